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
