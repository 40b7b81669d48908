"""Make the sample data of bell_foundry_castings (seeded: the same files every run).

The foundry's casting log is kept by the pourers on a clipboard by the pit: stamps written
two ways, 'n/a' or 'not weighed' for a bell that went to the fettling shop unweighed, the
note of each bell written as 'D#4', 'd 4', 'Eb4 (flat)' or nothing, moulders' names in any
case, a blank furnace, a few castings typed twice, and the sheets out of order.
"""
import csv
import random
from datetime import datetime, timedelta

rng = random.Random(7316)

FURNACES = ["north", "North", "south ", "SOUTH", "crucible", "", "n/a"]
MOULDERS = ["Aurélie", "aurélie ", "Bronwen", "BRONWEN", "Ciarán", "Dagny", "Émeric",
            "emeric", "", "n/a"]
NOTES = ["C4", "D#4", "d 4", "E4", "Eb4 (flat)", "F#3", "g3", "A3", "Bb3", "c5", "", "n/a", "??"]
ALLOYS = ["bell metal 78/22", "Bell Metal 78/22", "bell metal 80/20", "tin-rich 76/24",
          "recast scrap", "RECAST scrap", "n/a", ""]
DEFECTS = ["", "", "", "", "porosity", "Porosity at crown", "cold shut", "crack lip",
           "CRACK at waist", "n/a", "shrinkage"]

rows = []
moment = datetime(2024, 9, 2, 7, 40)
for number in range(1, 431):
    moment += timedelta(minutes=rng.randrange(40, 60 * 40))
    if rng.random() < 0.7:
        stamp = moment.strftime("%Y-%m-%d %H:%M")
    else:
        stamp = moment.strftime("%d/%m/%Y %H:%M")
    if rng.random() < 0.02:
        stamp = rng.choice(["n/a", "2024-13-01 09:00", "yesterday"])
    weight = round(rng.uniform(18, 950), 1)
    pour_temp = rng.choice([1080, 1095, 1110, 1120, 1135, 1150, 1165, 1190, 1240])
    cool_h = rng.choice([18, 24, 30, 36, 48, 72, 96])
    rows.append({
        "cast_no": f"{number}",
        "cast_at": stamp,
        "furnace": rng.choice(FURNACES),
        "moulder": rng.choice(MOULDERS),
        "note": rng.choice(NOTES),
        "alloy": rng.choice(ALLOYS),
        "metal_kg": round(weight * rng.uniform(1.05, 1.4), 1) if rng.random() > 0.05 else "n/a",
        "bell_kg": weight if rng.random() > 0.07 else rng.choice(["n/a", "not weighed", ""]),
        "pour_temp_c": pour_temp if rng.random() > 0.05 else "",
        "cool_hours": cool_h,
        "cents_off": rng.choice([-38, -21, -12, -6, -3, 0, 0, 2, 5, 9, 14, 27, 44, ""]),
        "defect": rng.choice(DEFECTS),
    })
rows += [dict(row) for row in rows if rng.random() < 0.03]  # typed twice
rng.shuffle(rows)

with open("data/castings.csv", "w", newline="", encoding="utf-8") as fh:
    writer = csv.DictWriter(fh, fieldnames=list(rows[0]))
    writer.writeheader()
    writer.writerows(rows)

prices = [
    {"alloy": "bell metal 78/22", "eur_per_kg": 14.2},
    {"alloy": "bell metal 80/20", "eur_per_kg": 13.6},
    {"alloy": "tin-rich 76/24", "eur_per_kg": 15.9},
    {"alloy": "recast scrap", "eur_per_kg": 6.5},
    {"alloy": "bell metal 78/22", "eur_per_kg": 14.8},   # a later price, kept below
]
with open("data/alloy_prices.csv", "w", newline="", encoding="utf-8") as fh:
    writer = csv.DictWriter(fh, fieldnames=["alloy", "eur_per_kg"])
    writer.writeheader()
    writer.writerows(prices)
