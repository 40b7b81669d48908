"""df.iloc[0] / df.iloc[-1]: one row picked in Polars and handed to pandas as its row Series.

Checked against pandas by what the scripts print and write: the row's values, its type (the
columns' common type: float64 for whole numbers beside floats, object beside text) and its
name (the row's label)."""

from __future__ import annotations

from pathlib import Path

import pytest

from support import convert, same_text

# a ferry line's crossings: whole numbers with a blank, floats, text with non-ASCII letters
CROSSINGS = """\
boat,port,cars,fare
Ørn,Kiel,12,4.5
Skarv,Åhus,,3.0
Ørn,Kiel,7,
Måke,Ystad,7,2.25
"""
# all whole numbers without blanks; a bool column
COUNTS = """\
dock,cars,trucks,late
1,12,3,True
2,5,0,False
3,9,1,True
"""

SHAPES = [
    'row = df.iloc[0]\nprint(row["cars"])\nprint(row)',
    'print(df.iloc[-1])',
    'print(df.iloc[0]["boat"])',
    'print(df.iloc[-1].to_dict())',
    'print(df.iloc[1, :])',
    'row = df.iloc[2]\nprint(row.name, row.dtype, list(row.index))',
    'row = df.loc[1]\nprint(row["port"], row.name)\nprint(row)',
    'print(df.loc[3, :].to_dict())',
]


@pytest.mark.parametrize("shape", SHAPES)
def test_a_row_of_mixed_columns_is_pandas_row(shape: str, tmp_path: Path) -> None:
    source = 'import pandas as pd\ndf = pd.read_csv("crossings.csv")\n' + shape + "\n"
    result = same_text(source, tmp_path, {"crossings.csv": CROSSINGS})
    assert "# TODO(porter): frame.iloc" not in result.converted_text
    assert ".get(" in result.converted_text


@pytest.mark.parametrize("position", [0, -1, 1])
def test_a_row_of_numbers_takes_their_common_type(position: int, tmp_path: Path) -> None:
    source = f'''\
        import pandas as pd
        df = pd.read_csv("counts.csv")
        print(df[["dock", "cars", "trucks"]].iloc[{position}])
        print(df.iloc[{position}])
        nums = df[["cars", "trucks"]]
        nums["share"] = nums["trucks"] / nums["cars"]
        print(nums.iloc[{position}].to_dict())
    '''
    same_text(source, tmp_path, {"counts.csv": COUNTS})


def test_a_row_without_the_data_folder(tmp_path: Path) -> None:
    source = '''\
        import pandas as pd
        df = pd.read_csv("crossings.csv")
        first = df.iloc[0]
        print(first)
        print(df.iloc[-1]["fare"])
    '''
    same_text(source, tmp_path, {"crossings.csv": CROSSINGS}, with_data=False)


def test_a_row_of_a_grouped_table_is_named_by_its_key(tmp_path: Path) -> None:
    source = '''\
        import pandas as pd
        df = pd.read_csv("crossings.csv")
        per = df.groupby("boat")[["cars", "fare"]].sum()
        print(per.iloc[0])
        print(per.iloc[-1].name)
    '''
    same_text(source, tmp_path, {"crossings.csv": CROSSINGS})


def test_a_row_after_a_filter_keeps_its_label(tmp_path: Path) -> None:
    source = '''\
        import pandas as pd
        df = pd.read_csv("crossings.csv")
        kiel = df[df["port"] == "Kiel"]
        print(kiel.iloc[-1])
    '''
    same_text(source, tmp_path, {"crossings.csv": CROSSINGS})


def test_a_row_by_label_after_a_sort_reads_the_label_not_the_position(tmp_path: Path) -> None:
    source = '''\
        import pandas as pd
        df = pd.read_csv("crossings.csv")
        by_cars = df.sort_values("cars")
        print(by_cars.loc[0])
        print(by_cars.iloc[0])
    '''
    same_text(source, tmp_path, {"crossings.csv": CROSSINGS})


def test_a_value_by_row_and_column_position_stays_a_todo() -> None:
    source = 'import pandas as pd\ndf = pd.read_csv("crossings.csv")\nx = df.iloc[0, 1]\n'
    assert "# TODO(porter): frame.iloc" in convert(source).converted_text
