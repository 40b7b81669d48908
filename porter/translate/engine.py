"""Statements: walk the script in order, keep track of what every name holds, and write the
rewritten statements (with TODO markers) back into the module."""

from __future__ import annotations

import ast
import builtins
import re
import textwrap
from dataclasses import dataclass, field, replace
from collections.abc import Callable
from itertools import product
from typing import Any

import libcst as cst
from libcst.metadata import MetadataWrapper, ParentNodeProvider, PositionProvider

from porter.analysis.imports import ImportFacts, collect_imports
from porter.analysis.mutations import IN_PLACE_METHODS, changes_in_place, mutated_names
from porter.emit import code as emit
from porter.emit.code import Code
from porter.model import SiteDraft
from porter.translate import handover, imports as import_edits
from porter.translate.functions import (
    COLUMNS, EXPRESSION_ROWS, discover_functions, function_definitions, learn_functions,
    hand_over_module_frames, handed_over_inside, marked_as_applied, module_frames_in_body,
    module_names_of,
    ported_where_applied, removed_note,
)
from porter.rules.assign import FRAME_STAYS_PANDAS, INTERVAL_MAKERS
from porter.translate.writes import FileChanges, FreshSchemas, batch_writes, is_sink_text
from porter.translate.context import (
    PandasCall, Unsupported, expr_in, grouping_code, labelled_frame, select_columns, value_dtype,
    with_column_updates, with_row_labels,
)
from porter.translate.evaluate import Evaluator, Services, chain_receivers, parts_current
from porter.translate.values import (
    MISSING, Accessor, Column, Frame, Grouped, Indexed, Module, Opaque, PandasValue, Parts, Scalar, Value,
    fresh_token, is_pandas,
)

TODO_PREFIX = "# TODO(porter): "
MAX_COMMENT = 100


# a loop or branch header longer than this is laid out one step per line
HEADER_LENGTH = 60


@dataclass
class Translation:
    module: cst.Module
    sites: list[SiteDraft] = field(default_factory=list)


def translate_module(module: cst.Module, services: Services) -> Translation:
    # the module is never changed in place (rewrites build new nodes), so no defensive copy
    wrapper = MetadataWrapper(module, unsafe_skip_copy=True)
    metadata = wrapper.resolve_many([PositionProvider, ParentNodeProvider])
    positions, parents = metadata[PositionProvider], metadata[ParentNodeProvider]
    module = wrapper.module
    facts = collect_imports(module)

    def position(node: cst.CSTNode) -> tuple[int, int]:
        pos = positions.get(node)
        if pos is None:  # a node porter made (a call without inplace=True): its statement's lines
            return services.statement_lines
        return (pos.start.line, pos.end.line)

    def inside_from_pandas(node: cst.CSTNode) -> bool:
        parent = parents.get(node)
        if isinstance(parent, cst.Arg):
            call = parents.get(parent)
            return isinstance(call, cst.Call) and module.code_for_node(call.func) == "pl.from_pandas"
        return False

    def shown(node: cst.CSTNode) -> bool:
        parent = parents.get(node)
        if isinstance(parent, (cst.Expr, cst.FormattedStringExpression)):
            return True
        if isinstance(parent, cst.Arg) and parent.keyword is None and not parent.star:
            call = parents.get(parent)
            return isinstance(call, cst.Call) and module.code_for_node(call.func) in ("print", "display")
        return False

    def printed(node: cst.CSTNode) -> bool:
        parent = parents.get(node)
        if isinstance(parent, cst.Arg) and parent.keyword is None and not parent.star:
            call = parents.get(parent)
            return isinstance(call, cst.Call) and module.code_for_node(call.func) == "print"
        return False

    lines: list[str] = []

    def glued(node: cst.CSTNode) -> bool:
        pos = positions.get(node)
        if pos is None or pos.start.column == 0:
            return False
        if not lines:
            lines.extend(module.code.splitlines())
        before = lines[pos.start.line - 1][pos.start.column - 1:pos.start.column]
        return before.isalnum() or before == "_"

    services.code_for = module.code_for_node
    services.name_uses = _name_counts(module)
    services.label_free_loops = label_free_loops(module)
    services.name_lines = {name: [positions[n].start.line for n in nodes]
                           for name, nodes in _name_nodes(module).items()}
    # where each change starts (line, column): its line says whether it comes after a statement,
    # its column orders it against statements sharing that line (`a = x; a["c"] = y`)
    services.changed_at = {name: [(p.start.line, p.start.column) for n in nodes
                                  if (p := positions.get(n)) is not None]
                           for name, nodes in changes_in_place(module).items()}
    services.changed_in_place = {name: [line for line, _ in starts]
                                 for name, starts in services.changed_at.items()}
    services.position = position
    services.start = lambda node: (p.start.line, p.start.column) if (p := positions.get(node)) else None
    services.glued = glued
    services.mutated = mutated_names(module)
    services.inside_from_pandas = inside_from_pandas
    services.shown = shown
    services.printed = printed
    functions = discover_functions(module)
    services.functions = {f.name: f for f in functions}
    services.function_defs = function_definitions(module)
    try:
        services.python_module = ast.parse(module.code)
    except (SyntaxError, ValueError, RecursionError, MemoryError):
        services.python_module = None
    # files the script writes, moves or removes: a read of one of them before the change is
    # collected there (bind), and --data's copy of one written before it is read is stale
    files = FileChanges(services.python_module)
    if services.schema_lookup is not None and not isinstance(services.schema_lookup, FreshSchemas):
        services.schema_lookup = FreshSchemas(services.schema_lookup, files,
                                              lambda: services.statement_lines)
    # a call of the script's own function that changes its argument in place changes it too
    for name, _, call in _changed_by_functions(module, services.functions):
        services.changed_in_place.setdefault(name, []).append(position(call)[0])
        if (start := services.start(call)) is not None:
            services.changed_at.setdefault(name, []).append(start)

    # Which parameters of the script's own functions take frames is learnt from the calls:
    # run the pass until that stops changing (each round can learn one more link of a chain
    # of helpers).
    # Each pass starts afresh what it learns from the walk: the label reads and what each plan
    # feeds are the last pass's (an earlier pass may have handed frames over that the
    # functions learnt since keep in Polars).
    # A function whose body was ported once for the texts its calls pass in the analysis
    # passes but not in the last pass (texts_followed) is learnt again without that (twice at
    # most): its callers must not take what it returns for frames the last pass did not write.
    def analysis_pass() -> dict[str, Any]:
        """One walk that writes nothing, what it learns from the walk started afresh; the
        functions as this walk learnt them."""
        services.call_sites = {}
        services.consumers, services.frame_parents = {}, {}
        services.row_counts, services.plan_texts = {}, {}
        services.materialized = set()
        services.applied_functions, services.applied_kinds = {}, {}
        walker = _Walker(services, facts, emit_code=False, files=files)
        walker.block(module.body, _initial_env(facts), module.default_indent, "")
        return learn_functions(services, walker.returns, walker.returned_of, walker.body_values,
                               walker.choice_returns)

    for _attempt in range(2):
        for _ in range(10):
            services.labels_needed = set()
            services.label_functions, services.pandas_functions = set(), set()
            updated = analysis_pass()
            if updated == services.functions:
                break
            services.functions = updated
        # Then, with the functions known, the frames pandas must make for their row labels: a
        # label read found in one pass can make an earlier statement pandas' in the next, back
        # along a chain of filters and column assignments, until no new one is found (each pass
        # finds one more statement or stops, so there are never more passes than lines).
        # A function whose result's labels are read becomes pandas' (pandas_functions), and a
        # frame made by pandas passed to a function keeps it from taking Polars frames: what the
        # functions take is learnt again after each pass.
        for _ in range(module.code.count("\n") + 1
                       if services.labels_needed or services.label_functions else 0):
            labels_before = set(services.labels_needed)
            updated = analysis_pass()
            if services.labels_needed == labels_before and updated == services.functions:
                break
            services.functions = updated

        services.collect_at = plans_to_collect(
            services.consumers, services.frame_parents, frozenset(services.materialized),
            services.row_counts, lambda binding: _cheap_to_recount(binding, services))
        services.call_sites = {}
        walker = _Walker(services, facts, emit_code=True, files=files)
        body, _ = walker.block(module.body, _initial_env(facts), module.default_indent, "")
        if not walker.texts_refused_late:
            break
        services.texts_refused |= walker.texts_refused_late
    new_module = module.with_changes(body=body)
    if walker.sites:
        new_module = import_edits.fix_imports(new_module, facts, module)
    return Translation(new_module, _unique(walker.sites))


def _written_with(text: str, names: dict[str, str]) -> str:
    """`text` with each identifier of `names` (emit.ParamText) replaced by its code."""
    for mark, code in names.items():
        text = re.sub(rf"\b{re.escape(mark)}\b", lambda _: code, text)
    return text


def _rebinds(definition: cst.FunctionDef, names: set[str]) -> bool:
    """Whether the function's body binds one of `names` anew (an assignment, a loop, `del`,
    `global`, a walrus) or a function, lambda or comprehension in it takes one as its own."""
    try:
        tree = ast.parse(textwrap.dedent(cst.Module([]).code_for_node(definition)).strip())
    except (SyntaxError, ValueError, RecursionError):
        return True
    function = tree.body[0] if tree.body else None
    if not isinstance(function, (ast.FunctionDef, ast.AsyncFunctionDef)):
        return True
    for node in (n for stmt in function.body for n in ast.walk(stmt)):
        if isinstance(node, ast.Name) and node.id in names and not isinstance(node.ctx, ast.Load):
            return True
        if isinstance(node, (ast.Global, ast.Nonlocal)) and names & set(node.names):
            return True
        if isinstance(node, ast.arguments) and names & {
                a.arg for a in (*node.posonlyargs, *node.args, *node.kwonlyargs,
                                *((node.vararg,) if node.vararg else ()),
                                *((node.kwarg,) if node.kwarg else ()))}:
            return True
        if isinstance(node, (ast.FunctionDef, ast.AsyncFunctionDef, ast.ClassDef)) and node.name in names:
            return True
        if isinstance(node, (ast.Import, ast.ImportFrom)) and names & {
                (a.asname or a.name).split(".")[0] for a in node.names}:
            return True
        if isinstance(node, ast.ExceptHandler) and node.name in names:
            return True
    return False


def _site_written_with(site: SiteDraft, names: dict[str, str]) -> SiteDraft:
    suggestion = None if site.suggestion is None else _written_with(site.suggestion, names)
    return replace(site, message=_written_with(site.message, names), suggestion=suggestion)


def _initial_env(facts: ImportFacts) -> dict[str, Value]:
    return {name: Module(emit.atom(name), qualname=qual) for name, qual in facts.names.items()}


def _unique(sites: list[SiteDraft]) -> list[SiteDraft]:
    seen: set[SiteDraft] = set()
    out = []
    for site in sites:
        if site not in seen:
            seen.add(site)
            out.append(site)
    return sorted(out, key=lambda s: (s.line, s.end_line))


# -- the walk over statements ---------------------------------------------------------------

# TODOs of calls that read the row labels a filter or sort left (see labels_as_column)
_LABEL_TODOS = frozenset({"frame.reset_index", "series.reset_index"})


class _Walker:
    def __init__(self, services: Services, facts: ImportFacts, emit_code: bool,
                 files: FileChanges | None = None) -> None:
        self.services = services
        self.files = files
        self.facts = facts
        self.emit_code = emit_code
        self.sites: list[SiteDraft] = []
        self.returns: dict[str, list[Value]] = {}
        self.returned_of: dict[str, list[str | None]] = {}  # see returned_column
        self.body_values: dict[str, list[Value]] = {}  # names bound in functions' bodies
        # what a function whose body is ported once for the texts its calls pass returns for
        # each of them (texts_followed): ((param, text), ...) -> the values returned
        self.choice_returns: dict[str, list[tuple[tuple[tuple[str, str], ...], list[Value]]]] = {}
        self.texts_refused_late: set[str] = set()  # see translate_module
        self.param_frames: dict[int, str] = {}  # rows of frame parameters: their names
        self.handed_from: dict[str, int] = {}  # see note_handed_over
        self.function: str | None = None
        self.header_sites: list[SiteDraft] = []  # sites in the header of the compound statement at hand
        self.statement_key = 0  # the simple statement being rewritten
        self.current_small: cst.CSTNode = cst.Pass()
        self.shared_line = False  # the statement shares its line with others (`a = x; a["c"] = y`)
        self.small_start: tuple[int, int] | None = None  # where it starts: line, column
        self.loop_depth = 0
        self.sink_run: int | None = None  # the execution a run of consecutive writes shares
        self.has_next = False  # the statement at hand has another after it in its block
        self.carried: list[cst.EmptyLine] = []  # comments for the next statement (function_def)
        # names bound to a CategoricalDtype or a list (`order = pd.CategoricalDtype([...])`),
        # which handover.text_categories reads through the name
        self.dtype_names: dict[str, cst.BaseExpression] = {}
        self.period_names: set[str] = set()  # names bound to pandas' Period values
        # the loops and functions around the statement at hand, outermost first (first and
        # last line): a statement in them runs again after the lines that follow it
        self.spans: list[tuple[int, int]] = []
        # str.extract's columns kept in the text's frame under names of their own (see
        # parts_as_columns): the line of the name's last read -> (frame, those columns)
        self.parts_drops: dict[int, tuple[str, tuple[str, ...]]] = {}
        services.changed_only_afresh = self.changed_only_afresh
        # the names holding such frames of parts: their text's frame, and each label's column
        self.parts_columns: dict[str, tuple[str, dict[object, str]]] = {}
        self._bound: dict[str, list[int]] | None = None  # see bound_lines
        self._bindings: list[tuple[list[str], ast.AST]] = []

    # blocks ---------------------------------------------------------------------------------
    def block(self, body: Any, env: dict[str, Value], unit: str, indent: str) -> tuple[list[Any], dict[str, Value]]:
        out: list[Any] = []
        body = list(body)
        skipped: int | None = None
        for i, stmt in enumerate(body):
            if i == skipped:
                continue  # the loop that fills the frame the statement before it made
            if i + 1 < len(body) and self.group_appends(stmt, body[i + 1], env):
                skipped = i + 1
            if not isinstance(stmt, cst.SimpleStatementLine):
                self.sink_run = None
            self.has_next = i < len(body) - 1
            # the comments of a statement left out (a function ported where applied) go on the
            # next statement of this block, not inside it (the body of a def that follows)
            pending, self.carried = self.carried, []
            new, env = self.statement(stmt, env, unit, indent)
            if pending and new and hasattr(new[0], "leading_lines"):
                new = [new[0].with_changes(leading_lines=[*pending, *new[0].leading_lines]),
                       *new[1:]]
            elif pending:
                self.carried = [*pending, *self.carried]
            out.extend(new)
        self.sink_run = None
        if self.emit_code:
            out = batch_writes(out, body)
        return out, env

    def indented(self, block: cst.BaseSuite, env: dict[str, Value], unit: str,
                 indent: str) -> tuple[cst.BaseSuite, dict[str, Value]]:
        if isinstance(block, cst.IndentedBlock):
            inner = indent + (block.indent if block.indent is not None else unit)
            body, env = self.block(block.body, env, unit, inner)
            return block.with_changes(body=body), env
        body, env = self.block([cst.SimpleStatementLine(body=list(block.body))], env, unit, indent)
        if len(body) == 1 and isinstance(body[0], cst.SimpleStatementLine):
            return block.with_changes(body=body[0].body), env
        return cst.IndentedBlock(body=body), env

    def statement(self, stmt: Any, env: dict[str, Value], unit: str, indent: str) -> tuple[list[Any], dict[str, Value]]:
        outer, self.header_sites = self.header_sites, []
        new, env = self._statement(stmt, env, unit, indent)
        header_sites, self.header_sites = self.header_sites, outer
        if header_sites and len(new) == 1 and hasattr(new[0], "leading_lines") \
                and not isinstance(new[0], cst.SimpleStatementLine):
            comments = _todo_comments(header_sites, new[0])
            if comments:
                new = [new[0].with_changes(leading_lines=[*new[0].leading_lines, *comments])]
        return new, env

    def _statement(self, stmt: Any, env: dict[str, Value], unit: str, indent: str) -> tuple[list[Any], dict[str, Value]]:
        env = dict(env)
        if isinstance(stmt, cst.SimpleStatementLine):
            return self.simple_line(stmt, env, indent), env
        if isinstance(stmt, cst.FunctionDef):
            if self.has_next and not self.carried and ported_where_applied(stmt, self.services) \
                    and self.services.name_uses.get(stmt.name.value, 0) > 1:
                # every use is an apply porter wrote as expressions (group_by().agg(), or
                # one expression of the column): the function is no longer run, and keeping
                # it may keep the pandas import (a third of a second and 100 MiB at start-up);
                # its comments stay, with a note
                kinds = self.services.applied_kinds.get(stmt.name.value)
                self.carried = [*stmt.leading_lines, *removed_note(stmt, kinds)]
                return [], env
            return [self.function_def(stmt, env, unit, indent)], env
        if isinstance(stmt, cst.If):
            return self.if_stmt(stmt, env, unit, indent)
        if isinstance(stmt, (cst.For, cst.While)):
            return self.loop(stmt, env, unit, indent)
        if isinstance(stmt, cst.Match):
            return self.match_stmt(stmt, env, unit, indent)
        if isinstance(stmt, cst.With):
            items = [item.with_changes(item=self.header(item.item, env, item)) for item in stmt.items]
            body, env = self.indented(stmt.body, env, unit, indent)
            return [stmt.with_changes(items=items, body=body)], env
        if isinstance(stmt, cst.Try):
            kept = self.try_on_pandas(stmt, env)
            if kept is not None:
                return kept
            body, env = self.indented(stmt.body, env, unit, indent)
            handlers = []
            for handler in stmt.handlers:
                h_body, env = self.indented(handler.body, env, unit, indent)
                handlers.append(handler.with_changes(body=h_body))
            changes: dict[str, Any] = {"body": body, "handlers": handlers}
            for part in ("orelse", "finalbody"):
                clause = getattr(stmt, part)
                if clause is not None:
                    c_body, env = self.indented(clause.body, env, unit, indent)
                    changes[part] = clause.with_changes(body=c_body)
            return [stmt.with_changes(**changes)], env
        return [stmt], env

    def function_def(self, stmt: cst.FunctionDef, env: dict[str, Value], unit: str, indent: str) -> Any:
        if ported_where_applied(stmt, self.services) \
                and self.services.applied_kinds.get(stmt.name.value, {"group"}) == {"group"}:
            return marked_as_applied(stmt)  # its pandas body is no longer run: left as written
        if stmt.name.value in self.services.pandas_functions:
            # pandas code reads the row labels of what it returns: it stays pandas code, as
            # written (Engine.made_by_pandas), and its callers hand it pandas frames
            line, _ = self.services.position(stmt.name)
            site = SiteDraft("frame.labels", "handover", "todo", 0.0,
                             f"pandas code reads the row labels of what {stmt.name.value} returns, "
                             "the original row numbers after a filter or sort: it stays pandas "
                             "code", line, line)
            self.record((site,))
            return stmt.with_changes(leading_lines=[*stmt.leading_lines, *_todo_comments([site], stmt)])
        function = self.services.functions.get(stmt.name.value)
        local = dict(env)
        for param in (*stmt.params.posonly_params, *stmt.params.params, *stmt.params.kwonly_params):
            name = param.name.value
            if function is not None and name in function.frame_params:
                columns, dtypes = dict(function.param_schemas).get(name, (None, ()))
                # labelled as every call's frame is (its index columns), where they agree
                index, unnamed = dict(function.param_indexes).get(name, ((), False))
                local[name] = Frame(emit.atom(name), labels_intact=False, columns=columns,
                                    dtypes=dtypes, index=index, index_unnamed=unnamed)
                self.param_frames[local[name].rows] = name  # type: ignore[union-attr]
            elif function is not None and name in function.column_params:
                # a Polars expression: the caller's column (the rows are the caller's, unknown)
                rows = Frame(emit.atom(EXPRESSION_ROWS), rows=function.column_rows or 0,
                             labels_intact=False)
                local[name] = Column(emit.atom(name), frame=rows,
                                     dtype=dict(function.column_dtypes).get(name) or None)
                local[EXPRESSION_ROWS] = rows  # names bound to its expressions stay expressions
            elif function is not None and name in dict(function.param_consts):
                local[name] = Opaque(emit.atom(name), const=dict(function.param_consts)[name])
            elif function is not None and name in dict(function.param_choices):
                local[name] = Opaque(emit.atom(name), choices=dict(function.param_choices)[name],
                                     pytype="str")
            else:
                local.pop(name, None)
        kept = module_frames_in_body(stmt, local, self.services)
        if kept is not None:
            # `global df` rebinding the module's frame: the body stays as written (pandas), and
            # the statements that call it hand the frame to pandas first
            self.record((kept,))
            return stmt.with_changes(leading_lines=[*stmt.leading_lines, *_todo_comments([kept], stmt)])
        outer = self.function
        self.function = self.services.function_at_hand = stmt.name.value
        self.spans.append(self.services.position(stmt))
        followed = None
        if function is not None and function.param_choices \
                and stmt.name.value not in self.services.texts_refused:
            # (the code of each walk is written, in the analysis passes too: it is compared)
            emit_code, self.emit_code = self.emit_code, True
            followed = self.texts_followed(stmt, function, local, unit, indent)
            self.emit_code = emit_code
            if followed is None and emit_code and function.returns_by_choice:
                self.texts_refused_late.add(stmt.name.value)
        if followed is not None:
            body = followed
        else:
            body = self.function_body(stmt, local, unit, indent)
        self.spans.pop()
        self.function = self.services.function_at_hand = outer
        return stmt.with_changes(body=body)

    def function_body(self, stmt: cst.FunctionDef, local: dict[str, Value], unit: str,
                      indent: str) -> Any:
        saved, header_saved = len(self.sites), len(self.header_sites)
        body, _ = self.indented(stmt.body, local, unit, indent)
        if handed_over_inside(stmt, body, local, self.services):
            # a module's frame handed to pandas in the body: ported again with it left pandas
            del self.sites[saved:], self.header_sites[header_saved:]
            body, _ = self.indented(stmt.body, local, unit, indent)
        return body

    def texts_followed(self, stmt: cst.FunctionDef, function: Any, local: dict[str, Value],
                       unit: str, indent: str) -> Any:
        """The body of a function whose calls pass different texts for a parameter
        (`kg_table(bookings, "baker")`, `kg_table(deliveries, "member")`: a column name),
        ported once with the parameter standing for its texts (emit.ParamText), the way a
        Polars user writes it (`.group_by(who)`). It is kept only when, for each text the calls
        pass, writing that text where the parameter stands gives exactly the code porter writes
        for a body given that text, and the body leaves no TODO and returns frames: then it
        computes what pandas computes at every call. What each text makes the function return
        (its columns, named by that text) is learnt for its calls (choice_returns,
        LocalFunction.returns_by_choice). None otherwise (the parameter is then unknown text)."""
        name = stmt.name.value
        params = [p for p, _ in function.param_choices]
        combos = list(product(*(texts for _, texts in function.param_choices)))
        if not combos or len(combos) > 8:
            return None
        if module_names_of(stmt, self.services.function_defs)[0] & self.services.function_defs.keys():
            return None  # it calls the script's functions: they would learn the stand-in text
        if _rebinds(stmt, set(params)):
            return None  # the name would not hold the call's text everywhere in the body
        marks = {p: emit.ParamText(p) for p in params}
        sites, header_sites = len(self.sites), len(self.header_sites)
        returns = list(self.returns.get(name, []))
        returned_of = list(self.returned_of.get(name, []))
        body_values = list(self.body_values.get(name, []))
        calls = {k: list(v) for k, v in self.services.call_sites.items()}

        def restore() -> None:
            del self.sites[sites:], self.header_sites[header_sites:]
            self.returns[name], self.returned_of[name] = list(returns), list(returned_of)
            self.body_values[name] = list(body_values)
            self.services.call_sites = {k: list(v) for k, v in calls.items()}

        def walk(texts: dict[str, str]) -> tuple[str, list[SiteDraft], list[SiteDraft], list[Value]] | None:
            restore()
            bound = {**local, **{p: Opaque(emit.atom(p), const=t, pytype="str") for p, t in texts.items()}}
            for param in function.frame_params:
                frame = bound.get(param)
                if isinstance(frame, Frame):
                    # which columns it has is not known to every walk alike (the parameter's
                    # text is none of them); the column a text names has the type every call's
                    # frame gives it
                    dtypes = tuple((texts[text], dtype) for f, text, dtype in function.text_column_dtypes
                                   if f == param and text in texts)
                    bound[param] = replace(frame, columns=None, dtypes=(*frame.dtypes, *dtypes))
            body = self.function_body(stmt, bound, unit, indent)
            own_sites, own_header = self.sites[sites:], self.header_sites[header_sites:]
            made = self.returns.get(name, [])[len(returns):]
            if any(site.status == "todo" for site in (*own_sites, *own_header)) or not made \
                    or not all(isinstance(v, Frame) for v in made):
                return None
            code = cst.Module([]).code_for_node(stmt.with_changes(body=body))
            return code, own_sites, own_header, made

        general = walk(marks)
        if general is None:
            restore()
            return None
        text, general_sites, general_header, _ = general
        learnt: list[tuple[tuple[tuple[str, str], ...], list[Value]]] = []
        for combo in combos:
            texts = dict(zip(params, combo))
            own = walk(texts)
            if own is None or own[0] != _written_with(text, {marks[p]: emit.lit(t).text
                                                           for p, t in texts.items()}):
                restore()
                return None
            learnt.append((tuple(sorted(texts.items())), own[3]))
        restore()
        # the body as ported once, with the parameter named where its texts stood
        named = {marks[p]: p for p in params}
        written = cst.parse_statement(_written_with(text, named))
        if not isinstance(written, cst.FunctionDef):
            return None
        self.sites.extend(_site_written_with(site, named) for site in general_sites)
        self.header_sites.extend(_site_written_with(site, named) for site in general_header)
        self.returns[name] = [*returns, *(v for _, made in learnt for v in made)]
        self.choice_returns[name] = learnt
        return written.body

    def if_stmt(self, stmt: cst.If, env: dict[str, Value], unit: str, indent: str) -> tuple[list[Any], dict[str, Value]]:
        test = self.header(stmt.test, env, stmt)
        body, env_body = self.indented(stmt.body, env, unit, indent)
        orelse = stmt.orelse
        env_else = env
        if isinstance(orelse, cst.If):
            new_else, env_else = self.if_stmt(orelse, env, unit, indent)
            orelse = new_else[0]
        elif isinstance(orelse, cst.Else):
            else_body, env_else = self.indented(orelse.body, env, unit, indent)
            orelse = orelse.with_changes(body=else_body)
        after: list[Any] = []
        env_body, env_else = dict(env_body), dict(env_else)  # `env_else` may be `env` itself
        for name in sorted(env_body.keys() & env_else.keys()):
            # one branch handed the frame to pandas, the other kept it in Polars: the Polars
            # branch hands it over too, so the code after the `if` meets a pandas frame
            # either way (and takes it back to Polars where it can)
            values = (env_body[name], env_else[name])
            if not (any(isinstance(v, PandasValue) for v in values)
                    and any(isinstance(v, Frame) for v in values)):
                continue
            frame = next(v for v in values if isinstance(v, Frame))
            self.note_handed_over(name, frame)
            line = cst.parse_statement(
                f"# handed to pandas, as the other branch does\n"
                f"{name} = {handover.to_pandas(frame).text}\n")
            if isinstance(env_body[name], Frame) and isinstance(body, cst.IndentedBlock):
                body = body.with_changes(body=[*body.body, line])
            elif isinstance(env_else[name], Frame) and orelse is None:
                orelse = cst.Else(body=cst.IndentedBlock(body=[line]))
            elif isinstance(env_else[name], Frame) and isinstance(orelse, cst.Else) \
                    and isinstance(orelse.body, cst.IndentedBlock):
                orelse = orelse.with_changes(body=orelse.body.with_changes(
                    body=[*orelse.body.body, line]))
            else:  # an elif chain or a one-line branch: checked once the `if` is done
                after.append(cst.parse_statement(
                    f"if isinstance({name}, pl.LazyFrame):  # handed to pandas, as other branches do\n"
                    f"    {name} = {name}.collect().to_pandas()\n"))
            back = PandasValue(emit.atom(name), frame=_after_change(name, frame, None))
            env_body[name] = env_else[name] = back
        return [stmt.with_changes(test=test, body=body, orelse=orelse), *after], \
            _merge(env_body, env_else)

    def match_stmt(self, stmt: cst.Match, env: dict[str, Value], unit: str, indent: str) -> tuple[list[Any], dict[str, Value]]:
        """`match subject: case ...:` is an `if`/`elif` chain: the subject and each guard are
        read as an `if` test is, each case body is walked from the names as they were before
        the statement, and the names hold after it what every path leaves them (a path that
        matches no case leaves them as they were)."""
        subject = self.header(stmt.subject, env, stmt)
        cases = []
        envs: list[dict[str, Value]] = []
        catches_all = False
        for case in stmt.cases:
            case_env = dict(env)
            for name in _pattern_names(case.pattern):
                case_env[name] = Opaque(emit.atom(name))  # what the pattern captures
            guard = self.header(case.guard, case_env, case) if case.guard is not None else None
            body, after = self.indented(case.body, case_env, unit, indent)
            cases.append(case.with_changes(body=body, guard=guard))
            envs.append(dict(after))
            catches_all = catches_all or case.guard is None and _catches_all(case.pattern)
        if not catches_all:
            envs.append(dict(env))
        after_lines: list[Any] = []
        for name in sorted(set.intersection(*(set(e) for e in envs))):
            # one path handed the frame to pandas, another kept it in Polars: after the
            # statement it is a pandas frame either way (and comes back to Polars where it can)
            values = [e[name] for e in envs]
            if not (any(isinstance(v, PandasValue) for v in values)
                    and any(isinstance(v, Frame) for v in values)):
                continue
            frame = next(v for v in values if isinstance(v, Frame))
            self.note_handed_over(name, frame)
            after_lines.append(cst.parse_statement(
                f"if isinstance({name}, pl.LazyFrame):  # handed to pandas, as other cases do\n"
                f"    {name} = {name}.collect().to_pandas()\n"))
            back = PandasValue(emit.atom(name), frame=_after_change(name, frame, None))
            for e in envs:
                e[name] = back
        merged = envs[0]
        for other in envs[1:]:
            merged = _merge(merged, other)
        return [stmt.with_changes(subject=subject, cases=cases), *after_lines], merged

    def loop(self, stmt: cst.For | cst.While, env: dict[str, Value], unit: str, indent: str) -> tuple[list[Any], dict[str, Value]]:
        if isinstance(stmt, cst.For):
            appended = self.iterrows_appends(stmt, env, indent)
            if appended is not None:
                return appended, env
            handed, site = self.frames_changed_by_a_loop(stmt, env)
            if handed:
                new, after = self.loop(stmt, env, unit, indent)
                self.record((site,))
                first = cst.parse_statement(handed[0] + "\n")
                first = first.with_changes(
                    leading_lines=[*new[0].leading_lines, *_todo_comments([site], first)])
                rest = [cst.parse_statement(line + "\n") for line in handed[1:]]
                return [first, *rest, new[0].with_changes(leading_lines=()), *new[1:]], after
        changes: dict[str, Any] = {}
        header_from, header_sites_from = len(self.sites), len(self.header_sites)
        pairs = self.column_pairs(stmt, env) if isinstance(stmt, cst.For) else None
        if pairs is not None:
            # `for name, col in df.items():` -> a loop over the column names, `col` standing
            # for the column of that name (pl.col(name)) in the body
            frame, key, series = pairs
            iter_value = Evaluator(env, self.services).dispatch(
                "frame.columns", PandasCall(frame, "columns", node=stmt.iter), stmt.iter)
            changes["iter"] = self.header(stmt.iter, env, stmt, iter_value)
            changes["target"] = cst.Name(key)
            loop_env = dict(env)
            loop_env[key] = Opaque(emit.atom(key), pytype="str",
                                   choices=tuple(frame.columns or ()))
            loop_env[series] = Column(emit.col(emit.atom(key)), frame=frame, name=None)
        elif isinstance(stmt, cst.For):
            iter_value = self.evaluate(stmt.iter, env)
            if isinstance(iter_value, Frame):  # `for col in df:` iterates pandas' column names
                iter_value = Evaluator(env, self.services).dispatch(
                    "frame.columns", PandasCall(iter_value, "columns", node=stmt.iter), stmt.iter)
            if isinstance(iter_value, Column):
                # a loop over a Series reads its values as pandas gives them (NaN, not None)
                iter_value = replace(iter_value, code=handover.python_values(iter_value))
            changes["iter"] = self.header(stmt.iter, env, stmt, iter_value)
            if isinstance(stmt.target, cst.Tuple):
                from porter.rules.legacy import written_for_older_pandas
                if written_for_older_pandas(self.services.python_module):
                    changes["iter"] = _keys_as_values(changes["iter"])
            loop_env = dict(env)
            pytype = "str" if _iterates_names(iter_value) else None
            names = tuple(iter_value.const) if pytype == "str" and isinstance(iter_value, Opaque) \
                and iter_value.is_const and isinstance(stmt.target, cst.Name) else ()
            for name in _target_names(stmt.target):
                loop_env[name] = Opaque(emit.atom(name), pytype=pytype, choices=names)
            ranged = iter_value.const if isinstance(iter_value, Opaque) and iter_value.is_const \
                else None
            if getattr(ranged, "kept", None) == "loop" and isinstance(stmt.target, cst.Name):
                # pandas' own Periods of pd.period_range (rules/datetimes.py): their dtype
                # name, which a column of periods of that kind is compared with (rules/ops.py)
                loop_env[stmt.target.value] = Opaque(emit.atom(stmt.target.value),
                                                     pytype=ranged.period)
            if isinstance(iter_value, Scalar) and iter_value.items == "text" \
                    and isinstance(stmt.target, cst.Name):
                # pandas' text, nan for a missing one: null again inside Polars expressions
                loop_env[stmt.target.value] = Scalar(emit.atom(stmt.target.value), pytype="text")
        else:
            changes["test"] = self.header(stmt.test, env, stmt)
            loop_env = dict(env)
        self.loop_depth += 1
        self.spans.append(self.services.position(stmt))
        # A second round through the body sees what the first round changed.
        emit_code, self.emit_code = self.emit_code, False
        saved, header_sites_to = len(self.sites), len(self.header_sites)
        _, after = self.indented(stmt.body, loop_env, unit, indent)
        first_todos = [site for site in self.sites[saved:] if site.status == "todo"]
        del self.sites[saved:]
        self.emit_code = emit_code
        widened = _merge(loop_env, after)
        # A frame the body hands over to pandas is a pandas frame from the first iteration on:
        # it is handed over once before the loop, never left as a LazyFrame inside it.
        before: list[Any] = []
        handed: dict[str, Frame] = {}
        for name, value in loop_env.items():
            if isinstance(value, Frame) and isinstance(after.get(name), PandasValue):
                widened[name] = PandasValue(emit.atom(name))  # pandas in every iteration
                handed[name] = value
                self.note_handed_over(name, value)
                line = f"{name} = {handover.to_pandas(value).text}\n"
                before.append(cst.parse_statement(line))
            elif isinstance(value, Column) and isinstance(after.get(name), PandasValue):
                # a Series kept in a name that the body computes with pandas values: pandas'
                # Series in every iteration, made once before the loop
                widened[name] = PandasValue(emit.atom(name))
                before.append(cst.parse_statement(f"{name} = {handover.to_pandas(value).text}\n"))
        if handed:
            # the header runs after the hand-over too: it reads the pandas frames
            header_env = {**env, **{name: PandasValue(emit.atom(name)) for name in handed}}
            del self.sites[header_from:saved]
            del self.header_sites[header_sites_from:header_sites_to]
            if isinstance(stmt, cst.For):
                iter_value = self.evaluate(stmt.iter, header_env)
                if isinstance(iter_value, Column):
                    iter_value = replace(iter_value, code=handover.to_pandas(iter_value))
                changes["iter"] = self.header(stmt.iter, header_env, stmt, iter_value)
            else:
                changes["test"] = self.header(stmt.test, header_env, stmt)
        body, after = self.indented(stmt.body, widened, unit, indent)
        self.loop_depth -= 1
        self.spans.pop()
        changes["body"] = body
        if stmt.orelse is not None:
            else_body, after = self.indented(stmt.orelse.body, after, unit, indent)
            changes["orelse"] = stmt.orelse.with_changes(body=else_body)
        if before and self.emit_code:
            # the TODOs that keep the frame on pandas in the body are marked where it crosses
            self.record(tuple(first_todos))
            before[0] = before[0].with_changes(
                leading_lines=[*stmt.leading_lines, *_todo_comments(first_todos, before[0])])
            return [*before, stmt.with_changes(**changes, leading_lines=())], \
                _after_loop(_merge(widened, after), handed)
        return [stmt.with_changes(**changes)], \
            _after_loop(_merge(env if not before else widened, after), handed)

    def try_on_pandas(self, stmt: cst.Try, env: dict[str, Value]) -> tuple[list[Any], dict[str, Value]] | None:
        """A `try` (with `except` clauses) around pandas code stays pandas code, with the frames
        it reads handed over first and back after it: Polars runs a plan where it is collected,
        later and outside the `try`, and raises its own exceptions (not ValueError or KeyError),
        so a handler would not run where pandas runs it. None when the statement uses no
        pandas."""
        if not stmt.handlers:
            return None
        read = _names_read(self.services.code_for(stmt))
        aliases = {n for n, q in self.facts.names.items() if q == "pandas" or q.startswith("pandas.")}
        held = [n for n in read if is_pandas(env.get(n)) and not isinstance(env.get(n), PandasValue)]
        if not held and not any(n in aliases for n in read):
            return None
        self.note_pandas_calls(self.services.code_for(stmt), env)  # they run on pandas values
        lines: list[str] = []
        for name in held:
            value = env[name]
            if isinstance(value, Frame):
                # the code in the `try` may read the labels a filter left: the next pass has
                # pandas make the frame where it is named
                Evaluator(env, self.services).note_labels_read(value)
                lines += self.hand_over_expressions_of(name, env, stmt)
                self.note_handed_over(name, value)
            lines.append(f"{name} = {handover.to_pandas(value).text}")
            env[name] = PandasValue(emit.atom(name), frame=_after_change(name, value, None)
                                    if isinstance(value, Frame) else None)
        for name, values in _try_assignments(stmt).items():
            reads_pandas = any(n in aliases or is_pandas(env.get(n)) for v in values
                               for n in _names_read(cst.Module([]).code_for_node(v)))
            if not reads_pandas and not is_pandas(env.get(name)):
                continue  # a plain value (a count, a path): nothing pandas about it
            # a frame every branch reads from a file comes back to Polars after the `try`
            read_files = all(isinstance(v, cst.Call) and cst.Module([]).code_for_node(v.func)
                             .split(".")[-1].startswith("read_") for v in values)
            env[name] = PandasValue(emit.atom(name),
                                    frame=Frame(emit.atom(name)) if read_files else None)
        site = SiteDraft("frame.try", "handover", "todo", 0.0,
                         "a `try` around pandas code stays pandas: Polars would raise its own "
                         "exceptions, and only where the plan is collected, after the `try`",
                         *self.services.position(stmt))
        self.record((site,))
        before = [cst.parse_statement(line) for line in lines]
        kept = stmt
        first = before[0] if before else kept
        comments = _todo_comments([site], first)
        if before:
            before[0] = before[0].with_changes(leading_lines=[*stmt.leading_lines, *comments])
            kept = stmt.with_changes(leading_lines=())
        else:
            kept = stmt.with_changes(leading_lines=[*stmt.leading_lines, *comments])
        return [*before, kept], env

    def column_pairs(self, stmt: cst.For, env: dict[str, Value]) -> tuple[Frame, str, str] | None:
        """`for name, col in df.items():` (or iteritems(), which pandas 2 removed) over a frame
        whose columns porter knows and that has no index of its own: the frame and the two
        names. The body must not assign either name."""
        call = stmt.iter
        if not (isinstance(call, cst.Call) and not call.args and isinstance(call.func, cst.Attribute)
                and call.func.attr.value in ("items", "iteritems")
                and isinstance(stmt.target, cst.Tuple) and len(stmt.target.elements) == 2
                and all(isinstance(e.value, cst.Name) for e in stmt.target.elements)):
            return None
        frame = self.evaluate(call.func.value, env)
        if not isinstance(frame, Frame) or frame.columns is None or frame.index:
            return None
        key, series = (e.value.value for e in stmt.target.elements)  # type: ignore[attr-defined]
        assigned = _Assigned()
        stmt.body.visit(assigned)
        # a loop that changes frames is handed to pandas as written; one that fills a Python
        # value of the script's (gaps[name] = ..., a dict made before the loop) is not
        if {key, series} & assigned.names or assigned.inplace \
                or any(n is None or n in (key, series) or not _plain_python(env.get(n))
                       for n in assigned.changed) \
                or any(isinstance(env.get(n), (Frame, Column)) for n in assigned.names):
            return None
        return frame, key, series

    def frames_changed_by_a_loop(self, stmt: cst.For, env: dict[str, Value]) -> tuple[list[str], SiteDraft | None]:
        """`for frame in [a, b]: frame["c"] = ...` (or over `zip([a, b], names)`,
        `enumerate(...)`, `[(a, "a"), ...]`) changes a and b: each is handed to pandas in its
        own name before the loop (env changed), so the loop changes them and not copies
        (shared_frames). They come back to Polars after the loop unless a loop variable is
        read after it."""
        start, end = self.services.position(stmt)
        try:
            held = _held_names(ast.parse(self.services.code_for(stmt.iter).strip(), mode="eval").body)
            aliases = _stored_names(ast.parse(self.services.code_for(stmt.target).strip(), mode="eval").body)
        except SyntaxError:
            return [], None
        names = self.shared_frames(held, aliases, env, start - 1)
        if not names:
            return [], None
        reach = self.reached_through(aliases)
        stays = any(line > end for n in reach for line in self.services.name_lines.get(n, ()))
        lines = self.hand_over_shared(names, env, stays)
        through = self.changed_through(aliases, start - 1) or names
        site = SiteDraft("frame.changed_in_a_loop", "handover", "todo", 0.0,
                         f"the loop changes {', '.join(f'`{n}`' for n in names)} in place through "
                         f"{', '.join(f'`{n}`' for n in through)}: each is handed to pandas first"
                         + (" and stays there (a loop variable is read after the loop)" if stays else ""),
                         start, end)
        return lines, site

    # frames reachable through another name ---------------------------------------------------
    def shared_frames(self, held: list[str], aliases: list[str], env: dict[str, Value],
                      after: int, changed_by_call: bool = False) -> list[str]:
        """Of the frames a statement hands on as they are (`held`: `jan` in `frames = [jan]`,
        `target = jan if c else feb`, `for d, n in zip([jan, feb], names)`), those pandas may
        change through a second name, which a Polars rewrite (a copy handed over, a name
        rebound) would lose: every one when a change in place goes through a name that holds
        them (`aliases`, or a name bound from those: `for k, d in frames.items()`) or the
        statement gives them to a function that changes things in place; otherwise each that
        is changed in place itself after the statement (a list built before `jan["c"] = ...`).
        `after` is the last line before those changes. A frame pandas holds already, waiting
        to come back to Polars, counts too: it must not come back while another name holds it."""
        frames = [n for n in dict.fromkeys(held) if isinstance(env.get(n), Frame)
                  or isinstance(env.get(n), PandasValue) and env[n].frame is not None]  # type: ignore[union-attr]
        if not frames:
            return []
        if changed_by_call or any(self.changed_since(n, after, own=False)
                                  for n in self.reached_through(aliases)):
            return frames
        return [n for n in frames if self.changed_since(n, after, own=True)]

    def changed_only_afresh(self, name: str) -> bool:
        """Whether every change in place of `name`'s object comes before the statement at hand
        and, in the loops and functions around it, after the name is bound afresh there
        (`part = pd.read_csv(path); part["c"] = ...; frames.append(part)`): what the statement
        holds of it then is never changed again (each run changes the next frame)."""
        here = self.services.statement_lines[0]
        for line in self.services.changed_in_place.get(name, ()):
            if line >= here:
                return False
            # each loop (or function) around both must bind the name afresh, in its own body
            # and not under a condition, before the change: else a later turn changes the
            # frame appended in an earlier one
            if not self.bound_afresh_before(name, line):
                return False
        return True

    def fresh_lines(self, span: tuple[int, int], name: str) -> list[int]:
        """The lines where the loop or function starting at span[0] binds `name` by a
        statement of its own body (not nested in an `if`, a `try` or another loop)."""
        module = self.services.python_module
        if module is None:
            return []
        for node in ast.walk(module):
            if isinstance(node, (ast.For, ast.AsyncFor, ast.While, ast.FunctionDef,
                                 ast.AsyncFunctionDef)) and node.lineno == span[0]:
                return [stmt.lineno for stmt in node.body
                        if isinstance(stmt, ast.Assign) and any(
                            isinstance(t, ast.Name) and t.id == name for t in stmt.targets)]
        return []

    def changed_through(self, aliases: list[str], after: int) -> list[str]:
        """The names holding what `aliases` hold that a change in place goes through."""
        return sorted(n for n in self.reached_through(aliases)
                      if self.changed_since(n, after, own=False))

    def changed_since(self, name: str, after: int, own: bool) -> bool:
        """Whether the script changes `name`'s object in place after line `after`, or anywhere in
        the loop or function around the statement (it runs again); in a loop that binds the
        frame's own name afresh, a change before the statement is to the next frame."""
        span = self.spans[0] if self.spans else None
        for line in self.services.changed_in_place.get(name, ()):
            if line > after:
                return True
            if span is not None and span[0] <= line <= span[1] and not (
                    own and self.bound_afresh_before(name, line)):
                return True
        return False

    def bound_afresh_before(self, name: str, line: int) -> bool:
        """Whether each loop (or function) around the statement at hand that holds the change
        at `line` binds `name` afresh before it, by a statement of its own body: the change is
        then to that turn's new frame (see fresh_lines)."""
        return all(any(span[0] <= b < line for b in self.fresh_lines(span, name))
                   for span in self.spans if span[0] <= line <= span[1])

    def bound_lines(self) -> dict[str, list[int]]:
        """Where each name is bound (assigned, a loop's or a `with`'s target)."""
        if self._bound is None:
            self._bound, self._bindings = _bindings(self.services.python_module)
        return self._bound

    def reached_through(self, names: list[str]) -> set[str]:
        """`names` and every name bound to an object one of them holds (`d` in
        `for k, d in frames.items()`, `first = frames[0]`), anywhere in the script."""
        self.bound_lines()
        found = set(names)
        grew = bool(found)
        while grew:
            grew = False
            for targets, value in self._bindings:
                if not set(targets) <= found and set(_held_names(value, frozenset(found))) & found:
                    found |= set(targets)
                    grew = True
        return found

    def hand_over_shared(self, names: list[str], env: dict[str, Value], stays: bool) -> list[str]:
        """Each frame of `names` handed to pandas in its own name (env changed): a frame that
        stays there (another name may hold it) never comes back to Polars."""
        lines = []
        for name in names:
            value = env[name]
            if isinstance(value, PandasValue):  # on pandas already: it stays there
                env[name] = value if not stays else PandasValue(emit.atom(name))
                continue
            assert isinstance(value, Frame)
            self.note_handed_over(name, value)
            lines += self.hand_over_expressions_of(name, env, None)
            lines.append(f"{name} = {handover.to_pandas(value).text}")
            env[name] = PandasValue(emit.atom(name),
                                    frame=None if stays else _after_change(name, value, None))
        return lines

    def hand_over_aliased(self, stmt: cst.BaseSmallStatement, env: dict[str, Value]) -> tuple[list[str], list[SiteDraft]]:
        """A statement that makes a frame reachable through another name (`frames = [jan, feb]`,
        `target = jan if c else feb`, `a, b = jan, feb`, `frames.append(df)`,
        `months["jan"] = jan`, `tag_all([jan, feb])` of the script's own function that changes
        things in place), where pandas may see a change in place through either: the frames are
        handed to pandas in their own names first and stay there, so both names hold one
        object as in pandas (shared_frames)."""
        try:
            tree = ast.parse(self.services.code_for(stmt).strip())
        except SyntaxError:
            return [], []
        if len(tree.body) != 1:
            return [], []
        held, aliases = _shared_by(tree.body[0], lambda n: isinstance(env.get(n), Frame))
        by_call: list[str] = []
        called: list[str] = []
        for node in ast.walk(tree.body[0]):
            if isinstance(node, ast.Call) and isinstance(node.func, ast.Name) \
                    and node.func.id in self.services.function_defs \
                    and changes_in_place(self.services.function_defs[node.func.id].body):
                found = [n for a in [*node.args, *(k.value for k in node.keywords)]
                         if not isinstance(a, ast.Name) for n in _held_names(a)]
                if any(isinstance(env.get(n), Frame) for n in found):
                    by_call += found
                    called.append(node.func.id)
        start, end = self.services.position(stmt)
        names = self.shared_frames(held, aliases, env, end)
        lines = self.hand_over_shared(names, env, stays=True)
        stays = bool(names)
        # given to the function only: nothing holds them after the call
        passed = self.shared_frames(by_call, [], env, end, changed_by_call=True)
        lines += self.hand_over_shared(passed, env, stays=False)
        names += passed
        if not names:
            return [], []
        shown = ", ".join(f"`{n}`" for n in names)
        holders = ", ".join(f"`{n}`" for n in aliases)
        via = self.changed_through(aliases, end)
        if via:
            why = f"{shown} can also be reached through {holders}, and pandas sees a change " \
                  f"made in place through {', '.join(f'`{n}`' for n in via)} through every name"
        elif stays:
            why = f"{holders} holds the objects {shown}, changed in place later, and pandas' " \
                  f"{holders} sees that change"
        else:
            why = f"{shown} are given to {', '.join(f'`{f}()`' for f in called)}, which " \
                  "changes things in place, and pandas changes the caller's frames"
        site = SiteDraft("frame.shared", "handover", "todo", 0.0,
                         why + (": each is handed to pandas and stays there" if stays
                                else ": each is handed to pandas first"), start, end)
        return lines, [site]

    def group_appends(self, first: Any, loop: Any, env: dict[str, Value]) -> bool:
        """`acc = pd.DataFrame()` followed by `for key, rows in df.groupby(k): acc =
        acc.append({...}, ignore_index=True)` (groupby.append_rows): the frame the loop fills,
        given to the first statement as the value of its `pd.DataFrame()` (the loop is then
        left out). False for any other pair of statements."""
        found = _group_row_appends(first, loop)
        if found is None:
            return False
        made, acc, keys, rows, items = found
        self.services.values_given.pop(id(made), None)  # what an earlier pass found
        uses, reads = self.services.name_uses, _name_counts(loop.body)
        if any(uses.get(name, 0) != reads.get(name, 0) + 1 for name in (*keys, rows)) \
                or reads.get(acc, 0) != 2 or any(name in env for name in (*keys, rows)):
            return False  # a loop name read after the loop, or acc read in the values
        if any(isinstance(env.get(name), PandasValue)
               for name in _names_read(self.services.code_for(loop.iter))):
            return False  # the frame is on pandas here: the loop stays pandas code
        evaluator = Evaluator(env, self.services)
        maker = evaluator.eval(made.func)
        if not (isinstance(maker, Module) and maker.qualname == "pandas.DataFrame"):
            return False
        grouped = evaluator.eval(loop.iter)
        if not isinstance(grouped, Grouped):
            return False
        call = PandasCall(grouped, "append_rows", (Opaque(Code(""), const=(keys, rows, items)),),
                          node=loop.iter)
        result = evaluator.dispatch("groupby.append_rows", call, loop.iter)
        if not isinstance(result, Frame) or any(site.status == "todo" for site in result.sites):
            return False
        self.services.values_given[id(made)] = (made, result)
        return True

    def iterrows_appends(self, stmt: cst.For, env: dict[str, Value], indent: str) -> list[Any] | None:
        """`for _, row in df.iterrows():` whose body only appends one value per row to lists
        (frame.iterrows): the statements that fill the lists from one select; None for any
        other loop."""
        found = _row_appends(stmt)
        if found is None:
            return None
        label, row, appends = found
        body = self.services.code_for(stmt.body)
        reads = _name_counts(stmt.body)
        uses = self.services.name_uses
        if reads.get(label, 0) or (label != "_" and uses.get(label, 0) > 1) \
                or uses.get(row, 0) != reads.get(row, 0) + 1 \
                or any(is_pandas(env.get(name)) or name in (label, row) for name, _ in appends) \
                or len({name for name, _ in appends}) != len(appends):
            return None  # the label or the row is read, or the lists are not plain names
        assert isinstance(stmt.iter, cst.Call) and isinstance(stmt.iter.func, cst.Attribute)
        evaluator = Evaluator(env, self.services)
        frame = evaluator.eval(stmt.iter.func.value)
        if not isinstance(frame, Frame) or not body:
            return None
        functions = tuple((name, cst.Lambda(params=cst.Parameters(params=[cst.Param(cst.Name(row))]),
                                            body=value)) for name, value in appends)
        call = PandasCall(frame, "iterrows", (Opaque(Code(""), const=functions),), node=stmt.iter)
        self.current_small = stmt
        result = evaluator.dispatch("frame.iterrows", call, stmt.iter)
        if not isinstance(result, Opaque) or not isinstance(result.const, tuple) \
                or any(site.status == "todo" for site in result.sites):
            return None
        self.record(result.sites)
        if not self.emit_code:
            return [stmt]
        self.statement_key = id(stmt)
        lines = []
        for target, code in result.const:
            text = emit.layout_chain(code, indent, f"{target} = " if target else "")
            self.count_consumers(text, env, id(stmt))
            lines.append(text)
        statements = list(cst.parse_module("\n".join(lines) + "\n").body)
        statements[0] = statements[0].with_changes(leading_lines=stmt.leading_lines)
        return statements

    def header(self, expr: cst.BaseExpression, env: dict[str, Value], owner: cst.CSTNode,
               value: Value | None = None) -> cst.BaseExpression:
        if value is None:
            value = self.evaluate(expr, env)
        if is_pandas(value):
            value = Evaluator(env, self.services).handed_to_unknown(value, expr) \
                if not isinstance(value, (Frame, Column)) else value
        self.record(value.sites)
        self.header_sites.extend(value.sites)
        text = value.code.text
        if text == self.services.code_for(expr):
            return expr
        if self.services.glued(expr):  # `if(df.kg > 0).all():` keeps a valid header
            text = f"({text})"
        elif len(text) > HEADER_LENGTH and value.code.steps:
            # a long chain in a `for` or `if` header: one step per line, in parentheses
            text = emit.layout_chain(value.code, " " * 4, "")
            if not text.startswith("("):
                text = f"({text})"
        return cst.parse_expression(text)

    def evaluate(self, expr: cst.BaseExpression, env: dict[str, Value]) -> Value:
        return Evaluator(env, self.services).eval(expr)

    def record(self, sites: tuple[SiteDraft, ...]) -> None:
        self.sites.extend(sites)

    # simple statements ------------------------------------------------------------------------
    def simple_line(self, line: cst.SimpleStatementLine, env: dict[str, Value], indent: str) -> list[Any]:
        texts: list[str | None] = []
        sites: list[SiteDraft] = []
        before = dict(env)
        self.statement_key = id(line)
        self.services.statement_lines = self.services.position(line)
        run, self.sink_run = self.sink_run, None
        smalls = [(part, self.services.start(small)) for small in line.body for part in _one_target_each(small)]
        self.shared_line = len(smalls) > 1
        for small, self.small_start in smalls:
            text, new_sites = self.small(small, env, indent)
            texts.append(text)
            sites += new_sites
            if isinstance(small, cst.Assign):  # the plan it binds, for _cheap_to_recount
                written = text if text is not None else self.services.code_for(small)
                if any(isinstance(_plan_of(before.get(n)), Frame)
                       and _plan_of(before.get(n)).binding is None  # type: ignore[union-attr]
                       for n in _names_read(written)):
                    written = "collect"  # a frame from elsewhere (a parameter): not known here
                known = self.services.plan_texts.get(self.statement_key)
                self.services.plan_texts[self.statement_key] = \
                    written if known is None else f"{known}\n{written}"
            if text is not None:
                execution: int = id(small)
                if len(smalls) == 1 and is_sink_text(text):
                    # consecutive writes run as one pl.collect_all (see writes.py); a comment
                    # starts a new run
                    comment = any(e.comment for e in line.leading_lines)
                    execution = self.sink_run = \
                        run if run is not None and not comment else id(small)
                self.count_consumers(text, before, execution)
                if len(smalls) == 1 and _collects_what_it_binds(text):
                    self.services.materialized.add(self.statement_key)
        if self.parts_drops and smalls:
            # the last read of a frame of parts kept as columns: they are dropped after it
            dropped = self.drop_parts_columns(env, indent)
            if dropped is not None:
                last_text = texts[-1] if texts[-1] is not None \
                    else self.services.code_for(smalls[-1][0]).strip()
                texts[-1] = f"{last_text}\n{dropped}"
        self.record(tuple(sites))
        if not self.emit_code:  # an analysis pass only learns; the last pass writes
            return [line]
        todo_lines = _todo_comments(sites, line)
        if all(t is None for t in texts) and not todo_lines:
            return [line]
        if all(t is None for t in texts):
            return [line.with_changes(leading_lines=[*line.leading_lines, *todo_lines])]
        parts = [t if t is not None else self.services.code_for(s).strip()
                 for t, (s, _) in zip(texts, smalls)]
        new_lines = []
        statements = [stmt for part in parts for stmt in cst.parse_module(part + "\n").body]
        if not statements:  # nothing left to write (`df = df`, `df.columns.name = None`)
            if self.has_next:
                self.carried = [*self.carried, *line.leading_lines, *todo_lines]
                return []
            comments = [e for e in (*line.leading_lines, *todo_lines) if e.comment is not None]
            if not indent and not comments:
                return []  # the script's last statement: a module may end anywhere
            statements = [cst.parse_statement("pass\n")]
        last = len(statements) - 1
        for i, parsed in enumerate(statements):
            assert isinstance(parsed, cst.SimpleStatementLine)
            # the markers go on the last statement: when a frame is handed over to pandas
            # first, that is the statement kept as written, which the TODOs are about
            leading = [*(line.leading_lines if i == 0 else []), *(todo_lines if i == last else [])]
            if leading:
                parsed = parsed.with_changes(leading_lines=leading)
            if i == last:
                parsed = parsed.with_changes(trailing_whitespace=line.trailing_whitespace)
            new_lines.append(parsed)
        return new_lines

    def count_consumers(self, text: str, env: dict[str, Value], statement: int) -> None:
        """Remember which named frames this statement computes (collects or writes); `statement`
        names the execution (writes batched together share one)."""
        if ".collect()" not in text and ".sink_" not in text:
            return
        try:
            tree = ast.parse(text)
        except SyntaxError:
            return
        counted = _row_counts(tree)
        for execution, names in enumerate(_executions(tree)):
            for name in names:
                value = _plan_of(env.get(name))
                if not isinstance(value, Frame) or value.binding is None:
                    continue
                if name in counted and value.rows in self.services.file_rows:
                    # only the rows of a file are counted: Polars counts them from the scan
                    # without reading the columns, cheaper than keeping the frame
                    continue
                if name in counted and not self.loop_depth:
                    # only its rows are counted: plans_to_collect decides whether that runs
                    # the plan again or needs the frame kept
                    self.services.row_counts.setdefault(value.binding, set()).add(
                        (statement, 2 * execution))
                    continue
                uses = self.services.consumers.setdefault(value.binding, set())
                uses.add((statement, 2 * execution))
                if self.loop_depth:  # runs once per iteration
                    uses.add((statement, 2 * execution + 1))

    def computed_once(self) -> bool:
        """A frame whose plan would run more than once is collected once where it is made."""
        return self.statement_key in self.services.collect_at

    def read_changed_later(self) -> bool:
        """Whether the statement at hand reads a file (pandas reads it there, Polars' scan
        when the plan is collected) that the script may write, move or remove afterwards:
        the frame is then collected where it is bound, so that it holds what pandas read."""
        if self.files is None or not self.files.changes:
            return False
        try:
            tree = ast.parse(self.services.code_for(self.current_small).strip())
        except (SyntaxError, ValueError, RecursionError):
            return False
        lines = self.services.statement_lines
        return any(self.files.changed_after(path, lines) for path in self.files.read_paths(tree))

    def note_parents(self, code: Code, env: dict[str, Value]) -> None:
        """Remember which named frames the plan bound by this statement reads."""
        parents = self.services.frame_parents.setdefault(self.statement_key, set())
        for name in _names_read(code.text):
            value = _plan_of(env.get(name))
            if isinstance(value, Frame) and value.binding is not None:
                parents.add(value.binding)

    def small(self, stmt: cst.BaseSmallStatement, env: dict[str, Value], indent: str) -> tuple[str | None, list[SiteDraft]]:
        """Rewrite one small statement; None when it stays as written."""
        if isinstance(stmt, cst.Assign) and len(stmt.targets) == 1 \
                and isinstance(stmt.targets[0].target, cst.Name):
            self.dtype_names.pop(stmt.targets[0].target.value, None)
            if handover.worth_remembering(stmt.value):
                self.dtype_names[stmt.targets[0].target.value] = stmt.value
            if handover.makes_periods(self.services.code_for(stmt.value), self.period_names):
                self.period_names.add(stmt.targets[0].target.value)
            else:
                self.period_names.discard(stmt.targets[0].target.value)
        annotated: cst.AnnAssign | None = None
        if isinstance(stmt, cst.AnnAssign) and isinstance(stmt.target, cst.Name) \
                and stmt.value is not None:
            # `df: pd.DataFrame = ...` binds the name as `df = ...` does; the annotation is
            # put back after (see _annotated)
            annotated, before = stmt, dict(env)
            stmt = cst.Assign(targets=[cst.AssignTarget(stmt.target)], value=stmt.value)
        back, blocking = self.back_to_polars(stmt, env, indent)
        waiting = {n: v for n, v in env.items() if isinstance(v, PandasValue) and v.frame is not None}
        text, sites = back if back is not None else self.rewrite_small(stmt, env, indent)
        if back is None:
            self.still_on_pandas(stmt, env, waiting, [*sites, *blocking])
            # the calls that keep a handed-over frame on pandas are marked, as they would be
            # on a Polars frame: the statement is not left on pandas silently
            sites = [*sites, *(s for s in blocking if s not in sites)]
        if annotated is not None:
            return self.annotated(annotated, text, env, before), sites
        if text is not None and _same_code(text, self.services.code_for(stmt)):
            return None, sites  # only the layout would change: the statement stays as written
        return text, sites

    def annotated(self, stmt: cst.AnnAssign, text: str | None, env: dict[str, Value],
                  before: dict[str, Value]) -> str | None:
        """The annotation of `name: T = value` put back on the statement that binds the name.
        A name that now holds a LazyFrame (or a Polars expression) is annotated as one where
        the script wrote a pandas type: `df: pd.DataFrame = ...` becomes
        `df: pl.LazyFrame = ...`. Any other annotation stays as written."""
        assert isinstance(stmt.target, cst.Name) and stmt.value is not None
        name = stmt.target.value
        annotation = self.services.code_for(stmt.annotation.annotation)
        held = env.get(name)
        polars: str | None = None
        if isinstance(held, (Frame, Indexed)):
            polars = "pl.LazyFrame"
        elif isinstance(held, Column):
            # an expression kept in the name, or a Series of other rows kept as a frame of
            # one column (bind)
            polars = "pl.Expr" if held.code.text == name \
                else "pl.LazyFrame" if held.frame.code.text == name else ""
        elif isinstance(held, (Grouped, Parts)):
            polars = ""
        if polars is not None and any(
                isinstance(before.get(n), Module) and before[n].qualname.startswith("pandas")  # type: ignore[union-attr]
                for n in _names_read(annotation)):
            annotation = polars  # "": the pandas type is dropped, the name holds another
        if not annotation:
            if text is None:
                text = f"{name} = {self.services.code_for(stmt.value).strip()}"
            return text
        if text is None:
            if annotation == self.services.code_for(stmt.annotation.annotation):
                return None
            text = f"{name} = {self.services.code_for(stmt.value).strip()}"
        if _same_code(text, f"{name} = {self.services.code_for(stmt.value).strip()}") \
                and annotation == self.services.code_for(stmt.annotation.annotation):
            return None
        try:
            module = cst.parse_module(text + "\n")
        except cst.ParserSyntaxError:
            return text
        body = list(module.body)
        for i in reversed(range(len(body))):
            line = body[i]
            if isinstance(line, cst.SimpleStatementLine) and len(line.body) == 1 \
                    and isinstance(line.body[0], cst.Assign) and len(line.body[0].targets) == 1 \
                    and isinstance(line.body[0].targets[0].target, cst.Name) \
                    and line.body[0].targets[0].target.value == name:
                bound = cst.AnnAssign(target=cst.Name(name),
                                      annotation=cst.Annotation(cst.parse_expression(annotation)),
                                      value=line.body[0].value)
                body[i] = line.with_changes(body=[bound])
                break
        return module.with_changes(body=body).code.rstrip("\n")

    def still_on_pandas(self, stmt: cst.BaseSmallStatement, env: dict[str, Value],
                        waiting: dict[str, PandasValue], sites: list[SiteDraft] = ()) -> None:  # type: ignore[assignment]
        """A statement kept on pandas that changes a frame waiting to come back to Polars
        (`df["c"] = ...` on the handed-over frame): what porter knows of it follows the change,
        so the frame comes back with every column pandas gave it. A change that gives it values
        Polars has no type for (a mixed column, tuples, Intervals: `sites` says so) keeps it
        on pandas, as bind_changed keeps a Polars frame given them."""
        stays = any(site.key in INTERVAL_MAKERS for site in sites) or any(
            site.key == "frame.setitem" and FRAME_STAYS_PANDAS in site.message for site in sites)
        changed = [_root_and_path(t) for t in _changed_targets(stmt)] + _mutating_calls(stmt)
        for name, what in changed:
            before = waiting.get(name) if name is not None else None
            if before is None or env.get(name) is not before:
                continue  # not waiting, or rebound by the statement itself
            assert name is not None
            what = "" if what in ("setitem", "loc", "iloc", "ix") else what
            env[name] = PandasValue(emit.atom(name), frame=None if stays else _after_change(
                name, before.frame, stmt, what, self.dtype_names, self.period_names))

    def back_to_polars(self, stmt: cst.BaseSmallStatement, env: dict[str, Value], indent: str
                       ) -> tuple[tuple[str | None, list[SiteDraft]] | None, list[SiteDraft]]:
        """A frame that an earlier statement kept on pandas comes back to Polars
        (`pl.from_pandas`) at the first statement porter can rewrite whole with it, so that one
        TODO does not keep the rest of the script on pandas. Otherwise (None, the TODOs that
        keep the statement on pandas)."""
        names = [n for n in _names_read(self.services.code_for(stmt))
                 if isinstance(env.get(n), PandasValue)
                 and env[n].frame is not None]  # type: ignore[union-attr]
        if not names:
            return None, []
        trial = dict(env)
        for name in names:
            trial[name] = env[name].frame  # type: ignore[union-attr, assignment]
        env_before = dict(trial)
        text, sites = self.rewrite_small(stmt, trial, indent)
        if any(s.status == "todo" for s in sites):
            # the statement needs pandas anyway: the frame stays there
            return None, [s for s in sites if s.status == "todo"]
        env.clear()
        env.update(trial)
        # each frame as it comes back, not as the statement leaves it (a column it makes is
        # not there yet)
        lines = [emit.layout_chain(_from_pandas(name, env_before[name]), indent, f"{name} = ")  # type: ignore[arg-type]
                 for name in names]
        return ("\n".join([*lines, text if text is not None else self.services.code_for(stmt).strip()]),
                sites), []

    def rewrite_small(self, stmt: cst.BaseSmallStatement, env: dict[str, Value], indent: str) -> tuple[str | None, list[SiteDraft]]:
        shared, shared_sites = self.hand_over_aliased(stmt, env)
        handed, handed_sites = self.hand_over_changed(stmt, env)
        handed, handed_sites = [*shared, *handed], [*shared_sites, *handed_sites]
        moved, moved_sites = hand_over_module_frames(self, stmt, env, _after_change)
        handed, handed_sites = [*moved, *handed], [*moved_sites, *handed_sites]
        text, sites = self._small(stmt, env, indent)
        if not handed:
            return text, [*handed_sites, *sites]  # a TODO without lines to add
        text = text if text is not None else self.services.code_for(stmt).strip()
        return "\n".join([*handed, text]), [*handed_sites, *sites]

    def changed_later(self, *names: str) -> bool:
        """Whether the script changes one of these names' object in place after this statement
        (or anywhere, inside a loop or a function)."""
        here = self.services.statement_lines[1]
        if self.loop_depth or self.function is not None:
            return any(name in self.services.changed_in_place for name in names)
        if any(line > here for name in names for line in self.services.changed_in_place.get(name, ())):
            return True
        # a change on this statement's own line, `keyed = df.set_index("k"); keyed["c"] = ...`,
        # counts when it starts after the statement (`df["c"] = y; result = df` does not)
        return self.shared_line and any(
            line == here and (self.small_start is None or (line, column) > self.small_start)
            for name in names for line, column in self.services.changed_at.get(name, ()))

    def hand_over_changed(self, stmt: cst.BaseSmallStatement, env: dict[str, Value]) -> tuple[list[str], list[SiteDraft]]:
        """Frames and Series the statement changes in place in a way no rule rewrites
        (`df.insert(...)`, `df.at[i, "c"] = v`, `s.name = "x"`): each is handed to pandas in
        its own name first, so the change lands on the object the script reads afterwards."""
        changed: dict[str, str] = {}
        for target in _changed_targets(stmt):
            name, what = _root_and_path(target)
            value = env.get(name) if name is not None else None
            if isinstance(value, (Frame, Column)) and not _rewritten_change(target, value, stmt):
                changed.setdefault(name, what)  # type: ignore[arg-type]
        for name, what in [*_mutating_calls(stmt), *((n, w) for n, w, _ in _changed_by_functions(stmt, self.services.functions))]:
            if isinstance(env.get(name), (Frame, Column)):
                changed.setdefault(name, what)
        lines: list[str] = []
        sites: list[SiteDraft] = []
        line, end_line = self.services.position(stmt)
        for name, what in changed.items():
            value = env[name]
            kind = "frame" if isinstance(value, Frame) else "series"
            if _may_read_labels(what, value):
                # the change may read or write by row label (`at[2, "s"]`, a helper's
                # `frame.loc[len(frame)] = …` or `drop(index=[4])`): after a filter or sort
                # those are the original row numbers, which a frame handed over from Polars
                # numbers 0..n-1 again, so the next pass has pandas make it (engine.bind)
                evaluator = Evaluator(env, self.services)
                evaluator.note_handed_over(value)
            if isinstance(value, Frame):
                self.note_handed_over(name, value)
                lines += self.hand_over_expressions_of(name, env, stmt)
            code = handover.to_pandas(value)
            if kind == "series" and not value.frame.index:
                # a Series from Polars shares Arrow's read-only memory, and pandas writes into
                # it in place ("assignment destination is read-only"): a copy of its own
                code = code.method("copy")
            lines.append(f"{name} = {code.text}")
            # labels pandas allows twice (insert(..., allow_duplicates=True)) cannot come back
            repeats = "allow_duplicates" in self.services.code_for(stmt)
            env[name] = PandasValue(emit.atom(name),
                                    frame=None if repeats else _after_change(name, value, None, what))
            sites.append(SiteDraft(f"{kind}.{what}", "handover", "todo", 0.0,
                                   f"`{what}` changes the {'frame' if kind == 'frame' else 'Series'} "
                                   f"in place, which porter does not rewrite: `{name}` is handed "
                                   "to pandas first", line, end_line))
        return lines, sites

    def _small(self, stmt: cst.BaseSmallStatement, env: dict[str, Value], indent: str) -> tuple[str | None, list[SiteDraft]]:
        evaluator = Evaluator(env, self.services)
        self.current_small = stmt
        if isinstance(stmt, cst.Expr):
            inplace = self.inplace_call(stmt.value, env, evaluator, indent)
            if inplace is not None:
                return inplace
            value = evaluator.eval(stmt.value)
            if isinstance(value, (Frame, Column)):
                # a bare value: a notebook cell shows it, so it shows the table, never a plan
                # or an expression (in a script it computes what pandas computed, unused)
                value = Opaque(handover.for_display(value), sites=value.sites)
            return self.unchanged_or(stmt.value, value, indent, prefix="")
        if isinstance(stmt, cst.Assert):
            return self.assert_stmt(stmt, evaluator)
        if isinstance(stmt, (cst.Assign, cst.AnnAssign)):
            return self.assign(stmt, env, evaluator, indent)
        if isinstance(stmt, cst.AugAssign):
            return self.aug_assign(stmt, env, evaluator, indent)
        if isinstance(stmt, cst.Return) and stmt.value is not None:
            value = evaluator.eval(stmt.value)
            if self.function is not None:
                self.returns.setdefault(self.function, []).append(value)
                if isinstance(value, Column):
                    value = self.returned_column(value, stmt.value)
            return self.unchanged_or(stmt.value, value, indent, prefix="return ")
        if isinstance(stmt, cst.Del) and isinstance(stmt.target, cst.Subscript):
            target = stmt.target
            frame = evaluator.eval(target.value)
            if isinstance(frame, Frame) and isinstance(target.value, cst.Name):
                key = evaluator.eval(_index_of(target))
                call = PandasCall(frame, "delitem", (key,), node=stmt)
                value = evaluator.dispatch("frame.delitem", call, stmt)
                return self.bind(target.value.value, value, env, indent)
        return None, []

    def assert_stmt(self, stmt: cst.Assert, evaluator: Evaluator) -> tuple[str | None, list[SiteDraft]]:
        """`assert test, msg`: both are Python values, so pandas values inside are computed."""
        parts: list[str] = []
        sites: list[SiteDraft] = []
        changed = False
        for node in (stmt.test, stmt.msg):
            if node is None:
                continue
            value = evaluator.eval(node)
            if isinstance(value, (Frame, Column, Grouped)):
                value = evaluator.handed_to_unknown(value, node)
            sites += value.sites
            text = value.code.text
            changed = changed or text != self.services.code_for(node)
            parts.append(text if _one_expression(text) else f"({text})")
        if not changed:
            return None, sites
        return "assert " + ", ".join(parts), sites

    def returned_column(self, value: Column, node: cst.BaseExpression) -> Value:
        """What a function's `return` of a column gives its callers. An expression of the
        column parameters, or of a frame parameter's rows as they came in, is returned as the
        expression (the callers evaluate it in their frame). Any other column is computed
        here and returned as the pandas Series the callers expect."""
        assert self.function is not None
        function = self.services.functions.get(self.function)
        of: str | None = None
        if function is not None and function.column_params and value.frame.rows == function.column_rows \
                and EXPRESSION_ROWS not in value.code.text:
            of = COLUMNS
        elif value.frame.rows in self.param_frames \
                and value.frame.code.text == self.param_frames[value.frame.rows]:
            of = self.param_frames[value.frame.rows]
        self.returned_of.setdefault(self.function, []).append(of)
        if function is not None and of is not None and of in (
                function.returns_column_of, COLUMNS if function.column_params else None):
            return value
        line, end_line = self.services.position(node)
        site = SiteDraft("function.return_series", "handover", "handover", 1.0,
                         "the function returns a Series its callers use as pandas: it is "
                         "computed here (.collect()) and handed over", line, end_line)
        if of is None and not value.frame.labels_intact and not value.frame.index:
            # after a filter or sort pandas' Series carries the original row numbers, which
            # its callers align on or print; the collected one is numbered 0..n-1 again. A
            # function given frames stays pandas code (the next pass gives it pandas frames)
            if function is not None and function.frame_params:
                self.services.pandas_called.add(self.function)
            site = replace(site, confidence=0.5, message=(
                "the function returns a Series whose row labels a filter or sort changed; "
                "computed here (.collect()) it is numbered 0..n-1 again, where pandas keeps "
                "the original row numbers (callers align on them and print them)"))
        return PandasValue(handover.to_pandas(value), sites=(*value.sites, site))

    def unchanged_or(self, node: cst.BaseExpression, value: Value, indent: str, prefix: str) -> tuple[str | None, list[SiteDraft]]:
        if is_pandas(value) and not isinstance(value, (Frame, Column)):
            value = Evaluator({}, self.services).handed_to_unknown(value, node)
        if value.code.text == self.services.code_for(node):
            return None, list(value.sites)
        return emit.layout_chain(value.code, indent, prefix), list(value.sites)

    def inplace_call(self, expr: cst.BaseExpression, env: dict[str, Value], evaluator: Evaluator,
                     indent: str) -> tuple[str | None, list[SiteDraft]] | None:
        """`x.method(..., inplace=True)` is `x = x.method(...)`."""
        if not (isinstance(expr, cst.Call) and isinstance(expr.func, cst.Attribute)):
            return None
        inplace = [a for a in expr.args if a.keyword is not None and a.keyword.value == "inplace"]
        if not inplace or self.services.code_for(inplace[0].value) != "True":
            return None
        receiver_node = expr.func.value
        receiver = evaluator.eval(receiver_node)
        if not isinstance(receiver, (Frame, Column, Indexed)):
            return None
        args = [a for a in expr.args if a is not inplace[0]]
        if args:
            args[-1] = args[-1].with_changes(comma=cst.MaybeSentinel.DEFAULT)
        call = expr.with_changes(args=args)
        value = evaluator.eval(call)
        if isinstance(receiver_node, cst.Name) and isinstance(value, (Frame, PandasValue, Indexed)):
            return self.bind(receiver_node.value, value, env, indent)
        if isinstance(receiver_node, (cst.Subscript, cst.Attribute)) and isinstance(value, Column):
            # pandas 3 (copy-on-write): the method changes a copy of the column, never the
            # frame (df["x"] and df.x alike)
            line, end_line = self.services.position(expr)
            meant = " ".join(f"{self.services.code_for(receiver_node)} = "
                             f"{cst.Module([]).code_for_node(call)}".split())
            site = SiteDraft("series.inplace", "inplace", "todo", 0.0,
                             "chained assignment with inplace=True changes nothing in pandas 3 "
                             "(copy-on-write), so its port does nothing either; if the column "
                             f"was meant to change, write `{meant}`", line, end_line)
            return "pass", [*value.sites, site]
        return None

    def assign(self, stmt: cst.Assign | cst.AnnAssign, env: dict[str, Value], evaluator: Evaluator,
               indent: str) -> tuple[str | None, list[SiteDraft]]:
        if stmt.value is None:
            return None, []
        targets = [t.target for t in stmt.targets] if isinstance(stmt, cst.Assign) else [stmt.target]
        several = _column_targets(stmt)
        if several is not None:
            result = self.set_columns(stmt, several, env, evaluator, indent)
            if result is not None:
                return result
        split = _columns_changed_alike(stmt, evaluator)
        if split is not None:
            result = self.set_columns_alike(stmt, *split, env, evaluator, indent)
            if result is not None:
                return result
        if len(targets) == 1:
            target = targets[0]
            if isinstance(target, cst.Name) and isinstance(stmt, cst.Assign):
                value = evaluator.eval(stmt.value)
                if self.function is not None:
                    self.body_values.setdefault(self.function, []).append(value)
                return self.bind(target.value, value, env, indent)
            if isinstance(target, cst.Subscript):
                value = evaluator.eval(stmt.value)
                result = self.set_item(target, value, env, evaluator, indent)
                if result is not None:
                    return result
            if isinstance(target, cst.Attribute):
                result = self.set_attr(target, stmt.value, env, evaluator, indent)
                if result is not None:
                    return result
            if isinstance(target, (cst.Tuple, cst.List)) and isinstance(stmt, cst.Assign):
                result = self.unpack(target, stmt.value, env, evaluator, indent)
                if result is not None:
                    return result
        value = evaluator.eval(stmt.value)
        if isinstance(value, (Frame, Column)) and not all(isinstance(t, cst.Name) for t in targets):
            # stored into an object porter does not model (a frame pandas holds, a dict, an
            # attribute): it gets the pandas value, aligned by pandas on its labels, so both
            # sides' labels must be pandas' own
            frame = value if isinstance(value, Frame) else value.frame
            evaluator.note_labels_read(frame)
            for target in targets:
                root = _root_and_path(target)[0] if isinstance(target, (cst.Subscript, cst.Attribute)) else None
                if root in self.handed_from:
                    self.services.labels_needed.add(self.handed_from[root])
            value = evaluator.handed_to_unknown(value, stmt.value)
        for target in targets:
            for name in _target_names(target):
                env[name] = Opaque(emit.atom(name))
        if value.code.text == self.services.code_for(stmt.value):
            return None, list(value.sites)
        lhs = "".join(f"{self.services.code_for(t)} = " for t in targets)
        return emit.layout_chain(value.code, indent, lhs), list(value.sites)

    def set_columns(self, stmt: cst.Assign, targets: list[cst.Subscript], env: dict[str, Value],
                    evaluator: Evaluator, indent: str) -> tuple[str | None, list[SiteDraft]] | None:
        """`df["a"], df["b"] = x, y` and `df["a"] = df["b"] = x`: Python computes every value
        before it sets a column, so the values are all expressions of the frame as it was, set
        in one step (frame.setitem with several keys and values); pandas code left on the
        LazyFrame failed."""
        owner = targets[0].value
        assert isinstance(owner, cst.Name)
        frame = evaluator.eval(owner)
        if not isinstance(frame, Frame):
            return None
        if len(stmt.targets) > 1:
            value = evaluator.eval(stmt.value)
            values = [value] * len(targets)
        else:
            node = stmt.value
            assert isinstance(node, (cst.Tuple, cst.List))
            values = [evaluator.eval(e.value) for e in node.elements]
        args: list[Value] = []
        for target, value in zip(targets, values):
            args += [evaluator.eval(_index_of(target)), value]
        call = PandasCall(frame, "setitem", tuple(args), node=targets[0])
        result = evaluator.dispatch("frame.setitem", call, stmt)
        return self.bind_changed(owner.value, frame, result, env, indent)

    def set_columns_alike(self, stmt: cst.Assign, owner: cst.Name, names: list[str],
                          values: list[cst.BaseExpression], env: dict[str, Value],
                          evaluator: Evaluator, indent: str) -> tuple[str | None, list[SiteDraft]] | None:
        """`df[["a", "b"]] = df[["a", "b"]].fillna(0)`: a method that works column by column,
        with constant arguments, gives each column what the same method gives that column
        alone (`df["a"].fillna(0)`): set in one step, as `df["a"], df["b"] = ...` (the frame's
        method on a frame porter knows less of was a TODO keeping the frame on pandas)."""
        frame = evaluator.eval(owner)
        if not isinstance(frame, Frame) or frame.columns is None \
                or not set(names) <= set(frame.columns) or set(names) & set(frame.index):
            return None
        args: list[Value] = []
        for name, node in zip(names, values):
            args += [Opaque(emit.atom(emit.render(name)), const=name), evaluator.eval(node)]
        call = PandasCall(frame, "setitem", tuple(args), node=stmt.targets[0].target)
        result = evaluator.dispatch("frame.setitem", call, stmt)
        if any(site.status == "todo" for site in result.sites):
            return None
        return self.bind_changed(owner.value, frame, result, env, indent)

    def unpack(self, target: cst.Tuple | cst.List, node: cst.BaseExpression, env: dict[str, Value],
               evaluator: Evaluator, indent: str) -> tuple[str | None, list[SiteDraft]] | None:
        """`a, b = jan, feb` binds each name as `a = jan` would (the names were left holding
        nothing porter knew, and pandas code on them ran on LazyFrames); None when the
        statement is not that (a starred or nested name, another length, a swap that reads
        the names it binds) or binds no pandas value."""
        names = [e.value.value if isinstance(e.value, cst.Name) and not isinstance(e, cst.StarredElement)
                 else None for e in target.elements]
        if not isinstance(node, (cst.Tuple, cst.List)) or None in names \
                or len(node.elements) != len(names) or len(set(names)) != len(names) \
                or any(isinstance(e, cst.StarredElement) for e in node.elements) \
                or set(names) & set(_names_read(self.services.code_for(node))):
            return None
        values = [evaluator.eval(e.value) for e in node.elements]
        if not any(is_pandas(v) for v in values):
            return None
        texts: list[str] = []
        sites: list[SiteDraft] = []
        for name, value in zip(names, values):
            text, new_sites = self.bind(name, value, env, indent)  # type: ignore[arg-type]
            sites += new_sites
            if text:  # nothing to write for a pending groupby bound later
                texts.append(text)
        return "\n".join(texts), sites

    def aug_assign(self, stmt: cst.AugAssign, env: dict[str, Value], evaluator: Evaluator,
                   indent: str) -> tuple[str | None, list[SiteDraft]]:
        if isinstance(stmt.target, cst.Subscript):
            # `x[k] op= v` is `x[k] = x[k] op v` for every operator (the rule of the operator
            # ports it or keeps it on pandas; never pandas code left on a LazyFrame)
            operator = _AUGMENTED.get(type(stmt.operator))
            if operator is not None:
                expr = cst.BinaryOperation(left=_whole_column(stmt.target), operator=operator,
                                           right=stmt.value)
                value = evaluator.eval(expr)
                result = self.set_item(stmt.target, value, env, evaluator, indent)
                if result is not None:
                    return result
        value = evaluator.eval(stmt.value)
        if isinstance(stmt.target, cst.Name):
            env[stmt.target.value] = Opaque(emit.atom(stmt.target.value))
        if value.code.text == self.services.code_for(stmt.value):
            return None, list(value.sites)
        lhs = f"{self.services.code_for(stmt.target)} {self.services.code_for(stmt.operator).strip()} "
        return emit.layout_chain(value.code, indent, lhs), list(value.sites)

    def set_item(self, target: cst.Subscript, value: Value, env: dict[str, Value],
                 evaluator: Evaluator, indent: str) -> tuple[str | None, list[SiteDraft]] | None:
        owner = target.value
        if isinstance(owner, cst.Attribute) and owner.attr.value in ("loc", "iloc", "ix") \
                and isinstance(owner.value, cst.Name):
            # (.ix: pandas' label-or-position writes before 1.0, rules/legacy.py)
            frame = evaluator.eval(owner.value)
            if not isinstance(frame, Frame):
                return None
            keys = tuple(evaluator.eval(e.slice.value) if isinstance(e.slice, cst.Index)
                         else evaluator.eval_slice(e.slice) for e in target.slice)
            call = PandasCall(frame, f"{owner.attr.value}_setitem", (*keys, value), node=target)
            result = evaluator.dispatch(f"frame.{owner.attr.value}_setitem", call, target)
            return self.bind_changed(owner.value.value, frame, result, env, indent)
        if not isinstance(owner, cst.Name):
            return None
        if owner.value in self.parts_columns:  # a frame of parts kept as columns
            changed = self.parts_changed(target, value, env, evaluator, indent)
            if changed is not None:
                return changed
        frame = evaluator.eval(owner)
        if not isinstance(frame, Frame):
            return None
        key = evaluator.eval(_index_of(target))
        call = PandasCall(frame, "setitem", (key, value), node=target)
        result = evaluator.dispatch("frame.setitem", call, target)
        return self.bind_changed(owner.value, frame, result, env, indent)

    def bind_changed(self, name: str, frame: Frame, result: Value, env: dict[str, Value],
                     indent: str) -> tuple[str | None, list[SiteDraft]]:
        """A frame changed by a statement: rebound to the rewrite, or, when the change stays on
        pandas, the frame is handed over first and the statement kept as written."""
        if not isinstance(result, PandasValue):
            return self.bind(name, result, env, indent)
        statement = self.current_small
        first = self.hand_over_expressions_of(name, env, statement, indent)
        intervals = any(site.key in INTERVAL_MAKERS for site in result.sites) or any(
            site.key == "frame.setitem" and FRAME_STAYS_PANDAS in site.message
            for site in result.sites)  # values Polars has no type for (rules/assign.py)
        # a frame given pandas' Interval values stays pandas (Polars has no type for them)
        env[name] = PandasValue(emit.atom(name),
                                frame=None if intervals else _after_change(
                                    name, frame, statement, dtype_names=self.dtype_names,
                                    period_names=self.period_names))
        if isinstance(statement, (cst.Assign, cst.AugAssign)) and statement.value is not None:
            # other frames the statement reads are handed over too (`other.pct`), never left
            # as LazyFrames or expressions inside pandas code
            statement = statement.with_changes(value=self.handed_over_in(statement.value, env))
            # and so are those read by the keys it assigns to (`df.loc[pos.index, "c"] = 1`)
            statement = self.keys_handed_over(statement, env)
        original = self.services.code_for(statement).strip()
        self.note_pandas_calls(original, env)
        # the whole statement stays pandas: what it uses is not converted after all
        sites = [replace(s, status="todo", confidence=0.0,
                         message="kept on pandas with the statement it is in")
                 if s.status == "converted" else s for s in result.sites]
        self.note_handed_over(name, frame)
        return "\n".join([*first, f"{name} = {handover.to_pandas(frame).text}", original]), sites

    def handed_over_in(self, node: cst.BaseExpression, env: dict[str, Value]) -> cst.BaseExpression:
        """`node` as pandas code, with the frames and Series of porter's it reads handed to
        pandas (the node itself where it reads none)."""
        value = Evaluator(env, self.services).generic(node)
        if value.code.text == self.services.code_for(node):
            return node
        text = value.code.text if "\n" not in value.code.text else f"({value.code.text})"
        return cst.parse_expression(text)

    def keys_handed_over(self, statement: cst.Assign | cst.AugAssign,
                         env: dict[str, Value]) -> cst.Assign | cst.AugAssign:
        """`statement` kept on pandas with the keys of the subscripts it assigns to rewritten:
        a frame or Series of porter's read there (`pos.index`) is handed to pandas."""
        def rewritten(target: cst.BaseExpression) -> cst.BaseExpression:
            if not isinstance(target, cst.Subscript):
                return target
            return target.with_changes(slice=[
                element.with_changes(slice=element.slice.with_changes(
                    value=self.handed_over_in(element.slice.value, env)))
                if isinstance(element.slice, cst.Index) else element
                for element in target.slice])

        if isinstance(statement, cst.AugAssign):
            return statement.with_changes(target=rewritten(statement.target))
        return statement.with_changes(targets=[t.with_changes(target=rewritten(t.target))
                                               for t in statement.targets])

    def note_pandas_calls(self, code: str, env: dict[str, Value]) -> None:
        """The script's functions that pandas code kept as written calls (`df["c"] =
        helper(df)`, with `df` handed over first): their parameters get pandas values there, so
        a body ported for Polars frames or expressions would fail (or lose the labels pandas
        aligns on). They become pandas' for every call (services.pandas_called), and the next
        pass ports their bodies with the parameters as pandas values."""
        for name in _called_names(code):
            function = self.services.functions.get(name)
            if name in env or function is None:
                continue  # another value bound to the name, or not a function porter learns
            if function.frame_params or function.column_params:
                self.services.pandas_called.add(name)

    def hand_over_expressions_of(self, name: str, env: dict[str, Value],
                                 stmt: cst.CSTNode | None, indent: str = "") -> list[str]:
        """Series kept in names as expressions of the frame `name` (`m = df["a"] > 0`) that
        the statement reads (every one, without a statement): pandas computes them first, from
        the Polars frame, in their own names; once `name` holds the pandas frame an expression
        of it has nothing to run on."""
        read = set(_names_read(self.services.code_for(stmt))) if stmt is not None else None
        # (a Series read by a later statement too: `y = df["cost"]` given to a model again after
        # df went to pandas would be an expression of a frame that no longer is one)
        here = self.services.statement_lines[1]
        span = self.spans[0] if self.loop_depth and self.spans else (here + 1, here)
        lines = []
        for held, value in list(env.items()):
            later = any(line > here or span[0] <= line <= span[1]
                        for line in self.services.name_lines.get(held, ()))
            if (read is None or held in read or later) and held != name \
                    and isinstance(value, Column) \
                    and value.binding is not None \
                    and (value.frame.code.text == name and isinstance(env.get(name), Frame)
                         # a Series kept as a frame of its own (`m = df.select(...)`, read
                         # after a column it reads was overwritten): a LazyFrame to pandas
                         or value.frame.code.text == held):
                lines.append(emit.layout_chain(handover.to_pandas(value), indent, f"{held} = "))
                env[held] = PandasValue(emit.atom(held))
        return lines

    def note_handed_over(self, name: str, frame: Frame) -> None:
        """A frame handed to pandas in its own name after a filter or sort: pandas numbers its
        rows 0..n-1 again. Remembered, so that pandas code that then aligns another Series to
        it has pandas make it with its own labels (see assign)."""
        if not frame.labels_intact and not frame.index and frame.binding is not None:
            self.handed_from[name] = frame.binding

    def set_attr(self, target: cst.Attribute, value_node: cst.BaseExpression, env: dict[str, Value],
                 evaluator: Evaluator, indent: str) -> tuple[str | None, list[SiteDraft]] | None:
        owner, key = target.value, f"frame.set_{target.attr.value}"
        if target.attr.value == "index":
            key = "frame.index.assign"  # df.index = ... (not the set_index method)
        if isinstance(owner, cst.Attribute) and owner.attr.value == "columns" \
                and target.attr.value == "name":
            owner, key = owner.value, "frame.columns.name"  # df.columns.name = None
        if not isinstance(owner, cst.Name):
            return None
        if owner.value in self.parts_columns:  # a frame of parts kept as columns
            changed = self.parts_changed(target, value_node, env, evaluator, indent)
            if changed is not None:
                return changed
        frame = evaluator.eval(owner)
        if not isinstance(frame, Frame):
            return None
        value = evaluator.eval(value_node)
        if key == "frame.set_columns" and isinstance(value, Opaque) and value.node is None \
                and isinstance(value_node, cst.ListComp):
            # the rule reads the comprehension's string methods (new names computed now)
            value = replace(value, node=value_node)
        call = PandasCall(frame, target.attr.value, (value,), node=target)
        result = evaluator.dispatch(key, call, target)
        if result is frame:
            return "", [*result.sites]  # the change has no Polars form: nothing is written
        if isinstance(result, Frame) and result.code is frame.code \
                and frame.dates_as_text is not None and result.dates_as_text is None:
            # a pivot's date columns, named already as this statement renames them
            env[owner.value] = result
            return "", [*result.sites]
        return self.bind_changed(owner.value, frame, result, env, indent)

    def note_stale_series(self, name: str, frame: Frame, env: dict[str, Value]) -> None:
        """`name` is about to hold other rows: a Series kept as an expression of it would then
        read the new rows. The next pass keeps such a Series as a frame of its own."""
        here = self.services.statement_lines[1]
        # in a loop, a read earlier in its body comes after this statement too (the next round);
        # a read before the loop does not
        span = self.spans[0] if self.loop_depth and self.spans else (here + 1, here)
        for held, value in env.items():
            if isinstance(value, Column) and value.binding is not None \
                    and value.frame.code.text == name \
                    and (value.frame.rows != frame.rows
                         or any(frame.version(c) != v for c, v in value.versions)) \
                    and (self.function is not None
                         or any(line > here or span[0] <= line <= span[1]
                                for line in self.services.name_lines.get(held, ()))):
                # other rows, or a column it reads overwritten or renamed (a fresh version)
                self.services.stale_series.add(value.binding)

    def labels_as_column(self, expr: cst.BaseExpression, env: dict[str, Value],
                         keep_index: bool = True) -> Value | None:
        """`pos = df[df["a"] > 0]` whose row labels pandas code reads later: the frame the
        statement reads, whose labels are still 0..n-1, is given its row numbers as a column
        (with_row_index) held as pandas' unnamed index, and the statement is evaluated again on
        it, so the filter or sort carries each row's label as pandas does (reset_index() makes
        it the column "index", idxmax and loc read it, print shows it). None when the statement
        reads more than one frame, a frame whose labels are renumbered already or whose columns
        are not known, or when the result leaves a TODO or (keep_index) does not keep the labels
        as its index."""
        if self.services.label_functions:
            # the script's own functions read the labels of frames they are given: they read
            # them from pandas' frames (the frames passed are pandas', see made_by_pandas)
            return None
        names = _names_read(self.services.code_for(expr))
        frames = [n for n in names if isinstance(env.get(n), Frame)]
        if not frames:
            return self._labels_where_the_chain_starts(expr, env, keep_index)
        # a statement reading several frames (left.merge(right, left_on=k, right_index=True)
        # labels its rows with the left's): each frame in turn, kept where the result holds
        # that frame's labels as its index
        keep_index = keep_index or len(frames) > 1
        for name in frames:
            frame = env[name]
            assert isinstance(frame, Frame)
            if not frame.labels_intact or frame.index or frame.columns is None \
                    or "index" in frame.columns \
                    or frame.nullable_ints is None and self.services.nullable_ints_possible:
                # (which columns are pandas' nullable ints is unknown only where the script
                # can make them at all)
                if len(frames) == 1:
                    return None
                continue
            labelled = with_row_labels(frame)
            result = Evaluator({**env, name: labelled}, self.services).eval(expr)
            if any(site.status == "todo" for site in result.sites):
                continue
            if keep_index and not (isinstance(result, Frame) and result.index == ("index",)):
                continue
            return result
        return None

    def _labels_where_the_chain_starts(self, expr: cst.BaseExpression, env: dict[str, Value],
                                       keep_index: bool) -> Value | None:
        """labels_as_column of a statement that makes its frame and reorders it in one chain
        (`pd.read_csv(...).sort_values("v")`): the frame the chain starts from (the innermost
        receiver that is a frame porter tracks with its labels still 0..n-1) is given its row
        numbers as a column there."""
        evaluator = Evaluator(env, self.services)
        for receiver in reversed(chain_receivers(expr)):  # the innermost first: where the frame is made
            if not isinstance(receiver, cst.Call):
                continue
            frame = evaluator.eval(receiver)
            if not isinstance(frame, Frame) or not frame.labels_intact or frame.index \
                    or frame.columns is None or "index" in frame.columns \
                    or frame.nullable_ints is None and self.services.nullable_ints_possible:
                continue
            stand_in = "_porter_chain_start"
            rewritten = expr.visit(_Replaced(receiver, cst.Name(stand_in)))
            assert isinstance(rewritten, cst.BaseExpression)
            result = Evaluator({**env, stand_in: with_row_labels(frame)}, self.services).eval(rewritten)
            if stand_in in result.code.text or any(site.status == "todo" for site in result.sites):
                return None
            if keep_index and not (isinstance(result, Frame) and result.index == ("index",)):
                return None
            return result
        return None

    def made_by_pandas(self, name: str, expr: cst.BaseExpression, env: dict[str, Value],
                       value: Value) -> tuple[str, list[SiteDraft]] | None:
        """`pos = df[df["a"] > 0]` whose row labels pandas code reads later (`pos.index`): a
        filter or sort made them the original row numbers, which a Polars frame does not keep.
        The frames the statement reads are handed to pandas in their own names (they come back
        at the next statement porter rewrites) and pandas runs the statement, so `pos` holds
        pandas' labels. A Series kept in a name as an expression of one of those frames (a
        mask, `m = df["a"] > 0; pos = df[m]`) is computed by pandas first, in its name. None
        when the statement reads something else porter made (an expression of another frame)
        or a frame whose own labels are already renumbered."""
        names = _names_read(self.services.code_for(expr))
        ported = [n for n in names if n not in env and n in self.services.functions
                  and (self.services.functions[n].frame_params
                       or isinstance(self.services.functions[n].returns, Frame))]
        if ported:
            # the script's own function made the frame, its body ported to Polars: when its
            # body reads no frame of the script's, the next pass leaves it pandas code, which
            # pandas runs here (its result an unknown value)
            if any(not self.runs_on_its_own(n, env) for n in ported):
                return None
            self.services.pandas_functions.update(ported)
            return None
        read = [n for n in names if n in env]
        frames = [n for n in read if isinstance(env[n], Frame)]
        # the frames such a Series is an expression of, named or not in the statement
        frames += [o for o in dict.fromkeys(env[n].frame.code.text for n in read  # type: ignore[union-attr]
                                             if isinstance(env[n], Column) and env[n].binding is not None)
                   if o not in frames and isinstance(env.get(o), Frame)]
        if not frames and any(not isinstance(env[n], (Module, Opaque, Scalar)) for n in read):
            return None
        # (no frame read at all: the statement makes its frame and reorders it in one chain,
        # pd.read_csv(...).sort_values("v"), which pandas runs as written)
        if frames and any(not isinstance(env[n], (Frame, PandasValue, Module, Opaque, Scalar))
                          and not _expression_of(env[n], frames) for n in read):
            return None
        if any(env[n].index for n in frames):  # type: ignore[union-attr]
            return None
        renumbered = [n for n in frames if not env[n].labels_intact]  # type: ignore[union-attr]
        if renumbered:
            # its own rows were filtered or sorted before: the next pass has pandas make that
            # frame too, back to one whose labels are 0..n-1
            for n in renumbered:
                Evaluator(env, self.services).note_labels_read(env[n])  # type: ignore[arg-type]
            return None
        lines = []
        for n in frames:
            frame = env[n]
            assert isinstance(frame, Frame)
            lines += self.hand_over_expressions_of(n, env, expr)
            lines.append(f"{n} = {handover.to_pandas(frame).text}")
            env[n] = PandasValue(emit.atom(n), frame=replace(frame, code=emit.atom(n), sites=()))
        if _inplace_call_of(expr) == name:  # df.sort_values(..., inplace=True) as written
            lines.append(self.services.code_for(expr))
        else:
            lines.append(f"{name} = {self.services.code_for(expr)}")
        env[name] = PandasValue(emit.atom(name))
        # one marker for the statement, not one per call in it: each call is pandas' own
        message = (f"pandas code reads the row labels of `{name}` later, which are the "
                   "original row numbers after a filter or sort: pandas makes it; to port "
                   "it, keep the row number as a column (with_row_index) where the frame is "
                   "read and use that column where the labels are read")
        if isinstance(value, Frame) and value.dask:
            message = (f"code kept on Dask reads `{name}` later (a call porter does not port, "
                       "or Dask's row labels, which start again at 0 in each partition): the "
                       "read stays Dask's")
        site = SiteDraft("frame.labels", "handover", "todo", 0.0, message,
                         *self.services.statement_lines)
        sites = [replace(x, status="handover", confidence=1.0,
                         message=f"made by pandas with `{name}`, for its row labels")
                 if x.status == "converted" else x for x in value.sites]
        return "\n".join(lines), [*sites, site]

    def runs_on_its_own(self, function: str, env: dict[str, Value]) -> bool:
        """Whether the body of the script's function `function` reads nothing porter changes
        outside it (a frame or Series of the script's, another of its functions), so that it
        can stay pandas code as written (services.pandas_functions)."""
        definition = self.services.function_defs.get(function)
        if definition is None:
            return False
        params = {p.name.value for p in (*definition.params.posonly_params, *definition.params.params,
                                         *definition.params.kwonly_params)}
        for name in _names_read(self.services.code_for(definition.body)):
            if name in params:
                continue
            if name in self.services.functions or is_pandas(env.get(name)) \
                    or isinstance(env.get(name), PandasValue):
                return False
        return True

    def parts_as_columns(self, name: str, parts: Parts, env: dict[str, Value],
                         indent: str) -> tuple[str | None, list[SiteDraft]] | None:
        """`route = df["route"].str.extract(pat)` read after `df["route"]` is overwritten
        (`df["route"] = route[0]; df["area"] = route[1]`), or changed in place (`parts.columns
        = ["a", "b"]`, `parts["a"] = parts["a"].str.zfill(5)`): pandas' frame of parts keeps
        its own values. Its columns are added to the text's frame under names of their own
        where it is bound (`df.with_columns(_route_0=route.struct.field("1"), ...)`), each
        `route[k]` reads its column, a change writes it, and they are dropped after the name's
        last read. Only at the top level, when until that read the frame is only read or
        written column by column (`df["c"]`), so no output shows the added columns, and the
        name is changed only by those two forms (a whole read, print(parts.head()), is
        pandas' frame made from the columns). str.split(expand=True) needs `parts.columns =`
        for its width. None otherwise (pandas computes it)."""
        source = parts.source
        frame_name = source.frame.code.text
        frame = env.get(frame_name)
        refused = getattr(self.services, "parts_refused", set())
        if parts.ints:
            return None  # isocalendar()'s integers: pandas computes it where it is bound
        if self.function is not None or self.loop_depth or self.statement_key in refused \
                or not parts_current(parts, env) or not isinstance(frame, Frame) \
                or frame.columns is None or not frame_name.isidentifier():
            return None
        found = _last_read_column_by_column(self.services.python_module, name, frame_name,
                                            self.services.statement_lines[1],
                                            self.services.changed_in_place.get(name, []))
        if found is None:
            return None
        last, written, relabels = found
        if not written & source.refs and name not in self.services.changed_in_place:
            return None  # its text is not overwritten before the last read: kept as it is
        sites: list[SiteDraft] = []
        if parts.fields:  # str.extract, str.split(n=k, expand=True): struct fields
            fields = dict(parts.fields)
            labels = list(fields)
            field_code = {label: emit.atom(name).attr("struct").method("field", fields[label])
                          for label in labels}
        elif not parts.fields and relabels:
            # pandas' width is the parts of the longest row, and `parts.columns = [...]`
            # raises unless it has as many names
            labels = list(range(len(relabels[0])))
            field_code = {i: emit.atom(name).attr("list").method("get", i, null_on_oob=True)
                          for i in labels}
            sites.append(SiteDraft(
                "series.str.split", "split", "converted", 0.98,
                "pandas' width is the parts of the longest row: it raises where that is not "
                f"{len(labels)}, and Polars takes the first {len(labels)}",
                *self.services.statement_lines))
        else:
            return None
        hidden: dict[object, str] = {}
        for label in labels:
            column = f"_{name}_{label}"
            while column in frame.columns or column in hidden.values():
                column = "_" + column
            hidden[label] = column
        # the name keeps the expression of the whole result, as for a frame of parts whose
        # text stays (parts.struct.field("1")); the frame takes its columns from it
        whole = emit.layout_chain(parts.code, indent, f"{name} = ")
        code = emit.atom(frame_name).method("with_columns", **{
            column: field_code[label] for label, column in hidden.items()})
        text, bound_sites = self.bind(frame_name, with_column_updates(
            frame, code, dict.fromkeys(hidden.values(), "str")), env, indent)
        text = f"{whole}\n{text}" if text else whole
        env[name] = replace(parts, code=emit.atom(name), sites=(), bound=False,
                            binding=self.statement_key, width_known=True)
        self.parts_columns[name] = (frame_name, hidden)
        self.parts_relabelled(name, env, hidden)
        self.parts_drops[last] = (frame_name, tuple(hidden.values()))
        return text, [*parts.sites, *bound_sites, *sites]

    def series_as_column(self, name: str, value: Column, env: dict[str, Value],
                         indent: str) -> tuple[str | None, list[SiteDraft]] | None:
        """`late = df["stop"] < df["start"]` read after a column it reads is overwritten
        (`df.loc[late, "stop"] += ...; print(late.sum())`): pandas' Series keeps its values.
        It is added to its frame as a column of its own where it is bound, read from there,
        and dropped after the name's last read, under the conditions of parts_as_columns (the
        frame read and written column by column until then). None otherwise."""
        frame_name = value.frame.code.text
        frame = env.get(frame_name)
        if self.function is not None or self.loop_depth or name in self.services.changed_in_place \
                or not isinstance(frame, Frame) or frame.columns is None \
                or not frame_name.isidentifier() or value.element:
            return None
        found = _last_read_column_by_column(self.services.python_module, name, frame_name,
                                            self.services.statement_lines[1], [])
        if found is None or not found[1] & value.refs:
            return None  # nothing it reads is overwritten before its last read
        last = found[0]
        column = f"_{name}"
        while column in frame.columns:
            column = "_" + column
        # the name keeps the expression, as a Series of its frame does; the frame takes it
        whole = emit.layout_chain(value.code, indent, f"{name} = ")
        code = emit.atom(name).method("fill_null", False) if value.null_is_false else emit.atom(name)
        text, sites = self.bind(frame_name, with_column_updates(
            frame, emit.atom(frame_name).method("with_columns", **{column: code}),
            {column: value.dtype}), env, indent)
        text = f"{whole}\n{text}" if text else whole
        widened = env[frame_name]
        if not isinstance(widened, Frame):  # not expected: the frame was handed over
            return None
        env[name] = replace(value, code=emit.col(column), frame=widened, sites=(),
                            refs=frozenset({column}), null_is_false=False,
                            versions=((column, widened.version(column)),))
        self.parts_drops[last] = (frame_name, (column,))
        return text, [*value.sites, *sites]

    def parts_relabelled(self, name: str, env: dict[str, Value], hidden: dict[object, str]) -> None:
        """The frame of parts `name` as its columns now are: each label read from its column
        of the text's frame (see parts_as_columns), pandas' frame made from them."""
        frame_name, _ = self.parts_columns[name]
        frame, parts = env.get(frame_name), env.get(name)
        if not isinstance(frame, Frame) or not isinstance(parts, Parts):
            return  # handed to pandas meanwhile: pandas code reads it from there
        kept = Column(emit.col(next(iter(hidden.values()))), frame=frame, name=parts.source.name,
                      dtype="str", refs=frozenset(hidden.values()),
                      versions=tuple((c, frame.version(c)) for c in hidden.values()))
        names = [str(label) for label in hidden]
        whole = select_columns(frame, emit.atom(frame_name).method(
            "select", *(emit.col(c).method("alias", str(label)) for label, c in hidden.items())),
            names)
        env[name] = replace(parts, source=kept, fields=tuple((label, c) for label, c in hidden.items()),
                            singles=tuple((label, emit.col(c)) for label, c in hidden.items()),
                            pandas=handover.to_pandas(whole), whole=whole)
        self.parts_columns[name] = (frame_name, hidden)

    def parts_changed(self, target: cst.Subscript | cst.Attribute, value: Value | cst.BaseExpression,
                      env: dict[str, Value], evaluator: Evaluator,
                      indent: str) -> tuple[str | None, list[SiteDraft]] | None:
        """`parts.columns = [...]` or `parts["a"] = ...` on a frame of parts kept as columns
        (see parts_as_columns): new labels, or the label's column written in the text's
        frame. None when it is not one."""
        owner = target.value
        if not isinstance(owner, cst.Name) or owner.value not in self.parts_columns \
                or not isinstance(env.get(owner.value), Parts):
            return None
        name = owner.value
        frame_name, hidden = self.parts_columns[name]
        frame = env.get(frame_name)
        if isinstance(target, cst.Attribute):
            labels = evaluator.eval(value) if isinstance(value, cst.BaseExpression) else value
            names = labels.const if isinstance(labels, Opaque) and labels.is_const else None
            if target.attr.value != "columns" or not isinstance(names, (list, tuple)) \
                    or len(names) != len(hidden) or len(set(map(repr, names))) != len(names):
                return self.parts_refuse(name, env)
            self.parts_relabelled(name, env, dict(zip(names, hidden.values())))
            return "", []
        key = evaluator.eval(_index_of(target))
        label = key.const if isinstance(key, Opaque) and key.is_const else None
        if label not in hidden or not isinstance(frame, Frame) or not isinstance(value, Value):
            return self.parts_refuse(name, env)
        try:
            code = expr_in(value, frame)
        except Unsupported:
            return self.parts_refuse(name, env)
        text, sites = self.bind(frame_name, with_column_updates(
            frame, emit.atom(frame_name).method("with_columns", **{hidden[label]: code}),
            {hidden[label]: value_dtype(value)}), env, indent)
        self.parts_relabelled(name, env, hidden)
        return text, [*value.sites, *sites]

    def parts_refuse(self, name: str, env: dict[str, Value]) -> None:
        """A change of a frame of parts kept as columns that porter does not follow: the next
        pass has pandas compute it where it is bound (and the pass at hand goes on)."""
        parts = env.get(name)
        refused = getattr(self.services, "parts_refused", None)
        if refused is None:
            refused = set()
            self.services.parts_refused = refused  # type: ignore[attr-defined]
        if isinstance(parts, Parts) and parts.binding is not None:
            refused.add(parts.binding)
        return None

    def drop_parts_columns(self, env: dict[str, Value], indent: str) -> str | None:
        """After the statement that reads a frame of parts kept as columns for the last time
        (see parts_as_columns): those columns are dropped from its frame."""
        start, end = self.services.statement_lines
        due = [line for line in self.parts_drops if start <= line <= end]
        texts = []
        for line in due:
            frame_name, columns = self.parts_drops.pop(line)
            frame = env.get(frame_name)
            if isinstance(frame, Frame) and frame.columns is not None:
                kept = [c for c in frame.columns if c not in columns]
                code = emit.atom(frame_name).method("drop", *columns)
                text, _ = self.bind(frame_name, select_columns(frame, code, kept), env, indent)
                texts.append(text or "")
            elif isinstance(frame, PandasValue):  # handed to pandas since: dropped there
                texts.append(f"{frame_name} = {frame_name}.drop(columns={list(columns)!r})")
        return "\n".join(t for t in texts if t) or None

    def series_of_its_own(self, name: str, value: Column) -> tuple[Code, Column]:
        """`s = df.select(...)`: the Series keeps its values when `df` is filtered later; it is
        still an expression of `df` while `df` keeps the same rows and columns."""
        column = value.name if value.name is not None else "0"
        plain = value.code.text == emit.col(column).text
        version = value.frame.version(column) if plain else fresh_token()
        # the index columns go with it (handover.series_frame selects them): the row labels a
        # filter left, a groupby's keys; the frame of its own holds them as its index too, or
        # its first column would be taken for the values
        keys = tuple(k for k in value.frame.index if k != column)
        frame = Frame(emit.atom(name), rows=value.frame.rows, columns=(*keys, column),
                      versions=((column, version),), labels_intact=value.frame.labels_intact,
                      dask=value.frame.dask, dask_many=value.frame.dask_many, index=keys,
                      index_unnamed=value.frame.index_unnamed if keys else False,
                      dtypes=tuple((k, t) for k, t in value.frame.dtypes if k in keys)
                      + (((column, value.dtype),) if value.dtype else ()))
        kept = Column(emit.col(column), frame=frame, name=value.name, dtype=value.dtype,
                      refs=frozenset({column}), versions=((column, version),),
                      binding=self.statement_key)
        return handover.series_frame(value), kept

    def bind(self, name: str, value: Value, env: dict[str, Value], indent: str) -> tuple[str | None, list[SiteDraft]]:
        """`name = value`: remember what the name now holds and write the assignment."""
        code = value.code
        self.handed_from.pop(name, None)
        small = self.current_small
        # `name = other`: the statement binds the name itself (not `df["c"] = flag`)
        source = small.value if isinstance(small, cst.Assign) and len(small.targets) == 1 \
            and isinstance(small.targets[0].target, cst.Name) \
            and small.targets[0].target.value == name else None
        binds_name = isinstance(small, cst.Assign) and len(small.targets) == 1 \
            and isinstance(small.targets[0].target, cst.Name) and small.targets[0].target.value == name \
            or isinstance(small, cst.Expr) and _inplace_call_of(small.value) == name
        if source is not None and any(site.status == "todo" and site.key in _LABEL_TODOS
                                      for site in value.sites):
            # the statement reads the labels a filter or sort made in one chain
            # (df.sort_values("a").head(3).reset_index()): numbered where the chain starts
            labelled = self.labels_as_column(source, env, keep_index=False)
            if labelled is not None:
                return self.bind(name, labelled, env, indent)
        frame_of = value if isinstance(value, Frame) else value.frame if isinstance(value, Column) else None
        if frame_of is not None and binds_name and not frame_of.labels_intact and not frame_of.index \
                and self.statement_key in self.services.labels_needed:
            labelled = self.labels_as_column(small.value, env)  # type: ignore[union-attr]
            if labelled is not None:
                return self.bind(name, labelled, env, indent)
            made = self.made_by_pandas(name, small.value, env, value)  # type: ignore[union-attr]
            if made is not None:
                return made
        if frame_of is not None and not binds_name and not frame_of.labels_intact \
                and not frame_of.index and self.statement_key in self.services.labels_needed:
            # `df["b"] = ...` keeps the rows: their labels are the frame's before it, which
            # the next pass has pandas make
            before = env.get(name)
            before = before.frame if isinstance(before, Column) else before
            if isinstance(before, Frame) and before.binding is not None:
                self.services.labels_needed.add(before.binding)
            elif isinstance(before, Frame) and self.function is not None:
                self.services.label_functions.add(self.function)  # a frame it was given
        if isinstance(value, Frame) and isinstance(source, cst.Name) and source.value != name \
                and self.changed_later(name, source.value):
            # `view = df` and one of them changed in place: both names are one object in
            # pandas, so a change through either shows through the other. Both stay pandas.
            original = source.value
            self.note_handed_over(original, value)
            # the frame stays pandas from here: a Series kept as an expression of it
            # (`s = df["s"]`) is computed by pandas now, or it would have nothing to run on
            lines = self.hand_over_expressions_of(original, env, None)
            lines += [f"{original} = {handover.to_pandas(value).text}", f"{name} = {original}"]
            env[original], env[name] = PandasValue(emit.atom(original)), PandasValue(emit.atom(name))
            site = SiteDraft("frame.alias", "handover", "todo", 0.0,
                             f"`{name}` and `{original}` are one frame, changed in place through "
                             "one of them: both are handed to pandas", *self.services.statement_lines)
            return "\n".join(lines), [*value.sites, site]
        if isinstance(value, Frame):
            self.note_stale_series(name, value, env)
            self.note_parents(code, env)
            cells = value.number_cells
            if cells is not None:  # still the pivoted table, now under its name
                cells = (name, cells[1]) if cells[0] == code.text else None
            env[name] = replace(value, code=emit.atom(name), sites=(), binding=self.statement_key,
                                number_cells=cells)
            if self.emit_code and (self.computed_once() or self.read_changed_later()) \
                    and not _is_collected(code):
                code = code.method("collect").method("lazy")
            if code.text == name:  # `df = df.reset_index()` of a frame with no index
                return "", list(value.sites)
        elif isinstance(value, Column):
            frame_name = value.frame.code.text
            same_frame = frame_name in env and isinstance(env[frame_name], Frame) \
                and env[frame_name].rows == value.frame.rows  # type: ignore[union-attr]
            if same_frame and (kept := self.series_as_column(name, value, env, indent)) is not None:
                return kept
            if same_frame and self.statement_key in self.services.stale_series:
                code, env[name] = self.series_of_its_own(name, value)
            elif same_frame:
                # an expression of its frame, kept in a name: pl.col("kg") * 2
                env[name] = replace(value, code=emit.atom(name), sites=(), binding=self.statement_key)
                if value.null_is_false:
                    code = value.code.method("fill_null", False)
                    env[name] = replace(env[name], null_is_false=False)  # type: ignore[arg-type]
            elif getattr(value, "pandas", None) is not None:
                # values Polars has no type for (periods, bytes): pandas makes them, in the name
                env[name] = PandasValue(emit.atom(name))
                site = SiteDraft(f"{value.key_prefix}", "handover", "todo", 0.0,
                                 "values Polars has no type for, kept in a name: pandas makes "
                                 "them; use them on the line that makes them (astype(str), "
                                 "str.decode) to port them", *self.services.statement_lines)
                return emit.layout_chain(value.pandas, indent, f"{name} = "), [*value.sites, site]  # type: ignore[attr-defined]
            else:
                code = handover.series_frame(value)
                if self.emit_code and (self.computed_once() or self.read_changed_later()) \
                        and not _is_collected(code):
                    # a Series read by two or more consumers is computed once, where it is made
                    code = code.method("collect").method("lazy")  # (and see read_changed_later)
                self.note_parents(code, env)
                column = value.name if value.name is not None else "0"
                known = (*value.frame.index, column)
                rows = fresh_token()
                # the same rows, in the same order, as the frame the Series came from
                frame = Frame(emit.atom(name), columns=known, rows=rows,
                              index=value.frame.index, labels_intact=value.frame.labels_intact,
                              dask=value.frame.dask, dask_many=value.frame.dask_many,
                              index_unnamed=value.frame.index_unnamed,
                              binding=self.statement_key,
                              dtypes=tuple((c, t) for c, t in value.frame.dtypes
                                           if c in value.frame.index)
                              + (((column, value.dtype),) if value.dtype else ()),
                              grouped_rows=rows if value.frame.grouped_rows == value.frame.rows
                              else None, levels_as_met=value.frame.levels_as_met,
                              levels_with_missing=value.frame.levels_with_missing)
                env[name] = Column(emit.col(column), frame=frame, name=value.name,
                                   dtype=value.dtype, refs=frozenset({column}),
                                   binding=self.statement_key)
        elif isinstance(value, Parts):
            # str.extract / split(expand=True) kept in a name: the Polars expression of the
            # whole result, its columns taken from it (parts.struct.field("1")); pandas computes
            # it when the name is changed in place or is read after its frame's name holds
            # other rows (the evaluator notes that)
            if (kept := self.parts_as_columns(name, value, env, indent)) is not None:
                return kept
            if parts_current(value, env) and name not in self.services.changed_in_place \
                    and self.statement_key not in self.services.stale_series:
                env[name] = replace(value, code=emit.atom(name), sites=(), bound=True,
                                    binding=self.statement_key)
            else:
                code = value.pandas
                env[name] = PandasValue(emit.atom(name))
                site = SiteDraft("series.str.expand", "handover", "todo", 0.0,
                                 f"`{name}` is changed in place, or read after its text's frame "
                                 "changed: pandas computes it", *self.services.statement_lines)
                return emit.layout_chain(code, indent, f"{name} = "), [*value.sites, site]
        elif isinstance(value, Indexed) and not value.grouped and self.changed_later(name):
            # changed in place later (df["c"] = ..., df.sort_index(inplace=True)): the table
            # labelled by the key, its column held as the index, as a groupby's keys are
            return self.bind(name, labelled_frame(value.frame, value.key), env, indent)
        elif isinstance(value, Indexed) and not value.grouped:
            # `df = df.set_index("ts")`: the name holds the Polars frame (the column kept);
            # pandas code porter does not port gets it with its labels set again
            self.note_stale_series(name, value.frame, env)
            # the labels' column first, as pandas puts it back (reset_index) and as porter
            # keeps the keys of a groupby's result
            frame, key = value.frame, value.key
            if frame.columns is None:
                code = frame.code.method("select", key, emit.pl("exclude", key))
            elif frame.columns[0] != key:
                columns = (key, *(c for c in frame.columns if c != key))
                code = frame.code.method("select", *columns)
                value = replace(value, frame=replace(frame, columns=columns))
            else:
                code = frame.code
            if self.emit_code and (self.computed_once() or self.read_changed_later()) \
                    and not _is_collected(code):
                code = code.method("collect").method("lazy")  # see read_changed_later
            self.note_parents(code, env)
            kept = replace(value.frame, code=emit.atom(name), sites=(), binding=self.statement_key)
            env[name] = replace(value, code=handover.to_pandas(kept).method("set_index", value.key),
                                frame=kept, sites=())
            if code.text == name:  # `df = df.set_index("k")` of a frame holding k first already
                return "", list(value.sites)
        elif isinstance(value, Grouped) and value.frame.code.text.isidentifier() \
                and not value.prepared and value.selection is None \
                and self.changed_later(value.frame.code.text):
            # pandas' DataFrameGroupBy holds the frame object, which df["c"] = ... changes in
            # place later: each use groups the frame as it is then, so nothing is bound here
            # (one of its columns taken, g = df.groupby(k)["x"], holds that column as it was)
            env[name] = replace(value, sites=(), live=True)
            return "", list(value.sites)
        elif isinstance(value, Grouped):
            if self.emit_code and self.read_changed_later() and not _is_collected(value.frame.code):
                # see read_changed_later: the frame is read here, before the file changes
                value = replace(value, frame=replace(
                    value.frame, code=value.frame.code.method("collect").method("lazy")))
            code = grouping_code(value)
            env[name] = replace(value, code=emit.atom(name), prepared=True, sites=())
        elif isinstance(value, Scalar) and value.kept_when_bound:
            env[name] = replace(value, code=emit.atom(name), sites=())
        elif isinstance(value, Scalar):
            env[name] = Scalar(emit.atom(name), pytype=value.pytype)
        elif isinstance(value, PandasValue):
            fresh = self.current_small.value if isinstance(self.current_small, cst.Assign) else None
            plain = fresh is not None and _makes_plain_frame(fresh) \
                and not self.services.categories_possible \
                and not _LIST_CELLS.search(self.services.code_for(fresh))
            # a frame pandas made with labels 0..n-1 comes back to Polars at the next statement
            # porter can rewrite whole
            env[name] = PandasValue(emit.atom(name), frame=Frame(emit.atom(name)) if plain else None)
        elif isinstance(value, Opaque):
            const, pytype = value.const, value.pytype
            if isinstance(const, (list, tuple, dict, set)) and pytype is None:
                pytype = type(const).__name__
            if name in self.services.mutated and isinstance(const, (list, dict, set)):
                const = MISSING  # changed in place somewhere: not a constant (still a list)
            env[name] = Opaque(emit.atom(name), const=const, pytype=pytype)
        elif isinstance(value, Module):
            env[name] = Module(emit.atom(name), qualname=value.qualname)
        elif isinstance(value, Accessor) and value.kind == "dt" and value.index_of is not None \
                and len(value.index_of.index) == 1:
            # `idx = df.index` of a table labelled by one date key: the name holds a frame of
            # the key alone (its labels, in the table's order), whose DatetimeIndex methods
            # are ported as on df.index itself; pandas is not imported to hold the labels
            key = value.index_of.index[0]
            code = value.index_of.code.method("select", key)
            if self.emit_code and (self.computed_once() or self.read_changed_later()) \
                    and not _is_collected(code):
                code = code.method("collect").method("lazy")
            self.note_parents(code, env)
            frame = Frame(emit.atom(name), columns=(key,), rows=fresh_token(), index=(key,),
                          labels_intact=value.index_of.labels_intact,
                          index_unnamed=value.index_of.index_unnamed,
                          dtypes=((key, "datetime"),), binding=self.statement_key)
            env[name] = replace(value, code=Code(f"{name}.index"), sites=(), index_of=frame,
                                column=replace(value.column, code=emit.col(key), frame=frame,
                                               binding=self.statement_key))
        else:
            code = Evaluator(env, self.services).handed_to_unknown(value, cst.Name(name)).code
            env[name] = PandasValue(emit.atom(name))
        return emit.layout_chain(code, indent, f"{name} = "), list(value.sites)


# -- frames reachable through another name (Engine.shared_frames) ----------------------------

# calls that hand on the objects they are given (a zip of frames gives the frames themselves)
_PASSES_ON = frozenset({"zip", "enumerate", "list", "tuple", "reversed", "iter", "dict", "set"})
# a container's methods that give its items themselves
_ITEMS_OF = frozenset({"items", "values", "get", "pop", "copy", "setdefault"})
# list, dict and set methods that store what they are given
_STORES = frozenset({"append", "extend", "insert", "add", "update", "setdefault"})


def _held_names(node: ast.AST, containers: frozenset[str] = frozenset()) -> list[str]:
    """The names whose objects `node` hands on as they are (never a copy or a value computed
    from them): the expression itself, the items of a list, tuple, set or dict written out,
    both branches of `a if c else b`, what zip/enumerate/list/... are given, and a container of
    `containers` read for its items (`frames[0]`, `frames.items()`)."""
    if isinstance(node, ast.Name):
        return [node.id]
    if isinstance(node, (ast.List, ast.Tuple, ast.Set)):
        return [n for e in node.elts for n in _held_names(e, containers)]
    if isinstance(node, ast.Starred):
        return _held_names(node.value, containers)
    if isinstance(node, ast.Dict):
        return [n for v in node.values for n in _held_names(v, containers)]
    if isinstance(node, ast.IfExp):
        return _held_names(node.body, containers) + _held_names(node.orelse, containers)
    if isinstance(node, ast.Call) and isinstance(node.func, ast.Name) and node.func.id in _PASSES_ON:
        return [n for a in [*node.args, *(k.value for k in node.keywords)]
                for n in _held_names(a, containers)]
    if isinstance(node, ast.Call) and isinstance(node.func, ast.Attribute) \
            and node.func.attr in _ITEMS_OF:
        return [n for n in _held_names(node.func.value, containers) if n in containers]
    if isinstance(node, ast.Subscript):
        return [n for n in _held_names(node.value, containers) if n in containers]
    return []


def _stored_names(target: ast.AST) -> list[str]:
    """The names an assignment target holds the value in: `a, b` both, `box["k"]` box."""
    if isinstance(target, ast.Name):
        return [target.id]
    if isinstance(target, (ast.Tuple, ast.List)):
        return [n for e in target.elts for n in _stored_names(e)]
    if isinstance(target, ast.Starred):
        return _stored_names(target.value)
    while isinstance(target, (ast.Subscript, ast.Attribute)):
        target = target.value
    return [target.id] if isinstance(target, ast.Name) else []


def _shared_by(stmt: ast.stmt, is_frame: Callable[[str], bool]) -> tuple[list[str], list[str]]:
    """(names whose objects the statement stores, the names it stores them in) for an
    assignment (`frames = [jan, feb]`, `a, b = jan, feb`, `box["k"] = jan`) or a container's
    storing method (`frames.append(df)`); `view = df` is Engine.bind's (frame.alias)."""
    if isinstance(stmt, ast.Assign) and not (
            len(stmt.targets) == 1 and isinstance(stmt.targets[0], ast.Name)
            and isinstance(stmt.value, ast.Name)):
        return _held_names(stmt.value), [n for t in stmt.targets for n in _stored_names(t)]
    if isinstance(stmt, (ast.AugAssign, ast.AnnAssign)) and stmt.value is not None:
        return _held_names(stmt.value), _stored_names(stmt.target)
    if isinstance(stmt, ast.Expr) and isinstance(stmt.value, ast.Call) \
            and isinstance(stmt.value.func, ast.Attribute) and stmt.value.func.attr in _STORES:
        owner = _stored_names(stmt.value.func.value)
        if owner and not is_frame(owner[0]):  # not a frame's own update() or insert()
            return [n for a in stmt.value.args for n in _held_names(a)], owner
    return [], []


def _last_read_column_by_column(module: ast.Module | None, name: str, frame: str, after: int,
                                 change_lines: list[int]
                                 ) -> tuple[int, set[object], list[list[object]]] | None:
    """For a frame of parts bound to `name` at line `after` (see parts_as_columns): the line
    of the name's last use, the columns of `frame` written until that statement
    (`frame["c"] = ...`) and the labels `name.columns = [...]` gives, when until then every
    use of `frame` is a subscript with a constant (`frame["c"]`), `name` is not bound again
    and is changed in place only by `name["c"] = ...` and `name.columns = [...]`, all in
    statements at the top level of the module; else None."""
    if module is None:
        return None
    uses = [(stmt, node) for stmt in module.body for node in ast.walk(stmt)
            if isinstance(node, ast.Name) and node.id in (name, frame) and node.lineno > after]
    lines = [node.lineno for _, node in uses if node.id == name]
    if not lines:
        return None
    last_statement = next(stmt for stmt, node in uses if node.lineno == max(lines))
    end = last_statement.end_lineno or last_statement.lineno
    subscripted: dict[int, ast.Subscript] = {}
    relabelled: dict[int, list[object]] = {}
    for stmt, _ in uses:
        for node in ast.walk(stmt):
            if isinstance(node, ast.Subscript) and isinstance(node.value, ast.Name) \
                    and isinstance(node.slice, ast.Constant) \
                    and isinstance(node.slice.value, (str, int)) \
                    and not isinstance(node.slice.value, bool):
                subscripted[id(node.value)] = node
            if isinstance(node, ast.Assign) and len(node.targets) == 1 \
                    and isinstance(node.targets[0], ast.Attribute) \
                    and node.targets[0].attr == "columns" \
                    and isinstance(node.targets[0].value, ast.Name) \
                    and isinstance(node.value, (ast.List, ast.Tuple)) \
                    and all(isinstance(e, ast.Constant) for e in node.value.elts):
                relabelled[id(node.targets[0].value)] = [e.value for e in node.value.elts]
    # frame.loc[rows, "c"] = ... (and +=): one column written
    located = {id(node.value.value): node.slice.elts[1].value
               for stmt, _ in uses for node in ast.walk(stmt)
               if isinstance(node, ast.Subscript) and isinstance(node.ctx, ast.Store)
               and isinstance(node.value, ast.Attribute) and node.value.attr == "loc"
               and isinstance(node.value.value, ast.Name) and isinstance(node.slice, ast.Tuple)
               and len(node.slice.elts) == 2 and isinstance(node.slice.elts[1], ast.Constant)
               and isinstance(node.slice.elts[1].value, str)}
    compound = (ast.FunctionDef, ast.AsyncFunctionDef, ast.ClassDef, ast.For, ast.AsyncFor,
                ast.While, ast.If, ast.With, ast.AsyncWith, ast.Try)
    written: set[object] = set()
    relabels: list[list[object]] = []
    changes_seen: set[int] = set()
    for stmt, node in uses:
        if node.lineno > end:
            continue
        if isinstance(stmt, compound) or isinstance(node.ctx, ast.Store):
            return None  # in a block, or the name bound again
        subscript = subscripted.get(id(node))
        before_last = stmt.lineno < last_statement.lineno
        if node.id == frame and id(node) in located:
            if before_last:
                written.add(located[id(node)])
            continue
        if node.id == frame:
            if subscript is None:
                return None  # the frame read as a whole would show the added columns
            if isinstance(subscript.ctx, ast.Store) and before_last:
                # written before the statement of the last read (Python reads that
                # statement's value before it writes)
                written.add(subscript.slice.value)  # type: ignore[attr-defined]
        elif subscript is not None and isinstance(subscript.ctx, ast.Store):
            changes_seen.add(node.lineno)
        elif id(node) in relabelled:
            relabels.append(relabelled[id(node)])
            changes_seen.add(node.lineno)
    if any(line > after and line not in changes_seen for line in change_lines):
        return None  # changed in place another way (inplace=True, a call of a function)
    return max(lines), written, relabels


def _bindings(module: ast.Module | None) -> tuple[dict[str, list[int]], list[tuple[list[str], ast.AST]]]:
    """Where each name is bound, and every (names, value) binding of the script: assignments,
    loops (their names take the items of what they iterate), `with ... as`, and a
    container's storing methods (`others.append(x)`)."""
    lines: dict[str, list[int]] = {}
    found: list[tuple[list[str], ast.AST]] = []
    if module is None:
        return lines, found
    for node in ast.walk(module):
        pairs: list[tuple[ast.AST, ast.AST]] = []
        if isinstance(node, ast.Assign):
            pairs = [(t, node.value) for t in node.targets]
        elif isinstance(node, (ast.AugAssign, ast.AnnAssign)) and node.value is not None:
            pairs = [(node.target, node.value)]
        elif isinstance(node, (ast.For, ast.AsyncFor, ast.comprehension)):
            pairs = [(node.target, node.iter)]
        elif isinstance(node, ast.withitem) and node.optional_vars is not None:
            pairs = [(node.optional_vars, node.context_expr)]
        elif isinstance(node, ast.Call) and isinstance(node.func, ast.Attribute) \
                and node.func.attr in _STORES:
            pairs = [(node.func.value, a) for a in node.args]
        for target, value in pairs:
            names = _stored_names(target)
            found.append((names, value))
            if isinstance(node, ast.Call):
                continue
            for name in names:
                lines.setdefault(name, []).append(getattr(node, "lineno", getattr(value, "lineno", 0)))
    return lines, found


# pandas methods that change their frame or Series in place (and have no rule that rewrites the
# change); list methods of the same names are not affected: only tracked frames are handed over
def _changed_targets(stmt: cst.BaseSmallStatement) -> list[cst.BaseExpression]:
    """Subscripts and attributes the statement assigns to or deletes."""
    if isinstance(stmt, cst.Assign):
        targets = [t.target for t in stmt.targets]
    elif isinstance(stmt, (cst.AugAssign, cst.AnnAssign)):
        targets = [stmt.target]
    elif isinstance(stmt, cst.Del):
        targets = list(stmt.target.elements) if isinstance(stmt.target, cst.Tuple) else [stmt.target]
        targets = [t.value if isinstance(t, cst.Element) else t for t in targets]
    else:
        return []
    found: list[cst.BaseExpression] = []
    for target in targets:
        if isinstance(target, (cst.Tuple, cst.List)):
            found += [e.value for e in target.elements if isinstance(e.value, (cst.Subscript, cst.Attribute))]
        elif isinstance(target, (cst.Subscript, cst.Attribute)):
            found.append(target)
    return found


def _root_and_path(node: cst.BaseExpression) -> tuple[str | None, str]:
    """`df.at[0, "a"]` -> ("df", "at"); `s.name` -> ("s", "name"); `df["a"]` -> ("df", "setitem")."""
    path: list[str] = []
    while isinstance(node, (cst.Subscript, cst.Attribute)):
        if isinstance(node, cst.Attribute):
            path.append(node.attr.value)
        node = node.value
    if not isinstance(node, cst.Name):
        return None, ""
    return node.value, ".".join(reversed(path)) or "setitem"


# frame methods that work column by column: with constant arguments, each column of the result
# is what the Series method gives that column alone
_COLUMNWISE = frozenset({"fillna", "round", "abs", "clip", "astype"})


def _columns_changed_alike(stmt: cst.BaseSmallStatement, evaluator: Evaluator | None = None
                           ) -> tuple[cst.Name, list[str], list[cst.BaseExpression]] | None:
    """`df[["a", "b"]] = df[["a", "b"]].fillna(0)` (the same names on both sides, a method of
    _COLUMNWISE whose arguments are constants): the frame's name, the columns, and per column
    the expression `df["a"].fillna(0)`; None for any other statement."""
    if not isinstance(stmt, cst.Assign) or len(stmt.targets) != 1:
        return None
    target, value = stmt.targets[0].target, stmt.value
    names = _listed_names(target, evaluator)
    if names is None or not isinstance(value, cst.Call) \
            or not isinstance(value.func, cst.Attribute):
        return None
    source = value.func.value
    assert isinstance(target, cst.Subscript)
    if _listed_names(source, evaluator) != names or not isinstance(source, cst.Subscript) \
            or not source.value.deep_equals(target.value):
        return None
    function = _pandas_function_applied(value, evaluator)
    if function is not None:
        # df[["a", "b"]] = df[["a", "b"]].apply(pd.to_numeric, errors="coerce"): pandas calls
        # the function on each column, with the keywords given
        owner = target.value
        assert isinstance(owner, cst.Name)
        rest = [a for a in value.args[1:] if a.keyword is not None]
        return owner, names, [
            cst.Call(func=function, args=[cst.Arg(cst.Subscript(value=owner, slice=[
                cst.SubscriptElement(cst.Index(cst.SimpleString(emit.render(n))))])), *rest])
            for n in names]
    if value.func.attr.value not in _COLUMNWISE:
        return None
    for arg in value.args:
        if arg.star or arg.keyword is not None and arg.keyword.value == "inplace":
            return None
        if isinstance(arg.value, cst.Name) and arg.value.value in ("str", "int", "float", "bool"):
            continue  # astype(str): a type, the same for each column
        try:
            constant = ast.literal_eval(cst.Module([]).code_for_node(arg.value))
        except (ValueError, SyntaxError, TypeError):
            return None
        if isinstance(constant, (dict, list, tuple, set)):
            return None  # per-column values (a dict) or bounds: not the same for each column
    owner = target.value
    assert isinstance(owner, cst.Name)
    values: list[cst.BaseExpression] = [
        value.with_changes(func=value.func.with_changes(value=cst.Subscript(
            value=owner, slice=[cst.SubscriptElement(cst.Index(cst.SimpleString(emit.render(n))))])))
        for n in names]
    return owner, names, values


def _pandas_function_applied(value: cst.Call, evaluator: Evaluator | None
                             ) -> cst.BaseExpression | None:
    """The function of `<frame>.apply(pd.to_numeric, errors="coerce")`: one of pandas' own
    functions of a Series, given by name, whose other arguments are keywords with constant
    values (not axis=); None for any other call."""
    if evaluator is None or value.func.attr.value != "apply" or not value.args \
            or value.args[0].keyword is not None or value.args[0].star:  # type: ignore[attr-defined]
        return None
    function = evaluator.eval(value.args[0].value)
    from porter.rules.elementwise import PER_COLUMN_FUNCTIONS
    if not (isinstance(function, Module) and function.qualname in PER_COLUMN_FUNCTIONS):
        return None
    for arg in value.args[1:]:
        if arg.keyword is None or arg.star or arg.keyword.value in ("axis", "args", "func",
                                                                     "result_type", "raw"):
            return None
        try:
            ast.literal_eval(cst.Module([]).code_for_node(arg.value))
        except (ValueError, SyntaxError, TypeError):
            return None
    return value.args[0].value


def _listed_names(node: cst.BaseExpression, evaluator: Evaluator | None = None
                  ) -> list[str] | None:
    """The names of `df[["a", "b"]]` (two or more distinct text literals) or None; with an
    evaluator, also of `df[NAMES]` and `df[NAMES + ["c"]]` where porter knows the list (a
    module constant)."""
    if not (isinstance(node, cst.Subscript) and isinstance(node.value, cst.Name)
            and len(node.slice) == 1 and isinstance(node.slice[0].slice, cst.Index)):
        return None
    key = node.slice[0].slice.value
    if evaluator is not None and isinstance(key, (cst.Name, cst.BinaryOperation)):
        known = evaluator.eval(key)
        if not (isinstance(known, Opaque) and isinstance(known.const, list) and not known.sites):
            return None
        names = list(known.const)
    elif isinstance(key, cst.List):
        names = []
        for element in key.elements:
            if not isinstance(element.value, cst.SimpleString):
                return None
            names.append(element.value.evaluated_value)
    else:
        return None
    if len(names) < 2 or len(set(names)) != len(names) or not all(isinstance(n, str) for n in names):
        return None
    return names


def _column_targets(stmt: cst.BaseSmallStatement) -> list[cst.Subscript] | None:
    """The targets of `df["a"], df["b"] = x, y` (as many values, written out) or of
    `df["a"] = df["b"] = x`: subscripts of one name, which _Walker.set_columns sets in one
    step; None for any other statement."""
    if not isinstance(stmt, cst.Assign):
        return None
    if len(stmt.targets) > 1:
        targets = [t.target for t in stmt.targets]
    else:
        target, value = stmt.targets[0].target, stmt.value
        if not isinstance(target, (cst.Tuple, cst.List)) or not isinstance(value, (cst.Tuple, cst.List)) \
                or len(target.elements) != len(value.elements) \
                or any(isinstance(e, cst.StarredElement) for e in (*target.elements, *value.elements)):
            return None
        targets = [e.value for e in target.elements]
    if not all(isinstance(t, cst.Subscript) and isinstance(t.value, cst.Name)
               and len(t.slice) == 1 and isinstance(t.slice[0].slice, cst.Index) for t in targets):
        return None
    if len({t.value.value for t in targets}) != 1:  # type: ignore[attr-defined]
        return None
    return targets  # type: ignore[return-value]


def _rewritten_change(target: cst.BaseExpression, value: Value, stmt: cst.BaseSmallStatement) -> bool:
    """Whether a rule takes the change: `df[key] = ...`, `df.loc[...] = ...`, `df.attr = ...`
    and `del df[key]` on a frame, alone or (`df["a"], df["b"] = ...`, `df["a"] = df["b"] = ...`)
    with other columns of the frame (the rule itself keeps pandas, handing the frame over, when
    it cannot port the change). A subscript among other targets (`x, df["a"] = ...`) is no
    rule's: the frame is handed to pandas first."""
    if not isinstance(value, Frame):
        return False
    if isinstance(stmt, cst.Assign) and (len(stmt.targets) > 1 or stmt.targets[0].target is not target):
        return _column_targets(stmt) is not None
    owner = target.value  # type: ignore[attr-defined]
    if isinstance(target, cst.Subscript):
        if isinstance(owner, cst.Name):
            return True
        return isinstance(owner, cst.Attribute) and owner.attr.value in ("loc", "iloc", "ix") \
            and isinstance(owner.value, cst.Name) and not isinstance(stmt, cst.Del)
    if isinstance(owner, cst.Attribute) and owner.attr.value == "columns" \
            and isinstance(target, cst.Attribute) and target.attr.value == "name":
        owner = owner.value  # df.columns.name = None
    return isinstance(owner, cst.Name) and isinstance(stmt, cst.Assign)


def _expression_of(value: Value, frames: list[str]) -> bool:
    """A Series kept in a name as an expression of one of the frames `frames` name (a mask,
    `m = df["a"] > 0`): Engine.hand_over_expressions_of has pandas compute it from them."""
    return isinstance(value, Column) and value.binding is not None \
        and value.frame.code.text in frames


def _inplace_call_of(expr: cst.BaseExpression) -> str | None:
    """The name `name.method(..., inplace=True)` changes, or None for other expressions."""
    if not (isinstance(expr, cst.Call) and isinstance(expr.func, cst.Attribute)
            and isinstance(expr.func.value, cst.Name)):
        return None
    if any(a.keyword is not None and a.keyword.value == "inplace" and isinstance(a.value, cst.Name)
           and a.value.value == "True" for a in expr.args):
        return expr.func.value.value
    return None


def _mutating_calls(stmt: cst.CSTNode) -> list[tuple[str, str]]:
    """(name, method) for each `name.method(...)` or `name.attrs.method(...)` in the statement
    whose method changes a pandas object in place."""
    found: list[tuple[str, str]] = []

    class Calls(cst.CSTVisitor):
        def visit_Call(self, node: cst.Call) -> None:
            func = node.func
            if not (isinstance(func, cst.Attribute) and func.attr.value in IN_PLACE_METHODS):
                return
            base = func.value
            if isinstance(base, cst.Attribute) and base.attr.value in ("attrs", "flags"):
                base = base.value
            if isinstance(base, cst.Name):
                found.append((base.value, func.attr.value))

        def visit_Lambda(self, node: cst.Lambda) -> bool:
            return False  # runs later, if at all

        def visit_FunctionDef(self, node: cst.FunctionDef) -> bool:
            return False

    stmt.visit(Calls())
    return found


def _changed_by_functions(node: cst.CSTNode, functions: dict[str, Any]) -> list[tuple[str, str, cst.Call]]:
    """(name, "f()", call) for each `f(name, ...)` in `node` where the script's own function f
    changes that parameter in place."""
    found: list[tuple[str, str, cst.Call]] = []

    class Calls(cst.CSTVisitor):
        def visit_Call(self, call: cst.Call) -> None:
            if not isinstance(call.func, cst.Name) or call.func.value not in functions:
                return
            function = functions[call.func.value]
            for i, arg in enumerate(call.args):
                param = arg.keyword.value if arg.keyword is not None else (
                    function.params[i] if i < len(function.params) and not arg.star else None)
                if param in function.mutated_params and isinstance(arg.value, cst.Name):
                    found.append((arg.value.value, f"{function.name}()", call))

    node.visit(Calls())
    return found


def _keys_as_values(header: cst.BaseExpression) -> cst.BaseExpression:
    """`for k, g in df.groupby(["k"]):` kept on pandas in a script written for pandas 1.x: the
    groupby on the key itself (`df.groupby("k")`), which gives each group's key as the value
    pandas 1.x gave (pandas 2 and 3 give a tuple of one for a list of one key). A header of
    any other form is returned as it is."""
    node = header
    selection = None
    if isinstance(node, cst.Subscript):  # df.groupby(["k"])["x"]
        selection, node = node, node.value
    if not (isinstance(node, cst.Call) and isinstance(node.func, cst.Attribute)
            and node.func.attr.value == "groupby" and node.args):
        return header
    args = list(node.args)
    at = next((i for i, a in enumerate(args) if a.keyword is None or a.keyword.value == "by"), None)
    if at is None or (args[at].keyword is None and at != 0) or args[at].star:
        return header
    keys = args[at].value
    if not (isinstance(keys, cst.List) and len(keys.elements) == 1
            and isinstance(keys.elements[0], cst.Element)):
        return header
    args[at] = args[at].with_changes(value=keys.elements[0].value)
    grouped = node.with_changes(args=args)
    return grouped if selection is None else selection.with_changes(value=grouped)


def label_free_loops(module: cst.Module) -> frozenset[int]:
    """The iterrows() calls (by node id) of `for label, row in df.iterrows():` loops whose
    label is read nowhere (in the body or after the loop) and whose row is read only in the
    body, by column (row["kg"], row.kg; never row.name): what they compute does not depend on
    the row labels, so a frame filtered or sorted before them need not keep pandas' labels."""
    from porter.translate.evaluate import _only_by_column
    found: set[int] = set()

    class Loops(cst.CSTVisitor):
        def visit_For(self, stmt: cst.For) -> None:
            it, target = stmt.iter, stmt.target
            if not (isinstance(it, cst.Call) and not it.args and isinstance(it.func, cst.Attribute)
                    and it.func.attr.value == "iterrows" and isinstance(target, cst.Tuple)
                    and len(target.elements) == 2
                    and all(isinstance(e.value, cst.Name) for e in target.elements)
                    and stmt.orelse is None):
                return
            label, row = (e.value.value for e in target.elements)  # type: ignore[attr-defined]
            if label == row or _free_uses(stmt.body, label) \
                    or (label != "_" and _free_uses(module, label) > 1) \
                    or _free_uses(module, row) != _free_uses(stmt.body, row) + 1 \
                    or not _only_by_column(stmt.body, row):
                return  # the label is read, or the row after the loop or as a whole
            found.add(id(it))

    module.visit(Loops())
    return frozenset(found)


def _free_uses(node: cst.CSTNode, name: str) -> int:
    """How many times `name` is written in `node` as the same variable: a lambda whose
    parameter has the name (`lambda r: r["kg"]`) has a variable of its own."""
    count = 0

    class Count(cst.CSTVisitor):
        def visit_Name(self, n: cst.Name) -> None:
            nonlocal count
            count += n.value == name

        def visit_Attribute(self, n: cst.Attribute) -> bool:
            n.value.visit(self)
            return False

        def visit_Arg(self, n: cst.Arg) -> bool:
            n.value.visit(self)
            return False

        def visit_Lambda(self, n: cst.Lambda) -> bool:
            params = n.params
            bound = {p.name.value for p in (*params.posonly_params, *params.params,
                                            *params.kwonly_params)}
            for extra in (params.star_arg, params.star_kwarg):
                if isinstance(extra, cst.Param):
                    bound.add(extra.name.value)
            if name in bound:
                for p in (*params.posonly_params, *params.params, *params.kwonly_params):
                    if p.default is not None:
                        p.default.visit(self)  # defaults are read outside the lambda
                return False
            return True

    node.visit(Count())
    return count


def _group_row_appends(first: Any, loop: Any) -> tuple[cst.Call, str, tuple[str, ...], str, tuple[tuple[str, cst.BaseExpression], ...]] | None:
    """(the `pd.DataFrame()` call, acc, the key names, the rows name, [(column, value)]) of
    `acc = pd.DataFrame()` then `for key, rows in df.groupby(...): acc = acc.append({"c":
    value, ...}, ignore_index=True)` (key a name, or a tuple of names for several keys); None
    otherwise."""
    if not (isinstance(first, cst.SimpleStatementLine) and len(first.body) == 1
            and isinstance(first.body[0], cst.Assign) and len(first.body[0].targets) == 1
            and isinstance(first.body[0].targets[0].target, cst.Name)):
        return None
    made = first.body[0].value
    acc = first.body[0].targets[0].target.value
    if not (isinstance(made, cst.Call) and not made.args):
        return None
    if not (isinstance(loop, cst.For) and loop.orelse is None and loop.asynchronous is None
            and isinstance(loop.iter, cst.Call) and isinstance(loop.iter.func, cst.Attribute)
            and loop.iter.func.attr.value == "groupby" and isinstance(loop.target, cst.Tuple)
            and len(loop.target.elements) == 2 and isinstance(loop.body, cst.IndentedBlock)
            and len(loop.body.body) == 1):
        return None
    key, rows = (e.value for e in loop.target.elements)
    if isinstance(key, cst.Tuple) and all(isinstance(e.value, cst.Name) for e in key.elements):
        keys = tuple(e.value.value for e in key.elements)  # type: ignore[attr-defined]
    elif isinstance(key, cst.Name):
        keys = (key.value,)
    else:
        return None
    if not isinstance(rows, cst.Name) or len({*keys, rows.value, acc}) != len(keys) + 2:
        return None
    line = loop.body.body[0]
    if not (isinstance(line, cst.SimpleStatementLine) and len(line.body) == 1
            and isinstance(line.body[0], cst.Assign) and len(line.body[0].targets) == 1
            and isinstance(line.body[0].targets[0].target, cst.Name)
            and line.body[0].targets[0].target.value == acc):
        return None
    call = line.body[0].value
    if not (isinstance(call, cst.Call) and isinstance(call.func, cst.Attribute)
            and call.func.attr.value == "append" and isinstance(call.func.value, cst.Name)
            and call.func.value.value == acc and len(call.args) == 2
            and call.args[0].keyword is None and isinstance(call.args[0].value, cst.Dict)
            and call.args[1].keyword is not None and call.args[1].keyword.value == "ignore_index"
            and isinstance(call.args[1].value, cst.Name) and call.args[1].value.value == "True"):
        return None
    items = []
    for element in call.args[0].value.elements:
        if not (isinstance(element, cst.DictElement) and isinstance(element.key, cst.SimpleString)):
            return None
        name = element.key.evaluated_value
        if not isinstance(name, str):
            return None
        items.append((name, element.value))
    if not items or len({name for name, _ in items}) != len(items):
        return None
    return made, acc, keys, rows.value, tuple(items)


def _row_appends(stmt: cst.For) -> tuple[str, str, list[tuple[str, cst.BaseExpression]]] | None:
    """(label name, row name, [(list name, appended value)]) of `for label, row in
    x.iterrows():` whose body only appends one value to a list per line; None otherwise."""
    it, target = stmt.iter, stmt.target
    if not (isinstance(it, cst.Call) and not it.args and isinstance(it.func, cst.Attribute)
            and it.func.attr.value == "iterrows" and isinstance(target, cst.Tuple)
            and len(target.elements) == 2
            and all(isinstance(e.value, cst.Name) for e in target.elements)
            and stmt.orelse is None and isinstance(stmt.body, cst.IndentedBlock)):
        return None
    label, row = (e.value.value for e in target.elements)  # type: ignore[attr-defined]
    appends: list[tuple[str, cst.BaseExpression]] = []
    for line in stmt.body.body:
        if not (isinstance(line, cst.SimpleStatementLine) and len(line.body) == 1
                and isinstance(line.body[0], cst.Expr)):
            return None
        call = line.body[0].value
        if not (isinstance(call, cst.Call) and isinstance(call.func, cst.Attribute)
                and call.func.attr.value == "append" and isinstance(call.func.value, cst.Name)
                and len(call.args) == 1 and call.args[0].keyword is None and not call.args[0].star):
            return None
        appends.append((call.func.value.value, call.args[0].value))
    return (label, row, appends) if appends else None


def _name_counts(node: cst.CSTNode) -> dict[str, int]:
    """How many times each name is written in `node` (attribute names and keywords aside)."""
    return {name: len(nodes) for name, nodes in _name_nodes(node).items()}


def _name_nodes(node: cst.CSTNode) -> dict[str, list[cst.Name]]:
    """Where each name is written in `node` (attribute names and keywords aside)."""
    found: dict[str, list[cst.Name]] = {}

    class Count(cst.CSTVisitor):
        def visit_Name(self, n: cst.Name) -> None:
            found.setdefault(n.value, []).append(n)

        def visit_Attribute(self, n: cst.Attribute) -> bool:
            n.value.visit(self)
            return False

        def visit_Arg(self, n: cst.Arg) -> bool:
            n.value.visit(self)
            return False

    node.visit(Count())
    return found


_PLAIN_FRAME_METHODS = {"reset_index", "merge", "merge_asof", "merge_ordered"}


def _makes_plain_frame(node: cst.BaseExpression) -> bool:
    """Whether pandas code certainly gives a DataFrame labelled 0..n-1: `….reset_index()` (of a
    Series or a frame, all levels, not in place) and merges that do not keep an index."""
    if not isinstance(node, cst.Call):
        return False
    func = node.func
    method = func.attr.value if isinstance(func, cst.Attribute) else \
        func.value if isinstance(func, cst.Name) else None
    if method not in _PLAIN_FRAME_METHODS:
        return False
    if any(a.star for a in node.args):
        return False  # *args / **options: not known
    keywords = {a.keyword.value: a.value for a in node.args if a.keyword is not None}
    if method == "reset_index":
        drop = keywords.get("drop")
        return not node.args or set(keywords) <= {"drop", "name", "names"} \
            and len(keywords) == len(node.args) \
            and (drop is None or isinstance(drop, cst.Name) and drop.value == "False")
    return not {"left_index", "right_index", "indicator"} & set(keywords)


def _called_names(code: str) -> list[str]:
    """The plain names called in the code (`helper` in `df["c"] = helper(df)`)."""
    try:
        tree = ast.parse(textwrap.dedent(code).strip())
    except (SyntaxError, ValueError, RecursionError):
        return []
    return list(dict.fromkeys(node.func.id for node in ast.walk(tree)
                              if isinstance(node, ast.Call) and isinstance(node.func, ast.Name)))


def _from_pandas(name: str, frame: Frame) -> Code:
    """`pl.from_pandas(name).lazy()`; category columns come back as an Enum of pandas' own
    categories, which sorts as pandas sorts them (from_pandas makes them Categorical)."""
    code = emit.pl("from_pandas", emit.atom(name)).method("lazy")
    categories = [c for c, t in frame.dtypes if t in ("category", "enum")]
    # an integer column with a missing value reached pandas as float64 (to_pandas): it comes
    # back an integer, as porter knew it before (pandas' own Int64 writes 7, not 7.0)
    ints = [c for c, t in frame.dtypes if t == "int" and frame.columns is not None and c in frame.columns]
    if categories or ints:
        code = code.method("with_columns", *(
            emit.col(c).method("cast", emit.pl("Enum", emit.atom(f"{name}[{emit.lit(c).text}].cat.categories")))
            for c in categories), *([emit.call("pl.col", *ints).method("cast", emit.atom("pl.Int64"))] if ints else []))
    return code


def plans_to_collect(consumers: dict[int, set[tuple[int, int]]],
                     parents: dict[int, set[int]],
                     materialized: frozenset[int] = frozenset(),
                     row_counts: dict[int, set[tuple[int, int]]] | None = None,
                     cheap_to_recount: Callable[[int], bool] = lambda binding: False,
                     ) -> frozenset[int]:
    """The bindings whose plans are collected where they are made (the materialisation model).

    A statement that computes a frame (a sink, a print, a scalar, a hand-over to pandas) runs
    the plan of every frame it reads, and of every frame those were made from, back to the
    last one that was collected. A binding is collected when its plan would otherwise run at
    two or more points: its own executions, the binding of each frame made from it that is
    itself collected, and the executions of each that is not. One execution that reads a plan
    twice (a join of two aggregates of one frame, or writes batched into one pl.collect_all)
    computes it once: Polars finds the shared part. A chain used once stays lazy up to its
    sink; a frame shared by several outputs is computed once, at the last point they share.
    A binding whose own statement collects it (`materialized`) runs the plans it is made
    from once, there: that collect is already one of their consumers.
    A statement that only counts a frame's rows (`row_counts`: `len(kept)` outside a loop) is
    one of its executions unless `cheap_to_recount` says its plan, back to the files, only
    reads and filters (no Python function, join, sort or group): Polars then counts the rows
    in one streaming pass over the file, reading only the columns the filters need, which
    costs a fraction of the read and no memory, where keeping the frame for the count holds
    the whole file's columns while every later plan runs.
    """
    consumers = {b: set(c) for b, c in consumers.items()}
    for binding, counts in (row_counts or {}).items():
        if not cheap_to_recount(binding):
            consumers.setdefault(binding, set()).update(counts)
    children: dict[int, set[int]] = {}
    for child, owners in parents.items():
        for owner in owners:
            if owner != child:
                children.setdefault(owner, set()).add(child)
    runs: dict[int, frozenset[object]] = {}
    collected: set[int] = set()

    def executions(binding: int, path: frozenset[int]) -> frozenset[object]:
        if binding in runs:
            return runs[binding]
        points: set[object] = set(consumers.get(binding, ()))
        for child in children.get(binding, ()):
            if child in path:
                continue  # a loop that rebinds the name: counted through its executions
            below = executions(child, path | {child})
            if child in materialized:
                continue  # its statement's collect is counted among this plan's consumers
            # a frame that is collected runs this plan once, where it is made; one that is
            # not runs it wherever it runs (one plan reading it twice computes it once)
            points |= {("made", child)} if len(below) >= 2 else below
        runs[binding] = frozenset(points)
        if len(points) >= 2:
            collected.add(binding)
        return runs[binding]

    for binding in list(parents) + list(consumers):
        executions(binding, frozenset({binding}))
    return frozenset(collected)


# what makes a plan costly to run a second time only to count its rows: a Python function
# on the values, rows joined, sorted, grouped, windowed or made from pandas (porter's own
# helpers named pandas_* sort or call Python, except those listed as cheap below)
_COSTLY_PLAN = ("map_elements", "map_batches", "map_distinct", ".pipe(", "lambda", "join",
                "group_by", "sort", ".over(", "unique", "rolling", "ewm_", "pandas", "concat",
                "explode", "pivot", "cum_", "shift(", "collect", "read_", "implode", "iter_",
                "n_rows", "head(", "tail(", "slice(", "sample(", "gather")
_CHEAP_HELPERS = ("pandas_upper(", "pandas_title(", "PANDAS_NA_VALUES", "PANDAS_WHITESPACE",
                  "pandas_lower(")
# the same in the pandas code of the script's own functions the plan calls
_COSTLY_PANDAS = ("apply", ".map(", "merge", "join", "groupby", "sort", "transform", "rolling",
                  "ewm", "expanding", "drop_duplicates", "unique", "iterrows", "itertuples",
                  "lambda", "pivot", "melt", "concat", "explode", "cum", "shift", "resample",
                  "for ", "while ", "to_pandas", "stack", "read_excel", "read_json", "eval(",
                  "query(", "global ", "nonlocal ", "open(")


def _cheap_to_recount(binding: int, services: Services) -> bool:
    """Whether counting the rows of the frame `binding` names runs no more than a scan and
    filters of it (plans_to_collect): every plan from the files to it (bindings read, and the
    script's own functions its code calls) reads files with pl.scan_* and filters or adds
    columns with Polars expressions. A plan whose statement collects it is in memory: the walk
    stops there."""
    seen: set[int] = set()
    todo = [binding]
    while todo:
        current = todo.pop()
        if current in seen:
            continue
        seen.add(current)
        if current in services.materialized:
            continue  # its statement collects it: counting reads the frame in memory
        text = services.plan_texts.get(current)
        if text is None or _collects_what_it_binds(text):
            if text is None:
                return False  # bound by a loop, a with, a parameter: not known
            continue
        if not _cheap_code(text, services, set()):
            return False
        todo.extend(services.frame_parents.get(current, ()))
    return True


def _cheap_code(text: str, services: Services, functions: set[str]) -> bool:
    """No step of _COSTLY_PLAN in `text` (Polars code porter wrote), nor in the pandas code of
    the script's own functions it calls (_COSTLY_PANDAS)."""
    plain = text
    for helper in _CHEAP_HELPERS:
        plain = plain.replace(helper, "")
    if any(step in plain for step in _COSTLY_PLAN):
        return False
    try:
        tree = ast.parse(text.strip())
    except SyntaxError:
        return False
    for node in ast.walk(tree):
        if isinstance(node, ast.Call) and isinstance(node.func, ast.Name) \
                and node.func.id in services.function_defs and node.func.id not in functions:
            functions.add(node.func.id)
            body = services.code_for(services.function_defs[node.func.id])
            if any(step in body for step in _COSTLY_PANDAS) \
                    or not _cheap_calls(body, services, functions):
                return False
    return True


def _cheap_calls(body: str, services: Services, functions: set[str]) -> bool:
    """The script's own functions a function's pandas code calls are cheap too."""
    try:
        tree = ast.parse(textwrap.dedent(body))
    except SyntaxError:
        return False
    for node in ast.walk(tree):
        if isinstance(node, ast.Call) and isinstance(node.func, ast.Name) \
                and node.func.id in services.function_defs and node.func.id not in functions:
            functions.add(node.func.id)
            inner = services.code_for(services.function_defs[node.func.id])
            if any(step in inner for step in _COSTLY_PANDAS) \
                    or not _cheap_calls(inner, services, functions):
                return False
    return True


def _same_code(a: str, b: str) -> bool:
    """Whether two texts are the same code, laid out differently."""
    try:
        return ast.dump(ast.parse(a.strip())) == ast.dump(ast.parse(b.strip()))
    except SyntaxError:
        return False


def _after_loop(env: dict[str, Value], handed: dict[str, Frame]) -> dict[str, Value]:
    """After a loop that kept frames on pandas, each may come back to Polars at the next
    statement porter can rewrite whole (what the loop did to its columns is not known)."""
    for name, frame in handed.items():
        if isinstance(env.get(name), PandasValue):
            env[name] = PandasValue(emit.atom(name), frame=_after_change(name, frame, None))
    return env


def _plan_of(value: Value | None) -> Value | None:
    """The frame whose plan a named value runs: a pending groupby runs its frame's, a table
    labelled by a column (set_index, read_csv(index_col=)) its frame's, a Series kept in a
    name the frame it is bound as."""
    if isinstance(value, (Grouped, Indexed)):
        return value.frame
    if isinstance(value, Column) and value.frame.binding is not None:
        return value.frame  # a Series kept in a name: the frame of its keys and values
    if isinstance(value, Accessor) and value.index_of is not None \
            and value.index_of.binding is not None:
        return value.index_of  # a date index kept in a name: the frame of its key
    return value


def _executions(tree: ast.AST) -> list[set[str]]:
    """The names each execution in this code reads: each `.collect()` and each sink runs its
    plan (`print(a.select(x).collect(), a.select(y).collect())` runs `a` twice), apart from
    plans collected inside it (those ran once, where they are). Writes batched into one
    pl.collect_all are one execution: Polars computes what they share once."""
    calls = [node for node in ast.walk(tree) if isinstance(node, ast.Call)
             and isinstance(node.func, ast.Attribute)
             and (node.func.attr == "collect" or node.func.attr.startswith("sink_"))]
    if not calls or any(isinstance(node, ast.Call) and ast.unparse(node.func) == "pl.collect_all"
                        for node in ast.walk(tree)):
        return [{node.id for node in ast.walk(tree) if isinstance(node, ast.Name)}]
    executions = []
    for call in calls:
        receiver = call.func.value  # type: ignore[attr-defined]
        inner = {id(n) for c in ast.walk(receiver) if c in calls and c is not call
                 for n in ast.walk(c.func.value)}  # type: ignore[attr-defined]
        executions.append({n.id for n in ast.walk(receiver)
                           if isinstance(n, ast.Name) and id(n) not in inner})
    return executions


def _collects_what_it_binds(text: str) -> bool:
    """Whether `name = <chain>` collects the plan it binds (`t.with_columns(...).collect()
    .pipe(...).lazy()`): the frame is made there, in memory."""
    if ".collect()" not in text:  # most statements: no parse
        return False
    try:
        tree = ast.parse(text)
    except SyntaxError:
        return False
    if len(tree.body) != 1 or not isinstance(tree.body[0], ast.Assign) \
            or not isinstance(tree.body[0].targets[0], ast.Name):
        return False
    node = tree.body[0].value
    while isinstance(node, ast.Call) and isinstance(node.func, ast.Attribute):
        if node.func.attr == "collect" and not node.args and not node.keywords:
            return True
        node = node.func.value
    return False


def _row_counts(tree: ast.AST) -> set[str]:
    """The names this code reads only to count their rows (`x.select(pl.len()).collect()`),
    or for their columns (`x.collect_schema()`)."""
    counts: dict[str, int] = {}
    for node in ast.walk(tree):
        if isinstance(node, ast.Call) and isinstance(node.func, ast.Attribute) \
                and isinstance(node.func.value, ast.Name) and not node.keywords \
                and (node.func.attr == "collect_schema" and not node.args
                     or node.func.attr == "select" and len(node.args) == 1
                     and ast.unparse(node.args[0]) == "pl.len()"):
            counts[node.func.value.id] = counts.get(node.func.value.id, 0) + 1
    uses: dict[str, int] = {}
    for node in ast.walk(tree):
        if isinstance(node, ast.Name):
            uses[node.id] = uses.get(node.id, 0) + 1
    return {name for name, n in counts.items() if uses.get(name) == n}


def _try_assignments(stmt: cst.Try) -> dict[str, list[cst.BaseExpression]]:
    """The names a `try` statement assigns anywhere in it, with the values assigned."""
    found: dict[str, list[cst.BaseExpression]] = {}

    class Assigns(cst.CSTVisitor):
        def visit_Assign(self, node: cst.Assign) -> None:
            for target in node.targets:
                if isinstance(target.target, cst.Name):
                    found.setdefault(target.target.value, []).append(node.value)

        def visit_AugAssign(self, node: cst.AugAssign) -> None:
            if isinstance(node.target, cst.Name):
                found.setdefault(node.target.value, []).append(node.value)

        def visit_FunctionDef(self, node: cst.FunctionDef) -> bool:
            return False

    stmt.visit(Assigns())
    return found


class _Replaced(cst.CSTTransformer):
    """The tree with one node (found by identity) replaced by another."""

    def __init__(self, target: cst.CSTNode, by: cst.BaseExpression) -> None:
        super().__init__()
        self.target, self.by = target, by

    def on_leave(self, original: cst.CSTNode, updated: cst.CSTNode) -> cst.CSTNode:  # type: ignore[override]
        return self.by if original is self.target else updated


def _names_read(text: str) -> list[str]:
    """The names a piece of code reads, in order of first use."""
    try:
        tree = ast.parse(text.strip())
    except SyntaxError:
        return []
    names: list[str] = []
    for node in ast.walk(tree):
        if isinstance(node, ast.Name) and isinstance(node.ctx, ast.Load) and node.id not in names:
            names.append(node.id)
    return names


# porter's column types that pl.from_pandas(df.to_pandas()) gives back as they were (an int
# column with a missing value comes back float, a date comes back a datetime)
_ROUND_TRIP_TYPES = frozenset({"bool", "str", "float", "datetime", "duration", "category", "enum"})
_BUILTIN_NAMES = frozenset(dir(builtins))
# changes in place that leave the other columns' values as they were
_KEEPS_OTHER_TYPES = frozenset({"pop", "__delitem__", "insert", "drop", "dropna", "drop_duplicates",
                                "sort_values", "sort_index"})


def _after_change(name: str, frame: Value, statement: cst.CSTNode | None,
                  what: str = "", dtype_names: dict[str, cst.BaseExpression] | None = None,
                  period_names: set[str] | None = None) -> Frame | None:
    """What porter knows of a frame after a statement kept on pandas changed it, as the frame
    that `pl.from_pandas(name).lazy()` would give back; None when it cannot come back (labels
    held in the index, pandas' number labels, or Period values, which Polars has no type
    for). `what` names an in-place change."""
    if not isinstance(frame, Frame) or frame.index or frame.number_labels:
        return None
    if _sets_labels(statement, what):
        return None  # row labels pandas set (df.index = df["k"]): pl.from_pandas drops them
    if frame.column_pairs and not _names_columns(statement):
        # two levels of column labels in pandas (agg({"v": ["min", "max"]})): pl.from_pandas
        # would name the columns "('v', 'min')"; they come back once the script names them
        return None
    if isinstance(statement, cst.Assign) and handover.orders_categories(
            statement.value, (dtype_names or {}).get) and handover.text_categories(
            statement.value, (dtype_names or {}).get) is None:
        return None  # categories in an order porter cannot read: Polars would sort by text
    if statement is not None and handover.makes_periods(
            cst.Module([]).code_for_node(statement), period_names or set()):
        return None
    if any(t.startswith("period[") for _, t in frame.dtypes):
        return None  # periods kept as their text went over as pandas' Period values
    if statement is not None and handover.makes_python_ints(cst.Module([]).code_for_node(statement)):
        return None  # whole numbers past Int64: an object column no Polars type holds
    columns: tuple[str, ...] | None = None
    dtypes: tuple[tuple[str, str], ...] = ()
    if what in ("insert", "at", "iat", "attrs", "flags") or what.startswith(("attrs.", "flags.")):
        # the other columns keep their values: category columns are still categories
        dtypes = tuple((c, t) for c, t in frame.dtypes if t in ("category", "enum"))
    if what in _KEEPS_OTHER_TYPES:
        # rows or columns taken away: the columns left keep their types, those that come back
        # from pandas as they went (True/False stays True/False, not text "true")
        dtypes = tuple((c, t) for c, t in frame.dtypes if t in _ROUND_TRIP_TYPES)
    target = None
    if isinstance(statement, (cst.Assign, cst.AugAssign)):
        target = statement.targets[0].target if isinstance(statement, cst.Assign) \
            and len(statement.targets) == 1 else getattr(statement, "target", None)
    key = None
    if isinstance(target, cst.Subscript) and target.slice:
        last = target.slice[-1].slice
        if isinstance(last, cst.Index) and isinstance(last.value, cst.SimpleString):
            key = last.value.evaluated_value
    # the other columns keep their values and rows: an integer column comes back as it went
    # (_from_pandas casts it back: float64 in pandas where it holds a missing value), unless a
    # step left it float64 in pandas, or the statement may change it too (a method that
    # changes a frame in place, a function of the script's): the cast would cut 2.5 to 2
    float_ints = {c for c, _ in frame.float_ints}
    kept = _ROUND_TRIP_TYPES
    if statement is not None and not _mutating_calls(statement) and all(
            name in _BUILTIN_NAMES for name in _called_names(cst.Module([]).code_for_node(statement))):
        kept = kept | {"int"}
    if isinstance(key, str) and frame.columns is not None:
        # `df["c"] = ...` / `df.loc[m, "c"] = ...`: one column made or changed
        columns = frame.columns if key in frame.columns else (*frame.columns, key)
        dtypes = tuple((c, t) for c, t in frame.dtypes
                       if c != key and t in kept and c not in float_ints)
    keys = _written_names(target) if key is None and frame.columns is not None else None
    if keys:
        # `df[["a", "b"]] = ...` / `df.loc[m, ["x", "b"]] = 0`: those columns made or changed
        # (pandas adds the new ones at the end, in the order written)
        columns = (*frame.columns, *(k for k in dict.fromkeys(keys) if k not in frame.columns))  # type: ignore[misc]
        dtypes = tuple((c, t) for c, t in frame.dtypes
                       if c not in keys and t in kept and c not in float_ints)
    if isinstance(key, str) and isinstance(statement, cst.Assign) \
            and isinstance(target, cst.Subscript) and len(target.slice) == 1 \
            and handover.text_categories(statement.value, (dtype_names or {}).get) is not None:
        # `df["c"] = pd.Categorical(..., categories=[...])`: an Enum of pandas' categories
        dtypes = (*((c, t) for c, t in dtypes if c != key), (key, "enum"))
    return Frame(emit.atom(name), columns=columns, dtypes=dtypes,
                 labels_intact=frame.labels_intact, dask=frame.dask, dask_many=frame.dask_many,
                 int_labels_except=handover.int_labels_after(frame, key))


# pandas code whose frame may hold lists or arrays in its cells (a groupby's unique(), agg(list),
# a function making lists): pl.from_pandas refuses pandas' arrays, and no Polars writer writes
# the elements as pandas does (np.int64(0), Timestamp(...)): such a frame stays pandas
_LIST_CELLS = re.compile(r"\.unique\(\s*\)|\.(agg|aggregate|apply|transform)\(\s*(list|sorted|tuple|set)\s*[,)]"
                         r"|\.(agg|aggregate|apply)\(\s*lambda[^:]*:.*\b(sorted|list|tuple|set)\("
                         r"|\.(tolist|to_list|to_numpy)\(\s*\)|\.values\b")


# methods that change a frame's row labels in place
_SETS_LABELS = frozenset({"set_index", "rename_axis", "reindex"})


def _names_columns(statement: cst.CSTNode | None) -> bool:
    """Whether a statement kept on pandas gives a frame its columns afresh (`df.columns = ...`)."""
    if not isinstance(statement, cst.Assign):
        return False
    return any(_root_and_path(t.target)[1] == "columns" for t in statement.targets)


def _sets_labels(statement: cst.CSTNode | None, what: str) -> bool:
    """Whether a statement kept on pandas gives a frame row labels of its own (`df.index =
    ...`, `df.index += 1`, `df.index.name = "rank"`, `set_index(..., inplace=True)`), which a
    frame coming back to Polars would lose."""
    if what == "index" or what.startswith("index.") or what in _SETS_LABELS:
        return True
    targets: list[cst.BaseExpression] = []
    if isinstance(statement, cst.Assign):
        targets = [t.target for t in statement.targets]
    elif isinstance(statement, (cst.AugAssign, cst.AnnAssign)):
        targets = [statement.target]
    for target in targets:
        _, path = _root_and_path(target)
        if path == "index" or path.startswith("index."):
            return True
    return False


def _written_names(target: cst.BaseExpression | None) -> tuple[str, ...] | None:
    """The column names a subscript assignment writes when they are a written-out list
    (`df[["a", "b"]]`, `df.loc[m, ["x", "b"]]`); None otherwise."""
    if not isinstance(target, cst.Subscript) or not target.slice:
        return None
    owner = target.value
    if isinstance(owner, cst.Attribute) and owner.attr.value == "loc":
        if len(target.slice) != 2:
            return None
    elif not isinstance(owner, cst.Name) or len(target.slice) != 1:
        return None
    last = target.slice[-1].slice
    if not (isinstance(last, cst.Index) and isinstance(last.value, (cst.List, cst.Tuple))):
        return None
    names = [e.value.evaluated_value if isinstance(e.value, cst.SimpleString) else None
             for e in last.value.elements]
    if not names or not all(isinstance(n, str) for n in names) \
            or any(isinstance(e, cst.StarredElement) for e in last.value.elements):
        return None
    return tuple(names)  # type: ignore[arg-type]


_AUGMENTED: dict[type, cst.BaseBinaryOp] = {
    cst.AddAssign: cst.Add(), cst.SubtractAssign: cst.Subtract(),
    cst.MultiplyAssign: cst.Multiply(), cst.DivideAssign: cst.Divide(),
    cst.FloorDivideAssign: cst.FloorDivide(), cst.ModuloAssign: cst.Modulo(),
    cst.PowerAssign: cst.Power(), cst.BitAndAssign: cst.BitAnd(), cst.BitOrAssign: cst.BitOr(),
    cst.BitXorAssign: cst.BitXor(), cst.LeftShiftAssign: cst.LeftShift(),
    cst.RightShiftAssign: cst.RightShift(), cst.MatrixMultiplyAssign: cst.MatrixMultiply(),
}


def _whole_column(target: cst.Subscript) -> cst.BaseExpression:
    """`df.loc[rows, "c"] += v` is `df.loc[rows, "c"] = df["c"] + v`: pandas aligns `v` on the
    index, so on the rows written the sum is the same, and the whole column keeps `v` an
    expression of the same frame (never a Series placed by position)."""
    owner = target.value
    if isinstance(owner, cst.Attribute) and owner.attr.value == "loc" \
            and isinstance(owner.value, cst.Name) and len(target.slice) == 2 \
            and isinstance(target.slice[1].slice, cst.Index) \
            and isinstance(target.slice[1].slice.value, cst.SimpleString):
        column = target.slice[1].slice.value
        return cst.Subscript(value=owner.value, slice=[cst.SubscriptElement(cst.Index(column))])
    return target


def _one_expression(text: str) -> bool:
    """Whether `text` can follow `assert ` as written (one line, or already in brackets)."""
    if "\n" not in text:
        return True
    try:
        ast.parse(f"assert {text}")
    except SyntaxError:
        return False
    return True


def _marked_key(comment: str) -> str | None:
    if not comment.startswith(TODO_PREFIX):
        return None
    return comment[len(TODO_PREFIX):].split(":", 1)[0]


def _is_collected(code: Code) -> bool:
    """Already data in memory: collected, or a frame written out in the script."""
    if code.text.endswith(".collect().lazy()"):
        return True
    steps = [s.strip() for s in code.steps]
    if steps and steps[-1] == ".lazy()":
        # collected, then eager DataFrame steps (a pivot, a select of dummies), then lazy again
        eager = [i for i, s in enumerate(steps) if s.startswith(".collect(")]
        if eager and not any(s.startswith(".lazy(") for s in steps[eager[-1] + 1:-1]):
            return True
    base = code.base if code.base is not None else code.text
    if base.startswith("pl.from_pandas(") and [s.strip() for s in code.steps] == [".lazy()"]:
        return True  # a frame pandas made: in memory already
    return base.startswith("pl.LazyFrame(") and not code.steps


def _index_of(target: cst.Subscript) -> cst.BaseExpression:
    element = target.slice[0].slice
    return element.value if isinstance(element, cst.Index) else cst.Name("None")


class _Assigned(cst.CSTVisitor):
    """The names a block assigns (=, op=, for targets, with ... as)."""

    def __init__(self) -> None:
        self.names: set[str] = set()
        self.changes_objects = False  # x[...] = / x.a = / a call with inplace=True
        self.inplace = False  # a call with inplace=True
        # the names whose object x[...] = / x.a = changes (None: not a plain name)
        self.changed: set[str | None] = set()

    def _changes(self, target: cst.BaseExpression) -> None:
        if isinstance(target, (cst.Subscript, cst.Attribute)):
            self.changes_objects = True
            self.changed.add(target.value.value if isinstance(target.value, cst.Name) else None)

    def visit_AssignTarget(self, node: cst.AssignTarget) -> None:
        self.names.update(_target_names(node.target))
        self._changes(node.target)

    def visit_AugAssign(self, node: cst.AugAssign) -> None:
        self.names.update(_target_names(node.target))
        self._changes(node.target)

    def visit_Arg(self, node: cst.Arg) -> None:
        if node.keyword is not None and node.keyword.value == "inplace":
            self.changes_objects = True
            self.inplace = True

    def visit_AnnAssign(self, node: cst.AnnAssign) -> None:
        self.names.update(_target_names(node.target))

    def visit_For(self, node: cst.For) -> None:
        self.names.update(_target_names(node.target))

    def visit_AsName(self, node: cst.AsName) -> None:
        self.names.update(_target_names(node.name))


def _target_names(target: cst.BaseExpression) -> list[str]:
    if isinstance(target, cst.Name):
        return [target.value]
    if isinstance(target, (cst.Tuple, cst.List)):
        return [n for e in target.elements for n in _target_names(e.value)]
    return []


def _plain_python(value: Value | None) -> bool:
    """A Python value the script made itself (a dict, a list, a number), no pandas in it."""
    return isinstance(value, Opaque) and (
        value.is_const and isinstance(value.const, (dict, list, set))
        or value.pytype in ("dict", "list", "set"))


def _iterates_names(value: Value) -> bool:
    if isinstance(value, Opaque) and value.is_const and isinstance(value.const, (list, tuple)):
        return all(isinstance(v, str) for v in value.const)
    return isinstance(value, Scalar) and value.pytype == "list[str]"


def _one_target_each(small: cst.BaseSmallStatement) -> list[cst.BaseSmallStatement]:
    """`raw = df = value` is `df = value` followed by `raw = df`: two names for one object, as
    `view = df` binds them (bind hands both to pandas when either is changed in place later).
    Any other statement is itself."""
    starred = _starred_unpacking(small)
    if starred is not None:
        return starred
    if not (isinstance(small, cst.Assign) and len(small.targets) > 1
            and all(isinstance(t.target, cst.Name) for t in small.targets)):
        return [small]
    names = [t.target.value for t in small.targets]  # type: ignore[attr-defined]
    if len(set(names)) != len(names):
        return [small]
    last = small.targets[-1]
    return [cst.Assign(targets=[last], value=small.value),
            *(cst.Assign(targets=[t], value=cst.Name(names[-1])) for t in small.targets[:-1])]


def _starred_unpacking(small: cst.BaseSmallStatement) -> list[cst.BaseSmallStatement] | None:
    """`first, *rest = [a, b, c]` is `first = a` and `rest = [b, c]` (a starred name always
    gets a list), when the values are written out and read none of the names bound."""
    if not (isinstance(small, cst.Assign) and len(small.targets) == 1
            and isinstance(small.targets[0].target, (cst.Tuple, cst.List))
            and isinstance(small.value, (cst.Tuple, cst.List))):
        return None
    targets, values = small.targets[0].target.elements, small.value.elements
    stars = [i for i, e in enumerate(targets) if isinstance(e, cst.StarredElement)]
    if len(stars) != 1 or any(isinstance(e, cst.StarredElement) for e in values) \
            or not all(isinstance(e.value, cst.Name) for e in targets) \
            or len(values) < len(targets) - 1:
        return None
    names = [e.value.value for e in targets]  # type: ignore[attr-defined]
    read: set[str] = set()

    class Names(cst.CSTVisitor):
        def visit_Name(self, node: cst.Name) -> None:
            read.add(node.value)

    small.value.visit(Names())
    if read & set(names) or len(set(names)) != len(names):
        return None
    star = stars[0]
    after = len(targets) - star - 1
    rest = values[star:len(values) - after]
    bound: list[cst.BaseExpression] = [
        *(e.value for e in values[:star]),
        cst.List([e.with_changes(comma=cst.MaybeSentinel.DEFAULT) if i == len(rest) - 1 else e
                  for i, e in enumerate(rest)]),
        *(e.value for e in values[len(values) - after:])]
    return [cst.Assign(targets=[cst.AssignTarget(cst.Name(name))], value=value)
            for name, value in zip(names, bound)]


def _pattern_names(pattern: cst.MatchPattern) -> list[str]:
    """The names a `case` pattern binds (`case [first, *rest]`, `case {"k": v, **kw}`,
    `case Point(x=px) as pt`)."""
    names: list[str] = []

    class Captures(cst.CSTVisitor):
        def visit_MatchAs(self, node: cst.MatchAs) -> None:
            if node.name is not None:
                names.append(node.name.value)

        def visit_MatchStar(self, node: cst.MatchStar) -> None:
            if node.name is not None:
                names.append(node.name.value)

        def visit_MatchMapping(self, node: cst.MatchMapping) -> None:
            if node.rest is not None:
                names.append(node.rest.value)

    pattern.visit(Captures())
    return names


def _catches_all(pattern: cst.MatchPattern) -> bool:
    """`case _:` or `case name:` (with no guard) matches every subject."""
    if isinstance(pattern, cst.MatchAs) and pattern.pattern is None:
        return True
    if isinstance(pattern, cst.MatchAs):
        return _catches_all(pattern.pattern)
    return isinstance(pattern, cst.MatchOr) and any(_catches_all(p.pattern) for p in pattern.patterns)


def _merge(a: dict[str, Value], b: dict[str, Value]) -> dict[str, Value]:
    """What a name holds after two paths join."""
    merged: dict[str, Value] = {}
    for name in a.keys() | b.keys():
        x, y = a.get(name), b.get(name)
        if x is None or y is None:
            merged[name] = Opaque(emit.atom(name))
        elif x == y:
            merged[name] = x
        elif isinstance(x, Frame) and isinstance(y, Frame):
            common = x.columns if x.columns == y.columns else None
            # named after the later path's binding (a loop's body, which was made from the
            # frame before the loop), so the plans made from it still lead back to it
            merged[name] = Frame(emit.atom(name), columns=common,
                                 dtypes=tuple(set(x.dtypes) & set(y.dtypes)),
                                 index=x.index if x.index == y.index else (),
                                 labels_intact=False,
                                 dask=x.dask or y.dask, dask_many=x.dask_many or y.dask_many,
                                 binding=y.binding if y.binding is not None else x.binding)
        elif type(x) is type(y) and isinstance(x, (PandasValue, Scalar, Module)):
            merged[name] = x
        else:
            merged[name] = Opaque(emit.atom(name))
    return merged


def _todo_comments(sites: list[SiteDraft], line: Any) -> list[cst.EmptyLine]:
    """One marker per mapping key on a statement; a key already marked (by an earlier run of
    porter) is not marked again, so converting converted code changes nothing."""
    marked = {_marked_key(el.comment.value) for el in line.leading_lines if el.comment is not None}
    comments = []
    for site in sites:
        if site.status != "todo" or site.key in marked:
            continue
        text = TODO_PREFIX + f"{site.key}: {site.message}"
        # whole sentences: a long reason goes on over indented comment lines, never cut off
        lines = textwrap.wrap(" ".join(text.split()), width=MAX_COMMENT,
                              subsequent_indent="#   ", break_long_words=False,
                              break_on_hyphens=False)
        marked.add(site.key)
        comments += [cst.EmptyLine(comment=cst.Comment(line)) for line in lines]
        if site.suggestion:
            lines = site.suggestion.splitlines()
            comments.append(cst.EmptyLine(comment=cst.Comment(f"#   suggested: {lines[0]}")))
            comments += [cst.EmptyLine(comment=cst.Comment(f"#   {line}")) for line in lines[1:]]
    return comments


# changes made in place that never read nor write by row label: the rest (`at[...]`,
# `update(other)`, `s[2] = …`, a change the script's own function makes) may
_LABEL_FREE_CHANGES = frozenset({"insert", "pop", "isetitem", "popitem", "iat", "iloc", "name",
                                 "columns", "columns.name", "index.name", "index.names"})


def _may_read_labels(what: str, value: Value) -> bool:
    """Whether a change made in place that porter leaves on pandas may read the row labels of
    `value` (a frame or Series): an `attrs`/`flags` change or one of _LABEL_FREE_CHANGES never
    does."""
    if what.startswith(("attrs", "flags")) or what in _LABEL_FREE_CHANGES:
        return False
    return isinstance(value, (Frame, Column))
