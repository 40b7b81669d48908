"""Where Polars values meet code that wants pandas (or wants to print them).

Every hand-over is written out in the code, so it is visible in review and counted in the report.
"""

from __future__ import annotations

import ast
import keyword
import re
from collections.abc import Callable
from dataclasses import replace

import libcst as cst

from porter.emit import code as emit
from porter.emit.code import Code
from porter.translate.context import PandasCall
from porter.translate.values import (
    Accessor, BoundMethod, Column, Frame, Grouped, Indexer, Items, Opaque, PandasValue, Parts, Value,
    is_pandas,
)


WINDOW_KINDS = ("rolling", "expanding", "ewm")
# porter's type of a column pandas holds as one of its nullable types other than the integers
_NULLABLE_KINDS = {"boolean": "bool", "string": "str", "Float64": "float", "Float32": "float"}


def _items(value: Items, convert: Callable[[Value], Code]) -> Code:
    inner = ", ".join(convert(v).text for v in value.items)
    if value.brackets == "()" and len(value.items) == 1:
        inner += ","
    return Code(f"{value.brackets[0]}{inner}{value.brackets[1]}")


# a column's values given to Python code (a loop over it) as pandas gives them, pandas imported
# only where a value is missing
VALUES_FUNCTION = "pandas_values"
VALUES_DEFINITION = '''\
def pandas_values(values):
    """A column's values as pandas gives them to Python: pandas' own Series where one is
    missing (nan for it, and floats for whole numbers), otherwise the Polars Series, whose
    numbers, texts and True/False are the same Python values, so that pandas is not imported
    for them."""
    return values.to_pandas() if values.null_count() else values
'''


def python_values(column: Column) -> Code:
    """The values of a column a loop reads, as pandas gives them (nan, not None, for a missing
    one): through `pandas_values` for numbers and text without a row label or a pandas dtype
    of their own, whose values are the same Python objects in both libraries where none is
    missing; through pandas otherwise (dates are Timestamps there)."""
    # (True/False with a missing value is pandas' object column, nan for it: to_pandas)
    if (column.dtype in ("int", "float", "str") or column.dtype == "bool" and column.null_is_false) \
            and not column.frame.index and not column.nullable_int \
            and getattr(column, "pandas", None) is None:
        return emit.call(VALUES_FUNCTION, series_frame(column).method("collect").method("to_series"))
    return to_pandas(column)


def series_frame(column: Column) -> Code:
    """A column as a frame of its index columns (if any) and its values."""
    name = column.name if column.name is not None else "0"
    expr = column.code.method("fill_null", False) if column.null_is_false else column.code
    if column.code.text != emit.col(name).text:
        expr = expr.method("alias", name)
    keys = [emit.col(k) for k in column.frame.index if k != name]
    if expr.text == emit.col(name).text and column.frame.columns == (*column.frame.index, name):
        return column.frame.code  # the frame is already exactly the Series
    return column.frame.code.method("select", *keys, expr)


def collected(value: Value) -> Code:
    """A frame or column as an eager Polars object."""
    if isinstance(value, Frame):
        return value.code.method("collect")
    if isinstance(value, Column):
        frame = series_frame(value).method("collect")
        return frame if value.frame.index else frame.method("to_series")
    return value.code


def _labels(code: Code, frame: Frame) -> Code:
    """The pandas frame `code` with the frame's index columns made its index again."""
    keys = emit.names_arg(frame.index)
    if frame.levels_as_met:
        # set_index sorts the levels; pandas' groupby(sort=False) made them in the order it
        # met the keys (unstack lays them out so): grouping the one row of each combination
        # again, in pandas, makes them so, and first() of one row is that row's value
        return code.method("groupby", keys, sort=False, dropna=False).method("first")
    if frame.levels_with_missing:
        # a missing key is a value of its level (sorted last) in groupby(dropna=False)'s
        # index, missing in set_index's: grouping the one row of each combination again
        # makes the levels so
        return code.method("groupby", keys, dropna=False).method("first")
    return code.method("set_index", keys)


def _two_levels(code: Code, frame: Frame) -> Code:
    """The pandas frame `code` with the (column, function) pairs of an aggregation with lists
    as its two levels of column labels, as pandas made them (porter names them
    "column_function"); a column that is not a pair is (name, ""), as pandas labels a column
    written into such a frame or a key that reset_index brought back."""
    pairs = dict(frame.column_pairs)
    names = [c for c in frame.columns if c not in frame.index] if frame.columns is not None \
        else None
    if names is not None:
        labels = emit.render({c: pairs.get(c, (c, "")) for c in names})
    else:
        labels = f"lambda c: {emit.render(pairs)}.get(c, (c, \"\"))"
    # Index.map of pairs makes a MultiIndex (set_axis of a list of tuples would not)
    return code.method("pipe", emit.atom(
        f"lambda frame: frame.set_axis(frame.columns.map({labels}), axis=1)"))


def _int_labels(texts: tuple[str, ...]) -> Code:
    """The rename that gives the columns a pivot on an integer key made pandas' labels: Polars
    named them by the values as text ("2024"), pandas by the values (2024). Only names that
    are an integer's text change: a column porter did not see written keeps its name."""
    others = f"c not in {emit.render(tuple(texts))} and " if texts else ""
    return emit.atom(f'lambda c: int(c) if {others}c.removeprefix("-").isdecimal() else c')


def int_labels_after(frame: Frame, written: object) -> tuple[str, ...] | None:
    """`int_labels_except` of a frame after a statement kept on pandas wrote one column under
    the text key `written` (`pv["growth"] = pv[2024] - pv[2023]`); None when the statement
    did something else to it (it may have renamed the columns)."""
    if frame.int_labels_except is None or not isinstance(written, str):
        return None
    kept = frame.int_labels_except
    return kept if written in kept else (*kept, written)


def _nullable_again(code: Code, column: Column) -> Code:
    """The pandas Series `code` of `column` in pandas' nullable type where porter knows the
    column is one: pandas' nullable integers (Polars hands an int column holding a missing
    value over as float64), and its other nullable types, whose missing value is <NA>."""
    if column.nullable_int and column.dtype == "int":  # pandas' nullable integers (see Frame)
        return code.method("astype", column.nullable_int)
    if (column.nullable_int, column.dtype) in (("boolean", "bool"), ("string", "str"),
                                               ("Float64", "float"), ("Float32", "float")):
        return code.method("astype", column.nullable_int)  # its other nullable types: <NA>
    return code


def product_labels(value: object):  # -> construct.ProductLabels | None
    """The labels of a pd.MultiIndex.from_product `value` stands for, if it does."""
    from porter.rules.construct import ProductLabels
    if isinstance(value, Opaque) and isinstance(value.const, ProductLabels):
        return value.const
    return None


def to_pandas(value: Value) -> Code:
    """The pandas object this value stands for (index restored where porter tracks one; dates,
    missing True/False values and categories as pandas holds them)."""
    labels = product_labels(value)
    if labels is not None:
        # pd.MultiIndex.from_product, which porter holds as a Polars frame of its combinations
        # (construct.ProductLabels), given to pandas code: pandas' MultiIndex of them
        return value.code.method("collect").method("to_pandas").method(
            "set_index", list(labels.names)).attr("index")
    if isinstance(value, Frame):
        categories = [c for c, t in value.dtypes if t == "category"]
        code = value.code
        if categories:
            # a Categorical reaches pandas with its categories in the order Polars met them;
            # as text made a category by pandas they are sorted, as astype("category") made them
            chosen = emit.col(categories[0]) if len(categories) == 1 else emit.col(categories)
            code = code.method("with_columns", chosen.method("cast", emit.atom("pl.String")))
        code = code.method("collect").method("to_pandas")
        if categories:
            code = code.method("astype", {c: "category" for c in categories})
        nullable = {c: kind for c, kind in value.nullable_ints or ()
                    if value.columns is not None and c in value.columns
                    and value.dtype(c) == _NULLABLE_KINDS.get(kind, "int")}
        if nullable:
            # pandas' nullable integers (astype("Int64"), isocalendar()): Polars hands an int
            # column holding a missing value over as float64; and its other nullable types (a
            # parquet file pandas wrote): <NA>, not None or NaN
            code = code.method("astype", nullable)
        elif value.columns is None and value.nullable_ints:
            # the columns are not known (no --data), the marks are (read_csv(dtype={...})):
            # those of the marked columns the frame has, at run time
            marks = {c: kind for c, kind in value.nullable_ints
                     if value.dtype(c) == _NULLABLE_KINDS.get(kind, "int")}
            if marks:
                nullable = marks
                code = code.method("pipe", emit.atom(
                    f"lambda t: t.astype({{c: k for c, k in {emit.render(marks)}.items() "
                    "if c in t.columns})"))
        code = _as_pandas_made_them(code, tuple((c, t) for c, t in value.dtypes
                                                if c not in nullable), value.columns)
        if value.index:
            code = _labels(code, value)
            if value.index_unnamed and len(value.index) == 1:
                code = code.method("rename_axis", None)  # describe's statistics: no name
            elif value.index_unnamed:  # pd.concat(keys=) without names=: levels without names
                code = code.method("rename_axis", emit.lit([None] * len(value.index)))
        if value.value_levels:
            # a pivot of several value columns: Polars' "a_x" is pandas' (a, x), the value
            # column, then the key's value (Index.map of pairs makes the two levels)
            prefixes = emit.render(value.value_levels)
            code = code.method("pipe", emit.atom(
                "lambda frame: frame.set_axis(frame.columns.map(lambda c: next("
                f"(v, c[len(v) + 1:]) for v in {prefixes} if c.startswith(v + \"_\"))), axis=1)"))
            code = code.method("rename_axis", columns=[None, value.columns_name])
        elif value.columns_name is not None:
            # a pivoted table's columns are named after its key (pandas keeps the name through
            # reset_index): stack, melt and print read it
            code = code.method("rename_axis", columns=value.columns_name)
        if value.column_pairs:
            # (a frame changed in place on pandas then stays pandas, unless the change names
            # its columns afresh: engine._after_change)
            code = _two_levels(code, value)
        labels = [c for c in value.number_labels if c not in value.index
                  and (value.columns is None or c in value.columns)]
        if labels:  # pandas' own labels 0, 1, … are integers
            code = code.method("rename", columns={c: int(c) for c in labels})
        if value.int_labels_except is not None:
            code = code.method("rename", columns=_int_labels(value.int_labels_except))
        return code
    if isinstance(value, Column):
        if getattr(value, "pandas", None) is not None:
            return value.pandas  # type: ignore[attr-defined]  # pandas makes it again (rules/windows.py)
        if value.index_values:
            # pandas' Index: its values by position ([0] is the first, `in` looks at the
            # values), not a Series labelled by the key (whose [0] is a label and whose `in`
            # reads the labels, the key before idx.str.upper() changed it)
            plain = to_pandas(replace(value, frame=replace(value.frame, index=()),
                                      index_values=False))
            label = value.name if value.name is not None else 0
            code = plain.method("to_frame").method("set_index", label).attr("index")
            return code.method("rename", None) if value.name is None else code
        if value.frame.index:
            name = value.name if value.name is not None else "0"
            renamed = name if name in value.frame.index else None
            if renamed is not None:
                # a Series named like one of its index keys (`df.groupby("k")["k"].count()`):
                # one Polars frame cannot hold both, so the values go over under a name of
                # their own and take the key's name back once the key is pandas' index
                name = "_".join((*value.frame.index, "values"))
                value = replace(value, name=name)
            kinds = tuple((c, t) for c, t in value.frame.dtypes if c in value.frame.index)
            if value.dtype is not None:
                kinds += ((name, value.dtype),)
            # date keys are datetime.date objects in pandas' index, as pandas grouped them
            made = _as_pandas_made_them(series_frame(value).method("collect").method("to_pandas"),
                                        kinds, (*value.frame.index, name))
            code = _nullable_again(_labels(made, value.frame).index(name), value)
            if renamed is not None:
                code = code.method("rename", renamed)
            if value.frame.index_unnamed and len(value.frame.index) == 1:
                # pandas' index has no name (pd.Series(..., index=[...])): the key column's
                # name would show in reset_index(), extractall's levels, a print
                code = code.method("rename_axis", None)
            elif value.frame.index_unnamed:
                code = code.method("rename_axis", emit.lit([None] * len(value.frame.index)))
        elif value.dtype == "category":  # categories sorted, as astype("category") made them
            code = (series_frame(value).method("collect").method("to_series")
                    .method("cast", emit.atom("pl.String")).method("to_pandas").method("astype", "category"))
        else:
            code = series_frame(value).method("collect").method("to_series").method("to_pandas")
            if value.dtype is not None and value.dtype.startswith("list["):
                # str.split's Python lists: Polars hands each over as a numpy array
                code = code.method("map", emit.atom("list"), na_action="ignore")
            elif value.dtype == "date":
                code = code.attr("dt").attr("date")  # see _as_pandas_made_them
            elif value.dtype is not None and value.dtype.startswith("period["):
                code = code.method("astype", value.dtype)  # the periods, from their text
            elif value.dtype == "bool" and not value.null_is_false and value.nullable_int != "boolean":
                code = code.method("fillna", emit.atom('float("nan")'))
            else:
                code = _nullable_again(code, value)
        # a Series pandas made without a name has none (Polars calls it "0")
        return code.method("rename", None) if value.name is None else code
    if isinstance(value, Grouped) and value.pandas is not None:
        code = value.pandas
        if value.selection is not None:
            code = code.index(value.selection[0] if value.single else list(value.selection))
        return code
    if isinstance(value, Grouped):
        args: dict[str, object] = {}
        if not value.sort:
            args["sort"] = False
        if not value.dropna:
            args["dropna"] = False
        if not value.as_index:
            args["as_index"] = False
        if not value.group_keys:
            args["group_keys"] = False
        # `groupby(["k"])` as written: pandas gives its groups 1-tuple keys then
        keys = list(value.keys) if value.key_list else emit.names_arg(value.keys)
        frame = value.frame
        if value.selection is not None:
            # only the keys and the columns taken go over (the rest would be copied for nothing)
            needed = list(dict.fromkeys((*frame.index, *value.keys, *value.selection)))
            if frame.columns is None or set(needed) <= set(frame.columns):
                frame = replace(frame, code=frame.code.method("select", *needed),
                                columns=tuple(needed) if frame.columns is not None else None,
                                dtypes=tuple((c, t) for c, t in frame.dtypes if c in needed))
        code = to_pandas(frame).method("groupby", keys, **args)
        if value.selection is not None:
            code = code.index(value.selection[0] if value.single else list(value.selection))
        return code
    if isinstance(value, Accessor) and value.index_of is not None:
        return to_pandas(value.index_of).attr("index")  # pandas' DatetimeIndex itself
    if isinstance(value, Accessor):
        if value.kind in WINDOW_KINDS:  # the window is made again, with the same arguments
            grouped = getattr(value, "grouped", None)  # a window within groups
            base = to_pandas(grouped if grouped is not None else value.column)
            window = base.method(value.kind, **dict(value.options))
            taken = getattr(value, "taken", None)  # a column of a frame's window
            return window if taken is None else window.index(taken)
        return to_pandas(value.column).attr(value.kind)
    if isinstance(value, Indexer):
        # a Series' s.iloc is the Series' own (not its frame's, nor `s[i]`, which reads labels)
        owner = value.column if value.column is not None else value.frame
        return to_pandas(owner).attr(value.kind)
    if isinstance(value, Items):
        if any(code is not None for code in value.labelled):
            # a filtered frame written inline keeps pandas' labels: pandas runs its filter
            return _items(value, lambda v: next(
                (c for i, c in zip(value.items, value.labelled) if i is v and c is not None),
                to_pandas(v)))
        return _items(value, to_pandas)
    if isinstance(value, Parts):  # str.extract / split(expand=True): pandas computes it again
        return value.pandas
    if isinstance(value, BoundMethod) and is_pandas(value.receiver):
        return to_pandas(value.receiver).attr(value.name)  # a method or property not called here
    return value.code


def _as_pandas_made_them(code: Code, dtypes: tuple[tuple[str, str], ...],
                         columns: tuple[str, ...] | None) -> Code:
    """A collected frame's columns as pandas holds them where Polars hands them over otherwise:
    dates are `datetime.date` objects (`dt.date`; Polars gives datetime64, so a function given
    them would see Timestamps), periods are Periods (Polars holds their text), lists are lists (Polars gives numpy arrays), and a missing
    True/False is NaN (Polars gives None, which is false where NaN is true)."""
    flags = [c for c, t in dtypes if t == "bool"]  # fillna passes over a column not there
    if flags:
        code = code.method("fillna", {c: emit.atom('float("nan")') for c in flags})
    # dt.to_period() kept in a frame as the periods' text ("2024-03"), which pandas reads back
    periods = {c: t for c, t in dtypes if t.startswith("period[") and columns is not None
               and c in columns}
    if periods:
        code = code.method("astype", periods)
    dates = [c for c, t in dtypes if t == "date" and columns is not None and c in columns]
    # str.split's lists: Polars hands each over as a numpy array, pandas holds a list (and
    # NaN for a missing one)
    lists = [c for c, t in dtypes if t.startswith("list[") and (columns is None or c in columns)]
    if dates or lists:
        made = {c: emit.atom(f"lambda frame: frame[{emit.lit(c).text}].dt.date") for c in dates}
        made |= {c: emit.atom(f"lambda frame: frame[{emit.lit(c).text}].map(lambda v: "
                              "float(\"nan\") if v is None else list(v))") for c in lists}
        if all(c.isidentifier() and not keyword.iskeyword(c) for c in made):
            code = code.method("assign", **made)
        else:
            code = code.method("assign", emit.atom(f"**{emit.render(made)}"))
    return code


def pandas_text(values: Code) -> Code:
    """A column of a type porter does not know (read without --data, back from pandas after a
    statement kept there) as pandas' astype(str) writes it: pandas writes the text, from the
    column as pandas holds it (True/False where Polars writes true/false, Python's repr of a
    float, 7.0 for an integer column with a missing value, a date alone when every time is
    midnight, "1 days 02:00:00" for a duration, which Polars casts to no text). The whole
    column at once (map_batches), as pandas decides some layouts over the whole column; a
    missing value stays missing."""
    return values.method("map_batches", emit.atom(
        "lambda s: pl.from_pandas(s.to_pandas().astype(str))"), return_dtype=emit.atom("pl.String"))


def for_display(value: Value) -> Code:
    """What `print(value)` should print: the collected Polars object."""
    if isinstance(value, (Frame, Column)):
        return collected(value)
    if isinstance(value, (Grouped, Accessor, Indexer, Parts)):
        return to_pandas(value)
    if isinstance(value, Items):
        return _items(value, for_display)
    return value.code


def pandas_fallback(call: PandasCall, source: Callable[[cst.CSTNode], str],
                    node: cst.CSTNode) -> Code:
    """The original pandas call, run on pandas versions of its inputs."""
    def rewritten(value: Value | None) -> bool:
        """A value porter changed (a frame to hand over, `len(df)` computed by Polars, a
        TODO'd call's own hand-over): its code must replace the source."""
        if value is None:
            return False
        if isinstance(value, Opaque):
            if product_labels(value) is not None:
                return True  # a Polars frame of the labels: pandas is given its MultiIndex
            if value.node is None:
                # code porter wrote (a call of the script's own function given columns
                # handed over): its source would subscript LazyFrames
                return any(s.status != "converted" for s in value.sites)
            return value.code.text != source(value.node)
        return True

    inputs = [call.receiver, *call.args, *call.kwargs.values()]
    renamed = modern_frequencies(node)
    if not any(rewritten(v) for v in inputs):
        if renamed:
            # an old frequency alias pandas 3 rejects, written as pandas 3.1 names it
            new = node.with_changes(args=[  # type: ignore[attr-defined]
                arg.with_changes(value=cst.SimpleString(f'"{renamed[i]}"')) if i in renamed else arg
                for i, arg in enumerate(node.args)])  # type: ignore[attr-defined]
            return Code(cst.Module([]).code_for_node(new))
        if isinstance(node, cst.Call) and isinstance(node.func, cst.Attribute) \
                and call.receiver is None and node.func.attr.value == "read_csv" \
                and not any(arg.star for arg in node.args):
            # read_csv's options pandas 2 and 3 removed (squeeze=, error_bad_lines=,
            # date_parser=, parse_dates joining columns): read as pandas 1.5 read them
            from porter.rules.legacy import modern_read_csv_call
            modern = modern_read_csv_call([(arg.keyword.value if arg.keyword else None,
                                            source(arg.value)) for arg in node.args])
            if modern is not None:
                return Code(modern)
        if isinstance(node, cst.Call) and isinstance(node.func, cst.Attribute) \
                and call.receiver is not None:
            # a method pandas 3 removed (rules/legacy.py): written as pandas 3.1 spells it, as
            # the kept call runs on pandas 3.1
            modern = _modern_method(call, node, [
                f"{arg.keyword.value}={source(arg.value)}" if arg.keyword else source(arg.value)
                for arg in node.args], source(node.func.value))
            if modern is not None:
                return Code(modern)
        return Code(source(node))  # nothing to hand over: the call stays exactly as written
    if isinstance(node, cst.Call):
        args = []
        for i, arg in enumerate(node.args):
            value = _argument_value(call, arg)
            text = to_pandas(value).text if rewritten(value) else source(arg.value)  # type: ignore[arg-type]
            if i in renamed:
                text = f'"{renamed[i]}"'
            star = arg.star or ""
            args.append(f"{arg.keyword.value}={text}" if arg.keyword else f"{star}{text}")
        func = node.func
        if call.receiver is not None and isinstance(func, cst.Attribute):
            receiver = to_pandas(call.receiver).wrapped(emit.ATOM)
            modern = _modern_method(call, node, args, receiver)
            if modern is not None:  # a method pandas 3 removed (rules/legacy.py)
                return Code(modern)
            return Code(f"{receiver}.{func.attr.value}({', '.join(args)})")
        return Code(f"{source(func)}({', '.join(args)})")
    if isinstance(node, cst.Attribute) and call.receiver is not None:
        return Code(f"{to_pandas(call.receiver).wrapped(emit.ATOM)}.{node.attr.value}")
    if isinstance(node, cst.Subscript) and call.receiver is not None:
        receiver = call.receiver
        keys: list[Value] = list(call.args)
        if len(keys) == 1 and len(node.slice) > 1 and hasattr(keys[0], "items"):
            keys = list(keys[0].items)  # type: ignore[attr-defined]  # df[a, b]: one tuple key
        parts = []
        for i, element in enumerate(node.slice):
            key = keys[i] if len(keys) == len(node.slice) else None
            # a key computed from a frame (`df.loc[df.index < 1, "a"]`) is handed over too
            if isinstance(element.slice, cst.Index) and key is not None \
                    and not isinstance(key, Opaque):
                parts.append(to_pandas(key).text)
            elif isinstance(element.slice, cst.Index) and isinstance(key, Opaque) \
                    and (key.node is None or key.code.text != source(key.node)):
                # a key porter rewrote (`s.index[s.values > 1]`: the values read from Polars)
                parts.append(key.code.text)
            else:
                parts.append(source(element.slice))
        inner = ", ".join(parts)
        base = to_pandas(receiver).wrapped(emit.ATOM)
        if isinstance(node.value, cst.Attribute) \
                and node.value.attr.value in ("loc", "iloc", "ix", "at", "iat") \
                and isinstance(receiver, (Frame, Column)):  # s.iloc[-1] is no s[-1] (a label)
            base = f"{base}.{node.value.attr.value}"
        return Code(f"{base}[{inner}]")
    if isinstance(node, (cst.BinaryOperation, cst.Comparison)) and call.receiver is not None:
        return emit.binop(to_pandas(call.receiver), call.name, to_pandas(call.args[0]))
    if isinstance(node, cst.UnaryOperation) and call.receiver is not None:
        return emit.unary(call.name, to_pandas(call.receiver))
    return Code(source(node))


# calls taking a frequency: the method's or function's name -> (the keyword, its position, an
# offset or a period)
_FREQUENCY_ARGS = {
    "resample": ("rule", 0, "either"), "asfreq": ("freq", 0, "either"),
    "floor": ("freq", 0, "offset"), "ceil": ("freq", 0, "offset"), "round": ("freq", 0, "offset"),
    "date_range": ("freq", 3, "offset"), "bdate_range": ("freq", 3, "offset"),
    "Grouper": ("freq", None, "offset"),
    "to_period": ("freq", 0, "period"), "period_range": ("freq", 3, "period"),
}


def _modern_method(call: PandasCall, node: cst.Call, args: list[str],
                   receiver: str) -> str | None:
    """A method pandas 3 removed, called on a frame or Series kept on pandas, as pandas 3.1
    writes it (rules/legacy.py), the whole call: iteritems() is items(), get_value(i, c) is
    .at[i, c], append(other) is pd.concat([df, other]), fillna(method="ffill") is ffill()."""
    from porter.rules.legacy import modern_call
    func = node.func
    if not isinstance(func, cst.Attribute) or not isinstance(call.receiver, (Frame, Column,
                                                                             PandasValue)):
        return None
    if len(args) != len(node.args) or any(arg.star for arg in node.args):
        return None
    given = [(arg.keyword.value if arg.keyword else None,
              text.split("=", 1)[1] if arg.keyword else text)
             for arg, text in zip(node.args, args)]
    return modern_call(receiver, func.attr.value, given)


def modern_chain(node: cst.BaseExpression, older: bool = False) -> cst.BaseExpression:
    """A chain of calls on a pandas object kept as written (`df.set_index("t").resample("M")
    [["a"]].sum()`), each call along it (not inside its arguments) written as it runs under
    pandas 3.1: old frequency aliases renamed, removed methods in today's spelling
    (rules/legacy.py). `older`: the script was written for pandas 1.x, whose
    `df.groupby(k).apply(f)` passed f the key columns too: `df.groupby(k)[list(df.columns)]
    .apply(f)` passes them under pandas 3.1 (df a name: it is read twice)."""
    from porter.rules.legacy import modern_call

    if isinstance(node, cst.Subscript):
        return node.with_changes(value=modern_chain(node.value, older))
    if isinstance(node, cst.Attribute):
        return node.with_changes(value=modern_chain(node.value, older))
    if not (isinstance(node, cst.Call) and isinstance(node.func, cst.Attribute)):
        return node
    func = node.func.with_changes(value=modern_chain(node.func.value, older))
    grouping = func.value
    if older and func.attr.value == "apply" \
            and not any(arg.keyword and arg.keyword.value == "include_groups" for arg in node.args) \
            and isinstance(grouping, cst.Call) and isinstance(grouping.func, cst.Attribute) \
            and grouping.func.attr.value == "groupby" and isinstance(grouping.func.value, cst.Name) \
            and grouping.args and all(arg.keyword is None or arg.keyword.value in (
                "by", "sort", "dropna", "group_keys", "observed") for arg in grouping.args):
        frame = grouping.func.value.value
        func = func.with_changes(value=cst.parse_expression(
            f"{cst.Module([]).code_for_node(grouping)}[list({frame}.columns)]"))
    node = node.with_changes(func=func)
    renamed = modern_frequencies(node)
    if renamed:
        node = node.with_changes(args=[
            arg.with_changes(value=cst.SimpleString(f'"{renamed[i]}"')) if i in renamed else arg
            for i, arg in enumerate(node.args)])
    if any(arg.star for arg in node.args):
        return node
    code = cst.Module([]).code_for_node
    text = modern_call(code(func.value), func.attr.value,
                       [(arg.keyword.value if arg.keyword else None, code(arg.value))
                        for arg in node.args])
    if text is None:
        return node
    return cst.parse_expression(text).with_changes(lpar=node.lpar, rpar=node.rpar)


def modern_frequencies(node: cst.CSTNode) -> dict[int, str]:
    """The arguments of a call kept on pandas that write a frequency alias pandas 3 rejects
    ("M", "15T"; rules/legacy.py), by their index, with pandas 3.1's name for it: the script
    ran on the pandas that had it, and the kept call runs on pandas 3.1."""
    from porter.rules.legacy import modern_offset, modern_period, period_accepted
    if not isinstance(node, cst.Call):
        return {}
    func = node.func
    name = func.attr.value if isinstance(func, cst.Attribute) else \
        func.value if isinstance(func, cst.Name) else None
    if name not in _FREQUENCY_ARGS:
        return {}
    keyword, position, kind = _FREQUENCY_ARGS[name]
    modern = modern_period if kind == "period" else modern_offset
    if kind == "either":
        # resample / asfreq of periods read period frequencies ("M" is still the month there):
        # only an alias pandas 3.1 refuses for periods too is renamed (the call failed either
        # way), to its offset name ("H": "h", "BM": "BME")
        def modern(freq: str) -> str | None:  # noqa: F811
            return None if period_accepted(freq) else modern_offset(freq)
    found = {}
    positional = 0
    for i, arg in enumerate(node.args):
        if arg.star:
            return {}
        if arg.keyword is None:
            at = positional == position
            positional += 1
        else:
            at = arg.keyword.value == keyword
        if at and isinstance(arg.value, cst.SimpleString):
            new = modern(arg.value.evaluated_value)
            if new is not None:
                found[i] = new
    return found


def _argument_value(call: PandasCall, arg: cst.Arg) -> Value | None:
    """The evaluated value of a call argument, when it is a pandas value."""
    if arg.keyword is not None:
        value = call.kwargs.get(arg.keyword.value)
    else:
        index = [a for a in (call.node.args if isinstance(call.node, cst.Call) else ())
                 if a.keyword is None].index(arg)
        positional = call.args
        if call.receiver is not None and isinstance(call.node, cst.Call) \
                and not isinstance(call.node.func, cst.Attribute):
            # a builtin given a Series (`max(df["x"])`): the Series is the call's receiver
            positional = (call.receiver, *call.args)
        value = positional[index] if index < len(positional) else None
    return value


# `.cat` methods whose first argument lists the new categories in order
_CATEGORY_LISTS = ("reorder_categories", "set_categories")
# `.cat` methods that keep an order of categories other than the sorted one
_CATEGORY_ORDERS = (*_CATEGORY_LISTS, "add_categories", "remove_categories", "rename_categories",
                    "remove_unused_categories", "as_ordered")


def text_categories(node: cst.BaseExpression | None,
                    lookup: Callable[[str], cst.BaseExpression | None] = lambda name: None
                    ) -> tuple[str, ...] | None:
    """The categories, when pandas code kept on pandas makes a Categorical whose categories
    are written out as text, in an order of the script's (`pd.Categorical(s, categories=[...])`,
    `s.astype(pd.CategoricalDtype([...]))`, `s.cat.reorder_categories([...])`): pandas sorts
    and groups it in that order, so it comes back to Polars as an Enum of them, not as a
    Categorical, which Polars orders by text."""
    if not isinstance(node, cst.Call):
        return None
    func = node.func
    name = func.attr.value if isinstance(func, cst.Attribute) else \
        func.value if isinstance(func, cst.Name) else None
    if name == "Categorical":
        return _text_list(_argument(node, "categories", 1), lookup)
    if name == "CategoricalDtype":
        return _text_list(_argument(node, "categories", 0), lookup)
    if name == "astype" and isinstance(func, cst.Attribute):
        dtype = _argument(node, "dtype", 0)
        if isinstance(dtype, cst.Name):  # a dtype bound to a name: `order = pd.CategoricalDtype([...])`
            dtype = lookup(dtype.value)
        return text_categories(dtype, lookup) if isinstance(dtype, cst.Call) else None
    if name in _CATEGORY_LISTS and isinstance(func, cst.Attribute) \
            and isinstance(func.value, cst.Attribute) and func.value.attr.value == "cat":
        return _text_list(_argument(node, "new_categories", 0), lookup)
    return None


def orders_categories(node: cst.BaseExpression | None,
                      lookup: Callable[[str], cst.BaseExpression | None] = lambda name: None) -> bool:
    """Whether pandas code makes a Categorical in an order of its own (categories given, or
    changed by a `.cat` method), whether or not porter can read them: where it cannot
    (`text_categories` is None) the frame stays pandas, as Polars would order it by text."""
    if not isinstance(node, cst.Call):
        return False
    func = node.func
    name = func.attr.value if isinstance(func, cst.Attribute) else \
        func.value if isinstance(func, cst.Name) else None
    if name == "Categorical":
        return _argument(node, "categories", 1) is not None
    if name == "CategoricalDtype":
        return _argument(node, "categories", 0) is not None
    if name == "astype" and isinstance(func, cst.Attribute):
        dtype = _argument(node, "dtype", 0)
        if isinstance(dtype, cst.Name):
            dtype = lookup(dtype.value)
        return isinstance(dtype, cst.Call) and orders_categories(dtype, lookup)
    return name in _CATEGORY_ORDERS and isinstance(func, cst.Attribute) \
        and isinstance(func.value, cst.Attribute) and func.value.attr.value == "cat"


def worth_remembering(node: cst.BaseExpression) -> bool:
    """A value bound to a name that `text_categories` may read through the name: a dtype
    (`order = pd.CategoricalDtype([...])`) or a list of categories."""
    return isinstance(node, (cst.List, cst.Tuple)) or orders_categories(node)


def _argument(node: cst.Call, keyword: str, position: int) -> cst.BaseExpression | None:
    for arg in node.args:
        if arg.keyword is not None and arg.keyword.value == keyword:
            return arg.value
    positional = [a for a in node.args if a.keyword is None and not a.star]
    return positional[position].value if position < len(positional) else None


def _text_list(node: cst.BaseExpression | None,
               lookup: Callable[[str], cst.BaseExpression | None] = lambda name: None
               ) -> tuple[str, ...] | None:
    if isinstance(node, cst.Name):  # categories bound to a name: `zones = ["low", "mid"]`
        node = lookup(node.value)
    if not isinstance(node, (cst.List, cst.Tuple)) or not node.elements \
            or not all(isinstance(e.value, cst.SimpleString) for e in node.elements):
        return None
    return tuple(str(e.value.evaluated_value) for e in node.elements)  # type: ignore[attr-defined]


# pandas code that makes Period values, which Polars has no type for (from_pandas keeps an
# extension column that no cast, sort or writer takes)
PERIOD_MAKERS = re.compile(r"to_period|period_range|\bPeriod(Index|Dtype)?\(")


def makes_periods(text: str, period_names: set[str] | frozenset[str] = frozenset()) -> bool:
    """Whether pandas code may store Period values: it makes them, or reads a name bound to
    some (`per = s.dt.to_period("M")` earlier)."""
    if PERIOD_MAKERS.search(text):
        return True
    if not period_names:
        return False
    try:
        tree = ast.parse(text.strip())
    except SyntaxError:
        return True
    return any(isinstance(n, ast.Name) and n.id in period_names for n in ast.walk(tree))


# Python code whose whole numbers can pass Int64 (9.2e18): a power other than 0, 1 or 2 or a
# fraction, a shift, factorial / comb / perm / prod / pow. pandas keeps such numbers exactly in
# an object column, which no Polars type holds: pl.Series and pl.from_pandas refuse them
PYTHON_INT_MAKERS = re.compile(
    r"\*\*\s*(?!\(?\s*(?:[012](?![\d.eE])|\d*\.\d))|<<|\b(?:factorial|comb|perm|prod|pow)\s*\(")


def makes_python_ints(text: str) -> bool:
    """Whether pandas code may compute whole numbers past Int64 (`10 ** g`, `math.factorial`,
    a dict of `2**70`): the frame that gets them stays pandas."""
    return bool(PYTHON_INT_MAKERS.search(text))
