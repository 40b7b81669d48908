"""s.map("{:.1f} kg".format) / s.apply("{:,.2f}".format): Python's str.format on each value, as
pandas calls it on each (a missing value reaches it as NaN: "nan"; na_action="ignore" leaves it
missing). Rounding at a tie (2.675 -> "2.67"), -0.0, inf and thousands separators are Python's
own. An int column stays a TODO (pandas passes floats where a value is missing). pandas is the
reference.

The data: an invented seed bank's packet weights and labels (NaN, -0.0, inf, a large weight,
accented and empty labels)."""

from __future__ import annotations

import pytest

from support import convert_source, differential

HEAD = """
import pandas as pd
import numpy as np
df = pd.DataFrame({
    "grams": [1.25, np.nan, 40.04, -0.0, 1e6, 0.05, 2.675, float("inf")],
    "packets": [1, 2, 3, 4, 5, 6, 7, 8],
    "label": ["a", None, "b", "c", "d", "é", "a", ""],
})
"""


@pytest.mark.parametrize("step", [
    'df["l"] = df["grams"].map("{:.1f} g".format)',
    'df["l"] = df["grams"].apply("{:,.2f}".format)',
    'df["l"] = df["grams"].map("{:.2f}".format, na_action="ignore")',
    'df["l"] = df["label"].map("<{}>".format)',
    'df["l"] = df["label"].map("{:>4}|".format, na_action="ignore")',
])
def test_str_format_of_each_value_is_pythons(step):
    result = differential(HEAD + step + "\nresult = df\n")
    assert "TODO(porter)" not in result.converted_text, result.converted_text


def test_str_format_of_an_int_column_stays_a_todo():
    result = convert_source(HEAD + 'df["l"] = df["packets"].map("{} packets".format)\n')
    site = next(s for s in result.sites if s.key == "series.map")
    assert site.status == "todo" and "int column" in site.message, site
