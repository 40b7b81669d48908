"""Glassblowing studio furnace log: cold spells per furnace, what each gaffer made and earned,
and gas burnt per piece.

The thermocouples are read every forty minutes. A single reading jumps about (the door was
open, a gather was being taken), so the studio smooths each furnace's readings with an
exponentially weighted mean before calling a spell cold. 'off' and '?' mean the reading
was not taken; a few stamps were typed day-first and are dropped.
"""
import pandas as pd

COLD = {"main pot": 1100, "glory hole": 1150, "annealer": 460}
SPAN = 4


def clean_text(s):
    return s.str.strip().str.lower()


log = pd.read_csv("data/furnace_log.csv", na_values=["off", "?"])
gaffers = pd.read_csv("data/gaffers.csv")
ids = log["reading_id"].nunique()
print(f"{len(log)} readings, {ids} distinct ids")

dupes = len(log) - log["reading_id"].nunique()
print("readings sent twice by the logger:", dupes)
log["furnace"] = clean_text(log["furnace"])
log["gaffer"] = log["gaffer"].str.strip().str.title()
log["read_at"] = pd.to_datetime(log["read_at"], format="%Y-%m-%d %H:%M", errors="coerce")
bad = log["read_at"].isna().sum()
print("stamps that would not parse:", bad)
log = log.dropna(subset=["read_at"])

# smooth each furnace on its own, in time order
log = log.sort_values(["furnace", "read_at", "reading_id"]).reset_index(drop=True)
log["temp_smooth"] = log.groupby("furnace")["temp_c"].transform(lambda s: s.ewm(span=SPAN, ignore_na=True).mean())
log["temp_smooth"] = log["temp_smooth"].round(1)
log["cold"] = log["temp_smooth"] < log["furnace"].map(COLD)
print(log.groupby("furnace")["cold"].sum())

# --- cold readings, for the maintenance book
cold = log.loc[log["cold"], ["reading_id", "furnace", "read_at", "temp_c", "temp_smooth"]]
cold = cold.sort_values(["furnace", "read_at"])
cold.to_csv("cold_readings.csv", index=False)

# --- per gaffer and day: pieces, pay, gas per piece
log["day"] = log["read_at"].dt.date
made = log[log["gaffer"].notna()].copy()
made["pieces"] = made["pieces"].fillna(0).astype(int)
per_day = made.groupby(["gaffer", "day"], as_index=False).agg(
    pieces=("pieces", "sum"), gas=("gas_m3", "sum"), readings=("reading_id", "count"),
    coldest=("temp_smooth", "min"))
rates = gaffers.drop_duplicates(subset="gaffer", keep="last")
per_day = per_day.merge(rates, on="gaffer", how="left")
per_day["pay"] = per_day["pieces"] * per_day["rate_per_piece"]
per_day["gas_per_piece"] = per_day["gas"] / per_day["pieces"]
per_day["gas"] = per_day["gas"].round(2)
per_day["gas_per_piece"] = per_day["gas_per_piece"].round(3)
per_day.to_csv("gaffer_days.csv", index=False)

totals = per_day.groupby("gaffer").agg(pieces=("pieces", "sum"), pay=("pay", "sum")).reset_index()
totals = totals.sort_values(["pay", "gaffer"], ascending=[False, True])
print(totals)
