"""Series.describe() of a number column against pandas (the reference): count, mean, std,
min, quartiles and max, as a Series labelled by the statistics. The frames hold NaN and
None, a column of only missing values, one value (std NaN), ties, and no rows at all."""

from __future__ import annotations

import pytest

from support import convert, differential

FRAME = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "pier": ["b", "a", None, "b", "a", "c", "Éclair", "c", "b"],
    "kg": [1.5, np.nan, 3.0, 4.0, 5.0, np.nan, 2.0, 0.1, 0.1],
    "n": [1, 2, 3, 4, 5, 6, 7, 8, 8],
    "gone": [np.nan, None, np.nan, np.nan, None, np.nan, np.nan, np.nan, np.nan],
    "edge": [np.inf, -0.0, 2.5, np.nan, -np.inf, 0.0, 1e-300, 7.0, -0.0],
})
"""

CASES = [
    'result = df["kg"].describe().reset_index()',
    'result = df["n"].describe()',
    'result = df.loc[df["pier"] == "a", "kg"].describe().reset_index()',
    'result = df.loc[df["pier"] == "Éclair", "n"].describe().reset_index()',
    'result = df["gone"].describe().reset_index()',
    'result = df[df["n"] > 99]["kg"].describe().reset_index()',
    'result = (df["kg"] * 3).describe().reset_index()',
    'd = df["n"].describe(); result = d.reset_index()',
    # infinities and signed zeros around the quartiles (numpy reads inf * 0 as NaN)
    'result = df["edge"].describe().reset_index()',
    'result = df.loc[df["edge"] <= 0, "edge"].describe().reset_index()',
    'result = df.loc[df["edge"] < 3, "edge"].describe().reset_index()',
]


@pytest.mark.parametrize("line", CASES)
def test_matches_pandas(line: str) -> None:
    result = differential(FRAME + line + "\n")
    assert "TODO" not in result.converted_text, result.converted_text


@pytest.mark.parametrize("line", [
    'result = df["pier"].describe()',  # text: count, unique, top, freq
    'result = df["kg"].describe(percentiles=[0.1, 0.9])',
])
def test_todo(line: str) -> None:
    result = convert(FRAME + line + "\n")
    assert any(s.key == "series.describe" for s in result.todos), result.converted_text
