"""Harbour crane shifts: which sheets carried the most, each shift's best crane by tonnes per
lift, and the night sheets by their place in the foreman's pile.

The row numbers matter here: the foreman files corrections by the sheet's position in the typed
pile (the row of the original file), so the reports keep it.
"""
import polars as pl

# Text that pandas' read_csv reads as a missing value.
PANDAS_NA_VALUES = [
    "", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null",
]


def pandas_total(frame, how="sum"):
    """s.sum() / s.mean() of a column whose type was not known when the script was converted,
    from a frame of one row: the column's values as a list, then Polars' own total. A float
    column is added as pandas adds it, with numpy's pairwise sum, missing values counted 0
    (Polars adds in another order, and the last digit could differ: 11532.650000000001 for
    11532.65), its mean that sum over the count of values (NaN when there is none); any other
    column keeps Polars' total, as a numpy value as pandas gives it."""
    values = frame.to_series(0)[0]
    if not values.dtype.is_float() or how == "mean" and values.dtype != pl.Float64:
        return frame.to_series(1).to_numpy()[0]
    total = values.fill_null(0.0).to_numpy().sum()
    if how == "sum":
        return total
    return total / values.count() if values.count() else total * float("nan")


# Float columns as pandas' to_csv writes them (Python's repr): 5e-05 and 1.5e-07, where Polars
# writes 0.00005 and 1.5e-7; NaN as an empty field. Only values below 0.0001 (other than 0)
# need the replacements, and only they are given them.
def pandas_csv_floats(values):
    text = values.fill_nan(None).cast(pl.String)
    small = (values.abs() < 1e-4) & (values != 0)
    if not small.any():
        return text
    repr_text = (
        text.filter(small)
        .str.replace(r"e-(\d)$", "e-0${1}")
        .str.replace(r"^(-?)0\.0000(\d)$", "${1}${2}e-05")
        .str.replace(r"^(-?)0\.0000(\d)(\d+)$", "${1}${2}.${3}e-05")
    )
    return text.scatter(small.arg_true(), repr_text)


PANDAS_CSV_FLOATS = pl.selectors.float().map_batches(
    pandas_csv_floats, return_dtype=pl.String, is_elementwise=True,
)

# Integer columns as pandas' to_csv writes them: one holding a missing value is float in
# pandas (2024.0), one without stays integer (2024).
PANDAS_CSV_INTS = (
    pl.when(pl.selectors.integer().null_count() > 0)
    .then(pl.selectors.integer().cast(pl.Float64).cast(pl.String))
    .otherwise(pl.selectors.integer().cast(pl.String))
)

# %%
lifts = pl.scan_csv(
    "data/lifts.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)
print((lifts.select(pl.len()).collect().item(), len(lifts.collect_schema())))

lifts = lifts.collect().to_pandas()
# TODO(porter): frame.labels: pandas code reads the row labels of `lifts` later, which are the
#   original row numbers after a filter or sort: pandas makes it; to port it, keep the row number as
#   a column (with_row_index) where the frame is read and use that column where the labels are read
lifts = lifts.drop_duplicates(subset=["sheet"])
lifts["crane"] = lifts["crane"].str.strip().str.title()
lifts = lifts[lifts["crane"] != ""]
lifts = lifts.dropna(subset=["crane"])
lifts = lifts[lifts["lifts"] > 0]
lifts["shift"] = lifts["shift"].str.lower()
lifts["per_lift"] = (lifts["tonnes"] / lifts["lifts"]).round(3)

# %% the ten heaviest sheets, with their place in the pile
busiest = lifts.sort_values("tonnes", ascending=False, kind="stable")
top = busiest.head(10).reset_index()
top = pl.from_pandas(top).lazy()
top = top.rename({"index": "pile_row"}, strict=False)
(
    top
    .select("pile_row", "sheet", "crane", "tonnes")
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("heaviest_sheets.csv")
)

# %% each shift's best sheet by tonnes per lift
best = lifts.loc[lifts.groupby("shift")["per_lift"].idxmax()]
best = best[["shift", "crane", "sheet", "per_lift"]].reset_index(drop=True)
best.to_csv("best_per_shift.csv", index=False)
print(best)

heaviest_row = lifts["tonnes"].idxmax()
print("heaviest sheet at pile row", heaviest_row, "by", lifts.loc[heaviest_row, "crane"])

# %% night sheets, numbered by the pile
night = lifts[lifts["shift"] == "night"].reset_index()
night = pl.from_pandas(night).lazy()
night = night.rename({"index": "pile_row"}, strict=False)
night = (
    night
    .with_columns(stopped_min=pl.col("stopped_min").fill_null(0))
    .collect()
    .lazy()
)
(
    night
    .select("pile_row", "sheet", "crane", "lifts", "stopped_min")
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("night_sheets.csv")
)
print(
    night.select(pl.len()).collect().item(),
    night.select(pl.col("pile_row").max()).collect().to_series().to_pandas().iloc[0],
    pandas_total(
        night.select(
            pl.col("stopped_min").implode().alias("values"),
            pl.col("stopped_min").sum().alias("total"),
        )
        .collect(),
    ),
)
