# Hill farm lambing book: which ewes lose lambs, and can we see it coming?
# Notebook style: look at the book, clean it, band it, draw it, fit a model, write it up.

import numpy as np
import pandas as pd
import matplotlib
matplotlib.use("Agg")
import matplotlib.pyplot as plt
import seaborn as sns
from sklearn.model_selection import train_test_split, cross_val_score, KFold
from sklearn.compose import ColumnTransformer
from sklearn.preprocessing import OneHotEncoder, StandardScaler
from sklearn.pipeline import Pipeline
from sklearn.linear_model import LogisticRegression, LinearRegression
from sklearn.metrics import accuracy_score, roc_auc_score, r2_score

lambings = pd.read_csv("data/lambings.csv", parse_dates=["lambed"])
fields = pd.read_csv("data/fields.csv")

print(lambings.head(10))
print(lambings.shape)
print(lambings.describe())
print(lambings.isna().sum())
print(lambings["breed"].value_counts())
print(lambings["assisted"].value_counts())

# --- cleaning
lambings = lambings.drop_duplicates()
lambings["field"] = lambings["field"].str.strip().str.title()
lambings = lambings[lambings["field"].notna()]
lambings["ewe_kg"] = lambings["ewe_kg"].fillna(lambings["ewe_kg"].median())
lambings["ewe_kg"] = np.clip(lambings["ewe_kg"], 30, 95)  # a few misread scales
lambings["condition"] = lambings["condition"].fillna(3)
lambings = lambings.merge(fields, on="field", how="left")
lambings["shelter"] = lambings["shelter"].fillna("none")
lambings["altitude_m"] = lambings["altitude_m"].fillna(lambings["altitude_m"].mean())
print(lambings.isna().sum())

# --- features
lambings["lost"] = lambings["born"] - lambings["alive_48h"]
lambings["any_lost"] = (lambings["lost"] > 0).astype(int)
lambings["survival"] = lambings["alive_48h"] / lambings["born"]
lambings["log_birth_kg"] = np.log(lambings["birth_kg"])
lambings["helped"] = (lambings["assisted"] == "yes").astype(int)
lambings["hour"] = lambings["lambed"].dt.hour
lambings["night"] = ((lambings["hour"] >= 20) | (lambings["hour"] < 6)).astype(int)
lambings["week"] = lambings["lambed"].dt.isocalendar().week
lambings["age_band"] = pd.cut(lambings["ewe_age"], bins=[0, 2, 4, 6, 10],
                              labels=["gimmer", "young", "prime", "old"])
lambings["weight_band"] = pd.qcut(lambings["ewe_kg"], q=4, labels=["light", "mid", "heavy", "big"])
print(lambings["age_band"].value_counts())
print(lambings[["ewe_kg", "weight_band"]].head())

numbers = lambings.select_dtypes(include="number")
print(numbers.columns.tolist())
corr = numbers.corr()
print(corr.round(2))

# --- pictures
fig, axes = plt.subplots(1, 2, figsize=(11, 4))
axes[0].hist(lambings["birth_kg"], bins=20, color="olive")
axes[0].set_xlabel("mean lamb weight (kg)")
axes[1].scatter(lambings["ewe_kg"], lambings["birth_kg"], c=lambings["born"], s=12, cmap="viridis")
axes[1].set_xlabel("ewe weight (kg)")
fig.tight_layout()
fig.savefig("data/weights.png")
plt.close(fig)

plt.figure(figsize=(8, 8))
sns.heatmap(corr, annot=True, fmt=".1f", cmap="RdBu_r", center=0)
plt.tight_layout()
plt.savefig("data/corr.png")
plt.close()

sns.violinplot(data=lambings, x="breed", y="birth_kg", hue="helped")
plt.savefig("data/birth_kg_by_breed.png")
plt.close()

sns.boxplot(data=lambings, x="age_band", y="survival", hue="shelter")
plt.savefig("data/survival_by_age.png")
plt.close()

daily = lambings.groupby(lambings["lambed"].dt.date)["born"].sum()
plt.figure(figsize=(9, 3))
plt.plot(daily.index, daily.values, marker=".")
plt.ylabel("lambs born")
plt.savefig("data/daily.png")
plt.close()

weekly = lambings.groupby(["week", "shepherd"], as_index=False)["lost"].sum()
sns.lineplot(data=weekly, x="week", y="lost", hue="shepherd")
plt.savefig("data/weekly_losses.png")
plt.close()

grid = lambings.pivot_table(index="age_band", columns="field", values="survival", aggfunc="mean")
print(grid.round(3))
sns.heatmap(grid, annot=True, fmt=".2f", cmap="YlGn")
plt.savefig("data/survival_grid.png")
plt.close()

# --- birth weight from the ewe's weight
lin = LinearRegression()
lin.fit(lambings["ewe_kg"].values.reshape(-1, 1), lambings["birth_kg"].values)
print("slope", round(lin.coef_[0], 4), "r2",
      round(r2_score(lambings["birth_kg"], lin.predict(lambings["ewe_kg"].values.reshape(-1, 1))), 3))
lambings["birth_kg_fit"] = lin.predict(lambings[["ewe_kg"]].values)

# --- will a ewe lose a lamb?
numeric = ["ewe_age", "ewe_kg", "condition", "born", "birth_kg", "altitude_m", "helped", "night"]
categorical = ["breed", "shelter"]
X = lambings[numeric + categorical]
y = lambings["any_lost"]
X_train, X_test, y_train, y_test = train_test_split(X, y, test_size=0.25, random_state=1, stratify=y)

prep = ColumnTransformer([
    ("num", StandardScaler(), numeric),
    ("cat", OneHotEncoder(handle_unknown="ignore"), categorical),
])
model = Pipeline([("prep", prep), ("clf", LogisticRegression(max_iter=500))])
model.fit(X_train, y_train)
pred = model.predict(X_test)
proba = model.predict_proba(X_test)[:, 1]
print("accuracy", round(accuracy_score(y_test, pred), 3), "auc", round(roc_auc_score(y_test, proba), 3))

folds = KFold(n_splits=5, shuffle=True, random_state=3)
scores = cross_val_score(model, X, y, cv=folds, scoring="accuracy")
print("cv accuracy", scores.round(3), scores.mean().round(3))

lambings["risk"] = model.predict_proba(X)[:, 1]
lambings["flag"] = np.where(lambings["risk"] > 0.5, "watch", "ok")
print(lambings["flag"].value_counts())

names = model.named_steps["prep"].get_feature_names_out()
weights = pd.DataFrame({"feature": names, "weight": model.named_steps["clf"].coef_[0]})
weights["size"] = weights["weight"].abs()
weights = weights.sort_values("size", ascending=False)
weights.to_csv("data/weights.csv", index=False)

# --- write it up
by_field = lambings.groupby(["field", "shelter"]).agg(
    ewes=("ewe", "nunique"),
    born=("born", "sum"),
    lost=("lost", "sum"),
    mean_birth_kg=("birth_kg", "mean"),
    mean_risk=("risk", "mean"),
).reset_index()
by_field["loss_rate"] = (by_field["lost"] / by_field["born"]).round(3)
by_field["mean_birth_kg"] = by_field["mean_birth_kg"].round(2)
by_field["mean_risk"] = by_field["mean_risk"].round(3)
by_field.to_csv("data/by_field.csv", index=False)

by_breed = lambings.groupby("breed")["birth_kg"].agg(["count", "mean", "std", "min", "max"]).round(2)
by_breed.to_csv("data/by_breed.csv")

watch = lambings[lambings["flag"] == "watch"].sort_values("risk", ascending=False)
watch = watch[["ewe", "field", "breed", "ewe_age", "condition", "born", "lost", "risk"]]
watch["risk"] = watch["risk"].round(3)
watch.to_csv("data/watch_list.csv", index=False)
