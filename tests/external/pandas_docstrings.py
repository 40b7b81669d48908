"""Wild code porter did not write: the `>>>` examples in the docstrings of the installed pandas.

Source: the docstrings of pandas itself (the version installed beside porter, printed in the
report) for DataFrame, Series, DataFrameGroupBy, SeriesGroupBy, the `.str` and `.dt` accessors
and the top-level functions. Each docstring's examples become one small script: every bare
expression that pandas' documentation shows the value of is kept in a variable, so both versions
can be compared as data. Each script ends in one category:

- same:      porter converted something, and every kept value equals pandas' (pandas is the
             reference implementation);
- flagged:   porter left a TODO (the code under it is pandas; it must still compute the same);
- different: porter converted with no TODO, and a value differs or the converted script fails;
             a bug, unless turned into a TODO;
- untouched: porter changed nothing;
- expressions: every value the examples show became an expression of its frame (a Series kept
             in a name), which is data only where the script uses it with the frame: nothing
             to compare;
- skipped:   the original itself does not run here (network, files, random numbers, plots).

    python tests/external/pandas_docstrings.py            # all, prints the counts
    python tests/external/pandas_docstrings.py --markdown docs/docstrings.md
"""

from __future__ import annotations

import argparse
import ast
import contextlib
import doctest
import io
import signal
import sys
from dataclasses import dataclass
from pathlib import Path
from typing import Any, Iterator

import pandas as pd

HERE = Path(__file__).resolve().parent
sys.path.insert(0, str(HERE.parent))

from support import assert_same_value  # noqa: E402

from porter.api import convert_source  # noqa: E402

UNSAFE = ("read_", "to_csv", "to_parquet", "to_excel", "to_json", "to_pickle", "to_hdf", "to_sql",
          "to_clipboard", "to_feather", "to_stata", "to_orc", "to_html", "to_latex", "to_xml",
          "http", "plot", "random", "open(", "import ", "tmp", "StringIO", "BytesIO", "style",
          "clipboard", "sqlite", "pyarrow", "numba", "cupy", "%timeit", "to_markdown")


def owners() -> Iterator[tuple[str, Any]]:
    from pandas.core.groupby import DataFrameGroupBy, SeriesGroupBy
    from pandas.core.indexes.accessors import DatetimeProperties
    from pandas.core.strings.accessor import StringMethods
    for prefix, cls in (("DataFrame", pd.DataFrame), ("Series", pd.Series),
                        ("DataFrameGroupBy", DataFrameGroupBy), ("SeriesGroupBy", SeriesGroupBy),
                        ("str", StringMethods), ("dt", DatetimeProperties)):
        for name in sorted(dir(cls)):
            if not name.startswith("_"):
                yield f"{prefix}.{name}", getattr(cls, name, None)
    for name in sorted(pd.__all__ if hasattr(pd, "__all__") else dir(pd)):
        obj = getattr(pd, name, None)
        if callable(obj) and not isinstance(obj, type) and not name.startswith("_"):
            yield f"pd.{name}", obj


@dataclass(frozen=True)
class Example:
    key: str
    script: str
    kept: tuple[str, ...]

    @property
    def reference(self) -> str:
        """The script pandas runs."""
        return snapshots(self.script, self.kept)


def snapshots(script: str, kept: tuple[str, ...]) -> str:
    """The script with each kept value copied where it is shown: later examples may change the
    same object in place, and the documentation shows the value as it was then."""
    lines = script.splitlines()
    after: dict[int, str] = {}
    for node in ast.parse(script).body:
        if isinstance(node, ast.Assign) and len(node.targets) == 1 \
                and isinstance(node.targets[0], ast.Name) and node.targets[0].id in kept:
            name = node.targets[0].id
            after[node.end_lineno or node.lineno] = \
                f"{name} = {name}.copy() if hasattr({name}, 'copy') else {name}"
    out: list[str] = []
    for number, line in enumerate(lines, start=1):
        out.append(line)
        if number in after:
            out.append(after[number])
    return "\n".join(out) + "\n"


def examples() -> list[Example]:
    parser = doctest.DocTestParser()
    found: list[Example] = []
    seen: set[str] = set()
    for key, obj in owners():
        doc = getattr(obj, "__doc__", None)
        if not doc or ">>>" not in doc:
            continue
        lines = ["import pandas as pd", "import numpy as np"]
        kept: list[str] = []
        for example in parser.get_examples(doc):
            source = example.source
            if any(word in source for word in UNSAFE):
                continue
            try:
                tree = ast.parse(source)
            except SyntaxError:
                continue
            if len(tree.body) == 1 and isinstance(tree.body[0], ast.Expr) and example.want.strip():
                name = f"shown_{len(kept)}"
                kept.append(name)
                source = f"{name} = {source}"
            lines.append(source.rstrip("\n"))
        script = "\n".join(lines) + "\n"
        if kept and script not in seen:
            seen.add(script)
            found.append(Example(key, script, tuple(kept)))
    return found


class _Timeout(Exception):
    pass


@contextlib.contextmanager
def time_limit(seconds: int) -> Iterator[None]:
    def stop(signum: int, frame: object) -> None:
        raise _Timeout()
    previous = signal.signal(signal.SIGALRM, stop)
    signal.alarm(seconds)
    try:
        yield
    finally:
        signal.alarm(0)
        signal.signal(signal.SIGALRM, previous)


def _run(script: str) -> dict[str, Any]:
    namespace: dict[str, Any] = {"__name__": "__docstring__"}
    with contextlib.redirect_stdout(io.StringIO()), contextlib.redirect_stderr(io.StringIO()), \
            time_limit(20):
        exec(compile(script, "<docstring>", "exec"), namespace)  # noqa: S102 - pandas' own examples
    return namespace


def judge(example: Example) -> tuple[str, str]:
    """(category, detail) for one docstring's examples."""
    try:
        expected = _run(example.reference)
    except BaseException as exc:  # noqa: BLE001 - an example that does not run here
        return "skipped", f"original: {type(exc).__name__}"
    try:
        result = convert_source(example.script, path=example.key)
    except Exception as exc:  # noqa: BLE001 - counted, never hidden
        return "different", f"porter failed: {type(exc).__name__}: {exc}"
    if result.converted_text == example.script:
        return "untouched", ""
    category = "flagged" if result.todos else "same"
    try:
        actual = _run(snapshots(result.converted_text, example.kept))
    except BaseException as exc:  # noqa: BLE001
        return ("flagged-different" if result.todos else "different"), \
            f"converted fails: {type(exc).__name__}: {str(exc)[:200]}"
    import polars as pl
    compared = 0
    for name in example.kept:
        if isinstance(actual.get(name), pl.Expr):
            # a Series of a frame kept in a name is an expression of that frame: it becomes
            # data where the script uses it with the frame, which these examples never do
            continue
        compared += 1
        try:
            assert_same_value(expected[name], actual[name])
        except Exception as exc:  # noqa: BLE001 - AssertionError or a value that is no table
            return ("flagged-different" if result.todos else "different"), \
                f"{name}: {str(exc).splitlines()[0][:200]}"
    if not compared:
        return "expressions", "every value shown is an expression of its frame (not compared)"
    return category, ""


def main() -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--markdown", help="write the counts and the differing examples here")
    parser.add_argument("-k", default="", help="only docstrings whose key contains this")
    args = parser.parse_args()
    counts: dict[str, int] = {}
    problems: list[tuple[str, str, str]] = []
    for example in examples():
        if args.k not in example.key:
            continue
        category, detail = judge(example)
        counts[category] = counts.get(category, 0) + 1
        if "different" in category:
            problems.append((example.key, category, detail))
            print(f"{category}: {example.key}: {detail}", file=sys.stderr)
    print(f"pandas {pd.__version__}: " + ", ".join(f"{k} {v}" for k, v in sorted(counts.items())))
    if args.markdown:
        lines = ["# pandas' docstring examples, converted", "",
                 f"Source: the `>>>` examples in the docstrings of pandas {pd.__version__} "
                 "(`tests/external/pandas_docstrings.py`; run on demand). One script per "
                 "docstring; pandas is the reference.", "", "| category | scripts |", "|---|---|"]
        lines += [f"| {k} | {v} |" for k, v in sorted(counts.items())]
        if problems:
            lines += ["", "## Differing", ""]
            lines += [f"- `{key}` ({category}): {detail}" for key, category, detail in problems]
        Path(args.markdown).write_text("\n".join(lines) + "\n", encoding="utf-8")
    return 1 if any(c == "different" for _, c, _ in problems) else 0


if __name__ == "__main__":
    sys.exit(main())
