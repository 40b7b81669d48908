# hill stations: daily extremes + frost alerts. readings file has messy headers
import pandas as pd
import numpy as np

df = pd.read_csv("data/readings.csv")
df.columns = df.columns.str.strip()
for col in ["station", "status"]:
    df[col] = df[col].str.strip()
df["station"] = df["station"].str.title()
df[["temp_c", "humidity", "wind_kmh"]] = df[["temp_c", "humidity", "wind_kmh"]].apply(pd.to_numeric, errors="coerce")
df["reading_time"] = pd.to_datetime(df["reading_time"], format="%Y-%m-%d %H:%M")
df["status"] = df["status"].str.lower().replace("", np.nan).fillna("unknown")
df = df.dropna(subset=["temp_c"])

stations = pd.read_csv("data/stations.csv")
df = df.merge(stations, on="station", how="left")
df = df.fillna({"humidity": df["humidity"].mean(), "altitude_m": 0})
df["feels_like"] = np.where(df["wind_kmh"] > 20, df["temp_c"] - df["wind_kmh"] / 10,
                            np.where(df["humidity"] > 85, df["temp_c"] - 1, df["temp_c"]))
df["frost"] = df["temp_c"] <= 0
df["day"] = df["reading_time"].dt.date

daily = df.groupby(["station", "day"]).agg(
    tmin=("temp_c", "min"), tmax=("temp_c", "max"), frost_hours=("frost", "sum"),
    wind_max=("wind_kmh", "max")).reset_index()
daily["range"] = daily["tmax"] - daily["tmin"]
daily = daily.query("range > 2 or frost_hours > 0")
daily.to_csv("data/daily.csv", index=False)

windiest = df.loc[df.groupby("station")["wind_kmh"].idxmax(), ["station", "reading_time", "wind_kmh"]]
print(windiest)

stats = df.groupby("station")["temp_c"].describe()
print(stats.round(2))
side = pd.concat([df.groupby("station")["temp_c"].mean().rename("mean_temp"),
                  df.groupby("station")["humidity"].median().rename("median_hum")], axis=1)
side.to_csv("data/side.csv")

alerts = []
for _, row in df[df["feels_like"] < -10].iterrows():
    alerts.append({"station": row["station"], "when": row["reading_time"].strftime("%d %b %H:%M"),
                   "feels": round(row["feels_like"], 1)})
alerts = pd.DataFrame(alerts)
print(alerts.head())
alerts.to_csv("data/alerts.csv", index=False)
print(df["status"].value_counts(normalize=True).round(3).to_dict())
