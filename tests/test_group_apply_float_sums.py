"""groupby.apply(lambda g: g["c"].sum()) of floats: pandas calls Series.sum on each group's values,
numpy's pairwise sum, where Polars adds them in another order, so the last digit can differ
(4285.299999999999 for 4285.3 in an older-pandas corpus case). porter says so (0.95) and the
values agree with pandas' within the last digits. pandas is the reference.

The data: an invented cider press's pressings, litres to two decimals over two presses."""

from __future__ import annotations

import pytest

from support import differential

HEAD = """
import pandas as pd
df = pd.DataFrame({
    "press": ["a", "b", "a", "b", "a", "b", "a", "b", "a", "a", "b", "b"],
    "litres": [12.35, 0.1, 7.2, 3.33, 19.99, 0.07, 4.41, 8.8, 2.25, 6.66, None, 1e-3],
    "n": [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12],
})
"""


@pytest.mark.parametrize("step, how", [
    ('result = df.groupby("press").apply(lambda g: g["litres"].sum())', "sum"),
    ('result = df.groupby("press").apply(lambda g: pd.Series({"l": g["litres"].mean(), "n": len(g)}))', "mean"),
])
def test_float_reductions_in_a_group_function_say_their_digits_may_differ(step, how):
    result = differential(HEAD + step + "\n")
    site = next(s for s in result.sites if s.key == "groupby.apply")
    assert site.status == "converted" and site.confidence == 0.95, site
    assert f"the {how} of a group's floats" in site.message


def test_int_sums_in_a_group_function_are_exact():
    result = differential(HEAD + 'result = df.groupby("press").apply(lambda g: g["n"].sum())\n')
    site = next(s for s in result.sites if s.key == "groupby.apply")
    assert site.status == "converted" and "group's floats" not in site.message, site
