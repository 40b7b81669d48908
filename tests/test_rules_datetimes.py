"""Rule cases and differential checks for porter/rules/datetimes.py (the .dt accessor and
pd.to_datetime).

pandas is the reference implementation: every differential check runs the snippet with pandas
and its conversion with Polars and compares the variables they computed.
"""

from __future__ import annotations

import polars as pl
import pytest

from rule_checks import check_ports, check_todo, check_unchanged
from support import convert, differential

# A Monday and a Sunday (weekday numbering), a leap day twice (duplicates), the last day of a
# common and of a leap year (day of year 365 / 366), midnight, and both kinds of missing value.
STAMPS = ('["2024-01-01 00:00:00", "2024-01-07 23:59:59", "2024-02-29 12:30:45", None,'
          ' "2024-02-29 12:30:45", "2023-12-31 06:05:04", "2024-12-31 18:00:00", np.nan]')
HEAD = "import numpy as np\nimport pandas as pd\n"
FRAME = (HEAD + f'df = pd.DataFrame({{"raw": {STAMPS}}})\n'
         'df["t"] = pd.to_datetime(df["raw"], format="%Y-%m-%d %H:%M:%S")\n')


def _snippet(expr: str) -> str:
    """`expr` (written over `df`) on the test frame and on an empty frame of the same type."""
    on_empty = expr.replace("df[", "empty[")
    return (FRAME + 'empty = df[df["raw"] == "no such value"]\n'
            f'df["out"] = {expr}\nempty["out"] = {on_empty}\n'
            "result = df\nresult_empty = empty\n")


# -- ports ----------------------------------------------------------------------------------

PORTS = [
    pytest.param('df["t"].dt.year', 'pl.col("t").dt.year()', id="year"),
    pytest.param('df["t"].dt.month', 'pl.col("t").dt.month()', id="month"),
    pytest.param('df["t"].dt.day', 'pl.col("t").dt.day()', id="day"),
    pytest.param('df["t"].dt.hour', 'pl.col("t").dt.hour()', id="hour"),
    pytest.param('df["t"].dt.minute', 'pl.col("t").dt.minute()', id="minute"),
    pytest.param('df["t"].dt.second', 'pl.col("t").dt.second()', id="second"),
    pytest.param('df["t"].dt.quarter', 'pl.col("t").dt.quarter()', id="quarter"),
    pytest.param('df["t"].dt.weekday', 'pl.col("t").dt.weekday() - 1', id="weekday"),
    pytest.param('df["t"].dt.dayofweek', 'pl.col("t").dt.weekday() - 1', id="dayofweek"),
    pytest.param('df["t"].dt.day_of_week', 'pl.col("t").dt.weekday() - 1', id="day_of_week"),
    pytest.param('df["t"].dt.dayofyear', 'pl.col("t").dt.ordinal_day()', id="dayofyear"),
    pytest.param('df["t"].dt.day_of_year', 'pl.col("t").dt.ordinal_day()', id="day_of_year"),
    pytest.param('df["t"].dt.date', 'pl.col("t").dt.date()', id="date"),
    pytest.param('df["t"].dt.day_name()', 'pl.col("t").dt.to_string("%A")', id="day_name"),
    pytest.param('df["t"].dt.month_name()', 'pl.col("t").dt.to_string("%B")', id="month_name"),
    pytest.param('df["t"].dt.strftime("%Y-%m-%d")', 'pl.col("t").dt.to_string("%Y-%m-%d")',
                 id="strftime"),
    pytest.param('df["t"].dt.strftime("%H:%M:%S.%f")', 'dt.to_string("%H:%M:%S.%6f")',
                 id="strftime microseconds"),
    pytest.param('pd.to_datetime(df["raw"], format="%Y-%m-%d %H:%M:%S", errors="coerce")',
                 'pl.col("raw").str.to_datetime("%Y-%m-%d %H:%M:%S", strict=False)',
                 id="to_datetime errors=coerce"),
    pytest.param('pd.to_datetime(df["raw"], format="%d/%m/%Y")',
                 'pl.col("raw").str.to_datetime("%d/%m/%Y")', id="to_datetime format"),
    pytest.param('pd.to_datetime(df["raw"], format="%Y-%m-%d %H:%M:%S.%f")',
                 'str.to_datetime("%Y-%m-%d %H:%M:%S%.f")', id="to_datetime fraction"),
    pytest.param('pd.to_datetime(df["raw"])', 'pl.col("raw").str.to_datetime(time_unit="us")',
                 id="to_datetime without format"),
]


@pytest.mark.parametrize("before, expected", PORTS)
def test_ports(before: str, expected: str) -> None:
    check_ports(FRAME + f'df["out"] = {before}\n', expected)


TODOS = [
    pytest.param('pd.to_datetime("2024-01-05")', "pd.to_datetime", id="a scalar stays on pandas"),
    pytest.param('pd.to_datetime(["2024-01-05", "2024-01-06"])', "pd.to_datetime",
                 id="a list stays on pandas"),
    pytest.param('pd.to_datetime(df["raw"], format="mixed")', "pd.to_datetime", id="format mixed"),
    pytest.param('pd.to_datetime(df["raw"], format="%Y-%m-%d %H:%M:%S%z", errors="coerce")',
                 "pd.to_datetime", id="offsets"),
    pytest.param('pd.to_datetime(df["raw"], utc=True)', "pd.to_datetime", id="utc"),
    pytest.param('pd.to_datetime(df["n"])', "pd.to_datetime", id="numbers are epoch nanoseconds"),
    pytest.param('df["t"].dt.strftime("%c")', "series.dt.strftime", id="strftime locale format"),
    pytest.param('df["t"].dt.round("h")', "series.dt.round", id="round"),
    pytest.param('df["t"].dt.floor("h")', "series.dt.floor", id="floor"),
    pytest.param('df["t"].dt.ceil("h")', "series.dt.ceil", id="ceil"),
    pytest.param('df["t"].dt.normalize()', "series.dt.normalize", id="normalize"),
    pytest.param('df["t"].dt.tz_localize("UTC")', "series.dt.tz_localize", id="tz_localize"),
    pytest.param('(df["t"] - df["t"]).dt.days', "series.dt.days", id="timedelta days"),
    pytest.param('df["t"].dt.isocalendar()', "series.dt.isocalendar", id="isocalendar"),
    pytest.param('df["t"].dt.to_period("M")', "series.dt.to_period", id="to_period"),
]


@pytest.mark.parametrize("before, key", TODOS)
def test_todo(before: str, key: str) -> None:
    check_todo(FRAME + 'df["n"] = df["t"].dt.year\n' + f"result = {before}\n", key)


@pytest.mark.parametrize("before, key", [
    pytest.param('df["t"].dt.tz_convert("UTC")', "series.dt.tz_convert", id="tz_convert"),
    pytest.param('df["t"].dt.day_name(locale="de_DE.utf8")', "series.dt.day_name", id="locale"),
    pytest.param('pd.to_datetime(df["raw"], format="%Y-%m-%d", errors="ignore")',
                 "pd.to_datetime", id="errors ignore"),
])
def test_todo_not_run(before: str, key: str) -> None:
    # pandas raises here (a naive column, a locale the machine may lack, errors="ignore" is
    # gone in pandas 3): only the marker is checked
    text = convert(FRAME + f"result = {before}\n").converted_text
    assert f"# TODO(porter): {key}" in text, text


UNCHANGED = [
    pytest.param("import pandas as pd\nimport datetime\nyear = datetime.date(2024, 1, 5).year\n"
                 "text = datetime.date(2024, 1, 5).strftime('%Y')\n", id="datetime module"),
]


@pytest.mark.parametrize("before", UNCHANGED)
def test_unchanged(before: str) -> None:
    check_unchanged(before)


# -- differential: the .dt accessor -----------------------------------------------------------

SAME = [
    'df["t"].dt.year',
    'df["t"].dt.month',
    'df["t"].dt.day',
    'df["t"].dt.hour',
    'df["t"].dt.minute',
    'df["t"].dt.second',
    'df["t"].dt.quarter',
    'df["t"].dt.weekday',
    'df["t"].dt.dayofweek',
    'df["t"].dt.day_of_week',
    'df["t"].dt.dayofyear',
    'df["t"].dt.day_of_year',
    'df["t"].dt.date',
    'df["t"].dt.day_name()',
    'df["t"].dt.month_name()',
    'df["t"].dt.year * 100 + df["t"].dt.month',
    'df["t"].dt.strftime("%Y-%m-%d")',
    'df["t"].dt.strftime("%d/%m/%y %I:%M %p")',
    'df["t"].dt.strftime("%A %d %B %Y, day %j, week %U/%W")',
    'df["t"].dt.strftime("%b %a %H%%")',
    'df["t"].dt.strftime("%S.%f")',
]


@pytest.mark.parametrize("expr", SAME)
def test_matches_pandas(expr: str) -> None:
    # pandas is the reference implementation
    result = differential(_snippet(expr), "result", "result_empty")
    assert "TODO(porter)" not in result.converted_text, result.converted_text


def test_weekday_mask_matches_pandas() -> None:
    # pandas is the reference implementation: weekends are 5 and 6 (Monday is 0)
    differential(FRAME + 'result = df[df["t"].dt.weekday >= 5]\n')


# -- differential: pd.to_datetime -----------------------------------------------------------

PARSES = [
    pytest.param('["2024-01-05", "", "2024-13-01", "not a date", None, "2024-1-7", "2024-02-29",'
                 ' "2024-02-29", np.nan]', "%Y-%m-%d", "coerce", id="coerce bad values"),
    pytest.param('["05/03/2024", "31/12/2023", None, "Éclair", "5/3/2024"]', "%d/%m/%Y",
                 "coerce", id="day first"),
    pytest.param('["03/05/2024 07:05", "12/31/2023 23:59", None]', "%m/%d/%Y %H:%M", "raise",
                 id="month first with time"),
    pytest.param('["2024-01-05 10:11:12.5", "2024-01-05 10:11:12.123456", None]',
                 "%Y-%m-%d %H:%M:%S.%f", "raise", id="fraction of a second"),
    pytest.param('["05 Mar 2024", "31 December 2023", None]', "%d %b %Y", "coerce",
                 id="month names"),
    pytest.param('["01/02/24", "01/02/70", None]', "%d/%m/%y", "raise", id="two-digit years"),
    pytest.param('["20240305", "20231231", None]', "%Y%m%d", "raise", id="no separators"),
    pytest.param('["07:05 PM 2024-01-02", "12:05 AM 2024-01-02"]', "%I:%M %p %Y-%m-%d", "raise",
                 id="twelve-hour clock"),
]


@pytest.mark.parametrize("values, fmt, errors", PARSES)
def test_to_datetime_matches_pandas(values: str, fmt: str, errors: str) -> None:
    # pandas is the reference implementation
    source = (HEAD + f'df = pd.DataFrame({{"raw": {values}}})\n'
              'empty = df[df["raw"] == "no such value"]\n'
              f'df["t"] = pd.to_datetime(df["raw"], format="{fmt}", errors="{errors}")\n'
              f'empty["t"] = pd.to_datetime(empty["raw"], format="{fmt}", errors="{errors}")\n'
              'df["month"] = df["t"].dt.month\n'
              "result = df\nresult_empty = empty\n")
    result = differential(source, "result", "result_empty")
    assert "TODO(porter)" not in result.converted_text, result.converted_text


def test_to_datetime_without_format_iso() -> None:
    # pandas is the reference implementation: ISO dates are read the same by both guesses
    result = differential(HEAD + 'df = pd.DataFrame({"raw": ["2024-01-05", None, "2023-12-31"]})\n'
                          'df["t"] = pd.to_datetime(df["raw"], errors="coerce")\nresult = df\n')
    site = next(s for s in result.sites if s.key == "pd.to_datetime")
    assert site.confidence == 0.7 and "month first" in site.message


def test_to_datetime_of_a_datetime_column_keeps_it() -> None:
    # pandas is the reference implementation
    result = differential(FRAME + 'df["u"] = pd.to_datetime(df["t"])\nresult = df\n')
    assert 'u=pl.col("t"))' in result.converted_text, result.converted_text


def test_to_datetime_lowers_confidence_where_a_difference_remains() -> None:
    def site(source: str):
        return next(s for s in convert(source).sites if s.key == "pd.to_datetime")

    strict = site(FRAME)
    assert strict.confidence == 0.95 and "NaT" in strict.message
    coerce = site(HEAD + 'df = pd.DataFrame({"raw": ["2024-01-05"]})\n'
                  'df["t"] = pd.to_datetime(df["raw"], format="%Y-%m-%d", errors="coerce")\n')
    assert coerce.confidence == 1.0
    assert site(HEAD + 'df = pd.DataFrame({"raw": ["01/02/24"]})\n'
                'df["t"] = pd.to_datetime(df["raw"], format="%d/%m/%y", errors="coerce")\n'
                ).confidence == 0.95


def test_each_call_of_a_chain_is_reported() -> None:
    source = (HEAD + 'df = pd.DataFrame({"raw": ["2024-01-05"]})\n'
              'df["y"] = pd.to_datetime(df["raw"], format="%Y-%m-%d").dt.year\n')
    keys = [s.key for s in convert(source).sites]
    assert "pd.to_datetime" in keys and "series.dt.year" in keys and "frame.getitem.column" in keys


@pytest.mark.xfail(strict=True, raises=AssertionError,
                   reason="documented caveat (confidence 0.7, D01): without a format pandas "
                   "reads 05/03/2024 month first, Polars guesses day first")
def test_known_difference_to_datetime_guess() -> None:
    differential(HEAD + 'df = pd.DataFrame({"raw": ["05/03/2024", "06/04/2024"]})\n'
                 'df["t"] = pd.to_datetime(df["raw"])\nresult = df\n')


@pytest.mark.xfail(strict=True, raises=pl.exceptions.InvalidOperationError,
                   reason="documented caveat (confidence 0.95): with errors='raise' "
                   "an empty string is NaT in pandas and an error in Polars")
def test_known_difference_to_datetime_empty_string() -> None:
    differential(HEAD + 'df = pd.DataFrame({"raw": ["2024-01-05", ""]})\n'
                 'df["t"] = pd.to_datetime(df["raw"], format="%Y-%m-%d")\nresult = df\n')
