"""Rule cases and differential checks for porter/rules/io.py (read_csv, read_parquet, to_csv,
to_parquet, pd.DataFrame literals).

pandas is the reference implementation: every differential check runs the snippet with pandas
and its conversion with Polars, each in its own folder holding the same input files, and
compares the variables they computed and the files they wrote (both read back by pandas).
"""

from __future__ import annotations

from pathlib import Path
import textwrap

import pandas as pd
import pytest

from rule_checks import check_ports, check_todo, check_unchanged
from support import assert_same_table, convert, differential, run, same_text

# Every missing-value token pandas knows that appears here: "NA", "n/a", "NULL", "NaN", "null",
# an empty field; "-" is not one of them (na_values adds it). zip codes have leading zeros.
PRODUCE_CSV = """\
id,price,label,picked,zip
1,1.5,Éclair,2024-01-05,01234
2,NA,n/a,2024-02-29,00001
3,,NULL,2024-03-01,99999
4,NaN,ünï,,12345
5,-,null,2024-03-02,00042
6,2.25,Éclair,2024-03-03,00042
"""

# The first lines are a title, not the header (skiprows=2).
TITLED_CSV = "Produce report\nexported 2024-03-04\nid,kg\n1,2.5\n2,NA\n3,4.0\n"


@pytest.fixture
def data(tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> Path:
    """A working folder holding the input files; the tests run inside it."""
    (tmp_path / "produce.csv").write_text(PRODUCE_CSV, encoding="utf-8")
    (tmp_path / "titled.csv").write_text(TITLED_CSV, encoding="utf-8")
    monkeypatch.chdir(tmp_path)
    return tmp_path


def written_by_both(source: str, folder: Path, monkeypatch: pytest.MonkeyPatch,
                    **options: object) -> tuple[Path, Path, str]:
    """Run `source` with pandas in folder/pandas and its conversion in folder/polars, each
    beside a copy of the inputs; return both folders and the converted text."""
    source = textwrap.dedent(source)
    converted = convert(source, **options).converted_text
    sides = []
    for side, text in (("pandas", source), ("polars", converted)):
        work = folder / side
        work.mkdir()
        for name in ("produce.csv", "titled.csv"):
            (work / name).write_text((folder / name).read_text(encoding="utf-8"), encoding="utf-8")
        monkeypatch.chdir(work)
        run(text)
        sides.append(work)
    monkeypatch.chdir(folder)
    return sides[0], sides[1], converted


# -- ports ----------------------------------------------------------------------------------

PORTS = [
    pytest.param('df = pd.read_csv("produce.csv")',
                 'pl.scan_csv("produce.csv", null_values=PANDAS_NA_VALUES, infer_schema_length=None)',
                 id="read_csv scans with pandas' missing-value tokens"),
    pytest.param('df = pd.read_csv("produce.csv", usecols=["label", "id"])',
                 '.select(pl.col("^(label|id)$"))', id="usecols selects in file order"),
    pytest.param('df = pd.read_csv("produce.csv", dtype={"zip": str})',
                 'schema_overrides={"zip": pl.String}', id="dtype becomes schema_overrides"),
    pytest.param('df = pd.read_csv("produce.csv", na_values=["-"])',
                 'null_values=PANDAS_NA_VALUES + ["-"]', id="na_values extend the defaults"),
    pytest.param('df = pd.read_csv("produce.csv", nrows=2)', "n_rows=2", id="nrows"),
    pytest.param('df = pd.read_csv("titled.csv", skiprows=2)', "skip_rows=2", id="skiprows count"),
    pytest.param('df = pd.read_csv("produce.csv", sep=";")', 'separator=";"', id="sep"),
    pytest.param('df = pd.read_csv("produce.csv", parse_dates=["picked"])',
                 'pandas_to_datetime(pl.col("picked"), coerce=False)', id="parse_dates"),
    pytest.param('df = pd.read_parquet("produce.parquet")',
                 'pl.scan_parquet("produce.parquet").with_columns(pl.col(pl.Float32, pl.Float64).fill_nan(None))',
                 id="read_parquet turns stored NaN into missing"),
    pytest.param('df = pd.read_parquet("produce.parquet", columns=["id"])',
                 '.select("id")', id="read_parquet columns"),
    pytest.param('df = pd.DataFrame({"a": [1.0, np.nan, None]})\ndf.to_csv("out.csv", index=False)',
                 'with_columns(PANDAS_CSV_FLOATS).sink_csv("out.csv", null_value=\'""\')',
                 id="to_csv index=False sinks (one column: a missing value is written \"\")"),
    pytest.param('df = pd.DataFrame({"a": [1.0, np.nan]})\ndf.to_csv("out.csv")',
                 'df.collect().to_pandas().to_csv("out.csv")',
                 id="to_csv with the default index is handed to pandas"),
    pytest.param('df = pd.DataFrame({"a": [1.0, np.nan]})\ndf.to_parquet("out.parquet")',
                 'df.sink_parquet("out.parquet")', id="to_parquet sinks"),
    pytest.param('df = pd.DataFrame({"ok": [True, False]})\ndf.to_csv("out.csv", index=False)',
                 'replace_strict({True: "True", False: "False"})',
                 id="booleans written as True and False"),
    pytest.param('df = pd.DataFrame({"a": [1.0, np.nan, None], "s": ["x", None, "ünï"]})',
                 'pl.LazyFrame({"a": [1.0, None, None], "s": ["x", None, "ünï"]})',
                 id="NaN in a literal is written as None"),
]


@pytest.mark.parametrize("before, expected", PORTS)
def test_ports(before: str, expected: str) -> None:
    check_ports("import pandas as pd\nimport numpy as np\n" + before + "\n", expected)


TODOS = [
    pytest.param('df = pd.read_csv("produce.csv", index_col=0)', "pd.read_csv", id="index_col"),
    pytest.param('df = pd.read_csv("produce.csv", skiprows=[1, 3])', "pd.read_csv",
                 id="a list of skipped rows"),
    pytest.param('df = pd.read_csv("produce.csv", encoding="shift_jis")', "pd.read_csv",
                 id="encodings other than UTF-8"),
    pytest.param('df = pd.read_csv("produce.csv", sep=r"\\s*,\\s*", engine="python")', "pd.read_csv",
                 id="a regex separator"),
    pytest.param('df = pd.DataFrame({"a": [1.0, 2.0]})\ndf[df["a"] > 1].to_csv("out.csv")',
                 "frame.to_csv", id="to_csv with the labels of a filtered frame"),
    pytest.param('df = pd.DataFrame({"a": [1.0, 2.0]})\ndf.to_parquet("out.parquet", index=True)',
                 "frame.to_parquet", id="to_parquet index=True"),
    pytest.param('df = pd.DataFrame({"a": [1.0, 2.0]})\ntext = df.to_csv(index=False)',
                 "frame.to_csv", id="to_csv without a path returns text"),
]


@pytest.mark.parametrize("before, key", TODOS)
def test_todo(before: str, key: str, data: Path) -> None:
    check_todo("import pandas as pd\n" + before + "\n", key)


UNCHANGED = [
    pytest.param("import pandas as pd\nimport csv\nrows = list(csv.reader(open('produce.csv')))\n",
                 id="csv module reader"),
    pytest.param("import pandas as pd\nclass Report:\n    def to_csv(self, path):\n        pass\n"
                 "Report().to_csv('out.csv')\n", id="to_csv of another class"),
    pytest.param("import pandas as pd\nimport json\ntext = json.dumps({'a': [1, 2]})\n",
                 id="json dumps"),
]


@pytest.mark.parametrize("before", UNCHANGED)
def test_unchanged(before: str) -> None:
    check_unchanged(before)


# -- differential: reading ------------------------------------------------------------------

READS = [
    pytest.param('pd.read_csv("produce.csv")', id="default tokens NA n/a NULL NaN null"),
    pytest.param('pd.read_csv("produce.csv", usecols=["zip", "label", "id"])', id="usecols order"),
    pytest.param('pd.read_csv("produce.csv", usecols=["label"])', id="usecols one column"),
    pytest.param('pd.read_csv("produce.csv", dtype={"zip": str})', id="dtype keeps leading zeros"),
    pytest.param('pd.read_csv("produce.csv", dtype={"id": "float64", "zip": "str"})',
                 id="dtype float and str"),
    pytest.param('pd.read_csv("produce.csv", na_values=["-"])', id="na_values makes price numeric"),
    pytest.param('pd.read_csv("produce.csv", na_values="-")', id="na_values as one string"),
    pytest.param('pd.read_csv("produce.csv", na_values=["-"], nrows=3)', id="nrows"),
    pytest.param('pd.read_csv("titled.csv", skiprows=2)', id="skiprows before the header"),
    pytest.param('pd.read_csv("produce.csv", parse_dates=["picked"])',
                 id="parse_dates with a missing date"),
    pytest.param('pd.read_csv("produce.csv", na_values=["-"]).query("id > 100")',
                 id="empty result keeps the columns"),
]


@pytest.mark.parametrize("read", READS)
def test_read_csv_matches_pandas(read: str, data: Path) -> None:
    differential(f"""
        import pandas as pd
        result = {read}
        """)


def test_read_csv_nrows_types_come_from_the_first_rows(data: Path) -> None:
    # pandas infers types from the rows it reads (price is a float column in the first 2
    # rows); Polars infers from the whole file, where row 5 holds "-": text. Not faithful, so
    # the site must carry a lowered confidence with its reason.
    result = convert('import pandas as pd\ndf = pd.read_csv("produce.csv", nrows=2)\n')
    site = next(s for s in result.sites if s.key == "pd.read_csv")
    assert site.confidence < 0.95
    assert "nrows" in site.message


def test_read_csv_nrows_types_from_the_rows_read_with_data(tmp_path: Path) -> None:
    # a ferry line's first sailings: the load column holds text only in a later row, which
    # pandas never reads with nrows=2 (int64 there, a sum and a mean); porter reads the types
    # of those rows from --data
    same_text("""
        import pandas as pd
        head = pd.read_csv("sailings.csv", nrows=2)
        print(head["load"].sum(), head["load"].mean(), head.dtypes.tolist())
        head.to_csv("head.csv", index=False)
        """, tmp_path, {"sailings.csv": "sailing,load\n1,5\n2,7\n3,n/a?\n4,8\n"})


def test_read_csv_nrows_with_a_blank_line_in_the_rows_read_is_a_todo(tmp_path: Path) -> None:
    # pandas skips the blank line and reads two rows; Polars' n_rows counts it as a row
    (tmp_path / "kiln.csv").write_text("firing,temp\n1,900\n\n2,950\n3,1000\n")
    result = convert('import pandas as pd\ndf = pd.read_csv("kiln.csv", nrows=2)\n',
                     data_dir=str(tmp_path))
    assert [s.key for s in result.sites if s.status == "todo"] == ["pd.read_csv"]


def test_read_csv_unnamed_index_column_with_data(data: Path) -> None:
    # A file written by pandas with its index has an empty first header; pandas names that
    # column "Unnamed: 0". With --data porter sees the header and names it the same way.
    pd.DataFrame({"kg": [1.5, None], "name": ["Éclair", "ünï"]}).to_csv(data / "indexed.csv")
    differential("""
        import pandas as pd
        result = pd.read_csv("indexed.csv")
        """, data_dir=str(data))


def test_read_csv_repeated_header_with_data_is_a_todo(data: Path) -> None:
    # pandas names the copy "kg.1", Polars "_duplicated_0".
    (data / "twice.csv").write_text("kg,kg\n1,2\n", encoding="utf-8")
    result = convert('import pandas as pd\ndf = pd.read_csv("twice.csv")\n', data_dir=str(data))
    assert "# TODO(porter): pd.read_csv" in result.converted_text


def test_read_csv_parse_dates_follows_pandas_guess_for_slashed_dates(data: Path) -> None:
    # pandas is the reference: it reads 05/03/2024 as May 3rd (month first, guessed from the
    # first value) and 13/01/2024 day first; Polars' own guess read March 5th. With --data
    # porter makes pandas' guess from the sample and writes the format; without, the script
    # makes it at run time (pandas_to_datetime)
    for rows in ("05/03/2024,1\n06/04/2024,2\n", "13/01/2024,1\n06/04/2024,2\n"):
        (data / "dates.csv").write_text("d,v\n" + rows, encoding="utf-8")
        source = 'import pandas as pd\nresult = pd.read_csv("dates.csv", parse_dates=["d"])\n'
        for options in ({}, {"data_dir": str(data)}):
            expected = run(source)["result"]
            actual = run(convert(source, **options).converted_text)["result"].collect()
            assert expected["d"].tolist() == actual["d"].to_list(), (rows, options)


def test_read_parquet_nan_and_none(data: Path) -> None:
    pd.DataFrame({"kg": [1.5, float("nan"), None, 3.0],
                  "name": ["Éclair", None, "ünï", "x"]}).to_parquet(data / "produce.parquet")
    differential("""
        import pandas as pd
        result = pd.read_parquet("produce.parquet")
        missing = int(result["kg"].isna().sum())
        """, "result", "missing")


def test_read_parquet_columns(data: Path) -> None:
    pd.DataFrame({"kg": [1.5, float("nan")], "name": ["Éclair", None]}).to_parquet(data / "p.parquet")
    differential("""
        import pandas as pd
        result = pd.read_parquet("p.parquet", columns=["name"])
        """)


LITERALS = [
    pytest.param('{"a": [1.0, np.nan, None], "s": ["Éclair", None, "ünï"]}', id="NaN and None"),
    pytest.param('{"a": [1, 2.5, None], "n": [1, 2, 3]}', id="mixed int and float"),
    pytest.param('{"b": [True, False, True], "s": ["x", "x", "y"]}', id="booleans and duplicates"),
    pytest.param('{"a": [], "s": []}', id="empty lists"),
]


@pytest.mark.parametrize("literal", LITERALS)
def test_data_frame_literal(literal: str) -> None:
    differential(f"""
        import numpy as np
        import pandas as pd
        result = pd.DataFrame({literal})
        """)


def test_data_frame_literal_nan_counts_as_missing() -> None:
    differential("""
        import numpy as np
        import pandas as pd
        df = pd.DataFrame({"a": [1.0, np.nan, None, 4.0]})
        result = int(df["a"].isna().sum())
        total = df["a"].sum()
        """, "result", "total")


# -- differential: writing ------------------------------------------------------------------

FRAME = ('df = pd.DataFrame({"kg": [1.5, np.nan, None, 2.0], "name": ["Éclair", None, "ünï", "x"],'
         ' "ok": [True, False, True, True]})')

WRITES = [
    pytest.param('df.to_csv("out.csv", index=False)', "out.csv", id="to_csv index=False"),
    pytest.param('df.to_csv("out.csv")', "out.csv", id="to_csv index=True hands over"),
    pytest.param('df.to_csv("out.csv", index=False, columns=["name", "kg"])', "out.csv",
                 id="to_csv columns"),
    pytest.param('df.to_csv("out.csv", index=False, sep=";", na_rep="NA")', "out.csv",
                 id="to_csv sep and na_rep"),
    pytest.param('df.groupby("name")["kg"].sum().to_csv("out.csv")', "out.csv",
                 id="to_csv of a groupby writes the keys as the index"),
    pytest.param('df[df["kg"] > 100].to_csv("out.csv", index=False)', "out.csv",
                 id="to_csv of an empty frame"),
    pytest.param('df.to_parquet("out.parquet")', "out.parquet", id="to_parquet"),
    pytest.param('df.to_parquet("out.parquet", index=False)', "out.parquet",
                 id="to_parquet index=False"),
    pytest.param('df.groupby("name", as_index=False)["kg"].mean().to_parquet("out.parquet")',
                 "out.parquet", id="to_parquet of a groupby"),
]


@pytest.mark.parametrize("write, output", WRITES)
def test_written_file_matches_pandas(write: str, output: str, data: Path,
                                     monkeypatch: pytest.MonkeyPatch) -> None:
    source = f"import numpy as np\nimport pandas as pd\n{FRAME}\n{write}\n"
    expected_dir, actual_dir, converted = written_by_both(source, data, monkeypatch)
    read = pd.read_csv if output.endswith(".csv") else pd.read_parquet
    options = {"sep": ";"} if "sep=" in write else {}
    expected = read(expected_dir / output, **options)
    actual = read(actual_dir / output, **options)
    assert_same_table(expected, actual)


def test_to_parquet_of_groupby_keys_is_written_by_pandas() -> None:
    # pandas marks the keys as the index in the file; its read_parquet restores them as the
    # row labels, where Polars' file would hold plain columns: pandas writes the file
    # (tests/test_files_read_and_written.py compares the files)
    result = convert("import numpy as np\nimport pandas as pd\n" + FRAME + "\n"
                     'df.groupby("name")[["kg"]].sum().to_parquet("out.parquet")\n')
    site = next(s for s in result.sites if s.key == "frame.to_parquet")
    assert "index in the file" in site.message
    assert ".set_index(\"name\")\n    .to_parquet(\"out.parquet\")" in result.converted_text


def test_to_csv_bytes_match_for_text_and_booleans(data: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    source = ('import pandas as pd\n'
              'df = pd.DataFrame({"name": ["Éclair", "ünï", "x"], "ok": [True, False, True], "n": [1, 2, 3]})\n'
              'df.to_csv("out.csv", index=False)\n')
    expected_dir, actual_dir, converted = written_by_both(source, data, monkeypatch)
    assert (actual_dir / "out.csv").read_text(encoding="utf-8") == \
        (expected_dir / "out.csv").read_text(encoding="utf-8"), converted


def test_read_then_write_round_trip(data: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    source = """
        import pandas as pd
        df = pd.read_csv("produce.csv", na_values=["-"], dtype={"zip": str})
        df.to_csv("out.csv", index=False)
        """
    expected_dir, actual_dir, converted = written_by_both(source, data, monkeypatch)
    expected = pd.read_csv(expected_dir / "out.csv", dtype={"zip": str})
    actual = pd.read_csv(actual_dir / "out.csv", dtype={"zip": str})
    assert_same_table(expected, actual)


def test_read_csv_with_data_is_told_the_schema(data: Path) -> None:
    # with --data the scan gets the types porter read, instead of inferring them over the
    # whole file a second time; the values are pandas' all the same
    result = differential("""
        import pandas as pd
        result = pd.read_csv("produce.csv")
        """, data_dir=str(data))
    assert "infer_schema_length=0" in result.converted_text  # nothing inferred
    # read as text, pandas' tokens made missing in one step, then cast by name
    assert ".is_in(PANDAS_NA_VALUES)" in result.converted_text
    assert '.cast({"' in result.converted_text


def test_read_csv_with_data_makes_every_pandas_token_missing(data: Path) -> None:
    # the scan reads text and makes pandas' tokens missing after it: every token, in text and
    # number columns, quoted or not, and a quoted empty field (missing in pandas)
    tokens = ["", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
              "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null"]
    lines = ["name,kg,crates,note"]
    for i, token in enumerate(tokens):
        quoted = f'"{token}"'
        lines.append(f"{token},{token},{i},{quoted}")
        lines.append(f"pear é {i},{i}.5,{token},plain")
    lines.append('"",-0.0,007,"a, b"')
    (data / "stock.csv").write_text("\n".join(lines) + "\n", encoding="utf-8")
    result = differential("""
        import pandas as pd
        result = pd.read_csv("stock.csv")
        """, data_dir=str(data))
    assert ".is_in(PANDAS_NA_VALUES)" in result.converted_text


def test_files_of_one_layout_read_by_one_function_share_the_schema(data: Path) -> None:
    (data / "week1.csv").write_text("crate,kg\nA,1.5\nB,\n", encoding="utf-8")
    (data / "week2.csv").write_text("crate,kg\nC,2\nÉ,3.25\n", encoding="utf-8")
    (data / "week3.csv").write_text("crate,kg,note\nD,1.25,x\n", encoding="utf-8")
    result = differential("""
        import pandas as pd
        def load(path):
            return pd.read_csv(path)
        result = pd.concat([load("week1.csv"), load("week2.csv")])
        """, data_dir=str(data))
    assert "infer_schema_length=0" in result.converted_text
    # two layouts that agree on the types of the columns they share: every column is typed
    other = differential("""
        import pandas as pd
        def load(path):
            return pd.read_csv(path)
        result = pd.concat([load("week1.csv"), load("week3.csv")])
        """, data_dir=str(data))
    # each file's own columns are cast (the typed scan ignored the ones a file lacks)
    assert 'pl.selectors.by_name("kg", require_all=False): pl.Float64' in other.converted_text
    (data / "week4.csv").write_text("crate,kg\nF,heavy\n", encoding="utf-8")
    clash = convert("""
        import pandas as pd
        def load(path):
            return pd.read_csv(path)
        result = pd.concat([load("week1.csv"), load("week4.csv")])
        """, data_dir=str(data))
    assert "infer_schema_length=None" in clash.converted_text  # kg is a number in one, text in the other


# -- na_values per column (a dict) ------------------------------------------------------------

# pandas (3.1) with na_values={column: tokens}: its own tokens (NA, n/a, an empty field, ...)
# still apply to every column and the dict adds tokens to the columns it names; a key that names
# no column is ignored; a number matches its usual spellings. "comp" is a token of "count" only:
# it must stay text in "note" and "Prüfer". Without the token "count" is text, with it numbers.
TALLIES_CSV = """\
Prüfer,count,note,day
Ana,1,comp,2024-01-31
Bé,comp,x,2024-02-29
Çé,3,,NA
NA,-1,n/a,2024-03-01
"comp",4.5,"-",
Dee,"comp",comp,2024-12-31
Ëve,,ünï,2024-02-29
"""


@pytest.fixture
def tallies(data: Path) -> Path:
    (data / "tallies.csv").write_text(TALLIES_CSV, encoding="utf-8")
    (data / "header_only.csv").write_text("Prüfer,count,note,day\n", encoding="utf-8")
    return data


PER_COLUMN = [
    pytest.param('pd.read_csv("tallies.csv", na_values={"count": "comp"})',
                 id="a token makes the column numbers"),
    pytest.param('pd.read_csv("tallies.csv", na_values={"count": ["comp"], "note": ["x", "-"]})',
                 id="lists of tokens for two columns"),
    pytest.param('pd.read_csv("tallies.csv", na_values={"note": "comp"})',
                 id="a token of one column stays text in the others"),
    pytest.param('pd.read_csv("tallies.csv", na_values={"count": ["comp", -1]})',
                 id="a number in its spellings"),
    pytest.param('pd.read_csv("tallies.csv", na_values={"no such column": "comp", "count": []})',
                 id="a key that is no column and an empty list are ignored"),
    pytest.param('pd.read_csv("tallies.csv", na_values={"Prüfer": "Ana"}, keep_default_na=True)',
                 id="a unicode header and keep_default_na=True"),
    pytest.param('pd.read_csv("tallies.csv", na_values={"count": "comp"}, usecols=["note", "count"])',
                 id="usecols"),
    pytest.param('pd.read_csv("tallies.csv", na_values={"day": "2024-02-29"}, parse_dates=["day"])',
                 id="parse_dates after the tokens"),
    pytest.param('pd.read_csv("tallies.csv", na_values={"count": "comp"}, dtype={"note": str})',
                 id="with dtype for another column"),
    pytest.param('pd.read_csv("tallies.csv", na_values={"count": "comp"})["count"].sum()',
                 id="the numbers add up"),
]


@pytest.mark.parametrize("read", PER_COLUMN)
def test_read_csv_na_values_per_column_with_data_matches_pandas(read: str, tallies: Path) -> None:
    # pandas is the reference implementation; --data tells porter the types that are left
    result = differential(f"""
        import pandas as pd
        result = {read}
        """, data_dir=str(tallies))
    assert "TODO(porter)" not in result.converted_text, result.converted_text


def test_read_csv_na_values_per_column_form(tallies: Path) -> None:
    result = convert('import pandas as pd\n'
                     'df = pd.read_csv("tallies.csv", na_values={"count": "comp", "nope": "x"})\n',
                     data_dir=str(tallies))
    text = result.converted_text
    assert 'is_in(PANDAS_NA_VALUES)' in text  # pandas' own tokens, for every column
    assert '"count": pl.Float64' not in text  # read as text: "comp" is not lost to a type first
    assert 'pl.col("count").replace(["comp"], None).cast(pl.Float64)' in text, text
    assert "nope" not in text  # a key that names no column is ignored, as pandas ignores it


@pytest.mark.parametrize("read", [
    pytest.param('pd.read_csv("tallies.csv", na_values={"count": "comp"}, dtype={"count": "float64"})',
                 id="dtype float"),
    pytest.param('pd.read_csv("tallies.csv", na_values={"count": "comp", "note": ["x"]},'
                 ' dtype={"count": str, "note": str})', id="dtype str"),
])
def test_read_csv_na_values_per_column_with_dtype_matches_pandas(read: str, tallies: Path) -> None:
    # pandas is the reference implementation: with dtype= the type is known without --data
    result = differential(f"""
        import pandas as pd
        result = {read}
        """)
    assert "TODO(porter)" not in result.converted_text, result.converted_text
    site = next(s for s in result.sites if s.key == "pd.read_csv")
    assert site.confidence <= 0.95 and "pandas ignores the key" in site.message


@pytest.mark.parametrize("read, reason", [
    pytest.param('pd.read_csv("tallies.csv", na_values={"count": "comp"})', "--data",
                 id="the type left is known only with --data"),
    pytest.param('pd.read_csv("tallies.csv", na_values={1: "comp"})', "position",
                 id="a number key is a column position"),
    pytest.param('pd.read_csv("tallies.csv", na_values={"count": "comp"}, keep_default_na=False)',
                 "keep_default_na", id="keep_default_na=False with a dict"),
])
def test_read_csv_na_values_per_column_todo(read: str, reason: str, tallies: Path) -> None:
    text = check_todo(f"import pandas as pd\ndf = {read}\n", "pd.read_csv")
    assert reason in text, text


# A sentinel written several ways. pandas (3.1) matches a column it parses as floats with the
# number of each na_values entry, text or not ("-999" also empties -999.0 and -9.99e2); a column
# it parses as integers ("n": ints and one blank) and a text column ("t") only with the texts
# "-999" and "-999.0" (so "-0999" and "-999.00" stay there).
SENTINEL_CSV = """\
plot,depth,n,t
P1,1.5,1,abc
P2,-999,-0999,-999.0
P3,-999.0,3,-999
P4,2.5,4,-999.00
P5,-9.99e2,,x
"""

SENTINELS = [
    pytest.param('["-999"]', id="a list of text"),
    pytest.param('"-999"', id="one text"),
    pytest.param('["-999.0"]', id="text with a fraction"),
    pytest.param('[-999]', id="a number"),
    pytest.param('["-999", "?"]', id="with a token that is no number"),
    pytest.param('{"depth": ["-999"]}', id="per column"),
    pytest.param('{"depth": "-999.0", "n": "-999", "t": "-999"}', id="per column, every column"),
]


@pytest.mark.parametrize("na_values", SENTINELS)
def test_read_csv_na_values_text_number_matches_every_spelling_with_data(
        na_values: str, data: Path) -> None:
    # pandas is the reference implementation
    (data / "sentinel.csv").write_text(SENTINEL_CSV, encoding="utf-8")
    differential(f"""
        import pandas as pd
        result = pd.read_csv("sentinel.csv", na_values={na_values})
        mean = result["depth"].mean()
        """, "result", "mean", data_dir=str(data))


@pytest.mark.parametrize("na_values", [p for p in SENTINELS if "{" not in p.values[0]])
def test_read_csv_na_values_text_number_matches_every_spelling_without_data(
        na_values: str, data: Path) -> None:
    # pandas is the reference implementation; without --data the float columns are chosen
    # after the scan ("n" is Int64 there, as the read's confidence says)
    (data / "sentinel.csv").write_text(SENTINEL_CSV, encoding="utf-8")
    differential(f"""
        import pandas as pd
        df = pd.read_csv("sentinel.csv", na_values={na_values})
        result = df[["plot", "depth", "t"]]
        mean = df["depth"].mean()
        """, "result", "mean")


# pandas (3.1) reads inf, -inf, +inf, Infinity in any case as float64 infinities (not " inf"
# or "1.#INF"); Polars infers such a column as text. "flag" keeps the typed scan (booleans),
# "padded" mixes an infinity with a number written with a plus sign and spaces.
INFINITIES_CSV = """\
pool,ratio,signed,padded,note,flag
A,1.5,inf,+1,inf ,True
B,Infinity,-Inf, 2,x,False
C,2,+INFINITY,-infinity,1.#INF,True
D,,nan,3,y,True
"""


@pytest.mark.parametrize("layout", [
    pytest.param("", id="every column"),
    pytest.param(', usecols=["pool", "ratio", "signed", "padded", "note", "flag"]', id="usecols"),
])
def test_read_csv_infinities_are_floats_with_data(layout: str, data: Path) -> None:
    # pandas is the reference implementation
    (data / "inf.csv").write_text(INFINITIES_CSV, encoding="utf-8")
    differential(f"""
        import pandas as pd
        result = pd.read_csv("inf.csv"{layout})
        result["r2"] = result["ratio"] * 2 + result["signed"] + result["padded"]
        top = result["ratio"].max()
        total = result["padded"].sum()
        """, "result", "top", "total", data_dir=str(data))


def test_read_csv_header_only_sample_types_nothing(data: Path) -> None:
    # pandas is the reference implementation. The --data sample is an empty export (a header
    # only: pandas reads object columns, Polars text); the script later reads a file with rows,
    # whose numbers must not be read as text because the sample had none
    sample = data / "sample"
    sample.mkdir()
    (sample / "day.csv").write_text("site,v\n", encoding="utf-8")
    (data / "day.csv").write_text("site,v\nA,1.5\nB,2\n", encoding="utf-8")
    result = differential("""
        import pandas as pd
        df = pd.read_csv("day.csv")
        df["v2"] = df["v"] * 2
        result = df
        total = df["v"].sum()
        """, "result", "total", data_dir=str(sample))
    site = next(s for s in result.sites if s.key == "pd.read_csv")
    assert site.confidence <= 0.7 and "no rows" in site.message, site.message


def test_read_csv_na_values_bool_left_is_a_todo(tallies: Path) -> None:
    # Polars cannot cast text to booleans: what is left of a column of True/False stays pandas
    (tallies / "flags.csv").write_text("ok,n\nTrue,1\n?,2\nFalse,3\n", encoding="utf-8")
    source = 'import pandas as pd\ndf = pd.read_csv("flags.csv", na_values={"ok": "?"})\n'
    text = convert(source, data_dir=str(tallies)).converted_text
    assert "# TODO(porter): pd.read_csv" in text and "bool" in text, text


def test_pandas_keeps_default_tokens_with_a_dict(tallies: Path) -> None:
    # the pandas behaviour the rule relies on, checked on pandas itself (the reference)
    df = pd.read_csv("tallies.csv", na_values={"count": "comp", "nope": "x"})
    assert df["note"].isna().tolist()[2:4] == [True, True]  # "" and "n/a": pandas' own tokens
    assert df["note"].tolist()[0] == "comp" and df["Prüfer"].isna().tolist()[3]
    assert str(df["count"].dtype) == "float64"
    strict = pd.read_csv("tallies.csv", na_values={"count": "comp"}, keep_default_na=False)
    assert strict["note"].tolist()[2:4] == ["", "n/a"]  # no default token anywhere
    assert str(strict["count"].dtype) == "str"  # its empty field is "" (text), not missing


def test_read_csv_skips_blank_lines_as_pandas_does(data: Path) -> None:
    # pandas skips blank lines (skip_blank_lines=True); Polars reads each as a row of missing
    # values. With --data porter sees them and drops those rows.
    (data / "gaps.csv").write_text("crate,kg,note\nA,1.5,é\n\nB,,x\n\nC,2.0,\n\n",
                                   encoding="utf-8")
    result = differential("""
        import pandas as pd
        result = pd.read_csv("gaps.csv")
        """, data_dir=str(data))
    assert "all_horizontal" in result.converted_text


def test_read_csv_with_blank_lines_and_empty_rows_stays_pandas(data: Path) -> None:
    # a row of empty fields is a row of missing values in pandas too: the two cannot be told
    # apart after Polars' scan
    (data / "holes.csv").write_text("crate,kg\nA,1.5\n\n,\nB,2\n", encoding="utf-8")
    (data / "spaces.csv").write_text("crate,kg\nA,1.5\n\n   \nB,2\n", encoding="utf-8")
    for name in ("holes.csv", "spaces.csv"):
        result = differential(f"""
            import pandas as pd
            result = pd.read_csv("{name}")
            """, data_dir=str(data))
        assert "# TODO(porter): pd.read_csv" in result.converted_text


def test_read_csv_without_data_names_blank_lines_in_its_reason() -> None:
    result = convert('import pandas as pd\ndf = pd.read_csv("produce.csv")\n')
    site = next(s for s in result.sites if s.key == "pd.read_csv")
    assert "blank line" in site.message


def test_an_integer_column_with_missing_values_is_read_as_pandas_reads_it(data: Path) -> None:
    # pandas reads whole numbers beside a blank as floats: text made from them is "33.0", and
    # to_csv writes 33.0. With --data porter sees the blank and reads the column as Float64.
    (data / "fees.csv").write_text("k,fee,n\na,33,1\nb,,2\nc,-5,3\n", encoding="utf-8")
    source = """
        import pandas as pd
        df = pd.read_csv("fees.csv")
        df["label"] = "EUR " + df["fee"].astype(str)
        df.to_csv("out.csv", index=False)
        result = df
        """
    result = differential(source, data_dir=str(data))
    assert '"fee": pl.Float64' in result.converted_text and '"n": pl.Int64' in result.converted_text
    import textwrap
    from support import run
    run(textwrap.dedent(source))
    expected = (data / "out.csv").read_bytes()
    run(result.converted_text)
    assert (data / "out.csv").read_bytes() == expected


FLAGS_CSV = "shop,ok,kg,day\nÉclair,True,1.5,2024-01-05\nünï,False,,2024-01-06\nÉclair,False,2.0,2024-01-07\n"

AGGREGATE_WRITES = [
    pytest.param('df.groupby("shop", as_index=False).agg(n=("ok", "sum"), kg=("kg", "mean"))',
                 False, id="sums and means of known columns: no text conversion"),
    pytest.param('df.groupby("shop")["ok"].first().reset_index()', True,
                 id="the first of a boolean column is still boolean"),
    pytest.param('df.groupby("shop").size().reset_index(name="lines")', False, id="sizes"),
    pytest.param('df.groupby("shop", as_index=False)["day"].max()', False,
                 id="the latest text date"),
]


@pytest.mark.parametrize("aggregate, booleans", AGGREGATE_WRITES)
def test_to_csv_of_aggregates_with_known_types(aggregate: str, booleans: bool, data: Path,
                                               monkeypatch: pytest.MonkeyPatch) -> None:
    """With --data the types of aggregates are known: booleans are converted to pandas' text
    only where an aggregate is still boolean, and the bytes match pandas'."""
    (data / "flags.csv").write_text(FLAGS_CSV, encoding="utf-8")
    source = ('import pandas as pd\ndf = pd.read_csv("flags.csv")\n'
              f'out = {aggregate}\nout.to_csv("out.csv", index=False)\n')
    converted = convert(source, data_dir=str(data)).converted_text
    assert ("pl.selectors.boolean()" in converted) is booleans, converted
    for side, text in (("pandas", source), ("polars", converted)):
        (data / side).mkdir()
        (data / side / "flags.csv").write_text(FLAGS_CSV, encoding="utf-8")
        monkeypatch.chdir(data / side)
        run(text)
    assert (data / "polars" / "out.csv").read_text(encoding="utf-8") == \
        (data / "pandas" / "out.csv").read_text(encoding="utf-8"), converted


def test_a_file_missing_from_the_data_folder_is_named(data: Path) -> None:
    # --data is the folder the script runs from: a path it does not hold is said so
    result = convert('import pandas as pd\ndf = pd.read_csv("data/produce.csv")\n', data_dir=str(data))
    messages = [s.message for s in result.sites if s.key == "pd.read_csv"]
    assert any("data/produce.csv is not under the --data folder" in m for m in messages), messages
    found = convert('import pandas as pd\ndf = pd.read_csv("produce.csv")\n', data_dir=str(data))
    assert not any("--data folder" in s.message for s in found.sites)


def test_true_is_not_read_as_a_row_count(data: Path) -> None:
    # nrows=True: pandas raises; porter reads whole numbers only, so it is a TODO
    result = convert('import pandas as pd\ndf = pd.read_csv("produce.csv", nrows=True)\n')
    assert "n_rows=True" not in result.converted_text
    assert any(s.key == "pd.read_csv" and s.status == "todo" for s in result.sites)


# -- numbers pandas reads where Polars reads text (--data) -----------------------------------

PADDED_CSV = "lock, boats, toll,change,gap\nA, 5, 2.50,+3,\nB, 12, 3 ,-2, 7\nC,\t9, 10.25,+12,\n"


def test_numbers_with_spaces_or_a_plus_sign_are_numbers_as_in_pandas(data: Path) -> None:
    # pandas' parser reads " 5", "3 " and "+3" as numbers; Polars reads the column as text, so
    # max() and sort_values() would compare text (" 9" > " 12") and arithmetic would fail
    (data / "locks.csv").write_text(PADDED_CSV, encoding="utf-8")
    result = differential("""
        import pandas as pd
        df = pd.read_csv("locks.csv")
        busiest = df.sort_values(" boats", ascending=False)
        top = df[" toll"].max()
        rise = df["change"].max()
        df["double"] = df["change"] * 2 + df["gap"]
        result = df
        """, "busiest", "top", "rise", "result", data_dir=str(data))
    assert 'str.strip_chars(" \\t").cast(pl.Int64)' in result.converted_text
    assert 'pl.col("gap").str.strip_chars(" \\t").cast(pl.Float64)' in result.converted_text


def test_text_that_is_not_a_number_after_stripping_stays_text(data: Path) -> None:
    (data / "codes.csv").write_text("k,code,n\na, 5,1\nb, inf,2\nc, x1,3\n", encoding="utf-8")
    result = differential("""
        import pandas as pd
        result = pd.read_csv("codes.csv")
        """, data_dir=str(data))
    assert "strip_chars" not in result.converted_text


def test_a_column_with_no_values_is_float_as_in_pandas(data: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    # pandas reads a column holding only missing values as float64: its sum is 0.0
    (data / "refunds.csv").write_text("k,empty,na_only,mixed\na,,NA,1\nb,,n/a,x\n", encoding="utf-8")
    result = differential("""
        import pandas as pd
        df = pd.read_csv("refunds.csv")
        df["n2"] = df["na_only"].sum()
        big = df[df["empty"] > 0]
        result = df
        """, "result", "big", data_dir=str(data))
    assert '"empty": pl.Float64' in result.converted_text


# -- to_csv: header names, one column -------------------------------------------------------

HEADER_WRITES = [
    pytest.param('df.to_csv("out.csv", index=False, columns=["name", "kg"], header=["who", "mass"])',
                 id="header names the selected columns"),
    pytest.param('df.to_csv("out.csv", index=False, header=["a", "b", "c"])', id="header names every column"),
    pytest.param('df.to_csv("out.csv", index=False, header=["kg", "name", "ok"])',
                 id="header swaps two names"),
    pytest.param('df.groupby("name")["kg"].sum().to_csv("out.csv", header=["total"])',
                 id="header names the values, not the index"),
    pytest.param('df[["kg"]].to_csv("out.csv", index=False)', id="one column with missing values"),
    pytest.param('df[["name"]].to_csv("out.csv", index=False, header=False)',
                 id="one text column with missing values, no header"),
    pytest.param('df["kg"].to_csv("out.csv", index=False)', id="a Series with missing values"),
]


@pytest.mark.parametrize("write", HEADER_WRITES)
def test_to_csv_bytes_match_for_header_names_and_one_column(write: str, data: Path,
                                                            monkeypatch: pytest.MonkeyPatch) -> None:
    # header=[...] renames the written columns; a missing value alone on its line is written
    # "" by pandas (an empty line would be skipped when the file is read back)
    frame = ('df = pd.DataFrame({"kg": [1.5, np.nan, None, 2.0], "name": ["Éclair", None, "ünï", "x"],'
             ' "ok": [True, False, True, True]})')
    if "header=False" in write:  # alone on its line, an empty text is written "" by both
        frame = frame.replace('"ünï"', '""')
    source = f"import numpy as np\nimport pandas as pd\n{frame}\n{write}\n"
    expected_dir, actual_dir, converted = written_by_both(source, data, monkeypatch)
    assert (actual_dir / "out.csv").read_text(encoding="utf-8") == \
        (expected_dir / "out.csv").read_text(encoding="utf-8"), converted


@pytest.mark.parametrize("write", [
    pytest.param('df.to_csv("out.csv", index=False, header=["a"])', id="too few names"),
    pytest.param('df.to_csv("out.csv", index=False, header=["a", "a", "b"])', id="a repeated name"),
])
def test_to_csv_header_names_todo(write: str) -> None:
    result = convert(f"import pandas as pd\n{FRAME.replace('np.nan', 'None')}\n{write}\n")
    assert any(s.key == "frame.to_csv" and s.status == "todo" for s in result.sites), result.sites
    assert "sink_csv" not in result.converted_text


# -- to_csv: integer columns holding a missing value ------------------------------------------

SHEARING_CSV = "d,shed,v\n2024-01-31,a,1\n,a,2\n2025-12-31,b,3\n"

INT_WRITES = [
    pytest.param('df = pd.read_csv("shearing.csv")\n'
                 'df["d"] = pd.to_datetime(df["d"], format="%Y-%m-%d")\n'
                 'df["year"] = df["d"].dt.year\ndf["month"] = df["d"].dt.month\n'
                 'df.to_csv("out.csv", index=False)',
                 id="a date part of a column with a missing date is float in pandas: 2024.0"),
    pytest.param('df = pd.read_csv("shearing.csv")\nfeb = pd.DataFrame({"shed": ["c"]})\n'
                 'df = pd.concat([df, feb], ignore_index=True)\ndf.to_csv("out.csv", index=False)',
                 id="concat of a frame without the column"),
    pytest.param('df = pd.read_csv("shearing.csv")\ndf = df[df["v"] > 5]\n'
                 'df.to_csv("out.csv", index=False)', id="an empty frame"),
    pytest.param('df = pd.read_csv("shearing.csv")\ndf["w"] = df["v"] * 2\n'
                 'df[["w"]].to_csv("out.csv", index=False)', id="integers without a missing value"),
]


@pytest.mark.parametrize("script", INT_WRITES)
@pytest.mark.parametrize("with_data", [False, True], ids=["", "with --data"])
def test_to_csv_writes_integers_with_a_missing_value_as_pandas_floats(
        script: str, with_data: bool, data: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    (data / "shearing.csv").write_text(SHEARING_CSV, encoding="utf-8")
    source = f"import pandas as pd\n{script}\n"
    converted = convert(source, **({"data_dir": str(data)} if with_data else {})).converted_text
    for side, text in (("pandas", source), ("polars", converted)):
        (data / side).mkdir()
        (data / side / "shearing.csv").write_text(SHEARING_CSV, encoding="utf-8")
        monkeypatch.chdir(data / side)
        run(text)
    assert (data / "polars" / "out.csv").read_text(encoding="utf-8") == \
        (data / "pandas" / "out.csv").read_text(encoding="utf-8"), converted


def test_to_csv_leaves_integers_alone_where_the_script_makes_nullable_ones(
        data: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    # astype("Int64") keeps whole numbers beside a missing value: pandas writes 7, not 7.0.
    # porter does not tell such a column from a plain one, so in a script that makes nullable
    # integers it writes integers as they are and says so
    source = ('import pandas as pd\nimport numpy as np\n'
              'df = pd.DataFrame({"n": [7.0, np.nan, 12.0], "g": ["a", "b", "a"]})\n'
              'df["n"] = df["n"].astype("Int64")\ndf.to_csv("out.csv", index=False)\n')
    result = convert(source)
    assert "PANDAS_CSV_INTS" not in result.converted_text
    site = next(s for s in result.sites if s.key == "frame.to_csv")
    assert "nullable" in site.message and site.confidence <= 0.9
    for side, text in (("pandas", source), ("polars", result.converted_text)):
        (data / side).mkdir()
        monkeypatch.chdir(data / side)
        run(text)
    assert (data / "polars" / "out.csv").read_text(encoding="utf-8") == \
        (data / "pandas" / "out.csv").read_text(encoding="utf-8"), result.converted_text


def test_to_csv_of_two_level_columns_writes_pandas_header(data: Path,
                                                         monkeypatch: pytest.MonkeyPatch) -> None:
    # pandas writes one header line per level (and one for the index name); porter's names
    # are flat (v_sum): it had written k,v_sum,v_mean without a word
    source = ('import pandas as pd\n'
              'df = pd.DataFrame({"k": ["b", "a", "b"], "v": [1.0, None, 3.5], "w": [5, 6, 7]})\n'
              's = df.groupby("k").agg({"v": ["sum", "mean"], "w": "max"})\n'
              's.to_csv("s.csv")\n'
              's.to_csv("plain.csv", index=False)\n')
    expected_dir, actual_dir, converted = written_by_both(source, data, monkeypatch)
    for name in ("s.csv", "plain.csv"):
        assert (actual_dir / name).read_text(encoding="utf-8") == \
            (expected_dir / name).read_text(encoding="utf-8"), converted
    assert "MultiIndex.from_tuples" in converted


@pytest.mark.parametrize("gaps", [
    # whole days (negative too): pandas writes "2 days", "-1 days"
    '["2024-03-01", "2024-02-28", "2024-03-03"], ["2024-03-03", "2024-03-01", None]',
    # hours and minutes: "0 days 06:30:00", a negative gap "-1 days +23:00:00"
    '["2024-03-01 06:30", "2024-03-01 00:00", None], ["2024-03-01 00:00", "2024-03-01 01:00", "2024-03-02 00:00"]',
    # a second's fraction in one value: every value gets microseconds
    '["2024-03-01 00:00:01.500000", "2024-03-02 00:00:00.000000", "2024-03-01 00:00:00.000000"], '
    '["2024-03-01 00:00:00.000000", "2024-03-01 00:00:00.000000", "2024-03-01 00:00:00.000001"]',
])
def test_a_column_of_date_differences_is_written_as_pandas_writes_it(
        gaps: str, data: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    # Polars cannot write a duration column to CSV at all; pandas writes each value as text
    # decided from the whole column
    source = f"""
        import pandas as pd
        ends, starts = {gaps}
        df = pd.DataFrame({{"end": pd.to_datetime(ends), "start": pd.to_datetime(starts)}})
        df["gap"] = df["end"] - df["start"]
        df["days"] = df["gap"].dt.days
        df.to_csv("gaps.csv", index=False)
        """
    expected_dir, actual_dir, converted = written_by_both(source, data, monkeypatch)
    assert (actual_dir / "gaps.csv").read_text() == (expected_dir / "gaps.csv").read_text(), converted


# -- to_csv: options, encodings, compression, text pandas' way --------------------------------

@pytest.mark.parametrize("write", [
    pytest.param('df.to_csv("out.csv", sep=";", columns=["name", "kg"])', id="sep and columns"),
    pytest.param('df.to_csv("out.csv", header=False)', id="no header"),
    pytest.param('df.to_csv("out.csv", na_rep="-")', id="na_rep"),
    pytest.param('df.to_csv("out.csv", header=["a", "b", "c"], encoding="utf-8-sig")',
                 id="header names and a byte-order mark"),
])
def test_to_csv_with_the_index_keeps_every_option(write: str, data: Path,
                                                  monkeypatch: pytest.MonkeyPatch) -> None:
    # the default index=True hands the write to pandas: it had forgotten every other option
    source = f"import numpy as np\nimport pandas as pd\n{FRAME}\n{write}\n"
    expected_dir, actual_dir, converted = written_by_both(source, data, monkeypatch)
    assert (actual_dir / "out.csv").read_bytes() == (expected_dir / "out.csv").read_bytes(), converted


@pytest.mark.parametrize("make", [
    'df["d"] = df["t"] - pd.Timestamp("2024-01-01")',
    'df["d"] = df["u"] - df["t"]',
])
@pytest.mark.parametrize("with_data", [False, True], ids=["", "with --data"])
def test_a_duration_made_without_a_hint_is_written_as_pandas_writes_it(
        make: str, with_data: bool, data: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    # a difference of dates in a script that names no timedelta: Polars' writer had refused it
    (data / "t.csv").write_text("id,t,u\n1,2024-01-04 10:00,2024-01-04 11:30\n2,,2024-01-05 00:00\n"
                                "3,2024-03-31 23:00,2024-03-31 22:00\n", encoding="utf-8")
    source = f'import pandas as pd\ndf = pd.read_csv("t.csv", parse_dates=["t", "u"])\n{make}\n' \
             'df.to_csv("out.csv", index=False)\n'
    converted = convert(source, **({"data_dir": str(data)} if with_data else {})).converted_text
    for side, text in (("pandas", source), ("polars", converted)):
        (data / side).mkdir()
        (data / side / "t.csv").write_text((data / "t.csv").read_text(), encoding="utf-8")
        monkeypatch.chdir(data / side)
        run(text)
    assert (data / "polars" / "out.csv").read_text(encoding="utf-8") == \
        (data / "pandas" / "out.csv").read_text(encoding="utf-8"), converted


def test_to_csv_utf8_sig_writes_the_byte_order_mark(data: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    source = f'import numpy as np\nimport pandas as pd\n{FRAME}\n' \
             'df.to_csv("out.csv", index=False, encoding="utf-8-sig")\n' \
             'df.to_csv("plain.csv", index=False, encoding="UTF_8")\n'
    expected_dir, actual_dir, converted = written_by_both(source, data, monkeypatch)
    for name in ("out.csv", "plain.csv"):
        assert (actual_dir / name).read_bytes() == (expected_dir / name).read_bytes(), converted


def test_to_csv_in_another_encoding_is_a_todo() -> None:
    result = convert(f'import numpy as np\nimport pandas as pd\n{FRAME}\n'
                     'df.to_csv("out.csv", index=False, encoding="latin-1")\n')
    assert any(s.key == "frame.to_csv" and s.status == "todo" for s in result.sites), result.sites
    assert "sink_csv" not in result.converted_text


COMPRESSED_WRITES = [
    pytest.param('df.to_csv("out.tsv.gz", sep="\\t", index=False)', "out.tsv.gz", "gzip",
                 id="gzip inferred from the name"),
    pytest.param('df.to_csv("out.csv.GZ", index=False)', "out.csv.GZ", "gzip",
                 id="the name's case does not matter to pandas"),
    pytest.param('df.to_csv("out.csv", index=False, compression="gzip")', "out.csv", "gzip",
                 id="gzip given for a plain name"),
    pytest.param('df.to_csv("out.csv.gz", index=False, compression=None)', "out.csv.gz", None,
                 id="no compression under a .gz name"),
    pytest.param('df.to_csv("out.csv.bz2", index=False, compression=None)', "out.csv.bz2", None,
                 id="no compression under a .bz2 name"),
    pytest.param('df.to_csv("out.csv.gz")', "out.csv.gz", "gzip", id="with the index, by pandas"),
]


@pytest.mark.parametrize("write, output, method", COMPRESSED_WRITES)
def test_to_csv_compresses_as_pandas_does(write: str, output: str, method: str | None, data: Path,
                                          monkeypatch: pytest.MonkeyPatch) -> None:
    # Polars' sink refused a name ending .gz without compression=, and wrote any other name
    # uncompressed; the gzip headers differ (time, name), the text they hold does not
    import gzip
    source = f"import numpy as np\nimport pandas as pd\n{FRAME}\n{write}\n"
    expected_dir, actual_dir, converted = written_by_both(source, data, monkeypatch)
    expected, actual = (expected_dir / output).read_bytes(), (actual_dir / output).read_bytes()
    if method == "gzip":
        assert actual[:2] == b"\x1f\x8b", converted
        expected, actual = gzip.decompress(expected), gzip.decompress(actual)
    assert actual == expected, converted


@pytest.mark.parametrize("write", [
    'df.to_csv("out.csv.bz2", index=False)',
    'df.to_csv("out.tar.gz", index=False)',
    'df.to_csv("out.csv", index=False, compression="xz")',
    'df.to_csv("out.csv", index=False, compression={"method": "gzip", "mtime": 1})',
])
def test_to_csv_compression_polars_does_not_write_is_a_todo(write: str, data: Path,
                                                            monkeypatch: pytest.MonkeyPatch) -> None:
    source = f"import numpy as np\nimport pandas as pd\n{FRAME}\n{write}\n"
    result = convert(source)
    assert any(s.key == "frame.to_csv" and s.status == "todo" for s in result.sites), result.sites
    assert "sink_csv" not in result.converted_text
    expected_dir, actual_dir, converted = written_by_both(source, data, monkeypatch)
    assert {p.name for p in actual_dir.iterdir()} == {p.name for p in expected_dir.iterdir()}


@pytest.mark.parametrize("write", [
    'df.to_csv("out.csv", index=False)',
    'df[["name", "kind"]].to_csv("out.csv", index=False)',
    'df[["name"]].to_csv("out.csv", index=False)',
    'df.groupby("kind")["name"].first().to_csv("out.csv")',
])
@pytest.mark.parametrize("with_data", [False, True], ids=["", "with --data"])
def test_to_csv_writes_an_empty_text_as_an_empty_field(write: str, with_data: bool, data: Path,
                                                      monkeypatch: pytest.MonkeyPatch) -> None:
    # pandas writes "" as an empty field (as a missing value); Polars had quoted it
    (data / "names.csv").write_text("id,name,kind\n1,ab,x\n2,,y\n3, c,x\n4,ab,\n", encoding="utf-8")
    source = ('import pandas as pd\ndf = pd.read_csv("names.csv")\n'
              'df["name"] = df["name"].fillna("").str.strip().str.replace("ab", "", regex=False)\n'
              'df["kind"] = df["kind"].fillna("").astype("category")\n'
              f'{write}\n')
    converted = convert(source, **({"data_dir": str(data)} if with_data else {})).converted_text
    for side, text in (("pandas", source), ("polars", converted)):
        (data / side).mkdir()
        (data / side / "names.csv").write_text((data / "names.csv").read_text(), encoding="utf-8")
        monkeypatch.chdir(data / side)
        run(text)
    assert (data / "polars" / "out.csv").read_text(encoding="utf-8") == \
        (data / "pandas" / "out.csv").read_text(encoding="utf-8"), converted


def test_to_csv_with_na_rep_says_an_empty_text_is_quoted() -> None:
    result = convert('import pandas as pd\ndf = pd.DataFrame({"a": ["x", ""], "n": [1, 2]})\n'
                     'df.to_csv("out.csv", index=False, na_rep="-")\n')
    site = next(s for s in result.sites if s.key == "frame.to_csv")
    assert site.confidence <= 0.9 and "empty text" in site.message, site


@pytest.mark.parametrize("make", [
    'b = df.groupby("g")["n"].apply(list).reset_index()',
    'b = df.groupby("g")["v"].apply(list).reset_index()',
    'b = df.groupby("g").agg(ns=("n", list), vs=("v", list), oks=("ok", list)).reset_index()',
])
@pytest.mark.parametrize("with_data", [False, True], ids=["", "with --data"])
def test_to_csv_writes_lists_of_numbers_as_pandas_writes_them(
        make: str, with_data: bool, data: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    # lists back from pandas: Polars' CSV writer refused them, pandas writes str(list), floats
    # by Python's repr (1e-05, nan)
    (data / "l.csv").write_text("g,n,v,ok\na,1,1.5,True\na,2,,False\nb,3,0.00001,True\n"
                                "b,4,1e16,True\n", encoding="utf-8")
    source = f'import pandas as pd\ndf = pd.read_csv("l.csv")\n{make}\nb.to_csv("out.csv", index=False)\n'
    converted = convert(source, **({"data_dir": str(data)} if with_data else {})).converted_text
    for side, text in (("pandas", source), ("polars", converted)):
        (data / side).mkdir()
        (data / side / "l.csv").write_text((data / "l.csv").read_text(), encoding="utf-8")
        monkeypatch.chdir(data / side)
        run(text)
    assert (data / "polars" / "out.csv").read_text(encoding="utf-8") == \
        (data / "pandas" / "out.csv").read_text(encoding="utf-8"), converted


def test_to_csv_of_lists_where_the_script_makes_arrays_is_pandas_own() -> None:
    # groupby unique gives numpy arrays, which pandas writes [1 2]: a frame pandas made with
    # arrays in its cells stays pandas (7bec65f), so pandas writes the file itself
    result = convert('import pandas as pd\ndf = pd.DataFrame({"g": ["a", "a"], "n": [1, 2]})\n'
                     'b = df.groupby("g")["n"].unique().reset_index()\n'
                     'c = df.groupby("g")["n"].apply(list).reset_index()\n'
                     'b.to_csv("b.csv", index=False)\n')
    assert not [s for s in result.sites if s.key == "frame.to_csv"]
    assert 'b.to_csv("b.csv", index=False)' in result.converted_text


def test_to_csv_of_lists_from_a_function_returning_arrays_says_so() -> None:
    result = convert('import pandas as pd\ndf = pd.DataFrame({"g": ["a", "a"], "n": [1, 2]})\n'
                     'def kinds(s):\n    return s.unique()\n'
                     'c = df.groupby("g")["n"].apply(list).reset_index()\n'
                     'b = df.groupby("g")["n"].apply(kinds).reset_index()\n'
                     'b.to_csv("b.csv", index=False)\n')
    site = next(s for s in result.sites if s.key == "frame.to_csv")
    assert site.confidence <= 0.9 and "[1 2]" in site.message, site


@pytest.mark.parametrize("values", [
    '["2024-01-05T10:00:00+01:00", "2024-01-05T23:30:00-05:00", None]',
    '["2024-01-05T00:00:00+00:00", "2024-07-06T00:00:00+00:00", None]',
    '["2024-01-05T10:00:00.5+01:00", "2024-07-06T00:00:00+00:00", None]',
    '["2024-01-05T10:00:00.123456+01:00", "2024-07-06T00:00:00+00:00", None]',
])
def test_to_csv_writes_time_zones_as_pandas_writes_them(values: str, data: Path,
                                                       monkeypatch: pytest.MonkeyPatch) -> None:
    # pandas writes the offset (+00:00) and always the time of a datetime with a time zone;
    # PANDAS_CSV_DATETIMES had dropped the offset
    source = f"""
        import pandas as pd
        c = pd.DataFrame({{"id": [1, 2, 3], "e": {values}}})
        c["e"] = pd.to_datetime(c["e"], utc=True, format="ISO8601")
        c["o"] = c["e"].dt.tz_convert("Europe/Oslo")
        c["naive"] = c["e"].dt.tz_localize(None)
        c.to_csv("out.csv", index=False)
        """
    expected_dir, actual_dir, converted = written_by_both(source, data, monkeypatch)
    assert (actual_dir / "out.csv").read_text() == (expected_dir / "out.csv").read_text(), converted


def test_to_csv_of_categories_without_an_empty_one(data: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    # a category column becomes an Enum in Polars; one without "" among its categories had
    # refused the replace of empty texts
    source = """
        import pandas as pd
        df = pd.DataFrame({"k": ["b", "a", None, "b"], "n": [1, 2, 3, 40]})
        df["k"] = df["k"].astype("category")
        df["size"] = pd.cut(df["n"], bins=[0, 2, 10], labels=["small", "big"])
        other = pd.DataFrame({"n": [1, 5]})
        both = df.merge(other, on="n", how="outer", indicator=True)
        df.to_csv("out.csv", index=False)
        both.to_csv("both.csv", index=False)
        """
    expected_dir, actual_dir, converted = written_by_both(source, data, monkeypatch)
    assert "pl.Enum" in converted
    for name in ("out.csv", "both.csv"):
        assert (actual_dir / name).read_text() == (expected_dir / name).read_text(), converted


def test_read_csv_one_field_more_than_the_header_is_a_todo(data: Path) -> None:
    # pandas reads the first field as the row labels (the columns shift by one); Polars'
    # reader fails on the extra field, so the read stays on pandas under a TODO, and runs
    (data / "trailing.csv").write_text("tank,temp\nT1,20.5,\nT2,21,\n", encoding="utf-8")
    source = 'import pandas as pd\ndf = pd.read_csv("trailing.csv")\nresult = df\n'
    expected = pd.read_csv("trailing.csv")
    assert expected["tank"].tolist() == [20.5, 21.0]  # the behaviour the TODO names
    text = convert(source, data_dir=str(data)).converted_text
    assert "# TODO(porter): pd.read_csv" in text and "one field more" in text, text
    assert_same_table(expected, run(text)["result"])


def test_read_csv_integers_beyond_int64_are_uint64_with_data(data: Path) -> None:
    # pandas is the reference implementation: every value from 0 to 2**64 - 1 (none missing)
    # is uint64 in pandas; Polars infers Int128, which does not go to numpy (tolist failed)
    (data / "tags.csv").write_text("id,tag\n1,12345678901234567890\n2,5\n3,9223372036854775808\n",
                                   encoding="utf-8")
    differential("""
        import pandas as pd
        df = pd.read_csv("tags.csv")
        result = df["tag"].tolist()
        kinds = [str(t) for t in df.dtypes.tolist()]
        top = df["tag"].max()
        """, "result", "kinds", "top", data_dir=str(data))


def test_read_csv_integers_beyond_int64_pandas_reads_as_text_stay_pandas(data: Path) -> None:
    # a negative value beside one past int64: pandas reads text, Polars Int128, whose max()
    # did not go to numpy (the converted script failed): the read stays pandas'
    (data / "tags.csv").write_text("id,tag\n1,12345678901234567890\n2,-5\n3,123\n",
                                   encoding="utf-8")
    assert str(pd.read_csv("tags.csv")["tag"].dtype) == "str"  # the behaviour named
    result = differential("""
        import pandas as pd
        df = pd.read_csv("tags.csv")
        top = df["tag"].max()
        result = df["tag"].tolist()
        """, "top", "result", data_dir=str(data))
    assert any(s.key == "pd.read_csv" and s.status == "todo" and "beyond int64" in s.message
               for s in result.sites), result.converted_text


def test_read_csv_integers_beyond_int64_with_a_blank_stay_pandas(data: Path) -> None:
    # pandas is the reference: a negative value, one past int64 and a blank make a text column
    # (the blank an empty text, not missing); the read had been typed Float64 (precision lost)
    (data / "serials.csv").write_text(
        "serial,x\n-5,1\n18446744073709551615,2\n,3\n9007199254740993,4\n", encoding="utf-8")
    result = differential("""
        import pandas as pd
        df = pd.read_csv("serials.csv")
        top = df["serial"].max()
        gaps = int(df["serial"].isna().sum())
        result = df["serial"].tolist()
        """, "top", "gaps", "result", data_dir=str(data))
    assert any(s.key == "pd.read_csv" and s.status == "todo" for s in result.sites), \
        result.converted_text


def test_to_csv_writes_small_floats_as_python_does(data: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    # pandas is the reference implementation: it writes Python's repr (5e-05, 1.5e-07, 1e-09),
    # where Polars' writer gives 0.00005, 1.5e-7, 1e-9; the file text is compared byte for byte
    pandas_side, polars_side, converted = written_by_both("""
        import numpy as np
        import pandas as pd
        df = pd.DataFrame({"site": ["A", "B", "C", "D", "E", "F"],
                           "conc": [0.00005, 1.5e-07, 0.25, np.nan, -9.99e-05, 1.2345678901234567e-05]})
        df["ppm"] = df["conc"] / 1000
        df.to_csv("out.csv", index=False)
        """, data, monkeypatch)
    assert "PANDAS_CSV_FLOATS" in converted
    expected = (pandas_side / "out.csv").read_text(encoding="utf-8")
    assert "5e-05" in expected and "1.5e-07" in expected  # the behaviour the test is about
    assert (polars_side / "out.csv").read_text(encoding="utf-8") == expected


def test_small_floats_among_many_rows_are_written_as_python_does(data: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    # pandas is the reference implementation, the file text compared byte for byte: the
    # replacements that make Polars' text Python's repr are given only to the values below
    # 0.0001, one batch of values at a time; 200,000 rows (several batches), a few of them
    # tiny, others 0, -0.0, NaN, large or negative, in both columns
    pandas_side, polars_side, converted = written_by_both("""
        import numpy as np
        import pandas as pd
        rng = np.random.default_rng(11)
        x = rng.normal(0, 50, 200_000)
        x[rng.integers(0, 200_000, 40)] = rng.normal(0, 1e-5, 40)
        x[rng.integers(0, 200_000, 40)] = 0.0
        x[rng.integers(0, 200_000, 40)] = np.nan
        x[:3] = [-0.0, 1e21, -3.5e-9]
        df = pd.DataFrame({"x": x, "y": np.round(x, 3)})
        df.to_csv("out.csv", index=False)
        """, data, monkeypatch)
    assert "PANDAS_CSV_FLOATS" in converted
    expected = (pandas_side / "out.csv").read_text(encoding="utf-8")
    assert "e-05" in expected and "e-06" in expected  # the behaviour the test is about
    assert (polars_side / "out.csv").read_text(encoding="utf-8") == expected


def test_read_csv_category_of_numbers_is_a_todo_with_data(data: Path) -> None:
    # pandas makes the categories numbers when every value reads as one ("007" becomes 7);
    # Polars' Categorical holds text: kept on pandas under a TODO (and it runs)
    (data / "codes.csv").write_text("plot,code,kind\nP1,007,a\nP2,012,b\nP3,007,a\n", encoding="utf-8")
    assert pd.read_csv("codes.csv", dtype={"code": "category"})["code"].tolist() == [7, 12, 7]
    source = ('import pandas as pd\n'
              'df = pd.read_csv("codes.csv", dtype={"code": "category"})\nresult = df\n')
    text = convert(source, data_dir=str(data)).converted_text
    assert "# TODO(porter): pd.read_csv" in text and "categories numbers" in text, text
    assert_same_table(pd.read_csv("codes.csv", dtype={"code": "category"}), run(text)["result"])


def test_read_csv_category_of_text_converts_with_data(data: Path) -> None:
    # pandas is the reference implementation: text categories stay text in both
    (data / "codes.csv").write_text("plot,code,kind\nP1,007,a\nP2,012,b\nP3,007,a\n", encoding="utf-8")
    result = differential("""
        import pandas as pd
        df = pd.read_csv("codes.csv", dtype={"kind": "category"})
        result = df["kind"].astype(str).tolist()
        """, data_dir=str(data))
    assert "TODO(porter)" not in result.converted_text


@pytest.mark.parametrize("write", [
    'df.groupby("k")["f"].sum().to_csv("a.csv")',
    'df["f"].value_counts().to_csv("b.csv")',
    'df.groupby("f").size().to_csv("d.csv")',
])
def test_small_floats_of_series_and_keys_are_written_as_pandas_writes_them(write: str, tmp_path: Path) -> None:
    # float columns porter has no type for (a Series' values, float keys) are found by the
    # selector and written as Python's repr (5e-05, 1.5e-07), as pandas writes them
    same_text(f"""
        import pandas as pd
        df = pd.read_csv("t.csv")
        {write}
        """, tmp_path, {"t.csv": "k,v,f\na,1,0.00005\na,2,0.00005\nb,3,1.5e-07\nb,4,-0.0000123\n"})


def test_blank_lines_make_no_integer_column_float(tmp_path: Path) -> None:
    # pandas skips the blank line: n stays int64 (written 1700000000, not 1700000000.0)
    same_text("""
        import pandas as pd
        df = pd.read_csv("e.csv")
        df["m"] = df["n"] * 2
        df.to_csv("o.csv", index=False)
        print(df["n"].tolist())
        """, tmp_path, {"e.csv": "n\n0\n1700000000\n\n951782400\n"})


@pytest.mark.parametrize("read", [
    'frames = [pd.read_csv(f) for f in ["day1.csv", "day2.csv", "day3.csv"]]',
    'frames = []\nfor f in sorted(glob.glob("day*.csv")):\n    frames.append(pd.read_csv(f))',
])
def test_files_read_in_a_loop_get_the_types_pandas_infers(read: str, tmp_path: Path) -> None:
    # a ferry line's daily logs read one by one: " 5" and "+3" are numbers to pandas, an
    # all-blank column is float64 (describe() keeps it), a file of a header only holds object
    # columns (the sum after the concat still adds numbers); Polars' scan reads them as text
    same_text("""
        import glob
        import pandas as pd
        READ
        allm = pd.concat(frames, ignore_index=True)
        print(allm.dtypes)
        print(allm.describe())
        tot = allm.groupby("ferry")[["cars", "delta"]].sum()
        tot.to_csv("out_tot.csv")
        """.replace("READ", read.replace("\n", "\n        ")), tmp_path, {
        "day1.csv": "ferry,cars,delta,kg\nF1, 5,+3,\nF2,6,-1,\n",
        "day2.csv": "ferry,cars,delta,kg\n",
        "day3.csv": "ferry,cars,delta,kg\nF1, 12,+0,2.5\nF2,4,+2,1\n",
    })


def test_a_header_only_file_concatenated_takes_the_other_files_types(tmp_path: Path) -> None:
    # an orchard's empty picking day: pandas reads its columns as empty object columns, which
    # the concat fills with the other day's numbers (the sum adds them); Polars' scan read
    # them as text, so every column became text and the sum failed
    same_text("""
        import pandas as pd
        d1 = pd.read_csv("day1.csv")
        d2 = pd.read_csv("day2.csv")
        allm = pd.concat([d1, d2], ignore_index=True)
        tot = allm.groupby("row")["kg"].sum()
        tot.to_csv("out_tot.csv")
        allm.to_csv("out_all.csv", index=False)
        print(allm["crate"].max(), len(d1))
        """, tmp_path, {"day1.csv": "crate,row,kg\n", "day2.csv": "crate,row,kg\n3,A,2.5\n4,C,1\n5,A,2\n"})


@pytest.mark.parametrize("path", ['os.path.join(BASE, "d.csv")', 'BASE + "/d.csv"', 'DATA / "d.csv"',
                                  'f"{BASE}/d.csv"'])
def test_a_path_made_of_constants_outside_a_loop_is_still_scanned(path) -> None:
    # only a loop's or a comprehension's file stays pandas' read; a path built once is scanned
    # by Polars, lowered for what its inference reads otherwise
    result = convert(f'import os\nfrom pathlib import Path\nimport pandas as pd\nBASE = "data"\n'
                     f'DATA = Path("data")\ndf = pd.read_csv({path})\ntotal = df["v"].sum()\n')
    site = next(s for s in result.sites if s.key == "pd.read_csv")
    assert site.status == "converted" and site.confidence <= 0.9 and "+3" in site.message
    assert "pl.scan_csv" in result.converted_text


# -- pandas' nullable integers, marked per column ----------------------------------------------

KILN_CSV = """\
    fired,batch,cones
    2024-01-05,3,
    ,6,9
    2024-02-10,-3,7
    """


def test_to_csv_writes_a_plain_int_column_as_floats_beside_a_nullable_one(tmp_path: Path) -> None:
    # dt.month of a date column with NaT is float64 in pandas (1.0), isocalendar().week a
    # nullable UInt32 (1): one nullable column in the script had switched the int writing
    # off for every file, the month written 1
    same_text("""
        import pandas as pd
        df = pd.read_csv("kiln.csv")
        df["dt"] = pd.to_datetime(df["fired"], errors="coerce")
        df["month"] = df["dt"].dt.month
        df["week"] = df["dt"].dt.isocalendar().week
        df["next_week"] = df["week"] + 1
        df.to_csv("out.csv", index=False)
        """, tmp_path, {"kiln.csv": KILN_CSV})


def test_a_nullable_column_of_one_frame_leaves_another_frames_ints_alone(tmp_path: Path) -> None:
    # astype("Int64") in one frame: the other frame's int column with a missing value is
    # still float64 in pandas (7.0); the nullable one, renamed, is written 7
    same_text("""
        import pandas as pd
        kiln = pd.read_csv("kiln.csv")
        kiln["month"] = pd.to_datetime(kiln["fired"]).dt.month
        ferry = pd.read_csv("kiln.csv", dtype={"batch": "Int64"})
        ferry["n"] = ferry["cones"].astype("Int64")
        ferry = ferry.rename(columns={"n": "cones_n"})
        kiln.to_csv("kiln_out.csv", index=False)
        ferry.to_csv("ferry_out.csv", index=False)
        print(kiln["month"].astype(str).tolist(), ferry["cones_n"].astype(str).tolist())
        """, tmp_path, {"kiln.csv": KILN_CSV})


def test_to_csv_handed_to_pandas_keeps_nullable_integers(tmp_path: Path) -> None:
    # float_format= hands the write to pandas: the Int64 column (and isocalendar()'s UInt32 /
    # Int32 parts) reached it as float64 and were written 3.00
    same_text("""
        import pandas as pd
        df = pd.read_csv("kiln.csv")
        df["mi"] = df["cones"].astype("Int64")
        df["d"] = pd.to_datetime(df["fired"], format="%Y-%m-%d")
        df["wk"] = df["d"].dt.isocalendar().week
        df["yr"] = df["d"].dt.isocalendar().year
        df.to_csv("out.csv", index=False, float_format="%.2f")
        print(df["wk"].tolist())
        """, tmp_path, {"kiln.csv": KILN_CSV})


def test_describe_to_csv_writes_the_unnamed_index_under_an_empty_header(tmp_path: Path) -> None:
    # pandas writes describe()'s unnamed index under an empty header (",a"); Polars' writer
    # quoted the empty name ('"",a')
    same_text("""
        import pandas as pd
        df = pd.read_csv("ferry.csv")
        df.describe().to_csv("desc.csv")
        df[["knots"]].describe().to_csv("desc2.csv", sep=";")
        """, tmp_path, {"ferry.csv": "knots,deck,route\n12,x,north\n,y,\n3.5,,south\n"})
