"""Helpers shared by the tests: convert snippets, run them, compare results.

pandas is the reference implementation: a differential check runs the original snippet with
pandas and the converted snippet with Polars, and compares what they computed.
"""

from __future__ import annotations

import contextlib
import math
from pathlib import Path
import subprocess
import textwrap
from typing import Any, Iterator

import pandas as pd
import polars as pl

from porter.api import convert_source
from porter.model import FileResult, Options


def convert(source: str, **options: Any) -> FileResult:
    return convert_source(textwrap.dedent(source), options=Options(**options))


def converted_text(source: str, **options: Any) -> str:
    return convert(source, **options).converted_text


def run(source: str) -> dict[str, Any]:
    namespace: dict[str, Any] = {"__name__": "__porter_test__"}
    exec(compile(source, "<snippet>", "exec"), namespace)  # noqa: S102 - test snippets only
    return namespace


def rows(value: Any) -> tuple[list[str], list[tuple[Any, ...]]]:
    """A table as (column names, rows) the way a person reads it: pandas' meaningful index
    becomes columns, Polars frames are collected, missing values are None."""
    if isinstance(value, pl.LazyFrame):
        value = value.collect()
    if isinstance(value, pl.Series):
        value = value.to_frame()
    if isinstance(value, pd.Series):
        value = value.to_frame(name=value.name if value.name is not None else "0")
    if isinstance(value, pd.DataFrame):
        if isinstance(value.index, pd.MultiIndex) or value.index.name is not None:
            value = value.reset_index(allow_duplicates=True)
        elif value.index.inferred_type not in ("integer", "empty") \
                and "index" not in [str(c) for c in value.columns]:
            # labels that are not row numbers (df.sum()'s column names) are data, as
            # porter's verifier reads them: "index", as reset_index() names them
            value = value.reset_index()
        else:
            value = value.reset_index(drop=True)
        # porter flattens MultiIndex columns to column_function (documented, confidence 0.9)
        columns = ["_".join(str(p) for p in c if p != "") if isinstance(c, tuple) else str(c)
                   for c in value.columns]
        data = [tuple(_cell(v) for v in row) for row in value.itertuples(index=False, name=None)]
        return columns, data
    if isinstance(value, pl.DataFrame):
        return [str(c) for c in value.columns], [tuple(_cell(v) for v in r) for r in value.iter_rows()]
    raise TypeError(f"not a table: {type(value)}")


def _cell(value: Any) -> Any:
    if value is None or value is pd.NA or value is pd.NaT:
        return None
    if isinstance(value, (list, tuple, pd.Index, pd.api.extensions.ExtensionArray)) \
            or type(value).__name__ == "ndarray":
        return tuple(_cell(v) for v in list(value))  # a list cell (pandas: an array)
    if isinstance(value, float) and math.isnan(value):
        return None
    if hasattr(value, "item") and not isinstance(value, (str, bytes)):
        try:
            value = value.item()
        except (ValueError, AttributeError):
            pass
    if isinstance(value, pd.Timestamp):
        return value.to_pydatetime()
    if isinstance(value, bool):
        return value
    if isinstance(value, int):
        return float(value)
    return value


# floats agree within this relative tolerance (exact_floats() makes it 0: to the last digit)
_FLOAT_TOLERANCE = [1e-9]


@contextlib.contextmanager
def exact_floats() -> Iterator[None]:
    """Floats compared to the last binary digit inside the block (as the text pandas writes
    shows them: 3.2659863237109046 and 3.265986323710904 differ for whoever reads them)."""
    _FLOAT_TOLERANCE.append(0.0)
    try:
        yield
    finally:
        _FLOAT_TOLERANCE.pop()


def same_cells(a: Any, b: Any) -> bool:
    if isinstance(a, float) and isinstance(b, float):
        rel = _FLOAT_TOLERANCE[-1]
        return a == b if rel == 0.0 else math.isclose(a, b, rel_tol=rel, abs_tol=1e-12)
    return a == b


def assert_same_table(expected: Any, actual: Any) -> None:
    exp_cols, exp_rows = rows(expected)
    act_cols, act_rows = rows(actual)
    if act_cols == ["index", *exp_cols] and isinstance(expected, (pd.DataFrame, pd.Series)) \
            and expected.index.nlevels == 1 and expected.index.name is None \
            and expected.index.inferred_type in ("integer", "empty"):
        # porter carries pandas' row labels (after a filter or sort) as a first column
        # "index", as porter's verifier compares them: pandas' labels are data here
        exp_cols, exp_rows = rows(expected.reset_index())
    assert exp_cols == act_cols, f"columns differ: pandas {exp_cols}, polars {act_cols}"
    assert len(exp_rows) == len(act_rows), (
        f"row counts differ: pandas {len(exp_rows)}, polars {len(act_rows)}\n"
        f"pandas: {exp_rows[:8]}\npolars: {act_rows[:8]}")
    for i, (e, a) in enumerate(zip(exp_rows, act_rows)):
        assert all(same_cells(x, y) for x, y in zip(e, a)), f"row {i} differs: pandas {e}, polars {a}"


def column_kinds(frame: Any) -> list[str]:
    """'f', 'i' or 'o' per column of a pandas or Polars frame: what to_csv and print write for
    a whole number (6 or 6.0) follows it."""
    if isinstance(frame, pl.LazyFrame):
        frame = frame.collect()
    if isinstance(frame, pl.DataFrame):
        return ["f" if d.is_float() else "i" if d.is_integer() else "o" for d in frame.dtypes]
    return [d.kind if d.kind in "fi" else "o" for d in frame.dtypes]


def assert_same_value(expected: Any, actual: Any) -> None:
    if isinstance(expected, (pd.DataFrame, pd.Series)):
        assert_same_table(expected, actual)
        return
    if isinstance(actual, (pl.Series, pl.DataFrame, pl.LazyFrame)):
        # an array from pandas (unique(), values) has no name: compare the values only
        name = actual.name if isinstance(actual, pl.Series) else getattr(expected, "name", None)
        assert_same_table(pd.Series(list(expected), name=name), actual)
        return
    if isinstance(expected, dict) and isinstance(actual, dict):
        try:  # item by item: a missing key (nan) equals a missing key
            assert_same_value(list(expected), list(actual))
        except AssertionError:
            raise AssertionError(f"keys differ: pandas {list(expected)}, polars {list(actual)}") from None
        for key, want, got in zip(expected, expected.values(), actual.values()):
            try:
                assert_same_value(want, got)
            except AssertionError as exc:
                raise AssertionError(f"key {key!r}: {exc}") from None
        return
    if _is_sequence(expected) or _is_sequence(actual):
        exp, act = _as_list(expected), _as_list(actual)
        assert exp is not None and act is not None, f"pandas {expected!r}, polars {actual!r}"
        assert len(exp) == len(act), f"lengths differ: pandas {len(exp)}, polars {len(act)}"
        for i, (e, a) in enumerate(zip(exp, act)):
            try:
                assert_same_value(e, a)
            except AssertionError as exc:
                raise AssertionError(f"item {i}: {exc}") from None
        return
    assert same_cells(_cell(expected), _cell(actual)), f"pandas {expected!r}, polars {actual!r}"


def _is_sequence(value: Any) -> bool:
    """An array, an Index or a list: compared item by item (a numpy array's `==` is no truth)."""
    import numpy as np
    return isinstance(value, (np.ndarray, pd.Index, pd.api.extensions.ExtensionArray, list, tuple))


def _as_list(value: Any) -> list[Any] | None:
    import numpy as np
    if isinstance(value, np.ndarray):
        return value.tolist() if value.ndim != 1 or value.dtype != object else list(value)
    if isinstance(value, (pd.Index, pd.api.extensions.ExtensionArray, list, tuple, pl.Series)):
        return list(value)
    return None


def _log_keys(result: FileResult) -> None:
    """With PORTER_KEYLOG set, remember which mapping keys differential checks exercised."""
    import os
    log = os.environ.get("PORTER_KEYLOG")
    if log:
        with open(log, "a", encoding="utf-8") as handle:
            for site in result.sites:
                if site.status != "todo":
                    handle.write(site.key + "\n")


def differential(source: str, *names: str, **options: Any) -> FileResult:
    """Run `source` with pandas (the reference) and its conversion with Polars, then compare
    the variables `names` (default: `result`): floats within 1e-9, to the last digit where
    every site is stated at 1.0. Returns the conversion for further checks."""
    source = textwrap.dedent(source)
    result = convert_source(source, options=Options(**options))
    _log_keys(result)
    expected = run(source)
    actual = run(result.converted_text)
    # where every site is stated at 1.0, floats agree to the last digit (the read of a file is
    # lowered for files whose values do not fit the types read from the sample: not digits)
    exact = all(s.confidence >= 1.0 for s in result.sites if s.key != "pd.read_csv")
    for name in names or ("result",):
        try:
            with exact_floats() if exact else contextlib.nullcontext():
                assert_same_value(expected[name], actual[name])
        except AssertionError as exc:
            raise AssertionError(f"{name}: {exc}\n--- converted ---\n{result.converted_text}") from None
    return result


# -- running whole scripts ------------------------------------------------------------------

def read_table(path: Path) -> pd.DataFrame | None:
    """An output file read back as a table (None when it is not a table porter compares)."""
    if path.suffix == ".csv":
        return pd.read_csv(path)
    if path.suffix == ".parquet":
        return pd.read_parquet(path)
    return None


def run_script(script: Path, workdir: Path, timeout: float = 120,
               python: str | None = None) -> subprocess.CompletedProcess[str]:
    import subprocess
    import sys
    return subprocess.run([python or sys.executable, script.name], cwd=workdir, capture_output=True,
                          text=True, timeout=timeout)


def outputs(before: set[Path], workdir: Path) -> dict[str, Path]:
    return {str(p.relative_to(workdir)): p for p in workdir.rglob("*")
            if p.is_file() and p.relative_to(workdir) not in before}


def same_text(source: str, tmp_path: Path, files: dict[str, str] | None = None,
              with_data: bool = True) -> FileResult:
    """Run `source` with pandas and its conversion with Polars, each in a folder of its own
    holding `files` (converted with them as --data unless `with_data` is False), and check
    that they print the same text and write files of the same text (2024.0 and 2024 differ
    here, as they do for whoever reads the output)."""
    import sys
    source = textwrap.dedent(source)
    folders = {side: tmp_path / side for side in ("pandas", "polars")}
    for folder in folders.values():
        folder.mkdir()
        for name, content in (files or {}).items():
            (folder / name).write_text(textwrap.dedent(content))
    data = str(folders["pandas"]) if files and with_data else None
    result = convert_source(source, options=Options(data_dir=data))
    texts = []
    for side, text in (("pandas", source), ("polars", result.converted_text)):
        folder = folders[side]
        (folder / "script.py").write_text(text)
        done = subprocess.run([sys.executable, "script.py"], cwd=folder, capture_output=True,
                              text=True, timeout=120)
        assert done.returncode == 0, f"{side} failed:\n{done.stderr}\n--- converted ---\n" \
                                     f"{result.converted_text}"
        written = {p.name: p.read_text() for p in sorted(folder.iterdir())
                   if p.name != "script.py" and p.name not in (files or {})}
        texts.append((done.stdout, written))
    assert texts[0] == texts[1], f"pandas {texts[0]}\npolars {texts[1]}\n--- converted ---\n" \
                                 f"{result.converted_text}"
    return result
