"""x // d and x % d where a float takes part give numpy's numbers, as in pandas.

Reference: pandas 3.1 itself, run on the same data; the files both write are compared as text
(to the last digit). numpy, which pandas computes with, floors the exact quotient and takes the
exact remainder (fmod, then moved to the divisor's sign): 1.0 // 0.1 is 9.0 and 1.0 % 0.1 is
0.09999999999999995. Polars floors the rounded quotient (10.0) and computes x - d * floor(x / d)
(0.0): for a divisor that is a fraction, most remainders differ in their last digits, and a
value one binary digit below a multiple of a whole divisor gets another quotient too.
"""

from __future__ import annotations

import numpy as np
import pytest

from support import same_text


def _values() -> str:
    """Floats where the two part: a seeded draw written with all its digits, values one binary
    digit below and above multiples of 3 and 0.1, the edges (0, -0.0, negative numbers, inf,
    blanks), and an integer column with a blank and one without."""
    rng = np.random.default_rng(5)
    drawn = [float(v) for v in rng.uniform(-50, 50, 300)]
    near = [float(np.nextafter(m, m - 1)) for m in np.arange(-12.0, 12.0, 3.0)]
    near += [float(np.nextafter(m * 0.1, m)) for m in range(1, 8)]
    edges = [0.0, -0.0, 1.0, -1.0, 0.7, float("inf"), float("-inf"), None]
    lines = ["g,v,d,n,m"]
    for i, v in enumerate(drawn + near + edges):
        d = ["0.1", "-0.3", "2.5", "0.0", "", "3.0", "1e-3"][i % 7]
        n = "" if i % 11 == 0 else str(i % 23 - 9)
        text = "" if v is None else repr(v)
        lines.append(f"g{i % 4},{text},{d},{n},{i % 5 + 1}")
    return "\n".join(lines) + "\n"


@pytest.mark.parametrize("expression", [
    'df["v"] // 0.1', 'df["v"] % 0.1', 'df["v"] // -0.3', 'df["v"] % -0.3',
    'df["v"] // 3', 'df["v"] % 3', 'df["v"] % 2', 'df["v"] // 2.5',
    'df["v"] // df["d"]', 'df["v"] % df["d"]', 'df["n"] // 0.5', 'df["n"] % 2.5',
    'df["m"] // 0.3', 'df["m"] % 0.3', '10 // df["d"]', '7.5 % df["d"]', 'df["n"] % df["d"]',
    '(df["v"] * 2) // 0.1', 'df["v"] // 0.1 * 0.1',
])
def test_floor_division_and_remainder_write_numpys_digits(expression, tmp_path):
    result = same_text(f"""
        import pandas as pd
        df = pd.read_csv("t.csv")
        df["x"] = {expression}
        df.to_csv("out.csv", index=False)
        print(df["x"].sum(), df["x"].isna().sum())
    """, tmp_path, {"t.csv": _values()})
    assert "TODO" not in result.converted_text
    assert all(site.confidence == 1.0 for site in result.sites
               if site.key == "series.arith"), [s.reasons for s in result.sites]


def test_remainders_summed_per_group_keep_the_column_name(tmp_path):
    # the numpy function's result is named after the numerator, as Polars' own // names it
    same_text("""
        import pandas as pd
        df = pd.read_csv("t.csv")
        df["v"] = df["v"] % 0.25
        out = df.groupby("g", as_index=False)["v"].sum()
        out.to_csv("out.csv", index=False)
        print((df["v"] // 0.5).max())
    """, tmp_path, {"t.csv": _values()})


def test_no_warning_for_a_zero_divisor(tmp_path):
    # pandas divides under numpy's errstate(all="ignore"): x // 0.0 is inf with no warning
    import subprocess
    import sys
    result = same_text("""
        import pandas as pd
        df = pd.read_csv("t.csv")
        df["x"] = df["v"] // df["d"]
        df["y"] = df["v"] % 0.0
        df.to_csv("out.csv", index=False)
    """, tmp_path / "run", {"t.csv": _values()}) if (tmp_path / "run").mkdir() is None else None
    done = subprocess.run([sys.executable, "script.py"], cwd=tmp_path / "run" / "polars",
                          capture_output=True, text=True, timeout=120)
    assert done.returncode == 0 and "Warning" not in done.stderr, done.stderr
    assert "pandas_float_divmod" in result.converted_text
