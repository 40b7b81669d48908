# community radio -- play log for the music rights return and the volunteers' rota
# copied out of the station notebook, run from the station PC
import numpy as np
import pandas as pd

plays = pd.read_csv("data/plays.csv", na_values=["n/a", "?"])
people = pd.read_csv("data/presenters.csv", na_values=["n/a"])
print(plays.head(3))
plays = plays.drop_duplicates()

# the old desk writes 01.03.2024 21:04, the new one ISO with seconds
aired = pd.to_datetime(plays["aired"], format="%Y-%m-%d %H:%M:%S", errors="coerce")
aired = aired.fillna(pd.to_datetime(plays["aired"], format="%d.%m.%Y %H:%M", errors="coerce"))
plays["aired"] = aired
print("not understood:", plays["aired"].isna().sum())

# "Artist - Title (feat. X)"; a phone types an en dash
plays["track"] = plays["track"].str.replace("–", "-", regex=False)
bits = plays["track"].str.split(" - ", n=1, expand=True)
plays["artist"] = bits[0].str.strip().str.title()
plays["title"] = bits[1].str.strip().str.capitalize()
plays.loc[bits[1].isna(), "artist"] = np.nan
plays.loc[bits[1].isna(), "title"] = bits[0].str.capitalize()
plays["feat"] = plays["title"].str.extract(r"\(feat\. ([^)]+)\)", expand=False)
plays["live"] = plays["title"].str.contains(r"\(live\)", regex=True, na=False)
plays["edit"] = plays["title"].str.endswith("edit", na=False) | plays["title"].str.endswith("Edit", na=False)


# lengths: 3:45, 245s, 1:02:03
def seconds(t):
    if not isinstance(t, str):
        return np.nan
    if t.endswith("s"):
        return float(t[:-1])
    parts = t.split(":")
    if len(parts) == 3:
        return int(parts[0]) * 3600 + int(parts[1]) * 60 + int(parts[2])
    return int(parts[0]) * 60 + int(parts[1])


plays["secs"] = plays["length"].map(seconds)
plays["dur"] = pd.to_timedelta(plays["secs"], unit="s")
plays["ends"] = plays["aired"] + plays["dur"]
plays["overrun"] = plays["secs"] > 600
plays["mins"] = plays["secs"].apply(lambda s: int(np.ceil(s / 60)) if s == s else 0)

plays["presenter"] = plays["presenter"].str.strip().str.upper()
plays["show"] = plays["show"].str.title()
plays["req"] = plays["request_from"].str.strip().str.upper()
plays["requested"] = plays["req"].isin(["FR", "DE", "PT", "GB"])
plays["country"] = plays["req"].map({"FR": "France", "DE": "Germany", "PT": "Portugal"}).fillna("-")

plays["day"] = plays["aired"].dt.normalize()
plays["dow"] = plays["aired"].dt.dayofweek
plays["week"] = plays["aired"].dt.to_period("W").astype(str)
plays["night"] = plays["aired"].dt.hour.map(lambda h: h >= 22 or h < 6)
print(plays.dtypes)

# -- the rights return: one row per artist and title
ret = plays.dropna(subset=["aired"]).groupby(["artist", "title"], dropna=False).agg(
    plays=("play_id", "count"), seconds=("secs", "sum"), listeners=("listeners", "sum"),
    first=("aired", "min"), last=("aired", "max")).reset_index()
ret["span_days"] = (ret["last"] - ret["first"]).dt.days
ret["avg_len"] = (ret["seconds"] / ret["plays"]).round(1)
ret["code"] = ret["artist"].fillna("unknown").str.slice(0, 3).str.upper() + "-" + ret["plays"].astype(str).str.zfill(3)
ret = ret.sort_values(["plays", "artist", "title"], ascending=[False, True, True])
ret.to_csv("data/rights_return.csv", index=False)
print(ret.head(10))

# -- every day of the period, with the days nothing was logged
days = pd.DataFrame({"day": pd.date_range("2024-02-26", "2024-04-06", freq="D")})
per_day = plays.groupby("day").agg(n=("play_id", "size"), secs=("secs", "sum"), nights=("night", "sum")).reset_index()
per_day = days.merge(per_day, on="day", how="left")
per_day["n"] = per_day["n"].fillna(0).astype(int)
per_day["hours"] = (per_day["secs"] / 3600).round(2)
per_day["weekend"] = per_day["day"].dt.dayofweek >= 5
per_day["month_end"] = per_day["day"].dt.is_month_end
per_day.to_csv("data/days.csv", index=False)

# -- presenters: licence renewal from the day they joined
people["initials"] = people["initials"].str.upper()
people["joined"] = pd.to_datetime(people["joined"], format="%Y-%m-%d")
people["renew"] = people["joined"] + pd.DateOffset(months=12)
rota = plays.groupby("presenter", dropna=False).agg(plays=("play_id", "count"), last_on=("aired", "max")).reset_index()
rota = rota.merge(people, left_on="presenter", right_on="initials", how="left")
rota["late"] = rota["last_on"] > rota["renew"]
rota["label"] = rota.apply(lambda r: f"{r['name']} ({r['plays']})" if isinstance(r["name"], str) else "?", axis=1)
rota = rota.drop(columns=["initials"])
rota.to_csv("data/rota.csv", index=False)
print(rota)
