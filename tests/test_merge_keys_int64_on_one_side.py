"""A merge key that is pandas' nullable Int64 on one side and a numpy int64 on the other.

pandas 3.1 gives the key the left side's type for an inner or left merge and Int64 for a right
or outer one. porter did not know the key's type after such a merge: where the frame was then
handed to pandas, the key came back float64 (1.0), so astype(str) gave "1.0" and to_csv wrote
1.0 where pandas has "1" and 1.

pandas is the reference implementation: each check runs the script with pandas and its
conversion with Polars and compares what they print and write.
"""

from __future__ import annotations

from pathlib import Path

import pytest

from support import same_text

DATA = {"l.csv": "tool_id,days\n1,3\n2,\n,5\n4,-1\n",
        "t.csv": "tool_id,name\n1,saw\n2,drill\n3,ladder\n"}


@pytest.mark.parametrize("how", ["outer", "left", "right", "inner"])
def test_key_type_after_a_merge_handed_to_pandas(tmp_path: Path, how: str) -> None:
    # list(m.index) keeps `m` on pandas: the key crosses over with its type
    same_text(f"""
        import pandas as pd
        l = pd.read_csv("l.csv")
        t = pd.read_csv("t.csv")
        l["tool_id"] = l["tool_id"].astype("Int64")
        m = l.merge(t, on="tool_id", how="{how}")
        m = m[m["name"] != "ladder"]
        print(list(m.index))
        m.to_csv("m.csv", index=False)
        m["key"] = m["tool_id"].astype(str)
        print(m["key"].tolist(), m["tool_id"].dtype)
        """, tmp_path, DATA)


@pytest.mark.parametrize("how", ["outer", "left", "right", "inner"])
def test_numpy_key_on_the_left(tmp_path: Path, how: str) -> None:
    same_text(f"""
        import pandas as pd
        l = pd.read_csv("l.csv")
        t = pd.read_csv("t.csv")
        l["tool_id"] = l["tool_id"].astype("Int64")
        m = t.merge(l, on="tool_id", how="{how}")
        m = m[m["name"] != "ladder"]
        print(list(m.index))
        m.to_csv("m.csv", index=False)
        m["key"] = m["tool_id"].astype(str)
        print(m["key"].tolist(), m["tool_id"].dtype)
        """, tmp_path, DATA)
