"""Canal boat hire yard: engine hours between hires, damage bills, and each boat's month.

Pasted from the yard office notebook. The booking book is typed up weekly; 'n/a' means the
meter was not read or the field was skipped. A hire with no boat name still counts towards
the takings but not towards any boat's hours.
"""
import numpy as np
import pandas as pd

# In[1]:
hires = pd.read_csv("data/hires.csv")
boats = pd.read_csv("data/boats.csv")
print(hires.shape)
print(hires.head())

# In[2]:
def tidy(df):
    df["boat"] = df["boat"].str.strip().str.title()
    df["boat"] = df["boat"].replace({"Ebène": "Ébène"})
    df["base"] = df["base"].str.strip().str.lower()
    df["damage"] = df["damage"].str.strip().str.lower()
    return df

hires = tidy(hires)
hires = hires.drop_duplicates()
hires["out_date"] = pd.to_datetime(hires["out_date"], format="%Y-%m-%d", errors="coerce")
print("hires with no date:", hires["out_date"].isna().sum())

# In[3]: meter readings: carry the last reading forward within a boat, hours used per hire
hires = hires.sort_values(["boat", "out_date", "hire_no"]).reset_index(drop=True)
hires["meter"] = hires.groupby("boat")["meter_hours"].ffill()
hires["engine_hours"] = hires.groupby("boat")["meter"].diff()
hires["hire_seq"] = hires.groupby("boat").cumcount() + 1
hires["hours_to_date"] = hires.groupby("boat")["engine_hours"].cumsum()
hires["fuel_litres"] = hires["fuel_litres"].clip(lower=0, upper=110)
hires["fuel_avg3"] = (hires.groupby("boat")["fuel_litres"]
                      .rolling(3, min_periods=1).mean()
                      .reset_index(level=0, drop=True))
hires["fuel_avg3"] = hires["fuel_avg3"].round(2)
print(hires[["boat", "out_date", "meter", "engine_hours", "hire_seq", "fuel_avg3"]].head(12))

# In[4]: charges
hires["list_price"] = hires["nights"] * 150 + 95
hires["charge"] = hires["price"].fillna(hires["list_price"])
long_hire = hires["nights"].between(7, 14)
hires.loc[long_hire, "charge"] *= 0.9
hires.loc[hires["crew"] > 6, "charge"] += 40
hires["damage_kind"] = np.select(
    [hires["damage"].str.contains("hull", na=False),
     hires["damage"].isin(["scratch", "window"]),
     hires["damage"].notna()],
    ["hull", "cosmetic", "other"],
    default="none")
hires["damage_fee"] = np.where(hires["damage_kind"] == "hull", 250,
                               np.where(hires["damage_kind"] == "none", 0, 60))
hires["kept_deposit"] = hires[["damage_fee", "deposit"]].min(axis=1)
hires.loc[hires["deposit"].isna(), ["kept_deposit", "damage_fee"]] = 0
hires["charge"] = hires["charge"].round(2)

damage = hires[hires["damage_kind"] != "none"]
damage = damage[["hire_no", "boat", "out_date", "damage", "damage_kind", "damage_fee", "kept_deposit"]]
damage.to_csv("data/damage_bill.csv", index=False)

# In[5]: each boat's month, ranked
hires["month"] = hires["out_date"].dt.month
hires["month_take"] = hires.groupby(["boat", "month"])["charge"].transform("sum")
hires["share_of_month"] = hires["charge"] / hires.groupby("month")["charge"].transform("sum")
hires["share_of_month"] = hires["share_of_month"].round(4)
month = hires.dropna(subset=["boat", "month"]).drop_duplicates(["boat", "month"])
month = month[["boat", "month", "month_take"]].copy()
month["rank"] = month.groupby("month")["month_take"].rank(method="dense", ascending=False)
month = month.sort_values(["month", "rank", "boat"])
month.to_csv("data/boat_month.csv", index=False)
print(month.head(10))

# In[6]: service due: hours since the last service interval
boats = boats.drop_duplicates(subset="boat", keep="last")
log = hires.merge(boats, on="boat", how="left")
log["service_every"] = log["service_every"].fillna(10_000)
log["since_service"] = log["hours_to_date"] % log["service_every"]
log["due"] = log["since_service"] > log["service_every"] * 0.8
log["hours_per_night"] = log["engine_hours"] / log["nights"]
log = log[["hire_no", "boat", "class", "hire_seq", "out_date", "engine_hours", "hours_to_date",
           "since_service", "due", "hours_per_night", "charge", "share_of_month", "fuel_avg3"]]
log.to_csv("data/boat_log.csv", index=False)
last = log.groupby("boat").tail(1)
print(last[last["due"]])
