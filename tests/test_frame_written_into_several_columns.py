"""df[["a", "b"]] = <a frame of the same rows>: pandas writes the frame's columns by position
into the named ones (existing ones in place, new ones at the end), the rows aligned on labels,
which are the same rows. Differential against pandas on text with blanks and accents, missing
values, a filtered and sorted frame."""

from __future__ import annotations

import pytest

from support import differential

FRAME = """
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "k": [" Île ", "nord", None, "süd ", "nord"],
    "s": ["a", " b", "c ", None, "É"],
    "n": [3, 1, 4, 1, 5],
    "v": [0.5, np.nan, 2.25, -1.0, 0.0],
})
"""


@pytest.mark.parametrize("body", [
    'df[["k", "s"]] = df[["k", "s"]].map(lambda x: x.strip().upper(), na_action="ignore")',
    'df = df[df["n"] > 1].sort_values("n", kind="stable").reset_index(drop=True)\n'
    'df[["s", "k"]] = df[["k", "s"]].map(lambda x: x.title(), na_action="ignore")',
    'df[["n2", "v2"]] = df[["n", "v"]].map(lambda x: x * 2)',
    'df[["v", "w"]] = df[["n", "v"]].map(lambda x: x + 1)',
])
def test_a_frame_of_the_same_rows_written_into_several_columns(body):
    result = differential(FRAME + body + "\nresult = df\n")
    assert not [s.key for s in result.sites if s.status == "todo"], result.converted_text
    assert 'how="horizontal"' in result.converted_text
