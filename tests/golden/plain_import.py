import pandas

landings = pandas.read_csv("landings.csv", na_values=["-"])
landings = landings.dropna(subset=["kg"])
by_boat = landings.groupby("boat", as_index=False)["kg"].sum()
print(by_boat)
