"""Every corpus script converts, and the converted script writes the same tables as pandas.

pandas is the reference: each case runs the original script with pandas and the converted one
with Polars, each in its own copy of the case folder, and compares every file they write.
"""

from __future__ import annotations

import pytest

from corpus_check import CORPUS, KNOWN_TIES, cases, compare_case, run_case


def test_corpus_is_big_enough():
    assert len(cases()) >= 12


@pytest.mark.parametrize("name", cases())
def test_corpus_case_gives_the_same_outputs(name, tmp_path):
    run = run_case(name, tmp_path)
    compare_case(run, KNOWN_TIES.get(name))


@pytest.mark.parametrize("name", cases())
def test_knowing_the_data_adds_no_todo(name):
    # with --data porter knows the columns and their types: it may port more, never less
    from porter.api import convert_file
    from porter.model import Options

    script = CORPUS / name / f"{name}.py"

    def todos(options: Options | None) -> list[str]:
        return [s.key for s in convert_file(script, options=options).sites if s.status == "todo"]

    blind, informed = todos(None), todos(Options(data_dir=str(CORPUS / name)))
    assert len(informed) <= len(blind), f"with --data: {informed}; without: {blind}"
