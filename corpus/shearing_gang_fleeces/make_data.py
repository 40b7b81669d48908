"""Make the sample data of shearing_gang_fleeces (seeded: the same files every run).

The gang's wool-classer writes a tally of every fleece off the board: the day, the shed, the
shearer (names in any case, a blank where the tally sheet smudged, a relief shearer the gang list
never heard of), the flock and breed, the fleece weight ('N/A' for a fleece that went to the
bin unweighed), the grade the classer gave it (blank for a fleece not classed) and the second
cuts. A fleece is sometimes tallied twice. The gang list holds each shearer's gang, rate per head
and the farms they come from (a shearer with a rate of 0: the learner, paid by the day); one
shearer on it never shore a sheep this season.
"""
import csv
import random

rng = random.Random(7731)

SHEARERS = {
    "Rhodri Vaughan": ["Rhodri Vaughan", "rhodri vaughan", "Rhodri Vaughan "],
    "Ceinwen Pryce": ["Ceinwen Pryce", "CEINWEN PRYCE"],
    "Tomás Ellery": ["Tomás Ellery", "tomás ellery"],
    "Iolo Brandt": ["Iolo Brandt"],
    "Mared Lusk": ["Mared Lusk", "mared lusk"],
    "Owain Fell": ["Owain Fell"],
    "Zoë Harrow": ["Zoë Harrow"],  # relief: not on the gang list
}
SHEDS = ["Blaen", "Cwm Du", "Pen-y-Graig", "Hafod"]
FLOCKS = {"Blaen": ["B-ewes", "B-hoggs"], "Cwm Du": ["CD-ewes"], "Pen-y-Graig": ["PG-ewes", "PG-tups"],
          "Hafod": ["H-ewes"]}
BREEDS = ["Welsh Mountain", "Welsh Mountain", "Beulah", "Lleyn", "lleyn", "Texel x"]
GRADES = ["AA", "A", "A", "B", "B", "C", "", "a"]
DAYS = ["2026-06-%02d" % d for d in (3, 4, 5, 8, 9, 10, 11, 15, 16)]

rows = []
for n in range(1, 241):
    shed = rng.choice(SHEDS)
    who = rng.choice(list(SHEARERS))
    kg = round(rng.uniform(1.1, 3.9), 2)
    rows.append({
        "tally": f"T{n:04d}",
        "day": rng.choice(DAYS),
        "shed": shed,
        "shearer": "" if rng.random() < 0.04 else rng.choice(SHEARERS[who]),
        "flock": rng.choice(FLOCKS[shed]),
        "breed": rng.choice(BREEDS),
        "fleece_kg": "N/A" if rng.random() < 0.05 else kg,
        "grade": rng.choice(GRADES),
        "second_cuts": rng.choice([0, 0, 0, 1, 1, 2, 3]),
    })
    if rng.random() < 0.04:
        rows.append(dict(rows[-1]))  # the same fleece tallied twice
rng.shuffle(rows)

with open("data/fleeces.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.DictWriter(out, fieldnames=list(rows[0]))
    writer.writeheader()
    writer.writerows(rows)

GANG = [
    ("Owain Fell", "north", 1.95, "Hafod"),
    ("Ceinwen Pryce", "south", 2.10, "Cwm Du"),
    ("Rhodri Vaughan", "north", 2.10, "Blaen"),
    ("Mared Lusk", "south", 0.0, "Cwm Du"),  # the learner, paid by the day
    ("Iolo Brandt", "north", 1.80, "Pen-y-Graig"),
    ("Tomás Ellery", "south", 2.25, "Blaen"),
    ("Gethin Moor", "north", 1.90, "Hafod"),  # on the list, never shore this season
]
with open("data/gang.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.writer(out)
    writer.writerow(["shearer", "gang", "rate", "home_shed"])
    writer.writerows(GANG)
