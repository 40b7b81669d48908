"""df.join(s, on="k") where s is a named Series a groupby made (labelled by its keys): each
row of df gets the value of its key's label, as pandas joins the Series as a one-column frame.

pandas is the reference implementation: every check runs the snippet with pandas and its
conversion with Polars and compares the frames (rows, order, values, types).
"""

from __future__ import annotations

import pytest

from support import differential

# A missing key, keys no group has after a filter, mixed case and unicode keys, NaN values,
# an int key column beside the text one.
FRAME = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "k": ["a", "B", "a", None, "b", "a", "Öl", "B"],
    "g": [1, 2, 1, 2, 1, 1, 3, 2],
    "x": [1.5, np.nan, 2.5, -0.5, 2.5, 0.0, 4.0, -1.0],
    "i": [5, -7, 0, 3, -2, 10, 1, 4],
})
"""

JOINS = [
    pytest.param('s = df.groupby("k")["x"].sum().rename("tot")\nresult = df.join(s, on="k")',
                 id="sum joined back, a missing key finds nothing"),
    pytest.param('s = df.groupby("k")["i"].max().rename("top")\nresult = df.join(s, on="k", how="inner")',
                 id="inner drops the row without a key"),
    pytest.param('s = df.groupby("k")["i"].sum().rename("tot")\nresult = df[df["x"] > 0].join(s, on="k")',
                 id="joined to a filtered frame"),
    pytest.param('s = df.groupby("k")["i"].sum().rename("tot")\ns = s[s > 0]\nresult = df.join(s, on="k")',
                 id="a filtered Series: ints made float where a key finds nothing"),
    pytest.param('s = df.groupby(["k", "g"])["x"].mean().rename("avg")\nresult = df.join(s, on=["k", "g"])',
                 id="two keys"),
    pytest.param('s = df.groupby("k").size().rename("n")\nresult = df.join(s, on="k")', id="group sizes"),
    pytest.param('result = df.join(df.groupby("g")["x"].count().rename("c"), on="g")', id="int key"),
]


@pytest.mark.parametrize("snippet", JOINS)
def test_join_of_a_group_series_matches_pandas(snippet: str) -> None:
    result = differential(FRAME + snippet + "\n")
    assert "TODO(porter)" not in result.converted_text


def test_a_series_named_like_a_column_stays_a_todo() -> None:
    # pandas needs rsuffix= there: kept on pandas, and the script runs
    result = differential(FRAME + 's = df.groupby("k")["i"].sum()\nresult = df.join(s, on="k", rsuffix="_t")\n')
    assert "# TODO(porter): frame.join" in result.converted_text
