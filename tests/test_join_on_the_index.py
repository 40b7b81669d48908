"""DataFrame.join of two frames on their index keys, checked against pandas (the reference
implementation).

The left frame holds its index in key columns (a groupby's keys), the right one is
`other.set_index(key)`: the join pairs each left row with the right rows of its label, in the
left's order, a missing label matching a missing one; an int column of the right frame is
float64 where a left row found no label. The data is an invented ferry pontoon's mooring log.
"""

from __future__ import annotations

import pytest

from support import differential

HEAD = '''
import numpy as np
import pandas as pd
log = pd.DataFrame({
    "berth": ["P1", "P2", "P1", None, "Pé", "P3", "P2", None],
    "hours": [2, 5, 1, 4, 3, 6, 2, 1],
    "fee": [4.5, np.nan, 2.0, 8.0, 6.25, 12.0, 4.0, 2.0],
})
berths = pd.DataFrame({
    "berth": ["P2", "P1", "Pé", None, "P9", "P2"],
    "length_m": [12, 9, 15, 7, 20, 11],
    "owner": ["quay", "Åsa", "quay", "club", None, "club"],
})
per = log.groupby("berth", dropna=False).agg(hours=("hours", "sum"), fee=("fee", "mean"))
'''

CASES = {
    "left: unmatched rows, a missing label, a repeated right label": (
        'result = per.join(berths.set_index("berth")).reset_index()'),
    "inner": 'result = per.join(berths.set_index("berth"), how="inner").reset_index()',
    "every row matched: the int column stays int": (
        'j = per.join(berths.drop_duplicates("berth").dropna(subset=["berth"]).set_index("berth"), how="inner")\n'
        'j["text"] = j["length_m"].astype(str)\nresult = j.reset_index()'),
    "the int column read as text after unmatched rows": (
        'j = per.join(berths.set_index("berth"), how="left").dropna(subset=["length_m"])\n'
        'j["text"] = j["length_m"].astype(str)\nresult = j.reset_index()'),
    "a groupby dropping the missing key, then a sort of the joined frame": (
        'p = log.groupby("berth").agg(hours=("hours", "sum"))\n'
        'result = p.join(berths.set_index("berth")).sort_values("hours").reset_index()'),
}


@pytest.mark.parametrize("source", list(CASES.values()), ids=list(CASES))
def test_join_on_the_index_matches_pandas(source: str) -> None:
    result = differential(HEAD + source + "\n")
    assert not [s for s in result.sites if s.status == "todo"], result.converted_text


OUTER_AND_SERIES = {
    "outer: the labels of both sorted, a missing one last, a repeated right label": (
        'result = per.join(berths.set_index("berth"), how="outer").reset_index()'),
    "outer of two groupby tables: ints float where a side lacks the label": (
        'lengths = berths.groupby("berth").agg(boats=("owner", "count"), length_m=("length_m", "sum"))\n'
        'p = log.groupby("berth").agg(visits=("hours", "count"), fee=("fee", "sum"))\n'
        'result = p.join(lengths, how="outer").reset_index()'),
    "outer where every label matches: ints stay int": (
        'a = log.groupby("berth").agg(visits=("hours", "count"))\n'
        'b = log.groupby("berth").agg(hours=("hours", "sum"))\n'
        'result = a.join(b, how="outer").reset_index()'),
    "a named Series labelled by the key, left": (
        'total = berths.groupby("berth")["length_m"].sum()\n'
        'result = per.join(total).reset_index()'),
    "a named Series of a sorted table, outer": (
        'wide = berths.groupby("berth")[["length_m"]].sum().sort_values("length_m", ascending=False)\n'
        'p = log.groupby("berth").agg(visits=("hours", "count"))\n'
        'j = p.join(wide["length_m"], how="outer")\n'
        'j["length_m"] = j["length_m"].fillna(0)\n'
        'result = j.rename_axis("where").reset_index()'),
}


@pytest.mark.parametrize("source", list(OUTER_AND_SERIES.values()), ids=list(OUTER_AND_SERIES))
def test_outer_joins_and_series_on_the_index_match_pandas(source: str) -> None:
    result = differential(HEAD + source + "\n")
    assert not [s for s in result.sites if s.status == "todo"], result.converted_text


@pytest.mark.parametrize("source", [
    'result = per.join(berths.set_index("berth"), how="right").reset_index()',
    'result = per.join(berths.set_index("berth"), rsuffix="_b").reset_index()',
])
def test_other_joins_on_the_index_are_todos_that_run(source: str) -> None:
    result = differential(HEAD + source + "\n")
    assert [s.key for s in result.sites if s.status == "todo"] == ["frame.join"], result.converted_text
