"""Rewriting inside expressions porter does not model: the pandas values found in them are
rewritten (or handed over explicitly) and everything else is kept as written."""

from __future__ import annotations

from typing import TYPE_CHECKING, Any

import libcst as cst

from porter.emit import code as emit
from porter.emit.code import ATOM, Code
from porter.emit.fstrings import as_format_call, fit_in_fstring, forbidden_in
from porter.model import SiteDraft
from porter.translate import handover
from porter.translate.values import Opaque, PandasValue, is_pandas

if TYPE_CHECKING:
    from porter.translate.evaluate import Evaluator

BINARY_OPS = {
    cst.Add: "+", cst.Subtract: "-", cst.Multiply: "*", cst.Divide: "/", cst.FloorDivide: "//",
    cst.Modulo: "%", cst.Power: "**", cst.BitAnd: "&", cst.BitOr: "|", cst.BitXor: "^",
    cst.MatrixMultiply: "@", cst.LeftShift: "<<", cst.RightShift: ">>",
}


class ChildRewriter(cst.CSTTransformer):
    """Evaluates the outermost expressions inside a node and swaps in their rewritten code."""

    def __init__(self, evaluator: Evaluator, root: cst.CSTNode, display: bool) -> None:
        super().__init__()
        self.evaluator = evaluator
        self.root = root
        self.display = display
        self.changed = False
        self.sites: list[SiteDraft] = []
        self.replacements: dict[int, cst.BaseExpression] = {}
        self.pandas_inside = False
        self.fstrings: list[cst.FormattedString] = []  # the f-strings being visited, innermost last
        self.unfit: set[int] = set()  # f-strings whose rewritten code cannot stay between braces
        self.concatenations = 0  # depth of implicit string concatenations being visited
        self.format_calls: dict[int, tuple[cst.CSTNode, cst.Call]] = {}
        self.attributes: set[int] = set()  # attributes whose receiver alone is rewritten
        self.targets: set[int] = set()  # loop targets of the comprehension being rewritten
        self.pandas_methods: set[int] = set()  # `obj.method` of pandas objects kept as written

    def on_visit(self, node: cst.CSTNode) -> bool:
        if isinstance(node, cst.FormattedString):
            self.fstrings.append(node)
            return True
        if isinstance(node, cst.ConcatenatedString):
            self.concatenations += 1
            return True
        if node is self.root:
            if isinstance(node, _COMPREHENSIONS):
                self._enter_comprehension(node)
            return True
        if id(node) in self.targets:
            return False  # the names a comprehension binds are written as they are
        if isinstance(node, (cst.Lambda, cst.ListComp, cst.SetComp, cst.DictComp,
                             cst.GeneratorExp)):
            return self._visit_scope(node)
        if isinstance(node, cst.FormattedStringExpression):
            self._replace(node.expression, display=True)
            return False
        if isinstance(node, cst.Arg):  # the keyword is a name, not an expression
            self._replace(node.value, display=self.display)
            return False
        if isinstance(node, cst.BaseExpression):
            self._replace(node, display=self.display)
            return False
        return True

    def _enter_comprehension(self, node: cst.CSTNode) -> None:
        """A comprehension rewritten as a whole: its loop names shadow the script's names
        (`[f"{a}_{b}" for a, b in e.columns]` with a frame called `a`), so inside it they are
        plain values, and its targets are never rewritten."""
        from porter.translate.evaluate import Evaluator

        bound: set[str] = set()
        for_in = getattr(node, "for_in", None)
        while for_in is not None:
            self.targets.add(id(for_in.target))
            bound |= {n.value for n in _names_in(for_in.target)}
            for_in = for_in.inner_for_in
        shadowed = bound & set(self.evaluator.env)
        if shadowed:
            env = {k: v for k, v in self.evaluator.env.items() if k not in shadowed}
            self.evaluator = Evaluator(env, self.evaluator.services)

    def _visit_scope(self, node: cst.CSTNode) -> bool:
        # Names bound inside a lambda or comprehension are not the script's frames; only the
        # outermost iterable is evaluated in the enclosing scope.
        if isinstance(node, (cst.ListComp, cst.SetComp, cst.DictComp, cst.GeneratorExp)):
            self._replace(node.for_in.iter, display=False)
        return False

    def _replace(self, node: cst.BaseExpression, display: bool) -> None:
        evaluator = self.evaluator
        value = evaluator.eval(node)
        if handover.product_labels(value) is not None and not display:
            # pd.MultiIndex.from_product, held as a Polars frame of its labels, in code left to
            # pandas (a reindex of a table pandas made): pandas' MultiIndex of them
            value = PandasValue(handover.to_pandas(value), sites=value.sites)
        if is_pandas(value):
            value = (Opaque(handover.for_display(value), sites=value.sites) if display
                     else evaluator.handed_to_unknown(value, node))
        original = evaluator.source(node)
        replacement = None
        if isinstance(value, PandasValue) and not display and value.code.text == original \
                and isinstance(node, (cst.Call, cst.Subscript, cst.Attribute)):
            # pandas code kept as written: the calls along it as pandas 3.1 runs them
            modern = handover.modern_chain(node)
            if modern is not node and evaluator.source(modern) != original:
                value = PandasValue(Code(evaluator.source(modern), precedence(node)),
                                    sites=value.sites, rows=value.rows, frame=value.frame,
                                    label_rows=value.label_rows)
        if value.code.text != original:
            try:
                replacement = cst.parse_expression(value.code.text)
            except cst.ParserSyntaxError:  # a chain laid out over several lines
                if isinstance(node, cst.Attribute):
                    # `(df.set_index(k)\n .groupby)(...)` would garble the chain: the receiver
                    # is rewritten and the attribute keeps its place on the next line
                    self.attributes.add(id(node))
                    self._replace(node.value, display)
                    return
                replacement = cst.parse_expression(f"({value.code.text})")
                if "\n" in original:
                    # the node was laid out over several lines, so it sits inside brackets
                    # already: no second pair around the chain
                    replacement = replacement.with_changes(lpar=[], rpar=[])
        if isinstance(value, PandasValue) and not display:
            self.pandas_inside = True
            if isinstance(node, cst.Attribute):
                self.pandas_methods.add(id(node))
        self.sites += value.sites
        if replacement is not None:
            if (value.code.prec < precedence(node) or self.evaluator.services.glued(node)) \
                    and not replacement.lpar:
                # `if(df.kg > 0).all():` - a keyword glued to its expression needs the
                # replacement to start with a parenthesis too
                replacement = replacement.with_changes(lpar=[cst.LeftParen()], rpar=[cst.RightParen()])
            self.replacements[id(node)] = replacement
            self.changed = True

    def on_leave(self, original: cst.CSTNode, updated: cst.CSTNode) -> Any:
        # nodes whose children were rewritten without being visited
        if isinstance(original, cst.Arg) and id(original.value) in self.replacements:
            return updated.with_changes(value=self.replacements[id(original.value)])
        if id(original) in self.attributes and id(original.value) in self.replacements:  # type: ignore[attr-defined]
            return updated.with_changes(value=self.replacements[id(original.value)])  # type: ignore[attr-defined]
        if isinstance(original, cst.FormattedStringExpression) \
                and id(original.expression) in self.replacements:
            return updated.with_changes(expression=self._in_braces(original))
        if isinstance(original, cst.FormattedString):
            self.fstrings.pop()
            if id(original) in self.unfit:
                call = as_format_call(updated, self.evaluator.source)  # type: ignore[arg-type]
                if call is not None and self.concatenations:
                    # libcst only concatenates strings: the outermost concatenation is rebuilt
                    self.format_calls[id(updated)] = (updated, call)
                elif call is not None:
                    return call.with_changes(lpar=original.lpar, rpar=original.rpar)
            return updated
        if isinstance(original, cst.ConcatenatedString):
            self.concatenations -= 1
            if not self.concatenations and self.format_calls:
                # an f-string became a `str.format` call: the implicit concatenation becomes `+`
                return self._joined(updated).with_changes(  # type: ignore[arg-type]
                    lpar=original.lpar or [cst.LeftParen()], rpar=original.rpar or [cst.RightParen()])
        if isinstance(original, (cst.ListComp, cst.SetComp, cst.DictComp, cst.GeneratorExp)) \
                and id(original.for_in.iter) in self.replacements:
            for_in = updated.for_in.with_changes(iter=self.replacements[id(original.for_in.iter)])
            return updated.with_changes(for_in=for_in)
        if isinstance(original, cst.Call) and id(original.func) in self.pandas_methods:
            renamed = handover.modern_frequencies(original)
            if renamed:
                # a method of a pandas object given a frequency alias pandas 3 rejects
                self.changed = True
                updated = updated.with_changes(args=[  # type: ignore[attr-defined]
                    a.with_changes(value=cst.SimpleString(f'"{renamed[i]}"')) if i in renamed else a
                    for i, a in enumerate(updated.args)])  # type: ignore[attr-defined]
            modern = self._modern_call(original, updated)  # type: ignore[arg-type]
            if modern is not None:
                self.changed = True
                return modern
            if renamed:
                return updated
        if isinstance(original, cst.Call) and self._on_pandas(original):
            renamed = handover.modern_frequencies(original)
            if renamed:
                # a method of a pandas object kept as written, given a frequency alias pandas 3
                # rejects ("M", "15T"): written as pandas 3.1 names it, so the port runs
                self.changed = True
                return updated.with_changes(args=[  # type: ignore[attr-defined]
                    a.with_changes(value=cst.SimpleString(f'"{renamed[i]}"')) if i in renamed else a
                    for i, a in enumerate(updated.args)])  # type: ignore[attr-defined]
        replacement = self.replacements.get(id(original))
        if replacement is not None:
            if getattr(original, "lpar", None):
                return replacement.with_changes(lpar=original.lpar, rpar=original.rpar)
            return replacement
        return updated


    def _modern_call(self, original: cst.Call, updated: cst.Call) -> cst.BaseExpression | None:
        """A method pandas 3 removed, called on a pandas object kept as written (rules/legacy.py:
        `df.append(row, ignore_index=True)`, `s.fillna(method="ffill")`, `df.iteritems()`), as
        pandas 3.1 spells it: the kept code runs on pandas 3.1."""
        from porter.rules.legacy import modern_call

        func = updated.func
        if not isinstance(func, cst.Attribute) or any(arg.star for arg in updated.args):
            return None
        source = self.evaluator.source
        given = [(arg.keyword.value if arg.keyword else None, source(arg.value))
                 for arg in updated.args]
        text = modern_call(source(func.value), func.attr.value, given)
        if text is None:
            return None
        new = cst.parse_expression(text)
        return new.with_changes(lpar=original.lpar, rpar=original.rpar) if original.lpar else new

    def _on_pandas(self, call: cst.Call) -> bool:
        """Whether a method call's receiver is (built on) a pandas value this rewrite handed over."""
        if not isinstance(call.func, cst.Attribute):
            return False
        node: cst.CSTNode = call.func
        while True:
            if id(node) in self.replacements:
                return self.pandas_inside
            if isinstance(node, cst.Call):
                node = node.func
            elif isinstance(node, (cst.Attribute, cst.Subscript)):
                node = node.value
            else:
                return False

    def _joined(self, node: cst.BaseExpression) -> cst.BaseExpression:
        """`"a" f"..."` with its f-strings made `str.format` calls, joined by `+`."""
        if isinstance(node, cst.ConcatenatedString):
            return cst.BinaryOperation(left=self._joined(node.left), operator=cst.Add(),
                                       right=self._joined(node.right))
        known = self.format_calls.get(id(node))
        return known[1] if known is not None and known[0] is node else node

    def _in_braces(self, original: cst.FormattedStringExpression) -> cst.BaseExpression:
        """The rewritten expression, written so that it parses between this f-string's braces
        on Python 3.11 (see porter.emit.fstrings)."""
        replacement = self.replacements[id(original.expression)]
        fstring = self.fstrings[-1]
        text = self.evaluator.source(replacement)
        fitted = fit_in_fstring(text, forbidden_in(fstring))
        if fitted is None:
            self.unfit.add(id(fstring))
            return replacement
        return replacement if fitted == text else cst.parse_expression(fitted)


_COMPREHENSIONS = (cst.ListComp, cst.SetComp, cst.DictComp, cst.GeneratorExp)


def _names_in(node: cst.CSTNode) -> list[cst.Name]:
    found: list[cst.Name] = []

    class Names(cst.CSTVisitor):
        def visit_Name(self, n: cst.Name) -> None:
            found.append(n)

    node.visit(Names())
    return found


def precedence(node: cst.CSTNode) -> int:
    if getattr(node, "lpar", None):
        return ATOM
    if isinstance(node, cst.BinaryOperation):
        return emit.BINARY_PRECEDENCE[BINARY_OPS[type(node.operator)]]
    if isinstance(node, cst.BooleanOperation):
        return emit.AND if isinstance(node.operator, cst.And) else emit.OR
    if isinstance(node, cst.Comparison):
        return emit.COMPARE
    if isinstance(node, cst.UnaryOperation):
        return emit.NOT if isinstance(node.operator, cst.Not) else emit.UNARY
    if isinstance(node, cst.IfExp):
        return emit.TERNARY
    if isinstance(node, cst.Lambda):
        return emit.LAMBDA
    return ATOM
