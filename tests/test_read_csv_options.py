"""read_csv options that read a file another way (every column as text, other encodings),
checked against pandas 3.1 by the text each side prints and writes."""

from __future__ import annotations

from pathlib import Path

import pytest

from support import convert, same_text

# an orchard co-op's crates: blanks, pandas' missing-value tokens, quoted fields with the
# separator, accented text, numbers with spaces, a plus sign and leading zeros
CRATES = ('variety,crate,weight,grower\n'
          'Reinette grise, 5,"1,200.5",NA\n'
          'Bérénice,,3.50,n/a\n'
          '"Pippin, late",007,+3,  Éloïse \n'
          'Cox,12,NaN,""\n'
          'Gala,-0,1e3,null\n')

READ_AS_TEXT = '''
import pandas as pd
crates = pd.read_csv("crates.csv", dtype={dtype})
print(crates.dtypes.astype(str).tolist())
print(crates.isna().sum().tolist())
print(crates["crate"].str.len().tolist())
crates["label"] = crates["crate"].str.strip() + "/" + crates["variety"]
crates.to_csv("out.csv", index=False)
'''


@pytest.mark.parametrize("with_data", [True, False])
@pytest.mark.parametrize("dtype", ["str", '"str"', "object"])
def test_read_csv_every_column_as_text(tmp_path: Path, dtype: str, with_data: bool) -> None:
    source = READ_AS_TEXT.format(dtype=dtype)
    if dtype == "object":  # the values are the same; pandas names the dtype object (0.95)
        source = source.replace('print(crates.dtypes.astype(str).tolist())\n', '')
    result = same_text(source, tmp_path, {"crates.csv": CRATES}, with_data=with_data)
    assert "TODO(porter): pd.read_csv" not in result.converted_text
    assert "infer_schema_length=0" in result.converted_text


def test_read_csv_every_column_as_pandas_string(tmp_path: Path) -> None:
    source = READ_AS_TEXT.format(dtype='"string"').replace(
        'print(crates.dtypes.astype(str).tolist())\n', '').replace(
        'print(crates["crate"].str.len().tolist())\n', '')
    result = same_text(source, tmp_path, {"crates.csv": CRATES})
    assert "TODO(porter): pd.read_csv" not in result.converted_text
    read = next(s for s in result.sites if s.key == "pd.read_csv")
    assert read.confidence <= 0.9  # pd.NA, not NaN, for a missing value


def test_read_csv_every_column_as_text_keeps_blank_line_handling(tmp_path: Path) -> None:
    result = same_text('''
        import pandas as pd
        crates = pd.read_csv("crates.csv", dtype=str)
        print(len(crates), crates["crate"].tolist())
        crates.to_csv("out.csv", index=False)
        ''', tmp_path, {"crates.csv": "variety,crate\nCox,007\n\nGala, 5\n"})
    assert "TODO(porter): pd.read_csv" not in result.converted_text


def test_read_csv_other_dtype_for_every_column_stays_todo() -> None:
    text = convert('import pandas as pd\ndf = pd.read_csv("a.csv", dtype=float)\n').converted_text
    assert "TODO(porter): pd.read_csv" in text


# a ferry line's sailings, no header line: a blank, NA tokens, accented text, a quoted field
SAILINGS = ('Île-aux-Moines,007,1.5\n'
            '"Port, north",12,NA\n'
            'Séné,,2\n'
            'Arradon,3,n/a\n')


@pytest.mark.parametrize("with_data", [True, False])
@pytest.mark.parametrize("read", [
    'pd.read_csv("sailings.csv", header=None, names=["pier", "cars", "hours"])',
    'pd.read_csv("sailings.csv", names=["pier", "cars", "hours"])',
    'pd.read_csv("sailings.csv", names=["pier", "cars", "hours"], dtype={"cars": str})',
    'pd.read_csv("sailings.csv", names=("pier", "cars", "hours"), dtype=str)',
    'pd.read_csv("sailings.csv", header=None, names=["pier", "cars", "hours"], usecols=["hours", "pier"])',
])
def test_read_csv_names_without_a_header_line(tmp_path: Path, read: str, with_data: bool) -> None:
    result = same_text(f'''
        import pandas as pd
        sailings = {read}
        print(sailings.columns.tolist(), sailings.dtypes.astype(str).tolist())
        print(sailings.isna().sum().tolist(), len(sailings))
        sailings.to_csv("out.csv", index=False)
        ''', tmp_path, {"sailings.csv": SAILINGS}, with_data=with_data)
    assert "TODO(porter): pd.read_csv" not in result.converted_text
    assert "has_header=False" in result.converted_text


@pytest.mark.parametrize("with_data", [True, False])
def test_read_csv_names_replace_the_header_line(tmp_path: Path, with_data: bool) -> None:
    result = same_text('''
        import pandas as pd
        sailings = pd.read_csv("sailings.csv", header=0, names=["pier", "cars", "hours"])
        sailings["load"] = sailings["cars"] * 2
        print(sailings.columns.tolist(), sailings.dtypes.astype(str).tolist())
        sailings.to_csv("out.csv", index=False)
        ''', tmp_path, {"sailings.csv": "Quai,Voitures,Heures\n" + SAILINGS.replace("\nSéné,,2", "")},
        with_data=with_data)
    assert "TODO(porter): pd.read_csv" not in result.converted_text
    assert "new_columns=" in result.converted_text


@pytest.mark.parametrize("read", [
    'pd.read_csv("a.csv", header=None)',  # integer column names
    'pd.read_csv("a.csv", header=1)',
    'pd.read_csv("a.csv", names=["a", "a"])',
])
def test_read_csv_headers_porter_does_not_read_stay_todo(read: str) -> None:
    text = convert(f"import pandas as pd\ndf = {read}\n").converted_text
    assert "TODO(porter): pd.read_csv" in text
