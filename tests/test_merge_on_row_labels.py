"""merge(left_index=True, right_index=True) of two tables labelled by the same key columns
(read_csv(index_col=), set_index, a groupby's keys): pandas joins them on the labels exactly as
it merges on=those keys, which porter ports; checked against pandas (the reference
implementation).

The data is an invented shearing gang: a shearer listed twice on the gang list, a relief
shearer not on it, a gang member who shore nothing, a blank name (a missing label), an
accented name, a rate of 0.
"""

from __future__ import annotations

import pytest

from support import convert, differential


@pytest.fixture(autouse=True)
def files(tmp_path, monkeypatch):
    (tmp_path / "gang.csv").write_text(
        "shearer,gang,rate\nOwain Fell,north,1.95\nMared Lusk,south,0.0\nIolo Brandt,north,1.8\n"
        "Iolo Brandt,south,2.1\nGethin Moor,north,1.9\n,south,2.0\n",
        encoding="utf-8")
    (tmp_path / "tally.csv").write_text(
        "shearer,shed,fleeces\nOwain Fell,Blaen,12\nZoë Harrow,Hafod,7\nMared Lusk,Blaen,3\n"
        "Owain Fell,Hafod,5\nIolo Brandt,Blaen,9\n,Hafod,4\n",
        encoding="utf-8")
    monkeypatch.chdir(tmp_path)


HEAD = ('import pandas as pd\ngang = pd.read_csv("gang.csv", index_col="shearer")\n'
        'tally = pd.read_csv("tally.csv")\n'
        'per = tally.groupby("shearer")[["fleeces"]].sum()\n')


@pytest.mark.parametrize("how", ["left", "inner", "outer", "right"])
def test_merge_on_labels_matches_pandas(how: str) -> None:
    body = (f'both = per.merge(gang, left_index=True, right_index=True, how="{how}")\n'
            'result = both.reset_index()\n')
    result = differential(HEAD + body, data_dir=".")
    assert "frame.merge" not in [s.key for s in result.todos], result.converted_text


def test_the_gang_list_on_the_left() -> None:
    body = ('both = gang.merge(per, left_index=True, right_index=True, how="left")\n'
            'both["pay"] = both["fleeces"] * both["rate"]\nresult = both.reset_index()\n')
    result = differential(HEAD + body, data_dir=".")
    assert "frame.merge" not in [s.key for s in result.todos], result.converted_text


def test_labels_of_other_names_stay_pandas() -> None:
    body = ('by_shed = tally.groupby("shed")[["fleeces"]].sum()\n'
            'result = by_shed.merge(gang, left_index=True, right_index=True, how="left")\n')
    assert "frame.merge" in [s.key for s in convert(HEAD + body, data_dir=".").todos]
    differential(HEAD + body, data_dir=".")
