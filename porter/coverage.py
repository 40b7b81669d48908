"""Generate docs/coverage.md from the mapping table and the rules' docstrings.

    python -m porter.coverage            # rewrite docs/coverage.md
    python -m porter.coverage --check    # exit 1 when docs/coverage.md is out of date
"""

from __future__ import annotations

import argparse
from collections import Counter
import inspect
import json
from pathlib import Path
import sys

from porter.mapping import MappingTable, load_table
from porter.model import MappingEntry
from porter.rules import registry

DOC = Path(__file__).resolve().parent.parent / "docs" / "coverage.md"
MEASURED = DOC.parent / "confidence.json"  # written by tests/measure_confidence.py


def _cell(text: str) -> str:
    return text.replace("|", "\\|").replace("\n", " ").strip()


def _docstring_counts() -> list[str]:
    """The category table of the last docstring run (docs/docstrings.md), if there is one."""
    page = Path(__file__).resolve().parent.parent / "docs" / "docstrings.md"
    if not page.exists():
        return []
    rows = [line for line in page.read_text(encoding="utf-8").splitlines()
            if line.startswith("| ") and not line.startswith("| category")]
    return ["| category | scripts |", "|---|---|", *rows, ""] if rows else []


def _recorded() -> dict[str, dict[str, float]]:
    if not MEASURED.exists():
        return {}
    return json.loads(MEASURED.read_text(encoding="utf-8"))


def _measured_cell(record: dict[str, float] | None) -> str:
    """agreed / trials of the key's own cases on random tables, as a rate and a count."""
    if not record or not record.get("trials"):
        return ""
    return f"{record['agreed'] / record['trials']:.2f} ({record['agreed']:g}/{record['trials']:g})"


def _measured(entry: MappingEntry, measured: dict[str, dict[str, float]]) -> str:
    if entry.key.startswith("element.") and entry.status == "ported":
        return "in series.map / apply"  # its sites are folded into theirs, as their cases run it
    return _measured_cell(measured.get(entry.key))


def render(table: MappingTable) -> str:
    rules = registry()
    measured = _recorded()
    entries = sorted(table, key=lambda e: (e.area, e.key))
    counts = Counter(e.status for e in entries)
    lines = [
        "# Coverage",
        "",
        "Generated from `mappings/*.toml` and the rules' docstrings by `python -m porter.coverage`;",
        "do not edit by hand (a test fails when this page and the table disagree).",
        "",
        f"{len(entries)} pandas APIs: {counts['ported']} ported, {counts['handover']} handed over "
        f"to pandas on purpose, {counts['todo']} marked TODO with advice.",
        "",
        "Confidence is the probability that the rewrite gives pandas' result on any valid input; a",
        "rule lowers it for a particular site when it cannot rule a difference out, and says why.",
        "",
        "Measured: each key's own `cases` (in the table) run with pandas and as converted on",
        "random tables (missing values, ties, halves, unicode, 0 to 25 rows), the share that",
        f"agree, from `tests/measure_confidence.py` ({len(measured)} keys, 40 tables a case);",
        "the suite fails when a key's rate is below the confidence porter states for it.",
        "",
        "Measured on code porter did not write: the `>>>` examples of pandas' own docstrings,",
        "converted and run both ways — counts per category (same, flagged, different) in",
        "[docstrings.md](docstrings.md), refreshed on demand by `tests/external/pandas_docstrings.py`.",
        "",
        *_docstring_counts(),
    ]
    for area in sorted({e.area for e in entries}):
        lines += [f"## {area}", "",
                  "| pandas | status | Polars | confidence | measured | handles / advice |",
                  "|---|---|---|---|---|---|"]
        for entry in (e for e in entries if e.area == area):
            detail = entry.advice if entry.status == "todo" else "; ".join(entry.handles)
            if entry.notes:
                detail = f"{detail}. {entry.notes}" if detail else entry.notes
            confidence = "" if entry.status == "todo" else f"{entry.confidence:.2f}"
            lines.append(f"| `{entry.key}` | {entry.status} | {_cell(entry.polars or '')} | "
                         f"{confidence} | {_measured(entry, measured)} | "
                         f"{_cell(detail)} |")
        lines.append("")
    lines += ["## Rules", ""]
    seen: set[str] = set()
    for entry in entries:
        fn = rules.get(entry.key)
        if fn is None or fn.__name__ in seen:
            continue
        seen.add(fn.__name__)
        keys = sorted(k for k, f in rules.items() if f is fn)
        doc = inspect.getdoc(fn) or ""
        lines += [f"### `{entry.rule}` ({', '.join(f'`{k}`' for k in keys)})", "", doc, ""]
    return "\n".join(lines).rstrip() + "\n"


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(prog="python -m porter.coverage")
    parser.add_argument("--check", action="store_true")
    args = parser.parse_args(argv)
    text = render(load_table())
    if args.check:
        if not DOC.exists() or DOC.read_text(encoding="utf-8") != text:
            print(f"{DOC} is out of date: run python -m porter.coverage", file=sys.stderr)
            return 1
        return 0
    DOC.parent.mkdir(exist_ok=True)
    DOC.write_text(text, encoding="utf-8")
    return 0


if __name__ == "__main__":
    sys.exit(main())
