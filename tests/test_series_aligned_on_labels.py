"""A Series of one table set as a column of another, both labelled by the same one key (a
groupby's results on that key): pandas aligns it on the labels, each row getting the value of its
own label, NaN where the Series lacks it, a label only the Series has dropped. porter writes a left
join on the key column. pandas is the reference implementation: each case runs both and compares.

The data: an invented seed-potato co-op's grading boxes and its growers' fields, with a grower who
has no field, a field of a grower who graded nothing, a missing grower, and accented names.
"""

from __future__ import annotations

import pytest

from support import differential

HEAD = """
import pandas as pd
import numpy as np
boxes = pd.DataFrame({"grower": ["Åsa", "Bram", "Åsa", None, "Cai", "Bram", "Dunya"],
                      "kg": [12.5, 8.0, np.nan, 4.0, 5.5, 6.25, 3.0],
                      "box": [1, 2, 3, 4, 5, 6, 7]})
fields = pd.DataFrame({"grower": ["Bram", "Åsa", "Zeno", None, "Åsa", "Cai"],
                       "ha": [2.0, 3.5, 9.0, 1.0, 0.5, np.nan],
                       "plots": [1, 2, 4, 1, 3, 2],
                       "soil": ["clay", "sand", "loam", "peat", "sand", "clay"]})
stats = boxes.groupby("grower").agg(kg=("kg", "sum"), boxes=("box", "count"))
"""

CASES = {
    "floats, a grower without a field": 'stats["ha"] = fields.groupby("grower")["ha"].sum()',
    "ints, a label missing: float64 in pandas": 'stats["plots"] = fields.groupby("grower")["plots"].max()',
    "ints, every label found: int64": 'stats["n"] = boxes.groupby("grower")["box"].max()',
    "text": 'stats["soil"] = fields.groupby("grower")["soil"].first()',
    "an existing column overwritten in its place": 'stats["kg"] = fields.groupby("grower")["ha"].mean()',
    "a Series kept in a name": 'ha = fields.groupby("grower")["ha"].sum()\nstats["ha"] = ha\nstats["per_ha"] = stats["kg"] / stats["ha"]',
    "two in a row": 'stats["ha"] = fields.groupby("grower")["ha"].sum()\nstats["plots"] = fields.groupby("grower")["plots"].sum()',
    "empty Series side": 'stats["ha"] = fields[fields["ha"] > 100].groupby("grower")["ha"].sum()',
}


@pytest.mark.parametrize("step", list(CASES.values()), ids=list(CASES))
def test_a_series_of_another_table_is_aligned_on_the_labels(step: str) -> None:
    result = differential(HEAD + step + "\nresult = stats.reset_index()\n")
    assert not [s for s in result.sites if s.key == "frame.setitem" and s.status == "todo"], \
        result.converted_text


@pytest.mark.parametrize("step", [
    # True/False values become an object column with NaN in pandas
    'stats["big"] = fields.groupby("grower")["ha"].sum() > 1',
    # dropna=False keeps a missing label: the tables are not labelled alike (a TODO, pandas' values)
    'stats = boxes.groupby("grower", dropna=False).agg(kg=("kg", "sum"))\n'
    'stats["ha"] = fields.groupby("grower", dropna=False)["ha"].sum()',
])
def test_what_is_not_aligned_here_stays_pandas(step: str) -> None:
    result = differential(HEAD + step + "\nresult = stats.reset_index()\n")
    assert [s for s in result.sites if s.key == "frame.setitem" and s.status == "todo"], \
        result.converted_text
