"""shift, diff, cumulative sums, quantile, any/all.

pandas is the reference implementation: each differential check runs the snippet with pandas
and its conversion with Polars and compares the results.
"""

from __future__ import annotations

import pytest

from rule_checks import check_ports, check_todo, check_unchanged
from support import convert, differential

FRAME = '''
import numpy as np
import pandas as pd
df = pd.DataFrame({"v": [1.5, np.nan, 3.0, 3.0, -2.0, None], "n": [4, 2, 2, 7, 1, 0],
                   "k": ["a", "b", None, "a", "ünï", "b"]})
'''
EMPTY = '''
import pandas as pd
df = pd.DataFrame({"v": [1.0], "n": [1], "k": ["a"]})
df = df[df["n"] > 5]
'''

PORTS = [
    pytest.param('r = df["v"].shift()', 'pl.col("v").shift(1)', id="shift by one"),
    pytest.param('r = df["n"].shift(2, fill_value=0)', 'pl.col("n").shift(2, fill_value=0)',
                 id="shift with a fill value"),
    pytest.param('r = df["v"].diff()', 'pl.col("v").diff()', id="diff"),
    pytest.param('r = df["v"].cumsum()', 'pl.col("v").cum_sum()', id="cumsum"),
    pytest.param('r = df["n"].quantile(0.25)', 'pl.col("n").quantile(0.25, "linear")',
                 id="quantile is linear as in pandas"),
    pytest.param('r = (df["v"] > 2).any()', '(pl.col("v") > 2).fill_null(False).any()',
                 id="any of a comparison"),
]


@pytest.mark.parametrize("before, fragment", PORTS)
def test_ports(before: str, fragment: str) -> None:
    check_ports(FRAME + before + "\n", fragment)


TODOS = [
    pytest.param('r = df["v"].cumsum(skipna=False)', "series.cumsum", id="cumsum skipna=False"),
    pytest.param('r = df["v"].quantile([0.25, 0.75])', "series.quantile", id="several quantiles"),
    pytest.param('r = df["k"].any()', "series.any", id="any of text"),
    pytest.param('r = df["v"].rolling(2).mean()', "series.rolling", id="rolling window"),
]


@pytest.mark.parametrize("before, key", TODOS)
def test_todo(before: str, key: str) -> None:
    check_todo(FRAME + before + "\n", key)


def test_unchanged() -> None:
    check_unchanged("import itertools\ntotal = list(itertools.accumulate([1, 2]))\n"
                    "class Tape:\n    def shift(self, n):\n        return n\nTape().shift(2)\n")


@pytest.mark.parametrize("frame", [pytest.param(FRAME, id="missing values"),
                                   pytest.param(EMPTY, id="empty")])
@pytest.mark.parametrize("expr", [
    'df["v"].shift()', 'df["n"].shift(-1)', 'df["n"].shift(2, fill_value=0)', 'df["v"].diff()',
    'df["n"].diff(2)', 'df["v"].cumsum()', 'df["v"].cumprod()', 'df["n"].cummax()',
    'df["v"].cummin()', '(df["v"] > 2).cumsum()',
])
def test_columns_match_pandas(frame: str, expr: str) -> None:
    differential(frame + f"df['r'] = {expr}\nresult = df\n")


@pytest.mark.parametrize("expr", [
    'df["n"].quantile(0.25)', 'df["v"].quantile(0.5)', 'df["n"].quantile(0.9, interpolation="lower")',
    '(df["v"] > 2).any()', '(df["v"] > 2).all()', 'df["n"].all()', 'df["v"].any()',
])
def test_scalars_match_pandas(expr: str) -> None:
    differential(FRAME + f"result = {expr}\n")


def test_display_settings_are_left_alone() -> None:
    check_unchanged("import pandas as pd\npd.set_option('display.max_columns', 20)\n")


# -- within groups: window expressions -----------------------------------------------------------

GROUPED = FRAME.replace('"k": ["a", "b", None, "a", "ünï", "b"]})',
                        '"k": ["a", "b", None, "a", "ünï", "b"], "g": ["x", "x", "y", None, "x", "y"]})')


@pytest.mark.parametrize("expr", [
    'df.groupby("k")["v"].transform("sum")',
    'df.groupby("k")["v"].transform("mean")',
    'df.groupby("k")["n"].transform("max")',
    'df.groupby("k")["v"].transform("count")',
    'df.groupby("k")["n"].transform("size")',
    'df.groupby(["k", "g"])["n"].transform("min")',
    'df.groupby("k", dropna=False)["n"].transform("sum")',
    'df.groupby("k")["v"].cumsum()',
    'df.groupby("k")["n"].cummax()',
    'df.groupby("g")["v"].cummin()',
    'df.groupby("k")["v"].shift(1)',
    'df.groupby("k")["n"].shift(-1, fill_value=0)',
    'df.groupby("g")["v"].diff()',
    'df.groupby("k").cumcount()',
    'df.groupby("g").cumcount(ascending=False)',
    'df.groupby("k").n.cumsum()',
])
def test_group_windows_match_pandas(expr: str) -> None:
    result = differential(GROUPED + f'df["w"] = {expr}\nresult = df\n')
    assert not result.todos, result.converted_text


def test_group_windows_on_an_empty_frame() -> None:
    differential(EMPTY + 'df["w"] = df.groupby("k")["v"].transform("sum")\n'
                 'df["c"] = df.groupby("k").cumcount()\nresult = df\n')


@pytest.mark.parametrize("expr", [
    'df.groupby("k")["v"].transform(lambda s: s - s.mean())',
    'df.groupby("k")["v"].transform(np.sum)',
    'df.groupby("k")[["v", "n"]].cumsum()',
    'df.groupby("k")["v"].cumsum(skipna=False)',
])
def test_group_windows_porter_cannot_read_are_todos(expr: str) -> None:
    assert convert(GROUPED + f'df["w"] = {expr}\n').todos
