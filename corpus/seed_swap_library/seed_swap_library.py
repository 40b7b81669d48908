"""Seed swap library: packets given and taken per variety and branch, the busiest varieties at
each branch, and how well the swapped seed came up in members' germination reports.

A swap is one member giving packets of one variety and taking the same number of another.
"""
import pandas as pd


def clean(names):
    return names.str.strip().str.title()


# %% the exchange book
ex = pd.read_csv("data/exchanges.csv", na_values=["N/A"], parse_dates=["day"])
ex = ex.drop_duplicates(subset=["swap_id"], keep="last")
print(len(ex), "swaps")
moves = ex.melt(id_vars=["swap_id", "branch", "member", "packets"], value_vars=["given", "taken"],
                var_name="way", value_name="variety")
moves = moves.dropna(subset=["variety"])
moves["variety"] = clean(moves["variety"])
print(moves.head())

# the melted book pivoted back: one row per swap again, the names now cleaned
book = moves.pivot(index="swap_id", columns="way", values="variety")
print(book.columns.name, book.index.name)
book = book.reset_index().rename_axis(columns=None)
book = book.merge(ex[["swap_id", "branch", "packets"]], on="swap_id", how="left")
book.to_csv("data/swap_book.csv", index=False)

flow = moves.groupby(["variety", "way"])["packets"].sum().unstack("way", fill_value=0)
flow["net"] = flow["given"] - flow["taken"]
flow = flow.sort_values("net", ascending=False)
print(flow)
long_flow = flow[["given", "taken"]].stack()
long_flow = long_flow.rename("packets").reset_index()
print(long_flow.head())

per_branch = moves.groupby(["branch", "variety"])["packets"].sum()
print(per_branch.groupby(level=0).sum())
top = per_branch.groupby(level="branch", group_keys=False).nlargest(2)
top = top.sort_index(level=["branch", "variety"], ascending=[True, False])
print(top)
top = top.reset_index()
top.to_csv("data/branch_favourites.csv", index=False)

# %% germination reports
rep = pd.read_csv("data/reports.csv", na_values=["N/A", "-"])
rep["variety"] = clean(rep["variety"])
rep["rate"] = rep["sprouted"] / rep["sown"]
kinds = pd.read_csv("data/varieties.csv")
kinds["variety"] = clean(kinds["variety"])
listed = kinds.set_index("variety")
print(listed.loc["Red Kuri"])
print("Borlotto saved since", listed.at["Borlotto", "year"])

rep = rep.merge(kinds, on="variety", how="outer", suffixes=("_report", "_list"), indicator=True)
print(rep["_merge"].value_counts())
rep = rep[rep["_merge"] != "right_only"]
rep["grade"] = pd.qcut(rep["rate"], q=3, labels=["poor", "fair", "good"])
fam = pd.crosstab(rep["family"], rep["grade"], normalize="columns").round(3)
print(fam)

taken = flow["taken"]
germ = rep.groupby("variety").agg(reports=("report_id", "count"), rate=("rate", "mean"))
germ = germ.join(taken, how="outer")
germ["taken"] = germ["taken"].fillna(0)
germ = germ.rename_axis("variety").reset_index()
germ["rate"] = germ["rate"].round(3)
germ.to_csv("data/germination.csv", index=False)

member_fam = rep.groupby(["member", "family"])["rate"].mean().unstack("family")
print(member_fam.head())
back = member_fam.stack().rename("rate")
best = back.groupby(level="family").idxmax()
print(best)
