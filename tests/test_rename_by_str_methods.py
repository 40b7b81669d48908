"""df.rename(columns=str.lower) / rename(str.strip, axis=1) / columns=str.title: Python's
string method called on each column name, as pandas calls it (and lambda c: c.title()).

pandas is the reference implementation: every check runs the snippet with pandas and its
conversion with Polars and compares the frames, names included.
"""

from __future__ import annotations

import pytest

from rule_checks import check_ports, check_todo
from support import converted_text, differential

# Names with spaces around them, mixed case, an underscore, a unicode letter (ß, é).
FRAME = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({
    " Kind ": ["a", "b", None, "a"],
    "weight_KG": [1.5, np.nan, 2.0, 2.0],
    "straße": [1, 2, 3, 4],
    "élan": ["x", "y", "z", "x"],
})
"""

RENAMES = [
    pytest.param("df.rename(columns=str.upper)", id="upper (ß becomes SS as in Python)"),
    pytest.param("df.rename(columns=str.lower)", id="lower"),
    pytest.param("df.rename(columns=str.strip)", id="strip"),
    pytest.param("df.rename(columns=str.title)", id="title"),
    pytest.param("df.rename(columns=str.capitalize)", id="capitalize"),
    pytest.param("df.rename(str.strip, axis=1)", id="mapper with axis=1"),
    pytest.param("df.rename(str.lower, axis='columns')", id="mapper with axis='columns'"),
    pytest.param('df.rename(columns=lambda c: c.strip().title().replace("_", " "))',
                 id="lambda with title"),
    pytest.param('df.groupby("élan")[["weight_KG", "straße"]].sum().rename(columns=str.upper)',
                 id="after a groupby: the key stays as it is"),
]


@pytest.mark.parametrize("expr", RENAMES)
def test_rename_matches_pandas(expr: str) -> None:
    result = differential(FRAME + f"result = {expr}\n")
    assert "TODO(porter)" not in result.converted_text


def test_names_computed_when_the_columns_are_known() -> None:
    check_ports(FRAME + "r = df.rename(columns=str.upper)\n",
                'df.rename({" Kind ": " KIND ", "weight_KG": "WEIGHT_KG", "straße": "STRASSE", '
                '"élan": "ÉLAN"})')


def test_python_method_on_each_name_when_the_columns_are_not_known() -> None:
    text = converted_text('import pandas as pd\ndf = pd.read_csv("f.csv")\n'
                          "r = df.rename(columns=str.title)\n")
    assert "df.rename(lambda c: c.title())" in text
    assert "TODO(porter)" not in text


def test_a_method_porter_does_not_read_stays_pandas() -> None:
    # str.swapcase is not among the methods porter reads: pandas' own call is kept and runs
    check_todo(FRAME + "r = df.rename(columns=str.swapcase)\n", "frame.rename")
