"""Make the sample data of sheepdog_trials (seeded: the same files every run).

The society's run sheets are typed up by whoever was in the hut: handlers written
'Surname, First' in any case with stray blanks, the dog with its register number in
brackets, two ways of writing the date, 'n/a' or 'ret' where a phase was never judged
(the dog retired), the time as m:ss, sheets typed twice, a run with no class written down.
"""
import csv
import random
from datetime import date, timedelta

rng = random.Random(4417)

HANDLERS = ["Pryce, Siân", "pryce, siân ", "Ó Briain, Éilís", "o briain, éilís", "Marsh, Tobias",
            "MARSH, Tobias", "Lindqvist, Åsa", "Hale, Corran", " hale, corran", "Abernethy, Rhoda",
            "Quill, Dafydd"]
DOGS = {"Pryce": ["Moss (reg 31245)", "Fly (reg 4410)"],
        "Ó Briain": ["Bráthair (reg 27001)", "Nell (reg 902)"],
        "Marsh": ["Cap (reg 15520)", "cap (Reg 15520)"],
        "Lindqvist": ["Sölve (reg 33310)"],
        "Hale": ["Jess (reg 18876)", "Roy (reg 20004)"],
        "Abernethy": ["Glen (reg 11223)", "Meg (reg 7041)"],
        "Quill": ["Bwlch (reg 30111)"]}
CLASSES = ["Open", "open ", "NOVICE", "Novice", "Nursery", "nursery", "pro-novice", "Pro Novice", ""]
GROUNDS = ["Fell End", " fell end", "Cwm Hir", "cwm hir ", "Côte Basse"]
JUDGES = ["M. Arkwright", "R. Tallis", "E. Vane"]
WEATHER = ["Fine", "fine", "Wet", "wet, windy", "WINDY", "Rain", "drizzle", "n/a", ""]
FAULTS = ["", "", "", "", "cross", "cross; grip", "Grip", "circled", "circled; cross", "off course",
          "n/a", "shed missed;cross"]
MAX_LOST = {"outrun": 20, "lift": 10, "fetch": 20, "drive": 30, "shed": 10, "pen": 10}

start = date(2025, 4, 5)
trial_days = [start + timedelta(days=7 * w + rng.choice([0, 1])) for w in range(16)]
rows = []
for number in range(1, 421):
    handler = rng.choice(HANDLERS)
    surname = handler.split(",")[0].strip().title().replace("Ó briain", "Ó Briain").replace("O briain", "Ó Briain")
    dog = rng.choice(DOGS.get(surname, ["Sky (reg 100)"]))
    day = rng.choice(trial_days)
    stamp = day.isoformat() if rng.random() < 0.7 else day.strftime("%d/%m/%Y")
    if rng.random() < 0.03:
        stamp = rng.choice(["", "tbc"])
    retired = rng.random() < 0.08
    row = {"run_no": number, "trial_date": stamp, "ground": rng.choice(GROUNDS),
           "class": rng.choice(CLASSES), "handler": handler, "dog": dog,
           "judge": rng.choice(JUDGES)}
    phase_done = True
    for phase, most in MAX_LOST.items():
        if retired and phase_done and rng.random() < 0.4:
            phase_done = False
        if not phase_done:
            row[phase] = "ret"
        elif rng.random() < 0.04:
            row[phase] = rng.choice(["", "n/a"])
        else:
            row[phase] = min(most, int(rng.expovariate(4 / most)))
    secs = rng.randrange(300, 900)
    row["run_time"] = f"{secs // 60}:{secs % 60:02d}"
    if retired or rng.random() < 0.04:
        row["run_time"] = rng.choice(["retired", "n/a", ""])
    row["faults"] = rng.choice(FAULTS)
    row["weather"] = rng.choice(WEATHER)
    rows.append(row)
rows += [dict(row) for row in rows if rng.random() < 0.03]  # sheets typed twice
rng.shuffle(rows)

with open("data/runs.csv", "w", newline="", encoding="utf-8") as fh:
    writer = csv.DictWriter(fh, fieldnames=list(rows[0]))
    writer.writeheader()
    writer.writerows(rows)

with open("data/classes.csv", "w", newline="", encoding="utf-8") as fh:
    writer = csv.writer(fh)
    writer.writerow(["class", "max_points", "time_allowed_min", "entry_fee"])
    writer.writerow(["open", 100, 15, 12.5])
    writer.writerow(["pro-novice", 100, 13, 10])
    writer.writerow(["novice", 90, 12, 8])
    writer.writerow(["nursery", 80, 10, 0])
