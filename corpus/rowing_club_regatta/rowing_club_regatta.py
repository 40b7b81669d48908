"""Lake rowing club: boathouse bookings by boat, crew and session, how hard each boat works for
its seats, and the summer regatta's results by event and heat.

'DNF' means the crew did not finish; a heat's places follow the times, dead heats share a place.
"""
import pandas as pd

SESSIONS = ["am", "pm", "eve"]


def norm(col):
    return col.str.strip().str.title()


# %% the boathouse book
book = pd.read_csv("data/bookings.csv", na_values=["N/A"], parse_dates=["day"])
print(len(book), "bookings written")
book = book.drop_duplicates(subset=["booking"])
book["boat"] = norm(book["boat"])
book["crew"] = norm(book["crew"])
book = book.dropna(subset=["boat"])

outings = book.groupby(["boat", "session"])["minutes"].sum()
boats = sorted(book["boat"].unique())
outings = outings.reindex(pd.MultiIndex.from_product([boats, SESSIONS], names=["boat", "session"]),
                          fill_value=0)
grid = outings.unstack("session")[SESSIONS]
grid["all"] = grid.sum(axis=1)
print(grid)

fleet = pd.read_csv("data/fleet.csv", index_col="boat")
print(fleet.loc["Mallard"])
print("Brèche seats", fleet.at["Brèche", "seats"])
use = fleet.join(grid, how="left")
use[SESSIONS + ["all"]] = use[SESSIONS + ["all"]].fillna(0)
use["seat_hours"] = use["all"] / 60 * use["seats"]
use = use.sort_values("seat_hours", ascending=False)
use = use.reset_index()
use.to_csv("data/boat_use.csv", index=False)

crews = book.pivot_table(index=["crew"], columns=["session"], values=["minutes", "booking"],
                         aggfunc={"minutes": "sum", "booking": "count"}, fill_value=0)
print(crews)
mins = crews["minutes"]
print("Masters A", mins.loc["Masters A"].sum(), "minutes")
mins = mins.reset_index().rename_axis(columns=None)
mins.to_csv("data/crew_minutes.csv", index=False)

# %% regatta
res = pd.read_csv("data/results.csv", na_values=["DNF"])
res = res.sort_values(["event", "heat", "seconds"])
res["place"] = res.groupby(["event", "heat"])["seconds"].rank(method="min")
res["finished"] = res["seconds"].notna()
heats = res.set_index(["event", "heat", "lane"]).sort_index()
print(heats.loc[("eight", 2)])
winners = heats[heats["place"] == 1]
print(winners.index.get_level_values("event").value_counts())
fastest = res.groupby(["event", "heat"])["seconds"].min().unstack("heat")
fastest.columns = [f"heat_{h}" for h in fastest.columns]
fastest = fastest.reset_index()
print(fastest)

clubs = res.groupby(["club", "event"]).agg(crews=("lane", "count"), wins=("place", lambda s: (s == 1).sum()))
clubs = clubs.droplevel("event").groupby(level="club").sum()
clubs["win_rate"] = (clubs["wins"] / clubs["crews"]).round(3)
clubs = clubs.reset_index()
table = res.merge(clubs[["club", "win_rate"]], on="club", how="left")
table = table[["event", "heat", "lane", "club", "crew", "seconds", "place", "win_rate"]]
table.to_csv("data/regatta_results.csv", index=False)
fastest.to_csv("data/fastest_heats.csv", index=False)
