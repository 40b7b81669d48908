"""Measured confidence: each mapping key's own cases, run with pandas and as converted on
many random tables.

A key's `cases` in `mappings/*.toml` are a few lines of pandas that end by binding `result`,
written against one table, `t.csv`, read as

    df = pd.read_csv("t.csv", parse_dates=["d"])

whose columns are always these (see COLUMNS): `k` and `g` text keys that repeat (with a
missing value, another case, a letter outside ASCII), `n` whole numbers that are never
missing, `m` whole numbers with a missing value (float in pandas), `v` floats with NaN, halves
and negative zero, `s` free text (padding, case, unicode, a comma), `d` dates across month and
year ends, `b` True/False.

Each case is converted once, with a sample of the table as --data (so the scan has the
columns' types), then run on `trials` tables drawn at random (seeded: the same seed draws the
same tables): 0, 1 or 2 rows now and then, otherwise up to 25, a share of missing values that
changes from table to table. A trial on which pandas itself raises tells nothing and is
skipped; otherwise the converted case agrees when it runs and its `result` is pandas' (the
comparison of tests/support.py: floats within 1e-9 of each other, and to the last digit
where every site of the case is stated at 1.0). The measured rate of a key is agreements /
trials run.

    python tests/measure_confidence.py     # every key, 40 trials, into docs/confidence.json
"""

from __future__ import annotations

import contextlib
from dataclasses import dataclass, field
import io
import os
from pathlib import Path
import random
import tempfile
import textwrap
from typing import Any, Iterator

from porter.api import convert_source
from porter.mapping import MappingEntry, load_table
from porter.model import Options
from support import assert_same_value, exact_floats, run

PREAMBLE = """\
import numpy as np
import pandas as pd
df = pd.read_csv("t.csv", parse_dates=["d"])
"""

MISSING = ""  # an empty field: missing to both readers


@dataclass(frozen=True)
class Column:
    values: tuple[str, ...]  # what a cell may hold, as written in the file
    missing: bool = True  # may a cell be empty
    needs_missing: bool = False  # is one cell always empty (keeps pandas' float64 for ints)
    text: bool = False  # is one cell always text that is not a number (keeps it text)


COLUMNS: dict[str, Column] = {
    "k": Column(("a", "b", "B", "é", "a", "b", "ça va")),
    "g": Column(("x", "y", "z", "x")),
    "n": Column(("-2", "-1", "0", "1", "2", "3", "5", "10", "3"), missing=False),
    "m": Column(("0", "1", "2", "3", "-1", "7"), needs_missing=True),
    "v": Column(("0.5", "1.5", "2.5", "-0.5", "-0.0", "0.125", "2.675", "1.0", "3.25",
                 "1e-05", "100.0", "0.0", "-7.75")),
    "s": Column(("Hello World", " padded ", "ÉCOLE", "x-1", "a,b", "straße", "mixed Case",
                 "42", "a_b c"), text=True),
    "d": Column(("2024-01-31", "2023-12-31", "2024-02-29", "2024-03-01", "2024-01-01",
                 "2024-06-15", "2023-12-31")),
    "b": Column(("True", "False", "True"), missing=False),
}


def _number(cell: str) -> bool:
    try:
        float(cell)
    except ValueError:
        return False
    return True


def _cell(value: str) -> str:
    return f'"{value}"' if "," in value or value.startswith(" ") or value.endswith(" ") else value


def table_text(rows: list[dict[str, str]]) -> str:
    lines = [",".join(COLUMNS)]
    lines += [",".join(_cell(row[name]) for name in COLUMNS) for row in rows]
    return "\n".join(lines) + "\n"


def draw(rnd: random.Random) -> list[dict[str, str]]:
    """One random table: 0, 1 or 2 rows now and then, else 3 to 25; each column's cells from
    its values, a share of them missing (0, 10 % or 30 % for this table)."""
    roll = rnd.random()
    count = 0 if roll < 0.05 else 1 if roll < 0.12 else 2 if roll < 0.19 else rnd.randint(3, 25)
    share = rnd.choice([0.0, 0.1, 0.3])
    rows = [{name: (MISSING if col.missing and rnd.random() < share else rnd.choice(col.values))
             for name, col in COLUMNS.items()} for _ in range(count)]
    for name, col in COLUMNS.items():
        cells = [row[name] for row in rows]
        if rows and col.needs_missing and MISSING not in cells:
            rows[rnd.randrange(count)][name] = MISSING
        if rows and all(c == MISSING for c in cells) and not col.needs_missing:
            # an all-missing column is float64 in pandas whatever it holds elsewhere
            rows[rnd.randrange(count)][name] = rnd.choice(col.values)
        if count > 1 and col.needs_missing and all(row[name] == MISSING for row in rows):
            rows[0][name] = rnd.choice(col.values)
        if rows and col.text and all(
                _number(row[name]) or row[name] == MISSING for row in rows):
            # a text column of numbers only ("42") is a number column to pandas
            rows[rnd.randrange(count)][name] = col.values[0]
    return rows


def sample() -> str:
    """The table the cases are converted with (--data): every value of every column, and a
    missing one where a column may have one."""
    width = max(len(col.values) for col in COLUMNS.values())
    rows = [{name: col.values[i % len(col.values)] for name, col in COLUMNS.items()}
            for i in range(width)]
    for name, col in COLUMNS.items():
        if col.missing:
            rows[-1][name] = MISSING
    return table_text(rows)


@contextlib.contextmanager
def _inside(folder: Path) -> Iterator[None]:
    here = os.getcwd()
    os.chdir(folder)
    try:
        with contextlib.redirect_stdout(io.StringIO()):
            yield
    finally:
        os.chdir(here)


@dataclass
class Measure:
    key: str
    declared: float
    stated: float  # the lowest confidence porter gave the key's sites in the cases
    trials: int = 0  # trials run (pandas ran)
    agreed: int = 0
    skipped: int = 0  # pandas itself raised
    first_difference: str = ""  # the case and the table of the first disagreement, and why
    unported: list[str] = field(default_factory=list)  # cases whose site of the key is a TODO

    @property
    def rate(self) -> float | None:
        return self.agreed / self.trials if self.trials else None


def case_source(case: str) -> str:
    return PREAMBLE + textwrap.dedent(case).strip() + "\n"


def measure(entry: MappingEntry, trials: int, seed: int = 0) -> Measure:
    """Run the key's cases on `trials` random tables each (see the module)."""
    cases = [str(c) for c in entry.extra.get("cases", ())]  # type: ignore[union-attr]
    result = Measure(entry.key, entry.confidence, entry.confidence)
    with tempfile.TemporaryDirectory(prefix="porter-cases-") as tmp:
        folder = Path(tmp)
        (folder / "t.csv").write_text(sample(), encoding="utf-8")
        for number, case in enumerate(cases):
            source = case_source(case)
            converted = convert_source(source, options=Options(data_dir=str(folder)))
            sites = [s for s in converted.sites if s.key == entry.key]
            if not sites or any(s.status == "todo" for s in sites):
                result.unported.append(case)
                continue
            result.stated = min([result.stated, *(s.confidence for s in sites)])
            # (the read of t.csv is lowered for files whose values would not fit the types
            # read from the sample, which says nothing about digits)
            exact = all(s.confidence >= 1.0 for s in converted.sites if s.key != "pd.read_csv")
            for trial in range(trials):
                rows = draw(random.Random(f"{seed}:{entry.key}:{number}:{trial}"))
                (folder / "t.csv").write_text(table_text(rows), encoding="utf-8")
                # a case whose every site is stated at 1.0 computes pandas' numbers to the
                # last digit; below, a last-digit difference is among what a lowered
                # confidence says may differ
                outcome = _one(source, converted.converted_text, folder, exact=exact)
                if outcome is None:
                    result.skipped += 1
                    continue
                result.trials += 1
                if outcome == "":
                    result.agreed += 1
                elif not result.first_difference:
                    result.first_difference = (f"case:\n{case}\ntable:\n{table_text(rows)}"
                                               f"{outcome}\nconverted:\n{converted.converted_text}")
            (folder / "t.csv").write_text(sample(), encoding="utf-8")
    return result


def _one(source: str, converted: str, folder: Path, exact: bool = False) -> str | None:
    """None when pandas raises; "" when the conversion agrees (its floats to the last digit
    when `exact`); else what differs."""
    try:
        with _inside(folder):
            expected = run(source)["result"]
    except Exception:
        return None
    try:
        with _inside(folder):
            actual: Any = run(converted)["result"]
            if hasattr(actual, "collect"):  # a LazyFrame reads t.csv when collected
                actual = actual.collect()
    except Exception as exc:
        return f"the conversion raised {type(exc).__name__}: {str(exc)[:300]}"
    try:
        with exact_floats() if exact else contextlib.nullcontext():
            assert_same_value(expected, actual)
    except AssertionError as exc:
        return str(exc)[:600]
    return ""


def cases_digest(entry: MappingEntry) -> str:
    """A fingerprint of the key's cases and stated confidence: a recorded rate is for these."""
    import hashlib
    text = repr((list(entry.extra.get("cases", ())), entry.confidence))  # type: ignore[arg-type]
    return hashlib.sha256(text.encode("utf-8")).hexdigest()[:16]


def entries_with_cases() -> list[MappingEntry]:
    return [e for e in load_table() if e.extra.get("cases")]
