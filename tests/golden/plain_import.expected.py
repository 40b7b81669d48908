import polars as pl

# Text that pandas' read_csv reads as a missing value.
PANDAS_NA_VALUES = [
    "", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null",
]

landings = pl.scan_csv(
    "landings.csv",
    null_values=PANDAS_NA_VALUES + ["-"],
    infer_schema_length=None,
)
landings = landings.drop_nulls("kg")
by_boat = (
    landings
    .drop_nulls("boat")
    .group_by("boat")
    .agg(pl.col("kg").sum())
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort("boat")
)
print(by_boat.collect())
