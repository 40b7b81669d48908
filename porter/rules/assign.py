"""Changing columns: df["c"] = ..., assign, rename, drop, astype, df.columns = [...],
df.loc[mask, "c"] = ..., del df["c"]."""

from __future__ import annotations

import ast
import re
from collections.abc import Iterable
from dataclasses import replace

import keyword
import math

import libcst as cst

from porter.analysis.consumers import MODEL_ARRAY_METHODS
from porter.emit import code as emit
from porter.emit.code import Code
from porter.rules import rule
from porter.rules.io import dtype_spelling, polars_dtype
from porter.rules.io_options import datetime_text, duration_text, float_text
from porter.rules.ops import (
    MASKED_DTYPES, PYTHON_ONLY_NUMBERS, float32_possible, int64_lit, whole_float,
)
from porter.translate.context import (
    MIXED_COLUMN, PandasCall, RuleContext, Unsupported, column_names, derive, derived_column,
    row_labels_carried,
    floats_where_missing, mark_float_ints, mark_numbers, nullable_mark, set_nullable_ints,
    with_column_updates,
)
from porter.rules.strings import LIST_STR, expanded_columns, list_repr
from porter.translate.handover import (makes_periods, makes_python_ints, orders_categories,
                                       pandas_text, series_frame, text_categories)
from porter.translate.values import (
    MISSING, NOT_NULLABLE, Column, Frame, Indexed, Opaque, PandasValue, Parts, Scalar, Value,
    fresh_token,
)


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


_NULLABLE_INTS = {"Int64", "Int32", "Int16", "Int8", "UInt64", "UInt32", "UInt16", "UInt8"}


def value_mark(value: Value, ctx: RuleContext) -> str | None:
    """Whether a value assigned into a column makes it one of pandas' nullable integers: its
    dtype name, NOT_NULLABLE, or None when porter does not know (Frame.nullable_ints)."""
    if isinstance(value, Column) and (value.nullable_int is not None or ctx.nullable_ints_possible):
        return value.nullable_int
    if isinstance(value, (Opaque, Scalar)) and (not isinstance(value, Opaque) or value.is_const):
        return NOT_NULLABLE  # a constant, a list or a reduction: numpy's types in pandas
    if isinstance(value, Parts) or not ctx.nullable_ints_possible:
        return NOT_NULLABLE  # text; or nothing in the script makes nullable integers
    return None


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
        if kind == "float" and value.const != value.const:
            # np.nan is a float64 column of missing values in pandas (pl.lit(None) would be
            # of Polars' Null type, which fill_null(1) makes integer)
            return emit.pl("lit", None, dtype=emit.atom("pl.Float64")), "float"
        # a whole number is int64 in pandas (Polars' pl.lit would make it Int32)
        return int64_lit(value.const) if kind == "int" else emit.pl("lit", value.const), kind
    if isinstance(value, Scalar):
        if value.agg is not None and value.agg.frame.rows == frame.rows:
            return value.agg.code, None
        if value.values_of is not None and value.values_of.dtype == "str" \
                and not value.values_of.element:
            # list(s) of a text column, set where it is made: pandas makes a text column of
            # it by position, as the collected column placed by position is (a missing text
            # nan there, null here); of the frame's own rows, the column itself
            source = value.values_of
            if source.frame.rows == frame.rows:
                return ctx.expr(source, frame), "str"
            return source.frame.code.method("select", source.code).method("collect") \
                .method("to_series"), "str"
        if value.pytype is not None and value.pytype.split("[")[0] in ("list", "tuple"):
            # a list (tolist(), then changed in place: out.reverse()) is placed by position,
            # one value per row, as pandas places it (pl.lit would put it whole in every row)
            return emit.call("pl.Series", Code(
                f"[None if x != x else x for x in {value.code.text}]")), None
        return int64_lit(value.code) if value.pytype == "int" else emit.pl("lit", value.code), None
    per_row = _per_row(value.code.text) if isinstance(value, Opaque) else None
    if isinstance(value, Opaque) and any(s.status != "converted" for s in value.sites) \
            and not (per_row == "numpy" and not _SERIES_KEEPING.intersection(
                _names_and_attributes(value.code.text))):
        # the script's own function (or another library) given data from a frame: it may well
        # return a Series, which pandas aligns on the index and pl.lit cannot hold (a numpy
        # array, a model's predictions, is placed by position)
        raise Unsupported(f"`{_short(value.code.text)}` is computed from frame data by code porter "
                          "hands to pandas, and may be a Series: the statement stays pandas")
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
    if isinstance(value, Opaque) and value.code.text.isidentifier() \
            and not keyword.iskeyword(value.code.text) and value.pytype is None \
            and not value.choices:  # (choices: the texts every call of the function passes)
        # a name porter did not see built (`a, b = [], []`, `list()`, `sorted(...)`, a helper's
        # list): a list, tuple or range is placed by position, one value per row, as pandas
        # places it (both raise on another length); anything else is one value for every row
        # (pl.lit of a list would put the whole list in every row). Decided when it runs.
        name = value.code.text
        ctx.lower(f"`{name}` is of a type porter did not see: a list is placed by position, "
                  "any other value broadcast to every row (decided when it runs); Polars infers "
                  "a list's type from its Python values", 0.8)
        return Code(f"(pl.Series([None if x != x else x for x in {name}]) "
                    f"if isinstance({name}, (list, tuple, range)) else pl.lit({name}))"), None
    if isinstance(value, Opaque):
        ctx.lower(f"`{value.code.text}` is taken to be a single value broadcast to every row", 0.8)
        return emit.pl("lit", value.code), None
    if isinstance(value, PandasValue):
        if any(site.key in INTERVAL_MAKERS for site in value.sites):
            # pandas' Interval values have no Polars type (from_pandas keeps an extension
            # column no writer takes): the statement and the frame stay pandas
            raise Unsupported("pandas' interval labels have no Polars type: the frame stays pandas")
        if any(PYTHON_ONLY_NUMBERS in site.message for site in value.sites) \
                or makes_python_ints(value.code.text) or makes_python_ints(_function_text(value, ctx)):
            # Python's integers past Int64 or complex numbers (x ** 20, x ** 0.5 in a lambda):
            # pl.Series refuses them where they occur
            raise Unsupported(f"pandas' column may hold {PYTHON_ONLY_NUMBERS}: "
                              + FRAME_STAYS_PANDAS)
        if any(MIXED_COLUMN in site.message for site in value.sites):
            # text put into numbers (fillna, where, combine_first): an object column in
            # pandas, which pl.Series refuses or turns into text
            raise Unsupported("pandas makes a mixed (object) column here, which has no Polars "
                              "type: " + FRAME_STAYS_PANDAS)
        if re.search(r"""\.astype\((["'])category\1\)""", value.code.text):
            # a Categorical of numbers (text categories are ported): pl.Series makes it plain
            # integers, which lose its categories' order and the .cat accessor
            raise Unsupported("pandas' Categorical of numbers has no Polars type (Polars' "
                              "Categorical holds text): " + FRAME_STAYS_PANDAS)
        if makes_periods(value.code.text):
            # from_pandas keeps Period values as an extension column no cast or sort takes
            raise Unsupported("pandas' Period values have no Polars type: the frame stays pandas")
        if value.rows is None or value.rows != frame.rows:
            # pandas aligns the Series on the index: by position it could land on other rows
            raise Unsupported("a Series computed by pandas whose rows porter cannot match to "
                              "the frame's (pandas aligns it on the index): the statement stays "
                              "pandas")
        returned = returned_kinds(value, frame, ctx)
        _check_polars_type(returned)
        ctx.needs_review("a Series computed by pandas, row for row from this frame, is put back "
                         "by position; port the computation to an expression")
        series = emit.call("pl.Series", value.code, nan_to_null=True)
        made = made_categories(value.code.text)
        if made is not None:
            # pandas sorts and groups a Categorical in its categories' order: an Enum of them
            return series.method("cast", emit.pl("Enum", list(made))), "enum"
        if returned is not None and _families(returned) == {"list"} and returned <= {
                LIST_STR, "none"}:
            # lists of text, as str.split makes them: list.get for .str[i], and to_csv writes
            # them as pandas does
            return series, LIST_STR
        return series, None
    raise Unsupported("this value cannot be assigned as a column")


# -- what a function pandas maps over a column returns -------------------------------------------
#
# pandas keeps whatever the function returns; pl.Series(...) gives it a Polars type, which only
# exists when the values are of one kind: numbers (with missing ones), text, True/False, lists of
# text. Read from the function's `return`s (the script's own function or a lambda), each kind:
# "int", "float", "str", "bool", "none", "list[<kind of the items>]", "tuple", "dict", "set".

FRAME_STAYS_PANDAS = "the frame stays pandas"
_FAMILIES = {"int": "number", "float": "number", "str": "text", "bool": "True/False",
             "tuple": "tuples", "dict": "dicts", "set": "sets"}
_CONVERSIONS = {"float": "float", "int": "int", "str": "str", "repr": "str", "format": "str",
                "bool": "bool", "len": "int", "isinstance": "bool", "callable": "bool",
                "tuple": "tuple", "dict": "dict", "set": "set", "list": "list[?]",
                "sorted": "list[?]"}
_TEXT_METHODS = {"upper", "lower", "strip", "lstrip", "rstrip", "title", "capitalize",
                 "casefold", "replace", "format", "join", "zfill", "center", "ljust", "rjust",
                 "swapcase", "removeprefix", "removesuffix", "translate", "expandtabs"}
_TEXT_TESTS = {"startswith", "endswith", "isdigit", "isalpha", "isalnum", "isnumeric",
               "isdecimal", "isspace", "islower", "isupper", "istitle"}
_TEXT_SPLITS = {"split", "rsplit", "splitlines"}


def _families(kinds: frozenset[str]) -> set[str]:
    """The kinds that cannot share a Polars column with each other (missing goes with any)."""
    return {"list" if k.startswith("list[") else _FAMILIES[k] for k in kinds if k != "none"}


def _check_polars_type(kinds: frozenset[str] | None) -> None:
    """Unsupported (the statement and its frame stay pandas) when the values a function
    returns have no Polars type porter can carry: pl.Series fails on mixed kinds (or turns
    True into 1.0 beside a float), and lists of numbers, tuples, dicts and sets would reach
    rules that take them for text."""
    if kinds is None:
        return
    families = _families(kinds)
    if len(families) > 1:
        raise Unsupported(f"the function returns {' and '.join(sorted(families))} values: pandas "
                          "keeps them in one object column, which has no Polars type: "
                          + FRAME_STAYS_PANDAS)
    nested = [k for k in kinds if k in ("tuple", "dict", "set")
              or k.startswith("list[") and k != LIST_STR]
    if nested:
        raise Unsupported(f"the function returns {_FAMILIES.get(nested[0], 'lists')} (other than "
                          "lists of text), which porter does not carry in a Polars column: "
                          + FRAME_STAYS_PANDAS)


def _function_text(value: PandasValue, ctx: RuleContext) -> str:
    """The source of the script's own function a handed-over `s.map(f)` / `s.apply(f)` is
    given by name ("" for anything else)."""
    try:
        node = ast.parse(value.code.text.strip(), mode="eval").body
    except SyntaxError:
        return ""
    if not (isinstance(node, ast.Call) and isinstance(node.func, ast.Attribute)
            and node.func.attr in ("map", "apply") and ctx.function_def is not None):
        return ""
    given = node.args[0] if node.args else next(
        (k.value for k in node.keywords if k.arg in ("arg", "func")), None)
    found = ctx.function_def(given.id) if isinstance(given, ast.Name) else None
    return cst.Module([]).code_for_node(found) if isinstance(found, cst.FunctionDef) else ""


def returned_kinds(value: PandasValue, frame: Frame, ctx: RuleContext) -> frozenset[str] | None:
    """The kinds of value the function of a handed-over `s.map(f)` / `s.apply(f)` /
    `df.apply(f, axis=1)` returns, as far as its `return`s tell; None when it is not such a
    call or no return is read. A return porter cannot read is left out: the kinds read are
    among what pandas gets."""
    try:
        node = ast.parse(value.code.text.strip(), mode="eval").body
    except SyntaxError:
        return None
    if not (isinstance(node, ast.Call) and isinstance(node.func, ast.Attribute)
            and node.func.attr in ("map", "apply")):
        return None
    given = node.args[0] if node.args else next(
        (k.value for k in node.keywords if k.arg in ("arg", "func")), None)
    if isinstance(given, ast.Lambda):
        params, returns = given.args.args, [given.body]
    elif isinstance(given, ast.Name) and ctx.function_def is not None \
            and isinstance(found := ctx.function_def(given.id), cst.FunctionDef):
        try:
            tree = ast.parse(cst.Module([]).code_for_node(found).strip())
        except SyntaxError:
            return None
        function = tree.body[0]
        assert isinstance(function, ast.FunctionDef)
        params, returns = function.args.args, _returns_of(function)
    else:
        return None
    if not params:
        return None
    param = params[0].arg
    element = _element_kind(node.func.value, frame)
    local = _local_kinds(function, param, element) if not isinstance(given, ast.Lambda) else {}
    kinds: set[str] = set()
    for expression in returns:
        found_kinds = _kinds(expression, param, element, local)
        if found_kinds is not None:
            kinds |= found_kinds
    return frozenset(kinds) if kinds else None


def _local_kinds(function: ast.FunctionDef, param: str,
                 element: str | None) -> dict[str, set[str] | None]:
    """The kinds each local name of `function` can hold, from every statement that binds it
    (`total = 0` then `total += row[c]`: a number; `d = {}`: a dict); None for a name bound
    in a way porter cannot read (a loop variable, an unpacking, a call it does not know)."""
    bindings: dict[str, list[ast.AST]] = {}
    for stmt in ast.walk(function):
        if isinstance(stmt, (ast.Assign, ast.AnnAssign)):
            targets = stmt.targets if isinstance(stmt, ast.Assign) else [stmt.target]
            for target in targets:
                if isinstance(target, ast.Name):
                    bindings.setdefault(target.id, []).append(stmt)
                elif isinstance(target, (ast.Tuple, ast.List, ast.Starred)):  # unpacked
                    for name in ast.walk(target):
                        if isinstance(name, ast.Name):
                            bindings.setdefault(name.id, []).append(target)
        elif isinstance(stmt, ast.AugAssign) and isinstance(stmt.target, ast.Name):
            bindings.setdefault(stmt.target.id, []).append(stmt)
        else:  # bound where porter does not read a value: a loop, a with, an except, :=
            targets = [stmt.target] if isinstance(stmt, (ast.For, ast.AsyncFor, ast.NamedExpr,
                                                          ast.comprehension)) else \
                [i.optional_vars for i in stmt.items if i.optional_vars is not None] \
                if isinstance(stmt, (ast.With, ast.AsyncWith)) else []
            for name in (n for t in targets for n in ast.walk(t)):
                if isinstance(name, ast.Name):
                    bindings.setdefault(name.id, []).append(name)
            if isinstance(stmt, ast.ExceptHandler) and stmt.name:
                bindings.setdefault(stmt.name, []).append(stmt)
    local: dict[str, set[str] | None] = {}
    for name, binds in bindings.items():
        if name == param:
            continue
        kinds: set[str] | None = set()
        for bind in binds:
            if isinstance(bind, (ast.Assign, ast.AnnAssign)) and bind.value is not None:
                found = _kinds(bind.value, param, element)
            elif isinstance(bind, ast.AugAssign):
                found = set()  # the value it starts from decides: number + x stays a number
            else:
                found = None
            if found is None:
                kinds = None
                break
            kinds |= found
        local[name] = kinds if kinds else None
    return local


def _returns_of(function: ast.FunctionDef) -> list[ast.expr]:
    """The values a function's `return`s give (None for a bare one or for falling off the
    end), not those of functions defined inside it."""
    found: list[ast.expr] = []
    pending: list[ast.AST] = list(function.body)
    while pending:
        node = pending.pop()
        if isinstance(node, (ast.FunctionDef, ast.AsyncFunctionDef, ast.Lambda, ast.ClassDef)):
            continue
        if isinstance(node, ast.Return):
            found.append(node.value if node.value is not None else ast.Constant(None))
        pending.extend(ast.iter_child_nodes(node))
    if not isinstance(function.body[-1], (ast.Return, ast.Raise)):
        found.append(ast.Constant(None))  # it may fall off the end
    return found


def _element_kind(receiver: ast.expr, frame: Frame) -> str | None:
    """The kind of one value the function is given: the type of the column whose hand-over is
    `receiver` (porter wrote it: the same text as the column handed over again)."""
    from porter.translate.context import column_of
    from porter.translate.handover import to_pandas
    text = ast.unparse(receiver)
    names = frame.columns if frame.columns is not None else [
        n.value for n in ast.walk(receiver) if isinstance(n, ast.Constant) and isinstance(n.value, str)]
    for name in names:
        kind = frame.dtype(name)
        if kind not in ("int", "float", "str", "bool"):
            continue
        try:
            written = ast.unparse(ast.parse(to_pandas(column_of(frame, name)).text, mode="eval").body)
        except SyntaxError:
            continue
        if written == text:
            return kind
    return None


def _kinds(node: ast.expr, param: str, element: str | None,
           local: dict[str, set[str] | None] | None = None) -> set[str] | None:
    """The kinds of value `node` can be, one value `param` of kind `element` given (and the
    kinds of the function's `local` names); None when porter cannot tell."""
    def of(child: ast.expr) -> set[str] | None:
        return _kinds(child, param, element, local)

    if isinstance(node, ast.Constant):
        kind = {type(None): "none", bool: "bool", int: "int", float: "float",
                str: "str"}.get(type(node.value))
        return {kind} if kind else None
    if isinstance(node, ast.JoinedStr):
        return {"str"}
    if isinstance(node, ast.Name):
        if node.id == param:
            return {element} if element else None
        return (local or {}).get(node.id)
    if isinstance(node, ast.Attribute) and node.attr == "nan" and isinstance(node.value, ast.Name) \
            and node.value.id in ("np", "numpy", "math"):
        return {"float"}
    if isinstance(node, ast.Compare) or isinstance(node, ast.UnaryOp) and isinstance(node.op, ast.Not):
        return {"bool"}
    if isinstance(node, ast.BoolOp):  # `a or b` is one of them
        operands = [of(v) for v in node.values]
        return set().union(*operands) if all(k is not None for k in operands) else None  # type: ignore[arg-type]
    if isinstance(node, ast.UnaryOp) and isinstance(node.op, (ast.USub, ast.UAdd)):
        operand = of(node.operand)
        return operand if operand is not None and operand <= {"int", "float"} else None
    if isinstance(node, ast.IfExp):
        body, orelse = of(node.body), of(node.orelse)
        return body | orelse if body is not None and orelse is not None else None
    if isinstance(node, (ast.Tuple, ast.Dict, ast.DictComp, ast.Set, ast.SetComp)):
        return {{ast.Tuple: "tuple", ast.Dict: "dict", ast.DictComp: "dict"}.get(type(node), "set")}
    if isinstance(node, ast.List):
        items = [of(e) for e in node.elts]
        return {_list_of(items)}
    if isinstance(node, ast.ListComp):
        return {_list_of([of(node.elt)])}
    if isinstance(node, ast.BinOp):
        left, right = of(node.left), of(node.right)
        if left is None or right is None or len(left) != 1 or len(right) != 1:
            return None
        a, b = next(iter(left)), next(iter(right))
        if isinstance(node.op, ast.Mult) and a.startswith("list[") and b == "int":
            return {a}
        if isinstance(node.op, ast.Add) and a == b and (a == "str" or a.startswith("list[")):
            return {a}
        if a in ("int", "float") and b in ("int", "float"):
            if isinstance(node.op, ast.Div) or "float" in (a, b):
                return {"float"}
            return {"int"} if isinstance(node.op, (ast.Add, ast.Sub, ast.Mult, ast.FloorDiv,
                                                   ast.Mod)) else None
        return None
    if isinstance(node, ast.Call):
        func = node.func
        if isinstance(func, ast.Name) and func.id in _CONVERSIONS:
            return {_CONVERSIONS[func.id]}
        if isinstance(func, ast.Attribute):
            receiver = of(func.value)
            if func.attr in _TEXT_SPLITS:
                return {LIST_STR}  # text's own method: a list of text
            if receiver == {"str"}:
                if func.attr in _TEXT_METHODS:
                    return {"str"}
                if func.attr in _TEXT_TESTS:
                    return {"bool"}
    return None


def _list_of(items: list[set[str] | None]) -> str:
    """The kind of a list whose items have these kinds."""
    kinds = set().union(*(k for k in items if k is not None)) - {"none"} \
        if all(k is not None for k in items) else None
    return f"list[{next(iter(kinds))}]" if kinds is not None and len(kinds) == 1 else "list[?]"


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


# numpy functions that give a Series back when given one (np.cumsum(s) is s.cumsum(), with its
# labels), where the others give an array
_SERIES_KEEPING = frozenset({"cumsum", "repeat"})


def _names_and_attributes(text: str) -> set[str]:
    """The names and attribute names in a piece of code."""
    try:
        tree = ast.parse(text, mode="eval")
    except SyntaxError:
        return set()
    return {n.id if isinstance(n, ast.Name) else n.attr for n in ast.walk(tree)
            if isinstance(n, (ast.Name, ast.Attribute))}


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

    def model_array(node: ast.AST) -> bool:
        # a model's predictions or a transform's rows (km.fit_predict(X), scaler.fit_transform(
        # ...)), and a column of a 2-D array (pcs[:, 0]): numpy arrays, one value per row
        if isinstance(node, ast.Call) and isinstance(node.func, ast.Attribute):
            return node.func.attr in MODEL_ARRAY_METHODS
        return isinstance(node, ast.Subscript) and isinstance(node.slice, ast.Tuple) \
            and len(node.slice.elts) == 2 and isinstance(node.slice.elts[0], ast.Slice) \
            and node.slice.elts[0].lower is None and node.slice.elts[0].upper is None

    def many(node: ast.AST) -> bool:
        if isinstance(node, (ast.List, ast.Tuple, ast.ListComp, ast.GeneratorExp)):
            return True
        if model_array(node):
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
    return "numpy" if numpy_call(node) or model_array(node) else "list"


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
    into several columns (df[["a", "b"]] = 0); a Series pandas computed row for row (a map or
    apply under a TODO) put back by position, lists of text it returns kept lists; np.nan is a
    Float64 column of missing values, as pandas' float64. A frame of the same rows into several
    columns (df[["a", "b"]] = df[["a", "b"]].applymap(f)): its columns by position.
    A Series of another table labelled by the same one key (a groupby's result on that key) is
    aligned on the labels as pandas aligns it: a left join on the key column.
    Caveats: a Series from another frame aligned on other labels is a TODO. A function
    pandas maps whose `return`s give values of several kinds (number and text), lists of
    other values, tuples, dicts or sets keeps the statement and the frame on pandas (Polars
    has no column that holds them as pandas does); returns porter cannot read are taken to
    fit the others.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    if len(call.args) > 2:
        return _set_several(frame, call.args, ctx)
    key, value = call.args
    if isinstance(value, Parts) and isinstance(key, Opaque) and key.is_const:
        # df[["a", "b"]] = s.str.extract(pat): each part is an expression of the frame's rows
        names = column_names(key.const)
        columns = expanded_columns(value, names, frame, ctx)
        return set_nullable_ints(
            with_columns(frame, [(n, *value_expr(c, frame, ctx)) for n, c in zip(names, columns)]),
            {n: c.nullable_int or NOT_NULLABLE for n, c in zip(names, columns)})
    if isinstance(key, Opaque) and isinstance(key.const, str) and isinstance(value, Column) \
            and value.frame.rows != frame.rows and _labelled_alike(frame, value.frame):
        return _aligned_on_labels(frame, key.const, value, ctx)
    if isinstance(key, Opaque) and isinstance(key.const, str) and isinstance(value, Column) \
            and value.frame.rows != frame.rows and value.frame.reordered_from() == frame.rows \
            and frame.labels_distinct():
        return _set_by_place(frame, key.const, value, ctx)
    if isinstance(key, Opaque) and isinstance(key.const, str):
        code, dtype = value_expr(value, frame, ctx)
        result = set_nullable_ints(with_columns(frame, [(key.const, code, dtype)]),
                                   {key.const: value_mark(value, ctx)})
        if isinstance(value, Column) and value.float_int is not None:
            # still float64 in pandas when a value went missing (lost_float_ints)
            result = mark_float_ints(result, [key.const], value.float_int)
        result = typed_at_run_time(result, {key.const: value}) or result
        if isinstance(value, Column) and value.number and dtype is None \
                and value.frame.rows == frame.rows:
            # numbers whose type the data decided, as they were (Frame.numbers)
            result = mark_numbers(result, [key.const])
        return result
    if isinstance(key, Opaque) and isinstance(key.const, list) and key.const \
            and all(isinstance(k, str) for k in key.const) \
            and isinstance(value, Opaque) and value.is_const \
            and not isinstance(value.const, (list, tuple, dict)):
        # df[["a", "b"]] = 0 broadcasts one value into every named column
        code, dtype = value_expr(value, frame, ctx)
        return set_nullable_ints(with_columns(frame, [(k, code, dtype) for k in key.const]),
                                 dict.fromkeys(key.const, NOT_NULLABLE))
    if isinstance(key, Opaque) and isinstance(key.const, list) and key.const \
            and all(isinstance(k, str) for k in key.const) and isinstance(value, Frame) \
            and value.rows == frame.rows:
        return _frame_into_columns(frame, list(key.const), value)
    if isinstance(key, Opaque) and not key.is_const and key.pytype == "str":
        code, _ = value_expr(value, frame, ctx)
        new = frame.code.method("with_columns", code.method("alias", key.code))
        if key.choices and frame.columns is not None and set(key.choices) <= set(frame.columns):
            # a loop over names of the frame's columns: one of them is overwritten each round
            return with_column_updates(frame, new, dict.fromkeys(key.choices))
        return with_column_updates(frame, new, {}) if frame.columns is None else \
            derive(frame, new, same_rows=True, columns=None)
    raise Unsupported("assigning to several columns or to a computed key")


def _frame_into_columns(frame: Frame, keys: list[str], value: Frame) -> Frame:
    """df[["a", "b"]] = other, `other` a frame of the same rows (df[["a", "b"]].applymap(f)):
    pandas writes other's columns by position into the named ones (its first column into
    "a", ...; the rows aligned on labels, which are the same rows here), the existing ones in
    their places, new ones at the end, as with_columns writes them. The two plans are put side
    by side (a horizontal concat of the same rows; Polars reads their shared input once),
    other's columns under names of their own, then written into the named ones."""
    if value.columns is None:
        raise Unsupported("assigning a frame to several columns: its columns are not known")
    if frame.index or value.index:
        raise Unsupported("assigning a frame to several columns of a frame with an index of "
                          "its own")
    if len(value.columns) != len(keys) or len(set(keys)) != len(keys):
        # pandas raises "Columns must be same length as key"
        raise Unsupported("assigning a frame of another number of columns than the keys")
    held = [f"_porter_set_{i}" for i in range(len(keys))]
    side = value.code.method("select", *[emit.col(old).method("alias", tmp)
                                         for old, tmp in zip(value.columns, held)])
    code = emit.pl("concat", [frame.code, side], how="horizontal") \
        .method("with_columns", *[emit.col(tmp).method("alias", new)
                                  for tmp, new in zip(held, keys)]) \
        .method("drop", *held)
    result = with_column_updates(frame, code, {new: value.dtype(old)
                                               for old, new in zip(value.columns, keys)})
    result = set_nullable_ints(result, {new: nullable_mark(value, old) or NOT_NULLABLE
                                        for old, new in zip(value.columns, keys)})
    floats = dict(value.float_ints)
    for old, new in zip(value.columns, keys):
        if old in floats:
            result = mark_float_ints(result, [new], floats[old])
    return result


PLACE = "_porter_place"


def _set_by_place(frame: Frame, name: str, value: Column, ctx: RuleContext) -> Frame:
    """df["c"] = df.sort_values(k).groupby(g)["v"].cumsum(): the Series is computed on the
    frame's rows sorted, and pandas aligns it on the labels, which are distinct: each row gets
    the value computed for it. Each row's place is numbered (with_row_index) before the sort,
    the column computed in the sorted plan, and the rows sorted back by their place."""
    start, chain = frame.code, value.frame.code
    base, steps = start.base if start.base is not None else start.text, start.steps
    if chain.base != base or chain.steps[:len(steps)] != steps or len(chain.steps) == len(steps) \
            or PLACE in (frame.columns or ()):
        raise Unsupported("the Series comes from a sort of this frame written in a form porter "
                          "cannot number its rows in: pandas aligns it on the labels")
    numbered = start.method("with_row_index", PLACE)
    code = Code(numbered.text + "".join(chain.steps[len(steps):]), numbered.prec, numbered.base,
                numbered.steps + chain.steps[len(steps):])
    expr = value.code.method("fill_null", False) if value.null_is_false else value.code
    code = code.method("with_columns", expr.method("alias", name)).method("sort", PLACE) \
        .method("drop", PLACE)
    result = with_column_updates(frame, code, {name: value.dtype})
    result = set_nullable_ints(result, {name: value_mark(value, ctx)})
    # the column, now of the frame's own rows: typed as pandas types it where that depends
    # on a value going missing (a running sum in groups whose key is missing is float64)
    placed = replace(value, frame=result, code=emit.col(name), versions=())
    if value.float_int is not None:
        result = mark_float_ints(result, [name], value.float_int)
    return typed_at_run_time(result, {name: placed}) or result


ALIGNED = "_porter_aligned"

# A Series labelled by a key of distinct values set into a frame labelled by that key, as
# pandas aligns it (each row the value of its label); a frame without rows takes the Series'
# labels as its rows in pandas, its other columns missing there
ALIGNED_FUNCTION = "pandas_aligned"
ALIGNED_DEFINITION = '''\
def pandas_aligned(frame, values, key):
    """The frame with the columns of `values` (its labels `key` and the values) joined on
    `key` as pandas aligns a Series set into a frame: each row gets the value of its label
    (missing where the Series lacks it, a missing label matching a missing one); a frame
    without rows gets the Series' labels as its rows, as pandas gives it them."""
    joined = frame.join(values, on=key, how="left", nulls_equal=True, maintain_order="left")
    rows = frame.select(pl.len().alias("_porter_rows"))
    taken = (
        values.join(rows, how="cross", maintain_order="left")
        .filter(pl.col("_porter_rows") == 0)
        .drop("_porter_rows")
    )
    return pl.concat([joined, taken], how="diagonal_relaxed")
'''


def _labelled_alike(frame: Frame, other: Frame) -> bool:
    """Both tables labelled by the same one key column, the Series' each label once (a
    groupby's results on one key, in their own order): a Series of one set into the other is
    aligned on it. The frame's labels may repeat (set_index of a column, a table a function
    returned labelled by its key): pandas reindexes the Series to them, each row getting the
    value of its label, which a left join on the key gives too."""
    from porter.rules.selection import unique_key
    return len(frame.index) == 1 and frame.index == other.index and unique_key(other) \
        and (unique_key(frame) or not frame.index_unnamed)


def _aligned_on_labels(frame: Frame, name: str, value: Column, ctx: RuleContext) -> Frame:
    """stats["ha"] = other_table["ha"], both labelled by one key of distinct values: pandas
    aligns the Series on the labels (each row gets the value of its own label, NaN where the
    Series lacks it, a label only the Series has is dropped): a left join on the key column,
    missing keys matching each other as pandas' NaN labels do. The column keeps its place when
    it exists. An integer Series is float64 in pandas where a label went missing: made Float64
    there once the join has run; a True/False one becomes object with NaN in pandas: a TODO.
    A frame without rows is given the Series' labels as its rows, as pandas gives them."""
    key = frame.index[0]
    kinds = {frame.dtype(key), value.frame.dtype(key)}
    if len(kinds) > 1 and None not in kinds:
        raise Unsupported("labels of two types: pandas finds none of them in the other table")
    if value.dtype == "bool" or value.null_is_false:
        raise Unsupported("True/False values aligned on labels: pandas makes an object column "
                          "with NaN where a label is missing")
    if value.dtype is None:
        ctx.lower("the Series' type is not known: True/False values become an object column in "
                  "pandas where a label is missing (Boolean with null here)", 0.9)
    other = value.frame.code.method("select", emit.col(key), value.code.method("alias", ALIGNED))
    # a left join; a frame without rows takes the Series' labels as its rows (pandas_aligned)
    joined = replace(frame, code=emit.call(ALIGNED_FUNCTION, frame.code, other, key))
    result = with_columns(joined, [(name, emit.col(ALIGNED), value.dtype)])
    code = result.code.method("drop", ALIGNED)
    if value.dtype in ("int", None):
        # pandas' type is known once the join has run: float64 where a label went missing
        code = floats_where_missing(code, (name,), integers_only=True)
        result = replace(result, dtypes=tuple((c, t) for c, t in result.dtypes if c != name))
    return replace(result, code=code)


def typed_at_run_time(frame: Frame, values: dict[str, Value]) -> Frame | None:
    """`frame` (just given the columns `values`) with each column whose pandas type depends on
    missing values (Column.float_int: a date part, a text length, a count in a group whose key
    is missing, a dict's map or get, where() or replace() with NaN) given that type once it is
    computed: pandas' dt.month is float64 when a date is missing then, int32 otherwise, and
    stays so when the rows with the missing date are dropped later (written 3.0), which a lazy
    plan cannot pick by value: the frame is computed there and those columns holding a missing value are made
    Float64, as the frame a merge makes (rules/merge.py). Their dtype stays "int", porter's
    name for an integer column pandas makes float64 by its missing values (Frame.float_ints):
    what reads them as int (to_csv, astype(str), a reduction) gives the text of the Float64
    column for it, and a step that wants a number of another kind (pd.to_datetime of epoch
    numbers) stays a TODO as it was. None when no column needs it."""
    names = tuple(name for name, value in values.items()
                  if isinstance(value, Column) and value.float_int is not None
                  and not value.nullable_int and value.dtype in ("int", None)
                  and value.frame.rows == frame.rows)
    if not names:
        return None
    code = floats_where_missing(frame.code, names)
    # the mark has done its work: pandas' type is the column's own from here on
    float_ints = tuple(m for m in frame.float_ints if m[0] not in names)
    return replace(frame, code=code, float_ints=float_ints)


def _set_several(frame: Frame, args: tuple[Value, ...], ctx: RuleContext) -> Frame:
    """`df["a"], df["b"] = x, y` or `df["a"] = df["b"] = x` (the engine passes the keys and
    values in turn): Python computes every value before it sets a column, so each is an
    expression of the frame as it was, and one with_columns, which reads the frame it is given,
    sets them all (`df["a"], df["b"] = df["b"], df["a"]` swaps). A name set twice keeps the
    last value, in the place the first made."""
    values: dict[str, Value] = {}
    for key, value in zip(args[::2], args[1::2]):
        if not (isinstance(key, Opaque) and isinstance(key.const, str)):
            raise Unsupported("several columns set at once, one of them by a key that is not a "
                              "column name")
        values[key.const] = value
    result = set_nullable_ints(
        with_columns(frame, [(name, *value_expr(value, frame, ctx)) for name, value in values.items()]),
        {name: value_mark(value, ctx) for name, value in values.items()})
    for name, value in values.items():
        if isinstance(value, Column) and value.float_int is not None:
            result = mark_float_ints(result, [name], value.float_int)
    return typed_at_run_time(result, values) or result


@rule("frame.join")
def join_parts(call: PandasCall, ctx: RuleContext) -> Value:
    """df.join(df["c"].str.extract(pat)) -> with_columns of each named part; df.join(other)
    of two frames holding the same index keys -> LazyFrame.join on them (_join_on_index).

    The parts are made from the frame's own rows and carry its labels, so the join on the
    index pairs each row with its own parts whatever `how` and `sort` say, when the labels
    are 0..n-1 (unique).
    Caveats: other frames (aligned on row numbers or other keys), parts of a frame whose labels are no longer
    0..n-1, unnamed parts (labelled 0, 1, …), on= and parts named like a column (pandas raises
    without suffixes) are TODOs.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "other", "on", "how", "lsuffix", "rsuffix", "sort", "validate",
                       positional=5)
    other = call.arg("other", 0)
    advice = ("DataFrame.join aligns on the index: make the index a column and use "
              "LazyFrame.join(on=...)")
    if isinstance(other, Indexed) and not other.frame.index:
        # other.set_index("k"): its frame, the key held as its index
        other = replace(other.frame, index=(other.key,), index_unnamed=False)
    if isinstance(other, Column) and other.name is not None and other.frame.index \
            and not other.element and other.name not in other.frame.index:
        # a named Series labelled by key columns: the frame of its keys and its values
        # (pandas joins it as that one-column frame, also on= a column of the left)
        other = Frame(series_frame(other), columns=(*other.frame.index, other.name),
                      index=other.frame.index, index_unnamed=other.frame.index_unnamed,
                      dtypes=tuple((k, t) for k, t in other.frame.dtypes if k in other.frame.index)
                      + (((other.name, other.dtype),) if other.dtype else ()),
                      labels_intact=False)
    if isinstance(other, Frame) and not call.has("on"):
        return _join_on_index(frame, other, call, ctx, advice)
    if isinstance(other, Frame):
        return _join_on_column(frame, other, call, ctx, advice)
    if not isinstance(other, Parts) or call.has("on"):
        raise ctx.todo(advice)
    if not frame.labels_intact or frame.index:
        raise ctx.todo("the frame's row labels are no longer 0..n-1 (a label may repeat): "
                       + advice)
    if not other.width_known or not all(isinstance(label, str) for label, _ in other.fields):
        raise ctx.todo("parts without names (labelled 0, 1, …, as many as the longest row "
                       "for split): name them with (?P<name>...) groups")
    names = [label for label, _ in other.fields]
    if frame.columns is None:
        ctx.lower("the frame's columns are not known: pandas raises where a part is named like "
                  "one of them, Polars overwrites it", 0.95)
    elif set(names) & set(frame.columns):
        raise ctx.todo("a part named like a column of the frame (pandas raises without "
                       "lsuffix/rsuffix)")
    columns = expanded_columns(other, names, frame, ctx)
    return set_nullable_ints(
        with_columns(frame, [(n, *value_expr(c, frame, ctx)) for n, c in zip(names, columns)]),
        {n: c.nullable_int or NOT_NULLABLE for n, c in zip(names, columns)})


def _join_on_column(frame: Frame, other: Frame, call: PandasCall, ctx: RuleContext,
                    advice: str) -> Value:
    """df.join(other, on="k") of a frame labelled by its key (other.set_index("k"),
    read_csv(index_col="k"), a groupby's keys) -> LazyFrame.join of df's column k on other's
    key, how="left" or "inner".

    pandas matches each row's value of the column to the other frame's labels: the left's
    rows in their order, each with the right rows of its label in theirs (a label repeated
    there repeats the row), a missing value matching a missing label; the left keeps its own
    row labels (which then repeat), and the other frame's key is not added. An int column of
    the right frame is float64 in pandas where a left row found no label."""
    on = call.const("on", 1, None)
    names = [on] if isinstance(on, str) else on
    how = call.const("how", 2, "left", kinds=(str,))
    if not (isinstance(names, list) and names and all(isinstance(n, str) for n in names)):
        raise ctx.todo("on= other than column names: " + advice)
    if how not in ("left", "inner"):
        raise ctx.todo(f"how={how!r} with on=: " + advice)
    if call.const("sort", 5, False) is not False or call.has("validate") \
            or call.has("lsuffix") or call.has("rsuffix"):
        raise ctx.todo("sort, validate or suffixes: " + advice)
    keys = other.index
    if len(keys) != len(names) or other.index_unnamed or other.columns is None \
            or frame.columns is None or any(n not in frame.columns or n in frame.index
                                            for n in names):
        raise ctx.todo("on= needs the other frame labelled by as many named keys, and columns "
                       "of both frames that porter knows: " + advice)
    for name, key in zip(names, keys):
        kinds = (frame.dtype(name), other.dtype(key))
        if None in kinds or kinds[0] != kinds[1]:
            raise ctx.todo("a column and labels of different or unknown types (Polars joins "
                           "only keys of one type): " + advice)
    right_columns = [c for c in other.columns if c not in keys]
    if set(right_columns) & set(frame.columns):
        raise ctx.todo("columns of both frames share a name (pandas raises without "
                       "lsuffix/rsuffix): " + advice)
    right = other.code.method("select", *(emit.col(k).method("alias", n) if k != n else k
                                          for k, n in zip(keys, names)), *right_columns)
    code = frame.code.method("join", right, on=emit.names_arg(names), how=how,
                             nulls_equal=True, maintain_order="left_right")
    dtypes = {**{c: t for c, t in other.dtypes if c in right_columns}, **dict(frame.dtypes)}
    ints = [c for c in right_columns if other.dtype(c) == "int"] if how == "left" else []
    if ints:
        code = floats_where_missing(code, ints)
        dtypes = {c: t for c, t in dtypes.items() if c not in ints}
    columns = (*frame.columns, *right_columns)
    # the other frame's labels all different (a groupby's result): a left join keeps each row
    # once, in its place, and its label
    distinct = other.grouped_rows is not None and other.grouped_rows == other.rows
    return derive(frame, code, same_rows=how == "left" and distinct, columns=columns,
                  dtypes=tuple((c, dtypes[c]) for c in columns if c in dtypes),
                  versions=tuple((c, v) for c, v in frame.versions)
                  + tuple((c, fresh_token()) for c in right_columns),
                  float_ints=frame.float_ints, grouped_rows=None, sorted_rows=None)


def _join_on_index(frame: Frame, other: Frame, call: PandasCall, ctx: RuleContext,
                   advice: str) -> Value:
    """df.join(other) of two frames holding the same index keys in columns (a groupby's keys,
    set_index) -> LazyFrame.join on those keys, the left's rows in their order.

    pandas aligns the rows on their labels: each left row with the right rows of its label (a
    missing label matches a missing one, nulls_equal), in the left's order, then the right's;
    the result keeps the left's index. An int column of the right frame is float64 in pandas
    where a left row found no label (made Float64 once the join has run, as after a merge).
    how="outer" (one key): the labels of both, sorted, a missing one last; int columns of
    either side float64 where a label the other side lacks left them missing. `other` may be
    a named Series labelled by the same key (joined as its one-column frame)."""
    how = call.const("how", 2, "left", kinds=(str,))
    if how not in ("left", "inner", "outer"):
        raise ctx.todo(f"how={how!r}: " + advice)
    if how == "outer" and len(frame.index) != 1:
        raise ctx.todo("how='outer' on labels of several keys: " + advice)
    if call.const("sort", 5, False) is not False or call.has("validate") \
            or call.has("lsuffix") or call.has("rsuffix"):
        raise ctx.todo("sort, validate or suffixes: " + advice)
    keys = frame.index
    if not keys or other.index != keys or frame.index_unnamed or other.index_unnamed:
        raise ctx.todo("the frames do not hold the same named index keys: " + advice)
    for key in keys:
        kinds = (frame.dtype(key), other.dtype(key))
        if None in kinds or kinds[0] != kinds[1]:
            raise ctx.todo("index keys of different or unknown types (Polars joins only keys "
                           "of one type): " + advice)
    right_columns = None if other.columns is None else [c for c in other.columns if c not in keys]
    columns = None
    if frame.columns is not None and right_columns is not None:
        if set(right_columns) & set(frame.columns):
            raise ctx.todo("columns of both frames share a name (pandas raises without "
                           "lsuffix/rsuffix)")
        columns = (*frame.columns, *right_columns)
    else:
        ctx.lower("the columns of a frame are not known: pandas raises where both frames have "
                  "a column of one name, Polars suffixes the right one", 0.95)
    if how == "outer":
        # pandas' outer join on the labels: the union of both sides' labels, sorted (a
        # missing label last), the rows of one label in the left's order then the right's
        code = frame.code.method("join", other.code, on=emit.names_arg(keys), how="full",
                                 coalesce=True, nulls_equal=True,
                                 maintain_order="left_right") \
            .method("sort", keys[0], nulls_last=True, maintain_order=True)
    else:
        code = frame.code.method("join", other.code, on=emit.names_arg(keys), how=how,
                                 nulls_equal=True, maintain_order="left_right")
    dtypes = {**dict(other.dtypes), **dict(frame.dtypes)}
    ints = [c for c in right_columns or () if other.dtype(c) == "int"] if how == "left" else []
    if how == "outer":
        # a label one side lacks leaves the other side's columns missing: float64 in pandas
        left_columns = [c for c in frame.columns or () if c not in keys]
        ints = [c for c in left_columns if frame.dtype(c) == "int"] \
            + [c for c in right_columns or () if other.dtype(c) == "int"]
        if frame.columns is None or right_columns is None:
            raise ctx.todo("how='outer' of a frame whose columns porter does not know: " + advice)
    if ints:
        code = floats_where_missing(code, ints)
        dtypes = {c: t for c, t in dtypes.items() if c not in ints}
    return Frame(code, columns=columns, index=keys, labels_intact=False,
                 dtypes=tuple(dtypes.items()) if columns is None
                 else tuple((c, dtypes[c]) for c in columns if c in dtypes))


@rule("frame.assign")
def assign(call: PandasCall, ctx: RuleContext) -> Value:
    """df.assign(c=expr, d=lambda d: ...) -> .with_columns(...).

    Handles: pandas evaluates the keywords in order, so a lambda that uses a column made by
    an earlier one starts a new with_columns; a Series (not a lambda) was computed before the
    call, from the columns as they were (`assign(a=df["b"], b=df["a"])` swaps).
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    if call.args:
        raise Unsupported("assign takes keywords only")
    from porter.rules.elementwise import frame_lambda
    pending: list[tuple[str, Code, str | None]] = []
    made: dict[str, Value] = {}
    marks: dict[str, str | None] = {}  # pandas' nullable integers among them
    for name, value in call.kwargs.items():
        made_by_lambda = isinstance(value, Opaque) and isinstance(value.node, cst.Lambda)
        if made_by_lambda:
            # the lambda receives the frame with the earlier keywords' columns already in it
            value = frame_lambda(value.node, with_columns(frame, pending), ctx)  # type: ignore[union-attr]
        if made_by_lambda and isinstance(value, Column) and value.refs & set(made):
            frame = _assigned(frame, pending, marks, made)
            pending, made, marks = [], {}, {}
            value = _rebase(value, frame)
        code, dtype = value_expr(value, frame, ctx)
        pending.append((name, code, dtype))
        made[name] = value
        marks[name] = value_mark(value, ctx)
    return _assigned(frame, pending, marks, made)


def _assigned(frame: Frame, items: list[tuple[str, Code, str | None]],
              marks: dict[str, str | None], values: dict[str, Value]) -> Frame:
    """One with_columns of assign's keywords, each column typed as df[name] = value types it:
    an integer column pandas makes float64 by a missing value (Column.float_int) keeps the
    mark, and is made Float64 where it is computed when it holds one (typed_at_run_time)."""
    result = set_nullable_ints(with_columns(frame, items), marks)
    for name, value in values.items():
        if isinstance(value, Column) and value.float_int is not None:
            result = mark_float_ints(result, [name], value.float_int)
    return typed_at_run_time(result, values) or result


def _rebase(column: Column, frame: Frame) -> Column:
    return Column(column.code, frame=frame, name=column.name, dtype=column.dtype,
                  null_is_false=column.null_is_false, refs=column.refs,
                  nullable_int=column.nullable_int,
                  versions=tuple((n, frame.version(n)) for n in column.refs))


@rule("series.rename")
def series_rename(call: PandasCall, ctx: RuleContext) -> Value:
    """s.rename("name") -> the column named so (alias where it becomes a frame's column).

    Caveats: a dict or a function renames the index labels in pandas: a TODO."""
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call, "index", positional=1)
    name = call.const("index", 0, MISSING)
    if not isinstance(name, str):
        raise Unsupported("renaming by a dict, a function or None: pandas renames the index "
                          "labels (or drops the name)")
    if name in column.frame.index:
        raise Unsupported("the new name is an index key's: pandas keeps both, Polars cannot")
    return replace(column, name=name, sites=())


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
    # a renamed column is another column to a Series taken under its new name before
    versions = tuple((k, v) for k, v in frame.versions if k not in names and k not in names.values()) \
        + tuple((new, fresh_token()) for new in names.values())
    index = tuple(names.get(k, k) for k in frame.index)
    result = derive(frame, code, same_rows=True, columns=new_columns, dtypes=dtypes,
                    versions=versions, index=index)
    return _text_labelled(_renamed_marks(result, frame, names), names.values())


def _renamed_marks(result: Frame, frame: Frame, names: dict[str, str]) -> Frame:
    """`result`, `frame` with columns renamed `names` (old: new), with the marks of pandas'
    nullable integers (Frame.nullable_ints) following the names."""
    if frame.nullable_ints is None:
        return result
    marks = {names.get(n, n): nullable_mark(frame, n) for n in
             [*dict(frame.nullable_ints), *frame.unsure_ints, *names]}
    return set_nullable_ints(replace(result, nullable_ints=(), unsure_ints=()), marks)


@rule("frame.drop")
def drop(call: PandasCall, ctx: RuleContext) -> Value:
    """df.drop(columns=[...]) / df.drop("c", axis=1) -> .drop(...)."""
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "labels", "columns", "axis", "index", positional=1)
    if call.has("index"):
        if call.has("columns") or call.has("labels", 0):
            raise Unsupported("index= with labels= or columns=")
        return _rows_dropped(frame, call.const("index", None, None, kinds=(str, int, list)), ctx)
    if call.has("columns"):
        names = call.const("columns")
    else:
        if call.const("axis", None, 0) not in (1, "columns"):
            return _rows_dropped(frame, call.const("labels", 0, None, kinds=(str, int, list)),
                                 ctx)
        names = call.const("labels", 0)
    return dropped(frame, column_names(names))


def _rows_dropped(frame: Frame, labels: object, ctx: RuleContext) -> Frame:
    """df.drop(index=labels) of a table labelled by one key column (a pivot's or groupby's
    keys, set_index): the rows whose key is one of the labels filtered out, every such row,
    as pandas drops every row holding the label. A row whose key is missing stays.
    pandas raises KeyError for a label no row holds, where here nothing is dropped (0.9)."""
    wanted = labels if isinstance(labels, list) else [labels]
    if len(frame.index) != 1 or row_labels_carried(frame) or not wanted:
        raise Unsupported("dropping rows by index label (a table labelled by one key column "
                          "is ported)")
    key = frame.index[0]
    kinds = {str: "str", int: "int"}
    if any(isinstance(w, bool) or kinds.get(type(w)) != frame.dtype(key) for w in wanted):
        raise Unsupported("dropping rows by a label of another type than the key column (or "
                          "a key of unknown type)")
    ctx.lower("a label no row holds: pandas raises KeyError, here no row is dropped", 0.9)
    keep = emit.unary("~", emit.col(key).method("is_in", wanted).method("fill_null", False))
    return derive(frame, frame.code.method("filter", keep), same_rows=False)


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
    from porter.rules.selection import LevelNames
    given = call.args[0]
    if isinstance(given, Scalar) and given.pytype == "names.formatted" \
            and given.of is not None and given.of.code.text == frame.code.text:
        # df.columns = df.columns.strftime(format) right after a pivot on a date key: the pivot
        # named them so already (frame.columns.strftime); nothing is written
        return replace(frame, dates_as_text=None)
    if frame.dates_as_text is not None:
        raise Unsupported("new names for a pivot's date columns other than their strftime")
    value = computed_names(call.args[0])  # df.columns.str.strip()...: the names as a list
    if isinstance(value, LevelNames) and value.of == frame.code:
        # df.columns = df.columns.droplevel(n) where the data decides which columns there
        # are: each flat name it has gets its level's name
        new_names = [n for _, n in value.renames]
        if len(set(new_names)) != len(new_names) or set(new_names) & set(frame.index):
            raise Unsupported("the new names repeat a name: pandas keeps two columns of that "
                              "name, Polars cannot")
        return derive(frame, frame.code.method("rename", dict(value.renames), strict=False),
                      same_rows=True, columns=None, dtypes=(), column_pairs=(),
                      int_labels_except=None, columns_name=None,
                      nullable_ints=_marks_after_renaming(frame), unsure_ints=())
    comprehended = _names_comprehension(value, frame, ctx)
    if comprehended is not None:
        value = Opaque(emit.lit(comprehended), const=comprehended)
    old_names = data_columns(frame).method("collect_schema").method("names")
    if not (isinstance(value, Opaque) and isinstance(value.const, list)):
        if isinstance(value, Opaque):
            code = frame.code.method("rename", emit.call("dict", emit.call("zip", old_names, value.code)))
            ctx.lower("new names are computed at run time", 0.9)
            return derive(frame, code, same_rows=True, columns=None, dtypes=(), column_pairs=(),
                          int_labels_except=None, columns_name=None,
                          nullable_ints=_marks_after_renaming(frame), unsure_ints=())
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
        result = derive(frame, code, same_rows=True, columns=tuple(mapping.get(c, c) for c in frame.columns),
                        dtypes=kinds, column_pairs=(), int_labels_except=None, columns_name=None)
        return _renamed_marks(result, frame, mapping)
    code = frame.code.method("rename", emit.call("dict", emit.call("zip", old_names, new)))
    return derive(frame, code, same_rows=True, columns=(*frame.index, *new) if frame.index else tuple(new),
                  dtypes=(), column_pairs=(), int_labels_except=None, columns_name=None,
                  nullable_ints=_marks_after_renaming(frame), unsure_ints=())


def _names_comprehension(value: Value, frame: Frame, ctx: RuleContext) -> list[str] | None:
    """df.columns = [c.strip().lower().replace(" ", "_") for c in df.columns]: the new names
    computed now, by the same Python string methods on each name, when porter knows the
    columns (None: not such a comprehension, or the names are not known)."""
    from porter.rules.selection import (
        ColumnNames, apply_name_ops, known_data_columns, lambda_name_ops,
    )
    node = value.node if isinstance(value, Opaque) else None
    if not isinstance(node, cst.ListComp):
        return None
    loop = node.for_in
    if loop.inner_for_in is not None or loop.ifs or loop.asynchronous is not None \
            or not isinstance(loop.target, cst.Name):
        return None
    names = ctx.evaluate(loop.iter, {})
    if not (isinstance(names, Scalar) and names.of is not None
            and names.of.code.text == frame.code.text):
        return None
    known = known_data_columns(frame)
    if known is None:
        return None
    ops = lambda_name_ops(cst.Lambda(
        params=cst.Parameters(params=[cst.Param(name=cst.Name(loop.target.value))]), body=node.elt))
    if ops is None:
        return None
    before = names.ops if isinstance(names, ColumnNames) else ()
    return [apply_name_ops(apply_name_ops(c, before), ops) for c in known]


def _marks_after_renaming(frame: Frame) -> tuple[tuple[str, str], ...] | None:
    """Frame.nullable_ints after the columns were renamed by names porter does not pair with
    the old ones: none still when the frame held none, else not known."""
    return None if frame.nullable_ints or frame.unsure_ints else frame.nullable_ints


@rule("frame.columns.name")
def set_columns_name(call: PandasCall, ctx: RuleContext) -> Value:
    """df.columns.name = None -> nothing: a Polars frame's columns carry no name.

    A name given (not None) shows in pandas' printing and becomes melt's variable column:
    a TODO."""
    frame = call.receiver
    assert isinstance(frame, Frame)
    value = call.args[0]
    if not (isinstance(value, Opaque) and value.is_const and value.const is None):
        raise Unsupported("a name for the columns: pandas prints it and melt names the variable "
                          "column after it; Polars columns have no name (pass var_name= to "
                          "unpivot)")
    return replace(frame, columns_name=None)  # melt calls its variable column "variable" again


_ARRAYS = ("series.values", "series.to_numpy", "frame.values", "frame.to_numpy")


@rule("frame.loc_setitem")
def loc_setitem(call: PandasCall, ctx: RuleContext) -> Value:
    """df.loc[mask, "c"] = v -> .with_columns(c=pl.when(mask).then(v).otherwise(pl.col("c"))).

    Handles: rows where the mask met a missing value keep their value (pandas' False); a new
    column is missing outside the mask, as pandas makes it; a new column given a whole number
    is Float64, as pandas makes it float64 whatever the mask (all True too); where the columns
    are not known, the column's values where the frame has it and missing values where it is
    new (a whole number then makes a new column Int64: 0.9). Several columns listed
    (df.loc[mask, ["a", "b"]] = 0, or one value each: = [0, 1.5]): one with_columns, each
    column typed as pandas types it (_loc_several).
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    if len(call.args) != 3:
        raise Unsupported("loc assignment needs rows and one column")
    rows, column, value = call.args
    if isinstance(column, Opaque) and isinstance(column.const, list) and column.const \
            and all(isinstance(c, str) for c in column.const):
        return _loc_several(frame, rows, column.const, value, ctx)
    if not (isinstance(column, Opaque) and isinstance(column.const, str)):
        raise Unsupported("loc assignment to several or computed columns")
    name = column.const
    code, dtype = value_expr(value, frame, ctx)
    if frame.columns is not None and name in frame.columns and frame.dtype(name) == "int" \
            and isinstance(value, Opaque) and isinstance(value.const, (float, bool)):
        # pandas writes a float into its int64 column only when no value is lost (3.0 is 3,
        # the column stays int64), and refuses 3.5, 1e30 or True ("Invalid value ... for dtype
        # 'int64'"), whatever the rows; NaN makes the column float64 (value_expr's float null)
        number = value.const
        if isinstance(number, bool) or number == number and not (
                math.isfinite(number) and number.is_integer() and -2**63 <= number < 2**63):
            raise Unsupported(f"pandas refuses {number!r} in its int64 column {name!r} (the "
                              "statement stays pandas)")
        if number == number:
            code, dtype = int64_lit(int(number)), "int"
    elif frame.dtype(name) is None and (frame.columns is None or name in frame.columns) \
            and whole_float(value) is not None:
        # a column of a type porter does not know: pandas puts a whole float into its int64
        # column as the int (the column stays int64, written 0) and into a float64 one as
        # the float; an Int64 literal does both (a Float64 column takes it as a float)
        code, dtype = int64_lit(whole_float(value)), None
    elif frame.columns is not None and name in frame.columns and frame.dtype(name) == "int" \
            and (isinstance(value, Scalar) or isinstance(value, Opaque) and not value.is_const) \
            and dtype != "int" and getattr(value, "pytype", None) != "int":
        ctx.lower(f"a value computed when the script runs, put into the int column {name!r}: "
                  "pandas keeps int64 when it is a whole number (2.0 is written 2) and refuses "
                  "2.5; here a float makes the column float (2.0)", 0.8)
    if _missing_into_nullable_int(frame, name, value):
        # NaN, None or pd.NA into one of pandas' nullable integer columns: a missing value of
        # the column's own type (Int64 stays Int64, <NA>), not a float column
        code, dtype = emit.pl("lit", None), "int"
    mark = _loc_mark(frame, name, value, dtype, ctx)
    if isinstance(rows, Opaque) and rows.const == slice(None):
        return set_nullable_ints(with_columns(frame, [(name, code, dtype)]), {name: mark})
    if not isinstance(rows, Column):
        raise Unsupported("rows chosen by index label")
    if isinstance(value, Scalar) and value.pytype == "array" or isinstance(value, Opaque) \
            and any(s.key in _ARRAYS for s in value.sites):
        # an array of the chosen rows' values, placed by position over those rows only
        raise Unsupported("an array (.values / .to_numpy()) is placed over the chosen rows by "
                          "position: assign the expression itself (df[\"v\"] * 10)")
    exists = frame.columns is None or name in frame.columns
    if frame.columns is None and dtype in ("int", None):
        ctx.lower(f"the columns are not known: if {name!r} is new, a whole number makes it "
                  "Int64 here where pandas makes it float64", 0.9)
    if not exists and dtype == "int":
        # a new column is NaN outside the mask: pandas makes it float64 whatever the mask
        # (all True too), and it stays float after fillna
        code = emit.pl("lit", float(value.const)) if isinstance(value, Opaque) \
            and isinstance(value.const, int) else code.method("cast", emit.atom("pl.Float64"))
        dtype = "float"
    kept_values = emit.col(name) if frame.columns is not None else emit.pl(
        # the column when the frame has it, missing values when it does not (a new column)
        "coalesce", emit.call("pl.selectors.by_name", name, require_all=False), emit.pl("lit", None))
    new = emit.when(ctx.expr(rows, frame), code, kept_values if exists else None)
    # a new column of True/False or text is missing outside the mask: pandas' object (str)
    # column with NaN, as a read with a blank gives (tolist() shows nan there, not None)
    kept = dtype == frame.dtype(name) or not exists and dtype in ("float", "bool", "str")
    return set_nullable_ints(with_columns(frame, [(name, new, dtype if kept else None)]),
                             {name: mark})


_SCALARS = (bool, int, float, str, type(None))


def _missing_into_nullable_int(frame: Frame, name: str, value: Value) -> bool:
    """Whether `value` is a missing constant (None, NaN, pd.NA) written into column `name`,
    which porter knows to be one of pandas' nullable integers (Int64...): pandas keeps the
    column's type, where a numpy int64 column becomes float64."""
    given = value.const if isinstance(value, Opaque) and value.is_const else 0
    missing = given is None or isinstance(given, float) and given != given
    return missing and frame.columns is not None and name in frame.columns \
        and nullable_mark(frame, name) in _NULLABLE_INTS


def _loc_several(frame: Frame, rows: Value, names: list[str], value: Value,
                 ctx: RuleContext) -> Frame:
    """df.loc[mask, ["a", "b"]] = v (or = [va, vb], one value per column) -> one with_columns
    of pl.when(mask).then(v).otherwise(pl.col(c)) per column.

    pandas 3.1 writes the value into each column's own type, whatever rows the mask chose (none
    too): 0 or 2.0 into an int64 column keeps it int64 (written 2), NaN or None makes it
    float64 (even where no row is chosen), 0.5 or True into it raises; an int64 column given a
    float, or a float64 one given a whole number, is float; text goes into text only and
    True/False into True/False only (anything else raises, as does a number into a date). A new
    column is missing outside the mask: float64 for a number, text for text. A missing value in
    the mask (a comparison with NaN, pandas' nullable boolean) chooses no row, as pl.when does.
    """
    if frame.columns is None:
        raise Unsupported("loc assignment to several columns of a frame whose columns porter "
                          "does not know")
    if len(set(names)) != len(names):
        raise Unsupported("loc assignment naming a column twice")
    if not isinstance(rows, Column):
        raise Unsupported("loc assignment to several columns: rows chosen by index label or "
                          "a slice")
    if not isinstance(value, Opaque) or not value.is_const:
        raise Unsupported("loc assignment to several columns of a value computed when the "
                          "script runs (pandas aligns a Series or frame on its labels)")
    if isinstance(value.const, (list, tuple)):
        if len(value.const) != len(names):
            raise Unsupported("a list of values whose length is not the number of columns")
        values = list(value.const)
    else:
        values = [value.const] * len(names)
    if not all(isinstance(v, _SCALARS) for v in values):
        raise Unsupported("loc assignment of values other than numbers, text, True/False or "
                          "None to several columns")
    mask = ctx.expr(rows, frame)
    items: list[tuple[str, Code, str | None]] = []
    marks: dict[str, str | None] = {}
    for name, given in zip(names, values):
        code, dtype = _loc_typed(frame, name, given)
        if _missing_into_nullable_int(frame, name, Opaque(emit.lit(given), const=given)):
            code, dtype = emit.pl("lit", None), "int"  # the column stays Int64 (<NA>)
        exists = name in frame.columns
        items.append((name, emit.when(mask, code, emit.col(name) if exists else None), dtype))
        marks[name] = _loc_mark(frame, name, Opaque(emit.lit(given), const=given), dtype, ctx)
    return set_nullable_ints(with_columns(frame, items), marks)


def _loc_typed(frame: Frame, name: str, given: object) -> tuple[Code, str]:
    """The value `given` as pandas writes it into column `name` of `frame` under a mask (see
    _loc_several): its expression and the column's type after."""
    assert frame.columns is not None
    kind = frame.dtype(name) if name in frame.columns else "new"
    missing = given is None or isinstance(given, float) and given != given
    number = isinstance(given, (int, float)) and not isinstance(given, bool)
    float_null = emit.pl("lit", None, dtype=emit.atom("pl.Float64"))
    refused = Unsupported(f"pandas refuses {given!r} in its {kind} column {name!r} (the "
                          "statement stays pandas)")
    if kind == "new":
        if missing:
            return float_null, "float"
        if number:
            return emit.pl("lit", float(given)), "float"
        if isinstance(given, str):
            return emit.pl("lit", given), "str"
        raise Unsupported(f"True/False into the new column {name!r}: pandas makes it an object "
                          "column with NaN outside the mask")
    if kind == "int":
        if missing:
            return float_null, "float"  # float64 in pandas even when the mask chose no row
        if isinstance(given, int) and not isinstance(given, bool) and -2**63 <= given < 2**63:
            return int64_lit(given), "int"
        if isinstance(given, float) and math.isfinite(given) and given.is_integer() \
                and -2**63 <= given < 2**63:
            return int64_lit(int(given)), "int"  # pandas keeps int64: 2.0 is written 2
        raise refused
    if kind == "float":
        if missing:
            return float_null, "float"
        if number:
            return emit.pl("lit", float(given)), "float"
        raise refused
    if kind == "str":
        if missing:
            return emit.pl("lit", None, dtype=emit.atom("pl.String")), "str"
        if isinstance(given, str):
            return emit.pl("lit", given), "str"
        raise refused
    if kind == "bool":
        if isinstance(given, bool):
            return emit.pl("lit", given), "bool"
        raise refused
    raise Unsupported(f"loc assignment into the column {name!r}, "
                      + (f"a {kind} column" if kind else "whose type porter does not know")
                      + ": pandas' result type depends on it")


def _loc_mark(frame: Frame, name: str, value: Value, dtype: str | None,
              ctx: RuleContext) -> str | None:
    """Whether column `name` is one of pandas' nullable integers after df.loc[rows, name] =
    value (Frame.nullable_ints): pandas writes the values into the column it has, so one of
    its nullable integers given whole numbers stays one; a new column is what the value is."""
    given = value_mark(value, ctx)
    if not ctx.nullable_ints_possible or frame.columns is not None and name not in frame.columns:
        return given
    existing = nullable_mark(frame, name)
    if existing == given or existing and given == NOT_NULLABLE and dtype == "int":
        return existing
    return None


# astype(str) of a float column that may be float32: numpy's text of each float32 value
# (values.astype(str)), Python's repr of a float64 one, a missing value missing
FLOAT_TEXT_EITHER = (
    "lambda s: pl.Series(s.name, s.to_numpy().astype(str), dtype=pl.String).replace(\"nan\", None) "
    "if s.dtype == pl.Float32 else pl.Series(s.name, [None if v is None else repr(v) "
    "for v in s.to_list()], dtype=pl.String)")


@rule("frame.astype", "series.astype")
def astype(call: PandasCall, ctx: RuleContext) -> Value:
    """astype(int / float / str / bool / "category") -> cast.

    Handles: bool to text writes True/False like pandas; integers to text write "7.0" where
    the column holds a missing value (float in pandas), decided over the whole column at run
    time; numbers to bool count missing values as True (NaN is truthy in pandas).
    pandas' nullable integers (astype("Int64")) are Polars integers, marked so: to_csv writes
    them as ints beside a missing value (2024, where a plain int column is float64: 2024.0),
    and a hand-over to pandas gives them back their dtype.
    Caveats: pandas raises when casting missing values to int; Polars keeps them missing.
    """
    ctx.reject_unknown(call, "dtype", positional=1)
    receiver = call.receiver
    target = call.arg("dtype", 0)
    if isinstance(receiver, Column):
        code, dtype = cast_expr(receiver, target, ctx)
        return replace(derived_column(receiver, code, dtype=dtype), nullable_int=cast_mark(target))
    assert isinstance(receiver, Frame)
    if isinstance(target, Opaque) and isinstance(target.const, dict):
        if not all(isinstance(name, str) for name in target.const):
            raise Unsupported("columns named by something other than text")
        if any(name in receiver.index for name in target.const):
            raise Unsupported("a key pandas keeps in the index (pandas raises KeyError)")
        items = []
        for name, kind in target.const.items():
            column = Column(emit.col(name), frame=receiver, name=name, dtype=receiver.dtype(name))
            code, dtype = cast_expr(column, Opaque(emit.lit(kind), const=kind), ctx)
            items.append((name, code, dtype))
        return set_nullable_ints(with_columns(receiver, items), {
            name: cast_mark(Opaque(emit.lit(kind), const=kind)) for name, kind in target.const.items()})
    if receiver.columns is None:
        raise Unsupported("casting every column needs the column names (use a dict, or --data)")
    items = []
    # the columns, never the index (a groupby's keys, row labels), which pandas leaves as it is
    names = [name for name in receiver.columns if name not in receiver.index]
    for name in names:
        column = Column(emit.col(name), frame=receiver, name=name, dtype=receiver.dtype(name))
        code, dtype = cast_expr(column, target, ctx)
        items.append((name, code, dtype))
    return set_nullable_ints(with_columns(receiver, items),
                             dict.fromkeys(names, cast_mark(target)))


def cast_mark(target: Value) -> str | None:
    """What astype(target) makes of a column: one of pandas' nullable integers (its name),
    NOT_NULLABLE, or None when the type is not written out (Frame.nullable_ints)."""
    if isinstance(target, Opaque) and (target.const in _NULLABLE_INTS
                                       or target.const in MASKED_DTYPES):
        # pandas' nullable integers, and its other nullable types ("boolean", "string",
        # "Float64"), whose <NA> comparisons and & | keep (rules/ops.py)
        return target.const
    if isinstance(target, Opaque) and isinstance(target.const, (str, type)):
        return NOT_NULLABLE
    return None


@rule("pd.to_numeric")
def to_numeric(call: PandasCall, ctx: RuleContext) -> Value:
    """pd.to_numeric(col, errors="raise" | "coerce") -> the text stripped and cast to Float64
    (strict=False for errors="coerce"), NaN made missing.

    Handles: the texts pandas reads as numbers and the ones it does not ("1e3", " 3 ", "+5",
    ".5", "inf" read; "1,000", "1_000", "0x10", "" not), checked value by value against pandas;
    a text pandas cannot read is missing with errors="coerce" and fails the script with
    errors="raise"; a column already of numbers is returned as it is.
    Caveats: pandas keeps int64 when every value is a whole number and none is missing (3, where
    Polars writes 3.0: 0.9); "nan" text with errors="raise" fails in pandas and is missing
    here; downcast= and errors="ignore" (removed in pandas 3) are TODOs.
    """
    ctx.reject_unknown(call, "arg", "errors", positional=2)
    column = call.arg("arg", 0)
    if not isinstance(column, Column) or column.element:
        raise Unsupported("only a column of a frame is ported")
    errors = call.const("errors", 1, "raise", kinds=(str,))
    if errors not in ("raise", "coerce"):
        raise Unsupported(f"errors={errors!r}")
    if column.dtype in ("int", "float"):
        return column  # numbers already: pandas returns them unchanged
    if column.dtype not in ("str", None):
        raise Unsupported(f"a {column.dtype} column")
    if column.dtype is None:
        ctx.lower("the column's type is not known: a column of numbers is returned as it is in "
                  "pandas and cast to Float64 here", 0.9)
    ctx.lower("pandas keeps int64 when every value is a whole number and none is missing (3, "
              "where Polars writes 3.0)", 0.9)
    code = column.code.method("cast", emit.atom("pl.String")) if column.dtype is None else column.code
    code = code.attr("str").method("strip_chars").method(
        "cast", emit.atom("pl.Float64"), **({"strict": False} if errors == "coerce" else {}))
    return derived_column(column, code.method("fill_nan", None), dtype="float")


def int_text(column: Column, code: Code, ctx: RuleContext) -> Code:
    """An integer column as pandas' astype(str) writes it: pandas holds one that has a missing
    value (str.len() of text with a blank, dt.year with NaT, a read with a blank) as floats,
    "7.0"; decided over the whole column at run time, as PANDAS_CSV_INTS decides it for
    to_csv. A missing value stays missing in both."""
    as_text = code.method("cast", emit.atom("pl.String"))
    if column.nullable_int:  # pandas' nullable integers are written "7" beside a missing value
        return as_text
    if ctx.nullable_ints_possible and column.nullable_int is None:
        ctx.lower("the script uses pandas' nullable integers, and porter does not know whether "
                  "this column is one: an integer column holding a missing value is written "
                  "\"7\" as a nullable one is; a plain one is float in pandas (\"7.0\")", 0.9)
        return as_text
    if not column.frame.labels_intact:
        ctx.lower("rows were filtered or sorted before: an integer column that held a missing "
                  "value is still float in pandas (\"7.0\") after the row is left out; here its "
                  "text follows the rows left (\"7\")", 0.95)
    as_float_text = code.method("cast", emit.atom("pl.Float64")).method("cast", emit.atom("pl.String"))
    return emit.when(emit.binop(code.method("null_count"), ">", 0), as_float_text, as_text)


def python_number_text(code: Code) -> Code:
    """Text as Python's int() and float() read it, ready for Polars' cast: pandas reads each
    text so, around spaces ("12 ", " 3 ") and with underscores between digits ("1_000" is
    1000). Two passes take every underscore (the first leaves one only where its left digit
    ended a match, "1_2_3" -> "12_3"); any other underscore stays, and the cast fails as int()
    fails."""
    code = code.attr("str").method("strip_chars")
    for _ in range(2):
        code = code.attr("str").method("replace_all", "([0-9])_([0-9])", "${1}${2}")
    return code


def cast_expr(column: Column, target: Value, ctx: RuleContext) -> tuple[Code, str]:
    polars, kind = polars_dtype(target)
    code = column.code.method("fill_null", False) if column.null_is_false else column.code
    if kind == "str" and column.dtype is None and not column.element:
        # a type porter does not know (a read without --data, a frame back from pandas):
        # pandas writes the text (True/False, 1e-05, 7.0, dates, durations as its own)
        if ctx.nullable_ints_possible:
            ctx.lower("the script uses pandas' nullable integers, and porter does not know "
                      "whether this column is one: an integer column holding a missing value "
                      "is written \"7.0\" here as a plain one is; a nullable one writes \"7\"", 0.9)
        ctx.handover = True
        return pandas_text(code), "str"
    if kind == "str" and column.dtype in ("bool", None):
        if column.dtype is None:
            ctx.lower("booleans become true/false in Polars, True/False in pandas", 0.9)
        else:
            # True/False as pandas writes them; a missing value stays missing (pandas keeps
            # the NaN of a True/False column read with a blank: it is not "False")
            return code.method("replace_strict", {True: "True", False: "False"}), "str"
    if kind == "str" and column.dtype == "float" and float32_possible(ctx):
        # a float32 column is written with numpy's text of float32 values (0.1, 1.234567e+06,
        # 1e-04), a float64 one with Python's repr (5e-05): which one it is, is seen when the
        # script runs
        return code.method("fill_nan", None).method(
            "map_batches", emit.atom(FLOAT_TEXT_EITHER), return_dtype=emit.atom("pl.String")), "str"
    if kind == "str" and column.dtype == "float":
        return float_text(code), "str"  # Python's repr: 5e-05 where Polars writes 0.00005
    if kind == "str" and column.dtype == LIST_STR:
        # pandas writes each list as Python's str(list) does: ['ash', 'celadon']
        return list_repr(code), "str"
    if kind == "str" and column.dtype is not None and column.dtype.startswith("list["):
        raise Unsupported("astype(str) of lists other than lists of text (Python's str(list))")
    if kind == "str" and column.dtype == "int" and not column.element:
        return int_text(column, code, ctx), "str"
    if kind == "str" and column.dtype == "datetime":
        # "2024-01-31" when every time is midnight, as pandas writes the column
        return datetime_text(code), "str"
    if kind == "str" and column.dtype == "duration":
        # "0 days 02:30:00" (Polars casts no duration to text)
        return duration_text(code), "str"
    if kind == "bool" and dtype_spelling(target) == "boolean":
        # pandas' nullable boolean keeps a missing value missing (<NA>, written empty), and
        # takes numbers 0 and 1 only (any other fails: "Need to pass bool-like values")
        if column.dtype == "bool":
            return code, "bool"
        if column.dtype in ("int", "float"):
            if column.dtype == "float":
                code = code.method("fill_nan", None)
            return code.method("replace_strict", {0: False, 1: True},
                               return_dtype=emit.atom("pl.Boolean")), "bool"
        raise Unsupported(f'astype("boolean") of a {column.dtype or "column of unknown"} type '
                          "(pandas takes True/False and the numbers 0 and 1 only)")
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
        code = python_number_text(code)
    if kind == "category" and column.dtype not in ("str", "category"):
        if column.dtype is not None:
            raise Unsupported(f"a category of {column.dtype} values: Polars' Categorical holds "
                              "text only (keep the column as it is, or cast it to text first)")
        ctx.lower("Polars' Categorical holds text only: the column is taken to be text", 0.9)
    return code.method("cast", emit.atom(polars)), kind

