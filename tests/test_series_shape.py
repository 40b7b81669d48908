"""s.shape is (len(s),) and s.shape[0] the Series' length: a column's rows (after a filter
too), a groupby result's groups (a keeper's busiest days).

pandas is the reference: each check runs the snippet with pandas and its conversion with
Polars and compares.
"""

from __future__ import annotations

import pytest

from support import converted_text, differential

WATCHES = """
    import numpy as np
    import pandas as pd
    w = pd.DataFrame({
        "keeper": ["K02", "k01", "K03", "k01", None, "K02", "Ørn", "K03"],
        "day": ["mon", "tue", "tue", "wed", "wed", "wed", "", "thu"],
        "hours": [4.0, 8.0, np.nan, 12.0, 6.0, 8.0, 0.0, 6.0],
    })
"""


@pytest.mark.parametrize("expr", [
    'w["hours"].shape',
    'w["hours"].shape[0]',
    'w[w["hours"] > 5]["keeper"].shape[0]',
    'w.groupby("day").size().shape[0]',
    'w.groupby("keeper")["hours"].sum().shape',
    'w["hours"].dropna().shape[-1]',
    'w[w["hours"] > 100]["hours"].shape',
])
def test_series_shape(expr: str) -> None:
    result = differential(WATCHES + f"    result = {expr}\n")
    assert "TODO(porter): series.shape" not in result.converted_text


def test_series_shape_in_a_printed_line() -> None:
    text = converted_text(WATCHES + """
    busy = w.groupby("day").size()
    print(f"days covered {busy.shape[0]}")
    """)
    assert "TODO" not in text
