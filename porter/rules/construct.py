"""Frames and Series written as Python values: `pd.DataFrame(...)`, `pd.Series(...)`.

pandas types every column of a literal from all of its values; Polars infers a type per column
too, but not the same one: an integer column with a missing value is float64 in pandas and Int64
in Polars, `[True, None]` and `["a", 1]` are object columns in pandas and have no Polars type,
lists of rows are rows in pandas and columns in Polars. Each literal is therefore typed here as
pandas types it, and written with the Polars types that keep pandas' values; a column pandas
keeps as `object` is a TODO.
"""

from __future__ import annotations

import ast

from dataclasses import dataclass, replace
import math
from typing import Any

import libcst as cst

from porter.emit import code as emit
from porter.emit.code import Code
from porter.model import SiteDraft
from porter.rules import rule
from porter.rules.legacy import modern_offset
from porter.translate.context import MIXED_COLUMN, ROW_LABELS, PandasCall, RuleContext
from porter.translate import handover
from porter.translate.values import Column, Frame, Opaque, PandasValue, Scalar, Value

POLARS = {"int": "pl.Int64", "float": "pl.Float64", "str": "pl.String", "bool": "pl.Boolean"}


def _missing(value: Any) -> bool:
    return value is None or isinstance(value, float) and math.isnan(value)


def column_type(name: str, values: list[Any], ctx: RuleContext) -> tuple[str | None, str | None]:
    """(porter's dtype, the Polars dtype to write when Polars would infer another) of a literal
    column, as pandas types it; a TODO for an object column."""
    present = [v for v in values if not _missing(v)]
    kinds = {type(v) for v in present}
    if not values:
        return "float", "pl.Float64"  # pandas: an empty column is float64 (Polars: Null)
    if not present:
        if all(v is None for v in values):
            raise ctx.todo(f"column {name!r} holds only None: an object column in pandas, "
                           "a Null column in Polars")
        return "float", "pl.Float64"
    missing = len(present) < len(values)
    if kinds == {bool}:
        if missing:
            raise ctx.todo(f"column {name!r} mixes True/False with missing values: an object "
                           "column in pandas")
        return "bool", None
    if kinds == {int}:
        # pandas stores an integer column with a missing value as float64
        return ("float", "pl.Float64") if missing else ("int", None)
    if kinds <= {int, float}:
        return "float", "pl.Float64" if int in kinds else None
    if kinds == {str}:
        return "str", None
    if kinds <= {list, tuple}:
        items = [item for v in present for item in v]
        inner, _ = column_type(name, items, ctx) if items else (None, None)
        if inner is None:
            raise ctx.todo(f"column {name!r} holds empty lists only: no element type to give")
        ctx.lower(f"column {name!r} holds lists: an object column in pandas, List({inner}) in "
                  "Polars (the same values; explode and len work alike)", 0.9)
        return None, f"pl.List({POLARS[inner]})"
    spelled = ", ".join(sorted(k.__name__ for k in kinds))
    raise ctx.todo(f"column {name!r} mixes {spelled}: pandas keeps an object column, which "
                   "has no Polars type (cast the values first)")


def _text_labels(labels: list[Any], ctx: RuleContext) -> list[str]:
    if not all(isinstance(label, str) for label in labels):
        raise ctx.todo("column labels that are not text have no Polars form")
    if len(set(labels)) != len(labels):
        raise ctx.todo("a column label given twice")
    return labels


def _columns_from_rows(rows: list[Any], labels: list[str] | None,
                       ctx: RuleContext) -> tuple[dict[str, list[Any]], bool]:
    """Rows (lists or tuples) or scalars as columns; True when the rows were lists. Without
    labels, the columns are pandas' 0, 1, … written as text."""
    if all(isinstance(r, (list, tuple)) for r in rows):
        widths = {len(r) for r in rows}
        if len(widths) > 1:
            raise ctx.todo("rows of different lengths (pandas pads them with missing values)")
        width = widths.pop() if widths else len(labels or [])
        as_rows = True
        table = [list(col) for col in zip(*rows)] if rows else [[] for _ in range(width)]
    elif not any(isinstance(r, (list, tuple, dict)) for r in rows):
        width, as_rows, table = 1, False, [list(rows)]
    else:
        raise ctx.todo("a list mixing rows and single values")
    if labels is None:
        ctx.lower("pandas names these columns 0, 1, …; Polars names them \"0\", \"1\", … (text)", 0.9)
        labels = [str(i) for i in range(width)]
    if len(labels) != width:
        raise ctx.todo(f"{len(labels)} column labels for rows of {width} values")
    return dict(zip(labels, table)), as_rows


def _columns_from_records(records: list[dict[Any, Any]], ctx: RuleContext) -> dict[str, list[Any]]:
    labels: list[Any] = []
    for record in records:
        labels += [k for k in record if k not in labels]
    _text_labels(labels, ctx)
    return {label: [record.get(label) for record in records] for label in labels}


def literal_frame(call: PandasCall, ctx: RuleContext, data: Any) -> Frame:
    ranges: dict[str, Code] = {}  # a date range's column -> its code (the name it is bound to)
    single: set[str] = set()  # the columns given as one value, beside a date range
    labels = call.const("columns", 1, None, kinds=(list, tuple))
    if labels is not None:
        labels = _text_labels(list(labels), ctx)
    as_rows = False
    number_labels: tuple[str, ...] = ()
    if isinstance(data, dict):
        _text_labels(list(data), ctx)
        lengths = {len(v) if isinstance(v, (list, tuple)) else v.size
                   for v in data.values() if isinstance(v, (list, tuple, DateRange))}
        if None in lengths:  # a range whose ends come from the data: its length is not known
            lengths.discard(None)
            if lengths:
                raise ctx.todo("a date range whose length is known only at run time beside "
                               "columns of values (pandas raises unless the lengths agree)")
            lengths = {1}  # (the single values beside it are broadcast)
        if len(lengths) > 1:
            raise ctx.todo("columns of different lengths (pandas raises)")
        if not lengths:
            raise ctx.todo("only single values: pandas needs an index to broadcast them")
        if any(isinstance(v, (dict, set)) for v in data.values()):
            raise ctx.todo("a column given as a dict or set")
        size = lengths.pop()
        for k, v in data.items():
            if isinstance(v, DateRange):
                ranges[k] = _named_range(call, k) or v.code
        if ranges:  # one value beside pl.datetime_range: Polars broadcasts it, as pandas does
            single = {k for k, v in data.items() if not isinstance(v, (list, tuple, DateRange))}
        columns = {k: list(v) if isinstance(v, (list, tuple)) else v if isinstance(v, DateRange)
                   else [v] * size for k, v in data.items()}
        if labels is not None:
            absent = [c for c in labels if c not in columns]
            if absent:
                raise ctx.todo(f"columns {absent} are not in the data (pandas makes them all missing)")
            columns = {c: columns[c] for c in labels}
    elif isinstance(data, (list, tuple)) and data and all(isinstance(r, dict) for r in data):
        columns = _columns_from_records(list(data), ctx)
        if labels is not None:
            absent = [c for c in labels if c not in columns]
            if absent:
                raise ctx.todo(f"columns {absent} are not in the records (pandas makes them all missing)")
            columns = {c: columns[c] for c in labels}
    elif isinstance(data, (list, tuple)):
        columns, as_rows = _columns_from_rows(list(data), labels, ctx)
        if labels is None:
            number_labels = tuple(columns)
    else:
        raise ctx.todo("a frame from a single value")
    dtypes: dict[str, str] = {}
    overrides: dict[str, Code] = {}
    for name, values in columns.items():
        if isinstance(values, DateRange):  # pl.datetime_range(...): Datetime("us") as in pandas
            dtypes[name] = values.kind  # (a period range's text: a String column, see PeriodTexts)
            continue
        kind, polars = column_type(name, values, ctx)
        if kind is not None:
            dtypes[name] = kind
        if name in single and kind == "int":
            polars = "pl.Int64"  # Polars would make a single whole number Int32
        if polars is not None:
            overrides[name] = emit.atom(polars)
    options: dict[str, Any] = {}
    if as_rows:
        code_data: Any = [list(r) for r in data]
        options["schema"] = list(columns)
        options["orient"] = "row"
    else:
        code_data = {k: ranges[k] if k in ranges else v[0] if k in single else v
                     for k, v in columns.items()}
    if overrides:
        options["schema_overrides"] = overrides
    if as_rows and len(data) > 100:
        options["infer_schema_length"] = None
    return Frame(emit.pl("LazyFrame", code_data, **options), columns=tuple(columns),
                 dtypes=tuple(dtypes.items()), number_labels=number_labels)


def _named_range(call: PandasCall, key: str) -> Code | None:
    """The name a date range of the frame's dict is read from (`{"day": days}`): the Polars
    Series bound to it, rather than the range written again."""
    data = call.first_node("data")
    if isinstance(data, cst.Dict):
        for element in data.elements:
            if isinstance(element, cst.DictElement) and isinstance(element.value, cst.Name) \
                    and isinstance(element.key, cst.SimpleString) \
                    and element.key.evaluated_value == key:
                return emit.atom(element.value.value)
    return None


@rule("pd.DataFrame")
def data_frame(call: PandasCall, ctx: RuleContext) -> Value:
    """pd.DataFrame(...) -> pl.LazyFrame(...) typed as pandas types the values.

    Handles: a dict of lists (single values broadcast), a list of dicts (columns in order of
    first appearance, missing keys missing), lists of rows or tuples (orient="row", columns=
    or pandas' labels 0..n-1), a list of values (one column); NaN written as a missing value;
    an integer column with a missing value is float, as in pandas; list cells become a List
    column. Data built at run time (numpy arrays, dicts filled in a loop) is built by pandas
    and handed to Polars once.
    Caveats: object columns (mixed text and numbers, True/False with None, None only), labels
    that are not text, index= and dtype= are TODOs.
    """
    ctx.reject_unknown(call, "data", "columns", "copy", "index", "dtype", positional=4)
    if call.has("index", 2) or call.has("dtype", 3):
        raise ctx.todo("index= and dtype= are not handled by porter yet")
    data = call.arg("data", 0, None)
    if data is None:
        raise ctx.todo("an empty DataFrame has no schema to build lazily")
    if isinstance(data, Opaque) and data.is_const:
        frame = literal_frame(call, ctx, data.const)
        # a date range written inside the dict: its site, which the dict's constant does not
        # carry (one bound to a name has its own, where it is bound)
        inline = [v for k, v in data.const.items() if isinstance(v, DateRange)
                  and _named_range(call, k) is None and v.lines != (0, 0)] \
            if isinstance(data.const, dict) else []
        return frame.with_sites(*(SiteDraft(
            v.key, v.key.split(".")[-1].replace("_", "-"), "converted", 1.0,  # date-range
            f"a column of a frame written out: the same {v.what} as pandas, checked when "
            "porter converted the script", *v.lines) for v in inline), *(
            SiteDraft(*v.made_by[:2], "converted", *v.made_by[2:], *v.lines)
            for v in inline if getattr(v, "made_by", None) is not None))
    if isinstance(data, Opaque) and ".to_pandas()" in data.code.text:
        # values porter already handed to pandas (an earlier run's output): as on that run
        raise ctx.todo("building a frame from another pandas object")
    if isinstance(data, Opaque) and data.code.text.isidentifier() \
            and _filled_by_key(ctx.python_module, data.code.text):
        # `res[key] = <a Series>` in a loop: pandas lines the Series up on their labels, which
        # become the frame's index; pl.from_pandas would drop them
        raise ctx.todo("a frame from a dict filled key by key: pandas lines its Series up on "
                       "their labels (the index), which Polars would drop")
    if isinstance(data, Opaque) and data.code.text.isidentifier() \
            and _rows_of_objects(ctx.python_module, data.code.text):
        # rows appended in a loop with a list in a cell, or a value of one type or another
        # (`top if top > 20 else "low"`): pandas keeps such a column as Python objects, which
        # pl.from_pandas refuses (mixed types) or makes a List column no CSV writer takes and
        # whose elements pandas writes otherwise (np.int64(3), Timestamp(...))
        raise ctx.todo(f"rows holding lists, or values of several types: pandas {MIXED_COLUMN} "
                       "(Python objects), which has no Polars type; the frame stays pandas")
    if isinstance(data, Opaque):
        # the shape is only known at run time (a 2-D array is rows, a dict is columns):
        # pandas builds the frame exactly as before, Polars takes it over once
        ctx.lower("the data is only known at run time: pandas builds the frame, then it is "
                  "handed to Polars (pl.from_pandas); number column labels become text", 0.9)
        if ctx.inside_from_pandas:  # porter's own hand-over, met again: written as it was
            ctx.handover = True
            return PandasValue(_rewritten_call("pd.DataFrame", call, ctx))
        # the values inside as porter computes them (`df["x"].max()` of a LazyFrame `df` is
        # its select ... item()), never the pandas code as written
        return Frame(emit.pl("from_pandas", _rewritten_call("pd.DataFrame", call, ctx)).method("lazy"))
    raise ctx.todo("building a frame from another pandas object")


def _rewritten_call(func: str, call: PandasCall, ctx: RuleContext) -> Code:
    """`func(...)` with each argument as porter rewrote it: aggregates and sizes of the
    script's frames (now LazyFrames) computed the Polars way, pandas values handed over."""
    def text(value: Value) -> Code:
        if isinstance(value, (Frame, Column)):
            return handover.to_pandas(value)
        if isinstance(value, (Opaque, Scalar, PandasValue)):
            code = value.code
            if "\n" in code.text:  # laid out over several lines as written: one line
                try:
                    code = Code(ast.unparse(ast.parse(code.text.strip(), mode="eval")))
                except SyntaxError:
                    raise ctx.todo("a frame from data built at run time") from None
            return code
        raise ctx.todo(f"an argument porter cannot hand over: {value.code.text}")
    return emit.call(func, *(text(a) for a in call.args),
                     **{k: text(v) for k, v in call.kwargs.items()})


_NESTED_CALLS = frozenset({"list", "sorted", "tuple", "set", "dict"})
_NESTED_METHODS = frozenset({"tolist", "to_list", "unique", "to_numpy", "values", "to_dict",
                             "split"})


def _object_cell(node: ast.expr) -> bool:
    """Whether a cell value written in a row may be a Python object pandas keeps as it is: a
    list (tuple, set, dict), or one of two kinds (`a if c else "text"`)."""
    if isinstance(node, (ast.List, ast.ListComp, ast.Tuple, ast.Set, ast.SetComp, ast.Dict,
                         ast.DictComp)):
        return True
    if isinstance(node, ast.Call):
        func = node.func
        if isinstance(func, ast.Name) and func.id in _NESTED_CALLS:
            return True
        return isinstance(func, ast.Attribute) and func.attr in _NESTED_METHODS
    if isinstance(node, ast.Attribute):
        return node.attr == "values"
    if isinstance(node, ast.IfExp):
        texts = [isinstance(b, ast.Constant) and isinstance(b.value, str) or isinstance(b, ast.JoinedStr)
                 for b in (node.body, node.orelse)]
        nones = [isinstance(b, ast.Constant) and b.value is None for b in (node.body, node.orelse)]
        return texts[0] != texts[1] and not any(nones) or _object_cell(node.body) \
            or _object_cell(node.orelse)
    return False


def _rows_of_objects(module: object, name: str) -> bool:
    """Whether the script appends rows to the list `name` (`name.append({...})` or a tuple or
    list of values) with a cell that may be a Python object pandas keeps as it is
    (_object_cell)."""
    if not isinstance(module, ast.Module):
        return False
    for node in ast.walk(module):
        if not (isinstance(node, ast.Call) and isinstance(node.func, ast.Attribute)
                and node.func.attr == "append" and isinstance(node.func.value, ast.Name)
                and node.func.value.id == name and len(node.args) == 1):
            continue
        row = node.args[0]
        cells = row.values if isinstance(row, ast.Dict) else row.elts \
            if isinstance(row, (ast.Tuple, ast.List)) else []
        if any(cell is not None and _object_cell(cell) for cell in cells):
            return True
    return False


def _filled_by_key(module: object, name: str) -> bool:
    """Whether the script assigns into `name` by key (`name[k] = ...`, other than a list
    written out) or updates it, so it may hold pandas Series whose labels pandas would line up."""
    if not isinstance(module, ast.Module):
        return True  # not known: as if it might
    for node in ast.walk(module):
        if isinstance(node, ast.Assign) and any(
                isinstance(t, ast.Subscript) and isinstance(t.value, ast.Name) and t.value.id == name
                for t in node.targets) and not isinstance(
                    node.value, (ast.List, ast.Tuple, ast.Constant, ast.ListComp)):
            return True  # a value that may be a Series (a list written out has no labels)
        if isinstance(node, ast.Call) and isinstance(node.func, ast.Attribute) \
                and node.func.attr in ("update", "setdefault") \
                and isinstance(node.func.value, ast.Name) and node.func.value.id == name:
            return True
    return False


@rule("pd.Series")
def series(call: PandasCall, ctx: RuleContext) -> Value:
    """pd.Series([...], name=...) -> a column of a one-column LazyFrame.

    Handles: the values typed as pandas types them (see pd.DataFrame); the name (pandas' None
    is written "0", the label pandas' to_frame gives it).
    A dict or list written out whose values are computed at run time (`{"a": df["a"].sum()}`)
    is built by pandas from the values porter computes (a hand-over: its labels are the keys).
    index= of distinct texts, or a dict written out with text keys: the labels in the key
    column "index", held as the Series' unnamed index.
    Caveats: other index=, dtype= and other values computed at run time are TODOs.
    """
    ctx.reject_unknown(call, "data", "name", "copy", "index", "dtype", positional=3)
    if call.has("dtype", 2):
        raise ctx.todo("dtype= is not handled by porter yet")
    labels = call.const("index", 1, None) if call.has("index", 1) else None
    if call.has("index", 1) and not (
            isinstance(labels, (list, tuple)) and labels and all(isinstance(v, str) for v in labels)
            and len(set(labels)) == len(labels)):
        raise ctx.todo("index= other than distinct texts written out")
    data = call.arg("data", 0, None)
    name = call.const("name", None, None, kinds=(str,))
    if isinstance(data, Opaque) and not data.is_const and not ctx.inside_from_pandas \
            and isinstance(call.first_node("data"), (cst.Dict, cst.List, cst.Tuple)):
        # values written out but computed at run time (`{"sales": df["sales"].sum(), ...}`):
        # pandas builds the Series (its labels are the keys) from the values porter computes
        ctx.handover = True
        return PandasValue(_rewritten_call("pd.Series", call, ctx))
    if isinstance(data, Opaque) and data.is_const and isinstance(data.const, dict) \
            and labels is None and data.const and all(isinstance(k, str) for k in data.const):
        # pd.Series({"a": 1, "b": 2}): the keys are the labels, as index=[...] gives them
        labels = list(data.const)
        data = replace(data, const=list(data.const.values()))
    if not (isinstance(data, Opaque) and data.is_const and isinstance(data.const, (list, tuple))):
        raise ctx.todo("a Series from values computed at run time")
    values = list(data.const)
    if any(isinstance(v, (list, tuple, dict)) for v in values):
        raise ctx.todo("a Series of lists or dicts")
    label = name if name is not None else "0"
    kind, polars = column_type(label, values, ctx)
    options = {"schema_overrides": {label: emit.atom(polars)}} if polars else {}
    if labels is not None:
        # pandas' unnamed index of the texts given, held in the key column "index" (the name
        # reset_index() gives it)
        if len(labels) != len(values):
            raise ctx.todo("index= of another length than the values (pandas raises)")
        if label == ROW_LABELS:
            raise ctx.todo('a Series named "index" beside its index')
        frame = Frame(emit.pl("LazyFrame", {ROW_LABELS: list(labels), label: values}, **options),
                      columns=(ROW_LABELS, label), index=(ROW_LABELS,), index_unnamed=True,
                      labels_intact=False, grouped_rows=None,
                      dtypes=((ROW_LABELS, "str"), *(((label, kind),) if kind else ())))
        return Column(emit.col(label), frame=frame, name=name, dtype=kind, refs=frozenset({label}))
    frame = Frame(emit.pl("LazyFrame", {label: values}, **options), columns=(label,),
                  dtypes=((label, kind),) if kind else ())
    return Column(emit.col(label), frame=frame, name=name, dtype=kind, refs=frozenset({label}))



@rule("series.to_frame")
def to_frame(call: PandasCall, ctx: RuleContext) -> Value:
    """Series.to_frame(name) -> the frame of the column (and of its index columns, if any).

    Handles: pandas' name for an unnamed Series ("0", as text).
    """
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call, "name", positional=1)
    name = call.const("name", 0, None, kinds=(str,))
    if name is not None:
        column = replace(column, name=name)
    label = column.name if column.name is not None else "0"
    index = column.frame.index
    if label in index:
        # pandas holds an index level and a column of one name; a Polars frame cannot
        raise ctx.todo(f"the column would be named {label!r} like an index key of the Series")
    return Frame(handover.series_frame(column), columns=(*index, label), index=index,
                 dtypes=((label, column.dtype),) if column.dtype else (),
                 labels_intact=column.frame.labels_intact)


@dataclass(frozen=True)
class DateRange:
    """The timestamps of a `pd.date_range(...)` written out in the script, read by pandas at
    convert time: `code` is the Polars Series of them (`pl.datetime_range(..., eager=True)`),
    checked to hold the same values. It is the constant of the call's value, so that a frame
    written out around it (`pd.DataFrame({"day": pd.date_range(...)})`) is a literal frame;
    anywhere else the call stays pandas' as written. It has no literal text (repr raises): a
    rule that would write it out as a Python value fails, and keeps its call on pandas."""

    code: Code
    size: int | None  # None: ends read from the data (known only at run time)
    lines: tuple[int, int] = (0, 0)  # where the call is written (its site, when inline)

    def __repr__(self) -> str:
        raise TypeError("a pd.date_range has no literal form")

    @property
    def kind(self) -> str:
        """porter's dtype of the column it makes."""
        return "datetime"

    @property
    def key(self) -> str:
        """The mapping key of the call that made it (its site, when inline)."""
        return "pd.date_range"

    what = "timestamps"


@dataclass(frozen=True, repr=False)
class PeriodTexts(DateRange):
    """The periods of a `pd.period_range(...)` written out in the script, made by pandas at
    convert time (rules/datetimes.py, period_range): `texts` are pandas' own text of each
    period (str(p), astype(str)), `code` a Polars Series or a list of them. `period` is
    pandas' dtype ("period[M]") while they stand for the periods; "str" once they are text
    (astype(str), strftime), which pandas makes a str column. A column of periods in a frame
    holds their text, as dt.to_period() columns do (Periods.aligned_in)."""

    texts: tuple[str, ...] = ()
    period: str = "str"
    made: tuple[Any, ...] = ()  # pd.period_range's start, end, periods, freq
    kept: str | None = None  # pandas' PeriodIndex kept as written ("isin", "loop"), not the texts
    key_prefix: str = "periods.range"  # its astype and strftime (evaluate._prefix)
    # the site of the call that made the texts, when not pd.period_range itself (strftime):
    # (key, rule, confidence, message)
    made_by: tuple[str, str, float, str] | None = None

    @property
    def kind(self) -> str:
        return self.period

    @property
    def key(self) -> str:
        return "pd.period_range"

    what = "periods"


def _frame_columns_only(module: object, text: str) -> tuple[int, int] | None:
    """Whether each `pd.date_range(...)` written as `text` in the script is a column of a frame
    written out (`pd.DataFrame({"day": <it>})`, in a call given nothing but the data and
    columns=) or the labels of a reindex (`s.reindex(<it>, ...)`), itself or through a name that
    is read only there (`days = pd.date_range(...)`, then `pd.DataFrame({"day": days})`): the
    lines of the first such call, or None."""
    if not isinstance(module, ast.Module):
        return None
    try:
        wanted = ast.unparse(ast.parse(text.strip(), mode="eval").body)
    except SyntaxError:
        return None
    columns: set[int] = set()  # the ids of the dict values of pd.DataFrame({...}) calls
    for node in ast.walk(module):
        if isinstance(node, ast.Call) and isinstance(node.func, ast.Attribute) \
                and node.func.attr == "DataFrame":
            data = node.args[0] if node.args else next(
                (k.value for k in node.keywords if k.arg == "data"), None)
            plain = len(node.args) <= 2 and all(k.arg in ("data", "columns") for k in node.keywords)
            if isinstance(data, ast.Dict) and plain:
                columns.update(id(v) for v in data.values)
        if isinstance(node, ast.Call) and isinstance(node.func, ast.Attribute) \
                and node.func.attr == "reindex" and len(node.args) == 1:
            # s.reindex(<it>, fill_value=...): the labels of a Series laid over the range, a
            # join on a frame of them (rows.reindex)
            columns.add(id(node.args[0]))
    for node in ast.walk(module):
        # a level of pd.MultiIndex.from_product([sheds, <it>], names=...) that is itself only
        # the labels of a reindex: a frame of the range cross-joined (multiindex_from_product)
        if isinstance(node, ast.Call) and isinstance(node.func, ast.Attribute) \
                and node.func.attr == "from_product" and node.args \
                and isinstance(node.args[0], (ast.List, ast.Tuple)) \
                and _product_only_reindexed(module, node, columns):
            columns.update(id(e) for e in node.args[0].elts)
    names: set[str] = set()  # names bound to the range
    lines: tuple[int, int] | None = None
    for node in ast.walk(module):
        if isinstance(node, ast.Assign) and len(node.targets) == 1 \
                and isinstance(node.targets[0], ast.Name) and ast.unparse(node.value) == wanted:
            names.add(node.targets[0].id)
    for node in ast.walk(module):
        if isinstance(node, ast.Call) and ast.unparse(node) == wanted:
            if lines is None:
                lines = (node.lineno, node.end_lineno or node.lineno)
            bound = any(isinstance(a, ast.Assign) and a.value is node and len(a.targets) == 1
                        and isinstance(a.targets[0], ast.Name) and a.targets[0].id in names
                        for a in ast.walk(module))
            if id(node) not in columns and not bound:
                return None
        if isinstance(node, ast.Name) and node.id in names and isinstance(node.ctx, ast.Load) \
                and id(node) not in columns:
            return None
    return lines


def _product_only_reindexed(module: ast.Module, node: ast.Call, targets: set[int]) -> bool:
    """Whether the from_product call `node` is written as the labels of a reindex (its id in
    `targets`) or bound once to a name read only as such."""
    # what multiindex_from_product ports, seen in the script: the levels a list, one per name
    # of names=[...] (distinct texts), nothing else given; otherwise the product stays
    # pandas', and a level of it must be pandas' DatetimeIndex (pandas names a level after
    # the Series given for it)
    names = [k.value for k in node.keywords if k.arg == "names"]
    if len(node.args) != 1 or len(node.keywords) != 1 or len(names) != 1 \
            or not isinstance(names[0], (ast.List, ast.Tuple)) \
            or not all(isinstance(e, ast.Constant) and isinstance(e.value, str)
                       for e in names[0].elts) \
            or len({e.value for e in names[0].elts}) != len(names[0].elts) \
            or len(names[0].elts) != len(node.args[0].elts) or not names[0].elts:
        return False
    if id(node) in targets:
        return True
    bound = [a.targets[0].id for a in ast.walk(module)
             if isinstance(a, ast.Assign) and a.value is node and len(a.targets) == 1
             and isinstance(a.targets[0], ast.Name)]
    return len(bound) == 1 and _only_reindexed(module, bound[0])


_MOST_STAMPS = 1_000_000  # a longer range is made by pandas at run time (a TODO), not here

# pandas' fixed frequencies (Day, Hour, Minute, ...) as Polars intervals, largest unit first
_INTERVALS = (("d", 86_400_000_000_000), ("h", 3_600_000_000_000), ("m", 60_000_000_000),
              ("s", 1_000_000_000), ("ms", 1_000_000), ("us", 1_000))


def _datetime_code(stamp: Any) -> Code:
    parts = [stamp.year, stamp.month, stamp.day, stamp.hour, stamp.minute, stamp.second,
             stamp.microsecond]
    while len(parts) > 3 and parts[-1] == 0:
        parts.pop()
    return emit.pl("datetime", *parts)


@rule("pd.date_range")
def date_range(call: PandasCall, ctx: RuleContext) -> Value:
    """pd.date_range(start, end / periods, freq) -> pl.datetime_range(first, last, interval,
    eager=True), a column of a frame written out (`pd.DataFrame({"day": ...})`).

    Handles: dates and times as text (read by pandas itself at convert time), two of start /
    end / periods, a fixed frequency ("D", "2D", "h", "15min", "s", ...); the values are
    datetime64[us] in pandas 3 and Datetime("us") in Polars, checked equal at convert time.
    Caveats: anchored frequencies (W, MS, ME, B, ...), a time zone, normalize=, inclusive=,
    unit= and name= are TODOs, and so is a range used otherwise (len(), isin, a column set
    with df["c"] = ..., pd.DataFrame with index= or dtype=): pandas' DatetimeIndex.
    """
    ctx.reject_unknown(call, "start", "end", "periods", "freq", positional=4)
    assert call.node is not None
    original = Code(cst.Module([]).code_for_node(call.node))
    lines = _frame_columns_only(ctx.python_module, original.text)
    if lines is None:
        raise ctx.todo("porter ports a date range as a column of a frame written out "
                       "(pd.DataFrame({\"day\": pd.date_range(...)})); here pandas' "
                       "DatetimeIndex is used otherwise")
    if call.has("start", 0) and call.has("end", 1) and isinstance(call.arg("start", 0), Scalar) \
            and isinstance(call.arg("end", 1), Scalar):
        return _date_range_of_data(call, ctx, lines)
    start = call.const("start", 0, None, kinds=(str,))
    end = call.const("end", 1, None, kinds=(str,))
    periods = call.const("periods", 2, None, kinds=(int,))
    freq = call.const("freq", 3, "D", kinds=(str,))
    if isinstance(periods, bool) or (start, end, periods).count(None) != 1:
        raise ctx.todo("exactly two of start, end and periods are ported")
    written = freq
    modern = modern_offset(freq)
    if modern is not None:
        # an alias pandas 3 rejects ("H", "15T", "M"): the offset pandas 2.2 renamed it to
        ctx.lower(f"freq={freq!r} is read as {modern!r}, its name since pandas 2.2 (pandas "
                  "3.1 rejects the old one)", 1.0)
        freq = modern
    import warnings
    import pandas as pd
    import polars as pl
    try:
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")
            # how many timestamps, before pandas makes them (a year of seconds is 31 million)
            step = pd.tseries.frequencies.to_offset(freq)
            count = periods if periods is not None else \
                (pd.Timestamp(end) - pd.Timestamp(start)) // pd.Timedelta(step.nanos, "ns") + 1
            if count > _MOST_STAMPS:
                raise ctx.todo(f"over {_MOST_STAMPS:,} timestamps")
            stamps = pd.date_range(start, end, periods, freq)
    except (ValueError, TypeError, OverflowError) as error:
        # (an anchored frequency has no fixed step: pandas says so, and porter ports none)
        raise ctx.todo(f"pandas raises here, or the step is not fixed ({error})") from None
    try:  # a fixed step (pandas 3's Day is a calendar day: 24 hours without a time zone)
        step = stamps.freq.nanos if stamps.freq is not None else None
    except ValueError:  # "<Week: weekday=6> is a non-fixed frequency"
        step = None
    if step is None or step <= 0:
        renamed = f" (the script's {written!r}, which pandas 3.1 rejects)" if written != freq else ""
        raise ctx.todo(f"freq={freq!r}{renamed} is anchored to a calendar (week, month, business "
                       "day): porter ports fixed steps (D, h, min, s, ...)")
    if stamps.tz is not None or str(stamps.dtype) != "datetime64[us]":
        raise ctx.todo("a time zone, or a unit other than microseconds")
    if len(stamps) == 0:
        raise ctx.todo("an empty range")
    unit, size = next((u, s) for u, s in _INTERVALS if step % s == 0)
    code = emit.pl("datetime_range", _datetime_code(stamps[0]), _datetime_code(stamps[-1]),
                   f"{step // size}{unit}", eager=True)
    made = pl.datetime_range(stamps[0].to_pydatetime(), stamps[-1].to_pydatetime(),
                             f"{step // size}{unit}", eager=True)
    if made.dtype != pl.Datetime("us") or made.to_list() != list(stamps.to_pydatetime()):
        raise ctx.todo("Polars' range differs from pandas' here")  # checked, never assumed
    return Opaque(code, const=DateRange(code, len(stamps), lines))


def _date_range_of_data(call: PandasCall, ctx: RuleContext, lines: tuple[int, int]) -> Value:
    """pd.date_range(df["d"].min(), df["d"].max(), freq=...) -> df.select(pl.datetime_range(
    pl.col("d").min(), pl.col("d").max(), interval)).collect().to_series(): the ends are
    reductions of one frame's date columns, computed in one plan and collected once.

    Both libraries start at the first end (its time of day kept) and step up to the last end
    included, in the column's unit (pandas keeps the Timestamps' unit, Polars the column's);
    a missing end (an empty or all-missing column) stops the script in both (pandas: "Neither
    `start` nor `end` can be NaT", Polars: "start is an out-of-range time"). pandas 3's Day
    is a calendar day, as Polars' "1d" (with a time zone too); a step in hours or less is a
    fixed duration in both."""
    import warnings
    import pandas as pd
    ctx.reject_unknown(call, "start", "end", "freq", positional=4)
    if call.has("periods", 2):
        raise ctx.todo("periods= with both ends given (pandas spaces them evenly)")
    start, end = call.arg("start", 0), call.arg("end", 1)
    assert isinstance(start, Scalar) and isinstance(end, Scalar)
    aggs = [start.agg, end.agg]
    if not all(isinstance(a, Column) for a in aggs) or aggs[0].frame.rows != aggs[1].frame.rows:
        raise ctx.todo("ends computed other than as reductions of one frame's date columns "
                       "(df[\"d\"].min(), df[\"d\"].max())")
    if not all(a.dtype == "datetime" for a in aggs):
        raise ctx.todo("ends that are not reductions of datetime columns")
    freq = call.const("freq", 3, "D", kinds=(str,))
    modern = modern_offset(freq)
    if modern is not None:
        ctx.lower(f"freq={freq!r} is read as {modern!r}, its name since pandas 2.2 (pandas "
                  "3.1 rejects the old one)", 1.0)
        freq = modern
    try:
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")
            offset = pd.tseries.frequencies.to_offset(freq)
            step = offset.nanos
    except (ValueError, TypeError) as error:
        raise ctx.todo(f"freq={freq!r} is anchored to a calendar or not read by pandas "
                       f"({error}): porter ports fixed steps (D, h, min, s, ...)") from None
    if step <= 0:
        raise ctx.todo(f"freq={freq!r}: a step that is not forward")
    if type(offset).__name__ == "Day":
        interval = f"{offset.n}d"  # calendar days in both
    else:
        unit, size = next((u, s) for u, s in _INTERVALS[1:] if step % s == 0)
        interval = f"{step // size}{unit}"
    frame = aggs[0].frame
    ends = [ctx.expr(a, frame) for a in aggs]
    code = frame.code.method("select", emit.pl("datetime_range", ends[0], ends[1], interval)) \
        .method("collect").method("to_series")
    return Opaque(code, const=DateRange(code, None, lines))


@dataclass(frozen=True)
class ProductLabels:
    """The labels of `pd.MultiIndex.from_product([a, b], names=[...])` as a Polars cross join
    of a frame per level (`code`), every combination once, the first level's values outermost
    as pandas makes them; `names` are the levels' names. It stands for pandas' MultiIndex only
    where the script reads it as the target of a reindex (rows.series_reindex); it has no
    literal text."""

    code: Code
    names: tuple[str, ...]

    def __repr__(self) -> str:
        raise TypeError("a pd.MultiIndex has no literal form")


def _only_reindexed(module: object, name: str | None) -> bool:
    """Whether the MultiIndex bound to `name` (once) is read only as the target of a reindex
    (`s.reindex(<it>, ...)`)."""
    if not isinstance(module, ast.Module) or name is None:
        return False
    binds = 0
    for each in ast.walk(module):
        if isinstance(each, ast.Assign) and any(isinstance(t, ast.Name) and t.id == name
                                                for t in each.targets):
            binds += 1
    targets = set()
    for each in ast.walk(module):
        if isinstance(each, ast.Call) and isinstance(each.func, ast.Attribute) \
                and each.func.attr == "reindex" and len(each.args) == 1:
            targets.add(id(each.args[0]))
    for each in ast.walk(module):
        if isinstance(each, ast.Name) and each.id == name and isinstance(each.ctx, ast.Load) \
                and id(each) not in targets:
            return False
    return binds == 1


@rule("pd.MultiIndex.from_product")
def multiindex_from_product(call: PandasCall, ctx: RuleContext) -> Value:
    """pd.MultiIndex.from_product([a, b], names=["x", "y"]) -> pl.LazyFrame({"x": a}).join(
    pl.LazyFrame({"y": b}), how="cross"), as the target of a reindex.

    Handles: lists written in the script or held in names (of text or whole numbers), each
    level named; every combination once, the first level outermost, as pandas makes them.
    Caveats: any other use of the MultiIndex (printed, iterated, set as an index), levels
    without names and a level holding a missing value are TODOs."""
    ctx.reject_unknown(call, "iterables", "sortorder", "names", positional=1)
    if call.has("sortorder"):
        raise ctx.todo("sortorder=")
    names = call.const("names", None, None, kinds=(list, tuple))
    levels = call.first_node("iterables")
    if not (isinstance(names, (list, tuple)) and names and all(isinstance(n, str) for n in names)
            and len(set(names)) == len(names)):
        raise ctx.todo("levels named by a list of distinct texts (names=[...])")
    if not (isinstance(levels, (cst.List, cst.Tuple)) and len(levels.elements) == len(names)):
        raise ctx.todo("the levels written as a list, one per name")
    bound = _bound_name(call, ctx)
    if not (_only_reindexed(ctx.python_module, bound) or _written_as_reindex_target(call, ctx)):
        raise ctx.todo("porter ports a MultiIndex made from a product only as the labels of a "
                       "reindex (s.reindex(it, fill_value=...)); here pandas' MultiIndex is used "
                       "otherwise")
    if not all(isinstance(e.value, (cst.List, cst.Tuple, cst.Name)) for e in levels.elements):
        # each level is written into the Polars frame as the script wrote it: a list, or a
        # name porter made (galleries.index written there would be a LazyFrame's attribute)
        raise ctx.todo("a level other than a list written in the script or held in a name "
                       "(the labels of a frame, a call)")
    module = cst.Module([])
    frames = [emit.pl("LazyFrame", emit.atom("{" + emit.lit(n).text + ": "
                                             + module.code_for_node(e.value) + "}"))
              for n, e in zip(names, levels.elements)]
    code = frames[0]
    for other in frames[1:]:
        code = code.method("join", other, how="cross", maintain_order="left_right")
    ctx.lower("a level holding a missing value (nan in a list) stops the script: Polars "
              "cannot make a column of text and a float", 0.95)
    return Opaque(code, const=ProductLabels(code, tuple(names)))


def _written_as_reindex_target(call: PandasCall, ctx: RuleContext) -> bool:
    """Whether `call` is written as the labels of a reindex (`s.reindex(pd.MultiIndex.
    from_product(...), ...)`) and nowhere else in the script."""
    module = ctx.python_module
    if not isinstance(module, ast.Module) or call.node is None:
        return False
    text = cst.Module([]).code_for_node(call.node)
    try:
        wanted = ast.unparse(ast.parse(text.strip(), mode="eval").body)
    except SyntaxError:
        return False
    targets = sum(1 for each in ast.walk(module)
                  if isinstance(each, ast.Call) and isinstance(each.func, ast.Attribute)
                  and each.func.attr == "reindex" and len(each.args) == 1
                  and ast.unparse(each.args[0]) == wanted)
    written = sum(1 for each in ast.walk(module)
                  if isinstance(each, ast.Call) and ast.unparse(each) == wanted)
    return targets >= 1 and targets == written


def _bound_name(call: PandasCall, ctx: RuleContext) -> str | None:
    """The name the statement holding `call` binds it to (`full = pd.MultiIndex...`)."""
    module = ctx.python_module
    if not isinstance(module, ast.Module) or call.node is None:
        return None
    text = cst.Module([]).code_for_node(call.node)
    try:
        wanted = ast.unparse(ast.parse(text.strip(), mode="eval").body)
    except SyntaxError:
        return None
    for each in ast.walk(module):
        if isinstance(each, ast.Assign) and len(each.targets) == 1 \
                and isinstance(each.targets[0], ast.Name) and ast.unparse(each.value) == wanted:
            return each.targets[0].id
    return None
