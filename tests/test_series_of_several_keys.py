"""A Series labelled by several keys (a groupby's result on two keys): grouped again by a level
(s.groupby(level=...)), sorted by its labels (sort_index, a MultiIndex: pandas' lexsort keeps
the order of rows with one label), its labels read (s.index.get_level_values), a level dropped
(droplevel), and a Series looked up by its labels (s.map(other)), with list(s) set as a column.
pandas is the reference implementation: each case runs both and compares.

The data: an invented seed-potato co-op's grading boxes by field and lot, with ties, a missing
field, a missing lot, a missing weight, accented names; and its lots sheet, one lot missing.
"""

from __future__ import annotations

import pytest

from support import differential

HEAD = """
import pandas as pd
import numpy as np
boxes = pd.DataFrame({"field": ["Nord", "Süd", "Nord", "Ost", None, "Süd", "Nord", "Ost", "Süd"],
                      "lot": ["L2", "L1", "L3", "L4", "L5", "L6", "L2", None, "L1"],
                      "kg": [10.0, 7.5, 12.5, np.nan, 4.0, 7.5, 2.5, 3.0, 0.0],
                      "n": [3, 1, 4, 1, 5, 9, 2, 6, 5]})
lots = pd.DataFrame({"lot": ["L1", "L2", "L3", "L4", "L6", "L7"],
                     "variety": ["Édith", "Nicola", None, "Désirée", "Nicola", "Agria"],
                     "ha": [1.5, 2.0, 0.5, np.nan, 3.0, 1.0],
                     "rows": [10, 20, 5, 7, 30, 11]}).set_index("lot")
by_lot = boxes.groupby(["field", "lot"])["kg"].sum()
"""

CASES = {
    "the best lot of each field, its labels and its variety": """
        best = by_lot.sort_values(ascending=False, kind="stable").groupby(level="field").head(1)
        best = best.sort_index()
        fields = list(best.index.get_level_values("field"))
        best_lots = best.index.get_level_values("lot")
        best = best.droplevel("lot").rename_axis("field").reset_index(name="kg")
        best["lot"] = list(best_lots)
        best["variety"] = best["lot"].map(lots["variety"])
        result = best""",
    "ties and sort_index descending": """
        top = by_lot.sort_values(kind="stable").groupby(level=0).tail(2)
        result = top.sort_index(ascending=False).reset_index()""",
    "groupby(level=) of counts, sum per level": """
        counts = boxes.groupby(["lot", "field"])["n"].sum()
        result = counts.groupby(level="field").sum().reset_index()""",
    "nth by level position": """
        result = by_lot.groupby(level=1).nth(0).reset_index()""",
    "get_level_values by position, as a list": """
        result = by_lot.index.get_level_values(1).tolist()""",
    "missing keys kept as labels (dropna=False), sorted both ways": """
        kept = boxes.groupby(["field", "lot"], dropna=False)["kg"].sum()
        up = kept.sort_index().reset_index()
        down = kept.sort_index(ascending=False).reset_index()
        result = pd.concat([up, down], ignore_index=True)""",
    "missing keys kept as labels: the best of each level, its labels": """
        kept = boxes.groupby(["field", "lot"], dropna=False)["n"].sum()
        best = kept.sort_values(kind="stable").groupby(level="lot").head(1).sort_index()
        result = pd.DataFrame({"lot": list(best.index.get_level_values("lot")), "n": list(best)})""",
    "map of integers: float64 where a lot is not on the sheet": """
        out = boxes.dropna(subset=["lot"]).copy()
        out["rows"] = out["lot"].map(lots["rows"])
        result = out""",
    "map of floats, a lot missing": """
        out = boxes.copy()
        out["ha"] = out["lot"].map(lots["ha"])
        result = out""",
    "map through a groupby's Series": """
        out = boxes.copy()
        out["field_kg"] = out["field"].map(boxes.groupby("field")["kg"].sum())
        result = out""",
    "an empty Series looked up": """
        out = boxes.copy()
        out["variety"] = out["lot"].map(lots[lots["ha"] > 100]["variety"])
        result = out""",
}


@pytest.mark.parametrize("step", list(CASES.values()), ids=list(CASES))
def test_labels_of_several_keys_as_pandas_reads_them(step: str) -> None:
    import textwrap
    result = differential(HEAD + textwrap.dedent(step) + "\n")
    assert not [s for s in result.sites if s.status == "todo"], result.converted_text


def test_labels_that_repeat_raise_in_both() -> None:
    # pandas' map with a Series whose labels repeat raises (InvalidIndexError); Polars'
    # replace_strict refuses an `old` that repeats
    import textwrap

    from support import convert, run
    source = HEAD + textwrap.dedent("""
        twice = pd.concat([lots, lots])
        out = boxes.copy()
        out["variety"] = out["lot"].map(twice["variety"])
        result = out
    """)
    with pytest.raises(Exception):
        run(source)
    converted = convert(source)
    with pytest.raises(Exception):
        run(converted.converted_text if hasattr(converted, "converted_text") else converted)
