"""wide = df.pivot_table(...); wide["total"] = wide.sum(axis=1): the pivot's columns are the
data's values, which porter does not know, but every cell holds numbers, so the row total is a
sum over every column but the index keys (missing cells skipped, as pandas skips NaN). pandas is
the reference implementation: each case runs both and compares.

The data: an invented orchard's picks, with a missing grade, a missing crate count, a picker with
one grade only and an accented name.
"""

from __future__ import annotations

import pytest

from support import differential

HEAD = """
import pandas as pd
import numpy as np
picks = pd.DataFrame({"picker": ["Ines", "Jonah", "Ines", "Mab", "Ådne", "Jonah", "Mab"],
                      "grade": ["A", "B", "B", None, "A", "A", "C"],
                      "crates": [4, 7, 1, 3, 2, 5, 6],
                      "kg": [40.5, np.nan, 9.25, 30.0, 21.0, 50.5, 61.0]})
"""

CASES = {
    "sum of whole numbers, filled": 'wide = picks.pivot_table(index="picker", columns="grade", values="crates", aggfunc="sum", fill_value=0)',
    "sum of whole numbers, not filled": 'wide = picks.pivot_table(index="picker", columns="grade", values="crates", aggfunc="sum")',
    "sum of floats with NaN": 'wide = picks.pivot_table(index="picker", columns="grade", values="kg", aggfunc="sum")',
    "mean": 'wide = picks.pivot_table(index="picker", columns="grade", values="kg")',
    "count, filled": 'wide = picks.pivot_table(index="picker", columns="grade", values="kg", aggfunc="count", fill_value=0)',
    "max, a float fill": 'wide = picks.pivot_table(index="picker", columns="grade", values="crates", aggfunc="max", fill_value=0.5)',
}


@pytest.mark.parametrize("pivot", list(CASES.values()), ids=list(CASES))
def test_row_totals_of_a_pivot_table(pivot: str) -> None:
    result = differential(HEAD + pivot + '\nwide["total"] = wide.sum(axis=1)\nresult = wide.reset_index()\n')
    assert not [s for s in result.sites if s.status == "todo"], result.converted_text
