"""The mapping table, the registered rules and the generated docs agree."""

from __future__ import annotations

from pathlib import Path

import inspect

import pytest

from porter import coverage
from porter.mapping import MappingFileError, load_files, load_table
from porter.rules import registry
from support import convert

TABLE = load_table()
RULES = registry()


def test_every_rule_has_a_ported_or_handover_entry():
    missing = sorted(k for k in RULES if k not in TABLE)
    assert not missing, f"rules without a mapping entry: {missing}"
    todo = sorted(k for k in RULES if TABLE.get(k).status == "todo")
    assert not todo, f"rules registered for keys the table marks todo: {todo}"


def test_every_ported_entry_has_a_rule():
    missing = sorted(e.key for e in TABLE if e.status != "todo" and e.key not in RULES)
    assert not missing, f"entries without a rule: {missing}"


def test_every_ported_entry_has_cases_to_measure_it():
    # element.* keys are the parts of a function given to map/apply: their sites are folded
    # into series.map's and series.apply's, whose cases measure them (mappings/elementwise.toml)
    # an API pandas 3 removed (applymap, append) cannot run there: `measured_as` names the
    # key whose cases measure what it did
    # key whose cases measure what it did; one with no spelling today (lookup) names, in
    # `measured_by`, the test file that checks it against the older pandas itself
    root = Path(__file__).resolve().parent.parent
    missing = sorted(e.key for e in TABLE if e.status == "ported" and not e.extra.get("cases")
                     and not e.key.startswith("element.")
                     and TABLE.get(str(e.extra.get("measured_as", ""))) is None
                     and not (e.extra.get("measured_by")
                              and (root / str(e.extra["measured_by"])).is_file()))
    assert not missing, f"ported entries without cases (tests/trial_cases.py): {missing}"


def test_one_rule_name_per_function():
    names: dict[str, set[str]] = {}
    for key, fn in RULES.items():
        names.setdefault(fn.__name__, set()).add(TABLE.get(key).rule)
    mixed = {fn: ids for fn, ids in names.items() if len(ids) > 1}
    assert not mixed, f"one function registered under several rule names: {mixed}"


def test_every_rule_is_documented():
    for key, fn in RULES.items():
        doc = inspect.getdoc(fn) or ""
        assert "->" in doc.splitlines()[0], f"{fn.__name__} ({key}) needs a 'pandas -> Polars' first line"


def test_confidences_are_probabilities():
    for entry in TABLE:
        assert 0.0 <= entry.confidence <= 1.0
        if entry.status == "todo":
            assert entry.advice, entry.key


def test_docs_coverage_is_current():
    assert coverage.DOC.read_text(encoding="utf-8") == coverage.render(TABLE), (
        "docs/coverage.md is out of date: run python -m porter.coverage")


@pytest.mark.parametrize("key,snippet", [
    pytest.param("frame.iterrows", "for _, row in df.iterrows():\n    print(row)\n", id="row loop"),
    pytest.param("frame.pivot_table", "t = df.pivot_table(index='a', values='b', margins=True)\n", id="pivot table"),
    pytest.param("frame.rolling.sum", "t = df.rolling(2).sum()\n", id="frame rolling"),
])
def test_todo_entries_never_produce_a_rewrite(key, snippet):
    result = convert("import pandas as pd\ndf = pd.DataFrame({'a': [1], 'b': [2]})\n" + snippet)
    assert f"# TODO(porter): {key}:" in result.converted_text
    assert [s.status for s in result.sites if s.key == key] == ["todo"]
    assert ".collect().to_pandas()" in result.converted_text


def test_bad_mapping_files_are_refused(tmp_path):
    bad = tmp_path / "bad.toml"
    bad.write_text('[frame.x]\nrule = "x"\nconfidence = 1.5\n')
    with pytest.raises(MappingFileError, match="confidence"):
        load_files([bad])
    bad.write_text('[frame.y]\nstatus = "todo"\n')
    with pytest.raises(MappingFileError, match="advice"):
        load_files([bad])
