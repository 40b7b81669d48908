"""Make the sample data of orchard_soil_survey (seeded: the same files every run).

A community orchard's soil survey: one line per soil core, taken under a tree. Plot names in
any case, a pH meter that wrote 'err', moisture left blank when the probe was lost, a core sent
twice to the lab, and a few cores from trees that were since felled (no health score). A second
file lists the trees with their variety and planting year.
"""
import csv
import random

rng = random.Random(2718)

PLOTS = ["North Slope", "north slope", "Pond Side", "Walled Garden", "walled garden ", "Bramble Corner", "Ça Va Row"]
VARIETIES = ["Bramley", "Egremont", "Discovery", "Perry Pear", "Damson"]

trees = []
for n in range(1, 61):
    trees.append({"tree": f"TR{n:02d}", "variety": rng.choice(VARIETIES), "planted": rng.choice(range(1988, 2021))})

rows = []
for n in range(240):
    tree = rng.choice(trees)
    ph = round(rng.gauss(6.4, 0.6), 2)
    nitrogen = round(max(0.0, rng.gauss(28, 9)), 1)
    moisture = "" if rng.random() < 0.07 else round(rng.uniform(12, 45), 1)
    organic = round(rng.uniform(1.5, 9.0), 2)
    health = 3 + (ph - 6.4) * -1.2 + nitrogen * 0.04 + organic * 0.25 + rng.gauss(0, 0.8)
    rows.append({
        "core": f"C{n + 1:04d}",
        "plot": rng.choice(PLOTS),
        "tree": tree["tree"] if rng.random() > 0.03 else "TR99",
        "depth_cm": rng.choice([10, 20, 30]),
        "ph": "err" if rng.random() < 0.04 else ph,
        "nitrogen_mgkg": nitrogen,
        "moisture_pct": moisture,
        "organic_pct": organic,
        "health": "" if rng.random() < 0.05 else round(min(5.0, max(0.0, health)), 1),
    })
    if rng.random() < 0.03:
        rows.append(dict(rows[-1]))

with open("data/cores.csv", "w", newline="", encoding="utf-8") as f:
    writer = csv.DictWriter(f, fieldnames=list(rows[0]))
    writer.writeheader()
    writer.writerows(rows)

with open("data/trees.csv", "w", newline="", encoding="utf-8") as f:
    writer = csv.DictWriter(f, fieldnames=list(trees[0]))
    writer.writeheader()
    writer.writerows(trees)
