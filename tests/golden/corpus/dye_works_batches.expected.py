"""Textile dye works: water used per dye, liters per kilo of cloth, and the rejected or rushed batches.

Batch codes look like IND-0041-W (dye prefix, number, fabric: W wool,
C cotton, L linen) but are typed with stray spaces and lower case.
Cloth weight 0 means a test vat with no cloth: its liters-per-kilo is left unguarded.
"""
import polars as pl

# Text that pandas' read_csv reads as a missing value.
PANDAS_NA_VALUES = [
    "", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null",
]

DYE_COSTS = pl.LazyFrame(
    {
        "dye": ["indigo", "madder", "weld", "walnut", "cochineal"],
        "cost_per_liter": [0.42, 0.35, 0.18, 0.12, 0.95],
    },
)


def tidy_codes(batches):
    batches["batch_code"] = batches["batch_code"].str.strip().str.upper()
    batches["prefix"] = batches["batch_code"].str.slice(0, 3)
    batches["wool"] = batches["batch_code"].str.endswith("-W")
    batches["dye"] = batches["dye"].str.strip().str.lower().str.replace(" hull", "")
    return batches


def flag_status(batches):
    status = batches["status"].str.lower()
    batches["rejected"] = status.str.startswith("rejected")
    batches["rush"] = status.str.contains("rush")
    batches["note_length"] = status.str.len()
    return batches


# TODO(porter): handover.unknown_code: passed to code porter does not understand: handed over to
#   pandas with .collect().to_pandas(); port that code to take a Polars frame
batches = flag_status(
    tidy_codes(
        pl.scan_csv(
            "data/batches.csv",
            null_values=PANDAS_NA_VALUES,
            infer_schema_length=None,
        )
        .collect()
        .to_pandas(),
    ),
)
batches["shift"] = batches["shift"].astype("category")
batches["liters_per_kg"] = batches["liters_used"] / batches["fabric_kg"]
batches["heat"] = batches["temp_c"].map(lambda t: "boil" if t >= 95 else "hot")
print(batches.head())

water = batches.groupby("dye")["liters_used"].agg(["sum", "mean"]).reset_index()
# TODO(porter): handover.unknown_code: passed to code porter does not understand: handed over to
#   pandas with .collect().to_pandas(); port that code to take a Polars frame
water = water.merge(DYE_COSTS.collect().to_pandas(), on="dye", how="left")
water["cost"] = (water["sum"] * water["cost_per_liter"]).round(2)
water.to_csv("water_per_dye.csv", index=False)

flagged = batches[batches["rejected"] | batches["rush"]]
flagged[["batch_code", "dye", "shift", "wool", "status", "note_length"]].to_csv("flagged_batches.csv", index=False)

per_shift = batches.groupby("shift", as_index=False).agg(
    batches=("batch_code", "count"), rejected=("rejected", "sum"), wool=("wool", "sum")
)
per_shift.to_csv("shift_report.csv", index=False)
print(per_shift)

intensity = batches[["batch_code", "prefix", "heat", "liters_per_kg"]].sort_values(
    by=["liters_per_kg", "batch_code"], ascending=[False, True]
)
intensity.head(10).to_csv("thirstiest_batches.csv", index=False)
