"""Seed bank germination summary written against modin's pandas API."""
import modin.pandas as pd

trays = pd.read_csv("trays.csv", usecols=["tray", "species", "sown", "sprouted"])
trays["rate"] = trays["sprouted"] / trays["sown"]
best = trays.nlargest(3, "rate")
best.to_csv("best_trays.csv", index=False)
