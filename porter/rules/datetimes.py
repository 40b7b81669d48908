"""Datetimes: the .dt accessor and pd.to_datetime (D01–D04 in the semantics reference).

A missing timestamp (NaT) stays missing through every rule here; pandas' integer components
become float64 when one is missing, Polars keeps integers with nulls (the same numbers).
"""

from __future__ import annotations

from dataclasses import dataclass, field, replace
from fractions import Fraction
import re
from typing import Any

import libcst as cst

from porter.emit import code as emit
from porter.emit.code import Code
from porter.rules import rule
from porter.rules.legacy import modern_offset, modern_period
from porter.translate.context import (
    PandasCall, RuleContext, Unsupported, derived_column, select_columns,
)
from porter.translate.context import accessor_column as _accessor_column
from porter.translate import handover
from porter.translate.values import (
    NOT_NULLABLE, Accessor, Column, Opaque, Parts, Scalar, Value, fresh_token,
)


def accessor_column(call: PandasCall) -> Column:
    """The column under `s.dt`. Under a table's own dates (`wide.index.strftime(...)`, see
    selection.frame_index) it is the index key's values: what the rule makes of them is an
    Index in pandas, values without labels of their own, so the result is not indexed by the
    key it replaces (handed to pandas it would be looked up under the key's name, which the
    new values took)."""
    column = _accessor_column(call)
    if column.dtype is not None and column.dtype.startswith("period["):
        # periods kept in a frame as their text (Periods.aligned_in): pandas' own accessor
        raise Unsupported("a column of periods, held as their text: its .dt stays pandas")
    accessor = call.receiver
    if isinstance(accessor, Accessor) and accessor.index_of is not None and column.frame.index:
        return replace(column, frame=replace(column.frame, index=()))
    return column


def _dt(column: Column) -> Code:
    return column.code.attr("dt")


def _result(column: Column, code: Code, dtype: str) -> Column:
    return derived_column(column, code, dtype=dtype)


_COMPONENTS = {"year": "year", "month": "month", "day": "day", "hour": "hour",
               "minute": "minute", "second": "second", "quarter": "quarter",
               "dayofyear": "ordinal_day", "day_of_year": "ordinal_day"}
INT32 = emit.atom("pl.Int32")


# pandas' integer parts of dates are float64 when a date is missing (NaT), int32 otherwise;
# Polars keeps integers with nulls. Files written, astype(str) and tolist() decide it from the
# nulls at run time as pandas does; what reads the numbers themselves does not
NAT_MAKES_FLOAT = ("a missing date (NaT) makes pandas' result float64: its min, max or sum and "
                   "a single value print 2024.0 where these print 2024, and a group key or group "
                   "aggregate of it is written 2024.0 (to_csv, astype(str) and tolist() of the "
                   "column itself follow the missing values, as pandas does)")
# Column.float_int of a date part: float64 in pandas where a date is missing. Assigned as a
# column (rules/assign.py: typed_at_run_time), it is given pandas' type once it is computed
NAT_FLOAT_MARK = "a date is missing (NaT)"
NAT_DURATION_MARK = "a duration is missing (NaT)"


def _as_int32(code: Code) -> Code:
    """A date part as pandas types it: int32. Polars' month, day, hour, minute, second,
    quarter and weekday are Int8 and its ordinal_day Int16, where integer arithmetic wraps
    around without an error (month * 100 is -80 for December, hour * 3600 wraps at 9 o'clock);
    pandas' int32 holds every such key (year * 10000 + month * 100 + day). dt.year is Int32
    already."""
    return code.method("cast", INT32)


@rule("series.dt.year", "series.dt.month", "series.dt.day", "series.dt.hour",
      "series.dt.minute", "series.dt.second", "series.dt.quarter", "series.dt.dayofyear",
      "series.dt.day_of_year")
def component(call: PandasCall, ctx: RuleContext) -> Value:
    """s.dt.year / month / day / hour / minute / second / quarter / dayofyear -> dt.year() …
    (dayofyear -> dt.ordinal_day()).

    Handles: the same numbers (January 1 is day 1 in both); missing stays missing; Int32 as
    pandas' int32 (Polars' Int8 and Int16 parts would wrap around in arithmetic).
    Caveats: pandas' int32 becomes float64 when a date is missing (NaT); Polars keeps Int32
    with nulls. Set as a column, the result is given pandas' type where it is computed
    (Column.float_int NAT_FLOAT_MARK, rules/assign.py typed_at_run_time); used otherwise,
    files written, astype(str) and tolist() follow the nulls as pandas does, but a min, max,
    sum or single value prints 2024 where pandas prints 2024.0, and so does a group key or
    aggregate of it (0.95).
    """
    column = accessor_column(call)
    ctx.lower(NAT_MAKES_FLOAT, 0.95)
    code = _dt(column).method(_COMPONENTS[call.name])
    result = _result(column, code if call.name == "year" else _as_int32(code), "int")
    return replace(result, float_int=NAT_FLOAT_MARK)


@rule("series.dt.weekday", "series.dt.dayofweek", "series.dt.day_of_week")
def weekday(call: PandasCall, ctx: RuleContext) -> Value:
    """s.dt.weekday / dayofweek / day_of_week -> dt.weekday() - 1.

    Handles: pandas counts Monday as 0, Polars (ISO) as 1 (D03); Int32 as pandas' int32
    (Polars' Int8 would wrap around in arithmetic).
    Caveats: a missing date makes pandas' result float64, as for dt.year (0.95).
    """
    column = accessor_column(call)
    ctx.lower(NAT_MAKES_FLOAT, 0.95)
    result = _result(column, emit.binop(_as_int32(_dt(column).method("weekday")), "-", 1), "int")
    return replace(result, float_int=NAT_FLOAT_MARK)


@rule("series.dt.date")
def date(call: PandasCall, ctx: RuleContext) -> Value:
    """s.dt.date -> dt.date().

    Caveats: pandas holds Python date objects (object dtype), Polars a Date column.
    """
    column = accessor_column(call)
    return _result(column, _dt(column).method("date"), "date")


_NAMES = {"day_name": "%A", "month_name": "%B"}


@rule("series.dt.day_name", "series.dt.month_name")
def names(call: PandasCall, ctx: RuleContext) -> Value:
    """s.dt.day_name() / month_name() -> dt.to_string("%A") / dt.to_string("%B").

    Handles: English names in both (D04). Caveats: locale= is a TODO.
    """
    column = accessor_column(call)
    ctx.reject_unknown(call)
    return _result(column, _dt(column).method("to_string", _NAMES[call.name]), "str")


@rule("series.dt.normalize")
def normalize(call: PandasCall, ctx: RuleContext) -> Value:
    """s.dt.normalize() -> dt.truncate("1d").

    Handles: midnight of the same day; NaT stays missing; the unit is kept.
    Caveats: a column with a time zone is truncated to local midnight in both (a day whose
    midnight does not exist in that zone is an error in Polars).
    """
    column = accessor_column(call)
    ctx.reject_unknown(call)
    if column.dtype not in (None, "datetime"):
        raise ctx.todo(f"a {column.dtype} column")
    return _result(column, _dt(column).method("truncate", "1d"), "datetime")


def _zone(call: PandasCall, ctx: RuleContext) -> str | None:
    zone = call.const("tz", 0, kinds=(str, type(None)))
    if zone is not None and not re.fullmatch(r"UTC|[A-Za-z]+(?:[/_+-][A-Za-z0-9_+-]+)+", zone):
        raise ctx.todo(f"the time zone {zone!r}: porter ports UTC and named zones "
                       "('Europe/Paris'), which both libraries read from the same database")
    return zone


def _zone_set_here(column: Column) -> bool:
    """The column's expression gives it a time zone (tz_localize / tz_convert ported in it)."""
    return any(f".dt.{m}(" in column.code.text
               for m in ("replace_time_zone", "convert_time_zone"))


@rule("series.dt.tz_localize")
def tz_localize(call: PandasCall, ctx: RuleContext) -> Value:
    """s.dt.tz_localize(tz) -> dt.replace_time_zone(tz); tz_localize(None) ->
    dt.replace_time_zone(None).

    Handles: the wall-clock time kept, the zone set; a time that does not exist (spring
    forward) or is ambiguous (fall back) is an error in both (pandas' and Polars' default
    "raise"); None drops the zone and keeps the local time, as pandas does; NaT stays missing.
    Caveats: ambiguous=, nonexistent= and a zone computed at run time are TODOs.
    """
    column = accessor_column(call)
    ctx.reject_unknown(call, "tz", positional=1)
    if column.dtype not in (None, "datetime"):
        raise ctx.todo(f"a {column.dtype} column")
    return _result(column, _dt(column).method("replace_time_zone", _zone(call, ctx)), "datetime")


@rule("series.dt.tz_convert")
def tz_convert(call: PandasCall, ctx: RuleContext) -> Value:
    """s.dt.tz_convert(tz) -> dt.convert_time_zone(tz); tz_convert(None) -> the UTC time
    without a zone (dt.convert_time_zone("UTC").dt.replace_time_zone(None)).

    Handles: the same instant in another zone's local time (hour, date, strftime then read
    it, as in pandas); NaT stays missing.
    Caveats: pandas refuses a column without a time zone (TypeError), Polars reads it as UTC:
    only a column given its zone in the same expression (s.dt.tz_localize("UTC").dt.tz_convert
    (tz)) is ported, any other is a TODO.
    """
    column = accessor_column(call)
    ctx.reject_unknown(call, "tz", positional=1)
    if column.dtype not in (None, "datetime"):
        raise ctx.todo(f"a {column.dtype} column")
    zone = _zone(call, ctx)
    if not _zone_set_here(column):
        # porter does not follow a column's zone from statement to statement
        raise ctx.todo("a column porter does not know to have a time zone (pandas refuses "
                       "one without, Polars would read it as UTC): tz_localize it in the same "
                       "expression")
    code = _dt(column).method("convert_time_zone", zone or "UTC")
    if zone is None:  # pandas: the UTC wall-clock time, the zone dropped
        code = code.attr("dt").method("replace_time_zone", None)
    return _result(column, code, "datetime")


def _modern_freq(freq: Any, modern: Any, ctx: RuleContext) -> Any:
    """The frequency as pandas 3.1 names it: an alias it rejects ("T", "H", "A") read as the
    one pandas 2.2 renamed it to (legacy.py); any other value as given."""
    new = modern(freq)
    if new is None:
        return freq
    ctx.lower(f"freq={freq!r} is read as {new!r}, its name since pandas 2.2 (pandas 3.1 "
              "rejects the old one)", 1.0)
    return new


_FIXED_FLOOR = re.compile(r"^([1-9][0-9]*)?(D|h|min|s|ms|us)$")
_POLARS_UNIT = {"D": "d", "h": "h", "min": "m", "s": "s", "ms": "ms", "us": "us"}


@rule("series.dt.floor")
def floor(call: PandasCall, ctx: RuleContext) -> Value:
    """s.dt.floor("15min") -> dt.truncate("15m"): the start of the fixed-length step holding
    each value, steps counted from 1970-01-01 in both (before 1970 too).

    Handles: multiples of days, hours, minutes, seconds, milliseconds and microseconds; NaT
    stays missing; a column with a time zone is floored in its local time in both.
    Caveats: weeks, months and other calendar frequencies (pandas raises for them), the
    ambiguous/nonexistent options and a frequency computed at run time are TODOs.
    """
    column = accessor_column(call)
    ctx.reject_unknown(call, "freq", positional=1)
    if column.dtype not in (None, "datetime"):
        raise ctx.todo(f"a {column.dtype} column")
    freq = _modern_freq(call.const("freq", 0, None), modern_offset, ctx)
    found = _FIXED_FLOOR.match(freq) if isinstance(freq, str) else None
    if found is None:
        raise ctx.todo(f"freq={freq!r}: porter floors to multiples of D, h, min, s, ms, us")
    every = f"{found.group(1) or 1}{_POLARS_UNIT[found.group(2)]}"
    return _result(column, _dt(column).method("truncate", every), "datetime")


@dataclass(frozen=True)
class Periods(Column):
    """s.dt.to_period(freq): pandas' Period values, which Polars has no type for. Only their
    text (astype(str)) and their first instant (dt.to_timestamp(), dt.start_time) are ported;
    its rows are its own, so any other use hands it to pandas, which makes the periods again
    (`pandas`)."""

    text: Column = field(kw_only=True)  # astype(str), an expression of the frame
    start: Column = field(kw_only=True)  # each period's first instant
    pandas: Code = field(kw_only=True)
    key_prefix: str = field(default="series.periods", kw_only=True)
    kind: str | None = field(default=None, kw_only=True)  # pandas' dtype name: "period[M]"

    def aligned_in(self, frame: Frame) -> Column | None:
        """Put into the frame of its timestamps (`df["m"] = df["d"].dt.to_period("M")`): the
        column holds the periods' text, which orders as the periods do and is what pandas
        writes (to_csv, astype(str)); a missing period stays missing. Its dtype is pandas'
        name ("period[M]"): a hand-over to pandas makes the periods again from the text."""
        if self.text.frame.rows != frame.rows or self.kind is None:
            return None
        return replace(self.text, dtype=self.kind, nullable_int=NOT_NULLABLE)


def _week_text(time: Code) -> Code:
    start = time.attr("dt").method("truncate", "1w")  # Monday: pandas' W-SUN runs Monday-Sunday
    end = emit.binop(start, "+", emit.pl("duration", days=6))
    return emit.formatted("{}/{}", start.attr("dt").method("to_string", "%Y-%m-%d"),
                          end.attr("dt").method("to_string", "%Y-%m-%d"))


# pandas' period frequency -> (Polars' truncation to the period's start, the period's text
# from a timestamp in it)
_PERIODS = {
    "D": ("1d", lambda t: t.attr("dt").method("to_string", "%Y-%m-%d")),
    "h": ("1h", lambda t: t.attr("dt").method("to_string", "%Y-%m-%d %H:00")),
    "min": ("1m", lambda t: t.attr("dt").method("to_string", "%Y-%m-%d %H:%M")),
    "W": ("1w", _week_text), "W-SUN": ("1w", _week_text),
    "M": ("1mo", lambda t: t.attr("dt").method("to_string", "%Y-%m")),
    "Q": ("1q", lambda t: emit.formatted("{}Q{}", t.attr("dt").method("year"),
                                         t.attr("dt").method("quarter"))),
    "Y": ("1y", lambda t: t.attr("dt").method("to_string", "%Y")),
}
_PERIODS["Q-DEC"], _PERIODS["Y-DEC"] = _PERIODS["Q"], _PERIODS["Y"]
# pandas' dtype of the periods of each frequency
_PERIOD_DTYPES = {"D": "period[D]", "h": "period[h]", "min": "period[min]", "W": "period[W-SUN]",
                  "W-SUN": "period[W-SUN]", "M": "period[M]", "Q": "period[Q-DEC]",
                  "Q-DEC": "period[Q-DEC]", "Y": "period[Y-DEC]", "Y-DEC": "period[Y-DEC]"}


@rule("series.dt.to_period")
def to_period(call: PandasCall, ctx: RuleContext) -> Value:
    """s.dt.to_period(freq) -> the periods, for their text or their start (see Periods).

    Handles: D, h, min, W / W-SUN, M, Q / Q-DEC, Y / Y-DEC; astype(str) writes them as pandas
    does ("2024-03", "2024Q1", "2024-03-04/2024-03-10"), a missing value stays missing;
    dt.to_timestamp() and dt.start_time give each period's first instant; put into the frame
    of its timestamps, the column holds the periods' text (Periods.aligned_in), which groups,
    sorts, writes and prints as pandas' periods do (dtypes: period[M]).
    Caveats: other frequencies, and the periods used any other way (compared, added to, their
    .dt accessor, kept in a name) stay pandas.
    """
    column = accessor_column(call)
    ctx.reject_unknown(call, "freq", positional=1)
    freq = _modern_freq(call.const("freq", 0, None, kinds=(str,)), modern_period, ctx)
    if freq not in _PERIODS:
        raise ctx.todo("Polars has no period type: dt.truncate(freq) gives the period start "
                       f"(porter ports {', '.join(_PERIODS)})")
    if column.dtype != "datetime":
        raise ctx.todo("the column is not known to hold timestamps (run with --data, or parse "
                       "it with pd.to_datetime first)")
    every, text_of = _PERIODS[freq]
    start = _dt(column).method("truncate", every)
    text = _result(column, text_of(column.code), "str")
    pandas = handover.to_pandas(column).attr("dt").method("to_period", freq)
    frame = replace(column.frame, rows=fresh_token())  # Period values are not an expression
    return Periods(text.code, frame=frame, name=column.name, dtype=None, text=text,
                   start=_result(column, start, "datetime"), pandas=pandas,
                   kind=_PERIOD_DTYPES[freq])


@rule("series.periods.astype")
def periods_astype(call: PandasCall, ctx: RuleContext) -> Value:
    """periods.astype(str) -> their text, as pandas writes them."""
    periods = call.receiver
    assert isinstance(periods, Periods)
    ctx.reject_unknown(call, "dtype", positional=1)
    target = call.arg("dtype", 0)
    if not (isinstance(target, Opaque) and target.code.text in ("str", '"str"', "'str'")):
        raise ctx.todo("periods cast to something other than str")
    return periods.text


@rule("series.dt.to_timestamp", "series.dt.start_time")
def period_start(call: PandasCall, ctx: RuleContext) -> Value:
    """periods.dt.to_timestamp() / dt.start_time -> each period's first instant."""
    periods = accessor_column(call)
    if not isinstance(periods, Periods):
        raise ctx.todo("periods porter did not make")
    ctx.reject_unknown(call, "how", positional=1)
    if call.const("how", 0, "start") not in ("start", "s"):
        raise ctx.todo("how= other than the start")
    return periods.start


def _is_day(column: Column, name: str) -> Code:
    """The pandas .dt.is_* test as a Polars boolean expression (null where the value is)."""
    dt = _dt(column)
    day, month = dt.method("day"), dt.method("month")
    last = emit.binop(day, "==", dt.method("days_in_month"))
    first = emit.binop(day, "==", 1)
    if name == "is_month_start":
        return first
    if name == "is_month_end":
        return last
    if name == "is_year_start":
        return emit.binop(dt.method("ordinal_day"), "==", 1)
    if name == "is_year_end":
        return emit.binop(emit.binop(month, "==", 12), "&", emit.binop(day, "==", 31))
    if name == "is_quarter_start":
        return emit.binop(emit.binop(emit.binop(month, "%", 3), "==", 1), "&", first)
    if name == "is_quarter_end":
        return emit.binop(emit.binop(emit.binop(month, "%", 3), "==", 0), "&", last)
    assert name == "is_leap_year"
    return dt.method("is_leap_year")


@rule("series.dt.is_month_start", "series.dt.is_month_end", "series.dt.is_year_start",
      "series.dt.is_year_end", "series.dt.is_quarter_start", "series.dt.is_quarter_end",
      "series.dt.is_leap_year")
def is_day(call: PandasCall, ctx: RuleContext) -> Value:
    """s.dt.is_month_start / is_month_end / is_year_start … -> dt.day() == 1 … .fill_null(False).

    The same test on dt.day(), dt.month(), dt.ordinal_day(), dt.days_in_month() (is_year_end,
    is_quarter_start, is_quarter_end too; is_leap_year is dt.is_leap_year()).

    Handles: NaT gives False in pandas (a True/False column without missing values), so the
    missing results are filled with False; leap days and month ends of every length.
    """
    column = accessor_column(call)
    if column.dtype not in (None, "datetime"):
        raise ctx.todo(f"a {column.dtype} column")
    return _result(column, _is_day(column, call.name).method("fill_null", False), "bool")


@rule("series.dt.days_in_month", "series.dt.daysinmonth")
def days_in_month(call: PandasCall, ctx: RuleContext) -> Value:
    """s.dt.days_in_month -> dt.days_in_month().cast(pl.Int32).

    Handles: leap Februaries; NaT stays missing; Int32 as pandas' int32 (Polars' Int8 would
    wrap around in arithmetic).
    Caveats: pandas' int32 becomes float64 when a value is missing; Polars keeps Int32.
    """
    column = accessor_column(call)
    if column.dtype not in (None, "datetime"):
        raise ctx.todo(f"a {column.dtype} column")
    result = _result(column, _as_int32(_dt(column).method("days_in_month")), "int")
    return replace(result, float_int=NAT_FLOAT_MARK)


@rule("pd.Timestamp")
def timestamp(call: PandasCall, ctx: RuleContext) -> Value:
    """pd.Timestamp("2024-06-30") -> pl.datetime(2024, 6, 30) inside Polars expressions; the
    pandas Timestamp itself where plain Python uses the value.

    Handles: the text read by pandas itself (dates, dates with a time, "2024-06"); compared
    with, added to or subtracted from a datetime column (Timestamp - column is a duration).
    Caveats: a time zone, nanoseconds, "now"/"today", NaT and a value computed at run time are
    TODOs; Polars reads the datetime in the column's unit.
    """
    ctx.reject_unknown(call, "ts_input", positional=1)
    return _date_constant(call, call.const("ts_input", 0), None, ctx)


@rule("pd.Timestamp.now", "pd.Timestamp.today")
def timestamp_now(call: PandasCall, ctx: RuleContext) -> Value:
    """pd.Timestamp.now() / today() -> the same call, read once where the script reads it, and
    pl.lit() of it inside Polars expressions (the local time, without a time zone).

    Handles: compared with, added to or subtracted from a datetime column, as a Timestamp
    written out is.
    Caveats: a time zone (tz=) is a TODO; the time differs from one run to the next, so
    `porter verify` can only compare outputs that do not show it.
    """
    ctx.reject_unknown(call)
    assert call.node is not None
    import libcst as cst
    original = Code(cst.Module([]).code_for_node(call.node))
    return Scalar(original, pytype="datetime", expr=emit.pl("lit", original))


def _date_constant(call: PandasCall, text: object, fmt: str | None, ctx: RuleContext) -> Value:
    """A date written as text in the script, read by pandas itself at convert time (with
    pd.to_datetime's format when one is given)."""
    if not isinstance(text, str):
        raise ctx.todo("only a date written as text is ported")
    if text.strip().lower() in ("now", "today"):
        raise ctx.todo(f"{text!r} is read when the script runs")
    import warnings
    import pandas as pd
    try:
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")
            stamp = pd.Timestamp(text) if call.name == "pd.Timestamp" else pd.to_datetime(text, format=fmt)
    except (ValueError, TypeError, OverflowError):
        raise ctx.todo(f"{text!r} is not a date pandas can read") from None
    if stamp is pd.NaT:
        raise ctx.todo("NaT")
    if stamp.tzinfo is not None:
        raise ctx.todo("a date with a time zone")
    if stamp.nanosecond:
        raise ctx.todo("a date with nanoseconds (porter's datetimes hold microseconds)")
    parts = stamp_parts(stamp)
    assert call.node is not None
    import libcst as cst
    original = Code(cst.Module([]).code_for_node(call.node))
    return Scalar(original, pytype="datetime", expr=emit.pl("datetime", *parts))


def stamp_parts(stamp: Any) -> list[int]:
    """A Timestamp's year, month, day, then its time down to the last part that is not 0."""
    parts = [stamp.year, stamp.month, stamp.day, stamp.hour, stamp.minute, stamp.second,
             stamp.microsecond]
    while len(parts) > 3 and parts[-1] == 0:
        parts.pop()
    return parts


_ISO = {"year": ("iso_year", "Int32"), "week": ("week", "UInt32"), "day": ("weekday", "UInt32")}


@rule("series.dt.isocalendar.year", "series.dt.isocalendar.week", "series.dt.isocalendar.day")
def isocalendar_part(call: PandasCall, ctx: RuleContext) -> Value:
    """s.dt.isocalendar().year / .week / .day -> dt.iso_year() / dt.week() / dt.weekday(),
    cast to pandas' types (Int32, UInt32, UInt32).

    Handles: the ISO year of the days around New Year (2024-12-30 is week 1 of 2025); Monday
    is day 1 in both; NaT stays missing (<NA> in pandas' nullable columns). The column is
    marked as one of pandas' nullable integers (Column.nullable_int): to_csv writes it as
    integers (52, an empty field), values / tolist() and a hand-over to pandas give pandas'
    own (52, <NA>).
    Caveats: a comparison with <NA> is <NA> in pandas, missing here (a filter drops the row
    in both; printed it differs: 0.95). The whole frame isocalendar() makes is
    series.dt.isocalendar (isocalendar below).
    """
    column = accessor_column(call)
    if column.dtype not in (None, "datetime"):
        raise ctx.todo(f"a {column.dtype} column")
    ctx.lower("pandas' isocalendar() parts are nullable integers: with a missing date a "
              "comparison with the part is <NA> in pandas, missing here (printed, it differs)",
              0.95)
    method, dtype = _ISO[call.name]
    code = _dt(column).method(method).method("cast", emit.atom(f"pl.{dtype}"))
    # pandas' nullable integers (Int32, UInt32): to_csv, values and hand-overs read the mark
    return replace(derived_column(column, code, dtype="int", name=call.name), nullable_int=dtype)


@rule("series.dt.isocalendar")
def isocalendar(call: PandasCall, ctx: RuleContext) -> Value:
    """s.dt.isocalendar() -> pl.struct(year=dt.iso_year(), week=dt.week(), day=dt.weekday()),
    pandas' frame of the ISO year, week and day: its columns are expressions of the dates'
    frame, cast to pandas' types (year Int32, week and day UInt32).

    Handles: df[["year", "week", "day"]] = s.dt.isocalendar() (or other names, in order);
    df.join(s.dt.isocalendar()) on a frame whose row labels are 0..n-1; iso["week"], iso.week
    of it kept in a name; NaT is missing in every part (<NA> in pandas' nullable columns), the
    columns are marked as pandas' nullable integers (to_csv writes 52 and an empty field). The
    frame used any other way (printed, grouped, concatenated) is pandas' own, computed again
    from the dates.
    Caveats: a comparison with <NA> is <NA> in pandas, missing here (0.95, as for the parts).
    """
    column = accessor_column(call)
    ctx.reject_unknown(call)
    if column.dtype not in (None, "datetime"):
        raise ctx.todo(f"a {column.dtype} column")
    ctx.lower("pandas' isocalendar() parts are nullable integers: with a missing date a "
              "comparison with a part is <NA> in pandas, missing here (printed, it differs)",
              0.95)
    singles = tuple((label, _dt(column).method(method).method("cast", emit.atom(f"pl.{dtype}")))
                    for label, (method, dtype) in _ISO.items())
    node = call.node
    if not isinstance(node, cst.Call) or node.args:
        raise Unsupported("isocalendar() made outside a call porter can write again")
    receiver = handover.to_pandas(column).wrapped(emit.ATOM)
    ints = tuple((label, dtype) for label, (_, dtype) in _ISO.items())
    whole = None
    frame = column.frame
    if not frame.index and frame.labels_intact:
        # read as a frame (iso.head(), iso.to_csv(...)): the three columns selected from the
        # dates' frame, row for row, labelled 0..n-1 as the dates are
        whole = replace(
            select_columns(frame, frame.code.method("select", **dict(singles)), list(_ISO)),
            dtypes=tuple((label, "int") for label in _ISO), nullable_ints=ints, unsure_ints=())
    return Parts(emit.pl("struct", **dict(singles)), source=column,
                 fields=tuple((label, label) for label in _ISO), singles=singles,
                 width_known=True, pandas=emit.atom(f"{receiver}.dt.isocalendar()"),
                 ints=ints, whole=whole)


# -- formats --------------------------------------------------------------------------------

_SAME_FORMAT = set("YmdHMSybBpIj%")
_DIRECTIVE = re.compile(r"%(.)")


def _directives(fmt: str) -> list[str]:
    return [m.group(1) for m in _DIRECTIVE.finditer(fmt.replace("%%", ""))] + \
        (["%"] if "%%" in fmt else [])


@rule("series.dt.strftime")
def strftime(call: PandasCall, ctx: RuleContext) -> Value:
    """s.dt.strftime(fmt) -> dt.to_string(fmt).

    Handles: %Y %m %d %H %M %S %y %b %B %a %A %j %p %I %U %W %% read the same; %f (6 digits in
    Python, 9 in Polars) is written %6f.
    Caveats: other directives (%z, %Z, %c, %x, %-d …) are TODOs.
    """
    column = accessor_column(call)
    ctx.reject_unknown(call, "date_format", positional=1)
    fmt = call.const("date_format", 0)
    if not isinstance(fmt, str):
        raise ctx.todo("the format must be text")
    return _result(column, _dt(column).method("to_string", polars_strftime(fmt)), "str")


def polars_strftime(fmt: str) -> str:
    """A strftime format of pandas' as Polars' dt.to_string writes the same text with it:
    %Y %m %d %H %M %S %y %b %B %a %A %j %p %I %U %W %% read the same; %f (6 digits in Python,
    9 in Polars) is written %6f; other directives raise Unsupported."""
    other = sorted(set(_directives(fmt)) - _SAME_FORMAT - set("aAUWf"))
    if other:
        raise Unsupported(f"directives {', '.join('%' + d for d in other)} are not checked to "
                          "format the same in Polars")
    return re.sub(r"(?<!%)((?:%%)*)%f", r"\1%6f", fmt)


# pandas' strptime patterns (TimeRE in pandas/_libs/tslibs/strptime.pyx, English names), one
# group per directive. Digits are [0-9]: Rust's \d is any Unicode digit, and pandas rejects
# "０5". %Y is four digits other than 0000 (year 0 is out of pandas' range). pandas matches
# the whole pattern case-insensitively, a run of blanks in the format matching any run of
# whitespace, and refuses a value the pattern does not match to its end.
_STRPTIME = {
    "Y": "[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9])",
    "y": "[0-9][0-9]",
    "m": "1[0-2]|0[1-9]|[1-9]",
    "d": "3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9]",
    "H": "2[0-3]|[0-1][0-9]|[0-9]",
    "I": "1[0-2]|0[1-9]|[1-9]",
    "M": "[0-5][0-9]|[0-9]",
    "S": "6[0-1]|[0-5][0-9]|[0-9]",
    "f": "[0-9]{1,9}",
    "p": "am|pm",
    "b": "jan|feb|mar|apr|may|jun|jul|aug|sep|oct|nov|dec",
    "B": "september|february|november|december|january|october|august|march|april|june|july|may",
}
# pandas' texts for a missing timestamp, NaT even with errors="raise"
NAT_TEXTS = ["", "NaT", "nat", "NAT", "nan", "NaN", "NAN"]
_REGEX_META = set("\\.+*?()|[]{}^$")


@dataclass(frozen=True)
class Strptime:
    """A pandas format as a regex replacement and a chrono format: the pattern (pandas' own)
    rewrites a value it matches into `text`, which Polars reads with `chrono`; any other value
    keeps its text behind empty fields, which Polars cannot read."""

    pattern: str
    text: str
    chrono: str
    # the values pandas' pattern matches, whole (no rewriting), when chrono reads each of them
    # as pandas does with the format itself: numbers only (%Y %m %d %H %M %S, a date in it),
    # each followed by a separator. Matching is ten times cheaper than rewriting
    match: str | None = None


def _pattern(fmt: str, fields: dict[str, str], blanks: str) -> tuple[str, list[str]] | str:
    """The regex of `fmt` (one named group per directive, a run of blanks as `blanks`) and its
    directives, or why there is none."""
    pattern: list[str] = []
    seen: list[str] = []
    i = 0
    while i < len(fmt):
        char = fmt[i]
        if char == "%":
            directive = fmt[i + 1:i + 2]
            i += 2
            if directive == "%":
                pattern.append("%")
                continue
            if directive not in fields:
                return f"the directive %{directive}"
            if directive in seen:
                return f"%{directive} twice (pandas refuses the format)"
            seen.append(directive)
            pattern.append(f"(?P<{directive}>{fields[directive]})")
        elif char.isspace():
            while i < len(fmt) and fmt[i].isspace():
                i += 1
            pattern.append(blanks)
        else:
            pattern.append("\\" + char if char in _REGEX_META else char)
            i += 1
    return "".join(pattern), seen


def strptime_port(fmt: str, *, fields: dict[str, str] | None = None,
                  month_number: bool = False) -> Strptime | str:
    """pandas' strptime of `fmt` as a Strptime, or why it is not ported that way. `fields`:
    stricter patterns (case-sensitive, one blank for a blank, a whole match); `month_number`:
    a month name is written where the layout reads a number (the caller replaces it)."""
    found_pattern = _pattern(fmt, fields or _STRPTIME, " " if fields else r"\s+")
    if isinstance(found_pattern, str):
        return found_pattern
    body, seen = found_pattern
    found = set(seen)
    if not found:
        return "a format without directives"
    if ("I" in found) != ("p" in found):
        return "%I without %p (pandas reads 12 as 0) or %p without %I (ignored by pandas)"
    if len(found & {"Y", "y"}) > 1 or len(found & {"m", "b", "B"}) > 1 or \
            len(found & {"H", "I"}) > 1:
        return "one part of the date written twice"
    if "f" in found and "S" not in found:
        return "%f without %S"
    # every part pandas fills in when the format leaves it out: 1900-01-01 00:00:00. The
    # separators are not signs: an empty field (a value the pattern does not match) is never
    # read as a number
    year = next((d for d in "Yy" if d in found), None)
    month = next((d for d in "mbB" if d in found), None)
    hour = "I" if "I" in found else "H" if "H" in found else None
    pieces = [("${%s}" % year, f"%{year}") if year else ("1900", "%Y"),
              ("/", "/"),
              ("${%s}" % month, "%m" if month_number else f"%{month}") if month else ("1", "%m"),
              ("/", "/"),
              ("${d}", "%d") if "d" in found else ("1", "%d"),
              (" ", " "),
              ("${%s}" % hour, f"%{hour}") if hour else ("0", "%H"),
              (":", ":"),
              ("${M}", "%M") if "M" in found else ("0", "%M"),
              (":", ":"),
              ("${S}", "%S") if "S" in found else ("0", "%S")]
    if "f" in found:
        pieces.append((".${f}", "%.f"))
    if "p" in found:
        pieces.append((" ${p}", " %p"))
    pieces.append(("=", "="))  # what a match leaves over follows: Polars refuses it
    pattern = f"^(?:{body})$" if fields else f"(?i)^(?:{body})|^"
    # directives apart (chrono and pandas split "20240105" otherwise), no letter between
    # them (pandas matches them in any case, chrono as written)
    separated = re.search(r"%[YmdHMS]%", fmt) is None and "%%" not in fmt \
        and not any(c.isalpha() for c in re.sub(r"%[YmdHMS]", "", fmt))
    plain = {"Y", "m", "d"} <= found and found - {"Y", "m", "d"} in ({"H", "M"}, {"H", "M", "S"}, set()) \
        and separated and not fields  # (chrono reads no hour without its minutes)
    return Strptime(pattern=pattern, text="".join(p for p, _ in pieces),
                    chrono="".join(c for _, c in pieces),
                    match=f"(?i)^(?:{re.sub(r'[(][?]P<[A-Za-z]>', '(?:', body)})$" if plain else None)


# Without format=, pandas guesses one format from the first value (pandas.tseries.api.
# guess_datetime_format: month first, a year of 4 digits, months' names as written in English)
# and parses every value with it; another value is NaT, or an error. These are the formats
# porter follows: the first of them whose strict pattern reads the whole first value is
# pandas' guess (tests/test_rules_datetimes.py checks it value by value against
# guess_datetime_format). A first value pandas guesses no format for is read by dateutil
# value by value in pandas: no dates here, an error with errors="raise".
GUESSED_FORMATS = (
    "%Y-%m-%d", "%Y-%m-%d %H:%M", "%Y-%m-%d %H:%M:%S", "%Y-%m-%d %H:%M:%S.%f",
    "%Y-%m-%dT%H:%M:%S", "%Y-%m-%dT%H:%M:%S.%f", "%Y/%m/%d", "%Y%m%d",
    "%m/%d/%Y", "%d/%m/%Y", "%m/%d/%Y %H:%M", "%d/%m/%Y %H:%M", "%m/%d/%Y %H:%M:%S",
    "%d/%m/%Y %H:%M:%S", "%m.%d.%Y", "%d.%m.%Y",
    "%B %d, %Y", "%b %d, %Y", "%d %B %Y", "%d %b %Y",
)
# With dayfirst=True pandas guesses the same layouts day first where the first value reads as a
# real date that way: 01/05/2024 is %d/%m/%Y, and an ISO date too, 2024-01-05 being %Y-%d-%m
# (the 5th month; 2024-01-13 then does not fit it). A first value that does not read day first
# (05/13/2024, 2024-01-31) keeps the month-first format. Eight digits that read day first
# (20240105) get no format at all (DAYFIRST_UNGUESSED; dateutil reads each value in pandas);
# 20240131 is %Y%m%d. The names of months are read as without dayfirst.
_DAY_FIRST = {"%m/%d/%Y": "%d/%m/%Y", "%m/%d/%Y %H:%M": "%d/%m/%Y %H:%M",
              "%m/%d/%Y %H:%M:%S": "%d/%m/%Y %H:%M:%S", "%m.%d.%Y": "%d.%m.%Y"}


def _day_first(fmt: str) -> str:
    if fmt in _DAY_FIRST:
        return _DAY_FIRST[fmt]
    if fmt.startswith(("%Y-%m-%d", "%Y/%m/%d")):
        return fmt[:3] + "%d" + fmt[5] + "%m" + fmt[8:]
    return fmt


GUESSED_FORMATS_DAYFIRST = tuple(dict.fromkeys(
    f for fmt in GUESSED_FORMATS if fmt not in _DAY_FIRST.values()
    for f in (_day_first(fmt), fmt)))
DAYFIRST_UNGUESSED = "%Y%d%m"
_MONTHS = ("January", "February", "March", "April", "May", "June", "July", "August",
           "September", "October", "November", "December")
_GUESS_FIELDS = {
    "Y": "[1-9][0-9]{3}", "m": "1[0-2]|0[1-9]|[1-9]", "d": "3[01]|[12][0-9]|0[1-9]|[1-9]",
    "H": "2[0-3]|[01][0-9]|[0-9]", "M": "[0-5][0-9]|[0-9]", "S": "[0-5][0-9]|[0-9]",
    "f": "[0-9]{1,6}", "b": "|".join(m[:3] for m in _MONTHS),
    "B": "|".join(sorted(_MONTHS, key=len, reverse=True)),
}
# eight digits: pandas guesses no format for 2024015
_GUESS_COMPACT = {**_GUESS_FIELDS, "m": "1[0-2]|0[1-9]", "d": "3[01]|[12][0-9]|0[1-9]"}
# pandas' first value: the first that is not missing, not one of its texts for NaT, not
# "now" or "today"
_NOT_FIRST = [*NAT_TEXTS, "now", "today"]


def guess_selection(fmt: str) -> str:
    """The regex of the first values for which pandas guesses `fmt` (before the formats
    after it in GUESSED_FORMATS)."""
    found = _pattern(fmt, _GUESS_COMPACT if fmt in ("%Y%m%d", DAYFIRST_UNGUESSED) else _GUESS_FIELDS,
                     " ")
    assert not isinstance(found, str)
    return "^" + re.sub(r"\(\?P<.>", "(?:", found[0]) + "$"


def _guess_definition(dayfirst: bool = False) -> str:
    """The function, defined once at the top of a converted script, that reads dates as
    pd.to_datetime without format= reads them (see GUESSED_FORMATS), or with dayfirst=True
    (GUESSED_FORMATS_DAYFIRST)."""
    rows = []
    for fmt in GUESSED_FORMATS_DAYFIRST if dayfirst else GUESSED_FORMATS:
        port = strptime_port(fmt, month_number=True)
        assert isinstance(port, Strptime) and port.pattern.startswith("(?i)^(?:") \
            and port.pattern.endswith(")|^")  # the blanks around it are added there
        rows.append(f"            # {fmt}\n"
                    f"            ({guess_selection(fmt)!r},\n"
                    f"             {port.pattern!r},\n"
                    f"             {port.text!r}),\n")
    names = [*_MONTHS, *(m[:3] for m in _MONTHS)]
    numbers = [str(i % 12 + 1) for i in range(24)]
    unguessed = ""
    if dayfirst:
        port = strptime_port(DAYFIRST_UNGUESSED, month_number=True)
        assert isinstance(port, Strptime)
        unguessed = (
            "    # eight digits that read day first (20240105): pandas guesses no format and\n"
            "    # dateutil reads each value by itself; no dates here (an error with raise)\n"
            f"    unguessed = (first.str.contains({guess_selection(DAYFIRST_UNGUESSED)!r})\n"
            f"                 & read(first.str.replace({port.pattern!r},\n"
            f"                                          {port.text!r}), False).is_not_null())\n")
    return (
        f"def {GUESS_DAYFIRST_FUNCTION if dayfirst else GUESS_FUNCTION}(text, coerce):\n"
        '    """pd.to_datetime(text) without format=, as pandas reads it: pandas guesses one\n'
        "    format from the first value (the first format below whose first pattern reads a\n"
        "    real date in it) and reads every value with it (the second pattern); a value it\n"
        "    does not fit is missing (coerce) or an error, as is a first value in none of\n"
        + ("    these formats. Day first (dayfirst=True): 01/05/2024 is the 1st of May, as\n"
           '    2024-01-05 is. Each value is rewritten into one layout Polars reads."""\n'
           if dayfirst else
           '    these formats. Each value is rewritten into one layout Polars reads."""\n') +
        "    def read(layouts, strict):\n"
        f"        return (layouts.str.replace_many({names!r},\n"
        f"                                          {numbers!r},\n"
        "                                          ascii_case_insensitive=True, leftmost=True)\n"
        f"                .str.to_datetime({_GUESS_LAYOUT!r}, time_unit=\"us\", strict=strict))\n"
        "\n"
        f"    first = text.filter(~text.is_in({_NOT_FIRST!r})).first()\n"
        "    written = text\n"
        "    if not coerce:  # pandas' texts for NaT are missing, not an error\n"
        f"        text = text.replace({NAT_TEXTS!r}, None)\n"
        "    # blanks before or after the first value are part of pandas' format (' %Y-%m-%d'):\n"
        "    # every value needs a run of blanks there\n"
        '    bare, lead, trail = (~first.str.contains(r"^\\s|\\s$"), first.str.contains(r"^\\s"),\n'
        '                         first.str.contains(r"\\s$"))\n'
        "    first = first.str.strip_chars()\n"
        + unguessed +
        "\n"
        "    def blanks(pattern, front, back):\n"
        '        return pattern.replace("^(?:", "^(?:" + front, 1)[:-3] + back + ")|^"\n'
        "\n"
        "    formats = FORMATS\n"
        "    fits = [first.str.contains(selection)\n"
        "            & read(first.str.replace(pattern, layout), False).is_not_null()\n"
        "            for selection, pattern, layout in formats]\n"
        "    guessed = [\n"
        "        pl.when(fit)\n"
        "        .then(pl.when(bare).then(text.str.replace(pattern, layout))\n"
        '              .when(~trail).then(text.str.replace(blanks(pattern, r"\\s+", ""), layout))\n'
        '              .when(~lead).then(text.str.replace(blanks(pattern, "", r"\\s+"), layout))\n'
        '              .otherwise(text.str.replace(blanks(pattern, r"\\s+", r"\\s+"), layout)))\n'
        "        for fit, (selection, pattern, layout) in zip(fits, formats)\n"
        "    ]\n"
        + ("    # a first value in none of these formats (a word, an impossible day such as\n"
           "    # 2024-02-30, am/pm, a time zone, eight digits that read day first): pandas\n"
           "    # guesses another format or none and reads the values its own way, so pandas\n"
           "    # reads them here\n" if dayfirst else
           "    # a first value in none of these formats (a word, an impossible day such as\n"
           "    # 2024-02-30, am/pm, a time zone): pandas guesses another format or none and\n"
           "    # reads the values its own way, so pandas reads them here\n") +
        "    known = first.is_null() | pl.any_horizontal(fits)"
        + (" & ~unguessed" if dayfirst else "") + "\n"
        "\n"
        "    def by_pandas(columns):\n"
        "        values, known = columns\n"
        "        if known.len() == 0 or known.all():\n"
        '            return pl.Series(values.name, [None] * values.len(), dtype=pl.Datetime("us"))\n'
        '        pandas = __import__("pandas")\n'
        "\n"
        '        dates = pandas.to_datetime(values.to_pandas(), errors="coerce" if coerce else "raise"'
        + (", dayfirst=True" if dayfirst else "") + ")\n"
        '        if dates.dtype.kind != "M" or getattr(dates.dtype, "tz", None) is not None:\n'
        '            raise ValueError("pandas reads these values as dates with a time zone, "\n'
        '                             "which this port does not hold")\n'
        '        return pl.from_pandas(dates).cast(pl.Datetime("us"))\n'
        "\n"
        "    ours = read(pl.when(known).then(pl.coalesce(guessed if coerce else [*guessed, text])),\n"
        "                not coerce)\n"
        '    return pl.coalesce(ours, pl.map_batches([written, known], by_pandas,\n'
        '                                            return_dtype=pl.Datetime("us")))\n'
    ).replace("    formats = FORMATS\n", "    formats = [\n" + "".join(rows).replace("            ", "        ") + "    ]\n")


def formatted_parse(column: Code, fmt: str, port: Strptime, *, coerce: bool) -> Code:
    """pd.to_datetime(column, format=fmt) of a text column, `port` being strptime_port(fmt):
    the values pandas' pattern matches parse, the others are missing (coerce) or an error."""
    options: dict[str, object] = {"strict": False} if coerce else {}
    if port.match is not None:
        # the values pandas' pattern matches are read by chrono with the format as written;
        # any other value is missing (coerce) or, but for pandas' texts for NaT, an unreadable
        # text (raise)
        matched = column.attr("str").method("contains", port.match)
        kept = emit.when(matched, column)
        if not coerce:
            unreadable = emit.binop(emit.unary("~", column.method("is_in", NAT_TEXTS)), "&",
                                    column.method("is_not_null"))
            kept = kept.method("when", unreadable).method("then", emit.pl("lit", "="))
        return kept.attr("str").method("to_datetime", fmt, time_unit="us", **options)
    source = column
    if not coerce:  # pandas' texts for NaT are missing, not an error
        source = source.method("replace", NAT_TEXTS, None)
    return source.attr("str").method("replace", port.pattern, port.text) \
        .attr("str").method("to_datetime", port.chrono, time_unit="us", **options)


def guessed_parse(column: Code, *, coerce: bool, dayfirst: bool = False) -> Code:
    """pd.to_datetime(column) without format=: the format pandas guesses from the first value,
    among GUESSED_FORMATS (GUESSED_FORMATS_DAYFIRST with dayfirst=True), applied to every
    value as an explicit format is."""
    return emit.call(GUESS_DAYFIRST_FUNCTION if dayfirst else GUESS_FUNCTION, column, coerce=coerce)


_GUESS_LAYOUT = "%Y/%m/%d %H:%M:%S%.f="
GUESS_FUNCTION = "pandas_to_datetime"
GUESS_DEFINITION = _guess_definition()
GUESS_DAYFIRST_FUNCTION = "pandas_to_datetime_dayfirst"
GUESS_DAYFIRST_DEFINITION = _guess_definition(dayfirst=True)
GUESS_REASON = ("no format: pandas guesses one from the first value and reads every value "
                "with it; porter follows its guess for ISO dates and times, 01/05/2024 (month "
                "first, or day first from 13/01/2024), 20240105, 5 Jan 2024 and Jan 5, 2024; "
                "a first value in another layout (a two-digit year, a time zone, am/pm, an "
                "impossible day such as 02/30/2024, a word) is read by pandas itself at run "
                "time (pandas is imported then); write format= to be sure")
GUESS_DAYFIRST_REASON = (
    "no format, dayfirst=True: pandas guesses one from the first value, day first where it "
    "reads that way (01/05/2024 and 2024-01-05 are the 1st of May), and reads every value with "
    "it; porter follows its guess for ISO dates and times, 01/05/2024, 01.05.2024, 20240131, "
    "5 Jan 2024 and Jan 5, 2024; a first value in another layout (a two-digit year, a time "
    "zone, am/pm, eight digits that read day first such as 20240105, a word) is read by "
    "pandas itself at run time (pandas is imported then); write format= to be sure")


def _written_values(column: Column, ctx: RuleContext) -> list[list[object]]:
    """The values of the column when they are written in the script: pd.Series([...]) or
    pd.DataFrame({"c": [...]}) assigned to the name of its frame (each such assignment: a
    false match only keeps a call on pandas), or pl.LazyFrame({...}) as the frame's code."""
    import ast
    if not column.code.text.startswith("pl.col("):
        return []
    try:
        name = ast.literal_eval(column.code.text.removeprefix("pl.col(").removesuffix(")"))
        frame = ast.parse(column.frame.code.text, mode="eval").body
    except (SyntaxError, ValueError, TypeError, RecursionError):
        return []
    sources: list[ast.expr] = []
    if isinstance(frame, ast.Call):
        sources.append(frame)
    elif isinstance(frame, ast.Name) and isinstance(ctx.python_module, ast.Module):
        sources += [node.value for node in ast.walk(ctx.python_module)
                    if isinstance(node, ast.Assign) and isinstance(node.value, ast.Call)
                    and any(isinstance(t, ast.Name) and t.id == frame.id for t in node.targets)]
    found = []
    for call in sources:
        if not (isinstance(call, ast.Call) and isinstance(call.func, ast.Attribute) and call.args):
            continue
        listed: ast.expr | None = call.args[0]
        if isinstance(listed, ast.Dict):
            listed = next((v for k, v in zip(listed.keys, listed.values)
                           if isinstance(k, ast.Constant) and k.value == name), None)
        elif call.func.attr != "Series":
            continue
        try:
            values = ast.literal_eval(listed) if listed is not None else None
        except (ValueError, TypeError, SyntaxError, RecursionError):
            continue
        if isinstance(values, (list, tuple)):
            found.append(list(values))
    return found


def _first_written_values(column: Column, ctx: RuleContext) -> list[str]:
    """The first value pandas guesses a format from, of each list of texts written in the
    script the column may come from (_written_values)."""
    firsts = []
    for values in _written_values(column, ctx):
        texts = [t.strip() for t in values if isinstance(t, str) and t.strip() not in _NOT_FIRST]
        firsts += texts[:1]
    return firsts


def parse_format(fmt: str, ctx: RuleContext, *, years_fixed: bool = False) -> str:
    """A pandas (strptime) format as a Polars (chrono) format, or a TODO (`years_fixed`: the
    caller moves chrono's 2069 of %y to pandas' 1969)."""
    if fmt in ("mixed", "ISO8601"):
        # each value is read by itself: dateutil ("mixed", day or month first per value, any
        # layout it recognises), or pandas' ISO 8601 parser (2024/01/05, 2024-01, 2024,
        # 20240105T1000 too, and offsets that make the column zone-aware or an error)
        raise ctx.todo(f"format={fmt!r}: pandas reads each value by itself "
                       f"({'dateutil' if fmt == 'mixed' else 'its ISO 8601 parser'}); a coalesce "
                       "of str.to_datetime(f, strict=False) over a fixed list of formats is not "
                       "identical in general: list the formats the data holds, parse each with "
                       "format= and errors='coerce', and fill one from the other")
    other = sorted(set(_directives(fmt)) - _SAME_FORMAT - {"f"})
    if other:
        raise ctx.todo(f"directives {', '.join('%' + d for d in other)} are not checked to "
                       "parse the same in Polars")
    if "%y" in fmt and not years_fixed:
        ctx.lower("%y: pandas reads 69 as 1969, Polars as 2069", 0.95)
    if "%f" in fmt:
        if ".%f" not in fmt or fmt.count("%f") > 1:
            raise ctx.todo("%f is ported only after a dot (.%f)")
        ctx.lower(".%f: Polars also accepts a missing fraction and keeps microseconds "
                  "where pandas keeps nanoseconds", 0.9)
        fmt = fmt.replace(".%f", "%.f")
    return fmt


def _from_epoch(call: PandasCall, column: Value, ctx: RuleContext) -> Value:
    """pd.to_datetime(col, unit="s" / "ms" / "us") of whole numbers -> pl.from_epoch(col,
    unit) in porter's microseconds; a missing number is NaT in both."""
    unit = call.const("unit", None, None)
    if unit not in ("s", "ms", "us") or call.has("format") or call.has("errors"):
        raise ctx.todo(f"unit={unit!r} (porter reads whole seconds, milliseconds or "
                       "microseconds since 1970, without format= or errors=)")
    if not isinstance(column, Column) or column.dtype not in ("int", "float"):
        raise ctx.todo("unit= of something other than a column of numbers")
    numbers = column.code
    if column.dtype == "float":
        # a column of whole numbers with missing values (read from a file with blanks) is
        # float64 in pandas: it reads them as it reads whole numbers (datetime64[us], NaN is
        # NaT); a number with a fraction makes pandas keep nanoseconds, cut here to the unit
        if any(isinstance(v, float) and v == v and not v.is_integer()
               for values in _written_values(column, ctx) for v in values):
            raise ctx.todo("a number with a fraction: pandas keeps nanoseconds (datetime64[ns])")
        ctx.lower("a float column: a number with a fraction makes pandas keep nanoseconds "
                  "(datetime64[ns]); here it is cut to the whole unit", 0.9)
        numbers = numbers.method("fill_nan", None).method("cast", emit.atom("pl.Int64"))
    code = emit.pl("from_epoch", numbers, time_unit=unit)
    if unit != "us":
        code = code.method("cast", emit.atom('pl.Datetime("us")'))
    return derived_column(column, code, dtype="datetime")


@rule("pd.to_datetime")
def to_datetime(call: PandasCall, ctx: RuleContext) -> Value:
    """pd.to_datetime(col, format=, errors=) -> col.str.replace(pandas' pattern, one layout)
    .str.to_datetime(that layout, strict=...).

    Handles: with format= of %Y %y %m %d %H %I %p %M %S %f %b %B, pandas' own pattern of the
    format decides which values parse: %Y exactly four digits ("05/01/24" is NaT), one or two
    digits for the others, a leading space only for %d (" 5"), a blank in the format matching
    any run of whitespace, letters in any case, nothing left over; a value it refuses is null
    with errors="coerce" and an error with errors="raise", as in pandas. Each value it matches
    is rewritten into one layout Polars reads (chrono alone takes "24" for %Y and spaces
    before any number). The parts a format leaves out are pandas' 1900-01-01 00:00:00 (a
    time-only format such as "%H:%M"). "", "NaT" and "nan" are NaT with errors="raise" too;
    %y's 69 is read as 1969 as Python reads it; a column that already holds datetimes is kept.
    Without format=, pandas_to_datetime (defined once at the top of the script) follows
    pandas' guess of one format from the first value among GUESSED_FORMATS (ISO dates and
    times, 01/05/2024 month first or 13/01/2024 day first, 20240105, Jan 5, 2024, 5 Jan 2024)
    and reads every value with it: the values it does not fit are NaT, or an error.
    dayfirst=True (pandas_to_datetime_dayfirst): the same guess day first where the first
    value reads that way (01/05/2024 and 2024-01-05 are the 1st of May; 05/13/2024 and
    2024-01-31 keep the month-first format); with format= dayfirst is ignored, as in pandas.
    Caveats: without a format, a first value in another layout (two-digit years, time zones,
    am/pm, an impossible day, a word), and day first a first value of eight digits that reads
    day first (20240105), is read by pandas its own way (dateutil value by value): pandas
    reads the column at run time here too, imported for it (0.8; dates with a time zone stop
    the script); %f keeps microseconds where pandas keeps
    nanoseconds (0.9); other directives (%j) keep Polars' own parser, which also takes values
    pandas refuses (0.8); a second of 61 rolls over into the next minute in pandas and is
    missing here; a year in non-ASCII digits ("２024") and year 0000 in an ISO format (an error
    in pandas even with errors="coerce") are missing here; a list or a frame stays on
    pandas. A date written in the script (pd.to_datetime("2024-03-01"), format= allowed) is
    the Timestamp pandas reads from it at convert time, as pd.Timestamp. unit="s" / "ms" /
    "us" of a column of numbers is pl.from_epoch; a float column's fractions (nanoseconds in
    pandas) are cut to the unit (0.9); other units are TODOs. utc=True of text or epoch
    numbers without a zone of their own: the same times in UTC (_in_utc).
    infer_datetime_format= (removed in pandas 3) is left out (rules/legacy.py).
    """
    if "infer_datetime_format" in call.kwargs:
        from porter.rules.legacy import without_infer_datetime_format
        call = without_infer_datetime_format(call, ctx)
    ctx.reject_unknown(call, "arg", "errors", "format", "unit", "utc", "dayfirst", positional=1)
    if call.const("utc", None, False, kinds=(bool,)):
        return _in_utc(call, ctx)
    column = call.arg("arg", 0)
    if call.has("unit"):
        return _from_epoch(call, column, ctx)
    if isinstance(column, Opaque) and isinstance(column.const, str) and not call.has("errors"):
        # pd.to_datetime("2024-03-01"): a Timestamp, as pd.Timestamp("2024-03-01") is
        fmt = call.const("format", None, None)
        if fmt is not None and not isinstance(fmt, str):
            raise ctx.todo("the format must be text")
        return _date_constant(call, column.const, fmt, ctx)
    if not isinstance(column, Column):
        raise ctx.todo("only a column of a frame is ported; a scalar, a list or a frame "
                       "stays on pandas")
    errors = call.const("errors", None, "raise")
    if errors not in ("raise", "coerce"):
        raise ctx.todo(f"errors={errors!r}")
    if column.dtype == "datetime":
        return derived_column(column, column.code, dtype="datetime")
    if column.dtype in ("int", "float"):
        raise ctx.todo("a number column: pandas reads numbers as epoch nanoseconds")
    if column.dtype not in (None, "str"):
        raise ctx.todo(f"a {column.dtype} column")
    if column.dtype is None:
        ctx.lower("assumes the column holds text (its type is unknown without --data)", 0.9)
    fmt = call.const("format", None, None)
    # dayfirst= only changes pandas' guess of a format: an explicit format is read as written
    dayfirst = call.const("dayfirst", None, False, kinds=(bool,))
    options: dict[str, object] = {"strict": False} if errors == "coerce" else {}
    text = column.code.attr("str")
    nat_texts = '"" and "NaT" are missing in pandas and an error in Polars (strict)'
    if fmt is None:
        guessed = GUESSED_FORMATS_DAYFIRST if dayfirst else GUESSED_FORMATS
        for first in _first_written_values(column, ctx):
            unguessed = dayfirst and re.fullmatch(guess_selection(DAYFIRST_UNGUESSED), first)
            if any(re.fullmatch(guess_selection(f), first) for f in guessed) and not unguessed:
                continue
            # the values are written in the script: pandas reads a first value in another
            # layout ("1/1/2020 10:00:00+00:00": a time zone) value by value, the converted
            # pandas_to_datetime would find no format and fail
            raise ctx.todo(f"the first date {first!r} is in a layout pandas reads value by "
                           "value (dateutil); write format= to port it")
        ctx.lower(GUESS_DAYFIRST_REASON if dayfirst else GUESS_REASON, 0.8)
        code = guessed_parse(column.code, coerce=errors == "coerce", dayfirst=dayfirst)
    else:
        if not isinstance(fmt, str):
            raise ctx.todo("the format must be text")
        port = strptime_port(fmt) if fmt not in ("mixed", "ISO8601") else "mixed"
        if isinstance(port, Strptime):
            # pandas' own pattern decides which values parse (chrono alone takes "24" for %Y,
            # "2024 0105" for %Y%m%d, " 1" for %m); each value it matches is rewritten into
            # one fixed layout Polars reads, with pandas' 1900-01-01 for the parts the format
            # leaves out
            code = formatted_parse(column.code, fmt, port, coerce=errors == "coerce")
            if "%f" in fmt:
                ctx.lower("%f: Polars keeps microseconds where pandas keeps nanoseconds", 0.9)
        else:
            code = text.method("to_datetime", parse_format(fmt, ctx, years_fixed=True),
                               **options)
            ctx.lower(f"{port}: Polars' parser also takes values pandas refuses (a year "
                      "of fewer than 4 digits, spaces inside a number)", 0.8)
            if errors == "raise":
                ctx.lower(nat_texts, 0.95)
            if errors == "coerce" and not fmt[:1].isspace():
                # pandas does not match a value with leading blanks to the format (NaT);
                # Polars skips them
                code = emit.when(emit.unary("~", text.method("contains", r"^\s")), code)
        if "%y" in fmt:
            # Python reads the two-digit year 69 as 1969, chrono as 2069 (the others agree)
            code = emit.when(emit.binop(code.attr("dt").method("year"), "==", 2069),
                             code.attr("dt").method("offset_by", "-100y"), code)
    return derived_column(column, code, dtype="datetime")


def _in_utc(call: PandasCall, ctx: RuleContext) -> Value:
    """pd.to_datetime(..., utc=True) of text read with format= (no %z) or of epoch numbers:
    the times read as pandas reads them, in UTC (dt.replace_time_zone("UTC")): the same
    instants, a zone-aware column (written 2024-03-01 10:00:00+00:00)."""
    column = call.arg("arg", 0)
    fmt = call.const("format", None, None)
    if not isinstance(column, Column) or column.dtype not in (None, "str", "int", "float"):
        raise ctx.todo("utc=True of something other than a column of text or numbers (a "
                       "column of datetimes may carry a zone of its own)")
    if isinstance(fmt, str) and re.search(r"%[zZ]", fmt):
        raise ctx.todo("utc=True with a zone in the format: each value's offset is converted")
    if column.dtype in (None, "str") and not call.has("unit") and fmt is None:
        # text given utc=True is most often text with offsets, which pandas reads value by
        # value and converts; porter's guess of a format reads none
        raise ctx.todo("utc=True of text without format=: the text may carry offsets "
                       "(+02:00), which pandas converts to UTC; give the format to port it")
    local = to_datetime(replace(call, kwargs={k: v for k, v in call.kwargs.items()
                                              if k != "utc"}), ctx)
    assert isinstance(local, Column)
    return replace(local, code=local.code.attr("dt").method("replace_time_zone", "UTC"))


# -- durations: pd.Timedelta, pd.to_timedelta, .dt.days, .dt.total_seconds() ------------------
#
# pandas 3 keeps a Timedelta made from whole units in microseconds, as it keeps the datetimes it
# parses, and porter's datetime columns are microseconds too. A Timedelta written out in the
# script becomes a Scalar with two forms: `pl.duration(...)` inside Polars expressions, and the
# same duration as a Python timedelta (`pl.select(pl.duration(...)).item()`) where plain Python
# uses the value (a name, arithmetic with a collected Timestamp, a call porter leaves on pandas).

_US_PER = {"W": 7 * 86_400_000_000, "D": 86_400_000_000, "h": 3_600_000_000,
           "m": 60_000_000, "s": 1_000_000, "ms": 1_000, "us": 1}
# unit spellings pandas 3.1 reads the same in a text ("2D", "6 hours") and in unit=; the ones it
# keeps in nanoseconds (ns, nanos) are left out (tests/test_rules_datetimes.py checks each one)
_UNITS = {
    "W": "W", "w": "W", "D": "D", "d": "D", "day": "D", "days": "D",
    "h": "h", "H": "h", "hr": "h", "hour": "h", "hours": "h",
    "m": "m", "min": "m", "minute": "m", "minutes": "m",
    "s": "s", "S": "s", "sec": "s", "second": "s", "seconds": "s",
    "ms": "ms", "millisecond": "ms", "milliseconds": "ms",
    "us": "us", "microsecond": "us", "microseconds": "us",
}
_KEYWORDS = {"weeks": "W", "days": "D", "hours": "h", "minutes": "m", "seconds": "s",
             "milliseconds": "ms", "microseconds": "us"}
_TEXT = re.compile(r"\s*([+-]?)(\d+)\s*([A-Za-z]+)\s*")
# beyond ±106751 days (the nanosecond range) pandas changes the Timedelta's unit or refuses it
_LIMIT_US = (2**63 - 1) // 1000
_PARTS = (("days", 86_400_000_000), ("hours", 3_600_000_000), ("minutes", 60_000_000),
          ("seconds", 1_000_000), ("microseconds", 1))


def _whole_us(number: object, unit: str, ctx: RuleContext) -> int:
    """`number` of `unit` in microseconds; a TODO unless it is exact."""
    if isinstance(number, bool) or not isinstance(number, (int, float)):
        raise ctx.todo(f"{number!r}: only a number written out is ported")
    exact = Fraction(number) * _US_PER[unit]
    if exact.denominator != 1:
        raise ctx.todo(f"{number!r} {unit} is not a whole number of microseconds")
    return int(exact)


def _unit(spelling: object, ctx: RuleContext) -> str:
    if not isinstance(spelling, str) or spelling not in _UNITS:
        raise ctx.todo(f"unit {spelling!r} (porter reads {', '.join(sorted(set(_UNITS)))})")
    return _UNITS[spelling]


def _from_text(text: str, ctx: RuleContext) -> int:
    match = _TEXT.fullmatch(text)
    if match is None or match.group(3) not in _UNITS:
        raise ctx.todo(f"the text {text!r}: porter reads a whole number and one unit, "
                       'such as "2D", "6h" or "30 minutes"')
    sign, number, unit = match.groups()
    return (-1 if sign == "-" else 1) * int(number) * _US_PER[_UNITS[unit]]


def duration_code(microseconds: int) -> Code:
    """pl.duration(...) for a whole number of microseconds (days=1, hours=12 for 1.5 days)."""
    sign, rest = (-1 if microseconds < 0 else 1), abs(microseconds)
    parts: dict[str, object] = {}
    for name, size in _PARTS:
        count, rest = divmod(rest, size)
        if count:
            parts[name] = sign * count
    return emit.pl("duration", **parts)


def timedelta_scalar(microseconds: int, ctx: RuleContext) -> Scalar:
    if abs(microseconds) > _LIMIT_US:
        raise ctx.todo("beyond ±106751 days pandas keeps a Timedelta in seconds, or refuses it")
    expr = duration_code(microseconds)
    if ctx.shown:
        ctx.lower("printed: Python's timedelta reads '7 days, 0:00:00' where pandas' Timedelta "
                  "reads '7 days 00:00:00'", 0.9)
    return Scalar(emit.pl("select", expr).method("item"), pytype="timedelta", expr=expr)


@rule("pd.Timedelta")
def timedelta(call: PandasCall, ctx: RuleContext) -> Value:
    """pd.Timedelta(days=7) / pd.Timedelta("2D") / pd.Timedelta(3, unit="h") -> pl.duration(days=7)
    inside expressions, a Python timedelta elsewhere.

    Handles: weeks= … microseconds= (whole microseconds, floats such as hours=1.5 included),
    a whole number and one unit as text ("2D", "6 hours", "-1D"), a number with unit=; all are
    microseconds in pandas 3, like the datetimes porter reads.
    Caveats: nanoseconds, numbers without a unit (nanoseconds in pandas), other texts
    ("1 days 02:00:00", "1.5h", "NaT") and values computed at run time are TODOs; printed, a
    Python timedelta reads '7 days, 0:00:00' (0.9).
    """
    ctx.reject_unknown(call, "value", "unit", *_KEYWORDS, positional=2)
    parts = {k: call.const(k) for k in _KEYWORDS if k in call.kwargs}
    if call.has("value", 0):
        if parts:
            raise ctx.todo("a value together with keyword units")
        return timedelta_scalar(_value_us(call, ctx), ctx)
    if call.has("unit", 1) or not parts:
        raise ctx.todo("a unit without a value, or no value at all")
    return timedelta_scalar(sum(_whole_us(n, _KEYWORDS[k], ctx) for k, n in parts.items()), ctx)


_NUMPY_UNITS = {"W": "W", "D": "D", "h": "h", "m": "m", "s": "s", "ms": "ms", "us": "us"}


@rule("np.timedelta64")
def numpy_timedelta(call: PandasCall, ctx: RuleContext) -> Value:
    """np.timedelta64(1, "h") -> pl.duration(hours=1) inside expressions, as pd.Timedelta.

    Handles: a whole number and one of numpy's units W, D, h, m (minutes), s, ms, us.
    Caveats: months and years ("M", "Y": not a fixed length), nanoseconds and no unit are TODOs.
    """
    ctx.reject_unknown(call, positional=2)
    value = call.const("value", 0, kinds=(int,))
    unit = call.const("unit", 1, None, kinds=(str,))
    if unit not in _NUMPY_UNITS:
        raise ctx.todo(f"numpy unit {unit!r} (porter reads {', '.join(_NUMPY_UNITS)})")
    return timedelta_scalar(_whole_us(value, _NUMPY_UNITS[unit], ctx), ctx)


def _value_us(call: PandasCall, ctx: RuleContext) -> int:
    """The `value` (and `unit`) argument of pd.Timedelta / pd.to_timedelta in microseconds."""
    value = call.const("value" if call.name == "Timedelta" else "arg", 0)
    unit = call.const("unit", 1, None)
    if isinstance(value, str):
        if unit is not None:
            raise ctx.todo("a text with unit= (pandas refuses it)")
        return _from_text(value, ctx)
    if unit is None:
        raise ctx.todo("a number without unit= is nanoseconds in pandas")
    if isinstance(value, float):
        raise ctx.todo("a fractional number with unit= is kept in nanoseconds by pandas")
    return _whole_us(value, _unit(unit, ctx), ctx)


@rule("pd.to_timedelta")
def to_timedelta(call: PandasCall, ctx: RuleContext) -> Value:
    """pd.to_timedelta(3, unit="D") / pd.to_timedelta("2D") -> pl.duration(days=3) (as
    pd.Timedelta).

    A column of numbers with unit= -> pl.duration(days=pl.col("n")) (weeks= … microseconds=):
    NaN and None become missing, as NaT. A column of text with errors="coerce" ->
    pandas_duration(texts), defined at the top of the script: "5h", "1h30m", "2 days 3
    hours", "[-][D days ]H:MM:SS[.ffffff]", "-1 days +23:00:00", ISO 8601 "P1DT2H", read by
    str.extract_groups into pl.duration as pandas reads them (see _TEXT_DURATION), anything
    else missing; unit= changes nothing there, as in pandas.
    Caveats: a float column keeps fractions below a microsecond in pandas (nanoseconds), not
    here (0.95); text in a form pandas reads beyond these is missing here (0.9: a number
    alone, a fraction with a unit, nanoseconds); a column of text without errors="coerce"
    (pandas raises on a text it cannot read, and on text with unit=), a column without unit=
    that is not text, a list, a fractional number alone (nanoseconds in pandas) are TODOs.
    """
    ctx.reject_unknown(call, "arg", "unit", "errors", positional=2)
    errors = call.const("errors", None, "raise")
    if errors not in ("raise", "coerce"):
        raise ctx.todo(f"errors={errors!r}")
    column = call.arg("arg", 0)
    if isinstance(column, Column):
        if column.dtype == "str" or column.dtype is None and not call.has("unit", 1) \
                and errors == "coerce":
            return _text_timedelta(call, column, errors, ctx)
        if errors != "raise":
            raise ctx.todo("errors='coerce' with a column of numbers")
        return _column_timedelta(call, column, ctx)
    if not (isinstance(column, Opaque) and column.is_const):
        # a pandas Series porter left on pandas (its frame was handed over), a list, a name
        raise ctx.todo("only a column of a frame porter ports, or a number or text written "
                       "out, is ported")
    # a value written out: porter reads it or leaves a TODO, so errors= changes nothing
    return timedelta_scalar(_value_us(call, ctx), ctx)


# pandas reads a duration's text character by character (parse_timedelta_string): spaces,
# commas and "+" are skipped wherever they are, a "-" is only allowed before everything else;
# "<number><unit>" parts add up ("1h30m", "2 days 3 hours", "5 hours 30 minutes"), each unit
# spelt as pandas spells it in any case (but "M", a month, is refused); "H:M:S" after them
# adds each part (25:00:00 is 1 day 01:00:00, 5:60:00 is 6:00:00); the "-" makes every unit
# part negative, and the clock too only when no unit part came before it ("-1 days
# +02:00:00" is -22 hours, "-5:00:00" is -5 hours); up to six decimals of a second are
# microseconds. porter reads the unit parts in the order weeks, days, hours, minutes,
# seconds, milliseconds, microseconds, each once, as whole numbers (pandas reads a fraction
# through a float, "1.1h" is 1:05:59.999999999); its digit counts keep every value far below
# pandas' limit (±106751 days, in nanoseconds).
# [0-9], not \d: pandas reads ASCII digits only, Polars' \d matches every script's digits;
# each letter as [xX], not (?i): Polars' case folding would take "ſ" for "s" and "K" for "k"


def _spelt(*words: str) -> str:
    """The unit words, each letter in either case ("m" alone: "M" is a month to pandas)."""
    return "|".join("".join(f"[{c}{c.upper()}]" if c.isalpha() and c.isascii() else c
                            for c in w) if w != "m" else "m" for w in words)


_UNIT_PARTS = (  # (pl.duration keyword, digits, pandas' spellings, longest first)
    ("weeks", 3, ("w",)),
    ("days", 4, ("days", "day", "d")),
    ("hours", 5, ("hours", "hour", "hr", "h")),
    ("minutes", 7, ("minutes", "minute", "min", "m")),
    ("seconds", 9, ("seconds", "second", "sec", "s")),
    ("milliseconds", 9, ("milliseconds", "millisecond", "millis", "milli", "ms")),
    ("microseconds", 9, ("microseconds", "microsecond", "micros", "micro", "us", "µs")),
)
_TEXT_DURATION = ("^(?<sign>-?)" + "".join(
    f"(?:(?<{k}>[0-9]{{1,{n}}})(?:{_spelt(*words)}))?" for k, n, words in _UNIT_PARTS)
    + "(?:(?<clock_h>[0-9]{1,6}):(?<clock_m>[0-9]{1,6}):(?<clock_s>[0-9]{1,8})"
    "(?:[.](?<fraction>[0-9]{1,6}))?)?$")
# ISO 8601 as pandas reads it (parse_iso_format_string), on the text as written: "P1DT2H",
# "PT2H30M", "-P1D", "P0DT0H0M1.5S", up to six decimals of a second. pandas reads other
# forms its own way ("PT1.5H" is 5 hours and 1 second, "P1M" a minute): missing here
_ISO_DURATION = ("^(?<sign>-?)P(?:(?<days>[0-9]{1,4})D)?(?:T(?:(?<hours>[0-9]{1,2})H)?"
                 "(?:(?<minutes>[0-9]{1,2})M)?(?:(?<seconds>[0-9]{1,5})"
                 "(?:[.](?<fraction>[0-9]{1,6}))?S)?)?$")


# A function, defined once at the top of a converted script, that reads durations' text as
# pandas does (translate/imports.py)
DURATION_FUNCTION = "pandas_duration"
_PART_NAMES = ", ".join(f'"{k}"' for k, _, _ in _UNIT_PARTS)
DURATION_DEFINITION = f'''\
def pandas_duration(text):
    """Durations written as text, read as pandas' to_timedelta(text, errors="coerce") reads
    "5h", "1h30m", "2 days 3 hours", "1 day 02:00:00", "-1 days +23:00:00", "00:30:00" and
    ISO 8601 "P1DT2H"; any other text is missing."""
    iso = text.str.extract_groups({_ISO_DURATION!r})
    # spaces, commas and "+" are skipped wherever they are, as pandas skips them
    parts = text.str.replace_all("[ ,+]", "").str.extract_groups(
        {_TEXT_DURATION!r}
    )

    def whole(t, name):
        return t.struct.field(name).cast(pl.Int64).fill_null(0)

    def read(t, *names):
        return pl.any_horizontal([t.struct.field(name).is_not_null() for name in names])

    def sign(t, where):
        return pl.when((t.struct.field("sign") == "-") & where).then(-1).otherwise(1)

    def clock(t, **more):
        micro = t.struct.field("fraction").str.pad_end(6, "0").cast(pl.Int64).fill_null(0)
        return pl.duration(**more, microseconds=micro)

    units = ({_PART_NAMES})
    written = read(parts, *units)
    # "-" makes the unit parts negative, and the clock after them only when there are none
    from_text = pl.when(written | read(parts, "clock_h")).then(
        pl.duration(**{{unit: whole(parts, unit) for unit in units}}) * sign(parts, pl.lit(True))
        + clock(parts, hours=whole(parts, "clock_h"), minutes=whole(parts, "clock_m"),
                seconds=whole(parts, "clock_s")) * sign(parts, ~written)
    )
    iso_units = ("days", "hours", "minutes", "seconds")
    from_iso = pl.when(read(iso, *iso_units)).then(
        clock(iso, **{{unit: whole(iso, unit) for unit in iso_units}}) * sign(iso, pl.lit(True))
    )
    return pl.coalesce(from_iso, from_text).name.keep()  # the text's name, as pandas keeps it
'''


def _text_timedelta(call: PandasCall, column: Column, errors: str, ctx: RuleContext) -> Column:
    """pd.to_timedelta(texts, errors="coerce") -> pandas_duration(texts): the parts pandas
    reads (see _TEXT_DURATION and _ISO_DURATION), by str.extract_groups, added up by
    pl.duration; a text of any other form, "", "NaT" and a missing value are missing."""
    if errors != "coerce":
        raise ctx.todo("a column of text without errors='coerce': pandas raises on a text it "
                       "cannot read, and on any text with unit= (write errors='coerce' to have "
                       "it missing)")
    if call.has("unit", 1):
        # with errors="coerce" pandas reads each text as without unit= ("42" is 42
        # nanoseconds, "5h" five hours); it raises on a unit it does not know, or M and Y
        _unit(call.const("unit", 1, None), ctx)
    ctx.lower("text in another form pandas reads is missing here: a number alone "
              "(nanoseconds), a fraction with a unit (\"1.5h\": pandas reads it through a "
              "float), nanoseconds or more than six decimals (the whole column's unit becomes "
              "nanoseconds), units out of order or repeated (\"30m1h\"), ISO 8601 weeks, "
              "fractions of other than seconds or a sign inside (\"P1W\", \"P-1D\"), more "
              "digits than porter reads (4 of days, 5 of hours, 6 of clock hours); a column "
              "with no duration at all is timedelta64[s] in pandas, Duration(us) here", 0.9)
    return derived_column(column, emit.call(DURATION_FUNCTION, column.code), dtype="duration",
                          name=column.name)


_DURATION_KEYWORDS = {unit: keyword for keyword, unit in _KEYWORDS.items()}


def _column_timedelta(call: PandasCall, column: Column, ctx: RuleContext) -> Column:
    """pd.to_timedelta(df["n"], unit="D") -> pl.duration(days=pl.col("n"))."""
    unit = call.const("unit", 1, None)
    if unit is None:
        raise ctx.todo("a column without unit= (numbers are nanoseconds, text is parsed)")
    keyword = _DURATION_KEYWORDS[_unit(unit, ctx)]
    if column.dtype not in (None, "int", "float"):
        raise ctx.todo(f"a {column.dtype} column: only numbers with unit= are ported")
    if column.dtype != "int":
        ctx.lower("a fraction below a microsecond: pandas keeps a float column's durations in "
                  "nanoseconds (1/3 day is 7:59:59.999999997), Polars in microseconds (8:00:00)",
                  0.95)
    # NaN and None are both missing (NaT) in pandas; pl.duration gives null for both
    return derived_column(column, emit.pl("duration", **{keyword: column.code}), dtype="duration",
                          name=column.name)


def is_timedelta(value: Value) -> bool:
    """A duration written out in the script (pd.Timedelta …, pd.DateOffset(months=…)), or a
    name holding one."""
    return isinstance(value, Scalar) and value.pytype in ("timedelta", "dateoffset")


# pd.DateOffset's plural keywords (added to the date; the singular ones replace a part) as
# Polars' offset_by units: both move by calendar units, a day past the month's end is the
# month's last day (2024-01-31 + 1 month is 2024-02-29)
_OFFSET_UNITS = {"years": "y", "months": "mo", "weeks": "w", "days": "d"}


@rule("pd.DateOffset")
def date_offset(call: PandasCall, ctx: RuleContext) -> Value:
    """pd.DateOffset(months=12) -> dt.offset_by("12mo") where it is added to (or subtracted
    from) a datetime column.

    Handles: one of years=, months=, weeks=, days= as a whole number written out; the day
    clipped to the end of a shorter month in both; NaT stays missing.
    Caveats: several keywords, the singular ones (month=3 sets the month), hours and below,
    n= and a value computed at run time are TODOs; any use other than + and - with a datetime
    column stays pandas.
    """
    ctx.reject_unknown(call, *_OFFSET_UNITS)
    parts = {k: call.const(k, None, kinds=(int,)) for k in _OFFSET_UNITS if k in call.kwargs}
    if len(parts) != 1 or any(isinstance(n, bool) for n in parts.values()):
        raise ctx.todo("porter ports one of years=, months=, weeks=, days= as a whole number")
    (unit, count), = parts.items()
    every = f"{count}{_OFFSET_UNITS[unit]}"
    return Scalar(emit.call("pd.DateOffset", **parts), pytype="dateoffset",
                  expr=emit.atom(repr(every)))


def _offset_arithmetic(call: PandasCall, ctx: RuleContext, column: Column) -> Column:
    """datetime column + / - pd.DateOffset(...) -> dt.offset_by(...)."""
    left, right = call.receiver, call.args[0]
    offset = right if is_timedelta(right) else left
    assert isinstance(offset, Scalar)
    if offset.expr is None:  # a name holding it: pandas' DateOffset, no Polars value
        raise ctx.todo("a DateOffset held in a name: write pd.DateOffset(...) where it is added")
    if call.name not in ("+", "-") or column.dtype not in (None, "datetime") \
            or (call.name == "-" and offset is left) or is_timedelta(left) == is_timedelta(right):
        raise ctx.todo("a DateOffset is ported added to or subtracted from a datetime column")
    if _zone_set_here(column):
        raise ctx.todo("a column with a time zone")
    every = offset.expr.text.strip("'\"")
    if call.name == "-":
        every = every[1:] if every.startswith("-") else "-" + every
    code = ctx.expr(column, column.frame).attr("dt").method("offset_by", every)
    return derived_column(column, code, dtype="datetime", others=[left, right])


def _true_divide(numerator: Code, divisor: Code | int) -> Code:
    """numerator / divisor, each value divided as numpy (and pandas) divide.

    Polars divides by a single value through its reciprocal (x * (1 / d)), which is not the
    correctly rounded quotient: 5 hours / 1 day is 0.20833333333333334 in pandas and
    0.20833333333333331 in Polars, and about a quarter of whole seconds, minutes or hours
    differ in the last digit. Divided by a column of that value (numerator * 0 + d), Polars
    divides element by element, exactly as pandas does.
    """
    column = emit.binop(emit.binop(numerator, "*", 0), "+", divisor)
    return emit.binop(numerator, "/", column)


def timedelta_arithmetic(call: PandasCall, ctx: RuleContext, column: Column) -> Column:
    """series.arith where one operand is a Timedelta (see is_timedelta)."""
    left, right = call.receiver, call.args[0]
    assert left is not None
    if any(isinstance(v, Scalar) and v.pytype == "dateoffset" for v in (left, right)):
        return _offset_arithmetic(call, ctx, column)
    op = call.name
    if column.dtype not in (None, "datetime", "duration"):
        raise ctx.todo(f"a Timedelta with a {column.dtype} column")
    lcode, rcode = ctx.expr(left, column.frame), ctx.expr(right, column.frame)
    others = [left, right]
    if op in ("+", "-"):
        # datetimes and durations both: NaT stays missing (null), the unit stays microseconds
        dtype = column.dtype if column.dtype in ("datetime", "duration") else None
        return derived_column(column, emit.binop(lcode, op, rcode), dtype=dtype, others=others)
    if column.dtype == "datetime":
        raise ctx.todo(f"a datetime column {op} a Timedelta (pandas refuses it)")
    if op == "/" and is_timedelta(right):
        ctx.lower("divided element by element, as pandas divides (Polars divides by a single "
                  "value through its reciprocal, which changes the last digit)", 1.0)
        code = _true_divide(lcode, rcode)
        if right.expr in (None, duration_code(0)):  # 0 / 0 is NaN (a name's value is not known)
            code = code.method("fill_nan", None)
        return derived_column(column, code, dtype="float", others=others)
    if op == "/":  # a Timedelta divided by each duration of a column: element by element
        code = emit.binop(lcode, "/", rcode).method("fill_nan", None)
        return derived_column(column, code, dtype="float", others=others)
    raise ctx.todo(f"the operator {op} with a Timedelta")


@rule("series.dt.days")
def days(call: PandasCall, ctx: RuleContext) -> Value:
    """td.dt.days -> td.dt.total_microseconds() // 86_400_000_000.

    Handles: pandas floors (-1 hour is day -1), Polars' dt.total_days() truncates toward zero;
    integer floor division of the microseconds floors like pandas (D07). NaT stays missing.
    Caveats: a duration kept in nanoseconds (Parquet written by pandas 2) loses what is below a
    microsecond first, which changes the day only just below a negative whole day; a missing
    duration makes pandas' result float64, as for dt.year (0.95).
    """
    column = accessor_column(call)
    if column.dtype not in (None, "duration"):
        raise ctx.todo(f"a {column.dtype} column has no .dt.days in pandas")
    ctx.lower(NAT_MAKES_FLOAT.replace("missing date", "missing duration").replace(
        "2024", "3"), 0.95)
    code = emit.binop(_dt(column).method("total_microseconds"), "//", emit.atom("86_400_000_000"))
    return replace(_result(column, code, "int"), float_int=NAT_DURATION_MARK)


@rule("series.dt.total_seconds")
def total_seconds(call: PandasCall, ctx: RuleContext) -> Value:
    """td.dt.total_seconds() -> whole seconds + the rest divided by 1_000_000, as pandas.

    Handles: pandas 3.1 computes floor(us / 10**6) + (us mod 10**6) / 10**6 (a float); Polars'
    dt.total_seconds(fractional=True) divides another way and differs in the last digit, so the
    same two steps are written out (the division element by element, see _true_divide).
    NaT stays missing.
    Caveats: a duration kept in nanoseconds loses what is below a microsecond; beyond 2**53
    microseconds (285 years) pandas nudges some results by one last digit.
    """
    column = accessor_column(call)
    ctx.reject_unknown(call)
    if column.dtype not in (None, "duration"):
        raise ctx.todo(f"a {column.dtype} column has no .dt.total_seconds() in pandas")
    # us // 10**6 + us % 10**6 / (us * 0 + 10**6); `us` is named once (Expr.pipe calls the
    # lambda while the query is built) rather than written out three times
    us, million = emit.atom("us"), emit.atom("1_000_000")
    rest = emit.binop(us, "%", million)
    whole = emit.binop(us, "//", million)
    body = emit.binop(whole, "+", emit.binop(rest, "/", emit.binop(emit.binop(us, "*", 0), "+",
                                                                    million)))
    code = _dt(column).method("total_microseconds").method("pipe", Code(f"lambda us: {body.text}"))
    return _result(column, code, "float")


# pd.period_range ------------------------------------------------------------------------------

# pandas' dtype of a range's periods -> the frequency porter writes their text for (_PERIODS)
_RANGE_KINDS = {"period[D]": "D", "period[h]": "h", "period[min]": "min", "period[W-SUN]": "W",
                "period[M]": "M", "period[Q-DEC]": "Q", "period[Y-DEC]": "Y"}
_MOST_PERIODS = 100_000  # a longer range is made by pandas at run time (a TODO), not here
_WRITTEN_OUT = 24  # up to this many periods the texts are written out as a list
_MOST_FORMATTED = 1_000  # strftime's texts are always written out: up to this many
# strftime directives whose text follows the locale (the month's name, AM/PM)
_LOCALE_DIRECTIVES = re.compile(r"%[aAbBpcxX]")


def _parents(module: Any) -> dict[int, Any]:
    import ast
    return {id(child): node for node in ast.walk(module) for child in ast.iter_child_nodes(node)}


def _plain_frame_columns(module: Any) -> set[int]:
    """The ids of the dict values of `pd.DataFrame({...})` calls given nothing but the data and
    columns= (as construct._frame_columns_only reads them)."""
    import ast
    columns: set[int] = set()
    for node in ast.walk(module):
        if isinstance(node, ast.Call) and isinstance(node.func, ast.Attribute) \
                and node.func.attr == "DataFrame":
            data = node.args[0] if node.args else next(
                (k.value for k in node.keywords if k.arg == "data"), None)
            plain = len(node.args) <= 2 and all(k.arg in ("data", "columns") for k in node.keywords)
            if isinstance(data, ast.Dict) and plain:
                columns.update(id(v) for v in data.values)
    return columns


def _read_as_text(module: Any, name: str, parents: dict[int, Any]) -> bool:
    """Whether every read of `name` in the script gives it as its text: f"{p}" (or {p!s}),
    str(p) or print(..., p, ...), where a Period and the text of it give the same."""
    import ast
    for node in ast.walk(module):
        if not (isinstance(node, ast.Name) and node.id == name and isinstance(node.ctx, ast.Load)):
            continue
        parent = parents.get(id(node))
        if isinstance(parent, ast.FormattedValue) and parent.format_spec is None \
                and parent.conversion in (-1, ord("s")):
            continue
        if isinstance(parent, ast.Call) and isinstance(parent.func, ast.Name) \
                and node in parent.args and not parent.keywords \
                and (parent.func.id == "print" or parent.func.id == "str" and len(parent.args) == 1):
            continue
        return False
    return True


def _range_used_as_ported(module: Any, text: str) -> tuple[tuple[int, int], str | None] | None:
    """Whether each `pd.period_range(...)` written as `text` is used where porter ports it:
    a column of a frame written out (`pd.DataFrame({"month": <it>})`), the sequence of a `for`
    loop whose variable is only read as text (f"{p}", str(p), print(p)), or either of these
    after `.astype(str)` or `.strftime("<format>")`, itself or through a name read only there.
    Or where pandas' own PeriodIndex is kept: written as the values of `isin`
    (`s.isin(pd.period_range(...))`), or the sequence of a loop that reads its periods
    otherwise (compared with a column of periods: rules/ops.py). The lines of the first such
    call, and how pandas' PeriodIndex is kept ("isin", "loop"; every use must agree) or None
    for the texts; or None."""
    import ast
    if not isinstance(module, ast.Module):
        return None
    try:
        wanted = ast.unparse(ast.parse(text.strip(), mode="eval").body)
    except SyntaxError:
        return None
    parents = _parents(module)
    columns = _plain_frame_columns(module)
    kept: list[str | None] = []  # per use: pandas' PeriodIndex kept (how) or the texts

    def isin_values(node: Any) -> bool:
        parent = parents.get(id(node))
        return isinstance(node, ast.Call) and isinstance(parent, ast.Call) \
            and len(parent.args) == 1 and parent.args[0] is node and not parent.keywords \
            and isinstance(parent.func, ast.Attribute) and parent.func.attr == "isin"

    def ported(node: Any) -> bool:
        parent = parents.get(id(node))
        if isin_values(node):
            kept.append("isin")
            return True
        if isinstance(parent, ast.For) and parent.iter is node \
                and isinstance(parent.target, ast.Name) \
                and not _read_as_text(module, parent.target.id, parents):
            kept.append("loop")  # pandas' Periods, read as pandas reads them
            return True
        kept.append(None)
        parent = parents.get(id(node))
        text_already = False
        if isinstance(parent, ast.Attribute) and parent.value is node \
                and parent.attr in ("astype", "strftime"):
            call = parents.get(id(parent))
            if not (isinstance(call, ast.Call) and call.func is parent and len(call.args) == 1
                    and not call.keywords):
                return False
            arg = call.args[0]
            if parent.attr == "astype" and not (
                    isinstance(arg, ast.Name) and arg.id == "str"
                    or isinstance(arg, ast.Constant) and arg.value == "str"):
                return False
            if parent.attr == "strftime" and not (isinstance(arg, ast.Constant)
                                                  and isinstance(arg.value, str)):
                return False
            node, parent, text_already = call, parents.get(id(call)), True
        if id(node) in columns:
            return True
        if isinstance(parent, ast.For) and parent.iter is node:
            # text: any use of the variable reads a str in both
            return isinstance(parent.target, ast.Name) and (
                text_already or _read_as_text(module, parent.target.id, parents))
        return False

    names: set[str] = set()
    for node in ast.walk(module):
        if isinstance(node, ast.Assign) and len(node.targets) == 1 \
                and isinstance(node.targets[0], ast.Name) and ast.unparse(node.value) == wanted:
            names.add(node.targets[0].id)
    lines: tuple[int, int] | None = None
    for node in ast.walk(module):
        if isinstance(node, ast.Call) and ast.unparse(node) == wanted:
            if lines is None:
                lines = (node.lineno, node.end_lineno or node.lineno)
            parent = parents.get(id(node))
            bound = isinstance(parent, ast.Assign) and parent.value is node \
                and len(parent.targets) == 1 and isinstance(parent.targets[0], ast.Name) \
                and parent.targets[0].id in names
            if not bound and not ported(node):
                return None
        if isinstance(node, ast.Name) and node.id in names and isinstance(node.ctx, ast.Load) \
                and not ported(node):
            return None
    if lines is None or any(kept) and not all(kept):
        return None  # pandas' PeriodIndex in one use, the texts in another: not ported
    return lines, "loop" if "loop" in kept else kept[0] if kept else None


def _period_texts_code(stamps: Any, kind: str, texts: list[str], ctx: RuleContext) -> Code:
    """The periods' texts as Polars makes them: a list written out when short, else the text
    of each period's first instant (as dt.to_period's columns are written), checked at
    convert time to be pandas' texts."""
    if len(texts) <= _WRITTEN_OUT:
        return emit.lit(list(texts))
    import polars as pl
    from porter.rules.construct import _datetime_code
    freq = _RANGE_KINDS[kind]
    every, text_of = _PERIODS[freq]
    first, last = stamps[0].start_time, stamps[-1].start_time
    made = emit.pl("datetime_range", _datetime_code(first), _datetime_code(last), every)
    code = emit.pl("select", text_of(made)).method("to_series")
    try:
        checked = eval(code.text, {"pl": pl}).to_list()  # noqa: S307 (porter's own code)
    except Exception:  # noqa: BLE001 (Polars refuses it: not ported)
        checked = None
    if checked != list(texts):
        raise ctx.todo("Polars' texts of the periods differ from pandas' here")  # checked
    return code


@rule("pd.period_range")
def period_range(call: PandasCall, ctx: RuleContext) -> Value:
    """pd.period_range(start, end / periods, freq) -> the periods' texts, made by pandas at
    convert time: a list written out (or pl.datetime_range(...) formatted, for a long range).

    Handles: D, h, min, W / W-SUN, M, Q / Q-DEC, Y / Y-DEC (pandas 3 refuses "A"), dates as
    text, two of start / end / periods. Used as a column of a frame written out
    (`pd.DataFrame({"month": pd.period_range(...)})`, dtype period[M], held as text as
    dt.to_period columns are, so it merges, groups and sorts with them), the sequence of a
    `for` loop whose variable is read as text (f"{p}", str(p), print(p)), or either after
    astype(str) or strftime("<format>") (str columns, texts made by pandas): the texts.
    Written as the values of isin (rows.isin: the texts against a column of periods of the
    same frequency), or the sequence of a loop that reads each period otherwise (a hand-over:
    pandas' own Periods, which a column of periods of the same frequency is compared with as
    text, ops._period_operands): the call stays as written for whatever porter cannot read.
    Caveats: other frequencies, a start or end computed at run time, an empty range, name=,
    and the range used any other way (len(), list(), isin of a name, one name made a column
    and looped over as Periods, pd.DataFrame with index=) are TODOs: pandas' PeriodIndex.
    """
    import warnings
    import pandas as pd
    ctx.reject_unknown(call, "start", "end", "periods", "freq", positional=4)
    assert call.node is not None
    import libcst as cst
    original = cst.Module([]).code_for_node(call.node)
    used = _range_used_as_ported(ctx.python_module, original)
    if used is None:
        raise ctx.todo("porter ports a period range as a column of a frame written out "
                       "(pd.DataFrame({\"month\": pd.period_range(...)})) or a loop's sequence, "
                       "itself or after astype(str) or strftime(...), or written as the values "
                       "of isin; here pandas' PeriodIndex is used otherwise")
    lines, pandas_kept = used
    start = call.const("start", 0, None, kinds=(str,))
    end = call.const("end", 1, None, kinds=(str,))
    periods = call.const("periods", 2, None, kinds=(int,))
    freq = call.const("freq", 3, None, kinds=(str,))
    if isinstance(periods, bool) or (start, end, periods).count(None) != 1:
        raise ctx.todo("exactly two of start, end and periods are ported")
    modern = modern_period(freq)
    if modern is not None and pandas_kept:
        raise ctx.todo(f"freq={freq!r}: pandas 3.1 rejects it, write {modern!r} (the range is "
                       "kept on pandas here)")
    freq = _modern_freq(freq, modern_period, ctx)
    if periods is not None and periods > _MOST_PERIODS:
        raise ctx.todo(f"over {_MOST_PERIODS:,} periods")
    try:
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")
            stamps = pd.period_range(start, end, periods, freq)
    except (ValueError, TypeError, OverflowError) as error:
        raise ctx.todo(f"pandas raises here ({error})") from None
    kind = str(stamps.dtype)
    if kind not in _RANGE_KINDS:
        raise ctx.todo(f"periods of {kind}: porter ports {', '.join(_RANGE_KINDS)}")
    if len(stamps) == 0:
        raise ctx.todo("an empty range (pandas' period dtype, no value to type it by here)")
    if len(stamps) > _MOST_PERIODS:
        raise ctx.todo(f"over {_MOST_PERIODS:,} periods")
    if stamps[0].start_time.year < 1000 or stamps[-1].end_time.year > 9999:
        # the texts order as the periods do only with years of four digits
        raise ctx.todo("years outside 1000-9999")
    texts = [str(p) for p in stamps]
    if list(stamps.astype(str)) != texts:
        raise ctx.todo("pandas writes these periods otherwise than str() gives them")
    code = _period_texts_code(stamps, kind, texts, ctx)
    from porter.rules.construct import PeriodTexts
    made = PeriodTexts(code, len(texts), lines, texts=tuple(texts), period=kind,
                       made=(start, end, periods, freq), kept=pandas_kept)
    if pandas_kept:
        # s.isin(pd.period_range(...)): rows.isin reads the texts (`made`); a loop whose
        # variable is read otherwise than as text keeps pandas' Periods, which a column of
        # periods is compared with as their text (rules/ops.py); anything porter cannot read
        # is given pandas' own Periods, as written
        if pandas_kept == "loop":
            ctx.handover = True
            ctx.lower("the loop reads each period otherwise than as its text: it runs over "
                      "pandas' own Periods (no data: the range is made once)", 1.0)
        return Opaque(Code(original), const=made)
    return Opaque(code, const=made)


@rule("periods.range.astype", "periods.range.strftime")
def period_range_text(call: PandasCall, ctx: RuleContext) -> Value:
    """period_range(...).astype(str) / .strftime(format) -> the texts pandas makes of the
    periods, at convert time (a str column in a frame written out, str values in a loop)."""
    import warnings
    import pandas as pd
    from porter.rules.construct import PeriodTexts
    periods = call.receiver
    assert isinstance(periods, Opaque) and isinstance(periods.const, PeriodTexts)
    ctx.reject_unknown(call, "dtype" if call.name == "astype" else "date_format", positional=1)
    made = periods.const
    if call.name == "astype":
        target = call.arg("dtype", 0)
        if not (isinstance(target, Opaque) and target.code.text in ("str", '"str"', "'str'")):
            raise ctx.todo("periods cast to something other than str")
        code, texts = periods.code, made.texts  # the same texts: the range's own value
    else:
        pattern = call.const("date_format", 0, kinds=(str,))
        if _LOCALE_DIRECTIVES.search(pattern):
            reason = ("names of months and days (and AM/PM) are written in the locale of the "
                      "conversion, not of the run")
            ctx.lower(reason, 0.95)
        if made.size > _MOST_FORMATTED:
            raise ctx.todo(f"over {_MOST_FORMATTED:,} periods formatted")
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")
            texts = tuple(pd.period_range(*made.made).strftime(pattern))
        code = emit.lit(list(texts))
    # a frame written out around it carries the site (its constant carries none)
    made = replace(made, made_by=(f"periods.range.{call.name}", "period-range-text",
                                  ctx.confidence, "; ".join(ctx.reasons) or
                                  "the texts pandas makes of the periods, made at convert time"))
    # a range bound to a name has its site where it is bound; one written here, here
    lines = (0, 0) if periods.code.text.isidentifier() else made.lines
    return Opaque(code, const=replace(made, code=code, texts=texts, period="str", lines=lines),
                  sites=periods.sites)
