"""The row order of an outer or sort=True merge whose keys hold missing timestamps or durations:
pandas sorts NaT (the smallest int64 inside) before every other key, where a missing number or
text goes last. Reference: pandas 3.1 itself."""

from __future__ import annotations

from pathlib import Path

import pytest

from support import differential

# an orchard co-op's deliveries and its weighbridge tickets: missing days, a missing grower,
# days in both, days in one only, rows out of order
DELIVERIES = (
    "day,grower,crates\n"
    "2024-09-03,Brünn,4\n"
    ",Aske,2\n"
    "2024-09-01,,7\n"
    ",,1\n"
    "2024-09-02,Aske,3\n"
)
TICKETS = (
    "day,grower,kg,wait\n"
    "2024-09-02,Aske,310.5,00:20:00\n"
    "2024-09-01,,88.0,\n"
    ",Brünn,12.5,00:05:00\n"
    "2024-09-04,Brünn,40.0,01:00:00\n"
)

HEAD = (
    'import pandas as pd\n'
    'lots = pd.read_csv("deliveries.csv", parse_dates=["day"])\n'
    'tickets = pd.read_csv("tickets.csv", parse_dates=["day"])\n'
)


@pytest.fixture()
def orchard(tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> Path:
    (tmp_path / "deliveries.csv").write_text(DELIVERIES, encoding="utf-8")
    (tmp_path / "tickets.csv").write_text(TICKETS, encoding="utf-8")
    monkeypatch.chdir(tmp_path)
    return tmp_path


@pytest.mark.parametrize("body", [
    pytest.param('result = lots.merge(tickets, on="day", how="outer")', id="outer on a date"),
    pytest.param('result = lots.merge(tickets, on=["grower", "day"], how="outer")',
                 id="outer on text then a date: NaT first within each grower, no grower last"),
    pytest.param('result = lots.merge(tickets, on=["day", "grower"], how="outer")',
                 id="outer on a date then text"),
    pytest.param('result = lots.merge(tickets, on="day", how="left", sort=True)',
                 id="left with sort=True"),
    pytest.param('result = lots.merge(tickets, left_on="day", right_on="day", how="outer",\n'
                 '                    suffixes=("_lot", "_ticket"))', id="outer through left_on/right_on"),
    pytest.param('tickets["wait"] = pd.to_timedelta(tickets["wait"])\n'
                 'lots["wait"] = pd.to_timedelta(lots["crates"], unit="m")\n'
                 'result = lots.merge(tickets.drop(columns="day"), on="wait", how="outer")',
                 id="outer on a duration"),
])
def test_missing_timestamp_keys_sort_first_as_in_pandas(body, orchard):
    result = differential(HEAD + body + "\n", data_dir=str(orchard))
    assert "nulls_last" in result.converted_text
