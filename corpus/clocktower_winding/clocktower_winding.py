"""Town clock-keeper's book: how far each tower clock drifts between windings, when the
weights ran down before the keeper came back, and what the repairs cost per month.

Pasted from the clerk's notebook. Drift is what the keeper read off against the radio
pips before setting the hands: '+12s' and 'fast 12' mean the same, 'stopped' that the
hands were found still (no drift can be read). Turns are crank turns to wind the going
train; the Corn Exchange is rewound by a motor and has no turns for a full wind.
"""
import numpy as np
import pandas as pd

# In[1]:
log = pd.read_csv("data/winding_log.csv", na_values=["stopped", "--"])
towers = pd.read_csv("data/towers.csv")
print(log.shape, towers.shape)
print(log.head())

# In[2]:
log["tower"] = (log["tower"].str.strip()
                .str.replace(r"^[Ss]t\.?\s+", "St ", regex=True)
                .str.title())
log["keeper"] = log["keeper"].str.strip().str.title()
log = log.drop_duplicates()
print(log["tower"].value_counts(dropna=False))

iso = pd.to_datetime(log["wound_at"], format="%Y-%m-%d %H:%M", errors="coerce")
uk = pd.to_datetime(log["wound_at"], format="%d/%m/%Y %H:%M", errors="coerce")
log["wound_at"] = iso.combine_first(uk)
print("no stamp:", log["wound_at"].isna().sum())
log = log[log["wound_at"].notna()]
log["day"] = log["wound_at"].dt.normalize()
log["month"] = log["wound_at"].dt.to_period("M").astype(str)
log["before_8"] = log["wound_at"] < log["day"] + pd.Timedelta(hours=8)

# In[3]: drift in seconds, fast positive
drift = log["drift"].str.strip().str.lower()
num = drift.str.extract(r"(\d+(?:\.\d+)?)")[0].astype(float)
slow = drift.str.startswith("slow") | drift.str.startswith("-")
log["drift_s"] = np.where(slow, -num, num)
log["drift_s"] = log["drift_s"].mask(log["drift_s"].abs() > 300)   # misread, minutes for seconds
log["stopped"] = log["drift"].isna() & log["tower"].notna()
print(log[["drift", "drift_s", "stopped"]].head(10))

# In[4]: the tower cards; the Market Hall card was copied after the overhaul
towers = towers.drop_duplicates(subset="tower", keep="last")
log = log.merge(towers, on="tower", how="left")
log["weight_kg"] = log["weight_kg"].fillna(log["std_weight_kg"])
log["turns"] = log["turns"].clip(lower=0)
log["wound_pct"] = (log["turns"] / log["turns_full"] * 100).round(1)
log["age"] = 2025 - log["built"]
log["era"] = log["built"].map(lambda y: "georgian" if y < 1837 else ("victorian" if y < 1901 else "modern"))

# In[5]: gaps between windings, per tower
log = log.sort_values(["tower", "wound_at", "entry"]).reset_index(drop=True)
log["keeper"] = log.groupby("tower")["keeper"].ffill()
log["gap"] = log.groupby("tower")["wound_at"].diff()
log["gap_h"] = (log["gap"].dt.total_seconds() / 3600).round(2)
log["gap_days"] = log["gap"].dt.days
log["drift_per_day"] = (log["drift_s"] / (log["gap_h"] / 24)).round(2)
log["run_out"] = log["wound_at"] - log["gap"] + pd.to_timedelta(log["run_days"], unit="D")
log["cum_drift"] = log.groupby("tower")["drift_s"].cumsum()
log["drift_avg4"] = (log.groupby("tower")["drift_s"]
                     .rolling(4, min_periods=2).mean()
                     .reset_index(level=0, drop=True)
                     .round(2))
log["worst_so_far"] = (log.groupby("tower")["drift_s"]
                       .expanding().max()
                       .reset_index(level=0, drop=True))


def state(row):
    if row["gap_h"] != row["gap_h"]:
        return "first"
    elif row["wound_at"] > row["run_out"]:
        return "ran down"
    elif row["stopped"]:
        return "stopped"
    elif abs(row["drift_s"]) > 20:
        return "adjust"
    else:
        return "ok"


log["state"] = log.apply(state, axis=1)
print(log["state"].value_counts())

# In[6]: the vestry wants the longest waits, and pages the clerk may have typed twice
LATE_HOURS = 24 * 9
worst = log.nlargest(8, "gap_days", keep="all")[["tower", "wound_at", "gap_days", "gap_h", "state"]]
print(worst)
late = log.query("state == 'ran down' and gap_h > @LATE_HOURS")
print(len(late), "windings more than", LATE_HOURS, "hours after the last")
twice = log[log.duplicated(subset=["tower", "day"], keep=False)]
print(twice[["entry", "tower", "wound_at", "keeper"]].sort_values(["tower", "wound_at"]).head(10))

# In[7]: repairs: new parts carry the carrier's charge, the clerk adds it by hand
log["repair"] = log["repair"].str.strip().str.lower()
KINDS = {"oiled pivots": "service", "cleaned dial": "service", "new rope": "parts", "new line": "parts",
         "new fly vane": "parts", "replaced pallet": "parts", "re-leaded weight": "parts"}
log["repair_kind"] = log["repair"].map(KINDS)
log["cost"] = log["cost"].fillna(0)
log.loc[log["repair_kind"] == "parts", "cost"] += 7.5
log.loc[log["temp_c"] < 0, "repair"] = log["repair"] + " (frost)"
log["cost"] = log["cost"].round(2)

book = log[["entry", "tower", "keeper", "wound_at", "month", "before_8", "drift_s", "gap_h",
            "gap_days", "drift_per_day", "cum_drift", "drift_avg4", "worst_so_far",
            "state", "wound_pct", "weight_kg", "era", "age"]]
book.to_csv("data/winding_book.csv", index=False)

month = log.groupby(["tower", "month"], as_index=False).agg(
    windings=("entry", "count"),
    mean_drift=("drift_s", "mean"),
    ran_down=("state", lambda s: (s == "ran down").sum()),
    repairs=("repair_kind", "count"),
    cost=("cost", "sum"),
)
month["mean_drift"] = month["mean_drift"].round(2)
month["cost_per_winding"] = (month["cost"] / month["windings"]).round(2)
month.to_csv("data/tower_month.csv", index=False)

repairs = log[log["repair_kind"].notna()]
repairs = repairs[["tower", "day", "keeper", "repair", "repair_kind", "cost", "temp_c"]]
repairs.to_csv("data/repairs.csv", index=False, date_format="%d/%m/%Y")
print(repairs.tail())
