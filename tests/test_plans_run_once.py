"""Each converted corpus script reads each input file once (counting rows apart).

Speed is the reason people port. A converted script that runs a shared plan once per consumer
reads its inputs again for every output; porter collects such a plan once, where it is bound
(the materialisation model, docs/design.md). This test runs each converted corpus script with
Polars' execution entry points wrapped, and counts, per input file, the plans that scan it.
A plan that only counts the rows of a read and filtered frame (`SELECT [len()]`) is not
counted: it streams over the file reading the columns its filters need and keeps nothing,
where keeping the frame for it would hold the whole file while every later plan runs.
"""

from __future__ import annotations

import json
import textwrap
from pathlib import Path
import shutil
import subprocess
import sys

import pytest

from corpus_check import CORPUS, cases
from porter.api import convert_file
from porter.model import Options

COUNTING = r'''
import collections, json, re, runpy, sys
import polars as pl

scans = collections.Counter()
busy = []

def record(frames):
    if not busy:  # a sink may execute through collect: one execution, counted once
        for frame in frames:
            plan = frame.explain()
            if "FAST COUNT" in plan and "SCAN [" not in plan:
                continue  # counting a file's rows reads no columns (len(df) of a plain read)
            if frame.explain(optimized=False).startswith("SELECT [len()]"):
                continue  # counting a filtered read's rows keeps nothing (cheap_to_recount)
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


@pytest.mark.parametrize("name", cases())
def test_no_line_runs_two_plans(name):
    # a reader sees where each plan runs: at most one .collect() per line of the output
    options = Options(data_dir=str(CORPUS / name))
    text = convert_file(CORPUS / name / f"{name}.py", options=options).converted_text
    crowded = [line for line in text.splitlines() if line.count(".collect()") > 1]
    assert not crowded, crowded


# -- the materialisation model on small scripts (docs/design.md) --------------------------------

def _converted(source: str) -> str:
    from porter.api import convert_source
    import textwrap
    return convert_source(textwrap.dedent(source)).converted_text


def test_a_frame_read_twice_by_one_plan_stays_lazy():
    # first and last rows per key of one sorted frame, joined into one output: one execution,
    # where Polars computes the shared sort once
    text = _converted('''
        import pandas as pd
        df = pd.read_csv("log.csv")
        week = df.sort_values(["k", "t"])
        first = week.groupby("k")[["t"]].first().reset_index()
        last = week.groupby("k")[["t"]].last().reset_index()
        first.merge(last, on="k").to_csv("out.csv", index=False)
        ''')
    week = text[text.index("week ="):text.index("first =")]
    assert ".collect()" not in week, text


def test_writes_batched_together_count_as_one_execution():
    text = _converted('''
        import pandas as pd
        df = pd.read_csv("log.csv")
        kept = df[df["n"] > 0]
        kept.groupby("k")["n"].sum().reset_index().to_csv("a.csv", index=False)
        kept.groupby("k")["n"].max().reset_index().to_csv("b.csv", index=False)
        ''')
    assert "pl.collect_all" in text, text
    assert ".collect()" not in text, text


def test_a_frame_shared_by_two_separate_outputs_is_collected_once():
    text = _converted('''
        import pandas as pd
        df = pd.read_csv("log.csv")
        kept = df[df["n"] > 0]
        kept.to_csv("a.csv", index=False)
        print(kept["n"].sum())
        ''')
    kept = text[text.index("kept ="):text.index("sink_csv")]
    assert ".collect()" in kept, text


def test_counting_the_rows_of_a_file_does_not_keep_the_frame():
    # len(df) of a plain read is a row count Polars takes from the file; the frame the rest of
    # the script works on is collected once, after its new column
    text = _converted('''
        import pandas as pd
        df = pd.read_csv("log.csv")
        print(len(df))
        df["m"] = df["n"] * 2
        df.to_csv("a.csv", index=False)
        print(df["m"].sum())
        ''')
    read = text[text.index("df ="):text.index("print(")]
    assert ".collect()" not in read, text
    assert ".collect().lazy()" in text[text.index("print("):], text


def test_counting_the_rows_of_a_filtered_read_does_not_keep_the_frame():
    # the count streams over the file again (only the filter's column) and keeps nothing;
    # collecting `kept` for it would hold every column while the write runs
    text = _converted('''
        import pandas as pd
        df = pd.read_csv("log.csv")
        df["m"] = df["n"] * 2
        kept = df[df["n"] > 0]
        print(len(kept))
        kept.to_csv("a.csv", index=False)
        ''')
    assert ".collect().lazy()" not in "".join(text.split()), text


def test_counting_a_filter_of_a_frame_kept_for_other_uses_counts_it_in_memory():
    # `gone` is counted; its parent `df` is collected for its two outputs, so the count reads
    # the frame in memory, and `gone` itself is never collected
    text = _converted('''
        import pandas as pd
        df = pd.read_csv("log.csv")
        df.to_csv("a.csv", index=False)
        gone = df[df["n"] <= 0]
        print(len(gone))
        print(df["n"].sum())
        ''')
    flat = "".join(text.split())
    assert flat.count(".collect().lazy()") == 1, text
    assert flat.index(".collect().lazy()") < flat.index("gone="), text


@pytest.mark.parametrize("step", [
    'kept = df[df["n"] > 0].sort_values("n")',
    'kept = df[df["s"].apply(readable)]',
    'kept = df.merge(df[["k"]].drop_duplicates(), on="k")',
    'kept = df.groupby("k", as_index=False)["n"].sum()',
])
def test_counting_the_rows_of_a_costly_plan_is_an_execution(step):
    # a sort, a Python function, a join or a group would run again for the count: the frame
    # is collected once and counted in memory
    text = _converted(f'''
        import pandas as pd
        def readable(text):
            try:
                return int(text.split("-")[0]) > 0
            except (AttributeError, ValueError):
                return False
        df = pd.read_csv("log.csv")
        {step}
        print(len(kept))
        kept.to_csv("a.csv", index=False)
        ''')
    kept = text[text.index("kept ="):text.index("print(")]
    assert ".collect()" in kept, text


def test_counting_rows_in_a_loop_is_an_execution_each_time():
    text = _converted('''
        import pandas as pd
        df = pd.read_csv("log.csv")
        kept = df[df["n"] > 0]
        for limit in (1, 2):
            print(limit, len(kept))
        kept.to_csv("a.csv", index=False)
        ''')
    kept = text[text.index("kept ="):text.index("for limit")]
    assert ".collect()" in kept, text


def test_counting_the_rows_of_a_filtered_frame_made_by_an_unknown_plan_is_an_execution():
    # a function's parameter: the plan it stands for is the caller's, which porter does not
    # see from inside the body, so the count keeps the frame
    text = _converted('''
        import pandas as pd
        def report(frame):
            kept = frame[frame["n"] > 0]
            print(len(kept))
            kept.to_csv("a.csv", index=False)
        report(pd.read_csv("log.csv").sort_values("n"))
        ''')
    kept = text[text.index("kept ="):text.index("print(")]
    assert ".collect()" in kept, text


def test_a_groupby_bound_to_a_name_runs_its_frames_plan():
    text = _converted('''
        import pandas as pd
        df = pd.read_csv("log.csv")
        kept = df[df["n"] > 0]
        kept.to_csv("a.csv", index=False)
        by_key = kept.groupby("k", as_index=False)
        print(by_key.agg(total=("n", "sum")))
        ''')
    kept = text[text.index("kept ="):text.index("sink_csv")]
    assert ".collect()" in kept, text


def test_a_frame_handed_to_pandas_before_a_loop_is_collected_once(tmp_path) -> None:
    # the put-back of a row function runs the plan, and so does every later output: the loop
    # that rebinds the frame between them had cut the chain, so the plan ran twice
    from support import convert
    text = convert(textwrap.dedent('''
        import pandas as pd
        def f(row):
            total = 0
            for c in ("n", "x"):
                total += 1 if row[c] == row[c] else 0
            return total
        df = pd.read_csv("e2.csv")
        df["k"] = df["k"].str.strip()
        df["h"] = df.apply(f, axis=1)
        df["s"] = 0
        for c in ["n", "x"]:
            df["s"] = df["s"] + df[c].isna()
        df.to_csv("o.csv", index=False)
        print(df["s"].sum())
        ''')).converted_text
    assert 'df = df.with_columns(k=pl.col("k").str.strip_chars(PANDAS_WHITESPACE)).collect().lazy()' in text, text


def test_two_results_of_one_frame_in_one_statement_are_two_executions():
    # print(a.mean(), a.max()) runs the plan once for each value: the frame is collected once
    text = _converted('''
        import pandas as pd
        df = pd.read_csv("log.csv")
        print(df["n"].mean(), df["n"].max())
        ''')
    read = text[text.index("df ="):text.index("print(")]
    assert ".collect()" in read, text


def test_a_plan_collected_by_the_next_statement_is_not_collected_before(tmp_path):
    # the weekday of a date that may be missing is float64 in pandas: its statement collects
    # the frame to type the column. That collect runs the date parse's plan once, so the parse
    # itself stays lazy (collecting it too kept two copies of the frame in memory)
    (tmp_path / "sailings.csv").write_text("sailed,kg\n2024-06-01,3\n,4\n2024-06-03,5\n")
    from porter.api import convert_source
    text = convert_source(textwrap.dedent('''
        import pandas as pd
        t = pd.read_csv("sailings.csv")
        t["sailed"] = pd.to_datetime(t["sailed"], format="%Y-%m-%d")
        t["weekday"] = t["sailed"].dt.dayofweek
        t = t.sort_values("sailed")
        print(t.head())
        t.to_csv("out.csv", index=False)
        '''), options=Options(data_dir=str(tmp_path))).converted_text
    parse = text[text.index('t = t.with_columns(\n    sailed='):text.index("weekday=")]
    assert ".collect()" not in parse, text
    assert text.count(".collect()") == 3, text  # the weekday, the sort (two uses), the print


def test_a_count_that_runs_the_plan_again_gives_pandas_values(tmp_path, monkeypatch):
    # missing values, NaN, duplicates, unicode and an empty result: the count of the filtered
    # rows and the rows themselves are pandas', with the frame left lazy for the count
    from support import differential
    (tmp_path / "cargo.csv").write_text(
        "kind,tons,port\nsalt,2,Ålesund\nsalt,2,Ålesund\nwool,,Sandvik\nfish,0.5,\n"
        "ore,3,Sandvik\nore,NaN,Åre\n", encoding="utf-8")
    monkeypatch.chdir(tmp_path)
    result = differential('''
        import numpy as np
        import pandas as pd
        df = pd.read_csv("cargo.csv")
        df["w"] = df["tons"] * 2
        df["w"] = df["w"].where(df["w"] != 4, np.nan)
        kept = df[df["w"] > 1]
        none = df[df["w"] > 1e9]
        n, m = len(kept), len(none)
        both = kept.drop_duplicates()
        ''', "n", "m", "kept", "none", "both")
    flat = "".join(result.converted_text.split())
    assert "kept=df.filter" in flat and ".collect().lazy()" not in flat, result.converted_text
