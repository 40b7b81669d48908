"""Kelp co-op: one harvest log per month, a folder of boat registers and price lists.

The month files are read in a loop over a sorted glob, each tagged with its file name, and
stacked; the boat registers are read from a folder listing (a README sits beside them) and
the price lists from a Path glob, in the order the file system gives them.
"""
import glob
import os
from pathlib import Path

import pandas as pd
import polars as pl


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

frames = []
for path in sorted(glob.glob("data/harvest/harvest_*.csv")):
    # TODO(porter): pd.read_csv: the file read is only known when the script runs (a loop's or a
    #   comprehension's variable): pandas reads numbers written " 5" or "+3", an all-blank column as
    #   float and a file of a header only as object columns, where Polars' scan infers text; the read
    #   stays pandas' (with --data, porter reads the files of a glob.glob, Path.glob or os.listdir the
    #   loop goes over)
    part = pd.read_csv(path)
    part["source"] = os.path.basename(path)
    frames.append(part)
# TODO(porter): pd.concat: the frames are not written out as a list, so porter cannot see them
harvest = pd.concat(frames, ignore_index=True)
harvest["wet_kg"] = harvest["wet_kg"].fillna(0)

# TODO(porter): pd.read_csv: the file read is only known when the script runs (a loop's or a
#   comprehension's variable): pandas reads numbers written " 5" or "+3", an all-blank column as
#   float and a file of a header only as object columns, where Polars' scan infers text; the read
#   stays pandas' (with --data, porter reads the files of a glob.glob, Path.glob or os.listdir the
#   loop goes over)
# TODO(porter): pd.concat: `pd.read_csv(os.path.join("data", "boats", name))` is not a frame porter
#   tracks: make it a LazyFrame (pl.from_pandas(...).lazy()) where it is built
boats = pd.concat(
    [pd.read_csv(os.path.join("data", "boats", name))
     for name in sorted(os.listdir("data/boats")) if name.endswith(".csv")],
    ignore_index=True,
)
# TODO(porter): pd.read_csv: the file read is only known when the script runs (a loop's or a
#   comprehension's variable): pandas reads numbers written " 5" or "+3", an all-blank column as
#   float and a file of a header only as object columns, where Polars' scan infers text; the read
#   stays pandas' (with --data, porter reads the files of a glob.glob, Path.glob or os.listdir the
#   loop goes over)
# TODO(porter): pd.concat: `pd.read_csv(p)` is not a frame porter tracks: make it a LazyFrame
#   (pl.from_pandas(...).lazy()) where it is built
prices = pd.concat([pd.read_csv(p) for p in Path("data/prices").glob("*.csv")],
                   ignore_index=True)

by_boat = harvest.groupby(["boat", "species"], as_index=False)["wet_kg"].sum()
by_boat = by_boat.merge(boats, on="boat", how="left")
by_boat = pl.from_pandas(by_boat).lazy()
(
    by_boat
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("by_boat.csv")
)

per_file = harvest.groupby("source", as_index=False).agg(rows=("wet_kg", "size"),
                                                        kg=("wet_kg", "mean"))
per_file.to_csv("per_file.csv", index=False)

valued = harvest.merge(prices, on="species", how="left")
valued = pl.from_pandas(valued).lazy()
valued = valued.with_columns(
    value=(pl.col("wet_kg") * pl.col("price_per_kg")).fill_nan(None),
)
(
    valued
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("harvest_valued.csv")
)
print(per_file)
