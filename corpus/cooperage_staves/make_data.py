"""Make the sample data of cooperage_staves (seeded: the same files every run).

The cooperage's order book is typed from the workshop's order cards: order references
written 'ORD/2024/17', 'ord-2024-0017' or 'Ord 2024 17', barrels described in words
('barrique 225L', 'Hogshead 300 l'), wood lots with the forest in any case (accents
included), coopers' names in any case with stray blanks, toast levels written five ways,
leak tests as free text ('leak 2 drops', 'weep at head x3'), 'n/a', 'tbc' or a blank for a
missing value, a card typed twice and the cards out of order. The lot list has a lot twice.
"""
import csv
import random
from datetime import date, timedelta

rng = random.Random(2609)

CLIENTS = ["Domaine des Ormeaux", "domaine des ormeaux ", "Cave de l'Étang", "CAVE DE L'ETANG",
           "Bodega Piedra Azul", "Clos Saint-Véran", "clos saint-véran", "Weingut am Hang",
           "Mazet du Ruisseau", "", "n/a"]
BARRELS = ["barrique 225L", "Barrique 225 l", "hogshead 300L", "Hogshead 300 l",
           "puncheon 500L", "demi-muid 600 L", "BARRIQUE 228L", "tonneau", "n/a"]
LOTS = ["FR-ALL-23-07", "fr-all-23-07", "FR-TRO-22-11", "Fr-Tro-22-11", "FR-BER-23-02",
        "HU-ZEM-21-03", "hu-zem-21-03", "US-MIS-22-05", "FR-JUP-23-09", "", "n/a"]
COOPERS = ["Éloi", "eloi", "ÉLOI ", "Gaspard", "gaspard ", "Margaux", "MARGAUX", "Théo",
           " théo", "Rosalind", "", "n/a"]
TOASTS = ["L", "light", "M", "medium", "M+", "medium plus", "Medium+", "H", "heavy", "HEAVY ",
          "", "n/a"]
LEAKS = ["pass", "PASS", "Pass ", "pass", "pass", "pass", "leak 2 drops", "Leak at croze x3",
         "weep at head", "WEEP x2 at stave 14", "leak 1 drop, rebunged", "n/a", "", "not tested"]

rows = []
day = date(2024, 1, 8)
for number in range(1, 421):
    day += timedelta(days=rng.choice([0, 0, 1, 1, 1, 2, 3]))
    style = rng.random()
    if style < 0.55:
        ref = f"ORD/{day.year}/{number}"
    elif style < 0.85:
        ref = f"ord-{day.year}-{number:04d}"
    else:
        ref = f"Ord {day.year} {number}"
    lead = rng.choice([18, 25, 32, 40, 46, 55, 61, 75, 90])
    delivered = day + timedelta(days=lead)
    if rng.random() < 0.08:
        delivered_text = rng.choice(["", "pending", "n/a", "tbc"])
    elif rng.random() < 0.4:
        delivered_text = delivered.strftime("%d/%m/%Y")
    else:
        delivered_text = delivered.isoformat()
    barrel = rng.choice(BARRELS)
    staves = rng.choice([27, 28, 29, 30, 31, 32, 33, 36, 42]) if rng.random() > 0.06 else ""
    price = round(rng.uniform(640, 1450), 0) if rng.random() > 0.07 else rng.choice(["tbc", "", "n/a"])
    rows.append({
        "order_ref": ref,
        "ordered": day.isoformat(),
        "delivered": delivered_text,
        "client": rng.choice(CLIENTS),
        "barrel": barrel,
        "wood_lot": rng.choice(LOTS),
        "cooper": rng.choice(COOPERS),
        "toast": rng.choice(TOASTS),
        "staves": staves,
        "qty": rng.choice([1, 1, 2, 2, 4, 6, 10, 12, 0]),
        "price_eur": price,
        "leak_test": rng.choice(LEAKS),
    })
rows += [dict(row) for row in rows if rng.random() < 0.03]  # card typed twice
rng.shuffle(rows)

with open("data/orders.csv", "w", newline="", encoding="utf-8") as fh:
    writer = csv.DictWriter(fh, fieldnames=list(rows[0]))
    writer.writeheader()
    writer.writerows(rows)

lots = [
    {"lot": "FR-ALL-23-07", "forest": "Allier", "seasoning_months": 24, "grain": "fine"},
    {"lot": "FR-TRO-22-11", "forest": "Tronçais", "seasoning_months": 36, "grain": "extra fine"},
    {"lot": "FR-BER-23-02", "forest": "Bertranges", "seasoning_months": 24, "grain": "fine"},
    {"lot": "HU-ZEM-21-03", "forest": "Zemplén", "seasoning_months": 30, "grain": "medium"},
    {"lot": "US-MIS-22-05", "forest": "Missouri Ozarks", "seasoning_months": 18, "grain": "medium"},
    {"lot": "FR-TRO-22-11", "forest": "Tronçais", "seasoning_months": 0, "grain": "extra fine"},
]
with open("data/wood_lots.csv", "w", newline="", encoding="utf-8") as fh:
    writer = csv.DictWriter(fh, fieldnames=["lot", "forest", "seasoning_months", "grain"])
    writer.writeheader()
    writer.writerows(lots)
