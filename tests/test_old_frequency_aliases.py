"""Frequency aliases pandas 2.2 renamed and pandas 3 rejects (M, Q, Y / A, AS, H, T, S, L, U,
N, their multiples and anchors) in resample, pd.Grouper(freq=), pd.date_range, dt.floor,
dt.to_period and pd.period_range (porter/rules/legacy.py). A script written for the pandas
that had them fails on pandas 3.1 as written; its port reads each alias as the offset pandas
3.1 spells otherwise. The reference is pandas 3.1 running the script written with today's
name; the names pandas still accepts ("M", "Q", "Y" as periods) keep their meaning.
"""

from __future__ import annotations

import textwrap
import warnings

import pandas as pd
import pytest

from porter.rules.legacy import OFFSET_ALIASES, PERIOD_ALIASES, modern_offset, modern_period
from support import assert_same_value, convert, run

# a ferry line's crossings: out of order, a missing time, a leap day late in the evening, the
# turn of the year, two crossings at the same minute, missing loads (None and NaN), accented
# and missing pier names
FERRY = '''
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "raw": ["2024-02-27 13:05", "2024-06-30 12:00", None, "2024-02-29 23:59", "2023-12-31 23:30",
            "2024-01-01 00:00", "2024-09-04 00:00", "2024-01-31 08:15", "2024-02-27 13:05"],
    "cars": [1, 5, 3, 4, 7, 2, 6, 9, 8],
    "tons": [1.5, 3.0, 2.0, None, np.nan, 0.5, 4.0, -1.0, np.nan],
    "pier": ["Nord", "Süd", "Nord", None, "Süd", "Île", "Nord", "Île", "Süd"],
})
df["ts"] = pd.to_datetime(df["raw"], format="%Y-%m-%d %H:%M")
df = df.drop(columns=["raw"])
'''
# a few hours of crossings, for hours, minutes and seconds
HOURS = '''
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "raw": ["2024-02-29 13:10:05", "2024-02-29 03:00:00", "2024-03-01 01:59:59", None,
            "2024-02-29 23:00:30", "2024-02-29 13:50:00"],
    "cars": [1, 2, 3, 4, 5, 6],
    "tons": [0.5, np.nan, 2.5, 1.0, None, 4.0],
    "pier": ["Nord", "Süd", "Nord", "Nord", "Süd", "Süd"],
})
df["ts"] = pd.to_datetime(df["raw"], format="%Y-%m-%d %H:%M:%S")
df = df.drop(columns=["raw"])
'''
EMPTY = '\ndf = df[df["cars"] > 100]\n'


def _fails_on_pandas(source: str) -> None:
    """The script as written stops on pandas 3.1 (the alias is rejected)."""
    with pytest.raises(ValueError, match="[Ii]nvalid frequency|not supported"):
        run(source)


def legacy_differential(frame: str, old: str, new: str, *names: str,
                        todo: str | None = None) -> str:
    """Convert the script written with the old alias; run it with Polars, and the script
    written with pandas 3.1's name with pandas; compare `names` (default: result). `todo`:
    the key of a call porter keeps on pandas (under a TODO), which must then run there."""
    old_source = textwrap.dedent(frame + old)
    new_source = textwrap.dedent(frame + new)
    _fails_on_pandas(old_source)
    converted = convert(old_source).converted_text
    if todo is None:
        assert "TODO(porter)" not in converted, converted
    else:
        assert f"TODO(porter): {todo}" in converted, converted
    expected, actual = run(new_source), run(converted)
    for name in names or ("result",):
        try:
            assert_same_value(expected[name], actual[name])
        except AssertionError as exc:
            raise AssertionError(f"{name}: {exc}\n--- converted ---\n{converted}") from None
    return converted


# -- resample, pd.Grouper --------------------------------------------------------------------

DAY_ALIASES = [("M", "ME"), ("Q", "QE"), ("Q-DEC", "QE-DEC"), ("A", "YE"), ("Y", "YE"),
               ("A-DEC", "YE-DEC"), ("AS", "YS"), ("AS-JAN", "YS-JAN")]
HOUR_ALIASES = [("H", "h"), ("5H", "5h"), ("90T", "90min"), ("7T", "7min"), ("30S", "30s")]


@pytest.mark.parametrize("old, new", DAY_ALIASES)
@pytest.mark.parametrize("how", ["sum", "mean", "count", "first"])
@pytest.mark.parametrize("rows", ["", EMPTY], ids=["rows", "empty"])
def test_resample_old_aliases(old: str, new: str, how: str, rows: str) -> None:
    text = legacy_differential(FERRY + rows,
                               f'result = df.resample("{old}", on="ts")[["cars", "tons"]].{how}()\n',
                               f'result = df.resample("{new}", on="ts")[["cars", "tons"]].{how}()\n')
    assert f'"{old}"' not in text


@pytest.mark.parametrize("old, new", HOUR_ALIASES)
@pytest.mark.parametrize("how", ["sum", "max", "size"])
def test_resample_old_hour_and_minute_aliases(old: str, new: str, how: str) -> None:
    legacy_differential(HOURS, f'result = df.resample("{old}", on="ts").cars.{how}()\n',
                        f'result = df.resample("{new}", on="ts").cars.{how}()\n')


@pytest.mark.parametrize("old, new", [("M", "ME"), ("A", "YE"), ("Q", "QE"), ("2H", "2h")])
def test_resample_of_the_index_and_by_group(old: str, new: str) -> None:
    frame = HOURS if old.endswith("H") else FERRY
    for pattern in ('result = df.set_index("ts").resample("{}")["tons"].sum()\n',
                    'result = df.groupby("pier").resample("{}", on="ts")["cars"].sum()\n',
                    'result = df.set_index("ts").groupby("pier")["tons"].resample("{}").max()\n'):
        legacy_differential(frame, pattern.format(old), pattern.format(new))


@pytest.mark.parametrize("old, new", [("M", "ME"), ("A", "YE"), ("Q", "QE"), ("AS", "YS")])
def test_grouper_old_aliases(old: str, new: str) -> None:
    for pattern in ('result = df.groupby(pd.Grouper(key="ts", freq="{}"))["cars"].sum()\n',
                    'result = df.groupby(["pier", pd.Grouper(key="ts", freq="{}")])["tons"]'
                    '.mean()\n'):
        text = legacy_differential(FERRY, pattern.format(old), pattern.format(new))
        assert f'freq="{old}"' not in text


def test_an_old_alias_porter_does_not_bin_stays_a_todo_naming_the_new_one() -> None:
    # SM (semi-month end) is SME in pandas 3.1; porter bins no semi-months (BM, a business
    # month end, is binned as BME: tests/test_business_month_end_bins.py)
    text = convert(textwrap.dedent(FERRY + 'result = df.resample("SM", on="ts")["cars"].sum()\n')
                   ).converted_text
    assert "TODO(porter): frame.resample" in text
    assert "'SME'" in text


# -- date_range, dt.floor ----------------------------------------------------------------------

@pytest.mark.parametrize("old, new", [("H", "h"), ("15T", "15min"), ("S", "s"), ("10L", "10ms"),
                                      ("U", "us"), ("3H", "3h")])
def test_date_range_old_aliases(old: str, new: str) -> None:
    pattern = ('result = pd.DataFrame({{"at": pd.date_range("2024-02-29 22:00", periods=7, '
               'freq="{}"), "slot": range(7)}})\n')
    legacy_differential("import pandas as pd\n", pattern.format(old), pattern.format(new))


@pytest.mark.parametrize("old, new", [("H", "h"), ("15T", "15min"), ("T", "min"), ("S", "s"),
                                      ("L", "ms"), ("U", "us"), ("2H", "2h")])
def test_floor_old_aliases(old: str, new: str) -> None:
    frame = HOURS + 'df["ts"] = df["ts"] + pd.to_timedelta(df["cars"] * 1234567, unit="us")\n'
    pattern = 'df["start"] = df["ts"].dt.floor("{}"); result = df\n'
    legacy_differential(frame, pattern.format(old), pattern.format(new))


# -- calls porter keeps on pandas: written with pandas 3.1's name, so the port runs ------------

@pytest.mark.parametrize("old, new, key", [
    ('df["up"] = df["ts"].dt.ceil("H"); result = df', 'df["up"] = df["ts"].dt.ceil("h"); result = df',
     "series.dt.ceil"),
    ('df["near"] = df["ts"].dt.round(freq="15T"); result = df',
     'df["near"] = df["ts"].dt.round(freq="15min"); result = df', "series.dt.round"),
    ('result = df.set_index("ts").resample("SM")["cars"].sum()',
     'result = df.set_index("ts").resample("SME")["cars"].sum()', "indexed.resample"),
    ('result = df.set_index("ts").resample("BM")["cars"].sum()',
     'result = df.set_index("ts").resample("BME")["cars"].sum()', None),
    ('result = df.set_index("ts").resample("2A")["cars"].sum()',
     'result = df.set_index("ts").resample("2YE")["cars"].sum()', "indexed.resample"),
    ('result = df.set_index("ts")["cars"].resample("2H").sum()',
     'result = df.set_index("ts")["cars"].resample("2h").sum()', None),
    ('result = df.set_index("ts")["cars"].resample("BM").sum()',
     'result = df.set_index("ts")["cars"].resample("BME").sum()', None),
])
def test_calls_kept_on_pandas_get_the_new_name(old: str, new: str, key: str | None) -> None:
    frame = HOURS if "H" in old or "T" in old else FERRY
    text = legacy_differential(frame, old, new, todo=key) if key else None
    if key is None:  # whatever porter makes of it, it runs and agrees with pandas 3.1
        source = textwrap.dedent(frame + old)
        text = convert(source).converted_text
        assert_same_value(run(textwrap.dedent(frame + new))["result"], run(text)["result"])
    assert '"BM"' not in text and '"M"' not in text and '"H"' not in text and '"15T"' not in text \
        and '"SM"' not in text


def test_a_kept_resample_of_an_alias_periods_still_read_is_not_renamed() -> None:
    # "M" resamples a PeriodIndex in pandas 3.1 (by month), where "ME" is refused: the kept
    # call (a Series computed from the column, which porter does not resample) does not know
    # which index it gets, so "M" stays as written
    source = textwrap.dedent(FERRY + 'result = df.set_index("ts")["cars"].shift(1).resample("M").sum()\n')
    assert '.resample("M")' in convert(source).converted_text


def test_a_column_of_a_table_labelled_by_dates_resampled_by_an_old_alias() -> None:
    # the labels are timestamps porter knows: "M" is read as the month end it meant
    legacy_differential(FERRY, 'result = df.set_index("ts")["cars"].resample("M").sum()\n',
                        'result = df.set_index("ts")["cars"].resample("ME").sum()\n')


def test_resampling_a_column_of_periods_stays_pandas() -> None:
    # porter bins timestamps; pandas 3.1 resamples periods by period frequency ("M")
    source = textwrap.dedent(FERRY + 'df = df.dropna(subset=["ts"])\n'
                             'df["month"] = df["ts"].dt.to_period("M")\n'
                             'result = df.set_index("month").resample("M")["cars"].sum()\n')
    text = convert(source).converted_text
    assert "TODO(porter): indexed.resample" in text and "holds periods" in text, text
    assert_same_value(run(source)["result"], run(text)["result"])


# -- periods: M, Q and Y keep their meaning -------------------------------------------------------

@pytest.mark.parametrize("old, new", [("A", "Y"), ("H", "h"), ("T", "min")])
def test_to_period_old_aliases(old: str, new: str) -> None:
    frame = HOURS if old != "A" else FERRY
    pattern = 'df["p"] = df["ts"].dt.to_period("{}").astype(str); result = df\n'
    legacy_differential(frame, pattern.format(old), pattern.format(new))


@pytest.mark.parametrize("old, new", [("A", "Y"), ("H", "h")])
def test_period_range_old_aliases(old: str, new: str) -> None:
    pattern = ('result = pd.DataFrame({{"p": pd.period_range("2023-12-31", periods=3, '
               'freq="{}").astype(str)}})\n')
    legacy_differential("import pandas as pd\n", pattern.format(old), pattern.format(new))


@pytest.mark.parametrize("freq", ["M", "Q", "Y", "Q-DEC", "Y-DEC"])
def test_month_quarter_and_year_periods_are_not_renamed(freq: str) -> None:
    # "M" in to_period is still the month period in pandas 3.1 (not a month end)
    source = textwrap.dedent(FERRY + f'df["p"] = df["ts"].dt.to_period("{freq}").astype(str); '
                             'result = df\n')
    converted = convert(source).converted_text
    assert "TODO(porter)" not in converted
    assert_same_value(run(source)["result"], run(converted)["result"])
    assert modern_period(freq) is None


# -- the tables -------------------------------------------------------------------------------

def _accepted(check, freq: str) -> bool:
    try:
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")
            check(freq)
    except (ValueError, TypeError):
        return False
    return True


def _offset(freq: str) -> object:
    return pd.tseries.frequencies.to_offset(freq)


def _period(freq: str) -> object:
    return pd.Period("2024-01-01", freq=freq)


@pytest.mark.parametrize("old", sorted(OFFSET_ALIASES))
def test_every_renamed_offset_is_rejected_and_its_new_name_read(old: str) -> None:
    assert not _accepted(_offset, old)
    assert _accepted(_offset, OFFSET_ALIASES[old])
    assert modern_offset(old) == OFFSET_ALIASES[old]


@pytest.mark.parametrize("old", sorted(PERIOD_ALIASES))
def test_every_renamed_period_is_rejected_and_its_new_name_read(old: str) -> None:
    assert not _accepted(_period, old)
    assert _accepted(_period, PERIOD_ALIASES[old])
    assert modern_period(old) == PERIOD_ALIASES[old]


ACCEPTED = ["D", "2D", "W", "W-SUN", "W-MON", "MS", "ME", "BME", "QS", "QE", "QE-JAN", "YS", "YE",
            "B", "C", "h", "2h", "min", "15min", "s", "ms", "us", "ns", "bh", "SME", "BQS",
            "M", "Q", "Y", "Q-JAN", "Y-JUN", "2M"]


@pytest.mark.parametrize("freq", ACCEPTED)
def test_an_alias_pandas_accepts_is_never_renamed(freq: str) -> None:
    if _accepted(_offset, freq):
        assert modern_offset(freq) is None
    if _accepted(_period, freq):
        assert modern_period(freq) is None
