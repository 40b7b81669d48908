"""Columns read_csv makes pandas' nullable "boolean", "string" or "Float64" (dtype={...}).

porter marked only the nullable integers (dtype={"c": "Int64"}), so:
- groupby(dropna=False) on a "boolean" key ordered its groups as pandas orders an object
  column of True/False/NaN (a missing key met first came first), where pandas sorts the
  nullable boolean False, True, <NA>;
- `b & cond` filled a missing result with False, where pandas' Kleene logic gives <NA>
  (<NA> & True);
- the frame handed to pandas got an object column of True/False/NaN back, not "boolean";
- str.len() of a "string" column was written 4.0 beside a missing value, where pandas' count
  is its nullable Int64 (written 4).

pandas is the reference implementation: each check runs the script with pandas and its
conversion with Polars and compares what they print and write.
"""

from __future__ import annotations

from pathlib import Path

from support import same_text

DATA = {"d.csv": "k,b,s,f,n\nb,,yy,,5\na,True,x,1.5,3\nc,False,,2.0,1\na,True,zzz,0,2\n"
                 "b,False,x,-1,\nc,,q,4,0\n"}


def test_groupby_dropna_false_on_a_boolean_key(tmp_path: Path) -> None:
    same_text("""
        import pandas as pd
        df = pd.read_csv("d.csv", dtype={"b": "boolean"})
        g = df.groupby("b", dropna=False)["n"].sum()
        print(g.tolist())
        g.to_csv("g.csv")
        m = df.groupby(["b", "k"], dropna=False)["n"].max().reset_index()
        m.to_csv("m.csv", index=False)
        """, tmp_path, DATA)


def test_kleene_and_of_a_boolean_column_read_as_boolean(tmp_path: Path) -> None:
    same_text("""
        import pandas as pd
        df = pd.read_csv("d.csv", dtype={"b": "boolean"})
        df["both"] = df["b"] & (df["n"] > 1)
        df["either"] = df["b"] | (df["n"] > 4)
        print(df["both"].sum(), df["either"].sum(), len(df[df["both"].fillna(True)]))
        df.to_csv("o.csv", index=False)
        """, tmp_path, DATA)


def test_boolean_column_handed_over_to_pandas(tmp_path: Path) -> None:
    # a draw by numpy's RandomState keeps `x` on pandas (a TODO): the column must come back
    # as "boolean"
    same_text("""
        import numpy as np
        import pandas as pd
        df = pd.read_csv("d.csv", dtype={"b": "boolean", "f": "Float64"})
        x = df[df["k"] != "a"].sample(frac=1.0, random_state=np.random.RandomState(0)).sort_index()
        print(list(x.index))
        t = x.groupby("b", dropna=False)["n"].mean()
        print(t)
        print(x["b"].dtype, x["f"].dtype, x["b"].tolist())
        t.to_csv("t.csv")
        """, tmp_path, DATA)


def test_nullable_columns_handed_over_without_data(tmp_path: Path) -> None:
    # without --data porter does not know the columns, but read_csv's dtype= names them: a
    # frame pandas makes for its labels gets them as "boolean" and "Float64" (they came over
    # as object and float64: the missing key grouped first, nan in tolist)
    same_text("""
        import pandas as pd
        df = pd.read_csv("d.csv", dtype={"b": "boolean", "f": "Float64"})
        x = df[df["k"] != "a"]
        print(list(x.index))
        t = x.groupby("b", dropna=False)["n"].mean()
        print(t)
        print(x["b"].dtype, x["f"].dtype, x["b"].tolist())
        t.to_csv("t.csv")
        """, tmp_path, DATA, with_data=False)


def test_str_len_of_a_string_column(tmp_path: Path) -> None:
    same_text("""
        import pandas as pd
        df = pd.read_csv("d.csv", dtype={"s": "string"})
        df["len"] = df["s"].str.len()
        df["xs"] = df["s"].str.count("x")
        df.to_csv("o.csv", index=False)
        print(df["len"].sum(), df["len"].max())
        """, tmp_path, DATA)


def test_text_tests_of_a_string_column(tmp_path: Path) -> None:
    # pandas' "string" dtype gives <NA> for a missing value in startswith / contains / match
    # (its nullable boolean), or `na` when given; the conversion gave False
    same_text("""
        import pandas as pd
        df = pd.read_csv("d.csv", dtype={"s": "string"})
        df["st"] = df["s"].str.startswith("x")
        df["en"] = df["s"].str.endswith("y", na=True)
        df["ct"] = df["s"].str.contains("z")
        df["cf"] = df["s"].str.contains("z", na=False)
        df["mt"] = df["s"].str.match("y")
        print(df["st"].sum(), df["ct"].astype(str).tolist(), df["en"].astype(str).tolist())
        x = df[df["k"] != "q"]
        print(list(x.index))
        print(x["st"].astype(str).tolist(), x["mt"].astype(str).tolist(), x["cf"].dtype)
        df.to_csv("o.csv", index=False)
        """, tmp_path, DATA)
