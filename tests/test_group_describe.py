"""groupby(k)[c].describe() against pandas (the reference): count, mean, std, min, quartiles
and max per group, labelled by the keys, as pandas describes each group's Series. The frames
hold missing keys, NaN and None, a group of only missing values, a group of one value (std
NaN), ties, unicode keys and no rows at all; the digits are checked as text on many drawn
floats (mean and std added as numpy adds, quartiles interpolated as numpy)."""

from __future__ import annotations

import numpy as np
import pytest

from support import convert, differential, same_text

FRAME = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "pier": ["b", "a", None, "b", "a", "c", "Éclair", "c", "b", "a"],
    "lane": [1, 1, 2, 2, 1, 1, 2, 2, 1, 1],
    "kg": [1.5, np.nan, 3.0, 4.0, 5.0, np.nan, 2.0, 0.1, 0.1, 5.0],
    "n": [1, 2, 3, 4, 5, 6, 7, 8, 8, 8],
    "gone": [np.nan, None, np.nan, np.nan, None, np.nan, np.nan, np.nan, np.nan, np.nan],
})
"""

CASES = [
    'result = df.groupby("pier")["kg"].describe()',
    'result = df.groupby("pier")["n"].describe().reset_index()',
    'result = df.groupby(["lane", "pier"])["kg"].describe().reset_index()',
    'result = df.groupby("pier", dropna=False)["kg"].describe().reset_index()',
    'result = df.groupby("pier", sort=False)["n"].describe().reset_index()',
    'result = df.groupby("lane", as_index=False)["kg"].describe()',
    'result = df.groupby("pier")["gone"].describe().reset_index()',
    'result = df.groupby("pier")["kg"].describe()[["count", "mean", "max"]].round(3).reset_index()',
    'result = df[df["n"] > 99].groupby("pier")["kg"].describe().reset_index(drop=True)',
    'df["kg"] = df["kg"] / df["n"].where(df["n"] > 2, 0) * 0; result = df.groupby("lane")["kg"].describe()',
]


@pytest.mark.parametrize("line", CASES)
def test_matches_pandas(line: str) -> None:
    result = differential(FRAME + line + "\n")
    assert "TODO" not in result.converted_text, result.converted_text
    assert "pandas_reduce(" in result.converted_text


@pytest.mark.parametrize("line", [
    'result = df.groupby("pier").describe()',  # a MultiIndex of column and statistic
    'result = df.groupby("pier")[["kg", "n"]].describe()',
    'result = df.groupby("lane")["pier"].describe()',  # text: count, unique, top, freq
    'result = df.groupby("pier")["kg"].describe(percentiles=[0.1, 0.9])',
])
def test_todo(line: str) -> None:
    result = convert(FRAME + line + "\n")
    assert any(s.key == "groupby.describe" for s in result.todos), result.converted_text


def _values() -> str:
    """Many drawn floats in a few groups, written with all their digits, with blanks, a group
    of one value and one of only blanks: where numpy's and Polars' sums part in the last digit."""
    rng = np.random.default_rng(21)
    drawn = np.concatenate([rng.normal(3, 2, 300), rng.uniform(0, 0.3, 300)])
    lines = ["flock,kg,n"]
    for i, v in enumerate(drawn):
        kg = "" if i % 13 == 0 else repr(float(v))
        lines.append(f"{'ÅBCD'[i % 4]},{kg},{int(v * 7)}")
    lines += ["solo,2.5,1", "blank,,", "blank,,2"]
    return "\n".join(lines) + "\n"


def test_statistics_are_written_with_pandas_digits(tmp_path) -> None:
    result = same_text("""
        import pandas as pd
        df = pd.read_csv("t.csv")
        s = df.groupby("flock")["kg"].describe()
        s.to_csv("s.csv")
        t = df.groupby("flock", as_index=False)["n"].describe()
        t.to_csv("t_out.csv", index=False)
    """, tmp_path, {"t.csv": _values()})
    assert "TODO" not in result.converted_text
