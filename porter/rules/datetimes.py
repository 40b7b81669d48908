"""Datetimes: the .dt accessor and pd.to_datetime (D01–D04 in the semantics reference).

A missing timestamp (NaT) stays missing through every rule here; pandas' integer components
become float64 when one is missing, Polars keeps integers with nulls (the same numbers).
"""

from __future__ import annotations

import re

from porter.emit import code as emit
from porter.emit.code import Code
from porter.rules import rule
from porter.translate.context import PandasCall, RuleContext, accessor_column, derived_column
from porter.translate.values import Column, Value


def _dt(column: Column) -> Code:
    return column.code.attr("dt")


def _result(column: Column, code: Code, dtype: str) -> Column:
    return derived_column(column, code, dtype=dtype)


_COMPONENTS = {"year": "year", "month": "month", "day": "day", "hour": "hour",
               "minute": "minute", "second": "second", "quarter": "quarter",
               "dayofyear": "ordinal_day", "day_of_year": "ordinal_day"}


@rule("series.dt.year", "series.dt.month", "series.dt.day", "series.dt.hour",
      "series.dt.minute", "series.dt.second", "series.dt.quarter", "series.dt.dayofyear",
      "series.dt.day_of_year")
def component(call: PandasCall, ctx: RuleContext) -> Value:
    """s.dt.year / month / day / hour / minute / second / quarter / dayofyear -> dt.year() …
    (dayofyear -> dt.ordinal_day()).

    Handles: the same numbers (January 1 is day 1 in both); missing stays missing.
    Caveats: pandas' int32 becomes float64 when a value is missing; Polars keeps Int32/Int8.
    """
    column = accessor_column(call)
    return _result(column, _dt(column).method(_COMPONENTS[call.name]), "int")


@rule("series.dt.weekday", "series.dt.dayofweek", "series.dt.day_of_week")
def weekday(call: PandasCall, ctx: RuleContext) -> Value:
    """s.dt.weekday / dayofweek / day_of_week -> dt.weekday() - 1.

    Handles: pandas counts Monday as 0, Polars (ISO) as 1 (D03).
    """
    column = accessor_column(call)
    return _result(column, emit.binop(_dt(column).method("weekday"), "-", 1), "int")


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
    other = sorted(set(_directives(fmt)) - _SAME_FORMAT - set("aAUWf"))
    if other:
        raise ctx.todo(f"directives {', '.join('%' + d for d in other)} are not checked to "
                       "format the same in Polars")
    fmt = re.sub(r"(?<!%)((?:%%)*)%f", r"\1%6f", fmt)
    return _result(column, _dt(column).method("to_string", fmt), "str")


def parse_format(fmt: str, ctx: RuleContext) -> str:
    """A pandas (strptime) format as a Polars (chrono) format, or a TODO."""
    if fmt in ("mixed", "ISO8601"):
        raise ctx.todo(f"format={fmt!r}: list the formats the data holds and coalesce "
                       "str.to_datetime(f, strict=False) over them")
    other = sorted(set(_directives(fmt)) - _SAME_FORMAT - {"f"})
    if other:
        raise ctx.todo(f"directives {', '.join('%' + d for d in other)} are not checked to "
                       "parse the same in Polars")
    if "%y" in fmt:
        ctx.lower("%y: pandas reads 69 as 1969, Polars as 2069", 0.95)
    if "%f" in fmt:
        if ".%f" not in fmt or fmt.count("%f") > 1:
            raise ctx.todo("%f is ported only after a dot (.%f)")
        ctx.lower(".%f: Polars also accepts a missing fraction and keeps microseconds "
                  "where pandas keeps nanoseconds", 0.9)
        fmt = fmt.replace(".%f", "%.f")
    return fmt


@rule("pd.to_datetime")
def to_datetime(call: PandasCall, ctx: RuleContext) -> Value:
    """pd.to_datetime(col, format=, errors=) -> col.str.to_datetime(format, strict=...).

    Handles: errors="coerce" (strict=False gives null where pandas gives NaT); the explicit
    format; a column that already holds datetimes is kept as it is.
    Caveats: without a format both guess it from the first value, but pandas reads 05/03/2024
    month first and Polars day first (0.7); with errors="raise", "" and "NaT" are NaT in pandas
    and an error in Polars (0.95); a scalar, a list or a frame stays on pandas.
    """
    ctx.reject_unknown(call, "arg", "errors", "format", positional=1)
    column = call.arg("arg", 0)
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
    options: dict[str, object] = {"strict": False} if errors == "coerce" else {}
    text = column.code.attr("str")
    if errors == "raise":
        ctx.lower('"" and "NaT" are missing in pandas and an error in Polars (strict)', 0.95)
    if fmt is None:
        ctx.lower("no format: pandas reads 05/03/2024 as May 3 (month first), Polars guesses "
                  "day first; write format= to be sure", 0.7)
        code = text.method("to_datetime", time_unit="us", **options)
    else:
        if not isinstance(fmt, str):
            raise ctx.todo("the format must be text")
        code = text.method("to_datetime", parse_format(fmt, ctx), **options)
    return derived_column(column, code, dtype="datetime")
