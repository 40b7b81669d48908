"""Make the sample data of harbour_crane_shifts (seeded: the same files every run).

The crane drivers' lift sheets are typed up by the shift foreman: crane names in any case and
with stray spaces, a blank crane where the sheet was torn, 'N/A' for tonnes nobody weighed, lift
counts of zero or below for a crane that was down (a correction written as a negative), the odd
sheet entered twice, and the sheets in the order they came off the clipboard.
"""
import csv
import random

rng = random.Random(5521)

CRANES = ["Heron", "heron", "Heron ", "Stork", "STORK", "Crane 3", "Ibis", "Ibís", ""]
SHIFTS = ["early", "late", "night", "Night"]
BERTHS = ["B1", "B2", "B3", "b2", "N/A"]

rows = []
for sheet in range(1, 261):
    lifts = rng.choice([0, 3, 7, 12, 12, 18, 24, 31, 40, -2])
    tonnes = round(rng.uniform(2.0, 95.0) * max(lifts, 1) / 10, 1)
    rows.append({
        "sheet": f"S{sheet:04d}",
        "crane": rng.choice(CRANES),
        "shift": rng.choice(SHIFTS),
        "berth": rng.choice(BERTHS),
        "lifts": lifts,
        "tonnes": "N/A" if rng.random() < 0.06 else tonnes,
        "stopped_min": rng.choice([0, 0, 0, 5, 15, 40, "", "n/a"]),
    })
    if rng.random() < 0.03:
        rows.append(dict(rows[-1]))  # the same sheet typed twice
rng.shuffle(rows)

with open("data/lifts.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.DictWriter(out, fieldnames=list(rows[0]))
    writer.writeheader()
    writer.writerows(rows)
