"""Plain data of a verification run."""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Literal

OutputStatus = Literal["same", "same-unordered", "different", "missing", "error"]
Verdict = Literal["same", "same-unordered", "different", "missing", "error"]

# worst last: the overall verdict is the worst status of the outputs
SEVERITY: dict[str, int] = {"same": 0, "same-unordered": 1, "different": 2, "missing": 3, "error": 4}


@dataclass(frozen=True)
class Comparison:
    """How one output of the two sides compares."""

    status: OutputStatus
    detail: str = ""
    differing_cells: int = 0
    # the first differing rows side by side: (row number, pandas row, converted row)
    first_rows: tuple[tuple[int, tuple[object, ...], tuple[object, ...]], ...] = ()


@dataclass(frozen=True)
class OutputResult:
    name: str
    kind: Literal["file", "variable"]
    comparison: Comparison

    def to_json(self) -> dict[str, object]:
        data: dict[str, object] = {"name": self.name, "kind": self.kind,
                                   "status": self.comparison.status,
                                   "detail": self.comparison.detail}
        if self.comparison.status == "different":
            data["differing_cells"] = self.comparison.differing_cells
            data["first_rows"] = [
                {"row": row, "original": list(map(_plain, a)), "converted": list(map(_plain, b))}
                for row, a, b in self.comparison.first_rows]
        return data


@dataclass(frozen=True)
class SideRun:
    """One side's run: how it ended and what it cost."""

    exit_code: int | None
    wall_s: float
    peak_mib: float | None
    stdout: str = ""
    stderr: str = ""
    failure: str | None = None  # "crashed", "timed out", "out of memory"
    workdir: str | None = None

    def to_json(self) -> dict[str, object]:
        data: dict[str, object] = {"exit_code": self.exit_code, "wall_s": round(self.wall_s, 3),
                                   "peak_mib": None if self.peak_mib is None else round(self.peak_mib, 1)}
        # kept for the report, not compared: the two libraries print differently
        data["stdout_tail"] = "\n".join(self.stdout.splitlines()[-20:])
        data["stderr_tail"] = "\n".join(self.stderr.splitlines()[-20:])
        if self.failure:
            data["failure"] = self.failure
        if self.workdir:
            data["workdir"] = self.workdir
        return data


@dataclass(frozen=True)
class VerifyResult:
    verdict: Verdict
    outputs: tuple[OutputResult, ...]
    original: SideRun
    converted: SideRun
    notes: tuple[str, ...] = field(default=())

    def to_json(self) -> dict[str, object]:
        return {"verdict": self.verdict, "outputs": [o.to_json() for o in self.outputs],
                "original": self.original.to_json(), "converted": self.converted.to_json(),
                "notes": list(self.notes)}


def _plain(value: object) -> object:
    if value is None or isinstance(value, (bool, int, float, str)):
        return value
    return str(value)
