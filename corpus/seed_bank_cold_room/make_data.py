"""Make the sample data of seed_bank_cold_room (seeded: the same files every run).

A seed bank's cold-room inventory, kept in a pandas 1.x notebook since 2019: the drawer count
sheet (each accession's seeds counted on a date, grams, the room's thermometer reading; the
thermometer blank on days nobody read it, 'N/A' grams for a packet not weighed, an accession
counted twice on one day, species names with accents and stray spaces) and the new arrivals
sheet of 2024, appended to it. The species list gives each species' family and the seeds a
viable packet must hold; one species is on it twice and one never arrived.
"""
import csv
import random

rng = random.Random(7781)

SPECIES = ["Primula veris", "Silene dioica", "Gentiana lutea", "Anémone pulsatilla", "Trollius europaeus",
           "Dianthus carthusianorum", "Arnica montana"]
DRAWERS = ["A1", "A2", "B1", "B2", "C1"]
DATES = ["2019-11-04", "2020-05-11", "2020-11-09", "2021-05-10", "2021-11-08", "2022-05-09",
         "2022-11-07", "2023-05-08", "2023-11-06"]

rows = []
for date in DATES:
    temp = "" if rng.random() < 0.3 else round(rng.uniform(-20.5, -17.5), 1)
    for acc in rng.sample(range(1, 31), 14):
        species = rng.choice(SPECIES)
        rows.append({"accession": f"SB-{acc:03d}", "counted": date, "drawer": DRAWERS[acc % 5],
                     "species": rng.choice([species, species.lower(), " " + species]),
                     "seeds": rng.choice([0, 40, 120, 250, 400, 800, 1500]),
                     "grams": "N/A" if rng.random() < 0.06 else round(rng.uniform(0.2, 12.0), 2),
                     "temp_c": temp})
        temp = ""  # read once a day, first line only
        if rng.random() < 0.03:
            rows.append(dict(rows[-1]))
with open("data/counts.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.DictWriter(out, fieldnames=list(rows[0]))
    writer.writeheader()
    writer.writerows(rows)

new = []
for acc in range(31, 41):
    species = rng.choice(SPECIES)
    new.append({"accession": f"SB-{acc:03d}", "counted": "2024-05-13", "drawer": DRAWERS[acc % 5],
                "species": species, "seeds": rng.choice([60, 300, 900]),
                "grams": round(rng.uniform(0.5, 6.0), 2), "temp_c": "" if acc > 31 else -18.4})
with open("data/arrivals.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.DictWriter(out, fieldnames=list(new[0]))
    writer.writeheader()
    writer.writerows(new)

with open("data/species.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.writer(out)
    writer.writerow(["species", "family", "viable_seeds"])
    for name, family, viable in [("Primula veris", "Primulaceae", 100), ("Silene dioica", "Caryophyllaceae", 200),
                                 ("Gentiana lutea", "Gentianaceae", 150), ("Anémone pulsatilla", "Ranunculaceae", 100),
                                 ("Trollius europaeus", "Ranunculaceae", 120), ("Dianthus carthusianorum", "Caryophyllaceae", 0),
                                 ("Arnica montana", "Asteraceae", 250), ("Silene dioica", "Caryophyllaceae", 250),
                                 ("Saxifraga aizoides", "Saxifragaceae", 80)]:
        writer.writerow([name, family, viable])
