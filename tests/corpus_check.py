"""Convert a corpus case, run both versions in copies of its folder, compare every output."""

from __future__ import annotations

from dataclasses import dataclass, field
from pathlib import Path
import shutil
import tempfile

from porter.api import convert_file
from porter.model import FileResult
from porter.verify.declared import ReferenceUnavailable, python_for
from support import assert_same_table, outputs, read_table, run_script

CORPUS = Path(__file__).resolve().parent.parent / "corpus"


def cases() -> list[str]:
    return sorted(p.name for p in CORPUS.iterdir() if (p / f"{p.name}.py").is_file())


@dataclass
class CaseRun:
    result: FileResult
    pandas_files: dict[str, Path] = field(default_factory=dict)
    polars_files: dict[str, Path] = field(default_factory=dict)
    pandas_stderr: str = ""
    polars_stderr: str = ""


def reference_python(name: str) -> str | None:
    """The Python the original of case `name` runs under: None for porter's own, else one with
    the pandas its corpus/<name>/reference.txt declares (porter.verify.declared); under pytest
    a case whose declared pandas cannot be had here is skipped with the reason."""
    if _imports_dask(CORPUS / name / f"{name}.py"):
        import importlib.util
        if importlib.util.find_spec("dask") is None or importlib.util.find_spec("dask.dataframe") is None:
            import pytest
            pytest.skip(f"{name} is a Dask script and Dask is not installed here (the dask "
                        "extra: pip install -e '.[dask]')")
    try:
        return python_for(CORPUS / name)
    except ReferenceUnavailable as exc:
        import pytest
        pytest.skip(str(exc))


def _imports_dask(script: Path) -> bool:
    """The case's original imports Dask's DataFrame module: it runs only where Dask is."""
    import re
    return bool(re.search(r"^\s*(import dask\.dataframe|from dask(\.dataframe)? import)",
                          script.read_text(encoding="utf-8"), re.MULTILINE))


def run_case(name: str, tmp: Path) -> CaseRun:
    source = CORPUS / name
    result = convert_file(source / f"{name}.py")
    pythons = {"pandas": reference_python(name), "polars": None}
    sides = {}
    for side in ("pandas", "polars"):
        work = tmp / side
        shutil.copytree(source, work)
        if side == "polars":
            (work / f"{name}.py").write_text(result.converted_text, encoding="utf-8")
        before = {p.relative_to(work) for p in work.rglob("*")}
        proc = run_script(work / f"{name}.py", work, python=pythons[side])
        if proc.returncode != 0:
            raise AssertionError(f"{side} side of {name} failed:\n{proc.stderr[-3000:]}")
        sides[side] = (outputs(before, work), proc.stderr)
    return CaseRun(result, sides["pandas"][0], sides["polars"][0], sides["pandas"][1], sides["polars"][1])


# Outputs where a float sum rounded afterwards sits on an exact tie: Polars adds a group's
# floats in another order than pandas, so the last binary digit differs and round(2) goes the
# other way (documented on groupby.mean in docs/coverage.md). Only these columns may differ,
# and only by one in the last decimal written. None today: the corpus data keeps its averages
# off exact halves (corpus/README.md), so `make demo` verifies every case as the same.
KNOWN_TIES: dict[str, dict[str, str]] = {}
# the same, as `porter verify` names the outputs (the file, and the frame left in globals)
KNOWN_TIE_OUTPUTS: dict[str, set[str]] = {}


def compare_case(run: CaseRun, ties: dict[str, str] | None = None) -> None:
    assert run.pandas_files, "the pandas script wrote nothing"
    assert set(run.pandas_files) == set(run.polars_files), (
        f"different outputs: pandas {sorted(run.pandas_files)}, polars {sorted(run.polars_files)}")
    for name, path in sorted(run.pandas_files.items()):
        expected = read_table(path)
        actual = read_table(run.polars_files[name])
        if expected is None:
            assert path.read_bytes() == run.polars_files[name].read_bytes(), f"{name} differs"
            continue
        tie = (ties or {}).get(name)
        if tie is not None and expected is not None and actual is not None and tie in expected:
            gap = (expected[tie] - actual[tie]).abs().max()
            assert gap <= 0.0100001, f"{name}: {tie} differs by {gap}, more than a rounding tie"
            expected, actual = expected.drop(columns=[tie]), actual.drop(columns=[tie])
        try:
            assert_same_table(expected, actual)
        except AssertionError as exc:
            raise AssertionError(f"{name}: {exc}") from None


if __name__ == "__main__":
    import sys
    import pytest
    for case in sys.argv[1:] or cases():
        with tempfile.TemporaryDirectory() as tmp:
            try:
                compare_case(run_case(case, Path(tmp)))
                print(f"{case}: same")
            except pytest.skip.Exception as exc:
                print(f"{case}: skipped ({exc})")
            except AssertionError as exc:
                print(f"{case}: DIFFERENT\n   {str(exc)[:1500]}")
