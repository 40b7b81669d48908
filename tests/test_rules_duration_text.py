"""pd.to_timedelta of a column of text with errors="coerce" (porter/rules/datetimes.py,
_text_timedelta): "[-][D days ]H:MM:SS[.ffffff]" read into pl.duration, anything else missing.

pandas is the reference implementation: each differential check runs the snippet with pandas
and its conversion with Polars and compares the variables they computed. The texts are the
ferry line's crossing log: times written by hand, some past midnight, some blank.
"""

from __future__ import annotations

import pytest

from rule_checks import check_todo
from support import convert, differential

# Each form pandas reads in its own way: hours past 24 and minutes past 60 carried over, one
# digit or many, spaces anywhere (even inside a number) and commas skipped, a leading "-" (on
# the days alone when days are written), "+" ignored, up to six decimals; and texts pandas
# cannot read (missing with errors="coerce"): two parts, an empty part, an empty decimal, a
# "-" inside, digits of another script, a tab before, "", "NaT", "n/a", None and NaN.
TEXTS = [
    "05:00:00", "5:00:00", "25:00:00", "5:60:00", "5:99:00", "00:00:60", "123:00:00",
    "0:0:0", "5:5:5", " 5:00:00", "5:00:00 ", "5 :00:00", "5 0:00:00", "5,0:00:00",
    "-5:00:00", "-0:30:00", "- 5:00:00", "+05:00:00", "+-5:00:00", "-00:00:00.25",
    "00:00:01.5", "00:00:01.123456", "12:34:56.789", "5:00:00.000",
    "1 days 02:00:00", "1 day 02:00:00", "1 DAYS 02:00:00", "1 D 02:00:00", "1days02:00:00",
    "2 days, 3:04:05", "-1 days +02:00:00", "-1 days 02:00:00", "2 days 25:00:00",
    "1 days 02:00:00.25", "-1 days 00:00:00.25",
    "05:00", "1:2", "5::00", "05:00:00:00", "5:00:00.", "5:00:-1", "1 days -02:00:00",
    "--5:00:00", "\u0665:00:00", "\t5:00:00", "5:00:00x", "x5:00:00", "alltide:00", "",
    "NaT", "n/a", None, float("nan"), "9999 days 999999:999999:99999999.999999",
    "-999999:999999:99999999.999999", "Ünïcode", "5:00:00", "5:00:00",
]
HEAD = "import numpy as np\nimport pandas as pd\n"


def _frame(texts: list[object]) -> str:
    items = ", ".join("np.nan" if isinstance(t, float) else repr(t) for t in texts)
    days = ", ".join(repr(f"2025-03-{1 + i % 28:02d}") for i in range(len(texts)))
    return (HEAD + f"df = pd.DataFrame({{\"raw\": [{items}], \"day\": [{days}]}})\n"
            'df["day"] = pd.to_datetime(df["day"], format="%Y-%m-%d")\n')


def test_texts_read_as_pandas_reads_them() -> None:
    result = differential(_frame(TEXTS) + 'df["x"] = pd.to_timedelta(df["raw"], errors="coerce")\n'
                          "result = df[[\"raw\", \"x\"]]\n")
    text = result.converted_text
    assert "str.extract_groups" in text and "pl.duration(" in text
    assert "pd.to_timedelta" not in text


def test_added_to_dates_and_compared() -> None:
    # the corpus form: a clock time made into a duration and added to the day; a run past
    # midnight is the next day's
    result = differential(HEAD + 'df = pd.DataFrame({"day": ["2025-06-24", "2025-06-25", None, '
                 '"2025-06-26", "2025-06-27"], "span": ["5:00-09:00", "22:30-01:15", '
                 '"6:00-7:00", "all tide", None]})\n'
                 'df["day"] = pd.to_datetime(df["day"], format="%Y-%m-%d")\n'
                 'df["a"] = df["span"].str.split("-").str[0]\n'
                 'df["b"] = df["span"].str.split("-").str[1]\n'
                 'df["start"] = df["day"] + pd.to_timedelta(df["a"] + ":00", errors="coerce")\n'
                 'df["stop"] = df["day"] + pd.to_timedelta(df["b"] + ":00", errors="coerce")\n'
                 'df["late"] = df["stop"] < df["start"]\n'
                 'df["minutes"] = (df["stop"] - df["start"]).dt.total_seconds() / 60\n'
                 "result = df\n")
    assert "pd.to_timedelta" not in result.converted_text


def test_no_rows() -> None:
    result = differential(_frame(["5:00:00"]) + 'empty = df[df["raw"] == "none such"]\n'
                 'empty["x"] = empty["day"] + pd.to_timedelta(empty["raw"], errors="coerce")\n'
                 'result = empty[["x"]]\n')
    assert "pd.to_timedelta" not in result.converted_text


@pytest.mark.parametrize("expr", [
    # pandas raises on a text it cannot read: without errors="coerce" it stays pandas
    pytest.param('pd.to_timedelta(df["raw"])', id="errors raise"),
    pytest.param('pd.to_timedelta(df["raw"], errors="raise")', id="errors raise written"),
])
def test_todo_without_coerce(expr: str) -> None:
    check_todo(_frame(["5:00:00", "6:00:00"]) + f"result = {expr}\n", "pd.to_timedelta")


def test_todo_text_with_unit() -> None:
    # pandas refuses a unit with text (unless errors="coerce", where it reads the text): a TODO
    text = convert(_frame(["5:00:00"]) + 'result = pd.to_timedelta(df["raw"], unit="h", '
                   'errors="coerce")\n').converted_text
    assert "# TODO(porter): pd.to_timedelta" in text


def test_confidence_names_the_other_forms() -> None:
    sites = convert(_frame(["5:00:00"]) + 'result = pd.to_timedelta(df["raw"], '
                    'errors="coerce")\n').sites
    site = next(s for s in sites if s.key == "pd.to_timedelta")
    assert site.confidence == 0.9 and "ISO 8601" in site.message
