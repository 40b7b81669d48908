"""pd.concat(frames, keys=[...]) without names= (and with names= for one level, where the
pieces' index gives the other), checked against pandas 3.1 (the reference implementation).

pandas leaves both levels of the index unnamed; reset_index() makes them the columns level_0
and level_1, and to_csv writes them under empty headers. The inner level is each row's label
in its piece: its row number, the label a filter left, or the key a set_index gave it. The data
is an invented seed bank's two cold-room sheets.
"""

from __future__ import annotations

from pathlib import Path

import pytest

from support import convert, differential, same_text

HEAD = '''
import numpy as np
import pandas as pd
room_a = pd.DataFrame({"lot": ["A1", "A2", "A2", "Ä3"], "species": ["Vicia", None, "Lens", "Pisum"],
                       "grams": [20, 0, 55, 31]})
room_b = pd.DataFrame({"lot": ["B1", "B2"], "grams": [1.5, np.nan], "viability": [0.9, 0.75]})
empty = room_a[room_a["grams"] > 999].reset_index(drop=True)
'''

CASES = {
    "two pieces, put back as level_0 and level_1": (
        'result = pd.concat([room_a, room_b], keys=["a", "b"]).reset_index()'),
    "the frame itself (pandas' unnamed two-level index)": (
        'result = pd.concat([room_a, room_b], keys=["a", "b"])'),
    "a key repeated, an empty piece": (
        'result = pd.concat([room_a, empty, room_a], keys=["a", "ø", "a"]).reset_index()'),
    "pieces filtered on the way: their labels are the inner level": (
        'wet = room_a[room_a["grams"] > 10]\ndry = room_a[room_a["grams"] <= 10]\n'
        'result = pd.concat([wet, dry], keys=["wet", "dry"]).reset_index()'),
    "a sorted piece": (
        'top = room_a.sort_values("grams", ascending=False)\n'
        'result = pd.concat([top, room_b], keys=["a", "b"], names=["room", "row"]).reset_index()'),
    "pieces labelled by a groupby's key, the outer level named": (
        'a = room_a.groupby("lot")[["grams"]].sum()\nb = room_b.groupby("lot")[["grams"]].max()\n'
        'result = pd.concat([a, b], keys=["a", "b"], names=["room"]).reset_index()'),
    "pieces labelled by a groupby's key, both levels named": (
        'a = room_a.groupby("lot")[["grams"]].sum()\nb = room_b.groupby("lot")[["grams"]].max()\n'
        'result = pd.concat([a, b], keys=["a", "b"], names=["room", "code"])'),
    "inner join of the columns, grouped by the key after": (
        'v = pd.concat([room_a, room_b], keys=["a", "b"], join="inner").reset_index()\n'
        'result = v.groupby("level_0", as_index=False)["grams"].sum()'),
    "the index dropped": (
        'result = pd.concat([room_a, room_b], keys=["a", "b"]).reset_index(drop=True)'),
}


@pytest.mark.parametrize("source", list(CASES.values()), ids=list(CASES))
def test_concat_with_keys_without_names_matches_pandas(source: str) -> None:
    result = differential(HEAD + source + "\n")
    assert not [s for s in result.sites if s.status == "todo"], result.converted_text


@pytest.mark.parametrize("source", [
    # the pieces' index is named "lot" and the outer level is not: pandas' levels are
    # [None, "lot"], half named
    'a = room_a.groupby("lot")[["grams"]].sum()\nb = room_b.groupby("lot")[["grams"]].max()\n'
    'result = pd.concat([a, b], keys=["a", "b"]).reset_index()',
    # pandas raises: keys and ignore_index together
    'result = pd.concat([room_a, room_b], keys=["a", "b"], names=["r", "n"], ignore_index=True)',
])
def test_half_named_levels_are_todos(source: str) -> None:
    text = convert(HEAD + source + "\n").converted_text
    assert "# TODO(porter): pd.concat" in text, text


def test_a_piece_filtered_inline_stays_pandas_with_its_labels() -> None:
    # no name holds the filtered piece: pandas makes it, with its own labels
    result = differential(HEAD + 'result = pd.concat([room_a[room_a["grams"] > 10], room_b], '
                                 'keys=["a", "b"]).reset_index()\n')
    assert "pd.concat" in [s.key for s in result.sites if s.status == "todo"], \
        result.converted_text


def test_a_column_named_like_a_level_is_a_todo_as_pandas_raises() -> None:
    source = HEAD + ('c = room_a.rename(columns={"lot": "level_1"})\n'
                     'result = pd.concat([c, room_b], keys=["a", "b"])\n')
    assert "# TODO(porter): pd.concat" in convert(source).converted_text


SHEETS = {
    "room_a.csv": """\
        lot,species,grams
        A1,Vicia,20
        A2,,0
        Ä3,Lens,55
        """,
    "room_b.csv": """\
        lot,grams,viability
        B1,1.5,0.9
        B2,,0.75
        """,
}


@pytest.mark.parametrize("with_data", [True, False])
def test_written_files_match_pandas(tmp_path: Path, with_data: bool) -> None:
    source = '''\
        import pandas as pd
        a = pd.read_csv("room_a.csv")
        b = pd.read_csv("room_b.csv")
        both = pd.concat([a, b], keys=["a", "b"])
        both.to_csv("both.csv")
        both.reset_index().to_csv("flat.csv", index=False)
        heavy = a[a["grams"] > 10]
        pd.concat([heavy, b], keys=["heavy", "b"]).to_csv("heavy.csv")
        print(both.reset_index()["level_1"].tolist())
    '''
    same_text(source, tmp_path, SHEETS, with_data=with_data)


def test_pieces_carrying_their_labels_are_written_under_an_empty_header(tmp_path: Path) -> None:
    # without keys=: the labels a filter left stay pandas' unnamed index, which to_csv writes
    # under an empty header (not "index")
    source = '''\
        import pandas as pd
        a = pd.read_csv("room_a.csv")
        heavy = a[a["grams"] > 10]
        light = a[a["grams"] <= 10]
        both = pd.concat([heavy, light])
        both.to_csv("both.csv")
    '''
    same_text(source, tmp_path, SHEETS)
