"""`df.index.name` and `df.columns.name` read as constants, checked against pandas (the reference
implementation).

porter keeps pandas' row labels in key columns and knows the name pandas gives them (a
set_index's key, a groupby's key, a pivot's index, None for 0..n-1 or a reindex over a date
range) and the name of the columns axis (the key a pivot or unstack laid out as columns, None
after rename_axis(columns=None) or for a frame read from a file). The data is an invented
seed swap library's exchange book.
"""

from __future__ import annotations

import pytest

from support import differential

HEAD = '''
import numpy as np
import pandas as pd
swaps = pd.DataFrame({
    "swap_id": ["X3", "X1", "X2", "X4", "X5", "X6"],
    "branch": ["Harbour", "Mühlbach", "Harbour", None, "Hillside", "Mühlbach"],
    "way": ["given", "taken", "given", "taken", "given", "given"],
    "variety": ["Borlotto", "Cœur de Bœuf", "Borlotto", "Red Kuri", None, "Borlotto"],
    "packets": [2.0, np.nan, 1.0, 3.0, 5.0, 2.0],
})
'''

CASES = {
    "set_index": 'result = [swaps.set_index("swap_id").index.name, swaps.columns.name]',
    "a groupby's key": 'result = swaps.groupby("branch")["packets"].sum().index.name',
    "renamed by rename_axis": (
        'result = swaps.groupby("branch")["packets"].sum().rename_axis("where").index.name'),
    "row numbers": 'result = swaps.index.name',
    "pivot": (
        'p = swaps.pivot(index="swap_id", columns="way", values="variety")\n'
        'result = [p.index.name, p.columns.name]'),
    "pivot_table": (
        'p = swaps.pivot_table(index="branch", columns="way", values="packets", aggfunc="sum")\n'
        'result = [p.index.name, p.columns.name]'),
    "unstack": (
        'u = swaps.groupby(["branch", "way"])["packets"].sum().unstack("way", fill_value=0)\n'
        'result = [u.index.name, u.columns.name]'),
    "unstack then rename_axis(columns=None)": (
        'u = swaps.groupby(["branch", "way"])["packets"].sum().unstack("way", fill_value=0)\n'
        'u = u.rename_axis(columns=None)\n'
        'result = [u.index.name, u.columns.name]'),
    "crosstab": (
        'c = pd.crosstab(swaps["branch"], swaps["way"])\n'
        'result = [c.index.name, c.columns.name]'),
    "after reset_index": (
        'p = swaps.pivot(index="swap_id", columns="way", values="variety").reset_index()\n'
        'result = [p.index.name, p.columns.name]'),
}


@pytest.mark.parametrize("source", list(CASES.values()), ids=list(CASES))
def test_axis_names_match_pandas(source: str) -> None:
    result = differential(HEAD + source + "\n")
    assert not [s for s in result.sites if s.status in ("todo", "handover")], result.converted_text


@pytest.mark.parametrize("source", [
    'result = (swaps["packets"] * 2).name',
    'result = swaps[swaps["packets"] > 1].index.name',
])
def test_other_names_are_todos_that_run(source: str) -> None:
    result = differential(HEAD + source + "\n")
    assert [s for s in result.sites if s.status == "todo"]
