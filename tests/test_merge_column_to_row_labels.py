"""merge(left_on=column, right_index=True) against pandas (the reference): the left frame's
column matched with the right frame's row labels (set_index, index_col=, a groupby's keys),
the left's key column kept, the right's labels not written. The frames hold missing keys,
duplicate labels, unmatched keys, unicode keys, a label named otherwise than the column and no
rows at all; the row labels pandas gives (the left rows', repeated) are not read as 0..n-1."""

from __future__ import annotations

import pytest

from support import convert, differential, same_text

FRAME = """\
import numpy as np
import pandas as pd
left = pd.DataFrame({
    "breed": ["Texel", "Jacob", None, "Texel", "Lleyn", "Éwe", "Jacob"],
    "kg": [1.5, np.nan, 3.0, 4.0, 5.0, 2.0, 0.1],
    "n": [1, 2, 3, 4, 5, 6, 7],
})
right = pd.DataFrame({
    "breed": ["Texel", "Jacob", "Texel", None, "Éwe", "Cheviot"],
    "rate": [1.25, 2.0, 1.5, 9.0, 3.5, 4.0],
    "n": [10, 20, 30, 40, 50, 60],
})
"""

CASES = [
    # labelled by a groupby's key (unique labels)
    'r = right.groupby("breed")["rate"].mean().to_frame(); '
    'result = left.merge(r, left_on="breed", right_index=True, how="left")',
    'r = right.groupby("breed")[["rate"]].max(); '
    'result = left.merge(r, left_on="breed", right_index=True)',
    # labelled by set_index: duplicate labels and a missing one
    'r = right.set_index("breed"); '
    'result = left.merge(r, left_on="breed", right_index=True, how="left")',
    'r = right.set_index("breed"); '
    'result = left.merge(r, left_on="breed", right_index=True, how="inner", suffixes=("_l", "_r"))',
    # the labels under another name than the left's column
    'r = right.rename(columns={"breed": "kind"}).set_index("kind")[["rate"]]; '
    'result = left.merge(r, left_on="breed", right_index=True, how="left")',
    # a filtered left frame in a name (it carries its labels), no rows on one side
    'r = right.set_index("breed"); pos = left[left["n"] > 2]; '
    'result = pos.merge(r, left_on="breed", right_index=True, how="left")',
    'r = right.set_index("breed"); none = left[left["n"] > 99]; '
    'result = none.merge(r, left_on="breed", right_index=True, how="left")',
    'r = right[right["n"] > 99].set_index("breed"); '
    'result = left.merge(r, left_on="breed", right_index=True, how="left")',
    'r = right.groupby("breed")["rate"].describe(); '
    'result = left.merge(r, left_on="breed", right_index=True, how="left")',
]


@pytest.mark.parametrize("line", CASES)
def test_matches_pandas(line: str) -> None:
    result = differential(FRAME + line + "\n")
    assert "TODO" not in result.converted_text, result.converted_text
    assert ".join(" in result.converted_text


@pytest.mark.parametrize("line", [
    # filtered where it is merged: its labels (pandas' labels of the result) are not carried
    'r = right.set_index("breed"); '
    'result = left[left["n"] > 2].merge(r, left_on="breed", right_index=True, how="left")',
    'r = right.groupby("breed")[["rate"]].mean(); '
    'result = left.sort_values("kg").merge(r, left_on="breed", right_index=True)',
])
def test_todo_with_pandas_values(line: str) -> None:
    result = differential(FRAME + line + "\n")
    assert any(s.key == "frame.merge" for s in result.todos), result.converted_text


@pytest.mark.parametrize("line", [
    # pandas mixes the two sides' labels and keys
    'r = right.set_index("breed"); '
    'result = left.merge(r, left_on="breed", right_index=True, how="right")',
    'r = right.set_index("breed"); '
    'result = left.merge(r, left_on="breed", right_index=True, how="outer")',
    # the right frame has a column named like the left's key: pandas suffixes both its way
    'r = right.set_index("n"); '
    'result = left.merge(r, left_on="breed", right_index=True, how="left")',
])
def test_todo(line: str) -> None:
    result = convert(FRAME + line + "\n")
    assert any(s.key == "frame.merge" for s in result.todos), result.converted_text


@pytest.mark.parametrize("right", [
    'pd.read_csv("right.csv", index_col="breed")',
    'pd.read_csv("right.csv").groupby("breed")[["rate"]].sum()',
    'pd.read_csv("right.csv").set_index("breed")',
])
@pytest.mark.parametrize("left", ['pd.read_csv("left.csv")',
                                  'pd.read_csv("left.csv"); left = left.sort_values("kg")',
                                  'pd.read_csv("left.csv"); left = left[left["kg"] > 1]'])
def test_the_row_labels_are_the_left_rows(left, right, tmp_path) -> None:
    # pandas labels the rows 0, 0, 1, ... (a left row matching two right rows twice), or the
    # labels a sort left: what reads the labels afterwards is given those
    same_text(f"""
        import pandas as pd
        left = {left}
        right = {right}
        out = left.merge(right, left_on="breed", right_index=True, how="left")
        out.to_csv("plain.csv", index=False)
        out.reset_index().to_csv("labelled.csv", index=False)
        out.to_csv("with_labels.csv")
    """, tmp_path, {"left.csv": "breed,kg\nTexel,1.5\nJacob,\n,3.0\nÉwe,2.25\nTexel,0.5\n",
                    "right.csv": "breed,rate\nTexel,1.25\nTexel,1.5\nJacob,2.0\n,9.5\n"})
