"""DataFrame.select_dtypes: pandas picks columns by the dtype it holds them in (pandas 3.1:
"number" picks durations too, "object" picks its str columns and dates of s.dt.date). pandas
(the reference) runs each script; the conversion runs with Polars on the same file; printed
text and written files must be the same."""

from __future__ import annotations

from pathlib import Path

import pytest

from support import same_text

# a ferry line's crossings: a time, text with blanks and accents, whole numbers, floats with a
# blank, True/False without one
CROSSINGS = """\
sailed,route,cars,fare,late,captain
2024-03-01 07:15,Nordkai–Südhafen,12,4.5,True,Åsa
2024-03-01 09:40,Nordkai–Südhafen,7,,False,
2024-03-02 07:15,Inselweg,0,3.25,False,Bo
2024-03-02 11:05,,31,5.0,True,Åsa
"""


@pytest.mark.parametrize("selection", [
    'include="number"',
    'include=["number"]',
    "include=np.number",
    'exclude="number"',
    'include=["object", "datetime"]',
    'include="str"',
    'include="datetime64"',
    'include=["timedelta", "number"]',
    'include="number", exclude="timedelta"',
    'include="category"',
])
def test_columns_picked_by_type_are_pandas_own(tmp_path: Path, selection: str) -> None:
    text = same_text(f'''\
import numpy as np
import pandas as pd
crossings = pd.read_csv("crossings.csv", parse_dates=["sailed"])
crossings["day"] = crossings["sailed"].dt.date
crossings["wait"] = crossings["sailed"] - crossings["sailed"].min()
crossings["kind"] = crossings["route"].astype("category")
picked = crossings.drop(columns=["late"]).select_dtypes({selection})
print(list(picked.columns))
picked.to_csv("picked.csv", index=False)
''', tmp_path, {"crossings.csv": CROSSINGS}).converted_text
    assert "TODO(porter): frame.select_dtypes" not in text, text


@pytest.mark.parametrize("selection", [
    'include="int"',      # pandas: float64 once a value is missing
    'include="float"',
    'include="bool"',     # pandas: object once a value is missing
    'include="object"',   # beside a True/False column
])
def test_types_pandas_decides_from_the_values_stay_todos(tmp_path: Path, selection: str) -> None:
    text = same_text(f'''\
import pandas as pd
crossings = pd.read_csv("crossings.csv")
picked = crossings.select_dtypes({selection})
print(list(picked.columns))
''', tmp_path, {"crossings.csv": CROSSINGS}).converted_text
    assert "TODO(porter): frame.select_dtypes" in text, text
