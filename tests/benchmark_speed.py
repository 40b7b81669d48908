"""Benchmark: every corpus script against its conversion, at scale. Run on demand.

    .venv/bin/python tests/benchmark_speed.py [--rows 1000000] [--runs 3] [-k name]
                                              [--out docs/performance.md]
    (-k a,b: the scenarios whose name contains a or b)

For each corpus scenario, porter converts the script with `--data` on the shipped sample (as a
user with a sample would), then the scenario's data is scaled up: the larger tables (the ones
holding events, not lookups) are drawn from the sample rows with replacement until they hold
`--rows` rows; lookup tables stay as they are, so joins keep their shape. `porter verify` then
runs both scripts on the scaled data, checks that they still write the same outputs, and times
each side `--runs` times: the script's own wall time and peak memory (see docs/report.md), the
median of the runs. The output's `.collect()` and `.to_pandas()` calls are counted too.

The table replaces the "Converted scripts against pandas" section of docs/performance.md. Not
part of the test suite: speed belongs in a benchmark, not in assertions.
"""

from __future__ import annotations

import argparse
import json
import os
from pathlib import Path
import platform
import re
import shutil
import statistics
import subprocess
import sys
import tempfile

import numpy as np
import pandas as pd

ROOT = Path(__file__).resolve().parent.parent
CORPUS = ROOT / "corpus"
PORTER = [sys.executable, "-m", "porter"]
SECTION = "## Converted scripts against pandas"


def scale(data: Path, out: Path, rows: int, seed: int = 7) -> dict[str, int]:
    """Copy `data` to `out` (making its parent folder), drawing the event tables up to `rows`
    rows. Returns rows per file.

    CSV files are scaled line by line, so what comes before the data (comment lines, the
    header) and the separator stay exactly as the script expects them."""
    shutil.copytree(data, out)
    tables = {p: _lines(p) if p.suffix == ".csv" else pd.read_parquet(p)
              for p in sorted(out.rglob("*")) if p.suffix in (".csv", ".parquet")}
    lengths = {p: len(t[1]) if isinstance(t, tuple) else len(t) for p, t in tables.items()}
    largest = max(lengths.values(), default=0)
    sizes = {}
    rng = np.random.default_rng(seed)
    for path, table in tables.items():
        if lengths[path] and lengths[path] >= largest / 2:  # an event table, not a lookup
            picks = rng.integers(0, lengths[path], rows)
            if isinstance(table, tuple):
                head, body = table
                path.write_text("\n".join([*head, *(body[i] for i in picks)]) + "\n", encoding="utf-8")
            else:
                table.iloc[picks].reset_index(drop=True).to_parquet(path, index=False)
            lengths[path] = rows
        sizes[str(path.relative_to(out))] = lengths[path]
    return sizes


def _lines(path: Path) -> tuple[list[str], list[str]]:
    """(the lines before the data, the data lines): the header is the first line with as many
    separators as the typical data line."""
    lines = [line for line in path.read_text(encoding="utf-8").splitlines() if line.strip()]
    sep = ";" if sum(line.count(";") for line in lines) > sum(line.count(",") for line in lines) else ","
    typical = statistics.mode(line.count(sep) for line in lines[-50:]) if lines else 0
    header = next((i for i, line in enumerate(lines) if line.count(sep) == typical), 0)
    return lines[:header + 1], lines[header + 1:]


def count_calls(text: str) -> dict[str, int]:
    lines = text.splitlines()
    return {
        "collect": text.count(".collect()"),
        "to_pandas": text.count(".to_pandas()"),
        "lines_collecting_twice": sum(1 for line in lines if line.count(".collect()") > 1),
    }


def bench(case: Path, rows: int, runs: int, work: Path) -> dict[str, object]:
    script = case / f"{case.name}.py"
    # a case written for an older pandas (reference.txt) runs its original under that pandas;
    # where that pandas cannot be had here the case is skipped with the reason
    from porter.verify.declared import ReferenceUnavailable, declared_requirements, python_for
    try:
        older = python_for(case)
    except ReferenceUnavailable as exc:
        return {"case": case.name, "skipped": str(exc)}
    reference = ["--reference-python", older] if older else []
    converted = work / f"{case.name}_polars.py"
    # the scripts read their files from data/ beside them: the scenario folder is the data
    subprocess.run([*PORTER, "convert", str(script), "-o", str(converted), "--data", str(case)],
                   check=True, capture_output=True, text=True, cwd=ROOT)
    folder = work / "scenario"
    sizes = scale(case / "data", folder / "data", rows)
    verdict_file = work / "verdict.json"
    done = subprocess.run([*PORTER, "verify", str(script), str(converted), "--data", str(folder),
                           "--timing-runs", str(max(runs - 1, 0)), "--json", str(verdict_file),
                           "--timeout", "1200", *reference], capture_output=True, text=True, cwd=ROOT)
    if not verdict_file.exists():
        return {"case": case.name, "error": (done.stderr or done.stdout).strip()[-300:]}
    verdict = json.loads(verdict_file.read_text(encoding="utf-8"))
    text = converted.read_text(encoding="utf-8")
    label = f"{case.name} (original on {', '.join(declared_requirements(case))})" if older else case.name
    return {
        "case": label, "rows": max(sizes.values()), "verdict": verdict["verdict"],
        "pandas_s": verdict["original"]["wall_s"], "polars_s": verdict["converted"]["wall_s"],
        "pandas_mib": verdict["original"]["peak_mib"], "polars_mib": verdict["converted"]["peak_mib"],
        "runs": verdict["converted"].get("runs", 1),
        "todos": len(re.findall(r"# TODO\(porter\)", text)), **count_calls(text),
    }


def ratio(a: object, b: object) -> float | None:
    if isinstance(a, (int, float)) and isinstance(b, (int, float)) and b:
        return a / b
    return None


def render(results: list[dict[str, object]], rows: int, runs: int) -> str:
    lines = [SECTION, "",
             f"`tests/benchmark_speed.py --rows {rows} --runs {runs}` on {platform.machine()}, "
             f"{os.cpu_count()} cores, Python {platform.python_version()}, pandas {pd.__version__}, "
             f"Polars {_polars_version()}. Each corpus script was converted with `--data` on its "
             "sample, then both versions ran on the sample scaled to the row count shown; times "
             "and peak memory are the script's own (median of the runs), as `porter verify` "
             "reports them.", "",
             "| script | rows | verdict | pandas s | Polars s | time ratio | pandas MiB | Polars MiB "
             "| memory ratio | TODOs | collect | to_pandas |",
             "|---|---|---|---|---|---|---|---|---|---|---|---|"]
    times, memories = [], []
    for r in results:
        if "skipped" in r:
            lines.append(f"| {r['case']} | | skipped: {str(r['skipped'])[:80]} | | | | | | | | | |")
            continue
        if "error" in r:
            lines.append(f"| {r['case']} | | error: {str(r['error']).splitlines()[-1][:80]} "
                         "| | | | | | | | | |")
            continue
        t, m = ratio(r["polars_s"], r["pandas_s"]), ratio(r["polars_mib"], r["pandas_mib"])
        if t is not None:
            times.append(t)
        if m is not None:
            memories.append(m)
        lines.append(
            f"| {r['case']} | {r['rows']:,} | {r['verdict']} | {r['pandas_s']:.2f} | "
            f"{r['polars_s']:.2f} | {_fmt(t)} | {_fmt(r['pandas_mib'], 0)} | "
            f"{_fmt(r['polars_mib'], 0)} | {_fmt(m)} | {r['todos']} | {r['collect']} | "
            f"{r['to_pandas']} |")
    if times:
        lines += ["", f"Median time ratio (Polars / pandas): {statistics.median(times):.2f}; "
                      f"worst: {max(times):.2f}. Median memory ratio: "
                      f"{_fmt(statistics.median(memories)) if memories else 'n/a'}."]
    return "\n".join(lines) + "\n"


def _fmt(value: object, digits: int = 2) -> str:
    return f"{value:.{digits}f}" if isinstance(value, (int, float)) else "n/a"


def _polars_version() -> str:
    import polars as pl
    return pl.__version__


def write_section(page: Path, section: str) -> None:
    """Replace this benchmark's section of the page (or add it), keeping the rest."""
    text = page.read_text(encoding="utf-8") if page.exists() else "# Performance\n"
    if SECTION in text:
        before, _, after = text.partition(SECTION)
        rest = after.split("\n## ", 1)
        text = before + section + ("\n## " + rest[1] if len(rest) > 1 else "")
    else:
        text = text.rstrip("\n") + "\n\n" + section
    page.write_text(text, encoding="utf-8")


def main() -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--rows", type=int, default=1_000_000)
    parser.add_argument("--runs", type=int, default=3, help="timed runs per side (median)")
    parser.add_argument("-k", default="", help="only scenarios whose name contains this (several "
                        "separated by commas: any of them)")
    parser.add_argument("--out", default=str(ROOT / "docs" / "performance.md"))
    args = parser.parse_args()
    results = []
    for case in sorted(p for p in CORPUS.iterdir() if (p / "data").is_dir()):
        if not any(part in case.name for part in args.k.split(",")):
            continue
        with tempfile.TemporaryDirectory(prefix="porter-speed-") as tmp:
            result = bench(case, args.rows, args.runs, Path(tmp))
        results.append(result)
        print(json.dumps(result), flush=True)
    write_section(Path(args.out), render(results, args.rows, args.runs))
    print(f"wrote {args.out}")
    return 0


if __name__ == "__main__":
    sys.exit(main())
