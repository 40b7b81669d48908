"""Make the sample data of canal_boat_hire (seeded: the same files every run).

The yard's booking book is typed up at the end of each week: boat names in any case with
stray blanks, 'n/a' where the engine-hour meter was not read, a few hires typed twice, rows
in the order the sheets came out of the drawer, a hire with no boat written down.
"""
import csv
import random
from datetime import date, timedelta

rng = random.Random(2611)

BOATS = ["Kingfisher", "kingfisher ", "Heron", "HERON", "Otter", "Moorhen", "Ébène", "ebène",
         "Water Vole", "Dabchick", ""]
BASES = ["north basin", "North Basin", "lock 7", "wharf", "n/a", ""]
CLASSES = {"Kingfisher": "narrow", "Heron": "narrow", "Otter": "wide", "Moorhen": "narrow",
           "Ébène": "wide", "Water Vole": "day", "Dabchick": "day"}

rows = []
hours = {b: rng.randrange(1200, 4000) for b in CLASSES}
start = date(2025, 3, 29)
for number in range(1, 1101):
    boat = rng.choice(BOATS)
    out = start + timedelta(days=rng.randrange(0, 180))
    nights = rng.choice([0, 2, 3, 3, 4, 7, 7, 7, 10, 14])
    meter = rng.choice([0, 6, 12, 18, 25, 31, 40])  # hours run on this hire, made a reading below
    fuel = round(rng.uniform(0, 120), 1) if nights else 0
    damage = rng.choice(["", "", "", "", "scratch", "Scratch ", "tiller", "fender lost", "n/a",
                         "hull dent", "hull DENT", "window"])
    deposit = rng.choice([250, 250, 250, 400, 0, ""])
    price = {0: 95, 2: 410, 3: 560, 4: 690, 7: 1120, 10: 1490, 14: 1880}[nights]
    if rng.random() < 0.06:
        price = ""
    row = {
        "hire_no": number,
        "boat": boat,
        "base": rng.choice(BASES),
        "out_date": out.isoformat() if rng.random() > 0.03 else rng.choice(["", "n/a"]),
        "nights": nights,
        "meter_hours": meter if rng.random() > 0.07 else rng.choice(["", "n/a"]),
        "fuel_litres": fuel if rng.random() > 0.05 else "n/a",
        "price": price,
        "deposit": deposit,
        "damage": damage,
        "crew": rng.choice([1, 2, 2, 4, 4, 4, 6, 8, 0]),
    }
    rows.append(row)
# the meter reading: the boat's hours so far, in date order (a hire with no boat gets any number)
for row in sorted(rows, key=lambda r: (r["out_date"], r["hire_no"])):
    key = row["boat"].strip().title()
    key = {"Ebène": "Ébène"}.get(key, key)
    if row["meter_hours"] in ("", "n/a"):
        continue
    if key in hours:
        hours[key] += row["meter_hours"]
        row["meter_hours"] = hours[key]
    else:
        row["meter_hours"] = rng.randrange(1000, 5000)
rows += [dict(row) for row in rows if rng.random() < 0.03]  # typed twice
rng.shuffle(rows)

with open("data/hires.csv", "w", newline="", encoding="utf-8") as fh:
    writer = csv.DictWriter(fh, fieldnames=list(rows[0]))
    writer.writeheader()
    writer.writerows(rows)

with open("data/boats.csv", "w", newline="", encoding="utf-8") as fh:
    writer = csv.writer(fh)
    writer.writerow(["boat", "class", "berths", "service_every"])
    for boat, cls in CLASSES.items():
        writer.writerow([boat, cls, {"narrow": 4, "wide": 6, "day": 0}[cls],
                         {"narrow": 250, "wide": 300, "day": ""}[cls]])
    writer.writerow(["Heron", "narrow", 4, 200])  # the old card, never thrown away
