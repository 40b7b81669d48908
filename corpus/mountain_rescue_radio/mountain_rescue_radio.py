"""Mountain rescue base station: what the radio log says about each call-out.

One line per message. The logger writes Unix seconds (UTC); the debrief wants local time.
Positions come in the team's shorthand: "POS 4612/0759 ALT 2350 CAS 2 ankle".
"""
import numpy as np
import pandas as pd

PRIORITY = {"mayday": 1, "cas": 2, "pos": 3}
TEAMS = {"team 1": "T1", "team1": "T1", "team 2": "T2", "heli": "H", "héli-2": "H", "base": "B"}


def tidy(log):
    log["call"] = log["call"].str.strip().str.lower()
    log["unit"] = log["call"].map(TEAMS)
    log["operator"] = log["operator"].str.strip().str.title()
    log["channel"] = log["channel"].str.zfill(2)
    # r24-33 -> R-24-033
    log["incident"] = log["incident"].str.upper().str.replace(r"^R-?(\d\d)-?(\d+)$", r"R-\1-\2", regex=True)
    num = log["incident"].str.split("-", n=2, expand=True)
    log["incident"] = "R-" + num[1] + "-" + num[2].str.pad(3, fillchar="0")
    return log


log = pd.read_csv("data/radio_log.csv", na_values=["n/a", "?"], dtype={"channel": str})
inc = pd.read_csv("data/incidents.csv", na_values=["n/a"])
print(log.shape, inc.shape)
log = log.drop_duplicates(subset=["msg_id"])
log = tidy(log)

log["at"] = pd.to_datetime(log["logged"], unit="s")
log["at"] = log["at"].dt.tz_localize("UTC").dt.tz_convert("Europe/Vienna")
log["local_day"] = log["at"].dt.strftime("%Y-%m-%d")
log["hour"] = log["at"].dt.hour
print(log[["logged", "at", "local_day"]].head())

# message shorthand
txt = log["text"]
log["is_pos"] = txt.str.startswith("POS") | txt.str.startswith("pos")
pos = txt.str.extract(r"(?i)pos\s+(?P<lat>\d{4})/(?P<lon>\d{4})(?:\s+alt\s+(?P<alt>\d+))?")
log["lat"] = pos["lat"].str.slice(0, 2).astype(float) + pos["lat"].str.slice(2).astype(float) / 60
log["lon"] = pos["lon"].str.slice(0, 2).astype(float) + pos["lon"].str.slice(2).astype(float) / 60
log["alt"] = pd.to_numeric(pos["alt"], errors="coerce")
log["casualties"] = txt.str.extract(r"(?i)cas\s+(\d+)", expand=False).astype(float)
log["mayday"] = txt.str.contains("mayday", case=False, na=False)
log["numbers"] = txt.str.findall(r"\d+").str.len()
log["words"] = txt.str.count(r"\s+") + 1
log["last_word"] = txt.str.split(" ").str.get(-1).str.capitalize()
log["eta"] = txt.str.extract(r"(?i)eta\s+(\d+)\s*min", expand=False).astype(float)
log["eta_h"] = txt.str.extract(r"(?i)eta\s+(\d+)h(\d+)", expand=True)[0].astype(float)
log.loc[log["eta_h"].notna(), "eta"] = log["eta_h"] * 60 + 20


def band(alt):
    if alt != alt:
        return "unknown"
    elif alt >= 3000:
        return "high"
    elif alt >= 2000:
        return "alpine"
    return "valley"


log["band"] = log["alt"].apply(band)
log["kind"] = txt.map(lambda t: "mayday" if isinstance(t, str) and "mayday" in t.lower() else ("pos" if isinstance(t, str) and t[:3].lower() == "pos" else "other"))
log["priority"] = log["kind"].map(PRIORITY).fillna(9).astype(int)
log["text_len"] = txt.str.len()
print(log["band"].value_counts())

# incidents: how long each stayed open, from the hand-typed sheet
inc = inc.drop_duplicates()
inc["opened"] = pd.to_datetime(inc["opened"], format="%Y-%m-%d %H:%M")
inc["closed"] = pd.to_datetime(inc["closed"], format="%Y-%m-%d %H:%M", errors="coerce")
inc["closed"] = inc["closed"].fillna(inc["opened"] + pd.Timedelta(hours=12))
inc["open_for"] = inc["closed"] - inc["opened"]
inc["hours"] = (inc["open_for"].dt.total_seconds() / 3600).round(2)
inc["whole_days"] = inc["open_for"].dt.days
inc["per_crew"] = inc["hours"] / inc["crew"]
inc["place"] = inc["place"].str.title()
inc["tag"] = inc["place"].str.slice(0, 4).str.upper() + "-" + inc["incident"].str.slice(-3)
print(inc)

# --- what each incident heard on the radio
per_inc = log.groupby("incident", as_index=False).agg(
    msgs=("msg_id", "count"), maydays=("mayday", "sum"), positions=("is_pos", "sum"),
    highest=("alt", "max"), casualties=("casualties", "max"), words=("words", "sum"))
per_inc = per_inc.merge(inc[["incident", "hours", "whole_days", "per_crew", "tag"]], on="incident", how="left")
per_inc["msgs_per_hour"] = (per_inc["msgs"] / per_inc["hours"]).round(3)
per_inc.to_csv("data/incident_radio.csv", index=False)
print(per_inc)

# --- positions for the map, local time as text
pts = log[log["lat"].notna()][["msg_id", "incident", "unit", "local_day", "hour", "lat", "lon", "alt", "band"]]
pts["lat"] = pts["lat"].round(4)
pts["lon"] = pts["lon"].round(4)
pts["label"] = pts.apply(lambda r: f"{r['incident']}/{r['msg_id']}" if r["alt"] == r["alt"] else "no alt", axis=1)
pts = pts.sort_values(["incident", "local_day", "hour", "msg_id"], na_position="first")
pts.to_csv("data/positions.csv", index=False)

# --- operators' day by day load
load_ = log.groupby(["local_day", "operator"]).agg(n=("msg_id", "size"), long_msgs=("text_len", lambda s: (s > 30).sum())).reset_index()
load_["share"] = load_["n"] / load_.groupby("local_day")["n"].transform("sum")
load_["share"] = load_["share"].round(4)
load_.to_csv("data/operator_load.csv", index=False)
print(load_.head(12))
print("messages without a time:", log["at"].isna().sum())
