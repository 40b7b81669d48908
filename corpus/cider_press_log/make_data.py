"""Make the sample data of cider_press_log (seeded: the same files every run).

A village cider press's pressing log, kept since the 2021 season in a pandas 1.x notebook: the
day and the clock time in two columns, the press left blank when it was the same as the line
above, 'N/A' juice when the jug was not read, a pressing written twice, apples weighed as 0 kg
(a test run) with juice, orchard names with accents and stray case. The orchard list names each
orchard's village; one orchard is on it twice (it moved village), one never pressed.
"""
import csv
import random

rng = random.Random(4127)

ORCHARDS = ["Les Pommiers", "Brook Farm", "Hôtel-Dieu", "Old Vicarage", "Cœur de Lion", "Mill Lane"]
VARIETIES = ["Kingston Black", "Dabinett", "Yarlington Mill", "Bramley", "Reinette"]
DAYS = ["2021-09-%02d" % d for d in (18, 19, 25, 26)] + ["2021-10-%02d" % d for d in (2, 3, 9, 10, 16, 30)] \
    + ["2021-11-%02d" % d for d in (6, 7, 13)]

rows = []
n = 0
for day in DAYS:
    press = None
    for slot in range(rng.choice([8, 10, 12])):
        n += 1
        hour, minute = 8 + slot // 2, rng.choice([0, 10, 20, 30, 40, 50])
        if press is None or rng.random() < 0.3:
            press = rng.choice(["rack", "screw", "belt"])
            shown = press
        else:
            shown = ""  # the same press as the line above
        kg = 0 if rng.random() < 0.03 else rng.choice(range(40, 260, 5))
        juice = "N/A" if rng.random() < 0.06 else round(kg * rng.uniform(0.55, 0.7) + rng.choice([0, 2.5]), 1)
        rows.append({"pressing": f"P{n:04d}", "date": day, "time": "%02d:%02d" % (hour, minute),
                     "press": shown, "orchard": rng.choice(ORCHARDS),
                     "variety": rng.choice(VARIETIES).lower() if rng.random() < 0.2 else rng.choice(VARIETIES),
                     "apples_kg": kg, "juice_l": juice})
        if rng.random() < 0.03:
            rows.append(dict(rows[-1], press=""))  # written twice
with open("data/pressings.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.DictWriter(out, fieldnames=list(rows[0]))
    writer.writeheader()
    writer.writerows(rows)

with open("data/orchards.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.writer(out)
    writer.writerow(["orchard", "village", "members"])
    for name, village, members in [("Les Pommiers", "Ashby", 4), ("Brook Farm", "Ashby", 2),
                                   ("Hôtel-Dieu", "Saint-Clair", 7), ("Old Vicarage", "Ashby", 1),
                                   ("Cœur de Lion", "Saint-Clair", 3), ("Mill Lane", "Netherby", 0),
                                   ("Brook Farm", "Netherby", 2), ("Quince Row", "Netherby", 5)]:
        writer.writerow([name, village, members])
