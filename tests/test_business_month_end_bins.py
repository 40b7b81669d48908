"""resample("BME") (pandas 1.x: "BM"): bins labelled by each month's last weekday, closed on the
right over the whole label day, so a day after the last weekday (a Saturday the 29th, a time on
it) falls in the next month's bin; empty months between are filled. Differential against
pandas 3.1's BME; tests/test_legacy_spellings_under_pandas_1_5.py checks "BM" under pandas 1.5."""

from __future__ import annotations

import pytest

from support import differential

FRAME = """
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "t": ["2023-04-28 10:00", "2023-04-29 09:00", "2023-04-30 00:00", "2023-03-31 23:59",
          "2023-06-30 00:00", "2023-07-01 00:00", "2023-09-30 12:00", "2023-12-29 00:00",
          "2023-12-30 00:00", None],
    "v": [1.5, np.nan, 2.0, 0.25, 3.0, 1.0, 4.5, 2.5, 1.25, 9.0],
    "k": ["a", "b", "a", "é", "b", "a", None, "a", "b", "a"],
})
df["t"] = pd.to_datetime(df["t"], format="%Y-%m-%d %H:%M")
"""


@pytest.mark.parametrize("body", [
    'result = df.resample("BME", on="t")["v"].sum().reset_index()',
    'result = df.resample("BME", on="t").agg({"v": "mean", "k": "count"}).reset_index()',
    'result = df.set_index("t").resample("BME")[["v"]].max().reset_index()',
    'result = df[df["k"] == "a"].resample("BME", on="t")["v"].count().reset_index()',
])
def test_business_month_end_bins(body):
    result = differential(FRAME + body + "\n")
    assert not [s.key for s in result.sites if s.status == "todo"], result.converted_text
    assert "add_business_days" in result.converted_text
