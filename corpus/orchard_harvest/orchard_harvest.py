"""Orchard co-op: premium (grade A) apple intake per grower, and revenue per month and grade.

The weigh-bridge log is keyed by hand, so varieties and grades arrive with
stray spaces and mixed case; a dash in the kg column means the scale failed.
"""
import pandas as pd

GRADE_PRICES = pd.DataFrame({"grade": ["A", "B", "C"], "price_per_kg": [1.35, 0.90, 0.40]})

weighings = pd.read_csv("data/weighings.csv", parse_dates=["pick_date"], na_values=["-"])
growers = pd.read_csv("data/growers.csv")
print(len(weighings))

clean = (
    weighings
    .assign(
        variety=weighings["variety"].str.strip().str.lower(),
        grade=weighings["grade"].str.strip().str.upper(),
        month=weighings["pick_date"].dt.month,
    )
    .dropna(subset=["kg", "grade"])
    .reset_index(drop=True)
)

premium = (
    clean.query("kg > 10 and grade == 'A'")
    .groupby(["grower_code", "variety"], as_index=False)
    .agg(total_kg=("kg", "sum"), crates=("crate_count", "sum"), weighings=("weigh_id", "count"))
    .merge(growers, on="grower_code", how="left")
    .assign(kg_per_ha=lambda d: (d["total_kg"] / d["hectares"]).round(2))
    .sort_values(by=["total_kg", "grower_code"], ascending=[False, True])
)
premium.to_csv("premium_by_grower.csv", index=False)
print(premium.head())

monthly = (
    clean.merge(GRADE_PRICES, on="grade", how="left")
    .assign(revenue=lambda d: d["kg"] * d["price_per_kg"])
    .groupby(["month", "grade"])
    .agg(kg=("kg", "sum"), revenue=("revenue", "sum"), growers=("grower_code", "nunique"))
    .reset_index()
    .round(2)
)
monthly.to_csv("monthly_revenue.csv", index=False)

total = monthly["revenue"].sum()
print(f"season revenue: {total:.2f}")
