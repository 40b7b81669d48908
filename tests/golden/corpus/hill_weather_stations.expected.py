# hill stations: daily extremes + frost alerts. readings file has messy headers
import pandas as pd
import polars as pl

# Text that pandas' read_csv reads as a missing value.
PANDAS_NA_VALUES = [
    "", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null",
]


def pandas_reduce(values, how="sum", ddof=1):
    """The sum, mean, std or var (how="sum" / "mean" / "std" / "var") of a column of numbers
    as pandas computes them: numpy's pairwise sum of the values as floats, a missing one
    counted 0 in its place; the mean over the count of values present; the var from the
    squared distances to that mean (0 where a value is missing), added the same way, over
    count - ddof, and the std its square root. NaN where there are too few values. Polars
    adds in another order, and the last digit can differ (55.080000000000005 for
    55.08000000000001, a std of 3.265986323710904 for 3.2659863237109046)."""
    def reduce(column):
        import numpy as np

        present = column.is_not_null().to_numpy()
        numbers = column.cast(pl.Float64).fill_null(0.0).to_numpy()
        total = numbers.sum()
        if how == "sum":
            return total
        count = int(present.sum())
        if how == "mean":
            return total / count if count else float("nan")
        if count <= ddof:
            return float("nan")
        squares = (total / count - numbers) ** 2
        squares[~present] = 0.0
        spread = squares.sum() / (count - ddof)
        return float(np.sqrt(spread) if how == "std" else spread)

    return values.map_batches(reduce, returns_scalar=True, return_dtype=pl.Float64)


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


def pandas_quantile(column, q):
    """The q quantile of the column's values as pandas computes it (numpy's linear
    interpolation a + (b - a) * t, to the last binary digit and the sign of a zero: Polars'
    quantile can be one digit off, which moves a value sitting on a bin's edge into the next
    bin, and returns -0.0 where numpy's sum gives 0.0)."""
    count = column.count()
    position = (count.cast(pl.Float64) - 1) * q
    below = position.floor().cast(pl.Int64)
    last = count.cast(pl.Int64) - 1
    # numpy at the last value (q=1, or one value) takes it twice with weight position + 1,
    # which gives the sign of a zero as numpy gives it (-0.0 alone stays -0.0; else 0.0)
    t = pl.when(position >= last.cast(pl.Float64)).then(position + 1).otherwise(position - below)
    # the two values around the position, found by selection (no sort): below it, and above
    # it (the same value where the position falls on one)
    a = column.drop_nulls().quantile(q, "lower")
    b = column.drop_nulls().quantile(q, "higher")
    # where the position falls on a value numpy also reads the next one: NaN when that one
    # is inf or the value itself is -inf (inf * 0)
    infinite = ((column == float("inf")).sum() >= last - below) \
        | ((column == float("-inf")).sum() >= below + 1)
    return (
        pl.when((t == 0) & (below < last) & infinite).then(a + float("nan"))
        .when(t >= 0.5).then(b - (b - a) * (1 - t))
        .otherwise(a + (b - a) * t)
    )


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

df = pl.scan_csv(
    "data/readings.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)
df = df.rename(
    dict(
        zip(df.collect_schema().names(), [c.strip() for c in df.collect_schema().names()]),
    ),
)
for col in ["station", "status"]:
    df = df.with_columns(pl.col(col).str.strip_chars(PANDAS_WHITESPACE).alias(col))
df = df.with_columns(station=pandas_title(pl.col("station")))
df = (
    pl.concat(
        [df, df.select("temp_c", "humidity", "wind_kmh").with_columns(pl.col("temp_c").cast(pl.String).str.strip_chars().cast(pl.Float64, strict=False).fill_nan(None).alias("temp_c"), pl.col("humidity").cast(pl.String).str.strip_chars().cast(pl.Float64, strict=False).fill_nan(None).alias("humidity"), pl.col("wind_kmh").cast(pl.String).str.strip_chars().cast(pl.Float64, strict=False).fill_nan(None).alias("wind_kmh")).select(pl.col("temp_c").alias("_porter_set_0"), pl.col("humidity").alias("_porter_set_1"), pl.col("wind_kmh").alias("_porter_set_2"))],
        how="horizontal",
    )
    .with_columns(
        pl.col("_porter_set_0").alias("temp_c"),
        pl.col("_porter_set_1").alias("humidity"),
        pl.col("_porter_set_2").alias("wind_kmh"),
    )
    .drop("_porter_set_0", "_porter_set_1", "_porter_set_2")
)
df = df.with_columns(
    reading_time=pl.when(
        pl.col("reading_time")
        .str.contains(
            "(?i)^(?:(?:[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))-(?:1[0-2]|0[1-9]|[1-9])-(?:3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9])\\s+(?:2[0-3]|[0-1][0-9]|[0-9]):(?:[0-5][0-9]|[0-9]))$",
        ),
    )
    .then(pl.col("reading_time"))
    .when(
        ~pl.col("reading_time").is_in(["", "NaT", "nat", "NAT", "nan", "NaN", "NAN"]) & pl.col("reading_time").is_not_null(),
    )
    .then(pl.lit("="))
    .str.to_datetime("%Y-%m-%d %H:%M", time_unit="us"),
)
df = df.with_columns(
    status=pl.col("status")
    .str.replace_many({"İ": "i", "Σ": "σ"})
    .str.to_lowercase()
    .replace("", None)
    .fill_null(pl.lit("unknown")),
)
df = df.drop_nulls("temp_c")

stations = pl.scan_csv(
    "data/stations.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)
df = (
    df
    .rename(
        lambda c, other=stations.collect_schema().names(): c + "_x" if c in other and c not in ("station",) else c,
    )
    .join(
        stations.rename(
            lambda c, other=df.collect_schema().names(): c + "_y" if c in other and c not in ("station",) else c,
        ),
        on="station",
        how="left",
        nulls_equal=True,
        maintain_order="left_right",
    )
)
df = df.with_columns(
    humidity=pl.col("humidity")
    .fill_null(pandas_reduce(pl.col("humidity"), how="mean").fill_nan(None)),
    altitude_m=pl.col("altitude_m").fill_null(0),
)
df = df.with_columns(
    feels_like=pl.when(pl.col("wind_kmh") > 20)
    .then((pl.col("temp_c") - pandas_div(pl.col("wind_kmh"), 10)).fill_nan(None))
    .otherwise(
        pl.when(pl.col("humidity") > 85)
        .then(pl.col("temp_c") - 1)
        .otherwise(pl.col("temp_c")),
    ),
)
df = df.with_columns(frost=(pl.col("temp_c") <= 0).fill_null(False))
df = df.with_columns(day=pl.col("reading_time").dt.date()).collect().lazy()

daily = (
    df
    .drop_nulls(["station", "day"])
    .group_by(["station", "day"])
    .agg(
        pl.col("temp_c").min().alias("tmin"),
        pl.col("temp_c").max().alias("tmax"),
        pl.col("frost").sum().cast(pl.Int64).alias("frost_hours"),
        pl.col("wind_kmh").max().alias("wind_max"),
    )
    .sort(["station", "day"])
)
daily = daily.with_columns(range=(pl.col("tmax") - pl.col("tmin")).fill_nan(None))
daily = daily.filter((pl.col("range") > 2) | (pl.col("frost_hours") > 0))
(
    daily
    .with_columns(
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("data/daily.csv")
)

windiest = (
    df
    .filter(
        pl.col("station").is_not_null(),
        pl.int_range(pl.len()).over("station") == pl.col("wind_kmh").arg_max().over("station"),
    )
    .sort("station", maintain_order=True)
    .select("station", "reading_time", "wind_kmh")
)
print(windiest.collect())

stats = (
    df
    .drop_nulls("station")
    .group_by("station")
    .agg(
        pl.col("temp_c").fill_nan(None).count().cast(pl.Float64).alias("count"),
        pandas_reduce(pl.col("temp_c").fill_nan(None).cast(pl.Float64), how="mean")
        .alias("mean"),
        pandas_reduce(pl.col("temp_c").fill_nan(None).cast(pl.Float64), how="std")
        .alias("std"),
        pl.col("temp_c").fill_nan(None).min().cast(pl.Float64).alias("min"),
        pandas_quantile(pl.col("temp_c").fill_nan(None), 0.25).alias("25%"),
        pandas_quantile(pl.col("temp_c").fill_nan(None), 0.5).alias("50%"),
        pandas_quantile(pl.col("temp_c").fill_nan(None), 0.75).alias("75%"),
        pl.col("temp_c").fill_nan(None).max().cast(pl.Float64).alias("max"),
    )
    .sort("station")
)
print(stats.with_columns(pl.selectors.float().round(2)).collect())
side = (
    df
    .with_columns(_porter_rows_in_key_order=pl.col("station").is_sorted())
    .drop_nulls("station")
    .group_by("station")
    .agg(pl.col("temp_c"), pl.col("_porter_rows_in_key_order").first())
    .with_columns(
        pandas_group_sums(
            pl.col("temp_c"),
            mean=True,
            in_key_order=pl.col("_porter_rows_in_key_order"),
        ),
    )
    .drop("_porter_rows_in_key_order")
    .sort("station")
    .select(pl.col("station"), pl.col("temp_c").alias("mean_temp"))
    .join(
        df.drop_nulls("station")
        .group_by("station")
        .agg(
            (pl.col("humidity").quantile(0.5, "lower") + pl.col("humidity").quantile(0.5, "higher")) / 2,
        )
        .sort("station")
        .select(pl.col("station"), pl.col("humidity").alias("median_hum")),
        on="station",
        how="full",
        coalesce=True,
        nulls_equal=True,
        validate="1:1",
        maintain_order="left_right",
    )
)
(
    side
    .with_columns(
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("data/side.csv")
)

alerts = []
# TODO(porter): frame.iterrows: only a loop whose body appends one value per row to lists is ported;
#   row loops have no lazy form: express the loop body as column expressions, or collect and use
#   iter_rows(named=True)
for _, row in df.filter(pl.col("feels_like") < -10).collect().to_pandas().fillna({"frost": float("nan")}).iterrows():
    alerts.append({"station": row["station"], "when": row["reading_time"].strftime("%d %b %H:%M"),
                   "feels": round(row["feels_like"], 1)})
alerts = pl.from_pandas(pd.DataFrame(alerts)).lazy()
print(alerts.head(5).collect())
(
    alerts
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
    .sink_csv("data/alerts.csv")
)
print(
    df.select(pl.col("status"))
    .drop_nulls()
    .group_by("status", maintain_order=True)
    .agg(pl.len().cast(pl.Int64).alias("count"))
    .select(
        pl.col("status"),
        pandas_div(pl.col("count"), pl.col("count").sum()).alias("proportion"),
    )
    .sort("proportion", descending=True, maintain_order=True)
    .select("status", pl.col("proportion").round(3).alias("proportion"))
    .collect()
    .to_pandas()
    .set_index("status")["proportion"]
    .to_dict(),
)
