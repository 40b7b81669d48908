"""s.mode() (porter/rules/groupby.py, series_mode) and s[i] on labels 0..n-1
(porter/rules/selection.py, series_getitem).

pandas is the reference: each check runs the snippet both ways and compares.
"""

from __future__ import annotations

import pytest

from support import differential

FRAME = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "crate": ["Äpfel", None, "pears", "Äpfel", "pears", "figs", None],
    "kg": [1.5, np.nan, 2.0, 1.5, 2.0, 0.5, np.nan],
    "n": [3, 1, 3, 1, 2, 2, 5],
    "ok": [True, False, True, True, False, False, True],
})
"""


@pytest.mark.parametrize("expr", [
    'df["crate"].mode().tolist()',  # a tie: both, sorted
    'df["crate"].mode()[0]',
    'df["kg"].mode().iloc[-1]',
    'df["n"].mode().tolist()',
    'df["ok"].mode()[0]',
    'df[df["n"] > 100]["kg"].mode().tolist()',  # no values: empty
    'df["crate"].fillna(df["crate"].mode()[0]).tolist()',
    'df["n"][3]',
])
def test_mode_and_label_reads_match_pandas(expr: str) -> None:
    result = differential(FRAME + f"result = {expr}\n")
    assert "TODO" not in result.converted_text


def test_a_label_after_a_filter_stays_a_todo() -> None:
    # after a filter pandas' labels are the original row numbers: s[2] is not the third value
    result = differential(FRAME + 'kept = df[df["n"] > 1]["kg"]\nresult = kept[2]\n')
    assert "TODO(porter)" in result.converted_text  # pandas makes it, for its labels
