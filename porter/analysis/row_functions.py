"""The script's own row functions that can run on Polars rows as they run on pandas rows.

`df.apply(f, axis=1)` with a function whose loops or `try` blocks have no expression form can
still leave pandas: Polars can call the same Python function once per row
(`pl.struct(cols).map_elements(f)`), about four times faster than pandas builds a Series for
each row. That is faithful only when the function cannot tell the two apart:

- it reads the row only as `row["c"]`, or as `row[c]` with `c` running over a list of column
  names written out in the script (then porter knows every column it reads);
- it changes nothing outside itself and calls nothing that could (only a few builtins, pure
  modules such as `math`, and the script's own functions that pass the same test);
- every name it reads from the module is bound once, to a literal, and never changed in place,
  because Polars runs the function when the plan is collected, not where `apply` stands;
- its result has one type whatever the row (a float, an int, a text or True/False), read from
  its `return` statements: pandas infers the result's dtype from the values, Polars needs it
  written down.

Works on Python's `ast` of the module: a static reading, it never runs the script.
"""

from __future__ import annotations

import ast
import builtins
from collections.abc import Callable, Iterator
from dataclasses import dataclass

# builtins that neither change their arguments nor reach outside the process
SAFE_CALLS = frozenset({
    "abs", "all", "any", "bool", "chr", "divmod", "enumerate", "float", "format", "int",
    "isinstance", "len", "list", "max", "min", "ord", "range", "repr", "reversed", "round",
    "set", "sorted", "str", "sum", "tuple", "dict", "zip",
})
_EXCEPTIONS = frozenset(name for name in dir(builtins)
                        if isinstance(getattr(builtins, name), type)
                        and issubclass(getattr(builtins, name), BaseException))
SAFE_NAMES = SAFE_CALLS | _EXCEPTIONS
PURE_MODULES = frozenset({"math", "re", "string", "difflib"})
_LIST_OF_STR = "list of str"  # a kind no column holds: only read through an item
# decorators that keep a function's results: a cache of a function that changes nothing
CACHE_DECORATORS = frozenset({"lru_cache", "cache", "functools.lru_cache", "functools.cache"})
# calls whose result is a plain Python value (not a frame or a Series porter converts)
_PYTHON_VALUE_CALLS = frozenset({"list", "set", "tuple", "dict", "sorted", "frozenset", "len",
                                 "int", "float", "str", "bool"})
_PYTHON_VALUE_METHODS = frozenset({"tolist", "to_list", "item"})
# methods that change the object they are called on
_MUTATING = frozenset({
    "append", "extend", "insert", "remove", "pop", "clear", "sort", "reverse", "update",
    "setdefault", "add", "discard", "popitem", "__setitem__", "__delitem__",
})
_STR_TO_STR = frozenset({
    "strip", "lstrip", "rstrip", "lower", "upper", "title", "capitalize", "casefold",
    "swapcase", "replace", "zfill", "center", "ljust", "rjust", "format", "join",
    "removeprefix", "removesuffix",
})
_STR_TO_BOOL = frozenset({
    "startswith", "endswith", "isdigit", "isalpha", "isalnum", "isnumeric", "isdecimal",
    "isspace", "isupper", "islower", "istitle",
})
_STR_TO_INT = frozenset({"find", "rfind", "index", "rindex", "count"})
_MATH_TO_INT = frozenset({"floor", "ceil", "trunc", "comb", "perm", "gcd", "lcm", "isqrt"})
_MATH_TO_FLOAT = frozenset({
    "sqrt", "exp", "log", "log10", "log2", "log1p", "expm1", "sin", "cos", "tan", "asin",
    "acos", "atan", "atan2", "hypot", "fabs", "fmod", "copysign", "radians", "degrees",
})
UNKNOWN = "?"
RESULT_TYPES = frozenset({"float", "int", "str", "bool"})  # constants of these types are read


class NotPortable(Exception):
    """The function may behave otherwise on a Polars row: the reason, for the TODO. `mixed`:
    it returns values of several types (a number and a text), which pandas keeps side by side
    in an object column that no Polars type holds."""

    mixed = False


@dataclass(frozen=True)
class PythonFunction:
    """The script's function that runs the same on Polars' values as on pandas' values."""

    name: str
    columns: tuple[str, ...]  # a row function: the columns it reads, in the order first read
    returns: str  # the result's Polars type: "Float64", "Int64", "String" or "Boolean"
    may_return_none: bool = False  # pandas makes NaN of it (an object column if every value is)


# what the function may return -> the Polars type of pandas' result: a float or a text with
# None is a float or text column with missing values; an int with None is float or int
# depending on the data, a True/False with None an object column: those are not read
_RESULTS = {
    frozenset({"float"}): "Float64", frozenset({"int"}): "Int64", frozenset({"str"}): "String",
    frozenset({"bool"}): "Boolean", frozenset({"float", "none"}): "Float64",
    frozenset({"str", "none"}): "String",
}


class ModuleFacts:
    """What the checks need to know about the module around the function."""

    def __init__(self, module: ast.Module) -> None:
        self.functions: dict[str, ast.FunctionDef] = {}
        defined: dict[str, int] = {}
        for stmt in module.body:
            if isinstance(stmt, (ast.FunctionDef, ast.AsyncFunctionDef, ast.ClassDef)):
                defined[stmt.name] = defined.get(stmt.name, 0) + 1
        stores: dict[str, int] = {}
        for node in ast.walk(module):
            for name in _stored_names(node):
                stores[name] = stores.get(name, 0) + 1
        self.modules: set[str] = set()
        for stmt in module.body:
            if isinstance(stmt, ast.Import):
                for alias in stmt.names:
                    if alias.name in PURE_MODULES and alias.asname is None:
                        self.modules.add(alias.name)
        for stmt in module.body:
            if isinstance(stmt, ast.FunctionDef) and defined[stmt.name] == 1 \
                    and stores.get(stmt.name, 0) == 1 \
                    and all(_is_cache(d) for d in stmt.decorator_list):
                self.functions[stmt.name] = stmt
        self.constants: dict[str, object] = {}
        # names bound once, at the top of the module, to a plain Python value computed at run
        # time (SPECIES = checklist["species"].tolist()) that nothing changes afterwards: a
        # function reading one sees the same value whenever Polars runs it
        self.frozen: set[str] = set()
        changed = _changed_in_place(module)
        for stmt in module.body:
            if isinstance(stmt, ast.Assign) and len(stmt.targets) == 1 \
                    and isinstance(stmt.targets[0], ast.Name):
                name = stmt.targets[0].id
                if stores.get(name, 0) != 1 or name in changed:
                    continue
                try:
                    self.constants[name] = ast.literal_eval(stmt.value)
                except (ValueError, TypeError, SyntaxError, MemoryError, RecursionError):
                    if _python_value(stmt.value):
                        self.frozen.add(name)
        self.bound = set(stores) | set(defined) | self.modules


def _is_cache(decorator: ast.expr) -> bool:
    """@lru_cache, @lru_cache(maxsize=None), @functools.cache: the function's results are
    kept; for a function that changes nothing outside itself, the results are the same."""
    if isinstance(decorator, ast.Call):
        decorator = decorator.func
    return ast.unparse(decorator) in CACHE_DECORATORS


def _python_value(node: ast.expr) -> bool:
    """A value that is a plain Python object whatever the script's frames are: list(...),
    a comprehension, s.tolist(), len(...)."""
    if isinstance(node, (ast.ListComp, ast.SetComp, ast.DictComp)):
        return True
    if isinstance(node, ast.Call):
        if isinstance(node.func, ast.Name):
            return node.func.id in _PYTHON_VALUE_CALLS
        return isinstance(node.func, ast.Attribute) and node.func.attr in _PYTHON_VALUE_METHODS
    return False


def _stored_names(node: ast.AST) -> Iterator[str]:
    if isinstance(node, ast.Name) and isinstance(node.ctx, (ast.Store, ast.Del)):
        yield node.id
    elif isinstance(node, (ast.FunctionDef, ast.AsyncFunctionDef, ast.ClassDef)):
        yield node.name
    elif isinstance(node, (ast.Import, ast.ImportFrom)):
        for alias in node.names:
            yield (alias.asname or alias.name).split(".")[0]
    elif isinstance(node, (ast.Global, ast.Nonlocal)):
        yield from node.names
    elif isinstance(node, ast.arg):
        yield node.arg


def _root(node: ast.AST) -> str | None:
    while isinstance(node, (ast.Attribute, ast.Subscript, ast.Call)):
        node = node.func if isinstance(node, ast.Call) else node.value
    return node.id if isinstance(node, ast.Name) else None


def _changed_in_place(module: ast.Module) -> set[str]:
    """Names whose object the script may change in place, or alias under another name: a
    name given to a function (`add_note(HEAVY, "y")`, `random.shuffle(HEAVY)`) may be changed
    by it, unless the function is a builtin that changes nothing or a method of another
    object (`df["c"].isin(HEAVY)`)."""
    found: set[str] = set()
    modules = {(alias.asname or alias.name).split(".")[0] for node in ast.walk(module)
               if isinstance(node, (ast.Import, ast.ImportFrom)) for alias in node.names}
    for node in ast.walk(module):
        if isinstance(node, ast.Call):
            func = node.func
            safe = isinstance(func, ast.Name) and func.id in SAFE_CALLS | {"print"} or \
                isinstance(func, ast.Attribute) and _root(func) not in modules \
                and func.attr not in _MUTATING or \
                isinstance(func, ast.Attribute) and _root(func) in PURE_MODULES  # math, difflib
            if not safe:
                for arg in [*node.args, *(k.value for k in node.keywords)]:
                    for name in ast.walk(arg):
                        if isinstance(name, ast.Name) and isinstance(name.ctx, ast.Load):
                            found.add(name.id)
        if isinstance(node, ast.Call) and isinstance(node.func, ast.Attribute) \
                and node.func.attr in _MUTATING:
            root = _root(node.func.value)
            if root is not None:
                found.add(root)
        targets: list[ast.AST] = []
        if isinstance(node, ast.Assign):
            targets = list(node.targets)
            if isinstance(node.value, (ast.Name, ast.List, ast.Tuple, ast.Dict, ast.Set)):
                # an alias, or a container holding the object: a change through it changes both
                found |= {n.id for n in ast.walk(node.value) if isinstance(n, ast.Name)}
        elif isinstance(node, (ast.AugAssign, ast.AnnAssign)):
            targets = [node.target]
        elif isinstance(node, ast.Delete):
            targets = list(node.targets)
        for target in targets:
            if isinstance(target, (ast.Subscript, ast.Attribute)):
                root = _root(target)
                if root is not None:
                    found.add(root)
    return found


def read_row_function(module: ast.Module, name: str,
                      column_kinds: Callable[[str], frozenset[str]]) -> PythonFunction:
    """Check the script's function `name` for a run on Polars rows (see the module's text);
    `column_kinds(c)` gives the Python types pandas passes for column c ("str", "float"; a
    missing value is a float NaN). Raises NotPortable with the reason."""
    facts = ModuleFacts(module)
    function = _one_parameter(facts, name)
    row = function.args.args[0].arg
    columns = _row_columns(function, row, facts)
    _check_pure(function, facts, set())
    kinds = {c: column_kinds(c) for c in columns}
    returns = _return_kinds(function, facts, {row: frozenset({UNKNOWN})}, kinds, row, set())
    return PythonFunction(name, columns, _result(name, returns), "none" in returns)


def read_value_function(module: ast.Module, name: str, kinds: frozenset[str]) -> PythonFunction:
    """Check the script's function `name` for a run on each value of a Polars column, given
    the Python types pandas passes it (`kinds`, as for read_row_function)."""
    facts = ModuleFacts(module)
    function = _one_parameter(facts, name)
    _check_pure(function, facts, set())
    returns = _return_kinds(function, facts, {function.args.args[0].arg: kinds}, {}, None, set())
    return PythonFunction(name, (), _result(name, returns), "none" in returns)


def _one_parameter(facts: ModuleFacts, name: str) -> ast.FunctionDef:
    function = facts.functions.get(name)
    if function is None:
        raise NotPortable(f"{name} is not a function defined once in the script")
    args = function.args
    if args.vararg or args.kwarg or args.kwonlyargs or args.posonlyargs or len(args.args) != 1 \
            or args.defaults:
        raise NotPortable(f"{name} does not take exactly one value")
    return function


def _result(name: str, returns: frozenset[str]) -> str:
    found = _RESULTS.get(returns)
    if found is None:
        shown = ", ".join(sorted(k for k in returns if k != UNKNOWN))
        error = NotPortable(f"what {name} returns is not always of one type porter can read"
                            + (f" ({shown})" if shown else ""))
        known = returns - {"none"}
        error.mixed = UNKNOWN not in known and len(known) > 1 and known != {"int", "float"}
        raise error
    return found


def _body_nodes(function: ast.FunctionDef) -> Iterator[ast.AST]:
    for stmt in function.body:
        yield from ast.walk(stmt)


def _locals(function: ast.FunctionDef) -> set[str]:
    names = {a.arg for a in function.args.args}
    for node in _body_nodes(function):
        if isinstance(node, ast.Name) and isinstance(node.ctx, ast.Store):
            names.add(node.id)
    return names


def _row_columns(function: ast.FunctionDef, row: str, facts: ModuleFacts) -> tuple[str, ...]:
    """The columns `row[...]` reads; any other use of the row is NotPortable."""
    loops: dict[str, tuple[str, ...]] = {}
    stores: dict[str, int] = {}
    for node in _body_nodes(function):
        if isinstance(node, ast.Name) and isinstance(node.ctx, ast.Store):
            stores[node.id] = stores.get(node.id, 0) + 1
    for node in _body_nodes(function):
        if isinstance(node, ast.For) and isinstance(node.target, ast.Name):
            names = _const_names(node.iter, facts)
            if names is not None:
                loops[node.target.id] = names
    loops = {k: v for k, v in loops.items() if stores.get(k) == 1}
    if stores.get(row):
        raise NotPortable(f"{function.name} assigns to its row")
    allowed: set[int] = set()
    columns: list[str] = []
    for node in _body_nodes(function):
        if isinstance(node, ast.Subscript) and isinstance(node.value, ast.Name) \
                and node.value.id == row and isinstance(node.ctx, ast.Load):
            key = node.slice
            if isinstance(key, ast.Constant) and isinstance(key.value, str):
                read: tuple[str, ...] = (key.value,)
            elif isinstance(key, ast.Name) and key.id in loops:
                read = loops[key.id]
            else:
                raise NotPortable(f"{function.name} reads its row other than by column names")
            allowed.add(id(node.value))
            columns += [c for c in read if c not in columns]
    for node in _body_nodes(function):
        if isinstance(node, ast.Name) and node.id == row and id(node) not in allowed:
            raise NotPortable(f"{function.name} uses its row other than as row[column] "
                              f"(row.name, row.get, passing it on)")
    if not columns:
        raise NotPortable(f"{function.name} reads no column of its row")
    return tuple(columns)


def _const_names(node: ast.AST, facts: ModuleFacts) -> tuple[str, ...] | None:
    if isinstance(node, (ast.List, ast.Tuple)):
        values: object = [e.value if isinstance(e, ast.Constant) else None for e in node.elts]
    elif isinstance(node, ast.Name) and node.id in facts.constants:
        values = facts.constants[node.id]
    else:
        return None
    if isinstance(values, (list, tuple)) and all(isinstance(v, str) for v in values):
        return tuple(values)  # type: ignore[arg-type]
    return None


def _check_pure(function: ast.FunctionDef, facts: ModuleFacts, seen: set[str]) -> None:
    """NotPortable unless `function` changes nothing outside itself (its parameters are the
    caller's objects), calls only what is safe, and reads from the module only constants."""
    seen.add(function.name)
    local = _locals(function)
    params = {a.arg for a in function.args.args}
    for node in _body_nodes(function):
        if isinstance(node, (ast.Global, ast.Nonlocal, ast.Yield, ast.YieldFrom, ast.Await,
                             ast.FunctionDef, ast.AsyncFunctionDef, ast.ClassDef, ast.Lambda,
                             ast.Import, ast.ImportFrom, ast.With, ast.AsyncWith)):
            raise NotPortable(f"{function.name} holds a statement porter does not run on Polars "
                              f"rows ({type(node).__name__.lower()})")
        targets: list[ast.AST] = []
        if isinstance(node, ast.Assign):
            targets = list(node.targets)
        elif isinstance(node, (ast.AugAssign, ast.AnnAssign)):
            targets = [node.target]
        elif isinstance(node, ast.Delete):
            targets = list(node.targets)
        for target in targets:
            root = _root(target)
            if isinstance(target, (ast.Subscript, ast.Attribute)) \
                    and (root not in local or root in params):
                raise NotPortable(f"{function.name} changes an object it did not make")
        if isinstance(node, ast.Call):
            _check_call(node, function, facts, local, params, seen)
        if isinstance(node, ast.Name) and isinstance(node.ctx, ast.Load) and node.id not in local:
            if node.id in facts.constants or node.id in facts.functions \
                    or node.id in facts.modules or node.id in facts.frozen:
                continue
            if node.id in SAFE_NAMES and node.id not in facts.bound:
                continue
            raise NotPortable(f"{function.name} reads {node.id}, which porter cannot tell is "
                              f"the same when Polars runs it")


def _check_call(node: ast.Call, function: ast.FunctionDef, facts: ModuleFacts, local: set[str],
                params: set[str], seen: set[str]) -> None:
    func = node.func
    if isinstance(func, ast.Name):
        if func.id in local:
            raise NotPortable(f"{function.name} calls a value it holds ({func.id})")
        if func.id in facts.functions:
            if func.id not in seen:
                _check_pure(facts.functions[func.id], facts, seen)
            return
        if func.id in SAFE_CALLS and func.id not in facts.bound:
            return
        raise NotPortable(f"{function.name} calls {func.id}()")
    if isinstance(func, ast.Attribute):
        root = _root(func.value)
        if isinstance(func.value, ast.Name) and func.value.id in facts.modules \
                and func.value.id not in local:
            return  # math.floor(x), re.sub(...)
        if func.attr in _MUTATING and (root is None or root not in local or root in params):
            raise NotPortable(f"{function.name} changes an object it did not make "
                              f"(.{func.attr}())")
        if root is not None and root not in local and root in facts.functions:
            raise NotPortable(f"{function.name} reads an attribute of a function")
        return
    raise NotPortable(f"{function.name} calls a computed function")


def _return_kinds(function: ast.FunctionDef, facts: ModuleFacts,
                  param_kinds: dict[str, frozenset[str]], columns: dict[str, frozenset[str]],
                  row: str | None, active: set[str]) -> frozenset[str]:
    """The types of what `function` returns, by a small fixpoint over its local names."""
    if not _always_returns(function.body):
        return frozenset({UNKNOWN, "none"})
    active = active | {function.name}
    local = _locals(function)
    # a local name holds nothing known until an assignment is read (the fixpoint grows it)
    names: dict[str, frozenset[str]] = {name: frozenset() for name in local}
    names.update({p: param_kinds.get(p, frozenset({UNKNOWN}))
                  for p in (a.arg for a in function.args.args)})
    writes: list[tuple[str, ast.AST]] = []
    for node in _body_nodes(function):
        if isinstance(node, ast.Assign):
            for target in node.targets:
                if isinstance(target, ast.Name):
                    writes.append((target.id, node.value))
                else:
                    writes += [(n.id, ast.Constant(value=...)) for n in ast.walk(target)
                               if isinstance(n, ast.Name) and isinstance(n.ctx, ast.Store)]
        elif isinstance(node, ast.AugAssign) and isinstance(node.target, ast.Name):
            writes.append((node.target.id, ast.BinOp(left=ast.Name(id=node.target.id, ctx=ast.Load()),
                                                      op=node.op, right=node.value)))
        elif isinstance(node, ast.AnnAssign) and isinstance(node.target, ast.Name) and node.value:
            writes.append((node.target.id, node.value))
    loops: list[tuple[str, ast.AST]] = []  # `for ch in text`: ch is a text too
    unknown: set[str] = set()
    for node in _body_nodes(function):
        if isinstance(node, (ast.For, ast.comprehension)) and isinstance(node.target, ast.Name):
            loops.append((node.target.id, node.iter))
        elif isinstance(node, (ast.For, ast.comprehension)):
            unknown |= {n.id for n in ast.walk(node.target) if isinstance(n, ast.Name)}
        elif isinstance(node, (ast.ExceptHandler, ast.NamedExpr, ast.With)):
            unknown |= {n.id for n in ast.walk(node) if isinstance(n, ast.Name)
                        and isinstance(n.ctx, ast.Store)}
    for name in unknown & local:
        names[name] = frozenset({UNKNOWN})
    for _ in range(20):
        before = dict(names)
        for name, value in writes:
            kinds = _kinds(value, names, facts, columns, row, active)
            names[name] = names.get(name, frozenset()) | kinds
        for name, iterable in loops:
            over = _kinds(iterable, names, facts, columns, row, active)
            is_range = isinstance(iterable, ast.Call) and isinstance(iterable.func, ast.Name) \
                and iterable.func.id == "range" and "range" not in facts.bound
            kinds = frozenset({"str"}) if over == frozenset({"str"}) \
                else frozenset({"int"}) if is_range else frozenset({UNKNOWN})
            names[name] = names.get(name, frozenset()) | kinds
        if names == before:
            break
    else:
        return frozenset({UNKNOWN})
    result: frozenset[str] = frozenset()
    for node in _body_nodes(function):
        if isinstance(node, ast.Return):
            result |= frozenset({"none"}) if node.value is None \
                else _kinds(node.value, names, facts, columns, row, active)
    return result


def _always_returns(body: list[ast.stmt]) -> bool:
    if not body:
        return False
    last = body[-1]
    if isinstance(last, (ast.Return, ast.Raise)):
        return True
    if isinstance(last, ast.If):
        return _always_returns(last.body) and _always_returns(last.orelse)
    if isinstance(last, ast.Try) and not last.finalbody:
        body = last.body + last.orelse
        return _always_returns(body) and all(_always_returns(h.body) for h in last.handlers)
    return False


def _kinds(node: ast.AST, names: dict[str, frozenset[str]], facts: ModuleFacts,
           columns: dict[str, frozenset[str]], row: str | None, active: set[str]) -> frozenset[str]:
    def k(n: ast.AST) -> frozenset[str]:
        return _kinds(n, names, facts, columns, row, active)

    unknown = frozenset({UNKNOWN})
    if isinstance(node, ast.Constant):
        value = node.value
        if value is ...:
            return unknown
        return frozenset({"none" if value is None else "bool" if isinstance(value, bool)
                          else type(value).__name__})
    if isinstance(node, ast.JoinedStr):
        return frozenset({"str"})
    if isinstance(node, ast.Name):
        if node.id in names:
            return names[node.id]
        if node.id in facts.constants:
            value = facts.constants[node.id]
            kind = "bool" if isinstance(value, bool) else type(value).__name__
            return frozenset({kind}) if kind in RESULT_TYPES else unknown
        return unknown
    if isinstance(node, ast.Subscript) and row is not None and isinstance(node.value, ast.Name) \
            and node.value.id == row:
        found: frozenset[str] = frozenset()
        for kinds in columns.values():
            found |= kinds
        key = node.slice
        if isinstance(key, ast.Constant) and isinstance(key.value, str):
            return columns.get(key.value, unknown)
        return found or unknown
    if isinstance(node, ast.Subscript) and isinstance(node.value, ast.Name) \
            and node.value.id not in names and isinstance(facts.constants.get(node.value.id), dict):
        # a lookup in the module's dict (`CODES[v]`): one of its values (a missing key raises)
        values = facts.constants[node.value.id].values()  # type: ignore[union-attr]
        kinds = frozenset("none" if v is None else "bool" if isinstance(v, bool)
                          else type(v).__name__ for v in values)
        return kinds if kinds and kinds <= RESULT_TYPES | {"none"} else unknown
    if isinstance(node, ast.Subscript) and k(node.value) == frozenset({"str"}):
        return frozenset({"str"})  # a character or a slice of a text
    if isinstance(node, ast.Subscript) and k(node.value) == frozenset({_LIST_OF_STR}) \
            and isinstance(node.slice, ast.Constant) and isinstance(node.slice.value, int):
        return frozenset({"str"})  # an item of a list of texts (IndexError where it is empty)
    if isinstance(node, (ast.Subscript, ast.Attribute)) and not k(node.value):
        return frozenset()  # not known yet: the fixpoint comes back to it
    if isinstance(node, ast.BinOp):
        out: set[str] = set()
        for a in k(node.left):
            for b in k(node.right):
                out.add(_binary(a, node.op, b))
        return frozenset(out)
    if isinstance(node, ast.UnaryOp):
        if isinstance(node.op, ast.Not):
            return frozenset({"bool"})
        if isinstance(node.op, (ast.USub, ast.UAdd)):
            return frozenset("int" if x == "bool" else x if x in ("int", "float") else UNKNOWN
                             for x in k(node.operand))
        return unknown
    if isinstance(node, ast.Compare):
        return frozenset({"bool"})
    if isinstance(node, ast.BoolOp):
        out_kinds: frozenset[str] = frozenset()
        for value in node.values:
            out_kinds |= k(value)
        return out_kinds
    if isinstance(node, ast.IfExp):
        return k(node.body) | k(node.orelse)
    if isinstance(node, ast.Call):
        return _call_kinds(node, k, facts, columns, active)
    return unknown


def _binary(a: str, op: ast.operator, b: str) -> str:
    arithmetic = (ast.Add, ast.Sub, ast.Mult, ast.Div, ast.FloorDiv)
    numbers = {"int", "float", "bool"}
    if isinstance(op, arithmetic) and "float" in (a, b) and {a, b} <= numbers | {UNKNOWN}:
        return "float"  # a float with a number is a float; with anything else Python raises
    if isinstance(op, ast.Mod) and a == "float" and b in numbers | {UNKNOWN}:
        return "float"
    if UNKNOWN in (a, b):
        return UNKNOWN
    if {a, b} <= numbers:
        if isinstance(op, ast.Div):
            return "float"
        if isinstance(op, (ast.Add, ast.Sub, ast.Mult, ast.FloorDiv, ast.Mod)):
            return "float" if "float" in (a, b) else "int"
        return UNKNOWN
    if a == "str" and b == "str" and isinstance(op, ast.Add):
        return "str"
    if isinstance(op, ast.Mult) and {a, b} in ({"str", "int"}, {"str", "bool"}):
        return "str"
    if isinstance(op, ast.Mod) and a == "str":
        return "str"
    return UNKNOWN


def _call_kinds(node: ast.Call, k: Callable[[ast.AST], frozenset[str]], facts: ModuleFacts,
                columns: dict[str, frozenset[str]], active: set[str]) -> frozenset[str]:
    unknown = frozenset({UNKNOWN})
    func = node.func
    args = node.args
    if node.keywords and not (isinstance(func, ast.Attribute)):
        return unknown
    if isinstance(func, ast.Name):
        name = func.id
        if name in facts.functions:
            if name in active:
                return unknown
            callee = facts.functions[name]
            params = [a.arg for a in callee.args.args]
            if len(args) != len(params) or callee.args.defaults or node.keywords:
                return unknown
            kinds = {p: k(a) for p, a in zip(params, args)}
            return _return_kinds(callee, facts, kinds, columns, None, active)
        if name in facts.bound:
            return unknown
        fixed = {"float": "float", "int": "int", "str": "str", "bool": "bool", "len": "int",
                 "isinstance": "bool", "repr": "str", "format": "str", "chr": "str", "ord": "int"}
        if name in fixed:
            return frozenset({fixed[name]})
        if name == "abs" and len(args) == 1:
            return frozenset("int" if x == "bool" else x if x in ("int", "float") else UNKNOWN
                             for x in k(args[0]))
        if name == "round" and len(args) == 1:
            return frozenset("int" if x in ("int", "float", "bool") else UNKNOWN for x in k(args[0]))
        if name == "round" and len(args) == 2:
            return frozenset(x if x in ("int", "float") else UNKNOWN for x in k(args[0]))
        if name in ("min", "max") and len(args) >= 2:
            out: frozenset[str] = frozenset()
            for a in args:
                out |= k(a)
            return out
        return unknown
    if isinstance(func, ast.Attribute):
        if isinstance(func.value, ast.Name) and func.value.id == "math" and "math" in facts.modules:
            if func.attr in _MATH_TO_INT:
                return frozenset({"int"})
            if func.attr in _MATH_TO_FLOAT:
                return frozenset({"float"})
            return unknown
        if isinstance(func.value, ast.Name) and func.value.id == "difflib" \
                and "difflib" in facts.modules and func.attr == "get_close_matches":
            return frozenset({_LIST_OF_STR})  # the closest texts of the list given
        receiver = k(func.value)
        if not receiver:
            return frozenset()  # not known yet: the fixpoint comes back to it
        if receiver == frozenset({"str"}):
            if func.attr in _STR_TO_STR:
                return frozenset({"str"})
            if func.attr in _STR_TO_BOOL:
                return frozenset({"bool"})
            if func.attr in _STR_TO_INT:
                return frozenset({"int"})
    return unknown
