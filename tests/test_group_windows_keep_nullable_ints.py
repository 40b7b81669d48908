"""Group windows (shift, cumsum, diff, cummax, ffill...) of one of pandas' nullable integer
columns.

pandas 3.1 keeps the column's type: df.groupby("k")["n"].shift() of an Int64 column is Int64
(<NA> in the first row of each group, "1" as text). porter did not know the result's type, so
where the frame was handed to pandas the column came back float64 ("1.0"), and astype(str) /
to_csv there gave 1.0 where pandas gives 1.

pandas is the reference implementation: each check runs the script with pandas and its
conversion with Polars and compares what they print and write.
"""

from __future__ import annotations

from pathlib import Path

import pytest

from support import same_text

DATA = {"i.csv": "k,n,m\na,1,5\nb,,3\na,3,\nc,-2,4\nb,5,5\nc,,\na,0,1\n"}


@pytest.mark.parametrize("window", ["shift(1)", "cumsum()", "diff()", "cummax()", "ffill()",
                                    "cummin()", "bfill()", "cumprod()"])
def test_group_window_of_int64_handed_to_pandas(tmp_path: Path, window: str) -> None:
    # list(x.index) keeps `x` on pandas: the column crosses over with its type
    same_text(f"""
        import pandas as pd
        df = pd.read_csv("i.csv", dtype={{"n": "Int64"}})
        df["w"] = df.groupby("k")["n"].{window}
        x = df[df["k"] != "c"]
        print(list(x.index))
        x["t"] = x["w"].astype(str) + "|" + x["n"].astype(str)
        print(x["t"].tolist())
        x.to_csv("x.csv", index=False)
        """, tmp_path, DATA)


def test_group_window_of_int64_as_text(tmp_path: Path) -> None:
    same_text("""
        import pandas as pd
        df = pd.read_csv("i.csv")
        df["n"] = df["n"].astype("Int64")
        df["sh"] = df.groupby("k")["n"].shift(-1)
        df["cs"] = df.groupby("k")["n"].cumsum()
        print(df["sh"].astype(str).tolist(), df["cs"].astype(str).tolist())
        df.to_csv("o.csv", index=False)
        """, tmp_path, DATA)


def test_group_window_of_numpy_int_is_float(tmp_path: Path) -> None:
    # a plain int64 column (no missing value read): shift makes it float64 in pandas
    same_text("""
        import pandas as pd
        df = pd.read_csv("i.csv")
        df["j"] = df["k"].str.len() * 2
        df["nn"] = df["n"].astype("Int64")
        df["sh"] = df.groupby("k")["j"].shift(1)
        x = df[df["k"] != "c"]
        print(list(x.index))
        print(x["sh"].astype(str).tolist())
        x.to_csv("x.csv", index=False)
        """, tmp_path, DATA)
