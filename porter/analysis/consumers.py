"""Which call arguments go to a plotting library (matplotlib, seaborn) or a modelling one
(scikit-learn, SciPy, statsmodels), however the script spells its imports, its figures and its
models.

A pandas frame or Series given to one of these is handed over to pandas on purpose. Polars has
no plotting that draws the same picture, and both plotting libraries read pandas objects
(seaborn's `data=`, the names of the Series it labels its axes with). The modelling libraries
take pandas objects as they are (scikit-learn keeps a frame's column names as the feature
names) and turn them into arrays. The site is a hand-over, not a TODO.
"""

from __future__ import annotations

import libcst as cst
from libcst.helpers import get_full_name_for_node

PLOTTING_MODULES = ("matplotlib", "seaborn")
MODELLING_MODULES = ("sklearn", "scipy", "statsmodels")
# scikit-learn methods and functions that turn what they are given into arrays of its values
# (a frame's column names kept as feature names), never reading its row labels
ARRAY_METHODS = frozenset({
    "fit", "predict", "predict_proba", "predict_log_proba", "transform", "fit_transform",
    "fit_predict", "inverse_transform", "score", "partial_fit", "decision_function",
    "score_samples",
})

# model methods whose result is a numpy array of one row per row given (a model's predictions,
# a transform's rows), whatever they were given: never a pandas object (pandas' own objects
# have no method of these names; `transform` is left out, a pandas method too)
MODEL_ARRAY_METHODS = frozenset({
    "predict", "predict_proba", "predict_log_proba", "fit_predict", "fit_transform",
    "decision_function", "score_samples", "inverse_transform",
})

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
    """Whether `module` is one whose calls take pandas values handed over (the name is the
    plotting libraries', where this began)."""
    return any(module == m or module.startswith(m + ".")
               for m in (*PLOTTING_MODULES, *MODELLING_MODULES))


def library(callee: str) -> str:
    """The library a resolved callee belongs to: "matplotlib", "seaborn", "sklearn", ..."""
    return callee.split(".")[0].split(" ")[0]


def plots(callee: str) -> bool:
    return library(callee) in PLOTTING_MODULES


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
        # `fig, ax = plt.subplots()`, `ax = fig.add_subplot(...)`: figures and axes;
        # `model = LinearRegression()`, `pipe = make_pipeline(...)`: models
        callee = self.resolve(node.value.func) if isinstance(node.value, cst.Call) else None
        if callee is not None:
            kind = "matplotlib figure" if library(callee) in PLOTTING_MODULES \
                else f"{library(callee)} object"
            for target in node.targets:
                for name in _names(target.target):
                    self.names[name] = kind

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
            elif isinstance(node, cst.Call):  # LinearRegression().fit
                node = node.func
            else:
                break
        if not isinstance(node, cst.Name) or node.value not in self.names:
            return None
        return ".".join([self.names[node.value], *reversed(parts)])


def _reads_labels(callee: str, call: cst.Call):  # type: ignore[no-untyped-def]
    """Whether the call may read the row labels of the pandas value given as `arg`."""
    function = callee.split(".")[-1]
    if library(callee) == "sklearn":
        # a model's fit / predict / transform and the metrics take the values (and a frame's
        # column names); a splitter (train_test_split) returns pandas objects with their labels
        values = function in ARRAY_METHODS or callee.startswith("sklearn.metrics")
        return lambda arg: not values
    if library(callee) == "scipy":
        return lambda arg: False  # SciPy's functions take arrays of the values
    if library(callee) == "statsmodels":
        return lambda arg: True  # formulas and results keep the frame's row labels
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
    """The arguments (by node id) of every call into a plotting or modelling library, with the
    callee and whether it may read the row labels of a Series or frame given there."""
    collector = _Collector()
    module.visit(collector)
    return collector.arguments
