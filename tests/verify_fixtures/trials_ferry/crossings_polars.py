"""Ferry line, written by hand in Polars: what pandas computes, on any data."""
import polars as pl

crossings = pl.scan_csv("data/crossings.csv", schema_overrides={"cars": pl.Float64})
boats = pl.scan_csv("data/boats.csv")
heaviest = (
    crossings
    .sort("cars", descending=True, nulls_last=True, maintain_order=True)
    .join(boats, on="boat", how="left", nulls_equal=True, maintain_order="left")
)
heaviest.sink_csv("heaviest.csv")
