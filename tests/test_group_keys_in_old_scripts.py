"""Two things groupby did otherwise before pandas 2 and 3, which old scripts rely on; porter
follows pandas 3.1 and says so where the script relied on the old behaviour.

- Iterating a groupby on a list of one key gives tuples of one key in pandas 2 and 3
  (`for (k,), g in df.groupby(["k"])`), a plain value for a key given as text; older pandas
  gave plain values for both. The conversion gives what pandas 3.1 gives.
- groupby(...).apply(f): pandas 3 leaves the key columns out of the frame given to f (and
  refuses include_groups=True). A function reading them ran on older pandas and raises
  KeyError now; porter makes it a TODO that says the script relied on the keys being there,
  never a value computed from them.
"""

from __future__ import annotations

import re
import textwrap

import pytest

from support import convert, differential, run

# a seed bank's drawers: a missing and an accented drawer name, duplicates, NaN among the grams
FRAME = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "drawer": ["Nord", "Süd", None, "Nord", "Île", "Süd", "Nord"],
    "shelf": ["a", "b", "a", "a", "b", "b", "a"],
    "grams": [1.5, np.nan, 2.0, 0.25, 3.0, 1.0, 1.5],
    "packets": [3, 1, 4, 1, 5, 9, 2],
})
"""


@pytest.mark.parametrize("loop", [
    'for (k,), g in df.groupby(["drawer"]):\n    seen.append((k, len(g), g["packets"].sum()))',
    'for k, g in df.groupby(["drawer"]):\n    seen.append((k, len(g)))',
    'for k, g in df.groupby("drawer"):\n    seen.append((k, len(g), g["grams"].max()))',
    'for (k, s), g in df.groupby(["drawer", "shelf"]):\n    seen.append((k, s, len(g)))',
    'for key, g in df.groupby(["drawer"], sort=False):\n    seen.append((key, g["packets"].tolist()))',
])
def test_iterating_a_groupby_gives_pandas_3_keys(loop: str) -> None:
    # a list key gives tuples (("Nord",), ...), a text key plain values, as in pandas 3.1
    differential(FRAME + "seen = []\n" + loop + "\nresult = seen\n")


KEY_READS = [
    'result = df.groupby("drawer").apply(lambda g: g["drawer"].nunique())',
    'result = df.groupby("drawer").apply(lambda g: pd.Series({"n": len(g), "d": g["drawer"].count()}))',
    'result = df.groupby(["drawer", "shelf"]).apply(lambda g: g.loc[g["shelf"] == "a", "grams"].sum())',
    'result = df.groupby("shelf").apply(lambda g: g.shelf.count())',
    # a function porter would not read anyway: the TODO still says what pandas 3 changed
    'def label(g):\n    out = []\n    for x in g["drawer"]:\n        out.append(x)\n    return len(out)\n'
    'result = df.groupby("drawer").apply(label)',
    'result = df.groupby("drawer").apply(lambda g: g[["drawer", "grams"]].shape[0])',
]


@pytest.mark.parametrize("body", KEY_READS)
def test_apply_reading_a_key_column_is_a_todo_saying_why(body: str) -> None:
    source = textwrap.dedent(FRAME + body + "\n")
    text = convert(source).converted_text
    said = re.sub(r"\n#  +", " ", text)  # the TODO's lines joined
    assert "# TODO(porter): groupby.apply: the function reads the key column" in said, text
    assert "pandas before 3 passed the key columns" in said, text
    # pandas 3.1 raises as written (KeyError, AttributeError for g.shelf); the conversion keeps
    # that call, so it raises the same way
    # (never a value made from the keys)
    with pytest.raises((KeyError, AttributeError)):
        run(source)
    with pytest.raises((KeyError, AttributeError)):
        run(text)


@pytest.mark.parametrize("body", [
    'result = df.groupby("drawer").apply(lambda g: g["grams"].sum() / len(g))',
    'result = df.groupby("drawer").apply(lambda g: pd.Series({"n": len(g), "p": g["packets"].max()}))',
])
def test_apply_without_the_keys_is_ported_as_pandas_3_computes_it(body: str) -> None:
    result = differential(FRAME + body + "\n")
    assert "TODO(porter)" not in result.converted_text, result.converted_text


def test_the_keys_selected_with_the_columns_are_not_a_key_read() -> None:
    # groupby(keys)[[...]] with the key among the columns passes it to f in pandas 3.1 too
    source = FRAME + 'result = df.groupby("drawer")[["drawer", "grams"]].apply(lambda g: len(g))\n'
    text = convert(source).converted_text
    assert "pandas before 3 passed" not in re.sub(r"\n#  +", " ", text), text
