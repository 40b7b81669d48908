"""Hand-overs: uses best left on pandas on purpose (plotting, writers Polars lacks).

The frame stays lazy up to the call, which is written on an explicit `.collect().to_pandas()`
(see docs/design.md, "TODO markers"): the site is reported with status `handover`.
Caveats: pandas plots and writes the row labels; where they are no longer 0..n-1 (after a
filter or a sort) the collected frame has fresh ones, so those uses lower their confidence or
become TODOs.
"""

from __future__ import annotations

from porter.emit.code import Code
from porter.rules import rule
from porter.translate.context import PandasCall, RuleContext
from porter.translate.handover import to_pandas
from porter.translate.values import (
    Accessor, Column, Frame, Grouped, Indexer, Opaque, PandasValue, Scalar, Value,
)

PANDAS_KINDS = (Frame, Column, Grouped, Accessor, Indexer)


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
    draw values only, so row labels do not matter.
    """
    return PandasValue(_same_call(call, ctx))


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
    """df.to_string(...) / to_markdown(...) -> df.collect().to_pandas().to_string(...).

    Handles: the text pandas lays out, from the collected frame with pandas' types (an int
    column with a missing value is float, as pandas holds it); the index porter tracks
    (after a groupby) is restored and printed; index=False prints no labels.
    Caveats: with the row labels printed (the default), labels that are no longer 0..n-1
    (after a filter or a sort) are a TODO.
    """
    if call.const("index", None, True):
        _check_labels(call, ctx, None, "print")
    return Opaque(_same_call(call, ctx))


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
