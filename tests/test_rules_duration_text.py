"""pd.to_timedelta of a column of text with errors="coerce" (porter/rules/datetimes.py,
_text_timedelta and pandas_duration): "[-][D days ]H:MM:SS[.ffffff]", units ("5h", "1h30m",
"2 days 3 hours") and ISO 8601 ("P1DT2H") read into pl.duration, anything else missing.

pandas is the reference implementation: each differential check runs the snippet with pandas
and its conversion with Polars and compares the variables they computed. The texts are the
ferry line's crossing log: times written by hand, some past midnight, some blank.
"""

from __future__ import annotations

import pandas as pd
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


# Forms with units and ISO 8601, as a ferry line's logbook holds them: a unit after each
# number in any case and spelling pandas takes ("5h", "5 H", "2 hours", "30min", "1h30m",
# "2 days 3 hours", "5 hours 30 minutes", "1w", "100ms", "250us", "7µs"), units before a clock
# ("1 hours 02:00:00": the "-" on the units alone), ISO 8601 ("P1DT2H", "-PT2H", "P0DT0H0M1.5S",
# "P1DT" with nothing after T, 25 hours), and what pandas does not read (NaT both ways):
# "M" (a month), "y", "T", "2 weeks", "5h30", "hrs", a unit alone, an ISO text with a space,
# a lower-case "p", "PT" alone, "ſ" and the Kelvin sign (Polars' case folding would take
# them for "s" and "k").
UNIT_TEXTS = [
    "5h", "5 h", "5H", "2 hours", "2 HOURS", "1 hour", "3 hr", "30min", "30 Min", "30 MIN",
    "30m", "30 minutes", "1 minute", "10s", "10 sec", "10 seconds", "1 second", "1h30m",
    "1h 30m", "1d2h", "2 days 3 hours", "5 hours 30 minutes", "3 days", "3 day", "3d", "3D",
    "1 days", "1w", "1 W", "100ms", "100 millis", "2 milliseconds", "250us", "250 micros",
    "7µs", "7µS", "-5h", "- 5h", "+5h", "+-5h", "-1h30m", "  5h  ", "5,h", "1 hours 02:00:00",
    "-1 hours 02:00:00", "-2 days 3 hours", "1w2d3h4m5s6ms7us", "0h", "00005h",
    "1 day, 2:00:00", "-1 days +23:00:00", "1 days 00:00:00.5", "00:30:00",
    "P1DT2H", "P1D", "PT2H30M", "P0DT0H0M1.5S", "-P1D", "-PT2H", "P1DT2H3M4.000005S",
    "PT90M", "PT36H", "P1DT25H", "P0D", "P0001D", "P1DT", "PT4S", "P1DT2M",
    "1M", "2y", "1T", "2 weeks", "5h30", "2 hrs", "5 mins", "h", "--5h", "5h-", "P 1D",
    " P1D", "p1d", "P1d", "PT", "P", "+P1D", "PT1.S", "5ſ", "5 dayſ", "5\u212a", "NaT", "",
    None, float("nan"),
]


def test_unit_and_iso_forms_read_as_pandas_reads_them() -> None:
    result = differential(_frame(UNIT_TEXTS) + 'df["x"] = pd.to_timedelta(df["raw"], '
                          'errors="coerce")\ndf["t"] = df["day"] + df["x"]\n'
                          'df["s"] = df["x"].dt.total_seconds()\nresult = df\n')
    assert "pd.to_timedelta" not in result.converted_text


def test_every_form_the_brief_names_is_read() -> None:
    """Not missing here: each of these has a value, the one pandas gives (checked above)."""
    import polars as pl
    from porter.rules.datetimes import DURATION_DEFINITION
    names: dict = {"pl": pl}
    exec(DURATION_DEFINITION, names)  # noqa: S102 - porter's own helper
    forms = ["5h", "1 day 02:00:00", "3 days", "00:30:00", "-1 days +23:00:00", "P1DT2H",
             "1h30m", "2 days 3 hours"]
    got = pl.DataFrame({"t": forms}).select(names["pandas_duration"](pl.col("t")))["t"]
    assert got.null_count() == 0
    expected = pd.to_timedelta(pd.Series(forms), errors="coerce")
    assert [v.total_seconds() for v in expected] == [v.total_seconds() for v in got.to_list()]


def _generated(seed: int, count: int) -> list[str]:
    """Texts from the pieces pandas' parser reads: numbers of 1 to 10 digits, every unit
    spelling in several cases (and some pandas refuses), signs, spaces, commas, clocks of two
    to four parts with decimals, ISO 8601 with weeks, fractions and lower case, and noise."""
    import random
    r = random.Random(seed)
    words = ["w", "W", "d", "D", "day", "days", "Day", "DAYS", "h", "H", "hr", "hour", "hours",
             "m", "M", "min", "MIN", "minute", "minutes", "s", "S", "sec", "second", "seconds",
             "ms", "MS", "milli", "millis", "milliseconds", "us", "US", "micro", "micros",
             "microseconds", "µs", "ns", "nanos", "T", "L", "y", "hrs", "mins", "weeks", "ſ"]

    def number() -> str:
        return "".join(r.choice("0123456789") for _ in range(r.choice([1, 1, 2, 2, 3, 4, 6, 10])))

    def text() -> str:
        kind = r.random()
        if kind < 0.35:
            out = r.choice(["", "", "-", "+", "- ", "+-", "--"])
            for _ in range(r.choice([1, 1, 2, 3])):
                out += number() + r.choice(["", " "]) + r.choice(words) + r.choice(["", " ", ", "])
            if r.random() < 0.3:
                out += f"{number()}:{number()}:{number()}" + ("." + number()) * (r.random() < 0.3)
            return out
        if kind < 0.55:
            out = r.choice(["", "-", "+", " "]) + ":".join(
                number() for _ in range(r.choice([2, 3, 3, 3, 4])))
            return out + r.choice(["", "", ".", "." + number()])
        if kind < 0.8:
            out = r.choice(["", "", "-", "+", " "]) + r.choice(["P", "P", "p"])
            out += "".join(number() + u for u in "WD" if r.random() < 0.4)
            if r.random() < 0.8:
                out += "T" + "".join(number() + ("." + number()) * (r.random() < 0.2) + u
                                     for u in "HMS" if r.random() < 0.5)
            return out
        return "".join(r.choice("0123456789 :.,+-PTDHMSdhmsa") for _ in range(r.randint(0, 12)))
    return [text() for _ in range(count)]


@pytest.mark.parametrize("seed", [0, 1, 2])
def test_generated_texts_never_read_to_another_value(seed: int) -> None:
    """Where porter reads a value it is pandas' value, to the microsecond; what it does not
    read is missing (the forms the lowered confidence names), never another duration."""
    import polars as pl
    from porter.rules.datetimes import DURATION_DEFINITION
    names: dict = {"pl": pl}
    exec(DURATION_DEFINITION, names)  # noqa: S102 - porter's own helper
    texts = _generated(seed, 4000)
    expected = pd.to_timedelta(pd.Series(texts, dtype=object), errors="coerce")
    got = pl.DataFrame({"t": texts}, schema={"t": pl.String}).select(
        names["pandas_duration"](pl.col("t")).dt.total_microseconds())["t"].to_list()
    read = 0
    for text, want, have in zip(texts, expected, got):
        if have is not None:
            read += 1
            assert not pd.isna(want) and want.as_unit("ns").value == have * 1000, (text, want, have)
    assert read > 400  # the generator reaches the forms porter reads


def test_text_with_unit_and_coerce_is_read_as_without() -> None:
    # with errors="coerce" pandas reads text as it does without unit= ("5h" is five hours
    # whatever the unit); it raises on text with unit= otherwise (a TODO below)
    result = differential(_frame(["5:00:00", "5h", "P1D", "1 days 02:00:00", "", None])
                          + 'df["x"] = pd.to_timedelta(df["raw"], unit="h", errors="coerce")\n'
                          "result = df\n")
    assert "pd.to_timedelta" not in result.converted_text


def test_todo_text_with_unit_without_coerce() -> None:
    text = convert(_frame(["5:00:00"]) + 'result = pd.to_timedelta(df["raw"], unit="h")\n'
                   ).converted_text
    assert "# TODO(porter): pd.to_timedelta" in text


@pytest.mark.parametrize("unit", ["M", "Y", "T"])
def test_todo_text_with_a_unit_pandas_refuses(unit: str) -> None:
    text = convert(_frame(["5:00:00"]) + f'result = pd.to_timedelta(df["raw"], unit="{unit}", '
                   'errors="coerce")\n').converted_text
    assert "# TODO(porter): pd.to_timedelta" in text


@pytest.mark.parametrize("form", ["42", "-42", "1.5h", "1.1h", "30m1h", "1h1h", "100ns",
                                  "00:00:01.1234567", "P1W", "P-1D", "PT1.5H", "10000 days"])
def test_forms_pandas_reads_otherwise_are_missing_not_another_value(form: str) -> None:
    """Each has a value in pandas (a number alone is nanoseconds, a fraction goes through a
    float, "PT1.5H" is 5 hours and 1 second): missing here, as the lowered confidence says."""
    import polars as pl
    from porter.rules.datetimes import DURATION_DEFINITION
    names: dict = {"pl": pl}
    exec(DURATION_DEFINITION, names)  # noqa: S102 - porter's own helper
    assert not pd.isna(pd.to_timedelta(pd.Series([form]), errors="coerce")[0])
    got = pl.DataFrame({"t": [form]}).select(names["pandas_duration"](pl.col("t")))["t"]
    assert got.to_list() == [None]


def test_confidence_names_the_other_forms() -> None:
    sites = convert(_frame(["5:00:00"]) + 'result = pd.to_timedelta(df["raw"], '
                    'errors="coerce")\n').sites
    site = next(s for s in sites if s.key == "pd.to_timedelta")
    assert site.confidence == 0.9 and "a number alone" in site.message \
        and "a fraction with a unit" in site.message
