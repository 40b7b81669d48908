"""sort_values(key=lambda s: ...): the rows sorted by the lambda's expression of each key
column, as pandas sorts them by what the key gives back.

pandas is the reference implementation: every check runs the snippet with pandas and its
conversion with Polars and compares what they computed (rows, their order, and the values).
"""

from __future__ import annotations

import pytest

from rule_checks import check_ports
from support import differential

# Mixed case, unicode (ß, İ, É), None and NaN, ties in every key, negative numbers.
FRAME = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "k": ["b", "A", None, "B", "a", np.nan, "Éclair", "a"],
    "name": ["Oak", "ash", "İris", None, "ÉLM", "oak", "straße", "Ash"],
    "v": [3.0, -1.0, np.nan, -3.0, None, 2.0, 1.0, 1.0],
    "n": [1, -2, 3, -4, 2, 6, -1, 0],
    "d": ["2024-01-31", "2024-03-01", None, "2023-01-15", "2024-01-01", "2022-03-09",
          "2024-03-31", "2021-01-01"],
})
df["d"] = pd.to_datetime(df["d"], format="%Y-%m-%d")
"""

PORTS = [
    pytest.param('r = df.sort_values("name", key=lambda s: s.str.lower())',
                 'df.sort(\n    pl.col("name")', id="text key lowered, sorted stably"),
    pytest.param('r = df.sort_values("v", key=lambda s: s.abs())',
                 'df.pipe(pandas_sort_values, pl.col("v").abs())', id="number key in quicksort order"),
]


@pytest.mark.parametrize("before, expected", PORTS)
def test_ports(before: str, expected: str) -> None:
    check_ports(FRAME + before + "\n", expected)


SORTS = [
    pytest.param('df.sort_values("name", key=lambda s: s.str.lower())', id="lower text, ties stable"),
    pytest.param('df.sort_values("name", key=lambda s: s.str.lower(), ascending=False, '
                 'na_position="first")', id="lower text descending, missing first"),
    pytest.param('df.sort_values("name", key=lambda s: s.str.upper())', id="upper text (ß, İ)"),
    pytest.param('df.sort_values("v", key=lambda s: s.abs())', id="abs of floats with NaN, ties"),
    pytest.param('df.sort_values("n", key=lambda s: s.abs(), ascending=False)', id="abs of ints descending"),
    pytest.param('df.sort_values("n", key=lambda s: -s)', id="negated ints"),
    pytest.param('df.sort_values("k", key=lambda s: s.map({"a": 2, "b": 1, "B": 0}))',
                 id="map to an order, unmapped keys missing"),
    pytest.param('df.sort_values(["k", "name"], key=lambda c: c.str.lower(), ascending=[True, False])',
                 id="two keys, each mapped"),
    pytest.param('df.sort_values(["k", "v"], key=lambda c: c)', id="key giving the column back"),
    pytest.param('df.sort_values("name", key=lambda s: s.str.len())', id="length of text with a missing value"),
    pytest.param('df.sort_values("v", key=lambda s: s > 1)', id="comparison: missing is False"),
    pytest.param('df.sort_values("d", key=lambda s: s.dt.month)', id="month of dates with NaT"),
    pytest.param('df.sort_values("v", key=lambda s: s.rank(method="dense"))', id="rank of the whole column"),
    pytest.param('df.sort_values("v", key=lambda s: -s).head(3)', id="head after a keyed sort"),
    pytest.param('df[df["n"] > -3].sort_values("name", key=lambda s: s.str.lower())',
                 id="after a filter"),
    pytest.param('df["name"].sort_values(key=lambda s: s.str.lower())', id="series keyed sort"),
    pytest.param('df["n"].sort_values(key=lambda s: s.abs(), ascending=False)', id="series abs descending"),
    pytest.param('df.iloc[:0].sort_values("name", key=lambda s: s.str.lower())', id="empty frame"),
]


@pytest.mark.parametrize("expr", SORTS)
def test_keyed_sort_matches_pandas(expr: str) -> None:
    result = differential(FRAME + f"result = {expr}\n")
    assert "TODO(porter)" not in result.converted_text


def test_keyed_sort_in_place_matches_pandas() -> None:
    result = differential(FRAME + 'df.sort_values("name", key=lambda s: s.str.lower(), inplace=True)\n'
                          'result = df\n')
    assert "TODO(porter)" not in result.converted_text


def test_key_of_the_script_s_own_function_stays_pandas() -> None:
    # a function porter does not read as an expression: a TODO, and the script still runs
    result = differential(FRAME + "def lowered(s):\n    return s.str.lower()\n"
                          'result = df.sort_values("name", key=lowered)\n')
    assert "# TODO(porter): frame.sort_values" in result.converted_text
