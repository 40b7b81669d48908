"""s.resample(rule) of a column of a table labelled by its datetime column
(`df.set_index("when")["t"].resample("D").sum()`): resampled as df.resample(rule, on="when")["t"]
is. A Series labelled 0..n-1 stays a TODO (pandas raises TypeError). pandas is the reference.

The data: an invented apiary's weighings (a missing stamp, NaN weights, days without rows)."""

from __future__ import annotations

import pytest

from support import convert_source, differential

HEAD = """
import pandas as pd
import numpy as np
df = pd.DataFrame({
    "when": ["2025-01-01 10:00", "2025-01-01 23:00", "2025-01-02 05:00", "2025-01-09 01:00",
             "2025-01-03 12:00", None],
    "hive": ["H1", "H2", None, "Ħ4", "H1", "H2"],
    "w": [1.5, np.nan, 3.0, 2.0, 0.5, 7.0],
    "t": [10, 11, 12, 13, 14, 15],
})
df["when"] = pd.to_datetime(df["when"])
"""


@pytest.mark.parametrize("step", [
    'result = df.set_index("when")["t"].resample("D").sum()',
    'result = df.set_index("when")["w"].resample("W").agg(["min", "max", "mean"]).round(2)',
    'result = df.set_index("when")["w"].resample("D").mean().reset_index()',
    'x = df.set_index("when")\nresult = x["t"].resample("2D").max()',
    'x = df.sort_values("w").set_index("when")\nresult = x["t"].resample("D").count()',
])
def test_a_column_of_a_table_labelled_by_dates_resamples_as_pandas(step):
    result = differential(HEAD + step + "\n")
    assert "TODO(porter)" not in result.converted_text, result.converted_text
    assert any(s.key == "series.resample" and s.status == "converted" for s in result.sites)


def test_a_series_labelled_by_row_numbers_stays_a_todo():
    result = convert_source(HEAD + 'result = df["t"].resample("D").sum()\n')
    assert any(s.key == "series.resample" and s.status == "todo" for s in result.sites)
