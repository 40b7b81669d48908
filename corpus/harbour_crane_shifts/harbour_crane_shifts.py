"""Harbour crane shifts: which sheets carried the most, each shift's best crane by tonnes per
lift, and the night sheets by their place in the foreman's pile.

The row numbers matter here: the foreman files corrections by the sheet's position in the typed
pile (the row of the original file), so the reports keep it.
"""
import pandas as pd

# %%
lifts = pd.read_csv("data/lifts.csv")
print(lifts.shape)

lifts = lifts.drop_duplicates(subset=["sheet"])
lifts["crane"] = lifts["crane"].str.strip().str.title()
lifts = lifts[lifts["crane"] != ""]
lifts = lifts.dropna(subset=["crane"])
lifts = lifts[lifts["lifts"] > 0]
lifts["shift"] = lifts["shift"].str.lower()
lifts["per_lift"] = (lifts["tonnes"] / lifts["lifts"]).round(3)

# %% the ten heaviest sheets, with their place in the pile
busiest = lifts.sort_values("tonnes", ascending=False, kind="stable")
top = busiest.head(10).reset_index()
top = top.rename(columns={"index": "pile_row"})
top[["pile_row", "sheet", "crane", "tonnes"]].to_csv("heaviest_sheets.csv", index=False)

# %% each shift's best sheet by tonnes per lift
best = lifts.loc[lifts.groupby("shift")["per_lift"].idxmax()]
best = best[["shift", "crane", "sheet", "per_lift"]].reset_index(drop=True)
best.to_csv("best_per_shift.csv", index=False)
print(best)

heaviest_row = lifts["tonnes"].idxmax()
print("heaviest sheet at pile row", heaviest_row, "by", lifts.loc[heaviest_row, "crane"])

# %% night sheets, numbered by the pile
night = lifts[lifts["shift"] == "night"].reset_index()
night = night.rename(columns={"index": "pile_row"})
night["stopped_min"] = night["stopped_min"].fillna(0)
night[["pile_row", "sheet", "crane", "lifts", "stopped_min"]].to_csv("night_sheets.csv", index=False)
print(len(night), night["pile_row"].max(), night["stopped_min"].sum())
