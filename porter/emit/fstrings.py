"""Code written between the braces of an f-string.

porter supports Python 3.11, where the text between an f-string's braces may not hold the
quote character that delimits the f-string, a backslash or a `#` (3.12 lifted all three). porter's
own code uses double quotes (`pl.col("kg")`), so a rewrite inside `f"..."` would not parse on
3.11. Two remedies, in order of preference:

1. `fit_in_fstring`: write the string literals of the rewritten expression with the other quote
   character (`pl.col('kg')`);
2. `as_format_call`: when that cannot be done (a literal holds both quote characters, or a
   backslash), the f-string becomes the equivalent `str.format` call, whose arguments are
   ordinary code: `f"{x:.1f}%"` is `"{:.1f}%".format(x)` (same format mini-language).
"""

from __future__ import annotations

from collections.abc import Callable

import libcst as cst

CodeFor = Callable[[cst.CSTNode], str]

QUOTES = ("'", '"')


def forbidden_in(fstring: cst.FormattedString) -> str:
    """The delimiter that code inside this f-string's braces may not contain on Python 3.11."""
    return fstring.end


def fits(text: str, delimiter: str) -> bool:
    """Whether `text` may stand between the braces of an f-string ending in `delimiter`."""
    return "\\" not in text and "#" not in text and delimiter not in text \
        and (len(delimiter) == 3 or "\n" not in text)


def fit_in_fstring(text: str, delimiter: str) -> str | None:
    """`text` (an expression) with its string literals requoted so that it fits between the
    braces of an f-string ending in `delimiter`; None when no requoting makes it fit."""
    if fits(text, delimiter):
        return text
    try:
        tree = cst.parse_expression(text if "\n" not in text else f"({text})")
    except cst.ParserSyntaxError:
        return None
    requoted = tree.visit(_Requote(delimiter[0]))
    new_text = cst.Module([]).code_for_node(requoted)
    return new_text if fits(new_text, delimiter) else None


class _Requote(cst.CSTTransformer):
    def __init__(self, avoid: str) -> None:
        super().__init__()
        self.avoid = avoid

    def leave_SimpleString(self, original: cst.SimpleString, updated: cst.SimpleString) -> cst.BaseExpression:
        if self.avoid not in original.value:
            return updated
        prefix = original.prefix.lower()
        value = original.evaluated_value
        if "b" in prefix or not isinstance(value, str):
            return updated
        other = next(q for q in QUOTES if q != self.avoid)
        if other in value or self.avoid in value or "\\" in value or "\n" in value:
            return updated  # left as it is; `fits` then rejects the whole text
        return updated.with_changes(value=f"{other}{value}{other}")


def as_format_call(fstring: cst.FormattedString, code_for: CodeFor) -> cst.Call | None:
    """The f-string as a `str.format` call with the same result; None for a form porter does
    not rewrite (a nested f-string in a format specification)."""
    template: list[str] = []
    args: list[str] = []
    if not _template(fstring.parts, template, args, code_for):
        return None
    prefix = fstring.prefix.replace("f", "").replace("F", "")
    quote = fstring.end
    literal = f"{prefix}{quote}{''.join(template)}{quote}"
    call = f"{literal}.format({', '.join(args)})"
    try:
        return cst.ensure_type(cst.parse_expression(call), cst.Call)
    except (cst.ParserSyntaxError, TypeError):
        return None


def _template(parts: object, template: list[str], args: list[str], code_for: CodeFor) -> bool:
    for part in parts:  # type: ignore[attr-defined]
        if isinstance(part, cst.FormattedStringText):
            template.append(part.value)
            continue
        if not isinstance(part, cst.FormattedStringExpression):
            return False
        expression = code_for(part.expression).strip()
        conversion = part.conversion
        if part.equal is not None:  # f"{x=}": the text of the expression, then its repr
            said = (code_for(part.whitespace_before_expression) + code_for(part.expression)
                    + code_for(part.whitespace_after_expression) + code_for(part.equal))
            template.append(said.replace("{", "{{").replace("}", "}}"))
            if conversion is None and part.format_spec is None:
                conversion = "r"
        field = "{"
        args.append(f"({expression})" if "\n" in expression else expression)
        if conversion:
            field += f"!{conversion}"
        if part.format_spec is not None:
            spec: list[str] = []
            if not _template(part.format_spec, spec, args, code_for):
                return False
            field += ":" + "".join(spec)
        template.append(field + "}")
    return True
