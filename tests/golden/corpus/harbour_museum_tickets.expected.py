# harbour museum ticket office -- weekly numbers for the trustees
# (pasted from the office notebook; cells kept in order)
import math
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

# %% load
tix = (
    pl.scan_csv(
        "data/tickets.csv",
        null_values=PANDAS_NA_VALUES + [],
        infer_schema_length=None,
    )
    .collect()
    .lazy()
)
shows = pl.scan_csv(
    "data/exhibitions.csv",
    null_values=PANDAS_NA_VALUES + [],
    infer_schema_length=None,
)
print((tix.select(pl.len()).collect().item(), len(tix.collect_schema())))
print(tix.head(5).collect())

# %% the two tills write their stamps differently: try the new one, then the old day-first one
new_till = (
    pl.when(pl.col("sold_at").str.contains("(?i)^(?:(?:[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))-(?:1[0-2]|0[1-9]|[1-9])-(?:3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9])\\s+(?:2[0-3]|[0-1][0-9]|[0-9]):(?:[0-5][0-9]|[0-9]))$")).then(pl.col("sold_at")).str
    .to_datetime("%Y-%m-%d %H:%M", time_unit="us", strict=False)
)
old_till = (
    pl.when(pl.col("sold_at").str.contains("(?i)^(?:(?:3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9])/(?:1[0-2]|0[1-9]|[1-9])/(?:[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))\\s+(?:2[0-3]|[0-1][0-9]|[0-9]):(?:[0-5][0-9]|[0-9]))$")).then(pl.col("sold_at")).str
    .to_datetime("%d/%m/%Y %H:%M", time_unit="us", strict=False)
)
tix = tix.with_columns(sold_at=new_till.fill_null(old_till)).collect().lazy()
print(
    "unreadable stamps:",
    tix.select(pl.col("sold_at").is_null().sum().cast(pl.Int64))
    .collect()
    .to_series()
    .to_numpy()[0],
)

# %% refs: HM-2024-000123/AD, hm 2024 123 ad, HM2024123 ...
parts = (
    pl.col("ref").str
    .extract_groups(
        "(?i)^hm[^\\p{L}\\p{N}_]*(?P<year>\\d{4})[^\\p{L}\\p{N}_]*(?P<num>\\d{1,6})(?:[^\\p{L}\\p{N}_]*(?P<code>[a-zé]{2}))?\\n?$",
    )
)
tix = tix.with_columns(ticket_no=parts.struct.field("num").str.zfill(6))
tix = tix.with_columns(
    ref_year=parts.struct.field("year")
    .str.strip_chars()
    .cast(pl.Float64, strict=False)
    .fill_nan(None),
)
tix = tix.with_columns(code=pandas_upper(parts.struct.field("code"))).collect().lazy()
print(tix.select("ref", "ticket_no", "code").head(10).collect())
tix = tix.unique(keep="first", maintain_order=True)


def clean_kind(df):
    # the desk types whatever it likes
    df = df.with_columns(
        visitor=pl.col("visitor")
        .str.strip_chars(PANDAS_WHITESPACE)
        .str.replace_many({"İ": "i", "Σ": "σ"})
        .str.to_lowercase(),
    )
    df = df.with_columns(
        visitor=pl.col("visitor").replace({"étudiant": "student", "famille": "family"}),
    )
    df = df.with_columns(visitor=pl.col("visitor").fill_null(pl.lit("unknown")))
    return df


tix = clean_kind(tix)
tix = tix.with_columns(
    desk=pandas_upper(pl.col("desk").str.strip_chars(PANDAS_WHITESPACE).str.head(1)) + pl.col("desk").str.strip_chars(PANDAS_WHITESPACE).str.slice(1).str.replace_many({"İ": "i", "Σ": "σ"}).str.to_lowercase(),
)
tix = tix.with_columns(
    lang=pl.col("lang")
    .str.strip_chars(PANDAS_WHITESPACE)
    .str.replace_many({"İ": "i", "Σ": "σ"})
    .str.to_lowercase()
    .replace_strict(
        {"fr": "French", "de": "German", "en": "English", "nl": "Dutch"},
        default=None,
    ),
)

# %% money: vouchers carry their value in the text ("voucher 12")
tix = tix.with_columns(
    voucher=pl.col("paid_by")
    .str.extract("voucher[\\s\\x1c-\\x1f]*(\\d+)", 1)
    .str.strip_chars()
    .str.replace_all("([0-9])_([0-9])", "${1}${2}")
    .str.replace_all("([0-9])_([0-9])", "${1}${2}")
    .cast(pl.Float64),
)
tix = tix.with_columns(
    paid_by=pl.col("paid_by")
    .str.splitn(" ", 2)
    .struct.field("field_0")
    .str.replace_many({"İ": "i", "Σ": "σ"})
    .str.to_lowercase(),
)
tix = tix.with_columns(
    is_voucher=pl.col("paid_by").str.starts_with("vouch").fill_null(False),
)


# porter: net_price(row), a function of each row, is ported as one expression
#   where it was applied, and left out here


tix = tix.with_columns(
    net=pl.when((pl.col("price") != pl.col("price")).fill_null(True))
    .then(None)
    .otherwise(
        pl.when(
            pl.lit(0, dtype=pl.Int64) > (pl.col("price") * (1 - pl.when(pl.col("visitor").is_in(["child", "student"])).then(0.0).when(pl.col("party") >= 4).then(0.1).otherwise(0.0)) - pl.when(pl.col("voucher") > 0).then(pl.col("voucher")).otherwise(0)).fill_nan(None),
        )
        .then(pl.lit(0, dtype=pl.Int64))
        .otherwise(
            (
                pl.col("price") * (1 - pl.when(pl.col("visitor").is_in(["child", "student"])).then(0.0).when(pl.col("party") >= 4).then(0.1).otherwise(0.0))
                - pl.when(pl.col("voucher") > 0).then(pl.col("voucher")).otherwise(0)
            )
            .fill_nan(None),
        )
        .map_elements(lambda v: round(v, 2), return_dtype=pl.Float64),
    ),
)
tix = tix.with_columns(per_head=(pl.col("net") / pl.col("party")).fill_nan(None))

# %% time of the sale
tix = tix.with_columns(day=pl.col("sold_at").dt.truncate("1d"))
tix = tix.with_columns(week=pl.col("sold_at").dt.week().cast(pl.UInt32))
tix = tix.with_columns(month=pl.col("sold_at").dt.to_string("%Y-%m"))
tix = (
    tix
    .with_columns(hour=pl.col("sold_at").dt.hour().cast(pl.Int32))
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("hour",) if t[c].has_nulls()]),
    )
    .lazy()
)
tix = tix.with_columns(
    slot=pl.when(pl.col("hour") < 12)
    .then(pl.lit("morning"))
    .when(pl.col("hour") < 14)
    .then(pl.lit("lunch"))
    .otherwise(pl.lit("afternoon")),
)
tix = tix.with_columns(
    month_end=(pl.col("sold_at").dt.day() == pl.col("sold_at").dt.days_in_month())
    .fill_null(False),
)
tix = tix.with_columns(
    leaves_at=pl.col("sold_at") + pl.duration(minutes=pl.col("visit_min")),
)
tix = tix.with_columns(
    after_close=(pl.col("leaves_at") > pl.col("day") + pl.duration(hours=18))
    .fill_null(False),
)
tix = (
    tix
    .with_columns(tour_count=pl.col("tours").str.count_matches(";").cast(pl.Int64) + 1)
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("tour_count",) if t[c].has_nulls()]),
    )
    .lazy()
)
tix = tix.with_columns(
    tour_count=pl.when(pl.col("tours").is_null() | (pl.col("tours") == "none"))
    .then(pl.lit(0, dtype=pl.Int64))
    .otherwise(
        pl.coalesce(
            pl.selectors.by_name("tour_count", require_all=False),
            pl.lit(None),
        ),
    ),
)
tix = (
    tix
    .with_columns(
        lighthouse=pl.col("tours").str.contains("(?i)lighthouse").fill_null(False),
    )
    .collect()
    .lazy()
)
# TODO(porter): frame.dtypes: porter does not know which integer columns pandas holds as its
#   nullable Int64 here (named Int64, not int64 or float64)
print(
    tix.collect().to_pandas().fillna({"is_voucher": float("nan"), "month_end": float("nan"), "after_close": float("nan"), "lighthouse": float("nan")}).dtypes,
)

# %% exhibitions on when the ticket was sold
shows = shows.with_columns(
    opens=pl.when(
        pl.col("opens")
        .str.contains(
            "(?i)^(?:(?:[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))-(?:1[0-2]|0[1-9]|[1-9])-(?:3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9]))$",
        ),
    )
    .then(pl.col("opens"))
    .when(
        ~pl.col("opens").is_in(["", "NaT", "nat", "NAT", "nan", "NaN", "NAN"]) & pl.col("opens").is_not_null(),
    )
    .then(pl.lit("="))
    .str.to_datetime("%Y-%m-%d", time_unit="us"),
)
shows = shows.with_columns(
    closes=pl.when(
        pl.col("closes")
        .str.contains(
            "(?i)^(?:(?:[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))-(?:1[0-2]|0[1-9]|[1-9])-(?:3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9]))$",
        ),
    )
    .then(pl.col("closes"))
    .when(
        ~pl.col("closes").is_in(["", "NaT", "nat", "NAT", "nan", "NaN", "NAN"]) & pl.col("closes").is_not_null(),
    )
    .then(pl.lit("="))
    .str.to_datetime("%Y-%m-%d", time_unit="us")
    .fill_null(pl.datetime(2024, 12, 31)),
)
shows = (
    shows
    .with_columns(
        days_open=(pl.col("closes") - pl.col("opens")).dt.total_microseconds() // 86_400_000_000 + 1,
    )
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("days_open",) if t[c].has_nulls()]),
    )
    .lazy()
)
shows = shows.with_columns(
    short=pandas_upper(pl.col("title").str.head(10).str.strip_chars(PANDAS_WHITESPACE)),
)
print(shows.collect())

# one output per desk and week
tix = tix.filter(pl.col("sold_at").is_not_null()).collect().lazy()
weekly = (
    tix
    .with_columns(
        _porter_rows_in_key_order=pl.when(
            ~pl.any_horizontal(pl.col("week", "desk").is_null()),
        )
        .then(pl.struct("week", "desk"))
        .is_sorted(),
    )
    .drop_nulls(["week", "desk"])
    .group_by(["week", "desk"])
    .agg(
        pl.col("ticket_no").count().cast(pl.Int64).alias("tickets"),
        pl.col("party").alias("visitors"),
        pl.col("net").alias("takings"),
        pl.col("lighthouse").sum().cast(pl.Int64).alias("lighthouse"),
        pl.col("after_close").sum().cast(pl.Int64).alias("late"),
        pl.col("_porter_rows_in_key_order").first(),
    )
    .with_columns(
        pandas_group_sums(
            pl.col("visitors"),
            floats=False,
            in_key_order=pl.col("_porter_rows_in_key_order"),
        ),
        pandas_group_sums(
            pl.col("takings"),
            in_key_order=pl.col("_porter_rows_in_key_order"),
        ),
    )
    .drop("_porter_rows_in_key_order")
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort(["week", "desk"])
)
weekly = weekly.with_columns(takings=pl.col("takings").round(2))
weekly = weekly.with_columns(
    label=pl.concat_str(
        pl.lit("W"),
        pl.col("week").cast(pl.Int64).cast(pl.String).str.zfill(2),
        pl.lit("-"),
        pl.col("desk").str.head(1).fill_null("nan"),
    ),
)
weekly = weekly.sort(["week", "desk"], nulls_last=True, maintain_order=True)
(
    weekly
    .with_columns(PANDAS_CSV_ZONED_DATETIMES)
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_DATETIMES,
        PANDAS_CSV_DURATIONS,
        PANDAS_CSV_FLOATS,
        PANDAS_CSV_LISTS,
        PANDAS_CSV_NUMBER_LISTS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("data/weekly_desks.csv")
)

# by month and kind
monthly = (
    tix
    .drop_nulls(["month", "visitor"])
    .group_by(["month", "visitor"])
    .agg(pl.col("party").alias("n"), pl.col("visit_min").alias("avg_visit"))
    .with_columns(
        pandas_group_sums(pl.col("n"), floats=False),
        pandas_group_sums(pl.col("avg_visit"), mean=True, floats=False),
    )
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort(["month", "visitor"])
)
monthly = monthly.with_columns(month=pl.col("month").cast(pl.String)).collect().lazy()
# TODO(porter): series.apply: part of the function has no expression form: math.floor of a value of
#   unknown type; a value computed by pandas is mixed into a Polars expression
# TODO(porter): frame.setitem: a Series computed by pandas, row for row from this frame, is put back
#   by position; port the computation to an expression
monthly = monthly.with_columns(
    avg_visit=pl.Series(
        monthly.select(pl.col("avg_visit"))
        .collect()
        .to_series()
        .to_pandas()
        .apply(lambda m: math.floor(m) if m == m else -1),
        nan_to_null=True,
    ),
)
(
    monthly
    .with_columns(PANDAS_CSV_ZONED_DATETIMES)
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_DATETIMES,
        PANDAS_CSV_DURATIONS,
        PANDAS_CSV_FLOATS,
        PANDAS_CSV_LISTS,
        PANDAS_CSV_NUMBER_LISTS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("data/monthly_visitors.csv")
)

# per day: month-end days get flagged for the accountant
daily = (
    tix
    .with_columns(_porter_rows_in_key_order=pl.col("day").is_sorted())
    .drop_nulls("day")
    .group_by("day")
    .agg(
        pl.col("net"),
        pl.len().cast(pl.Int64).alias("tickets"),
        pl.col("month_end").first(ignore_nulls=True).alias("month_end"),
        pl.col("_porter_rows_in_key_order").first(),
    )
    .with_columns(
        pandas_group_sums(
            pl.col("net"),
            in_key_order=pl.col("_porter_rows_in_key_order"),
        ),
    )
    .drop("_porter_rows_in_key_order")
    .sort("day")
)
daily = daily.with_columns(net=pl.col("net").round(2))
daily = (
    daily
    .with_columns(days_in_month=pl.col("day").dt.days_in_month().cast(pl.Int32))
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("days_in_month",) if t[c].has_nulls()]),
    )
    .lazy()
)
daily = daily.with_columns(weekday=pl.col("day").dt.to_string("%A"))
daily = (
    daily
    .with_columns(
        busy=pl.when(pl.col("tickets") >= 22)
        .then(pl.lit("busy"))
        .otherwise(pl.lit("quiet")),
    )
    .collect()
    .lazy()
)
(
    daily
    .with_columns(PANDAS_CSV_ZONED_DATETIMES)
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_DATETIMES,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("data/daily_takings.csv")
)
print(daily.tail(5).collect())

# refs nobody could read
bad = tix.filter(pl.col("ticket_no").is_null()).select("ref", "sold_at", "desk")
bad = (
    bad
    .with_columns(ref_len=pl.col("ref").str.len_chars().cast(pl.Int64))
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("ref_len",) if t[c].has_nulls()]),
    )
    .lazy()
)
bad = (
    bad
    .sort(["sold_at", "ref"], nulls_last=True, maintain_order=True)
    .collect()
    .lazy()
)
(
    bad
    .with_columns(PANDAS_CSV_ZONED_DATETIMES)
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_DATETIMES,
        PANDAS_CSV_DURATIONS,
        PANDAS_CSV_FLOATS,
        PANDAS_CSV_LISTS,
        PANDAS_CSV_NUMBER_LISTS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("data/unreadable_refs.csv")
)
print(bad.select(pl.len()).collect().item(), "refs unreadable")
