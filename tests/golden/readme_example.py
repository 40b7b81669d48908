import pandas as pd

deliveries = pd.read_csv("data/deliveries.csv")
deliveries["kg_per_tree"] = deliveries["kg"] / deliveries["trees"]
good = deliveries[deliveries["grade"] != "reject"]
totals = good.groupby("orchard")["kg"].sum().reset_index()
totals.to_csv("totals.csv", index=False)
