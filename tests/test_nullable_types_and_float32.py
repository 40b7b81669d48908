"""Operators on pandas' nullable types (Int64, Float64, string, boolean) and on float32
columns.

pandas is the reference implementation: each check runs the script with pandas and its
conversion with Polars and compares what they print and write.
"""

from __future__ import annotations

from pathlib import Path

from support import convert, same_text


def test_comparisons_of_nullable_columns_are_missing_where_a_value_is(tmp_path: Path) -> None:
    # pandas' Int64, Float64 and string compare a missing value as <NA> (written empty,
    # skipped by sum, printed <NA>); the conversion filled False (True for !=)
    same_text("""
        import pandas as pd
        df = pd.read_csv("d.csv")
        df["vi"] = df["v"].astype("Int64")
        df["vf"] = df["v"].astype("Float64")
        df["ks"] = df["k"].astype("string")
        df["big"] = df["vi"] > 1
        df["not3"] = df["vi"] != 3
        df["eq"] = df["vf"] == df["vf"]
        df["mid"] = df["vi"].between(1, 3)
        df["late"] = df["ks"] != "early"
        df["gt"] = df["vi"].gt(1)
        print(df["big"].sum(), df["late"].sum(), df["big"].tolist())
        print(len(df[df["big"]]), len(df[~df["big"]]))
        df.to_csv("o.csv", index=False)
        """, tmp_path, {"d.csv": "k,v\nlate,1\n,\nearly,3\nmid,2\n"})


def test_floor_division_and_modulo_of_nullable_integers_by_zero(tmp_path: Path) -> None:
    # pandas' Int64 gives 0 for x // 0 and x % 0 (<NA> for a missing x) and stays integer;
    # the conversion gave inf and NaN in a float column
    same_text("""
        import pandas as pd
        df = pd.read_csv("d.csv")
        df["vi"] = df["v"].astype("Int64")
        df["per"] = df["vi"] // df["w"]
        df["rem"] = df["vi"] % df["w"].astype("Int64")
        df["zero"] = df["vi"] // 0
        df["zrem"] = df["vi"] % 0
        df["two"] = df["vi"] // 2
        df.to_csv("o.csv", index=False)
        print(df["per"].tolist(), df["rem"].tolist())
        """, tmp_path, {"d.csv": "v,w\n3,0\n4,1\n-7,2\n,0\n5,-2\n,3\n"})


def test_kleene_logic_of_the_nullable_boolean(tmp_path: Path) -> None:
    # pandas' boolean: <NA> | True is True, <NA> | False is <NA>, <NA> & False is False;
    # the conversion read <NA> as False
    same_text("""
        import pandas as pd
        h = pd.read_csv("h.csv")
        h["ok"] = h["ok"].astype("boolean")
        h["keep"] = h["ok"] | (h["frames"] > 9)
        h["both"] = h["ok"] & (h["frames"] > 9)
        h["either"] = h["ok"] ^ (h["frames"] > 9)
        h["flip"] = ~h["ok"]
        h["always"] = True | h["ok"]
        print(h["keep"].sum(), h["both"].sum())
        h.to_csv("out.csv", index=False)
        """, tmp_path, {"h.csv": "hive,ok,frames\nH1,True,10\nH2,,8\nH3,False,12\nH4,,11\nH5,True,\n"})


def test_float32_divided_by_a_number_stays_float32(tmp_path: Path) -> None:
    # numpy takes the number as float32 and pandas' quotient is float32 (0.033333335); the
    # conversion divided by an integer column and made it Float64 (0.033333333830038704)
    same_text("""
        import pandas as pd
        df = pd.read_csv("d.csv", dtype={"grams": "float32"})
        df["per_seed"] = df["grams"] / 3
        df["tenth"] = df["grams"] / 0.1
        df["share"] = df["grams"] / df["grams"].sum()
        df["centred"] = (df["grams"] - df["grams"].mean()) / 2.5
        df.to_csv("o.csv", index=False)
        print(df["per_seed"].tolist(), df["tenth"].tolist())
        """, tmp_path, {"d.csv": "lot,grams\nL1,0.1\nL2,2.675\nL3,\nL4,12.5\n"})


def test_astype_str_of_float32(tmp_path: Path) -> None:
    # pandas writes numpy's text of float32 values (0.1, 1.234567e+06, 1e-04); the
    # conversion's text was of the Float64 value (0.10000000149011612, 1234567.0, 0.0001)
    same_text("""
        import pandas as pd
        df = pd.read_csv("d.csv", dtype={"g": "float32"})
        df["t"] = df["g"].astype(str)
        df["u"] = df["h"].astype(str)
        print(df["t"].tolist(), df["u"].tolist())
        df.to_csv("o.csv", index=False)
        """, tmp_path, {"d.csv": "g,h\n0.1,0.1\n1234567,5e-05\n0.0001,1e16\n,\n2.675,-0.0\n"})


def test_a_column_porter_does_not_follow_may_be_nullable(tmp_path: Path) -> None:
    # read_csv(dtype="string") makes every column pandas' string dtype, which the read does
    # not mark (dtype={"k": "string"} is marked: tests/test_nullable_dtypes_read_from_csv.py):
    # the comparison says it may be <NA> where a value is missing
    (tmp_path / "d.csv").write_text("k,v\na,1\n,2\n", encoding="utf-8")
    result = convert("""
        import pandas as pd
        df = pd.read_csv("d.csv", dtype="string")
        df["x"] = df["k"] == "a"
        """, data_dir=str(tmp_path))
    site = next(s for s in result.sites if s.key == "series.compare")
    assert site.confidence <= 0.9 and "<NA>" in site.message, site
    # a script that makes no nullable type: no such lowering
    result = convert("""
        import pandas as pd
        df = pd.read_csv("d.csv")
        df["x"] = df["k"] == "a"
        """, data_dir=str(tmp_path))
    site = next(s for s in result.sites if s.key == "series.compare")
    assert "<NA>" not in site.message, site


def test_sum_of_an_int32_column_is_int64(tmp_path: Path) -> None:
    # numpy adds int32 into int64 (4000000000); Polars' Int32 sum wrapped around (-294967296),
    # and so did arithmetic on it
    same_text("""
        import pandas as pd
        df = pd.read_csv("d.csv", dtype={"bees": "int32", "n": "int32"})
        total = df["bees"].sum()
        print(total, df["bees"].sum() * 10, df["n"].sum() * 100000)
        df["share"] = df["bees"] / df["bees"].sum()
        df.to_csv("o.csv", index=False)
        """, tmp_path, {"d.csv": "hive,bees,n\nH1,2000000000,30000\nH2,2000000000,2\n"})
