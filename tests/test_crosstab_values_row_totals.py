"""A crosstab of values (values=, aggfunc=) is a table of float cells: filled, rounded, then
summed along its rows (sum(axis=1)) as pandas does, and a value read at a label computed when
the script runs (t.at[t.index[0], "c"]), checked against pandas (the reference implementation).

The data is an invented hill farm's fleece tally: a shearer with no AA fleece (a missing
cell), a fleece not weighed (a missing value), a blank grade, an accented name, halves.
"""

from __future__ import annotations

import pytest

from support import convert, differential

HEAD = '''
import numpy as np
import pandas as pd
tally = pd.DataFrame({
    "shearer": ["Owain", "Zoë", "Owain", "Iolo", "Zoë", "Iolo", "Owain", None, "Iolo"],
    "grade": ["A", "B", "AA", "A", "A", None, "B", "A", "B"],
    "kg": [2.5, 3.25, np.nan, 1.75, 2.125, 3.0, 1.5, 2.0, np.nan],
})
'''


@pytest.mark.parametrize("body", [
    'kg = pd.crosstab(tally["shearer"], tally["grade"], values=tally["kg"], aggfunc="sum")\n'
    'kg = kg.fillna(0).round(1)\nkg["clip"] = kg.sum(axis=1)\nresult = kg.reset_index()',
    'kg = pd.crosstab(tally["shearer"], tally["grade"], values=tally["kg"], aggfunc="mean")\n'
    'kg["total"] = kg.sum(axis=1)\nresult = kg.reset_index()',
    'kg = pd.crosstab(tally["shearer"], tally["grade"], values=tally["kg"], aggfunc="max")\n'
    'kg = kg.fillna(-1)\nresult = kg.sum(axis=1).rename("t").reset_index()',
    'kg = pd.crosstab(tally["shearer"], tally["grade"], values=tally["kg"], aggfunc="sum")\n'
    'kg = kg.fillna(0)\nkg["clip"] = kg.sum(axis=1)\nkg = kg.sort_values("clip", ascending=False)\n'
    'top = kg.index[0]\nresult = kg.at[top, "clip"]',
])
def test_crosstab_of_values_summed_by_row_matches_pandas(body: str) -> None:
    result = differential(HEAD + body + "\n")
    assert not result.todos, result.converted_text


def test_a_label_read_from_the_index_picks_the_value() -> None:
    body = ('per = tally.groupby("shearer")[["kg"]].sum()\nfirst = per.index[1]\n'
            'result = per.at[first, "kg"]\n')
    result = differential(HEAD + body)
    assert not result.todos, result.converted_text
