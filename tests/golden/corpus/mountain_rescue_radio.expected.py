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
# writes 0.00005 and 1.5e-7; NaN as an empty field.
PANDAS_CSV_FLOATS = (
    pl.selectors.float().fill_nan(None).cast(pl.String)
    .str.replace(r"e-(\d)$", "e-0${1}")
    .str.replace(r"^(-?)0\.0000(\d)$", "${1}${2}e-05")
    .str.replace(r"^(-?)0\.0000(\d)(\d+)$", "${1}${2}.${3}e-05")
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


# TODO(porter): frame.labels: pandas code reads the row labels of what tidy returns, the original
#   row numbers after a filter or sort: it stays pandas code
def tidy(log):
    log["call"] = log["call"].str.strip().str.lower()
    log["unit"] = log["call"].map(TEAMS)
    log["operator"] = log["operator"].str.strip().str.title()
    log["channel"] = log["channel"].str.zfill(2)
    # r24-33 -> R-24-033
    log["incident"] = log["incident"].str.upper().str.replace(r"^R-?(\d\d)-?(\d+)$", r"R-\1-\2", regex=True)
    num = log["incident"].str.split("-", n=2, expand=True)
    log["incident"] = "R-" + num[1] + "-" + num[2].str.pad(3, fillchar="0")
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
log = log.collect().to_pandas()
# TODO(porter): frame.labels: pandas code reads the row labels of `log` later, which are the
#   original row numbers after a filter or sort: pandas makes it; to port it, keep the row number as
#   a column (with_row_index) where the frame is read and use that column where the labels are read
log = log.drop_duplicates(subset=["msg_id"])
log = tidy(log)

# TODO(porter): pd.to_datetime: unit= of something other than a column of numbers
log["at"] = pd.to_datetime(log["logged"], unit="s")
log["at"] = log["at"].dt.tz_localize("UTC").dt.tz_convert("Europe/Vienna")
log["local_day"] = log["at"].dt.strftime("%Y-%m-%d")
log["hour"] = log["at"].dt.hour
print(log[["logged", "at", "local_day"]].head())

# message shorthand
txt = log["text"]
log["is_pos"] = txt.str.startswith("POS") | txt.str.startswith("pos")
pos = txt.str.extract(r"(?i)pos\s+(?P<lat>\d{4})/(?P<lon>\d{4})(?:\s+alt\s+(?P<alt>\d+))?")
log["lat"] = pos["lat"].str.slice(0, 2).astype(float) + pos["lat"].str.slice(2).astype(float) / 60
log["lon"] = pos["lon"].str.slice(0, 2).astype(float) + pos["lon"].str.slice(2).astype(float) / 60
# TODO(porter): pd.to_numeric: only a column of a frame is ported;
#   pl.col(c).str.strip_chars().cast(pl.Float64, strict=False) for errors='coerce' (pandas strips
#   spaces and may give int64)
log["alt"] = pd.to_numeric(pos["alt"], errors="coerce")
log["casualties"] = txt.str.extract(r"(?i)cas\s+(\d+)", expand=False).astype(float)
log["mayday"] = txt.str.contains("mayday", case=False, na=False)
log["numbers"] = txt.str.findall(r"\d+").str.len()
log["words"] = txt.str.count(r"\s+") + 1
log["last_word"] = txt.str.split(" ").str.get(-1).str.capitalize()
log["eta"] = txt.str.extract(r"(?i)eta\s+(\d+)\s*min", expand=False).astype(float)
log["eta_h"] = txt.str.extract(r"(?i)eta\s+(\d+)h(\d+)", expand=True)[0].astype(float)
log.loc[log["eta_h"].notna(), "eta"] = log["eta_h"] * 60 + 20


def band(alt):
    if alt != alt:
        return "unknown"
    elif alt >= 3000:
        return "high"
    elif alt >= 2000:
        return "alpine"
    return "valley"


log["band"] = log["alt"].apply(band)
log["kind"] = txt.map(lambda t: "mayday" if isinstance(t, str) and "mayday" in t.lower() else ("pos" if isinstance(t, str) and t[:3].lower() == "pos" else "other"))
log["priority"] = log["kind"].map(PRIORITY).fillna(9).astype(int)
log["text_len"] = txt.str.len()
print(log["band"].value_counts())

# incidents: how long each stayed open, from the hand-typed sheet
inc = inc.collect().to_pandas()
# TODO(porter): frame.labels: pandas code reads the row labels of `inc` later, which are the
#   original row numbers after a filter or sort: pandas makes it; to port it, keep the row number as
#   a column (with_row_index) where the frame is read and use that column where the labels are read
inc = inc.drop_duplicates()
# TODO(porter): pd.to_datetime: only a column of a frame is ported; a scalar, a list or a frame
#   stays on pandas
inc["opened"] = pd.to_datetime(inc["opened"], format="%Y-%m-%d %H:%M")
# TODO(porter): pd.to_datetime: only a column of a frame is ported; a scalar, a list or a frame
#   stays on pandas
inc["closed"] = pd.to_datetime(inc["closed"], format="%Y-%m-%d %H:%M", errors="coerce")
inc["closed"] = inc["closed"].fillna(
    inc["opened"] + pl.select(pl.duration(hours=12)).item(),
)
inc["open_for"] = inc["closed"] - inc["opened"]
inc["hours"] = (inc["open_for"].dt.total_seconds() / 3600).round(2)
inc["whole_days"] = inc["open_for"].dt.days
inc["per_crew"] = inc["hours"] / inc["crew"]
inc["place"] = inc["place"].str.title()
inc["tag"] = inc["place"].str.slice(0, 4).str.upper() + "-" + inc["incident"].str.slice(-3)
print(inc)

# --- what each incident heard on the radio
per_inc = log.groupby("incident", as_index=False).agg(
    msgs=("msg_id", "count"), maydays=("mayday", "sum"), positions=("is_pos", "sum"),
    highest=("alt", "max"), casualties=("casualties", "max"), words=("words", "sum"))
per_inc = per_inc.merge(inc[["incident", "hours", "whole_days", "per_crew", "tag"]], on="incident", how="left")
per_inc = pl.from_pandas(per_inc).lazy()
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
pts = log[log["lat"].notna()][["msg_id", "incident", "unit", "local_day", "hour", "lat", "lon", "alt", "band"]]
pts["lat"] = pts["lat"].round(4)
pts["lon"] = pts["lon"].round(4)
pts["label"] = pts.apply(lambda r: f"{r['incident']}/{r['msg_id']}" if r["alt"] == r["alt"] else "no alt", axis=1)
pts = pts.sort_values(["incident", "local_day", "hour", "msg_id"], na_position="first")
pts.to_csv("data/positions.csv", index=False)

# --- operators' day by day load
load_ = log.groupby(["local_day", "operator"]).agg(n=("msg_id", "size"), long_msgs=("text_len", lambda s: (s > 30).sum())).reset_index()
load_ = pl.from_pandas(load_).lazy()
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
    .sink_csv("data/operator_load.csv")
)
print(load_.head(12).collect())
print("messages without a time:", log["at"].isna().sum())
