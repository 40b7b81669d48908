"""Island ferry line: freight manifests priced by deck, charged fees filled in, the month's
takings and each deck's heaviest load (a pandas 1.x notebook, written for pandas 1.5: see
reference.txt).

A blank weight takes the next reading (the weighbridge was down); 'N/A' fees were not charged
yet and are priced at the sailing's rate for the deck the load travelled on.
"""
import pandas as pd

man = pd.read_csv("data/manifests.csv", parse_dates=["sailed"], na_values=["N/A"])
man.drop_duplicates(inplace=True)
man["consignee"] = man["consignee"].str.strip().str.title()

gaps = {}
for name, values in man.iteritems():
    gaps[name] = int(values.isna().sum())
print("missing per column:", gaps)

man.sort_values(["sailing", "deck", "consignment"], inplace=True)
man["weight_t"] = man["weight_t"].fillna(method="bfill")

sailings = pd.read_csv("data/sailings.csv")
sailings.drop_duplicates(subset=["sailing"], inplace=True)
man = man.merge(sailings, on="sailing", how="left")
man["rate"] = man.lookup(man.index, man["deck"])
man["charge"] = (man["weight_t"] * man["rate"]).round(2)
man["fee"] = man["fee"].fillna(man["charge"])
man["per_axle"] = pd.np.where(man["axles"] > 0, man["fee"] / man["axles"], pd.np.nan)
man["per_tonne"] = (man["fee"] / man["weight_t"]).round(2)

priced = man[["consignment", "sailing", "route", "deck", "consignee", "weight_t", "fee",
              "charge", "per_axle", "per_tonne"]]
priced.to_csv("data/priced.csv", index=False)

takings = man.set_index("sailed").resample("BM")[["fee", "weight_t"]].sum().reset_index()
takings.to_csv("data/takings.csv", index=False)

heaviest = man.groupby("deck").apply(lambda g: g.nlargest(2, "weight_t")).reset_index(drop=True)
heaviest = heaviest[["deck", "consignment", "consignee", "weight_t", "fee"]]
heaviest.to_csv("data/heaviest.csv", index=False)

consignees = (man.groupby(["consignee", "route"], as_index=False)
                 .agg(loads=("consignment", "count"), tonnes=("weight_t", "sum"), fees=("fee", "sum"))
                 .sort_values(["fees", "consignee"], ascending=[False, True]))
consignees.to_csv("data/consignees.csv", index=False)
