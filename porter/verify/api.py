"""`verify`: run the original and the converted script on the same data, compare every output.

Each side runs in its own temporary copy of the data folder, so inputs are found at the same
relative paths and neither side sees the other's outputs; the user's folder is never written.
"""

from __future__ import annotations

import ast
from dataclasses import dataclass, replace
from pathlib import Path
import shutil
import sys
import tempfile

from porter.model import ConversionError
from porter.verify.compare import compare
from porter.verify.model import SEVERITY, Comparison, OutputResult, VerifyResult
from porter.verify.runner import SideOutputs, run_side
from porter.verify.tables import TableReadError, read_table


@dataclass(frozen=True)
class VerifyOptions:
    timeout: float = 600.0
    memory_mib: int | None = None
    rtol: float = 1e-9
    ignore_order: bool = False
    keep: bool = False
    # runs of each side after the verifying one, with no capture, for the median time and
    # peak memory and their spread; the command line's --timing-runs defaults to 1
    timing_runs: int = 0
    # another Python to run the original under (one with the older pandas it was written for)
    reference_python: str | None = None


def verify(original: str | Path, converted_text: str | None, data_dir: str | Path,
           options: VerifyOptions | None = None) -> VerifyResult:
    """Run both versions of a script on `data_dir` and compare what they leave behind.

    `converted_text` is the converted script; None converts `original` in memory first.
    """
    options = options or VerifyOptions()
    original, data = Path(original), Path(data_dir)
    if not original.is_file():
        raise ConversionError("no such script", str(original))
    if not data.is_dir():
        raise ConversionError("no such folder (--data is the folder the script runs in)", str(data))
    original_text = original.read_text(encoding="utf-8")
    pythons = {"original": options.reference_python, "converted": None}
    environments = {"original": reference_environment(options.reference_python),
                    "converted": _this_environment()} if options.reference_python else {}
    if converted_text is None:
        from porter.api import convert_source
        from porter.model import Options
        converted_text = convert_source(original_text, path=str(original),
                                        options=Options(data_dir=str(data))).converted_text
    script_rel = _script_place(original, data)
    root = Path(tempfile.mkdtemp(prefix="porter-verify-"))
    try:
        sides = {}
        texts = {"original": original_text, "converted": converted_text}
        for side, text in texts.items():
            (root / side).mkdir()
            sides[side] = run_side(text, script_rel, data, root / side,
                                   timeout=options.timeout, memory_mib=options.memory_mib,
                                   python=pythons[side])
        result = _judge(sides["original"], sides["converted"], options,
                        row_names=_row_loop_names(original_text),
                        drawn=random_draws(original_text))
        if options.timing_runs > 0 and result.verdict != "error":
            result = _timed(result, texts, script_rel, data, root, options)
        if environments:
            result = replace(result,
                             original=replace(result.original, environment=environments["original"]),
                             converted=replace(result.converted, environment=environments["converted"]))
        if not options.keep:  # the working copies are removed below: name none
            result = replace(result, original=replace(result.original, workdir=None),
                             converted=replace(result.converted, workdir=None))
    finally:
        if not options.keep:
            shutil.rmtree(root, ignore_errors=True)
    return result


def _timed(result: VerifyResult, texts: dict[str, str], script_rel: str, data: Path,
           root: Path, options: VerifyOptions) -> VerifyResult:
    """Run each side `options.timing_runs` more times without capture, each time in a fresh
    copy of the data folder (removed after), the sides taking turns so that a change in the
    machine's load falls on both; the figures become the medians over all runs."""
    walls: dict[str, list[float]] = {side: [] for side in texts}
    peaks: dict[str, list[float | None]] = {side: [] for side in texts}
    stopped: dict[str, str] = {}
    for number in range(1, options.timing_runs + 1):
        for side, text in texts.items():
            if side in stopped:
                continue
            place = root / side / f"timing-{number}"
            place.mkdir()
            try:
                run = run_side(text, script_rel, data, place, timeout=options.timeout,
                               memory_mib=options.memory_mib, capture=False,
                               python=options.reference_python if side == "original" else None).run
            finally:
                shutil.rmtree(place, ignore_errors=True)
            if run.failure or run.measured != "script":
                stopped[side] = f"timing run {number} of the {side} script " \
                                f"{run.failure or 'did not report its figures'}"
                continue
            walls[side].append(run.wall_s)
            peaks[side].append(run.peak_mib)
    runs = {"original": result.original, "converted": result.converted}
    timed = {side: runs[side].with_runs(walls[side], peaks[side]) for side in texts}
    notes = [f"{reason}: its time and memory rest on {timed[side].runs} run(s)"
             for side, reason in stopped.items()]
    return replace(result, original=timed["original"], converted=timed["converted"],
                   notes=result.notes + tuple(notes))


def reference_environment(python: str) -> str:
    """The Python at `python` and the pandas it has ("Python 3.11.7, pandas 2.2.3 (path)");
    a ConversionError when it cannot be run or has no pandas."""
    import subprocess
    probe = "import sys, pandas; print(sys.version.split()[0], pandas.__version__)"
    try:
        done = subprocess.run([python, "-c", probe], capture_output=True, text=True, timeout=120)
    except (OSError, subprocess.TimeoutExpired) as exc:
        raise ConversionError(f"cannot run this Python ({type(exc).__name__}: {exc})", python) from None
    if done.returncode != 0:
        last = (done.stderr.strip().splitlines() or ["no output"])[-1]
        raise ConversionError(f"this Python cannot import pandas ({last}); install pandas there "
                              "to verify against it", python)
    version, pandas_version = done.stdout.split()[-2:]
    return f"Python {version}, pandas {pandas_version} ({python})"


def _this_environment() -> str:
    """The Python porter runs under and its pandas and Polars, as reference_environment says it."""
    from importlib.metadata import PackageNotFoundError, version
    import platform

    def of(name: str) -> str:
        try:
            return version(name)
        except PackageNotFoundError:
            return "not installed"
    return f"Python {platform.python_version()}, pandas {of('pandas')}, Polars {of('polars')} ({sys.executable})"


def _script_place(original: Path, data: Path) -> str:
    """Where the script sits in the working copy: its own place when it lives in the folder."""
    try:
        return str(original.resolve().relative_to(data.resolve()))
    except ValueError:
        return original.name


# loops over a frame's rows, and over its columns (items, iteritems in older pandas), which
# the converted script computes as columns or as a loop over the column names, and over a
# groupby's groups, which it computes as one group_by (a row appended per group)
ROW_LOOPS = {"iterrows", "itertuples", "items", "iteritems", "groupby"}


def _row_loop_names(text: str) -> frozenset[str]:
    """The names a `for` over a frame's rows, columns or groups binds in the script (`for _,
    row in df.iterrows()`, `for name, values in df.items()`, `for key, rows in
    df.groupby(k)`): the row, column or group left behind by the last turn is not a result."""
    try:
        tree = ast.parse(text)
    except SyntaxError:
        return frozenset()
    names: set[str] = set()
    for node in ast.walk(tree):
        if isinstance(node, ast.For) and isinstance(node.iter, ast.Call) \
                and isinstance(node.iter.func, ast.Attribute) and node.iter.func.attr in ROW_LOOPS:
            names |= {n.id for n in ast.walk(node.target) if isinstance(n, ast.Name)}
    return frozenset(names)


@dataclass(frozen=True)
class RandomDraws:
    """The outputs of a script that draws rows at random (`df.sample(...)`): pandas' draws
    cannot be repeated by Polars (another generator, whatever the seed), so these outputs are
    compared by their columns, and by their number of rows where they are the draw itself.
    `names` maps each variable computed from a draw to whether it is the draw itself;
    `files` are the paths written from one."""

    names: dict[str, bool]
    files: frozenset[str]

    def __bool__(self) -> bool:
        return bool(self.names or self.files)

    def file(self, rel: str) -> bool:
        rel = rel.replace("\\", "/")
        return any(rel == f or rel.endswith("/" + f) for f in self.files)


# the calls that write a frame to a file, whose first argument is the path
_WRITERS = {"to_csv", "to_parquet", "to_json", "to_excel", "to_feather", "to_pickle"}


def random_draws(text: str) -> RandomDraws:
    """The names and files of `text` computed from rows drawn at random: bound to an
    expression that calls `.sample(...)` or reads such a name (followed through the script
    until nothing is added; a name changed in place, `s["c"] = ...`, counts as bound), and the
    files written (`x.to_csv("path")`) from such an expression."""
    try:
        tree = ast.parse(text)
    except SyntaxError:
        return RandomDraws({}, frozenset())

    def of_random_module(receiver: ast.expr) -> bool:
        # random.sample(...), np.random.sample(...): Python's or numpy's, which both sides run
        # alike with the same seed, not a frame's draw
        return isinstance(receiver, ast.Name) and receiver.id == "random" \
            or isinstance(receiver, ast.Attribute) and receiver.attr == "random"

    def draws(node: ast.AST) -> bool:
        return any(isinstance(n, ast.Call) and isinstance(n.func, ast.Attribute)
                   and n.func.attr == "sample" and not of_random_module(n.func.value)
                   for n in ast.walk(node))

    def reads(node: ast.AST, names: dict[str, bool]) -> bool:
        return any(isinstance(n, ast.Name) and n.id in names for n in ast.walk(node))

    def bound(target: ast.AST) -> list[str]:
        while isinstance(target, (ast.Subscript, ast.Attribute)):
            target = target.value  # df["c"] = ..., df.c = ...: df is changed
        if isinstance(target, ast.Name):
            return [target.id]
        if isinstance(target, (ast.Tuple, ast.List)):
            return [n for t in target.elts for n in bound(t)]
        return []

    names: dict[str, bool] = {}
    files: set[str] = set()
    grown = True
    while grown:
        grown = False
        for node in ast.walk(tree):
            targets: list[ast.AST] = []
            value: ast.AST | None = None
            if isinstance(node, ast.Assign):
                targets, value = list(node.targets), node.value
            elif isinstance(node, (ast.AugAssign, ast.AnnAssign)) and node.value is not None:
                targets, value = [node.target], node.value
            if value is not None and (draws(value) or reads(value, names)):
                direct = isinstance(value, ast.Call) and isinstance(value.func, ast.Attribute) \
                    and value.func.attr == "sample" and not of_random_module(value.func.value)
                for name in (n for t in targets for n in bound(t)):
                    if name not in names or (names[name] and not direct):
                        names[name] = direct and names.get(name, True)
                        grown = True
            if isinstance(node, ast.Call) and isinstance(node.func, ast.Attribute) \
                    and node.func.attr in _WRITERS and node.args \
                    and isinstance(node.args[0], ast.Constant) \
                    and isinstance(node.args[0].value, str) \
                    and (draws(node.func.value) or reads(node.func.value, names)):
                path = node.args[0].value.replace("\\", "/").removeprefix("./")
                if path not in files:
                    files.add(path)
                    grown = True
    return RandomDraws(names, frozenset(files))


def _drawn_comparison(a: object, b: object, direct: bool) -> Comparison:
    """An output computed from rows drawn at random: the same columns (and, for the draw
    itself, as many rows) is all the two sides can share."""
    missing = _missing(a, b)
    if missing is not None:
        return missing
    return _safely(lambda: _drawn_shapes(a, b, direct))


def _drawn_shapes(a: object, b: object, direct: bool) -> Comparison:
    from porter.verify.compare import _row_numbers_as_labels, normalize
    if isinstance(a, Path) and isinstance(b, Path):
        a, b = read_table(a), read_table(b)
        if a is None or b is None:
            return Comparison("same", "rows drawn at random (sample): not a table, not compared")
    elif not hasattr(a, "columns") and not hasattr(a, "name"):
        return Comparison("same", "rows drawn at random (sample): not a table, not compared")
    left, right = normalize(a), normalize(b)
    if [c for c in right.columns if c not in left.columns] == ["index"] \
            and _row_numbers_as_labels(a):
        # the converted frame carries pandas' row labels as a column "index"
        left = normalize(a.reset_index())  # type: ignore[union-attr]
    if sorted(left.columns) != sorted(right.columns):
        return Comparison("different", "rows drawn at random (sample), and the columns differ: "
                                       f"{left.columns} vs {right.columns}")
    if direct and left.height != right.height:
        return Comparison("different", f"rows drawn at random (sample): {left.height} rows vs "
                                       f"{right.height}")
    what = "columns and number of rows" if direct else "columns"
    return Comparison("same", "rows drawn at random (sample), which Polars cannot draw as "
                              f"pandas does: compared by their {what} only")


def _judge(before: SideOutputs, after: SideOutputs, options: VerifyOptions,
           row_names: frozenset[str] = frozenset(),
           drawn: RandomDraws | None = None) -> VerifyResult:
    notes: list[str] = []
    outputs: list[OutputResult] = []
    if before.run.failure or after.run.failure:
        for side, out in (("original", before), ("converted", after)):
            if out.run.failure:
                outputs.append(OutputResult(f"{side} script", "variable", Comparison(
                    "error", f"the {side} script {out.run.failure}")))
        return VerifyResult("error", tuple(outputs), before.run, after.run)
    drawn = drawn or RandomDraws({}, frozenset())
    if drawn:
        notes.append("the script draws rows at random (sample): pandas' draws cannot be "
                     "repeated in Polars, so the outputs computed from them are compared by "
                     "their columns (and the draw itself by its number of rows) only")
    for name in sorted(set(before.files) | set(after.files)):
        if drawn.file(name):
            outputs.append(OutputResult(name, "file", _drawn_comparison(
                before.files.get(name), after.files.get(name), direct=False)))
            continue
        outputs.append(OutputResult(name, "file", _compare_files(
            before.files.get(name), after.files.get(name), options)))
    for side, out in (("original", before), ("converted", after)):
        if out.variable_error:
            outputs.append(OutputResult(f"({side} frames)", "variable", Comparison(
                "error", f"the frames left by the {side} script could not be read: "
                         f"{out.variable_error}")))
    for name in sorted(set(before.variables) | set(after.variables)):
        if name not in after.variables and name in after.expressions:
            notes.append(f"{name}: a Polars expression in the converted script (not data); "
                         "not compared")
            continue
        if name not in after.variables and name in row_names:
            notes.append(f"{name}: the last row (column, group) of a loop over rows (columns, "
                         "groups), which the converted script computes as columns; not "
                         "compared")
            continue
        if name not in before.variables:
            notes.append(f"{name}: only the converted script has it (a name porter wrote); "
                         "not compared")
            continue
        if name in drawn.names:
            outputs.append(OutputResult(name, "variable", _drawn_comparison(
                before.variables.get(name), after.variables.get(name), drawn.names[name])))
            continue
        outputs.append(OutputResult(name, "variable", _compare_values(
            before.variables.get(name), after.variables.get(name), options)))
    verdict = max((o.comparison.status for o in outputs), key=SEVERITY.__getitem__, default="same")
    if not outputs:
        notes.append("neither script left a file or a frame to compare")
    return VerifyResult(verdict, tuple(outputs), before.run, after.run, tuple(notes))


def _missing(a: object, b: object) -> Comparison | None:
    if a is None:
        return Comparison("missing", "only the converted script produced it")
    if b is None:
        return Comparison("missing", "the converted script did not produce it")
    return None


def _compare_files(a: Path | None, b: Path | None, options: VerifyOptions) -> Comparison:
    missing = _missing(a, b)
    if missing is not None:
        return missing
    assert a is not None and b is not None
    identical = a.read_bytes() == b.read_bytes()
    try:
        expected, actual = read_table(a), read_table(b)
    except TableReadError as exc:
        if identical:  # a file porter cannot read as a table, written the same by both
            return Comparison("same", f"identical bytes (not read as a table: {exc})")
        return Comparison("error", f"could not be read back as a table: {exc}")
    if expected is None or actual is None:
        if identical:
            return Comparison("same", "identical bytes")
        return Comparison("different", _first_text_difference(a, b))
    result = _safely(lambda: compare(expected, actual, rtol=options.rtol,
                                     ignore_order=options.ignore_order))
    if result.status == "same" and not identical and not result.detail:
        # the tables hold the same values, but the text is not pandas' (2024 for 2024.0)
        result = replace(result, detail="same values, other text: "
                                        + _first_text_difference(a, b))
    return result


def _compare_values(a: object, b: object, options: VerifyOptions) -> Comparison:
    missing = _missing(a, b)
    if missing is not None:
        return missing
    a, b = _unnamed_series(a, b)
    return _safely(lambda: compare(a, b, rtol=options.rtol, ignore_order=options.ignore_order))


def _unnamed_series(a: object, b: object) -> tuple[object, object]:
    """Two Series left in variables of the same name compare by their values: the variable
    names them. (A row taken from a frame, `for _, row in df.iterrows()`, is named by its row
    label, which a hand-over to pandas renumbers.)"""
    kinds = {type(a).__name__, type(b).__name__}
    if kinds <= {"Series"}:
        return _renamed(a, "values"), _renamed(b, "values")
    return a, b


def _renamed(series: object, name: str) -> object:
    rename = getattr(series, "rename")
    return rename(name)


def _safely(run) -> Comparison:  # type: ignore[no-untyped-def]
    try:
        return run()
    except Exception as exc:  # an output porter cannot compare is reported by name
        return Comparison("error", f"could not be compared: {type(exc).__name__}: {exc}")


def _first_text_difference(a: Path, b: Path) -> str:
    try:
        left = a.read_text(encoding="utf-8").splitlines()
        right = b.read_text(encoding="utf-8").splitlines()
    except UnicodeDecodeError:
        return "the bytes differ"
    for number, (x, y) in enumerate(zip(left, right), start=1):
        if x != y:
            # show where they part: from a little before the first differing character
            at = next((i for i, (c, d) in enumerate(zip(x, y)) if c != d), min(len(x), len(y)))
            start = max(0, at - 20)
            lead = "…" if start else ""
            return f"line {number} differs at character {at + 1}: " \
                   f"{lead}{x[start:start + 60]!r} vs {lead}{y[start:start + 60]!r}"
    return f"{len(left)} lines vs {len(right)} lines"
