"""Community orchard soil survey: which soils go with healthy trees?

Course notebook: load, tidy, look, cluster the cores, draw, write the summaries.
"""
import numpy as np
import pandas as pd
import matplotlib
matplotlib.use("Agg")
import matplotlib.pyplot as plt
import seaborn as sns
from sklearn.preprocessing import StandardScaler
from sklearn.cluster import KMeans
from sklearn.decomposition import PCA

cores = pd.read_csv("data/cores.csv", na_values=["err"])
trees = pd.read_csv("data/trees.csv")
print(cores.info())
print(cores.describe().round(2))

cores = cores.drop_duplicates(subset=["core"])
cores["plot"] = cores["plot"].str.strip().str.title()
cores["moisture_pct"] = cores["moisture_pct"].fillna(cores["moisture_pct"].mean())
cores = cores.dropna(subset=["ph"])
cores["acid"] = np.where(cores["ph"] < 6.0, "acid", "neutral")
cores = cores.merge(trees, on="tree", how="left")
cores["age"] = 2024 - cores["planted"]
print(cores["variety"].value_counts(dropna=False))

# look
cores["ph"].plot(kind="hist", bins=12, title="soil pH")
plt.savefig("data/ph.png")
plt.close()

sns.countplot(data=cores, x="plot", hue="acid")
plt.xticks(rotation=20)
plt.tight_layout()
plt.savefig("data/acid_by_plot.png")
plt.close()

by_depth = cores.groupby("depth_cm")[["ph", "nitrogen_mgkg", "organic_pct"]].mean()
by_depth.plot(kind="bar", figsize=(6, 4))
plt.savefig("data/by_depth.png")
plt.close()

# cluster the cores on their chemistry
features = ["ph", "nitrogen_mgkg", "moisture_pct", "organic_pct"]
X = StandardScaler().fit_transform(cores[features])
km = KMeans(n_clusters=3, n_init=10, random_state=0)
cores["cluster"] = km.fit_predict(X)
pcs = PCA(n_components=2, random_state=0).fit_transform(X)
cores["pc1"] = pcs[:, 0]
cores["pc2"] = pcs[:, 1]

plt.figure(figsize=(6, 5))
sns.scatterplot(data=cores, x="pc1", y="pc2", hue="cluster", palette="deep")
plt.savefig("data/clusters.png")
plt.close()

profile = cores.groupby("cluster")[features + ["health"]].mean().round(2)
profile["cores"] = cores.groupby("cluster").size()
print(profile)
profile.to_csv("data/cluster_profile.csv")

healthy = cores[cores["health"] >= 4]
share = (healthy.groupby("variety").size() / cores.groupby("variety").size()).fillna(0).round(3)
share = share.rename("healthy_share").reset_index()
share.to_csv("data/healthy_share.csv", index=False)

plots = cores.groupby("plot", as_index=False).agg(
    cores=("core", "count"),
    mean_ph=("ph", "mean"),
    wet=("moisture_pct", "max"),
    trees=("tree", "nunique"),
)
plots["mean_ph"] = plots["mean_ph"].round(2)
plots.to_csv("data/plots.csv", index=False)
