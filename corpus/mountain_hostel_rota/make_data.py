"""Make the sample data of mountain_hostel_rota (seeded: the same files every run).

A mountain hostel network's booking sheet (a party staying one night in a hostel's dorm: hostel
names with stray spaces, 'N/A' guests when the warden did not count, a stay typed twice, a blank
hostel where the sheet was torn, nights out of order, one night before the season opens) and its
cleaning rota (a cleaner's visit to a hostel with the tasks done, written as 'beds; showers' in
any case, a blank task list, minutes missing). The hostel list gives each hostel's beds: the
winter room has 0 beds in summer, and one hostel on the list had no guest at all.
"""
import csv
import random

rng = random.Random(2107)

HOSTELS = {"Col du Lac": ["Col du Lac", "Col du Lac "], "Refuge Écrins": ["Refuge Écrins", " Refuge Écrins"],
           "Alpe Verte": ["Alpe Verte"], "Grauhorn": ["Grauhorn", "Grauhorn  "], "Winter Room": ["Winter Room"],
           "Bergsee": ["Bergsee"]}
NIGHTS = ["2026-07-%02d" % d for d in range(1, 32)] + ["2026-06-30"]

stays = []
for n in range(1, 211):
    hostel = rng.choice(list(HOSTELS))
    stays.append({
        "stay_id": f"S{n:04d}",
        "hostel": "" if rng.random() < 0.03 else rng.choice(HOSTELS[hostel]),
        "night": rng.choice(NIGHTS[:-1]) if rng.random() > 0.01 else NIGHTS[-1],
        "dorm": rng.choice(["A", "B", "B", "C"]),
        "guests": "N/A" if rng.random() < 0.05 else rng.choice([1, 2, 2, 3, 4, 6, 8]),
        "party": rng.choice(["walkers", "climbers", "school", "family", "cyclists"]),
    })
    if rng.random() < 0.04:
        stays.append(dict(stays[-1]))
rng.shuffle(stays)
with open("data/stays.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.DictWriter(out, fieldnames=list(stays[0]))
    writer.writeheader()
    writer.writerows(stays)

TASKS = ["beds", "Beds", "showers", "kitchen", "KITCHEN", "bins", "windows"]
CLEANERS = ["Ana", "Bruno", "Céline", "Dario", "Ebba"]
rota = []
for n in range(1, 141):
    k = rng.choice([1, 1, 2, 3])
    tasks = "; ".join(rng.sample(TASKS, k))
    rota.append({
        "visit": n,
        "day": rng.choice(NIGHTS[:-1]),
        "hostel": rng.choice(["Col du Lac", "Refuge Écrins", "Alpe Verte", "Grauhorn", "Bergsee", "Hütte Nord"]),
        "cleaner": rng.choice(CLEANERS),
        "tasks": "" if rng.random() < 0.04 else tasks,
        "minutes": "" if rng.random() < 0.05 else rng.choice([30, 45, 45, 60, 90, 120]),
    })
rng.shuffle(rota)
with open("data/rota.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.DictWriter(out, fieldnames=list(rota[0]))
    writer.writeheader()
    writer.writerows(rota)

with open("data/hostels.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.writer(out)
    writer.writerow(["hostel", "valley", "beds", "warden"])
    writer.writerows([
        ("Grauhorn", "Saas", 24, "Kurt"), ("Col du Lac", "Arve", 32, "Mireille"),
        ("Refuge Écrins", "Romanche", 40, "Jérôme"), ("Alpe Verte", "Arve", 18, "Lucia"),
        ("Winter Room", "Saas", 0, "Kurt"), ("Bergsee", "Saas", 20, "Heidi"),
        ("Lac Noir", "Romanche", 12, "Odile"),
    ])
