"""Seattle weather (vega_datasets package, local data): rain per month and the kinds of days."""
import pandas as pd

weather = pd.read_csv("seattle-weather.csv")
weather["date"] = pd.to_datetime(weather["date"], format="%Y/%m/%d")
weather["year"] = weather["date"].dt.year
weather["month"] = weather["date"].dt.month
weather["range"] = weather["temp_max"] - weather["temp_min"]

monthly = weather.groupby(["year", "month"], as_index=False).agg(
    rain_mm=("precipitation", "sum"), wettest=("precipitation", "max"), days=("date", "count")
)
monthly.to_csv("monthly.csv", index=False)

kinds = weather["weather"].value_counts()
kinds.to_csv("kinds.csv")

windy = weather[weather["wind"] >= 7].nlargest(10, "wind")
windy[["date", "wind", "weather"]].to_csv("windiest.csv", index=False)

days = len(weather)
wet_share = (weather["precipitation"] > 0).mean()
print(days, round(wet_share, 4))
