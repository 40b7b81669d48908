"""Bell foundry casting log: yield of each pour, how far each bell came out of tune, and
each furnace's run of castings between relinings.

Pasted from the foundry manager's notebook. Pourers write the stamp two ways (ISO at the
north pit, day-first at the south one). 'n/a' and 'not weighed' mean the bell left for the
fettling shop before it was weighed. A casting with no furnace still counts in the month.
"""
import numpy as np
import pandas as pd

# In[1]:
castings = pd.read_csv("data/castings.csv", na_values=["not weighed"], dtype={"cast_no": str})
prices = pd.read_csv("data/alloy_prices.csv")
print(castings.shape)
print(castings.head())

# In[2]:
def clean(df):
    df["furnace"] = df["furnace"].str.strip().str.lower()
    df["moulder"] = df["moulder"].str.strip().str.capitalize()
    df["alloy"] = df["alloy"].str.strip().str.lower()
    df["cast_no"] = df["cast_no"].str.zfill(4)
    return df

castings = clean(castings)
castings = castings.drop_duplicates()
iso = pd.to_datetime(castings["cast_at"], format="%Y-%m-%d %H:%M", errors="coerce")
dayfirst = pd.to_datetime(castings["cast_at"], format="%d/%m/%Y %H:%M", errors="coerce")
castings["cast_at"] = iso.fillna(dayfirst)
print("unreadable stamps:", castings["cast_at"].isna().sum())
castings = castings.dropna(subset=["cast_at"])

# In[3]: the note: letter, sharp/flat, octave ('Eb4 (flat)', 'd 4', 'D#4')
parts = castings["note"].str.extract(r"^([A-Ga-g])\s?([#b]?)\s?(\d)")
castings["pitch"] = parts[0].str.upper() + parts[1]
castings["octave"] = parts[2].astype(float)
castings["flat_marked"] = castings["note"].str.contains("flat", case=False, na=False)
print(castings[["note", "pitch", "octave", "flat_marked"]].head(10))

# In[4]: yield and tuning
castings["yield_pct"] = (castings["bell_kg"] / castings["metal_kg"] * 100).round(1)
castings["yield_pct"] = castings["yield_pct"].clip(upper=100)
castings["abs_cents"] = castings["cents_off"].abs()

def tuning_grade(cents):
    if cents != cents:
        return "untested"
    elif abs(cents) <= 5:
        return "true"
    elif abs(cents) <= 15:
        return "tunable"
    else:
        return "recast"

castings["tuning"] = castings["cents_off"].apply(tuning_grade)
castings["defect_kind"] = np.select(
    [castings["defect"].str.contains("crack", case=False, na=False),
     castings["defect"].str.contains("poros|shrink", case=False, na=False),
     castings["defect"].notna()],
    ["crack", "gas", "other"],
    default="sound")
castings["scrap"] = np.where((castings["defect_kind"] == "crack") | (castings["tuning"] == "recast"),
                             True, False)
castings["hot_pour"] = castings["pour_temp_c"].map(lambda t: t > 1150)
castings.loc[castings["hot_pour"], "cool_hours"] += 12
castings["cool_days"] = (castings["cool_hours"] / 24).round(2)
castings["ready_at"] = castings["cast_at"] + pd.to_timedelta(castings["cool_hours"], unit="h")
castings["ready_day"] = castings["ready_at"].dt.normalize()

# In[5]: each furnace's run: gap between pours, running metal since the first pour, rank of the yield
castings = castings.sort_values(["furnace", "cast_at", "cast_no"]).reset_index(drop=True)
castings["pour_seq"] = castings.groupby("furnace").cumcount() + 1
castings["hours_since_pour"] = castings.groupby("furnace")["cast_at"].diff().dt.total_seconds() / 3600
castings["metal_to_date"] = castings.groupby("furnace")["metal_kg"].cumsum()
castings["yield_rank"] = castings.groupby("furnace")["yield_pct"].rank(method="min", ascending=False)
castings["temp_avg3"] = (castings.groupby("furnace")["pour_temp_c"]
                         .rolling(3, min_periods=1).mean()
                         .reset_index(level=0, drop=True)
                         .round(1))
castings["yield_vs_furnace"] = (castings["yield_pct"]
                                - castings.groupby("furnace")["yield_pct"].transform("mean")).round(2)
castings["relined"] = castings["hours_since_pour"] > 24 * 14
print(castings[["furnace", "cast_no", "pour_seq", "hours_since_pour", "metal_to_date", "temp_avg3"]].head(12))

log = castings[["cast_no", "cast_at", "furnace", "moulder", "pitch", "octave", "tuning", "defect_kind",
                "scrap", "yield_pct", "yield_rank", "yield_vs_furnace", "pour_seq", "hours_since_pour",
                "metal_to_date", "temp_avg3", "relined", "cool_days", "ready_day"]]
log.to_csv("data/casting_log.csv", index=False)

# In[6]: what the metal cost, month by month
prices = prices.drop_duplicates(subset="alloy", keep="last")
costed = castings.merge(prices, on="alloy", how="left")
costed["metal_eur"] = (costed["metal_kg"] * costed["eur_per_kg"]).round(2)
costed["scrap_eur"] = costed["metal_eur"].where(costed["scrap"], 0)
costed["month"] = costed["cast_at"].dt.to_period("M").astype(str)
monthly = costed.groupby("month").agg(castings=("cast_no", "count"),
                                      metal_kg=("metal_kg", "sum"),
                                      metal_eur=("metal_eur", "sum"),
                                      scrap_eur=("scrap_eur", "sum"),
                                      scrapped=("scrap", "sum")).reset_index()
monthly["scrap_share"] = (monthly["scrap_eur"] / monthly["metal_eur"]).round(3)
monthly["eur_per_bell"] = (monthly["metal_eur"] / (monthly["castings"] - monthly["scrapped"])).round(2)
monthly["metal_eur"] = monthly["metal_eur"].round(2)
monthly["scrap_eur"] = monthly["scrap_eur"].round(2)
monthly.to_csv("data/monthly_metal.csv", index=False)
print(monthly)

# In[7]: each moulder: bells in tune, and the last bell cast
moulders = costed.groupby("moulder", dropna=False).agg(bells=("cast_no", "count"),
                                                       true_bells=("tuning", lambda s: (s == "true").sum()),
                                                       mean_cents=("abs_cents", "mean"),
                                                       last_cast=("cast_at", "max")).reset_index()
moulders["mean_cents"] = moulders["mean_cents"].round(1)
moulders["days_since_last"] = (pd.Timestamp("2025-12-31") - moulders["last_cast"]).dt.days
moulders = moulders.sort_values(["true_bells", "moulder"], ascending=[False, True])
moulders.to_csv("data/moulders.csv", index=False)
print(moulders)
