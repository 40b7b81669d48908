"""The verifier and an unnamed index of labels that the conversion keeps as an "index" column.

describe() gives a frame whose unnamed index holds the statistics' names ("count", "mean"...);
porter's conversion holds them in a column named "index" (as reset_index() names it). The
verifier dropped the unnamed index and so reported every describe() output as different
("extra in converted: index"); it now compares the labels as that column.
"""

from __future__ import annotations

import pandas as pd
import polars as pl

from porter.verify.compare import compare

DATA = pd.DataFrame({"kg": [3.0, None, 4.5, 1.0], "n": [1, 2, 2, 7]})


def test_describe_labels_in_an_index_column_match() -> None:
    stats = DATA.describe().round(2)
    converted = pl.from_pandas(stats.reset_index())
    assert converted.columns[0] == "index"
    assert compare(stats, converted).status == "same"


def test_other_labels_in_the_index_column_differ() -> None:
    stats = DATA.describe().round(2)
    wrong = pl.from_pandas(stats.reset_index()).with_columns(
        pl.col("index").str.replace("mean", "avg"))
    assert compare(stats, wrong).status == "different"


def test_other_values_still_differ() -> None:
    stats = DATA.describe().round(2)
    wrong = pl.from_pandas(stats.reset_index()).with_columns(pl.col("kg") + 1)
    assert compare(stats, wrong).status == "different"


def test_row_numbers_and_an_extra_index_column_still_differ() -> None:
    # an "index" column on the other side is read as the row labels porter carries (pandas
    # keeps a RangeIndex after a filter or sort that leaves the rows in a run): labels other
    # than pandas' differ, the same labels match
    frame = pd.DataFrame({"kg": [1.0, 2.0]})
    converted = pl.DataFrame({"index": ["a", "b"], "kg": [1.0, 2.0]})
    assert compare(frame, converted).status == "different"
    renumbered = pl.DataFrame({"index": [1, 2], "kg": [1.0, 2.0]})
    assert compare(frame, renumbered).status == "different"
    carried = pl.DataFrame({"index": [0, 1], "kg": [1.0, 2.0]})
    assert compare(frame, carried).status == "same"
    # a second extra column is still extra
    extra = pl.DataFrame({"index": [0, 1], "kg": [1.0, 2.0], "g": [1, 2]})
    result = compare(frame, extra)
    assert result.status == "different" and "extra in converted: index, g" in result.detail


def test_series_with_text_labels() -> None:
    series = DATA["kg"].describe()
    converted = pl.DataFrame({"index": list(series.index), "kg": series.to_list()})
    assert compare(series, converted).status == "same"
