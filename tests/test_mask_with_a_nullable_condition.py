"""Series.mask / where with a condition of pandas' nullable boolean (a comparison of an Int64
or boolean column), which holds <NA> where the compared value is missing.

pandas replaces the value where the condition is <NA> in both: where() keeps only where it is
True, and mask() replaces where it is True or <NA>. The conversion filled the missing
condition with False for both, so mask() kept the value (<NA> where pandas has 0).

pandas is the reference implementation: each check runs the script with pandas and its
conversion with Polars and compares what they print and write.
"""

from __future__ import annotations

from pathlib import Path

from support import same_text

DATA = {"i.csv": "k,n,b,v\na,1,True,1.5\nb,,,\na,3,False,2.5\nc,-2,,-1\nb,5,True,\n"}


def test_mask_of_int64_by_its_own_comparison(tmp_path: Path) -> None:
    same_text("""
        import pandas as pd
        df = pd.read_csv("i.csv", dtype={"n": "Int64"})
        df["mk"] = df["n"].mask(df["n"] > 2, 0)
        df["mn"] = df["n"].mask(df["n"] < 0)
        df["wh"] = df["n"].where(df["n"] > 0, -1)
        print(df["mk"].astype(str).tolist(), df["mn"].astype(str).tolist(),
              df["wh"].astype(str).tolist(), df["mk"].sum())
        df.to_csv("o.csv", index=False)
        """, tmp_path, DATA)


def test_mask_of_a_float_column_by_a_boolean_column(tmp_path: Path) -> None:
    same_text("""
        import pandas as pd
        df = pd.read_csv("i.csv", dtype={"b": "boolean"})
        df["mk"] = df["v"].mask(df["b"], 0.0)
        df["wh"] = df["v"].where(df["b"], 0.0)
        print(df["mk"].tolist(), df["wh"].tolist())
        df.to_csv("o.csv", index=False)
        """, tmp_path, DATA)


def test_mask_of_a_numpy_comparison_keeps_the_value(tmp_path: Path) -> None:
    # a float column compared: NaN > 2 is False in pandas, so mask keeps NaN
    same_text("""
        import pandas as pd
        df = pd.read_csv("i.csv")
        df["mk"] = df["v"].mask(df["v"] > 2, 0.0)
        df["mn"] = df["n"].mask(df["n"] > 2, 0)
        print(df["mk"].tolist(), df["mn"].tolist())
        df.to_csv("o.csv", index=False)
        """, tmp_path, DATA)
