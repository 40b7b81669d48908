"""Operators whose operands were taken from the same rows at different points: a part of a
split made before a column was added, beside that column (a ferry line's crew list written
'Surname, First'). The expressions are read in the newest frame, which holds every operand's
columns as they are; pandas is the reference.
"""

from __future__ import annotations

from pathlib import Path

import pytest

from support import convert, differential

CREW = """\
crew,berth,shift
"Harrow, ann",3,early
"Quay,bo",1,late
"Harrow, ann",3,early
Nocomma,2,
,4,late
"Ørn, åsa",5,early
"  Søby , ÉMILE",6,late
"""


@pytest.fixture
def folder(tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> Path:
    monkeypatch.chdir(tmp_path)
    (tmp_path / "crew.csv").write_text(CREW)
    return tmp_path


SPLIT = """
    import numpy as np
    import pandas as pd
    crew = pd.read_csv("crew.csv").drop_duplicates()
    names = crew["crew"].str.strip().str.split(",", n=1, expand=True)
    crew["surname"] = names[0].str.strip().str.title()
"""


@pytest.mark.parametrize("line", [
    'crew["crew"] = names[1].str.strip().str.capitalize() + " " + crew["surname"]',
    'crew["crew"] = crew["surname"] + ", " + names[1].str.strip()',
    'crew["same"] = names[0].str.strip().str.title() == crew["surname"]',
    'crew["both"] = names[1].notna() & crew["surname"].str.startswith("H")',
    'crew["pick"] = np.where(names[1].isna(), crew["surname"], names[1])',
    'crew["longer"] = names[0].str.len() > crew["surname"].str.len() - crew["berth"]',
])
def test_a_split_part_beside_a_column_added_after_it(folder: Path, line: str) -> None:
    result = differential(SPLIT + f"""
    {line}
    result = crew
    """, data_dir=str(folder))
    assert "TODO" not in result.converted_text


def test_without_data_and_rows_kept(folder: Path) -> None:
    # the rows as read (no labels to keep): the same, with the frame built in the script
    result = differential("""
        import pandas as pd
        crew = pd.DataFrame({"crew": ["Harrow, ann", "Quay,bo", None, "Nocomma"], "berth": [3, 1, 4, 2]})
        crew = crew[crew["berth"] > 1]
        names = crew["crew"].str.split(",", n=1, expand=True)
        crew["surname"] = names[0].str.upper()
        crew["crew"] = names[1].str.strip() + " " + crew["surname"]
        result = crew
        """)
    assert "TODO" not in result.converted_text


def test_the_source_overwritten_in_between_still_reads_the_old_values(folder: Path) -> None:
    # the split's source column changes before the part is read: the part keeps pandas'
    # values of then (whatever form porter gives it), never the new column's
    differential(SPLIT + """
    crew["crew"] = crew["shift"]
    crew["who"] = names[1].str.strip() + " " + crew["surname"]
    result = crew
    """, data_dir=str(folder))


def test_a_column_of_other_rows_is_still_refused(folder: Path) -> None:
    # a part of a split made before rows were dropped does not line up with the later frame
    text = convert(SPLIT + """
    shorter = crew[crew["berth"] > 2]
    shorter["who"] = names[1] + shorter["surname"]
    result = shorter
    """, data_dir=str(folder)).converted_text
    assert "TODO(porter)" in text
