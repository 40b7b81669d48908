"""Village recycling depot: combine two weekly drop-off sheets, weigh up each material,
and list the households that bring the heavy glass and metal loads.

A ticket that shows up on both sheets is disputed and left out entirely;
weight 0 or 'n/a' means the scale was not used.
"""
import polars as pl

# Text that pandas' read_csv reads as a missing value.
PANDAS_NA_VALUES = [
    "", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null",
]


def pandas_group_sum(x):
    """x.sum() of floats in a group_by or a window, as pandas' group sum adds them: exactly,
    rounded once (Polars' own sum can end a unit in the last digit away, 212.40000000000003
    for 212.4, and round(2) of a sum on a half cent then gives the other cent). Each value
    is cut into a multiple of 2**-20, which add up without error, and the small rest."""
    whole = (x * 1048576.0).round() / 1048576.0
    return whole.sum() + (x - whole).fill_nan(0.0).sum()


# One row per column that gives pandas the dtype of the whole column: the first value, or a
# missing value where the column holds one (pandas makes such an int column float64 and a
# True/False one object); no row when the frame has none.
PANDAS_DTYPE_PROBE = pl.when(~pl.all().is_null().any()).then(pl.all().head(1))

# Float columns as pandas' to_csv writes them (Python's repr): 5e-05 and 1.5e-07, where Polars
# writes 0.00005 and 1.5e-7; NaN as an empty field.
PANDAS_CSV_FLOATS = (
    pl.selectors.float().fill_nan(None).cast(pl.String)
    .str.replace(r"e-(\d)$", "e-0${1}")
    .str.replace(r"^(-?)0\.0000(\d)$", "${1}${2}e-05")
    .str.replace(r"^(-?)0\.0000(\d)(\d+)$", "${1}${2}.${3}e-05")
)

# Integer columns as pandas' to_csv writes them: one holding a missing value is float in
# pandas (2024.0), one without stays integer (2024).
PANDAS_CSV_INTS = (
    pl.when(pl.selectors.integer().null_count() > 0)
    .then(pl.selectors.integer().cast(pl.Float64).cast(pl.String))
    .otherwise(pl.selectors.integer().cast(pl.String))
)

CREDITS = pl.LazyFrame(
    {
        "material": ["glass", "paper", "metal", "textiles", "e-waste"],
        "credit_per_kg": [0.02, 0.03, 0.11, 0.05, 0.0],
    },
)

week1 = pl.scan_csv(
    "data/dropoffs_week1.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)
week2 = (
    pl.scan_csv(
        "data/dropoffs_week2.csv",
        null_values=PANDAS_NA_VALUES,
        infer_schema_length=None,
    )
    .collect()
    .lazy()
)
print(week1.collect_schema().names())
print(week2.select(PANDAS_DTYPE_PROBE).collect().to_pandas().dtypes)

drops = pl.concat([week1, week2], how="diagonal_relaxed")
print((drops.select(pl.len()).collect().item(), len(drops.collect_schema())))

drops = (
    drops
    .unique("ticket", keep="none", maintain_order=True)
    .drop("staff")
    .with_columns(
        material=pl.col("material")
        .str.replace_all("^[\\s\\x1c-\\x1f]+|[\\s\\x1c-\\x1f]+$", "")
        .str.replace_many({"İ": "i", "Σ": "σ"})
        .str.to_lowercase(),
        weight_kg=pl.col("weight_kg").cast(pl.Float64),
        bags=pl.col("bags").cast(pl.Float64),
    )
    .filter(pl.col("weight_kg") > 0)
    .collect()
    .lazy()
)
print(
    drops.select(pl.col("material").unique(maintain_order=True))
    .collect()
    .to_series()
    .to_pandas()
    .unique(),
)
print(
    drops.select(pl.col("material"))
    .drop_nulls()
    .group_by("material", maintain_order=True)
    .agg(pl.len().cast(pl.Int64).alias("count"))
    .sort("count", descending=True, maintain_order=True)
    .head(3)
    .collect(),
)

per_material = (
    drops
    .drop_nulls("material")
    .group_by("material")
    .agg(
        pandas_group_sum(pl.col("weight_kg")).alias("kg"),
        pl.col("ticket").count().cast(pl.Int64).alias("visits"),
        pandas_group_sum(pl.col("bags")).alias("bags"),
    )
    .sort("material")
    .join(
        CREDITS,
        on="material",
        how="left",
        nulls_equal=True,
        maintain_order="left_right",
    )
    .with_columns(
        credit=(pl.col("kg") * pl.col("credit_per_kg")).fill_nan(None).round(2),
    )
    .sort(
        ["kg", "material"],
        descending=[True, False],
        nulls_last=True,
        maintain_order=True,
    )
)
(
    per_material
    .with_columns(
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("material_totals.csv")
)

heavy = drops.filter(
    pl.col("weight_kg").is_between(20, 60) & pl.col("material").is_in(["glass", "metal"]),
)
heavy_households = (
    heavy
    .drop_nulls("household")
    .group_by("household")
    .agg(pl.len().cast(pl.Int64).alias("size"))
    .sort("household")
    .select(pl.col("household"), pl.col("size").alias("0"))
)
heavy_households = heavy_households.rename({"0": "heavy_loads"})
heavy_households = (
    heavy_households
    .sort(
        ["heavy_loads", "household"],
        descending=[True, False],
        nulls_last=True,
        maintain_order=True,
    )
    .collect()
    .lazy()
)
(
    heavy_households
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("heavy_households.csv")
)
print(heavy_households.head(5).collect())

household_kg = (
    drops
    .drop_nulls("household")
    .group_by("household")
    .agg(pandas_group_sum(pl.col("weight_kg")))
    .sort("household")
)
first_visit = (
    drops
    .sort(["dropped_on", "ticket"], nulls_last=True, maintain_order=True)
    .drop_nulls("household")
    .group_by("household")
    .agg(pl.all().first(ignore_nulls=True))
    .sort("household")
)
first_visit = (
    first_visit
    .select("household", "dropped_on", "material")
    .join(
        household_kg,
        on="household",
        how="inner",
        nulls_equal=True,
        maintain_order="left_right",
    )
    .collect()
    .lazy()
)
(
    first_visit
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("household_first_visit.csv")
)
print(
    first_visit.tail(3).collect(),
    drops.select(pl.col("weight_kg"))
    .collect()
    .to_series()
    .fill_null(0)
    .to_numpy()
    .sum(),
)
