"""Ferry line, deliberately broken: a tie on cars broken by the boat's name, where pandas keeps the file's order.

The sample in data/ does not show it; the randomised trials do."""
import polars as pl

crossings = pl.scan_csv("data/crossings.csv", schema_overrides={"cars": pl.Float64})
boats = pl.scan_csv("data/boats.csv")
heaviest = (
    crossings
    .sort(["cars", "boat"], descending=[True, False], nulls_last=True)
    .join(boats, on="boat", how="left", nulls_equal=True, maintain_order="left")
)
heaviest.sink_csv("heaviest.csv")
