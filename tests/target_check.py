"""On-demand check of the target scripts kept beside the project (not shipped with it).

    .venv/bin/python tests/target_check.py [--targets DIR] [--rows 5000] [--runs 1] [-k name]
                                           [--out FILE.md]

A target folder holds pandas scripts written the way users write them, each reading `data/`
and writing `out/`, and a `make_data.py DIR/data --rows N` that makes their data. A target is
met when `porter convert SCRIPT --data DIR` leaves no TODO, `porter verify` says "same", and
the converted script takes less time than the pandas one at scale (`--rows 1000000`; at a few
thousand rows both times are mostly imports). This prints, per script, the TODO
count with each TODO's key, the verdict with the outputs that differ, and both times.

The folder defaults to `$PORTER_TARGETS`, else `../shared/challenge` beside the checkout. When
it is absent (a user's clone), the check says so and exits 0: it is not part of the test suite.
"""

from __future__ import annotations

import argparse
import json
import os
from pathlib import Path
import re
import subprocess
import sys
import tempfile

ROOT = Path(__file__).resolve().parent.parent
PORTER = [sys.executable, "-m", "porter"]


def default_targets() -> Path:
    return Path(os.environ.get("PORTER_TARGETS") or ROOT.parent / "shared" / "challenge")


def check(script: Path, folder: Path, runs: int) -> dict[str, object]:
    """Convert `script` with `folder` as its data folder, then verify it there."""
    converted = folder / f"{script.stem}_polars.py"
    done = subprocess.run([*PORTER, "convert", str(script), "-o", str(converted), "--data",
                           str(folder)], capture_output=True, text=True, cwd=ROOT)
    if done.returncode != 0 or not converted.exists():
        return {"script": script.stem, "error": (done.stderr or done.stdout).strip()[-300:]}
    text = converted.read_text(encoding="utf-8")
    keys = re.findall(r"# TODO\(porter\): ([\w.]+)", text)
    verdict_file = folder / f"{script.stem}.verdict.json"
    subprocess.run([*PORTER, "verify", str(script), str(converted), "--data", str(folder),
                    "--timing-runs", str(max(runs - 1, 0)), "--json", str(verdict_file),
                    "--timeout", "1200"], capture_output=True, text=True, cwd=ROOT)
    if not verdict_file.exists():
        return {"script": script.stem, "todos": keys, "error": "porter verify wrote no verdict"}
    verdict = json.loads(verdict_file.read_text(encoding="utf-8"))
    different = [o.get("name") for o in verdict.get("outputs", [])
                 if o.get("status") not in ("same", None)]
    return {"script": script.stem, "todos": keys, "verdict": verdict["verdict"],
            "different": different, "pandas_s": verdict["original"]["wall_s"],
            "polars_s": verdict["converted"]["wall_s"]}


def render(results: list[dict[str, object]], rows: int) -> str:
    lines = [f"`tests/target_check.py --rows {rows}`", "",
             "| script | TODOs | verdict | pandas s | Polars s | met |", "|---|---|---|---|---|---|"]
    for r in results:
        if "error" in r:
            lines.append(f"| {r['script']} | {len(r.get('todos', []))} | error | | | no |")
            continue
        met = not r["todos"] and r["verdict"] == "same" and r["polars_s"] < r["pandas_s"]
        todos = f"{len(r['todos'])}: {', '.join(sorted(set(r['todos'])))}" if r["todos"] else "0"
        verdict = r["verdict"] + (f" ({', '.join(map(str, r['different']))})" if r["different"] else "")
        lines.append(f"| {r['script']} | {todos} | {verdict} | "
                     f"{r['pandas_s']:.2f} | {r['polars_s']:.2f} | {'yes' if met else 'no'} |")
    return "\n".join(lines) + "\n"


def main() -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--targets", type=Path, default=default_targets())
    parser.add_argument("--rows", type=int, default=5000)
    parser.add_argument("--runs", type=int, default=1, help="timed runs per side (median)")
    parser.add_argument("-k", default="", help="only scripts whose name contains this")
    parser.add_argument("--out", type=Path, help="also write the table to this file")
    args = parser.parse_args()
    maker = args.targets / "make_data.py"
    if not maker.exists():
        print(f"no target scripts at {args.targets}: nothing to check")
        return 0
    results = []
    with tempfile.TemporaryDirectory(prefix="porter-targets-") as tmp:
        folder = Path(tmp)
        subprocess.run([sys.executable, str(maker), str(folder / "data"), "--rows", str(args.rows)],
                       check=True, capture_output=True, text=True)
        for script in sorted(args.targets.glob("*.py")):
            if script.name == "make_data.py" or args.k not in script.stem:
                continue
            result = check(script, folder, args.runs)
            results.append(result)
            print(json.dumps(result), flush=True)
    table = render(results, args.rows)
    print(table)
    if args.out:
        args.out.write_text(table, encoding="utf-8")
    return 0


if __name__ == "__main__":
    sys.exit(main())
