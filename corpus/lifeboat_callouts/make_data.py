"""Make the sample data of lifeboat_callouts (seeded: the same files every run).

The station's call-out log is typed by whoever was on the pager: stamps with or without
seconds, 'n/a' for a time nobody noted, coxswains' names in any case, a blank boat, a few
shouts entered twice, and the sheets are out of order.
"""
import csv
import random
from datetime import datetime, timedelta

rng = random.Random(4417)

BOATS = ["all-weather", "All-Weather", "inshore", "Inshore ", "d-class", "", "n/a"]
COX = ["Marée", "maree", "Ógra", "Tamsin", "tamsin ", "Bréac", "Olwen", "", "n/a"]
CAUSES = ["yacht aground", "Yacht aground", "swimmer", "kayak capsized", "Kayak", "dog on cliff",
          "medevac", "MEDEVAC", "false alarm - good intent", "False Alarm", "fishing vessel",
          "n/a", ""]

rows = []
moment = datetime(2025, 1, 3, 6, 10)
for number in range(1, 621):
    moment += timedelta(minutes=rng.randrange(30, 60 * 36))
    paged = moment
    launch_min = rng.choice([6, 7, 8, 8, 9, 10, 11, 12, 14, 15, 18, 25])
    on_scene = rng.choice([10, 14, 18, 22, 30, 41, 55, 70])
    back = on_scene + rng.choice([20, 35, 60, 90, 120, 200])
    stamp = paged.strftime("%Y-%m-%d %H:%M:%S" if rng.random() < 0.3 else "%Y-%m-%d %H:%M")
    if rng.random() < 0.02:
        stamp = "n/a"
    rows.append({
        "shout_no": 2500 + number,
        "paged_at": stamp,
        "boat": rng.choice(BOATS),
        "coxswain": rng.choice(COX),
        "cause": rng.choice(CAUSES),
        "launch_min": launch_min if rng.random() > 0.06 else rng.choice(["", "n/a"]),
        "on_scene_min": on_scene if rng.random() > 0.08 else rng.choice(["", "n/a"]),
        "back_min": back if rng.random() > 0.04 else "",
        "crew": rng.choice([3, 4, 4, 5, 6, 6, 7, 0]),
        "persons_aided": rng.choice([0, 0, 1, 1, 1, 2, 3, 5, 12]),
        "fuel_l": round(rng.uniform(5, 400), 1) if rng.random() > 0.05 else "n/a",
        "sea_state": rng.choice(["1", "2", "3", "3", "4", "5", "6", "n/a", ""]),
    })
rows += [dict(row) for row in rows if rng.random() < 0.025]  # entered twice
rng.shuffle(rows)

with open("data/shouts.csv", "w", newline="", encoding="utf-8") as fh:
    writer = csv.DictWriter(fh, fieldnames=list(rows[0]))
    writer.writeheader()
    writer.writerows(rows)
