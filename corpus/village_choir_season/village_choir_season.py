"""Village choir: who came to rehearsals (by voice part and by evening), each member's record
against the members' list, and the box office returns for the season's three concerts.

A mark of Y counts as present, 'late' or L as late, N or a blank as absent.
"""
import pandas as pd

MARKS = {"Y": "present", "L": "late", "LATE": "late", "N": "absent"}


def clean_part(col):
    return col.str.strip().str.lower()


# %% the register
reg = pd.read_csv("data/register.csv", parse_dates=["evening"])
print(reg.shape, reg["evening"].nunique(), "evenings")
reg = reg.drop_duplicates(subset=["evening", "singer"])
reg["part"] = clean_part(reg["part"]).fillna("visitor")
reg["mark"] = reg["mark"].str.upper().map(MARKS).fillna("absent")
reg["came"] = reg["mark"] != "absent"

# %% how each part answers the register, as shares of its rows
share = pd.crosstab(reg["part"], reg["mark"], normalize="index").round(3)
share = share.rename_axis(index="voice", columns=None).reset_index()
share.to_csv("data/register_shares.csv", index=False)
print(share)

counts = pd.crosstab(reg["part"], reg["mark"], margins=True)
print(counts)
print("late in all:", counts.loc["All", "late"])

# %% singers present per evening and part
per_evening = reg.groupby(["evening", "part"])["came"].sum()
wide = per_evening.unstack(fill_value=0)
wide["choir"] = wide.sum(axis=1)
print(wide.head())
tenors = per_evening.xs("tenor", level="part")
print("tenors at most", tenors.max(), "on", tenors.idxmax())
thin = wide[wide["tenor"] < 2].index
print("thin tenor evenings:", list(thin.strftime("%d %b")))
wide = wide.reset_index()
wide["evening"] = wide["evening"].dt.strftime("%Y-%m-%d")
long = wide.melt(id_vars="evening", var_name="part", value_name="singers")
long = long[long["part"] != "choir"].sort_values(["evening", "part"])
long.to_csv("data/singers_per_evening.csv", index=False)

# %% each member's record against the list
members = pd.read_csv("data/singers.csv", index_col="singer")
members = members.sort_index()
print(members.loc["Joëlle Fane"])
print("Bryn joined", members.at["Bryn Hollis", "joined"])
came = reg.groupby("singer")["came"].agg(["sum", "count"])
came = came.rename(columns={"sum": "came", "count": "ticked"})
record = members.reset_index().merge(came.reset_index(), on="singer", how="left")
record["rate"] = (record["came"] / record["ticked"]).round(3)
record = record.set_index("singer")
record = record.sort_values(["part", "rate"], ascending=[True, False])
record.to_csv("data/member_record.csv")

# %% box office
tix = pd.read_csv("data/tickets.csv", na_values=["N/A"])
tix["band"] = tix["band"].str.strip().str.title()
tix["seller"] = tix["seller"].str.lower()
tix["takings"] = tix["price"] * tix["sold"]
office = tix.pivot_table(index=["concert", "band"], values=["sold", "takings"],
                         aggfunc={"sold": "sum", "takings": "sum"}, fill_value=0)
office = office.reset_index()
office["avg_price"] = office["takings"] / office["sold"]
office.to_csv("data/box_office.csv", index=False)
by_seller = tix.pivot_table(index="seller", columns="concert", values="sold", aggfunc="sum")
print(by_seller)
