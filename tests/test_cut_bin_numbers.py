"""pd.cut(s, bins=[edges], labels=False): each value's bin number (0, 1, ...), as pandas gives
it. pandas holds the numbers as int64 when every value falls in a bin, and as float64 (1.0)
when a value is missing or outside every bin, which shows in the text it writes.

pandas is the reference implementation: every check runs the snippet with pandas and its
conversion with Polars and compares the values, and the CSV text both write.
"""

from __future__ import annotations

from pathlib import Path

import pytest

from support import differential, same_text

# NaN and None, a value on every edge, values below and above the edges, ties, negative zero.
FRAME = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "v": [1.5, np.nan, 0.0, -0.0, 3.0, None, -1.0, 9.5, 1.5, 2.999],
    "n": [5, -7, 0, 3, -2, 10, 20, -10, 5, 1],
    "k": ["a", "b", "a", "c", "b", "a", "c", "b", "a", "é"],
})
"""

CUTS = [
    pytest.param('pd.cut(df["v"], [-1, 0, 1.5, 3], labels=False)', id="floats with NaN and outside"),
    pytest.param('pd.cut(df["n"], [-10, 0, 5, 20], labels=False)', id="ints, the lowest edge left out"),
    pytest.param('pd.cut(df["n"], [-10, 0, 5, 20], labels=False, include_lowest=True)',
                 id="ints, every value in a bin: int64"),
    pytest.param('pd.cut(df["n"], [-10, 0, 5, 21], right=False, labels=False)', id="left-closed"),
    pytest.param('pd.cut(df["v"], bins=[-np.inf, 0, np.inf], labels=False)', id="infinite edges"),
    pytest.param('pd.cut(df["n"], [100, 200], labels=False)', id="no value in any bin"),
]


@pytest.mark.parametrize("call", CUTS)
def test_bin_numbers_match_pandas(call: str) -> None:
    result = differential(FRAME + f'df["band"] = {call}\nresult = df\n')
    assert "TODO(porter)" not in result.converted_text


@pytest.mark.parametrize("after", [
    pytest.param('result = df.assign(t=df["band"].astype(str))', id="as text: 1.0 or 1"),
    pytest.param('result = df.groupby("band", as_index=False)["n"].sum()', id="group by the numbers"),
    pytest.param('result = df.assign(b=df["band"] + 1)', id="arithmetic"),
    pytest.param('result = df[df["band"] == 1]', id="filter"),
])
def test_bin_numbers_used_later_match_pandas(after: str) -> None:
    differential(FRAME + 'df["band"] = pd.cut(df["v"], [-1, 0, 1.5, 3], labels=False)\n' + after + "\n")


@pytest.mark.parametrize("call", [
    'pd.cut(df["v"], [-1, 0, 1.5, 3], labels=False)',
    'pd.cut(df["n"], [-10, 0, 5, 20], labels=False, include_lowest=True)',
])
def test_csv_text_is_pandas_text(call: str, tmp_path: Path) -> None:
    # 1.0 where pandas holds floats, 1 where every value has a bin
    same_text(FRAME + f'df["band"] = {call}\ndf.to_csv("out.csv", index=False)\n', tmp_path)


QCUTS = [
    pytest.param('pd.qcut(df["v"], 3, labels=False)', id="qcut floats with NaN: float numbers"),
    pytest.param('pd.qcut(df["n"], 4, labels=False)', id="qcut ints, every value in a bin: int64"),
    pytest.param('pd.qcut(df["n"], [0, 0.5, 1], labels=False)', id="qcut by quantiles"),
]


@pytest.mark.parametrize("call", QCUTS)
def test_qcut_bin_numbers_match_pandas(call: str, tmp_path: Path) -> None:
    result = differential(FRAME + f'df["band"] = {call}\nresult = df.assign(t=df["band"].astype(str))\n')
    assert "TODO(porter)" not in result.converted_text
    same_text(FRAME + f'df["band"] = {call}\ndf.to_csv("out.csv", index=False)\n', tmp_path)


# Many ties: quantiles that fall on one value, which duplicates="drop" keeps once.
TIES = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "v": [1.0, 1.0, 1.0, 1.0, 2.0, np.nan, 3.0, 1.0, 5.0, 5.0],
    "c": [0, 0, 0, 0, 0, 0, 0, 1, 1, 2],
    "z": [7, 7, 7, 7, 7, 7, 7, 7, 7, 7],
})
"""

DROPS = [
    pytest.param('pd.qcut(df["v"], 4, labels=False, duplicates="drop")', id="ties and NaN"),
    pytest.param('pd.qcut(df["v"], 10, labels=False, duplicates="drop")', id="more bins than values"),
    pytest.param('pd.qcut(df["c"], 5, labels=False, duplicates="drop")', id="ints, most edges equal"),
    pytest.param('pd.qcut(df["c"], 2, labels=False, duplicates="drop")', id="no edge equal"),
    pytest.param('pd.qcut(df["z"], 3, labels=False, duplicates="drop")', id="one distinct edge: no bins"),
    pytest.param('pd.qcut(df["v"], [0.25, 0.5, 0.9], labels=False, duplicates="drop")',
                 id="quantiles not from 0 to 1: values outside"),
    pytest.param('pd.qcut(df["c"], [0, 0.1, 0.5, 0.75, 1], labels=False, duplicates="drop")',
                 id="a list with equal edges"),
]


@pytest.mark.parametrize("call", DROPS)
def test_qcut_numbers_over_distinct_edges_match_pandas(call: str, tmp_path: Path) -> None:
    result = differential(TIES + f'df["band"] = {call}\nresult = df.assign(t=df["band"].astype(str))\n')
    assert "pandas_qcut_numbers(" in result.converted_text
    assert "TODO(porter)" not in result.converted_text
    same_text(TIES + f'df["band"] = {call}\ndf.to_csv("out.csv", index=False)\n', tmp_path)


def test_qcut_numbers_over_distinct_edges_grouped_match_pandas() -> None:
    differential(TIES + 'df["band"] = pd.qcut(df["v"], 4, labels=False, duplicates="drop")\n'
                 'result = df.groupby("band", as_index=False)["c"].sum()\n')
