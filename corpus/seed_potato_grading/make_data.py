"""Make the sample data of seed_potato_grading (seeded: the same files every run).

The seed-potato cooperative keeps a sheet of field lots (one row per lot: field, variety, grower,
hectares; a hectare figure of 0 for a lot planted on a headland nobody measured, a blank variety
for a lot sown from mixed bags) and the grading shed's tally (lot codes in any case, a blank lot
where the label fell off, size grades typed as they came, 'N/A' or '-' kilograms for a box the
scale missed, the same box weighed twice, lots graded that are not on the sheet, and some
variety never graded in some size at all).
"""
import csv
import random

rng = random.Random(2290)

VARIETIES = ["Maris Piper", "Charlotte", "Pentland Javelin", "Rooster", "Désirée", ""]
GROWERS = ["Hollow Farm", "Long Acre", "Brynmor", "Øvre Lea"]
FIELDS = ["Top Field", "Mill Piece", "Church Close", "Long Meadow", "Brook Side"]

lots = []
for n in range(1, 25):
    lots.append({
        "lot": f"L{n:02d}",
        "field": rng.choice(FIELDS),
        "variety": rng.choice(VARIETIES),
        "grower": rng.choice(GROWERS),
        "hectares": rng.choice([0, 0.8, 1.2, 1.5, 2.0, 2.4, 3.1]),
    })
rng.shuffle(lots)
with open("data/lots.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.DictWriter(out, fieldnames=list(lots[0]))
    writer.writeheader()
    writer.writerows(lots)

SIZES = ["seed", "Seed", "ware", "Ware ", "chats", "oversize", "seed"]
boxes = []
for box in range(1, 231):
    lot = rng.randint(1, 27)  # 25-27 are not on the sheet
    code = f"L{lot:02d}"
    sizes = SIZES if lot % 5 else ["seed", "ware", "Seed"]  # some lots never give chats
    boxes.append({
        "box": f"X{box:04d}",
        "lot": "" if rng.random() < 0.03 else rng.choice([code, code, code.lower()]),
        "graded_on": f"2026-09-{rng.randint(1, 20):02d}",
        "size": rng.choice(sizes),
        "kg": rng.choice(["N/A", "-"]) if rng.random() < 0.05 else round(rng.uniform(180, 520), 1),
        "blight": rng.choice([0, 0, 0, 1, 2, 5]),
    })
    if rng.random() < 0.03:
        boxes.append(dict(boxes[-1]))  # weighed twice
rng.shuffle(boxes)
with open("data/grading.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.DictWriter(out, fieldnames=list(boxes[0]))
    writer.writeheader()
    writer.writerows(boxes)
