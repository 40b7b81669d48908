"""Names whose value the script changes in place (`data["b"] = ...`, `cols.append("x")`).

A name bound to a list, dict or set literal is a constant only while nothing changes it; rules
read constants (column lists, literal frames), so a name changed anywhere in the script is never
treated as one."""

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
