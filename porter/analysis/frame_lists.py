"""Lists a script fills with frames, one `append` at a time, for one `pd.concat`:

    pieces = []
    for month in months:
        pieces.append(df[df["month"] == month])
    both = pd.concat(pieces, ignore_index=True)

Such a list can hold LazyFrames as well as pandas frames, and `pl.concat(pieces)` stacks them
as pd.concat does, so the frames never go to pandas. A name qualifies when everything the
script does with it is one of: bind it to `[]`, `name.append(one value)`, and pass it as the
first argument of a call named `concat` with ignore_index=True (without it pandas keeps each
piece's row labels, which Polars has no place for). Any other use (a subscript, a loop over
it, len(), +=, passing it elsewhere) leaves the list to pandas as before.
"""

from __future__ import annotations

import libcst as cst


class _Uses(cst.CSTVisitor):
    def __init__(self) -> None:
        self.candidates: set[str] = set()
        self.refused: set[str] = set()
        self.allowed: set[int] = set()  # Name nodes in an allowed position

    def visit_Assign(self, node: cst.Assign) -> None:
        if len(node.targets) == 1 and isinstance(node.targets[0].target, cst.Name):
            name = node.targets[0].target.value
            if isinstance(node.value, cst.List) and not node.value.elements:
                self.candidates.add(name)
                self.allowed.add(id(node.targets[0].target))
            else:
                self.refused.add(name)  # bound to something else too

    def visit_Call(self, node: cst.Call) -> None:
        func = node.func
        if isinstance(func, cst.Attribute) and func.attr.value == "append" \
                and isinstance(func.value, cst.Name) and len(node.args) == 1 \
                and node.args[0].keyword is None and node.args[0].star == "":
            self.allowed.add(id(func.value))
        name = func.attr.value if isinstance(func, cst.Attribute) else \
            func.value if isinstance(func, cst.Name) else None
        # with ignore_index=True: the pieces' row labels (the original row numbers of each
        # filtered piece) are dropped in pandas too, so no later step can read them
        fresh = any(a.keyword is not None and a.keyword.value == "ignore_index"
                    and isinstance(a.value, cst.Name) and a.value.value == "True"
                    for a in node.args)
        if name == "concat" and fresh and node.args and node.args[0].keyword is None \
                and node.args[0].star == "" and isinstance(node.args[0].value, cst.Name):
            self.allowed.add(id(node.args[0].value))


class _Others(cst.CSTVisitor):
    """Every other appearance of a candidate's name refuses it."""

    def __init__(self, uses: _Uses) -> None:
        self.uses = uses

    def visit_Name(self, node: cst.Name) -> None:
        if node.value in self.uses.candidates and id(node) not in self.uses.allowed:
            self.uses.refused.add(node.value)

    def visit_Attribute(self, node: cst.Attribute) -> bool:
        node.value.visit(self)  # the attribute's own name is not a use of a variable
        return False

    def visit_Arg(self, node: cst.Arg) -> bool:
        node.value.visit(self)  # nor is a keyword's name
        return False


def frame_lists(module: cst.Module) -> frozenset[str]:
    """The names of lists filled by append and stacked by one concat (see above)."""
    uses = _Uses()
    module.visit(uses)
    module.visit(_Others(uses))
    return frozenset(uses.candidates - uses.refused)
