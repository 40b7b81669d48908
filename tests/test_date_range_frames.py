"""pd.date_range as a column of a frame written out (`pd.DataFrame({"day": pd.date_range(...)})`),
merged with a frame read from a file: a calendar of every day, hour or quarter hour, with the
days nothing happened. Reference: pandas 3.1 itself (datetime64[us] timestamps)."""

from __future__ import annotations

from pathlib import Path

import pandas as pd
import pytest

from support import convert, differential

# a ferry line's crossings: a missing timestamp, two crossings on one day, days with none,
# rows out of order, a crossing before and after the calendar
CROSSINGS = (
    "sailed,pier,cars\n"
    "2024-02-28 07:15:00,Nord,12\n"
    "2024-02-26 06:00:00,Süd,3\n"
    "2024-02-28 07:15:00,Nord,5\n"
    ",Nord,7\n"
    "2024-03-02 18:45:00,Öst,0\n"
    "2024-02-20 09:00:00,Süd,1\n"
    "2024-03-09 09:00:00,Süd,2\n"
)

HEAD = (
    'import pandas as pd\n'
    'log = pd.read_csv("crossings.csv")\n'
    'log["sailed"] = pd.to_datetime(log["sailed"], format="%Y-%m-%d %H:%M:%S")\n'
    'log["day"] = log["sailed"].dt.normalize()\n'
)

PORTS = [
    pytest.param(
        'days = pd.DataFrame({"day": pd.date_range("2024-02-26", "2024-03-03", freq="D")})\n'
        'per_day = log.groupby("day").agg(n=("cars", "size"), cars=("cars", "sum")).reset_index()\n'
        'result = days.merge(per_day, on="day", how="left")\n'
        'result["n"] = result["n"].fillna(0).astype(int)\n',
        id="every day, merged on the left: days without crossings stay missing"),
    pytest.param(
        'calendar = pd.date_range(start="2024-02-25", periods=9, freq="D")\n'
        'days = pd.DataFrame({"day": calendar, "open": True})\n'
        'result = log.merge(days, on="day", how="inner")\n',
        id="start and periods through a name, a value broadcast, an inner merge"),
    pytest.param(
        'slots = pd.DataFrame({"sailed": pd.date_range(end="2024-02-28 08:00", periods=6, freq="15min")})\n'
        'result = slots.merge(log, on="sailed", how="left")\n',
        id="end and periods, a quarter-hour step: duplicate matches kept in order"),
    pytest.param(
        'hours = pd.DataFrame({"sailed": pd.date_range("2024-02-28 06:15", "2024-02-28 09:00", freq="h"),\n'
        '                      "slot": ["a", "b", "c"]})\n'
        'result = log.merge(hours, on="sailed", how="outer")\n',
        id="hourly from a time that is not on the hour, an outer merge"),
    pytest.param(
        'result = pd.DataFrame({"day": pd.date_range("2024-02-27", "2024-03-02", freq="2D")})\n',
        id="a two-day step: the end is left out when not on the step"),
    pytest.param(
        'result = pd.DataFrame({"day": pd.date_range("2024-02-27", periods=3), "n": 0, "k": "é",\n'
        '                       "w": 0.5})\n',
        id="whole numbers, text and floats broadcast beside the range keep pandas' types"),
]


@pytest.fixture()
def crossings(tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> Path:
    (tmp_path / "crossings.csv").write_text(CROSSINGS, encoding="utf-8")
    monkeypatch.chdir(tmp_path)
    return tmp_path


@pytest.mark.parametrize("body", PORTS)
def test_date_range_frames_merge_as_in_pandas(body, crossings):
    result = differential(HEAD + body, data_dir=str(crossings))
    assert not result.todos, result.converted_text
    assert "pl.datetime_range(" in result.converted_text
    assert "pd.date_range" not in result.converted_text


def test_an_inline_range_is_reported_where_it_is_written(crossings):
    result = convert(HEAD + 'days = pd.DataFrame({"day": pd.date_range("2024-02-26", periods=3),\n'
                            '                     "n": 0})\n', data_dir=str(crossings))
    sites = [s for s in result.sites if s.key == "pd.date_range"]
    assert [(s.status, s.line) for s in sites] == [("converted", 5)], result.sites


def test_date_range_frame_writes_pandas_text(crossings):
    """The calendar written to CSV: midnight timestamps as dates, as pandas writes them."""
    source = HEAD + (
        'days = pd.DataFrame({"day": pd.date_range("2024-02-26", "2024-03-01", freq="D")})\n'
        'out = days.merge(log.groupby("day", as_index=False)["cars"].sum(), on="day", how="left")\n'
        'out.to_csv("calendar.csv", index=False)\n')
    from support import run
    run(source)
    expected = (crossings / "calendar.csv").read_text(encoding="utf-8")
    result = convert(source, data_dir=str(crossings))
    assert not result.todos, result.converted_text
    run(result.converted_text)
    assert (crossings / "calendar.csv").read_text(encoding="utf-8") == expected
    assert expected.splitlines()[1] == "2024-02-26,3.0"


@pytest.mark.parametrize("body, reason", [
    ('days = pd.DataFrame({"day": pd.date_range("2024-02-26", periods=4, freq="W")})',
     "anchored to a calendar"),
    ('days = pd.DataFrame({"day": pd.date_range("2024-02-26", periods=4, freq="MS")})',
     "anchored to a calendar"),
    ('days = pd.DataFrame({"day": pd.date_range("2024-02-26", periods=4, tz="UTC")})',
     "argument tz"),
    ('first = log["day"].min()\n'
     'days = pd.DataFrame({"day": pd.date_range(first, periods=4, freq="D")})',
     "computed at run time"),
    ('days = pd.DataFrame({"day": pd.date_range("2024-02-26", "2024-03-01", periods=4)})',
     "exactly two of start, end and periods"),
    ('rng = pd.date_range("2024-02-26", periods=4, freq="D")\n'
     'days = pd.DataFrame({"day": rng})\nn = len(rng)',
     "used otherwise"),
    ('log["slot"] = pd.date_range("2024-02-26", periods=7, freq="h")',
     "used otherwise"),
    ('days = pd.DataFrame({"t": pd.date_range("1900-01-01", "2100-01-01", freq="s")})',
     "over 1,000,000 timestamps"),
    ('days = pd.DataFrame({"day": pd.date_range("2024-02-26", periods=3)}, index=[5, 6, 7])',
     "used otherwise"),
])
def test_date_ranges_porter_does_not_port_stay_todos(body, reason, crossings):
    result = convert(HEAD + body + "\nresult = days if 'days' in dir() else log\n",
                     data_dir=str(crossings))
    assert "TODO(porter): pd.date_range" in result.converted_text, result.converted_text
    assert reason in result.converted_text.replace("\n#   ", " "), result.converted_text
