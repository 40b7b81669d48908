"""Village lending tool shed: how long each tool sat idle between loans, which tools earn
their deposit, and the members with tools out too long.

The shed is open on Saturdays; the loans book says when a tool went out and came back. A
blank or '?' return date means nobody wrote it down; 'lost' is lost. The tool names are
typed by whoever is on duty ('Hedge Trimmer', ' hedge trimmer'). The ladder was bought twice
and the post-hole digger came from a house clearance, so it has no deposit.
"""
import polars as pl

# Text that pandas' read_csv reads as a missing value.
PANDAS_NA_VALUES = [
    "", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null",
]


def pandas_values(values):
    """A column's values as pandas gives them to Python: pandas' own Series where one is
    missing (nan for it, and floats for whole numbers), otherwise the Polars Series, whose
    numbers, texts and True/False are the same Python values, so that pandas is not imported
    for them."""
    return values.to_pandas() if values.null_count() else values


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

# Integer columns as pandas' to_csv writes them: one holding a missing value is float in
# pandas (2024.0), one without stays integer (2024).
PANDAS_CSV_INTS = (
    pl.when(pl.selectors.integer().null_count() > 0)
    .then(pl.selectors.integer().cast(pl.Float64).cast(pl.String))
    .otherwise(pl.selectors.integer().cast(pl.String))
)

LATE_AFTER = 14   # days
TODAY = "2024-08-31"   # the day the book was closed for the summer


def longest_idle(out_dates):
    """Longest run of days between two loans of the same tool."""
    days = sorted(out_dates.dropna().unique())
    longest = 0
    for earlier, later in zip(days, days[1:]):
        gap = (later - earlier).days
        if gap > longest:
            longest = gap
    return longest


loans = (
    pl.scan_csv(
        "data/loans.csv",
        null_values=PANDAS_NA_VALUES + ["?"],
        infer_schema_length=None,
    )
    .collect()
    .lazy()
)
tools = pl.scan_csv(
    "data/tools.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)
print("loans in the book:", loans.select(pl.len()).collect().item())

print(
    "loan slips entered twice:",
    loans.select(pl.col("loan_id").is_first_distinct().not_().sum().cast(pl.Int64))
    .collect()
    .to_series()
    .to_numpy()[0],
)
loans = loans.with_columns(
    tool=pl.col("tool")
    .str.strip_chars(PANDAS_WHITESPACE)
    .str.replace_many({"İ": "i", "Σ": "σ"})
    .str.to_lowercase(),
)
loans = loans.with_columns(
    condition=pl.col("condition")
    .str.replace_many({"İ": "i", "Σ": "σ"})
    .str.to_lowercase()
    .fill_null(pl.lit("not checked")),
)
loans = loans.with_columns(
    out_date=pl.when(
        pl.col("out_date")
        .str.contains(
            "(?i)^(?:(?:[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))-(?:1[0-2]|0[1-9]|[1-9])-(?:3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9]))$",
        ),
    )
    .then(pl.col("out_date"))
    .when(
        ~pl.col("out_date").is_in(["", "NaT", "nat", "NAT", "nan", "NaN", "NAN"]) & pl.col("out_date").is_not_null(),
    )
    .then(pl.lit("="))
    .str.to_datetime("%Y-%m-%d", time_unit="us"),
)
loans = loans.with_columns(lost=(pl.col("back_date") == "lost").fill_null(False))
loans = loans.with_columns(broken=(pl.col("condition") == "broken").fill_null(False))
loans = loans.with_columns(
    back_date=pl.when(
        pl.col("back_date")
        .str.contains(
            "(?i)^(?:(?:[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))-(?:1[0-2]|0[1-9]|[1-9])-(?:3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9]))$",
        ),
    )
    .then(pl.col("back_date"))
    .str.to_datetime("%Y-%m-%d", time_unit="us", strict=False),
)
loans = (
    loans
    .with_columns(
        days_out=(pl.col("back_date").fill_null(pl.datetime(2024, 8, 31)) - pl.col("out_date")).dt.total_microseconds() // 86_400_000_000,
    )
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("days_out",) if t[c].has_nulls()]),
    )
    .lazy()
)

# TODO(porter): groupby.agg: longest_idle is not one expression (a loop or a block that only a
#   Python call can run): write it as an aggregation
idle = (
    loans.select("tool", "out_date")
    .collect()
    .to_pandas()
    .groupby("tool")["out_date"]
    .agg(longest_idle)
    .reset_index()
)
idle = pl.from_pandas(idle).lazy()
idle = idle.rename({"out_date": "longest_idle_days"}, strict=False).collect().lazy()
print(idle.head(5).collect())

# --- per tool: loans, days out, idle spell, against the deposit
stock = (
    tools
    .drop_nulls("tool")
    .group_by("tool")
    .agg(
        pl.col("bought").count().cast(pl.Int64).alias("copies"),
        pl.col("deposit").max().alias("deposit"),
    )
    .sort("tool")
)
per_tool = (
    loans
    .drop_nulls("tool")
    .group_by("tool")
    .agg(
        pl.col("loan_id").count().cast(pl.Int64).alias("loans"),
        pl.col("days_out").sum().alias("days_out"),
        pl.col("broken").sum().cast(pl.Int64).alias("broken"),
        pl.col("lost").sum().cast(pl.Int64).alias("lost"),
    )
    .sort("tool")
)
per_tool = (
    per_tool
    .rename(
        lambda c, other=idle.collect_schema().names(): c + "_x" if c in other and c not in ("tool",) else c,
    )
    .join(
        idle.rename(
            lambda c: c + "_y" if c in ("loans", "days_out", "broken", "lost") else c,
        ),
        on="tool",
        how="inner",
        nulls_equal=True,
        maintain_order="left_right",
    )
    .rename(lambda c: c + "_x" if c in ("copies", "deposit") else c)
    .join(
        stock.rename(
            lambda c, other=per_tool.rename(lambda c, other=idle.collect_schema().names(): c + "_x" if c in other and c not in ("tool",) else c).join(idle.rename(lambda c: c + "_y" if c in ("loans", "days_out", "broken", "lost") else c), on="tool", how="inner", nulls_equal=True, maintain_order="left_right").collect_schema().names(): c + "_y" if c in other and c not in ("tool",) else c,
        ),
        on="tool",
        how="left",
        nulls_equal=True,
        maintain_order="left_right",
    )
)
per_tool = per_tool.with_columns(
    loans_per_deposit_pound=(pl.col("loans") / pl.col("deposit")).fill_nan(None),
)
per_tool = per_tool.with_columns(
    loans_per_deposit_pound=pl.col("loans_per_deposit_pound").round(3),
)
per_tool = per_tool.with_columns(
    idle_share=pandas_div(pl.col("longest_idle_days"), 183).round(3),
)
per_tool = (
    per_tool
    .sort(
        ["longest_idle_days", "tool"],
        descending=[True, False],
        nulls_last=True,
        maintain_order=True,
    )
    .collect()
    .lazy()
)
(
    per_tool
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
    .sink_csv("tool_use.csv")
)
print(
    "tools not in the stock list:",
    pandas_values(
        per_tool.filter(pl.col("copies").is_null())
        .select(pl.col("tool"))
        .collect()
        .to_series(),
    )
    .to_list(),
)

# --- members with a tool out too long (or lost)
late = loans.filter((pl.col("days_out") > LATE_AFTER) | pl.col("lost"))
late = (
    late
    .rename(lambda c: c + "_x" if c in ("deposit",) else c)
    .join(
        per_tool.select("tool", "deposit")
        .rename(
            lambda c, other=late.collect_schema().names(): c + "_y" if c in other and c not in ("tool",) else c,
        ),
        on="tool",
        how="left",
        nulls_equal=True,
        maintain_order="left_right",
    )
)
by_member = (
    late
    .drop_nulls("member")
    .group_by("member")
    .agg(
        pl.col("loan_id").count().cast(pl.Int64).alias("late_loans"),
        pl.col("deposit").alias("deposits_held"),
        pl.col("days_out").max().alias("worst"),
    )
    .with_columns(pandas_group_sums(pl.col("deposits_held"), floats=False))
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort("member")
)
by_member = by_member.sort(
    ["late_loans", "member"],
    descending=[True, False],
    nulls_last=True,
    maintain_order=True,
)
pl.collect_all([
    (
        by_member
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
        .sink_csv("late_members.csv", lazy=True)
    ),
    (
        late
        .select("loan_id", "tool", "member", "out_date", "days_out", "lost")
        .pipe(pandas_sort_values, "loan_id")
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
        .sink_csv("late_loans.csv", lazy=True)
    ),
])
