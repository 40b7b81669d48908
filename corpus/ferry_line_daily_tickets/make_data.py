"""Make the sample data of ferry_line_daily_tickets (seeded: the same files every run).

A small island ferry line's ticket office writes one file a day (data/tickets-2026-03-DD.csv,
ten days; the 10th sorts before the 2nd by name, as it does for Dask and Polars alike): each
ticket's sailing, route, fare class, fare ('N/A' when the fare was waived, blank when the
machine lost it), passengers and vehicle (blank for foot passengers). A ticket is sometimes
printed twice. The route list names each route's crossing; one route sold on the quay
('QX') is not on it, and the list names one route twice (a winter timetable left in).
"""
import csv
import random

rng = random.Random(2026_03)

ROUTES = ["HB-IM", "HB-GR", "IM-GR", "GR-ÉC", "QX"]
CLASSES = ["Adulte", "Enfant", "Senior", "Résident", "Adulte"]
SAILINGS = ["06:40", "08:15", "11:30", "14:45", "17:20"]
FARES = {"Adulte": 12.5, "Enfant": 6.25, "Senior": 9.75, "Résident": 4.5}
DAYS = ["2026-03-%02d" % d for d in (1, 2, 3, 4, 5, 6, 7, 8, 9, 10)]

n = 0
for day in DAYS:
    rows = []
    for _ in range(rng.randint(11, 19)):
        n += 1
        kind = rng.choice(CLASSES)
        fare = FARES[kind] + rng.choice([0.0, 0.0, 1.25, 2.5])
        roll = rng.random()
        rows.append({
            "ticket": f"T{n:04d}",
            "day": day,
            "sailing": rng.choice(SAILINGS),
            "route": rng.choice(ROUTES),
            "fare_class": kind,
            "fare": "N/A" if roll < 0.05 else "" if roll < 0.09 else f"{fare:.2f}",
            "passengers": rng.choice([1, 1, 1, 2, 2, 3, 4]),
            "vehicle": rng.choice(["", "", "", "voiture", "camionnette", "vélo"]),
        })
        if rng.random() < 0.05:
            rows.append(dict(rows[-1]))  # printed twice
    with open(f"data/tickets-{day}.csv", "w", newline="", encoding="utf-8") as out:
        writer = csv.DictWriter(out, fieldnames=list(rows[0]))
        writer.writeheader()
        writer.writerows(rows)

with open("data/routes.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.writer(out)
    writer.writerow(["route", "route_name", "crossing_min", "season"])
    writer.writerows([
        ("HB-IM", "Havre-Bleu – Île-Mère", 35, "all year"),
        ("HB-GR", "Havre-Bleu – Grève-Rousse", 50, "all year"),
        ("IM-GR", "Île-Mère – Grève-Rousse", 20, "all year"),
        ("GR-ÉC", "Grève-Rousse – Écueil", 15, "summer"),
        ("GR-ÉC", "Grève-Rousse – Écueil (hiver)", 18, "winter"),
    ])
