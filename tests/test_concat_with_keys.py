"""pd.concat(frames, keys=[...], names=[outer, inner]), checked against pandas (the reference
implementation).

pandas labels each row with its piece's key and its own label there; porter gives each piece
both as index columns (the key, its row number), which reset_index() puts first. The data is an
invented river ferry's two pontoon sheets.
"""

from __future__ import annotations

import pytest

from support import differential

HEAD = '''
import numpy as np
import pandas as pd
east = pd.DataFrame({"visit": ["E1", "E2", "E2", "E3"], "boat": ["Möwe", None, "Lark", "Tern"],
                     "hours": [2, 0, 5, 3]})
west = pd.DataFrame({"visit": ["W1", "W2"], "hours": [1.5, np.nan], "paid": [4.0, 9.5]})
empty = east[east["hours"] > 99].reset_index(drop=True)
'''

CASES = {
    "two pieces, columns in part shared": (
        'result = pd.concat([east, west], keys=["east", "west"], names=["bank", "line"]).reset_index()'),
    "then a filter and the labels of the result read": (
        'v = pd.concat([east, west], keys=["east", "wést"], names=["bank", "line"]).reset_index()\n'
        'v = v[v["hours"] > 1]\nresult = v.reset_index()'),
    "an empty piece, inner join of the columns": (
        'result = pd.concat([east, empty, west], keys=["a", "b", "c"], names=["k", "n"], '
        'join="inner").reset_index()'),
    "grouped by the key": (
        'v = pd.concat([east, west], keys=["east", "west"], names=["bank", "line"]).reset_index()\n'
        'result = v.groupby("bank", as_index=False)["hours"].sum()'),
}


@pytest.mark.parametrize("source", list(CASES.values()), ids=list(CASES))
def test_concat_with_keys_matches_pandas(source: str) -> None:
    result = differential(HEAD + source + "\n")
    assert not [s for s in result.sites if s.status == "todo"], result.converted_text


@pytest.mark.parametrize("source", [
    # one level named, the other not (porter marks a whole index unnamed or not)
    'result = pd.concat([east, west], keys=["e", "w"], names=["b"]).reset_index()',
    # keys that are not one text per piece
    'result = pd.concat([east, west], keys=[1, 2], names=["b", "l"]).reset_index()',
])
def test_other_keyed_concats_are_todos_that_run(source: str) -> None:
    result = differential(HEAD + source + "\n")
    assert "pd.concat" in [s.key for s in result.sites if s.status == "todo"], result.converted_text
