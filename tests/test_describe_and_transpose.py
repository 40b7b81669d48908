"""describe() to the last digit, and .T / transpose() of a table of numbers labelled by one
text key. pandas (the reference) runs each script; the conversion runs with Polars on the same
file; printed text and written files must be the same (the text: 55.08000000000001 and
55.080000000000005 differ)."""

from __future__ import annotations

from pathlib import Path

import pytest

from support import same_text


def _readings(rows: int) -> str:
    # a glacier camp's stake readings: floats whose sums depend on the order of adding, a
    # blank now and then, whole numbers
    lines = ["stake,cm,snow,day"]
    for i in range(rows):
        cm = "" if i % 11 == 3 else f"{(i * 7.31) % 97.3 + 0.01 * (i % 7):.2f}"
        lines.append(f"S{i % 5},{cm},{(i * 0.37) % 3.1:.3f},{i % 30}")
    return "\n".join(lines) + "\n"


@pytest.mark.parametrize("rows", [3, 1_000, 20_000])
def test_describe_is_pandas_own_to_the_last_digit(tmp_path: Path, rows: int) -> None:
    text = same_text('''\
import pandas as pd
readings = pd.read_csv("readings.csv")
readings.describe().reset_index().to_csv("described.csv", index=False)
readings[["cm", "snow"]].describe().to_csv("labelled.csv")
''', tmp_path, {"readings.csv": _readings(rows)}).converted_text
    assert "TODO(porter)" not in text, text


@pytest.mark.parametrize("lines", [
    'out = readings.describe().T',
    'out = readings[["cm", "day"]].describe().transpose()',
    'out = readings.groupby("stake")[["cm", "day"]].sum().T',
    'out = readings.groupby("stake")[["day"]].max().T',
])
def test_transposed_tables_are_pandas_own(tmp_path: Path, lines: str) -> None:
    text = same_text(f'''\
import pandas as pd
readings = pd.read_csv("readings.csv")
{lines}
out.to_csv("out.csv")
print(out.columns.tolist())
''', tmp_path, {"readings.csv": _readings(40)}).converted_text
    assert "TODO(porter)" not in text, text


def test_a_frame_of_numbers_labelled_by_row_numbers_is_transposed(tmp_path: Path) -> None:
    # pandas' columns are the integers 0..n-1: Polars' "0", "1", ... written the same
    text = same_text('''\
import pandas as pd
readings = pd.read_csv("readings.csv")
readings[["cm", "day"]].head(3).T.to_csv("out.csv")
''', tmp_path, {"readings.csv": _readings(10)}).converted_text
    assert "TODO(porter)" not in text, text


def test_a_frame_of_text_labelled_by_row_numbers_stays_a_todo(tmp_path: Path) -> None:
    # text beside numbers: an object frame in pandas
    text = same_text('''\
import pandas as pd
readings = pd.read_csv("readings.csv")
readings[["stake", "day"]].head(3).T.to_csv("out.csv")
''', tmp_path, {"readings.csv": _readings(10)}).converted_text
    assert "TODO(porter)" in text, text


@pytest.mark.parametrize("lines", [
    # two levels of column names become two levels of row labels in pandas
    'out = readings.groupby("stake").agg({"cm": ["sum", "mean"]}).T.reset_index()',
    # a pivot's columns are named after its key: pandas' transposed index carries that name
    'out = readings.pivot_table(index="stake", columns="day", values="cm", aggfunc="sum")'
    '.T.reset_index()',
])
def test_tables_whose_columns_pandas_labels_otherwise_are_transposed_by_pandas(
        tmp_path: Path, lines: str) -> None:
    text = same_text(f'''\
import pandas as pd
readings = pd.read_csv("readings.csv")
{lines}
out.to_csv("out.csv", index=False)
''', tmp_path, {"readings.csv": _readings(12)}).converted_text
    assert ".transpose(include_header" not in text, text
