"""The verdict on a terminal: one line per output, one per side."""

from __future__ import annotations

import textwrap

from porter.verify.model import SideRun, VerifyResult


def _cell(value: object, width: int) -> str:
    text = str(value)
    return text if len(text) <= width else text[: width - 1] + "…"


def render(result: VerifyResult, original: str, converted: str) -> str:
    lines = [f"porter verify: {result.verdict.upper()}  ({original} vs {converted})", ""]
    if result.outputs:
        lines.append(f"  {'output':<34} {'kind':<8} {'status':<15} detail")
        for out in result.outputs:
            c = out.comparison
            # a long detail goes on under the row, whole (it says why outputs differ)
            first, *rest = textwrap.wrap(c.detail, width=70) or [""]
            lines.append(f"  {_cell(out.name, 34):<34} {out.kind:<8} {c.status:<15} {first}")
            if rest:
                lines += textwrap.wrap(" ".join(rest), width=96, initial_indent="      ",
                                       subsequent_indent="      ")
            for row, a, b in c.first_rows[:3]:
                lines.append(f"      row {row}: original  {_cell(a, 90)}")
                lines.append(f"      {' ' * len(str(row))}     converted {_cell(b, 90)}")
    for note in result.notes:
        lines.append(f"  note: {note}")
    lines += ["", f"  {'side':<10} {'exit':>5} {'time':>9} {'range':>13} {'peak memory':>12} "
                  f"{'capture':>8}"]
    for side, run in (("original", result.original), ("converted", result.converted)):
        peak = "" if run.peak_mib is None else f"{run.peak_mib:.0f} MiB"
        capture = "" if run.capture_s is None else f"{run.capture_s:.2f}s"
        lines.append(f"  {side:<10} {str(run.exit_code):>5} {run.wall_s:>8.2f}s "
                     f"{time_range(run):>13} {peak:>12} {capture:>8}")
        if run.environment:
            lines.append(f"    ran under {run.environment}")
        if run.failure:
            lines.append(f"    {side} {run.failure}; last lines of its stderr:")
            lines += [f"    | {line}" for line in run.stderr.splitlines()[-12:]]
    claim = speed_claim(result)
    lines.append("")
    lines += textwrap.wrap(what_is_measured(result) + (f" {claim}" if claim else ""), width=96,
                           initial_indent="  ", subsequent_indent="  ")
    return "\n".join(lines)


def time_range(run: SideRun) -> str:
    """The spread of a side's times over its runs: "0.41–0.47s", or "" after a single run."""
    if len(run.wall_runs) < 2:
        return ""
    return f"{min(run.wall_runs):.2f}–{max(run.wall_runs):.2f}s"


def runs_basis(result: VerifyResult) -> str:
    """What the figures rest on, in words: "1 run each", "the median of 3 runs each"…"""
    a, b = result.original.runs, result.converted.runs
    if a == b:
        return "1 run each" if a == 1 else f"the median of {a} runs each"
    return f"the median of {a} run(s) of the original and {b} of the converted script"


def what_is_measured(result: VerifyResult) -> str:
    """What the time and peak memory columns are, in words."""
    baseline = result.original.baseline_mib or result.converted.baseline_mib
    interpreter = "" if baseline is None else f" ({baseline:.0f} MiB)"
    text = (f"Time and peak memory are each script's own, {runs_basis(result)}: from its first "
            f"line to its end, its imports included; not the interpreter's start-up nor "
            f"porter's capture of the frames left in its globals (capture). Peak memory is the "
            f"process's resident high-water mark, the interpreter's own{interpreter} included.")
    if "process" in (result.original.measured, result.converted.measured):
        text += (" A side that did not reach its end shows the time until it stopped and no "
                 "peak memory.")
    return text


def speed_claim(result: VerifyResult) -> str | None:
    """One sentence on the time of the converted script against the original's, saying how
    many runs it rests on; None when a side failed or did not report its own figures."""
    a, b = result.original, result.converted
    if a.failure or b.failure or "process" in (a.measured, b.measured):
        return None
    if a.wall_s <= 0 or b.wall_s <= 0:
        return None
    basis = runs_basis(result)
    figures = f"{b.wall_s:.2f} s against {a.wall_s:.2f} s, {basis}"
    if (len(a.wall_runs) > 1 and len(b.wall_runs) > 1
            and min(a.wall_runs) <= max(b.wall_runs) and min(b.wall_runs) <= max(a.wall_runs)):
        return f"No clear difference in time: the runs of the two scripts overlap ({figures})."
    ratio = a.wall_s / b.wall_s
    if ratio >= 1:
        claim = f"The converted script took {ratio:.1f}× less time than the original ({figures})."
    else:
        claim = (f"The converted script took {1 / ratio:.1f}× more time than the original "
                 f"({figures}).")
    if a.runs == 1 or b.runs == 1:
        claim += " A single run can mislead: --timing-runs N repeats each side N more times."
    return claim


def kept_folders(result: VerifyResult) -> str:
    return "\n".join(f"  {side} ran in {run.workdir}" for side, run in
                     (("original", result.original), ("converted", result.converted)) if run.workdir)
