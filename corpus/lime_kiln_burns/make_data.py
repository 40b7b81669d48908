"""Make the sample data of lime_kiln_burns (seeded: the same files every run).

    python make_data.py [--rows N]   (about N readings; 400 by default, the shipped sample)

A restored lime kiln's firing log, kept since 2015 in a pandas 1.x notebook: one line a
thermocouple reading, the day written day-first and the clock time in a column of its own,
the burner left blank while the same burner tended the kiln, blank temperatures (the
thermocouple dropped out), 'N/A' fuel (the scale was away), kiln names in stray case with
blanks around them, a reading with no kiln, readings written twice, and a line with a note
typed into an extra field, which the notebook's read leaves out. The kiln list names one kiln
twice and leaves one out.
"""
import argparse
import csv
import random

parser = argparse.ArgumentParser()
parser.add_argument("--rows", type=int, default=400)
rows_wanted = parser.parse_args().rows

rng = random.Random(2015)

KILNS = ["Kiln Ruadh", "kiln ruadh ", "Fornace Nord", " fornace nord", "Four à Chaux",
         "Òrd Kiln", "òrd kiln"]
BURNERS = ["Séamus Ó Ceallaigh", "Ishbel MacRae", "Anwen Pryce", "Jòsaidh Dòmhnallach"]

lines = []
n = 0
day = 0
while len(lines) < rows_wanted:
    day += rng.choice([1, 2, 3, 5])
    month, dom = 4 + (day // 28) % 6, 1 + day % 28
    year = 2015 + day // 168
    kiln = rng.choice(KILNS)
    burner = None
    temp = 180.0
    for hour in range(6, 23, 2):
        n += 1
        if burner is None or rng.random() < 0.15:
            burner = rng.choice(BURNERS)
            shown = burner
        else:
            shown = ""  # the same burner as the line above
        temp = min(1180.0, temp + rng.choice([60.0, 95.5, 120.25, 140.0, 30.75]))
        reading = {"reading": f"R{n:05d}", "kiln": "" if rng.random() < 0.01 else kiln,
                   "date": f"{dom:02d}/{month:02d}/{year}",
                   "clock": f"{hour:02d}:{rng.choice([0, 10, 30, 45]):02d}",
                   "temp_c": "" if rng.random() < 0.08 else temp,
                   "fuel_kg": "N/A" if rng.random() < 0.05 else rng.choice([0, 12.5, 20, 25.5, 40]),
                   "burner": shown}
        lines.append(list(reading.values()))
        if rng.random() < 0.03:
            lines.append(list(reading.values()))  # written twice
        if n == 37:
            # a note typed into an extra field: a line with more fields than the header
            lines.append([f"R{n:05d}b", kiln, reading["date"], "23:00", 650.5, 10,
                          "", "draw-hole blocked"])

with open("data/readings.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.writer(out)
    writer.writerow(["reading", "kiln", "date", "clock", "temp_c", "fuel_kg", "burner"])
    writer.writerows(lines)

with open("data/kilns.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.writer(out)
    writer.writerow(["kiln", "parish", "capacity_t"])
    writer.writerows([["kiln ruadh", "Glen Ruadh", 6.5], ["Fornace Nord", "Nordholm", 4.0],
                      ["Four à chaux", "Saint-Aubin", 0],  # the pot was never measured: 0
                      ["Kiln Ruadh", "Glen Ruadh", 7.25]])  # listed twice: the later line holds
    # Òrd Kiln is not on the list
