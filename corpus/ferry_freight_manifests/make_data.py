"""Make the sample data of ferry_freight_manifests (seeded: the same files every run).

An island ferry line's freight manifests, kept in a pandas 1.x notebook since 2022: one line a
vehicle or pallet on a sailing, with its deck, weight in tonnes, axles and the fee charged.
The weight is blank where the weighbridge was down (the next reading on the same deck is used),
'N/A' fees were not charged yet, a consignment is written twice, some pallets weigh 0 t, and
consignees carry accents. The sailings list gives each sailing's route and the rate per tonne
for each deck (one column per deck), a sailing listed twice.
"""
import csv
import random

rng = random.Random(9043)

ROUTES = {"S%03d" % n: rng.choice(["Porthaven–Isle Brae", "Isle Brae–Skerry", "Porthaven–Skerry"])
          for n in range(1, 19)}
CONSIGNEES = ["Brae Stores", "Skerry Fish Co", "Højland Timber", "Île Verte Dairy", "Mòr Quarry",
              "brae stores", "Porthaven Post"]
DECKS = ["main", "upper", "open"]
CARGO = ["van", "lorry", "pallet", "trailer", "car"]

rows = []
n = 0
for sailing in ROUTES:
    day = 1 + int(sailing[1:]) * 3 % 28
    month = 1 + int(sailing[1:]) % 4
    for _ in range(rng.choice([6, 8, 10, 12])):
        n += 1
        cargo = rng.choice(CARGO)
        weight = "" if rng.random() < 0.08 else (0 if rng.random() < 0.04 else round(rng.uniform(0.5, 38), 2))
        rows.append({"consignment": f"C{n:04d}", "sailing": sailing, "sailed": f"2023-{month:02d}-{day:02d}",
                     "deck": rng.choice(DECKS), "cargo": cargo, "consignee": rng.choice(CONSIGNEES),
                     "weight_t": weight, "axles": 0 if cargo == "pallet" else rng.choice([2, 2, 3, 4, 5]),
                     "fee": "N/A" if rng.random() < 0.07 else rng.choice([45, 60, 80, 120, 150, 210])})
        if rng.random() < 0.03:
            rows.append(dict(rows[-1]))
with open("data/manifests.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.DictWriter(out, fieldnames=list(rows[0]))
    writer.writeheader()
    writer.writerows(rows)

with open("data/sailings.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.writer(out)
    writer.writerow(["sailing", "route", "main", "upper", "open"])
    for sailing, route in ROUTES.items():
        writer.writerow([sailing, route, rng.choice([4.5, 5.0, 5.5]), rng.choice([6.0, 6.25]), rng.choice([3.0, 3.5])])
    writer.writerow(["S004", ROUTES["S004"], 4.5, 6.0, 3.0])  # listed twice
