"""Every mapping key's own cases, on random tables: the confidence porter states for a key is
never above the share of tables on which its conversion computes what pandas computes.

Two checks (see tests/trial_cases.py for the cases and the tables):

- here, each key's cases run on PORTER_CASE_TRIALS tables each (8 by default). A key stated
  at 1.0 must agree on every one; below 1.0 the test fails when so few agree that the stated
  confidence is not believable (less than a 1 % chance of so few agreeing if it were true);
- the rates `tests/measure_confidence.py` recorded in docs/confidence.json (40 tables a case)
  must not be below the stated confidence, and must have been measured on the key's present
  cases."""

from __future__ import annotations

import json
from math import comb
import os
from pathlib import Path

import pytest

from trial_cases import cases_digest, entries_with_cases, measure

TRIALS = int(os.environ.get("PORTER_CASE_TRIALS", "8"))
RECORDED = Path(__file__).resolve().parent.parent / "docs" / "confidence.json"
ENTRIES = entries_with_cases()


def at_most(agreed: int, trials: int, rate: float) -> float:
    """The chance that no more than `agreed` of `trials` agree when each does with `rate`."""
    return sum(comb(trials, k) * rate ** k * (1 - rate) ** (trials - k) for k in range(agreed + 1))


@pytest.mark.parametrize("entry", ENTRIES, ids=lambda e: e.key)
def test_measured_rate_is_not_below_the_stated_confidence(entry) -> None:
    result = measure(entry, TRIALS)
    assert not result.unported, f"cases that do not port: {result.unported}"
    assert result.trials >= TRIALS, f"pandas raised on most tables ({result.skipped} skipped)"
    believable = result.agreed == result.trials if result.stated >= 1.0 \
        else at_most(result.agreed, result.trials, result.stated) >= 0.01
    assert believable, (
        f"{entry.key}: agreed on {result.agreed} of {result.trials} tables, stated "
        f"{result.stated:.2f}\n{result.first_difference}")


def test_recorded_rates_are_not_below_the_stated_confidence() -> None:
    recorded = json.loads(RECORDED.read_text(encoding="utf-8"))
    stale = [e.key for e in ENTRIES
             if recorded.get(e.key, {}).get("cases_digest") != cases_digest(e)]
    assert not stale, f"measure these keys again (tests/measure_confidence.py --key K): {stale}"
    below = {key: r for key, r in recorded.items()
             if r["trials"] and r["agreed"] / r["trials"] < r["stated"]}
    assert not below, below
