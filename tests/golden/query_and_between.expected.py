import polars as pl

# Text that pandas' read_csv reads as a missing value.
PANDAS_NA_VALUES = [
    "", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null",
]

limit = 30
meters = (
    pl.scan_csv("meters.csv", null_values=PANDAS_NA_VALUES, infer_schema_length=None)
    .collect()
    .lazy()
)
high = (
    meters
    .filter(
        (pl.col("litres") > limit) & (pl.col("village") != "Upper Fold").fill_null(True),
    )
    .collect()
    .lazy()
)
mid = meters.filter(pl.col("litres").is_between(10, 30, closed="left"))
print(
    high.select(pl.len()).collect().item(),
    mid.select(pl.len()).collect().item(),
)
(
    high
    .with_columns(pl.selectors.boolean().replace_strict({True: "True", False: "False"}))
    .sink_csv("high_use.csv")
)
