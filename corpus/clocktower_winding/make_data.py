"""Make the sample data of clocktower_winding (seeded: the same files every run).

The clock-keeper's book as typed up by the parish clerk: tower names in any case with
stray blanks and 'St.' or 'St', stamps written two ways, the drift noted as '+12s', '-3 s',
'slow 4' or 'fast 7', 'stopped' when the keeper found the hands still, weights and turns
left blank when not counted, entries typed twice, a page with no tower written at the top.
"""
import csv
import random
from datetime import datetime, timedelta

rng = random.Random(9120)

TOWERS = {"St Aldhelm": ["St Aldhelm", "st. aldhelm ", "St. Aldhelm"],
          "Market Hall": ["Market Hall", "MARKET HALL", " market hall"],
          "Église Ste-Foy": ["Église Ste-Foy", "église ste-foy"],
          "Corn Exchange": ["Corn Exchange", "corn exchange  "],
          "Harbour Gate": ["Harbour Gate"]}
KEEPERS = {"St Aldhelm": ["bede marlow", "Bede Marlow "], "Market Hall": ["Inés Ávila", "ines ávila"],
           "Église Ste-Foy": ["Odile Ferrand"], "Corn Exchange": ["bede marlow", "Tam Rudd"],
           "Harbour Gate": ["Tam Rudd", ""]}
REPAIRS = ["", "", "", "", "", "", "oiled pivots", "Oiled pivots", "new rope", "New line",
           "replaced pallet", "cleaned dial", "n/a", "new fly vane", "re-leaded weight"]
RUN_DAYS = {"St Aldhelm": 8, "Market Hall": 8, "Église Ste-Foy": 30, "Corn Exchange": 8,
            "Harbour Gate": 4}

rows = []
number = 0
for tower, spellings in TOWERS.items():
    at = datetime(2025, 1, 2, 8, 0) + timedelta(hours=rng.randrange(0, 60))
    while at < datetime(2025, 12, 20):
        number += 1
        fmt = "%Y-%m-%d %H:%M" if rng.random() < 0.75 else "%d/%m/%Y %H:%M"
        stamp = at.strftime(fmt)
        if rng.random() < 0.02:
            stamp = rng.choice(["", "n/a", "Tues am"])
        drift = round(rng.gauss(2, 9))
        drift_text = rng.choice([f"{drift:+d}s", f"{drift:+d} s", f"{drift:+d}",
                                 f"fast {abs(drift)}" if drift >= 0 else f"slow {abs(drift)}"])
        if rng.random() < 0.04:
            drift_text = rng.choice(["stopped", "n/a", ""])
        turns = rng.randrange(20, 90) if rng.random() > 0.06 else rng.choice(["", "n/a", -5])
        rows.append({
            "entry": number,
            "tower": rng.choice(spellings) if rng.random() > 0.02 else "",
            "keeper": rng.choice(KEEPERS[tower]),
            "wound_at": stamp,
            "drift": drift_text,
            "turns": turns,
            "weight_kg": rng.choice(["", "", "", 52, 55.5, 60, "n/a"]),
            "repair": rng.choice(REPAIRS),
            "cost": rng.choice([0, 0, 0, 12.5, 30, 48.75, ""]),
            "temp_c": round(rng.uniform(-6, 28), 1) if rng.random() > 0.1 else "",
        })
        step = max(2, RUN_DAYS[tower] // 2)
        at += timedelta(days=rng.choice([step, step, step - 1, step + 2, 0 if rng.random() < 0.05 else step]))
        at = at.replace(hour=rng.randrange(7, 11), minute=rng.randrange(0, 60))
rows += [dict(row) for row in rows if rng.random() < 0.025]  # typed twice
rng.shuffle(rows)

with open("data/winding_log.csv", "w", newline="", encoding="utf-8") as fh:
    writer = csv.DictWriter(fh, fieldnames=list(rows[0]))
    writer.writeheader()
    writer.writerows(rows)

with open("data/towers.csv", "w", newline="", encoding="utf-8") as fh:
    writer = csv.writer(fh)
    writer.writerow(["tower", "built", "run_days", "turns_full", "std_weight_kg", "bells"])
    writer.writerow(["St Aldhelm", 1862, 8, 85, 55.5, 6])
    writer.writerow(["Market Hall", 1904, 8, 70, 52, 1])
    writer.writerow(["Église Ste-Foy", 1788, 30, 60, 60, 3])
    writer.writerow(["Corn Exchange", 1899, 8, 0, 52, 0])  # rewound by motor: no turns
    writer.writerow(["Harbour Gate", "", 4, 40, "", 1])
    writer.writerow(["Market Hall", 1904, 7, 70, 52, 1])  # the card after the 1990 overhaul
