"""df.pipe(func, ...) with a function the script defines: pandas calls func(df, ...), and so
does the port, which ports the function as the script's other functions (its body on a Polars
plan). pandas is the reference implementation: each case runs both and compares.

The data: an invented orchard co-op's picking sheets, with a missing grade, a picker's name in
odd case, duplicate rows and accented varieties.
"""

from __future__ import annotations

import libcst as cst
import pytest

from porter.analysis.pipes import pipes_as_calls
from support import convert_source, differential

HEAD = '''
import pandas as pd
import numpy as np


def clean(df):
    df = df.copy()
    df["variety"] = df["variety"].str.strip().str.title()
    df["grade"] = df["grade"].fillna("ungraded")
    return df.drop_duplicates()


def add_value(df, price, bonus=0.0):
    return df.assign(value=df["crates"] * price + bonus)


sheet = pd.DataFrame({"picker": ["ines", "Jonah", "ines", "Mab", "Mab"],
                      "variety": [" cox", "Åkerö ", " cox", "bramley", "Discovery"],
                      "grade": ["A", None, "A", "B", np.nan],
                      "crates": [4, 7, 4, 0, 12]})
'''

CASES = {
    "one function": "result = sheet.pipe(clean)",
    "with arguments": "result = sheet.pipe(clean).pipe(add_value, 12.5, bonus=1.0)",
    "a keyword argument only": "result = sheet.pipe(add_value, price=3.0)",
    "after a filter": "result = sheet[sheet.crates > 0].pipe(clean).reset_index(drop=True)",
    "a reduction afterwards": "result = sheet.pipe(clean).crates.sum()",
}


@pytest.mark.parametrize("step", list(CASES.values()), ids=list(CASES))
def test_a_pipe_of_the_scripts_function_is_its_call(step: str) -> None:
    result = differential(HEAD + step + "\n")
    assert ".pipe(clean" not in result.converted_text and ".pipe(add_value" not in result.converted_text
    assert not [s for s in result.sites if s.status == "todo"], result.converted_text


def test_pipe_keeps_every_line_where_it_was() -> None:
    source = HEAD + "result = sheet.pipe(clean)\nprint(result.grade.value_counts())\n"
    assert pipes_as_calls(cst.parse_module(source)).code.count("\n") == source.count("\n")
    result = convert_source(source)
    assert all(s.line <= source.count("\n") for s in result.sites)
    # value_counts, on the line after the pipe, is reported there
    line = source.splitlines().index("result = sheet.pipe(clean)") + 2
    assert any(s.line == line and s.key == "series.value_counts" for s in result.sites)


@pytest.mark.parametrize("source", [
    # `.pipe` on a line of its own: not rewritten (the statement would lose a line)
    "result = (sheet\n          .pipe(clean))\n",
    # a name bound again: not the function
    "clean = lambda d: d.head(2)\nresult = sheet.pipe(clean)\n",
    # a lambda: frame.pipe's own rule
    "result = sheet.pipe(lambda d: d[d.crates > 3])\n",
])
def test_what_is_left_as_written(source: str) -> None:
    code = HEAD + source
    assert pipes_as_calls(cst.parse_module(code)).code == code
    differential(code)
