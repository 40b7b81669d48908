"""Mountain hut network: guest-nights per hut over the summer season, a hut-by-month grid,
and half-board stays that have not been paid yet.

Bookings come from the reservation system as Parquet; the hut register is a CSV
where the unguarded bivouac shelters have 0 beds.
"""
import pandas as pd

stays = pd.read_parquet("data/stays.parquet")
huts = pd.read_csv("data/huts.csv")
print(stays.dtypes)

stays = stays.assign(
    year=stays["arrival"].dt.year,
    month=stays["arrival"].dt.month,
    guest_nights=stays["guests"] * stays["nights"],
)

per_hut = (
    stays.groupby("hut")["guest_nights"]
    .agg(["sum", "mean"])
    .reset_index()
    .rename(columns={"sum": "guest_nights", "mean": "avg_per_stay"})
    .merge(huts, on="hut", how="left")
    .assign(nights_per_bed=lambda d: (d["guest_nights"] / d["beds"]).round(1))
    .drop(columns=["warden"])
    .sort_values(by="guest_nights", ascending=False)
)
per_hut.to_parquet("hut_summary.parquet", index=False)
print(per_hut)

# the accountant wants a wide grid, one column per month
grid = stays.pivot_table(index="hut", columns="month", values="guest_nights", aggfunc="sum", fill_value=0)
grid.reset_index().to_csv("hut_month_grid.csv", index=False)

unpaid = (
    stays[stays["paid_eur"].isna() & stays["half_board"]]
    .merge(huts[["hut", "warden"]], on="hut", how="left")
    .sort_values(by=["arrival", "stay_id"])
    [["stay_id", "hut", "warden", "arrival", "guests", "nights"]]
)
unpaid.to_csv("unpaid_half_board.csv", index=False)
print(len(unpaid), round(stays["paid_eur"].sum(), 2))
