"""Salt marsh bird count: birds per transect and kilometre, the red-listed species by date,
and the lines whose species name nobody could read.

Volunteers write the species by hand ('red shank', 'curlw', 'brent geese'); each name is
matched against the reserve's checklist with difflib, and what does not match closely
enough is sent back to the recorder. 'x' or 'not counted' in the birds column means the
flock flew before it was counted. T4 is the hide: a point count with no length.
"""
import difflib
from functools import lru_cache

import pandas as pd

CUTOFF = 0.75

checklist = pd.read_csv("data/checklist.csv")
checklist["species"] = checklist["species"].str.lower()
SPECIES = checklist["species"].tolist()
print(f"checklist: {len(SPECIES)} species")


@lru_cache(maxsize=None)
def match_species(raw):
    # a blank or a '?' is not a bird
    if not isinstance(raw, str) or not raw.strip():
        return None
    name = raw.strip().lower()
    for plural, single in (("geese", "goose"),):
        name = name.replace(plural, single)
    best = difflib.get_close_matches(name, SPECIES, n=1, cutoff=CUTOFF)
    return best[0] if best else None


counts = pd.read_csv("data/counts.csv", na_values=["x", "not counted"])
transects = pd.read_csv("data/transects.csv")
print("lines read:", len(counts))
# a flock can be counted twice on purpose (it moved between transects): lines are kept, only flagged
print("lines entered twice:", counts.duplicated().sum())
counts["transect"] = counts["transect"].str.strip().str.upper()
counts["tide"] = counts.tide.str.strip().str.lower()

counts["species"] = counts["species_raw"].map(match_species)

unmatched = counts[counts["species"].isna()]
print(f"{len(unmatched)} lines with a species name we could not match")
unmatched = unmatched[["count_id", "survey_date", "observer", "species_raw"]].sort_values("count_id")
unmatched.to_csv("unmatched_species.csv", index=False)

counts = counts.dropna(subset=["species"])
counts = counts.merge(checklist, on="species", how="left")
counts["birds"] = counts["birds"].fillna(0)

# --- birds per transect and species, per km walked
per_transect = counts.groupby(["transect", "species"], as_index=False).agg(
    birds=("birds", "sum"), visits=("survey_date", "nunique"))
per_transect = per_transect.merge(transects, on="transect", how="left")
per_transect["birds_per_km"] = (per_transect["birds"] / per_transect["visits"] / per_transect["length_km"]).round(2)
per_transect.sort_values(["transect", "birds", "species"], ascending=[True, False, True], inplace=True)
per_transect.to_csv("birds_per_transect.csv", index=False)

# --- red-listed species, per survey date
red = counts[counts["status"] == "red"]
red_by_date = (
    red.groupby("survey_date")
    .agg(birds=("birds", "sum"), species=("species", "nunique"), lines=("count_id", "count"))
    .reset_index()
    .sort_values("survey_date")
)
red_by_date.to_csv("red_list_by_date.csv", index=False)

# --- a word for the newsletter
by_tide = counts.groupby("tide")["birds"].mean().round(2)
print(by_tide)
top = counts.groupby("species")["birds"].sum().sort_values(ascending=False).head(5)
print("most counted:")
print(top)
