"""df.describe() of a frame with a datetime column: pandas describes the dates with timestamps
(mean, min, quartiles, max) beside a float count in one object column, std last. No Polars
column holds that, so the frame is handed to pandas, which describes it; the table must be
pandas' own, to the printed text."""

from __future__ import annotations

from support import convert, differential

FRAME = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "day": ["2026-03-20 09:00", "2026-04-01 00:00", None, "2026-03-29 01:15",
            "2026-04-23 19:00", "2026-04-01 00:00"],
    "kg": [48.5, np.nan, 61.0, 55.25, 55.25, 70.0],
    "n": [1, 2, 3, 3, 0, 2],
    "name": ["Intake", "Prée Haute", None, "Beck Side", "Intake", "x"],
})
df["day"] = pd.to_datetime(df["day"], format="%Y-%m-%d %H:%M")
"""


def test_describe_with_dates_is_pandas_own() -> None:
    result = differential(FRAME + "result = df.describe()\ntext = df.describe().to_string()\n",
                          "result", "text")
    assert "TODO(porter)" not in result.converted_text, result.converted_text
    site = next(s for s in result.sites if s.key == "frame.describe")
    assert site.status == "handover"


def test_describe_with_dates_after_a_filter_and_a_new_column() -> None:
    differential(FRAME + 'df = df[df["n"] > 0]\ndf["w"] = df["kg"] * 2\n'
                 'result = df.describe().round(2)\n')


def test_describe_without_dates_is_still_ported() -> None:
    result = convert(FRAME + 'result = df[["kg", "n"]].describe()\n')
    site = next(s for s in result.sites if s.key == "frame.describe")
    assert site.status == "converted"
