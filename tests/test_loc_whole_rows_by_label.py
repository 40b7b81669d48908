"""`df.loc["label"]`: the whole row (or rows) of a label, on a table labelled by one key column
(read_csv(index_col=), set_index, a groupby's keys), checked against pandas (the reference
implementation).

The rows are chosen in Polars (a filter on the key) and handed to pandas labelled by the key,
where `.loc[label]` gives what pandas gives of the whole table: the row as a Series named by the
label, a frame of the rows when the label repeats. The data is an invented hill farm's shearing
gang list: a learner with a rate of 0, a shearer with no rate, an accented name, a shearer
listed twice.
"""

from __future__ import annotations

import pytest

from support import convert, differential


@pytest.fixture(autouse=True)
def gang(tmp_path, monkeypatch):
    (tmp_path / "gang.csv").write_text(
        "shearer,gang,rate,fleeces\nOwain Fell,north,1.95,43\nMared Lusk,south,0.0,26\n"
        "Zoë Harrow,,,31\nIolo Brandt,north,1.8,39\nIolo Brandt,south,2.1,4\n",
        encoding="utf-8")
    monkeypatch.chdir(tmp_path)


HEAD = 'import pandas as pd\ngang = pd.read_csv("gang.csv", index_col="shearer")\n'


@pytest.mark.parametrize("body", [
    # one row: a Series of mixed values (object), named by its label
    'result = gang.loc["Mared Lusk"]',
    'result = gang.loc["Zoë Harrow"]',
    # the row read on: a value of it, a sum of its numbers
    'row = gang.loc["Owain Fell"]\nresult = row["rate"] * row["fleeces"]',
    'result = gang[["rate", "fleeces"]].loc["Mared Lusk"].sum()',
    # a label two rows hold: a frame of them
    'result = gang.loc["Iolo Brandt"]',
    # set_index and a groupby's keys as the labels
    'flat = pd.read_csv("gang.csv")\nresult = flat.set_index("gang").loc["north"]',
    'flat = pd.read_csv("gang.csv")\nper = flat.groupby("gang")[["rate", "fleeces"]].sum()\n'
    'result = per.loc["south"]',
    'flat = pd.read_csv("gang.csv")\nper = flat.groupby("fleeces")[["rate"]].sum()\n'
    'result = per.loc[31]',
])
def test_whole_rows_by_label_match_pandas(body: str) -> None:
    result = differential(HEAD + body + "\n", data_dir=".")
    assert not [s for s in result.todos if s.key == "frame.loc"], result.converted_text


def test_a_label_of_another_type_stays_pandas() -> None:
    body = 'flat = pd.read_csv("gang.csv")\nper = flat.groupby("fleeces")[["rate"]].sum()\n' \
           'result = per.loc["31"] if False else per.loc[31.0]\n'
    result = convert(HEAD + body, data_dir=".")
    assert "frame.loc" in [s.key for s in result.todos], result.converted_text
    differential(HEAD + body, data_dir=".")


@pytest.mark.parametrize("body", [
    # without --data the key's type is not known: .at / .iat stay pandas, and stay .at / .iat
    'result = gang.at["Zoë Harrow", "fleeces"]',
    'result = gang.at["Owain Fell", "rate"] * 2',
    'result = gang.iat[1, 2]',
])
def test_at_kept_on_pandas_keeps_its_accessor(body: str) -> None:
    differential(HEAD + body + "\n")


@pytest.mark.parametrize("body", [
    # one row of numbers with a float column: added without pandas, as pandas adds them
    'result = gang[["rate", "fleeces"]].loc["Owain Fell"].sum()',
    'result = gang[["rate", "fleeces"]].loc["Zoë Harrow"].sum()',  # a missing rate skipped
    'result = gang[["fleeces", "rate"]].loc["Mared Lusk"].sum()',
    'flat = pd.read_csv("gang.csv")\nper = flat.groupby("gang")[["rate", "fleeces"]].sum()\n'
    'result = per.loc["south"].sum()',
    'flat = pd.read_csv("gang.csv")\nflat["a"] = flat["rate"] / 3\nflat["b"] = flat["rate"] / 7\n'
    'flat["c"] = flat["rate"] * 0.1\nflat["d"] = flat["fleeces"] / 9\nflat["e"] = flat["rate"] / 11\n'
    'flat["f"] = flat["rate"] * 1.3\nflat["h"] = flat["rate"] / 13\n'
    'result = flat.set_index("shearer").drop(columns="gang").loc["Owain Fell"].sum()',
    # left to pandas when the script runs: a label two rows hold (a sum per column), whole
    # numbers only
    'result = gang[["rate", "fleeces"]].loc["Iolo Brandt"].sum()',
    'result = gang[["fleeces"]].loc["Owain Fell"].sum()',
])
def test_the_sum_of_a_labelled_row_matches_pandas(body: str) -> None:
    result = differential(HEAD + body + "\n", data_dir=".")
    assert "pandas_row_sum(" in result.converted_text, result.converted_text
    assert not [s for s in result.sites if s.status in ("todo", "handover")], \
        [(s.key, s.status) for s in result.sites]


def test_the_sum_of_a_label_no_row_holds_raises_as_in_pandas() -> None:
    from support import run
    source = HEAD + 'result = gang[["rate", "fleeces"]].loc["Nobody"].sum()\n'
    with pytest.raises(KeyError):
        run(source)
    with pytest.raises(KeyError):
        run(convert(source, data_dir=".").converted_text)


def test_the_sum_of_a_labelled_row_with_text_raises_as_in_pandas() -> None:
    # pandas' row of text and numbers is object: adding them raises, computed by pandas
    from support import run
    source = HEAD + 'result = gang.loc["Owain Fell"].sum()\n'
    with pytest.raises(TypeError):
        run(source)
    with pytest.raises(TypeError):
        run(convert(source, data_dir=".").converted_text)
