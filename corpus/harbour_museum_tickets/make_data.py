"""Make the sample data of harbour_museum_tickets (seeded: the same files every run).

The ticket office's till exports what the desk typed: stamps in two formats (the old till
writes day-first), refs typed by hand, 'n/a' where a field was skipped, a desk left blank,
a few sales sent twice, rows out of order.
"""
import csv
import random
from datetime import datetime, timedelta

rng = random.Random(1410)

KINDS = ["adult", "Adult ", "child", "CHILD", "senior", "famille", "student", " étudiant", "n/a", ""]
DESKS = ["quay", "Quay", "tower", "shop", "", "n/a"]
LANGS = ["fr", "de", "en", "nl", "", "FR", "n/a"]
PAYS = ["card", "cash", "Card", "voucher 12", "voucher", "n/a", ""]
TOURS = ["none", "boats", "nets;boats", "lighthouse", "Lighthouse;boats;nets", "", "n/a"]


def stamp(moment):
    style = rng.random()
    if style < 0.62:
        return moment.strftime("%Y-%m-%d %H:%M")
    if style < 0.90:
        return moment.strftime("%d/%m/%Y %H:%M")
    if style < 0.95:
        return "n/a"
    if style < 0.97:
        return ""
    return moment.strftime("%Y-%m-%d %H:%M").replace("-0", "-13", 1)  # month 13: unreadable


def ref(number, moment, kind):
    code = (kind.strip()[:2] or "xx").upper()
    style = rng.random()
    if style < 0.55:
        return f"HM-{moment.year}-{number:06d}/{code}"
    if style < 0.80:
        return f"hm {moment.year} {number} {code.lower()}"
    if style < 0.93:
        return f"HM{moment.year}{number}"
    return rng.choice(["lost", "n/a", "", "HM--"])


rows = []
start = datetime(2024, 5, 27, 9, 0)
for number in range(1, 1301):
    moment = start + timedelta(days=rng.randrange(0, 70), minutes=rng.randrange(0, 9 * 60))
    kind = rng.choice(KINDS)
    base = {"adult": 12, "child": 6, "senior": 9, "famille": 30, "student": 7, "étudiant": 7}
    price = base.get(kind.strip().lower(), rng.choice([0, 12]))
    if rng.random() < 0.05:
        price = "n/a"
    elif rng.random() < 0.07:
        price = 0
    visit = rng.choice([35, 50, 65, 80, 95, 120, 145, 0, 200])
    if rng.random() < 0.04:
        visit = ""
    rows.append({
        "ref": ref(number, moment, kind),
        "sold_at": stamp(moment),
        "visitor": kind,
        "price": price,
        "desk": rng.choice(DESKS),
        "lang": rng.choice(LANGS),
        "paid_by": rng.choice(PAYS),
        "visit_min": visit,
        "tours": rng.choice(TOURS),
        "party": rng.choice([1, 1, 1, 2, 2, 3, 4, 5, 0]),
    })
rows += rng.sample(rows, 20)  # sent twice
rng.shuffle(rows)
with open("data/tickets.csv", "w", newline="", encoding="utf-8") as fh:
    writer = csv.DictWriter(fh, fieldnames=list(rows[0]))
    writer.writeheader()
    writer.writerows(rows)

exhibitions = [
    ("Nets & Knots", "2024-05-01", "2024-06-14", 0),
    ("Lighthouse lenses", "2024-06-15", "2024-07-31", 2),
    ("Le chantier naval", "2024-07-01", "2024-08-31", 3),
    ("Boats of the estuary", "2024-06-01", "n/a", 0),
]
with open("data/exhibitions.csv", "w", newline="", encoding="utf-8") as fh:
    writer = csv.writer(fh)
    writer.writerow(["title", "opens", "closes", "surcharge"])
    writer.writerows(exhibitions)
