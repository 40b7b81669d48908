import polars as pl

# Text that pandas' read_csv reads as a missing value.
PANDAS_NA_VALUES = [
    "", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null",
]


def pandas_reduce(values, how="sum", ddof=1):
    """The sum, mean, std or var (how="sum" / "mean" / "std" / "var") of a column of numbers
    as pandas computes them: numpy's pairwise sum of the values as floats, a missing one
    counted 0 in its place; the mean over the count of values present; the var from the
    squared distances to that mean (0 where a value is missing), added the same way, over
    count - ddof, and the std its square root. NaN where there are too few values. Polars
    adds in another order, and the last digit can differ (55.080000000000005 for
    55.08000000000001, a std of 3.265986323710904 for 3.2659863237109046)."""
    def reduce(column):
        import numpy as np

        present = column.is_not_null().to_numpy()
        numbers = column.cast(pl.Float64).fill_null(0.0).to_numpy()
        total = numbers.sum()
        if how == "sum":
            return total
        count = int(present.sum())
        if how == "mean":
            return total / count if count else float("nan")
        if count <= ddof:
            return float("nan")
        squares = (total / count - numbers) ** 2
        squares[~present] = 0.0
        spread = squares.sum() / (count - ddof)
        return float(np.sqrt(spread) if how == "std" else spread)

    return values.map_batches(reduce, returns_scalar=True, return_dtype=pl.Float64)


def pandas_percentiles(column, qs):
    """The quantiles qs of the column's values as pandas computes them: numpy's percentile
    of the values present (linear interpolation, to the last binary digit and the sign of a
    zero), a row each; missing where the column holds no value."""
    import numpy as np

    def percentiles(values):
        present = values.drop_nulls().cast(pl.Float64).to_numpy()
        if not len(present):
            return pl.Series([None] * len(qs), dtype=pl.Float64)
        return pl.Series(np.percentile(present, [q * 100 for q in qs]), dtype=pl.Float64)

    return column.map_batches(percentiles, return_dtype=pl.Float64)


spring = pl.scan_csv(
    "spring.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)
summer = pl.scan_csv(
    "summer.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)
season = pl.concat([spring, summer], how="diagonal_relaxed")
season = season.filter(pl.struct("hive", "date").is_last_distinct())
stats = pl.concat([
    season.select(
        pl.lit("count").alias("index"),
        pl.selectors.numeric().count().cast(pl.Float64),
    ),
    season.select(
        pl.lit("mean").alias("index"),
        pandas_reduce(pl.selectors.numeric().cast(pl.Float64), how="mean"),
    ),
    season.select(
        pl.lit("std").alias("index"),
        pandas_reduce(pl.selectors.numeric().cast(pl.Float64), how="std"),
    ),
    season.select(
        pl.lit("min").alias("index"),
        pl.selectors.numeric().min().cast(pl.Float64),
    ),
    season.select(
        pl.lit(pl.Series(["25%", "50%", "75%"])).alias("index"),
        pandas_percentiles(pl.selectors.numeric(), [0.25, 0.5, 0.75]),
    ),
    season.select(
        pl.lit("max").alias("index"),
        pl.selectors.numeric().max().cast(pl.Float64),
    ),
])
(
    stats
    .collect()
    .to_pandas()
    .set_index("index")
    .rename_axis(None)
    .to_csv("season_stats.csv")
)
