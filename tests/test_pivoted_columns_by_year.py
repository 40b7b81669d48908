"""pv[2024] of a table pivoted on an integer key (pivot_table(columns="year"), unstack, crosstab):
pandas labels those columns with the key's values, Polars names them as text ("2024"); the
column is read by its text. A year no row holds raises in both (KeyError in pandas). pandas is
the reference.

The data: an invented orchard's yields by variety and year (a missing variety, NaN, accents)."""

from __future__ import annotations

import pytest

from support import convert_source, differential, run

HEAD = """
import pandas as pd
import numpy as np
y = pd.DataFrame({"variety": ["Cox", "Cox", "Bramley", None, "Égremont", "Cox", "Bramley"],
                  "year": [2022, 2024, 2022, 2024, 2023, 2022, 2024],
                  "kg": [1.5, 2.0, np.nan, 4.0, 5.5, 6.25, 3.0]})
"""


@pytest.mark.parametrize("step", [
    'pv = y.pivot_table(index="variety", columns="year", values="kg", aggfunc="mean").round(2)\n'
    'pv["change"] = pv[2024] - pv[2022]\nresult = pv',
    'pv = y.pivot_table(index="variety", columns="year", values="kg", aggfunc="sum")\n'
    'result = pv[2022].reset_index()',
    'pv = y.groupby(["variety", "year"])["kg"].sum().unstack()\n'
    'pv["up"] = pv[2024] > pv[2022]\nresult = pv.reset_index()',
    'pv = pd.crosstab(y["variety"], y["year"])\nresult = (pv[2022] + pv[2023]).reset_index()',
])
def test_a_year_column_of_a_pivot_is_read_as_pandas_reads_it(step):
    result = differential(HEAD + step + "\n")
    assert "TODO(porter)" not in result.converted_text, result.converted_text


def test_a_year_no_row_holds_raises_in_both():
    source = HEAD + ('pv = y.pivot_table(index="variety", columns="year", values="kg", '
                     'aggfunc="sum")\nprint(pv[2030])\n')
    with pytest.raises(KeyError):
        run(source)
    with pytest.raises(Exception, match="2030"):
        run(convert_source(source).converted_text)
