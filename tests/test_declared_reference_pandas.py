"""A corpus case may declare the pandas it was written for (corpus/<case>/reference.txt, pip
requirements one a line): porter.verify.declared gives the Python to run its original under,
built once and cached; where it cannot be built the reason says why."""

from __future__ import annotations

import pytest

from corpus_check import CORPUS, cases
from porter.verify import declared


def test_requirements_are_read_one_a_line_without_comments(tmp_path):
    (tmp_path / "reference.txt").write_text("# written for pandas 1.5\npandas==1.5.3\n\nnumpy<2  # 1.5 needs it\n")
    assert declared.declared_requirements(tmp_path) == ("pandas==1.5.3", "numpy<2")


def test_a_case_without_the_file_runs_under_porters_python(tmp_path):
    assert declared.declared_requirements(tmp_path) == ()
    assert declared.python_for(tmp_path) is None


def test_a_python_that_cannot_be_built_is_refused_with_the_reason(tmp_path, monkeypatch):
    monkeypatch.setenv("PORTER_REFERENCE_CACHE", str(tmp_path / "cache"))
    monkeypatch.setenv("PIP_NO_INDEX", "1")
    monkeypatch.setenv("PIP_FIND_LINKS", "")
    monkeypatch.setattr(declared, "_BUILT", {})
    (tmp_path / "reference.txt").write_text("pandas==0.0.404\n")
    with pytest.raises(declared.ReferenceUnavailable, match="cannot build a Python with pandas==0.0.404"):
        declared.python_for(tmp_path)
    # nothing half-built is left in the cache
    assert not [p for p in (tmp_path / "cache").iterdir() if not p.name.startswith(".")]


def test_the_corpus_cases_that_declare_a_pandas_name_an_older_one():
    old = [c for c in cases() if declared.declared_requirements(CORPUS / c)]
    assert len(old) >= 1
    for case in old:
        pins = [r for r in declared.declared_requirements(CORPUS / case) if r.startswith("pandas==")]
        assert pins and pins[0] < "pandas==3", (case, pins)
