"""m.stack() of a table unstack made on an integer key (months, years), rounded or not: the
cells row by row, the key's integers back as the labels (Polars named the columns by their
text). It was a TODO. pandas is the reference.

The data: an invented weather station network's readings (a missing station, NaN, a month
one station lacks)."""

from __future__ import annotations

import pytest

from support import differential

HEAD = """
import pandas as pd
import numpy as np
df = pd.DataFrame({"st": ["K", "K", "M", None, "T", "K", "M", "T"],
                   "month": [1, 2, 1, 2, 3, 3, 3, 1],
                   "temp": [1.5, np.nan, 3.0, 4.0, -0.5, 2.25, 7.0, 1.0]})
"""


@pytest.mark.parametrize("step", [
    'm = df.groupby(["st", "month"])["temp"].mean().unstack().round(2)\n'
    'result = m.stack().reset_index(name="t")',
    'm = df.groupby(["st", "month"])["temp"].mean().unstack()\n'
    'result = m.stack().reset_index(name="t")',
    'm = df.groupby(["month", "st"])["temp"].sum().unstack()\n'
    'result = m.stack().reset_index(name="t")',
])
def test_a_pivot_on_integers_stacks_as_pandas(step):
    result = differential(HEAD + step + "\n")
    assert "TODO(porter)" not in result.converted_text, result.converted_text
