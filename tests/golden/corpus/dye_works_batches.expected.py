"""Textile dye works: water used per dye, liters per kilo of cloth, and the rejected or rushed batches.

Batch codes look like IND-0041-W (dye prefix, number, fabric: W wool,
C cotton, L linen) but are typed with stray spaces and lower case.
Cloth weight 0 means a test vat with no cloth: its liters-per-kilo is left unguarded.
"""
import polars as pl

# Text that pandas' read_csv reads as a missing value.
PANDAS_NA_VALUES = [
    "", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null",
]


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

DYE_COSTS = pl.LazyFrame(
    {
        "dye": ["indigo", "madder", "weld", "walnut", "cochineal"],
        "cost_per_liter": [0.42, 0.35, 0.18, 0.12, 0.95],
    },
)


def tidy_codes(batches):
    batches = batches.with_columns(
        batch_code=pandas_upper(pl.col("batch_code").str.strip_chars(PANDAS_WHITESPACE)),
    )
    batches = batches.with_columns(prefix=pl.col("batch_code").str.head(3))
    batches = batches.with_columns(
        wool=pl.col("batch_code").str.ends_with("-W").fill_null(False),
    )
    batches = batches.with_columns(
        dye=pl.col("dye")
        .str.strip_chars(PANDAS_WHITESPACE)
        .str.replace_many({"İ": "i", "Σ": "σ"})
        .str.to_lowercase()
        .str.replace_all(" hull", "", literal=True),
    )
    return batches


def flag_status(batches):
    status = pl.col("status").str.replace_many({"İ": "i", "Σ": "σ"}).str.to_lowercase()
    batches = batches.with_columns(
        rejected=status.str.starts_with("rejected").fill_null(False),
    )
    batches = batches.with_columns(rush=status.str.contains("rush").fill_null(False))
    batches = (
        batches
        .with_columns(note_length=status.str.len_chars().cast(pl.Int64))
        .collect()
        .pipe(
            lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("note_length",) if t[c].has_nulls()]),
        )
        .lazy()
    )
    return batches


batches = flag_status(
    tidy_codes(
        pl.scan_csv(
            "data/batches.csv",
            null_values=PANDAS_NA_VALUES,
            infer_schema_length=None,
        ),
    ),
)
batches = batches.with_columns(shift=pl.col("shift").cast(pl.Categorical))
batches = batches.with_columns(
    liters_per_kg=(pl.col("liters_used") / pl.col("fabric_kg")).fill_nan(None),
)
batches = (
    batches
    .with_columns(
        heat=pl.when(pl.col("temp_c") >= 95)
        .then(pl.lit("boil"))
        .otherwise(pl.lit("hot")),
    )
    .collect()
    .lazy()
)
print(batches.head(5).collect())

water = (
    batches
    .with_columns(_porter_rows_in_key_order=pl.col("dye").is_sorted())
    .drop_nulls("dye")
    .group_by("dye")
    .agg(
        pl.col("liters_used").alias("sum"),
        pl.col("liters_used").alias("mean"),
        pl.col("_porter_rows_in_key_order").first(),
    )
    .with_columns(
        pandas_group_sums(
            pl.col("sum"),
            floats=False,
            in_key_order=pl.col("_porter_rows_in_key_order"),
        ),
        pandas_group_sums(
            pl.col("mean"),
            mean=True,
            floats=False,
            in_key_order=pl.col("_porter_rows_in_key_order"),
        ),
    )
    .drop("_porter_rows_in_key_order")
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort("dye")
)
water = water.join(
    DYE_COSTS,
    on="dye",
    how="left",
    nulls_equal=True,
    maintain_order="left_right",
)
water = water.with_columns(
    cost=(pl.col("sum") * pl.col("cost_per_liter")).fill_nan(None).round(2),
)
(
    water
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("water_per_dye.csv")
)

flagged = batches.filter(
    pl.when(pl.col("rejected").is_not_null()).then(pl.col("rejected") | pl.col("rush")),
)
(
    flagged
    .select("batch_code", "dye", "shift", "wool", "status", "note_length")
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("flagged_batches.csv")
)

per_shift = (
    batches
    .drop_nulls("shift")
    .group_by("shift")
    .agg(
        pl.col("batch_code").count().cast(pl.Int64).alias("batches"),
        pl.col("rejected").sum().cast(pl.Int64).alias("rejected"),
        pl.col("wool").sum().cast(pl.Int64).alias("wool"),
    )
    .sort("shift")
    .collect()
    .lazy()
)
(
    per_shift
    .with_columns(
        PANDAS_CSV_INTS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("shift_report.csv")
)
print(per_shift.collect())

intensity = (
    batches
    .select("batch_code", "prefix", "heat", "liters_per_kg")
    .sort(
        ["liters_per_kg", "batch_code"],
        descending=[True, False],
        nulls_last=True,
        maintain_order=True,
    )
)
(
    intensity
    .head(10)
    .with_columns(
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("thirstiest_batches.csv")
)
