"""Make the sample data of radio_pledge_drive (seeded: the same files every run).

A community radio station's pledge week: the volunteer rota (who sat at the desk or the phones,
which show, the hours written '2' or '2.5' or 'N/A' when the sheet was not signed, a volunteer
written in any case, a blank name for an unfilled slot, a slot typed twice) and the listener
pledges taken on the phones (the show the listener named, a blank show when the caller could not
say, the amount, 'N/A' for a pledge promised with no sum, the way it was paid, the pledge taken
by a volunteer or left blank when it came in by post). One show on the schedule drew no pledge
at all; one pledge names a show that is not on the schedule.
"""
import csv
import random

rng = random.Random(3307)

VOLUNTEERS = ["Anwen Tye", "anwen tye", "Bastien Roux", "Cai Morrow", "CAI MORROW", "Dilys Hart",
              "Émile Sand", "Ffion Lake", "Gus Pennant", ""]
SHOWS = ["Breakfast", "Folk Hour", "Jazz Late", "Farming Today", "Kids Club", "Drive"]
ROLES = ["desk", "phones", "phones", "studio"]
DAYS = ["2026-03-%02d" % d for d in (9, 10, 11, 12, 13, 16, 17)]

rota = []
for n in range(1, 151):
    rota.append({
        "slot": f"R{n:03d}",
        "day": rng.choice(DAYS),
        "show": rng.choice(SHOWS),
        "volunteer": rng.choice(VOLUNTEERS),
        "role": rng.choice(ROLES),
        "hours": rng.choice(["2", "2.5", "1", "3", "N/A", "0.5"]),
    })
    if rng.random() < 0.04:
        rota.append(dict(rota[-1]))
rng.shuffle(rota)
with open("data/rota.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.DictWriter(out, fieldnames=list(rota[0]))
    writer.writeheader()
    writer.writerows(rota)

TAKERS = ["Anwen Tye", "Bastien Roux", "Cai Morrow", "Dilys Hart", "Émile Sand", "Ffion Lake", ""]
PLEDGE_SHOWS = ["Breakfast", "Folk Hour", "Jazz Late", "Farming Today", "Drive", "Gardeners' Q", ""]
METHODS = ["card", "card", "standing order", "cheque", "cash", "Card"]
pledges = []
for n in range(1, 221):
    pledges.append({
        "pledge": f"P{n:04d}",
        "day": rng.choice(DAYS),
        "show": rng.choice(PLEDGE_SHOWS),
        "taken_by": rng.choice(TAKERS),
        "method": rng.choice(METHODS),
        "amount": "N/A" if rng.random() < 0.05 else rng.choice([5, 10, 10, 15, 20, 25, 50, 12.5, 100]),
    })
rng.shuffle(pledges)
with open("data/pledges.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.DictWriter(out, fieldnames=list(pledges[0]))
    writer.writeheader()
    writer.writerows(pledges)

with open("data/schedule.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.writer(out)
    writer.writerow(["show", "presenter", "slot_hours", "target"])
    writer.writerows([
        ("Jazz Late", "Mo Quill", 2, 600), ("Breakfast", "Rhian Teg", 3, 1200),
        ("Drive", "Sol Arden", 2, 900), ("Folk Hour", "Tegwen Bal", 1, 400),
        ("Farming Today", "Huw Penn", 1, 0), ("Kids Club", "Pip Orme", 1, 200),
    ])
