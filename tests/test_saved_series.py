"""A Series kept in a name, then its frame changed: pandas' Series keeps the values it had.

Checked against pandas itself (the reference implementation) for each way a script changes
the column after saving it: overwritten, changed under a mask, assign, rename, and a saved
mask or text length compared after the column is cleaned. The data is an invented market
stall's price list.
"""

from __future__ import annotations

import pytest

from support import differential

FRAME = '''
import numpy as np
import pandas as pd
df = pd.DataFrame({"price": [10, 20, 30], "x": [1, 2, 3], "y": [5, -1, 7],
                   "name": ["  Ann", "Bo ", "Cy"]})
'''


@pytest.mark.parametrize("change", [
    pytest.param('saved = df["price"]\ndf["price"] = df["price"] * 1.5\n', id="overwritten"),
    pytest.param('saved = df["x"]\ndf.loc[df["y"] < 0, "x"] = 100\n', id="changed under a mask"),
    pytest.param('saved = df["y"]\ndf = df.assign(y=df["y"] * 10)\n', id="assign"),
    pytest.param('saved = df["x"]\ndf = df.rename(columns={"y": "x", "x": "y"})\n', id="renamed"),
    pytest.param('saved = df["x"] > 1\ndf["x"] = -df["x"]\n', id="a mask"),
    pytest.param('saved = df["name"].str.len()\ndf["name"] = df["name"].str.strip()\n',
                 id="text length before a strip"),
])
def test_a_saved_series_keeps_its_values(change: str) -> None:
    source = FRAME + change + ('total = saved.sum()\nvalues = saved.tolist()\n'
                               'differs = (saved != df["x"]).sum()\n')
    differential(source, "total", "values", "differs", "df")
