"""`porter review`: convert in memory (a script, or a folder in scan mode), optionally verify,
and render the review page. Nothing but the page is written, and that by the caller."""

from __future__ import annotations

from dataclasses import dataclass, field
from pathlib import Path

from porter.api import convert_file
from porter.batch import DEFAULT_MAX_SIZE, BatchOptions, run_batch
from porter.model import ConversionError, FileResult, Options
from porter.review.model import DEFAULT_LOW
from porter.review.render import render_review
from porter.verify.model import VerifyResult


@dataclass(frozen=True)
class ReviewOptions:
    options: Options = Options()
    low: float = DEFAULT_LOW
    verify: bool = False
    verify_options: object | None = None  # porter.verify.api.VerifyOptions
    jobs: int = 1
    excludes: tuple[str, ...] = ()
    max_size: int = DEFAULT_MAX_SIZE
    title: str | None = None
    progress: bool = False
    trials: int = 0  # with verify: randomised trials per script (porter.verify.trials)
    seed: int = 0
    trials_out: str | None = None
    sample_rows: int = 10_000  # rows of each data file the trials draw from


@dataclass
class Review:
    html: str
    results: list[FileResult]
    verdicts: dict[str, VerifyResult] = field(default_factory=dict)
    notes: list[str] = field(default_factory=list)
    trials: dict[str, object] = field(default_factory=dict)  # TrialsResult by source


def verify_results(results: list[FileResult], data_dir: str,
                   verify_options: object | None = None) -> dict[str, VerifyResult]:
    """The verdict of every converted script, by source (runs the scripts)."""
    from porter.verify.api import verify
    verdicts = {}
    for result in results:
        if result.status == "converted" and result.converted_text:
            verdicts[result.source] = verify(result.source, result.converted_text, data_dir,
                                             verify_options)  # type: ignore[arg-type]
    return verdicts


def review(src: str, options: ReviewOptions = ReviewOptions()) -> Review:
    path = Path(src)
    data_dir = options.options.data_dir
    if data_dir is not None and not Path(data_dir).is_dir():
        raise ConversionError("no such folder", data_dir)
    if options.verify and data_dir is None:
        raise ConversionError("--verify needs --data DIR (the folder the scripts run in)")
    if options.trials and not options.verify:
        raise ConversionError("--trials needs --verify (the trials run the scripts)")
    notes: list[str] = []
    if path.is_dir():
        batch = run_batch([src], BatchOptions(
            options=options.options, mode="scan", jobs=options.jobs, max_size=options.max_size,
            excludes=options.excludes, progress=options.progress, keep_text=True))
        results, notes, folder = batch.results, batch.notes, True
    else:
        results, folder = [convert_file(src, options=options.options)], False
    verdicts = verify_results(results, data_dir, options.verify_options) if options.verify else {}
    trials = trial_results(results, data_dir, options) if options.verify and options.trials else {}
    title = options.title or f"porter review of {src}"
    html = render_review(results, verdicts=verdicts, title=title, low=options.low, folder=folder,
                         trials=trials)
    return Review(html, results, verdicts, notes, trials)  # type: ignore[arg-type]


def trial_results(results: list[FileResult], data_dir: str, options: ReviewOptions) -> dict:
    """The randomised trials of every converted script, by source (runs the scripts)."""
    from porter.verify.trials import TrialOptions, run_trials
    out = Path(options.trials_out) if options.trials_out else None
    found = {}
    for result in results:
        if result.status == "converted" and result.converted_text:
            found[result.source] = run_trials(
                result.source, result.converted_text, data_dir,
                TrialOptions(trials=options.trials, seed=options.seed, out=out,
                             sample_rows=options.sample_rows),
                options.verify_options, sites=result.sites)  # type: ignore[arg-type]
    return found
