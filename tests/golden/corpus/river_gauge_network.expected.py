"""River gauge network: daily levels per gauge, the highest reading of each gauge, flood
alerts against the bank height, and monthly flow per river."""
import os
import polars as pl

# Text that pandas' read_csv reads as a missing value.
PANDAS_NA_VALUES = [
    "", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null",
]


def pandas_text_values(values):
    """Texts as pandas gives them: its own string array, nan for a missing one, where one is
    missing (Polars gives None); otherwise the same texts as a numpy array, so that pandas is
    not imported for them."""
    return values.to_pandas().unique() if values.null_count() else values.to_numpy()


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

readings = pl.scan_csv(
    "data/readings.csv",
    null_values=PANDAS_NA_VALUES + [],
    infer_schema_length=None,
)
stations = pl.scan_csv(
    "data/stations.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)

readings = readings.unique(keep="first", maintain_order=True)
readings = readings.with_columns(
    gauge=pandas_upper(pl.col("gauge").str.strip_chars(PANDAS_WHITESPACE)),
)
readings = (
    readings
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
unread = (
    readings
    .select(pl.col("read_at").is_null().sum().cast(pl.Int64))
    .collect()
    .to_series()
    .to_numpy()[0]
)
readings = readings.drop_nulls("read_at")
readings = readings.with_columns(observer=pandas_title(pl.col("observer")))

# the flow was not always written down: estimate it from the level where it is missing
estimate = pl.col("level_cm") * 0.1
readings = (
    readings
    .with_columns(flow_m3s=pl.col("flow_m3s").fill_null(estimate.round(2)))
    .collect()
    .lazy()
)

# ---- daily mean level per gauge, every day from a gauge's first reading to its last
daily = (
    readings
    .with_columns(pl.col("read_at").dt.truncate("1d").alias("read_at"))
    .drop_nulls(["gauge", "read_at"])
    .group_by(["gauge", "read_at"])
    .agg(pl.col("level_cm"))
    .with_columns(
        pandas_group_sums(
            pl.col("level_cm"),
            mean=True,
            floats=False,
            sorted_within=["gauge"],
        ),
    )
    .pipe(
        lambda binned: binned.group_by("gauge").agg(pl.datetime_ranges(pl.col("read_at").min(), pl.col("read_at").max(), "1d").explode().drop_nulls().alias("read_at")).explode("read_at").sort(["gauge", "read_at"]).join(binned, on=["gauge", "read_at"], how="left", maintain_order="left"),
    )
    .select(
        pl.col("gauge"),
        pl.col("read_at"),
        pl.col("level_cm").round(1).alias("level_cm"),
    )
)
daily = daily.rename({"read_at": "day", "level_cm": "mean_level_cm"})

# ---- the highest reading of each gauge
readings = readings.collect().lazy()
peaks = (
    readings
    .filter(
        pl.col("gauge").is_not_null(),
        pl.int_range(pl.len()).over("gauge") == pl.col("level_cm").arg_max().over("gauge"),
    )
    .sort("gauge", maintain_order=True)
    .select("gauge", "read_at", "level_cm", "observer")
    .collect()
    .lazy()
)

# ---- alerts against the bank height
checked = (
    readings
    .rename(
        lambda c, other=stations.collect_schema().names(): c + "_x" if c in other and c not in ("gauge",) else c,
    )
    .with_columns(_in_left=pl.lit(True))
    .join(
        stations.rename(
            lambda c, other=readings.collect_schema().names(): c + "_y" if c in other and c not in ("gauge",) else c,
        )
        .with_columns(_in_right=pl.lit(True)),
        on="gauge",
        how="left",
        nulls_equal=True,
        maintain_order="left_right",
        validate="m:1",
    )
    .with_columns(
        _merge=pl.when(
            pl.col("_in_left").is_not_null() & pl.col("_in_right").is_not_null(),
        )
        .then(pl.lit("both"))
        .when(pl.col("_in_left").is_not_null())
        .then(pl.lit("left_only"))
        .otherwise(pl.lit("right_only"))
        .cast(pl.Enum(["left_only", "right_only", "both"])),
    )
    .drop("_in_left", "_in_right")
    .collect()
    .lazy()
)
unknown_gauges = pandas_text_values(checked.filter(pl.col("_merge") == "left_only").select(pl.col("gauge").unique(maintain_order=True)).collect().to_series()).tolist()
checked = checked.filter(pl.col("_merge") == "both").drop("_merge")
checked = checked.with_columns(margin_cm=pl.col("bank_height_cm") - pl.col("level_cm"))
checked = checked.with_columns(
    margin_cm=pl.when((pl.col("margin_cm") > 0).fill_null(False))
    .then(pl.col("margin_cm"))
    .otherwise(0),
)
checked = checked.with_columns(
    alert=pl.when(pl.col("margin_cm") < 30)
    .then(pl.lit("high water"))
    .otherwise(pl.lit("normal")),
)
checked = checked.with_columns(
    level_cm=pl.when((pl.col("level_cm") > 250).fill_null(False))
    .then(None)
    .otherwise(pl.col("level_cm")),
)
checked = (
    checked
    .with_columns(month=pl.col("read_at").dt.to_string("%Y-%m"))
    .collect()
    .lazy()
)

alerts = checked.filter(pl.col("alert") == "high water")
alerts_per_day = (
    alerts
    .with_columns(pl.col("read_at").dt.date().alias("read_at"))
    .drop_nulls("read_at")
    .group_by("read_at")
    .agg(pl.col("reading_id").count().cast(pl.Int64))
    .sort("read_at")
    .rename({"read_at": "day"})
)

monthly = (
    checked
    .drop_nulls(["month", "river"])
    .group_by(["month", "river"])
    .agg(pl.col("flow_m3s"))
    .with_columns(pandas_group_sums(pl.col("flow_m3s"), floats=False))
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort(["month", "river"])
)
monthly = monthly.with_columns(flow_m3s=pl.col("flow_m3s").round(2))
wide = (
    monthly
    .select("month", "river", "flow_m3s")
    .sort("river")
    .collect()
    .pivot(on="river", index="month", values="flow_m3s")
    .sort("month")
    .rename({"null": "nan"}, strict=False)
    .lazy()
)

os.makedirs("out", exist_ok=True)
pl.collect_all([
    (
        daily
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
        .sink_csv("out/gauge_daily_levels.csv", lazy=True)
    ),
    (
        peaks
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
        .sink_csv("out/gauge_peaks.csv", lazy=True)
    ),
    alerts_per_day.with_columns(PANDAS_CSV_INTS).sink_csv("out/gauge_alerts_per_day.csv", lazy=True),
    (
        wide
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
        .sink_csv("out/river_monthly_flow.csv", lazy=True)
    ),
])
print(f"unreadable stamps: {unread}, gauges without a station: {unknown_gauges}")
print(peaks.collect().to_pandas().to_string(index=False))
