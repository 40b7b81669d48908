"""Wild code porter did not write: the test files of the installed pandas (`pandas/tests/`).

Source: pandas' own test suite, as shipped in the pandas wheel installed beside porter (version
printed in the report). These files use every corner of pandas, in every syntax form. Each file
is converted; porter must never crash (an internal error), must always write code that parses on
the oldest Python porter supports, and converting its own output again must change nothing.

    python tests/external/pandas_test_files.py              # all files, prints the failures
    python tests/external/pandas_test_files.py -k groupby   # only paths containing "groupby"
"""

from __future__ import annotations

import argparse
import ast
import sys
import time
from pathlib import Path

import pandas as pd

HERE = Path(__file__).resolve().parent
sys.path.insert(0, str(HERE.parent.parent))

from porter.api import OLDEST_PYTHON, convert_source  # noqa: E402

TESTS = Path(pd.__file__).resolve().parent / "tests"


def files() -> list[Path]:
    return sorted(TESTS.rglob("*.py"))


def check(path: Path) -> str | None:
    """None when porter handles the file; otherwise what went wrong."""
    source = path.read_text(encoding="utf-8")
    try:
        ast.parse(source, feature_version=OLDEST_PYTHON)
    except SyntaxError:
        return None  # not a script porter is asked to read on the oldest Python
    try:
        first = convert_source(source, path=str(path))
    except Exception as exc:  # noqa: BLE001 - the failure is the finding
        return f"porter failed: {type(exc).__name__}: {exc}"
    try:
        ast.parse(first.converted_text, feature_version=OLDEST_PYTHON)
    except SyntaxError as exc:
        return f"output does not parse: {exc}"
    try:
        second = convert_source(first.converted_text, path=str(path))
    except Exception as exc:  # noqa: BLE001
        return f"second pass failed: {type(exc).__name__}: {exc}"
    if second.converted_text != first.converted_text:
        return "a second pass changes the output"
    return None


def main() -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("-k", default="", help="only files whose path contains this")
    args = parser.parse_args()
    failures = 0
    chosen = [p for p in files() if args.k in str(p.relative_to(TESTS))]
    start = time.perf_counter()
    for i, path in enumerate(chosen, start=1):
        problem = check(path)
        if problem:
            failures += 1
            print(f"{path.relative_to(TESTS)}: {problem}", flush=True)
        if i % 100 == 0:
            print(f"... {i}/{len(chosen)} files, {time.perf_counter() - start:.0f} s", file=sys.stderr)
    print(f"pandas {pd.__version__}: {len(chosen)} test files, {failures} failing")
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
