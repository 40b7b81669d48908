"""pivot_table(margins=True) of floats and of several index keys, crosstab(values=,
aggfunc=, margins=True), and the float sums of a pivot when the rows come sorted, checked
against pandas (the reference) to the last digit of the written text.

pandas adds the cells and each row's and column's total with its groupby: a compensated sum in
row order, or numpy's reduceat where the rows come sorted by the keys and the column holds no
missing value; the grand total with Series.sum (numpy's pairwise sum). The three orders end
in other digits on these hours (95.05 + 14.42 + ... is 401.53 one way, 401.53000000000003
another). The data is an invented ferry line's deck log: a missing hand, a missing route, a
missing hours value, a hand whose only hours are missing (her total missing), a route only
she sailed (its total missing: fill_value, or NaN), accents, repeated rows.
"""

from __future__ import annotations

from pathlib import Path

import pytest

from support import convert, same_text

LOG_CSV = """\
crossing,hand,route,deck,hours
c1,Ailsa,north,upper,95.05
c2,Ailsa,north,upper,14.42
c3,Ailsa,north,lower,94.86
c4,Ailsa,north,upper,31.18
c5,Ailsa,south,upper,42.33
c6,Ailsa,north,lower,82.77
c7,Ailsa,north,upper,40.92
c8,Bràn,south,lower,0.1
c9,Bràn,south,lower,0.2
c10,Bràn,north,upper,0.3
c11,,south,upper,5.5
c12,Éamon,,lower,2.25
c13,Éamon,south,lower,
c14,Ùna,east,upper,
c15,Bràn,south,lower,0.2
c16,Éamon,north,lower,72.48
c17,Éamon,north,lower,54.12
c18,Éamon,north,upper,96.17
"""

HEAD = 'import pandas as pd\nlog = pd.read_csv("log.csv")\n'
# the rows sorted by the keys, none missing: pandas adds with numpy's reduceat there
SORTED = 'log = log.dropna().sort_values(["hand", "route"], kind="stable")\n'
EMPTY = 'log = log[log["hours"] > 1000]\n'
WRITE = ('t.rename_axis(columns=None).reset_index().to_csv("out.csv", index=False)\n'
         'print(t.shape)\n')


def _check(body: str, tmp_path: Path) -> str:
    source = HEAD + body + WRITE
    result = same_text(source, tmp_path, {"log.csv": LOG_CSV})
    assert "TODO" not in result.converted_text, result.converted_text
    return result.converted_text


PIVOTS = [
    't = log.pivot_table(index=["hand"], columns=["route"], values="hours", aggfunc="sum", '
    'fill_value=0, margins=True, margins_name="total")\n',
    't = log.pivot_table(index="hand", columns="route", values="hours", aggfunc="sum", '
    'margins=True)\n',
    't = log.pivot_table(index="hand", columns="route", values="hours", aggfunc="mean", '
    'margins=True)\n',
    't = log.pivot_table(index="hand", columns="deck", values="hours", aggfunc="max", '
    'fill_value=-1, margins=True)\n',
    't = log.pivot_table(index="route", columns="hand", values="hours", aggfunc="min", '
    'margins=True, margins_name="Σ")\n',
    # several index keys: the total row holds the name in the first and "" in the other
    't = log.pivot_table(index=["hand", "deck"], columns="route", values="hours", '
    'aggfunc="sum", fill_value=0, margins=True)\n',
    't = log.pivot_table(index=["deck", "hand"], columns="route", values="hours", '
    'aggfunc="mean", margins=True)\n',
]


@pytest.mark.parametrize("body", PIVOTS)
def test_float_margins_write_pandas_digits(body: str, tmp_path: Path) -> None:
    converted = _check(body, tmp_path)
    assert "pandas_pivot_margins" in converted


@pytest.mark.parametrize("body", PIVOTS[:3] + PIVOTS[5:6])
def test_float_margins_of_rows_sorted_by_the_keys(body: str, tmp_path: Path) -> None:
    _check(SORTED + body, tmp_path)


@pytest.mark.parametrize("body", PIVOTS[:2] + PIVOTS[5:6])
def test_float_margins_of_no_rows(body: str, tmp_path: Path) -> None:
    _check(EMPTY + body, tmp_path)


@pytest.mark.parametrize("setup", ["", SORTED, 'log = log.sort_values("hand", kind="stable")\n'])
def test_pivot_float_sums_follow_the_order_of_the_rows(setup: str, tmp_path: Path) -> None:
    # no margins: the cells alone, added as pandas adds them for rows in this order
    _check(setup + 't = log.pivot_table(index="hand", columns="route", values="hours", '
           'aggfunc="sum", fill_value=0)\n', tmp_path)


CROSSTABS = [
    't = pd.crosstab(log["hand"], log["route"], values=log["hours"], aggfunc="sum", '
    'margins=True)\n',
    't = pd.crosstab(log["hand"], log["deck"], values=log["hours"], aggfunc="mean", '
    'margins=True, margins_name="Total")\n',
    't = pd.crosstab(log["route"], log["hand"], values=log["hours"], aggfunc="max", '
    'margins=True)\n',
]


@pytest.mark.parametrize("body", CROSSTABS)
@pytest.mark.parametrize("setup", ["", SORTED])
def test_crosstab_of_values_with_margins(body: str, setup: str, tmp_path: Path) -> None:
    converted = _check(setup + body, tmp_path)
    assert "pandas_pivot_margins" in converted


def test_crosstab_of_values_with_margins_on_no_rows(tmp_path: Path) -> None:
    _check(EMPTY + CROSSTABS[0], tmp_path)


def test_the_busiest_hand_read_back_from_the_margins(tmp_path: Path) -> None:
    # drop(index=) of the total row, idxmax of the total column, loc of the label it gave
    _check('t = log.pivot_table(index=["hand"], columns=["route"], values="hours", '
           'aggfunc="sum", fill_value=0, margins=True, margins_name="total")\n'
           'busiest = t.drop(index="total")["total"].idxmax()\n'
           'print("busiest:", busiest, t.loc[busiest, "total"])\n'
           'print(t.drop(index=["total", "Bràn"])["north"].sum())\n', tmp_path)


@pytest.mark.parametrize("body,reason", [
    # the total row's label cannot go into a number key
    ('t = log.pivot_table(index=["hand", "hours"], columns="route", values="crossing", '
     'aggfunc="count", margins=True)\n', "text"),
    ('t = log.pivot_table(index="hand", columns="route", values="hours", aggfunc="median", '
     'margins=True)\n', "median"),
    ('t = pd.crosstab(log["hand"], log["route"], values=log["hours"], aggfunc="median", '
     'margins=True)\n', "median"),
])
def test_margins_left_as_todo(body: str, reason: str, tmp_path: Path) -> None:
    (tmp_path / "log.csv").write_text(LOG_CSV, encoding="utf-8")
    result = convert(HEAD + body, data_dir=str(tmp_path))
    assert any(reason in s.message for s in result.todos), [s.message for s in result.todos]
