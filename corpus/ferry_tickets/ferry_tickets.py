"""Ferry line: tidy the June ticket log, then revenue per route, fare-class counts and weekend sailings.

Ticket numbers keep their leading zeros; '?' in the fare class means the
clerk could not read the stub.
"""
import pandas as pd

VEHICLE_FEE = {"yes": 12.5, "no": 0.0}

tickets = pd.read_csv("data/tickets.csv", dtype={"ticket_no": str}, na_values=["?"])
routes = pd.read_csv("data/routes.csv")
print(tickets.dtypes)

tickets.rename(columns={"Sail Date": "sail_date", "Route": "route_code", "Fare Class": "fare_class"}, inplace=True)
tickets.drop(columns=["paid_by"], inplace=True)
tickets.fillna({"fare_class": "unknown", "vehicle": "no"}, inplace=True)

tickets["route_code"] = tickets["route_code"].str.strip().str.upper()
tickets["fare_class"] = tickets["fare_class"].str.lower()
tickets["vehicle"] = tickets["vehicle"].str.strip().str.lower()
tickets["vehicle_fee"] = tickets["vehicle"].map(VEHICLE_FEE)
tickets["revenue"] = tickets["passengers"] * tickets["fare"] + tickets["vehicle_fee"]
tickets["sail_date"] = pd.to_datetime(tickets["sail_date"], format="%Y-%m-%d")
tickets["weekday"] = tickets["sail_date"].dt.dayofweek

tickets.sort_values(by=["sail_date", "ticket_no"], inplace=True)
tickets.reset_index(drop=True, inplace=True)
print(tickets.head())

per_route = tickets.groupby("route_code").agg({"passengers": "sum", "revenue": "sum", "fare": "mean"}).reset_index()
per_route = per_route.merge(routes, on="route_code", how="left")
per_route["revenue_per_seat"] = (per_route["revenue"] / per_route["seats"]).round(2)
per_route.to_parquet("route_summary.parquet", index=False)

class_counts = tickets["fare_class"].value_counts().reset_index()
class_counts.to_csv("fare_classes.csv", index=False)

weekend = tickets[tickets["weekday"] >= 5]
weekend[["ticket_no", "sail_date", "route_code", "passengers", "revenue"]].to_csv("weekend_sailings.csv", index=False)
print(len(weekend), tickets["revenue"].sum())
