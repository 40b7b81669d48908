"""Ropewalk order book: what each customer ordered and owes, the rope weight per fibre for the
carter, and the orders whose length nobody could read.

Lengths come in as the customer wrote them: '120 m', '30 fathoms', '400 ft', '2 km', a decimal
comma ('45,5 m'), a bare number (metres), or 'tbc' / '??'. They are turned into metres by a
small parser; anything it cannot read stays missing and goes on the query list.
"""
import pandas as pd

# metres per unit; the longer spellings first so 'fathoms' is not read as 'm'
UNITS = [("fathoms", 1.8288), ("fathom", 1.8288), ("ft", 0.3048), ("km", 1000.0), ("m", 1.0)]


def to_metres(text):
    if not isinstance(text, str):   # a blank is read as NaN
        return None
    t = str(text).strip().lower().replace(",", ".")
    factor = 1.0
    for unit, per in UNITS:
        if t.endswith(unit):
            t = t[: -len(unit)].strip()
            factor = per
            break
    try:
        return round(float(t) * factor, 2)
    except ValueError:
        return None


def normalise(s):
    return s.str.strip().str.lower()


orders = pd.read_csv("data/orders.csv", dtype={"order_no": str}, na_values=["??", "tbc"],
                     parse_dates=["ordered_on"])
fibres = pd.read_csv("data/fibres.csv")
print("order lines:", len(orders))

repeats = orders.duplicated(subset="order_no").sum()
print("order numbers used twice:", repeats)
orders["fibre"] = normalise(orders["fibre"])
orders["status"] = orders.status.str.strip().str.lower()
orders["customer"] = orders["customer"].str.strip().str.title()
orders = orders[orders["status"] != "cancelled"]

orders["metres"] = orders["length"].apply(to_metres)

unread = orders[orders["metres"].isna()][["order_no", "customer", "length"]]
unread.to_csv("lengths_to_query.csv", index=False)
print(f"{len(unread)} orders without a readable length")

# the fibre list has hemp twice (the new supplier): keep the first price
fibres = fibres.drop_duplicates(subset=["fibre"])
priced = orders.merge(fibres, on="fibre", how="left")
priced["value"] = (priced["metres"] * priced["price_per_m"]).round(2)
priced["kg"] = priced["metres"] / 100 * priced["kg_per_100m"]
priced["metres_per_kg"] = priced["metres"] / priced["kg"]
priced["is_open"] = priced["status"] == "open"
priced["month"] = priced["ordered_on"].dt.month

# --- per customer
per_customer = priced.groupby("customer").agg(orders=("order_no", "count"), metres=("metres", "sum"),
                                              value=("value", "sum"), open_orders=("is_open", "sum"))
per_customer = per_customer.reset_index().sort_values(["value", "customer"], ascending=[False, True])
per_customer["value"] = per_customer["value"].round(2)
per_customer["metres"] = per_customer["metres"].round(2)
per_customer.to_csv("customer_totals.csv", index=False)

# --- per fibre and month, for the carter
loads = priced.groupby(["fibre", "month"], dropna=False)[["kg", "metres"]].sum().reset_index()
loads["kg"] = loads["kg"].round(1)
loads["metres"] = loads["metres"].round(2)
loads.to_csv("fibre_loads.csv", index=False)

print(priced[["metres", "kg", "metres_per_kg"]].describe().round(2))
