"""Hill-fort dig: summaries of the finds register for the site meeting.

The register got too big for the site laptop's pandas, so the import was switched to Modin
(same API); nothing else changed.
"""
import os

os.environ.setdefault("MODIN_ENGINE", "python")  # no Ray on the site laptop
import modin.pandas as pd
import numpy as np

finds = pd.read_csv("data/finds.csv", na_values=["?"])
trenches = pd.read_csv("data/trenches.csv")
print(finds.shape)

finds = finds.drop_duplicates(subset=["find_id"])
finds["material"] = finds["material"].str.strip().str.lower()
finds["weight_g"] = finds["weight_g"].fillna(0)
finds["depth_band"] = pd.cut(finds["depth_cm"], bins=[0, 20, 50, 100, 300],
                             labels=["topsoil", "upper", "middle", "deep"])
finds = finds.merge(trenches, on="trench", how="left")
finds["period"] = finds["period"].fillna("unphased")
finds["metal"] = np.where(finds["material"].isin(["iron", "bronze"]), "metal", "other")

# what each trench gave
by_material = (finds.groupby(["trench", "material"], as_index=False)
               .agg(finds=("find_id", "count"), weight_g=("weight_g", "sum"), deepest=("depth_cm", "max")))
by_material["share"] = (by_material["finds"]
                        / by_material.groupby("trench")["finds"].transform("sum")).round(3)
by_material = by_material.sort_values(["trench", "finds"], ascending=[True, False])
by_material.to_csv("data/by_material.csv", index=False)

# per square metre, for trenches on the list
dens = finds.groupby("trench").agg(n=("find_id", "count"), area=("area_m2", "first"))
dens["per_m2"] = (dens["n"] / dens["area"]).round(2)
dens = dens.dropna(subset=["per_m2"]).sort_values("per_m2", ascending=False)
print(dens.head())
dens.to_csv("data/density.csv")

bands = finds.groupby(["material", "depth_band"], observed=True).size().unstack(fill_value=0)
bands.to_csv("data/depth_bands.csv")

cut_off = finds["weight_g"].quantile(0.9)
heavy = finds[finds["weight_g"] > cut_off]
print(len(heavy), "finds over", cut_off, "g")
per_day = heavy.groupby(["dug_on", "metal"])["weight_g"].agg(["count", "sum", "mean"]).round(1)
per_day = per_day.reset_index()
per_day.to_csv("data/heavy_per_day.csv", index=False)
