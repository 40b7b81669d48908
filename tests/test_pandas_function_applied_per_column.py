"""df[cols].apply(pd.to_numeric, errors="coerce"): pandas calls pd.to_numeric on each column
with the keywords given. porter ports each column as its pd.to_numeric rule does, written into
the same columns (df[cols] = ...) or as a frame of its own. pandas is the reference
implementation: each case runs both and compares.

The data: an invented weather station's readings as text, with a word among the numbers,
blanks around a number, a missing value and a column that is numbers already.
"""

from __future__ import annotations

import pytest

from support import differential

HEAD = """
import pandas as pd
import numpy as np
readings = pd.DataFrame({"station": ["Cairn", "Bothy", "Mill Brae", "Cairn"],
                         "temp_c": ["3.5", " -1.25 ", "err", None],
                         "wind": ["12", "7", "1e1", "+4"],
                         "gust": [20.5, np.nan, 31.0, 18.0]})
"""

CASES = {
    "into the same columns": 'readings[["temp_c", "wind", "gust"]] = readings[["temp_c", "wind", "gust"]].apply(pd.to_numeric, errors="coerce")\nresult = readings',
    "as a frame of its own": 'result = readings[["temp_c", "wind", "gust"]].apply(pd.to_numeric, errors="coerce")',
    "a list in a name": 'cols = ["temp_c", "gust"]\nreadings[cols] = readings[cols].apply(pd.to_numeric, errors="coerce")\nresult = readings',
}


@pytest.mark.parametrize("step", list(CASES.values()), ids=list(CASES))
def test_to_numeric_of_each_column(step: str) -> None:
    result = differential(HEAD + step + "\n")
    assert not [s for s in result.sites if s.status == "todo"], result.converted_text
    assert "to_pandas" not in result.converted_text


def test_errors_raise_stops_both_scripts_on_a_word() -> None:
    from support import convert_source, run
    source = HEAD + 'result = readings[["temp_c", "wind"]].apply(pd.to_numeric)\n'
    with pytest.raises(Exception):
        run(source)
    converted = run(convert_source(source).converted_text)["result"]  # a plan, run here
    with pytest.raises(Exception):
        converted.collect()
