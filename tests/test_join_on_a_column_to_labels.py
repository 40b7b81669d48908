"""df.join(other, on="k") of a table labelled by its key (set_index, read_csv(index_col=), a
groupby's result): each row's value of the column matched to the other table's labels, the
left's rows in their order with their own labels, a label repeated there repeating the row, a
missing value matching a missing label, ints made float where a row found none. It was a TODO.
pandas is the reference.

The data: an invented orchard's picking rows against the plots' soil (a missing plot, a plot
listed twice, accented names, a plot no row names)."""

from __future__ import annotations

import pytest

from support import convert_source, differential

HEAD = """
import pandas as pd
import numpy as np
rows = pd.DataFrame({"plot": ["a", "b", None, "c", "a", "é"], "kg": [1, 2, 3, 4, 5, 6],
                     "brix": [0.5, np.nan, 1.5, 2.0, 3.0, 4.0]})
soil = pd.DataFrame({"plot": ["a", "b", "a", None, "é", "z"], "ha": [7, 8, 9, 6, 5, 1],
                     "kind": ["clay", "loam", None, "sand", "ß", "clay"]})
"""


@pytest.mark.parametrize("step", [
    'result = rows.join(soil.set_index("plot"), on="plot")',
    'result = rows.join(soil.set_index("plot"), on="plot", how="inner")',
    'result = rows.join(soil.drop_duplicates("plot").set_index("plot"), on="plot")\n'
    'result["t"] = result["ha"] * 2',
    'g = soil.groupby("plot").agg(total=("ha", "sum"))\n'
    'result = rows.join(g, on="plot").reset_index()',
    'f = rows[rows["kg"] > 1]\nresult = f.join(soil.set_index("plot"), on="plot").reset_index()',
])
def test_a_column_joined_to_labels_as_pandas_joins_it(step):
    result = differential(HEAD + step + "\n")
    assert "TODO(porter)" not in result.converted_text, result.converted_text


@pytest.mark.parametrize("step", [
    'result = rows.join(soil.set_index("plot"), on="plot", how="outer")',
    'result = rows.join(soil.set_index("plot"), on="kg")',  # text labels, int column
    'result = rows.join(soil.set_index("plot"), on="plot", rsuffix="_r")',
])
def test_other_joins_on_a_column_stay_todos(step):
    result = convert_source(HEAD + step + "\n")
    assert any(s.key == "frame.join" and s.status == "todo" for s in result.sites)
