"""Windows met in the corpus scripts of round 14 (issue 10): round() or abs() of a window
within groups, time windows of a frame (`df.rolling("30D", on="t")[col]`), and the running
sum of a True/False column read with a blank.

pandas is the reference: each check runs the script with pandas and its conversion with Polars
in folders holding the same files, and compares what they print and write as text.
"""

from __future__ import annotations

import pytest

from support import same_text

BOATS = {"b.csv": "boat,fuel,t\nheron,3.25,2024-01-01\nótter,,2024-01-02\nheron,-1.5,2024-01-02\n"
                  ",7.0,2024-01-04\nótter,2.75,2024-01-05\nheron,4.125,2024-01-09\n"
                  "ótter,-0.5,2024-01-09\nheron,,2024-01-12\n"}


# -- round / abs of a group window ----------------------------------------------------------

@pytest.mark.parametrize("line", [
    'd["r"] = d.groupby("boat")["fuel"].expanding().mean().reset_index(level=0, drop=True).round(1)',
    'd["r"] = d.groupby("boat")["fuel"].rolling(2, min_periods=1).sum().round(2).reset_index(level=0, drop=True)',
    'd["r"] = d.groupby("boat")["fuel"].rolling(2, min_periods=1).min().droplevel(0).abs()',
    'd["r"] = d.groupby("boat")["fuel"].rolling(3, min_periods=1).mean().abs().round(3).droplevel(0)',
])
def test_round_and_abs_of_a_group_window(line, tmp_path):
    """pandas keeps each value's labels through round and abs: assigned back, each lands on its
    own row (the row with no boat gets NaN)."""
    result = same_text(f"""
        import pandas as pd
        d = pd.read_csv("b.csv")
        {line}
        print(d["fuel"].tolist())
        d.to_csv("o.csv", index=False)
        """, tmp_path, BOATS)
    assert "TODO" not in result.converted_text
