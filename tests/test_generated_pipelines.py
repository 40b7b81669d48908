"""Pipelines nobody wrote, checked against pandas (the reference implementation): hypothesis
chains up to eight steps real scripts use (tests/pipeline_programs.py) on small frames with
missing keys and values, NaN, ties, duplicates, accented text and dates; porter converts the
program and the Polars result must be the table pandas computes, to the last digit where every
site is stated at 1.0. A longer search runs on demand: `python tests/pipeline_programs.py`."""

from __future__ import annotations

from hypothesis import HealthCheck, assume, given, settings

from pipeline_programs import programs
from support import differential, run


@settings(max_examples=25, deadline=None, derandomize=True, database=None,
          suppress_health_check=list(HealthCheck))
@given(programs(8))
def test_a_generated_pipeline_computes_what_pandas_computes(program: str) -> None:
    try:
        run(program)
    except Exception:  # noqa: BLE001 - a program pandas refuses says nothing about porter
        assume(False)
    differential(program)
