"""pd.pivot_table(...) that porter keeps on pandas (a TODO: margins=True, or a frame already
handed over) is labelled by the values of its index keys. It came back to Polars through
pl.from_pandas(...).lazy(), which drops the row labels: the pivot lost its key column (a wool
mill's kilos per fibre and shift came back without the fibres). It now stays a pandas frame."""

from __future__ import annotations

import pytest

from support import differential

FRAME = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "fibre": ["merino", "jacob", None, "merino", "jacob", "alpaca", "shetland é", "alpaca", "merino"],
    "shift": ["Early", "Late", "Early", "Late", np.nan, "Early", "Late", "Early", "Early"],
    "kg": [1.5, np.nan, 3.0, 4.0, 5.0, np.nan, 2.0, 2.25, 0.1],
    "n": [1, 2, 3, 4, 5, 6, 7, 8, 8],
})
"""

CASES = [
    # kept on pandas for margins=
    'result = pd.pivot_table(df, index="fibre", columns="shift", values="kg", aggfunc="sum", '
    'margins=True)',
    'pt = pd.pivot_table(df, index="fibre", columns="shift", values="n", aggfunc="max", '
    'margins=True)\nresult = pt.reset_index()',
    # a frame handed over to pandas before the pivot (a draw by numpy's RandomState stays
    # on pandas; its labels read by position)
    'd = df.sample(n=6, random_state=np.random.RandomState(3))\nd["kg2"] = d["kg"] * 2\n'
    'result = pd.pivot_table(d, values="kg2", index="fibre", columns="shift", aggfunc=np.sum, '
    'fill_value=0)',
]


@pytest.mark.parametrize("line", CASES)
def test_keys_of_a_pivot_kept_on_pandas(line: str) -> None:
    result = differential(FRAME + line + "\n")
    assert "pl.from_pandas(\n        pd.pivot_table" not in result.converted_text
