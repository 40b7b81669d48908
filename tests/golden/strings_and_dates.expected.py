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

visits = pl.scan_csv(
    "visits.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)
visits = visits.with_columns(
    name=pandas_title(pl.col("name").str.strip_chars(PANDAS_WHITESPACE)),
)
visits = visits.with_columns(
    day=pl.when(
        pl.col("day")
        .str.contains(
            "(?i)^(?:(?:[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))-(?:1[0-2]|0[1-9]|[1-9])-(?:3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9]))$",
        ),
    )
    .then(pl.col("day"))
    .str.to_datetime("%Y-%m-%d", time_unit="us", strict=False),
)
visits = (
    visits
    .with_columns(weekday=pl.col("day").dt.weekday().cast(pl.Int32) - 1)
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("weekday",) if t[c].has_nulls()]),
    )
    .lazy()
)
long_names = visits.filter(pl.col("name").str.len_chars().cast(pl.Int64) > 10)
weekend = visits.filter(pl.col("weekday") >= 5)
(
    weekend
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
    .sink_csv("weekend_visits.csv")
)
