"""Tide mill grinding book: how long each run ground for, flour per hour of ebb, and how
much each millstone ground between dressings.

Written by the mill's volunteer secretary from the grinding book. A run is written as
'start-stop' on the clock; a run that starts before midnight may stop after it. A head of
water below zero is the gauge reading low, not a real head. 'n/a' means not written down.
"""
import numpy as np
import pandas as pd

STONE_INCHES = {"french burr": 48, "peak": 54, "cullin": 42}
OPENING_DAY = pd.Timestamp("2025-02-01")

book = pd.read_csv("data/grinding_book.csv")
print(book.dtypes)
book = book.drop_duplicates()
book["stone"] = book["stone"].str.strip().str.lower()
book["miller"] = book["miller"].str.strip().str.capitalize()
book["miller"] = book["miller"].replace({"Herve": "Hervé"})

# the day: mostly ISO, a few written the continental way
day = pd.to_datetime(book["day"], format="%Y-%m-%d", errors="coerce")
book["day"] = day.fillna(pd.to_datetime(book["day"], format="%d.%m.%Y", errors="coerce"))

# the run: '5:00-09:00' or '14:00 - 19:00'; 'all tide' and blanks are not runs
span = book["span"].str.replace(" ", "", regex=False).str.split("-", expand=True)
span.columns = ["start", "stop"]
span["start"] = span["start"].str.zfill(5)
print(span.head())
book["start"] = book["day"] + pd.to_timedelta(span["start"] + ":00", errors="coerce")
book["stop"] = book["day"] + pd.to_timedelta(span["stop"] + ":00", errors="coerce")
overnight = book["stop"] < book["start"]
book.loc[overnight, "stop"] += pd.Timedelta(days=1)
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
