"""s.sum() and s.mean() of a column whose type porter does not know (converted without
--data), to the last digit.

A float column read without --data was added with Polars' own sum, which adds in another
order than pandas (numpy's pairwise sum): `print(d["dry"].sum())` printed 11532.650000000001
where pandas prints 11532.65, and a share d["dry"] / d["dry"].sum() differed in the last digit.
The type is only known when the script runs: a float column is added as pandas adds it there,
any other column as before (whole numbers exactly).
"""

from __future__ import annotations

import sys
from pathlib import Path

import pytest

from support import same_text

sys.path.insert(0, str(Path(__file__).parent))
from test_shares_of_a_column_total import weights_csv  # noqa: E402

LINES = [
    'print(d["dry"].sum(), d["dry"].mean(), d["day"].sum(), d["day"].mean())',
    'e = d[d["rack"] == "Rø"]\nprint(e["dry"].sum(), e["dry"].mean(), round(e["dry"].sum(), 1))',
    'e = d[d["dry"] > 1000]\nprint(e["dry"].sum(), e["dry"].mean(), e["day"].sum(), e["day"].mean())',
    'd["share"] = d["dry"] / d["dry"].sum()\nd["c"] = d["dry"] - d["dry"].mean()\n'
    'd["dd"] = d["day"] / d["day"].sum()\nd["dm"] = d["day"] - d["day"].mean()\n'
    'd.to_csv("out.csv", index=False)',
    'e = d[d["dry"] > 1000].copy()\ne["c"] = e["dry"] - e["dry"].mean()\n'
    'e["s"] = e["dry"] / e["dry"].sum()\ne.to_csv("out.csv", index=False)',
]


@pytest.mark.parametrize("line", LINES)
def test_totals_without_data(line: str, tmp_path) -> None:
    same_text('import pandas as pd\nd = pd.read_csv("dry.csv")\n' + line + "\n",
              tmp_path, {"dry.csv": weights_csv()}, with_data=False)


def test_text_and_true_false_totals_without_data(tmp_path) -> None:
    same_text("""
        import pandas as pd
        d = pd.read_csv("flags.csv")
        print(d["ok"].sum(), d["ok"].mean(), d["n"].sum(), d["n"].mean())
        d["share"] = d["n"] / d["n"].sum()
        d.to_csv("out.csv", index=False)
    """, tmp_path, {"flags.csv": "ok,n\nTrue,1\nFalse,2\nTrue,3\n"}, with_data=False)
