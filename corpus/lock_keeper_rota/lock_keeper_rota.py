"""River lock-keeper rota: hours and pay per keeper and week, cover per lock, and boats
through per hour kept.

Each rota line is one keeper at one lock for a week, with up to three shifts written as the
keeper likes them: '06:00-14:00', '6-14', a night '22:00-06:00' (past midnight), 'off',
'sick' or blank. Hours are worked out shift by shift. A line with no hours and boats through
means the lock was worked by the boaters themselves.
"""
import pandas as pd

SHIFTS = ["shift_1", "shift_2", "shift_3"]
WEEK_HOURS = 37.5


def clock(text):
    # '06:00' -> 6.0, '8:30' -> 8.5, '14' -> 14.0
    hh, _, mm = text.strip().partition(":")
    return int(hh) + (int(mm) / 60 if mm else 0)


def hours_on_rota(row):
    total = 0.0
    for col in SHIFTS:
        shift = row[col]
        if not isinstance(shift, str) or "-" not in shift:
            continue   # off, sick, blank
        start, end = shift.split("-")
        try:
            h = clock(end) - clock(start)
        except ValueError:
            continue
        if h <= 0:
            h += 24   # a night shift runs past midnight ('12-12' is a full day)
        total += h
    return total


rota = pd.read_csv("data/rota.csv", na_values=["off"])
keepers = pd.read_csv("data/keepers.csv")
print(f"rota lines: {len(rota)}")

print("rota ids on two lines:", len(rota) - rota["rota_id"].nunique())
rota["keeper"] = rota["keeper"].str.strip().str.title()
rota["lock"] = rota["lock"].str.strip()
rota["lock"] = rota["lock"].str[0].str.upper() + rota["lock"].str[1:]
rota.rename(columns={"boats_through": "boats"}, inplace=True)

rota["hours"] = rota.apply(hours_on_rota, axis=1)

rota["sick_shifts"] = 0
for col in SHIFTS:
    rota["sick_shifts"] = rota["sick_shifts"] + (rota[col] == "sick").astype(int)
rota["boats_per_hour"] = rota["boats"] / rota["hours"]
print(rota[["hours", "boats_per_hour"]].describe())

# --- pay per keeper and week; the keepers list has Piers twice, the first rate stands
rates = keepers.drop_duplicates(subset="keeper")
pay = rota.groupby(["keeper", "week_start"], as_index=False).agg(hours=("hours", "sum"), locks=("lock", "nunique"))
pay = pay.merge(rates, on="keeper", how="left")
pay["overtime"] = (pay["hours"] - WEEK_HOURS).clip(lower=0)
pay["pay"] = ((pay["hours"] - pay["overtime"]) * pay["hourly_rate"] + pay["overtime"] * pay["hourly_rate"] * 1.5).round(2)
pay = pay.sort_values(["week_start", "keeper"])
pay.to_csv("keeper_pay.csv", index=False)

# --- cover per lock and week
cover = rota.groupby(["lock", "week_start"]).agg(
    hours=("hours", "sum"), boats=("boats", "sum"), sick=("sick_shifts", "sum")).reset_index()
cover["boats_per_hour"] = (cover["boats"] / cover["hours"]).round(2)
cover.to_csv("lock_cover.csv", index=False)

unmanned = rota[(rota["hours"] == 0) & (rota["boats"] > 0)]
unmanned[["rota_id", "lock", "week_start", "keeper", "boats"]].to_csv("self_worked.csv", index=False)
print("self-worked lines:", len(unmanned), "| overtime hours:", pay["overtime"].sum())
