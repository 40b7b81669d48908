"""groupby(k)[c].transform("sum" | "mean") of floats adds each group as pandas' groupby sum
does: where the rows come sorted by the keys and no value is missing, pandas 3.1 adds a
group with numpy (10.2 + 9.7 + 23.3 + 11.2 is 54.400000000000006); otherwise with a
compensated sum in row order (54.4). The last digit shows in what to_csv writes, and in a
share rounded on a half.

pandas (the reference) runs each script; the conversion runs with Polars on the same file;
both must write the same text.
"""

from __future__ import annotations

from pathlib import Path

import pytest

from support import same_text

# a tide mill's grinding book: sacks per week and grain
SORTED = """\
week,grain,sacks
w1,barley,10.2
w1,oats,9.7
w1,rye,23.3
w1,wheat,11.2
w2,barley,0.1
w2,oats,0.2
w2,rye,0.3
w3,barley,1e16
w3,oats,1.0
w3,rye,-1e16
"""
UNSORTED = "week,grain,sacks\n" + "\n".join(
    sorted(SORTED.splitlines()[1:], key=lambda line: line.split(",")[1])) + "\n"
MISSING_VALUE = SORTED.replace("w2,oats,0.2", "w2,oats,")
MISSING_KEY = SORTED.replace("w2,oats,0.2", ",oats,0.2")
MISSING_KEY_FIRST = "week,grain,sacks\n,oats,0.2\n" + "".join(
    line + "\n" for line in SORTED.splitlines()[1:] if "w2,oats" not in line)


@pytest.mark.parametrize("data", [SORTED, UNSORTED, MISSING_VALUE, MISSING_KEY, MISSING_KEY_FIRST],
                         ids=["sorted", "unsorted", "missing-value", "missing-key",
                              "missing-key-first"])
@pytest.mark.parametrize("how", ["sum", "mean"])
def test_transform_sums_are_pandas_own(tmp_path: Path, data: str, how: str) -> None:
    text = same_text(f'''\
import pandas as pd
weekly = pd.read_csv("weekly.csv")
weekly["total"] = weekly.groupby("week")["sacks"].transform("{how}")
weekly["share"] = (weekly["sacks"] / weekly.groupby("week")["sacks"].transform("{how}")).round(3)
weekly["by_two"] = weekly.groupby(["week", "grain"])["sacks"].transform("{how}")
weekly.to_csv("out.csv", index=False)
''', tmp_path, {"weekly.csv": data}).converted_text
    assert "TODO(porter)" not in text, text
