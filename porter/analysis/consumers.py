"""Which call arguments go to a plotting library (matplotlib, seaborn), however the script
spells its imports and its figures.

A pandas frame or Series given to one of these is handed over to pandas on purpose: Polars has
no plotting that draws the same picture, and both libraries read pandas objects (seaborn's
`data=`, the names of the Series it labels its axes with). The site is a hand-over, not a TODO.
"""

from __future__ import annotations

import libcst as cst
from libcst.helpers import get_full_name_for_node

PLOTTING_MODULES = ("matplotlib", "seaborn")

# matplotlib functions (and Axes methods) that draw the values they are given and never read a
# Series' row labels
VALUES_ONLY = frozenset({
    "scatter", "hist", "bar", "barh", "pie", "boxplot", "violinplot", "fill_between",
    "fill_betweenx", "errorbar", "hexbin", "hist2d", "stem", "eventplot",
})
# line plots read a Series' row labels as x when given one sequence alone (plot(s)), not
# when given x and y (plot(x, y, "o-"))
LINES = frozenset({"plot", "step", "semilogx", "semilogy", "loglog"})


def _plotting(module: str) -> bool:
    return any(module == m or module.startswith(m + ".") for m in PLOTTING_MODULES)


class _Collector(cst.CSTVisitor):
    def __init__(self) -> None:
        self.names: dict[str, str] = {}  # local name -> what it stands for ("matplotlib.pyplot")
        self.arguments: dict[int, tuple[str, bool]] = {}

    def visit_Import(self, node: cst.Import) -> None:
        for alias in node.names:
            module = get_full_name_for_node(alias.name) or ""
            if not _plotting(module):
                continue
            if alias.asname is not None and isinstance(alias.asname.name, cst.Name):
                self.names[alias.asname.name.value] = module
            else:  # `import matplotlib.pyplot`: the name bound is `matplotlib`
                root = module.split(".")[0]
                self.names[root] = root

    def visit_ImportFrom(self, node: cst.ImportFrom) -> None:
        if node.module is None or node.relative or isinstance(node.names, cst.ImportStar):
            return
        module = get_full_name_for_node(node.module) or ""
        if not _plotting(module):
            return
        for alias in node.names:
            name = get_full_name_for_node(alias.name) or ""
            local = alias.asname.name.value if alias.asname is not None \
                and isinstance(alias.asname.name, cst.Name) else name
            self.names[local] = f"{module}.{name}"

    def visit_Assign(self, node: cst.Assign) -> None:
        # `fig, ax = plt.subplots()`, `ax = fig.add_subplot(...)`: figures and axes
        if isinstance(node.value, cst.Call) and self.resolve(node.value.func) is not None:
            for target in node.targets:
                for name in _names(target.target):
                    self.names[name] = "matplotlib figure"

    def visit_Call(self, node: cst.Call) -> None:
        callee = self.resolve(node.func)
        if callee is None:
            return
        reads_labels = _reads_labels(callee, node)
        for arg in node.args:
            self.arguments[id(arg.value)] = (callee, reads_labels(arg))

    def resolve(self, func: cst.BaseExpression) -> str | None:
        """`plt.plot` -> "matplotlib.pyplot.plot"; `ax.bar` -> "matplotlib figure.bar"."""
        parts: list[str] = []
        node = func
        while True:
            if isinstance(node, cst.Attribute):
                parts.append(node.attr.value)
                node = node.value
            elif isinstance(node, cst.Subscript):  # axes[0].plot
                node = node.value
            else:
                break
        if not isinstance(node, cst.Name) or node.value not in self.names:
            return None
        return ".".join([self.names[node.value], *reversed(parts)])


def _reads_labels(callee: str, call: cst.Call):  # type: ignore[no-untyped-def]
    """Whether the call may read the row labels of the pandas value given as `arg`."""
    function = callee.split(".")[-1]
    if callee.startswith("seaborn"):
        # data=frame with the columns named: seaborn reads the named columns' values (without
        # x= and y= it draws a wide frame against its row labels; vectors are aligned on them)
        keywords = {a.keyword.value for a in call.args if a.keyword is not None}
        named = all(isinstance(a.value, (cst.SimpleString, cst.ConcatenatedString))
                    for a in call.args if a.keyword is not None and a.keyword.value in ("x", "y"))
        return lambda arg: not (arg.keyword is not None and arg.keyword.value == "data"
                                and "x" in keywords and named)
    if function in VALUES_ONLY:
        return lambda arg: False
    if function in LINES:
        data = [a for a in call.args if a.keyword is None and a.star == ""
                and not isinstance(a.value, (cst.SimpleString, cst.FormattedString))]
        return lambda arg: len(data) < 2
    return lambda arg: True


def _names(target: cst.BaseExpression) -> list[str]:
    if isinstance(target, cst.Name):
        return [target.value]
    if isinstance(target, (cst.Tuple, cst.List)):
        return [n for element in target.elements for n in _names(element.value)]
    return []


def plotting_arguments(module: cst.Module) -> dict[int, tuple[str, bool]]:
    """The arguments (by node id) of every call into a plotting library, with the callee and
    whether it may read the row labels of a Series or frame given there."""
    collector = _Collector()
    module.visit(collector)
    return collector.arguments
