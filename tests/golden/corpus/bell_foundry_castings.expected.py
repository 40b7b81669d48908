"""Bell foundry casting log: yield of each pour, how far each bell came out of tune, and
each furnace's run of castings between relinings.

Pasted from the foundry manager's notebook. Pourers write the stamp two ways (ISO at the
north pit, day-first at the south one). 'n/a' and 'not weighed' mean the bell left for the
fettling shop before it was weighed. A casting with no furnace still counts in the month.
"""
import polars as pl

# Text that pandas' read_csv reads as a missing value.
PANDAS_NA_VALUES = [
    "", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null",
]


def pandas_group_mean(x):
    """x.mean() of floats in a group_by or a window, as pandas' group mean computes it: the
    sum added as pandas_group_sum adds it, over the count; missing where there is no value."""
    return (pandas_group_sum(x) / x.fill_nan(None).count()).fill_nan(None)


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


def pandas_group_sum(x):
    """x.sum() of floats in a group_by or a window, as pandas' group sum adds them: a
    compensated (Kahan) sum in row order, missing values skipped, which is what Polars'
    rolling sum computes over a window longer than the group. Polars' own sum adds in
    another order and can end a unit in the last digit away (212.40000000000003 for 212.4),
    and round(2) of a sum on a half cent then gives the other cent."""
    kept = x.fill_nan(None).drop_nulls()
    return kept.rolling_sum(2**40, min_samples=1).last().fill_null(0.0)


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


def pandas_div(numerator, divisor):
    """numerator / divisor, each value divided as pandas divides it: Polars multiplies by the
    reciprocal of a single divisor, which can be one binary digit off the quotient (and a later
    round() then goes the other way)."""
    return numerator / (numerator.is_null() * 0 + divisor)


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

# In[1]:
castings = (
    pl.scan_csv(
        "data/castings.csv",
        null_values=PANDAS_NA_VALUES + ["not weighed"],
        schema_overrides={"cast_no": pl.String},
        infer_schema_length=None,
    )
    .collect()
    .lazy()
)
prices = pl.scan_csv(
    "data/alloy_prices.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)
print((castings.select(pl.len()).collect().item(), len(castings.collect_schema())))
print(castings.head(5).collect())

# In[2]:
def clean(df):
    df = df.with_columns(
        furnace=pl.col("furnace")
        .str.strip_chars(PANDAS_WHITESPACE)
        .str.replace_many({"İ": "i", "Σ": "σ"})
        .str.to_lowercase(),
    )
    df = df.with_columns(
        moulder=pandas_upper(pl.col("moulder").str.strip_chars(PANDAS_WHITESPACE).str.head(1)) + pl.col("moulder").str.strip_chars(PANDAS_WHITESPACE).str.slice(1).str.replace_many({"İ": "i", "Σ": "σ"}).str.to_lowercase(),
    )
    df = df.with_columns(
        alloy=pl.col("alloy")
        .str.strip_chars(PANDAS_WHITESPACE)
        .str.replace_many({"İ": "i", "Σ": "σ"})
        .str.to_lowercase(),
    )
    df = df.with_columns(cast_no=pl.col("cast_no").str.zfill(4))
    return df

castings = clean(castings)
castings = castings.unique(keep="first", maintain_order=True)
iso = (
    pl.when(pl.col("cast_at").str.contains("(?i)^(?:(?:[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))-(?:1[0-2]|0[1-9]|[1-9])-(?:3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9])\\s+(?:2[0-3]|[0-1][0-9]|[0-9]):(?:[0-5][0-9]|[0-9]))$")).then(pl.col("cast_at")).str
    .to_datetime("%Y-%m-%d %H:%M", time_unit="us", strict=False)
)
dayfirst = (
    pl.when(pl.col("cast_at").str.contains("(?i)^(?:(?:3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9])/(?:1[0-2]|0[1-9]|[1-9])/(?:[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))\\s+(?:2[0-3]|[0-1][0-9]|[0-9]):(?:[0-5][0-9]|[0-9]))$")).then(pl.col("cast_at")).str
    .to_datetime("%d/%m/%Y %H:%M", time_unit="us", strict=False)
)
castings = castings.with_columns(cast_at=iso.fill_null(dayfirst)).collect().lazy()
print(
    "unreadable stamps:",
    castings.select(pl.col("cast_at").is_null().sum().cast(pl.Int64))
    .collect()
    .to_series()
    .to_numpy()[0],
)
castings = castings.drop_nulls("cast_at")

# In[3]: the note: letter, sharp/flat, octave ('Eb4 (flat)', 'd 4', 'D#4')
parts = (
    pl.col("note").str
    .extract_groups("^([A-Ga-g])[\\s\\x1c-\\x1f]?([#b]?)[\\s\\x1c-\\x1f]?(\\d)")
)
castings = castings.with_columns(
    pitch=pandas_upper(parts.struct.field("1")) + parts.struct.field("2"),
)
castings = castings.with_columns(
    octave=parts.struct.field("3")
    .str.strip_chars()
    .str.replace_all("([0-9])_([0-9])", "${1}${2}")
    .str.replace_all("([0-9])_([0-9])", "${1}${2}")
    .cast(pl.Float64),
)
castings = (
    castings
    .with_columns(flat_marked=pl.col("note").str.contains("(?i)flat").fill_null(False))
    .collect()
    .lazy()
)
print(castings.select("note", "pitch", "octave", "flat_marked").head(10).collect())

# In[4]: yield and tuning
castings = castings.with_columns(
    yield_pct=(pl.col("bell_kg") / pl.col("metal_kg") * 100).fill_nan(None).round(1),
)
castings = castings.with_columns(yield_pct=pl.col("yield_pct").clip(None, 100))
castings = castings.with_columns(abs_cents=pl.col("cents_off").abs())

# porter: tuning_grade(cents), a function of each value, is ported as one expression
#   where it was applied, and left out here

castings = castings.with_columns(
    tuning=pl.when((pl.col("cents_off") != pl.col("cents_off")).fill_null(True))
    .then(pl.lit("untested"))
    .when(pl.col("cents_off").abs() <= 5)
    .then(pl.lit("true"))
    .when(pl.col("cents_off").abs() <= 15)
    .then(pl.lit("tunable"))
    .otherwise(pl.lit("recast")),
)
castings = castings.with_columns(
    defect_kind=pl.when(pl.col("defect").str.contains("(?i)crack"))
    .then(pl.lit("crack"))
    .when(pl.col("defect").str.contains("(?i)poros|shrink"))
    .then(pl.lit("gas"))
    .when(pl.col("defect").is_not_null())
    .then(pl.lit("other"))
    .otherwise(pl.lit("sound")),
)
castings = castings.with_columns(
    scrap=pl.when((pl.col("defect_kind") == "crack") | (pl.col("tuning") == "recast"))
    .then(True)
    .otherwise(False),
)
castings = castings.with_columns(
    hot_pour=(pl.col("pour_temp_c") > 1150).fill_null(False),
)
castings = castings.with_columns(
    cool_hours=pl.when(pl.col("hot_pour"))
    .then(pl.col("cool_hours") + 12)
    .otherwise(
        pl.coalesce(
            pl.selectors.by_name("cool_hours", require_all=False),
            pl.lit(None),
        ),
    ),
)
castings = castings.with_columns(
    cool_days=pandas_div(pl.col("cool_hours"), 24).round(2),
)
castings = castings.with_columns(
    ready_at=pl.col("cast_at") + pl.duration(hours=pl.col("cool_hours")),
)
castings = castings.with_columns(ready_day=pl.col("ready_at").dt.truncate("1d"))

# In[5]: each furnace's run: gap between pours, running metal since the first pour, rank of the yield
castings = castings.sort(
    ["furnace", "cast_at", "cast_no"],
    nulls_last=True,
    maintain_order=True,
)
castings = (
    castings
    .with_columns(
        pour_seq=pl.when(pl.col("furnace").is_not_null()).then(pl.int_range(pl.len(), dtype=pl.Int64).over("furnace")) + 1,
    )
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("pour_seq",) if t[c].has_nulls()]),
    )
    .lazy()
)
castings = castings.with_columns(
    hours_since_pour=pandas_div(
        pl.when(pl.col("furnace").is_not_null())
        .then(pl.col("cast_at").diff().over("furnace"))
        .dt.total_microseconds()
        .pipe(lambda us: us // 1_000_000 + us % 1_000_000 / (us * 0 + 1_000_000)),
        3600,
    ),
)
castings = castings.with_columns(
    metal_to_date=pl.when(pl.col("furnace").is_not_null())
    .then(
        pl.when(
            pl.col("metal_kg").is_not_null(),
            pl.col("metal_kg")
            .rolling_sum(2 ** 31 - 1, min_samples=1)
            .shift()
            .fill_null(0)
            .is_finite(),
        )
        .then(pl.col("metal_kg").rolling_sum(2 ** 31 - 1, min_samples=1))
        .over("furnace"),
    ),
)
castings = castings.with_columns(
    yield_rank=pl.when(pl.col("furnace").is_not_null())
    .then(
        pl.col("yield_pct")
        .rank("min", descending=True)
        .cast(pl.Float64)
        .over("furnace"),
    ),
)
castings = castings.with_columns(
    temp_avg3=pl.when(pl.col("furnace").is_not_null())
    .then(
        pl.when(
            pl.col("pour_temp_c").cast(pl.Float64).replace([float("inf"), float("-inf")], None).rolling_min(3, min_samples=1) == pl.col("pour_temp_c").cast(pl.Float64).replace([float("inf"), float("-inf")], None).rolling_max(3, min_samples=1),
        )
        .then(
            pl.col("pour_temp_c")
            .cast(pl.Float64)
            .replace([float("inf"), float("-inf")], None)
            .forward_fill(),
        )
        .otherwise(
            pl.col("pour_temp_c")
            .cast(pl.Float64)
            .replace([float("inf"), float("-inf")], None)
            .rolling_mean(3, min_samples=1),
        )
        .over("furnace"),
    )
    .round(1),
)
castings = castings.with_columns(
    yield_vs_furnace=(
        pl.col("yield_pct")
        - pl.when(pl.col("furnace").is_not_null()).then(pandas_group_mean(pl.col("yield_pct")).over("furnace"))
    )
    .fill_nan(None)
    .round(2),
)
castings = (
    castings
    .with_columns(relined=(pl.col("hours_since_pour") > 24 * 14).fill_null(False))
    .collect()
    .lazy()
)
print(
    castings.select(
        "furnace",
        "cast_no",
        "pour_seq",
        "hours_since_pour",
        "metal_to_date",
        "temp_avg3",
    )
    .head(12)
    .collect(),
)

log = castings.select(
    "cast_no",
    "cast_at",
    "furnace",
    "moulder",
    "pitch",
    "octave",
    "tuning",
    "defect_kind",
    "scrap",
    "yield_pct",
    "yield_rank",
    "yield_vs_furnace",
    "pour_seq",
    "hours_since_pour",
    "metal_to_date",
    "temp_avg3",
    "relined",
    "cool_days",
    "ready_day",
)
(
    log
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
    .sink_csv("data/casting_log.csv")
)

# In[6]: what the metal cost, month by month
prices = prices.filter(pl.col("alloy").is_last_distinct())
costed = (
    castings
    .rename(
        lambda c, other=prices.collect_schema().names(): c + "_x" if c in other and c not in ("alloy",) else c,
    )
    .join(
        prices.rename(
            lambda c, other=castings.collect_schema().names(): c + "_y" if c in other and c not in ("alloy",) else c,
        ),
        on="alloy",
        how="left",
        nulls_equal=True,
        maintain_order="left_right",
    )
)
costed = costed.with_columns(
    metal_eur=(pl.col("metal_kg") * pl.col("eur_per_kg")).round(2),
)
costed = costed.with_columns(
    scrap_eur=pl.when(pl.col("scrap").fill_null(False))
    .then(pl.col("metal_eur"))
    .otherwise(0),
)
costed = (
    costed
    .with_columns(month=pl.col("cast_at").dt.to_string("%Y-%m"))
    .collect()
    .lazy()
)
monthly = (
    costed
    .with_columns(_porter_rows_in_key_order=pl.col("month").is_sorted())
    .drop_nulls("month")
    .group_by("month")
    .agg(
        pl.col("cast_no").count().cast(pl.Int64).alias("castings"),
        pl.col("metal_kg"),
        pl.col("metal_eur"),
        pl.col("scrap_eur"),
        pl.col("scrap").sum().cast(pl.Int64).alias("scrapped"),
        pl.col("_porter_rows_in_key_order").first(),
    )
    .with_columns(
        pandas_group_sums(
            pl.col("metal_kg"),
            floats=False,
            in_key_order=pl.col("_porter_rows_in_key_order"),
        ),
        pandas_group_sums(
            pl.col("metal_eur"),
            floats=False,
            in_key_order=pl.col("_porter_rows_in_key_order"),
        ),
        pandas_group_sums(
            pl.col("scrap_eur"),
            floats=False,
            in_key_order=pl.col("_porter_rows_in_key_order"),
        ),
    )
    .drop("_porter_rows_in_key_order")
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort("month")
)
monthly = monthly.with_columns(
    scrap_share=(pl.col("scrap_eur") / pl.col("metal_eur")).fill_nan(None).round(3),
)
monthly = monthly.with_columns(
    eur_per_bell=(pl.col("metal_eur") / (pl.col("castings") - pl.col("scrapped")))
    .fill_nan(None)
    .round(2),
)
monthly = monthly.with_columns(metal_eur=pl.col("metal_eur").round(2))
monthly = monthly.with_columns(scrap_eur=pl.col("scrap_eur").round(2)).collect().lazy()
(
    monthly
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
    .sink_csv("data/monthly_metal.csv")
)
print(monthly.collect())

# In[7]: each moulder: bells in tune, and the last bell cast
moulders = (
    costed
    .group_by("moulder")
    .agg(
        pl.col("cast_no").count().cast(pl.Int64).alias("bells"),
        (pl.col("tuning") == "true")
        .fill_null(False)
        .sum()
        .cast(pl.Int64)
        .alias("true_bells"),
        pl.col("abs_cents").alias("mean_cents"),
        pl.col("cast_at").max().alias("last_cast"),
    )
    .with_columns(pandas_group_sums(pl.col("mean_cents"), mean=True, floats=False))
    .sort("moulder", nulls_last=True)
)
moulders = moulders.with_columns(mean_cents=pl.col("mean_cents").round(1))
moulders = (
    moulders
    .with_columns(
        days_since_last=(pl.datetime(2025, 12, 31) - pl.col("last_cast")).dt.total_microseconds() // 86_400_000_000,
    )
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("days_since_last",) if t[c].has_nulls()]),
    )
    .lazy()
)
moulders = (
    moulders
    .sort(
        ["true_bells", "moulder"],
        descending=[True, False],
        nulls_last=True,
        maintain_order=True,
    )
    .collect()
    .lazy()
)
(
    moulders
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
    .sink_csv("data/moulders.csv")
)
print(moulders.collect())
