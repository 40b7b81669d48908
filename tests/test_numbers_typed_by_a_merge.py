"""An int column a left merge brings in is int64 in pandas where every row found its match and
float64 where one did not: porter gives it that type once the join has run and does not know
which. It holds numbers either way, so select_dtypes("number") picks it, and a fill with a
fraction keeps the type the join gave it (pandas fills an int64 column with nothing and keeps
it int64, where Polars' fill_null(0.5) would make it Float64). Checked against pandas with
both kinds of lookup: one that matches every row and one that leaves a row unmatched."""

from __future__ import annotations

import pytest

from support import convert, differential

LEFT = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "field": ["Intake", "Beck", "Prée", "Intake", None, "Beck"],
    "kg": [48.5, np.nan, 61.0, 55.25, 55.25, 70.0],
    "n": [1, 2, 3, 3, 0, 2],
    "name": ["a", "b", None, "é", "c", "d"],
})
"""
MATCHED = 'fields = pd.DataFrame({"field": ["Intake", "Beck", "Prée", None], "alt": [420, 210, 150, 7]})\n'
UNMATCHED = 'fields = pd.DataFrame({"field": ["Intake", "Beck"], "alt": [420, 211]})\n'
LOOKUPS = [pytest.param(MATCHED, id="every row matched: int64"),
           pytest.param(UNMATCHED, id="a row unmatched: float64")]
MERGED = 'df = df.merge(fields, on="field", how="left")\n'
WRITTEN = '{}.to_csv("out.csv", index=False)\ntext = open("out.csv", encoding="utf-8").read()\n'


@pytest.mark.parametrize("lookup", LOOKUPS)
@pytest.mark.parametrize("fill", [
    pytest.param('df["alt"].mean()', id="the mean"),
    pytest.param('df["alt"].median()', id="the median"),
    pytest.param("0.5", id="a fraction"),
    pytest.param("0", id="a whole number"),
    pytest.param('df["kg"]', id="a float column"),
])
def test_fill_keeps_the_type_the_join_gave(lookup: str, fill: str, tmp_path, monkeypatch) -> None:
    monkeypatch.chdir(tmp_path)  # the text written is pandas' own: 420 where int64, 420.0 where not
    result = differential(LEFT + lookup + MERGED + f'df["alt"] = df["alt"].fillna({fill})\n'
                          + WRITTEN.format("df") + 'result = df\n', "result", "text")
    assert "TODO(porter)" not in result.converted_text, result.converted_text


@pytest.mark.parametrize("lookup", LOOKUPS)
def test_select_dtypes_number_picks_the_joined_numbers(lookup: str, tmp_path, monkeypatch) -> None:
    monkeypatch.chdir(tmp_path)
    result = differential(LEFT + lookup + MERGED
                          + 'df["alt"] = df["alt"].fillna(df["alt"].mean())\n'
                          'result = df.select_dtypes(include="number")\n'
                          'names = result.columns.tolist()\n' + WRITTEN.format("result"),
                          "result", "names", "text")
    assert "TODO(porter)" not in result.converted_text, result.converted_text


@pytest.mark.parametrize("lookup", LOOKUPS)
def test_select_dtypes_right_after_the_merge(lookup: str) -> None:
    result = differential(LEFT + lookup + MERGED
                          + 'result = df.select_dtypes(exclude=["number"])\n'
                          'nums = df.select_dtypes("number")\n', "result", "nums")
    assert "TODO(porter)" not in result.converted_text, result.converted_text


@pytest.mark.parametrize("lookup", LOOKUPS)
def test_a_column_written_over_is_no_longer_taken_for_numbers(lookup: str) -> None:
    # the mark holds for the column the join made: text written under its name is text
    result = differential(LEFT + lookup + MERGED + 'df["alt"] = df["name"].str.upper()\n'
                          'result = df.select_dtypes(include="number")\n')
    assert '"alt"' not in result.converted_text.split("result = ")[-1]


def test_a_fill_of_text_is_not_taken_for_numbers() -> None:
    result = convert(LEFT + UNMATCHED + MERGED + 'df["alt"] = df["alt"].fillna("none")\n'
                     'result = df.select_dtypes(include="number")\n')
    assert "pl.dtype_of" not in result.converted_text
    assert "# TODO(porter): frame.select_dtypes" in result.converted_text


@pytest.mark.parametrize("lookup", LOOKUPS)
def test_rows_filtered_after_the_merge_keep_the_type(lookup: str, tmp_path, monkeypatch) -> None:
    # pandas' float64 column stays float64 when the rows that were missing are dropped
    monkeypatch.chdir(tmp_path)
    result = differential(LEFT + lookup + MERGED + 'df = df[df["n"] > 0]\n'
                          'df["alt"] = df["alt"].fillna(0.5)\n'
                          'result = df.select_dtypes(include="number")\n' + WRITTEN.format("result"),
                          "result", "text")
    assert "TODO(porter)" not in result.converted_text, result.converted_text
