"""Aggregation: groupby + agg / sum / mean / ... / size, and whole-column reductions,
value_counts, unique, nunique, describe."""

from __future__ import annotations

from typing import Any

from porter.emit import code as emit
from porter.emit.code import Code
from porter.rules import rule
from porter.rules.io_options import DIVIDE_FUNCTION
from porter.translate.context import (
    PandasCall, RuleContext, Unsupported, column_names, grouping_code,
)
from porter.translate.values import Column, Frame, Grouped, Module, Opaque, Scalar, Value

AGGREGATIONS = ("sum", "mean", "median", "min", "max", "std", "var", "count", "nunique",
                "first", "last", "size")
COUNTS = {"count", "nunique", "size"}


def agg_expr(column: Code, how: str, dtype: str | None = None) -> Code:
    """One pandas aggregation as a Polars expression, with pandas' treatment of missing values."""
    if how == "count":  # non-missing values; Int64 so later arithmetic cannot wrap around
        return column.method("count").method("cast", emit.atom("pl.Int64"))
    if how == "nunique":  # pandas does not count missing values
        return column.method("drop_nulls").method("n_unique").method("cast", emit.atom("pl.Int64"))
    if how in ("first", "last"):  # pandas skips missing values
        return column.method(how, ignore_nulls=True)
    if how == "sum" and dtype == "str":  # pandas concatenates text
        return column.attr("str").method("join", "")
    if how == "builtin_sum":  # Python's sum meets NaN: the group's sum is NaN
        return emit.when(emit.binop(column.method("null_count"), "==", 0), column.method("sum"))
    if how in ("builtin_min", "builtin_max"):
        # Python's min/max keep a NaN met first (nothing compares above it) and skip later ones
        return emit.when(column.method("first").method("is_not_null"), column.method(how[8:]))
    if how in ("sum", "mean", "median", "min", "max", "std", "var"):
        return column.method(how)
    raise Unsupported(f"aggregation {how!r}")


def how_name(value: Value) -> str:
    if isinstance(value, Opaque) and isinstance(value.const, str):
        return value.const
    if isinstance(value, Module):
        return value.qualname.rsplit(".", 1)[-1]
    if isinstance(value, Opaque) and value.code.text in ("sum", "min", "max", "len"):
        # pandas 3 calls a Python builtin on each group's values (NaN included)
        return {"len": "size"}.get(value.code.text, f"builtin_{value.code.text}")
    raise Unsupported(f"aggregation {value.code.text} (a function porter cannot read)")


def grouped_of(call: PandasCall) -> Grouped:
    assert isinstance(call.receiver, Grouped)
    return call.receiver


@rule("frame.groupby")
def groupby(call: PandasCall, ctx: RuleContext) -> Value:
    """df.groupby(keys, sort, dropna, as_index) -> a pending group_by.

    Handles: rows with a missing key are dropped (dropna=True); keys sorted (sort=True) or in
    order of first appearance (sort=False); keys as the index (as_index=True).
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "by", "sort", "dropna", "as_index", "observed", positional=1)
    by = call.arg("by", 0)
    if isinstance(by, Column) and by.name is not None and by.code.text == emit.col(by.name).text:
        keys: list[str] = [by.name]
    else:
        keys_const = call.const("by", 0)
        keys = column_names(keys_const, "the group keys")
    if not all(isinstance(k, str) for k in keys):
        raise Unsupported("grouping by something other than column names")
    if call.const("observed", None, True) is not True:
        raise Unsupported("observed=False adds unseen categories")
    if any(frame.dtype(k) == "category" for k in keys):
        ctx.lower("category keys sort by their categories in pandas; porter sorts by text, which "
                  "is the same for categories made by astype('category')", 0.9)
    return Grouped(frame.code, frame=frame, keys=tuple(keys),
                   sort=bool(call.const("sort", None, True)),
                   dropna=bool(call.const("dropna", None, True)),
                   as_index=bool(call.const("as_index", None, True)))


@rule("groupby.getitem")
def groupby_getitem(call: PandasCall, ctx: RuleContext) -> Value:
    """g["kg"] / g[["kg", "price"]] -> the columns to aggregate."""
    grouped = grouped_of(call)
    key = call.args[0]
    if isinstance(key, Opaque) and isinstance(key.const, str):
        return Grouped(grouped.code, frame=grouped.frame, keys=grouped.keys, sort=grouped.sort,
                       dropna=grouped.dropna, as_index=grouped.as_index, selection=(key.const,),
                       single=True, prepared=grouped.prepared)
    if isinstance(key, Opaque) and isinstance(key.const, list):
        return Grouped(grouped.code, frame=grouped.frame, keys=grouped.keys, sort=grouped.sort,
                       dropna=grouped.dropna, as_index=grouped.as_index,
                       selection=tuple(key.const), single=False, prepared=grouped.prepared)
    raise Unsupported("selecting group columns by a computed key")


def agg_dtype(how: str, dtype: str | None) -> str | None:
    """porter's dtype name of an aggregate of a column of `dtype` (None: not known)."""
    if how in COUNTS:
        return "int"
    if how in ("mean", "median", "std", "var"):
        return "float" if dtype in ("int", "float", "bool") else None
    if how in ("sum", "builtin_sum"):
        return {"bool": "int", "int": "int", "float": "float", "str": "str"}.get(dtype or "")
    if how in ("min", "max", "first", "last", "builtin_min", "builtin_max"):
        return dtype if dtype in ("int", "float", "str", "bool", "datetime", "date") else None
    return None


def aggregate(grouped: Grouped, exprs: list[Code], names: list[str], ctx: RuleContext,
              *, series_name: str | None = None, is_series: bool = False,
              dtypes: list[str | None] | None = None) -> Value:
    """The frame of aggregates, sorted like pandas, as a frame or (for one column) a Series.

    `dtypes` are the aggregates' types where known (agg_dtype); the keys keep theirs."""
    code = grouping_code(grouped).method("agg", *exprs)
    keys = list(grouped.keys)
    if grouped.sort:
        # keys are unique after grouping, so the sort is total; a kept null key sorts last
        kwargs = {} if grouped.dropna else {"nulls_last": True}
        code = code.method("sort", emit.names_arg(keys), **kwargs)
    columns = (*keys, *names)
    index = tuple(keys) if grouped.as_index else ()
    known = [(k, grouped.frame.dtype(k)) for k in keys]
    known += list(zip(names, dtypes or [None] * len(names)))
    frame = Frame(code, columns=columns, index=index, labels_intact=not grouped.as_index,
                  dtypes=tuple((c, t) for c, t in known if t is not None))
    if is_series and grouped.as_index:
        name = series_name
        return Column(emit.col(name if name is not None else names[0]), frame=frame,
                      name=name, refs=frozenset(names), dtype=frame.dtype(names[0]))
    return frame


def target_columns(grouped: Grouped, ctx: RuleContext) -> list[str] | None:
    if grouped.selection is not None:
        return list(grouped.selection)
    if grouped.frame.columns is not None:
        return [c for c in grouped.frame.columns if c not in grouped.keys]
    return None


@rule(*(f"groupby.{how}" for how in AGGREGATIONS))
def reduce(call: PandasCall, ctx: RuleContext) -> Value:
    """GroupBy.sum / mean / median / min / max / ... / size -> aggregations in LazyGroupBy.agg.

    The reductions: sum, mean, median, min, max, std, var, count, nunique, first, last, size.

    Handles: missing values skipped by first/last/nunique/count; counts as Int64; keys sorted.
    """
    grouped = grouped_of(call)
    how = call.name
    allowed = {"numeric_only", "ddof"} if how in ("std", "var") else {"numeric_only"}
    ctx.reject_unknown(call, *allowed)
    if call.const("numeric_only", None, False):
        raise Unsupported("numeric_only=True needs the column types")
    if how == "size":
        expr = emit.pl("len").method("cast", emit.atom("pl.Int64"))
        if grouped.as_index:
            # g.size() is an unnamed Series; g["qty"].size() is named after the column
            name = grouped.selection[0] if grouped.single and grouped.selection else None
            return aggregate(grouped, [expr.method("alias", name or "size")], [name or "size"], ctx,
                             series_name=name, is_series=True, dtypes=["int"])
        return aggregate(grouped, [expr.method("alias", "size")], ["size"], ctx, dtypes=["int"])
    ddof = call.const("ddof", None, 1)
    columns = target_columns(grouped, ctx)
    if columns is None:
        ctx.lower("the non-key columns are not known: text columns would fail in Polars "
                  "(pandas concatenates or raises); run with --data to know them", 0.85)
        expr = agg_expr(emit.pl("all"), how)
        if how in ("std", "var") and ddof != 1:
            expr = emit.pl("all").method(how, ddof=ddof)
        return aggregate(grouped, [expr], [], ctx)
    exprs = []
    for name in columns:
        expr = agg_expr(emit.col(name), how, grouped.frame.dtype(name))
        if how in ("std", "var") and ddof != 1:
            expr = emit.col(name).method(how, ddof=ddof)
        exprs.append(expr)
    single = grouped.single and len(columns) == 1
    dtypes = [agg_dtype(how, grouped.frame.dtype(name)) if ddof == 1 or how not in ("std", "var")
              else "float" for name in columns]
    return aggregate(grouped, exprs, columns, ctx, series_name=columns[0] if single else None,
                     is_series=single, dtypes=dtypes)


@rule("groupby.agg", "groupby.aggregate")
def agg(call: PandasCall, ctx: RuleContext) -> Value:
    """GroupBy.agg -> LazyGroupBy.agg: g.agg(total=("kg", "sum")), g.agg({"kg": "sum"}),
    g["kg"].agg(["sum", "mean"]), g.agg("sum").

    Handles: output names as pandas makes them; a dict of lists gives MultiIndex columns in
    pandas, flattened here to "kg_sum" for every output (documented); g["kg"].agg(total="sum");
    the Python builtins sum / min / max, which pandas 3 calls on each group's values (a
    missing value makes sum NaN; one met first is min and max), and len (the group size).
    """
    grouped = grouped_of(call)
    exprs: list[Code] = []
    names: list[str] = []
    dtypes: list[str | None] = []

    def add(column: str, how: str, name: str) -> None:
        if how == "size":
            expr = emit.pl("len").method("cast", emit.atom("pl.Int64"))
        else:
            expr = agg_expr(emit.col(column), how, grouped.frame.dtype(column))
        exprs.append(expr.method("alias", name))
        names.append(name)
        dtypes.append(agg_dtype(how, grouped.frame.dtype(column)))

    if call.kwargs and not call.args:
        selected = grouped.selection[0] if grouped.single and grouped.selection else None
        for name, spec in call.kwargs.items():
            if selected is not None and not (isinstance(spec, Opaque) and isinstance(spec.const, tuple)):
                add(selected, how_name(spec), name)  # g["kg"].agg(total="sum")
                continue
            if not (isinstance(spec, Opaque) and isinstance(spec.const, tuple) and len(spec.const) == 2):
                raise Unsupported("named aggregation needs (column, function) pairs")
            column, how = spec.const
            add(column, how_name(Opaque(emit.lit(how), const=how)), name)
        return aggregate(grouped, exprs, names, ctx, dtypes=dtypes)
    if len(call.args) != 1 or call.kwargs:
        raise Unsupported("agg with extra arguments")
    spec_value = call.args[0]
    spec: Any = spec_value.const if isinstance(spec_value, Opaque) and spec_value.is_const else None
    if isinstance(spec, dict):
        # any list makes every output a (column, function) pair in pandas: flatten them all
        flattened = any(isinstance(hows, list) for hows in spec.values())
        for column, hows in spec.items():
            for how in hows if isinstance(hows, list) else [hows]:
                add(column, how, f"{column}_{how}" if flattened else column)
        if flattened:
            ctx.lower("pandas makes MultiIndex columns here; porter names them column_function", 0.9)
        return aggregate(grouped, exprs, names, ctx, dtypes=dtypes)
    if isinstance(spec, list):
        columns = target_columns(grouped, ctx)
        if columns is None or len(columns) != 1:
            raise Unsupported("a list of functions over several columns makes MultiIndex columns")
        for how in spec:
            add(columns[0], str(how), str(how))
        return aggregate(grouped, exprs, names, ctx, dtypes=dtypes)
    how = how_name(spec_value)
    if how.startswith("builtin_"):
        columns = target_columns(grouped, ctx)
        if columns is None:
            raise Unsupported("a Python builtin over columns porter does not know")
        for column in columns:
            add(column, how, column)
        single = grouped.single and len(columns) == 1
        return aggregate(grouped, exprs, names, ctx, series_name=columns[0] if single else None,
                         is_series=single, dtypes=dtypes)
    forward = PandasCall(grouped, how, (), {}, call.node)
    if how not in AGGREGATIONS:
        raise Unsupported(f"aggregation {how!r}")
    return reduce(forward, ctx)


# -- whole-column reductions ------------------------------------------------------------------

def scalar_of(column: Column, expr: Code, pytype: str | None = None, *,
              collected: Code | None = None) -> Scalar:
    """A reduction of a column: `expr` inside expressions of its frame, `collected` (default
    `expr`) as the Python value."""
    code = column.frame.code.method("select", collected if collected is not None else expr) \
        .method("collect").method("item")
    agg_column = Column(expr, frame=column.frame, name=column.name, refs=column.refs,
                        versions=column.versions)
    if collected is not None and collected != expr:
        # the Python value is NaN where pandas' is; marked float, it is made null again inside
        # another frame's expressions (context.expr_in)
        return Scalar(code, pytype="float", agg=agg_column)
    return Scalar(code, pytype=pytype, agg=agg_column)


@rule(*(f"series.{how}" for how in ("sum", "mean", "median", "min", "max", "std", "var", "count",
                                   "nunique")))
def series_reduce(call: PandasCall, ctx: RuleContext) -> Value:
    """s.sum() / mean / median / min / max / std / var / count / nunique -> a Python scalar.

    Handles: missing values are skipped (nunique does not count them); std/var with ddof=1;
    the mean, median, std, var (and the min and max of a float column) of no values (an empty
    selection, only missing values, the std of one value) are NaN in pandas and None in
    Polars: the Python value is made NaN (fill_null(float("nan"))).
    Caveats: the min/max of no values of an integer, boolean or unknown-type column is NaN in
    pandas and None here (a NaN fill would make every result float) (0.98); so is the mean
    of a column of unknown type (0.98).
    """
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call, "ddof", "skipna", "numeric_only")
    if call.const("skipna", None, True) is not True:
        raise Unsupported("skipna=False")
    how = call.name
    code = ctx.bool_expr(column, column.frame) if column.dtype == "bool" else column.code
    if how in ("std", "var"):
        expr = code.method(how, ddof=call.const("ddof", None, 1))
    elif how in ("count", "nunique"):
        expr = agg_expr(code, how)
    else:
        expr = code.method(how)
    if how in NAN_WHEN_EMPTY:
        return scalar_of(column, expr, collected=_nan_when_empty(column, how, expr, ctx))
    return scalar_of(column, expr)


NAN_WHEN_EMPTY = ("mean", "median", "min", "max", "std", "var", "quantile")


def _nan_when_empty(column: Column, how: str, expr: Code, ctx: RuleContext) -> Code:
    """pandas' mean, median, min, ... of no values is NaN; Polars gives None. Where the result
    is a float in Polars too, the Python value is filled with NaN (only the collected value:
    inside expressions porter keeps missing as null)."""
    float_result = column.dtype == "float" if how in ("min", "max") \
        else column.dtype in ("int", "float", "bool")
    if float_result:
        return expr.method("fill_null", emit.call("float", "nan"))
    what = "an integer or boolean" if column.dtype in ("int", "bool") else \
        "an unknown-type" if column.dtype is None else f"a {column.dtype}"
    missing = "NaT" if column.dtype in ("datetime", "date") else "NaN"
    ctx.lower(f"the {how} of no values (an empty selection or only missing values) of {what} "
              f"column is {missing} in pandas and None here", 0.98)
    return expr


@rule("series.value_counts")
def value_counts(call: PandasCall, ctx: RuleContext) -> Value:
    """s.value_counts() -> counts by value, most frequent first, ties in order of appearance.

    Handles: missing values not counted (dropna=True); normalize=True gives "proportion";
    ascending=True.
    """
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call, "normalize", "sort", "ascending", "dropna")
    name = column.name
    if name is None:
        raise Unsupported("counting an unnamed Series")
    frame = column.frame.code.method("select", column.code if column.code.text == emit.col(name).text
                                     else column.code.method("alias", name))
    if call.const("dropna", None, True):
        frame = frame.method("drop_nulls")
    counts = frame.method("group_by", name, maintain_order=True).method(
        "agg", emit.pl("len").method("cast", emit.atom("pl.Int64")).method("alias", "count"))
    result_name = "count"
    if call.const("normalize", None, False):
        # divided value by value, as pandas divides (see series.arith)
        counts = counts.method("select", emit.col(name), emit.call(
            DIVIDE_FUNCTION, emit.col("count"), emit.col("count").method("sum")).method("alias", "proportion"))
        result_name = "proportion"
    if call.const("sort", None, True):
        descending = not call.const("ascending", None, False)
        kwargs: dict[str, object] = {"descending": True} if descending else {}
        counts = counts.method("sort", result_name, **kwargs, maintain_order=True)
    result = Frame(counts, columns=(name, result_name), index=(name,), labels_intact=False)
    return Column(emit.col(result_name), frame=result, name=result_name, dtype="int",
                  refs=frozenset({result_name}))


@rule("series.unique")
def unique(call: PandasCall, ctx: RuleContext) -> Value:
    """s.unique() -> the distinct values in order of first appearance (a Polars Series).

    Caveats: a missing value shows as None where pandas shows nan.
    """
    column = call.receiver
    assert isinstance(column, Column)
    code = column.frame.code.method("select", column.code.method("unique", maintain_order=True)) \
        .method("collect").method("to_series")
    return Scalar(code, pytype="series")


@rule("frame.describe")
def describe(call: PandasCall, ctx: RuleContext) -> Value:
    """df.describe() -> count, mean, std, min, 25%, 50%, 75%, max of the numeric columns.

    Handles: percentiles interpolated linearly like pandas (Polars' default is "nearest");
    booleans and text left out like pandas; the statistics as a column named "index" (pandas
    keeps them in an unnamed index, which reset_index() names "index").
    Caveats: to_csv with the index writes the header "" (quoted) where pandas writes nothing.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call)
    numeric = emit.atom("pl.selectors.numeric()")
    as_float = emit.atom("pl.Float64")
    stats: list[tuple[str, Code]] = [
        ("count", numeric.method("count").method("cast", as_float)),
        ("mean", numeric.method("mean")),
        ("std", numeric.method("std")),
        ("min", numeric.method("min").method("cast", as_float)),
        ("25%", numeric.method("quantile", 0.25, "linear")),
        ("50%", numeric.method("quantile", 0.5, "linear")),
        ("75%", numeric.method("quantile", 0.75, "linear")),
        ("max", numeric.method("max").method("cast", as_float)),
    ]
    # pandas keeps the statistic names in an unnamed index, which reset_index() names "index"
    parts = [frame.code.method("select", emit.pl("lit", name).method("alias", "index"), expr)
             for name, expr in stats]
    code = emit.pl("concat", parts)
    if frame.columns is not None and len(frame.dtypes) == len(frame.columns) and not any(
            t in ("int", "float") for _, t in frame.dtypes):
        raise Unsupported("describe of a frame without numeric columns describes text in pandas")
    numeric_cols = tuple(c for c in frame.columns or () if frame.dtype(c) in ("int", "float")) or None
    columns = ("index", *numeric_cols) if numeric_cols else None
    return Frame(code, columns=columns, index=("index",), labels_intact=False, index_unnamed=True)



@rule("series.quantile")
def series_quantile(call: PandasCall, ctx: RuleContext) -> Value:
    """Series.quantile(q) -> select(expr.quantile(q, "linear")).collect().item().

    Handles: pandas interpolates linearly (Polars' default is "nearest").
    Caveats: a list of quantiles (a Series in pandas) is a TODO.
    """
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call, "q", "interpolation", positional=1)
    q = call.const("q", 0, 0.5)
    if not isinstance(q, (int, float)) or isinstance(q, bool):
        raise Unsupported("several quantiles at once")
    method = call.const("interpolation", None, "linear")
    if method not in ("linear", "lower", "higher", "nearest", "midpoint"):
        raise Unsupported(f"interpolation={method!r}")
    expr = column.code.method("quantile", q, method)
    return scalar_of(column, expr, collected=_nan_when_empty(column, "quantile", expr, ctx))


@rule("series.any", "series.all")
def series_any_all(call: PandasCall, ctx: RuleContext) -> Value:
    """Series.any() / all() -> select(expr.any() / expr.all()).collect().item().

    Handles: missing values are skipped (pandas' skipna=True); a comparison that met a missing
    value counts as False; numbers are true when not zero.
    """
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call, "skipna")
    if call.const("skipna", None, True) is not True:
        raise Unsupported("skipna=False counts missing values as true")
    if column.dtype == "bool":
        code = ctx.bool_expr(column, column.frame)
    elif column.dtype in ("int", "float"):
        code = column.code.method("cast", emit.atom("pl.Boolean"))
    else:
        raise Unsupported("any/all of a column whose type porter does not know (text is true "
                          "when not empty in pandas)")
    return scalar_of(column, code.method(call.name), pytype="bool")


@rule("frame.pivot_table")
def pivot_table(call: PandasCall, ctx: RuleContext) -> Value:
    """df.pivot_table(index, columns, values, aggfunc, fill_value) -> group_by the keys, then
    the collected groups pivoted (the new columns are the data's own values).

    Handles: rows with a missing key are dropped and groups whose mean / median / min / max is
    missing too, as pandas drops them; the new columns come in the order of their values
    (sorted before the pivot: Polars names them as text) and the rows sorted by the index
    keys; fill_value fills the missing cells; the index keys stay label columns.
    Caveats: one values column and one columns key; sum, count, min and max without a
    fill_value are TODOs (pandas turns the cells float when one is missing); margins,
    dropna=False, sort=False and lists or dicts of functions are TODOs.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "values", "index", "columns", "aggfunc", "fill_value", "dropna",
                       "margins", "sort", "observed", positional=5)
    index = call.const("index", 1, None, kinds=(str, list, tuple))
    columns = call.const("columns", 2, None, kinds=(str, list, tuple))
    values = call.const("values", 0, None, kinds=(str, list, tuple))
    if isinstance(columns, (list, tuple)) and len(columns) == 1:
        columns = columns[0]
    if isinstance(values, (list, tuple)) and len(values) == 1:
        raise Unsupported("values given as a list: pandas keeps two levels of column labels")
    if not isinstance(columns, str) or not isinstance(values, str):
        raise Unsupported("one values column and one columns key only")
    keys = [index] if isinstance(index, str) else list(index or [])
    if not keys or not all(isinstance(k, str) for k in keys):
        raise Unsupported("a pivot without index keys")
    if call.const("margins", None, False) or not call.const("dropna", None, True) \
            or not call.const("sort", None, True):
        raise Unsupported("margins, dropna=False or sort=False")
    how = how_name(call.arg("aggfunc", 3)) if call.has("aggfunc", 3) else "mean"
    if how not in ("sum", "mean", "median", "min", "max", "count"):
        raise Unsupported(f"aggfunc {how!r}")
    fill = call.const("fill_value", 4, None)
    if fill is not None and (isinstance(fill, bool) or not isinstance(fill, (int, float))):
        raise Unsupported("a fill_value that is not a number")
    if fill is None and how not in ("mean", "median"):
        raise Unsupported(f"{how} without fill_value: pandas makes every cell float when one "
                          "is missing, which depends on the data")
    known = frame.columns
    absent = [c for c in (*keys, columns, values) if known is not None and c not in known]
    if absent:
        raise Unsupported(f"columns {absent} are not in the frame (pandas raises KeyError)")
    groups = [*keys, columns]
    code = frame.code.method("drop_nulls", groups).method("group_by", groups).method(
        "agg", agg_expr(emit.col(values), how, frame.dtype(values)))
    if how in ("mean", "median", "min", "max"):
        code = code.method("drop_nulls", values)  # pandas drops a group whose value is missing
    # the new columns appear in the order the pivot meets their values: sorted first
    code = code.method("sort", columns).method("collect").method(
        "pivot", on=columns, index=keys[0] if len(keys) == 1 else keys, values=values)
    code = code.method("sort", keys[0] if len(keys) == 1 else keys)
    if fill is not None:
        code = code.method("fill_null", fill)
    ctx.lower("the new columns are named by their values as text (pandas keeps the values)", 0.95)
    return Frame(code.method("lazy"), columns=None, index=tuple(keys), labels_intact=False)
