"""Community radio pledge week: volunteer hours on the rota, the pledges listeners phoned in,
each show's takings against its target, and who took the calls.

Hours 'N/A' means the sheet was not signed (the hours are not counted); a pledge with no sum
counts as a promise but adds nothing.
"""
import pandas as pd


def clean(col):
    return col.str.strip().str.title()


# %% the rota
rota = pd.read_csv("data/rota.csv", na_values=["N/A"], parse_dates=["day"])
rota = rota.drop_duplicates()
rota["volunteer"] = clean(rota["volunteer"])
rota = rota.dropna(subset=["volunteer"])
print(rota.head())

hours = rota.pivot_table(index=["volunteer"], columns=["role"], values="hours",
                         aggfunc="sum", fill_value=0, margins=True, margins_name="total")
print(hours)
busiest = hours.drop(index="total")["total"].idxmax()
print("busiest:", busiest, hours.loc[busiest, "total"])
hours = hours.reset_index().rename_axis(columns=None)
hours.to_csv("data/volunteer_hours.csv", index=False)

# slots per show and day of the week, a day with no slot for a show is a 0
rota["weekday"] = rota["day"].dt.day_name()
per = rota.groupby(["show", "weekday"]).size()
per = per.unstack(fill_value=0)
per = per.stack().rename("slots")
print(per.xs("Drive", level="show"))
quiet = per[per == 0].index.get_level_values("show").unique()
print("shows with an empty weekday:", sorted(quiet))

# %% pledges
pledges = pd.read_csv("data/pledges.csv", na_values=["N/A"], parse_dates=["day"])
pledges["method"] = pledges["method"].str.lower()
pledges["show"] = pledges["show"].fillna("unknown")
pledges["taken_by"] = pledges["taken_by"].fillna("by post")
print(pledges["amount"].describe())

ways = pd.crosstab(pledges["show"], pledges["method"], normalize="index").round(3)
print(ways)
sums = pd.crosstab(pledges["show"], pledges["method"], values=pledges["amount"], aggfunc="sum",
                   margins=True)
print(sums)
print("card total:", sums.loc["All", "card"])

by_show = pledges.groupby("show").agg(pledges=("pledge", "count"), raised=("amount", "sum"),
                                      biggest=("amount", "max"))
schedule = pd.read_csv("data/schedule.csv", index_col="show")
schedule = schedule.sort_index()
print(schedule.loc["Breakfast"])
board = schedule.merge(by_show, left_index=True, right_index=True, how="outer")
board["raised"] = board["raised"].fillna(0)
board["of_target"] = (board["raised"] / board["target"]).round(3)
board["per_hour"] = board["raised"] / board["slot_hours"]
board = board.rename_axis("show").reset_index()
board.to_csv("data/show_board.csv", index=False)
print(board)

# %% who took the calls, day by day, in long form
taken = pledges.pivot_table(index="taken_by", columns="day", values="amount",
                            aggfunc="count", fill_value=0)
taken.columns = taken.columns.strftime("%a %d")
taken = taken.reset_index()
long = taken.melt(id_vars="taken_by", var_name="day", value_name="calls")
long = long[long["calls"] > 0].sort_values(["taken_by", "day"])
long = long.set_index("taken_by")
print(long.loc["Émile Sand"])
long = long.reset_index()
long.to_csv("data/calls_taken.csv", index=False)
