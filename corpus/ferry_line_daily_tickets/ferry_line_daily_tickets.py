"""An island ferry line's March tickets, one file a day, read with Dask: takings per route and
fare class, passengers per day, and the vehicle tickets."""
import dask.dataframe as dd
import pandas as pd

tickets = dd.read_csv("data/tickets-2026-03-*.csv", dtype={"fare": "float64"})
routes = pd.read_csv("data/routes.csv")
routes = routes[routes.season != "winter"]

tickets = tickets.merge(routes, on="route", how="left")
tickets = tickets.assign(
    takings=tickets.fare * tickets.passengers,
    minutes_aboard=tickets.crossing_min * tickets.passengers,
)

per_route = (
    tickets.groupby(["route", "fare_class"], sort=True)
    .agg({"takings": "sum", "passengers": "sum", "ticket": "count", "minutes_aboard": "sum"})
    .reset_index()
)
per_route = per_route.assign(takings_per_head=(per_route.takings / per_route.passengers).round(2))
per_route.compute().to_csv("route_takings.csv", index=False)

per_day = tickets.groupby("day", sort=True).agg({"passengers": "sum", "fare": "mean", "ticket": "count"})
per_day.compute().round(3).to_csv("daily_passengers.csv")

vehicles = tickets[tickets.vehicle.notnull()]
vehicles[["day", "ticket", "route", "route_name", "vehicle", "fare"]].to_csv(
    "vehicle_tickets.csv", single_file=True, index=False
)
