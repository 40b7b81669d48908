"""Tide mill grinding book: how long each run ground for, flour per hour of ebb, and how
much each millstone ground between dressings.

Written by the mill's volunteer secretary from the grinding book. A run is written as
'start-stop' on the clock; a run that starts before midnight may stop after it. A head of
water below zero is the gauge reading low, not a real head. 'n/a' means not written down.
"""
import numpy as np
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


# One row per column that gives pandas the dtype of the whole column: the first value, or a
# missing value where the column holds one (pandas makes such an int column float64 and a
# True/False one object); no row when the frame has none.
PANDAS_DTYPE_PROBE = pl.when(~pl.all().is_null().any()).then(pl.all().head(1))

STONE_INCHES = {"french burr": 48, "peak": 54, "cullin": 42}
OPENING_DAY = pd.Timestamp("2025-02-01")

book = (
    pl.scan_csv(
        "data/grinding_book.csv",
        null_values=PANDAS_NA_VALUES,
        infer_schema_length=None,
    )
    .collect()
    .lazy()
)
print(pandas_dtypes_text(book.select(PANDAS_DTYPE_PROBE).collect()))
book = book.collect().to_pandas()
# TODO(porter): frame.labels: pandas code reads the row labels of `book` later, which are the
#   original row numbers after a filter or sort: pandas makes it; to port it, keep the row number as
#   a column (with_row_index) where the frame is read and use that column where the labels are read
book = book.drop_duplicates()
book["stone"] = book["stone"].str.strip().str.lower()
book["miller"] = book["miller"].str.strip().str.capitalize()
book["miller"] = book["miller"].replace({"Herve": "Hervé"})

# the day: mostly ISO, a few written the continental way
# TODO(porter): pd.to_datetime: only a column of a frame is ported; a scalar, a list or a frame
#   stays on pandas
day = pd.to_datetime(book["day"], format="%Y-%m-%d", errors="coerce")
# TODO(porter): pd.to_datetime: only a column of a frame is ported; a scalar, a list or a frame
#   stays on pandas
book["day"] = day.fillna(pd.to_datetime(book["day"], format="%d.%m.%Y", errors="coerce"))

# the run: '5:00-09:00' or '14:00 - 19:00'; 'all tide' and blanks are not runs
span = book["span"].str.replace(" ", "", regex=False).str.split("-", expand=True)
span.columns = ["start", "stop"]
span["start"] = span["start"].str.zfill(5)
print(span.head())
# TODO(porter): pd.to_timedelta: only a column of a frame porter ports, or a number or text written
#   out, is ported
book["start"] = book["day"] + pd.to_timedelta(span["start"] + ":00", errors="coerce")
# TODO(porter): pd.to_timedelta: only a column of a frame porter ports, or a number or text written
#   out, is ported
book["stop"] = book["day"] + pd.to_timedelta(span["stop"] + ":00", errors="coerce")
overnight = book["stop"] < book["start"]
book.loc[overnight, "stop"] += pl.select(pl.duration(days=1)).item()
book["run_min"] = (book["stop"] - book["start"]).dt.total_seconds() / 60
print("runs past midnight:", overnight.sum())

# the grain: 'RYE / coarse' -> Rye, coarse
grain = book["grain"].str.split("/", n=1, expand=True)
book["grain"] = grain[0].str.strip().str.capitalize()
book["grind"] = grain[1].str.strip().str.lower()
book["grind"] = book["grind"].fillna("plain")

def tide_kind(weather):
    if not isinstance(weather, str):
        return "ordinary"
    elif "spring" in weather.lower():
        return "spring"
    elif "neap" in weather.lower():
        return "neap"
    else:
        return "ordinary"

book["tide"] = book["weather"].apply(tide_kind)
book["gale"] = book["weather"].str.contains("gale", case=False, na=False)
book["head_cm"] = book["head_cm"].mask(book["head_cm"] < 0)
book["head_cm"] = book["head_cm"].clip(upper=140)
book["stone_in"] = book["stone"].map(STONE_INCHES)
book["dressed"] = book["dressed"].map(lambda d: d in ("yes", "Y"))
book["sacks_per_hour"] = (book["sacks"] / (book["run_min"] / 60)).round(2)
book["head_band"] = np.where(book["head_cm"] >= 100, "high",
                             np.where(book["head_cm"] >= 60, "mid", "low"))
book.loc[book["head_cm"].isna(), "head_band"] = "unread"
book.loc[book["gale"], "sacks_per_hour"] *= 0.95   # gale runs are weighed wet
book["sacks_per_hour"] = book["sacks_per_hour"].round(2)
print(book[["run_id", "start", "stop", "run_min", "grain", "grind", "tide", "head_band"]].head(10))

# each stone: gap between runs, sacks since the last dressing, its average so far
book = book.sort_values(["stone", "start", "run_id"]).reset_index(drop=True)
book["dressing_no"] = book.groupby("stone")["dressed"].cumsum()
book["sacks_since_dressing"] = book.groupby(["stone", "dressing_no"])["sacks"].cumsum()
book["idle_h"] = (book["start"] - book.groupby("stone")["stop"].shift()).dt.total_seconds() / 3600
book["rate_so_far"] = (book.groupby("stone")["sacks_per_hour"].expanding().mean()
                       .reset_index(level=0, drop=True).round(2))
book["run_of_stone"] = book.groupby("stone").cumcount() + 1
book["days_open"] = (book["day"] - OPENING_DAY).dt.days
stones = book[["run_id", "stone", "stone_in", "start", "run_min", "sacks", "dressing_no",
               "sacks_since_dressing", "idle_h", "rate_so_far", "run_of_stone", "days_open"]]
stones.to_csv("data/stone_wear.csv", index=False)
print(stones.tail(8))

# week by week, grain by grain
book["week"] = book["start"].dt.to_period("W").astype(str)
weekly = book.groupby(["week", "grain"]).agg(runs=("run_id", "count"), sacks=("sacks", "sum"),
                                             minutes=("run_min", "sum")).reset_index()
weekly["sacks_per_hour"] = (weekly["sacks"] / weekly["minutes"] * 60).round(2)
weekly["share_of_week"] = (weekly["sacks"] / weekly.groupby("week")["sacks"].transform("sum")).round(3)
weekly["sacks"] = weekly["sacks"].round(1)
weekly.to_csv("data/weekly_grain.csv", index=False)
print(weekly.head(12))

# each miller: runs on a spring tide, best rate
millers = book.groupby("miller", dropna=False).agg(runs=("run_id", "count"),
                                                   spring_runs=("tide", lambda s: (s == "spring").sum()),
                                                   best_rate=("sacks_per_hour", "max"),
                                                   first_run=("start", "min")).reset_index()
millers["first_day"] = millers["first_run"].dt.normalize()
millers = millers.sort_values("runs", ascending=False)
millers.to_csv("data/millers.csv", index=False)
print(millers)
