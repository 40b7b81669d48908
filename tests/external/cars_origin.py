"""Cars (vega_datasets package, local data): fuel use by origin and decade, with the missing
horsepower and mileage values the table has."""
import pandas as pd

cars = pd.read_csv("cars.csv")
cars["year"] = cars["Year"].str.slice(0, 4).astype(int)
cars["decade"] = (cars["year"] // 10) * 10
cars["heavy"] = cars["Weight_in_lbs"] > 3500

known = cars.dropna(subset=["Miles_per_Gallon"])
by_origin = known.groupby(["Origin", "decade"]).agg(
    {"Miles_per_Gallon": "mean", "Horsepower": "max", "Name": "count"}
).reset_index()
by_origin.to_csv("by_origin.csv", index=False)

strongest = cars.nlargest(5, "Horsepower")[["Name", "Horsepower", "Origin"]]
strongest.to_csv("strongest.csv", index=False)

print(len(cars), cars["Horsepower"].isna().sum(), cars["Origin"].nunique())
