"""Harbour landings, deliberately broken: rounds halves away from zero, where pandas rounds them to even.

The sample in data/ does not show it; the randomised trials do."""
import polars as pl

landings = pl.scan_csv("data/landings.csv", schema_overrides={"kg": pl.Float64})
per_boat = (
    landings
    .filter(pl.col("boat").is_not_null())
    .group_by("boat")
    .agg(
        catches=pl.col("kg").count().cast(pl.Int64),
        mean_kg=pl.col("kg").mean(),
    )
    .sort("boat")
    .with_columns(pl.col("mean_kg").round(0, mode="half_away_from_zero"))
)
per_boat.sink_csv("per_boat.csv")
