"""Time bins: df.resample(rule, on=col) and groupby with pd.Grouper(key=col, freq=rule)
(porter/rules/resample.py).

pandas is the reference implementation: each differential check runs the snippet with pandas
and its conversion with Polars and compares the results, and the result's column types are
compared too (pandas' int64 sum stays whole numbers, counts are integers, means floats).
"""

from __future__ import annotations

import textwrap

import pandas as pd
import polars as pl
import pytest

from rule_checks import check_todo
from support import convert, differential, run

# Rows out of order; a missing timestamp; a leap day late in the evening; the last half hour
# of 2023 and midnight of 2024; Sunday noon (2024-03-03) and the Monday midnight after it;
# missing values (None and NaN) among the floats and the text; a missing station; two stations
# whose rows span different periods.
FRAME = '''
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "raw": ["2024-02-27 13:00", "2024-03-03 12:00", None, "2024-02-29 23:59", "2023-12-31 23:30",
            "2024-01-01 00:00", "2024-03-04 00:00", "2024-01-31 08:00", "2024-02-27 13:00"],
    "v": [1, 5, 3, 4, 7, 2, 6, 9, 8],
    "f": [1.5, 3.0, 2.0, None, np.nan, 0.5, 4.0, -1.0, np.nan],
    "k": ["a", None, "a", "b", "c", "b", "a", "a", "b"],
    "st": ["x", "x", "y", "y", "x", None, "y", "y", "x"],
})
df["ts"] = pd.to_datetime(df["raw"], format="%Y-%m-%d %H:%M")
df = df.drop(columns=["raw"])
'''
# A few hours apart, for the rules of hours and minutes (a frame spanning months would make
# thousands of bins)
HOURS = '''
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "raw": ["2024-02-29 13:10", "2024-02-29 03:00", "2024-03-01 01:59", None, "2024-02-29 23:00",
            "2024-02-29 13:50"],
    "v": [1, 2, 3, 4, 5, 6],
    "f": [0.5, np.nan, 2.5, 1.0, None, 4.0],
    "st": ["x", "y", "x", "x", "y", "y"],
})
df["ts"] = pd.to_datetime(df["raw"], format="%Y-%m-%d %H:%M")
df = df.drop(columns=["raw"])
'''
EMPTY = '\ndf = df[df["v"] > 100]\n'

DAY_RULES = ["D", "2D", "3D", "W", "W-SUN", "W-WED", "W-SAT", "MS", "ME", "QS", "QE", "YS", "YE"]
HOUR_RULES = ["h", "5h", "6h", "90min", "7min", "30s"]
AGGREGATIONS = ["sum", "mean", "median", "min", "max", "count", "size", "first", "last",
                "nunique", "std", "var"]


def _kind(dtype: object) -> str:
    """int / float / text / datetime: what a column holds, as a person reading it sees it."""
    if isinstance(dtype, pl.DataType):
        if dtype.is_integer():
            return "int"
        if dtype.is_float():
            return "float"
        if dtype == pl.String:
            return "text"
        if isinstance(dtype, pl.Datetime):
            return "datetime"
        return str(dtype)
    kind = getattr(dtype, "kind", "O")
    if kind in "iu":
        return "int"
    if kind == "f":
        return "float"
    if kind == "M":
        return "datetime"
    if kind in "OUT" or str(dtype).startswith(("str", "string")):
        return "text"
    return str(dtype)


def _kinds(value: object) -> dict[str, str]:
    if isinstance(value, pl.LazyFrame):
        value = value.collect()
    if isinstance(value, pl.DataFrame):
        return {c: _kind(t) for c, t in value.schema.items()}
    if isinstance(value, pd.Series):
        value = value.to_frame(name=value.name if value.name is not None else "0")
    assert isinstance(value, pd.DataFrame)
    frame = value.reset_index() if value.index.name is not None or \
        isinstance(value.index, pd.MultiIndex) else value
    return {str(c): _kind(t) for c, t in frame.dtypes.items()}


def same_types(source: str, name: str = "result", *, allow: set[str] = frozenset()) -> None:
    """The result's columns hold the same kinds of values on both sides (`allow`: columns
    porter documents as int in Polars where pandas makes them float)."""
    source = textwrap.dedent(source)
    expected = _kinds(run(source)[name])
    actual = _kinds(run(convert(source).converted_text)[name])
    for column in allow:
        if expected.get(column) == "float" and actual.get(column) == "int":
            actual[column] = "float"
    assert list(expected) == list(actual), f"pandas {expected}, polars {actual}"
    assert expected == actual, f"pandas {expected}, polars {actual}"


def _converted(source: str) -> str:
    return convert(textwrap.dedent(source)).converted_text


# -- every rule, every aggregation, against pandas ---------------------------------------------

@pytest.mark.parametrize("freq", DAY_RULES)
@pytest.mark.parametrize("how", ["sum", "mean", "count", "size", "max"])
def test_resample_rules(freq: str, how: str) -> None:
    columns = '' if how == "size" else '[["v", "f"]]'
    source = FRAME + f'result = df.resample("{freq}", on="ts"){columns}.{how}()\n'
    result = differential(source)
    assert "TODO(porter)" not in result.converted_text
    same_types(source, allow={"v"} if how == "max" else set())


@pytest.mark.parametrize("freq", HOUR_RULES)
@pytest.mark.parametrize("how", ["sum", "mean", "count", "first"])
def test_resample_hours(freq: str, how: str) -> None:
    source = HOURS + f'result = df.resample("{freq}", on="ts")[["v", "f"]].{how}()\n'
    result = differential(source)
    assert "TODO(porter)" not in result.converted_text
    same_types(source, allow={"v"} if how == "first" else set())


@pytest.mark.parametrize("how", AGGREGATIONS)
@pytest.mark.parametrize("freq", ["D", "W", "ME"])
def test_resample_aggregations(freq: str, how: str) -> None:
    columns = '["v", "f", "k"]' if how in ("min", "max", "first", "last", "count", "nunique") \
        else '["v", "f"]'
    source = FRAME + f'result = df.resample("{freq}", on="ts")[{columns}].{how}()\n'
    result = differential(source)
    assert "TODO(porter)" not in result.converted_text
    same_types(source, allow={"v"} if how in ("min", "max", "first", "last") else set())


def test_sum_of_an_int_column_stays_int_and_empty_days_are_zero() -> None:
    source = FRAME + 'result = df.resample("D", on="ts")["v"].sum()\n'
    differential(source)
    same_types(source)
    out = run(_converted(source))["result"].collect()
    assert out.schema["v"].is_integer()
    assert (out["v"] == 0).sum() > 0, "the empty days are there, as 0"


def test_sum_of_text_is_joined_and_empty_bins_are_empty_text() -> None:
    source = FRAME + 'result = df.resample("D", on="ts")["k"].sum()\n'
    differential(source)


def test_float_sum_of_only_missing_values_is_zero() -> None:
    # 2024-02-29 holds one row, its f missing: pandas' sum (min_count=0) is 0.0
    source = FRAME + 'result = df.resample("D", on="ts")["f"].sum()\n'
    differential(source)
    same_types(source)


def test_std_with_ddof() -> None:
    differential(FRAME + 'result = df.resample("ME", on="ts")["f"].std(ddof=0)\n')


def test_whole_frame_when_the_columns_are_known() -> None:
    source = FRAME + 'result = df[["ts", "v", "f"]].resample("W", on="ts").sum()\n'
    differential(source)
    same_types(source)


def test_sunday_noon_is_in_the_week_ending_that_sunday() -> None:
    source = FRAME + ('df = df[df["ts"] >= pd.Timestamp("2024-03-03")]\n'
                      'result = df.resample("W-SUN", on="ts")["v"].sum()\n')
    differential(source)
    out = run(_converted(source))["result"].collect()
    assert out["ts"].dt.strftime("%Y-%m-%d").to_list() == ["2024-03-03", "2024-03-10"]


def test_a_multiple_of_days_counts_from_the_first_midnight() -> None:
    # the first row is at 23:30 on 2023-12-31: the 3-day bins start at that midnight
    source = FRAME + 'result = df.resample("3D", on="ts")["v"].sum()\n'
    differential(source)
    out = run(_converted(source))["result"].collect()
    assert out["ts"][0].isoformat() == "2023-12-31T00:00:00"


# -- groupby with pd.Grouper -------------------------------------------------------------------

@pytest.mark.parametrize("freq", ["D", "2D", "W", "W-WED", "MS", "ME", "QE", "YS"])
@pytest.mark.parametrize("how", ["sum", "mean", "min", "count", "size", "nunique"])
def test_groupby_station_and_grouper(freq: str, how: str) -> None:
    # beside another key pandas makes only the bins rows fall in (no empty ones), per station;
    # the missing station's row is left out but still sets where 2-day bins start
    columns = "" if how == "size" else '["v"]'
    source = FRAME + (f'result = df.groupby(["st", pd.Grouper(key="ts", freq="{freq}")])'
                      f'{columns}.{how}()\n')
    result = differential(source)
    assert "TODO(porter)" not in result.converted_text
    same_types(source)


def test_grouper_first_then_station() -> None:
    source = FRAME + ('result = df.groupby([pd.Grouper(key="ts", freq="W"), "st"])'
                      '[["v", "f"]].sum()\n')
    differential(source)
    same_types(source)


@pytest.mark.parametrize("freq", ["D", "2D", "W", "ME", "QS"])
def test_grouper_alone_makes_every_bin(freq: str) -> None:
    source = FRAME + f'result = df.groupby(pd.Grouper(key="ts", freq="{freq}"))["v"].sum()\n'
    differential(source)
    same_types(source)


def test_grouper_in_a_list_alone_and_bound_to_a_name() -> None:
    source = FRAME + ('by_week = pd.Grouper(key="ts", freq="W")\n'
                      'result = df.groupby([by_week])["f"].mean()\n'
                      'other = df.groupby(["st", by_week])["f"].mean()\n')
    result = differential(source, "result", "other")
    assert "TODO(porter)" not in result.converted_text


def test_grouper_as_index_false() -> None:
    source = FRAME + ('result = df.groupby(["st", pd.Grouper(key="ts", freq="ME")], '
                      'as_index=False)["v"].sum()\n'
                      'alone = df.groupby(pd.Grouper(key="ts", freq="ME"), as_index=False)["v"].sum()\n')
    differential(source, "result", "alone")


@pytest.mark.parametrize("by", ['pd.Grouper(key="ts", freq="W")', '[pd.Grouper(key="ts", freq="W")]',
                                '["st", pd.Grouper(key="ts", freq="W")]'])
def test_first_and_last_read_the_order_pandas_bins_in(by: str) -> None:
    # pandas sorts by time (stably, ties in the frame's order) for resample and a Grouper given
    # alone, and keeps the frame's order for a Grouper in a list
    source = FRAME + (f'result = df.groupby({by})[["v", "f", "k"]].first()\n'
                      f'other = df.groupby({by})[["v", "f", "k"]].last()\n')
    differential(source, "result", "other")


# -- agg -----------------------------------------------------------------------------------------

AGG = [
    pytest.param('df.resample("W", on="ts").agg({"v": "sum", "f": "mean", "k": "first"})', id="dict"),
    pytest.param('df.resample("ME", on="ts").agg(total=("v", "sum"), n=("f", "count"), '
                 'top=("f", "max"))', id="named"),
    pytest.param('df.resample("D", on="ts")["v"].agg(["sum", "mean", "size"])', id="list"),
    pytest.param('df.resample("D", on="ts")["f"].agg("median")', id="one name"),
    pytest.param('df.resample("QE", on="ts")["v"].agg(total="sum", n="count")', id="named on one"),
    pytest.param('df.groupby(["st", pd.Grouper(key="ts", freq="W")]).agg(total=("v", "sum"))',
                 id="grouper named"),
]


@pytest.mark.parametrize("expr", AGG)
def test_agg(expr: str) -> None:
    source = FRAME + f"result = {expr}\n"
    result = differential(source)
    assert "TODO(porter)" not in result.converted_text
    same_types(source)


# -- set_index and groupby().resample ------------------------------------------------------------

# pandas resamples each group on its own: every bin from the group's first timestamp to its
# last (station "y" spans other weeks than "x"), the groups in key order, the missing station
# and the missing timestamp left out
GROUP_RESAMPLES = [
    'df.set_index("ts").groupby("st").resample("{freq}")[["v", "f"]].{how}()',
    'df.set_index("ts").groupby("st")["f"].resample("{freq}").{how}()',
    'df.groupby("st").resample("{freq}", on="ts")[["v", "f"]].{how}()',
    'df.groupby(["st", "k"]).resample("{freq}", on="ts")["v"].{how}()',
]


@pytest.mark.parametrize("expr", GROUP_RESAMPLES)
@pytest.mark.parametrize("freq", ["D", "W-SUN", "MS", "ME", "6h"])
@pytest.mark.parametrize("how", ["sum", "mean", "count", "first", "max"])
def test_groupby_resample_fills_each_group(expr: str, freq: str, how: str) -> None:
    source = FRAME + f"result = {expr.format(freq=freq, how=how)}\n"
    result = differential(source)
    assert "TODO(porter)" not in result.converted_text
    same_types(source, allow={"v"} if how in ("first", "max") else set())


def test_groupby_resample_of_every_column_and_agg() -> None:
    source = FRAME + (
        'result = df.drop(columns=["k"]).set_index("ts").groupby("st").resample("D").sum()\n'
        'other = df.groupby("st").resample("W", on="ts").agg({"v": "max", "f": "sum"})\n'
        'sizes = df.set_index("ts").groupby("st").resample("ME").size()\n')
    result = differential(source, "result", "other", "sizes")
    assert "TODO(porter)" not in result.converted_text


def test_set_index_then_resample_and_reset_index() -> None:
    source = FRAME + (
        'result = df.set_index("ts").resample("W")["v"].sum().reset_index()\n'
        'back = df.set_index("ts").reset_index()\n'
        'dropped = df.set_index("ts").reset_index(drop=True)\n'
        'by_time = df.set_index("ts")\n'
        'other = by_time.groupby("st")["f"].resample("D").mean().reset_index()\n')
    result = differential(source, "result", "back", "dropped", "other")
    assert "TODO(porter)" not in result.converted_text


def test_an_indexed_frame_read_by_label_stays_pandas_with_its_labels() -> None:
    source = FRAME + ('by_time = df.set_index("ts")\n'
                      'result = by_time.loc[by_time.index >= "2024-02-29"]\n')
    result = differential(source)
    # the labelled table's .loc by a mask of its labels (the index is a Series porter does not
    # compare with text): kept on pandas, labels set again
    assert "TODO(porter): frame.loc" in result.converted_text
    assert '.set_index("ts").loc[' in "".join(result.converted_text.split())


# -- the result as pandas' index ---------------------------------------------------------------

def test_reset_index_and_csv(tmp_path) -> None:
    out = tmp_path / "weekly.csv"
    source = FRAME + (f'weekly = df.resample("W", on="ts")["v"].sum().reset_index()\n'
                      f'weekly.to_csv({str(out)!r}, index=False)\n'
                      f'df.groupby(["st", pd.Grouper(key="ts", freq="ME")])["f"].mean()'
                      f'.to_csv({str(tmp_path / "monthly.csv")!r})\n'
                      'result = weekly\n')
    differential(source)
    expected = {p.name: p.read_text() for p in tmp_path.iterdir()}
    for p in tmp_path.iterdir():
        p.unlink()
    run(_converted(source))
    actual = {p.name: p.read_text() for p in tmp_path.iterdir()}
    assert expected == actual


# -- empty frames -------------------------------------------------------------------------------

@pytest.mark.parametrize("expr", [
    'df.resample("D", on="ts")["v"].sum()',
    'df.resample("W", on="ts")[["v", "f"]].mean()',
    'df.resample("ME", on="ts")["v"].size()',
    'df.groupby(["st", pd.Grouper(key="ts", freq="D")])["v"].count()',
])
def test_empty_frame(expr: str) -> None:
    source = FRAME + EMPTY + f"result = {expr}\n"
    differential(source)
    out = run(_converted(source))["result"]
    assert out.collect().height == 0


# -- TODOs ----------------------------------------------------------------------------------------

TODOS = [
    pytest.param('df.resample("W", on="ts", closed="left")["v"].sum()', "frame.resample", id="closed"),
    pytest.param('df.resample("D", on="ts", label="right")["v"].sum()', "frame.resample", id="label"),
    pytest.param('df.resample("D", on="ts", origin="epoch")["v"].sum()', "frame.resample", id="origin"),
    pytest.param('df.resample("D", on="ts", offset="2h")["v"].sum()', "frame.resample", id="offset"),
    pytest.param('df.resample("B", on="ts")["v"].sum()', "frame.resample", id="business days"),
    pytest.param('df.resample("2W", on="ts")["v"].sum()', "frame.resample", id="two weeks"),
    pytest.param('df.resample("d", on="ts")["v"].sum()', "frame.resample", id="lower case"),
    pytest.param('df.set_index("ts", drop=False).resample("D")["v"].sum()', "frame.set_index",
                 id="set_index drop=False"),
    pytest.param('df.set_index("ts").loc["2024-02-27"]', "frame.loc", id="a label read"),
    pytest.param('df.set_index("ts").groupby("st").resample("2D")["v"].sum()',
                 "indexed.groupby.resample", id="days counted from each group's first"),
    pytest.param('df.set_index("ts").groupby("st").sum()', "indexed.groupby.sum",
                 id="groupby on the indexed frame without resample"),
    pytest.param('df.groupby("st").resample("D", on="ts", closed="right")["v"].sum()',
                 "groupby.resample", id="groupby resample closed right"),
    pytest.param('df.groupby("st", sort=False).resample("D", on="ts")["v"].sum()',
                 "groupby.resample", id="groupby sort=False before resample"),
    pytest.param('df.resample("D", on="ts")["v"].sum(min_count=1)', "resample.sum", id="min_count"),
    pytest.param('df.resample("D", on="ts")["v"].ohlc()', "resample.ohlc", id="ohlc"),
    pytest.param('df.groupby(["st", pd.Grouper(key="ts", freq="D")], sort=False)["v"].sum()',
                 "frame.groupby.grouper", id="sort=False"),
    pytest.param('df.groupby(pd.Grouper(key="ts", freq="D", offset="1h"))["v"].sum()',
                 "pd.Grouper", id="grouper offset"),
    pytest.param('df.resample("D", on="ts").agg({"v": ("sum", "mean")})', "resample.agg",
                 id="dict of tuples"),
]


@pytest.mark.parametrize("expr, key", TODOS)
def test_todo(expr: str, key: str) -> None:
    check_todo(FRAME + f"result = {expr}\n", key)


def test_two_labels_columns_set_and_reset_as_pandas():
    # set_index of a text and a time column, then reset_index: ported since tables labelled
    # by several key columns are (it was a TODO), the columns back in pandas' order
    result = differential(FRAME + 'result = df.set_index(["st", "ts"]).reset_index()\n')
    assert "TODO" not in result.converted_text


def test_rule_pandas_rejects_is_read_as_its_new_name() -> None:
    # "M" is pandas 3.1's "ME" (tests/test_old_frequency_aliases.py compares them)
    text = _converted(FRAME + 'result = df.resample("M", on="ts")["v"].sum()\n')
    assert "TODO(porter)" not in text
    # a semi-month end is not binned by porter: the TODO names pandas 3.1's spelling (a
    # business month end, "BM", is: tests/test_business_month_end_bins.py)
    text = _converted(FRAME + 'result = df.resample("SM", on="ts")["v"].sum()\n')
    assert "TODO(porter): frame.resample" in text
    assert "'SME'" in text


# -- columns porter does not know -------------------------------------------------------------

CSV = """ts,kg,price
2024-01-31 23:00,1,2.5
2024-01-02 08:00,3,
2024-01-30 10:00,,1.0
,4,4.0
2024-03-01 00:00,2,0.5
"""


@pytest.mark.parametrize("how", ["sum", "mean", "count", "max"])
def test_whole_frame_read_from_a_file(tmp_path, how: str) -> None:
    path = tmp_path / "sales.csv"
    path.write_text(CSV)
    source = (f'import pandas as pd\ndf = pd.read_csv({str(path)!r}, parse_dates=["ts"])\n'
              f'result = df.resample("ME", on="ts").{how}()\n')
    result = differential(source)
    assert "TODO(porter)" not in result.converted_text
    assert any(s.key == f"resample.{how}" and s.confidence == 0.85 for s in result.sites)


def test_days_counted_in_bins_of_several_days_are_lowered() -> None:
    result = convert(FRAME + 'result = df.resample("2D", on="ts")["v"].sum()\n')
    assert any(s.key == "frame.resample" and s.confidence == 0.95 for s in result.sites)


def test_a_column_by_attribute() -> None:
    result = differential(FRAME + 'result = df.resample("D", on="ts").v.sum()\n')
    assert "TODO(porter)" not in result.converted_text


@pytest.mark.parametrize("agg", [
    '{"v": ["sum", "mean"], "f": "max"}',
    '{"f": ["min", "max", "mean"]}',
])
def test_dict_of_lists_flattened_as_pandas_joins_them(agg: str) -> None:
    # pandas makes (column, function) pairs; the script joins them into flat names
    source = FRAME + (f'result = df.set_index("ts").groupby("st").resample("D").agg({agg})\n'
                      'result.columns = ["_".join(c) for c in result.columns]\n'
                      'result = result.reset_index()\n'
                      f'weekly = df.resample("W", on="ts").agg({agg})\n'
                      'weekly.columns = ["_".join(c) for c in weekly.columns]\n')
    result = differential(source, "result", "weekly")
    assert "TODO" not in result.converted_text


def test_the_date_index_of_a_resampled_frame_read_otherwise_is_pandas_own_index() -> None:
    # strftime is ported as the key column's dt method; tolist() and min() are handed over as
    # pandas' DatetimeIndex of the frame (not a Series' .dt, which has neither)
    source = FRAME + ('wide = df.set_index("ts").resample("W")[["v"]].sum()\n'
                      'days = wide.index.tolist()\n'
                      'first = wide.index.min()\n'
                      'wide.index = wide.index.strftime("%d.%m")\n'
                      'result = wide.reset_index()\n')
    differential(source, "days", "first", "result")
