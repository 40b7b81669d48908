"""df.columns != "k" compares each name (pandas gives a boolean array), and df.columns[mask]
selects names by a boolean Series porter computed (df.isna().any()): porter's names are a
Python list, which compares whole (one True/False) and which a Series cannot index, so both
are pandas' Index of the names. A list made of the names (list(df.columns), tolist())
compares whole, as in pandas.

pandas is the reference: each check runs the snippet with pandas and its conversion with
Polars and compares (a mushroom forager club's finds).
"""

from __future__ import annotations

import pytest

from support import differential

FINDS = """
    import numpy as np
    import pandas as pd
    df = pd.DataFrame({
        "member": ["m1", "M2", None, "m1", "ö3"],
        "grams": [250.0, np.nan, 12.5, 0.0, 800.0],
        "count": [1, 2, 3, 0, 5],
        "wood": ["Oak", "Fir", "", None, "Birch"],
    })
"""


@pytest.mark.parametrize("expr", [
    'df.loc[:, df.columns != "member"]',
    'df.loc[:, "grams" != df.columns]',
    'df.loc[:, df.columns > "grams"]',
    'df.loc[:, df.columns == "zzz"]',
])
def test_names_compared_one_by_one_choose_columns(expr: str) -> None:
    differential(FINDS + f"    result = {expr}\n")


def test_names_compared_give_one_flag_per_name() -> None:
    differential(FINDS + """
    flags = df.columns != "wood"
    result = [bool(x) for x in flags]
    kept = int(flags.sum())
    """, "result", "kept")


def test_a_list_of_the_names_compares_whole() -> None:
    differential(FINDS + """
    result = list(df.columns) == ["member", "grams", "count", "wood"]
    other = df.columns.tolist() != ["member"]
    """, "result", "other")


@pytest.mark.parametrize("mask", ["df.isna().any()", "df.notna().all()", "(df == 0).any()"])
def test_names_selected_by_a_per_column_mask(mask: str) -> None:
    differential(FINDS + f"    result = list(df.columns[{mask}])\n")
