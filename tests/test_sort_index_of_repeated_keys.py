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

import numpy as np

from support import differential

_rng = np.random.default_rng(3)
_N = 60
HEAD = f"""
import pandas as pd
import numpy as np
log = pd.DataFrame({{"day": {[None if i == 7 else f"2025-03-0{d}" for i, d in enumerate(_rng.integers(1, 6, _N))]!r},
                    "tray": {_rng.integers(0, 4, _N).tolist()!r},
                    "weight": {[None if w != w else float(w) for w in _rng.choice([0.5, 1.25, np.nan, 2.0], _N)]!r},
                    "ok": {[bool(b) for b in _rng.choice([True, False], _N)]!r},
                    "lot": {[f"L{i:02d}" for i in range(_N)]!r}}})
log["day"] = pd.to_datetime(log["day"])
log["weight"] = log["weight"].astype(float)
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
    assert not [s for s in result.sites if s.status == "todo"], result.converted_text



def test_labels_made_by_set_index_after_drop_duplicates_may_repeat() -> None:
    # drop_duplicates leaves distinct row labels, but set_index labels the rows by another
    # column, whose values repeat: pandas refuses to reindex them ("cannot reindex on an axis
    # with duplicate labels"), so porter must not port the reindex as labels of distinct values
    from support import convert_source, run
    source = ('import pandas as pd\n'
              'log = pd.DataFrame({"lot": ["L1", "L2", "L2", "L3"], "tray": [1, 1, 1, 2], '
              '"weight": [0.5, 1.25, 1.25, 2.0]})\n'
              'result = log.drop_duplicates("lot")[["tray", "weight"]].set_index("tray")'
              '.reindex([0, 1, 2, 3], fill_value=0).reset_index()\n')
    with pytest.raises(ValueError, match="duplicate labels"):
        run(source)
    result = convert_source(source)
    assert [s for s in result.sites if s.key == "frame.reindex" and s.status == "todo"], \
        result.converted_text
