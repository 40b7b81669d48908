"""df.loc[:, "a":"c"] and df.loc[mask, "a":"c"]: a slice of column labels, both ends included.

pandas is the reference: each check runs the snippet with pandas and its conversion with
Polars and compares the frames (a sheepdog trial's judges' cards: points lost per phase).
"""

from __future__ import annotations

from pathlib import Path

import pytest

from support import convert, differential

CARDS = """\
run,dog,outrun,lift,fetch,drive,shed,pen,judge
3,Moss,4,2,,7,1,0,Vane
1,Fly,20,ret,ret,ret,ret,ret,Tallis
2,Nell,3,1,5,9,2,4,Vane
2,Nell,3,1,5,9,2,4,Vane
4,Sölve,0,0,1,,3,2,Arkwright
"""


@pytest.fixture
def folder(tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> Path:
    monkeypatch.chdir(tmp_path)
    (tmp_path / "cards.csv").write_text(CARDS)
    return tmp_path


@pytest.mark.parametrize("piece", ['"outrun":"pen"', '"lift":"lift"', ':"fetch"', '"shed":',
                                   '"dog"::2', '"outrun":"drive":3'])
def test_column_label_slice_keeps_both_ends(folder: Path, piece: str) -> None:
    result = differential(f"""
        import pandas as pd
        cards = pd.read_csv("cards.csv", na_values=["ret"])
        result = cards.loc[:, {piece}]
        """, data_dir=str(folder))
    assert "TODO" not in result.converted_text


def test_column_label_slice_with_a_row_mask_after_changes(folder: Path) -> None:
    # the columns as they are at that point: one added at the end, one dropped in the middle
    result = differential("""
        import pandas as pd
        cards = pd.read_csv("cards.csv", na_values=["ret"]).drop_duplicates()
        cards["lost"] = cards.loc[:, "outrun":"pen"].sum(axis=1)
        cards = cards.drop(columns=["shed"])
        result = cards.loc[cards["judge"] == "Vane", "fetch":"lost"]
        """, data_dir=str(folder))
    assert "TODO" not in result.converted_text


def test_column_label_slice_porter_cannot_resolve_is_a_todo(folder: Path) -> None:
    # without --data the columns are unknown; a bound that is no column raises in pandas
    text = convert("""
        import pandas as pd
        cards = pd.read_csv("cards.csv")
        result = cards.loc[:, "outrun":"pen"]
        """).converted_text
    assert "# TODO(porter): frame.loc" in text
    text = convert("""
        import pandas as pd
        cards = pd.read_csv("cards.csv")
        result = cards.loc[:, "outrun":"pens"]
        """, data_dir=str(folder)).converted_text
    assert "# TODO(porter): frame.loc" in text
