"""Nothing here uses pandas: porter leaves it alone."""
import csv

with open("rows.csv") as handle:
    rows = list(csv.DictReader(handle))


class Sorter:
    def sort_values(self, rows):
        return sorted(rows)


print(Sorter().sort_values([r["name"] for r in rows]))
