"""A date or a duration written as a module constant (`START = pd.Timestamp("2024-11-15")`,
`pd.Timedelta(days=1)`) and used only beside Polars expressions becomes Python's datetime
(timedelta), which Polars reads as the same literal: the conversion no longer imports pandas
for it. pd.Timestamp.now() / today() are read where the script reads them and used as literals
in Polars expressions. pandas (the reference) runs each script; the conversion runs with
Polars; both write the same text.
"""

from __future__ import annotations

from pathlib import Path

from support import same_text

SHIFTS = """\
day,start,kg
2024-11-15,2024-11-15 06:00,12.5
2024-11-16,2024-11-16 22:30,
2024-12-01,2024-12-01 05:15,3.0
,2024-12-02 07:00,4.5
"""

BODY = '''
shifts = pd.read_csv("shifts.csv", parse_dates=["day", "start"])
shifts["season_day"] = (shifts["day"] - SEASON_START).dt.days
shifts["late"] = shifts["start"] > shifts["day"] + LATE
shifts = shifts[shifts["day"] >= SEASON_START]
shifts.to_csv("out.csv", index=False)
'''


def test_constants_used_beside_polars_expressions_need_no_pandas(tmp_path: Path) -> None:
    text = same_text('import pandas as pd\n\nSEASON_START = pd.Timestamp("2024-11-15")\n'
                     'LATE = pd.Timedelta(hours=20, minutes=30)\n' + BODY,
                     tmp_path, {"shifts.csv": SHIFTS}).converted_text
    assert "import pandas" not in text, text
    assert "SEASON_START = datetime.datetime(2024, 11, 15)" in text
    assert "pd.Timedelta" not in text
    assert text.index("import datetime") < text.index("import polars")


def test_a_constant_python_also_uses_stays_a_timestamp(tmp_path: Path) -> None:
    # printed, a Timestamp and a datetime read alike, but its repr, its methods (normalize,
    # dayofweek) and its arithmetic with other Timestamps differ: kept as pandas wrote it
    text = same_text('import pandas as pd\n\nSEASON_START = pd.Timestamp("2024-11-15")\n'
                     'LATE = pd.Timedelta(hours=20)\n' + BODY + 'print(SEASON_START.dayofweek)\n',
                     tmp_path, {"shifts.csv": SHIFTS}).converted_text
    assert 'SEASON_START = pd.Timestamp("2024-11-15")' in text
    assert "pd.Timedelta" not in text


def test_a_script_naming_datetime_itself_keeps_its_constants(tmp_path: Path) -> None:
    text = same_text('from datetime import datetime\nimport pandas as pd\n\n'
                     'SEASON_START = pd.Timestamp("2024-11-15")\nLATE = pd.Timedelta(hours=20)\n'
                     + BODY + 'print(datetime(2024, 1, 1).year)\n',
                     tmp_path, {"shifts.csv": SHIFTS}).converted_text
    assert 'SEASON_START = pd.Timestamp("2024-11-15")' in text


def test_now_and_today_read_where_the_script_reads_them(tmp_path: Path) -> None:
    # the dates are far from today, so both runs agree whenever they run (a day count of a
    # date far away could still change at midnight between the two runs: compared as a sign)
    text = same_text('''\
import pandas as pd
visits = pd.read_csv("visits.csv", parse_dates=["day"])
today = pd.Timestamp.today().normalize()
now = pd.Timestamp.now()
visits["past"] = visits["day"] < now
visits["ahead"] = (visits["day"] - today).dt.days > 0
visits["soon"] = visits["day"] <= pd.Timestamp.today()
visits.to_csv("out.csv", index=False)
''', tmp_path, {"visits.csv": "day,n\n2001-03-04,1\n2099-12-31,2\n,3\n"}).converted_text
    assert "TODO(porter)" not in text, text


def test_a_constant_beside_a_python_value_of_a_plan_stays_a_timestamp(tmp_path: Path) -> None:
    # the latest day as a Python value minus the constant: a Timestamp makes a Timedelta
    # ("3 days 00:00:00" printed), a datetime would make a timedelta ("3 days, 0:00:00")
    text = same_text('import pandas as pd\n\nSEASON_START = pd.Timestamp("2024-11-15")\n'
                     'shifts = pd.read_csv("shifts.csv", parse_dates=["day"])\n'
                     'shifts["late"] = shifts["day"] > SEASON_START\n'
                     'print(shifts["day"].max() - SEASON_START)\n'
                     'shifts.to_csv("out.csv", index=False)\n',
                     tmp_path, {"shifts.csv": SHIFTS}).converted_text
    assert 'SEASON_START = pd.Timestamp("2024-11-15")' in text, text


def test_to_datetime_of_one_text_is_the_same_constant(tmp_path: Path) -> None:
    # pd.to_datetime("2024-11-15") is the Timestamp pd.Timestamp reads from the same text
    text = same_text('import pandas as pd\n\nSEASON_START = pd.to_datetime("2024-11-15")\n'
                     'LATE = pd.Timedelta(hours=20, minutes=30)\n' + BODY,
                     tmp_path, {"shifts.csv": SHIFTS}).converted_text
    assert "import pandas" not in text, text
    assert "SEASON_START = datetime.datetime(2024, 11, 15)" in text


def test_to_datetime_with_options_stays_pandas(tmp_path: Path) -> None:
    # dayfirst=True reads 01/02/2024 as the first of February, where pd.Timestamp reads January:
    # only the call without options is written as Python's datetime
    text = same_text('import pandas as pd\n\nSEASON_START = pd.to_datetime("15/11/2024", dayfirst=True)\n'
                     'LATE = pd.Timedelta(hours=20, minutes=30)\n' + BODY,
                     tmp_path, {"shifts.csv": SHIFTS}).converted_text
    assert "datetime.datetime(" not in text, text
