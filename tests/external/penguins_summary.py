"""Palmer penguins (palmerpenguins package): body mass by species and island, with the
missing measurements the dataset really has."""
import pandas as pd

penguins = pd.read_csv("penguins.csv")
measured = penguins.dropna(subset=["body_mass_g", "flipper_length_mm"])
measured["mass_kg"] = measured["body_mass_g"] / 1000
by_species = (
    measured.groupby(["species", "island"])
    .agg(birds=("body_mass_g", "count"), mass_kg=("mass_kg", "mean"),
         flipper=("flipper_length_mm", "median"), heaviest=("body_mass_g", "max"))
    .reset_index()
)
by_species["mass_kg"] = by_species["mass_kg"].round(3)
by_species.to_csv("by_species.csv", index=False)

sexes = penguins["sex"].value_counts().reset_index()
sexes.to_csv("sexes.csv", index=False)

big = penguins[(penguins["body_mass_g"] > 5000) & penguins["sex"].notna()]
big = big.sort_values(["body_mass_g", "year"], ascending=[False, True])
big[["species", "island", "sex", "body_mass_g", "year"]].to_csv("heavy.csv", index=False)

missing_sex = penguins["sex"].isna().sum()
rows = len(penguins)
bill_ratio = penguins.assign(ratio=penguins["bill_length_mm"] / penguins["bill_depth_mm"])
ratio_by_year = bill_ratio.groupby("year", as_index=False)["ratio"].mean()
print(rows, missing_sex)
