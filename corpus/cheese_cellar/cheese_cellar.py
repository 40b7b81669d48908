"""Dairy co-op cheese cellar: weight lost by each wheel while ageing, which wheels are
ready for sale, and how evenly each cave dries its cheeses.

Wheels that gained weight are scale errors and count as zero loss; a missing
current weight means the wheel has not been weighed this month.
"""
import pandas as pd

wheels = pd.read_csv("data/wheels.csv", parse_dates=["made_on"])
wheels = wheels.dropna(subset=["now_kg"]).reset_index(drop=True)
print(len(wheels))


def sale_status(row):
    # the affineurs' rule of thumb, kept exactly as they wrote it down
    if row["loss_pct"] >= 8 and row["rind_score"] >= 4:
        return "ready"
    if row["loss_pct"] >= 8:
        return "check rind"
    return "keep ageing"


wheels["turns"] = wheels["turns"].fillna(0).astype(int)
wheels["loss_pct"] = ((wheels["start_kg"] - wheels["now_kg"]) / wheels["start_kg"] * 100).round(2)
wheels["loss_pct"] = wheels["loss_pct"].clip(lower=0)
wheels["made_month"] = wheels["made_on"].dt.month
wheels["status"] = wheels.apply(sale_status, axis=1)
wheels["recipe"] = wheels["recipe"].astype("category")

status = wheels[["wheel_id", "recipe", "cellar", "made_month", "turns", "loss_pct", "status"]]
status.to_csv("wheel_status.csv", index=False)
print(status.tail())

spread = wheels.groupby("cellar")["loss_pct"].std().reset_index()
lowest = wheels.groupby("cellar")["loss_pct"].min().reset_index()
highest = wheels.groupby("cellar")["loss_pct"].max().reset_index()
caves = (
    spread.merge(lowest, on="cellar", suffixes=("_std", "_min"))
    .merge(highest.rename(columns={"loss_pct": "loss_pct_max"}), on="cellar")
    .round(2)
)
caves.to_csv("cave_spread.csv", index=False)

by_recipe = wheels.groupby("recipe", as_index=False).agg(wheels=("wheel_id", "count"), mean_loss=("loss_pct", "mean"))
by_recipe["mean_loss"] = by_recipe["mean_loss"].round(2)
by_recipe.to_csv("recipe_loss.csv", index=False)
print(wheels["status"].value_counts())
