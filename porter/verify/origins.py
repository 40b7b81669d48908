"""The lines of a script behind one of its outputs, nearest first.

When a trial shows an output that differs, the user wants to know where to look. An output is a
file the script wrote (`to_csv("fees.csv")`) or a frame left in its globals (`fees`); the lines
behind it are the statement that writes it and, going backwards through the names it reads, the
statements that bind or change those names, and so on. Each statement gets its distance from
the output: 0 for the statement that writes it, 1 for those that bind the names it reads, ...

This is a reading of names, not of values: every statement that binds a name counts, wherever
it stands in a loop or a branch, so it finds more lines than ran, never fewer (within what
names can tell: a value smuggled through a container's item or an attribute of another object
is followed only as far as the container's or the object's name).
"""

from __future__ import annotations

import ast
from dataclasses import dataclass
from pathlib import PurePosixPath


@dataclass(frozen=True)
class Origin:
    line: int
    end_line: int
    distance: int  # 0: the statement that writes the output; 1: what binds the names it reads


@dataclass(frozen=True)
class _Statement:
    line: int
    end_line: int
    binds: frozenset[str]
    reads: frozenset[str]
    texts: tuple[str, ...]  # the string constants in it


def origins(source: str, output: str) -> list[Origin]:
    """The statements behind `output` (a file name as the verifier names it, or a global's
    name), nearest first; empty when the source does not parse or nothing writes it."""
    try:
        tree = ast.parse(source)
    except (SyntaxError, ValueError):
        return []
    statements = _statements(tree.body)
    seeds = [s for s in statements if _writes_file(s, output)] or \
        [s for s in statements if output in s.binds]
    found: dict[_Statement, int] = {s: 0 for s in seeds}
    frontier = list(seeds)
    distance = 0
    while frontier:
        distance += 1
        wanted = set().union(*(s.reads for s in frontier))
        before = max(s.end_line for s in frontier)
        frontier = [s for s in statements
                    if s not in found and s.line <= before and s.binds & wanted]
        for statement in frontier:
            found[statement] = distance
    return sorted((Origin(s.line, s.end_line, d) for s, d in found.items()),
                  key=lambda o: (o.distance, -o.line))


def _writes_file(statement: _Statement, output: str) -> bool:
    """Whether a string in the statement names the file: the same name, and the shorter of the
    two paths the end of the other (`OUT / "fees.csv"` writes out/fees.csv)."""
    name = PurePosixPath(output.replace("\\", "/")).parts
    for text in statement.texts:
        written = PurePosixPath(text.replace("\\", "/")).parts
        shorter = min(len(written), len(name))
        if shorter and written[-shorter:] == name[-shorter:]:
            return True
    return False


def _statements(body: list[ast.stmt]) -> list[_Statement]:
    """Every simple statement, and each function or class as one (its whole body), in order."""
    found: list[_Statement] = []
    for node in body:
        if isinstance(node, (ast.FunctionDef, ast.AsyncFunctionDef, ast.ClassDef)):
            found.append(_statement(node, {node.name}, node))
        elif isinstance(node, (ast.For, ast.AsyncFor)):
            found.append(_statement(node, _names(node.target), node.iter))
            found += _statements(node.body) + _statements(node.orelse)
        elif isinstance(node, (ast.With, ast.AsyncWith)):
            for item in node.items:
                found.append(_statement(node, _names(item.optional_vars)
                                        if item.optional_vars else set(), item.context_expr))
            found += _statements(node.body)
        elif isinstance(node, (ast.If, ast.While)):
            found.append(_statement(node, set(), node.test))
            found += _statements(node.body) + _statements(node.orelse)
        elif isinstance(node, ast.Try) or type(node).__name__ == "TryStar":
            found += _statements(node.body)  # type: ignore[attr-defined]
            for handler in node.handlers:  # type: ignore[attr-defined]
                found += _statements(handler.body)
            found += _statements(node.orelse) + _statements(node.finalbody)  # type: ignore[attr-defined]
        elif isinstance(node, ast.Match):
            found.append(_statement(node, set(), node.subject))
            for case in node.cases:
                found += _statements(case.body)
        else:
            found.append(_statement(node, _bound(node), node))
    return found


def _statement(node: ast.stmt, binds: set[str], reads: ast.AST) -> _Statement:
    texts = tuple(n.value for n in ast.walk(reads)
                  if isinstance(n, ast.Constant) and isinstance(n.value, str))
    return _Statement(node.lineno, node.end_lineno or node.lineno, frozenset(binds),
                      frozenset(_loads(reads)), texts)


def _bound(node: ast.stmt) -> set[str]:
    """The names a simple statement binds or changes in place."""
    if isinstance(node, ast.Assign):
        return set().union(*(_names(t) for t in node.targets))
    if isinstance(node, (ast.AugAssign, ast.AnnAssign)):
        return _names(node.target)
    if isinstance(node, (ast.Import, ast.ImportFrom)):
        return {(a.asname or a.name).split(".")[0] for a in node.names}
    if isinstance(node, ast.Delete):
        return set().union(*(_names(t) for t in node.targets))
    if isinstance(node, ast.Expr) and isinstance(node.value, ast.Call) \
            and isinstance(node.value.func, ast.Attribute):
        # frame.drop(..., inplace=True), pieces.append(part): a call that changes the object
        # it is called on (a write such as frame.to_csv(...) changes nothing)
        call = node.value
        changes = call.func.attr in _CHANGING or any(  # type: ignore[attr-defined]
            k.arg == "inplace" and not (isinstance(k.value, ast.Constant) and not k.value.value)
            for k in call.keywords)
        root = _root(call.func)
        return {root} if root and changes else set()
    return set()


# methods of lists, dicts and sets that change them in place
_CHANGING = frozenset({"append", "extend", "insert", "update", "pop", "popitem", "remove",
                       "clear", "add", "discard", "setdefault", "sort", "reverse"})


def _names(target: ast.AST) -> set[str]:
    """The names an assignment target binds: `a`, `a, b`, and the frame in `a["x"]`/`a.loc[...]`."""
    if isinstance(target, ast.Name):
        return {target.id}
    if isinstance(target, (ast.Tuple, ast.List)):
        return set().union(set(), *(_names(e) for e in target.elts))
    if isinstance(target, ast.Starred):
        return _names(target.value)
    root = _root(target)
    return {root} if root else set()


def _root(node: ast.AST) -> str | None:
    while isinstance(node, (ast.Attribute, ast.Subscript, ast.Call)):
        node = node.func if isinstance(node, ast.Call) else node.value
    return node.id if isinstance(node, ast.Name) else None


def _loads(node: ast.AST) -> set[str]:
    """Every name the node reads; an augmented or item assignment also reads its target."""
    names = {n.id for n in ast.walk(node) if isinstance(n, ast.Name)
             and not isinstance(n.ctx, ast.Store)}
    for child in ast.walk(node):
        if isinstance(child, ast.AugAssign) or (
                isinstance(child, ast.Assign)
                and any(not isinstance(t, (ast.Name, ast.Tuple, ast.List))
                        for t in child.targets)):
            targets = [child.target] if isinstance(child, ast.AugAssign) else child.targets
            names |= set().union(*(_names(t) for t in targets))
    return names
