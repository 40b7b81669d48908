"""Make the sample data of hillfort_finds_register (seeded: the same files every run).

A hill-fort excavation's finds register (each find with its trench, material written in any case
with stray spaces, weight in grams, '?' where the scale was not to hand, depth in centimetres,
blank when the context sheet was lost, the day it was dug; a find entered twice) and the
trench list (each trench's area and the period it was phased to; one trench on the register
was opened late and is not on the list, one trench on the list has no finds).
"""
import csv
import random

rng = random.Random(4471)

MATERIALS = {"pottery": ["pottery", "Pottery", " pottery"], "bone": ["bone", "Bone "],
             "flint": ["flint", "FLINT"], "iron": ["iron"], "glass": ["glass", "Glass"],
             "céramique fine": ["céramique fine"], "bronze": ["bronze", "Bronze"]}
TRENCHES = ["T1", "T2", "T3", "T4", "T5", "T7"]  # T7 opened late, not on the trench list
DAYS = ["2026-07-%02d" % d for d in (6, 7, 8, 9, 10, 13, 14, 15, 16, 17)]

finds = []
for n in range(1, 241):
    material = rng.choice(list(MATERIALS))
    heavy = material in ("iron", "bronze", "pottery")
    finds.append({
        "find_id": f"F{n:04d}",
        "trench": rng.choice(TRENCHES),
        "material": rng.choice(MATERIALS[material]),
        "weight_g": "?" if rng.random() < 0.05 else round(rng.uniform(0.5, 400 if heavy else 60), 1),
        "depth_cm": "" if rng.random() < 0.04 else rng.choice(range(2, 260)),
        "dug_on": rng.choice(DAYS),
    })
    if rng.random() < 0.04:
        finds.append(dict(finds[-1]))
rng.shuffle(finds)
with open("data/finds.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.DictWriter(out, fieldnames=list(finds[0]))
    writer.writeheader()
    writer.writerows(finds)

trenches = [
    {"trench": "T1", "area_m2": 20, "period": "Iron Age"},
    {"trench": "T2", "area_m2": 12, "period": "Iron Age"},
    {"trench": "T3", "area_m2": 30, "period": "Roman"},
    {"trench": "T4", "area_m2": 8, "period": ""},
    {"trench": "T5", "area_m2": 16, "period": "Medieval"},
    {"trench": "T6", "area_m2": 10, "period": "Roman"},  # no finds yet
]
with open("data/trenches.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.DictWriter(out, fieldnames=list(trenches[0]))
    writer.writeheader()
    writer.writerows(trenches)
