"""Bakery chain of four shops: one week of sales per shop, typical daily volumes per product,
what each shop sold first and last in the week, and the products that waste the least.

Waste is counted at closing; a blank waste cell means nobody counted it.
"""
import pandas as pd

sales = pd.read_csv("data/sales.csv", parse_dates=["sale_date"])
print(sales.shape)

sales = sales.assign(
    revenue=(sales["units"] * sales["unit_price"]).round(2),
    day=sales["sale_date"].dt.day,
    waste_units=sales["waste_units"].fillna(0),
)

shop_stats = (
    sales.groupby("shop")
    .agg(
        days=("sale_date", "nunique"),
        revenue=("revenue", "sum"),
        median_units=("units", "median"),
        units_std=("units", "std"),
        cheapest=("unit_price", "min"),
        dearest=("unit_price", "max"),
        lines=("product", "count"),
    )
    .reset_index()
    .round(2)
)
shop_stats.to_csv("shop_stats.csv", index=False)
print(shop_stats)

typical = sales.groupby(["category", "product"])["units"].median().reset_index()
products_per_shop = sales.groupby("shop")["product"].nunique().reset_index()
products_per_shop = products_per_shop.rename(columns={"product": "products_sold"})
week = sales.sort_values(by=["shop", "sale_date", "product"])
opening = week.groupby("shop")[["sale_date", "product", "units"]].first().reset_index()
closing = week.groupby("shop")[["sale_date", "product", "units"]].last().reset_index()
first_last = opening.merge(closing, on="shop", suffixes=("_first", "_last")).merge(products_per_shop, on="shop")
typical.to_csv("typical_units.csv", index=False)
first_last.to_csv("first_and_last.csv", index=False)

least_waste = (
    sales.query("units > 0")
    .assign(waste_rate=lambda d: (d["waste_units"] / d["units"]).round(3))
    .nsmallest(8, "waste_rate")
    [["sale_date", "shop", "product", "units", "waste_units", "waste_rate"]]
    .reset_index(drop=True)
)
least_waste.to_csv("least_waste.csv", index=False)
print(least_waste.tail(3))
