"""Each group's n largest (or smallest) values, `s.groupby(level=k, group_keys=False).nlargest(n)`,
checked against pandas (the reference implementation).

pandas runs Series.nlargest on each group and puts the groups one after another in key order:
ties in the Series' own order (keep="first"), missing and NaN values after the numbers where
a group has fewer than n of them, rows of a missing key left out. The data is an invented seed swap library's packets per branch and
variety.
"""

from __future__ import annotations

import pytest

from support import differential

HEAD = '''
import numpy as np
import pandas as pd
moves = pd.DataFrame({
    "branch": ["Mühlbach", "Harbour", "Mühlbach", None, "Harbour", "Hillside", "Mühlbach", "Harbour", "Ébène"],
    "variety": ["Borlotto", "Red Kuri", "Cœur", "Borlotto", "Borlotto", "Red Kuri", "Red Kuri", "Zinnia", "Cœur"],
    "packets": [3.0, 5.0, 3.0, 9.0, np.nan, 2.0, 1.0, 5.0, 0.0],
    "whole": [3, 5, 3, 9, 4, 2, 1, 5, 0],
})
moves["ratio"] = moves["packets"] / moves["whole"].where(moves["whole"] != 1, 0)
per = moves.groupby(["branch", "variety"])["packets"].sum()
'''

CASES = {
    "ties in the Series' order": (
        'result = per.groupby(level="branch", group_keys=False).nlargest(2).reset_index()'),
    "level by position, one per group": (
        'result = per.groupby(level=0, group_keys=False).nlargest(1).reset_index()'),
    "whole numbers, nsmallest": (
        'w = moves.groupby(["variety", "branch"])["whole"].sum()\n'
        'result = w.groupby(level="variety", group_keys=False).nsmallest(1).reset_index()'),
    "a missing key kept by the first groupby": (
        'w = moves.groupby(["branch", "variety"], dropna=False)["whole"].sum()\n'
        'result = w.groupby(level="branch", group_keys=False).nlargest(1).reset_index()'),
    "NaN after the numbers, inf first": (
        'w = moves.groupby(["branch", "variety"])["ratio"].max()\n'
        'result = w.groupby(level="branch", group_keys=False).nlargest(2).reset_index()'),
    "missing values filling a group, nsmallest": (
        'w = moves.groupby(["branch", "variety"])["ratio"].max()\n'
        'result = w.groupby(level="branch", group_keys=False).nsmallest(3).reset_index()'),
    "then sort_index by two levels": (
        'top = per.groupby(level="branch", group_keys=False).nlargest(2)\n'
        'top = top.sort_index(level=["branch", "variety"], ascending=[True, False])\n'
        'result = top.reset_index()'),
}


@pytest.mark.parametrize("source", list(CASES.values()), ids=list(CASES))
def test_group_nlargest_matches_pandas(source: str) -> None:
    result = differential(HEAD + source + "\n")
    assert not [s for s in result.sites if s.status in ("todo", "handover")], result.converted_text


@pytest.mark.parametrize("source", [
    'result = per.groupby(level="branch").nlargest(2).reset_index(level=0, drop=True).reset_index()',
    'result = per.groupby(level="branch", group_keys=False).nlargest(1, keep="last").reset_index()',
])
def test_other_forms_are_todos_that_run(source: str) -> None:
    result = differential(HEAD + source + "\n")
    assert [s for s in result.sites if s.status == "todo"]
