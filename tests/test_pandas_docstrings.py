"""A fixed sample of pandas' own docstring examples (source: the docstrings of the installed
pandas, see tests/external/pandas_docstrings.py for the whole run on demand): porter either
converts them to the same values as pandas, or flags them; never converts them to others."""

from __future__ import annotations

from pathlib import Path
import sys

import pytest

sys.path.insert(0, str(Path(__file__).resolve().parent / "external"))

import pandas_docstrings as harness  # noqa: E402

SAMPLE = ["DataFrame.shape", "Series.count", "Series.std", "str.center", "str.endswith",
          "str.fullmatch", "str.match", "str.pad", "str.startswith", "DataFrameGroupBy.rank",
          "DataFrame.sort_values", "DataFrame.dropna", "DataFrame.merge"]
EXAMPLES = {e.key: e for e in harness.examples()}


@pytest.mark.parametrize("key", [k for k in SAMPLE if k in EXAMPLES])
def test_docstring_examples_are_same_or_flagged(key):
    category, detail = harness.judge(EXAMPLES[key])
    assert category in ("same", "flagged", "untouched", "skipped"), f"{category}: {detail}"


def test_isin_with_values_of_another_type():
    category, detail = harness.judge(EXAMPLES["Series.isin"])
    assert category != "different", detail


def test_dtypes_value_counts():
    category, detail = harness.judge(EXAMPLES["Series.value_counts"])
    assert category in ("same", "flagged"), detail
