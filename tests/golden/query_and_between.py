import pandas as pd

limit = 30
meters = pd.read_csv("meters.csv")
high = meters.query("litres > @limit and village != 'Upper Fold'")
mid = meters[meters["litres"].between(10, 30, inclusive="left")]
print(len(high), len(mid))
high.to_csv("high_use.csv", index=False)
