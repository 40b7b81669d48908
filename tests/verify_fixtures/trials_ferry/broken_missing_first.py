"""Ferry line, deliberately broken: crossings with no car count sorted first (Polars' default), where pandas puts them last.

The sample in data/ does not show it; the randomised trials do."""
import polars as pl

crossings = pl.scan_csv("data/crossings.csv", schema_overrides={"cars": pl.Float64})
boats = pl.scan_csv("data/boats.csv")
heaviest = (
    crossings
    .sort("cars", descending=True, maintain_order=True)
    .join(boats, on="boat", how="left", nulls_equal=True, maintain_order="left")
)
heaviest.sink_csv("heaviest.csv")
