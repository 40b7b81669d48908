"""Harbour landings, deliberately broken: counts rows, where pandas' count skips a missing weight.

The sample in data/ does not show it; the randomised trials do."""
import polars as pl

landings = pl.scan_csv("data/landings.csv", schema_overrides={"kg": pl.Float64})
per_boat = (
    landings
    .filter(pl.col("boat").is_not_null())
    .group_by("boat")
    .agg(
        catches=pl.len().cast(pl.Int64),
        mean_kg=pl.col("kg").mean(),
    )
    .sort("boat")
    .with_columns(pl.col("mean_kg").round(0))
)
per_boat.sink_csv("per_boat.csv")
