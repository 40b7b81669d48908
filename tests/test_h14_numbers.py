"""Number types pandas 3.1 keeps or changes (round 14): whole floats put into int columns,
missing values beside whole numbers, int arithmetic in row functions, to_numeric of text.

pandas is the reference: each check runs the script with pandas and its conversion with Polars
in folders holding the same files, and compares what they print and write (same_text: 3 and
3.0 differ there, as they do for whoever reads the output).
"""

from __future__ import annotations

import pytest

from support import convert, same_text

# a ferry line's crossings: whole numbers of cars, fractions of hours
FERRY = {"f.csv": "boat,cars,hours\nAster,1,1.5\nBrill,2,2.5\nAster,3,3.5\nCove,4,4.0\n"}


# -- where / mask / clip / loc with a whole float on an int column ---------------------------

@pytest.mark.parametrize("line", [
    'f["x"] = f["cars"].where(f["cars"] > 2, 0.0)',
    'f["x"] = f["cars"].where(f["cars"] > 2, other=-0.0)',
    'f["x"] = f["cars"].mask(f["cars"] > 2, 5.0)',
    'f["x"] = f["cars"].clip(0.0, 3.0)',
    'f["x"] = f["cars"].clip(lower=2.0)',
    'f["x"] = f["cars"].clip(upper=np.inf)',
    'f["x"] = f["cars"].clip(np.nan, 3.0)',
    'f.loc[f["cars"] > 3, "cars"] = 0.0',
    'f["x"] = f["hours"].where(f["hours"] > 2, 0.0)',
    'f["x"] = f["hours"].clip(2.0, 3.0)',
])
@pytest.mark.parametrize("with_data", [True, False])
def test_whole_float_into_int_column(line, with_data, tmp_path):
    """pandas 3.1 puts a whole float into its int64 column as the int: where(cars > 2, 0.0),
    clip(0.0, 3.0) and loc[...] = 0.0 keep int64 (written 0, not 0.0), whatever the rows;
    an infinite or NaN bound is no bound. A float column stays float (written 0.0)."""
    same_text(f"""
        import numpy as np
        import pandas as pd
        f = pd.read_csv("f.csv")
        {line}
        f.to_csv("o.csv", index=False)
        print(f.iloc[:, -1].tolist())
        """, tmp_path, FERRY, with_data=with_data)


@pytest.mark.parametrize("line", [
    'f["x"] = f["cars"].clip(upper=f["cars"].quantile(0.9))',
    'f["x"] = f["cars"].clip(lower=f["cars"].mean())',
    'lo = f["cars"].median(); f["x"] = f["cars"].clip(lo, 100)',
    'f["x"] = f["cars"].clip(upper=f["cars"].quantile(0.9) * 1)',
])
def test_computed_float_bound_on_int_column_is_not_truncated(line, tmp_path):
    """pandas clips 1, 2, 3, 4 to a cap of 3.7 (the 0.9 quantile) as 1.0, 2.0, 3.0, 3.7, and
    to a floor of 2.5 (the mean) as 2.5, 2.5, 3.0, 4.0: Polars' clip would take the bound as
    the Int64 column's type (3 and 2)."""
    result = same_text(f"""
        import pandas as pd
        f = pd.read_csv("f.csv")
        {line}
        f.to_csv("o.csv", index=False)
        """, tmp_path, FERRY)
    sites = [s for s in result.sites if s.key == "series.clip"]
    assert sites and all(s.confidence < 1 for s in sites)


@pytest.mark.parametrize("line", [
    'f["x"] = f["cars"].where(f["cars"] > 0, 0.5)',
    'f["x"] = f["cars"].where(f["cars"] > 0, f["cars"].mean())',
    'f["x"] = f["cars"].mask(f["cars"] > 9, f["hours"])',
])
def test_fraction_into_int_column_is_lowered(line):
    """pandas makes the int64 column float64 only when the condition leaves a value out: here
    none is, so pandas writes 1, 2 where Polars' Float64 column writes 1.0, 2.0."""
    result = convert(f"""
        import pandas as pd
        f = pd.read_csv("f.csv", dtype={{"cars": "int64", "hours": "float64"}})
        {line}
        f.to_csv("o.csv", index=False)
        """)
    sites = [s for s in result.sites if s.key in ("series.where", "series.mask")]
    assert sites and sites[0].confidence < 1 and "leaves a value out" in sites[0].message
