"""Make the sample data of ferry_pontoon_tides (seeded: the same files every run).

A river ferry's two pontoons (east and west bank) let visiting boats moor for a fee that
depends on the boat's class. Each pontoon keeps its own sheet: boat names in any case, a class
written 'N/A' or left blank, an arrival time missing where the warden forgot, hours of zero
(a boat that only dropped someone off), fees 'N/A' where nobody paid yet, the same visit typed
twice. The harbour office logs the river level every 30 minutes with gaps where the gauge was
down.
"""
import csv
import random

rng = random.Random(4417)

BOATS = ["Kestrel", "kestrel", "Otter", "Möwe", "Moewe", "Heron II", "Lark", "Brisé", "Tern", "Puffin "]
CLASSES = ["dinghy", "cruiser", "narrowboat", "Cruiser", "N/A", "", "barge"]


def sheet(path, prefix, count):
    rows = []
    for n in range(1, count + 1):
        hour, minute = rng.randrange(6, 20), rng.choice([0, 7, 15, 22, 30, 41, 45, 58])
        hours = rng.choice([0, 1, 2, 2, 3, 4, 6, 8, 12, 24])
        rows.append({
            "visit": f"{prefix}{n:03d}",
            "boat": rng.choice(BOATS),
            "boat_class": rng.choice(CLASSES),
            "arrived": "" if rng.random() < 0.05 else f"2025-06-{rng.randrange(10, 13)} {hour:02d}:{minute:02d}",
            "hours": hours,
            "paid": "N/A" if rng.random() < 0.12 else rng.choice([0, 4.5, 9, 12.75, 18, 30]),
        })
        if rng.random() < 0.04:
            rows.append(dict(rows[-1]))
    rng.shuffle(rows)
    with open(path, "w", newline="", encoding="utf-8") as out:
        writer = csv.DictWriter(out, fieldnames=list(rows[0]))
        writer.writeheader()
        writer.writerows(rows)


sheet("data/east_pontoon.csv", "E", 110)
sheet("data/west_pontoon.csv", "W", 90)

levels = []
for day in (10, 11, 12):
    for half in range(48):
        if rng.random() < 0.08:
            continue  # the gauge was down
        level = 2.0 + 1.6 * ((half % 25) / 12.5 - 1) ** 2 + rng.uniform(-0.2, 0.2)
        levels.append({
            "read_at": f"2025-06-{day} {half // 2:02d}:{30 * (half % 2):02d}",
            "level_m": "" if rng.random() < 0.04 else round(level, 2),
        })
with open("data/river_levels.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.DictWriter(out, fieldnames=list(levels[0]))
    writer.writeheader()
    writer.writerows(levels)
