"""groupby(...).agg({...}) and .agg([...]) holding numpy functions or Python builtins beside
texts ({"kg": np.mean, "n": [np.sum, "max", len]}), as older notebooks write them.

pandas 3 calls each such function on the group's Series: np.mean / np.sum / np.max skip
missing values as the Series' own methods do, np.std / np.var use numpy's ddof=0, np.median
reads the values (one missing makes NaN), sum meets NaN, len counts the rows. Each output
column is labelled by the function's name. pandas is the reference implementation: every
check runs the snippet with pandas and its conversion with Polars and compares.
"""

from __future__ import annotations

import pytest

from rule_checks import check_ports, check_todo
from support import differential

# Duplicate keys, a missing key, NaN in the floats (a group of NaN only: "c"), a one-row
# group ("d"), unicode keys, halves.
FRAME = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "k": ["a", "b", "a", None, "b", "c", "Ærø", "a", "d"],
    "g": ["x", "y", "y", "x", "x", "y", "x", "x", "y"],
    "v": [1.5, np.nan, 2.25, 4.0, 3.0, np.nan, -0.5, 2.5, 7.0],
    "n": [1, 2, 3, 4, 5, 6, 7, 8, -9],
})
"""

AGGREGATIONS = [
    pytest.param('df.groupby("k").agg({"v": np.mean, "n": np.sum})', id="dict of numpy functions"),
    pytest.param('df.groupby("k").agg({"v": [np.mean, np.std, "count"], "n": [np.sum, "max", len]})',
                 id="dict of lists: flattened column_function labels"),
    pytest.param('df.groupby("k", as_index=False).agg({"v": np.max, "n": np.min, "g": "first"})',
                 id="as_index=False"),
    pytest.param('df.groupby(["k", "g"]).agg({"v": np.std, "n": np.var}).reset_index()',
                 id="std and var with ddof=0, one-row groups"),
    pytest.param('df.groupby("g").agg({"v": np.median, "n": np.median})', id="median: NaN makes NaN"),
    pytest.param('df.groupby("k").agg({"v": sum, "n": max})', id="builtins in a dict"),
    pytest.param('df.groupby("k")["v"].agg([sum, min, max, len])', id="builtins in a list"),
    pytest.param('df.groupby("k")["v"].agg([np.sum, np.mean, np.median, "size"]).reset_index()',
                 id="list on one column"),
    pytest.param('df.groupby("k")[["v"]].agg([np.nanmean, np.var])', id="list on a frame's one column"),
    pytest.param('df.groupby("k").agg({"v": [np.nansum, np.nanmax], "n": np.amin})',
                 id="nan forms and amin"),
    pytest.param('df[df["n"] > 100].groupby("k").agg({"v": np.mean, "n": [np.sum, len]})',
                 id="no rows"),
]


@pytest.mark.parametrize("expr", AGGREGATIONS)
def test_aggregation_matches_pandas(expr: str) -> None:
    result = differential(FRAME + f"result = {expr}\n")
    assert "TODO(porter)" not in result.converted_text


def test_dict_of_numpy_functions_is_one_group_by() -> None:
    check_ports(FRAME + 'r = df.groupby("k").agg({"v": np.mean, "n": [np.sum, len]})\n',
                'pl.len().cast(pl.Int64).alias("n_len")')


def test_numpy_function_porter_does_not_read_stays_pandas() -> None:
    # np.prod has no rule: the whole call is a TODO, kept on pandas, and runs
    check_todo(FRAME + 'r = df.groupby("k").agg({"v": np.prod, "n": "sum"})\n', "groupby.agg")


def test_two_functions_of_one_name_stay_pandas() -> None:
    # pandas keeps two columns named "sum"; a Polars frame cannot hold them
    check_todo(FRAME + 'r = df.groupby("k")["v"].agg([np.sum, sum])\nprint(r)\n', "groupby.agg")
