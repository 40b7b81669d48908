"""Mountain railway gates: which train each gate scan boarded, how full the trains ran, the
scans per time of day and the share of tickets valid in each fare zone.

The gates know nothing of the timetable: a scan is matched to the next departure from the same
station within 45 minutes (a scan with no departure in that window is a walker who went down on
foot, or a gate at a halt with no printed departures).
"""
import pandas as pd

# %%
scans = pd.read_csv("data/gate_scans.csv", parse_dates=["scanned_at"])
timetable = pd.read_csv("data/timetable.csv", parse_dates=["departs"])
print(scans.shape, timetable.shape)

scans = scans.drop_duplicates()
scans["station"] = scans["station"].str.strip().replace({"Alp Grum": "Alp Grüm"})
scans["ticket_type"] = scans["ticket_type"].str.lower()
print(scans["ticket_type"].value_counts())


def minutes_between(later, earlier):
    return (later - earlier).dt.total_seconds() / 60


# %% stations on the wall map, with their height
heights = pd.DataFrame({
    "station": ["Talstation", "Mittelstation", "Alp Grüm", "Gipfel", "Kulm"],
    "altitude_m": [1040, 1610, 2091, 2453, 2600],
})
checked = scans.merge(heights, on="station", how="left", indicator=True, validate="m:1")
print(checked["_merge"].value_counts())
off_map = checked[checked["_merge"] == "left_only"]
print("gates not on the map:", sorted(off_map["station"].unique()))
checked = checked[checked["_merge"] == "both"].drop(columns="_merge")

# %% the train each scan boarded
timed = checked.dropna(subset=["scanned_at"]).sort_values("scanned_at")
timetable = timetable.sort_values("departs")
boarded = pd.merge_asof(
    timed, timetable,
    left_on="scanned_at", right_on="departs", by="station",
    direction="forward", tolerance=pd.Timedelta(minutes=45),
)
boarded["wait_min"] = minutes_between(boarded["departs"], boarded["scanned_at"])
print(boarded["train"].isna().sum(), "scans found no train")

boarded["band"] = pd.cut(
    boarded["scanned_at"].dt.hour,
    bins=[0, 9, 12, 15, 24],
    labels=["early", "morning", "midday", "afternoon"],
    right=False,
)
per_band = boarded.groupby("band", observed=True).agg(
    scans=("scan_id", "count"),
    heads=("heads", "sum"),
    mean_wait=("wait_min", "mean"),
    climb_m=("altitude_m", "mean"),
)
per_band = per_band.reset_index()
per_band["mean_wait"] = per_band["mean_wait"].round(1)
per_band["climb_m"] = per_band["climb_m"].round(0)
per_band.to_csv("data/per_band.csv", index=False)
print(per_band)

# %% how full each train ran
load = boarded.dropna(subset=["train"]).groupby(["train", "station", "seats"], as_index=False)["heads"].sum()
load["full"] = load["heads"] / load["seats"]
load = load.sort_values(["full", "train"], ascending=[False, True])
fullest = load.loc[load["heads"].idxmax()]
print("fullest train:", fullest["train"], "from", fullest["station"], int(fullest["heads"]), "heads")
emptiest = load.loc[load["heads"].idxmin()]
print("emptiest train:", emptiest["train"], emptiest["heads"])
load["full"] = load["full"].round(3)
load.to_csv("data/train_load.csv", index=False)

# %% fare zones: each ticket counted once per zone it is valid in
zones = checked[["scan_id", "ticket_type", "zones", "fare_chf"]].copy()
zones["zone"] = zones["zones"].str.split("|")
zones = zones.explode("zone")
zone_share = zones["zone"].value_counts(normalize=True).round(4)
zone_fares = zones.groupby("zone")["fare_chf"].mean().round(2)
zone_fee = pd.Series([2.5, 4.0, 6.5], index=["A", "B", "C"], name="fee_chf")
zone_table = pd.concat([zone_share, zone_fares, zone_fee], axis=1)
zone_table = zone_table.rename_axis("zone").reset_index()
zone_table["fee_share"] = (zone_table["fee_chf"] / zone_table["fare_chf"]).round(3)
zone_table = zone_table.sort_values("zone")
zone_table.to_csv("data/zone_share.csv", index=False)
print(zone_table)
