"""Property-based: corpus scripts changed in small ways real code shows (keywords glued to a
parenthesis, the other quote character, implicit string concatenation, f-strings, option values
of another kind) never crash porter, and what it writes parses on Python 3.11."""

from __future__ import annotations

import ast
from pathlib import Path

from hypothesis import HealthCheck, assume, given, settings, strategies as st
import libcst as cst

from porter.api import OLDEST_PYTHON, convert_source

ROOT = Path(__file__).resolve().parent.parent
SCRIPTS = {p.parent.name: p.read_text(encoding="utf-8") for p in sorted(ROOT.glob("corpus/*/*.py"))}
OTHER_VALUES = ["-1", "1.5", "None", "'x'", "['x', -1]", "{'x': 1}", "True", "('a', 'b')", "0"]


class _Mutate(cst.CSTTransformer):
    """Applies one kind of change to the `target`-th candidate node (counted in visit order)."""

    def __init__(self, kind: str, target: int) -> None:
        super().__init__()
        self.kind, self.target, self.seen = kind, target, 0

    def _pick(self) -> bool:
        self.seen += 1
        return self.seen - 1 == self.target

    # keywords glued to a parenthesised expression: `if(x):`, `while(x):`, `return(x)`
    def leave_If(self, original: cst.If, updated: cst.If) -> cst.If:
        if self.kind == "glue" and self._pick():
            test = updated.test.with_changes(lpar=[cst.LeftParen()], rpar=[cst.RightParen()])
            return updated.with_changes(test=test, whitespace_before_test=cst.SimpleWhitespace(""))
        return updated

    def leave_Return(self, original: cst.Return, updated: cst.Return) -> cst.Return:
        if self.kind == "glue" and updated.value is not None and self._pick():
            value = updated.value.with_changes(lpar=[cst.LeftParen()], rpar=[cst.RightParen()])
            return updated.with_changes(value=value, whitespace_after_return=cst.SimpleWhitespace(""))
        return updated

    def leave_SimpleString(self, original: cst.SimpleString, updated: cst.SimpleString) -> cst.BaseExpression:
        if self.kind == "quotes" and self._pick():
            value = original.evaluated_value
            if isinstance(value, str) and "'" not in value and '"' not in value and "\\" not in value:
                quote = "'" if original.quote == '"' else '"'
                return updated.with_changes(value=f"{original.prefix}{quote}{value}{quote}")
        return updated

    def leave_Arg(self, original: cst.Arg, updated: cst.Arg) -> cst.Arg:
        if self.kind == "option" and original.keyword is not None and self._pick():
            new = OTHER_VALUES[self.target % len(OTHER_VALUES)]
            return updated.with_changes(value=cst.parse_expression(new))
        if self.kind == "fstring" and original.keyword is None and self._pick() \
                and isinstance(original.value, (cst.Name, cst.Subscript, cst.Attribute, cst.Call)):
            inner = cst.Module([]).code_for_node(original.value)
            if "\n" not in inner and '"' not in inner and "\\" not in inner:
                wrapped = cst.parse_expression(f'("rows: " f"{{{inner}}}" f" {{{inner}!r:>8}}")')
                return updated.with_changes(value=wrapped)
        return updated


def mutate(text: str, changes: list[tuple[str, int]]) -> str:
    module = cst.parse_module(text)
    for kind, target in changes:
        module = module.visit(_Mutate(kind, target))
    return module.code


@settings(max_examples=40, deadline=None, derandomize=True,
          suppress_health_check=[HealthCheck.too_slow])
@given(name=st.sampled_from(sorted(SCRIPTS)),
       changes=st.lists(st.tuples(st.sampled_from(["glue", "quotes", "option", "fstring"]),
                                  st.integers(0, 60)), min_size=1, max_size=4))
def test_mutated_corpus_scripts_convert_and_parse_on_311(name, changes):
    text = mutate(SCRIPTS[name], changes)
    try:
        ast.parse(text, feature_version=OLDEST_PYTHON)
    except SyntaxError:
        assume(False)
    result = convert_source(text, path=f"{name}.py")  # raises on a crash or unparseable output
    ast.parse(result.converted_text, feature_version=OLDEST_PYTHON)
    assert not any("internal error" in s.message for s in result.sites), [
        s.message for s in result.sites if "internal error" in s.message]
