"""Make the sample data of hill_farm_lambing (seeded: the same files every run).

    python make_data.py [--rows N]    (N lambings; 240 by default, the shipped sample)

A hill farm's lambing book, one line per ewe that lambed: the ewe's tag, the day she lambed,
the field (typed in any case, with stray spaces, one accented name, a blank), her breed, age
and weight ('N/A' where she was not weighed, and a few weights misread far too high), her body
condition score (blank where nobody scored her), the lambs born and the lambs alive at two
days (none alive for a few), the lambs' mean birth weight, whether she needed help, and a ewe
written up twice. A second file lists the fields' altitude and shelter, one field missing.
"""
import argparse
import csv
import datetime as dt
import random

parser = argparse.ArgumentParser()
parser.add_argument("--rows", type=int, default=240)
args = parser.parse_args()

rng = random.Random(7719)

FIELDS = {"Top Allotment": ["Top Allotment", "top allotment", "Top allotment "],
          "Beck Side": ["Beck Side", "BECK SIDE"],
          "Intake": ["Intake", " intake"],
          "Low Meadow": ["Low Meadow"],
          "Crag Fold": ["Crag Fold", "crag fold"],
          "Prée Haute": ["Prée Haute", "prée haute"]}
BREEDS = ["Herdwick", "Swaledale", "Mule", "Texel cross"]
SHELTER = {"Top Allotment": 0.08, "Beck Side": 0.0, "Intake": 0.05, "Low Meadow": -0.04,
           "Crag Fold": 0.1, "Prée Haute": 0.03}

rows = []
start = dt.datetime(2026, 3, 20)
for n in range(1, args.rows + 1):
    field = rng.choice(list(FIELDS))
    breed = rng.choice(BREEDS)
    age = rng.randint(1, 9)
    weight = round(rng.gauss(58 if breed != "Herdwick" else 48, 7), 1)
    score = round(rng.choice([1.5, 2, 2.5, 3, 3, 3.5, 4]), 1)
    born = rng.choice([1, 1, 2, 2, 2, 3])
    birth_weight = round(max(1.8, rng.gauss(4.8 - 0.5 * born + 0.02 * (weight - 55), 0.6)), 2)
    risk = 0.08 + 0.06 * (born - 1) + SHELTER[field] + (0.06 if age >= 7 else 0) \
        - 0.03 * (score - 3) - 0.04 * (birth_weight - 4)
    alive = sum(rng.random() > risk for _ in range(born))
    day = start + dt.timedelta(days=rng.randint(0, 34), hours=rng.choice([2, 6, 9, 14, 19, 23]))
    rows.append({
        "ewe": f"E{rng.randint(1, 400):04d}",
        "lambed": day.strftime("%Y-%m-%d %H:%M"),
        "field": "" if rng.random() < 0.02 else rng.choice(FIELDS[field]),
        "breed": breed,
        "ewe_age": age,
        "ewe_kg": "N/A" if rng.random() < 0.05 else (round(weight * 10, 1) if rng.random() < 0.02 else weight),
        "condition": "" if rng.random() < 0.06 else score,
        "born": born,
        "alive_48h": alive,
        "birth_kg": birth_weight,
        "assisted": "yes" if rng.random() < 0.15 + 0.1 * (born == 3) else "no",
        "shepherd": rng.choice(["Agnes", "Tom", "Tom", "Wyn"]),
    })
    if rng.random() < 0.03:
        rows.append(dict(rows[-1]))  # written up twice
rng.shuffle(rows)

with open("data/lambings.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.DictWriter(out, fieldnames=list(rows[0]))
    writer.writeheader()
    writer.writerows(rows)

with open("data/fields.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.writer(out)
    writer.writerow(["field", "altitude_m", "shelter"])
    writer.writerows([("Top Allotment", 420, "wall"), ("Beck Side", 210, "barn"),
                      ("Intake", 330, "wall"), ("Low Meadow", 150, "barn"),
                      ("Crag Fold", 480, "none")])
