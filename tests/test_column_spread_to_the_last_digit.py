"""s.std() and s.var() give pandas' digits, to the last one.

Reference: pandas 3.1 itself, run on the same data; what both print and write is compared as
text. pandas computes a variance in two passes with numpy (nanops.nanvar: the pairwise sum of
the values for the mean, then the squared distances to it added the same way, over count -
ddof); Polars' own std adds in another order and can end one binary digit away: on a table of
25 small whole numbers it gave 3.265986323710904 where pandas gives 3.2659863237109046.
"""

from __future__ import annotations

import numpy as np
import pytest

from support import same_text


def _values() -> str:
    """Floats written with all their digits, whole numbers with a blank (float64 in pandas) and
    without, a column holding one value and one holding none."""
    rng = np.random.default_rng(7)
    lines = ["g,v,n,w,one,none"]
    for i in range(400):
        v = "" if i % 13 == 0 else repr(float(rng.normal(50, 20)))
        n = "" if i % 9 == 0 else str(int(rng.integers(-5, 12)))
        one = "2.5" if i == 3 else ""
        lines.append(f"g{i % 3},{v},{n},{int(rng.integers(0, 1000))},{one},")
    return "\n".join(lines) + "\n"


@pytest.mark.parametrize("call", ["std()", "var()", "std(ddof=0)", "var(ddof=0)", "std(ddof=2)"])
@pytest.mark.parametrize("column", ["v", "n", "w", "one", "none"])
def test_std_and_var_print_pandas_digits(call, column, tmp_path):
    result = same_text(f"""
        import pandas as pd
        df = pd.read_csv("t.csv")
        print(repr(df["{column}"].{call}))
        print(df["{column}"].{call} * 3)
    """, tmp_path, {"t.csv": _values()})
    assert "TODO" not in result.converted_text


def test_standard_scores_written_to_the_last_digit(tmp_path):
    # the z-score of a column, inside an expression of its own rows, and after a filter
    same_text("""
        import pandas as pd
        df = pd.read_csv("t.csv")
        df["z"] = (df["v"] - df["v"].mean()) / df["v"].std()
        big = df[df["w"] > 300].copy()
        big["zn"] = (big["n"] - big["n"].mean()) / big["n"].std(ddof=0)
        df.to_csv("all.csv", index=False)
        big.to_csv("big.csv", index=False)
        print(df["z"].var(), big["zn"].std())
    """, tmp_path, {"t.csv": _values()})
