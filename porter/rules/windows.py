"""Row-to-row operations on one column: shift, diff, cumsum / cumprod / cummax / cummin,
rolling and expanding windows, and the same within groups (`groupby(...)[col].cumsum()`,
`rank()`, `ffill()`, `transform("sum")`, `transform(lambda s: ...)`) as window expressions
(`.over(keys)`); the rows of each group (`groupby(...).head(n)`, `tail`, `nth`) as filters.

They read rows in order, which a LazyFrame keeps for column expressions (no group_by or join
in between), so the expression sees the rows in pandas' order.
"""

from __future__ import annotations

from dataclasses import dataclass, field, replace
import re

import libcst as cst

from porter.emit import code as emit
from porter.emit.code import Code
from porter.rules import rule
from porter.rules.elementwise import _checked, body_expression, function_value
from porter.rules.groupby import (
    GROUP_MEAN_FUNCTION, GROUP_SUM_FUNCTION, GROUP_SUM_OVER_FUNCTION, agg_expr, group_order,
    keys_sorted_as_pandas, lower_for_group_spread,
)
from porter.rules.io_options import QUANTILE_FUNCTION
from porter.rules.ops import abs_, float32_possible, round_
from porter.translate import handover
from porter.translate.context import (
    PandasCall, RuleContext, Unsupported, column_of, derive, derived_column, select_columns,
)
from porter.translate.values import (
    NOT_NULLABLE, Accessor, Column, Frame, Grouped, Opaque, Scalar, Value, fresh_token,
)

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
    kwargs, dtype = _shift_fill(call, column, ctx)
    code = column.code.method("shift", periods, **kwargs)
    if dtype == "int" and periods != 0 and not kwargs and _plain_int(column, ctx):
        code, dtype = _as_float(code), "float"
    return derived_column(column, code, dtype=dtype)


def _shift_fill(call: PandasCall, column: Column, ctx: RuleContext) -> tuple[dict[str, Code], str | None]:
    """shift's fill_value as Polars' keyword, and the result's type. pandas keeps an int
    column int64 with a fill that is a whole number (2 or 2.0) and makes it float64 with a
    fraction (0.5); fill_value=None is no fill."""
    if not call.has("fill_value"):
        return {}, column.dtype
    fill = call.arg("fill_value")
    if column.dtype == "int" and isinstance(fill, Opaque) and fill.is_const:
        value = fill.const
        if value is None:
            return {}, column.dtype
        if isinstance(value, float) and value.is_integer():
            return {"fill_value": emit.lit(int(value))}, "int"
        if isinstance(value, float):
            return {"fill_value": emit.lit(value)}, "float"
        if not (isinstance(value, int) and not isinstance(value, bool)):
            raise Unsupported(f"fill_value={value!r} on an int column (pandas makes it object)")
        return {"fill_value": ctx.expr(fill, column.frame)}, "int"
    if column.dtype == "int":
        raise Unsupported("a computed fill_value on an int column: pandas keeps int64 for a "
                          "whole number and makes float64 for a fraction")
    return {"fill_value": ctx.expr(fill, column.frame)}, column.dtype


def _as_float(code: Code) -> Code:
    """An int column a shift or diff gives missing values: float64 in pandas, whatever rows
    are left later (a filter that drops the missing rows keeps it float: 5.0, not 5)."""
    return code.method("cast", emit.atom("pl.Float64"))


def _plain_int(column: Column, ctx: RuleContext) -> bool:
    """Whether an int column is numpy's int64, which a missing value makes float64. pandas'
    nullable integers (astype("Int64")) stay integers beside <NA> (written 10, not 10.0): the
    result keeps their type and their mark (Column.nullable_int)."""
    if column.nullable_int:
        return False
    if column.nullable_int is None and ctx.nullable_ints_possible:
        ctx.lower("the column may be one of pandas' nullable integers (astype(\"Int64\")), "
                  "which stay integers beside a missing value; porter takes it as int64, made "
                  "float64 by one (10.0)", 0.9)
    return True


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
    # the difference of times is a duration (pandas' timedelta64)
    dtype = "duration" if column.dtype == "datetime" else None if column.dtype == "date" \
        else column.dtype
    code = column.code.method("diff", *args)
    if dtype == "int" and _plain_int(column, ctx):
        code, dtype = _as_float(code), "float"
    return derived_column(column, code, dtype=dtype)


@rule("frame.diff")
def frame_diff(call: PandasCall, ctx: RuleContext) -> Value:
    """df.diff(n) -> every column but the index keys .diff(n), as Series.diff on each.

    Handles: a wide table (a pivot, an unstack) whose index keys stay; columns of numbers.
    Caveats: text (pandas raises), True/False (a logical xor in pandas) and date columns (a
    duration) are TODOs when the types are known; unknown types lower the confidence (0.9);
    axis=1 is a TODO.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "periods", "axis", positional=1)
    periods = call.const("periods", 0, 1)
    if not isinstance(periods, int) or isinstance(periods, bool) or periods < 1:
        raise Unsupported("zero, negative or computed periods")
    if call.const("axis", None, 0) not in (0, "index", "rows"):
        raise Unsupported("axis=1: the differences across columns")
    args = [periods] if periods != 1 else []
    if frame.columns is not None:
        data = [c for c in frame.columns if c not in frame.index]
        kinds = {frame.dtype(c) for c in data}
        if kinds - {"int", "float"} - {None}:
            raise Unsupported("a column of text, True/False or dates (pandas raises, takes a "
                              "logical xor or makes durations)")
        if None in kinds:
            ctx.lower("some column types are not known: text fails in both, True/False is a "
                      "logical xor in pandas", 0.9)
        # numpy's int64 is float64 after it (a missing first row); pandas' nullable integers
        # stay integers
        floats = {c for c in data if frame.dtype(c) == "int"
                  and _plain_int(column_of(frame, c), ctx)}
        code = frame.code.method("with_columns", *(
            _as_float(emit.col(c).method("diff", *args)) if c in floats
            else emit.col(c).method("diff", *args) for c in data))
        dtypes = tuple((c, "float" if c in floats else t) for c, t in frame.dtypes)
        return derive(frame, code, same_rows=True, dtypes=dtypes)
    ctx.lower("the columns are not known: text fails in both, True/False is a logical xor in "
              "pandas", 0.9)
    others = emit.pl("all").method("exclude", *frame.index) if frame.index else emit.pl("all")
    code = frame.code.method("with_columns", others.method("diff", *args))
    return derive(frame, code, same_rows=True)


@rule(*(f"series.{name}" for name in CUMULATIVE))
def cumulative(call: PandasCall, ctx: RuleContext) -> Value:
    """Series.cumsum / cumprod / cummax / cummin -> Expr.cum_sum / cum_prod / cum_max / cum_min.

    Handles: a missing value stays missing and the running value carries on past it, as with
    pandas' skipna=True.
    Caveats: skipna=False and the running sum of a text column (pandas joins the strings) are
    TODOs.
    """
    column = _column(call)
    ctx.reject_unknown(call, "skipna")
    if call.const("skipna", None, True) is not True:
        raise Unsupported("skipna=False")
    if column.dtype == "str" and call.name in ("cumsum", "cumprod"):
        raise Unsupported("a running sum of text: pandas joins the strings so far, Polars has "
                          "no running join")
    code = ctx.bool_expr(column, column.frame) if column.dtype == "bool" else column.code
    if column.dtype == "bool" and call.name in ("cumsum", "cumprod") and _as_read(column):
        # pandas reads a True/False column with a blank as an object column, whose running
        # sum mixes types (True, 1, NaN, 2.0, 3.0: the first value kept, ints, then floats
        # after the first missing value) and is written so; no Polars column holds that, and
        # porter cannot tell from the file's types whether a value is missing
        raise Unsupported(f"`{column.name}` may hold a missing value, which makes it an object "
                          f"column in pandas: its running {'sum' if call.name == 'cumsum' else 'product'} "
                          "keeps the first value as True/False and turns float after the first "
                          "missing value (True, 1, NaN, 2.0); fillna(False).astype(bool) first makes it "
                          "a count in both")
    if column.dtype == "bool" and call.name == "cumsum":
        code = code.method("cast", emit.atom("pl.Int64"))
    return derived_column(column, code.method(CUMULATIVE[call.name]), dtype=column.dtype)


def _as_read(column: Column) -> bool:
    """A column as read from a file, not one the script wrote: a True/False one may hold a
    missing value, which makes it an object column in pandas."""
    return column.name is not None and column.code.text == emit.col(column.name).text \
        and column.frame.version(column.name) == 0


def _signed_zero_kept(values: Code, name: str) -> Code:
    """cummax / cummin of floats within groups as pandas: a running extreme that reached zero
    keeps the zero it met first (0.0 < -0.0 is false, so -0.0 stays), where Polars' (as
    numpy's, which pandas uses outside groups) takes the later one. Where the running value
    is a zero, it is the group's first zero (met at or before that row)."""
    running = values.method(CUMULATIVE[name])
    first_zero = values.method("filter", emit.binop(values, "==", 0)).method("first")
    return emit.when(emit.binop(running, "==", 0), first_zero, running)


# -- within groups ------------------------------------------------------------------------------

TRANSFORMS = ("sum", "mean", "median", "min", "max", "std", "var", "count", "nunique", "first",
              "last", "size")


def _over(grouped: Grouped, expr: Code) -> Code:
    return expr.method("over", *grouped.keys)


def _keys_present(grouped: Grouped) -> Code:
    """Rows whose every key is present: the rows pandas (dropna=True) puts in a group."""
    keys = [emit.col(k) for k in grouped.keys]
    present = keys[0].method("is_not_null")
    for key in keys[1:]:
        present = emit.binop(present, "&", key.method("is_not_null"))
    return present


def _window(grouped: Grouped, expr: Code, missing: Code | None = None, *,
            over: Code | None = None) -> Code:
    """`expr` computed per group, on every row of its group, in the frame's row order (`over`:
    an expression made of windows already). pandas (dropna=True) gives rows with a missing key
    a missing value (`missing` where pandas fills them, as shift's fill_value); Polars would
    make them a group."""
    windowed = over if over is not None else _over(grouped, expr)
    if not grouped.dropna:
        return windowed
    return emit.when(_keys_present(grouped), windowed, missing)


MISSING_KEY_FLOAT = "a row's group key is missing (pandas gives that row NaN)"


def _key_missing_float(grouped: Grouped, result: Column, nullable: str | None = None) -> Column:
    """An int result of a group window: pandas gives the rows of a missing key NaN, which
    makes the whole column float64 (0.0, 1.0), int64 where no key is missing. Polars keeps
    Int64 with those rows missing; marked (Frame.float_ints) so they are written and printed
    as pandas' floats, and a step that drops those rows says so (context.lost_float_ints).
    `nullable`: the source column's Column.nullable_int; pandas' nullable integers stay
    integers beside <NA>, and a count (cumcount) is never one (NOT_NULLABLE)."""
    if grouped.dropna and result.dtype == "int" and result.float_int is None \
            and not nullable:
        return replace(result, float_int=MISSING_KEY_FLOAT, nullable_int=nullable)
    return result


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
    """df.groupby(keys)[col].transform("sum" | "mean" | ...) -> the aggregation .over(keys);
    transform("cumsum" | "rank" | "ffill" | "shift", ...) -> that window .over(keys);
    transform(lambda s: s - s.mean()) -> the lambda's expression of the column .over(keys).

    Handles: every row gets its group's value, in the frame's order; a missing key gives a
    missing value (dropna=True), missing values are skipped as pandas skips them; a function
    (a lambda or the script's own def) whose body is one expression of the group's column,
    made of reductions, element-wise operations and windows, is evaluated once for a group and
    the whole expression computed per group (a reduction is broadcast to the group's rows, as
    pandas broadcasts a scalar result).
    A body that reads the group only through reductions combined by Python operators
    (s.max() - s.min()) has each reduction .over(keys).
    Caveats: numpy functions, a body that reads anything but the group's column (another
    column, the frame, its labels) are TODOs; an int result whose keys have a missing value is
    float64 in pandas (Column.float_int): set as a column it is made Float64 where it holds a
    missing value (rules/assign.py typed_at_run_time), kept on its own it stays integer and a
    step that drops or fills the missing rows is 0.9.
    """
    grouped, column = _selected(call)
    function = call.arg("func", 0)
    if isinstance(function, Opaque) and isinstance(function.const, str) \
            and function.const in GROUP_WINDOWS:
        # the window method by name, with the rest of the arguments
        rest = PandasCall(grouped, function.const, call.args[1:],
                          {k: v for k, v in call.kwargs.items() if k != "func"}, call.node)
        return GROUP_WINDOWS[function.const](rest, ctx)
    if isinstance(function, Opaque) and function.const == "quantile":
        ctx.reject_unknown(call, "func", "q", "interpolation", positional=2)
        q = call.const("q", 1, 0.5, kinds=(int, float))
        if call.const("interpolation", None, "linear", kinds=(str,)) != "linear" or not 0 <= q <= 1:
            raise Unsupported("quantile with another interpolation or outside 0..1")
        _numeric(column, ctx)
        # numpy's interpolation to the last bit and the sign of a zero (pandas_quantile)
        expr = emit.call(QUANTILE_FUNCTION, column.code, q)
        return derived_column(column, _window(grouped, expr), dtype="float")
    if isinstance(function, Opaque) and not function.is_const:
        return _transform_function(call, grouped, column, function, ctx)
    ctx.reject_unknown(call, "func", positional=1)
    how = call.const("func", 0, None, kinds=(str,))
    if how not in TRANSFORMS:
        raise Unsupported("a function porter cannot read: write it as an aggregation .over(keys)")
    # the group size as Int64, as pandas' int64 (Polars' UInt32 would wrap around below 0);
    # agg_expr makes a count and a sum of booleans Int64 too
    lower_for_group_spread(ctx, how, column.dtype)
    expr = emit.pl("len").method("cast", emit.atom("pl.Int64")) if how == "size" \
        else agg_expr(column.code, how, column.dtype, float32=float32_possible(ctx))
    dtype = "int" if how in ("count", "nunique", "size") or how == "sum" and column.dtype == "bool" \
        else "float" if how in ("mean", "median", "std", "var") else column.dtype
    over = _group_sum_over(grouped, expr, how, column.code)
    return _key_missing_float(grouped, derived_column(column, _window(grouped, expr, over=over),
                                                      dtype=dtype), column.nullable_int)


def _group_sum_over(grouped: Grouped, expr: Code, how: str, values: Code) -> Code | None:
    """transform("sum" | "mean") of floats where pandas may add a group with numpy's sum (the
    rows sorted by the keys, no value missing; see in_key_order_flag): the total the agg would
    give, put on each row (pandas_group_sum_over); None to keep the window."""
    if how not in ("sum", "mean") or not expr.text.startswith(f"{GROUP_SUM_FUNCTION}(") \
            and not expr.text.startswith(f"{GROUP_MEAN_FUNCTION}("):
        return None
    frame = grouped.frame
    if not keys_sorted_as_pandas(grouped) or frame.columns is None \
            or any(k not in frame.columns for k in grouped.keys):
        return None
    options = {"mean": True} if how == "mean" else {}
    return emit.call(GROUP_SUM_OVER_FUNCTION, values, *grouped.keys, **options)


# the group's frame inside a transform function: code that reads it as a frame (a collected
# reduction, a filter) names it, and is not an expression of the group
GROUP_FRAME = "_porter_group"


def _parameter_and_body(call: PandasCall, function: Opaque, ctx: RuleContext,
                        advice: str) -> tuple[str, cst.BaseExpression]:
    """A lambda's or the script's own function's one parameter and its body as one expression."""
    if isinstance(function.node, cst.Lambda):
        params = function.node.params
        if len(params.params) != 1 or params.star_arg not in (None, cst.MaybeSentinel.DEFAULT) \
                or params.kwonly_params or params.star_kwarg or params.posonly_params:
            raise Unsupported("a lambda that does not take exactly the group's values")
        return params.params[0].name.value, function.node.body
    named = function_value(call, function, ctx)
    if named is None:
        raise Unsupported(f"a function porter cannot read: {advice}")
    try:
        body = body_expression(named)
    except Unsupported as exc:
        raise Unsupported(f"{named.name.value} is not one expression ({exc.reason}): {advice}") from None
    return named.params.params[0].name.value, body


def _group_of(grouped: Grouped) -> Frame:
    """The group inside a function: the frame's columns, rows of their own (a Series of another
    frame in the body is pandas' index alignment, a TODO), labels that are not 0..n-1, bound
    to no name (the body reading the group's labels says nothing of the frame's)."""
    return replace(grouped.frame, code=emit.atom(GROUP_FRAME), rows=fresh_token(),
                   labels_intact=False, sites=(), binding=None)


# a branch of pl.when giving a float written in the script (.otherwise(0.5), .then(pl.lit(1.0)))
FLOAT_BRANCH = r"\.(then|otherwise)\((pl\.lit\()?(-?[0-9]+\.[0-9]*|float)"


def _rows_elsewhere(value: Frame | Column) -> Frame | Column:
    """A frame (or a column of one) read inside a group's function, taken as rows of their
    own: what the function computes of it is not the group's."""
    if isinstance(value, Column):
        return replace(value, frame=replace(value.frame, rows=fresh_token()))
    return replace(value, rows=fresh_token())


def group_function(call: PandasCall, grouped: Grouped, name: str, function: Opaque,
                   ctx: RuleContext) -> tuple[Code, str | None]:
    """agg(f) on the group's column `name`: f's body evaluated once with its parameter
    standing for the group's values. A reduction of them (`s.max()`, `(s == "x").sum()`,
    `s.str.len().mean()`) or reductions combined by Python operators (`s.max() - s.min()`)
    is one value per group: (the aggregation expression, its type)."""
    param, body = _parameter_and_body(call, function, ctx, "write it as an aggregation")
    others: dict[str, Value] = {}
    for other in _free_names(body) - {param}:
        value = ctx.evaluate(cst.Name(other), {})
        if isinstance(value, Grouped):
            raise Unsupported(f"the function reads `{other}`, not only the group's values")
        if isinstance(value, (Frame, Column)):
            # a reduction of a whole frame inside the function (s.sum() / df["kg"].sum()) is
            # one value for every group: its rows made another frame's, so that it is
            # computed once (collected), never written as the group's own in the aggregation
            others[other] = _rows_elsewhere(value)
    group = _group_of(grouped)
    values = column_of(group, name)
    result = _checked(ctx.evaluate(body, {**others, param: values}), ctx)
    if isinstance(result, Scalar) and result.agg is not None and result.agg.frame.rows == group.rows:
        expr, dtype = result.agg.code, result.agg.dtype or result.pytype
    else:
        reductions = _GroupReductions(param, values, grouped, ctx, windowed=False)
        rewritten = body.visit(reductions)
        assert isinstance(rewritten, cst.BaseExpression)
        if not reductions.bindings or _mentions(rewritten, param):
            raise Unsupported("the function's result is not one value of the group's column "
                              "(a reduction, or reductions combined by operators)")
        combined = _checked(ctx.evaluate(rewritten, {**others, **reductions.bindings}), ctx)
        if not (isinstance(combined, Column) and combined.frame.rows == grouped.frame.rows):
            raise Unsupported("the function's reductions are combined in a way porter cannot "
                              "write as an expression")
        expr, dtype = ctx.bool_expr(combined, grouped.frame), combined.dtype
        if combined.refs - {name}:
            raise Unsupported("the function reads other columns than the group's")
    if GROUP_FRAME in expr.text or (isinstance(result, Scalar) and result.agg is not None
                                    and result.agg.refs - {name}):
        raise Unsupported("the function reads the group as a frame (a collected value, a filter)")
    _float_branch(body, expr, grouped.frame.dtype(name), ctx)
    if grouped.frame.dtype(name) in ("float", None) and re.search(r"\.(sum|mean|std|var)\(", expr.text):
        ctx.lower("pandas adds a group's values inside a function with numpy's pairwise "
                  "summation, Polars in order: a float result can differ in the last digit", 0.95)
    return expr, dtype


def _float_branch(body: cst.BaseExpression, expr: Code, dtype: str | None,
                  ctx: RuleContext) -> None:
    """A function with a branch giving a float written in the script (`s.max() if ... else
    0.5`): pandas makes the result from each group's Python value, int64 when no group takes
    the float branch (5), float64 when one does; Polars' branches share one type (5.0). The
    data decides: a TODO unless the column is float (every branch float then)."""
    if not (_has_branches(body) and re.search(FLOAT_BRANCH, expr.text)):
        return
    if dtype != "float":
        raise Unsupported("a function with a float branch (else 0.5): pandas' result is int64 "
                          "when no group takes it (5), float64 when one does; a Polars plan "
                          "fixes the type before it sees the data")
    ctx.lower("pandas' result is int64 when no group takes a float branch of the function "
              "(5 where this writes 5.0)", 0.9)


def _transform_function(call: PandasCall, grouped: Grouped, column: Column, function: Opaque,
                        ctx: RuleContext) -> Value:
    """transform(f): f's body evaluated once with its parameter standing for the group's
    column, over a frame of its own rows (the group's), and computed per group by .over()."""
    ctx.reject_unknown(call, "func", positional=1)
    param, body = _parameter_and_body(call, function, ctx, "write it as an expression .over(keys)")
    group = _group_of(grouped)
    values = column_of(group, column.name or "")
    result = _checked(ctx.evaluate(body, {param: values}), ctx)
    if isinstance(result, Scalar) and result.agg is not None and result.agg.frame.rows == group.rows:
        expr, dtype = result.agg.code, result.agg.dtype  # one value broadcast to the group
    elif isinstance(result, Column) and result.frame.rows == group.rows and not result.element \
            and (result.frame.labels_intact, result.frame.index) == (False, group.index):
        # the group's own rows under their own labels (pandas aligns the result on them)
        expr, dtype = ctx.bool_expr(result, group), result.dtype
    else:
        return _reductions_combined(param, body, grouped, column, values, ctx)
    if GROUP_FRAME in expr.text or (result.refs if isinstance(result, Column) else {column.name}) \
            - {column.name}:
        raise Unsupported("the function reads the group as a frame (a collected value, a filter)")
    _float_branch(body, expr, column.dtype, ctx)
    return _key_missing_float(grouped, derived_column(column, _window(grouped, expr), dtype=dtype),
                              column.nullable_int)


# what a reduction of the group's values is, by the method's name (else the column's type)
REDUCTION_TYPES = {"mean": "float", "median": "float", "std": "float", "var": "float",
                   "quantile": "float", "sem": "float", "count": "int", "nunique": "int"}


class _GroupReductions(cst.CSTTransformer):
    """Replaces each reduction of the group's values (`s.max()`, `s.notna().sum()`) by a name
    bound to it as a window (`pl.col("v").max().over(key)`): one value on every row."""

    def __init__(self, param: str, values: Column, grouped: Grouped, ctx: RuleContext, *,
                 windowed: bool = True) -> None:
        super().__init__()
        self.param, self.values, self.grouped, self.ctx = param, values, grouped, ctx
        self.windowed = windowed  # False: the reductions of an aggregation, one row per group
        self.bindings: dict[str, Value] = {}

    def leave_Call(self, original: cst.Call, updated: cst.Call) -> cst.BaseExpression:
        if not (isinstance(original.func, cst.Attribute) and _mentions(original.func.value, self.param)):
            return updated
        value = _checked(self.ctx.evaluate(original, {self.param: self.values}), self.ctx)
        if not (isinstance(value, Scalar) and value.agg is not None
                and value.agg.frame.rows == self.values.frame.rows
                and GROUP_FRAME not in value.agg.code.text):
            return updated
        name = f"_porter_reduction_{len(self.bindings)}"
        base = column_of(self.grouped.frame, self.values.name or "")
        how = original.func.attr.value
        # the sum of booleans counts them (an int, Int64 from series_reduce)
        dtype = "int" if how == "sum" and base.dtype == "bool" else REDUCTION_TYPES.get(how, base.dtype)
        code = _over(self.grouped, value.agg.code) if self.windowed else value.agg.code
        self.bindings[name] = derived_column(base, code, dtype=dtype, name=None)
        return cst.Name(name)


def _reductions_combined(param: str, body: cst.BaseExpression, grouped: Grouped, column: Column,
                         values: Column, ctx: RuleContext) -> Value:
    """transform(lambda s: s.max() - s.min()): a body that reads the group only through
    reductions, combined by Python operators, is one value per group: each reduction a window
    of its own (a column on every row, so a division of two is exact, as pandas' division of
    two numbers; Polars divides a single value by multiplying by its reciprocal)."""
    reductions = _GroupReductions(param, values, grouped, ctx)
    rewritten = body.visit(reductions)
    assert isinstance(rewritten, cst.BaseExpression)
    if not reductions.bindings or _mentions(rewritten, param):
        raise Unsupported("the function's result is not one expression of the group's column "
                          "(reductions, element-wise operations and windows of it)")
    result = _checked(ctx.evaluate(rewritten, reductions.bindings), ctx)
    if not (isinstance(result, Column) and result.frame.rows == grouped.frame.rows):
        raise Unsupported("the function's reductions are combined in a way porter cannot write "
                          "as an expression")
    expr = ctx.bool_expr(result, grouped.frame)
    _float_branch(body, expr, column.dtype, ctx)
    return _key_missing_float(grouped, derived_column(
        column, _window(grouped, expr, over=expr), dtype=result.dtype, others=[result]),
        column.nullable_int)


@rule(*(f"groupby.{name}" for name in CUMULATIVE))
def group_cumulative(call: PandasCall, ctx: RuleContext) -> Value:
    """df.groupby(keys)[col].cumsum() / cumprod / cummax / cummin -> .cum_sum().over(keys).

    Handles: the running value restarts in each group and carries on past a missing value
    (skipna); a missing key gives a missing value; a running sum of floats has pandas' last
    digits (compensated, _compensated_running_sum); the running sum of a True/False column
    counts the True values; a running minimum or maximum of floats keeps the zero it met
    first (-0.0 before 0.0), as pandas.
    Caveats: cumprod / cummax / cummin of True/False and the running sum of durations
    (pandas' goes wrong past a missing one where a key is missing) are TODOs.
    """
    grouped, column = _selected(call)
    ctx.reject_unknown(call, "skipna")
    if call.const("skipna", None, True) is not True:
        raise Unsupported("skipna=False")
    if column.dtype == "bool" and call.name != "cumsum":
        raise Unsupported("a running product, maximum or minimum of booleans")
    if column.dtype == "bool":
        if _as_read(column):
            ctx.lower(f"`{column.name}` is an object column in pandas where it has a missing "
                      "value (read_csv), whose running sum within groups pandas refuses "
                      "(TypeError); porter counts the True values", 0.9)
        # True counted as 1 (pandas' int64; float64 where a key is missing, the same values)
        running = ctx.bool_expr(column, grouped.frame).method(
            "cast", emit.atom("pl.Int64")).method("cum_sum")
        return _key_missing_float(grouped, derived_column(column, _window(grouped, running),
                                                          dtype="int"), NOT_NULLABLE)
    if call.name == "cumsum" and column.dtype == "duration" and grouped.dropna:
        raise Unsupported("a running sum of durations: where a key is missing, pandas' sum runs "
                          "on past a missing duration as a huge negative number")
    if call.name == "cumsum" and column.dtype in ("float", None):
        return derived_column(column, _window(grouped, _compensated_running_sum(column.code, ctx)),
                              dtype=column.dtype)
    running = column.code.method(CUMULATIVE[call.name])
    if column.dtype == "float" and call.name in ("cummax", "cummin"):
        running = _signed_zero_kept(column.code, call.name)
    if call.name in ("cummax", "cummin") and _missing_time_is_earliest(grouped, column, ctx):
        # where a key is missing, pandas takes a missing time as the earliest of all: cummax
        # carries the running maximum onto it, cummin is missing from it to the group's end
        quirk = running.method("forward_fill") if call.name == "cummax" else emit.when(
            emit.binop(column.code.method("is_null").method("cum_sum"), "==", 0), running)
        over = emit.when(_keys_present(grouped).method("all"), _over(grouped, running),
                         _over(grouped, quirk))
        return derived_column(column, _window(grouped, running, over=over), dtype=column.dtype)
    return _key_missing_float(grouped, derived_column(column, _window(grouped, running),
                                                      dtype=column.dtype), column.nullable_int)


def _compensated_running_sum(values: Code, ctx: RuleContext) -> Code:
    """pandas' running sum of floats within groups (group_cumsum) is compensated (Kahan): ten
    0.1s end at 1.0 where a plain running sum (cum_sum) ends at 0.9999999999999999. Polars'
    rolling_sum over a window as long as the column adds with the same compensation, bit for
    bit (nothing ever leaves the window); it gives a missing row the sum so far, where pandas
    gives that row NaN and carries on: the row is made missing. Once the sum is infinite
    pandas' compensation turns NaN, and so does every later value of the group, where Polars
    stays at inf: a row after an infinite sum is missing too, where the script may make
    infinities (a division, an inf written out; as for the windows' infinities). A column of
    unknown type that holds whole numbers stays whole (Int64 sums are exact), as pandas' int64."""
    running = values.method("rolling_sum", WHOLE_COLUMN, min_samples=1)
    conditions = [values.method("is_not_null")]
    if ctx.infinities_possible:
        conditions.append(running.method("shift").method("fill_null", 0).method("is_finite"))
    return emit.pl("when", *conditions).method("then", running)


def _missing_time_is_earliest(grouped: Grouped, column: Column, ctx: RuleContext) -> bool:
    """pandas' rank, cummax and cummin of a date or duration column within groups take a
    missing time (NaT) as the earliest value there is when a row's key is missing anywhere in
    the frame (pandas 3.1: its groupby transforms then compute on the times as float numbers,
    where NaT is the lowest number and no longer missing); where every key is present NaT is
    skipped. porter computes both and picks by the keys (pl.when(keys present .all())). A
    column of unknown type may hold times: lowered."""
    if grouped.dropna and column.dtype is None:
        ctx.lower("the column's type is not known: if it holds dates or durations, pandas takes "
                  "a missing one as the earliest where a key is missing, porter skips it", 0.9)
    return grouped.dropna and column.dtype in ("datetime", "duration")


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
    kwargs, dtype = _shift_fill(call, column, ctx) if call.name == "shift" else ({}, column.dtype)
    args = [periods] if call.name == "shift" or periods != 1 else []
    expr = column.code.method(call.name, *args, **kwargs)
    # pandas writes fill_value on the rows of a missing key too
    dtype = dtype if call.name != "diff" or column.dtype not in ("datetime", "date") \
        else "duration" if column.dtype == "datetime" else None
    if dtype == "int" and (call.name == "diff" or periods != 0 and not kwargs) \
            and _plain_int(column, ctx):
        expr, dtype = _as_float(expr), "float"
    if periods == 0:
        # pandas gives every row its own value (shift) or 0 (diff), a row of a missing key too
        return derived_column(column, expr, dtype=dtype)
    return derived_column(column, _window(grouped, expr, kwargs.get("fill_value")), dtype=dtype)


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
    return _key_missing_float(grouped, derived_column(base, _window(grouped, position),
                                                      dtype="int", name=None), NOT_NULLABLE)


@rule("groupby.ffill", "groupby.bfill")
def group_fill(call: PandasCall, ctx: RuleContext) -> Value:
    """df.groupby(keys)[col].ffill(limit) / bfill(limit) -> .forward_fill(limit).over(keys) /
    .backward_fill(limit).over(keys).

    Handles: values are carried only within their group, at most `limit` rows; a missing key
    gives a missing value (dropna=True), a missing key is a group of its own with dropna=False;
    an int column is float64 in pandas where a key is missing (Column.float_int), which a
    column set from it follows (rules/assign.py typed_at_run_time).
    """
    grouped, column = _selected(call)
    ctx.reject_unknown(call, "limit", positional=1)
    limit = call.const("limit", 0, None, kinds=(int,))
    if limit is not None and limit < 1:
        raise Unsupported(f"limit={limit} (pandas fills nothing or raises)")
    method = "forward_fill" if call.name == "ffill" else "backward_fill"
    expr = column.code.method(method, **({"limit": limit} if limit is not None else {}))
    # an int column is float64 in pandas where a key is missing (that row's NaN)
    return _key_missing_float(grouped, derived_column(column, _window(grouped, expr),
                                                      dtype=column.dtype), column.nullable_int)


# pandas' rank methods by their Polars names: "first" numbers ties in order of appearance
RANK_METHODS = {"average": "average", "min": "min", "max": "max", "first": "ordinal",
                "dense": "dense"}


def rank_code(column: Column, method: object, ascending: object, na_option: object) -> Code:
    """pandas' rank as a Polars rank of the column's expression (float64, as pandas gives it);
    Unsupported for the forms porter does not read."""
    if method not in RANK_METHODS:
        raise Unsupported(f"method={method!r}")
    if na_option != "keep":
        raise Unsupported(f"na_option={na_option!r} (missing values ranked first or last)")
    if column.dtype in ("category", "enum"):
        raise Unsupported("ranks of categories follow the order of the categories in pandas")
    kwargs = {} if ascending else {"descending": True}
    rank = column.code.method("rank", RANK_METHODS[method], **kwargs)  # type: ignore[index]
    return rank if method == "average" else rank.method("cast", emit.atom("pl.Float64"))


@rule("groupby.rank")
def group_rank(call: PandasCall, ctx: RuleContext) -> Value:
    """df.groupby(keys)[col].rank(method, ascending, pct) -> .rank(method).over(keys) as floats.

    Handles: method average / min / max / dense, and first (Polars' ordinal: ties numbered in
    order of appearance, also descending); missing values keep no rank (na_option="keep");
    pct=True divides by the group's count of values (dense: by its highest rank), window by
    window so that each quotient is an exact division as in pandas; pandas' ranks are float64.
    """
    grouped, column = _selected(call)
    ctx.reject_unknown(call, "method", "ascending", "na_option", "pct", positional=4)
    method = call.const("method", 0, "average", kinds=(str,))
    ascending = call.const("ascending", 1, True, kinds=(bool,))
    na_option = call.const("na_option", 2, "keep", kinds=(str,))
    pct = call.const("pct", 3, False, kinds=(bool,))
    def ranks(values: Column) -> Code:
        rank = rank_code(values, method, ascending, na_option)
        if not pct:
            return _over(grouped, rank)
        # the divisor as a window of its own: Polars divides a column by a single value as a
        # multiplication by its reciprocal (one binary digit off pandas' quotient)
        total = values.code.method("rank", "dense").method("max") if method == "dense" \
            else values.code.method("count")
        return emit.binop(_over(grouped, rank), "/", _over(grouped, total))

    over = ranks(column)
    if _missing_time_is_earliest(grouped, column, ctx):
        # a missing time ranked as the earliest there is, where a key is missing (pandas)
        earliest = column.code.method("cast", emit.atom("pl.Int64")).method("fill_null", -2 ** 63)
        over = emit.when(_keys_present(grouped).method("all"), over,
                         ranks(replace(column, code=earliest, dtype="int")))
    return derived_column(column, _window(grouped, over, over=over), dtype="float")


def pct_change_code(column: Column, call: PandasCall, ctx: RuleContext) -> Code:
    """pandas' percent change of `column` as pandas computes it: `x / x.shift(n) - 1` (Polars'
    pct_change computes `(x - prev) / prev`, which gives -0.0 where pandas gives 0.0 and
    other last digits: 0.22 where pandas has 0.21999999999999997)."""
    ctx.reject_unknown(call, "periods", "fill_method", positional=1)
    periods = call.const("periods", 0, 1, kinds=(int,))
    if isinstance(periods, bool):
        raise Unsupported("periods=True")
    if call.const("fill_method", None, None) is not None:
        raise Unsupported("fill_method (pandas 3 raises)")
    if column.dtype in NOT_NUMERIC or column.dtype == "bool":
        raise Unsupported(f"pct_change of a {column.dtype} column")
    # pandas 3 fills nothing first (fill_method=None; groupby's ffill(limit=0) fills
    # nothing): a change from or to a missing value is missing, as Polars' shift leaves it;
    # 0 / 0 is NaN, missing for pandas (fill_nan(None)); x / 0 is ±inf in both
    ratio = emit.binop(column.code, "/", column.code.method("shift", periods))
    return emit.binop(ratio, "-", 1).method("fill_nan", None)


@rule("series.pct_change")
def series_pct_change(call: PandasCall, ctx: RuleContext) -> Value:
    """Series.pct_change(n) -> (x / x.shift(n) - 1).fill_nan(None), pandas' own formula.

    Handles: pandas 3 no longer fills missing values first (fill_method=None): a change from
    or to a missing value is missing; 0 / 0 is a missing value, x / 0 is ±inf; the result is
    `x / prev - 1` to the last bit (0.0, not -0.0, for two equal negative values).
    Caveats: freq= (shifting the index) is a TODO.
    """
    column = _column(call)
    return derived_column(column, pct_change_code(column, call, ctx), dtype="float")


@rule("groupby.pct_change")
def group_pct_change(call: PandasCall, ctx: RuleContext) -> Value:
    """df.groupby(keys)[col].pct_change(n) -> (x / x.shift(n) - 1).fill_nan(None).over(keys).

    Handles: pandas 3 no longer fills missing values first (fill_method=None): a change from
    or to a missing value is missing; 0 / 0 is NaN, a missing value (fill_nan(None)), x / 0 is
    inf in both; pandas' formula `x / prev - 1` to the last bit (Polars' pct_change divides
    the difference: -0.0 for pandas' 0.0); a missing key gives a missing value.
    """
    grouped, column = _selected(call)
    return derived_column(column, _window(grouped, pct_change_code(column, call, ctx)),
                          dtype="float")


# -- rows of each group: head, tail, nth ---------------------------------------------------------

def _positions(grouped: Grouped, from_end: bool) -> Code:
    """Each row's place in its group: 0, 1, ... from the first row, or 1, 2, ... from the last."""
    places = emit.pl("int_range", emit.pl("len"), 0, -1) if from_end \
        else emit.pl("int_range", emit.pl("len"))
    return _over(grouped, places)


def _group_rows(call: PandasCall, grouped: Grouped, keep: Code) -> Value:
    """The rows `keep` selects, in the frame's order, with the columns pandas keeps: all of them,
    or the selected ones (one selected column is a Series)."""
    frame = grouped.frame
    if grouped.dropna:  # pandas leaves out the rows of a missing key
        keep = emit.binop(_keys_present(grouped), "&", keep)
    for name in grouped.selection or ():
        if frame.columns is not None and name not in frame.columns:
            raise Unsupported(f"column {name!r} is not in the frame (pandas raises KeyError)")
    # the rows keep their labels, which are no longer 0..n-1
    rows = derive(frame, frame.code.method("filter", keep), same_rows=False)
    if grouped.selection is None:
        return rows
    if grouped.single:
        return column_of(rows, grouped.selection[0])
    names = list(grouped.selection)
    return select_columns(rows, rows.code.method("select", *names), names)


@rule("groupby.head", "groupby.tail")
def group_head(call: PandasCall, ctx: RuleContext) -> Value:
    """df.groupby(keys).head(n) / tail(n) -> df.filter(place in group < n), in the frame's order.

    Handles: the rows keep the frame's order and every column (pandas: a filter, not an
    aggregation); a negative n leaves out the last (head) or first (tail) -n rows of each
    group; rows of a missing key are left out (dropna=True).
    """
    grouped = call.receiver
    assert isinstance(grouped, Grouped)
    ctx.reject_unknown(call, "n", positional=1)
    n = call.const("n", 0, 5, kinds=(int,))
    head = call.name == "head"
    if n >= 0:
        keep = emit.binop(_positions(grouped, not head), "<" if head else "<=", n)
    else:  # all but the last (head) or first (tail) -n rows
        keep = emit.binop(_positions(grouped, head), ">" if head else ">=", -n)
    return _group_rows(call, grouped, keep)


@rule("groupby.nlargest", "groupby.nsmallest")
def group_nlargest(call: PandasCall, ctx: RuleContext) -> Value:
    """s.groupby(level=k, group_keys=False).nlargest(n) -> the Series' rows sorted by value,
    the first n of each group kept, the groups in key order.

    Handles: each group's n largest (nsmallest: smallest) values, ties in the Series' own
    order (keep="first"), missing and NaN values after the numbers where a group has fewer than
    n numbers, as Series.nlargest puts them; the groups one after another in sorted key order (sort=True), rows of a missing key left out
    (dropna=True); the rows keep their labels (the Series' keys), as group_keys=False does.
    Caveats: an empty Series gives pandas one unnamed level of labels (0.95). group_keys=True
    (pandas puts the group's key in front of the labels, a level of the same name twice),
    sort=False, keep="last" / "all" and values that are not numbers are
    TODOs."""
    grouped = call.receiver
    assert isinstance(grouped, Grouped)
    ctx.reject_unknown(call, "n", "keep", positional=1)
    n = call.const("n", 0, 5, kinds=(int,))
    if call.const("keep", None, "first", kinds=(str,)) != "first":
        raise ctx.todo('keep="last" or "all": ties kept otherwise')
    if grouped.group_keys:
        raise ctx.todo("group_keys=True: pandas puts each group's key in front of the Series' "
                       "labels (the key's level twice); group_keys=False keeps the labels")
    if not grouped.sort:
        raise ctx.todo("sort=False: the groups in the order they first appear")
    if not grouped.single or not grouped.selection or grouped.selection[0] in grouped.keys:
        raise ctx.todo("nlargest of a frame's groups (pandas raises) or of a key column")
    frame = grouped.frame
    name = grouped.selection[0]
    column = column_of(frame, name)
    if column.dtype not in ("int", "float"):
        raise ctx.todo(f"values of type {column.dtype or 'unknown'}")
    # missing and NaN values come after the numbers, in the Series' order, where a group has
    # fewer than n numbers (pandas appends them to the values it sorted)
    values = emit.col(name)
    if column.dtype == "float":
        values = values.method("fill_nan", None)
    kwargs: dict[str, object] = {"descending": True} if call.name == "nlargest" else {}
    # a stable sort by value keeps tied values in the Series' order (keep="first"); the
    # first n of each group by that order, then the groups in key order, stably
    code = frame.code
    if grouped.dropna:
        code = code.method("filter", _keys_present(grouped))
    code = code.method("sort", values, **kwargs, nulls_last=True, maintain_order=True) \
        .method("filter", emit.binop(_positions(grouped, False), "<", n)) \
        .method("sort", list(grouped.keys), maintain_order=True)
    ctx.lower("an empty Series: pandas' result has one unnamed level of labels where the "
              "conversion keeps the keys", 0.9)
    rows = derive(frame, code, same_rows=False)
    return column_of(rows, name)


@rule("groupby.nth")
def group_nth(call: PandasCall, ctx: RuleContext) -> Value:
    """df.groupby(keys).nth(i) / nth([i, j]) -> df.filter(place in group is i), in the frame's
    order (pandas 3: a filter keeping every column).

    Handles: negative positions count from the end; a list keeps the rows at any of its
    positions once; rows of a missing key are left out (dropna=True).
    Caveats: slices and dropna= are TODOs.
    """
    grouped = call.receiver
    assert isinstance(grouped, Grouped)
    ctx.reject_unknown(call, "n", positional=1)
    wanted = call.const_values("n", 0, kinds=(int,))
    if not wanted:
        raise Unsupported("nth of a slice or of no positions")
    tests = []
    for places, from_end in ((sorted({i for i in wanted if i >= 0}), False),
                             (sorted({-i for i in wanted if i < 0}), True)):
        if places:
            position = _positions(grouped, from_end)
            tests.append(emit.binop(position, "==", places[0]) if len(places) == 1
                         else position.method("is_in", places))
    keep = tests[0] if len(tests) == 1 else emit.binop(tests[0], "|", tests[1])
    return _group_rows(call, grouped, keep)


# transform("cumsum") and the like: the group window of that name
GROUP_WINDOWS = {**{name: group_cumulative for name in CUMULATIVE}, "cumcount": group_cumcount,
                 "rank": group_rank, "ffill": group_fill, "bfill": group_fill,
                 "pct_change": group_pct_change, "shift": group_shift, "diff": group_shift}


# -- rolling and expanding windows --------------------------------------------------------------
#
# `s.rolling(n)` / `s.expanding()` make an Accessor of kind "rolling" / "expanding" holding the
# window's arguments; its method (`.mean()`) is the key `series.rolling.mean`. Both libraries
# skip missing values inside a window and give a missing value where fewer than min_periods
# (min_samples) values are present, so `rolling_mean(n, min_samples=m)` is pandas' window.
# pandas' result is always float (a window of integers too): integer, boolean and unknown
# columns are cast to Float64 first, which also keeps sums of integers exact.

# A window that holds the whole column: Polars' rolling kernels then give pandas' expanding
# values exactly (the same online sums with nothing leaving the window), where a cum_sum adds
# in another order and differs in the last digits.
WHOLE_COLUMN = emit.binop(emit.binop(2, "**", 31), "-", 1)

WINDOW_AGGREGATES = ("mean", "sum", "min", "max", "median", "std", "var", "count")
NOT_NUMERIC = ("str", "datetime", "date", "category", "enum")


def _window_of(call: PandasCall) -> tuple[Column, dict[str, object]]:
    accessor = call.receiver
    assert isinstance(accessor, Accessor)
    return accessor.column, dict(accessor.options)


def _numeric(column: Column, ctx: RuleContext) -> Code:
    """The column as pandas hands it to a window: float64 (True is 1.0; a comparison's null
    is False)."""
    if column.dtype in NOT_NUMERIC:
        raise Unsupported(f"a window over a {column.dtype} column (pandas raises)")
    code = ctx.bool_expr(column, column.frame) if column.dtype == "bool" else column.code
    code = code if column.dtype == "float" else code.method("cast", emit.atom("pl.Float64"))
    if ctx.infinities_possible and column.dtype in ("float", None):
        # a quotient holds ±inf where it divided by 0; pandas' windows take inf as missing
        code = code.method("replace", emit.atom('[float("inf"), float("-inf")]'), None)
    return code


def _window_args(options: dict[str, object], kind: str) -> tuple[list[object], dict[str, object]]:
    """Polars' window arguments: the size, min_samples unless it is the size (Polars' default),
    center when it is True."""
    if kind == "expanding":
        return [WHOLE_COLUMN], {"min_samples": options["min_periods"]}
    size, least = options["window"], options["min_periods"]
    kwargs: dict[str, object] = {}
    if least != size:
        kwargs["min_samples"] = least
    if options.get("center"):
        kwargs["center"] = True
    return [size], kwargs


@rule("series.rolling")
def rolling(call: PandasCall, ctx: RuleContext) -> Value:
    """s.rolling(n, min_periods=m, center=c) -> a window waiting for its method
    (`series.rolling.mean` ...).

    Handles: min_periods defaults to the window size as in pandas; center=True.
    Caveats: time windows ("2D", on=), win_type, closed, step and method="table" are TODOs.
    """
    column = _column(call)
    ctx.reject_unknown(call, "window", "min_periods", "center", positional=3)
    window = call.const("window", 0, kinds=(int, str))
    if isinstance(window, str):
        raise Unsupported("a time window")
    if window < 1:
        raise Unsupported(f"a window of {window} rows")
    least = call.const("min_periods", 1, None, kinds=(int,))
    least = window if least is None else least
    if not 0 <= least <= window:
        raise Unsupported(f"min_periods={least} outside 0..{window} (pandas raises)")
    center = call.const("center", 2, False, kinds=(bool,))
    _numeric(column, ctx)
    options = (("window", window), ("min_periods", least), ("center", center))
    return Accessor(column.code, column=column, kind="rolling", options=options)


# -- windows of a frame: df.rolling(n or "30D", on="t")[col] ------------------------------------
#
# pandas makes the window of the whole frame and then takes one column of it: the same window
# over that column. A count window is Series.rolling's. A time window ("30D") reads the dates of
# `on`: each row's window holds the rows before it (in the frame's order) whose time is after
# its own time less the span, up to its own row (closed="right"). A row tied on time with later
# rows does not see them; Polars' rolling_*_by windows are by value and would. So each value
# is made of two parts: the window of the earlier times (closed="none": after t - span, before
# t) and the running value among the rows of its own time so far (cum_* .over(on)).

TIME_UNITS = {"D": "d", "d": "d", "h": "h", "H": "h", "min": "m", "T": "m", "s": "s", "S": "s",
              "ms": "ms", "L": "ms", "us": "us", "U": "us"}
TIME_SPAN = re.compile(r"^(\d*)(D|d|h|H|min|T|s|S|ms|L|us|U)$")


@dataclass(frozen=True)
class FrameWindow(Accessor):
    """`df.rolling(...)`: a window of the whole frame waiting for a column (`[col]`, key
    `series.rolling.getitem`). `grouped` is the frame: a hand-over makes the window again from
    it with the same arguments (`options`), as it does for a window within groups."""

    grouped: Frame = field(kw_only=True)
    key_prefix: str = field(default="frame.rolling", kw_only=True)
    time_span: str | None = field(default=None, kw_only=True)  # Polars' duration ("30d")


@dataclass(frozen=True)
class TimeWindow(Accessor):
    """`df.rolling("30D", on="t")[col]`: a time window over one column waiting for its method
    (`series.rolling.sum` ...). Handed over, the window is made again from `grouped` (the
    frame's times and that column: pandas' Series.rolling refuses on=) and `taken` is the
    column taken from it."""

    time_span: str = field(kw_only=True)
    grouped: Frame = field(kw_only=True)
    taken: str = field(kw_only=True)


def _time_span(window: str) -> str | None:
    """pandas' fixed span ("30D", "2h", "15min") as Polars writes a duration ("30d"), or None
    for another offset (a month or a week is not a fixed span: pandas raises)."""
    found = TIME_SPAN.match(window.strip())
    if found is None or found.group(1) in ("0",) or found.group(1).startswith("0"):
        return None
    return f"{found.group(1) or 1}{TIME_UNITS[found.group(2)]}"


@rule("frame.rolling")
def frame_rolling(call: PandasCall, ctx: RuleContext) -> Value:
    """df.rolling(n, min_periods, center) / df.rolling("30D", on="t", min_periods) -> a window
    of the frame waiting for its column.

    Handles: a count window is Series.rolling's; a time window reads `on`, a datetime column
    (min_periods defaults to 1, closed to "right", as in pandas).
    Caveats: a time window over the row labels (no on=), closed other than "right", center,
    win_type, step and method are TODOs.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "window", "min_periods", "center", "on", "closed", positional=3)
    window = call.const("window", 0, kinds=(int, str))
    on = call.const("on", None, None, kinds=(str,))
    closed = call.const("closed", None, None, kinds=(str,))
    center = call.const("center", 2, False, kinds=(bool,))
    least = call.const("min_periods", 1, None, kinds=(int,))
    dummy = Column(frame.code, frame=frame)
    if isinstance(window, int):
        if on is not None or closed is not None:
            raise Unsupported("on= or closed= with a window of rows")
        column_window = rolling(PandasCall(dummy, "rolling", call.args, {
            k: v for k, v in call.kwargs.items()}, call.node), ctx)
        assert isinstance(column_window, Accessor)
        return FrameWindow(frame.code, column=dummy, kind="rolling",
                           options=column_window.options, grouped=frame)
    span = _time_span(window)
    if span is None:
        raise Unsupported(f"the time window {window!r}: porter reads a fixed span (30D, 6h, 15min)")
    if on is None:
        raise Unsupported("a time window over the row labels (no on=)")
    if frame.dtype(on) != "datetime":
        raise Unsupported(f"on={on!r} is not a column porter knows holds dates")
    if closed not in (None, "right"):
        raise Unsupported(f"closed={closed!r}: only pandas' default for time windows (right)")
    if center:
        raise Unsupported("center=True with a time window")
    least = 1 if least is None else least
    if least < 0:
        raise Unsupported(f"min_periods={least} (pandas raises)")
    ctx.lower(f"pandas raises where `{on}` is not in order or holds a missing time, and reads a "
              "column in decreasing order backwards: the windows here are by time in the "
              "frame's order", 0.95)
    options = (("window", window), ("min_periods", least), ("on", on), ("span", span))
    return FrameWindow(frame.code, column=dummy, kind="rolling", grouped=frame,
                       options=tuple((k, v) for k, v in options if k != "span"),
                       time_span=span)


@rule("series.rolling.getitem")
def frame_window_column(call: PandasCall, ctx: RuleContext) -> Value:
    """df.rolling(...)[col] -> the same window over that column (`series.rolling.mean` ...).

    Caveats: several columns (`[[a, b]]`) and the column of the times itself are TODOs.
    """
    window = call.receiver
    if not isinstance(window, FrameWindow):
        raise Unsupported("a column of a Series' window")
    name = call.const("key", 0, kinds=(str,))
    frame = window.grouped
    if frame.columns is not None and name not in frame.columns:
        raise Unsupported(f"no column {name!r} is known here")
    options = dict(window.options)
    if name == options.get("on"):
        raise Unsupported("the window of the column of the times")
    column = column_of(frame, name)
    _numeric(column, ctx)
    if window.time_span is None:
        return Accessor(column.code, column=column, kind="rolling", options=window.options)
    on = str(options["on"])
    pair = replace(frame, code=frame.code.method("select", on, name), columns=(on, name),
                   dtypes=tuple((c, t) for c, t in frame.dtypes if c in (on, name)))
    return TimeWindow(column.code, column=column, kind="rolling", options=window.options,
                      time_span=window.time_span, grouped=pair, taken=name)


@rule("series.expanding")
def expanding(call: PandasCall, ctx: RuleContext) -> Value:
    """s.expanding(min_periods=1) -> a window from the first row to each row, waiting for its
    method (`series.expanding.sum` ...)."""
    column = _column(call)
    ctx.reject_unknown(call, "min_periods", positional=1)
    least = call.const("min_periods", 0, 1, kinds=(int,))
    if least < 0:
        raise Unsupported(f"min_periods={least} (pandas raises)")
    _numeric(column, ctx)
    return Accessor(column.code, column=column, kind="expanding", options=(("min_periods", least),))


_EWM_DECAYS = ("com", "span", "halflife", "alpha")


@rule("series.ewm")
def ewm(call: PandasCall, ctx: RuleContext) -> Value:
    """s.ewm(com= | span= | halflife= | alpha=, adjust=, ignore_na=, min_periods=) -> weights
    waiting for their method (`series.ewm.mean`).

    Caveats: times=, axis=, method= and a decay given twice are TODOs.
    """
    column = _column(call)
    ctx.reject_unknown(call, *_EWM_DECAYS, "min_periods", "adjust", "ignore_na", positional=5)
    given = [(name, call.const(name, i, None, kinds=(int, float)))
             for i, name in enumerate(_EWM_DECAYS)]
    decays = [(name, value) for name, value in given if value is not None]
    if len(decays) != 1 or isinstance(decays[0][1], bool):
        raise Unsupported("one of com, span, halflife, alpha must be given (pandas raises)")
    options = [decays[0],
               ("min_periods", call.const("min_periods", 4, 0, kinds=(int,))),
               ("adjust", call.const("adjust", None, True, kinds=(bool,))),
               ("ignore_na", call.const("ignore_na", None, False, kinds=(bool,)))]
    _numeric(column, ctx)
    return Accessor(column.code, column=column, kind="ewm", options=tuple(options))


@rule("series.ewm.mean")
def ewm_mean(call: PandasCall, ctx: RuleContext) -> Value:
    """s.ewm(...).mean() -> ewm_mean(...).forward_fill().

    Handles: com, span, halflife (half_life) and alpha; adjust; ignore_na (ignore_nulls);
    min_periods (min_samples, at least 1 as pandas counts it); a missing value keeps the mean
    so far, as pandas does (forward_fill: Polars leaves it missing); checked against pandas on
    random data with gaps.
    Caveats: adjust=False with ignore_na=False is a TODO: pandas decays the old weight across
    missing values, Polars does not (the same where the column has none).
    """
    column, options = _window_of(call)
    ctx.reject_unknown(call, "numeric_only")
    decay, value = next((k, v) for k, v in options.items() if k in _EWM_DECAYS)
    if not options["adjust"] and not options["ignore_na"]:
        raise Unsupported("adjust=False with ignore_na=False: pandas decays the old weight across "
                          "missing values and Polars does not (ewm_mean(adjust=False) is the same "
                          "where the column has no missing value)")
    kwargs: dict[str, object] = {"half_life" if decay == "halflife" else decay: value}
    if not options["adjust"]:
        kwargs["adjust"] = False
    least = max(int(options["min_periods"]), 1)  # type: ignore[call-overload]
    if least != 1:
        kwargs["min_samples"] = least
    if options["ignore_na"]:
        kwargs["ignore_nulls"] = True
    ctx.lower("weights computed in another order can differ in the last digits", 0.98)
    code = _numeric(column, ctx).method("ewm_mean", **kwargs).method("forward_fill")
    return derived_column(column, code, dtype="float")


def _last_digits(column: Column, how: str, kind: str, options: dict[str, object],
                 ctx: RuleContext) -> None:
    """Lower the confidence where Polars computes a window value another way than pandas
    (measured on random data, with and without missing values)."""
    exact_numbers = column.dtype in ("int", "bool")
    if how in ("std", "var"):
        ctx.lower("pandas' running variance (values added and removed as the window moves) and "
                  "Polars' can differ in the last digits, and from the 4th significant digit "
                  "where the values are large beside their spread (epoch milliseconds)",
                  0.95 if kind == "rolling" else 0.98)
    elif how in ("sum", "mean") and kind == "rolling" and not exact_numbers:
        ctx.lower("pandas' rolling sum is an online sum with a correction term; Polars' can "
                  "differ from it in the last digits when windows hold missing values", 0.98)


def _aggregate_code(values: Code, how: str, options: dict[str, object], kind: str,
                    ddof: int = 1) -> Code:
    args, kwargs = _window_args(options, kind)
    if how == "count":
        # pandas counts the values present; its min_periods counts the rows of the window
        # (is_not_null is never missing, so min_samples counts rows too)
        flags = values.method("is_not_null").method("cast", emit.atom("pl.Float64"))
        return flags.method("rolling_sum", *args, **kwargs)
    if how in ("std", "var") and ddof != 1:
        kwargs["ddof"] = ddof
    if how == "mean" or how == "sum" and kind == "rolling":
        # pandas' running sum and mean count how many values in a row are equal: a window whose
        # values all are gives that value times their count (sum: 2.2 * 5 is 11.0, where the
        # sum as the window moves gives 11.000000000000002) or that value itself (mean: the
        # window's last one, -0.0 for 0.0, -0.0; 0.1 for three 0.1s, not 0.1000…02)
        same = emit.binop(values.method("rolling_min", *args, **kwargs), "==",
                          values.method("rolling_max", *args, **kwargs))
        last = values.method("forward_fill")
        ahead = (int(args[0]) - 1) // 2 if kwargs.get("center") else 0  # type: ignore[call-overload]
        if ahead:  # a centred window ends (size - 1) // 2 rows further on
            last = last.method("shift", -ahead).method("forward_fill")
        if how == "sum":
            count = values.method("is_not_null").method("cast", emit.atom("pl.Float64"))
            last = last.method("mul", count.method("rolling_sum", *args, **kwargs))
        return emit.when(same, last, values.method(f"rolling_{how}", *args, **kwargs))
    if how == "median":
        # pandas halves the sum of the two middle values of an even count, (a + b) / 2
        # (0.39999999999999997 for 0.7 and 0.1), where Polars' rolling_median gives 0.4
        return emit.binop(emit.binop(
            values.method("rolling_quantile", 0.5, "lower", *args, **kwargs), "+",
            values.method("rolling_quantile", 0.5, "higher", *args, **kwargs)), "/", 2)
    return values.method(f"rolling_{how}", *args, **kwargs)


@rule(*(f"series.{kind}.{how}" for kind in ("rolling", "expanding") for how in WINDOW_AGGREGATES
        if (kind, how) != ("expanding", "median")))
def window_aggregate(call: PandasCall, ctx: RuleContext) -> Value:
    """s.rolling(n, ...).mean() / sum / min / max / median / std / var / count ->
    rolling_mean(n, min_samples=..., center=...) ...; s.expanding(m).sum() -> the same over a
    window as long as the column.

    Handles: missing values are skipped and a window with fewer than min_periods values is
    missing, as in pandas; count's min_periods counts rows (pandas); std/var ddof; integer
    columns give floats as in pandas; the mean of a window of equal values is that value, as
    pandas gives it (-0.0 stays -0.0, three 0.1s give 0.1).
    Caveats: std/var (and float sums, means and medians of a rolling window) can differ in the
    last digits: lowered confidence. expanding().median() (a table TODO) and engine= are TODOs.
    """
    column, options = _window_of(call)
    kind = call.receiver.kind  # type: ignore[union-attr]
    how = call.name
    ddof = 1
    if how in ("std", "var"):
        ctx.reject_unknown(call, "ddof", "numeric_only", positional=1)
        ddof = int(call.const("ddof", 0, 1, kinds=(int, bool)))  # pandas reads True as 1
    else:
        ctx.reject_unknown(call, "numeric_only")
    if isinstance(call.receiver, TimeWindow):
        if how not in TIME_AGGREGATES:
            raise Unsupported(f"{how}() of a time window")
        if how in ("sum", "mean") and column.dtype not in ("int", "bool"):
            ctx.lower("the sum of a time window is added in two parts here (the earlier times, "
                      "then the rows of its own time), pandas' as it moves: floats can differ in "
                      "the last digits", 0.98)
        # whole numbers hold no infinity (which pandas' windows take as missing): their
        # present values are read as they are
        plain = column.code if column.dtype == "int" else None
        code = _time_aggregate(_numeric(column, ctx), how, options, call.receiver.time_span,
                               plain)
        return derived_column(column, code, dtype="float")
    _last_digits(column, how, kind, options, ctx)
    code = _aggregate_code(_numeric(column, ctx), how, options, kind, ddof)
    return derived_column(column, code, dtype="float")


TIME_AGGREGATES = ("count", "sum", "mean", "min", "max")


def _time_aggregate(values: Code, how: str, options: dict[str, object], span: str,
                    plain: Code | None = None) -> Code:
    """A time window's count / sum / mean / min / max, as pandas computes it row by row.

    Each part: `earlier` is the window over the earlier times (after t - span, before t:
    closed="none"); `so_far` the running value among the rows of the row's own time up to it
    (pandas' window ends at the row, a later row of the same time is not in it). pandas'
    min_periods counts the rows of the window for count, the values present otherwise."""
    on = str(options["on"])
    least = int(options["min_periods"])  # type: ignore[call-overload]

    def earlier(part: Code, how: str) -> Code:
        return part.method(f"rolling_{how}_by", on, window_size=span, closed="none")

    def so_far(part: Code, how: str) -> Code:
        running = part.method(f"cum_{how}")
        if how in ("min", "max"):  # cum_min is missing on a missing value: the one before it
            running = running.method("forward_fill")
        return running.method("over", on)

    def total(part: Code) -> Code:
        # no earlier row: the rows of its own time alone (0 + -0.0 would lose pandas' -0.0)
        own = so_far(part, "sum")
        return emit.binop(earlier(part, "sum"), "+", own).method("fill_null", own)

    def counted(flags: Code) -> Code:
        # a count is exact in floats: the rows of its own time so far are the running count
        # less the running count before the first of them (the times are in order, as pandas
        # requires, so rows of one time are together); cheaper than a window per time
        running = flags.method("cum_sum")
        first_of_time = emit.col(on).method("ne_missing", emit.col(on).method("shift"))
        before = emit.when(first_of_time, emit.binop(running, "-", flags)).method("forward_fill")
        own = emit.binop(running, "-", before)
        return emit.binop(earlier(flags, "sum"), "+", own).method("fill_null", own)

    present = (plain if plain is not None else values).method("is_not_null").method(
        "cast", emit.atom("pl.Float64"))
    count = total(present)
    if how == "count":
        count = counted(present)
        if least <= 1:  # a row's own row is always in its window
            return count
        rows = counted(emit.col(on).method("is_not_null").method("cast", emit.atom("pl.Float64")))
        return emit.when(emit.binop(rows, ">=", least), count)
    extremes = {way: emit.pl(f"{way}_horizontal", earlier(values, way), so_far(values, way))
                for way in ("min", "max")}
    if how in extremes:
        result = extremes[how]
    else:
        result = total(values.method("fill_null", 0))
        if how == "mean":
            # pandas' running mean of a window whose values are all equal is that value itself
            # (the last one: -0.0 stays -0.0), not their sum over their count
            same = emit.binop(extremes["min"], "==", extremes["max"])
            result = emit.when(same, values.method("forward_fill"),
                               emit.binop(result, "/", count))
    if how == "sum" and least == 0:
        return result  # no value at all sums to 0, as pandas gives
    return emit.when(emit.binop(count, ">=", max(least, 1)), result)


# -- rolling and expanding windows within groups -------------------------------------------------
#
# `df.groupby(k)[c].rolling(n).mean()` is ordered by group (keys sorted, each group's rows in
# the frame's order, rows of a missing key left out) with (key, row label) as its index. As a
# Polars value it is the window expression `rolling_mean(n).over(k)` computed in a frame of
# those rows in that order. `.reset_index(level=0, drop=True)` (or `.droplevel(0)`) leaves the
# row labels, so assigning it into the frame it came from puts each value back on its own row:
# there the same expression is computed in the frame's own order (pl.when(key present)).


@dataclass(frozen=True)
class GroupWindow(Accessor):
    """`df.groupby(k)[c].rolling(n)` / `.expanding()`: a window per group waiting for its method
    (keys `groupby.rolling.<method>`); a hand-over makes it again from the grouped Series."""

    grouped: Grouped = field(kw_only=True)
    key_prefix: str = field(default="groupby.rolling", kw_only=True)


@dataclass(frozen=True)
class GroupOrdered(Column):
    """A window's result per group in pandas' order: by group, with the keys in the index. Its
    methods are keys `groupby.window.<method>`: only reset_index(level=keys, drop=True) and
    droplevel(keys) are ported."""

    grouped: Grouped = field(kw_only=True)
    in_order: Code = field(kw_only=True)  # the same values in the grouped frame's row order
    key_prefix: str = field(default="groupby.window", kw_only=True)
    pandas: Code | None = field(default=None, kw_only=True)  # made again by pandas, labels and all


@dataclass(frozen=True)
class Relabelled(Column):
    """A Series whose labels are a frame's own row labels, in another order (a group window
    after reset_index(level=0, drop=True)). pandas aligns it on the labels when it is assigned
    into that frame: `aligned_in(frame)` is then the column in the frame's own order."""

    in_order: Column | None = field(default=None, kw_only=True)
    pandas: Code | None = field(default=None, kw_only=True)  # made again by pandas, labels and all
    # kept in a name, the values are made again by pandas (its labels): that site's key
    key_prefix: str = field(default="groupby.window", kw_only=True)

    def aligned_in(self, frame: Frame) -> Column | None:
        if self.in_order is None or self.in_order.frame.rows != frame.rows:
            return None
        return self.in_order


def _group_sorted(grouped: Grouped) -> Frame:
    """The grouped frame's rows in pandas' group order: keys sorted (a missing key last, or
    left out with dropna=True), or in order of first appearance (sort=False); each group's rows
    in the frame's order."""
    frame = grouped.frame
    code = frame.code
    if grouped.dropna:
        code = code.method("filter", _keys_present(grouped))
    if grouped.sort:
        # a True/False key with a missing value kept: pandas' order of its groups (group_order)
        order = group_order(grouped)
        code = code.method("sort", emit.names_arg(grouped.keys) if order is None else order,
                           nulls_last=True, maintain_order=True)
    else:  # each group where its first row is: the smallest row number of the group
        code = code.method("with_row_index", ROW_NUMBER).method(
            "sort", _over(grouped, emit.col(ROW_NUMBER).method("min")), maintain_order=True
        ).method("drop", ROW_NUMBER)
    return derive(frame, code, same_rows=False)


ROW_NUMBER = "_porter_row"


@rule("groupby.rolling", "groupby.expanding")
def group_rolling(call: PandasCall, ctx: RuleContext) -> Value:
    """df.groupby(keys)[col].rolling(n, min_periods, center) / .expanding(min_periods) -> a
    window per group waiting for its method (`groupby.rolling.mean` ...).

    Handles: the same window arguments as Series.rolling / expanding.
    Caveats: time windows, on=, win_type, closed, step are TODOs.
    """
    grouped, column = _selected(call)
    window = (rolling if call.name == "rolling" else expanding)(
        PandasCall(column, call.name, call.args, call.kwargs, call.node), ctx)
    assert isinstance(window, Accessor)
    return GroupWindow(window.code, column=column, kind=window.kind, options=window.options,
                       grouped=grouped, key_prefix=f"groupby.{call.name}")


@rule(*(f"groupby.{kind}.{how}" for kind in ("rolling", "expanding")
        for how in (*WINDOW_AGGREGATES, "apply") if (kind, how) != ("expanding", "median")))
def group_window_aggregate(call: PandasCall, ctx: RuleContext) -> Value:
    """df.groupby(keys)[col].rolling(n).mean() / sum / ... / apply(f) -> rolling_mean(n, ...)
    .over(keys) (the window function's expression .over(keys)), computed in a frame of the
    rows in pandas' group order, with the keys in the index.

    Handles: each group's window restarts at its first row; as Series.rolling / expanding for
    missing values, min_periods, dtypes and the functions apply reads; the result is ordered
    by group as pandas orders it.
    Caveats: as Series.rolling for the last digits of sums, means, std and var.
    """
    window = call.receiver
    assert isinstance(window, GroupWindow)
    plain_rule = window_apply if call.name == "apply" else window_aggregate
    plain = plain_rule(PandasCall(Accessor(window.code, column=window.column, kind=window.kind,
                                           options=window.options),
                                  call.name, call.args, call.kwargs, call.node), ctx)
    assert isinstance(plain, Column)
    grouped = window.grouped
    rows = _group_sorted(grouped)
    rows = replace(rows, index=tuple(dict.fromkeys((*grouped.keys, *rows.index))))
    # handed to pandas, the window is made again there (the arguments as written: numbers,
    # the function): the labels are pandas' own
    pandas = handover.to_pandas(window).method(
        call.name, *(a.code for a in call.args), **{k: v.code for k, v in call.kwargs.items()})
    return GroupOrdered(_over(grouped, plain.code), frame=rows, name=plain.name, dtype="float",
                        refs=plain.refs, versions=plain.versions, grouped=grouped,
                        in_order=_window(grouped, plain.code), pandas=pandas)


@rule("groupby.window.reset_index", "groupby.window.droplevel")
def group_window_labels(call: PandasCall, ctx: RuleContext) -> Value:
    """g[col].rolling(n).mean().reset_index(level=0, drop=True) -> window.over(keys) in the
    frame's order where it is assigned back (droplevel(0) alike).

    The values keep their own row labels, still in group order; assigned into the frame they
    came from, pandas puts each value back on its row: the window .over(keys) computed in the
    frame's order.

    Caveats: any other use of the index levels (reset_index without drop, only some of
    several keys) is a TODO.
    """
    result = call.receiver
    assert isinstance(result, GroupOrdered)
    keys = result.grouped.keys
    if call.name == "reset_index":
        ctx.reject_unknown(call, "level", "drop", positional=2)
        level = call.const("level", 0, None)
        if call.const("drop", 1, False, kinds=(bool,)) is not True:
            raise Unsupported("the keys become a column beside the row labels")
    else:
        ctx.reject_unknown(call, "level", positional=1)
        level = call.const("level", 0)
    levels = level if isinstance(level, (list, tuple)) else [level]
    wanted = ({*range(len(keys))}, set(keys))
    if not (len(levels) == len(keys) and (set(levels) in wanted)) or any(
            isinstance(v, bool) for v in levels):
        raise Unsupported(f"level={level!r}: only every key level (the row labels stay)")
    rows = replace(result.frame, index=tuple(i for i in result.frame.index if i not in keys))
    in_order = derived_column(column_of(result.grouped.frame, result.name or ""), result.in_order,
                              dtype="float")
    pandas = None if result.pandas is None else result.pandas.method(call.name, level=level, **(
        {"drop": True} if call.name == "reset_index" else {}))
    return Relabelled(result.code, frame=rows, name=result.name, dtype=result.dtype,
                      refs=result.refs, versions=result.versions, in_order=in_order, pandas=pandas)


@rule("groupby.window.round", "groupby.window.abs")
def group_window_elementwise(call: PandasCall, ctx: RuleContext) -> Value:
    """g[col].rolling(n).mean().round(2) / .abs() -> the window expression's .round(2) / .abs().

    Before or after reset_index(level=0, drop=True) / droplevel.

    round and abs change each value on its own and keep its row label, so the result keeps
    the window's labels: in group order with the keys (then reset_index / droplevel as
    before), or the frame's own labels (then assigned back onto each row). Each form the
    window is held in (group order, the frame's order, pandas' own) gets the same call.
    """
    result = call.receiver
    assert isinstance(result, (GroupOrdered, Relabelled))
    plain_rule = round_ if call.name == "round" else abs_

    def applied(code: Code, frame: Frame) -> Column:
        column = Column(code, frame=frame, name=result.name, dtype=result.dtype,
                        refs=result.refs, versions=result.versions)
        value = plain_rule(PandasCall(column, call.name, call.args, call.kwargs, call.node), ctx)
        assert isinstance(value, Column)
        return value

    code = applied(result.code, result.frame).code
    pandas = None if result.pandas is None else result.pandas.method(
        call.name, *(a.code for a in call.args), **{k: v.code for k, v in call.kwargs.items()})
    if isinstance(result, GroupOrdered):
        in_order = applied(result.in_order, result.grouped.frame).code
        return replace(result, code=code, in_order=in_order, pandas=pandas, sites=())
    in_order = None if result.in_order is None else applied(result.in_order.code,
                                                            result.in_order.frame)
    return replace(result, code=code, in_order=in_order, pandas=pandas, sites=())


# -- apply(func) over a window ------------------------------------------------------------------
#
# pandas calls `func` on each window holding at least min_periods values present (NaN
# otherwise). A function whose body is one expression over the window becomes rolling
# expressions: each way it reads the window (`w[-1]`, `np.nanmedian(w)`, `w.mean()`) is a
# column expression, and the rest of the body (abs, arithmetic, numbers) is evaluated by the
# ordinary rules with those expressions standing in.

NUMPY_SKIPPING = {"nanmean": "mean", "nanmedian": "median", "nanmax": "max", "nanmin": "min",
                  "nansum": "sum", "nanstd": "std", "nanvar": "var"}
NUMPY_PLAIN = {"mean": "mean", "median": "median", "max": "max", "amax": "max", "min": "min",
               "amin": "min", "sum": "sum", "std": "std", "var": "var"}
# ndarray methods (raw=True): NaN makes them NaN; Series methods (raw=False) skip it
ARRAY_METHODS = {"mean": "mean", "max": "max", "min": "min", "sum": "sum", "std": "std",
                 "var": "var"}
SERIES_METHODS = {**ARRAY_METHODS, "median": "median"}
NUMPY_ABS = {"abs", "absolute", "fabs"}
# operators through which a missing value stays missing (the window's gate carries over)
NULL_KEEPING = (cst.Add, cst.Subtract, cst.Multiply, cst.Divide)


# the largest window whose std or var porter computes window by window: numpy sums fewer
# than 8 values one after another (a running sum gives the same bits), longer arrays in 8
# interleaved partial sums
SPREAD_WINDOWS = 7


def _window_spread(values: Code, how: str, options: dict[str, object], ddof: int) -> Code:
    """The std or var of each rolling window computed from the window's own values, as pandas'
    Series.std (nanops.nanvar) and numpy's std compute it for apply: the window's rows
    gathered into a list, its sum taken value after value (numpy's order, a missing value as
    0), the mean, then the squares around it summed the same way; missing where fewer than
    min_periods values (or no more than ddof) are present."""
    size = int(options["window"])  # type: ignore[call-overload]
    row = emit.pl("int_range", emit.pl("len"))
    # the window of row i ends at i (a centred one (size - 1) // 2 rows later), as pandas'
    # fixed windows do, cut at the first and last rows
    ahead = (size - 1) // 2 if options.get("center") else 0
    start = emit.binop(row, "-", size - 1 - ahead).method("clip", 0) if size - 1 - ahead else row
    end = emit.binop(row, "+", ahead + 1)
    if ahead:
        end = end.method("clip", upper_bound=emit.pl("len"))
    windows = values.method("implode").attr("list").method(
        "gather", emit.pl("int_ranges", start, end))
    least = max(int(options["min_periods"]), ddof + 1)  # type: ignore[call-overload]
    mean = "pl.element().fill_null(0).cum_sum().last() / pl.element().count()"
    spread = emit.atom(
        f"pl.when(pl.element().count() >= {least}).then(((pl.element() - ({mean})) ** 2)"
        f".fill_null(0).cum_sum().last() / (pl.element().count() - {ddof}))")
    code = windows.attr("list").method("eval", spread).attr("list").method("first")
    return code.method("sqrt") if how == "std" else code


class _WindowReads(cst.CSTTransformer):
    """Replaces each read of the window parameter by a name bound to its column expression."""

    def __init__(self, param: str, raw: bool, column: Column, values: Code, kind: str,
                 options: dict[str, object], ctx: RuleContext) -> None:
        super().__init__()
        self.param, self.raw, self.column, self.values = param, raw, column, values
        self.kind, self.options, self.ctx = kind, options, ctx
        self.bindings: dict[str, Value] = {}
        self.aggregates: set[str] = set()
        # the window holds no missing value when pandas needs every row present
        self.complete = kind == "rolling" and options["min_periods"] == options["window"]

    def _is_param(self, node: cst.BaseExpression) -> bool:
        return isinstance(node, cst.Name) and node.value == self.param

    def _bind(self, code: Code, aggregate: bool) -> cst.Name:
        name = f"_porter_window_{len(self.bindings)}"
        self.bindings[name] = derived_column(self.column, code, dtype="float", name=None)
        if aggregate:
            self.aggregates.add(name)
        return cst.Name(name)

    def _aggregate(self, how: str, ddof: int) -> cst.Name:
        if how in ("std", "var"):
            # pandas computes the function's std of each window on its own (two passes: the
            # mean, then the squares around it); Polars' running variance, values added and
            # removed as the window moves, loses digits where the values are large beside
            # their spread (epoch milliseconds: from the 4th significant digit)
            if self.kind == "expanding" or int(self.options["window"]) > SPREAD_WINDOWS:  # type: ignore[call-overload]
                raise Unsupported(f"the {how} of each window: pandas computes it window by "
                                  f"window, and Polars' running {how} loses digits where the "
                                  f"values are large beside their spread; porter gathers the "
                                  f"rows of windows of up to {SPREAD_WINDOWS} rows only")
            return self._bind(_window_spread(self.values, how, self.options, ddof), True)
        _last_digits(self.column, how, self.kind, self.options, self.ctx)
        if self.kind == "expanding" and how == "median":
            raise Unsupported("a running median (no bounded Polars expression)")
        return self._bind(_aggregate_code(self.values, how, self.options, self.kind, ddof), True)

    def _ddof(self, node: cst.Call, default: int) -> int:
        ddof = default
        for arg in node.args:
            if arg.keyword is None or arg.keyword.value != "ddof" or not isinstance(arg.value, cst.Integer):
                raise Unsupported("an argument porter does not read in the window function")
            ddof = int(arg.value.value)
        return ddof

    def leave_Subscript(self, original: cst.Subscript, updated: cst.Subscript) -> cst.BaseExpression:
        base = updated.value
        newest = (self.raw and self._is_param(base)) or (
            not self.raw and isinstance(base, cst.Attribute) and self._is_param(base.value)
            and base.attr.value == "iloc")
        if not newest or len(updated.slice) != 1 or not isinstance(updated.slice[0].slice, cst.Index):
            return updated
        index = updated.slice[0].slice.value
        if not (isinstance(index, cst.UnaryOperation) and isinstance(index.operator, cst.Minus)
                and isinstance(index.expression, cst.Integer) and index.expression.value == "1"):
            return updated  # another position: left for the check below
        if self.options.get("center"):
            raise Unsupported("the newest value of a centred window (a later row)")
        return self._bind(self.values, False)

    def leave_Call(self, original: cst.Call, updated: cst.Call) -> cst.BaseExpression:
        func = updated.func
        numpy = self.ctx.evaluate(original.func, {}) if isinstance(func, cst.Attribute) else None
        qualname = getattr(numpy, "qualname", "")
        if qualname.startswith("numpy."):
            name = qualname.removeprefix("numpy.")
            if name in NUMPY_ABS and len(updated.args) == 1 and updated.args[0].keyword is None:
                return updated.with_changes(func=cst.Name("abs"))
            positional = [a for a in updated.args if a.keyword is None]
            if len(positional) != 1 or not self._is_param(positional[0].value):
                return updated
            extra = cst.Call(func=func, args=[a for a in updated.args if a.keyword is not None])
            if name in NUMPY_SKIPPING:
                return self._aggregate(NUMPY_SKIPPING[name], self._ddof(extra, 0))
            if name in NUMPY_PLAIN and self.complete:
                # the window holds no NaN: numpy's plain reduction is the skipping one
                return self._aggregate(NUMPY_PLAIN[name], self._ddof(extra, 0))
            return updated
        if isinstance(func, cst.Attribute) and self._is_param(func.value):
            methods = ARRAY_METHODS if self.raw else SERIES_METHODS
            name = func.attr.value
            if name in methods and (self.complete or not self.raw):
                return self._aggregate(methods[name], self._ddof(updated, 0 if self.raw else 1))
        return updated


def _keeps_missing(node: cst.BaseExpression, names: set[str]) -> bool:
    """Whether `node` is missing wherever one of `names` is: they are combined only by + - * /,
    unary minus and abs()."""
    if isinstance(node, cst.Name):
        return node.value in names
    if isinstance(node, cst.BinaryOperation) and isinstance(node.operator, NULL_KEEPING):
        return _keeps_missing(node.left, names) or _keeps_missing(node.right, names)
    if isinstance(node, cst.UnaryOperation) and isinstance(node.operator, (cst.Minus, cst.Plus)):
        return _keeps_missing(node.expression, names)
    if isinstance(node, cst.Call) and isinstance(node.func, cst.Name) and node.func.value == "abs" \
            and len(node.args) == 1:
        return _keeps_missing(node.args[0].value, names)
    return False


def _has_branches(node: cst.CSTNode) -> bool:
    found = False

    class Finder(cst.CSTVisitor):
        def visit_IfExp(self, n: cst.IfExp) -> None:
            nonlocal found
            found = True

    node.visit(Finder())
    return found


def _free_names(node: cst.CSTNode) -> set[str]:
    """The names an expression reads (not attribute names, nor keyword names)."""
    names: set[str] = set()

    class Finder(cst.CSTVisitor):
        def visit_Name(self, n: cst.Name) -> None:
            names.add(n.value)

        def visit_Attribute(self, n: cst.Attribute) -> bool:
            n.value.visit(self)
            return False

        def visit_Arg(self, n: cst.Arg) -> bool:
            n.value.visit(self)
            return False

    node.visit(Finder())
    return names


def _mentions(node: cst.CSTNode, name: str) -> bool:
    found = False

    class Finder(cst.CSTVisitor):
        def visit_Name(self, n: cst.Name) -> None:
            nonlocal found
            found = found or n.value == name

    node.visit(Finder())
    return found


@rule("series.rolling.apply", "series.expanding.apply")
def window_apply(call: PandasCall, ctx: RuleContext) -> Value:
    """s.rolling(n, min_periods=m).apply(func, raw=...) -> rolling expressions, where func
    returns one expression of the window: `w[-1]` (raw) / `w.iloc[-1]` is the column itself,
    `np.nanmedian(w)` is rolling_median(n, min_samples=m), and so on.

    Handles: pandas calls func only on windows with at least min_periods values present (NaN
    otherwise): each rolling_* has that min_samples, and an expression that could be present
    without them is put under pl.when(values present >= m); numpy's plain reductions and
    ndarray methods (which give NaN for a window holding NaN) only where the window cannot hold
    one (min_periods equal to the window); Series methods (raw=False) skip missing values.
    Caveats: any other read of the window (another position, len, a loop, np.median of a
    window that may hold NaN), args/kwargs, engine, and min_periods=0 are TODOs.
    """
    if isinstance(call.receiver, TimeWindow):
        raise Unsupported("apply over a time window")
    column, options = _window_of(call)
    kind = call.receiver.kind  # type: ignore[union-attr]
    ctx.reject_unknown(call, "func", "raw", positional=2)
    raw = call.const("raw", 1, False, kinds=(bool,))
    if options["min_periods"] == 0:
        raise Unsupported("min_periods=0: pandas also calls the function on windows with no values")
    function = call.arg("func", 0)
    if isinstance(function, Opaque) and isinstance(function.node, cst.Lambda):
        lambda_node = function.node
        params = lambda_node.params.params
        if len(params) != 1 or lambda_node.params.star_arg not in (None, cst.MaybeSentinel.DEFAULT):
            raise Unsupported("a lambda with more than one parameter")
        param, body = params[0].name.value, lambda_node.body
    else:
        named = function_value(call, function, ctx)
        if named is None:
            raise Unsupported("a function porter cannot read: write it as rolling expressions")
        body = body_expression(named)
        param = named.params.params[0].name.value
    values = _numeric(column, ctx)
    reads = _WindowReads(param, raw, column, values, kind, options, ctx)
    rewritten = body.visit(reads)
    assert isinstance(rewritten, cst.BaseExpression)
    if _mentions(rewritten, param):
        raise Unsupported(
            "the function reads the window in a way porter cannot write as rolling expressions "
            "(only the newest value w[-1], np.nan* reductions, and plain reductions of a window "
            "that cannot hold NaN)")
    result = _checked(ctx.evaluate(rewritten, reads.bindings), ctx)
    if isinstance(result, Opaque) and result.is_const and isinstance(result.const, (int, float)) \
            and not isinstance(result.const, bool):
        # NaN is a missing value, written as a float null
        code = emit.pl("lit", None, dtype=emit.atom("pl.Float64")) if result.const != result.const \
            else emit.pl("lit", float(result.const))
    elif isinstance(result, Column) and result.frame.rows == column.frame.rows:
        code = result.code.method("fill_null", False) if result.null_is_false else result.code
        if result.dtype in ("bool", "int"):  # pandas stores what the function returns as float
            code = code.method("cast", emit.atom("pl.Float64"))
    else:
        raise Unsupported("the function's result has no expression form porter knows")
    if not _keeps_missing(rewritten, reads.aggregates):
        # the function is only called where enough values are present
        present = values.method("is_not_null")
        if kind == "expanding":
            count = present.method("cum_sum")
        else:
            count = present.method("cast", emit.atom("pl.Int64")).method(
                "rolling_sum", options["window"], min_samples=1,
                **({"center": True} if options.get("center") else {}))
        code = emit.when(emit.binop(count, ">=", options["min_periods"]), code)
    return derived_column(column, code, dtype="float", others=[result] if isinstance(result, Column) else [])
