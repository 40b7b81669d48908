"""Make the sample data of apiary_winter_survival (seeded: the same files every run).

The bee inspector's autumn sheets, typed up in spring once the survivors were counted: apiary
names in any case and with stray spaces, a blank apiary where the sheet got wet, 'n/a' for a
mite count nobody did, queen ages written as a year or left blank, the odd hive inspected
twice, and one hive whose honey was never weighed. A second file lists the apiaries' heights.
"""
import csv
import random

rng = random.Random(8117)

APIARIES = ["Upper Meadow", "upper meadow", "Orchard ", "Étang", "Heath", "heath", ""]
HEIGHTS = {"Upper Meadow": 410, "Orchard": 120, "Étang": 95, "Heath": 260, "Old Quarry": 330}

rows = []
for n in range(1, 281):
    frames = rng.randint(3, 20)
    mites = "n/a" if rng.random() < 0.05 else round(rng.gammavariate(2.0, 1.6), 2)
    honey = "" if rng.random() < 0.04 else round(rng.gauss(17.5, 6.5), 2)
    brood = round(rng.uniform(0, 90), 1)
    # survival leans on frames, brood and mites, with plenty of chance in it
    score = frames * 0.2 + brood * 0.02 - (mites if isinstance(mites, float) else 2.5) * 0.6
    survived = 1 if score + rng.gauss(0, 1.2) > 2.2 else 0
    rows.append({
        "hive": f"H{rng.randint(1, 240):03d}",
        "apiary": rng.choice(APIARIES),
        "frames": frames,
        "brood_pct": brood,
        "mites_per_100": mites,
        "honey_kg": honey,
        "queen_year": rng.choice([2021, 2022, 2023, 2023, 2024, ""]),
        "survived": survived,
    })
    if rng.random() < 0.03:
        rows.append(dict(rows[-1]))

with open("data/inspections.csv", "w", newline="", encoding="utf-8") as f:
    writer = csv.DictWriter(f, fieldnames=list(rows[0]))
    writer.writeheader()
    writer.writerows(rows)

with open("data/apiaries.csv", "w", newline="", encoding="utf-8") as f:
    writer = csv.writer(f)
    writer.writerow(["apiary", "height_m"])
    for name, height in HEIGHTS.items():
        writer.writerow([name, height])
