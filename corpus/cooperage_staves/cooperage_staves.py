"""Cooperage order book: barrels ordered and delivered, each cooper's run of barrels, leak tests
by wood lot and toast.

Cells pasted from the workshop manager's notebook. The order cards are typed up on Fridays:
'n/a', 'tbc' and 'pending' mean not known yet. An order with no cooper still counts for its
wood lot. A barrel that leaked is rebuilt at the cooperage's cost.
"""
import numpy as np
import pandas as pd

# %%
orders = pd.read_csv("data/orders.csv", na_values=["n/a", "tbc"])
lots = pd.read_csv("data/wood_lots.csv")
print(orders.shape)
print(orders.head())

# %%
orders = orders.drop_duplicates()
orders["client"] = orders["client"].str.strip().str.title()
orders["cooper"] = orders["cooper"].str.strip().str.capitalize()
orders["cooper"] = orders["cooper"].replace({"Eloi": "Éloi"})
orders["wood_lot"] = orders["wood_lot"].str.upper()

# 'ORD/2024/17', 'ord-2024-0017', 'Ord 2024 17' -> 2024-00017
ref = orders["order_ref"].str.upper().str.replace(r"[\s/-]+", "-", regex=True)
ref = ref.str.split("-", n=2, expand=True)
orders["order_no"] = ref[2].astype(int)
orders["order_ref"] = ref[1] + "-" + ref[2].str.lstrip("0").str.pad(5, side="left", fillchar="0")
print(orders[["order_ref", "order_no"]].head())

# %%
orders["ordered"] = pd.to_datetime(orders["ordered"], format="%Y-%m-%d")
delivered = pd.to_datetime(orders["delivered"], format="%Y-%m-%d", errors="coerce")
delivered = delivered.combine_first(pd.to_datetime(orders["delivered"], format="%d/%m/%Y", errors="coerce"))
orders["pending"] = orders["delivered"].str.startswith("pend", na=False) | delivered.isna()
orders["delivered"] = delivered
orders["lead_days"] = (orders["delivered"] - orders["ordered"]).dt.days
orders["lead_days"] = orders["lead_days"].mask(orders["lead_days"] < 0)
orders["order_week"] = orders["ordered"].dt.isocalendar().week.astype(str).str.zfill(2)
orders["order_month"] = orders["ordered"].dt.to_period("M").astype(str)
orders["promised"] = orders["ordered"] + pd.Timedelta(days=45)
orders["late"] = orders["delivered"] > orders["promised"]

# %% barrel size from the description; the toast written many ways
size = orders["barrel"].str.extract(r"(?i)^([a-z-]+)\s*(\d+)?\s*l?$")
orders["barrel_kind"] = size[0].str.lower()
orders["litres"] = size[1].astype(float)
NOMINAL = {"barrique": 225, "hogshead": 300, "puncheon": 500, "demi-muid": 600, "tonneau": 900}
orders["litres"] = orders["litres"].fillna(orders["barrel_kind"].map(NOMINAL))


def toast_level(t):
    if not isinstance(t, str):
        return "unknown"
    t = t.strip().lower()
    if t in ("l", "light"):
        return "light"
    elif t.startswith("m") and ("+" in t or "plus" in t):
        return "medium plus"
    elif t in ("m", "medium"):
        return "medium"
    else:
        return "heavy"


orders["toast"] = orders["toast"].map(toast_level)
orders["toast_minutes"] = orders["toast"].map({"light": 25, "medium": 35, "medium plus": 40, "heavy": 50})

# %% leak tests: 'leak 2 drops', 'WEEP x2 at stave 14', 'pass'
test = orders["leak_test"].str.lower().str.strip()
orders["tested"] = test.notna() & ~test.str.contains("not tested", na=False)
orders["leaked"] = test.str.contains(r"leak|weep", na=False)
orders["leak_marks"] = test.str.findall(r"leak|weep|drop").str.len()
orders["leak_words"] = test.str.count(r"\w+")
orders["leak_spots"] = test.str.extract(r"x(\d)", expand=False).astype(float)
orders.loc[orders["leaked"] & orders["leak_spots"].isna(), "leak_spots"] = 1
orders.loc[~orders["leaked"], "leak_spots"] = 0
orders["test_note"] = orders["leak_test"].str.slice(0, 12)
print(orders[["leak_test", "tested", "leaked", "leak_marks", "leak_spots", "leak_words"]].head(12))

# %% money
orders["price_eur"] = orders["price_eur"].where(orders["price_eur"] > 0)
orders["value_eur"] = orders["price_eur"] * orders["qty"]
orders["eur_per_litre"] = (orders["price_eur"] / orders["litres"]).round(3)
orders["rebuild_eur"] = np.where(orders["leaked"], orders["price_eur"] * 0.35, 0.0)
orders.loc[orders["toast"] == "heavy", "rebuild_eur"] += 20
orders["eur_per_stave"] = orders["price_eur"] / (orders["staves"] - 27)


def label(row):
    if row["pending"]:
        return f"{row['order_ref']}: pending"
    kind = row["barrel_kind"] if isinstance(row["barrel_kind"], str) else "barrel"
    return f"{row['order_ref']}: {kind} {row['lead_days']:.0f} d"


orders["card"] = orders.apply(label, axis=1)

# %% each cooper's run of barrels
orders = orders.sort_values(["cooper", "ordered", "order_no"]).reset_index(drop=True)
orders["staves_filled"] = orders.groupby("cooper")["staves"].ffill()
orders["barrel_no"] = orders.groupby("cooper").cumcount() + 1
orders["days_between"] = orders.groupby("cooper")["ordered"].diff().dt.days
orders["avg_lead"] = (orders.groupby("cooper")["lead_days"]
                      .expanding().mean()
                      .reset_index(level=0, drop=True)
                      .round(1))
orders["leaks_so_far"] = orders.groupby("cooper")["leaked"].cumsum()
print(orders[["cooper", "order_ref", "barrel_no", "staves_filled", "days_between", "avg_lead"]].head(12))

cols = ["order_ref", "card", "client", "cooper", "barrel_no", "barrel_kind", "litres", "toast",
        "toast_minutes", "wood_lot", "ordered", "delivered", "lead_days", "late", "order_week",
        "staves_filled", "leaked", "leak_marks", "leak_spots", "leak_words", "test_note", "value_eur",
        "eur_per_litre", "eur_per_stave", "rebuild_eur", "avg_lead", "leaks_so_far"]
orders[cols].to_csv("data/order_book.csv", index=False)

# %% leak tests by wood lot and toast
lots = lots.drop_duplicates(subset="lot", keep="first")
tests = orders.merge(lots, left_on="wood_lot", right_on="lot", how="left")
tests["forest"] = tests["forest"].fillna("unknown lot")
by_lot = tests[tests["tested"]].groupby(["forest", "toast"]).agg(
    barrels=("order_ref", "count"),
    leaked=("leaked", "sum"),
    spots=("leak_spots", "sum"),
    seasoning=("seasoning_months", "first"),
    rebuild_eur=("rebuild_eur", "sum")).reset_index()
by_lot["leak_rate"] = (by_lot["leaked"] / by_lot["barrels"]).round(3)
by_lot["rebuild_eur"] = by_lot["rebuild_eur"].round(2)
by_lot = by_lot.sort_values(["leak_rate", "forest", "toast"], ascending=[False, True, True])
by_lot.to_csv("data/leaks_by_lot.csv", index=False)
print(by_lot)

# %% each cooper's last two barrels
last = orders.groupby("cooper").tail(2)
last = last[["cooper", "order_ref", "ordered", "leaked", "avg_lead", "leaks_so_far"]]
last.to_csv("data/last_barrels.csv", index=False)
print(last)
