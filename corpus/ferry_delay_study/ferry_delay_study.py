# Lake ferry delays: can we predict how late a sailing leaves?
# Competition-notebook style: split by date, engineer features, fit a booster, write a submission.

import numpy as np
import pandas as pd
import matplotlib
matplotlib.use("Agg")
import matplotlib.pyplot as plt
import seaborn as sns
from sklearn.linear_model import LinearRegression
from sklearn.ensemble import GradientBoostingRegressor
from sklearn.metrics import mean_absolute_error, mean_squared_error

df = pd.read_csv("data/sailings.csv", parse_dates=["departure"])
routes = pd.read_csv("data/routes.csv")
print(df.shape)
print(df.isnull().sum())

df = df.drop_duplicates()
df["route"] = df["route"].str.strip().str.title()
df["wind_kmh"] = df["wind_kmh"].fillna(df["wind_kmh"].median())
df = df.merge(routes, on="route", how="left")

# feature engineering
df["hour"] = df["departure"].dt.hour
df["weekday"] = df["departure"].dt.dayofweek
df["month"] = df["departure"].dt.month
df["weekend"] = (df["weekday"] >= 5).astype(int)
df["rush"] = df["hour"].isin([8, 17]).astype(int)
df["load"] = df["passengers"] / df["capacity"]
df["load"] = df["load"].replace([np.inf, -np.inf], np.nan).fillna(0)
df["line"] = df["route"]
df = pd.get_dummies(df, columns=["route"], drop_first=True)

features = ["hour", "weekday", "weekend", "rush", "load", "cars", "wind_kmh", "length_km"]
features += [c for c in df.columns if c.startswith("route_")]

# train on March, predict April (the delays we are asked to predict are the blank ones too)
cutoff = pd.Timestamp("2026-04-01")
train = df[(df["departure"] < cutoff) & df["delay_min"].notna()]
test = df[df["departure"] >= cutoff].copy()
print("train", train.shape, "test", test.shape)

lin = LinearRegression()
lin.fit(train[features].values, train["delay_min"].values)
gbr = GradientBoostingRegressor(n_estimators=80, max_depth=3, random_state=0)
gbr.fit(train[features].values, train["delay_min"].values)

test["pred_lin"] = lin.predict(test[features].values)
test["pred"] = gbr.predict(test[features].values)
scored = test[test["delay_min"].notna()]
print("MAE linear", round(mean_absolute_error(scored["delay_min"], scored["pred_lin"]), 3))
print("MAE boost", round(mean_absolute_error(scored["delay_min"], scored["pred"]), 3))
print("RMSE boost", round(np.sqrt(mean_squared_error(scored["delay_min"], scored["pred"])), 3))

scored = scored.copy()
scored["residual"] = scored["delay_min"] - scored["pred"]
by_route = scored.groupby("line")["residual"].agg(["mean", "std", "count"]).round(3)
print(by_route)

hourly = train.groupby("hour", as_index=False)["delay_min"].mean()
sns.lineplot(data=hourly, x="hour", y="delay_min", marker="o")
plt.title("mean delay by hour (March)")
plt.savefig("data/delay_by_hour.png")
plt.close()

by_vessel = df.groupby("vessel")["delay_min"].mean().reset_index()
sns.barplot(data=by_vessel, x="vessel", y="delay_min")
plt.savefig("data/delay_by_vessel.png")
plt.close()

cols = ["delay_min", "wind_kmh", "load", "passengers"]
fig, axes = plt.subplots(2, 2, figsize=(9, 7))
axes = axes.flatten()
for i, col in enumerate(cols):
    axes[i].hist(df[col].dropna(), bins=20, color="teal")
    axes[i].set_title(col)
fig.tight_layout()
fig.savefig("data/histograms.png")
plt.close(fig)

importance = pd.DataFrame({"feature": features, "importance": gbr.feature_importances_})
print(importance.sort_values("importance", ascending=False).head(5))

submission = test[["sailing", "pred"]].rename(columns={"pred": "delay_min"})
submission["delay_min"] = submission["delay_min"].round(2)
submission.to_csv("data/submission.csv", index=False)
by_route.to_csv("data/residuals_by_route.csv")
