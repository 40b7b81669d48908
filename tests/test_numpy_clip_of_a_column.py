"""np.clip(s, lower, upper) of a column: numpy hands a Series to Series.clip, so the conversion
is what s.clip(lower, upper) gives; checked against pandas on NaN and None, ties on the bounds,
integer columns with whole and fractional bounds, bounds the wrong way round and a None bound."""

from __future__ import annotations

import pytest

from rule_checks import check_ports, check_todo
from support import differential

FRAME = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "a": [1.0, 0.0, -1.0, None, np.nan, 2.25, 2.5, 400.0, -0.0],
    "n": [1, 0, -4, 9, 9, 2, 2, 16, 3],
    "m": [3.0, 1.0, 0.0, None, 7.0, 2.0, 5.0, 16.0, 2.0],
    "k": ["x", "y", None, "x", "é", "é", "y", "x", "z"],
})
"""

CLIPPED = [
    pytest.param('np.clip(df["a"], 0, 2.5)', id="floats, a value on each bound, NaN kept"),
    pytest.param('np.clip(df["a"], 30, 95)', id="every value below the lower bound or above"),
    pytest.param('np.clip(df["n"], 0, 9)', id="ints with int bounds stay ints"),
    pytest.param('np.clip(df["n"], 0.5, 8.5)', id="ints with fractional bounds become floats"),
    pytest.param('np.clip(df["n"], 0.0, 9.0)', id="ints with whole float bounds"),
    pytest.param('np.clip(df["m"], 1, 6)', id="a float column of whole numbers with a missing one"),
    pytest.param('np.clip(df["a"], 2, -1)', id="bounds the wrong way round, as pandas swaps them"),
    pytest.param('np.clip(df["n"], None, 3)', id="no lower bound"),
    pytest.param('np.clip(df["a"], -1, None)', id="no upper bound"),
    pytest.param('np.clip(df["a"], a_min=0, a_max=1)', id="numpy's keywords"),
    pytest.param('np.clip(df["a"] * 2, 0, df["a"].median())', id="an expression, a computed bound"),
]


@pytest.mark.parametrize("expr", CLIPPED)
def test_np_clip_matches_pandas(expr: str) -> None:
    result = differential(FRAME + f'df["r"] = {expr}\nresult = df\n')
    assert "TODO(porter)" not in result.converted_text, result.converted_text


def test_np_clip_on_an_empty_frame() -> None:
    differential(FRAME + 'none = df[df["n"] > 100].copy()\nnone["r"] = np.clip(none["a"], 0, 1)\n'
                 'result = none\n')


def test_np_clip_after_a_filter() -> None:
    differential(FRAME + 'sub = df[df["k"] == "x"].copy()\nsub["r"] = np.clip(sub["a"], 0, 1)\n'
                 'result = sub\n')


def test_np_clip_is_the_clip_expression() -> None:
    check_ports(FRAME + 'df["r"] = np.clip(df["a"], 0, 2.5)\n', '.clip(0, 2.5)')


@pytest.mark.parametrize("expr", [
    pytest.param('np.clip(df[["a", "n"]], 0, 1)', id="a frame"),
    pytest.param('np.clip(df["a"], 0, 1, out=None)', id="out="),
    pytest.param('np.clip(df["a"], min=0, max=1)', id="numpy's min= and max="),
    pytest.param('np.clip(df["k"], "a", "x")', id="text"),
])
def test_np_clip_todo(expr: str) -> None:
    check_todo(FRAME + f"r = {expr}\n", "np.clip")
