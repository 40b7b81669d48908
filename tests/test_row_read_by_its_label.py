"""df.loc[df["c"].idxmax()]: the whole row of a label read from the same frame, checked against
pandas (the reference implementation).

porter picks the row in Polars (pl.all().get(position)) and hands that one row to pandas with
its label as the index, so the row Series pandas code reads next has pandas' values, types and
name. The data is an invented mountain railway's train loads: ties, a missing value, text with
accents, an int column beside floats.
"""

from __future__ import annotations

import pytest

from support import differential

HEAD = '''
import numpy as np
import pandas as pd
load = pd.DataFrame({
    "train": ["Z01", "Z02", "Z03", "Z04", "Z05", "Z06"],
    "station": ["Talstation", "Alp Grüm", "Gipfel", "Alp Grüm", None, "Kulm"],
    "heads": [4, 14, 0, 14, 2, 0],
    "seats": [120.0, 80.0, np.nan, 160.0, 120.0, 0.0],
})
'''


@pytest.mark.parametrize("body", [
    # labels 0..n-1: the row's name is its number
    'row = load.loc[load["heads"].idxmax()]',
    'row = load.loc[load["seats"].idxmin()]',
    # labels a filter and a sort left, carried as a column
    'pos = load[load["heads"] > 0].sort_values(["seats", "train"], ascending=[False, True])\n'
    'row = pos.loc[pos["heads"].idxmin()]',
    # a groupby's key as the label
    'per = load.groupby("station").agg(heads=("heads", "sum"), seats=("seats", "max"))\n'
    'row = per.loc[per["heads"].idxmax()]',
])
def test_a_row_read_by_its_label_matches_pandas(body: str) -> None:
    result = differential(HEAD + body + '\nresult = [row, row.name, str(row.iloc[-1]), row["heads"]]\n')
    assert not [s for s in result.sites if s.status == "todo"], result.converted_text
    assert ".iloc[0]" in result.converted_text
