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


def pandas_values(values):
    """A column's values as pandas gives them to Python: pandas' own Series where one is
    missing (nan for it, and floats for whole numbers), otherwise the Polars Series, whose
    numbers, texts and True/False are the same Python values, so that pandas is not imported
    for them."""
    return values.to_pandas() if values.null_count() else values


def pandas_group_sums(values, mean=False, sorted_within=None, in_key_order=None, floats=True):
    """Each group's sum of floats (mean=True: mean) as pandas computes it, from the group's
    values as a list (pl.col(...) in an agg). pandas adds a group with a compensated (Kahan)
    sum in row order, missing values skipped, which is what Polars' rolling sum computes over
    a window longer than the group; Polars' own sum adds in another order and can end a unit
    in the last digit away (212.40000000000003 for 212.4). Where the rows reach pandas
    grouped in the order of the sorted keys and none is missing, it adds with numpy's
    reduceat instead: the first value plus numpy's pairwise sum of the rest. That is a
    resample (sorted_within names the keys whose rows are binned together, [] for all rows)
    where no value of those rows is missing, or a groupby whose in_key_order says so
    (computed on the rows before grouping). floats=False: the column's type is not known;
    whole numbers and True/False are added as Polars adds them (exactly), into Int64."""
    kept = pl.element().fill_nan(None).drop_nulls()
    whole_group = 2**40  # a window longer than any group

    def compensated(lists):
        total = lists.list.eval(kept.rolling_sum(whole_group, min_samples=1).last())
        total = total.list.first().fill_null(0.0)
        if not mean:
            return total
        return (total / lists.list.eval(kept.len()).list.first()).fill_nan(None)

    def add(columns):
        lists = columns[0]
        if lists.dtype.inner != pl.Float64:  # whole numbers, True/False: exact sums
            total = lists.list.mean() if mean else lists.list.sum()
            return total.cast(pl.Int64) if total.dtype.is_unsigned_integer() else total
        if len(columns) == 1 or not len(lists):
            return compensated(lists)
        import numpy as np

        sizes = lists.list.len().cast(pl.Int64).to_numpy()
        clean = columns[1].to_numpy() & (sizes > 0)
        flat = lists.explode().to_numpy()  # an empty list: one missing value
        starts = np.concatenate(([0], np.maximum(sizes, 1).cumsum()[:-1]))
        with np.errstate(invalid="ignore"):
            total = np.add.reduceat(flat, starts)
        if mean:
            total = total / np.maximum(sizes, 1)
        if not clean.all():
            total = np.where(clean, total, compensated(lists).to_numpy())
        return pl.Series(total).fill_nan(None) if mean else pl.Series(total)

    kind = pl.Float64 if floats else None
    if sorted_within is None and in_key_order is None:
        if floats:
            return compensated(values)
        return values.map_batches(lambda lists: add([lists]), return_dtype=kind)
    missing = values.list.eval(pl.element().cast(pl.Float64).fill_nan(None).is_null()).list.any()
    if in_key_order is not None:
        clean = in_key_order & ~missing.any()
    else:
        clean = ~(missing.any().over(sorted_within) if sorted_within else missing.any())
    return pl.map_batches([values, clean], add, return_dtype=kind)


def pandas_upper(text):
    """text.str.to_uppercase() as pandas' str.upper() writes it (pyarrow's kernel, one letter
    at a time): "ß" is "ẞ" (Polars: "SS"), and a letter Polars writes as two or three ("ﬁ" as
    "FI", "ŉ", Greek letters with accents or an iota) is kept, or made its one capital, as
    pandas does: the text is cut around those letters and each piece upper-cased. A batch of
    values that holds none of them gets Polars' own upper case, and only that is computed."""
    kept, iota = "[ŉǰΐΰևẖ-ẚὐὒὔὖᾈ-ᾏᾘ-ᾟᾨ-ᾯᾲᾴᾶᾷᾼῂῄῆῇῌῒ\u1fd3ῖῗῢ-ῤῦῧῲῴῶῷῼﬀ-ﬆﬓ-ﬗ]", "[ᾀ-ᾇᾐ-ᾗᾠ-ᾧᾳῃῳ]"

    def upper(values):
        values = values.str.replace_all("ß", "ẞ", literal=True)
        special = values.str.contains(f"{kept}|{iota}")
        if not special.any():
            return values.str.to_uppercase()
        piece = pl.element()
        by_piece = (
            pl.first().str.extract_all(f"{kept}|{iota}|[^ŉǰΐΰևẖ-ẚὐὒὔὖᾈ-ᾏᾘ-ᾟᾨ-ᾯᾲᾴᾶᾷᾼῂῄῆῇῌῒ\u1fd3ῖῗῢ-ῤῦῧῲῴῶῷῼﬀ-ﬆﬓ-ﬗᾀ-ᾇᾐ-ᾗᾠ-ᾧᾳῃῳ]+")
            .list.eval(
                pl.when(piece.str.contains(f"^{kept}$")).then(piece)
                .when(piece.str.contains(f"^{iota}$")).then(piece.str.to_titlecase())
                .otherwise(piece.str.to_uppercase())
            )
            .list.join("")
        )
        return values.to_frame().select(
            pl.when(special).then(by_piece).otherwise(pl.first().str.to_uppercase())
        ).to_series()

    return text.map_batches(upper, return_dtype=pl.String, is_elementwise=True)


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


# The characters Python's str.isspace() calls whitespace, which pandas' str.strip() takes
# off: Polars' strip_chars() leaves the separators \x1c-\x1f.
PANDAS_WHITESPACE = (
    "\t\n\x0b\x0c\r\x1c\x1d\x1e\x1f \x85\xa0\u1680"
    "\u2000\u2001\u2002\u2003\u2004\u2005\u2006\u2007"
    "\u2008\u2009\u200a\u2028\u2029\u202f\u205f\u3000"
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

CUTOFF = 0.75

checklist = pl.scan_csv(
    "data/checklist.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)
checklist = (
    checklist
    .with_columns(
        species=pl.col("species")
        .str.replace_many({"İ": "i", "Σ": "σ"})
        .str.to_lowercase(),
    )
    .collect()
    .lazy()
)
SPECIES = (
    pandas_values(checklist.select(pl.col("species")).collect().to_series())
    .to_list()
)
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
    transect=pandas_upper(pl.col("transect").str.strip_chars(PANDAS_WHITESPACE)),
)
counts = (
    counts
    .with_columns(
        tide=pl.col("tide")
        .str.strip_chars(PANDAS_WHITESPACE)
        .str.replace_many({"İ": "i", "Σ": "σ"})
        .str.to_lowercase(),
    )
    .collect()
    .lazy()
)

# TODO(porter): series.map: a loop or a block that only a Python call can run; porter runs
#   match_species on Polars values only on a text or float column whose type it knows (convert with
#   --data)
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
    .pipe(pandas_sort_values, "count_id")
)
(
    unmatched
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
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
    .with_columns(
        _porter_rows_in_key_order=pl.when(
            ~pl.any_horizontal(pl.col("transect", "species").is_null()),
        )
        .then(pl.struct("transect", "species"))
        .is_sorted(),
    )
    .drop_nulls(["transect", "species"])
    .group_by(["transect", "species"])
    .agg(
        pl.col("birds"),
        pl.col("survey_date").drop_nulls().n_unique().cast(pl.Int64).alias("visits"),
        pl.col("_porter_rows_in_key_order").first(),
    )
    .with_columns(
        pandas_group_sums(
            pl.col("birds"),
            floats=False,
            in_key_order=pl.col("_porter_rows_in_key_order"),
        ),
    )
    .drop("_porter_rows_in_key_order")
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
        PANDAS_CSV_FLOATS,
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
        pl.col("birds"),
        pl.col("species").drop_nulls().n_unique().cast(pl.Int64).alias("species"),
        pl.col("count_id").count().cast(pl.Int64).alias("lines"),
    )
    .with_columns(pandas_group_sums(pl.col("birds"), floats=False))
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort("survey_date")
    .pipe(pandas_sort_values, "survey_date")
)
(
    red_by_date
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("red_list_by_date.csv")
)

# --- a word for the newsletter
by_tide = (
    counts
    .with_columns(_porter_rows_in_key_order=pl.col("tide").is_sorted())
    .drop_nulls("tide")
    .group_by("tide")
    .agg(pl.col("birds"), pl.col("_porter_rows_in_key_order").first())
    .with_columns(
        pandas_group_sums(
            pl.col("birds"),
            mean=True,
            floats=False,
            in_key_order=pl.col("_porter_rows_in_key_order"),
        ),
    )
    .drop("_porter_rows_in_key_order")
    .sort("tide")
    .select(pl.col("tide"), pl.col("birds").round(2).alias("birds"))
)
print(by_tide.collect())
top = (
    counts
    .with_columns(_porter_rows_in_key_order=pl.col("species").is_sorted())
    .drop_nulls("species")
    .group_by("species")
    .agg(pl.col("birds"), pl.col("_porter_rows_in_key_order").first())
    .with_columns(
        pandas_group_sums(
            pl.col("birds"),
            floats=False,
            in_key_order=pl.col("_porter_rows_in_key_order"),
        ),
    )
    .drop("_porter_rows_in_key_order")
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort("species")
    .pipe(pandas_sort_values, pl.col("birds"), descending=True)
    .head(5)
)
print("most counted:")
print(top.collect())
