"""Selecting columns and rows: df["a"], df.a, df[["a", "b"]], df[mask], loc, iloc, head, tail,
query, and what a frame knows about itself (columns, shape, dtypes, len)."""

from __future__ import annotations

import ast
import functools
import re
from collections.abc import Iterable
from dataclasses import dataclass, field, replace
from typing import TYPE_CHECKING

import libcst as cst

from porter.emit import code as emit
from porter.emit.code import Code
from porter.rules import rule
from porter.translate.context import (
    ROW_LABELS, PandasCall, RuleContext, Unsupported, column_names, column_of, derive,
    holds_numbers, labels_kept, nullable_columns, row_labels_carried, select_columns,
    values_fixed, with_row_labels,
)
from porter.translate.handover import series_frame, to_pandas

if TYPE_CHECKING:
    from porter.rules.groupby import RowPosition
from porter.translate.values import (
    Accessor, Column, Frame, Module, Opaque, PandasValue, Parts, Scalar, Value, fresh_token,
)


def frame_of(call: PandasCall) -> Frame:
    assert isinstance(call.receiver, Frame)
    return call.receiver


def column_by_key(frame: Frame, key: Value, ctx: RuleContext) -> Column:
    """`frame[key]` for a key naming one column."""
    if isinstance(key, Opaque) and isinstance(key.const, str):
        if frame.columns is not None and key.const not in frame.columns:
            raise Unsupported(f"column {key.const!r} is not in the frame (pandas raises KeyError)")
        name = key.const
        code = emit.col(key.code if key.code.text != emit.lit(name).text else name)
        return column_of(frame, name, code)
    if isinstance(key, Opaque) and isinstance(key.const, int) and not isinstance(key.const, bool) \
            and frame.int_labels_except is not None \
            and str(key.const) not in frame.int_labels_except:
        # pv[2024] of a table pivoted on an integer key: pandas labels the column with the
        # key's value, Polars names it as text ("2024")
        name = str(key.const)
        if frame.columns is not None and name not in frame.columns:
            raise Unsupported(f"column {key.const!r} is not in the frame (pandas raises KeyError)")
        return column_of(frame, name, emit.col(name))
    if isinstance(key, Opaque) and not key.is_const and key.node is None or (
            isinstance(key, Opaque) and isinstance(key.node, cst.Name)):
        if key.pytype != "str":
            ctx.lower(f"`{key.code.text}` is taken to hold one column name", 0.85)
        name_code = key.code if frame.int_labels_except is None else emit.call("str", key.code)
        return Column(emit.col(name_code), frame=frame, name=None)
    raise Unsupported(f"a key of this kind ({key.code.text}) selects by index or position")


@rule("frame.getitem.column")
def getitem_column(call: PandasCall, ctx: RuleContext) -> Value:
    """df["a"] -> pl.col("a") inside the frame's expressions; df[[c for c in ...]] (a list
    built when the script runs) -> .select(...), keeping the columns pandas holds in the index.

    Handles: a name the script binds only to lists (a comprehension, list(...), sorted(...),
    x + [...]) or changes with append / extend / remove / += is a list: a frame of those
    columns in the list's order, even with one name. A name bound to a list somewhere and to
    something else elsewhere is a TODO (pandas gives a frame for one, a Series for the other).
    """
    frame = frame_of(call)
    key = call.args[0]
    if frame.value_levels:
        return _value_level(frame, key, ctx)
    if isinstance(key, Opaque) and not key.is_const:
        kind = "list" if _is_list_display(key.code.text) or key.pytype == "list" else None
        if key.pytype != "str" and (isinstance(key.node, cst.Name) or key.node is None
                                    and key.code.text.isidentifier()):
            kind = name_kind(ctx.python_module, key.code.text) or kind
        if kind == "mixed":
            raise ctx.todo(f"`{key.code.text}` holds a list of column names somewhere and "
                           "something else elsewhere: pandas selects a frame for a list and a "
                           "Series for one name")
        if kind == "list":
            # pandas' df[list] is a frame of those columns in the list's order, one name or
            # several; a name it lacks raises in both (ColumnNotFoundError in Polars)
            ctx.lower(f"`{key.code.text}` is taken to hold column names", 0.9)
            code = frame.code.method("select", *frame.index, emit.col(_by_text(frame, key.code)))
            return derive(frame, code, same_rows=True, columns=None, dtypes=frame.dtypes,
                          column_pairs=())
    return column_by_key(frame, key, ctx)


def _value_level(frame: Frame, key: Value, ctx: RuleContext) -> Value:
    """pv["a"] of a pivot of several value columns: the table of a's columns, labelled by the
    pivot's key values as pandas labels them (the first level of the columns taken): Polars'
    columns "a_x" renamed "x", the index keys kept."""
    if not (isinstance(key, Opaque) and isinstance(key.const, str)
            and key.const in frame.value_levels):
        raise ctx.todo("pandas' columns are two levels here (the value column, then the key's "
                       "value): select one value column first")
    prefix = emit.lit(key.const + "_").text
    code = frame.code.method("select", *frame.index, emit.atom(
        f"pl.selectors.starts_with({prefix})")).method("rename", emit.atom(
            f"lambda c: c.removeprefix({prefix})"))
    return derive(frame, code, same_rows=True, columns=None, value_levels=(),
                  dtypes=tuple((c, t) for c, t in frame.dtypes if c in frame.index))


# builtins and methods whose result is a list (or pandas Index) of the names they are given
_LIST_CALLS = frozenset({"list", "sorted"})
_LIST_METHODS = frozenset({"tolist", "to_list", "names", "copy"})
_LIST_CHANGES = frozenset({"append", "extend", "remove", "insert", "pop", "sort", "reverse",
                           "clear"})


def _list_expr(node: ast.expr | None) -> bool:
    """`[...]`, `[... for ...]`, list(...), sorted(...), df.columns, a slice of them, x + [...]:
    an expression that gives a list of names, never one name."""
    if isinstance(node, (ast.List, ast.ListComp)):
        return True
    if isinstance(node, ast.Call) and isinstance(node.func, ast.Name):
        return node.func.id in _LIST_CALLS
    if isinstance(node, ast.Call) and isinstance(node.func, ast.Attribute):
        return node.func.attr in _LIST_METHODS and _list_expr(node.func.value) \
            or node.func.attr in ("tolist", "to_list", "names")
    if isinstance(node, ast.Attribute):
        return node.attr == "columns"
    if isinstance(node, ast.Subscript) and isinstance(node.slice, ast.Slice):
        return _list_expr(node.value)
    if isinstance(node, ast.BinOp) and isinstance(node.op, ast.Add):
        return _list_expr(node.left) or _list_expr(node.right)
    return False


def _bound_names(target: ast.expr) -> list[str]:
    """The names an assignment target binds (`a, (b, *c)`; not those read in `df[cols] = `)."""
    if isinstance(target, ast.Name):
        return [target.id]
    if isinstance(target, ast.Starred):
        return _bound_names(target.value)
    if isinstance(target, (ast.Tuple, ast.List)):
        return [n for element in target.elts for n in _bound_names(element)]
    return []


# the last module read by name_kind, with what it found of each name (one walk per script)
_KINDS: list[tuple[ast.Module, dict[str, str | None]]] = []


def name_kind(module: ast.Module | None, name: str) -> str | None:
    """What the script binds `name` to anywhere (any scope): "list" when every binding gives a
    list of names (or the list is changed with append / extend / remove), "mixed" when some do
    and others may not, None when none does (one name, or a value porter cannot see)."""
    if module is None:
        return None
    if not _KINDS or _KINDS[0][0] is not module:
        _KINDS[:] = [(module, {})]
    known = _KINDS[0][1]
    if name not in known:
        known[name] = _name_kind(module, name)
    return known[name]


def _name_kind(module: ast.Module, name: str) -> str | None:
    lists = others = 0
    for node in ast.walk(module):
        values: list[ast.expr | None] = []
        if isinstance(node, ast.Assign):
            for target in node.targets:
                if isinstance(target, ast.Name) and target.id == name:
                    values.append(node.value)
                elif name in _bound_names(target):
                    values.append(None)
        elif isinstance(node, (ast.AnnAssign, ast.NamedExpr)) and isinstance(node.target, ast.Name) \
                and node.target.id == name:
            values.append(node.value)
        elif isinstance(node, ast.AugAssign) and isinstance(node.target, ast.Name) \
                and node.target.id == name:
            if isinstance(node.op, ast.Add) and _list_expr(node.value):
                lists += 1
            continue
        elif isinstance(node, (ast.For, ast.AsyncFor, ast.comprehension, ast.withitem)):
            target = node.optional_vars if isinstance(node, ast.withitem) else node.target
            if target is not None and name in _bound_names(target):
                values.append(None)
        elif isinstance(node, ast.arg) and node.arg == name:
            values.append(None)
        elif isinstance(node, ast.Call) and isinstance(node.func, ast.Attribute) \
                and isinstance(node.func.value, ast.Name) and node.func.value.id == name \
                and node.func.attr in _LIST_CHANGES:
            lists += 1
            continue
        for value in values:
            if _list_expr(value):
                lists += 1
            else:
                others += 1
    if not lists:
        return None
    return "mixed" if others else "list"


def _is_list_display(text: str) -> bool:
    """`[...]` or `[... for ...]` written out, or a slice of the column names (df.columns[1:]):
    a list, never one column name."""
    try:
        node = cst.parse_expression(text)
    except cst.ParserSyntaxError:
        return False
    if isinstance(node, cst.Subscript) and len(node.slice) == 1 \
            and isinstance(node.slice[0].slice, cst.Slice):
        names = node.value
        return isinstance(names, cst.Call) and isinstance(names.func, cst.Attribute) \
            and names.func.attr.value == "names" and isinstance(names.func.value, cst.Call) \
            and isinstance(names.func.value.func, cst.Attribute) \
            and names.func.value.func.attr.value == "collect_schema"
    if isinstance(node, (cst.List, cst.ListComp)):
        return True
    try:
        return _list_expr(ast.parse(text.strip(), mode="eval").body)
    except SyntaxError:
        return False


@rule("frame.getattr")
def getattr_column(call: PandasCall, ctx: RuleContext) -> Value:
    """df.a -> pl.col("a")."""
    frame = frame_of(call)
    if frame.columns is not None and call.name not in frame.columns:
        raise Unsupported(f"{call.name!r} is neither a column nor a DataFrame attribute porter knows")
    return column_of(frame, call.name)


@rule("frame.getitem.columns")
def getitem_columns(call: PandasCall, ctx: RuleContext) -> Value:
    """df[["a", "b"]] -> .select("a", "b")."""
    frame = frame_of(call)
    key = call.args[0]
    names = key.const  # type: ignore[union-attr]
    if not all(isinstance(n, str) for n in names):
        raise Unsupported("columns selected by something other than names")
    args: list[object] = [key.code] if not _is_literal(key) else list(names)
    # the columns pandas keeps in the index (a groupby's keys) stay with the rows
    keys = [k for k in frame.index if k not in names]
    if keys and not _is_literal(key):
        args = [emit.col(key.code)]  # beside other names, a list is one literal value to select
    return select_columns(frame, frame.code.method("select", *keys, *args), [*keys, *names])


def _is_literal(value: Value) -> bool:
    return isinstance(value, Opaque) and value.node is not None and not isinstance(value.node, cst.Name)


@rule("frame.getitem.mask")
def getitem_mask(call: PandasCall, ctx: RuleContext) -> Value:
    """df[mask] -> .filter(mask).

    Handles: rows where the mask met a missing value are dropped, as pandas' False drops them.
    """
    frame = frame_of(call)
    mask = call.args[0]
    if not isinstance(mask, Column):
        raise Unsupported("the mask was computed by pandas (see the TODO where it was made)")
    return labels_kept(frame, derive(frame, frame.code.method("filter", ctx.expr(mask, frame)),
                                     same_rows=False))


@rule("frame.getitem.slice", "frame.iloc")
def positional_rows(call: PandasCall, ctx: RuleContext) -> Value:
    """df[a:b] and df.iloc[a:b] (and df.iloc[a:b, :]) -> .slice / .head / .tail;
    df.iloc[:, 1:3] / [:, [0, 2]] / [:, 0] -> the columns at those positions, by name.

    Handles: column positions count the columns pandas holds as data (not a groupby's keys in
    the index, which stay); a slice of positions with a step or negative bounds as Python
    slices a list; one position gives the Series. df.iloc[0] / df.iloc[-1] (one literal row
    position, every column): that row picked in Polars and handed to pandas as its row
    Series, named by its label (_row_at).
    """
    frame = frame_of(call)
    keys = call.args
    key = keys[0]
    if call.name == "iloc" and isinstance(key, Opaque) and type(key.const) is int and (
            len(keys) == 1 or isinstance(keys[1], Opaque) and keys[1].const == slice(None)):
        # pandas types the row as it types a row of the frame (the columns' common type:
        # float64 for ints beside floats, object beside text), which the one-row frame
        # handed over gives it again
        return _row_at(frame, emit.lit(key.const), ctx)
    if not (isinstance(key, Opaque) and isinstance(key.const, slice)):
        raise Unsupported("iloc with a single position and a column returns a value; porter "
                          "ports one row (df.iloc[0]) and row slices")
    rows = slice_rows(frame, key.const)
    if len(keys) == 2 and not (isinstance(keys[1], Opaque) and keys[1].const == slice(None)):
        return _columns_at(rows, keys[1], ctx)
    return rows


def _columns_at(frame: Frame, positions: Value, ctx: RuleContext) -> Value:
    """The columns of `frame` at pandas' positions (iloc's second key), chosen by name."""
    if frame.columns is None or frame.column_pairs or frame.int_labels_except is not None \
            or frame.number_labels:
        raise Unsupported("iloc with column positions of a frame whose columns porter does not "
                          "know: select columns by name")
    names = [c for c in frame.columns if c not in frame.index]
    const = positions.const if isinstance(positions, Opaque) else None
    if isinstance(const, int) and not isinstance(const, bool):
        if not -len(names) <= const < len(names):
            raise Unsupported("a column position out of range (pandas raises IndexError)")
        return column_of(frame, names[const])
    if isinstance(const, slice) and all(v is None or isinstance(v, int) and not isinstance(v, bool)
                                        for v in (const.start, const.stop, const.step)) \
            and const.step != 0:
        chosen = names[const]
    elif isinstance(const, list) and const and all(
            isinstance(p, int) and not isinstance(p, bool) for p in const):
        if not all(-len(names) <= p < len(names) for p in const):
            raise Unsupported("a column position out of range (pandas raises IndexError)")
        chosen = [names[p] for p in const]
        if len(set(chosen)) != len(chosen):
            raise Unsupported("a column chosen twice (pandas repeats it; Polars refuses)")
    else:
        raise Unsupported("iloc with column positions computed when the script runs: select "
                          "columns by name")
    kept = [*frame.index, *chosen]
    return select_columns(frame, frame.code.method("select", *kept), kept)


def slice_rows(frame: Frame, s: slice) -> Frame:
    start, stop, step = s.start, s.stop, s.step
    if step not in (None, 1) or any(v is not None and not isinstance(v, int) for v in (start, stop)):
        raise Unsupported("slices with a step or computed bounds")
    intact = frame.labels_intact and (start is None or start == 0)
    if start is None or start == 0:
        if stop is None:
            return frame
        if stop < 0:
            raise Unsupported("a slice ending before the last rows has no lazy form without the length")
        return derive(frame, frame.code.method("head", stop), same_rows=False, labels_intact=intact)
    if start < 0 and stop is None:
        return derive(frame, frame.code.method("tail", -start), same_rows=False)
    if start > 0 and stop is None:
        return derive(frame, frame.code.method("slice", start), same_rows=False)
    if start > 0 and stop is not None and stop >= start:
        return derive(frame, frame.code.method("slice", start, stop - start), same_rows=False)
    raise Unsupported("negative slice bounds need the frame's length")


@rule("frame.loc")
def loc(call: PandasCall, ctx: RuleContext) -> Value:
    """df.loc[mask, cols] -> .filter(mask).select(cols); df.loc[:, "a"] -> a column.

    Handles: df.loc[s.idxmax(), "c"] of the frame the label was read from: the value on that
    row (pl.col("c").get(the first row holding the extreme)); df.loc["label"] of a table
    labelled by one key column: the rows holding the label picked in Polars, handed to pandas,
    which gives its row Series (one row), a frame (several) or KeyError (none), as on the table.
    df.loc[("a", 2)] of a table labelled by as many key columns is read the same way.
    df.loc[pd.IndexSlice["a", :], cols] of a table labelled by several key columns: a filter
    per level picked, KeyError where pandas raises it (_rows_by_levels).
    Caveats: other row labels (df.loc[[...]], df.loc["a":"c"], row numbers after a filter) are
    TODOs: the index is not data in Polars.
    """
    frame = frame_of(call)
    rows = call.args[0]
    cols = call.args[1] if len(call.args) > 1 else None
    from porter.rules.groupby import ExtremeLabels, RowPosition, scalar_of
    if isinstance(rows, RowPosition) and rows.current_in(frame) \
            and isinstance(cols, Opaque) and isinstance(cols.const, str):
        # df.loc[df["kg"].idxmax(), "boat"]: the value on the row the label was read from
        column = column_by_key(frame, cols, ctx)
        if not isinstance(column, Column) or column.dtype not in ("int", "float", "str", "bool"):
            raise Unsupported("a value of a column whose type porter does not know")
        return scalar_of(column, column.code.method("get", rows.position),
                         column.dtype if column.dtype in ("int", "float") else None)
    if isinstance(rows, RowPosition) and rows.current_in(frame) and cols is None:
        return _row_at(frame, rows.position, ctx)
    if isinstance(rows, ExtremeLabels) and rows.source.rows == frame.rows \
            and (frame.labels_intact and not frame.index or row_labels_carried(frame)):
        # df.loc[df.groupby(k)["c"].idxmin()]: each group's row of its first smallest value,
        # in the order of the keys (the labels' Series is sorted by them)
        keys = emit.names_arg(rows.keys)
        position = emit.pl("int_range", emit.pl("len")).method("over", keys)
        first = emit.col(rows.column).method(f"arg_{rows.how}").method("over", keys)
        present = [emit.col(k).method("is_not_null") for k in rows.keys]
        known = present[0] if len(present) == 1 else emit.pl("all_horizontal", *present)
        code = frame.code.method("filter", known, emit.binop(position, "==", first)).method(
            "sort", keys, maintain_order=True)
        frame = derive(frame, code, same_rows=False)
    elif isinstance(rows, Column):
        frame = labels_kept(frame, derive(frame, frame.code.method("filter", ctx.expr(rows, frame)),
                                          same_rows=False))
    elif _level_selection(rows) and len(frame.index) > 1:
        assert isinstance(rows, Opaque)
        frame = _rows_by_levels(frame, rows, ctx)  # df.loc[pd.IndexSlice["a", :], ...]
    elif (_one_label(rows) or _label_read(rows, frame)) and isinstance(cols, Opaque) \
            and isinstance(cols.const, str):
        return _labelled_value(frame, rows, cols, ctx)  # df.loc["label", "c"], as df.at
    elif isinstance(rows, Opaque) and type(rows.const) is int and rows.const >= 0 \
            and not frame.index and frame.labels_intact \
            and (cols is None or isinstance(cols, Opaque) and cols.const == slice(None)):
        # df.loc[2] of a frame still labelled 0..n-1: the row at that position, pandas' row
        # Series as df.iloc[2] gives it (a label past the rows: OutOfBoundsError where pandas
        # raises KeyError)
        return _row_at(frame, emit.lit(rows.const), ctx)
    elif (_one_label(rows) or _label_tuple(rows)) \
            and (cols is None or isinstance(cols, Opaque) and cols.const == slice(None)):
        assert isinstance(rows, Opaque)
        return _rows_by_label(frame, rows, ctx)  # df.loc["label"]: its row, pandas' Series
    elif not (isinstance(rows, Opaque) and rows.const == slice(None)):
        raise Unsupported("rows chosen by index label: the index is not data in Polars")
    if cols is None or (isinstance(cols, Opaque) and cols.const == slice(None)):
        return frame
    if isinstance(cols, Opaque) and isinstance(cols.const, str):
        return column_by_key(frame, cols, ctx)
    if isinstance(cols, Opaque) and isinstance(cols.const, list) and all(isinstance(c, str) for c in cols.const):
        if any(c in frame.index for c in cols.const):
            raise Unsupported("a column pandas keeps in the index (pandas raises KeyError)")
        # the index (a groupby's keys, row labels) stays with the rows, as pandas keeps it
        names = [*frame.index, *cols.const]
        return select_columns(frame, frame.code.method("select", *names), names)
    if isinstance(cols, Opaque) and isinstance(cols.const, slice):
        return _column_label_slice(frame, cols.const)
    raise Unsupported("columns chosen by something other than names")


def _level_selection(value: Value) -> bool:
    """A tuple of labels and slices written out, one per level, at least one a slice
    (df.loc[pd.IndexSlice["a", :]], df.loc[("a", slice(None))])."""
    return isinstance(value, Opaque) and isinstance(value.const, tuple) and bool(value.const) \
        and any(isinstance(p, slice) for p in value.const) \
        and all(isinstance(p, slice) or isinstance(p, (str, int)) and not isinstance(p, bool)
                for p in value.const)


_DAY_TEXT = re.compile(r"\d{4}-\d{2}-\d{2}")


def _rows_by_levels(frame: Frame, rows: Opaque, ctx: RuleContext) -> Frame:
    """df.loc[pd.IndexSlice["a", :], ...] of a table labelled by several key columns (a
    MultiIndex) -> a filter on the key columns, the levels all kept, the rows in their order.

    A label picks the rows whose key is that label: where no row is left pandas raises
    KeyError (a label that is in none, or in none with the others), as pandas_label_rows
    does. slice(None) (`:`) takes every row. A slice of labels takes the keys between its
    ends, both included, which pandas does only on rows sorted by the keys (sort_index();
    otherwise it raises UnsortedIndexError, so porter ports it only after one): text and
    whole numbers compared as they are; on a date key, a day written as text
    ("2026-06-08") stands for the whole day, as pandas reads a partial date."""
    from porter.rules.construct import _datetime_code
    parts = rows.const
    keys = frame.index
    if len(parts) > len(keys) or row_labels_carried(frame) or frame.index_unnamed:
        raise ctx.todo("rows chosen by index label: one label or slice per key column holding "
                       "the labels is ported")
    import pandas as pd
    picks: list[tuple[list[Code], bool]] = []  # per level picked: its conditions, a label?
    for part, key in zip(parts, keys):
        conditions: list[Code] = []
        kind = frame.dtype(key)
        if isinstance(part, slice) and part == slice(None):
            continue
        if not isinstance(part, slice):
            if {str: "str", int: "int"}.get(type(part)) != kind:
                raise ctx.todo("a label of another type than its key column (or a key of "
                               "unknown type)")
            picks.append(([emit.binop(emit.col(key), "==", emit.lit(part))], True))
            continue
        if part.step is not None:
            raise ctx.todo("a slice of labels with a step")
        if not frame.sorted_by_keys():
            raise ctx.todo("a slice of labels on rows porter does not know to be sorted by the "
                           "keys (pandas raises unless they are: sort_index() first)")
        for bound, op in ((part.start, ">="), (part.stop, "<=")):
            if bound is None:
                continue
            if kind == "datetime" and isinstance(bound, str) and _DAY_TEXT.fullmatch(bound):
                day = pd.Timestamp(bound)
                if op == ">=":
                    conditions.append(emit.binop(emit.col(key), ">=", _datetime_code(day)))
                else:  # the whole day: before the next one
                    conditions.append(emit.binop(emit.col(key), "<",
                                                 _datetime_code(day + pd.Timedelta(days=1))))
            elif {str: "str", int: "int"}.get(type(bound)) == kind and kind in ("str", "int"):
                conditions.append(emit.binop(emit.col(key), op, emit.lit(bound)))
            else:
                raise ctx.todo("a slice whose ends are not of its key's type (text or whole "
                               "numbers; a day written as text on a date key)")
        ctx.lower("a slice of a level on rows holding a missing key: pandas raises (its labels "
                  "are not sorted then), Polars leaves the row out", 0.95)
        if conditions:
            picks.append((conditions, False))
    if not picks:
        return frame
    if not any(label for _, label in picks):
        # slices only: the rows between their ends, none at all without an error
        return derive(frame, frame.code.method("filter", *(c for cs, _ in picks for c in cs)),
                      same_rows=False)
    # a label no row holds, or one that leaves no row with the picks before it: pandas'
    # KeyError, checked on the rows (pandas_level_rows)
    code = emit.call(LEVEL_ROWS_FUNCTION, frame.code.method("collect"), emit.atom(
        "[" + ", ".join(f"({_all(c).text}, {l})" for c, l in picks) + "]"),
        emit.atom(repr(parts))).method("lazy")
    return derive(frame, code, same_rows=False)


def _all(conditions: list[Code]) -> Code:
    code = conditions[0]
    for other in conditions[1:]:
        code = emit.binop(code, "&", other)
    return code


def _row_at(frame: Frame, position: Code, ctx: RuleContext) -> Value:
    """df.loc[df["c"].idxmax()] of the frame the label was read from, or df.iloc[0] /
    df.iloc[-1] (a literal position): that one row, picked in
    Polars (pl.all().get(position)), handed to pandas with its label (the row number, a label a
    filter or sort left, or the groupby key) as the one-row frame's index, and taken as pandas'
    row Series (.iloc[0]): its values typed as pandas types a row of that frame, named by its
    label, and read as pandas' Series by the code after it."""
    if not frame.index and frame.labels_intact:
        if frame.columns is None or ROW_LABELS in frame.columns:
            raise Unsupported("a row of a frame whose columns porter does not know")
        frame = with_row_labels(frame)  # the label of a row is its number
    elif not frame.index:
        raise Unsupported("the row's label (its Series' name) is its number before a filter or "
                          "sort, which porter does not keep here: bind the filtered frame to a "
                          "name first, or read the row with .row(0, named=True)")
    # (a position past the rows raises OutOfBoundsError, as pandas raises IndexError)
    picked = replace(frame, code=frame.code.method("select", emit.pl("all").method("get", position)))
    ctx.handover = True
    chain = to_pandas(picked)
    if chain.base is not None and chain.steps:  # laid out one step per line, .iloc[0] the last
        return PandasValue(Code(f"{chain.text}.iloc[0]", emit.ATOM, chain.base, (*chain.steps, ".iloc[0]")))
    return PandasValue(chain.attr("iloc").index(0))


@rule("frame.at")
def frame_at(call: PandasCall, ctx: RuleContext) -> Value:
    """df.at["label", "c"] -> df.filter(pl.col(key) == "label").select("c").collect().item(),
    on a table labelled by one key column (set_index, read_csv(index_col=), a groupby's keys,
    crosstab, pivot_table).

    Handles: a label no row holds raises, as in pandas (KeyError there).
    Caveats: the value is Python's: None for a missing value where pandas gives nan, an int
    where pandas gives numpy's int64 (which divides by zero to inf); a label several rows hold
    raises where pandas gives a Series of their values (0.9). Labels of several keys, row
    numbers and a label of another type than the key are TODOs."""
    frame = frame_of(call)
    if len(call.args) != 2:
        raise ctx.todo("one label and one column name: df.at[label, column]")
    rows, cols = call.args
    if not ((_one_label(rows) or _label_read(rows, frame))
            and isinstance(cols, Opaque) and isinstance(cols.const, str)):
        raise ctx.todo("one label and one column name written in the script")
    return _labelled_value(frame, rows, cols, ctx)


def _label_read(value: Value, frame: Frame) -> bool:
    """A label computed when the script runs (`top = t.index[0]`), of the type of the one key
    column labelling `frame`: a Python value porter compares the key with."""
    return isinstance(value, (Scalar, Opaque)) and not (isinstance(value, Opaque) and value.is_const) \
        and not value.sites and len(frame.index) == 1 \
        and {"str": "str", "text": "str", "int": "int"}.get(value.pytype or "") \
        == frame.dtype(frame.index[0])


def _label_tuple(value: Value) -> bool:
    """A tuple of labels written out, one per level (df.loc[("a", 2)])."""
    return isinstance(value, Opaque) and isinstance(value.const, tuple) and bool(value.const) \
        and all(isinstance(p, (str, int)) and not isinstance(p, bool) for p in value.const)


def _one_label(value: Value) -> bool:
    return isinstance(value, Opaque) and value.is_const and isinstance(value.const, (str, int)) \
        and not isinstance(value.const, bool)


def _labelled_value(frame: Frame, label: Opaque, col: Opaque, ctx: RuleContext) -> Value:
    """The value of column `col` on the row labelled `label` of a table labelled by one key
    column: the one row whose key is the label, its value read with item() (which raises
    unless exactly one row has the label)."""
    if len(frame.index) != 1 or row_labels_carried(frame):
        raise ctx.todo("rows chosen by index label: the index is not data in Polars (one key "
                       "column holding the labels is ported)")
    key, name = frame.index[0], col.const
    kinds = {str: "str", int: "int"}
    computed = not (isinstance(label, Opaque) and label.is_const)
    if not computed and kinds.get(type(label.const)) != frame.dtype(key):
        raise ctx.todo("a label of another type than the key column (or a key of unknown type)")
    if name == key or frame.columns is not None and name not in frame.columns:
        raise ctx.todo(f"{name!r} is not a column of the frame (pandas raises KeyError)")
    ctx.lower("the value is Python's: None for a missing value where pandas gives nan, an int "
              "where pandas gives numpy's int64; a label several rows hold raises where pandas "
              "gives a Series of their values", 0.9)
    wanted = emit.lit(label.const) if not computed else label.code
    if computed and getattr(label, "pytype", None) == "text":
        # pandas' text value, nan where it is missing (materialize.series_position): Polars
        # compares no text with a float
        wanted = emit.atom(f"pl.lit(next((None if v != v else v for v in [{label.code.text}])), "
                           "dtype=pl.String)")
    code = frame.code.method("filter", emit.binop(emit.col(key), "==", wanted)) \
        .method("select", name).method("collect").method("item")
    pytype = frame.dtype(name)
    return Scalar(code, pytype=pytype if pytype in ("int", "float", "str", "bool") else None)


# print(df.loc[label]) without pandas: the rows holding the label, or pandas' KeyError
LABEL_ROWS_FUNCTION = "pandas_label_rows"
LABEL_ROWS_DEFINITION = '''\
def pandas_label_rows(rows, label):
    """The rows of df.loc[label] to print (those whose keys hold the label, picked in Polars),
    shown as Polars shows a frame; KeyError where no row holds it, as pandas raises."""
    if not rows.height:
        raise KeyError(label)
    return rows
'''


# df.loc[pd.IndexSlice["a", :]] without pandas: the rows each level's label or slice picks,
# or pandas' KeyError as MultiIndex.get_locs raises it
LEVEL_ROWS_FUNCTION = "pandas_level_rows"
LEVEL_ROWS_DEFINITION = '''\
def pandas_level_rows(rows, picks, key):
    """The rows of df.loc[key] of a table labelled by several keys, each level's pick (a
    label or a slice, as a condition on its key) applied in turn as pandas does: KeyError
    where a label no row holds, or one that leaves no row with the picks before it (a slice
    never raises: pandas takes it among the rows picked so far)."""
    matched = rows.select(
        *(pick.fill_null(False).sum().alias(f"one{i}") for i, (pick, _) in enumerate(picks)),
        *(pl.all_horizontal([p.fill_null(False) for p, _ in picks[: i + 1]]).sum().alias(f"all{i}")
          for i in range(len(picks))),
    ).row(0)
    for i, (_, label) in enumerate(picks):
        one, kept = matched[i], matched[len(picks) + i]
        if label and (not one or not kept):
            raise KeyError(key)
    return rows.filter(*(p for p, _ in picks))
'''


def _rows_by_label(frame: Frame, label: Opaque, ctx: RuleContext) -> Value:
    """df.loc["label"] of a table labelled by one key column (set_index, read_csv(index_col=),
    a groupby's keys), or df.loc[("a", "b")] of one labelled by as many: the rows whose keys
    are the labels, picked in Polars (a filter, so only they are collected), handed to pandas
    with the keys as their index and read there with .loc[label]. pandas decides what it gives
    as on the whole table: the row Series (values typed as pandas types a row of that frame,
    named by the label) when one row holds the label, a frame of those rows in their order
    when several do (porter cannot tell which from the script: a key read from a file may
    repeat), KeyError when none does. Only printed or displayed, the rows are shown in Polars
    (pandas_label_rows), as a printed frame is."""
    parts = label.const if isinstance(label.const, tuple) else (label.const,)
    if not frame.index or len(parts) > len(frame.index) or row_labels_carried(frame) \
            or isinstance(label.const, tuple) and len(frame.index) == 1:
        raise ctx.todo("rows chosen by index label: the index is not data in Polars (keys "
                       "holding the labels, one label per key, are ported)")
    kinds = {str: "str", int: "int"}
    if any(kinds.get(type(p)) != frame.dtype(k) for p, k in zip(parts, frame.index)):
        raise ctx.todo("a label of another type than the key column (or a key of unknown type)")
    picked = derive(frame, frame.code.method("filter", *(
        emit.binop(emit.col(k), "==", emit.lit(p)) for p, k in zip(parts, frame.index))),
        same_rows=False)
    if ctx.shown:
        # only printed or displayed: the rows are shown as Polars shows a frame (as print(df)
        # is), without importing pandas for them (the import costs more than the script's
        # own work on a short run); KeyError where no row holds the label, as pandas raises
        return Opaque(emit.call(LABEL_ROWS_FUNCTION, picked.code.method("collect"),
                                emit.lit(label.const)), sites=label.sites)
    ctx.handover = True
    chain = to_pandas(picked)
    step = f".loc[{emit.lit(label.const).text}]"
    rows = (picked, label.const)  # a reduction of the row is computed without pandas
    if chain.base is not None and chain.steps:  # laid out one step per line, .loc[...] the last
        return PandasValue(Code(f"{chain.text}{step}", emit.ATOM, chain.base, (*chain.steps, step)),
                           label_rows=rows)
    return PandasValue(chain.attr("loc").index(label.const), label_rows=rows)


# df.loc[label].sum() of a table of numbers without pandas: the row's floats added as numpy adds
ROW_SUM_FUNCTION = "pandas_row_sum"
ROW_SUM_DEFINITION = '''\
def pandas_row_sum(rows, keys, label, by_pandas):
    """df.loc[label].sum() without pandas, where one row holds the label and its values are
    numbers, one float column or more: pandas' row is then float64 (whole numbers become
    floats, a missing value is NaN), and its sum counts a missing value 0 and adds as numpy
    adds. KeyError where no row holds the label. Where several do (pandas' .loc gives a
    frame, whose sum is per column), or the values are of other types (whole numbers only,
    whose row type pandas decides from missing values anywhere in the columns; text,
    True/False, dates), by_pandas(rows) computes it with pandas from the rows."""
    found = rows.collect()
    if not found.height:
        raise KeyError(label)
    values = found.drop(keys)
    types = values.schema.values()
    if found.height != 1 or pl.Float64 not in types or not all(
            t.is_integer() or t in (pl.Float32, pl.Float64) for t in types):
        return by_pandas(rows)
    import numpy as np

    numbers = np.array([np.nan if v is None else v for v in values.cast(pl.Float64).row(0)],
                       dtype=np.float64)
    numbers[np.isnan(numbers)] = 0.0
    return numbers.sum()
'''


@rule("frame.loc.row.sum")
def label_row_sum(call: PandasCall, ctx: RuleContext) -> Value:
    """df.loc[label].sum() -> the sum of the row holding the label, computed from the rows
    picked in Polars (pandas_row_sum), without handing them to pandas.

    Handles: a row of numbers, one float column or more (pandas' row is then float64: whole
    numbers become floats, a missing value or NaN is skipped), added as numpy adds them
    (pandas' sum); KeyError where no row holds the label. Decided on the rows when the
    script runs (the columns of a pivot are known only then): a label several rows hold
    (pandas' .loc gives a frame, whose sum is per column), and rows of whole numbers only
    (pandas' row type depends on missing values anywhere in a column), of text, True/False or
    dates are summed by pandas from the rows picked.
    Caveats: options of sum stay on pandas."""
    receiver = call.receiver
    assert isinstance(receiver, PandasValue) and receiver.label_rows is not None
    picked, label = receiver.label_rows
    by_pandas = receiver.code.method(
        "sum", *(a.code for a in call.args), **{k: v.code for k, v in call.kwargs.items()})
    if call.args or call.kwargs:
        ctx.handover = True  # pandas' own sum of the row it was handed
        return PandasValue(by_pandas)
    handed = to_pandas(replace(picked, code=emit.atom("rows")))
    lazy = emit.atom(f"lambda rows: {handed.text}.loc[{emit.lit(label).text}].sum()")
    return Scalar(emit.call(ROW_SUM_FUNCTION, picked.code, emit.lit(list(picked.index)),
                            emit.lit(label), lazy))


def _column_label_slice(frame: Frame, piece: slice) -> Frame:
    """df.loc[:, "a":"c"]: the columns from a to c, both included, in the frame's order (a
    label slice is inclusive in pandas), computed from the columns porter knows."""
    if frame.columns is None:
        raise Unsupported("a slice of column labels of a frame whose columns porter does not "
                          "know (run with --data)")
    if frame.index:
        raise Unsupported("a slice of column labels beside keys pandas keeps in the index")
    names = list(frame.columns)
    for bound in (piece.start, piece.stop):
        if bound is not None and not (isinstance(bound, str) and bound in names):
            # pandas raises KeyError for a label that is not a column
            raise Unsupported(f"the slice bound {bound!r} is not a column porter knows")
    step = piece.step
    if step is not None and not (isinstance(step, int) and not isinstance(step, bool) and step > 0):
        raise Unsupported("a slice of column labels with a step other than a positive number")
    start = names.index(piece.start) if piece.start is not None else 0
    stop = names.index(piece.stop) + 1 if piece.stop is not None else len(names)
    chosen = names[start:stop:step]
    if not chosen:
        # pandas keeps the rows with no columns; a Polars frame without columns has no rows
        raise Unsupported("a slice of column labels that chooses no column")
    return select_columns(frame, frame.code.method("select", *chosen), chosen)


@rule("frame.index")
def frame_index(call: PandasCall, ctx: RuleContext) -> Value:
    """df.index -> the index key's dates, on a table indexed by one date key.

    Handles: a resample, a pivot or an unstack by time; the DatetimeIndex methods (strftime,
    year, month_name …) are Series.dt's: idx.strftime(fmt) is dt.to_string(fmt).

    Any other index of one key (a groupby's text keys) is that key column; the labels 0..n-1
    of a frame not filtered or sorted are its row numbers (pl.int_range(pl.len())).
    Caveats: labels after a filter or sort, and several keys, are TODOs: the index is not data
    in Polars."""
    frame = call.receiver
    assert isinstance(frame, Frame)
    return _index_of(frame, ctx)


@rule("series.index")
def series_index(call: PandasCall, ctx: RuleContext) -> Value:
    """s.index -> the index key column, on a Series labelled by one key (a groupby's, the
    column names of df.sum()): its values as a column of the Series' frame.

    Handles: list(s.index), s.index.tolist(), iteration and comparisons read the key's values
    in the Series' order; a date key's DatetimeIndex methods are Series.dt's.
    Caveats: row numbers and several keys are TODOs."""
    column = call.receiver
    assert isinstance(column, Column)
    return _index_of(column.frame, ctx)


def _index_of(frame: Frame, ctx: RuleContext) -> Value:
    """The labels of a table indexed by one key column, as that column; of a frame still
    labelled 0..n-1, its row numbers (pl.int_range: pandas' RangeIndex)."""
    if not frame.index and frame.labels_intact:
        numbers = emit.pl("int_range", emit.pl("len"), dtype=emit.atom("pl.Int64"))
        # pandas' RangeIndex: read by position too (df.index[-1] is the last row number)
        return Column(numbers, frame=frame, name=None, dtype="int", index_values=True)
    if len(frame.index) > 1 and not frame.index_unnamed:
        # a MultiIndex: get_level_values read on s.index itself is index_get_level_values;
        # otherwise handed over as pandas' index of the frame
        return Accessor(Code(f"{frame.code.text}.index"), column=column_of(frame, frame.index[0]),
                        kind="levels", index_of=frame)
    if len(frame.index) != 1:
        raise ctx.todo("the index is not data in Polars: keep the labels in a column "
                       "(with_row_index) and use it")
    key = frame.index[0]
    if frame.dtype(key) == "datetime":
        return Accessor(Code(f"{frame.code.text}.index"), column=column_of(frame, key),
                        kind="dt", index_of=frame)
    return replace(column_of(frame, key), name=None if frame.index_unnamed else key,
                   index_values=True)


def index_level(owner: Value, level: Value) -> str | None:
    """The key column of level `level` (a name or a position) of the index of `owner` (a
    table or Series labelled by key columns), or None."""
    frame = owner.frame if isinstance(owner, Column) else owner
    if not isinstance(frame, Frame) or not frame.index or row_labels_carried(frame) \
            or frame.index_unnamed or not isinstance(level, Opaque):
        return None
    keys = list(frame.index)
    if isinstance(level.const, str) and keys.count(level.const) == 1:
        return level.const
    if type(level.const) is int and -len(keys) <= level.const < len(keys):
        return keys[level.const]
    return None


@rule("frame.index.get_level_values")
def index_get_level_values(call: PandasCall, ctx: RuleContext) -> Value:
    """df.index.get_level_values("k") -> the key column k, as pandas' Index of its values.

    Handles: a table or Series labelled by one or more key columns (a groupby's keys,
    set_index([...])), the level named or given by position: the key's values in the rows'
    order, read as pandas' Index (by position, named by the level).
    Caveats: the evaluator only calls this rule where index_level finds the level; row numbers
    and carried labels take the plain path."""
    owner = call.receiver
    frame = owner.frame if isinstance(owner, Column) else owner
    assert isinstance(frame, Frame)
    key = index_level(owner, call.args[0])
    if key is None:
        raise ctx.todo("a level the index does not have (pandas raises KeyError)")
    # pandas' Index of the level's values: the other levels are not labels of it
    return replace(column_of(replace(frame, index=()), key), name=key, index_values=True)


@rule("frame.droplevel")
def droplevel(call: PandasCall, ctx: RuleContext) -> Value:
    """df.droplevel("k") -> .drop("k"), on a table labelled by several key columns (a Series:
    rows.series_droplevel).

    Handles: levels named or given by position, one or a list; the rows stay as they are, the
    other keys label them (no longer known to be distinct).
    Caveats: axis=1 (levels of column labels), dropping every level (pandas raises), row
    numbers and carried labels are TODOs."""
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "level", "axis", positional=1)
    if call.const("axis", None, 0, kinds=(int, str)) not in (0, "index", "rows"):
        raise ctx.todo("levels of the column labels (axis=1)")
    given = call.const("level", 0, None, kinds=(str, int, list))
    levels = given if isinstance(given, list) else [given]
    keys = list(frame.index)
    if len(keys) < 2 or row_labels_carried(frame) or frame.index_unnamed:
        raise ctx.todo("an index of fewer than two named key columns")
    dropped = []
    for level in levels:
        found = index_level(frame, Opaque(emit.lit(level), const=level))
        if found is None or found in dropped:
            raise ctx.todo(f"a level the index does not have: {level!r} (pandas raises)")
        dropped.append(found)
    if len(dropped) == len(keys):
        raise ctx.todo("dropping every level (pandas raises ValueError)")
    code = frame.code.method("drop", *dropped)
    columns = None if frame.columns is None else tuple(c for c in frame.columns if c not in dropped)
    result = derive(frame, code, same_rows=True, columns=columns,
                    dtypes=tuple((c, t) for c, t in frame.dtypes if c not in dropped))
    # the keys left may repeat: no longer a groupby's distinct, sorted labels
    return replace(result, index=tuple(k for k in keys if k not in dropped), grouped_rows=None,
                   levels_as_met=False, levels_with_missing=False)


@rule("frame.index.assign")
def frame_index_assign(call: PandasCall, ctx: RuleContext) -> Value:
    """df.index = <a column of df's rows> -> the index key column replaced, under its name.

    Handles: a table indexed by one key (df.index = df.index.strftime("%Y-%m")).

    Caveats: other values (a list, another frame's column) and frames without an index key
    are TODOs."""
    frame = call.receiver
    assert isinstance(frame, Frame)
    value = call.args[0]
    if len(frame.index) != 1 or not isinstance(value, Column):
        raise ctx.todo("new row labels: keep them in a column and use it")
    key = frame.index[0]
    code = frame.code.method("with_columns", ctx.expr(value, frame).method("alias", key))
    dtypes = tuple((c, t) for c, t in frame.dtypes if c != key)
    if value.dtype is not None:
        dtypes += ((key, value.dtype),)
    return derive(frame, code, same_rows=True, dtypes=dtypes, grouped_rows=None)


@rule("frame.head", "frame.tail")
def head(call: PandasCall, ctx: RuleContext) -> Value:
    """df.head(n) / df.tail(n) -> .head(n) / .tail(n)."""
    ctx.reject_unknown(call, "n", positional=1)
    frame = frame_of(call)
    n = call.const("n", 0, 5)
    if not isinstance(n, int) or n < 0:
        raise Unsupported(f"{call.name} with a negative or computed count needs the frame's length")
    # head keeps the first labels 0..n-1; tail does not
    intact = frame.labels_intact and call.name == "head"
    return derive(frame, frame.code.method(call.name, n), same_rows=False, labels_intact=intact)


@rule("series.head", "series.tail")
def series_head(call: PandasCall, ctx: RuleContext) -> Value:
    """s.head(n) -> the column of frame.head(n)."""
    column = call.receiver
    assert isinstance(column, Column)
    n = call.const("n", 0, 5)
    if not isinstance(n, int) or n < 0:
        raise Unsupported("a negative or computed count needs the frame's length")
    column = values_fixed(column)  # a rank or running sum keeps the values of all rows
    frame = column.frame
    rows = derive(frame, frame.code.method(call.name, n), same_rows=False,
                  labels_intact=frame.labels_intact and call.name == "head")
    return Column(column.code, frame=rows, name=column.name, dtype=column.dtype,
                  null_is_false=column.null_is_false, refs=column.refs, versions=column.versions)


@rule("frame.copy", "series.copy")
def copy(call: PandasCall, ctx: RuleContext) -> Value:
    """df.copy() -> the same LazyFrame (Polars values are never changed in place)."""
    assert call.receiver is not None
    return call.receiver


def data_columns(frame: Frame) -> Code:
    """The frame without the columns pandas keeps in the index (a groupby's keys): what
    pandas' df.columns and df.shape[1] count."""
    return frame.code.method("drop", *frame.index) if frame.index else frame.code


@rule("frame.columns")
def columns(call: PandasCall, ctx: RuleContext) -> Value:
    """df.columns -> .collect_schema().names() (no data is read).

    Handles: a groupby's keys, which pandas keeps in the index, are left out; the
    (column, function) pairs of MultiIndex columns (agg with lists) are a list of pairs.
    """
    frame = frame_of(call)
    pairs = dict(frame.column_pairs)
    if pairs:
        names = [c for c in frame.columns if c not in frame.index] if frame.columns is not None \
            else None
        if names is None:
            # the pairs of a table whose columns the data decides (a pivot_table dropped the
            # columns without a value): read at run time; a column that is not a pair fails
            ctx.lower("pandas' columns are a MultiIndex: here a list of its (column, function) "
                      "pairs", 0.9)
            items = ", ".join(f"{emit.lit(flat).text}: ({emit.lit(a).text}, {emit.lit(b).text})"
                              for flat, (a, b) in pairs.items())
            listed = data_columns(frame).method("collect_schema").method("names")
            return Scalar(emit.atom(f"[{{{items}}}[c] for c in {listed.text}]"), pytype="list",
                          of=frame)
        if any(n in pairs for n in names) and not all(n in pairs for n in names):
            raise ctx.todo("pandas' columns are a MultiIndex here, with columns that are not "
                           "(column, function) pairs")
        if any(n in pairs for n in names):
            ctx.lower("pandas' columns are a MultiIndex: here a list of its (column, function) "
                      "pairs", 0.9)
            items = ", ".join(f"({emit.lit(pairs[n][0]).text}, {emit.lit(pairs[n][1]).text})"
                              for n in names)
            return Scalar(emit.atom(f"[{items}]"), pytype="list", of=frame)
    if frame.number_labels:
        # pandas labels these columns with integers (a Series reset without a name: 0)
        if frame.columns is None:
            raise ctx.todo("pandas labels some columns with integers here, and porter does not "
                           "know the others")
        names = [c for c in frame.columns if c not in frame.index]
        items = ", ".join(str(int(n)) if n in frame.number_labels else emit.lit(n).text
                          for n in names)
        return Scalar(emit.atom(f"[{items}]"), pytype="list", of=frame)
    names = data_columns(frame).method("collect_schema").method("names")
    if frame.dates_as_text is not None:
        # a pivot's date columns, named already by the text the statement after the pivot
        # makes of them (df.columns = df.columns.strftime(...)): only that reads them
        return Scalar(names, pytype="names.dates", of=frame)
    if frame.int_labels_except is not None:
        # a pivot on an integer key: pandas' labels are the key's values (2024), Polars' their
        # text ("2024"); selections by them find the text again (_by_text)
        texts = emit.render(tuple(frame.int_labels_except))
        return Scalar(emit.atom(f"[int(c) if c not in {texts} and c.removeprefix(\"-\")"
                                f".isdecimal() else c for c in {names.text}]"),
                      pytype="list", of=frame)
    return Scalar(names, pytype="list[str]", of=frame)


@rule("frame.columns.strftime")
def columns_strftime(call: PandasCall, ctx: RuleContext) -> Value:
    """df.columns.strftime(format) of a pivot's date columns -> nothing (the pivot's names).

    In `df.columns = df.columns.strftime(format)` right after the pivot: the pivot named the
    columns by the dates written with that format (Polars' dt.to_string, the directives
    checked to write what pandas writes), in the order of the dates.

    Caveats: any other use of a pivot's date columns is a TODO (the pivot itself stays pandas
    where no such statement follows it)."""
    names = call.receiver
    assert isinstance(names, Scalar) and isinstance(names.of, Frame)
    ctx.reject_unknown(call, "date_format", positional=1)
    fmt = call.const("date_format", 0, None, kinds=(str,))
    if names.pytype != "names.dates" or fmt != names.of.dates_as_text:
        raise ctx.todo("strftime of columns other than a pivot's dates named by it")
    return Scalar(names.code, pytype="names.formatted", of=names.of)


@rule("frame.columns.droplevel")
def columns_droplevel(call: PandasCall, ctx: RuleContext) -> Value:
    """df.columns.droplevel(n) of the (column, function) pairs of MultiIndex columns -> the
    names of the level kept, as a list (porter's columns are flat: "kg_sum" for ("kg", "sum")).

    Handles: level 0 or 1 (-1, -2) of two levels; the names may repeat, as pandas' do (a new
    df.columns that repeats a name is a TODO there); a table whose columns the data decides
    (pivot_table dropping a column without a value) gets the names of those it has, at
    run time.
    Caveats: a level named by text, or several levels, is a TODO.
    """
    names = call.receiver
    assert isinstance(names, Scalar) and isinstance(names.of, Frame)
    frame = names.of
    ctx.reject_unknown(call, "level", positional=1)
    level = call.const("level", 0, None, kinds=(int, list))
    if isinstance(level, list) and len(level) == 1:
        level = level[0]
    if isinstance(level, bool) or level not in (0, 1, -1, -2):
        raise ctx.todo("a level other than 0 or 1 of the two levels of (column, function) pairs")
    pairs = dict(frame.column_pairs)
    keep = 1 - level % 2  # droplevel(0) keeps the second name
    data = [c for c in frame.columns if c not in frame.index] if frame.columns is not None \
        else None
    if data is not None and not all(c in pairs for c in data):
        raise ctx.todo("pandas' columns are a MultiIndex here, with columns that are not "
                       "(column, function) pairs")
    if data is not None:
        kept = [str(pairs[c][keep]) for c in data]
        return Opaque(emit.lit(kept), const=kept)
    # the names read at run time; df.columns = ... renames the flat names it finds
    # (rules/assign.py, set_columns)
    renames = {flat: str(pair[keep]) for flat, pair in pairs.items()}
    listed = data_columns(frame).method("collect_schema").method("names")
    return LevelNames(emit.atom(f"[{emit.lit(renames).text}[c] for c in {listed.text}]"),
                      renames=tuple(renames.items()), of=frame.code)


@dataclass(frozen=True)
class LevelNames(Opaque):
    """df.columns.droplevel(n) of a frame whose columns the data decides: the names at run
    time (`code`), and each flat name with the name it gets, for df.columns = ... of the
    frame whose code is `of`."""

    renames: tuple[tuple[str, str], ...] = field(kw_only=True)
    of: Code = field(kw_only=True)


def _by_text(frame: Frame, names: Code) -> Code:
    """Column names as Polars holds them where pandas labels a pivot's columns with the
    integer key's values (2024 is the column "2024")."""
    if frame.int_labels_except is None:
        return names
    return emit.atom(f"[str(c) for c in {names.text}]")


def _probe(expr: Code) -> Code:
    """At most one row of a column that leads pandas to the column's dtype: its first value,
    or a missing value where the column holds one anywhere (an int column with a missing value
    reaches pandas as float64, a True/False one as object), and no row in an empty frame (an
    empty int column stays int64)."""
    return emit.pl("when", emit.unary("~", expr.method("is_null").method("any"))).method(
        "then", expr.method("head", 1))


# The same for every column, defined once at the top of a converted script that reads dtypes.
DTYPE_PROBE_CONSTANT = "PANDAS_DTYPE_PROBE"
DTYPE_PROBE_DEFINITION = f"""\
# One row per column that gives pandas the dtype of the whole column: the first value, or a
# missing value where the column holds one (pandas makes such an int column float64 and a
# True/False one object); no row when the frame has none.
{DTYPE_PROBE_CONSTANT} = {_probe(emit.pl("all")).text}
"""


# print(df.dtypes) without pandas: its text written from the probe row's Polars types
DTYPES_TEXT_FUNCTION = "pandas_dtypes_text"
DTYPES_TEXT_DEFINITION = '''\
def pandas_dtypes_text(probe):
    """print(df.dtypes) as pandas prints it, from the frame's probe row (PANDAS_DTYPE_PROBE),
    without importing pandas: each column's type as pandas names it (an integer column with a
    missing value is float64, a True/False one object), names to the left and types to the
    right, only the first and last five of more than sixty columns."""
    kinds = []
    for name, dtype in probe.schema.items():
        missing = probe[name].has_nulls()
        if dtype.is_integer() and dtype not in (pl.Int128, pl.UInt128):
            kind = "float64" if missing else str(dtype).lower()
        elif dtype in (pl.Float32, pl.Float64):
            kind = str(dtype).lower()
        elif dtype == pl.Boolean:
            kind = "object" if missing else "bool"
        elif dtype == pl.String:
            kind = "str"
        elif dtype == pl.Categorical or isinstance(dtype, pl.Enum):
            kind = "category"
        elif isinstance(dtype, pl.Datetime):
            zone = f", {dtype.time_zone}" if dtype.time_zone else ""
            kind = f"datetime64[{dtype.time_unit}{zone}]"
        elif dtype == pl.Date:
            kind = "datetime64[ms]"
        elif isinstance(dtype, pl.Duration):
            kind = f"timedelta64[{dtype.time_unit}]"
        elif dtype in (pl.Time, pl.Null, pl.Binary) \\
                or isinstance(dtype, (pl.List, pl.Array, pl.Struct, pl.Decimal)):
            kind = "object"
        else:
            kind = None
        if kind is None or "\\t" in name or "\\r" in name or "\\n" in name:  # pandas names it
            return str(probe.to_pandas().dtypes)
        kinds.append((name, kind))
    if not kinds:
        return "Series([], dtype: object)"
    footer = "dtype: object"
    if len(kinds) > 60:
        footer = f"Length: {len(kinds)}, dtype: object"
        kinds = [*kinds[:5], None, *kinds[-5:]]
    shown = [k for k in kinds if k is not None]
    left = max(len(name) for name, _ in shown)
    right = max(len(kind) for _, kind in shown)
    lines = [" " * left + "   " + "...".center(right + 1) if k is None
             else k[0].ljust(left) + "    " + k[1].rjust(right) for k in kinds]
    return "\\n".join([*lines, footer])
'''


@rule("frame.dtypes")
def dtypes(call: PandasCall, ctx: RuleContext) -> Value:
    """df.dtypes -> pandas' own dtypes of one probe row per column handed over to pandas.

    Handles: pandas names the types itself (int64, str, datetime64[us], category), so code
    that prints or compares them sees what it saw; the frame is not copied to pandas, only a
    row that holds a missing value where the column does, which is all that decides the dtype
    to_pandas() gives (float64 for ints with a missing value, object for True/False ones).
    """
    frame = frame_of(call)
    _check_dtype_names(ctx)
    if ctx.nullable_ints_possible:
        marks = nullable_columns(frame)
        if marks is None or marks[1]:
            raise Unsupported("porter does not know which integer columns pandas holds as its "
                              "nullable Int64 here (named Int64, not int64 or float64)")
    probe = replace(frame, code=frame.code.method("select", emit.atom(DTYPE_PROBE_CONSTANT)))
    handed = to_pandas(probe)
    plain = probe.code.method("collect").method("to_pandas")
    # (a missing True/False made NaN, .fillna, changes no dtype name: object either way)
    plain_types = handed.text == plain.text or (
        handed.text.startswith(plain.text + ".fillna(") and handed.text.count(").") == plain.text.count(").") + 1)
    if ctx.printed and frame.int_labels_except is None and plain_types:
        # printed: pandas' text written from the probe's Polars types, pandas not imported
        # (not where the hand-over gives pandas types of its own: nullable ones from a file)
        return Scalar(emit.call(DTYPES_TEXT_FUNCTION, probe.code.method("collect")), pytype="str")
    return PandasValue(handed.attr("dtypes"))


# pandas' own nullable types, which Polars has no separate type for: a script that names them
# may hold columns pandas calls "string", "boolean" or "Float64", where porter's probe says
# str, bool (or object) and float64
_NULLABLE_NAMES = frozenset({"string", "boolean", "Float32", "Float64", "string[python]",
                             "string[pyarrow]", "StringDtype", "BooleanDtype", "Float32Dtype",
                             "Float64Dtype", "ArrowDtype", "convert_dtypes", "dtype_backend"})


def _check_dtype_names(ctx: RuleContext) -> None:
    module = ctx.python_module
    if module is None or _names_nullable_types(module):
        raise Unsupported("the script may make pandas' nullable string, boolean or float "
                          "columns, whose dtype names porter does not follow")


def nullable_values_lower(column: Column, ctx: RuleContext) -> None:
    """Values of a column handed to Python (tolist, values, unique, iloc) in a script that names
    pandas' nullable string, boolean or float types: pandas gives <NA> for a missing value of
    such a column, nan or None here, and porter does not follow which columns are."""
    module = ctx.python_module
    if module is None or not _names_nullable_types(module):
        if column.dtype in ("float", None) and ctx.nullable_ints_possible:
            ctx.lower("pandas' nullable integers divided or averaged are its nullable Float64, "
                      "whose missing value is <NA> (nan here)", 0.9)
        return
    if column.dtype in ("str", "bool", "float", None):
        # a TODO would not help: the hand-over reads the column back through to_pandas(),
        # which makes it a plain column again
        ctx.lower("the script names pandas' nullable string, boolean or float types: a "
                  "missing value of such a column is <NA> in pandas (nan or None here), and "
                  "porter does not follow which columns are", 0.8)


@functools.lru_cache(maxsize=16)
def _names_nullable_types(module: ast.Module) -> bool:
    for node in ast.walk(module):
        if isinstance(node, ast.Constant) and node.value in _NULLABLE_NAMES \
                or isinstance(node, ast.Attribute) and node.attr in _NULLABLE_NAMES \
                or isinstance(node, ast.Name) and node.id in _NULLABLE_NAMES \
                or isinstance(node, ast.keyword) and node.arg in _NULLABLE_NAMES:
            return True
    return False


@rule("series.dtype")
def dtype(call: PandasCall, ctx: RuleContext) -> Value:
    """s.dtype -> pandas' own dtype of one probe value of the column handed over to pandas.

    Handles: as df.dtypes (one row that holds a missing value where the column does)."""
    column = call.receiver
    assert isinstance(column, Column)
    _check_dtype_names(ctx)
    if ctx.nullable_ints_possible and column.nullable_int is None and column.dtype in ("int", None):
        raise Unsupported("porter does not know whether pandas holds this integer column as its "
                          "nullable Int64 (named Int64, not int64 or float64)")
    if column.frame.index or getattr(column, "pandas", None) is not None:
        return PandasValue(to_pandas(column).attr("dtype"))  # the labels go over too
    name = column.name if column.name is not None else "0"
    probe = replace(column.frame,
                    code=series_frame(column).method("select", emit.atom(DTYPE_PROBE_CONSTANT)),
                    columns=(name,))
    probe_column = replace(column, code=emit.col(name), frame=probe, null_is_false=False)
    return PandasValue(to_pandas(probe_column).attr("dtype"))


def row_count(frame: Frame) -> Code:
    return frame.code.method("select", emit.pl("len")).method("collect").method("item")


@rule("frame.shape")
def shape(call: PandasCall, ctx: RuleContext) -> Value:
    """df.shape -> (rows, columns): rows counted by a query, columns from the schema;
    df.shape[0] / df.shape[1] compute only the one asked for."""
    frame = frame_of(call)
    width = emit.call("len", data_columns(frame).method("collect_schema"))
    if call.args:
        position = call.args[0].const  # type: ignore[attr-defined]
        if position in (0, -2):
            return Scalar(row_count(frame), pytype="int")
        return Scalar(width, pytype="int")
    return Scalar(emit.Code(f"({row_count(frame).text}, {width.text})"), pytype="tuple")


@rule("series.shape")
def series_shape(call: PandasCall, ctx: RuleContext) -> Value:
    """s.shape -> (rows,): its frame's rows counted by a query; s.shape[0] counts only.

    Handles: a column of a frame (filtered or not), a groupby's result (one row per group)."""
    column = call.receiver
    assert isinstance(column, Column)
    count = row_count(column.frame)
    if call.args:  # s.shape[0] / s.shape[-1] (evaluate.shape_item)
        return Scalar(count, pytype="int")
    return Scalar(emit.Code(f"({count.text},)"), pytype="tuple")


@rule("builtin.len")
def length(call: PandasCall, ctx: RuleContext) -> Value:
    """len(df) / len(s) -> .select(pl.len()).collect().item()."""
    receiver = call.receiver
    if isinstance(receiver, Parts):  # str.extract's frame: one row per row of the text's frame
        return Scalar(row_count(receiver.source.frame), pytype="int")
    frame = receiver.frame if isinstance(receiver, Column) else receiver
    if isinstance(frame, Frame):
        # the count as an expression of its frame too (len(df) - df["k"].nunique(): one select)
        counted = Column(emit.pl("len").method("cast", emit.atom("pl.Int64")), frame=frame, name=None)
        return Scalar(row_count(frame), pytype="int", agg=counted)
    raise Unsupported("len of this value")


@rule("frame.empty")
def empty(call: PandasCall, ctx: RuleContext) -> Value:
    """df.empty -> a row count compared with 0."""
    return Scalar(emit.binop(row_count(frame_of(call)), "==", 0), pytype="bool")


@rule("series.getitem")
def series_getitem(call: PandasCall, ctx: RuleContext) -> Value:
    """s[mask] -> the column of frame.filter(mask); s[0] of labels 0..n-1 -> its value.

    Handles: a whole number written in the script, on a Series whose row labels are still
    pandas' 0..n-1 (s.mode()[0], a column of a frame read or made, not filtered or sorted):
    the label is the position, as s.iloc[i] takes it.
    """
    column = call.receiver
    assert isinstance(column, Column)
    key = call.args[0]
    if isinstance(key, Opaque) and type(key.const) is int and column.index_values:
        # an Index (s.index[0]) is read by position, whatever its values: the first key in
        # the Series' order (a negative position counts from the end in both)
        from porter.rules.materialize import series_position
        return series_position(call, ctx)
    if isinstance(key, Opaque) and type(key.const) is int and key.const >= 0 \
            and column.frame.labels_intact and not column.frame.index:
        from porter.rules.materialize import series_position
        return series_position(call, ctx)
    if isinstance(key, Opaque) and isinstance(key.const, slice):
        # s[a:b] of whole numbers is by position in pandas, whatever the labels
        column = values_fixed(column)  # a rank or running sum keeps the values of all rows
        rows = slice_rows(column.frame, key.const)
        return Column(column.code, frame=rows, name=column.name, dtype=column.dtype,
                      null_is_false=column.null_is_false, refs=column.refs,
                      versions=column.versions)
    if isinstance(key, Opaque) and key.is_const and unique_key(column.frame):
        return series_label(call, ctx)
    if not isinstance(key, Column):
        raise Unsupported("a Series indexed by label or position")
    mask = ctx.expr(key, column.frame)
    column = values_fixed(column)  # a rank or running sum keeps the values of all rows
    frame = column.frame
    filtered = derive(frame, frame.code.method("filter", mask), same_rows=False)
    return Column(ctx.expr(column, frame), frame=filtered, name=column.name, dtype=column.dtype,
                  refs=column.refs, versions=column.versions)


def unique_key(frame: Frame) -> bool:
    """Whether `frame` is labelled by one key column whose values are all different: a
    groupby's result in its own order, a Series indexed by column names (df.sum()), or value
    counts (Frame.distinct_labels)."""
    return len(frame.index) == 1 and (frame.grouped_rows == frame.rows or frame.index_unnamed
                                      or frame.distinct_labels == (frame.rows, frame.index))


@rule("series.loc")
def series_label(call: PandasCall, ctx: RuleContext) -> Value:
    """s["label"] / s.loc["label"] -> the value of the row whose key is the label, on a Series
    labelled by one key of distinct values (a groupby's, df.sum()'s column names).

    Handles: the value as s.iloc[0] of that row gives it (numpy numbers, nan for a missing
    one, pandas' text); a label no row holds raises, as in pandas (KeyError there).
    Caveats: labels of several keys, a list or slice of labels, keys that may repeat (after a
    concat or a sort) and a label of another type than the key are TODOs."""
    from porter.rules.materialize import series_position  # the value as pandas gives it
    column = call.receiver
    assert isinstance(column, Column)
    key = call.args[0] if len(call.args) == 1 else None
    frame = column.frame
    if not (isinstance(key, Opaque) and key.is_const and unique_key(frame)):
        raise ctx.todo("a label other than one value written in the script, or labels that "
                       "may repeat: filter the key column and take the value")
    name = frame.index[0]
    kinds = {str: "str", int: "int"}
    if kinds.get(type(key.const)) != frame.dtype(name):
        raise ctx.todo("a label of another type than the key column (or a key of unknown type)")
    column = values_fixed(column)  # a rank or running sum keeps the values of all rows
    frame = column.frame
    filtered = derive(frame, frame.code.method("filter", emit.binop(emit.col(name), "==",
                                                                  emit.lit(key.const))),
                      same_rows=False)
    one = Column(ctx.expr(column, frame), frame=filtered, name=column.name, dtype=column.dtype,
                 refs=column.refs, versions=column.versions, null_is_false=column.null_is_false)
    return series_position(replace(call, receiver=one, args=(Opaque(emit.lit(0), const=0),)), ctx)


# -- query ----------------------------------------------------------------------------------

_QUERY_NAME = re.compile(r"`([^`]+)`")


@rule("frame.query")
def query(call: PandasCall, ctx: RuleContext) -> Value:
    """df.query("kg > 10 and grade == 'A'") -> .filter(...) built from the same expression.

    Handles: `and`/`or`/`not`, comparisons (chained ones too), `in`/`not in` lists, @variables
    and backquoted names, a True/False column as a condition ("is_sold and kg > 0"); missing
    values compare as pandas compares them.
    """
    frame = frame_of(call)
    ctx.reject_unknown(call, "expr", positional=1)
    text = call.const("expr", 0)
    mask = query_mask(text, frame, ctx)
    return derive(frame, frame.code.method("filter", mask), same_rows=False)


def query_mask(text: str, frame: Frame, ctx: RuleContext) -> Code:
    try:
        tree = cst.parse_expression(_prepare_query(text))
    except cst.ParserSyntaxError:
        raise Unsupported("the query string is not a Python expression porter can read") from None
    return _QueryBuilder(frame, ctx).build(tree)


def _prepare_query(text: str) -> str:
    text = _QUERY_NAME.sub(lambda m: f"__col__{m.group(1).encode().hex()}", text)
    return re.sub(r"@([A-Za-z_]\w*)", r"__var__\1", text)


class _QueryBuilder:
    """Builds the Polars mask for a query string, with pandas' missing-value comparisons."""

    def __init__(self, frame: Frame, ctx: RuleContext) -> None:
        self.frame = frame
        self.ctx = ctx
        self.dated: dict[int, Code] = {}  # text nodes read as dates (see _read_date)

    def build(self, node: cst.BaseExpression) -> Code:
        code, _ = self.boolean(node)
        return code

    def boolean(self, node: cst.BaseExpression) -> tuple[Code, bool]:
        """(expression, whether null stands for pandas' False)"""
        if isinstance(node, cst.BooleanOperation):
            left, lnull = self.boolean(node.left)
            right, rnull = self.boolean(node.right)
            op = "&" if isinstance(node.operator, cst.And) else "|"
            return emit.binop(left, op, right), lnull or rnull
        if isinstance(node, cst.UnaryOperation) and isinstance(node.operator, (cst.Not, cst.BitInvert)):
            inner, null = self.boolean(node.expression)
            if null:
                inner = inner.method("fill_null", False)
            return emit.unary("~", inner), False
        if isinstance(node, cst.BinaryOperation) and isinstance(node.operator, (cst.BitAnd, cst.BitOr)):
            left, lnull = self.boolean(node.left)
            right, rnull = self.boolean(node.right)
            return emit.binop(left, "&" if isinstance(node.operator, cst.BitAnd) else "|", right), lnull or rnull
        if isinstance(node, cst.Comparison):
            return self.comparison(node)
        if isinstance(node, cst.Name) and not node.value.startswith("__var__") \
                and node.value not in ("True", "False", "None"):
            return self.condition_column(node), True
        if node.lpar:
            return self.boolean(node.with_changes(lpar=[], rpar=[]))
        raise Unsupported("this query expression is not a comparison porter ports")

    def condition_column(self, node: cst.Name) -> Code:
        """A column used as a condition ("is_sold and price > 0"): its True/False values; a
        missing value is no match, as pandas' `and`/`or` take it (pandas raises for a missing
        value in the bare column or under `not`)."""
        code = self.operand(node)
        name = node.value
        if name.startswith("__col__"):
            name = bytes.fromhex(name[len("__col__"):]).decode()
        dtype = self.frame.dtype(name)
        if dtype is None:
            self.ctx.lower(f"{name!r} is used as a condition: it must hold True/False (pandas "
                           "combines numbers bit by bit); run with --data to know its type", 0.9)
        elif dtype != "bool":
            raise Unsupported(f"the {dtype} column {name!r} used as a condition (pandas combines "
                              "its values bit by bit)")
        return code

    def comparison(self, node: cst.Comparison) -> tuple[Code, bool]:
        parts: list[Code] = []
        nullable = False
        left_node = node.left
        for target in node.comparisons:
            op = cst.Module([]).code_for_node(target.operator).strip()
            right_node = target.comparator
            if op not in ("in", "not in"):
                # a date written as text against a datetime column is a date to pandas
                self._read_date(left_node, right_node, op)
                self._read_date(right_node, left_node, op)
            kinds = {self._kind(left_node), self._kind(right_node)}
            if op in ("==", "!=") and "str" in kinds and kinds & {"number", "bool"}:
                # text against a number or True/False ("code == 7" on a text column): pandas
                # finds no value equal (every row False, True for !=), Polars refuses to compare
                parts.append(emit.pl("lit", op == "!="))
                left_node = target.comparator
                continue
            left = self.operand(left_node)
            if op in ("in", "not in"):
                right_node = self._comparable_items(left_node, right_node)
                values = self.operand(right_node)
                if _may_hold_none(right_node):
                    # pandas matches a missing value against None in the list
                    code = left.method("is_in", values, nulls_equal=True)
                    code = emit.unary("~", code) if op == "not in" else code
                else:
                    code = left.method("is_in", values)
                    if op == "not in":
                        code = emit.unary("~", code.method("fill_null", False))
                    else:
                        nullable = True
            elif op == "!=":
                code = emit.binop(left, "!=", self.operand(right_node)).method("fill_null", True)
            else:
                code = emit.binop(left, op, self.operand(right_node))
                nullable = True
            parts.append(code)
            left_node = target.comparator
        result = parts[0]
        for part in parts[1:]:
            result = emit.binop(result, "&", part)
        return result, nullable

    def _comparable_items(self, column: cst.BaseExpression, items: cst.BaseExpression) -> cst.BaseExpression:
        """A list of `in` without the values pandas never finds equal to the column's: numbers
        and True/False in a list for a text column, text for a number or True/False column
        ("code in [7, 8]" on text matches no row; Polars refuses to compare them)."""
        kind = self._kind(column)
        if kind is None or not isinstance(items, (cst.List, cst.Tuple)):
            return items
        never = {"number", "bool"} if kind == "str" else {"str"}
        kept = [e for e in items.elements if self._kind(e.value) not in never]
        if len(kept) == len(items.elements):
            return items
        kept = [e.with_changes(comma=cst.MaybeSentinel.DEFAULT) for e in kept]
        return cst.List(kept)

    def _kind(self, node: cst.BaseExpression) -> str | None:
        """"str", "number" or "bool" for an operand whose type is known: a literal, or a
        column of a known type; None otherwise (an @variable, an expression)."""
        if isinstance(node, cst.SimpleString):
            return "str"
        if isinstance(node, (cst.Integer, cst.Float)):
            return "number"
        if isinstance(node, cst.UnaryOperation) and isinstance(node.operator, cst.Minus) \
                and isinstance(node.expression, (cst.Integer, cst.Float)):
            return "number"
        if not isinstance(node, cst.Name) or node.value.startswith("__var__") or node.value == "None":
            return None
        if node.value in ("True", "False"):
            return "bool"
        name = node.value
        if name.startswith("__col__"):
            name = bytes.fromhex(name[len("__col__"):]).decode()
        dtype = self.frame.dtype(name)
        return {"str": "str", "int": "number", "float": "number", "bool": "bool"}.get(dtype or "")

    def _read_date(self, node: cst.BaseExpression, other: cst.BaseExpression, op: str) -> None:
        """Text compared with a column that holds datetimes is read as pandas reads it: its
        operand becomes pl.datetime(...), which Polars compares with the column."""
        if not (isinstance(node, cst.SimpleString) and isinstance(other, cst.Name)):
            return
        name = other.value
        if name.startswith("__var__") or name in ("True", "False", "None"):
            return
        if name.startswith("__col__"):
            name = bytes.fromhex(name[len("__col__"):]).decode()
        from porter.rules.ops import _as_datetime, _date_like
        text = Opaque(emit.lit(node.evaluated_value), const=node.evaluated_value)
        dtype = self.frame.dtype(name)
        if dtype is None and _date_like(text):
            self.ctx.lower("comparing with a date written as text: pandas parses it when the "
                           "column holds datetimes", 0.7)
        value = _as_datetime(text, Column(emit.col(name), frame=self.frame, name=name, dtype=dtype))
        if value is not text:
            if op in ("==", "!="):
                raise Unsupported("== and != in a query compare the text itself with the dates "
                                  "(pandas finds no date equal to it)")
            self.dated[id(node)] = value.code

    def operand(self, node: cst.BaseExpression) -> Code:
        if id(node) in self.dated:
            return self.dated[id(node)]
        if isinstance(node, cst.Name):
            if node.value.startswith("__var__"):
                return emit.atom(node.value[len("__var__"):])
            if node.value.startswith("__col__"):
                return emit.col(bytes.fromhex(node.value[len("__col__"):]).decode())
            if node.value in ("True", "False", "None"):
                return emit.atom(node.value)
            if self.frame.columns is not None and node.value not in self.frame.columns:
                raise Unsupported(f"{node.value!r} in the query is not a column")
            return emit.col(node.value)
        if isinstance(node, (cst.SimpleString, cst.Integer, cst.Float)):
            return emit.lit(node.evaluated_value)
        if isinstance(node, (cst.List, cst.Tuple)):
            items = [self.operand(e.value) for e in node.elements]
            return emit.atom("[" + ", ".join(i.text for i in items) + "]")
        if isinstance(node, cst.BinaryOperation) and not isinstance(node.operator, (cst.BitAnd, cst.BitOr)):
            op = cst.Module([]).code_for_node(node.operator).strip()
            return emit.binop(self.operand(node.left), op, self.operand(node.right))
        if isinstance(node, cst.UnaryOperation) and isinstance(node.operator, cst.Minus):
            return emit.unary("-", self.operand(node.expression))
        raise Unsupported("a query operand porter does not port")



def _may_hold_none(node: cst.BaseExpression) -> bool:
    """A list operand of `in` that is a variable (contents unknown) or lists None."""
    if isinstance(node, (cst.List, cst.Tuple)):
        return any(isinstance(e.value, cst.Name) and e.value.value == "None" for e in node.elements)
    return True


@rule("frame.explode")
def explode(call: PandasCall, ctx: RuleContext) -> Value:
    """df.explode(c) -> .explode(c, empty_as_null=True, keep_nulls=True) (I12).

    Handles: an empty list and a missing value each give one row with a missing value, as in
    pandas (Polars drops empty lists unless empty_as_null=True); several columns (both raise
    when a row's lists differ in length); ignore_index=True renumbers the labels 0..n-1.
    Caveats: pandas repeats a row's label for each element; a column not known to hold lists
    lowers confidence (pandas keeps a text value as is, Polars refuses a text column).
    """
    frame = frame_of(call)
    ctx.reject_unknown(call, "column", "ignore_index", positional=2)
    names = column_names(call.const("column", 0), "explode's columns")
    ignore_index = call.const("ignore_index", 1, False, kinds=(bool,))
    if set(names) & set(frame.index):
        raise Unsupported("a name of the frame's index, not a column (pandas raises KeyError)")
    dtypes = dict(frame.dtypes)
    for name in names:
        if frame.columns is not None and name not in frame.columns:
            raise Unsupported(f"column {name!r} is not in the frame (pandas raises KeyError)")
        kind = dtypes.get(name)
        if kind is None:
            ctx.lower(f"column {name!r} is taken to hold lists (pandas keeps other values as "
                      "they are; Polars refuses a column of text)", 0.95)
        elif not kind.startswith("list["):
            raise Unsupported(f"column {name!r} holds {kind} values, not lists: pandas keeps "
                              "them as they are")
        else:
            dtypes[name] = kind[len("list["):-1]
    code = frame.code.method("explode", emit.names_arg(names), empty_as_null=True,
                             keep_nulls=True)
    if frame.index and ignore_index:
        # the labels renumbered 0..n-1: the columns holding the index (row labels a filter or
        # sort left, a groupby's keys) go; without ignore_index each row's go with its values
        code = code.method("drop", *frame.index)
        dtypes = {c: t for c, t in dtypes.items() if c not in frame.index}
        return derive(frame, code, same_rows=False, labels_intact=True, index=(),
                      index_unnamed=False, dtypes=tuple(dtypes.items()),
                      columns=None if frame.columns is None else
                      tuple(c for c in frame.columns if c not in frame.index))
    return derive(frame, code, same_rows=False, labels_intact=bool(ignore_index),
                  dtypes=tuple(dtypes.items()))


@rule("series.explode")
def series_explode(call: PandasCall, ctx: RuleContext) -> Value:
    """s.explode() -> the column of frame.select(s).explode(..., empty_as_null=True,
    keep_nulls=True).

    Handles: an empty list and a missing value each give one missing value, as in pandas.
    Caveats: a column not known to hold lists lowers confidence, as for DataFrame.explode.
    """
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call, "ignore_index", positional=1)
    ignore_index = call.const("ignore_index", 0, False, kinds=(bool,))
    frame = column.frame
    if frame.index:
        raise Unsupported("a Series with an index porter keeps as columns")
    kind = column.dtype
    if kind is None:
        ctx.lower("the Series is taken to hold lists (pandas keeps other values as they are; "
                  "Polars refuses text)", 0.95)
    elif not kind.startswith("list["):
        raise Unsupported(f"the Series holds {kind} values, not lists: pandas keeps them as they are")
    name = column.name if column.name is not None else "0"
    expr = column.code if column.code.text == emit.col(name).text else \
        column.code.method("alias", name)
    code = frame.code.method("select", expr).method("explode", name, empty_as_null=True,
                                                     keep_nulls=True)
    element = kind[len("list["):-1] if kind else None
    rows = derive(frame, code, same_rows=False, columns=(name,), labels_intact=bool(ignore_index),
                  dtypes=((name, element),) if element else (), versions=((name, 0),),
                  index=())
    return column_of(rows, name) if column.name is not None else \
        Column(emit.col(name), frame=rows, name=None, dtype=element, refs=frozenset({name}),
               versions=((name, 0),))


# -- column names computed with string methods ----------------------------------------------

# Python's str methods that a rename function may call on each name (pandas calls the function
# itself, Polars' rename too), with the number of arguments each takes
NAME_METHODS = {"strip": (0, 1), "lstrip": (0, 1), "rstrip": (0, 1), "lower": (0, 0),
                "upper": (0, 0), "casefold": (0, 0), "replace": (2, 3), "removeprefix": (1, 1),
                "removesuffix": (1, 1), "title": (0, 0), "capitalize": (0, 0)}
# pandas' Index.str methods that give what the Python method of that name gives on a name
# (lower and upper only on ASCII names: pyarrow's lower-cases "İ" to "i", upper-cases "ß" to
# "ẞ", Python's to "i̇" and "SS")
INDEX_STR_METHODS = {"strip": "to_strip", "lstrip": "to_strip", "rstrip": "to_strip",
                     "lower": None, "upper": None, "casefold": None, "replace": None,
                     "removeprefix": "prefix", "removesuffix": "suffix"}

NameOps = tuple[tuple[str, tuple[object, ...]], ...]


@dataclass(frozen=True)
class ColumnNames(Scalar):
    """A frame's column names after string methods (df.columns.str.strip().str.lower()): the
    Python list `code`, `base` the names before them and `ops` the methods in order."""

    base: Code | None = field(default=None, kw_only=True)
    ops: NameOps = field(default=(), kw_only=True)


def known_data_columns(frame: Frame) -> list[str] | None:
    """The names pandas' df.columns holds, when porter knows them (none known: not trusted,
    an aggregation of columns porter does not know lists only its keys)."""
    if frame.columns is None:
        return None
    data = [c for c in frame.columns if c not in frame.index]
    return data or None


def apply_name_ops(name: str, ops: NameOps) -> str:
    for method, args in ops:
        name = getattr(str, method)(name, *args)
    return name


# Index.str.replace(pat, repl, regex=True), among the string methods applied to column names
REGEX_REPLACE = "replace_pattern"


def names_by_pandas(names: Iterable[str], ops: NameOps) -> list[str]:
    """The column names after df.columns.str.<method>(...) calls, computed by pandas' own
    Index.str methods (pandas 3's str dtype, as read_csv labels the columns): lower() and
    upper() of a few non-ASCII letters, strip()'s whitespace and patterns are pandas'."""
    import pandas as pd

    index = pd.Index(list(names), dtype="str")
    for method, args in ops:
        if method == REGEX_REPLACE:
            pat, repl, n = args
            index = index.str.replace(pat, repl, n=n, regex=True)  # type: ignore[arg-type]
        else:
            index = getattr(index.str, method)(*args)
    return [str(name) for name in index]


def _name_ops_text(param: str, ops: NameOps) -> str:
    text = param
    for method, args in ops:
        text += f".{method}({', '.join(emit.lit(a).text for a in args)})"
    return text


def lambda_name_ops(node: object) -> NameOps | None:
    """`lambda c: c.strip().lower().replace(" ", "_")` -> its string methods in order, when the
    body is only such methods called with literal arguments on the parameter."""
    if not isinstance(node, cst.Lambda) or len(node.params.params) != 1 or node.params.star_arg \
            not in (None, cst.MaybeSentinel.DEFAULT) or node.params.kwonly_params \
            or node.params.star_kwarg or node.params.posonly_params \
            or node.params.params[0].default is not None:
        return None
    param = node.params.params[0].name.value
    ops: list[tuple[str, tuple[object, ...]]] = []
    expr: cst.BaseExpression = node.body
    while isinstance(expr, cst.Call):
        func = expr.func
        if not isinstance(func, cst.Attribute) or func.attr.value not in NAME_METHODS:
            return None
        args: list[object] = []
        for arg in expr.args:
            if arg.keyword is not None or arg.star:
                return None
            try:
                args.append(ast.literal_eval(cst.Module([]).code_for_node(arg.value)))
            except (ValueError, SyntaxError):
                return None
        low, high = NAME_METHODS[func.attr.value]
        if not low <= len(args) <= high or not all(
                isinstance(a, str) or a is None or i == 2 and isinstance(a, int)
                for i, a in enumerate(args)):
            return None
        ops.append((func.attr.value, tuple(args)))
        expr = func.value
    if not (isinstance(expr, cst.Name) and expr.value == param) or not ops:
        return None
    try:  # arguments of the wrong type (c.replace(None, "")) fail here, not in porter
        apply_name_ops("x", tuple(reversed(ops)))
    except (TypeError, ValueError):
        return None
    return tuple(reversed(ops))


def rename_function(frame: Frame, function: Value, ctx: RuleContext) -> dict[str, str] | Value:
    """df.rename(columns=lambda c: c.strip().lower()): the new names computed now when porter
    knows the columns (a dict for frame.rename), else LazyFrame.rename(<the lambda>)."""
    ops = lambda_name_ops(function.node) if isinstance(function, Opaque) else None
    node = function.node if isinstance(function, Opaque) else None
    if ops is None and isinstance(node, cst.Attribute) and isinstance(node.value, cst.Name) \
            and node.value.value == "str" and NAME_METHODS.get(node.attr.value, (1,))[0] == 0:
        # columns=str.lower: Python's method called on each name, as lambda c: c.lower()
        ops = ((node.attr.value, ()),)
    if ops is None:
        raise Unsupported("a rename function porter cannot read (only a lambda calling string "
                          "methods on the name, or str.lower / str.upper / str.strip / "
                          "str.title ...)")
    data = known_data_columns(frame)
    if data is not None:
        return {c: new for c in data if (new := apply_name_ops(c, ops)) != c}
    if frame.index:
        raise Unsupported("a rename function on a frame with index levels whose columns are not "
                          "known (pandas leaves the levels' names alone)")
    code = frame.code.method("rename", emit.atom(f"lambda c: {_name_ops_text('c', ops)}"))
    return derive(frame, code, same_rows=True, columns=None, dtypes=(), column_pairs=())


@rule(*(f"frame.columns.str.{m}" for m in INDEX_STR_METHODS))
def columns_str(call: PandasCall, ctx: RuleContext) -> Value:
    """df.columns.str.strip() / lower() / replace(" ", "_") ... -> the new names computed when
    porter knows the columns (with --data), else the same Python str method on each name.

    Handles: Index.str.replace replaces text, not a pattern (regex=False, pandas 3's default);
    strip / lstrip / rstrip with or without characters; lower / upper on ASCII names (pandas'
    pyarrow strings change a few other letters unlike Python).
    """
    names = call.receiver
    assert isinstance(names, Scalar) and names.of is not None
    frame = names.of
    method = call.name
    base = names.base if isinstance(names, ColumnNames) and names.base is not None else names.code
    ops = names.ops if isinstance(names, ColumnNames) else ()
    if method == "replace":
        ctx.reject_unknown(call, "pat", "repl", "n", "regex", positional=3)
        regex = call.const("regex", None, False)
        if regex not in (True, False):
            raise Unsupported("regex= that porter cannot read")
        pat, repl = call.const("pat", 0), call.const("repl", 1)
        n = call.const("n", 2, -1, kinds=(int,))
        if not (isinstance(pat, str) and isinstance(repl, str)):
            raise Unsupported("replace with something other than text")
        args: tuple[object, ...] = (pat, repl) if n == -1 else (pat, repl, n)
        if regex:
            # a pattern: pandas' own replace computes the names, which porter needs to know
            method, args = REGEX_REPLACE, (pat, repl, n)
    else:
        keyword = INDEX_STR_METHODS[method]
        if keyword is None:
            ctx.reject_unknown(call)
            args = ()
        else:
            ctx.reject_unknown(call, keyword, positional=1)
            value = call.const(keyword, 0, None)
            if value is not None and not isinstance(value, str):
                raise Unsupported(f"{method} of something other than text")
            args = () if value is None and keyword == "to_strip" else (value,)
            if value is None and keyword != "to_strip":
                raise Unsupported(f"{method} without a text")
    ops = (*ops, (method, args))
    known = known_data_columns(frame)
    if known is not None:
        # pandas' own Index.str methods compute the new names here, as the script would
        new_names = names_by_pandas(known, ops)
        if any(m in ("lower", "upper", "casefold") for m, _ in ops) \
                and not all(c.isascii() for c in known):
            ctx.lower("the new names of non-ASCII letters are those this machine's pandas gives; "
                      "pandas without pyarrow changes a few letters otherwise (İ, ß)", 0.95)
        if len(set(new_names)) != len(new_names):
            raise Unsupported("the new names repeat a name (pandas keeps both columns; a Polars "
                              "frame cannot)")
        code = emit.lit(new_names)
    else:
        if any(m == REGEX_REPLACE for m, _ in ops):
            raise Unsupported("regex=True (a pattern) on names porter does not know")
        if method in ("lower", "upper", "casefold"):
            ctx.lower(f"pandas' Index.str.{method} differs from Python's on a few non-ASCII "
                      "letters (İ, ß)", 0.95)
        code = emit.atom(f"[c{_name_ops_text('', ops)} for c in {base.text}]")
    return ColumnNames(code, pytype="list[str]", of=frame, base=base, ops=ops, sites=names.sites)


def computed_names(value: Value) -> Value:
    """df.columns = <names after string methods>: a list porter computed (an Opaque holding
    it), else the Python list built at run time."""
    if not isinstance(value, ColumnNames):
        return value
    known = known_data_columns(value.of) if value.of is not None else None
    if known is not None:
        names = names_by_pandas(known, value.ops)
        return Opaque(emit.lit(names), const=names)
    return Opaque(value.code)


# -- select_dtypes ---------------------------------------------------------------------------

# which of pandas' dtype selectors each of porter's column types is picked by (pandas 3.1,
# measured): text is pandas' str dtype, which "object" still selects; dates of s.dt.date are
# objects; "number" picks durations too. An int column is float64 in pandas once a value is
# missing, and a True/False one object: "int", "float", "bool" and their kin are not listed,
# so they stay TODOs (whether a value is missing is only known when the script runs).
_DTYPE_SELECTORS = {
    "int": {"number"},
    "float": {"number"},
    "str": {"object", "O", "str", "string"},
    "date": {"object", "O"},
    "datetime": {"datetime", "datetime64", "M"},
    "duration": {"number", "timedelta", "timedelta64", "m"},
    "category": {"category"},
    "enum": {"category"},
}
_KNOWN_SELECTORS = set().union(*_DTYPE_SELECTORS.values())


def _dtype_selectors(call: PandasCall, name: str, position: int) -> set[str]:
    value = call.arg(name, position, None)
    if value is None or isinstance(value, Opaque) and value.is_const and value.const is None:
        return set()
    items = value.const if isinstance(value, Opaque) and value.is_const \
        and isinstance(value.const, (list, tuple)) else [value]
    selectors = set()
    for item in items:
        if isinstance(item, str):
            selectors.add(item)
        elif isinstance(item, Module) and item.qualname == "numpy.number":
            selectors.add("number")
        elif isinstance(item, Opaque) and item.is_const and isinstance(item.const, str):
            selectors.add(item.const)
        elif isinstance(item, Opaque) and item.code.text == "object":
            selectors.add("object")
        else:
            raise Unsupported(f"a dtype selector porter does not read: {getattr(item, 'code', item)}")
    unknown = selectors - _KNOWN_SELECTORS
    if unknown:
        raise Unsupported(f"the dtype selector {', '.join(sorted(unknown))!s}: whether pandas "
                          "holds a column as int64, float64, bool or object depends on the "
                          "values it holds when the script runs")
    return selectors


@rule("frame.select_dtypes")
def select_dtypes(call: PandasCall, ctx: RuleContext) -> Value:
    """df.select_dtypes(include=..., exclude=...) -> df.select(the columns pandas picks).

    Handles: "number" (numbers and durations, not True/False), "object" (text, and dates of
    s.dt.date, which pandas holds as objects), "str" / "string", "datetime", "timedelta",
    "category", np.number, given alone or in lists, on a frame whose column types porter
    knows; the columns in the frame's order.
    Caveats: "int", "float", "bool" and their kin are TODOs (pandas makes an int column float64
    once a value is missing, a True/False one object), as is "object" beside a True/False
    column; a frame with a column of unknown type too.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "include", "exclude", positional=2)
    include = _dtype_selectors(call, "include", 0)
    exclude = _dtype_selectors(call, "exclude", 1)
    if not include and not exclude:
        raise Unsupported("select_dtypes with neither include nor exclude (pandas raises)")
    # numbers whose type the data decides (int64 or float64, Frame.numbers) are numbers either
    # way: "number" picks them, and they are neither text, dates nor categories
    kinds = {c: "int" if holds_numbers(frame, c) else frame.dtype(c) for c in frame.columns or ()}
    if frame.columns is None or any(kinds[c] is None for c in frame.columns):
        raise Unsupported("a frame with a column whose type porter does not know")
    if frame.index or frame.column_pairs or frame.number_labels:
        raise Unsupported("a frame with an index of its own, or column names of two levels or "
                          "numbers")
    if "bool" in kinds.values() and (include | exclude) & {"object", "O"}:
        raise Unsupported("\"object\" beside a True/False column, which pandas holds as object "
                          "once a value is missing")

    def picked(kind: str | None) -> bool:
        selectors = _DTYPE_SELECTORS.get(kind or "", set())
        return (not include or bool(selectors & include)) and not selectors & exclude

    names = [c for c in frame.columns if picked(kinds[c])]
    ctx.lower("the columns are picked by the types porter knows: pandas reads a file with a "
              "header and no rows as text in every column", 0.95)
    return select_columns(frame, frame.code.method("select", *names), names)


@rule("series.xs")
def series_xs(call: PandasCall, ctx: RuleContext) -> Value:
    """s.xs("tenor", level="part") -> the rows whose key "part" is the label, .drop("part"),
    on a Series labelled by two or more keys (a groupby's).

    Handles: level by name or position; the Series keeps the other keys as its labels, in the
    groupby's order (each combination of them once).
    Caveats: a label no row holds gives no rows where pandas raises KeyError (0.95);
    drop_level=False, a tuple of labels across levels, several levels and a label of another
    type than the key are TODOs."""
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call, "key", "level", "drop_level", positional=1)
    frame = column.frame
    keys = list(frame.index)
    label = call.arg("key", 0, None)
    if len(keys) < 2 or row_labels_carried(frame):
        raise ctx.todo("a Series not labelled by two or more keys (a groupby's): select the rows "
                       "by their key column")
    if not (isinstance(label, Opaque) and label.is_const and isinstance(label.const, (str, int))
            and not isinstance(label.const, bool)):
        raise ctx.todo("one label written in the script (a tuple across levels is not ported)")
    level = call.const("level", None, None, kinds=(str, int, type(None)))
    if level is None:
        level = 0  # the first level, as pandas reads a label without level=
    if isinstance(level, bool):
        raise ctx.todo("level as True/False")
    if isinstance(level, int):
        if not -len(keys) <= level < len(keys):
            raise ctx.todo(f"level {level} out of range (pandas raises)")
        level = keys[level]
    if level not in keys:
        raise ctx.todo(f"level {level!r} is not a key (pandas raises)")
    if call.const("drop_level", None, True, kinds=(bool,)) is not True:
        raise ctx.todo("drop_level=False: keep the key column")
    kinds = {str: "str", int: "int"}
    if kinds.get(type(label.const)) != frame.dtype(level):
        raise ctx.todo("a label of another type than the key (or a key of unknown type)")
    if level in column.refs:
        raise ctx.todo("values computed from the key taken away")
    ctx.lower("a label no row holds gives an empty Series where pandas raises KeyError", 0.95)
    column = values_fixed(column)  # a rank or running sum keeps the values of all rows
    frame = column.frame
    code = frame.code.method("filter", emit.binop(emit.col(level), "==", emit.lit(label.const))) \
        .method("drop", level)
    rows = fresh_token()
    # the other keys of a groupby's sorted result, once each and in order, where they were so
    grouped = rows if frame.grouped_rows == frame.rows else None
    left = derive(frame, code, same_rows=False, rows=rows, grouped_rows=grouped,
                  index=tuple(k for k in keys if k != level),
                  columns=tuple(c for c in frame.columns if c != level)
                  if frame.columns is not None else None,
                  dtypes=tuple((c, t) for c, t in frame.dtypes if c != level))
    return replace(column, code=ctx.expr(column, frame), frame=left, sites=())


@rule("series.name")
def series_name(call: PandasCall, ctx: RuleContext) -> Value:
    """df.index.name -> the name of the key column that labels the rows, a constant.

    Handles: a table labelled by one key column (set_index, read_csv(index_col=), a groupby's
    key, pivot's index) reads its key's name; a table whose labels have no name (0..n-1, a
    reindex over a date range, a rename_axis(None)) reads None, as pandas.
    Caveats: the name of any other Series is a TODO (porter does not follow the names pandas
    gives the results of arithmetic)."""
    column = call.receiver
    assert isinstance(column, Column)
    if not column.index_values:
        raise ctx.todo("the name of a Series other than a table's labels: pandas names "
                       "the results of arithmetic by rules of its own")
    return Scalar(emit.lit(column.name), pytype="str" if column.name is not None else None)


@rule("series.is_unique")
def series_is_unique(call: PandasCall, ctx: RuleContext) -> Value:
    """s.is_unique / df.index.is_unique -> pl.col(c).is_unique().all(), collected.

    Handles: missing values are one value (two of them are not unique), as in pandas; NaN is
    made missing first; an empty Series is unique in both."""
    column = call.receiver
    assert isinstance(column, Column)
    if column.element:
        raise ctx.todo("is_unique of one value")
    values = ctx.expr(column, column.frame)
    if column.dtype not in ("int", "str", "bool", "date", "datetime"):
        values = values.method("fill_nan", None) if column.dtype == "float" else values
        if column.dtype not in ("float",):
            raise ctx.todo("values of a type porter does not know (NaN and missing values are "
                           "one value in pandas)")
    code = column.frame.code.method("select", values.method("is_unique").method("all")) \
        .method("collect").method("item")
    return Scalar(code, pytype="bool")
