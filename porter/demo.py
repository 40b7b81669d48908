"""The shipped demo: convert every pandas script in `corpus/`, verify each conversion by running
both versions on the script's sample data, and show what porter did.

    python -m porter.demo [--out build/demo] [--no-verify]

Each converted script is written beside a JSON report and a side-by-side HTML review page
(review.html) in the output folder; the terminal shows
one line per script (sites, TODOs, verdict, time and peak memory of both versions) and the
overall summary. Verifying runs the corpus scripts. The time and peak memory are each script's
own (from its first line to its end, not the verifier's capture of its frames afterwards), the
median over the verifying run and `--timing-runs` more runs (default 1).
"""

from __future__ import annotations

import argparse
import json
from pathlib import Path
import sys

from porter.api import convert_file
from porter.reports import report_json, summary_text
from porter.model import FileResult, Options
from porter.verify.api import VerifyOptions, verify
from porter.verify.declared import ReferenceUnavailable, python_for
from porter.review import render_review
from porter.verify.model import SideRun, VerifyResult

ROOT = Path(__file__).resolve().parent.parent


def _cost(run: SideRun) -> str:
    peak = "" if run.peak_mib is None else f" {run.peak_mib:.0f}MiB"
    return f"{run.wall_s:.2f}s{peak}"


def demo_scripts(corpus: Path) -> list[Path]:
    return sorted(p / f"{p.name}.py" for p in corpus.iterdir() if (p / f"{p.name}.py").is_file())


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(prog="python -m porter.demo", description=__doc__.splitlines()[0])
    parser.add_argument("--corpus", type=Path, default=ROOT / "corpus")
    parser.add_argument("--out", type=Path, default=ROOT / "build" / "demo")
    parser.add_argument("--no-verify", action="store_true", help="convert only")
    parser.add_argument("--timing-runs", type=int, default=1, metavar="N",
                        help="run each side N more times for the median time and memory "
                             "(default 1)")
    args = parser.parse_args(argv)
    if not args.corpus.is_dir():
        print(f"porter demo: no corpus folder at {args.corpus}", file=sys.stderr)
        return 2
    args.out.mkdir(parents=True, exist_ok=True)
    results: list[FileResult] = []
    print(f"{'script':<24} {'sites':>5} {'TODO':>4} {'lowest':>6}  {'verdict':<8} "
          f"{'pandas':>16} {'polars':>16}")
    verdicts = []
    verdicts_by_source: dict[str, VerifyResult] = {}
    skipped: list[str] = []
    for script in demo_scripts(args.corpus):
        target = args.out / script.name
        # each script runs in its own folder: its input schemas are read from there
        options = Options(data_dir=str(script.parent))
        result = convert_file(script, output=str(target), options=options)
        target.write_text(result.converted_text, encoding="utf-8")
        results.append(result)
        summary = result.summary()
        lowest = summary["lowest_confidence"]
        line = (f"{script.stem:<24} {summary['sites']:>5} {summary['todo']:>4} "
                f"{'' if lowest is None else f'{lowest:.2f}':>6}  ")
        if not args.no_verify:
            # a script written for an older pandas (reference.txt beside it) is verified
            # against that pandas, in a Python built for it once; where it cannot be built
            # here (no network) the script is not verified, and the line says why
            try:
                older = python_for(script.parent)
            except ReferenceUnavailable as exc:
                skipped.append(f"{script.stem}: not verified, {exc}")
                print(line + "skipped", flush=True)
                continue
            verdict = verify(script, result.converted_text, script.parent,
                             VerifyOptions(timing_runs=max(0, args.timing_runs),
                                           reference_python=older))
            verdicts.append(verdict.verdict)
            verdicts_by_source[result.source] = verdict
            line += (f"{verdict.verdict:<8} {_cost(verdict.original):>16} "
                     f"{_cost(verdict.converted):>16}")
        print(line, flush=True)
    (args.out / "report.json").write_text(json.dumps(report_json(results), indent=2) + "\n",
                                          encoding="utf-8")
    page = render_review(results, verdicts=verdicts_by_source or None,
                         title="porter review: the demo corpus")
    (args.out / "review.html").write_text(page, encoding="utf-8")
    if verdicts:
        runs = max(0, args.timing_runs) + 1
        basis = "1 run each" if runs == 1 else (
            f"the median of {runs} runs each (review.html says where a timing run failed and "
            f"the figures rest on fewer)")
        print(f"\ntime and peak memory: each script alone, from its first line to its end (its "
              f"imports included, not the capture of its frames), {basis}")
    print()
    print(summary_text(results))
    if verdicts:
        same = sum(v == "same" for v in verdicts)
        print(f"verified: {same} of {len(verdicts)} conversions compute the same outputs as pandas")
    for note in skipped:
        print(note)
    print(f"\nConverted scripts, report.json and review.html (open it in a browser) are in "
          f"{args.out}")
    print(f"Try: diff -u {args.corpus / 'orchard_harvest' / 'orchard_harvest.py'} "
          f"{args.out / 'orchard_harvest.py'}")
    return 0 if all(v == "same" for v in verdicts) else 1


if __name__ == "__main__":
    sys.exit(main())
