"""The page model of the review: plain data built from the same report model as the JSON report.

Per file, the original and converted lines are aligned with `difflib.SequenceMatcher` into rows;
long unchanged stretches are folded; every site is placed on its source line (left) and on the
converted row its line maps to (right); `# TODO(porter)` comment lines are TODO rows.
Code text is kept raw here: escaping (and highlighting) is the renderer's job.
"""

from __future__ import annotations

from dataclasses import dataclass, field
import difflib
import json
import re
from typing import Literal

from porter.mapping import MappingTable, load_table
from porter.model import FileResult, Site
from porter.reports import folder_report
from porter.verify.model import VerifyResult
from porter.verify.trials import TrialsResult, render as render_trials
from porter.verify.text import speed_claim, time_range, what_is_measured

RowKind = Literal["equal", "replace", "insert", "delete"]
Level = Literal["high", "medium", "low"]

CONTEXT = 3  # unchanged lines kept visible around a change
TODO_COMMENT = re.compile(r"^\s*#\s*TODO\(porter\)\s*:?\s*(?P<key>[\w.\[\]]+)?")
DEFAULT_LOW = 0.9


def confidence_level(confidence: float) -> Level:
    if confidence >= 0.95:
        return "high"
    if confidence >= 0.8:
        return "medium"
    return "low"


@dataclass
class SiteView:
    """One converted site, as the page shows it on both sides."""

    id: str
    key: str
    rule: str
    status: str
    confidence: float
    level: Level
    low: bool  # below the page's --low threshold
    message: str
    line: int  # in the source (cell-relative for notebooks)
    end_line: int
    converted_line: int | None = None  # where it lands on the right, 1-based; None: deleted
    handles: tuple[str, ...] = ()
    notes: str = ""
    advice: str = ""
    polars: str = ""

    @property
    def tooltip(self) -> str:
        parts = [f"{self.key} · {self.rule} · {self.status} · confidence {self.confidence:.2f}"]
        if self.message:
            parts.append(self.message)
        return "\n".join(parts)  # what the rule handles is told once per page, by key


@dataclass
class Todo:
    id: str  # the anchor, "todo-N", unique on the page
    file_id: str
    source: str
    key: str
    line: int | None  # source line (None: a marker with no site)
    converted_line: int | None
    text: str  # the advice shown (the site's message, or the comment's text)
    advice: str = ""  # the mapping table's advice
    cell: int | None = None


@dataclass
class Side:
    number: int  # 1-based line number in its text
    text: str


@dataclass
class Row:
    kind: RowKind
    left: Side | None
    right: Side | None
    left_sites: list[SiteView] = field(default_factory=list)
    right_sites: list[SiteView] = field(default_factory=list)
    todos: list[Todo] = field(default_factory=list)
    todo_comment: bool = False  # the right side is a `# TODO(porter)` comment

    @property
    def quiet(self) -> bool:
        """Nothing to see: unchanged, no site, no TODO (may be folded)."""
        return self.kind == "equal" and not (self.left_sites or self.right_sites or self.todos
                                             or self.todo_comment)


@dataclass
class Chunk:
    rows: list[Row]
    folded: bool = False


@dataclass
class Block:
    """One side-by-side view: the whole script, or one code cell of a notebook."""

    title: str | None
    chunks: list[Chunk]
    cell: int | None = None

    @property
    def rows(self) -> list[Row]:
        return [r for c in self.chunks for r in c.rows]


@dataclass
class OutputView:
    name: str
    kind: str
    status: str
    detail: str
    differing_cells: int
    first_rows: list[tuple[int, list[object], list[object]]]


@dataclass
class SideRunView:
    exit_code: int | None
    wall_s: float  # the script's own: the median over `runs` runs
    peak_mib: float | None
    failure: str | None
    runs: int = 1
    time_range: str = ""  # "0.41–0.47s" over the runs, "" after one
    capture_s: float | None = None


@dataclass
class VerdictView:
    verdict: str
    outputs: list[OutputView]
    original: SideRunView
    converted: SideRunView
    notes: list[str]
    measured: str = ""  # what the time and memory columns are, and how many runs
    speed: str | None = None  # the speed claim, with the runs it rests on
    trials: str | None = None  # the randomised trials, as `porter verify --trials` prints them


@dataclass
class FileView:
    id: str
    source: str
    output: str | None
    status: str
    error: str | None
    summary: dict[str, object]  # `FileResult.to_json()["summary"]`
    blocks: list[Block]
    sites: list[SiteView]
    todos: list[Todo]
    verdict: VerdictView | None = None

    @property
    def lowest_confidence(self) -> float | None:
        value = self.summary.get("lowest_confidence")
        return None if value is None else float(value)  # type: ignore[arg-type]

    @property
    def lowest_level(self) -> Level | None:
        low = self.lowest_confidence
        return None if low is None else confidence_level(low)


@dataclass
class Page:
    title: str
    files: list[FileView]
    summary: dict[str, object]  # the JSON report's summary (`folder_report`)
    todos: list[Todo]
    low: float
    folder: bool

    @property
    def verified(self) -> bool:
        return any(f.verdict for f in self.files)

    @property
    def verdicts(self) -> dict[str, int]:
        counts: dict[str, int] = {}
        for f in self.files:
            if f.verdict:
                counts[f.verdict.verdict] = counts.get(f.verdict.verdict, 0) + 1
        return counts


# ------------------------------------------------------------------ alignment

ASSIGNED = re.compile(r"([\w.]+(?:\[[^\]]*\])?)\s*=(?!=)")
SIMILAR = 0.45  # lines of a replaced block this alike share a row
DP_LIMIT = 250_000  # larger replaced blocks pair up in order (no similarity search)


def _similarity(a: str, b: str) -> float:
    if TODO_COMMENT.match(b):
        return 0.0  # a TODO comment stands on a row of its own
    a, b = a.strip(), b.strip()
    if not a or not b:
        return 1.0 if a == b else 0.0
    target_a, target_b = ASSIGNED.match(a), ASSIGNED.match(b)
    same_target = bool(target_a and target_b and target_a.group(1) == target_b.group(1))
    matcher = difflib.SequenceMatcher(None, a, b, autojunk=False)
    ratio = matcher.ratio() if same_target or matcher.quick_ratio() >= SIMILAR else 0.0
    if same_target:  # `x = pandas code` and `x = Polars code`: the same statement
        ratio = max(ratio, SIMILAR + 0.05)
    return ratio if ratio >= SIMILAR else 0.0


def _split_replace(a: list[str], i1: int, i2: int, b: list[str], j1: int, j2: int):
    """Rows of a replaced block: the pairing of its lines that keeps the order and makes the
    pairs as alike as possible; the lines left over stand alone (deleted or inserted)."""
    n, m = i2 - i1, j2 - j1
    pairs: list[tuple[int, int]] = []
    if n * m <= DP_LIMIT:
        sim = [[_similarity(a[i1 + i], b[j1 + j]) for j in range(m)] for i in range(n)]
        score = [[0.0] * (m + 1) for _ in range(n + 1)]
        for i in range(n - 1, -1, -1):
            for j in range(m - 1, -1, -1):
                best = max(score[i + 1][j], score[i][j + 1])
                if sim[i][j]:
                    best = max(best, score[i + 1][j + 1] + sim[i][j])
                score[i][j] = best
        i = j = 0
        while i < n and j < m:
            if sim[i][j] and score[i][j] == score[i + 1][j + 1] + sim[i][j]:
                pairs.append((i1 + i, j1 + j))
                i, j = i + 1, j + 1
            elif score[i][j] == score[i + 1][j]:
                i += 1
            else:
                j += 1
    else:
        rights = [j for j in range(j1, j2) if not TODO_COMMENT.match(b[j])]
        pairs = list(zip(range(i1, i2), rights))
    i, j = i1, j1
    for pi, pj in pairs + [(i2, j2)]:
        while i < pi:
            yield "delete", i, None
            i += 1
        while j < pj:
            yield "insert", None, j
            j += 1
        if pi < i2:
            yield "replace", pi, pj
            i, j = pi + 1, pj + 1


def align(original: str, converted: str) -> list[Row]:
    """The two texts side by side, row by row."""
    a, b = original.splitlines(), converted.splitlines()
    rows: list[Row] = []
    matcher = difflib.SequenceMatcher(None, a, b, autojunk=False)
    for tag, i1, i2, j1, j2 in matcher.get_opcodes():
        if tag == "equal":
            rows += [Row("equal", Side(i + 1, a[i]), Side(j + 1, b[j]))
                     for i, j in zip(range(i1, i2), range(j1, j2))]
        elif tag == "delete":
            rows += [Row("delete", Side(i + 1, a[i]), None) for i in range(i1, i2)]
        elif tag == "insert":
            rows += [Row("insert", None, Side(j + 1, b[j]), todo_comment=bool(TODO_COMMENT.match(b[j])))
                     for j in range(j1, j2)]
        else:
            for kind, i, j in _split_replace(a, i1, i2, b, j1, j2):
                rows.append(Row(kind, None if i is None else Side(i + 1, a[i]),
                                None if j is None else Side(j + 1, b[j]),
                                todo_comment=j is not None and bool(TODO_COMMENT.match(b[j]))))
    return rows


def fold(rows: list[Row], context: int = CONTEXT) -> list[Chunk]:
    """Runs of quiet rows longer than 2×context+1 are folded, keeping `context` rows each side
    (none at the start or end of the text)."""
    chunks: list[Chunk] = []
    visible: list[Row] = []
    index = 0
    while index < len(rows):
        if not rows[index].quiet:
            visible.append(rows[index])
            index += 1
            continue
        end = index
        while end < len(rows) and rows[end].quiet:
            end += 1
        run = rows[index:end]
        head = 0 if index == 0 else context
        tail = 0 if end == len(rows) else context
        if len(run) - head - tail > max(1, context):
            visible += run[:head]
            if visible:
                chunks.append(Chunk(visible))
            chunks.append(Chunk(run[head:len(run) - tail], folded=True))
            visible = list(run[len(run) - tail:])
        else:
            visible += run
        index = end
    if visible:
        chunks.append(Chunk(visible))
    return chunks


def _right_row(rows: list[Row], line: int) -> int | None:
    """Index of the row holding source line `line`, moved to a row with a right side when the
    line itself was deleted (the nearest following row of the same change, else preceding)."""
    at = next((k for k, r in enumerate(rows) if r.left and r.left.number == line), None)
    if at is None:
        return None
    if rows[at].right is not None:
        return at
    for k in range(at + 1, len(rows)):
        if rows[k].kind == "equal":
            break
        if rows[k].right is not None and not rows[k].todo_comment:
            return k
    for k in range(at - 1, -1, -1):
        if rows[k].kind == "equal":
            break
        if rows[k].right is not None and not rows[k].todo_comment:
            return k
    return None


# ------------------------------------------------------------------ building

class _Ids:
    def __init__(self) -> None:
        self.sites = 0
        self.todos = 0

    def site(self) -> str:
        self.sites += 1
        return f"site-{self.sites}"

    def todo(self) -> str:
        self.todos += 1
        return f"todo-{self.todos}"


def site_view(site: Site, table: MappingTable, ids: _Ids, low: float) -> SiteView:
    entry = table.get(site.key)
    return SiteView(
        id=ids.site(), key=site.key, rule=site.rule, status=site.status,
        confidence=site.confidence, level=confidence_level(site.confidence),
        low=site.status != "todo" and site.confidence < low,
        message=site.message, line=site.line, end_line=site.end_line,
        handles=entry.handles if entry else (), notes=entry.notes if entry else "",
        advice=entry.advice if entry else "", polars=(entry.polars or "") if entry else "")


def build_block(original: str, converted: str, sites: list[SiteView], *, file_id: str,
                source: str, ids: _Ids, title: str | None = None, cell: int | None = None,
                context: int = CONTEXT) -> tuple[Block, list[Todo]]:
    rows = align(original, converted)
    todos: list[Todo] = []
    claimed: set[int] = set()
    for site in sorted(sites, key=lambda s: (s.line, s.end_line)):
        left = next((r for r in rows if r.left and r.left.number == site.line), None)
        if left is not None:
            left.left_sites.append(site)
        k = _right_row(rows, site.line)
        if k is not None:
            rows[k].right_sites.append(site)
            site.converted_line = rows[k].right.number  # type: ignore[union-attr]
        if site.status != "todo":
            continue
        # its `# TODO(porter)` comment: the nearest unclaimed one just above where it landed
        anchor = k
        if k is not None:
            for c in range(k, max(-1, k - 12), -1):
                if c in claimed or not rows[c].todo_comment:
                    continue
                key = TODO_COMMENT.match(rows[c].right.text).group("key")  # type: ignore[union-attr]
                if key in (None, site.key) or not site.key:
                    anchor = c
                    claimed.add(c)
                    break
        todo = Todo(id=ids.todo(), file_id=file_id, source=source, key=site.key, line=site.line,
                    converted_line=rows[anchor].right.number if anchor is not None and rows[anchor].right else None,
                    text=site.message, advice=site.advice, cell=cell)
        if anchor is None:
            anchor = next((i for i, r in enumerate(rows) if r.left and r.left.number == site.line), None)
        if anchor is not None:
            rows[anchor].todos.append(todo)
        todos.append(todo)
    for index, row in enumerate(rows):  # markers with no site (left by an earlier conversion)
        if row.todo_comment and index not in claimed and row.right is not None:
            match = TODO_COMMENT.match(row.right.text)
            text = row.right.text.strip().lstrip("#").strip()
            todo = Todo(id=ids.todo(), file_id=file_id, source=source,
                        key=(match.group("key") if match else None) or "TODO(porter)",
                        line=row.left.number if row.left else None,
                        converted_line=row.right.number, text=text, cell=cell)
            row.todos.append(todo)
            todos.append(todo)
    todos.sort(key=lambda t: int(t.id.split("-")[1]))
    return Block(title, fold(rows, context), cell), todos


def _notebook_cells(text: str) -> list[tuple[str, str]] | None:
    try:
        data = json.loads(text)
    except ValueError:
        return None
    cells = data.get("cells") if isinstance(data, dict) else None
    if not isinstance(cells, list):
        return None
    out = []
    for cell in cells:
        source = cell.get("source", "")
        out.append((cell.get("cell_type", ""), "".join(source) if isinstance(source, list) else source))
    return out


def _blocks(result: FileResult, sites: list[SiteView], file_id: str, ids: _Ids,
            context: int) -> tuple[list[Block], list[Todo]]:
    if result.status != "converted" or not (result.original_text or result.converted_text):
        return [], []
    original, converted = result.original_text, result.converted_text or result.original_text
    if result.source.endswith(".ipynb"):
        before, after = _notebook_cells(original), _notebook_cells(converted)
        if before is not None and after is not None and len(before) == len(after):
            blocks, todos = [], []
            for index, ((kind, a), (_, b)) in enumerate(zip(before, after)):
                in_cell = [s for s, raw in zip(sites, result.sites) if raw.cell == index + 1]
                if kind != "code" or (a == b and not in_cell):
                    continue
                block, found = build_block(a, b, in_cell, file_id=file_id, source=result.source,
                                           ids=ids, title=f"cell {index + 1}", cell=index + 1,
                                           context=context)
                blocks.append(block)
                todos += found
            return blocks, todos
    block, todos = build_block(original, converted, sites, file_id=file_id, source=result.source,
                               ids=ids, context=context)
    return [block], todos


def verdict_view(result: VerifyResult, trials: TrialsResult | None = None) -> VerdictView:
    outputs = []
    for out in result.outputs:
        data = out.to_json()
        outputs.append(OutputView(
            name=out.name, kind=out.kind, status=out.comparison.status, detail=out.comparison.detail,
            differing_cells=out.comparison.differing_cells,
            first_rows=[(r["row"], r["original"], r["converted"]) for r in data.get("first_rows", [])]))

    def side(run) -> SideRunView:  # type: ignore[no-untyped-def]
        return SideRunView(run.exit_code, run.wall_s, run.peak_mib, run.failure, run.runs,
                           time_range(run), run.capture_s)

    return VerdictView(result.verdict, outputs, side(result.original), side(result.converted),
                       list(result.notes), what_is_measured(result), speed_claim(result),
                       render_trials(trials) if trials is not None else None)


def build_page(results: list[FileResult], *, verdicts: dict[str, VerifyResult] | None = None,
               title: str = "porter review", low: float = DEFAULT_LOW, folder: bool | None = None,
               table: MappingTable | None = None, context: int = CONTEXT,
               trials: dict[str, TrialsResult] | None = None) -> Page:
    """The page model. Totals and per-file counts are the JSON report's (`folder_report`)."""
    table = table or load_table()
    verdicts = verdicts or {}
    report = folder_report(results, command="scan")
    entries = report["files"]
    assert isinstance(entries, list)
    ids = _Ids()
    files: list[FileView] = []
    all_todos: list[Todo] = []
    for number, (result, entry) in enumerate(zip(results, entries), start=1):
        file_id = f"file-{number}"
        sites = [site_view(s, table, ids, low) for s in result.sites]
        blocks, todos = _blocks(result, sites, file_id, ids, context)
        verdict = verdicts.get(result.source)
        files.append(FileView(
            id=file_id, source=result.source, output=result.output, status=result.status,
            error=result.error, summary=entry["summary"], blocks=blocks, sites=sites, todos=todos,
            verdict=verdict_view(verdict, (trials or {}).get(result.source))
            if verdict is not None else None))
        all_todos += todos
    summary = report["summary"]
    assert isinstance(summary, dict)
    return Page(title=title, files=files, summary=summary, todos=all_todos, low=low,
                folder=len(results) > 1 if folder is None else folder)
