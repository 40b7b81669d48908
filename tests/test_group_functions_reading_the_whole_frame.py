"""A function given to a groupby's agg that reads the whole frame besides the group's values
(`lambda s: s.sum() / df["qty"].sum()`, a group's share of the total) ports: the whole frame's
value is computed once, and is not the group's own.

Reference: pandas 3.1 itself, on small frames with missing keys, NaN, an empty group and text
outside ASCII (tests/support.differential). Before, the function was handed to pandas with `df`
inside it still a LazyFrame, and the converted script failed; written as an aggregation
naively, `df["qty"].sum()` became `pl.col("qty").sum()`, the group's own sum (every share 1.0).
"""

from __future__ import annotations

import pytest

from support import differential

FRAME = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "shop": ["b", "a", None, "b", "a", "c", np.nan, "Éclair", "c"],
    "qty": [1.0, np.nan, 3.0, 4.0, 5.0, np.nan, 2.0, 2.0, None],
    "n": [1, 2, 3, 4, 5, 6, 7, 8, 8],
    "t": ["x", "y", "z", None, "y", "ünï", "w", "v", "x"],
})
big = df[df["n"] > 4]
"""

FUNCTIONS = {
    "share of the total": 'r = df.groupby("shop")["qty"].agg(lambda s: s.sum() / df["qty"].sum())',
    "whole numbers": 'r = df.groupby("shop")["n"].agg(lambda s: s.sum() / df["n"].sum())',
    "above the mean": 'r = df.groupby("shop")["qty"].agg(lambda s: (s > df["qty"].mean()).sum())',
    "against the max": 'r = df.groupby("shop")["n"].agg(lambda s: s.max() - df["n"].max())',
    "count over rows": 'r = df.groupby("shop")["n"].agg(lambda s: s.count() / len(df))',
    "named aggregation": 'r = df.groupby("shop").agg(share=("n", lambda s: s.sum() / df["n"].sum()))',
    "another frame": 'r = df.groupby("shop")["n"].agg(lambda s: s.sum() / big["n"].sum())',
    "a filtered frame's own": 'r = big.groupby("shop")["qty"].agg(lambda s: s.mean() - big["qty"].mean())',
    "two keys": 'r = df.groupby(["shop", "t"])["n"].agg(lambda s: s.sum() / df["n"].sum()).reset_index()',
}


@pytest.mark.parametrize("source", list(FUNCTIONS.values()), ids=list(FUNCTIONS))
def test_group_function_reading_the_whole_frame(source: str) -> None:
    result = differential(FRAME + source + "\n", "r")
    assert not result.todos, [s.message for s in result.sites if s.status == "todo"]


def test_a_function_reading_a_grouped_frame_stays_a_todo() -> None:
    from support import convert
    result = convert(FRAME + 'g = df.groupby("t")\n'
                     'r = df.groupby("shop")["n"].agg(lambda s: s.sum() / g.ngroups)\n')
    assert any(s.status == "todo" for s in result.sites)
