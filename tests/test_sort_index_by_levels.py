"""`sort_index(level=..., ascending=[...])` of labels of several keys (a MultiIndex), checked
against pandas (the reference implementation).

With ascending a list, pandas sorts by the levels named only, each its own way, with a stable
lexsort (the other levels stay in their order); with one True/False, by the levels named and
then the others (sort_remaining=True), all that way. A missing key is last either way. The data is an invented mountain hostel network's bed-nights per hostel and dorm.
"""

from __future__ import annotations

import pytest

from support import differential

HEAD = '''
import numpy as np
import pandas as pd
stays = pd.DataFrame({
    "hostel": ["Grauhorn", "Col du Lac", "Écrins", "Grauhorn", "Col du Lac", "Bergsee", "Écrins", "Grauhorn"],
    "dorm": ["B", "A", "A", "A", "C", "B", "B", "C"],
    "night": [3, 1, 2, 1, 3, 2, 1, 2],
    "guests": [4.0, 2.0, np.nan, 6.0, 1.0, 3.0, 8.0, 2.0],
})
per = stays.groupby(["hostel", "dorm"])["guests"].sum()
'''

CASES = {
    "two levels, two ways": (
        'result = per.sort_index(level=["hostel", "dorm"], ascending=[True, False]).reset_index()'),
    "one level descending, the other ascending after it": (
        'result = per.sort_index(level="dorm", ascending=False).reset_index()'),
    "positions": 'result = per.sort_index(level=[1, 0], ascending=[False, True]).reset_index()',
    "a frame, three keys, sort_remaining=False": (
        't = stays.groupby(["hostel", "dorm", "night"])[["guests"]].sum()\n'
        'result = t.sort_index(level=["night"], ascending=[False], sort_remaining=False).reset_index()'),
    "a frame, three keys, the rest ascending": (
        't = stays.groupby(["hostel", "dorm", "night"])[["guests"]].sum()\n'
        'result = t.sort_index(level=["dorm", "night"], ascending=[False, True]).reset_index()'),
    "the other level left in its order": (
        'result = per.sort_index(level=["dorm"], ascending=[False]).reset_index()'),
    "missing keys, set_index": (
        'm = stays.assign(hostel=stays["hostel"].where(stays["night"] != 2))\n'
        'result = m.set_index(["hostel", "dorm"]).sort_index(level=["hostel"], ascending=[False]).reset_index()'),
    "missing keys, set_index, one way for all": (
        'm = stays.assign(hostel=stays["hostel"].where(stays["night"] != 2))\n'
        'result = m.set_index(["dorm", "hostel"]).sort_index(level="dorm", ascending=False).reset_index()'),
    "one key named by level": (
        'result = stays.groupby("hostel")["guests"].sum().sort_index(level="hostel", ascending=False).reset_index()'),
}


@pytest.mark.parametrize("source", list(CASES.values()), ids=list(CASES))
def test_sort_by_levels_matches_pandas(source: str) -> None:
    result = differential(HEAD + source + "\n")
    assert not [s for s in result.sites if s.status in ("todo", "handover")], result.converted_text


@pytest.mark.parametrize("source", [
    'result = stays.set_index(["hostel", "dorm"]).sort_index(level="dorm", ascending=False).reset_index()',
    'result = stays.groupby(["hostel", "dorm"], dropna=False)["guests"].sum().sort_index(level="dorm", ascending=False).reset_index()',
])
def test_other_level_sorts_run(source: str) -> None:
    differential(HEAD + source + "\n")


SWAPPED = {
    "swaplevel then sort_index": 'result = per.swaplevel().sort_index().reset_index()',
    "swaplevel alone keeps the rows' order": 'result = per.swaplevel().reset_index()',
    "three levels by name, then xs": (
        't = stays.groupby(["hostel", "dorm", "night"])["guests"].sum()\n'
        'result = t.swaplevel("hostel", "night").sort_index().xs(1, level="night").reset_index()'),
    "by position, then a level sorted descending": (
        'result = per.swaplevel(0, 1).sort_index(level="dorm", ascending=False).reset_index()'),
}


@pytest.mark.parametrize("source", list(SWAPPED.values()), ids=list(SWAPPED))
def test_swaplevel_matches_pandas(source: str) -> None:
    result = differential(HEAD + source + "\n")
    assert not [s for s in result.sites if s.status in ("todo", "handover")], result.converted_text
