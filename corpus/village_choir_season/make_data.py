"""Make the sample data of village_choir_season (seeded: the same files every run).

The choir secretary keeps the members' list (one row per singer, the name first), a register
ticked at each rehearsal (voice parts typed in any case, a blank part for a visitor, a blank mark
where nobody ticked, 'late' and 'L' both meaning late, a singer ticked twice on one evening, singers
who never joined the list) and the box office's ticket returns (seat bands with stray spaces,
'N/A' sold for a sheet that never came back, a comp-only band priced 0, a concert with no
gallery at all).
"""
import csv
import random

rng = random.Random(4417)

MEMBERS = [
    ("Agnès Pell", "soprano"), ("Bryn Hollis", "bass"), ("Cora Vane", "alto"),
    ("Dafydd Ree", "tenor"), ("Elin Marsh", "soprano"), ("Fenna Osk", "alto"),
    ("Gwil Tarr", "bass"), ("Hana Brook", "soprano"), ("Idris Lowe", "tenor"),
    ("Joëlle Fane", "alto"), ("Kit Amberley", "tenor"), ("Lorna Quay", "soprano"),
    ("Moss Ferry", "bass"), ("Nia Cole", "alto"),
]
VISITORS = ["Ola Wren", "Pim Stave"]
PART_SPELLINGS = {"soprano": ["Soprano", "soprano", "SOPRANO"], "alto": ["Alto", "alto", "Alto "],
                  "tenor": ["Tenor", "tenor"], "bass": ["Bass", "BASS", "bass"]}
EVENINGS = ["2026-01-07", "2026-01-14", "2026-01-21", "2026-01-28", "2026-02-04", "2026-02-11",
            "2026-02-18", "2026-02-25", "2026-03-04", "2026-03-11"]

with open("data/singers.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.writer(out)
    writer.writerow(["singer", "part", "joined", "subs_paid"])
    members = MEMBERS[:]
    rng.shuffle(members)
    for name, part in members:
        writer.writerow([name, part, rng.choice([2015, 2019, 2021, 2024, 2025]), rng.choice(["yes", "no", ""])])

register = []
for evening in EVENINGS:
    for name, part in MEMBERS + [(v, "") for v in VISITORS]:
        if rng.random() < 0.12:
            continue  # not on the sheet that evening
        register.append({
            "evening": evening,
            "singer": name,
            "part": rng.choice(PART_SPELLINGS[part]) if part else "",
            "mark": rng.choice(["Y", "Y", "Y", "y", "N", "late", "L", ""]),
        })
        if rng.random() < 0.03:
            register.append(dict(register[-1]))  # ticked twice
rng.shuffle(register)
with open("data/register.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.DictWriter(out, fieldnames=list(register[0]))
    writer.writeheader()
    writer.writerows(register)

returns = []
for concert in ["Advent", "Candlemas", "Spring Songs"]:
    for sheet in range(rng.randint(20, 26)):
        band = rng.choice(["Front", "Middle", "Back", "Back ", "front", "Gallery", "Comps"])
        if concert == "Candlemas" and band == "Gallery":
            band = "Back"  # the chapel has no gallery
        price = {"Front": 14, "Middle": 11, "Back": 8, "Gallery": 6, "Comps": 0}[band.strip().title()]
        returns.append({
            "concert": concert,
            "seller": rng.choice(["door", "shop", "online", "Door"]),
            "band": band,
            "price": price,
            "sold": "N/A" if rng.random() < 0.05 else rng.choice([0, 1, 2, 2, 4, 6, 10]),
        })
rng.shuffle(returns)
with open("data/tickets.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.DictWriter(out, fieldnames=list(returns[0]))
    writer.writeheader()
    writer.writerows(returns)
