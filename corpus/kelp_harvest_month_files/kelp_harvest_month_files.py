"""Kelp co-op: one harvest log per month, a folder of boat registers and price lists.

The month files are read in a loop over a sorted glob, each tagged with its file name, and
stacked; the boat registers are read from a folder listing (a README sits beside them) and
the price lists from a Path glob, in the order the file system gives them.
"""
import glob
import os
from pathlib import Path

import pandas as pd

frames = []
for path in sorted(glob.glob("data/harvest/harvest_*.csv")):
    part = pd.read_csv(path)
    part["source"] = os.path.basename(path)
    frames.append(part)
harvest = pd.concat(frames, ignore_index=True)
harvest["wet_kg"] = harvest["wet_kg"].fillna(0)

boats = pd.concat(
    [pd.read_csv(os.path.join("data", "boats", name))
     for name in sorted(os.listdir("data/boats")) if name.endswith(".csv")],
    ignore_index=True,
)
prices = pd.concat([pd.read_csv(p) for p in Path("data/prices").glob("*.csv")],
                   ignore_index=True)

by_boat = harvest.groupby(["boat", "species"], as_index=False)["wet_kg"].sum()
by_boat = by_boat.merge(boats, on="boat", how="left")
by_boat.to_csv("by_boat.csv", index=False)

per_file = harvest.groupby("source", as_index=False).agg(rows=("wet_kg", "size"),
                                                        kg=("wet_kg", "mean"))
per_file.to_csv("per_file.csv", index=False)

valued = harvest.merge(prices, on="species", how="left")
valued["value"] = valued["wet_kg"] * valued["price_per_kg"]
valued.to_csv("harvest_valued.csv", index=False)
print(per_file)
