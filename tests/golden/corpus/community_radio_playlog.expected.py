# community radio -- play log for the music rights return and the volunteers' rota
# copied out of the station notebook, run from the station PC
import numpy as np
import polars as pl

# Text that pandas' read_csv reads as a missing value.
PANDAS_NA_VALUES = [
    "", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null",
]


def pandas_dtypes_text(probe):
    """print(df.dtypes) as pandas prints it, from the frame's probe row (PANDAS_DTYPE_PROBE),
    without importing pandas: each column's type as pandas names it (an integer column with a
    missing value is float64, a True/False one object), names to the left and types to the
    right, only the first and last five of more than sixty columns."""
    kinds = []
    for name, dtype in probe.schema.items():
        missing = probe[name].has_nulls()
        if dtype.is_integer() and dtype not in (pl.Int128, pl.UInt128):
            kind = "float64" if missing else str(dtype).lower()
        elif dtype in (pl.Float32, pl.Float64):
            kind = str(dtype).lower()
        elif dtype == pl.Boolean:
            kind = "object" if missing else "bool"
        elif dtype == pl.String:
            kind = "str"
        elif dtype == pl.Categorical or isinstance(dtype, pl.Enum):
            kind = "category"
        elif isinstance(dtype, pl.Datetime):
            zone = f", {dtype.time_zone}" if dtype.time_zone else ""
            kind = f"datetime64[{dtype.time_unit}{zone}]"
        elif dtype == pl.Date:
            kind = "datetime64[ms]"
        elif isinstance(dtype, pl.Duration):
            kind = f"timedelta64[{dtype.time_unit}]"
        elif dtype in (pl.Time, pl.Null, pl.Binary) \
                or isinstance(dtype, (pl.List, pl.Array, pl.Struct, pl.Decimal)):
            kind = "object"
        else:
            kind = None
        if kind is None or "\t" in name or "\r" in name or "\n" in name:  # pandas names it
            return str(probe.to_pandas().dtypes)
        kinds.append((name, kind))
    if not kinds:
        return "Series([], dtype: object)"
    footer = "dtype: object"
    if len(kinds) > 60:
        footer = f"Length: {len(kinds)}, dtype: object"
        kinds = [*kinds[:5], None, *kinds[-5:]]
    shown = [k for k in kinds if k is not None]
    left = max(len(name) for name, _ in shown)
    right = max(len(kind) for _, kind in shown)
    lines = [" " * left + "   " + "...".center(right + 1) if k is None
             else k[0].ljust(left) + "    " + k[1].rjust(right) for k in kinds]
    return "\n".join([*lines, footer])


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

# One row per column that gives pandas the dtype of the whole column: the first value, or a
# missing value where the column holds one (pandas makes such an int column float64 and a
# True/False one object); no row when the frame has none.
PANDAS_DTYPE_PROBE = pl.when(~pl.all().is_null().any()).then(pl.all().head(1))

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

plays = (
    pl.scan_csv(
        "data/plays.csv",
        null_values=PANDAS_NA_VALUES + ["?"],
        infer_schema_length=None,
    )
    .collect()
    .lazy()
)
people = pl.scan_csv(
    "data/presenters.csv",
    null_values=PANDAS_NA_VALUES + [],
    infer_schema_length=None,
)
print(plays.head(3).collect())
plays = plays.unique(keep="first", maintain_order=True)

# the old desk writes 01.03.2024 21:04, the new one ISO with seconds
aired = (
    pl.when(pl.col("aired").str.contains("(?i)^(?:(?:[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))-(?:1[0-2]|0[1-9]|[1-9])-(?:3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9])\\s+(?:2[0-3]|[0-1][0-9]|[0-9]):(?:[0-5][0-9]|[0-9]):(?:6[0-1]|[0-5][0-9]|[0-9]))$")).then(pl.col("aired")).str
    .to_datetime("%Y-%m-%d %H:%M:%S", time_unit="us", strict=False)
)
aired = aired.fill_null(
    pl.when(
        pl.col("aired")
        .str.contains(
            "(?i)^(?:(?:3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9])\\.(?:1[0-2]|0[1-9]|[1-9])\\.(?:[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))\\s+(?:2[0-3]|[0-1][0-9]|[0-9]):(?:[0-5][0-9]|[0-9]))$",
        ),
    )
    .then(pl.col("aired"))
    .str.to_datetime("%d.%m.%Y %H:%M", time_unit="us", strict=False),
)
plays = plays.with_columns(aired=aired).collect().lazy()
print(
    "not understood:",
    plays.select(pl.col("aired").is_null().sum().cast(pl.Int64))
    .collect()
    .to_series()
    .to_numpy()[0],
)

# "Artist - Title (feat. X)"; a phone types an en dash
plays = plays.with_columns(
    track=pl.col("track").str.replace_all("–", "-", literal=True),
)
bits = pl.col("track").str.splitn(" - ", 2)
plays = plays.with_columns(
    artist=pandas_title(
        bits.struct.field("field_0").str.strip_chars(PANDAS_WHITESPACE),
    ),
)
plays = plays.with_columns(
    title=pandas_upper(bits.struct.field("field_1").str.strip_chars(PANDAS_WHITESPACE).str.head(1)) + bits.struct.field("field_1").str.strip_chars(PANDAS_WHITESPACE).str.slice(1).str.replace_many({"İ": "i", "Σ": "σ"}).str.to_lowercase(),
)
plays = plays.with_columns(
    artist=pl.when(bits.struct.field("field_1").is_null())
    .then(pl.lit(None, dtype=pl.Float64))
    .otherwise(
        pl.coalesce(pl.selectors.by_name("artist", require_all=False), pl.lit(None)),
    ),
)
plays = plays.with_columns(
    title=pl.when(bits.struct.field("field_1").is_null())
    .then(
        pandas_upper(bits.struct.field("field_0").str.head(1)) + bits.struct.field("field_0").str.slice(1).str.replace_many({"İ": "i", "Σ": "σ"}).str.to_lowercase(),
    )
    .otherwise(
        pl.coalesce(pl.selectors.by_name("title", require_all=False), pl.lit(None)),
    ),
)
plays = plays.with_columns(feat=pl.col("title").str.extract("\\(feat\\. ([^)]+)\\)", 1))
plays = plays.with_columns(
    live=pl.col("title").str.contains("\\(live\\)").fill_null(False),
)
plays = (
    plays
    .with_columns(
        edit=(
            pl.col("title").str.ends_with("edit")
            | pl.col("title").str.ends_with("Edit")
        )
        .fill_null(False),
    )
    .collect()
    .lazy()
)


# lengths: 3:45, 245s, 1:02:03
def seconds(t):
    if not isinstance(t, str):
        return np.nan
    if t.endswith("s"):
        return float(t[:-1])
    parts = t.split(":")
    if len(parts) == 3:
        return int(parts[0]) * 3600 + int(parts[1]) * 60 + int(parts[2])
    return int(parts[0]) * 60 + int(parts[1])


# TODO(porter): series.map: isinstance of a value whose type porter does not know (convert with
#   --data); porter runs seconds on Polars values only on a text or float column whose type it knows
#   (convert with --data)
# TODO(porter): frame.setitem: a Series computed by pandas, row for row from this frame, is put back
#   by position; port the computation to an expression
plays = plays.with_columns(
    secs=pl.Series(
        plays.select(pl.col("length")).collect().to_series().to_pandas().map(seconds),
        nan_to_null=True,
    ),
)
plays = plays.with_columns(dur=pl.duration(seconds=pl.col("secs")))
plays = plays.with_columns(ends=pl.col("aired") + pl.col("dur"))
plays = plays.with_columns(overrun=(pl.col("secs") > 600).fill_null(False))
plays = plays.with_columns(
    mins=pl.when(pl.col("secs") == pl.col("secs"))
    .then(pandas_div(pl.col("secs"), 60).ceil().cast(pl.Int64))
    .otherwise(0),
)

plays = plays.with_columns(
    presenter=pandas_upper(pl.col("presenter").str.strip_chars(PANDAS_WHITESPACE)),
)
plays = plays.with_columns(show=pandas_title(pl.col("show")))
plays = plays.with_columns(
    req=pandas_upper(pl.col("request_from").str.strip_chars(PANDAS_WHITESPACE)),
)
plays = plays.with_columns(
    requested=pl.col("req").is_in(["FR", "DE", "PT", "GB"]).fill_null(False),
)
plays = plays.with_columns(
    country=pl.col("req")
    .replace_strict({"FR": "France", "DE": "Germany", "PT": "Portugal"}, default=None)
    .fill_null(pl.lit("-")),
)

plays = plays.with_columns(day=pl.col("aired").dt.truncate("1d"))
plays = (
    plays
    .with_columns(dow=pl.col("aired").dt.weekday().cast(pl.Int32) - 1)
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("dow",) if t[c].has_nulls()]),
    )
    .lazy()
)
plays = plays.with_columns(
    week=pl.concat_str(
        pl.col("aired").dt.truncate("1w").dt.to_string("%Y-%m-%d"),
        pl.lit("/"),
        (pl.col("aired").dt.truncate("1w") + pl.duration(days=6)).dt.to_string("%Y-%m-%d"),
    ),
)
plays = (
    plays
    .with_columns(
        night=(
            (pl.col("aired").dt.hour().cast(pl.Int32) >= 22)
            | (pl.col("aired").dt.hour().cast(pl.Int32) < 6)
        )
        .fill_null(False),
    )
    .collect()
    .lazy()
)
print(pandas_dtypes_text(plays.select(PANDAS_DTYPE_PROBE).collect()))

# -- the rights return: one row per artist and title
ret = (
    plays
    .drop_nulls("aired")
    .group_by(["artist", "title"])
    .agg(
        pl.col("play_id").count().cast(pl.Int64).alias("plays"),
        pl.col("secs").alias("seconds"),
        pl.col("listeners"),
        pl.col("aired").min().alias("first"),
        pl.col("aired").max().alias("last"),
    )
    .with_columns(
        pandas_group_sums(pl.col("seconds"), floats=False),
        pandas_group_sums(pl.col("listeners"), floats=False),
    )
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort(["artist", "title"], nulls_last=True)
)
ret = (
    ret
    .with_columns(
        span_days=(pl.col("last") - pl.col("first")).dt.total_microseconds() // 86_400_000_000,
    )
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("span_days",) if t[c].has_nulls()]),
    )
    .lazy()
)
ret = ret.with_columns(
    avg_len=(pl.col("seconds") / pl.col("plays")).fill_nan(None).round(1),
)
ret = ret.with_columns(
    code=pandas_upper(pl.col("artist").fill_null(pl.lit("unknown")).str.head(3)) + "-" + pl.when(pl.col("plays").null_count() > 0).then(pl.col("plays").cast(pl.Float64).cast(pl.String)).otherwise(pl.col("plays").cast(pl.String)).str.zfill(3),
)
ret = (
    ret
    .sort(
        ["plays", "artist", "title"],
        descending=[True, False, False],
        nulls_last=True,
        maintain_order=True,
    )
    .collect()
    .lazy()
)
(
    ret
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
    .sink_csv("data/rights_return.csv")
)
print(ret.head(10).collect())

# -- every day of the period, with the days nothing was logged
days = pl.LazyFrame(
    {
        "day": pl.datetime_range(pl.datetime(2024, 2, 26), pl.datetime(2024, 4, 6), "1d", eager=True),
    },
)
per_day = (
    plays
    .with_columns(_porter_rows_in_key_order=pl.col("day").is_sorted())
    .drop_nulls("day")
    .group_by("day")
    .agg(
        pl.len().cast(pl.Int64).alias("n"),
        pl.col("secs"),
        pl.col("night").sum().cast(pl.Int64).alias("nights"),
        pl.col("_porter_rows_in_key_order").first(),
    )
    .with_columns(
        pandas_group_sums(
            pl.col("secs"),
            floats=False,
            in_key_order=pl.col("_porter_rows_in_key_order"),
        ),
    )
    .drop("_porter_rows_in_key_order")
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort("day")
)
per_day = (
    days
    .join(per_day, on="day", how="left", nulls_equal=True, maintain_order="left_right")
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("n", "nights") if t[c].has_nulls()]),
    )
    .lazy()
)
per_day = per_day.with_columns(n=pl.col("n").fill_null(0).cast(pl.Int64))
per_day = per_day.with_columns(hours=pandas_div(pl.col("secs"), 3600).round(2))
per_day = per_day.with_columns(
    weekend=(pl.col("day").dt.weekday().cast(pl.Int32) - 1 >= 5).fill_null(False),
)
per_day = per_day.with_columns(
    month_end=(pl.col("day").dt.day() == pl.col("day").dt.days_in_month())
    .fill_null(False),
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
        PANDAS_CSV_LISTS,
        PANDAS_CSV_NUMBER_LISTS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("data/days.csv")
)

# -- presenters: licence renewal from the day they joined
people = people.with_columns(initials=pandas_upper(pl.col("initials")))
people = people.with_columns(
    joined=pl.when(
        pl.col("joined")
        .str.contains(
            "(?i)^(?:(?:[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))-(?:1[0-2]|0[1-9]|[1-9])-(?:3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9]))$",
        ),
    )
    .then(pl.col("joined"))
    .when(
        ~pl.col("joined").is_in(["", "NaT", "nat", "NAT", "nan", "NaN", "NAN"]) & pl.col("joined").is_not_null(),
    )
    .then(pl.lit("="))
    .str.to_datetime("%Y-%m-%d", time_unit="us"),
)
people = people.with_columns(renew=pl.col("joined").dt.offset_by("12mo"))
rota = (
    plays
    .group_by("presenter")
    .agg(
        pl.col("play_id").count().cast(pl.Int64).alias("plays"),
        pl.col("aired").max().alias("last_on"),
    )
    .sort("presenter", nulls_last=True)
)
rota = (
    rota
    .rename(
        lambda c, other=people.collect_schema().names(): c + "_x" if c in other and c not in ("presenter",) else c,
    )
    .join(
        people.rename(
            lambda c: c + "_y" if c in ("presenter", "plays", "last_on") else c,
        ),
        left_on="presenter",
        right_on="initials",
        how="left",
        coalesce=False,
        nulls_equal=True,
        maintain_order="left_right",
    )
)
rota = (
    rota
    .with_columns(late=(pl.col("last_on") > pl.col("renew")).fill_null(False))
    .collect()
    .lazy()
)
# TODO(porter): frame.apply: isinstance of a value whose type porter does not know (convert with
#   --data); write the function as column expressions (pl.when / arithmetic); map_elements is a last
#   resort
# TODO(porter): frame.setitem: a Series computed by pandas, row for row from this frame, is put back
#   by position; port the computation to an expression
rota = rota.with_columns(
    label=pl.Series(
        rota.collect()
        .to_pandas()
        .fillna({"late": float("nan")})
        .apply(
            lambda r: f"{r['name']} ({r['plays']})" if isinstance(r["name"], str) else "?",
            axis=1,
        ),
        nan_to_null=True,
    ),
)
rota = rota.drop("initials").collect().lazy()
(
    rota
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
    .sink_csv("data/rota.csv")
)
print(rota.collect())
