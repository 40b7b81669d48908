"""Integer parts of dates with a missing date (pandas is the reference).

pandas 3 gives dt.year / dt.month / dt.dayofweek / td.dt.days as int32 (int64 for days), and
float64 once a date is missing (NaT): its max prints 1.0 and a group key is written 2024.0,
where the conversion's Int32 with nulls gives 1 and 2024. Files written, astype(str) and
tolist() of the column itself decide from the nulls at run time, as pandas does; what reads
the numbers themselves is lowered, with the reason.
"""

from __future__ import annotations

import pandas as pd
import pytest

from support import convert, same_text

SCRIPT = """
import pandas as pd
df = pd.read_csv("trips.csv", parse_dates=["start", "end"])
df["stay"] = df["end"] - df["start"]
top = df["{receiver}"].dt.{part}.max()
"""
FILES = {"trips.csv": "k,start,end\na,2024-01-01,2024-01-03\nb,2024-03-02,\na,,2024-01-04\n"}


@pytest.mark.parametrize("part,receiver", [
    ("year", "start"), ("month", "start"), ("dayofweek", "start"), ("days", "stay"),
])
def test_a_date_part_read_as_a_number_says_pandas_makes_it_float(tmp_path, part, receiver):
    source = SCRIPT.format(part=part, receiver=receiver)
    (tmp_path / "trips.csv").write_text(FILES["trips.csv"])
    namespace: dict = {}
    import os
    here = os.getcwd()
    os.chdir(tmp_path)
    try:
        exec(source, namespace)  # pandas: the reference
    finally:
        os.chdir(here)
    assert isinstance(namespace["top"], float)  # pandas' float64 beside the missing date
    result = convert(source, data_dir=str(tmp_path))
    site = next(s for s in result.sites if s.key == f"series.dt.{part}")
    assert site.confidence <= 0.95 and "float64" in site.message, site


def test_files_text_and_lists_of_date_parts_stay_pandas_own(tmp_path):
    # what follows the nulls at run time: 2024.0 beside a missing date, as pandas writes it
    same_text("""
        import pandas as pd
        df = pd.read_csv("trips.csv", parse_dates=["start", "end"])
        df["y"] = df["start"].dt.year
        df["days"] = (df["end"] - df["start"]).dt.days
        print(df["y"].tolist(), df["days"].astype(str).tolist())
        df.to_csv("out.csv", index=False)
        """, tmp_path, FILES)
