"""Mountain dairy summer pasture: milk per herder and alp, the herders' wages, and the cows
that gave least.

The milk book is kept by whoever milks: names come with and without their accents
('Séverine Brügger', 'SEVERINE BRUGGER'), so they are folded to plain lower-case ASCII
before they are matched to the wage list, which is keyed that way. 'dry' means the cow was
not milked. Alpe Gèrra had no cows summered this year (the count was not sent up).
"""
import pandas as pd


milk = pd.read_csv("data/milk_log.csv", na_values=["dry"])
herders = pd.read_csv("data/herders.csv")
alps = pd.read_csv("data/alps.csv")
print("milk lines:", len(milk), "| blank litres:", milk["litres"].isna().sum())

print("lines written twice:", milk.duplicated().sum())
milk["alp"] = milk["alp"].str.strip().str.title().str.replace("Da", "da")
milk["milking"] = milk["milking"].str.lower()
milk["herder_key"] = milk["herder"].str.strip().str.lower()
# fold the accents away: é -> e, ü -> u, å -> a
milk["herder_key"] = milk["herder_key"].str.normalize("NFKD").str.encode("ascii", errors="ignore").str.decode("ascii")
print(milk["herder_key"].value_counts())

milk["litres"] = milk["litres"].fillna(0)
milk["fat_kg"] = milk["litres"] * milk["fat_pct"] / 100

# the wage list has Luzi twice (a raise in July): the later line counts
wages = herders.drop_duplicates(subset="herder_key", keep="last")
milk = milk.merge(wages, on="herder_key", how="left")
milk["wage"] = milk["litres"] * milk["wage_per_litre"]

# --- per herder: litres, fat and wage
per_herder = milk.groupby("herder_key").agg(
    days=("day", "nunique"), litres=("litres", "sum"), fat_kg=("fat_kg", "sum"), wage=("wage", "sum"))
per_herder = per_herder.reset_index()
per_herder["fat_kg"] = per_herder["fat_kg"].round(3)
per_herder["wage"] = per_herder["wage"].round(2)
per_herder["litres"] = per_herder["litres"].round(1)
per_herder = per_herder.sort_values(["litres", "herder_key"], ascending=[False, True])
per_herder.to_csv("herder_wages.csv", index=False)
no_wage = milk[milk["wage_per_litre"].isna()]
print(f"{len(no_wage)} lines by herders not on the wage list:", sorted(no_wage["herder_key"].unique()))

# --- per alp and day, against the cows summered there
per_alp = milk.groupby(["alp", "day"], as_index=False)["litres"].sum()
per_alp = per_alp.merge(alps, on="alp", how="left")
per_alp["litres_per_cow"] = (per_alp["litres"] / per_alp["cows_summered"]).round(2)
per_alp["litres"] = per_alp["litres"].round(1)
per_alp.to_csv("alp_days.csv", index=False)

# --- the cows that gave least in the evening
evening = milk[milk["milking"] == "evening"]
low = evening.groupby("cow", as_index=False).agg(litres=("litres", "mean"), milkings=("log_id", "count"))
low["litres"] = low["litres"].round(2)
low = low.sort_values(["litres", "cow"]).head(4)
print(low)
