"""Canal-side boatyard: yard hours by hull and repair, what each registered boat cost per foot,
and how busy the slipway was day by day through the spring haul-out season.

The register is read with the boat name as its row label (that is how the office looks boats up);
the slipway diary is laid over every day of the season, quiet days included.
"""
import pandas as pd


def tidy(names):
    # the cards spell a boat any old way
    return names.str.strip().str.title()


# %% the register, looked up by name
boats = pd.read_csv("data/boats.csv", index_col="boat")
print(boats.index)
boats = boats.sort_index()
print(boats.head())
print("Kingfisher is", boats.at["Kingfisher", "length_ft"], "ft")
kf = boats.loc["Kingfisher"]
print(kf["kind"], kf["mooring"])

# %% job cards
jobs = pd.read_csv("data/repairs.csv", na_values=["N/A"])
print(jobs.shape)
jobs = jobs.drop_duplicates()
jobs["boat"] = tidy(jobs["boat"])
jobs = jobs.dropna(subset=["boat"])
jobs["hull"] = jobs["hull"].str.strip().str.lower()
jobs["hull"] = jobs["hull"].fillna("unknown")
jobs["hours"] = jobs["hours"].fillna(0)
jobs["parts_gbp"] = jobs["parts_gbp"].fillna(0)
jobs["labour_gbp"] = jobs["hours"] * 38.5
jobs["bill"] = jobs["labour_gbp"] + jobs["parts_gbp"]

# %% hours by hull and repair: one row per hull, one column per repair
hrs = jobs.groupby(["hull", "repair"])["hours"].sum()
print(hrs.head(8))
grid = hrs.unstack(fill_value=0)
grid["all_repairs"] = grid.sum(axis=1)
grid = grid.sort_values("all_repairs", ascending=False)
grid = grid.reset_index()
grid.to_csv("data/hours_by_hull.csv", index=False)
print(grid)

# %% each registered boat's bill, per foot of hull
per_boat = jobs.groupby("boat").agg(jobs=("job", "count"), hours=("hours", "sum"), bill=("bill", "sum"))
per_boat = per_boat.reset_index().merge(boats.reset_index(), on="boat", how="inner")
per_boat["per_ft"] = (per_boat["bill"] / per_boat["length_ft"]).round(2)
per_boat = per_boat.set_index("boat").sort_index()
per_boat = per_boat[["kind", "jobs", "hours", "bill", "per_ft"]]
per_boat.to_csv("data/bill_per_boat.csv")
print(per_boat.loc["Otter"])

# %% the slipway through the season
slip = pd.read_csv("data/slipway.csv", parse_dates=["haul_out"])
slip["slip"] = slip["slip"].str.strip().str.title()
slip = slip[slip["slip"] != "Dock"]
slip["month"] = slip["haul_out"].dt.month

fees = slip.pivot_table(index="slip", columns="month", values="fee_gbp", aggfunc="sum", fill_value=0, margins=True)
print(fees)
fees = fees.rename_axis(columns=None).reset_index()
fees.to_csv("data/slip_fees.csv", index=False)

daily = slip.groupby("haul_out")["booking"].count()
season = pd.date_range("2026-03-01", "2026-04-30", freq="D")
daily = daily.reindex(season, fill_value=0)
daily = daily.rename_axis("day").reset_index(name="hauled")
daily["weekday"] = daily["day"].dt.day_name()
quiet = daily[daily["hauled"] == 0]
print(len(quiet), "quiet days")
per_weekday = daily.groupby("weekday")["hauled"].mean().round(3).reset_index()
per_weekday.to_csv("data/slipway_by_weekday.csv", index=False)
