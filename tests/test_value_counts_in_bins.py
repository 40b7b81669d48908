"""Series.value_counts(bins=[edges]) against pandas (the reference), written out and printed
as text: pandas counts pd.cut(values, edges, include_lowest=True), labels each bin with its
Interval ("(0.999, 1.5]": the first edge moved down by pandas' display precision), lists every
bin (an empty one as 0), drops values outside the bins and missing ones, gives no rows when no
value falls in a bin (dropna=True), divides by every value with normalize=True and sorts the
counts stably. Values sit on the edges, just below the first one, outside the bins; NaN,
blanks, ties, unicode names and no rows at all."""

from __future__ import annotations

import pytest

from support import convert, differential, same_text

DATA = """\
pen,kg,n
a,1.0,1
b,0.9995,2
Ä,1.5,3
a,,4
b,2.0,5
c,2.25,6
c,4.0,7
a,4.5,8
b,1.2,9
ü,3.0,10
a,-1.0,0
"""

CASES = [
    'df["kg"].value_counts(bins=[1.0, 1.5, 2.0, 2.5, 3.0, 4.0], sort=False)',
    'df["kg"].value_counts(bins=[1.0, 1.5, 2.0, 2.5, 3.0, 4.0])',
    'df["kg"].value_counts(bins=[1, 2, 3, 5], ascending=True)',
    'df["kg"].value_counts(bins=(1.0, 2.0, 4.0), normalize=True, sort=False)',
    'df["n"].value_counts(bins=[0, 5, 10], sort=False)',
    'df["n"].value_counts(bins=[-3, 0, 2.5, 100])',
    'df["kg"].value_counts(bins=[0.0001, 0.00055, 1.25, 1.3333333], sort=False, dropna=False)',
    'df["kg"].value_counts(bins=[10, 20, 30])',  # no value in any bin: no rows
    'df["kg"].value_counts(bins=[10, 20, 30], dropna=False)',  # every bin, counted 0
    'df[df["n"] > 99]["kg"].value_counts(bins=[1, 2])',  # no rows at all
    'df[df["n"] > 99]["kg"].value_counts(bins=[1, 2], normalize=True, dropna=False)',
    'df.loc[df["pen"] == "a", "kg"].value_counts(bins=[1.0, 1.5, 2.0, 2.5, 3.0, 4.0], sort=False)',
]


@pytest.mark.parametrize("counted", CASES)
def test_written_and_printed_as_pandas(counted: str, tmp_path) -> None:
    result = same_text(f"""
        import pandas as pd
        df = pd.read_csv("t.csv")
        bands = {counted}
        bands.to_csv("bands.csv")
        bands.reset_index().to_csv("flat.csv", index=False)
        print(bands.tolist(), len(bands))
    """, tmp_path, {"t.csv": DATA})
    assert "TODO" not in result.converted_text, result.converted_text
    assert "pandas_category_counts(" in result.converted_text


FRAME = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({"kg": [1.0, np.nan, 2.0, 2.0, 0.5, None, 3.5, 1.75], "n": [1, 2, 3, 4, 5, 6, 7, 8]})
"""


@pytest.mark.parametrize("line", [
    'result = df["kg"].value_counts(bins=[1.0, 2.0, 3.0, 4.0]).tolist()',
    'result = df["kg"].value_counts(bins=[1.0, 2.0, 3.0, 4.0], sort=False).tolist()',
    'result = df["n"].value_counts(bins=[0, 4, 8], normalize=True).tolist()',
    'result = (df["kg"] * 2).value_counts(bins=[1.0, 4.0, 9.0], sort=False).tolist()',
])
def test_counts_match_pandas(line: str) -> None:
    result = differential(FRAME + line + "\n")
    assert "TODO" not in result.converted_text, result.converted_text


@pytest.mark.parametrize("line", [
    'result = df["kg"].value_counts(bins=4)',  # edges from the data
    'result = df["kg"].value_counts(bins=[3.0, 2.0, 1.0])',  # pandas raises
    'df["t"] = df["n"].astype(str); result = df["t"].value_counts(bins=[1, 2])',  # text
])
def test_todo(line: str) -> None:
    result = convert(FRAME + line + "\n")
    assert any(s.key == "series.value_counts" for s in result.todos), result.converted_text
