"""Lavender distillery still log: oil yield of each batch against the variety's usual yield,
each still's run through the season, and the operators' weeks.

The distillery's own script, run after harvest. Whoever runs the still fills in the log:
'n/a' or 'wet' mean the flowers were not weighed. A batch with no still still counts in the
week's oil. Batch numbers are typed three ways ('LD-0042', 'ld 42', 'LD42').
"""
import pandas as pd
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


def pandas_div(numerator, divisor):
    """numerator / divisor, each value divided as pandas divides it: Polars multiplies by the
    reciprocal of a single divisor, which can be one binary digit off the quotient (and a later
    round() then goes the other way)."""
    return numerator / (numerator.is_null() * 0 + divisor)


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

SEASON_START = pd.Timestamp("2025-06-23")
HEAD_LIMIT = 100.0        # above this the oil scorches
DENSITY = 0.89            # g/ml, lavender oil
MISSING = ["n/a", "wet"]


# TODO(porter): frame.labels: pandas code reads the row labels of what tidy_names returns, the
#   original row numbers after a filter or sort: it stays pandas code
def tidy_names(df):
    df["still"] = df["still"].str.strip().str.lower()
    df["operator"] = df["operator"].str.strip().str.title()
    df["variety"] = df["variety"].str.strip().str.lower()
    return df


# porter: quality(row_pct), a function of each value, is ported as one expression
#   where it was applied, and left out here


log = (
    pl.scan_csv(
        "data/still_log.csv",
        null_values=PANDAS_NA_VALUES + ["wet"],
        infer_schema_length=None,
    )
    .collect()
    .lazy()
)
varieties = pl.scan_csv(
    "data/varieties.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)
print((log.select(pl.len()).collect().item(), len(log.collect_schema())))
print(pandas_dtypes_text(log.select(PANDAS_DTYPE_PROBE).collect()))

# TODO(porter): handover.unknown_code: passed to code porter does not understand: handed over to
#   pandas with .collect().to_pandas(); port that code to take a Polars frame
log = tidy_names(log.collect().to_pandas())
log = log.drop_duplicates()
print("after dropping repeats:", len(log))

# batch number: 'LD-0042' / 'ld 42' / 'LD42' -> 'LD-0042'
num = log["batch"].str.extract(r"(?i)^(ld)[\s-]?(\d+)$")
log["batch"] = num[0].str.upper() + "-" + num[1].str.zfill(4)
log["batch_no"] = num[1].astype(int)

# two ways of writing the start
# TODO(porter): pd.to_datetime: only a column of a frame is ported; a scalar, a list or a frame
#   stays on pandas
started = pd.to_datetime(log["started"], format="%Y-%m-%d %H:%M", errors="coerce")
# TODO(porter): pd.to_datetime: only a column of a frame is ported; a scalar, a list or a frame
#   stays on pandas
started = started.fillna(pd.to_datetime(log["started"], format="%d.%m.%Y %H:%M", errors="coerce"))
log["started"] = started
print("no start:", log["started"].isna().sum())
log = log[log["started"].notna()]
log["day"] = log["started"].dt.normalize()
log["season_day"] = (log["day"] - SEASON_START).dt.days + 1
log["week"] = log["started"].dt.isocalendar().week
log["steam_min"] = log["steam_min"].fillna(60)
# TODO(porter): pd.to_timedelta: only a column of a frame porter ports, or a number or text written
#   out, is ported
log["ended"] = log["started"] + pd.to_timedelta(log["steam_min"], unit="m")

# field: 'F3-sud', 'f7 plateau' -> plot number and side
field = log["field"].str.upper().str.replace(r"\s+", "-", regex=True).str.split("-", n=1, expand=True)
log["plot"] = field[0]
log["slope"] = field[1].str.capitalize()
print(log[["batch", "started", "ended", "plot", "slope"]].head(10))

# yield: oil mass over flower mass, per cent
log["oil_g"] = log["oil_ml"] * DENSITY
log["yield_pct"] = (log["oil_g"] / (log["flowers_kg"] * 1000) * 100).round(3)
log["yield_pct"] = log["yield_pct"].where(log["oil_ml"] > 0)
varieties = varieties.collect().to_pandas()
# TODO(porter): frame.labels: pandas code reads the row labels of `varieties` later, which are the
#   original row numbers after a filter or sort: pandas makes it; to port it, keep the row number as
#   a column (with_row_index) where the frame is read and use that column where the labels are read
varieties = varieties.drop_duplicates(subset="variety", keep="last")
log = log.merge(varieties, on="variety", how="left")
log = pl.from_pandas(log).lazy()
log = log.with_columns(
    vs_expected=(pl.col("yield_pct") / pl.col("expected_pct")).fill_nan(None).round(3),
)
log = log.with_columns(
    quality=pl.when((pl.col("vs_expected") != pl.col("vs_expected")).fill_null(True))
    .then(pl.lit("unknown"))
    .when(pl.col("vs_expected") >= 1.1)
    .then(pl.lit("rich"))
    .when(pl.col("vs_expected") >= 0.9)
    .then(pl.lit("normal"))
    .otherwise(pl.lit("thin")),
)
log = log.with_columns(scorched=(pl.col("head_temp_c") > HEAD_LIMIT).fill_null(False))
log = log.with_columns(
    trouble=pl.when(pl.col("notes").str.contains("(?i)burnt|scorch"))
    .then(pl.lit("burnt"))
    .when(pl.col("notes").str.contains("(?i)overflow|foam"))
    .then(pl.lit("overflow"))
    .when(pl.col("notes").str.contains("(?i)leak"))
    .then(pl.lit("leak"))
    .otherwise(pl.lit("none")),
)
log = log.with_columns(
    trouble=pl.when(pl.col("scorched") & (pl.col("trouble") == "none"))
    .then(pl.lit("hot head"))
    .otherwise(
        pl.coalesce(pl.selectors.by_name("trouble", require_all=False), pl.lit(None)),
    ),
)
log = log.with_columns(
    eur=(pandas_div(pl.col("oil_ml"), 1000) * pl.col("eur_per_litre"))
    .fill_nan(None)
    .round(2),
)
log = log.with_columns(
    eur=pl.when(pl.col("trouble") == "burnt")
    .then(pl.lit(0, dtype=pl.Int64))
    .otherwise(
        pl.coalesce(pl.selectors.by_name("eur", require_all=False), pl.lit(None)),
    ),
)
log = (
    log
    .with_columns(temp_margin=(HEAD_LIMIT - pl.col("head_temp_c")).clip(-5, 5))
    .collect()
    .lazy()
)
print(
    log.select(
        "batch",
        "variety",
        "yield_pct",
        "vs_expected",
        "quality",
        "trouble",
        "eur",
    )
    .head(10)
    .collect(),
)

# each still's season: pause since the last batch, running oil, moving head temperature
log = log.sort(["still", "started", "batch_no"], nulls_last=True, maintain_order=True)
log = log.with_columns(
    prev_end=pl.when(pl.col("still").is_not_null())
    .then(pl.col("ended").shift(1).over("still")),
)
log = log.with_columns(
    pause_h=pandas_div(
        (pl.col("started") - pl.col("prev_end")).dt.total_microseconds()
        .pipe(lambda us: us // 1_000_000 + us % 1_000_000 / (us * 0 + 1_000_000)),
        3600,
    )
    .round(2),
)
log = log.with_columns(
    cold_start=(pl.col("pause_h").is_null() | (pl.col("pause_h") > 10))
    .fill_null(False),
)
log = (
    log
    .with_columns(
        run_no=pl.when(pl.col("still").is_not_null())
        .then(pl.col("cold_start").cast(pl.Int64).cum_sum().over("still")),
    )
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("run_no",) if t[c].has_nulls()]),
    )
    .lazy()
)
log = log.with_columns(
    oil_to_date=pl.when(pl.col("still").is_not_null())
    .then(
        pl.when(
            pl.col("oil_ml").is_not_null(),
            pl.col("oil_ml")
            .rolling_sum(2 ** 31 - 1, min_samples=1)
            .shift()
            .fill_null(0)
            .is_finite(),
        )
        .then(pl.col("oil_ml").rolling_sum(2 ** 31 - 1, min_samples=1))
        .over("still"),
    ),
)
log = log.with_columns(
    head_avg5=pl.when(pl.col("still").is_not_null())
    .then(
        pl.when(
            pl.col("head_temp_c").cast(pl.Float64).replace([float("inf"), float("-inf")], None).rolling_min(5, min_samples=2) == pl.col("head_temp_c").cast(pl.Float64).replace([float("inf"), float("-inf")], None).rolling_max(5, min_samples=2),
        )
        .then(
            pl.col("head_temp_c")
            .cast(pl.Float64)
            .replace([float("inf"), float("-inf")], None)
            .forward_fill(),
        )
        .otherwise(
            pl.col("head_temp_c")
            .cast(pl.Float64)
            .replace([float("inf"), float("-inf")], None)
            .rolling_mean(5, min_samples=2),
        )
        .over("still"),
    )
    .round(2),
)
log = log.with_columns(
    yield_rank=pl.when(pl.col("still").is_not_null() & pl.col("variety").is_not_null())
    .then(
        pl.col("yield_pct")
        .rank("dense", descending=True)
        .cast(pl.Float64)
        .over("still", "variety"),
    ),
)
log = (
    log
    .with_columns(
        share_of_still=(
            pl.col("oil_ml")
            / pl.when(pl.col("still").is_not_null()).then(pl.col("oil_ml").sum().over("still"))
        )
        .fill_nan(None)
        .round(4),
    )
    .collect()
    .lazy()
)
print(
    log.select(
        "still",
        "batch",
        "pause_h",
        "run_no",
        "oil_to_date",
        "head_avg5",
        "yield_rank",
    )
    .head(12)
    .collect(),
)

out = log.select(
    "batch",
    "started",
    "ended",
    "still",
    "operator",
    "variety",
    "plot",
    "slope",
    "season_day",
    "flowers_kg",
    "oil_ml",
    "yield_pct",
    "vs_expected",
    "quality",
    "trouble",
    "eur",
    "temp_margin",
    "pause_h",
    "run_no",
    "oil_to_date",
    "head_avg5",
    "yield_rank",
    "share_of_still",
)
(
    out
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
    .sink_csv("data/batch_report.csv")
)

# the operators' weeks
weekly = (
    log
    .group_by(["week", "operator"])
    .agg(
        pl.col("batch").count().cast(pl.Int64).alias("batches"),
        pl.col("flowers_kg"),
        pl.col("oil_ml"),
        pl.col("eur"),
        (pl.col("trouble") == "burnt")
        .fill_null(False)
        .sum()
        .cast(pl.Int64)
        .alias("burnt"),
    )
    .with_columns(
        pandas_group_sums(pl.col("flowers_kg"), floats=False),
        pandas_group_sums(pl.col("oil_ml"), floats=False),
        pandas_group_sums(pl.col("eur"), floats=False),
    )
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort(["week", "operator"], nulls_last=True)
)
weekly = weekly.with_columns(
    ml_per_batch=(pl.col("oil_ml") / (pl.col("batches") - pl.col("burnt")))
    .fill_nan(None)
    .round(1),
)
weekly = weekly.with_columns(eur=pl.col("eur").round(2))
weekly = (
    weekly
    .sort(
        ["week", "oil_ml"],
        descending=[False, True],
        nulls_last=True,
        maintain_order=True,
    )
    .collect()
    .lazy()
)
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
    .sink_csv("data/operator_weeks.csv")
)
print(weekly.head(15).collect())

# the best batch of each variety
best = (
    log
    .drop_nulls("yield_pct")
    .sort(
        ["variety", "yield_pct", "batch"],
        descending=[False, True, False],
        nulls_last=True,
        maintain_order=True,
    )
)
best = (
    best
    .filter(
        pl.col("variety").is_not_null() & (pl.int_range(pl.len()).over("variety") < 1),
    )
    .select("variety", "batch", "still", "operator", "yield_pct", "quality")
    .collect()
    .lazy()
)
(
    best
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
    .sink_csv("data/best_batches.csv")
)
print(best.collect())
