"""Row labels after a filter or sort carried as a column, checked against pandas (the reference
implementation).

When pandas code reads the labels a filter or sort left (reset_index(), idxmax, loc by label,
`list(df.index)`), porter numbers the rows where their labels are still 0..n-1
(with_row_index) and keeps that number as pandas' unnamed index, so the rest stays Polars.
Frames that hold their index in columns (a groupby's keys, these labels) leave it out where
pandas does: drop_duplicates compares the other columns, describe describes them.
The data is an invented ferry line's crossing log; --data is given so porter knows the
columns.
"""

from __future__ import annotations

import pytest

from support import differential

LOG = ("boat,leg,cars,fare\nOrm,north,12,5.5\nSkarv,south,-3,4.0\nOrm,north,7,\n"
       "Lunde,east,0,6.25\n,south,9,3.0\nSkarv,north,15,5.5\nLunde,south,4,2.0\nÖrn,north,7,\n")


@pytest.fixture(autouse=True)
def crossings(tmp_path, monkeypatch):
    (tmp_path / "crossings.csv").write_text(LOG, encoding="utf-8")
    monkeypatch.chdir(tmp_path)


HEAD = 'import pandas as pd\ndf = pd.read_csv("crossings.csv")\n'


def keys(result) -> list[str]:
    return [site.key for site in result.sites if site.status == "todo"]


@pytest.mark.parametrize("body", [
    # a filter, a sort with ties, then the labels as a column
    'pos = df[df["cars"] > 0]\npos = pos.sort_values("fare", kind="stable")\n'
    'result = pos.reset_index()\n',
    # two filters in two statements, a new column between them
    'pos = df[df["cars"] > 0]\npos["double"] = pos["cars"] * 2\npos = pos[pos["leg"] != "east"]\n'
    'result = pos.reset_index()\n',
    # each group's label of its largest value, and the rows they label
    'pos = df[df["cars"] > 0]\nresult = pos.groupby("boat")["cars"].idxmax()\n',
    'pos = df[df["cars"] > 0]\nresult = pos.loc[pos.groupby("leg")["cars"].idxmin()].reset_index()\n',
    # the labels as a list
    'pos = df.sort_values(["leg", "cars"], kind="stable")\nresult = list(pos.index)\n',
    # head of a sorted frame, its labels written out
    'result = df.sort_values("cars", ascending=False).head(3).reset_index()\n',
])
def test_labels_after_filters_and_sorts_stay_polars(body: str) -> None:
    result = differential(HEAD + body, data_dir=".")
    assert "frame.labels" not in keys(result)
    assert ".to_pandas()" not in result.converted_text


@pytest.mark.parametrize("made", [
    'pos = df.dropna(subset=["boat"])\n',  # labels a filter left, carried
    'pos = df\n',  # labels 0..n-1
])
def test_a_label_kept_in_a_name_reads_its_row(made: str) -> None:
    # best = s.idxmax() then pos.loc[best, "boat"]: the row the label was read from
    result = differential(HEAD + made + 'best = pos["cars"].idxmax()\n'
                          'result = [best, pos.loc[best, "boat"]]\n', data_dir=".")
    assert keys(result) == []


def test_a_label_kept_in_a_name_after_its_column_changed_is_pandas_read() -> None:
    # the column the label was the largest of changed since: its row is not found again by
    # the largest value, so the read by label stays pandas' (with the labels set again)
    result = differential(HEAD + 'pos = df.dropna(subset=["boat"])\nbest = pos["cars"].idxmax()\n'
                          'pos["cars"] = -pos["cars"]\nresult = pos.loc[best, "boat"]\n',
                          data_dir=".")
    assert keys(result) == ["frame.loc"]
    assert 'set_index("index")' in result.converted_text


@pytest.mark.parametrize("body", [
    'result = pos.drop_duplicates()\n',
    'result = pos.drop_duplicates(keep="last")\n',
    'result = pos.drop_duplicates(ignore_index=True)\n',
    'result = pos.describe()\n',
    'result = pos[["cars"]].drop_duplicates().reset_index()\n',
])
@pytest.mark.parametrize("made", [
    # labels left by a filter, read later
    'pos = df[df["fare"].notna()]\nlabels = list(pos.index)\n',
    # a groupby's keys held as the index (numbers: describe must leave them out)
    'pos = df.assign(n=df["cars"] % 2).groupby("n").agg(cars=("cars", "max"), fare=("fare", "max"))\n',
])
def test_the_index_is_left_out_where_pandas_leaves_it_out(made: str, body: str) -> None:
    differential(HEAD + made + body, data_dir=".")


@pytest.mark.parametrize("body", [
    # the script's own functions read the labels of the frames they are given: those frames
    # are pandas' (pandas makes them), with --data too
    'pos = df[df["cars"] > 5]\ndef top(d):\n    return d["cars"].idxmax()\nresult = [top(pos), top(df)]\n',
    'pos = df[df["cars"] > 5]\ndef labels(d):\n    e = d[d["fare"] < 6]\n    return list(e.index)\n'
    'result = labels(pos)\n',
    'pos = df[df["cars"] > 5]\ndef inner(d):\n    return d.index.tolist()\n'
    'def outer(d):\n    return inner(d)\nresult = outer(pos)\n',
    'pos = df[df["cars"] > 5]\ndef show(d):\n    return d.index.tolist()\nx = pos.at[5, "boat"]\n'
    'result = [show(pos), x]\n',
])
def test_labels_read_inside_the_scripts_own_functions(body: str) -> None:
    differential(HEAD + body, data_dir=".")


def test_labels_read_in_the_keys_of_a_statement_kept_on_pandas() -> None:
    # df.loc[pos.index, "c"] = ... stays pandas; pos, which carries its labels as a column, is
    # handed to pandas in the key with them as its index (it was left a LazyFrame: a crash)
    differential(HEAD + 'pos = df[df["cars"] > 5]\ndf["heavy"] = False\n'
                 'df.loc[pos.index, "heavy"] = True\nresult = df\n', data_dir=".")


def test_pandas_nullable_types_of_a_frame_carrying_labels() -> None:
    # columns read as pandas' nullable types keep <NA> in tolist() and their dtype when handed
    # over, on a frame carrying its labels (they came back with nan, as float64 and object)
    with open("checks.csv", "w", encoding="utf-8") as out:
        out.write("boat,ok,crew\nOrm,True,3\nSkarv,,\nLunde,False,4\nÖrn,,2\n")
    differential('import pandas as pd\n'
                 'df = pd.read_csv("checks.csv", dtype={"ok": "boolean", "crew": "Int64"})\n'
                 'pos = df[df["boat"] != "Orm"]\nlabels = list(pos.index)\n'
                 'result = [pos["ok"].tolist(), pos["crew"].tolist(), str(pos["ok"].dtype),\n'
                 '          pos.set_index("boat")["crew"].to_dict()]\n', data_dir=".")


@pytest.mark.parametrize("body", [
    # a groupby with its keys as columns numbers its rows 0..n-1 in key order; a sort keeps them
    'per = df.groupby(["leg", "boat"], as_index=False)["cars"].sum()\nper["half"] = per["cars"] / 2\n'
    'per = per.sort_values(["half", "boat"], ascending=[False, True])\n'
    'best = per["cars"].idxmax()\nresult = [best, per.loc[best, "boat"], per.loc[per["cars"].idxmin(), "leg"]]\n',
    'per = df.groupby("leg", as_index=False).agg(cars=("cars", "sum"), fare=("fare", "mean"))\n'
    'per = per.sort_values("fare", ascending=False)\nresult = per.reset_index()\n',
])
def test_labels_of_a_grouped_frame_after_a_sort_stay_polars(body: str) -> None:
    # the grouped frame's nullable integer columns are not followed, which kept the labels on
    # pandas where the script cannot make nullable integers at all
    result = differential(HEAD + body, data_dir=".")
    assert "frame.labels" not in keys(result)
    assert ".to_pandas()" not in result.converted_text


CHAINS = {
    "read and sorted in one statement": (
        'left = pd.read_csv("crossings.csv").sort_values("cars", ascending=False)\n'
        'result = left.reset_index()\n'),
    "read, filtered and sorted": (
        'left = pd.read_csv("crossings.csv")[lambda d: d["cars"] > 0].sort_values("fare")\n'
        'result = left.reset_index()\n'),
    "the label of the largest": (
        'left = pd.read_csv("crossings.csv").sort_values("boat")\n'
        'result = left.loc[left["cars"].idxmax(), "boat"]\n'),
}


@pytest.mark.parametrize("with_data", [True, False], ids=["with --data", "without --data"])
@pytest.mark.parametrize("body", list(CHAINS.values()), ids=list(CHAINS))
def test_labels_of_a_frame_read_and_reordered_in_one_chain(body: str, with_data: bool) -> None:
    # the labels are numbered where the chain starts (with --data), or pandas makes the frame
    # (without: the columns are not known); the hand-over had read them as 0..n-1 again
    differential('import pandas as pd\n' + body, **({"data_dir": "."} if with_data else {}))
