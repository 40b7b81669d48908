"""pd.pivot_table(df, ...) (the function form) against pandas (the reference): ported as
df.pivot_table(...), the frame as the first argument or data=, the rest moved one place.
The frame has missing keys and values, a combination no row has, ties and unicode."""

from __future__ import annotations

import pytest

from support import convert, differential

FRAME = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "pier": ["b", "a", None, "b", "a", "c", "Éclair", "c", "b"],
    "boat": ["x", "y", "x", "y", np.nan, "x", "ü", "x", "x"],
    "kg": [1.5, np.nan, 3.0, 4.0, 5.0, np.nan, 2.0, 2.25, 0.1],
    "n": [1, 2, 3, 4, 5, 6, 7, 8, 8],
})
"""

CASES = [
    'result = pd.pivot_table(df, index="pier", columns="boat", values="kg", aggfunc="sum")',
    'result = pd.pivot_table(df, values="n", index="pier", columns="boat", aggfunc="max").reset_index()',
    'result = pd.pivot_table(df, "n", "pier", "boat", "count", fill_value=0)',
    'result = pd.pivot_table(data=df, index="boat", columns="pier", values="kg").reset_index()',
    'result = pd.pivot_table(df[df["n"] > 2], index="pier", columns="boat", values="n", aggfunc="sum", fill_value=0)',
]


@pytest.mark.parametrize("line", CASES)
def test_matches_pandas(line: str) -> None:
    result = differential(FRAME + line + "\n")
    assert "TODO" not in result.converted_text, result.converted_text


def test_margins_of_float_sums_match_pandas() -> None:
    result = differential(FRAME + 'result = pd.pivot_table(df, index="pier", columns="boat", '
                          'values="kg", aggfunc="sum", margins=True)\n')
    assert "pandas_pivot_margins" in result.converted_text


def test_margins_of_a_median_stay_todo() -> None:
    result = convert(FRAME + 'result = pd.pivot_table(df, index="pier", columns="boat", '
                     'values="kg", aggfunc="median", margins=True)\n')
    assert any(s.key == "pd.pivot_table" for s in result.todos), result.converted_text
