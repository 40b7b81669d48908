"""Community bakery oven share: flour used against flour brought per member, how full each
oven ran on each day of the week (every oven and day, booked or not), loaf sizes by band and
the breads baked.
"""
import pandas as pd

# %%
bookings = pd.read_csv("data/bookings.csv")
deliveries = pd.read_csv("data/flour_deliveries.csv", na_values=["-"])
print(bookings.shape, deliveries.shape)

bookings = bookings.drop_duplicates(subset=["booking_id"])
bookings["baker"] = bookings["baker"].str.strip().str.title()
bookings["oven"] = bookings["oven"].str.strip()
bookings = bookings.dropna(subset=["baker"])
deliveries["flour"] = deliveries["flour"].str.lower()
print(deliveries["flour"].value_counts(normalize=True))


def kg_table(frame, who):
    out = frame.groupby(who, as_index=False)["kg"].sum()
    return out


# %% flour used against flour brought
used = kg_table(bookings, "baker")
brought = kg_table(deliveries.dropna(subset=["member"]), "member")
balance = used.merge(brought, left_on="baker", right_on="member", how="outer",
                     suffixes=("_used", "_brought"), indicator=True)
print(balance["_merge"].value_counts())
never_brought = balance[balance["_merge"] == "left_only"]
print("baked without bringing flour:", never_brought["baker"].tolist())
balance["name"] = balance["baker"].fillna(balance["member"])
balance["owed_kg"] = (balance["kg_used"].fillna(0) - balance["kg_brought"].fillna(0)).round(2)
balance = balance[["name", "kg_used", "kg_brought", "owed_kg", "_merge"]].sort_values("owed_kg", ascending=False)
balance.to_csv("data/flour_balance.csv", index=False)
worst = balance.loc[balance["owed_kg"].idxmax(), "name"]
print("owes the most flour:", worst)

# %% every oven on every day, booked or not
ovens = pd.DataFrame({"oven": ["wood", "deck", "small", "clay"], "capacity": [40, 24, 12, 0]})
days = pd.DataFrame({"day": ["Mon", "Tue", "Wed", "Thu", "Fri", "Sat", "Sun"]})
grid = ovens.merge(days, how="cross")
load = bookings.groupby(["oven", "day"], as_index=False).agg(
    loaves=("loaves", "sum"), booked=("booking_id", "count"))
grid = grid.merge(load, on=["oven", "day"], how="left", validate="1:1")
grid[["loaves", "booked"]] = grid[["loaves", "booked"]].fillna(0)
grid["fill"] = (grid["loaves"] / grid["capacity"]).round(3)
idle = grid[grid["booked"] == 0]
print(len(idle), "oven-days with no booking")
grid.to_csv("data/oven_days.csv", index=False)

# %% loaf sizes by band
bookings["size"] = pd.qcut(bookings["loaves"], 3, labels=["few", "some", "many"])
by_size = bookings.groupby("size", observed=True).agg(bookings=("booking_id", "count"), kg=("kg", "mean"))
by_size["kg"] = by_size["kg"].round(2)
by_size = by_size.sort_index(ascending=False)
print(by_size)

# %% breads baked, per oven
breads = bookings[["booking_id", "oven", "breads"]].copy()
breads["bread"] = breads["breads"].str.split("|")
breads = breads.explode("bread").dropna(subset=["bread"])
per_oven = pd.get_dummies(breads[["oven", "bread"]], columns=["bread"], dtype=int)
per_oven = per_oven.groupby("oven").sum()
per_oven = per_oven.join(ovens.set_index("oven"), how="left")
per_oven = per_oven.reset_index()
per_oven.to_csv("data/breads_per_oven.csv", index=False)
print(per_oven)
