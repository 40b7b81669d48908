"""Statements written on one line with semicolons convert as they do on lines of their own.

Reference: pandas 3.1 itself (tests/support.differential). `keyed = df.set_index("k");
keyed["c"] = ...` had its second statement handed to pandas onto a LazyFrame (the change on the
same line was not seen as coming after the binding), and the converted script failed.
"""

from __future__ import annotations

import pytest

from support import differential

FRAME = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({"k": ["b", "a", "c", "é"], "v": [2.0, 1.0, np.nan, 4.5], "n": [1, 2, 3, 4]})
"""

LINES = {
    "set_index then a new column": 'keyed = df.set_index("k"); keyed["c"] = keyed["v"] * 2\n'
                                   'result = keyed.reset_index()\n',
    "a filter then a new column": 'big = df[df["n"] > 1].copy(); big["c"] = big["n"] + 1\n'
                                  'result = big\n',
    "three on one line": 'a = df.copy(); a["c"] = a["n"] * 3; a = a.sort_values("c", ascending=False)\n'
                         'result = a.reset_index(drop=True)\n',
}


@pytest.mark.parametrize("source", list(LINES.values()), ids=list(LINES))
def test_statements_on_one_line(source: str) -> None:
    result = differential(FRAME + source)
    assert not result.todos, [s.message for s in result.sites if s.status == "todo"]
