# Moth traps on the heath: what brings the moths out?
# Competition-notebook style: explore, plot, one-hot encode, fit a forest, look at importances.

import numpy as np
import pandas as pd
import matplotlib
matplotlib.use("Agg")
import matplotlib.pyplot as plt
import seaborn as sns
from sklearn.model_selection import train_test_split, cross_val_score
from sklearn.ensemble import RandomForestRegressor
from sklearn.linear_model import LinearRegression
from sklearn.metrics import mean_absolute_error, r2_score

traps = pd.read_csv("data/traps.csv", parse_dates=["night"])
habitats = pd.read_csv("data/habitats.csv")

print(traps.shape)
print(traps.dtypes)
print(traps.isna().mean().round(3))

traps = traps.drop_duplicates()
traps["site"] = traps["site"].str.strip().str.title()
traps = traps[traps["site"].notna() & (traps["site"] != "")]
traps["wind_kmh"] = traps["wind_kmh"].fillna(0)
traps = traps.dropna(subset=["temp_c"])
traps["month"] = traps["night"].dt.month
traps["warm"] = (traps["temp_c"] > traps["temp_c"].median()).astype(int)
traps = traps.merge(habitats, on="site", how="left")
traps["habitat"] = traps["habitat"].fillna("unknown")
print(traps["habitat"].value_counts())

# nightly totals over the summer
nightly = traps.groupby("night")["catch"].sum()
plt.figure(figsize=(8, 3))
plt.plot(nightly.index, nightly.values, color="purple")
plt.ylabel("moths caught")
plt.tight_layout()
plt.savefig("data/nightly.png")
plt.close()

fig, ax = plt.subplots(1, 2, figsize=(10, 4))
sns.histplot(traps["catch"], bins=20, ax=ax[0])
sns.scatterplot(data=traps, x="temp_c", y="catch", hue="habitat", ax=ax[1])
fig.savefig("data/catch.png")
plt.close(fig)

corr = traps[["temp_c", "wind_kmh", "moon_pct", "cloud_okta", "catch", "species"]].corr()
sns.heatmap(corr, annot=True, fmt=".2f", cmap="vlag")
plt.savefig("data/corr.png")
plt.close()

top = np.percentile(traps["catch"], 90)
print("a good night catches more than", top)

# model
model_df = pd.get_dummies(traps[["temp_c", "wind_kmh", "moon_pct", "cloud_okta", "month", "habitat", "catch"]],
                          columns=["habitat"], drop_first=True, dtype=int)
X = model_df.drop(columns=["catch"])
y = model_df["catch"]
X_train, X_test, y_train, y_test = train_test_split(X, y, test_size=0.25, random_state=0)

lin = LinearRegression().fit(X_train, y_train)
print("linear MAE", round(mean_absolute_error(y_test, lin.predict(X_test)), 3))

forest = RandomForestRegressor(n_estimators=50, random_state=0)
forest.fit(X_train, y_train)
pred = forest.predict(X_test)
print("forest MAE", round(mean_absolute_error(y_test, pred), 3), "R2", round(r2_score(y_test, pred), 3))
scores = cross_val_score(LinearRegression(), X.values, y.values, cv=5, scoring="r2")
print("cv r2", scores.round(3))

importances = pd.DataFrame({"feature": X.columns, "importance": forest.feature_importances_})
importances = importances.sort_values("importance", ascending=False)
importances.to_csv("data/importances.csv", index=False)

by_site = traps.groupby(["site", "habitat"], as_index=False).agg(
    nights=("night", "nunique"),
    moths=("catch", "sum"),
    best=("catch", "max"),
    richness=("species", "mean"),
)
by_site["per_night"] = (by_site["moths"] / by_site["nights"]).round(2)
by_site["richness"] = by_site["richness"].round(2)
by_site.to_csv("data/by_site.csv", index=False)
