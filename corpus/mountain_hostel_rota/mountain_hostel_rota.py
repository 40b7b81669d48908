"""Mountain hostel network: bed-nights per hostel over the July season, how full each hostel
ran for its beds, and who cleaned what on the rota.

A stay is one party's night in a hostel; 'N/A' guests were not counted by the warden.
"""
import pandas as pd


def tidy(col):
    return col.str.strip()


def share(part, whole):
    return (part / whole).round(3)


# %% bed-nights
stays = pd.read_csv("data/stays.csv", na_values=["N/A"], parse_dates=["night"])
print(len(stays), "stays on the sheet")
stays = stays.drop_duplicates(subset=["stay_id"])
stays["hostel"] = tidy(stays["hostel"])
stays = stays.dropna(subset=["hostel"])

nightly = stays.groupby(["night", "hostel"])["guests"].sum()
grid = nightly.unstack("hostel", fill_value=0)
season = pd.date_range("2026-07-01", "2026-07-31", freq="D")
grid = grid.reindex(season, fill_value=0)
grid = grid.rename_axis("night")
print(grid.index.name, len(grid), "nights")
print(grid.head())

# long and back again: the warden's sheet wants one row per night, one column per hostel
long = grid.reset_index().melt(id_vars="night", var_name="hostel", value_name="bed_nights")
long = long[long["bed_nights"] > 0]
back = long.pivot(index="night", columns="hostel", values="bed_nights")
back = back.fillna(0)
print(back.shape)
back.index = back.index.strftime("%d %b")
back = back.rename_axis(index="night", columns=None).reset_index()
back.to_csv("data/nightly_sheet.csv", index=False)

totals = grid.sum()
peak = grid.max()
busy = (grid > 0).sum()
summary = pd.concat([totals.rename("bed_nights"), peak.rename("peak"), busy.rename("open_nights")], axis=1)
hostels = pd.read_csv("data/hostels.csv", index_col="hostel")
print(hostels.loc["Refuge Écrins"])
print("Grauhorn beds", hostels.at["Grauhorn", "beds"])
summary = hostels.join(summary, how="left")
summary["bed_nights"] = summary["bed_nights"].fillna(0)
summary["occupancy"] = share(summary["bed_nights"], summary["beds"] * 31)
summary["band"] = pd.cut(summary["occupancy"], bins=[0, 0.15, 0.3, 1, float("inf")],
                         labels=["quiet", "steady", "busy", "overfull"])
summary = summary.sort_index()
print(summary)
summary.to_csv("data/hostel_summary.csv")

# %% cleaning rota
rota = pd.read_csv("data/rota.csv", parse_dates=["day"])
rota["task"] = rota["tasks"].str.split(";")
rota = rota.explode("task")
rota["task"] = tidy(rota["task"]).str.lower()
print(rota["task"].value_counts(dropna=False))
done = pd.get_dummies(rota["task"], prefix="did", dtype=int)
rota = pd.concat([rota.drop(columns=["tasks"]), done], axis=1)
per_cleaner = rota.groupby("cleaner")[list(done.columns)].sum()
print(per_cleaner)

who = pd.crosstab(rota["cleaner"], rota["hostel"], normalize="columns").round(3)
print(who)
print("Céline's share of Grauhorn", who.at["Céline", "Grauhorn"])

visits = rota.drop_duplicates(subset=["visit"])
minutes = visits.groupby(["hostel", "cleaner"])["minutes"].sum()
by_cleaner = minutes.swaplevel().sort_index()
print(by_cleaner.xs("Ana", level="cleaner"))
bergsee = minutes.xs("Bergsee", level="hostel")
print("Bergsee's cleaners", list(bergsee.index))
work = by_cleaner.reset_index(name="minutes")
work = work.merge(per_cleaner.reset_index(), on="cleaner", how="left")
work.to_csv("data/cleaning_minutes.csv", index=False)
