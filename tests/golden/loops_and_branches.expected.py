import polars as pl

# Text that pandas' read_csv reads as a missing value.
PANDAS_NA_VALUES = [
    "", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null",
]

VERBOSE = True
plots = pl.scan_csv("plots.csv", null_values=PANDAS_NA_VALUES, infer_schema_length=None)
for column in ["fee", "deposit"]:
    plots = plots.with_columns(pl.col(column).fill_null(0).round(2).alias(column))
if VERBOSE:
    print(plots.collect_schema().names())
else:
    plots = plots.head(10).collect().lazy()
total = plots.select(pl.col("fee").sum()).collect().to_series().to_numpy()[0] + plots.select(pl.col("deposit").sum()).collect().to_series().to_numpy()[0]
print(f"total due: {total:.2f}")
