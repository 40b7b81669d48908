# harbour museum ticket office -- weekly numbers for the trustees
# (pasted from the office notebook; cells kept in order)
import math

import numpy as np
import pandas as pd

# %% load
tix = pd.read_csv("data/tickets.csv", na_values=["n/a"])
shows = pd.read_csv("data/exhibitions.csv", na_values=["n/a"])
print(tix.shape)
print(tix.head())

# %% the two tills write their stamps differently: try the new one, then the old day-first one
new_till = pd.to_datetime(tix["sold_at"], format="%Y-%m-%d %H:%M", errors="coerce")
old_till = pd.to_datetime(tix["sold_at"], format="%d/%m/%Y %H:%M", errors="coerce")
tix["sold_at"] = new_till.fillna(old_till)
print("unreadable stamps:", tix["sold_at"].isna().sum())

# %% refs: HM-2024-000123/AD, hm 2024 123 ad, HM2024123 ...
parts = tix["ref"].str.extract(r"(?i)^hm\W*(?P<year>\d{4})\W*(?P<num>\d{1,6})(?:\W*(?P<code>[a-zé]{2}))?$")
tix["ticket_no"] = parts["num"].str.zfill(6)
tix["ref_year"] = pd.to_numeric(parts["year"], errors="coerce")
tix["code"] = parts["code"].str.upper()
print(tix[["ref", "ticket_no", "code"]].head(10))
tix = tix.drop_duplicates()


def clean_kind(df):
    # the desk types whatever it likes
    df["visitor"] = df["visitor"].str.strip().str.lower()
    df["visitor"] = df["visitor"].replace({"étudiant": "student", "famille": "family"})
    df["visitor"] = df["visitor"].fillna("unknown")
    return df


tix = clean_kind(tix)
tix["desk"] = tix["desk"].str.strip().str.capitalize()
tix["lang"] = tix["lang"].str.strip().str.lower().map({"fr": "French", "de": "German", "en": "English", "nl": "Dutch"})

# %% money: vouchers carry their value in the text ("voucher 12")
tix["voucher"] = tix["paid_by"].str.extract(r"voucher\s*(\d+)", expand=False).astype(float)
tix["paid_by"] = tix["paid_by"].str.split(" ", n=1, expand=True)[0].str.lower()
tix["is_voucher"] = tix["paid_by"].str.startswith("vouch", na=False)


def net_price(row):
    if row["price"] != row["price"]:
        return np.nan
    if row["visitor"] in ("child", "student"):
        disc = 0.0
    elif row["party"] >= 4:
        disc = 0.1
    else:
        disc = 0.0
    net = row["price"] * (1 - disc) - (row["voucher"] if row["voucher"] > 0 else 0)
    return round(max(net, 0), 2)


tix["net"] = tix.apply(net_price, axis=1)
tix["per_head"] = tix["net"] / tix["party"]

# %% time of the sale
tix["day"] = tix["sold_at"].dt.normalize()
tix["week"] = tix["sold_at"].dt.isocalendar().week
tix["month"] = tix["sold_at"].dt.to_period("M")
tix["hour"] = tix["sold_at"].dt.hour
tix["slot"] = tix["hour"].map(lambda h: "morning" if h < 12 else ("lunch" if h < 14 else "afternoon"))
tix["month_end"] = tix["sold_at"].dt.is_month_end
tix["leaves_at"] = tix["sold_at"] + pd.to_timedelta(tix["visit_min"], unit="m")
tix["after_close"] = tix["leaves_at"] > tix["day"] + pd.Timedelta(hours=18)
tix["tour_count"] = tix["tours"].str.count(";") + 1
tix.loc[tix["tours"].isna() | (tix["tours"] == "none"), "tour_count"] = 0
tix["lighthouse"] = tix["tours"].str.contains("lighthouse", case=False, na=False)
print(tix.dtypes)

# %% exhibitions on when the ticket was sold
shows["opens"] = pd.to_datetime(shows["opens"], format="%Y-%m-%d")
shows["closes"] = pd.to_datetime(shows["closes"], format="%Y-%m-%d").fillna(pd.Timestamp("2024-12-31"))
shows["days_open"] = (shows["closes"] - shows["opens"]).dt.days + 1
shows["short"] = shows["title"].str.slice(0, 10).str.strip().str.upper()
print(shows)

# one output per desk and week
tix = tix[tix["sold_at"].notna()]
weekly = tix.groupby(["week", "desk"], as_index=False).agg(
    tickets=("ticket_no", "count"), visitors=("party", "sum"), takings=("net", "sum"),
    lighthouse=("lighthouse", "sum"), late=("after_close", "sum"))
weekly["takings"] = weekly["takings"].round(2)
weekly["label"] = weekly.apply(lambda r: f"W{int(r['week']):02d}-{r['desk'][:1]}", axis=1)
weekly = weekly.sort_values(["week", "desk"])
weekly.to_csv("data/weekly_desks.csv", index=False)

# by month and kind
monthly = tix.groupby(["month", "visitor"]).agg(n=("party", "sum"), avg_visit=("visit_min", "mean")).reset_index()
monthly["month"] = monthly["month"].astype(str)
monthly["avg_visit"] = monthly["avg_visit"].apply(lambda m: math.floor(m) if m == m else -1)
monthly.to_csv("data/monthly_visitors.csv", index=False)

# per day: month-end days get flagged for the accountant
daily = tix.groupby("day").agg(net=("net", "sum"), tickets=("ticket_no", "size"), month_end=("month_end", "first")).reset_index()
daily["net"] = daily["net"].round(2)
daily["days_in_month"] = daily["day"].dt.days_in_month
daily["weekday"] = daily["day"].dt.day_name()
daily["busy"] = np.where(daily["tickets"] >= 22, "busy", "quiet")
daily.to_csv("data/daily_takings.csv", index=False)
print(daily.tail())

# refs nobody could read
bad = tix[tix["ticket_no"].isna()][["ref", "sold_at", "desk"]]
bad["ref_len"] = bad["ref"].str.len()
bad = bad.sort_values(["sold_at", "ref"])
bad.to_csv("data/unreadable_refs.csv", index=False)
print(len(bad), "refs unreadable")
