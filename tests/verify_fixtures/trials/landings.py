"""Harbour landings: catches and mean weight per boat (the pandas original)."""
import pandas as pd

landings = pd.read_csv("data/landings.csv")
per_boat = landings.groupby("boat", as_index=False).agg(
    catches=("kg", "count"), mean_kg=("kg", "mean")
)
per_boat["mean_kg"] = per_boat["mean_kg"].round(0)
per_boat.to_csv("per_boat.csv", index=False)
