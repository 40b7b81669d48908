"""Make the sample data of mountain_railway_gates (seeded: the same files every run).

The ticket gates of a rack railway up a mountain log every scan: the station typed by the gate's
installer (stray spaces, one station with and one without its accent), a scan time in
whole-minute text (a few gates lost their clock and wrote nothing), the zones the ticket is valid
in as a "|"-joined list (blank on staff passes), 'N/A' as a fare on a pass nobody priced, groups
scanning several heads at once, the odd scan logged twice. The timetable is the printed one:
departures per station, not in order, one station the gates never see and one gate at a halt
with no printed departures.
"""
import csv
import random

rng = random.Random(2093)

STATIONS = ["Talstation", "Talstation ", "Mittelstation", "Alp Grüm", "Alp Grum", "Gipfel", "Seeblick"]
TYPES = ["single", "return", "day pass", "Return", "staff", "family"]
ZONES = ["A", "A|B", "A|B|C", "B|C", "C", "", "A|C"]

scans = []
for n in range(1, 241):
    hour = rng.choice([7, 8, 8, 9, 10, 11, 12, 13, 14, 15, 16, 17, 18])
    minute = rng.randrange(60)
    kind = rng.choice(TYPES)
    fare = {"single": 18.0, "return": 32.0, "Return": 32.0, "day pass": 54.0, "staff": 0.0, "family": 76.0}[kind]
    scans.append({
        "scan_id": f"G{n:05d}",
        "station": rng.choice(STATIONS),
        "scanned_at": "" if rng.random() < 0.04 else f"2025-07-19 {hour:02d}:{minute:02d}",
        "ticket_type": kind,
        "zones": "" if kind == "staff" else rng.choice(ZONES),
        "heads": rng.choice([1, 1, 1, 2, 2, 3, 4, 0]),
        "fare_chf": "N/A" if rng.random() < 0.05 else fare,
    })
    if rng.random() < 0.04:
        scans.append(dict(scans[-1]))  # the gate logged the same scan twice
rng.shuffle(scans)

with open("data/gate_scans.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.DictWriter(out, fieldnames=list(scans[0]))
    writer.writeheader()
    writer.writerows(scans)

timetable = []
for station, first, every in [("Talstation", 7, 30), ("Mittelstation", 7, 30), ("Alp Grüm", 8, 40), ("Gipfel", 8, 60), ("Kulm", 9, 60)]:
    minute = first * 60 + rng.choice([0, 5, 10])
    while minute < 19 * 60:
        timetable.append({
            "station": station,
            "departs": f"2025-07-19 {minute // 60:02d}:{minute % 60:02d}",
            "train": f"Z{len(timetable) + 1:03d}",
            "seats": rng.choice([120, 120, 80, 0, 160]),
        })
        minute += every
rng.shuffle(timetable)
with open("data/timetable.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.DictWriter(out, fieldnames=list(timetable[0]))
    writer.writeheader()
    writer.writerows(timetable)
