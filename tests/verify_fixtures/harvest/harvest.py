"""An orchard co-op's delivery totals (verify fixture)."""
import pandas as pd

deliveries = pd.read_csv("data/deliveries.csv")
growers = pd.read_csv("data/growers.csv")
good = deliveries[deliveries["grade"] != "reject"]
totals = good.groupby("orchard", as_index=False)["kg"].sum()
totals.to_csv("totals.csv", index=False)
named = good.merge(growers, on="grower", how="left")
named.to_csv("named.csv", index=False)
by_grower = good.groupby("grower")["kg"].max()
