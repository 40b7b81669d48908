"""Values out of a frame (values, to_numpy, tolist), and a few keys whose rule is shared.

pandas is the reference implementation: each differential check runs the snippet with pandas
and its conversion with Polars and compares the results.
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from rule_checks import check_ports, check_todo
from support import convert, differential, run

FRAME = '''
import numpy as np
import pandas as pd
df = pd.DataFrame({"k": ["b", "a", None, "b", "Éclair"], "v": [1.5, np.nan, 3.0, 3.0, -2.0],
                   "n": [1, 2, 3, 4, 5]})
'''


def _same_list(expected, actual) -> None:
    assert len(expected) == len(actual)
    for e, a in zip(expected, actual):
        if isinstance(e, float) and math.isnan(e):
            assert isinstance(a, float) and math.isnan(a), (expected, actual)
        else:
            assert e == a, (expected, actual)


@pytest.mark.parametrize("expr", [
    pytest.param('df["v"].values', id="values keeps nan"),
    pytest.param('df["v"].to_numpy()', id="to_numpy"),
    pytest.param('df[df["n"] > 2]["n"].values', id="values of a filtered frame"),
    pytest.param('df[["v", "n"]].values', id="frame values"),
    pytest.param('df[["v", "n"]].to_numpy()', id="frame to_numpy"),
])
def test_arrays_match_pandas(expr: str) -> None:
    source = FRAME + f"result = {expr}\n"
    expected = run(source)["result"]
    actual = run(convert(source).converted_text)["result"]
    assert isinstance(actual, np.ndarray)
    assert expected.shape == actual.shape
    _same_list(expected.ravel().tolist(), actual.ravel().tolist())


@pytest.mark.parametrize("expr", [
    pytest.param('df["v"].tolist()', id="tolist gives nan for missing numbers"),
    pytest.param('df["n"].to_list()', id="to_list of integers"),
    pytest.param('df.groupby("k")["v"].sum().tolist()', id="tolist of an aggregate"),
])
def test_lists_match_pandas(expr: str) -> None:
    source = FRAME + f"result = {expr}\n"
    _same_list(run(source)["result"], run(convert(source).converted_text)["result"])


def test_values_of_unknown_type_are_pandas_own() -> None:
    # a missing text or True/False of a column of unknown type is nan, as in pandas: the
    # values come through to_pandas() (test_text_values_hold_nan_as_in_pandas runs them)
    result = convert('import pandas as pd\ndf = pd.read_csv("x.csv")\nresult = df["k"].tolist()\n')
    site = next(s for s in result.sites if s.key == "series.tolist")
    assert site.confidence == 1.0 and "nan" in site.message


@pytest.mark.parametrize("expr", [
    pytest.param('df["k"].tolist()', id="tolist"),
    pytest.param('df["k"].to_list()', id="to_list"),
    pytest.param('list(df["k"].to_numpy())', id="to_numpy"),
    pytest.param('[n for n in df["k"].tolist() if n]', id="truth of a missing text (nan is true)"),
    pytest.param('[str(n) for n in df["k"].values]', id="str of a missing text is 'nan'"),
])
def test_text_values_hold_nan_as_in_pandas(expr: str) -> None:
    # pandas is the reference: a missing text is nan in pandas' text column (Polars' to_numpy
    # gave None, which is false and reads 'None')
    source = FRAME + f"result = {expr}\n"
    result = convert(source)
    assert "to_pandas()" in result.converted_text, result.converted_text
    _same_list(run(source)["result"], run(result.converted_text)["result"])


def test_values_of_a_grouped_frame_is_a_todo() -> None:
    check_todo(FRAME + 'result = df.groupby("k").sum().values\n', "frame.values")


def test_ports_tolist() -> None:
    check_ports(FRAME + 'result = df["v"].tolist()\n',
                'df.select(pl.col("v")).collect().to_series().to_numpy().tolist()')


# -- keys that share a rule with another key ---------------------------------------------------

def test_series_copy_tail_unique_and_aggregate() -> None:
    differential(FRAME + '''
s = df["v"].copy()
copied = df.assign(c=s * 2)
last = df["n"].tail(2)
firsts = df["k"].unique()
result = df.groupby("k").aggregate({"v": "max", "n": "sum"})
''', "copied", "last", "firsts", "result")


def test_series_to_csv(tmp_path, monkeypatch) -> None:
    # both sides write a Series with its index (a groupby key), read back by pandas
    import pandas as pd
    source = FRAME + '''
totals = df.groupby("k")["v"].sum()
totals.to_csv("totals.csv")
totals.reset_index().to_parquet("totals.parquet")
'''
    for side, text in (("pandas", source), ("polars", convert(source).converted_text)):
        (tmp_path / side).mkdir()
        monkeypatch.chdir(tmp_path / side)
        run(text)
    for name, read in (("totals.csv", pd.read_csv), ("totals.parquet", pd.read_parquet)):
        expected = read(tmp_path / "pandas" / name).reset_index()
        actual = read(tmp_path / "polars" / name).reset_index()
        expected = expected.drop(columns=[c for c in ("index",) if c in expected])
        actual = actual.drop(columns=[c for c in ("index",) if c in actual])
        assert expected.to_dict("list") == actual.to_dict("list"), name


def test_dtypes_names_every_column() -> None:
    # the dtype names differ (Polars' own), so the check is on the columns they describe
    source = FRAME + "result = list(dict(df.dtypes))\n"
    assert run(source)["result"] == run(convert(source).converted_text)["result"]


def test_values_of_dates_beside_numbers_are_pandas_own():
    # pandas keeps Timestamps in an object array; Polars' to_numpy would cast them to numbers
    result = differential("""
import pandas as pd
df = pd.DataFrame({"n": [1, 2], "label": ["é", None]})
df["when"] = pd.to_datetime(df["n"], unit="D")
result = df.to_numpy()
numbers = df[["n"]].values
""", "result", "numbers")
    assert ".to_pandas().to_numpy()" in result.converted_text


def test_tolist_of_a_list_column_gives_lists() -> None:
    source = ('import pandas as pd\ndf = pd.DataFrame({"route": ["a;b", "c", None, ""]})\n'
              'result = df["route"].str.split(";").tolist()\n'
              'shown = repr(result)\n')
    differential(source, "shown")


# Series.to_dict(): pandas makes the dict from the collected labels and values
TO_DICT = [
    pytest.param('r = df["shop"].value_counts().to_dict()', id="value_counts"),
    pytest.param('r = df.groupby("shop")["n"].max().to_dict()', id="groupby result"),
    pytest.param('r = df.groupby("shop", dropna=False)["qty"].sum().to_dict()', id="missing key kept"),
    pytest.param('r = df["t"].to_dict()', id="row numbers, a missing text"),
    pytest.param('r = df["qty"].to_dict()', id="row numbers, NaN"),
]


@pytest.mark.parametrize("before", TO_DICT)
def test_series_to_dict_matches_pandas(before: str) -> None:
    frame = ('import numpy as np\nimport pandas as pd\n'
             'df = pd.DataFrame({"shop": ["b", "a", None, "b", "é"], "qty": [1.5, np.nan, 3.0, 4.0, 2.0],\n'
             '                   "n": [1, 2, 3, 4, 5], "t": ["x", None, "z", "y", "w"]})\n')
    result = differential(frame + before + "\n", "r")
    assert "TODO" not in result.converted_text, result.converted_text


def test_series_to_dict_after_a_filter_stays_todo() -> None:
    check_todo('import pandas as pd\ndf = pd.DataFrame({"n": [1, 2, 3]})\n'
               'r = df[df["n"] > 1]["n"].to_dict()\n', "series.to_dict")


def test_tolist_of_true_false_with_a_blank_gives_nan(tmp_path) -> None:
    # pandas reads True/False with a blank as an object column: its missing value is nan
    from support import same_text
    same_text("""
        import pandas as pd
        df = pd.read_csv("t.csv")
        print(df["ok"].tolist(), df["full"].tolist())
        """, tmp_path, {"t.csv": "id,ok,full\n1,True,True\n2,,False\n3,False,True\n"})


# s.iloc[i]: the value at a position, whatever the labels
ILOC = [
    pytest.param('r = (df["qty"].iloc[0], df["qty"].iloc[-1], df["n"].iloc[2])', id="first and last"),
    pytest.param('r = df[df["n"] > 2]["qty"].iloc[0]', id="after a filter"),
    pytest.param('r = df.sort_values("n", ascending=False)["t"].iloc[0]', id="after a sort"),
    pytest.param('r = df["qty"].iloc[1]', id="a missing number is nan"),
    pytest.param('r = df.groupby("shop")["n"].sum().iloc[-1]', id="of a groupby result"),
    pytest.param('r = (df["n"] > 2).iloc[0]', id="True/False"),
]


@pytest.mark.parametrize("before", ILOC)
def test_series_iloc_matches_pandas(before: str) -> None:
    frame = ('import numpy as np\nimport pandas as pd\n'
             'df = pd.DataFrame({"shop": ["b", "a", None, "b", "é"], "qty": [1.5, np.nan, 3.0, 4.0, 2.0],\n'
             '                   "n": [1, 2, 3, 4, 5], "t": ["x", None, "z", "y", "w"]})\n')
    result = differential(frame + before + "\n", "r")
    assert "TODO" not in result.converted_text, result.converted_text
    assert ".get(" in result.converted_text


def test_series_iloc_slice_stays_todo() -> None:
    check_todo('import pandas as pd\ndf = pd.DataFrame({"n": [1, 2, 3]})\nr = df["n"].iloc[1:]\n',
               "series.iloc")


def test_values_of_nullable_integers_are_pandas_own(tmp_path) -> None:
    # astype("Int64") with a missing value: pandas' tolist() gives [1, <NA>, 3], porter's
    # integer column gave [1.0, nan, 3.0] as a plain int64 column read with a blank
    from support import same_text
    source = ('import pandas as pd\ndf = pd.read_csv("ferry.csv")\n'
              'df["m"] = df["n"].astype("Int64")\n'
              'print(df["m"].tolist(), df["n"].tolist(), df["m"].to_numpy())\n'
              'print(list(df["m"].values), (df["m"] * 2).tolist())\n')
    same_text(source, tmp_path, {"ferry.csv": "n,k\n1,a\n,b\n3,c\n"})
    # unique() still gives floats (pandas: an IntegerArray): said so
    result = convert(source + 'b = df["m"].unique().tolist()\n')
    site = next(s for s in result.sites if s.key == "series.unique")
    assert site.confidence <= 0.9 and "<NA>" in site.message


def test_dict_and_printed_value_of_nullable_integers_are_pandas_own(tmp_path) -> None:
    # pandas' Int64 column: to_dict() gives 1 and None, iloc of the missing value prints <NA>;
    # porter gave 1.0 and nan for both
    from support import same_text
    source = ('import pandas as pd\ndf = pd.read_csv("ferry.csv")\n'
              'df["m"] = df["n"].astype("Int64")\n'
              'print(df["m"].to_dict())\n'
              'print(df["m"].iloc[1], df["m"].iloc[0])\n'
              'v = df["m"].iloc[2]\n'
              'print(v + 1)\n')
    same_text(source, tmp_path, {"ferry.csv": "n,k\n1,a\n,b\n3,c\n"})


def test_tolist_of_dates_and_durations_prints_pandas_values(tmp_path) -> None:
    # pandas' tolist() gives Timestamps, Timedeltas, datetime.date objects and NaT for a
    # missing one; Polars' gave datetime.datetime / datetime.timedelta objects and None, which
    # print otherwise ([datetime.datetime(2024, 1, 1, 0, 0)] for [Timestamp('2024-01-01 ...')])
    from support import same_text
    same_text("""
        import pandas as pd
        df = pd.read_csv("trips.csv", parse_dates=["start", "end"])
        df["dur"] = df["end"] - df["start"]
        print(df["start"].tolist(), df["end"].to_list())
        print(df["dur"].tolist())
        print(df["start"].dt.date.tolist(), df["start"].dt.date.values)
        print(df.groupby("k")["start"].max().tolist())
        """, tmp_path, {"trips.csv": "k,start,end\na,2024-01-01 00:00:00,2024-01-03 04:00:00\n"
                                     "b,2024-01-02 06:00:00,\na,,2024-01-04 00:00:00\n"})


def test_distinct_dates_and_times_are_pandas_values(tmp_path) -> None:
    # pandas' unique() of dates is an array of datetime.date objects (tolist() there), of
    # times a DatetimeArray of Timestamps; the conversion gave a Polars Series, which has no
    # tolist() (the script stopped)
    from support import same_text
    same_text("""
        import pandas as pd
        df = pd.read_csv("trips.csv", parse_dates=["start"])
        print(df["start"].dt.date.unique().tolist())
        print(df["start"].unique().tolist(), len(df["start"].unique()))
        print(list(df["start"].dt.normalize().unique()))
        """, tmp_path, {"trips.csv": "k,start\na,2024-01-01 00:00:00\nb,2024-01-02 06:00:00\n"
                                     "a,\nc,2024-01-01 00:00:00\nd,2024-01-02 08:00:00\n"})
