"""df[cols].isna() / notna(): a frame of True/False, and its any / all / sum over each row
as expressions (pl.any_horizontal(pl.col(cols).is_null())). pandas is the reference: NaN,
None and NaT are missing, a text "" is not (an orchard co-op's picking tallies per row of
trees).
"""

from __future__ import annotations

from pathlib import Path

import pytest

from support import convert, differential

TALLY = """\
picker,row,apples,pears,plums,note,day
Ivo,3,12,,4,windfall,2025-09-01
Maren,1,,,,n/a,2025-09-01
Ivo,3,12,,4,windfall,2025-09-01
Søren,2,0,7,1.5,,
Äda,4,5,2,,"",2025-09-03
Ivo,5,,,,,2025-09-04
"""

FRAME = """
    import numpy as np
    import pandas as pd
    df = pd.DataFrame({
        "a": [1.0, np.nan, None, 4.0, np.nan, 2.0],
        "s": ["x", None, "", np.nan, "", "ünï"],
        "n": [1, 2, 3, 4, 5, 6],
        "d": ["2025-01-02", None, "2025-03-01", "", "2025-01-02", "2025-05-06"],
    })
    df["d"] = pd.to_datetime(df["d"], errors="coerce")
"""


@pytest.fixture
def folder(tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> Path:
    monkeypatch.chdir(tmp_path)
    (tmp_path / "tally.csv").write_text(TALLY)
    return tmp_path


@pytest.mark.parametrize("line", [
    'df["x"] = df[["a", "s"]].isna().any(axis=1)',
    'df["x"] = df[["a", "s", "d"]].isnull().all(axis=1)',
    'df["x"] = df[["a", "s", "n", "d"]].isna().sum(axis=1)',
    'df["x"] = df[["a", "s", "d"]].notna().sum(axis="columns")',
    'df["x"] = df[["s"]].notnull().all(axis=1)',
    'df["x"] = df[["a", "d"]].notna().any(axis=1, skipna=False)',
    'df["x"] = df[["a", "s"]].isna().sum(axis=1, min_count=2)',
    'df = df[df[["a", "s"]].isna().any(axis=1) & (df["n"] > 2)]',
    'df = df[~df[["a", "d"]].isna().all(axis=1)]',
])
def test_row_reductions_of_a_mask(line: str) -> None:
    result = differential(FRAME + f"""
    {line}
    result = df
    """)
    assert "TODO" not in result.converted_text
    assert "_horizontal(" in result.converted_text


@pytest.mark.parametrize("method", ["isna", "isnull", "notna", "notnull"])
def test_the_mask_itself(method: str) -> None:
    result = differential(FRAME + f"""
    result = df[["a", "s", "d"]].{method}()
    whole = df.{method}()
    """, "result", "whole")
    assert "TODO" not in result.converted_text


def test_a_mask_kept_in_a_name_and_reduced_later() -> None:
    result = differential(FRAME + """
    gaps = df[["a", "s"]].isna()
    df["gap"] = gaps.any(axis=1)
    df["gaps"] = gaps.sum(axis=1)
    result = df
    held = gaps
    """, "result", "held")
    assert "TODO" not in result.converted_text


def test_read_from_a_file_after_repeats_dropped(folder: Path) -> None:
    # blanks and "n/a" are missing, a quoted "" is missing too (read_csv): as pandas reads them
    result = differential("""
        import pandas as pd
        FRUIT = ["apples", "pears", "plums"]
        tally = pd.read_csv("tally.csv").drop_duplicates()
        tally["unpicked"] = tally[FRUIT].isna().any(axis=1) & tally["note"].isna()
        tally["missing"] = tally[FRUIT].isna().sum(axis=1)
        tally["full"] = tally[["picker", "note", "day"]].notna().all(axis=1)
        result = tally
        """, data_dir=str(folder))
    assert "TODO" not in result.converted_text


def test_an_empty_frame() -> None:
    differential("""
        import pandas as pd
        df = pd.DataFrame({"a": [1.0, None], "s": ["x", None]})
        df = df[df["a"] > 5]
        df["x"] = df[["a", "s"]].isna().any(axis=1)
        df["y"] = df[["a", "s"]].isna().sum(axis=1)
        result = df
        """)


@pytest.mark.parametrize("line", [
    'result = df[["a", "s"]].isna().sum()',
    'result = df[["a", "s"]].notna().any()',
    'result = df.isnull().all()',
    'result = df[["a", "s"]].isna().mean(axis=1)',
    'result = df.notna().mean()',
])
def test_per_column_results_are_pandas_own(line: str) -> None:
    # per-column counts are a Series indexed by column name: a frame of the names and values
    result = differential(FRAME + "    " + line + "\n")
    assert "TODO(porter)" not in result.converted_text


@pytest.mark.parametrize("line, key", [
    ('result = df[["a", "s"]].isna().std()', "frame.isna.std"),
    ('result = df[["a", "s"]].isna().sum(axis=1, min_count=3)', "frame.isna.sum"),
    ('result = df[["a", "s"]].isna().sum(axis=None)', "frame.isna.sum"),
])
def test_other_results_stay_todos(line: str, key: str) -> None:
    result = differential(FRAME + "    " + line + "\n")
    assert f"# TODO(porter): {key}" in result.converted_text


def test_a_frame_of_unknown_columns_stays_a_todo(folder: Path) -> None:
    text = convert("""
        import pandas as pd
        tally = pd.read_csv("tally.csv")
        tally["x"] = tally.isna().any(axis=1)
        """).converted_text
    assert "# TODO(porter): frame.isna" in text
