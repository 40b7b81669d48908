"""np.median / np.percentile / np.quantile of a column, and their nan* forms, give numpy's
numbers, as they do on a pandas Series.

Reference: pandas 3.1 and numpy themselves, run on the same data; what both print is compared
as text. numpy reads a Series' values (it does not call Series.quantile): a missing value is NaN
to it and makes the result NaN, where the nan* forms skip it. np.percentile divides q by 100.
"""

from __future__ import annotations

import numpy as np
import pytest

from support import same_text


def _values() -> str:
    rng = np.random.default_rng(3)
    lines = ["v,n,full,w"]
    for i in range(301):
        v = "" if i % 29 == 0 else repr(float(rng.normal(10, 4)))
        n = "" if i % 31 == 0 else str(int(rng.integers(-20, 50)))
        lines.append(f"{v},{n},{int(rng.integers(0, 9))},{float(rng.uniform(-1, 1))!r}")
    return "\n".join(lines) + "\n"


@pytest.mark.parametrize("call", [
    'np.median(df["full"])', 'np.median(df["v"])', 'np.nanmedian(df["v"])',
    'np.percentile(df["w"], 90)', 'np.percentile(df["full"], 33.3)', 'np.percentile(df["n"], 50)',
    'np.nanpercentile(df["n"], 7)', 'np.nanpercentile(df["v"], q=99.5)',
    'np.quantile(df["w"], 0.07)', 'np.nanquantile(df["v"], 0.25)', 'np.quantile(df["w"], 1)',
    'np.percentile(df.loc[df["full"] > 4, "w"], 10)',
])
def test_numpy_quantiles_print_numpys_numbers(call, tmp_path):
    result = same_text(f"""
        import numpy as np
        import pandas as pd
        df = pd.read_csv("t.csv")
        top = {call}
        print(top, [top], top * 2)
        print(len(df[df["w"] > {call}]))
    """, tmp_path, {"t.csv": _values()})
    assert "TODO" not in result.converted_text


def test_a_list_of_percentiles_stays_a_todo():
    from support import convert
    result = convert('import numpy as np\nimport pandas as pd\ndf = pd.read_csv("t.csv")\n'
                     'qs = np.percentile(df["v"], [10, 90])\n')
    assert any(s.status == "todo" and s.key == "np.percentile" for s in result.sites)
