"""df.nlargest / nsmallest(n, column, keep="all"): every row tied with the n-th is kept.

pandas is the reference: each check runs the snippet with pandas and its conversion with
Polars and compares the frames (a hill-race club's finishing times, a hay barn's bale weights).
"""

from __future__ import annotations

import pytest

from support import convert, differential

TIMES = """
    import numpy as np
    import pandas as pd
    df = pd.DataFrame({
        "runner": ["Aled", "Brónach", "Cai", "Dóra", "Efa", "Ffion", "Gwil", "Huw", "Ióna"],
        "mins": [31.5, 28.0, np.nan, 28.0, 40.25, 31.5, 31.5, 25.0, 28.0],
        "club": ["hill", "fell", None, "hill", "fell", "hill", "road", "fell", "hill"],
    })
"""


@pytest.mark.parametrize("method", ["nlargest", "nsmallest"])
@pytest.mark.parametrize("n", [0, 1, 2, 3, 4, 5, 8, 9, 12])
def test_keep_all_keeps_the_ties_at_the_cut(method: str, n: int) -> None:
    # ties at the n-th value all stay, in their original order; past the values pandas
    # appends every missing one (they tie with each other)
    result = differential(TIMES + f"""
    result = df.{method}({n}, "mins", keep="all")
    """)
    assert "TODO" not in result.converted_text


def test_keep_all_on_a_column_of_only_missing_values_and_an_empty_frame() -> None:
    result = differential("""
    import numpy as np
    import pandas as pd
    df = pd.DataFrame({"bale": ["a", "b", "c"], "kg": [np.nan, np.nan, np.nan]})
    result = df.nlargest(1, "kg", keep="all")
    empty = df[df["bale"] == "z"].nsmallest(2, "kg", keep="all")
    """, "result", "empty")
    assert "TODO" not in result.converted_text


def test_keep_all_after_a_computed_column_and_a_filter() -> None:
    result = differential(TIMES + """
    df["pace"] = (df["mins"] / 8).round(2)
    fast = df[df["club"] != "road"]
    result = fast.nsmallest(2, "pace", keep="all")[["runner", "pace"]]
    """)
    assert "eq_missing" in result.converted_text


def test_keep_all_on_several_columns_and_keep_last_stay_todos() -> None:
    text = convert(TIMES + """
    result = df.nlargest(2, ["mins", "club"], keep="all")
    other = df.nlargest(2, "mins", keep="last")
    """).converted_text
    assert text.count("# TODO(porter): frame.nlargest") == 2, text
