"""Make the sample data of snow_plough_depot (seeded: the same files every run).

The depot's shift sheets are typed in each morning from the drivers' cards: the route as
'r7/north', 'R-07 North' or 'R12/ valley', times as 'HH:MM' on the shift's day (a night
shift ends the next morning), salt in tonnes with a comma now and then, 'n/a' or 'kaputt'
where a reading is missing, drivers' names in any case, a blank truck, a few cards typed
twice, and the cards in no order at all.
"""
import csv
import random
from datetime import date, timedelta

rng = random.Random(1873)

TRUCKS = ["U-3", "u-3", "U-7", "U-7 ", "U-11", "unimog 2", "Unimog 2", "", "n/a"]
DRIVERS = ["Žofie", "zofie", "Ulrich", "ULRICH", "Ségolène", "Radka", "radka ", "Tobiáš",
           "", "n/a"]
ROUTES = ["r7/north", "R-07 North", "R7/north", "r12/ valley", "R-12 Valley", "r3/pass",
          "R-3 Pass", "r21/village", "R-21 village", "??", ""]
NOTES = ["", "", "", "", "blade worn", "Blade chipped", "spinner jammed", "SPINNER jam",
         "hit kerb", "n/a", "chains on", "Chains ON"]

rows = []
day = date(2024, 11, 18)
for card in range(1, 521):
    day += timedelta(days=rng.choice([0, 0, 0, 0, 0, 1]))
    start_h = rng.choice([3, 4, 4, 5, 6, 14, 18, 21, 22, 23])
    start_m = rng.choice([0, 15, 30, 45])
    length_min = rng.choice([180, 240, 300, 360, 420, 480, 540, 600])
    end_total = start_h * 60 + start_m + length_min
    end = f"{(end_total // 60) % 24:02d}:{end_total % 60:02d}"
    km = round(rng.uniform(12, 140), 1)
    salt = round(km * rng.uniform(0.02, 0.11), 2)
    salt_text = f"{salt}" if rng.random() > 0.15 else f"{salt}".replace(".", ",")
    rows.append({
        "card": card,
        "shift_day": day.isoformat() if rng.random() > 0.02 else "n/a",
        "start": f"{start_h:02d}:{start_m:02d}",
        "end": end if rng.random() > 0.04 else rng.choice(["", "n/a"]),
        "truck": rng.choice(TRUCKS),
        "driver": rng.choice(DRIVERS),
        "route": rng.choice(ROUTES),
        "km": km if rng.random() > 0.05 else rng.choice(["n/a", "kaputt"]),
        "salt_t": salt_text if rng.random() > 0.05 else "",
        "snow_cm": rng.choice([0, 2, 5, 8, 12, 15, 20, 30, 45, ""]),
        "air_c": rng.choice([-18, -12, -9, -6, -4, -2, 0, 1, 3, ""]),
        "note": rng.choice(NOTES),
    })
rows += [dict(row) for row in rows if rng.random() < 0.03]  # typed twice
rng.shuffle(rows)

with open("data/shift_sheets.csv", "w", newline="", encoding="utf-8") as fh:
    writer = csv.DictWriter(fh, fieldnames=list(rows[0]))
    writer.writeheader()
    writer.writerows(rows)

routes = [
    {"route": "R07", "area": "north", "km_planned": 64, "priority": 1},
    {"route": "R12", "area": "valley", "km_planned": 88, "priority": 2},
    {"route": "R03", "area": "pass", "km_planned": 41, "priority": 1},
    {"route": "R21", "area": "village", "km_planned": 23, "priority": 3},
    {"route": "R12", "area": "valley", "km_planned": 91, "priority": 2},   # re-measured
]
with open("data/routes.csv", "w", newline="", encoding="utf-8") as fh:
    writer = csv.DictWriter(fh, fieldnames=list(routes[0]))
    writer.writeheader()
    writer.writerows(routes)
