"""Town clock-keeper's book: how far each tower clock drifts between windings, when the
weights ran down before the keeper came back, and what the repairs cost per month.

Pasted from the clerk's notebook. Drift is what the keeper read off against the radio
pips before setting the hands: '+12s' and 'fast 12' mean the same, 'stopped' that the
hands were found still (no drift can be read). Turns are crank turns to wind the going
train; the Corn Exchange is rewound by a motor and has no turns for a full wind.
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
log = (
    pl.scan_csv(
        "data/winding_log.csv",
        null_values=PANDAS_NA_VALUES + ["stopped", "--"],
        infer_schema_length=None,
    )
    .collect()
    .lazy()
)
towers = pl.scan_csv(
    "data/towers.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)
print(
    (log.select(pl.len()).collect().item(), len(log.collect_schema())),
    (towers.select(pl.len()).collect().item(), len(towers.collect_schema())),
)
print(log.head(5).collect())

# In[2]:
log = log.with_columns(
    tower=pandas_title(
        pl.col("tower")
        .str.strip_chars(PANDAS_WHITESPACE)
        .str.replace_all("^[Ss]t\\.?[\\s\\x1c-\\x1f]+", "St "),
    ),
)
log = log.with_columns(
    keeper=pandas_title(pl.col("keeper").str.strip_chars(PANDAS_WHITESPACE)),
)
log = log.unique(keep="first", maintain_order=True).collect().lazy()
print(
    log.select(pl.col("tower"))
    .group_by("tower", maintain_order=True)
    .agg(pl.len().cast(pl.Int64).alias("count"))
    .sort("count", descending=True, maintain_order=True)
    .collect(),
)

iso = (
    pl.when(pl.col("wound_at").str.contains("(?i)^(?:(?:[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))-(?:1[0-2]|0[1-9]|[1-9])-(?:3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9])\\s+(?:2[0-3]|[0-1][0-9]|[0-9]):(?:[0-5][0-9]|[0-9]))$")).then(pl.col("wound_at")).str
    .to_datetime("%Y-%m-%d %H:%M", time_unit="us", strict=False)
)
uk = (
    pl.when(pl.col("wound_at").str.contains("(?i)^(?:(?:3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9])/(?:1[0-2]|0[1-9]|[1-9])/(?:[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))\\s+(?:2[0-3]|[0-1][0-9]|[0-9]):(?:[0-5][0-9]|[0-9]))$")).then(pl.col("wound_at")).str
    .to_datetime("%d/%m/%Y %H:%M", time_unit="us", strict=False)
)
log = log.with_columns(wound_at=iso.fill_null(uk)).collect().lazy()
print(
    "no stamp:",
    log.select(pl.col("wound_at").is_null().sum().cast(pl.Int64))
    .collect()
    .to_series()
    .to_numpy()[0],
)
log = log.filter(pl.col("wound_at").is_not_null())
log = log.with_columns(day=pl.col("wound_at").dt.truncate("1d"))
log = log.with_columns(month=pl.col("wound_at").dt.to_string("%Y-%m"))
log = log.with_columns(
    before_8=(pl.col("wound_at") < pl.col("day") + pl.duration(hours=8))
    .fill_null(False),
)

# In[3]: drift in seconds, fast positive
drift = (
    pl.col("drift").str.strip_chars(PANDAS_WHITESPACE).str.replace_many({"İ": "i", "Σ": "σ"}).str
    .to_lowercase()
)
num = (
    drift.str.extract("(\\d+(?:\\.\\d+)?)", 1).str.strip_chars().str.replace_all("([0-9])_([0-9])", "${1}${2}").str
    .replace_all("([0-9])_([0-9])", "${1}${2}")
    .cast(pl.Float64)
)
slow = (drift.str.starts_with("slow") | drift.str.starts_with("-")).fill_null(False)
log = log.with_columns(drift_s=pl.when(slow.fill_null(True)).then(-num).otherwise(num))
log = log.with_columns(
    drift_s=pl.when((pl.col("drift_s").abs() > 300).fill_null(False))
    .then(None)
    .otherwise(pl.col("drift_s")),
)   # misread, minutes for seconds
log = (
    log
    .with_columns(stopped=pl.col("drift").is_null() & pl.col("tower").is_not_null())
    .collect()
    .lazy()
)
print(log.select("drift", "drift_s", "stopped").head(10).collect())

# In[4]: the tower cards; the Market Hall card was copied after the overhaul
towers = towers.filter(pl.col("tower").is_last_distinct())
log = (
    log
    .rename(
        lambda c, other=towers.collect_schema().names(): c + "_x" if c in other and c not in ("tower",) else c,
    )
    .join(
        towers.rename(
            lambda c, other=log.collect_schema().names(): c + "_y" if c in other and c not in ("tower",) else c,
        ),
        on="tower",
        how="left",
        nulls_equal=True,
        maintain_order="left_right",
    )
)
log = log.with_columns(weight_kg=pl.col("weight_kg").fill_null(pl.col("std_weight_kg")))
log = log.with_columns(turns=pl.col("turns").clip(0, None))
log = log.with_columns(
    wound_pct=(pl.col("turns") / pl.col("turns_full") * 100).fill_nan(None).round(1),
)
log = log.with_columns(age=2025 - pl.col("built"))
log = log.with_columns(
    era=pl.when(pl.col("built") < 1837)
    .then(pl.lit("georgian"))
    .when(pl.col("built") < 1901)
    .then(pl.lit("victorian"))
    .otherwise(pl.lit("modern")),
)

# In[5]: gaps between windings, per tower
log = log.sort(["tower", "wound_at", "entry"], nulls_last=True, maintain_order=True)
log = log.with_columns(
    keeper=pl.when(pl.col("tower").is_not_null())
    .then(pl.col("keeper").forward_fill().over("tower")),
)
log = log.with_columns(
    gap=pl.when(pl.col("tower").is_not_null())
    .then(pl.col("wound_at").diff().over("tower")),
)
log = log.with_columns(
    gap_h=pandas_div(
        pl.col("gap")
        .dt.total_microseconds()
        .pipe(lambda us: us // 1_000_000 + us % 1_000_000 / (us * 0 + 1_000_000)),
        3600,
    )
    .round(2),
)
log = (
    log
    .with_columns(gap_days=pl.col("gap").dt.total_microseconds() // 86_400_000_000)
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("gap_days",) if t[c].has_nulls()]),
    )
    .lazy()
)
log = log.with_columns(
    drift_per_day=(pl.col("drift_s") / pandas_div(pl.col("gap_h"), 24))
    .fill_nan(None)
    .round(2),
)
log = log.with_columns(
    run_out=pl.col("wound_at") - pl.col("gap") + pl.duration(days=pl.col("run_days")),
)
log = log.with_columns(
    cum_drift=pl.when(pl.col("tower").is_not_null())
    .then(
        pl.when(
            pl.col("drift_s").is_not_null(),
            pl.col("drift_s")
            .rolling_sum(2 ** 31 - 1, min_samples=1)
            .shift()
            .fill_null(0)
            .is_finite(),
        )
        .then(pl.col("drift_s").rolling_sum(2 ** 31 - 1, min_samples=1))
        .over("tower"),
    ),
)
log = log.with_columns(
    drift_avg4=pl.when(pl.col("tower").is_not_null())
    .then(
        pl.when(
            pl.col("drift_s").replace([float("inf"), float("-inf")], None).rolling_min(4, min_samples=2) == pl.col("drift_s").replace([float("inf"), float("-inf")], None).rolling_max(4, min_samples=2),
        )
        .then(
            pl.col("drift_s")
            .replace([float("inf"), float("-inf")], None)
            .forward_fill(),
        )
        .otherwise(
            pl.col("drift_s")
            .replace([float("inf"), float("-inf")], None)
            .rolling_mean(4, min_samples=2),
        )
        .over("tower"),
    )
    .round(2),
)
log = log.with_columns(
    worst_so_far=pl.when(pl.col("tower").is_not_null())
    .then(
        pl.col("drift_s")
        .replace([float("inf"), float("-inf")], None)
        .rolling_max(2 ** 31 - 1, min_samples=1)
        .over("tower"),
    ),
)


# porter: state(row), a function of each row, is ported as one expression
#   where it was applied, and left out here


log = (
    log
    .with_columns(
        state=pl.when((pl.col("gap_h") != pl.col("gap_h")).fill_null(True))
        .then(pl.lit("first"))
        .when(pl.col("wound_at") > pl.col("run_out"))
        .then(pl.lit("ran down"))
        .when(pl.col("stopped").fill_null(True))
        .then(pl.lit("stopped"))
        .when(pl.col("drift_s").abs() > 20)
        .then(pl.lit("adjust"))
        .otherwise(pl.lit("ok")),
    )
    .collect()
    .lazy()
)
print(
    log.select(pl.col("state"))
    .drop_nulls()
    .group_by("state", maintain_order=True)
    .agg(pl.len().cast(pl.Int64).alias("count"))
    .sort("count", descending=True, maintain_order=True)
    .collect(),
)

# In[6]: the vestry wants the longest waits, and pages the clerk may have typed twice
LATE_HOURS = 24 * 9
worst = (
    log
    .sort("gap_days", descending=True, nulls_last=True, maintain_order=True)
    .filter(
        (pl.int_range(pl.len()) < 8) | pl.col("gap_days").eq_missing(pl.col("gap_days").head(8).last()),
    )
    .select("tower", "wound_at", "gap_days", "gap_h", "state")
)
print(worst.collect())
late = log.filter((pl.col("state") == "ran down") & (pl.col("gap_h") > LATE_HOURS))
print(
    late.select(pl.len()).collect().item(),
    "windings more than",
    LATE_HOURS,
    "hours after the last",
)
twice = log.filter(pl.struct(pl.col("tower"), pl.col("day")).is_duplicated())
print(
    twice.select("entry", "tower", "wound_at", "keeper")
    .sort(["tower", "wound_at"], nulls_last=True, maintain_order=True)
    .head(10)
    .collect(),
)

# In[7]: repairs: new parts carry the carrier's charge, the clerk adds it by hand
log = log.with_columns(
    repair=pl.col("repair")
    .str.strip_chars(PANDAS_WHITESPACE)
    .str.replace_many({"İ": "i", "Σ": "σ"})
    .str.to_lowercase(),
)
KINDS = {"oiled pivots": "service", "cleaned dial": "service", "new rope": "parts", "new line": "parts",
         "new fly vane": "parts", "replaced pallet": "parts", "re-leaded weight": "parts"}
log = log.with_columns(repair_kind=pl.col("repair").replace_strict(KINDS, default=None))
log = log.with_columns(cost=pl.col("cost").fill_null(0))
log = log.with_columns(
    cost=pl.when(pl.col("repair_kind") == "parts")
    .then(pl.col("cost") + 7.5)
    .otherwise(
        pl.coalesce(pl.selectors.by_name("cost", require_all=False), pl.lit(None)),
    ),
)
log = log.with_columns(
    repair=pl.when(pl.col("temp_c") < 0)
    .then(pl.col("repair") + " (frost)")
    .otherwise(
        pl.coalesce(pl.selectors.by_name("repair", require_all=False), pl.lit(None)),
    ),
)
log = log.with_columns(cost=pl.col("cost").round(2)).collect().lazy()

book = log.select(
    "entry",
    "tower",
    "keeper",
    "wound_at",
    "month",
    "before_8",
    "drift_s",
    "gap_h",
    "gap_days",
    "drift_per_day",
    "cum_drift",
    "drift_avg4",
    "worst_so_far",
    "state",
    "wound_pct",
    "weight_kg",
    "era",
    "age",
)
(
    book
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
    .sink_csv("data/winding_book.csv")
)

month = (
    log
    .with_columns(
        _porter_rows_in_key_order=pl.when(
            ~pl.any_horizontal(pl.col("tower", "month").is_null()),
        )
        .then(pl.struct("tower", "month"))
        .is_sorted(),
    )
    .drop_nulls(["tower", "month"])
    .group_by(["tower", "month"])
    .agg(
        pl.col("entry").count().cast(pl.Int64).alias("windings"),
        pl.col("drift_s").alias("mean_drift"),
        (pl.col("state") == "ran down")
        .fill_null(False)
        .sum()
        .cast(pl.Int64)
        .alias("ran_down"),
        pl.col("repair_kind").count().cast(pl.Int64).alias("repairs"),
        pl.col("cost"),
        pl.col("_porter_rows_in_key_order").first(),
    )
    .with_columns(
        pandas_group_sums(
            pl.col("mean_drift"),
            mean=True,
            in_key_order=pl.col("_porter_rows_in_key_order"),
        ),
        pandas_group_sums(
            pl.col("cost"),
            floats=False,
            in_key_order=pl.col("_porter_rows_in_key_order"),
        ),
    )
    .drop("_porter_rows_in_key_order")
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort(["tower", "month"])
)
month = month.with_columns(mean_drift=pl.col("mean_drift").round(2))
month = month.with_columns(
    cost_per_winding=(pl.col("cost") / pl.col("windings")).fill_nan(None).round(2),
)
(
    month
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
    .sink_csv("data/tower_month.csv")
)

repairs = log.filter(pl.col("repair_kind").is_not_null())
repairs = (
    repairs
    .select("tower", "day", "keeper", "repair", "repair_kind", "cost", "temp_c")
    .collect()
    .lazy()
)
(
    repairs
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        pl.selectors.datetime().dt.strftime("%d/%m/%Y"),
        PANDAS_CSV_DURATIONS,
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("data/repairs.csv")
)
print(repairs.tail(5).collect())
