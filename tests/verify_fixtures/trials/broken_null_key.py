"""Harbour landings, deliberately broken: a group for the missing boat, which pandas drops.

The sample in data/ does not show it; the randomised trials do."""
import polars as pl

landings = pl.scan_csv("data/landings.csv", schema_overrides={"kg": pl.Float64})
per_boat = (
    landings
    .group_by("boat")
    .agg(
        catches=pl.col("kg").count().cast(pl.Int64),
        mean_kg=pl.col("kg").mean(),
    )
    .sort("boat")
    .with_columns(pl.col("mean_kg").round(0))
)
per_boat.sink_csv("per_boat.csv")
