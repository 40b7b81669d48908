"""A table labelled by one of its columns (read_csv(index_col=...), set_index) read through its
labels: sort_index, .at / .loc[label, column], the labels written out or put back, and what
else pandas does with such a frame (filters, new columns, merges after reset_index).

pandas is the reference: each check runs the snippet with pandas and its conversion with
Polars in a folder holding the same input file, and compares what they computed.
"""

from __future__ import annotations

from pathlib import Path

import pytest

from support import convert, differential

# Boat names that repeat (Otter twice), a missing one, unsorted, accented ("Éider" sorts after
# ASCII), a length of 0, a missing length and a missing mooring.
BOATS_CSV = """\
boat,kind,length_ft,mooring
Teal,dinghy,0,home
Otter,widebeam,60,
Éider,narrowboat,50,home
Kingfisher,narrowboat,57,visitor
,cruiser,21,home
Otter,narrowboat,44,visitor
Coot,cruiser,,home
"""

# The same boats, each name once.
UNIQUE_CSV = """\
boat,kind,length_ft
Teal,dinghy,0
Otter,widebeam,60
Éider,narrowboat,50
Kingfisher,narrowboat,57
Coot,cruiser,
"""

HEAD = "import pandas as pd\n"


@pytest.fixture
def data(tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> Path:
    (tmp_path / "boats.csv").write_text(BOATS_CSV, encoding="utf-8")
    (tmp_path / "unique.csv").write_text(UNIQUE_CSV, encoding="utf-8")
    monkeypatch.chdir(tmp_path)
    return tmp_path


def _todos(source: str, data: Path) -> list[str]:
    return [s.key for s in convert(source, data_dir=str(data)).todos]


@pytest.mark.parametrize("body", [
    'result = pd.read_csv("boats.csv", index_col="boat")',
    'result = pd.read_csv("boats.csv", index_col=0)',
    'result = pd.read_csv("boats.csv", index_col="kind")',
    'result = pd.read_csv("boats.csv", index_col="boat").sort_index()',
    'result = pd.read_csv("boats.csv", index_col="boat").sort_index(ascending=False)',
    'result = pd.read_csv("boats.csv").set_index("boat").sort_index()',
    'result = pd.read_csv("boats.csv").set_index("kind").sort_index(ascending=False)',
    'b = pd.read_csv("boats.csv", index_col="boat")\nb = b.sort_index()\nresult = b.reset_index()',
    'b = pd.read_csv("boats.csv", index_col="boat")\nresult = b[b["length_ft"] > 30]',
    'b = pd.read_csv("boats.csv", index_col="boat")\nb["half"] = b["length_ft"] / 2\nresult = b',
    'b = pd.read_csv("boats.csv", index_col="boat")\nresult = b.reset_index().merge(b.reset_index(), on="kind")',
    # a key of numbers (a missing one among them): numpy's quicksort order, as pandas sorts it
    'result = pd.read_csv("boats.csv", index_col="length_ft").sort_index().reset_index()',
    'result = pd.read_csv("boats.csv", index_col="length_ft").sort_index(ascending=False).reset_index()',
])
def test_labelled_table_matches_pandas(body: str, data: Path) -> None:
    source = HEAD + body + "\n"
    assert not _todos(source, data), convert(source, data_dir=str(data)).converted_text
    differential(source, data_dir=str(data))


def test_labelled_table_written_out_keeps_its_labels(data: Path, tmp_path: Path) -> None:
    source = HEAD + ('b = pd.read_csv("boats.csv", index_col="boat").sort_index()\n'
                     'b.to_csv("out.csv")\nresult = pd.read_csv("out.csv")\n')
    assert not _todos(source, data)
    differential(source, data_dir=str(data))


@pytest.mark.parametrize("body", [
    'result = pd.read_csv("unique.csv", index_col="boat").at["Kingfisher", "length_ft"]',
    'result = pd.read_csv("unique.csv", index_col="boat").at["Éider", "kind"]',
    'result = pd.read_csv("unique.csv").set_index("boat").loc["Teal", "length_ft"]',
    'b = pd.read_csv("unique.csv", index_col="boat")\nresult = b.at["Otter", "length_ft"] * 2',
    'result = pd.read_csv("boats.csv").groupby("kind")[["length_ft"]].sum().at["cruiser", "length_ft"]',
    'df = pd.read_csv("boats.csv")\nresult = pd.crosstab(df["kind"], df["mooring"], margins=True).loc["All", "home"]',
    'df = pd.read_csv("boats.csv")\nresult = pd.crosstab(df["kind"], df["mooring"]).loc["cruiser", "home"]',
])
def test_value_by_label_matches_pandas(body: str, data: Path) -> None:
    source = HEAD + body + "\n"
    assert not _todos(source, data), convert(source, data_dir=str(data)).converted_text
    differential(source, data_dir=str(data))


@pytest.mark.parametrize("body", [
    'result = pd.read_csv("boats.csv", index_col="boat").at["Nobody", "kind"]',  # KeyError
    'result = pd.read_csv("boats.csv", index_col="boat").at["Otter", "kind"]',  # a Series in pandas
])
def test_value_by_a_label_not_held_once_raises(body: str, data: Path) -> None:
    # pandas raises for a missing label and gives a Series for one several rows hold; the
    # conversion raises in both cases, never a value of one of the rows
    from support import run
    converted = convert(HEAD + body + "\n", data_dir=str(data)).converted_text
    with pytest.raises(Exception):
        run(converted)


@pytest.mark.parametrize("body,reason", [
    ('result = pd.read_csv("boats.csv", index_col=["boat", "kind"])', "index_col"),
    ('result = pd.read_csv("boats.csv", index_col="boat", usecols=["boat", "kind"])', "usecols"),
    ('result = pd.read_csv("boats.csv", index_col="boat").at[3, "kind"]', "another type"),
])
def test_labelled_table_todo(body: str, reason: str, data: Path) -> None:
    result = convert(HEAD + body + "\n", data_dir=str(data))
    assert any(reason in s.message for s in result.todos), [s.message for s in result.todos]


@pytest.mark.parametrize("body", [
    'b = pd.read_csv("boats.csv", index_col="boat")\nresult = b.index.is_unique',
    'b = pd.read_csv("unique.csv", index_col="boat")\nresult = b.index.is_unique',
    'b = pd.read_csv("boats.csv")\nb = b.set_index("kind")\nresult = b.index.is_unique',
    'result = pd.read_csv("boats.csv")["length_ft"].is_unique',  # NaN once: unique
    'b = pd.read_csv("boats.csv")\nresult = pd.concat([b, b])["mooring"].is_unique',
    'b = pd.read_csv("boats.csv", index_col="boat")\nresult = len(b)',
    'b = pd.read_csv("boats.csv")\nb = b.set_index("boat")\nresult = len(b[b["length_ft"] > 30])',
])
def test_labels_read_whole_match_pandas(body: str, data: Path) -> None:
    source = HEAD + body + "\n"
    result = differential(source, data_dir=str(data))
    assert not [s for s in result.todos if s.key in ("series.is_unique", "builtin.len")], \
        result.converted_text


@pytest.mark.parametrize("body", [
    'b = pd.read_csv("boats.csv", index_col="boat")\nresult = b.groupby("kind")["length_ft"].sum()',
    'b = pd.read_csv("boats.csv").set_index("boat")\nresult = b.groupby("kind")[["length_ft"]].max().reset_index()',
    'b = pd.read_csv("boats.csv", index_col="boat")\nresult = b.groupby(["kind", "mooring"])["length_ft"].mean()',
])
def test_groupby_of_a_labelled_table_matches_pandas(body: str, data: Path) -> None:
    # pandas leaves the labels out of what it aggregates: the groups of the columns taken
    source = HEAD + body + "\n"
    result = differential(source, data_dir=str(data))
    assert not result.todos, result.converted_text
