"""s.round(-1) / s.round(-2): numpy's rounding to tens or hundreds (the value over 10**n rounded
half to even, times 10**n): 150 -> 200, 250 -> 200, -49 -> -0.0, an int column stays int. A
frame's round(-2) (pandas rounds its int columns too) and a column of unknown type stay TODOs.
pandas is the reference.

The data: an invented lake ferry's rain gauges and passenger counts (halves, negatives, NaN, a
large value)."""

from __future__ import annotations

import pytest

from support import convert_source, differential

HEAD = """
import pandas as pd
import numpy as np
df = pd.DataFrame({
    "rain": [149.9, 150.0, 250.0, -50.0, -49.0, 351.2, np.nan, 1e20, 0.5, 5.0, 15.0],
    "pax": [149, 150, 250, -50, 351, 0, 5, 15, 25, 35, 1049],
})
"""


@pytest.mark.parametrize("step", [
    'df["r"] = df["rain"].round(-2)',
    'df["r"] = df["rain"].round(-1)',
    'df["r"] = df["pax"].round(-2)',
    'df["r"] = df["pax"].round(decimals=-1)',
    'df["r"] = df["rain"].clip(0, 400).round(-2)',
    'df["r"] = (df["pax"] * 3).round(-3)',
])
def test_rounding_to_tens_and_hundreds_is_numpys(step):
    result = differential(HEAD + step + "\nresult = df\n")
    assert "TODO(porter)" not in result.converted_text, result.converted_text


def test_a_frames_round_to_hundreds_stays_a_todo():
    result = convert_source(HEAD + "result = df.round(-2)\n")
    assert any(s.key == "frame.round" and s.status == "todo" for s in result.sites)
