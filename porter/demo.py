"""The shipped demo: convert every pandas script in `corpus/` and show what porter did.

    python -m porter.demo [--out build/demo]

Each converted script is written beside a JSON report in the output folder; the terminal shows
one line per script and the overall summary.
"""

from __future__ import annotations

import argparse
import json
from pathlib import Path
import sys

from porter.api import convert_file
from porter.cli import report_json, summary_text
from porter.model import FileResult, Options

ROOT = Path(__file__).resolve().parent.parent


def demo_scripts(corpus: Path) -> list[Path]:
    return sorted(p / f"{p.name}.py" for p in corpus.iterdir() if (p / f"{p.name}.py").is_file())


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(prog="python -m porter.demo", description=__doc__.splitlines()[0])
    parser.add_argument("--corpus", type=Path, default=ROOT / "corpus")
    parser.add_argument("--out", type=Path, default=ROOT / "build" / "demo")
    args = parser.parse_args(argv)
    if not args.corpus.is_dir():
        print(f"porter demo: no corpus folder at {args.corpus}", file=sys.stderr)
        return 2
    args.out.mkdir(parents=True, exist_ok=True)
    results: list[FileResult] = []
    print(f"{'script':<28} {'converted':>9} {'handover':>9} {'TODO':>5}  lowest confidence")
    for script in demo_scripts(args.corpus):
        target = args.out / script.name
        # each script runs in its own folder: its input schemas are read from there
        result = convert_file(script, output=str(target), options=Options(data_dir=str(script.parent)))
        target.write_text(result.converted_text, encoding="utf-8")
        results.append(result)
        summary = result.summary()
        lowest = summary["lowest_confidence"]
        print(f"{script.stem:<28} {summary['converted']:>9} {summary['handover']:>9} "
              f"{summary['todo']:>5}  {'' if lowest is None else f'{lowest:.2f}'}")
    (args.out / "report.json").write_text(json.dumps(report_json(results), indent=2) + "\n",
                                          encoding="utf-8")
    print()
    print(summary_text(results))
    print(f"\nConverted scripts and report.json are in {args.out}")
    print(f"Try: diff -u {args.corpus / 'orchard_harvest' / 'orchard_harvest.py'} "
          f"{args.out / 'orchard_harvest.py'}")
    return 0


if __name__ == "__main__":
    sys.exit(main())
