"""The column pd.cut / pd.qcut is given is made of numbers when porter makes the input files
from the script alone (verify without --data): it was made of text, and the original script
itself failed on the data porter made (an observatory's temperatures cut into bands)."""

from __future__ import annotations

import csv
import textwrap
from pathlib import Path

import pytest

from porter.verify.api import verify
from porter.verify.synthesize import synthesize

SCRIPT = """\
import pandas as pd
log = pd.read_csv("data/nights.csv")
log["band"] = pd.cut(log["temp_c"], [-10, -1, 1, 10], labels=["frost", "near zero", "mild"])
log["q"] = pd.qcut(log["seeing"], q=2, labels=False, duplicates="drop")
log.groupby("band", observed=True)["q"].count().to_csv("bands.csv")
"""


def test_the_cut_columns_are_numbers(tmp_path: Path) -> None:
    synthesize(SCRIPT, tmp_path / "made")
    text = (tmp_path / "made" / "data" / "nights.csv").read_text(encoding="utf-8")
    rows = list(csv.DictReader(text.splitlines()))
    assert rows
    for column in ("temp_c", "seeing"):
        for row in rows:
            assert row[column] == "" or float(row[column]) == float(row[column]), row


@pytest.mark.parametrize("line", ['print(log["band"].value_counts(sort=False))'])
def test_verify_without_data_runs_the_original(line: str, tmp_path: Path) -> None:
    script = tmp_path / "night_log.py"
    script.write_text(SCRIPT + line + "\n", encoding="utf-8")
    synthesize(script.read_text(encoding="utf-8"), tmp_path / "sample")
    result = verify(script, None, tmp_path / "sample")
    assert result.verdict == "same", result.verdict
