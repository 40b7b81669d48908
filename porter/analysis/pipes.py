"""`obj.pipe(func, *args, **kwargs)` with a function the script defines is `func(obj, *args,
**kwargs)`, which is what pandas' pipe calls: written as that call before translation, so the
function is ported as the script's other functions are (its frame parameter, what it returns)
and the frame it returns stays a Polars plan:

    picks = pd.read_csv("picks.csv").pipe(clean)   ->   picks = clean(pd.read_csv("picks.csv"))

Only where the function is a `def` at the top of the module that nothing else rebinds, and the
call sits on one line (`.pipe` not on a line of its own), so the statement keeps its lines and
each site its line number.
"""

from __future__ import annotations

import libcst as cst


def pipes_as_calls(module: cst.Module) -> cst.Module:
    if ".pipe(" not in module.code or _imports_polars(module):
        # (a script that imports Polars, porter's own output among them, pipes LazyFrames)
        return module
    functions = _defined_once(module)
    if not functions:
        return module
    return module.visit(_Rewrite(functions))


def _imports_polars(module: cst.Module) -> bool:
    for stmt in module.body:
        if not isinstance(stmt, cst.SimpleStatementLine):
            continue
        for small in stmt.body:
            if isinstance(small, cst.Import) and any(
                    cst.Module([]).code_for_node(a.name).split(".")[0] == "polars" for a in small.names):
                return True
            if isinstance(small, cst.ImportFrom) and small.module is not None \
                    and cst.Module([]).code_for_node(small.module).split(".")[0] == "polars":
                return True
    return False


def _defined_once(module: cst.Module) -> set[str]:
    """The names of the module's top-level functions that no other statement binds."""
    defined: dict[str, int] = {}
    for stmt in module.body:
        if isinstance(stmt, (cst.FunctionDef, cst.ClassDef)):
            defined[stmt.name.value] = defined.get(stmt.name.value, 0) + 1

    class Bound(cst.CSTVisitor):
        def __init__(self) -> None:
            self.names: set[str] = set()

        def visit_AssignTarget(self, node: cst.AssignTarget) -> None:
            self.names |= {n.value for n in _names(node.target)}

        def visit_AugAssign(self, node: cst.AugAssign) -> None:
            self.names |= {n.value for n in _names(node.target)}

        def visit_For(self, node: cst.For) -> None:
            self.names |= {n.value for n in _names(node.target)}

        def visit_ImportAlias(self, node: cst.ImportAlias) -> None:
            name = node.asname.name if node.asname is not None else node.name
            if isinstance(name, cst.Name):
                self.names.add(name.value)

        def visit_Global(self, node: cst.Global) -> None:
            self.names |= {n.name.value for n in node.names}

    bound = Bound()
    module.visit(bound)
    return {name for name, count in defined.items() if count == 1 and name not in bound.names}


def _names(node: cst.CSTNode) -> list[cst.Name]:
    if isinstance(node, cst.Name):
        return [node]
    if isinstance(node, (cst.Tuple, cst.List)):
        return [n for e in node.elements for n in _names(e.value)]
    if isinstance(node, cst.StarredElement):
        return _names(node.value)
    return []


class _Rewrite(cst.CSTTransformer):
    def __init__(self, functions: set[str]) -> None:
        super().__init__()
        self.functions = functions

    def leave_Call(self, original: cst.Call, updated: cst.Call) -> cst.BaseExpression:
        func = updated.func
        if not (isinstance(func, cst.Attribute) and func.attr.value == "pipe" and updated.args):
            return updated
        first = updated.args[0]
        if first.keyword is not None or first.star or not isinstance(first.value, cst.Name) \
                or first.value.value not in self.functions:
            return updated
        if any(_has_newline(w) for w in (func.dot.whitespace_before, func.dot.whitespace_after,
                                          updated.whitespace_before_args)):
            return updated
        receiver = cst.Arg(func.value.with_changes(lpar=[], rpar=[])
                           if _bare(func.value) else func.value)
        rest = list(updated.args[1:])
        args = [receiver.with_changes(comma=cst.Comma(whitespace_after=cst.SimpleWhitespace(" ")))
                if rest else receiver, *rest]
        return cst.Call(func=first.value.with_changes(lpar=[], rpar=[]), args=args,
                        lpar=updated.lpar, rpar=updated.rpar)


def _bare(node: cst.BaseExpression) -> bool:
    """Brackets around the receiver that a call's argument does not need (one line)."""
    return bool(getattr(node, "lpar", None)) and "\n" not in cst.Module([]).code_for_node(node)


def _has_newline(whitespace: cst.BaseParenthesizableWhitespace) -> bool:
    return isinstance(whitespace, cst.ParenthesizedWhitespace)
