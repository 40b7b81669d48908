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


@pytest.mark.parametrize("body", [
    # a groupby's two keys, one dropped, then the rows grouped by the other (level=)
    'per = res.groupby(["club", "event"]).agg(crews=("lane", "count"), best=("seconds", "min"))\n'
    'result = per.droplevel("event").groupby(level="club").sum()',
    'per = res.groupby(["club", "event"]).agg(crews=("lane", "count"), best=("seconds", "min"))\n'
    'result = per.droplevel(1).groupby(level=0).max().reset_index()',
    'per = res.groupby(["event", "heat", "club"])[["seconds"]].max()\n'
    'result = per.droplevel(["heat"]).reset_index()',
    'per = res.groupby(["event", "club"])["seconds"].sum()\nresult = per.droplevel("event")',
    'heats = res.set_index(["event", "heat"])\n'
    'result = heats.groupby(level=["event", "heat"])[["seconds"]].mean()',
])
def test_dropped_levels_and_level_groups_match_pandas(body: str) -> None:
    result = differential(HEAD + body + "\n", data_dir=".")
    assert not result.todos, result.converted_text


@pytest.mark.parametrize("body, key", [
    ('per = res.groupby(["club", "event"])[["seconds"]].sum()\nresult = per.droplevel([0, 1])',
     "frame.droplevel"),
    ('per = res.groupby(["club", "event"])[["seconds"]].sum()\n'
     'result = per.groupby(level="club").sum()', "frame.groupby"),
])
def test_levels_porter_leaves_to_pandas(body: str, key: str) -> None:
    result = convert(HEAD + body + "\n", data_dir=".")
    assert key in [s.key for s in result.todos], result.converted_text


def test_a_series_with_a_level_dropped_given_to_pandas() -> None:
    # Series.groupby has no rule: pandas groups the Series porter made, labelled by the key left
    body = ('per = res.groupby(["event", "heat"])["seconds"].count()\n'
            'result = per.droplevel(0).groupby(level="heat").sum()\n')
    differential(HEAD + body, data_dir=".")
