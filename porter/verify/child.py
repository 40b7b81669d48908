"""Runs one script as `__main__` in the verifier's child process, measures it, keeps its frames.

    python -m porter.verify.child SCRIPT DUMP_DIR [--no-capture]

The script runs exactly as `python SCRIPT` would (its folder first on sys.path, `__name__` set
to "__main__"). The moment it ends — normally, with SystemExit or with an exception — the
child writes what the script alone cost to DUMP_DIR/measure.json (below). Then, unless
`--no-capture`, every frame-valued global (pandas DataFrame/Series, Polars
DataFrame/LazyFrame/Series; LazyFrames collected; a Dask original's frames computed) is pickled
into DUMP_DIR as NAME.pickle, and
Polars expressions left in globals are listed in DUMP_DIR/expressions.txt; the time that takes
is added to measure.json as `capture_s`, apart from the script's own figures. A script that
raises prints its traceback and exits 1.

What is measured, and what is not:

- `wall_s`: wall time from the script's first line to its end, its own imports (pandas,
  Polars…) included. The interpreter's start-up, reading and compiling the script, and the
  capture of its frames afterwards are not counted.
- `peak_mib`: the resident-memory high-water mark of this process, read when the script ends
  (before the capture, which collects LazyFrames and pickles frames, can raise it). It is the
  whole process's: the interpreter's own start-up memory (with this module's imports) is
  included, and is reported alone as `baseline_mib` (read just before the script starts).
  Nothing is subtracted: running a script costs its interpreter too, both sides carry the same
  baseline, and a reader who wants the script's growth alone can subtract the reported one.
  Processes the script starts are not counted.

On Linux the mark is VmHWM from /proc/self/status, the high-water mark of this process's own
memory since it started. It is not `getrusage(RUSAGE_SELF).ru_maxrss`: Linux keeps, in
ru_maxrss, the high-water mark of the memory the process had *before* it exec'd Python, which
for a child forked by the verifier is the verifier's own resident memory (a verifier holding
400 MiB made an empty script report 408 MiB). ru_maxrss is the fallback where /proc is absent.
"""

from __future__ import annotations

import builtins
import json
from pathlib import Path
import pickle
import resource
import sys
import time
import traceback
from typing import Any


def peak_mib() -> tuple[float | None, str]:
    """This process's resident-memory high-water mark in MiB, and where it was read."""
    try:
        with open("/proc/self/status", encoding="ascii") as status:
            for line in status:
                if line.startswith("VmHWM:"):
                    return int(line.split()[1]) / 1024, "VmHWM"  # kB
    except (OSError, ValueError, IndexError):
        pass
    try:
        maxrss = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss
    except (OSError, ValueError):
        return None, "unknown"
    # bytes on macOS, KiB elsewhere; includes the memory held before exec (see above)
    return maxrss / (1024 * 1024 if sys.platform == "darwin" else 1024), "ru_maxrss"


def frame_values(namespace: dict[str, Any]) -> tuple[dict[str, Any], list[str]]:
    frames: dict[str, Any] = {}
    expressions: list[str] = []
    pandas = sys.modules.get("pandas")
    polars = sys.modules.get("polars")
    dask = sys.modules.get("dask.dataframe")
    for name, value in namespace.items():
        if name.startswith("_"):
            continue
        if pandas is not None and isinstance(value, (pandas.DataFrame, pandas.Series)):
            frames[name] = value
        elif polars is not None and isinstance(value, (polars.DataFrame, polars.Series)):
            frames[name] = value
        elif polars is not None and isinstance(value, polars.LazyFrame):
            frames[name] = value.collect()
        elif polars is not None and isinstance(value, polars.Expr):
            expressions.append(name)
        elif dask is not None and isinstance(value, (dask.DataFrame, dask.Series)):
            # a Dask original's frame: computed, as its conversion's LazyFrame is collected
            try:
                frames[name] = value.compute()
            except Exception:  # noqa: BLE001 - a frame that no longer computes is not compared
                continue
    return frames, expressions


def _write_measure(dump: Path, measure: dict[str, object]) -> None:
    # written whole then renamed: the runner never reads half a file, even if the child is
    # killed during the capture that follows
    partial = dump / "measure.json.part"
    partial.write_text(json.dumps(measure), encoding="utf-8")
    partial.replace(dump / "measure.json")


def capture(namespace: dict[str, Any], dump: Path) -> None:
    frames, expressions = frame_values(namespace)
    for name, value in frames.items():
        with open(dump / f"{name}.pickle", "wb") as handle:
            pickle.dump(value, handle)
    (dump / "expressions.txt").write_text("\n".join(expressions), encoding="utf-8")


def main(argv: list[str]) -> int:
    script, dump = Path(argv[0]).resolve(), Path(argv[1])
    keep_frames = "--no-capture" not in argv[2:]
    sys.argv = [str(script)]
    sys.path.insert(0, str(script.parent))
    namespace: dict[str, Any] = {"__name__": "__main__", "__file__": str(script),
                                 "__builtins__": builtins}
    code = compile(script.read_text(encoding="utf-8"), str(script), "exec")
    baseline, _ = peak_mib()
    status = 0
    error: BaseException | None = None
    started = time.perf_counter()
    try:
        exec(code, namespace)  # noqa: S102 - running the user's script is the point
    except SystemExit as exc:
        status = exc.code if isinstance(exc.code, int) else (0 if exc.code is None else 1)
    except BaseException as exc:  # the script's own failure: its traceback is the report
        error = exc
    # the script has ended: its own figures are read now, before anything else runs
    wall = time.perf_counter() - started
    peak, source = peak_mib()
    measure: dict[str, object] = {"wall_s": wall, "peak_mib": peak, "peak_source": source,
                                  "baseline_mib": baseline}
    _write_measure(dump, measure)
    if error is not None:
        traceback.print_exception(error)
        return 1
    sys.stdout.flush()
    if not keep_frames:
        return status
    capture_started = time.perf_counter()
    try:
        capture(namespace, dump)
    except Exception:  # keeping the frames failed: say so, the files still count
        print("porter: could not keep the script's frames:", file=sys.stderr)
        traceback.print_exc()
        status = 3
    measure["capture_s"] = time.perf_counter() - capture_started
    _write_measure(dump, measure)
    return status


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
