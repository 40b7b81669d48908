"""Missing values: isna / notna, dropna, fillna.

porter keeps NaN out of Polars frames (scans read pandas' NA tokens as null, NaN-producing
arithmetic is followed by fill_nan(None)), so pandas' "missing" is Polars' null throughout.
"""

from __future__ import annotations

from dataclasses import dataclass, field, fields, replace

import libcst as cst

from porter.emit import code as emit
from porter.emit.code import Code
from porter.rules import rule
from porter.rules.totals import column_totals
from porter.translate.context import (
    MIXED_COLUMN, PandasCall, RuleContext, Unsupported, column_names, column_of, derive,
    derived_column, labels_kept, values_fixed, without_index,
)
from porter.translate.values import (
    NOT_NULLABLE, Column, Frame, Opaque, PandasValue, Scalar, Value, fresh_token,
)


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


@rule("pd.isna", "pd.isnull", "pd.notna", "pd.notnull")
def pd_isna(call: PandasCall, ctx: RuleContext) -> Value:
    """pd.isna(s) / pd.notna(s) -> .is_null() / .is_not_null(), as s.isna().

    Handles: a column, or the value a function given to apply or map receives.

    Caveats: a frame, a list or a plain Python value stays pandas' (porter keeps such calls
    as written where no column is involved)."""
    ctx.reject_unknown(call, "obj", positional=1)
    value = call.arg("obj", 0)
    if not isinstance(value, Column):
        raise Unsupported("only a column, or the value a function given to apply receives, is "
                          "ported")
    method = "is_null" if call.name in ("isna", "isnull") else "is_not_null"
    return derived_column(value, value.code.method(method), dtype="bool")


@dataclass(frozen=True)
class MissingMask(Frame):
    """df.isna() / df.notna(): pandas' frame of True/False, one column per column of `source`.
    As a frame it is what Polars computes (`code`: source.select(pl.col(names).is_null())),
    each column a new version, so none is read as the column it was made from. Its methods
    are keys `frame.isna.<method>`: the row-wise any / all / sum are expressions of `source`
    (pl.any_horizontal(pl.col(names).is_null())); the rest are TODOs handing the mask over."""

    source: Frame = field(kw_only=True)
    names: tuple[str, ...] = field(kw_only=True)
    test: str = field(kw_only=True)  # is_null / is_not_null
    key_prefix: str = field(default="frame.isna", kw_only=True)


@rule("frame.isna", "frame.isnull", "frame.notna", "frame.notnull")
def frame_isna(call: PandasCall, ctx: RuleContext) -> Value:
    """df.isna() / df.notna() -> df.select(pl.col(names).is_null() / .is_not_null()).

    Handles: a frame of True/False with pandas' columns (NaN, None and NaT are missing; a
    text "" is not: porter's frames hold no NaN, so missing is null); its any(axis=1),
    all(axis=1) and sum(axis=1) are expressions of the frame (keys frame.isna.*).
    Caveats: a frame whose columns are not known or that holds an index of its own is a TODO.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call)
    if frame.columns is None or not frame.columns:
        raise Unsupported("the frame's columns are not known")
    if frame.index:
        raise Unsupported("a frame with an index of its own")
    names = tuple(frame.columns)
    test = "is_null" if call.name in ("isna", "isnull") else "is_not_null"
    code = frame.code.method("select", emit.col(emit.names_arg(names)).method(test))
    # pandas' isna gives numpy booleans, whatever the column's type (no nullable ones)
    mask = derive(frame, code, same_rows=True, columns=names,
                  dtypes=tuple((c, "bool") for c in names),
                  versions=tuple((c, fresh_token()) for c in names), float_ints=(),
                  nullable_ints=None if frame.nullable_ints is None else (), unsure_ints=())
    return MissingMask(**{f.name: getattr(mask, f.name) for f in fields(Frame)},
                       source=frame, names=names, test=test)


@rule("frame.isna.any", "frame.isna.all", "frame.isna.sum", "frame.isna.mean")
def missing_mask_rowwise(call: PandasCall, ctx: RuleContext) -> Value:
    """df[cols].isna().any(axis=1) / .all(axis=1) / .sum(axis=1) -> pl.any_horizontal /
    pl.all_horizontal / pl.sum_horizontal of pl.col(cols).is_null() (is_not_null for notna);
    mean(axis=1) is that count over the number of columns. Per column (axis=0, the default):
    is_null().sum() / any() / all() / mean() of each, a Series indexed by the column names.

    Handles: the mask holds no missing values, so skipna, bool_only and numeric_only change
    nothing; sum counts per row (Int64, as pandas' int64), min_count up to the number of
    columns.
    Caveats: per-column results (axis=0) and axis=None are TODOs (pandas gives a Series
    indexed by column name, or one value), as are min_count above the number of columns.
    """
    mask = call.receiver
    if not isinstance(mask, MissingMask):
        raise Unsupported("not a mask made by isna() / notna()")
    extra = ["skipna", "numeric_only", "min_count"] if call.name == "sum" else \
        ["skipna", "numeric_only"] if call.name == "mean" else ["skipna", "bool_only"]
    ctx.reject_unknown(call, "axis", *extra, positional=1)
    axis = call.const("axis", 0, 0, kinds=(int, str, type(None)))
    if axis in (0, "index"):
        # one value per column: the count of missing (present) values, or whether any / all
        # are; the mask holds no missing values, so skipna and min_count (up to 1) change
        # nothing
        if call.const("min_count", None, 0, kinds=(int,)) > 1:
            raise Unsupported("min_count above 1 per column")
        for flag in extra:
            if flag != "min_count":
                call.const(flag, None, False, kinds=(bool,))

        def reduce(name: str) -> Code:
            test = emit.col(name).method(mask.test).method(call.name)
            return test.method("cast", emit.atom("pl.Int64")) if call.name == "sum" else test

        return column_totals(mask.source, mask.names, reduce, {"sum": "int", "mean": "float"}
                             .get(call.name, "bool"))
    if axis not in (1, "columns"):
        raise Unsupported(f"a {call.name} of the whole frame (axis=None)")
    for flag in extra:
        if flag != "min_count":
            call.const(flag, None, False, kinds=(bool,))
    if call.const("min_count", None, 0, kinds=(int,)) > len(mask.names):
        raise Unsupported("min_count above the number of columns: every row is NaN")
    source = mask.source
    columns = [column_of(source, c) for c in mask.names]
    tests = emit.col(emit.names_arg(mask.names)).method(mask.test)
    if call.name == "mean":  # the share of the row's columns: a count over their number
        code = emit.binop(emit.pl("sum_horizontal", tests), "/", len(mask.names))
    else:
        code = emit.pl(f"{call.name}_horizontal", tests)
    if call.name == "sum":
        code = code.method("cast", emit.atom("pl.Int64"))  # a count of True: UInt32 in Polars
    base = Column(emit.pl("lit", None), frame=source, name=None)
    return derived_column(base, code, dtype={"sum": "int", "mean": "float"}.get(call.name, "bool"),
                          name=None, others=columns)


def _subset(call: PandasCall, frame: Frame) -> list[str] | None:
    subset = call.const("subset", None, None)
    if subset is None:
        return None
    return column_names(subset, "subset")


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
    # pandas reads the columns, never the index (a missing key held as a column stays)
    everything = without_index(emit.atom("pl.selectors.all()"), frame) if frame.index else emit.pl("all")
    cols: Code = emit.col(emit.names_arg(subset)) if subset else everything
    thresh = call.const("thresh", None, None)
    how = call.const("how", None, "any")
    if thresh is not None:
        present = emit.pl("sum_horizontal", cols.method("is_not_null"))
        code = frame.code.method("filter", emit.binop(present, ">=", thresh))
    elif how == "all":
        code = frame.code.method("filter", emit.unary("~", emit.pl("all_horizontal", cols.method("is_null"))))
    elif frame.index and not subset:
        code = frame.code.method("drop_nulls", everything)
    else:
        code = frame.code.method("drop_nulls", *([emit.names_arg(subset)] if subset else []))
    return labels_kept(frame, derive(frame, code, same_rows=False))


@rule("series.dropna")
def series_dropna(call: PandasCall, ctx: RuleContext) -> Value:
    """s.dropna() -> the column of frame.filter(s.is_not_null())."""
    column = call.receiver
    assert isinstance(column, Column)
    column = values_fixed(column)  # a rank or running sum keeps the values of all rows
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


def _is_nan(value: object) -> bool:
    return isinstance(value, float) and value != value


def _kind_of(value: object) -> str | None:
    if isinstance(value, bool):
        return "bool"
    if isinstance(value, (int, float)):
        return "number"
    if isinstance(value, str):
        return "str"
    return None


def _mixes_types(value: object, dtype: str | None) -> bool:
    """Filling `value` into a column of `dtype` makes a mixed (object) column in pandas; Polars
    would turn the whole column into text (or refuse)."""
    kind = _kind_of(value)
    if kind is None or dtype is None:
        return False
    if kind == "str":
        return dtype != "str"
    if kind == "number":
        return dtype in ("str", "bool", "datetime", "date", "category", "enum")
    return dtype not in ("bool",)


_FILL_METHODS = {"ffill": "ffill", "pad": "ffill", "bfill": "bfill", "backfill": "bfill"}


def _fill_method(call: PandasCall, ctx: RuleContext) -> Value | None:
    """fillna(method="ffill" / "pad" / "bfill" / "backfill", limit=) as ffill() / bfill(),
    which is what it did before pandas 3 removed the keyword (the script fails on pandas 3;
    the port runs where pandas no longer does)."""
    if "method" not in call.kwargs:
        return None
    ctx.reject_unknown(call, "method", "limit")
    method = _FILL_METHODS.get(call.const("method", None, None, kinds=(str,)))
    if method is None:
        raise Unsupported("a fill method other than ffill, pad, bfill or backfill")
    kwargs = {"limit": call.kwargs["limit"]} if "limit" in call.kwargs else {}
    return fill_direction(replace(call, name=method, args=(), kwargs=kwargs), ctx)


@rule("series.fillna")
def series_fillna(call: PandasCall, ctx: RuleContext) -> Value:
    """s.fillna(v) -> .fill_null(v) (v may be a value, a column or a reduction).

    Caveats: a value of another type (text into numbers, numbers into text) makes a mixed
    object column in pandas: a TODO when the column type is known, lowered confidence when not.
    A fraction (a float reduction, a float column) into an int column is a TODO: pandas'
    int64 column holds no missing value and stays int64, where one holding a missing value is
    float64 and filled; a lazy plan cannot pick the type by the data (fraction_into_ints).
    """
    column = call.receiver
    assert isinstance(column, Column)
    filled = _fill_method(call, ctx)
    if filled is not None:
        return filled
    ctx.reject_unknown(call, "value", positional=1)
    value = call.arg("value", 0)
    if isinstance(value, Opaque) and _is_nan(value.const):
        return column  # pandas fills NaN with NaN: nothing (fill_null(nan) would fill them)
    if isinstance(value, Opaque) and value.is_const:
        if _mixes_types(value.const, column.dtype):
            raise Unsupported(f"filling {value.const!r} into a {column.dtype} column "
                              f"{MIXED_COLUMN}; Polars would turn every value into text")
        if column.dtype is None and _kind_of(value.const) in ("str", "number"):
            ctx.lower("the column type is not known: a fill value of another type makes a mixed "
                      "column in pandas, text in Polars", 0.85)
    if column.number and column.dtype is None and isinstance(column.name, str) \
            and column.code.text == emit.col(column.name).text and _number_fill(value):
        # numbers whose type the data decided (Frame.numbers: int64 where a merge matched every
        # row, float64 where it left one missing), Polars' type pandas' own: pandas fills an
        # int64 column with nothing and keeps it int64, where fill_null(0.5) would make it
        # Float64, so the column keeps its type (an Int64 column has no null to fill)
        code = column.code.method("fill_null", fill_value(value, column.frame, ctx))
        if not _int_fill(value):  # filled with an int, Int64 stays Int64 and Float64 Float64
            code = code.method("cast", emit.pl("dtype_of", column.name))
        return replace(derived_column(column, code, others=[value]), number=True)
    dtype = column.dtype
    if column.dtype == "int" and isinstance(value, Opaque) and isinstance(value.const, float) \
            and value.const.is_integer():
        # fill_null(3.0) would make the column float; pandas' int64 column (nothing to fill)
        # stays integer: fill with the whole number
        code = column.code.method("fill_null", int(value.const))
    else:
        if column.dtype == "int" and column.float_int is None:
            name = f"`{column.name or '?'}`"
            if _float_fill(value):
                what = "a float column" if isinstance(value, Column) else "a fraction"
                raise Unsupported(fraction_into_ints(what, name))
            if _untyped_fill(value):
                ctx.lower(f"`{_short(value)}` is of a type porter does not know: if it is "
                          + fraction_into_ints("a fraction", name), 0.8)
        code = column.code.method("fill_null", fill_value(value, column.frame, ctx))
        if column.dtype == "int" and _float_fill(value):
            # an int column pandas holds as float64 when a step left a value missing
            # (float_int): filled, it is float (lost_float_ints says what differs)
            _int_filled_with_float(column.name, ctx)
            dtype = "float"
    return derived_column(column, code, dtype=dtype, others=[value])


def fraction_into_ints(what: str, names: str) -> str:
    """Why a fraction filled into an int column is not ported: the type of pandas' result
    depends on the data."""
    return (f"{what} filled into the integer column {names}: pandas' "
            "int64 column holds no missing value, so pandas fills nothing and it stays int64 "
            "(written 4); where it holds a missing value it is float64, filled (4.0, 0.5). "
            "Polars must pick the type before it sees the data: fill_null makes it Float64 "
            "either way")


def _plain_ints(frame: Frame) -> list[str]:
    """The frame's int columns that pandas holds as int64 (no missing value): not those a step
    may have made float64 (Frame.float_ints), named as the messages name them."""
    marked = dict(frame.float_ints)
    return [f"`{c}`" for c, t in frame.dtypes if t == "int" and c not in marked]


def _untyped_fill(value: Value) -> bool:
    """A fill value whose type porter does not know (a name, a reduction of unknown type):
    it may be a fraction."""
    if isinstance(value, Opaque):
        return not value.is_const and value.pytype not in ("int", "bool", "str")
    return isinstance(value, Scalar) and value.pytype not in ("int", "bool", "str", "float")


def _short(value: Value) -> str:
    text = value.code.text
    return text if len(text) <= 40 else text[:37] + "..."


def _number_fill(value: Value) -> bool:
    """A fill value that is a number: an int or a float, as a constant, a scalar or a column."""
    if isinstance(value, Opaque) and value.is_const:
        return isinstance(value.const, (int, float)) and not isinstance(value.const, bool)
    return isinstance(value, Column) and (value.dtype in ("int", "float") or value.number) \
        or isinstance(value, Scalar) and value.pytype in ("int", "float")


def _int_fill(value: Value) -> bool:
    """A fill value that is a whole number of an integer type, as a constant, a scalar or a
    column: filled into an Int64 or a Float64 column, it keeps the column's type."""
    if isinstance(value, Opaque) and value.is_const:
        return isinstance(value.const, int) and not isinstance(value.const, bool)
    return isinstance(value, Column) and value.dtype == "int" \
        or isinstance(value, Scalar) and value.pytype == "int"


def _float_fill(value: Value) -> bool:
    """A fill value that makes Polars' integer column Float64: a float, or a float column or
    scalar."""
    if isinstance(value, Opaque) and value.is_const:
        return isinstance(value.const, float)
    return isinstance(value, Column) and value.dtype == "float" \
        or isinstance(value, Scalar) and value.pytype == "float"


def _int_filled_with_float(name: str | None, ctx: RuleContext) -> None:
    ctx.lower(f"pandas fills `{name or 'the column'}` only where it holds a missing value (a "
              "float64 column then): an int64 column with nothing to fill stays integer (4), "
              "where Polars makes it Float64 (4.0)", 0.9)


@rule("series.combine_first")
def series_combine_first(call: PandasCall, ctx: RuleContext) -> Value:
    """s.combine_first(other) -> .fill_null(other), other a column of the same rows (or a
    value).

    Handles: a missing value of s takes other's on the same row, as pandas' alignment on the
    same labels does.
    Caveats: a Series of another frame (or of other rows: pandas aligns it on the labels and
    keeps the labels of both) is a TODO; other of another kind (text into numbers) makes a
    mixed column in pandas: a TODO when the types are known.
    """
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call, "other", positional=1)
    other = call.arg("other", 0)
    if not isinstance(other, Column):
        raise Unsupported("combine_first with something other than a column of the same rows")
    kinds = {column.dtype, other.dtype}
    if None not in kinds and len(kinds) > 1 and kinds != {"int", "float"}:
        raise Unsupported(f"a {other.dtype} column into a {column.dtype} one {MIXED_COLUMN}")
    code = column.code.method("fill_null", fill_value(other, column.frame, ctx))
    dtype = column.dtype if len(kinds) == 1 else "float" if kinds == {"int", "float"} else None
    return derived_column(column, code, dtype=dtype, others=[other])


def _fill_each_column(frame: Frame, node: cst.Dict, ctx: RuleContext) -> Value:
    """df.fillna({"m": df["m"].median(), "d": pd.Timestamp(...), "k": "none"}): each column
    filled with its own value; a computed one only where its type is the column's (a number
    into a float column, a date into a datetime column)."""
    from porter.rules.assign import with_columns
    items = []
    for element in node.elements:
        if not isinstance(element, cst.DictElement):
            raise Unsupported("a dict of fill values unpacked from another (**)")
        key = ctx.evaluate(element.key, {})
        if not (isinstance(key, Opaque) and isinstance(key.const, str)):
            raise Unsupported("a dict of fill values whose keys are not names written out")
        name = key.const
        if frame.columns is not None and name not in frame.columns or name in frame.index:
            continue  # pandas ignores names that are not columns (an index's are not)
        dtype = frame.dtype(name)
        value = ctx.evaluate(element.value, {})
        if isinstance(value, Opaque) and value.is_const and not isinstance(value.const, (dict, list)):
            if _mixes_types(value.const, dtype):
                raise Unsupported(f"filling {value.const!r} into the {dtype} column {name!r} "
                                  f"{MIXED_COLUMN}")
            fill = emit.as_expr(value.const)
        elif isinstance(value, Scalar) and (dtype == "float" and value.pytype in ("int", "float")
                                            or dtype == "datetime" and value.pytype == "datetime"):
            fill = ctx.expr(value, frame)
        else:
            written = cst.Module([]).code_for_node(element.value)
            raise Unsupported(f"filling the {dtype or 'untyped'} column {name!r} with "
                              f"`{written}`, a value porter cannot type")
        items.append((name, emit.col(name).method("fill_null", fill), dtype))
    if frame.columns is None:
        ctx.lower("the columns are not known: a name that is not a column is ignored by "
                  "pandas and an error in Polars", 0.9)
    return with_columns(frame, items)


# the columns Polars' DataFrame.fill_null(value) fills, by the value's Python type
_FILLED_BY_TYPE = {bool: "pl.selectors.boolean()", int: "pl.selectors.numeric()",
                   float: "pl.selectors.numeric()", str: "pl.selectors.by_dtype(pl.String, pl.Categorical)"}


def _fill_columns(frame: Frame, value: object) -> Code:
    """frame.fill_null(value): the columns whose type can hold the value filled; of a frame
    holding pandas' index in columns (a groupby's keys), never those: pandas fills the
    columns only."""
    if not frame.index:
        return frame.code.method("fill_null", value)
    selector = _FILLED_BY_TYPE.get(type(value))
    if selector is None:
        raise Unsupported(f"filling {value!r} into a frame that holds its index in columns")
    return frame.code.method("with_columns", without_index(emit.atom(selector), frame).method("fill_null", value))


@rule("frame.fillna")
def frame_fillna(call: PandasCall, ctx: RuleContext) -> Value:
    """df.fillna(v) -> .fill_null(v); df.fillna({"a": 0}) -> per-column fill_null.

    Handles: a plain value fills the columns whose type can hold it (Polars' fill_null with a
    Python value); a computed value (a reduction) fills the numeric columns only, where Polars
    would otherwise turn every other column into that type; names in a dict that are not
    columns are ignored, as pandas ignores them.
    Caveats: pandas also writes a number into text columns (and text into numbers), making them
    object: lowered confidence when such columns exist or their types are unknown; a TODO for
    a dict entry whose value does not fit its known column type, and for a fraction (or a
    float reduction) where int columns are known (fraction_into_ints).
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    filled = _fill_method(call, ctx)
    if filled is not None:
        return filled
    ctx.reject_unknown(call, "value", positional=1)
    value = call.arg("value", 0)
    if isinstance(value, Opaque) and isinstance(value.const, dict):
        from porter.rules.assign import with_columns
        items = []
        for name, v in value.const.items():
            if frame.columns is not None and name not in frame.columns or name in frame.index:
                continue  # pandas ignores names that are not columns (an index's are not)
            if _mixes_types(v, frame.dtype(name)):
                raise Unsupported(f"filling {v!r} into the {frame.dtype(name)} column {name!r} "
                                  f"{MIXED_COLUMN}")
            dtype = frame.dtype(name)
            if dtype == "int" and isinstance(v, float) and v.is_integer():
                v = int(v)  # pandas' int64 column stays integer (as the whole-frame fill below)
            elif dtype == "int" and isinstance(v, float):
                if name not in dict(frame.float_ints):
                    raise Unsupported(fraction_into_ints("a fraction", f"`{name}`"))
                _int_filled_with_float(name, ctx)
                dtype = "float"
            items.append((name, emit.col(name).method("fill_null", emit.as_expr(v)), dtype))
        if frame.columns is None:
            ctx.lower("the columns are not known: a name that is not a column is ignored by "
                      "pandas and an error in Polars", 0.9)
        return with_columns(frame, items)
    if isinstance(value, (Opaque, PandasValue)) and not (isinstance(value, Opaque) and value.is_const) \
            and value.code.text.lstrip().startswith(("{", "[")):
        # a dict (or list) whose values are not all constants (a reduction, pd.Timestamp(...)):
        # not one fill value for the numeric columns
        node = call.first_node("value")
        if not isinstance(node, cst.Dict):
            raise Unsupported("a dict or list of fill values that are not all constants")
        return _fill_each_column(frame, node, ctx)
    complete = frame.columns is not None and len(frame.dtypes) == len(frame.columns)
    from porter.translate.context import number_cells
    pivoted, cells = number_cells(frame)
    if pivoted and cells == "float" and frame.index and isinstance(value, Opaque) \
            and type(value.const) in (int, float) and not _is_nan(value.const):
        # a pivoted table of float cells (crosstab with values, unstack): every column but
        # the keys holds numbers, so the fill is theirs alone; still a table of float cells
        cells_code = emit.pl("exclude", *frame.index)
        code = frame.code.method("with_columns", cells_code.method("fill_null", value.const)
                                 .method("fill_nan", value.const))
        return replace(derive(frame, code, same_rows=True), number_cells=(code.text, "float"))
    if isinstance(value, Opaque) and _is_nan(value.const):
        return derive(frame, frame.code, same_rows=True)  # pandas fills NaN with NaN: nothing
    if isinstance(value, Opaque) and value.is_const and not isinstance(value.const, (dict, list)):
        # A Python value (not pl.lit): Polars fills only the columns whose type can hold it.
        code = _fill_columns(frame, value.const)
        if isinstance(value.const, float) and value.const.is_integer():
            # fill_null(0.0) would make every integer column float; pandas' int64 columns
            # (no missing value) stay integers: fill them with the whole number
            code = frame.code.method(
                "with_columns",
                without_index(emit.atom("pl.selectors.float()"), frame).method("fill_null", value.const),
                without_index(emit.atom("pl.selectors.integer()"), frame).method("fill_null", int(value.const)))
        elif isinstance(value.const, float):
            plain = _plain_ints(frame)
            if plain:
                raise Unsupported(fraction_into_ints("a fraction", ", ".join(plain)))
            ints = [c for c, t in frame.dtypes if t == "int"]
            if ints or not complete:
                _int_filled_with_float(", ".join(ints) if ints else "an integer column", ctx)
            # Polars' fill_null(0.5) makes the integer columns Float64
            frame = replace(frame, dtypes=tuple((c, "float" if t == "int" else t)
                                                for c, t in frame.dtypes))
        others = [c for c, t in frame.dtypes if _mixes_types(value.const, t) and c not in frame.index]
        if others and _kind_of(value.const) == "number" \
                and all(frame.dtype(c) == "str" for c in others):
            # pandas writes the number into the text columns too (they become object);
            # Polars' fill_null(number) leaves them missing: fill them with its text
            code = code.method("with_columns", without_index(emit.atom("pl.selectors.string()"), frame).method(
                "fill_null", str(value.const)))
            ctx.lower(f"pandas holds the number {value.const!r} among the texts of "
                      f"{', '.join(others)} (an object column); Polars the text "
                      f"{str(value.const)!r}: the same in a written file, not to code that "
                      "compares or computes with the column", 0.5)
            others = []
        elif others:
            raise Unsupported(f"pandas also fills {', '.join(others)} with {value.const!r}, "
                              "making object columns of mixed types; Polars cannot mix them")
        elif not complete and _kind_of(value.const) == "number":
            # text columns porter does not know of (a frame back from pandas): pandas writes
            # the number into them too; the string selector finds them when the plan runs
            code = code.method("with_columns", without_index(emit.atom("pl.selectors.string()"), frame).method(
                "fill_null", str(value.const)))
    else:
        plain = _plain_ints(frame)
        if plain and _float_fill(value):
            raise Unsupported(fraction_into_ints("a float", ", ".join(plain)))
        if plain and _untyped_fill(value):
            ctx.lower(f"`{_short(value)}` is of a type porter does not know: if it is "
                      + fraction_into_ints("a fraction", ", ".join(plain)), 0.8)
        code = frame.code.method("with_columns", without_index(emit.atom("pl.selectors.numeric()"), frame).method(
            "fill_null", fill_value(value, frame, ctx)))
        others = [c for c, t in frame.dtypes if t not in ("int", "float") and c not in frame.index]
    if others:
        ctx.lower(f"pandas also fills {', '.join(others)} (making object columns); Polars leaves "
                  "them missing", 0.7)
    elif not complete:
        ctx.lower("pandas also fills columns of another type (making them object); Polars "
                  "fills only the columns whose type can hold the value", 0.85)
    return derive(frame, code, same_rows=True)


@rule("frame.ffill", "frame.bfill", "series.ffill", "series.bfill")
def fill_direction(call: PandasCall, ctx: RuleContext) -> Value:
    """ffill() / bfill() -> .forward_fill() / .backward_fill() (every column of a frame)."""
    ctx.reject_unknown(call, "limit")
    method = "forward_fill" if call.name == "ffill" else "backward_fill"
    limit = call.const("limit", None, None)
    limits = [limit] if limit is not None else []
    receiver = call.receiver
    if isinstance(receiver, Frame):
        # every column, never the index (a missing key held as a column stays missing)
        every = without_index(emit.atom("pl.selectors.all()"), receiver) if receiver.index else emit.pl("all")
        code = receiver.code.method("with_columns", every.method(method, *limits))
        return derive(receiver, code, same_rows=True)
    assert isinstance(receiver, Column)
    return derived_column(receiver, receiver.code.method(method, *limits), dtype=receiver.dtype)


@rule("series.interpolate")
def interpolate(call: PandasCall, ctx: RuleContext) -> Value:
    """s.interpolate() -> .interpolate().forward_fill(): straight lines between the values
    present, by position (method="linear" ignores the index, as Polars does).

    Handles: pandas (limit_direction="forward") also fills the trailing missing values with
    the last value present and leaves the leading ones missing, where Polars' interpolate
    leaves both: forward_fill() after it fills only the trailing ones.
    limit_direction="backward" fills the leading ones instead (backward_fill), "both" both;
    limit_area="inside" fills neither.
    Caveats: an integer column without missing values stays integer in pandas and becomes
    float in Polars (same values): lowered confidence where the column may be integer. Other
    methods, limit= and limit_area="outside" are TODOs.
    """
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call, "method", "limit_direction", "limit_area", "axis", positional=1)
    method = call.const("method", 0, "linear", kinds=(str,))
    if method != "linear":
        raise Unsupported(f'method="{method}"')
    if call.const("axis", None, 0, kinds=(int, str)) not in (0, "index", "rows"):
        raise Unsupported("interpolating along the other axis")
    direction = call.const("limit_direction", None, None, kinds=(str,))
    area = call.const("limit_area", None, None, kinds=(str,))
    if direction not in (None, "forward", "backward", "both") or area not in (None, "inside"):
        raise Unsupported(f"limit_direction={direction!r}, limit_area={area!r}")
    if column.dtype in ("str", "bool", "datetime", "date", "category", "enum"):
        raise Unsupported(f"interpolating a {column.dtype} column (pandas raises or keeps it "
                          "as objects)")
    if column.dtype == "int" and column.float_int is None and (
            column.nullable_int == NOT_NULLABLE
            or column.nullable_int is None and not ctx.nullable_ints_possible):
        # numpy's int64 holds no missing value: pandas' interpolate changes nothing and the
        # column stays int64 (4, 7, 5), where Polars' interpolate makes it float (4.0)
        return column
    if column.dtype != "float":
        ctx.lower("an integer column without missing values stays integer in pandas; Polars' "
                  "interpolate makes it float (the same values)", 0.98)
    code = column.code.method("interpolate")
    if area is None:
        if direction in (None, "forward", "both"):
            code = code.method("forward_fill")
        if direction in ("backward", "both"):
            code = code.method("backward_fill")
    return derived_column(column, code, dtype="float")
