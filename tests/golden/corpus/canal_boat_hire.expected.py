"""Canal boat hire yard: engine hours between hires, damage bills, and each boat's month.

Pasted from the yard office notebook. The booking book is typed up weekly; 'n/a' means the
meter was not read or the field was skipped. A hire with no boat name still counts towards
the takings but not towards any boat's hours.
"""
import polars as pl

# Text that pandas' read_csv reads as a missing value.
PANDAS_NA_VALUES = [
    "", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null",
]


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

# In[1]:
hires = (
    pl.scan_csv(
        "data/hires.csv",
        null_values=PANDAS_NA_VALUES,
        infer_schema_length=None,
    )
    .collect()
    .lazy()
)
boats = pl.scan_csv(
    "data/boats.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)
print((hires.select(pl.len()).collect().item(), len(hires.collect_schema())))
print(hires.head(5).collect())

# In[2]:
def tidy(df):
    df = df.with_columns(
        boat=pandas_title(pl.col("boat").str.strip_chars(PANDAS_WHITESPACE)),
    )
    df = df.with_columns(boat=pl.col("boat").replace({"Ebène": "Ébène"}))
    df = df.with_columns(
        base=pl.col("base")
        .str.strip_chars(PANDAS_WHITESPACE)
        .str.replace_many({"İ": "i", "Σ": "σ"})
        .str.to_lowercase(),
    )
    df = df.with_columns(
        damage=pl.col("damage")
        .str.strip_chars(PANDAS_WHITESPACE)
        .str.replace_many({"İ": "i", "Σ": "σ"})
        .str.to_lowercase(),
    )
    return df

hires = tidy(hires)
hires = hires.unique(keep="first", maintain_order=True)
hires = (
    hires
    .with_columns(
        out_date=pl.when(
            pl.col("out_date")
            .str.contains(
                "(?i)^(?:(?:[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))-(?:1[0-2]|0[1-9]|[1-9])-(?:3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9]))$",
            ),
        )
        .then(pl.col("out_date"))
        .str.to_datetime("%Y-%m-%d", time_unit="us", strict=False),
    )
    .collect()
    .lazy()
)
print(
    "hires with no date:",
    hires.select(pl.col("out_date").is_null().sum().cast(pl.Int64))
    .collect()
    .to_series()
    .to_numpy()[0],
)

# In[3]: meter readings: carry the last reading forward within a boat, hours used per hire
hires = hires.sort(
    ["boat", "out_date", "hire_no"],
    nulls_last=True,
    maintain_order=True,
)
hires = hires.with_columns(
    meter=pl.when(pl.col("boat").is_not_null())
    .then(pl.col("meter_hours").forward_fill().over("boat")),
)
hires = hires.with_columns(
    engine_hours=pl.when(pl.col("boat").is_not_null())
    .then(pl.col("meter").diff().over("boat")),
)
hires = (
    hires
    .with_columns(
        hire_seq=pl.when(pl.col("boat").is_not_null()).then(pl.int_range(pl.len(), dtype=pl.Int64).over("boat")) + 1,
    )
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("hire_seq",) if t[c].has_nulls()]),
    )
    .lazy()
)
hires = hires.with_columns(
    hours_to_date=pl.when(pl.col("boat").is_not_null())
    .then(
        pl.when(
            pl.col("engine_hours").is_not_null(),
            pl.col("engine_hours")
            .rolling_sum(2 ** 31 - 1, min_samples=1)
            .shift()
            .fill_null(0)
            .is_finite(),
        )
        .then(pl.col("engine_hours").rolling_sum(2 ** 31 - 1, min_samples=1))
        .over("boat"),
    ),
)
hires = hires.with_columns(fuel_litres=pl.col("fuel_litres").clip(0, 110))
hires = hires.with_columns(
    fuel_avg3=pl.when(pl.col("boat").is_not_null())
    .then(
        pl.when(
            pl.col("fuel_litres").cast(pl.Float64).replace([float("inf"), float("-inf")], None).rolling_min(3, min_samples=1) == pl.col("fuel_litres").cast(pl.Float64).replace([float("inf"), float("-inf")], None).rolling_max(3, min_samples=1),
        )
        .then(
            pl.col("fuel_litres")
            .cast(pl.Float64)
            .replace([float("inf"), float("-inf")], None)
            .forward_fill(),
        )
        .otherwise(
            pl.col("fuel_litres")
            .cast(pl.Float64)
            .replace([float("inf"), float("-inf")], None)
            .rolling_mean(3, min_samples=1),
        )
        .over("boat"),
    ),
)
hires = hires.with_columns(fuel_avg3=pl.col("fuel_avg3").round(2)).collect().lazy()
print(
    hires.select("boat", "out_date", "meter", "engine_hours", "hire_seq", "fuel_avg3")
    .head(12)
    .collect(),
)

# In[4]: charges
hires = hires.with_columns(list_price=pl.col("nights") * 150 + 95)
hires = hires.with_columns(charge=pl.col("price").fill_null(pl.col("list_price")))
long_hire = pl.col("nights").is_between(7, 14).fill_null(False)
hires = hires.with_columns(
    charge=pl.when(long_hire)
    .then(pl.col("charge") * 0.9)
    .otherwise(
        pl.coalesce(pl.selectors.by_name("charge", require_all=False), pl.lit(None)),
    ),
)
hires = hires.with_columns(
    charge=pl.when(pl.col("crew") > 6)
    .then(pl.col("charge") + 40)
    .otherwise(
        pl.coalesce(pl.selectors.by_name("charge", require_all=False), pl.lit(None)),
    ),
)
hires = hires.with_columns(
    damage_kind=pl.when(pl.col("damage").str.contains("hull"))
    .then(pl.lit("hull"))
    .when(pl.col("damage").is_in(["scratch", "window"]))
    .then(pl.lit("cosmetic"))
    .when(pl.col("damage").is_not_null())
    .then(pl.lit("other"))
    .otherwise(pl.lit("none")),
)
hires = hires.with_columns(
    damage_fee=pl.when(pl.col("damage_kind") == "hull")
    .then(250)
    .otherwise(
        pl.when(pl.col("damage_kind") == "none")
        .then(pl.lit(0, dtype=pl.Int64))
        .otherwise(60),
    ),
)
hires = hires.with_columns(
    kept_deposit=pl.min_horizontal(pl.col("damage_fee"), pl.col("deposit")),
)
hires = hires.collect().to_pandas()
# TODO(porter): frame.getitem.column: kept on pandas with the statement it is in
# TODO(porter): series.isna: kept on pandas with the statement it is in
# TODO(porter): frame.loc_setitem: loc assignment to several columns of a frame whose columns porter
#   does not know
hires.loc[hires["deposit"].isna(), ["kept_deposit", "damage_fee"]] = 0
hires = pl.from_pandas(hires).lazy()
hires = hires.with_columns(charge=pl.col("charge").round(2)).collect().lazy()

damage = hires.filter(pl.col("damage_kind").ne_missing(pl.lit("none")))
damage = damage.select(
    "hire_no",
    "boat",
    "out_date",
    "damage",
    "damage_kind",
    "damage_fee",
    "kept_deposit",
)
(
    damage
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
    .sink_csv("data/damage_bill.csv")
)

# In[5]: each boat's month, ranked
hires = (
    hires
    .with_columns(month=pl.col("out_date").dt.month().cast(pl.Int32))
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("month",) if t[c].has_nulls()]),
    )
    .lazy()
)
hires = hires.with_columns(
    month_take=pl.when(pl.col("boat").is_not_null() & pl.col("month").is_not_null())
    .then(pl.col("charge").sum().over("boat", "month")),
)
hires = hires.with_columns(
    share_of_month=(
        pl.col("charge")
        / pl.when(pl.col("month").is_not_null()).then(pl.col("charge").sum().over("month"))
    )
    .fill_nan(None),
)
hires = (
    hires
    .with_columns(share_of_month=pl.col("share_of_month").round(4))
    .collect()
    .lazy()
)
month = (
    hires
    .drop_nulls(["boat", "month"])
    .unique(["boat", "month"], keep="first", maintain_order=True)
)
month = month.select("boat", "month", "month_take")
month = month.with_columns(
    rank=pl.when(pl.col("month").is_not_null())
    .then(
        pl.col("month_take")
        .rank("dense", descending=True)
        .cast(pl.Float64)
        .over("month"),
    ),
)
month = (
    month
    .sort(["month", "rank", "boat"], nulls_last=True, maintain_order=True)
    .collect()
    .lazy()
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
    .sink_csv("data/boat_month.csv")
)
print(month.head(10).collect())

# In[6]: service due: hours since the last service interval
boats = boats.filter(pl.col("boat").is_last_distinct())
log = (
    hires
    .rename(
        lambda c, other=boats.collect_schema().names(): c + "_x" if c in other and c not in ("boat",) else c,
    )
    .join(
        boats.rename(
            lambda c, other=hires.collect_schema().names(): c + "_y" if c in other and c not in ("boat",) else c,
        ),
        on="boat",
        how="left",
        nulls_equal=True,
        maintain_order="left_right",
    )
)
log = log.with_columns(service_every=pl.col("service_every").fill_null(10000))
log = log.with_columns(
    since_service=pl.when(pl.col("service_every") != 0)
    .then(pl.col("hours_to_date") % pl.col("service_every")),
)
log = log.with_columns(
    due=(pl.col("since_service") > pl.col("service_every") * 0.8).fill_null(False),
)
log = log.with_columns(
    hours_per_night=(pl.col("engine_hours") / pl.col("nights")).fill_nan(None),
)
log = (
    log
    .select(
        "hire_no",
        "boat",
        "class",
        "hire_seq",
        "out_date",
        "engine_hours",
        "hours_to_date",
        "since_service",
        "due",
        "hours_per_night",
        "charge",
        "share_of_month",
        "fuel_avg3",
    )
    .collect()
    .lazy()
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
    .sink_csv("data/boat_log.csv")
)
last = log.filter(
    pl.col("boat").is_not_null() & (pl.int_range(pl.len(), 0, -1).over("boat") <= 1),
)
print(last.filter(pl.col("due")).collect())
