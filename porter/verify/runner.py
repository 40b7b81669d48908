"""Running one side: a private copy of the data folder, a child process with time and memory
limits, and what the script left behind (new or changed files, frames in its globals)."""

from __future__ import annotations

from dataclasses import dataclass, field
import hashlib
import json
import os
from pathlib import Path
import pickle
import resource
import shutil
import signal
import subprocess
import sys
import threading
import time
from typing import Any

from porter.verify.model import SideRun

IGNORED_PARTS = {"__pycache__", ".ipynb_checkpoints"}


@dataclass
class SideOutputs:
    run: SideRun
    files: dict[str, Path] = field(default_factory=dict)  # relative path -> file
    variables: dict[str, Any] = field(default_factory=dict)
    expressions: list[str] = field(default_factory=list)
    variable_error: str | None = None


def _fingerprints(root: Path) -> dict[str, str]:
    """Each file's content and modification time: a file the script writes again with the
    same content (an output left in the folder by an earlier run) is still one it wrote."""
    prints = {}
    for path in root.rglob("*"):
        if path.is_file() and not IGNORED_PARTS & set(path.relative_to(root).parts):
            digest = hashlib.sha256(path.read_bytes()).hexdigest()
            prints[str(path.relative_to(root))] = f"{digest}:{path.stat().st_mtime_ns}"
    return prints


def _limits(memory_mib: int | None):  # type: ignore[no-untyped-def]
    def apply() -> None:
        if memory_mib is not None:
            limit = memory_mib * 1024 * 1024
            resource.setrlimit(resource.RLIMIT_AS, (limit, limit))
    return apply


def run_side(script_text: str, script_rel: str, data_dir: Path, side_dir: Path, *,
             timeout: float, memory_mib: int | None, capture: bool = True,
             python: str | None = None) -> SideOutputs:
    """Copy `data_dir` into `side_dir/work`, put the script at `script_rel` in it, run it there.

    `python`: another interpreter to run it under (verify --reference-python); the child is
    then run from its file, which needs nothing but the standard library.

    `capture=False` is a timing run: the child keeps no frames and the files the script wrote
    are not looked at; only how it ended and what it cost are reported.
    """
    work = side_dir / "work"
    # the data folder may hold this very run's folder (`--data .` in the temp directory):
    # it is not copied into itself
    inside = side_dir.resolve()
    shutil.copytree(data_dir, work, symlinks=True, ignore=lambda folder, names: [
        n for n in names if (Path(folder) / n).resolve() in (inside, *inside.parents)])
    script = work / script_rel
    script.parent.mkdir(parents=True, exist_ok=True)
    script.write_text(script_text, encoding="utf-8")
    dump = side_dir / "frames"
    dump.mkdir()
    before = _fingerprints(work) if capture else {}

    if python is None:
        command = [sys.executable, "-m", "porter.verify.child", str(script), str(dump)]
    else:
        command = [python, str(Path(__file__).with_name("child.py")), str(script), str(dump)]
    if not capture:
        command.append("--no-capture")
    exit_code, stdout, stderr, timed_out, process_wall = _run_child(command, work, timeout,
                                                                    memory_mib)
    failure = _failure(exit_code, stderr, timed_out, memory_mib)
    measure = _measure(dump)
    if measure is not None:  # the script's own figures, read in the child as it ended
        run = SideRun(exit_code=exit_code, wall_s=measure["wall_s"],
                      peak_mib=measure.get("peak_mib"), stdout=stdout, stderr=stderr,
                      failure=failure, workdir=str(work), capture_s=measure.get("capture_s"),
                      baseline_mib=measure.get("baseline_mib"), measured="script")
    else:  # it never got to the end (timed out, killed): the child process's life, no peak
        run = SideRun(exit_code=exit_code, wall_s=process_wall, peak_mib=None, stdout=stdout,
                      stderr=stderr, failure=failure, workdir=str(work), measured="process")
    result = SideOutputs(run)
    if not capture:
        return result
    after = _fingerprints(work)
    result.files = {rel: work / rel for rel, digest in after.items()
                    if before.get(rel) != digest and rel != script_rel}
    if failure is None:
        _load_frames(dump, result)
    return result


def _run_child(command: list[str], work: Path, timeout: float,
               memory_mib: int | None) -> tuple[int, str, str, bool, float]:
    """Run the child to its end or the time-out: exit code, stdout, stderr, whether it was
    stopped, and the wall time of the whole process (start-up and capture included)."""
    env = dict(os.environ)
    env["PYTHONDONTWRITEBYTECODE"] = "1"
    env.setdefault("PYTHONHASHSEED", "0")
    started = time.perf_counter()
    proc = subprocess.Popen(command, cwd=work, stdout=subprocess.PIPE, stderr=subprocess.PIPE,
                            env=env, start_new_session=True, preexec_fn=_limits(memory_mib))
    out: list[bytes] = []
    err: list[bytes] = []
    readers = [threading.Thread(target=lambda s=stream, b=buf: b.append(s.read()), daemon=True)
               for stream, buf in ((proc.stdout, out), (proc.stderr, err))]
    for reader in readers:
        reader.start()
    timed_out = threading.Event()

    def stop() -> None:
        timed_out.set()
        try:
            os.killpg(proc.pid, signal.SIGKILL)
        except ProcessLookupError:
            pass

    timer = threading.Timer(timeout, stop)
    timer.start()
    # no resource usage from wait4 here: the child's ru_maxrss starts from this (forking)
    # process's own resident memory, so the child reads its peak itself (see child.py)
    exit_code = proc.wait()
    timer.cancel()
    wall = time.perf_counter() - started
    for reader in readers:
        reader.join(timeout=5)
    stdout = b"".join(out).decode("utf-8", "replace")
    stderr = b"".join(err).decode("utf-8", "replace")
    return exit_code, stdout, stderr, timed_out.is_set(), wall


def _measure(dump: Path) -> dict[str, Any] | None:
    try:
        measure = json.loads((dump / "measure.json").read_text(encoding="utf-8"))
    except (OSError, ValueError):
        return None
    return measure if isinstance(measure, dict) and "wall_s" in measure else None


def _failure(exit_code: int, stderr: str, timed_out: bool, memory_mib: int | None) -> str | None:
    if timed_out:
        return "timed out"
    if exit_code == 0:
        return None
    memory_signs = ("MemoryError", "memory allocation", "Cannot allocate memory",
                    "std::bad_alloc", "out of memory")
    if memory_mib is not None and (exit_code < 0 or any(s in stderr for s in memory_signs)):
        return "out of memory"
    if exit_code < 0:
        return f"killed by signal {signal.Signals(-exit_code).name}"
    return "crashed"


def _load_frames(dump: Path, result: SideOutputs) -> None:
    try:
        for path in sorted(dump.glob("*.pickle")):
            with open(path, "rb") as handle:
                try:
                    result.variables[path.stem] = pickle.load(handle)  # noqa: S301 - our child wrote it
                except (ModuleNotFoundError, AttributeError, ImportError):
                    # a frame pickled by an older pandas (--reference-python: pandas 1.5's
                    # Int64Index lived in a module pandas 2 removed): pandas' own reader maps
                    # its old classes to today's
                    import pandas as pd
                    result.variables[path.stem] = pd.read_pickle(path)  # noqa: S301
        expressions = dump / "expressions.txt"
        if expressions.exists():
            result.expressions = [n for n in expressions.read_text().splitlines() if n]
    except Exception as exc:  # a frame that cannot be read back is reported, not fatal
        result.variable_error = f"{type(exc).__name__}: {exc}"
