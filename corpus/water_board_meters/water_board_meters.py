"""Hill-village water board: quarterly bills from meter readings, low users and suspected leaks.

The meter office export is semicolon separated, starts with three comment
lines, and its last rows are provisional (only the first 150 readings count).
A reading lower than the previous one means the meter was replaced.
"""
import numpy as np
import pandas as pd

TARIFF_RATES = {"domestic": 1.10, "farm": 0.75, "holiday": 1.60}
STANDING_CHARGE = 8.0
col = "usage_m3"

df = pd.read_csv("data/readings.csv", sep=";", skiprows=3, nrows=150, na_values=["missing"])
print(df.shape)

df["village"] = df["village"].str.strip().str.upper()
df["tariff"] = df["tariff"].str.strip().str.lower()
df["usage_m3"] = (df["current_m3"] - df["previous_m3"]).abs().round(2)
df["usage_m3"] = df["usage_m3"].clip(lower=0, upper=120)
df["rate"] = df["tariff"].map(TARIFF_RATES)
df["bill"] = (df[col] * df["rate"] + STANDING_CHARGE).round(2)
df["band"] = np.where(df[col] > 40, "high", "normal")
print(df.iloc[2:10])

bills = df[["meter_id", "household", "village", "tariff", "usage_m3", "bill", "band"]]
bills.to_csv("bills.csv", index=False)

low = df[df[col].between(0, 5)]
print(len(low), "low users")

leaks = df.loc[(df[col] > 60) & (df["tariff"] != "farm"), ["meter_id", "household", "village", "usage_m3"]]
leaks = leaks.sort_values(by=["usage_m3", "meter_id"], ascending=[False, True])
leaks.to_csv("suspected_leaks.csv", index=False)
print(leaks.tail(3))

village = df.groupby("village", as_index=False).agg(
    meters=("meter_id", "count"),
    usage_m3=("usage_m3", "sum"),
    billed=("bill", "sum"),
    median_m3=("usage_m3", "median"),
)
village["billed"] = village["billed"].round(2)
village.to_csv("village_usage.csv", index=False)
