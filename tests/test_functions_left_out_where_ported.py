"""A function of the script that porter ported everywhere it is applied (a rolling window's
apply, here) is left out of the conversion, with a note, so that its numpy or pandas import can
go too; its comments and the note stay at the level where the function was, never inside the
function that follows it.

pandas (the reference) runs the script; the conversion runs with Polars; both write the same
text.
"""

from __future__ import annotations

from pathlib import Path

from support import same_text

STAKES = """\
stake,read_on,exposed_cm
A1,2024-07-01,120.0
A1,2024-07-02,
A1,2024-07-03,131.5
A1,2024-07-04,150.0
B2,2024-07-01,80.0
B2,2024-07-03,82.5
B2,2024-07-05,
"""

SCRIPT = '''\
import numpy as np
import pandas as pd

JUMP_CM = 10.0


def jump_from_median(window):
    # distance of the newest reading from the median of the window
    return abs(window[-1] - np.nanmedian(window))


def load(path):
    readings = pd.read_csv(path)
    return readings.sort_values(["stake", "read_on"]).reset_index(drop=True)


readings = load("stakes.csv")
readings["jump"] = readings["exposed_cm"].rolling(3, min_periods=2).apply(jump_from_median, raw=True)
readings["suspicious"] = readings["jump"] > JUMP_CM
readings.to_csv("out.csv", index=False)
'''


def test_a_window_function_ported_where_applied_is_left_out_at_its_own_level(tmp_path: Path) -> None:
    text = same_text(SCRIPT, tmp_path, {"stakes.csv": STAKES}).converted_text
    assert "TODO(porter)" not in text, text
    assert "def jump_from_median" not in text and "import numpy" not in text, text
    note = text.index("# porter: jump_from_median(window), a function of each window")
    assert text.index("# distance of the newest reading") > note
    # the note and the function's comment come before `def load`, at the top level
    assert note < text.index("def load(path):"), text
    assert "\n    # porter: jump_from_median" not in text, text
