"""Strings: the .str accessor (T01–T12 in the semantics reference).

A missing value stays missing through pandas' string methods, except in boolean tests
(contains, startswith, match…), where pandas 3 gives False; Polars gives null for both, so
boolean results are marked null_is_false and filled where pandas' False matters.
Patterns written for Python's `re` are checked before they reach Polars' Rust regex engine.
"""

from __future__ import annotations

from collections.abc import Iterator
from dataclasses import dataclass, field, replace as _replace
import math
import re
import re._constants as _C  # noqa: PLC2701 - the parse tree is how Python reads a pattern
import re._parser as _P  # noqa: PLC2701
import warnings

import polars as pl

from porter.emit import code as emit
from porter.emit.code import Code
from porter.rules import rule
import libcst as cst

from porter.translate import handover
from porter.translate.context import (
    PandasCall, RuleContext, Unsupported, accessor_column, check_same_rows, derived_column,
    select_columns,
)
from porter.translate.values import (
    Column, Frame, Items, Opaque, Parts, Scalar, Value, fresh_token,
)

INT64 = emit.atom("pl.Int64")
# pandas' counts over text are float64 once a value is missing (int64 otherwise); Polars keeps
# Int64 with nulls: the result is marked (Column.float_int), so its reductions, its text and
# the steps that drop the missing rows read it as pandas' float64 where a value is missing
MISSING_MAKES_FLOAT = "a text value is missing (its count is NaN)"
LIST_STR = "list[str]"  # porter's dtype of a column of lists of text (str.split, str.findall)


# what can make pandas' nullable "string" dtype (not pandas 3's default "str"): its lengths and
# counts are pandas' nullable Int64, written 4 beside a missing value, where those of "str"
# are float64 (4.0)
_STRING_DTYPE_HINTS = re.compile(r"^string(\[(python|pyarrow)\])?$")
_STRING_DTYPE_NAMES = {"StringDtype", "convert_dtypes", "dtype_backend"}


def string_dtype_possible(ctx: RuleContext) -> bool:
    """Whether the script may hold pandas' "string" dtype somewhere (astype("string"),
    dtype={"c": "string"}, pd.StringDtype(), convert_dtypes): porter does not follow which
    text columns are of it."""
    import ast
    module = ctx.python_module
    if module is None:
        return True
    found = getattr(module, "_porter_string_dtype", None)
    if found is None:
        found = any(
            isinstance(n, ast.Constant) and isinstance(n.value, str)
            and _STRING_DTYPE_HINTS.match(n.value)
            or isinstance(n, ast.Attribute) and n.attr in _STRING_DTYPE_NAMES
            or isinstance(n, ast.Name) and n.id in _STRING_DTYPE_NAMES
            or isinstance(n, ast.keyword) and n.arg == "dtype_backend"
            for n in ast.walk(module))
        module._porter_string_dtype = found  # read once per script
    return found


def _counts(result: Column, ctx: RuleContext, column: Column | None = None) -> Column:
    """A count over text (str.len, str.count): float64 in pandas where a value is missing
    (Column.float_int), except on pandas' "string" dtype, whose counts are its nullable Int64."""
    if column is not None and column.nullable_int == "string":
        # a column porter knows to be pandas' "string" (dtype={"c": "string"}): Int64, <NA>
        return _replace(result, nullable_int="Int64")
    if string_dtype_possible(ctx):
        ctx.lower('the script may make pandas\' "string" dtype: on such a column the count is '
                  'pandas\' nullable Int64 (written 4 beside a missing value, where <NA> is), and '
                  'porter writes it as a count of "str" text, float64 there (4.0)', 0.8)
    return _replace(result, float_int=MISSING_MAKES_FLOAT)


def text_column(call: PandasCall, ctx: RuleContext) -> Column:
    """The column under `s.str` for a method of text: on a column of lists (str.split) pandas
    gives a missing value for every row, and the Polars string method fails."""
    column = accessor_column(call)
    if column.dtype == LIST_STR:
        raise ctx.todo(f"str.{call.name} of a column of lists: pandas gives a missing value for "
                       "every row")
    return column


def _text(column: Column) -> Code:
    if column.dtype in ("category", "enum"):
        # pandas' .str works on a category column's values: Polars' on text only
        return column.code.method("cast", emit.atom("pl.String")).attr("str")
    return column.code.attr("str")


def _result(column: Column, code: Code, dtype: str, null_is_false: bool = False) -> Column:
    return derived_column(column, code, dtype=dtype, null_is_false=null_is_false)


def _string(column: Column, code: Code) -> Column:
    return _result(column, code, "str")


# -- regex dialects (T12) -------------------------------------------------------------------

_FLAG_LETTERS = {re.I: "i", re.M: "m", re.S: "s"}
_FLAG_NAMES = {"I": re.I, "IGNORECASE": re.I, "M": re.M, "MULTILINE": re.M, "S": re.S,
               "DOTALL": re.S, "U": re.U, "UNICODE": re.U}
_ISSUES = {_C.ASSERT: "lookaround", _C.ASSERT_NOT: "lookaround", _C.GROUPREF: "backreference",
           _C.GROUPREF_EXISTS: "conditional", _C.ATOMIC_GROUP: "atomic group",
           _C.POSSESSIVE_REPEAT: "possessive repeat"}


def regex_flags(call: PandasCall, position: int) -> int:
    """`flags=re.I | re.M` (or an int) as Python's flag bits."""
    if not call.has("flags", position):
        return 0
    value = call.arg("flags", position)
    if isinstance(value, Opaque) and isinstance(value.const, int):
        flags = value.const
    else:
        flags = 0
        for part in value.code.text.split("|"):
            name = part.strip().rsplit(".", 1)[-1]
            if name not in _FLAG_NAMES:
                raise Unsupported(f"regex flag {part.strip()}")
            flags |= _FLAG_NAMES[name]
    if flags & ~(re.I | re.M | re.S | re.U):
        raise Unsupported("regex flags other than IGNORECASE, MULTILINE, DOTALL")
    return flags


def _nodes(items: object) -> Iterator[tuple[object, object]]:
    """Every node of a pattern parsed by Python's re, depth first."""
    for op, av in items:  # type: ignore[attr-defined]
        yield op, av
        if op is _C.SUBPATTERN:
            yield from _nodes(av[3])
        elif op is _C.BRANCH:
            for branch in av[1]:
                yield from _nodes(branch)
        elif op in (_C.MAX_REPEAT, _C.MIN_REPEAT, _C.POSSESSIVE_REPEAT):
            yield from _nodes(av[2])
        elif op in (_C.ASSERT, _C.ASSERT_NOT):
            yield from _nodes(av[1])
        elif op is _C.ATOMIC_GROUP:
            yield from _nodes(av)
        elif op is _C.GROUPREF_EXISTS:
            yield from _nodes(av[1])
            if av[2]:
                yield from _nodes(av[2])


_DOLLAR = "$ also matches before a final newline in Python"


def regex_issues(pattern: str, flags: int = 0) -> list[str]:
    """Why `pattern` (written for Python's re) may not match the same in Polars (T12)."""
    issues: list[str] = []
    with warnings.catch_warnings(record=True) as caught:
        warnings.simplefilter("always")
        try:
            tree = _P.parse(pattern, flags)
        except re.error:
            return ["not a valid Python regex"]
    if any(issubclass(w.category, FutureWarning) for w in caught):
        issues.append("nested set syntax ([[..]], --, &&, ~~) means something else in Rust")
    if tree.state.flags & re.X:
        issues.append("verbose mode treats whitespace in classes differently")
    for op, av in _nodes(tree):
        if op in _ISSUES:
            issues.append(_ISSUES[op])
        elif op is _C.AT and av is _C.AT_END and not tree.state.flags & re.M:
            issues.append(_DOLLAR)
    if re.search(r"(?<!\\)(?:\\\\)*\\[<>]", pattern):
        issues.append(r"\< and \> are word boundaries in Rust")
    if not issues and _rejected(pattern, flags):
        issues.append(_REJECTED)
    return sorted(set(issues))


_REJECTED = "Polars' regex engine rejects it"


def _rejected(pattern: str, flags: int) -> bool:
    """Whether Polars' regex engine fails to compile the pattern ({,3}, a{ at the end)."""
    try:
        pl.select(pl.lit("x").str.contains(inline_flags(flags) + pattern)).item()
    except pl.exceptions.PolarsError:
        return True
    return False


def inline_flags(flags: int) -> str:
    letters = "".join(v for k, v in _FLAG_LETTERS.items() if flags & k)
    return f"(?{letters})" if letters else ""


def polars_regex(pattern: str, flags: int, ctx: RuleContext, *, test: bool) -> str:
    """A Python pattern as a Polars pattern (flags not included), or a TODO.

    `test`: only whether it matches counts, so a final `$` can be widened to `\\n?$`
    (Python's `$` also matches before one final newline).
    """
    issues = regex_issues(pattern, flags)
    if test and issues == [_DOLLAR] and _only_final_dollar(pattern, flags):
        # the rest of the pattern was not compiled by regex_issues yet
        widened = pattern[:-1] + r"\n?$"
        if _rejected(widened, flags):
            issues = [_REJECTED]
        else:
            pattern, issues = widened, []
    if issues:
        raise ctx.todo(f"the pattern {pattern!r} does not mean the same in Polars' regex "
                       f"engine ({'; '.join(issues)})")
    if _P.parse(pattern, flags).state.flags & re.ASCII:
        if re.search(r"(?<!\\)(?:\\\\)*\\[wWsSdDbB]", pattern):
            raise ctx.todo(r"\w, \s, \d and \b of an ASCII-only pattern ((?a)) mean every "
                           "Unicode letter, space and digit in Polars' regex engine")
        return pattern
    if re.search(r"(?<!\\)(?:\\\\)*\\[bB]", pattern):
        ctx.lower(r"\b: a word boundary next to ², ³, ½ (numbers other than digits, word "
                  r"characters to Python), a combining accent or ‿ (word characters to Polars' "
                  r"regex engine) is found by one engine and not the other", 0.95)
    return python_classes(pattern)


# Python's \w is a letter, a number of any kind (², ½ too) or _: \p{L}\p{N}_ exactly (Rust's
# \w takes combining marks and connector punctuation, and no ², ½); Python's \s also holds
# \x1c-\x1f, Rust's does not. \d is a decimal digit (\p{Nd}) in both. Outside a class and
# inside one:
_PYTHON_CLASSES = {
    "w": (r"[\p{L}\p{N}_]", r"\p{L}\p{N}_"),
    "W": (r"[^\p{L}\p{N}_]", r"[^\p{L}\p{N}_]"),
    "s": (r"[\s\x1c-\x1f]", r"\s\x1c-\x1f"),
    "S": (r"[^\s\x1c-\x1f]", r"[^\s\x1c-\x1f]"),
}


def python_classes(pattern: str) -> str:
    """`pattern` with \\w, \\W, \\s and \\S written as the classes Python's re means by them."""
    out: list[str] = []
    i, inside = 0, False
    while i < len(pattern):
        ch = pattern[i]
        if ch == "\\" and i + 1 < len(pattern):
            nxt = pattern[i + 1]
            out.append(_PYTHON_CLASSES[nxt][inside] if nxt in _PYTHON_CLASSES else ch + nxt)
            i += 2
            continue
        out.append(ch)
        i += 1
        if ch == "[" and not inside:
            inside = True
            for opening in ("^", "]"):  # [^...] and a ] first in the class is a ]
                if pattern[i:i + 1] == opening:
                    out.append(opening)
                    i += 1
        elif ch == "]" and inside:
            inside = False
    return "".join(out)


def _only_final_dollar(pattern: str, flags: int) -> bool:
    tree = _P.parse(pattern, flags)
    dollars = [av for op, av in _nodes(tree) if op is _C.AT and av is _C.AT_END]
    return len(dollars) == 1 and pattern.endswith("$") and tuple(tree[-1]) == (_C.AT, _C.AT_END)


def _anchored_at_both_ends(pattern: str, flags: int) -> bool:
    """^...$ without re.M, its only $ the final one (outside any alternation)."""
    if flags & re.M or not _only_final_dollar(pattern, flags):
        return False
    tree = _P.parse(pattern, flags)
    return tuple(tree[0]) == (_C.AT, _C.AT_BEGINNING) \
        and not _rejected(pattern[:-1] + r"(\n?)$", flags)


def polars_template(repl: str, groups: int, ctx: RuleContext) -> str:
    r"""A Python replacement template (\1, \g<name>) in Polars' syntax (${1}, $$) (T03)."""
    escapes = {"n": "\n", "t": "\t", "r": "\r", "f": "\f", "v": "\v", "a": "\a", "b": "\b",
               "\\": "\\"}
    out: list[str] = []
    i = 0
    while i < len(repl):
        ch = repl[i]
        nxt = repl[i + 1:i + 2]
        if ch == "$":
            out.append("$$")
        elif ch != "\\" or not nxt:
            out.append(ch)
        elif nxt == "g":
            m = re.match(r"\\g<(\w+)>", repl[i:])
            if not m:
                raise ctx.todo(f"replacement {repl!r}: malformed \\g<...>")
            group = m.group(1)
            if group.isdigit() and int(group) > groups:
                raise ctx.todo(f"replacement {repl!r} refers to a group the pattern lacks")
            out.append("${" + group + "}")
            i += len(m.group(0))
            continue
        elif nxt.isdigit():
            m = re.match(r"\\([1-9][0-9]?)", repl[i:])
            if not m or int(m.group(1)) > groups:
                raise ctx.todo(f"replacement {repl!r}: octal escape or missing group")
            out.append("${" + m.group(1) + "}")
            i += len(m.group(0))
            continue
        elif nxt in escapes:
            out.append(escapes[nxt])
        elif nxt.isascii() and nxt.isalpha():
            raise ctx.todo(f"replacement {repl!r}: Python rejects \\{nxt}")
        else:
            out.append(ch + nxt)
        i += 2 if ch == "\\" and nxt else 1
    return "".join(out)


# -- case and whitespace (T06) --------------------------------------------------------------

_CASE = {"lower": "to_lowercase", "upper": "to_uppercase", "title": "to_titlecase"}

# Letters whose upper case Polars writes as two or three (Unicode's full case mapping: "ﬁ" is
# "FI", "ŉ" is "ʼN") and pandas' kernel (pyarrow, one letter at a time) keeps as they are:
# ligatures, as text copied out of PDFs holds them, and Greek letters with accents or an iota.
# U+1FD3 is written escaped: it looks as U+0390 (its canonical equivalent) and a tool that
# normalises text would make it that.
UPPER_KEPT = "ŉǰΐΰևẖ-ẚὐὒὔὖᾈ-ᾏᾘ-ᾟᾨ-ᾯᾲᾴᾶᾷᾼῂῄῆῇῌῒ\u1fd3ῖῗῢ-ῤῦῧῲῴῶῷῼﬀ-ﬆﬓ-ﬗ"
# Greek small letters with an iota: pandas writes their one capital (ᾳ -> ᾼ), which is Polars'
# title case of the letter alone; Polars' upper case is two letters (ΑΙ)
UPPER_IOTA = "ᾀ-ᾇᾐ-ᾗᾠ-ᾧᾳῃῳ"
# the letters of UPPER_KEPT that are small: title() keeps them first in a word too (Polars
# writes "Fi" for "ﬁ"), and lower-cases them inside one as both do
TITLE_KEPT = "ŉǰΐΰևẖ-ẚὐὒὔὖᾲᾴᾶᾷῂῄῆῇῒ\u1fd3ῖῗῢ-ῤῦῧῲῴῶῷﬀ-ﬆﬓ-ﬗ"
# a letter without case (Cyrillic's multiocular O) set before each of them for title(): Polars
# then reads the letter as inside a word and keeps it; taken out again after (written escaped,
# as few fonts have it)
TITLE_MARK = r"\ua66e"  # as written in the converted script


def _escaped(letters: str) -> str:
    """`letters` as written between the quotes of the converted script (U+1FD3 escaped)."""
    return letters.replace("\u1fd3", "\\u1fd3")


UPPER_FUNCTION = "pandas_upper"
UPPER_DEFINITION = f'''\
def pandas_upper(text):
    """text.str.to_uppercase() as pandas' str.upper() writes it (pyarrow's kernel, one letter
    at a time): "ß" is "ẞ" (Polars: "SS"), and a letter Polars writes as two or three ("ﬁ" as
    "FI", "ŉ", Greek letters with accents or an iota) is kept, or made its one capital, as
    pandas does: the text is cut around those letters and each piece upper-cased. A batch of
    values that holds none of them gets Polars' own upper case, and only that is computed."""
    kept, iota = "[{_escaped(UPPER_KEPT)}]", "[{UPPER_IOTA}]"

    def upper(values):
        values = values.str.replace_all("ß", "ẞ", literal=True)
        special = values.str.contains(f"{{kept}}|{{iota}}")
        if not special.any():
            return values.str.to_uppercase()
        piece = pl.element()
        by_piece = (
            pl.first().str.extract_all(f"{{kept}}|{{iota}}|[^{_escaped(UPPER_KEPT)}{UPPER_IOTA}]+")
            .list.eval(
                pl.when(piece.str.contains(f"^{{kept}}$")).then(piece)
                .when(piece.str.contains(f"^{{iota}}$")).then(piece.str.to_titlecase())
                .otherwise(piece.str.to_uppercase())
            )
            .list.join("")
        )
        return values.to_frame().select(
            pl.when(special).then(by_piece).otherwise(pl.first().str.to_uppercase())
        ).to_series()

    return text.map_batches(upper, return_dtype=pl.String, is_elementwise=True)
'''


@rule("series.str.lower", "series.str.upper", "series.str.title")
def case(call: PandasCall, ctx: RuleContext) -> Value:
    """s.str.lower() / upper() / title() -> str.to_lowercase() / pandas_upper() / pandas_title().

    Handles: lower() of "İ" is "i" and of a final "Σ" is "σ", as in pandas (Polars writes "i̇"
    and "ς"): made so first. upper() (UPPER_DEFINITION): "ß" is "ẞ" (Polars: "SS"), and the
    letters Polars writes as two or three (ligatures "ﬁ", "ﬂ", "ŉ", Greek letters with accents
    or an iota) are kept or made their one capital, as pandas' kernel does. title()
    (TITLE_DEFINITION): "ß" and a digraph first in a word, "İ" inside one, and the ligatures
    kept first in a word, as pandas writes them; a word starts after a letter without case
    (CJK, Hebrew, Arabic, a modifier letter), as in pandas.
    Caveats: title(): Georgian letters first in a word are capitals in pandas only; it writes
    an "i" with a combining dot (i + U+0307) already in the text as "i";
    letters added in Unicode 16 change case in pandas only (confidence below 1 in the table).
    """
    column = text_column(call, ctx)
    ctx.reject_unknown(call)
    text = _text(column)
    if call.name == "upper":
        return _string(column, emit.call(UPPER_FUNCTION, _text_expr(column)))
    if call.name == "lower":
        text = _simple_lower_case(text)
    else:
        return _string(column, emit.call(TITLE_FUNCTION, _text_expr(column)))
    return _string(column, text.method(_CASE[call.name]))


TITLE_FUNCTION = "pandas_title"
# the letters pandas' title() (pyarrow's kernel) reads as without case, so that the next letter
# starts a word, where Polars reads any alphabetic character as inside a word: alphabetic but
# neither an upper, lower nor title case letter; letter numbers and circled letters (Ⅰ, Ⓐ),
# which have a case, left out
TITLE_UNCASED = r"[\p{Alphabetic}&&[^\p{Lu}\p{Ll}\p{Lt}]&&[^\p{Cased}&&[\p{Nl}\x{24b6}-\x{24e9}]]]"
# pandas' title() upper-cases the first letter of a word, Polars' writes its title case: the
# four letters whose title case is not their upper case (the digraphs "ǅ", "ǈ", "ǋ", "ǲ") are
# made their upper case after it
TITLE_DEFINITION = f'''\
def pandas_title(text):
    """text.str.to_titlecase() as pandas' str.title() writes it (pyarrow's kernel, one letter
    at a time): "Σ" is "σ" at the end of a word too, "ß" first in a word is "ẞ" (Polars: "Ss"),
    a digraph first in a word is its upper case ("ǆemal" -> "Ǆemal", Polars: "ǅemal"), "İ"
    inside a word is "i" (Polars: i and a combining dot), and a letter Polars writes as two or
    three first in a word ("ﬁ" as "Fi") is kept: a letter without case set before it makes
    Polars read it as inside a word, and is taken out after. A letter without case (CJK,
    Hebrew, a modifier letter) ends a word for pandas, not for Polars: a mark that is no
    letter (U+FFFF) is set after each, and taken out after. Where a batch of values holds none of
    these letters, Polars' own title case is pandas', and only that is computed."""
    kept, mark = "[{_escaped(TITLE_KEPT)}]", "{TITLE_MARK}"
    special = r"[ΣßǄ-ǌǱ-ǳİ\\u0307\\uffff{_escaped(TITLE_KEPT)}{TITLE_UNCASED}]"

    def title(values):
        if not values.str.contains(special).any():
            return values.str.to_titlecase()
        return (
            values.str.replace_many({{"Σ": "σ", "ß": "ẞ"}})
            .str.replace_all(r"{TITLE_UNCASED}", "$0\\uffff")
            .str.replace_all(kept, mark + "$0")
            .str.to_titlecase()
            .str.replace_all("\\uffff", "", literal=True)
            .str.replace_many({{"ǅ": "Ǆ", "ǈ": "Ǉ", "ǋ": "Ǌ", "ǲ": "Ǳ", "i\\u0307": "i"}})
            .str.replace_all(mark + f"({{kept}})", "$1")
        )

    return text.map_batches(title, return_dtype=pl.String, is_elementwise=True)
'''


def _text_expr(column: Column) -> Code:
    """The column as a Polars text expression (a category column's values as text)."""
    if column.dtype in ("category", "enum"):
        return column.code.method("cast", emit.atom("pl.String"))
    return column.code




def _simple_lower_case(text: Code) -> Code:
    """`text` (a .str namespace) with the two capitals whose lower case Polars writes by
    Unicode's full rules made lower case first, as pandas' (pyarrow's) kernel lowers them one
    letter at a time: "İ" is "i" (Polars: "i̇", two characters) and "Σ" is "σ" at the end
    of a word too (Polars: the final "ς")."""
    return text.method("replace_many", {"İ": "i", "Σ": "σ"}).attr("str")


_STRIP = {"strip": "strip_chars", "lstrip": "strip_chars_start", "rstrip": "strip_chars_end"}
# the characters Python's str.isspace() is true for, which pandas' str.strip() without chars
# strips: Unicode's White_Space (what Polars' strip_chars() strips) and the separators
# \x1c-\x1f. Given as the set to strip_chars, they are stripped at Polars' speed (a regex of
# them takes three times as long)
WHITESPACE_CONSTANT = "PANDAS_WHITESPACE"
WHITESPACE_DEFINITION = (
    "# The characters Python's str.isspace() calls whitespace, which pandas' str.strip() takes\n"
    "# off: Polars' strip_chars() leaves the separators \\x1c-\\x1f.\n"
    "PANDAS_WHITESPACE = (\n"
    '    "\\t\\n\\x0b\\x0c\\r\\x1c\\x1d\\x1e\\x1f \\x85\\xa0\\u1680"\n'
    '    "\\u2000\\u2001\\u2002\\u2003\\u2004\\u2005\\u2006\\u2007"\n'
    '    "\\u2008\\u2009\\u200a\\u2028\\u2029\\u202f\\u205f\\u3000"\n'
    ")\n")


@rule("series.str.strip", "series.str.lstrip", "series.str.rstrip")
def strip(call: PandasCall, ctx: RuleContext) -> Value:
    """s.str.strip(chars) / lstrip / rstrip -> str.strip_chars(chars) / _start / _end.

    Handles: a set of characters to strip (both read it as a set, not a prefix); without
    chars, Python's whitespace at the ends (\\x1c-\\x1f too, which Polars' strip_chars()
    leaves): strip_chars(PANDAS_WHITESPACE), the set defined at the top of the script.
    """
    column = text_column(call, ctx)
    ctx.reject_unknown(call, "to_strip", positional=1)
    chars = call.const("to_strip", 0, None)
    if chars is None:
        # pandas strips what Python's str.isspace() calls whitespace; Polars' strip_chars()
        # Unicode's White_Space, which lacks the separators \x1c-\x1f: the set is given
        return _string(column, _text(column).method(_STRIP[call.name],
                                                    emit.atom(WHITESPACE_CONSTANT)))
    if not isinstance(chars, str):
        raise ctx.todo("characters to strip must be text")
    return _string(column, _text(column).method(_STRIP[call.name], chars))


# -- length, padding (T07, T10) -------------------------------------------------------------

@rule("series.str.len")
def str_len(call: PandasCall, ctx: RuleContext) -> Value:
    """s.str.len() -> str.len_chars().cast(pl.Int64); on a column of lists list.len().

    Handles: characters, not UTF-8 bytes ("Éclair" is 6); Int64 so arithmetic cannot wrap; the
    number of parts of a list (str.split(...).str.len()); pandas gives float64 when a value is
    missing, Polars Int64 with nulls: the column is marked as pandas' float64 there, so its
    min, max or sum is 3.0 when a value is missing and 3 when none is, as in pandas.
    """
    column = accessor_column(call)
    ctx.reject_unknown(call)
    if column.dtype == LIST_STR:
        result = _result(column, column.code.attr("list").method("len").method("cast", INT64),
                         "int")
    else:
        result = _result(column, _text(column).method("len_chars").method("cast", INT64), "int")
    return _counts(result, ctx, column)


@rule("series.str.zfill")
def zfill(call: PandasCall, ctx: RuleContext) -> Value:
    """s.str.zfill(w) -> str.zfill(w).

    Handles: a leading sign stays in front in both ("-0042").
    """
    column = text_column(call, ctx)
    ctx.reject_unknown(call, "width", positional=1)
    width = call.const("width", 0)
    if not isinstance(width, int):
        raise ctx.todo("width must be an integer")
    return _string(column, _text(column).method("zfill", width))


_SIDES = {"ljust": "right", "rjust": "left", "center": "both"}


@rule("series.str.pad", "series.str.center", "series.str.ljust", "series.str.rjust")
def pad(call: PandasCall, ctx: RuleContext) -> Value:
    """s.str.pad(w, side, fillchar) / ljust / rjust / center -> str.pad_start / pad_end.

    Handles: side="both" and center() put the odd extra character where Python does
    (left when the width is odd), T10.
    """
    column = text_column(call, ctx)
    if call.name == "pad":
        ctx.reject_unknown(call, "width", "side", "fillchar", positional=3)
        side = call.const("side", 1, "left")
        fill = call.const("fillchar", 2, " ")
    else:
        ctx.reject_unknown(call, "width", "fillchar", positional=2)
        side = _SIDES[call.name]
        fill = call.const("fillchar", 1, " ")
    width = call.const("width", 0)
    if not isinstance(width, int) or not isinstance(fill, str) or len(fill) != 1:
        raise ctx.todo("width must be an integer and fillchar one character")
    text = _text(column)
    if side == "left":
        return _string(column, text.method("pad_start", width, fill))
    if side == "right":
        return _string(column, text.method("pad_end", width, fill))
    if side != "both":
        raise ctx.todo(f"side={side!r}")
    n = text.method("len_chars").method("cast", INT64)
    total = emit.pl("max_horizontal", emit.binop(emit.pl("lit", width), "-", n), 0)
    left = emit.binop(emit.binop(total, "+", 1) if width % 2 else total, "//", 2)
    start = emit.binop(n, "+", left).method("cast", emit.atom("pl.UInt32"))
    padded = text.method("pad_start", start, fill).attr("str").method("pad_end", width, fill)
    return _string(column, padded)


# -- slices and single characters (T09) -----------------------------------------------------

def slice_code(text: Code, start: int | None, stop: int | None, ctx: RuleContext) -> Code:
    """Python's s[start:stop] on every string, as Polars string methods."""
    start = start or 0
    if stop is None:
        return text.method("tail", -start) if start < 0 else text.method("slice", start)
    if start == 0 or stop == 0:  # s[-3:0] is always empty
        return text.method("head", stop if start == 0 else 0)
    if start > 0 and stop < 0:
        return text.method("head", stop).attr("str").method("slice", start)
    if (start > 0) == (stop > 0):  # both from the start, or both from the end
        return text.method("slice", start, max(stop - start, 0))
    raise ctx.todo(f"a slice from the end to a position from the start ([{start}:{stop}])")


def char_at(column: Column, index: int) -> Column:
    """s.str[i]: missing (not "") where the string is too short."""
    text = _text(column)
    longer = emit.binop(text.method("len_chars"), ">" if index >= 0 else ">=",
                        index if index >= 0 else -index)
    return _string(column, emit.when(longer, text.method("slice", index, 1)))


def _check_slice(start: object, stop: object, step: object, ctx: RuleContext) -> None:
    if step not in (None, 1):
        raise ctx.todo("a slice with a step")
    if not all(v is None or isinstance(v, int) and not isinstance(v, bool) for v in (start, stop)):
        raise ctx.todo("slice bounds must be integers")


@rule("series.str.slice")
def slice_(call: PandasCall, ctx: RuleContext) -> Value:
    """s.str.slice(start, stop) -> str.slice / str.head / str.tail.

    Handles: negative bounds ([-3:] -> tail(3), [:-1] -> head(-1), [1:-1] -> head(-1).slice(1)),
    strings shorter than the slice.
    Caveats: a step, and a negative start with a non-negative stop, are TODOs.
    """
    column = text_column(call, ctx)
    ctx.reject_unknown(call, "start", "stop", "step", positional=3)
    start, stop, step = (call.const(n, i, None) for i, n in enumerate(("start", "stop", "step")))
    _check_slice(start, stop, step, ctx)
    return _string(column, slice_code(_text(column), start, stop, ctx))


@rule("series.str.getitem", "series.str.get")
def getitem(call: PandasCall, ctx: RuleContext) -> Value:
    """s.str[a:b] / s.str[i] / s.str.get(i) -> str.slice / head / tail, or
    pl.when(str.len_chars() > i).then(str.slice(i, 1)).

    Handles: an index past the end gives a missing value in pandas ("" from str.slice), so the
    character is taken only where the string is long enough.
    """
    column = accessor_column(call)
    if call.name == "get":
        ctx.reject_unknown(call, "i", positional=1)
    key = call.const("i", 0)
    if column.dtype == LIST_STR:
        return list_item(column, key, ctx)
    if isinstance(key, slice):
        _check_slice(key.start, key.stop, key.step, ctx)
        return _string(column, slice_code(_text(column), key.start, key.stop, ctx))
    if isinstance(key, int) and not isinstance(key, bool):
        return char_at(column, key)
    raise ctx.todo("an index that is not an integer or a slice")


def list_item(column: Column, key: object, ctx: RuleContext) -> Column:
    """s.str[i] / s.str.get(i) / s.str[a:b] on a column of lists (str.split): one part, missing
    where the list is too short (pandas' NaN), or a shorter list."""
    items = column.code.attr("list")
    if isinstance(key, int) and not isinstance(key, bool):
        return _string(column, items.method("get", key, null_on_oob=True))
    if not isinstance(key, slice):
        raise ctx.todo("an index that is not an integer or a slice")
    _check_slice(key.start, key.stop, key.step, ctx)
    start, stop = key.start or 0, key.stop
    if start >= 0 and stop is None:
        code = items.method("slice", start) if start else column.code
    elif start >= 0 and stop is not None and stop >= 0:
        code = items.method("head", stop) if start == 0 else \
            items.method("slice", start, max(stop - start, 0))
    elif start < 0 and stop is None:
        code = items.method("tail", -start)
    else:  # list.head / slice read a negative bound otherwise than Python
        raise ctx.todo(f"a slice of lists with a bound from the end ([{key.start}:{key.stop}])")
    return _result(column, code, LIST_STR)


def list_repr(items: Code) -> Code:
    """A list of text written as Python's str(list) writes it (pandas' to_csv of str.split's
    lists): ['a', "it's"], with backslashes, \\n, \\t, \\r and the quote escaped."""
    element = emit.pl("element")
    chars, escapes = ["\\", "\n", "\t", "\r"], ["\\\\", "\\n", "\\t", "\\r"]
    escaped = element.attr("str").method("replace_many", chars, escapes)
    single = element.attr("str").method("replace_many", [*chars, "'"], [*escapes, "\\'"])
    double = emit.binop(element.attr("str").method("contains", "'", literal=True), "&",
                        emit.unary("~", element.attr("str").method("contains", '"', literal=True)))
    item = emit.when(double, emit.pl("format", '"{}"', escaped), emit.pl("format", "'{}'", single))
    joined = items.attr("list").method("eval", item).attr("list").method("join", ", ")
    return emit.pl("format", "[{}]", joined)


# -- tests that give booleans (T01, T08, M11) -------------------------------------------------

def predicate(column: Column, code: Code, call: PandasCall, position: int,
              ctx: RuleContext) -> Column:
    """A boolean test: pandas gives `na` (False by default) for a missing value; on a column
    porter knows to be pandas' "string" dtype, <NA> by default (its nullable boolean)."""
    na = call.const("na", position, None)
    if column.nullable_int == "string" and (na is None or isinstance(na, bool)):
        tested = code if na is None else code.method("fill_null", na)
        return _replace(_result(column, tested, "bool"), nullable_int="boolean")
    if na is True:
        return _result(column, code.method("fill_null", True), "bool")
    if na is None or na is False or isinstance(na, float) and math.isnan(na):
        return _result(column, code, "bool", null_is_false=True)
    raise ctx.todo(f"na={na!r}: pandas puts that value into a boolean result")


def _case(call: PandasCall, position: int, ctx: RuleContext, default: bool | None = True) -> int:
    case = call.const("case", position, default)
    if case not in (True, False, None):
        raise ctx.todo("case must be True or False")
    return re.I if case is False else 0


@rule("series.str.contains")
def contains(call: PandasCall, ctx: RuleContext) -> Value:
    """s.str.contains(pat, case, flags, na, regex) -> str.contains(...).fill_null(na).

    Handles: a regex by default, checked for Python-only features (T12); case=False and
    flags=re.I/M/S as inline flags; regex=False as a literal (pandas then ignores flags); a
    missing value is False or `na`; a final $ also matches before a final newline, as in Python;
    \\w, \\W, \\s, \\S written as the classes Python means by them (polars_regex).
    Caveats: lookarounds, backreferences, \\< \\>, nested sets and a $ that is not the last
    character are TODOs; \\b lowers confidence (0.95): a word boundary next to ², ½, a combining
    accent or ‿ differs.
    """
    column = text_column(call, ctx)
    ctx.reject_unknown(call, "pat", "case", "flags", "na", "regex", positional=5)
    pat = call.const("pat", 0)
    if not isinstance(pat, str):
        raise ctx.todo("a pattern that is not text (a compiled regex?)")
    regex = call.const("regex", 4, True)
    flags = (regex_flags(call, 2) if regex else 0) | _case(call, 1, ctx)  # pandas ignores flags
    text = _text(column)
    if not regex and not flags:
        code = text.method("contains", pat, literal=True)
    else:
        pattern = polars_regex(pat if regex else re.escape(pat), flags, ctx, test=True)
        code = text.method("contains", inline_flags(flags) + pattern)
    return predicate(column, code, call, 3, ctx)


@rule("series.str.match", "series.str.fullmatch")
def match(call: PandasCall, ctx: RuleContext) -> Value:
    """s.str.match(pat) / fullmatch(pat) -> str.contains(r"\\A(?:pat)") / r"\\A(?:pat)\\z".

    Handles: case, flags and na as for contains.
    """
    column = text_column(call, ctx)
    ctx.reject_unknown(call, "pat", "case", "flags", "na", positional=4)
    pat = call.const("pat", 0)
    if not isinstance(pat, str):
        raise ctx.todo("a pattern that is not text (a compiled regex?)")
    flags = regex_flags(call, 2) | _case(call, 1, ctx)
    end = r"\z" if call.name == "fullmatch" else ""
    body = polars_regex(pat, flags, ctx, test=False)
    anchored = inline_flags(flags) + r"\A(?:" + body + ")" + end
    return predicate(column, _text(column).method("contains", anchored), call, 3, ctx)


_PREFIX = {"startswith": "starts_with", "endswith": "ends_with"}


@rule("series.str.startswith", "series.str.endswith")
def prefix(call: PandasCall, ctx: RuleContext) -> Value:
    """s.str.startswith(p) / endswith(p) -> str.starts_with(p) / ends_with(p), filled with na.

    Handles: a tuple of prefixes (pl.any_horizontal over them); missing is False or `na`.
    """
    column = text_column(call, ctx)
    ctx.reject_unknown(call, "pat", "na", positional=2)
    pat = call.const("pat", 0)
    pats = pat if isinstance(pat, tuple) else (pat,)
    if not pats or not all(isinstance(p, str) for p in pats):
        raise ctx.todo("the prefix must be text or a non-empty tuple of text")
    tests = [_text(column).method(_PREFIX[call.name], p) for p in pats]
    code = tests[0] if len(tests) == 1 else emit.pl("any_horizontal", *tests)
    return predicate(column, code, call, 1, ctx)


# -- replace (T02, T03) -----------------------------------------------------------------------

@rule("series.str.replace")
def replace(call: PandasCall, ctx: RuleContext) -> Value:
    """s.str.replace(pat, repl, n, case, flags, regex) -> str.replace_all / str.replace.

    Handles: pandas 3 replaces every occurrence literally by default (replace_all,
    literal=True); regex=True with \\1 / \\g<name> written as ${1} / ${name} and a literal $ as
    $$; case=False and flags (pandas then reads repl as a template); n=1; n=k for literals.
    Caveats: a callable repl, a compiled pattern, Python-only regex features and a regex
    replacement with n=0 or n > 1 are TODOs.
    """
    column = text_column(call, ctx)
    ctx.reject_unknown(call, "pat", "repl", "n", "case", "flags", "regex", positional=6)
    pat, repl = call.const("pat", 0), call.const("repl", 1)
    if not isinstance(pat, str) or not isinstance(repl, str):
        raise ctx.todo("a compiled pattern or a callable replacement")
    n = call.const("n", 2, -1)
    regex = call.const("regex", 5, False)
    flags = regex_flags(call, 4) | _case(call, 3, ctx, default=None)
    if not isinstance(n, int) or isinstance(n, bool):
        raise ctx.todo("n must be an integer")
    text = _text(column)
    if not regex and not flags:
        args: tuple[object, ...] = (pat, repl)
        options: dict[str, object] = {"literal": True}
    else:
        if n == 0 or n > 1:  # n=0 replaces nothing or everything, depending on pandas' path
            raise ctx.todo(f"a regex replacement with n={n}: Polars replaces the first or all")
        pattern = pat if regex else re.escape(pat)
        groups = re.compile(pattern, flags).groups
        if _anchored_at_both_ends(pattern, flags):
            # ^...$: one match at most, and Python's $ also matches before a final newline:
            # the newline is matched by a group of its own and written back after the
            # replacement, so the text is the same as pandas'
            source = polars_regex(pattern[:-1], flags, ctx, test=False) + r"(\n?)$"
            template = polars_template(repl, groups, ctx) + f"${{{groups + 1}}}"
        else:
            source = polars_regex(pattern, flags, ctx, test=False)
            template = polars_template(repl, groups, ctx)
        args = (inline_flags(flags) + source, template)
        options = {}
    if n < 0:
        return _string(column, text.method("replace_all", *args, **options))
    if n != 1:
        options["n"] = n
    return _string(column, text.method("replace", *args, **options))


# -- capitalize, count, findall (T06, T12) ------------------------------------------------------

@rule("series.str.capitalize")
def capitalize(call: PandasCall, ctx: RuleContext) -> Value:
    """s.str.capitalize() -> pandas_upper(str.head(1)) + str.slice(1).str.to_lowercase().

    Handles: the first character upper case and the rest lower case, as pandas' kernel does
    ('ǆ' becomes 'Ǆ', not the title-case 'ǅ' of Python's str.capitalize).
    The first letter as upper() writes it: 'ß' becomes 'ẞ' and a ligature ('ﬁ') is kept, as in
    pandas (Polars writes 'SS' and 'FI').
    Caveats: letters added in Unicode 16 change case in pandas only: 0.98.
    """
    column = text_column(call, ctx)
    ctx.reject_unknown(call)
    text = _text(column)
    first = emit.call(UPPER_FUNCTION, text.method("head", 1))
    rest = _simple_lower_case(text.method("slice", 1).attr("str")).method("to_lowercase")
    return _string(column, emit.binop(first, "+", rest))


def _pattern(call: PandasCall, ctx: RuleContext, flags_position: int, *,
             test: bool) -> tuple[str | Code, re.Pattern[str]]:
    """The pattern argument (position 0) and `flags=` as one Polars pattern (the script's own
    constant when Polars reads it as it is), and the pattern as Python compiles it."""
    pat = call.const("pat", 0)
    if not isinstance(pat, str):
        raise ctx.todo("a pattern that is not text (a compiled regex?)")
    flags = regex_flags(call, flags_position)
    source = inline_flags(flags) + polars_regex(pat, flags, ctx, test=test)
    written = call.arg("pat", 0)
    if source == pat and written.code.text.isidentifier():
        return written.code, re.compile(pat, flags)  # TAG_PATTERN stays TAG_PATTERN
    return source, re.compile(pat, flags)


def _may_match_empty(compiled: re.Pattern[str]) -> bool:
    return _P.parse(compiled.pattern, compiled.flags).getwidth()[0] == 0


@rule("series.str.count")
def count(call: PandasCall, ctx: RuleContext) -> Value:
    """s.str.count(pat, flags) -> str.count_matches(pat).cast(pl.Int64).

    Handles: non-overlapping matches counted as re.findall finds them; flags as inline flags;
    a missing value stays missing.
    Caveats: a pattern that can match the empty string is a TODO (pandas counts empty matches
    at every byte with pyarrow, Python and Polars each otherwise); pandas gives float64 when a
    value is missing, Polars Int64 with nulls: marked as str.len() is.
    """
    column = text_column(call, ctx)
    ctx.reject_unknown(call, "pat", "flags", positional=2)
    pattern, compiled = _pattern(call, ctx, 1, test=False)
    if _may_match_empty(compiled):
        raise ctx.todo(f"the pattern {compiled.pattern!r} can match the empty string: each "
                       "engine counts empty matches its own way")
    code = _text(column).method("count_matches", pattern).method("cast", INT64)
    return _counts(_result(column, code, "int"), ctx, column)


@rule("series.str.findall")
def findall(call: PandasCall, ctx: RuleContext) -> Value:
    """s.str.findall(pat, flags) -> str.extract_all(pat), a list per row.

    Handles: every non-overlapping match in order, as re.findall; an empty list where nothing
    matches; a missing value stays missing.
    Caveats: a pattern with groups (re.findall then gives the groups, Polars the whole match)
    and a pattern that can match the empty string (Polars skips an empty match right after a
    match) are TODOs.
    """
    column = text_column(call, ctx)
    ctx.reject_unknown(call, "pat", "flags", positional=2)
    pattern, compiled = _pattern(call, ctx, 1, test=False)
    if compiled.groups:
        raise ctx.todo("a pattern with groups: re.findall gives the groups, str.extract_all "
                       "the whole match (make the groups non-capturing: (?:...))")
    if _may_match_empty(compiled):
        raise ctx.todo(f"the pattern {compiled.pattern!r} can match the empty string: Polars "
                       "skips an empty match right after a match, Python does not")
    return _result(column, _text(column).method("extract_all", pattern), LIST_STR)


# -- split and extract: lists and frames of parts (T04, T05) ------------------------------------

def _again_in_pandas(call: PandasCall, column: Column) -> Code:
    """The call made by pandas on the pandas Series (for code that needs pandas' DataFrame)."""
    node = call.node
    if not isinstance(node, cst.Call):
        raise Unsupported("the frame of parts is made outside a call porter can write again")
    empty = cst.Module(body=[])
    args = ", ".join(empty.code_for_node(a.with_changes(comma=cst.MaybeSentinel.DEFAULT))
                     for a in node.args)
    receiver = handover.to_pandas(column).wrapped(emit.ATOM)
    return emit.atom(f"{receiver}.str.{call.name}({args})")


def _separator(call: PandasCall, ctx: RuleContext) -> tuple[str | None, bool]:
    """What is split on, and whether it is literal text (None: runs of whitespace)."""
    pat = call.const("pat", 0, None)
    if pat is None:
        return None, True
    if not isinstance(pat, str) or not pat:
        raise ctx.todo("a separator that is not text (a compiled regex?) or is empty")
    regex = call.const("regex", None, None) if call.name == "split" else False
    if regex is False or regex is None and len(pat) == 1:
        return pat, True
    # pandas reads a longer pattern (or regex=True) with re.split
    try:
        tree = _P.parse(pat)
    except re.error:
        raise ctx.todo(f"{pat!r} is read as a regex by pandas, and is not a valid one") from None
    if all(op is _C.LITERAL for op, _ in tree):  # plain characters: the same text
        return "".join(chr(av) for _, av in tree), True  # type: ignore[arg-type]
    compiled = re.compile(pat)
    if compiled.groups:
        raise ctx.todo(f"the separator {pat!r} has groups: re.split puts what they matched "
                       "between the parts (make them non-capturing: (?:...))")
    if _may_match_empty(compiled):
        raise ctx.todo(f"the separator {pat!r} can match the empty string: re.split splits "
                       "there, Polars does not")
    return polars_regex(pat, 0, ctx, test=False), False


def _limit(call: PandasCall, ctx: RuleContext) -> int | None:
    """n= as a number of splits (None: every one)."""
    n = call.const("n", None, -1)
    if n is None or n in (0, -1) and not isinstance(n, bool):
        return None
    if not isinstance(n, int) or isinstance(n, bool) or n < 0:
        raise ctx.todo(f"n={n!r}")
    return n


@rule("series.str.split", "series.str.rsplit")
def split(call: PandasCall, ctx: RuleContext) -> Value:
    """s.str.split(sep) -> str.split(sep), a list per row; rsplit(sep, n=k) from the right;
    expand=True -> a frame of parts whose columns are parts.list.get(i, null_on_oob=True).

    Handles: a one-character separator as text; a longer one (or regex=True) is a regex in
    pandas: as text when it has no metacharacters, otherwise str.split(pat, literal=False)
    (re.split and Polars split alike at matches that cannot be empty, with no groups); no
    separator splits on runs of whitespace as Python's str.split() (str.extract_all of runs of
    what is not Python's whitespace, \\x1c-\\x1f being some: none for an empty or blank
    string); n=k keeps the rest in the last (first, for rsplit) part; a missing value stays
    missing; a subscript of the expanded frame is missing where a row has fewer parts, as in
    pandas.
    Caveats: a regex separator with groups, that can match empty text or with n, whitespace
    with n, and reading the expanded frame as a whole (its width is the parts of the longest
    row) are TODOs.
    """
    column = text_column(call, ctx)
    known = ("pat", "n", "expand", "regex") if call.name == "split" else ("pat", "n", "expand")
    ctx.reject_unknown(call, *known, positional=1)
    sep, literal = _separator(call, ctx)
    n = _limit(call, ctx)
    expand = call.const("expand", None, False, kinds=(bool,))
    text = _text(column)
    if not literal:
        if n is not None:
            raise ctx.todo("a regex separator with n: Polars' splitn takes literal text")
        parts = text.method("split", sep, literal=False)
    elif sep is None:
        if n is not None:
            raise ctx.todo("splitting on whitespace with n: Python keeps the rest with its own "
                           "spacing")
        # Python's whitespace: \x1c-\x1f too (Polars' \S takes them for text)
        parts = text.method("extract_all", python_classes(r"\S+"))
    else:
        parts = text.method("split", sep)
        if n is not None:
            items = parts.attr("list")
            if call.name == "split":
                if expand:  # at most n + 1 parts, each a field of a struct
                    whole = text.method("splitn", sep, n + 1)
                    fields = tuple((i, f"field_{i}") for i in range(n + 1))
                    singles = tuple((i, whole.attr("struct").method("field", f"field_{i}"))
                                    for i in range(n + 1))
                    return Parts(whole, source=column, fields=fields, singles=singles,
                                 pandas=_again_in_pandas(call, column))
                joined = emit.pl("concat_list", items.method("head", n),
                                 items.method("slice", n).attr("list").method("join", sep))
            else:
                rest = emit.binop(items.method("len"), "-", n)
                joined = emit.pl("concat_list", items.method("head", rest).attr("list")
                                 .method("join", sep), items.method("tail", n))
            longer = emit.binop(items.method("len"), ">", n + 1)
            parts = emit.when(longer, joined, parts)
    if expand:
        return Parts(parts, source=column, pandas=_again_in_pandas(call, column))
    return _result(column, parts, LIST_STR)


@rule("series.str.extract")
def extract(call: PandasCall, ctx: RuleContext) -> Value:
    """s.str.extract(pat) -> str.extract_groups(pat) (its fields parts.struct.field("1"), or
    str.extract(pat, 1) for one column); expand=False with one group -> str.extract(pat, 1).

    Handles: pandas' labels 0, 1, … for unnamed groups and the name of a named one (Polars
    names fields "1", "2", … and by name); no match, a missing value and a group that took no
    part are missing in both; an empty match is ""; flags as inline flags; a final $ matches
    before a final newline, as in Python; \\w, \\W, \\s, \\S as Python means them.
    Caveats: Python-only regex features (lookaround, backreferences…) are TODOs; \\b lowers
    confidence (0.95).
    """
    column = text_column(call, ctx)
    ctx.reject_unknown(call, "pat", "flags", "expand", positional=3)
    expand = call.const("expand", 2, True, kinds=(bool,))
    # only the groups are read, and a final $ lies outside every group
    pattern, compiled = _pattern(call, ctx, 1, test=True)
    if not compiled.groups:
        raise ctx.todo("a pattern without groups (pandas raises)")
    text = _text(column)
    if not expand and compiled.groups == 1:
        return _string(column, text.method("extract", pattern, 1))
    names = {index: name for name, index in compiled.groupindex.items()}
    labels = [names.get(k, k - 1) for k in range(1, compiled.groups + 1)]
    fields = tuple((label, names.get(k, str(k))) for k, label in enumerate(labels, 1))
    singles = tuple((label, text.method("extract", pattern, k)) for k, label in enumerate(labels, 1))
    return Parts(text.method("extract_groups", pattern), source=column, fields=fields,
                 singles=singles, width_known=True, pandas=_again_in_pandas(call, column))


def part(parts: Parts, label: object, ctx: RuleContext) -> Column:
    """One column of a frame of parts, as an expression of its source's frame."""
    column = parts.source
    if isinstance(label, (list, dict, set)):
        raise ctx.todo("a list of labels: pandas' frame of those parts")
    if parts.fields:
        found = dict(parts.fields)
        if label not in found or isinstance(label, bool):
            raise ctx.todo(f"{label!r} is not a column of this frame (pandas raises KeyError)")
        if parts.bound:
            code = parts.code.attr("struct").method("field", found[label])
        else:
            code = dict(parts.singles)[label]
    elif isinstance(label, int) and not isinstance(label, bool) and label >= 0:
        code = parts.code.attr("list").method("get", label, null_on_oob=True)
    else:
        raise ctx.todo(f"{label!r}: the columns of str.split(expand=True) are 0, 1, …")
    ints = dict(parts.ints)
    if label in ints:  # s.dt.isocalendar()'s nullable integers
        return _replace(derived_column(column, code, dtype="int", name=str(label)),
                        nullable_int=ints[label])
    return derived_column(column, code, dtype="str", name=str(label))


@rule("series.str.expand.getitem")
def expand_getitem(call: PandasCall, ctx: RuleContext) -> Value:
    """parts[i] / parts["name"] / parts.name of str.extract or str.split(expand=True) -> the
    part as an expression of the source column's frame (struct.field or list.get).

    Handles: a row with fewer parts is missing, as pandas fills it; the column keeps the
    rows of the frame the text came from, so it can be assigned back to it.
    Caveats: a part number past pandas' width raises KeyError in pandas and is missing here;
    a list of labels, or the frame as a whole, stays pandas (but for s.dt.isocalendar()'s
    frame, whose columns are selected from the dates' frame).
    """
    parts = call.receiver
    assert isinstance(parts, Parts)
    key = call.args[0]
    if not (isinstance(key, Opaque) and key.is_const):
        raise ctx.todo("a label computed at run time")
    labels = [label for label, _ in parts.fields]
    if isinstance(key.const, list) and parts.ints and parts.whole is not None and key.const \
            and len(set(key.const)) == len(key.const) and all(k in labels for k in key.const):
        # iso[["week", "day"]] of isocalendar()'s frame: those columns of it, in that order
        whole = parts.whole
        return select_columns(whole, whole.code.method("select", *key.const), key.const)
    return part(parts, key.const, ctx)


def expanded_columns(parts: Parts, names: list[str], frame: Frame, ctx: RuleContext) -> list[Column]:
    """df[["a", "b"]] = parts: the parts in order, one per name, rows checked against `frame`.
    pandas raises unless the widths agree, so where it runs the columns are these."""
    check_same_rows(parts.source, frame)
    if parts.width_known and len(parts.fields) != len(names) \
            or parts.fields and len(names) > len(parts.fields):
        raise ctx.todo(f"{len(names)} names for {len(parts.fields)} columns (pandas raises)")
    if parts.width_known:
        labels = [label for label, _ in parts.fields]
    else:
        ctx.lower("pandas' width is the parts of the longest row: it raises where that is not "
                  f"{len(names)}, and Polars would take the first {len(names)}", 0.98)
        labels = list(range(len(names)))
    return [part(parts, label, ctx) for label in labels]


@rule("series.str.join")
def join(call: PandasCall, ctx: RuleContext) -> Value:
    """s.str.join(sep) on a column of lists (str.split) -> list.join(sep).

    Handles: a missing list stays missing, an empty list gives "".
    Caveats: on a column of text pandas puts sep between the characters: a TODO.
    """
    column = accessor_column(call)
    ctx.reject_unknown(call, "sep", positional=1)
    sep = call.const("sep", 0)
    if not isinstance(sep, str):
        raise ctx.todo("a separator that is not text")
    if column.dtype != LIST_STR:
        raise ctx.todo("str.join of a column not known to hold lists (pandas puts the separator "
                       "between the characters of text)")
    return _string(column, column.code.attr("list").method("join", sep))


@rule("series.str.cat")
def cat(call: PandasCall, ctx: RuleContext) -> Value:
    """a.str.cat(b, sep=x) -> pl.concat_str([a, b], separator=x, ignore_nulls=False);
    s.str.cat(sep=x) -> the column's texts joined into one Python str (str.join(x)).

    Handles: element-wise, a missing value in any input makes the row missing, as in pandas;
    na_rep=r fills each input's missing values with r first (not ignore_nulls=True, which
    would drop the separator too); several columns as a list; joined into one text, missing
    values are skipped (na_rep=r: written as r), no rows give "".
    Caveats: a Series of another frame (or of other rows: pandas aligns on the index), other
    list-likes, join= other than "left", and columns of numbers (pandas raises) are TODOs.
    """
    column = text_column(call, ctx)
    ctx.reject_unknown(call, "others", "sep", "na_rep", "join", positional=4)
    sep = call.const("sep", 1, None, kinds=(str, type(None)))
    sep = "" if sep is None else sep
    na_rep = call.const("na_rep", 2, None, kinds=(str, type(None)))
    if call.const("join", 3, "left", kinds=(str,)) != "left":
        raise ctx.todo("join= other than \"left\"")

    def text_of(value: Column) -> Code:
        if value.dtype in ("category", "enum"):
            code = value.code.method("cast", emit.atom("pl.String"))
        elif value.dtype in ("str", None):
            code = value.code
        else:
            raise ctx.todo(f"str.cat of a {value.dtype} column (pandas raises: cast it with "
                           "astype(str) first)")
        return code if na_rep is None else code.method("fill_null", na_rep)

    others = call.arg("others", 0, None)
    if others is None or isinstance(others, Opaque) and others.is_const and others.const is None:
        # every text joined into one; pandas skips the missing values (na_rep: written as it)
        expr = text_of(column).attr("str").method("join", sep)
        code = column.frame.code.method("select", expr).method("collect").method("item")
        agg = Column(expr, frame=column.frame, name=column.name, refs=column.refs,
                     versions=column.versions)
        return Scalar(code, pytype="str", agg=agg)
    parts = list(others.items) if isinstance(others, Items) else [others]
    if not parts or not all(isinstance(p, Column) for p in parts):
        raise ctx.todo("others that are not columns of the same frame")
    for part in parts:
        check_same_rows(part, column.frame)
    if any(p.dtype is None for p in (column, *parts)):
        ctx.lower("a column of unknown type: pandas raises on numbers, Polars writes them as "
                  "text", 0.95)
    # a missing value in any input makes the row missing, as pandas (ignore_nulls=False)
    expr = emit.pl("concat_str", [text_of(column), *(text_of(p) for p in parts)],
                   separator=sep, ignore_nulls=False)
    return derived_column(column, expr, dtype="str", others=parts)


# -- normalize, and the encode / decode round trip that folds accents -----------------------------

_FORMS = ("NFC", "NFD", "NFKC", "NFKD")
_ASCII = ("ascii", "us-ascii", "us_ascii", "646")


@rule("series.str.normalize")
def normalize(call: PandasCall, ctx: RuleContext) -> Value:
    """s.str.normalize(form) -> str.normalize(form).

    Handles: NFC, NFD, NFKC and NFKD, checked against pandas on accents, ligatures, compatibility
    characters and missing values.
    Caveats: Python's and Polars' Unicode tables can be of different Unicode versions, which
    matters only for characters added lately (0.99).
    """
    column = text_column(call, ctx)
    ctx.reject_unknown(call, "form", positional=1)
    form = call.const("form", 0, kinds=(str,))
    if form not in _FORMS:
        raise Unsupported(f"form={form!r} (pandas raises)")
    ctx.lower("Python's and Polars' Unicode tables may be of different versions (characters "
              "added lately)", 0.99)
    return _string(column, _text(column).method("normalize", form))


@dataclass(frozen=True)
class Encoded(Column):
    """s.str.encode("ascii", errors="ignore"): pandas' bytes, which Polars has no text methods
    for. Only .str.decode("ascii" | "utf-8") is ported (the text without what ASCII cannot
    hold, which is what the round trip gives); its rows are its own, so any other use hands it
    to pandas, which makes the bytes again (`pandas`)."""

    text: Column = field(kw_only=True)  # the ASCII text, an expression of the frame encoded
    pandas: Code = field(kw_only=True)
    key_prefix: str = field(default="series.encoded", kw_only=True)


@rule("series.str.encode")
def encode(call: PandasCall, ctx: RuleContext) -> Value:
    """s.str.encode("ascii", errors="ignore") -> bytes waiting for .str.decode (see Encoded).

    Handles: the accent-folding idiom s.str.normalize("NFKD").str.encode("ascii",
    errors="ignore").str.decode("ascii"): every character beyond ASCII dropped.
    Caveats: other encodings and error handlers, and bytes used other than decoded, are TODOs.
    """
    column = text_column(call, ctx)
    ctx.reject_unknown(call, "encoding", "errors", positional=2)
    encoding = call.const("encoding", 0, kinds=(str,))
    errors = call.const("errors", 1, "strict", kinds=(str,))
    if encoding.lower() not in _ASCII or errors != "ignore":
        raise Unsupported(f"encode({encoding!r}, errors={errors!r}): only ASCII with "
                          "errors='ignore' is ported (the text without what ASCII cannot hold)")
    if column.dtype not in ("str", None):
        raise Unsupported(f"a {column.dtype} column")
    text = _string(column, _text(column).method("replace_all", r"[^\x00-\x7F]", ""))
    pandas = handover.to_pandas(column).attr("str").method("encode", encoding, errors=errors)
    frame = _replace(column.frame, rows=fresh_token())  # not an expression of the frame: bytes
    return Encoded(text.code, frame=frame, name=column.name, dtype=None, text=text, pandas=pandas)


@rule("series.str.decode")
def decode(call: PandasCall, ctx: RuleContext) -> Value:
    """bytes.str.decode("ascii" | "utf-8") of s.str.encode("ascii", errors="ignore") -> the
    text without what ASCII cannot hold."""
    column = accessor_column(call)
    ctx.reject_unknown(call, "encoding", "errors", positional=2)
    if not isinstance(column, Encoded):
        raise Unsupported("decoding bytes porter did not make")
    encoding = call.const("encoding", 0, kinds=(str,))
    if encoding.lower() not in (*_ASCII, "utf-8", "utf8", "latin-1", "latin1"):
        raise Unsupported(f"decode({encoding!r})")
    return column.text
