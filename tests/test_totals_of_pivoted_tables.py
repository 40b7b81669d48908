"""Per-column totals of a pivoted table (`grid.sum()`, mean, min, max, count of an unstack or a
crosstab), checked against pandas (the reference implementation).

porter does not know such a table's columns (the values of a key), but knows every cell is a
number of one type: pandas gives a Series labelled by the column names, named after the
columns' name (the key), in the columns' order, floats added with numpy's pairwise sum. The
data is an invented mountain hostel network's bed-nights.
"""

from __future__ import annotations

import pytest

from support import differential

HEAD = '''
import numpy as np
import pandas as pd
stays = pd.DataFrame({
    "night": ["2026-07-03", "2026-07-01", "2026-07-03", "2026-06-30", "2026-07-05", "2026-07-01", None, "2026-07-02"],
    "hostel": ["Grauhorn", "Écrins", "Écrins", "Grauhorn", "Bergsee", "Grauhorn", "Bergsee", "Écrins"],
    "guests": [4, 2, 6, 1, 3, 2, 5, 7],
    "paid": [40.1, np.nan, 60.7, 10.3, 30.5, 20.2, 50.0, 0.1],
})
'''

CASES = {
    "sum of whole numbers": (
        'grid = stays.groupby(["night", "hostel"])["guests"].sum().unstack("hostel", fill_value=0)\n'
        'result = grid.sum().reset_index()'),
    "sum of floats, as pandas adds them": (
        'grid = stays.groupby(["night", "hostel"])["paid"].sum().unstack("hostel")\n'
        'result = grid.sum().rename("paid").reset_index()'),
    "mean, max and min": (
        'grid = stays.groupby(["night", "hostel"])["guests"].sum().unstack("hostel")\n'
        'result = pd.concat([grid.mean().rename("mean"), grid.max().rename("top"), grid.min().rename("low")], axis=1).reset_index()'),
    "count of an unstack with missing cells": (
        'grid = stays.groupby(["night", "hostel"])["paid"].sum().unstack("hostel")\n'
        'result = grid.count().reset_index()'),
    "max of whole numbers made float by a missing combination": (
        'grid = stays.groupby(["night", "hostel"])["guests"].sum().unstack("hostel")\n'
        'result = grid.max().reset_index()'),
    "a label read back": (
        'grid = stays.groupby(["night", "hostel"])["guests"].sum().unstack("hostel", fill_value=0)\n'
        'totals = grid.sum()\n'
        'result = [int(totals["Écrins"]), totals.index.name]'),
}


@pytest.mark.parametrize("source", list(CASES.values()), ids=list(CASES))
def test_totals_of_a_pivoted_table_match_pandas(source: str) -> None:
    result = differential(HEAD + source + "\n")
    assert not [s for s in result.sites if s.status in ("todo", "handover")], result.converted_text


COMPARED = {
    "days above a number": (
        'grid = stays.groupby(["night", "hostel"])["guests"].sum().unstack("hostel", fill_value=0)\n'
        'result = (grid > 2).sum().reset_index()'),
    "missing cells compared: False, True for !=": (
        'grid = stays.groupby(["night", "hostel"])["paid"].sum(min_count=1).unstack("hostel")\n'
        'result = pd.concat([(grid >= 20.2).sum().rename("ge"), (grid != 0.1).sum().rename("ne"), (grid == 40.1).mean().rename("eq")], axis=1).reset_index()'),
}


@pytest.mark.parametrize("source", list(COMPARED.values()), ids=list(COMPARED))
def test_totals_of_a_compared_pivoted_table_match_pandas(source: str) -> None:
    result = differential(HEAD + source + "\n")
    assert not [s for s in result.sites if s.status in ("todo", "handover")], result.converted_text
