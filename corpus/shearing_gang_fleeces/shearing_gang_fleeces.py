"""Hill-farm shearing gang: the wool-classer's tally of fleeces off the board, the gang list,
what each shearer earned per shed and day, and how the clip graded.

A fleece graded blank was not classed; 'N/A' weight went to the bin unweighed.
"""
import pandas as pd

GRADE_ORDER = ["AA", "A", "B", "C"]


def tidy_name(col):
    return col.str.strip().str.title()


def per_head(frame, rate_col="rate"):
    # pay is per fleece shorn; the learner (rate 0) gets the day rate instead
    frame["pay"] = frame["fleeces"] * frame[rate_col]
    frame.loc[frame[rate_col] == 0, "pay"] = 95.0
    return frame


# %% the tally
tally = pd.read_csv("data/fleeces.csv", na_values=["N/A"], parse_dates=["day"])
print(tally.shape)
tally = tally.drop_duplicates(subset=["tally"])
tally["shearer"] = tidy_name(tally["shearer"])
tally["breed"] = tally["breed"].str.title()
tally["grade"] = tally["grade"].str.upper()
print(tally["shearer"].value_counts(dropna=False))

# weights of the clip in bands of the scale
bands = tally["fleece_kg"].value_counts(bins=[1.0, 1.5, 2.0, 2.5, 3.0, 4.0], sort=False)
print(bands)
tally["size"] = pd.qcut(tally["fleece_kg"], q=4, labels=["light", "fair", "good", "heavy"])

# %% kg by shearer and grade (classed fleeces only)
classed = tally[tally["grade"].isin(GRADE_ORDER)]
kg = pd.crosstab(classed["shearer"], classed["grade"], values=classed["fleece_kg"], aggfunc="sum")
kg = kg.fillna(0).round(2)
kg["clip"] = kg.sum(axis=1)
kg = kg.sort_values("clip", ascending=False)
print(kg)
top = kg.index[0]
print("best clip:", top, kg.at[top, "clip"])
kg.reset_index(names="shearer").to_csv("data/kg_by_grade.csv", index=False)

# %% shed x day: fleeces and kg
daily = tally.groupby(["shed", "day"]).agg(fleeces=("tally", "count"), kg=("fleece_kg", "sum"))
print(daily.head())
sheds = sorted(tally["shed"].unique())
days = pd.date_range(tally["day"].min(), tally["day"].max(), freq="D")
full = pd.MultiIndex.from_product([sheds, days], names=["shed", "day"])
daily = daily.reindex(full, fill_value=0)
by_day = daily.swaplevel().sort_index()
print(by_day.loc[pd.IndexSlice["2026-06-08":"2026-06-10", :], "fleeces"])
blaen = daily.loc[pd.IndexSlice["Blaen", :], :].droplevel("shed")
print("Blaen worked", int((blaen["fleeces"] > 0).sum()), "days")
wide = daily["fleeces"].unstack("shed", fill_value=0)
wide = wide[wide.sum(axis=1) > 0]
wide.index = wide.index.strftime("%d/%m")
wide = wide.rename_axis(index="day", columns=None).reset_index()
wide.to_csv("data/fleeces_per_day.csv", index=False)

# %% pay: per shearer and shed, joined to the gang list on the label
count = tally.groupby(["shearer", "shed"])["tally"].count()
pay = count.unstack(fill_value=0).stack()
pay = pay[pay > 0].rename("fleeces").reset_index()
gang = pd.read_csv("data/gang.csv", index_col="shearer")
print(gang.loc["Mared Lusk"])
print("north gang rate:", gang.at["Owain Fell", "rate"])
totals = pay.groupby("shearer")["fleeces"].sum().to_frame()
totals = totals.merge(gang, left_index=True, right_index=True, how="left")
totals = per_head(totals)
totals["gang"] = totals["gang"].fillna("relief")
totals = totals.sort_index()
totals["kg_each"] = (tally.groupby("shearer")["fleece_kg"].mean()).round(3)
totals.reset_index(names="shearer").to_csv("data/shearer_pay.csv", index=False)
print(totals)

# %% how each breed's fleeces weigh, and grades by flock and breed
summary = tally.groupby("breed")["fleece_kg"].describe()
summary = summary[["count", "mean", "min", "max"]].round(3)
print(summary)
grid = tally.pivot_table(index=["shed", "flock"], columns=["size"], values="fleece_kg",
                         aggfunc="count", fill_value=0, observed=False)
print(grid)
mix = tally.pivot_table(index=["shed", "breed"], values=["fleece_kg", "second_cuts"],
                        aggfunc={"fleece_kg": "mean", "second_cuts": "sum"})
mix = mix.round(3).reset_index()
mix = mix.merge(summary, left_on="breed", right_index=True, how="left")
mix.to_csv("data/breed_mix.csv", index=False)
