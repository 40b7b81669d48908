"""Series.str.cat against pandas (the reference): element-wise with other columns (a missing
value in any input makes the row missing; na_rep fills them first) and joined into one text
(missing values skipped, or written as na_rep; no rows give "")."""

from __future__ import annotations

import pytest

from support import convert, differential

FRAME = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "a": ["x", None, "é", np.nan, "", "ünï", "x"],
    "b": ["1", "2", None, "z", "w", "", None],
    "c": ["p", "q", "r", None, "s", "t", "u"],
    "n": [1, 2, 3, 4, 5, 6, 7],
})
"""

CASES = [
    'df["r"] = df["a"].str.cat(df["b"], sep="-"); result = df',
    'df["r"] = df["a"].str.cat(df["b"]); result = df',
    'df["r"] = df["a"].str.cat(df["b"], sep="-", na_rep="?"); result = df',
    'df["r"] = df["a"].str.cat([df["b"], df["c"]], sep=" / "); result = df',
    'df["r"] = df["a"].str.cat([df["b"], df["c"]], sep="|", na_rep=""); result = df',
    'df["r"] = df["c"].str.cat(df["n"].astype(str), sep="#"); result = df',
    'result = df["a"].str.cat(sep=",")',
    'result = df["a"].str.cat()',
    'result = df["a"].str.cat(sep=", ", na_rep="?")',
    'result = df[df["n"] > 99]["a"].str.cat(sep=",")',
    'result = df[df["n"] == 2]["a"].str.cat(sep=",")',
    'sub = df[df["n"] > 3].copy(); sub["r"] = sub["a"].str.cat(sub["c"], sep=":"); result = sub',
    'df["r"] = df["a"].str.cat(df["b"], sep="-").str.len(); result = df',
]


@pytest.mark.parametrize("line", CASES)
def test_matches_pandas(line: str) -> None:
    result = differential(FRAME + line + "\n")
    assert "TODO" not in result.converted_text, result.converted_text


@pytest.mark.parametrize("line", [
    'result = df["a"].str.cat(df["n"], sep="-")',  # pandas raises on numbers
    'result = df["a"].str.cat(df["b"], join="inner")',
    'result = df["a"].str.cat(["1", "2", "3", "4", "5", "6", "7"])',
    'other = df[df["n"] > 3]; result = df["a"].str.cat(other["b"])',  # aligned on the index
])
def test_todo(line: str) -> None:
    result = convert(FRAME + line + "\n")
    assert any(s.key == "series.str.cat" for s in result.todos), result.converted_text
