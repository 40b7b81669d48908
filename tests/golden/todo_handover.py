import pandas as pd

cheeses = pd.read_csv("cheeses.csv")
cheeses["age_weeks"] = cheeses["age_days"] // 7
pivot = cheeses.pivot_table(index="cellar", columns="kind", values="weight", aggfunc="sum")
pivot.to_csv("cellar_pivot.csv")
for _, row in cheeses.iterrows():
    print(row["name"])
