"""A Series computed on a sorted copy of a frame and set into the frame itself:
`df["run"] = df.sort_values("day").groupby("boat")["kg"].cumsum()`. pandas aligns the Series on
the row labels, which are distinct, so each row gets the value computed for it in the sorted
order. porter numbers the rows (with_row_index), computes the column in the sorted plan and sorts
the rows back by their number. pandas is the reference implementation: each case runs both and
compares.

The data: an invented harbour's landings, with tied days, a missing boat, a missing weight, NaN,
an accented name and a frame filtered before the sort (labels no longer 0..n-1).
"""

from __future__ import annotations

import pytest

from support import convert_source, differential, run

HEAD = """
import pandas as pd
import numpy as np
df = pd.DataFrame({"boat": ["Skarv", "Ærling", "Skarv", None, "Ærling", "Skarv", "Tern", "Tern"],
                   "day": ["2025-03-04", "2025-03-01", "2025-03-02", "2025-03-01",
                           "2025-03-01", "2025-03-04", "2025-03-03", None],
                   "kg": [12.5, 8.0, np.nan, 4.0, 5.5, 6.25, 3.0, 7.5],
                   "crates": [3, 2, 5, 1, 4, 2, 2, 6],
                   "lot": [8, 3, 6, 1, 7, 2, 5, 4]})
df["day"] = pd.to_datetime(df["day"])
"""

CASES = {
    "a running sum in groups": 'df["run"] = df.sort_values("day").groupby("boat")["kg"].cumsum()',
    "a running sum of ints, a key missing: float64 in pandas":
        'df["run"] = df.sort_values("lot").groupby("boat")["crates"].cumsum()',
    "a shift in groups, sorted by two keys":
        'df["prev"] = df.sort_values(["boat", "lot"]).groupby("boat")["kg"].shift()',
    "a diff of the sorted column": 'df["step"] = df.sort_values("lot")["crates"].diff()',
    "descending": 'df["step"] = df.sort_values("lot", ascending=False)["kg"].diff()',
    "the column itself, back in its place": 'df["kg2"] = df.sort_values("kg")["kg"]',
    "an existing column overwritten": 'df["kg"] = df.sort_values("lot")["kg"].ffill()',
    "a comparison (True/False)": 'df["up"] = df.sort_values("lot")["kg"].diff() > 0',
    "after a filter": 'df = df[df["crates"] > 1]\n'
                      'df["run"] = df.sort_values("lot").groupby("boat")["crates"].cumsum()',
    "after drop_duplicates and dropna": 'df = df.dropna(subset=["boat"]).drop_duplicates("lot")\n'
                                        'df["run"] = df.sort_values("lot")["kg"].cumsum()',
    "a transform with a rolling mean": 'df["avg"] = df.sort_values("lot").groupby("boat")["kg"]'
                                       '.transform(lambda s: s.rolling(2, min_periods=1).mean())',
    "two in a row": 'df["run"] = df.sort_values("lot")["kg"].cumsum()\n'
                    'df["rank"] = df.sort_values("lot")["crates"].cumsum()',
}


@pytest.mark.parametrize("step", list(CASES.values()), ids=list(CASES))
def test_a_series_of_the_sorted_frame_is_set_row_by_row(step: str) -> None:
    result = differential(HEAD + step + "\nresult = df\n")
    assert not [s for s in result.sites if s.status == "todo"], result.converted_text
    assert "_porter_place" in result.converted_text


@pytest.mark.parametrize("step", [
    # some rows only: pandas leaves NaN where the Series has no label
    'df["top"] = df.sort_values("lot").head(3)["kg"]',
    # a sort of another frame with the same rows: pandas sorts it (a TODO), so the Series
    # keeps its labels; handed over sorted, it was numbered 0..n-1 and set by position
    'other = df.copy()\ndf["run"] = other.sort_values("lot")["kg"].cumsum()',
    # the sorted frame in a name of its own
    'srt = df.sort_values("lot")\ndf["run"] = srt["kg"].cumsum()\nprint(srt.head(2))',
])
def test_what_is_not_set_back_row_by_row_stays_as_pandas_computes_it(step: str) -> None:
    result = differential(HEAD + step + "\nresult = df\n")
    assert "_porter_place" not in result.converted_text


def test_repeated_labels_are_not_set_back_row_by_row() -> None:
    # pandas raises "cannot reindex on an axis with duplicate labels": the rows of a concat
    # share labels, so they are not numbered and set back by place
    step = 'df = pd.concat([df, df])\ndf["run"] = df.sort_values("lot")["kg"].cumsum()\nresult = df\n'
    with pytest.raises(ValueError, match="duplicate labels"):
        run(HEAD + step)
    assert "_porter_place" not in convert_source(HEAD + step).converted_text
