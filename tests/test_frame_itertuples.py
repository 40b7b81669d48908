"""for row in df.itertuples(): the named tuples pandas makes (the row label first, pandas' own
values: an int column with a missing value as floats, nan for a missing value), from the frame
handed over once where the loop starts. What the loop computes must be pandas'. pandas is the
reference.

The data: an invented orchard's picking rows (a missing variety, NaN, a count with a gap,
accents)."""

from __future__ import annotations

import pytest

from support import convert_source, run

HEAD = """
import pandas as pd
import numpy as np
y = pd.DataFrame({"variety": ["Cox", "Bramley", None, "Égremont", "Cox"],
                  "kg": [1.5, np.nan, 3.0, 0.25, 2.0],
                  "crates": [1, 2, 3, 4, 5]})
y["tier"] = y["variety"].map({"Cox": 1, "Bramley": 2})
"""


@pytest.mark.parametrize("step", [
    'best = {}\nfor row in y.itertuples():\n'
    '    if isinstance(row.variety, str):\n'
    '        best[row.variety] = max(best.get(row.variety, 0), row.kg)\nresult = sorted(best.items())',
    'result = [(r.Index, r.crates, r.tier) for r in y.itertuples()]',
    'result = [tuple(r) for r in y.itertuples(index=False, name="Pick")]',
    'kept = y[y["crates"] > 2]\nresult = [r.Index for r in kept.itertuples()]\n'
    'top = kept.loc[kept.groupby("variety")["kg"].idxmax(), ["variety"]]',
    'g = y.groupby("variety").agg(kg=("kg", "sum"))\nresult = [(r.Index, r.kg) for r in g.itertuples()]',
])
def test_the_rows_are_pandas_own(step):
    source = HEAD + step + "\n"
    converted = convert_source(source)
    assert "TODO(porter)" not in converted.converted_text, converted.converted_text
    expected, actual = run(source)["result"], run(converted.converted_text)["result"]
    assert repr(expected) == repr(actual), (expected, actual)


def test_labels_porter_lost_stay_a_todo():
    result = convert_source(HEAD + 'for r in y.sort_values("kg").itertuples():\n    print(r.Index)\n')
    assert any(s.key == "frame.itertuples" and s.status == "todo" for s in result.sites)
