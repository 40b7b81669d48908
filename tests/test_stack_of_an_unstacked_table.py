"""stack() of a table unstack made (a groupby on two keys, then unstack): every cell back as a
Series labelled by the row keys and the columns' key, row by row, checked against pandas (the
reference implementation).

The data is an invented community radio station's volunteer rota: a show with no Sunday slot
(a cell unstack fills, or leaves missing), a blank volunteer (a missing key, dropped by the
groupby), hours not signed (missing), an accented show name, shows out of order.
"""

from __future__ import annotations

import pytest

from support import convert, differential

HEAD = '''
import numpy as np
import pandas as pd
rota = pd.DataFrame({
    "show": ["Jazz", "Folk", "Jazz", "Élan", "Folk", None, "Jazz", "Drive", "Élan"],
    "day": ["Sun", "Mon", "Mon", "Sat", "Mon", "Sun", "Sat", "Mon", "Sun"],
    "hours": [2.0, 1.5, np.nan, 3.0, 0.5, 2.0, 1.0, np.nan, 2.5],
})
'''


@pytest.mark.parametrize("body", [
    'wide = rota.groupby(["show", "day"]).size().unstack(fill_value=0)\n'
    'result = wide.stack().rename("slots").reset_index()',
    'wide = rota.groupby(["show", "day"])["hours"].sum().unstack(fill_value=0)\n'
    'result = wide.stack()',
    # no fill_value: the missing cells are stacked too (pandas 3)
    'wide = rota.groupby(["show", "day"])["hours"].max().unstack()\n'
    'result = wide.stack().reset_index(name="top")',
    'per = rota.groupby(["day", "show"]).size().unstack("day", fill_value=0).stack()\n'
    'result = per[per > 0].reset_index()',
    'per = rota.groupby(["show", "day"]).size().unstack(fill_value=0).stack()\n'
    'result = per.xs("Mon", level="day")',
    # a pivot on whole numbers: the labels cast back from Polars' text names
    'rota["n"] = rota["hours"].fillna(0).round().astype(int)\n'
    'wide = rota.groupby(["show", "n"]).size().unstack(fill_value=0)\nresult = wide.stack()',
])
def test_stack_matches_pandas(body: str) -> None:
    result = differential(HEAD + body + "\n")
    assert not result.todos, result.converted_text


@pytest.mark.parametrize("body", [
    # a table changed since the unstack, a pivot on fractions
    'wide = rota.groupby(["show", "day"]).size().unstack(fill_value=0)\n'
    'wide = wide[wide["Mon"] > 0]\nresult = wide.stack()',
    'rota["x"] = rota["hours"].fillna(0) + 0.5\n'
    'wide = rota.groupby(["show", "x"]).size().unstack(fill_value=0)\nresult = wide.stack()',
])
def test_other_stacks_stay_pandas(body: str) -> None:
    # the stack (or, for a key of fractions, whose labels would reach pandas as text, the
    # unstack before it) stays pandas, and computes pandas' values
    keys = [s.key for s in convert(HEAD + body + "\n").todos]
    assert "frame.stack" in keys or "series.unstack" in keys, keys
    differential(HEAD + body + "\n")
