"""Make the sample data of seed_bank_germination (seeded: the same files every run).

A seed bank's germination trials: each tray's accession, the species (typed in any case, with
stray spaces, one accented name), the treatment (cold stratification, scarified, control), the
seeds sown and the seeds that came up, the seed weight, the seed's age in years, 'N/A' where
the weight was not taken, a blank age, a tray written up twice, and a tray sown with no seeds at
all (a zero divisor for the germination rate). A second file lists each species' family.
"""
import csv
import random

rng = random.Random(5203)

SPECIES = {"Primula veris": ["Primula veris", "primula veris", "Primula veris "],
           "Silene dioica": ["Silene dioica", "SILENE DIOICA"],
           "Centaurée noire": ["Centaurée noire", "centaurée noire"],
           "Knautia arvensis": ["Knautia arvensis"],
           "Lotus corniculatus": ["Lotus corniculatus"]}
BOOST = {"cold": 0.18, "scarified": 0.1, "control": 0.0}

rows = []
for n in range(1, 261):
    species = rng.choice(list(SPECIES))
    treatment = rng.choice(list(BOOST))
    age = rng.randint(0, 12)
    weight = round(rng.uniform(0.4, 3.5), 2)
    sown = rng.choice([20, 25, 25, 50])
    if rng.random() < 0.015:
        sown = 0  # a tray sown with nothing: the rate is 0 / 0
    rate = max(0.0, min(1.0, 0.45 + BOOST[treatment] - age * 0.03 + weight * 0.04 + rng.gauss(0, 0.12)))
    came_up = sum(rng.random() < rate for _ in range(sown))
    rows.append({
        "tray": f"T{n:03d}",
        "accession": f"A{rng.randint(1, 90):04d}",
        "species": rng.choice(SPECIES[species]),
        "treatment": treatment,
        "sown": sown,
        "germinated": came_up,
        "seed_weight_mg": "N/A" if rng.random() < 0.05 else weight,
        "age_years": "" if rng.random() < 0.04 else age,
    })
    if rng.random() < 0.03:
        rows.append(dict(rows[-1]))
rng.shuffle(rows)
with open("data/trials.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.DictWriter(out, fieldnames=list(rows[0]))
    writer.writeheader()
    writer.writerows(rows)

with open("data/species.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.writer(out)
    writer.writerow(["species", "family"])
    writer.writerows([
        ("Primula veris", "Primulaceae"), ("Silene dioica", "Caryophyllaceae"),
        ("Centaurée Noire", "Asteraceae"), ("Knautia arvensis", "Caprifoliaceae"),
        ("Lotus corniculatus", "Fabaceae"), ("Succisa pratensis", "Caprifoliaceae"),
    ])
