"""A reader of the converted script sees where each plan runs: no line of porter's output runs
two plans (two `.collect()`), and an f-string too long for its line is broken between its
values. An f-string printing two plans' values is written as f-strings Python joins, one per
line (a value too long for a line of its own stays whole: Python 3.11 cannot break it); a
list of two collected frames handed to pandas, one item per line. pandas runs the same
scripts as the reference: what they print must not change.

The data: an invented lighthouse stores ledger (two small files)."""

from __future__ import annotations

from support import same_text

FILES = {
    "stores.csv": """\
        item,keeper,qty,cost
        oil,Ana,4,2.5
        wicks,Bo,,0.25
        oil,Ana,2,2.5
        soap,Élise,1,
        """,
    "keepers.csv": """\
        keeper,tower
        Ana,north
        Bo,south
        Élise,north
        """,
}


def _crowded(text: str) -> list[str]:
    return [line for line in text.splitlines() if line.count(".collect()") > 1]


def test_an_fstring_of_two_plans_is_written_one_piece_per_line(tmp_path):
    result = same_text('''
        import pandas as pd
        stores = pd.read_csv("stores.csv")
        keepers = pd.read_csv("keepers.csv")
        print(f"{len(stores)} lines in the ledger, {keepers.shape[0]} keepers on the rota, and {stores['qty'].sum()} items: {{ok}}")
        ''', tmp_path, FILES)
    text = result.converted_text
    assert not _crowded(text), text
    pieces = [line for line in text.splitlines() if line.lstrip().startswith('f"')]
    assert len(pieces) == 3, text


def test_a_long_fstring_without_plans_is_broken_where_it_is_too_long(tmp_path):
    result = same_text('''
        import pandas as pd
        stores = pd.read_csv("stores.csv")
        who = "the keeper on duty at the north tower"
        what = "the oil and the wicks of the winter store"
        print(f"{who!r} counted {what:>50} in {len(stores)} lines of the ledger, on {who.upper()}'s watch")
        ''', tmp_path, FILES)
    assert not _crowded(result.converted_text), result.converted_text


def test_two_frames_handed_to_pandas_together_are_listed_one_per_line(tmp_path):
    # concat keys= without names= of frames porter cannot follow stays pandas (a hand-over)
    result = same_text('''
        import pandas as pd
        stores = pd.read_csv("stores.csv")
        keepers = pd.read_csv("keepers.csv")
        both = pd.concat([stores, keepers], keys=["stores", "keepers"], names=["sheet", "line"])
        both = both.reset_index()
        print(both.to_string())
        ''', tmp_path, FILES, with_data=False)
    assert not _crowded(result.converted_text), result.converted_text
