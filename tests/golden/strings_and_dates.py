import pandas as pd

visits = pd.read_csv("visits.csv")
visits["name"] = visits["name"].str.strip().str.title()
visits["day"] = pd.to_datetime(visits["day"], format="%Y-%m-%d", errors="coerce")
visits["weekday"] = visits["day"].dt.day_of_week
long_names = visits[visits["name"].str.len() > 10]
weekend = visits[visits["weekday"] >= 5]
weekend.to_csv("weekend_visits.csv", index=False)
