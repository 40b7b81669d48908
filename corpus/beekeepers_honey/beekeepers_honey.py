"""Beekeepers' association: combine the spring and summer harvest sheets, check honey moisture,
and total the honey per hive and per apiary.

The summer sheet has no frame count but adds a varroa count; some summer rows
were typed twice, and the later entry is the corrected one.
"""
import pandas

APIARIES = pandas.DataFrame(
    {
        "apiary": ["combe aux abeilles", "pré haut", "rucher du moulin"],
        "altitude_m": [640, 1120, 415],
    }
)
MAX_MOISTURE = 18.6


def load_season(path, season):
    sheet = pandas.read_csv(path, parse_dates=["harvest_date"])
    return sheet.assign(season=season)


def main():
    spring = load_season("data/spring_2024.csv", "spring")
    summer = load_season("data/summer_2024.csv", "summer")
    harvests = pandas.concat([spring, summer], ignore_index=True)
    print(len(harvests))

    harvests = harvests.drop_duplicates(subset=["hive_id", "harvest_date"], keep="last")
    harvests["keeper"] = harvests["keeper"].str.strip().str.lower()
    harvests["apiary"] = harvests["apiary"].str.strip().str.lower()
    harvests["moisture_check"] = harvests["moisture_pct"].apply(lambda m: "fail" if m > MAX_MOISTURE else "pass")
    print(harvests["moisture_check"].value_counts())

    per_hive = harvests.groupby(["hive_id", "season"], as_index=False).agg(
        keeper=("keeper", "first"),
        total_kg=("honey_kg", "sum"),
        harvests=("harvest_date", "count"),
        wettest=("moisture_pct", "max"),
    )
    per_hive.to_csv("hive_totals.csv", index=False)

    per_apiary = harvests.groupby("apiary").agg({"honey_kg": "sum", "moisture_pct": "mean", "hive_id": "nunique"})
    per_apiary = per_apiary.reset_index().merge(APIARIES, on="apiary", how="left")
    per_apiary["moisture_pct"] = per_apiary["moisture_pct"].round(2)
    per_apiary.to_csv("apiary_totals.csv", index=False)
    print(per_apiary)

    stats = harvests[["honey_kg", "moisture_pct", "frames", "varroa_per_100"]].describe().reset_index()
    stats.to_csv("honey_describe.csv", index=False)


if __name__ == "__main__":
    main()
