"""melt, explode and set_index on a frame that holds an index: the row labels a sort left
(carried as a column where the script reads them later, here by loc of idxmax) or a groupby's
keys. pandas' melt leaves the index out, explode repeats each row's label (ignore_index=True
renumbers them), and set_index replaces the index, which is dropped. Each was a TODO; the
conversion must compute what pandas computes. pandas is the reference.

The data: an invented apiary's hive inspections (a missing hive, NaN weights, an accented
hive name, notes split into lists with an empty one)."""

from __future__ import annotations

import pytest

from support import differential

HEAD = """
import pandas as pd
import numpy as np
df = pd.DataFrame({
    "when": ["2025-01-01 10:00", "2025-01-01 23:00", "2025-01-02 05:00", "2025-01-04 01:00",
             "2025-01-03 12:00"],
    "hive": ["H1", "H2", None, "Ħ4", "H1"],
    "w": [1.5, np.nan, 3.0, 2.0, 0.5],
    "t": [10, 11, 12, 13, 14],
    "notes": ["a,b", "", None, "c", "d,e,f"],
})
df["when"] = pd.to_datetime(df["when"])
df["tags"] = df["notes"].fillna("").str.split(",")
x = df.sort_values("w")
best = x.loc[x.groupby("hive")["t"].idxmax(), ["hive", "t"]]
keyed = df.groupby("hive").agg(w=("w", "sum"), t=("t", "max"), tags=("tags", "first"),
                               when=("when", "max"))
"""

CASES = {
    "frame.melt": [
        'result = x.melt(id_vars=["hive"], value_vars=["w", "t"])',
        'result = x.melt(id_vars="hive", value_vars=["w"], var_name="m")',
        'result = pd.melt(x, id_vars=["hive", "notes"], value_vars=["t", "w"])',
        'result = keyed.melt(value_vars=["w", "t"])',
        'result = keyed.melt(id_vars=["t"], value_vars=["w"])',
    ],
    "frame.explode": [
        'result = x[["hive", "tags"]].explode("tags")\nresult = result[result["tags"] != ""]',
        'result = x[["hive", "tags"]].explode("tags", ignore_index=True)',
        'result = x[["hive", "tags"]].explode("tags").reset_index()',
        'result = keyed.explode("tags")',
        'result = keyed.explode("tags", ignore_index=True)',
    ],
    "frame.set_index": [
        'result = x.set_index("when").reset_index()',
        'result = x.set_index("when").groupby("hive")["w"].resample("D").mean().reset_index()',
        'result = x.set_index(["hive", "t"]).reset_index()',
        'result = keyed.set_index("when").reset_index()',
    ],
}


@pytest.mark.parametrize("key, step", [(k, s) for k, steps in CASES.items() for s in steps])
def test_a_step_on_a_labelled_frame_is_ported_as_pandas_computes_it(key, step):
    result = differential(HEAD + step + "\n", "result", "best")
    assert '"index"' in result.converted_text  # the row labels were carried
    sites = [s for s in result.sites if s.key in (key, "pd.melt")]
    assert sites and all(s.status == "converted" for s in sites), sites


def test_an_index_name_is_not_a_column_to_melt():
    # pandas raises KeyError for an id column that is the index: the step stays a TODO
    result = differential(HEAD + 'result = keyed.melt(id_vars=["w"], value_vars=["t"])\n')
    assert all(s.status == "converted" for s in result.sites if s.key == "frame.melt")
    text = HEAD + 'result = keyed.melt(id_vars=["hive"], value_vars=["t"])\n'
    from support import convert_source
    converted = convert_source(text)
    assert any(s.key == "frame.melt" and s.status == "todo" for s in converted.sites)
