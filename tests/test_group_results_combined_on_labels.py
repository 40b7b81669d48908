"""Arithmetic between two groupby results of different frames on the same one key
(`healthy.groupby("k").size() / df.groupby("k").size()`): pandas aligns the two Series on their
labels, the union of the keys in sorted order (a missing key last), NaN where one side lacks a
label, and an int Series becomes float64 then (int64 when every label is on both sides). porter
writes a full join on the key, sorted by it. pandas is the reference implementation: each case
runs both and compares.

The data: an invented hill-farm co-op's shearing tallies, with a shed that has no fleeces over
the weight, a missing shed, a duplicated tally and accented shed names.
"""

from __future__ import annotations

import pytest

from support import differential

HEAD = """
import pandas as pd
import numpy as np
tally = pd.DataFrame({"shed": ["Øyvik", "Brae", "Øyvik", None, "Cairn", "Brae", "Dun", "Brae", "Cairn"],
                      "kg": [3.5, 2.0, np.nan, 4.0, 5.5, 2.25, 3.0, 2.0, 0.5],
                      "fleeces": [12, 8, 3, 4, 5, 6, 7, 8, 0]})
heavy = tally[tally["kg"] >= 3]
"""

CASES = {
    "share of sizes, a label on one side only": 'result = (heavy.groupby("shed").size() / tally.groupby("shed").size()).fillna(0).round(3)',
    "sizes added: float64 where a label is missing": 'result = heavy.groupby("shed").size() + tally.groupby("shed").size()',
    "sizes added, every label on both sides: int64": 'result = tally[tally["fleeces"] >= 0].groupby("shed").size() + tally.groupby("shed").size()',
    "float sums subtracted": 'result = tally.groupby("shed")["kg"].sum() - heavy.groupby("shed")["kg"].sum()',
    "int sums multiplied": 'result = heavy.groupby("shed")["fleeces"].sum() * tally.groupby("shed")["fleeces"].max()',
    "a zero divisor": 'result = heavy.groupby("shed")["fleeces"].sum() / tally.groupby("shed")["fleeces"].min()',
    "named, renamed and reset": 'share = heavy.groupby("shed")["kg"].mean() / tally.groupby("shed")["kg"].mean()\nresult = share.rename("ratio").reset_index()',
    "one side without rows": 'result = tally[tally["kg"] > 100].groupby("shed")["kg"].sum() / tally.groupby("shed")["kg"].sum()',
    "same rows, two columns": 'result = tally.groupby("shed")["kg"].sum() / tally.groupby("shed")["fleeces"].sum()',
}


@pytest.mark.parametrize("step", list(CASES.values()), ids=list(CASES))
def test_two_group_results_are_aligned_on_their_labels(step: str) -> None:
    result = differential(HEAD + step + "\n")
    assert "TODO" not in result.converted_text, result.converted_text


@pytest.mark.parametrize("step", [
    # groups in the order met: pandas sorts the union of the labels, unless they are the same
    'result = heavy.groupby("shed", sort=False).size() / tally.groupby("shed", sort=False).size()',
    # missing keys kept (dropna=False): computed by pandas for now
    'result = heavy.groupby("shed", dropna=False)["fleeces"].sum() + tally.groupby("shed", dropna=False)["fleeces"].sum()',
    # True/False: pandas makes an object Series with NaN where a label is missing
    'result = (heavy.groupby("shed")["kg"].sum() > 3) & (tally.groupby("shed")["kg"].sum() > 3)',
])
def test_what_is_not_aligned_here_stays_pandas(step: str) -> None:
    result = differential(HEAD + step + "\n")
    assert "TODO" in result.converted_text, result.converted_text
