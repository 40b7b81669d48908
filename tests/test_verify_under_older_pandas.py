"""porter verify --reference-python: the original runs under another Python, one with the older
pandas it was written for, and the report says which versions each side ran under.

The older environment is built here from the package index (a venv with pandas 2.2.3); where
that is impossible (no network, no venv module) the tests that need it are skipped with the
reason. pandas 2.2.3 is the reference for the original: the script below uses APIs pandas 3
removed (fillna(method=), applymap, the "M" alias), which that pandas still runs.
"""

from __future__ import annotations

import json
from pathlib import Path
import subprocess
import sys
import textwrap

import pytest

from porter.cli import main
from porter.model import ConversionError
from porter.verify.api import VerifyOptions, verify

OLDER_PANDAS = "2.2.3"

# an orchard co-op's picking log, with a missing weight the old script fills forward
CROPS = """plot,crop,kg,picked
P1,pear,12.5,2024-01-05
P2,plum,,2024-01-20
P1,pear,7.0,2024-02-03
P3,fig,3.25,2024-02-28
P2,plum,9.5,2024-03-02
"""

OLD_SCRIPT = """
import pandas as pd

df = pd.read_csv("data/crops.csv", parse_dates=["picked"])
df["kg"] = df["kg"].fillna(method="ffill")
labels = df[["crop"]].applymap(lambda s: s.upper())
df["label"] = labels["crop"]
monthly = df.set_index("picked").resample("M")["kg"].sum().reset_index()
monthly.to_csv("monthly.csv", index=False)
df.to_csv("clean.csv", index=False)
"""


def _venv(place: Path, *packages: str) -> Path:
    """A virtual environment at `place` with `packages` installed; its python."""
    subprocess.run([sys.executable, "-m", "venv", str(place)], check=True, capture_output=True,
                   timeout=300)
    python = place / "bin" / "python"
    if packages:
        subprocess.run([str(python), "-m", "pip", "install", "-q", *packages], check=True,
                       capture_output=True, timeout=900)
    return python


@pytest.fixture(scope="module")
def older_python(tmp_path_factory: pytest.TempPathFactory) -> Path:
    try:
        return _venv(tmp_path_factory.mktemp("older") / "venv", f"pandas=={OLDER_PANDAS}")
    except (subprocess.CalledProcessError, subprocess.TimeoutExpired, OSError) as exc:
        reason = getattr(exc, "stderr", b"") or str(exc)
        reason = reason.decode(errors="replace") if isinstance(reason, bytes) else reason
        pytest.skip(f"cannot build a Python with pandas {OLDER_PANDAS} here: {reason.strip()[-300:]}")


@pytest.fixture
def orchard(tmp_path: Path) -> Path:
    (tmp_path / "data").mkdir()
    (tmp_path / "data" / "crops.csv").write_text(CROPS, encoding="utf-8")
    script = tmp_path / "picking.py"
    script.write_text(textwrap.dedent(OLD_SCRIPT), encoding="utf-8")
    return script


def test_an_old_script_is_verified_against_the_pandas_it_was_written_for(orchard, older_python, tmp_path):
    report = tmp_path / "verdict.json"
    code = main(["verify", str(orchard), "--data", str(orchard.parent), "--timing-runs", "0",
                 "--reference-python", str(older_python), "--json", str(report)])
    verdict = json.loads(report.read_text(encoding="utf-8"))
    assert verdict["verdict"] == "same", verdict
    assert code == 0
    assert f"pandas {OLDER_PANDAS}" in verdict["original"]["environment"]
    assert "Polars" in verdict["converted"]["environment"]
    # the files compared are the ones the old pandas wrote
    assert {o["name"] for o in verdict["outputs"]} >= {"monthly.csv", "clean.csv"}


def test_without_the_older_python_the_original_stops_on_todays_pandas(orchard):
    # the reason the option exists: pandas 3 no longer runs the old script
    result = verify(orchard, None, orchard.parent, VerifyOptions())
    assert result.original.exit_code != 0
    assert result.original.environment is None  # nothing said when both ran under porter's Python


def test_a_python_without_pandas_is_refused_with_the_reason(orchard, tmp_path):
    try:
        bare = _venv(tmp_path / "bare")
    except (subprocess.CalledProcessError, subprocess.TimeoutExpired, OSError) as exc:
        pytest.skip(f"cannot make a virtual environment here: {exc}")
    with pytest.raises(ConversionError, match="cannot import pandas"):
        verify(orchard, None, orchard.parent, VerifyOptions(reference_python=str(bare)))


def test_a_python_that_does_not_exist_is_refused(orchard, tmp_path):
    missing = tmp_path / "no" / "python"
    with pytest.raises(ConversionError, match="cannot run this Python"):
        verify(orchard, None, orchard.parent, VerifyOptions(reference_python=str(missing)))
    assert main(["verify", str(orchard), "--data", str(orchard.parent),
                 "--reference-python", str(missing)]) != 0
