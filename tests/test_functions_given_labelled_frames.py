"""The script's own function given a frame labelled by a key (set_index, index_col=, a
groupby's keys, a merge on those labels) that writes columns into it and returns it: its body
is ported, the parameter a frame labelled by that key when every call passes one so labelled,
so that what reads the labels of what it returns (sort_index, reset_index, a Series aligned on
them) reads the key. A Series of another table labelled by the same key is aligned on it when
set into a frame whose labels repeat (pandas reindexes it to them).

pandas is the reference: each check writes both versions' outputs and compares their text.
"""

from __future__ import annotations

import pytest

from support import differential, same_text

FILES = {
    "gang.csv": "shearer,gang,rate\nAb,north,2.5\nCd,south,0\nÉf,north,3.0\nGh,,1.25\n",
    "tally.csv": "shearer,fleeces,kg\nAb,3,2.5\nCd,4,\nAb,5,3.25\nZz,1,1.0\n,2,2.0\nÉf,0,1.5\n",
}

PER_HEAD = """\
import pandas as pd


def per_head(frame, rate_col="rate"):
    # pay per fleece; the learner (rate 0) gets the day rate
    frame["pay"] = frame["fleeces"] * frame[rate_col]
    frame.loc[frame[rate_col] == 0, "pay"] = 95.0
    return frame


"""


@pytest.mark.parametrize("made", [
    # labelled by a groupby's key, joined to the gang list on its labels
    'totals = pd.read_csv("tally.csv").groupby("shearer")["fleeces"].sum().to_frame()\n'
    'totals = totals.merge(gang, left_index=True, right_index=True, how="left")',
    # set_index of a column that repeats
    'totals = pd.read_csv("tally.csv").merge(gang.reset_index(), on="shearer", how="left")\n'
    'totals = totals.set_index("shearer")',
])
def test_the_function_returns_the_frame_labelled_by_its_key(made: str, tmp_path) -> None:
    result = same_text(PER_HEAD + f"""
gang = pd.read_csv("gang.csv", index_col="shearer")
{made}
totals = per_head(totals)
totals["gang"] = totals["gang"].fillna("relief")
totals = totals.sort_index()
totals["kg_each"] = pd.read_csv("tally.csv").groupby("shearer")["kg"].mean().round(3)
totals.reset_index(names="shearer").to_csv("pay.csv", index=False)
totals.to_csv("labelled.csv")
""", tmp_path, FILES)
    text = result.converted_text
    assert "TODO" not in text and "to_pandas()" not in text, text
    assert 'frame = frame.with_columns(' in text


def test_calls_labelled_otherwise_give_an_unlabelled_parameter(tmp_path) -> None:
    # one call's frame is labelled by the key, the other's by row numbers: the body knows no
    # key, and what reads the labels of what it returns is made by pandas
    same_text(PER_HEAD + """
gang = pd.read_csv("gang.csv", index_col="shearer")
totals = pd.read_csv("tally.csv").merge(gang.reset_index(), on="shearer", how="left")
keyed = per_head(totals.set_index("shearer")).sort_index()
plain = per_head(pd.read_csv("tally.csv").assign(rate=2.0)).sort_values("kg")
keyed.to_csv("keyed.csv")
plain.reset_index().to_csv("plain.csv", index=False)
""", tmp_path, FILES)


FRAME = """\
import numpy as np
import pandas as pd
pens = pd.DataFrame({
    "pen": ["a", "b", "a", None, "ü", "c", "a"],
    "kg": [1.5, np.nan, 3.0, 4.0, 5.0, 2.0, 0.1],
    "n": [1, 2, 3, 4, 5, 6, 7],
})
"""


@pytest.mark.parametrize("line", [
    'keyed = pens.set_index("pen")\nkeyed["mean_kg"] = pens.groupby("pen")["kg"].mean()'
    '\nresult = keyed.reset_index()',
    'keyed = pens.set_index("pen")\nkeyed["rows"] = pens.groupby("pen")["n"].count()'
    '\nresult = keyed.reset_index()',
    'keyed = pens.set_index("pen")\nkeyed["top"] = pens.groupby("pen")["n"].max()'
    '\nresult = keyed.reset_index()',
    'keyed = pens[pens["n"] > 99].set_index("pen")\nkeyed["mean_kg"] = pens.groupby("pen")["kg"].mean()'
    '\nresult = keyed.reset_index()',
])
def test_a_series_aligned_on_repeated_labels(line: str) -> None:
    result = differential(FRAME + line + "\n")
    assert "TODO" not in result.converted_text, result.converted_text
    assert ".join(" in result.converted_text
