"""df.groupby(keys)["col"].apply(f) where f reduces the group's Series to one value: pandas
calls f on each group's Series, as agg(f) does, so it is the same aggregation (pandas is the
reference; the frame has missing keys, missing values, ties, a one-row group and unicode)."""

from __future__ import annotations

import pytest

from rule_checks import check_todo
from support import differential

FRAME = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "hut": ["Hochalm", "Zirbe", None, "Hochalm", "Zirbe", "Éiger", "Hochalm", "Zirbe", "Zirbe"],
    "beds": [4.0, 2.0, 7.0, np.nan, 9.0, 3.0, 4.0, -1.5, 6.0],
    "n": [1, 5, 3, 8, 2, 2, 7, 7, 0],
})
"""


@pytest.mark.parametrize("body", [
    'result = df.groupby("hut")["beds"].apply(lambda s: s.max() - s.min())',
    'result = df.groupby("hut")["n"].apply(lambda s: s.max() - s.min())',
    'result = df.groupby("hut")["n"].apply(lambda s: (s > 2).sum())',
    'result = df.groupby("hut")["beds"].apply(lambda s: s.nunique())',
    'result = df.groupby("hut", sort=False)["n"].apply(lambda v: v.sum() * 2)',
    'result = df.groupby("hut")["beds"].apply(func=lambda s: s.count())',
    'def spread(s):\n    return s.max() - s.min()\nresult = df.groupby("hut")["n"].apply(spread)',
])
def test_reduction_of_the_selected_column_matches_pandas(body: str) -> None:
    result = differential(FRAME + body + "\n")
    assert "TODO(porter)" not in result.converted_text, result.converted_text


@pytest.mark.parametrize("body", [
    # a Series per group (pandas stacks them under the keys)
    'result = df.groupby("hut")["n"].apply(lambda s: s.cumsum())',
    # pandas decays the old weight across missing values with adjust=False, Polars otherwise
    'result = df.groupby("hut")["beds"].apply(lambda s: s.ewm(span=3, adjust=False).mean().iloc[-1])',
])
def test_other_functions_stay_todos(body: str) -> None:
    check_todo(FRAME + body + "\n", "groupby.apply")
