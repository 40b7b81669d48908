"""Every mapping key's own cases, on random tables: the confidence porter states for a key is
never above the share of tables on which its conversion computes what pandas computes.

The number of tables per case is PORTER_CASE_TRIALS (8 here; `tests/measure_confidence.py`
runs 40 and writes the rates into docs/coverage.md). See tests/trial_cases.py."""

from __future__ import annotations

import os

import pytest

from trial_cases import entries_with_cases, measure

TRIALS = int(os.environ.get("PORTER_CASE_TRIALS", "8"))


@pytest.mark.parametrize("entry", entries_with_cases(), ids=lambda e: e.key)
def test_measured_rate_is_not_below_the_stated_confidence(entry) -> None:
    result = measure(entry, TRIALS)
    assert not result.unported, f"cases that do not port: {result.unported}"
    assert result.trials >= TRIALS, f"pandas raised on most tables ({result.skipped} skipped)"
    assert result.rate >= result.stated, (
        f"{entry.key}: agreed on {result.agreed} of {result.trials} tables, below the stated "
        f"{result.stated:.2f}\n{result.first_difference}")
