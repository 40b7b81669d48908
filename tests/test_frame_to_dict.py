"""df.to_dict(orient): the dict pandas makes, its keys and values pandas' own (an int column
with a missing value is float, a missing value nan, a missing text nan), the row labels where
the orient holds them: 0..n-1, a groupby's keys, the labels a filter left. The frame crosses
to pandas once, where the dict is made. pandas is the reference.

The data: an invented seed bank's packets (a missing weight, a missing count, a missing name,
accents)."""

from __future__ import annotations

import math

import pytest

from support import convert_source, run

HEAD = """
import pandas as pd
import numpy as np
seeds = pd.DataFrame({"species": ["Cox", "Bramley", None, "Égremont", "Cox"],
                      "grams": [1.5, np.nan, 3.0, 0.25, 2.0],
                      "packets": [1, 2, 3, 4, 5],
                      "viable": [True, False, True, True, False]})
seeds["count"] = seeds["species"].map({"Cox": 10, "Bramley": 4})
"""


def _same(a, b) -> bool:
    """Equal, nan equal to nan (pandas' missing value), types alike (1 is not 1.0 here)."""
    if isinstance(a, dict) and isinstance(b, dict):
        return list(a) == list(b) and all(_same(a[k], b[k]) for k in a) \
            and [type(k) for k in a] == [type(k) for k in b]
    if isinstance(a, (list, tuple)) and isinstance(b, (list, tuple)):
        return len(a) == len(b) and all(_same(x, y) for x, y in zip(a, b))
    if isinstance(a, float) and isinstance(b, float) and math.isnan(a) and math.isnan(b):
        return True
    return type(a) is type(b) and a == b


@pytest.mark.parametrize("step", [
    'result = seeds.to_dict("records")',
    'result = seeds.to_dict(orient="list")',
    'result = seeds.to_dict()',
    'result = seeds.to_dict("index")',
    'result = seeds.groupby("species").agg(g=("grams", "sum"), n=("packets", "max")).to_dict()',
    'result = seeds.groupby("species").agg(g=("grams", "sum")).reset_index().to_dict("records")',
    'kept = seeds[seeds["packets"] > 2]\nresult = kept.to_dict("records")',
    'kept = seeds.sort_values("grams")\nresult = kept.to_dict("split")\n'
    'best = kept.loc[kept.groupby("viable")["packets"].idxmax(), ["species"]]',
])
def test_the_dict_is_pandas_own(step):
    source = HEAD + step + "\n"
    converted = convert_source(source)
    assert "TODO(porter)" not in converted.converted_text, converted.converted_text
    expected, actual = run(source)["result"], run(converted.converted_text)["result"]
    assert _same(expected, actual), (expected, actual)


def test_the_labels_of_a_sorted_frame_porter_does_not_carry_stay_a_todo():
    result = convert_source(HEAD + 'print(seeds.sort_values("grams").to_dict())\n')
    assert any(s.key == "frame.to_dict" and s.status == "todo" for s in result.sites)
