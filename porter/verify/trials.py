"""Randomised trials: both scripts on many small datasets drawn from the user's sample.

A sample that verifies "same" can be friendly: no missing value in a group key, no tie in a
sort key, no empty table. `porter verify --trials K` therefore runs both scripts again on K
datasets made from the sample in `--data`, drawn by hypothesis strategies, seeded and
reproducible (`--seed`; hypothesis is an extra, imported only here):

- every CSV file keeps its lines before the data (comments, the header) and its separator;
  its data rows are drawn again: whole rows of the sample (so related cells stay together)
  and rows whose cells are drawn column by column from what that column holds, so keys repeat
  and sort keys tie;
- each trial mixes in the awkward cases: empty cells (a missing value to both readers),
  numbers at rounding halves and negative zero, text in another case or with a non-ASCII
  letter, and tables of 0, 1 or 2 rows;
- files that are not CSV are copied as they are (and named in the result).

A trial on which the original script itself fails tells nothing about the conversion and is
counted as skipped. Every trial runs. Where the outputs differ, or the conversion fails where
the original runs, porter takes the first trial of each kind of disagreement (which outputs
differ; the conversion failing), at most three kinds, shrinks its data (drops rows while the
same disagreement stays), writes the smallest dataset to a folder and gives the one command
that shows it again.
"""

from __future__ import annotations

import csv
from dataclasses import dataclass, field, replace
import io
from pathlib import Path
import re
import shutil
import tempfile
from typing import Callable, Sequence

from porter.model import ConversionError, Site
from porter.rules.io_options import PANDAS_NA_TOKENS
from porter.verify.api import VerifyOptions, verify
from porter.verify.model import OutputResult, VerifyResult
from porter.verify.origins import origins

_NUMBER = re.compile(r"^\s*[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?\s*$")
_INTEGER = re.compile(r"^\s*[+-]?\d+\s*$")
_ISO_DATE = re.compile(r"^(\d{4})-(\d{2})-(\d{2})(.*)$")
# a date in another layout (05/01/2024, 5.1.24, 2024/01/05 10:00): its awkward values are
# its own, since an edit of the text would only make the script's format fail
_OTHER_DATE = re.compile(r"^\s*\d{1,4}[-/.]\d{1,2}[-/.]\d{1,4}([ T]\d{1,2}:\d{2}.*)?\s*$")
_SEPARATORS = (",", ";", "\t", "|")
_MISSING = set(PANDAS_NA_TOKENS)  # text pandas' read_csv reads as a missing value
_AGREE = ("same",)  # verdicts and output statuses that agree (rows in another order do not:
# the order of rows written is part of the output, unless --ignore-order makes it "same")


@dataclass(frozen=True)
class TrialOptions:
    trials: int = 20
    seed: int = 0
    max_rows: int = 30
    shrink_runs: int = 24  # verification runs the shrinking of one disagreement may take
    kinds: int = 3  # disagreements of different kinds shrunk and kept, at most
    out: Path | None = None  # where the smallest disagreeing dataset goes (default: the cwd)
    sample_rows: int = 10_000  # rows of each file the trials draw from (the first ones)


@dataclass(frozen=True)
class Trial:
    number: int
    rows: dict[str, int]  # data rows per varied file
    verdict: str  # same | same-unordered | different | error | skipped
    detail: str = ""


@dataclass(frozen=True)
class Disagreement:
    trial: int
    folder: str  # the smallest dataset that still shows it
    command: str  # the one line that shows it again
    rows: dict[str, int]
    outputs: tuple[OutputResult, ...]  # the outputs that differ there
    converted_stderr: str = ""  # when the conversion failed where the original ran
    shrink_runs: int = 0
    # the conversion's sites on the lines behind the differing outputs, nearest first
    # (porter.verify.origins): where to look
    nearest_sites: tuple[Site, ...] = ()

    def to_json(self) -> dict[str, object]:
        return {"trial": self.trial, "folder": self.folder, "command": self.command,
                "rows": self.rows, "outputs": [o.to_json() for o in self.outputs],
                "converted_stderr_tail": "\n".join(self.converted_stderr.splitlines()[-20:]),
                "shrink_runs": self.shrink_runs,
                "nearest_sites": [s.to_json() for s in self.nearest_sites]}


@dataclass(frozen=True)
class TrialsResult:
    seed: int
    trials: tuple[Trial, ...]
    varied: tuple[str, ...]  # the CSV files each trial draws again
    copied: tuple[str, ...]  # other files, copied as they are
    disagreements: tuple[Disagreement, ...] = ()

    @property
    def agreed(self) -> int:
        return sum(t.verdict in _AGREE for t in self.trials)

    @property
    def skipped(self) -> int:
        return sum(t.verdict == "skipped" for t in self.trials)

    def to_json(self) -> dict[str, object]:
        return {"seed": self.seed, "run": len(self.trials), "agreed": self.agreed,
                "skipped": self.skipped, "varied": list(self.varied), "copied": list(self.copied),
                "trials": [{"trial": t.number, "rows": t.rows, "verdict": t.verdict,
                            "detail": t.detail} for t in self.trials],
                "disagreements": [d.to_json() for d in self.disagreements]}


# --- the sample's tables --------------------------------------------------------------------

@dataclass
class _Column:
    cells: list[str]  # what the sample holds, as written
    kind: str  # "int", "float", "text"
    edges: list[str] = field(default_factory=list)


@dataclass
class _Table:
    """A CSV file of the sample: the lines before its data as they are, its rows as cells."""

    path: str  # relative to the data folder
    head: list[str]
    separator: str
    rows: list[list[str]]
    columns: list[_Column]


def _read_table(root: Path, path: Path, sample_rows: int = 10_000) -> _Table | None:
    """The file as lines before the data and rows of cells; None when its rows do not all
    split into the header's number of cells (the file is then copied as it is)."""
    lines: list[str] = []
    body: list[str] = []
    try:  # the lines before the data, then at most sample_rows data lines (a big file is
        # not read whole)
        with path.open(encoding="utf-8-sig") as handle:
            for line in handle:
                line = line.rstrip("\r\n")
                if not lines or not lines[-1].strip() or lines[-1].lstrip().startswith("#"):
                    lines.append(line)
                elif line.strip():
                    body.append(line)
                    if len(body) >= sample_rows:
                        break
    except (OSError, UnicodeDecodeError):
        return None
    first = next((i for i, line in enumerate(lines) if line.strip()
                  and not line.lstrip().startswith("#")), None)
    if first is None:
        return None
    header = lines[first]
    separator = max(_SEPARATORS, key=header.count)
    width = len(next(csv.reader([header], delimiter=separator)))
    rows = list(csv.reader(body, delimiter=separator))
    if width < 1 or any(len(row) != width for row in rows) or not rows:
        return None
    columns = [_column([row[i] for row in rows]) for i in range(width)]
    return _Table(str(path.relative_to(root)), lines[:first + 1], separator, rows, columns)


def _column(cells: list[str]) -> _Column:
    present = [c for c in cells if c.strip() and c not in _MISSING]
    # a column of numbers with a few markers the script reads as missing ("-", "n/a" given
    # to na_values) is a column of numbers: its awkward values are numbers
    numbers = [c for c in present if _NUMBER.match(c)]
    if present and len(numbers) >= 0.8 * len(present):
        kind = "int" if all(_INTEGER.match(c) for c in numbers) else "float"
        return _Column(cells, kind, _edges(numbers, kind))
    return _Column(cells, "text", _edges(present, "text"))


def _edges(present: list[str], kind: str) -> list[str]:
    """Awkward values of the column's own kind, made from what it holds."""
    distinct = sorted(set(present))[:20]
    if kind == "int":
        return ["0", "-1", *distinct[:3]]
    if kind == "float":
        halves = []
        for cell in distinct[:6]:
            whole = int(float(cell))
            halves += [f"{whole}.5", f"{whole + 1}.5", f"-{abs(whole)}.5"]
        return ["0.0", "-0.0", "0.125", "2.675", *halves]
    edges = []
    for cell in distinct[:6]:
        date = _ISO_DATE.match(cell)
        if not date and _OTHER_DATE.match(cell):
            continue
        if date:  # the ends of months and years, in the same layout
            edges += [day + date.group(4)
                      for day in ("2023-12-31", "2024-01-01", "2024-02-29", "2024-03-31")]
        else:  # another case, a letter outside ASCII
            edges += [cell.upper(), cell.lower(), cell + "é"]
    return edges


# --- drawing a trial ------------------------------------------------------------------------

def _datasets(tables: list[_Table], options: TrialOptions) -> list[dict[str, list[list[str]]]]:
    """`options.trials` datasets drawn by hypothesis, seeded: the same seed (and hypothesis
    version) draws the same ones. Each holds, for every varied table, its rows."""
    try:
        from hypothesis import HealthCheck, Phase, given, seed, settings
        from hypothesis import strategies as st
    except ImportError as exc:  # an extra: pip install "porter[trials]"
        raise ConversionError("the randomised trials draw their data with hypothesis, which is "
                              "not installed: pip install 'porter[trials]'") from exc

    @st.composite
    def row(draw, table: _Table, missing: int, awkward: int) -> list[str]:
        # a whole row of the sample (its cells belong together) or one cell from each column
        if draw(st.booleans()):
            cells = list(draw(st.sampled_from(table.rows)))
        else:
            cells = [draw(st.sampled_from(column.cells)) for column in table.columns]
        for i, column in enumerate(table.columns):
            roll = draw(st.integers(0, 99))
            if roll < missing:
                cells[i] = ""
            elif roll < missing + awkward and column.edges:
                cells[i] = draw(st.sampled_from(column.edges))
        return cells

    @st.composite
    def dataset(draw) -> dict[str, list[list[str]]]:
        # per dataset: how often a cell is empty and how often it is awkward (percent)
        missing = draw(st.sampled_from([0, 10, 30]))
        awkward = draw(st.sampled_from([0, 10, 25]))
        drawn = {}
        for table in tables:  # 0 to max_rows rows; hypothesis favours the ends: 0, 1, max_rows
            size = draw(st.integers(0, options.max_rows))
            drawn[table.path] = draw(st.lists(row(table, missing, awkward),
                                              min_size=size, max_size=size))
        return drawn

    found: list[dict[str, list[list[str]]]] = []
    seen: set[str] = set()

    def keep(drawn: dict[str, list[list[str]]]) -> None:
        if repr(drawn) not in seen and len(found) < options.trials:
            seen.add(repr(drawn))
            found.append(drawn)

    for attempt in range(8):  # a dataset drawn twice counts once: draw again for the rest
        if len(found) >= options.trials:
            break
        run = seed(options.seed * 1000 + attempt)(settings(
            max_examples=options.trials, phases=[Phase.generate], database=None,
            deadline=None, suppress_health_check=list(HealthCheck))(given(dataset())(keep)))
        run()
    return found


def _write_table(table: _Table, rows: list[list[str]], folder: Path) -> None:
    out = io.StringIO()
    writer = csv.writer(out, delimiter=table.separator, lineterminator="\n")
    writer.writerows(rows)
    target = folder / table.path
    target.parent.mkdir(parents=True, exist_ok=True)
    target.write_text("\n".join(table.head) + "\n" + out.getvalue(), encoding="utf-8")


# what porter itself leaves in a folder: the data of trials and samples, never an input
_OWN_PREFIXES = ("porter-trial-", "porter-sample-")


def _own(path: Path, data: Path) -> bool:
    return any(part.startswith(_OWN_PREFIXES) for part in path.relative_to(data).parts)


def _dataset(data: Path, tables: list[_Table], drawn: dict[str, list[list[str]]],
             folder: Path) -> Path:
    """A copy of the data folder with the varied tables written over their files (porter's
    own trial folders left out: the copy may be made inside the data folder)."""
    shutil.copytree(data, folder,
                    ignore=shutil.ignore_patterns(*(p + "*" for p in _OWN_PREFIXES)))
    for table in tables:
        _write_table(table, drawn[table.path], folder)
    return folder


# --- running --------------------------------------------------------------------------------

def _disagrees(result: VerifyResult) -> bool:
    if result.original.exit_code != 0:
        return False
    return result.verdict not in _AGREE


def _kind(result: VerifyResult) -> object:
    """What the disagreement is: the conversion failing, or which outputs differ. Shrinking
    keeps it, so that the smallest dataset shows the same problem, not another one."""
    if result.converted.exit_code != 0:
        return "the converted script failed"
    return frozenset(o.name for o in result.outputs
                     if o.comparison.status not in _AGREE)


def run_trials(original: str | Path, converted_text: str, data_dir: str | Path,
               options: TrialOptions, verify_options: VerifyOptions | None = None,
               progress: Callable[[str], None] | None = None,
               converted_path: str | None = None, sites: Sequence[Site] = ()) -> TrialsResult:
    """Run both scripts on `options.trials` datasets drawn from `data_dir` (see the module).
    `sites` are the conversion's (`FileResult.sites`): each disagreement names those nearest
    the lines behind the outputs that differ."""
    data = Path(data_dir)
    if not data.is_dir():
        raise ConversionError("no such folder (--data is the folder the script runs in)", str(data))
    verify_options = replace(verify_options or VerifyOptions(), timing_runs=0, keep=False)
    tables, copied = [], []
    for path in sorted(p for p in data.rglob("*") if p.is_file() and not _own(p, data)):
        table = _read_table(data, path, options.sample_rows) \
            if path.suffix.lower() in (".csv", ".txt", ".tsv") else None
        if table is None and path.suffix != ".py":
            copied.append(str(path.relative_to(data)))
        elif table is None:
            continue
        else:
            tables.append(table)
    say = progress or (lambda _: None)
    trials: list[Trial] = []
    found: list[Disagreement] = []
    kinds: set[object] = set()
    work = Path(tempfile.mkdtemp(prefix="porter-trials-"))
    try:
        for number, drawn in enumerate(_datasets(tables, options), start=1):
            folder = _dataset(data, tables, drawn, work / f"trial-{number}")
            result = verify(original, converted_text, folder, verify_options)
            shutil.rmtree(folder, ignore_errors=True)
            rows = {path: len(r) for path, r in drawn.items()}
            if result.original.exit_code != 0:
                trial = Trial(number, rows, "skipped", "the original script fails on this data")
            else:
                trial = Trial(number, rows, result.verdict, _summary(result))
            trials.append(trial)
            say(f"trial {number}/{options.trials}: {trial.verdict}"
                + (f" ({trial.detail})" if trial.detail else ""))
            if _disagrees(result) and _kind(result) not in kinds and len(kinds) < options.kinds:
                kinds.add(_kind(result))
                shrunk = _shrink(original, converted_text, data, tables, drawn, result,
                                 number, options, verify_options, work, say, converted_path)
                found.append(replace(shrunk, nearest_sites=_nearest(original, shrunk, sites)))
    finally:
        shutil.rmtree(work, ignore_errors=True)
    return TrialsResult(options.seed, tuple(trials), tuple(t.path for t in tables), tuple(copied),
                        tuple(found))


def _summary(result: VerifyResult) -> str:
    odd = [o for o in result.outputs if o.comparison.status not in _AGREE]
    if result.converted.exit_code != 0:
        return f"the converted script {result.converted.failure or 'failed'}"
    return "; ".join(f"{o.name}: {o.comparison.status}" for o in odd[:3])


def _shrink(original: str | Path, converted_text: str, data: Path, tables: list[_Table],
            drawn: dict[str, list[list[str]]], result: VerifyResult, number: int,
            options: TrialOptions, verify_options: VerifyOptions, work: Path,
            say: Callable[[str], None], converted_path: str | None) -> Disagreement:
    """Drop rows (halves, then single rows) while both scripts still disagree; write the
    smallest dataset found within `options.shrink_runs` runs."""
    runs = 0
    kind = _kind(result)
    current = {path: list(rows) for path, rows in drawn.items()}

    def still(candidate: dict[str, list[list[str]]]) -> VerifyResult | None:
        nonlocal runs
        runs += 1
        folder = _dataset(data, tables, candidate, work / f"shrink-{runs}")
        try:
            attempt = verify(original, converted_text, folder, verify_options)
        finally:
            shutil.rmtree(folder, ignore_errors=True)
        return attempt if _disagrees(attempt) and _kind(attempt) == kind else None

    for path in sorted(current, key=lambda p: -len(current[p])):
        chunk = max(1, len(current[path]) // 2)
        while runs < options.shrink_runs:
            start = 0
            while start < len(current[path]) and runs < options.shrink_runs:
                candidate = dict(current)
                candidate[path] = current[path][:start] + current[path][start + chunk:]
                attempt = still(candidate)
                if attempt is None:
                    start += chunk
                    continue
                current, result = candidate, attempt
                say(f"shrinking: {sum(map(len, current.values()))} rows left")
            if chunk == 1:
                break
            chunk //= 2
    out = (options.out or Path.cwd()) / f"porter-trial-{options.seed}-{number}"
    if out.exists():
        shutil.rmtree(out)
    _dataset(data, tables, current, out)
    script = str(original)
    command = f"porter verify {script}" + (f" {converted_path}" if converted_path else "") \
        + f" --data {out}"
    differing = tuple(o for o in result.outputs
                      if o.comparison.status not in _AGREE)
    stderr = result.converted.stderr if result.converted.exit_code != 0 else ""
    return Disagreement(number, str(out), command, {p: len(r) for p, r in current.items()},
                        differing, stderr, runs)


def _nearest(original: str | Path, disagreement: Disagreement, sites: Sequence[Site],
             most: int = 5) -> tuple[Site, ...]:
    """The sites on the `most` lines nearest the differing outputs, among the statements
    behind them, nearest first."""
    if not sites or not disagreement.outputs:
        return ()
    try:
        source = Path(original).read_text(encoding="utf-8")
    except (OSError, UnicodeDecodeError):
        return ()
    distance: dict[Site, tuple[int, int]] = {}
    for output in disagreement.outputs:
        for origin in origins(source, output.name):
            for site in sites:
                if site.cell is None and origin.line <= site.line <= origin.end_line:
                    rank = (origin.distance, -site.line)
                    distance[site] = min(distance.get(site, rank), rank)
    ordered = sorted(distance, key=lambda site: (distance[site], site.key))
    lines = list(dict.fromkeys(site.line for site in ordered))[:most]
    return tuple(site for site in ordered if site.line in lines)


def render(trials: TrialsResult) -> str:
    """The trials on a terminal."""
    run = len(trials.trials)
    lines = [f"porter trials (seed {trials.seed}): {trials.agreed} of {run} agreed, "
             f"{trials.skipped} skipped (the original script failed on that data)"]
    if trials.copied:
        lines.append(f"  copied as they are (not varied): {', '.join(trials.copied)}")
    if not trials.varied:
        lines.append("  no CSV file to vary: every trial ran on the sample as it is")
    disagreeing = sum(t.verdict not in (*_AGREE, "skipped")
                      for t in trials.trials)
    if disagreeing:
        lines.append(f"  {disagreeing} trial(s) disagreed; {len(trials.disagreements)} kind(s) "
                     "of disagreement, each shrunk to the smallest data found:")
    for d in trials.disagreements:
        rows = ", ".join(f"{path} {n} rows" for path, n in d.rows.items())
        lines += [f"  DISAGREEMENT first seen on trial {d.trial}; the smallest data ({rows}) "
                  f"is in", f"    {d.folder}", "  show it again with:", f"    {d.command}"]
        for o in d.outputs:
            lines.append(f"  {o.name}: {o.comparison.status} {o.comparison.detail}".rstrip())
            for row, a, b in o.comparison.first_rows[:3]:
                lines.append(f"      row {row}: original  {a}")
                lines.append(f"      {' ' * len(str(row))}     converted {b}")
        if d.nearest_sites:
            lines.append("  the converted sites nearest the lines behind it:")
            by_line: dict[int, list[Site]] = {}
            for site in d.nearest_sites:
                by_line.setdefault(site.line, []).append(site)
            lines += [f"    line {line}: " + ", ".join(
                f"{s.key} ({s.status}, confidence {s.confidence:g})" for s in sites)
                for line, sites in by_line.items()]
        if d.converted_stderr:
            lines.append("  the converted script failed; last lines of its stderr:")
            lines += ["    " + line for line in d.converted_stderr.splitlines()[-8:]]
    return "\n".join(lines)
