"""The verdict on a terminal: one line per output, one per side."""

from __future__ import annotations

from porter.verify.model import VerifyResult


def _cell(value: object, width: int) -> str:
    text = str(value)
    return text if len(text) <= width else text[: width - 1] + "…"


def render(result: VerifyResult, original: str, converted: str) -> str:
    lines = [f"porter verify: {result.verdict.upper()}  ({original} vs {converted})", ""]
    if result.outputs:
        lines.append(f"  {'output':<34} {'kind':<8} {'status':<15} detail")
        for out in result.outputs:
            c = out.comparison
            lines.append(f"  {_cell(out.name, 34):<34} {out.kind:<8} {c.status:<15} "
                         f"{_cell(c.detail, 70)}")
            for row, a, b in c.first_rows[:3]:
                lines.append(f"      row {row}: original  {_cell(a, 90)}")
                lines.append(f"      {' ' * len(str(row))}     converted {_cell(b, 90)}")
    for note in result.notes:
        lines.append(f"  note: {note}")
    lines += ["", f"  {'side':<10} {'exit':>5} {'wall':>9} {'peak memory':>12}"]
    for side, run in (("original", result.original), ("converted", result.converted)):
        peak = "" if run.peak_mib is None else f"{run.peak_mib:.0f} MiB"
        lines.append(f"  {side:<10} {str(run.exit_code):>5} {run.wall_s:>8.2f}s {peak:>12}")
        if run.failure:
            lines.append(f"    {side} {run.failure}; last lines of its stderr:")
            lines += [f"    | {line}" for line in run.stderr.splitlines()[-12:]]
    return "\n".join(lines)


def kept_folders(result: VerifyResult) -> str:
    return "\n".join(f"  {side} ran in {run.workdir}" for side, run in
                     (("original", result.original), ("converted", result.converted)) if run.workdir)
