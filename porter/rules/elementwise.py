"""Element-wise functions: map(dict), map / apply with a lambda, and what a lambda body may
contain (arithmetic, comparisons, `a if cond else b`, string methods, dict lookups).

A lambda is not run row by row: its body is evaluated once with the parameter standing for the
column, and becomes one expression (pl.when / replace_strict / str.*). A missing value reaches a
pandas lambda as NaN, where comparisons are False, so `a if x > 1 else b` gives b; in Polars the
condition is null and pl.when takes the otherwise branch: the same result.
"""

from __future__ import annotations

from dataclasses import replace

import libcst as cst

from porter.emit import code as emit
from porter.emit.code import Code
from porter.rules import rule
from porter.translate.context import (
    PandasCall, RuleContext, Unsupported, derived_column, value_dtype,
)
from porter.translate.values import Column, Frame, Opaque, Value


def frame_lambda(node: cst.Lambda, frame: Frame, ctx: RuleContext) -> Value:
    """`lambda d: <expression of d>` with d standing for the frame."""
    params = node.params.params
    if len(params) != 1 or node.params.star_arg not in (None, cst.MaybeSentinel.DEFAULT):
        raise Unsupported("a lambda with more than one parameter")
    return _checked(ctx.evaluate(node.body, {params[0].name.value: frame}), ctx)


def element_lambda(node: cst.Lambda, column: Column, ctx: RuleContext) -> Column:
    """`lambda x: <expression of one value>` as an expression over `column`."""
    params = node.params.params
    if len(params) != 1 or node.params.star_arg not in (None, cst.MaybeSentinel.DEFAULT):
        raise Unsupported("a lambda with more than one parameter")
    element = replace(column, element=True, sites=())
    result = _checked(ctx.evaluate(node.body, {params[0].name.value: element}), ctx)
    if isinstance(result, Opaque) and result.is_const:
        return derived_column(column, emit.pl("lit", result.const), name=column.name)
    if not isinstance(result, Column):
        raise Unsupported("the lambda body has no expression form porter knows")
    code = result.code.method("fill_null", False) if result.null_is_false else result.code
    return replace(result, code=code, element=False, name=column.name, null_is_false=False, sites=())


def _checked(value: Value, ctx: RuleContext) -> Value:
    if any(site.status == "todo" for site in value.sites):
        raise Unsupported("part of the function has no expression form: "
                          + "; ".join(s.message for s in value.sites if s.status == "todo"))
    # the lambda's own sites are folded into this one: keep their lowered confidences
    for site in value.sites:
        if site.confidence < ctx.confidence:
            ctx.lower(f"{site.key}: {site.message}", site.confidence)
    return value


def _function(call: PandasCall) -> Value:
    return call.arg("arg", 0) if call.name == "map" else call.arg("func", 0)


@rule("series.map", "series.apply")
def map_(call: PandasCall, ctx: RuleContext) -> Value:
    """s.map(dict) -> .replace_strict(dict, default=None); s.map(lambda x: ...) / s.apply(lambda
    x: ...) -> one expression.

    Handles: values missing from the dict become missing (pandas map); lambdas become pl.when /
    str.* / arithmetic expressions, never a per-row Python call.
    Caveats: named functions and lambdas with calls porter does not know are TODOs.
    """
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call, "arg", "func", "na_action", positional=1)
    function = _function(call)
    if isinstance(function, Opaque) and isinstance(function.const, dict):
        if call.name == "apply":
            raise Unsupported("apply with a dict")
        # a named dict stays named in the output; a literal is written out
        mapping: object = function.code if function.code.text.isidentifier() else function.const
        return derived_column(column, column.code.method("replace_strict", mapping, default=None),
                              name=column.name)
    if isinstance(function, Opaque) and isinstance(function.node, cst.Lambda):
        result = element_lambda(function.node, column, ctx)
        if call.const("na_action", None, None) == "ignore":
            # pandas does not call the function on a missing value: it stays missing
            code = emit.when(column.code.method("is_not_null"), result.code)
            return replace(result, code=code)
        return result
    raise Unsupported("a named function: write its body as a lambda or as column expressions")


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
    """len(x) in a lambda -> str.len_chars() (characters, as Python counts them)."""
    element = _element(call)
    if element.dtype not in (None, "str"):
        raise Unsupported("len of a non-text value")
    code = element.code.attr("str").method("len_chars").method("cast", emit.atom("pl.Int64"))
    return _value(element, code, dtype="int")


@rule("element.str", "element.int", "element.float")
def element_cast(call: PandasCall, ctx: RuleContext) -> Value:
    """str(x) / int(x) / float(x) in a lambda -> cast.

    Handles: str() of a boolean is True/False and of a missing value "nan", as Python writes
    them.
    Caveats: Python writes some floats differently (1e-05, Polars 0.00001) (0.85).
    """
    element = _element(call)
    if call.name == "str":
        if element.dtype == "bool":
            code = emit.pl("when", element.code).method("then", emit.pl("lit", "True")).method(
                "when", emit.unary("~", element.code)).method("then", emit.pl("lit", "False"))
            return _value(element, code.method("otherwise", emit.pl("lit", "nan")), dtype="str")
        if element.dtype in (None, "float"):
            ctx.lower("Python's str() writes some floats (1e-05) and, without the column type, "
                      "booleans (True) differently from Polars' text", 0.85)
        code = element.code.method("cast", emit.atom("pl.String"))
        if element.dtype != "int":  # a missing value reaches str() as NaN: "nan"
            code = code.method("fill_null", "nan")
        return _value(element, code, dtype="str")
    target = {"int": "pl.Int64", "float": "pl.Float64"}[call.name]
    if call.name == "int":
        ctx.lower("int() of a missing value raises in pandas; Polars keeps it missing", 0.95)
    return _value(element, element.code.method("cast", emit.atom(target)), dtype=call.name)


@rule("element.round", "element.abs")
def element_number(call: PandasCall, ctx: RuleContext) -> Value:
    """round(x, n) / abs(x) in a lambda -> .round(n) / .abs()."""
    element = _element(call)
    if call.name == "abs":
        return _value(element, element.code.method("abs"), dtype=element.dtype)
    digits = call.const("ndigits", 0, None)
    if digits is None:
        ctx.lower("round(x) without digits gives an int in Python, a float in Polars", 0.95)
        return _value(element, element.code.method("round", 0), dtype="float")
    if not isinstance(digits, int) or digits < 0:
        raise Unsupported("negative digits")
    return _value(element, element.code.method("round", digits), dtype=element.dtype)


@rule("element.ifexp")
def element_ifexp(call: PandasCall, ctx: RuleContext) -> Value:
    """`a if cond else b` -> pl.when(cond).then(a).otherwise(b).

    Handles: a condition on a missing value is False in Python (NaN comparisons) and null in
    Polars; both take the else branch. A plain value as the condition is Python's truth value
    (nonzero, non-empty; NaN is true).
    Caveats: a value of unknown type as the condition is a TODO.
    """
    cond = call.receiver
    assert isinstance(cond, Column)
    then, otherwise = call.args
    code = emit.when(_truth(cond), _branch(then, cond, ctx), _branch(otherwise, cond, ctx))
    kinds = {value_dtype(v) for v in (then, otherwise)}
    return derived_column(cond, code, dtype=kinds.pop() if len(kinds) == 1 else None,
                          others=[v for v in (then, otherwise) if isinstance(v, Column)])


def _truth(cond: Column) -> Code:
    """Python's truth value of the condition. A comparison is null where pandas' is False,
    and pl.when takes the otherwise branch there; a plain value is true when nonzero (or
    non-empty), and a missing value reaches Python as NaN, which is true."""
    if cond.dtype == "bool":
        raw = cond.name is not None and cond.code.text == emit.col(cond.name).text
        return cond.code.method("fill_null", True) if raw else cond.code
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
    if isinstance(call.node, cst.Subscript):
        code = element.code.method("replace_strict", code_mapping)
    else:
        default = call.args[1] if len(call.args) > 1 else Opaque(emit.lit(None), const=None)
        code = element.code.method("replace_strict", code_mapping,
                                   default=ctx.expr(default, element.frame))
    return derived_column(element, code)


@rule("pd.cut")
def cut(call: PandasCall, ctx: RuleContext) -> Value:
    """pd.cut(s, bins=[edges], labels=[...]) -> pl.when(in bin 1).then(label 1)... as pl.Enum.

    Handles: right-closed bins (left-closed with right=False), include_lowest, values outside
    every bin and missing values (NaN fails every bin, as in pandas) are missing; the labels
    become an Enum, which sorts in the labels' order as pandas sorts its categorical (ordered or
    not).
    Caveats: a number of bins (the edges depend on the data), labels=None (pandas' Interval
    values), labels=False (bin numbers) and repeated labels are TODOs.
    """
    ctx.reject_unknown(call, "x", "bins", "right", "labels", "include_lowest", "ordered",
                       positional=3)
    column = call.arg("x", 0)
    if not isinstance(column, Column):
        raise Unsupported("cutting something other than a column")
    if column.dtype in ("str", "bool", "datetime", "date", "category"):
        raise Unsupported(f"cutting a {column.dtype} column")
    bins = call.const("bins", 1, None, kinds=(list, tuple))
    if bins is None or not all(isinstance(b, (int, float)) and not isinstance(b, bool) for b in bins):
        raise Unsupported("bins given as a number of bins (the edges depend on the data)")
    if any(a >= b for a, b in zip(bins, bins[1:])) or len(bins) < 2:
        raise Unsupported("bins that do not increase (pandas raises)")
    right = call.const("right", 2, True, kinds=(bool,))
    labels = call.const("labels", 3, None, kinds=(list, tuple, bool))
    if not isinstance(labels, (list, tuple)) or not all(isinstance(x, str) for x in labels):
        raise Unsupported("labels other than a list of texts (pandas' Interval values or bin "
                          "numbers)")
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
    code = code.method("cast", emit.pl("Enum", list(labels)))
    return derived_column(column, code, dtype="category")
