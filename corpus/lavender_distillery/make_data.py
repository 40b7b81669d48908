"""Make the sample data of lavender_distillery (seeded: the same files every run).

The still log is filled in by whoever runs the stills: batch numbers typed 'LD-0042',
'ld 42' or 'LD42', the start stamp written ISO or day-first with dots, flower weights with
'n/a', 'wet' (not weighed, too wet) or a blank, the oil yield sometimes missing, operators'
names in any case with stray blanks, a batch with no still, a few batches typed twice and
the pages out of order. The variety table has one variety twice (a revised price).
"""
import csv
import random
from datetime import datetime, timedelta

rng = random.Random(5821)

STILLS = ["still 1", "Still 1 ", "STILL 2", "still 2", "copper", "Copper ", "", "n/a"]
OPERATORS = ["Mathéo", "mathéo ", "Inès", "INÈS", "Séverine", "severine", "Baptiste",
             " baptiste", "Noémie", "", "n/a"]
VARIETIES = ["angustifolia", "Angustifolia ", "lavandin grosso", "Lavandin Grosso",
             "lavandin super", "LAVANDIN SUPER", "spica", "n/a", ""]
FIELDS = ["F1-nord", "F2-nord", "F3-sud", "f4-Sud", "F12-plateau", "f7 plateau", "", "n/a"]
NOTES = ["", "", "", "", "", "foaming at 20 min", "Burnt smell", "burnt - restarted",
         "overflow", "OVERFLOW, lost some", "cloudy oil", "n/a", "good", "Good clear oil",
         "steam leak at lid"]

rows = []
moment = datetime(2025, 6, 23, 5, 30)
for number in range(1, 461):
    moment += timedelta(minutes=rng.randrange(50, 60 * 9))
    if moment.hour >= 21:
        moment += timedelta(hours=8)
    if rng.random() < 0.65:
        stamp = moment.strftime("%Y-%m-%d %H:%M")
    else:
        stamp = moment.strftime("%d.%m.%Y %H:%M")
    if rng.random() < 0.02:
        stamp = rng.choice(["n/a", "2025-07-32 06:00", "after lunch", ""])
    variety = rng.choice(VARIETIES)
    kg = round(rng.uniform(120, 680), 1)
    pct = rng.uniform(0.6, 1.1) if "angustifolia" in variety.lower() else rng.uniform(1.2, 2.6)
    oil = round(kg * pct * 10, 0)   # ml: about 1% of the flower weight
    style = rng.random()
    if style < 0.5:
        batch = f"LD-{number:04d}"
    elif style < 0.8:
        batch = f"ld {number}"
    else:
        batch = f"LD{number}"
    rows.append({
        "batch": batch,
        "started": stamp,
        "still": rng.choice(STILLS),
        "operator": rng.choice(OPERATORS),
        "variety": variety,
        "field": rng.choice(FIELDS),
        "flowers_kg": kg if rng.random() > 0.06 else rng.choice(["n/a", "wet", ""]),
        "oil_ml": int(oil) if rng.random() > 0.05 else rng.choice(["n/a", "", "0"]),
        "steam_min": rng.choice([45, 50, 55, 60, 60, 65, 70, 75, 90, 120, ""]),
        "head_temp_c": rng.choice([96.5, 97.0, 97.5, 98.0, 98.5, 99.0, 99.5, 100.0, 101.5, 103.0, ""]),
        "notes": rng.choice(NOTES),
    })
rows += [dict(row) for row in rows if rng.random() < 0.03]  # typed twice
rng.shuffle(rows)

with open("data/still_log.csv", "w", newline="", encoding="utf-8") as fh:
    writer = csv.DictWriter(fh, fieldnames=list(rows[0]))
    writer.writeheader()
    writer.writerows(rows)

varieties = [
    {"variety": "angustifolia", "eur_per_litre": 420.0, "expected_pct": 0.85},
    {"variety": "lavandin grosso", "eur_per_litre": 95.0, "expected_pct": 1.9},
    {"variety": "lavandin super", "eur_per_litre": 130.0, "expected_pct": 1.6},
    {"variety": "spica", "eur_per_litre": 210.0, "expected_pct": 0.0},
    {"variety": "lavandin grosso", "eur_per_litre": 102.5, "expected_pct": 1.9},  # revised
]
with open("data/varieties.csv", "w", newline="", encoding="utf-8") as fh:
    writer = csv.DictWriter(fh, fieldnames=["variety", "eur_per_litre", "expected_pct"])
    writer.writeheader()
    writer.writerows(varieties)
