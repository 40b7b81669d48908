"""Village recycling depot: combine two weekly drop-off sheets, weigh up each material,
and list the households that bring the heavy glass and metal loads.

A ticket that shows up on both sheets is disputed and left out entirely;
weight 0 or 'n/a' means the scale was not used.
"""
import pandas as pd

CREDITS = pd.DataFrame(
    {
        "material": ["glass", "paper", "metal", "textiles", "e-waste"],
        "credit_per_kg": [0.02, 0.03, 0.11, 0.05, 0.0],
    }
)

week1 = pd.read_csv("data/dropoffs_week1.csv")
week2 = pd.read_csv("data/dropoffs_week2.csv")
print(week1.columns)
print(week2.dtypes)

drops = pd.concat([week1, week2], ignore_index=True)
print(drops.shape)

drops = (
    drops.drop_duplicates(subset=["ticket"], keep=False)
    .drop("staff", axis=1)
    .assign(
        material=lambda d: d["material"].str.strip().str.lower(),
        weight_kg=lambda d: d["weight_kg"].astype(float),
        bags=lambda d: d["bags"].astype(float),
    )
    .query("weight_kg > 0")
    .reset_index(drop=True)
)
print(drops["material"].unique())
print(drops["material"].value_counts().head(3))

per_material = (
    drops.groupby("material", as_index=False)
    .agg(kg=("weight_kg", "sum"), visits=("ticket", "count"), bags=("bags", "sum"))
    .merge(CREDITS, on="material", how="left")
    .assign(credit=lambda d: (d["kg"] * d["credit_per_kg"]).round(2))
    .sort_values(by=["kg", "material"], ascending=[False, True])
)
per_material.to_csv("material_totals.csv", index=False)

heavy = drops[drops["weight_kg"].between(20, 60) & drops["material"].isin(["glass", "metal"])]
heavy_households = heavy.groupby("household").size().reset_index()
heavy_households = heavy_households.rename(columns={0: "heavy_loads"})
heavy_households = heavy_households.sort_values(by=["heavy_loads", "household"], ascending=[False, True])
heavy_households.to_csv("heavy_households.csv", index=False)
print(heavy_households.head())

household_kg = drops.groupby("household")["weight_kg"].sum().reset_index()
first_visit = drops.sort_values(by=["dropped_on", "ticket"]).groupby("household").first().reset_index()
first_visit = first_visit[["household", "dropped_on", "material"]].merge(household_kg, on="household")
first_visit.to_csv("household_first_visit.csv", index=False)
print(first_visit.tail(3), drops["weight_kg"].sum())
