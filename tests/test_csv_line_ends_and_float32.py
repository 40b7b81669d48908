"""Reading CSV files whose lines end in a bare carriage return, or whose data rows carry a
trailing separator, and writing float32 columns.

pandas is the reference implementation: each check runs the snippet with pandas and its
conversion with Polars on the same files and compares what they computed.
"""

from __future__ import annotations

from pathlib import Path

import pandas as pd
import pytest

from support import assert_same_table, convert, differential, run, same_text


@pytest.fixture
def folder(tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> Path:
    monkeypatch.chdir(tmp_path)
    return tmp_path


def test_read_csv_lines_ending_in_a_bare_carriage_return(folder: Path) -> None:
    # pandas ends a line at a bare \r (old Mac files); Polars' reader at \n only, so it read
    # the whole file as a header of one line and no rows. The scan is told eol_char="\r"
    (folder / "mac.csv").write_bytes(b"k,n,s\r1,2,x\r3,4,y\r5,,z\r")
    result = differential("""
        import pandas as pd
        df = pd.read_csv("mac.csv")
        result = df
        total = df["n"].sum()
        names = list(df.columns)
        """, "result", "total", "names", data_dir=str(folder))
    assert 'eol_char="\\r"' in result.converted_text


def test_read_csv_lines_ending_in_a_bare_carriage_return_beside_newlines(folder: Path) -> None:
    # one line ends in \r, the others in \n: pandas reads three rows, Polars' reader joins two
    # lines into one value ("1\r2"); no reader option does what pandas does: a TODO that runs
    (folder / "mixed.csv").write_bytes(b"s\nab\r2\ncd\n")
    source = 'import pandas as pd\ndf = pd.read_csv("mixed.csv")\nresult = df\n'
    expected = pd.read_csv("mixed.csv")
    assert len(expected) == 3  # the behaviour the TODO names
    text = convert(source, data_dir=str(folder)).converted_text
    assert "# TODO(porter): pd.read_csv" in text and "carriage return" in text, text
    assert_same_table(expected, run(text)["result"])


def test_read_csv_quoted_carriage_return_is_a_value(folder: Path) -> None:
    # a \r inside quotes is part of the value to both readers: the file's lines end in \n
    (folder / "quoted.csv").write_bytes(b'k,s\n1,"a\rb"\n2,c\n')
    result = differential("""
        import pandas as pd
        result = pd.read_csv("quoted.csv")
        """, data_dir=str(folder))
    assert "TODO" not in result.converted_text and "eol_char" not in result.converted_text


def test_read_csv_numbers_with_a_trailing_separator_is_a_todo(folder: Path) -> None:
    # "1,2,3," under "a,b,c": pandas reads the first field as the row labels (a is 2, c is
    # missing). The schema reader failed on the extra field before it looked for it, so the
    # conversion scanned the file and crashed; the read now stays pandas' under a TODO
    (folder / "t.csv").write_text("a,b,c\n1,2,3,\n4,5,6,\n", encoding="utf-8")
    source = 'import pandas as pd\ndf = pd.read_csv("t.csv")\nresult = df.reset_index()\n'
    expected = run(source)["result"]
    assert list(pd.read_csv("t.csv")["a"]) == [2, 5]  # the behaviour the TODO names
    text = convert(source, data_dir=str(folder)).converted_text
    assert "# TODO(porter): pd.read_csv" in text and "one field more" in text, text
    assert_same_table(expected, run(text)["result"])


def test_read_csv_trailing_separator_on_every_line_is_an_unnamed_column(folder: Path) -> None:
    # the header ends in a comma too: pandas names the empty column "Unnamed: 3" (all NaN)
    (folder / "u.csv").write_text("a,b,c,\n1,2,3,\n4,5,6,\n", encoding="utf-8")
    differential("""
        import pandas as pd
        result = pd.read_csv("u.csv")
        """, data_dir=str(folder))


def test_to_csv_of_float32_columns_writes_numpys_text(tmp_path: Path) -> None:
    # pandas writes a float32 column as numpy's text of each value (values.astype(str)):
    # 1.234567e+06 and 1e-04, where Polars writes 1234567.0 and 0.0001 (the same digits)
    same_text("""
        import pandas as pd
        df = pd.read_csv("g.csv")
        df["z"] = df["x"].astype("float32")
        df.to_csv("out1.csv", index=False)
        g = pd.read_csv("g.csv", dtype={"x": "float32"})
        g["w"] = g["x"] * 2
        g["v"] = g["y"] / 3
        g.to_csv("out2.csv", index=False)
        """, tmp_path, {"g.csv": "x,y\n0.1,1\n1234567,2\n0.0001,3\n,4\n1e20,5\n-2.5e-9,6\n"
                                  "16777217,7\n-0.0,8\n"})
