"""DataFrame.corr(): Pearson's correlation of each pair of columns over the rows where both are
present. pandas adds with Welford's running sums and Polars in another order, so the rule is
at 0.9 and these checks compare the values rounded to 12 decimals (the last digit may differ).
pandas (the reference) runs each script; the conversion runs with Polars on the same file;
printed text and written files must be the same."""

from __future__ import annotations

from pathlib import Path

import pytest

from support import differential, same_text


def _hives(rows: int) -> str:
    # a beekeepers' co-op: weights with blanks, a count that never varies in a few rows, a
    # True/False column
    lines = ["hive,kg,frames,queen,constant"]
    for i in range(rows):
        kg = "" if i % 9 == 4 else f"{(i * 3.7) % 41.3 + (i % 5) * 0.11:.2f}"
        frames = "" if i % 13 == 6 else str((i * 7) % 10)
        lines.append(f"H{i % 4},{kg},{frames},{'True' if i % 3 else 'False'},5")
    return "\n".join(lines) + "\n"


@pytest.mark.parametrize("call", [
    'hives[["kg", "frames"]].corr()',
    'hives.corr(numeric_only=True)',
    'hives[["kg", "frames", "constant"]].corr()',
    'hives[["kg", "frames"]].corr(min_periods=40)',
    'hives[["kg", "queen"]].corr()',
])
@pytest.mark.parametrize("rows", [1, 3, 500])
def test_correlations_are_pandas_own(tmp_path: Path, call: str, rows: int) -> None:
    text = same_text(f'''\
import pandas as pd
hives = pd.read_csv("hives.csv")
{call}.round(12).to_csv("corr.csv")
''', tmp_path, {"hives.csv": _hives(rows)}).converted_text
    assert "TODO(porter)" not in text, text


@pytest.mark.parametrize("call", [
    'hives.corr()',                      # a text column: pandas raises
    'hives[["kg", "frames"]].corr(method="spearman")',
])
def test_other_correlations_stay_todos(call: str, tmp_path: Path) -> None:
    from porter.api import convert_source
    from porter.model import Options
    (tmp_path / "hives.csv").write_text(_hives(10))
    text = convert_source(f'''\
import pandas as pd
hives = pd.read_csv("hives.csv")
out = {call}
''', options=Options(data_dir=str(tmp_path))).converted_text
    assert "TODO(porter): frame.corr" in text, text


def test_correlation_of_a_frame_holding_its_row_labels_leaves_them_out():
    # after dropna the row labels are carried (a later step reads them); pandas' corr never
    # reads the index
    result = differential("""
        import pandas as pd
        df = pd.DataFrame({"a": [1.0, None, 3.0, 4.5, 2.0], "b": [2, 1, 7, 3, 3],
                           "c": [0.5, 0.25, None, 1.0, 8.0]})
        df = df.dropna(subset=["a"])
        result = df[["a", "b", "c"]].corr()
        labels = df.index
    """, "result")
    assert "TODO" not in result.converted_text and "pl.corr" in result.converted_text


def test_correlation_of_group_means_leaves_the_keys_out():
    result = differential("""
        import pandas as pd
        df = pd.DataFrame({"k": ["x", "y", "x", "z", "y", "z"], "a": [1.0, 2.0, 3.0, 4.5, 2.0, 0.0],
                           "b": [2, 1, 7, 3, 3, 9]})
        result = df.groupby("k").mean().corr()
    """)
    assert "TODO" not in result.converted_text and "pl.corr" in result.converted_text


def test_correlation_of_columns_typed_at_run_time(tmp_path):
    # height_m is int in its file, made float by the left merge (a missing apiary) and filled:
    # porter knows its type only at run time
    result = same_text("""
        import pandas as pd
        df = pd.read_csv("hives.csv")
        heights = pd.read_csv("heights.csv")
        df = df.merge(heights, on="apiary", how="left")
        df["height_m"] = df["height_m"].fillna(0)
        corr = df[["frames", "honey", "height_m"]].corr()
        corr.to_csv("corr.csv")
    """, tmp_path, {"hives.csv": "apiary,frames,honey\nA,3,1.5\nB,7,2.25\nC,4,\nA,9,7.0\nÉ,2,0.5\n",
                    "heights.csv": "apiary,height_m\nA,410\nB,120\nÉ,95\n"})
    assert "TODO" not in result.converted_text
