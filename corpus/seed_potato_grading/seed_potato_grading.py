"""Seed-potato cooperative: the grading shed's tally against the field lots. Kilograms of each
variety in every size grade (grades a variety never gave shown as 0), the seed share per variety,
each grower's yield per hectare, and the best lot of every field.
"""
import pandas as pd

GRADES = ["seed", "ware", "chats", "oversize"]


def per_ha(kg, ha):
    return (kg / 1000 / ha).round(2)


# %% the lots sheet and the shed's tally
lots = pd.read_csv("data/lots.csv")
lots["variety"] = lots["variety"].fillna("mixed")
lots = lots.set_index("lot")
print(lots.index.is_unique, len(lots))

boxes = pd.read_csv("data/grading.csv", na_values=["N/A", "-"], parse_dates=["graded_on"])
print(boxes.shape)
boxes = boxes.drop_duplicates(subset=["box"])
boxes["lot"] = boxes["lot"].str.upper()
boxes["size"] = boxes["size"].str.strip().str.lower()
boxes = boxes.dropna(subset=["lot", "kg"])
graded = boxes.merge(lots.reset_index(), on="lot", how="inner")
print(len(boxes) - len(graded), "boxes from lots not on the sheet")

# %% every variety in every grade
kg = graded.groupby(["variety", "size"])["kg"].sum()
varieties = sorted(graded["variety"].unique())
full = pd.MultiIndex.from_product([varieties, GRADES], names=["variety", "size"])
kg = kg.reindex(full, fill_value=0)
print(kg.head(8))
table = kg.unstack("size")
table = table[GRADES]
table["total"] = table.sum(axis=1)
table["seed_share"] = (table["seed"] / table["total"]).round(3)
table = table.reset_index()
table.to_csv("data/grades_by_variety.csv", index=False)
tidy = table.melt(id_vars=["variety"], value_vars=GRADES, var_name="grade", value_name="kg")
tidy = tidy.sort_values(["grade", "kg"], ascending=[True, False])
print(tidy.head(10))

# %% growers: boxes, kilograms and yield per hectare
stats = graded.pivot_table(index="grower", values="kg", aggfunc=["sum", "mean", "count"])
stats.columns = stats.columns.droplevel(1)
stats = stats.rename(columns={"sum": "kg", "mean": "kg_per_box", "count": "boxes"})
ha = lots.groupby("grower")["hectares"].sum()
stats["hectares"] = ha
stats["t_per_ha"] = per_ha(stats["kg"], stats["hectares"])
stats = stats.sort_index().reset_index()
stats["kg_per_box"] = stats["kg_per_box"].round(1)
stats.to_csv("data/grower_yield.csv", index=False)

# %% the best lot of each field
by_lot = graded.groupby(["field", "lot"])["kg"].sum()
best = by_lot.sort_values(ascending=False, kind="stable").groupby(level="field").head(1)
best = best.sort_index()
print("fields:", list(best.index.get_level_values("field")))
best_lots = best.index.get_level_values("lot")
best = best.droplevel("lot").rename_axis("field").reset_index(name="kg")
best["lot"] = list(best_lots)
best["variety"] = best["lot"].map(lots["variety"])
best.to_csv("data/best_lot_per_field.csv", index=False)
print(best)
