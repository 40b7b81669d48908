"""A frame a filter or drop_duplicates left with its original row labels, which the script
hands to pandas later (pieces of it concatenated in a loop), carries them as a column "index".
groupby(...).first() / sum() / max() / agg(func) over "every other column" aggregated that
column too: pandas never aggregates the index, and an orchestra's first loan per member came
back with an "index" column of old row numbers (pandas: none, labels 0..n-1 after
reset_index)."""

from __future__ import annotations

import pytest

from support import same_text

LOANS = """\
member,n,v
M02,3,1.5
M01,1,
,4,3.0
M02,1,4.0
Mø,5,5.0
M01,9,
Mø,2,2.0
M02,6,2.25
M01,5,0.1
M02,3,1.5
"""

SCRIPT = """\
import pandas as pd
d = pd.read_csv("loans.csv")
d = d.drop_duplicates()
d = d[d["n"] > 1]
pieces = []
for m in ["M01", "M02"]:
    part = d[d["member"] == m][["member", "v"]].copy()
    part["tag"] = m
    pieces.append(part)
counted = len(pieces)  # the list read otherwise than by concat: its frames go to pandas
both = pd.concat(pieces, ignore_index=True)
"""

CASES = [
    "result = d.groupby('member').first().reset_index()",
    "result = d.groupby('member').first()",
    "result = d.groupby('member').sum().reset_index()",
    "result = d.groupby('member').max()",
    "result = d.groupby('member', as_index=False).last()",
    "result = d.groupby('member').agg('min').reset_index()",
    "result = d.groupby('member').agg(lambda s: s.max() - s.min()).reset_index()",
]


@pytest.mark.parametrize("line", CASES)
def test_the_labels_are_not_aggregated(line: str, tmp_path) -> None:
    result = same_text(SCRIPT + line + "\nresult.to_csv('out.csv')\nprint(result.shape)\n",
                       tmp_path, {"loans.csv": LOANS})
    assert 'with_row_index("index")' in result.converted_text, result.converted_text

