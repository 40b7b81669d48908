"""Lifeboat station call-out log: how busy the station was, launch times against the
station's own average, and each coxswain's first shouts.

Written by the station's deputy launching authority, one cell at a time. 'n/a' means nobody
noted it. Launch, on-scene and back times are minutes after the pager went off.
"""
import numpy as np
import pandas as pd

TARGET_LAUNCH = 10   # minutes, the station's own target
ROUGH = 5

shouts = pd.read_csv("data/shouts.csv")
print(shouts.dtypes)

shouts = shouts.drop_duplicates()
shouts["boat"] = shouts["boat"].str.strip().str.lower()
shouts["coxswain"] = shouts["coxswain"].str.strip().str.capitalize()
shouts["coxswain"] = shouts["coxswain"].replace({"Maree": "Marée"})
# stamps with or without seconds: keep the minutes
shouts["paged_at"] = pd.to_datetime(shouts["paged_at"].str.slice(0, 16), format="%Y-%m-%d %H:%M",
                                    errors="coerce")
shouts = shouts.dropna(subset=["paged_at"])
shouts = shouts.sort_values(["paged_at", "shout_no"]).reset_index(drop=True)

# how busy: shouts in the 30 days up to each one, the gap since the last one
shouts["shouts_30d"] = shouts.rolling("30D", on="paged_at")["shout_no"].count()
shouts["hours_since_last"] = shouts["paged_at"].diff().dt.total_seconds() / 3600
shouts["hours_since_last"] = shouts["hours_since_last"].round(1)
shouts["most_aided_so_far"] = shouts["persons_aided"].expanding().max()
shouts["launch_trend"] = shouts["launch_min"].ewm(span=8).mean().round(2)
print(shouts[["shout_no", "paged_at", "shouts_30d", "hours_since_last", "launch_trend"]].head(8))

# on-scene before launch is a typing slip: blank it; a missing one is guessed from the launch
shouts["on_scene_min"] = shouts["on_scene_min"].where(shouts["on_scene_min"] >= shouts["launch_min"])
shouts["on_scene_min"] = shouts["on_scene_min"].combine_first(shouts["launch_min"] + 12)
shouts["false_alarm"] = shouts["cause"].str.contains("false", case=False, na=False)
shouts["persons_aided"] = shouts["persons_aided"].mask(shouts["false_alarm"], 0)
shouts["sea"] = pd.to_numeric(shouts["sea_state"], errors="coerce")
shouts["rough"] = np.where(shouts["sea"] >= ROUGH, "rough", "moderate")
shouts.loc[shouts["sea"].isna(), "rough"] = "unknown"
shouts["late"] = shouts["launch_min"] > TARGET_LAUNCH
shouts["aided_per_crew"] = shouts["persons_aided"] / shouts["crew"]
shouts.loc[shouts["rough"] == "rough", "launch_min"] -= 2   # allowance in heavy weather

# each boat against its own average
shouts["launch_vs_boat"] = shouts.groupby("boat")["launch_min"].transform(lambda s: s - s.mean()).round(2)
shouts["launch_pct"] = shouts.groupby("boat")["launch_min"].rank(pct=True)
shouts["prev_paged"] = shouts.groupby("boat")["paged_at"].shift()
shouts["turnaround_h"] = (shouts["paged_at"] - shouts["prev_paged"]).dt.total_seconds() / 3600
shouts["fuel_running_mean"] = (shouts.groupby("boat")["fuel_l"].expanding().mean()
                               .reset_index(level=0, drop=True).round(1))
shouts["boat_shout_no"] = shouts.groupby("boat").cumcount()

log = shouts[["shout_no", "paged_at", "boat", "coxswain", "shouts_30d", "hours_since_last",
              "most_aided_so_far", "launch_trend", "launch_min", "on_scene_min", "rough", "late", "aided_per_crew",
              "launch_vs_boat", "launch_pct", "turnaround_h", "fuel_running_mean", "boat_shout_no"]]
log.to_csv("data/shout_log.csv", index=False)

# first three shouts of each coxswain, and their last
firsts = shouts.groupby("coxswain").head(3)[["coxswain", "shout_no", "paged_at", "cause"]]
lasts = shouts.groupby("coxswain").tail(1)[["coxswain", "shout_no", "paged_at"]]
firsts = firsts.merge(lasts, on="coxswain", how="left", suffixes=("", "_last"))
firsts.to_csv("data/coxswain_firsts.csv", index=False)
print(firsts.head())

# monthly
shouts["month"] = shouts["paged_at"].dt.to_period("M").astype(str)
monthly = shouts.groupby("month").agg(shouts=("shout_no", "count"), aided=("persons_aided", "sum"),
                                      late=("late", "sum"), fuel=("fuel_l", "sum")).reset_index()
monthly["change"] = monthly["shouts"].pct_change().round(3)
monthly["fuel_per_aided"] = (monthly["fuel"] / monthly["aided"]).round(2)
monthly["late_share"] = monthly["late"] / monthly["shouts"]
monthly["late_share"] = monthly["late_share"].clip(upper=0.5).round(3)
monthly["busiest"] = monthly["shouts"].rank(method="min", ascending=False)
monthly.to_csv("data/monthly.csv", index=False)
print(monthly)
