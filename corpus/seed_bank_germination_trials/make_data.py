"""Make the sample data of seed_bank_germination_trials (seeded: the same files every run).

A seed bank tests its stored accessions each month (data/trials-2025-MM.csv, eight months):
each trial's accession, species code (written with stray spaces or in lower case now and
then), seeds sown and germinated, the cabinet's temperature (blank when the logger failed),
and a note in the technicians' French ('N/A' or blank when there is none). An accession is
sometimes tested twice in a month. The species list names each code's species, family and
dormancy; one code on the trays ('XXX', a mislabelled tray) is not on it.
"""
import csv
import random

rng = random.Random(1848)

SPECIES = ["PRI", "ANE", "ORC", "SAX", "GEN", "XXX"]
NOTES = ["", "", "", "N/A", "moisissure légère", "tégument dur", "germination très lente",
         "plateau déplacé"]
MONTHS = ["01", "02", "03", "04", "05", "06", "09", "11"]

n = 0
for month in MONTHS:
    rows = []
    for _ in range(rng.randint(9, 16)):
        n += 1
        code = rng.choice(SPECIES)
        sown = rng.choice([20, 25, 50, 50, 100])
        roll = rng.random()
        rows.append({
            "month": f"2025-{month}",
            "accession": f"A{rng.randint(100, 160)}",
            "species": code if roll > 0.15 else f" {code.lower()}" if roll > 0.07 else f"{code} ",
            "sown": sown,
            "germinated": rng.randint(0, sown),
            "temp_c": "" if rng.random() < 0.08 else rng.choice([5.0, 12.5, 15.0, 20.0, 22.5, 25.0]),
            "note": rng.choice(NOTES),
        })
        if rng.random() < 0.06:
            rows.append(dict(rows[-1]))  # tested twice
    with open(f"data/trials-2025-{month}.csv", "w", newline="", encoding="utf-8") as out:
        writer = csv.DictWriter(out, fieldnames=list(rows[0]))
        writer.writeheader()
        writer.writerows(rows)

with open("data/species.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.writer(out)
    writer.writerow(["code", "species_name", "family", "dormancy"])
    writer.writerows([
        ("PRI", "Primula élatior", "Primulacées", "physiologique"),
        ("ANE", "Anémone des bois", "Renonculacées", "morphologique"),
        ("ORC", "Orchis bouffon", "Orchidacées", "morphologique"),
        ("SAX", "Saxifrage à feuilles opposées", "Saxifragacées", "physiologique"),
        ("GEN", "Gentiane printanière", "Gentianacées", "physique"),
    ])
