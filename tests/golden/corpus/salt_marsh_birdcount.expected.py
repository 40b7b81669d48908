"""Salt marsh bird count: birds per transect and kilometre, the red-listed species by date,
and the lines whose species name nobody could read.

Volunteers write the species by hand ('red shank', 'curlw', 'brent geese'); each name is
matched against the reserve's checklist with difflib, and what does not match closely
enough is sent back to the recorder. 'x' or 'not counted' in the birds column means the
flock flew before it was counted. T4 is the hide: a point count with no length.
"""
import difflib
from functools import lru_cache

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

CUTOFF = 0.75

checklist = pl.scan_csv(
    "data/checklist.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)
checklist = (
    checklist
    .with_columns(species=pl.col("species").str.to_lowercase())
    .collect()
    .lazy()
)
SPECIES = checklist.select(pl.col("species")).collect().to_series().to_pandas().tolist()
print(f"checklist: {len(SPECIES)} species")


@lru_cache(maxsize=None)
def match_species(raw):
    # a blank or a '?' is not a bird
    if not isinstance(raw, str) or not raw.strip():
        return None
    name = raw.strip().lower()
    for plural, single in (("geese", "goose"),):
        name = name.replace(plural, single)
    best = difflib.get_close_matches(name, SPECIES, n=1, cutoff=CUTOFF)
    return best[0] if best else None


counts = (
    pl.scan_csv(
        "data/counts.csv",
        null_values=PANDAS_NA_VALUES + ["x", "not counted"],
        infer_schema_length=None,
    )
    .collect()
    .lazy()
)
transects = pl.scan_csv(
    "data/transects.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)
print("lines read:", counts.select(pl.len()).collect().item())
# a flock can be counted twice on purpose (it moved between transects): lines are kept, only flagged
# TODO(porter): frame.duplicated: the frame's columns are not known (pass subset=[...]);
#   ~pl.struct(cols).is_first_distinct() for keep='first'
print("lines entered twice:", counts.collect().to_pandas().duplicated().sum())
counts = counts.with_columns(
    transect=pl.col("transect").str.strip_chars().str.to_uppercase(),
)
counts = (
    counts
    .with_columns(tide=pl.col("tide").str.strip_chars().str.to_lowercase())
    .collect()
    .lazy()
)

# TODO(porter): series.map: a named function porter cannot read: write its body as a lambda or as
#   column expressions
# TODO(porter): frame.setitem: a Series computed by pandas, row for row from this frame, is put back
#   by position; port the computation to an expression
counts = (
    counts
    .with_columns(
        species=pl.Series(
            counts.select(pl.col("species_raw"))
            .collect()
            .to_series()
            .to_pandas()
            .map(match_species),
            nan_to_null=True,
        ),
    )
    .collect()
    .lazy()
)

unmatched = counts.filter(pl.col("species").is_null()).collect().lazy()
print(
    f"{unmatched.select(pl.len()).collect().item()} lines with a species name we could not match",
)
unmatched = (
    unmatched
    .select("count_id", "survey_date", "observer", "species_raw")
    .sort("count_id", nulls_last=True, maintain_order=True)
)
(
    unmatched
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("unmatched_species.csv")
)

counts = counts.drop_nulls("species")
counts = (
    counts
    .rename(
        lambda c, other=checklist.collect_schema().names(): c + "_x" if c in other and c not in ("species",) else c,
    )
    .join(
        checklist.rename(
            lambda c, other=counts.collect_schema().names(): c + "_y" if c in other and c not in ("species",) else c,
        ),
        on="species",
        how="left",
        nulls_equal=True,
        maintain_order="left_right",
    )
)
counts = counts.with_columns(birds=pl.col("birds").fill_null(0)).collect().lazy()

# --- birds per transect and species, per km walked
per_transect = (
    counts
    .drop_nulls(["transect", "species"])
    .group_by(["transect", "species"])
    .agg(
        pl.col("birds").sum().alias("birds"),
        pl.col("survey_date").drop_nulls().n_unique().cast(pl.Int64).alias("visits"),
    )
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort(["transect", "species"])
)
per_transect = (
    per_transect
    .rename(
        lambda c, other=transects.collect_schema().names(): c + "_x" if c in other and c not in ("transect",) else c,
    )
    .join(
        transects.rename(
            lambda c: c + "_y" if c in ("species", "birds", "visits") else c,
        ),
        on="transect",
        how="left",
        nulls_equal=True,
        maintain_order="left_right",
    )
)
per_transect = per_transect.with_columns(
    birds_per_km=(pl.col("birds") / pl.col("visits") / pl.col("length_km"))
    .fill_nan(None)
    .round(2),
)
per_transect = per_transect.sort(
    ["transect", "birds", "species"],
    descending=[False, True, False],
    nulls_last=True,
    maintain_order=True,
)
(
    per_transect
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("birds_per_transect.csv")
)

# --- red-listed species, per survey date
red = counts.filter(pl.col("status") == "red")
red_by_date = (
    red
    .drop_nulls("survey_date")
    .group_by("survey_date")
    .agg(
        pl.col("birds").sum().alias("birds"),
        pl.col("species").drop_nulls().n_unique().cast(pl.Int64).alias("species"),
        pl.col("count_id").count().cast(pl.Int64).alias("lines"),
    )
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort("survey_date")
    .sort("survey_date", nulls_last=True, maintain_order=True)
)
(
    red_by_date
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("red_list_by_date.csv")
)

# --- a word for the newsletter
by_tide = (
    counts
    .drop_nulls("tide")
    .group_by("tide")
    .agg(pl.col("birds").mean())
    .sort("tide")
    .select(pl.col("tide"), pl.col("birds").round(2).alias("birds"))
)
print(by_tide.collect())
top = (
    counts
    .drop_nulls("species")
    .group_by("species")
    .agg(pl.col("birds").sum())
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort("species")
    .sort(pl.col("birds"), descending=True, nulls_last=True, maintain_order=True)
    .head(5)
)
print("most counted:")
print(top.collect())
