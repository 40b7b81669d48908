import pandas as pd

VERBOSE = True
plots = pd.read_csv("plots.csv")
for column in ["fee", "deposit"]:
    plots[column] = plots[column].fillna(0).round(2)
if VERBOSE:
    print(plots.columns)
else:
    plots = plots.head(10)
total = plots["fee"].sum() + plots["deposit"].sum()
print(f"total due: {total:.2f}")
