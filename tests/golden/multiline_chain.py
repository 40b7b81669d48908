import pandas as pd

orders = (
    pd.read_csv("orders.csv", dtype={"shop": str})
    .assign(total=lambda d: d["units"] * d["price"])  # price per unit
    .query("units > 0")
)

# the ten biggest orders
top = orders.sort_values("total", ascending=False).head(10)
top[["shop", "units", "total"]].to_csv("top_orders.csv", index=False)
