"""Reshaping: pd.crosstab, Series.unstack, melt / pd.melt, pd.get_dummies, pd.qcut.

A crosstab's columns and a get_dummies' columns are the data's own values, which a lazy plan
cannot list before it runs: like pivot_table, those rules collect the frame once and build the
new columns on the collected DataFrame, then go back to lazy.
"""

from __future__ import annotations

from dataclasses import replace
from typing import Any

import numpy as np

from porter.emit import code as emit
from porter.emit.code import Code
from porter.rules import rule
from porter.rules.groupby import agg_expr, how_name, pivot_groups, pivot_margins, pivot_sorted
from porter.rules.io import polars_dtype
from porter.rules.ops import float32_possible
from porter.rules.io_options import (
    COUNT_MARGINS_FUNCTION, DIVIDE_FUNCTION, QCUT_NUMBERS_FUNCTION, QUANTILE_FUNCTION,
)
from porter.translate.context import (
    MIXED_COLUMN, PandasCall, RuleContext, Unsupported, check_same_rows, column_names, derived_column,
)
from porter.translate.values import Column, Frame, Items, Opaque, PandasValue, Value, fresh_token

_NUMBER_TYPES = ("int", "float")


# -- crosstab -----------------------------------------------------------------------------------

def _series_list(value: Value, what: str) -> list[Column]:
    """The Series given as the crosstab's index or columns: one, or a list written out."""
    items = list(value.items) if isinstance(value, Items) else [value]
    if any(isinstance(v, PandasValue) for v in items):
        raise Unsupported(f"the {what} Series come from a frame an earlier statement left on "
                          "pandas")
    if not items or not all(isinstance(v, Column) and not v.element for v in items):
        raise Unsupported(f"the {what} are not columns of a frame porter tracks (arrays and "
                          "lists are labelled by position, which has no lazy form)")
    return items  # type: ignore[return-value]


def _key_names(call: PandasCall, name: str, position: int, series: list[Column],
               prefix: str) -> list[str]:
    given = call.const(name, position, None, kinds=(str, list, tuple))
    if given is not None:
        names = column_names(given, f"`{name}`")
        if len(names) != len(series):
            raise Unsupported(f"`{name}` does not name each Series (pandas raises)")
        return names
    names = []
    for i, s in enumerate(series):
        if s.name is None:
            # pandas would call it row_0 / col_0; porter cannot tell an unnamed Series from one
            # whose name it lost, so the names must be written out
            raise Unsupported(f"a Series without a name: pass {name}=[...]")
        names.append(s.name)
    return names


def _normalize_how(value: Any) -> str | None:
    if value is False:
        return None
    if value is True:
        return "all"
    found = {"all": "all", "index": "index", "columns": "columns", 0: "index", 1: "columns"}
    if isinstance(value, (str, int)) and value in found:
        return found[value]
    raise Unsupported(f"normalize={value!r} (pandas raises)")


@rule("pd.crosstab")
def crosstab(call: PandasCall, ctx: RuleContext) -> Value:
    """pd.crosstab(index, columns) -> group_by both keys and pl.len(), collected and pivoted.

    Handles: rows with a missing key are dropped; counts as Int64 and 0 for a combination
    that never occurs; rows sorted by the index keys, the new columns in the order of their
    values; the index keys stay label columns named like the Series (reset_index() brings them
    back); normalize=True/"all"/"index"/"columns" divides as pandas divides (pandas_div, each
    count divided once by its total); margins=True adds the total column and row (margins_name)
    to the counts, and with normalize the margins pandas keeps; values= with aggfunc mean or
    median (float cells, a group whose value is missing dropped, as pandas drops it), and sum /
    min / max of a float column (sums and means added as pandas adds them, pivot_groups), with
    margins as pivot_table's (pandas_pivot_margins); several index Series.
    Caveats: several columns Series (pandas keeps two levels of column labels), dropna=False,
    normalize with values, margins of a median with values, margins with several keys or an
    index key not known to be text, and sum / min / max / count of a column not known to be
    float (pandas makes the cells float when one combination is missing) are TODOs. The new
    columns are named by their values as text (handed to pandas, those of an integer key get
    pandas' integer labels back); boolean and datetime column keys are TODOs
    (Polars names them true / 2024-01-01 00:00:00.000000). margins=True on no rows (no row
    with both keys) gives the empty table pandas gives, and raises as pandas does when a key
    already holds the margins' name (pandas_count_margins).
    """
    ctx.reject_unknown(call, "index", "columns", "values", "rownames", "colnames", "aggfunc",
                       "margins", "margins_name", "dropna", "normalize", positional=10)
    rows = _series_list(call.arg("index", 0), "index")
    cols = _series_list(call.arg("columns", 1), "columns")
    frame = rows[0].frame
    for s in (*rows, *cols):
        check_same_rows(s, frame)
    row_names = _key_names(call, "rownames", 3, rows, "row")
    col_names = _key_names(call, "colnames", 4, cols, "col")
    names = [*row_names, *col_names]
    if len(set(names)) != len(names):
        raise Unsupported("two keys with the same name")
    margins = call.const("margins", 6, False, kinds=(bool,))
    margins_name = call.const("margins_name", 7, "All", kinds=(str,))
    if call.const("dropna", 8, True, kinds=(bool,)) is not True:
        raise Unsupported("dropna=False keeps missing keys and combinations no row has")
    normalize = _normalize_how(call.const("normalize", 9, False, kinds=(bool, str, int)))
    has_values, has_agg = call.has("values", 2), call.has("aggfunc", 5)
    if has_values != has_agg:
        raise Unsupported("values= without aggfunc= or aggfunc= without values= (pandas raises)")
    if margins and (len(rows) > 1 or len(cols) > 1):
        raise Unsupported("margins with several keys")
    if margins and rows[0].dtype != "str":
        raise Unsupported("margins with an index key not known to be text (the total row's "
                          "label goes into it)")

    for key in cols:
        if key.dtype in ("bool", "datetime", "date"):
            raise Unsupported(f"a {key.dtype} columns key: Polars names the new columns "
                              "differently from pandas' labels")
        if key.dtype not in ("str", "enum"):
            ctx.lower("the new columns are named by their values as text (pandas keeps the "
                      "values)", 0.95)
    if len(cols) > 1:
        # pandas writes and prints a header row per level (to_csv: one line per columns key
        # and one for the index names), which one level of flattened names cannot give
        raise Unsupported("several columns Series: pandas keeps two levels of column labels "
                          "(a header row each in to_csv); Polars has one")
    for s in (*rows, *cols):
        if s.dtype == "category":
            ctx.lower("category keys sort by their categories in pandas; porter sorts by text, "
                      "which is the same for categories made by astype('category')", 0.9)

    pairs: list[tuple[Column, str]] = list(zip([*rows, *cols], names))
    value_name = "len"
    if has_values:
        values = call.arg("values", 2)
        if not isinstance(values, Column):
            raise Unsupported("values= that is not a column of the frame")
        check_same_rows(values, frame)
        how = how_name(call.arg("aggfunc", 5))
        if values.dtype not in (None, *_NUMBER_TYPES, "bool"):
            raise Unsupported(f"aggfunc {how!r} of a {values.dtype} column")
        if normalize is not None:
            raise Unsupported("normalize with values= and aggfunc=")
        if how in ("sum", "min", "max"):
            if values.dtype != "float":
                raise Unsupported(f"aggfunc {how!r} of a column not known to be float: pandas "
                                  "makes the cells float when one combination is missing, "
                                  "which depends on the data")
        elif how not in ("mean", "median", "numpy_median"):
            raise Unsupported(f"aggfunc {how!r}")
        value_name = values.name if values.name is not None else "values"
    while value_name in names:
        value_name = f"_{value_name}"
    if has_values:
        pairs.append((values, value_name))

    # a comparison that met a missing value is False in pandas (a key like any other)
    exprs = [(ctx.bool_expr(s, frame), n) for s, n in pairs]
    plain = all(e.text == emit.col(n).text for e, n in exprs)
    code = frame.code if plain else frame.code.method(
        "select", *(e if e.text == emit.col(n).text else e.method("alias", n) for e, n in exprs))
    source = code
    fill: Any = None
    if has_values:
        # a float sum or mean added as pandas adds it (the rows' order decides how)
        code = pivot_groups(code, names, value_name, agg_expr(
            emit.col(value_name), how, values.dtype, float32=float32_possible(ctx)))
        if how in ("mean", "median", "numpy_median", "min", "max"):
            code = code.method("drop_nulls", value_name)  # pandas drops a group whose value is missing
    else:
        code = code.method("drop_nulls", names).method("group_by", names)
        count = emit.pl("len").method("cast", emit.atom("pl.Int64"))
        if value_name != "len":
            count = count.method("alias", value_name)
        code = code.method("agg", count)
        fill = 0
        if normalize is not None and not margins:
            total = emit.col(value_name).method("sum")
            if normalize == "index":
                total = total.method("over", emit.names_arg(row_names))
            elif normalize == "columns":
                total = total.method("over", emit.names_arg(col_names))
            # each count divided by its total once, as pandas divides the table
            code = code.method("with_columns", emit.call(DIVIDE_FUNCTION, emit.col(value_name),
                                                         total))
            fill = 0.0
    index = emit.names_arg(row_names)
    # the new columns appear in the order the pivot meets their values: sorted first
    code = code.method("sort", emit.names_arg(col_names))
    on = col_names[0]
    if len(cols) > 1:  # one column per combination, named as porter flattens two levels
        on = "__columns"
        while on in names or on == value_name:
            on = f"_{on}"
        code = code.method("with_columns", emit.formatted(
            "_".join("{}" for _ in col_names), *col_names).method("alias", on))
    code = code.method("collect").method("pivot", on=on, index=index, values=value_name)
    code = code.method("sort", index)
    if fill is not None:  # a combination no row has: 0 in pandas
        code = code.method("with_columns", emit.pl("exclude", index).method("fill_null", fill))
    if margins and has_values:
        # pandas' crosstab is its pivot_table of the values: the same margins, without a
        # fill_value (a column without a total gets NaN)
        keyed = Frame(source, dtypes=((row_names[0], rows[0].dtype),))
        code = pivot_margins(code, keyed, row_names, col_names[0], value_name, how,
                             values.dtype, margins_name, None, float32_possible(ctx))
    elif margins:
        code = _margins(code, row_names[0], margins_name, normalize)
    dtypes = tuple((n, s.dtype) for s, n in zip(rows, row_names) if s.dtype is not None)
    # pandas code given the table finds the columns by the key's values (ct[2024])
    int_labels = (*row_names, *([margins_name] if margins else [])) \
        if len(cols) == 1 and cols[0].dtype == "int" else None
    code = code.method("lazy")
    # counts (whole numbers), or their shares (floats), in every column but the keys
    # (of values: floats, a sum / min / max of a float column, a mean or median)
    cells = (code.text, "float") if has_values else (
        code.text, "float" if normalize is not None else "int")
    return Frame(code, columns=None, index=tuple(row_names), dtypes=dtypes,
                 labels_intact=False, int_labels_except=int_labels,
                 columns_name=col_names[0] if len(col_names) == 1 else None, number_cells=cells)


def _margins(code: Code, key: str, name: str, normalize: str | None) -> Code:
    """The total column and row of a table of counts (one index key: pandas_count_margins,
    which raises as pandas does when a key already holds the margins' name), then pandas'
    normalisation: every cell by the total ("all"), each row by its total with the total row
    kept and the total column dropped ("index"), each column by its total with the total column
    kept and the total row dropped ("columns"); each an exact division of two counts. A table
    without rows (no row has both keys) stays as it is: pandas gives an empty table there."""
    kwargs = {} if name == "All" else {"name": name}
    code = code.method("pipe", emit.atom(COUNT_MARGINS_FUNCTION), key, **kwargs)
    if normalize is None:
        return code
    cells = emit.pl("exclude", key)
    if normalize == "all":
        divided = emit.atom("t").method("with_columns", emit.call(
            DIVIDE_FUNCTION, cells, emit.col(name).method("last")))
    elif normalize == "index":
        divided = emit.atom("t").method("with_columns", emit.call(
            DIVIDE_FUNCTION, emit.pl("exclude", key, name), emit.col(name))).method("drop", name)
    else:
        divided = emit.atom("t").method("with_columns", emit.call(
            DIVIDE_FUNCTION, cells, cells.method("last"))).method("head", -1)
    return code.method("pipe", emit.atom(f"lambda t: t if t.is_empty() else {divided.text}"))


# -- unstack ------------------------------------------------------------------------------------

@rule("series.unstack")
def unstack(call: PandasCall, ctx: RuleContext) -> Value:
    """s.unstack(level=-1, fill_value=None) of a groupby result on two or more keys -> the
    collected Series pivoted on that key, the other keys as the index.

    Handles: the new columns in the order of the key's values and the rows in the order of the
    other keys (pandas lays the table out by its sorted labels); fill_value fills a
    combination no row has; without it, every cell float when one is missing, as pandas
    (pandas_unstacked decides on the pivoted table); level as a position or a key name.
    Caveats: a value of the key that only rows with a missing value in another key hold (the
    groupby dropped them) makes pandas order that key's values by first appearance instead of
    sorted (0.95). Only the Series a groupby(sort=True) made, before any filter or sort (pandas
    follows the order its labels were made in); text, True/False, date and unknown values
    (pandas makes an object column) and True/False or date column keys are TODOs. The new
    columns are named by their values as text (0.95 unless the key is text); handed to
    pandas, those of an integer key get pandas' integer labels back.
    """
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call, "level", "fill_value", "sort", positional=2)
    frame = column.frame
    keys = list(frame.index)
    if len(keys) < 2:
        raise Unsupported("a Series with one level of labels (pandas makes a Series of the "
                          "column labels)")
    if frame.grouped_rows != frame.rows:
        raise Unsupported("the Series is not the sorted result of a groupby (pandas lays the "
                          "table out in the order its labels were made)")
    if call.const("sort", None, True) is not True:
        raise Unsupported("sort=False")
    level = call.const("level", 0, -1, kinds=(int, str))
    if isinstance(level, str):
        if level not in keys:
            raise Unsupported(f"level {level!r} is not a key (pandas raises)")
        on = level
    elif -len(keys) <= level < len(keys):
        on = keys[level]
    else:
        raise Unsupported(f"level {level} out of range (pandas raises)")
    if frame.dtype(on) in ("bool", "datetime", "date", "float") or frame.dtype(on) is None:
        # (a float key's labels would reach pandas code as text: "0.5" where pandas has 0.5)
        raise Unsupported(f"a key of type {frame.dtype(on) or 'unknown'}: Polars names the new "
                          "columns differently from pandas' labels")
    if frame.dtype(on) not in ("str", "enum"):
        ctx.lower("the new columns are named by their values as text (pandas keeps the values)",
                  0.95)
    fill = call.const("fill_value", 1, None)
    if fill is not None and (isinstance(fill, bool) or not isinstance(fill, (int, float))):
        raise Unsupported("a fill_value that is not a number")
    # pandas' groupby labels hold every value of each key, also those of rows it dropped for a
    # missing value in another key; unstack removes the labels no row has left
    # (remove_unused_levels), which puts the values of such a key in the order they first come
    ctx.lower("a value of a key that only rows with a missing value in another key hold makes "
              "pandas lay that key's values out in the order they first come in the grouped "
              "result, not sorted (its unused labels are removed); porter sorts them", 0.95)
    if column.dtype not in ("int", "float"):
        raise Unsupported(f"values of type {column.dtype or 'unknown'}: pandas makes an object "
                          "column when a combination is missing")
    rest = [k for k in keys if k != on]
    # the values keep the name of the column they are, where they are one (g.size(): "size")
    plain = next((c for c in frame.columns or () if column.code.text == emit.col(c).text), None)
    values = plain or (column.name if column.name is not None else "values")
    while values in keys:
        values = f"_{values}"
    code = frame.code
    if frame.columns != (*keys, values) or plain != values:
        code = code.method("select", *(emit.col(k) for k in keys),
                           column.code if plain == values else column.code.method("alias", values))
    code = pivot_sorted(code, on, rest, values, fill, column.dtype == "int")
    dtypes = tuple((k, frame.dtype(k)) for k in rest if frame.dtype(k) is not None)
    # pandas code given the table finds the columns by the key's values (t[2024])
    int_labels = tuple(rest) if frame.dtype(on) == "int" else None
    code = code.method("lazy")
    # the cells are the Series' numbers: integers stay so where fill_value is one (else
    # pandas_unstacked makes them float when a combination is missing, which depends on the data)
    kind = "float" if column.dtype == "float" or isinstance(fill, float) else (
        "int" if fill is not None else None)
    # one row per combination of the other keys, sorted: labels of distinct values in a
    # groupby's order
    rows = fresh_token()
    return Frame(code, columns=None, index=tuple(rest), dtypes=dtypes,
                 labels_intact=False, int_labels_except=int_labels, columns_name=on,
                 number_cells=(code.text, kind), columns_kind=frame.dtype(on), rows=rows,
                 grouped_rows=rows)


_STACK_ROW = "__stack_row"


@rule("frame.stack")
def stack(call: PandasCall, ctx: RuleContext) -> Value:
    """pivoted.stack() of a table unstack made (nothing done to it since) -> the cells
    unpivoted (LazyFrame.unpivot), row by row, each row's cells in the columns' order.

    pandas 3 stacks every cell, missing ones too (future_stack), row by row in the table's
    order, the columns in theirs: unpivot lays the cells out column by column, so a stable
    sort by the row number puts them row by row. The result is a Series labelled by the row
    keys and the columns' key, without a name.
    Handles: a pivot on a text key (its values are the column labels pandas brings back); on
    an integer key, the labels cast back from the text Polars names the columns by.
    Caveats: a pivot on a key of another type (Polars named the columns by their text), a
    table changed since the unstack, level= other than the last, and the older dropna= /
    sort= are TODOs."""
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "level", "future_stack", positional=1)
    from porter.translate.context import number_cells
    pivoted, kind = number_cells(frame)
    name = frame.columns_name
    keys = list(frame.index)
    if not pivoted or name is None or not keys or frame.columns_kind not in ("str", "int") \
            or frame.column_pairs or frame.value_levels or name in keys \
            or frame.columns_kind == "int" and (frame.int_labels_except is None
                                                or set(frame.int_labels_except) - set(keys)):
        raise ctx.todo("a table other than one unstack made on a text or integer key, "
                       "unchanged since")
    if call.const("level", 0, -1, kinds=(int, str)) not in (-1, name):
        raise ctx.todo("level= other than the columns' only level")
    if call.const("future_stack", None, True) is not True:
        raise ctx.todo("future_stack=False (pandas 2's stack, which drops missing cells)")
    ctx.lower("each row's cells come in the order of unstack's columns, which pandas lays out "
              "in the order a key's values first come where a value only rows with a missing "
              "value in another key hold (series.unstack's caveat): sorted here", 0.95)
    values = "values"
    while values in (*keys, name, _STACK_ROW):
        values = f"_{values}"
    code = frame.code.method("with_row_index", _STACK_ROW).method(
        "unpivot", index=[_STACK_ROW, *keys], variable_name=name, value_name=values).method(
        "sort", _STACK_ROW, maintain_order=True).method("drop", _STACK_ROW)
    if frame.columns_kind == "int":
        # a pivot on an integer key: pandas' labels are the key's integers, Polars named the
        # columns by their text
        code = code.method("with_columns", emit.col(name).method("cast", emit.atom("pl.Int64")))
    dtypes = tuple((k, frame.dtype(k)) for k in keys if frame.dtype(k) is not None)
    dtypes += ((name, frame.columns_kind),) + (((values, kind),) if kind is not None else ())
    result = Frame(code, columns=(*keys, name, values), index=(*keys, name), dtypes=dtypes,
                   labels_intact=False)
    return Column(emit.col(values), frame=result, name=None, dtype=kind)


# -- melt ---------------------------------------------------------------------------------------

_MELT_ROW = "__melt_row"


def _names_or_none(call: PandasCall, name: str, position: int) -> list[str] | None:
    value = call.const(name, position, None, kinds=(str, list, tuple))
    if value is None:
        return None
    if isinstance(value, (list, tuple)) and not value:
        return []
    return column_names(value, f"`{name}`")


@rule("frame.melt", "pd.melt")
def melt(call: PandasCall, ctx: RuleContext) -> Value:
    """df.melt(id_vars, value_vars) / pd.melt(df, ...) -> unpivot(on, index), sorted back into
    pandas' order.

    Handles: pandas' rows (every row of the first value column, then of the second, ...: Polars
    unpivots piece by piece, so the rows are numbered first and sorted by column position then
    row); columns named variable and value (var_name / value_name); value columns of ints and
    floats give floats in both; value_vars left out means every other column (when known);
    without var_name, the variable column of a pivoted table (pivot_table, crosstab, unstack,
    reset_index() or not) is named after its columns' name, as pandas names it; a table pivoted
    on an integer key has pandas' integer labels in the variable column (int64, cast from the
    text Polars names its columns by).
    Caveats: value columns mixing text, numbers or booleans (pandas keeps each value as it is,
    an object column; Polars casts them to one type) are TODOs, and lower the confidence when
    their types are unknown; without var_name, a frame whose columns porter does not know may
    carry a columns.name porter did not follow, which pandas uses instead of "variable"
    (0.95); ignore_index=False, col_level, a frame with an index (reset_index()
    first) are TODOs, as are integer labels beside text ones (a margin). value_vars left out
    when porter does not know the frame's columns reads them from the frame's schema at run
    time (a frame held in a name; 0.9, the types unknown).
    """
    offset = 1 if call.receiver is None else 0
    frame = call.receiver if offset == 0 else call.arg("frame", 0)
    if not isinstance(frame, Frame):
        raise Unsupported("melting something other than a frame porter tracks")
    known = ("id_vars", "value_vars", "var_name", "value_name", "col_level", "ignore_index")
    ctx.reject_unknown(call, *known, *(("frame",) if offset else ()), positional=5 + offset)
    if call.const("col_level", 4 + offset, None) is not None:
        raise Unsupported("col_level (two levels of column labels)")
    if call.const("ignore_index", None, True, kinds=(bool,)) is not True:
        raise Unsupported("ignore_index=False repeats the row labels")
    id_vars = _names_or_none(call, "id_vars", 0 + offset) or []
    value_vars = _names_or_none(call, "value_vars", 1 + offset)
    if frame.index:
        # pandas melts the columns and leaves the index out (the labels of a groupby's keys,
        # or the row labels a filter or sort left): the columns holding it are not melted
        if frame.columns is None:
            raise Unsupported("the frame has an index (pandas leaves it out of the values) and "
                              "porter does not know its columns: call reset_index() first")
        named = [c for c in (*id_vars, *(value_vars or ())) if c in frame.index]
        if named:
            raise Unsupported(f"{named} name the frame's index, not a column (pandas raises "
                              "KeyError): call reset_index() first")
        frame = replace(frame, columns=tuple(c for c in frame.columns if c not in frame.index),
                        index=())
    var_name = call.const("var_name", 2 + offset, None, kinds=(str,))
    if var_name is None and frame.columns_name is not None:
        # a pivoted table (pivot_table, crosstab, unstack; reset_index keeps it): pandas names
        # the variable column after the columns' name
        var_name = frame.columns_name
    if var_name is None and frame.columns is None:
        ctx.lower("pandas names the variable column after the frame's columns.name when it has "
                  "one (a crosstab or pivot_table result, even after reset_index()); porter "
                  "does not know this frame's columns: pass var_name= to be sure", 0.95)
    var_name = "variable" if var_name is None else var_name
    value_name = call.const("value_name", 3 + offset, "value", kinds=(str,))
    columns = frame.columns
    # value_vars left out on a frame whose columns porter does not know: every other column,
    # in the order the frame's schema gives at run time (collect_schema reads no rows)
    every_other = value_vars is None and columns is None
    if every_other and not frame.code.text.isidentifier():
        raise Unsupported("value_vars left out and the frame's columns are not known: list "
                          "them (pandas' row order follows them)")
    if value_vars is None and columns is not None:
        value_vars = [c for c in columns if c not in id_vars]
    if value_vars is not None and not value_vars:
        raise Unsupported("no value columns")
    if set(value_vars or ()) & set(id_vars) or len(set(value_vars or ())) != len(value_vars or ()) \
            or len(set(id_vars)) != len(id_vars):
        raise Unsupported("a column listed twice")
    if columns is not None and value_vars is not None:
        absent = [c for c in (*id_vars, *value_vars) if c not in columns]
        if absent:
            raise Unsupported(f"columns {absent} are not in the frame (pandas raises KeyError)")
        if value_name in columns:
            raise Unsupported(f"value_name {value_name!r} is a column (pandas raises)")
    if var_name in (*id_vars, value_name) or value_name in id_vars:
        raise Unsupported("var_name or value_name repeats a column name")
    if value_vars is None:
        ctx.lower("the value columns' types are not known: pandas keeps each value as it is "
                  "when they mix text, numbers or booleans (an object column), Polars casts "
                  "them to one type", 0.9)
        value_dtype = None
    else:
        value_dtype = _common_value_dtype(frame, value_vars, ctx)

    # a table pivoted on an integer key (unstack, pivot, crosstab): pandas labels those columns
    # with the key's integers, which melt puts in the variable column (int64; Polars: text)
    int_variable = False
    texts = frame.int_labels_except
    if texts is not None:
        text_values = [c for c in value_vars if c in texts] if value_vars is not None \
            else [c for c in texts if c not in id_vars]
        if text_values:
            raise Unsupported(f"the value columns mix the key's integers (pandas' labels) and "
                              f"text ({text_values}): pandas' variable column holds both (an "
                              "object column), which has no Polars type")
        int_variable = True
    options: dict[str, object] = {"index": emit.names_arg(id_vars)} if id_vars else {}
    if var_name != "variable":
        options["variable_name"] = var_name
    if value_name != "value":
        options["value_name"] = value_name
    if value_vars is not None and len(value_vars) == 1:  # one piece: rows stay in order
        code = frame.code.method("unpivot", value_vars[0], **options)
    elif value_vars is not None and value_dtype is not None:
        # pandas' order, every row of the first value column, then of the second, ...: one
        # select per value column, stacked in that order (four times faster than numbering
        # the rows of an unpivot and sorting them back on a million rows); whole numbers
        # beside floats made floats, as pandas makes them
        source = frame.code if frame.code.text.isidentifier() else emit.atom("frame")
        pieces = [source.method("select", *id_vars, emit.pl("lit", v).method("alias", var_name),
                                emit.col(v).method("alias", value_name)) for v in value_vars]
        stacked = emit.pl("concat", pieces, how="vertical_relaxed")
        code = stacked if frame.code.text.isidentifier() else frame.code.method(
            "pipe", emit.atom(f"lambda frame: {stacked.text}"))
    else:
        options["index"] = [*id_vars, _MELT_ROW]
        # the value columns in the frame's order (the id columns among them are never values)
        order = emit.pl("Enum", value_vars if value_vars is not None else
                        frame.code.method("collect_schema").method("names"))
        code = frame.code.method("with_row_index", _MELT_ROW)
        code = code.method("unpivot", value_vars, **options) if value_vars is not None \
            else code.method("unpivot", **options)
        code = (code.method("sort", emit.col(var_name).method("cast", order), _MELT_ROW)
                .method("drop", _MELT_ROW))
    if int_variable:
        code = code.method("with_columns", emit.col(var_name).method("cast", emit.atom("pl.Int64")))
    dtypes = [(c, frame.dtype(c)) for c in id_vars] + \
        [(var_name, "int" if int_variable else "str"), (value_name, value_dtype)]
    return Frame(code, columns=(*id_vars, var_name, value_name), labels_intact=True,
                 dtypes=tuple((c, t) for c, t in dtypes if t is not None))


def _common_value_dtype(frame: Frame, value_vars: list[str], ctx: RuleContext) -> str | None:
    types = {frame.dtype(c) for c in value_vars}
    if None in types:
        if len(value_vars) > 1:
            ctx.lower("the value columns' types are not known: pandas keeps each value as it is "
                      "when they mix text, numbers or booleans (an object column), Polars casts "
                      "them to one type", 0.9)
        return None
    if len(types) == 1:
        return types.pop()
    if types <= set(_NUMBER_TYPES):
        return "float"
    raise Unsupported(f"value columns of types {sorted(types)}: putting them in one column "
                      f"{MIXED_COLUMN} (each value kept as it is); Polars casts them to one type")


# -- get_dummies --------------------------------------------------------------------------------

def _label(prefix: str | None, sep: str) -> Code:
    """The dummy column's name for the category `v`: pandas writes f"{prefix}{sep}{v}"."""
    if prefix is None:
        return emit.call("str", emit.atom("v"))
    head = prefix + sep
    if not any(ch in head for ch in "{}\\'\"\n\r"):
        return emit.atom(f'f"{head}{{v}}"')
    return emit.binop(emit.lit(head), "+", emit.call("str", emit.atom("v")))


def _dummies(column: str, prefix: str | None, sep: str, cast: str | None, drop_first: bool,
             dummy_na: bool) -> list[Code]:
    """One expression per category of `column` in the collected frame `d`, sorted as pandas
    sorts them; a missing value is False in every one (eq_missing)."""
    categories = emit.atom(f"d[{emit.literal_text(column)}]").method("drop_nulls").method(
        "unique").method("sort")
    if drop_first:
        categories = categories.method("slice", 1)
    one = emit.col(column).method("eq_missing", emit.atom("v"))
    if cast is not None:
        one = one.method("cast", emit.atom(cast))
    one = one.method("alias", _label(prefix, sep))
    parts = [emit.atom(f"*({one.text} for v in {categories.text})")]
    if dummy_na:
        missing = emit.col(column).method("is_null")
        if cast is not None:
            missing = missing.method("cast", emit.atom(cast))
        name = "nan" if prefix is None else f"{prefix}{sep}nan"
        parts.append(missing.method("alias", name))
    return parts


@rule("pd.get_dummies")
def get_dummies(call: PandasCall, ctx: RuleContext) -> Value:
    """pd.get_dummies(df, columns=[...]) / pd.get_dummies(s) -> the frame collected, then one
    eq_missing(v) column per category v of the collected column.

    Handles: the categories sorted as pandas sorts them, named prefix + prefix_sep + value (the
    column's name by default; the value alone for a Series); the other columns first, then the
    dummies of each encoded column in the order of `columns`; missing values False in every
    dummy, or a `nan` column with dummy_na=True; drop_first drops the first sorted category;
    bool columns by default, or dtype=; prefix as text, a list or a dict; columns left out
    encodes the text columns when every column's type is known.
    Caveats: category columns (pandas makes a column for every category, used or not), datetime
    columns (named differently), sparse=True, dummy_na with drop_first, a frame with an index,
    and columns left out when the types are unknown are TODOs. An encoded column of unknown
    type is named as Python writes its values (0.95).
    """
    ctx.reject_unknown(call, "data", "prefix", "prefix_sep", "dummy_na", "columns", "sparse",
                       "drop_first", "dtype", positional=8)
    data = call.arg("data", 0)
    prefix = call.const("prefix", 1, None, kinds=(str, list, tuple, dict))
    sep = call.const("prefix_sep", 2, "_", kinds=(str,))
    dummy_na = call.const("dummy_na", 3, False, kinds=(bool,))
    if call.const("sparse", 5, False, kinds=(bool,)):
        raise Unsupported("sparse=True (Polars has no sparse columns)")
    drop_first = call.const("drop_first", 6, False, kinds=(bool,))
    if dummy_na and drop_first:
        raise Unsupported("dummy_na with drop_first")
    cast: str | None = None
    dtype = call.arg("dtype", 7, None)
    if dtype is not None and not (isinstance(dtype, Opaque) and dtype.is_const and dtype.const is None):
        cast, _ = polars_dtype(dtype)
        if cast == "pl.Boolean":
            cast = None

    if isinstance(data, Column):
        if data.element:
            raise Unsupported("get_dummies inside a lambda")
        if data.frame.index:
            raise Unsupported("a Series with an index (pandas keeps it on the dummies): call "
                              "reset_index() on its frame first")
        if call.has("columns", 4):
            raise Unsupported("columns= with a Series")
        if isinstance(prefix, (list, tuple, dict)):
            raise Unsupported("a list or dict of prefixes for a Series")
        _check_encodable(data.dtype, ctx)
        name = data.name if data.name is not None else "values"
        expr = ctx.bool_expr(data, data.frame)  # a comparison with a missing value is False
        source = data.frame.code.method(
            "select", expr if expr.text == emit.col(name).text else expr.method("alias", name))
        exprs = _dummies(name, prefix, sep, cast, drop_first, dummy_na)
        code = source.method("collect").method(
            "pipe", emit.atom(f"lambda d: d.select({', '.join(e.text for e in exprs)})"))
        # one row of dummies per row of the Series, in its order: the same rows (pd.concat
        # axis=1 puts them beside the frame as they are)
        return Frame(code.method("lazy"), columns=None, labels_intact=data.frame.labels_intact,
                     rows=data.frame.rows)

    if not isinstance(data, Frame):
        raise Unsupported("get_dummies of something other than a frame or column porter tracks")
    frame = data
    if frame.index:
        raise Unsupported("the frame has an index: call reset_index() first")
    if call.has("columns", 4) and not isinstance(
            call.const("columns", 4, None, kinds=(list, tuple)), (list, tuple, type(None))):
        raise Unsupported("columns= must be a list")  # pandas raises for a single name
    encode = _names_or_none(call, "columns", 4)
    if encode is None:
        if frame.columns is None or any(frame.dtype(c) is None for c in frame.columns):
            raise Unsupported("columns left out and the column types are not known: pandas "
                              "encodes the text and category columns; list them in columns=")
        encode = [c for c in frame.columns if frame.dtype(c) in ("str", "category", "enum")]
    if len(set(encode)) != len(encode):
        raise Unsupported("a column listed twice")
    if frame.columns is not None:
        absent = [c for c in encode if c not in frame.columns]
        if absent:
            raise Unsupported(f"columns {absent} are not in the frame (pandas raises KeyError)")
    for c in encode:
        _check_encodable(frame.dtype(c), ctx)
    if isinstance(prefix, dict):
        if set(prefix) != set(encode) or not all(isinstance(p, str) for p in prefix.values()):
            raise Unsupported("a prefix dict that does not name each encoded column")
        prefixes = [prefix[c] for c in encode]
    elif isinstance(prefix, (list, tuple)):
        if len(prefix) != len(encode) or not all(isinstance(p, str) for p in prefix):
            raise Unsupported("a prefix list that does not match the encoded columns (pandas "
                              "raises)")
        prefixes = list(prefix)
    else:
        prefixes = [prefix if prefix is not None else c for c in encode]
    if not encode:
        return frame
    exprs = [emit.pl("exclude", emit.names_arg(encode))]
    for c, p in zip(encode, prefixes):
        exprs += _dummies(c, p, sep, cast, drop_first, dummy_na)
    code = frame.code.method("collect").method(
        "pipe", emit.atom(f"lambda d: d.select({', '.join(e.text for e in exprs)})"))
    kept = tuple((c, t) for c, t in frame.dtypes if c not in encode)
    return Frame(code.method("lazy"), columns=None, dtypes=kept,
                 labels_intact=frame.labels_intact)


def _check_encodable(dtype: str | None, ctx: RuleContext) -> None:
    if dtype in ("category", "enum"):
        raise Unsupported("a category column: pandas makes a column for every category, used "
                          "or not, in the categories' order")
    if dtype in ("datetime", "date"):
        raise Unsupported(f"a {dtype} column: pandas names the columns by its Timestamps")
    if dtype is None:
        ctx.lower("the dummy columns are named as Python writes the values (a datetime column "
                  "would be named differently)", 0.95)


# -- qcut ---------------------------------------------------------------------------------------

@rule("pd.qcut")
def qcut(call: PandasCall, ctx: RuleContext) -> Value:
    """pd.qcut(s, q, labels=[...]) -> pl.when(s between two quantile edges).then(label)... as
    pl.Enum.

    Handles: q as a number of bins (edges at evenly spaced quantiles, one binary digit up where
    k/q is not exact, as pandas takes them) or a list of quantiles; the edges are the column's
    linear quantiles computed as pandas computes them, to the last digit (pandas_quantile:
    Polars' quantile can be a digit off, which moves a value on an edge; missing values
    skipped); bins closed on the right with the lowest edge included; missing values and values
    outside the edges are missing; the labels become an Enum, sorted in the labels' order as
    pandas sorts its ordered categorical; labels=False gives the bin numbers.
    Caveats: pandas raises when two edges are equal (many ties, fewer distinct values than
    bins, no values) and the Polars code leaves those bins empty instead (0.95); labels=None
    (pandas' Interval values, whose text depends on the edges), duplicates="drop" and
    retbins=True are TODOs. labels=False gives integers, marked as pandas' floats while a
    value is missing (float_int: written 1.0 as pandas writes it).
    """
    ctx.reject_unknown(call, "x", "q", "labels", "retbins", "precision", "duplicates",
                       positional=6)
    column = call.arg("x", 0)
    if not isinstance(column, Column) or column.element:
        raise Unsupported("cutting something other than a column")
    if column.dtype in ("str", "bool", "datetime", "date", "category", "enum"):
        raise Unsupported(f"cutting a {column.dtype} column")
    q = call.const("q", 1, None, kinds=(int, list, tuple))
    if isinstance(q, int):
        if q < 1:
            raise Unsupported(f"q={q} (pandas raises)")
        # pandas' quantiles: k/q, one binary digit up where k/q is not exact (pandas rounds
        # them up so that a value at a bin's edge lands where the exact edge would put it)
        spaced = np.linspace(0, 1, q + 1)
        np.putmask(spaced, q * spaced != np.arange(q + 1), np.nextafter(spaced, 1))
        quantiles = [float(p) for p in spaced]
    elif isinstance(q, (list, tuple)) and len(q) >= 2 and all(
            isinstance(p, (int, float)) and not isinstance(p, bool) and 0 <= p <= 1 for p in q):
        quantiles = [float(p) for p in q]
        if any(a >= b for a, b in zip(quantiles, quantiles[1:])):
            raise Unsupported("quantiles that do not increase (pandas raises)")
    else:
        raise Unsupported("q other than a number of bins or a list of quantiles in [0, 1]")
    if call.const("retbins", 3, False, kinds=(bool,)):
        raise Unsupported("retbins=True returns the edges too")
    call.const("precision", 4, 3, kinds=(int,))  # only shapes Interval labels
    duplicates = call.const("duplicates", 5, "raise", kinds=(str,))
    labels = call.const("labels", 2, None, kinds=(list, tuple, bool))
    if duplicates == "drop" and labels is False:
        return _qcut_numbers_of_distinct_edges(column, quantiles)
    if duplicates != "raise":
        raise Unsupported(f"duplicates={duplicates!r} with labels other than False: the number "
                          "of bins depends on the data")
    bins = len(quantiles) - 1
    if labels is False:
        steps: list[Any] = list(range(bins))
    elif isinstance(labels, (list, tuple)) and all(isinstance(x, str) for x in labels):
        if len(labels) != bins:
            raise Unsupported("a label count that does not match the bins (pandas raises)")
        if len(set(labels)) != len(labels):
            raise Unsupported("repeated labels")
        steps = [emit.pl("lit", x) for x in labels]
    else:
        raise Unsupported("labels other than a list of texts or False (pandas' Interval values "
                          "are named from the edges, which depend on the data)")
    ctx.lower("pandas raises when two quantile edges are equal (ties, fewer distinct values than "
              "bins, or no values); the Polars code leaves those bins empty", 0.95)
    x = column.code
    edges = [_edge(x, p) for p in quantiles]
    code: Code | None = None
    for i, (low, high, step) in enumerate(zip(edges, edges[1:], steps)):
        # right-closed bins, the lowest edge included (pandas' include_lowest=True); from the
        # minimum no value lies below the first bin, so each bin starts where the last ended
        if quantiles[0] == 0.0:
            test = emit.binop(x, "<=", high)
        else:
            test = x.method("is_between", low, high, closed="both" if i == 0 else "right")
        code = emit.pl("when", test).method("then", step) if code is None \
            else code.method("when", test).method("then", step)
    assert code is not None
    if labels is False:
        # pandas gives float bin numbers (1.0) while a value is missing or outside the edges:
        # the mark writes them as pandas does
        result = derived_column(column, code.method("cast", emit.atom("pl.Int64")), dtype="int")
        return replace(result, float_int="qcut() left a value missing")
    code = code.method("cast", emit.pl("Enum", list(labels)))
    return derived_column(column, code, dtype="enum")


def _qcut_numbers_of_distinct_edges(column: Column, quantiles: list[float]) -> Value:
    """pd.qcut(s, q, labels=False, duplicates="drop"): the bin numbers over the distinct
    edges (pandas_qcut_numbers, written once into the script). pandas keeps each edge once
    (equal quantiles: ties, few distinct values) and numbers a value by the distinct edges
    below it (searchsorted, side="left"), a value on the lowest edge being in bin 0; a value
    below the lowest edge or above the highest (q as a list not from 0 to 1) or missing has
    none, and with one distinct edge no value has one. The edges are those qcut computes
    (pandas_quantile, the minimum, the maximum)."""
    x = column.code
    code = emit.call(QCUT_NUMBERS_FUNCTION, x, [_edge(x, p) for p in quantiles])
    result = derived_column(column, code, dtype="int")
    # pandas gives float bin numbers (1.0) while a value has none: the mark writes them so
    return replace(result, float_int="qcut() left a value missing")


def _edge(x: Code, p: float) -> Code:
    """The p quantile of the column as pandas computes it, to the last binary digit
    (pandas_quantile: Polars' own linear quantile can be a digit off, and a value on the edge
    then lands in the next bin); the ends are the minimum and maximum."""
    if p == 0.0:
        return x.method("min")
    if p == 1.0:
        return x.method("max")
    return emit.call(QUANTILE_FUNCTION, x, p)


def _transposed_row_numbers(frame: Frame) -> Frame:
    """df.T of a frame of numbers labelled 0..n-1: pandas' columns are the integers 0..n-1 and
    its unnamed index the old column names. Polars names columns by text: "0", "1", ... held
    as pandas' integer labels (int_labels_except), which a hand-over to pandas (a write with
    the index, a print of pandas' frame) makes integers again; a CSV header reads the same."""
    if frame.column_pairs or frame.columns_name is not None or frame.number_labels \
            or frame.int_labels_except is not None:
        raise Unsupported("column names of two levels, with a name of their own, or numbers")
    kinds = {frame.dtype(c) for c in frame.columns or ()}
    if not frame.columns or not kinds <= set(_NUMBER_TYPES):
        raise Unsupported("text, dates, True/False or columns of unknown type: pandas makes an "
                          "object frame, whose values Polars would make one type (text)")
    # (Polars transposes into the columns' common type: ints beside floats become Float64,
    # as pandas' float64; ints only stay Int64, as pandas' int64)
    transposed = emit.atom("t").method(
        "transpose", include_header=True, header_name="index",
        column_names=emit.atom("[str(i) for i in range(t.height)]"))
    code = frame.code.method("collect").method(
        "pipe", emit.atom(f"lambda t: {transposed.text}")).method("lazy")
    return Frame(code, columns=None, index=("index",), labels_intact=False, index_unnamed=True,
                 int_labels_except=("index",), dtypes=(("index", "str"),))


@rule("frame.T", "frame.transpose")
def transpose(call: PandasCall, ctx: RuleContext) -> Value:
    """df.T / df.transpose() -> collect().transpose(include_header=True, ...), on a table of
    numbers labelled by one text key (describe()'s statistics, a groupby's keys): the column
    names become the labels (an unnamed index, "index"), the key's values the columns.

    Handles: numbers of one type, or ints beside floats (float64 in both).
    Caveats: frames labelled 0..n-1 (pandas' columns would be the integers), text or date
    columns (an object frame in pandas) and frames whose columns porter does not know are
    TODOs.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    if call.name == "transpose":
        ctx.reject_unknown(call, "copy")
    if frame.columns is not None and not frame.index and frame.labels_intact:
        return _transposed_row_numbers(frame)
    if frame.columns is None or len(frame.index) != 1 or frame.dtype(frame.index[0]) != "str":
        raise Unsupported("a frame not labelled by one text key or by its row numbers 0..n-1 "
                          "(after a filter or sort the new column names would be the rows' "
                          "old numbers): the new column names would be its row labels")
    if frame.column_pairs or frame.columns_name is not None or frame.number_labels \
            or frame.int_labels_except is not None:
        # two levels of column names (agg with lists) become two levels of row labels, a
        # pivot's named columns a named index, number labels number rows: pandas' own shapes
        raise Unsupported("column names of two levels, with a name of their own, or numbers")
    key = frame.index[0]
    values = [c for c in frame.columns if c != key]
    kinds = {frame.dtype(c) for c in values}
    if not values or not kinds <= set(_NUMBER_TYPES):
        raise Unsupported("text, dates or columns of unknown type: pandas makes an object frame")
    # (Polars transposes into the columns' common type: ints beside floats become Float64,
    # as pandas' float64)
    code = frame.code.method("collect").method(
        "transpose", include_header=True, header_name="index", column_names=key).method("lazy")
    return Frame(code, columns=None, index=("index",), labels_intact=False, index_unnamed=True,
                 dtypes=(("index", "str"),))
