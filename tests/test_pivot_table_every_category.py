"""pivot_table(..., columns=<pd.cut / pd.qcut labels>, aggfunc="count", observed=False)
against pandas (the reference): pandas counts every combination of the index keys met in a
row with every category of the columns key, used or not: a column per category in the
categories' order, 0 where nothing is counted (fill_value never applies), a row for every
combination of keys none of which is missing, even one whose category or value is missing.
The frames hold missing keys, a missing category, NaN values, duplicates, unicode and
categories no row has."""

from __future__ import annotations

import pytest

from support import convert, differential

FRAME = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "shed": ["a", "a", "b", "b", None, "c", "Ü", "a", "b"],
    "flock": ["x", "y", "x", "x", "y", "z", "ö", "x", None],
    "kg": [1.0, 2.5, np.nan, 4.0, 5.0, np.nan, 0.5, 1.25, 3.0],
})
df["size"] = pd.cut(df["kg"], bins=[0, 1, 2, 3, 10], labels=["light", "fair", "good", "huge"])
"""

CASES = [
    'result = df.pivot_table(index=["shed", "flock"], columns=["size"], values="kg", '
    'aggfunc="count", fill_value=0, observed=False)',
    'result = df.pivot_table(index="shed", columns="size", values="kg", aggfunc="count", '
    'observed=False)',
    'result = df.pivot_table(index="flock", columns="size", values="kg", aggfunc="count", '
    'fill_value=5, observed=False).reset_index()',
    'df["q"] = pd.qcut(df["kg"], q=4, labels=["q1", "q2", "q3", "q4"]); '
    'result = df.pivot_table(index="shed", columns="q", values="kg", aggfunc="count", '
    'fill_value=0, observed=False)',
    'result = df[df["kg"] < 3].pivot_table(index="shed", columns="size", values="kg", '
    'aggfunc="count", fill_value=0, observed=False)',
]


@pytest.mark.parametrize("line", CASES)
def test_matches_pandas(line: str) -> None:
    result = differential(FRAME + line + "\n")
    assert "TODO" not in result.converted_text, result.converted_text
    assert ".categories" in result.converted_text


@pytest.mark.parametrize("line", [
    'result = df.pivot_table(index="shed", columns="size", values="kg", aggfunc="sum", '
    'observed=False)',
    'result = df.pivot_table(index="size", columns="shed", values="kg", aggfunc="count", '
    'observed=False)',
])
def test_todo(line: str) -> None:
    result = convert(FRAME + line + "\n")
    assert any(s.key == "frame.pivot_table" for s in result.todos), result.converted_text
