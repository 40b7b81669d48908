"""Make the sample data of orchard_coop_weighbridge (seeded: the same files every run).

An orchard co-op's weighbridge prints one file a week in the apple harvest
(data/weighbridge-week-NN.csv, weeks 36 to 44): each load's grower, variety (in any case, with
stray spaces now and then), gross and tare weights in kg (tare 'N/A' when the trailer was not
weighed empty, blank when the printer skipped it), the bins on the trailer and the grade the
yard gave ('A', 'B', 'jus' for juice apples, blank when nobody graded it). A load is sometimes
printed twice. The growers' list names each grower's farm and valley; one grower
('G09', a new member) is not on it yet.
"""
import csv
import random

rng = random.Random(4417)

GROWERS = ["G01", "G02", "G03", "G04", "G05", "G09"]
VARIETIES = ["Reinette", "reinette ", "Boskoop", "Calville", "Cox's Orange", "Belle de Boskoop"]
WEEKS = list(range(36, 45))

n = 0
for week in WEEKS:
    rows = []
    for _ in range(rng.randint(6, 12)):
        n += 1
        bins = rng.randint(2, 12)
        tare = rng.choice([1450.0, 1520.5, 1980.0, 2210.0])
        gross = tare + bins * rng.choice([285.0, 301.5, 318.0, 322.5])
        roll = rng.random()
        rows.append({
            "load": f"L{n:03d}",
            "week": week,
            "grower": rng.choice(GROWERS),
            "variety": rng.choice(VARIETIES),
            "gross_kg": gross,
            "tare_kg": "N/A" if roll < 0.05 else "" if roll < 0.08 else tare,
            "bins": bins,
            "grade": rng.choice(["A", "A", "B", "jus", ""]),
        })
        if rng.random() < 0.06:
            rows.append(dict(rows[-1]))  # printed twice
    with open(f"data/weighbridge-week-{week}.csv", "w", newline="", encoding="utf-8") as out:
        writer = csv.DictWriter(out, fieldnames=list(rows[0]))
        writer.writeheader()
        writer.writerows(rows)

with open("data/growers.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.writer(out)
    writer.writerow(["grower", "farm", "valley", "organic"])
    writer.writerows([
        ("G01", "Les Prés Hauts", "Vallée d'Aulne", "yes"),
        ("G02", "Ferme du Moulin", "Vallée d'Aulne", "no"),
        ("G03", "Verger Sainte-Gêne", "Combe Noire", "yes"),
        ("G04", "Clos des Frênes", "Combe Noire", "no"),
        ("G05", "La Côte Grise", "Vallée d'Aulne", "no"),
    ])
