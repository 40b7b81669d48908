"""Row-to-row operations on one column: shift, diff, cumsum / cumprod / cummax / cummin, and
the same within groups (`groupby(...)[col].cumsum()`, `transform("sum")`) as window
expressions (`.over(keys)`).

They read rows in order, which a LazyFrame keeps for column expressions (no group_by or join
in between), so the expression sees the rows in pandas' order.
"""

from __future__ import annotations

from porter.emit import code as emit
from porter.emit.code import Code
from porter.rules import rule
from porter.rules.groupby import agg_expr
from porter.translate.context import (
    PandasCall, RuleContext, Unsupported, column_of, derived_column,
)
from porter.translate.values import Column, Grouped, Opaque, Value

CUMULATIVE = {"cumsum": "cum_sum", "cumprod": "cum_prod", "cummax": "cum_max", "cummin": "cum_min"}


def _column(call: PandasCall) -> Column:
    assert isinstance(call.receiver, Column)
    return call.receiver


@rule("series.shift")
def shift(call: PandasCall, ctx: RuleContext) -> Value:
    """Series.shift(n, fill_value) -> Expr.shift(n, fill_value=...).

    Handles: the rows moved in are missing (or fill_value); an integer column with missing
    values is float in pandas and stays integer in Polars (values match).
    Caveats: freq= (shifting the index) is a TODO.
    """
    column = _column(call)
    ctx.reject_unknown(call, "periods", "fill_value", positional=1)
    periods = call.const("periods", 0, 1)
    if not isinstance(periods, int):
        raise Unsupported("a computed number of periods")
    kwargs = {}
    if call.has("fill_value"):
        kwargs["fill_value"] = ctx.expr(call.arg("fill_value"), column.frame)
    return derived_column(column, column.code.method("shift", periods, **kwargs), dtype=column.dtype)


@rule("series.diff")
def diff(call: PandasCall, ctx: RuleContext) -> Value:
    """Series.diff(n) -> Expr.diff(n).

    Handles: the first n rows are missing, a missing value makes its two differences missing.
    """
    column = _column(call)
    ctx.reject_unknown(call, "periods", positional=1)
    periods = call.const("periods", 0, 1)
    if not isinstance(periods, int) or periods < 0:
        raise Unsupported("negative or computed periods")
    if column.dtype == "bool":
        raise Unsupported("diff of booleans is a logical xor in pandas")
    args = [periods] if periods != 1 else []
    return derived_column(column, column.code.method("diff", *args), dtype=column.dtype)


@rule(*(f"series.{name}" for name in CUMULATIVE))
def cumulative(call: PandasCall, ctx: RuleContext) -> Value:
    """Series.cumsum / cumprod / cummax / cummin -> Expr.cum_sum / cum_prod / cum_max / cum_min.

    Handles: a missing value stays missing and the running value carries on past it, as with
    pandas' skipna=True.
    Caveats: skipna=False is a TODO.
    """
    column = _column(call)
    ctx.reject_unknown(call, "skipna")
    if call.const("skipna", None, True) is not True:
        raise Unsupported("skipna=False")
    code = ctx.bool_expr(column, column.frame) if column.dtype == "bool" else column.code
    if column.dtype == "bool" and call.name == "cumsum":
        code = code.method("cast", emit.atom("pl.Int64"))
    return derived_column(column, code.method(CUMULATIVE[call.name]), dtype=column.dtype)


# -- within groups ------------------------------------------------------------------------------

TRANSFORMS = ("sum", "mean", "median", "min", "max", "std", "var", "count", "nunique", "first",
              "last", "size")


def _window(grouped: Grouped, expr: Code, missing: Code | None = None) -> Code:
    """`expr` computed per group, on every row of its group, in the frame's row order. pandas
    (dropna=True) gives rows with a missing key a missing value (`missing` where pandas fills
    them, as shift's fill_value); Polars would make them a group."""
    keys = [emit.col(k) for k in grouped.keys]
    over = expr.method("over", *grouped.keys)
    if not grouped.dropna:
        return over
    present = keys[0].method("is_not_null")
    for key in keys[1:]:
        present = emit.binop(present, "&", key.method("is_not_null"))
    return emit.when(present, over, missing)


def _selected(call: PandasCall) -> tuple[Grouped, Column]:
    grouped = call.receiver
    assert isinstance(grouped, Grouped)
    if not (grouped.single and grouped.selection):
        raise Unsupported("a window over several columns at once (select one column first)")
    frame = grouped.frame
    name = grouped.selection[0]
    if frame.columns is not None and name not in frame.columns:
        raise Unsupported(f"column {name!r} is not in the frame (pandas raises KeyError)")
    if any(k == name for k in grouped.keys):
        raise Unsupported("a window over the grouping key itself")
    return grouped, column_of(frame, name)


@rule("groupby.transform")
def group_transform(call: PandasCall, ctx: RuleContext) -> Value:
    """df.groupby(keys)[col].transform("sum" | "mean" | ...) -> the aggregation .over(keys).

    Handles: every row gets its group's value, in the frame's order; a missing key gives a
    missing value (dropna=True), missing values are skipped as pandas skips them.
    Caveats: functions and lambdas are TODOs; an int column whose keys have a missing value is
    float in pandas and stays integer in Polars (the values match).
    """
    grouped, column = _selected(call)
    ctx.reject_unknown(call, "func", positional=1)
    how = call.const("func", 0, None, kinds=(str,))
    if how not in TRANSFORMS:
        raise Unsupported("a function porter cannot read: write it as an aggregation .over(keys)")
    expr = emit.pl("len") if how == "size" else agg_expr(column.code, how, column.dtype)
    dtype = "int" if how in ("count", "nunique", "size") else \
        "float" if how in ("mean", "median", "std", "var") else column.dtype
    return derived_column(column, _window(grouped, expr), dtype=dtype)


@rule(*(f"groupby.{name}" for name in CUMULATIVE))
def group_cumulative(call: PandasCall, ctx: RuleContext) -> Value:
    """df.groupby(keys)[col].cumsum() / cumprod / cummax / cummin -> .cum_sum().over(keys).

    Handles: the running value restarts in each group and carries on past a missing value
    (skipna); a missing key gives a missing value.
    """
    grouped, column = _selected(call)
    ctx.reject_unknown(call, "skipna")
    if call.const("skipna", None, True) is not True:
        raise Unsupported("skipna=False")
    if column.dtype == "bool":
        raise Unsupported("a running value over booleans")
    return derived_column(column, _window(grouped, column.code.method(CUMULATIVE[call.name])),
                          dtype=column.dtype)


@rule("groupby.shift", "groupby.diff")
def group_shift(call: PandasCall, ctx: RuleContext) -> Value:
    """df.groupby(keys)[col].shift(n) / diff(n) -> .shift(n).over(keys) / .diff(n).over(keys).

    Handles: the first rows of each group are missing (or fill_value for shift); a missing key
    gives a missing value.
    """
    grouped, column = _selected(call)
    ctx.reject_unknown(call, "periods", *(("fill_value",) if call.name == "shift" else ()),
                       positional=1)
    periods = call.const("periods", 0, 1)
    if not isinstance(periods, int) or isinstance(periods, bool):
        raise Unsupported("a computed number of periods")
    if call.name == "diff" and (periods < 0 or column.dtype == "bool"):
        raise Unsupported("a negative diff or a diff of booleans")
    kwargs = {}
    if call.has("fill_value"):
        kwargs["fill_value"] = ctx.expr(call.arg("fill_value"), column.frame)
    args = [periods] if call.name == "shift" or periods != 1 else []
    expr = column.code.method(call.name, *args, **kwargs)
    # pandas writes fill_value on the rows of a missing key too
    return derived_column(column, _window(grouped, expr, kwargs.get("fill_value")), dtype=column.dtype)


@rule("groupby.cumcount")
def group_cumcount(call: PandasCall, ctx: RuleContext) -> Value:
    """df.groupby(keys).cumcount() -> pl.int_range(pl.len()).over(keys): each row's position in
    its group, from 0 (ascending=False counts from the end).

    Handles: a missing key gives a missing value.
    """
    grouped = call.receiver
    assert isinstance(grouped, Grouped)
    ctx.reject_unknown(call, "ascending", positional=1)
    ascending = call.const("ascending", 0, True, kinds=(bool,))
    position = emit.pl("int_range", emit.pl("len"), dtype=emit.atom("pl.Int64"))
    if not ascending:
        position = emit.binop(emit.binop(emit.pl("len"), "-", 1), "-", position)
    base = column_of(grouped.frame, grouped.keys[0])
    return derived_column(base, _window(grouped, position), dtype="int", name=None)
