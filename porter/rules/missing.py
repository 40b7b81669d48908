"""Missing values: isna / notna, dropna, fillna.

porter keeps NaN out of Polars frames (scans read pandas' NA tokens as null, NaN-producing
arithmetic is followed by fill_nan(None)), so pandas' "missing" is Polars' null throughout.
"""

from __future__ import annotations

from porter.emit import code as emit
from porter.emit.code import Code
from porter.rules import rule
from porter.translate.context import PandasCall, RuleContext, Unsupported, derive, derived_column
from porter.translate.values import Column, Frame, Opaque, Scalar, Value


@rule("series.isna", "series.isnull")
def isna(call: PandasCall, ctx: RuleContext) -> Value:
    """s.isna() -> .is_null() (NaN never reaches a Polars frame porter writes)."""
    column = call.receiver
    assert isinstance(column, Column)
    return derived_column(column, column.code.method("is_null"), dtype="bool")


@rule("series.notna", "series.notnull")
def notna(call: PandasCall, ctx: RuleContext) -> Value:
    """s.notna() -> .is_not_null()."""
    column = call.receiver
    assert isinstance(column, Column)
    return derived_column(column, column.code.method("is_not_null"), dtype="bool")


def _subset(call: PandasCall, frame: Frame) -> list[str] | None:
    subset = call.const("subset", None, None)
    if subset is None:
        return None
    return [subset] if isinstance(subset, str) else list(subset)


@rule("frame.dropna")
def dropna(call: PandasCall, ctx: RuleContext) -> Value:
    """df.dropna(subset=, how=, thresh=) -> .drop_nulls(...) or a filter.

    Handles: how="all" keeps rows with any value; thresh counts the values present.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "subset", "how", "thresh", "axis")
    if call.const("axis", None, 0) not in (0, "index"):
        raise Unsupported("dropping columns with missing values")
    subset = _subset(call, frame)
    cols: Code = emit.col(emit.names_arg(subset)) if subset else emit.pl("all")
    thresh = call.const("thresh", None, None)
    how = call.const("how", None, "any")
    if thresh is not None:
        present = emit.pl("sum_horizontal", cols.method("is_not_null"))
        code = frame.code.method("filter", emit.binop(present, ">=", thresh))
    elif how == "all":
        code = frame.code.method("filter", emit.unary("~", emit.pl("all_horizontal", cols.method("is_null"))))
    else:
        code = frame.code.method("drop_nulls", *([emit.names_arg(subset)] if subset else []))
    return derive(frame, code, same_rows=False)


@rule("series.dropna")
def series_dropna(call: PandasCall, ctx: RuleContext) -> Value:
    """s.dropna() -> the column of frame.filter(s.is_not_null())."""
    column = call.receiver
    assert isinstance(column, Column)
    frame = column.frame
    filtered = derive(frame, frame.code.method("filter", column.code.method("is_not_null")), same_rows=False)
    return Column(column.code, frame=filtered, name=column.name, dtype=column.dtype,
                  refs=column.refs, versions=column.versions)


def fill_value(value: Value, frame: Frame, ctx: RuleContext) -> Code:
    if isinstance(value, Opaque) and value.is_const:
        if isinstance(value.const, (dict, list)):
            raise Unsupported("this fill value")
        return emit.as_expr(value.const)
    if isinstance(value, (Column, Scalar, Opaque)):
        return ctx.expr(value, frame)
    raise Unsupported("a fill value computed by pandas")


@rule("series.fillna")
def series_fillna(call: PandasCall, ctx: RuleContext) -> Value:
    """s.fillna(v) -> .fill_null(v) (v may be a value, a column or a reduction)."""
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call, "value", positional=1)
    value = call.arg("value", 0)
    code = column.code.method("fill_null", fill_value(value, column.frame, ctx))
    if isinstance(value, Opaque) and isinstance(value.const, str) and column.dtype not in (None, "str"):
        ctx.lower("text filled into a non-text column makes an object column in pandas", 0.7)
    return derived_column(column, code, dtype=column.dtype, others=[value])


@rule("frame.fillna")
def frame_fillna(call: PandasCall, ctx: RuleContext) -> Value:
    """df.fillna(v) -> .fill_null(v); df.fillna({"a": 0}) -> per-column fill_null.

    Caveats: pandas also writes a number into text columns (making them object); Polars only
    fills columns whose type can hold the value.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "value", positional=1)
    value = call.arg("value", 0)
    if isinstance(value, Opaque) and isinstance(value.const, dict):
        from porter.rules.assign import with_columns
        items = [(name, emit.col(name).method("fill_null", emit.as_expr(v)), frame.dtype(name))
                 for name, v in value.const.items()]
        return with_columns(frame, items)
    code = frame.code.method("fill_null", fill_value(value, frame, ctx))
    kinds = {t for _, t in frame.dtypes}
    complete = frame.columns is not None and len(frame.dtypes) == len(frame.columns)
    is_text = isinstance(value, Opaque) and isinstance(value.const, str)
    if not complete or (is_text and kinds - {"str"}) or (not is_text and "str" in kinds):
        ctx.lower("pandas also fills columns of another type (making them object); Polars "
                  "fills only the columns whose type can hold the value", 0.85)
    return derive(frame, code, same_rows=True)


@rule("series.ffill", "series.bfill")
def fill_direction(call: PandasCall, ctx: RuleContext) -> Value:
    """s.ffill() / s.bfill() -> .forward_fill() / .backward_fill()."""
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call, "limit")
    method = "forward_fill" if call.name == "ffill" else "backward_fill"
    limit = call.const("limit", None, None)
    code = column.code.method(method, *([limit] if limit is not None else []))
    return derived_column(column, code, dtype=column.dtype)
