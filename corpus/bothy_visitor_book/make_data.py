"""Make the sample data of bothy_visitor_book (seeded: the same files every run).

    python make_data.py [--rows N]   (about N visits; 300 by default, the shipped sample)

A mountain bothy association's visitor books, typed up since 2016 in a pandas 1.x notebook:
one line a party's stay, the bothy's name in stray case with blanks around it (one line
without a bothy), where the party walked in from (accented names, some blank), the party's
size, the nights (blank when the party wrote them on the next line), the season the
warden ticked, the donation left ('N/A' when the box was not opened), lines copied twice.
A second book found late has the same columns but the fuel bags. The tariff lists the
suggested donation per person-night for each season; the closed list names the bothies shut
for repair (one column), whose lines are left out.
"""
import argparse
import csv
import random

parser = argparse.ArgumentParser()
parser.add_argument("--rows", type=int, default=300)
rows_wanted = parser.parse_args().rows

rng = random.Random(1604)

BOTHIES = ["Coire Dubh", "coire dubh ", "Allt na Fèithe", " allt na fèithe", "Shiel Howe",
           "Lòn Mòr", "Black Sike"]
TOWNS = ["Inbhir Nis", "Glasgow", "Zürich", "Kraków", "Besançon", "Ålesund", "", "Fort William"]
SEASONS = {1: "winter", 2: "winter", 3: "shoulder", 4: "shoulder", 5: "summer", 6: "summer",
           7: "summer", 8: "summer", 9: "shoulder", 10: "shoulder", 11: "winter", 12: "winter"}


def visit(n: int) -> dict:
    year = rng.choice([2016, 2017])
    month = rng.randint(1, 12)
    nights = "" if rng.random() < 0.06 else rng.choice([1, 1, 2, 3])
    return {"entry": f"V{n:04d}", "bothy": "" if rng.random() < 0.015 else rng.choice(BOTHIES),
            "arrived": f"{year}-{month:02d}-{rng.randint(1, 28):02d}",
            "from_town": rng.choice(TOWNS), "party": rng.choice([1, 2, 2, 3, 4, 6]),
            "nights": nights, "season": SEASONS[month],
            "donation": "N/A" if rng.random() < 0.08 else rng.choice([0, 5, 10, 12.5, 20, 7.5]),
            "fuel_bags": rng.choice([0, 0, 1, 2])}


main, late = [], []
n = 0
while len(main) + len(late) < rows_wanted:
    n += 1
    row = visit(n)
    (late if rng.random() < 0.1 else main).append(row)
    if rng.random() < 0.03:
        main.append(dict(row))  # copied twice
main.sort(key=lambda r: r["arrived"])
with open("data/visits.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.DictWriter(out, fieldnames=list(main[0]))
    writer.writeheader()
    writer.writerows(main)
with open("data/late_book.csv", "w", newline="", encoding="utf-8") as out:
    fields = [f for f in late[0] if f != "fuel_bags"]
    writer = csv.DictWriter(out, fieldnames=fields, extrasaction="ignore")
    writer.writeheader()
    writer.writerows(late)
with open("data/tariff.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.writer(out)
    writer.writerow(["bothy", "summer", "shoulder", "winter"])
    writer.writerows([["Coire Dubh", 5.0, 4.0, 3.5], ["Allt Na Fèithe", 4.5, 3.0, 2.5],
                      ["Shiel Howe", 6.0, 5.0, 4.0], ["Lòn Mòr", 4.0, 4.0, 3.0]])
    # Black Sike has no tariff
with open("data/closed.csv", "w", newline="", encoding="utf-8") as out:
    out.write("bothy\nShiel Howe\n")
