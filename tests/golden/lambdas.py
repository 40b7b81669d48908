import pandas as pd

GRADES = {"A": "premium", "B": "standard"}

batches = pd.read_csv("batches.csv")
batches["code"] = batches["code"].map(lambda c: c.strip().upper())
batches["grade_name"] = batches["grade"].map(GRADES)
batches["size"] = batches["litres"].apply(lambda v: "large" if v >= 100 else "small")
batches["tier"] = batches["grade"].map(lambda g: GRADES.get(g, "unknown"))
batches.to_csv("batches_named.csv", index=False)
