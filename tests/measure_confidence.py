"""Measure every mapping key's confidence on its own cases (run on demand, not in the suite).

    python tests/measure_confidence.py [--trials 40] [--seed 0] [--key frame.sort_values]

Each key's `cases` (mappings/*.toml) run with pandas and as converted on TRIALS random tables
each (tests/trial_cases.py). The rates go into docs/confidence.json, which
`python -m porter.coverage` shows beside the declared confidence in docs/coverage.md. Exits 1
when a key's measured rate is below the confidence porter states for it; the test suite runs
the same check on fewer tables (tests/test_confidence.py)."""

from __future__ import annotations

import argparse
import json
from pathlib import Path
import sys
import time

sys.path.insert(0, str(Path(__file__).resolve().parent))

from trial_cases import cases_digest, entries_with_cases, measure  # noqa: E402

ROOT = Path(__file__).resolve().parent.parent
PAGE = ROOT / "docs" / "confidence.json"


def main() -> int:
    parser = argparse.ArgumentParser(prog="python tests/measure_confidence.py")
    parser.add_argument("--trials", type=int, default=40)
    parser.add_argument("--seed", type=int, default=0)
    parser.add_argument("--key", action="append", help="only this key (repeatable); merged "
                        "into the existing docs/confidence.json")
    args = parser.parse_args()
    entries = [e for e in entries_with_cases() if not args.key or e.key in args.key]
    recorded = json.loads(PAGE.read_text(encoding="utf-8")) if PAGE.exists() and args.key else {}
    below = []
    started = time.perf_counter()
    for number, entry in enumerate(entries, 1):
        result = measure(entry, args.trials, args.seed)
        recorded[entry.key] = {
            "declared": entry.confidence, "stated": result.stated, "trials": result.trials,
            "agreed": result.agreed, "skipped": result.skipped,
            "cases": len(entry.extra.get("cases", ())), "unported": len(result.unported),  # type: ignore[arg-type]
            "cases_digest": cases_digest(entry),
        }
        rate = result.rate
        flag = "" if rate is not None and rate >= result.stated and not result.unported else "  <-"
        print(f"[{number}/{len(entries)}] {entry.key}: {result.agreed}/{result.trials} agree, "
              f"stated {result.stated:.2f}{flag}", flush=True)
        if flag:
            below.append(result)
    PAGE.write_text(json.dumps(dict(sorted(recorded.items())), indent=1) + "\n", encoding="utf-8")
    print(f"{len(entries)} keys in {time.perf_counter() - started:.0f} s -> {PAGE}")
    for result in below:
        print(f"\n== {result.key}: unported cases {result.unported}\n{result.first_difference}")
    return 1 if below else 0


if __name__ == "__main__":
    sys.exit(main())
