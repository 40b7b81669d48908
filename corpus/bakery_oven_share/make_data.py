"""Make the sample data of bakery_oven_share (seeded: the same files every run).

A village's shared bread oven: members book a slot (oven and day), write how many loaves and
how much flour they used, and bring flour in deliveries logged on a separate sheet. The booking
sheet has names in any case with stray spaces, a booking typed twice, blank bakers on a torn
line, 'N/A' flour, zero-loaf bookings (the fire went out); the delivery sheet names the member
its own way, with '-' for an unweighed sack, a member who never baked and a baker who never
brought flour.
"""
import csv
import random

rng = random.Random(7310)

BAKERS = ["Agnès", "agnès ", "Bruno", "BRUNO", "Céline", "Dario", "Eilidh", "Fen", "Gosia", ""]
OVENS = ["wood", "deck", "deck ", "small", "clay"]
DAYS = ["Mon", "Tue", "Wed", "Thu", "Fri", "Sat"]
BREADS = ["rye", "spelt", "rye|spelt", "wheat", "wheat|rye", "sourdough|wheat|rye", ""]

rows = []
for n in range(1, 201):
    loaves = rng.choice([0, 2, 4, 6, 6, 8, 10, 12, 16, 20, 24])
    rows.append({
        "booking_id": f"B{n:04d}",
        "baker": rng.choice(BAKERS),
        "oven": rng.choice(OVENS),
        "day": rng.choice(DAYS),
        "loaves": loaves,
        "kg": "N/A" if rng.random() < 0.05 else round(loaves * rng.uniform(0.35, 0.6), 2),
        "breads": rng.choice(BREADS),
    })
    if rng.random() < 0.04:
        rows.append(dict(rows[-1]))  # typed twice
rng.shuffle(rows)
with open("data/bookings.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.DictWriter(out, fieldnames=list(rows[0]))
    writer.writeheader()
    writer.writerows(rows)

MEMBERS = ["Agnès", "Bruno", "Céline", "Dario", "Fen", "Gosia", "Hamid", None]
deliveries = []
for n in range(1, 91):
    deliveries.append({
        "delivery": f"D{n:03d}",
        "member": rng.choice(MEMBERS) or "",
        "flour": rng.choice(["rye", "spelt", "wheat", "Wheat", "einkorn"]),
        "kg": "-" if rng.random() < 0.07 else rng.choice([5, 10, 10, 12.5, 25]),
        "paid_eur": rng.choice([0, 8.5, 15, 22.75, 40, ""]),
    })
rng.shuffle(deliveries)
with open("data/flour_deliveries.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.DictWriter(out, fieldnames=list(deliveries[0]))
    writer.writeheader()
    writer.writerows(deliveries)
