"""Builders for the Python source porter writes.

Generated code is kept as small immutable `Code` values: the source text, its operator
precedence (so composing two pieces adds parentheses only where Python needs them) and, for
method chains, the base and the steps (so a long chain can be laid out one step per line).
"""

from __future__ import annotations

from collections.abc import Iterable, Mapping
from dataclasses import dataclass, field
import math
from typing import Any

# Python operator precedence, lowest to highest.
LAMBDA, TERNARY, OR, AND, NOT, COMPARE, BIT_OR, BIT_XOR, BIT_AND = 0, 1, 2, 3, 4, 5, 6, 7, 8
SHIFT, ADD, MUL, UNARY, POWER, ATOM = 9, 10, 11, 12, 13, 15

BINARY_PRECEDENCE = {
    "|": BIT_OR, "^": BIT_XOR, "&": BIT_AND, "<<": SHIFT, ">>": SHIFT,
    "+": ADD, "-": ADD, "*": MUL, "/": MUL, "//": MUL, "%": MUL, "@": MUL, "**": POWER,
    "==": COMPARE, "!=": COMPARE, "<": COMPARE, "<=": COMPARE, ">": COMPARE, ">=": COMPARE,
    "in": COMPARE, "not in": COMPARE, "is": COMPARE, "is not": COMPARE,
    "and": AND, "or": OR,
}


@dataclass(frozen=True)
class Code:
    """A piece of Python source with its precedence; `steps` is set for method chains."""

    text: str
    prec: int = ATOM
    base: str | None = None
    steps: tuple[str, ...] = field(default=())

    def __str__(self) -> str:
        return self.text

    def wrapped(self, min_prec: int) -> str:
        return self.text if self.prec >= min_prec else f"({self.text})"

    # -- building ---------------------------------------------------------------------------
    def method(self, name: str, /, *args: object, **kwargs: object) -> Code:
        step = f".{name}({arglist(args, kwargs)})"
        if self.prec >= ATOM:
            base = self.base if self.base is not None else self.text
            steps = self.steps if self.base is not None else ()
        else:
            base, steps = f"({self.text})", ()
        return Code(base + "".join(steps) + step, ATOM, base, steps + (step,))

    def without_last_step(self) -> Code:
        """A chain without its last step (its base alone when that was the only one)."""
        assert self.base is not None and self.steps
        steps = self.steps[:-1]
        return Code(self.base + "".join(steps), ATOM, self.base, steps) if steps else Code(self.base)

    def attr(self, name: str) -> Code:
        return Code(f"{self.wrapped(ATOM)}.{name}")

    def index(self, key: object) -> Code:
        text = f"{self.wrapped(ATOM)}[{render(key)}]"
        if self.prec >= ATOM and self.base is not None and self.steps:
            # a chain's last step indexed (`.to_numpy()[0]`): still a chain, laid out by steps
            return Code(text, ATOM, self.base, (*self.steps[:-1], self.steps[-1] + f"[{render(key)}]"))
        return Code(text)


def atom(text: str) -> Code:
    return Code(text, ATOM)


def lit(value: object) -> Code:
    """A Python literal (strings, numbers, bools, None, lists/tuples/dicts of those)."""
    return Code(literal_text(value), ATOM if not _is_negative_number(value) else UNARY)


def _is_negative_number(value: object) -> bool:
    return isinstance(value, (int, float)) and not isinstance(value, bool) and value < 0


class ParamText(str):
    """A text parameter of the script's function, standing in its body for the texts its calls
    pass (engine.texts_followed): the body is ported once for all of them. Its value is an
    identifier of its own, written bare where a literal goes; the body is kept only when,
    with each call's text written there instead, it is the code porter writes for that text,
    and the identifier then becomes the parameter's name."""

    def __new__(cls, param: str) -> "ParamText":
        return super().__new__(cls, f"_porter_text_{param}_")


def literal_text(value: object) -> str:
    if isinstance(value, Code):
        return value.text
    if isinstance(value, ParamText):
        return str.__str__(value)
    if isinstance(value, float):
        if math.isnan(value):
            return "None"  # porter keeps frames NaN-free: NaN is written as a missing value
        if math.isinf(value):
            return 'float("inf")' if value > 0 else 'float("-inf")'
        return repr(value)
    if isinstance(value, str):
        return _string_literal(value)
    if isinstance(value, list):
        return "[" + ", ".join(literal_text(v) for v in value) + "]"
    if isinstance(value, tuple):
        inner = ", ".join(literal_text(v) for v in value)
        return f"({inner},)" if len(value) == 1 else f"({inner})"
    if isinstance(value, dict):
        return "{" + ", ".join(f"{literal_text(k)}: {literal_text(v)}" for k, v in value.items()) + "}"
    return repr(value)


def _string_literal(value: str) -> str:
    if '"' in value and "'" not in value:
        return repr(value)
    text = repr(value)
    if text.startswith("'"):
        inner = text[1:-1].replace("\\'", "'").replace('"', '\\"')
        return f'"{inner}"'
    return text


def render(value: object) -> str:
    """Source text of an argument: Code as is, Python values as literals."""
    if isinstance(value, Code):
        return value.text
    return literal_text(value)


def arglist(args: Iterable[object], kwargs: Mapping[str, object] | None = None) -> str:
    parts = [render(a) for a in args]
    parts += [f"{k}={render(v)}" for k, v in (kwargs or {}).items()]
    return ", ".join(parts)


def call(func: str, /, *args: object, **kwargs: object) -> Code:
    return Code(f"{func}({arglist(args, kwargs)})", ATOM)


def binop(left: Code | object, op: str, right: Code | object) -> Code:
    left_c = left if isinstance(left, Code) else lit(left)
    right_c = right if isinstance(right, Code) else lit(right)
    prec = BINARY_PRECEDENCE[op]
    if op == "**":  # right-associative
        text = f"{left_c.wrapped(prec + 1)} ** {right_c.wrapped(prec)}"
    elif prec == COMPARE:
        text = f"{left_c.wrapped(prec + 1)} {op} {right_c.wrapped(prec + 1)}"
    else:
        text = f"{left_c.wrapped(prec)} {op} {right_c.wrapped(prec + 1)}"
    return Code(text, prec)


def unary(op: str, operand: Code) -> Code:
    if op == "not":
        return Code(f"not {operand.wrapped(NOT)}", NOT)
    return Code(f"{op}{operand.wrapped(UNARY)}", UNARY)


# -- Polars vocabulary ----------------------------------------------------------------------

def col(name: str | Code) -> Code:
    return call("pl.col", name)


def pl(name: str, /, *args: object, **kwargs: object) -> Code:
    return call(f"pl.{name}", *args, **kwargs)


def formatted(template: str, /, *parts: object) -> Code:
    """What `pl.format(template, *parts)` computes (missing where a part is missing), written
    as `pl.concat_str` of the parts and the template's texts between them. pl.format panics
    in Polars 2.1 on a frame filtered after its columns were made in several chunks
    ("assertion failed: i < self.len()"); concat_str computes the same and does not. (Each
    part is one column: concat_str joins the columns a selector picks, where pl.format
    formats each.)"""
    texts = template.split("{}")
    if len(texts) != len(parts) + 1:
        raise ValueError(f"{template!r} has {len(texts) - 1} places for {len(parts)} parts")
    pieces: list[object] = []
    for text, part in zip(texts, [*parts, None]):
        if text:
            pieces.append(pl("lit", text))
        if part is not None:
            pieces.append(col(part) if isinstance(part, str) else part)
    return pl("concat_str", *pieces)


def when(cond: Code, then: object, otherwise: object | None = None) -> Code:
    code = pl("when", cond).method("then", as_expr(then))
    if otherwise is not None:
        code = code.method("otherwise", as_expr(otherwise))
    return code


def as_expr(value: object) -> Code:
    """A value used where Polars wants an expression: bare strings would be read as column
    names, so they are wrapped in pl.lit."""
    if isinstance(value, Code):
        return value
    if isinstance(value, str):
        return pl("lit", value)
    return lit(value)


def names_arg(names: Iterable[str]) -> object:
    """One column name as a string, several as a list."""
    names = list(names)
    return names[0] if len(names) == 1 else names


# -- layout ---------------------------------------------------------------------------------

LINE_LENGTH = 88


def _parses(text: str) -> bool:
    import ast
    try:
        ast.parse(text, mode="eval")
    except SyntaxError:
        return False
    return True


def layout_chain(code: Code, indent: str, prefix: str, suffix: str = "") -> str:
    """`prefix + code + suffix`, broken into one step per line when it does not fit."""
    if "\n" in code.text and any(line.count(".collect()") > 1 for line in code.text.splitlines()):
        # code laid out over several lines as the script wrote it, one of which now runs two
        # plans: laid out again from one line (never when a comment sits inside it)
        # (kept as written where the line cannot be broken up: a conditional, a tuple)
        flat = _flattened(code.text)
        if flat is not None:
            laid_out = layout_chain(Code(flat, code.prec), indent, prefix, suffix)
            if not any(line.count(".collect()") > 1 for line in laid_out.splitlines()):
                return laid_out
    if "\n" in code.text and not _parses(code.text):
        code = Code(f"({code.text})")
    one_line = f"{prefix}{code.text}{suffix}"
    if len(indent) + len(one_line) <= LINE_LENGTH and one_line.count(".collect()") <= 1:
        return one_line  # (two plans run on one line are laid out one per line)
    # a chain is laid out one step per line; a single call on a plain name (df.with_columns)
    # gets one argument per line instead
    if code.base is None or not code.steps or (len(code.steps) == 1 and "(" not in code.base):
        if code.base is None and "\n" not in code.text:
            # text built without its steps known (pandas code kept around a hand-over): its
            # method chain, when it has one, is laid out as a chain
            chain = _chain_lines(code.text, indent, prefix, suffix)
            if chain is not None:
                return chain
        if code.base is None and "\n" not in code.text and code.prec < ATOM:
            # an operation (two scalars added, each a plan's value): one operand per line
            operation = _operation_lines(code.text, indent, prefix, suffix)
            if operation is not None:
                return operation
        return _split_call(code.text, prefix, suffix) or one_line
    # continuation lines are relative: libcst adds the enclosing block's indentation
    base = [code.base]
    if len(indent) + 4 + len(code.base) > LINE_LENGTH:
        # a long first call: one argument per line; a long operation in parentheses, one
        # operand per line
        split = _split_call(code.base, "", "") or _split_operation(code.base, "")
        if split is not None:
            base = split.splitlines()
    lines = [f"{prefix}(", *("    " + line for line in base)]
    for step in code.steps:
        lines += _split_step(step, LINE_LENGTH - len(indent) - 4)
    lines.append(f"){suffix}")
    return "\n".join(lines)


def _flattened(text: str) -> str | None:
    """An expression written over several lines, on one line: each line break inside its
    brackets becomes a space after a comma or around an operator, nothing elsewhere. None
    when it holds a comment, or when the line read otherwise (not the same expression)."""
    import ast
    import libcst as cst

    try:
        tree = cst.parse_expression(text)
        before = ast.dump(ast.parse(text, mode="eval"))
    except (cst.ParserSyntaxError, SyntaxError):
        return None

    class Flatten(cst.CSTTransformer):
        comments = False

        def visit_Comment(self, node: cst.Comment) -> bool:
            self.comments = True
            return False

        def on_leave(self, original: Any, updated: Any) -> Any:
            if isinstance(updated, cst.ParenthesizedWhitespace):
                return updated  # replaced by its owner below
            changes = {}
            for name in ("whitespace_before", "whitespace_after", "whitespace_before_args",
                         "whitespace_after_func", "whitespace_after_arg", "whitespace_after_param",
                         "whitespace_before_value", "whitespace_after_colon",
                         "whitespace_before_colon", "whitespace_after_star",
                         "whitespace_after_lambda", "whitespace_before_if",
                         "whitespace_after_if", "whitespace_before_else",
                         "whitespace_after_else", "whitespace_before_in", "whitespace_after_in",
                         "whitespace_before_for", "whitespace_after_for"):
                value = getattr(updated, name, None)
                if isinstance(value, cst.ParenthesizedWhitespace):
                    spaced = isinstance(updated, cst.Comma) and name == "whitespace_after" \
                        or "if" in name or "else" in name or "for" in name or "in" in name \
                        or "lambda" in name or isinstance(updated, (
                            cst.BaseBinaryOp, cst.BaseBooleanOp, cst.BaseCompOp))
                    changes[name] = cst.SimpleWhitespace(" " if spaced else "")
            return updated.with_changes(**changes) if changes else updated

    flatten = Flatten()
    flat = tree.visit(flatten)
    if flatten.comments:
        return None
    result = cst.Module([]).code_for_node(flat)
    try:
        if "\n" in result or ast.dump(ast.parse(result, mode="eval")) != before:
            return None
    except SyntaxError:
        return None
    return result


def _chain_lines(text: str, indent: str, prefix: str, suffix: str) -> str | None:
    """A method chain of three calls or more given as text, one step per line inside
    parentheses (as layout_chain lays out a chain it built); None when the text is not one."""
    parsed = _one_argument(text)
    if parsed is None or parsed.keyword is not None or parsed.star:
        return None
    parts = _chain_parts(parsed, 2)
    if parts is None:
        return None
    head, steps = parts
    base = [head]
    if len(indent) + 4 + len(head) > LINE_LENGTH:
        split = _split_call(head, "", "") or _split_operation(head, "")  # as layout_chain
        if split is not None:
            base = split.splitlines()
    lines = [f"{prefix}(", *("    " + line for line in base)]
    for step in steps:
        lines += _split_step(step, LINE_LENGTH - len(indent) - 4)
    return "\n".join([*lines, f"){suffix}"])


def _split_call(text: str, prefix: str, suffix: str) -> str | None:
    """A single call too long for its line, one argument per line."""
    if "\n" in text:
        return None
    parts = _call_parts("", text)
    if parts is None:
        return None
    func, args = parts
    items = _list_items(args[0]) if len(args) == 1 else None
    if items is not None:  # f([a, b]): the brackets hug, one item per line
        lines = [f"{prefix}{func}(["]
        for item in items:
            lines += _split_argument(item, "    ", LINE_LENGTH, min_steps=1)
        return "\n".join([*lines, f"]){suffix}"])
    lines = [f"{prefix}{func}("]
    for arg in args:
        lines += _split_argument(arg, "    ", LINE_LENGTH)
    return "\n".join([*lines, f"){suffix}"])


def _list_items(arg: str) -> list[str] | None:
    """The items of a list literal written as one positional argument; None otherwise."""
    import libcst as cst

    parsed = _one_argument(arg)
    if parsed is None or parsed.keyword is not None or not isinstance(parsed.value, cst.List) \
            or not parsed.value.elements \
            or not all(isinstance(e, cst.Element) for e in parsed.value.elements):
        return None
    module = cst.Module([])
    return [module.code_for_node(e.value) for e in parsed.value.elements]


def _split_argument(arg: str, indent: str, width: int, min_steps: int = 2) -> list[str]:
    """One argument of a call laid out one per line: a chain too long for its line is broken
    before each step (inside the call's brackets no extra parentheses are needed); a chain
    on a plain name (`df.select(...)`) is broken when it has `min_steps` calls after the first."""
    parsed = _one_argument(arg) if arg.count(".collect()") > 1 or len(indent) + len(arg) + 1 > width \
        else None
    pieces = _fstring_pieces(parsed, width - len(indent)) if parsed is not None else None
    if pieces is not None:  # f"{a.collect()} and {b.collect()}": one f-string per line
        return [*(f"{indent}{piece}" for piece in pieces[:-1]), f"{indent}{pieces[-1]},"]
    if len(indent) + len(arg) + 1 <= width:
        split = _split_operation(f"({arg})", "") if arg.count(".collect()") > 1 else None
        if split is not None:  # two plans run in one operation: one operand per line
            return [*(indent + line for line in split.splitlines()[:-1]), f"{indent}),"]
        items = _list_items(arg) if arg.count(".collect()") > 1 else None
        if items is not None:  # [a.collect(), b.collect()]: one item per line
            return [f"{indent}[", *(f"{indent}    {item}," for item in items), f"{indent}],"]
        return [f"{indent}{arg},"]
    entries = _dict_parts(parsed) if parsed is not None else None
    if entries is not None:
        head, items = entries
        return [f"{indent}{head}{{", *(f"{indent}    {item}," for item in items), f"{indent}}},"]
    if parsed is None:
        return [f"{indent}{arg},"]
    looped = _comprehension_lines(parsed, indent, width)
    if looped is not None:
        return looped
    keyword = _argument_head(parsed)  # kw=, or the star of *values / **mapping
    parts = _chain_parts(parsed, min_steps)
    if parts is None:
        # f([...]).collect(), pl.when(...).then(...): broken before the one step, since the
        # whole does not fit
        parts = _chain_parts(parsed, 1)
    if parts is None:  # f(a, b) on a plain name (print, pl.concat): one argument per line
        call = _call_parts("", arg[len(keyword):])
        whole = _split_call(arg[len(keyword):], keyword, ",") \
            if call is not None and "(" not in call[0] else None
        return [indent + line for line in whole.splitlines()] if whole else [f"{indent}{arg},"]
    head, steps = parts
    heads = [head]
    if len(indent) + len(head) > width:
        split = _split_call(head[len(keyword):], keyword, "") or _split_operation(head[len(keyword):], keyword)
        heads = split.splitlines() if split else heads
    lines = [indent + line for line in heads]
    for i, step in enumerate(steps):
        end = "," if i == len(steps) - 1 else ""
        call = _call_parts("_", step) if len(indent) + len(step) + len(end) > width else None
        if call is None:
            lines.append(f"{indent}{step}{end}")
            continue
        method, args = call  # a step too long for its line: one argument per line
        lines.append(f"{indent}{method}(")
        for arg in args:
            lines += _split_argument(arg, indent + "    ", width)
        lines.append(f"{indent}){end}")
    return lines


def _fstring_pieces(arg: Any, width: int) -> list[str] | None:
    """An f-string argument too long for its line, or running two plans (`f"{a.collect()} and
    {b.collect()}"`), as f-strings Python joins (one literal written in pieces): a piece ends
    before a value that would make it too long or run a second plan. None for anything else."""
    import libcst as cst

    node = arg.value
    if arg.keyword is not None or arg.star or not isinstance(node, cst.FormattedString) \
            or node.lpar or len(node.parts) < 2 or len(node.end) != 1:
        return None
    module = cst.Module([])
    start, end = node.start, node.end
    pieces: list[list[str]] = [[]]
    for part in node.parts:
        text = module.code_for_node(part)
        current = "".join(pieces[-1])
        plans = current.count(".collect()") + text.count(".collect()")
        if pieces[-1] and isinstance(part, cst.FormattedStringExpression) \
                and (plans > 1 or len(start) + len(current) + len(text) + len(end) > width):
            pieces.append([])
        pieces[-1].append(text)
    if len(pieces) < 2:
        return None
    return [f"{start}{''.join(piece)}{end}" for piece in pieces]


def _comprehension_lines(arg: Any, indent: str, width: int) -> list[str] | None:
    """`[f(a) for a in names]` or `*(g(b) for b in names)` too long for its line: the value
    on lines of its own (laid out as an argument is), then each `for` / `if` clause, inside
    the brackets."""
    import libcst as cst

    node = arg.value
    if isinstance(node, cst.ListComp):
        opening, closing = "[", "]"
    elif isinstance(node, cst.GeneratorExp) and node.lpar:
        opening, closing = "(", ")"
    else:
        return None
    module = cst.Module([])
    value = _split_argument(module.code_for_node(node.elt), indent + "    ", width)
    value[-1] = value[-1][:-1]  # (an argument's lines end in a comma)
    clauses: list[str] = []
    clause: Any = node.for_in
    while clause is not None:
        clauses.append(f"for {module.code_for_node(clause.target)} in "
                       f"{module.code_for_node(clause.iter)}")
        clauses += [f"if {module.code_for_node(c.test)}" for c in clause.ifs]
        clause = clause.inner_for_in
    return [f"{indent}{_argument_head(arg)}{opening}", *value,
            *(f"{indent}    {c}" for c in clauses), f"{indent}{closing},"]


def _split_operation(text: str, prefix: str) -> str | None:
    """`(a + b - c)` too long for its line: one operand per line inside the parentheses, each
    after its operator (a + b * c keeps b * c together)."""
    import libcst as cst

    try:
        node = cst.parse_expression(text)
    except cst.ParserSyntaxError:
        return None
    if not (isinstance(node, cst.BinaryOperation) and node.lpar):
        return None
    module = cst.Module([])
    level = BINARY_PRECEDENCE.get(module.code_for_node(node.operator).strip())
    operands: list[str] = []
    inner: cst.BaseExpression = node.with_changes(lpar=[], rpar=[])
    while isinstance(inner, cst.BinaryOperation) and not inner.lpar \
            and BINARY_PRECEDENCE.get(module.code_for_node(inner.operator).strip()) == level:
        operands.insert(0, f"{module.code_for_node(inner.operator).strip()} "
                           f"{module.code_for_node(inner.right)}")
        inner = inner.left
    operands.insert(0, module.code_for_node(inner))
    if len(operands) < 2:
        return None
    return "\n".join([f"{prefix}(", *(f"    {o}" for o in operands), ")"])


def _operation_lines(text: str, indent: str, prefix: str, suffix: str) -> str | None:
    """An operation too long for its line (or running two plans), one operand per line inside
    parentheses, after its operator; an operand still too long is laid out as an argument."""
    split = _split_operation(f"({text})", "")
    if split is None:
        return None
    width = LINE_LENGTH - len(indent) - 4
    lines = [f"{prefix}("]
    for i, operand in enumerate(split.splitlines()[1:-1]):
        operand = operand[4:]
        if len(operand) <= width:
            lines.append(f"    {operand}")
            continue
        # every operand but the first is written after its operator
        operator, _, rest = operand.partition(" ") if i else ("", "", operand)
        sign = rest[0] if rest[:1] in ("-", "~") and _parses(rest[1:]) else ""  # -f(...)
        laid = _split_argument(rest[len(sign):], "    ", width + 4)
        laid[-1] = laid[-1][:-1] if laid[-1].endswith(",") else laid[-1]
        head = f"{operator} " if operator else ""
        laid[0] = f"    {head}{sign}{laid[0][4:]}"
        lines += laid
    return "\n".join([*lines, f"){suffix}"])


def _one_argument(arg: str) -> Any:
    """One argument's text (`kw=value` or `value`) as a libcst Arg; None if it is not one."""
    import libcst as cst

    try:
        call = cst.parse_expression(f"_({arg})")
    except cst.ParserSyntaxError:
        return None
    assert isinstance(call, cst.Call)
    return call.args[0] if len(call.args) == 1 else None


def _dict_parts(arg: Any) -> tuple[str, list[str]] | None:
    """`kw={"a": 1, "b": 2}` -> ("kw=", ['"a": 1', '"b": 2']): a dict laid out one entry per line."""
    import libcst as cst

    if not isinstance(arg.value, cst.Dict):
        return None
    module = cst.Module([])
    items = [module.code_for_node(e.with_changes(comma=cst.MaybeSentinel.DEFAULT)).strip()
             for e in arg.value.elements]
    return _argument_head(arg), items


def _argument_head(arg: Any) -> str:
    """What an argument's value follows: `kw=`, the star of `*values` / `**mapping`, or
    nothing."""
    return f"{arg.keyword.value}=" if arg.keyword is not None else arg.star or ""


def _chain_parts(arg: Any, min_steps: int = 2) -> tuple[str, list[str]] | None:
    """`kw=a.b(x).c(y)` -> ("kw=a.b(x)", [".c(y)"]): the steps of a method chain that is
    called on another call (pl.when(...).then(...), pl.col(...).str.strip_chars().alias(...))."""
    import libcst as cst

    module = cst.Module([])
    keyword = arg.keyword
    node: cst.BaseExpression = arg.value
    steps: list[str] = []
    indexed = ""  # `.to_numpy()[0]`: the index stays on the last step
    last = ""  # `.loc["label"]` / `.iloc[0]` after a call: a step of its own, the last
    if isinstance(node, cst.Subscript) and not node.lpar and isinstance(node.value, cst.Call):
        indexed = module.code_for_node(node)[len(module.code_for_node(node.value)):]
        node = node.value
    elif isinstance(node, cst.Subscript) and not node.lpar \
            and isinstance(node.value, cst.Attribute) and not node.value.lpar \
            and isinstance(node.value.value, cst.Call):
        last = module.code_for_node(node)[len(module.code_for_node(node.value.value)):]
        node = node.value.value
    pending = ""  # `["w"]` between two calls: kept at the end of the call before it
    while isinstance(node, cst.Call) and isinstance(node.func, cst.Attribute) \
            and not node.lpar and not node.func.lpar:
        inner = node.func.value
        # the step is everything after the receiver: .method(args)
        step = module.code_for_node(node)[len(module.code_for_node(inner)):]
        attributes: list[str] = []
        while isinstance(inner, cst.Attribute) and not isinstance(inner.value, (cst.Name,)) \
                and not inner.lpar:
            attributes.insert(0, "." + inner.attr.value)  # .str / .dt between two calls
            inner = inner.value
        if isinstance(inner, cst.Subscript) and not inner.lpar and isinstance(inner.value, cst.Call) \
                and isinstance(inner.value.func, cst.Attribute):
            # .set_index("k")["w"].plot.bar(): the column taken stays on .set_index's line
            steps.insert(0, "".join(attributes) + step + pending)
            pending = module.code_for_node(inner)[len(module.code_for_node(inner.value)):]
            node = inner.value
            continue
        if isinstance(inner, cst.Subscript) and not inner.lpar \
                and isinstance(inner.value, cst.Attribute) and not inner.value.lpar \
                and isinstance(inner.value.value, cst.Call) \
                and isinstance(inner.value.value.func, cst.Attribute):
            # .agg([...]).loc["a"].plot(): `.loc["a"]` a step of its own
            steps.insert(0, "".join(attributes) + step + pending)
            steps.insert(0, module.code_for_node(inner)[len(module.code_for_node(inner.value.value)):])
            pending = ""
            node = inner.value.value
            continue
        if not isinstance(inner, cst.Call):
            if inner.lpar and not attributes:  # (a - b).fill_nan(None): the parentheses lead
                steps.insert(0, step + pending)
                pending = ""
                node = inner
            break
        steps.insert(0, "".join(attributes) + step + pending)
        pending = ""
        node = inner
    if last:
        steps.append(last)
    if len(steps) < min_steps:
        return None
    steps[-1] += indexed
    head = module.code_for_node(node) + pending
    if keyword is not None:
        head = f"{keyword.value}={head}"
    elif arg.star:  # *values / **mapping: the star stays in front of the chain
        head = f"{arg.star}{head}"
    return head, steps


def _call_parts(prefix: str, text: str) -> tuple[str, list[str]] | None:
    import libcst as cst

    try:
        call = cst.parse_expression(prefix + text)
    except cst.ParserSyntaxError:
        return None
    if not isinstance(call, cst.Call) or not call.args or call.lpar:
        return None
    module = cst.Module([])
    args = [module.code_for_node(a.with_changes(comma=cst.MaybeSentinel.DEFAULT)).strip()
            for a in call.args]
    return module.code_for_node(call.func)[len(prefix):], args


def _split_step(step: str, width: int) -> list[str]:
    """One chain step; a call too long for its line gets one argument per line."""
    if len(step) <= width:
        return ["    " + step]
    parts = _call_parts("_", step)
    if parts is None:
        return ["    " + step]
    method, args = parts
    lines = [f"    {method}("]
    for arg in args:
        lines += _split_argument(arg, "        ", width + 4)
    return [*lines, "    )"]
