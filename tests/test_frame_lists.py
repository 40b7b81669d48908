"""Lists filled with frames by append and stacked by pd.concat (porter/analysis/frame_lists.py):
the list holds LazyFrames and pl.concat stacks them, as long as everything the script does with
the list is append and concat.

pandas is the reference: each check runs the script with pandas and its conversion and compares
the frames (or the printed text and the files written).
"""

from __future__ import annotations

import pytest

from support import converted_text, differential, same_text

FRAME = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "boat": ["Ålesund", "Kvarøy", None, "Kvarøy", "Ålesund", "Tind"],
    "kg": [1.5, np.nan, 4.0, 4.0, 0.5, 2.25],
    "month": [1, 2, 2, 3, 1, 3],
})
"""


@pytest.mark.parametrize("body", [
    # one filter per loop value, stacked with fresh labels
    'parts = []\nfor m in [3, 1]:\n    parts.append(df[df["month"] == m])\n'
    'result = pd.concat(parts, ignore_index=True)',
    # frames of different columns: aligned by name, a missing column missing
    'parts = []\nparts.append(df[["boat", "kg"]])\nparts.append(df[["month", "boat"]])\n'
    'result = pd.concat(parts, ignore_index=True)',
    # a loop that adds nothing for some values, and a computed column
    'parts = []\nfor m in [1, 2, 9]:\n    part = df[df["month"] == m]\n'
    '    if len(part) > 1:\n        parts.append(part.assign(total=part["kg"].sum()))\n'
    'result = pd.concat(parts, ignore_index=True)',
])
def test_appended_frames_are_stacked_as_pandas_stacks_them(body: str) -> None:
    result = differential(FRAME + body + "\n")
    assert "pl.concat(" in result.converted_text and "TODO" not in result.converted_text
    assert "to_pandas" not in result.converted_text  # the frames never go to pandas


def test_the_list_used_otherwise_stays_with_pandas() -> None:
    # the list is read (len, a subscript): pandas objects in it, as before
    text = converted_text(FRAME + 'parts = []\nfor m in [1, 2]:\n    parts.append(df[df.month == m])\n'
                          'print(len(parts))\nresult = pd.concat(parts)\n')
    assert "pl.concat(parts" not in text


def test_without_ignore_index_the_pieces_keep_their_labels_in_pandas() -> None:
    # pandas keeps each filtered piece's row labels (1, 4, 0, ...): the list stays pandas'
    result = differential(FRAME + 'parts = []\nfor m in [3, 1]:\n    parts.append(df[df.month == m])\n'
                          'stacked = pd.concat(parts)\nresult = stacked.index.tolist()\n')
    assert "pl.concat(parts" not in result.converted_text


def test_a_frame_changed_in_place_after_it_is_appended() -> None:
    # pandas' list holds the same object, which the later assignment changes too
    result = differential(FRAME + 'parts = []\npart = df[df["month"] == 1]\nparts.append(part)\n'
                          'part["kg"] = 0.0\nresult = pd.concat(parts, ignore_index=True)\n')
    assert "pl.concat(parts" not in result.converted_text


CSV = """\
boat,kg,month
Ålesund,1.5,1
Kvarøy,,2
,4.0,2
Kvarøy,4,3
"""


def test_files_written_from_the_stack(tmp_path) -> None:
    source = """\
        import pandas as pd
        df = pd.read_csv("landings.csv")
        parts = []
        for m in sorted(df["month"].unique()):
            month = df[df["month"] == m]
            parts.append(month.groupby("boat", as_index=False)["kg"].sum().assign(month=m))
        out = pd.concat(parts, ignore_index=True)
        out.to_csv("by_month.csv", index=False)
        print(len(out))
    """
    result = same_text(source, tmp_path, {"landings.csv": CSV})
    assert "pl.concat(parts" in result.converted_text
