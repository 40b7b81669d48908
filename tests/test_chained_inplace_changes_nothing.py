"""df["c"].fillna(0, inplace=True): under pandas 3's copy-on-write the method changes a copy of
the column, never the frame, so the statement does nothing. Its port does nothing either (a
`pass` under a TODO that says how to write the change that was meant). pandas is the reference
implementation: the frame after it is compared.
"""

from __future__ import annotations

import warnings

import pytest

from support import differential

SOURCE = """
import pandas as pd
import numpy as np
lockers = pd.DataFrame({"keeper": ["Åse", None, "Bo"], "keys": [2.0, np.nan, 1.0]})
lockers["keeper"].fillna("nobody", inplace=True)
lockers["keys"].fillna(0, inplace=True)
result = lockers
"""


def test_a_chained_inplace_fill_changes_nothing() -> None:
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")  # pandas warns of the chained assignment
        result = differential(SOURCE)
    assert result.converted_text.count("\npass\n") == 2
    todos = [s for s in result.sites if s.key == "series.inplace"]
    assert len(todos) == 2
    assert 'lockers["keys"] = lockers["keys"].fillna(0)' in todos[1].message
    assert "fill_null" not in result.converted_text


@pytest.mark.parametrize("body", ['    df["keys"].fillna(0, inplace=True)\n'])
def test_the_only_statement_of_a_function(body: str) -> None:
    source = ("import pandas as pd\n\n\ndef fix(df):\n" + body +
              "    return df\n\n\nresult = fix(pd.DataFrame({'keys': [1.0, None]}))\n")
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        differential(source)
