"""Make the sample data of seed_swap_library (seeded: the same files every run).

A seed swap library's exchange book (a member brings packets of one variety and takes packets of
another at one of the branches: variety names in any case with stray spaces, a blank 'taken'
when the member only gave, 'N/A' packets when nobody counted, a swap written twice, a branch
name with an accent) and the germination reports members send back (seeds sown and sprouted:
'N/A' and '-' for a report left blank, a tray of 0 seeds, a variety no one took, a variety
the library's list does not have). The variety list names each variety's family and the year
the library began saving it; one listed variety was never swapped nor sown.
"""
import csv
import random

rng = random.Random(4413)

VARIETIES = {"Pois de Clamart": ["Pois de Clamart", "pois de clamart", "Pois De Clamart "],
             "Cœur de Bœuf": ["Cœur de Bœuf", "cœur de bœuf"], "Black Krim": ["Black Krim", "BLACK KRIM"],
             "Bleu de Solaize": ["Bleu de Solaize"], "Red Kuri": ["Red Kuri", "red kuri "],
             "Borlotto": ["Borlotto", "borlotto"], "Lazy Housewife": ["Lazy Housewife"],
             "Rattlesnake": ["Rattlesnake"]}
BRANCHES = ["Harbour", "Hillside", "Mühlbach", "Old School"]
MEMBERS = [f"M{n:02d}" for n in range(1, 31)]
DAYS = ["2026-03-%02d" % d for d in (1, 7, 8, 14, 15, 21, 22, 28, 29)]

swaps = []
for n in range(1, 201):
    given, taken = rng.sample(list(VARIETIES), 2)
    swaps.append({
        "swap_id": f"X{n:03d}",
        "day": rng.choice(DAYS),
        "branch": rng.choice(BRANCHES),
        "member": rng.choice(MEMBERS),
        "given": rng.choice(VARIETIES[given]),
        "taken": "" if rng.random() < 0.08 else rng.choice(VARIETIES[taken]),
        "packets": "N/A" if rng.random() < 0.05 else rng.choice([1, 1, 2, 2, 3, 5]),
    })
    if rng.random() < 0.05:
        dup = dict(swaps[-1])
        dup["packets"] = rng.choice([1, 2])  # written twice, the second time corrected
        swaps.append(dup)
rng.shuffle(swaps)
with open("data/exchanges.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.DictWriter(out, fieldnames=list(swaps[0]))
    writer.writeheader()
    writer.writerows(swaps)

reports = []
for n in range(1, 161):
    variety = rng.choice(list(VARIETIES) + ["Tigerella"])
    sown = rng.choice([0, 6, 10, 12, 12, 20, 24])
    sprouted = 0 if sown == 0 else min(sown, max(0, round(sown * rng.uniform(0.3, 1.05))))
    reports.append({
        "report_id": n,
        "member": rng.choice(MEMBERS),
        "variety": rng.choice(VARIETIES.get(variety, [variety])),
        "sown": sown,
        "sprouted": rng.choice(["N/A", "-"]) if rng.random() < 0.06 else sprouted,
        "year": rng.choice([2025, 2026, 2026]),
    })
rng.shuffle(reports)
with open("data/reports.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.DictWriter(out, fieldnames=list(reports[0]))
    writer.writeheader()
    writer.writerows(reports)

with open("data/varieties.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.writer(out)
    writer.writerow(["variety", "family", "year"])
    writer.writerows([
        ("Pois de Clamart", "pea", 2011), ("Cœur de Bœuf", "tomato", 2009), ("Black Krim", "tomato", 2014),
        ("Bleu de Solaize", "leek", 2018), ("Red Kuri", "squash", 2012), ("Borlotto", "bean", 2010),
        ("Lazy Housewife", "bean", 2016), ("Rattlesnake", "bean", 2021), ("Ruby Chard", "chard", 2019),
    ])
