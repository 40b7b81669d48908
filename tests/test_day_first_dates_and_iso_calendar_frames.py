"""pd.to_datetime(col, dayfirst=True) without format=, several formats in one column, and the
frame s.dt.isocalendar() makes.

pandas is the reference implementation: every differential check runs the snippet with pandas
and its conversion with Polars and compares the variables they computed.
"""

from __future__ import annotations

import itertools
import re
import warnings

import pandas as pd
import polars as pl
import pytest

from support import convert, differential, run, same_text

HEAD = "import numpy as np\nimport pandas as pd\n"

# pandas 3.1 guesses ONE format from the first value that is not missing (day first where the
# value reads that way) and reads every value with it; the others are NaT (coerce) or an error
DAY_FIRST = [
    # 01/05/2024 is the 1st of May; 05/13/2024 does not fit %d/%m/%Y
    pytest.param('["01/05/2024", "13/01/2024", "05/13/2024", None, "", "NaT", "31/12/2023",'
                 ' "x", "02/30/2024", "29/02/2024", "ünï", "1/2/2024", " 3/4/2024"]',
                 "coerce", id="day first"),
    # a first value that does not read day first keeps pandas' month-first format
    pytest.param('["05/13/2024", "01/05/2024", "14/02/2024", None, "12/31/2024"]', "coerce",
                 id="month first from the first value"),
    # an ISO date is read day first too: 2024-01-05 is %Y-%d-%m, 2024-01-13 does not fit it
    pytest.param('["2024-01-05", "2024-01-13", "2024-12-11", None, "2024-05-01 10:00"]',
                 "coerce", id="ISO dates day first"),
    pytest.param('["2024-01-31", "2024-01-05", "2024-13-01", "nan"]', "coerce",
                 id="ISO dates month first from the first value"),
    pytest.param('["2024-13-05T07:05:09", "2024-01-05T07:05:09", "2024-05-01T00:00:00.5"]',
                 "coerce", id="ISO date-times"),
    pytest.param('["2024/01/05", "2024/13/01", "2024/12/12"]', "coerce", id="year first slashes"),
    pytest.param('["01.05.2024", "13.01.2024", "01/05/2024"]', "coerce",
                 id="dots"),
    pytest.param('["01/05/2024 10:30", "13/01/2024 23:59", "13/01/2024", None]', "coerce",
                 id="date and time"),
    pytest.param('["01/05/2024 10:30:15", "13/01/2024 23:59:59", "12/12/2024 00:00:00"]',
                 "coerce", id="date and time with seconds"),
    # names of months are read as without dayfirst
    pytest.param('["5 Jan 2024", "13 feb 2024", None, "Jan 5, 2024"]', "coerce",
                 id="month names"),
    # eight digits: 20240131 is %Y%m%d; 20240105 gets no format from pandas (dateutil)
    pytest.param('["20240131", "20240105", "20241301", None]', "coerce", id="compact"),
    # pandas' first value skips missing values and its texts for NaT
    pytest.param('[None, "", "NaT", "02/03/2024", "13/01/2024", "01/13/2024"]', "coerce",
                 id="first value after missing ones"),
    pytest.param('["01/05/2024", "13/01/2024", None, "", "NaT", "31/12/2023"]', "raise",
                 id="raise"),
    pytest.param('["2024-01-05", "2024-02-01", None]', "raise", id="ISO raise"),
    pytest.param('[" 01/05/2024", "  13/01/2024", "\\t2/3/2024 ", "13/01/2024"]', "coerce",
                 id="a blank before the first value"),
]


@pytest.mark.parametrize("values, errors", DAY_FIRST)
def test_day_first_follows_pandas_guess(values: str, errors: str) -> None:
    # pandas is the reference implementation
    source = (HEAD + f'df = pd.DataFrame({{"raw": {values}}})\n'
              f'df["t"] = pd.to_datetime(df["raw"], dayfirst=True, errors="{errors}")\n'
              'empty = df[df["raw"] == "no such value"].copy()\n'
              f'empty["t"] = pd.to_datetime(empty["raw"], dayfirst=True, errors="{errors}")\n'
              "result = df\nresult_empty = empty\n")
    result = differential(source)
    assert "TODO(porter)" not in result.converted_text, result.converted_text
    assert "pandas_to_datetime_dayfirst(" in result.converted_text


def test_day_first_false_and_with_a_format_read_as_without() -> None:
    # pandas is the reference implementation: dayfirst only changes the guess; an explicit
    # format is read as written
    source = (HEAD + 'df = pd.DataFrame({"raw": ["01/05/2024", "13/01/2024", None, "01/13/2024"]})\n'
              'df["a"] = pd.to_datetime(df["raw"], dayfirst=False, errors="coerce")\n'
              'df["b"] = pd.to_datetime(df["raw"], format="%m/%d/%Y", dayfirst=True, errors="coerce")\n'
              'df["c"] = pd.to_datetime(df["b"], dayfirst=True)\n'
              "result = df\n")
    result = differential(source)
    assert "TODO(porter)" not in result.converted_text, result.converted_text
    assert "pandas_to_datetime_dayfirst" not in result.converted_text


@pytest.mark.parametrize("values", [
    # 01/05/2024 makes the format day first, and 05/13/2024 does not fit it
    pytest.param('["01/05/2024", "05/13/2024"]', id="day first"),
    pytest.param('["2024-01-05", "2024-01-13"]', id="ISO day first"),
])
def test_day_first_raises_where_pandas_raises(values: str) -> None:
    # pandas is the reference implementation
    source = (HEAD + f'df = pd.DataFrame({{"raw": {values}}})\n'
              'df["t"] = pd.to_datetime(df["raw"], dayfirst=True)\nresult = df\n')
    with pytest.raises(ValueError):
        run(source)
    with pytest.raises(pl.exceptions.InvalidOperationError):
        run(convert(source).converted_text)["result"].collect()


def test_day_first_of_a_first_value_pandas_reads_value_by_value_is_a_todo() -> None:
    # pandas guesses no format for 20240105 day first: dateutil reads each value
    source = (HEAD + 'df = pd.DataFrame({"raw": ["20240105", "20240131"]})\n'
              'df["t"] = pd.to_datetime(df["raw"], dayfirst=True, errors="coerce")\n')
    assert "TODO(porter): pd.to_datetime" in convert(source).converted_text


def test_day_first_guesses_are_pandas_guesses() -> None:
    # pandas' guess_datetime_format(dayfirst=True) is the reference: for first values of every
    # listed format, the first format whose selection reads a real date is pandas' guess, and
    # eight digits that read day first get no guess
    from pandas.tseries.api import guess_datetime_format
    from porter.rules.datetimes import (
        DAYFIRST_UNGUESSED, GUESSED_FORMATS_DAYFIRST, guess_selection,
    )

    parts = {"%Y": ["2024", "1999", "0999", "1000"], "%m": ["01", "1", "12", "13", " 1"],
             "%d": ["05", "5", "31", "13", " 5", "00"], "%H": ["07", "7", "23", "24"],
             "%M": ["05", "5", "60"], "%S": ["09", "60"], "%f": ["5", "123456", "1234567"],
             "%b": ["Jan", "jan", "JUN", "May", "Sept"], "%B": ["January", "may", "June"]}
    selections = [(fmt, re.compile(guess_selection(fmt))) for fmt in GUESSED_FORMATS_DAYFIRST]
    unguessed = re.compile(guess_selection(DAYFIRST_UNGUESSED))

    def real(value: str, fmt: str) -> bool:
        return not pd.isna(pd.to_datetime(value, format=fmt, errors="coerce"))

    checked = 0
    for fmt in (*GUESSED_FORMATS_DAYFIRST, DAYFIRST_UNGUESSED):
        pieces = re.split(r"(%[a-zA-Z])", fmt)
        choices = [parts.get(p, [p, p + p] if p in (" ", "-", "/") else [p]) for p in pieces]
        for combo in itertools.islice(itertools.product(*choices), 3000):
            value = "".join(combo)
            with warnings.catch_warnings():
                warnings.simplefilter("ignore")
                guess = guess_datetime_format(value, dayfirst=True)
            if unguessed.search(value) and real(value, DAYFIRST_UNGUESSED):
                checked += 1
                assert guess is None, (value, guess)
                continue
            chosen = next((f for f, r in selections if r.search(value) and real(value, f)), None)
            if chosen is not None:
                checked += 1
                assert chosen == guess, (value, chosen, guess)
    assert checked > 1500


# -- several formats in one column -------------------------------------------------------------

MESSY = ('["05/01/2024", "2024-01-13", None, "", "NaT", "13/01/2024", "x", "2024-02-30",'
         ' "31/12/2023", "ünï", " 2024-03-01", "2024-3-1", "1/2/2024", "2024-02-29"]')


@pytest.mark.parametrize("combine", [
    pytest.param("first.fillna(second)", id="fillna"),
    pytest.param("first.combine_first(second)", id="combine_first"),
])
def test_two_coerced_parses_filled_one_from_the_other(combine: str) -> None:
    # pandas is the reference implementation: each format parses the values it fits, the
    # first one's missing values are taken from the second
    source = (HEAD + f'df = pd.DataFrame({{"raw": {MESSY}}})\n'
              'first = pd.to_datetime(df["raw"], format="%d/%m/%Y", errors="coerce")\n'
              'second = pd.to_datetime(df["raw"], format="%Y-%m-%d", errors="coerce")\n'
              f'df["t"] = {combine}\n'
              'df["u"] = pd.to_datetime(df["raw"], format="%d/%m/%Y", errors="coerce").fillna(\n'
              '    pd.to_datetime(df["raw"], format="%Y-%m-%d", errors="coerce"))\n'
              'empty = df[df["raw"] == "no such value"].copy()\n'
              'empty["t"] = pd.to_datetime(empty["raw"], format="%d/%m/%Y", errors="coerce").fillna(\n'
              '    pd.to_datetime(empty["raw"], format="%Y-%m-%d", errors="coerce"))\n'
              "result = df\nresult_empty = empty\n")
    result = differential(source, "result", "result_empty")
    assert "TODO(porter)" not in result.converted_text, result.converted_text


@pytest.mark.parametrize("fmt", ["mixed", "ISO8601"])
def test_mixed_and_iso8601_formats_stay_pandas(fmt: str) -> None:
    # pandas reads each value by itself (dateutil for "mixed"; its ISO 8601 parser, which
    # takes 2024/01/05, 2024-01, 20240105T1000 and time zones that change the dtype, for
    # "ISO8601"): no fixed list of Polars formats reads every value as it does
    source = (HEAD + f'df = pd.DataFrame({{"raw": {MESSY}}})\n'
              f'df["t"] = pd.to_datetime(df["raw"], format="{fmt}", errors="coerce")\n'
              "result = df\n")
    result = differential(source)
    assert "TODO(porter): pd.to_datetime" in result.converted_text
    assert any(s.key == "pd.to_datetime" and "not identical" in s.message for s in result.sites)


# -- the frame s.dt.isocalendar() makes --------------------------------------------------------

# the days around New Year (ISO week 1 of the next year, week 52/53 of the last), a leap day
# twice, a Sunday (day 7), a missing date in the middle, unsorted
ISO_DAYS = ('["2024-12-30", None, "2023-01-01", "2021-01-03", "2024-02-29", "2024-02-29",'
            ' "2020-12-31", "2026-01-01", "NaT"]')
ISO_FRAME = (HEAD + f'df = pd.DataFrame({{"raw": {ISO_DAYS}, "n": {list(range(9))}}})\n'
             'df["d"] = pd.to_datetime(df["raw"], format="%Y-%m-%d")\n'
             'empty = df[df["raw"] == "no such value"].reset_index(drop=True)\n')


@pytest.mark.parametrize("use", [
    pytest.param('df[["iy", "iw", "id"]] = df["d"].dt.isocalendar()\nresult = df\n'
                 'empty[["iy", "iw", "id"]] = empty["d"].dt.isocalendar()\nresult_empty = empty\n',
                 id="assigned to three columns"),
    pytest.param('iso = df["d"].dt.isocalendar()\ndf["w"] = iso["week"]\ndf["y"] = iso.year\n'
                 'df["wd"] = iso.day\nresult = df\nresult_empty = empty\n',
                 id="kept in a name"),
    pytest.param('result = df[["d", "n"]].join(df["d"].dt.isocalendar())\n'
                 'result_empty = empty[["d", "n"]].join(empty["d"].dt.isocalendar())\n',
                 id="joined"),
    pytest.param('iso = df["d"].dt.isocalendar()\nresult = iso.head(5)\n'
                 'result_empty = empty["d"].dt.isocalendar().head(5)\n',
                 id="used as a frame"),
    pytest.param('iso = df["d"].dt.isocalendar()\nresult = iso[["week", "day"]]\n'
                 'result_empty = empty["d"].dt.isocalendar()[["day", "year"]]\n',
                 id="a list of its columns"),
])
def test_isocalendar_frame_follows_pandas(use: str) -> None:
    # pandas is the reference implementation
    result = differential(ISO_FRAME + use, "result", "result_empty")
    assert "TODO(porter)" not in result.converted_text, result.converted_text
    assert any(s.key == "series.dt.isocalendar" and s.confidence == 0.95 for s in result.sites)


def test_isocalendar_frame_written_and_printed_as_pandas_does(tmp_path) -> None:
    # pandas is the reference implementation: nullable integers are written 52 and an empty
    # field, printed <NA>, and the types printed are pandas' own
    days = "day,k\n2024-12-30,1\n,2\n2023-01-01,3\n2021-01-03,4\n2024-02-29,5\n2020-12-31,6\n"
    same_text(HEAD + 'df = pd.read_csv("days.csv")\n'
              'df["d"] = pd.to_datetime(df["day"], format="%Y-%m-%d")\n'
              'df[["year", "week", "wd"]] = df["d"].dt.isocalendar()\n'
              'print(df.dtypes)\nprint(df["week"].tolist())\n'
              'df.to_csv("out.csv", index=False)\n'
              'iso = df["d"].dt.isocalendar()\nprint(iso)\nprint(iso.dtypes)\n'
              'iso.to_csv("whole.csv")\nprint(iso[iso["week"] >= 9])\n'
              'joined = df[["d", "k"]].join(df["d"].dt.isocalendar())\n'
              'joined.to_csv("joined.csv", index=False)\n',
              tmp_path, files={"days.csv": days})


def test_a_list_of_labels_of_extracted_parts_is_a_todo_not_an_internal_error() -> None:
    source = (HEAD + 'df = pd.DataFrame({"raw": ["2024-01", None]})\n'
              'parts = df["raw"].str.extract(r"(?P<y>\\d+)-(?P<m>\\d+)")\n'
              'result = parts[["y", "m"]]\n')
    result = differential(source)
    assert "TODO(porter): series.str.expand.getitem" in result.converted_text
    assert "internal error" not in result.converted_text


def test_day_first_reads_random_columns_as_pandas() -> None:
    # pandas is the reference implementation: random columns of tricky texts, read by the
    # function the conversion defines, wherever pandas guesses a format from the first value
    # (another first value is read by dateutil value by value: the documented 0.8 caveat)
    import random

    from pandas.tseries.api import guess_datetime_format
    from porter.rules.datetimes import GUESS_DAYFIRST_DEFINITION

    space: dict = {"pl": pl}
    exec(GUESS_DAYFIRST_DEFINITION, space)  # noqa: S102 - porter's own generated code
    read = space["pandas_to_datetime_dayfirst"]
    vocabulary = [
        "01/05/2024", "13/01/2024", "05/13/2024", "1/2/2024", " 3/4/2024", "3/4/2024 ",
        "31/12/2023", "29/02/2024", "29/02/2023", "2024-01-05", "2024-01-13", "2024-13-01",
        "2024-1-5", "2024-05-01 10:00", "2024-01-05 10:00:00", "2024-01-05T10:00:00",
        "2024-01-05T10:00:00.5", "2024/01/05", "2024/13/01", "20240131", "01.05.2024",
        "13.05.2024", "5 Jan 2024", "Jan 5, 2024", "01/05/2024 10:30", "13/01/2024 23:59",
        "01/05/2024 10:30:15", None, "", "NaT", "nan", "x", "ünï", "０1/05/2024", "2024-01-05 ",
    ]
    rng = random.Random(18)
    compared = 0
    for _ in range(120):
        values = [rng.choice(vocabulary) for _ in range(rng.randint(0, 5))]
        firsts = [v.strip() for v in values if v is not None and v not in ("", "NaT", "nan")]
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")
            if firsts and guess_datetime_format(firsts[0], dayfirst=True) is None:
                continue
        for coerce in (True, False):
            with warnings.catch_warnings():
                warnings.simplefilter("ignore")
                try:
                    parsed = pd.to_datetime(pd.Series(values, dtype=object), dayfirst=True,
                                            errors="coerce" if coerce else "raise")
                    expected: object = [None if pd.isna(v) else v.to_pydatetime() for v in parsed]
                except ValueError:
                    expected = "error"
            try:
                frame = pl.DataFrame({"raw": pl.Series(values, dtype=pl.String)})
                actual: object = frame.select(read(pl.col("raw"), coerce=coerce))["raw"].to_list()
            except pl.exceptions.InvalidOperationError:
                actual = "error"
            assert actual == expected, (values, coerce)
            compared += 1
    assert compared > 80


@pytest.mark.parametrize("with_data", [True, False])
@pytest.mark.parametrize("days", [
    pytest.param("01/05/2024\n13/01/2024\n\n31/12/2023\n", id="day first"),
    pytest.param("2024-01-05\n2024-12-11\n2024-03-02\n", id="ISO dates day first"),
    pytest.param("05/13/2024\n01/05/2024\n12/31/2024\n", id="month first from the first value"),
    pytest.param("13.01.2024\n01.05.2024\n", id="dots"),
])
def test_read_csv_day_first_follows_pandas(tmp_path, days: str, with_data: bool) -> None:
    # pandas is the reference implementation: read_csv guesses each parsed column's format
    # from its first value, day first
    lines = days.split("\n")
    text = "day,n\n" + "\n".join(f"{d},{i}" if d else f",{i}" for i, d in enumerate(lines[:-1])) + "\n"
    result = same_text(HEAD + 'df = pd.read_csv("days.csv", parse_dates=["day"], dayfirst=True)\n'
                       'print(df.dtypes)\ndf.to_csv("out.csv", index=False)\n',
                       tmp_path, files={"days.csv": text}, with_data=with_data)
    assert "TODO(porter)" not in result.converted_text, result.converted_text


def test_read_csv_day_first_keeps_text_that_does_not_fit_the_guess(tmp_path) -> None:
    # pandas is the reference implementation: 2024-01-05 day first is %Y-%d-%m, which
    # 2024-01-13 does not fit, so read_csv keeps the column as text (--data shows it)
    result = same_text(HEAD + 'df = pd.read_csv("days.csv", parse_dates=["day"], dayfirst=True)\n'
                       'print(df.dtypes)\ndf.to_csv("out.csv", index=False)\n',
                       tmp_path, files={"days.csv": "day,n\n2024-01-05,1\n2024-01-13,2\n,3\n"})
    assert "TODO(porter)" not in result.converted_text, result.converted_text


def test_isocalendar_frame_kept_while_its_dates_change() -> None:
    # pandas is the reference implementation: the frame keeps the dates it was made from
    # (porter has pandas compute it where it is bound once the frame's rows or dates change)
    source = (ISO_FRAME + 'iso = df["d"].dt.isocalendar()\n'
              'df = df[df["n"] > 1].reset_index(drop=True)\n'
              'df["d"] = df["d"] + pd.Timedelta(days=7)\n'
              'top = iso.head(4)\ndf["w"] = iso["week"]\nresult = df\n')
    differential(source, "result", "top")
