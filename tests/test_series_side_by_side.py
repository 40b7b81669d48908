"""Series labelled by one key, written out with index= or made by a groupby or value_counts, and
put side by side with pd.concat(axis=1), checked against pandas (the reference
implementation).

pandas lines the Series up on their labels: the union of the labels in the order they are first
met (inner: the labels all of them have), a missing label matching a missing one, an int Series
float64 where a label finds no value, the index named only where every Series' index has that
name. The data is an invented mountain railway's fare zones.
"""

from __future__ import annotations

import pytest

from support import differential

HEAD = '''
import numpy as np
import pandas as pd
scans = pd.DataFrame({
    "zone": ["B", "A", "C", "A", None, "B", "É", "A"],
    "fare": [18.0, 32.0, np.nan, 54.0, 18.0, 0.0, 76.0, 32.0],
    "heads": [1, 2, 1, 3, 1, 0, 4, 2],
})
fee = pd.Series([2.5, 4.0, 6.5, 1.0], index=["A", "B", "C", "Z"], name="fee")
seats = pd.Series([120, 80], index=["B", "A"], name="seats")
'''

CASES = {
    "three Series, labels first met in order": (
        'share = scans["zone"].value_counts(normalize=True)\n'
        'fares = scans.groupby("zone")["fare"].mean()\n'
        't = pd.concat([share, fares, fee], axis=1)\nresult = t.rename_axis("zone").reset_index()'),
    "the index named where every Series' index has the name": (
        'a = scans.groupby("zone")["heads"].sum()\nb = scans.groupby("zone")["fare"].max()\n'
        'result = pd.concat([a, b], axis=1).reset_index()'),
    "an int Series with labels it lacks": (
        'heads = scans.groupby("zone")["heads"].sum()\n'
        't = pd.concat([fee, heads, seats], axis=1).reset_index()\n'
        't["text"] = t["heads"].astype(str) + "/" + t["seats"].astype(str)\nresult = t'),
    "inner": (
        'heads = scans.groupby("zone")["heads"].sum()\n'
        'result = pd.concat([heads, fee], axis=1, join="inner").reset_index()'),
    "a missing label kept by the groupby": (
        'a = scans.groupby("zone", dropna=False)["heads"].sum()\n'
        'b = scans.groupby("zone", dropna=False)["fare"].sum()\n'
        'result = pd.concat([b, a], axis=1).reset_index()'),
    "a Series written with index=, read by label and as a frame": (
        'result = [fee["C"], fee.idxmax(), fee.reset_index(), (fee * 2).sum()]'),
}


@pytest.mark.parametrize("source", list(CASES.values()), ids=list(CASES))
def test_series_side_by_side_match_pandas(source: str) -> None:
    result = differential(HEAD + source + "\n")
    assert not [s for s in result.sites if s.status == "todo"], result.converted_text


def test_float_series_are_not_cast_after_the_join() -> None:
    # a proportion is a float: only int Series are made Float64 where a label lacks a value
    result = differential(HEAD + 'share = scans["zone"].value_counts(normalize=True)\n'
                          'result = pd.concat([share, fee], axis=1).reset_index()\n')
    assert "has_nulls" not in result.converted_text.split("result = ", 1)[1]


def test_columns_of_one_frame_side_by_side_are_its_rows() -> None:
    # two columns of the same frame: the same rows under the same labels, a horizontal concat
    result = differential(HEAD + 'result = pd.concat([scans["heads"], scans["fare"]], axis=1)\n')
    assert not [s for s in result.sites if s.status == "todo"], result.converted_text


@pytest.mark.parametrize("source", [
    'result = pd.concat([fee, fee * 2], axis=1)',  # one name twice
    'result = pd.concat([fee, seats], axis=1, sort=True)',
])
def test_other_side_by_side_concats_are_todos_that_run(source: str) -> None:
    result = differential(HEAD + source + "\n")
    assert "pd.concat" in [s.key for s in result.sites if s.status == "todo"], result.converted_text
