"""Cooperage order book: barrels ordered and delivered, each cooper's run of barrels, leak tests
by wood lot and toast.

Cells pasted from the workshop manager's notebook. The order cards are typed up on Fridays:
'n/a', 'tbc' and 'pending' mean not known yet. An order with no cooper still counts for its
wood lot. A barrel that leaked is rebuilt at the cooperage's cost.
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

# %%
orders = (
    pl.scan_csv(
        "data/orders.csv",
        null_values=PANDAS_NA_VALUES + ["tbc"],
        infer_schema_length=None,
    )
    .collect()
    .lazy()
)
lots = pl.scan_csv(
    "data/wood_lots.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)
print((orders.select(pl.len()).collect().item(), len(orders.collect_schema())))
print(orders.head(5).collect())

# %%
orders = orders.unique(keep="first", maintain_order=True)
orders = orders.with_columns(
    client=pandas_title(pl.col("client").str.strip_chars(PANDAS_WHITESPACE)),
)
orders = orders.with_columns(
    cooper=pandas_upper(pl.col("cooper").str.strip_chars(PANDAS_WHITESPACE).str.head(1)) + pl.col("cooper").str.strip_chars(PANDAS_WHITESPACE).str.slice(1).str.replace_many({"İ": "i", "Σ": "σ"}).str.to_lowercase(),
)
orders = orders.with_columns(cooper=pl.col("cooper").replace({"Eloi": "Éloi"}))
orders = orders.with_columns(wood_lot=pandas_upper(pl.col("wood_lot")))

# 'ORD/2024/17', 'ord-2024-0017', 'Ord 2024 17' -> 2024-00017
ref = pandas_upper(pl.col("order_ref")).str.replace_all("[\\s\\x1c-\\x1f/-]+", "-")
ref = ref.str.splitn("-", 3)
orders = orders.with_columns(
    order_no=ref.struct.field("field_2")
    .str.strip_chars()
    .str.replace_all("([0-9])_([0-9])", "${1}${2}")
    .str.replace_all("([0-9])_([0-9])", "${1}${2}")
    .cast(pl.Int64),
)
orders = (
    orders
    .with_columns(
        order_ref=ref.struct.field("field_1") + "-" + ref.struct.field("field_2").str.strip_chars_start("0").str.pad_start(5, "0"),
    )
    .collect()
    .lazy()
)
print(orders.select("order_ref", "order_no").head(5).collect())

# %%
orders = orders.with_columns(
    ordered=pl.when(
        pl.col("ordered")
        .str.contains(
            "(?i)^(?:(?:[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))-(?:1[0-2]|0[1-9]|[1-9])-(?:3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9]))$",
        ),
    )
    .then(pl.col("ordered"))
    .when(
        ~pl.col("ordered").is_in(["", "NaT", "nat", "NAT", "nan", "NaN", "NAN"]) & pl.col("ordered").is_not_null(),
    )
    .then(pl.lit("="))
    .str.to_datetime("%Y-%m-%d", time_unit="us"),
)
delivered = (
    pl.when(pl.col("delivered").str.contains("(?i)^(?:(?:[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))-(?:1[0-2]|0[1-9]|[1-9])-(?:3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9]))$")).then(pl.col("delivered")).str
    .to_datetime("%Y-%m-%d", time_unit="us", strict=False)
)
delivered = delivered.fill_null(
    pl.when(
        pl.col("delivered")
        .str.contains(
            "(?i)^(?:(?:3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9])/(?:1[0-2]|0[1-9]|[1-9])/(?:[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9])))$",
        ),
    )
    .then(pl.col("delivered"))
    .str.to_datetime("%d/%m/%Y", time_unit="us", strict=False),
)
orders = orders.with_columns(
    pending=(pl.col("delivered").str.starts_with("pend") | delivered.is_null())
    .fill_null(False),
)
orders = orders.with_columns(delivered=delivered)
orders = (
    orders
    .with_columns(
        lead_days=(pl.col("delivered") - pl.col("ordered")).dt.total_microseconds() // 86_400_000_000,
    )
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("lead_days",) if t[c].has_nulls()]),
    )
    .lazy()
)
orders = (
    orders
    .with_columns(
        lead_days=pl.when((pl.col("lead_days") < 0).fill_null(False))
        .then(None)
        .otherwise(pl.col("lead_days")),
    )
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("lead_days",) if t[c].has_nulls()]),
    )
    .lazy()
)
orders = orders.with_columns(
    order_week=pl.col("ordered").dt.week().cast(pl.UInt32).cast(pl.String).str.zfill(2),
)
orders = orders.with_columns(order_month=pl.col("ordered").dt.to_string("%Y-%m"))
orders = orders.with_columns(promised=pl.col("ordered") + pl.duration(days=45))
orders = orders.with_columns(
    late=(pl.col("delivered") > pl.col("promised")).fill_null(False),
)

# %% barrel size from the description; the toast written many ways
size = (
    pl.col("barrel").str
    .extract_groups("(?i)^([a-z-]+)[\\s\\x1c-\\x1f]*(\\d+)?[\\s\\x1c-\\x1f]*l?\\n?$")
)
orders = orders.with_columns(
    barrel_kind=size.struct.field("1")
    .str.replace_many({"İ": "i", "Σ": "σ"})
    .str.to_lowercase(),
)
orders = orders.with_columns(
    litres=size.struct.field("2")
    .str.strip_chars()
    .str.replace_all("([0-9])_([0-9])", "${1}${2}")
    .str.replace_all("([0-9])_([0-9])", "${1}${2}")
    .cast(pl.Float64),
)
NOMINAL = {"barrique": 225, "hogshead": 300, "puncheon": 500, "demi-muid": 600, "tonneau": 900}
orders = (
    orders
    .with_columns(
        litres=pl.col("litres")
        .fill_null(pl.col("barrel_kind").replace_strict(NOMINAL, default=None)),
    )
    .collect()
    .lazy()
)


def toast_level(t):
    if not isinstance(t, str):
        return "unknown"
    t = t.strip().lower()
    if t in ("l", "light"):
        return "light"
    elif t.startswith("m") and ("+" in t or "plus" in t):
        return "medium plus"
    elif t in ("m", "medium"):
        return "medium"
    else:
        return "heavy"


# TODO(porter): series.map: isinstance of a value whose type porter does not know (convert with
#   --data); porter runs toast_level on Polars values only on a text or float column whose type it
#   knows (convert with --data)
# TODO(porter): frame.setitem: a Series computed by pandas, row for row from this frame, is put back
#   by position; port the computation to an expression
orders = orders.with_columns(
    toast=pl.Series(
        orders.select(pl.col("toast")).collect().to_series().to_pandas().map(toast_level),
        nan_to_null=True,
    ),
)
orders = (
    orders
    .with_columns(
        toast_minutes=pl.col("toast")
        .replace_strict(
            {"light": 25, "medium": 35, "medium plus": 40, "heavy": 50},
            default=None,
        ),
    )
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("toast_minutes",) if t[c].has_nulls()]),
    )
    .lazy()
)

# %% leak tests: 'leak 2 drops', 'WEEP x2 at stave 14', 'pass'
test = (
    pl.col("leak_test").str.replace_many({"İ": "i", "Σ": "σ"}).str.to_lowercase().str
    .strip_chars(PANDAS_WHITESPACE)
)
orders = orders.with_columns(
    tested=(test.is_not_null() & ~test.str.contains("not tested").fill_null(False))
    .fill_null(False),
)
orders = orders.with_columns(leaked=test.str.contains("leak|weep").fill_null(False))
orders = (
    orders
    .with_columns(
        leak_marks=test.str.extract_all("leak|weep|drop").list.len().cast(pl.Int64),
    )
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("leak_marks",) if t[c].has_nulls()]),
    )
    .lazy()
)
orders = (
    orders
    .with_columns(leak_words=test.str.count_matches("[\\p{L}\\p{N}_]+").cast(pl.Int64))
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("leak_words",) if t[c].has_nulls()]),
    )
    .lazy()
)
orders = orders.with_columns(
    leak_spots=test.str.extract("x(\\d)", 1)
    .str.strip_chars()
    .str.replace_all("([0-9])_([0-9])", "${1}${2}")
    .str.replace_all("([0-9])_([0-9])", "${1}${2}")
    .cast(pl.Float64),
)
orders = orders.with_columns(
    leak_spots=pl.when(pl.col("leaked") & pl.col("leak_spots").is_null())
    .then(pl.lit(1, dtype=pl.Int64))
    .otherwise(
        pl.coalesce(
            pl.selectors.by_name("leak_spots", require_all=False),
            pl.lit(None),
        ),
    ),
)
orders = orders.with_columns(
    leak_spots=pl.when(~pl.col("leaked"))
    .then(pl.lit(0, dtype=pl.Int64))
    .otherwise(
        pl.coalesce(
            pl.selectors.by_name("leak_spots", require_all=False),
            pl.lit(None),
        ),
    ),
)
orders = (
    orders
    .with_columns(test_note=pl.col("leak_test").str.head(12))
    .collect()
    .lazy()
)
print(
    orders.select(
        "leak_test",
        "tested",
        "leaked",
        "leak_marks",
        "leak_spots",
        "leak_words",
    )
    .head(12)
    .collect(),
)

# %% money
orders = orders.with_columns(
    price_eur=pl.when((pl.col("price_eur") > 0).fill_null(False))
    .then(pl.col("price_eur")),
)
orders = orders.with_columns(value_eur=pl.col("price_eur") * pl.col("qty"))
orders = orders.with_columns(
    eur_per_litre=(pl.col("price_eur") / pl.col("litres")).fill_nan(None).round(3),
)
orders = orders.with_columns(
    rebuild_eur=pl.when(pl.col("leaked").fill_null(True))
    .then(pl.col("price_eur") * 0.35)
    .otherwise(0.0),
)
orders = orders.with_columns(
    rebuild_eur=pl.when(pl.col("toast") == "heavy")
    .then(pl.col("rebuild_eur") + 20)
    .otherwise(
        pl.coalesce(
            pl.selectors.by_name("rebuild_eur", require_all=False),
            pl.lit(None),
        ),
    ),
)
orders = orders.with_columns(
    eur_per_stave=(pl.col("price_eur") / (pl.col("staves") - 27)).fill_nan(None),
)


# porter: label(row), a function of each row, is ported as one expression
#   where it was applied, and left out here


orders = orders.with_columns(
    card=pl.when(pl.col("pending").fill_null(True))
    .then(pl.concat_str(pl.col("order_ref").fill_null("nan"), pl.lit(": pending")))
    .otherwise(
        pl.concat_str(
            pl.col("order_ref").fill_null("nan"),
            pl.lit(": "),
            pl.when(pl.col("barrel_kind").is_not_null())
            .then(pl.col("barrel_kind"))
            .otherwise(pl.lit("barrel"))
            .fill_null("nan"),
            pl.lit(" "),
            pl.col("lead_days").cast(pl.Int64).cast(pl.String).fill_null("nan"),
            pl.lit(" d"),
        ),
    ),
)

# %% each cooper's run of barrels
orders = orders.sort(
    ["cooper", "ordered", "order_no"],
    nulls_last=True,
    maintain_order=True,
)
orders = orders.with_columns(
    staves_filled=pl.when(pl.col("cooper").is_not_null())
    .then(pl.col("staves").forward_fill().over("cooper")),
)
orders = (
    orders
    .with_columns(
        barrel_no=pl.when(pl.col("cooper").is_not_null()).then(pl.int_range(pl.len(), dtype=pl.Int64).over("cooper")) + 1,
    )
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("barrel_no",) if t[c].has_nulls()]),
    )
    .lazy()
)
orders = (
    orders
    .with_columns(
        days_between=pl.when(pl.col("cooper").is_not_null()).then(pl.col("ordered").diff().over("cooper")).dt.total_microseconds() // 86_400_000_000,
    )
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("days_between",) if t[c].has_nulls()]),
    )
    .lazy()
)
orders = orders.with_columns(
    avg_lead=pl.when(pl.col("cooper").is_not_null())
    .then(
        pl.when(
            pl.col("lead_days").cast(pl.Float64).rolling_min(2 ** 31 - 1, min_samples=1) == pl.col("lead_days").cast(pl.Float64).rolling_max(2 ** 31 - 1, min_samples=1),
        )
        .then(pl.col("lead_days").cast(pl.Float64).forward_fill())
        .otherwise(
            pl.col("lead_days")
            .cast(pl.Float64)
            .rolling_mean(2 ** 31 - 1, min_samples=1),
        )
        .over("cooper"),
    )
    .round(1),
)
orders = (
    orders
    .with_columns(
        leaks_so_far=pl.when(pl.col("cooper").is_not_null())
        .then(pl.col("leaked").cast(pl.Int64).cum_sum().over("cooper")),
    )
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("leaks_so_far",) if t[c].has_nulls()]),
    )
    .lazy()
)
print(
    orders.select(
        "cooper",
        "order_ref",
        "barrel_no",
        "staves_filled",
        "days_between",
        "avg_lead",
    )
    .head(12)
    .collect(),
)

cols = ["order_ref", "card", "client", "cooper", "barrel_no", "barrel_kind", "litres", "toast",
        "toast_minutes", "wood_lot", "ordered", "delivered", "lead_days", "late", "order_week",
        "staves_filled", "leaked", "leak_marks", "leak_spots", "leak_words", "test_note", "value_eur",
        "eur_per_litre", "eur_per_stave", "rebuild_eur", "avg_lead", "leaks_so_far"]
(
    orders
    .select(cols)
    .with_columns(
        (
            pl.selectors.by_name("toast", "toast_minutes", "avg_lead", require_all=False)
            & pl.selectors.integer()
        )
        .cast(pl.String),
    )
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
    .sink_csv("data/order_book.csv")
)

# %% leak tests by wood lot and toast
lots = lots.unique("lot", keep="first", maintain_order=True)
tests = (
    orders
    .rename(
        lambda c, other=lots.collect_schema().names(): c + "_x" if c in other and c not in ("wood_lot",) else c,
    )
    .join(
        lots.rename(
            lambda c, other=orders.collect_schema().names(): c + "_y" if c in other and c not in ("lot",) else c,
        ),
        left_on="wood_lot",
        right_on="lot",
        how="left",
        coalesce=False,
        nulls_equal=True,
        maintain_order="left_right",
    )
)
tests = tests.with_columns(forest=pl.col("forest").fill_null(pl.lit("unknown lot")))
by_lot = (
    tests
    .filter(pl.col("tested"))
    .drop_nulls(["forest", "toast"])
    .group_by(["forest", "toast"])
    .agg(
        pl.col("order_ref").count().cast(pl.Int64).alias("barrels"),
        pl.col("leaked").sum().cast(pl.Int64).alias("leaked"),
        pl.col("leak_spots").alias("spots"),
        pl.col("seasoning_months").first(ignore_nulls=True).alias("seasoning"),
        pl.col("rebuild_eur"),
    )
    .with_columns(
        pandas_group_sums(pl.col("spots"), floats=False),
        pandas_group_sums(pl.col("rebuild_eur"), floats=False),
    )
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort(["forest", "toast"])
)
by_lot = by_lot.with_columns(
    leak_rate=(pl.col("leaked") / pl.col("barrels")).fill_nan(None).round(3),
)
by_lot = by_lot.with_columns(rebuild_eur=pl.col("rebuild_eur").round(2))
by_lot = (
    by_lot
    .sort(
        ["leak_rate", "forest", "toast"],
        descending=[True, False, False],
        nulls_last=True,
        maintain_order=True,
    )
    .collect()
    .lazy()
)
(
    by_lot
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
    .sink_csv("data/leaks_by_lot.csv")
)
print(by_lot.collect())

# %% each cooper's last two barrels
last = orders.filter(
    pl.col("cooper").is_not_null() & (pl.int_range(pl.len(), 0, -1).over("cooper") <= 2),
)
last = (
    last
    .select("cooper", "order_ref", "ordered", "leaked", "avg_lead", "leaks_so_far")
    .collect()
    .lazy()
)
(
    last
    .with_columns(
        (pl.selectors.by_name("avg_lead", require_all=False) & pl.selectors.integer())
        .cast(pl.String),
    )
    .with_columns(PANDAS_CSV_ZONED_DATETIMES)
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_DATETIMES,
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("data/last_barrels.csv")
)
print(last.collect())
