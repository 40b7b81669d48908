"""Evaluate expressions symbolically: every pandas expression becomes a `Value`.

The evaluator recognises what each name and call *is* (a frame, a column of a frame, a pending
groupby, the pandas module…), asks the rule registered for the pandas API to decide the Polars
code, and records a site for every decision. Expressions it does not model are kept as written,
with any pandas value inside them handed over explicitly.
"""

from __future__ import annotations

from collections.abc import Callable, Mapping
from dataclasses import dataclass, field, replace
import ast
import math
from typing import Any

import libcst as cst

from porter.analysis import pandas_names
from porter.analysis.consumers import MODEL_ARRAY_METHODS, library, plots
from porter.emit import code as emit
from porter.emit.code import Code
from porter.mapping import MappingTable
from porter.model import MappingEntry, SiteDraft
from porter.translate import handover
from porter.translate.rewrite import BINARY_OPS, ChildRewriter, precedence
from porter.translate.context import (
    MIXED_COLUMN, PandasCall, RuleContext, Unsupported, derived_column, labelled_frame,
    lost_float_ints,
)
from porter.translate.values import (
    MISSING, Accessor, BoundMethod, Column, Frame, FrameList, Grouped, Indexed, Indexer, Items,
    Module, Opaque,
    PandasValue, Parts, Resampled, Scalar, TimeGrouperSpec, Value, fresh_token, is_pandas,
)

COMPARE_OPS = {
    cst.Equal: "==", cst.NotEqual: "!=", cst.LessThan: "<", cst.LessThanEqual: "<=",
    cst.GreaterThan: ">", cst.GreaterThanEqual: ">=", cst.In: "in", cst.NotIn: "not in",
    cst.Is: "is", cst.IsNot: "is not",
}
DISPLAY_FUNCTIONS = {"print", "display", "str", "repr"}


@dataclass(frozen=True)
class LocalFunction:
    """A function defined in the script: which parameters take frames, what it returns."""

    name: str
    params: tuple[str, ...]
    frame_params: frozenset[str]
    returns: Value | None  # a template of the return value (Frame), when known
    # what every call passes for a frame parameter, when the calls agree: (columns, dtypes)
    param_schemas: tuple[tuple[str, tuple[tuple[str, ...] | None, tuple[tuple[str, str], ...]]], ...] = ()
    # the index every call's frame has for a frame parameter, when they agree and it is one
    # (set_index, a groupby's keys, index_col=): (param, (index columns, index unnamed)); the
    # body sees a frame labelled by them, so what it returns keeps them as its labels
    param_indexes: tuple[tuple[str, tuple[tuple[str, ...], bool]], ...] = ()
    # literal values every call passes (a file name), so rules can look inputs up
    param_consts: tuple[tuple[str, Any], ...] = ()
    # texts the calls pass for a parameter when they differ (two input files of one layout)
    param_choices: tuple[tuple[str, tuple[str, ...]], ...] = ()
    # parameters the body changes in place (`frame["c"] = ...`): the caller's object changes,
    # so the argument is handed to pandas in its own name and the body stays pandas for it
    mutated_params: frozenset[str] = frozenset()
    # parameters every call passes a column of one frame, in a body that only computes one
    # column from them: the function takes Polars expressions there and returns one
    # (`def tidy(s): return s.str.strip_chars()`, called as `tidy(pl.col("name"))`)
    column_params: frozenset[str] = frozenset()
    column_dtypes: tuple[tuple[str, str], ...] = ()  # what the calls pass, when they agree
    column_rows: int | None = None  # the rows the body's expressions stand for
    not_expression: bool = False  # tried, and the body is more than one column's expression
    # the frame parameter whose column the function returns unchanged in rows (`return
    # df["kg"] * 2`): it returns that expression, evaluated in the caller's frame
    returns_column_of: str | None = None
    # every frame it returns holds the rows of a file read (Polars counts them from the file)
    returns_file_rows: bool = False
    # what it returns for each set of texts its calls pass (param_choices), when its body is
    # ported once for them all (engine.texts_followed): ((param, text), ...) -> a template
    returns_by_choice: tuple[tuple[tuple[tuple[str, str], ...], Value], ...] = ()
    # (frame parameter, text parameter, dtype): every call's frame holds the column that call's
    # text names, of this one type (`kg_table(bookings, "baker")`, `kg_table(d, "member")`)
    text_column_dtypes: tuple[tuple[str, str, str], ...] = ()


@dataclass
class Services:
    """What evaluation needs besides the names in scope."""

    table: MappingTable
    registry: Mapping[str, Callable[[PandasCall, RuleContext], Value]]
    code_for: Callable[[cst.CSTNode], str]
    position: Callable[[cst.CSTNode], tuple[int, int]]
    min_confidence: float = 0.0
    functions: dict[str, LocalFunction] = field(default_factory=dict)
    call_sites: dict[str, list[tuple[Value, ...]]] = field(default_factory=dict)
    inside_from_pandas: Callable[[cst.CSTNode], bool] = lambda node: False
    shown: Callable[[cst.CSTNode], bool] = lambda node: False  # only printed or displayed
    printed: Callable[[cst.CSTNode], bool] = lambda node: False  # an argument of print()
    # the module's own plain functions, defined once, by name (their bodies can become expressions)
    function_defs: dict[str, cst.FunctionDef] = field(default_factory=dict)
    schema_lookup: Callable[[str, str, dict[str, Any]], dict[str, str] | None] | None = None
    datetimes_possible: bool = True
    # the script may make pandas' nullable integer columns (astype("Int64")), which porter
    # does not tell from plain ones
    nullable_ints_possible: bool = True
    durations_possible: bool = True  # the script may make durations of unknown type
    lists_possible: bool = True  # the script may make columns of lists (str.split)
    infinities_possible: bool = True  # the script divides or writes an infinity
    # statements that compute each named frame's data, by the assignment that named it
    consumers: dict[int, set[tuple[int, int]]] = field(default_factory=dict)
    # statements that only count the rows of a named frame (`len(kept)`), by its assignment:
    # an execution only where running its plan again costs more than a scan (plans_to_collect)
    row_counts: dict[int, set[tuple[int, int]]] = field(default_factory=dict)
    # the code each assignment of a frame writes (the plan it binds), by the assignment
    plan_texts: dict[int, str] = field(default_factory=dict)
    # the script may make category columns (astype("category"), cut, a parquet file): a frame
    # pandas made comes back to Polars only when porter knows which columns are categories
    categories_possible: bool = True
    # names whose object the script changes in place (`df["c"] = ...`, inplace=True), with the
    # lines where it does
    changed_in_place: dict[str, list[int]] = field(default_factory=dict)
    # whether a name's changes in place all come before the statement at hand, each to a frame
    # bound afresh in the loop around it (engine._Walker.changed_only_afresh)
    changed_only_afresh: Callable[[str], bool] | None = None
    changed_at: dict[str, list[tuple[int, int]]] = field(default_factory=dict)  # (line, column)
    # how many times each name is written in the module (a loop's row read after the loop)
    name_uses: dict[str, int] = field(default_factory=dict)
    name_lines: dict[str, list[int]] = field(default_factory=dict)  # where each name is written
    # the rows of frames read from files: counting them again needs no more than the scan
    file_rows: set[int] = field(default_factory=set)
    # the bindings whose frames each binding's plan reads (`b = a.filter(...)`: a -> b)
    frame_parents: dict[int, set[int]] = field(default_factory=dict)
    # the bindings collected where they are made: plans that would otherwise run more than once
    collect_at: frozenset[int] = frozenset()
    # the bindings whose own statement collects the plan it binds (a rule's .collect(): a
    # column typed at run time): the frames they are made from run once there
    materialized: set[int] = field(default_factory=set)
    # Series kept in a name whose frame's name later holds other rows: kept as a frame of its own
    stale_series: set[int] = field(default_factory=set)
    # the iterrows() calls (by node id) of `for label, row in df.iterrows():` loops that read
    # no row label: the label is never read, the row only by column (engine.label_free_loops)
    label_free_loops: frozenset[int] = frozenset()
    # frames bound to a name whose row labels pandas code reads later (`pos.index`) after a
    # filter or sort made them other than 0..n-1: the next pass has pandas make them
    labels_needed: set[int] = field(default_factory=set)
    # the script's function whose body is being walked, and the functions whose bodies read
    # the row labels of a frame they were given (`def save(d): d.to_csv(name)`, `d.index`): a
    # frame passed to them is a label read at the call (kept over all passes: it only grows)
    function_at_hand: str | None = None
    label_functions: set[str] = field(default_factory=set)
    # functions whose result's row labels are read where they are called (`a = heavy(h)`,
    # `a.index`): pandas runs them, so their bodies stay pandas code (functions.learn_functions)
    pandas_functions: set[str] = field(default_factory=set)
    # functions a statement kept on pandas as written calls (`df["c"] = helper(df)` aligned by
    # pandas): their parameters take pandas values at every call, so their bodies are not
    # ported for Polars frames or expressions (kept over all passes: it only grows)
    pandas_called: set[str] = field(default_factory=set)
    # functions whose body is not ported once for the texts its calls pass (engine.texts_followed)
    texts_refused: set[str] = field(default_factory=set)
    # the module's frames each of the script's functions leaves to pandas code (functions.py)
    pandas_globals: dict[str, set[str]] = field(default_factory=dict)
    frames_kept: dict[str, set[str]] = field(default_factory=dict)  # those its body ports
    statement_lines: tuple[int, int] = (0, 0)  # lines of the statement being rewritten
    # whether a node is glued to the word before it (`if(`, `not(`): its rewrite needs parentheses
    glued: Callable[[cst.CSTNode], bool] = lambda node: False
    start: Callable[[cst.CSTNode], tuple[int, int] | None] = lambda node: None  # line, column
    mutated: frozenset[str] = frozenset()  # names the script changes in place (never constants)
    # the script's own functions a converted groupby().apply read as expressions, with the
    # ids of those apply calls (functions.ported_where_applied)
    applied_functions: dict[str, set[int]] = field(default_factory=dict)
    applied_kinds: dict[str, set[str]] = field(default_factory=dict)  # "group", "value", "row"
    python_module: Any = None  # the script as Python's ast.Module, when it parses
    # arguments of calls into a plotting library (matplotlib, seaborn), by node id, with the
    # function called: a pandas value given there is handed over on purpose
    plotted: dict[int, tuple[str, bool]] = field(default_factory=dict)
    # frames given to seaborn as data= (by node id): the columns the call names, all it reads
    seaborn_columns: dict[int, tuple[str, ...]] = field(default_factory=dict)
    # lists the script fills with frames by append for pd.concat (analysis.frame_lists), those
    # found to take something else (kept over all passes: it only grows), and the frames
    # appended to each
    frame_lists: frozenset[str] = frozenset()
    frame_lists_refused: set[str] = field(default_factory=set)
    # values computed for an expression from the statements after it, by the node's id (the
    # node kept to check it): `acc = pd.DataFrame()` filled by the loop that follows it
    values_given: dict[int, tuple[cst.CSTNode, "Value"]] = field(default_factory=dict)
    frame_list_members: dict[str, list[Frame]] = field(default_factory=dict)


# how the libraries whose calls take pandas values are named in site messages
LIBRARY_NAMES = {"sklearn": "scikit-learn", "scipy": "SciPy"}

class Evaluator:
    def __init__(self, env: dict[str, Value], services: Services) -> None:
        self.env = env
        self.services = services
        # The names in scope do not change while one statement is evaluated, so each node is
        # evaluated once (rewriting a node looks at its children again).
        self._memo: dict[int, tuple[cst.CSTNode, Value]] = {}

    # -- entry points ---------------------------------------------------------------------------
    def eval(self, node: cst.BaseExpression) -> Value:
        known = self._memo.get(id(node))
        if known is not None and known[0] is node:
            return known[1]
        given = self.services.values_given.get(id(node))
        if given is not None and given[0] is node:
            # what the statements around this one compute (Engine.group_appends)
            return given[1]
        method = getattr(self, f"_eval_{type(node).__name__}", None)
        value = method(node) if method is not None else self.generic(node)
        self._memo[id(node)] = (node, value)
        return value

    def source(self, node: cst.CSTNode) -> str:
        return self.services.code_for(node)

    def opaque(self, node: cst.BaseExpression, const: Any = MISSING) -> Opaque:
        return Opaque(Code(self.standalone(node), precedence(node)), const=const, node=node)

    def standalone(self, node: cst.CSTNode) -> str:
        """Source text that stays valid wherever it is written: a generator that was the only
        argument of a call (`f(x for x in y)`) borrows the call's parentheses."""
        text = self.source(node)
        if isinstance(node, cst.GeneratorExp) and not node.lpar:
            return f"({text})"
        return text

    # -- names, literals ----------------------------------------------------------------------
    def _eval_Name(self, node: cst.Name) -> Value:
        members = self.services.frame_list_members.get(node.value)
        if members and node.value in self.services.frame_lists \
                and node.value not in self.services.frame_lists_refused:
            return FrameList(emit.atom(node.value), members=tuple(members))
        if node.value in self.env:
            value = self.env[node.value]
            if isinstance(value, Parts) and value.binding is not None:
                self.note_stale_parts(value)
            if isinstance(value, Grouped) and value.live:
                return self.live_grouping(value)
            return value
        if node.value in ("True", "False", "None"):
            return self.opaque(node, {"True": True, "False": False, "None": None}[node.value])
        if node.value in _TYPE_NAMES:
            return self.opaque(node, _TYPE_NAMES[node.value])
        return self.opaque(node)

    def append_frame(self, node: cst.Call) -> Value | None:
        """`pieces.append(frame)` onto a list stacked by pd.concat (analysis.frame_lists): the
        LazyFrame goes into the list as it is, where it would have gone to pandas."""
        func = node.func
        if not (isinstance(func, cst.Attribute) and isinstance(func.value, cst.Name)
                and func.value.value in self.services.frame_lists and func.attr.value == "append"
                and len(node.args) == 1):
            return None
        name = func.value.value
        if name in self.services.frame_lists_refused:
            return None
        given = node.args[0].value
        value = self.eval(given)
        if not isinstance(value, Frame) or value.index \
                or isinstance(given, cst.Name) and given.value in self.services.changed_in_place \
                and not (self.services.changed_only_afresh is not None
                         and self.services.changed_only_afresh(given.value)):
            # something else than a frame porter tracks, or a frame the script changes in
            # place later (pandas' list holds that same object, which sees the change)
            self.services.frame_lists_refused.add(name)
            return None
        members = self.services.frame_list_members.setdefault(name, [])
        if all(m.code.text != value.code.text for m in members):  # each pass appends again
            members.append(value)
        return Opaque(emit.atom(name).method("append", value.code), sites=value.sites)

    def live_grouping(self, grouped: Grouped) -> Value:
        """A groupby kept in a name whose frame was changed in place since: the frame as the
        name holds it now (pandas' GroupBy holds the same object)."""
        frame_name = grouped.frame.code.text
        current = self.env.get(frame_name)
        if isinstance(current, Frame) and current.rows == grouped.frame.rows:
            return replace(grouped, frame=current, code=current.code, live=False)
        if isinstance(current, PandasValue):
            options = {k: v for k, v in (("sort", grouped.sort), ("dropna", grouped.dropna),
                                         ("as_index", grouped.as_index)) if v is not True}
            keys = list(grouped.keys) if grouped.key_list else emit.names_arg(grouped.keys)
            return PandasValue(emit.atom(frame_name).method("groupby", keys, **options))
        return self.todo("groupby", PandasCall(grouped, "groupby"), cst.Name(frame_name),
                         "the frame grouped was given other rows since")

    def note_stale_parts(self, parts: Parts) -> None:
        """str.extract's frame kept in a name, read where its frame's name holds other rows or
        its text column was overwritten: the next pass has pandas compute it where it is bound."""
        if not parts_current(parts, self.env):
            self.services.stale_series.add(parts.binding)  # type: ignore[arg-type]

    def _eval_SimpleString(self, node: cst.SimpleString) -> Value:
        return self.opaque(node, node.evaluated_value)

    def _eval_ConcatenatedString(self, node: cst.ConcatenatedString) -> Value:
        value = node.evaluated_value
        return self.opaque(node, value) if value is not None else self.generic(node)

    def _eval_Integer(self, node: cst.Integer) -> Value:
        return self.opaque(node, node.evaluated_value)

    def _eval_Float(self, node: cst.Float) -> Value:
        return self.opaque(node, node.evaluated_value)

    def _eval_List(self, node: cst.List | cst.Tuple) -> Value:
        values = [self.eval(e.value) for e in node.elements if isinstance(e, cst.Element)]
        if len(values) == len(node.elements) and all(
            isinstance(v, Opaque) and v.is_const for v in values
        ):
            items = [v.const for v in values]  # type: ignore[union-attr]
            return self.opaque(node, items if isinstance(node, cst.List) else tuple(items))
        if len(values) == len(node.elements) and any(is_pandas(v) for v in values):
            elements = [e.value for e in node.elements if isinstance(e, cst.Element)]
            return Items(Code(self.source(node)), items=tuple(values),
                         brackets="[]" if isinstance(node, cst.List) else "()",
                         sites=tuple(s for v in values for s in v.sites),
                         labelled=tuple(self.pandas_throughout(v, e) for v, e in zip(values, elements)))
        return self.generic(node)

    _eval_Tuple = _eval_List

    def _eval_Dict(self, node: cst.Dict) -> Value:
        items: dict[Any, Any] = {}
        for element in node.elements:
            if not isinstance(element, cst.DictElement):
                return self.generic(node)
            key, value = self.eval(element.key), self.eval(element.value)
            if not (isinstance(key, Opaque) and key.is_const and isinstance(value, Opaque)
                    and value.is_const):
                return self.generic(node)
            items[key.const] = value.const
        return self.opaque(node, items)

    def _eval_Lambda(self, node: cst.Lambda) -> Value:
        return self.opaque(node)

    def _eval_FormattedString(self, node: cst.FormattedString) -> Value:
        """An f-string of one value of a column (a lambda's parameter, a row's field) ->
        pl.concat_str (emit.formatted): each value is written as str() writes it (element.str)."""
        texts: list[str] = [""]
        values: list[Value] = []
        formatted: set[int] = set()  # the values already written as text by their format spec
        for part in node.parts:
            if isinstance(part, cst.FormattedStringText):
                texts[-1] += part.value
                continue
            assert isinstance(part, cst.FormattedStringExpression)
            value = self.eval(part.expression)
            spec = _plain_format_spec(part)
            if spec is not None and isinstance(value, Column) and value.element:
                # f"{x:.0f}", f"{n:03d}": Python's formatting of each value, where an
                # expression writes the same text (element.format)
                value = self.dispatch("element.format", PandasCall(
                    value, "format", (Opaque(emit.lit(spec), const=spec),), {}, node), node)
                if not isinstance(value, Column) or any(x.status == "todo" for x in value.sites):
                    return value
                values.append(value)
                texts.append("")
                formatted.add(len(values) - 1)
                continue
            if part.format_spec is not None or part.conversion not in (None, "s") or part.equal:
                if isinstance(value, Column) and value.element:
                    # Python formats each value of the column (f"{x:03d}", f"{s!r}"): kept as
                    # written it would format the whole Series once
                    return self.todo("element.format", PandasCall(value, "format", (), {}, node),
                                     node, "an f-string that formats a value with a format spec, "
                                     "!r or = (Python's formatting of each value has no "
                                     "expression form)")
                return self.generic(node)
            if isinstance(value, Opaque) and isinstance(value.const, (str, int)) \
                    and not isinstance(value.const, bool):
                constant = str(value.const)
                if "{" in constant or "}" in constant or "\\" in constant:
                    return self.generic(node)
                texts[-1] += constant
                continue
            values.append(value)
            texts.append("")
        columns = [v for v in values if isinstance(v, Column) and v.element]
        # a literal brace would read as a placeholder of the template (emit.formatted)
        if not values or len(columns) != len(values) or any("{" in t or "}" in t for t in texts):
            return self.generic(node)
        prefix = node.start.replace("f", "").replace("F", "")  # r"…" stays raw
        try:
            template = ast.literal_eval(prefix + "{}".join(texts) + node.end)
        except (SyntaxError, ValueError):
            return self.generic(node)
        parts = []
        for index, column in enumerate(columns):
            if index in formatted:
                parts.append(column)
                continue
            written = self.dispatch("element.str", PandasCall(column, "str", (), {}, node), node)
            if not isinstance(written, Column) or any(x.status == "todo" for x in written.sites):
                return self.generic(node)
            parts.append(written)
        code = emit.formatted(template, *(p.code for p in parts))
        return derived_column(columns[0], code, dtype="str", others=columns[1:], name=None) \
            .with_sites(*(x for p in parts for x in p.sites))

    def dask_script(self) -> bool:
        """Whether the script imports dask.dataframe."""
        return any(isinstance(v, Module) and v.qualname == "dask" for v in self.env.values())

    def dask_compute_key(self, receiver: Value, name: str) -> str | None:
        """`x.compute()` / `x.persist()` in a script that imports dask.dataframe: Dask's."""
        if not self.dask_script():
            return None
        if isinstance(receiver, Frame):
            return f"dd.frame.{name}"
        if isinstance(receiver, Column) and not receiver.element:
            return f"dd.series.{name}"
        if isinstance(receiver, Scalar):
            return f"dd.scalar.{name}"
        return None

    def numpy_name(self) -> str:
        """The name the script imports numpy as ("np" when it does not)."""
        for name, value in self.env.items():
            if isinstance(value, Module) and value.qualname == "numpy":
                return name
        return NUMPY_NAME

    # -- attributes -----------------------------------------------------------------------------
    def _eval_Attribute(self, node: cst.Attribute) -> Value:
        name = node.attr.value
        if name in ("year", "week", "day") and _isocalendar_call(node.value):
            # s.dt.isocalendar().week: one column of the frame isocalendar() makes
            accessor = self.eval(node.value.func.value)  # type: ignore[attr-defined]
            if isinstance(accessor, Accessor) and accessor.kind == "dt":
                return self.dispatch(f"series.dt.isocalendar.{name}",
                                     PandasCall(accessor, name, node=node), node)
        receiver = self.eval(node.value)
        if isinstance(receiver, Parts) and receiver.whole is not None \
                and all(label != name for label, _ in receiver.fields):
            receiver = receiver.whole  # parts kept as columns, read as a whole (parts.head())
        if isinstance(receiver, Module):
            qualname = f"{receiver.qualname}.{name}"
            if qualname == "pandas.np":
                # pandas' re-export of numpy (removed in pandas 2.0): pd.np.log is np.log,
                # written with the script's numpy name (imports.fix_imports adds numpy's
                # import when the script had none)
                return Module(emit.atom(self.numpy_name()), qualname="numpy", sites=receiver.sites)
            if qualname in ("numpy.nan", "numpy.NaN", "pandas.NA", "pandas.NaT"):
                return self.opaque(node, math.nan)
            if qualname == "numpy.inf":
                return self.opaque(node, math.inf)
            return Module(Code(self.source(node)), qualname=qualname, sites=receiver.sites)
        if isinstance(receiver, Indexed) and receiver.grouped and receiver.selection \
                and name not in _INDEXED_METHODS[True]:
            # df.set_index(k).groupby(keys)["c"].sum(): the groups of the frame's columns
            # (the labels are not among the columns taken)
            receiver = self.regrouped(receiver, node)
        if isinstance(receiver, Indexed) and not receiver.grouped \
                and name not in _INDEXED_METHODS[False]:
            # df.set_index(k).<anything but resample / groupby / reset_index>: the table
            # labelled by k, its key column held as the index
            receiver = labelled_frame(receiver.frame, receiver.key)
        if isinstance(receiver, PandasValue) and receiver.label_rows is not None \
                and name in _LABEL_ROW_METHODS:
            # df.loc[label].sum(): the row's reduction (rules/selection.py), computed from the
            # rows .loc picked, which are then not handed to pandas
            receiver = replace(receiver, sites=tuple(
                replace(s, status="converted") if s.key == "frame.loc" and s.status == "handover"
                else s for s in receiver.sites))
            return BoundMethod(receiver.code.attr(name), receiver=receiver, name=name)
        dask_key = _dask_key(receiver, name)
        if dask_key is None and name in ("compute", "persist"):
            # pandas has no compute(): in a Dask script it is Dask's (a reduction's value,
            # ddf.fare.sum(), or a frame whose Dask mark a step did not carry)
            dask_key = self.dask_compute_key(receiver, name)
        if dask_key is not None:
            if name in ("npartitions",):
                return self.dispatch(dask_key, PandasCall(receiver, name, node=node), node)
            return BoundMethod(receiver.code.attr(name), receiver=receiver, name=name)
        if isinstance(receiver, Frame):
            if name in ("loc", "iloc", "at") or name == "ix" and name not in (receiver.columns or ()):
                # (.ix: label-or-position indexing pandas 1.0 removed, rules/legacy.py)
                return Indexer(Code(self.source(node)), frame=receiver, kind=name,
                               sites=receiver.sites)
            if name in pandas_names.FRAME and name not in _FRAME_PROPERTIES \
                    or name in pandas_names.FRAME_REMOVED and name not in (receiver.columns or ()):
                # (a method pandas removed, called by an old script, unless it names a column)
                return BoundMethod(receiver.code.attr(name), receiver=receiver, name=name)
            if name == "index":
                self.note_labels_read(receiver)
            if name in _FRAME_PROPERTIES:
                return self.dispatch(f"frame.{name}", PandasCall(receiver, name, node=node), node)
            return self.dispatch("frame.getattr", PandasCall(receiver, name, node=node), node)
        if isinstance(receiver, Column) and receiver.element:
            return BoundMethod(receiver.code.attr(name), receiver=receiver, name=name)
        if isinstance(receiver, Column) and name in ("iloc", "loc", "ix"):
            return Indexer(Code(self.source(node)), frame=receiver.frame, kind=name,
                           column=receiver, sites=receiver.sites)
        if isinstance(receiver, Column):
            if name in ("str", "dt", "cat"):
                return Accessor(Code(self.source(node)), column=receiver, kind=name,
                                sites=receiver.sites)
            if name in pandas_names.SERIES and name not in _SERIES_PROPERTIES \
                    or name in pandas_names.SERIES_REMOVED:
                return BoundMethod(receiver.code.attr(name), receiver=receiver, name=name)
            if name == "index":
                self.note_labels_read(receiver.frame)
            return self.dispatch(f"series.{name}", PandasCall(receiver, name, node=node), node)
        if isinstance(receiver, Grouped) and name in _GROUPBY_PROPERTIES:
            # properties, not methods: read where they are (print(g.ngroups))
            return self.dispatch(f"groupby.{name}", PandasCall(receiver, name, node=node), node)
        if isinstance(receiver, Grouped):
            # pandas looks a column up by attribute only when no method has the name
            # (g.size() with a "size" column is the method)
            if name in pandas_names.GROUPBY and (
                    receiver.selection is not None and receiver.single
                    or name not in _SERIES_GROUPBY_ONLY
                    or name not in (receiver.frame.columns or ())) \
                    or name in pandas_names.GROUPBY_REMOVED \
                    and name not in (receiver.frame.columns or ()):
                # (pad / backfill: the names pandas 2 removed, called by an old script)
                return BoundMethod(receiver.code.attr(name), receiver=receiver, name=name)
            return self.dispatch("groupby.getitem", PandasCall(
                receiver, "getitem", (Opaque(emit.lit(name), const=name),), node=node), node)
        if isinstance(receiver, Indexed):  # df.set_index("ts"), waiting for resample
            if name in _INDEXED_METHODS[bool(receiver.grouped)]:
                return BoundMethod(receiver.code.attr(name), receiver=receiver, name=name)
        if isinstance(receiver, Resampled):  # df.resample(...) / groupby with a pd.Grouper
            if name in pandas_names.GROUPBY or name in _RESAMPLER_METHODS:
                return BoundMethod(receiver.code.attr(name), receiver=receiver, name=name)
            if name in (receiver.frame.columns or ()):  # r.kg: the column, as r["kg"]
                return self.dispatch("resample.getitem", PandasCall(
                    receiver, "getitem", (Opaque(emit.lit(name), const=name),), node=node), node)
        if isinstance(receiver, Accessor):
            names = pandas_names.STR if receiver.kind == "str" else \
                _WINDOW_METHODS if receiver.kind in handover.WINDOW_KINDS else pandas_names.DT
            if receiver.kind == "dt" and name == "name" and receiver.index_of is not None:
                # df.index.name of a table labelled by one date key: the series.name rule
                # reads the key column's name
                labels = replace(receiver.column, index_values=True,
                                 name=None if receiver.index_of.index_unnamed
                                 else receiver.index_of.index[0])
                return self.dispatch("series.name", PandasCall(labels, name, node=node), node)
            if receiver.kind == "cat" and name == "codes":  # a property
                return self.dispatch("series.cat.codes", PandasCall(receiver, name, node=node), node)
            if receiver.kind == "dt" and name in _DT_PROPERTIES:
                return self.dispatch(f"series.dt.{name}", PandasCall(receiver, name, node=node), node)
            if receiver.kind == "dt" and name in _PERIOD_METHODS:  # of s.dt.to_period(...)
                return BoundMethod(receiver.code.attr(name), receiver=receiver, name=name)
            if name in names:
                return BoundMethod(receiver.code.attr(name), receiver=receiver, name=name)
        if isinstance(receiver, (Column, Frame, Grouped, Accessor, Indexer, Resampled, Indexed)):
            return self.todo(f"{_prefix(receiver)}.{name}", PandasCall(receiver, name, node=node),
                             node, "porter has no rule for this attribute")
        if isinstance(receiver, Scalar) and (receiver.pytype in ("list[str]", "names.dates") or
                                             receiver.pytype == "list" and receiver.of is not None):
            return self.column_names_attribute(receiver, name, node)
        if isinstance(receiver, Scalar) and receiver.pytype == "datetime" and name in _TIMESTAMP_ONLY:
            # pandas' Timestamp attribute on the Python datetime porter collects
            return Opaque(Code(_TIMESTAMP_ONLY[name].format(x=receiver.code.wrapped(emit.ATOM))),
                          sites=receiver.sites)
        if isinstance(receiver, Scalar) and receiver.pytype == "names.str" and name in pandas_names.STR:
            if f"frame.columns.str.{name}" in self.services.registry:
                return BoundMethod(receiver.code.attr(name), receiver=receiver, name=name)
            # another Index.str method: pandas' own names, after the string methods porter
            # computed so far (rules/selection.py, columns_str)
            done = "".join(f".str.{method}({', '.join(emit.lit(a).text for a in args)})"
                           for method, args in getattr(receiver, "ops", ()))
            return self.column_names_attribute(replace(receiver, pytype="list[str]"),
                                               f"{done[1:]}.str.{name}" if done else f"str.{name}", node)
        if isinstance(receiver, Parts) and name not in pandas_names.FRAME \
                and any(label == name for label, _ in receiver.fields):
            # parts.name: a named group's column (anything else is pandas' DataFrame API)
            call = PandasCall(receiver, "getitem", (Opaque(emit.lit(name), const=name),), node=node)
            return self.dispatch("series.str.expand.getitem", call, node)
        if isinstance(receiver, Opaque) and receiver.is_const \
                and getattr(receiver.const, "key_prefix", None) and name in ("astype", "strftime"):
            # pd.period_range(...).astype(str) (rules/datetimes.py, period_range_text)
            return BoundMethod(receiver.code.attr(name), receiver=receiver, name=name)
        return self.generic(node)

    def note_labels_read(self, frame: Frame) -> None:
        """pandas code reads this frame's row labels: when a filter or sort made them other
        than 0..n-1 and the frame is bound to a name, pandas makes it (engine.bind), so the
        labels are pandas' own."""
        if frame.labels_intact or frame.index:
            return
        if frame.binding is not None:
            self.services.labels_needed.add(frame.binding)
        elif self.services.function_at_hand is not None:
            # a frame the function was given (or made from one): its labels are the caller's
            self.services.label_functions.add(self.services.function_at_hand)

    def rows_without_labels(self, call: PandasCall) -> bool:
        """df.apply(f, axis=1) whose function reads its row only by column (row["kg"],
        row.kg, row[name]): the result does not depend on the row labels (row.name), and
        pandas' result has the frame's rows in order, so it can be put back on them."""
        function = call.args[0] if call.args else call.kwargs.get("func")
        node = function.node if isinstance(function, Opaque) else None
        if isinstance(node, cst.Name):
            node = self.services.function_defs.get(node.value)
        if isinstance(node, cst.Lambda):
            params, body = node.params.params, node.body
        elif isinstance(node, cst.FunctionDef):
            params, body = node.params.params, node.body
        else:
            return False
        return len(params) == 1 and _only_by_column(body, params[0].name.value)

    def pandas_throughout(self, value: Value | None, node: cst.CSTNode) -> Code | None:
        """The pandas code of `node` as written, with each frame it names handed over, when
        `value` (what the call works on) is a frame or Series no statement names whose labels
        a filter or sort made the original row numbers (`df[df.kg > 2].index`,
        `s.sort_values()[0]`): handing `value` over would number its rows 0..n-1 again. None
        when that does not apply or a name it reads is not a frame with labels 0..n-1."""
        frame = value if isinstance(value, Frame) else value.frame if isinstance(value, Column) else None
        if frame is None or frame.labels_intact or frame.index or \
                (isinstance(value, Frame) and value.code.text.isidentifier()) or \
                (isinstance(value, Column) and value.binding is not None):
            return None  # a frame in a name is made by pandas where it is named (engine.bind)
        env = self.env
        ok = True

        class Names(cst.CSTTransformer):
            def visit_Attribute(self, node: cst.Attribute) -> bool:
                return False  # the attribute's own name is not a variable: only its value is

            def leave_Attribute(self, original: cst.Attribute, updated: cst.Attribute) -> cst.BaseExpression:
                return original.with_changes(value=original.value.visit(self))

            def leave_Arg(self, original: cst.Arg, updated: cst.Arg) -> cst.Arg:
                return updated.with_changes(keyword=original.keyword)  # `right=`: not a variable

            def visit_Lambda(self, node: cst.Lambda) -> bool:
                return False  # its parameters may hide the script's names

            def leave_Name(self, original: cst.Name, updated: cst.Name) -> cst.BaseExpression:
                nonlocal ok
                named = env.get(original.value)
                if isinstance(named, (Frame, Column)):
                    owner = named if isinstance(named, Frame) else named.frame
                    if not owner.labels_intact or owner.index:
                        ok = False
                        return updated
                    return cst.parse_expression(handover.to_pandas(named).wrapped(emit.ATOM))
                if isinstance(named, Indexed) and not named.grouped \
                        and named.frame.labels_intact and not named.frame.index:
                    # set_index(k) of a frame in a name: pandas' frame labelled by k
                    return cst.parse_expression(handover.to_pandas(named).wrapped(emit.ATOM))
                if isinstance(named, (Grouped, Accessor, Indexer, Parts, Indexed)):
                    ok = False
                return updated

        if not isinstance(node, cst.BaseExpression):
            return None
        rewritten = node.visit(Names())
        if not ok or rewritten.deep_equals(node):
            return None
        return Code(self.source(rewritten), precedence(node))

    def note_handed_over(self, value: Value | None) -> None:
        """A frame or Series (or the frame of a groupby) given to pandas code porter does not
        rewrite: that code may read its row labels (a loop's labels, row.name, a group's rows,
        an index written out, a plot's x axis), so after a filter or sort pandas makes it."""
        if isinstance(value, Grouped):
            value = value.frame
        if isinstance(value, Column) and value.binding is not None \
                and not value.frame.labels_intact and not value.frame.index:
            self.services.labels_needed.add(value.binding)
        elif isinstance(value, (Frame, Column)):
            self.note_labels_read(value if isinstance(value, Frame) else value.frame)

    def note_alignment(self, key: str, call: PandasCall) -> None:
        """A call pandas makes on Series or frames of different rows that aligns them on their
        labels (arithmetic, comparisons, assignment, join on the index, concat side by side…;
        not a merge on columns): a value among them bound to a name after a filter or sort
        must hold pandas' own labels, so the next pass has pandas make it (engine.bind)."""
        if key in _LABEL_READERS:  # the call reads its receiver's labels
            receiver = call.receiver
            if isinstance(receiver, Column) and receiver.binding is not None \
                    and not receiver.frame.labels_intact and not receiver.frame.index:
                self.services.labels_needed.add(receiver.binding)
            elif isinstance(receiver, (Frame, Column)):
                self.note_labels_read(receiver if isinstance(receiver, Frame) else receiver.frame)
            return
        if key == "pd.concat" and "keys" in call.kwargs and not _side_by_side(call):
            # keys= makes each piece's row labels the inner level of the index: a piece
            # filtered or sorted on the way must hold pandas' own labels
            pieces = [x for v in call.args[:1]
                      for x in (v.items if isinstance(v, Items) else (v,))]
            for piece in pieces:
                if isinstance(piece, Frame) and not piece.labels_intact and not piece.index:
                    self.note_labels_read(piece)
            return
        if key not in _ALIGNING and not (key == "pd.concat" and _side_by_side(call)) \
                and not _joins_on_labels(key, call):
            return
        given = [call.receiver, *call.args, *call.kwargs.values()]
        given = [x for v in given for x in (v.items if isinstance(v, Items) else (v,))]  # concat([a, b])
        values = [v for v in given if isinstance(v, (Frame, Column))]
        frames = [v if isinstance(v, Frame) else v.frame for v in values]  # type: ignore[union-attr]
        if len({f.rows for f in frames}) < 2:
            return
        for value, frame in zip(values, frames):
            if frame.labels_intact or frame.index:
                continue
            if isinstance(value, Column) and value.binding is not None:
                self.services.labels_needed.add(value.binding)
            else:
                self.note_labels_read(frame)

    def column_names_attribute(self, names: Scalar, attr: str, node: cst.Attribute) -> Value:
        """`df.columns.<attr>`: porter's column names are a list, pandas' an Index."""
        if attr in ("tolist", "to_list", "values"):
            return BoundMethod(names.code, receiver=names, name=attr) if attr != "values" else names
        if names.of is None:
            return self.generic(node)
        if attr == "str":  # string methods on the names (rules/selection.py, columns_str)
            return replace(names, pytype="names.str")
        if attr == "strftime" and names.pytype == "names.dates":
            # a pivot's date columns written as text (rules/selection.py, columns_strftime)
            return BoundMethod(names.code, receiver=names, name=attr)
        if attr == "droplevel" and isinstance(names.of, Frame) and names.of.column_pairs:
            # the (column, function) pairs of MultiIndex columns (rules/selection.py)
            # the names of a level are exact: the list of pairs' lowered confidence goes
            kept = tuple(s for s in names.sites if s.key != "frame.columns")
            return BoundMethod(names.code, receiver=replace(names, pytype="names.pairs",
                                                            sites=kept), name=attr)
        if attr == "name" and isinstance(names.of, Frame) and not names.of.value_levels \
                and not names.of.column_pairs:
            # df.columns.name: the key a pivot or unstack laid out as columns (what a hand-over
            # gives pandas' columns with rename_axis), None for any other frame
            name = names.of.columns_name
            return Scalar(emit.lit(name), pytype="str" if name is not None else None,
                          sites=names.sites)
        line, end_line = self.services.position(node)
        site = SiteDraft("frame.columns.index", "todo", "todo", 0.0,
                         f"pandas' Index.{attr} on the column names: porter's names are a list",
                         line, end_line)
        code = handover.to_pandas(names.of).attr("columns").attr(attr)
        return PandasValue(code, sites=names.sites + (site,))

    # -- calls ----------------------------------------------------------------------------------
    def _eval_Call(self, node: cst.Call) -> Value:
        appended = self.append_frame(node)
        if appended is not None:
            return appended
        if isinstance(node.func, cst.Attribute) and node.func.attr.value in _TIMESTAMP_NAMES \
                and not node.args:
            receiver = self.eval(node.func.value)
            if isinstance(receiver, Scalar) and receiver.pytype == "datetime":
                # Timestamp.day_name() / month_name(): the English names, as strftime gives them
                pattern = _TIMESTAMP_NAMES[node.func.attr.value]
                return Opaque(receiver.code.method("strftime", pattern), sites=receiver.sites)
        rounded = self.math_rounding(node)
        if rounded is not None:
            return rounded
        levels = self.level_values(node)
        if levels is not None:
            return levels
        func = self.eval(node.func)
        if isinstance(func, Opaque) and not func.sites and isinstance(node.func, cst.Name):
            name = node.func.value
            if name in self.services.functions:
                return self.call_local(self.services.functions[name], node)
            if name in DISPLAY_FUNCTIONS or name in _BUILTIN_RULES or name in _ELEMENT_BUILTINS:
                return self.call_builtin(name, node)
        lookup = self.dict_get(node)
        if lookup is not None:
            return lookup
        if isinstance(func, BoundMethod) and isinstance(func.receiver, Scalar) \
                and func.receiver.pytype not in ("names.str", "names.pairs", "names.dates"):
            return func.receiver  # tolist() of the column names: already a list
        if not isinstance(func, (BoundMethod, Module)):
            return self.generic(node)
        if isinstance(func, Module) and func.qualname in _PANDAS_SETTINGS:
            return self.generic(node)  # display settings: pandas still prints what is left to it
        if isinstance(func, Module) and (func.qualname.startswith("numpy.") or func.qualname
                                         in _VALUE_FUNCTIONS) \
                and func.qualname not in _NUMPY_SCALARS:
            args = self.call_args(node)
            if args is None or not any(is_pandas(v) for v in (*args[0], *args[1].values())):
                return self.generic(node)
        args = self.call_args(node)
        if args is None:
            return self.todo_unhandled(func, node, "`*args`/`**kwargs` unpacking is not handled")
        positional, keywords = args
        if isinstance(func, BoundMethod):
            key = _dask_key(func.receiver, func.name) or (
                func.name in ("compute", "persist") and self.dask_compute_key(func.receiver, func.name)
                or f"{_prefix(func.receiver)}.{func.name}")
            call = PandasCall(func.receiver, func.name, positional, keywords, node)
            if key == "frame.groupby" and _groups_by_time(call):
                key = "frame.groupby.grouper"  # time bins among the keys (rules/resample.py)
        else:
            key = _module_key(func.qualname)
            call = PandasCall(None, func.qualname.rsplit(".", 1)[-1], positional, keywords, node)
        return self.dispatch(key, call, node)

    def math_rounding(self, node: cst.Call) -> Value | None:
        """math.floor(x) / math.ceil(x) of a lambda's value (the script imports math itself)."""
        func = node.func
        if not (isinstance(func, cst.Attribute) and isinstance(func.value, cst.Name)
                and func.value.value == "math" and func.attr.value in ("floor", "ceil")
                and "math" not in self.env and _imports_math(self.services.python_module)):
            return None
        args = self.call_args(node)
        if args is None or len(args[0]) != 1 or args[1] \
                or not (isinstance(args[0][0], Column) and args[0][0].element):
            return None
        name = func.attr.value
        return self.dispatch(f"element.math.{name}", PandasCall(args[0][0], name, (), {}, node),
                             node)

    def dict_get(self, node: cst.Call) -> Value | None:
        """`mapping.get(x, default)` where x is a lambda's parameter: a lookup."""
        func = node.func
        if not (isinstance(func, cst.Attribute) and func.attr.value == "get"):
            return None
        mapping = self.eval(func.value)
        if not (isinstance(mapping, Opaque) and isinstance(mapping.const, dict)):
            return None
        args = self.call_args(node)
        if args is None or not args[0] or not (isinstance(args[0][0], Column) and args[0][0].element):
            return None
        call = PandasCall(args[0][0], "lookup", (mapping, *args[0][1:]), node=node)
        return self.dispatch("element.lookup", call, node)

    def call_args(self, node: cst.Call) -> tuple[tuple[Value, ...], dict[str, Value]] | None:
        positional: list[Value] = []
        keywords: dict[str, Value] = {}
        for arg in node.args:
            if arg.star:
                return None
            value = self.eval(arg.value)
            if arg.keyword is not None:
                keywords[arg.keyword.value] = value
            else:
                positional.append(value)
        return tuple(positional), keywords

    def call_builtin(self, name: str, node: cst.Call) -> Value:
        args = self.call_args(node)
        if args is not None and name in ("list", "tuple") and len(args[0]) == 1 and not args[1] \
                and isinstance(args[0][0], Opaque) and args[0][0].is_const \
                and isinstance(args[0][0].const, (str, list, tuple)):
            return self.opaque(node, _CONST_BUILTINS[name](args[0][0].const))  # list("AB")
        if args is not None and name in ("list", "tuple") and len(args[0]) == 1 and not args[1] \
                and isinstance(args[0][0], Scalar) and args[0][0].pytype == "list[str]" \
                and args[0][0].of is not None:
            # list(df.columns): the names, a plain list porter knows holds text (g[...] of it
            # selects those columns)
            names = args[0][0]
            return Scalar(emit.call(name, names.code), pytype="list[str]", sites=names.sites)
        if args is not None and name == "float" and len(args[0]) == 1 and not args[1] \
                and isinstance(args[0][0], Opaque) and isinstance(args[0][0].const, str) \
                and args[0][0].const.strip().lower().lstrip("+-") in ("nan", "inf", "infinity"):
            # float("nan") is NaN, as np.nan is (a missing value where pandas puts it)
            return self.opaque(node, float(args[0][0].const))
        if args is None or not any(is_pandas(v) for v in (*args[0], *args[1].values())):
            return self.generic(node)
        positional, keywords = args
        if positional and isinstance(positional[0], Column) and positional[0].element:
            call = PandasCall(positional[0], name, positional[1:], keywords, node)
            return self.dispatch(f"element.{name}", call, node)
        if name in _BUILTIN_RULES and positional and isinstance(positional[0], Parts) \
                and name != "len":
            return self.generic(node)  # round(parts), list(parts)…: pandas' DataFrame
        if name in _BUILTIN_RULES and positional and is_pandas(positional[0]):
            first = positional[0]
            if isinstance(first, Indexed) and not first.grouped:
                first = labelled_frame(first.frame, first.key)  # len(df.set_index("k"))
            call = PandasCall(first, name, positional[1:], keywords, node)
            return self.dispatch(_BUILTIN_RULES[name].format(kind=_prefix(first)), call, node)
        # display: print(df) prints the collected frame
        parts = [self.for_display(v) for v in positional]
        parts += [f"{k}={self.for_display(v)}" for k, v in keywords.items()]
        sites = tuple(s for v in (*positional, *keywords.values()) for s in v.sites)
        return Opaque(emit.call(self.source(node.func), *[Code(p) for p in parts]), sites=sites)

    def for_display(self, value: Value) -> str:
        return handover.for_display(value).text

    def call_local(self, function: LocalFunction, node: cst.Call) -> Value:
        args = self.call_args(node)
        if args is None:
            return self.generic(node)
        positional, keywords = args
        if function.name in self.services.label_functions:
            # its body reads the row labels of a frame it is given: so does the call. A frame
            # no statement names, filtered or sorted on the way (`save(df[df.k == "a"])`), is
            # made by pandas in the call, and the function takes pandas frames there
            positional = tuple(self._labels_given(value, arg.value) for arg, value in
                               zip([a for a in node.args if a.keyword is None], positional))
            keywords = {arg.keyword.value: self._labels_given(keywords[arg.keyword.value], arg.value)
                        for arg in node.args if arg.keyword is not None}
        self.services.call_sites.setdefault(function.name, []).append(
            tuple(positional) + tuple(keywords.values()))
        parts: list[str] = []
        sites: list[SiteDraft] = []
        bound: dict[str, Value] = {}
        position = 0
        handed = any(isinstance(v, PandasValue) for v in (*positional, *keywords.values()))
        for arg in node.args:
            # each argument is written from its own value (a keyword never stands in for a
            # positional argument, even when the call binds both to one name: pandas raises)
            if arg.keyword is not None:
                param, value = arg.keyword.value, keywords[arg.keyword.value]
            else:
                param = function.params[position] if position < len(function.params) else ""
                value = positional[position]
                position += 1
            sites += value.sites
            bound[param] = value
            if isinstance(value, Frame) and param in function.frame_params:
                text = value.code.text
            elif isinstance(value, Column) and param in function.column_params:
                text = value.code.text
            elif is_pandas(value):
                # the argument's own expression (pandas may run all of it: pandas_throughout),
                # not the call's, which is written around it
                handed_value = self.handed_to_unknown(value, arg.value)
                text = handed_value.code.text
                sites += handed_value.sites[len(value.sites):]
                handed = True
            else:
                text = value.code.text
            parts.append(f"{arg.keyword.value}={text}" if arg.keyword else text)
        code = Code(f"{self.source(node.func)}({', '.join(parts)})")
        returns = function.returns
        if function.returns_by_choice and not handed:
            # the body ported once for the texts its calls pass: what it returns for this
            # call's texts (the columns they name)
            texts = tuple(sorted((p, v.const) for p, v in bound.items()
                                 if p in dict(function.param_choices)
                                 and isinstance(v, Opaque) and isinstance(v.const, str)))
            returns = dict(function.returns_by_choice).get(texts, returns)
        if isinstance(returns, Frame):
            # each call returns rows of its own: two calls (load("a.csv"), load("b.csv")) are
            # two frames, never columns of one another
            rows = fresh_token()
            if function.returns_file_rows:
                self.services.file_rows.add(rows)
            return replace(returns, code=code, sites=tuple(sites), rows=rows)
        returned = function.returns
        if isinstance(returned, Column) and (function.column_params or function.returns_column_of):
            # the function returns an expression: of the columns passed, or of the frame passed
            columns = [v for p, v in bound.items() if p in function.column_params]
            frame = bound.get(function.returns_column_of or "")
            if columns and all(isinstance(c, Column) for c in columns):
                frame = columns[0].frame  # type: ignore[union-attr]
            if isinstance(frame, Frame):
                refs = frozenset().union(*(c.refs for c in columns)) if columns else returned.refs  # type: ignore[union-attr]
                name = returned.name
                if name is None and len(columns) == 1:
                    name = columns[0].name  # type: ignore[union-attr]
                return Column(code, frame=frame, name=name, dtype=returned.dtype, refs=refs,
                              versions=tuple((c, frame.version(c)) for c in sorted(refs)),
                              null_is_false=returned.null_is_false, sites=tuple(sites))
        if isinstance(function.returns, Column | Scalar) or handed:
            # (given pandas data, its body pandas code: what it returns may be a Series, which
            # pandas aligns on its labels, never a constant pl.lit could hold)
            return PandasValue(code, sites=tuple(sites))
        return Opaque(code, sites=tuple(sites))

    def _labels_given(self, value: Value, node: cst.BaseExpression) -> Value:
        """A value given to a function that reads the row labels of what it is given (see
        call_local): pandas makes it, when a filter or sort on the way made them other than
        0..n-1 and no statement names it; a frame in a name is made by pandas where it is
        named (engine.bind)."""
        self.note_handed_over(value)
        frame = value if isinstance(value, Frame) else value.frame if isinstance(value, Column) else None
        if frame is None or frame.labels_intact or frame.index or \
                (isinstance(value, Column) and value.binding is not None) or \
                (isinstance(value, Frame) and value.code.text.isidentifier()):
            return value
        return self.handed_to_unknown(value, node)

    def _eval_IfExp(self, node: cst.IfExp) -> Value:
        test = self.eval(node.test)
        if not isinstance(test, Column):
            return self.generic(node)
        body, orelse = self.eval(node.body), self.eval(node.orelse)
        call = PandasCall(test, "ifexp", (body, orelse), node=node)
        return self.dispatch("element.ifexp", call, node)

    # -- subscripts -----------------------------------------------------------------------------
    def _eval_Subscript(self, node: cst.Subscript) -> Value:
        shape = self.shape_item(node)
        if shape is not None:
            return shape
        receiver = self.eval(node.value)
        if isinstance(receiver, Opaque) and isinstance(receiver.const, dict) and len(node.slice) == 1 \
                and isinstance(node.slice[0].slice, cst.Index):
            key = self.eval(node.slice[0].slice.value)
            if isinstance(key, Column) and key.element:
                call = PandasCall(key, "lookup", (receiver,), node=node)
                return self.dispatch("element.lookup", call, node)
        if isinstance(receiver, Scalar) and receiver.pytype == "list[str]" and receiver.of is not None \
                and len(node.slice) == 1 and isinstance(node.slice[0].slice, cst.Index):
            key = self.eval(node.slice[0].slice.value)
            if isinstance(key, PandasValue) or isinstance(key, (Column, Frame)) \
                    and isinstance(node.value, cst.Attribute) and node.value.attr.value == "columns":
                # df.columns[<a mask pandas computed>], df.columns[df.isna().any()]: porter's
                # names are a list, which a boolean array or Series cannot index; pandas'
                # Index of the names can (by position: a Series' labels are not read)
                line, end_line = self.services.position(node)
                site = SiteDraft("frame.columns.index", "todo", "todo", 0.0,
                                 "the column names selected by a mask pandas computed: pandas' "
                                 "Index of the names", line, end_line)
                mask = key.code if isinstance(key, PandasValue) else handover.to_pandas(key)
                code = _pandas_names(receiver.of).index(mask)
                return PandasValue(code, sites=receiver.sites + key.sites + (site,))
        if isinstance(receiver, Module) and receiver.qualname == "pandas.IndexSlice":
            # pd.IndexSlice["a", :] is the tuple of what is written between the brackets
            # ("a", slice(None)): a literal when each part is (the rules that read labels
            # read it; anywhere else it is pandas' own, written as it is)
            parts = [self.eval(e.slice.value) if isinstance(e.slice, cst.Index)
                     else self.eval_slice(e.slice) for e in node.slice]
            if all(isinstance(p, Opaque) and p.is_const and not p.sites for p in parts) \
                    and not receiver.sites:
                consts = tuple(p.const for p in parts)
                return Opaque(Code(self.source(node)), const=consts if len(consts) > 1
                              else consts[0], node=node)
            return self.generic(node)
        if not isinstance(receiver, (Frame, Column, Grouped, Indexer, Accessor, Parts, Resampled,
                                     Indexed)):
            return self.generic(node)
        keys: list[Value] = []
        for element in node.slice:
            if isinstance(element.slice, cst.Index):
                keys.append(self.eval(element.slice.value))
            else:
                keys.append(self.eval_slice(element.slice))
        key_value: Value = keys[0] if len(keys) == 1 else _TupleKey(Code(""), items=tuple(keys))
        if isinstance(receiver, Indexer) and receiver.column is not None:
            call = PandasCall(receiver.column, receiver.kind, tuple(keys), node=node)
            return self.dispatch(f"series.{receiver.kind}", call, node)
        if isinstance(receiver, Indexer):
            call = PandasCall(receiver.frame, receiver.kind, tuple(keys), node=node)
            return self.dispatch(f"frame.{receiver.kind}", call, node)
        if isinstance(receiver, Indexed) and not receiver.grouped:
            receiver = labelled_frame(receiver.frame, receiver.key)  # df.set_index(k)["c"]
        call = PandasCall(receiver, "getitem", (key_value,), node=node)
        return self.dispatch(_getitem_key(receiver, key_value), call, node)

    def shape_item(self, node: cst.Subscript) -> Value | None:
        """`df.shape[0]`: only the row count is computed (not the whole tuple)."""
        owner = node.value
        if not (isinstance(owner, cst.Attribute) and owner.attr.value == "shape"
                and len(node.slice) == 1 and isinstance(node.slice[0].slice, cst.Index)):
            return None
        frame = self.eval(owner.value)
        key = self.eval(node.slice[0].slice.value)
        if isinstance(frame, Column) and not frame.element and isinstance(key, Opaque) \
                and key.const in (0, -1) and not isinstance(key.const, bool):
            # s.shape[0]: a Series has one dimension
            return self.dispatch("series.shape", PandasCall(frame, "shape", (key,), node=node), node)
        if not (isinstance(frame, Frame) and isinstance(key, Opaque) and key.const in (0, 1, -1, -2)
                and not isinstance(key.const, bool)):
            return None
        return self.dispatch("frame.shape", PandasCall(frame, "shape", (key,), node=node), node)

    def eval_slice(self, node: cst.Slice) -> Value:
        parts = []
        for part in (node.lower, node.upper, node.step):
            if part is None:
                parts.append(None)
                continue
            value = self.eval(part)
            if not (isinstance(value, Opaque) and value.is_const):
                return self.opaque_slice(node)
            parts.append(value.const)
        return Opaque(Code(self.source(node)), const=slice(*parts), node=node)

    def opaque_slice(self, node: cst.Slice) -> Value:
        return Opaque(Code(self.source(node)), node=node)

    # -- operators ------------------------------------------------------------------------------
    def _eval_BinaryOperation(self, node: cst.BinaryOperation) -> Value:
        left, right = self.eval(node.left), self.eval(node.right)
        op = BINARY_OPS[type(node.operator)]
        if not (_is_series_like(left) or _is_series_like(right)):
            if isinstance(left, Frame) or isinstance(right, Frame):
                return self.todo_operator(left, right, op, node)
            combined = _one_select(left, right, op)
            if combined is not None:
                return combined
            result = self.generic(node)
            if isinstance(result, Opaque) and not result.is_const and op == "+" \
                    and isinstance(left, Opaque) and isinstance(right, Opaque) \
                    and left.is_const and right.is_const \
                    and type(left.const) is type(right.const) and type(left.const) in (list, tuple) \
                    and not result.sites:
                # NAMES + ["other"]: two lists known when porter reads them, one known list
                # (a column selection, the columns assigned to)
                return replace(result, const=left.const + right.const)
            if isinstance(result, Opaque) and not result.is_const and op in ("+", "-", "*", "//", "%") \
                    and _whole_number(left) and _whole_number(right):
                # len(df) * 2, s.sum() - 5: a whole number (stored as a column: Int64, as pandas)
                result = replace(result, pytype="int")
            return result
        key = "series.logical" if op in ("&", "|", "^") else "series.arith"
        return self.dispatch(key, PandasCall(left, op, (right,), node=node), node)

    def _eval_Comparison(self, node: cst.Comparison) -> Value:
        left = self.eval(node.left)
        if len(node.comparisons) != 1:
            return self.generic(node)
        target = node.comparisons[0]
        right = self.eval(target.comparator)
        op = COMPARE_OPS[type(target.operator)]
        # df.columns as written (pandas' Index), not a list made of it (list(df.columns),
        # tolist(): a list compares whole in pandas too)
        names = next((v for v, n in ((left, node.left), (right, target.comparator))
                      if isinstance(v, Scalar) and v.of is not None and v.pytype == "list[str]"
                      and isinstance(n, cst.Attribute) and n.attr.value == "columns"), None)
        other = right if names is left else left
        if names is not None and op in ("==", "!=", "<", "<=", ">", ">=") \
                and isinstance(other, Opaque) and other.is_const:
            # df.columns != "k": pandas compares each name (a boolean array); porter's names
            # are a list, which compares whole (one True/False): pandas' Index of the names
            line, end_line = self.services.position(node)
            site = SiteDraft("frame.columns.compare", "todo", "todo", 0.0,
                             "the column names compared one by one: pandas' Index of the names "
                             "(a boolean array)", line, end_line)
            labels = _pandas_names(names.of)
            code = emit.binop(labels, op, other.code) if names is left \
                else emit.binop(other.code, op, labels)
            return PandasValue(code, sites=names.sites + other.sites + (site,))
        pivot = _pivot_compared(left, right, op)
        if pivot is not None:
            return pivot
        if not (_is_series_like(left) or _is_series_like(right)) or op in ("in", "not in", "is", "is not"):
            return self.generic(node)
        return self.dispatch("series.compare", PandasCall(left, op, (right,), node=node), node)

    def _eval_BooleanOperation(self, node: cst.BooleanOperation) -> Value:
        """`a and b` / `a or b` inside a lambda, on booleans: & and |."""
        left, right = self.eval(node.left), self.eval(node.right)
        if not any(isinstance(v, Column) and v.element for v in (left, right)) or not all(
                isinstance(v, Column) and v.dtype == "bool" for v in (left, right)):
            return self.generic(node)
        op = "&" if isinstance(node.operator, cst.And) else "|"
        return self.dispatch("series.logical", PandasCall(left, op, (right,), node=node), node)

    def _eval_UnaryOperation(self, node: cst.UnaryOperation) -> Value:
        operand = self.eval(node.expression)
        if isinstance(node.operator, cst.Minus) and isinstance(operand, Opaque) and operand.is_const:
            if isinstance(operand.const, (int, float)):
                return self.opaque(node, -operand.const)
        if not _is_series_like(operand):
            return self.generic(node)
        op = {cst.BitInvert: "~", cst.Minus: "-", cst.Plus: "+", cst.Not: "not"}[type(node.operator)]
        if op == "not":
            if not (isinstance(operand, Column) and operand.element and operand.dtype == "bool"):
                return self.generic(node)
            op = "~"  # `not` of one boolean value inside a lambda
        return self.dispatch("series.unary", PandasCall(operand, op, node=node), node)

    def level_values(self, node: cst.Call) -> Value | None:
        """`df.index.get_level_values("k")` of a table (or Series) labelled by key columns:
        the key column (rules/selection.index_get_level_values); None for anything else, which
        takes the plain path (df.index, then the method)."""
        from porter.rules.selection import index_level
        func = node.func
        if not (isinstance(func, cst.Attribute) and func.attr.value == "get_level_values"
                and isinstance(func.value, cst.Attribute) and func.value.attr.value == "index"
                and len(node.args) == 1 and node.args[0].keyword is None
                and not node.args[0].star):
            return None
        owner = self.eval(func.value.value)
        level = self.eval(node.args[0].value)
        if not isinstance(owner, (Frame, Column)) or index_level(owner, level) is None:
            return None
        return self.dispatch("frame.index.get_level_values",
                             PandasCall(owner, "get_level_values", (level,), node=node), node)

    # -- rules ----------------------------------------------------------------------------------
    def regrouped(self, indexed: Indexed, node: cst.CSTNode) -> Value:
        """A groupby of a labelled table with columns taken (set_index(k).groupby(g)["c"]) as
        the same groupby of its frame: pandas leaves the labels out of what it aggregates."""
        keys = list(indexed.grouped)
        by: Any = keys[0] if len(keys) == 1 else keys
        grouped = self.dispatch("frame.groupby", PandasCall(
            indexed.frame, "groupby", (Opaque(emit.lit(by), const=by),), node=node), node)
        names: Any = indexed.selection[0] if indexed.single else list(indexed.selection or ())
        if not isinstance(grouped, Grouped):
            return grouped
        return self.dispatch("groupby.getitem", PandasCall(
            grouped, "getitem", (Opaque(emit.lit(names), const=names),), node=node), node)

    def dispatch(self, key: str, call: PandasCall, node: cst.CSTNode) -> Value:
        table, registry = self.services.table, self.services.registry
        entry = table.get(key)
        fn = registry.get(key)
        if entry is None or fn is None or entry.status == "todo":
            reason = entry.advice if entry is not None and entry.status == "todo" else (
                "porter has no rule for this API yet")
            return self.todo(key, call, node, reason, entry=entry)
        if key != "frame.getitem.column" and any(
                isinstance(v, Frame) and v.value_levels
                for v in (call.receiver, *call.args, *call.kwargs.values())):
            # a pivot of several value columns: pandas' two levels of column labels, which
            # only pv["value"] reads as porter holds them (rules/groupby._pivot_several_values)
            return self.todo(key, call, node, "pandas' columns are two levels here (the value "
                             "column, then the key's value): select one value column first",
                             entry=entry)
        if key in ("frame.to_csv", "series.to_csv", "frame.to_parquet") and call.args \
                and isinstance(call.args[0], Opaque) and isinstance(call.args[0].const, str) \
                and "*" in call.args[0].const \
                and self.dask_script():
            # a Dask frame porter lost track of: Dask writes one file per partition, numbering
            # the `*`; pandas would write one file under that very name
            return self.todo(key, call, node, "in a Dask script a `*` in the name writes one "
                             "file per partition (the `*` numbered 0, 1, ...); porter writes "
                             "one file: give single_file=True", entry=entry)
        ctx = RuleContext(key, entry, entry.confidence, schema_lookup=self.services.schema_lookup,
                          evaluate=self.evaluate_with,
                          datetimes_possible=self.services.datetimes_possible,
                          nullable_ints_possible=self.services.nullable_ints_possible,
                          durations_possible=self.services.durations_possible,
                          lists_possible=self.services.lists_possible,
                          infinities_possible=self.services.infinities_possible,
                          inside_from_pandas=self.services.inside_from_pandas(node),
                          shown=self.services.shown(node),
                          printed=self.services.printed(node),
                          function_def=self.services.function_defs.get,
                          python_module=self.services.python_module)
        if key == "frame.setitem" and len(call.args) == 2 and isinstance(call.receiver, Frame) \
                and hasattr(call.args[1], "aligned_in"):
            # a Series holding the frame's own row labels in another order: pandas puts each
            # value on its row, which is the column computed in the frame's order
            aligned = call.args[1].aligned_in(call.receiver)  # type: ignore[attr-defined]
            if aligned is not None:
                call = replace(call, args=(call.args[0], aligned.with_sites(*call.args[1].sites)))
        try:
            result = lost_float_ints(key, call, fn(call, ctx), ctx)
            receiver = call.receiver
            if isinstance(receiver, Column) and receiver.index_values \
                    and isinstance(result, Column) and not result.index_values \
                    and key not in _INDEX_TO_SERIES:
                # a method of pandas' Index gives an Index again (idx.sort_values()[0] is the
                # first value by position)
                result = replace(result, index_values=True)
        except Unsupported as exc:
            return self.todo(key, call, node, exc.reason, entry=entry)
        except Exception as exc:  # noqa: BLE001 - a rule that cannot read this call keeps pandas
            reason = (f"porter could not read this call ({type(exc).__name__}: {exc}); "
                      f"internal error: please report")
            return self.todo(key, call, node, reason, entry=entry)
        if key in _MERGES and sum(_dask_frame(v) and _frame_of(v).dask_many
                                  for v in (call.receiver, *call.args, *call.kwargs.values())) >= 2:
            # Dask merges two frames of several partitions by shuffling both on the key
            ctx.lower("a merge of two Dask frames of several partitions shuffles their rows on "
                      "the key: Dask's rows come in another order than pandas' (and their "
                      "labels start again in each partition); sort the result", 0.5)
        if key in _DASK_ORDERS and _dask_frame(call.receiver) and _frame_of(call.receiver).dask_many:
            ctx.lower(_DASK_ORDERS[key], 0.5)
        many = any(_dask_frame(v) and _frame_of(v).dask_many
                   for v in (call.receiver, *call.args, *call.kwargs.values())) \
            and not key.startswith(("groupby.", "frame.groupby"))
        if key not in _DASK_COMPUTED and _from_dask(call):
            # a step of a Dask frame (merge, assign, a filter, a groupby's sum...) gives a Dask
            # frame or column again
            if isinstance(result, Frame) and not result.dask:
                result = replace(result, dask=True, dask_many=many)
            elif isinstance(result, Column) and not result.element and not result.frame.dask:
                result = replace(result, frame=replace(result.frame, dask=True, dask_many=many))
        if ctx.inside_from_pandas and ctx.handover and isinstance(result, PandasValue):
            return result  # porter's own hand-over, met again on a later pass: nothing new
        status = "handover" if entry.status == "handover" or ctx.handover else "converted"
        if ctx.todo_note is not None:
            status = "todo"
        if status == "converted" and ctx.confidence < self.services.min_confidence:
            reason = (f"confidence {ctx.confidence:.2f} is below --min-confidence "
                      f"{self.services.min_confidence:.2f}")
            if ctx.reasons:
                reason += f" ({'; '.join(ctx.reasons)})"
            return self.todo(key, call, node, reason, entry=entry, suggestion=result.code.text)
        if isinstance(result, Frame) and (
                key.startswith(("pd.read_", "dd.read_")) and "nrows" not in call.kwargs
                or ctx.stacked_rows and set(ctx.stacked_rows) <= self.services.file_rows):
            self.services.file_rows.add(result.rows)  # Polars counts them from the files alone
        line, end_line = self.services.position(node)
        message = "; ".join(ctx.reasons) if ctx.reasons else _first_sentence(entry.notes)
        if ctx.todo_note is not None:
            message = ctx.todo_note
        site = SiteDraft(key, entry.rule or key, status, ctx.confidence, message, line, end_line)
        if key in _APPLIES and status == "converted" and not ctx.runs_function:
            function = call.args[0] if call.args else call.kwargs.get(
                "arg" if key == "series.map" else "func")
            if isinstance(function, Opaque) and isinstance(function.node, cst.Name):
                self.services.applied_functions.setdefault(function.node.value, set()).add(id(node))
                self.services.applied_kinds.setdefault(function.node.value, set()).add(_APPLIES[key])
        if ctx.args_evaluated_again:
            call = replace(call, args=(), kwargs={})
        return result.with_sites(*_child_sites(call, result), site)

    def evaluate_with(self, node: cst.BaseExpression, bindings: dict[str, Value]) -> Value:
        """Evaluate `node` with extra names bound (lambda parameters)."""
        return Evaluator({**self.env, **bindings}, self.services).eval(node)

    def todo(self, key: str, call: PandasCall, node: cst.CSTNode, reason: str, *,
             entry: MappingEntry | None = None, suggestion: str | None = None) -> Value:
        """Keep this use on pandas: hand the inputs over and mark the line."""
        line, end_line = self.services.position(node)
        advice = entry.advice if entry is not None and entry.status != "todo" else ""
        message = reason if not advice or advice == reason else f"{reason}; {advice}"
        site = SiteDraft(key, entry.rule or "todo" if entry else "todo", "todo", 0.0, message,
                         line, end_line, suggestion)
        fallback = handover.pandas_fallback(call, self.source, node)
        self.note_alignment(key, call)
        labels_unread = (key in _LABELS_NOT_READ or key.startswith(_ELEMENT_PREFIXES)) \
            and not {"left_index", "right_index"} & set(call.kwargs) \
            or key == "frame.iterrows" and id(node) in self.services.label_free_loops
        sites = _child_sites(call, None) + (site,)
        if key not in _ELEMENT_CALLS and not labels_unread \
                and not (key == "frame.apply" and self.rows_without_labels(call)):
            self.note_handed_over(call.receiver)
            whole = self.pandas_throughout(call.receiver, node)
            if call.receiver is None and _joins_on_labels(key, call):
                # pd.merge(a, b, left_index=True, ...): the frames it is given are read by label
                for given in (*call.args, *call.kwargs.values()):
                    if isinstance(given, (Frame, Column)):
                        self.note_handed_over(given)
                        whole = whole or self.pandas_throughout(given, node)
            if whole is not None:
                # a frame no statement names, filtered or sorted on the way: its labels are
                # pandas' only if pandas runs the whole expression from the frames it reads
                fallback = whole
                sites = tuple(replace(x, status="handover", confidence=1.0,
                                      message="made by pandas with the expression it is in, "
                                              "for its row labels")
                              if x.status == "converted" else x for x in sites[:-1]) + (site,)
        if (call.receiver is None and entry is not None and entry.extra.get("returns") == "frame"
                and not self.services.inside_from_pandas(node)
                and MIXED_COLUMN not in reason  # an object column of mixed values: no Polars type
                and not {"chunksize", "iterator"} & set(call.kwargs)  # those give chunks
                # pl.from_pandas drops the row labels: only labels 0..n-1 may be dropped
                and _labels_from_zero(key, call)):
            code = emit.pl("from_pandas", fallback).method("lazy")
            return Frame(code, sites=sites)
        return PandasValue(fallback, sites=sites, rows=_rows_kept(key, call))

    def todo_unhandled(self, func: Value, node: cst.Call, reason: str) -> Value:
        if isinstance(func, BoundMethod):
            key = f"{_prefix(func.receiver)}.{func.name}"
            call = PandasCall(func.receiver, func.name, (), {}, node)
        else:
            key = _module_key(func.qualname)  # type: ignore[attr-defined]
            call = PandasCall(None, key, (), {}, node)
        return self.todo(key, call, node, reason, entry=self.services.table.get(key))

    def todo_operator(self, left: Value, right: Value, op: str, node: cst.CSTNode) -> Value:
        call = PandasCall(left, op, (right,), node=node)
        return self.todo("frame.arith", call, node, "arithmetic on whole frames is not ported",
                         entry=self.services.table.get("frame.arith"))

    def handed_to_unknown(self, value: Value, node: cst.CSTNode) -> Value:
        """A pandas value passed to code porter does not model: give it the pandas object."""
        line, end_line = self.services.position(node)
        plotting, reads_labels = self.services.plotted.get(id(node), (None, True))
        if reads_labels:
            self.note_handed_over(value)
        code = handover.to_pandas(value)
        message = ("passed to code porter does not understand: handed over to pandas with "
                   ".collect().to_pandas(); port that code to take a Polars frame")
        frame = value if isinstance(value, Frame) else value.frame if isinstance(value, Column) else None
        # a method of such a value (`other.sort_values("k")["v"].cumsum`, called by code kept
        # on pandas): what it is called on is what carries the labels
        works_on = value.receiver if isinstance(value, BoundMethod) else value
        whole = self.pandas_throughout(works_on, node) if reads_labels else None
        if whole is not None:
            # filtered or sorted on the way (`[df[df.k == "a"], ...]`): pandas runs the whole
            # expression, so the rows keep pandas' labels
            code = whole
        elif frame is not None and not frame.labels_intact and not frame.index and reads_labels:
            # after a filter or a sort pandas' labels are the original row numbers; the frame
            # handed over is numbered 0..n-1 again (a known gap: labels are not carried yet)
            message += (". Its row labels are renumbered 0..n-1 (pandas kept the original row "
                        "numbers after the filter or sort): check that the code does not read "
                        "them (.loc, .index, alignment with another Series, a plot's x axis)")
        site = SiteDraft("handover.unknown_code", "handover", "todo", 0.0, message, line, end_line)
        if plotting is not None:
            # Polars has no plotting that draws the same picture: pandas' objects are what the
            # library reads (values, the Series' names on the axes, the row labels as x); a
            # modelling library takes them as they are and makes arrays of them
            name = library(plotting)
            draws = plots(plotting)
            confidence, message = 1.0, (
                f"given to {LIBRARY_NAMES.get(name, name)} ({plotting.split('.')[-1]}), which "
                + ("draws from pandas objects" if draws else "takes pandas objects")
                + ": handed over with .collect().to_pandas()")
            if frame is not None and not frame.labels_intact and not frame.index \
                    and whole is None and reads_labels:
                confidence = 0.8
                message += (". Its row labels are renumbered 0..n-1 (pandas kept the original row "
                            "numbers after the filter or sort): "
                            + ("a plot of one Series draws them as its x values" if draws else
                               "what it returns is labelled by them"))
            named = self.services.seaborn_columns.get(id(node))
            if isinstance(value, Frame) and named is not None and whole is None \
                    and not reads_labels and not value.index and value.columns is not None \
                    and not value.value_levels and not value.column_pairs \
                    and any(c in value.columns for c in named) \
                    and not set(value.columns) <= set(named):
                # seaborn reads the columns named in the call from its data= frame, nothing
                # else (not its row labels: see consumers._reads_labels): only they go over
                kept = tuple(c for c in value.columns if c in named)
                code = handover.to_pandas(replace(
                    value, code=value.code.method("select", *kept), columns=kept,
                    dtypes=tuple((c, t) for c, t in value.dtypes if c in kept)))
                message = message.replace(".collect().to_pandas()",
                                          f".select(<the {len(kept)} columns it names>)"
                                          ".collect().to_pandas()")
            if _values_array(value, name, reads_labels, whole):
                # matplotlib's drawing functions and scikit-learn's models and metrics make an
                # array of a Series' values (Series.to_numpy()) and read neither its labels nor
                # its name; a column of numbers is the same array from Polars (int64, float64,
                # a missing value nan: an int column with one is float64 in pandas too)
                code = handover.collected(value).method("to_numpy")
                message = message.replace(".collect().to_pandas()",
                                          ".collect().to_series().to_numpy() (its values)")
            site = SiteDraft("handover.plotting" if draws else "handover.library",
                             "plotting" if draws else "library", "handover", confidence, message,
                             line, end_line)
        return PandasValue(code, sites=value.sites + (site,))

    # -- everything else ------------------------------------------------------------------------
    def modern_chain(self, node: cst.BaseExpression) -> str | None:
        """A chain of calls on a pandas object kept as written, with the calls along it as
        pandas 3.1 runs them (handover.modern_chain: old frequency aliases, removed methods);
        None when it starts from no pandas object or nothing changes."""
        if not isinstance(node, (cst.Call, cst.Attribute, cst.Subscript)):
            return None
        receivers = chain_receivers(node)
        if not receivers or not isinstance(self.eval(receivers[-1]), PandasValue):
            return None
        from porter.rules.legacy import written_for_older_pandas
        modern = handover.modern_chain(
            node, older=written_for_older_pandas(self.services.python_module))
        if modern is node:
            return None
        text = self.source(modern)
        return text if text != self.source(node) else None

    def generic(self, node: cst.BaseExpression, display: bool = False) -> Value:
        """Keep `node` as written, rewriting pandas values found inside it."""
        rewriter = ChildRewriter(self, node, display)
        new_node = node.visit(rewriter)
        if not rewriter.changed:
            if rewriter.pandas_inside:
                modern = self.modern_chain(node)
                if modern is not None:
                    return PandasValue(Code(modern, precedence(node)), sites=tuple(rewriter.sites))
                return PandasValue(Code(self.standalone(node), precedence(node)),
                                   sites=tuple(rewriter.sites))
            return Opaque(Code(self.standalone(node), precedence(node)), node=node,
                          sites=tuple(rewriter.sites))
        text = self.source(new_node)  # type: ignore[arg-type]
        if rewriter.pandas_inside and not _model_array(node):
            # built on a value handed over to pandas: a pandas object, never a plain scalar
            return PandasValue(Code(text, precedence(node)), sites=tuple(rewriter.sites))
        return Opaque(Code(text, precedence(node)), sites=tuple(rewriter.sites))


def _values_array(value: Value, library_name: str, reads_labels: bool, whole: Code | None) -> bool:
    """Whether a Series given to a plotting or modelling call may go over as the numpy array of
    its values: a column of numbers (int or float; not one of pandas' nullable integers, whose
    array holds <NA>) of a frame without row labels of its own, given to matplotlib or
    scikit-learn where they read only its values."""
    return isinstance(value, Column) and library_name in ("matplotlib", "sklearn") \
        and not reads_labels and whole is None and value.dtype in ("int", "float") \
        and not value.nullable_int and not value.null_is_false and not value.frame.index \
        and not value.index_values


def chain_receivers(node: cst.BaseExpression) -> list[cst.BaseExpression]:
    """The receivers along a chain of calls, attributes and subscripts, the outermost first:
    the last is the object the chain starts from (`df.a.sum()`: df.a, df)."""
    receivers: list[cst.BaseExpression] = []
    while True:
        if isinstance(node, cst.Call) and isinstance(node.func, cst.Attribute):
            node = node.func.value
        elif isinstance(node, (cst.Attribute, cst.Subscript)):
            node = node.value
        else:
            return receivers
        receivers.append(node)


def _model_array(node: cst.BaseExpression) -> bool:
    """A model's predictions or a transform's rows (`scaler.fit_transform(df[cols])`,
    `km.fit_predict(X)`): a numpy array whatever pandas values it was given."""
    return isinstance(node, cst.Call) and isinstance(node.func, cst.Attribute) \
        and node.func.attr.value in MODEL_ARRAY_METHODS


def _one_select(left: Value, right: Value, op: str) -> Scalar | None:
    """Whole numbers counted from one frame, and numbers written out (len(df) -
    df["k"].nunique() * 2): one select of them all, so the frame's plan runs once (integer
    arithmetic: exact, as pandas')."""
    def part(value: Value) -> Code | None:
        if isinstance(value, Scalar) and value.pytype == "int" and value.agg is not None:
            return value.agg.code
        if isinstance(value, Opaque) and type(value.const) is int:  # a whole number written out
            return emit.lit(value.const)
        return None

    counted = [v for v in (left, right) if isinstance(v, Scalar) and v.agg is not None]
    a, b = part(left), part(right)
    if op not in ("+", "-", "*") or a is None or b is None or not counted \
            or len({v.agg.frame.rows for v in counted}) != 1:  # type: ignore[union-attr]
        return None
    agg = counted[0].agg
    assert agg is not None
    expr = emit.binop(a, op, b)
    code = agg.frame.code.method("select", expr).method("collect")
    if all(v.code.text.endswith(".item()") for v in counted):
        code = code.method("item")  # Python ints, as len() and nunique() give
    else:  # numpy's int64, as a sum gives (it divides by zero to inf, not an error)
        code = code.method("to_series").method("to_numpy").index(0)
    return Scalar(code, pytype="int", agg=replace(agg, code=expr), sites=left.sites + right.sites)


def _whole_number(value: Value) -> bool:
    """A whole number written out, or a Python value porter knows to be one (len(df), the sum
    of an integer column)."""
    if isinstance(value, Opaque) and value.is_const:
        return isinstance(value.const, int) and not isinstance(value.const, bool)
    return isinstance(value, (Scalar, Opaque)) and value.pytype == "int"


def parts_current(parts: Parts, env: Mapping[str, Value]) -> bool:
    """Whether the name of the frame str.extract's text came from (or of the Series, for a
    Series of its own) still holds those rows, with the text column unchanged."""
    source = parts.source
    held = env.get(source.frame.code.text)
    frame = held.frame if isinstance(held, Column) else held
    return isinstance(frame, Frame) and frame.rows == source.frame.rows \
        and frame.code.text == source.frame.code.text \
        and all(frame.version(c) == v for c, v in source.versions)


def _pivot_compared(left: Value, right: Value, op: str) -> Frame | None:
    """`grid > 0` of a pivoted table whose columns porter does not know (an unstack, a
    crosstab; every cell a number) and a number written in the script: a table of the same
    labels whose cells are True/False. pandas compares a missing cell (NaN) as False, or True
    for !=; Polars would give null (and NaN compares above every number there)."""
    from porter.translate.context import number_cells
    if not (isinstance(left, Frame) and isinstance(right, Opaque) and right.is_const
            and isinstance(right.const, (int, float)) and not isinstance(right.const, bool)
            and op in ("==", "!=", "<", "<=", ">", ">=")):
        return None
    pivoted, kind = number_cells(left)
    if not pivoted or kind not in ("int", "float", None) or not left.index:
        return None
    cells = emit.pl("exclude", *left.index)
    if kind != "int":
        cells = cells.method("fill_nan", None)
    test = emit.binop(cells, op, right.code).method("fill_null", op == "!=")
    code = left.code.method("with_columns", test)
    return replace(left, code=code, sites=left.sites + right.sites, number_cells=(code.text, "bool"))


@dataclass(frozen=True)
class _TupleKey(Value):
    items: tuple[Value, ...] = field(kw_only=True)


# -- helpers ------------------------------------------------------------------------------------

# pandas calls that pair the rows of two Series or frames by their labels
_ALIGNING = frozenset({
    "series.arith", "series.compare", "series.logical", "frame.arith", "frame.compare",
    "frame.setitem", "frame.loc_setitem", "frame.assign", "frame.join", "series.where",
    "series.mask", "frame.where", "frame.mask", "series.fillna", "frame.fillna",
    "series.combine_first", "frame.combine_first", "series.update", "frame.update",
    "series.corr", "series.cov", "frame.corrwith", "series.clip", "frame.clip",
    "series.between", "frame.insert", "series.eq", "series.ne", "series.lt", "series.le",
    "series.gt", "series.ge", "series.add", "series.sub", "series.mul", "series.div",
    "series.truediv", "series.floordiv", "series.mod", "series.pow",
})


# pandas calls that read their receiver's row labels (they give or use them as values); a
# loop over rows (iterrows) is left out: its labels are read with the same frame's, which agree
_LABEL_READERS = frozenset({
    "frame.reset_index", "series.reset_index", "frame.idxmax", "frame.idxmin",
    "series.idxmax", "series.idxmin", "frame.sort_index", "series.sort_index", "frame.loc",
    "series.loc", "frame.at", "series.at", "frame.to_csv", "series.to_csv", "frame.to_excel",
    "frame.to_dict", "series.to_dict",
    "frame.reindex", "series.reindex", "frame.index", "series.index", "frame.first_valid_index",
    "series.first_valid_index", "frame.last_valid_index", "series.last_valid_index",
})


# calls whose function sees one value at a time (never a label)
_ELEMENT_CALLS = frozenset({"series.apply", "series.map", "frame.map", "frame.applymap"})

# calls left on pandas whose result neither shows nor uses the receiver's row labels (a merge
# numbers its rows afresh; a summary is labelled by keys, values or column names; not info()
# nor memory_usage(), which show the labels' range and the memory they hold)
_LABELS_NOT_READ = frozenset({
    "frame.merge", "pd.merge", "pd.crosstab", "frame.pivot_table", "pd.pivot_table",
    "frame.describe", "series.describe", "series.value_counts",
    "frame.value_counts", "frame.nunique", "series.nunique", "frame.corr", "frame.cov",
    "series.mode", "frame.mode", "series.unique", "frame.to_numpy", "series.to_numpy",
    "series.tolist", "series.to_list", "frame.dtypes",
    # a group's aggregate is labelled by its keys
    "groupby.agg", "groupby.aggregate", "groupby.sum", "groupby.mean", "groupby.median",
    "groupby.min", "groupby.max", "groupby.count", "groupby.size", "groupby.nunique",
    "groupby.std", "groupby.var", "groupby.first", "groupby.last", "groupby.quantile",
})
# text and date methods work value by value, as do the operations inside an element or row
# function: the result keeps the labels without reading them
_ELEMENT_PREFIXES = ("series.str.", "series.dt.", "element.")


def _imports_math(module: Any) -> bool:
    """Whether the script's top level has `import math`."""
    body = getattr(module, "body", ())
    return any(isinstance(stmt, ast.Import) and any(a.name == "math" and a.asname is None
                                                     for a in stmt.names) for stmt in body)


def _plain_format_spec(part: cst.FormattedStringExpression) -> str | None:
    """The format spec of `{x:.0f}` written out as text (no nested placeholder, no !r or =)."""
    if part.format_spec is None or part.conversion not in (None, "s") or part.equal:
        return None
    if not all(isinstance(p, cst.FormattedStringText) for p in part.format_spec):
        return None
    return "".join(p.value for p in part.format_spec)  # type: ignore[union-attr]


# methods of pandas' Index that give a Series (labelled by the values, or counted by them)
_INDEX_TO_SERIES = frozenset({"series.to_series", "series.value_counts", "series.reset_index",
                              "pd.Series", "series.to_frame"})


def _pandas_names(frame: Frame) -> Code:
    """pandas' Index of the frame's column names (its labels as pandas holds them), from no
    rows."""
    return handover.to_pandas(replace(frame, code=frame.code.method("head", 0))).attr("columns")


def _only_by_column(body: cst.CSTNode, param: str) -> bool:
    """`param` is read in `body` only as param[...] or param.<column>, never as param.name
    (the row's label) or passed on whole."""
    ok = True

    class Uses(cst.CSTVisitor):
        def visit_Subscript(self, node: cst.Subscript) -> bool:
            if isinstance(node.value, cst.Name) and node.value.value == param:
                for element in node.slice:
                    element.visit(self)
                return False
            return True

        def visit_Attribute(self, node: cst.Attribute) -> bool:
            if isinstance(node.value, cst.Name) and node.value.value == param:
                nonlocal ok
                ok = ok and node.attr.value not in ("name", "get", "items", "iteritems",
                                                    "to_dict", "keys")
                return False
            return True

        def visit_Name(self, node: cst.Name) -> None:
            nonlocal ok
            if node.value == param:
                ok = False

    body.visit(Uses())
    return ok


def _side_by_side(call: PandasCall) -> bool:
    axis = call.kwargs.get("axis")
    return isinstance(axis, Opaque) and axis.const in (1, "columns")


_PANDAS_SETTINGS = {"pandas.set_option", "pandas.reset_option", "pandas.get_option",
                    "pandas.option_context", "pandas.describe_option"}
_ELEMENT_BUILTINS = {"len", "str", "int", "float", "round", "abs"}
_CONST_BUILTINS: dict[str, Any] = {"list": list, "tuple": tuple}
_TYPE_NAMES: dict[str, type] = {"str": str, "int": int, "float": float, "bool": bool}
_FRAME_PROPERTIES = {"columns", "shape", "dtypes", "empty", "index", "values", "T", "size",
                     "ndim", "axes", "at", "iat", "attrs", "flags", "style", "plot"}
_SERIES_PROPERTIES = {"values", "shape", "dtype", "name", "index", "size", "empty", "T",
                      "is_unique", "hasnans", "array", "nbytes", "ndim", "dtypes", "plot",
                      "is_monotonic_increasing", "is_monotonic_decreasing", "at", "iat", "loc",
                      "iloc", "cat", "sparse", "list", "struct"}
# methods of `s.rolling(n)` / `s.expanding()`: each is a key `series.rolling.<method>`
_WINDOW_METHODS = {"mean", "sum", "min", "max", "median", "std", "var", "count", "apply",
                   "quantile", "skew", "kurt", "sem", "agg", "aggregate", "corr", "cov", "rank",
                   "first", "last", "nunique", "pipe"}
_DT_PROPERTIES = {"year", "month", "day", "hour", "minute", "second", "microsecond",
                  "nanosecond", "weekday", "dayofweek", "day_of_week", "dayofyear",
                  "day_of_year", "quarter", "date", "time", "is_leap_year", "days_in_month",
                  "daysinmonth", "is_month_start", "is_month_end", "days", "seconds",
                  "tz", "freq", "unit", "week", "weekofyear", "timetz", "is_quarter_start",
                  "is_quarter_end", "is_year_start", "is_year_end", "components",
                  "microseconds", "nanoseconds", "start_time", "end_time"}
_PERIOD_METHODS = {"to_timestamp", "asfreq"}
_BUILTIN_RULES = {"len": "builtin.len", "round": "{kind}.round", "abs": "{kind}.abs",
                  "list": "builtin.list", "sum": "builtin.sum", "max": "builtin.max",
                  "min": "builtin.min"}


# pandas calls whose result has one value per row of their input, in the same order and under
# the same labels (element-wise functions and windows)
_ROW_KEEPING_METHODS = frozenset({
    "apply", "map", "transform", "astype", "fillna", "ffill", "bfill", "where", "mask", "clip",
    "round", "abs", "shift", "diff", "pct_change", "cumsum", "cumprod", "cummax", "cummin",
    "cumcount", "rank", "replace", "isin", "between", "isna", "notna", "isnull", "notnull",
    "interpolate", "case_when", "convert_dtypes", "infer_objects", "rename", "copy",
})
_ROW_KEEPING_FUNCTIONS = frozenset({
    "pd.to_datetime", "pd.to_numeric", "pd.to_timedelta", "pd.cut", "pd.qcut", "pd.isna",
    "pd.notna", "pd.isnull", "pd.notnull",
})
_ROW_CHANGING_STR = frozenset({"split", "rsplit", "extract", "extractall", "partition",
                               "rpartition", "get_dummies", "cat"})


def _rows_kept(key: str, call: PandasCall) -> int | None:
    """The rows of the frame whose Series a TODO'd call keeps row for row, if it does."""
    receiver = call.receiver
    method = key.rsplit(".", 1)[-1]
    if isinstance(receiver, Accessor):
        if method in _ROW_CHANGING_STR or call.kwargs.get("expand") is not None \
                or isinstance(getattr(receiver, "grouped", None), Grouped):  # ordered by group
            return None
        base: Value | None = receiver.column
    elif isinstance(receiver, Column) and method in _ROW_KEEPING_METHODS:
        base = receiver
    elif isinstance(receiver, Grouped) and method in _ROW_KEEPING_METHODS - {"apply", "map"}:
        base = receiver
    elif receiver is None and key in _ROW_KEEPING_FUNCTIONS and call.args:
        base = call.args[0]
    elif isinstance(receiver, Frame) and method == "apply" and _row_wise(call):
        base = receiver  # df.apply(f, axis=1): one value per row, under the row's label
    else:
        return None
    frame = base.frame if isinstance(base, (Column, Grouped)) else \
        base if isinstance(base, Frame) else None
    if frame is None or frame.index:
        return None
    inputs = [v for v in (*call.args, *call.kwargs.values()) if isinstance(v, (Column, Frame))]
    if any((v.frame.rows if isinstance(v, Column) else v.rows) != frame.rows for v in inputs):
        return None  # another frame's Series: pandas aligns it on labels porter does not keep
    return frame.rows


def _joins_on_labels(key: str, call: PandasCall) -> bool:
    """A merge whose `left_index` or `right_index` may be true: it pairs rows by label."""
    return key in ("pd.merge", "pd.merge_asof", "frame.merge") \
        and any(not (isinstance(v, Opaque) and v.is_const and v.const is False)
                for k, v in call.kwargs.items() if k in ("left_index", "right_index"))


def _labels_from_zero(key: str, call: PandasCall) -> bool:
    """Whether the frame a TODO'd pandas function returns is labelled 0..n-1, so that it can
    come back to Polars (pl.from_pandas keeps no labels): not `pd.melt(ignore_index=False)`
    (each row's label repeated per column melted), a merge on the index (one side's labels),
    a read with `index_col` or a JSON layout whose keys are labels, a `pd.pivot_table`
    (labelled by its index keys), nor `pd.get_dummies` of a frame or Series whose labels a
    filter or sort made the original row numbers (or that porter does not know)."""
    kwargs = call.kwargs
    if key == "pd.pivot_table":
        return False  # labelled by the index keys' values, which pl.from_pandas dropped

    def literal(name: str, position: int | None, default: object) -> object:
        if not call.has(name, position):
            return default
        value = call.arg(name, position)
        return value.const if isinstance(value, Opaque) and value.is_const else MISSING

    if key == "pd.melt":
        return literal("ignore_index", 6, True) is True
    if key in ("pd.merge", "pd.merge_asof"):
        return all(literal(name, None, False) is False for name in ("left_index", "right_index"))
    if key.startswith("pd.read_"):
        orient = literal("orient", None, None)
        return "index_col" not in kwargs and orient in (None, "records", "values", "table")
    if key == "pd.get_dummies":
        data = call.args[0] if call.args else kwargs.get("data")
        if isinstance(data, PandasValue):
            data = data.frame
        frame = data if isinstance(data, Frame) else data.frame if isinstance(data, Column) else None
        return frame is not None and frame.labels_intact and not frame.index
    return True


def _row_wise(call: PandasCall) -> bool:
    axis = call.kwargs.get("axis", call.args[1] if len(call.args) > 1 else None)
    return isinstance(axis, Opaque) and axis.const in (1, "columns")


# methods of pandas' Resampler beside the GroupBy ones (keys `resample.<method>`)
_RESAMPLER_METHODS = frozenset({"asfreq", "interpolate", "nearest", "fillna", "backfill", "pad"})


def _groups_by_time(call: PandasCall) -> bool:
    """df.groupby(pd.Grouper(key=..., freq=...)) or a list of keys holding one."""
    by = call.kwargs.get("by", call.args[0] if call.args else None)
    if not (isinstance(by, Opaque) and by.is_const):
        return False
    keys = by.const if isinstance(by.const, (list, tuple)) else [by.const]
    return any(isinstance(k, TimeGrouperSpec) for k in keys)


# the methods of a frame indexed by a column (and of a groupby on it) that porter ports
_INDEXED_METHODS = {False: frozenset({"resample", "groupby", "reset_index"}),
                    True: frozenset({"resample"})}

# GroupBy attributes that are values, not methods
_GROUPBY_PROPERTIES = frozenset({"ngroups", "groups", "indices", "dtypes", "ndim"})

# SeriesGroupBy methods that a DataFrameGroupBy does not have (a column of the name wins there)
_SERIES_GROUPBY_ONLY = frozenset({"dtype", "is_monotonic_decreasing", "is_monotonic_increasing",
                                  "nlargest", "nsmallest", "unique"})


# methods of df.loc[label] (the row of a label) with a rule: others are pandas' on the row
_LABEL_ROW_METHODS = frozenset({"sum"})


def _prefix(value: Value) -> str:
    if getattr(value, "key_prefix", None):  # a window within groups (rules/windows.py)
        return value.key_prefix  # type: ignore[attr-defined]
    if isinstance(value, Opaque) and value.is_const and getattr(value.const, "key_prefix", None):
        return value.const.key_prefix  # the periods of pd.period_range (rules/construct.py)
    if isinstance(value, Frame):
        return "frame"
    if isinstance(value, PandasValue) and value.label_rows is not None:
        return "frame.loc.row"  # df.loc[label] (rules/selection.py)
    if isinstance(value, Column):
        return "element" if value.element else "series"
    if isinstance(value, Grouped):
        return "groupby"
    if isinstance(value, Accessor):
        return f"series.{value.kind}"
    if isinstance(value, Indexer):
        return f"{'series' if value.column is not None else 'frame'}.{value.kind}"
    if isinstance(value, Scalar) and value.pytype == "names.str":
        return "frame.columns.str"
    if isinstance(value, Scalar) and value.pytype in ("names.pairs", "names.dates"):
        return "frame.columns"
    return "value"


def _isocalendar_call(node: cst.BaseExpression) -> bool:
    """`<...>.dt.isocalendar()` without arguments."""
    return isinstance(node, cst.Call) and not node.args \
        and isinstance(node.func, cst.Attribute) and node.func.attr.value == "isocalendar" \
        and isinstance(node.func.value, cst.Attribute) and node.func.value.attr.value == "dt"


# pandas Timestamp attributes a Python datetime lacks, written with the datetime's own
# (weekday() is a method of both: it stays as written)
_TIMESTAMP_ONLY = {
    "quarter": "(({x}.month - 1) // 3 + 1)", "dayofweek": "{x}.weekday()",
    "day_of_week": "{x}.weekday()",
    "dayofyear": "{x}.timetuple().tm_yday", "day_of_year": "{x}.timetuple().tm_yday",
    "is_month_start": "({x}.day == 1)",
}
_TIMESTAMP_NAMES = {"day_name": "%A", "month_name": "%B"}

# calls that apply the script's own function, ported as expressions: what the function is given
_APPLIES = {"groupby.apply": "group", "series.apply": "value", "series.map": "value",
            "frame.apply": "row", "series.rolling.apply": "window",
            "series.expanding.apply": "window", "groupby.rolling.apply": "window",
            "groupby.expanding.apply": "window"}

# pandas functions of plain values too (pd.isna(3.0)): left as written without a column
_VALUE_FUNCTIONS = frozenset({"pandas.isna", "pandas.isnull", "pandas.notna", "pandas.notnull"})

# numpy scalars porter reads even without pandas values in the call (np.timedelta64(1, "h"))
_NUMPY_SCALARS = frozenset({"numpy.timedelta64"})
NUMPY_NAME = "np"  # numpy's name in a conversion of a script that reached it through pd.np only


def _dask_frame(value: object) -> bool:
    """A Dask DataFrame, or a column or the groups of one."""
    if isinstance(value, (Column, Grouped)):
        value = value.frame
    return isinstance(value, Frame) and value.dask


_MERGES = frozenset({"frame.merge", "pd.merge", "frame.join"})
# steps whose order (or which of equal rows is kept) Dask decides by its partitions (checked
# against dask 2026.8 on files of repeated keys)
_DASK_SORT = ("Dask's sort_values on several partitions is not stable: rows with equal keys "
              "come in another order than pandas' (sort by enough columns to leave no ties)")
_DASK_DUPLICATES = ("Dask drops duplicates per partition, then over the partitions' results: "
                    "the rows kept and their order are not pandas'")
_DASK_ORDERS = {"frame.sort_values": _DASK_SORT, "series.sort_values": _DASK_SORT,
                "frame.drop_duplicates": _DASK_DUPLICATES,
                "series.drop_duplicates": _DASK_DUPLICATES,
                "series.unique": "Dask's unique() of several partitions does not keep the order "
                                 "the values first appear in"}


def _frame_of(value: object) -> Frame:
    return value.frame if isinstance(value, (Column, Grouped)) else value  # type: ignore[return-value]


def _from_dask(call: PandasCall) -> bool:
    return any(_dask_frame(v) for v in (call.receiver, *call.args, *call.kwargs.values()))


# what only Dask's frames and series have, or where Dask's differ from pandas' (rules/dask.py)
DASK_FRAME_METHODS = frozenset({"compute", "persist", "head", "repartition", "map_partitions",
                                "to_csv", "to_parquet", "set_index", "npartitions",
                                "partitions", "get_partition", "to_delayed", "visualize",
                                "reset_index", "value_counts"})
DASK_SERIES_METHODS = frozenset({"compute", "persist", "head", "npartitions", "repartition",
                                 "map_partitions", "value_counts", "to_csv", "reset_index",
                                 "unique", "drop_duplicates"})


# Dask methods whose result is pandas' (computed)
_DASK_COMPUTED = frozenset({"dd.frame.compute", "dd.series.compute", "dd.frame.head",
                            "dd.series.head"})


def _dask_key(receiver: object, name: str) -> str | None:
    """The `dd.frame.<name>` / `dd.series.<name>` key of a method of a Dask frame or column."""
    if isinstance(receiver, Frame) and receiver.dask and name in DASK_FRAME_METHODS:
        return f"dd.frame.{name}"
    if isinstance(receiver, Column) and not receiver.element and receiver.frame.dask \
            and name in DASK_SERIES_METHODS:
        return f"dd.series.{name}"
    return None


def _module_key(qualname: str) -> str:
    module, _, name = qualname.partition(".")
    return f"{ {'pandas': 'pd', 'dask': 'dd'}.get(module, 'np')}.{name}"


def _getitem_key(receiver: Value, key: Value) -> str:
    if isinstance(receiver, Resampled):
        return "resample.getitem"
    if isinstance(receiver, Indexed):
        return f"{receiver.key_prefix}.getitem"
    if isinstance(receiver, Grouped):
        return "groupby.getitem"
    if isinstance(receiver, Parts):
        return "series.str.expand.getitem"
    if isinstance(receiver, Accessor):
        return f"series.{receiver.kind}.getitem"
    if isinstance(receiver, Column):
        return "series.getitem"
    if isinstance(key, (Column, PandasValue)):
        return "frame.getitem.mask"
    if isinstance(key, Opaque) and key.is_const:
        if isinstance(key.const, str):
            return "frame.getitem.column"
        if isinstance(key.const, list):
            return "frame.getitem.columns"
        if isinstance(key.const, slice):
            return "frame.getitem.slice"
    return "frame.getitem.column"





def _is_series_like(value: Value) -> bool:
    return isinstance(value, Column)


def _child_sites(call: PandasCall, result: Value | None) -> tuple[SiteDraft, ...]:
    sites: list[SiteDraft] = []
    for value in (call.receiver, *call.args, *call.kwargs.values()):
        if value is None:
            continue
        if isinstance(value, _TupleKey):
            for item in value.items:
                sites += item.sites
        else:
            sites += value.sites
    if result is not None:
        sites += [s for s in result.sites if s not in sites]
    seen: list[SiteDraft] = []
    for site in sites:
        if site not in seen:
            seen.append(site)
    return tuple(seen)


def _first_sentence(text: str) -> str:
    text = text.strip()
    end = text.find(". ")
    return text if end < 0 else text[: end + 1]
