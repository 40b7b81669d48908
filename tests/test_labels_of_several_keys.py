"""Tables labelled by several key columns (set_index([...]), a groupby on two keys): sorted by
their labels, rows read by a tuple of labels, the values of one level, checked against pandas
(the reference implementation).

The data is an invented lake rowing club's regatta sheet: heats out of order, a dead heat (two
crews with one time), a crew that did not finish (a missing time), a lane written twice in one
heat, an accented club name, a heat with no event written.
"""

from __future__ import annotations

import pytest

from support import convert, differential


@pytest.fixture(autouse=True)
def results(tmp_path, monkeypatch):
    (tmp_path / "results.csv").write_text(
        "event,heat,lane,club,seconds\n"
        "four,2,3,Tarn Vale,401\neight,1,2,Brèche RC,377\nfour,1,1,Tarn Vale,\n"
        "eight,2,5,Marrow Oars,380\neight,1,4,Tarn Vale,377\nfour,2,1,Brèche RC,399\n"
        "eight,2,5,Lakeside,383\n,1,2,Lakeside,390\nsingle,3,1,Marrow Oars,470\n"
        "eight,1,1,Lakeside,381\n",
        encoding="utf-8")
    monkeypatch.chdir(tmp_path)


HEAD = 'import pandas as pd\nres = pd.read_csv("results.csv")\n'


@pytest.mark.parametrize("body", [
    'result = res.set_index(["event", "heat", "lane"]).sort_index()',
    'result = res.set_index(["event", "lane"]).sort_index(ascending=False)',
    'result = res.set_index(["club", "heat"]).sort_index().reset_index()',
    'heats = res.set_index(["event", "heat", "lane"]).sort_index()\nresult = heats.loc[("eight", 1)]',
    'heats = res.set_index(["event", "heat", "lane"]).sort_index()\nresult = heats.loc["four"]',
    'heats = res.set_index(["event", "heat"])\nresult = heats.loc[("eight", 2)]',
    'heats = res.set_index(["event", "heat", "lane"])\nresult = heats.loc[("four", 2, 3)]',
    'heats = res.set_index(["event", "heat", "lane"]).sort_index()\n'
    'won = heats[heats["seconds"] < 390]\n'
    'result = won.index.get_level_values("event").value_counts()',
    'heats = res.set_index(["event", "heat"])\nresult = list(heats.index.get_level_values(1))',
    'per = res.groupby(["club", "event"])["seconds"].min()\n'
    'result = per.index.get_level_values("club").str.upper()',
])
def test_labels_of_several_keys_match_pandas(body: str) -> None:
    result = differential(HEAD + body + "\n", data_dir=".")
    assert not result.todos, result.converted_text


def test_set_index_of_several_keys_keeps_them_first() -> None:
    result = convert(HEAD + 'result = res.set_index(["lane", "event"])\n', data_dir=".")
    assert 'select("lane", "event", "heat", "club", "seconds")' in result.converted_text
