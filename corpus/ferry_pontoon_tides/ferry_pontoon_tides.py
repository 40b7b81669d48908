"""River ferry pontoons: mooring fees owed per visit, the river level each boat came in on,
fees by level band and class, and the visits still unpaid numbered as in the warden's pile.
"""
import pandas as pd

# %% both pontoon sheets in one table, each visit with its bank
east = pd.read_csv("data/east_pontoon.csv", parse_dates=["arrived"])
west = pd.read_csv("data/west_pontoon.csv", parse_dates=["arrived"])
visits = pd.concat([east, west], keys=["east", "west"], names=["bank", "line"])
visits = visits.reset_index()
print(visits.shape)
print(visits.head())

visits = visits.drop_duplicates(subset=["visit"])
visits["boat"] = visits["boat"].str.strip().str.title()
visits["boat_class"] = visits["boat_class"].str.lower()

# %% the fee owed, from the class tariff on the harbour board
tariff = pd.DataFrame({
    "boat_class": ["dinghy", "cruiser", "narrowboat", "barge"],
    "per_hour": [0.75, 1.5, 2.25, 4.0],
    "minimum": [2, 4, 4, 10],
})
visits = visits.merge(tariff, on="boat_class", how="left", validate="m:1", indicator="tariff")
no_tariff = visits[visits["tariff"] == "left_only"]
print(len(no_tariff), "visits of a class not on the board")
visits["owed"] = (visits["hours"] * visits["per_hour"]).clip(lower=visits["minimum"])
visits["balance"] = (visits["paid"].fillna(0) - visits["owed"]).round(2)


def per_hour_paid(frame):
    return (frame["paid"] / frame["hours"]).round(2)


visits["paid_per_hour"] = per_hour_paid(visits)

# %% the river level nearest each arrival (the gauge reads every half hour)
levels = pd.read_csv("data/river_levels.csv", parse_dates=["read_at"])
levels = levels.dropna(subset=["level_m"]).sort_values("read_at")
arrivals = visits.dropna(subset=["arrived"]).sort_values("arrived")
arrivals = pd.merge_asof(arrivals, levels, left_on="arrived", right_on="read_at",
                         direction="nearest", tolerance=pd.Timedelta(minutes=45))
arrivals["stage"] = pd.cut(arrivals["level_m"], bins=[0, 2.3, 3.0, 10],
                           labels=["low water", "mid", "high water"])
print(arrivals["stage"].value_counts(normalize=True, dropna=False).round(3))

by_stage = arrivals.groupby(["stage", "bank"], observed=True).agg(
    visits=("visit", "count"),
    owed=("owed", "sum"),
    paid=("paid", "sum"),
)
by_stage = by_stage.reset_index().sort_values(["stage", "bank"], ascending=[False, True])
by_stage["owed"] = by_stage["owed"].round(2)
by_stage.to_csv("data/fees_by_stage.csv", index=False)
print(by_stage)

# %% the longest stay, and the biggest debt
longest = arrivals.loc[arrivals["hours"].idxmax(), "boat"]
print("longest stay:", longest)
debtor = visits.loc[visits["balance"].idxmin(), "visit"]
print("largest debt on visit", debtor)

# %% unpaid visits, numbered by their place in the combined pile
unpaid = visits[visits["paid"].isna()].reset_index()
unpaid = unpaid.rename(columns={"index": "pile_no"})
unpaid = unpaid[["pile_no", "bank", "line", "visit", "boat", "boat_class", "owed"]]
unpaid.to_csv("data/unpaid.csv", index=False)
print(unpaid.head(10))
