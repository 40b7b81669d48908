"""Make the sample data of mountain_rescue_radio (seeded: the same files every run).

The base station's logger writes one line per radio message: a Unix time in seconds (blank
when the logger rebooted), the call sign as the operator typed it, and the message text
in the team's shorthand ("POS 4612/0759 ALT 2350 CAS 2 ankle"). Some lines are logged twice,
the file is not in time order, and the incident sheet is typed by hand.
"""
import csv
import random

rng = random.Random(2207)

CALLS = ["base", "BASE ", "team 1", "Team1", "team 2", "heli", "Héli-2", "hut edelrot", "hut Émile",
         "", "n/a"]
WORDS = ["ankle", "knee", "hypothermia", "lost", "rockfall", "crevasse", "all clear", "ok",
         "Ankle", "épuisé", "bivouac", ""]
OPERATORS = ["mara", "Jonas ", "LÉA", "tobiah", "", "n/a"]


def message():
    style = rng.random()
    if style < 0.45:
        lat, lon = rng.randint(4600, 4640), rng.randint(750, 799)
        alt = rng.choice([1850, 2350, 2800, 3100, 960, 4010])
        cas = rng.choice([0, 1, 1, 2, 3, 12])
        return f"POS {lat}/{lon:04d} ALT {alt} CAS {cas} {rng.choice(WORDS)}".strip()
    if style < 0.60:
        return f"pos {rng.randint(4600, 4640)}/{rng.randint(750, 799):04d} alt {rng.choice([1200, 2500])}"
    if style < 0.75:
        return rng.choice(["radio check", "Radio check OK", "relay via heli", "MAYDAY MAYDAY cas 1",
                           "mayday lost contact", "weather closing in, wind 80", "ETA 35 min",
                           "eta 1h20", "ETA 05 min"])
    if style < 0.85:
        return rng.choice(["n/a", "", "?"])
    return f"{rng.choice(['stand by', 'copy', 'Copy that', 'negative'])} {rng.randint(1, 9)}"


rows = []
start = 1719900000  # early July 2024, in UTC seconds
for msg_id in range(1, 1601):
    t = start + rng.randrange(0, 18 * 86400)
    if rng.random() < 0.04:
        t = ""
    rows.append({
        "msg_id": msg_id,
        "logged": t,
        "incident": rng.choice(["R-24-031", "R-24-032", "r24-33", "R-24-034", "R-24-035", "", "n/a"]),
        "call": rng.choice(CALLS),
        "channel": rng.choice(["6", "6", "7", "12", "n/a", "", "06"]),
        "text": message(),
        "operator": rng.choice(OPERATORS),
    })
rows += [dict(r) for r in rng.sample(rows, 25)]  # logged twice
rng.shuffle(rows)
with open("data/radio_log.csv", "w", newline="", encoding="utf-8") as fh:
    writer = csv.DictWriter(fh, fieldnames=list(rows[0]))
    writer.writeheader()
    writer.writerows(rows)

incidents = [
    ("R-24-031", "2024-07-02 14:05", "2024-07-02 19:40", "Grat Nord", 3),
    ("R-24-032", "2024-07-05 06:30", "2024-07-06 11:15", "Glacier de l'Épée", 5),
    ("R-24-033", "2024-07-08 22:10", "n/a", "hut edelrot approach", 2),
    ("R-24-034", "2024-07-11 09:00", "2024-07-11 09:00", "Valley road", 0),
    ("R-24-035", "2024-07-15 13:45", "2024-07-16 02:30", "couloir", 4),
    ("R-24-035", "2024-07-15 13:45", "2024-07-16 02:30", "couloir", 4),
]
with open("data/incidents.csv", "w", newline="", encoding="utf-8") as fh:
    writer = csv.writer(fh)
    writer.writerow(["incident", "opened", "closed", "place", "crew"])
    writer.writerows(incidents)
