"""Snow-plough depot shift sheets: hours and salt per route, drivers' rest between shifts,
and the kilometres each truck's blade has done since it was last changed.

The depot clerk's working file, cell by cell. A shift's end is written on the clock; a
night shift ends the next morning. 'kaputt' is what the drivers write when the odometer
is broken. A card with no end time is booked as a standard eight-hour shift.
"""
import numpy as np
import pandas as pd

SEASON_START = pd.Timestamp("2024-11-15")
STANDARD_SHIFT = pd.Timedelta(hours=8)
MIN_REST_H = 11
TRUCK_CLASS = {"U-3": "unimog", "U-7": "unimog", "U-11": "lorry", "Unimog 2": "unimog"}

sheets = pd.read_csv("data/shift_sheets.csv", na_values=["kaputt"])
routes = pd.read_csv("data/routes.csv")
print(sheets.shape)
print(sheets.head())

def tidy_names(df):
    df["truck"] = df["truck"].str.strip().str.upper().str.replace("UNIMOG", "Unimog", regex=False)
    df["driver"] = df["driver"].str.strip().str.capitalize()
    df["driver"] = df["driver"].replace({"Zofie": "Žofie"})
    return df

sheets = sheets.drop_duplicates()
sheets = tidy_names(sheets)
sheets["salt_t"] = pd.to_numeric(sheets["salt_t"].str.replace(",", ".", regex=False), errors="coerce")

# route 'R-07 North', 'r12/ valley' -> R07 / valley
route = sheets["route"].str.extract(r"(?i)^r-?(\d+)\W*\s*([a-z]+)$")
sheets["route"] = "R" + route[0].str.zfill(2)
sheets["area"] = route[1].str.lower()
print(sheets[["route", "area"]].value_counts(dropna=False).head(10))

# times: the end may be past midnight, or missing
sheets["start_at"] = pd.to_datetime(sheets["shift_day"] + " " + sheets["start"], format="%Y-%m-%d %H:%M",
                                    errors="coerce")
sheets["end_at"] = pd.to_datetime(sheets["shift_day"] + " " + sheets["end"], format="%Y-%m-%d %H:%M",
                                  errors="coerce")
sheets.loc[sheets["end_at"] < sheets["start_at"], "end_at"] += pd.Timedelta(days=1)
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
blades["days_on"] = (blades["last_day"] - blades["first_day"]).dt.days
blades["km_per_shift"] = (blades["km"] / blades["shifts"]).round(1)
blades.to_csv("data/blades.csv", index=False)
print(blades)

# routes: against the planned length, busiest days ranked
routes = routes.drop_duplicates(subset="route", keep="last")
daily = sheets.groupby(["day", "route"]).agg(shifts=("card", "count"), km=("km", "sum"),
                                             salt_t=("salt_t", "sum"), hours=("hours", "sum")).reset_index()
daily = daily.merge(routes, on="route", how="left")
daily["passes"] = (daily["km"] / daily["km_planned"]).round(2)
daily["salt_t"] = daily["salt_t"].round(2)
daily["rank_in_route"] = daily.groupby("route")["salt_t"].rank(method="dense", ascending=False)
daily["priority"] = daily["priority"].fillna(9).astype(int)
daily = daily.sort_values(["day", "priority", "route"])
daily.to_csv("data/route_days.csv", index=False)
print(daily.head(12))

log = sheets[["card", "day", "season_day", "driver", "truck", "truck_class", "route", "area", "kind", "job",
              "hours", "paid_hours", "rest_h", "hours_this_season", "km", "km_on_blade", "salt_per_km",
              "salt_avg3"]]
log = log.sort_values("card")
log.to_csv("data/shift_log.csv", index=False)
