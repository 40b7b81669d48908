import polars as pl

# Text that pandas' read_csv reads as a missing value.
PANDAS_NA_VALUES = [
    "", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null",
]

# Integer columns as pandas' to_csv writes them: one holding a missing value is float in
# pandas (2024.0), one without stays integer (2024).
PANDAS_CSV_INTS = (
    pl.when(pl.selectors.integer().null_count() > 0)
    .then(pl.selectors.integer().cast(pl.Float64).cast(pl.String))
    .otherwise(pl.selectors.integer().cast(pl.String))
)

orders = (
    pl.scan_csv(
        "orders.csv",
        null_values=PANDAS_NA_VALUES,
        schema_overrides={"shop": pl.String},
        infer_schema_length=None,
    )
    .with_columns(total=(pl.col("units") * pl.col("price")).fill_nan(None))
    .filter(pl.col("units") > 0)
)

# the ten biggest orders
top = (
    orders
    .sort("total", descending=True, nulls_last=True, maintain_order=True)
    .head(10)
)
(
    top
    .select("shop", "units", "total")
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("top_orders.csv")
)
