"""Make the sample data of tide_mill_grinding (seeded: the same files every run).

The tide mill's grinding book is written up by whichever miller opened the sluice: the run
is noted as 'start–stop' clock times (a run may go past midnight), the grain as
'wheat/stoneground' or 'RYE / coarse', sacks as a number or 'n/a', millers' names in any
case, a blank stone for a run nobody noted, a few runs written twice, pages out of order.
"""
import csv
import random
from datetime import date, timedelta

rng = random.Random(9052)

STONES = ["french burr", "French Burr", "peak", "PEAK ", "cullin", "", "n/a"]
MILLERS = ["Hervé", "herve", "Isolde", "isolde ", "Jóhanna", "Kasimir", "Lúcás", "", "n/a"]
GRAINS = ["wheat/stoneground", "Wheat / fine", "RYE / coarse", "rye/fine", "spelt/ wholemeal",
          "oats", "barley/ pearl", "n/a", ""]
WEATHER = ["calm", "Calm", "gale", "SW gale", "fog", "spring tide", "Spring Tide", "neap", "", "n/a"]

rows = []
day = date(2025, 2, 1)
for number in range(1, 461):
    day += timedelta(days=rng.choice([0, 0, 1, 1, 2]))
    start_h = rng.randrange(0, 24)
    start_m = rng.choice([0, 5, 15, 20, 30, 45, 50])
    run_min = rng.choice([55, 80, 95, 120, 150, 180, 210, 240, 300])
    stop_total = start_h * 60 + start_m + run_min
    stop = f"{(stop_total // 60) % 24:02d}:{stop_total % 60:02d}"
    start = f"{start_h}:{start_m:02d}" if rng.random() < 0.3 else f"{start_h:02d}:{start_m:02d}"
    span = f"{start}-{stop}" if rng.random() < 0.6 else f"{start} - {stop}"
    if rng.random() < 0.03:
        span = rng.choice(["n/a", "", "all tide"])
    sacks = round(run_min / 60 * rng.uniform(1.5, 3.2), 1)
    rows.append({
        "run_id": number,
        "day": day.strftime("%Y-%m-%d") if rng.random() > 0.03 else day.strftime("%d.%m.%Y"),
        "span": span,
        "stone": rng.choice(STONES),
        "miller": rng.choice(MILLERS),
        "grain": rng.choice(GRAINS),
        "sacks": sacks if rng.random() > 0.06 else rng.choice(["n/a", ""]),
        "head_cm": rng.choice([40, 55, 70, 85, 95, 110, 130, 150, -5, ""]),
        "weather": rng.choice(WEATHER),
        "dressed": rng.choice(["", "", "", "", "", "yes", "Y", "n/a"]),
    })
rows += [dict(row) for row in rows if rng.random() < 0.03]  # written twice
rng.shuffle(rows)

with open("data/grinding_book.csv", "w", newline="", encoding="utf-8") as fh:
    writer = csv.DictWriter(fh, fieldnames=list(rows[0]))
    writer.writeheader()
    writer.writerows(rows)
