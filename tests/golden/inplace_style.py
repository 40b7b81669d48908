import pandas as pd

meals = pd.read_csv("meals.csv")
meals.rename(columns={"Class": "class_group", "Dish": "dish"}, inplace=True)
meals.drop(columns=["notes"], inplace=True)
meals.fillna({"portions": 0}, inplace=True)
meals.dropna(subset=["dish"], inplace=True)
meals.sort_values(["class_group", "dish"], inplace=True)
meals.reset_index(drop=True, inplace=True)
meals.to_csv("meals_clean.csv", index=False)
