"""pivot_table(margins=True): the total column and row pandas adds to a pivoted table, checked
against pandas (the reference implementation).

pandas computes the totals over the rows where neither key nor the value is missing, puts the
total column and the total row last, fills a column without a total with fill_value, keeps a
row without one missing (its column float), and raises when a key already holds the margins'
name. The data is an invented lighthouse keepers' log of lamp oil: a missing keeper, a missing
month, a missing litre count, a keeper whose only entry has no litres, accents, an int month
key and a float one.
"""

from __future__ import annotations

from pathlib import Path

import pytest

from support import convert, differential, run

OIL_CSV = """\
station,keeper,month,litres,wicks,gallons
Skerry,Ailsa,3,12,2,2.5
Skerry,Ailsa,3,8,1,
Skerry,Bràn,4,5,1,1.0
Holm,Bràn,3,7,0,1.5
Holm,,4,9,3,2.0
Holm,Ailsa,,4,1,0.5
Ness,Éamon,5,3,2,
Ness,Éamon,4,6,1,1.25
Ness,Ùna,5,2,0,
"""

HEAD = 'import pandas as pd\nlog = pd.read_csv("oil.csv")\n'


@pytest.fixture
def data(tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> Path:
    (tmp_path / "oil.csv").write_text(OIL_CSV, encoding="utf-8")
    monkeypatch.chdir(tmp_path)
    return tmp_path


def _todos(source: str, data: Path) -> list[str]:
    return [s.key for s in convert(source, data_dir=str(data)).todos]


PIVOTS = [
    # whole numbers summed, a missing combination 0; the month key has a missing value (float)
    'result = log.pivot_table(index="keeper", columns="month", values="litres", aggfunc="sum", '
    'fill_value=0, margins=True)',
    # an int key: the new columns are pandas' integer labels and the text "All"
    'result = log.pivot_table(index="keeper", columns="station", values="wicks", aggfunc="sum", '
    'fill_value=0, margins=True)',
    'result = log.pivot_table(index="station", columns="wicks", values="litres", aggfunc="max", '
    'fill_value=-1, margins=True)',
    # without fill_value: a missing combination makes the cells float
    'result = log.pivot_table(index="keeper", columns="station", values="litres", aggfunc="sum", '
    'margins=True)',
    'result = log.pivot_table(index="keeper", columns="station", values="litres", aggfunc="min", '
    'margins=True)',
    # means are floats; the default aggfunc is the mean
    'result = log.pivot_table(index="station", columns="keeper", values="wicks", margins=True)',
    'result = log.pivot_table(index="station", columns="keeper", values="litres", aggfunc="mean", '
    'fill_value=0, margins=True, margins_name="Total")',
    'result = log.pivot_table(index="keeper", columns="station", values="litres", '
    'aggfunc="median", margins=True)',
    # counts without fill_value: the cells float, the total column whole numbers
    'result = log.pivot_table(index="keeper", columns="month", values="wicks", aggfunc="count", '
    'margins=True, margins_name="Σ")',
    # counts of a float column with missing values: Ùna's only gallons are missing, so her
    # total is missing (the column float) while her cells are 0
    'result = log.pivot_table(index="keeper", columns="station", values="gallons", '
    'aggfunc="count", fill_value=0, margins=True)',
    'result = log.pivot_table(index="keeper", columns="station", values="gallons", '
    'aggfunc="count", margins=True)',
    # month 5 has no gallons at all: its total is fill_value, or missing (the column float)
    'result = log.pivot_table(index="keeper", columns="month", values="gallons", '
    'aggfunc="count", fill_value=0, margins=True)',
    'result = log.pivot_table(index="keeper", columns="month", values="gallons", '
    'aggfunc="count", margins=True)',
    # no value at all: every row total missing, the grand total 0
    'e = log[log["gallons"].isna()]\n'
    'result = e.pivot_table(index="keeper", columns="station", values="gallons", '
    'aggfunc="count", fill_value=0, margins=True)',
    # no row left: the empty table pandas gives
    'result = log[log["litres"] > 100].pivot_table(index="keeper", columns="station", '
    'values="litres", aggfunc="sum", fill_value=0, margins=True)',
    # floats added as pandas adds them (tests/test_pivot_margins_of_floats.py writes the digits)
    'result = log.pivot_table(index="keeper", columns="station", values="gallons", '
    'aggfunc="sum", fill_value=0, margins=True)',
    # several text index keys: the total row holds the name, then ""
    'result = log.pivot_table(index=["station", "keeper"], columns="month", values="litres", '
    'aggfunc="sum", fill_value=0, margins=True)',
    # a filter before, and the table put back with reset_index
    'kept = log[log["litres"] > 4]\n'
    'result = kept.pivot_table(index="station", columns="month", values="litres", aggfunc="sum", '
    'fill_value=0, margins=True).rename_axis(columns=None).reset_index()',
]


@pytest.mark.parametrize("body", PIVOTS)
def test_margins_match_pandas(body: str, data: Path) -> None:
    source = HEAD + body + "\n"
    assert not _todos(source, data), convert(source, data_dir=str(data)).converted_text
    result = differential(source, data_dir=str(data))
    assert "pandas_pivot_margins" in result.converted_text


def test_margins_written_out_match_pandas(data: Path) -> None:
    source = HEAD + ('t = log.pivot_table(index="keeper", columns="month", values="litres", '
                     'aggfunc="sum", fill_value=0, margins=True)\n'
                     't.rename_axis(columns=None).reset_index().to_csv("out.csv", index=False)\n'
                     'result = open("out.csv", encoding="utf-8").read()\n')
    assert not _todos(source, data)
    differential(source, data_dir=str(data))


@pytest.mark.parametrize("body", [
    # a keeper already named like the margins
    'log["keeper"] = log["keeper"].fillna("All")\n'
    'result = log.pivot_table(index="keeper", columns="station", values="litres", aggfunc="sum", '
    'fill_value=0, margins=True)',
    'result = log.pivot_table(index="keeper", columns="station", values="litres", aggfunc="sum", '
    'fill_value=0, margins=True, margins_name="Skerry")',
])
def test_a_conflicting_margins_name_raises_as_in_pandas(body: str, data: Path) -> None:
    source = HEAD + body + "\n"
    with pytest.raises(ValueError, match="Conflicting name"):
        run(source)
    converted = convert(source, data_dir=str(data)).converted_text
    with pytest.raises(ValueError, match="Conflicting name"):
        run(converted)


@pytest.mark.parametrize("body,reason", [
    # pandas' median of each row and column is not computed here
    ('result = log.pivot_table(index="keeper", columns="station", values="gallons", '
     'aggfunc="median", fill_value=0, margins=True)', "median"),
    # the total row's label cannot go into an int key
    ('result = log.pivot_table(index="wicks", columns="station", values="litres", '
     'aggfunc="sum", fill_value=0, margins=True)', "text"),
    ('result = log.pivot_table(index=["station", "wicks"], columns="month", values="litres", '
     'aggfunc="sum", fill_value=0, margins=True)', "text"),
])
def test_margins_todo(body: str, reason: str, data: Path) -> None:
    result = convert(HEAD + body + "\n", data_dir=str(data))
    assert any(reason in s.message for s in result.todos), [s.message for s in result.todos]


@pytest.mark.parametrize("body", [
    # crosstab's margins too: a keeper or a station already named like them
    'log["keeper"] = log["keeper"].fillna("All")\n'
    'result = pd.crosstab(log["keeper"], log["station"], margins=True)',
    'log["station"] = log["station"].replace("Ness", "All")\n'
    'result = pd.crosstab(log["keeper"], log["station"], margins=True)',
    'result = pd.crosstab(log["keeper"], log["station"], margins=True, margins_name="Holm", '
    'normalize="index")',
])
def test_a_conflicting_crosstab_margins_name_raises_as_in_pandas(body: str, data: Path) -> None:
    source = HEAD + body + "\n"
    with pytest.raises(ValueError, match="Conflicting name"):
        run(source)
    result = convert(source, data_dir=str(data))
    assert not result.todos, result.converted_text
    with pytest.raises(ValueError, match="Conflicting name"):
        run(result.converted_text)


@pytest.mark.parametrize("body", [
    'result = pd.crosstab(log["keeper"], log["station"], margins=True)',
    'result = pd.crosstab(log["keeper"], log["month"], margins=True, margins_name="Total")',
    'result = pd.crosstab(log["keeper"], log["wicks"], margins=True, normalize="all")',
    'result = pd.crosstab(log["station"], log["keeper"], margins=True, normalize="index")',
    'result = pd.crosstab(log["station"], log["keeper"], margins=True, normalize="columns")',
    'e = log[log["litres"] > 100]\nresult = pd.crosstab(e["keeper"], e["station"], margins=True)',
])
def test_crosstab_margins_match_pandas(body: str, data: Path) -> None:
    source = HEAD + body + "\n"
    assert not _todos(source, data), convert(source, data_dir=str(data)).converted_text
    differential(source, data_dir=str(data))
