"""Canal lock toll register: tolls per lock and month, the passages still unpaid, and who owes most.

The tariff changes during the season, per vessel class: each passage pays the tariff in force
when it went through the lock (the last one whose effective date is on or before the passage).
Lock-keepers write the class by hand ('Narrowboat ', 'BARGE'), a few lengths are missing and a
raft has no tariff at all.
"""
import pandas as pd

PASSAGE_FORMAT = "%Y-%m-%d %H:%M"


def load_passages(path):
    p = pd.read_csv(path, na_values=["n/a", "pending"])
    p["passed_at"] = pd.to_datetime(p["passed_at"], format=PASSAGE_FORMAT, errors="coerce")
    p["vessel_class"] = p["vessel_class"].str.strip().str.lower()
    p["lock_id"] = p.lock_id.str.strip().str.upper()
    p = p.drop_duplicates(subset=["passage_id"])
    # one line has a month 13 -- can't price it without a date
    return p.dropna(subset=["passed_at"])


def load_tariffs(path):
    t = pd.read_csv(path, parse_dates=['effective_from'])
    return t.sort_values('effective_from')


def price(passages, tariffs):
    # merge_asof wants both sides sorted on the time key
    passages = passages.sort_values(["passed_at", "passage_id"])
    priced = pd.merge_asof(passages, tariffs, left_on="passed_at", right_on="effective_from",
                           by="vessel_class", direction="backward")
    priced["toll"] = priced["base_toll"] + priced["per_metre"] * priced["length_m"]
    return priced


def main():
    passages = load_passages("data/passages.csv")
    tariffs = load_tariffs("data/tariffs.csv")
    locks = pd.read_csv("data/locks.csv")
    print(len(passages), "passages,", len(tariffs), "tariff lines")

    priced = price(passages, tariffs)
    priced["month"] = priced.passed_at.dt.month
    priced["paid"] = priced["paid"].str.lower().fillna("unknown")

    by_lock = (
        priced.groupby(["lock_id", "month"])
        .agg(passages=("passage_id", "count"), tolls=("toll", "sum"), cargo=("cargo_t", "sum"))
        .reset_index()
        .merge(locks, on="lock_id", how="left")
    )
    by_lock["tolls"] = by_lock["tolls"].round(2)
    by_lock["cargo_per_m_rise"] = by_lock["cargo"] / by_lock["rise_m"]   # Sainte-Aurèle has no rise
    by_lock = by_lock.sort_values(["lock_id", "month"])
    by_lock.to_csv("toll_by_lock.csv", index=False)

    unpaid = priced.loc[priced["paid"] != "yes", ["passage_id", "lock_id", "passed_at", "vessel_class", "skipper", "paid", "toll"]]
    unpaid = unpaid.sort_values(["toll", "passage_id"], ascending=[False, True])
    unpaid.to_parquet("unpaid_passages.parquet", index=False)

    no_tariff = priced[priced["toll"].isna()]
    print("no toll worked out for", len(no_tariff), "passages")
    print(no_tariff["vessel_class"].value_counts())

    owed = unpaid.groupby("skipper")["toll"].sum().reset_index()
    owed = owed.sort_values(["toll", "skipper"], ascending=[False, True])
    owed["toll"] = owed["toll"].round(2)
    owed.to_csv("owed_by_skipper.csv", index=False)
    print(owed.head())


if __name__ == "__main__":
    main()
