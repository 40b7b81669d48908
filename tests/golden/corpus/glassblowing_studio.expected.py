"""Glassblowing studio furnace log: cold spells per furnace, what each gaffer made and earned,
and gas burnt per piece.

The thermocouples are read every forty minutes. A single reading jumps about (the door was
open, a gather was being taken), so the studio smooths each furnace's readings with an
exponentially weighted mean before calling a spell cold. 'off' and '?' mean the reading
was not taken; a few stamps were typed day-first and are dropped.
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


# The characters Python's str.isspace() calls whitespace, which pandas' str.strip() takes
# off: Polars' strip_chars() leaves the separators \x1c-\x1f.
PANDAS_WHITESPACE = (
    "\t\n\x0b\x0c\r\x1c\x1d\x1e\x1f \x85\xa0\u1680"
    "\u2000\u2001\u2002\u2003\u2004\u2005\u2006\u2007"
    "\u2008\u2009\u200a\u2028\u2029\u202f\u205f\u3000"
)

# Datetime columns with a time zone as pandas' to_csv writes them: the time always, then the
# offset (+01:00); no fraction of a second when none has one, milliseconds when they are enough.
PANDAS_CSV_ZONED_DATETIMES = (
    pl.when((pl.selectors.datetime(time_zone="*").dt.microsecond() == 0).all())
    .then(pl.selectors.datetime(time_zone="*").dt.strftime("%Y-%m-%d %H:%M:%S%:z"))
    .when((pl.selectors.datetime(time_zone="*").dt.microsecond() % 1000 == 0).all())
    .then(pl.selectors.datetime(time_zone="*").dt.strftime("%Y-%m-%d %H:%M:%S%.3f%:z"))
    .otherwise(pl.selectors.datetime(time_zone="*").dt.strftime("%Y-%m-%d %H:%M:%S%.6f%:z"))
)

# Datetime columns as pandas' to_csv writes them: dates only when every time in the column is
# midnight, no fraction of a second when none has one, milliseconds when they are enough.
PANDAS_CSV_DATETIMES = (
    pl.when((pl.selectors.datetime() == pl.selectors.datetime().dt.truncate("1d")).all())
    .then(pl.selectors.datetime().dt.strftime("%Y-%m-%d"))
    .when((pl.selectors.datetime().dt.microsecond() == 0).all())
    .then(pl.selectors.datetime().dt.strftime("%Y-%m-%d %H:%M:%S"))
    .when((pl.selectors.datetime().dt.microsecond() % 1000 == 0).all())
    .then(pl.selectors.datetime().dt.strftime("%Y-%m-%d %H:%M:%S%.3f"))
    .otherwise(pl.selectors.datetime().dt.strftime("%Y-%m-%d %H:%M:%S%.6f"))
)

# Duration columns as pandas' to_csv writes them: "2 days" when every value is a whole number
# of days, else "-1 days +23:00:00", with microseconds when one value has them.
PANDAS_CSV_DURATIONS = (
    pl.when((pl.selectors.duration().dt.total_microseconds() % 86_400_000_000 == 0).all())
    .then(
        (pl.selectors.duration().dt.total_microseconds() // 86_400_000_000).cast(pl.String)
        + " days"
    )
    .otherwise(
        (pl.selectors.duration().dt.total_microseconds() // 86_400_000_000).cast(pl.String)
        + pl.when(pl.selectors.duration().dt.total_microseconds() < 0)
        .then(pl.lit(" days +"))
        .otherwise(pl.lit(" days "))
        + (pl.selectors.duration().dt.total_microseconds() % 86_400_000_000 // 3_600_000_000)
        .cast(pl.String).str.zfill(2)
        + ":"
        + (pl.selectors.duration().dt.total_microseconds() % 3_600_000_000 // 60_000_000)
        .cast(pl.String).str.zfill(2)
        + ":"
        + (pl.selectors.duration().dt.total_microseconds() % 60_000_000 // 1_000_000)
        .cast(pl.String).str.zfill(2)
        + pl.when((pl.selectors.duration().dt.total_microseconds() % 1_000_000 == 0).all())
        .then(pl.lit(""))
        .otherwise(
            "." + (pl.selectors.duration().dt.total_microseconds() % 1_000_000)
            .cast(pl.String).str.zfill(6)
        )
    )
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

COLD = {"main pot": 1100, "glory hole": 1150, "annealer": 460}
SPAN = 4


def clean_text(s):
    return (
        s.str.strip_chars(PANDAS_WHITESPACE).str.replace_many({"İ": "i", "Σ": "σ"}).str
        .to_lowercase()
    )


log = (
    pl.scan_csv(
        "data/furnace_log.csv",
        null_values=PANDAS_NA_VALUES + ["off", "?"],
        infer_schema_length=None,
    )
    .collect()
    .lazy()
)
gaffers = pl.scan_csv(
    "data/gaffers.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)
ids = (
    log
    .select(pl.col("reading_id").drop_nulls().n_unique().cast(pl.Int64))
    .collect()
    .item()
)
print(f"{log.select(pl.len()).collect().item()} readings, {ids} distinct ids")

dupes = (
    log
    .select(
        pl.len().cast(pl.Int64) - pl.col("reading_id").drop_nulls().n_unique().cast(pl.Int64),
    )
    .collect()
    .item()
)
print("readings sent twice by the logger:", dupes)
log = log.with_columns(furnace=clean_text(pl.col("furnace")))
log = log.with_columns(
    gaffer=pandas_title(pl.col("gaffer").str.strip_chars(PANDAS_WHITESPACE)),
)
log = (
    log
    .with_columns(
        read_at=pl.when(
            pl.col("read_at")
            .str.contains(
                "(?i)^(?:(?:[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))-(?:1[0-2]|0[1-9]|[1-9])-(?:3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9])\\s+(?:2[0-3]|[0-1][0-9]|[0-9]):(?:[0-5][0-9]|[0-9]))$",
            ),
        )
        .then(pl.col("read_at"))
        .str.to_datetime("%Y-%m-%d %H:%M", time_unit="us", strict=False),
    )
    .collect()
    .lazy()
)
bad = (
    log
    .select(pl.col("read_at").is_null().sum().cast(pl.Int64))
    .collect()
    .to_series()
    .to_numpy()[0]
)
print("stamps that would not parse:", bad)
log = log.drop_nulls("read_at")

# smooth each furnace on its own, in time order
log = log.sort(
    ["furnace", "read_at", "reading_id"],
    nulls_last=True,
    maintain_order=True,
)
log = log.with_columns(
    temp_smooth=pl.when(pl.col("furnace").is_not_null())
    .then(
        pl.col("temp_c")
        .cast(pl.Float64)
        .replace([float("inf"), float("-inf")], None)
        .ewm_mean(span=4, ignore_nulls=True)
        .forward_fill()
        .over("furnace"),
    ),
)
log = log.with_columns(temp_smooth=pl.col("temp_smooth").round(1))
log = (
    log
    .with_columns(
        cold=(pl.col("temp_smooth") < pl.col("furnace").replace_strict(COLD, default=None))
        .fill_null(False),
    )
    .collect()
    .lazy()
)
print(
    log.drop_nulls("furnace")
    .group_by("furnace")
    .agg(pl.col("cold").sum().cast(pl.Int64))
    .sort("furnace")
    .collect(),
)

# --- cold readings, for the maintenance book
cold = (
    log
    .filter(pl.col("cold"))
    .select("reading_id", "furnace", "read_at", "temp_c", "temp_smooth")
)
cold = cold.sort(["furnace", "read_at"], nulls_last=True, maintain_order=True)
(
    cold
    .with_columns(PANDAS_CSV_ZONED_DATETIMES)
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_DATETIMES,
        PANDAS_CSV_DURATIONS,
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("cold_readings.csv")
)

# --- per gaffer and day: pieces, pay, gas per piece
log = log.with_columns(day=pl.col("read_at").dt.date())
made = log.filter(pl.col("gaffer").is_not_null())
made = made.with_columns(pieces=pl.col("pieces").fill_null(0).cast(pl.Int64))
per_day = (
    made
    .with_columns(
        _porter_rows_in_key_order=pl.when(
            ~pl.any_horizontal(pl.col("gaffer", "day").is_null()),
        )
        .then(pl.struct("gaffer", "day"))
        .is_sorted(),
    )
    .drop_nulls(["gaffer", "day"])
    .group_by(["gaffer", "day"])
    .agg(
        pl.col("pieces").sum().alias("pieces"),
        pl.col("gas_m3").alias("gas"),
        pl.col("reading_id").count().cast(pl.Int64).alias("readings"),
        pl.col("temp_smooth").min().alias("coldest"),
        pl.col("_porter_rows_in_key_order").first(),
    )
    .with_columns(
        pandas_group_sums(
            pl.col("gas"),
            floats=False,
            in_key_order=pl.col("_porter_rows_in_key_order"),
        ),
    )
    .drop("_porter_rows_in_key_order")
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort(["gaffer", "day"])
)
rates = gaffers.filter(pl.col("gaffer").is_last_distinct())
per_day = (
    per_day
    .rename(
        lambda c, other=rates.collect_schema().names(): c + "_x" if c in other and c not in ("gaffer",) else c,
    )
    .join(
        rates.rename(
            lambda c: c + "_y" if c in ("day", "pieces", "gas", "readings", "coldest") else c,
        ),
        on="gaffer",
        how="left",
        nulls_equal=True,
        maintain_order="left_right",
    )
)
per_day = per_day.with_columns(
    pay=(pl.col("pieces") * pl.col("rate_per_piece")).fill_nan(None),
)
per_day = per_day.with_columns(
    gas_per_piece=(pl.col("gas") / pl.col("pieces")).fill_nan(None),
)
per_day = per_day.with_columns(gas=pl.col("gas").round(2))
per_day = (
    per_day
    .with_columns(gas_per_piece=pl.col("gas_per_piece").round(3))
    .collect()
    .lazy()
)
(
    per_day
    .with_columns(PANDAS_CSV_ZONED_DATETIMES)
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_DATETIMES,
        PANDAS_CSV_DURATIONS,
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("gaffer_days.csv")
)

totals = (
    per_day
    .with_columns(_porter_rows_in_key_order=pl.col("gaffer").is_sorted())
    .drop_nulls("gaffer")
    .group_by("gaffer")
    .agg(
        pl.col("pieces").sum().alias("pieces"),
        pl.col("pay"),
        pl.col("_porter_rows_in_key_order").first(),
    )
    .with_columns(
        pandas_group_sums(
            pl.col("pay"),
            floats=False,
            in_key_order=pl.col("_porter_rows_in_key_order"),
        ),
    )
    .drop("_porter_rows_in_key_order")
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort("gaffer")
)
totals = totals.sort(
    ["pay", "gaffer"],
    descending=[True, False],
    nulls_last=True,
    maintain_order=True,
)
print(totals.collect())
