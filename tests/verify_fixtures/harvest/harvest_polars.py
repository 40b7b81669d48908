"""An orchard co-op's delivery totals (verify fixture)."""
import polars as pl

# Text that pandas' read_csv reads as a missing value.
PANDAS_NA_VALUES = [
    "", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null",
]

deliveries = pl.scan_csv(
    "data/deliveries.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)
growers = pl.scan_csv(
    "data/growers.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)
good = deliveries.filter(pl.col("grade").ne_missing(pl.lit("reject")))
totals = (
    good
    .drop_nulls("orchard")
    .group_by("orchard")
    .agg(pl.col("kg").sum())
    .sort("orchard")
)
totals.sink_csv("totals.csv")
named = good.join(
    growers,
    on="grower",
    how="left",
    nulls_equal=True,
    maintain_order="left_right",
)
named.sink_csv("named.csv")
by_grower = (
    good
    .drop_nulls("grower")
    .group_by("grower")
    .agg(pl.col("kg").max())
    .sort("grower")
)
