"""Puppet theatre ticket desk: one line per show for the director, the busy shows, and the till mix.

'comp' in the price column is a complimentary ticket (free); '?' as payment means the volunteer
did not note it. Two tickets were scanned twice. Show S05 has no capacity entered yet (0), and
somebody sold tickets for S09, which is not in the programme.
"""
import numpy as np
import pandas as pd

sales = pd.read_csv("data/sales.csv", na_values=["comp", "?"])
shows = pd.read_csv('data/shows.csv', parse_dates=["show_date"])

sales = sales.drop_duplicates(subset="sale_id")
sales["show_id"] = sales["show_id"].str.strip().str.upper()
sales["seat_zone"] = sales.seat_zone.str.strip().str.lower()
sales.fillna({"price_each": 0.0, "payment": "unknown"}, inplace=True)   # comps are free
sales["payment"] = sales["payment"].str.lower()
sales["takings"] = sales["tickets"] * sales["price_each"]


def show_summary(g):
    # one row per show for the director's Monday sheet
    sold = g["tickets"].sum()
    loge = g.loc[g["seat_zone"] == "loge", "tickets"].sum()
    return pd.Series({
        "tickets": sold,
        "takings": g["takings"].sum(),
        "zones": g["seat_zone"].nunique(),
        "biggest_party": g["tickets"].max(),
        "loge_share": loge / sold if sold > 0 else np.nan,
    })


per_show = sales.groupby("show_id").apply(show_summary).reset_index()
per_show = per_show.merge(shows, on="show_id", how="left")
per_show["fill_rate"] = per_show["tickets"] / per_show["capacity"]    # S05: capacity 0
per_show['takings'] = per_show['takings'].round(2)
per_show["loge_share"] = per_show["loge_share"].round(3)
per_show = per_show.sort_values(["fill_rate", "show_id"], ascending=[False, True])
per_show.to_csv("show_report.csv", index=False)

busy = per_show[per_show.fill_rate >= 0.5][["show_id", "title", "show_date", "tickets", "fill_rate"]]
busy.to_csv("data/busy_shows.csv", index=False)

# same title on two dates: add them up
per_title = per_show.groupby("title", dropna=False).agg(shows=("show_id", "count"), tickets=("tickets", "sum"), takings=("takings", "sum"))
per_title = per_title.reset_index().sort_values("tickets", ascending=False)
print(per_title)

# till mix, for the treasurer
till = sales.groupby(["payment", "seat_zone"], as_index=False)["takings"].sum()
till = till[till["takings"] > 0]
till["takings"] = till["takings"].round(2)
till.sort_values(["payment", "takings"], ascending=[True, False]).to_csv("till_mix.csv", index=False)
print("comps given:", (sales["price_each"] == 0).sum())
