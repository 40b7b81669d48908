"""s.quantile([0.1, 0.5, 0.9]): a Series of the quantiles labelled by the q's, named as the
column, each interpolated linearly as numpy computes it (to the last digit and the sign of a
zero), missing for a column without values. It was a TODO. pandas is the reference.

The data: an invented cider press's pressings (NaN, -0.0, ties, an empty selection)."""

from __future__ import annotations

import pytest

from support import convert_source, differential

HEAD = """
import pandas as pd
import numpy as np
y = pd.DataFrame({"litres": [1.5, 2.0, np.nan, 4.0, 5.5, 6.25, 3.0, -0.0],
                  "bins": [1, 5, 2, 8, 3, 3, 9, 0]})
"""


@pytest.mark.parametrize("step", [
    'result = y["litres"].quantile([0.1, 0.5, 0.9]).reset_index()',
    'result = y["bins"].quantile([0, 0.25, 1]).reset_index()',
    'qs = y["litres"].quantile([0.25, 0.75])\nresult = qs.reset_index()',
    'result = y[y["bins"] > 100]["litres"].quantile([0.5]).reset_index()',
    'result = y["litres"].quantile(q=[0.05, 0.95]).rename("q").reset_index()',
])
def test_several_quantiles_are_pandas(step):
    result = differential(HEAD + step + "\n")
    assert "TODO(porter)" not in result.converted_text, result.converted_text


def test_several_quantiles_with_other_interpolation_stay_a_todo():
    result = convert_source(HEAD + 'print(y["litres"].quantile([0.5], interpolation="lower"))\n')
    assert any(s.key == "series.quantile" and s.status == "todo" for s in result.sites)
