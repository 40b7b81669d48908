"""Fishing cooperative: landed catch against quota for each boat and species, and a season total per boat.

Species names are spelled every which way at the quay; an ice-box count of -1
means "not counted". A quota of 0 is a suspended licence, so the share used
is left as the raw division (inf or NaN) for the office to spot.
"""
import polars as pl

# Text that pandas' read_csv reads as a missing value.
PANDAS_NA_VALUES = [
    "", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null",
]

SPELLINGS = {"anchovie": "anchovy", "sardines": "sardine"}


def clean_landings(landings):
    landings["species"] = landings["species"].str.strip().str.lower()
    landings["species"] = landings["species"].replace(SPELLINGS)
    landings["ice_boxes"] = landings["ice_boxes"].replace(-1, 0)
    landings["value_eur"] = (landings["catch_kg"] * landings["price_per_kg"]).round(2)
    return landings


def quota_status(landings, quota):
    landed = landings.groupby(["boat", "species"], as_index=False).agg(
        landed_kg=("catch_kg", "sum"), port=("port", "last")
    )
    # TODO(porter): handover.unknown_code: passed to code porter does not understand: handed over to
    #   pandas with .collect().to_pandas(); port that code to take a Polars frame
    status = landed.merge(
        quota.collect().to_pandas(),
        on=["boat", "species"],
        how="outer",
        suffixes=("_landed", "_home"),
    )
    status = pl.from_pandas(status).lazy()
    status = status.with_columns(
        landed_kg=pl.col("landed_kg").fill_null(0),
        quota_kg=pl.col("quota_kg").fill_null(0),
    )
    status = status.with_columns(
        used_share=(pl.col("landed_kg") / pl.col("quota_kg")).fill_nan(None).round(2),
    )
    status = status.with_columns(
        over_quota=(pl.col("landed_kg") > pl.col("quota_kg")).fill_null(False),
    )
    status = status.with_columns(
        away_port=(pl.col("port_landed") != pl.col("port_home")).fill_null(True),
    )
    return status


def boat_totals(landings):
    totals = landings.groupby("boat").agg(
        trips=("landing_id", "nunique"),
        catch_kg=("catch_kg", "sum"),
        value_eur=("value_eur", "sum"),
        ice_boxes=("ice_boxes", "sum"),
        best_price=("price_per_kg", "max"),
    )
    return totals.reset_index().round(2)


# TODO(porter): handover.unknown_code: passed to code porter does not understand: handed over to
#   pandas with .collect().to_pandas(); port that code to take a Polars frame
landings = clean_landings(
    pl.scan_csv(
        "data/landings.csv",
        null_values=PANDAS_NA_VALUES,
        infer_schema_length=None,
    )
    .collect()
    .to_pandas(),
)
quota = (
    pl.scan_csv(
        "data/quota.csv",
        null_values=PANDAS_NA_VALUES,
        infer_schema_length=None,
    )
    .collect()
    .lazy()
)
print(landings["species"].unique())

status = quota_status(landings, quota).collect().lazy()
(
    status
    .with_columns(pl.selectors.boolean().replace_strict({True: "True", False: "False"}))
    .sink_csv("quota_status.csv")
)
print(status.filter(pl.col("over_quota")).collect())

totals = boat_totals(landings)
totals.to_csv("boat_totals.csv", index=False)
print(totals["catch_kg"].sum())
