"""Consecutive writes become one pl.collect_all, so the plans they share run once; and where the
script writes, moves or removes files (FileChanges), so that a scan reads a file before the
script changes it, as pandas reads it."""

from __future__ import annotations

import ast
import os
import re
import textwrap
from dataclasses import dataclass
from typing import Any

import libcst as cst


SINKS = ("sink_csv", "sink_parquet", "sink_ndjson", "sink_ipc")


def _sink_call(stmt: Any) -> cst.Call | None:
    """The write of a statement that is only `frame.sink_*(path, ...)` with a literal path."""
    if not (isinstance(stmt, cst.SimpleStatementLine) and len(stmt.body) == 1
            and isinstance(stmt.body[0], cst.Expr)):
        return None
    call = stmt.body[0].value
    if isinstance(call, cst.Call) and isinstance(call.func, cst.Attribute) \
            and call.func.attr.value in SINKS and call.args \
            and isinstance(call.args[0].value, cst.SimpleString) and not any(
                a.keyword is not None and a.keyword.value == "lazy" for a in call.args):
        return call
    return None


def is_sink_text(text: str) -> bool:
    """Whether code porter wrote is one write that batch_writes would batch with its
    neighbours."""
    try:
        return _sink_call(cst.parse_statement(text.strip() + "\n")) is not None
    except cst.ParserSyntaxError:
        return False


def batch_writes(out: list[Any], original: Any) -> list[Any]:
    """Consecutive writes porter made become one pl.collect_all, so plans they share run once.

    Only writes to distinct literal paths with nothing but blank lines between them are
    batched: the files are then the same as when written one after the other. A write whose
    file a query of the run reads is never batched with it: Polars refuses to write a file a
    query of the same batch reads (pandas read it earlier; the frames read before a file is
    written are collected where they are bound, see FileChanges).
    """
    rewritten = {id(s) for s in out} - {id(s) for s in original}
    result: list[Any] = []
    run: list[tuple[Any, cst.Call]] = []

    def flush() -> None:
        paths = [c.args[0].value.evaluated_value for _, c in run]  # type: ignore[union-attr]
        read = {path for stmt, _ in run for path in _scanned(stmt)}
        if len(run) >= 2 and len(set(paths)) == len(paths) \
                and not read & {_normal(p) for p in paths if isinstance(p, str)}:
            result.append(_collect_all(run))
        else:
            result.extend(stmt for stmt, _ in run)
        run.clear()

    for stmt in out:
        call = _sink_call(stmt) if id(stmt) in rewritten else None
        if call is not None and _normal(call.args[0].value.evaluated_value) in _scanned(stmt):  # type: ignore[union-attr, arg-type]
            # the query reads the file it writes (`pd.read_csv(p)....to_csv(p)`): pandas read
            # it whole first, and Polars refuses to stream into a file it reads: collected
            stmt, call = _collected_first(stmt, call), None
        has_comment = any(line.comment for line in getattr(stmt, "leading_lines", ()))
        if call is not None and (not run or not has_comment):
            run.append((stmt, call))
            continue
        flush()
        if call is not None:
            run.append((stmt, call))
        else:
            result.append(stmt)
    flush()
    return result


def _collected_first(stmt: Any, call: cst.Call) -> Any:
    """The write with its query collected first: `q.collect().lazy().sink_csv(p)`."""
    func = call.func
    assert isinstance(func, cst.Attribute)
    collected = cst.Call(func=cst.Attribute(
        value=cst.Call(func=cst.Attribute(value=func.value, attr=cst.Name("collect"), dot=func.dot)),
        attr=cst.Name("lazy"), dot=func.dot))
    return stmt.deep_replace(call, call.with_changes(func=func.with_changes(value=collected)))


def _scanned(stmt: Any) -> set[str]:
    """The files a statement's code reads by a literal path (`pl.scan_csv("d.csv")`)."""
    found: set[str] = set()

    class Reads(cst.CSTVisitor):
        def visit_Call(self, call: cst.Call) -> None:
            func = call.func
            name = func.attr.value if isinstance(func, cst.Attribute) else \
                func.value if isinstance(func, cst.Name) else ""
            if name.startswith(("scan_", "read_")) and call.args \
                    and isinstance(call.args[0].value, cst.SimpleString):
                path = call.args[0].value.evaluated_value
                if isinstance(path, str):
                    found.add(_normal(path))

    stmt.visit(Reads())
    return found


def _collect_all(run: list[tuple[Any, cst.Call]]) -> cst.SimpleStatementLine:
    module = cst.Module([])
    lines = []
    for _, call in run:
        args = [*call.args]
        args[-1] = args[-1].with_changes(comma=cst.MaybeSentinel.DEFAULT)
        lazy = cst.Arg(keyword=cst.Name("lazy"), value=cst.Name("True"),
                       equal=cst.AssignEqual(cst.SimpleWhitespace(""), cst.SimpleWhitespace("")))
        with_lazy = call.with_changes(args=[*(a.with_changes(comma=cst.Comma(
            whitespace_after=cst.SimpleWhitespace(" "))) for a in args), lazy])
        # a write laid out over several lines keeps its layout, one level in
        lines.append(textwrap.indent(module.code_for_node(with_lazy), "    ") + ",")
    text = "pl.collect_all([\n" + "\n".join(lines) + "\n])\n"
    stmt = cst.parse_statement(text)
    first = run[0][0]
    return stmt.with_changes(leading_lines=first.leading_lines,
                             trailing_whitespace=run[-1][0].trailing_whitespace)


# -- files the script changes (engine: a scan read before the change is collected there) --------


# methods that write the file named by their first argument (or their path keyword)
_WRITERS = frozenset({
    "to_csv", "to_parquet", "to_json", "to_excel", "to_feather", "to_pickle", "to_hdf",
    "to_stata", "to_html", "to_xml", "to_latex", "to_markdown", "to_string", "to_orc",
    "write_csv", "write_parquet", "write_json", "write_ndjson", "write_ipc", "write_excel",
    "write_avro", "write_delta", "sink_csv", "sink_parquet", "sink_ipc", "sink_ndjson",
    "savetxt", "save", "savez", "savez_compressed", "ExcelWriter", "copyfile",
})
_PATH_KEYWORDS = ("path_or_buf", "path", "excel_writer", "buf", "file", "fname", "dst")
# shutil / os calls: which of their arguments they change (0 the first, 1 the second)
_MOVES = {"move": (0, 1), "rename": (0, 1), "replace": (0, 1), "renames": (0, 1),
          "copy": (1,), "copy2": (1,), "copyfile": (1,), "copytree": (1,),
          "remove": (0,), "unlink": (0,), "rmdir": (0,), "rmtree": (0,), "removedirs": (0,)}
_MOVE_MODULES = frozenset({"os", "shutil"})
# methods of a path object that change the file it names
_PATH_METHODS = frozenset({"write_text", "write_bytes", "unlink", "rename", "replace", "touch",
                           "rmdir"})
# calls that run another program: it may change any file
_RUNS = frozenset({"system", "run", "call", "check_call", "check_output", "Popen", "popen"})
_ANY = ".*"
_OPENERS = frozenset({"io", "gzip", "bz2", "lzma", "codecs", "builtins", "os"})


@dataclass(frozen=True)
class FileChange:
    """A statement that changes a file: `pattern` is a regular expression of the paths it may
    name (".*" where porter cannot tell), `content` whether it writes the file (not only moves
    or removes it)."""

    pattern: str
    line: int
    content: bool


class FileChanges:
    """Where the script writes, moves or removes files, read once from the module (ast)."""

    def __init__(self, module: ast.Module | None) -> None:
        self.changes: list[FileChange] = []
        self.loops: list[tuple[int, int]] = []
        self.functions: list[tuple[int, int]] = []
        self.reads_in: dict[str, list[ast.Call]] = {}  # the script's functions: reads in them
        self.calls_in: dict[str, set[str]] = {}
        self.constants: dict[str, str] = {}
        if module is None:
            return
        self.constants = _string_constants(module)
        for node in ast.walk(module):
            if isinstance(node, (ast.For, ast.AsyncFor, ast.While)):
                self.loops.append((node.lineno, node.end_lineno or node.lineno))
            elif isinstance(node, (ast.FunctionDef, ast.AsyncFunctionDef)):
                self.functions.append((node.lineno, node.end_lineno or node.lineno))
                self.reads_in[node.name] = [c for c in ast.walk(node) if _is_read(c)]
                self.calls_in[node.name] = {c.func.id for c in ast.walk(node) if isinstance(c, ast.Call)
                                            and isinstance(c.func, ast.Name)}
            elif isinstance(node, ast.Call):
                for target, content in self._changed(node):
                    self.changes.append(FileChange(self.pattern(target), node.lineno, content))

    # -- what a call changes ------------------------------------------------------------------
    def _changed(self, call: ast.Call) -> list[tuple[ast.expr | None, bool]]:
        func = call.func
        name = func.attr if isinstance(func, ast.Attribute) else func.id if isinstance(func, ast.Name) else None
        if name is None:
            return []
        owner = func.value.id if isinstance(func, ast.Attribute) and isinstance(func.value, ast.Name) else None
        if name == "open":
            method = isinstance(func, ast.Attribute) and owner not in _OPENERS  # Path(p).open
            path = func.value if method else call.args[0] if call.args else next(
                (k.value for k in call.keywords if k.arg == "file"), None)
            at = 0 if method else 1
            mode = call.args[at] if len(call.args) > at else next(
                (k.value for k in call.keywords if k.arg == "mode"), None)
            if mode is None or isinstance(mode, ast.Constant) and isinstance(mode.value, str) \
                    and not set(mode.value) & set("wax+"):
                return []  # read
            return [(path, True)]
        if name in _MOVES and (owner in _MOVE_MODULES or owner is None and name in ("move", "rmtree", "copyfile")):
            return [(call.args[i] if i < len(call.args) else None, i == 1)
                    for i in _MOVES[name]]
        if name in _RUNS and owner in ("os", "subprocess"):
            return [(None, True)]
        if isinstance(func, ast.Attribute) and name in _PATH_METHODS and owner not in _MOVE_MODULES \
                and (not call.args or name in ("rename", "replace", "write_text", "write_bytes")):
            if name in ("rename", "replace") and call.args and not _textlike(func.value):
                # Path(a).rename(b): both names change; str.replace is not a file
                return [(func.value, False), (call.args[0], True)]
            return [(func.value, name.startswith("write") or name == "touch")] \
                if name not in ("rename", "replace") else []
        if name in _WRITERS:
            target = call.args[0] if call.args else next(
                (k.value for k in call.keywords if k.arg in _PATH_KEYWORDS), None)
            if target is None:
                return []  # to_csv() / to_string(): the text is returned, nothing written
            return [(target, True)]
        return []

    # -- paths --------------------------------------------------------------------------------
    def pattern(self, node: ast.expr | None) -> str:
        """A regular expression of the paths an expression may name (normalised)."""
        text = self._pattern(node)
        return _ANY if text is None else text

    def _pattern(self, node: ast.expr | None) -> str | None:
        if node is None:
            return None
        if isinstance(node, ast.Constant) and isinstance(node.value, str):
            return re.escape(_normal(node.value))
        if isinstance(node, ast.Name) and node.id in self.constants:
            return re.escape(_normal(self.constants[node.id]))
        if isinstance(node, ast.JoinedStr):
            parts = [v.value if isinstance(v, ast.Constant) else None for v in node.values]
            if parts and isinstance(parts[0], str) and parts[0].startswith("./"):
                parts[0] = parts[0][2:]
            return "".join(_ANY if p is None else re.escape(p) for p in parts) or None
        if isinstance(node, ast.BinOp) and isinstance(node.op, (ast.Add, ast.Div)):
            left, right = self._pattern(node.left), self._pattern(node.right)
            joint = "/" if isinstance(node.op, ast.Div) else ""
            return f"{left or _ANY}{joint}{right or _ANY}"
        if isinstance(node, ast.Call):
            func = node.func
            name = func.attr if isinstance(func, ast.Attribute) else func.id if isinstance(func, ast.Name) else ""
            if name in ("join", "Path", "PurePath") and node.args and not node.keywords:
                return "/".join(self._pattern(a) or _ANY for a in node.args)
            if name in ("str", "fspath", "abspath", "normpath", "expanduser") and len(node.args) == 1:
                return self._pattern(node.args[0])
        return None

    def may_name(self, pattern: str, path: str | None) -> bool:
        """Whether a change of `pattern` may change the file `path` (None: not known), or a
        folder it is in."""
        if path is None or pattern == _ANY:
            return True
        path = _normal(path)
        parts = path.split("/")
        candidates = ["/".join(parts[:i]) for i in range(1, len(parts) + 1)]
        return any(re.fullmatch(pattern, c) for c in candidates)

    # -- reads --------------------------------------------------------------------------------
    def read_paths(self, statement: ast.AST) -> list[str | None]:
        """The files a statement reads with pandas (directly, or through one of the script's
        functions that reads one): each path, or None where porter cannot tell it."""
        paths: list[str | None] = []
        for call in ast.walk(statement):
            if not isinstance(call, ast.Call):
                continue
            if _is_read(call):
                paths.append(self.literal(_read_source(call)))
            elif isinstance(call.func, ast.Name) and call.func.id in self.reads_in:
                passed = [self.literal(a) for a in [*call.args, *(k.value for k in call.keywords)]]
                for read in self._reads_through(call.func.id, set()):
                    own = self.literal(_read_source(read))
                    if own is not None:
                        paths.append(own)
                    elif any(p is not None for p in passed):
                        paths.extend(p for p in passed if p is not None)
                    else:
                        paths.append(None)
        return paths

    def _reads_through(self, function: str, seen: set[str]) -> list[ast.Call]:
        """The reads in a function of the script and in the functions it calls."""
        if function in seen:
            return []
        seen.add(function)
        found = list(self.reads_in.get(function, ()))
        for called in self.calls_in.get(function, ()):
            found += self._reads_through(called, seen)
        return found

    def literal(self, node: ast.expr | None) -> str | None:
        if isinstance(node, ast.Constant) and isinstance(node.value, str):
            return node.value
        if isinstance(node, ast.Name):
            return self.constants.get(node.id)
        return None

    # -- order --------------------------------------------------------------------------------
    def changed_after(self, path: str | None, lines: tuple[int, int]) -> bool:
        """Whether the script may change the file `path` (None: not known) after the statement
        at `lines` reads it: a change on a later line, in a loop around both, or in a function
        (run when it is called). A statement in a function counts the changes in that
        function (its caller's binding counts the rest)."""
        start, end = lines
        function = self._span(self.functions, start)
        for change in self.changes:
            if not self.may_name(change.pattern, path):
                continue
            if function is not None:
                if function[0] <= change.line <= function[1] and (
                        change.line > end or self._together(start, change.line)):
                    return True
            elif change.line > end or self._span(self.functions, change.line) is not None \
                    or self._together(start, change.line):
                return True
        return False

    def written_before(self, path: str, lines: tuple[int, int]) -> bool:
        """Whether the script may write the file `path` before the statement at `lines` reads
        it: on an earlier line, in a loop around both, in a function, or anywhere when the
        read is in a function."""
        start, _ = lines
        in_function = self._span(self.functions, start) is not None
        return any(change.content and self.may_name(change.pattern, path) and (
            in_function or change.line < start or self._together(start, change.line)
            or self._span(self.functions, change.line) is not None) for change in self.changes)

    def _together(self, a: int, b: int) -> bool:
        return any(lo <= a <= hi and lo <= b <= hi for lo, hi in self.loops)

    @staticmethod
    def _span(spans: list[tuple[int, int]], line: int) -> tuple[int, int] | None:
        inside = [s for s in spans if s[0] <= line <= s[1]]
        return min(inside, key=lambda s: s[1] - s[0]) if inside else None


class FreshSchemas:
    """The --data schema lookup, except for a file the script writes before it reads it: the
    copy in the data folder may be an older one (left there by an earlier run), so its types
    are not taken; the scan infers them from what the script wrote."""

    def __init__(self, lookup: Any, changes: FileChanges, lines: Any) -> None:
        self.lookup, self.changes, self.lines = lookup, changes, lines

    def __call__(self, reader: str, path: str, options: dict[str, Any]) -> Any:
        if isinstance(path, str) and self.changes.written_before(path, self.lines()):
            return None
        return self.lookup(reader, path, options)

    def written_by_script(self, path: object) -> bool:
        return isinstance(path, str) and self.changes.written_before(path, self.lines())

    def __getattr__(self, name: str) -> Any:
        return getattr(self.lookup, name)


def _is_read(node: ast.AST) -> bool:
    if not isinstance(node, ast.Call):
        return False
    func = node.func
    name = func.attr if isinstance(func, ast.Attribute) else func.id if isinstance(func, ast.Name) else ""
    return name.startswith("read_") and name not in ("read_text", "read_bytes") and (
        bool(node.args) or any(k.arg in ("filepath_or_buffer", "path", "io", "path_or_buf")
                               for k in node.keywords))


def _read_source(call: ast.Call) -> ast.expr | None:
    if call.args:
        return call.args[0]
    return next((k.value for k in call.keywords
                 if k.arg in ("filepath_or_buffer", "path", "io", "path_or_buf")), None)


def _textlike(node: ast.expr) -> bool:
    """An expression that is text, not a path (`"a-b".replace(...)`, `name.replace(...)`)."""
    if isinstance(node, (ast.Constant, ast.JoinedStr)):
        return True
    return not (isinstance(node, ast.Call) and isinstance(node.func, (ast.Name, ast.Attribute))
                and (node.func.id if isinstance(node.func, ast.Name) else node.func.attr)
                in ("Path", "PurePath"))


def _string_constants(module: ast.Module) -> dict[str, str]:
    """Module names bound once, to a text, and never bound again anywhere."""
    counts: dict[str, int] = {}
    values: dict[str, str] = {}
    for node in ast.walk(module):
        if isinstance(node, ast.Name) and isinstance(node.ctx, ast.Store):
            counts[node.id] = counts.get(node.id, 0) + 1
    for stmt in module.body:
        if isinstance(stmt, ast.Assign) and len(stmt.targets) == 1 \
                and isinstance(stmt.targets[0], ast.Name) and isinstance(stmt.value, ast.Constant) \
                and isinstance(stmt.value.value, str):
            values[stmt.targets[0].id] = stmt.value.value
    return {n: v for n, v in values.items() if counts.get(n) == 1}


def _normal(path: str) -> str:
    return os.path.normpath(path).replace(os.sep, "/")
