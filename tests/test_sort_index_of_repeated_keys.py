"""sort_index() of labels that may repeat (set_index("day") of a column of dates, numbers or
True/False), and of value counts (labels of distinct values). pandas sorts one key with numpy's
quicksort (nargsort), which leaves rows of one label in an order of its own; porter places the
rows as numpy's argsort does (pandas_sort_values). pandas is the reference implementation: each
case runs both and compares, row order included.

The data: an invented seed bank's sowing log, with tied days, ties among many rows (where
quicksort's order shows), a missing day and a missing count.
"""

from __future__ import annotations

import pytest

from support import differential

HEAD = """
import pandas as pd
import numpy as np
rng = np.random.default_rng(3)
n = 60
log = pd.DataFrame({"day": pd.to_datetime("2025-03-01") + pd.to_timedelta(rng.integers(0, 5, n), unit="D"),
                    "tray": rng.integers(0, 4, n),
                    "weight": rng.choice([0.5, 1.25, np.nan, 2.0], n),
                    "ok": rng.choice([True, False], n),
                    "lot": [f"L{i:02d}" for i in range(n)]})
log.loc[7, "day"] = pd.NaT
"""

CASES = {
    "dates": 'result = log.set_index("day").sort_index().reset_index()',
    "dates descending": 'result = log.set_index("day").sort_index(ascending=False).reset_index()',
    "whole numbers": 'result = log.set_index("tray").sort_index().reset_index()',
    "floats with NaN": 'result = log.set_index("weight").sort_index().reset_index()',
    "True/False": 'result = log.set_index("ok").sort_index().reset_index()',
    "a column of the sorted frame": 'result = log.set_index("tray").sort_index()["lot"].reset_index()',
    "value counts of text": 'result = log["lot"].str[:2].value_counts().sort_index().reset_index()',
    "value counts of numbers, descending": 'result = log["tray"].value_counts().sort_index(ascending=False).reset_index()',
    "value counts of bands (pd.cut)": 'log["band"] = pd.cut(log["weight"], [0, 1, 3], labels=["light", "heavy"])\n'
                                      'result = log["band"].value_counts().sort_index().reset_index()',
}


@pytest.mark.parametrize("step", list(CASES.values()), ids=list(CASES))
def test_sort_index_as_pandas_orders_the_rows(step: str) -> None:
    result = differential(HEAD + step + "\n")
    assert not [s for s in result.sites if s.key.endswith("sort_index") and s.status == "todo"], \
        result.converted_text
