"""Ferry line, deliberately broken: the rows in the order of the boats table, where pandas keeps the crossings' order.

The sample in data/ does not show it; the randomised trials do."""
import polars as pl

crossings = pl.scan_csv("data/crossings.csv", schema_overrides={"cars": pl.Float64})
boats = pl.scan_csv("data/boats.csv")
heaviest = (
    boats
    .join(
        crossings.sort("cars", descending=True, nulls_last=True, maintain_order=True),
        on="boat",
        how="inner",
        maintain_order="left_right",
    )
)
heaviest.sink_csv("heaviest.csv")
