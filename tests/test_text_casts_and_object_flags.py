"""Casts of text to numbers, query() comparisons of text with numbers, and ~ / * 1 of
True/False columns pandas holds as objects.

pandas is the reference implementation: each check runs the snippet with pandas and its
conversion with Polars and compares what they computed.
"""

from __future__ import annotations

from pathlib import Path
import textwrap

import pytest

from support import convert, differential, run


@pytest.fixture
def folder(tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> Path:
    monkeypatch.chdir(tmp_path)
    return tmp_path


def test_astype_int_of_text_with_underscores_and_spaces(folder: Path) -> None:
    # pandas casts each text as Python's int() does: "1_000" is 1000, " 7 ", "+7" and "007"
    # are 7; Polars' cast refused "1_000" and the converted script stopped
    (folder / "a.csv").write_text("s,t\n1_000,1\n 7 ,2\n+7,3\n007,4\n-3,5\n-1_2_3,6\n1_2_3_4_5,7\n",
                                  encoding="utf-8")
    differential("""
        import pandas as pd
        df = pd.read_csv("a.csv", dtype={"s": str})
        df["n"] = df["s"].astype(int)
        df["f"] = df["s"].astype(float)
        result = df
        """, data_dir=str(folder))


def test_query_text_column_against_a_number(folder: Path) -> None:
    # pandas compares a text column with 7 value by value and finds none equal (no rows for
    # ==, every row for !=); the conversion wrote pl.col("code") == 7, which Polars refuses
    (folder / "a.csv").write_text("code,v,b\n7,1,True\nA7,2,False\n,3,True\n07,4,\n",
                                  encoding="utf-8")
    differential("""
        import pandas as pd
        df = pd.read_csv("a.csv")
        result = df.query("code == 7")
        others = df.query("code != 7 and v > 1")
        either = df.query("code == 7 or v > 2")
        flipped = df.query("7 == code")
        text = df.query("v == '1'")
        listed = df.query("code in [7, 8, '07']")
        unlisted = df.query("code not in [7]")
        """, "result", "others", "either", "flipped", "text", "listed", "unlisted",
        data_dir=str(folder))


def test_invert_and_arithmetic_of_a_true_false_column_pandas_holds_as_objects(folder: Path) -> None:
    # a True/False column read with a blank is object in pandas, and stays object once filled:
    # ~ gives Python's ~True (-2) and ~False (-1), and b * 1 gives ints beside NaN, which
    # to_csv writes 1 where Polars' integer column with a missing value is written 1.0. Polars
    # negates and multiplies booleans: the sites say so
    (folder / "a.csv").write_text("k,b\na,True\nb,False\nc,\nd,True\n", encoding="utf-8")
    source = """
        import pandas as pd
        df = pd.read_csv("a.csv")
        df["b1"] = df["b"] * 1
        df["f"] = df["b"].fillna(False)
        df["nf"] = ~df["f"]
        flags = (~df["k"].isna()).tolist()
        df["late"] = df["k"] > "b"
        on_time = df[~df["late"]]
        """
    done = run(textwrap.dedent(source))  # pandas is the reference
    assert done["df"]["nf"].tolist() == [-2, -1, -1, -2]
    assert done["df"]["b1"].to_csv(index=False).split() == ["b1", "1", "0", '""', "1"]
    result = convert(source, data_dir=str(folder))
    site = {(s.line, s.key): s for s in result.sites}
    times = site[(4, "series.arith")]
    assert times.confidence <= 0.9 and "Python objects" in times.message, times
    invert = site[(6, "series.unary")]
    assert invert.confidence <= 0.9 and "~True" in invert.message, invert
    # ~ of isna() is a numpy bool in pandas too: not lowered
    assert "Python objects" not in site[(7, "series.unary")].message
    # a column the script only stores comparisons in is numpy bools in pandas: not lowered
    assert "Python objects" not in site[(9, "series.unary")].message
