"""Seaweed farm harvest tags: yield per longline, per species and week, and the bags whose tag can't be read.

Every net bag landed gets a tag like 'L07-B/W12' (longline 7, bay B, ISO week 12), written by
hand: lower case, a missing leading zero, no week, or torn off altogether. Dry weight comes
from the drying shed later; '?' or blank when the bag went to the fresh market.
"""
import pandas as pd

TAG_PATTERN = r"^\s*[Ll](\d+)-([A-Ca-c])(?:/[Ww](\d+))?\s*$"

tags = pd.read_csv("data/harvest_tags.csv", na_values=["?"], parse_dates=["landed_on"])
lines = pd.read_csv("data/lines.csv")

tags = tags.drop_duplicates(subset=["harvest_id"]).assign(
    species=lambda d: d["species"].str.strip().str.lower(),
)
tags["harvester"] = tags["harvester"].str.strip()

# split the hand-written tag into its parts
parts = tags["tag"].str.extract(TAG_PATTERN)
tags["line"] = "L" + parts[0].str.zfill(2)
tags["bay"] = parts[1].str.upper()
tags["week"] = parts[2].astype(float)

unread = tags[tags["line"].isna()]
tags = tags[tags["line"].notna()]

tags["dry_ratio"] = tags["dry_kg"] / tags["wet_kg"]   # 0 kg wet: empty bag, still tagged

# the re-rigged line 7 is in the lines sheet twice: keep the newest (last) row
lines = lines.drop_duplicates("line", keep="last")
per_line = (
    tags.groupby("line")
    .agg(bags=("harvest_id", "count"), wet_kg=("wet_kg", "sum"), dry_kg=("dry_kg", "sum"), bays=("bay", "nunique"))
    .reset_index()
    .merge(lines, on="line", how="outer")
    .assign(wet_per_m=lambda d: d["wet_kg"] / d["rope_m"])
    .sort_values(["site", "line"])
)
per_line["wet_per_m"] = per_line["wet_per_m"].round(3)
per_line["dry_kg"] = per_line["dry_kg"].round(2)
per_line.to_csv("line_yield.csv", index=False)

weekly = tags[tags.week.notna()].groupby(["species", "week"], as_index=False).agg(
    bags=("harvest_id", "size"), wet_kg=("wet_kg", "sum"), mean_ratio=("dry_ratio", "mean"))
weekly["mean_ratio"] = weekly["mean_ratio"].round(4)
weekly = weekly.sort_values(["species", "week"])
weekly.to_csv("species_weeks.csv", index=False)

unread = unread[["harvest_id", "tag", "species", "wet_kg", "harvester", "landed_on"]].sort_values(["landed_on", "harvest_id"])
unread.to_csv("data/unread_tags.csv", index=False)
print(len(unread), "bags without a readable tag")
print(tags.groupby("harvester")["wet_kg"].sum().sort_values(ascending=False))
