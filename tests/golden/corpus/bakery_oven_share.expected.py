"""Community bakery oven share: flour used against flour brought per member, how full each
oven ran on each day of the week (every oven and day, booked or not), loaf sizes by band and
the breads baked.
"""
import pandas as pd
import polars as pl

# Text that pandas' read_csv reads as a missing value.
PANDAS_NA_VALUES = [
    "", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null",
]


def pandas_div(numerator, divisor):
    """numerator / divisor, each value divided as pandas divides it: Polars multiplies by the
    reciprocal of a single divisor, which can be one binary digit off the quotient (and a later
    round() then goes the other way)."""
    return numerator / (numerator.is_null() * 0 + divisor)


# %%
bookings = pl.scan_csv(
    "data/bookings.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)
deliveries = pl.scan_csv(
    "data/flour_deliveries.csv",
    null_values=PANDAS_NA_VALUES + ["-"],
    infer_schema_length=None,
)
print(
    (bookings.select(pl.len()).collect().item(), len(bookings.collect_schema())),
    (deliveries.select(pl.len()).collect().item(), len(deliveries.collect_schema())),
)

bookings = bookings.collect().to_pandas()
# TODO(porter): frame.labels: pandas code reads the row labels of `bookings` later, which are the
#   original row numbers after a filter or sort: pandas makes it; to port it, keep the row number as
#   a column (with_row_index) where the frame is read and use that column where the labels are read
bookings = bookings.drop_duplicates(subset=["booking_id"])
bookings["baker"] = bookings["baker"].str.strip().str.title()
bookings["oven"] = bookings["oven"].str.strip()
bookings = bookings.dropna(subset=["baker"])
deliveries = (
    deliveries
    .with_columns(
        flour=pl.col("flour").str.replace_many({"İ": "i", "Σ": "σ"}).str.to_lowercase(),
    )
    .collect()
    .lazy()
)
print(
    deliveries.select(pl.col("flour"))
    .drop_nulls()
    .group_by("flour", maintain_order=True)
    .agg(pl.len().cast(pl.Int64).alias("count"))
    .select(
        pl.col("flour"),
        pandas_div(pl.col("count"), pl.col("count").sum()).alias("proportion"),
    )
    .sort("proportion", descending=True, maintain_order=True)
    .collect(),
)


def kg_table(frame, who):
    out = frame.groupby(who, as_index=False)["kg"].sum()
    return out


# %% flour used against flour brought
used = kg_table(bookings, "baker")
# TODO(porter): handover.unknown_code: passed to code porter does not understand: handed over to
#   pandas with .collect().to_pandas(); port that code to take a Polars frame
brought = kg_table(deliveries.collect().to_pandas().dropna(subset=["member"]), "member")
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
ovens = pl.LazyFrame(
    {"oven": ["wood", "deck", "small", "clay"], "capacity": [40, 24, 12, 0]},
)
days = pl.LazyFrame({"day": ["Mon", "Tue", "Wed", "Thu", "Fri", "Sat", "Sun"]})
grid = ovens.join(days, how="cross", maintain_order="left_right")
load = bookings.groupby(["oven", "day"], as_index=False).agg(
    loaves=("loaves", "sum"), booked=("booking_id", "count"))
# TODO(porter): frame.merge: the right side is not a frame porter tracks: make it a LazyFrame
#   (pl.from_pandas(...).lazy()) where it is built
grid = grid.collect().to_pandas().merge(
    load,
    on=["oven", "day"],
    how="left",
    validate="1:1",
)
grid[["loaves", "booked"]] = grid[["loaves", "booked"]].fillna(0)
grid["fill"] = (grid["loaves"] / grid["capacity"]).round(3)
idle = grid[grid["booked"] == 0]
print(len(idle), "oven-days with no booking")
grid.to_csv("data/oven_days.csv", index=False)

# %% loaf sizes by band
# TODO(porter): pd.qcut: cutting something other than a column; pl.when(v <= v.quantile(p,
#   "linear")) per bin, cast to pl.Enum(labels)
bookings["size"] = pd.qcut(bookings["loaves"], 3, labels=["few", "some", "many"])
by_size = bookings.groupby("size", observed=True).agg(bookings=("booking_id", "count"), kg=("kg", "mean"))
by_size["kg"] = by_size["kg"].round(2)
by_size = by_size.sort_index(ascending=False)
print(by_size)

# %% breads baked, per oven
breads = bookings[["booking_id", "oven", "breads"]].copy()
breads["bread"] = breads["breads"].str.split("|")
breads = breads.explode("bread").dropna(subset=["bread"])
# TODO(porter): pd.get_dummies: get_dummies of something other than a frame or column porter tracks;
#   collect, then pl.col(c).eq_missing(v).alias(f"{c}_{v}") for each sorted category v
per_oven = pd.get_dummies(breads[["oven", "bread"]], columns=["bread"], dtype=int)
per_oven = per_oven.groupby("oven").sum()
# TODO(porter): handover.unknown_code: passed to code porter does not understand: handed over to
#   pandas with .collect().to_pandas(); port that code to take a Polars frame
per_oven = per_oven.join(ovens.collect().to_pandas().set_index("oven"), how="left")
per_oven = per_oven.reset_index()
per_oven.to_csv("data/breads_per_oven.csv", index=False)
print(per_oven)
