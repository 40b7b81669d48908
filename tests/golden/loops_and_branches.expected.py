import polars as pl

# Text that pandas' read_csv reads as a missing value.
PANDAS_NA_VALUES = [
    "", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null",
]


def pandas_total(frame, how="sum"):
    """s.sum() / s.mean() of a column whose type was not known when the script was converted,
    from a frame of one row: the column's values as a list, then Polars' own total. A float
    column is added as pandas adds it, with numpy's pairwise sum, missing values counted 0
    (Polars adds in another order, and the last digit could differ: 11532.650000000001 for
    11532.65), its mean that sum over the count of values (NaN when there is none); any other
    column keeps Polars' total, as a numpy value as pandas gives it."""
    values = frame.to_series(0)[0]
    if not values.dtype.is_float() or how == "mean" and values.dtype != pl.Float64:
        return frame.to_series(1).to_numpy()[0]
    total = values.fill_null(0.0).to_numpy().sum()
    if how == "sum":
        return total
    return total / values.count() if values.count() else total * float("nan")


VERBOSE = True
plots = pl.scan_csv("plots.csv", null_values=PANDAS_NA_VALUES, infer_schema_length=None)
for column in ["fee", "deposit"]:
    plots = plots.with_columns(pl.col(column).fill_null(0).round(2).alias(column))
if VERBOSE:
    print(plots.collect_schema().names())
else:
    plots = plots.head(10).collect().lazy()
total = (
    pandas_total(
        plots.select(
            pl.col("fee").implode().alias("values"),
            pl.col("fee").sum().alias("total"),
        )
        .collect(),
    )
    + pandas_total(
        plots.select(
            pl.col("deposit").implode().alias("values"),
            pl.col("deposit").sum().alias("total"),
        )
        .collect(),
    )
)
print(f"total due: {total:.2f}")
