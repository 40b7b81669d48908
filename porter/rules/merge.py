"""Combining frames: merge -> LazyFrame.join, pd.concat -> pl.concat.

Caveats: indicator= and validate= on right or cross joins, left_index/right_index, the anti
joins and axis=1 concatenation are TODOs. Missing keys match each other only as nulls: porter keeps frames NaN-free (NaN is
written as a missing value), and a NaN produced by arithmetic would match only NaN in Polars.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass, replace
from typing import Any

import libcst as cst

from porter.emit import code as emit
from porter.emit.code import Code
from porter.rules import rule
from porter.translate import handover
from porter.translate.context import (
    PandasCall, RuleContext, Unsupported, floats_where_missing, mark_numbers, nullable_mark,
    ROW_LABELS, labelled_frame, row_labels_carried,
)
from porter.translate.values import NOT_NULLABLE, Column, Frame, FrameList, Opaque, Scalar, Value

HOW = {"inner": "inner", "left": "left", "right": "right", "outer": "full", "cross": "cross"}
MERGE_PARAMS = ("right", "how", "on", "left_on", "right_on", "left_index", "right_index", "sort",
                "suffixes", "copy", "indicator", "validate")
INDICATOR_ADVICE = (
    "indicator=True has no join option: mark each side with a literal column, join how='full', "
    "then derive '_merge' with pl.when (J08)")


@rule("frame.merge")
def frame_merge(call: PandasCall, ctx: RuleContext) -> Value:
    """df.merge(right, how, on, ...) -> .join(right, ..., nulls_equal=True, maintain_order=...).

    Handles: pandas' row order for every `how` (left_right, right_left for a right join);
    outer joins coalesce their keys and sort by them with missing keys last (first for
    timestamps and durations: pandas' NaT); missing keys match each other (nulls_equal=True); left_on/right_on keep both key columns; suffixes
    applied to both sides when the columns are known; pandas' column order after a right
    join; sort=True; an int key joined to a float key (cast when the types are known); keys
    that are the index of a grouped frame.
    validate= (not on a right or cross join; a failed check raises ComputeError).
    Caveats: indicator=, left_index/right_index and the anti joins are TODOs.
    With the columns unknown, the columns both frames have are found from their schemas when
    the script runs.
    """
    return _merge(call.receiver, _named(call, MERGE_PARAMS), ctx)


@rule("pd.merge")
def pd_merge(call: PandasCall, ctx: RuleContext) -> Value:
    """pd.merge(left, right, ...) -> left.join(right, ...); as frame.merge."""
    args = _named(call, ("left", *MERGE_PARAMS))
    return _merge(args.arg("left"), args, ctx)


VALIDATE = {"one_to_one": "1:1", "1:1": "1:1", "one_to_many": "1:m", "1:m": "1:m",
            "many_to_one": "m:1", "m:1": "m:1", "many_to_many": None, "m:m": None}


def _validate(args: PandasCall, ctx: RuleContext) -> str | None:
    """Polars' validate= for pandas' one: the same check of which side's keys are unique.

    Missing keys count as equal keys on both sides (nulls_equal=True), as pandas counts
    them; a failed check raises ComputeError instead of pandas' MergeError.
    """
    value = args.const("validate", None, None, kinds=(str,))
    if value is None:
        return None
    if value not in VALIDATE:
        raise ctx.todo(f"validate={value!r} is not one of pandas' checks")
    if VALIDATE[value] is not None:
        ctx.lower("validate=: keys that fail the check raise polars' ComputeError, not "
                  "pandas' MergeError (code that catches MergeError does not see it)", 0.95)
    return VALIDATE[value]


def _named(call: PandasCall, names: Sequence[str]) -> PandasCall:
    """The call with every argument by name, so both spellings read the same."""
    if len(call.args) > len(names):
        raise Unsupported("more positional arguments than pandas takes")
    unknown = [k for k in call.kwargs if k not in names]
    if unknown:
        raise Unsupported(f"argument {', '.join(unknown)} is not handled by porter yet")
    kwargs = dict(zip(names, call.args)) | call.kwargs
    return PandasCall(call.receiver, call.name, (), kwargs, call.node)


@dataclass(frozen=True)
class _Side:
    """One input of the join as it is prepared: its code, columns, types and keys."""

    code: Code
    columns: tuple[str, ...] | None
    dtypes: dict[str, str]
    keys: tuple[str, ...]
    index: tuple[str, ...]


def _merge(left: Any, args: PandasCall, ctx: RuleContext) -> Value:
    right = args.arg("right")
    from porter.translate.values import Indexed
    if isinstance(right, Indexed) and not right.grouped:
        # read_csv(index_col=k) / set_index(k): the table labelled by k, its key column first
        right = labelled_frame(right.frame, right.key)
    for side, value in (("left", left), ("right", right)):
        if not isinstance(value, Frame):
            raise ctx.todo(f"the {side} side is not a frame porter tracks: make it a "
                           "LazyFrame (pl.from_pandas(...).lazy()) where it is built")
    assert isinstance(left, Frame) and isinstance(right, Frame)
    indicator = _indicator(args, ctx)
    validate = _validate(args, ctx)
    if args.const("left_index", None, False) and args.const("right_index", None, False) \
            and _labelled_alike(left, right) \
            and not any(args.has(k) for k in ("on", "left_on", "right_on")):
        # both frames labelled by the same key columns: pandas joins on the labels exactly as
        # it merges on=those keys (the same rows, order and index), which porter ports
        keys: Any = list(left.index) if len(left.index) > 1 else left.index[0]
        kwargs = {k: v for k, v in args.kwargs.items() if k not in ("left_index", "right_index")}
        kwargs["on"] = Opaque(emit.lit(keys), const=keys)
        args = PandasCall(args.receiver, args.name, (), kwargs, args.node)
    labels_from_left = carried = False
    if args.const("right_index", None, False) and not args.const("left_index", None, False) \
            and args.has("left_on") and not args.has("on") and not args.has("right_on"):
        right, args = _left_on_right_index(left, right, args, ctx)
        labels_from_left = True
        if row_labels_carried(left):
            carried = True
            left = _left_labels_as_column(left)
    if args.const("left_index", None, False) or args.const("right_index", None, False):
        raise ctx.todo("left_index/right_index join on row labels: make the labels a column "
                       "(with_row_index where the frame was made) and join on it")
    how = args.const("how", None, "inner", kinds=(str,))
    if how in ("left_anti", "right_anti"):
        raise ctx.todo(f"how={how!r} keeps the other side's columns as missing values and the "
                       "old row labels: use join(how='anti') and add the columns")
    if how not in HOW:
        raise ctx.todo(f"how={how!r}")
    left_keys, right_keys, coalesced = _keys(args, how, left, right, ctx)
    lside = _ignore_index(left, left_keys, coalesced, ctx)
    rside = _ignore_index(right, right_keys, coalesced, ctx)
    if lside.index and rside.index and not (lside.index == rside.index == left_keys):
        raise ctx.todo("both frames keep an index that is not exactly the merge keys: "
                       "call reset_index() first")
    before = (lside, rside)
    lside, rside, suffix = _suffixes(args, lside, rside, coalesced, ctx)
    nullable = _nullable_marks((left, right), before, (lside, rside), how)
    widened = _int_keys_widened(lside, rside)
    lside, rside = _common_key_types(lside, rside)

    kwargs: dict[str, object] = {}
    if how != "cross":
        if coalesced:
            kwargs["on"] = emit.names_arg(lside.keys)
        else:
            kwargs["left_on"] = emit.names_arg(lside.keys)
            kwargs["right_on"] = emit.names_arg(rside.keys)
    kwargs["how"] = HOW[how]
    unknown_right_order = how == "right" and coalesced and (
        lside.columns is None or rside.columns is None)
    if not coalesced or unknown_right_order:
        kwargs["coalesce"] = False  # pandas keeps both key columns (J06)
    elif how == "outer":
        kwargs["coalesce"] = True  # pandas' outer merge has one key column (J04)
    if how != "cross":
        kwargs["nulls_equal"] = True  # pandas matches missing keys with each other (J01)
    kwargs["maintain_order"] = "right_left" if how == "right" else "left_right"
    if validate is not None:
        if how in ("right", "cross"):
            raise ctx.todo(f"validate= on a {how} join: Polars checks keys only on inner, "
                           "left and full joins; check the keys' uniqueness before the join")
        kwargs["validate"] = validate
    if suffix is not None:
        kwargs["suffix"] = suffix
    columns = _result_columns(lside, rside, coalesced)
    if indicator is not None:
        if how in ("right", "cross"):
            raise ctx.todo(f"indicator= on a {how} merge: " + INDICATOR_ADVICE)
        if columns is None:
            ctx.lower("the columns are not known: pandas raises where a column is named "
                      f"{indicator!r} already, Polars replaces it", 0.95)
        elif indicator in columns or set(columns) & set(_SIDE_MARKS):
            raise ctx.todo(f"a column is named {indicator!r}, {_SIDE_MARKS[0]!r} or "
                           f"{_SIDE_MARKS[1]!r} (pandas raises for the first; porter marks the "
                           "sides with the others)")
        marked = [replace(side, code=side.code.method("with_columns", **{mark: emit.pl("lit", True)}))
                  for side, mark in zip((lside, rside), _SIDE_MARKS)]
        lside, rside = marked
    code, back_to_int = _join(lside, rside, how, kwargs)
    if how == "right" and coalesced:
        code = _right_join_order(code, lside, rside, columns, suffix or "_right")
    if how == "outer" or (args.const("sort", None, False) and how != "cross"):
        code = code.method("sort", _sort_keys(how, lside, rside, coalesced),
                           nulls_last=_nulls_last(lside, rside), maintain_order=True)
    # pandas' key column keeps the int type of the left key after a left or inner merge on
    # one name; with left_on/right_on each key column keeps its own type where the join
    # leaves it no missing value: the cast to Float64 (for the join) is undone there
    back = [k for k in widened[0] if how in ("left", "inner")] + back_to_int
    if not coalesced and lside.columns is not None and how in ("right", "inner"):
        back += [k for k in widened[1] if k not in lside.columns]
    if back:
        code = code.method("with_columns", *(emit.col(k).method("cast", emit.atom("pl.Int64"))
                                             for k in back))
    # with the columns unknown, the types known of each side's columns are kept: a name both
    # sides have is renamed with its suffix at run time, and no longer read under the old name
    dtypes = {**rside.dtypes, **lside.dtypes, **{k: "int" for k in back}}
    # a row of one side that finds no match gives the other side's columns missing values:
    # pandas then holds an int column as floats (10.0) and a True/False one as objects, which
    # depends on the data; Polars keeps Int64 with nulls (to_csv writes 10.0 while a missing
    # value is left, but not after a dropna, and astype(str) gives "10")
    optional = {"left": [rside], "right": [lside], "outer": [lside, rside]}.get(how, [])
    kinds = {c: t for side in optional for c, t in side.dtypes.items()
             if t in ("int", "bool") and c not in side.keys}
    changing = sorted(kinds)
    # int columns of known names are given pandas' type once the join has run (below)
    stated = [c for c in changing if kinds[c] == "bool" or columns is None or c not in columns]
    if stated:
        ctx.lower(f"{', '.join(stated)}: pandas makes an int column float (a True/False one "
                  "object) when a row finds no match, which depends on the data; Polars keeps "
                  "its type with missing values", 0.95)
    if changing:
        # an int column stays "int", marked: its text is decided at run time from the nulls;
        # a True/False one stays "bool", porter's type for True/False that may hold missing
        # values (as read from a file with blanks): NaN where pandas hands over or lists them
        dtypes = {c: t for c, t in dtypes.items() if c not in changing or t in ("int", "bool")}
    # pandas' nullable integers (Int64) stay integers with <NA> where a row finds no match
    # (written 10): only plain int64 columns become float64
    float_ints = tuple((c, "the merge left a row unmatched") for side in optional
                       for c, t in side.dtypes.items() if t == "int" and c not in side.keys
                       and not (nullable is not None and nullable.get(c)))
    if indicator is not None:
        # pandas' Categorical of where each row came from, its categories in this order
        left, right = (emit.col(m).method("is_not_null") for m in _SIDE_MARKS)
        source = emit.pl("when", emit.binop(left, "&", right)).method("then", emit.pl("lit", "both")) \
            .method("when", left).method("then", emit.pl("lit", "left_only")) \
            .method("otherwise", emit.pl("lit", "right_only")) \
            .method("cast", emit.pl("Enum", ["left_only", "right_only", "both"]))
        code = code.method("with_columns", **{indicator: source}).method("drop", *_SIDE_MARKS)
        if columns is not None:
            columns = (*columns, indicator)
            dtypes[indicator] = "enum"
    ints = [c for c, _ in float_ints if columns is not None and c in columns]
    if ints:
        code = _float_where_missing(code, ints)
        float_ints = tuple(m for m in float_ints if m[0] not in ints)
        dtypes = {c: t for c, t in dtypes.items() if c not in ints}
    marks: dict[str, Any] = {}
    if nullable is not None:
        marks = {"nullable_ints": tuple((c, m) for c, m in nullable.items() if m),
                 "unsure_ints": tuple(c for c, m in nullable.items() if m is None)}
    # left_on= with right_index=True: pandas labels each row with its left row's label
    # (repeated where a key matches several rows), not with new row numbers
    index = lside.index if lside.index and rside.index else ()
    if carried:  # the left rows' labels, carried in the column "index" (pandas' unnamed index)
        index = (ROW_LABELS,)
    result = Frame(code, columns=columns, labels_intact=not labels_from_left, float_ints=float_ints,
                   **marks, index=index, index_unnamed=carried,
                   dtypes=tuple((c, dtypes[c]) for c in columns if c in dtypes)
                   if columns is not None else tuple(dtypes.items()))
    # the int columns given pandas' type once the join ran hold numbers either way (Float64
    # where a row found no match, Int64 otherwise): select_dtypes("number") picks them, and a
    # fill keeps the type the join gave them (missing.series_fillna)
    return mark_numbers(result, ints) if ints else result


_SIDE_MARKS = ("_in_left", "_in_right")


def _left_on_right_index(left: Frame, right: Frame, args: PandasCall,
                         ctx: RuleContext) -> tuple[Frame, PandasCall]:
    """merge(left_on=k, right_index=True): the right frame's one index level made a column
    named k, and the merge read as on=k.

    pandas matches the left column k with the right frame's labels and keeps the left's k
    (the right's labels are not written as a column): the rows, their order and the columns
    are those of a merge on=k where the right's key column is its labels under the name k.
    The row labels are the left rows' (repeated where a key matches several rows), which the
    returned frame says are not 0..n-1. Only left and inner merges of a left frame without an
    index, and a right frame labelled by one named key without a column named k."""
    how = args.const("how", None, "inner", kinds=(str,))
    left_on = args.const("left_on", None, None)
    if isinstance(left_on, list) and len(left_on) == 1:
        left_on = left_on[0]
    if how not in ("left", "inner"):
        raise ctx.todo(f"left_on= with right_index=True and how={how!r}: pandas' key column "
                       "and labels then mix both sides; reset_index() the right frame and merge "
                       "on columns")
    if not isinstance(left_on, str):
        raise ctx.todo("left_on= with right_index=True on several keys or a computed one")
    if left.index and not row_labels_carried(left):
        raise ctx.todo("left_on= with right_index=True of a left frame with an index: "
                       "reset_index() it first")
    if not left.labels_intact and not row_labels_carried(left):
        # pandas labels the rows with the left's labels, which a filter or sort made: the TODO
        # has the left frame carry them (engine.labels_as_column) and the next pass ports this
        raise ctx.todo("left_on= with right_index=True labels the rows with the left frame's "
                       "labels, the original row numbers after a filter or sort: keep them as "
                       "a column (with_row_index) where the left frame is made")
    if len(right.index) != 1 or right.index_unnamed or row_labels_carried(right) \
            or right.columns is None:
        raise ctx.todo("right_index=True of a frame not labelled by one named key column: "
                       "reset_index() the right frame and merge on columns")
    label = right.index[0]
    others = [c for c in right.columns if c != label]
    if left_on in others:
        raise ctx.todo(f"the right frame has a column {left_on!r} too: pandas then suffixes "
                       "the left's key and that column in a way of its own")
    if left.columns is not None and left_on not in left.columns:
        raise ctx.todo(f"merge key {left_on!r} is not a column of the left frame")
    code = right.code
    columns = tuple(right.columns)
    dtypes = tuple(right.dtypes)
    if label != left_on:
        code = code.method("rename", {label: left_on})
        columns = tuple(left_on if c == label else c for c in columns)
        dtypes = tuple((left_on if c == label else c, t) for c, t in dtypes)
    keyed = replace(right, code=code, columns=columns, dtypes=dtypes, index=(),
                    labels_intact=False, grouped_rows=None, number_cells=None)
    if row_labels_carried(left) and ROW_LABELS in others:
        raise ctx.todo(f"the right frame has a column {ROW_LABELS!r}, the name porter gives "
                       "the left rows' labels")
    kwargs = {k: v for k, v in args.kwargs.items() if k not in ("left_on", "right_index")}
    kwargs["on"] = Opaque(emit.lit(left_on), const=left_on)
    return keyed, PandasCall(args.receiver, args.name, (), kwargs, args.node)


def _left_labels_as_column(left: Frame) -> Frame:
    """The left frame of merge(left_on=, right_index=True) whose row labels a filter or sort
    left in its column "index": that column joined as any other, so that each row of the result
    carries its left row's label, as pandas labels it."""
    return replace(left, index=(), index_unnamed=False)


def _labelled_alike(left: Frame, right: Frame) -> bool:
    """Both frames labelled by the same named key columns (set_index, index_col=, a groupby's
    keys), neither by row numbers."""
    return bool(left.index) and left.index == right.index \
        and not left.index_unnamed and not right.index_unnamed \
        and not row_labels_carried(left) and not row_labels_carried(right)


def _float_where_missing(code: Code, ints: Sequence[str]) -> Code:
    """The joined table with each int column of `ints` made Float64 where the join left it a
    missing value. pandas' type is known once the join has run: float64 where it left a value
    missing, int64 where every row found its match. The joined table gives each such column the
    type pandas gives it, so what follows (fillna, astype(str), sums, to_csv, a row read as a
    Series) reads it as pandas does; porter cannot tell which, so it knows no type for them."""
    return floats_where_missing(code, ints)


def _nullable_marks(frames: tuple[Frame, Frame], before: tuple[_Side, _Side],
                    after: tuple[_Side, _Side], how: str = "inner"
                    ) -> dict[str, str | None] | None:
    """Each column of the merged frame that is one of pandas' nullable integers on its side:
    its dtype name ("Int64"), NOT_NULLABLE, or None where porter does not know; None when the
    columns or the marks of a side are not known. A key both sides have is one where both
    agree, or one Int64 on one side and a numpy int64 on the other: pandas 3.1 gives the left
    key's type for an inner or left merge, Int64 for a right or outer one."""
    marks: dict[str, str | None] = {}
    left_dtypes: dict[str, str | None] = {}
    for side, (frame, old, new) in enumerate(zip(frames, before, after)):
        if frame.nullable_ints is None or old.columns is None or new.columns is None:
            return None
        for name, renamed in zip(old.columns, new.columns):
            mark = nullable_mark(frame, name)
            if renamed in marks and marks[renamed] != mark:
                first, dtypes = marks[renamed], (left_dtypes.get(renamed), frame.dtype(name))
                if {first, mark} == {"Int64", NOT_NULLABLE} and dtypes[first == "Int64"] == "int":
                    mark = first if how in ("inner", "left") else "Int64"
                else:
                    mark = None  # a key of both sides, nullable on one of them
            marks[renamed] = mark
            if side == 0:
                left_dtypes[renamed] = frame.dtype(name)
    return marks


def _indicator(args: PandasCall, ctx: RuleContext) -> str | None:
    """The name of pandas' indicator column, or None without one."""
    value = args.const("indicator", None, False)
    if value is False:
        return None
    if value is True:
        return "_merge"
    if isinstance(value, str) and value:
        return value
    raise ctx.todo(INDICATOR_ADVICE)


def _names(value: Any, what: str, ctx: RuleContext) -> tuple[str, ...] | None:
    if value is None:
        return None
    if isinstance(value, str):
        return (value,)
    if isinstance(value, (list, tuple)) and value and all(isinstance(v, str) for v in value):
        return tuple(value)
    raise ctx.todo(f"{what} must name columns (arrays of key values are not handled)")


def _keys(args: PandasCall, how: str, left: Frame, right: Frame,
          ctx: RuleContext) -> tuple[tuple[str, ...], tuple[str, ...], bool]:
    """The key columns of each side, and whether pandas keeps one column per key."""
    on = _names(args.const("on", None, None), "on", ctx)
    left_on = _names(args.const("left_on", None, None), "left_on", ctx)
    right_on = _names(args.const("right_on", None, None), "right_on", ctx)
    if how == "cross":
        if on or left_on or right_on:
            raise ctx.todo("how='cross' takes no keys (pandas raises MergeError)")
        return (), (), True
    if on is not None:
        if left_on or right_on:
            raise ctx.todo("on= together with left_on/right_on (pandas raises MergeError)")
        keys = on
    elif left_on is not None or right_on is not None:
        if left_on is None or right_on is None or len(left_on) != len(right_on):
            raise ctx.todo("left_on and right_on must name as many columns (pandas raises)")
        if left_on != right_on:
            if any(a == b for a, b in zip(left_on, right_on)):
                raise ctx.todo("some key pairs share a name and others do not: pandas keeps "
                               "one column for the first and two for the others")
            _check_keys(left, left_on, ctx)
            _check_keys(right, right_on, ctx)
            return left_on, right_on, False
        keys = left_on  # same names on both sides: one column per key, as with on=
    else:
        if left.columns is None or right.columns is None:
            raise ctx.todo("without on=, pandas joins on the columns both frames share, which "
                           "porter does not know here: write on=[...]")
        keys = tuple(c for c in left.columns if c not in left.index
                     and c in right.columns and c not in right.index)
        if not keys:
            raise ctx.todo("the frames share no column to join on (pandas raises MergeError)")
    _check_keys(left, keys, ctx)
    _check_keys(right, keys, ctx)
    return keys, keys, True


def _check_keys(frame: Frame, keys: tuple[str, ...], ctx: RuleContext) -> None:
    if frame.columns is not None and any(k not in frame.columns for k in keys):
        missing = [k for k in keys if k not in frame.columns]
        raise ctx.todo(f"merge key {', '.join(map(repr, missing))} is not a column of this frame")


def _ignore_index(frame: Frame, keys: tuple[str, ...], coalesced: bool,
                  ctx: RuleContext) -> _Side:
    """pandas ignores an index that is not a merge key, and uses index levels named in on=."""
    side = _Side(frame.code, frame.columns, dict(frame.dtypes), keys, frame.index)
    if not frame.index:
        return side
    used = [c for c in frame.index if c in keys]
    if not used:  # a join on columns only: the index (kept as columns by porter) goes
        code = frame.code.method("drop", *frame.index)
        columns = tuple(c for c in frame.columns if c not in frame.index) \
            if frame.columns is not None else None
        return _Side(code, columns, side.dtypes, keys, ())
    if coalesced and len(used) == len(frame.index):
        return side
    raise ctx.todo("the index of this frame (after a groupby) is only partly a merge key: "
                   "call reset_index() first")


def _suffixes(args: PandasCall, lside: _Side, rside: _Side, coalesced: bool,
              ctx: RuleContext) -> tuple[_Side, _Side, str | None]:
    """Rename the columns both sides have, as pandas does, before the join (J05)."""
    suffixes = args.const("suffixes", None, ("_x", "_y"))
    if not (isinstance(suffixes, (tuple, list)) and len(suffixes) == 2
            and all(s is None or isinstance(s, str) for s in suffixes)):
        raise ctx.todo("suffixes must be two strings")
    lsuf, rsuf = (s or "" for s in suffixes)
    if lside.columns is None or rside.columns is None:
        # The shared columns are found when the script runs, from the two schemas (no data is
        # read): each side renames the columns the other side also has, as pandas does.
        left_schema = lside.code.method("collect_schema")
        right_schema = rside.code.method("collect_schema")
        if not coalesced:
            ctx.lower("a key column whose name the other frame also has keeps its name here; "
                      "pandas suffixes it too (run with --data to know the columns)", 0.9)
        # a side whose columns porter knows is named as a tuple: no schema read, no plan copied
        right_names = rside.columns if rside.columns is not None else right_schema.method("names")
        left_names = lside.columns if lside.columns is not None else left_schema.method("names")
        return (_renamed_at_run_time(lside, right_names, tuple(lside.keys), lsuf),
                _renamed_at_run_time(rside, left_names, tuple(rside.keys), rsuf), None)
    shared = [c for c in lside.columns if c in rside.columns
              and not (coalesced and c in lside.keys)]
    if shared and not lsuf and not rsuf:
        raise ctx.todo("columns overlap but no suffix is given (pandas raises ValueError)")
    return _renamed(lside, shared, lsuf), _renamed(rside, shared, rsuf), None


def _renamed_at_run_time(side: _Side, other_names: Code | tuple[str, ...], keys: tuple[str, ...],
                         suffix: str) -> _Side:
    """Rename this side's columns that the other side also has; `other_names` is the other
    side's columns when porter knows them, else the code that reads them when the script runs."""
    if not suffix:
        return side
    if isinstance(other_names, tuple):  # written out: no schema read, no plan copied
        clash = tuple(c for c in other_names if c not in keys)
        if not clash:
            return side
        rename = Code(f"lambda c: c + {emit.lit(suffix).text} if c in {emit.lit(clash).text} else c")
        dtypes = {(c + suffix if c in clash else c): t for c, t in side.dtypes.items()}
        return _Side(side.code.method("rename", rename), None, dtypes, side.keys, side.index)
    test = "c in other" + (f" and c not in {emit.lit(keys).text}" if keys else "")
    # the other schema is read when the lambda is made (a default argument): reading it inside
    # the rename would re-enter Polars' plan resolution
    rename = Code(f"lambda c, other={other_names.text}: "
                  f"c + {emit.lit(suffix).text} if {test} else c")
    # the types known stay under their names: a column renamed at run time is no longer read
    # under its old name (pandas and Polars both fail there)
    return _Side(side.code.method("rename", rename), None, side.dtypes, side.keys, side.index)


def _renamed(side: _Side, shared: list[str], suffix: str) -> _Side:
    if not shared or not suffix:
        return side
    mapping = {c: c + suffix for c in shared}
    return _Side(side.code.method("rename", mapping),
                 tuple(mapping.get(c, c) for c in side.columns or ()),
                 {mapping.get(c, c): t for c, t in side.dtypes.items()},
                 tuple(mapping.get(k, k) for k in side.keys), side.index)


def _join(lside: _Side, rside: _Side, how: str, kwargs: dict[str, object]) -> tuple[Code, list[str]]:
    """left.join(right); an int key joined to a key whose type porter does not know (an int
    column an earlier merge made float where it left a row unmatched, as pandas does) takes
    that key's type at run time when it is a number (Polars refuses to join Int64 to Float64;
    pandas joins them, and a left or inner merge keeps the left key's type). Also the left
    int keys cast so, to give back their Int64 after the join."""
    pairs = [(lk, rk, lside.dtypes.get(lk), rside.dtypes.get(rk))
             for lk, rk in zip(lside.keys, rside.keys)]
    loose = [(lk, rk, a, b) for lk, rk, a, b in pairs if {a, b} == {"int", None}]
    if how not in ("left", "inner") or len(loose) != 1:
        return lside.code.method("join", rside.code, **kwargs), []
    lk, rk, a, _ = loose[0]
    other, name, key = ("__right", rk, lk) if a == "int" else ("__left", lk, rk)
    kind = emit.atom(f"{other}.collect_schema()[{emit.render(name)}]")
    # a number: its type; anything else stays Int64 (Polars raises, as pandas does)
    target = emit.atom(f"{kind.text} if {kind.text}.is_numeric() else pl.Int64")
    cast = emit.col(key).method("cast", target)
    if a == "int":  # the right key's type decides; the left key is Int64 again afterwards
        joined = lside.code.method("with_columns", cast).method("join", emit.atom(other), **kwargs)
        return rside.code.method("pipe", emit.atom(f"lambda {other}: {joined.text}")), [lk]
    joined = emit.atom(other).method("join", rside.code.method("with_columns", cast), **kwargs)
    return lside.code.method("pipe", emit.atom(f"lambda {other}: {joined.text}")), []


def _common_key_types(lside: _Side, rside: _Side) -> tuple[_Side, _Side]:
    """pandas joins an int key to a float key; Polars raises SchemaError (J11)."""
    lcast, rcast, ltext, rtext = [], [], [], []
    for lk, rk in zip(lside.keys, rside.keys):
        kinds = (lside.dtypes.get(lk), rside.dtypes.get(rk))
        if kinds == ("int", "float"):
            lcast.append(lk)
        elif kinds == ("float", "int"):
            rcast.append(rk)
        elif kinds == ("category", "str"):  # pandas joins a category key to a text one
            ltext.append(lk)
        elif kinds == ("str", "category"):
            rtext.append(rk)
    return (_cast_text(_cast_float(lside, lcast), ltext),
            _cast_text(_cast_float(rside, rcast), rtext))


def _cast_text(side: _Side, keys: list[str]) -> _Side:
    """Category keys joined to text keys: as text (Polars refuses to join the two types)."""
    if not keys:
        return side
    exprs = [emit.col(k).method("cast", emit.atom("pl.String")) for k in keys]
    return _Side(side.code.method("with_columns", *exprs), side.columns,
                 {**side.dtypes, **{k: "str" for k in keys}}, side.keys, side.index)


def _int_keys_widened(lside: _Side, rside: _Side) -> tuple[list[str], list[str]]:
    """The int keys of each side _common_key_types casts to Float64 (the other key is float)."""
    pairs = [(lk, rk, lside.dtypes.get(lk), rside.dtypes.get(rk))
             for lk, rk in zip(lside.keys, rside.keys)]
    return ([lk for lk, _, a, b in pairs if (a, b) == ("int", "float")],
            [rk for _, rk, a, b in pairs if (a, b) == ("float", "int")])


def _cast_float(side: _Side, keys: list[str]) -> _Side:
    if not keys:
        return side
    exprs = [emit.col(k).method("cast", emit.atom("pl.Float64")) for k in keys]
    return _Side(side.code.method("with_columns", *exprs), side.columns,
                 {**side.dtypes, **{k: "float" for k in keys}}, side.keys, side.index)


def _result_columns(lside: _Side, rside: _Side, coalesced: bool) -> tuple[str, ...] | None:
    """pandas' column order: the left columns, then the right ones (one column per key)."""
    if lside.columns is None or rside.columns is None:
        return None
    right = [c for c in rside.columns if not (coalesced and c in rside.keys)]
    return (*lside.columns, *right)


def _right_join_order(code: Code, lside: _Side, rside: _Side, columns: tuple[str, ...] | None,
                      suffix: str) -> Code:
    """Polars puts the keys of a right join after the left columns; pandas keeps them where
    the left frame has them (J03)."""
    if columns is None:
        # joined with coalesce=False: the left key columns take the right keys' values
        exprs = [emit.col(k + suffix).method("alias", k) for k in lside.keys]
        return code.method("with_columns", *exprs).method("drop", *(k + suffix for k in lside.keys))
    left_values = [c for c in lside.columns or () if c not in lside.keys]
    if (*left_values, *(rside.columns or ())) == columns:
        return code
    return code.method("select", *columns)


# pandas sorts a missing timestamp, duration or period (NaT, the smallest int64 inside) before
# every other key, and a missing number or text after them
_NAT_KEYS = ("datetime", "duration")


def _nulls_last(lside: _Side, rside: _Side) -> bool | list[bool]:
    """Polars' nulls_last= for the sort of an outer or sort=True merge, key by key as pandas
    places the missing keys: first for timestamps and durations, last otherwise."""
    def nat(kind: str | None) -> bool:  # periods kept as their text (to_period) too
        return kind in _NAT_KEYS or kind is not None and kind.startswith("period[")
    last = [not nat(lside.dtypes.get(a)) and not nat(rside.dtypes.get(b))
            for a, b in zip(lside.keys, rside.keys)]
    if all(last):
        return True
    return last[0] if len(last) == 1 else last


def _sort_keys(how: str, lside: _Side, rside: _Side, coalesced: bool) -> object:
    if coalesced:
        return emit.names_arg(lside.keys)
    if how == "outer":  # a row from either side: sort by whichever key it has
        exprs = [emit.pl("coalesce", emit.col(a), emit.col(b))
                 for a, b in zip(lside.keys, rside.keys)]
        return exprs[0] if len(exprs) == 1 else exprs
    return emit.names_arg(rside.keys if how == "right" else lside.keys)


# -- merge_asof -----------------------------------------------------------------------------

ASOF_PARAMS = ("left", "right", "on", "left_on", "right_on", "left_index", "right_index", "by",
               "left_by", "right_by", "suffixes", "tolerance", "allow_exact_matches", "direction")
ASOF_BY_MISSING = ("a missing value in a `by` column matches a missing value in the other frame "
                   "in pandas and matches nothing in Polars (the row gets no match)")


@rule("pd.merge_asof")
def merge_asof(call: PandasCall, ctx: RuleContext) -> Value:
    """pd.merge_asof(left, right, on=, by=, direction=, ...) -> left.join_asof(right, ...).

    Reads on / left_on+right_on, by / left_by+right_by, direction, allow_exact_matches,
    tolerance and suffixes.

    Handles: the left's rows in their order, each with the last right row whose key is <= its
    own (backward) or the first whose key is >= (forward), as pandas picks them among equal
    keys; nearest as pandas picks it (the forward row only when strictly nearer: a backward
    and a forward join_asof of the right's row numbers, then a join on the nearer one; Polars'
    own "nearest" takes the forward row on a tie and the last of equal keys);
    allow_exact_matches=False; tolerance as a number or a pd.Timedelta; pandas' columns:
    the left ones, then the right ones without the `by` columns and without the key when both
    sides call it the same (left_on/right_on of two names keep both, and left_by/right_by of
    two names keep the right one, in the right frame's order); suffixes on both sides for the
    other columns both frames have; an int key against a float one.
    Caveats: a missing `by` value matches a missing one
    in pandas and nothing in Polars (0.95). An int column of the right frame is made Float64
    once the join has run where a left row found no match, as pandas makes it float64 (as for
    merge).
    """
    args = _named(call, ASOF_PARAMS)
    left, right = args.arg("left"), args.arg("right")
    for side, value in (("left", left), ("right", right)):
        if not isinstance(value, Frame):
            raise ctx.todo(f"the {side} side is not a frame porter tracks: make it a "
                           "LazyFrame (pl.from_pandas(...).lazy()) where it is built")
    assert isinstance(left, Frame) and isinstance(right, Frame)
    if args.const("left_index", None, False) or args.const("right_index", None, False):
        raise ctx.todo("left_index/right_index match on row labels: make the labels a column "
                       "and use on=")
    if left.index or right.index:
        raise ctx.todo("a frame keeps an index (after a groupby): call reset_index() first")
    direction = args.const("direction", None, "backward", kinds=(str,))
    if direction not in ("backward", "forward", "nearest"):
        raise ctx.todo(f"direction={direction!r} (pandas raises)")
    exact = args.const("allow_exact_matches", None, True, kinds=(bool,))
    lkey, rkey = _asof_keys(args, ctx)
    lby, rby = _asof_by(args, ctx)
    for frame, names in ((left, (lkey, *lby)), (right, (rkey, *rby))):
        _check_keys(frame, names, ctx)
    kinds = {left.dtype(lkey), right.dtype(rkey)}
    if "date" in kinds and len(kinds) > 1:
        raise ctx.todo("a date key against a datetime key: cast both to one type first")
    tolerance = _asof_tolerance(args, ctx)

    # the key and the `by` columns pandas keeps once: same name on both sides
    once = {b for a, b in zip(lby, rby) if a == b} | ({lkey} if lkey == rkey else set())
    lside = _Side(left.code, left.columns, dict(left.dtypes), (lkey, *lby), ())
    rside = _Side(right.code, right.columns, dict(right.dtypes), (rkey, *rby), ())
    lside, rside = _asof_suffixes(args, lside, rside, once, ctx)
    widened = _int_keys_widened(lside, rside)
    lside, rside = _common_key_types(lside, rside)
    lkey, *lby = lside.keys
    rkey, *rby = rside.keys

    rcode = rside.code
    renamed_by: list[str] = []
    for a, b in zip(lby, rby):
        if a == b:
            renamed_by.append(b)
        else:
            # Polars drops the right `by` columns; pandas keeps one named otherwise: join on a
            # copy, so the column itself stays where the right frame has it
            copy = f"__asof_by_{len(renamed_by)}"
            rcode = rcode.method("with_columns", emit.col(b).method("alias", copy))
            renamed_by.append(copy)
    kwargs: dict[str, object] = {}
    if lkey == rkey:
        kwargs["on"] = lkey
    else:
        kwargs["left_on"], kwargs["right_on"] = lkey, rkey
    if lby:
        if list(lby) == renamed_by:
            kwargs["by"] = emit.names_arg(lby)
        else:
            kwargs["by_left"] = emit.names_arg(lby)
            kwargs["by_right"] = emit.names_arg(renamed_by)
        ctx.lower(ASOF_BY_MISSING, 0.95)
    if direction != "backward":
        kwargs["strategy"] = direction
    if tolerance is not None:
        kwargs["tolerance"] = tolerance
    if not exact:
        kwargs["allow_exact_matches"] = False
    if lkey != rkey:
        kwargs["coalesce"] = False  # pandas keeps both key columns
    if lby:
        # Polars cannot check the keys' order within groups and would warn; pandas has
        # checked that both keys are sorted (it raises otherwise)
        kwargs["check_sortedness"] = False
    if direction == "nearest":
        dropped = [b for a, b in zip(lby, rby) if a == b] + [b for b in renamed_by if b not in rby]
        code = _nearest(lside.code, rcode, kwargs, lkey, rkey, dropped + (
            [rkey] if lkey == rkey else []))
    else:
        code = lside.code.method("join_asof", rcode, **kwargs)
    columns = None
    if lside.columns is not None and rside.columns is not None:
        columns = (*lside.columns,
                   *(c for c in rside.columns if not (c in once and c in rside.keys)))
    dtypes = {**rside.dtypes, **lside.dtypes} if columns is not None else {}
    # a left row that finds no right row (or none within the tolerance) gives the right's
    # columns missing values: pandas then holds an int column as float64, as after a merge
    # (pandas' nullable integers stay integers)
    nullable = dict(right.nullable_ints or ())
    ints = [c for c, t in rside.dtypes.items() if t == "int" and columns is not None
            and c in columns and c not in lside.columns and not (c in once and c in rside.keys)
            and not nullable.get(c)]
    float_ints: tuple[tuple[str, str], ...] = ()
    if ints:
        code = _float_where_missing(code, ints)
        dtypes = {c: t for c, t in dtypes.items() if c not in ints}
    elif columns is None:
        float_ints = tuple((c, "merge_asof left a row unmatched") for c, t in rside.dtypes.items()
                           if t == "int" and c not in once)
    return Frame(code, columns=columns, labels_intact=True, float_ints=float_ints,
                 dtypes=tuple((c, dtypes[c]) for c in columns or () if c in dtypes))


def _nearest(left: Code, right: Code, kwargs: dict[str, object], lkey: str, rkey: str,
             dropped: list[str]) -> Code:
    """direction="nearest" as pandas picks: the backward and the forward match (each within
    the tolerance), the forward one only when it is strictly nearer. Polars' own "nearest"
    takes the forward row on a tie and the last of equal forward keys."""
    row = "__asof_row"
    right = right.method("with_row_index", row)
    by = next((v for k, v in kwargs.items() if k in ("by", "by_right")), [])
    by_names = [by] if isinstance(by, str) else list(by)  # type: ignore[call-overload]
    code = left
    for strategy, tag in (("backward", "__asof_back"), ("forward", "__asof_fwd")):
        candidates = right.method("select", *by_names, emit.col(rkey).method("alias", tag + "_key"),
                                  emit.col(row).method("alias", tag))
        options = {k: v for k, v in kwargs.items() if k not in ("on", "right_on", "coalesce")}
        options["left_on"], options["right_on"] = lkey, tag + "_key"
        options["strategy"] = strategy
        code = code.method("join_asof", candidates, **options)
    back, fwd, key = emit.col("__asof_back_key"), emit.col("__asof_fwd_key"), emit.col(lkey)
    pick = (emit.pl("when", fwd.method("is_null")).method("then", emit.col("__asof_back"))
            .method("when", back.method("is_null")).method("then", emit.col("__asof_fwd"))
            .method("when", emit.binop(emit.binop(fwd, "-", key), "<", emit.binop(key, "-", back)))
            .method("then", emit.col("__asof_fwd")).method("otherwise", emit.col("__asof_back"))
            .method("alias", row))
    rows = right.method("drop", *dropped) if dropped else right
    return (code.method("with_columns", pick)
            .method("join", rows, on=row, how="left", maintain_order="left")
            .method("drop", row, "__asof_back", "__asof_back_key", "__asof_fwd", "__asof_fwd_key"))


def _one_key(value: Any, what: str, ctx: RuleContext) -> str | None:
    names = _names(value, what, ctx)
    if names is None:
        return None
    if len(names) != 1:
        raise ctx.todo(f"{what} must name one column (pandas asof-joins on one key)")
    return names[0]


def _asof_keys(args: PandasCall, ctx: RuleContext) -> tuple[str, str]:
    on = _one_key(args.const("on", None, None), "on", ctx)
    left_on = _one_key(args.const("left_on", None, None), "left_on", ctx)
    right_on = _one_key(args.const("right_on", None, None), "right_on", ctx)
    if on is not None:
        if left_on is not None or right_on is not None:
            raise ctx.todo("on= together with left_on/right_on (pandas raises MergeError)")
        return on, on
    if left_on is None or right_on is None:
        raise ctx.todo("merge_asof needs on= or both left_on= and right_on=")
    return left_on, right_on


def _asof_by(args: PandasCall, ctx: RuleContext) -> tuple[tuple[str, ...], tuple[str, ...]]:
    by = _names(args.const("by", None, None), "by", ctx)
    left_by = _names(args.const("left_by", None, None), "left_by", ctx)
    right_by = _names(args.const("right_by", None, None), "right_by", ctx)
    if by is not None:
        if left_by is not None or right_by is not None:
            raise ctx.todo("by= together with left_by/right_by (pandas raises MergeError)")
        return by, by
    if left_by is None and right_by is None:
        return (), ()
    if left_by is None or right_by is None or len(left_by) != len(right_by):
        raise ctx.todo("left_by and right_by must name as many columns (pandas raises)")
    return left_by, right_by


def _asof_tolerance(args: PandasCall, ctx: RuleContext) -> object:
    if not args.has("tolerance"):
        return None
    value = args.arg("tolerance")
    if isinstance(value, Opaque) and value.is_const:
        const = value.const
        if const is None:
            return None
        if isinstance(const, (int, float)) and not isinstance(const, bool) and const >= 0:
            return const
    if isinstance(value, Scalar) and value.pytype == "timedelta":
        return value.code  # a Python timedelta, which join_asof reads
    raise ctx.todo("tolerance must be a number or a pd.Timedelta written out")


def _asof_suffixes(args: PandasCall, lside: _Side, rside: _Side, once: set[str],
                   ctx: RuleContext) -> tuple[_Side, _Side]:
    """pandas suffixes the columns both frames have, on both sides, except the columns it
    keeps once (J05); Polars would suffix only the right one."""
    suffixes = args.const("suffixes", None, ("_x", "_y"))
    if not (isinstance(suffixes, (tuple, list)) and len(suffixes) == 2
            and all(s is None or isinstance(s, str) for s in suffixes)):
        raise ctx.todo("suffixes must be two strings")
    lsuf, rsuf = (s or "" for s in suffixes)
    if lside.columns is None or rside.columns is None:
        keys = tuple(dict.fromkeys((*lside.keys, *rside.keys)))
        if set(keys) - once:
            ctx.lower("a key column whose name the other frame also has keeps its name here; "
                      "pandas suffixes it too (run with --data to know the columns)", 0.9)
        right_names = rside.columns if rside.columns is not None \
            else rside.code.method("collect_schema").method("names")
        left_names = lside.columns if lside.columns is not None \
            else lside.code.method("collect_schema").method("names")
        return (_renamed_at_run_time(lside, right_names, keys, lsuf),
                _renamed_at_run_time(rside, left_names, keys, rsuf))
    shared = [c for c in lside.columns if c in rside.columns and c not in once]
    by_names = set(lside.keys[1:]) | set(rside.keys[1:])
    if any(c in by_names for c in shared):
        raise ctx.todo("a `by` column whose name the other frame also has as another column")
    if shared and not lsuf and not rsuf:
        raise ctx.todo("columns overlap but no suffix is given (pandas raises ValueError)")
    return _renamed(lside, shared, lsuf), _renamed(rside, shared, rsuf)


# -- concat ---------------------------------------------------------------------------------

@rule("pd.concat")
def concat(call: PandasCall, ctx: RuleContext) -> Value:
    """pd.concat([a, b]) -> pl.concat([a, b], how="diagonal_relaxed").

    Handles: columns aligned by name in first-seen order, a column missing from a frame is
    missing there (an int column becomes float64 in pandas, even when that frame has no rows:
    cast to Float64), int and float columns take the common type (C01); join="inner" and
    sort=True when the columns are known; ignore_index=True gives fresh labels (C02).
    keys=[...] with names=[outer, inner]: each piece, labelled 0..n-1, given its key and its
    row numbers as index columns (_keyed_frames).
    Caveats: axis=1, other keys=, Series and frames porter does not track are TODOs.
    """
    keyed = call.has("keys") or call.has("levels") or call.has("names")
    if keyed and (call.has("levels") or call.const("ignore_index", None, False)
                  or call.const("axis", None, 0) not in (0, "index", "rows")):
        raise ctx.todo("keys= labels each piece in a MultiIndex: add a column per frame "
                       "(with_columns(pl.lit(key))) before the concat")
    ctx.reject_unknown(call, "objs", "axis", "join", "ignore_index", "sort", "copy",
                       "verify_integrity", "keys", "names", positional=1)
    axis = call.const("axis", None, 0)
    if axis in (1, "columns") and not keyed:
        return _side_by_side(call, ctx)
    if axis in (1, "columns"):
        raise ctx.todo("axis=1 lines frames up by their row labels (an outer join of the "
                       "indexes), not by position: join on a label column, or use "
                       "pl.concat(how='horizontal_extend') where both have labels 0..n-1")
    if axis not in (0, "index", "rows"):
        raise ctx.todo(f"axis={axis!r}")
    if call.const("verify_integrity", None, False):
        raise ctx.todo("verify_integrity=True checks row labels, which Polars does not have")
    join = call.const("join", None, "outer")
    if join not in ("outer", "inner"):
        raise ctx.todo(f"join={join!r}")
    ignore_index = bool(call.const("ignore_index", None, False))
    frames, listed = _listed_frames(call, ctx)
    if keyed:
        frames = _keyed_frames(frames, listed, call, ctx)
    index = frames[0].index
    if ignore_index:  # pandas drops the labels; porter's index columns go with them
        frames = [_drop_index(f) for f in frames]
        index = ()
    elif any(f.index != index for f in frames):
        raise ctx.todo("the frames have different indexes: call reset_index() first")
    _check_mixed_types(frames, ctx)
    code = emit.pl("concat", [f.code for f in frames] if listed is None else listed,
                   how="diagonal_relaxed")
    columns = _concat_columns(frames, join, bool(call.const("sort", None, False)), ctx)
    union = _union(f.columns or () for f in frames)
    if columns is not None and columns != union:
        code = code.method("select", *columns)
    dtypes = _concat_dtypes(frames, columns)
    nullable = _concat_nullable(frames, columns)
    gaps = [c for c in columns or () if dict(dtypes).get(c) == "int"
            and any(c not in (f.columns or ()) for f in frames)
            and not (nullable is not None and nullable.get(c) == "Int64")]
    if gaps:
        # a frame without the column gives it NaN: pandas makes it float64 (an empty such
        # frame too), where Polars' nulls would stay Int64 (written 5 after fillna, pandas 5.0)
        code = code.method("with_columns", emit.col(emit.names_arg(gaps)).method(
            "cast", emit.atom("pl.Float64")))
        dtypes = tuple((c, "float" if c in gaps else t) for c, t in dtypes)
    ctx.stacked_rows = tuple(f.rows for f in frames)
    marks: dict[str, object] = {} if nullable is None else {
        "nullable_ints": tuple((c, m) for c, m in nullable.items() if m),
        "unsure_ints": tuple(c for c, m in nullable.items() if m is None)}
    return Frame(code, columns=columns, dtypes=dtypes, index=index,
                 # (labels a filter or sort left stay pandas' unnamed index: to_csv writes
                 # them under an empty header)
                 index_unnamed=bool(index) and all(f.index_unnamed for f in frames),
                 labels_intact=ignore_index or len(frames) == 1 and frames[0].labels_intact,
                 sites=tuple(s for f in frames for s in f.sites), **marks)


def _side_by_side(call: PandasCall, ctx: RuleContext) -> Value:
    """pd.concat([s1, s2, ...], axis=1) of Series each labelled by one key (a groupby's,
    value_counts', a Series written with index=) -> a full join of them on their labels.

    pandas lines them up on their labels: the union of the labels in the order they are first
    met (join="outer"; "inner": the labels of all, in the first's order), a missing label
    matching a missing one; a label repeated in one of them makes pandas raise (validate="1:1"
    raises too). The index is named when every Series' index has that name. An int Series is
    float64 where a label found no value (made Float64 once the join has run)."""
    join = call.const("join", None, "outer")
    if join not in ("outer", "inner") or call.const("sort", None, False) \
            or call.const("ignore_index", None, False) or call.const("verify_integrity", None, False):
        raise ctx.todo("axis=1 with sort, ignore_index or verify_integrity: join on the label "
                       "columns")
    node = call.first_node("objs")
    if not isinstance(node, (cst.List, cst.Tuple)) or len(node.elements) < 2:
        raise ctx.todo("axis=1 of Series not written out as a list: join on the label columns")
    given = [ctx.evaluate(element.value, {}) if isinstance(element, cst.Element) else None
             for element in node.elements]
    same = _same_rows_side_by_side(given, ctx)
    if same is not None:
        return same
    pieces: list[Column] = []
    for value in given:
        if not isinstance(value, Column) or len(value.frame.index) != 1 \
                or value.name is None or value.name in value.frame.index:
            raise ctx.todo("axis=1 of values other than named Series labelled by one key "
                           "lines them up by their row labels: join on the label columns")
        pieces.append(value)
    names = [p.name for p in pieces]
    if len(set(names)) != len(names):
        raise ctx.todo("two Series of one name side by side (Polars refuses the names)")
    key_names = {None if p.frame.index_unnamed else p.frame.index[0] for p in pieces}
    key_types = {p.frame.dtype(p.frame.index[0]) for p in pieces}
    if len(key_types) != 1 or None in key_types or key_types & {"int", "float"} \
            and any(p.frame.index_unnamed for p in pieces):
        raise ctx.todo("labels of different or unknown types side by side: join on the label "
                       "columns")
    shared = key_names.pop() if len(key_names) == 1 else None
    key = shared if shared is not None else ROW_LABELS_COLUMN
    if key in names:
        raise ctx.todo(f"a Series named {key!r} like the labels")
    frames = []
    for piece in pieces:
        own = piece.frame.index[0]
        code = handover.series_frame(piece)
        if own != key:
            code = code.method("rename", {own: key})
        frames.append(code)
    how = "full" if join == "outer" else "inner"
    code = frames[0]
    for other in frames[1:]:
        kwargs: dict[str, object] = {"on": key, "how": how}
        if how == "full":
            kwargs["coalesce"] = True
        code = code.method("join", other, **kwargs, nulls_equal=True, validate="1:1",
                           maintain_order="left_right")
    dtypes = {key: next(iter(key_types))}
    ints = []
    for piece in pieces:
        if piece.dtype == "int" and how == "full":
            ints.append(piece.name)
        elif piece.dtype is not None:
            dtypes[piece.name] = piece.dtype
    if ints:
        code = _float_where_missing(code, ints)
    if any(p.dtype is None for p in pieces):
        ctx.lower("a Series of a type porter does not know: pandas makes an int Series float "
                  "where a label finds no value, Polars keeps its type", 0.95)
    return Frame(code, columns=(key, *names), index=(key,), index_unnamed=shared is None,
                 labels_intact=False, dtypes=tuple(dtypes.items()))


def _same_rows_side_by_side(given: list[Value | None], ctx: RuleContext) -> Value | None:
    """pd.concat([df, s, dummies], axis=1) of frames and named Series that all hold the same
    rows in the same order (a frame, columns computed from it, pd.get_dummies of one of its
    columns) -> pl.concat(how="horizontal"). Their labels are the same labels in the same
    order (repeated ones too, after an explode), so pandas puts them side by side as they
    are. None when the pieces are not all such."""
    pieces: list[tuple[Code, tuple[str, ...] | None, Frame]] = []
    for value in given:
        if isinstance(value, Frame):
            pieces.append((value.code, value.columns, value))
        elif isinstance(value, Column) and value.name is not None and not value.element:
            pieces.append((handover.series_frame(value), (value.name,), value.frame))
        else:
            return None
    frames = [f for _, _, f in pieces]
    if len({f.rows for f in frames}) != 1 or any(f.index for f in frames):
        return None
    known = [c for _, columns, _ in pieces for c in columns or ()]
    if len(set(known)) != len(known):
        raise ctx.todo("frames side by side holding a column of one name (pandas keeps both, "
                       "Polars cannot)")
    unknown = any(columns is None for _, columns, _ in pieces)
    if unknown:
        ctx.lower("a piece whose columns porter does not know: a name two pieces share makes "
                  "Polars raise where pandas keeps both columns", 0.95)
    dtypes: dict[str, str] = {}
    for _, columns, frame in pieces:
        for name in columns or ():
            if frame.dtype(name) is not None:
                dtypes[name] = frame.dtype(name)  # type: ignore[assignment]
    for value in given:
        if isinstance(value, Column) and value.dtype is not None and value.name is not None:
            dtypes[value.name] = value.dtype
    code = emit.pl("concat", [code for code, _, _ in pieces], how="horizontal")
    first = frames[0]
    return Frame(code, columns=None if unknown else tuple(known), dtypes=tuple(dtypes.items()),
                 rows=first.rows, labels_intact=first.labels_intact,
                 sites=tuple(s for f in frames for s in f.sites))


# the key column of labels whose index pandas leaves unnamed (reset_index() names it "index")
ROW_LABELS_COLUMN = "index"


def _keyed_frames(frames: list[Frame], listed: Code | None, call: PandasCall,
                  ctx: RuleContext) -> list[Frame]:
    """pd.concat(frames, keys=[...], names=[...]): pandas labels each row with the key of its
    piece and its own label there, a two-level index. Each piece is given both as index
    columns (the key, its label), so that reset_index() puts them first, as pandas does.

    The inner level is the piece's row number (labels 0..n-1), the label a filter or sort
    left (carried in its column "index"), or the key that labels it (set_index, a groupby's).
    The levels are named by names=, else the outer one has no name and the inner one the
    pieces' index name where they all share one: without names=, two unnamed levels are held
    as columns "level_0" and "level_1", the names reset_index() gives them (index_unnamed).
    One level named and the other not is a TODO (porter marks a whole index unnamed or not)."""
    keys = call.const("keys", None, None)
    names = call.const("names", None, None)
    if listed is not None or not (isinstance(keys, (list, tuple)) and len(keys) == len(frames)
                                  and all(isinstance(k, str) for k in keys)):
        raise ctx.todo("keys= other than one text per frame written in the list: add a column "
                       "per frame (with_columns(pl.lit(key))) before the concat")
    if names is None:
        names = [None, None]
    if not (isinstance(names, (list, tuple)) and 1 <= len(names) <= 2
            and all(n is None or isinstance(n, str) for n in names)):
        raise ctx.todo("names= other than one or two texts")
    inners = [_inner_level(frame, ctx) for frame in frames]
    labels = {label for label, _ in inners}
    inner_name = labels.pop() if len(labels) == 1 else None  # pandas: None where they differ
    outer = names[0]
    inner = names[1] if len(names) == 2 and names[1] is not None else inner_name
    if outer is None and inner is None:
        outer, inner = "level_0", "level_1"  # reset_index()'s names for unnamed levels
        unnamed = True
    elif outer is None or inner is None:
        raise ctx.todo("one level of the keys' MultiIndex named and the other not: give "
                       "names= for both levels")
    else:
        unnamed = False
    if outer == inner:
        raise ctx.todo("two levels of one name")
    keyed = []
    for frame, key, (_, source) in zip(frames, keys, inners):
        if frame.columns is None:
            raise ctx.todo("a piece whose columns porter does not know, or with a column named "
                           "like a level")
        data = [c for c in frame.columns if c not in frame.index]
        if {outer, inner} & set(data):
            raise ctx.todo("a piece with a column named like a level of the keys' index "
                           "(pandas' reset_index() raises)")
        code = frame.code.method("select", emit.pl("lit", key).method("alias", outer),
                                 source.method("alias", inner), *data)
        kind = "int" if not frame.index else frame.dtype(frame.index[0])
        keyed.append(replace(frame, code=code, columns=(outer, inner, *data),
                             dtypes=((outer, "str"), (inner, kind),
                                     *((c, t) for c, t in frame.dtypes if c in data)),
                             index=(outer, inner), index_unnamed=unnamed, labels_intact=False))
    return keyed


def _inner_level(frame: Frame, ctx: RuleContext) -> tuple[str | None, Code]:
    """The inner level pd.concat(keys=) gives a piece's rows, and its name: the row numbers of
    a piece labelled 0..n-1 (no name), the labels a filter or sort left (no name), or the one
    key labelling it (its name)."""
    if not frame.index and frame.labels_intact:
        return None, emit.pl("int_range", emit.pl("len"), dtype=emit.atom("pl.Int64"))
    if row_labels_carried(frame):
        return None, emit.col(ROW_LABELS)
    if len(frame.index) == 1 and not frame.index_unnamed and frame.dtype(frame.index[0]) in (
            "str", "int", "date", "datetime", "bool"):
        return frame.index[0], emit.col(frame.index[0])
    raise ctx.todo("a piece whose row labels porter does not keep (after a filter or sort), "
                   "or labelled by several keys: its labels are the inner level")


def _concat_nullable(frames: list[Frame], columns: tuple[str, ...] | None
                     ) -> dict[str, str | None] | None:
    """Each column of pd.concat's result that is one of pandas' nullable integers: "Int64"
    where a piece holds it as Int64 and every other piece as Int64 or a numpy int64, or not
    at all (pandas 3.1 keeps Int64 and fills a gap with <NA>); NOT_NULLABLE where no piece
    holds a nullable one; None where porter does not know (other mixes: Int32 beside Int64,
    Int64 beside float64, which pandas makes Float64). None when a piece's marks or columns
    are not known."""
    if columns is None or any(f.nullable_ints is None or f.columns is None for f in frames):
        return None
    marks: dict[str, str | None] = {}
    for name in columns:
        pieces = [(nullable_mark(f, name), f.dtype(name)) for f in frames if name in f.columns]
        kinds = {m for m, _ in pieces}
        if kinds == {NOT_NULLABLE}:
            marks[name] = NOT_NULLABLE
        elif "Int64" in kinds and kinds <= {"Int64", NOT_NULLABLE} and all(
                m == "Int64" or t == "int" for m, t in pieces):
            marks[name] = "Int64"
        else:
            marks[name] = None
    return marks


def _listed_frames(call: PandasCall, ctx: RuleContext) -> tuple[list[Frame], Code | None]:
    """The frames written in the list literal passed to pd.concat; or the frames appended
    to the list named there, with that name (a list of LazyFrames when the script runs)."""
    node = call.first_node("objs")
    given = call.args[0] if call.args else call.kwargs.get("objs")
    if isinstance(given, FrameList):
        if any(f.index for f in given.members):
            raise ctx.todo("frames with an index appended to the list: call reset_index() first")
        return list(given.members), given.code
    if isinstance(node, (cst.ListComp, cst.GeneratorExp)):
        return _comprehended_frames(node, call, ctx)
    if not isinstance(node, (cst.List, cst.Tuple)):
        raise ctx.todo("the frames are not written out as a list, so porter cannot see them")
    frames: list[Frame] = []
    for element in node.elements:
        if not isinstance(element, cst.Element):
            raise ctx.todo("*unpacking in the list of frames")
        value = ctx.evaluate(element.value, {})
        if isinstance(value, Column):
            raise ctx.todo("concatenating Series: pandas aligns them by their labels")
        if not isinstance(value, Frame):
            raise ctx.todo(f"`{value.code.text}` is not a frame porter tracks: make it a "
                           "LazyFrame (pl.from_pandas(...).lazy()) where it is built")
        frames.append(value)
    if not frames:
        raise ctx.todo("an empty list (pandas raises ValueError)")
    return frames, None


class _OneLine(cst.CSTTransformer):
    """The clause as one line (the layout breaks the code porter writes where it is long)."""

    def leave_ParenthesizedWhitespace(self, original: cst.ParenthesizedWhitespace,
                                      updated: cst.ParenthesizedWhitespace) -> cst.SimpleWhitespace:
        return cst.SimpleWhitespace(" ")


def _comprehended_frames(node: cst.ListComp | cst.GeneratorExp, call: PandasCall,
                         ctx: RuleContext) -> tuple[list[Frame], Code]:
    """pd.concat([pd.read_csv(f) for f in files], ignore_index=True): one `for` clause whose
    element is a frame porter tracks (the same frame for every value, as a list filled by
    append holds: analysis/frame_lists.py) -> a list comprehension of LazyFrames over the same
    values, filtered by the same conditions, so the pieces are stacked in the order pandas
    stacks them. Without ignore_index pandas keeps each piece's row labels: a TODO, as for
    a list filled by append."""
    clause = node.for_in
    if not call.const("ignore_index", None, False):
        raise ctx.todo("a comprehension of frames without ignore_index=True: pandas keeps each "
                       "piece's row labels, which Polars has no place for")
    if clause.inner_for_in is not None or clause.asynchronous is not None \
            or not isinstance(clause.target, cst.Name):
        raise ctx.todo("the frames are not written out as a list, so porter cannot see them "
                       "(a comprehension of one `for` over one name is read)")
    name = clause.target.value
    loop = {name: Opaque(emit.atom(name))}
    pieces = [ctx.evaluate(clause.iter, {}), *(ctx.evaluate(c.test, loop) for c in clause.ifs)]
    if not all(isinstance(p, Opaque) for p in pieces):
        raise ctx.todo("a comprehension of frames over pandas values: porter reads one over "
                       "plain Python values")
    value = ctx.evaluate(node.elt, loop)
    if not isinstance(value, Frame) or value.index:
        raise ctx.todo(f"`{value.code.text}` is not a frame porter tracks: make it a "
                       "LazyFrame (pl.from_pandas(...).lazy()) where it is built")
    if value.columns is None or any(value.dtype(c) is None for c in value.columns):
        # one value stands for every piece: columns (or types) porter does not know may
        # differ from one piece to the next, where pandas makes an int column with a gap
        # float, and text beside numbers an object column
        raise ctx.todo("a comprehension of frames whose columns or their types porter does "
                       "not know: they may differ from one piece to the next")
    listed = cst.ListComp(elt=cst.parse_expression(value.code.text),
                          for_in=clause.visit(_OneLine()))  # type: ignore[arg-type]
    ctx.args_evaluated_again = True
    return [value], emit.atom(cst.Module([]).code_for_node(listed))


def _drop_index(frame: Frame) -> Frame:
    if not frame.index:
        return frame
    columns = tuple(c for c in frame.columns if c not in frame.index) \
        if frame.columns is not None else None
    return Frame(frame.code.method("drop", *frame.index), columns=columns,
                 dtypes=tuple((c, t) for c, t in frame.dtypes if c not in frame.index),
                 sites=frame.sites)


def _union(columns: Any) -> tuple[str, ...]:
    seen: dict[str, None] = {}
    for names in columns:
        seen.update(dict.fromkeys(names))
    return tuple(seen)


def _concat_columns(frames: list[Frame], join: str, sort: bool,
                    ctx: RuleContext) -> tuple[str, ...] | None:
    if any(f.columns is None for f in frames):
        if join == "inner" or sort:
            raise ctx.todo("join='inner' and sort=True need the columns of every frame, "
                           "which porter does not know here")
        return None
    columns = _union(f.columns or () for f in frames)
    if join == "inner":  # the columns every frame has, in the first frame's order
        columns = tuple(c for c in columns if all(c in (f.columns or ()) for f in frames))
    return tuple(sorted(columns)) if sort else columns


def _check_mixed_types(frames: list[Frame], ctx: RuleContext) -> None:
    """pandas keeps text and numbers (or True/False and numbers) side by side in one column;
    diagonal_relaxed would turn the numbers into text (True/False into numbers)."""
    for column in _union(f.columns or () for f in frames):
        kinds = {f.dtype(column) for f in frames if column in (f.columns or ())}
        if "str" in kinds and kinds & {"int", "float", "bool"}:
            raise ctx.todo(f"column {column!r} holds text in one frame and numbers in another: "
                           "pandas keeps both, Polars would make the numbers text")
        if "bool" in kinds and kinds & {"int", "float"}:
            # also a column all blank in one file (float64 NaN): pandas keeps True/False
            raise ctx.todo(f"column {column!r} holds True/False in one frame and numbers in "
                           "another: pandas keeps both (an object column), Polars would make "
                           "True/False 1.0/0.0")
        if "bool" in kinds and None in kinds:
            ctx.lower(f"column {column!r} holds True/False in one frame and values of a type "
                      "porter does not know in another: pandas keeps True/False beside numbers "
                      "(an object column), Polars would make them 1.0/0.0", 0.9)


def _concat_dtypes(frames: list[Frame],
                   columns: tuple[str, ...] | None) -> tuple[tuple[str, str], ...]:
    """A column's type when every frame that has it agrees (int with float gives float)."""
    out = []
    for column in columns or ():
        kinds = {f.dtype(column) for f in frames if column in (f.columns or ())}
        if kinds == {"int", "float"}:
            kinds = {"float"}
        if len(kinds) == 1 and None not in kinds:
            out.append((column, kinds.pop()))
    return tuple(out)


@rule("frame.append")
def frame_append(call: PandasCall, ctx: RuleContext) -> Value:
    """df.append(other) -> pd.concat([df, other]) ported: what the method did before pandas 2
    removed it (the script fails on pandas 2 and 3; the port runs where pandas no longer does).

    Handles: a frame or a list of frames written in the call; ignore_index, sort and
    verify_integrity as pd.concat takes them.
    Caveats: appending a row (a dict or a Series) is a TODO: pd.concat with a one-row frame.
    """
    ctx.reject_unknown(call, "other", "ignore_index", "verify_integrity", "sort", positional=1)
    node = call.node
    other_node = call.first_node("other")
    if not (isinstance(node, cst.Call) and isinstance(node.func, cst.Attribute)) \
            or other_node is None:
        raise Unsupported("append of something porter cannot see")
    other = call.arg("other", 0)
    if isinstance(other_node, (cst.List, cst.Tuple)):
        pieces = [e.value for e in other_node.elements if isinstance(e, cst.Element)]
        if len(pieces) != len(other_node.elements):
            raise Unsupported("*unpacking in the list of frames")
    elif isinstance(other, Frame):
        pieces = [other_node]
    else:
        raise ctx.todo("appending a row (a dict or a Series): pd.concat([df, pd.DataFrame([row])], "
                       "ignore_index=True), which porter ports")
    objs = cst.List([cst.Element(node.func.value), *(cst.Element(p) for p in pieces)])
    stacked = cst.Call(func=cst.Attribute(cst.Name("pd"), cst.Name("concat")),
                       args=[cst.Arg(objs)])
    kwargs = {name: call.kwargs[name] for name in ("ignore_index", "verify_integrity", "sort")
              if name in call.kwargs}
    return concat(PandasCall(None, "concat", (Opaque(Code("[...]")),), kwargs, node=stacked), ctx)
