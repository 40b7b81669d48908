import numpy as np
import pandas as pd

hives = pd.read_csv("hives.csv")
# a hive is strong when it is heavy and calm
strong = (hives["weight_kg"] > 40) & ~(hives["temper"] == "aggressive")
hives["label"] = np.where(strong, "strong", "watch")
hives.loc[hives["weight_kg"].isna(), "label"] = "unweighed"
watch = hives[hives["label"] != "strong"]
watch.to_csv("watch_list.csv", index=False)
