"""Element-wise functions: map(dict), map / apply with a lambda, and what a lambda body may
contain (arithmetic, comparisons, `a if cond else b`, string methods, dict lookups).

A lambda is not run row by row: its body is evaluated once with the parameter standing for the
column, and becomes one expression (pl.when / replace_strict / str.*). A missing value reaches a
pandas lambda as NaN, where comparisons are False, so `a if x > 1 else b` gives b; in Polars the
condition is null and pl.when takes the otherwise branch: the same result.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import replace
import re
from typing import Any

import libcst as cst

from porter.analysis import pandas_names
from porter.analysis.row_functions import (
    UNKNOWN, NotPortable, PythonFunction, read_row_function, read_value_function,
)
from porter.emit import code as emit
from porter.emit.code import Code
from porter.rules import rule
from porter.rules.io_options import ROW_FUNCTION, float_text
from porter.rules.ops import abs_, clip, compare, int64_branches, int64_lit, may_hold_nan, round_
from porter.rules.strings import LIST_STR
from porter.rules.totals import VALUE, column_totals, pandas_median, pandas_reduce
from porter.translate.context import (
    MIXED_COLUMN, PandasCall, RuleContext, Unsupported, column_of, derived_column, number_cells,
    row_labels_carried,
    value_dtype, with_column_updates,
)
from porter.translate.values import Column, Frame, Items, Module, Opaque, Scalar, Value, fresh_token


def frame_lambda(node: cst.Lambda, frame: Frame, ctx: RuleContext) -> Value:
    """`lambda d: <expression of d>` with d standing for the frame."""
    params = node.params.params
    if len(params) != 1 or node.params.star_arg not in (None, cst.MaybeSentinel.DEFAULT):
        raise Unsupported("a lambda with more than one parameter")
    return _checked(ctx.evaluate(node.body, {params[0].name.value: frame}), ctx)


def series_lambda(node: cst.Lambda, column: Column, ctx: RuleContext) -> Value:
    """`lambda s: <expression of s>` with s standing for the whole column (a Series, as
    sort_values' key= receives it)."""
    params = node.params.params
    if len(params) != 1 or node.params.star_arg not in (None, cst.MaybeSentinel.DEFAULT):
        raise Unsupported("a lambda with more than one parameter")
    return _checked(ctx.evaluate(node.body, {params[0].name.value: replace(column, sites=())}), ctx)


def element_lambda(node: cst.Lambda, column: Column, ctx: RuleContext) -> Column:
    """`lambda x: <expression of one value>` as an expression over `column`."""
    params = node.params.params
    if len(params) != 1 or node.params.star_arg not in (None, cst.MaybeSentinel.DEFAULT):
        raise Unsupported("a lambda with more than one parameter")
    element = replace(column, element=True, sites=())
    result = _checked(evaluate_element(node.body, {params[0].name.value: element}, ctx), ctx)
    if isinstance(result, Opaque) and result.is_const:
        # a whole number is int64 in pandas (Polars' pl.lit would make it Int32)
        whole = isinstance(result.const, int) and not isinstance(result.const, bool)
        code = int64_lit(result.const) if whole else emit.pl("lit", result.const)
        return derived_column(column, code, name=column.name, dtype="int" if whole else None)
    if not isinstance(result, Column):
        raise Unsupported("the lambda body has no expression form porter knows")
    code = result.code.method("fill_null", False) if result.null_is_false else result.code
    return replace(result, code=code, element=False, name=column.name, null_is_false=False, sites=())


def evaluate_element(node: cst.BaseExpression, bindings: dict[str, Value],
                     ctx: RuleContext) -> Value:
    """The body of a function of one value (or of a row's values) evaluated with `bindings`:
    `a in b` and `x[i]` / `x[a:b]` of such a value, which the evaluator does not read on
    values, are computed here first (innermost first) and stand in the body as names bound
    to their expressions."""
    forms = _ElementForms(dict(bindings), ctx)
    visited = node.visit(forms)
    assert isinstance(visited, cst.BaseExpression)
    return ctx.evaluate(visited, forms.bindings)


def _is_element(value: Value) -> bool:
    return isinstance(value, Column) and value.element


class _ElementForms(cst.CSTTransformer):
    def __init__(self, bindings: dict[str, Value], ctx: RuleContext) -> None:
        super().__init__()
        self.bindings = bindings
        self.ctx = ctx

    def _bind(self, value: Value, *operands: Value) -> cst.Name:
        name = f"_element_form_{len(self.bindings)}"
        self.bindings[name] = value.with_sites(*(s for v in operands for s in v.sites))
        return cst.Name(name)

    def visit_Lambda(self, node: cst.Lambda) -> bool:
        return False  # a lambda inside: its parameter is no value of this one

    def leave_Comparison(self, original: cst.Comparison,
                         updated: cst.Comparison) -> cst.BaseExpression:
        if len(updated.comparisons) != 1 or not isinstance(
                updated.comparisons[0].operator, (cst.In, cst.NotIn)):
            return updated
        target = updated.comparisons[0]
        left = self.ctx.evaluate(updated.left, self.bindings)
        right = self.ctx.evaluate(target.comparator, self.bindings)
        if not (_is_element(left) or _is_element(right)):
            return updated
        value = _membership(left, right, isinstance(target.operator, cst.NotIn))
        return self._bind(value, left, right).with_changes(lpar=updated.lpar, rpar=updated.rpar)

    def leave_Call(self, original: cst.Call, updated: cst.Call) -> cst.BaseExpression:
        if not (isinstance(updated.func, cst.Name) and updated.func.value == "isinstance"
                and len(updated.args) == 2
                and all(a.keyword is None and not a.star for a in updated.args)):
            return updated
        value = self.ctx.evaluate(updated.args[0].value, self.bindings)
        if not isinstance(value, Column) or not value.element:
            return updated
        result = _isinstance(value, updated.args[1].value)
        return self._bind(result, value).with_changes(lpar=updated.lpar, rpar=updated.rpar)

    def leave_Subscript(self, original: cst.Subscript,
                        updated: cst.Subscript) -> cst.BaseExpression:
        if len(updated.slice) != 1:
            return updated
        value = self.ctx.evaluate(updated.value, self.bindings)
        if not isinstance(value, Column) or not value.element:
            return updated
        part = updated.slice[0].slice
        if isinstance(part, cst.Index):
            key = self.ctx.evaluate(part.value, self.bindings)
            if not (isinstance(key, Opaque) and isinstance(key.const, int)
                    and not isinstance(key.const, bool)):
                raise Unsupported("a value indexed by something other than a whole number")
            result = _element_item(value, key.const)
        else:
            bounds = []
            for bound in (part.lower, part.upper, part.step):
                known = None if bound is None else self.ctx.evaluate(bound, self.bindings)
                if known is not None and not (isinstance(known, Opaque) and (
                        known.const is None or isinstance(known.const, int)
                        and not isinstance(known.const, bool))):
                    raise Unsupported("a slice whose bounds are not whole numbers")
                bounds.append(None if known is None else known.const)
            result = _element_slice(value, *bounds)
        return self._bind(result, value).with_changes(lpar=updated.lpar, rpar=updated.rpar)


def _membership(left: Value, right: Value, negate: bool) -> Column:
    """`"x" in text` -> str.contains(literal=True); `value in ("a", "b")` -> is_in. A missing
    value (NaN in pandas) is in no tuple of constants: False, where is_in is null."""
    if _is_element(right) and isinstance(right, Column) and right.dtype == "str" \
            and isinstance(left, Opaque) and isinstance(left.const, str):
        code = right.code.attr("str").method("contains", left.const, literal=True)
        result = _value(right, code, dtype="bool", null_is_false=True)
    elif _is_element(left) and isinstance(left, Column) and isinstance(right, Opaque) \
            and isinstance(right.const, (tuple, list, set, frozenset)):
        # (not `in` a dict: its guard `d[x] if x in d` does not keep Polars from looking up
        # every value in the then branch, where replace_strict fails on a value not in d)
        items = list(right.const)
        numbers = all(isinstance(v, (int, float)) and not isinstance(v, bool) and v == v
                      for v in items)
        if left.dtype == "str" and all(isinstance(v, str) for v in items):
            pass
        elif left.dtype == "float" and numbers:
            items = [float(v) for v in items]  # 2 == 2.0: the float column holds them so
        elif left.dtype == "int" and numbers and all(isinstance(v, int) for v in items):
            pass
        else:
            raise Unsupported("`in` a collection whose items are not all of the value's type "
                              "(text in text, numbers in numbers, no NaN or None)")
        if isinstance(right.const, (set, frozenset)):
            items = sorted(items)
        result = _value(left, left.code.method("is_in", items), dtype="bool", null_is_false=True)
    else:
        raise Unsupported("`in` other than a text in a text value or a value in a tuple, list "
                          "or set of constants")
    if negate:
        # `nan not in ("a",)` is True: the missing value is made False before it is negated
        return _value(result, emit.unary("~", result.code.method("fill_null", False)),
                      dtype="bool")
    return result


def _element_item(value: Column, index: int) -> Column:
    """text[i] -> one character (str.slice / str.tail); parts[i] of a split -> list.get."""
    if value.dtype == LIST_STR:
        code = value.code.attr("list").method("get", index, null_on_oob=True)
        return _value(value, code, dtype="str")
    if value.dtype != "str":
        raise Unsupported("an item of a value that is not text or a list of texts")
    text = value.code.attr("str")
    code = text.method("slice", index, 1) if index >= 0 \
        else text.method("tail", -index).attr("str").method("head", 1)
    return _value(value, code, dtype="str")


def _element_slice(value: Column, lower: int | None, upper: int | None,
                   step: int | None) -> Column:
    """text[a:b] -> str.slice / str.head / str.tail, counting characters as Python does (a
    negative bound counts from the end; str.head(-n) drops the last n)."""
    if value.dtype != "str":
        raise Unsupported("a slice of a value that is not text")
    if step not in (None, 1):
        raise Unsupported("a slice with a step")
    code = value.code
    if lower is not None and lower < 0:
        if upper is not None and upper >= 0:
            raise Unsupported("a slice from the end to a position from the start")
        code = code.attr("str").method("tail", -lower)
        if upper is not None:
            code = code.attr("str").method("head", upper)
        return _value(value, code, dtype="str")
    start = lower or 0
    if start:
        code = code.attr("str").method("slice", start)
    if upper is not None:
        code = code.attr("str").method("head", max(upper - start, 0) if upper >= 0 else upper)
    return _value(value, code, dtype="str")


def _checked(value: Value, ctx: RuleContext) -> Value:
    if any(site.status == "todo" for site in value.sites):
        # (each reason once: the same hand-over met at several places of the body)
        raise Unsupported("part of the function has no expression form: " + "; ".join(
            dict.fromkeys(s.message for s in value.sites if s.status == "todo")))
    # the lambda's own sites are folded into this one: keep their lowered confidences
    for site in value.sites:
        if site.confidence < ctx.confidence:
            ctx.lower(f"{site.key}: {site.message}", site.confidence)
    return value


def keys_of_column_type(mapping: dict[Any, Any], dtype: str | None,
                        python: bool = False) -> dict[Any, Any] | None:
    """A dict's keys as a column of `dtype` holds them (None when nothing changes). Polars
    casts the keys to the column's type ("1" and True to 1, 2.5 to 2, 1 to True), where a key
    of another kind matches nothing: in pandas' map of a dict whose keys are all of one kind a
    number never equals a text or True/False; with `python` (d.get(x) in a lambda, or keys of
    several kinds, which pandas compares as Python does) True equals 1. In a float column 1 is
    written 1.0 (Polars failed on a mix of 1 and 2.5), in an integer column 2.0 is written 2
    and a fraction, which no integer equals, is left out."""
    def number(k: object) -> bool:
        return isinstance(k, (int, float)) and not isinstance(k, bool)

    if dtype in ("int", "float"):
        kept = {(int(k) if python and isinstance(k, bool) else k): v for k, v in mapping.items()
                if number(k) or k is None or python and isinstance(k, bool)}
        if dtype == "float":
            kept = {float(k) if number(k) else k: v for k, v in kept.items()}
        else:
            kept = {int(k) if isinstance(k, float) else k: v for k, v in kept.items()
                    if not isinstance(k, float) or (k == k and k.is_integer())}
    elif dtype == "bool":
        kept = {(bool(k) if number(k) else k): v for k, v in mapping.items()
                if isinstance(k, bool) or k is None or python and number(k) and k in (0, 1)}
    elif dtype == "str":
        kept = {k: v for k, v in mapping.items() if isinstance(k, str) or k is None}
    else:
        return None
    if list(kept.items()) == list(mapping.items()) and all(
            type(a) is type(b) for a, b in zip(kept, mapping)):
        return None
    return kept


def _function(call: PandasCall) -> Value:
    return call.arg("arg", 0) if call.name == "map" else call.arg("func", 0)


# -- the script's own functions as one expression -------------------------------------------------

def body_expression(function: cst.FunctionDef) -> cst.BaseExpression:
    """A function whose body only names values and returns one, possibly under `if`s, as one
    conditional expression: `if c: return a` / `x = e` / `return b` -> `a if c else b` with `x`
    replaced by `(e)`. Python evaluates the same value for every argument; anything else
    (loops, calls for their effect, a branch that falls through) raises Unsupported."""
    params = function.params
    if params.star_arg not in (None, cst.MaybeSentinel.DEFAULT) or params.star_kwarg \
            or params.kwonly_params or params.posonly_params or len(params.params) != 1:
        raise Unsupported("a function that does not take exactly one value")
    body = function.body
    if not isinstance(body, cst.IndentedBlock):
        body = cst.IndentedBlock(body=[cst.SimpleStatementLine(body=list(body.body))])
    statements = list(body.body)
    if statements and _is_docstring(statements[0]):
        statements = statements[1:]
    return _as_expression(statements, {})


def _is_docstring(stmt: cst.BaseStatement) -> bool:
    return isinstance(stmt, cst.SimpleStatementLine) and len(stmt.body) == 1 \
        and isinstance(stmt.body[0], cst.Expr) and isinstance(stmt.body[0].value, cst.SimpleString)


class _Substitute(cst.CSTTransformer):
    def __init__(self, names: dict[str, cst.BaseExpression]) -> None:
        super().__init__()
        self.names = names

    def leave_Name(self, original: cst.Name, updated: cst.Name) -> cst.BaseExpression:
        value = self.names.get(original.value)
        return value.with_changes(lpar=[cst.LeftParen()], rpar=[cst.RightParen()]) \
            if value is not None else updated

    def leave_Attribute(self, original: cst.Attribute, updated: cst.Attribute) -> cst.BaseExpression:
        return updated.with_changes(attr=original.attr)  # `x.name`: the attribute is no local

    def leave_Arg(self, original: cst.Arg, updated: cst.Arg) -> cst.Arg:
        return updated.with_changes(keyword=original.keyword)  # `f(name=...)`: nor a keyword


def _substituted(node: cst.BaseExpression, names: dict[str, cst.BaseExpression]) -> cst.BaseExpression:
    if not names:
        return node
    result = node.visit(_Substitute(names))
    assert isinstance(result, cst.BaseExpression)
    return result


def _as_expression(statements: list[cst.BaseStatement],
                   names: dict[str, cst.BaseExpression]) -> cst.BaseExpression:
    if not statements:
        return cst.Name("None")  # falling off the end returns None
    first, rest = statements[0], statements[1:]
    if isinstance(first, cst.SimpleStatementLine):
        small = list(first.body)
        if not small:
            return _as_expression(rest, names)
        head, tail = small[0], small[1:]
        remaining = ([first.with_changes(body=tail)] if tail else []) + rest
        if isinstance(head, cst.Return):
            return _substituted(head.value, names) if head.value is not None else cst.Name("None")
        if isinstance(head, cst.Pass):
            return _as_expression(remaining, names)
        if isinstance(head, cst.Assign) and len(head.targets) == 1 \
                and isinstance(head.targets[0].target, cst.Name):
            name = head.targets[0].target.value
            return _as_expression(remaining, {**names, name: _substituted(head.value, names)})
        raise Unsupported("a statement that only a Python call can run")
    if isinstance(first, cst.If):
        merged = _merged_if(first, names)
        if merged is not None:
            # `if c: d = 0.0` / `else: d = 0.1`: d is `0.0 if c else 0.1` in what follows
            return _as_expression(rest, merged)
        test = _substituted(first.test, names)
        # a branch that goes on to the next statements: they follow it in its own expression
        body = _as_expression([*first.body.body, *rest], names)
        orelse = first.orelse
        if isinstance(orelse, cst.If):
            other = _as_expression([orelse, *rest], names)
        elif isinstance(orelse, cst.Else):
            other = _as_expression([*orelse.body.body, *rest], names)
        else:
            other = _as_expression(rest, names)
        return cst.IfExp(test=_parenthesized(test), body=body, orelse=other)
    raise Unsupported("a loop or a block that only a Python call can run")


def _parenthesized(node: cst.BaseExpression) -> cst.BaseExpression:
    return node.with_changes(lpar=[cst.LeftParen()], rpar=[cst.RightParen()])


def _assigned(statements: Sequence[cst.BaseStatement],
              names: dict[str, cst.BaseExpression]) -> dict[str, cst.BaseExpression] | None:
    """The local names after `statements` when all they do is name values (under `if`s that
    do the same); None when one returns or does anything else."""
    names = dict(names)
    for stmt in statements:
        if isinstance(stmt, cst.SimpleStatementLine):
            for small in stmt.body:
                if isinstance(small, cst.Pass):
                    continue
                if isinstance(small, cst.Assign) and len(small.targets) == 1 \
                        and isinstance(small.targets[0].target, cst.Name):
                    names[small.targets[0].target.value] = _substituted(small.value, names)
                    continue
                return None
        elif isinstance(stmt, cst.If):
            merged = _merged_if(stmt, names)
            if merged is None:
                return None
            names = merged
        else:
            return None
    return names


def _merged_if(stmt: cst.If, names: dict[str, cst.BaseExpression]
               ) -> dict[str, cst.BaseExpression] | None:
    """An `if` whose branches only name values: each name the branches set is one conditional
    expression (`d = 0.0 if c else 0.1`). None when a branch returns or does anything else."""
    body = _assigned(list(stmt.body.body), names)
    orelse = stmt.orelse
    other = names if orelse is None else _assigned(
        [orelse] if isinstance(orelse, cst.If) else list(orelse.body.body), names)
    if body is None or other is None:
        return None
    test = _parenthesized(_substituted(stmt.test, names))
    merged: dict[str, cst.BaseExpression] = {}
    for name in {**body, **other}:
        if name not in body or name not in other:
            # read later it is unbound on the other path (UnboundLocalError in Python)
            raise Unsupported(f"`{name}` is set in only some branches of an `if`")
        a, b = body[name], other[name]
        merged[name] = a if a is b else _parenthesized(cst.IfExp(test=test, body=a, orelse=b))
    return merged


def function_value(call: PandasCall, function: Value, ctx: RuleContext) -> cst.FunctionDef | None:
    """The script's own function a call passes by name (`s.apply(grade)`), if porter has it."""
    if isinstance(function, Opaque) and isinstance(function.node, cst.Name) \
            and ctx.function_def is not None:
        found = ctx.function_def(function.node.value)
        return found if isinstance(found, cst.FunctionDef) else None
    return None


@rule("series.map", "series.apply")
def map_(call: PandasCall, ctx: RuleContext) -> Value:
    """s.map(dict) -> .replace_strict(dict, default=None); s.map(lambda x: ...) / s.apply(lambda
    x: ...) -> one expression.

    Handles: values missing from the dict become missing (pandas map); a dict of whole and
    fractional numbers gives Float64 (pandas' float64); lambdas and the
    script's own functions become pl.when / str.* / arithmetic expressions. A function with
    loops or `try` blocks on a text or float column runs in Python on each value
    (map_elements, 0.9) when it cannot tell Polars' values from pandas'
    (porter.analysis.row_functions).
    Caveats: lambdas with calls porter does not know, and functions Polars could run otherwise,
    are TODOs; so is a dict or a function whose values mix numbers and text (an object column
    in pandas), whose frame then stays pandas.
    """
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call, "arg", "func", "na_action", positional=1)
    function = _function(call)
    if call.name == "map" and isinstance(function, Column) and not function.element:
        return _map_by_labels(call, column, function, ctx)
    if isinstance(function, Opaque) and isinstance(function.const, dict):
        if call.name == "apply":
            raise Unsupported("apply with a dict")
        # a named dict stays named in the output; a literal is written out (also for a named
        # dict whose number keys are written as the column holds them)
        # keys of one kind make a typed index in pandas (1 never equals True there); keys of
        # several kinds an object index, which compares as Python does (True == 1)
        key_kinds = {bool if isinstance(k, bool) else float if isinstance(k, (int, float))
                     else type(k) for k in function.const if k is not None}
        keyed = keys_of_column_type(function.const, column.dtype, python=len(key_kinds) > 1)
        const = function.const if keyed is None else keyed
        mapping: object = function.code if function.code.text.isidentifier() and keyed is None \
            else const
        # True/False or text values: the result's type (a value not in the dict is missing,
        # NaN in pandas); numbers are left untyped (pandas makes whole numbers float there)
        kinds = {type(v) for v in function.const.values() if v is not None}
        if re.search(r"\bNA\b", function.code.text) and kinds - {str}:
            # pd.NA (read as NaN) beside numbers or True/False: pandas keeps the values and
            # <NA> in an object column ([1, <NA>, 2], written 1), where NaN would make float64
            raise Unsupported(f"pd.NA among the dict's numbers: it {MIXED_COLUMN} ([1, <NA>, "
                              "2], written 1), which no Polars type holds")
        if kinds == {int, float}:
            # pandas makes them float64; Polars builds the new values from the first one's
            # type and fails on the other: they are given as floats
            if isinstance(mapping, Code):  # a named dict: its values as a Float64 Series
                code = column.code.method(
                    "replace_strict", emit.call("list", mapping),
                    emit.call("pl.Series", emit.call("list", mapping.method("values")),
                              dtype=emit.atom("pl.Float64"), strict=False),
                    default=None)
            else:
                code = column.code.method("replace_strict", {
                    k: None if v is None else float(v) for k, v in const.items()},
                    default=None)
            return derived_column(column, code.method("fill_nan", None), name=column.name,
                                  dtype="float")
        if len(kinds) > 1:
            # a number and a text (or True/False): pandas keeps each value in an object column
            raise Unsupported(f"the dict's values are of several types: it {MIXED_COLUMN} "
                              "(each value kept as it is), which no Polars type holds")
        kind = kinds.pop() if len(kinds) == 1 else None
        dtype = {bool: "bool", str: "str", int: "int"}.get(kind) if kind else None
        result = derived_column(column, column.code.method("replace_strict", mapping,
                                                           default=None),
                                name=column.name, dtype=dtype)
        if dtype == "int" and column.dtype in ("category", "enum"):
            # a categorical column (pd.cut, astype("category")) mapped one to one keeps its
            # categories mapped: an int category column, whose missing value does not make it
            # float (written 1 and an empty field); a dict that misses a category makes float64
            ctx.lower("an int dict over a categorical column: pandas makes a categorical column "
                      "of the ints when every category maps to a value of its own (written 1, "
                      "where a missing value makes Polars' column written 1.0), float64 "
                      "otherwise", 0.9)
        elif dtype == "int":
            # float64 in pandas when a value is not in the dict (or is missing), int64 when
            # every one is: Polars gives Int64 with nulls, which later steps read
            # (lost_float_ints)
            result = replace(result, float_int="map() found a value not in the dict")
        return result
    if isinstance(function, Opaque) and isinstance(function.node, cst.Lambda):
        result = element_lambda(function.node, column, ctx)
        if call.const("na_action", None, None) == "ignore":
            # pandas does not call the function on a missing value: it stays missing
            code = emit.when(column.code.method("is_not_null"), result.code)
            return replace(result, code=code)
        return result
    named = function_value(call, function, ctx)
    if named is not None:
        param = named.params.params[0].name.value if named.params.params else None
        if param is None:
            raise Unsupported("a function without a parameter")
        try:
            lambda_node = cst.Lambda(params=cst.Parameters(params=[cst.Param(cst.Name(param))]),
                                     body=body_expression(named))
            result = element_lambda(lambda_node, column, ctx)
        except Unsupported as exc:
            return _python_values(column, named, exc.reason,
                                  call.const("na_action", None, None) == "ignore", ctx)
        if call.const("na_action", None, None) == "ignore":
            return replace(result, code=emit.when(column.code.method("is_not_null"), result.code))
        return result
    template = _format_template(function)
    if template is not None:
        return _formatted_values(column, template, call.const("na_action", None, None) == "ignore",
                                 ctx)
    raise Unsupported("a named function porter cannot read: write its body as a lambda or as "
                      "column expressions")


def _format_template(function: Value) -> str | None:
    """The text of `"{:.1f} kg".format` passed as the function (s.map("{:.1f} kg".format))."""
    node = function.node if isinstance(function, Opaque) else None
    if not (isinstance(node, cst.Attribute) and node.attr.value == "format"
            and isinstance(node.value, (cst.SimpleString, cst.ConcatenatedString))):
        return None
    text = node.value.evaluated_value
    return text if isinstance(text, str) else None


def _formatted_values(column: Column, template: str, skip_missing: bool,
                      ctx: RuleContext) -> Column:
    """s.map("{:.1f} kg".format): Python's str.format on each value, as pandas calls it on each
    (map_elements; for text, once per distinct text), a missing value passed as NaN ("nan")."""
    if column.dtype not in ("str", "float"):
        kind = f"the {column.dtype} column" if column.dtype else "a column of unknown type"
        raise Unsupported(f"str.format of {kind}: pandas "
                          "passes numpy values (an int column with a missing value as floats), "
                          "whose text porter cannot tell from Polars' values")
    if "!r" in template or "!a" in template:
        raise Unsupported("!r in the format: numpy's repr of a value (np.float64(1.5)) is not "
                          "Python's")
    formatter = emit.atom(f"{emit.render(template)}.format")
    ctx.runs_function = True
    if column.dtype == "str":
        code = emit.call(DISTINCT_FUNCTION, column.code, formatter, emit.atom("pl.String"),
                         **({"skip_nulls": True} if skip_missing else {}))
    elif skip_missing:  # na_action="ignore": pandas leaves a missing value missing
        code = column.code.method("fill_nan", None).method(
            "map_elements", formatter, return_dtype=emit.atom("pl.String"))
    else:
        code = column.code.method("fill_nan", None).method(
            "map_elements", emit.atom(f'lambda value: {formatter.text}(float("nan") if value is '
                                      'None else value)'),
            return_dtype=emit.atom("pl.String"), skip_nulls=False)
    return derived_column(column, code, name=column.name, dtype="str")


def _map_by_labels(call: PandasCall, column: Column, mapper: Column, ctx: RuleContext) -> Value:
    """s.map(other) of a Series `other` labelled by one key column (set_index, a groupby's):
    each value looked up among other's labels -> replace_strict(labels, values, default=None)
    with both collected from other's frame.

    pandas reindexes `other` by the values: a value no label holds is missing, a missing value
    finds a missing label; labels that repeat raise there (InvalidIndexError) and in Polars
    (replace_strict's `old` must not repeat). Integers are float64 in pandas where a value
    found no label: marked (float_int) as a dict's map is."""
    if call.const("na_action", None, None) is not None:
        raise Unsupported("na_action= with a Series")
    frame = mapper.frame
    if len(frame.index) != 1 or frame.index_unnamed or row_labels_carried(frame):
        raise Unsupported("a Series labelled by other than one key column (row numbers, or "
                          "several keys)")
    key = frame.index[0]
    kinds = {column.dtype, frame.dtype(key)}
    if len(kinds) != 1 or not kinds <= {"str", "int", "date", "datetime"}:
        # pandas finds no label of another type (every value missing); Polars would raise
        raise Unsupported("values and labels not known to be of one type (text, whole "
                          "numbers or dates)")
    if mapper.dtype not in ("str", "int", "float", "date", "datetime"):
        # True/False become an object column with NaN where a value found no label
        raise Unsupported("looked-up values not known to be text, numbers or dates")
    values = ctx.expr(mapper, frame)
    name = mapper.name if isinstance(mapper.name, str) and mapper.name != key else "_porter_value"
    if values.text.replace("'", '"') == emit.col(name).text:
        values = emit.lit(name)  # the column itself, by its name
    else:
        values = values.method("alias", name)
    # the labels and values collected once; the expression made from them
    replaced = column.code.method("replace_strict", emit.atom(f"lookup[{emit.lit(key).text}]"),
                                  emit.atom(f"lookup[{emit.lit(name).text}]"), default=None)
    code = frame.code.method("select", key, values).method("collect").method(
        "pipe", emit.atom(f"lambda lookup: {replaced.text}"))
    result = derived_column(column, code, name=column.name, dtype=mapper.dtype)
    if mapper.dtype == "int":
        # float64 in pandas when a value found no label (or the Series held a missing value)
        result = replace(result, float_int="map() found a value no label of the Series holds")
    return result


# -- what a lambda body may contain --------------------------------------------------------

STRING_METHODS = {
    "upper": ("to_uppercase", ()), "lower": ("to_lowercase", ()), "title": ("to_titlecase", ()),
    "strip": ("strip_chars", None), "lstrip": ("strip_chars_start", None),
    "rstrip": ("strip_chars_end", None),
}


def _element(call: PandasCall) -> Column:
    assert isinstance(call.receiver, Column)
    return call.receiver


def _value(element: Column, code: Code, **changes: object) -> Column:
    """One value computed from the lambda's parameter: still a value, so methods chain
    (`s.strip().upper()`)."""
    return replace(derived_column(element, code, **changes), element=True)  # type: ignore[arg-type]


@rule("element.upper", "element.lower", "element.title", "element.strip", "element.lstrip",
      "element.rstrip")
def element_string_method(call: PandasCall, ctx: RuleContext) -> Value:
    """x.upper() / lower / title / strip in a lambda -> str.to_uppercase() / ..."""
    element = _element(call)
    method, _ = STRING_METHODS[call.name]
    args = [call.const("chars", 0)] if call.args else []
    return _value(element, element.code.attr("str").method(method, *args), dtype="str")


@rule("element.startswith", "element.endswith")
def element_prefix(call: PandasCall, ctx: RuleContext) -> Value:
    """x.startswith(p) in a lambda -> str.starts_with(p)."""
    element = _element(call)
    prefix = call.const("prefix", 0)
    method = "starts_with" if call.name == "startswith" else "ends_with"
    if isinstance(prefix, tuple):
        parts = [element.code.attr("str").method(method, p) for p in prefix]
        code = emit.pl("any_horizontal", *parts)
    else:
        code = element.code.attr("str").method(method, prefix)
    return _value(element, code, dtype="bool", null_is_false=True)


@rule("element.replace")
def element_replace(call: PandasCall, ctx: RuleContext) -> Value:
    """x.replace(a, b) in a lambda -> str.replace_all(a, b, literal=True)."""
    element = _element(call)
    if len(call.args) not in (2, 3):
        raise Unsupported("str.replace needs the old and new text")
    old, new = call.const("old", 0), call.const("new", 1)
    count = call.const("count", 2, -1)
    if not isinstance(count, int):
        raise Unsupported("a computed replacement count")
    if count < 0:
        code = element.code.attr("str").method("replace_all", old, new, literal=True)
    elif count == 0:
        code = element.code
    else:  # the first `count` occurrences, as Python does
        code = element.code.attr("str").method("replace", old, new, literal=True, n=count)
    return _value(element, code, dtype="str")


@rule("element.len")
def element_len(call: PandasCall, ctx: RuleContext) -> Value:
    """len(x) in a lambda -> str.len_chars() (characters, as Python counts them); of the parts
    of a split -> list.len()."""
    element = _element(call)
    if element.dtype == LIST_STR:
        code = element.code.attr("list").method("len").method("cast", emit.atom("pl.Int64"))
        return replace(_value(element, code, dtype="int"), python_int=True)
    if element.dtype not in (None, "str"):
        raise Unsupported("len of a non-text value")
    code = element.code.attr("str").method("len_chars").method("cast", emit.atom("pl.Int64"))
    return replace(_value(element, code, dtype="int"), python_int=True)  # a Python int


@rule("element.split")
def element_split(call: PandasCall, ctx: RuleContext) -> Value:
    """x.split(sep) in a lambda -> str.split(sep): the parts, empty ones kept ("a::b" gives
    "a", "", "b" in both; "" gives [""])."""
    element = _element(call)
    ctx.reject_unknown(call, "sep", positional=1)
    sep = call.const("sep", 0, None)
    if element.dtype != "str":
        raise Unsupported("split of a value that is not text")
    if not isinstance(sep, str) or not sep:
        # split() splits on runs of whitespace and drops empty parts
        raise Unsupported("split without a separator (runs of whitespace)")
    return _value(element, element.code.attr("str").method("split", sep), dtype=LIST_STR)


# the Python types isinstance() tests porter reads
_PYTHON_TYPES: dict[str, type] = {"str": str, "int": int, "float": float, "bool": bool}


def _isinstance(element: Column, spec: cst.BaseExpression) -> Column:
    """isinstance(x, str) / (int, float) / float in a lambda -> decided from the column's type:
    pandas passes each value as a Python str, int, float or bool, and a missing one as the
    float NaN (text, True/False with blanks and int columns with a missing value, which pandas
    holds as floats). So isinstance(x, str) of a text column is is_not_null(), isinstance(x,
    float) is_null(), and of a float column True."""
    written = [spec] if isinstance(spec, cst.Name) else [e.value for e in spec.elements] \
        if isinstance(spec, cst.Tuple) else []
    if not written or not all(isinstance(n, cst.Name) and n.value in _PYTHON_TYPES
                              for n in written):
        raise Unsupported("isinstance of a type other than str, int, float and bool")
    types = tuple(_PYTHON_TYPES[n.value] for n in written)  # type: ignore[attr-defined]
    dtype = element.dtype
    present: type
    if dtype == "int" and (element.python_int or not element.float_int):
        if element.nullable_int:
            raise Unsupported("isinstance of a value of pandas' nullable integer column (pd.NA)")
        present = int
    elif dtype == "int" or dtype == "float":
        present = float  # an int column with a missing value is float64 in pandas
    elif dtype in ("str", "bool"):
        present = _PYTHON_TYPES[dtype]
    else:
        raise Unsupported("isinstance of a value whose type porter does not know "
                          "(convert with --data)")
    given, missing = issubclass(present, types), issubclass(float, types)  # NaN is a float
    if given == missing:
        code = emit.pl("lit", given)
    else:
        code = element.code.method("is_not_null" if given else "is_null")
    return _value(element, code, dtype="bool")


@rule("element.max", "element.min")
def element_extreme(call: PandasCall, ctx: RuleContext) -> Value:
    """max(x, n) / min(x, n) of two numbers in a lambda -> pl.when(n > x).then(n).otherwise(x):
    Python keeps the first unless the second is larger (smaller), so max(nan, 0) is nan and
    max(0, nan) is 0; a missing value compares as null and falls through to the first."""
    element = _element(call)
    if call.kwargs or len(call.args) != 1:
        raise Unsupported(f"{call.name}() of other than two values")
    other = call.args[0]
    constant = isinstance(other, Opaque) and other.is_const
    if constant and (not isinstance(other.const, (int, float)) or isinstance(other.const, bool)
                     or other.const != other.const):
        raise Unsupported(f"{call.name}() of a value and something other than a number")
    second_kind = ("int" if isinstance(other.const, int) else "float") if constant \
        else value_dtype(other)
    if element.dtype not in ("int", "float", None) or second_kind not in ("int", "float"):
        raise Unsupported(f"{call.name}() of values other than numbers")
    kinds = {element.dtype, second_kind}
    if element.dtype is None:
        ctx.lower(f"{call.name}() of a value whose type porter does not know (arithmetic of "
                  f"ints and floats): where it is not a number pandas raises", 0.95)
    if kinds == {"int", "float"} or element.dtype is None:
        ctx.lower(f"{call.name}() of a float and an int returns either: where every value it "
                  f"returns is the int, pandas makes an int64 column (written 0, here 0.0)", 0.95)
    assert isinstance(other, (Opaque, Column))
    second = int64_lit(other.const) if constant and isinstance(other.const, int) \
        else ctx.expr(other, element.frame)
    op = ">" if call.name == "max" else "<"
    code = emit.when(emit.binop(second, op, element.code), second).method("otherwise", element.code)
    # ints and floats together: pandas makes the column of the values returned float64
    return _value(element, code, dtype=None if None in kinds else
                  "float" if "float" in kinds else "int")


@rule("element.str", "element.int", "element.float")
def element_cast(call: PandasCall, ctx: RuleContext) -> Value:
    """str(x) / int(x) / float(x) in a lambda -> cast.

    Handles: str() of a boolean is True/False, of a missing value "nan", of a datetime
    "2024-01-05 00:00:00" (microseconds only when there are some) and of NaT "NaT", as Python
    writes them; an integer column holding a missing value reaches str() as floats ("7.0",
    "nan"), decided over the whole column at run time, but int(x) is a Python int ("7").
    A float is written as Python's repr (1e-05 where Polars writes 0.00001).
    Caveats: a value whose type porter does not know (0.85): Python writes some floats,
    booleans and dates differently from Polars' text.
    """
    element = _element(call)
    if call.name == "str":
        if element.dtype == "bool":
            code = emit.pl("when", element.code).method("then", emit.pl("lit", "True")).method(
                "when", emit.unary("~", element.code)).method("then", emit.pl("lit", "False"))
            return _value(element, code.method("otherwise", emit.pl("lit", "nan")), dtype="str")
        if element.dtype == "datetime":
            # str(Timestamp): seconds always, microseconds only when there are some; NaT
            x = element.code
            code = emit.pl("when", emit.binop(x.attr("dt").method("microsecond"), "==", 0)).method(
                "then", x.attr("dt").method("strftime", "%Y-%m-%d %H:%M:%S")).method(
                "otherwise", x.attr("dt").method("strftime", "%Y-%m-%d %H:%M:%S%.6f"))
            return _value(element, code.method("fill_null", "NaT"), dtype="str")
        if element.dtype == "float":
            # Python's repr (1e-05, 1.5e-07) where Polars writes 0.00001 and 1.5e-7; NaN
            # reaches str() as "nan"
            return _value(element, float_text(element.code).method("fill_null", "nan"),
                          dtype="str")
        if element.dtype is None:
            ctx.lower("Python's str() writes some floats (1e-05), booleans (True) and dates "
                      "differently from Polars' text: the column type is not known", 0.85)
        if element.dtype == "int" and not element.python_int:
            # pandas holds an integer column with a missing value as floats: str() writes
            # "7.0", and "nan" for the missing value (decided over the whole column); int(x)
            # is a Python int, "7" whatever the column holds
            from porter.rules.assign import int_text
            code = int_text(element, element.code, ctx).method("fill_null", "nan")
            return _value(element, code, dtype="str")
        code = element.code if element.dtype == "str" else element.code.method("cast", emit.atom("pl.String"))
        code = code.method("fill_null", "nan")  # a missing value reaches str() as NaN: "nan"
        return _value(element, code, dtype="str")
    target = {"int": "pl.Int64", "float": "pl.Float64"}[call.name]
    if call.name == "int":
        ctx.lower("int() of a missing value raises in pandas; Polars keeps it missing", 0.95)
    code = element.code
    if element.dtype == "str":
        # Python's int() and float() read " 1.5" and "1_000" (Polars' cast refuses them); a
        # text "nan" is NaN, missing in pandas
        from porter.rules.assign import python_number_text
        code = python_number_text(code).method("cast", emit.atom(target))
        if call.name == "float":
            code = code.method("fill_nan", None)
    else:
        if element.dtype is None:
            ctx.lower(f"the value's type is not known: where it is text, Python's {call.name}() "
                      "reads \" 1.5\" and \"1_000\", which Polars' cast refuses", 0.9)
        code = code.method("cast", emit.atom(target))
    return replace(_value(element, code, dtype=call.name), python_int=call.name == "int")


@rule("element.format")
def element_format(call: PandasCall, ctx: RuleContext) -> Value:
    """f"{x:.0f}" / f"{n:03d}" in a lambda or a row function -> the text Python's format()
    writes, as an expression.

    Handles: `.0f` of a float rounds the exact value half to even (0.5 -> "0", 2.5 -> "2"),
    as Polars' round(0) does; "-0" for a negative value that rounds to 0 and for -0.0; "nan",
    "inf" and "-inf"; a missing float reaches format() as NaN: "nan". `d`, `Nd` and `0Nd` of an
    int made by int(), len() or round(): padded with blanks or zeros after the sign. `.0f` of
    an int column: its digits, "nan" where missing.
    Caveats: an int column with a missing value is float64 in pandas, whose `.0f` of a value
    beyond 2**53 writes the nearest float's digits. Other specs are TODOs: `.2f` rounds the exact
    binary value (2.675 -> "2.67"),
    which no expression does; `d` of a column value may reach Python as a float (a missing
    value, a row of a frame with a float column), where format() raises.
    """
    element = _element(call)
    spec = call.const("format_spec", 0, kinds=(str,))
    x = element.code
    if spec == ".0f" and element.dtype == "float":
        rounded = x.method("round", 0)
        negative_zero = emit.binop(emit.binop(rounded, "==", 0), "&", emit.binop(
            emit.binop(x, "<", 0), "|", emit.binop(emit.binop(1.0, "/", x), "<", 0)))
        digits = emit.when(x.method("is_finite"), rounded).method(
            "cast", emit.atom("pl.Int128")).method("cast", emit.atom("pl.String"))
        code = (emit.pl("when", x.method("is_nan")).method("then", emit.pl("lit", "nan"))
                .method("when", emit.binop(x, "==", emit.atom('float("inf")')))
                .method("then", emit.pl("lit", "inf"))
                .method("when", emit.binop(x, "==", emit.atom('float("-inf")')))
                .method("then", emit.pl("lit", "-inf"))
                .method("when", negative_zero).method("then", emit.pl("lit", "-0"))
                .method("otherwise", digits).method("fill_null", "nan"))
        return _value(element, code, dtype="str")
    if spec == ".0f" and element.dtype == "int":
        # an int, or the float pandas holds where the column has a missing value: the same
        # digits (the column may be made Float64 at run time for pandas' float64: cast back);
        # the missing value is NaN: "nan"
        code = x.method("cast", emit.atom("pl.Int64")).method("cast", emit.atom("pl.String"))
        return _value(element, code if element.python_int else code.method("fill_null", "nan"),
                      dtype="str")
    width = re.fullmatch(r"(0?)(\d*)d", spec)
    if width and element.dtype == "int" and element.python_int:
        code = x.method("cast", emit.atom("pl.String"))
        if width.group(2):
            size = int(width.group(2))
            code = code.attr("str").method("zfill", size) if width.group(1) else \
                code.attr("str").method("pad_start", size)
        return _value(element, code, dtype="str")
    raise Unsupported(f"the format spec {spec!r} of a value whose type is "
                      f"{element.dtype or 'not known'}: Python's formatting of each value has "
                      "no expression form here")


@rule("element.math.floor", "element.math.ceil")
def element_math_rounding(call: PandasCall, ctx: RuleContext) -> Value:
    """math.floor(x) / math.ceil(x) in a lambda -> .floor() / .ceil() cast to Int64: Python's
    int, as pandas makes an int64 column of them (-0.5 floors to -1, ceils to 0).

    Caveats: math.floor of NaN raises in pandas (ValueError); Polars keeps it missing (0.95,
    as int()); of an infinity both raise.
    """
    element = _element(call)
    if element.dtype not in ("int", "float"):
        raise Unsupported(f"math.{call.name} of a {element.dtype or 'value of unknown type'}")
    code = element.code
    if element.dtype == "float" or element.float_int:
        ctx.lower(f"math.{call.name}() of a missing value raises in pandas; Polars keeps it "
                  "missing", 0.95)
        code = code.method(call.name)
    code = code.method("cast", emit.atom("pl.Int64"))
    return replace(_value(element, code, dtype="int"), python_int=True)


@rule("element.round", "element.abs")
def element_number(call: PandasCall, ctx: RuleContext) -> Value:
    """round(x, n) / abs(x) in a lambda -> .round(n) / .abs(); Python's round of a float runs
    on each value (map_elements): it rounds the exact binary value, which no expression does.
    round(x) without digits is a Python int: .round(0) cast to Int64 (2, not 2.0 or -0.0)."""
    element = _element(call)
    if call.name == "abs":
        return _value(element, element.code.method("abs"), dtype=element.dtype)
    digits = call.const("ndigits", 0, None)
    if digits is None:
        # Python's round(x) is an int (half to even, as Polars rounds): 2, not 2.0 or -0.0
        ctx.lower("round() of a missing value raises in pandas; Polars keeps it missing, in an "
                  "integer column where map(..., na_action='ignore') gives pandas float64 (its "
                  "sum prints 2.0 there, 2 here; to_csv and tolist() agree)", 0.95)
        code = element.code.method("round", 0).method("cast", emit.atom("pl.Int64"))
        return replace(_value(element, code, dtype="int"), python_int=True)
    if not isinstance(digits, int) or digits < 0:
        raise Unsupported("negative digits")
    if element.dtype != "int":
        # round(2.675, 2) is 2.67: Python rounds the float's exact binary value
        # (2.67499999...); Polars (and pandas' Series.round) scale by 10**n first and give
        # 2.68. Python's own round runs on each value (a missing value stays missing, as
        # round(nan) is nan)
        code = element.code.method("map_elements", emit.atom(f"lambda v: round(v, {digits})"),
                                   return_dtype=emit.atom("pl.Float64"))
        return _value(element, code, dtype="float")
    return _value(element, element.code.method("round", digits), dtype=element.dtype)


@rule("element.ifexp")
def element_ifexp(call: PandasCall, ctx: RuleContext) -> Value:
    """`a if cond else b` -> pl.when(cond).then(a).otherwise(b).

    Handles: a condition on a missing value is False in Python (NaN comparisons) and null in
    Polars; both take the else branch. A plain value as the condition is Python's truth value
    (nonzero, non-empty; NaN is true). Whole numbers in both branches are Int64, as pandas'
    int64 (Polars' Int32 would wrap around in arithmetic).
    Caveats: a value of unknown type as the condition is a TODO.
    """
    cond = call.receiver
    assert isinstance(cond, Column)
    then, otherwise = call.args
    _check_one_kind(then, otherwise, ctx)
    # whole numbers in both branches: int64 as pandas makes them (not Polars' Int32)
    then_code, other = int64_branches(then, otherwise,
                                      [_branch(v, cond, ctx) for v in (then, otherwise)])
    code = emit.when(_truth(cond), then_code)
    if other.base is not None and other.base.startswith("pl.when(") and other.steps \
            and other.steps[-1].startswith(".otherwise("):
        # `a if c else (b if d else e)`: one chain, pl.when(c).then(a).when(d).then(b)...
        code = Code(code.text + other.text[len("pl"):], emit.ATOM, code.base,
                    code.steps + (other.base[len("pl"):], *other.steps))
    else:
        code = code.method("otherwise", other)
    # a None branch is a missing value of the other branch's kind (the parts of a split)
    kinds = {value_dtype(v) for v in (then, otherwise)
             if not (isinstance(v, Opaque) and v.is_const and v.const is None)}
    return derived_column(cond, code, dtype=kinds.pop() if len(kinds) == 1 else None,
                          others=[v for v in (then, otherwise) if isinstance(v, Column)])


# kinds of value whose mix pandas keeps in an object column (each value as it is): a number
# and a text, True/False and a number (1 and True), a date and a text...
_KIND_GROUPS = {"int": "number", "float": "number"}


def _branch_kind(value: Value) -> str | None:
    """The kind of value a branch gives, "missing" for None or NaN, None when not known."""
    if isinstance(value, Opaque) and value.is_const and (
            value.const is None or isinstance(value.const, float) and value.const != value.const):
        return "missing"
    dtype = value_dtype(value)
    return None if dtype is None else _KIND_GROUPS.get(dtype, dtype)


def _check_one_kind(then: Value, otherwise: Value, ctx: RuleContext) -> None:
    """pandas stores what the function returns as it is: a number in one branch and a text in
    the other make an object column holding both (1 and "other"), where Polars' when/then
    turns them into one type (the text "1"), which compares and adds otherwise."""
    kinds = [_branch_kind(v) for v in (then, otherwise)]
    known = {k for k in kinds if k not in (None, "missing")}
    if len(known) > 1:
        raise Unsupported(f"the branches give values of several types ({' and '.join(sorted(known))}): "
                          f"the function {MIXED_COLUMN} (each value kept as it is), which no "
                          f"Polars type holds")
    spelled = [v.code.text for v in (then, otherwise) if _branch_kind(v) == "missing"]
    if known - {"str"} and any(re.search(r"(^|\.)NA$", text) for text in spelled):
        # pandas keeps pd.NA beside numbers or True/False in an object column ([1, <NA>, 3],
        # written 1), where None or NaN beside numbers make float64
        raise Unsupported(f"pd.NA beside {known.pop()} values: the function {MIXED_COLUMN} "
                          "([1, <NA>, 3], written 1), which no Polars type holds")
    if known == {"bool"} and any(text == "None" for text in spelled):
        ctx.lower("None beside True/False: pandas keeps an object column of the values and "
                  "None, which it lists and prints as None where porter's missing True/False "
                  "is NaN (written the same: an empty field)", 0.9)
    if None in kinds and known:
        ctx.lower(f"one branch's type is not known: where it is not {known.pop()} as the other's, "
                  f"pandas makes a mixed (object) column and Polars one of a single type", 0.8)


def _truth(cond: Column) -> Code:
    """Python's truth value of the condition. A comparison is null where pandas' is False,
    and pl.when takes the otherwise branch there; a plain value is true when nonzero (or
    non-empty), and a missing value reaches Python as NaN, which is true."""
    if cond.dtype == "bool":
        # a missing value of a True/False column (not a comparison's) is NaN in pandas: true
        return cond.code.method("fill_null", True) if may_hold_nan(cond) else cond.code
    if cond.dtype in ("int", "float"):
        return emit.binop(cond.code, "!=", 0).method("fill_null", True)
    if cond.dtype == "str":
        return emit.binop(cond.code, "!=", emit.pl("lit", "")).method("fill_null", True)
    raise Unsupported("the truth value of a value of unknown type (write the test out, "
                      "for example `x > 0`)")


def _branch(value: Value, cond: Column, ctx: RuleContext) -> Code:
    if isinstance(value, Opaque) and isinstance(value.const, str):
        return emit.pl("lit", value.const)
    if isinstance(value, Column):
        return ctx.bool_expr(value, cond.frame)
    return ctx.expr(value, cond.frame)


@rule("element.lookup")
def element_lookup(call: PandasCall, ctx: RuleContext) -> Value:
    """d[x] / d.get(x, default) in a lambda -> replace_strict(d) / replace_strict(d, default=...).

    Handles: d[x] raises for a value not in d in both; .get gives the default (None by default).
    """
    element = _element(call)
    mapping = call.args[0]
    assert isinstance(mapping, Opaque)
    code_mapping: object = mapping.const if mapping.node is not None and not isinstance(
        mapping.node, cst.Name) else mapping.code
    if isinstance(mapping.const, dict):
        keyed = keys_of_column_type(mapping.const, element.dtype, python=True)
        if keyed is not None:
            code_mapping = keyed
    default = None if isinstance(call.node, cst.Subscript) else call.args[1] \
        if len(call.args) > 1 else Opaque(emit.lit(None), const=None)
    values = list(mapping.const.values()) if isinstance(mapping.const, dict) else None
    kinds = _number_kinds(values or ())
    given = _number_kinds([default.const]) if isinstance(default, Opaque) and default.is_const \
        else {"unknown"} if default is not None else set()
    dtype: str | None = None
    if values is not None and kinds in ({"int"}, {"float"}, {"int", "float"}):
        dtype = "float" if "float" in kinds | given else "int" if given <= {"int", "missing"} \
            else None
        if kinds == {"int", "float"}:
            # Polars builds the new values from the first one's type and fails on 2.5 beside
            # 1: they are given as floats, as pandas makes a column holding both
            code_mapping = {k: float(v) if isinstance(v, int) and not isinstance(v, bool) else v
                            for k, v in (code_mapping.items() if isinstance(code_mapping, dict)
                                         else mapping.const.items())}
        if "other" in given:
            raise Unsupported(f"a default that is not a number beside the dict's numbers: it "
                              f"{MIXED_COLUMN} (each value kept as it is), which no Polars "
                              "type holds")
        if len(kinds | given - {"missing"}) > 1 or "unknown" in given:
            # pandas makes the column of what the function returned: ints and floats are
            # float64, but ints alone (every value found in a dict of ints, or none found in
            # a dict of floats with an int default) int64
            ctx.lower("the dict's values and the default are not all of one number type: "
                      "pandas makes the column float64 only where the values returned mix "
                      "them, and int64 where they are all ints (written 3 where Polars writes "
                      "3.0)", 0.95)
    if default is None:
        code = element.code.method("replace_strict", code_mapping)
    else:
        code = element.code.method("replace_strict", code_mapping,
                                   default=ctx.expr(default, element.frame))
    result = derived_column(element, code, dtype=dtype)
    if dtype == "int" and given == {"missing"}:
        # float64 in pandas when a value is not in the dict, int64 when every one is: Polars
        # gives Int64 with nulls, which later steps read (lost_float_ints)
        result = replace(result, float_int="get() found a value not in the dict")
    return result


def _number_kinds(values: Sequence[object]) -> set[str]:
    """"int", "float", "missing" (None or NaN) or "other" for each value."""
    kinds = set()
    for value in values:
        if value is None or isinstance(value, float) and value != value:
            kinds.add("missing")
        elif isinstance(value, bool) or not isinstance(value, (int, float)):
            kinds.add("other")
        else:
            kinds.add("int" if isinstance(value, int) else "float")
    return kinds


@rule("series.cat.codes")
def cat_codes(call: PandasCall, ctx: RuleContext) -> Value:
    """s.cat.codes -> each value's position among the categories, -1 where it is missing.

    Handles: a column made a category in the same expression (s.astype("category").cat.codes):
    pandas' categories are its distinct texts sorted (a dense rank of the text, less one); an
    Enum (pd.cut's labels, ordered categories): the position of its label (to_physical).
    Caveats: pandas' codes are int8 (int16 beyond 127 categories), Int64 here: the same values
    (0.95). A category column made in an earlier statement (its categories may be those of rows
    a filter has since left out) is a TODO.
    """
    accessor = call.receiver
    column = accessor.column  # type: ignore[attr-defined]
    assert isinstance(column, Column)
    code = column.code
    if column.dtype == "enum":
        codes = code.method("to_physical").method("cast", emit.atom("pl.Int64"))
    elif column.dtype == "category" and code.text.endswith(".cast(pl.Categorical)") \
            and not column.element:
        text = Code(code.text[:-len(".cast(pl.Categorical)")])
        codes = emit.binop(text.method("rank", "dense").method("cast", emit.atom("pl.Int64")),
                           "-", 1)
    else:
        raise Unsupported("the codes of a category column made in an earlier statement (its "
                          "categories can be those of rows a filter has left out) or of a "
                          "column porter does not know to be one")
    ctx.lower("pandas' codes are int8 (int16 beyond 127 categories), Int64 here: the same "
              "values", 0.95)
    return derived_column(column, codes.method("fill_null", -1), dtype="int", name=column.name)


@rule("pd.cut")
def cut(call: PandasCall, ctx: RuleContext) -> Value:
    """pd.cut(s, bins=[edges], labels=[...]) -> pl.when(in bin 1).then(label 1)... as pl.Enum.

    Handles: right-closed bins (left-closed with right=False), include_lowest, values outside
    every bin and missing values (NaN fails every bin, as in pandas) are missing; the labels
    become an Enum, which sorts in the labels' order as pandas sorts its categorical (ordered or
    not).
    labels=False gives the bin numbers 0, 1, ...: integers, which pandas holds as floats when
    a value is missing or outside every bin (the column is marked float_int: written 1.0 then,
    as pandas writes it).
    Caveats: a number of bins (the edges depend on the data), labels=None (pandas' Interval
    values) and repeated labels are TODOs.
    """
    ctx.reject_unknown(call, "x", "bins", "right", "labels", "include_lowest", "ordered",
                       positional=3)
    column = call.arg("x", 0)
    if not isinstance(column, Column):
        raise Unsupported("cutting something other than a column")
    if column.dtype in ("str", "bool", "datetime", "date", "category", "enum"):
        raise Unsupported(f"cutting a {column.dtype} column")
    bins = call.const("bins", 1, None, kinds=(list, tuple))
    if bins is None or not all(isinstance(b, (int, float)) and not isinstance(b, bool) for b in bins):
        raise Unsupported("bins given as a number of bins (the edges depend on the data)")
    if any(a >= b for a, b in zip(bins, bins[1:])) or len(bins) < 2:
        raise Unsupported("bins that do not increase (pandas raises)")
    right = call.const("right", 2, True, kinds=(bool,))
    labels = call.const("labels", 3, None, kinds=(list, tuple, bool))
    numbered = labels is False
    if numbered:
        labels = list(range(len(bins) - 1))  # the bin numbers
    elif not isinstance(labels, (list, tuple)) or not all(isinstance(x, str) for x in labels):
        raise Unsupported("labels other than a list of texts or False (pandas' Interval values)")
    if len(labels) != len(bins) - 1:
        raise Unsupported("a label count that does not match the bins (pandas raises)")
    if len(set(labels)) != len(labels):
        raise Unsupported("repeated labels")
    include_lowest = call.const("include_lowest", None, False, kinds=(bool,))
    call.const("ordered", None, True, kinds=(bool,))  # the Enum sorts in the labels' order either way
    x = column.code
    code: Code | None = None
    for i, (low, high, label) in enumerate(zip(bins, bins[1:], labels)):
        closed = "right" if right else "left"
        if i == 0 and include_lowest and right:
            closed = "both"
        test = x.method("is_between", low, high, closed=closed)
        step = emit.pl("lit", label)
        code = emit.pl("when", test).method("then", step) if code is None \
            else code.method("when", test).method("then", step)
    assert code is not None
    if numbered:
        # a value missing or outside every bin has no number: pandas' bin numbers are then
        # float64 (1.0), which the mark writes as pandas does while such a value remains
        result = derived_column(column, code.method("cast", emit.atom("pl.Int64")), dtype="int")
        return replace(result, float_int="cut() left a value missing or outside every bin")
    code = code.method("cast", emit.pl("Enum", list(labels)))
    return derived_column(column, code, dtype="enum")  # ordered: sorts in the labels' order


# pandas' functions of a Series that df.apply(f, axis=0, **kwargs) calls on each column, each
# with the mapping key of the rule that ports it
PER_COLUMN_FUNCTIONS = {"pandas.to_numeric": "pd.to_numeric"}


def _pandas_function_per_column(call: PandasCall, frame: Frame, qualname: str,
                                ctx: RuleContext) -> Frame:
    """df[cols].apply(pd.to_numeric, errors="coerce"): pandas calls the function on each
    column with the keyword arguments given, and builds a frame of the results with the
    frame's rows: each column ported as the function's own rule ports it."""
    from porter.rules import registry

    if call.const("axis", 1, 0, kinds=(int, str)) not in (0, "index"):
        raise Unsupported("a pandas function given each row (axis=1)")
    if frame.columns is None or not frame.columns:
        raise Unsupported("the frame's columns are not known")
    if frame.index:
        raise Unsupported("a frame with an index of its own")
    if len(call.args) > 2:
        raise Unsupported("arguments of the function given by position (args=)")
    key = PER_COLUMN_FUNCTIONS[qualname]
    rule_function, name = registry()[key], key.split(".")[-1]
    kwargs = {k: v for k, v in call.kwargs.items() if k not in ("func", "axis")}
    ported: dict[str, Column] = {}
    for column in frame.columns:
        each = PandasCall(None, name, (column_of(frame, column),), kwargs, node=call.node)
        result = rule_function(each, ctx)
        if not isinstance(result, Column) or result.frame.rows != frame.rows:
            raise Unsupported(f"{qualname.split('.')[-1]} of column {column!r} gives no column")
        ported[column] = result
    changed = {n: c for n, c in ported.items() if c.code.text != emit.col(n).text}
    if not changed:
        return frame
    exprs = [c.code.method("alias", n) for n, c in changed.items()]
    return with_column_updates(frame, frame.code.method("with_columns", *exprs),
                               {n: c.dtype for n, c in changed.items()})


@rule("frame.apply")
def frame_apply(call: PandasCall, ctx: RuleContext) -> Value:
    """df.apply(f, axis=1) -> one expression over the row's columns.

    Handles: a lambda or the script's own function, whose `if`s and `return`s become a pl.when
    chain and whose local names are inlined; row["c"] and row.c read column c; a condition on a
    missing value takes the else branch (NaN comparisons are False in Python, null conditions
    fall through pl.when); in a row of numbers only, pandas passes every number as a float.
    A function with loops or `try` blocks that reads only text and float columns, changes
    nothing outside itself and always returns one type runs in Python on a dict of the columns
    it reads (map_elements, 0.9; see porter.analysis.row_functions).
    df[cols].apply(pd.to_numeric, errors="coerce") (axis=0): each column as pd.to_numeric's
    rule ports it (_pandas_function_per_column).
    Caveats: axis=0 with other functions, other uses of the row (row.name, row[0]) and
    calls porter does not know are TODOs. Without the column types, an int column is taken
    to reach the function as an int (0.95).
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    function = call.arg("func", 0, None)
    if isinstance(function, Module) and function.qualname in PER_COLUMN_FUNCTIONS:
        return _pandas_function_per_column(call, frame, function.qualname, ctx)
    ctx.reject_unknown(call, "func", "axis", positional=2)
    axis = call.const("axis", 1, 0, kinds=(int, str))
    if axis not in (1, "columns"):
        raise Unsupported("a function per column (axis=0)")
    function = call.arg("func", 0)
    if isinstance(function, Opaque) and isinstance(function.node, cst.Lambda):
        params = function.node.params.params
        if len(params) != 1:
            raise Unsupported("a lambda with more than one parameter")
        param, body = params[0].name.value, function.node.body
    else:
        named = function_value(call, function, ctx)
        if named is None or not named.params.params:
            raise Unsupported("a function porter cannot read")
        try:
            param, body = named.params.params[0].name.value, body_expression(named)
        except Unsupported as exc:
            return _python_rows(frame, named, exc.reason, ctx)
    fields: dict[str, str] = {}
    body = body.visit(_RowFields(param, fields))  # type: ignore[assignment]
    if _uses_name(body, param):
        raise Unsupported("the row is used other than by its column names (row.name, row[0])")
    absent = [c for c in fields.values() if frame.columns is not None and c not in frame.columns]
    if absent:
        raise Unsupported(f"columns {absent} are not in the frame (pandas raises KeyError)")
    kinds = {t for _, t in frame.dtypes}
    all_numbers = frame.columns is not None and len(frame.dtypes) == len(frame.columns) \
        and kinds <= {"int", "float", "bool"}
    if frame.columns is None or len(frame.dtypes) != len(frame.columns):
        ctx.lower("pandas passes a row of numbers only as floats; the column types are not all "
                  "known, so int columns are taken to reach the function as ints", 0.95)
    if all_numbers and _numpy_sensitive(body):
        # a row of numbers is a Series of numpy values: round() is numpy's (0.015 -> 0.02),
        # an int row divides by zero to 0 with // and %, where Python raises
        raise Unsupported("round(), // or % of a row of numbers only, which pandas passes as "
                          "numpy values")
    if not all_numbers and (frame.columns is None or len(frame.dtypes) != len(frame.columns)) \
            and _numpy_sensitive(body):
        ctx.lower("round(), // and % follow numpy's rules where the row holds numbers only "
                  "(the column types are not all known)", 0.9)
    bindings: dict[str, Value] = {}
    for name, column in fields.items():
        value = replace(column_of(frame, column), element=True)
        if all_numbers and "float" in kinds and value.dtype in ("int", "bool"):
            # the row is one float Series: str(row["n"]) is "3.0", as the cast writes it
            value = replace(value, code=value.code.method("cast", emit.atom("pl.Float64")),
                            dtype="float")
        bindings[name] = value
    result = _checked(evaluate_element(body, bindings, ctx), ctx)
    base = Column(emit.pl("lit", None), frame=frame, name=None)
    if isinstance(result, Opaque) and result.is_const:
        return derived_column(base, emit.pl("lit", result.const), name=None)  # the same for every row
    if not isinstance(result, Column):
        raise Unsupported("the function has no expression form porter knows")
    code = result.code.method("fill_null", False) if result.null_is_false else result.code
    return replace(result, code=code, element=False, name=None, null_is_false=False, sites=())


def _python_rows(frame: Frame, function: cst.FunctionDef, reason: str, ctx: RuleContext) -> Column:
    """A row function with no expression form (a loop, a `try`), run by Polars once per row on
    a dict of the columns it reads, when it cannot tell that dict from pandas' row (see
    porter.analysis.row_functions): pl.struct(cols).map_elements(f, return_dtype=...)."""
    name = function.name.value
    if ctx.python_module is None:
        raise Unsupported(reason)
    if frame.columns is None or len(frame.dtypes) != len(frame.columns) or frame.index:
        raise Unsupported(f"{reason}; porter runs {name} on Polars rows only when it knows "
                          f"every column's type (convert with --data)")
    dtypes = dict(frame.dtypes)
    if "str" not in dtypes.values():
        # pandas passes a row of numbers as numpy floats (even the int columns' values)
        raise Unsupported(f"{reason}; a row of numbers only reaches {name} as numpy floats")

    def kinds(column: str) -> frozenset[str]:
        dtype = dtypes.get(column)
        if dtype == "str":
            return frozenset({"str", "float"})  # a missing text is NaN, a float
        if dtype == "float":
            return frozenset({"float"})
        raise NotPortable(f"column {column!r} ({dtype or 'not in the frame'}) is read; porter "
                          f"passes only text and float columns to a Python row function")

    try:
        found = read_row_function(ctx.python_module, name, kinds)
    except NotPortable as exc:
        raise Unsupported(f"{reason}; {exc}") from None
    code = emit.pl("struct", *found.columns).method(
        "map_elements", emit.atom(f"lambda row: {name}({ROW_FUNCTION}(row))"),
        return_dtype=emit.atom(f"pl.{found.returns}"))
    code = _python_result(code, found, ctx)
    ctx.lower(f"runs {name} in Python once per row, on a dict of the columns it reads "
              f"(map_elements), a missing value passed as NaN as pandas passes it; on an empty "
              f"frame pandas calls it once with an empty row", 0.9)
    absent = [c for c in found.columns if c not in frame.columns]
    if absent:
        raise Unsupported(f"columns {absent} are not in the frame (pandas raises KeyError)")
    read = [column_of(frame, c) for c in found.columns]
    return derived_column(read[0], code, name=None, dtype=_PORTER_TYPES[found.returns],
                          others=read[1:])


def _python_values(column: Column, function: cst.FunctionDef, reason: str, skip_missing: bool,
                   ctx: RuleContext) -> Column:
    """A value function with no expression form (a loop, a `try`), run by Polars on each value
    when it cannot tell Polars' values from pandas' (see porter.analysis.row_functions):
    map_elements(f, return_dtype=...), a missing value passed as NaN as pandas passes it."""
    name = function.name.value
    kinds = {"str": frozenset({"str", "float"}), "float": frozenset({"float"})}.get(column.dtype or "")
    if ctx.python_module is None or kinds is None:
        mixed = ""
        if ctx.python_module is not None:
            try:  # what it returns, whatever it is given
                read_value_function(ctx.python_module, name, frozenset({UNKNOWN}))
            except NotPortable as exc:
                mixed = f"; it returns values of several types: it {MIXED_COLUMN}" if exc.mixed else ""
        raise Unsupported(f"{reason}; porter runs {name} on Polars values only on a text or float "
                          f"column whose type it knows (convert with --data){mixed}")
    try:
        found = read_value_function(ctx.python_module, name, kinds)
    except NotPortable as exc:
        # values of several types: the statement that stores them keeps the frame on pandas
        mixed = f": it {MIXED_COLUMN}" if exc.mixed else ""
        raise Unsupported(f"{reason}; {exc}{mixed}") from None
    values = column.code.method("fill_nan", None) if column.dtype == "float" else column.code
    if column.dtype == "str":
        # the same text gives the same result: one call per distinct text, not per row
        code = emit.call(DISTINCT_FUNCTION, values, emit.atom(name),
                         emit.atom(f"pl.{found.returns}"),
                         **({"skip_nulls": True} if skip_missing else {}))
        code = _python_result(code, found, ctx)
        ctx.lower(f"runs {name} in Python once per distinct text (map_distinct), a missing "
                  f"value passed as NaN as pandas passes it", 0.9)
        return derived_column(column, code, name=column.name, dtype=_PORTER_TYPES[found.returns])
    if skip_missing:  # na_action="ignore": pandas leaves a missing value missing
        code = values.method("map_elements", emit.atom(name),
                             return_dtype=emit.atom(f"pl.{found.returns}"))
    else:
        code = values.method("map_elements",
                             emit.atom(f'lambda value: {name}(float("nan") if value is None else value)'),
                             return_dtype=emit.atom(f"pl.{found.returns}"), skip_nulls=False)
    code = _python_result(code, found, ctx)
    ctx.lower(f"runs {name} in Python once per value (map_elements), a missing value passed as "
              f"NaN as pandas passes it", 0.9)
    return derived_column(column, code, name=column.name, dtype=_PORTER_TYPES[found.returns])


# a function of one text that changes nothing else, run once per distinct text of a column
DISTINCT_FUNCTION = "map_distinct"
DISTINCT_DEFINITION = '''\
def map_distinct(texts, function, return_dtype, skip_nulls=False):
    """function(text) on every row, run once per distinct text: the function changes nothing
    outside itself and reads only what the script no longer changes, so it returns the same
    for the same text, and its result is put on every row holding that text. A missing text
    is passed as NaN, as pandas passes it (skip_nulls: it stays missing)."""

    def run(values):
        distinct = values.unique(maintain_order=True)
        if skip_nulls:
            distinct = distinct.drop_nulls()
        results = [function(float("nan") if v is None else v) for v in distinct]
        return values.replace_strict(distinct, pl.Series(results, dtype=return_dtype),
                                     default=None, return_dtype=return_dtype)

    return texts.map_batches(run, return_dtype=return_dtype)
'''


# the Polars type a Python function's results are given -> porter's name for it
_PORTER_TYPES = {"Float64": "float", "Int64": "int", "String": "str", "Boolean": "bool"}


def _python_result(code: Code, found: PythonFunction, ctx: RuleContext) -> Code:
    """The column a Python function's results make, as pandas makes it."""
    ctx.runs_function = True
    if found.returns == "Float64":
        code = code.method("fill_nan", None)  # a NaN it returns is pandas' missing value
    if found.may_return_none:
        ctx.lower(f"{found.name} may return None: where it does for every value, pandas makes an "
                  f"object column of None", 0.9)
    return code


def _numpy_sensitive(node: cst.CSTNode) -> bool:
    """Whether the expression rounds, floor-divides or takes a remainder: on numpy values
    (a row of numbers only) these follow numpy's rules, not Python's."""
    found = []

    class Find(cst.CSTVisitor):
        def visit_Call(self, n: cst.Call) -> None:
            if isinstance(n.func, cst.Name) and n.func.value == "round":
                found.append(n)

        def visit_BinaryOperation(self, n: cst.BinaryOperation) -> None:
            if isinstance(n.operator, (cst.FloorDivide, cst.Modulo)):
                found.append(n)

    node.visit(Find())
    return bool(found)


class _RowFields(cst.CSTTransformer):
    """row["c"] / row.c -> a name standing for column c of the row."""

    def __init__(self, param: str, fields: dict[str, str]) -> None:
        super().__init__()
        self.param = param
        self.fields = fields

    def _field(self, column: str) -> cst.Name:
        for name, known in self.fields.items():
            if known == column:
                return cst.Name(name)
        name = f"_row_field_{len(self.fields)}"
        self.fields[name] = column
        return cst.Name(name)

    def leave_Subscript(self, original: cst.Subscript, updated: cst.Subscript) -> cst.BaseExpression:
        if isinstance(original.value, cst.Name) and original.value.value == self.param \
                and len(original.slice) == 1 and isinstance(original.slice[0].slice, cst.Index) \
                and isinstance(original.slice[0].slice.value, cst.SimpleString):
            column = original.slice[0].slice.value.evaluated_value
            if isinstance(column, str):
                return self._field(column)
        return updated

    def leave_Attribute(self, original: cst.Attribute, updated: cst.Attribute) -> cst.BaseExpression:
        if isinstance(original.value, cst.Name) and original.value.value == self.param \
                and original.attr.value not in pandas_names.SERIES:  # row.name, row.sum()
            return self._field(original.attr.value)
        return updated


def _uses_name(node: cst.CSTNode, name: str) -> bool:
    found = []

    class Find(cst.CSTVisitor):
        def visit_Name(self, n: cst.Name) -> None:
            if n.value == name:
                found.append(n)

        def visit_Attribute(self, n: cst.Attribute) -> bool:
            n.value.visit(self)
            return False

    node.visit(Find())
    return bool(found)


@rule("frame.iterrows")
def iterrows_appends(call: PandasCall, ctx: RuleContext) -> Value:
    """`for _, row in df.iterrows(): a.append(f(row)); b.append(g(row))` -> one select of the
    row functions, collected once, and each list extended with its column.

    The engine hands over the loop's appends as (list name, `lambda row: value`) pairs; each
    value is read as a row function (frame.apply with axis=1). A plain `df.iterrows()` has no
    lazy form: a TODO.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    appends = call.args[0].const if call.args and isinstance(call.args[0], Opaque) else None
    if not appends:
        raise Unsupported("only a loop whose body appends one value per row to lists is ported")
    columns: list[tuple[str, Code]] = []
    for name, function in appends:
        apply = PandasCall(frame, "apply", (Opaque(Code("_"), node=function),),
                           {"axis": Opaque(emit.lit(1), const=1)})
        value = frame_apply(apply, ctx)
        if not isinstance(value, Column) or value.frame.rows != frame.rows:
            raise Unsupported(f"the value appended to {name} has no expression form")
        columns.append((name, value.code))
    ctx.lower("a missing value reaches the list as None, where pandas' row gives NaN or NaT", 0.9)
    # the statements that replace the loop, as (name assigned or None, code)
    if len(columns) == 1:
        name, code = columns[0]
        values = frame.code.method("select", code).method("collect").method("to_series").method("to_list")
        return Opaque(Code(name), const=((None, emit.atom(name).method("extend", values)),))
    collected = frame.code.method("select", **{name: code for name, code in columns}).method("collect")
    statements: list[tuple[str | None, Code]] = [("row_values", collected)]
    statements += [(None, emit.atom(name).method("extend", emit.atom("row_values").index(name).method("to_list")))
                   for name, _ in columns]
    return Opaque(Code("row_values"), const=tuple(statements))


# -- comparison methods, numpy functions on a column -----------------------------------------

_COMPARE_METHODS = {"eq": "==", "ne": "!=", "lt": "<", "le": "<=", "gt": ">", "ge": ">="}


@rule("series.eq", "series.ne", "series.lt", "series.le", "series.gt", "series.ge")
def compare_method(call: PandasCall, ctx: RuleContext) -> Value:
    """s.eq(v) / ne / lt / le / gt / ge -> the operator (==, !=, ...), as `s == v` is ported.

    Handles: everything the operators handle (a missing value compares False, True for ne).
    Caveats: level, fill_value and a list or frame as the other operand are TODOs.
    """
    ctx.reject_unknown(call, "other", positional=1)
    other = call.arg("other", 0)
    if not isinstance(other, (Column, Scalar, Opaque)) or (
            isinstance(other, Opaque) and (not other.is_const
                                           or isinstance(other.const, (list, tuple, dict, set)))):
        raise Unsupported("a comparison with a list, a frame or a value porter does not know")
    return compare(PandasCall(call.receiver, _COMPARE_METHODS[call.name], (other,), node=call.node), ctx)


def _numpy_column(call: PandasCall, ctx: RuleContext, name: str) -> Column:
    ctx.reject_unknown(call, name, positional=1)
    column = call.arg(name, 0)
    if not isinstance(column, Column):
        raise Unsupported(f"np.{call.name} of something other than a column")
    return column


def _as_element(result: Value, column: Column) -> Value:
    """Inside a lambda the result stays a value of the lambda's parameter."""
    return replace(result, element=True) if column.element and isinstance(result, Column) else result


@rule("np.round", "np.around", "np.abs", "np.absolute")
def np_same_as_method(call: PandasCall, ctx: RuleContext) -> Value:
    """np.round(s, n) / np.abs(s) -> what s.round(n) / s.abs() give (.round(n) / .abs()).

    Handles: numpy rounds half to even, as pandas' Series.round and Polars.
    Caveats: a frame (np.round(df)), out= and where= are TODOs.
    """
    if call.name in ("round", "around"):
        ctx.reject_unknown(call, "a", "decimals", positional=2)
        column = call.arg("a", 0)
        if not isinstance(column, Column):
            raise Unsupported("np.round of something other than a column")
        if column.dtype in ("str", "bool", "datetime", "date", "category", "enum"):
            raise Unsupported(f"np.round of a {column.dtype} column")
        kwargs = {"decimals": call.kwargs["decimals"]} if "decimals" in call.kwargs else {}
        args = call.args[1:2]
        result = round_(PandasCall(column, "round", tuple(args), kwargs, call.node), ctx)
    else:
        column = _numpy_column(call, ctx, "x")
        if column.dtype in ("str", "datetime", "date", "category", "enum"):
            raise Unsupported(f"np.abs of a {column.dtype} column")
        if column.dtype == "bool":
            raise Unsupported("np.abs of a True/False column")
        result = abs_(PandasCall(column, "abs", (), {}, call.node), ctx)
    return _as_element(result, column)


@rule("np.clip")
def np_clip(call: PandasCall, ctx: RuleContext) -> Value:
    """np.clip(s, lower, upper) -> what s.clip(lower, upper) gives (.clip(lower, upper)).

    Handles: numpy hands a Series to its own clip method (np.clip calls s.clip(a_min, a_max)),
    so the values, the types and the bounds the wrong way round are pandas' Series.clip's;
    a None bound is no bound, as there.
    Caveats: a frame (np.clip(df, ...)), out= and numpy's min= / max= spellings are TODOs.
    """
    ctx.reject_unknown(call, "a", "a_min", "a_max", positional=3)
    column = call.arg("a", 0)
    if not isinstance(column, Column):
        raise Unsupported("np.clip of something other than a column")
    if not (call.has("a_min", 1) and call.has("a_max", 2)):
        raise Unsupported("np.clip without both bounds (numpy requires them)")
    if column.dtype in ("str", "bool", "datetime", "date", "category", "enum"):
        raise Unsupported(f"np.clip of a {column.dtype} column")
    bounds = (call.arg("a_min", 1), call.arg("a_max", 2))
    return _as_element(clip(PandasCall(column, "clip", bounds, {}, call.node), ctx), column)


# numpy functions of a column that Polars evaluates with numpy itself (`np.log(pl.col("v"))`
# runs the ufunc on the column's values, missing values kept missing): numpy's own SIMD code
# for log, exp and the trigonometric functions can be a binary digit off the C library's,
# which Polars' .log() / .exp() use (about 1 value in 1,000 for log, 1 in 30 for exp), so
# numpy computes them here as it does in pandas
_NUMPY_UFUNCS = frozenset({
    "log", "log1p", "log2", "log10", "exp", "exp2", "expm1", "cbrt", "square", "sign",
    "sin", "cos", "tan", "arcsin", "arccos", "arctan", "sinh", "cosh", "tanh",
    "arcsinh", "arccosh", "arctanh", "degrees", "radians", "deg2rad", "rad2deg",
})
# those that give NaN for a number that is not NaN (a negative log, sin of inf, arcsin of 2):
# pandas counts NaN as missing, so the result is made missing (fill_nan(None))
_NAN_MAKING = frozenset({
    "log", "log1p", "log2", "log10", "sin", "cos", "tan", "arcsin", "arccos", "arccosh",
    "arctanh",
})
# those that keep an integer column's integers (np.sign(3) is 3, np.square(3) is 9)
_INT_KEEPING = frozenset({"square", "sign"})


@rule("np.sqrt")
def np_sqrt(call: PandasCall, ctx: RuleContext) -> Value:
    """np.sqrt(s) -> .sqrt().

    Handles: the square root is correctly rounded in both (IEEE 754), so Polars' own gives
    numpy's digits; a negative number gives NaN, which pandas counts as missing: made missing
    (fill_nan(None)); integer columns give floats in both.
    Caveats: text, date and True/False columns (numpy's float16 for booleans) are TODOs.
    """
    column = _numpy_column(call, ctx, "x")
    if column.dtype not in (None, "int", "float"):
        raise Unsupported(f"np.sqrt of a {column.dtype} column")
    code = column.code.method("sqrt").method("fill_nan", None)
    return _as_element(derived_column(column, code, dtype="float"), column)


@rule(*(f"np.{name}" for name in sorted(_NUMPY_UFUNCS)))
def np_ufunc(call: PandasCall, ctx: RuleContext) -> Value:
    """np.log(s) / np.exp(s) / np.log1p(s) / np.sin(s) / ... -> np.log(<expr>): numpy's own
    function run on the column's values by Polars (an expression; missing values stay missing).

    Handles: numpy computes the values, as it does for pandas: Polars' .log() and .exp() use
    the C library's functions, a binary digit off numpy's own on this kind of machine for
    about 1 value in 1,000 (log) or 30 (exp); log of 0 is -inf in both; a NaN made from a
    number (the log of a negative number, arcsin(2), sin(inf)) is missing in pandas: made
    missing (fill_nan(None)); integer columns give floats, except np.sign and np.square, which
    keep them (an integer column pandas holds as floats, a missing value, gives floats).
    Caveats: text, date and True/False columns (numpy's float16 for booleans) are TODOs, as
    are out=, where= and a second argument.
    """
    name = call.name
    column = _numpy_column(call, ctx, "x")
    if column.dtype not in (None, "int", "float"):
        raise Unsupported(f"np.{name} of a {column.dtype} column")
    code = column.code
    dtype = "float"
    if name in _INT_KEEPING:
        dtype = column.dtype  # type: ignore[assignment]
        if column.dtype == "int" and column.float_int and not column.python_int:
            code, dtype = code.method("cast", emit.atom("pl.Float64")), "float"
    func = cst.Module([]).code_for_node(call.node.func) if isinstance(call.node, cst.Call) \
        else f"np.{name}"
    code = emit.call(func, code)
    if name in _NAN_MAKING:
        code = code.method("fill_nan", None)
    return _as_element(derived_column(column, code, dtype=dtype), column)


@rule("np.ceil", "np.floor")
def np_ceil_floor(call: PandasCall, ctx: RuleContext) -> Value:
    """np.ceil(s) / np.floor(s) -> .ceil() / .floor(), of one value inside a lambda too.

    Handles: numpy (2.x) keeps an integer column's ints (3, written so), as Polars does; an
    integer column pandas holds as floats (a missing value) gives floats; -0.5 rounds up to
    -0.0 in both; NaN stays NaN (missing).
    Caveats: text, date and True/False columns are TODOs.
    """
    column = _numpy_column(call, ctx, "x")
    if column.dtype not in ("int", "float"):
        raise Unsupported(f"np.{call.name} of a {column.dtype or 'value of unknown type'}")
    code, dtype = column.code, column.dtype
    if column.dtype == "int" and column.float_int and not column.python_int:
        code, dtype = code.method("cast", emit.atom("pl.Float64")), "float"
    return _as_element(derived_column(column, code.method(call.name), dtype=dtype), column)


# -- np.select --------------------------------------------------------------------------------

def _listed(value: Value, what: str) -> list[Value]:
    if isinstance(value, Items):
        return list(value.items)
    if isinstance(value, Opaque) and isinstance(value.const, (list, tuple)):
        return [Opaque(emit.lit(v), const=v) for v in value.const]
    raise Unsupported(f"the {what} are not a list written in the script")


_CONSTANT_KINDS = (bool, int, float, str)


@rule("np.select")
def np_select(call: PandasCall, ctx: RuleContext) -> Value:
    """np.select([c1, c2], [v1, v2], default=d) -> pl.when(c1).then(v1).when(c2).then(v2)
    .otherwise(d).

    Handles: the first true condition wins, as in numpy; a condition that met a missing value
    (a comparison) is False and the next one is tried; constant choices take numpy's common
    type (computed with numpy), ints with floats are floats, NaN among numbers is missing,
    whole numbers are Int64.
    Caveats: numpy raises on text mixed with numbers (the default 0 with text choices): a TODO,
    kept on numpy. It raises too on a True/False condition column with blanks (an object
    array), where Polars takes a blank as not true: 0.95 where the column may hold blanks.
    Columns among the choices mixed with constants of another kind are TODOs.
    """
    import numpy as np

    ctx.reject_unknown(call, "condlist", "choicelist", "default", positional=3)
    conds = _listed(call.arg("condlist", 0), "conditions")
    choices = _listed(call.arg("choicelist", 1), "choices")
    default = call.arg("default", 2, Opaque(emit.lit(0), const=0))
    if not conds or len(conds) != len(choices):
        raise Unsupported("as many conditions as choices are needed (numpy raises)")
    if not all(isinstance(c, Column) for c in conds):
        raise Unsupported("a condition that is not a column")
    values = [*choices, default]
    base = conds[0]
    assert isinstance(base, Column)
    frame = base.frame
    if any(isinstance(v, Column) and v.frame.rows != frame.rows for v in (*conds, *values)):
        raise Unsupported("conditions and choices of different frames")
    constant = [isinstance(v, Opaque) and isinstance(v.const, _CONSTANT_KINDS) for v in values]
    dtype: str | None
    if all(constant):
        # numpy's own result: one row per branch, the last the default
        n = len(conds)
        try:
            picked = np.select([np.arange(n + 1) == k for k in range(n)],
                               [v.const for v in choices], default=default.const)  # type: ignore[union-attr]
        except (TypeError, ValueError) as exc:
            raise Unsupported(f"numpy refuses these choices ({type(exc).__name__}: text mixed with "
                              "numbers has no common type)") from None
        kind = picked.dtype.kind
        if kind == "U":
            codes = [emit.pl("lit", str(x)) for x in picked.tolist()]
            dtype = "str"
        elif kind == "f":
            items = [None if x != x else float(x) for x in picked.tolist()]
            codes = [emit.pl("lit", x) for x in items]
            if all(x is None for x in items):
                codes = [emit.pl("lit", None, dtype=emit.atom("pl.Float64")) for _ in items]
            dtype = "float"
        elif kind == "i":
            codes = [int64_lit(int(x)) for x in picked.tolist()]
            dtype = "int"
        elif kind == "b":
            codes = [emit.pl("lit", bool(x)) for x in picked.tolist()]
            dtype = "bool"
        else:
            raise Unsupported(f"choices numpy makes {picked.dtype} of")
    else:
        kinds = set()
        for v in values:
            if isinstance(v, Column):
                kinds.add(v.dtype)
            elif isinstance(v, Opaque) and isinstance(v.const, _CONSTANT_KINDS):
                c = v.const
                kinds.add("bool" if isinstance(c, bool) else "str" if isinstance(c, str)
                          else "number")
            else:
                raise Unsupported("a choice porter does not know the type of")
        numbers = {"int", "float", "number"}
        if kinds <= numbers and kinds & {"int", "float"}:
            dtype = "float" if kinds & {"float"} or any(
                isinstance(v, Opaque) and isinstance(v.const, float) for v in values) else "int"
        elif kinds in ({"str"}, {"bool"}):
            dtype = kinds.pop()
        else:
            raise Unsupported("choices of different or unknown types: numpy makes them one type "
                              "(numbers become text, or an object array)")
        codes = []
        for v in values:
            if isinstance(v, Column):
                codes.append(ctx.bool_expr(v, frame) if v.dtype == "bool" else ctx.expr(v, frame))
            else:
                c = v.const  # type: ignore[union-attr]
                codes.append(emit.pl("lit", None if isinstance(c, float) and c != c else c))
    code: Code | None = None
    for cond, value in zip(conds, codes):
        if may_hold_nan(cond):
            # a True/False column with blanks is an object column in pandas: numpy refuses it
            ctx.lower("a True/False condition column with blanks is an object column in pandas, "
                      "which np.select refuses (TypeError); Polars takes a blank as not true", 0.95)
        test = ctx.expr(cond, frame)
        code = emit.pl("when", test).method("then", value) if code is None \
            else code.method("when", test).method("then", value)
    assert code is not None
    code = code.method("otherwise", codes[-1])
    return derived_column(base, code, dtype=dtype, name=None, others=[*conds, *values])


# -- row-wise reductions -------------------------------------------------------------------------

_HORIZONTAL = {"sum": "sum_horizontal", "max": "max_horizontal", "min": "min_horizontal",
               "mean": "mean_horizontal"}


@rule("frame.median")
def frame_median(call: PandasCall, ctx: RuleContext) -> Value:
    """df.median() -> each column's median as pandas computes it (per column, axis=0).

    Handles: numbers and True/False (1 and 0), the two middle values added and halved for an
    even count, missing values skipped; numeric_only=True when every column's type is known.
    Caveats: axis=1, skipna=False and text or date columns are TODOs."""
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "axis", "skipna", "numeric_only", positional=1)
    if call.const("axis", 0, 0, kinds=(int, str)) not in (0, "index"):
        raise Unsupported("a median per row (axis=1)")
    if not call.const("skipna", None, True, kinds=(bool,)):
        raise Unsupported("skipna=False")
    return _per_column(call, frame, ctx)


@rule("frame.sum", "frame.max", "frame.min", "frame.mean", "frame.count")
def frame_rowwise(call: PandasCall, ctx: RuleContext) -> Value:
    """df[[a, b]].sum(axis=1) / max / min / mean / count -> pl.sum_horizontal(a, b) / ...

    Handles: missing values are skipped as pandas' skipna: a row with none sums to 0 and has a
    missing max, min and mean; sum(min_count=k) is missing where fewer than k values are
    present; a sum of True/False columns counts them (Int64, as pandas' int64); count(axis=1)
    counts the present values of columns of any type (Int64).
    numeric_only=True reads the number and True/False columns, when every column's type is
    known. sum(axis=1) of a pivoted table whose columns porter does not know (unstack,
    crosstab of counts, pivot_table of numbers), before any other step: every column but the
    keys, NaN skipped.
    Caveats: per-column totals (axis=0: pandas gives a Series indexed by column name),
    skipna=False, text or date columns (and True/False ones but for sum and count) and
    numeric_only=True with a column of unknown type are TODOs. Without the column types,
    an integer column holding missing values is float in pandas (3.0 where Polars writes 3)
    (0.95).
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    if call.name == "count":
        return _row_count(call, frame, ctx)
    known = ["axis", "skipna", "numeric_only"] + (["min_count"] if call.name == "sum" else [])
    ctx.reject_unknown(call, *known, positional=1)
    axis = call.const("axis", 0, 0, kinds=(int, str, type(None)))
    if not call.const("skipna", None, True, kinds=(bool,)):
        raise Unsupported("skipna=False")
    if axis in (0, "index"):
        return _per_column(call, frame, ctx)
    if axis not in (1, "columns"):
        raise Unsupported(f"a {call.name} of the whole frame (axis=None)")
    min_count = call.const("min_count", None, 0, kinds=(int,)) if call.name == "sum" else 0
    pivoted, cells = number_cells(frame)
    if pivoted and frame.index and call.name == "sum" and min_count == 0:
        return _pivot_row_sum(frame, cells)
    columns = _row_columns(call, frame)
    kinds = {c.dtype for c in columns}
    allowed = {None, "int", "float", "bool"} if call.name == "sum" else {None, "int", "float"}
    if not kinds <= allowed:
        raise Unsupported(f"a row {call.name} over {', '.join(sorted(str(k) for k in kinds - allowed))} "
                          "columns")
    if None in kinds:
        ctx.lower("the column types are not known: an integer column holding missing values is "
                  "float in pandas, so its row-wise result is written 3.0 where Polars writes 3",
                  0.95)
    codes = [c.code for c in columns]
    code = emit.pl(_HORIZONTAL[call.name], *codes)
    dtype = "float" if call.name == "mean" or "float" in kinds else ("int" if None not in kinds else None)
    if call.name == "sum" and "bool" in kinds and "float" not in kinds:
        code = code.method("cast", emit.atom("pl.Int64"))  # a count of True: UInt32 in Polars
    if "float" in kinds and kinds & {"int", "bool"}:
        code = code.method("cast", emit.atom("pl.Float64"))
    if min_count > 0:
        present = [c.method("is_not_null") for c in codes]
        enough = emit.pl("any_horizontal", *present) if min_count == 1 else emit.binop(
            emit.pl("sum_horizontal", *present), ">=", min_count)
        code = emit.when(enough, code)
    base = Column(emit.pl("lit", None), frame=frame, name=None)
    return derived_column(base, code, dtype=dtype, name=None, others=columns)


def _pivot_row_sum(frame: Frame, cells: str | None) -> Column:
    """wide.sum(axis=1) of a pivoted table whose columns porter does not know (unstack,
    crosstab): every column but the index keys holds numbers, so the row sum is a
    sum_horizontal over them; missing cells are skipped (a row of none sums to 0, as pandas).
    NaN is skipped as missing (pandas' skipna). The 0 added keeps a table without columns (no
    rows were pivoted) summable, as pandas'."""
    cells_code = emit.pl("exclude", *frame.index)
    if cells != "int":
        cells_code = cells_code.method("fill_nan", None)
    code = emit.pl("sum_horizontal", cells_code, emit.pl("lit", 0))
    base = Column(emit.pl("lit", None), frame=frame, name=None)
    return derived_column(base, code, dtype=cells, name=None)


def _row_count(call: PandasCall, frame: Frame, ctx: RuleContext) -> Value:
    ctx.reject_unknown(call, "axis", "numeric_only", positional=1)
    if call.const("axis", 0, 0, kinds=(int, str)) in (0, "index"):
        return _per_column(call, frame, ctx)
    if call.const("axis", 0, 0, kinds=(int, str)) not in (1, "columns"):
        raise Unsupported("a count of the whole frame")
    columns = _row_columns(call, frame)
    present = [c.code.method("is_not_null") for c in columns]
    code = emit.pl("sum_horizontal", *present).method("cast", emit.atom("pl.Int64"))
    base = Column(emit.pl("lit", None), frame=frame, name=None)
    return derived_column(base, code, dtype="int", name=None, others=columns)


def _per_column(call: PandasCall, frame: Frame, ctx: RuleContext) -> Column:
    """df.sum() / mean / min / max / count per column (axis=0): pandas' Series indexed by the
    column names, as a frame of the names and the values (totals.column_totals).

    count counts the present values of columns of any type; sum, mean, min and max need
    every column's type: numbers (and True/False for sum and mean, counted as 1 and 0), where
    pandas would reduce text or dates too, or give an object Series of mixed values. Floats
    are added as pandas adds them (numpy's pairwise sum, totals.pandas_reduce); integers exactly,
    and made float beside a float column as pandas makes the Series float64."""
    if call.name == "sum" and call.const("min_count", None, 0, kinds=(int,)) > 0:
        raise Unsupported("min_count per column")
    if frame.columns is None:
        return _pivot_totals(call, frame, ctx)
    if not frame.columns:
        raise Unsupported("the frame's columns are not known")
    names = [c.name for c in _row_columns(call, frame)]  # type: ignore[misc]
    if call.const("numeric_only", None, False, kinds=(bool,)):
        ctx.lower("numeric_only=True picks the columns by the types porter knows: pandas reads "
                  "a file with a header and no rows as text in every column, and reduces none "
                  "of them", 0.95)
    if call.name == "count":
        return column_totals(frame, names, lambda c: emit.col(c).method("count").method(
            "cast", emit.atom("pl.Int64")), "int")
    kinds = {c: frame.dtype(c) for c in names}
    allowed = {"int", "float", "bool"} if call.name in ("sum", "mean", "median") \
        else {"int", "float"}
    other = sorted({str(k) for k in kinds.values() if k not in allowed})
    if other:
        raise Unsupported(f"a {call.name} per column over {', '.join(other)} columns (pandas "
                          "reduces text and dates too, or gives an object Series)")
    floats = "float" in kinds.values() or call.name in ("mean", "median")
    as_float = emit.atom("pl.Float64")

    def reduce(name: str) -> Code:
        column = emit.col(name)
        if call.name == "median":  # numpy's: the two middle values added and halved
            return pandas_median(column if kinds[name] == "float" else column.method("cast", as_float))
        if call.name == "mean":
            # pandas adds the values as float64, with numpy's pairwise sum, over the count
            return pandas_reduce(column if kinds[name] == "float" else column.method("cast", as_float),
                                 "mean")
        if call.name == "sum" and kinds[name] == "float":
            return pandas_reduce(column)
        if call.name == "sum":  # whole numbers and True/False: exact, int64 as pandas'
            total = column.method("sum").method("cast", emit.atom("pl.Int64"))
            return total.method("cast", as_float) if floats else total
        extreme = column.method(call.name)
        return extreme.method("cast", as_float) if floats and kinds[name] == "int" else extreme

    return column_totals(frame, names, reduce, "float" if floats else "int")


def _pivot_totals(call: PandasCall, frame: Frame, ctx: RuleContext) -> Column:
    """pivoted.sum() / mean / min / max / count per column of a table an unstack or crosstab
    made (its columns the text values of a key, porter not knowing which; every cell a number
    of one type): pandas' Series labelled by the column names, its labels named after the
    columns' name (the key's). Every column but the index keys reduced at once, unpivoted in
    the columns' order; floats added as pandas adds them (totals.pandas_reduce)."""
    from porter.translate.context import number_cells
    pivoted, kind = number_cells(frame)
    if not pivoted or frame.columns_kind != "str" or frame.column_pairs or frame.value_levels:
        raise Unsupported("the frame's columns are not known")
    if call.has("numeric_only") or call.has("skipna"):
        raise Unsupported("numeric_only= or skipna= on a pivoted table")
    if kind == "bool" and call.name not in ("sum", "mean", "count"):
        raise Unsupported(f"{call.name} per column of a table of True/False")
    if kind not in ("int", "float", "bool", None) or kind is None and call.name == "sum":
        # (a sum adds whole numbers exactly and floats as numpy does: the type decides)
        raise Unsupported("a pivoted table whose cells' type porter does not know")
    cells = emit.pl("exclude", *frame.index) if frame.index else emit.pl("all")
    if kind not in ("int", "bool") and call.name != "count":
        cells = cells.method("fill_nan", None)  # NaN is skipped, as pandas skips it
    as_float = emit.atom("pl.Float64")
    if call.name == "count":
        values, dtype = cells.method("count").method("cast", emit.atom("pl.Int64")), "int"
    elif call.name == "sum":
        # whole numbers and True/False (counted as 1) exactly, int64; floats as numpy adds them
        values = pandas_reduce(cells) if kind == "float" \
            else cells.method("sum").method("cast", emit.atom("pl.Int64"))
        dtype = "float" if kind == "float" else "int"
    elif call.name == "mean":
        values = pandas_reduce(cells if kind == "float" else cells.method("cast", as_float), "mean")
        dtype = "float"
    elif call.name in ("min", "max"):
        # cells of a type the data decides (an unstack of whole numbers with a combination
        # missing is float64 in both): the unpivot gives the columns' common type, as pandas
        values, dtype = cells.method(call.name), kind
    else:
        raise Unsupported(f"{call.name} per column of a pivoted table")
    label = frame.columns_name if frame.columns_name is not None else "index"
    if label in frame.index or label == VALUE:
        raise Unsupported("the columns' name is an index key's")
    code = frame.code.method("select", values).method(
        "unpivot", variable_name=label, value_name=VALUE)
    rows = fresh_token()
    # the column names, each once, in the pivot's sorted order: labels of distinct values
    result = Frame(code, columns=(label, VALUE), index=(label,),
                   index_unnamed=frame.columns_name is None, labels_intact=False,
                   dtypes=((label, "str"), (VALUE, dtype)), rows=rows, grouped_rows=rows)
    return Column(emit.col(VALUE), frame=result, name=None, dtype=dtype, refs=frozenset({VALUE}))


def _row_columns(call: PandasCall, frame: Frame) -> list[Column]:
    """The columns a row-wise reduction reads: all of them, or the numbers and True/False
    columns with numeric_only=True (which needs every column's type)."""
    if frame.columns is None or not frame.columns:
        raise Unsupported("the frame's columns are not known")
    # the columns that hold pandas' index (a groupby's keys, a pivot's) are not columns there
    names = [c for c in frame.columns if c not in frame.index]
    if not names:
        raise Unsupported("a frame without columns beside its index")
    if call.const("numeric_only", None, False, kinds=(bool,)):
        if any(frame.dtype(c) is None for c in names):
            raise Unsupported("numeric_only=True where porter does not know every column's type")
        names = [c for c in names if frame.dtype(c) in ("int", "float", "bool")]
        if not names:
            raise Unsupported("numeric_only=True on a frame without number columns")
    return [column_of(frame, c) for c in names]


@rule("frame.pipe")
def frame_pipe(call: PandasCall, ctx: RuleContext) -> Value:
    """df.pipe(lambda d: ...) -> the lambda's body with d standing for the frame.

    Handles: a lambda of one parameter whose body porter ports (a filter, an assign, a chain
    of methods); what it gives back (a frame, a column, a value) is what pandas' pipe gives.
    df.pipe(clean, ...) with a function the script defines never reaches this rule: it is
    written clean(df, ...) before translation (analysis/pipes.py), unless `.pipe(` starts a
    line of its own.
    Caveats: other functions (imported, bound again), a lambda with extra arguments and a
    (function, keyword) tuple are TODOs.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "func", positional=1)
    func = call.arg("func", 0, None)
    if not (isinstance(func, Opaque) and isinstance(func.node, cst.Lambda)):
        raise Unsupported("a function other than a lambda (write its body on the frame, or "
                          "use LazyFrame.pipe once it takes and returns a LazyFrame)")
    return frame_lambda(func.node, frame, ctx)


@rule("frame.map", "frame.applymap")
def frame_map(call: PandasCall, ctx: RuleContext) -> Value:
    """df.map(func) / df.applymap(func) -> each column mapped as s.map(func) maps it, in one
    with_columns: pandas' DataFrame.map is Series.map over every column (applymap is its name
    before pandas 2.1; pandas 3 removed it, and the port runs where pandas no longer does).

    Handles: whatever s.map takes (a lambda, the script's own function, a dict),
    na_action="ignore", with each column's result typed as Series.map types it.
    Caveats: a function porter cannot port on one of the columns makes the whole call a TODO;
    so does a frame whose columns porter does not know or with an index of its own.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "func", "na_action", positional=1)
    if frame.columns is None or not frame.columns:
        raise Unsupported("the frame's columns are not known")
    if frame.index:
        raise Unsupported("a frame with an index of its own")
    func = call.arg("func", 0)
    if isinstance(func, Opaque) and isinstance(func.const, dict):
        raise Unsupported("a dict: DataFrame.map takes a function (pandas raises TypeError)")
    kwargs = {"na_action": call.kwargs["na_action"]} if "na_action" in call.kwargs else {}
    mapped: dict[str, Column] = {}
    for name in frame.columns:
        each = PandasCall(column_of(frame, name), "map", (func,), kwargs, node=call.node)
        result = map_(each, ctx)
        if not isinstance(result, Column):
            raise Unsupported("the function gives no column")
        mapped[name] = result
    exprs = [c.code.method("alias", name) for name, c in mapped.items()]
    return with_column_updates(frame, frame.code.method("with_columns", *exprs),
                               {name: c.dtype for name, c in mapped.items()})
