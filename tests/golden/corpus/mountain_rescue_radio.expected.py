"""Mountain rescue base station: what the radio log says about each call-out.

One line per message. The logger writes Unix seconds (UTC); the debrief wants local time.
Positions come in the team's shorthand: "POS 4612/0759 ALT 2350 CAS 2 ankle".
"""
import numpy as np
import pandas as pd
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

PRIORITY = {"mayday": 1, "cas": 2, "pos": 3}
TEAMS = {"team 1": "T1", "team1": "T1", "team 2": "T2", "heli": "H", "héli-2": "H", "base": "B"}


def tidy(log):
    log = log.with_columns(
        call=pl.col("call")
        .str.strip_chars(PANDAS_WHITESPACE)
        .str.replace_many({"İ": "i", "Σ": "σ"})
        .str.to_lowercase(),
    )
    log = log.with_columns(unit=pl.col("call").replace_strict(TEAMS, default=None))
    log = log.with_columns(
        operator=pandas_title(pl.col("operator").str.strip_chars(PANDAS_WHITESPACE)),
    )
    log = log.with_columns(channel=pl.col("channel").str.zfill(2))
    # r24-33 -> R-24-033
    log = log.with_columns(
        incident=pandas_upper(pl.col("incident"))
        .str.replace_all("^R-?(\\d\\d)-?(\\d+)(\\n?)$", "R-${1}-${2}${3}"),
    )
    num = pl.col("incident").str.splitn("-", 3)
    log = log.with_columns(
        incident=pl.lit("R-") + num.struct.field("field_1") + "-" + num.struct.field("field_2").str.pad_start(3, "0"),
    )
    return log


log = pl.scan_csv(
    "data/radio_log.csv",
    null_values=PANDAS_NA_VALUES + ["?"],
    schema_overrides={"channel": pl.String},
    infer_schema_length=None,
)
inc = pl.scan_csv(
    "data/incidents.csv",
    null_values=PANDAS_NA_VALUES + [],
    infer_schema_length=None,
)
print(
    (log.select(pl.len()).collect().item(), len(log.collect_schema())),
    (inc.select(pl.len()).collect().item(), len(inc.collect_schema())),
)
log = log.unique("msg_id", keep="first", maintain_order=True)
log = tidy(log).collect().lazy()

# TODO(porter): pd.to_datetime: unit= of something other than a column of numbers
# TODO(porter): frame.setitem: a Series computed by pandas, row for row from this frame, is put back
#   by position; port the computation to an expression
log = log.with_columns(
    at=pl.Series(
        pd.to_datetime(
            log.select(pl.col("logged")).collect().to_series().to_pandas(),
            unit="s",
        ),
        nan_to_null=True,
    ),
)
log = log.with_columns(
    at=pl.col("at").dt.replace_time_zone("UTC").dt.convert_time_zone("Europe/Vienna"),
)
log = log.with_columns(local_day=pl.col("at").dt.to_string("%Y-%m-%d"))
log = (
    log
    .with_columns(hour=pl.col("at").dt.hour().cast(pl.Int32))
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("hour",) if t[c].has_nulls()]),
    )
    .lazy()
)
print(log.select("logged", "at", "local_day").head(5).collect())

# message shorthand
txt = pl.col("text")
log = log.with_columns(
    is_pos=(txt.str.starts_with("POS") | txt.str.starts_with("pos")).fill_null(False),
)
pos = txt.str.extract_groups(
    "(?i)pos[\\s\\x1c-\\x1f]+(?P<lat>\\d{4})/(?P<lon>\\d{4})(?:[\\s\\x1c-\\x1f]+alt[\\s\\x1c-\\x1f]+(?P<alt>\\d+))?",
)
log = log.with_columns(
    lat=(
        pos.struct.field("lat").str.head(2).str.strip_chars().str.replace_all("([0-9])_([0-9])", "${1}${2}").str.replace_all("([0-9])_([0-9])", "${1}${2}").cast(pl.Float64)
        + pandas_div(pos.struct.field("lat").str.slice(2).str.strip_chars().str.replace_all("([0-9])_([0-9])", "${1}${2}").str.replace_all("([0-9])_([0-9])", "${1}${2}").cast(pl.Float64), 60)
    )
    .fill_nan(None),
)
log = log.with_columns(
    lon=(
        pos.struct.field("lon").str.head(2).str.strip_chars().str.replace_all("([0-9])_([0-9])", "${1}${2}").str.replace_all("([0-9])_([0-9])", "${1}${2}").cast(pl.Float64)
        + pandas_div(pos.struct.field("lon").str.slice(2).str.strip_chars().str.replace_all("([0-9])_([0-9])", "${1}${2}").str.replace_all("([0-9])_([0-9])", "${1}${2}").cast(pl.Float64), 60)
    )
    .fill_nan(None),
)
log = log.with_columns(
    alt=pos.struct.field("alt")
    .str.strip_chars()
    .cast(pl.Float64, strict=False)
    .fill_nan(None),
)
log = log.with_columns(
    casualties=txt.str.extract("(?i)cas[\\s\\x1c-\\x1f]+(\\d+)", 1)
    .str.strip_chars()
    .str.replace_all("([0-9])_([0-9])", "${1}${2}")
    .str.replace_all("([0-9])_([0-9])", "${1}${2}")
    .cast(pl.Float64),
)
log = log.with_columns(mayday=txt.str.contains("(?i)mayday").fill_null(False))
log = (
    log
    .with_columns(numbers=txt.str.extract_all("\\d+").list.len().cast(pl.Int64))
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("numbers",) if t[c].has_nulls()]),
    )
    .lazy()
)
log = (
    log
    .with_columns(words=txt.str.count_matches("[\\s\\x1c-\\x1f]+").cast(pl.Int64) + 1)
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("words",) if t[c].has_nulls()]),
    )
    .lazy()
)
log = log.with_columns(
    last_word=pandas_upper(txt.str.split(" ").list.get(-1, null_on_oob=True).str.head(1)) + txt.str.split(" ").list.get(-1, null_on_oob=True).str.slice(1).str.replace_many({"İ": "i", "Σ": "σ"}).str.to_lowercase(),
)
log = log.with_columns(
    eta=txt.str.extract("(?i)eta[\\s\\x1c-\\x1f]+(\\d+)[\\s\\x1c-\\x1f]*min", 1)
    .str.strip_chars()
    .str.replace_all("([0-9])_([0-9])", "${1}${2}")
    .str.replace_all("([0-9])_([0-9])", "${1}${2}")
    .cast(pl.Float64),
)
log = log.with_columns(
    eta_h=txt.str.extract("(?i)eta[\\s\\x1c-\\x1f]+(\\d+)h(\\d+)", 1)
    .str.strip_chars()
    .str.replace_all("([0-9])_([0-9])", "${1}${2}")
    .str.replace_all("([0-9])_([0-9])", "${1}${2}")
    .cast(pl.Float64),
)
log = log.with_columns(
    eta=pl.when(pl.col("eta_h").is_not_null())
    .then(pl.col("eta_h") * 60 + 20)
    .otherwise(
        pl.coalesce(pl.selectors.by_name("eta", require_all=False), pl.lit(None)),
    ),
)


# porter: band(alt), a function of each value, is ported as one expression
#   where it was applied, and left out here


log = (
    log
    .with_columns(
        band=pl.when((pl.col("alt") != pl.col("alt")).fill_null(True))
        .then(pl.lit("unknown"))
        .when(pl.col("alt") >= 3000)
        .then(pl.lit("high"))
        .when(pl.col("alt") >= 2000)
        .then(pl.lit("alpine"))
        .otherwise(pl.lit("valley")),
    )
    .collect()
    .lazy()
)
# TODO(porter): series.map: isinstance of a value whose type porter does not know (convert with
#   --data)
# TODO(porter): frame.setitem: a Series computed by pandas, row for row from this frame, is put back
#   by position; port the computation to an expression
log = log.with_columns(
    kind=pl.Series(
        log.select(txt.alias("text"))
        .collect()
        .to_series()
        .to_pandas()
        .map(
            lambda t: "mayday" if isinstance(t, str) and "mayday" in t.lower() else ("pos" if isinstance(t, str) and t[:3].lower() == "pos" else "other"),
        ),
        nan_to_null=True,
    ),
)
log = log.with_columns(
    priority=pl.col("kind")
    .replace_strict(PRIORITY, default=None)
    .fill_null(9)
    .cast(pl.Float64)
    .cast(pl.Int64),
)
log = (
    log
    .with_columns(text_len=txt.str.len_chars().cast(pl.Int64))
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("text_len",) if t[c].has_nulls()]),
    )
    .lazy()
)
print(
    log.select(pl.col("band"))
    .drop_nulls()
    .group_by("band", maintain_order=True)
    .agg(pl.len().cast(pl.Int64).alias("count"))
    .sort("count", descending=True, maintain_order=True)
    .collect(),
)

# incidents: how long each stayed open, from the hand-typed sheet
inc = inc.unique(keep="first", maintain_order=True)
inc = inc.with_columns(
    opened=pl.when(
        pl.col("opened")
        .str.contains(
            "(?i)^(?:(?:[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))-(?:1[0-2]|0[1-9]|[1-9])-(?:3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9])\\s+(?:2[0-3]|[0-1][0-9]|[0-9]):(?:[0-5][0-9]|[0-9]))$",
        ),
    )
    .then(pl.col("opened"))
    .when(
        ~pl.col("opened").is_in(["", "NaT", "nat", "NAT", "nan", "NaN", "NAN"]) & pl.col("opened").is_not_null(),
    )
    .then(pl.lit("="))
    .str.to_datetime("%Y-%m-%d %H:%M", time_unit="us"),
)
inc = inc.with_columns(
    closed=pl.when(
        pl.col("closed")
        .str.contains(
            "(?i)^(?:(?:[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))-(?:1[0-2]|0[1-9]|[1-9])-(?:3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9])\\s+(?:2[0-3]|[0-1][0-9]|[0-9]):(?:[0-5][0-9]|[0-9]))$",
        ),
    )
    .then(pl.col("closed"))
    .str.to_datetime("%Y-%m-%d %H:%M", time_unit="us", strict=False),
)
inc = inc.with_columns(
    closed=pl.col("closed").fill_null(pl.col("opened") + pl.duration(hours=12)),
)
inc = inc.with_columns(open_for=pl.col("closed") - pl.col("opened"))
inc = inc.with_columns(
    hours=pandas_div(
        pl.col("open_for")
        .dt.total_microseconds()
        .pipe(lambda us: us // 1_000_000 + us % 1_000_000 / (us * 0 + 1_000_000)),
        3600,
    )
    .round(2),
)
inc = (
    inc
    .with_columns(
        whole_days=pl.col("open_for").dt.total_microseconds() // 86_400_000_000,
    )
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("whole_days",) if t[c].has_nulls()]),
    )
    .lazy()
)
inc = inc.with_columns(per_crew=(pl.col("hours") / pl.col("crew")).fill_nan(None))
inc = inc.with_columns(place=pandas_title(pl.col("place")))
inc = (
    inc
    .with_columns(
        tag=pandas_upper(pl.col("place").str.head(4)) + "-" + pl.col("incident").str.tail(3),
    )
    .collect()
    .lazy()
)
print(inc.collect())

# --- what each incident heard on the radio
per_inc = (
    log
    .drop_nulls("incident")
    .group_by("incident")
    .agg(
        pl.col("msg_id").count().cast(pl.Int64).alias("msgs"),
        pl.col("mayday").sum().cast(pl.Int64).alias("maydays"),
        pl.col("is_pos").sum().cast(pl.Int64).alias("positions"),
        pl.col("alt").max().alias("highest"),
        pl.col("casualties").max().alias("casualties"),
        pl.col("words").sum().alias("words"),
    )
    .sort("incident")
)
per_inc = (
    per_inc
    .join(
        inc.select("incident", "hours", "whole_days", "per_crew", "tag"),
        on="incident",
        how="left",
        nulls_equal=True,
        maintain_order="left_right",
    )
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("whole_days",) if t[c].has_nulls()]),
    )
    .lazy()
)
per_inc = (
    per_inc
    .with_columns(
        msgs_per_hour=(pl.col("msgs") / pl.col("hours")).fill_nan(None).round(3),
    )
    .collect()
    .lazy()
)
(
    per_inc
    .with_columns(PANDAS_CSV_ZONED_DATETIMES)
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_DATETIMES,
        PANDAS_CSV_DURATIONS,
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        PANDAS_CSV_LISTS,
        PANDAS_CSV_NUMBER_LISTS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("data/incident_radio.csv")
)
print(per_inc.collect())

# --- positions for the map, local time as text
pts = (
    log
    .filter(pl.col("lat").is_not_null())
    .select(
        "msg_id",
        "incident",
        "unit",
        "local_day",
        "hour",
        "lat",
        "lon",
        "alt",
        "band",
    )
)
pts = pts.with_columns(lat=pl.col("lat").round(4))
pts = pts.with_columns(lon=pl.col("lon").round(4))
pts = pts.with_columns(
    label=pl.when(pl.col("alt") == pl.col("alt"))
    .then(
        pl.concat_str(
            pl.col("incident").fill_null("nan"),
            pl.lit("/"),
            pl.col("msg_id").cast(pl.String).fill_null("nan"),
        ),
    )
    .otherwise(pl.lit("no alt")),
)
pts = pts.sort(
    ["incident", "local_day", "hour", "msg_id"],
    nulls_last=False,
    maintain_order=True,
)
(
    pts
    .with_columns(PANDAS_CSV_ZONED_DATETIMES)
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_DATETIMES,
        PANDAS_CSV_DURATIONS,
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        PANDAS_CSV_LISTS,
        PANDAS_CSV_NUMBER_LISTS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("data/positions.csv")
)

# --- operators' day by day load
load_ = (
    log
    .drop_nulls(["local_day", "operator"])
    .group_by(["local_day", "operator"])
    .agg(
        pl.len().cast(pl.Int64).alias("n"),
        (pl.col("text_len") > 30)
        .fill_null(False)
        .sum()
        .cast(pl.Int64)
        .alias("long_msgs"),
    )
    .sort(["local_day", "operator"])
)
load_ = load_.with_columns(
    share=(
        pl.col("n")
        / pl.when(pl.col("local_day").is_not_null()).then(pl.col("n").sum().over("local_day"))
    )
    .fill_nan(None),
)
load_ = load_.with_columns(share=pl.col("share").round(4)).collect().lazy()
(
    load_
    .with_columns(
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("data/operator_load.csv")
)
print(load_.head(12).collect())
print(
    "messages without a time:",
    log.select(pl.col("at").is_null().sum().cast(pl.Int64))
    .collect()
    .to_series()
    .to_numpy()[0],
)
