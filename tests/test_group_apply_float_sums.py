"""groupby.apply(lambda g: g["c"].sum()) of floats: pandas calls Series.sum (mean, std, var) on
each group's values, numpy's pairwise sum, where Polars adds them in another order, so the last
digit could differ (4285.299999999999 for 4285.3 in an older-pandas corpus case). porter adds
each group's values with numpy as pandas does; the values must agree with pandas' to the last
digit. pandas is the reference.

The data: an invented cider press's pressings, litres to two decimals over three presses (one
with no litres at all), and a long run of tenths whose sum depends on the order of adding."""

from __future__ import annotations

import pytest

from support import assert_same_value, convert_source, exact_floats, run

_PRESS = ["a", "b", "a", "b", "a", "b", "a", "b", "a", "a", "b", "b", "c"] + ["d"] * 300
_LITRES = [12.35, 0.1, 7.2, 3.33, 19.99, 0.07, 4.41, 8.8, 2.25, 6.66, None, 1e-3, None] \
    + [round(0.1 * (i % 7) + 0.01, 2) for i in range(300)]
_N = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 5] + list(range(300))
# the frame written out as a literal, so that porter knows its columns' types
HEAD = f"""
import pandas as pd
df = pd.DataFrame({{"press": {_PRESS!r}, "litres": {_LITRES!r}, "n": {_N!r}}})
"""

def _same_to_the_digit(step: str):
    source = HEAD + step + "\n"
    result = convert_source(source)
    assert "TODO" not in result.converted_text, result.converted_text
    expected, actual = run(source), run(result.converted_text)
    with exact_floats():
        assert_same_value(expected["result"], actual["result"])
    return result


@pytest.mark.parametrize("step", [
    'result = df.groupby("press").apply(lambda g: g["litres"].sum())',
    'result = df.groupby("press").apply(lambda g: g["litres"].mean())',
    'result = df.groupby("press").apply(lambda g: g["litres"].std())',
    'result = df.groupby("press").apply(lambda g: pd.Series({"l": g["litres"].mean(), '
    '"s": g["litres"].std(), "v": g["n"].var(), "m": g["n"].mean(), "n": len(g)}))',
    'result = df.groupby("press").apply(lambda g: g.loc[g["n"] > 4, "litres"].sum() / len(g))',
    'result = df.groupby("press").apply(lambda g: g.loc[g["n"] > 100, "litres"].mean())',
])
def test_float_reductions_in_a_group_function_match_pandas_to_the_last_digit(step):
    result = _same_to_the_digit(step)
    site = next(s for s in result.sites if s.key == "groupby.apply")
    assert site.status == "converted" and "group's floats" not in site.message, site
    assert "pandas_reduce(" in result.converted_text


def test_int_sums_in_a_group_function_are_exact():
    result = _same_to_the_digit('result = df.groupby("press").apply(lambda g: g["n"].sum())')
    site = next(s for s in result.sites if s.key == "groupby.apply")
    assert site.status == "converted" and "pandas_reduce(" not in result.converted_text, site
