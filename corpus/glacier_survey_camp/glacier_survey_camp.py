"""Glacier survey camp: ablation stakes, melt per stake and per zone, and readings that look misread.

Each stake is read every day or two: the centimetres of stake standing out of the ice grow as
the ice melts. 'buried' means snow hid the stake; 'trace' of snow counts as none. A reading is
suspicious when it jumps away from the median of the last three readings.
"""
import numpy as np
import pandas as pd

JUMP_CM = 20.0


def jump_from_median(window):
    # distance of the newest reading from the median of the window
    return abs(window[-1] - np.nanmedian(window))


def load_readings(path):
    readings = pd.read_csv(path, na_values=["buried", "trace"])
    readings["read_on"] = pd.to_datetime(readings["read_on"], format="%Y-%m-%d")
    readings["stake"] = readings["stake"].str.upper()
    readings["observer"] = readings.observer.str.title()
    readings.fillna({"snow_cm": 0}, inplace=True)
    readings = readings.drop_duplicates()
    return readings


def load_stakes(path):
    stakes = pd.read_csv(path, parse_dates=["installed"])
    stakes["zone"] = stakes["zone"].str.strip().str.lower()
    return stakes


def main():
    readings = load_readings("data/stake_readings.csv")
    stakes = load_stakes("data/stakes.csv")
    readings = readings.sort_values(["stake", "read_on"]).reset_index(drop=True)

    # rolling over the whole sorted book -- the first rows of a stake still see the last of the previous one
    readings["jump"] = readings["exposed_cm"].rolling(3, min_periods=2).apply(jump_from_median, raw=True)
    readings["suspicious"] = readings["jump"] > JUMP_CM

    suspicious = readings[readings["suspicious"]].copy()
    suspicious["jump"] = suspicious["jump"].round(1)
    suspicious = suspicious[["reading_id", "stake", "read_on", "exposed_cm", "jump", "observer", "note"]]
    suspicious.to_csv("suspicious_readings.csv", index=False)

    good = readings[~readings["suspicious"] & readings["exposed_cm"].notna()]
    per_stake = good.groupby("stake").agg(
        first_day=("read_on", "min"),
        last_day=("read_on", "max"),
        low_cm=("exposed_cm", "min"),
        high_cm=("exposed_cm", "max"),
        readings=("reading_id", "count"),
        snow_cm=("snow_cm", "mean"),
    ).reset_index()
    per_stake["days"] = (per_stake["last_day"] - per_stake["first_day"]) / pd.Timedelta(days=1)
    per_stake["cm_per_day"] = (per_stake["high_cm"] - per_stake["low_cm"]) / per_stake["days"]
    per_stake = per_stake.merge(stakes, on="stake", how="inner")
    per_stake["cm_per_day"] = per_stake["cm_per_day"].round(2)
    per_stake["snow_cm"] = per_stake["snow_cm"].round(2)
    per_stake = per_stake.sort_values(["zone", "elevation_m"])
    per_stake.to_csv("stake_melt.csv", index=False)

    per_zone = per_stake.groupby("zone", as_index=False)
    per_zone = per_zone.agg(stakes=("stake", "nunique"), cm_per_day=("cm_per_day", "mean"), top_m=("elevation_m", "max"))
    per_zone = per_zone.sort_values("cm_per_day", ascending=False)
    per_zone.to_parquet("zone_melt.parquet")
    print(per_zone)
    print(len(suspicious), "suspicious readings;", readings["exposed_cm"].isna().sum(), "missing")


main()
