import pandas as pd

loans = pd.read_csv("loans.csv")
popular = loans["title"].value_counts().head(5)
print(popular)
branches = loans["branch"].unique()
print(len(branches), loans["member"].nunique())
per_branch = loans.groupby("branch").size().reset_index(name="loans")
per_branch.to_csv("per_branch.csv", index=False)
