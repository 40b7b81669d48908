"""Lighthouse keepers' log: lamp oil burnt per station, the foggy watches, and who kept them.

Three watches a night (dusk, midnight, dawn). The oil tank is dipped at every watch, but
keepers skip it often ('not read', '--' or blank); the gaps are filled by straight-line
interpolation between readings. Visibility is 'fog' when the keeper could not see the buoy.
"""
import numpy as np
import pandas as pd

WATCHES = {'dusk': 1, 'midnight': 2, 'dawn': 3}
FOG_NM = 2   # below two nautical miles the horn goes on


def tidy_names(s):
    # keepers type their own names, in any case, sometimes with a leading space
    return s.str.strip().str.title()


log = pd.read_csv("data/watch_log.csv", na_values=["not read", "--", "fog"])
stations = pd.read_csv('data/stations.csv')
print("raw lines:", len(log))

log = log.drop_duplicates()
log["station"] = log["station"].str.strip().str.upper()
log['keeper'] = tidy_names(log['keeper'])
log["watch_no"] = log.watch.str.lower().map(WATCHES)
log.fillna({"wind_bft": 0, "remarks": ""}, inplace=True)

# order of the book: station, night, watch
log = log.sort_values(by=["station", "watch_date", "watch_no", "log_id"]).reset_index(drop=True)

# fill the tank dips the keepers skipped
log["oil_est"] = log["oil_litres"].interpolate()
log["oil_est"] = log["oil_est"].round(1)
log["estimated"] = log["oil_litres"].isna()

# --- per station: oil range over the fortnight against the tank size
stations = stations.drop_duplicates(subset="code", keep="first")
per_station = log.groupby("station", as_index=False).agg(
    watches=("log_id", "count"),
    high=("oil_est", "max"),
    low=("oil_est", "min"),
    estimated=("estimated", "sum"),
    mean_wind=("wind_bft", "mean"),
)
per_station = per_station.merge(stations, left_on="station", right_on="code", how="left")
per_station["burn_share"] = (per_station["high"] - per_station["low"]) / per_station["tank_litres"]
per_station["burn_share"] = per_station["burn_share"].round(3)
per_station['mean_wind'] = per_station['mean_wind'].round(2)
per_station = per_station.drop(columns=["code"]).sort_values("burn_share", ascending=False)
per_station.to_csv("station_oil.csv", index=False)

# --- foggy watches, for the harbour master
foggy = log[(log["visibility_nm"] < FOG_NM) | log["visibility_nm"].isna()]
foggy = foggy[["log_id", "station", "watch_date", "watch", "keeper", "visibility_nm", "oil_est", "remarks"]]
foggy = foggy.sort_values(["watch_date", "station", "log_id"])
foggy.to_csv("data/foggy_watches.csv", index=False)

# --- who kept the foggy watches
by_keeper = foggy.groupby(["station", "keeper"]).size().reset_index(name="fog_watches")
by_keeper = by_keeper.sort_values(["fog_watches", "station", "keeper"], ascending=[False, True, True])
print(by_keeper.head(8))
print("estimated dips:", int(log["estimated"].sum()), "of", len(log))
