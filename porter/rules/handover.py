"""Hand-overs: uses best left on pandas on purpose (plotting, writers Polars lacks).

The frame stays lazy up to the call, which is written on an explicit `.collect().to_pandas()`
(see docs/design.md, "TODO markers"): the site is reported with status `handover`.
Caveats: pandas plots and writes the row labels; where they are no longer 0..n-1 (after a
filter or a sort) the collected frame has fresh ones, so those uses lower their confidence or
become TODOs.

`df.to_string()` is the exception: the text is laid out from the Polars frame, as pandas lays
it out, by a function written once into the converted script (TEXT_DEFINITION).
"""

from __future__ import annotations

from dataclasses import replace

from porter.emit import code as emit
from porter.emit.code import Code
from porter.rules import rule
from porter.translate.context import PandasCall, RuleContext
from porter.translate.handover import to_pandas
from porter.translate.values import (
    Accessor, Column, Frame, Grouped, Indexer, Opaque, PandasValue, Scalar, Value,
)

PANDAS_KINDS = (Frame, Column, Grouped, Accessor, Indexer)

# A function, defined once at the top of a converted script, that lays a collected frame out as
# pandas' DataFrame.to_string() does (checked against pandas on generated frames in the tests).
TEXT_FUNCTION = "pandas_to_string"
TEXT_DEFINITION = '''\
def pandas_to_string(frame, index=True):
    """The frame as pandas' DataFrame.to_string() lays it out with its default options: each
    column right-aligned under its name, floats to the decimals the column needs (at most six,
    or in e-notation), a missing value as NaN (NaT for a date), one space between columns.
    Columns of other types (time zones, durations, lists) are laid out by pandas itself."""
    if any(not (dtype.is_numeric() or dtype in (pl.String, pl.Boolean, pl.Categorical)
                or isinstance(dtype, pl.Enum)
                or isinstance(dtype, pl.Datetime) and dtype.time_zone is None)
           for dtype in frame.dtypes):
        return frame.to_pandas().to_string(index=index)
    if frame.height == 0 or frame.width == 0:
        def listed(items):
            items = [str(item) for item in items]
            return "[" + ", ".join(items[:100]) + (", ..." if len(items) > 100 else "") + "]"
        return (f"Empty DataFrame\\nColumns: {listed(frame.columns)}\\n"
                f"Index: {listed(range(frame.height))}")

    def escaped(text):
        return text.replace("\\t", "\\\\t").replace("\\n", "\\\\n").replace("\\r", "\\\\r")

    def floats(values):
        def laid_out(spec):
            cells = ["NaN" if v is None or v != v else format(v, spec) for v in values]
            numbers = []
            for cell in cells:
                whole, dot, part = cell.strip().lstrip("+-").partition(".")
                numbers.append(bool(dot) and whole.isdigit() and (part == "" or part.isdigit()))
            if any(numbers):
                while all(cell.endswith("0") for cell, n in zip(cells, numbers) if n):
                    cells = [cell[:-1] if n else cell for cell, n in zip(cells, numbers)]
                cells = [cell + "0" if n and cell.endswith(".") else cell
                         for cell, n in zip(cells, numbers)]
            return cells
        sign = " " if index else ""
        cells = laid_out(f"{sign}.6f")
        sizes = [abs(v) for v in values if v is not None and v == v]
        if any(0 < v < 1e-06 for v in sizes) or (
                max(map(len, cells)) > 12 and any(v > 1e6 for v in sizes)):
            cells = laid_out(f"{sign}.6e")
        return cells

    def datetimes(column):
        times = column.drop_nulls()
        fraction = times.dt.nanosecond()
        if (times == times.dt.truncate("1d")).all():
            layout = "%Y-%m-%d"
        elif (fraction == 0).all():
            layout = "%Y-%m-%d %H:%M:%S"
        elif (fraction % 1_000_000 == 0).all():
            layout = "%Y-%m-%d %H:%M:%S%.3f"
        elif (fraction % 1_000 == 0).all():
            layout = "%Y-%m-%d %H:%M:%S%.6f"
        else:
            layout = "%Y-%m-%d %H:%M:%S%.9f"
        return column.dt.to_string(layout).fill_null("NaT").to_list()

    blocks = []
    if index:
        labels = [str(label) for label in range(frame.height)]
        width = max(map(len, labels))
        blocks.append([" " * width] + [label.ljust(width) for label in labels])
    lead = " " if index else ""
    for column in frame.iter_columns():
        numeric = column.dtype.is_numeric()
        if column.dtype.is_float() or column.dtype.is_integer() and column.has_nulls() \\
                or isinstance(column.dtype, (pl.Categorical, pl.Enum)) \\
                and column.null_count() == column.len():
            cells = floats(column.cast(pl.Float64).to_list())
        elif column.dtype.is_integer():
            cells = [format(value, lead + "d") for value in column.to_list()]
        elif isinstance(column.dtype, pl.Datetime):
            cells = datetimes(column)
        elif column.dtype == pl.Boolean:
            numeric = not column.has_nulls()
            cells = [lead + ("NaN" if value is None else str(value)) for value in column.to_list()]
        else:
            cells = [lead + ("NaN" if value is None else escaped(value))
                     for value in column.cast(pl.String).to_list()]
        header = (" " if numeric else "") + escaped(column.name)
        width = max(len(header), *map(len, cells))
        blocks.append([header.rjust(width)] + [cell.rjust(width) for cell in cells])
    return "\\n".join(" ".join(row) for row in zip(*blocks))
'''
# porter's dtypes the function lays out itself
_TEXT_DTYPES = {"int", "float", "str", "bool", "datetime", "category", "enum"}


@rule("frame.plot", "series.plot")
def plot_accessor(call: PandasCall, ctx: RuleContext) -> Value:
    """df.plot / s.plot -> df.collect().to_pandas().plot (the accessor, called or not).

    Handles: the index porter tracks (after a groupby) is restored, so it labels the x axis
    as in pandas; `df.plot(...)`, `df.plot.bar(...)` and `s.plot.hist()` all go through here.
    Caveats: a line or bar plot uses the row labels as x values; when they are no longer
    0..n-1 the picture can differ unless x= is given (0.8).
    """
    _check_labels(call, ctx, "the plot's x axis shows the row labels unless x= is given")
    return PandasValue(to_pandas(_receiver(call)).attr("plot"))


@rule("frame.hist", "frame.boxplot", "series.hist")
def plot_method(call: PandasCall, ctx: RuleContext) -> Value:
    """df.hist(...) / df.boxplot(...) / s.hist(...) -> on df.collect().to_pandas().

    Handles: the same arguments, pandas values among them handed over as well; these plots
    draw values only, so row labels do not matter. With column= (and by=) written out, only
    those columns go over to pandas: pandas reads nothing else of the frame then.
    """
    named = _named_columns(call)
    if named is not None:
        frame = call.receiver
        assert isinstance(frame, Frame)
        kept = tuple(c for c in frame.columns or () if c in named)
        chosen = replace(frame, code=frame.code.method("select", *kept), columns=kept,
                         dtypes=tuple((c, t) for c, t in frame.dtypes if c in kept))
        kwargs = {k: _argument(v, ctx) for k, v in call.kwargs.items()}
        return PandasValue(to_pandas(chosen).method(call.name, **kwargs))
    return PandasValue(_same_call(call, ctx))


def _named_columns(call: PandasCall) -> set[str] | None:
    """The columns df.hist(column=..., by=...) / df.boxplot(column=..., by=...) reads, when
    both are written out as texts naming columns of a frame whose columns are known (without
    row labels of its own), and the call is given nothing else from pandas; None otherwise."""
    frame = call.receiver
    if call.name not in ("hist", "boxplot") or not isinstance(frame, Frame) or call.args \
            or frame.columns is None or frame.index or frame.value_levels or frame.column_pairs:
        return None
    named: set[str] = set()
    for option in ("column", "by"):
        value = call.kwargs.get(option)
        if value is None:
            if option == "column":
                return None  # every number column is drawn
            continue
        if not (isinstance(value, Opaque) and value.is_const):
            return None
        texts = list(value.const) if isinstance(value.const, (list, tuple)) else [value.const]
        if not texts or not all(isinstance(t, str) and t in frame.columns for t in texts):
            return None
        named.update(texts)
    if any(isinstance(v, PANDAS_KINDS) for v in call.kwargs.values()) \
            or set(frame.columns) <= named:
        return None
    return named


@rule("frame.to_excel", "frame.to_sql")
def handover(call: PandasCall, ctx: RuleContext) -> Value:
    """df.to_excel(...) / df.to_sql(...) -> df.collect().to_pandas().to_excel(...).

    Handles: the index porter tracks (after a groupby) is restored and written like pandas
    writes it; index=False.
    Caveats: with index=True (the default) the row labels are written, which is a TODO once
    a filter or a sort has changed them.
    """
    if call.const("index", None, True):
        _check_labels(call, ctx, None)
    return Opaque(_same_call(call, ctx))


@rule("frame.to_string", "series.to_string", "frame.to_markdown", "series.to_markdown")
def to_text(call: PandasCall, ctx: RuleContext) -> Value:
    """df.to_string(index=...) -> pandas_to_string(df.collect(), index=...); other text layouts
    -> df.collect().to_pandas().to_string(...) / to_markdown(...).

    Handles: df.to_string() with no option but index=, on a frame whose columns are numbers,
    text, booleans, categories or dates, is laid out from the Polars frame exactly as pandas
    lays it out (pandas_to_string, written once into the script): an int column with a missing
    value as pandas' float, a missing value as NaN (NaT for a date), pandas' common decimals
    and e-notation; the row labels 0..n-1 when they are still pandas' own. Otherwise the text
    pandas lays out, from the collected frame with pandas' types; the index porter tracks
    (after a groupby) is restored and printed; index=False prints no labels.
    Caveats: with the row labels printed (the default), labels that are no longer 0..n-1
    (after a filter or a sort) are a TODO.
    """
    if call.const("index", None, True):
        _check_labels(call, ctx, None, "print")
    frame = call.receiver
    if call.name == "to_string" and isinstance(frame, Frame) and _laid_out_here(call, frame):
        index = call.const("index", None, True, kinds=(bool,))
        kwargs = {} if index else {"index": False}
        return Scalar(emit.call(TEXT_FUNCTION, frame.code.method("collect"), **kwargs),
                      pytype="str")
    ctx.handover = True
    return Opaque(_same_call(call, ctx))


@rule("frame.info")
def info(call: PandasCall, ctx: RuleContext) -> Value:
    """df.info() -> df.collect().to_pandas().info(): pandas prints its own summary.

    Handles: the row labels as pandas shows them (a RangeIndex 0..n-1, or the index porter
    tracks, restored), each column's non-null count and pandas' dtype (float64 for an int
    column with a missing value, str, category), the same arguments (verbose=, buf=,
    show_counts=); the value is None, as in pandas.
    Caveats: the last line counts the bytes pandas holds, which for text that made the round
    trip through Polars can be a few bytes off (0.9). Labels that are no longer 0..n-1 (after
    a filter or a sort) are a TODO, which hands the frame over with its labels. Polars' own
    summary is lf.collect_schema() and the row count.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    if not (frame.index or frame.labels_intact):
        raise ctx.todo("info() shows pandas' row labels, which are no longer 0..n-1 here: the "
                       "frame goes to pandas with its labels")
    if frame.columns is None or any(frame.dtype(c) in ("str", None) for c in frame.columns):
        ctx.lower("the memory line of info() counts the bytes pandas holds for text, which "
                  "after the round trip through Polars can be a few bytes off", 0.9)
    ctx.handover = True
    return Opaque(_same_call(call, ctx))


def _laid_out_here(call: PandasCall, frame: Frame) -> bool:
    """pandas_to_string lays the frame out as pandas would: no option but index=, plain
    column names, every column of a type it lays out, the row labels (if printed) 0..n-1."""
    if call.args or set(call.kwargs) - {"index"} or frame.columns is None:
        return False
    if frame.index or frame.number_labels or frame.column_pairs or frame.columns_name \
            or frame.int_labels_except is not None:
        return False
    return all(frame.dtype(name) in _TEXT_DTYPES for name in frame.columns)


def _receiver(call: PandasCall) -> Frame | Column:
    receiver = call.receiver
    assert isinstance(receiver, (Frame, Column))
    return receiver


def _check_labels(call: PandasCall, ctx: RuleContext, plot_reason: str | None,
                  verb: str = "write") -> None:
    """pandas uses the row labels here; the collected frame has fresh ones (0..n-1)."""
    receiver = _receiver(call)
    frame = receiver.frame if isinstance(receiver, Column) else receiver
    if frame.index or frame.labels_intact:
        return
    if plot_reason is None:
        raise ctx.todo(f"index=True {verb}s pandas' row labels, which are no longer 0..n-1 "
                       "here: pass index=False, or keep the labels as a column (with_row_index)")
    ctx.lower(f"{plot_reason}, and they are no longer 0..n-1 here", 0.8)


def _same_call(call: PandasCall, ctx: RuleContext) -> Code:
    """`<receiver as pandas>.<method>(<the same arguments>)`."""
    args = [_argument(v, ctx) for v in call.args]
    kwargs = {k: _argument(v, ctx) for k, v in call.kwargs.items()}
    return to_pandas(_receiver(call)).method(call.name, *args, **kwargs)


def _argument(value: Value, ctx: RuleContext) -> Code:
    if isinstance(value, PANDAS_KINDS):
        return to_pandas(value)
    if isinstance(value, (Opaque, Scalar, PandasValue)):
        return value.code
    raise ctx.todo(f"an argument porter cannot hand over: {value.code.text}")
