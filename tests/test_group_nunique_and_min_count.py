"""Group nunique(dropna=False) and group sum(min_count=k), against pandas (the reference).

pandas' nunique(dropna=False) counts a missing value (NaN or None, in a float or a text
column) as one value; sum(min_count=k) is missing in a group with fewer than k values that
are not missing (NaN included). The frame has None and NaN keys, a group whose values are
all missing (c), one with a single value, ties and unicode.
"""

from __future__ import annotations

import pytest

from support import differential

FRAME = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "shop": ["b", "a", None, "b", "a", "c", np.nan, "Éclair", "c", "b", "a"],
    "qty": [1.5, np.nan, 3.0, 1.5, 5.25, np.nan, 2.0, 2.0, None, np.nan, 0.1],
    "n": [1, 2, 3, 4, 5, 6, 7, 8, 8, 1, 2],
    "t": ["x", None, "z", np.nan, "y", None, "w", "ünï", np.nan, "x", "y"],
})
"""

NUNIQUE = [
    'result = df.groupby("shop")["qty"].nunique(dropna=False)',
    'result = df.groupby("shop")["t"].nunique(dropna=False)',
    'result = df.groupby("shop", as_index=False)[["qty", "t", "n"]].nunique(dropna=False)',
    'result = df.groupby("shop", dropna=False)["t"].nunique(dropna=False).reset_index()',
    'result = df.groupby("shop", sort=False)["qty"].nunique(dropna=False)',
    'result = df.groupby("shop")["t"].agg("nunique", dropna=False)',
    'result = df.groupby("shop")["t"].nunique(dropna=True)',
]

MIN_COUNT = [
    'result = df.groupby("shop")["qty"].sum(min_count=1)',
    'result = df.groupby("shop")["qty"].sum(min_count=2)',
    'result = df.groupby("shop", as_index=False)[["qty", "n"]].sum(min_count=3)',
    'result = df.groupby("shop")["n"].sum(min_count=2)',
    'result = df.groupby("shop", sort=False)["qty"].sum(min_count=1).reset_index()',
    'result = df.groupby("shop")["qty"].agg("sum", min_count=1)',
    'result = df.groupby("shop")["qty"].sum(min_count=0)',
    'result = df.groupby(["shop", "t"])["qty"].sum(min_count=1)',
]


@pytest.mark.parametrize("line", NUNIQUE + MIN_COUNT)
def test_matches_pandas(line: str) -> None:
    result = differential(FRAME + line + "\n")
    assert "TODO" not in result.converted_text, result.converted_text


def test_nan_made_by_arithmetic_is_not_counted_by_min_count() -> None:
    # 0/0 is NaN in Polars, not a missing value: min_count must not count it
    source = FRAME + ('df["r"] = df["qty"] * 0 / 0\n'
                      'result = df.groupby("shop")["r"].sum(min_count=1)\n')
    differential(source)


def test_min_count_sum_keeps_pandas_float_sum() -> None:
    # the float sum still goes through pandas_group_sums (pandas' last digit)
    result = differential(FRAME + 'result = df.groupby("shop")["qty"].sum(min_count=1)\n')
    assert "pandas_group_sums" in result.converted_text
