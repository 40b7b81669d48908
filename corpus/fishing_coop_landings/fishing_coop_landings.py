"""Fishing cooperative: landed catch against quota for each boat and species, and a season total per boat.

Species names are spelled every which way at the quay; an ice-box count of -1
means "not counted". A quota of 0 is a suspended licence, so the share used
is left as the raw division (inf or NaN) for the office to spot.
"""
import pandas as pd

SPELLINGS = {"anchovie": "anchovy", "sardines": "sardine"}


def clean_landings(landings):
    landings["species"] = landings["species"].str.strip().str.lower()
    landings["species"] = landings["species"].replace(SPELLINGS)
    landings["ice_boxes"] = landings["ice_boxes"].replace(-1, 0)
    landings["value_eur"] = (landings["catch_kg"] * landings["price_per_kg"]).round(2)
    return landings


def quota_status(landings, quota):
    landed = landings.groupby(["boat", "species"], as_index=False).agg(
        landed_kg=("catch_kg", "sum"), port=("port", "last")
    )
    status = landed.merge(quota, on=["boat", "species"], how="outer", suffixes=("_landed", "_home"))
    status = status.fillna({"landed_kg": 0, "quota_kg": 0})
    status["used_share"] = (status["landed_kg"] / status["quota_kg"]).round(2)
    status["over_quota"] = status["landed_kg"] > status["quota_kg"]
    status["away_port"] = status["port_landed"] != status["port_home"]
    return status


def boat_totals(landings):
    totals = landings.groupby("boat").agg(
        trips=("landing_id", "nunique"),
        catch_kg=("catch_kg", "sum"),
        value_eur=("value_eur", "sum"),
        ice_boxes=("ice_boxes", "sum"),
        best_price=("price_per_kg", "max"),
    )
    return totals.reset_index().round(2)


landings = clean_landings(pd.read_csv("data/landings.csv"))
quota = pd.read_csv("data/quota.csv")
print(landings["species"].unique())

status = quota_status(landings, quota)
status.to_csv("quota_status.csv", index=False)
print(status[status["over_quota"]])

totals = boat_totals(landings)
totals.to_csv("boat_totals.csv", index=False)
print(totals["catch_kg"].sum())
