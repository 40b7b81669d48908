"""Each converted corpus script reads each input file once.

Speed is the reason people port. A converted script that runs a shared plan once per consumer
reads its inputs again for every output; porter collects such a plan once, where it is bound
(the materialisation model, docs/design.md). This test runs each converted corpus script with
Polars' execution entry points wrapped, and counts, per input file, the plans that scan it.
"""

from __future__ import annotations

import json
from pathlib import Path
import shutil
import subprocess
import sys

import pytest

from corpus_check import CORPUS, cases
from porter.api import convert_file

COUNTING = r'''
import collections, json, re, runpy, sys
import polars as pl

scans = collections.Counter()
busy = []

def record(frames):
    if not busy:  # a sink may execute through collect: one execution, counted once
        for frame in frames:
            for path in set(re.findall(r"SCAN \[([^\]]+)\]", frame.explain(optimized=False))):
                scans[path] += 1

def counted(method, frames_of):
    def run(*args, **kwargs):
        record(frames_of(*args))
        busy.append(1)
        try:
            return method(*args, **kwargs)
        finally:
            busy.pop()
    return run

for name in ("collect", "sink_csv", "sink_parquet", "sink_ndjson", "sink_ipc"):
    setattr(pl.LazyFrame, name, counted(getattr(pl.LazyFrame, name), lambda self, *a: [self]))
pl.collect_all = counted(pl.collect_all, lambda frames, *a: list(frames))
runpy.run_path(sys.argv[1], run_name="__main__")
with open("scans.json", "w", encoding="utf-8") as handle:
    json.dump(scans, handle)
'''


@pytest.mark.parametrize("name", cases())
def test_each_input_file_is_read_once(name, tmp_path):
    work = tmp_path / name
    shutil.copytree(CORPUS / name, work)
    script = work / f"{name}.py"
    script.write_text(convert_file(CORPUS / name / f"{name}.py").converted_text, encoding="utf-8")
    done = subprocess.run([sys.executable, "-c", COUNTING, script.name], cwd=work,
                          capture_output=True, text=True, timeout=300)
    assert done.returncode == 0, done.stderr[-2000:]
    scans = json.loads((work / "scans.json").read_text(encoding="utf-8"))
    twice = {path: n for path, n in scans.items() if n > 1}
    assert not twice, f"input files read more than once: {twice}"
