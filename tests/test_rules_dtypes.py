"""df.dtypes and s.dtype (porter/rules/selection.py): pandas names the types of one probe row
per column, not of the whole frame copied over.

pandas is the reference implementation: each check runs the script with pandas and its
conversion, and compares the printed text (and the values where the script computes with them).
"""

from __future__ import annotations

import pytest

from support import converted_text, differential, same_text

# a missing value in an int column (pandas: float64) and a True/False one (pandas: object),
# text with unicode, dates, a column that is missing everywhere
CSV = """\
plot,crop,kg,organic,sown,note
1,Äpfel,2.5,True,2024-03-01,
2,pears,,False,2024-03-04,
,plums,4.0,,2024-03-09,
4,ünï,1.0,True,,
"""


@pytest.mark.parametrize("body", [
    'print(df.dtypes)',
    'print(df[df["kg"] > 1].dtypes)',  # the filter drops the row with the missing plot: int64
    'print(df[df["kg"] > 100][["plot", "crop", "kg", "sown"]].dtypes)',  # no row left
    'print(df.head(2)[["plot", "kg", "note"]].dtypes)',
    'print(df.dtypes.to_dict())',
    'print(df["plot"].dtype, df["organic"].dtype, df["crop"].dtype, df["sown"].dtype)',
    'print(df[df["kg"] > 1]["plot"].dtype)',
    'print(df["kg"].round().dtype == "float64")',
    'for name, kind in df.dtypes.items():\n    print(name, kind == "object", str(kind))',
    'df["crop"] = df["crop"].astype("category")\nprint(df.dtypes)',
    'print(df.groupby("crop")["kg"].sum().dtype)',
])
def test_dtypes_as_pandas_names_them(body: str, tmp_path) -> None:
    source = f'import pandas as pd\ndf = pd.read_csv("plots.csv")\n{body}\n'
    result = same_text(source, tmp_path, {"plots.csv": CSV})
    assert "TODO" not in result.converted_text


@pytest.mark.xfail(strict=True, reason="a True/False column read with a blank is object in "
                   "pandas for good; porter marks it by its missing values, which a filter "
                   "can remove (the values are the same, the dtype's name is not)")
@pytest.mark.parametrize("rows", ['df[df["organic"].notna()]', "df.head(2)"])
def test_true_false_read_with_a_blank_after_its_blanks_are_gone(rows: str, tmp_path) -> None:
    source = f'import pandas as pd\ndf = pd.read_csv("plots.csv")\nprint({rows}.dtypes)\n'
    same_text(source, tmp_path, {"plots.csv": CSV})


def test_only_one_row_is_read_and_pandas_names_the_types_when_kept() -> None:
    # printed: the probe row's types are written as pandas names them, pandas not imported
    text = converted_text('import pandas as pd\ndf = pd.read_csv("plots.csv")\nprint(df.dtypes)\n')
    assert "print(pandas_dtypes_text(df.select(PANDAS_DTYPE_PROBE).collect()))" in text
    assert "PANDAS_DTYPE_PROBE = " in text
    # kept in a name: pandas' own dtypes of the one probe row
    text = converted_text('import pandas as pd\ndf = pd.read_csv("plots.csv")\nt = df.dtypes\nprint(t)\n')
    assert "df.select(PANDAS_DTYPE_PROBE).collect().to_pandas().dtypes" in text


def test_probe_on_tricky_frames() -> None:
    # pandas' own frames (the snippet's DataFrame): every column type, empty and not
    differential("""
        import numpy as np
        import pandas as pd
        df = pd.DataFrame({"n": [1, 2, 3], "v": [1.5, np.nan, None], "s": ["a", None, "é"],
                           "b": [True, False, True],
                           "d": pd.to_datetime(["2024-01-01", None, "2024-01-03"])})
        result = [str(df.dtypes), str(df[df["n"] > 5].dtypes), str(df["n"].dtype),
                  str(df[df["n"] > 1]["s"].dtype)]
    """)


@pytest.mark.parametrize("make", [
    # an Int64 column that a statement kept on pandas hands back without its mark
    'df["n"] = df["plot"].fillna(0).astype("Int64")\ndf["c"] = pd.Categorical(df["crop"])',
    # a hand-over gives pandas' nullable types back (astype("string") was str there)
    'df["crop"] = df["crop"].astype("string")',
    'df = df.convert_dtypes()',
])
def test_pandas_nullable_types_are_named_as_pandas_names_them(make: str, tmp_path) -> None:
    source = (f'import pandas as pd\ndf = pd.read_csv("plots.csv")\n{make}\n'
              'print(df.dtypes)\nprint(df["crop"].dtype)\n')
    same_text(source, tmp_path, {"plots.csv": CSV})
