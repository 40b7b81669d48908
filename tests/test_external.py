"""External checks: scripts of our own over open datasets that PyPI packages ship, converted
and verified against pandas (the reference implementation).

- `palmerpenguins` (the penguins table, missing values included): its README describes 344
  penguins of 3 species (Adelie, Chinstrap, Gentoo) — figures quoted from memory of that
  README, checked here against the file the package ships.
- `vega_datasets` local data: `seattle-weather` (daily weather, 2012–2015: 4 × 365 + 1 leap day
  = 1461 days, computed from the calendar) and `cars` (406 cars — from memory of the dataset's
  description; 3 origins: USA, Europe, Japan).
"""

from __future__ import annotations

from pathlib import Path
import shutil

import pandas as pd
import pytest

from porter.verify.api import verify

HERE = Path(__file__).resolve().parent / "external"
palmerpenguins = pytest.importorskip("palmerpenguins")
vega_datasets = pytest.importorskip("vega_datasets")


def _penguins_csv() -> Path:
    return Path(palmerpenguins.__file__).parent / "data" / "penguins.csv"


def _vega(name: str) -> Path:
    return Path(vega_datasets.__file__).parent / "_data" / name


@pytest.fixture
def workdir(tmp_path: Path) -> Path:
    shutil.copy(_penguins_csv(), tmp_path / "penguins.csv")
    shutil.copy(_vega("seattle-weather.csv"), tmp_path / "seattle-weather.csv")
    # the package ships cars as JSON records; the scripts read the same table as CSV
    pd.read_json(_vega("cars.json")).to_csv(tmp_path / "cars.csv", index=False)
    for script in HERE.glob("*.py"):
        shutil.copy(script, tmp_path / script.name)
    return tmp_path


def test_published_facts_about_the_data(workdir: Path) -> None:
    penguins = pd.read_csv(workdir / "penguins.csv")
    assert len(penguins) == 344  # palmerpenguins README (from memory)
    assert sorted(penguins["species"].unique()) == ["Adelie", "Chinstrap", "Gentoo"]
    assert penguins["sex"].isna().sum() > 0  # the table has missing values, which is the point
    weather = pd.read_csv(workdir / "seattle-weather.csv")
    assert len(weather) == 4 * 365 + 1  # 2012-2015, 2012 a leap year (calendar)
    cars = pd.read_csv(workdir / "cars.csv")
    assert len(cars) == 406  # dataset description (from memory)
    assert set(cars["Origin"]) == {"USA", "Europe", "Japan"}


@pytest.mark.parametrize("script", ["penguins_summary.py", "seattle_weather.py", "cars_origin.py"])
def test_external_script_verifies_as_same(workdir: Path, script: str) -> None:
    result = verify(workdir / script, None, workdir)
    assert result.verdict == "same", result.to_json()
    assert all(o.comparison.status == "same" for o in result.outputs)
    assert result.outputs, "the script wrote nothing to compare"


def test_penguin_counts_match_the_published_row_count(workdir: Path) -> None:
    # the converted script's printed row count is the dataset's published size
    result = verify(workdir / "penguins_summary.py", None, workdir)
    assert result.converted.stdout.split()[0] == "344"
