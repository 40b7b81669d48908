"""Row operations: drop_duplicates, duplicated, sort_values, nlargest / nsmallest, reset_index,
isin, between, replace."""

from __future__ import annotations

from dataclasses import replace
from typing import Any

import libcst as cst

from porter.emit import code as emit
from porter.emit.code import Code
from porter.rules.elementwise import keys_of_column_type
from porter.rules import rule
from porter.translate.context import (
    MIXED_COLUMN, PandasCall, RuleContext, Unsupported, column_names, column_of, derive, derived_column,
    labels_kept,
    row_labels_carried, values_fixed, without_index,
)
from porter.translate import handover
from porter.translate.values import Column, Frame, Opaque, PandasValue, Value, fresh_token

KEEP = {"first": "first", "last": "last", False: "none"}
_ROW = "__row"  # the row number drop_duplicates(keep="last") sorts the kept rows back by


@rule("frame.drop_duplicates")
def drop_duplicates(call: PandasCall, ctx: RuleContext) -> Value:
    """df.drop_duplicates(subset, keep) -> .unique(subset, keep=..., maintain_order=True);
    keep="last" -> .filter(pl.col(k).is_last_distinct()) (pl.struct of several), or, where
    the columns are not known, numbers the rows, keeps the last of each unordered and sorts
    back by number.

    Handles: which row of a duplicate group is kept and the original row order (Polars'
    default keep="any" and unordered output differ); missing values are equal to each other
    in both; a frame holding pandas' index in columns (a groupby's keys, row labels) compares
    the other columns only, as pandas leaves the index out.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "subset", "keep", "ignore_index", positional=1)
    subset = call.const("subset", 0, None)
    keep = call.const("keep", None, "first", kinds=(str, bool))
    if keep not in KEEP:
        raise Unsupported(f"keep={keep!r}")
    names = column_names(subset, "subset") if subset else None
    ignore_index = bool(call.const("ignore_index", None, False))
    if frame.index and names is None:
        # pandas compares the rows' values, never their labels (the keys of a groupby, the
        # row numbers carried as a column): the columns that are not the index
        if frame.columns is None:
            raise Unsupported("a frame with an index of its own whose columns are not known "
                              "(pass subset=[...])")
        names = [c for c in frame.columns if c not in frame.index]
    if keep == "last" and names:
        # the rows that are the last of their values, in their order: a filter by
        # is_last_distinct (missing values equal to each other, as in pandas), which hashes
        # the subset's columns only; numbering the rows for an unordered unique and sorting
        # them back took seven times as long on a million rows
        key = emit.col(names[0]) if len(names) == 1 else emit.pl("struct", *names)
        code = frame.code.method("filter", key.method("is_last_distinct"))
    elif keep == "last":
        # unique(keep="last", maintain_order=True) holds several copies of the whole frame
        # (three times the peak of keep="first" on a 2,000,000-row frame of nine columns);
        # an unordered unique of numbered rows, sorted back by the number, keeps the same
        # rows in the same order at the cost of keep="first".
        key = (emit.names_arg(names or [c for c in frame.columns or ()])
               if names or frame.columns else emit.pl("selectors.exclude", _ROW))
        code = (frame.code.method("with_row_index", _ROW).method("unique", key, keep="last")
                .method("sort", _ROW).method("drop", _ROW))
    else:
        args = [emit.names_arg(names)] if names else []
        code = frame.code.method("unique", *args, keep=KEEP[keep], maintain_order=True)
    if ignore_index and frame.index:
        # the labels are dropped: 0..n-1 again
        code = code.method("drop", *frame.index)
        columns = None if frame.columns is None else \
            tuple(c for c in frame.columns if c not in frame.index)
        return derive(frame, code, same_rows=False, labels_intact=True, index=(),
                      columns=columns, index_unnamed=False)
    return labels_kept(frame, derive(frame, code, same_rows=False, labels_intact=ignore_index))


@rule("frame.duplicated", "series.duplicated")
def duplicated(call: PandasCall, ctx: RuleContext) -> Value:
    """df.duplicated(subset, keep) / s.duplicated(keep) -> a True/False column:
    ~is_first_distinct() (keep="first"), ~is_last_distinct() ("last"), is_duplicated() (False);
    several columns as one pl.struct.

    Handles: missing values are equal to each other, as in pandas; every column when subset
    is left out (the frame's columns must be known); the result has the frame's rows.
    Caveats: a frame with an index of its own (pandas leaves the index out) is a TODO.
    """
    receiver = call.receiver
    if isinstance(receiver, Frame):
        ctx.reject_unknown(call, "subset", "keep", positional=2)
        frame = receiver
        if frame.index:
            raise Unsupported("a frame with an index of its own")
        subset = call.const("subset", 0, None)
        names = column_names(subset, "subset") if subset is not None else list(frame.columns or ())
        if not names:
            raise Unsupported("the frame's columns are not known (pass subset=[...])")
        absent = [n for n in names if frame.columns is not None and n not in frame.columns]
        if absent:
            raise Unsupported(f"columns {absent} are not in the frame (pandas raises KeyError)")
        columns = [column_of(frame, n) for n in names]
        key = columns[0].code if len(columns) == 1 else emit.pl("struct", *(c.code for c in columns))
        keep = call.const("keep", 1, "first", kinds=(str, bool))
        base = Column(emit.pl("lit", None), frame=frame, name=None)
    else:
        assert isinstance(receiver, Column)
        ctx.reject_unknown(call, "keep", positional=1)
        columns, key, base = [], receiver.code, receiver
        keep = call.const("keep", 0, "first", kinds=(str, bool))
    if keep == "first":
        code = key.method("is_first_distinct").method("not_")
    elif keep == "last":
        code = key.method("is_last_distinct").method("not_")
    elif keep is False:
        code = key.method("is_duplicated")
    else:
        raise Unsupported(f"keep={keep!r} (pandas raises)")
    return derived_column(base, code, dtype="bool", name=None if isinstance(receiver, Frame)
                          else receiver.name, others=columns)


def sort_args(by: list[Any], ascending: Any, na_position: str) -> dict[str, object]:
    if isinstance(ascending, list):
        if len(ascending) != len(by):
            raise Unsupported("ascending and by have different lengths")
        descending: object = [not a for a in ascending]
        if not any(descending):  # type: ignore[arg-type]
            descending = False
    else:
        descending = not ascending
    kwargs: dict[str, object] = {}
    if descending:
        kwargs["descending"] = descending
    kwargs["nulls_last"] = na_position == "last"
    kwargs["maintain_order"] = True
    return kwargs


def pandas_order(frame: Frame, column: Code, dtype: str | None, ascending: Any, na_position: str,
                 kind: Any, ctx: RuleContext, name: Code | None = None) -> Code:
    """frame.sort(...) by one column in the order pandas gives its rows.

    pandas' single-key sort_values is numpy's argsort with kind="quicksort" (pandas'
    nargsort): for numbers, True/False and dates it is not stable, so tied rows come out in an
    order of numpy's (head() and drop_duplicates() after it then keep other rows). The frame
    is then sorted by pandas_sort_values (written once into the script), which places each
    row where numpy's argsort of the values, as pandas holds them, puts it.
    kind="stable"/"mergesort", and text (pandas 3 sorts its Arrow strings stably), keep
    Polars' stable sort, which is pandas' order there (by `name`, the column's name, when
    given)."""
    if isinstance(ascending, (list, tuple)):
        if len(ascending) != 1:
            raise Unsupported("ascending and by have different lengths")
        ascending = ascending[0]
    if na_position not in ("first", "last"):
        raise Unsupported(f"na_position={na_position!r} (pandas raises)")
    if kind not in ("quicksort", "stable", "mergesort", "heapsort", None):
        raise Unsupported(f"kind={kind!r}")
    if kind in ("stable", "mergesort") or dtype == "str":
        return frame.code.method("sort", name or column, **sort_args([None], ascending, na_position))
    if dtype in ("category", "enum") or kind == "heapsort":
        ctx.lower("pandas sorts this column with numpy's unstable "
                  + ("heapsort" if kind == "heapsort" else "quicksort of the category codes")
                  + ": tied rows may come out in another order", 0.9)
        return frame.code.method("sort", name or column, **sort_args([None], ascending, na_position))
    from porter.rules.io_options import SORT_FUNCTION
    options: dict[str, object] = {}
    if not ascending:
        options["descending"] = True
    if na_position == "first":
        options["nulls_last"] = False
    return frame.code.method("pipe", emit.atom(SORT_FUNCTION), name or column, **options)


def sort_keys(call: PandasCall, columns: list[Column], frame: Frame,
              ctx: RuleContext) -> list[tuple[Code, str | None]] | None:
    """sort_values' key=: the expression of each key column to sort by, and its type (None
    without key=).

    pandas calls the key with each column as a Series and sorts by the values it gives back,
    as it would sort a column of them (pandas' nargsort / lexsort_indexer map the values
    first): the lambda's body, evaluated with its parameter standing for the column, is that
    column of values, computed on the rows before the sort. A key that gives anything but a
    column of the same rows (a filtered Series, a list, another frame's column) is a TODO."""
    key = call.arg("key", None, None)
    if key is None or (isinstance(key, Opaque) and key.is_const and key.const is None):
        return None
    if not (isinstance(key, Opaque) and isinstance(key.node, cst.Lambda)):
        raise Unsupported("key= other than a lambda (write the key as a lambda of the column)")
    from porter.rules.elementwise import series_lambda
    keyed: list[tuple[Code, str | None]] = []
    for column in columns:
        value = series_lambda(key.node, column, ctx)
        if not isinstance(value, Column) or value.element:
            raise Unsupported("the key gives no column porter can sort by")
        # the key's values on the frame's own rows (another frame's rows would be pandas'
        # alignment by label: bool_expr refuses them)
        keyed.append((ctx.bool_expr(value, frame), value.dtype))
    return keyed


@rule("frame.sort_values")
def sort_values(call: PandasCall, ctx: RuleContext) -> Value:
    """df.sort_values(by, ascending, na_position) -> .sort(..., nulls_last=True, maintain_order=True).

    Handles: missing values last (also when descending); a list for `ascending`; several
    keys keep tied rows in order (pandas' lexsort is stable); one key of numbers, True/False
    or dates orders tied rows as pandas' unstable quicksort does (pandas_sort_values), one text
    key is sorted stably as pandas 3 sorts it. key=lambda s: <expression of s> sorts by the
    lambda's expression of each key column (pandas sorts by what the key gives for each
    column, in the same order as a column of those values would be sorted).
    Caveats: a key= other than a lambda porter reads as an expression of its column is a
    TODO; one category key or kind="heapsort" keep the stable order (0.9).
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "by", "ascending", "na_position", "kind", "ignore_index", "key",
                       positional=1)
    by = call.const("by", 0)
    by = column_names(by, "by")
    ascending = call.const("ascending", None, True)
    na_position = call.const("na_position", None, "last")
    kind = call.const("kind", None, "quicksort")
    keyed = sort_keys(call, [column_of(frame, name) for name in by], frame, ctx)
    if keyed is not None:
        if len(by) == 1:
            code = pandas_order(frame, keyed[0][0], keyed[0][1], ascending, na_position, kind, ctx)
        else:
            code = frame.code.method("sort", *(c for c, _ in keyed),
                                     **sort_args(by, ascending, na_position))
    elif len(by) == 1:
        code = pandas_order(frame, emit.col(by[0]), frame.dtype(by[0]), ascending, na_position,
                            kind, ctx, name=emit.names_arg(by))
    else:
        code = frame.code.method("sort", emit.names_arg(by), **sort_args(by, ascending, na_position))
    return labels_kept(frame, derive(frame, code, same_rows=False,
                                     labels_intact=bool(call.const("ignore_index", None, False))),
                       reordered=True)


@rule("series.sort_values")
def series_sort_values(call: PandasCall, ctx: RuleContext) -> Value:
    """s.sort_values() -> the column of the frame sorted by it, in pandas' order (as
    frame.sort_values by one column)."""
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call, "ascending", "na_position", "kind", "ignore_index", "key")
    column = values_fixed(column)  # a running sum keeps the values of the rows in their order
    frame = column.frame
    keyed = sort_keys(call, [column], frame, ctx)
    by, dtype = keyed[0] if keyed is not None else (column.code, column.dtype)
    code = pandas_order(frame, by, dtype, call.const("ascending", None, True),
                        call.const("na_position", None, "last"),
                        call.const("kind", None, "quicksort"), ctx)
    sorted_frame = derive(frame, code, same_rows=False)
    return Column(column.code, frame=sorted_frame, name=column.name, dtype=column.dtype,
                  refs=column.refs, versions=column.versions)


@rule("frame.nlargest", "frame.nsmallest")
def nlargest(call: PandasCall, ctx: RuleContext) -> Value:
    """df.nlargest(n, columns) -> .sort(columns, descending=True, nulls_last=True, maintain_order=True).head(n).

    Handles: ties kept in their original order (keep="first"; top_k has no such guarantee);
    missing values come last, as pandas appends them when n exceeds the values; keep="all" on
    one column: the n first rows and every later row tied with the last of them (a missing
    value ties with every missing value: pandas appends them all when n reaches them).
    Caveats: keep="last", and keep="all" on several columns or with n not written out, are
    TODOs.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "n", "columns", "keep", positional=2)
    n = call.const("n", 0)
    columns = call.const("columns", 1)
    keep = call.const("keep", None, "first")
    if keep not in ("first", "all"):
        raise Unsupported(f"keep={keep!r}")
    columns = column_names(columns)
    largest = call.name == "nlargest"
    kwargs: dict[str, object] = {"descending": True} if largest else {}
    kwargs |= {"nulls_last": True, "maintain_order": True}
    code = frame.code.method("sort", emit.names_arg(columns), **kwargs)
    if keep == "all":
        if len(columns) != 1:
            raise Unsupported("keep='all' on several columns")
        if not (isinstance(n, int) and not isinstance(n, bool) and n >= 0):
            raise Unsupported("keep='all' with a number of rows porter cannot read")
        if n > 0:
            # sorted, ties in their original order: the rows past the n-th that equal it
            # (eq_missing: a missing n-th value keeps every missing value, as pandas does)
            column = emit.col(columns[0])
            boundary = column.method("head", n).method("last")
            position = emit.pl("int_range", emit.pl("len"))
            return derive(frame, code.method("filter", emit.binop(
                emit.binop(position, "<", n), "|", column.method("eq_missing", boundary))),
                same_rows=False)
    return derive(frame, code.method("head", n), same_rows=False)


@rule("series.nlargest", "series.nsmallest")
def series_nlargest(call: PandasCall, ctx: RuleContext) -> Value:
    """s.nlargest(n) -> the column of the frame sorted by it, first n rows."""
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call, "n", "keep", positional=1)
    n = call.const("n", 0, 5)
    if call.const("keep", None, "first") != "first":
        raise Unsupported("keep other than first")
    kwargs: dict[str, object] = {"descending": True} if call.name == "nlargest" else {}
    kwargs |= {"nulls_last": True, "maintain_order": True}
    column = values_fixed(column)  # a rank or running sum keeps the values of all rows
    frame = column.frame
    top = derive(frame, frame.code.method("sort", column.code, **kwargs).method("head", n), same_rows=False)
    return Column(column.code, frame=top, name=column.name, dtype=column.dtype, refs=column.refs,
                  versions=column.versions)


@rule("frame.reset_index")
def reset_index(call: PandasCall, ctx: RuleContext) -> Value:
    """df.reset_index() / reset_index(drop=True) -> nothing, or with_row_index("index").

    Handles: after a groupby the keys are already columns in Polars; drop=True makes fresh
    labels, which is nothing to do in Polars.
    Caveats: the old row labels of a filtered or sorted frame (I02) are a TODO.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "drop", "names")
    drop = call.const("drop", None, False)
    if frame.index:
        if drop:
            code = frame.code.method("drop", *frame.index)
            columns = tuple(c for c in frame.columns or () if c not in frame.index) or None
            return derive(frame, code, same_rows=True, index=(), labels_intact=True, columns=columns)
        return derive(frame, frame.code, same_rows=True, index=(), labels_intact=True)
    if drop:
        return derive(frame, frame.code, same_rows=True, labels_intact=True)
    if not frame.labels_intact:
        raise Unsupported("the old row labels of a filtered or reordered frame become a column "
                          "(with_row_index where the frame was made)")
    # pandas names the labels "index", or "level_0" when the frame has an "index" column
    # already (a frame reset once before), and raises when it has both
    name = "index"
    if frame.columns is None:
        ctx.lower("the labels column is named \"index\" (pandas: \"level_0\" when the frame "
                  "has an \"index\" column, which porter cannot see here)", 0.9)
    elif "index" in frame.columns:
        if "level_0" in frame.columns:
            raise Unsupported("the frame has columns \"index\" and \"level_0\" already "
                              "(pandas raises)")
        name = "level_0"
    code = frame.code.method("with_row_index", name).method(
        "with_columns", emit.col(name).method("cast", emit.atom("pl.Int64")))
    columns = (name, *frame.columns) if frame.columns is not None else None
    return derive(frame, code, same_rows=True, labels_intact=True, columns=columns)


@rule("frame.rename_axis", "series.rename_axis")
def rename_axis(call: PandasCall, ctx: RuleContext) -> Value:
    """rename_axis("day") of a result indexed by keys (a groupby's) -> rename the key columns.

    Handles: a name per index key (one name, or a list for several keys); columns=None on a
    frame (the columns' name, which Polars columns do not have) writes nothing.
    Caveats: naming the row numbers of a frame without an index (reset_index would make a
    column of them), None for an index name and a mapper function are TODOs.
    """
    receiver = call.receiver
    frame = receiver.frame if isinstance(receiver, Column) else receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "mapper", "index", "columns", "axis", positional=1)
    if call.has("columns"):
        if isinstance(receiver, Column) or call.has("mapper") \
                or call.const("columns", None, 0) is not None:
            raise ctx.todo("naming the columns: Polars columns have no name")
        # df.rename_axis(columns=None): nothing to do in Polars; melt calls its variable
        # column "variable" again
        receiver = frame = replace(receiver, columns_name=None)
        if not call.has("index"):
            return receiver
    if call.const("axis", None, 0) not in (0, "index", "rows"):
        raise ctx.todo("naming the columns: Polars columns have no name")
    names = call.const("index", None) if call.has("index") else call.const("mapper", 0, None)
    names = [names] if isinstance(names, str) else names
    if not frame.index:
        raise ctx.todo("naming row numbers: reset_index() would make a column of them; keep "
                       "them as a column (with_row_index) named as you like")
    if not (isinstance(names, (list, tuple)) and len(names) == len(frame.index)
            and all(isinstance(n, str) for n in names)):
        raise ctx.todo("a name per index key, as text (None, a function or a dict are not "
                       "ported)")
    mapping = {old: new for old, new in zip(frame.index, names) if old != new}
    if not mapping:
        return receiver
    others = [c for c in frame.columns or () if c not in frame.index]
    if set(mapping.values()) & set(others) or len(set(names)) != len(names):
        raise ctx.todo("an index key named like a column: pandas keeps both, Polars cannot")
    code = frame.code.method("rename", mapping)
    renamed = derive(frame, code, same_rows=True, index=tuple(names), index_unnamed=False,
                     columns=tuple(mapping.get(c, c) for c in frame.columns)
                     if frame.columns is not None else None,
                     dtypes=tuple((mapping.get(c, c), t) for c, t in frame.dtypes))
    from porter.translate.context import number_cells
    pivoted, cells = number_cells(frame)
    if pivoted:
        # a pivoted table with its labels renamed: its cells are still the numbers they were
        renamed = replace(renamed, number_cells=(code.text, cells))
    if isinstance(receiver, Column):
        return Column(receiver.code, frame=renamed, name=receiver.name, dtype=receiver.dtype,
                      refs=receiver.refs)
    return renamed


@rule("series.droplevel")
def series_droplevel(call: PandasCall, ctx: RuleContext) -> Value:
    """s.droplevel(level) of a Series labelled by several key columns -> those keys dropped
    from its frame; the labels left are the other keys.

    Handles: a level by name or position, or a list of them, while one key is left.
    Caveats: dropping every level (pandas raises), a level the index lacks, and axis=1 are
    TODOs; the labels left may repeat (as in pandas), so what reads them as distinct (sort_index
    of one key, alignment) does not.
    """
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call, "level", "axis", positional=1)
    if call.const("axis", None, 0, kinds=(int, str)) not in (0, "index", "rows"):
        raise ctx.todo("axis=1: a Series has one axis")
    frame = column.frame
    levels = call.const_values("level", 0, kinds=(str, int))
    if len(frame.index) < 2 or frame.index_unnamed or not levels:
        raise ctx.todo("a Series labelled by other than several named key columns")
    dropped: list[str] = []
    for level in levels:
        if isinstance(level, int) and not isinstance(level, bool) \
                and -len(frame.index) <= level < len(frame.index):
            dropped.append(frame.index[level])
        elif isinstance(level, str) and level in frame.index:
            dropped.append(level)
        else:
            raise ctx.todo(f"level {level!r} is not a level of the index (pandas raises)")
    kept = tuple(k for k in frame.index if k not in dropped)
    if not kept:
        raise ctx.todo("dropping every level (pandas raises)")
    name = column.name
    if name is None or name in frame.index or column.code.text != emit.col(name).text:
        raise ctx.todo("a computed Series: name it and reset_index() first")
    code = frame.code.method("select", *kept, name)
    rows = derive(frame, code, same_rows=False, index=kept, columns=(*kept, name),
                  dtypes=tuple((c, t) for c, t in frame.dtypes if c in (*kept, name)),
                  grouped_rows=None, levels_as_met=False, levels_with_missing=False)
    return Column(column.code, frame=rows, name=name, dtype=column.dtype,
                  null_is_false=column.null_is_false, float_int=column.float_int,
                  nullable_int=column.nullable_int)


@rule("series.swaplevel")
def series_swaplevel(call: PandasCall, ctx: RuleContext) -> Value:
    """s.swaplevel(i, j) of a Series labelled by several key columns -> the key columns in
    their new order (select), the rows as they were.

    Handles: levels by name or position (-2 and -1 by default); the rows keep their order,
    no longer sorted by the first key (sort_index() sorts them by the new order).
    Caveats: a Series whose labels are row numbers or unnamed keys, and a computed Series
    without a name, are TODOs."""
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call, "i", "j", positional=2)
    frame = column.frame
    keys = list(frame.index)
    if len(keys) < 2 or frame.index_unnamed or row_labels_carried(frame):
        raise ctx.todo("a Series labelled by other than several named key columns")
    picked = []
    for name, position, default in (("i", 0, -2), ("j", 1, -1)):
        level = call.const(name, position, default, kinds=(str, int))
        if isinstance(level, int) and not isinstance(level, bool) and -len(keys) <= level < len(keys):
            picked.append(level % len(keys))
        elif isinstance(level, str) and keys.count(level) == 1:
            picked.append(keys.index(level))
        else:
            raise ctx.todo(f"level {level!r} is not a level of the index (pandas raises)")
    first, second = picked
    keys[first], keys[second] = keys[second], keys[first]
    name = column.name
    if name is None or name in keys or column.code.text != emit.col(name).text:
        raise ctx.todo("a computed Series: name it and reset_index() first")
    code = frame.code.method("select", *keys, name)
    swapped = derive(frame, code, same_rows=True, index=tuple(keys), columns=(*keys, name),
                     dtypes=tuple((c, t) for c, t in frame.dtypes if c in (*keys, name)),
                     grouped_rows=None)
    return Column(column.code, frame=swapped, name=name, dtype=column.dtype,
                  null_is_false=column.null_is_false, float_int=column.float_int,
                  nullable_int=column.nullable_int)


@rule("frame.swaplevel")
def frame_swaplevel(call: PandasCall, ctx: RuleContext) -> Value:
    """df.swaplevel(i, j) of a table labelled by several key columns -> the key columns in
    their new order (select), the rows as they were.

    Handles: levels by name or position (-2 and -1 by default); the rows keep their order,
    no longer sorted by the first key (sort_index() sorts them by the new order); the columns
    stay as they were.
    Caveats: a table whose labels are row numbers or unnamed keys, whose columns porter does
    not know, axis=1 (the column labels' levels) are TODOs."""
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "i", "j", "axis", positional=3)
    if call.const("axis", 2, 0, kinds=(int, str)) not in (0, "index", "rows"):
        raise ctx.todo("axis=1: the levels of the column labels")
    keys = list(frame.index)
    if len(keys) < 2 or frame.index_unnamed or row_labels_carried(frame):
        raise ctx.todo("a table labelled by other than several named key columns")
    if frame.columns is None or frame.number_cells:
        raise ctx.todo("a table whose columns porter does not know")
    picked = []
    for name, position, default in (("i", 0, -2), ("j", 1, -1)):
        level = call.const(name, position, default, kinds=(str, int))
        if isinstance(level, int) and not isinstance(level, bool) and -len(keys) <= level < len(keys):
            picked.append(level % len(keys))
        elif isinstance(level, str) and keys.count(level) == 1:
            picked.append(keys.index(level))
        else:
            raise ctx.todo(f"level {level!r} is not a level of the index (pandas raises)")
    first, second = picked
    keys[first], keys[second] = keys[second], keys[first]
    cells = [c for c in frame.columns if c not in keys]
    code = frame.code.method("select", *keys, *cells)
    return derive(frame, code, same_rows=True, index=tuple(keys), columns=(*keys, *cells),
                  grouped_rows=None, sorted_rows=None)


@rule("series.reset_index")
def series_reset_index(call: PandasCall, ctx: RuleContext) -> Value:
    """s.reset_index() -> a frame of the index columns and the values (name= renames them)."""
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call, "name", "drop")
    from porter.translate.handover import series_frame
    name = call.const("name", None, None)
    if call.const("drop", None, False):
        # the index (a groupby's keys) is dropped: the Series is its values alone
        return Column(column.code, frame=derive(column.frame, column.frame.code, same_rows=True,
                                                 labels_intact=True, index=()), name=column.name,
                      dtype=column.dtype, refs=column.refs, versions=column.versions)
    if not column.frame.index:
        raise Unsupported("the row labels of a Series become a column")
    value_name = name if name is not None else (column.name if column.name is not None else "0")
    renamed = Column(column.code, frame=column.frame, name=value_name, dtype=column.dtype,
                     null_is_false=column.null_is_false)
    if column.name is None and name is None:
        ctx.lower("the values column is named \"0\" (the integer 0 in pandas)", 0.95)
    code = series_frame(renamed)
    dtypes = [(k, column.frame.dtype(k)) for k in column.frame.index] + [(value_name, column.dtype)]
    return Frame(code, columns=(*column.frame.index, value_name), labels_intact=True,
                 dtypes=tuple((c, t) for c, t in dtypes if t is not None),
                 # pandas labels the values column with the integer 0 (handed over so)
                 number_labels=("0",) if column.name is None and name is None else ())


@rule("series.isin")
def isin(call: PandasCall, ctx: RuleContext) -> Value:
    """s.isin([...]) -> .is_in([...]); s.isin(other_series) -> .is_in(its values).

    Handles: a missing value is not in the list (False in pandas, null in Polars, filled where
    it matters); NaN in the list matches missing values (nulls_equal=True), None only in a
    text column (a missing number is NaN, not None); a list in a variable may hold either;
    numbers are written in the column's numeric type (pandas compares them by value, Polars
    refuses a list of another numeric type).
    """
    column = call.receiver
    assert isinstance(column, Column)
    values = call.arg("values", 0)
    if column.dtype is not None and column.dtype.startswith("period[") \
            or isinstance(values, Opaque) and getattr(values.const, "period", "").startswith("period["):
        return _periods_isin(column, values, ctx)
    if isinstance(values, Opaque) and isinstance(values.const, (list, tuple, set)):
        items = _comparable(list(values.const), column.dtype, ctx)
        has_missing = _matches_missing(items, column.dtype, ctx)
        kwargs = {"nulls_equal": True} if has_missing else {}
        target, items = _numbers_of_column_type(column, items, ctx)
        code = target.method("is_in", [v for v in items], **kwargs)
        return derived_column(column, code, dtype="bool", null_is_false=not has_missing)
    if isinstance(values, Opaque) and not values.is_const:
        # the list may hold None or NaN, which pandas matches against missing values
        ctx.lower(f"`{values.code.text}` is taken to be a list of values", 0.85)
        code = column.code.method("is_in", values.code, nulls_equal=True)
        return derived_column(column, code, dtype="bool")
    if isinstance(values, Column):
        # pandas tests membership in the other Series' values (no alignment); a missing value
        # is in it when the other Series has one too (nulls_equal=True)
        mine, theirs = column.code, values.code
        if {column.dtype, values.dtype} == {"int", "float"}:
            # pandas compares the numbers by value (3 is in [3.0]); Polars refuses Int64
            # values in a list of Float64: both as floats
            mine = mine.method("cast", emit.atom("pl.Float64"))
            theirs = theirs.method("cast", emit.atom("pl.Float64"))
        elif column.dtype is None or values.dtype is None:
            ctx.lower("a column of another number type (an integer column in a float one) fails "
                      "in Polars, where pandas compares the numbers by value", 0.95)
        values = replace(values, code=theirs)
        if values.frame.rows == column.frame.rows:
            others = ctx.expr(values, column.frame).method("implode")
        else:
            # another frame: its values are collected first (an expression cannot read it),
            # as one list (Polars 2 deprecates a Series of the column's own type here)
            others = values.frame.code.method("select", values.code).method("collect") \
                .method("to_series").method("implode")
        code = mine.method("is_in", others, nulls_equal=True)
        return derived_column(column, code, dtype="bool", others=[values] if values.frame.rows
                              == column.frame.rows else [])
    raise Unsupported("isin with a frame or a value computed by pandas")


def _periods_isin(column: Column, values: Value, ctx: RuleContext) -> Column:
    """periods.isin(pd.period_range(...)) -> the periods' text .is_in(the range's texts).

    A column of periods (dt.to_period, held as their text) matches the periods of a range of
    the same frequency, whose texts are pandas' own; a missing period is in no range (False).
    Anything else stays pandas: a period is never equal to a text (`isin(["2024-01"])` is
    False everywhere in pandas), nor to a period of another frequency."""
    period = getattr(values.const, "period", None) if isinstance(values, Opaque) else None
    if column.dtype is None or period is None or column.dtype != period:
        raise Unsupported("isin on periods, or with periods, other than a column of periods "
                          "(dt.to_period) and pd.period_range(...) of the same frequency")
    code = column.code.method("is_in", values.const.code)
    return derived_column(column, code, dtype="bool", null_is_false=True)


def _comparable(items: list[Any], dtype: str | None, ctx: RuleContext) -> list[Any]:
    """The items pandas can match in a column of this type: a number never equals a text
    (`pd.Series([1]).isin(["1"])` is False), and Polars refuses to compare them at all, so the
    items of the other kind are dropped."""
    def kind(v: Any) -> str | None:
        if v is None or isinstance(v, float) and v != v:
            return None
        return "str" if isinstance(v, str) else "number" if isinstance(v, (int, float)) else "other"
    kinds = {kind(v) for v in items} - {None}
    if dtype in ("int", "float", "bool"):
        return [v for v in items if kind(v) != "str"]
    if dtype in ("str", "category", "enum"):
        return [v for v in items if kind(v) != "number"]
    if len(kinds) > 1:
        ctx.lower("the list mixes texts and numbers and the column type is not known; pandas "
                  "matches each against equal values only", 0.7)
    return items


def _numbers_of_column_type(column: Column, items: list[Any], ctx: RuleContext) -> tuple[Code, list[Any]]:
    """The numbers of the list written in the column's type: pandas compares numbers by value
    (3.0 is in an integer column holding 3, True is 1), Polars refuses a list of another
    numeric type. In an integer column a fraction matches nothing and is dropped."""
    def number(v: Any) -> bool:
        return isinstance(v, (int, float)) and v == v  # NaN stays: it stands for missing

    code = column.code
    if not any(number(v) for v in items):
        return code, items
    if column.dtype == "int":
        return code, [int(v) if number(v) else v for v in items
                      if not number(v) or float(v).is_integer()]
    if column.dtype == "float":
        return code, [float(v) if number(v) else v for v in items]
    if column.dtype == "bool":
        return code, [bool(v) if number(v) else v for v in items if not number(v) or v in (0, 1)]
    if column.dtype is None:
        if any(isinstance(v, float) and number(v) for v in items):
            # a float in the list: the column may be integer or float, and Polars compares
            # only within one type, so the column is compared as floats
            return code.method("cast", emit.atom("pl.Float64")), \
                [float(v) if number(v) else v for v in items]
        if any(isinstance(v, int) and not isinstance(v, bool) for v in items):
            ctx.lower("the list holds whole numbers and the column type is not known: Polars "
                      "refuses to look for them in a float column (pandas compares by value)", 0.95)
    return code, items


def _matches_missing(items: list[Any], dtype: str | None, ctx: RuleContext) -> bool:
    """Whether pandas' isin matches a missing value: NaN in the list matches it in every
    column; None only in a text column (a missing number is NaN, which is not None)."""
    if any(isinstance(v, float) and v != v for v in items):
        return True
    if not any(v is None for v in items):
        return False
    if dtype is None:
        ctx.lower("None in the list matches missing text but not a missing number in pandas; "
                  "the column type is not known, so it is taken to be text", 0.8)
    return dtype in (None, "str", "category", "enum")


@rule("series.between")
def between(call: PandasCall, ctx: RuleContext) -> Value:
    """s.between(a, b, inclusive) -> .is_between(a, b, closed=...)."""
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call, "left", "right", "inclusive", positional=2)
    from porter.rules.ops import _as_datetime, _date_like
    bounds = [call.arg("left", 0), call.arg("right", 1)]
    if any(_date_like(b) for b in bounds) and column.dtype not in ("str", "datetime"):
        ctx.lower("bounds are dates written as text: pandas parses them when the column "
                  "holds datetimes", 0.7)
    # text bounds on a datetime column are dates to pandas ("2024-01-31" is midnight);
    # Polars refuses to compare datetimes with text
    left, right = (ctx.expr(_as_datetime(b, column), column.frame) for b in bounds)
    inclusive = call.const("inclusive", None, "both")
    closed = {"both": "both", "neither": "none", "left": "left", "right": "right"}.get(inclusive)
    if closed is None:
        raise Unsupported(f"inclusive={inclusive!r}")
    kwargs = {"closed": closed} if closed != "both" else {}
    from porter.rules.ops import _maybe_masked, masked
    if masked(column):
        # pandas' nullable types (Int64, Float64): a missing value is <NA> here (rules/ops.py)
        result = derived_column(column, column.code.method("is_between", left, right, **kwargs),
                                dtype="bool")
        return replace(result, nullable_int="boolean")
    _maybe_masked(ctx, column)
    return derived_column(column, column.code.method("is_between", left, right, **kwargs),
                          dtype="bool", null_is_false=True)


def _replace_args(call: PandasCall) -> tuple[object, object] | dict[Any, Any]:
    to_replace = call.const("to_replace", 0)
    if isinstance(to_replace, dict):
        if call.has("value", 1):
            raise Unsupported("nested replacement dicts")
        return to_replace
    value = call.const("value", 1)
    return to_replace, value


def _listed(args: tuple[object, object] | dict[Any, Any]) -> tuple[object, object] | dict[Any, Any]:
    """s.replace([a, b], v) as {a: v, b: v}, and s.replace([a, b], [v, w]) as {a: v, b: w}:
    what pandas replaces (a list of values to replace of several types, or lists of other
    lengths, are left as given)."""
    if isinstance(args, dict) or not isinstance(args[0], (list, tuple)):
        return args
    olds, new = list(args[0]), args[1]
    if not olds or not all(_hashable(o) for o in olds) or len({type(o) for o in olds}) > 1:
        return args
    if isinstance(new, (list, tuple)):
        return dict(zip(olds, new)) if len(new) == len(olds) and len(set(olds)) == len(olds) \
            else args
    return dict.fromkeys(olds, new) if _hashable(new) else args


def _values(args: tuple[object, object] | dict[Any, Any]) -> list[object]:
    return list(args.values()) if isinstance(args, dict) else [args[1]]


def _replacement(code: Code, args: tuple[object, object] | dict[Any, Any]) -> Code:
    if isinstance(args, dict):
        return code.method("replace", args)
    old, new = args
    return code.method("replace", old, new)


def _types(args: tuple[object, object] | dict[Any, Any]) -> tuple[set[type], set[type]]:
    pairs = list(args.items()) if isinstance(args, dict) else [args]
    old = {type(k) for k, _ in pairs if k is not None}
    new = {type(v) for _, v in pairs if v is not None}
    return old, new


@rule("series.replace")
def series_replace(call: PandasCall, ctx: RuleContext) -> Value:
    """s.replace(a, b) / s.replace({a: b}) -> .replace(...).

    Handles: values not in the mapping are kept, like pandas. Replacing with None makes a
    missing value in both (text columns).
    Caveats: replacing with None in a number or True/False column is a TODO: pandas 3 makes an
    object column of the values and None ([3, None, 2], written 3); lowered where the column's
    type is not known. A fraction in place of a value of an int column is a TODO: pandas makes
    the column float64 only where the value is found.
    """
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call, "to_replace", "value", positional=2)
    args = _replace_args(call)
    if column.dtype in ("str", "float", "int"):
        args = _listed(args)
    written_none = any(v is None for v in _values(args))  # None itself, not NaN (below)
    if column.dtype in ("str", "float") and any(
            isinstance(v, float) and v != v for v in _values(args)):
        # NaN (or pd.NA) in place of a value of a text or float column is a missing value of
        # the column's own type in pandas 3 (str stays str, float64 stays float64): a null
        # (Polars' NaN would not be missing to is_null, fill_null or a count)
        args = {k: None if isinstance(v, float) and v != v else v for k, v in args.items()} \
            if isinstance(args, dict) else (args[0], None)
    old, new = _types(args)
    if old and new and not (old | new) <= {int, float} and old != new:
        raise Unsupported("replacing values with values of another type (text with numbers) "
                          f"{MIXED_COLUMN}")
    code, dtype = column.code, column.dtype
    if written_none:
        # pandas 3 puts None into a number or True/False column as an object column of the
        # values and None ([3, None, 2], written 3); Int64 with nulls is pandas' float64
        # (written 3.0, listed [3.0, nan, 2.0])
        if dtype in ("int", "float", "bool"):
            # (MIXED_COLUMN: the Series pandas makes is not put back into a Polars frame, where
            # Int64 with nulls would be written 3.0: the frame stays pandas)
            raise Unsupported(f"replacing a value with None in a {dtype} column: pandas makes an "
                              "object column of the values and None ([3, None, 2], written 3), "
                              f"which no Polars type holds (it {MIXED_COLUMN})")
        if dtype is None:
            ctx.lower("replacing a value with None in a column of unknown type: in a number or "
                      "True/False column pandas makes an object column ([3, None, 2], written "
                      "3), here one with missing values (written 3.0)", 0.9)
    if _fractional_replacement(args) and dtype == "int" and column.float_int is None:
        # pandas' int64 column becomes float64 only where a value to replace is found (2.5 in
        # place of 2; written 1.0, 2.5), and stays int64 where none is (written 1, 2): the
        # type depends on the data
        raise Unsupported("replacing a value with a fraction in an integer column: pandas "
                          "makes it float64 only where the value is found (1.0, 2.5) and "
                          "keeps int64 where it is not (1, 2); a Polars plan fixes the type "
                          "before it sees the data")
    if _fractional_replacement(args) and dtype != "float":
        # pandas makes an integer column float to hold 2.5; Polars would truncate it to 2
        code, dtype = code.method("cast", emit.atom("pl.Float64")), "float"
    elif _fractional_keys(args) and dtype != "float":
        if dtype is None:
            ctx.lower("a fraction to replace in a column of unknown type: Polars casts it to an "
                      "integer column's type (2.5 to 2) and replaces that value", 0.95)
        elif dtype == "int":
            # no integer equals 2.5 in pandas; Polars would cast it to 2 and replace the 2s
            whole = _whole_keys(args)
            if whole is None:
                return derived_column(column, code, dtype=dtype)
            args = whole
    # (one number for another in a number column Polars compares by value already)
    pairs = args if isinstance(args, dict) else dict([args]) \
        if dtype in ("bool", "str") and _hashable(args[0]) else None
    keyed = keys_of_column_type(pairs, dtype) if pairs is not None else None
    if keyed is not None:
        # keys of another kind match nothing in pandas (1 is not True, "1" is not 1); Polars
        # would cast them to the column's type
        if not keyed:
            return derived_column(column, code, dtype=dtype)
        args = keyed if isinstance(args, dict) else next(iter(keyed.items()))
    if isinstance(args, dict) and dtype == "float":
        # Polars builds the new values with the first one's type and fails on 10 beside 2.5
        args = {k: float(v) if _number(v) and v == v else v for k, v in args.items()}
    result = derived_column(column, _replacement(code, args), dtype=dtype)
    values = args.values() if isinstance(args, dict) else [args[1]]
    if dtype == "int" and any(isinstance(v, float) and v != v for v in values):
        # float64 in pandas when a value is replaced by NaN (int64 when none matched): Polars
        # keeps Int64 with nulls, which later steps read (lost_float_ints)
        result = replace(result, float_int="replace() put NaN in place of a value")
    return result


def _number(x: object) -> bool:
    return isinstance(x, (int, float)) and not isinstance(x, bool)


def _hashable(x: object) -> bool:
    try:
        hash(x)
    except TypeError:
        return False
    return True


def _fractional_replacement(args: tuple[object, object] | dict[Any, Any]) -> bool:
    values = args.values() if isinstance(args, dict) else [args[1]]
    return any(_fraction(v) for v in values)


def _fraction(value: object) -> bool:
    return isinstance(value, float) and value == value and not value.is_integer()


def _fractional_keys(args: tuple[object, object] | dict[Any, Any]) -> bool:
    keys = args.keys() if isinstance(args, dict) else [args[0]]
    return any(_fraction(k) for k in keys)


def _whole_keys(args: tuple[object, object] | dict[Any, Any]) -> tuple[object, object] | dict[Any, Any] | None:
    """The replacements an integer column can hold a value of (no fraction to replace), or
    None when there is none."""
    if isinstance(args, dict):
        whole = {k: v for k, v in args.items() if not _fraction(k)}
        return whole or None
    return None if _fraction(args[0]) else args


@rule("frame.replace")
def frame_replace(call: PandasCall, ctx: RuleContext) -> Value:
    """df.replace(a, b) -> .with_columns(<columns of a's type>.replace(a, b)).

    Handles: pandas replaces in every column where the value occurs; porter replaces in the
    columns whose type can hold it (text values in text columns, numbers in numeric columns);
    never in the index (a groupby's keys, row labels carried as a column).
    Caveats: NaN replaced with a number is a missing value of every column to pandas: text,
    date and True/False columns become object columns holding the number, which Polars cannot
    mix (a TODO where such columns are known, 0.7 where the types are not known).
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "to_replace", "value", positional=2)
    args = _replace_args(call)
    old, new = _types(args)
    if not old or len(old) > 1 or (new and not (old | new) <= {int, float} and old != new):
        raise Unsupported("replacing values of mixed types across a frame")
    olds = args.keys() if isinstance(args, dict) else [args[0]]
    if any(isinstance(o, float) and o != o for o in olds):
        # NaN is every column's missing value to pandas, not only the numeric columns'
        others = [c for c, t in frame.dtypes if t not in ("int", "float")]
        if others:
            raise Unsupported(f"pandas replaces the missing values of {', '.join(others)} too, "
                              "making object columns of mixed types; Polars cannot mix them "
                              "(fill the numeric columns with fillna)")
        if frame.columns is None or len(frame.dtypes) != len(frame.columns):
            ctx.lower("NaN is a missing value of every column to pandas: it also replaces those "
                      "of text, date and True/False columns (making them object), which Polars "
                      "leaves missing", 0.7)
    selector = without_index(
        emit.atom("pl.selectors.string()" if old == {str} else "pl.selectors.numeric()"), frame)
    if old != {str} and _fractional_replacement(args):
        # pandas makes an integer column holding the value float; Polars would truncate
        selector = selector.method("cast", emit.atom("pl.Float64"))
        ctx.lower("every numeric column becomes float, not only those holding the value", 0.9)
    elif old != {str} and _fractional_keys(args):
        # no integer equals 2.5 in pandas; Polars would cast it to an integer column's type (2)
        # and replace the 2s: the integer columns get only the whole values to replace
        parts = [_replacement(without_index(emit.atom("pl.selectors.float()"), frame), args)]
        whole = _whole_keys(args)
        if whole is not None:
            parts.append(_replacement(without_index(emit.atom("pl.selectors.integer()"), frame),
                                      whole))
        return derive(frame, frame.code.method("with_columns", *parts), same_rows=True)
    code = frame.code.method("with_columns", _replacement(selector, args))
    return derive(frame, code, same_rows=True)


@rule("series.rank")
def series_rank(call: PandasCall, ctx: RuleContext) -> Value:
    """s.rank(method, ascending, pct) -> .rank(method) as floats.

    Handles: method average / min / max / dense, and first (Polars' ordinal: ties numbered in
    order of appearance, also descending); missing values keep no rank (na_option="keep");
    pct=True divides by the count of values (dense: by the highest rank), value by value so
    that each quotient is an exact division as in pandas; pandas' ranks are float64.
    """
    from porter.rules.io_options import DIVIDE_FUNCTION
    from porter.rules.windows import rank_code
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call, "axis", "method", "numeric_only", "na_option", "ascending", "pct",
                       positional=6)
    if call.const("axis", 0, 0) not in (0, "index"):
        raise Unsupported("axis other than 0")
    method = call.const("method", 1, "average", kinds=(str,))
    if call.const("numeric_only", 2, False, kinds=(bool,)):
        raise Unsupported("numeric_only=True")
    na_option = call.const("na_option", 3, "keep", kinds=(str,))
    ascending = call.const("ascending", 4, True, kinds=(bool,))
    pct = call.const("pct", 5, False, kinds=(bool,))
    rank = rank_code(column, method, ascending, na_option)
    if pct:
        # Polars divides by a single value through its reciprocal (one binary digit off
        # pandas' quotient): divided value by value
        total = column.code.method("rank", "dense").method("max") if method == "dense" \
            else column.code.method("count")
        rank = emit.call(DIVIDE_FUNCTION, rank, total)
    return derived_column(column, rank, dtype="float")


@rule("frame.sort_index", "series.sort_index")
def sort_index(call: PandasCall, ctx: RuleContext) -> Value:
    """sort_index() -> nothing on a frame still labelled 0..n-1 (reverse() for
    ascending=False); a sort by the key column on a table labelled by one key of distinct
    values (a groupby's, df.sum()'s column names).

    Handles: a missing key last (na_position="last"); text by code point in both; labels of
    several keys of text, whole numbers, dates or True/False (a MultiIndex: pandas' lexsort
    is stable, so rows of one label keep their order, as maintain_order=True).
    One key of numbers, True/False or dates that may repeat (set_index("day")): numpy's
    quicksort order, as pandas sorts it (pandas_sort_values).
    Caveats: labels after a filter or a sort (row numbers porter does not keep), several keys
    of other types,
    axis=1, key= and na_position="first" are TODOs. level= (a name or position, or a list of
    them) sorts stably by those keys: ascending a list of as many, each its own way; one
    True/False, then by the other keys too (sort_remaining=True), all that way. sort_index(by=...) of older pandas is
    sort_values (rules/legacy.py).
    """
    from porter.rules.selection import unique_key
    if "by" in call.kwargs and isinstance(call.receiver, Frame):
        from porter.rules.legacy import sort_index_by
        return sort_index_by(call, ctx)  # sort_index(by=...): older pandas' sort_values
    receiver = call.receiver
    if isinstance(receiver, Column):
        receiver = values_fixed(receiver)  # a running sum keeps the values of the rows in order
    frame = receiver.frame if isinstance(receiver, Column) else receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "axis", "level", "ascending", "kind", "na_position", "inplace",
                       "ignore_index", "sort_remaining")
    if call.const("axis", None, 0, kinds=(int, str)) not in (0, "index", "rows"):
        raise ctx.todo("sorting the columns by name (axis=1): select them in sorted order")
    if call.const("na_position", None, "last", kinds=(str,)) != "last":
        raise ctx.todo('na_position="first"')
    if call.has("level"):
        by_levels = _sort_index_levels(call, frame, ctx)
        if by_levels is not None:
            sorted_frame = derive(frame, by_levels, same_rows=False, rows=fresh_token())
            if isinstance(receiver, Column):
                return replace(receiver, frame=sorted_frame, sites=())
            return sorted_frame
    ascending = call.const("ascending", None, True, kinds=(bool,))
    if not frame.index and frame.labels_intact:
        # labels 0..n-1 in order: sorted already (reversed when descending)
        code = frame.code if ascending else frame.code.method("reverse")
    elif unique_key(frame):
        key = frame.index[0]
        kwargs: dict[str, Any] = {"nulls_last": True}
        if not ascending:
            kwargs["descending"] = True
        code = frame.code.method("sort", key, **kwargs)
    elif len(frame.index) == 1 and frame.dtype(frame.index[0]) == "str" \
            and not row_labels_carried(frame):
        # text labels that may repeat (set_index, read_csv(index_col=)): pandas' str dtype
        # sorts them stably (pyarrow's sort), rows of one label in their order, as
        # maintain_order=True does, both ways
        ctx.lower("rows of one label keep their order, as pandas' str dtype backed by pyarrow "
                  "sorts them; pandas without pyarrow sorts with numpy's quicksort, which puts "
                  "them in no set order", 0.95)
        kwargs = {"nulls_last": True, "maintain_order": True}
        if not ascending:
            kwargs["descending"] = True
        code = frame.code.method("sort", frame.index[0], **kwargs)
    elif len(frame.index) > 1 and not frame.index_unnamed and all(
            frame.dtype(k) in ("str", "int", "bool", "date", "datetime") for k in frame.index):
        # labels of several keys (a MultiIndex): pandas sorts them with numpy's lexsort on
        # the levels' codes, which is stable (rows of one label keep their order, both ways),
        # a missing key last in its level; a groupby(dropna=False) made it a value of its
        # level (levels_with_missing), sorted last among them, so first when descending
        kwargs = {"nulls_last": ascending or not frame.levels_with_missing,
                  "maintain_order": True}
        if not ascending:
            kwargs["descending"] = True
        code = frame.code.method("sort", list(frame.index), **kwargs)
    elif len(frame.index) == 1 and frame.dtype(frame.index[0]) in ("int", "float", "bool",
                                                                   "date", "datetime") \
            and not row_labels_carried(frame) and not frame.index_unnamed:
        # one key of numbers, True/False or dates that may repeat (set_index("day")): pandas
        # sorts the labels as sort_values sorts a column, with numpy's quicksort (nargsort),
        # which puts rows of one label in an order of its own: pandas_sort_values
        key = frame.index[0]
        code = pandas_order(frame, emit.col(key), frame.dtype(key), ascending, "last",
                            call.const("kind", None, "quicksort"), ctx, name=emit.lit(key))
    else:
        raise ctx.todo("row labels that are original row numbers after a filter or sort, or "
                       "keys that may repeat: keep them in a column (with_row_index) and sort "
                       "by it")
    if call.const("ignore_index", None, False, kinds=(bool,)):
        raise ctx.todo("ignore_index=True: drop the key columns after the sort")
    if ascending and not frame.index:
        sorted_frame = frame  # nothing changed
    else:
        rows = fresh_token()
        # a groupby's table sorted by its key again is in the groupby's own order
        grouped = rows if ascending and frame.grouped_rows == frame.rows else None
        sorted_frame = derive(frame, code, same_rows=False, rows=rows, grouped_rows=grouped)
        if ascending and frame.index:
            sorted_frame = replace(sorted_frame, sorted_rows=sorted_frame.sorted_mark())
    if isinstance(receiver, Column):
        return replace(receiver, frame=sorted_frame, sites=())
    return sorted_frame


def _sort_index_levels(call: PandasCall, frame: Frame, ctx: RuleContext) -> Code | None:
    """sort_index(level=[...], ascending=[...]) of labels of several keys (a MultiIndex): a
    stable sort by the keys named, each its own way (pandas leaves the other keys in their
    order then); with ascending one True/False, by the keys named and then the others
    (sort_remaining=True), all that way. A missing key last in its level either way. None
    where the level names the only key of a table labelled by one (sorted as without
    level=)."""
    from porter.rules.selection import index_level
    levels = call.const_values("level", None, kinds=(str, int))
    assert levels is not None
    keys = [index_level(frame, Opaque(emit.lit(v), const=v)) for v in levels]
    if any(k is None for k in keys) or len(set(keys)) != len(keys):
        raise ctx.todo("a level that is not one of the labels' keys (or one named twice)")
    if len(frame.index) == 1:
        if not isinstance(call.const("ascending", None, True), bool):
            raise ctx.todo("ascending given as a list for one level")
        return None
    if frame.index_unnamed or not all(
            frame.dtype(k) in ("str", "int", "bool", "date", "datetime") for k in frame.index):
        raise ctx.todo("labels of several keys of types porter does not sort as pandas does")
    ascending = call.const("ascending", None, True, kinds=(bool, list, tuple))
    if call.const("ignore_index", None, False, kinds=(bool,)):
        raise ctx.todo("ignore_index=True: drop the key columns after the sort")
    if not isinstance(ascending, bool) and frame.levels_with_missing:
        raise ctx.todo("a missing key kept as a level value (groupby(dropna=False))")
    if isinstance(ascending, bool) and not ascending and frame.levels_with_missing:
        raise ctx.todo("a missing key kept as a level value (groupby(dropna=False)) sorted "
                       "descending")
    order = [k for k in keys if k is not None]
    if isinstance(ascending, bool):
        # pandas (MultiIndex.sortlevel) sorts by the levels named, then the others
        # (sort_remaining=True), all one way; a missing key last either way
        if call.const("sort_remaining", None, True, kinds=(bool,)):
            order += [k for k in frame.index if k not in order]
        if not ascending and frame.grouped_rows != frame.rows:
            ctx.lower("rows of one label (labels that repeat) keep their order; pandas "
                      "reverses the ascending order, which puts them the other way round", 0.95)
        ways = [ascending] * len(order)
    else:
        # a list: pandas sorts by the levels named only, each its own way (sort_remaining is
        # not read), stably
        ways = list(ascending)
        if len(ways) != len(order) or not all(isinstance(w, bool) for w in ways):
            raise ctx.todo("ascending as a list of another length than level (pandas raises)")
    # pandas sorts the levels' codes with a stable lexsort: rows of one label keep their order
    return frame.code.method("sort", order, descending=[not w for w in ways], nulls_last=True,
                             maintain_order=True)


# -- reindex ------------------------------------------------------------------------------------

@rule("series.reindex")
def series_reindex(call: PandasCall, ctx: RuleContext) -> Value:
    """s.reindex(days, fill_value=0) -> pl.LazyFrame({"index": days}).join(s, how="left").

    On a Series labelled by one date key (a groupby's), days a pd.date_range written in the
    script: one row per timestamp of the range, in its order; a timestamp the Series has no
    row for gets fill_value.

    Handles: the labels of the Series the range does not hold are left out; a missing value
    the Series had stays missing (fill_value fills the new labels only, as pandas); the result
    is labelled by the range, whose name is None (pandas' index takes the target's name:
    reset_index() calls it "index", rename_axis names it).
    Caveats: other targets (a list, another index, pd.MultiIndex.from_product), no fill_value
    (pandas' NaN turns integers float), method=, limit=, tolerance= and a Series whose labels
    may repeat (pandas raises) are TODOs."""
    from porter.rules.construct import DateRange, ProductLabels
    from porter.rules.selection import unique_key
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call, "index", "fill_value", positional=1)
    target = call.args[0] if call.args else call.kwargs.get("index")
    if isinstance(target, Opaque) and isinstance(target.const, ProductLabels):
        try:
            return _reindex_product(call, column, target, ctx)
        except Unsupported as exc:
            # kept on pandas, given pandas' MultiIndex of the same labels (the name holds the
            # Polars frame of them): a TODO all the same
            ctx.needs_review(exc.reason)
            labels = target.code.method("collect").method("to_pandas").method(
                "set_index", list(target.const.names)).attr("index")
            passed = {k: v.code for k, v in call.kwargs.items() if k != "index"}
            return PandasValue(handover.to_pandas(column).method("reindex", labels, **passed))
    if not (isinstance(target, Opaque) and isinstance(target.const, DateRange)
            and type(target.const) is DateRange):
        raise ctx.todo("a target other than a pd.date_range written in the script (a list, "
                       "another index, pd.MultiIndex.from_product): a join on a frame of the "
                       "labels")
    frame = column.frame
    if not unique_key(frame) or frame.dtype(frame.index[0]) != "datetime":
        raise ctx.todo("a Series not labelled by one date key of distinct values (a groupby's): "
                       "pandas raises for labels that repeat")
    fill = call.const("fill_value", None, None, kinds=(int, float, type(None)))
    if fill is None or isinstance(fill, bool):
        raise ctx.todo("no fill_value (or one that is not a number): pandas makes the new labels "
                       "NaN and turns integers float")
    if column.dtype not in ("int", "float"):
        raise ctx.todo(f"values of type {column.dtype or 'unknown'}")
    key = frame.index[0]
    value = column.name if column.name is not None else "values"
    found = "_porter_found"
    labels = "index"  # the range's name is None: pandas' unnamed index
    values = ctx.expr(column, frame)
    if values.text != emit.col(value).text:
        values = values.method("alias", value)
    right = frame.code.method("select", emit.col(key).method("alias", labels), values,
                              emit.pl("lit", True).method("alias", found))
    # the range's Series, by the name the script bound it to where it did
    stamps = target.code if target.code.text.isidentifier() else target.const.code
    range_frame = emit.pl("LazyFrame", emit.atom("{" + emit.lit(labels).text + ": "
                                                + stamps.text + "}"))
    if value in (labels, found):
        raise ctx.todo(f"a Series named {value!r}")
    filled = emit.when(emit.col(found), emit.col(value), fill)
    code = range_frame.method("join", right, on=labels, how="left", maintain_order="left") \
        .method("select", labels, filled.method("alias", value))
    dtype = "float" if column.dtype == "float" or isinstance(fill, float) else "int"
    rows = fresh_token()
    # each timestamp of the range once, in ascending order: a groupby's key order
    result = Frame(code, columns=(labels, value), index=(labels,), index_unnamed=True,
                   dtypes=((labels, "datetime"), (value, dtype)), labels_intact=False,
                   rows=rows, grouped_rows=rows)
    return Column(emit.col(value), frame=result, name=column.name, dtype=dtype)


@rule("frame.reindex")
def frame_reindex(call: PandasCall, ctx: RuleContext) -> Value:
    """df.reindex(days, fill_value=0) -> pl.LazyFrame({"index": days}).join(df, how="left"),
    the rows that found none filled.

    On a table labelled by one date key of distinct values (an unstack by day, a groupby's
    table), days a pd.date_range written in the script: one row per timestamp of the range,
    in its order; a timestamp the table has no row for gets fill_value in every column.

    Handles: the table's labels the range does not hold are left out; a missing value the
    table had stays missing (fill_value fills the new rows only); the columns keep their
    name (an unstack's key); the result is labelled by the range, whose name is None
    (rename_axis names it, reset_index() calls it "index").
    pd.MultiIndex.from_product as the target: a left join of a groupby's table on the cross
    join of the levels (_reindex_frame_product).
    Caveats: other targets, columns=, no fill_value, method=, limit=, tolerance=, tables whose
    labels may repeat (pandas raises) and columns that may hold other than numbers are TODOs."""
    from porter.rules.construct import DateRange, ProductLabels
    from porter.rules.selection import unique_key
    from porter.translate.context import number_cells
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "index", "labels", "fill_value", positional=1)
    target = call.args[0] if call.args else call.kwargs.get("index", call.kwargs.get("labels"))
    if isinstance(target, Opaque) and isinstance(target.const, ProductLabels):
        return _reindex_frame_product(call, frame, target, ctx)
    if not (isinstance(target, Opaque) and isinstance(target.const, DateRange)
            and type(target.const) is DateRange):
        raise ctx.todo("a target other than a pd.date_range written in the script: a join on a "
                       "frame of the labels")
    if not unique_key(frame) or frame.dtype(frame.index[0]) != "datetime":
        raise ctx.todo("a table not labelled by one date key of distinct values: pandas raises "
                       "for labels that repeat")
    fill = call.const("fill_value", None, None, kinds=(int, float, type(None)))
    if fill is None or isinstance(fill, bool):
        raise ctx.todo("no fill_value (or one that is not a number): pandas makes the new rows "
                       "NaN and turns integers float")
    key = frame.index[0]
    labels = "index"  # the range's name is None: pandas' unnamed index
    found = "_porter_found"
    pivoted, kind = number_cells(frame)
    if pivoted:
        cells = None
    elif frame.columns is not None:
        cells = [c for c in frame.columns if c != key]
        kinds = {frame.dtype(c) for c in cells}
        if not cells or not kinds <= {"int", "float"}:
            raise ctx.todo("columns that may hold other than numbers: pandas writes the fill "
                           "value into them as it is")
        kind = "float" if "float" in kinds else "int"
    else:
        raise ctx.todo("a table whose columns porter does not know")
    if (labels in (frame.columns or ()) and labels != key) or found in (frame.columns or ()):
        raise ctx.todo(f"a column named {labels!r} beside the labels")
    right = frame.code
    if key != labels:
        right = right.method("rename", {key: labels})
    right = right.method("with_columns", emit.pl("lit", True).method("alias", found))
    stamps = target.code if target.code.text.isidentifier() else target.const.code
    range_frame = emit.pl("LazyFrame", emit.atom("{" + emit.lit(labels).text + ": "
                                                + stamps.text + "}"))
    values = emit.pl("exclude", labels, found)
    filled = emit.when(emit.col(found), values, fill)
    code = range_frame.method("join", right, on=labels, how="left", maintain_order="left") \
        .method("with_columns", filled).method("drop", found)
    if kind == "int" and isinstance(fill, float):
        kind = "float"
    rows = fresh_token()
    columns = None if cells is None else (labels, *cells)
    dtypes = ((labels, "datetime"),) + tuple((c, "float" if isinstance(fill, float)
                                               and frame.dtype(c) == "int" else frame.dtype(c))
                                              for c in cells or () if frame.dtype(c))
    return replace(frame, code=code, sites=(), columns=columns, index=(labels,),
                   index_unnamed=True, dtypes=dtypes, labels_intact=False, rows=rows,
                   grouped_rows=rows, number_cells=(code.text, kind) if pivoted else None)


def _reindex_frame_product(call: PandasCall, frame: Frame, target: Opaque,
                           ctx: RuleContext) -> Value:
    """df.reindex(pd.MultiIndex.from_product(levels, names=...), fill_value=x) of a groupby's
    table on as many keys: a left join of the table on the cross join of the levels (the
    table's keys matched to the levels by position, as pandas matches them), every
    combination once in the product's order; one the table has no row for gets fill_value in
    every column, a missing value it had stays missing, and a whole-number column stays
    whole numbers unless the fill is a fraction. The result is labelled by the levels' names."""
    product = target.const
    keys = list(frame.index)
    if len(keys) != len(product.names) or frame.grouped_rows != frame.rows \
            or row_labels_carried(frame):
        raise ctx.todo("a table not labelled by as many keys of distinct combinations (a "
                       "groupby's) as the product has levels: pandas raises for labels that "
                       "repeat")
    kinds = {"str": "pl.String", "int": "pl.Int64", "datetime": None}
    if not all(frame.dtype(k) in kinds for k in keys):
        raise ctx.todo("keys of a type other than text, whole numbers or dates")
    fill = call.const("fill_value", None, None, kinds=(int, float, type(None)))
    if fill is None or isinstance(fill, bool):
        raise ctx.todo("no fill_value (or one that is not a number): pandas makes the new rows "
                       "NaN and turns integers float")
    if frame.columns is None or frame.number_cells:
        raise ctx.todo("a table whose columns porter does not know")
    cells = [c for c in frame.columns if c not in keys]
    if not cells or not {frame.dtype(c) for c in cells} <= {"int", "float"}:
        raise ctx.todo("columns that may hold other than numbers: pandas writes the fill value "
                       "into them as it is")
    if any(c in cells for c, _ in frame.float_ints):
        raise ctx.todo("whole numbers pandas may hold as floats (a step gave them a missing "
                       "value): the fill would be written 0.0 there, 0 here")
    found = "_porter_found"
    names = list(product.names)
    if set(cells) & {*names, found}:
        raise ctx.todo("a column named like a level of the product")
    mark = emit.pl("lit", True).method("alias", found)
    if tuple(keys) == product.names:
        right = frame.code.method("with_columns", mark)
    else:
        right = frame.code.method("select", *(emit.col(k) if k == n else
                                              emit.col(k).method("alias", n)
                                              for k, n in zip(keys, names)),
                                  *cells, mark)
    # the levels of text or numbers as the keys' types (an empty list has none of its own); a
    # date range is Datetime already, in the unit of the dates it was read from
    casts = [f"{emit.lit(n).text}: {kinds[frame.dtype(k)]}" for k, n in zip(keys, names)
             if kinds[frame.dtype(k)] is not None]
    labels = target.code.method("cast", emit.atom("{" + ", ".join(casts) + "}")) \
        if casts else target.code
    filled = emit.when(emit.col(found), emit.pl("col", *cells), fill)
    code = labels.method("join", right, on=names, how="left", maintain_order="left") \
        .method("select", *names, filled)
    rows = fresh_token()
    dtypes = (*((n, frame.dtype(k)) for k, n in zip(keys, names)),
              *((c, "float" if isinstance(fill, float) else frame.dtype(c)) for c in cells))
    return Frame(code, columns=(*names, *cells), index=tuple(names), dtypes=dtypes,
                 labels_intact=False, rows=rows, grouped_rows=rows)


def _reindex_product(call: PandasCall, column: Column, target: Opaque, ctx: RuleContext) -> Value:
    """s.reindex(pd.MultiIndex.from_product(levels, names=...), fill_value=x) of a groupby's
    Series on as many keys: a left join of the Series on the cross join of the levels (the
    Series' keys matched to the levels by position, as pandas matches them), every
    combination once in the product's order; one the Series has no row for gets fill_value,
    a missing value it had stays missing. The result is labelled by the levels' names."""
    product = target.const
    frame = column.frame
    keys = list(frame.index)
    if len(keys) != len(product.names) or frame.grouped_rows != frame.rows \
            or row_labels_carried(frame):
        raise ctx.todo("a Series not labelled by as many keys of distinct combinations (a "
                       "groupby's) as the product has levels")
    kinds = {"str": "pl.String", "int": "pl.Int64"}
    if not all(frame.dtype(k) in kinds for k in keys):
        raise ctx.todo("keys of a type other than text or whole numbers")
    fill = call.const("fill_value", None, None, kinds=(int, float, type(None)))
    if fill is None or isinstance(fill, bool):
        raise ctx.todo("no fill_value (or one that is not a number): pandas makes the new labels "
                       "NaN and turns integers float")
    if column.dtype not in ("int", "float"):
        raise ctx.todo(f"values of type {column.dtype or 'unknown'}")
    value = column.name if column.name is not None else "values"
    found = "_porter_found"
    if value in (*product.names, found):
        raise ctx.todo(f"a Series named {value!r} like a level")
    values = ctx.expr(column, frame)
    if values.text != emit.col(value).text:
        values = values.method("alias", value)
    mark = emit.pl("lit", True).method("alias", found)
    if frame.columns == (*keys, value) and tuple(keys) == product.names \
            and values.text == emit.col(value).text:
        right = frame.code.method("with_columns", mark)
    else:
        right = frame.code.method("select", *(emit.col(k) if k == n else
                                              emit.col(k).method("alias", n)
                                              for k, n in zip(keys, product.names)),
                                  values, mark)
    names = list(product.names)
    # the levels as the keys' types (an empty list has none of its own)
    labels = target.code.method("cast", emit.atom(
        "{" + ", ".join(f"{emit.lit(n).text}: {kinds[frame.dtype(k)]}"
                        for k, n in zip(keys, names)) + "}"))
    filled = emit.when(emit.col(found), emit.col(value), fill)
    code = labels.method("join", right, on=names, how="left", maintain_order="left") \
        .method("select", *names, filled.method("alias", value))
    dtype = "float" if column.dtype == "float" or isinstance(fill, float) else "int"
    rows = fresh_token()
    # every combination once: what unstack lays out (pandas' levels are sorted, as porter
    # lays them out)
    result = Frame(code, columns=(*names, value), index=tuple(names),
                   dtypes=(*((n, frame.dtype(k)) for k, n in zip(keys, names)), (value, dtype)),
                   labels_intact=False, rows=rows, grouped_rows=rows)
    return Column(emit.col(value), frame=result, name=column.name, dtype=dtype)


# why a draw is stated at 0.3
_SAMPLE_REASON = ("Polars draws other rows than pandas whatever the seed (another random "
                  "generator): the rows, and every value computed from them, match pandas' "
                  "only by chance; their number, the columns and their types do")


@rule("frame.sample")
def frame_sample(call: PandasCall, ctx: RuleContext) -> Value:
    """df.sample(n=, frac=, replace=, random_state=) -> collect().sample(n, shuffle=True,
    with_replacement=, seed=).lazy().

    Handles: n (1 when neither n nor frac is given, as pandas), frac as pandas counts it
    (round(frac * rows), Python's rounding of halves to even, where Polars' fraction= rounds
    down), replace=True, an int random_state as the seed (the same rows on every run, as in
    pandas), the drawn rows in a random order as pandas gives them, ignore_index=True (fresh
    labels); without it the rows keep their labels, which later label reads carry as after a
    filter. Too many rows without replace raises in both.
    Caveats: the rows drawn are not pandas' (0.3): another random generator. weights=, axis=1
    and a RandomState or Generator as random_state are TODOs.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "n", "frac", "replace", "weights", "random_state", "axis",
                       "ignore_index", positional=6)
    if call.has("weights", 3) and call.const("weights", 3, None) is not None:
        raise ctx.todo("weights=: Polars' sample draws every row alike")
    if call.const("axis", 5, None, kinds=(int, str, type(None))) not in (None, 0, "index", "rows"):
        raise ctx.todo("axis=1 draws columns")
    n = call.const("n", 0, None, kinds=(int, type(None)))
    frac = call.const("frac", 1, None, kinds=(int, float, type(None)))
    replace_rows = call.const("replace", 2, False, kinds=(bool,))
    seed = call.const("random_state", 4, None, kinds=(int, type(None)))
    if isinstance(seed, bool) or isinstance(n, bool) or isinstance(frac, bool):
        raise ctx.todo("True/False given for a count or a seed")
    if n is not None and frac is not None:
        raise ctx.todo("n and frac together (pandas raises)")
    if n is not None and n < 0 or frac is not None and (frac < 0 or frac > 1 and not replace_rows):
        raise ctx.todo("a negative count, or frac above 1 without replace (pandas raises)")
    options: dict[str, Any] = {"shuffle": True}
    if replace_rows:
        options["with_replacement"] = True
    if seed is not None:
        options["seed"] = seed
    collected = frame.code.method("collect")
    if frac is None:
        code = collected.method("sample", n if n is not None else 1, **options)
    else:
        # pandas draws round(frac * rows) rows; Polars' fraction= rounds down
        count = emit.call("round", emit.binop(emit.lit(float(frac)), "*", emit.atom("t.height")))
        drawn = emit.atom("t").method("sample", count, **options)
        code = collected.method("pipe", emit.atom(f"lambda t: {drawn.text}"))
    ctx.lower(_SAMPLE_REASON, 0.3)
    intact = bool(call.const("ignore_index", None, False, kinds=(bool,)))
    if intact and frame.index:
        code = code.method("drop", *frame.index)
        return derive(frame, code.method("lazy"), same_rows=False, labels_intact=True,
                      index=(), index_unnamed=False,
                      columns=None if frame.columns is None else tuple(
                          c for c in frame.columns if c not in frame.index))
    return derive(frame, code.method("lazy"), same_rows=False, labels_intact=intact)
