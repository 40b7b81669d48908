"""Make the sample data of ferry_delay_study (seeded: the same files every run).

A lake ferry line's sailings log for the spring timetable: each sailing's route (typed in any
case, with stray spaces, and one accented pier name), the scheduled departure, the passengers
and cars aboard, the wind, 'N/A' where the wind gauge was down, a blank delay where the mate
forgot to write it, a sailing logged twice, and a cancelled sailing with zero capacity (a zero
divisor for the load factor). A second file lists the routes' lengths and vessels.
"""
import csv
import random

rng = random.Random(4471)

ROUTES = {"North Pier": ["North Pier", "north pier", "North Pier "], "Île Verte": ["Île Verte", "île verte"],
          "Causeway": ["Causeway", "CAUSEWAY"], "Harbour Loop": ["Harbour Loop"]}
CAPACITY = {"North Pier": 120, "Île Verte": 80, "Causeway": 150, "Harbour Loop": 60}

rows = []
for n in range(1, 301):
    route = rng.choice(list(ROUTES))
    day = rng.randint(1, 61)
    month, dom = (3, day) if day <= 31 else (4, day - 31)
    hour = rng.choice([7, 8, 9, 11, 13, 15, 17, 18])
    passengers = rng.randint(0, CAPACITY[route])
    cars = rng.randint(0, 12)
    wind = round(rng.gammavariate(2.5, 6.0), 1)
    delay = 2 + wind * 0.35 + passengers * 0.04 + (4 if hour in (8, 17) else 0) + rng.gauss(0, 3)
    capacity = CAPACITY[route]
    if rng.random() < 0.02:
        capacity = 0  # the sailing was cancelled: no seats offered
    rows.append({
        "sailing": f"S{n:04d}",
        "route": rng.choice(ROUTES[route]),
        "departure": f"2026-{month:02d}-{dom:02d} {hour:02d}:{rng.choice([0, 15, 30, 45]):02d}",
        "passengers": passengers,
        "cars": cars,
        "capacity": capacity,
        "wind_kmh": "N/A" if rng.random() < 0.05 else wind,
        "delay_min": "" if rng.random() < 0.04 else round(max(delay, 0.0), 1),
    })
    if rng.random() < 0.03:
        rows.append(dict(rows[-1]))
rng.shuffle(rows)
with open("data/sailings.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.DictWriter(out, fieldnames=list(rows[0]))
    writer.writeheader()
    writer.writerows(rows)

with open("data/routes.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.writer(out)
    writer.writerow(["route", "length_km", "vessel"])
    writer.writerows([
        ("North Pier", 4.2, "Heron"), ("Île Verte", 6.8, "Bittern"), ("Causeway", 2.1, "Heron"),
        ("Harbour Loop", 3.5, "Little Auk"), ("Old Slip", 1.2, "Little Auk"),
    ])
