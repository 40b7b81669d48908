"""A Series whose values depend on other rows (a rank, a running sum, a shift, the distance
from the mean), then filtered, cut to its first rows, sorted or read by label: pandas keeps
the values it computed over all rows. A conversion that re-evaluates the expression on the
rows left computes other numbers (a rank among the rows kept). pandas (the reference) runs
each script; the conversion runs with Polars on the same file; printed text and written files
must be the same."""

from __future__ import annotations

from pathlib import Path

import pytest

from support import same_text

# a pottery kiln's firings: ties, blanks, a negative, unsorted
FIRINGS = """\
kiln,pieces,hours,cracked
A,12,9.5,1
B,3,,0
A,40,11.0,4
C,7,8.25,0
B,3,7.5,2
A,-1,10.0,
C,25,12.5,3
B,18,6.0,1
"""


@pytest.mark.parametrize("lines", [
    'r = firings["pieces"].rank()\nprint(r[r > 4].tolist())',
    'c = firings["pieces"].cumsum()\nprint(c[c > 30].tolist(), c.head(3).tolist())',
    'c = firings["pieces"].cumsum()\nprint(c.nlargest(2).tolist(), c.nsmallest(3).tolist())',
    'print(firings["hours"].shift().dropna().tolist())',
    'd = firings["hours"] - firings["hours"].mean()\nprint(d[firings["pieces"] > 5].round(3).tolist())',
    'print(firings["pieces"].rank(pct=True)[firings["kiln"] == "A"].tolist())',
    'print(firings["hours"].diff().tail(3).tolist())',
    'top = firings["pieces"].rank(method="dense")\ntop = top[firings["cracked"] > 0]\nprint(top.tolist())',
    'by = firings.groupby("kiln")["hours"].sum().rank()\nprint(by["B"], by.loc["A"])',
    'c = firings["pieces"].cumsum()\nprint(c.sort_values().tolist(), c.sort_values().head(2).tolist())',
    's = firings["hours"].shift(-1)\nprint(s.sort_values(ascending=False).tolist())',
    'c = firings["pieces"].cumsum()\nprint(c.sort_index(ascending=False).tolist())',
])
def test_values_computed_over_all_rows_are_kept(tmp_path: Path, lines: str) -> None:
    text = same_text(f'''\
import pandas as pd
firings = pd.read_csv("firings.csv")
{lines}
''', tmp_path, {"firings.csv": FIRINGS}).converted_text
    assert "TODO(porter)" not in text, text


@pytest.mark.parametrize("lines", [
    'print(firings["pieces"][firings["pieces"] > 5].tolist())',
    'print((firings["pieces"] * 2)[firings["hours"] > 8].tolist())',
])
def test_values_of_their_own_row_are_read_after_the_filter(tmp_path: Path, lines: str) -> None:
    # a column computed from its own row needs no column of its own first
    text = same_text(f'''\
import pandas as pd
firings = pd.read_csv("firings.csv")
{lines}
''', tmp_path, {"firings.csv": FIRINGS}).converted_text
    assert "_porter_value" not in text, text
