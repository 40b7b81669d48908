"""Ferry line: the crossings with the most cars first, each with its boat's home port
(the pandas original)."""
import pandas as pd

crossings = pd.read_csv("data/crossings.csv")
boats = pd.read_csv("data/boats.csv")
heaviest = crossings.sort_values("cars", ascending=False, kind="stable")
heaviest = heaviest.merge(boats, on="boat", how="left")
heaviest.to_csv("heaviest.csv", index=False)
