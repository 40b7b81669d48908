"""The time and peak memory `porter verify` reports are each script's own.

The child reads them the moment the script ends, before it collects and pickles the frames the
script left (the capture), which is reported apart; `--timing-runs N` repeats each side N more
times without capture and reports the median and the spread. No test here compares the speed
of two scripts: the only time bounds are a known sleep, with a wide margin.
"""

from __future__ import annotations

import json
from pathlib import Path
from statistics import median

from porter.cli import main
from porter.verify.api import VerifyOptions, verify
from porter.verify.model import SideRun, VerifyResult
from porter.verify.text import render, speed_claim

MIB = 2**20


def _script(tmp_path: Path, text: str, name: str = "job.py") -> Path:
    data = tmp_path / "data"
    data.mkdir(exist_ok=True)
    script = data / name
    script.write_text(text)
    return script


# Collecting `slow` sleeps 3 s; collecting `big` builds a 153 MiB column. Neither runs while the
# script runs: both are plans, and only the verifier's capture collects them.
COSTLY_LAZY_GLOBALS = """\
import time
import polars as pl

def slow_identity(s):
    time.sleep(3)
    return s

slow = pl.LazyFrame({"x": [1, 2]}).select(pl.col("x").map_batches(slow_identity, return_dtype=pl.Int64))
big = pl.LazyFrame().select(pl.int_range(0, 20_000_000).alias("n"))
"""


def test_capturing_costly_lazy_globals_is_not_counted(tmp_path):
    script = _script(tmp_path, COSTLY_LAZY_GLOBALS)
    result = verify(script, COSTLY_LAZY_GLOBALS, script.parent)
    assert result.verdict == "same", result.to_json()  # the capture did collect both frames
    for run in (result.original, result.converted):
        assert run.measured == "script"
        # the capture slept its 3 s and is reported apart ...
        assert run.capture_s is not None and run.capture_s >= 3.0
        # ... and none of it is in the script's own time (importing Polars takes well under
        # 3 s; before the fix the reported time included the sleep)
        assert run.wall_s < 3.0, run
        # nor in its peak memory: the 153 MiB column exists only during the capture (the
        # script itself is Polars' import, about 50 MiB)
        assert run.peak_mib is not None and run.peak_mib < 130, run
    data = result.to_json()["original"]
    assert data["capture_s"] >= 3.0 and data["wall_s"] < 3.0 and data["measured"] == "script"


ALLOCATES = "import numpy as np\nblock = np.ones({size} // 8)  # every page written\n"


def test_the_peak_memory_of_a_known_allocation(tmp_path):
    size = 256 * MIB
    with_block = ALLOCATES.format(size=size)
    without_block = ALLOCATES.format(size=0)
    script = _script(tmp_path, with_block)
    result = verify(script, without_block, script.parent)
    allocating, control = result.original, result.converted
    assert allocating.peak_mib is not None and control.peak_mib is not None
    # the peak is the whole process's: the interpreter and numpy's import are in both sides,
    # so the difference is the array, within 5%
    assert abs((allocating.peak_mib - control.peak_mib) - size / MIB) < 0.05 * size / MIB, \
        (allocating, control)
    assert size / MIB <= allocating.peak_mib < size / MIB + 100
    # the interpreter's own start-up memory is reported, and is part of the peak
    assert allocating.baseline_mib is not None and 0 < allocating.baseline_mib < control.peak_mib


def test_the_verifiers_own_memory_is_not_counted(tmp_path):
    # Linux's ru_maxrss of a child starts from the memory of the process that forked it: a
    # verifier holding 400 MiB made an empty script report over 400 MiB
    held = b"\x01" * (400 * MIB)  # every page written, so resident
    script = _script(tmp_path, "x = 1\n")
    result = verify(script, "x = 1\n", script.parent)
    assert len(held) == 400 * MIB
    for run in (result.original, result.converted):
        assert run.peak_mib is not None and run.peak_mib < 100, run


COUNTS_ITS_RUNS = """\
import polars as pl
from pathlib import Path

LOG = Path({log!r})
with LOG.open("a") as log:
    log.write("run\\n")

def noted(s):
    with LOG.open("a") as log:
        log.write("collect\\n")
    return s

plan = pl.LazyFrame({{"x": [1]}}).select(pl.col("x").map_batches(noted, return_dtype=pl.Int64))
pl.DataFrame({{"x": [1, 2]}}).write_csv("out.csv")
"""


def test_timing_runs_repeat_each_side_without_capture(tmp_path, capsys):
    log = tmp_path / "log.txt"
    text = COUNTS_ITS_RUNS.format(log=str(log))
    script = _script(tmp_path, text)
    report = tmp_path / "verdict.json"
    assert main(["verify", str(script), str(script), "--data", str(script.parent),
                 "--timing-runs", "2", "--json", str(report)]) == 0
    lines = log.read_text().splitlines()
    # two sides, three runs each; the plan was collected once per side, by the verifying run
    assert lines.count("run") == 6 and lines.count("collect") == 2
    data = json.loads(report.read_text())
    for side in ("original", "converted"):
        run = data[side]
        assert run["runs"] == 3 and len(run["wall_s_runs"]) == 3 and len(run["peak_mib_runs"]) == 3
        assert run["wall_s"] == round(median(run["wall_s_runs"]), 3)
        assert run["peak_mib"] == round(median(run["peak_mib_runs"]), 1)
    out = capsys.readouterr().out
    assert "the median of 3 runs each" in out
    # the timing runs' working copies are gone; the user's folder holds only the script
    assert sorted(p.name for p in script.parent.iterdir()) == ["job.py"]


def test_the_default_command_line_adds_one_timing_run(tmp_path):
    script = _script(tmp_path, "x = 1\n")
    report = tmp_path / "verdict.json"
    assert main(["verify", str(script), str(script), "--data", str(script.parent),
                 "--json", str(report)]) == 0
    data = json.loads(report.read_text())
    assert data["original"]["runs"] == 2 and data["converted"]["runs"] == 2
    assert "workdir" not in data["original"]  # removed without --keep: not named
    assert main(["verify", str(script), str(script), "--data", str(script.parent),
                 "--timing-runs", "0", "--json", str(report)]) == 0
    assert json.loads(report.read_text())["original"]["runs"] == 1


def test_a_failed_timing_run_is_named_and_left_out(tmp_path):
    # the converted script fails from its second run on: its figures rest on its first run
    log = tmp_path / "runs.txt"
    failing = (f"from pathlib import Path\nLOG = Path({str(log)!r})\n"
               "earlier = LOG.read_text() if LOG.exists() else ''\n"
               "LOG.write_text(earlier + 'x')\n"
               "if earlier:\n    raise SystemExit(5)\n")
    script = _script(tmp_path, "x = 1\n")
    result = verify(script, failing, script.parent, VerifyOptions(timing_runs=2))
    assert result.verdict == "same"
    assert result.original.runs == 3 and result.converted.runs == 1
    assert any("timing run 1 of the converted script crashed" in n and "1 run(s)" in n
               for n in result.notes), result.notes
    assert log.read_text() == "xx"  # not tried again after it failed


def test_a_crash_keeps_the_scripts_figures_a_time_out_does_not(tmp_path):
    crash = _script(tmp_path, "raise ValueError('the ferry sank')\n")
    result = verify(crash, None, crash.parent)
    assert result.original.failure == "crashed" and result.original.measured == "script"
    assert result.original.peak_mib is not None
    assert "ValueError: the ferry sank" in result.original.stderr
    hang = _script(tmp_path, "import time\nwhile True:\n    time.sleep(0.1)\n", "hang.py")
    result = verify(hang, None, hang.parent, VerifyOptions(timeout=2, timing_runs=3))
    run = result.original
    assert run.failure == "timed out" and run.measured == "process" and run.peak_mib is None
    assert 2 <= run.wall_s < 10 and run.runs == 1  # no timing runs after a failure
    assert "did not reach its end" in render(result, "hang.py", "converted")


# ------------------------------------------------------------------ what is said about speed

def _result(original: SideRun, converted: SideRun) -> VerifyResult:
    return VerifyResult("same", (), original, converted)


def test_the_speed_claim_says_how_many_runs_it_rests_on():
    one = _result(SideRun(0, 1.0, 100.0), SideRun(0, 0.25, 50.0))
    claim = speed_claim(one)
    assert claim is not None and "4.0× less time" in claim and "1 run each" in claim
    assert "--timing-runs" in claim  # a single run is flagged as such
    apart = _result(SideRun(0, 1.0, 100.0).with_runs([1.1, 0.9], [100.0, 100.0]),
                    SideRun(0, 0.5, 50.0).with_runs([0.6, 0.55], [50.0, 50.0]))
    claim = speed_claim(apart)
    assert claim is not None and "the median of 3 runs each" in claim
    assert "1.8× less time" in claim and "--timing-runs" not in claim
    overlapping = _result(SideRun(0, 1.0, 100.0).with_runs([0.7, 1.2], [100.0, 100.0]),
                          SideRun(0, 0.8, 50.0).with_runs([0.9, 0.85], [50.0, 50.0]))
    claim = speed_claim(overlapping)
    assert claim is not None and claim.startswith("No clear difference")
    slower = _result(SideRun(0, 0.5, 100.0), SideRun(0, 1.0, 50.0))
    assert "2.0× more time" in (speed_claim(slower) or "")
    failed = _result(SideRun(0, 1.0, 100.0), SideRun(1, 0.2, None, failure="crashed"))
    assert speed_claim(failed) is None


def test_medians_and_spread_of_the_runs():
    run = SideRun(0, 1.0, 100.0).with_runs([3.0, 2.0, 0.5], [110.0, None, 90.0])
    assert run.runs == 4 and run.wall_s == 1.5 and run.peak_mib == 100.0
    data = run.to_json()
    assert data["wall_s_runs"] == [1.0, 3.0, 2.0, 0.5] and data["peak_mib_runs"] == [100.0, 110.0, 90.0]
    assert data["runs"] == 4


def test_the_review_page_shows_the_runs_and_the_claim():
    from porter.model import FileResult
    from porter.review import render_review
    original = SideRun(0, 1.0, 120.0, capture_s=0.75).with_runs([1.1, 0.9], [120.0, 121.0])
    converted = SideRun(0, 0.4, 60.5, capture_s=2.5).with_runs([0.45, 0.42], [60.5, 60.0])
    verdict = _result(original, converted)
    source = "import pandas as pd\ndf = pd.read_csv('a.csv')\n"
    result = FileResult("job.py", None, source, source, (), "unchanged")
    html = render_review([result], verdicts={"job.py": verdict})
    assert "1.00 s" in html and "0.90–1.10s" in html and "2.50 s" in html  # capture apart
    assert "the median of 3 runs each" in html and "× less time" in html
    assert "<th>runs</th>" in html


def test_the_demo_shows_the_scripts_own_figures(tmp_path, capsys):
    from porter.demo import main as demo
    case = tmp_path / "corpus" / "tiny"
    case.mkdir(parents=True)
    (case / "tiny.py").write_text("import pandas as pd\n"
                                  "pd.DataFrame({'x': [1, 2]}).to_csv('x.csv', index=False)\n")
    assert demo(["--corpus", str(tmp_path / "corpus"), "--out", str(tmp_path / "out"),
                 "--timing-runs", "0"]) == 0
    out = capsys.readouterr().out
    line = next(line for line in out.splitlines() if line.startswith("tiny"))
    assert "same" in line and line.count("MiB") == 2
    assert "1 run each" in out and "not the capture of its frames" in out
