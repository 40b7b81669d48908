"""Seed bank cold room: the drawer counts with the 2024 arrivals appended, the thermometer
carried over the days nobody read it, seeds per gram, each year's stock and the packets below
their species' viable count (a pandas 1.x notebook, written for pandas 1.5: see reference.txt).
"""
import pandas as pd

counts = pd.read_csv("data/counts.csv", parse_dates=["counted"], na_values=["N/A"])
arrivals = pd.read_csv("data/arrivals.csv", parse_dates=["counted"])
stock = counts.append(arrivals, ignore_index=True)
stock.drop_duplicates(subset=["accession", "counted"], keep="first", inplace=True)
stock.reset_index(drop=True, inplace=True)

stock["species"] = stock["species"].str.strip().str.capitalize()
stock[["drawer", "accession"]] = stock[["drawer", "accession"]].applymap(lambda s: s.upper())
stock["temp_c"] = stock["temp_c"].pad()
stock["grams"] = stock.groupby("accession")["grams"].backfill()
stock["seeds_per_g"] = pd.np.round(stock["seeds"] / stock["grams"], 1)
stock["warm"] = pd.np.where(stock["temp_c"] > -18, "check", "ok")

species = pd.read_csv("data/species.csv")
species.drop_duplicates(subset=["species"], keep="last", inplace=True)
species["species"] = species["species"].str.capitalize()
stock = stock.merge(species, on="species", how="left")
stock["viable"] = stock["seeds"] >= stock["viable_seeds"]
stock["share_of_viable"] = (stock["seeds"] / stock["viable_seeds"]).round(2)
stock.sort_values(["counted", "accession"], inplace=True)
stock.to_csv("data/stock.csv", index=False)

yearly = stock.set_index("counted").resample("A").agg({"seeds": "sum", "accession": "nunique",
                                                      "temp_c": "min"})
yearly.rename(columns={"accession": "accessions"}, inplace=True)
yearly.reset_index(inplace=True)
yearly.to_csv("data/yearly.csv", index=False)

low = stock[~stock["viable"]]
families = (low.groupby(["family", "drawer"], dropna=False)["accession"].nunique()
               .reset_index(name="low_packets"))
families.to_csv("data/low_by_family.csv", index=False)
