"""Lighthouse stores ledger: the keepers' issues of stores cleaned, each month's issues, each
store's totals and each keeper's last issue (a pandas 1.x notebook, written for pandas 1.5: see
reference.txt).

A blank keeper is the keeper of the line above; 'N/A' unit costs were not priced yet.
"""
import pandas as pd

led = pd.read_csv("data/ledger.csv", parse_dates=[["day", "time"]], na_values=["N/A"])
led.rename(columns={"day_time": "logged_at"}, inplace=True)
led.drop_duplicates(subset=["entry"], inplace=True)
led["keeper"] = led["keeper"].fillna(method="ffill")
led[["store", "keeper"]] = led[["store", "keeper"]].applymap(lambda s: s.strip().title())

blanks = {}
for name, values in led.iteritems():
    blanks[name] = int(values.isna().sum())
print("blank per column:", blanks)

led["cost"] = (led["qty"] * led["unit_cost"]).round(2)
led.sort_values(["logged_at", "entry"], inplace=True)
led.to_csv("data/ledger_clean.csv", index=False)

monthly = led.groupby(pd.Grouper(key="logged_at", freq="M"))[["qty", "cost"]].sum().reset_index()
monthly.to_csv("data/monthly.csv", index=False)

stores = pd.DataFrame()
for store, rows in led.groupby("store"):
    stores = stores.append({"store": store, "issues": len(rows), "qty": rows["qty"].sum(),
                            "cost": rows["cost"].sum()}, ignore_index=True)
stores["cost_per_unit"] = (stores["cost"] / stores["qty"]).round(2)
stores.to_csv("data/stores.csv", index=False)

last = led.groupby("keeper").apply(lambda g: g.tail(1)).reset_index(drop=True)
last = last[["keeper", "entry", "logged_at", "store", "qty"]]
last.to_csv("data/last_by_keeper.csv", index=False)
