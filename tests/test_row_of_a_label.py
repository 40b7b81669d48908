"""df.loc["label"]: the whole row of a table labelled by one of its columns (read_csv(index_col=),
set_index, a groupby's key), checked against pandas (the reference implementation).

porter picks the rows holding the label in Polars (a filter) and hands only them to pandas with
the key as their index, where .loc["label"] gives what pandas gives on the whole table: the row
Series when one row holds the label (named by it, its values typed as pandas types a row of
that frame), a frame of the rows when several do, KeyError when none does. The data is an
invented lock-keeper's log of boats: a name that repeats, a missing name, accents, a missing
length and a missing mooring, an int column beside a float one.
"""

from __future__ import annotations

from pathlib import Path

import pytest

from support import convert, differential, run

LOCKS_CSV = """\
boat,kind,length_ft,beam_ft,passages,mooring
Teal,dinghy,0,4.5,3,home
Otter,widebeam,60,12.0,7,
Éider,narrowboat,50,6.8,0,home
Kingfisher,narrowboat,57,6.9,12,visitor
,cruiser,21,7.5,2,home
Otter,narrowboat,44,,5,visitor
Coot,cruiser,,8.0,1,home
"""

HEAD = "import pandas as pd\n"


@pytest.fixture
def data(tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> Path:
    (tmp_path / "locks.csv").write_text(LOCKS_CSV, encoding="utf-8")
    monkeypatch.chdir(tmp_path)
    return tmp_path


def _statuses(source: str, data: Path) -> list[tuple[str, str]]:
    return [(s.key, s.status) for s in convert(source, data_dir=str(data)).sites
            if s.key == "frame.loc"]


ROWS = [
    # one row holds the label: pandas' row Series (object: text beside numbers), named by it
    'b = pd.read_csv("locks.csv", index_col="boat")\nrow = b.loc["Éider"]',
    'b = pd.read_csv("locks.csv", index_col="boat").sort_index()\nrow = b.loc["Kingfisher"]',
    'b = pd.read_csv("locks.csv").set_index("boat")\nrow = b.loc["Coot", :]',
    # numbers only: the row is float64 (an int beside a float), a missing length is nan
    'b = pd.read_csv("locks.csv", index_col="boat")[["length_ft", "beam_ft"]]\nrow = b.loc["Coot"]',
    'b = pd.read_csv("locks.csv", index_col="boat")[["passages"]]\nrow = b.loc["Teal"]',
    # several rows hold it: pandas gives a frame of those rows, in their order
    'b = pd.read_csv("locks.csv", index_col="boat")\nrow = b.loc["Otter"]',
    'b = pd.read_csv("locks.csv").set_index("kind")\nrow = b.loc["narrowboat"]',
    # a groupby's key, and a table labelled again after a merge
    'df = pd.read_csv("locks.csv")\n'
    'per = df.groupby("kind").agg(boats=("boat", "count"), feet=("length_ft", "sum"))\n'
    'row = per.loc["cruiser"]',
    'df = pd.read_csv("locks.csv")\n'
    'per = df.groupby("boat").agg(passages=("passages", "sum")).reset_index()\n'
    'per = per.merge(df[["boat", "kind"]], on="boat", how="inner").set_index("boat")\n'
    'row = per.loc["Teal"]',
    # an int key
    'b = pd.read_csv("locks.csv", index_col="passages")\nrow = b.loc[7]',
]


@pytest.mark.parametrize("body", ROWS)
def test_the_row_of_a_label_matches_pandas(body: str, data: Path) -> None:
    source = HEAD + body + "\nresult = [row, str(row)]\n"
    assert _statuses(source, data) == [("frame.loc", "handover")], \
        convert(source, data_dir=str(data)).converted_text
    result = differential(source, data_dir=str(data))
    # only the rows holding the label are collected and handed over
    assert ".filter(pl.col(" in result.converted_text, result.converted_text


@pytest.mark.parametrize("body", [
    'b = pd.read_csv("locks.csv", index_col="boat")\nrow = b.loc["Nobody"]',
    'b = pd.read_csv("locks.csv", index_col="boat")\nb = b[b["length_ft"] > 100]\nrow = b.loc["Teal"]',
])
def test_a_label_no_row_holds_raises_as_in_pandas(body: str, data: Path) -> None:
    source = HEAD + body + "\n"
    with pytest.raises(KeyError):
        run(source)
    converted = convert(source, data_dir=str(data)).converted_text
    with pytest.raises(KeyError):
        run(converted)


@pytest.mark.parametrize("body,reason", [
    ('b = pd.read_csv("locks.csv", index_col="boat")\nrow = b.loc[3]', "another type"),
    ('b = pd.read_csv("locks.csv", index_col=["boat", "kind"])\nrow = b.loc["Teal"]', "index"),
])
def test_the_row_of_a_label_todo(body: str, reason: str, data: Path) -> None:
    result = convert(HEAD + body + "\n", data_dir=str(data))
    assert any(reason in s.message for s in result.todos), [s.message for s in result.todos]


def test_a_row_handed_to_pandas_is_laid_out_one_step_per_line(data: Path) -> None:
    # a long chain is broken before each step, .loc["label"] the last
    source = HEAD + ('b = pd.read_csv("locks.csv", index_col="boat")\n'
                     'row = b.loc["Kingfisher"]\n')
    text = convert(source, data_dir=str(data)).converted_text
    assert '\n    .loc["Kingfisher"]\n)' in text, text


@pytest.mark.parametrize("body", [
    'b = pd.read_csv("locks.csv", index_col="boat")\nprint(b.loc["Kingfisher"])',
    'b = pd.read_csv("locks.csv", index_col="boat")\nprint("twice:", b.loc["Otter"])',
    'b = pd.read_csv("locks.csv").set_index(["kind", "passages"])\nprint(b.loc[("cruiser", 2)])',
])
def test_a_printed_row_is_shown_in_polars_without_pandas(body: str, data: Path) -> None:
    # only printed: the rows holding the label are picked and shown by Polars, as a printed
    # frame is; pandas is not imported for them (its import costs more than a short run)
    source = HEAD + body + "\n"
    text = convert(source, data_dir=str(data)).converted_text
    assert "to_pandas" not in text and "import pandas" not in text, text
    assert "pandas_label_rows(" in text, text
    run(text)


@pytest.mark.parametrize("body", [
    'b = pd.read_csv("locks.csv", index_col="boat")\nprint(b.loc["Nobody"])',
    'b = pd.read_csv("locks.csv", index_col="boat")\nb = b[b["length_ft"] > 100]\nprint(b.loc["Teal"])',
])
def test_a_printed_label_no_row_holds_raises_as_in_pandas(body: str, data: Path) -> None:
    source = HEAD + body + "\n"
    with pytest.raises(KeyError):
        run(source)
    converted = convert(source, data_dir=str(data)).converted_text
    with pytest.raises(KeyError):
        run(converted)
