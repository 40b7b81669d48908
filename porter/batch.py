"""Converting or scanning many files: discovery, parallel work, safe writes, the folder report.

One bad file never stops a batch: a syntax error, a file that is not UTF-8, a file over the size
limit, or a crash inside porter becomes a `FileResult` with status "failed" and the reason in
`error`, and the rest goes on.
"""

from __future__ import annotations

from concurrent.futures import ProcessPoolExecutor, as_completed
from dataclasses import dataclass, field, replace
import fnmatch
import importlib.util
import math
import os
from pathlib import Path
import re
import shutil
import stat
import subprocess
import sys
import tempfile
import traceback
from typing import Iterable

from porter.api import convert_source
from porter.model import ConversionError, FileResult, InternalError, Options
from porter.reports import TODO_MARKER, Mode


DEFAULT_MAX_SIZE = 2 * 1024 * 1024
# Folders never searched: virtual environments, caches, build outputs (hidden ones too).
SKIPPED_FOLDERS = frozenset({"__pycache__", "build", "dist", "node_modules", "venv", ".venv", "env"})
# Every script porter converts imports pandas (or modin.pandas, or dask.dataframe, whose frames
# take pandas' API): without such a line it cannot
# hold pandas code, and the file is copied without being parsed. Loose on purpose (a notebook's
# JSON keeps each source line inside a string), it only has to miss nothing.
PANDAS_IMPORT = re.compile(r"\b(?:import|from)\b[^\n]*\b(?:pandas|modin|dask)\b")
# A TODO left by an earlier conversion (the converted script may no longer import pandas).


@dataclass(frozen=True)
class Item:
    """One file to process: its name in reports, where it is read and where it is written."""

    source: str
    path: str
    output: str | None


@dataclass
class Discovery:
    items: list[Item]
    notes: list[str] = field(default_factory=list)


@dataclass(frozen=True)
class BatchOptions:
    options: Options = Options()
    mode: Mode = "convert"
    jobs: int = 1
    max_size: int = DEFAULT_MAX_SIZE
    excludes: tuple[str, ...] = ()
    shard: tuple[int, int] | None = None  # (K, N), K 1-based
    in_place: bool = False
    output_dir: str | None = None
    progress: bool = False
    keep_text: bool = False  # scan mode: keep the texts of changed files (the HTML review)


@dataclass
class BatchResult:
    results: list[FileResult]
    notes: list[str] = field(default_factory=list)


# ------------------------------------------------------------------ discovery

def notebooks_supported() -> bool:
    try:
        return importlib.util.find_spec("porter.notebooks") is not None
    except (ImportError, ValueError):
        return False


def excluded(relative: str, patterns: Iterable[str]) -> bool:
    """A glob matches the path relative to the folder searched (`*` crosses `/`) or a name in it."""
    relative = relative.replace(os.sep, "/").strip("/")
    parts = relative.split("/")
    for pattern in patterns:
        pattern = pattern.replace(os.sep, "/").strip("/")
        if pattern.startswith("./"):
            pattern = pattern[2:]
        if fnmatch.fnmatchcase(relative, pattern) or any(fnmatch.fnmatchcase(p, pattern) for p in parts):
            return True
    return False


def git_ignored(folder: Path) -> set[str] | None:
    """Paths under `folder` that .gitignore ignores (folders end in "/"), relative to it; None
    when git is absent or `folder` is not in a git work tree."""
    if shutil.which("git") is None:
        return None
    try:
        proc = subprocess.run(
            ["git", "-C", str(folder), "ls-files", "--others", "--ignored", "--exclude-standard",
             "--directory", "-z"], capture_output=True, timeout=120)
    except (OSError, subprocess.SubprocessError):
        return None
    if proc.returncode != 0:  # not a repository (or git failed): no .gitignore handling
        return None
    return {p for p in proc.stdout.decode("utf-8", "surrogateescape").split("\0") if p}


def _ignored_by_git(relative: str, is_dir: bool, ignored: set[str]) -> bool:
    return (relative + "/" if is_dir else relative) in ignored or relative in ignored


def discover_folder(root: Path, excludes: Iterable[str] = (), skip: Iterable[Path] = ()) -> Discovery:
    """Python files (and notebooks, when porter can convert them) under `root`, sorted by their
    path relative to `root`."""
    excludes = tuple(excludes)
    skip_real = {os.path.realpath(p) for p in skip}
    ignored = git_ignored(root) or set()
    with_notebooks = notebooks_supported()
    found: list[str] = []
    notebooks_skipped = 0
    for folder, dirs, files in os.walk(root):
        rel_folder = os.path.relpath(folder, root)
        rel_folder = "" if rel_folder == "." else rel_folder.replace(os.sep, "/")
        kept = []
        for name in sorted(dirs):
            rel = f"{rel_folder}/{name}" if rel_folder else name
            full = os.path.join(folder, name)
            if (name.startswith(".") or name in SKIPPED_FOLDERS
                    or os.path.isfile(os.path.join(full, "pyvenv.cfg"))
                    or os.path.realpath(full) in skip_real
                    or _ignored_by_git(rel, True, ignored) or excluded(rel, excludes)):
                continue
            kept.append(name)
        dirs[:] = kept
        for name in files:
            rel = f"{rel_folder}/{name}" if rel_folder else name
            if not (name.endswith(".py") or name.endswith(".ipynb")):
                continue
            full = os.path.join(folder, name)
            if os.path.islink(full) or not os.path.isfile(full):
                continue
            if _ignored_by_git(rel, False, ignored) or excluded(rel, excludes):
                continue
            if name.endswith(".ipynb") and not with_notebooks:
                notebooks_skipped += 1
                continue
            found.append(rel)
    found.sort()
    notes = []
    if notebooks_skipped:
        notes.append(f"{notebooks_skipped} notebook(s) skipped: this porter has no notebook support")
    items = [Item(str(root / rel), str(root / rel), None) for rel in found]
    return Discovery(items, notes)


def discover(paths: list[str], options: BatchOptions) -> Discovery:
    """The work for `paths` (folders are searched, files taken as they are), sharded when asked;
    outputs mirror each folder under `options.output_dir`, or are the sources with `in_place`."""
    skip = [Path(options.output_dir)] if options.output_dir else []
    items: list[Item] = []
    notes: list[str] = []
    for given in paths:
        path = Path(given)
        if path.is_dir():
            found = discover_folder(path, options.excludes, skip)
            notes += found.notes
            for item in found.items:
                output = None
                if options.mode == "convert":
                    if options.in_place:
                        output = item.path
                    elif options.output_dir is not None:
                        output = str(Path(options.output_dir) / Path(item.path).relative_to(path))
                items.append(replace(item, output=output))
        elif path.is_file():
            if excluded(given, options.excludes):
                continue
            output = given if options.mode == "convert" and options.in_place else None
            items.append(Item(given, given, output))
        else:
            raise ConversionError("no such file or folder", given)
    if len(paths) > 1:
        items.sort(key=lambda i: i.source)
        seen: set[str] = set()
        items = [i for i in items if not (os.path.realpath(i.path) in seen
                                          or seen.add(os.path.realpath(i.path)))]
    if options.shard is not None:
        items = shard(items, *options.shard)
    return Discovery(items, notes)


def shard(items: list, k: int, n: int) -> list:
    """The K-th (1-based) of N slices: every N-th item of the sorted list, starting at K-1."""
    if not (n >= 1 and 1 <= k <= n):
        raise ValueError(f"shard {k}/{n}: K must be between 1 and N")
    return items[k - 1::n]


def parse_shard(text: str) -> tuple[int, int]:
    match = re.fullmatch(r"\s*(\d+)\s*/\s*(\d+)\s*", text)
    if not match:
        raise ValueError(f"expected K/N (for example 2/4), got {text!r}")
    k, n = int(match[1]), int(match[2])
    if n < 1 or not 1 <= k <= n:
        raise ValueError(f"{text!r}: K must be between 1 and N")
    return k, n


def parse_size(text: str) -> int:
    """`2MB`, `500k`, `1048576` → bytes (binary units)."""
    match = re.fullmatch(r"\s*(\d+(?:\.\d+)?)\s*([kmg]?)i?b?\s*", text.lower())
    if not match:
        raise ValueError(f"not a size: {text!r} (for example 2MB, 500KB, 100000)")
    factor = {"": 1, "k": 1024, "m": 1024 ** 2, "g": 1024 ** 3}[match[2]]
    value = int(float(match[1]) * factor)
    if value < 1:
        raise ValueError("must be at least 1 byte")
    return value


# ------------------------------------------------------------------ one file

def failed(item: Item, reason: str) -> FileResult:
    return FileResult(source=item.source, output=None, original_text="", converted_text="",
                      sites=(), status="failed", error=reason)


def _reason(exc: ConversionError) -> str:
    reason = exc.message
    if exc.line is not None:
        reason += f" (line {exc.line}" + (f", column {exc.column}" if exc.column is not None else "") + ")"
    return reason


def process_file(item: Item, options: Options, max_size: int, keep_text: bool) -> FileResult:
    """Convert one file in memory. Never raises for a bad file: it comes back "failed".
    Texts are dropped unless `keep_text` and the file changed (the caller copies the others);
    `original_text` is kept when it holds TODO(porter) markers (see `todo_markers`)."""
    try:
        size = os.stat(item.path).st_size
        if size > max_size:
            return failed(item, f"too large: {size} bytes (--max-size is {max_size})")
        data = Path(item.path).read_bytes()
        try:
            text = data.decode("utf-8")
        except UnicodeDecodeError as exc:
            return failed(item, f"not UTF-8 text ({exc.reason} at byte {exc.start})")
        if not PANDAS_IMPORT.search(text):
            return FileResult(item.source, item.output, _with_markers(text), "", (), "unchanged")
        if item.path.endswith(".ipynb"):
            result = _convert_notebook(item, text, options)
        else:
            result = convert_source(text, path=item.source, options=options, output=item.output)
    except ConversionError as exc:
        return failed(item, _reason(exc))
    except OSError as exc:
        return failed(item, f"cannot read: {exc.strerror or exc}")
    except InternalError as exc:  # a bug in porter: report it for this file, go on with the rest
        where = f"line {exc.line}: " if exc.line else ""
        return replace(failed(item, f"{where}internal error: please report ({exc.detail})"),
                       traceback=exc.traceback or None)
    except Exception as exc:  # noqa: BLE001 - outside the translation (notebook cells, reading)
        return replace(failed(item, f"internal error: please report ({type(exc).__name__}: {exc})"),
                       traceback=traceback.format_exc())
    if not (keep_text and result.status == "converted"):
        result = replace(result, original_text=_with_markers(result.original_text),
                         converted_text="")
    return result


def _convert_notebook(item: Item, text: str, options: Options) -> FileResult:
    from porter import notebooks
    if hasattr(notebooks, "convert_notebook_text"):  # the text is read already
        result = notebooks.convert_notebook_text(text, item.source, options)
    else:
        result = notebooks.convert_notebook(Path(item.path), options)
    return replace(result, source=item.source, output=item.output)


def _with_markers(text: str) -> str:
    return text if TODO_MARKER.search(text) else ""


def _process_chunk(items: list[Item], options: Options, max_size: int,
                   keep_text: bool) -> list[FileResult]:
    return [process_file(item, options, max_size, keep_text) for item in items]


# ------------------------------------------------------------------ the batch

def _progress_bar(total: int, enabled: bool):
    from tqdm import tqdm
    return tqdm(total=total, unit="file", file=sys.stderr, leave=False, dynamic_ncols=True,
                disable=not (enabled and sys.stderr.isatty()))


def process_items(items: list[Item], options: Options, *, jobs: int = 1,
                  max_size: int = DEFAULT_MAX_SIZE, keep_text: bool = True,
                  progress: bool = False) -> list[FileResult]:
    """Process every item, in parallel over `jobs` processes; results in the order of `items`."""
    results: list[FileResult | None] = [None] * len(items)
    with _progress_bar(len(items), progress) as bar:
        if jobs <= 1 or len(items) <= 1:
            for index, item in enumerate(items):
                results[index] = process_file(item, options, max_size, keep_text)
                bar.update(1)
            return [r for r in results if r is not None]
        size = max(1, min(32, math.ceil(len(items) / (jobs * 4))))
        starts = range(0, len(items), size)
        with ProcessPoolExecutor(max_workers=min(jobs, len(starts))) as pool:
            futures = {pool.submit(_process_chunk, items[s:s + size], options, max_size, keep_text): s
                       for s in starts}
            for future in as_completed(futures):
                start = futures[future]
                chunk = items[start:start + size]
                try:
                    done = future.result()
                except Exception as exc:  # a worker died (killed, out of memory): its files fail
                    done = [failed(i, f"crash inside porter: {type(exc).__name__}: {exc}") for i in chunk]
                results[start:start + len(chunk)] = done
                bar.update(len(chunk))
    return [r for r in results if r is not None]


def run_batch(paths: list[str], options: BatchOptions) -> BatchResult:
    """Discover, process and (in convert mode) write. Usage problems raise ConversionError."""
    if options.mode == "convert" and not options.in_place:
        if options.output_dir is None:
            raise ConversionError("converting a folder needs -o OUT_DIR (or --in-place)")
        out = Path(options.output_dir).resolve()
        for given in paths:
            src = Path(given).resolve()
            if out == src or src.is_relative_to(out):
                raise ConversionError("the output folder must not contain the sources "
                                      "(use --in-place to rewrite them)", options.output_dir)
    discovery = discover(paths, options)
    keep_text = options.mode == "convert" or options.keep_text
    results = process_items(discovery.items, options.options, jobs=options.jobs,
                            max_size=options.max_size, keep_text=keep_text,
                            progress=options.progress)
    if options.mode == "convert":
        results = [_write_result(item, result, options.in_place)
                   for item, result in zip(discovery.items, results)]
    return BatchResult(results, discovery.notes)


# ------------------------------------------------------------------ writing

def _fill(handle, data: bytes) -> None:
    handle.write(data)


def write_atomic(path: Path, data: bytes, mode_from: Path | None = None) -> None:
    """Write `data` to `path` completely or not at all: a temporary file in the same folder,
    flushed, then renamed over `path` (`os.replace` is atomic on one file system)."""
    handle = tempfile.NamedTemporaryFile(dir=path.parent, prefix=f".{path.name}.",
                                         suffix=".porter-tmp", delete=False)
    try:
        with handle:
            _fill(handle, data)
            handle.flush()
            os.fsync(handle.fileno())
        if mode_from is not None and mode_from.exists():
            os.chmod(handle.name, stat.S_IMODE(os.stat(mode_from).st_mode))
        else:
            os.chmod(handle.name, 0o666 & ~_umask())
        os.replace(handle.name, path)
    except BaseException:
        try:
            os.unlink(handle.name)
        except OSError:
            pass
        raise


def _umask() -> int:
    mask = os.umask(0)
    os.umask(mask)
    return mask


def _write_result(item: Item, result: FileResult, in_place: bool) -> FileResult:
    if result.status == "failed" or item.output is None:
        return result
    target = Path(item.output)
    try:
        if result.status == "converted":
            target.parent.mkdir(parents=True, exist_ok=True)
            write_atomic(target, result.converted_text.encode("utf-8"), Path(item.path))
        elif not in_place:  # unchanged: an exact copy, so the mirrored tree is complete
            target.parent.mkdir(parents=True, exist_ok=True)
            write_atomic(target, Path(item.path).read_bytes(), Path(item.path))
    except OSError as exc:
        return replace(failed(item, f"cannot write {item.output}: {exc.strerror or exc}"),
                       sites=result.sites)
    return result


# ------------------------------------------------------------------ reports and summaries
