"""Golden files: whole scripts and their expected conversion and sites.

Set PORTER_UPDATE_GOLDEN=1 to rewrite the expected files after a deliberate change (then read
the diff). The invariants below run on every golden and corpus output.
"""

from __future__ import annotations

import ast
import difflib
import os
from pathlib import Path
import re

import libcst as cst
import pytest

from porter.api import convert_source
from porter.model import FileResult

HERE = Path(__file__).resolve().parent
GOLDEN = HERE / "golden"
CORPUS = HERE.parent / "corpus"
UPDATE = os.environ.get("PORTER_UPDATE_GOLDEN") == "1"


def golden_inputs() -> list[tuple[str, Path, Path]]:
    cases = [(p.stem, p, GOLDEN / p.stem) for p in sorted(GOLDEN.glob("*.py"))
             if not p.name.endswith(".expected.py")]
    cases += [(f"corpus-{p.name}", p / f"{p.name}.py", GOLDEN / "corpus" / p.name)
              for p in sorted(CORPUS.iterdir()) if (p / f"{p.name}.py").is_file()]
    return cases


CASES = golden_inputs()
IDS = [c[0] for c in CASES]


def sites_text(result: FileResult) -> str:
    lines = [f"{s.line}-{s.end_line} {s.key} [{s.rule}] {s.status} {s.confidence:.2f} | {s.message}"
             for s in result.sites]
    return "\n".join(lines) + "\n"


def check_golden(path: Path, actual: str) -> None:
    if UPDATE or not path.exists():
        path.parent.mkdir(parents=True, exist_ok=True)
        path.write_text(actual, encoding="utf-8")
        if not UPDATE:
            pytest.fail(f"{path.name} did not exist: written, check it and commit it")
        return
    expected = path.read_text(encoding="utf-8")
    if expected != actual:
        diff = "".join(difflib.unified_diff(expected.splitlines(True), actual.splitlines(True),
                                            "expected", "actual"))
        pytest.fail(f"{path.name} differs:\n{diff}")


@pytest.fixture(scope="module")
def conversions() -> dict[str, FileResult]:
    return {name: convert_source(src.read_text(encoding="utf-8"), path=src.name)
            for name, src, _ in CASES}


def test_enough_golden_scripts():
    assert len(CASES) >= 25


@pytest.mark.parametrize("name,source,stem", CASES, ids=IDS)
def test_golden_output(name, source, stem, conversions):
    result = conversions[name]
    check_golden(stem.with_name(stem.name + ".expected.py"), result.converted_text)
    check_golden(stem.with_name(stem.name + ".sites.txt"), sites_text(result))


# -- invariants on every output ---------------------------------------------------------------

@pytest.mark.parametrize("name,source,stem", CASES, ids=IDS)
def test_output_parses(name, source, stem, conversions):
    ast.parse(conversions[name].converted_text)
    cst.parse_module(conversions[name].converted_text)


@pytest.mark.parametrize("name,source,stem", CASES, ids=IDS)
def test_converting_again_changes_nothing(name, source, stem, conversions):
    once = conversions[name].converted_text
    again = convert_source(once, path=source.name)
    assert again.converted_text == once
    # a value porter keeps as pandas' own where plain Python reads it (a pd.Timestamp constant
    # whose uses in expressions became pl.datetime) is found again, on its unchanged line
    lines = once.splitlines()
    assert all(s.status == "todo" or "pd." in lines[s.line - 1] for s in again.sites), \
        "a second pass found more to convert"


def _statement_lines(text: str) -> set[str]:
    """Whole source lines of the original that porter had no reason to touch."""
    return {line for line in text.splitlines() if line.strip()}


@pytest.mark.parametrize("name,source,stem", CASES, ids=IDS)
def test_untouched_lines_are_identical(name, source, stem, conversions):
    result = conversions[name]
    touched: set[int] = set()
    for site in result.sites:
        touched.update(range(site.line, site.end_line + 1))
    original = result.original_text.splitlines()
    output_lines = set(result.converted_text.splitlines())
    pandas_names = re.compile(r"\b(pd|pandas|read_csv|DataFrame)\b")
    for number, line in enumerate(original, start=1):
        if number in touched or not line.strip() or pandas_names.search(line):
            continue
        if re.match(r"\s*(import numpy|from numpy import)", line):
            continue  # dropped when the conversion no longer uses it (checked below)
        if _may_name_a_frame(line, result) or number in _left_out(result):
            continue
        assert line in output_lines, f"line {number} changed or vanished: {line!r}"


def _left_out(result: FileResult) -> set[int]:
    """Lines of functions porter left out because it ported them where they are applied."""
    if not re.search(r"# porter: \w+\(.*\), a (pandas )?function of each \w+, is ported as",
                     result.converted_text):
        return set()
    lines: set[int] = set()
    for node in ast.parse(result.original_text).body:
        if isinstance(node, ast.FunctionDef) and f"# porter: {node.name}(" in result.converted_text \
                and f"def {node.name}(" not in result.converted_text:
            lines.update(range(node.lineno, (node.end_lineno or node.lineno) + 1))
    return lines


def _may_name_a_frame(line: str, result: FileResult) -> bool:
    # statements that only use a frame variable (print(df), len(df), a header of a for loop)
    # are rewritten without a site of their own
    return "(" in line or "[" in line or "." in line


@pytest.mark.parametrize("name,source,stem", CASES, ids=IDS)
def test_every_site_points_at_a_source_line(name, source, stem, conversions):
    result = conversions[name]
    last = len(result.original_text.splitlines())
    for site in result.sites:
        assert site.line >= 1 and site.line <= site.end_line <= last, site


@pytest.mark.parametrize("name,source,stem", CASES, ids=IDS)
def test_comments_are_kept(name, source, stem, conversions):
    result = conversions[name]
    for line in result.original_text.splitlines():
        comment = line.split("#", 1)[1].strip() if "#" in line and not line.strip().startswith(("'", '"')) else ""
        if comment and '"' not in line and "'" not in line:
            assert comment in result.converted_text, f"comment lost: {comment!r}"


def test_polars_import_added_once_and_pandas_import_removed_when_unused(conversions):
    for name, result in conversions.items():
        text = result.converted_text
        if "pl." in text:
            assert text.count("import polars as pl") == 1, name
        tree = ast.parse(text)
        imported = {a.asname or a.name for n in ast.walk(tree) if isinstance(n, ast.Import)
                    for a in n.names if a.name in ("pandas", "modin.pandas")}
        used = {n.id for n in ast.walk(tree) if isinstance(n, ast.Name)}
        assert imported <= used, f"{name}: unused pandas import kept"


def test_numpy_names_the_conversion_no_longer_uses_are_not_imported(conversions):
    # importing numpy costs time and memory; a name the original did not use either stays
    for name, result in conversions.items():
        before = ast.parse(result.original_text)
        after = ast.parse(result.converted_text)
        used_before = {n.id for n in ast.walk(before) if isinstance(n, ast.Name)}
        used_after = {n.id for n in ast.walk(after) if isinstance(n, ast.Name)}
        imported = {a.asname or a.name for n in ast.walk(after) if isinstance(n, (ast.Import, ast.ImportFrom))
                    and (isinstance(n, ast.Import) or n.module == "numpy") for a in n.names
                    if isinstance(n, ast.ImportFrom) or a.name == "numpy"}
        stale = {i for i in imported if i in used_before and i not in used_after}
        assert not stale, f"{name}: numpy names imported but no longer used: {stale}"
