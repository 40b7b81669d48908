"""Plain data passed between porter's stages."""

from __future__ import annotations

from collections import Counter
from dataclasses import dataclass, field
from typing import Literal

Status = Literal["converted", "handover", "todo"]


@dataclass(frozen=True)
class SiteDraft:
    """One use of a pandas API, as a rule decided it (line numbers are the source's)."""

    key: str
    rule: str
    status: Status
    confidence: float
    message: str
    line: int
    end_line: int
    suggestion: str | None = None  # Polars code a TODO would have been rewritten to


@dataclass(frozen=True)
class Site:
    line: int
    end_line: int
    key: str
    rule: str
    status: Status
    confidence: float
    message: str
    cell: int | None = None  # notebooks: the cell's position, counting from 1 (lines are the cell's)

    def to_json(self) -> dict[str, object]:
        data: dict[str, object] = {
            "line": self.line,
            "end_line": self.end_line,
            "key": self.key,
            "rule": self.rule,
            "status": self.status,
            "confidence": round(self.confidence, 3),
            "message": self.message,
        }
        if self.cell is not None:
            data["cell"] = self.cell
        return data


@dataclass(frozen=True)
class Options:
    min_confidence: float = 0.0
    data_dir: str | None = None


@dataclass(frozen=True)
class FileResult:
    source: str
    output: str | None
    original_text: str
    converted_text: str
    sites: tuple[Site, ...]
    status: Literal["converted", "unchanged", "failed"] = "converted"
    error: str | None = None
    traceback: str | None = None  # a failure inside porter: where it happened, for the report

    @property
    def todos(self) -> tuple[Site, ...]:
        return tuple(s for s in self.sites if s.status == "todo")

    def summary(self) -> dict[str, object]:
        return summarize(self.sites)

    def to_json(self) -> dict[str, object]:
        data: dict[str, object] = {
            "source": self.source,
            "output": self.output,
            "status": self.status,
            "sites": [s.to_json() for s in self.sites],
            "summary": self.summary(),
        }
        if self.error:
            data["error"] = self.error
        if self.traceback:
            data["traceback"] = self.traceback
        return data


def summarize(sites: tuple[Site, ...] | list[Site]) -> dict[str, object]:
    by_status = Counter(s.status for s in sites)
    todo_keys = Counter(s.key for s in sites if s.status == "todo")
    confidences = [s.confidence for s in sites if s.status == "converted"]
    return {
        "sites": len(sites),
        "converted": by_status["converted"],
        "handover": by_status["handover"],
        "todo": by_status["todo"],
        "todo_by_key": dict(todo_keys.most_common()),
        "lowest_confidence": min(confidences) if confidences else None,
    }


@dataclass
class ConversionError(Exception):
    """Bad input: the message names the file and, where known, the line."""

    message: str
    path: str | None = None
    line: int | None = None
    column: int | None = None

    def __str__(self) -> str:
        where = self.path or "<input>"
        if self.line is not None:
            where += f":{self.line}"
            if self.column is not None:
                where += f":{self.column}"
        return f"{where}: {self.message}"


@dataclass
class InternalError(Exception):
    """A bug in porter met while converting one file: the file fails, nothing is written."""

    detail: str
    path: str | None = None
    line: int | None = None
    traceback: str = ""

    def __str__(self) -> str:
        where = self.path or "<input>"
        if self.line:
            where += f":{self.line}"
        return f"{where}: internal error: please report ({self.detail})"


@dataclass(frozen=True)
class MappingEntry:
    key: str
    status: Literal["ported", "handover", "todo"]
    rule: str | None
    polars: str | None
    confidence: float
    handles: tuple[str, ...] = ()
    notes: str = ""
    advice: str = ""
    area: str = ""
    extra: dict[str, object] = field(default_factory=dict)
