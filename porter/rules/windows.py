"""Row-to-row operations on one column: shift, diff, cumsum / cumprod / cummax / cummin.

They read rows in order, which a LazyFrame keeps for column expressions (no group_by or join
in between), so the expression sees the rows in pandas' order.
"""

from __future__ import annotations

from porter.emit import code as emit
from porter.rules import rule
from porter.translate.context import PandasCall, RuleContext, Unsupported, derived_column
from porter.translate.values import Column, Value

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
