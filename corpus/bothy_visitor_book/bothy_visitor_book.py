"""Bothy visitor book: the association's visitor books typed up, the late book appended, the
closed bothies left out, each stay's suggested donation from the tariff, the person-nights of
each quarter and the biggest party each bothy sheltered (a pandas 1.x notebook, kept since
2016, written for pandas 1.5: see reference.txt).

A blank 'nights' was written on the next line by the same party; 'N/A' donations were not
counted yet.
"""
import pandas as pd

book = pd.read_csv("data/visits.csv", parse_dates=["arrived"], na_values=["N/A"])
late = pd.read_csv("data/late_book.csv", parse_dates=["arrived"], na_values=["N/A"])
visits = book.append(late, ignore_index=True)
visits.drop_duplicates(inplace=True)
visits.reset_index(drop=True, inplace=True)
print(len(book), len(late), len(visits))

visits[["bothy", "from_town"]] = visits[["bothy", "from_town"]].applymap(
    lambda s: s.strip().title() if isinstance(s, str) else s)
visits["nights"] = visits["nights"].backfill()

blanks = {}
for col, values in visits.iteritems():
    blanks[col] = values.isnull().sum()
print("blanks:", blanks)

closed = pd.read_csv("data/closed.csv", squeeze=True)
visits = visits[~visits["bothy"].isin(closed)]

tariff = pd.read_csv("data/tariff.csv")
tariff["bothy"] = tariff["bothy"].str.title()
visits = visits.merge(tariff, on="bothy", how="left")
visits["rate"] = visits.lookup(visits.index, visits["season"])
visits["person_nights"] = visits["party"] * visits["nights"]
visits["suggested"] = (visits["rate"] * visits["person_nights"]).round(2)
visits["per_night"] = pd.np.where(visits["nights"] > 0, visits["donation"] / visits["nights"], pd.np.nan)
visits["short"] = visits["donation"] < visits["suggested"]
visits.sort_values(["arrived", "entry"], inplace=True)
visits.to_csv("data/stays.csv", index=False)

quarterly = visits.set_index("arrived").resample("Q")[["person_nights", "donation", "suggested"]].sum()
quarterly.reset_index(inplace=True)
quarterly.to_csv("data/quarterly.csv", index=False)

biggest = visits.groupby("bothy").apply(lambda g: g[g["party"] == g["party"].max()])
biggest = biggest.reset_index(drop=True)[["bothy", "entry", "arrived", "party", "from_town"]]
biggest.to_csv("data/biggest_parties.csv", index=False)

towns = (visits.groupby(["from_town", "season"], as_index=False)
               .agg(stays=("entry", "count"), people=("party", "sum"), given=("donation", "sum")))
towns.to_csv("data/towns.csv", index=False)
