"""Make the sample data of canal_boatyard_slipway (seeded: the same files every run).

The boatyard's office keeps three sheets: the boat register (one row per boat, the name first, a
length of 0 for a dinghy nobody measured), the repair job cards (boat names in any case and with
stray spaces, a blank boat where the card was smudged, 'N/A' hours for a job not yet booked in,
hull types typed as they came, a card entered twice) and the slipway diary (slip names in any
case, a blank haul-out date for a booking pencilled in, days of zero for a float-off the same
tide, boats that are not on the register).
"""
import csv
import random

rng = random.Random(8830)

REGISTER = [
    ("Kingfisher", "narrowboat", 57), ("Dabchick", "narrowboat", 45), ("Otter", "widebeam", 60),
    ("Water Vole", "narrowboat", 38), ("Grebe", "cruiser", 24), ("Mallard", "narrowboat", 62),
    ("Moorhen", "widebeam", 55), ("Pochard", "cruiser", 21), ("Éider", "narrowboat", 50),
    ("Teal", "dinghy", 0), ("Bittern", "narrowboat", 48), ("Coot", "cruiser", 19),
]
ON_CARDS = [name for name, _, _ in REGISTER] + ["Wigeon", "Shoveler"]  # not registered
SPELLINGS = lambda name: [name, name.upper(), name.lower(), f" {name}", f"{name} "]
HULLS = ["steel", "Steel", "steel ", "GRP", "grp", "wood", "Wood", "N/A"]
REPAIRS = ["blacking", "welding", "anodes", "plating", "caulking", "blacking", "blacking"]
HANDS = ["Ros", "Dev", "Ósk", "Dev"]

with open("data/boats.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.writer(out)
    writer.writerow(["boat", "kind", "length_ft", "mooring"])
    shuffled = REGISTER[:]
    rng.shuffle(shuffled)  # the register is not in name order
    for name, kind, length in shuffled:
        writer.writerow([name, kind, length, rng.choice(["home", "visitor", "", "home"])])

cards = []
for job in range(1, 181):
    boat = rng.choice(ON_CARDS)
    cards.append({
        "job": f"J{job:03d}",
        "boat": "" if rng.random() < 0.04 else rng.choice(SPELLINGS(boat)),
        "hull": rng.choice(HULLS),
        "repair": rng.choice(REPAIRS),
        "hand": rng.choice(HANDS),
        "hours": "N/A" if rng.random() < 0.07 else rng.choice([0.5, 1, 2, 2, 3.5, 4, 6, 8, 12]),
        "parts_gbp": rng.choice(["", 0, 12.5, 40, 85, 120, 310.75]),
    })
    if rng.random() < 0.04:
        cards.append(dict(cards[-1]))  # the same card typed twice
rng.shuffle(cards)
with open("data/repairs.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.DictWriter(out, fieldnames=list(cards[0]))
    writer.writeheader()
    writer.writerows(cards)

diary = []
for booking in range(1, 121):
    day = rng.randint(1, 61)
    month, dom = (3, day) if day <= 31 else (4, day - 31)
    diary.append({
        "booking": f"B{booking:03d}",
        "slip": rng.choice(["Slip A", "slip a", "Slip B", "SLIP B", "Slip C ", "Dock"]),
        "boat": rng.choice(ON_CARDS + ["Heron"]),
        "haul_out": "" if rng.random() < 0.05 else f"2026-{month:02d}-{dom:02d}",
        "days": rng.choice([0, 1, 2, 2, 3, 5, 7]),
        "fee_gbp": rng.choice([60, 60, 90, 120, 150, 0]),
    })
rng.shuffle(diary)
with open("data/slipway.csv", "w", newline="", encoding="utf-8") as out:
    writer = csv.DictWriter(out, fieldnames=list(diary[0]))
    writer.writeheader()
    writer.writerows(diary)
