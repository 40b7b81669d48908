"""df.round({"kg": 1, "price": 2}): each float column named rounded to its own decimals, half
to even as pandas rounds; other columns, names that are no column, whole numbers and text are
left as pandas leaves them.

pandas is the reference implementation: every check runs the snippet with pandas and its
conversion with Polars and compares the frames, and the CSV text both write.
"""

from __future__ import annotations

from pathlib import Path

import pytest

from rule_checks import check_todo
from support import differential, same_text

# Halves (0.125, 2.5, -0.5, 2.675 which is below its half in binary), NaN, negative values,
# a text column with None, whole numbers.
FRAME = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "a": [0.125, 2.5, np.nan, -1.005, 3.14159, 0.375],
    "e": [2.675, 0.5, 1.5, -0.5, np.nan, 1e-9],
    "n": [1, 2, 3, 4, 5, -6],
    "s": ["x", "y", None, "ž", "w", "x"],
})
"""

ROUNDS = [
    pytest.param('df.round({"a": 2, "e": 0})', id="two float columns, own decimals"),
    pytest.param('df.round({"a": 1, "n": 2, "s": 1, "zz": 3})', id="ints, text and absent names left"),
    pytest.param('df.round({"e": 2})', id="one column, the others as they are"),
    pytest.param("df.round({})", id="nothing to round"),
    pytest.param('df.groupby("s")[["a", "n"]].mean().round({"a": 1, "n": 0}).reset_index()',
                 id="means of a groupby, the key left alone"),
]


@pytest.mark.parametrize("expr", ROUNDS)
def test_round_by_column_matches_pandas(expr: str, tmp_path: Path) -> None:
    result = differential(FRAME + f"result = {expr}\n")
    assert "TODO(porter)" not in result.converted_text
    same_text(FRAME + f'{expr}.to_csv("out.csv", index=False)\n', tmp_path)


def test_negative_decimals_by_column_stay_pandas() -> None:
    check_todo(FRAME + 'r = df.round({"a": -1})\n', "frame.round")
