"""`table.reindex(pd.date_range(...), fill_value=...)` of a table labelled by one date key (an
unstack by day, a groupby's table), checked against pandas (the reference implementation).

pandas gives one row per timestamp of the range, in its order: a day the table has no row for
gets fill_value in every column, a day the range does not hold is left out, a missing value the
table had stays missing, and the labels lose their name (the range has none). The data is an
invented mountain hostel network's bed-nights.
"""

from __future__ import annotations

import pytest

from support import differential

HEAD = '''
import numpy as np
import pandas as pd
stays = pd.DataFrame({
    "night": ["2026-07-03", "2026-07-01", "2026-07-03", "2026-06-30", "2026-07-05", "2026-07-01", None],
    "hostel": ["Grauhorn", "Écrins", "Écrins", "Grauhorn", "Bergsee", "Grauhorn", "Bergsee"],
    "guests": [4, 2, 6, 1, 3, 2, 5],
    "paid": [40.0, np.nan, 60.0, 10.0, 30.5, 20.0, 50.0],
})
stays["night"] = pd.to_datetime(stays["night"])
season = pd.date_range("2026-07-01", "2026-07-06", freq="D")
'''

CASES = {
    "an unstack by day, whole numbers": (
        'grid = stays.groupby(["night", "hostel"])["guests"].sum().unstack("hostel", fill_value=0)\n'
        'grid = grid.reindex(season, fill_value=0)\n'
        'result = grid.rename_axis("night").reset_index()'),
    "an unstack of floats, a fraction as the fill": (
        'grid = stays.groupby(["night", "hostel"])["paid"].sum().unstack("hostel")\n'
        'result = grid.reindex(season, fill_value=0.5).reset_index()'),
    "a groupby's table of known columns, NaN kept": (
        't = stays.groupby("night")[["guests", "paid"]].max()\n'
        't["paid"] = t["paid"].where(t["guests"] != 6)\n'
        'result = t.reindex(season, fill_value=-1).reset_index()'),
    "the range inline, then a total per column": (
        'grid = stays.groupby(["night", "hostel"])["guests"].sum().unstack("hostel", fill_value=0)\n'
        'grid = grid.reindex(pd.date_range("2026-06-29", "2026-07-04"), fill_value=0)\n'
        'result = grid.sum().reset_index()'),
    "the index name read after rename_axis": (
        'grid = stays.groupby(["night", "hostel"])["guests"].sum().unstack("hostel", fill_value=0)\n'
        'grid = grid.reindex(season, fill_value=0)\n'
        'before = grid.index.name\n'
        'grid = grid.rename_axis("night")\n'
        'result = [before, grid.index.name, grid.columns.name, len(grid)]'),
}


@pytest.mark.parametrize("source", list(CASES.values()), ids=list(CASES))
def test_reindex_over_a_date_range_matches_pandas(source: str) -> None:
    result = differential(HEAD + source + "\n")
    assert not [s for s in result.sites if s.status in ("todo", "handover")], result.converted_text


@pytest.mark.parametrize("source", [
    'result = stays.drop_duplicates("night")[["night", "guests"]].set_index("night").reindex(season, fill_value=0).reset_index()',
    'result = stays.groupby("night")[["guests"]].sum().reindex(season).reset_index()',
])
def test_other_reindexes_are_todos_that_run(source: str) -> None:
    result = differential(HEAD + source + "\n")
    assert [s for s in result.sites if s.status == "todo"]


MELTED_BACK = {
    "melt then pivot back, the date labels written as text": (
        'grid = stays.groupby(["night", "hostel"])["guests"].sum().unstack("hostel", fill_value=0)\n'
        'grid = grid.reindex(season, fill_value=0).rename_axis("night")\n'
        'long = grid.reset_index().melt(id_vars="night", var_name="hostel", value_name="bed_nights")\n'
        'long = long[long["bed_nights"] > 0]\n'
        'back = long.pivot(index="night", columns="hostel", values="bed_nights").fillna(0)\n'
        'back.index = back.index.strftime("%d %b")\n'
        'result = back.rename_axis(index="night", columns=None).reset_index()'),
    "a pivot of floats, its totals": (
        'back = stays.dropna(subset=["night"]).drop_duplicates(["night", "hostel"]).pivot(index="night", columns="hostel", values="paid")\n'
        'result = back.max().reset_index()'),
}


@pytest.mark.parametrize("source", list(MELTED_BACK.values()), ids=list(MELTED_BACK))
def test_pivot_back_matches_pandas(source: str) -> None:
    result = differential(HEAD + source + "\n")
    assert not [s for s in result.sites if s.status in ("todo", "handover")], result.converted_text
