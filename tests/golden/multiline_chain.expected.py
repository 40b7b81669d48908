import polars as pl

# Text that pandas' read_csv reads as a missing value.
PANDAS_NA_VALUES = [
    "", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null",
]


def pandas_sort_values(frame, by, descending=False, nulls_last=True):
    """The frame sorted by one column (a name or an expression) in the order pandas'
    sort_values gives: pandas sorts numbers, True/False and dates with numpy's quicksort, which
    does not keep tied rows in their order (Polars' sort does); missing values (NaN too) come
    first or last, in their order. Text is sorted stably by pandas, as by Polars."""

    def positions(values):
        # each row's position in pandas' order
        if values.dtype.is_float():
            values = values.fill_nan(None)  # NaN is missing to pandas
        if not (values.dtype.is_numeric() or values.dtype in (
                pl.Boolean, pl.Date, pl.Datetime, pl.Duration)):
            rank = values.rank("ordinal", descending=descending).cast(pl.Int64)
            missing = values.is_null().cum_sum().cast(pl.Int64)
            if nulls_last:
                return rank.fill_null(missing + values.len() - values.null_count())
            return (rank + values.null_count()).fill_null(missing)
        import numpy as np

        # the values as pandas holds them: integers with a missing value are floats, and
        # True/False with a missing value are objects (each is sorted another way by numpy)
        numbers = values.drop_nulls().to_numpy()
        if values.dtype.is_integer() and values.has_nulls():
            numbers = numbers.astype(np.float64)
        elif values.dtype == pl.Boolean and values.has_nulls():
            numbers = numbers.astype(object)
        rows = np.flatnonzero(values.is_not_null().to_numpy())
        if descending:  # as pandas' nargsort: reversed, sorted, reversed again
            order = rows[::-1][numbers[::-1].argsort(kind="quicksort")][::-1]
        else:
            order = rows[numbers.argsort(kind="quicksort")]
        missing = np.flatnonzero(values.is_null().to_numpy())
        order = np.concatenate([order, missing] if nulls_last else [missing, order])
        key = np.empty(len(order), dtype=np.int64)
        key[order] = np.arange(len(order))
        return pl.Series(values.name, key)

    # a column of its own: Polars merges consecutive sorts, and would compute the positions
    # from the rows before an earlier sort
    by = pl.col(by) if isinstance(by, str) else by
    return (
        frame.with_columns(by.map_batches(positions, return_dtype=pl.Int64).alias("_pandas_order"))
        .sort("_pandas_order")
        .drop("_pandas_order")
    )


# Float columns as pandas' to_csv writes them (Python's repr): 5e-05 and 1.5e-07, where Polars
# writes 0.00005 and 1.5e-7; NaN as an empty field. Only values below 0.0001 (other than 0)
# need the replacements, and only they are given them.
def pandas_csv_floats(values):
    text = values.fill_nan(None).cast(pl.String)
    small = (values.abs() < 1e-4) & (values != 0)
    if not small.any():
        return text
    repr_text = (
        text.filter(small)
        .str.replace(r"e-(\d)$", "e-0${1}")
        .str.replace(r"^(-?)0\.0000(\d)$", "${1}${2}e-05")
        .str.replace(r"^(-?)0\.0000(\d)(\d+)$", "${1}${2}.${3}e-05")
    )
    return text.scatter(small.arg_true(), repr_text)


PANDAS_CSV_FLOATS = pl.selectors.float().map_batches(
    pandas_csv_floats, return_dtype=pl.String, is_elementwise=True,
)

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
top = orders.pipe(pandas_sort_values, "total", descending=True).head(10)
(
    top
    .select("shop", "units", "total")
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("top_orders.csv")
)
