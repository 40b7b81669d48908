"""Make the sample data of lighthouse_stores_ledger (seeded: the same files every run).

A lighthouse's stores ledger, kept since 2021 in a pandas 1.x notebook: one line an issue of
stores (paraffin, wicks, coal, rations, ...) with the day and the clock time in two columns, the
keeper left blank when it was the same keeper as the line above, 'N/A' unit costs not yet
priced, an entry written twice, store names in stray case with blanks around them, keepers'
names with accents, issues of 0 units (a stock check).
"""
import csv
import random

rng = random.Random(7717)

STORES = ["paraffin", "Wicks", " coal", "rations ", "Lamp glass", "signal flares", "Brass polish"]
KEEPERS = ["Mòrag Ferrie", "Eoin Ó Dálaigh", "ailsa brodie", "Tòmas Mac Leòid"]
COSTS = {"paraffin": 1.15, "Wicks": 0.35, " coal": 2.4, "rations ": 3.75, "Lamp glass": 6.5,
         "signal flares": 12.25, "Brass polish": 0.85}

rows = []
n = 0
for month in range(1, 6):
    for day in sorted(rng.sample(range(1, 29), 6)):
        keeper = None
        for _ in range(rng.choice([2, 3, 4])):
            n += 1
            if keeper is None or rng.random() < 0.35:
                keeper = rng.choice(KEEPERS)
                shown = keeper
            else:
                shown = ""  # the same keeper as the line above
            store = rng.choice(STORES)
            qty = 0 if rng.random() < 0.04 else rng.choice([1, 2, 3, 4, 6, 10, 12])
            cost = "N/A" if rng.random() < 0.07 else COSTS[store]
            rows.append({"entry": f"E{n:04d}", "day": f"2021-{month:02d}-{day:02d}",
                         "time": "%02d:%02d" % (rng.choice([6, 8, 12, 18, 22]), rng.choice([0, 15, 30, 45])),
                         "store": store, "keeper": shown, "qty": qty, "unit_cost": cost})
            if rng.random() < 0.03:
                rows.append(dict(rows[-1], keeper=""))  # written twice
with open("data/ledger.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.DictWriter(out, fieldnames=list(rows[0]))
    writer.writeheader()
    writer.writerows(rows)
