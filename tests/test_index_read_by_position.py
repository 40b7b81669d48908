"""s.index[i] reads a pandas Index by position: the i-th key in the Series' order, never the
row whose key equals i (what s[i] would do on a Series labelled by its key).

pandas is the reference: each check runs the snippet with pandas and its conversion with
Polars and compares (a lighthouse keepers' guild's watch hours, a tram depot's fault counts).
"""

from __future__ import annotations

import pytest

from support import converted_text, differential

WATCHES = """
    import numpy as np
    import pandas as pd
    df = pd.DataFrame({
        "keeper": ["K02", "k01", "K03", "k01", None, "K02", "Ørn", "K03"],
        "faults": [-1, 0, 2, 2, 5, -1, 0, 7],
        "hours": [4.0, 8.0, np.nan, 12.0, 6.0, 8.0, 0.0, 6.0],
    })
"""


@pytest.mark.parametrize("position", [0, 1, 2, -1, -2])
def test_integer_keys_are_read_by_position_not_by_label(position: int) -> None:
    # keys -1, 0, 2, 5, 7: index[0] is -1 (label 0 is the second key), index[1] is 0 and
    # label 1 is no key at all
    differential(WATCHES + f"""
    per = df.groupby("faults")["hours"].sum()
    result = per.index[{position}]
    shifted = (per.index + 1)[{position}]
    """, "result", "shifted")


@pytest.mark.parametrize("position", [0, 1, -1])
def test_text_keys_after_a_sort_are_read_by_position(position: int) -> None:
    # the busiest keeper first: a key of text, in the order of the sorted sums
    differential(WATCHES + f"""
    top = df.groupby("keeper")["hours"].sum().sort_values(ascending=False)
    result = top.index[{position}]
    upper = top.index.str.upper()[{position}]
    """, "result", "upper")


def test_index_of_an_aggregated_frame_is_read_by_position() -> None:
    differential(WATCHES + """
    per = df.groupby("keeper").agg({"hours": "sum", "faults": "max"})
    result = per.index[0]
    last = per.index[-1]
    """, "result", "last")


def test_index_handed_over_is_an_index() -> None:
    # what porter leaves on pandas gets pandas' Index: `in` reads its values (after
    # str.upper() too), a comprehension its values in order
    source = WATCHES + """
    top = df.groupby("keeper")["hours"].sum().sort_values(ascending=False)
    result = "K01" in top.index.str.upper()
    missing = "k01" in top.index.str.upper()
    names = [k for k in top.index]
    """
    differential(source, "result", "missing", "names")


def test_index_position_needs_no_pandas_series() -> None:
    text = converted_text(WATCHES + """
    per = df.groupby("faults")["hours"].sum()
    result = per.index[0]
    """)
    assert 'pl.col("faults").get(0)' in text
    assert "TODO(porter)" not in text.split("per = ")[1]


def test_value_counts_index_is_read_by_position() -> None:
    # the most frequent value first: value_counts' keys are whole numbers here, so a label
    # read would take the count of the value 0, or fail
    differential(WATCHES + """
    counts = df["faults"].value_counts()
    result = counts.head(1).index[0]
    line = f"{counts.index[0]}|{counts.index[-1]}"
    """, "result", "line")


@pytest.mark.parametrize("expr", [
    "top.index[top.values > 6].tolist()",
    "top.index[top.values.argmax()]",
    "top.index[top > 6].tolist()",
])
def test_index_chosen_by_a_mask_of_the_values(expr: str) -> None:
    # the mask is computed by porter (the values read from Polars) and given to pandas' Index
    # as computed: the source's `top.values` would read a LazyFrame
    differential(WATCHES + f"""
    top = df.groupby("keeper")["hours"].sum().sort_values(ascending=False)
    result = {expr}
    """)


@pytest.mark.parametrize("expr", [
    "per.index.sort_values()[0]",
    "per.index.sort_values(ascending=False)[1]",
    "per.index[per.index > 0][0]",
    "per.index.drop_duplicates()[-1]",
    "per.index.map({-1: 10, 0: 20, 2: 30, 5: 40, 7: 50})[1]",
    "per.index.to_series().sort_values()[0]",    # a Series labelled by the keys: label 0
    "per.index.value_counts()[5]",               # counted by value: label 5
])
def test_what_an_index_method_gives_is_read_as_pandas_reads_it(expr: str) -> None:
    # an Index method gives an Index (read by position); to_series and value_counts give a
    # Series labelled by the values (read by label)
    differential(WATCHES + f"""
    per = df.groupby("faults")["hours"].sum().sort_values(ascending=False)
    result = {expr}
    """)


@pytest.mark.parametrize("expr", ["df.index[-1]", 'df["hours"].index[-2]', "df.index[0]"])
def test_row_numbers_are_read_by_position_from_the_end_too(expr: str) -> None:
    # pandas' RangeIndex: df.index[-1] is the last row number (a Series of the numbers would
    # read -1 as a label and fail)
    differential(WATCHES + f"    result = {expr}\n")
