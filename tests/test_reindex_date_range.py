"""A Series labelled by dates laid over a pd.date_range (s.reindex(days, fill_value=0)): the
left join on a frame of the range that porter writes for it, checked against pandas.
"""

from __future__ import annotations

import pytest

from support import convert, differential

# Dates out of order, a day held twice (the groupby sums it), a missing date, days before and
# after the range, a group whose values are all NaN (its max stays NaN: fill_value fills the
# new labels only), whole numbers and floats.
FRAME = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "day": ["2024-03-02", "2024-02-27", None, "2024-03-02", "2024-03-05", "2024-02-29",
            "2024-03-09", "2024-03-01"],
    "n": [1, 2, 3, 4, 5, 6, 7, 8],
    "v": [0.5, np.nan, 2.5, -1.0, np.nan, 3.25, 1.0, np.nan],
})
df["day"] = pd.to_datetime(df["day"], format="%Y-%m-%d")
days = pd.date_range("2024-02-28", "2024-03-06", freq="D")
"""


@pytest.mark.parametrize("body", [
    'result = df.groupby("day")["n"].sum().reindex(days, fill_value=0).reset_index()',
    'result = df.groupby("day")["n"].count().reindex(days, fill_value=0).rename_axis("d").reset_index(name="c")',
    'result = df.groupby("day")["v"].max().reindex(days, fill_value=-1.5).reset_index()',
    'result = df.groupby("day")["n"].sum().reindex(days, fill_value=0.5).reset_index()',
    'result = df.groupby("day")["n"].sum().reindex(pd.date_range("2024-03-01", periods=12, freq="12h"), fill_value=0).reset_index()',
    's = df.groupby("day")["n"].sum()\ns = s.reindex(days, fill_value=0)\nresult = s.rename_axis("day").reset_index()',
    'result = df[df["n"] > 100].groupby("day")["n"].sum().reindex(days, fill_value=0).reset_index()',
])
def test_reindex_over_a_date_range_matches_pandas(body: str) -> None:
    result = differential(FRAME + body + "\n")
    assert not [s for s in result.todos if s.key in ("series.reindex", "pd.date_range")], \
        result.converted_text
    assert ".join(" in result.converted_text


@pytest.mark.parametrize("body,reason", [
    ('result = df.groupby("day")["n"].sum().reindex(days)', "no fill_value"),
    ('result = df.set_index("day")["n"].reindex(days, fill_value=0)', "distinct values"),
    ('result = df.groupby("day")["n"].sum().reindex(list(days), fill_value=0)', "target"),
])
def test_reindex_todo(body: str, reason: str) -> None:
    result = convert(FRAME + body + "\n")
    todo = next(s for s in result.todos if s.key == "series.reindex")
    assert reason in todo.message


def test_rename_axis_of_index_and_columns_none_matches_pandas() -> None:
    # crosstab's table: the index renamed and the columns' name taken away in one call
    source = FRAME + ('t = pd.crosstab(df["day"].dt.day, df["n"] > 3)\n'
                      'result = t.rename_axis(index="dom", columns=None).reset_index()\n')
    result = differential(source)
    assert not [s for s in result.todos if s.key == "frame.rename_axis"], result.converted_text


# -- a groupby's Series laid over every combination of its keys -------------------------------

PRODUCT = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "farm": ["b", "a", "b", None, "é", "a", "b", "a"],
    "size": ["seed", "ware", "seed", "seed", "chats", None, "ware", "ware"],
    "n": [1, 2, 3, 4, 5, 6, 7, 8],
    "kg": [0.5, np.nan, 2.5, -1.0, np.nan, 3.25, 1.0, 2.0],
})
SIZES = ["seed", "ware", "chats", "oversize"]
"""


@pytest.mark.parametrize("body", [
    'full = pd.MultiIndex.from_product([["a", "b", "c"], SIZES], names=["farm", "size"])\n'
    'result = df.groupby(["farm", "size"])["n"].sum().reindex(full, fill_value=0).reset_index()',
    'farms = sorted(df["farm"].dropna().unique())\n'
    'full = pd.MultiIndex.from_product([farms, SIZES], names=["farm", "size"])\n'
    'result = df.groupby(["farm", "size"])["kg"].max().reindex(full, fill_value=0).reset_index()',
    'full = pd.MultiIndex.from_product([SIZES, ["b", "a"]], names=["grade", "grower"])\n'
    'result = df.groupby(["size", "farm"])["n"].count().reindex(full, fill_value=-1).reset_index()',
    'full = pd.MultiIndex.from_product([["b", "a"], SIZES], names=["farm", "size"])\n'
    'kg = df.groupby(["farm", "size"])["kg"].sum().reindex(full, fill_value=0.0)\n'
    'result = kg.unstack("size").reset_index()',
    'full = pd.MultiIndex.from_product([[], SIZES], names=["farm", "size"])\n'
    'result = df.groupby(["farm", "size"])["n"].sum().reindex(full, fill_value=0).reset_index()',
])
def test_reindex_over_a_product_matches_pandas(body: str) -> None:
    result = differential(PRODUCT + body + "\n")
    assert not [s for s in result.todos if s.key in ("series.reindex", "pd.MultiIndex.from_product")], \
        result.converted_text
    assert 'how="cross"' in result.converted_text


@pytest.mark.parametrize("body,key", [
    # the MultiIndex read otherwise: pandas' own
    ('full = pd.MultiIndex.from_product([["a"], SIZES], names=["farm", "size"])\nprint(len(full))\n'
     'result = df.groupby(["farm", "size"])["n"].sum().reindex(full, fill_value=0)',
     "pd.MultiIndex.from_product"),
    ('full = pd.MultiIndex.from_product([["a"], SIZES])\n'
     'result = df.groupby(["farm", "size"])["n"].sum().reindex(full, fill_value=0)',
     "pd.MultiIndex.from_product"),
    ('full = pd.MultiIndex.from_product([["a"], SIZES], names=["farm", "size"])\n'
     'result = df.groupby(["farm", "size"])["n"].sum().reindex(full)', "series.reindex"),
])
def test_reindex_over_a_product_todo(body: str, key: str) -> None:
    result = convert(PRODUCT + body + "\n")
    assert key in [s.key for s in result.todos], result.converted_text
    differential(PRODUCT + body + "\n")  # what stays pandas still computes pandas' values


@pytest.mark.parametrize("body", [
    # a frame (two aggregates) reindexed: no rule, so pandas runs it, given pandas' MultiIndex
    'full = pd.MultiIndex.from_product([["b", "a", "q"], SIZES], names=["farm", "size"])\n'
    'agg = df.groupby(["farm", "size"]).agg(n=("n", "sum"), kg=("kg", "max"))\n'
    'result = agg.reindex(full, fill_value=0).reset_index()',
    'farms = sorted(df["farm"].dropna().unique())\n'
    'full = pd.MultiIndex.from_product([farms, SIZES], names=["farm", "size"])\n'
    'result = df.groupby(["farm", "size"])[["n", "kg"]].sum().reindex(full, fill_value=0)',
])
def test_a_product_given_to_pandas_is_pandas_multiindex(body: str) -> None:
    differential(PRODUCT + body + "\n")


def test_a_product_written_inside_the_reindex_matches_pandas() -> None:
    body = ('farms = sorted(df["farm"].dropna().unique())\n'
            'kg = df.groupby(["farm", "size"])["kg"].sum()\n'
            'kg = kg.reindex(pd.MultiIndex.from_product([farms, SIZES], names=["farm", "size"]),\n'
            '                fill_value=0)\n'
            'result = kg.unstack("size").reset_index()\n')
    result = differential(PRODUCT + body)
    assert not result.todos, result.converted_text


def test_a_product_given_to_a_table_pandas_made() -> None:
    # groupby.describe stays pandas: its reindex is pandas code given pandas' MultiIndex
    body = ('full = pd.MultiIndex.from_product([["b", "a", "q"], SIZES], names=["farm", "size"])\n'
            'stats = df.groupby(["farm", "size"])["kg"].describe()\n'
            'result = stats.reindex(full, fill_value=0).reset_index()\n')
    differential(PRODUCT + body)
