"""Which hives came through the winter? The bee inspector's autumn sheets against the spring count.

Course-notebook style: look at the data, clean it, draw a few pictures, fit a small model.
"""
import numpy as np
import pandas as pd
import matplotlib
matplotlib.use("Agg")
import matplotlib.pyplot as plt
import seaborn as sns
from sklearn.model_selection import train_test_split
from sklearn.preprocessing import StandardScaler
from sklearn.linear_model import LogisticRegression
from sklearn.metrics import accuracy_score, confusion_matrix

df = pd.read_csv("data/inspections.csv")
heights = pd.read_csv("data/apiaries.csv")
print(df.shape)
print(df.head())
print(df.isnull().sum())

# --- cleaning
df = df.drop_duplicates()
df["apiary"] = df["apiary"].str.strip().str.title()
df["apiary"] = df["apiary"].fillna("Unknown")
df = df.dropna(subset=["honey_kg"])
df["mites_per_100"] = df["mites_per_100"].fillna(df["mites_per_100"].median())
df["queen_age"] = 2024 - df["queen_year"]
df["queen_age"] = df["queen_age"].fillna(df["queen_age"].mean())
df["log_mites"] = np.log1p(df["mites_per_100"])
df["strong"] = np.where(df["frames"] >= 10, 1, 0)
df = df.merge(heights, on="apiary", how="left")
df["height_m"] = df["height_m"].fillna(0)
print(df.describe())
print(df["survived"].value_counts())

# --- pictures
fig, ax = plt.subplots(figsize=(6, 4))
ax.hist(df["honey_kg"], bins=15, color="goldenrod")
ax.set_xlabel("honey (kg)")
ax.set_ylabel("hives")
fig.savefig("data/honey_hist.png")
plt.close(fig)

plt.figure(figsize=(6, 4))
plt.scatter(df["mites_per_100"], df["brood_pct"], c=df["survived"], s=12)
plt.xlabel("mites per 100 bees")
plt.ylabel("brood (%)")
plt.savefig("data/mites_brood.png")
plt.close()

sns.boxplot(data=df, x="apiary", y="honey_kg")
plt.xticks(rotation=30)
plt.tight_layout()
plt.savefig("data/honey_by_apiary.png")
plt.close()

num_cols = ["frames", "brood_pct", "mites_per_100", "honey_kg", "queen_age", "height_m"]
corr = df[num_cols].corr()
print(corr.round(2))

# --- model
features = ["frames", "brood_pct", "log_mites", "queen_age", "height_m", "strong"]
X = df[features]
y = df["survived"]
X_train, X_test, y_train, y_test = train_test_split(X, y, test_size=0.3, random_state=42)
scaler = StandardScaler()
X_train_s = scaler.fit_transform(X_train)
X_test_s = scaler.transform(X_test)
model = LogisticRegression(max_iter=1000)
model.fit(X_train_s, y_train)
pred = model.predict(X_test_s)
print("accuracy:", round(accuracy_score(y_test, pred), 3))
print(confusion_matrix(y_test, pred))
coefs = pd.DataFrame({"feature": features, "weight": model.coef_[0]})
coefs = coefs.sort_values("weight")
coefs.to_csv("data/weights.csv", index=False)

summary = df.groupby("apiary").agg(
    hives=("hive", "nunique"),
    survived=("survived", "mean"),
    honey=("honey_kg", "mean"),
).reset_index()
summary["survived"] = summary["survived"].round(3)
summary.to_csv("data/apiary_summary.csv", index=False)
