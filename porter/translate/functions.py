"""The script's own functions: which parameters take frames, what they return, learnt from
the calls (a small fixpoint over the module, run by the engine)."""

from __future__ import annotations

import ast
import builtins
import textwrap
from dataclasses import replace
from typing import Any

import libcst as cst

from porter.analysis.mutations import changed_in_place
from porter.analysis.row_functions import CACHE_DECORATORS
from porter.emit.code import Code
from porter.translate.evaluate import Evaluator, LocalFunction, Services
from porter.translate.values import (
    Column, Frame, Grouped, Opaque, PandasValue, Scalar, Value, fresh_token,
)


def discover_functions(module: cst.Module) -> list[LocalFunction]:
    """The module's own plain functions. A name defined twice is left out: which definition a
    call runs depends on where it is, and one learnt signature would fit only one of them."""
    defined: dict[str, int] = {}
    for stmt in module.body:
        if isinstance(stmt, (cst.FunctionDef, cst.ClassDef)):
            defined[stmt.name.value] = defined.get(stmt.name.value, 0) + 1
    passed = _passed_as_values(module, set(defined))
    found = []
    for stmt in module.body:
        if isinstance(stmt, cst.FunctionDef) and not stmt.decorators \
                and defined[stmt.name.value] == 1 and stmt.name.value not in passed:
            params = stmt.params
            if params.star_arg not in (None, cst.MaybeSentinel.DEFAULT) or params.star_kwarg:
                continue
            names = tuple(p.name.value for p in (*params.posonly_params, *params.params))
            changed = (changed_in_place(stmt) & set(names)) - _rebound_first(stmt)
            changed = {p for p in changed if not _rebound_at_every_call(module, stmt.name.value, names, p)}
            found.append(LocalFunction(stmt.name.value, names, frozenset(), None,
                                       mutated_params=frozenset(changed)))
    return found


def _rebound_first(function: cst.FunctionDef) -> set[str]:
    """Names the function's first statements bind anew (`frame = frame.copy()`) before
    anything else runs: a change made through them later is not the caller's object's."""
    rebound: set[str] = set()
    body = function.body.body if isinstance(function.body, cst.IndentedBlock) else ()
    for stmt in body:
        if not isinstance(stmt, cst.SimpleStatementLine):
            break
        smalls = list(stmt.body)
        if len(smalls) == 1 and isinstance(smalls[0], cst.Expr) \
                and isinstance(smalls[0].value, cst.SimpleString):
            continue  # the docstring
        if not all(isinstance(s, cst.Assign) and len(s.targets) == 1
                   and isinstance(s.targets[0].target, cst.Name) for s in smalls):
            break
        for small in smalls:
            assert isinstance(small, cst.Assign)
            name = small.targets[0].target.value  # type: ignore[attr-defined]
            if name in changed_in_place(small.value):
                return rebound
            rebound.add(name)
    return rebound


def _rebound_at_every_call(module: cst.Module, function: str, params: tuple[str, ...],
                           param: str) -> bool:
    """Whether no call of `function` lets the caller see a change made in place to `param`:
    each call passes it a value that is not a name (`f(pd.read_csv(...))`), or a name the
    call's own result is assigned to (`df = f(df)`: the name then holds the result)."""
    index = params.index(param)
    calls: list[tuple[cst.Call, str | None]] = []

    class Calls(cst.CSTVisitor):
        def __init__(self) -> None:
            super().__init__()
            self.target: list[str | None] = [None]

        def visit_Assign(self, node: cst.Assign) -> None:
            only = node.targets[0].target if len(node.targets) == 1 else None
            self.target.append(only.value if isinstance(only, cst.Name)
                               and isinstance(node.value, cst.Call) else None)

        def leave_Assign(self, original_node: cst.Assign) -> None:
            self.target.pop()

        def visit_Call(self, node: cst.Call) -> None:
            if isinstance(node.func, cst.Name) and node.func.value == function:
                calls.append((node, self.target[-1]))
                self.target.append(None)  # calls inside its arguments are not assigned
            else:
                self.target.append(None)

        def leave_Call(self, original_node: cst.Call) -> None:
            self.target.pop()

    module.visit(Calls())
    for call, target in calls:
        passed = None
        for i, arg in enumerate(call.args):
            if arg.star:
                return False
            if (arg.keyword is not None and arg.keyword.value == param) \
                    or (arg.keyword is None and i == index):
                passed = arg.value
        if isinstance(passed, cst.Name) and passed.value != target:
            return False
    return True


def function_definitions(module: cst.Module) -> dict[str, cst.FunctionDef]:
    """The module's plain functions defined once (no decorators but a cache of results,
    @lru_cache / @cache, which keeps what a function of its value alone returns), by name."""
    found: dict[str, cst.FunctionDef] = {}
    seen: set[str] = set()
    for stmt in module.body:
        if isinstance(stmt, (cst.FunctionDef, cst.ClassDef)):
            name = stmt.name.value
            if name in seen:
                found.pop(name, None)
            elif isinstance(stmt, cst.FunctionDef) and all(
                    _is_cache(d.decorator) for d in stmt.decorators):
                found[name] = stmt
            seen.add(name)
    return found


def _is_cache(decorator: cst.BaseExpression) -> bool:
    if isinstance(decorator, cst.Call):
        decorator = decorator.func
    return cst.Module([]).code_for_node(decorator) in CACHE_DECORATORS


def _passed_as_values(module: cst.Module, names: set[str]) -> set[str]:
    """Functions named other than in a call of their own (`df.pipe(f)`, `s.apply(f)`): other
    code calls them, with arguments porter does not see, so nothing is learnt about them."""
    try:
        tree = ast.parse(module.code)
    except SyntaxError:  # syntax newer than this Python: learn nothing rather than guess
        return names
    callees = {id(node.func) for node in ast.walk(tree) if isinstance(node, ast.Call)}
    # Dask's ddf.map_partitions(f): rules/dask.py ports it as the call f(ddf), which is where
    # porter learns f's frame parameter (when f works row by row)
    callees |= {id(node.args[0]) for node in ast.walk(tree) if isinstance(node, ast.Call)
                and isinstance(node.func, ast.Attribute) and node.func.attr == "map_partitions"
                and node.args}
    return {node.id for node in ast.walk(tree)
            if isinstance(node, ast.Name) and node.id in names and id(node) not in callees}


# what a returned Column is an expression of (recorded by the engine at each `return`)
COLUMNS = "<columns>"  # of the column parameters (an expression function)
# the stand-in code of the frame behind column parameters: code that names it reads rows the
# function cannot see, so a body that writes it is not an expression function
EXPRESSION_ROWS = "_porter_caller_rows_"


def learn_functions(services: Services, returns: dict[str, list[Value]],
                    returned_of: dict[str, list[str | None]] | None = None,
                    body_values: dict[str, list[Value]] | None = None,
                    choice_returns: dict[str, list[tuple[tuple[tuple[str, str], ...], list[Value]]]] | None = None,
                    ) -> dict[str, LocalFunction]:
    """What each of the script's functions takes and returns, from this pass's calls and
    returns. `returned_of` says, for each Column a function returned, which parameter it is an
    expression of (a frame parameter's name, COLUMNS, or None); `body_values` holds what the
    body of a function with column parameters assigned to its names."""
    returned_of = returned_of or {}
    body_values = body_values or {}
    choice_returns = choice_returns or {}
    updated = {}
    for name, function in services.functions.items():
        calls = services.call_sites.get(name, [])
        frame_params = set()
        schemas = []
        indexes: list[tuple[str, tuple[tuple[str, ...], bool]]] = []
        consts: list[tuple[str, Any]] = []
        choices: list[tuple[str, tuple[str, ...]]] = []
        for i, param in enumerate(function.params):
            kinds = [c[i] if i < len(c) else None for c in calls]
            if param in function.mutated_params:
                continue  # the caller's frame changes: it is handed to pandas at each call
            if name in services.pandas_functions:
                continue  # pandas code reads its result's row labels: it runs on pandas frames
            if name in services.pandas_called:
                continue  # a statement kept on pandas calls it: it is given pandas frames
            if kinds and all(isinstance(k, Frame) for k in kinds):
                frame_params.add(param)
                labels = {(k.index, k.index_unnamed) for k in kinds}  # type: ignore[union-attr]
                if len(labels) == 1 and next(iter(labels))[0]:
                    indexes.append((param, labels.pop()))
                shapes = {(k.columns, tuple(sorted(k.dtypes))) for k in kinds}  # type: ignore[union-attr]
                if len(shapes) == 1:
                    schemas.append((param, shapes.pop()))
                else:
                    # frames of different columns: which columns it has is not known, but a
                    # column every call's frame holds with one type has that type
                    common = set.intersection(*(set(dtypes) for _, dtypes in shapes))
                    if common:
                        schemas.append((param, (None, tuple(sorted(common)))))
            elif kinds and all(isinstance(k, Opaque) and k.is_const and isinstance(k.const, str)
                               for k in kinds) and len({k.const for k in kinds}) == 1:  # type: ignore[union-attr]
                consts.append((param, kinds[0].const))  # type: ignore[union-attr]
            elif kinds and all(isinstance(k, Opaque) and k.is_const and isinstance(k.const, str)
                               for k in kinds):
                texts = tuple(dict.fromkeys(k.const for k in kinds))  # type: ignore[union-attr]
                choices.append((param, texts))
        text_dtypes = []
        for frame_param in sorted(frame_params):
            for text_param, _ in choices:
                i, j = function.params.index(frame_param), function.params.index(text_param)
                kinds = {dict(c[i].dtypes).get(c[j].const) if max(i, j) < len(c) else None  # type: ignore[union-attr]
                         for c in calls}
                if len(kinds) == 1 and None not in kinds:
                    text_dtypes.append((frame_param, text_param, kinds.pop()))
        columns = _column_params(function, calls, services.function_defs.get(name))
        returned = returns.get(name, [])
        kinds_returned = returned_of.get(name, [])
        column_changes: dict[str, Any] = {}
        if function.column_params and name in services.pandas_called:
            # a statement kept on pandas calls it with pandas Series: no Polars expressions
            column_changes = {"column_params": frozenset(), "column_dtypes": (),
                              "not_expression": True}
        elif function.column_params:
            # the body ran with columns bound to the parameters: it is an expression function
            # when it returned one column of them, and named nothing but such columns
            good = bool(returned) and all(isinstance(r, Column) for r in returned) \
                and kinds_returned and all(k == COLUMNS for k in kinds_returned) \
                and all(isinstance(v, Column) and v.frame.rows == function.column_rows
                        or isinstance(v, Opaque) and v.is_const and not v.sites
                        for v in body_values.get(name, []))
            if not good or set(columns) != set(function.column_params):
                column_changes = {"column_params": frozenset(), "column_dtypes": (),
                                  "not_expression": True}
        elif columns and not function.not_expression and name not in services.pandas_called:
            column_changes = {"column_params": frozenset(columns), "column_dtypes": tuple(
                sorted(columns.items())), "column_rows": function.column_rows or fresh_token()}
        of = {k for k in kinds_returned}
        returns_column_of = None
        if returned and all(isinstance(r, Column) for r in returned) and len(of) == 1 \
                and next(iter(of)) in frame_params:
            returns_column_of = next(iter(of))
        template: Value | None = None
        if name in services.pandas_functions:
            returned = []  # its body stays pandas code: what it returns is not known
        if returned and all(isinstance(r, Frame) for r in returned):
            shapes = {(r.columns, tuple(sorted(r.dtypes)), r.index) for r in returned}  # type: ignore[union-attr]
            columns, dtypes, index = shapes.pop() if len(shapes) == 1 else (None, (), ())
            template = Frame(Code(""), rows=fresh_token(), labels_intact=False, columns=columns,
                             dtypes=dtypes, index=index)
            template = _nullable_marks(template, returned, calls, frame_params, function,
                                       services.function_defs.get(name), services.python_module)
        elif returned and all(isinstance(r, (Column, Scalar)) for r in returned):
            template = returned[0]
        file_rows = bool(returned) and all(isinstance(r, Frame) and r.rows in services.file_rows
                                           for r in returned)
        by_choice = []
        if name not in services.pandas_functions and name not in services.pandas_called \
                and {p for p, _ in choices} == {p for p, _ in function.param_choices}:
            for texts, made in choice_returns.get(name, []):
                shapes = {(r.columns, tuple(sorted(r.dtypes)), r.index) for r in made}  # type: ignore[union-attr]
                if len(shapes) != 1:
                    continue
                columns, dtypes, index = shapes.pop()
                own = Frame(Code(""), rows=fresh_token(), labels_intact=False, columns=columns,
                            dtypes=dtypes, index=index)
                own = _nullable_marks(own, made, calls, frame_params, function,
                                      services.function_defs.get(name), services.python_module)
                by_choice.append((texts, own))
        updated[name] = replace(function, frame_params=frozenset(frame_params), returns=template,
                                returns_file_rows=file_rows,
                                param_schemas=tuple(schemas), param_indexes=tuple(indexes),
                                param_consts=tuple(consts),
                                param_choices=tuple(choices), returns_column_of=returns_column_of,
                                returns_by_choice=tuple(by_choice),
                                text_column_dtypes=tuple(text_dtypes), **column_changes)
    # keep templates stable between passes so the fixpoint check can succeed
    for name, function in updated.items():
        old = services.functions[name]
        if isinstance(old.returns, Frame) and isinstance(function.returns, Frame) \
                and _same_shape(old.returns, function.returns):
            updated[name] = replace(function, returns=old.returns)
        before = dict(old.returns_by_choice)
        if function.returns_by_choice and all(
                isinstance(before.get(texts), Frame) and _same_shape(before[texts], made)  # type: ignore[arg-type]
                for texts, made in function.returns_by_choice):
            updated[name] = replace(updated[name], returns_by_choice=old.returns_by_choice)
    return updated


def _column_params(function: LocalFunction, calls: list[tuple[Value, ...]],
                   definition: cst.FunctionDef | None) -> dict[str, str]:
    """The parameters that can take Polars expressions, with the dtype the calls agree on
    ("" when they do not): every call passes columns of one frame there and no frame
    anywhere, and the body is names bound to expressions and one `return` at its end."""
    if not calls or definition is None or function.mutated_params or not _expression_body(definition):
        return {}
    if not function.column_params:
        # still learning: a call given values an earlier statement handed to pandas (because
        # the function was not known yet) says nothing; the next pass checks every call again
        columned = [c for c in calls if not any(isinstance(v, PandasValue) for v in c)]
        calls = columned if columned else calls
    found: dict[str, set[str | None]] = {}
    for call in calls:
        if len(call) != len(function.params):
            return {}  # defaults or keywords: which value is which parameter is not known here
        columns = {p: v for p, v in zip(function.params, call) if isinstance(v, Column)}
        if any(isinstance(v, (Frame, Grouped)) for v in call) or not columns \
                or any(c.element for c in columns.values()) \
                or len({c.frame.rows for c in columns.values()}) != 1:
            return {}
        for p, c in columns.items():
            found.setdefault(p, set()).add(c.dtype)
    if any(p not in found for call in calls for p, v in zip(function.params, call)
           if isinstance(v, Column)) or len({frozenset(_columns_of(function, c)) for c in calls}) != 1:
        return {}
    return {p: (kinds.pop() or "") if len(kinds) == 1 else "" for p, kinds in found.items()}


def _columns_of(function: LocalFunction, call: tuple[Value, ...]) -> set[str]:
    return {p for p, v in zip(function.params, call) if isinstance(v, Column)}


def _expression_body(definition: cst.FunctionDef) -> bool:
    """A docstring, names bound to values, then one `return` of a value: nothing else."""
    body = definition.body.body if isinstance(definition.body, cst.IndentedBlock) else ()
    statements = list(body)
    if not statements:
        return False
    *head, last = statements
    if not (isinstance(last, cst.SimpleStatementLine) and len(last.body) == 1
            and isinstance(last.body[0], cst.Return) and last.body[0].value is not None):
        return False
    for i, stmt in enumerate(head):
        if not isinstance(stmt, cst.SimpleStatementLine) or len(stmt.body) != 1:
            return False
        small = stmt.body[0]
        if i == 0 and isinstance(small, cst.Expr) and isinstance(small.value, cst.SimpleString):
            continue
        if not (isinstance(small, cst.Assign) and len(small.targets) == 1
                and isinstance(small.targets[0].target, cst.Name)):
            return False
    return True


def _same_shape(a: Frame, b: Frame) -> bool:
    return (a.columns, tuple(sorted(a.dtypes)), a.index, a.nullable_ints, a.unsure_ints) \
        == (b.columns, tuple(sorted(b.dtypes)), b.index, b.nullable_ints, b.unsure_ints)


def _nullable_marks(template: Frame, returned: list[Value], calls: list[tuple[Value, ...]],
                    frame_params: set[str], function: LocalFunction,
                    definition: cst.FunctionDef | None, module: Any) -> Frame:
    """The template of what the function returns, with the columns pandas holds as its nullable
    integers (Frame.nullable_ints) when porter knows them: the marks of the frames returned when
    they agree; else none, for a body that takes one frame, which every call passes holding
    none, and makes none of its own nor reads another frame (the body runs on a parameter whose
    marks it does not know: `def tidy(df): df["k"] = df["k"].str.strip(); return df`, called as `tix =
    tidy(tix)` after `tix["week"] = tix["d"].dt.isocalendar().week`)."""
    marks = {(r.nullable_ints, r.unsure_ints) for r in returned if isinstance(r, Frame)}
    if len(marks) == 1 and next(iter(marks))[0] is not None:
        nullable, unsure = marks.pop()
        return replace(template, nullable_ints=nullable, unsure_ints=unsure)
    if definition is None or len(frame_params) != 1 or template.columns is None \
            or not _reads_no_module_values(definition, module):
        return template
    from porter.api import NULLABLE_INT_HINTS  # (porter.api imports the translator)
    if NULLABLE_INT_HINTS.search(cst.Module([]).code_for_node(definition)):
        return template
    index = function.params.index(next(iter(frame_params)))
    given = {(c[index].nullable_ints, c[index].unsure_ints) for c in calls  # type: ignore[union-attr]
             if index < len(c) and isinstance(c[index], Frame)}
    # a frame with no nullable integer in, none made in the body, nothing else read: none out
    # (a column computed in the body from a nullable one of the caller's could be one)
    if given != {((), ())}:
        return template
    return replace(template, nullable_ints=(), unsure_ints=())


def _reads_no_module_values(definition: cst.FunctionDef, module: Any) -> bool:
    """Whether the function's body reads no name the module binds by assignment (a frame
    of the script's, which may hold nullable integers), only its parameters, its own names,
    imports, functions and builtins."""
    if not isinstance(module, ast.Module):
        return False
    assigned = {t.id for stmt in module.body if isinstance(stmt, (ast.Assign, ast.AnnAssign, ast.AugAssign))
                for target in (stmt.targets if isinstance(stmt, ast.Assign) else [stmt.target])
                for t in ast.walk(target) if isinstance(t, ast.Name)}
    try:
        body = ast.parse(textwrap.dedent(cst.Module([]).code_for_node(definition)))
    except SyntaxError:
        return False
    own = {n.id for n in ast.walk(body) if isinstance(n, ast.Name) and isinstance(n.ctx, ast.Store)}
    own |= {a.arg for n in ast.walk(body) if isinstance(n, ast.arguments)
            for a in (*n.posonlyargs, *n.args, *n.kwonlyargs)}
    read = {n.id for n in ast.walk(body) if isinstance(n, ast.Name) and isinstance(n.ctx, ast.Load)}
    return not (read - own) & assigned


# -- functions applied to each group --------------------------------------------------------------

APPLIED_NOTE = "# porter: ported as group_by().agg() expressions where it is applied;"
APPLIED_NOTE_REST = "#   nothing here calls this pandas definition any more"


def ported_where_applied(stmt: cst.FunctionDef, services: Services) -> bool:
    """Whether every use of the function is a groupby().apply porter read as expressions (or
    porter said so on an earlier conversion): its body is no longer run, so it is not ported
    (its parameter is a pandas group) and stays as the user wrote it, for other callers."""
    if _marked(stmt):
        return True
    name = stmt.name.value
    applied = services.applied_functions.get(name, set())
    # every other Name spelled like the function is one of those applies (the def is one)
    return bool(applied) and services.function_defs.get(name) is stmt \
        and len(applied) == services.name_uses.get(name, 0) - 1


def _marked(stmt: cst.FunctionDef) -> bool:
    return any(line.comment is not None and line.comment.value == APPLIED_NOTE
               for line in stmt.leading_lines)


_APPLIED_AS = {"group": ("a pandas function of each group", "group_by().agg()", "expressions "),
               "value": ("a function of each value", "one expression", ""),
               "row": ("a function of each row", "one expression", ""),
               "window": ("a function of each window", "rolling expressions", "")}


def removed_note(stmt: cst.FunctionDef, kinds: set[str] | None = None) -> list[cst.EmptyLine]:
    """The comment left where a function ported where applied was (engine.block)."""
    name = stmt.name.value
    params = ", ".join(p.name.value for p in stmt.params.params)
    comments: list[str] = []

    class Comments(cst.CSTVisitor):
        def visit_Comment(self, node: cst.Comment) -> None:
            comments.append(node.value)

    stmt.body.visit(Comments())
    what, ported, rest = _APPLIED_AS[min(kinds)] if kinds and len(kinds) == 1 else \
        ("a function given to apply", "expressions", "")
    texts = [f"# porter: {name}({params}), {what}, is ported as {ported}",
             f"#   {rest}where it was applied, and left out here"
             + (" (its comments follow)" if comments else "")]
    return [cst.EmptyLine(comment=cst.Comment(text)) for text in (*texts, *comments)]


def marked_as_applied(stmt: cst.FunctionDef) -> cst.FunctionDef:
    if _marked(stmt):
        return stmt
    notes = [cst.EmptyLine(comment=cst.Comment(text)) for text in (APPLIED_NOTE, APPLIED_NOTE_REST)]
    return stmt.with_changes(leading_lines=[*stmt.leading_lines, *notes])


# -- functions that read the module's frames ------------------------------------------------------

_BUILTIN_NAMES = frozenset(dir(builtins))


# what module_names_of found, by definition (kept with it, so that its id is not reused)
_NAMES: dict[int, tuple[cst.FunctionDef, tuple[frozenset[str], frozenset[str]]]] = {}


def module_names_of(definition: cst.FunctionDef, defs: dict[str, cst.FunctionDef],
                    seen: frozenset[str] = frozenset()) -> tuple[frozenset[str], frozenset[str]]:
    """(the module's names the function reads or changes, those it declares `global`), with
    those of the script's functions it calls (a helper calling a helper reads what both do)."""
    if seen:
        return _module_names_of(definition, defs, seen)
    held = _NAMES.get(id(definition))
    if held is None or held[0] is not definition:
        if len(_NAMES) > 1000:
            _NAMES.clear()
        held = _NAMES[id(definition)] = (definition, _module_names_of(definition, defs, seen))
    return held[1]


def _module_names_of(definition: cst.FunctionDef, defs: dict[str, cst.FunctionDef],
                     seen: frozenset[str]) -> tuple[frozenset[str], frozenset[str]]:
    try:
        tree = ast.parse(cst.Module([]).code_for_node(definition).strip())
    except (SyntaxError, ValueError, RecursionError):
        return frozenset(), frozenset()
    function = tree.body[0] if tree.body else None
    if not isinstance(function, (ast.FunctionDef, ast.AsyncFunctionDef)):
        return frozenset(), frozenset()
    declared = {n for node in ast.walk(function) if isinstance(node, ast.Global) for n in node.names}
    local = {a.arg for node in ast.walk(function) if isinstance(node, ast.arguments)
             for a in (*node.posonlyargs, *node.args, *node.kwonlyargs,
                       *((node.vararg,) if node.vararg else ()),
                       *((node.kwarg,) if node.kwarg else ()))}
    local |= {node.id for node in ast.walk(function)
              if isinstance(node, ast.Name) and isinstance(node.ctx, (ast.Store, ast.Del))}
    local |= {node.name for node in ast.walk(function)
              if isinstance(node, (ast.FunctionDef, ast.AsyncFunctionDef, ast.ClassDef))
              and node is not function}
    local -= declared
    read = {node.id for node in ast.walk(function) if isinstance(node, ast.Name)
            and isinstance(node.ctx, ast.Load) and node.id not in local
            and node.id not in _BUILTIN_NAMES} | declared
    names, globals_ = set(read), set(declared)
    for callee in sorted(read & defs.keys() - seen - {definition.name.value}):
        more, more_declared = module_names_of(defs[callee], defs, seen | {definition.name.value})
        names |= more
        globals_ |= more_declared
    return frozenset(names), frozenset(globals_)


def _holds_porter_value(value: Value | None) -> bool:
    return isinstance(value, (Frame, Column, Grouped))


def module_frames_in_body(definition: cst.FunctionDef, local: dict[str, Value],
                          services: Services) -> Any:
    """A function whose body reads frames of the module's (`def report(): print(len(df))`):
    its body stays pandas code for them (those names are taken out of `local`), and each
    statement that names the function hands them to pandas first (hand_over_module_frames).
    A TODO site when it declares `global` a frame name it binds: the whole body stays as
    written; None otherwise."""
    names, declared = module_names_of(definition, services.function_defs)
    params = {p.name.value for p in (*definition.params.posonly_params, *definition.params.params,
                                     *definition.params.kwonly_params)}
    changed = changed_in_place(definition)
    left = services.pandas_globals[definition.name.value] = set()
    kept = services.frames_kept[definition.name.value] = set()
    for name in names - params:
        value = local.get(name)
        if name not in local:
            left.add(name)  # bound later (or never): the body names it as written
        if not (_holds_porter_value(value) or isinstance(value, PandasValue)):
            continue
        # a frame the module binds once and never changes, which the function only reads, is
        # the same frame at every call: the body is ported with it (a call where it was handed
        # to pandas in its name hands it back first, hand_over_module_frames)
        if isinstance(value, Frame) and name not in declared and name not in changed \
                and name not in services.changed_in_place and _bindings(services, name) == 1:
            kept.add(name)
            continue
        local.pop(name, None)
        left.add(name)
    rebound = sorted(name for name in declared if _frame_like(definition, name))
    if not rebound:
        return None
    from porter.model import SiteDraft
    line, _ = services.position(definition.name)
    return SiteDraft("function.module_frame", "handover", "todo", 0.0,
                     f"{definition.name.value}() binds the module's frame "
                     f"{', '.join(f'`{n}`' for n in rebound)} (global): it stays pandas code as "
                     "written, and so does that frame after each call; return the frame instead "
                     "to port it", line, line)


def _frame_like(definition: cst.FunctionDef, name: str) -> bool:
    """Whether the function uses the name it declares `global` as an object (name[...],
    name.attr) or binds it to a call of a method (pd.read_csv(...), other.copy())."""
    try:
        tree = ast.parse(cst.Module([]).code_for_node(definition).strip())
    except (SyntaxError, ValueError, RecursionError):
        return True
    for node in ast.walk(tree):
        if isinstance(node, (ast.Subscript, ast.Attribute)) and isinstance(node.value, ast.Name) \
                and node.value.id == name:
            return True
        if isinstance(node, ast.Assign) and any(isinstance(t, ast.Name) and t.id == name
                                                for t in node.targets) \
                and isinstance(node.value, ast.Call) and isinstance(node.value.func, ast.Attribute):
            return True
    return False


def hand_over_module_frames(walker: Any, stmt: cst.CSTNode, env: dict[str, Value],
                            after_change: Any) -> tuple[list[str], list[Any]]:
    """Lines that hand to pandas, in their own names, the module's frames that the script's
    functions named in `stmt` read or change (their bodies stay pandas code for them), and the
    TODO site. A frame the function changes in place comes back to Polars later with what
    pandas made of it; one it binds anew (`global df`) stays pandas. A frame a body was ported
    with (frames_kept) that pandas holds in its name here comes back to Polars first."""
    from porter.emit import code as emit
    from porter.model import SiteDraft
    from porter.translate import handover

    defs = walker.services.function_defs
    code = walker.services.code_for(stmt)
    called = [n for n in dict.fromkeys(_names_in(code)) if n in defs and n not in env]
    lines: list[str] = []
    handed: list[str] = []
    unported: list[str] = []
    sites: list[Any] = []
    for function in called:
        names, declared = module_names_of(defs[function], defs)
        changed = changed_in_place(defs[function])
        left = set().union(*(walker.services.pandas_globals.get(f, set())
                             for f in {function, *(names & defs.keys())}))
        for name in sorted(names & left):
            value = env.get(name)
            if not _holds_porter_value(value):
                continue
            # pandas code may read its row labels: after a filter or sort pandas makes it
            Evaluator(env, walker.services).note_handed_over(value)
            if isinstance(value, Frame):
                walker.note_handed_over(name, value)
                lines += walker.hand_over_expressions_of(name, env, stmt)
            lines.append(f"{name} = {handover.to_pandas(value).text}")
            frame = None if name in declared or not isinstance(value, Frame) else \
                after_change(name, value, None, "setitem" if name in changed else "")
            if frame is not None and name in changed:
                frame = replace(frame, columns=None, dtypes=(), numbers=())
            env[name] = PandasValue(emit.atom(name), frame=frame)
            handed.append(f"`{name}` ({function}())")
        for name in sorted(names - left - declared):
            # the body was ported with this frame: where it was handed to pandas in its name
            # (for another helper, an `if` branch), it comes back to Polars first
            value = env.get(name)
            if not (isinstance(value, PandasValue) and any(
                    name in walker.services.frames_kept.get(f, ())
                    for f in {function, *(names & defs.keys())})):
                continue
            if value.frame is None:  # pandas made it in a way Polars cannot hold (labels)
                unported.append(f"`{name}` ({function}())")
                continue
            from porter.translate.engine import _from_pandas
            lines.append(f"{name} = {_from_pandas(name, value.frame).text}")
            env[name] = replace(value.frame, code=emit.atom(name), sites=())
    line, end_line = walker.services.position(stmt) if unported or handed else (0, 0)
    if unported:
        sites.append(SiteDraft("function.module_frame", "todo", "todo", 0.0,
                               f"the script's function was ported for the Polars frame "
                               f"{', '.join(unported)}, which pandas holds here: pass the frame "
                               "as a parameter", line, end_line))
    if handed:
        sites.append(SiteDraft("function.module_frame", "handover", "todo", 0.0,
                               f"the script's function reads or changes the module's frame "
                               f"{', '.join(handed)}: its body stays pandas code, so the frame is "
                               "handed to pandas first; pass the frame as a parameter to port it",
                               line, end_line))
    return lines, sites


def _names_in(code: str) -> list[str]:
    try:
        tree = ast.parse(code.strip())
    except SyntaxError:
        return []
    return [node.id for node in ast.walk(tree) if isinstance(node, ast.Name)]


def _bindings(services: Services, name: str) -> int:
    """How many times the script binds `name` (in any scope); 2 when porter cannot read it."""
    module = services.python_module
    if module is None:
        return 2
    return sum(1 for node in ast.walk(module) if isinstance(node, ast.Name) and node.id == name
               and isinstance(node.ctx, (ast.Store, ast.Del)))


def handed_over_inside(definition: cst.FunctionDef, body: cst.CSTNode, local: dict[str, Value],
                       services: Services) -> bool:
    """Whether the ported body binds a module's frame the function only read (a hand-over to
    pandas, `rates = rates.collect().to_pandas()`, which makes the name local to the function):
    such frames are taken out of `local` (True), for the body to be ported again without them."""
    try:
        before = ast.parse(cst.Module([]).code_for_node(definition).strip())
        after = ast.parse(textwrap.dedent(cst.Module([]).code_for_node(
            definition.with_changes(body=body))).strip())
    except (SyntaxError, ValueError, RecursionError):
        return False
    def stored(tree: ast.AST) -> set[str]:
        return {n.id for n in ast.walk(tree) if isinstance(n, ast.Name) and isinstance(n.ctx, ast.Store)}
    free, _ = module_names_of(definition, services.function_defs)
    params = {p.name.value for p in (*definition.params.posonly_params, *definition.params.params,
                                     *definition.params.kwonly_params)}
    found = {n for n in (stored(after) - stored(before)) & (free - params)
             if _holds_porter_value(local.get(n)) or isinstance(local.get(n), PandasValue)}
    for name in found:
        local.pop(name, None)
        services.frames_kept.get(definition.name.value, set()).discard(name)
    services.pandas_globals.setdefault(definition.name.value, set()).update(found)
    return bool(found)
