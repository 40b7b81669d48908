"""`for idx, row in df.iterrows():` after a filter or sort, when the loop reads no row label
(idx is never read, the row only by column), leaves the frame to Polars: only the loop itself
is handed to pandas. A loop that reads a label (idx, row.name, the row after the loop) keeps
pandas' labels: pandas makes the frame.

pandas is the reference: each check runs the snippet with pandas and its conversion with
Polars and compares (a tram depot's runs, a salt works' pans).
"""

from __future__ import annotations

import pytest

from support import converted_text, differential

RUNS = """
    import numpy as np
    import pandas as pd
    runs = pd.DataFrame({
        "tram": ["T01", "t02", "T03", "T01", None, "T04", "Tø5", "T03"],
        "km": [120.5, 0.0, -3.0, 88.25, 140.0, np.nan, 120.5, 61.0],
        "faults": [2, 0, 1, 3, 5, 2, 0, 4],
    })
    runs.drop_duplicates(inplace=True)
    good = runs[runs.km > 0]
"""

LABEL_FREE = RUNS + """
    rows = []
    for idx, r in good.iterrows():
        if r["faults"] > 1:
            rows.append({"tram": r["tram"], "ratio": round(r["km"] / r["faults"], 2)})
    result = pd.DataFrame(rows)
"""


def test_a_loop_reading_no_label_leaves_the_filter_to_polars() -> None:
    text = converted_text(LABEL_FREE)
    assert "frame.labels" not in text
    assert ".filter(" in text


def test_a_loop_reading_no_label_computes_what_pandas_computes() -> None:
    differential(LABEL_FREE, "result")


@pytest.mark.parametrize("body, after", [
    ('seen.append((idx, r["tram"]))', ""),                 # the label, in the body
    ('seen.append(r.name)', ""),                            # the row's label
    ('seen.append(r["km"])', "last = idx"),                 # the label, after the loop
    ('seen.append(r["km"])', "last = r.name"),              # the last row, after the loop
    ('seen.append(r)', ""),                                 # the row whole
])
def test_a_loop_reading_a_label_keeps_pandas_labels(body: str, after: str) -> None:
    source = RUNS + f"""
    seen = []
    for idx, r in good.iterrows():
        {body}
    {after}
    result = pd.DataFrame({{"v": [str(x) for x in seen]}})
    """
    text = converted_text(source)
    assert "frame.labels" in text or ".filter(" not in text
    differential(source, "result")


def test_a_lambda_with_the_row_name_is_another_variable() -> None:
    # `lambda r: ...` elsewhere binds an `r` of its own: the loop's row is still read only
    # in the loop
    source = LABEL_FREE.replace("    result = pd.DataFrame(rows)", """
    runs["per"] = runs.apply(lambda r: r["km"] / r["faults"] if r["faults"] > 0 else np.nan, axis=1)
    result = pd.DataFrame(rows)
    after = runs""")
    text = converted_text(source)
    assert "frame.labels" not in text
    differential(source, "result", "after")
