"""s.astype("category").cat.codes and the codes of pd.cut's labels: each value's position among
pandas' categories (the distinct texts sorted by code point; cut's labels in order), -1 where it
is missing. pandas is the reference. pandas' codes are int8; porter's Int64 (0.95, same values).

The data: an invented ferry line's sailings (a missing vessel, an empty name, accented and
capitalised names that sort apart)."""

from __future__ import annotations

import pytest

from support import convert_source, differential

HEAD = """
import pandas as pd
import numpy as np
df = pd.DataFrame({
    "vessel": ["Sula", "kestrel", None, "Éider", "", "Sula", "Puffin", "éider"],
    "pax": [12.0, np.nan, 3.5, 40.0, 0.0, 7.25, 18.0, 2.0],
})
"""


@pytest.mark.parametrize("step", [
    'df["code"] = df["vessel"].astype("category").cat.codes\nresult = df',
    'result = df.assign(code=df["vessel"].astype("category").cat.codes + 1)',
    'df["band"] = pd.cut(df["pax"], [0, 5, 20, 50], labels=["few", "some", "many"])\n'
    'df["code"] = df["band"].cat.codes\nresult = df',
    'small = df[df["pax"] < 20].copy()\nsmall["code"] = small["vessel"].astype("category").cat.codes\n'
    'result = small',
])
def test_codes_are_pandas_codes(step):
    result = differential(HEAD + step + "\n")
    assert "TODO(porter)" not in result.converted_text, result.converted_text
    site = next(s for s in result.sites if s.key == "series.cat.codes")
    assert site.confidence == 0.95 and "int8" in site.message


def test_codes_of_a_category_made_before_a_filter_stay_a_todo():
    # pandas keeps the categories of every row: the codes count the rows the filter left out
    result = convert_source(HEAD + 'df["c"] = df["vessel"].astype("category")\n'
                            'small = df[df["pax"] > 5]\nresult = small["c"].cat.codes\n')
    assert any(s.key == "series.cat.codes" and s.status == "todo" for s in result.sites)
