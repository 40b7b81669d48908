"""sort_index: on a frame still labelled 0..n-1 it changes nothing (or reverses), on a table
labelled by one key of distinct values (a groupby's, df.sum()'s) it sorts by the key, a
missing key last. pandas (the reference) runs each script; the conversion runs with Polars on
the same file; printed text and written files must be the same."""

from __future__ import annotations

from pathlib import Path

import pytest

from support import same_text

# a lighthouse keeper's stores: a blank store, accented and mixed-case names, ties
STORES = """\
store,item,qty,kg
Öl,wick,3,0.2
oil,lamp,1,2.5
Öl,wick,3,
,rope,7,4.0
Brot,,2,0.5
oil,wick,1,0.2
"""


@pytest.mark.parametrize("lines", [
    'out = stores.sort_index()',
    'out = stores.sort_index(ascending=False)',
    'out = stores.groupby("store")[["qty", "kg"]].sum().sort_index(ascending=False).reset_index()',
    'out = stores.groupby("item")["kg"].max().sort_index(ascending=False).reset_index()',
    'out = stores[["qty", "kg"]].sum().sort_index().reset_index()',
])
def test_sorted_labels_are_pandas_own(tmp_path: Path, lines: str) -> None:
    text = same_text(f'''\
import pandas as pd
stores = pd.read_csv("stores.csv")
{lines}
out.to_csv("out.csv", index=False)
''', tmp_path, {"stores.csv": STORES}).converted_text
    assert "TODO(porter)" not in text, text


def test_original_row_numbers_stay_a_todo(tmp_path: Path) -> None:
    text = same_text('''\
import pandas as pd
stores = pd.read_csv("stores.csv")
out = stores.sort_values("qty", kind="stable").sort_index()
out.to_csv("out.csv", index=False)
''', tmp_path, {"stores.csv": STORES}).converted_text
    assert "TODO(porter)" in text, text
