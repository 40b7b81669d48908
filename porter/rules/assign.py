"""Changing columns: df["c"] = ..., assign, rename, drop, astype, df.columns = [...],
df.loc[mask, "c"] = ..., del df["c"]."""

from __future__ import annotations

import ast
from collections.abc import Iterable
from dataclasses import replace

import keyword

import libcst as cst

from porter.emit import code as emit
from porter.emit.code import Code
from porter.rules import rule
from porter.rules.io import polars_dtype
from porter.rules.ops import int64_lit
from porter.translate.context import (
    PandasCall, RuleContext, Unsupported, column_names, derive, derived_column,
    with_column_updates,
)
from porter.rules.strings import expanded_columns
from porter.translate.handover import makes_periods, orders_categories, text_categories
from porter.translate.values import Column, Frame, Opaque, PandasValue, Parts, Scalar, Value


def named(code: Code, name: str) -> tuple[Code | None, dict[str, Code]]:
    """An expression written under a column name: keyword form when the name allows it."""
    if code.text == emit.col(name).text:
        return None, {}
    if name.isidentifier() and not keyword.iskeyword(name):
        return None, {name: code}
    return code.method("alias", name), {}


def with_columns(frame: Frame, items: list[tuple[str, Code, str | None]]) -> Frame:
    args: list[object] = []
    kwargs: dict[str, object] = {}
    for name, code, _ in items:
        positional, keywords = named(code, name)
        if positional is not None:
            args.append(positional)
        kwargs.update(keywords)
    if not args and not kwargs:
        return frame
    code = frame.code.method("with_columns", *args, **kwargs)
    result = with_column_updates(frame, code, {name: dtype for name, _, dtype in items})
    return _text_labelled(result, [name for name, _, _ in items])


def _text_labelled(frame: Frame, names: Iterable[str]) -> Frame:
    """`frame` where pandas labels the columns `names` with text (written by a text key, or
    renamed to text), after a pivot on an integer key whose columns pandas labels by number."""
    if frame.int_labels_except is None:
        return frame
    kept = frame.int_labels_except
    return replace(frame, int_labels_except=(*kept, *(n for n in names if n not in kept)))


def value_expr(value: Value, frame: Frame, ctx: RuleContext) -> tuple[Code, str | None]:
    """A value assigned into a column of `frame`: an expression and its dtype."""
    if isinstance(value, Column):
        return ctx.bool_expr(value, frame), value.dtype
    if isinstance(value, Opaque) and value.is_const:
        if isinstance(value.const, (list, tuple)):
            # placed by position, as pandas places it (both raise on another length); whole
            # numbers beside a missing value are floats in pandas
            items = list(value.const)
            present = [v for v in items if v is not None]
            kwargs: dict[str, object] = {"nan_to_null": True}
            if len(present) < len(items) and present and all(
                    isinstance(v, int) and not isinstance(v, bool) for v in present):
                kwargs["dtype"] = emit.atom("pl.Float64")
            kind = {bool: "bool", int: "int", float: "float", str: "str"}.get(
                type(present[0])) if present and len({type(v) for v in present}) == 1 else None
            return emit.call("pl.Series", items, **kwargs), "float" if "dtype" in kwargs else kind
        if isinstance(value.const, dict):
            raise Unsupported("a dict assigned as a column: pandas makes its keys the values")
        kind = {bool: "bool", int: "int", float: "float", str: "str"}.get(type(value.const))
        # a whole number is int64 in pandas (Polars' pl.lit would make it Int32)
        return int64_lit(value.const) if kind == "int" else emit.pl("lit", value.const), kind
    if isinstance(value, Scalar):
        if value.agg is not None and value.agg.frame.rows == frame.rows:
            return value.agg.code, None
        return int64_lit(value.code) if value.pytype == "int" else emit.pl("lit", value.code), None
    if isinstance(value, Opaque) and any(s.status != "converted" for s in value.sites):
        # the script's own function (or another library) given data from a frame: it may well
        # return a Series, which pandas aligns on the index and pl.lit cannot hold
        raise Unsupported(f"`{_short(value.code.text)}` is computed from frame data by code porter "
                          "hands to pandas, and may be a Series: the statement stays pandas")
    per_row = _per_row(value.code.text) if isinstance(value, Opaque) else None
    if isinstance(value, Opaque) and (value.pytype in ("list", "tuple") or per_row):
        # a list is placed by position, one value per row (pandas raises on another length,
        # and so does Polars); Polars infers the type from the Python values
        ctx.lower(f"`{value.code.text}` is a list placed by position; Polars infers its type "
                  "from the Python values (a whole number beside a float is a float in both)", 0.95)
        if per_row == "numpy":
            return emit.call("pl.Series", value.code, nan_to_null=True), None
        # nan_to_null reads numpy arrays only: a NaN in a list (np.nan) is made missing here,
        # as pandas holds it (x != x only for NaN)
        return emit.call("pl.Series", Code(f"[None if x != x else x for x in {value.code.text}]")), None
    if isinstance(value, Opaque) and value.pytype == "int":
        return int64_lit(value.code), "int"  # arithmetic on whole numbers (len(df) * 2)
    if isinstance(value, Opaque):
        ctx.lower(f"`{value.code.text}` is taken to be a single value broadcast to every row", 0.8)
        return emit.pl("lit", value.code), None
    if isinstance(value, PandasValue):
        if any(site.key in INTERVAL_MAKERS for site in value.sites):
            # pandas' Interval values have no Polars type (from_pandas keeps an extension
            # column no writer takes): the statement and the frame stay pandas
            raise Unsupported("pandas' interval labels have no Polars type: the frame stays pandas")
        if makes_periods(value.code.text):
            # from_pandas keeps Period values as an extension column no cast or sort takes
            raise Unsupported("pandas' Period values have no Polars type: the frame stays pandas")
        if value.rows is None or value.rows != frame.rows:
            # pandas aligns the Series on the index: by position it could land on other rows
            raise Unsupported("a Series computed by pandas whose rows porter cannot match to "
                              "the frame's (pandas aligns it on the index): the statement stays "
                              "pandas")
        ctx.needs_review("a Series computed by pandas, row for row from this frame, is put back "
                         "by position; port the computation to an expression")
        series = emit.call("pl.Series", value.code, nan_to_null=True)
        made = made_categories(value.code.text)
        if made is not None:
            # pandas sorts and groups a Categorical in its categories' order: an Enum of them
            return series.method("cast", emit.pl("Enum", list(made))), "enum"
        return series, None
    raise Unsupported("this value cannot be assigned as a column")


def made_categories(text: str) -> tuple[str, ...] | None:
    """The categories of a Categorical the pandas code `text` makes with them written out;
    a TODO when it is given a dtype bound to a name (`astype(order)`): the statement is then
    kept on pandas, and the frame comes back with an Enum of the categories (engine)."""
    try:
        node = cst.parse_expression(text)
    except cst.ParserSyntaxError:
        return None
    if isinstance(node, cst.Call) and isinstance(node.func, cst.Attribute) \
            and node.func.attr.value == "astype" and node.args \
            and isinstance(node.args[0].value, cst.Name) and node.args[0].keyword is None \
            and node.args[0].value.value not in ("str", "int", "float", "bool", "object"):
        raise Unsupported(f"`astype({node.args[0].value.value})`: a dtype bound to a name may be a "
                          "Categorical, which pandas orders by its categories: the statement "
                          "stays pandas")
    made = text_categories(node)
    if made is None and orders_categories(node):
        raise Unsupported("a Categorical whose categories' order porter cannot read here: the "
                          "statement stays pandas")
    return made


_ARRAY_MAKERS = {"arange", "array", "asarray", "linspace", "repeat", "tile", "zeros", "ones",
                 "full", "empty", "concatenate", "cumsum", "random", "where", "select"}


def _per_row(text: str) -> str | None:
    """Code that makes one value per row, not a single value (pl.lit would give every row the
    whole list): "numpy" for a numpy array (`np.arange(n) - 5`), "list" for Python values (`[a, b]
    * 4`, `list(range(n))`); None otherwise."""
    try:
        node = ast.parse(text, mode="eval").body
    except SyntaxError:
        return None

    def numpy_call(node: ast.AST) -> bool:
        func = node.func if isinstance(node, ast.Call) else None
        names = []
        while isinstance(func, ast.Attribute):
            names.append(func.attr)
            func = func.value
        return isinstance(func, ast.Name) and func.id in ("np", "numpy") \
            and bool(set(names) & _ARRAY_MAKERS)

    def many(node: ast.AST) -> bool:
        if isinstance(node, (ast.List, ast.Tuple, ast.ListComp, ast.GeneratorExp)):
            return True
        if isinstance(node, ast.BinOp):
            return many(node.left) or many(node.right)
        if isinstance(node, ast.UnaryOp):
            return many(node.operand)
        if isinstance(node, ast.Call) and isinstance(node.func, ast.Name):
            return node.func.id in ("list", "range", "sorted", "reversed", "tuple")
        return numpy_call(node)

    if not many(node):
        return None
    while isinstance(node, ast.BinOp):  # np.arange(n) - 5 is still the numpy array's
        node = node.left
    return "numpy" if numpy_call(node) else "list"


# calls whose pandas result can hold Interval values (bins without labels)
INTERVAL_MAKERS = frozenset({"pd.cut", "pd.qcut"})


def _short(text: str, width: int = 40) -> str:
    """A call as `f(...)` when its text is long."""
    if len(text) <= width:
        return text
    return text[:text.index("(")] + "(...)" if "(" in text else text[:width - 3] + "..."


@rule("frame.setitem")
def setitem(call: PandasCall, ctx: RuleContext) -> Value:
    """df["c"] = expr -> df = df.with_columns(c=expr).

    Handles: a comparison that met a missing value is stored as False, like pandas; one value
    into several columns (df[["a", "b"]] = 0).
    Caveats: a Series from another frame aligns on the index in pandas: a TODO.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    key, value = call.args
    if isinstance(value, Parts) and isinstance(key, Opaque) and key.is_const:
        # df[["a", "b"]] = s.str.extract(pat): each part is an expression of the frame's rows
        names = column_names(key.const)
        columns = expanded_columns(value, names, frame, ctx)
        return with_columns(frame, [(n, *value_expr(c, frame, ctx)) for n, c in zip(names, columns)])
    if isinstance(key, Opaque) and isinstance(key.const, str):
        code, dtype = value_expr(value, frame, ctx)
        return with_columns(frame, [(key.const, code, dtype)])
    if isinstance(key, Opaque) and isinstance(key.const, list) and key.const \
            and all(isinstance(k, str) for k in key.const) \
            and isinstance(value, Opaque) and value.is_const \
            and not isinstance(value.const, (list, tuple, dict)):
        # df[["a", "b"]] = 0 broadcasts one value into every named column
        code, dtype = value_expr(value, frame, ctx)
        return with_columns(frame, [(k, code, dtype) for k in key.const])
    if isinstance(key, Opaque) and not key.is_const and key.pytype == "str":
        code, _ = value_expr(value, frame, ctx)
        new = frame.code.method("with_columns", code.method("alias", key.code))
        return with_column_updates(frame, new, {}) if frame.columns is None else \
            derive(frame, new, same_rows=True, columns=None)
    raise Unsupported("assigning to several columns or to a computed key")


@rule("frame.assign")
def assign(call: PandasCall, ctx: RuleContext) -> Value:
    """df.assign(c=expr, d=lambda d: ...) -> .with_columns(...).

    Handles: pandas evaluates the keywords in order, so a keyword that uses a column made by
    an earlier one starts a new with_columns.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    if call.args:
        raise Unsupported("assign takes keywords only")
    from porter.rules.elementwise import frame_lambda
    pending: list[tuple[str, Code, str | None]] = []
    made: set[str] = set()
    for name, value in call.kwargs.items():
        if isinstance(value, Opaque) and isinstance(value.node, cst.Lambda):
            # the lambda receives the frame with the earlier keywords' columns already in it
            value = frame_lambda(value.node, with_columns(frame, pending), ctx)
        if isinstance(value, Column) and value.refs & made:
            frame = with_columns(frame, pending)
            pending, made = [], set()
            value = _rebase(value, frame)
        code, dtype = value_expr(value, frame, ctx)
        pending.append((name, code, dtype))
        made.add(name)
    return with_columns(frame, pending)


def _rebase(column: Column, frame: Frame) -> Column:
    return Column(column.code, frame=frame, name=column.name, dtype=column.dtype,
                  null_is_false=column.null_is_false, refs=column.refs,
                  versions=tuple((n, frame.version(n)) for n in column.refs))


@rule("frame.rename")
def rename(call: PandasCall, ctx: RuleContext) -> Value:
    """df.rename(columns={...}) -> .rename({...}, strict=False).

    Handles: pandas ignores names that are not columns (strict=False does the same).
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "columns", "mapper", "axis", positional=1)
    mapping = call.arg("columns", None, None)
    if mapping is None:
        axis = call.const("axis", None, 0)
        if axis not in (1, "columns"):
            raise Unsupported("renaming index labels")
        mapping = call.arg("mapper", 0)
    if not (isinstance(mapping, Opaque) and isinstance(mapping.const, dict)):
        from porter.rules.selection import rename_function  # a lambda of string methods
        renamed = rename_function(frame, mapping, ctx)
        if not isinstance(renamed, dict):
            return renamed
        mapping = Opaque(emit.lit(renamed), const=renamed)
    names = {str(k): v for k, v in mapping.const.items()}
    if not all(isinstance(v, str) for v in names.values()):
        raise Unsupported("renaming to non-string names")
    columns = frame.columns
    if columns is not None:
        names = {k: v for k, v in names.items() if k in columns}
        after = [names.get(c, c) for c in columns]
        if len(set(after)) != len(after):
            raise Unsupported("the new names repeat a column name: pandas keeps two columns of "
                              "that name, Polars cannot")
        code = frame.code.method("rename", names) if names else frame.code
        new_columns = tuple(names.get(c, c) for c in columns)
    else:
        code = frame.code.method("rename", names, strict=False)
        new_columns = None
    if any(not isinstance(k, str) for k in mapping.const):
        ctx.lower("a column named by a number in pandas is named by text in Polars", 0.9)
    dtypes = tuple((names.get(k, k), v) for k, v in frame.dtypes)
    versions = tuple((names.get(k, k), v) for k, v in frame.versions)
    index = tuple(names.get(k, k) for k in frame.index)
    return _text_labelled(derive(frame, code, same_rows=True, columns=new_columns, dtypes=dtypes,
                                 versions=versions, index=index), names.values())


@rule("frame.drop")
def drop(call: PandasCall, ctx: RuleContext) -> Value:
    """df.drop(columns=[...]) / df.drop("c", axis=1) -> .drop(...)."""
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "labels", "columns", "axis", positional=1)
    if call.has("columns"):
        names = call.const("columns")
    else:
        if call.const("axis", None, 0) not in (1, "columns"):
            raise Unsupported("dropping rows by index label")
        names = call.const("labels", 0)
    return dropped(frame, column_names(names))


def dropped(frame: Frame, names: list[str]) -> Frame:
    """`frame` without the columns `names` (what porter knows of the others is kept)."""
    columns = tuple(c for c in frame.columns if c not in names) if frame.columns is not None else None
    return derive(frame, frame.code.method("drop", *names), same_rows=True, columns=columns,
                  dtypes=tuple((k, v) for k, v in frame.dtypes if k not in names))


@rule("frame.delitem")
def delitem(call: PandasCall, ctx: RuleContext) -> Value:
    """del df["c"] -> df = df.drop("c")."""
    frame = call.receiver
    assert isinstance(frame, Frame)
    key = call.args[0]
    if not (isinstance(key, Opaque) and isinstance(key.const, str)):
        raise Unsupported("deleting a computed key")
    return dropped(frame, [key.const])


@rule("frame.set_columns")
def set_columns(call: PandasCall, ctx: RuleContext) -> Value:
    """df.columns = [...] -> .rename(...) pairing old names with new ones by position.

    The columns pandas keeps in the index (a groupby's keys) are not among the names."""
    frame = call.receiver
    assert isinstance(frame, Frame)
    from porter.rules.selection import computed_names, data_columns
    value = computed_names(call.args[0])  # df.columns.str.strip()...: the names as a list
    old_names = data_columns(frame).method("collect_schema").method("names")
    if not (isinstance(value, Opaque) and isinstance(value.const, list)):
        if isinstance(value, Opaque):
            code = frame.code.method("rename", emit.call("dict", emit.call("zip", old_names, value.code)))
            ctx.lower("new names are computed at run time", 0.9)
            return derive(frame, code, same_rows=True, columns=None, dtypes=(), column_pairs=(),
                          int_labels_except=None)
        raise Unsupported("new column names from a pandas value")
    new = [str(v) for v in value.const]
    if len(set(new)) != len(new):
        raise Unsupported("the new names repeat a name: pandas keeps two columns of that name, "
                          "Polars cannot")
    if any(n in frame.index for n in new):
        raise Unsupported("a new name is the name of an index level: pandas keeps both, Polars "
                          "cannot")
    if frame.columns is not None:
        data = [c for c in frame.columns if c not in frame.index]
        if len(new) != len(data):
            raise Unsupported("the number of names differs from the number of columns")
        mapping = {o: n for o, n in zip(data, new) if o != n}
        code = frame.code.method("rename", mapping)
        kinds = tuple((n, k) for o, n in zip(frame.columns, [mapping.get(c, c) for c in frame.columns])
                      if (k := frame.dtype(o)))
        return derive(frame, code, same_rows=True, columns=tuple(mapping.get(c, c) for c in frame.columns),
                      dtypes=kinds, column_pairs=(), int_labels_except=None)
    code = frame.code.method("rename", emit.call("dict", emit.call("zip", old_names, new)))
    return derive(frame, code, same_rows=True, columns=(*frame.index, *new) if frame.index else tuple(new),
                  dtypes=(), column_pairs=(), int_labels_except=None)


_ARRAYS = ("series.values", "series.to_numpy", "frame.values", "frame.to_numpy")


@rule("frame.loc_setitem")
def loc_setitem(call: PandasCall, ctx: RuleContext) -> Value:
    """df.loc[mask, "c"] = v -> .with_columns(c=pl.when(mask).then(v).otherwise(pl.col("c"))).

    Handles: rows where the mask met a missing value keep their value (pandas' False); a new
    column is missing outside the mask, as pandas makes it.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    if len(call.args) != 3:
        raise Unsupported("loc assignment needs rows and one column")
    rows, column, value = call.args
    if not (isinstance(column, Opaque) and isinstance(column.const, str)):
        raise Unsupported("loc assignment to several or computed columns")
    name = column.const
    code, dtype = value_expr(value, frame, ctx)
    if isinstance(rows, Opaque) and rows.const == slice(None):
        return with_columns(frame, [(name, code, dtype)])
    if not isinstance(rows, Column):
        raise Unsupported("rows chosen by index label")
    if isinstance(value, Scalar) and value.pytype == "array" or isinstance(value, Opaque) \
            and any(s.key in _ARRAYS for s in value.sites):
        # an array of the chosen rows' values, placed by position over those rows only
        raise Unsupported("an array (.values / .to_numpy()) is placed over the chosen rows by "
                          "position: assign the expression itself (df[\"v\"] * 10)")
    exists = frame.columns is None or name in frame.columns
    if frame.columns is None:
        ctx.lower(f"column {name!r} is taken to exist already", 0.9)
    new = emit.when(ctx.expr(rows, frame), code, emit.col(name) if exists else None)
    return with_columns(frame, [(name, new, dtype if dtype == frame.dtype(name) else None)])


@rule("frame.astype", "series.astype")
def astype(call: PandasCall, ctx: RuleContext) -> Value:
    """astype(int / float / str / bool / "category") -> cast.

    Handles: bool to text writes True/False like pandas; numbers to bool count missing values
    as True (NaN is truthy in pandas).
    Caveats: pandas raises when casting missing values to int; Polars keeps them missing.
    """
    ctx.reject_unknown(call, "dtype", positional=1)
    receiver = call.receiver
    target = call.arg("dtype", 0)
    if isinstance(receiver, Column):
        code, dtype = cast_expr(receiver, target, ctx)
        return derived_column(receiver, code, dtype=dtype)
    assert isinstance(receiver, Frame)
    if isinstance(target, Opaque) and isinstance(target.const, dict):
        if not all(isinstance(name, str) for name in target.const):
            raise Unsupported("columns named by something other than text")
        items = []
        for name, kind in target.const.items():
            column = Column(emit.col(name), frame=receiver, name=name, dtype=receiver.dtype(name))
            code, dtype = cast_expr(column, Opaque(emit.lit(kind), const=kind), ctx)
            items.append((name, code, dtype))
        return with_columns(receiver, items)
    if receiver.columns is None:
        raise Unsupported("casting every column needs the column names (use a dict, or --data)")
    items = []
    for name in receiver.columns:
        column = Column(emit.col(name), frame=receiver, name=name, dtype=receiver.dtype(name))
        code, dtype = cast_expr(column, target, ctx)
        items.append((name, code, dtype))
    return with_columns(receiver, items)


def cast_expr(column: Column, target: Value, ctx: RuleContext) -> tuple[Code, str]:
    polars, kind = polars_dtype(target)
    code = column.code.method("fill_null", False) if column.null_is_false else column.code
    if kind == "str" and column.dtype in ("bool", None):
        if column.dtype is None:
            ctx.lower("booleans become true/false in Polars, True/False in pandas", 0.9)
        else:
            # True/False as pandas writes them; a missing value stays missing (pandas keeps
            # the NaN of a True/False column read with a blank: it is not "False")
            return code.method("replace_strict", {True: "True", False: "False"}), "str"
    if kind == "bool":
        if column.dtype == "str":
            return emit.binop(code, "!=", "").method("fill_null", True), "bool"
        if column.dtype in ("int", "float"):
            return code.method("cast", emit.atom(polars)).method("fill_null", True), "bool"
        if column.dtype == "bool":
            # a blank of a True/False column is NaN in pandas, which bool() makes True (a
            # comparison's missing value, pandas' False, was filled with False above)
            return code.method("fill_null", True), "bool"
        raise Unsupported("astype(bool) depends on the column type (use --data)")
    if kind == "int":
        ctx.lower("pandas raises on missing values when casting to int; Polars keeps them missing", 0.95)
    if kind in ("int", "float") and column.dtype == "str":
        # pandas reads each text as Python's int()/float() do, around spaces ("12 ", " 3 ")
        code = code.attr("str").method("strip_chars")
    if kind == "category" and column.dtype not in ("str", "category"):
        if column.dtype is not None:
            raise Unsupported(f"a category of {column.dtype} values: Polars' Categorical holds "
                              "text only (keep the column as it is, or cast it to text first)")
        ctx.lower("Polars' Categorical holds text only: the column is taken to be text", 0.9)
    return code.method("cast", emit.atom(polars)), kind

