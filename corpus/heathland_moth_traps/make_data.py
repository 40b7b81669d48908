"""Make the sample data of heathland_moth_traps (seeded: the same files every run).

A heathland warden's moth-trap book, one line per trap and night: trap sites typed in any
case, a night whose site was left blank, temperatures read off a wet thermometer as 'n/a',
wind left blank on calm nights, a trap emptied twice and written twice, and a few nights with
no moths at all. A second file holds the traps' habitats.
"""
import csv
import datetime as dt
import random

rng = random.Random(4411)

SITES = ["Gorse Hill", "gorse hill", "Bog Edge", "Pine Belt", "pine belt ", "Sandpit", "Lièvre Copse", ""]
HABITATS = [("Gorse Hill", "heath"), ("Bog Edge", "mire"), ("Pine Belt", "woodland"),
            ("Sandpit", "bare"), ("Lièvre Copse", "woodland"), ("Old Barn", "farm")]

rows = []
start = dt.date(2024, 5, 1)
for n in range(260):
    night = start + dt.timedelta(days=rng.randint(0, 120))
    temp = round(rng.gauss(13.0, 3.5), 1)
    wind = "" if rng.random() < 0.12 else round(abs(rng.gauss(9.0, 6.0)), 1)
    moon = rng.randint(0, 100)
    cloud = rng.randint(0, 8)
    expected = max(0.0, 4 + temp * 2.2 - (wind if isinstance(wind, float) else 0) * 0.8
                   - moon * 0.05 + cloud * 0.9)
    catch = 0 if rng.random() < 0.05 else max(0, int(rng.gauss(expected, 6)))
    rows.append({
        "trap": f"T{rng.randint(1, 9)}",
        "site": rng.choice(SITES),
        "night": night.isoformat(),
        "temp_c": "n/a" if rng.random() < 0.04 else temp,
        "wind_kmh": wind,
        "moon_pct": moon,
        "cloud_okta": cloud,
        "catch": catch,
        "species": min(catch, rng.randint(0, 30)),
    })
    if rng.random() < 0.03:
        rows.append(dict(rows[-1]))

with open("data/traps.csv", "w", newline="", encoding="utf-8") as f:
    writer = csv.DictWriter(f, fieldnames=list(rows[0]))
    writer.writeheader()
    writer.writerows(rows)

with open("data/habitats.csv", "w", newline="", encoding="utf-8") as f:
    writer = csv.writer(f)
    writer.writerow(["site", "habitat"])
    writer.writerows(HABITATS)
