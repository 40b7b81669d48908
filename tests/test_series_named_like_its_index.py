"""A Series named like its own index key, handed to pandas (pandas is the reference).

pandas holds an index level and the values of one name (`df.groupby("k")["k"].count()`,
`s.to_frame("k")` of a Series indexed by "k"); one Polars frame cannot hold two columns of one
name, so the hand-over must not look the values up under the key's name.
"""

from __future__ import annotations

import pandas as pd
import polars as pl

from support import assert_same_value, differential  # porter.api first: its import order
from porter.emit.code import Code
from porter.translate.handover import to_pandas
from porter.translate.values import Column, Frame


def test_a_series_named_like_its_index_key_reaches_pandas_with_its_values():
    # the values of "n" indexed by "k", named "k": pandas' own Series is the reference
    frame = Frame(Code('pl.LazyFrame({"k": ["a", "b", "c"], "n": [3, 1, 2]})'),
                  columns=("k", "n"), index=("k",), dtypes=(("k", "str"), ("n", "int")))
    column = Column(Code('pl.col("n")'), frame=frame, name="k", dtype="int")
    expected = pd.DataFrame({"k": ["a", "b", "c"], "n": [3, 1, 2]}).set_index("k")["n"].rename("k")
    actual = eval(to_pandas(column).text, {"pl": pl, "pd": pd})  # was a KeyError: 'k'
    assert isinstance(actual, pd.Series)
    assert actual.name == "k" and actual.index.name == "k"
    assert actual.index.tolist() == expected.index.tolist()
    assert_same_value(expected, actual)


def test_to_frame_named_like_the_index_key_keeps_the_values():
    # pandas: the sums under a column "k" beside the index "k"; the conversion selected the
    # sums under the key's name, and set_index("k") made them the index of an empty frame
    result = differential("""
        import pandas as pd
        df = pd.DataFrame({"k": ["b", "a", "b", "c"], "n": [1, 2, 3, 4]})
        result = df.groupby("k")["n"].sum().to_frame("k")
        total = result["k"].sum()
    """, "result", "total")
    assert "TODO(porter): series.to_frame" in result.converted_text


def test_astype_str_after_a_frame_comes_back_from_pandas_writes_pandas_text(tmp_path):
    # after a loop kept on pandas (at[...] changes the frame in place) the frame comes back
    # with its types unknown: Polars' cast wrote true, 0.00001 and 2024-01-01 00:00:00.000000
    # and refused the durations, where pandas writes True, 1e-05, 2024-01-01 and 1 days
    from support import same_text
    same_text("""
        import pandas as pd
        df = pd.read_csv("berths.csv", parse_dates=["arrived", "left"])
        df["stay"] = df["left"] - df["arrived"]
        for i, row in df.iterrows():
            if row["tons"] > 2:
                df.at[i, "berth"] = "big"
        df["ok_text"] = df["ok"].astype(str)
        df["tons_text"] = df["tons"].astype(str)
        df["arrived_text"] = df["arrived"].astype(str)
        df["stay_text"] = df["stay"].astype(str)
        df["crates_text"] = df["crates"].astype(str)
        df.to_csv("out.csv", index=False)
        """, tmp_path, {"berths.csv": "berth,ok,tons,crates,arrived,left\n"
                                      "A,True,0.00001,3,2024-01-01,2024-01-02\n"
                                      "B,,2.5,,2024-01-02,2024-01-04\n"
                                      "C,False,,1,,2024-01-05\n"})
