"""wide.div(wide.sum(axis=1), axis=0) and its kin (mul, sub, add): each column of numbers with a
Series of the frame's own rows, row by row (row shares of a pivot are the common case). porter
holds the Series in a column and combines every other column with it. pandas is the reference
implementation: each case runs both and compares.

The data: an invented farm shop's orders, with a channel that sells one size only (a row of
zeros but one), a row whose total is 0 (0 / 0), a missing amount and an accented name.
"""

from __future__ import annotations

import pytest

from support import differential

HEAD = """
import pandas as pd
import numpy as np
orders = pd.DataFrame({"channel": ["web", "phone", "web", "market", "Ståll", "web", "phone", "none"],
                       "size": ["small", "large", "large", "small", "medium", "small", "small", "small"],
                       "amount": [12.5, 300.0, 1200.0, np.nan, 80.25, 7.0, 14.0, 0.0],
                       "items": [1, 4, 9, 2, 3, 1, 2, 0]})
"""

CASES = {
    "row shares of counts": 'wide = orders.pivot_table(index="channel", columns="size", values="amount", aggfunc="count", fill_value=0)\n'
                            'result = wide.div(wide.sum(axis=1), axis=0).round(3).reset_index()',
    "row shares of sums, 0 / 0": 'wide = orders.pivot_table(index="channel", columns="size", values="amount", aggfunc="sum", fill_value=0)\n'
                                 'result = wide.div(wide.sum(axis=1), axis="index").reset_index()',
    "truediv of whole numbers": 'wide = orders.pivot_table(index="channel", columns="size", values="items", aggfunc="sum", fill_value=0)\n'
                                'result = wide.truediv(wide.sum(axis=1), axis=0).reset_index()',
    "mul of whole numbers stays whole": 'wide = orders.pivot_table(index="channel", columns="size", values="items", aggfunc="sum", fill_value=0)\n'
                                        'result = wide.mul(wide.sum(axis=1), axis=0).reset_index()',
    "sub of a row total, means with missing cells": 'wide = orders.pivot_table(index="channel", columns="size", values="amount", aggfunc="mean")\n'
                     'result = wide.sub(wide.sum(axis=1), axis=0).reset_index()',
    "crosstab": 'wide = pd.crosstab(orders["channel"], orders["size"])\n'
                'result = wide.div(wide.sum(axis=1), axis=0).reset_index()',
    "known columns": 'result = orders[["amount", "items"]].div(orders["items"], axis=0)',
}


@pytest.mark.parametrize("step", list(CASES.values()), ids=list(CASES))
def test_each_column_with_the_rows_series(step: str) -> None:
    result = differential(HEAD + step + "\n")
    assert not [s for s in result.sites if s.status == "todo"], result.converted_text


@pytest.mark.parametrize("step", [
    # lined up with the column labels: pandas matches the Series' labels to the columns
    'wide = orders.pivot_table(index="channel", columns="size", values="items", aggfunc="sum", fill_value=0)\n'
    'result = wide.div(wide.sum(), axis=1)',
    # a Series of other rows: aligned on the labels
    'result = orders[["amount", "items"]].div(orders["items"].head(3), axis=0)',
])
def test_what_stays_pandas(step: str) -> None:
    result = differential(HEAD + step + "\n")
    assert [s for s in result.sites if s.status == "todo"], result.converted_text
