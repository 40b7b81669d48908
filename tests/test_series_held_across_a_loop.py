"""A Series kept in a name and a later `for` loop that overwrites columns of its frame: the
Series is computed as pandas computed it only where it is read in the loop or after it; one
read only before the loop stays an expression of its frame (a lighthouse keepers' log: lamp
hours per watch, a date written two ways). pandas is the reference.
"""

from __future__ import annotations

from pathlib import Path

import pytest

from support import differential

LOG = """\
logged,keeper,first,middle,morning
2025-01-02,Ansel,4,,2
03/01/2025,Brit,,3,
2025-01-02,Ansel,4,,2
not kept,Cai,1,1,1
,Dörte,,,5
"""


@pytest.fixture
def folder(tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> Path:
    monkeypatch.chdir(tmp_path)
    (tmp_path / "log.csv").write_text(LOG)
    return tmp_path


def test_series_read_only_before_the_loop(folder: Path) -> None:
    result = differential("""
        import pandas as pd
        WATCHES = ["first", "middle", "morning"]
        log = pd.read_csv("log.csv").drop_duplicates()
        d1 = pd.to_datetime(log["logged"], format="%Y-%m-%d", errors="coerce")
        d2 = pd.to_datetime(log["logged"], format="%d/%m/%Y", errors="coerce")
        log["logged"] = d1.fillna(d2)
        for w in WATCHES:
            log[w] = log[w].fillna(0)
        log["total"] = log["first"] + log["middle"] + log["morning"]
        result = log
        """, data_dir=str(folder))
    assert "TODO" not in result.converted_text


def test_series_read_only_before_the_loop_in_a_frame_built_in_the_script() -> None:
    result = differential("""
        import pandas as pd
        import numpy as np
        log = pd.DataFrame({"keeper": [" ansel", "Brit ", None, "cai"],
                            "first": [4.0, np.nan, 1.0, np.nan], "middle": [np.nan, 3.0, 1.0, 2.5]})
        name = log["keeper"].str.strip()
        log["keeper"] = name.str.title()
        for w in ["first", "middle"]:
            log[w] = log[w].fillna(-1)
        result = log
        """)
    assert "TODO" not in result.converted_text


def test_series_read_after_the_loop_keeps_the_values_it_had() -> None:
    # the loop overwrites the column the Series reads: pandas keeps the values of before
    differential("""
        import pandas as pd
        import numpy as np
        log = pd.DataFrame({"first": [4.0, np.nan, 1.0, np.nan], "middle": [np.nan, 3.0, 1.0, 2.5]})
        gap = log["first"].isna()
        for w in ["first", "middle"]:
            log[w] = log[w].fillna(0)
        log["was_gap"] = gap
        result = log
        """)



def test_a_loop_over_named_columns_keeps_the_frames_columns_known(folder: Path) -> None:
    # each round overwrites one of the listed columns: afterwards the frame still has the same
    # columns, so a slice of column labels (loc[:, "first":"morning"]) is read from them
    result = differential("""
        import pandas as pd
        WATCHES = ["first", "middle", "morning"]
        log = pd.read_csv("log.csv").drop_duplicates()
        for w in WATCHES:
            log[w] = log[w].fillna(0)
        log["hours"] = log.loc[:, "first":"morning"].sum(axis=1)
        result = log.reset_index(drop=True)
        """, data_dir=str(folder))
    assert not result.todos, result.converted_text


def test_a_series_read_in_a_loop_whose_body_hands_its_frame_over(folder: Path) -> None:
    # the body puts a pandas Series back into a frame pandas changes in the loop: the Series is
    # pandas' in every round, made once before the loop (it was left a LazyFrame: TypeError)
    differential("""
        import numpy as np
        import pandas as pd
        log = pd.DataFrame({"first": [4.0, np.nan], "middle": [np.nan, 3.0]})
        before = log["first"] * 10
        for k in range(2):
            log["x"] = before + k
            log["first"] = log["first"].fillna(7) + 1
        result = log
        """)
