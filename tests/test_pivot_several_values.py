"""pivot_table of several value columns with a columns key (pandas labels the columns by two
levels: the value column, then the key's value), checked against pandas (the reference
implementation).

Polars' pivot of several values names the columns "<value>_<key value>"; porter keeps the
value columns with the table, so pv["minutes"] is the table of that value's columns, and the
table handed to pandas gets its two levels back. The data is an invented lake rowing club's
boathouse book: a crew written twice, a session left blank, minutes not signed (missing), a
crew that never rowed in the evening, an accented crew name.
"""

from __future__ import annotations

import pytest

from support import convert, differential


@pytest.fixture(autouse=True)
def bookings(tmp_path, monkeypatch):
    (tmp_path / "bookings.csv").write_text(
        "booking,crew,session,minutes,seats\n"
        "B1,Juniors,am,60,2\nB2,Masters,pm,45.5,4\nB3,Juniors,pm,,1\nB4,Élan,am,90,8\n"
        "B5,Masters,pm,30,4\nB6,Juniors,,75,2\nB7,Masters,eve,120,4\nB8,Élan,am,,8\n"
        "B9,,am,60,1\nB1,Juniors,am,60,2\n",
        encoding="utf-8")
    monkeypatch.chdir(tmp_path)


HEAD = 'import pandas as pd\nbook = pd.read_csv("bookings.csv")\n'
PIVOT = ('pv = book.pivot_table(index=["crew"], columns=["session"], '
         'values=["minutes", "booking"], aggfunc={"minutes": "sum", "booking": "count"}, '
         'fill_value=0)\n')


@pytest.mark.parametrize("body", [
    PIVOT + 'result = pv["minutes"].reset_index().rename_axis(columns=None)',
    PIVOT + 'result = pv["booking"]',
    PIVOT + 'result = pv["minutes"].loc["Juniors"].sum()',
    'pv = book.pivot_table(index="crew", columns="session", values=["seats", "minutes"], '
    'aggfunc="sum", fill_value=-1)\nresult = pv["seats"].reset_index()',
    'pv = book.pivot_table(index=["crew"], columns="session", values=["seats", "booking"], '
    'aggfunc="count", fill_value=0)\nresult = pv["booking"]',
])
def test_pivot_of_several_values_matches_pandas(body: str) -> None:
    result = differential(HEAD + body + "\n", data_dir=".")
    assert not result.todos, result.converted_text
    assert ".pivot(" in result.converted_text


@pytest.mark.parametrize("body", [
    # the whole table read otherwise: pandas' two levels of column labels
    PIVOT + 'result = pv.reset_index()',
    PIVOT + 'result = pv.sum()',
    PIVOT + 'result = pv[("minutes", "am")]',
    PIVOT + 'result = pv.columns.tolist()',
])
def test_the_whole_table_gets_pandas_two_levels(body: str) -> None:
    differential(HEAD + body + "\n", data_dir=".")


@pytest.mark.parametrize("body", [
    # a mean may be missing (pandas then drops rows and columns), no fill_value, a key of numbers
    'pv = book.pivot_table(index="crew", columns="session", values=["seats", "minutes"], '
    'aggfunc="mean", fill_value=0)\nresult = pv["seats"]',
    'pv = book.pivot_table(index="crew", columns="session", values=["seats", "minutes"], '
    'aggfunc="sum")\nresult = pv["seats"]',
    'pv = book.pivot_table(index="crew", columns="seats", values=["booking", "minutes"], '
    'aggfunc="count", fill_value=0)\nresult = pv["minutes"]',
])
def test_other_pivots_stay_pandas(body: str) -> None:
    result = convert(HEAD + body + "\n", data_dir=".")
    assert "frame.pivot_table" in [s.key for s in result.todos], result.converted_text
    differential(HEAD + body + "\n", data_dir=".")
