"""Seed bank germination trials: does cold stratification help, and can we tell a good tray?

Course-notebook style: describe, correlate, cross-tabulate, draw, then a scaled logistic
regression in a pipeline with cross-validation.
"""
import numpy as np
import pandas as pd
import matplotlib
matplotlib.use("Agg")
import matplotlib.pyplot as plt
import seaborn as sns
from sklearn.pipeline import Pipeline
from sklearn.preprocessing import StandardScaler
from sklearn.linear_model import LogisticRegression
from sklearn.model_selection import train_test_split, cross_val_score
from sklearn.metrics import confusion_matrix, classification_report

trials = pd.read_csv("data/trials.csv")
species = pd.read_csv("data/species.csv")
print(trials.head())
print(trials.describe())

trials = trials.drop_duplicates()
trials["species"] = trials["species"].str.strip().str.capitalize()
trials["seed_weight_mg"] = trials["seed_weight_mg"].fillna(trials["seed_weight_mg"].mean())
trials = trials.dropna(subset=["age_years"])
trials["rate"] = trials["germinated"] / trials["sown"]
trials = trials[trials["sown"] > 0]
trials["good"] = (trials["rate"] >= 0.5).astype(int)
trials = trials.merge(species, on="species", how="left")
trials["family"] = trials["family"].fillna("unknown")

print(trials["treatment"].value_counts(normalize=True).round(3))
print(trials["good"].value_counts(normalize=True))

# correlations
corr = trials.corr(numeric_only=True)
print(corr.round(2))
plt.figure(figsize=(7, 6))
sns.heatmap(corr, annot=True, fmt=".2f", cmap="coolwarm")
plt.tight_layout()
plt.savefig("data/corr.png")
plt.close()

# treatment against outcome
table = pd.crosstab(trials["treatment"], trials["good"])
print(table)
table.plot(kind="bar", stacked=True)
plt.ylabel("trays")
plt.savefig("data/treatment_good.png")
plt.close()

trials.boxplot(column="rate", by="treatment")
plt.savefig("data/rate_by_treatment.png")
plt.close()

sns.scatterplot(data=trials, x="age_years", y="rate", hue="treatment")
plt.savefig("data/age_rate.png")
plt.close()

# model
trials["cold"] = (trials["treatment"] == "cold").astype(int)
trials["scarified"] = (trials["treatment"] == "scarified").astype(int)
features = ["seed_weight_mg", "age_years", "cold", "scarified"]
X = trials[features]
y = trials["good"]
X_train, X_test, y_train, y_test = train_test_split(X, y, test_size=0.3, random_state=0, stratify=y)

pipe = Pipeline([("scale", StandardScaler()), ("model", LogisticRegression())])
pipe.fit(X_train, y_train)
pred = pipe.predict(X_test)
print(confusion_matrix(y_test, pred))
print(classification_report(y_test, pred))
scores = cross_val_score(pipe, X, y, cv=5)
print("cv accuracy", scores.mean().round(3), scores.std().round(3))

coefs = pd.DataFrame({"feature": features, "weight": pipe.named_steps["model"].coef_[0]})
coefs.to_csv("data/weights.csv", index=False)

summary = trials.groupby(["family", "treatment"]).agg(
    trays=("tray", "count"),
    accessions=("accession", "nunique"),
    mean_rate=("rate", "mean"),
).reset_index()
summary["mean_rate"] = summary["mean_rate"].round(3)
summary.to_csv("data/summary.csv", index=False)
