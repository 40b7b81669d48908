"""read_csv(parse_dates=[["d", "t"]]) / parse_dates={"when": ["d", "t"]} and date_parser=,
which pandas 3 removed: the columns' texts joined with a space and read as one datetime column,
named "d_t" (or the dict's key), put first, the joined columns dropped. Such a script fails on
pandas 3.1 (TypeError); its port runs. The reference is pandas 3.1 running the same script
written as it is spelled now: pd.to_datetime(df["d"] + " " + df["t"], format=...) inserted
first, date_format= for date_parser on one column.
"""

from __future__ import annotations

from pathlib import Path
import subprocess
import sys

import pytest

from porter.api import convert_source
from porter.model import Options
from support import convert

# a ferry line's crossings: a missing day and a missing time, a leap day, a duplicate row,
# accented piers, minutes written without seconds
CROSSINGS = """\
day,time,pier,cars,back_day,back_time
2024-02-29,23:55,Süd,4,2024-03-01,00:40
2024-01-05,08:05,Nord,12,2024-01-05,09:10
,13:30,Île,3,2024-01-06,14:00
2024-03-01,,Nord,,2024-03-01,10:00
2024-01-05,08:05,Nord,12,2024-01-05,09:10
"""

SCRIPT = """\
import pandas as pd
from datetime import datetime
{}
out.to_csv("out.csv", index=False)
print(out.dtypes.astype(str).tolist(), out.columns.tolist(), len(out))
"""


def _outputs(folder: Path, text: str) -> tuple[str, str]:
    folder.mkdir()
    (folder / "crossings.csv").write_text(CROSSINGS)
    (folder / "script.py").write_text(text)
    done = subprocess.run([sys.executable, "script.py"], cwd=folder, capture_output=True,
                          text=True, timeout=120)
    assert done.returncode == 0, f"{done.stderr}\n--- script ---\n{text}"
    return done.stdout, (folder / "out.csv").read_text()


MODERN_PAIR = ('out = pd.read_csv("crossings.csv")\n'
               'out.insert(0, "{name}", pd.to_datetime(out["day"] + " " + out["time"]{fmt}))\n'
               'out = out.drop(columns=["day", "time"])')
CASES = [
    ('out = pd.read_csv("crossings.csv", parse_dates=[["day", "time"]])',
     MODERN_PAIR.format(name="day_time", fmt="")),
    ('out = pd.read_csv("crossings.csv", parse_dates={"left": ["day", "time"]})',
     MODERN_PAIR.format(name="left", fmt="")),
    ('out = pd.read_csv("crossings.csv", parse_dates=[["day", "time"]], '
     'date_parser=lambda x: pd.to_datetime(x, format="%Y-%m-%d %H:%M"))',
     MODERN_PAIR.format(name="day_time", fmt=', format="%Y-%m-%d %H:%M"')),
    ('out = pd.read_csv("crossings.csv", parse_dates={"left": ["day", "time"]}, '
     'date_parser=lambda s: datetime.strptime(s, "%Y-%m-%d %H:%M"), keep_date_col=False)',
     MODERN_PAIR.format(name="left", fmt=', format="%Y-%m-%d %H:%M"')),
    ('out = pd.read_csv("crossings.csv", parse_dates={"left": ["day", "time"], '
     '"back": ["back_day", "back_time"]})',
     'out = pd.read_csv("crossings.csv")\n'
     'out.insert(0, "back", pd.to_datetime(out["back_day"] + " " + out["back_time"]))\n'
     'out.insert(0, "left", pd.to_datetime(out["day"] + " " + out["time"]))\n'
     'out = out.drop(columns=["day", "time", "back_day", "back_time"])'),
    ('out = pd.read_csv("crossings.csv", parse_dates=["back_day"], '
     'date_parser=lambda x: pd.to_datetime(x, format="%Y-%m-%d"))',
     'out = pd.read_csv("crossings.csv", parse_dates=["back_day"], date_format="%Y-%m-%d")'),
]


@pytest.mark.parametrize("with_data", [True, False], ids=["data", "no-data"])
@pytest.mark.parametrize("old, new", CASES)
def test_combined_dates_port_as_pandas_3_spells_them(tmp_path: Path, old: str, new: str,
                                                    with_data: bool) -> None:
    old_script, new_script = SCRIPT.format(old), SCRIPT.format(new)
    expected = _outputs(tmp_path / "pandas", new_script)
    (tmp_path / "sample").mkdir()
    (tmp_path / "sample" / "crossings.csv").write_text(CROSSINGS)
    converted = convert_source(old_script, options=Options(
        data_dir=str(tmp_path / "sample") if with_data else None)).converted_text
    assert "TODO(porter)" not in converted, converted
    assert _outputs(tmp_path / "polars", converted) == expected, converted


@pytest.mark.parametrize("old", [old for old, _ in CASES])
def test_the_old_spelling_fails_on_pandas_3(tmp_path: Path, old: str) -> None:
    (tmp_path / "crossings.csv").write_text(CROSSINGS)
    done = subprocess.run([sys.executable, "-c", SCRIPT.format(old)], cwd=tmp_path,
                          capture_output=True, text=True, timeout=120)
    assert done.returncode != 0 and "TypeError" in done.stderr


@pytest.mark.parametrize("call, why", [
    ('pd.read_csv("crossings.csv", parse_dates=[["day", "time"]], keep_date_col=True)',
     "keep_date_col=True"),
    ('pd.read_csv("crossings.csv", parse_dates=[["day", "time"]], date_parser=lambda x: x)',
     "date_parser="),
    ('pd.read_csv("crossings.csv", parse_dates=["pier", ["day", "time"]])',
     "mixing single columns"),
    ('pd.read_csv("crossings.csv", parse_dates={"pier": ["day", "time"]})', "already a column"),
    ('pd.read_csv("crossings.csv", parse_dates={"day": ["day", "time"]})', "already a column"),
    ('pd.read_csv("crossings.csv", parse_dates=[["day"]])', "already a column"),
    # a tuple is one column's name (two levels) in pandas, not columns to combine
    ('pd.read_csv("crossings.csv", parse_dates=[("day", "time")])', "tuples"),
    ('pd.read_csv("crossings.csv", parse_dates=[["day", "cars"]])', "read as numbers"),
])
def test_combined_dates_porter_does_not_read_stay_todos(tmp_path: Path, call: str, why: str) -> None:
    (tmp_path / "crossings.csv").write_text(CROSSINGS)
    text = convert(f"import pandas as pd\nout = {call}\n", data_dir=str(tmp_path)).converted_text
    assert "TODO(porter): pd.read_csv" in text and why in text, text
