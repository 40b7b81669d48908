"""Make the sample data of rowing_club_regatta (seeded: the same files every run).

A lake rowing club's boathouse book (a boat taken out by a crew: boat names in any case with
stray spaces, the minutes out, 'N/A' when the boat came back unsigned, a booking written twice,
a blank boat where the page was wet) and the summer regatta's results (each heat's crews with
their times in seconds, 'DNF' for a crew that did not finish, dead heats, a crew racing a class
the club list does not have). The fleet list names each boat's class and seats; one boat on it
(the old coxed four) was never booked.
"""
import csv
import random

rng = random.Random(6619)

BOATS = {"Kingfisher": ["Kingfisher", "kingfisher", "Kingfisher "], "Grebe": ["Grebe", "GREBE"],
         "Coot": ["Coot"], "Mallard": ["Mallard", "mallard"], "Heron II": ["Heron II"],
         "Brèche": ["Brèche", "brèche"], "Swift": ["Swift"]}
CREWS = ["Juniors", "Masters A", "Masters B", "Novices", "Seniors", "juniors"]
DAYS = ["2026-05-%02d" % d for d in (2, 3, 9, 10, 16, 17, 23, 24, 30, 31)]

book = []
for n in range(1, 181):
    boat = rng.choice(list(BOATS))
    book.append({
        "booking": f"B{n:03d}",
        "day": rng.choice(DAYS),
        "boat": "" if rng.random() < 0.03 else rng.choice(BOATS[boat]),
        "crew": rng.choice(CREWS),
        "session": rng.choice(["am", "pm", "pm", "eve"]),
        "minutes": "N/A" if rng.random() < 0.05 else rng.choice([30, 45, 60, 60, 75, 90, 120]),
    })
    if rng.random() < 0.04:
        book.append(dict(book[-1]))
rng.shuffle(book)
with open("data/bookings.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.DictWriter(out, fieldnames=list(book[0]))
    writer.writeheader()
    writer.writerows(book)

CLASSES = ["single", "double", "four", "eight"]
CLUBS = ["Lakeside RC", "Marrow Oars", "Tarn Vale", "Lakeside RC"]
results = []
for event in CLASSES + ["quad"]:  # 'quad' is not a class on the club list
    for heat in (1, 2, 3):
        lanes = rng.sample([1, 2, 3, 4, 5], k=rng.choice([3, 4, 5]))
        base = {"single": 470, "double": 430, "four": 400, "eight": 370, "quad": 390}[event]
        for lane in lanes:
            t = base + rng.choice(range(0, 40))
            results.append({
                "event": event,
                "heat": heat,
                "lane": lane,
                "club": rng.choice(CLUBS),
                "crew": rng.choice(["A", "B", "Vets", "Jnr"]),
                "seconds": "DNF" if rng.random() < 0.06 else t,
            })
        if rng.random() < 0.5:
            # a dead heat: copy a time onto another lane's crew
            results[-1]["seconds"] = results[-2]["seconds"]
rng.shuffle(results)
with open("data/results.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.DictWriter(out, fieldnames=list(results[0]))
    writer.writeheader()
    writer.writerows(results)

with open("data/fleet.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.writer(out)
    writer.writerow(["boat", "class", "seats", "built"])
    writer.writerows([
        ("Swift", "single", 1, 2019), ("Kingfisher", "double", 2, 2011), ("Grebe", "four", 4, 2008),
        ("Coot", "single", 1, 2022), ("Mallard", "eight", 8, 1999), ("Heron II", "four", 4, 2015),
        ("Brèche", "double", 2, 2024), ("Old Tom", "four", 5, 1987),
    ])
