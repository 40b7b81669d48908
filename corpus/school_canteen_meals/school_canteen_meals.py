"""School canteen: meals and cost per class, the menu mix, and allergen alerts for the kitchen.

A portion count of 0 means the pupil was booked but absent. The allergen
column says 'none' or is blank when the family declared nothing.
"""
import numpy as np
import pandas as pd

MEAL_PRICE = {"standard": 3.40, "reduced": 1.10}

meals = pd.read_csv("data/meals.csv", na_values=["none"])
print(len(meals))

meals["class_group"] = meals["class_group"].str.strip().str.upper()
meals["tariff"] = np.where(meals["reduced_rate"] == "yes", "reduced", "standard")
meals["unit_price"] = meals["tariff"].map(MEAL_PRICE)
meals["cost"] = meals.portions * meals.unit_price
meals["second_helping"] = meals.portions.apply(lambda p: p > 1)

served = meals[meals.portions > 0]
absent = meals[~(meals.portions > 0)]
print(len(served), len(absent), served["pupil_id"].nunique())

per_class = served.groupby("class_group", as_index=False).agg(
    pupils=("pupil_id", "nunique"),
    portions=("portions", "sum"),
    seconds=("second_helping", "sum"),
    cost=("cost", "sum"),
)
per_class["cost"] = per_class["cost"].round(2)
per_class.to_csv("class_costs.csv", index=False)

menu_mix = served.groupby(["class_group", "menu"])["pupil_id"].count().reset_index()
menu_mix = menu_mix.rename(columns={"pupil_id": "meals"})
menu_mix.to_csv("menu_mix.csv", index=False)

# the kitchen wants a plain list of plates to check by hand
risky = served[served["menu"].isin(["meat", "fish"]) & served["allergen"].notna()]
dates, pupils, notes = [], [], []
for _, row in risky.iterrows():
    dates.append(row["served_on"])
    pupils.append(row["pupil_id"])
    notes.append(f"{row['class_group']}: {row['menu']} plate, check {row['allergen']}")
alerts = pd.DataFrame({"served_on": dates, "pupil_id": pupils, "note": notes})
alerts.to_csv("allergen_alerts.csv", index=False)
print(alerts.head())
