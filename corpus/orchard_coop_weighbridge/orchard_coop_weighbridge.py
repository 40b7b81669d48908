"""An orchard co-op's weighbridge tickets, one file a week of the apple harvest, read with Dask:
net apples per valley and grade, per grower, and the first loads of the season."""
import dask.dataframe as dd
import pandas as pd

loads = dd.read_csv("data/weighbridge-week-*.csv", dtype={"tare_kg": "float64"}, blocksize=None)
loads = loads.repartition(npartitions=3)
growers = pd.read_csv("data/growers.csv")

loads = loads.assign(variety=loads.variety.str.strip().str.title())
loads = loads.assign(net_kg=loads.gross_kg - loads.tare_kg)
loads = loads.assign(kg_per_bin=(loads.net_kg / loads.bins).round(1))
loads = loads.merge(growers, on="grower", how="left")

per_valley = (
    loads.groupby(["valley", "grade"], sort=True)
    .agg({"net_kg": "sum", "bins": "sum", "load": "count", "kg_per_bin": "mean"})
    .reset_index()
)
per_valley = per_valley.assign(kg_per_bin=per_valley.kg_per_bin.round(2))
per_valley.compute().to_csv("valley_grades.csv", index=False)

per_grower = loads.groupby("grower", sort=True).net_kg.sum().compute()
per_grower.to_csv("grower_net_kg.csv")

organic = loads[loads.organic == "yes"][["week", "load", "farm", "variety", "net_kg"]]
organic.to_csv("organic_loads.csv", single_file=True, index=False)

loads.head(8, npartitions=-1)[["load", "week", "grower", "net_kg"]].to_csv("first_loads.csv", index=False)
