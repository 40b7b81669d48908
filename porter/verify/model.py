"""Plain data of a verification run."""

from __future__ import annotations

from dataclasses import dataclass, field, replace
from statistics import median
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
    """One side's run: how it ended and what the script alone cost.

    `wall_s` and `peak_mib` are the script's own figures, read in the child the moment the
    script ended (`porter.verify.child` says exactly what they include): porter's capture of
    the frames it left, which collects every LazyFrame once more and pickles every frame, is
    `capture_s`, apart. With timing runs, `wall_runs` / `peak_runs` hold one figure per run
    (the verifying run first, then the runs without capture) and `wall_s` / `peak_mib` are
    their medians.

    `measured` is "process" when the script never reported its figures (it timed out or was
    killed): `wall_s` is then the child process's whole life and the peak is unknown.
    """

    exit_code: int | None
    wall_s: float
    peak_mib: float | None
    stdout: str = ""
    stderr: str = ""
    failure: str | None = None  # "crashed", "timed out", "out of memory"
    workdir: str | None = None
    capture_s: float | None = None
    baseline_mib: float | None = None  # the interpreter's own start-up memory, inside peak_mib
    measured: Literal["script", "process"] = "script"
    wall_runs: tuple[float, ...] = ()
    peak_runs: tuple[float, ...] = ()
    # the interpreter and libraries this side ran under, when the original ran under another
    # Python (verify --reference-python): "Python 3.11.7, pandas 2.2.3 (/venvs/old/bin/python)"
    environment: str | None = None

    @property
    def runs(self) -> int:
        """How many runs `wall_s` rests on."""
        return max(1, len(self.wall_runs))

    def with_runs(self, walls: list[float], peaks: list[float | None]) -> SideRun:
        """This run with more runs' figures: the medians of all of them (this one's first)."""
        all_walls = [self.wall_s, *walls]
        all_peaks = [p for p in (self.peak_mib, *peaks) if p is not None]
        return replace(self, wall_s=median(all_walls),
                       peak_mib=median(all_peaks) if all_peaks else None,
                       wall_runs=tuple(all_walls), peak_runs=tuple(all_peaks))

    def to_json(self) -> dict[str, object]:
        walls = self.wall_runs or (self.wall_s,)
        peaks = self.peak_runs or (() if self.peak_mib is None else (self.peak_mib,))
        data: dict[str, object] = {
            "exit_code": self.exit_code, "wall_s": round(self.wall_s, 3),
            "peak_mib": _mib(self.peak_mib), "measured": self.measured, "runs": self.runs,
            "wall_s_runs": [round(w, 3) for w in walls], "peak_mib_runs": [_mib(p) for p in peaks],
            "capture_s": None if self.capture_s is None else round(self.capture_s, 3),
            "baseline_mib": _mib(self.baseline_mib)}
        # kept for the report, not compared: the two libraries print differently
        data["stdout_tail"] = "\n".join(self.stdout.splitlines()[-20:])
        data["stderr_tail"] = "\n".join(self.stderr.splitlines()[-20:])
        if self.failure:
            data["failure"] = self.failure
        if self.environment:
            data["environment"] = self.environment
        if self.workdir:
            data["workdir"] = self.workdir
        return data


def _mib(value: float | None) -> float | None:
    return None if value is None else round(value, 1)


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
