"""Command line: argument parsing only; every command calls into the library."""

from __future__ import annotations

import argparse
import difflib
import importlib.util
import json
import os
from pathlib import Path
import shutil
import sys
from typing import TextIO

from porter import __version__
from porter.api import convert_file
from porter.batch import (DEFAULT_MAX_SIZE, BatchOptions, parse_shard, parse_size, run_batch,
                          write_atomic)
from porter.reports import (check_problems, folder_report, folder_summary_text, merge_reports,
                            report_json, scan_text, summary_text)
from porter.config import Config, load_config
from porter.mapping import MappingFileError
from porter.model import ConversionError, FileResult, InternalError, Options

EXIT_OK, EXIT_TODO, EXIT_USAGE = 0, 1, 2
EXIT_INTERNAL = 2  # an internal error: never 1, which means "TODOs remain" under --fail-on-todo


class _Parser(argparse.ArgumentParser):
    def error(self, message: str) -> None:  # argparse exits with 2 too; keep the message short
        self.print_usage(sys.stderr)
        self.exit(EXIT_USAGE, f"porter: error: {message}\n")


def build_parser() -> argparse.ArgumentParser:
    parser = _Parser(prog="porter", description=(
        "Port pandas scripts to the Polars lazy API, marking what cannot be ported with "
        "TODO(porter) comments."))
    parser.add_argument("--version", action="version", version=f"porter {__version__}")
    commands = parser.add_subparsers(dest="command", required=True, parser_class=_Parser)

    convert = commands.add_parser(
        "convert", help="convert a pandas script, or every one in a folder",
        description=(
            "Convert one pandas script to Polars lazy code, or a folder: its tree is mirrored "
            "under -o OUT_DIR (scripts without pandas copied unchanged, other files not copied). "
            "Exit codes: 0 done; 1 a file failed, TODOs remain under --fail-on-todo, or --check "
            "found pandas code; 2 bad usage or bad input."))
    convert.add_argument("input", help="the pandas script, or a folder")
    convert.add_argument("-o", "--output", default=None,
                         help="where to write the converted script (default: stdout), or the "
                              "output folder for a folder")
    convert.add_argument("--diff", action="store_true", help="print a unified diff, write nothing")
    _analysis_options(convert)
    convert.add_argument("-q", "--quiet", action="store_true", help="no summary on stderr")
    convert.add_argument("--in-place", action="store_true",
                         help="rewrite the sources themselves (each written completely, then renamed)")
    convert.add_argument("--verify", action="store_true",
                         help="then run both versions on --data and compare their outputs "
                              "(runs the script: same trust as running it yourself)")
    _verify_options(convert)
    convert.add_argument("--html", metavar="REVIEW.html",
                         help="also write the side-by-side review page of the conversion")

    review = commands.add_parser(
        "review", help="write a side-by-side HTML review of a conversion, write nothing else",
        description=(
            "Convert a script or a folder in memory and write one self-contained HTML page: "
            "original and converted code side by side, every site with its confidence and "
            "what it handles, every TODO with its advice, and the verdicts under --verify. "
            "Exit codes: 0 done; 2 bad usage or bad input."))
    review.add_argument("input", metavar="SRC", help="the pandas script, or a folder")
    review.add_argument("-o", "--output", required=True, metavar="REVIEW.html",
                        help="where to write the page")
    review.add_argument("--data", metavar="DIR",
                        help="folder the scripts run in: input schemas are read from it")
    review.add_argument("--min-confidence", type=_confidence, default=None, metavar="X",
                        help="rewrites below this confidence become TODOs carrying the suggestion")
    review.add_argument("--low", type=_confidence, default=0.9, metavar="X",
                        help="sites below this confidence get a distinct mark (default 0.9)")
    review.add_argument("--verify", action="store_true",
                        help="run each converted script and its original on --data and show "
                             "the verdicts (runs the scripts: same trust as running them)")
    review.add_argument("--title", default=None, help="the page's title")
    review.add_argument("-q", "--quiet", action="store_true", help="no summary on stderr")
    _debug_option(review)
    folder = review.add_argument_group("folders")
    folder.add_argument("-j", "--jobs", type=_positive, default=None, metavar="N",
                        help="parallel processes (default: all cores)")
    folder.add_argument("--exclude", action="append", default=[], metavar="GLOB",
                        help="skip paths matching GLOB; repeatable")
    folder.add_argument("--max-size", type=_size, default=DEFAULT_MAX_SIZE, metavar="SIZE",
                        help="files larger than this fail (default 2MB)")
    _verify_options(review, outputs=False)
    _trial_options(review)
    review.set_defaults(fail_on_todo=None, keep=False)

    verify = commands.add_parser(
        "verify", help="run a script and its conversion on the same data and compare outputs",
        description=(
            "Run the original pandas script and the converted Polars script, each in its own "
            "temporary copy of DIR, and compare every file they write and every frame left in "
            "their globals. This RUNS THE SCRIPTS: it is the same trust as running them "
            "yourself. Exit codes: 0 same, 1 different, 2 error."))
    verify.add_argument("original", help="the pandas script")
    verify.add_argument("converted", nargs="?",
                        help="the converted script (default: convert ORIGINAL in memory)")
    verify.add_argument("--data", metavar="DIR", default=None,
                        help="the folder the script runs in (copied; never written); without "
                             "it, porter makes the CSV files the script reads from the script "
                             "itself and runs randomised trials on them")
    verify.add_argument("--synthesize", action="store_true",
                        help="make the input files from the script even with --data: their "
                             "columns, types and values then come from the first --sample-rows "
                             "rows of DIR's files")
    _verify_options(verify)
    _trial_options(verify)
    _debug_option(verify)

    scan = commands.add_parser(
        "scan", help="readiness report: what porter would convert, write nothing",
        description=(
            "Analyse pandas scripts and folders without writing anything: per file and in total, "
            "the pandas APIs used, the sites porter would convert and the TODOs by mapping key. "
            "Exit codes: 0 done; 1 a file failed, TODOs remain under --fail-on-todo, or --check "
            "found pandas code; 2 bad usage."))
    scan.add_argument("inputs", nargs="+", metavar="PATH", help="scripts and folders")
    _analysis_options(scan)
    scan.add_argument("-q", "--quiet", action="store_true", help="print nothing")

    report = commands.add_parser("report", help="work with JSON reports")
    report_commands = report.add_subparsers(dest="report_command", required=True,
                                            parser_class=_Parser)
    merge = report_commands.add_parser(
        "merge", help="merge the reports of shards into one",
        description="Concatenate the files of shard reports and recompute the summary; a file "
                    "in two reports is an error.")
    merge.add_argument("reports", nargs="+", metavar="REPORT.json")
    merge.add_argument("-o", "--output", required=True, metavar="MERGED.json")
    return parser


def _debug_option(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("--debug", action="store_true",
                        help="on an internal error, print porter's traceback too (it is always "
                             "in the --report)")


def _analysis_options(parser: argparse.ArgumentParser) -> None:
    """Options shared by convert and scan; None means: take [tool.porter] or the default."""
    parser.add_argument("--report", metavar="FILE.json", help="write the JSON report here")
    if sarif_available():
        parser.add_argument("--format", choices=("json", "sarif"), default="json",
                            help="format of --report: porter's JSON (default) or SARIF 2.1.0")
    parser.add_argument("--min-confidence", type=_confidence, default=None, metavar="X",
                        help="rewrites below this confidence become TODOs carrying the suggestion")
    parser.add_argument("--data", metavar="DIR",
                        help="folder the script runs in: input schemas are read from it (no data loaded)")
    _debug_option(parser)
    parser.add_argument("--fail-on-todo", action=argparse.BooleanOptionalAction, default=None,
                        help="exit 1 when TODOs remain")
    parser.add_argument("--check", action="store_true",
                        help="write nothing; exit 1 when pandas code porter could convert or a "
                             "TODO remains (for CI)")
    folder = parser.add_argument_group("folders")
    folder.add_argument("-j", "--jobs", type=_positive, default=None, metavar="N",
                        help="parallel processes (default: all cores)")
    folder.add_argument("--exclude", action="append", default=[], metavar="GLOB",
                        help="skip paths matching GLOB (relative to the folder, or a file or "
                             "folder name); repeatable, adds to [tool.porter] exclude")
    folder.add_argument("--max-size", type=_size, default=DEFAULT_MAX_SIZE, metavar="SIZE",
                        help="files larger than this fail (default 2MB)")
    folder.add_argument("--shard", type=_shard, default=None, metavar="K/N",
                        help="process only the K-th of N slices of the sorted file list")


def _trial_options(parser: argparse.ArgumentParser) -> None:
    trials = parser.add_argument_group("randomised trials")
    trials.add_argument("--trials", type=_count, default=0, metavar="K",
                        help="after the sample, run both scripts on K datasets drawn from it "
                             "(missing values, ties, duplicates, rounding halves, tiny tables); "
                             "each kind of disagreement is shrunk and its data written to a folder")
    trials.add_argument("--seed", type=int, default=0,
                        help="the trials' seed: the same seed draws the same datasets (default 0)")
    trials.add_argument("--trials-out", metavar="DIR", default=None,
                        help="where the smallest disagreeing dataset is written (default: here)")
    trials.add_argument("--sample-rows", type=_count, default=10_000, metavar="N",
                        help="rows of each data file the trials draw from, and --synthesize "
                             "reads types from: the first N (default 10000)")


def _verify_options(parser: argparse.ArgumentParser, outputs: bool = True) -> None:
    """The verification options; `outputs`: also --json and --keep."""
    group = parser.add_argument_group("verification")
    group.add_argument("--timeout", type=float, default=600.0, metavar="S",
                       help="seconds each side may run (default 600)")
    group.add_argument("--memory-limit", type=int, default=None, metavar="MB",
                       help="address-space limit of each side, in MiB")
    group.add_argument("--rtol", type=float, default=1e-9,
                       help="relative tolerance for floats (default 1e-9)")
    group.add_argument("--ignore-order", action="store_true",
                       help="compare tables as multisets of rows")
    group.add_argument("--reference-python", metavar="PATH", default=None,
                       help="run the original under this Python (one with the older pandas the "
                            "script was written for); it must have pandas")
    group.add_argument("--timing-runs", type=_count, default=1, metavar="N",
                       help="run each side N more times without capturing its frames and report "
                            "the median time and peak memory and their spread (default 1)")
    if not outputs:
        return
    group.add_argument("--json", metavar="FILE", help="write the verdict as JSON")
    group.add_argument("--keep", action="store_true",
                       help="keep both working copies and print where they are")


def _confidence(text: str) -> float:
    try:
        value = float(text)
    except ValueError:
        raise argparse.ArgumentTypeError(f"not a number: {text!r}") from None
    if not 0.0 <= value <= 1.0:
        raise argparse.ArgumentTypeError("must be between 0 and 1")
    return value


def _positive(text: str) -> int:
    try:
        value = int(text)
    except ValueError:
        raise argparse.ArgumentTypeError(f"not a whole number: {text!r}") from None
    if value < 1:
        raise argparse.ArgumentTypeError("must be at least 1")
    return value


def _count(text: str) -> int:
    try:
        value = int(text)
    except ValueError:
        raise argparse.ArgumentTypeError(f"not a whole number: {text!r}") from None
    if value < 0:
        raise argparse.ArgumentTypeError("must be 0 or more")
    return value


def _size(text: str) -> int:
    try:
        return parse_size(text)
    except ValueError as exc:
        raise argparse.ArgumentTypeError(str(exc)) from None


def _shard(text: str) -> tuple[int, int]:
    try:
        return parse_shard(text)
    except ValueError as exc:
        raise argparse.ArgumentTypeError(str(exc)) from None


def sarif_available() -> bool:
    try:
        return importlib.util.find_spec("porter.sarif") is not None
    except (ImportError, ValueError):
        return False


def main(argv: list[str] | None = None) -> int:
    args = build_parser().parse_args(argv)
    try:
        if args.command in ("convert", "scan", "review"):
            _apply_config(args, load_config())
        if args.command == "review":
            return review_command(args)
        if args.command == "convert":
            if args.check or args.in_place or Path(args.input).is_dir():
                return batch_command(args, [args.input])
            return convert(args)
        if args.command == "scan":
            return batch_command(args, args.inputs)
        if args.command == "report":
            _write(Path(args.output), json.dumps(merge_reports(args.reports), indent=2) + "\n")
            return EXIT_OK
        if args.command == "verify":
            converted = None
            if args.converted is not None:
                path = Path(args.converted)
                if not path.is_file():
                    raise ConversionError("no such file", args.converted)
                converted = path.read_text(encoding="utf-8")
            if args.data is None or args.synthesize:
                return _verify_without_data(args, converted)
            return run_verify(args, args.original, converted,
                              args.converted or "(converted in memory)", sys.stdout)
    except ConversionError as exc:
        print(f"porter: {exc}", file=sys.stderr)
        return EXIT_USAGE
    except MappingFileError as exc:
        print(f"porter: mapping table: {exc}", file=sys.stderr)
        return EXIT_USAGE
    except InternalError as exc:  # a bug in porter: say where, keep the traceback for --debug
        print(f"porter: {exc}", file=sys.stderr)
        if getattr(args, "debug", False) and exc.traceback:
            print(exc.traceback, file=sys.stderr, end="")
        return EXIT_INTERNAL
    return EXIT_USAGE


def _apply_config(args: argparse.Namespace, config: Config) -> None:
    """The command line wins over [tool.porter]; --exclude adds to its exclude list."""
    if args.min_confidence is None:
        args.min_confidence = config.min_confidence if config.min_confidence is not None else 0.0
    if args.fail_on_todo is None:
        args.fail_on_todo = bool(config.fail_on_todo)
    if args.jobs is None:
        args.jobs = config.jobs or os.cpu_count() or 1
    args.exclude = [*config.exclude, *args.exclude]


def batch_command(args: argparse.Namespace, paths: list[str]) -> int:
    """Folders (and `scan`, `--check`, `--in-place` on files): the work lives in porter.batch."""
    if args.data is not None and not Path(args.data).is_dir():
        raise ConversionError("no such folder", args.data)
    scanning = args.command == "scan" or args.check
    if args.command == "convert" and not scanning:
        if args.diff:
            raise ConversionError("--diff works on one script, not a folder", args.input)
        if args.verify:
            raise ConversionError("--verify works on one script, not a folder", args.input)
        if args.in_place and args.output not in (None, "-"):
            raise ConversionError("give either -o OUT_DIR or --in-place, not both", args.input)
        if not args.in_place and args.output in (None, "-"):
            raise ConversionError("converting a folder needs -o OUT_DIR (or --in-place)", args.input)
    options = BatchOptions(
        options=Options(min_confidence=args.min_confidence, data_dir=args.data),
        mode="scan" if scanning else "convert",
        jobs=args.jobs, max_size=args.max_size, excludes=tuple(args.exclude), shard=args.shard,
        in_place=getattr(args, "in_place", False) and not scanning,
        output_dir=None if scanning or args.in_place else args.output,
        progress=not args.quiet, keep_text=bool(getattr(args, "html", None)))
    batch = run_batch(paths, options)
    results = batch.results
    if getattr(args, "html", None):
        _write_review(Path(args.html), ", ".join(paths), results, None, folder=True)
    if args.report:
        if getattr(args, "format", "json") == "sarif":
            from porter.sarif import to_sarif
            document = to_sarif(results)
        else:
            document = folder_report(results, command=options.mode, shard_of=args.shard,
                                     notes=batch.notes)
        _write(Path(args.report), json.dumps(document, indent=2) + "\n")
    problems = check_problems(results) if args.check else []
    if not args.quiet:
        if args.command == "scan":
            print(scan_text(results, batch.notes))
        else:
            print(scan_text(results, batch.notes) if args.check
                  else folder_summary_text(results, batch.notes), file=sys.stderr)
        for problem in problems:
            print(f"porter: check failed: {problem}", file=sys.stderr)
    failures = any(r.status == "failed" for r in results)
    todos = args.fail_on_todo and any(r.todos for r in results)
    if getattr(args, "debug", False):
        for result in results:
            if result.traceback:
                print(f"porter: {result.source}:\n{result.traceback}", file=sys.stderr, end="")
    if any(r.traceback for r in results):
        return EXIT_INTERNAL
    return EXIT_TODO if failures or todos or problems else EXIT_OK


def convert(args: argparse.Namespace) -> int:
    if args.data is not None and not Path(args.data).is_dir():
        raise ConversionError("no such folder", args.data)
    options = Options(min_confidence=args.min_confidence, data_dir=args.data)
    output = None if args.diff or args.output in (None, "-") else args.output
    try:
        result = convert_file(args.input, options=options, output=output)
    except InternalError as exc:  # nothing is written but the report, which keeps the traceback
        if args.report:
            failed = FileResult(args.input, None, "", "", (), "failed", str(exc), exc.traceback)
            _write(Path(args.report), json.dumps(report_json([failed]), indent=2) + "\n")
        raise
    if args.diff:
        sys.stdout.writelines(difflib.unified_diff(
            result.original_text.splitlines(keepends=True),
            result.converted_text.splitlines(keepends=True),
            fromfile=args.input, tofile=f"{args.input} (polars)"))
    elif output is None:
        sys.stdout.write(result.converted_text)
    else:
        _write(Path(output), result.converted_text)
    if args.report:
        if getattr(args, "format", "json") == "sarif":
            from porter.sarif import to_sarif
            document = to_sarif([result])
        else:
            document = report_json([result])
        _write(Path(args.report), json.dumps(document, indent=2) + "\n")
    if not args.quiet:
        print(summary_text([result]), file=sys.stderr)
    code = EXIT_TODO if args.fail_on_todo and result.todos else EXIT_OK
    verdicts = None
    if args.verify:
        if args.data is None:
            raise ConversionError("--verify needs --data DIR (the folder the script runs in)")
        verified, verdict = _run_verify(args, args.input, result.converted_text,
                                        output or "(converted)", sys.stderr)
        verdicts = {result.source: verdict}
        code = max(code, verified)
    if args.html:
        _write_review(Path(args.html), args.input, [result], verdicts, folder=False)
    return code


def review_command(args: argparse.Namespace) -> int:
    from porter.review.run import ReviewOptions, review
    from porter.verify.api import VerifyOptions
    done = review(args.input, ReviewOptions(
        options=Options(min_confidence=args.min_confidence, data_dir=args.data),
        low=args.low, verify=args.verify,
        verify_options=VerifyOptions(timeout=args.timeout, memory_mib=args.memory_limit,
                                     rtol=args.rtol, ignore_order=args.ignore_order,
                                     timing_runs=args.timing_runs,
                                     reference_python=args.reference_python),
        jobs=args.jobs, excludes=tuple(args.exclude), max_size=args.max_size, title=args.title,
        progress=not args.quiet, trials=args.trials, seed=args.seed,
        trials_out=args.trials_out, sample_rows=args.sample_rows))
    _write(Path(args.output), done.html)
    if not args.quiet:
        todos = sum(len(r.todos) for r in done.results)
        print(f"porter: review of {len(done.results)} file(s), {todos} TODO(s) written to "
              f"{args.output}", file=sys.stderr)
    return EXIT_OK


def _write_review(path: Path, source: str, results: list, verdicts: dict | None, *,
                  folder: bool) -> None:
    from porter.review import render_review
    _write(path, render_review(results, verdicts=verdicts, folder=folder,
                               title=f"porter review of {source}"))


def run_verify(args: argparse.Namespace, original: str, converted: str | None, label: str,
               stream: TextIO) -> int:
    return _run_verify(args, original, converted, label, stream)[0]


def _run_verify(args: argparse.Namespace, original: str, converted: str | None, label: str,
                stream: TextIO):  # type: ignore[no-untyped-def]
    from porter.verify.api import VerifyOptions, verify
    from porter.verify.text import kept_folders, render
    trials_out = getattr(args, "trials_out", None)
    if trials_out and not Path(trials_out).is_dir():  # said before anything runs
        raise ConversionError("no such folder (--trials-out)", trials_out)
    options = VerifyOptions(timeout=args.timeout, memory_mib=args.memory_limit, rtol=args.rtol,
                            ignore_order=args.ignore_order, keep=args.keep,
                            timing_runs=args.timing_runs,
                            reference_python=getattr(args, "reference_python", None))
    result = verify(original, converted, args.data, options)
    print(render(result, original, label), file=stream)
    if args.keep:
        print(kept_folders(result), file=stream)
    report = result.to_json()
    trials = None
    if getattr(args, "trials", 0) and result.original.exit_code == 0:
        # (when the original fails on the sample itself, trials drawn from it tell nothing)
        trials = _run_trials(args, original, converted, options, stream)
        report["trials"] = trials.to_json()
    if args.json:
        _write(Path(args.json), json.dumps(report, indent=2) + "\n")
    if result.verdict == "same" and (trials is None or not trials.disagreements):
        return EXIT_OK, result
    return (EXIT_USAGE if result.verdict == "error" else EXIT_TODO), result


def _verify_without_data(args: argparse.Namespace, converted: str | None) -> int:
    """`porter verify SCRIPT` with no --data (or with --synthesize): the inputs made from the
    script (their types from --data's files when given), then trials."""
    import tempfile
    from porter.api import convert_source
    from porter.model import Options
    from porter.verify.synthesize import synthesize_checked
    original = Path(args.original)
    if not original.is_file():
        raise ConversionError("no such script", args.original)
    types_from = Path(args.data) if args.data is not None else None
    if types_from is not None and not types_from.is_dir():
        raise ConversionError("no such folder (--data is the folder the script runs in)",
                              args.data)
    text = original.read_text(encoding="utf-8")
    if converted is None:  # the conversion `porter convert` gives (with --data when given)
        converted = convert_source(text, path=str(original), options=Options(
            data_dir=args.data)).converted_text
    out = Path(args.trials_out) if args.trials_out else Path.cwd()
    if not out.is_dir():
        raise ConversionError("no such folder", str(out))
    with tempfile.TemporaryDirectory(prefix="porter-sample-") as work:
        sample = Path(work) / "sample"
        sizes = synthesize_checked(original, sample, seed=args.seed, types_from=types_from,
                                   sample_rows=args.sample_rows)
        made = ", ".join(f"{path} ({rows} rows)" for path, rows in sizes.items())
        how = f"the types of {args.data}'s files" if types_from is not None else "no --data"
        print(f"porter: {how}: made {made} from the script", file=sys.stderr)
        args.data = str(sample)
        if not args.trials:
            args.trials = 10
        code, result = _run_verify(args, args.original, converted,
                                   args.converted or "(converted in memory)", sys.stdout)
        if result.original.exit_code != 0:
            print("  the original script itself fails on the data porter made from it: the "
                  "code does not tell enough of what its input holds; give the script's "
                  "folder with --data", file=sys.stdout)
        if result.verdict != "same":  # keep the sample that shows it
            kept = out / f"porter-sample-{args.seed}"
            if kept.exists():
                shutil.rmtree(kept)
            shutil.copytree(sample, kept)
            print(f"  the sample porter made is kept in {kept}; show it again with:\n"
                  f"    porter verify {args.original}"
                  + (f" {args.converted}" if args.converted else "") + f" --data {kept}")
    return code


def _run_trials(args: argparse.Namespace, original: str, converted: str | None, options,
                stream: TextIO):  # type: ignore[no-untyped-def]
    from porter.api import convert_source
    from porter.model import Options
    from porter.verify.trials import TrialOptions, render, run_trials
    # the conversion of the original: its text when none was given, and its sites, which a
    # disagreement names where they stand behind the outputs that differ
    conversion = convert_source(Path(original).read_text(encoding="utf-8"), path=original,
                                options=Options(data_dir=args.data))
    if converted is None:
        converted = conversion.converted_text
    out = Path(args.trials_out) if args.trials_out else None
    if out is not None and not out.is_dir():
        raise ConversionError("no such folder", str(out))
    trials = run_trials(original, converted, args.data,
                        TrialOptions(trials=args.trials, seed=args.seed, out=out,
                                     sample_rows=getattr(args, "sample_rows", 10_000)), options,
                        progress=lambda line: print(f"porter: {line}", file=sys.stderr),
                        converted_path=args.converted, sites=conversion.sites)
    print(render(trials), file=stream)
    return trials


def _write(path: Path, text: str) -> None:
    """Write completely or not at all: a temporary file renamed into place."""
    if path.parent and not path.parent.exists():
        raise ConversionError("the output folder does not exist", str(path.parent))
    write_atomic(path, text.encode("utf-8"))


if __name__ == "__main__":  # pragma: no cover
    sys.exit(main())
