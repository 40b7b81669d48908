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
season = season.unique(["hive", "date"], keep="last", maintain_order=True)
stats = pl.concat([
    season.select(
        pl.lit("count").alias("index"),
        pl.selectors.numeric().count().cast(pl.Float64),
    ),
    season.select(pl.lit("mean").alias("index"), pl.selectors.numeric().mean()),
    season.select(pl.lit("std").alias("index"), pl.selectors.numeric().std()),
    season.select(
        pl.lit("min").alias("index"),
        pl.selectors.numeric().min().cast(pl.Float64),
    ),
    season.select(
        pl.lit("25%").alias("index"),
        pl.selectors.numeric().quantile(0.25, "linear"),
    ),
    season.select(
        pl.lit("50%").alias("index"),
        pl.selectors.numeric().quantile(0.5, "linear"),
    ),
    season.select(
        pl.lit("75%").alias("index"),
        pl.selectors.numeric().quantile(0.75, "linear"),
    ),
    season.select(
        pl.lit("max").alias("index"),
        pl.selectors.numeric().max().cast(pl.Float64),
    ),
])
(
    stats
    .rename({"index": ""})
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("season_stats.csv")
)
