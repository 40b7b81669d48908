# ferry sailings - weekly operator figures, slow crossings, crew leads
import pandas as pd
import numpy as np

df = pd.read_csv("data/sailings.csv")
routes = pd.read_csv("data/routes.csv")

df.drop_duplicates(subset="sailing_id", keep="last", inplace=True)
df["departed"] = pd.to_datetime(df["departed"], format="%d/%m/%Y %H:%M", errors="coerce")
df["arrived"] = pd.to_datetime(df["arrived"], format="%d/%m/%Y %H:%M", errors="coerce")
df = df[df.departed.notnull()]
df["crossing_min"] = (df["arrived"] - df["departed"]).dt.total_seconds() / 60
df["weather"] = df["weather"].str.strip().str.lower().fillna("unknown")
df["crew_lead"] = df["crew_lead"].str.strip().str.title()
df["pax"] = df["pax"].fillna(df.groupby("route")["pax"].transform("median"))
df["load"] = np.select([df.pax > 120, df.pax > 60], ["full", "busy"], default="light")
df["fare_gbp"] = df["fare_gbp"].ffill()
df["revenue"] = df.pax * df.fare_gbp
df["week"] = df["departed"].dt.isocalendar().week
df["hour_band"] = pd.cut(df["departed"].dt.hour, bins=[0, 6, 12, 18, 24], right=False,
                         labels=["night", "morning", "afternoon", "evening"])

df = df.merge(routes, on="route", how="left", indicator=True)
print(df["_merge"].value_counts())
df["pax_per_mile"] = df["pax"] / df["miles"]

weekly = df.groupby(["week", "operator"]).agg({"revenue": "sum", "pax": "mean", "sailing_id": "count"})
weekly.columns = ["revenue", "avg_pax", "sailings"]
weekly = weekly.reset_index()
weekly["revenue_share"] = weekly["revenue"] / weekly.groupby("week")["revenue"].transform("sum")
weekly["rev_change"] = weekly.groupby("operator")["revenue"].pct_change()
weekly.round(3).to_csv("data/weekly.csv", index=False)

slow = df.loc[df["crossing_min"] > df.groupby("route")["crossing_min"].transform("mean") * 1.3,
              ["sailing_id", "route", "departed", "crossing_min", "weather"]]
slow = slow.sort_values("crossing_min", ascending=False)
slow.to_csv("data/slow_crossings.csv", index=False)

leads = df.groupby("crew_lead").agg(sailings=("sailing_id", "nunique"), pax=("pax", "sum"),
                                    worst=("crossing_min", "max")).sort_values("pax", ascending=False)
leads["rank"] = leads["pax"].rank(method="min", ascending=False)
print(leads.head(10))
leads.to_csv("data/leads.csv")

bands = pd.pivot_table(df, index="hour_band", columns="load", values="pax", aggfunc="sum", fill_value=0)
print(bands)
bands.to_csv("data/bands.csv")

df["rolling_pax"] = df.sort_values("departed").groupby("route")["pax"].transform(lambda s: s.rolling(5, min_periods=1).mean())
top = df.nlargest(5, "revenue")[["sailing_id", "route", "revenue"]]
print(top.to_string(index=False))
weather_share = df["weather"].value_counts(normalize=True).round(3)
print(weather_share)
