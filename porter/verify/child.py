"""Runs one script as `__main__` in the verifier's child process and keeps its frames.

    python -m porter.verify.child SCRIPT DUMP_DIR

The script runs exactly as `python SCRIPT` would (its folder first on sys.path, `__name__` set
to "__main__"). When it ends — normally or with SystemExit — every frame-valued global (pandas
DataFrame/Series, Polars DataFrame/LazyFrame/Series; LazyFrames collected) is pickled into
DUMP_DIR as NAME.pickle, and Polars expressions left in globals are listed in
DUMP_DIR/expressions.txt. A script that raises prints its traceback and exits 1.
"""

from __future__ import annotations

import builtins
from pathlib import Path
import pickle
import sys
import traceback
from typing import Any


def frame_values(namespace: dict[str, Any]) -> tuple[dict[str, Any], list[str]]:
    frames: dict[str, Any] = {}
    expressions: list[str] = []
    pandas = sys.modules.get("pandas")
    polars = sys.modules.get("polars")
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
    return frames, expressions


def main(argv: list[str]) -> int:
    script, dump = Path(argv[0]).resolve(), Path(argv[1])
    sys.argv = [str(script)]
    sys.path.insert(0, str(script.parent))
    namespace: dict[str, Any] = {"__name__": "__main__", "__file__": str(script),
                                 "__builtins__": builtins}
    code = compile(script.read_text(encoding="utf-8"), str(script), "exec")
    status = 0
    try:
        exec(code, namespace)  # noqa: S102 - running the user's script is the point
    except SystemExit as exc:
        status = exc.code if isinstance(exc.code, int) else (0 if exc.code is None else 1)
    except BaseException:  # the script's own failure: its traceback is the report
        traceback.print_exc()
        return 1
    sys.stdout.flush()
    try:
        frames, expressions = frame_values(namespace)
        for name, value in frames.items():
            with open(dump / f"{name}.pickle", "wb") as handle:
                pickle.dump(value, handle)
        (dump / "expressions.txt").write_text("\n".join(expressions), encoding="utf-8")
    except Exception:  # keeping the frames failed: say so, the files still count
        print("porter: could not keep the script's frames:", file=sys.stderr)
        traceback.print_exc()
        return 3
    return status


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
