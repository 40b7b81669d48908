"""River lock-keeper rota: hours and pay per keeper and week, cover per lock, and boats
through per hour kept.

Each rota line is one keeper at one lock for a week, with up to three shifts written as the
keeper likes them: '06:00-14:00', '6-14', a night '22:00-06:00' (past midnight), 'off',
'sick' or blank. Hours are worked out shift by shift. A line with no hours and boats through
means the lock was worked by the boaters themselves.
"""
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


def pandas_title(text):
    """text.str.to_titlecase() as pandas' str.title() writes it (pyarrow's kernel, one letter
    at a time): "Σ" is "σ" at the end of a word too, "ß" first in a word is "ẞ" (Polars: "Ss"),
    a digraph first in a word is its upper case ("ǆemal" -> "Ǆemal", Polars: "ǅemal"), "İ"
    inside a word is "i" (Polars: i and a combining dot), and a letter Polars writes as two or
    three first in a word ("ﬁ" as "Fi") is kept: a letter without case set before it makes
    Polars read it as inside a word, and is taken out after. A letter without case (CJK,
    Hebrew, a modifier letter) ends a word for pandas, not for Polars: a mark that is no
    letter (U+FFFF) is set after each, and taken out after. Where a batch of values holds none of
    these letters, Polars' own title case is pandas', and only that is computed."""
    kept, mark = "[ŉǰΐΰևẖ-ẚὐὒὔὖᾲᾴᾶᾷῂῄῆῇῒ\u1fd3ῖῗῢ-ῤῦῧῲῴῶῷﬀ-ﬆﬓ-ﬗ]", "\ua66e"
    special = r"[ΣßǄ-ǌǱ-ǳİ\u0307\uffffŉǰΐΰևẖ-ẚὐὒὔὖᾲᾴᾶᾷῂῄῆῇῒ\u1fd3ῖῗῢ-ῤῦῧῲῴῶῷﬀ-ﬆﬓ-ﬗ[\p{Alphabetic}&&[^\p{Lu}\p{Ll}\p{Lt}]&&[^\p{Cased}&&[\p{Nl}\x{24b6}-\x{24e9}]]]]"

    def title(values):
        if not values.str.contains(special).any():
            return values.str.to_titlecase()
        return (
            values.str.replace_many({"Σ": "σ", "ß": "ẞ"})
            .str.replace_all(r"[\p{Alphabetic}&&[^\p{Lu}\p{Ll}\p{Lt}]&&[^\p{Cased}&&[\p{Nl}\x{24b6}-\x{24e9}]]]", "$0\uffff")
            .str.replace_all(kept, mark + "$0")
            .str.to_titlecase()
            .str.replace_all("\uffff", "", literal=True)
            .str.replace_many({"ǅ": "Ǆ", "ǈ": "Ǉ", "ǋ": "Ǌ", "ǲ": "Ǳ", "i\u0307": "i"})
            .str.replace_all(mark + f"({kept})", "$1")
        )

    return text.map_batches(title, return_dtype=pl.String, is_elementwise=True)


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

# Columns of lists of numbers or True/False as pandas' to_csv writes them: Python's str of the
# list ([1, 2], [1.5, nan, 1e-05], [True]); a missing float in a list is NaN in pandas.
PANDAS_CSV_NUMBER_LISTS = pl.selectors.by_dtype(
    pl.List(pl.Int8), pl.List(pl.Int16), pl.List(pl.Int32), pl.List(pl.Int64),
    pl.List(pl.UInt8), pl.List(pl.UInt16), pl.List(pl.UInt32), pl.List(pl.UInt64),
    pl.List(pl.Float64), pl.List(pl.Boolean),
).map_elements(
    lambda values: str(
        [float("nan") if v is None and values.dtype == pl.Float64 else v for v in values]
    ),
    return_dtype=pl.String,
)

# Columns of lists of text as pandas' to_csv writes them: Python's repr of the list; a missing
# text in a list is NaN in pandas (agg(list) of a text column).
PANDAS_CSV_LISTS = pl.format(
    "[{}]",
    pl.selectors.by_dtype(pl.List(pl.String))
    .list.eval(
        pl.when(pl.element().is_null())
        .then(pl.lit("nan"))
        .when(
            pl.element().str.contains("'", literal=True)
            & ~pl.element().str.contains('"', literal=True),
        )
        .then(pl.format('"{}"', pl.element().str.replace_many(
            ["\\", "\n", "\t", "\r"], ["\\\\", "\\n", "\\t", "\\r"])))
        .otherwise(pl.format("'{}'", pl.element().str.replace_many(
            ["\\", "\n", "\t", "\r", "'"], ["\\\\", "\\n", "\\t", "\\r", "\\'"])))
    )
    .list.join(", "),
)

SHIFTS = ["shift_1", "shift_2", "shift_3"]
WEEK_HOURS = 37.5


def clock(text):
    # '06:00' -> 6.0, '8:30' -> 8.5, '14' -> 14.0
    hh, _, mm = text.strip().partition(":")
    return int(hh) + (int(mm) / 60 if mm else 0)


def hours_on_rota(row):
    total = 0.0
    for col in SHIFTS:
        shift = row[col]
        if not isinstance(shift, str) or "-" not in shift:
            continue   # off, sick, blank
        start, end = shift.split("-")
        try:
            h = clock(end) - clock(start)
        except ValueError:
            continue
        if h <= 0:
            h += 24   # a night shift runs past midnight ('12-12' is a full day)
        total += h
    return total


rota = (
    pl.scan_csv(
        "data/rota.csv",
        null_values=PANDAS_NA_VALUES + ["off"],
        infer_schema_length=None,
    )
    .collect()
    .lazy()
)
keepers = pl.scan_csv(
    "data/keepers.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)
print(f"rota lines: {rota.select(pl.len()).collect().item()}")

print(
    "rota ids on two lines:",
    rota.select(
        pl.len().cast(pl.Int64) - pl.col("rota_id").drop_nulls().n_unique().cast(pl.Int64),
    )
    .collect()
    .item(),
)
rota = rota.with_columns(
    keeper=pandas_title(pl.col("keeper").str.strip_chars(PANDAS_WHITESPACE)),
)
rota = rota.with_columns(lock=pl.col("lock").str.strip_chars(PANDAS_WHITESPACE))
rota = rota.with_columns(
    lock=pandas_upper(pl.when(pl.col("lock").str.len_chars() > 0).then(pl.col("lock").str.slice(0, 1))) + pl.col("lock").str.slice(1),
)
rota = rota.rename({"boats_through": "boats"}, strict=False).collect().lazy()

# TODO(porter): frame.apply: a loop or a block that only a Python call can run; porter runs
#   hours_on_rota on Polars rows only when it knows every column's type (convert with --data); write
#   the function as column expressions (pl.when / arithmetic); map_elements is a last resort
# TODO(porter): frame.setitem: a Series computed by pandas, row for row from this frame, is put back
#   by position; port the computation to an expression
rota = rota.with_columns(
    hours=pl.Series(
        rota.collect().to_pandas().apply(hours_on_rota, axis=1),
        nan_to_null=True,
    ),
)

rota = rota.with_columns(sick_shifts=pl.lit(0, dtype=pl.Int64))
for col in SHIFTS:
    rota = rota.with_columns(
        sick_shifts=pl.col("sick_shifts") + (pl.col(col) == "sick").fill_null(False).cast(pl.Int64),
    )
rota = (
    rota
    .with_columns(boats_per_hour=(pl.col("boats") / pl.col("hours")).fill_nan(None))
    .collect()
    .lazy()
)
print(
    pl.concat([
        rota.select("hours", "boats_per_hour")
        .select(
            pl.lit("count").alias("index"),
            pl.selectors.numeric().count().cast(pl.Float64),
        ),
        rota.select("hours", "boats_per_hour")
        .select(
            pl.lit("mean").alias("index"),
            pandas_reduce(pl.selectors.numeric().cast(pl.Float64), how="mean"),
        ),
        rota.select("hours", "boats_per_hour")
        .select(
            pl.lit("std").alias("index"),
            pandas_reduce(pl.selectors.numeric().cast(pl.Float64), how="std"),
        ),
        rota.select("hours", "boats_per_hour")
        .select(
            pl.lit("min").alias("index"),
            pl.selectors.numeric().min().cast(pl.Float64),
        ),
        rota.select("hours", "boats_per_hour")
        .select(
            pl.lit(pl.Series(["25%", "50%", "75%"])).alias("index"),
            pandas_percentiles(pl.selectors.numeric(), [0.25, 0.5, 0.75]),
        ),
        rota.select("hours", "boats_per_hour")
        .select(
            pl.lit("max").alias("index"),
            pl.selectors.numeric().max().cast(pl.Float64),
        ),
    ])
    .collect(),
)

# --- pay per keeper and week; the keepers list has Piers twice, the first rate stands
rates = keepers.unique("keeper", keep="first", maintain_order=True)
pay = (
    rota
    .drop_nulls(["keeper", "week_start"])
    .group_by(["keeper", "week_start"])
    .agg(
        pl.col("hours"),
        pl.col("lock").drop_nulls().n_unique().cast(pl.Int64).alias("locks"),
    )
    .with_columns(pandas_group_sums(pl.col("hours"), floats=False))
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort(["keeper", "week_start"])
)
pay = (
    pay
    .rename(
        lambda c, other=rates.collect_schema().names(): c + "_x" if c in other and c not in ("keeper",) else c,
    )
    .join(
        rates.rename(
            lambda c: c + "_y" if c in ("week_start", "hours", "locks") else c,
        ),
        on="keeper",
        how="left",
        nulls_equal=True,
        maintain_order="left_right",
    )
)
pay = pay.with_columns(overtime=(pl.col("hours") - WEEK_HOURS).clip(0, None))
pay = pay.with_columns(
    pay=(
        (pl.col("hours") - pl.col("overtime")) * pl.col("hourly_rate")
        + pl.col("overtime") * pl.col("hourly_rate") * 1.5
    )
    .fill_nan(None)
    .round(2),
)
pay = (
    pay
    .sort(["week_start", "keeper"], nulls_last=True, maintain_order=True)
    .collect()
    .lazy()
)
(
    pay
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        PANDAS_CSV_LISTS,
        PANDAS_CSV_NUMBER_LISTS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("keeper_pay.csv")
)

# --- cover per lock and week
cover = (
    rota
    .drop_nulls(["lock", "week_start"])
    .group_by(["lock", "week_start"])
    .agg(pl.col("hours"), pl.col("boats"), pl.col("sick_shifts").sum().alias("sick"))
    .with_columns(
        pandas_group_sums(pl.col("hours"), floats=False),
        pandas_group_sums(pl.col("boats"), floats=False),
    )
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort(["lock", "week_start"])
)
cover = cover.with_columns(
    boats_per_hour=(pl.col("boats") / pl.col("hours")).fill_nan(None).round(2),
)
(
    cover
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        PANDAS_CSV_LISTS,
        PANDAS_CSV_NUMBER_LISTS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("lock_cover.csv")
)

unmanned = rota.filter((pl.col("hours") == 0) & (pl.col("boats") > 0)).collect().lazy()
(
    unmanned
    .select("rota_id", "lock", "week_start", "keeper", "boats")
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        PANDAS_CSV_LISTS,
        PANDAS_CSV_NUMBER_LISTS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("self_worked.csv")
)
print(
    "self-worked lines:",
    unmanned.select(pl.len()).collect().item(),
    "| overtime hours:",
    pandas_total(
        pay.select(
            pl.col("overtime").implode().alias("values"),
            pl.col("overtime").sum().alias("total"),
        )
        .collect(),
    ),
)
