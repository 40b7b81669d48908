"""Village cider press: the season's pressing log by month, press and orchard (a pandas 1.x
notebook, written for pandas 1.5: see reference.txt).

A blank press means the same press as the line above; 'N/A' juice was not read.
"""
import pandas as pd

log = pd.read_csv("data/pressings.csv", parse_dates=[["date", "time"]], na_values=["N/A"])
log.rename(columns={"date_time": "pressed_at"}, inplace=True)
log.drop_duplicates(subset=["pressing"], inplace=True)
log["press"] = log["press"].fillna(method="ffill")
log.sort_values(["pressed_at", "pressing"], inplace=True)

log[["orchard", "variety"]] = log[["orchard", "variety"]].applymap(lambda s: s.strip().title())
log["yield_l_per_kg"] = (log["juice_l"] / log["apples_kg"]).round(3)
print(log.head())

orchards = pd.read_csv("data/orchards.csv")
orchards.drop_duplicates(subset=["orchard"], keep="last", inplace=True)
orchards["orchard"] = orchards["orchard"].str.title()
log = log.merge(orchards, on="orchard", how="left")

monthly = log.set_index("pressed_at").resample("M")[["apples_kg", "juice_l"]].sum()
monthly["pressings"] = log.set_index("pressed_at").resample("M")["pressing"].count()
monthly = monthly.reset_index()
monthly.to_csv("data/monthly.csv", index=False)

by_press = pd.DataFrame()
for press, rows in log.groupby("press"):
    by_press = by_press.append({"press": press, "pressings": len(rows),
                                "apples_kg": rows["apples_kg"].sum(),
                                "juice_l": rows["juice_l"].sum()}, ignore_index=True)
by_press["l_per_kg"] = (by_press["juice_l"] / by_press["apples_kg"]).round(3)
by_press.to_csv("data/by_press.csv", index=False)

villages = (log.groupby(["village", "variety"], as_index=False)
               .agg(apples_kg=("apples_kg", "sum"), juice_l=("juice_l", "sum"),
                    best=("yield_l_per_kg", "max")))
villages.to_csv("data/villages.csv", index=False)
