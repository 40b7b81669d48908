"""Helpers that change their frame in place and return nothing, made to return it.

    def tidy(df):                          def tidy(df):
        df["k"] = df["k"].str.upper()          df["k"] = df["k"].str.upper()
                                  ->           return df
    tidy(d)                                d = tidy(d)

A Polars frame cannot be changed in place: porter rewrites each change as a new frame bound to
the same name, which the caller of such a helper would never see. Written as above, the helper
is one porter ports (a function that returns its changed frame, rebound at every call), and the
caller's frame is the changed one, as in pandas: the helper's frame *is* the caller's object.

Only where that is plainly so: a top-level function defined once, without decorators, `return`
or `yield`, that changes exactly one of its parameters in place and never binds that name to
another object, and whose every use is a statement of its own `helper(name, ...)`, outside any
function, passing a plain name for that parameter that nothing else may hold: a name never
given to another name (`g = d`), put in a list, tuple, set or dict, taken by a loop or `with`,
nor handed to a method that stores it (`frames.append(d)`). Where another name may hold the
same frame, pandas changes it for both, and a rebinding would change only one. The inserted `return` lines are listed so that the lines of
porter's findings can be given in the original file's numbering (`original_line`).
"""

from __future__ import annotations

from dataclasses import dataclass

import libcst as cst
from libcst.metadata import MetadataWrapper, PositionProvider

from porter.analysis.mutations import changed_in_place


@dataclass(frozen=True)
class ReturnedFrames:
    module: cst.Module
    functions: tuple[str, ...]  # the helpers made to return their frame
    inserted: tuple[int, ...]  # the line numbers of the inserted `return`s, in the new module

    def original_line(self, line: int) -> int:
        """A line of the new module in the original file's numbering."""
        return line - sum(1 for at in self.inserted if at < line)


def return_changed_frames(module: cst.Module) -> ReturnedFrames:
    candidates = _candidates(module)
    if not candidates:
        return ReturnedFrames(module, (), ())
    uses = _Uses(set(candidates))
    module.visit(uses)
    shared = _shared_names(module)
    chosen = {name: param for name, param in candidates.items()
              if name not in uses.other and _calls_pass_names(uses.calls.get(name, []),
                                                              _params(module, name), param, shared)}
    if not chosen:
        return ReturnedFrames(module, (), ())
    wrapper = MetadataWrapper(module, unsafe_skip_copy=True)
    positions = wrapper.resolve(PositionProvider)
    ends = {stmt.name.value: positions[stmt.body.body[-1]].end.line  # type: ignore[attr-defined]
            for stmt in wrapper.module.body
            if isinstance(stmt, cst.FunctionDef) and stmt.name.value in chosen}
    new = wrapper.module.visit(_Rewrite(chosen, _params_of(wrapper.module, chosen)))
    # each inserted line follows its function's last line, pushed down by the ones before it
    order = sorted(ends.values())
    inserted = tuple(end + 1 + i for i, end in enumerate(order))
    return ReturnedFrames(new, tuple(sorted(chosen)), inserted)


def _params(module: cst.Module, name: str) -> tuple[str, ...]:
    return _params_of(module, {name: ""})[name]


def _params_of(module: cst.Module, names: dict[str, str]) -> dict[str, tuple[str, ...]]:
    return {stmt.name.value: tuple(p.name.value for p in (*stmt.params.posonly_params,
                                                          *stmt.params.params))
            for stmt in module.body if isinstance(stmt, cst.FunctionDef) and stmt.name.value in names}


def _candidates(module: cst.Module) -> dict[str, str]:
    """{function: the one parameter it changes in place} for the functions that may qualify."""
    count: dict[str, int] = {}
    for stmt in module.body:
        if isinstance(stmt, (cst.FunctionDef, cst.ClassDef)):
            count[stmt.name.value] = count.get(stmt.name.value, 0) + 1
    found = {}
    for stmt in module.body:
        if not isinstance(stmt, cst.FunctionDef) or stmt.decorators or stmt.asynchronous \
                or count[stmt.name.value] != 1 or not isinstance(stmt.body, cst.IndentedBlock):
            continue
        params = stmt.params
        if params.star_arg not in (None, cst.MaybeSentinel.DEFAULT) or params.star_kwarg \
                or params.kwonly_params:
            continue
        names = {p.name.value for p in (*params.posonly_params, *params.params)}
        changed = changed_in_place(stmt.body) & names
        if len(changed) != 1:
            continue
        param = next(iter(changed))
        body = _Body(param)
        stmt.body.visit(body)
        if not body.returns and not body.rebinds:
            found[stmt.name.value] = param
    return found


class _Body(cst.CSTVisitor):
    """Whether a function body returns or yields (outside functions and classes defined in
    it), and whether it binds `param` to another object."""

    def __init__(self, param: str) -> None:
        super().__init__()
        self.param = param
        self.returns = False
        self.rebinds = False

    def visit_FunctionDef(self, node: cst.FunctionDef) -> bool:
        return False

    def visit_ClassDef(self, node: cst.ClassDef) -> bool:
        return False

    def visit_Lambda(self, node: cst.Lambda) -> bool:
        return False

    def visit_Return(self, node: cst.Return) -> None:
        self.returns = True

    def visit_Yield(self, node: cst.Yield) -> None:
        self.returns = True

    def visit_Global(self, node: cst.Global) -> None:
        self.rebinds = True  # names shared with the module: left as written

    def visit_Nonlocal(self, node: cst.Nonlocal) -> None:
        self.rebinds = True

    def _bound(self, target: cst.BaseExpression) -> None:
        if isinstance(target, cst.Name) and target.value == self.param:
            self.rebinds = True
        elif isinstance(target, (cst.Tuple, cst.List)):
            for element in target.elements:
                self._bound(element.value)
        elif isinstance(target, cst.StarredElement):
            self._bound(target.value)

    def visit_AssignTarget(self, node: cst.AssignTarget) -> None:
        self._bound(node.target)

    def visit_AnnAssign(self, node: cst.AnnAssign) -> None:
        self._bound(node.target)

    def visit_AugAssign(self, node: cst.AugAssign) -> None:
        self._bound(node.target)  # df += 1 may bind another object

    def visit_For(self, node: cst.For) -> None:
        self._bound(node.target)

    def visit_WithItem(self, node: cst.WithItem) -> None:
        if node.asname is not None:
            self._bound(node.asname.name)

    def visit_NamedExpr(self, node: cst.NamedExpr) -> None:
        self._bound(node.target)

    def visit_Del(self, node: cst.Del) -> None:
        self._bound(node.target)


class _Uses(cst.CSTVisitor):
    """Every use of the candidate names: calls that are a statement of their own, and others."""

    def __init__(self, names: set[str]) -> None:
        super().__init__()
        self.names = names
        self.calls: dict[str, list[cst.Call]] = {}
        self.other: set[str] = set()
        self._own: set[int] = set()  # the Name nodes already accounted for

        self._depth = 0  # inside how many functions

    def visit_FunctionDef(self, node: cst.FunctionDef) -> None:
        self._own.add(id(node.name))
        self._depth += 1

    def leave_FunctionDef(self, node: cst.FunctionDef) -> None:
        self._depth -= 1

    def visit_SimpleStatementLine(self, node: cst.SimpleStatementLine) -> None:
        if self._depth == 0 and len(node.body) == 1 and isinstance(node.body[0], cst.Expr):
            call = node.body[0].value
            if isinstance(call, cst.Call) and isinstance(call.func, cst.Name) \
                    and call.func.value in self.names:
                self.calls.setdefault(call.func.value, []).append(call)
                self._own.add(id(call.func))

    def visit_Name(self, node: cst.Name) -> None:
        if node.value in self.names and id(node) not in self._own:
            self.other.add(node.value)


def _argument(call: cst.Call, params: tuple[str, ...], param: str) -> cst.Arg | None:
    """The argument of `call` given for `param`, or None where it cannot be told."""
    for i, arg in enumerate(call.args):
        if arg.star:
            return None
        if arg.keyword is not None:
            if arg.keyword.value == param:
                return arg
        elif i < len(params) and params[i] == param:
            return arg
    return None


def _calls_pass_names(calls: list[cst.Call], params: tuple[str, ...], param: str,
                      shared: set[str]) -> bool:
    if not calls:
        return False
    for call in calls:
        arg = _argument(call, params, param)
        if arg is None or not isinstance(arg.value, cst.Name) or arg.value.value in shared:
            return False
    return True


STORING_METHODS = frozenset({"append", "extend", "insert", "update", "setdefault", "add"})


def _shared_names(module: cst.Module) -> set[str]:
    """Names whose object another name or a container may hold too (see the module's doc)."""
    shared: set[str] = set()

    def names(node: cst.CSTNode | None) -> None:
        if isinstance(node, cst.Name):
            shared.add(node.value)
        elif isinstance(node, (cst.Tuple, cst.List, cst.Set)):
            for element in node.elements:
                names(element.value)
        elif isinstance(node, (cst.StarredElement, cst.Element)):
            names(node.value)

    class Finder(cst.CSTVisitor):
        def visit_Assign(self, node: cst.Assign) -> None:
            if isinstance(node.value, cst.Name):  # g = d: both names hold one object
                shared.add(node.value.value)
                for target in node.targets:
                    names(target.target)

        def visit_AnnAssign(self, node: cst.AnnAssign) -> None:
            if isinstance(node.value, cst.Name):
                shared.add(node.value.value)
                names(node.target)

        def visit_NamedExpr(self, node: cst.NamedExpr) -> None:
            names(node.value)
            names(node.target)

        def visit_Element(self, node: cst.Element) -> None:
            names(node.value)  # [d, e], (d, e), {d}: also a loop's targets (a, b)

        def visit_DictElement(self, node: cst.DictElement) -> None:
            names(node.value)

        def visit_For(self, node: cst.For) -> None:
            names(node.target)

        def visit_CompFor(self, node: cst.CompFor) -> None:
            names(node.target)

        def visit_WithItem(self, node: cst.WithItem) -> None:
            if node.asname is not None:
                names(node.asname.name)

        def visit_Call(self, node: cst.Call) -> None:
            func = node.func
            if isinstance(func, cst.Attribute) and func.attr.value in STORING_METHODS \
                    or isinstance(func, cst.Name) and func.value in ("dict", "list", "tuple", "set"):
                for arg in node.args:
                    names(arg.value)

        def visit_Global(self, node: cst.Global) -> None:
            for item in node.names:
                shared.add(item.name.value)

    module.visit(Finder())
    return shared


class _Rewrite(cst.CSTTransformer):
    def __init__(self, chosen: dict[str, str], params: dict[str, tuple[str, ...]]) -> None:
        super().__init__()
        self.chosen = chosen
        self.params = params

    def leave_FunctionDef(self, original: cst.FunctionDef, updated: cst.FunctionDef) -> cst.FunctionDef:
        param = self.chosen.get(original.name.value)
        if param is None or not isinstance(updated.body, cst.IndentedBlock):
            return updated
        line = cst.SimpleStatementLine([cst.Return(cst.Name(param))])
        return updated.with_changes(body=updated.body.with_changes(body=[*updated.body.body, line]))

    def leave_SimpleStatementLine(self, original: cst.SimpleStatementLine,
                                  updated: cst.SimpleStatementLine) -> cst.SimpleStatementLine:
        if len(updated.body) != 1 or not isinstance(updated.body[0], cst.Expr):
            return updated
        call = updated.body[0].value
        if not (isinstance(call, cst.Call) and isinstance(call.func, cst.Name)
                and call.func.value in self.chosen):
            return updated
        name = call.func.value
        arg = _argument(call, self.params[name], self.chosen[name])
        assert arg is not None and isinstance(arg.value, cst.Name)
        assign = cst.Assign([cst.AssignTarget(cst.Name(arg.value.value))], call)
        return updated.with_changes(body=[assign])
