"""A fixed sample of pandas' own test files (shipped in the installed pandas wheel), converted:
porter never crashes, always writes code that parses on the oldest Python it supports, and a
second pass changes nothing. The full run over every file is on demand:
`python tests/external/pandas_test_files.py` (source: pandas' test suite, `pandas/tests/`)."""

from __future__ import annotations

import sys
from pathlib import Path

import pytest

sys.path.insert(0, str(Path(__file__).resolve().parent / "external"))

import pandas_test_files as harness  # noqa: E402

# small and varied: frames, groupby, reshaping, strings, dates, IO and arithmetic
SAMPLE = [
    "frame/methods/test_assign.py", "frame/methods/test_dropna.py",
    "groupby/test_counting.py", "reshape/test_melt.py", "strings/test_case_justify.py",
    "tseries/offsets/test_month.py", "io/parser/test_na_values.py", "series/methods/test_isin.py",
    "arithmetic/test_interval.py", "copy_view/test_methods.py",
]


@pytest.mark.parametrize("name", SAMPLE)
def test_a_pandas_test_file_converts_cleanly(name):
    path = harness.TESTS / name
    if not path.exists():
        pytest.skip(f"{name} is not in this pandas ({harness.pd.__version__})")
    problem = harness.check(path)
    assert problem is None, problem
