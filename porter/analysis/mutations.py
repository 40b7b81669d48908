"""Names whose value the script changes in place (`data["b"] = ...`, `cols.append("x")`).

A name bound to a list, dict or set literal is a constant only while nothing changes it; rules
read constants (column lists, literal frames), so a name changed anywhere in the script is never
treated as one. `changes_in_place` finds the pandas objects a script changes in place (through a
subscript or an attribute, a changing method, inplace=True): the translator hands those to
pandas where Polars' rebinding would lose the change."""

from __future__ import annotations

import libcst as cst

MUTATORS = {"append", "extend", "insert", "remove", "pop", "clear", "update", "setdefault",
            "add", "discard", "sort", "reverse", "popitem", "difference_update",
            "intersection_update", "symmetric_difference_update", "__setitem__", "__delitem__"}


def mutated_names(module: cst.Module) -> frozenset[str]:
    finder = _Finder()
    module.visit(finder)
    return frozenset(finder.names)


class _Finder(cst.CSTVisitor):
    def __init__(self) -> None:
        super().__init__()
        self.names: set[str] = set()

    def _base(self, node: cst.BaseExpression) -> None:
        while isinstance(node, (cst.Subscript, cst.Attribute)):
            node = node.value
        if isinstance(node, cst.Name):
            self.names.add(node.value)

    def visit_AssignTarget(self, node: cst.AssignTarget) -> None:
        if isinstance(node.target, cst.Subscript):
            self._base(node.target)

    def visit_AugAssign(self, node: cst.AugAssign) -> None:
        self._base(node.target)  # `cols += ["x"]` changes the list in place

    def visit_Del(self, node: cst.Del) -> None:
        if isinstance(node.target, cst.Subscript):
            self._base(node.target)

    def visit_Call(self, node: cst.Call) -> None:
        func = node.func
        if isinstance(func, cst.Attribute) and func.attr.value in MUTATORS:
            self._base(func.value)


# pandas methods that change the object they are called on (besides any call with inplace=True)
IN_PLACE_METHODS = frozenset({"insert", "pop", "update", "isetitem", "popitem"})


def changed_in_place(node: cst.CSTNode) -> frozenset[str]:
    """Names whose object the code changes in place: assigned or deleted through a subscript or
    an attribute (`df["c"] = …`, `df.loc[m, "c"] = …`, `df.columns = …`), or given to a method
    that changes it (`df.insert(…)`, anything with `inplace=True`)."""
    return frozenset(changes_in_place(node))


def changes_in_place(node: cst.CSTNode) -> dict[str, list[cst.CSTNode]]:
    """Each name changed in place (see changed_in_place), with the nodes that change it."""
    found: dict[str, list[cst.CSTNode]] = {}

    def root(expr: cst.BaseExpression) -> None:
        at = expr
        while isinstance(expr, (cst.Subscript, cst.Attribute)):
            expr = expr.value
        if isinstance(expr, cst.Name):
            found.setdefault(expr.value, []).append(at)

    class Finder(cst.CSTVisitor):
        def visit_AssignTarget(self, n: cst.AssignTarget) -> None:
            if isinstance(n.target, (cst.Subscript, cst.Attribute)):
                root(n.target)

        def visit_AugAssign(self, n: cst.AugAssign) -> None:
            if isinstance(n.target, (cst.Subscript, cst.Attribute)):
                root(n.target)

        def visit_Del(self, n: cst.Del) -> None:
            root(n.target)

        def visit_Call(self, n: cst.Call) -> None:
            func = n.func
            if not isinstance(func, cst.Attribute):
                return
            inplace = any(a.keyword is not None and a.keyword.value == "inplace"
                          and not (isinstance(a.value, cst.Name) and a.value.value == "False")
                          for a in n.args)
            if inplace or func.attr.value in IN_PLACE_METHODS | {"__setitem__", "__delitem__"}:
                root(func.value)

    node.visit(Finder())
    return found
