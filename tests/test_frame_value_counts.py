"""DataFrame.value_counts(subset): pandas 3.1 groups the rows without sorting (the
combinations in order of first appearance) and sorts the counts stably, so tied counts keep
that order. pandas (the reference) runs each script; the conversion runs with Polars on the same
file; the frames (reset_index) and the written text must be the same.
"""

from __future__ import annotations

from pathlib import Path

import pytest

from support import same_text

# a snow-plough depot's shift sheets: ties, blanks, accented names, -0.0 beside 0.0
SHEETS = """\
route,area,truck,salt
R2,north,T1,0.0
R1,Öst,T2,-0.0
R2,north,T1,1.5
,south,T3,0.0
R1,Öst,,1.5
R3,north,T1,-0.0
R2,,T2,2.0
R3,north,T1,0.0
R1,Öst,T2,
R2,,T2,2.0
"""


@pytest.mark.parametrize("call", [
    'sheets[["route", "area"]].value_counts()',
    'sheets[["route", "area"]].value_counts(dropna=False)',
    'sheets.value_counts(subset=["route", "truck"], normalize=True)',
    'sheets.value_counts(["area"], ascending=True)',
    'sheets[["route", "salt"]].value_counts(dropna=False, sort=False)',
    'sheets.value_counts(subset="truck")',
])
def test_counts_of_row_combinations_are_pandas_own(tmp_path: Path, call: str) -> None:
    text = same_text(f'''\
import pandas as pd
sheets = pd.read_csv("sheets.csv")
counts = {call}
counts.reset_index().to_csv("counts.csv", index=False)
''', tmp_path, {"sheets.csv": SHEETS}).converted_text
    assert "TODO(porter)" not in text and "to_pandas" not in text, text


def test_a_column_named_count_stays_on_pandas(tmp_path: Path) -> None:
    text = same_text('''\
import pandas as pd
sheets = pd.read_csv("sheets.csv").rename(columns={"truck": "count"})
sheets[["route", "count"]].value_counts().reset_index(name="n").to_csv("counts.csv", index=False)
''', tmp_path, {"sheets.csv": SHEETS}).converted_text
    assert "TODO(porter): frame.value_counts" in text
