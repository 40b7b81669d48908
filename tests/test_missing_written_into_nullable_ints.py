"""A missing value (pd.NA, np.nan, None) written by df.loc[mask, col] = ... into one of pandas'
nullable integer columns (Int64, Int32...).

pandas keeps the column's type (Int64 with <NA>: astype(str) gives "4", to_csv writes 4);
only a numpy int64 column becomes float64. The conversion made every such column Float64,
so astype(str) gave "4.0" and the file read 4.0.

pandas is the reference implementation: each check runs the script with pandas and its
conversion with Polars and compares what they print and write.
"""

from __future__ import annotations

from pathlib import Path

from support import same_text

DATA = {"d.csv": "k,v,w\na,1,2\nb,-3,\nc,,5\na,4,-1\nb,12,7\n"}


def test_pd_na_under_a_mask_keeps_int64(tmp_path: Path) -> None:
    same_text("""
        import pandas as pd
        df = pd.read_csv("d.csv")
        df["v"] = df["v"].astype("Int64")
        df.loc[df["v"] < 0, "v"] = pd.NA
        df["vs"] = df["v"].astype(str)
        print(df["v"].tolist(), df["vs"].tolist(), df["v"].dtype)
        df.to_csv("o.csv", index=False)
        """, tmp_path, DATA)


def test_nan_and_none_under_a_mask_keep_the_nullable_type(tmp_path: Path) -> None:
    same_text("""
        import pandas as pd
        import numpy as np
        df = pd.read_csv("d.csv")
        df["v"] = df["v"].astype("Int64")
        df["w"] = df["w"].astype("Int32")
        df.loc[df["k"] == "a", "v"] = np.nan
        df.loc[df["k"] == "b", "w"] = None
        df["both"] = df["v"].astype(str) + "/" + df["w"].astype(str)
        print(df["both"].tolist())
        df.to_csv("o.csv", index=False)
        """, tmp_path, DATA)


def test_several_columns_int64_kept_numpy_int_made_float(tmp_path: Path) -> None:
    same_text("""
        import pandas as pd
        df = pd.read_csv("d.csv")
        df["v"] = df["v"].astype("Int64")
        df["n"] = df["k"].str.len()
        df.loc[df["k"] == "c", ["v", "n"]] = None
        print(df["v"].astype(str).tolist(), df["n"].astype(str).tolist())
        df.to_csv("o.csv", index=False)
        """, tmp_path, DATA)


def test_numpy_int_column_still_becomes_float(tmp_path: Path) -> None:
    same_text("""
        import pandas as pd
        df = pd.read_csv("d.csv")
        df["n"] = df["k"].str.len() * 3
        df.loc[df["k"] == "a", "n"] = pd.NA
        print(df["n"].astype(str).tolist())
        df.to_csv("o.csv", index=False)
        """, tmp_path, DATA)
