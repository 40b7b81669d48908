"""Mountain hut network: guest-nights per hut over the summer season, a hut-by-month grid,
and half-board stays that have not been paid yet.

Bookings come from the reservation system as Parquet; the hut register is a CSV
where the unguarded bivouac shelters have 0 beds.
"""
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

stays = (
    pl.scan_parquet("data/stays.parquet")
    .with_columns(pl.col(pl.Float32, pl.Float64).fill_nan(None))
    .collect()
    .lazy()
)
huts = (
    pl.scan_csv("data/huts.csv", null_values=PANDAS_NA_VALUES, infer_schema_length=None)
    .collect()
    .lazy()
)
print(pandas_dtypes_text(stays.select(PANDAS_DTYPE_PROBE).collect()))

stays = (
    stays
    .with_columns(
        year=pl.col("arrival").dt.year(),
        month=pl.col("arrival").dt.month().cast(pl.Int32),
        guest_nights=pl.col("guests") * pl.col("nights"),
    )
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("year", "month") if t[c].has_nulls()]),
    )
    .lazy()
)

per_hut = (
    stays
    .drop_nulls("hut")
    .group_by("hut")
    .agg(pl.col("guest_nights").alias("sum"), pl.col("guest_nights").alias("mean"))
    .with_columns(
        pandas_group_sums(pl.col("sum"), floats=False),
        pandas_group_sums(pl.col("mean"), mean=True, floats=False),
    )
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort("hut")
    .rename({"sum": "guest_nights", "mean": "avg_per_stay"})
    .rename(
        lambda c, other=huts.collect_schema().names(): c + "_x" if c in other and c not in ("hut",) else c,
    )
    .join(
        huts.rename(lambda c: c + "_y" if c in ("guest_nights", "avg_per_stay") else c),
        on="hut",
        how="left",
        nulls_equal=True,
        maintain_order="left_right",
    )
    .with_columns(
        nights_per_bed=(
            ((pl.col("guest_nights") / pl.col("beds")).fill_nan(None) * 10).round(0)
            / 10
        )
        .round(1),
    )
    .drop("warden")
    .pipe(pandas_sort_values, "guest_nights", descending=True)
    .collect()
    .lazy()
)
per_hut.sink_parquet("hut_summary.parquet")
print(per_hut.collect())

# the accountant wants a wide grid, one column per month
grid = (
    stays
    .drop_nulls(["hut", "month"])
    .group_by(["hut", "month"])
    .agg(pl.col("guest_nights").sum())
    .sort("month")
    .collect()
    .pivot(on="month", index="hut", values="guest_nights")
    .sort("hut")
    .fill_null(0)
    .lazy()
)
(
    grid
    .with_columns(
        pl.selectors.by_dtype(pl.Float32)
        .map_batches(
            lambda s: pl.Series(s.name, s.to_numpy().astype(str), dtype=pl.String).replace("nan", None),
            return_dtype=pl.String,
        ),
    )
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
    .sink_csv("hut_month_grid.csv")
)

unpaid = (
    stays
    .filter(pl.col("paid_eur").is_null() & pl.col("half_board"))
    .rename(lambda c: c + "_x" if c in ("warden",) else c)
    .join(
        huts.select("hut", "warden")
        .rename(
            lambda c, other=stays.filter(pl.col("paid_eur").is_null() & pl.col("half_board")).collect_schema().names(): c + "_y" if c in other and c not in ("hut",) else c,
        ),
        on="hut",
        how="left",
        nulls_equal=True,
        maintain_order="left_right",
    )
    .sort(["arrival", "stay_id"], nulls_last=True, maintain_order=True)
    .select("stay_id", "hut", "warden", "arrival", "guests", "nights")
    .collect()
    .lazy()
)
(
    unpaid
    .with_columns(
        pl.selectors.by_dtype(pl.Float32)
        .map_batches(
            lambda s: pl.Series(s.name, s.to_numpy().astype(str), dtype=pl.String).replace("nan", None),
            return_dtype=pl.String,
        ),
    )
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
    .sink_csv("unpaid_half_board.csv")
)
print(
    unpaid.select(pl.len()).collect().item(),
    round(
        stays.select(pl.col("paid_eur").sum()).collect().to_series().to_numpy()[0],
        2,
    ),
)
