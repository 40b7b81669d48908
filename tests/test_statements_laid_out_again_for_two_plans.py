"""A statement the script wrote over several lines keeps its layout, unless a line of the
conversion would run two plans (two .collect() on one line): it is then laid out again from
one line, one argument per line, as porter lays out the statements it writes. A comment
inside it keeps the layout as written (it would be lost)."""

from __future__ import annotations

from support import convert, differential

FRAME = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({"kg": [48.5, np.nan, 61.0, 55.25, 55.25, 70.0], "n": [1, 2, 3, 3, 0, 2]})
df = df[df["n"] > 0]
"""


def test_two_columns_handed_over_on_one_written_line_are_laid_out_one_per_line() -> None:
    result = differential(FRAME + 'result = round(\n'
                          '    max(np.nansum(df["kg"].values), np.sum(df["n"].values) * 1.5), 3)\n')
    lines = result.converted_text.splitlines()
    assert not [line for line in lines if line.count(".collect()") > 1], result.converted_text


def test_a_conditional_that_cannot_be_broken_up_keeps_the_layout_as_written() -> None:
    source = FRAME + ('result = (len(df["kg"].values) + len(df["n"].values) +\n'
                      '          len(df["kg"].values) if len(df["n"].values) > 1\n'
                      '          else 0)\n')
    text = differential(source).converted_text
    assert text.count("\n") - source.count("\n") < 5, text  # not one long line


def test_a_comment_inside_keeps_the_layout_as_written() -> None:
    text = convert(FRAME + 'result = (len(df["kg"].values),  # the weights\n'
                   '          len(df["n"].values))\n').converted_text
    assert "# the weights" in text
