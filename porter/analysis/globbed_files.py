"""The files a read names through a loop's or a comprehension's variable, where the loop goes
over a listing porter can make itself in the --data folder:

    for path in sorted(glob.glob("data/catch_*.csv")):
        part = pd.read_csv(path)
    [pd.read_csv(f) for f in Path("data").glob("*.csv")]
    for name in os.listdir("data"):
        if name.endswith(".csv"):
            part = pd.read_csv(os.path.join("data", name))

The listings read are glob.glob / glob.iglob (recursive= as written), Path(dir).glob / rglob /
iterdir and os.listdir(dir), each with text written out (or a module constant bound once to
text), wrapped or not in sorted / list / tuple / reversed / set (the same files). The path read
may be the variable itself or built from it with os.path.join, an f-string, `+` of texts,
Path(...) and `/`, or str(...). Conditions on the variable that guard the read (a
comprehension's `if`, an enclosing `if`, `if not ...: continue` before it) leave files out when
porter can evaluate them (str methods such as endswith / startswith / lower, `in`, `==`,
os.path.basename / splitext, fnmatch.fnmatch, a Path's name / stem / suffix); a condition it
cannot evaluate keeps every file, which is the careful answer: the schema the read is given is
one every listed file shares, so it is that of the files read whatever the condition picks.

The order of the files does not matter here: the converted script keeps the loop, which goes
over the same Python list at run time as pandas' script does.

The listing itself is made by a callable the schema reader gives (the data folder is its
business): `lister(kind, where, pattern, recursive)` returns the names, as the script's own call
would return them run from the data folder, or None.
"""

from __future__ import annotations

import ast
import fnmatch
import ntpath
import os
import posixpath
from pathlib import PurePosixPath
from typing import Any, Callable

Lister = Callable[[str, str, "str | None", bool], "list[str] | None"]


class _Unknown(Exception):
    """An expression porter does not evaluate statically."""


def _aliases(module: ast.Module) -> dict[str, str]:
    """Module-level imports: each bound name and what it names (`Path` -> pathlib.Path)."""
    names: dict[str, str] = {}
    for node in ast.walk(module):
        if isinstance(node, ast.Import):
            for alias in node.names:
                if alias.asname:
                    names[alias.asname] = alias.name
                else:
                    names[alias.name.split(".")[0]] = alias.name.split(".")[0]
        elif isinstance(node, ast.ImportFrom) and node.module and not node.level:
            for alias in node.names:
                names[alias.asname or alias.name] = f"{node.module}.{alias.name}"
    return names


def _stores(module: ast.Module) -> dict[str, list[ast.AST]]:
    """Every place a name is bound: the node that binds it (a loop, a comprehension, an
    assignment, a parameter, an import...)."""
    bound: dict[str, list[ast.AST]] = {}

    def add(target: ast.AST, owner: ast.AST) -> None:
        for n in ast.walk(target):
            if isinstance(n, ast.Name):
                bound.setdefault(n.id, []).append(owner)

    for node in ast.walk(module):
        if isinstance(node, (ast.For, ast.AsyncFor)):
            add(node.target, node)
        elif isinstance(node, ast.comprehension):
            add(node.target, node)
        elif isinstance(node, ast.Assign):
            for target in node.targets:
                add(target, node)
        elif isinstance(node, (ast.AugAssign, ast.AnnAssign)):
            add(node.target, node)
        elif isinstance(node, ast.NamedExpr):
            add(node.target, node)
        elif isinstance(node, (ast.With, ast.AsyncWith)):
            for item in node.items:
                if item.optional_vars is not None:
                    add(item.optional_vars, node)
        elif isinstance(node, ast.arguments):
            for arg in [*node.posonlyargs, *node.args, *node.kwonlyargs,
                        *([node.vararg] if node.vararg else []),
                        *([node.kwarg] if node.kwarg else [])]:
                bound.setdefault(arg.arg, []).append(node)
        elif isinstance(node, (ast.FunctionDef, ast.AsyncFunctionDef, ast.ClassDef)):
            bound.setdefault(node.name, []).append(node)
        elif isinstance(node, ast.ExceptHandler) and node.name:
            bound.setdefault(node.name, []).append(node)
        elif isinstance(node, (ast.Import, ast.ImportFrom)):
            for alias in node.names:
                bound.setdefault((alias.asname or alias.name).split(".")[0], []).append(node)
        elif isinstance(node, (ast.Global, ast.Nonlocal)):
            for name in node.names:
                bound.setdefault(name, []).append(node)
    return bound


class _Static:
    """Evaluates the few expressions a listing, a path or a filter is written with."""

    def __init__(self, module: ast.Module) -> None:
        self.module = module
        self.aliases = _aliases(module)
        self.stores = _stores(module)
        self.env: dict[str, Any] = {}

    def qualified(self, node: ast.expr) -> str | None:
        if isinstance(node, ast.Name):
            owners = self.stores.get(node.id, [])
            if node.id not in self.aliases or not owners \
                    or not all(isinstance(o, (ast.Import, ast.ImportFrom)) for o in owners):
                return None
            return self.aliases[node.id]
        if isinstance(node, ast.Attribute):
            owner = self.qualified(node.value)
            return None if owner is None else f"{owner}.{node.attr}"
        return None

    def constant_name(self, name: str) -> Any:
        """A name bound once, at the module's top level, to text written out."""
        owners = self.stores.get(name, [])
        if len(owners) == 1 and isinstance(owners[0], ast.Assign) \
                and isinstance(owners[0].value, ast.Constant) \
                and isinstance(owners[0].value.value, str) and len(owners[0].targets) == 1 \
                and isinstance(owners[0].targets[0], ast.Name):
            return owners[0].value.value
        raise _Unknown(name)

    def text(self, node: ast.expr) -> str:
        value = self.value(node)
        if not isinstance(value, str):
            raise _Unknown("not text")
        return value

    def value(self, node: ast.expr) -> Any:
        if isinstance(node, ast.Constant) and isinstance(node.value, (str, bool, int)):
            return node.value
        if isinstance(node, ast.Tuple):
            return tuple(self.value(e) for e in node.elts)
        if isinstance(node, ast.Name):
            if node.id in self.env:
                return self.env[node.id]
            return self.constant_name(node.id)
        if isinstance(node, ast.JoinedStr):
            parts = []
            for part in node.values:
                if isinstance(part, ast.Constant):
                    parts.append(str(part.value))
                elif isinstance(part, ast.FormattedValue) and part.format_spec is None \
                        and part.conversion in (-1, ord("s")):
                    inner = self.value(part.value)
                    if not isinstance(inner, (str, PurePosixPath)):
                        raise _Unknown("formatted value")
                    parts.append(str(inner))
                else:
                    raise _Unknown("formatted value")
            return "".join(parts)
        if isinstance(node, ast.BinOp):
            left, right = self.value(node.left), self.value(node.right)
            if isinstance(node.op, ast.Add) and isinstance(left, str) and isinstance(right, str):
                return left + right
            if isinstance(node.op, ast.Div) and isinstance(left, PurePosixPath) \
                    and isinstance(right, (str, PurePosixPath)):
                return left / right
            raise _Unknown("operator")
        if isinstance(node, ast.UnaryOp) and isinstance(node.op, ast.Not):
            return not self.truth(node.operand)
        if isinstance(node, ast.BoolOp):
            if isinstance(node.op, ast.And):
                return all(self.truth(v) for v in node.values)
            return any(self.truth(v) for v in node.values)
        if isinstance(node, ast.Compare) and len(node.ops) == 1:
            left, right = self.value(node.left), self.value(node.comparators[0])
            op = node.ops[0]
            if isinstance(op, ast.Eq):
                return left == right
            if isinstance(op, ast.NotEq):
                return left != right
            if isinstance(op, (ast.In, ast.NotIn)) and isinstance(left, str) \
                    and isinstance(right, str):
                return (left in right) == isinstance(op, ast.In)
            raise _Unknown("comparison")
        if isinstance(node, ast.Attribute):
            owner = self.value(node.value)
            if isinstance(owner, PurePosixPath) and node.attr in ("name", "stem", "suffix"):
                return getattr(owner, node.attr)
            raise _Unknown("attribute")
        if isinstance(node, ast.Call):
            return self.call(node)
        raise _Unknown(type(node).__name__)

    def truth(self, node: ast.expr) -> bool:
        value = self.value(node)
        if not isinstance(value, (bool, str)):
            raise _Unknown("condition")
        return bool(value)

    def call(self, node: ast.Call) -> Any:
        if any(isinstance(a, ast.Starred) for a in node.args) or \
                any(k.arg is None for k in node.keywords):
            raise _Unknown("starred")
        name = self.qualified(node.func)
        args = [self.value(a) for a in node.args] if name != "str" else []
        if node.keywords:
            raise _Unknown("keywords")
        if name in ("os.path.join", "posixpath.join"):
            if not args or not all(isinstance(a, (str, PurePosixPath)) for a in args):
                raise _Unknown("join")
            return posixpath.join(*(str(a) for a in args))
        if name == "os.path.basename" and len(args) == 1 and isinstance(args[0], (str, PurePosixPath)):
            return posixpath.basename(str(args[0]))
        if name == "fnmatch.fnmatch" and len(args) == 2 and all(isinstance(a, str) for a in args):
            return fnmatch.fnmatch(*args)
        if name in ("pathlib.Path", "pathlib.PurePath", "pathlib.PosixPath") \
                and all(isinstance(a, (str, PurePosixPath)) for a in args):
            return PurePosixPath(*args)
        if isinstance(node.func, ast.Name) and node.func.id == "str" \
                and "str" not in self.stores and len(node.args) == 1:
            inner = self.value(node.args[0])
            if isinstance(inner, (str, PurePosixPath)):
                return str(inner)
            raise _Unknown("str")
        if isinstance(node.func, ast.Attribute) and name is None:
            owner = self.value(node.func.value)
            method = node.func.attr
            if isinstance(owner, str) and method in ("endswith", "startswith") \
                    and len(args) == 1 and isinstance(args[0], (str, tuple)):
                return getattr(owner, method)(args[0])
            if isinstance(owner, str) and method in ("lower", "upper", "casefold", "strip") \
                    and not args:
                return getattr(owner, method)()
            if isinstance(owner, PurePosixPath) and method == "match" and len(args) == 1 \
                    and isinstance(args[0], str):
                return owner.match(args[0])
        raise _Unknown("call")


def _changed_list(module: ast.Module, name: str) -> bool:
    """Whether the script may change the list a name holds (files.append(...), files[0] = ...,
    del files[0], or gives it to a call that might): only sort / reverse / copy / count /
    index keep its files, and sorted(files), len(files) and a loop over it read them."""
    parents = {id(child): node for node in ast.walk(module) for child in ast.iter_child_nodes(node)}
    for node in ast.walk(module):
        if not (isinstance(node, ast.Name) and node.id == name and isinstance(node.ctx, ast.Load)):
            continue
        parent = parents.get(id(node))
        if isinstance(parent, ast.Attribute):
            if parent.attr not in ("sort", "reverse", "copy", "count", "index"):
                return True
        elif isinstance(parent, ast.Subscript):
            if not isinstance(parent.ctx, ast.Load):
                return True
        elif isinstance(parent, ast.Call):
            if not (isinstance(parent.func, ast.Name)
                    and parent.func.id in ("sorted", "len", "list", "tuple", "set", "reversed",
                                           "print", "enumerate")):
                return True
        elif not isinstance(parent, (ast.For, ast.comprehension, ast.Compare, ast.If,
                                     ast.BoolOp, ast.UnaryOp, ast.Expr)):
            return True  # bound to another name, stored somewhere...: not followed
    return False


def _unwrapped(node: ast.expr, static: _Static) -> ast.expr:
    """sorted(x) / list(x) / tuple(x) / reversed(x) / set(x) hold the files x lists."""
    while isinstance(node, ast.Call) and isinstance(node.func, ast.Name) \
            and node.func.id in ("sorted", "list", "tuple", "reversed", "set") \
            and node.func.id not in static.stores and len(node.args) == 1 \
            and not isinstance(node.args[0], ast.Starred) \
            and all(k.arg in ("key", "reverse") for k in node.keywords) \
            and (node.func.id == "sorted" or not node.keywords):
        node = node.args[0]
    return node


def _listing(node: ast.expr, static: _Static, lister: Lister) -> list[Any]:
    """The values a loop over `node` gives, listed in the data folder."""
    node = _unwrapped(node, static)
    if isinstance(node, ast.Name) and node.id not in static.env:
        owners = static.stores.get(node.id, [])
        if len(owners) == 1 and isinstance(owners[0], ast.Assign) \
                and len(owners[0].targets) == 1 and isinstance(owners[0].targets[0], ast.Name) \
                and not _changed_list(static.module, node.id):
            return _listing(owners[0].value, static, lister)  # files = sorted(glob.glob(...))
        raise _Unknown(f"the loop goes over `{node.id}`, which porter cannot list")
    if not isinstance(node, ast.Call) or any(isinstance(a, ast.Starred) for a in node.args):
        raise _Unknown("the loop goes over values porter cannot list")
    func = node.func
    name = static.qualified(func)
    keywords = {k.arg: k.value for k in node.keywords}
    if name in ("glob.glob", "glob.iglob") and len(node.args) == 1 \
            and set(keywords) <= {"recursive"}:
        pattern = static.text(node.args[0])
        recursive = static.value(keywords["recursive"]) if "recursive" in keywords else False
        if not isinstance(recursive, bool):
            raise _Unknown("recursive=")
        _relative(pattern)
        return _listed(lister("glob", pattern, None, recursive), pattern)
    if name == "os.listdir" and len(node.args) <= 1 and not keywords:
        where = static.text(node.args[0]) if node.args else "."
        _relative(where)
        return _listed(lister("listdir", where, None, False), where)
    if isinstance(func, ast.Attribute) and func.attr in ("glob", "rglob", "iterdir") \
            and not keywords and len(node.args) == (0 if func.attr == "iterdir" else 1):
        where = static.value(func.value)
        if not isinstance(where, PurePosixPath):
            raise _Unknown("the loop goes over values porter cannot list")
        _relative(str(where))
        pattern = static.text(node.args[0]) if node.args else None
        names = _listed(lister(func.attr, str(where), pattern, False), str(where))
        return [where / n for n in names]
    raise _Unknown("the loop goes over values porter cannot list (a glob.glob, Path.glob or "
                   "os.listdir of text written out)")


def _relative(path: str) -> None:
    if posixpath.isabs(path) or ntpath.isabs(path) or path.startswith("~"):
        raise _Unknown(f"{path!r} is not a path under the --data folder")


def _listed(names: list[str] | None, what: str) -> list[str]:
    if names is None:
        raise _Unknown(f"{what!r} could not be listed in the --data folder")
    return names


def _contains(tree: ast.AST, dump: str) -> bool:
    """Whether `tree` holds a call given the path read (ast.dump of it) as an argument: the read,
    not a condition on the path (`if not path.endswith(".csv"): continue`)."""
    return any(isinstance(n, ast.Call) and any(
        ast.dump(a) == dump for a in [*n.args, *(k.value for k in n.keywords)])
        for n in ast.walk(tree))


def _guards(loop: ast.AST, owner: ast.AST | None, dump: str) -> list[tuple[ast.expr, bool]]:
    """The conditions that must hold (True) or fail (False) for the read inside the loop to run:
    a comprehension's ifs, and in a for loop's body the `if`s around the read and the
    `if cond: continue` before it."""
    if isinstance(loop, ast.comprehension):
        return [(cond, True) for cond in loop.ifs]
    guards: list[tuple[ast.expr, bool]] = []
    body = getattr(loop, "body", [])
    while True:
        for stmt in body:
            if _contains(stmt, dump):
                break
            if isinstance(stmt, ast.If) and len(stmt.body) == 1 \
                    and isinstance(stmt.body[0], ast.Continue) and not stmt.orelse:
                guards.append((stmt.test, False))
        else:
            return guards
        if isinstance(stmt, ast.If):
            in_body = any(_contains(s, dump) for s in stmt.body)
            in_else = any(_contains(s, dump) for s in stmt.orelse)
            if in_body == in_else:
                return guards
            guards.append((stmt.test, in_body))
            body = stmt.body if in_body else stmt.orelse
            continue
        return guards


def listed_files(module: ast.Module, path: ast.expr, lister: Lister) -> tuple[str, ...] | str:
    """The files the read of `path` may open, as the script names them, or why porter cannot
    tell (see the module's docstring)."""
    static = _Static(module)
    used = {n.id for n in ast.walk(path) if isinstance(n, ast.Name)}
    loops: list[tuple[str, ast.AST]] = []
    for name in sorted(used):
        owners = static.stores.get(name, [])
        looping = [o for o in owners if isinstance(o, (ast.For, ast.comprehension))]
        if looping:
            if len(owners) != 1:
                return f"`{name}` is bound more than once in the script"
            if not isinstance(getattr(looping[0], "target", None), ast.Name):
                return f"`{name}` is one of several names the loop binds"
            loops.append((name, looping[0]))
    if len(loops) != 1:
        return "the path is built from the variables of several loops"
    name, loop = loops[0]
    try:
        values = _listing(loop.iter, static, lister)  # type: ignore[attr-defined]
    except _Unknown as exc:
        return str(exc)
    dump = ast.dump(path)
    owner = next((n for n in ast.walk(module)
                  if isinstance(n, (ast.ListComp, ast.SetComp, ast.GeneratorExp, ast.DictComp))
                  and loop in n.generators), None)
    inside = _contains(loop, dump) if owner is None else _contains(owner, dump)
    guards = _guards(loop, owner, dump) if inside else []
    files: list[str] = []
    for value in values:
        static.env = {name: value}
        keep = True
        for cond, wanted in guards:
            try:
                if static.truth(cond) is not wanted:
                    keep = False
                    break
            except _Unknown:
                continue  # not known: the file may be read
        if not keep:
            continue
        try:
            file = static.value(path)
        except _Unknown:
            return "the path read is built in a way porter does not evaluate"
        if not isinstance(file, (str, PurePosixPath)):
            return "the path read is not text"
        files.append(str(file))
    static.env = {}
    if not files:
        return "no file of the --data folder is listed by the loop"
    return tuple(sorted(set(files)))  # the order is the loop's business, not the schema's


def list_in(root: os.PathLike[str] | str, kind: str, where: str, pattern: str | None,
            recursive: bool) -> list[str] | None:
    """What the script's listing call gives when run from `root` (glob.glob's text paths,
    os.listdir's names, Path.glob's / iterdir's paths relative to `where`)."""
    import glob
    from pathlib import Path
    base = Path(root)
    try:
        if kind == "glob" and pattern is None:
            return glob.glob(where, root_dir=base, recursive=recursive)
        if kind == "listdir":
            return os.listdir(base / where)
        folder = base / where
        if not folder.is_dir():
            return []
        if kind == "iterdir":
            found = list(folder.iterdir())
        elif kind == "glob":
            found = list(folder.glob(pattern or ""))
        else:
            found = list(folder.rglob(pattern or ""))
        return [str(f.relative_to(folder)) for f in found]
    except (OSError, ValueError, NotImplementedError):
        return None
