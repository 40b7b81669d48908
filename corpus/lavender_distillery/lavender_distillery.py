"""Lavender distillery still log: oil yield of each batch against the variety's usual yield,
each still's run through the season, and the operators' weeks.

The distillery's own script, run after harvest. Whoever runs the still fills in the log:
'n/a' or 'wet' mean the flowers were not weighed. A batch with no still still counts in the
week's oil. Batch numbers are typed three ways ('LD-0042', 'ld 42', 'LD42').
"""
import numpy as np
import pandas as pd

SEASON_START = pd.Timestamp("2025-06-23")
HEAD_LIMIT = 100.0        # above this the oil scorches
DENSITY = 0.89            # g/ml, lavender oil
MISSING = ["n/a", "wet"]


def tidy_names(df):
    df["still"] = df["still"].str.strip().str.lower()
    df["operator"] = df["operator"].str.strip().str.title()
    df["variety"] = df["variety"].str.strip().str.lower()
    return df


def quality(row_pct):
    if row_pct != row_pct:
        return "unknown"
    elif row_pct >= 1.1:
        return "rich"
    elif row_pct >= 0.9:
        return "normal"
    else:
        return "thin"


log = pd.read_csv("data/still_log.csv", na_values=MISSING)
varieties = pd.read_csv("data/varieties.csv")
print(log.shape)
print(log.dtypes)

log = tidy_names(log)
log = log.drop_duplicates()
print("after dropping repeats:", len(log))

# batch number: 'LD-0042' / 'ld 42' / 'LD42' -> 'LD-0042'
num = log["batch"].str.extract(r"(?i)^(ld)[\s-]?(\d+)$")
log["batch"] = num[0].str.upper() + "-" + num[1].str.zfill(4)
log["batch_no"] = num[1].astype(int)

# two ways of writing the start
started = pd.to_datetime(log["started"], format="%Y-%m-%d %H:%M", errors="coerce")
started = started.fillna(pd.to_datetime(log["started"], format="%d.%m.%Y %H:%M", errors="coerce"))
log["started"] = started
print("no start:", log["started"].isna().sum())
log = log[log["started"].notna()]
log["day"] = log["started"].dt.normalize()
log["season_day"] = (log["day"] - SEASON_START).dt.days + 1
log["week"] = log["started"].dt.isocalendar().week
log["steam_min"] = log["steam_min"].fillna(60)
log["ended"] = log["started"] + pd.to_timedelta(log["steam_min"], unit="m")

# field: 'F3-sud', 'f7 plateau' -> plot number and side
field = log["field"].str.upper().str.replace(r"\s+", "-", regex=True).str.split("-", n=1, expand=True)
log["plot"] = field[0]
log["slope"] = field[1].str.capitalize()
print(log[["batch", "started", "ended", "plot", "slope"]].head(10))

# yield: oil mass over flower mass, per cent
log["oil_g"] = log["oil_ml"] * DENSITY
log["yield_pct"] = (log["oil_g"] / (log["flowers_kg"] * 1000) * 100).round(3)
log["yield_pct"] = log["yield_pct"].where(log["oil_ml"] > 0)
varieties = varieties.drop_duplicates(subset="variety", keep="last")
log = log.merge(varieties, on="variety", how="left")
log["vs_expected"] = (log["yield_pct"] / log["expected_pct"]).round(3)
log["quality"] = log["vs_expected"].apply(quality)
log["scorched"] = log["head_temp_c"] > HEAD_LIMIT
log["trouble"] = np.select(
    [log["notes"].str.contains("burnt|scorch", case=False, na=False),
     log["notes"].str.contains("overflow|foam", case=False, na=False),
     log["notes"].str.contains("leak", case=False, na=False)],
    ["burnt", "overflow", "leak"],
    default="none")
log.loc[log["scorched"] & (log["trouble"] == "none"), "trouble"] = "hot head"
log["eur"] = (log["oil_ml"] / 1000 * log["eur_per_litre"]).round(2)
log.loc[log["trouble"] == "burnt", "eur"] = 0
log["temp_margin"] = (HEAD_LIMIT - log["head_temp_c"]).clip(lower=-5, upper=5)
print(log[["batch", "variety", "yield_pct", "vs_expected", "quality", "trouble", "eur"]].head(10))

# each still's season: pause since the last batch, running oil, moving head temperature
log = log.sort_values(["still", "started", "batch_no"]).reset_index(drop=True)
log["prev_end"] = log.groupby("still")["ended"].shift()
log["pause_h"] = ((log["started"] - log["prev_end"]).dt.total_seconds() / 3600).round(2)
log["cold_start"] = log["pause_h"].isna() | (log["pause_h"] > 10)
log["run_no"] = log.groupby("still")["cold_start"].cumsum()
log["oil_to_date"] = log.groupby("still")["oil_ml"].cumsum()
log["head_avg5"] = (log.groupby("still")["head_temp_c"]
                    .rolling(5, min_periods=2).mean()
                    .reset_index(level=0, drop=True)
                    .round(2))
log["yield_rank"] = log.groupby(["still", "variety"])["yield_pct"].rank(method="dense", ascending=False)
log["share_of_still"] = (log["oil_ml"] / log.groupby("still")["oil_ml"].transform("sum")).round(4)
print(log[["still", "batch", "pause_h", "run_no", "oil_to_date", "head_avg5", "yield_rank"]].head(12))

out = log[["batch", "started", "ended", "still", "operator", "variety", "plot", "slope", "season_day",
           "flowers_kg", "oil_ml", "yield_pct", "vs_expected", "quality", "trouble", "eur",
           "temp_margin", "pause_h", "run_no", "oil_to_date", "head_avg5", "yield_rank",
           "share_of_still"]]
out.to_csv("data/batch_report.csv", index=False)

# the operators' weeks
weekly = log.groupby(["week", "operator"], dropna=False).agg(batches=("batch", "count"),
                                                             flowers_kg=("flowers_kg", "sum"),
                                                             oil_ml=("oil_ml", "sum"),
                                                             eur=("eur", "sum"),
                                                             burnt=("trouble", lambda s: (s == "burnt").sum()))
weekly = weekly.reset_index()
weekly["ml_per_batch"] = (weekly["oil_ml"] / (weekly["batches"] - weekly["burnt"])).round(1)
weekly["eur"] = weekly["eur"].round(2)
weekly = weekly.sort_values(["week", "oil_ml"], ascending=[True, False])
weekly.to_csv("data/operator_weeks.csv", index=False)
print(weekly.head(15))

# the best batch of each variety
best = log.dropna(subset=["yield_pct"]).sort_values(["variety", "yield_pct", "batch"], ascending=[True, False, True])
best = best.groupby("variety").head(1)[["variety", "batch", "still", "operator", "yield_pct", "quality"]]
best.to_csv("data/best_batches.csv", index=False)
print(best)
