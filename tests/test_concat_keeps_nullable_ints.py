"""pd.concat of frames holding one of pandas' nullable integer columns (Int64).

pandas 3.1 keeps Int64 when every piece holds the column as Int64 or as a numpy int64, and
fills a piece without the column with <NA> (the column stays Int64, where a numpy int64 one
becomes float64). porter did not carry the mark through the concat, so where the result was
handed to pandas the column came back float64 ("1.0"), and a missing piece made it Float64.

pandas is the reference implementation: each check runs the script with pandas and its
conversion with Polars and compares what they print and write.
"""

from __future__ import annotations

from pathlib import Path

from support import same_text

DATA = {"i.csv": "k,n,m\na,1,5\nb,,3\na,3,\nc,-2,4\nb,5,5\nc,,\na,0,1\n",
        "j.csv": "k,n,w\nd,7,1\ne,8,2\n"}


def test_concat_of_int64_frames_handed_to_pandas(tmp_path: Path) -> None:
    # list(w.index) keeps `w` on pandas: the column crosses over with its type
    same_text("""
        import pandas as pd
        df = pd.read_csv("i.csv", dtype={"n": "Int64"})
        c = pd.concat([df, df], ignore_index=True)
        w = c[c["k"] != "q"]
        print(list(w.index))
        print(w["n"].astype(str).tolist())
        w.to_csv("w.csv", index=False)
        """, tmp_path, DATA)


def test_int64_beside_numpy_int_and_a_missing_column(tmp_path: Path) -> None:
    same_text("""
        import pandas as pd
        df = pd.read_csv("i.csv", dtype={"n": "Int64"})
        other = pd.read_csv("j.csv")
        c = pd.concat([df, other], ignore_index=True)
        c["w2"] = c["w"].fillna(0)
        print(c["n"].astype(str).tolist(), c["w"].astype(str).tolist())
        c.to_csv("c.csv", index=False)
        solo = pd.concat([df[["k", "n"]], other[["k"]]], ignore_index=True)
        solo["t"] = solo["n"].astype(str)
        print(solo["t"].tolist())
        solo.to_csv("solo.csv", index=False)
        """, tmp_path, DATA)
