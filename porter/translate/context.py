"""What a rule receives: the recognised pandas call and a context to answer with."""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass, field, replace
import re
from typing import Any

import libcst as cst

from porter.analysis.schema import FileSchema, merged
from porter.emit import code as emit
from porter.emit.code import Code
from porter.model import MappingEntry
from porter.translate.values import (
    MISSING, NOT_NULLABLE, Accessor, Column, Frame, Grouped, Opaque, PandasValue, Scalar, Value,
    fresh_token,
)


class Unsupported(Exception):
    """Raised by a rule (through ctx.todo) when it cannot port this use faithfully."""

    def __init__(self, reason: str) -> None:
        super().__init__(reason)
        self.reason = reason


class NotLiteral(Unsupported):
    pass


@dataclass(frozen=True)
class PandasCall:
    """A call (or attribute, or subscript) on a pandas value, with its evaluated arguments."""

    receiver: Value | None
    name: str
    args: tuple[Value, ...] = ()
    kwargs: dict[str, Value] = field(default_factory=dict)
    node: cst.CSTNode | None = None

    def has(self, name: str, position: int | None = None) -> bool:
        return name in self.kwargs or (position is not None and position < len(self.args))

    def first_node(self, name: str) -> cst.BaseExpression | None:
        """The expression written as the first argument, or as `name=`, when this is a call."""
        if not isinstance(self.node, cst.Call):
            return None
        for arg in self.node.args:
            if arg.keyword is None and not arg.star or \
                    arg.keyword is not None and arg.keyword.value == name:
                return arg.value
        return None

    def arg(self, name: str, position: int | None = None, default: Any = MISSING) -> Value | Any:
        if name in self.kwargs:
            return self.kwargs[name]
        if position is not None and position < len(self.args):
            return self.args[position]
        if default is MISSING:
            raise Unsupported(f"`{name}` is required here")
        return default

    def const(self, name: str, position: int | None = None, default: Any = MISSING,
              kinds: tuple[type, ...] | None = None) -> Any:
        """The argument's literal value; a TODO when it is computed at run time, or when it is
        not one of `kinds` (the forms the rule reads: pandas may accept others)."""
        if not self.has(name, position):
            if default is MISSING:
                raise Unsupported(f"`{name}` is required here")
            return default
        value = self.arg(name, position)
        if not (isinstance(value, Opaque) and value.is_const):
            raise NotLiteral(f"`{name}` is computed at run time; porter needs it written out")
        const = value.const
        if kinds is not None and const is not default and not _of_kind(const, kinds):
            raise Unsupported(f"`{name}`={const!r}: porter reads {_kinds(kinds)} here")
        return const

    def const_values(self, name: str, position: int | None = None,
                     kinds: tuple[type, ...] = (str, int, float)) -> list[Any] | None:
        """An option pandas takes as one value or as a list of them (`na_values=-1`,
        `na_values=["-", "n/a"]`), as a list; None when absent. A dict (the per-column form) or
        a value of another kind is a TODO, never a crash."""
        if not self.has(name, position):
            return None
        value = self.const(name, position)
        if isinstance(value, dict):
            raise Unsupported(f"`{name}` given per column (a dict) is not handled by porter yet")
        values = list(value) if isinstance(value, (list, tuple, set, frozenset)) else [value]
        if not all(_of_kind(v, kinds) for v in values):
            raise Unsupported(f"`{name}`={value!r}: porter reads {_kinds(kinds)} here")
        return values

    def unknown_args(self, *known: str, positional: int = 0) -> list[str]:
        """Arguments a rule does not handle (keyword names, or `#n` for positions)."""
        extra = [k for k in self.kwargs if k not in known]
        extra += [f"#{i + 1}" for i in range(positional, len(self.args))]
        return extra


def _of_kind(value: Any, kinds: tuple[type, ...]) -> bool:
    """isinstance, except that True/False is not a number here (only `bool` admits it)."""
    return bool in kinds if isinstance(value, bool) else isinstance(value, kinds)


def _kinds(kinds: tuple[type, ...]) -> str:
    return " or ".join({str: "text", int: "whole numbers", float: "numbers", bool: "True/False",
                        list: "a list", tuple: "a tuple", dict: "a dict"}.get(k, k.__name__)
                       for k in kinds)


@dataclass
class RuleContext:
    key: str
    entry: MappingEntry
    confidence: float
    reasons: list[str] = field(default_factory=list)
    handover: bool = False
    schema_lookup: Any = None  # (reader, path, options) -> {column: dtype} from --data, or None
    evaluate: Any = None  # (node, {name: value}) -> Value, for lambda bodies
    todo_note: str | None = None  # the rewrite is written, but the site still needs a person
    datetimes_possible: bool = True  # the script makes or reads datetimes somewhere
    nullable_ints_possible: bool = True  # the script may make pandas' nullable integers
    durations_possible: bool = True  # the script may make durations porter has no type for
    lists_possible: bool = True  # the script may make columns of lists (str.split)
    infinities_possible: bool = True  # the script divides or writes an infinity
    inside_from_pandas: bool = False  # the call is the argument of pl.from_pandas (porter's output)
    shown: bool = False  # the value is only printed or displayed (print(...), a bare cell value)
    printed: bool = False  # the value is an argument of print(): only its str() is seen
    function_def: Any = None  # name -> the script's own FunctionDef (defined once), or None
    python_module: Any = None  # the script as Python's ast.Module (row_functions), or None
    runs_function: bool = False  # the rewrite still calls the script's function it was given
    stacked_rows: tuple[int, ...] = ()  # the result's rows are these frames' rows, one after another
    # the rule evaluated its arguments' code again itself (pd.concat of a comprehension): the
    # sites of their first evaluation (a frame in code porter did not read, handed over) go
    args_evaluated_again: bool = False

    def needs_review(self, reason: str) -> None:
        """Keep the rewrite but report the site as a TODO (for example a hand-back from pandas)."""
        self.todo_note = reason

    def input_schema(self, reader: str, path: object, options: dict[str, Any]) -> dict[str, str] | None:
        """Column types of an input file, when the user gave --data (no data is loaded). `path`
        may be several files (a function's calls pass each): their schema when they all agree."""
        if self.schema_lookup is None:
            return None
        if isinstance(path, tuple) and path and all(isinstance(p, str) for p in path):
            found = [self.schema_lookup(reader, p, options) for p in path]
            if not all(isinstance(f, FileSchema) for f in found):
                return None
            return merged(found)  # type: ignore[arg-type]
        if not isinstance(path, str):
            return None
        return self.schema_lookup(reader, path, options)

    # -- deciding -----------------------------------------------------------------------------
    def lower(self, reason: str, to: float) -> None:
        """Lower this site's confidence, saying why."""
        if to < self.confidence:
            self.confidence = to
        if reason not in self.reasons:
            self.reasons.append(reason)

    def todo(self, reason: str) -> Unsupported:
        return Unsupported(reason)

    def reject_unknown(self, call: PandasCall, *known: str, positional: int = 0) -> None:
        extra = call.unknown_args(*known, positional=positional)
        if extra:
            raise Unsupported(f"argument {', '.join(extra)} is not handled by porter yet")

    # -- values -------------------------------------------------------------------------------
    def expr(self, value: Value, frame: Frame) -> Code:
        """`value` as a Polars expression evaluated inside `frame`."""
        return expr_in(value, frame)

    def bool_expr(self, value: Value, frame: Frame) -> Code:
        """A boolean column used as a value: pandas has False where the comparison met a
        missing value, Polars has null."""
        code = expr_in(value, frame)
        if isinstance(value, Column) and value.null_is_false:
            return code.method("fill_null", False)
        return code


# what a TODO says where pandas makes an object column of values of two kinds (text filled
# into numbers): a Series so made has no Polars type, so the frame it goes into stays pandas
MIXED_COLUMN = "makes a mixed column in pandas"


def expr_in(value: Value, frame: Frame) -> Code:
    if isinstance(value, Column):
        check_same_rows(value, frame)
        return value.code
    if isinstance(value, Scalar):
        if value.agg is not None and value.agg.frame.rows == frame.rows:
            return value.agg.code
        if value.expr is not None:
            return value.expr
        if value.pytype == "float":
            # a reduction porter made NaN as pandas has it (the mean of no values): NaN is
            # missing in pandas, so null inside Polars expressions
            return emit.pl("lit", value.code).method("fill_nan", None)
        if value.pytype == "text":
            # pandas' text value, nan where it is missing (materialize.series_position):
            # Polars compares no text with a float, and missing is null in its expressions
            # (the generator in brackets of its own: laid out over lines, the call's only
            # argument gets a trailing comma, which a bare generator does not allow)
            return emit.atom(f"pl.lit(next((None if v != v else v for v in [{value.code.text}])), "
                             "dtype=pl.String)")
        return value.code
    if isinstance(value, Opaque):
        if value.is_const and value.code.text.isidentifier() and value.code.text not in (
                "True", "False", "None"):
            # a named constant stays named; text is wrapped, or Polars would read a column name
            return emit.pl("lit", value.code) if isinstance(value.const, str) else value.code
        if value.is_const:
            return emit.as_expr(value.const)
        return value.code
    if isinstance(value, PandasValue):
        raise Unsupported("a value computed by pandas is mixed into a Polars expression")
    raise Unsupported(f"a {type(value).__name__.lower()} cannot be used as a column expression here")


def check_same_rows(column: Column, frame: Frame) -> None:
    if column.frame.rows != frame.rows:
        raise Unsupported(
            "the Series comes from another frame (or from before rows were filtered or "
            "reordered): pandas aligns it on the index, which has no expression form"
        )
    for name, version in column.versions:
        if frame.version(name) != version and column.frame.code.text != frame.code.text:
            # a Series kept as a frame of its own (engine.series_of_its_own): its values
            # are those pandas computed before a column it reads was overwritten
            raise Unsupported("the Series was computed before a column it reads was "
                              "overwritten, and pandas keeps the values it had then")
        if frame.version(name) != version:
            raise Unsupported(
                f"column {name!r} was overwritten after this Series was taken from it"
            )
        if frame.columns is not None and name not in frame.columns:
            # a Series kept as a frame of its own (the same rows) met a column of the frame
            # it came from: they are two frames to Polars
            raise Unsupported(f"the Series reads column {name!r}, which this frame does not "
                              "have (pandas aligns the two on the index)")


def derive(frame: Frame, code: Code, *, same_rows: bool, **changes: Any) -> Frame:
    """A frame computed from `frame`: same rows (new columns only) or new rows."""
    if not same_rows:
        changes.setdefault("rows", fresh_token())
        changes.setdefault("labels_intact", False)
    if "dtypes" in changes:
        # the step says what the columns are now: numbers whose type the data decided stay
        # so only where the step keeps them as they were (select_columns)
        changes.setdefault("numbers", ())
    return replace(frame, code=code, sites=(), **changes)


def labels_kept(frame: Frame, result: Frame, *, reordered: bool = False) -> Frame:
    """`result`, some of `frame`'s rows with their labels (a filter) or all of them in
    another order (reordered: a sort), marked as having distinct labels when `frame`'s are
    (Frame.distinct_labels, Frame.reorders)."""
    if not frame.labels_distinct() or result.labels_intact or result.rows == frame.rows:
        return result
    return replace(result, distinct_labels=(result.rows, ()),
                   reorders=(result.rows, frame.rows) if reordered else None)


def with_column_updates(frame: Frame, code: Code, updates: dict[str, str | None]) -> Frame:
    """`frame` after with_columns: `updates` maps each written column to its dtype."""
    columns = frame.columns
    if columns is not None:
        columns = columns + tuple(c for c in updates if c not in columns)
    dtypes = dict(frame.dtypes)
    versions = dict(frame.versions)
    frame = replace(frame, float_ints=tuple(m for m in frame.float_ints if m[0] not in updates),
                    numbers=tuple(m for m in frame.numbers if m[0] not in updates))
    if frame.nullable_ints is not None:
        # a column written here is one of pandas' nullable integers only if made from one
        # (the rule that knows marks it: set_nullable_ints); in a frame that holds none, it
        # cannot be one
        unsure = bool(frame.nullable_ints or frame.unsure_ints)
        frame = set_nullable_ints(frame, {name: None if unsure else NOT_NULLABLE
                                          for name in updates})
    for name, dtype in updates.items():
        if dtype is None:
            dtypes.pop(name, None)
        else:
            dtypes[name] = dtype
        versions[name] = fresh_token()
    return replace(frame, code=code, sites=(), columns=columns,
                   dtypes=tuple(dtypes.items()), versions=tuple(versions.items()))


def select_columns(frame: Frame, code: Code, names: Sequence[str], *, same_rows: bool = True) -> Frame:
    dtypes = {k: v for k, v in frame.dtypes if k in names}
    result = derive(frame, code, same_rows=same_rows, columns=tuple(names),
                    dtypes=tuple(dtypes.items()),
                    numbers=tuple(m for m in frame.numbers if m[0] in names))
    return replace(result, index=tuple(i for i in frame.index if i in names))


ROW_LABELS = "index"  # the column carrying the row labels a filter or sort left


def with_row_labels(frame: Frame) -> Frame:
    """`frame`, whose row labels are still 0..n-1, with them as a column "index" (Int64, as
    pandas' labels) held as pandas' unnamed index: a filter or sort carries each row's label
    (engine.labels_as_column)."""
    code = frame.code.method("with_row_index", ROW_LABELS).method(
        "with_columns", emit.col(ROW_LABELS).method("cast", emit.atom("pl.Int64")))
    columns = None if frame.columns is None else (ROW_LABELS, *frame.columns)
    return replace(frame, code=code, columns=columns, index=(ROW_LABELS,), index_unnamed=True,
                   dtypes=(*frame.dtypes, (ROW_LABELS, "int")))


def labelled_frame(frame: Frame, key: str | tuple[str, ...]) -> Frame:
    """`frame` after set_index(key) (or read_csv(index_col=key)), for the calls that read it as
    a table labelled by `key` (or by several keys, set_index([...])): the key columns first,
    held as pandas' index (as a groupby's keys are), its labels neither known to be distinct
    nor sorted (grouped_rows unset)."""
    keys = (key,) if isinstance(key, str) else tuple(key)
    code = frame.code
    columns = frame.columns
    if columns is None and not code.text.isidentifier():
        # a name bound to the labelled frame holds the key first already (engine.bind)
        code = code.method("select", *keys, emit.pl("exclude", *keys))
    elif columns is not None and columns[:len(keys)] != keys:
        columns = (*keys, *(c for c in columns if c not in keys))
        code = code.method("select", *columns)
    return replace(frame, code=code, columns=columns, index=keys, index_unnamed=False,
                   labels_intact=False, grouped_rows=None, number_cells=None)


def number_cells(frame: Frame) -> tuple[bool, str | None]:
    """Whether every column of `frame` but its index keys holds numbers (a pivoted table as
    unstack or crosstab made it, nothing done to it since), and their type when porter knows
    it."""
    mark = frame.number_cells
    if mark is None or mark[0] != frame.code.text or frame.columns is not None:
        return False, None
    return True, mark[1]


def row_labels_carried(frame: Frame) -> bool:
    """Whether `frame` holds the row labels a filter or sort left in its column "index"
    (with_row_labels)."""
    return frame.index == (ROW_LABELS,) and frame.index_unnamed and frame.dtype(ROW_LABELS) == "int"


# the porter types a selector of one kind can select (an index column of another known type is
# not among its columns, and is not named)
_SELECTED_TYPES = {"pl.selectors.float()": {"float"}, "pl.selectors.by_dtype(pl.Float64)": {"float"},
                   "pl.selectors.by_dtype(pl.Float32)": {"float"},
                   "pl.selectors.integer()": {"int"}, "pl.selectors.numeric()": {"int", "float"},
                   "pl.selectors.string()": {"str"}, "pl.selectors.boolean()": {"bool"},
                   "pl.selectors.by_dtype(pl.String, pl.Categorical)": {"str", "category"}}


def without_index(selector: Code, frame: Frame) -> Code:
    """A column selector without the columns holding the frame's index (a groupby's keys, row
    labels carried as a column): pandas computes on the columns, never on the index. An index
    column whose known type the selector does not select is left unnamed."""
    kinds = _SELECTED_TYPES.get(selector.text)
    index = [name for name in frame.index
             if kinds is None or frame.dtype(name) is None or frame.dtype(name) in kinds]
    if not index:
        return selector
    return emit.binop(selector, "-", emit.call("pl.selectors.by_name", *index))


def column_of(frame: Frame, name: str, code: Code | None = None) -> Column:
    return Column(
        code if code is not None else emit.col(name),
        frame=frame,
        name=name,
        dtype=frame.dtype(name),
        refs=frozenset({name}),
        versions=((name, frame.version(name)),),
        float_int=dict(frame.float_ints).get(name),
        nullable_int=nullable_mark(frame, name),
        number=holds_numbers(frame, name),
    )


def holds_numbers(frame: Frame, name: str) -> bool:
    """Column `name` of `frame` is of a type porter does not know but holds numbers, int64 or
    float64 as the data decides, its Polars type pandas' own (Frame.numbers): marked so, and
    not written since."""
    return frame.dtype(name) is None and (name, frame.version(name)) in frame.numbers


def mark_numbers(frame: Frame, names: Sequence[str]) -> Frame:
    """`frame` with the columns `names`, as they are now, marked as holding numbers whose type
    the data decides (Frame.numbers)."""
    kept = tuple(m for m in frame.numbers if m[0] not in names)
    return replace(frame, numbers=kept + tuple((n, frame.version(n)) for n in names))


# -- pandas' nullable integer columns ---------------------------------------------------------
#
# astype("Int64"), dtype={"c": "Int64"} and dt.isocalendar() make columns pandas holds as its
# nullable integers: with a missing value they are written and printed as ints (2024, <NA>),
# where a plain int column is float64 (2024.0, nan). Polars has one kind of integer, so porter
# marks them per column (Frame.nullable_ints, Column.nullable_int): to_csv writes them as ints,
# a hand-over to pandas gives them back their dtype. Where the mark is unknown (a frame a step
# built without following them, or back from pandas) the rules say so.

# pandas' dtype of each part of dt.isocalendar()
ISOCALENDAR_DTYPES = {"series.dt.isocalendar.year": "Int32", "series.dt.isocalendar.week": "UInt32",
                      "series.dt.isocalendar.day": "UInt32"}
# steps whose result from a nullable integer column may be of any pandas type
# group windows whose result has the type of the column they run over (pandas 3.1)
_GROUP_WINDOWS_KEEPING_TYPE = frozenset({
    "groupby.shift", "groupby.cumsum", "groupby.cumprod", "groupby.cummax", "groupby.cummin",
    "groupby.diff", "groupby.ffill", "groupby.bfill"})
_ANY_TYPE = frozenset({"series.apply", "series.map", "series.transform", "series.pipe",
                       "series.agg", "series.aggregate", "series.combine"})


def nullable_mark(frame: Frame, name: str) -> str | None:
    """pandas' nullable integer dtype of column `name` of `frame`, NOT_NULLABLE when it is not
    one, None when porter does not know."""
    if frame.nullable_ints is None or name in frame.unsure_ints:
        return None
    return dict(frame.nullable_ints).get(name, NOT_NULLABLE)


def set_nullable_ints(frame: Frame, marks: dict[str, str | None]) -> Frame:
    """`frame` with the columns of `marks` marked: a dtype name (one of pandas' nullable
    integers), NOT_NULLABLE, or None (not known). A frame whose marks are unknown stays so."""
    if frame.nullable_ints is None:
        return frame
    nullable = tuple(m for m in frame.nullable_ints if m[0] not in marks) + tuple(
        (n, m) for n, m in marks.items() if m)
    unsure = tuple(n for n in frame.unsure_ints if n not in marks) + tuple(
        n for n, m in marks.items() if m is None)
    return replace(frame, nullable_ints=nullable, unsure_ints=unsure)


def nullable_columns(frame: Frame) -> tuple[list[str], list[str]] | None:
    """The columns of `frame` pandas holds as nullable integers, and those porter does not know
    to be or not (present in the frame, where its columns are known); None when porter knows
    nothing of them."""
    if frame.nullable_ints is None:
        return None
    present = (lambda n: True) if frame.columns is None else (lambda n: n in frame.columns)
    return ([n for n, _ in frame.nullable_ints if present(n)],
            [n for n in frame.unsure_ints if present(n)])


def _nullable_result(key: str, call: PandasCall, result: Value) -> Value:
    """A column a rule computed, marked from the columns it was computed from where the rule
    did not mark it: pandas' nullable integers stay so through arithmetic, fills, filters
    (Int64 + 1 is Int64); a result that is not an integer is not one."""
    if not isinstance(result, Column) or result.nullable_int is not None or result.element:
        return result
    if key in ISOCALENDAR_DTYPES:
        return replace(result, nullable_int=ISOCALENDAR_DTYPES[key])
    if result.dtype not in ("int", None):
        return replace(result, nullable_int=NOT_NULLABLE)
    grouped = call.receiver
    if key in _GROUP_WINDOWS_KEEPING_TYPE and isinstance(grouped, Grouped) and grouped.single \
            and grouped.selection is not None and len(grouped.selection) == 1:
        # a group window of one column (df.groupby("k")["n"].shift()): pandas keeps the
        # column's type, so Int64 stays Int64 (<NA> where a row has no value before it)
        mark = nullable_mark(grouped.frame, grouped.selection[0])
        if mark in ("boolean", "string", "Float64", "Float32"):
            mark = NOT_NULLABLE
        return result if mark is None else replace(result, nullable_int=mark)
    given = [call.receiver, *call.args, *call.kwargs.values()]
    inputs = [v.column if isinstance(v, Accessor) else v for v in given]
    # pandas' other nullable types (boolean, string, Float64: rules/ops.py) make no integers
    marks = [NOT_NULLABLE if v.nullable_int in ("boolean", "string", "Float64", "Float32")
             else v.nullable_int for v in inputs if isinstance(v, Column)]
    if not marks:
        return result
    nullable = next((m for m in marks if m), None)
    if nullable is not None:
        return result if key in _ANY_TYPE else replace(result, nullable_int=nullable)
    if all(m == NOT_NULLABLE for m in marks):
        return replace(result, nullable_int=NOT_NULLABLE)
    return result


# -- integer columns pandas holds as float64 when a value went missing --------------------------
#
# Whether pandas turned an int column float64 can depend on the data (a merge that left a row
# unmatched, where() without other, dt.year of NaT): a lazy plan cannot pick its type by value,
# so Polars keeps Int64 with nulls and porter decides the text at run time from those nulls
# (PANDAS_CSV_INTS, astype(str), printing), which is what pandas shows while they remain. A
# step that removes them removes the evidence: there porter lowers the site's confidence,
# saying so, and the mark goes.

# steps that fill the missing values of a column or frame (the rows stay)
_FILLS = frozenset({"series.fillna", "frame.fillna", "series.ffill", "series.bfill",
                    "frame.ffill", "frame.bfill", "series.combine_first", "series.interpolate"})
# reductions whose result is a number of the column's type (pandas' is a float)
_REDUCTIONS = frozenset({"series.sum", "series.min", "series.max", "series.prod",
                         "series.median", "series.cumsum", "series.cummax", "series.cummin"})
# steps that give a frame other rows but keep every row
_KEEP_ROWS = frozenset({"frame.sort_values", "frame.sort_index", "frame.reset_index",
                        "frame.copy"})


def float_int_reason(names: Sequence[str], why: str) -> str:
    listed = ", ".join(f"`{n}`" for n in names)
    return (f"pandas holds {listed} as float64 when {why}; once this step fills or drops the "
            "missing values, pandas still writes 3.0 where this writes 3")


def lost_float_ints(key: str, call: PandasCall, result: Value, ctx: RuleContext) -> Value:
    """`result` of the rule for `key`, with the marks of int columns pandas holds as float64
    (_float_int_result) and of pandas' nullable integers (_nullable_result) carried on."""
    return _nullable_result(key, call, _float_int_result(key, call, result, ctx))


def _float_int_result(key: str, call: PandasCall, result: Value, ctx: RuleContext) -> Value:
    """`result` of the rule for `key`: where the call removes the missing values that made
    pandas hold a marked int column as float64, the site's confidence is lowered and the mark
    cleared; an expression of a marked column that keeps its values (arithmetic) keeps it."""
    receiver = call.receiver
    if isinstance(receiver, Column) and receiver.float_int is not None:
        name = receiver.name or "the column"
        if key in _FILLS and isinstance(result, Column) and result.dtype in ("int", None) \
                and result.frame.rows == receiver.frame.rows:
            # a fill is the script saying values went missing: pandas' column was float64 then,
            # and stays float once filled (3.0). Made Float64 here, it differs only where the
            # step before left nothing missing (pandas keeps int64 there: 3)
            ctx.lower(f"pandas holds `{name}` as float64 when {receiver.float_int}, and filled it "
                      "stays float: porter makes it Float64, which writes 3.0 where pandas "
                      "writes 3 if nothing was missing", 0.95)
            return replace(result, code=result.code.method("cast", emit.atom("pl.Float64")),
                           dtype="float", float_int=None)
        if key in _FILLS or key in _REDUCTIONS \
                or isinstance(result, Column) and result.frame.rows != receiver.frame.rows:
            ctx.lower(float_int_reason([name], receiver.float_int), 0.9)
            return replace(result, float_int=None) if isinstance(result, Column) else result
        if isinstance(result, Column) and result.float_int is None and result.dtype in ("int", None) \
                and result.frame.rows == receiver.frame.rows:
            return replace(result, float_int=receiver.float_int)
        return result
    frame = receiver if isinstance(receiver, Frame) else \
        receiver.frame if isinstance(receiver, Grouped) else None
    if frame is None or not frame.float_ints or not isinstance(result, Frame) \
            or not result.float_ints or key in _KEEP_ROWS:
        return result
    if key in _FILLS or result.rows != frame.rows or isinstance(receiver, Grouped):
        # the marks the frame had (not those the step makes: a merge marks its own)
        marks = [(n, why) for n, why in result.float_ints if (n, why) in frame.float_ints
                 and (result.columns is None or n in result.columns)]
        for why in dict.fromkeys(why for _, why in marks):
            ctx.lower(float_int_reason([n for n, w in marks if w == why], why), 0.9)
        return replace(result, float_ints=tuple(m for m in result.float_ints if m not in marks))
    return result


def floats_where_missing(code: Code, names: Sequence[str], integers_only: bool = False) -> Code:
    """The plan `code` computed, each int column of `names` made Float64 where it holds a
    missing value: pandas' type known once the plan has run (a join that left a value missing,
    a date part of a missing date: float64; int64 where none is). `integers_only`: a column
    named may be of another type (left as it is)."""
    test = "t[c].dtype.is_integer() and t[c].has_nulls()" if integers_only else "t[c].has_nulls()"
    return code.method("collect").method("pipe", emit.atom(
        f"lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in {emit.render(tuple(names))} "
        f"if {test}])")).method("lazy")


def mark_float_ints(frame: Frame, names: Sequence[str], why: str) -> Frame:
    """`frame` with the int columns `names` marked as float64 in pandas when `why`."""
    kept = tuple(m for m in frame.float_ints if m[0] not in names)
    return replace(frame, float_ints=kept + tuple((n, why) for n in names))


def derived_column(base: Column, code: Code, *, dtype: str | None = None,
                   null_is_false: bool = False, name: Any = MISSING,
                   others: Sequence[Value] = ()) -> Column:
    """A column computed from `base` (and `others` of the same frame)."""
    refs = set(base.refs)
    versions = dict(base.versions)
    for other in others:
        if isinstance(other, Column):
            refs |= other.refs
            versions.update(other.versions)
    return Column(
        code,
        frame=base.frame,
        name=base.name if name is MISSING else name,
        dtype=dtype,
        null_is_false=null_is_false,
        refs=frozenset(refs),
        versions=tuple(versions.items()),
        element=base.element,
        index_values=base.index_values,  # idx.str.upper() of an Index is an Index
    )


PYTHON_DTYPES = {bool: "bool", int: "int", float: "float", str: "str"}


def column_names(value: Any, what: str = "columns") -> list[str]:
    """One column name or a list of them, as written in the call; anything else (labels that
    are numbers, arrays, functions) is a TODO."""
    names = [value] if isinstance(value, str) else value
    if not isinstance(names, (list, tuple)) or not names or not all(isinstance(n, str) for n in names):
        raise Unsupported(f"{what} must name columns by their (text) names")
    return list(names)


def value_dtype(value: Value) -> str | None:
    """porter's dtype name of a column or a literal, when known."""
    if isinstance(value, Column):
        return value.dtype
    if isinstance(value, Opaque) and value.is_const:
        # (a function's text parameter standing for its calls' texts is text: emit.ParamText)
        return PYTHON_DTYPES.get(str if isinstance(value.const, emit.ParamText) else type(value.const))
    if isinstance(value, Scalar) and value.agg is not None and value.agg.dtype in ("duration",
                                                                                 "datetime"):
        return value.agg.dtype  # a sum of durations, the min of dates (arithmetic takes them)
    if isinstance(value, Scalar) and value.pytype == "datetime" and value.expr is not None:
        return "datetime"  # a date written in the script (pd.Timestamp("2024-01-01"))
    return None


def accessor_column(call: PandasCall) -> Column:
    """The column under `s.str` / `s.dt` for a rule of the accessor."""
    from porter.translate.values import Accessor
    accessor = call.receiver
    assert isinstance(accessor, Accessor)
    return accessor.column


def grouping_code(grouped: Grouped) -> Code:
    """The LazyGroupBy for a pandas groupby.

    pandas drops rows whose key is missing (dropna=True), so they are dropped before grouping;
    with sort=False pandas keeps keys in order of first appearance (maintain_order=True).
    """
    if grouped.prepared:
        return grouped.code
    frame = grouped.frame.code
    if grouped.dropna:
        frame = frame.method("drop_nulls", emit.names_arg(grouped.keys))
    options = {} if grouped.sort else {"maintain_order": True}
    return frame.method("group_by", emit.names_arg(grouped.keys), **options)


# expressions whose value on a row depends on other rows (ranks, running and window values,
# reductions, sorts, positions): re-evaluated on fewer or reordered rows they change value
_READS_OTHER_ROWS = re.compile(
    r"\.(rank|cum_\w+|shift|diff|pct_change|rolling\w*|ewm_\w+|over|mean|sum|min|max|std|var|"
    r"median|quantile|count|len|n_unique|first|last|head|tail|sort\w*|reverse|forward_fill|"
    r"backward_fill|interpolate\w*|is_duplicated|is_unique|is_first_distinct|is_last_distinct|"
    r"mode|map_batches|gather\w*|get|implode|arg_\w+|search_sorted|cumulative_eval|unique\w*|"
    r"drop_nulls|drop_nans|filter|slice|shuffle|sample|top_k\w*|bottom_k\w*|value_counts|"
    r"null_count|entropy|skew|kurtosis|product|any|all|item|peak_\w+|rle\w*)\("
    r"|\bpl\.(len|int_range|sum|mean|min|max|count|first|last|corr|cov|cum_\w+|arg_\w+|"
    r"map_batches|fold|reduce|cum_fold|cum_reduce)\("
    r"|(?<![.\w])(?!pl\b|float\b|int\b|str\b)[a-z_]\w*\(")  # a helper of porter's: any rows


VALUE_COLUMN = "_porter_value"


def values_fixed(column: Column) -> Column:
    """`column` ready for a row operation on its frame (a filter, head, sort, slice) after
    which it is read: an expression that reads other rows (a rank, a running sum, a mean) is
    computed on the frame as it is, into a column of its own, and read from there; re-evaluated
    on the rows left, it would change (a rank among the rows kept, not among all). A column
    read as it is, or computed from its own row alone, is returned as it is."""
    text = column.code.text
    # (an expression bound to a name, `r = pl.col("v").rank()`, is read through its name: it
    # may be anything)
    if not (_READS_OTHER_ROWS.search(text) or re.search(r"(?<![.\w\"'])(?!(pl|True|False|None)\b)[A-Za-z_]\w*"
                                                        r"(?![\w(\"'])", text)):
        return column
    frame = column.frame
    code = frame.code.method("with_columns", column.code.method("alias", VALUE_COLUMN))
    fixed = with_column_updates(frame, code, {VALUE_COLUMN: column.dtype})
    return replace(column, code=emit.col(VALUE_COLUMN), frame=fixed,
                   refs=frozenset({VALUE_COLUMN}),
                   versions=((VALUE_COLUMN, fixed.version(VALUE_COLUMN)),))
