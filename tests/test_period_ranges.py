"""pd.period_range (porter/rules/datetimes.py, period_range): the periods made by pandas at
convert time and written as their text, as dt.to_period() columns are held in a frame.

pandas 3.1 is the reference: each case runs the script with pandas and as converted, and the
printed text and the files written must be the same (test_period_columns_in_frames.py does
the same for dt.to_period columns). The scenario: a seed bank's deposits, counted per month,
quarter, year, week and day against a calendar made with pd.period_range, so that periods
without a deposit show up.
"""

from __future__ import annotations

from pathlib import Path

import pandas as pd
import pytest

from support import convert, differential, same_text

# a missing date, New Year, a leap day, a Sunday/Monday week boundary, a deposit before and
# one after the calendar, two on one day, rows out of order, accents
DEPOSITS = {
    "deposits.csv": (
        "stored,vault,packets\n"
        "2024-03-05 10:00,Nord,2\n"
        ",Sud,1\n"
        "2023-12-31 23:30,Nord,3\n"
        "2024-02-29 09:15,Écluse,4\n"
        "2024-01-01 00:00,,5\n"
        "2024-03-10 18:00,Sud,1\n"
        "2024-03-11 08:00,Nord,2\n"
        "2024-03-11 08:00,Sud,7\n"
        "2022-06-15 12:00,Nord,9\n"
        "2026-01-02 12:00,Sud,6\n"
    ),
}

HEAD = (
    "import pandas as pd\n"
    'log = pd.read_csv("deposits.csv")\n'
    'log["stored"] = pd.to_datetime(log["stored"], format="%Y-%m-%d %H:%M")\n'
)

# (freq of the range, of dt.to_period, start, end or periods) for each kind of period
KINDS = [
    pytest.param("M", "M", '"2023-11", "2024-04"', id="months"),
    pytest.param("Q", "Q", '"2023Q3", periods=4', id="quarters"),
    pytest.param("Q-DEC", "Q", '"2023-10-15", "2024-06-01"', id="quarters Q-DEC from dates"),
    pytest.param("Y", "Y", '"2022", "2026"', id="years"),
    pytest.param("Y-DEC", "Y", 'end="2025", periods=3', id="years Y-DEC from the end"),
    pytest.param("W", "W", '"2024-02-25", "2024-03-17"', id="weeks from a Sunday"),
    pytest.param("W-SUN", "W", '"2024-02-26", periods=4', id="weeks W-SUN from a Monday"),
    pytest.param("D", "D", '"2024-02-27", "2024-03-12"', id="days"),
    pytest.param("D", "D", '"2023-12-01", periods=120', id="many days: Polars makes the text"),
    pytest.param("M", "M", '"2020-01", periods=80', id="many months: Polars makes the text"),
    pytest.param("W", "W", '"2023-01-01", periods=70', id="many weeks: Polars makes the text"),
    pytest.param("Q", "Q", '"2010Q1", periods=70', id="many quarters: Polars makes the text"),
    pytest.param("Y", "Y", '"1990", periods=40', id="many years: Polars makes the text"),
    pytest.param("h", "h", '"2024-03-11 06:00", periods=30', id="hours"),
]


@pytest.fixture()
def folder(tmp_path: Path) -> Path:
    return tmp_path


@pytest.mark.parametrize("freq, to, bounds", KINDS)
def test_a_calendar_of_periods_merged_with_to_period_counts(freq, to, bounds, folder):
    result = same_text(HEAD + (
        f'log["period"] = log["stored"].dt.to_period("{to}")\n'
        'per = log.groupby("period", as_index=False)["packets"].sum()\n'
        f'calendar = pd.DataFrame({{"period": pd.period_range({bounds}, freq="{freq}")}})\n'
        'calendar.to_csv("calendar.csv", index=False)\n'
        'full = calendar.merge(per, on="period", how="left")\n'
        'full["packets"] = full["packets"].fillna(0).astype(int)\n'
        'full.to_csv("full.csv", index=False)\n'
        'print(full.dtypes)\n'
        'inner = per.merge(calendar, on="period", how="inner")\n'
        'inner.to_csv("inner.csv", index=False)\n'
        'outer = calendar.merge(per, on="period", how="outer")\n'
        'outer.to_csv("outer.csv", index=False)\n'
        'print(len(full), len(inner), len(outer))\n'
    ), folder, DEPOSITS)
    assert not result.todos, result.converted_text
    assert "pd.period_range" not in result.converted_text
    assert "to_pandas" not in result.converted_text.replace(".to_pandas().astype({", "")


@pytest.mark.parametrize("freq, to, bounds", KINDS)
def test_the_periods_text_is_pandas_text(freq, to, bounds):
    """astype(str) and two strftime formats (pandas' %q and %j too), against pandas' values."""
    rng = f"pd.period_range({bounds}, freq=\"{freq}\")"
    result = differential(
        "import pandas as pd\n"
        f'result = pd.DataFrame({{"p": {rng}.astype(str),\n'
        f'                       "iso": {rng}.strftime("%Y-%m-%d %H:%M"),\n'
        f'                       "q": {rng}.strftime("%Y Q%q %j"), "k": "é", "n": 0}})\n')
    assert not result.todos, result.converted_text


def test_the_texts_of_each_kind_as_measured():
    """pandas 3.1's text of one period of each kind, as this module relies on."""
    texts = {f: str(pd.period_range("2024-01-01", periods=1, freq=f)[0])
             for f in ("M", "Q", "Y", "D", "W", "h", "min")}
    assert texts == {"M": "2024-01", "Q": "2024Q1", "Y": "2024", "D": "2024-01-01",
                     "W": "2024-01-01/2024-01-07", "h": "2024-01-01 00:00",
                     "min": "2024-01-01 00:00"}


def test_a_range_bound_to_a_name_and_several_columns(folder):
    result = same_text(HEAD + (
        'months = pd.period_range("2023-12", periods=5, freq="M")\n'
        'calendar = pd.DataFrame({"month": months, "label": months.strftime("%b %Y"),\n'
        '                         "text": months.astype(str), "open": True, "n": 0})\n'
        'log["month"] = log["stored"].dt.to_period("M")\n'
        'both = log.merge(calendar, on="month", how="inner").sort_values(["month", "packets"])\n'
        'both.to_csv("both.csv", index=False)\n'
        'print(both.dtypes)\n'
    ), folder, DEPOSITS)
    assert not result.todos, result.converted_text


def test_a_loop_over_periods_writes_one_file_each(folder):
    result = same_text(HEAD + (
        'log["quarter"] = log["stored"].dt.to_period("Q")\n'
        'for q in pd.period_range("2023Q4", "2024Q2", freq="Q"):\n'
        '    print("quarter", q, str(q), f"{q}|{q!s}")\n'
        'for label in pd.period_range("2024-02-26", periods=3, freq="W").strftime("%d.%m"):\n'
        '    print(label.upper(), label[:2])\n'
        'for text in pd.period_range("2024-01", periods=3, freq="M").astype(str):\n'
        '    print(text.replace("-", "/"))\n'
        'per = log.groupby("quarter", as_index=False)["packets"].sum()\n'
        'per.to_csv("per.csv", index=False)\n'
    ), folder, DEPOSITS)
    assert not result.todos, result.converted_text
    assert "pd.period_range" not in result.converted_text


def test_an_inline_range_is_reported_where_it_is_written(folder):
    (folder / "deposits.csv").write_text(DEPOSITS["deposits.csv"])
    result = convert(HEAD + 'cal = pd.DataFrame({"m": pd.period_range("2024-01", periods=3,\n'
                            '                                         freq="M"), "n": 0})\n',
                     data_dir=str(folder))
    sites = [s for s in result.sites if s.key == "pd.period_range"]
    assert [(s.status, s.line) for s in sites] == [("converted", 4)], result.sites


def test_strftime_with_month_names_is_lowered_for_the_locale():
    result = convert('import pandas as pd\n'
                     'cal = pd.DataFrame({"m": pd.period_range("2024-01", periods=3, freq="M")'
                     '.strftime("%B %Y")})\n')
    site = next(s for s in result.sites if s.key == "periods.range.strftime")
    assert site.confidence == 0.95 and "locale" in site.message


@pytest.mark.parametrize("body, reason", [
    # frequencies porter writes no text for, and the one pandas 3 refuses
    ('cal = pd.DataFrame({"p": pd.period_range("2024-01", periods=3, freq="2M")})',
     "periods of period[2M]"),
    ('cal = pd.DataFrame({"p": pd.period_range("2024-01", periods=3, freq="Q-MAR")})',
     "periods of period[Q-MAR]"),
    ('cal = pd.DataFrame({"p": pd.period_range("2024-01-01", periods=3, freq="W-MON")})',
     "periods of period[W-MON]"),
    ('cal = pd.DataFrame({"p": pd.period_range("2024", periods=3, freq="BA")})',
     "pandas raises here"),
    ('cal = pd.DataFrame({"p": pd.period_range("2024-03", "2024-01", freq="M")})',
     "an empty range"),
    ('cal = pd.DataFrame({"p": pd.period_range("2024-01", "2024-03", periods=3, freq="M")})',
     "exactly two of start, end and periods"),
    ('first = str(log["stored"].min())[:7]\n'
     'cal = pd.DataFrame({"p": pd.period_range(first, periods=3, freq="M")})',
     "computed at run time"),
    ('cal = pd.DataFrame({"p": pd.period_range("0999-11", periods=3, freq="M")})',
     "years outside 1000-9999"),
    # uses of pandas' PeriodIndex porter does not port
    ('rng = pd.period_range("2024-01", periods=3, freq="M")\n'
     'cal = pd.DataFrame({"p": rng})\nn = len(rng)', "used otherwise"),
    ('cal = list(pd.period_range("2024-01", periods=3, freq="M"))', "used otherwise"),
    ('rng = pd.period_range("2024-01", periods=3, freq="M")\n'
     'log["p"] = log["stored"].dt.to_period("M")\ncal = log[log["p"].isin(rng)]',
     "used otherwise"),
    ('log["p"] = log["stored"].dt.to_period("M")\n'
     'cal = log[log["p"].isin(pd.period_range("2024-01", periods=3, freq="M"))]\n'
     'for m in pd.period_range("2024-01", periods=3, freq="M"):\n    print(m)',
     "used otherwise"),
    ('rng = pd.period_range("2024-01", periods=3, freq="M")\n'
     'cal = pd.DataFrame({"p": rng})\nfor p in rng:\n    print(p.month)', "used otherwise"),
    ('cal = pd.DataFrame({"p": pd.period_range("2024-01", periods=3, freq="M")}, index=[1, 2, 3])',
     "used otherwise"),
    ('cal = pd.DataFrame({"p": pd.period_range("2024-01", periods=3, freq="M").astype("int")})',
     "used otherwise"),
    ('cal = pd.DataFrame({"p": pd.period_range("2024-01", periods=3, freq="M", name="m")})',
     "argument name"),
])
def test_period_ranges_porter_does_not_port_stay_todos(body, reason, folder):
    (folder / "deposits.csv").write_text(DEPOSITS["deposits.csv"])
    result = convert(HEAD + body + "\n", data_dir=str(folder))
    assert "TODO(porter): pd.period_range" in result.converted_text, result.converted_text
    assert reason in result.converted_text.replace("\n#   ", " "), result.converted_text


@pytest.mark.parametrize("body", [
    'rng = pd.period_range("2024-01", periods=3, freq="M")\ncal = pd.DataFrame({"p": rng})\n'
    'print(len(rng))\nprint(cal.dtypes)\n',
    'rng = pd.period_range("2024-01", periods=3, freq="M")\ncal = pd.DataFrame({"p": rng})\n'
    'for p in rng:\n    print(p.month)\n',
])
def test_what_stays_pandas_still_runs_as_pandas(body, folder):
    same_text(HEAD + body, folder, DEPOSITS)


@pytest.mark.parametrize("freq, to, bounds", [
    pytest.param("M", "M", '"2023-12", "2024-03"', id="months"),
    pytest.param("Q", "Q", '"2023Q4", periods=3', id="quarters"),
    pytest.param("W", "W", '"2024-02-26", periods=3', id="weeks"),
    pytest.param("D", "D", '"2024-02-28", "2024-03-12"', id="days"),
    pytest.param("Y", "Y", '"2022", "2026"', id="years"),
])
def test_a_loop_over_periods_compared_with_a_period_column(freq, to, bounds, folder):
    """The loop runs over pandas' own Periods (no data); a column of periods of the same
    frequency compared with each is compared as text: ==, != (a missing period is unequal),
    <, >=, the period on either side; other uses of the period stay as written."""
    result = same_text(HEAD + (
        f'log["p"] = log["stored"].dt.to_period("{to}")\n'
        f'for q in pd.period_range({bounds}, freq="{freq}"):\n'
        '    sub = log[log["p"] == q]\n'
        '    later = log[q < log["p"]]\n'
        '    other = log[log["p"] != q]\n'
        '    upto = log[log["p"] <= q]\n'
        '    print(q, q.start_time, len(sub), len(later), len(other), len(upto),\n'
        '          sub["packets"].sum())\n'
        '    other.to_csv(f"other_{q}.csv".replace("/", "_"), index=False)\n'
    ), folder, DEPOSITS)
    assert not result.todos, result.converted_text
    assert 'pl.col("p") == str(q)' in result.converted_text


@pytest.mark.parametrize("use", [
    # a column of periods of another frequency: pandas compares Periods (never equal), or
    # reads the text as a period of the column's frequency
    'log[log["p"] == q]',
    # a column of text: a Period never equals a text in pandas
    'log[log["p"].astype(str) == q]',
    'log[log["vault"] == q]',
])
def test_a_loop_period_compared_otherwise_keeps_pandas_answer(use, folder):
    result = same_text(HEAD + (
        'log["p"] = log["stored"].dt.to_period("Q")\n'
        'for q in pd.period_range("2023-12", "2024-03", freq="M"):\n'
        f'    sub = {use}\n'
        '    print(q, len(sub))\n'
    ), folder, DEPOSITS)
    assert "pd.period_range" in result.converted_text


@pytest.mark.parametrize("freq, bounds", [
    pytest.param("M", '"2024-01", "2024-03"', id="months"),
    pytest.param("Q", '"2023Q4", periods=2', id="quarters"),
    pytest.param("W", '"2024-02-26", periods=2', id="weeks"),
    pytest.param("D", '"2024-02-27", periods=40', id="many days"),
    pytest.param("Y", '"2024", periods=1', id="a year"),
])
def test_a_period_column_in_a_range(freq, bounds, folder):
    """isin of a range of the same frequency: the periods' texts; a missing period is in none."""
    result = same_text(HEAD + (
        f'log["p"] = log["stored"].dt.to_period("{freq}")\n'
        f'kept = log[log["p"].isin(pd.period_range({bounds}, freq="{freq}"))]\n'
        'kept.to_csv("kept.csv", index=False)\n'
        f'log["out"] = ~log["p"].isin(pd.period_range({bounds}, freq="{freq}"))\n'
        'log.to_csv("all.csv", index=False)\n'
        'print(len(kept), log["out"].sum())\n'
    ), folder, DEPOSITS)
    assert not result.todos, result.converted_text
    assert "pd.period_range" not in result.converted_text


@pytest.mark.parametrize("use", [
    # pandas: a period never equals a text, nor a period of another frequency (all False)
    'log[log["p"].isin(["2024-01", "2024-03"])]',
    'log[log["p"].isin(pd.period_range("2024Q1", periods=2, freq="Q"))]',
    # a range compared with timestamps: pandas' own answer (a text column raises in pandas)
    'log[log["stored"].isin(pd.period_range("2024-01", periods=3, freq="M"))]',
])
def test_isin_porter_does_not_port_keeps_pandas_answer(use, folder):
    result = same_text(HEAD + (
        'log["p"] = log["stored"].dt.to_period("M")\n'
        f'kept = {use}\n'
        'kept.to_csv("kept.csv", index=False)\n'
        'print(len(kept))\n'
    ), folder, DEPOSITS)
    assert result.todos, result.converted_text
