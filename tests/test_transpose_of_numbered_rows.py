"""df.T / df.transpose() of a frame of numbers labelled 0..n-1, checked against pandas.

pandas' columns become the integers 0..n-1 and the old column names its unnamed index; Polars
names the columns "0", "1", ... and porter holds them as pandas' integer labels. The data is an
invented ferry line's crossings."""

from __future__ import annotations

from pathlib import Path

import pytest

from support import convert, differential, same_text

HEAD = '''
import numpy as np
import pandas as pd
trips = pd.DataFrame({"cars": [12, 7, 0, 7], "fare": [4.5, np.nan, -0.0, 2.25],
                      "vans": [1, 2, 2, 0], "route": ["Ørn", "Åhus", "Ørn", None]})
'''

CASES = {
    "ints beside floats: float64": 'result = trips[["cars", "fare"]].T',
    "ints only: int64": 'result = trips[["cars", "vans"]].transpose()',
    "the first rows, put back as a column": 'result = trips[["fare", "vans"]].head(2).T.reset_index()',
    "no rows": 'result = trips[["cars", "vans"]].head(0).T.reset_index()',
    "one row": 'result = trips[["fare"]].tail(1).reset_index(drop=True).T',
}


@pytest.mark.parametrize("source", list(CASES.values()), ids=list(CASES))
def test_transpose_of_numbered_rows_matches_pandas(source: str) -> None:
    result = differential(HEAD + source + "\n")
    assert not [s for s in result.sites if s.status == "todo"], result.converted_text


@pytest.mark.parametrize("source", [
    # text beside numbers: an object frame in pandas
    'result = trips.T',
    # the labels a filter left would be the new column names
    'result = trips[trips["cars"] > 5][["cars", "vans"]].T',
])
def test_other_transposes_are_todos_that_run(source: str) -> None:
    result = differential(HEAD + source + "\n")
    assert {"frame.T", "frame.transpose"} & {s.key for s in result.sites if s.status == "todo"}, \
        result.converted_text


CROSSINGS = {"crossings.csv": """\
    cars,fare,vans
    12,4.5,1
    7,,2
    0,3.0,2
    """}


@pytest.mark.parametrize("with_data", [True, False])
def test_written_and_printed_as_pandas(tmp_path: Path, with_data: bool) -> None:
    source = '''\
        import pandas as pd
        df = pd.read_csv("crossings.csv")
        t = df.T
        t.to_csv("wide.csv")
        df.head(2).transpose().reset_index().to_csv("flat.csv", index=False)
        print(t.columns.tolist(), t.shape)
    '''
    same_text(source, tmp_path, CROSSINGS, with_data=with_data)


def test_the_columns_are_named_from_the_collected_height() -> None:
    text = convert(HEAD + 'result = trips[["cars", "vans"]].T\n').converted_text
    assert "range(t.height)" in text and "# TODO(porter)" not in text
