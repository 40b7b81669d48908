"""Seed bank: germination rate per species, the five best accessions, and weak lots kept in the cold room.

Accession numbers are zero-padded strings; a tray with nothing sown (sown == 0)
has no rate rather than a division error.
"""
import numpy as np
import pandas as pd

TEST_COLUMNS = ["test_id", "accession", "species", "sown", "germinated", "test_date"]


def load_tests(path):
    tests = pd.read_csv(path, usecols=TEST_COLUMNS, dtype={"accession": str})
    return tests.dropna(subset=["germinated"])


def add_rates(tests):
    rate = np.where(tests["sown"] > 0, tests["germinated"] / tests["sown"], np.nan)
    return tests.assign(rate=rate)


def attach_registry(tests, registry):
    registry = registry.assign(storage=registry["storage"].str.strip().str.lower())
    return tests.merge(registry, left_on="accession", right_on="accession_id", how="left", suffixes=("", "_registry"))


def species_summary(tests):
    summary = tests.groupby("species").agg({"rate": "mean", "sown": "sum", "germinated": "sum"}).reset_index()
    summary["rate"] = summary["rate"].round(3)
    return summary.sort_values(by="rate", ascending=False)


tests = add_rates(load_tests("data/germination_tests.csv"))
registry = pd.read_csv("data/accessions.csv", dtype={"accession_id": str})
rated = attach_registry(tests, registry)
print(len(tests), len(rated))

species_summary(rated).to_csv("species_rates.csv", index=False)

top = rated.nlargest(5, "rate")[["test_id", "accession", "species", "sown", "rate", "storage"]]
top.to_csv("top_accessions.csv", index=False)
print(top)

weak = rated[(rated["rate"] < 0.5) & (rated["storage"] == "cold room")]
weak = weak.drop(columns=["accession_id", "species_registry"]).sort_values(by=["rate", "test_id"])
weak.to_csv("weak_cold_room.csv", index=False)
print(weak["accession"].nunique())
