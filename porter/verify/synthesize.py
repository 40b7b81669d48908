"""Sample data made from the script alone, for `porter verify` without `--data`.

Many users cannot bring the script's real input: it is too large, private, or today's export.
From the script's own text porter finds the files it reads (`read_csv` of a path written in the
code, with its separator, `usecols`, `names`, `dtype`, `parse_dates` and `na_values`), the
columns it uses on each, and a type for each column from how it is used:

- `.str`, a comparison with text, `isin`/`map`/`replace` with text: text, and the literals the
  script compares with are among the values;
- arithmetic, a comparison with a number, a numeric reduction (`sum`, `mean`...), `round`,
  `astype(float)`, `pd.to_numeric`: numbers;
- `.dt`, `parse_dates=`, `pd.to_datetime(col, format=f)`: dates as text (in `f` when given);
- a group, sort or merge key with no other clue: text codes that repeat; merge keys are drawn
  from one pool shared by the files, so some match and some do not.

A column only carried along (selected, counted, written) is text. A column read on a frame made
from several files goes into one of them; `synthesize_checked` then runs the original script on
what was made and, where it stops on a missing column, puts the column in the other file.

The values include the awkward cases on purpose (missing values, repeats, ties, rounding halves,
month ends, non-ASCII letters). What porter cannot make, it names, and asks for `--data`: a path
computed at run time, a file outside the script's folder, a database or other non-CSV read, a
column given to the script's own function (what the function expects, porter cannot tell).
"""

from __future__ import annotations

import ast
import csv
from dataclasses import dataclass, field
import datetime as dt
import io
from pathlib import Path
import random
import re
import shutil
import subprocess
import sys
import tempfile

from porter.analysis.pandas_names import FRAME
from porter.model import ConversionError
from porter.rules.io_options import PANDAS_NA_TOKENS

_READERS = {"read_csv", "read_table"}
_OTHER_READERS = {"read_parquet", "read_excel", "read_json", "read_sql", "read_sql_query",
                  "read_sql_table", "read_feather", "read_pickle", "read_html", "read_xml",
                  "read_fwf", "read_orc", "read_stata", "read_sas", "read_spss", "read_hdf"}
_NUMBER_METHODS = {"sum", "mean", "median", "std", "var", "min", "max", "cumsum", "cumprod",
                   "round", "abs", "clip", "pct_change", "diff", "prod", "quantile", "rolling",
                   "expanding", "ewm", "rank", "between"}
_KEY_METHODS = {"groupby", "sort_values", "drop_duplicates", "set_index", "pivot_table",
                "value_counts", "nlargest", "nsmallest", "duplicated"}
_NUMBER_AGGS = {"sum", "mean", "median", "std", "var", "min", "max", "prod"}


@dataclass
class _Column:
    kind: str | None = None  # "text", "number", "int", "date", "key"
    date_format: str = "%Y-%m-%d"
    literals: set[object] = field(default_factory=set)
    seen: list[str] = field(default_factory=list)  # values read from --data's file, if given


@dataclass
class _Read:
    path: str
    separator: str = ","
    columns: dict[str, _Column] = field(default_factory=dict)
    fixed: list[str] | None = None  # usecols / names: exactly these columns
    header: bool = True


class SynthesisError(ConversionError):
    """Input porter cannot make from the script alone."""

    def __init__(self, message: str) -> None:
        super().__init__(message)


def synthesize(source: str, folder: Path, seed: int = 0, rows: int = 24,
               path: str | None = None, placement: dict[str, int] | None = None,
               types_from: Path | None = None, sample_rows: int = 1000) -> dict[str, int]:
    """Write the files `source` (the script at `path`) reads into `folder` (relative paths
    kept); rows per file. `placement` picks, for a column read on a frame made from several
    files (after a merge), which of those files holds it (by its number among them).
    `types_from`: the script's data folder (`--synthesize --data`): each file found there
    gives its columns, their types and some of their values, from its first `sample_rows`
    rows; what the script's code says (its literals) is kept."""
    try:
        reads = _find_reads(source, placement or {}, types_from, sample_rows)
    except SynthesisError as exc:
        exc.path = path
        raise
    rnd = random.Random(f"synthesize:{seed}")
    merge_pool = [f"K{n:02d}" for n in range(1, 9)]
    sizes = {}
    for read in reads:
        table = _table(read, rnd, rows, merge_pool)
        target = folder / read.path
        target.parent.mkdir(parents=True, exist_ok=True)
        out = io.StringIO()
        writer = csv.writer(out, delimiter=read.separator, lineterminator="\n")
        if read.header:
            writer.writerow(list(read.columns))
        writer.writerows(table)
        target.write_text(out.getvalue(), encoding="utf-8")
        sizes[read.path] = len(table)
    return sizes


_MISSING_COLUMN = re.compile(
    r"KeyError: \"?\[?'([^']+)'|has no attribute '([^']+)'|unable to find column \"([^\"]+)\"")


def synthesize_checked(script: Path, folder: Path, seed: int = 0, attempts: int = 6,
                       timeout: float = 120.0, types_from: Path | None = None,
                       sample_rows: int = 1000) -> dict[str, int]:
    """synthesize(), then run the original script on what was made: where it stops on a
    column missing from a frame made from several files (porter put the column in the other
    file), move the column and make the files again, a few times at most."""
    source = script.read_text(encoding="utf-8")
    placement: dict[str, int] = {}
    for _ in range(attempts):
        if folder.exists():
            shutil.rmtree(folder)
        sizes = synthesize(source, folder, seed=seed, path=str(script), placement=placement,
                           types_from=types_from, sample_rows=sample_rows)
        with tempfile.TemporaryDirectory(prefix="porter-check-") as work:
            shutil.copytree(folder, work, dirs_exist_ok=True)
            shutil.copy(script, Path(work) / script.name)
            try:
                done = subprocess.run([sys.executable, script.name], cwd=work, timeout=timeout,
                                      capture_output=True, text=True)
            except subprocess.TimeoutExpired:
                return sizes
        found = _MISSING_COLUMN.findall(done.stderr.splitlines()[-1] if done.stderr else "")
        missing = next((n for group in found for n in group if n), None)
        if done.returncode == 0 or missing is None:
            return sizes
        placement[missing] = placement.get(missing, 0) + 1
    return sizes


# --- reading the script ------------------------------------------------------------------------

def _find_reads(source: str, placement: dict[str, int], types_from: Path | None = None,
                sample_rows: int = 1000) -> list[_Read]:
    try:
        tree = ast.parse(source)
    except SyntaxError as exc:
        raise SynthesisError(f"the script does not parse (line {exc.lineno}): {exc.msg}") from None
    constants = _string_constants(tree)
    parents = {child: node for node in ast.walk(tree) for child in ast.iter_child_nodes(node)}
    reads: dict[str, _Read] = {}
    sources: dict[str, set[str]] = {}  # a name -> the files its frame comes from
    problems: list[str] = []
    for node in ast.walk(tree):
        if not (isinstance(node, ast.Call) and isinstance(node.func, ast.Attribute)):
            continue
        name = node.func.attr
        if name in _OTHER_READERS:
            problems.append(f"line {node.lineno}: {name} (porter makes CSV files only)")
            continue
        if name not in _READERS:
            continue
        paths = _paths_of(node, tree, parents, constants)
        if not paths:
            problems.append(f"line {node.lineno}: {name} of a path computed at run time")
            continue
        for path in paths:
            if Path(path).is_absolute() or path.startswith(("http:", "https:", "s3:")):
                problems.append(f"line {node.lineno}: {name} of {path!r}, outside the "
                                "script's folder")
                continue
            read = reads.setdefault(path, _Read(path))
            _read_options(read, node, constants)
            bound = _bound_name(node, parents)
            if bound is not None:
                sources.setdefault(bound, set()).add(path)
    if problems:
        raise SynthesisError("porter cannot make this input from the script alone: "
                             + "; ".join(problems) + ". Give the script's folder with --data")
    if not reads:
        raise SynthesisError("the script reads no CSV file porter can find: nothing to make. "
                             "Give the script's folder with --data")
    _follow(tree, sources)
    _columns(tree, parents, reads, sources, placement)
    if types_from is not None:
        for read in reads.values():
            _from_data(read, types_from, sample_rows)
    untyped = [f"{c!r} of {r.path}" for r in reads.values() for c, col in r.columns.items()
               if col.kind == "needed"]
    for read in reads.values():  # used only as it is (selected, counted, written): any text
        for column in read.columns.values():
            if column.kind is None:
                column.kind = "key"
    if untyped:
        raise SynthesisError("porter cannot tell the type of " + ", ".join(untyped)
                             + ", which the script gives to a function, from how the script uses "
                             "it. Give the script's folder with --data")
    for read in reads.values():
        if not read.columns:
            raise SynthesisError(f"porter cannot tell which columns {read.path} has. Give the "
                                 "script's folder with --data")
    return list(reads.values())


_ISO_DAY = re.compile(r"^\d{4}-\d{2}-\d{2}$")
_ISO_TIME = re.compile(r"^\d{4}-\d{2}-\d{2}([ T])\d{2}:\d{2}(:\d{2})?$")
_INT_TEXT = re.compile(r"^[+-]?\d+$")
_NUMBER_TEXT = re.compile(r"^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$")


def _from_data(read: _Read, data: Path, sample_rows: int) -> None:
    """The file's columns, types and values from its first `sample_rows` rows in `data`
    (`--synthesize --data`): the columns in the file's order (all of them, not only those
    the script names), each typed by what it holds."""
    target = data / read.path
    if not target.is_file():
        return
    try:
        with target.open(encoding="utf-8-sig", newline="") as handle:
            reader = csv.reader(handle, delimiter=read.separator)
            header = next(reader, None) if read.header else read.fixed
            rows = [row for _, row in zip(range(sample_rows), reader)]
    except (OSError, UnicodeDecodeError, csv.Error):
        return
    if not header:
        return
    used = read.columns
    read.columns = {}
    for i, name in enumerate(header):
        column = used.get(name, _Column())
        values = [row[i].strip() for row in rows if i < len(row)]
        present = [v for v in values if v and v not in _NA_TEXT]
        column.seen = sorted(set(present))[:20]
        if not present:
            column.kind = column.kind if column.kind not in (None, "needed") else "text"
        elif all(_INT_TEXT.match(v) for v in present):
            column.kind = "int" if column.kind != "merge" else "merge"
        elif all(_NUMBER_TEXT.match(v) for v in present):
            column.kind = "number"
        elif all(_ISO_DAY.match(v) for v in present):
            column.kind, column.date_format = "date", "%Y-%m-%d"
        elif all(_ISO_TIME.match(v) for v in present):
            match = _ISO_TIME.match(present[0])
            column.kind = "date"
            column.date_format = "%Y-%m-%d" + match.group(1) + "%H:%M" \
                + (":%S" if match.group(2) else "")  # type: ignore[union-attr]
        elif column.kind not in ("key", "merge", "text", "date"):
            column.kind = "text"  # what the code took for a number holds text
        read.columns[name] = column
    for name, column in used.items():  # named by the script, not in the file: as inferred
        read.columns.setdefault(name, column)


_NA_TEXT = set(PANDAS_NA_TOKENS)  # what pandas' read_csv reads as a missing value


def _string_constants(tree: ast.Module) -> dict[str, object]:
    """Module-level names bound once to a literal (`SOURCE = "data/x.csv"`)."""
    found: dict[str, object] = {}
    counts: dict[str, int] = {}
    for node in ast.walk(tree):
        if isinstance(node, ast.Assign):
            for target in node.targets:
                if isinstance(target, ast.Name):
                    counts[target.id] = counts.get(target.id, 0) + 1
                    try:
                        found[target.id] = ast.literal_eval(node.value)
                    except (ValueError, TypeError, SyntaxError, MemoryError, RecursionError):
                        found.pop(target.id, None)
    return {k: v for k, v in found.items() if counts.get(k) == 1}


def _literal(node: ast.AST | None, constants: dict[str, object]) -> object:
    if node is None:
        return None
    if isinstance(node, ast.Name):
        return constants.get(node.id)
    try:
        return ast.literal_eval(node)
    except (ValueError, TypeError, SyntaxError, MemoryError, RecursionError):
        return None


def _paths_of(call: ast.Call, tree: ast.Module, parents: dict[ast.AST, ast.AST],
              constants: dict[str, object]) -> list[str]:
    """The paths a read is given: written in the call, or, for a parameter of the function
    around it (`def load(path): return pd.read_csv(path)`), written in each call of it."""
    path = _path_of(call, constants)
    if path is not None:
        return [path]
    arg = call.args[0] if call.args else None
    function: ast.AST | None = call
    while function is not None and not isinstance(function, ast.FunctionDef):
        function = parents.get(function)
    if not (isinstance(arg, ast.Name) and isinstance(function, ast.FunctionDef)):
        return []
    params = [a.arg for a in function.args.args]
    if arg.id not in params:
        return []
    at = params.index(arg.id)
    found = []
    for node in ast.walk(tree):
        if isinstance(node, ast.Call) and isinstance(node.func, ast.Name) \
                and node.func.id == function.name:
            given = node.args[at] if at < len(node.args) else next(
                (k.value for k in node.keywords if k.arg == arg.id), None)
            value = _path_value(given, constants)
            if value is None:
                return []
            found.append(value)
    return found


def _path_of(call: ast.Call, constants: dict[str, object]) -> str | None:
    arg = call.args[0] if call.args else next(
        (k.value for k in call.keywords if k.arg == "filepath_or_buffer"), None)
    return _path_value(arg, constants)


def _path_value(node: ast.AST | None, constants: dict[str, object]) -> str | None:
    """A path written in the code: a literal, a name bound once to one, `Path("data") /
    "x.csv"`, `os.path.join("data", "x.csv")`."""
    value = _literal(node, constants)
    if isinstance(value, str):
        return value
    if isinstance(node, ast.BinOp) and isinstance(node.op, ast.Div):
        left, right = _path_value(node.left, constants), _path_value(node.right, constants)
        return str(Path(left) / right) if left is not None and right is not None else None
    if isinstance(node, ast.Call) and isinstance(node.func, (ast.Name, ast.Attribute)):
        called = node.func.id if isinstance(node.func, ast.Name) else node.func.attr
        parts = [_path_value(a, constants) for a in node.args]
        if called in ("Path", "join") and parts and all(p is not None for p in parts):
            return str(Path(*parts))  # type: ignore[arg-type]
    return None


def _read_options(read: _Read, call: ast.Call, constants: dict[str, object]) -> None:
    options = {k.arg: _literal(k.value, constants) for k in call.keywords if k.arg}
    sep = options.get("sep", options.get("delimiter"))
    if isinstance(sep, str) and len(sep) == 1:
        read.separator = sep
    elif call.func.attr == "read_table":  # type: ignore[attr-defined]
        read.separator = "\t"
    names = options.get("names")
    if isinstance(names, (list, tuple)) and all(isinstance(n, str) for n in names):
        read.fixed = list(names)
        read.header = options.get("header") == 0  # names= alone: no header line
    usecols = options.get("usecols")
    if isinstance(usecols, (list, tuple)) and all(isinstance(n, str) for n in usecols):
        read.fixed = list(usecols) if read.fixed is None else read.fixed
    for name in read.fixed or []:
        read.columns.setdefault(name, _Column())
    dates = options.get("parse_dates")
    if isinstance(dates, (list, tuple)):
        for name in dates:
            if isinstance(name, str):
                read.columns.setdefault(name, _Column()).kind = "date"
    dtypes = options.get("dtype")
    if isinstance(dtypes, dict):
        for name, dtype in dtypes.items():
            text = str(dtype)
            kind = "int" if "int" in text.lower() else "number" if "float" in text.lower() \
                else "text"
            read.columns.setdefault(str(name), _Column()).kind = kind
    index_col = options.get("index_col")
    if isinstance(index_col, str):
        read.columns.setdefault(index_col, _Column(kind="key"))


def _bound_name(call: ast.Call, parents: dict[ast.AST, ast.AST]) -> str | None:
    """The name the read's frame is bound to (`df = pd.read_csv(...)`, through a chain of
    method calls on it)."""
    node: ast.AST = call
    while node in parents and isinstance(parents[node], (ast.Attribute, ast.Call, ast.Subscript)):
        node = parents[node]
    parent = parents.get(node)
    if isinstance(parent, ast.Assign) and len(parent.targets) == 1 \
            and isinstance(parent.targets[0], ast.Name):
        return parent.targets[0].id
    if isinstance(parent, ast.Return):  # a loader function: the name its callers bind
        function = parent
        while function in parents and not isinstance(function, ast.FunctionDef):
            function = parents[function]
        if isinstance(function, ast.FunctionDef):
            return f"{function.name}()"
    return None


def _follow(tree: ast.Module, sources: dict[str, set[str]]) -> None:
    """Spread the files a frame comes from to every name bound from it, and to the calls of
    a function that returns one (to a fixed point)."""
    changed = True
    while changed:
        changed = False
        for function in ast.walk(tree):
            if not isinstance(function, ast.FunctionDef):
                continue
            for ret in ast.walk(function):
                if isinstance(ret, ast.Return) and ret.value is not None:
                    found = {path for inner in ast.walk(ret.value) if isinstance(inner, ast.Name)
                             for path in sources.get(inner.id, set())}
                    key = f"{function.name}()"
                    if found - sources.get(key, set()):
                        sources.setdefault(key, set()).update(found)
                        changed = True
        functions = {f.name: f for f in ast.walk(tree) if isinstance(f, ast.FunctionDef)}
        for node in ast.walk(tree):
            # a row function (df.apply(f, axis=1)) and a loop over rows read the frame's columns
            rows_of, bound = None, []
            if isinstance(node, ast.Call) and isinstance(node.func, ast.Attribute) \
                    and node.func.attr == "apply" and node.args \
                    and any(k.arg == "axis" and _const(k.value) in (1, "columns")
                            for k in node.keywords):
                rows_of = _root(node.func.value)
                given = node.args[0]
                if isinstance(given, ast.Lambda):
                    bound = [a.arg for a in given.args.args[:1]]
                elif isinstance(given, ast.Name) and given.id in functions:
                    bound = [a.arg for a in functions[given.id].args.args[:1]]
            if isinstance(node, ast.For) and isinstance(node.iter, ast.Call) \
                    and isinstance(node.iter.func, ast.Attribute) \
                    and node.iter.func.attr in ("iterrows", "itertuples"):
                rows_of = _root(node.iter.func.value)
                target = node.target.elts[-1] if isinstance(node.target, ast.Tuple) \
                    and node.iter.func.attr == "iterrows" else node.target
                bound = [target.id] if isinstance(target, ast.Name) else []
            for name in bound:
                found_rows = sources.get(rows_of or "", set())
                if found_rows - sources.get(name, set()):
                    sources.setdefault(name, set()).update(found_rows)
                    changed = True
            if not isinstance(node, ast.Assign):
                continue
            found: set[str] = set()
            for inner in ast.walk(node.value):
                if isinstance(inner, ast.Name) and inner.id in sources:
                    found |= sources[inner.id]
                if isinstance(inner, ast.Call) and isinstance(inner.func, ast.Name) \
                        and f"{inner.func.id}()" in sources:
                    found |= sources[f"{inner.func.id}()"]
            for target in node.targets:
                for name in ast.walk(target):
                    if isinstance(name, ast.Name) and found - sources.get(name.id, set()):
                        sources.setdefault(name.id, set()).update(found)
                        changed = True


def _root(node: ast.AST) -> str | None:
    while isinstance(node, (ast.Attribute, ast.Subscript, ast.Call)):
        node = node.func if isinstance(node, ast.Call) else node.value
    return node.id if isinstance(node, ast.Name) else None


def _strings(node: ast.AST | None) -> list[str]:
    if isinstance(node, ast.Constant) and isinstance(node.value, str):
        return [node.value]
    if isinstance(node, (ast.List, ast.Tuple)):
        return [e.value for e in node.elts if isinstance(e, ast.Constant)
                and isinstance(e.value, str)]
    return []


def _columns(tree: ast.Module, parents: dict[ast.AST, ast.AST], reads: dict[str, _Read],
             sources: dict[str, set[str]], placement: dict[str, int]) -> None:
    """The columns each file must have, and their kinds, from how the script uses them."""
    # columns the script makes (df["new"] = ..., assign(new=...), a rename), by the first line
    # that makes them: a read on a later line is of the column made, not of an input
    created: dict[str, int] = {}
    made_in: dict[str, set[str]] = {}  # the files of the frames the column is made on
    # a name a rename gives -> the input column it was, and the files of the renamed frame
    renamed: dict[str, tuple[str, frozenset[str]]] = {}

    def made(name: str, line: int, root: str | None, value: ast.AST | None = None) -> None:
        if value is not None and any(isinstance(n, ast.Subscript) and name in _strings(n.slice)
                                     for n in ast.walk(value)):
            return  # df["x"] = df["x"].str.strip(): the input column x, rewritten
        created[name] = min(line, created.get(name, line))
        made_in.setdefault(name, set()).update(sources.get(root or "", set()))

    for node in ast.walk(tree):
        if isinstance(node, ast.Assign):  # the right side's reads come first
            for target in node.targets:
                if isinstance(target, ast.Subscript):
                    for name in _strings(target.slice):
                        made(name, node.end_lineno or node.lineno, _root(target.value),
                             node.value)
        if isinstance(node, ast.Call) and isinstance(node.func, ast.Attribute) \
                and node.func.attr == "assign":
            for keyword in node.keywords:
                if keyword.arg:
                    made(keyword.arg, keyword.value.end_lineno or keyword.value.lineno,
                         _root(node.func.value), keyword.value)
        if isinstance(node, ast.Call) and isinstance(node.func, ast.Attribute) \
                and node.func.attr == "rename":
            given = node.args[0] if node.args else next(
                (k.value for k in node.keywords if k.arg == "columns"), None)
            if isinstance(given, ast.Dict):  # rename(columns={"old": "new"})
                frames = sources.get(_root(node.func.value) or "", set())
                for key, value in zip(given.keys, given.values):
                    for name in _strings(value)[:1]:
                        made(name, value.lineno, _root(node.func.value))
                        for old in _strings(key)[:1]:
                            renamed.setdefault(name, (old, frozenset(frames)))

    def files(root: str | None) -> list[_Read]:
        return [reads[p] for p in sorted(sources.get(root or "", set())) if p in reads]

    # (root, column, node of the use, a key?, line, kind the use says), applied after the walk
    uses: list[tuple[str | None, str, ast.AST | None, bool, int | None, str | None]] = []

    def use(root: str | None, name: str, node: ast.AST | None, key: bool = False,
            at: int | None = None, kind: str | None = None) -> None:
        uses.append((root, name, node, key, at, kind))

    def apply(root: str | None, name: str, node: ast.AST | None, key: bool, at: int | None,
              said: str | None) -> None:
        candidates = [r for r in files(root) if r.fixed is None or name in r.fixed]
        if len(candidates) > 1:  # a frame made from several files (a merge): those that
            having = [r for r in candidates if name in r.columns]  # have it, or the one
            at = placement.get(name, 0) % len(candidates)  # placed there (the first at first)
            candidates = having if having and name not in placement else [candidates[at]]
        line = getattr(node, "lineno", None) if node is not None else at
        for read in candidates:
            column_name = name
            if name in renamed and read.path in renamed[name][1] and line is not None \
                    and line > created[name]:
                column_name = renamed[name][0]  # the use of a renamed column tells of the input
            elif name in created and name not in read.columns \
                    and read.path in made_in[name] and (line is None or line > created[name]):
                continue
            name_here = column_name
            column = read.columns.setdefault(name_here, _Column())
            kind, literals, fmt = _kind_from_use(node, parents) if node is not None else \
                (said, set(), None)
            if kind is not None and (column.kind in (None, "key", "needed") or kind == "date"):
                column.kind = kind
                if fmt:
                    column.date_format = fmt
            elif key and column.kind is None:
                column.kind = "key"
            column.literals |= literals

    for node in ast.walk(tree):
        if isinstance(node, ast.Subscript) and isinstance(node.ctx, ast.Load):
            names = _strings(node.slice)
            root = _root(node.value)  # df["kg"], and df.groupby(...)["kg"]: a column of df
            for name in names:
                use(root, name, node if len(names) == 1 else None, at=node.lineno)
        elif isinstance(node, ast.Attribute) and isinstance(node.value, ast.Name) \
                and isinstance(node.ctx, ast.Load) and node.attr not in FRAME \
                and node.value.id in sources and not (
                    isinstance(parents.get(node), ast.Call) and parents[node].func is node):
            use(node.value.id, node.attr, node, at=node.lineno)  # df.kg: the column kg
        if isinstance(node, ast.Call) and isinstance(node.func, ast.Attribute):
            root = _root(node.func.value)
            method = node.func.attr
            if method in _KEY_METHODS:
                given = node.args[0] if node.args and method not in ("nlargest", "nsmallest") \
                    else node.args[1] if len(node.args) > 1 else None
                for keyword in node.keywords:
                    if keyword.arg in ("by", "subset", "keys", "index", "columns", "values"):
                        for name in _strings(keyword.value):
                            use(root, name, None, key=True, at=node.lineno)
                for name in _strings(given):
                    use(root, name, None, key=True, at=node.lineno)
            if method in ("drop", "dropna", "fillna", "astype", "rename"):
                for keyword in node.keywords:  # drop(columns=[...]), dropna(subset=[...])
                    if keyword.arg in ("columns", "subset") and method in ("drop", "dropna"):
                        for name in _strings(keyword.value):
                            use(root, name, None, key=True, at=node.lineno)
                given = node.args[0] if node.args else next(
                    (k.value for k in node.keywords if k.arg == "columns"), None)
                if isinstance(given, ast.Dict):  # fillna({"kg": 0}), rename(columns={...})
                    for key, value in zip(given.keys, given.values):
                        fill = _const(value) if method == "fillna" else None
                        kind = "number" if isinstance(fill, (int, float)) and \
                            not isinstance(fill, bool) else "text" if isinstance(fill, str) else None
                        for name in _strings(key):
                            use(root, name, None, key=True, at=node.lineno, kind=kind)
            if method in ("merge", "join"):
                other = node.args[0] if node.args else None
                keys: list[str] = []
                for keyword in node.keywords:
                    if keyword.arg in ("on", "left_on", "right_on"):
                        keys += _strings(keyword.value)
                for name in keys:  # each side's files have the key, from one shared pool
                    for side in (root, _root(other) if other is not None else None):
                        use(side, name, None, key=True, at=node.lineno, kind="merge")
            if method in ("agg", "aggregate"):
                pairs = [(k.value.elts[0], k.value.elts[1]) for k in node.keywords
                         if isinstance(k.value, ast.Tuple) and len(k.value.elts) == 2]
                if node.args and isinstance(node.args[0], ast.Dict):
                    pairs += [(k, v) for k, v in zip(node.args[0].keys, node.args[0].values)
                              if k is not None]
                for column_node, how in pairs:  # total=("kg", "sum"), {"kg": "sum"}
                    numeric = bool(set(_strings(how)) & _NUMBER_AGGS)
                    for name in _strings(column_node):
                        use(root, name, None, key=True, at=node.lineno,
                            kind="number" if numeric else None)
    for args in sorted(uses, key=lambda u: len(files(u[0]))):  # one file's frames first
        apply(*args)


def _kind_from_use(node: ast.AST, parents: dict[ast.AST, ast.AST]
                   ) -> tuple[str | None, set[object], str | None]:
    """What the use of one column (`node`, the subscript) says of its type."""
    parent = parents.get(node)
    if isinstance(parent, ast.Attribute):
        if parent.attr == "str":
            return "text", set(), None
        if parent.attr == "dt":
            return "date", set(), None
        call = parents.get(parent)
        if isinstance(call, ast.Call) and call.func is parent:
            args = [a for a in call.args]
            if parent.attr in _NUMBER_METHODS:
                return "number", set(), None
            if parent.attr in ("isin",) and args:
                values = _values(args[0])
                return _kind_of_values(values), values, None
            if parent.attr in ("map", "replace") and args and isinstance(args[0], ast.Dict):
                values = {_const(k) for k in args[0].keys if k is not None} - {None}
                return _kind_of_values(values), values, None
            if parent.attr == "fillna" and args:
                value = _const(args[0])
                if isinstance(value, str):
                    return "text", set(), None
                if isinstance(value, (int, float)) and not isinstance(value, bool):
                    return "number", set(), None
            if parent.attr in ("apply", "map", "transform") and args \
                    and not isinstance(args[0], ast.Dict) and not _strings(args[0]):
                return "needed", set(), None  # what the function expects, porter cannot tell
            if parent.attr == "astype" and args:
                text = ast.unparse(args[0]).lower()
                if "float" in text or "int" in text:
                    return "number", set(), None
    if isinstance(parent, ast.Compare):
        others = [parent.left, *parent.comparators]
        values = {_const(o) for o in others if o is not node} - {None}
        kind = _kind_of_values(values)
        if kind is not None:
            return kind, values, None
    if isinstance(parent, ast.BinOp):
        other = parent.right if parent.left is node else parent.left
        value = _const(other)
        if isinstance(value, str):
            return "text", set(), None
        if isinstance(parent.op, (ast.Sub, ast.Mult, ast.Div, ast.FloorDiv, ast.Mod, ast.Pow)) \
                or _numeric(other):
            return "number", set(), None
    if isinstance(parent, ast.Call) and node in parent.args:
        func = parent.func
        called = func.attr if isinstance(func, ast.Attribute) else \
            func.id if isinstance(func, ast.Name) else ""
        if called == "to_datetime":
            fmt = next((_const(k.value) for k in parent.keywords if k.arg == "format"), None)
            return "date", set(), fmt if isinstance(fmt, str) and "%" in fmt else None
        if called in ("to_numeric", "round", "abs", "float", "int"):
            return "number", set(), None
        if called in ("where", "select", "log", "sqrt", "exp", "log1p"):
            return "number", set(), None
        if called in ("cut", "qcut") and node is parent.args[0]:
            return "number", set(), None  # pd.cut(df["x"], bins): pandas cuts numbers only
    return None, set(), None


def _numeric(node: ast.AST) -> bool:
    """An expression that is a number whatever the columns in it: a numeric literal, or
    arithmetic other than + (which also joins text), or + of such."""
    value = _const(node)
    if isinstance(value, (int, float)) and not isinstance(value, bool):
        return True
    if isinstance(node, ast.BinOp):
        if not isinstance(node.op, ast.Add):
            return True
        return _numeric(node.left) or _numeric(node.right)
    return False


def _const(node: ast.AST) -> object:
    return _literal(node, {})


def _values(node: ast.AST) -> set[object]:
    value = _const(node)
    if isinstance(value, (list, tuple, set)):
        return {v for v in value if isinstance(v, (str, int, float)) and not isinstance(v, bool)}
    return set()


def _kind_of_values(values: set[object]) -> str | None:
    if values and all(isinstance(v, str) for v in values):
        return "text"
    if values and all(isinstance(v, (int, float)) and not isinstance(v, bool) for v in values):
        return "number"
    return None


# --- making the values ---------------------------------------------------------------------------

_WORDS = ["alder", "Birch", "cedar", "Dune", "éclair", "fjord", "Gorse", "heath", "Île",
          "juniper", "kelp", "Lark"]


def _table(read: _Read, rnd: random.Random, rows: int, merge_pool: list[str]) -> list[list[str]]:
    columns = list(read.columns.items())
    pools = {name: _pool(column, rnd, merge_pool) for name, column in columns}
    table = []
    for _ in range(rows):
        row = []
        for name, column in columns:
            if rnd.random() < 0.12:
                row.append("")  # a missing value
            else:
                row.append(rnd.choice(pools[name]))
        table.append(row)
    if rows > 2:  # a row twice: duplicates and ties
        table[-1] = list(table[0])
    return table


def _pool(column: _Column, rnd: random.Random, merge_pool: list[str]) -> list[str]:
    if column.seen:  # values of the user's own file, the script's literals, awkward ones
        seen = list(column.seen)
        literals = [str(v) for v in column.literals if not isinstance(v, bool)]
        awkward: list[str] = []
        if column.kind == "int":
            awkward = ["0", "-1"]
        elif column.kind == "number":
            awkward = ["0.0", "-0.0", "2.5", "0.125"]
        elif column.kind in ("text", "key", "merge"):
            awkward = [seen[0].upper(), seen[0].lower(), seen[0] + "é"]
        elif column.kind == "date":  # the ends of months and years, in the file's layout
            awkward = [dt.datetime(*day).strftime(column.date_format)
                       for day in ((2023, 12, 31), (2024, 1, 1), (2024, 2, 29))]
        return seen + literals + awkward
    if column.kind == "merge":
        return rnd.sample(merge_pool, 6)  # partly the other file's keys, partly not
    if column.kind == "key":
        return [str(v) for v in column.literals] + rnd.sample(_WORDS, 4)
    if column.kind == "text":
        words = [str(v) for v in column.literals if isinstance(v, str)]
        return words + [w.upper() if i % 3 == 0 else w for i, w in enumerate(rnd.sample(_WORDS, 5))]
    if column.kind in ("number", "int"):
        numbers = {0, 1, 2, 7, 10, -3}
        for value in column.literals:
            if isinstance(value, (int, float)) and not isinstance(value, bool):
                numbers |= {value, value + 1, value - 1}
        if column.kind == "int":
            return [str(int(n)) for n in numbers]
        return [str(n) for n in numbers] + ["2.5", "0.125", "-0.5", "12.345", "1e3"]
    if column.kind == "date":
        days = [dt.datetime(2023, 12, 31), dt.datetime(2024, 1, 1), dt.datetime(2024, 2, 29),
                dt.datetime(2024, 3, 31, 18, 30), dt.datetime(2024, 6, 15),
                dt.datetime(2024, 11, 30, 23, 59)]
        fmt = column.date_format
        if "%H" not in fmt:
            days = [d.replace(hour=0, minute=0) for d in days]
        return [d.strftime(fmt) for d in days]
    return ["x"]
