"""Sheepdog trial society: placings per trial and class, each dog's form over the season.

Run sheets typed up after each trial. Judges mark points LOST per phase; 'ret' means the dog
retired before that phase was judged, 'n/a' that the judge's card was lost (counted as 0 lost).
Handler written 'Surname, First'. A run with no class still counts in the dog's form.
"""
import numpy as np
import pandas as pd

RUNS = "data/runs.csv"
CLASSES = "data/classes.csv"
PHASES = ["outrun", "lift", "fetch", "drive", "shed", "pen"]
GRIP_PENALTY = 100          # a grip is a disqualification: the run scores nothing
OVERTIME_LOST = 5           # points off per started minute over the time allowed
SEASON_START = pd.Timestamp("2025-04-01")


def award(score):
    if score != score:
        return "retired"
    elif score >= 85:
        return "excellent"
    elif score >= 70:
        return "good"
    elif score > 0:
        return "fair"
    else:
        return "no score"


def weather_word(w):
    w = w.lower()
    if "wet" in w or "rain" in w or "drizzle" in w:
        return "wet"
    return "dry"


runs = pd.read_csv(RUNS, na_values=["ret"], keep_default_na=True)
classes = pd.read_csv(CLASSES)
print(runs.shape)
runs = runs.drop_duplicates()
print("after dropping repeats:", runs.shape)

# --- names ---
names = runs["handler"].str.strip().str.split(",", n=1, expand=True)
runs["surname"] = names[0].str.strip().str.title()
runs["handler"] = names[1].str.strip().str.capitalize() + " " + runs["surname"]
dog = runs["dog"].str.extract(r"^\s*(\w+)\s*\((?:reg|Reg)\s*(\d+)\)")
runs["dog"] = dog[0].str.title()
runs["reg_no"] = "R" + dog[1].str.zfill(6)
runs["class"] = runs["class"].str.strip().str.lower().str.replace(r"[\s_]+", "-", regex=True)
runs.loc[runs["class"] == "", "class"] = np.nan
runs["ground"] = runs["ground"].str.strip().str.title()
print(runs[["handler", "dog", "reg_no", "class"]].head(8))

# --- dates: the hut at Cwm Hir writes day-first ---
d1 = pd.to_datetime(runs["trial_date"], format="%Y-%m-%d", errors="coerce")
d2 = pd.to_datetime(runs["trial_date"], format="%d/%m/%Y", errors="coerce")
runs["trial_date"] = d1.fillna(d2)
runs["week"] = runs["trial_date"].dt.isocalendar().week
runs["days_in"] = (runs["trial_date"] - SEASON_START).dt.days
print("runs with no date:", runs["trial_date"].isna().sum())

# --- points ---
runs["retired"] = runs[PHASES].isna().any(axis=1) & runs["run_time"].str.contains("retired", case=False, na=True)
for p in PHASES:
    runs[p] = runs[p].fillna(0)
runs["lost"] = runs.loc[:, "outrun":"pen"].sum(axis=1)
runs = runs.merge(classes, on="class", how="left")
runs["max_points"] = runs["max_points"].fillna(100)
runs["score"] = runs["max_points"] - runs["lost"]
runs["score"] = runs["score"].clip(lower=0)

t = runs["run_time"].str.strip()
mins = pd.to_numeric(t.str.extract(r"^(\d+):")[0], errors="coerce")
secs = pd.to_numeric(t.str.slice(-2), errors="coerce")
runs["run_secs"] = mins * 60 + secs
runs["over_min"] = np.ceil((runs["run_secs"] - runs["time_allowed_min"] * 60) / 60).clip(lower=0)
runs.loc[runs["over_min"] > 0, "score"] -= runs["over_min"] * OVERTIME_LOST

runs["faults"] = runs["faults"].str.lower()
runs["n_faults"] = runs["faults"].str.count(";") + 1
runs["n_faults"] = runs["n_faults"].fillna(0)
gripped = runs["faults"].str.contains("grip", case=False, na=False)
runs.loc[gripped, "score"] = 0
runs.loc[runs["retired"], "score"] = np.nan
runs["award"] = runs["score"].apply(award)
runs["weather"] = runs["weather"].fillna("unknown").map(weather_word)
print(runs[["run_no", "class", "lost", "run_secs", "over_min", "n_faults", "score", "award"]].head(10))

# --- placings per trial day and class ---
runs = runs.sort_values(["trial_date", "class", "run_no"])
runs["place"] = runs.groupby(["trial_date", "class"])["score"].rank(method="min", ascending=False)
runs["entries"] = runs.groupby(["trial_date", "class"])["run_no"].transform("count")
runs["class_mean"] = runs.groupby(["trial_date", "class"])["score"].transform("mean").round(2)
runs["above_mean"] = np.where(runs["score"] > runs["class_mean"], "yes", "no")
placings = runs[runs["place"] <= 3]
placings = placings[["trial_date", "ground", "class", "place", "handler", "dog", "reg_no",
                     "score", "award", "judge", "entries"]]
placings.to_csv("data/placings.csv", index=False)

# --- each dog's form ---
runs = runs.sort_values(["reg_no", "trial_date", "run_no"])
runs["outing"] = runs.groupby("reg_no").cumcount() + 1
runs["prev_score"] = runs.groupby("reg_no")["score"].shift(1)
runs["change"] = runs["score"] - runs["prev_score"]
runs["best_so_far"] = runs.groupby("reg_no")["score"].cummax()
runs["fees_to_date"] = runs.groupby("reg_no")["entry_fee"].cumsum()
form = runs[["reg_no", "dog", "handler", "trial_date", "week", "days_in", "outing", "class", "score",
             "prev_score", "change", "best_so_far", "fees_to_date", "weather", "above_mean"]]
form.to_csv("data/dog_form.csv", index=False)

wet = runs.groupby(["handler", "weather"], dropna=False).agg(
    runs=("run_no", "count"), mean_score=("score", "mean"), faults=("n_faults", "sum"))
wet = wet.reset_index()
wet.to_csv("data/handler_weather.csv", index=False, float_format="%.2f")
print(wet)
