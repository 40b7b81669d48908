"""numpy's reductions of a Series (porter/rules/groupby.py, numpy_reduction): numpy calls the
Series' own method, so they are ported as s.sum(), s.mean(), ..., with ddof=0 for np.std and
np.var as numpy passes it.

pandas (with numpy) is the reference: each check runs the snippet both ways and compares.
"""

from __future__ import annotations

import pytest

from support import converted_text, differential

FRAME = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "kg": [1.5, np.nan, None, 4.0, 4.0, 0.5],
    "n": [1, 2, 3, 4, 5, 6],
    "crate": ["A", None, "B", "A", "É", "ü"],
})
"""


@pytest.mark.parametrize("expr", [
    'np.sum(df["kg"])', 'np.sum(df["n"])', 'np.nansum(df["kg"])',
    'np.mean(df["kg"])', 'np.nanmean(df["n"])',
    'np.max(df["kg"])', 'np.amin(df["n"])', 'np.nanmax(df["kg"])',
    'np.std(df["kg"])', 'np.var(df["n"])',  # ddof=0, not pandas' 1
    'np.sum(df.loc[df["crate"] == "A", "kg"])',
    'np.mean(df[df["n"] > 100]["kg"])',  # no values: NaN
    'np.max(df[df["n"] > 100]["n"])',  # no integers: NaN
    'round(np.mean(df["kg"]) * 2, 3)',
])
def test_numpy_reduction_of_a_series_matches_pandas(expr: str) -> None:
    result = differential(FRAME + f"result = {expr}\n")
    assert "TODO" not in result.converted_text and "to_pandas" not in result.converted_text


@pytest.mark.parametrize("expr", [
    'np.sum(df["kg"], dtype="float32")',  # numpy's own options
    'np.sum(df[["kg", "n"]])',  # a frame
])
def test_other_forms_stay_todos(expr: str) -> None:
    assert "# TODO(porter)" in converted_text(FRAME + f"result = {expr}\n")
