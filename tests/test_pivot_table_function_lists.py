"""pivot_table with a list of functions and no columns=: pandas pivots once per function and puts
the tables side by side, each column labelled by a (function, value column) pair; a script then
often keeps one level (df.columns = df.columns.droplevel(1)) and sets another table's Series
beside it, aligned on the labels. pandas is the reference implementation: each case runs both
and compares.

The data: an invented seed-potato co-op's grading boxes, with a missing grower, a grower whose
every box lacks its weight, duplicate growers, accented names, and an empty table.
"""

from __future__ import annotations

import pytest

from support import differential

HEAD = """
import pandas as pd
import numpy as np
boxes = pd.DataFrame({"grower": ["Åsa", "Bram", "Åsa", None, "Cai", "Bram", "Dunya", "Cai"],
                      "kg": [12.5, 8.0, np.nan, 4.0, np.nan, 6.25, 3.0, np.nan],
                      "n": [1, 2, 3, 4, 5, 6, 7, 8],
                      "size": ["seed", "ware", "seed", "ware", "chats", "seed", "ware", "seed"]})
fields = pd.DataFrame({"grower": ["Bram", "Åsa", "Zeno", None, "Cai"],
                       "ha": [2.0, 3.5, 9.0, 1.0, np.nan]})
"""

CASES = {
    "sum, mean, count; droplevel(1); renamed":
        'stats = boxes.pivot_table(index="grower", values="kg", aggfunc=["sum", "mean", "count"])\n'
        'stats.columns = stats.columns.droplevel(1)\n'
        'stats = stats.rename(columns={"sum": "kg", "mean": "kg_per_box", "count": "boxes"})',
    "a Series of another table set beside it":
        'stats = boxes.pivot_table(index="grower", values="kg", aggfunc=["sum", "mean", "count"])\n'
        'stats.columns = stats.columns.droplevel(1)\n'
        'stats["ha"] = fields.groupby("grower")["ha"].sum()\n'
        'stats["t_per_ha"] = (stats["sum"] / 1000 / stats["ha"]).round(2)',
    "mean and max only: a grower without a weight dropped":
        'stats = boxes.pivot_table(index="grower", values="kg", aggfunc=["mean", "max"])\n'
        'stats.columns = stats.columns.droplevel(1)',
    "every weight missing: the mean column dropped":
        'boxes["kg"] = np.nan\n'
        'stats = boxes.pivot_table(index="grower", values="kg", aggfunc=["sum", "mean"])\n'
        'stats.columns = stats.columns.droplevel(1)',
    "two value columns, sorted within each function":
        'stats = boxes.pivot_table(index="grower", values=["n", "kg"], aggfunc=["sum", "max"])\n'
        'stats.columns = [a + "_" + b for a, b in stats.columns]',
    "two keys":
        'stats = boxes.pivot_table(index=["grower", "size"], values="n", aggfunc=["sum", "count"])\n'
        'stats.columns = stats.columns.droplevel(-1)',
    "droplevel(0) keeps the value names":
        'stats = boxes.pivot_table(index="grower", values=["n", "kg"], aggfunc=["sum"])\n'
        'stats.columns = stats.columns.droplevel(0)',
    "no droplevel, written as pandas labels them":
        'stats = boxes.pivot_table(index="size", values="n", aggfunc=["min", "max"])',
    "an empty table":
        'boxes = boxes[boxes["n"] > 100]\n'
        'stats = boxes.pivot_table(index="grower", values="kg", aggfunc=["sum", "mean"])\n'
        'stats.columns = stats.columns.droplevel(1)',
}


@pytest.mark.parametrize("step", list(CASES.values()), ids=list(CASES))
def test_a_list_of_functions_is_ported_as_pandas_pivots_it(step: str) -> None:
    result = differential(HEAD + step + "\nresult = stats.reset_index()\n")
    assert not [s for s in result.sites if s.status == "todo"], result.converted_text


@pytest.mark.parametrize("step", [
    # the names repeat after droplevel(0): pandas keeps two "kg" columns, Polars cannot
    'stats = boxes.pivot_table(index="grower", values="kg", aggfunc=["sum", "mean"])\n'
    'stats.columns = stats.columns.droplevel(0)',
    # fill_value fills each function's table before they are put side by side
    'stats = boxes.pivot_table(index="grower", values="kg", aggfunc=["sum", "mean"], fill_value=0)',
])
def test_what_pandas_labels_otherwise_stays_a_todo(step: str) -> None:
    result = differential(HEAD + step + "\nresult = stats.reset_index()\n")
    assert [s for s in result.sites if s.status == "todo"], result.converted_text
