"""Older pandas spellings that pandas 2 and 3 removed, read with the meaning they had.

Frequency aliases: pandas 2.2 renamed the end-of-period offsets (M -> ME, Q -> QE, Y / A ->
YE, BM -> BME, ...) and the fixed ones (H -> h, T -> min, S -> s, L -> ms, U -> us, N -> ns),
and pandas 3 rejects the old names with a ValueError. A script written for the pandas that had
them means the offset pandas now spells otherwise; the port reads it as that.

Periods (to_period, period_range) kept M, Q and Y: "M" there is still the month period, not
an offset, and is never rewritten. Only the names pandas 3.1 itself rejects are translated
(checked with pandas at convert time as well as by the table), so an alias pandas still
accepts never changes meaning.
"""

from __future__ import annotations

import ast

import libcst as cst
import re

# an offset's old base name -> pandas 3's (date_range, resample, Grouper, dt.floor / ceil / round)
OFFSET_ALIASES = {
    "M": "ME", "BM": "BME", "CBM": "CBME", "SM": "SME",
    "Q": "QE", "BQ": "BQE",
    "A": "YE", "Y": "YE", "BA": "BYE", "BY": "BYE", "AS": "YS", "BAS": "BYS",
    "H": "h", "BH": "bh", "CBH": "cbh", "T": "min", "S": "s", "L": "ms", "U": "us", "N": "ns",
}
# a period's old frequency -> pandas 3's (to_period, period_range); M, Q and Y are unchanged
PERIOD_ALIASES = {
    "A": "Y", "H": "h", "T": "min", "S": "s", "L": "ms", "U": "us", "N": "ns",
}
_ALIAS = re.compile(r"(\d*)([A-Z]+)(-[A-Z]{3})?")


def _modern(freq: str, table: dict[str, str], accepted: object) -> str | None:
    found = _ALIAS.fullmatch(freq)
    if found is None or found.group(2) not in table:
        return None
    count, base, anchor = found.group(1), found.group(2), found.group(3) or ""
    if anchor and base not in ("Q", "BQ", "A", "Y", "BA", "BY", "AS", "BAS"):
        return None  # only quarters and years take a month (W-SUN keeps its name)
    new = f"{count}{table[base]}{anchor}"
    if accepted(freq) or not accepted(new):  # type: ignore[operator]
        return None  # pandas still reads the old name (its meaning is pandas'), or not the new
    return new


def _offset_accepted(freq: str) -> bool:
    import warnings
    import pandas as pd
    try:
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")
            pd.tseries.frequencies.to_offset(freq)
    except ValueError:
        return False
    return True


def period_accepted(freq: str) -> bool:
    """Whether pandas 3.1 reads `freq` as a period frequency ("M", "Q", "Y", "h")."""
    import warnings
    import pandas as pd
    try:
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")
            pd.Period("2024-01-01", freq=freq)
    except (ValueError, TypeError):
        return False
    return True


def modern_offset(freq: object) -> str | None:
    """pandas 3.1's name for an offset alias it rejects ("M" -> "ME", "15T" -> "15min",
    "A-JUN" -> "YE-JUN"); None when there is nothing to rename."""
    if not isinstance(freq, str):
        return None
    return _modern(freq, OFFSET_ALIASES, _offset_accepted)


def modern_period(freq: object) -> str | None:
    """pandas 3.1's name for a period frequency it rejects ("A" -> "Y", "H" -> "h"); None
    when there is nothing to rename ("M", "Q", "Y" are still the month, quarter and year)."""
    if not isinstance(freq, str):
        return None
    return _modern(freq, PERIOD_ALIASES, period_accepted)


# -- calls pandas 2 and 3 removed, read as their modern spelling --------------------------------
#
# The meanings below are from memory of pandas' release notes (not looked up here): each rule
# says which release removed the call and what it became. The rules rewrite the call into its
# modern spelling and hand it to the rule of that spelling, so everything those rules know
# (missing values, tied rows, dtypes) holds for the old name too.

from porter.emit import code as emit  # noqa: E402
from porter.rules import registry, rule  # noqa: E402
from porter.translate.context import PandasCall, RuleContext, Unsupported  # noqa: E402
from porter.translate.values import Column, Frame, Grouped, Opaque, Value  # noqa: E402


def _const(value: object) -> Opaque:
    return Opaque(emit.lit(value), const=value)


def _as_today(key: str, call: PandasCall, ctx: RuleContext) -> Value:
    """Run the rule of today's spelling on the rewritten call."""
    return registry()[key](call, ctx)


# read_csv's options that pandas 2 removed: (from memory) squeeze= deprecated in 1.4 and removed
# in 2.0 (DataFrame.squeeze("columns") instead); error_bad_lines= / warn_bad_lines= deprecated in
# 1.3 for on_bad_lines= and removed in 2.0; delim_whitespace= deprecated in 2.2 for sep=r"\s+" and
# removed in 3.0; infer_datetime_format= deprecated in 2.0 (the format is always guessed from the
# first value since then) and removed in 3.0.
READ_CSV_LEGACY = ("squeeze", "error_bad_lines", "warn_bad_lines", "delim_whitespace",
                   "infer_datetime_format")


def modern_read_csv(call: PandasCall, ctx: RuleContext) -> tuple[PandasCall, bool, str]:
    """read_csv's removed options rewritten as pandas 3.1 spells them; whether squeeze=True
    asked for a one-column read to be a Series; what was rewritten (for a TODO's reason)."""
    if not set(READ_CSV_LEGACY) & set(call.kwargs):
        return call, False, ""
    notes = []
    kwargs = dict(call.kwargs)
    squeeze = bool(call.const("squeeze", None, False, kinds=(bool,)))
    errors = call.const("error_bad_lines", None, None, kinds=(bool, type(None)))
    warns = call.const("warn_bad_lines", None, None, kinds=(bool, type(None)))
    spaces = call.const("delim_whitespace", None, False, kinds=(bool,))
    call.const("infer_datetime_format", None, False, kinds=(bool,))
    for name in READ_CSV_LEGACY:
        kwargs.pop(name, None)
    if errors is False:
        # pandas 1.x: error_bad_lines=False left out a row with too many fields, and said so
        # on stderr unless warn_bad_lines=False: on_bad_lines="warn" / "skip"
        if "on_bad_lines" in kwargs:
            raise Unsupported("error_bad_lines= beside on_bad_lines= (pandas raised)")
        kwargs["on_bad_lines"] = _const("skip" if warns is False else "warn")
        notes.append(f"error_bad_lines=False is on_bad_lines={kwargs['on_bad_lines'].const!r}")
    # error_bad_lines=True was the default (a bad row stops the read); warn_bad_lines without
    # error_bad_lines=False changed nothing
    if spaces:
        if {"sep", "delimiter"} & set(kwargs) or len(call.args) > 1:
            raise Unsupported("delim_whitespace=True beside sep= (pandas raised)")
        kwargs["sep"] = _const(r"\s+")
        notes.append('delim_whitespace=True is sep=r"\\s+"')
    # infer_datetime_format=True only made pandas 1.x parse faster: the dates are the same as
    # those of pandas 2's guessed format, which parse_dates reads as before
    return (PandasCall(call.receiver, call.name, call.args, kwargs, call.node), squeeze,
            "; ".join(notes))


def squeezed(read: Value, ctx: RuleContext) -> Value:
    """read_csv(..., squeeze=True): a file of one column read as that column (a Series), as
    pandas 1.x returned it; a file of several columns stays a frame."""
    if not isinstance(read, Frame) or read.columns is None:
        raise Unsupported("squeeze=True (removed in pandas 2): the read is a Series when the file "
                          "has one column; porter does not know its columns here (give usecols= "
                          "or run with --data)")
    if len(read.columns) != 1:
        return read
    name = read.columns[0]
    return _as_today("frame.getitem.column", PandasCall(read, "getitem", (_const(name),)), ctx)


def _column_named(frame: Frame, name: str, ctx: RuleContext) -> Value:
    return _as_today("frame.getitem.column", PandasCall(frame, "getitem", (_const(name),)), ctx)


def _default_labels(frame: Frame) -> bool:
    """pandas' row labels are still 0..n-1 in order (a label is then the row's position)."""
    return frame.labels_intact and not frame.index


def _names(value: Value) -> list[str] | None:
    """Column names written in the script: one text or a list of texts."""
    if isinstance(value, Opaque) and value.is_const:
        if isinstance(value.const, str):
            return [value.const]
        if isinstance(value.const, (list, tuple)) and value.const \
                and all(isinstance(n, str) for n in value.const):
            return list(value.const)
    return None


@rule("frame.ix")
def ix(call: PandasCall, ctx: RuleContext) -> Value:
    """df.ix[rows, cols] -> as df.loc / df.iloc, where the frame tells which one .ix read:
    every row (:) or a True/False mask, rows by label on pandas' labels 0..n-1 (a slice of
    whole numbers, its end included, is the same positions), column names written as text
    (labels) or whole numbers among text names (positions).

    .ix (deprecated in pandas 0.20, removed in 1.0; from memory) read a key as a label where
    the axis had such labels and as a position otherwise. pandas' Index._convert_slice_indexer
    of those releases (read in its source) reads a slice of whole numbers as labels on an
    integer index, positions on any other: on a frame read and not yet filtered, sorted or
    indexed, whose labels are 0..n-1, df.ix[a:b] is rows a to b, b included (df.ix[:5] is six
    rows), and df.ix[i, "c"] the value at row i. Columns named by text read a whole number as
    a position (df.ix[:, 1], df.ix[:, 0:2] with its end left out, as positions are sliced).
    Other rows (after a filter or sort, negative bounds, a step, a list of labels, one row),
    and columns named by numbers are TODOs, which say to write .loc or .iloc.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    rows = call.args[0] if call.args else None
    cols = call.args[1] if len(call.args) > 1 else None
    if len(call.args) > 2 or rows is None:
        raise Unsupported(".ix with more than two keys")
    label = rows.const if isinstance(rows, Opaque) and rows.is_const else None
    if isinstance(label, int) and not isinstance(label, bool) and label >= 0 \
            and isinstance(cols, Opaque) and isinstance(cols.const, str) and _default_labels(frame):
        # one value: on pandas' integer labels 0..n-1 a whole number was a label (.ix read
        # labels on an integer index), which is the row's position here
        column = _column_named(frame, cols.const, ctx)
        return _as_today("series.iloc", PandasCall(column, "iloc", (rows,), {}, call.node), ctx)
    every_row = isinstance(label, slice) and label == slice(None)
    mask = isinstance(rows, Column) and rows.dtype == "bool"
    if isinstance(label, slice) and not every_row:
        if not (_default_labels(frame) and label.step in (None, 1) and all(
                v is None or isinstance(v, int) and not isinstance(v, bool) and v >= 0
                for v in (label.start, label.stop))):
            raise Unsupported(".ix[a:b] on a frame whose labels are not 0..n-1 (filtered, sorted "
                              "or indexed since it was read), or with negative bounds or a step: "
                              ".ix read labels of an integer index, positions otherwise; write "
                              ".loc (labels) or .iloc (positions)")
        # labels a..b, b included: on labels 0..n-1 the positions a..b
        # (an end before the start chooses no row, as iloc[a:a] does)
        stop = None if label.stop is None else max(label.stop + 1, label.start or 0)
        frame = _as_today("frame.iloc", PandasCall(  # type: ignore[assignment]
            frame, "iloc", (_const(slice(label.start, stop)),), {}, call.node), ctx)
        rows, every_row = _const(slice(None)), True
    elif not (every_row or mask):
        raise Unsupported(".ix[rows] with rows other than `:`, a True/False mask or a slice of "
                          "whole numbers: .ix read a whole number as a label of an integer "
                          "index and as a position otherwise, which porter cannot tell here; "
                          "write .loc (labels) or .iloc (positions)")
    if cols is None or isinstance(cols, Opaque) and cols.is_const and cols.const == slice(None):
        if every_row:
            return frame
        return _as_today("frame.loc", PandasCall(frame, "loc", (rows,), {}, call.node), ctx)
    if _names(cols) is not None:
        return _as_today("frame.loc", PandasCall(frame, "loc", (rows, cols), {}, call.node), ctx)
    if isinstance(cols, Opaque) and _positions(cols.const) and frame.columns is not None \
            and all(isinstance(c, str) for c in frame.columns):
        # whole numbers among columns named by text: positions to .ix
        if mask:
            frame = _as_today("frame.loc", PandasCall(  # type: ignore[assignment]
                frame, "loc", (rows,), {}, call.node), ctx)
        return _as_today("frame.iloc", PandasCall(frame, "iloc", (_const(slice(None)), cols),
                                                  {}, call.node), ctx)
    raise Unsupported(".ix[:, cols] with columns other than names written as text or whole "
                      "numbers among columns porter knows are named by text; write .loc or .iloc")


def _positions(key: object) -> bool:
    """A whole number, a list of them or a slice of them (None bounds too)."""
    def whole(v: object) -> bool:
        return isinstance(v, int) and not isinstance(v, bool)
    if whole(key):
        return True
    if isinstance(key, list):
        return bool(key) and all(whole(v) for v in key)
    if isinstance(key, slice):
        return all(v is None or whole(v) for v in (key.start, key.stop, key.step))
    return False


@rule("frame.ix_setitem")
def ix_setitem(call: PandasCall, ctx: RuleContext) -> Value:
    """df.ix[rows, cols] = v -> as df.loc[rows, cols] = v where .ix read labels: every row
    (:) or a True/False mask, column names written as text.

    The keys are read as frame.ix reads them (from memory: .ix removed in pandas 1.0); whole
    numbers for the rows or the columns are TODOs (a label or a position). The value is
    written as pandas 3.1 writes it with .loc: a value pandas 3.1 refuses in a column (0.5
    into an int column), which older pandas wrote by making the column float, is a TODO there.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    if len(call.args) != 3:
        raise Unsupported(".ix assignment needs rows and columns")
    rows, cols, _ = call.args
    every_row = isinstance(rows, Opaque) and rows.is_const and rows.const == slice(None)
    if not (every_row or isinstance(rows, Column) and rows.dtype == "bool"):
        raise Unsupported(".ix[rows] = with rows other than `:` or a True/False mask: .ix read a "
                          "whole number as a label of an integer index and as a position "
                          "otherwise; write .loc (labels) or .iloc (positions)")
    if _names(cols) is None:
        raise Unsupported(".ix[:, cols] = with columns other than names written as text; write "
                          ".loc or .iloc")
    return _as_today("frame.loc_setitem", PandasCall(frame, "loc_setitem", call.args, {},
                                                     call.node), ctx)


@rule("frame.as_matrix")
def as_matrix(call: PandasCall, ctx: RuleContext) -> Value:
    """df.as_matrix(columns=None) -> as df[columns].to_numpy() (collected to numpy).

    as_matrix (from memory: deprecated in pandas 0.23 for .values / to_numpy(), removed in
    1.0) gave the frame's values as one numpy array, of the columns given in their order:
    the array to_numpy() gives (missing numbers nan, text in an object array).
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "columns", positional=1)
    if call.has("columns", 0):
        given = call.arg("columns", 0)
        if not (isinstance(given, Opaque) and given.is_const and given.const is None):
            names = _names(given)
            if names is None or isinstance(given.const, str):  # type: ignore[union-attr]
                raise Unsupported("as_matrix(columns=) with something other than a list of "
                                  "column names")
            frame = _as_today("frame.getitem.columns",  # type: ignore[assignment]
                            PandasCall(frame, "getitem", (given,)), ctx)
    return _as_today("frame.to_numpy", PandasCall(frame, "to_numpy", (), {}, call.node), ctx)


@rule("frame.get_value")
def get_value(call: PandasCall, ctx: RuleContext) -> Value:
    """df.get_value(label, col) -> as df.at[label, col]: on a frame whose row labels are still
    0..n-1, the value at that position (as s.iloc[i]).

    get_value (from memory: deprecated in pandas 0.21 for .at / .iat, removed in 1.0) read one
    value by row label and column name. A frame read from a file and not yet filtered or sorted
    has the labels 0..n-1, so the label is the position; other labels are a TODO.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "index", "col", "takeable", positional=2)
    label = call.const("index", 0, kinds=(int,))
    name = call.const("col", 1, kinds=(str,))
    if call.const("takeable", None, False, kinds=(bool,)):
        raise Unsupported("get_value(takeable=True) (positions): write .iat")
    if not _default_labels(frame):
        raise Unsupported("get_value(label, col) on a frame filtered, sorted or indexed since it "
                          "was made: its labels are pandas' (write .at[label, col])")
    if label < 0:
        raise Unsupported("get_value with a negative label (pandas raises: no such label)")
    column = _column_named(frame, name, ctx)
    return _as_today("series.iloc", PandasCall(column, "iloc", (_const(label),), {}, call.node), ctx)


@rule("frame.lookup")
def lookup(call: PandasCall, ctx: RuleContext) -> Value:
    """df.lookup(df.index, df["which"]) -> each row's value in the column its label names:
    pl.when(pl.col("which") == "a").then(pl.col("a")).when(...)... over the number columns.

    DataFrame.lookup (from memory: deprecated in pandas 1.2, removed in 2.0) read one value per
    (row label, column label) pair into an array, converted from objects (numbers: int64 when
    every value found is an integer, else float64). Given the frame's own index, each pair is
    the row itself. A label that names no column raised KeyError in pandas, so the script never
    ran on such data; here it gives a missing value.
    Caveats: only the number columns are candidates: a label naming a text or date column
    (pandas gave that value, the array of objects) gives a missing value (0.95 when the frame
    has such columns); int and float candidates give Float64 even where the labels only name
    int columns (pandas: int64; 0.9). Row labels other than the frame's own index of 0..n-1
    are a TODO.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "row_labels", "col_labels", positional=2)
    rows, cols = call.arg("row_labels", 0), call.arg("col_labels", 1)
    if not (isinstance(rows, Column) and rows.index_values and rows.frame.rows == frame.rows
            and not frame.index):
        raise Unsupported("lookup with row labels other than the frame's own index of row "
                          "numbers")
    if not (isinstance(cols, Column) and cols.frame.rows == frame.rows and not cols.element):
        raise Unsupported("lookup with column labels other than a column of the same frame")
    if frame.columns is None or any(frame.dtype(c) is None for c in frame.columns):
        raise Unsupported("lookup on a frame whose column types porter does not know")
    candidates = [c for c in frame.columns if frame.dtype(c) in ("int", "float")]
    if not candidates:
        raise Unsupported("lookup on a frame without number columns")
    if len(candidates) < len(frame.columns) - (1 if cols.name in frame.columns else 0):
        ctx.lower("lookup reads the number columns: a label naming a text or date column gives "
                  "a missing value here (pandas: that value, in an array of objects)", to=0.95)
    kinds = {frame.dtype(c) for c in candidates}
    if kinds == {"int", "float"}:
        ctx.lower("lookup over int and float columns gives Float64 (pandas: int64 where the "
                  "labels only name int columns)", to=0.9)
    which = ctx.expr(cols, frame)
    chain = emit.pl("when", emit.binop(which, "==", emit.pl("lit", candidates[0]))) \
        .method("then", emit.col(candidates[0]))
    for name in candidates[1:]:
        chain = chain.method("when", emit.binop(which, "==", emit.pl("lit", name))) \
            .method("then", emit.col(name))
    dtype = "float" if "float" in kinds else "int"
    if kinds == {"int", "float"}:
        chain = chain.method("cast", emit.atom("pl.Float64"))
    return Column(chain, frame=frame, name=None, dtype=dtype,
                  refs=frozenset({*candidates, *cols.refs}),
                  versions=tuple(sorted({*((c, frame.version(c)) for c in candidates),
                                         *cols.versions})))


@rule("series.valid")
def valid(call: PandasCall, ctx: RuleContext) -> Value:
    """s.valid() -> as s.dropna() (the column's rows holding a value).

    Series.valid (from memory: deprecated in pandas 0.23, removed in 1.0) was dropna() under
    another name.
    """
    ctx.reject_unknown(call)
    return _as_today("series.dropna", PandasCall(call.receiver, "dropna", (), {}, call.node), ctx)


@rule("series.order")
def order(call: PandasCall, ctx: RuleContext) -> Value:
    """s.order(ascending, na_position, kind) -> as s.sort_values(ascending, na_position, kind).

    Series.order (deprecated in pandas 0.17 for sort_values, removed in 0.20) sorted a copy,
    missing values last. Its default kind was "quicksort" from pandas 0.15 to 0.19, as
    sort_values' (the source of those releases says so); before 0.15 it was "mergesort" (a
    stable sort) and the place of missing values was na_last=True / False, read here as
    na_position="last" / "first". A script from before 0.15 that relied on tied values
    keeping their order is read with the later default.
    """
    ctx.reject_unknown(call, "na_last", "ascending", "kind", "na_position")
    kwargs = {k: v for k, v in call.kwargs.items() if k != "na_last"}
    if call.has("na_last"):
        if call.has("na_position"):
            raise Unsupported("order(na_last=, na_position=) (pandas took one of them)")
        last = call.const("na_last", None, True, kinds=(bool, type(None)))
        kwargs["na_position"] = _const("first" if last is False else "last")
    return _as_today("series.sort_values",
                     PandasCall(call.receiver, "sort_values", (), kwargs, call.node), ctx)


@rule("frame.sort")
def frame_sort(call: PandasCall, ctx: RuleContext) -> Value:
    """df.sort(columns, ascending, kind, na_position) -> as df.sort_values(by=columns, ...).

    DataFrame.sort (from memory: deprecated in pandas 0.17, removed in 0.20) sorted by the
    columns given (by the index without them), missing values last, with an unstable
    quicksort unless told otherwise: sort_values' defaults.
    Caveats: without columns it sorted by the index: a TODO.
    """
    ctx.reject_unknown(call, "columns", "ascending", "kind", "na_position", positional=1)
    if not call.has("columns", 0):
        raise Unsupported("sort() without columns sorted by the index: write sort_index()")
    kwargs = {k: v for k, v in call.kwargs.items() if k != "columns"}
    kwargs["by"] = call.arg("columns", 0)
    return _as_today("frame.sort_values",
                   PandasCall(call.receiver, "sort_values", (), kwargs, call.node), ctx)


# pd.rolling_mean(s, n) and its kin: pandas' functions of a window before the .rolling() /
# .expanding() methods (from memory: deprecated in 0.18, removed in 0.23)
ROLLING_FUNCTIONS = {f"pd.rolling_{how}": how
                     for how in ("mean", "sum", "min", "max", "median", "std", "var")}
EXPANDING_FUNCTIONS = {f"pd.expanding_{how}": how
                       for how in ("mean", "sum", "min", "max", "std", "var")}


@rule(*ROLLING_FUNCTIONS, *EXPANDING_FUNCTIONS)
def window_function(call: PandasCall, ctx: RuleContext) -> Value:
    """pd.rolling_mean(s, n, min_periods, center) -> as s.rolling(n, min_periods=..,
    center=..).mean(); pd.expanding_sum(s, min_periods) -> as s.expanding(min_periods).sum().

    The functions took the Series first and the window's options after it, with the defaults
    the methods kept (min_periods the window's size for rolling, 1 for expanding). freq= and
    how= (resampling first) are TODOs.
    """
    rolling = ctx.key in ROLLING_FUNCTIONS
    how = ROLLING_FUNCTIONS.get(ctx.key) or EXPANDING_FUNCTIONS[ctx.key]
    options = ("arg", "window", "min_periods", "freq", "center", "how") if rolling else \
        ("arg", "min_periods", "freq")
    extra = ("ddof",) if how in ("std", "var") else ()
    ctx.reject_unknown(call, *options, *extra, positional=len(options))
    for name in ("freq", "how"):
        if name in options and call.has(name, options.index(name)) \
                and call.const(name, options.index(name), None) is not None:
            raise Unsupported(f"{name}= (the Series resampled first)")
    column = call.arg("arg", 0)
    if not isinstance(column, Column):
        raise Unsupported("a window over something other than a column")
    window_options = {name: call.arg(name, options.index(name))
                      for name in options[1:] if name not in ("freq", "how")
                      and call.has(name, options.index(name))}
    kind = "rolling" if rolling else "expanding"
    window = _as_today(f"series.{kind}", PandasCall(column, kind, (), window_options, call.node), ctx)
    kwargs = {k: v for k, v in call.kwargs.items() if k in extra}
    return _as_today(f"series.{kind}.{how}", PandasCall(window, how, (), kwargs, call.node), ctx)


@rule("pd.ewma")
def ewma(call: PandasCall, ctx: RuleContext) -> Value:
    """pd.ewma(s, com= | span= | halflife= | alpha=, min_periods=, adjust=, ignore_na=) -> as
    s.ewm(...).mean().

    pd.ewma (deprecated in pandas 0.18, removed in 0.23; from memory) was, in 0.18 (read in
    its source), ensure_compat("ewm", "mean", ...): s.ewm(...).mean() with the same options.
    The series and com are read by position (alpha came in 0.18, so the later positions
    differ between releases: they must be named); freq= and how= (resampling first) are
    TODOs. Before 0.15.2, min_periods blanked the first values from the first present one
    (later: fewer present values than min_periods): read as the later meaning (0.95).
    """
    ctx.reject_unknown(call, "arg", "com", "span", "halflife", "alpha", "min_periods", "freq",
                       "adjust", "how", "ignore_na", positional=2)
    for name in ("freq", "how"):
        if call.has(name) and call.const(name, None, None) is not None:
            raise Unsupported(f"{name}= (the Series resampled first)")
    column = call.arg("arg", 0)
    if not isinstance(column, Column):
        raise Unsupported("an average over something other than a column")
    kwargs = {name: call.arg(name, 1 if name == "com" else None)
              for name in ("com", "span", "halflife", "alpha", "min_periods", "adjust", "ignore_na")
              if call.has(name, 1 if name == "com" else None)}
    if call.const("min_periods", None, 0, kinds=(int,)):
        ctx.lower("min_periods=: before pandas 0.15.2 it blanked the first values after the "
                  "first present one, since then the values with fewer present ones before "
                  "them (read so)", 0.95)
    weights = _as_today("series.ewm", PandasCall(column, "ewm", (), kwargs, call.node), ctx)
    return _as_today("series.ewm.mean", PandasCall(weights, "mean", (), {}, call.node), ctx)


@rule("pd.value_counts")
def top_value_counts(call: PandasCall, ctx: RuleContext) -> Value:
    """pd.value_counts(s, sort, ascending, normalize, bins, dropna) -> as s.value_counts(...).

    The function (deprecated in pandas 2.1, removed in 3.0; from memory) counted the values
    of the Series it was given, as the method does, with the same options in another order.
    """
    options = ("values", "sort", "ascending", "normalize", "bins", "dropna")
    ctx.reject_unknown(call, *options, positional=len(options))
    column = call.arg("values", 0)
    if not isinstance(column, Column):
        raise Unsupported("pd.value_counts of something other than a column")
    kwargs = {name: call.arg(name, i) for i, name in enumerate(options)
              if i and call.has(name, i)}
    return _as_today("series.value_counts",
                     PandasCall(column, "value_counts", (), kwargs, call.node), ctx)


@rule("series.pad", "series.backfill", "frame.pad", "frame.backfill", "groupby.pad",
      "groupby.backfill")
def pad_backfill(call: PandasCall, ctx: RuleContext) -> Value:
    """s.pad() / s.backfill() (and a frame's, a groupby's) -> as s.ffill() / s.bfill().

    pad and backfill (deprecated in pandas 2.0, removed in 3.0; a groupby's deprecated in 1.4
    and removed in 2.0; from memory) were ffill and bfill under their older names, with the
    same options.
    """
    owner = "frame" if isinstance(call.receiver, Frame) else \
        "groupby" if isinstance(call.receiver, Grouped) else "series"
    today = "ffill" if call.name == "pad" else "bfill"
    return _as_today(f"{owner}.{today}",
                     PandasCall(call.receiver, today, call.args, call.kwargs, call.node), ctx)


@rule("series.iteritems")
def series_iteritems(call: PandasCall, ctx: RuleContext) -> Value:
    """s.iteritems() -> as s.items(): (label, value) pairs.

    Series.iteritems (deprecated in pandas 1.5, removed in 2.0; from memory) was items()
    under its Python 2 name.
    """
    return _as_today("series.items", PandasCall(call.receiver, "items", call.args, call.kwargs,
                                                call.node), ctx)


# -- a call kept on pandas, written as pandas 3.1 spells it -------------------------------------
#
# A call porter keeps on pandas (a TODO, or a value only pandas gives) runs on pandas 3.1,
# which no longer has the older names: the hand-over writes today's spelling of the same call
# (handover.pandas_fallback), as it writes today's frequency aliases. Only calls whose receiver
# is a pandas value, and only spellings with one meaning, are rewritten.

_RENAMED_METHODS = {"iteritems": "items", "applymap": "map", "valid": "dropna", "pad": "ffill",
                    "backfill": "bfill"}


_FILL_METHODS = {"ffill": "ffill", "pad": "ffill", "bfill": "bfill", "backfill": "bfill"}


APPEND_FUNCTION = "pandas_append"
APPEND_DEFINITION = """\
def pandas_append(appended_to, other, ignore_index=False, verify_integrity=False, sort=False):
    \"\"\"appended_to.append(other) as pandas 1.5 ran it (DataFrame.append and Series.append,
    which pandas 2 removed): pd.concat, where a dict or a Series given to a frame is one row
    first (Series(other).to_frame().T.infer_objects()) and a list of dicts a frame; the append
    of anything else (an Index, a list) is its own.\"\"\"
    pandas = __import__("pandas")  # (no import statement: a second conversion leaves it be)

    if not isinstance(appended_to, (pandas.DataFrame, pandas.Series)):
        return appended_to.append(other)  # an Index's own append, a list's
    if isinstance(appended_to, pandas.Series):
        if isinstance(other, (list, tuple)):
            return pandas.concat([appended_to, *other], ignore_index=ignore_index,
                                 verify_integrity=verify_integrity)
        return pandas.concat([appended_to, other], ignore_index=ignore_index,
                             verify_integrity=verify_integrity)
    if isinstance(other, (pandas.Series, dict)):
        if isinstance(other, dict):
            if not ignore_index:
                raise TypeError("Can only append a dict if ignore_index=True")
            other = pandas.Series(other)
        if other.name is None and not ignore_index:
            raise TypeError("Can only append a Series if ignore_index=True or if the Series "
                            "has a name")
        names = pandas.Index([other.name], name=appended_to.index.name).names
        other = other.to_frame().T.infer_objects().rename_axis(names)
    elif isinstance(other, list) and other and not isinstance(other[0], pandas.DataFrame):
        other = pandas.DataFrame(other)
        if appended_to.index.name is not None and not ignore_index:
            other.index.name = appended_to.index.name
    to_concat = [appended_to, *other] if isinstance(other, (list, tuple)) else [appended_to, other]
    return pandas.concat(to_concat, ignore_index=ignore_index, verify_integrity=verify_integrity,
                         sort=sort)
"""


READ_CSV_FUNCTION = "pandas_read_csv"
READ_CSV_DEFINITION = """\
def pandas_read_csv(*args, squeeze=False, error_bad_lines=None, warn_bad_lines=None,
                    delim_whitespace=False, infer_datetime_format=False, parse_dates=None,
                    date_parser=None, keep_date_col=False, **kwargs):
    \"\"\"pd.read_csv as pandas 1.5 read it, with the options pandas 2 and 3 removed: squeeze=True
    (a file of one column is that column), error_bad_lines=False (on_bad_lines=), delim_whitespace
    (sep=r"\\\\s+"), parse_dates joining columns ([["d", "t"]] or {"name": ["d", "t"]}: the texts
    joined with a space, the new column first) and date_parser= (called on the columns, else on
    each joined text, else on each row's texts, as pandas 1.5's converter tried them; a column it
    cannot read stays text).\"\"\"
    pandas = __import__("pandas")

    if error_bad_lines is False:
        kwargs["on_bad_lines"] = "skip" if warn_bad_lines is False else "warn"
    if delim_whitespace:
        kwargs["sep"] = r"\\s+"
    groups, keep = [], set()
    if isinstance(parse_dates, dict):
        groups = [(name, list(cols)) for name, cols in parse_dates.items()]
    elif isinstance(parse_dates, (list, tuple)):
        for col in parse_dates:
            if isinstance(col, list):
                groups.append(("_".join(str(c) for c in col), col))
            else:
                groups.append((col, [col]))
                keep.add(col)
    elif parse_dates:
        return pandas.read_csv(*args, parse_dates=parse_dates, **kwargs)
    texts = {c for _, cols in groups for c in cols}
    if texts:
        given = kwargs.get("dtype")
        kwargs["dtype"] = {**(given if isinstance(given, dict) else {}), **{c: object for c in texts}}
    frame = pandas.read_csv(*args, **kwargs)

    def dates(cols):
        values = [frame[c].to_numpy(dtype=object) for c in cols]
        joined = [" ".join(str(v) for v in row) for row in zip(*values)]
        if date_parser is None:
            found = joined
        else:
            try:
                found = date_parser(*values)
                if isinstance(found, __import__("datetime").datetime):
                    raise TypeError("one value")
            except Exception:
                try:
                    found = [date_parser(text) for text in joined]
                except Exception:
                    found = [date_parser(*row) for row in zip(*values)]
        try:
            return pandas.to_datetime(found)
        except (ValueError, TypeError):
            return pandas.Series(found, dtype=object).to_numpy()

    made = {name: dates(cols) for name, cols in groups}
    joined_away = [c for name, cols in groups for c in cols if name not in keep]
    if not keep_date_col:
        frame = frame.drop(columns=[c for c in joined_away if c in frame.columns])
    for name in keep:
        frame[name] = made[name]
    new = [name for name, _ in groups if name not in keep]
    for at, name in enumerate(new):
        frame.insert(at, name, made[name])
    if squeeze and len(frame.columns) == 1:
        return frame[frame.columns[0]].copy()
    return frame
"""
READ_CSV_REMOVED = ("squeeze", "error_bad_lines", "warn_bad_lines", "delim_whitespace",
                    "infer_datetime_format", "date_parser", "keep_date_col")


def modern_read_csv_call(args: list[tuple[str | None, str]]) -> str | None:
    """pd.read_csv(...) kept on pandas, as it runs under pandas 3.1 when it uses an option
    pandas 2 or 3 removed (or parse_dates joining columns): pandas_read_csv(...), which reads
    those as pandas 1.5 did (READ_CSV_DEFINITION); None when it uses none."""
    keywords = {keyword: text for keyword, text in args if keyword is not None}
    parse_dates = keywords.get("parse_dates", "")
    joins = parse_dates.lstrip("(").startswith("{") or "[[" in parse_dates.replace(" ", "") \
        or ", [" in parse_dates or ",[" in parse_dates
    if not (set(keywords) & set(READ_CSV_REMOVED) or joins):
        return None
    written = [text if keyword is None else f"{keyword}={text}" for keyword, text in args]
    return f"{READ_CSV_FUNCTION}({', '.join(written)})"


def modern_call(receiver: str, name: str, args: list[tuple[str | None, str]]) -> str | None:
    """`receiver.name(args)` of a pandas object kept on pandas, as it runs under pandas 3.1
    (the whole call), given the receiver's code and the arguments as (keyword or None, text);
    None when there is nothing to rewrite or no one way to.

    append(other, ignore_index, verify_integrity, sort) (removed in pandas 2.0) is
    pandas_append(receiver, ...), which does what pandas 1.5's DataFrame.append and
    Series.append did (APPEND_DEFINITION). fillna(method="ffill" / "bfill" / "pad" /
    "backfill") is ffill() / bfill() with its limit, axis and inplace."""
    if receiver.rsplit(".", 1)[-1] in ("str", "dt", "cat", "sparse", "plot", "list",
                                       "struct"):
        return None  # an accessor's method (s.str.pad) is no frame's or Series'
    positional = [text for keyword, text in args if keyword is None]
    keywords = {keyword: text for keyword, text in args if keyword is not None}
    if name == "append":
        if len(positional) + len(keywords) > 4 or not set(keywords) <= {
                "other", "ignore_index", "verify_integrity", "sort"} or not args:
            return None
        written = [text if keyword is None else f"{keyword}={text}" for keyword, text in args]
        return f"{APPEND_FUNCTION}({receiver}, {', '.join(written)})"
    if name == "fillna" and "method" in keywords and not positional \
            and "value" not in keywords and set(keywords) <= {"method", "limit", "axis", "inplace"}:
        try:
            method = _FILL_METHODS[ast.literal_eval(keywords["method"])]
        except (ValueError, SyntaxError, KeyError, TypeError):
            return None
        rest = ", ".join(f"{k}={v}" for k, v in keywords.items() if k != "method")
        return f"{receiver}.{method}({rest})"
    if name == "lookup" and len(positional) == 2 and not keywords:
        # DataFrame.lookup (removed in 2.0) in the source of 1.5 (read): each (row, column)
        # label pair's value, converted from objects as maybe_convert_objects does
        return (f"(lambda frame, rows, cols: pd.Series([frame.at[r, c] for r, c in zip(rows, cols)], "
                f"dtype=object).infer_objects().to_numpy())({receiver}, {positional[0]}, {positional[1]})")
    modern = modern_method(name, args)
    return None if modern is None else f"{receiver}{modern}"


def modern_method(name: str, args: list[tuple[str | None, str]]) -> str | None:
    """`.name(args)` of a pandas frame or Series as pandas 3.1 writes it (the text after the
    receiver), given the arguments as (keyword or None, text); None when there is nothing to
    rewrite or no one way to."""
    positional = [text for keyword, text in args if keyword is None]
    keywords = {keyword: text for keyword, text in args if keyword is not None}
    if name in _RENAMED_METHODS:
        written = [text if keyword is None else f"{keyword}={text}" for keyword, text in args]
        return f".{_RENAMED_METHODS[name]}({', '.join(written)})"
    if name == "as_matrix" and len(args) <= 1 and set(keywords) <= {"columns"}:
        columns = positional[0] if positional else keywords.get("columns")
        if columns in (None, "None"):
            return ".to_numpy()"
        # a list of names (a text would choose a Series: not what as_matrix read)
        return f"[{columns}].to_numpy()" if columns.startswith("[") else None
    if name == "get_value" and len(positional) == 2 and not keywords:
        return f".at[{positional[0]}, {positional[1]}]"
    return None


@rule("pd.rolling_apply", "pd.expanding_apply")
def window_apply_function(call: PandasCall, ctx: RuleContext) -> Value:
    """pd.rolling_apply(s, n, func, min_periods, freq, center) -> as s.rolling(n, ...).apply(
    func, raw=True); pd.expanding_apply(s, func, min_periods) -> as s.expanding(...).apply(
    func, raw=True).

    The functions (deprecated in pandas 0.18, removed in 0.23; from memory) called func on
    each window as a numpy array, which is raw=True (the default raw=False of today passes a
    Series). freq= (resampling first), args= and kwargs= are TODOs.
    """
    rolling = ctx.key == "pd.rolling_apply"
    options = ("arg", "window", "func", "min_periods", "freq", "center", "args", "kwargs") \
        if rolling else ("arg", "func", "min_periods", "freq", "args", "kwargs")
    ctx.reject_unknown(call, *options, positional=len(options))
    for name in ("freq", "args", "kwargs"):
        at = options.index(name)
        if call.has(name, at) and call.const(name, at, None) not in (None, (), {}):
            raise Unsupported(f"{name}= of pd.{ctx.key[3:]}")
    column = call.arg("arg", 0)
    if not isinstance(column, Column):
        raise Unsupported("a window over something other than a column")
    window_options = {name: call.arg(name, options.index(name))
                      for name in ("window", "min_periods", "center")
                      if name in options and call.has(name, options.index(name))}
    kind = "rolling" if rolling else "expanding"
    window = _as_today(f"series.{kind}", PandasCall(column, kind, (), window_options, call.node), ctx)
    func = call.arg("func", options.index("func"))
    return _as_today(f"series.{kind}.apply", PandasCall(
        window, "apply", (func,), {"raw": _const(True)}, call.node), ctx)


def sort_index_by(call: PandasCall, ctx: RuleContext) -> Value:
    """df.sort_index(by=cols, ascending=) -> as df.sort_values(cols, ascending=) (the frame's
    sort_index rule hands it here).

    sort_index(by=) (deprecated in pandas 0.17, removed by 1.0; from memory) was, in the
    source of 0.20 (read), sort_values(by, axis=axis, ascending=ascending, inplace=inplace):
    kind= and na_position= were not passed on (sort_values' defaults), level= beside by=
    raised.
    """
    ctx.reject_unknown(call, "by", "axis", "ascending", "inplace", "kind", "na_position")
    if call.const("axis", None, 0, kinds=(int, str)) not in (0, "index", "rows"):
        raise Unsupported("sort_index(by=, axis=1)")
    kwargs = {"by": call.kwargs["by"]}
    if "ascending" in call.kwargs:
        kwargs["ascending"] = call.kwargs["ascending"]
    return _as_today("frame.sort_values",
                     PandasCall(call.receiver, "sort_values", (), kwargs, call.node), ctx)


@rule("series.ix")
def series_ix(call: PandasCall, ctx: RuleContext) -> Value:
    """s.ix[key] -> as s[mask], s.loc["label"] or s.iloc[i], where the Series tells which one
    .ix read.

    A True/False mask chose rows as s[mask] does; a text was a label (s.loc); a whole number
    on pandas' labels 0..n-1 (a column of a frame read and not filtered, sorted or indexed
    since) was a label of that integer index, which is the row's position. Other keys (a
    whole number of a Series labelled by text, which .ix read as a position, slices, lists)
    are TODOs (from memory: .ix removed in pandas 1.0).
    """
    column = call.receiver
    assert isinstance(column, Column)
    if len(call.args) != 1:
        raise Unsupported("s.ix with more than one key")
    key = call.args[0]
    if isinstance(key, Column) and key.dtype == "bool":
        return _as_today("series.getitem", PandasCall(column, "getitem", (key,), {}, call.node), ctx)
    const = key.const if isinstance(key, Opaque) and key.is_const else None
    if isinstance(const, str):
        return _as_today("series.loc", PandasCall(column, "loc", (key,), {}, call.node), ctx)
    if isinstance(const, int) and not isinstance(const, bool) and const >= 0 \
            and _default_labels(column.frame) and not column.index_values:
        return _as_today("series.iloc", PandasCall(column, "iloc", (key,), {}, call.node), ctx)
    raise Unsupported("s.ix[key] with a key other than a mask, a text label or a whole number "
                      "on labels 0..n-1: .ix read a whole number as a label of an integer index "
                      "and as a position otherwise; write .loc or .iloc")


def without_infer_datetime_format(call: PandasCall, ctx: RuleContext) -> PandasCall:
    """pd.to_datetime(..., infer_datetime_format=) read as pandas 3.1 reads the call without it
    (the option was deprecated in pandas 2.0 and removed in 3.0; from memory).

    With it, pandas 1.x guessed one format from the first value and read the values that did
    not fit it one by one (dateutil); since pandas 2 the guessed format is the only one: a
    value that does not fit is an error, or NaT with errors="coerce", where pandas 1.x read
    it (0.9 without format=: the values of one layout are the same).
    """
    call.const("infer_datetime_format", None, False, kinds=(bool,))
    if not call.has("format"):
        ctx.lower("infer_datetime_format= (pandas 1.x): a value not in the format guessed from "
                  "the first one was read on its own; since pandas 2 (and here) it is an error, "
                  "or NaT with errors=\"coerce\"", 0.9)
    kwargs = {k: v for k, v in call.kwargs.items() if k != "infer_datetime_format"}
    return PandasCall(call.receiver, call.name, call.args, kwargs, call.node)


@rule("groupby.append_rows")
def group_append_rows(call: PandasCall, ctx: RuleContext) -> Value:
    """a loop appending one dict row per group -> df.group_by(k).agg(values) sorted by the keys.

    acc = pd.DataFrame(); for key, rows in df.groupby(k): acc = acc.append({"c": value, ...},
    ignore_index=True): the columns in the dict's order. The loop (Engine.group_appends hands it here, with acc made empty just before) appended
    one row per group, the groups in sorted key order, rows of a missing key left out; each
    value is the key or a reduction of the group's rows (as in groupby.apply with
    pd.Series({...})). DataFrame.append (pandas 1.5, read) made each dict a row through
    Series(dict): with a text value (a text key) each column keeps its own type; with numbers
    only, one float makes every column float (Series of ints and floats), as the result here
    does (at run time where the types are not known).
    Caveats: on an empty frame the loop never ran and pandas' frame has no columns, where this
    one has the dict's (0.95); a key given as a list of one (groupby(["k"])) is the key itself
    as pandas 1.x gave it (pandas 2 and 3 give a tuple).
    """
    from porter.rules.groupby import _BodyReader, aggregate

    grouped = call.receiver
    assert isinstance(grouped, Grouped)
    keys, rows, items = call.args[0].const  # type: ignore[attr-defined]
    if grouped.selection is not None or grouped.prepared or grouped.pandas is not None \
            or grouped.frame.index or not grouped.sort or not grouped.dropna:
        raise Unsupported("a loop over a groupby of selected columns, a computed key, a "
                          "labelled table, sort=False or dropna=False")
    if len(keys) != len(grouped.keys) or any(not isinstance(k, str) for k in grouped.keys):
        raise Unsupported("a loop whose key names do not match the groupby's keys")
    frame = grouped.frame
    reader = _BodyReader(rows, grouped, ctx)
    exprs, names, kinds = [], [], []
    selected: list[Code] = []
    for name, node in items:
        if isinstance(node, cst.Name) and node.value in keys:
            column = grouped.keys[keys.index(node.value)]
            selected.append(emit.col(column).method("alias", name) if column != name
                            else emit.col(column))
            kinds.append(frame.dtype(column))
            continue
        value = reader.agg(node)
        if value.is_test:
            raise Unsupported("a value that is True/False (pandas keeps it in an object column)")
        if name in grouped.keys:
            raise Unsupported(f"a value named like the key column {name!r}")
        exprs.append(value.code.method("alias", name))
        names.append(name)
        kinds.append(None if value.kinds is None else
                     "int" if value.kinds == frozenset({"int"}) else
                     "float" if value.kinds == frozenset({"float"}) else "mixed")
        selected.append(emit.col(name))
    table = aggregate(grouped, exprs, names, ctx)
    if not isinstance(table, Frame):
        raise Unsupported("the values make no frame")
    code = table.code.method("select", *selected)
    numbers = {"int", "float"}
    if any(k is not None and k not in numbers for k in kinds):
        pass  # a text value in every row: each column keeps its own type
    elif all(k in numbers for k in kinds):
        if "float" in kinds:
            code = code.method("cast", emit.atom("pl.Float64"))
    else:
        # numbers only, the types not all known: one float column makes every column float
        code = code.method("pipe", emit.atom(
            "lambda t: t.cast(pl.Float64) if all(d.is_numeric() for d in "
            "t.collect_schema().dtypes()) and any(d.is_float() for d in "
            "t.collect_schema().dtypes()) else t"))
    ctx.lower("on an empty frame the loop never runs: pandas' frame has no columns, this one "
              "has the dict's", 0.95)
    return Frame(code, columns=tuple(name for name, _ in items), labels_intact=True,
                 binding=None)


# methods pandas 2 or 3 removed whose names nothing else in pandas has: a script calling one
# was written for an older pandas (append and pad are left out: lists and strings have them)
_REMOVED_NAMES = frozenset({"iteritems", "applymap", "as_matrix", "get_value", "set_value",
                            "lookup", "ix", "valid", "rolling_mean", "rolling_sum",
                            "expanding_mean", "ewma", "backfill"})


def written_for_older_pandas(module: object) -> bool:
    """Whether the script (Python's ast.Module) uses an API pandas 2 or 3 removed: .iteritems(),
    .applymap(), .ix[...], .lookup(), fillna(method=...), pd.np, ... It was written for pandas
    1.x, whose meaning of a call that pandas 3 changed (groupby.apply passing the key columns)
    is the one it relied on."""
    import ast as python_ast

    if not isinstance(module, python_ast.Module):
        return False
    for node in python_ast.walk(module):
        if isinstance(node, python_ast.Attribute) and (
                node.attr in _REMOVED_NAMES
                or node.attr == "np" and isinstance(node.value, python_ast.Name)
                and node.value.id in ("pd", "pandas")):
            return True
        if isinstance(node, python_ast.Call) and isinstance(node.func, python_ast.Attribute) \
                and node.func.attr == "fillna" and any(k.arg == "method" for k in node.keywords):
            return True
    return False
