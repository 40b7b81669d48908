"""Canal lock toll register: tolls per lock and month, the passages still unpaid, and who owes most.

The tariff changes during the season, per vessel class: each passage pays the tariff in force
when it went through the lock (the last one whose effective date is on or before the passage).
Lock-keepers write the class by hand ('Narrowboat ', 'BARGE'), a few lengths are missing and a
raft has no tariff at all.
"""
import pandas as pd
import polars as pl

# Text that pandas' read_csv reads as a missing value.
PANDAS_NA_VALUES = [
    "", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null",
]

PASSAGE_FORMAT = "%Y-%m-%d %H:%M"


def load_passages(path):
    p = pl.scan_csv(
        path,
        null_values=PANDAS_NA_VALUES + ["pending"],
        infer_schema_length=None,
    )
    p = p.with_columns(
        passed_at=pl.col("passed_at").str.to_datetime("%Y-%m-%d %H:%M", strict=False),
    )
    p = p.with_columns(
        vessel_class=pl.col("vessel_class").str.strip_chars().str.to_lowercase(),
    )
    p = p.with_columns(lock_id=pl.col("lock_id").str.strip_chars().str.to_uppercase())
    p = p.unique("passage_id", keep="first", maintain_order=True)
    # one line has a month 13 -- can't price it without a date
    return p.drop_nulls("passed_at")


def load_tariffs(path):
    t = (
        pl.scan_csv(path, null_values=PANDAS_NA_VALUES, infer_schema_length=None)
        .with_columns(pl.col("effective_from").str.to_datetime(time_unit="us"))
    )
    return t.sort("effective_from", nulls_last=True, maintain_order=True)


def price(passages, tariffs):
    # merge_asof wants both sides sorted on the time key
    passages = passages.sort(
        ["passed_at", "passage_id"],
        nulls_last=True,
        maintain_order=True,
    )
    # TODO(porter): pd.merge_asof: porter has no rule for this API yet
    priced = pd.merge_asof(
        passages.collect().to_pandas(),
        tariffs.collect().to_pandas(),
        left_on="passed_at",
        right_on="effective_from",
        by="vessel_class",
        direction="backward",
    )
    priced["toll"] = priced["base_toll"] + priced["per_metre"] * priced["length_m"]
    return priced


def main():
    passages = load_passages("data/passages.csv").collect().lazy()
    tariffs = load_tariffs("data/tariffs.csv").collect().lazy()
    locks = pl.scan_csv(
        "data/locks.csv",
        null_values=PANDAS_NA_VALUES,
        infer_schema_length=None,
    )
    print(
        passages.select(pl.len()).collect().item(),
        "passages,",
        tariffs.select(pl.len()).collect().item(),
        "tariff lines",
    )

    priced = price(passages, tariffs)
    priced["month"] = priced.passed_at.dt.month
    priced["paid"] = priced["paid"].str.lower().fillna("unknown")

    # TODO(porter): handover.unknown_code: passed to code porter does not understand: handed over to
    #   pandas with .collect().to_pandas(); port that code to take a Polars frame
    by_lock = (
        priced.groupby(["lock_id", "month"])
        .agg(passages=("passage_id", "count"), tolls=("toll", "sum"), cargo=("cargo_t", "sum"))
        .reset_index()
        .merge(locks.collect().to_pandas(), on="lock_id", how="left")
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
