# orders export (semicolons, amounts with thousands commas) vs regional targets
import pandas as pd
import numpy as np

orders = pd.read_csv("data/orders.csv", sep=";")
orders["amount"] = pd.to_numeric(orders["amount"].str.replace(",", ""), errors="coerce")
orders["placed"] = pd.to_datetime(orders["placed"], format="%d/%m/%Y")
orders["customer"] = orders["customer"].str.strip().str.title().replace("", np.nan)
orders["region"] = orders["region"].replace("", np.nan).fillna("unknown")
orders["month"] = orders["placed"].dt.month
orders["size"] = np.select([orders["amount"] >= 1000, orders["amount"] >= 100], ["large", "medium"], default="small")
orders["ref_no"] = orders["order_ref"].str[1:].astype(int)

monthly = orders.groupby(["region", "month"])["amount"].sum().unstack(fill_value=0)
print(monthly.round(0))
monthly.to_csv("data/monthly.csv")

targets = pd.read_csv("data/targets.csv")
actual = orders.groupby(["region", "month"], as_index=False)["amount"].sum()
check = actual.merge(targets, on=["region", "month"], how="outer", indicator=True)
check["gap"] = check["amount"].fillna(0) - check["target"].fillna(0)
check = check.sort_values(["region", "month"]).reset_index(drop=True)
check.to_csv("data/check.csv", index=False)
print(check["_merge"].value_counts())

by_channel = {}
for channel, frame in orders.groupby("channel"):
    by_channel[channel] = frame["amount"].describe()
summary = pd.DataFrame(by_channel).T
print(summary.round(2))

top = (orders.groupby("customer")["amount"].agg(["sum", "count"])
             .sort_values("sum", ascending=False)
             .head(3))
top.columns = ["total", "orders"]
top.to_csv("data/top.csv")
shares = orders.pivot_table(index="channel", columns="size", values="amount", aggfunc="count", fill_value=0)
shares = shares.div(shares.sum(axis=1), axis=0).round(3)
print(shares)
