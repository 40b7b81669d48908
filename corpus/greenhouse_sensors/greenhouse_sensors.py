"""Botanical greenhouse: daily climate averages per glasshouse, the gaps in the sensor log,
and the days a house ran too hot.

Sensors write 'err' when a probe fails; the arid house has no soil probe at
all, which the curators count as bone dry (0).
"""
import pandas as pd

SENSORS = ["temp_c", "humidity_pct", "soil_moisture", "co2_ppm"]
HOT_LIMIT = {"tropical": 30, "arid": 34, "fern gully": 24}

log = pd.read_csv("data/sensors.csv", na_values=["err"])
print(len(log))

log["house"] = log["house"].str.strip().str.lower()
log["reading_time"] = pd.to_datetime(log["reading_time"], format="%Y-%m-%d %H:%M")
log["day"] = log["reading_time"].dt.date

gaps = log[log["temp_c"].isnull() | log["humidity_pct"].isnull()]
gaps[["reading_time", "house", "temp_c", "humidity_pct"]].to_csv("sensor_gaps.csv", index=False)
print(len(gaps), "readings with a gap")

log.dropna(subset=SENSORS, how="all", inplace=True)
log.fillna({"soil_moisture": 0}, inplace=True)
log.dropna(thresh=6, inplace=True)
print(len(log), "usable readings")

daily = log.groupby(["house", "day"])[SENSORS].mean().reset_index()
daily = daily.round(2)
daily["hot_limit"] = daily["house"].map(HOT_LIMIT)
daily["too_hot"] = daily["temp_c"] > daily["hot_limit"]
daily.to_parquet("daily_climate.parquet", index=False)

hot = daily[daily["too_hot"]].drop("hot_limit", axis=1)
hot.to_csv("hot_days.csv", index=False)

co2_days = log[log["co2_ppm"].notna()].groupby("house")["day"].nunique().reset_index()
print(co2_days)
print(daily.describe())
