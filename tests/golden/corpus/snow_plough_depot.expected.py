"""Snow-plough depot shift sheets: hours and salt per route, drivers' rest between shifts,
and the kilometres each truck's blade has done since it was last changed.

The depot clerk's working file, cell by cell. A shift's end is written on the clock; a
night shift ends the next morning. 'kaputt' is what the drivers write when the odometer
is broken. A card with no end time is booked as a standard eight-hour shift.
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

SEASON_START = pd.Timestamp("2024-11-15")
STANDARD_SHIFT = pl.select(pl.duration(hours=8)).item()
MIN_REST_H = 11
TRUCK_CLASS = {"U-3": "unimog", "U-7": "unimog", "U-11": "lorry", "Unimog 2": "unimog"}

sheets = (
    pl.scan_csv(
        "data/shift_sheets.csv",
        null_values=PANDAS_NA_VALUES + ["kaputt"],
        infer_schema_length=None,
    )
    .collect()
    .lazy()
)
routes = pl.scan_csv(
    "data/routes.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)
print((sheets.select(pl.len()).collect().item(), len(sheets.collect_schema())))
print(sheets.head(5).collect())

# TODO(porter): frame.labels: pandas code reads the row labels of what tidy_names returns, the
#   original row numbers after a filter or sort: it stays pandas code
def tidy_names(df):
    df["truck"] = df["truck"].str.strip().str.upper().str.replace("UNIMOG", "Unimog", regex=False)
    df["driver"] = df["driver"].str.strip().str.capitalize()
    df["driver"] = df["driver"].replace({"Zofie": "Žofie"})
    return df

sheets = sheets.collect().to_pandas()
# TODO(porter): frame.labels: pandas code reads the row labels of `sheets` later, which are the
#   original row numbers after a filter or sort: pandas makes it; to port it, keep the row number as
#   a column (with_row_index) where the frame is read and use that column where the labels are read
sheets = sheets.drop_duplicates()
sheets = tidy_names(sheets)
# TODO(porter): pd.to_numeric: only a column of a frame is ported;
#   pl.col(c).str.strip_chars().cast(pl.Float64, strict=False) for errors='coerce' (pandas strips
#   spaces and may give int64)
sheets["salt_t"] = pd.to_numeric(sheets["salt_t"].str.replace(",", ".", regex=False), errors="coerce")

# route 'R-07 North', 'r12/ valley' -> R07 / valley
route = sheets["route"].str.extract(r"(?i)^r-?(\d+)\W*\s*([a-z]+)$")
sheets["route"] = "R" + route[0].str.zfill(2)
sheets["area"] = route[1].str.lower()
print(sheets[["route", "area"]].value_counts(dropna=False).head(10))

# times: the end may be past midnight, or missing
# TODO(porter): pd.to_datetime: only a column of a frame is ported; a scalar, a list or a frame
#   stays on pandas
sheets["start_at"] = pd.to_datetime(sheets["shift_day"] + " " + sheets["start"], format="%Y-%m-%d %H:%M",
                                    errors="coerce")
# TODO(porter): pd.to_datetime: only a column of a frame is ported; a scalar, a list or a frame
#   stays on pandas
sheets["end_at"] = pd.to_datetime(sheets["shift_day"] + " " + sheets["end"], format="%Y-%m-%d %H:%M",
                                  errors="coerce")
sheets.loc[sheets["end_at"] < sheets["start_at"], "end_at"] += (
    pl.select(pl.duration(days=1))
    .item()
)
sheets["end_at"] = sheets["end_at"].fillna(sheets["start_at"] + STANDARD_SHIFT)
sheets = sheets.dropna(subset=["start_at"])
sheets["hours"] = (sheets["end_at"] - sheets["start_at"]).dt.total_seconds() / 3600
sheets["day"] = sheets["start_at"].dt.normalize()
sheets["season_day"] = (sheets["day"] - SEASON_START).dt.days

def shift_kind(hour):
    if hour >= 20 or hour < 2:
        return "night"
    elif hour < 7:
        return "early"
    else:
        return "day"

sheets["kind"] = sheets["start_at"].dt.hour.apply(shift_kind)
sheets["truck_class"] = sheets["truck"].map(TRUCK_CLASS)
sheets["job"] = np.select([(sheets["snow_cm"] >= 10) & (sheets["air_c"] <= -2),
                           sheets["snow_cm"] >= 10,
                           sheets["air_c"] <= -2],
                          ["plough+salt", "plough", "salt"], default="patrol")
sheets["salt_per_km"] = (sheets["salt_t"] * 1000 / sheets["km"]).round(1)
sheets["salt_per_km"] = sheets["salt_per_km"].clip(upper=120)
sheets["blade_change"] = sheets["note"].str.contains("blade", case=False, na=False)
sheets["chains"] = sheets["note"].str.contains("chains", case=False, na=False)
sheets["km"] = sheets["km"].where(sheets["km"] > 0)
sheets.loc[sheets["chains"], "hours"] += 0.25    # fitting the chains is paid time
sheets["paid_hours"] = np.where(sheets["kind"] == "night", sheets["hours"] * 1.25, sheets["hours"])
sheets["paid_hours"] = sheets["paid_hours"].round(2)
print(sheets[["card", "start_at", "end_at", "hours", "kind", "job", "salt_per_km"]].head(10))

# drivers' rest: hours between the end of one shift and the start of the next
sheets = sheets.sort_values(["driver", "start_at", "card"]).reset_index(drop=True)
sheets["prev_end"] = sheets.groupby("driver")["end_at"].shift()
sheets["rest_h"] = ((sheets["start_at"] - sheets["prev_end"]).dt.total_seconds() / 3600).round(2)
sheets["short_rest"] = sheets["rest_h"] < MIN_REST_H
sheets["shift_no"] = sheets.groupby("driver").cumcount() + 1
sheets["hours_this_season"] = sheets.groupby("driver")["paid_hours"].cumsum().round(2)
rest = sheets.loc[sheets["short_rest"], ["driver", "card", "prev_end", "start_at", "rest_h", "shift_no"]]
rest.to_csv("data/short_rest.csv", index=False)
print(rest.head())

# each truck's blade: km since it was last changed
sheets = sheets.sort_values(["truck", "start_at", "card"]).reset_index(drop=True)
sheets["blade_no"] = sheets.groupby("truck")["blade_change"].cumsum()
sheets["km_on_blade"] = sheets.groupby(["truck", "blade_no"])["km"].cumsum()
sheets["salt_avg3"] = (sheets.groupby("truck")["salt_per_km"].rolling(3, min_periods=2).mean()
                       .reset_index(level=0, drop=True).round(1))
blades = sheets.groupby(["truck", "blade_no"]).agg(first_day=("day", "min"), last_day=("day", "max"),
                                                   shifts=("card", "count"), km=("km", "sum")).reset_index()
blades = pl.from_pandas(blades).lazy()
blades = (
    blades
    .with_columns(
        days_on=(pl.col("last_day") - pl.col("first_day")).dt.total_microseconds() // 86_400_000_000,
    )
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("days_on",) if t[c].has_nulls()]),
    )
    .lazy()
)
blades = (
    blades
    .with_columns(
        km_per_shift=(pl.col("km") / pl.col("shifts")).fill_nan(None).round(1),
    )
    .collect()
    .lazy()
)
(
    blades
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
    .sink_csv("data/blades.csv")
)
print(blades.collect())

# routes: against the planned length, busiest days ranked
routes = routes.filter(pl.col("route").is_last_distinct())
daily = sheets.groupby(["day", "route"]).agg(shifts=("card", "count"), km=("km", "sum"),
                                             salt_t=("salt_t", "sum"), hours=("hours", "sum")).reset_index()
daily = pl.from_pandas(daily).lazy()
daily = (
    daily
    .rename(
        lambda c, other=routes.collect_schema().names(): c + "_x" if c in other and c not in ("route",) else c,
    )
    .join(
        routes.rename(
            lambda c, other=daily.collect_schema().names(): c + "_y" if c in other and c not in ("route",) else c,
        ),
        on="route",
        how="left",
        nulls_equal=True,
        maintain_order="left_right",
    )
)
daily = daily.with_columns(
    passes=(pl.col("km") / pl.col("km_planned")).fill_nan(None).round(2),
)
daily = daily.with_columns(salt_t=pl.col("salt_t").round(2))
daily = daily.with_columns(
    rank_in_route=pl.when(pl.col("route").is_not_null())
    .then(
        pl.col("salt_t").rank("dense", descending=True).cast(pl.Float64).over("route"),
    ),
)
daily = daily.with_columns(priority=pl.col("priority").fill_null(9).cast(pl.Int64))
daily = (
    daily
    .sort(["day", "priority", "route"], nulls_last=True, maintain_order=True)
    .collect()
    .lazy()
)
(
    daily
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
    .sink_csv("data/route_days.csv")
)
print(daily.head(12).collect())

log = sheets[["card", "day", "season_day", "driver", "truck", "truck_class", "route", "area", "kind", "job",
              "hours", "paid_hours", "rest_h", "hours_this_season", "km", "km_on_blade", "salt_per_km",
              "salt_avg3"]]
log = log.sort_values("card")
log.to_csv("data/shift_log.csv", index=False)
