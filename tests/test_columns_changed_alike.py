"""`df[["a", "b"]] = df[["a", "b"]].method(constants)` for methods that work column by column,
checked against pandas (the reference implementation).

Each column of the result is what the Series method gives that column alone, so porter sets
them in one with_columns, as it sets `df["a"], df["b"] = ...`. The data is an invented bakery
oven share's day sheet: a left merge leaves missing values in an int and a float column.
"""

from __future__ import annotations

import pytest

from support import differential

HEAD = '''
import numpy as np
import pandas as pd
ovens = pd.DataFrame({"oven": ["wood", "deck", "clay", "sêche"], "capacity": [40, 24, 0, 12]})
load = pd.DataFrame({"oven": ["wood", "deck", "deck"], "loaves": [12, 7, 3],
                     "kg": [4.25, np.nan, -1.5]}).groupby("oven", as_index=False).sum()
grid = ovens.merge(load, on="oven", how="left")
'''


@pytest.mark.parametrize("body", [
    'grid[["loaves", "kg"]] = grid[["loaves", "kg"]].fillna(0)',
    'grid[["kg", "loaves"]] = grid[["kg", "loaves"]].fillna(-1.5)',
    'grid[["capacity", "kg"]] = grid[["capacity", "kg"]].clip(0, 20)',
    'grid[["kg", "capacity"]] = grid[["kg", "capacity"]].abs()',
    'grid[["kg", "loaves"]] = grid[["kg", "loaves"]].round(1)',
    'grid[["capacity", "oven"]] = grid[["capacity", "oven"]].astype(str)',
])
def test_columns_changed_alike_match_pandas(body: str) -> None:
    result = differential(HEAD + body + "\nresult = grid\n")
    assert not [s for s in result.sites if s.status == "todo"], result.converted_text


@pytest.mark.parametrize("body", [
    # other forms: a dict of values per column, different names on the two sides
    'grid[["loaves", "kg"]] = grid[["loaves", "kg"]].fillna({"loaves": 0})',
    'grid[["loaves", "kg"]] = grid[["kg", "loaves"]].fillna(0)',
])
def test_other_forms_still_run(body: str) -> None:
    differential(HEAD + body + "\nresult = grid\n")


@pytest.mark.parametrize("body", [
    # the names held in a module constant, or a constant and a list added together
    'COUNTS = ["loaves", "kg"]\ngrid[COUNTS] = grid[COUNTS].fillna(0)',
    'SOME = ["kg"]\ngrid[SOME + ["loaves"]] = grid[SOME + ["loaves"]].fillna(-1.5)',
    'SOME = ["kg"]\nMORE = ["capacity"]\ngrid[SOME + MORE] = grid[SOME + MORE].clip(0, 20)',
])
def test_names_held_in_constants_match_pandas(body: str) -> None:
    result = differential(HEAD + body + "\nresult = grid\n")
    assert not [s for s in result.sites if s.status == "todo"], result.converted_text
