# ferry sailings - weekly operator figures, slow crossings, crew leads
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


def pandas_sort_values(frame, by, descending=False, nulls_last=True):
    """The frame sorted by one column (a name or an expression) in the order pandas'
    sort_values gives: pandas sorts numbers, True/False and dates with numpy's quicksort, which
    does not keep tied rows in their order (Polars' sort does); missing values (NaN too) come
    first or last, in their order. Text is sorted stably by pandas, as by Polars."""

    def positions(values):
        # each row's position in pandas' order
        if values.dtype.is_float():
            values = values.fill_nan(None)  # NaN is missing to pandas
        if not (values.dtype.is_numeric() or values.dtype in (
                pl.Boolean, pl.Date, pl.Datetime, pl.Duration)):
            rank = values.rank("ordinal", descending=descending).cast(pl.Int64)
            missing = values.is_null().cum_sum().cast(pl.Int64)
            if nulls_last:
                return rank.fill_null(missing + values.len() - values.null_count())
            return (rank + values.null_count()).fill_null(missing)
        import numpy as np

        # the values as pandas holds them: integers with a missing value are floats, and
        # True/False with a missing value are objects (each is sorted another way by numpy)
        numbers = values.drop_nulls().to_numpy()
        if values.dtype.is_integer() and values.has_nulls():
            numbers = numbers.astype(np.float64)
        elif values.dtype == pl.Boolean and values.has_nulls():
            numbers = numbers.astype(object)
        rows = np.flatnonzero(values.is_not_null().to_numpy())
        if descending:  # as pandas' nargsort: reversed, sorted, reversed again
            order = rows[::-1][numbers[::-1].argsort(kind="quicksort")][::-1]
        else:
            order = rows[numbers.argsort(kind="quicksort")]
        missing = np.flatnonzero(values.is_null().to_numpy())
        order = np.concatenate([order, missing] if nulls_last else [missing, order])
        key = np.empty(len(order), dtype=np.int64)
        key[order] = np.arange(len(order))
        return pl.Series(values.name, key)

    # a column of its own: Polars merges consecutive sorts, and would compute the positions
    # from the rows before an earlier sort
    by = pl.col(by) if isinstance(by, str) else by
    return (
        frame.with_columns(by.map_batches(positions, return_dtype=pl.Int64).alias("_pandas_order"))
        .sort("_pandas_order")
        .drop("_pandas_order")
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

df = pl.scan_csv(
    "data/sailings.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)
routes = pl.scan_csv(
    "data/routes.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)

df = df.filter(pl.col("sailing_id").is_last_distinct())
df = df.with_columns(
    departed=pl.when(
        pl.col("departed")
        .str.contains(
            "(?i)^(?:(?:3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9])/(?:1[0-2]|0[1-9]|[1-9])/(?:[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))\\s+(?:2[0-3]|[0-1][0-9]|[0-9]):(?:[0-5][0-9]|[0-9]))$",
        ),
    )
    .then(pl.col("departed"))
    .str.to_datetime("%d/%m/%Y %H:%M", time_unit="us", strict=False),
)
df = df.with_columns(
    arrived=pl.when(
        pl.col("arrived")
        .str.contains(
            "(?i)^(?:(?:3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9])/(?:1[0-2]|0[1-9]|[1-9])/(?:[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))\\s+(?:2[0-3]|[0-1][0-9]|[0-9]):(?:[0-5][0-9]|[0-9]))$",
        ),
    )
    .then(pl.col("arrived"))
    .str.to_datetime("%d/%m/%Y %H:%M", time_unit="us", strict=False),
)
df = df.filter(pl.col("departed").is_not_null())
df = df.with_columns(
    crossing_min=pandas_div(
        (pl.col("arrived") - pl.col("departed")).dt.total_microseconds()
        .pipe(lambda us: us // 1_000_000 + us % 1_000_000 / (us * 0 + 1_000_000)),
        60,
    ),
)
df = df.with_columns(
    weather=pl.col("weather")
    .str.strip_chars(PANDAS_WHITESPACE)
    .str.replace_many({"İ": "i", "Σ": "σ"})
    .str.to_lowercase()
    .fill_null(pl.lit("unknown")),
)
df = df.with_columns(
    crew_lead=pandas_title(pl.col("crew_lead").str.strip_chars(PANDAS_WHITESPACE)),
)
df = df.with_columns(
    pax=pl.col("pax")
    .fill_null(
        pl.when(pl.col("route").is_not_null())
        .then(pl.col("pax").median().over("route")),
    ),
)
df = df.with_columns(
    load=pl.when(pl.col("pax") > 120)
    .then(pl.lit("full"))
    .when(pl.col("pax") > 60)
    .then(pl.lit("busy"))
    .otherwise(pl.lit("light")),
)
df = df.with_columns(fare_gbp=pl.col("fare_gbp").forward_fill())
df = df.with_columns(revenue=pl.col("pax") * pl.col("fare_gbp"))
df = df.with_columns(week=pl.col("departed").dt.week().cast(pl.UInt32))
df = df.with_columns(
    hour_band=pl.when(
        pl.col("departed").dt.hour().cast(pl.Int32).is_between(0, 6, closed="left"),
    )
    .then(pl.lit("night"))
    .when(pl.col("departed").dt.hour().cast(pl.Int32).is_between(6, 12, closed="left"))
    .then(pl.lit("morning"))
    .when(pl.col("departed").dt.hour().cast(pl.Int32).is_between(12, 18, closed="left"))
    .then(pl.lit("afternoon"))
    .when(pl.col("departed").dt.hour().cast(pl.Int32).is_between(18, 24, closed="left"))
    .then(pl.lit("evening"))
    .cast(pl.Enum(["night", "morning", "afternoon", "evening"])),
)

df = (
    df
    .rename(
        lambda c, other=routes.collect_schema().names(): c + "_x" if c in other and c not in ("route",) else c,
    )
    .with_columns(_in_left=pl.lit(True))
    .join(
        routes.rename(
            lambda c, other=df.collect_schema().names(): c + "_y" if c in other and c not in ("route",) else c,
        )
        .with_columns(_in_right=pl.lit(True)),
        on="route",
        how="left",
        nulls_equal=True,
        maintain_order="left_right",
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
print(
    df.select(pl.col("_merge"))
    .drop_nulls()
    .group_by("_merge", maintain_order=True)
    .agg(pl.len().cast(pl.Int64).alias("count"))
    .sort("count", descending=True, maintain_order=True)
    .collect(),
)
df = (
    df
    .with_columns(pax_per_mile=(pl.col("pax") / pl.col("miles")).fill_nan(None))
    .collect()
    .lazy()
)

weekly = (
    df
    .drop_nulls(["week", "operator"])
    .group_by(["week", "operator"])
    .agg(
        pl.col("revenue"),
        pl.col("pax"),
        pl.col("sailing_id").count().cast(pl.Int64).alias("sailing_id"),
    )
    .with_columns(
        pandas_group_sums(pl.col("revenue"), floats=False),
        pandas_group_sums(pl.col("pax"), mean=True, floats=False),
    )
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort(["week", "operator"])
)
weekly = weekly.rename({"pax": "avg_pax", "sailing_id": "sailings"})
weekly = weekly.with_columns(
    revenue_share=(
        pl.col("revenue")
        / pl.when(pl.col("week").is_not_null()).then(pl.col("revenue").sum().over("week"))
    )
    .fill_nan(None),
)
weekly = weekly.with_columns(
    rev_change=pl.when(pl.col("operator").is_not_null())
    .then(
        (pl.col("revenue") / pl.col("revenue").shift(1) - 1)
        .fill_nan(None)
        .over("operator"),
    ),
)
(
    weekly
    .with_columns(pl.selectors.float().round(3))
    .with_columns(PANDAS_CSV_ZONED_DATETIMES)
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_DATETIMES,
        PANDAS_CSV_DURATIONS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("data/weekly.csv")
)

slow = (
    df
    .filter(
        pl.col("crossing_min") > pl.when(pl.col("route").is_not_null()).then(pandas_group_mean(pl.col("crossing_min")).over("route")) * 1.3,
    )
    .select("sailing_id", "route", "departed", "crossing_min", "weather")
)
slow = slow.pipe(pandas_sort_values, "crossing_min", descending=True)
(
    slow
    .with_columns(PANDAS_CSV_ZONED_DATETIMES)
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_DATETIMES,
        PANDAS_CSV_DURATIONS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("data/slow_crossings.csv")
)

leads = (
    df
    .with_columns(_porter_rows_in_key_order=pl.col("crew_lead").is_sorted())
    .drop_nulls("crew_lead")
    .group_by("crew_lead")
    .agg(
        pl.col("sailing_id").drop_nulls().n_unique().cast(pl.Int64).alias("sailings"),
        pl.col("pax"),
        pl.col("crossing_min").max().alias("worst"),
        pl.col("_porter_rows_in_key_order").first(),
    )
    .with_columns(
        pandas_group_sums(
            pl.col("pax"),
            floats=False,
            in_key_order=pl.col("_porter_rows_in_key_order"),
        ),
    )
    .drop("_porter_rows_in_key_order")
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort("crew_lead")
    .pipe(pandas_sort_values, "pax", descending=True)
)
leads = (
    leads
    .with_columns(rank=pl.col("pax").rank("min", descending=True).cast(pl.Float64))
    .collect()
    .lazy()
)
print(leads.head(10).collect())
(
    leads
    .with_columns(PANDAS_CSV_ZONED_DATETIMES)
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_DATETIMES,
        PANDAS_CSV_DURATIONS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("data/leads.csv")
)

bands = (
    df
    .drop_nulls(["hour_band", "load"])
    .group_by(["hour_band", "load"])
    .agg(pl.col("pax").sum())
    .sort("load")
    .collect()
    .pivot(on="load", index="hour_band", values="pax")
    .sort("hour_band")
    .fill_null(0)
    .lazy()
)
print(bands.collect())
(
    bands
    .with_columns(PANDAS_CSV_ZONED_DATETIMES)
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_DATETIMES,
        PANDAS_CSV_DURATIONS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("data/bands.csv")
)

df = (
    df
    .with_row_index("_porter_place")
    .pipe(pandas_sort_values, "departed")
    .with_columns(
        pl.when(pl.col("route").is_not_null())
        .then(
            pl.when(
                pl.col("pax").cast(pl.Float64).replace([float("inf"), float("-inf")], None).rolling_min(5, min_samples=1) == pl.col("pax").cast(pl.Float64).replace([float("inf"), float("-inf")], None).rolling_max(5, min_samples=1),
            )
            .then(
                pl.col("pax")
                .cast(pl.Float64)
                .replace([float("inf"), float("-inf")], None)
                .forward_fill(),
            )
            .otherwise(
                pl.col("pax")
                .cast(pl.Float64)
                .replace([float("inf"), float("-inf")], None)
                .rolling_mean(5, min_samples=1),
            )
            .over("route"),
        )
        .alias("rolling_pax"),
    )
    .sort("_porter_place")
    .drop("_porter_place")
    .collect()
    .lazy()
)
top = (
    df
    .sort("revenue", descending=True, nulls_last=True, maintain_order=True)
    .head(5)
    .select("sailing_id", "route", "revenue")
)
print(top.collect().to_pandas().to_string(index=False))
weather_share = (
    df
    .select(pl.col("weather"))
    .drop_nulls()
    .group_by("weather", maintain_order=True)
    .agg(pl.len().cast(pl.Int64).alias("count"))
    .select(
        pl.col("weather"),
        pandas_div(pl.col("count"), pl.col("count").sum()).alias("proportion"),
    )
    .sort("proportion", descending=True, maintain_order=True)
    .select(pl.col("weather"), pl.col("proportion").round(3).alias("proportion"))
)
print(weather_share.collect())
