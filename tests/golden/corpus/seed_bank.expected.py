"""Seed bank: germination rate per species, the five best accessions, and weak lots kept in the cold room.

Accession numbers are zero-padded strings; a tray with nothing sown (sown == 0)
has no rate rather than a division error.
"""
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

TEST_COLUMNS = ["test_id", "accession", "species", "sown", "germinated", "test_date"]


def load_tests(path):
    tests = (
        pl.scan_csv(
            path,
            null_values=PANDAS_NA_VALUES,
            schema_overrides={"accession": pl.String},
            infer_schema_length=None,
        )
        .select(pl.col("^(test_id|accession|species|sown|germinated|test_date)$"))
    )
    return tests.drop_nulls("germinated")


def add_rates(tests):
    rate = (
        pl.when(pl.col("sown") > 0)
        .then((pl.col("germinated") / pl.col("sown")).fill_nan(None))
        .otherwise(None)
    )
    return tests.with_columns(rate=rate)


def attach_registry(tests, registry):
    registry = registry.with_columns(
        storage=pl.col("storage").str.strip_chars().str.to_lowercase(),
    )
    return tests.join(
        registry.rename(
            lambda c, other=tests.collect_schema().names(): c + "_registry" if c in other and c not in ("accession_id",) else c,
        ),
        left_on="accession",
        right_on="accession_id",
        how="left",
        coalesce=False,
        nulls_equal=True,
        maintain_order="left_right",
    )


def species_summary(tests):
    summary = (
        tests
        .drop_nulls("species")
        .group_by("species")
        .agg(
            pl.col("rate").mean().alias("rate"),
            pl.col("sown").sum().alias("sown"),
            pl.col("germinated").sum().alias("germinated"),
        )
        .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
        .sort("species")
    )
    summary = summary.with_columns(rate=pl.col("rate").round(3))
    return summary.sort("rate", descending=True, nulls_last=True, maintain_order=True)


tests = add_rates(load_tests("data/germination_tests.csv")).collect().lazy()
registry = pl.scan_csv(
    "data/accessions.csv",
    null_values=PANDAS_NA_VALUES,
    schema_overrides={"accession_id": pl.String},
    infer_schema_length=None,
)
rated = attach_registry(tests, registry).collect().lazy()
print(
    tests.select(pl.len()).collect().item(),
    rated.select(pl.len()).collect().item(),
)

(
    species_summary(rated)
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("species_rates.csv")
)

top = (
    rated
    .sort("rate", descending=True, nulls_last=True, maintain_order=True)
    .head(5)
    .select("test_id", "accession", "species", "sown", "rate", "storage")
    .collect()
    .lazy()
)
(
    top
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("top_accessions.csv")
)
print(top.collect())

weak = rated.filter((pl.col("rate") < 0.5) & (pl.col("storage") == "cold room"))
weak = (
    weak
    .drop("accession_id", "species_registry")
    .sort(["rate", "test_id"], nulls_last=True, maintain_order=True)
    .collect()
    .lazy()
)
(
    weak
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("weak_cold_room.csv")
)
print(
    weak.select(pl.col("accession").drop_nulls().n_unique().cast(pl.Int64))
    .collect()
    .to_series()
    .to_numpy()[0],
)
