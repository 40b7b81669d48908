"""River gauge network: daily levels per gauge, the highest reading of each gauge, flood
alerts against the bank height, and monthly flow per river."""
import os

import numpy as np
import pandas as pd

readings = pd.read_csv("data/readings.csv", na_values=["n/a"])
stations = pd.read_csv("data/stations.csv")

readings = readings.drop_duplicates()
readings["gauge"] = readings["gauge"].str.strip().str.upper()
readings["read_at"] = pd.to_datetime(readings["read_at"], format="%Y-%m-%d %H:%M", errors="coerce")
unread = readings["read_at"].isna().sum()
readings = readings.dropna(subset=["read_at"])
readings["observer"] = readings["observer"].str.title()

# the flow was not always written down: estimate it from the level where it is missing
estimate = readings["level_cm"] * 0.1
readings["flow_m3s"] = readings["flow_m3s"].combine_first(estimate.round(2))

# ---- daily mean level per gauge, every day from a gauge's first reading to its last
daily = (readings.set_index("read_at")
         .groupby("gauge")["level_cm"]
         .resample("D")
         .mean()
         .round(1)
         .reset_index())
daily = daily.rename(columns={"read_at": "day", "level_cm": "mean_level_cm"})

# ---- the highest reading of each gauge
readings = readings.reset_index(drop=True)
peaks = readings.loc[readings.groupby("gauge")["level_cm"].idxmax(), ["gauge", "read_at", "level_cm", "observer"]]

# ---- alerts against the bank height
checked = readings.merge(stations, on="gauge", how="left", validate="many_to_one", indicator=True)
unknown_gauges = checked.loc[checked["_merge"] == "left_only", "gauge"].unique().tolist()
checked = checked[checked["_merge"] == "both"].drop(columns="_merge")
checked["margin_cm"] = checked["bank_height_cm"] - checked["level_cm"]
checked["margin_cm"] = checked["margin_cm"].where(checked["margin_cm"] > 0, 0)
checked["alert"] = np.where(checked["margin_cm"] < 30, "high water", "normal")
checked["level_cm"] = checked["level_cm"].mask(checked["level_cm"] > 250)
checked["month"] = checked["read_at"].dt.to_period("M").astype(str)

alerts = checked[checked["alert"] == "high water"]
alerts_per_day = alerts.groupby(alerts["read_at"].dt.date)["reading_id"].count().rename_axis("day").reset_index()

monthly = checked.groupby(["month", "river"], as_index=False)["flow_m3s"].sum()
monthly["flow_m3s"] = monthly["flow_m3s"].round(2)
wide = monthly.pivot(index="month", columns="river", values="flow_m3s").reset_index()

os.makedirs("out", exist_ok=True)
daily.to_csv("out/gauge_daily_levels.csv", index=False)
peaks.to_csv("out/gauge_peaks.csv", index=False)
alerts_per_day.to_csv("out/gauge_alerts_per_day.csv", index=False)
wide.to_csv("out/river_monthly_flow.csv", index=False)
print(f"unreadable stamps: {unread}, gauges without a station: {unknown_gauges}")
print(peaks.to_string(index=False))
