"""Rule cases and differential checks for porter/rules/assign.py (setitem, assign, rename, drop,
del, df.columns = [...], loc assignment, astype).

pandas is the reference implementation: every differential check runs the snippet with pandas
and its conversion with Polars and compares what they computed.
"""

from __future__ import annotations

import pytest

from rule_checks import check_ports, check_todo, check_unchanged
from support import convert, differential, run, same_text

# NaN and None together, duplicates, unicode text, booleans.
FRAME = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "kg": [1.5, np.nan, None, 4.0, 4.0, 0.5],
    "grade": ["A", None, "B", "A", "Éclair", "ünï"],
    "n": [1, 2, 3, 4, 5, 6],
    "ok": [True, False, True, False, True, True],
})
"""

# -- ports ----------------------------------------------------------------------------------

PORTS = [
    pytest.param('df["d"] = df["kg"] * 2', 'df = df.with_columns(d=pl.col("kg") * 2)', id="setitem expression"),
    # a whole number is int64 in pandas; Polars' pl.lit(1) would be an Int32, which wraps
    pytest.param('df["d"] = 1', "df.with_columns(d=pl.lit(1, dtype=pl.Int64))", id="setitem scalar"),
    pytest.param('df["d"] = 1.5', "df.with_columns(d=pl.lit(1.5))", id="setitem float scalar"),
    pytest.param('df["d"] = df["kg"] > 1', 'd=(pl.col("kg") > 1).fill_null(False)',
                 id="comparison with missing stored as False"),
    pytest.param('df["my col"] = 1', 'pl.lit(1, dtype=pl.Int64).alias("my col")',
                 id="name that is not an identifier"),
    pytest.param('df[["kg", "n"]] = 0', "kg=pl.lit(0, dtype=pl.Int64), n=pl.lit(0, dtype=pl.Int64)",
                 id="one value into several columns"),
    pytest.param('df["rows"] = len(df)', "rows=pl.len().cast(pl.Int64)",
                 id="a count of the frame itself is an Int64 expression"),
    pytest.param('r = df.assign(d=lambda d: d["kg"] * 2, e=lambda d: d["d"] + 1)',
                 'df.with_columns(d=pl.col("kg") * 2).with_columns(e=pl.col("d") + 1)',
                 id="assign keyword using an earlier one"),
    pytest.param('r = df.assign(d=df["n"] * 2, e=1)',
                 'with_columns(d=pl.col("n") * 2, e=pl.lit(1, dtype=pl.Int64))',
                 id="assign independent keywords together"),
    pytest.param('r = df.rename(columns={"kg": "mass", "zzz": "q"})', 'df.rename({"kg": "mass"})',
                 id="rename drops unknown names"),
    pytest.param('r = df.rename({"kg": "mass"}, axis=1)', 'df.rename({"kg": "mass"})', id="rename mapper axis"),
    pytest.param('r = df.drop(columns=["ok"])', 'df.drop("ok")', id="drop columns="),
    pytest.param('r = df.drop("ok", axis=1)', 'df.drop("ok")', id="drop axis=1"),
    pytest.param('del df["ok"]', 'df = df.drop("ok")', id="del"),
    pytest.param('df.columns = ["a", "b", "c", "d"]', 'df.rename({"kg": "a", "grade": "b", "n": "c", "ok": "d"})',
                 id="columns assigned by position"),
    pytest.param('df.loc[df["kg"] > 1, "grade"] = "big"',
                 'pl.when(pl.col("kg") > 1).then(pl.lit("big")).otherwise(pl.col("grade"))',
                 id="loc assignment existing column"),
    pytest.param('df.loc[df["kg"] > 1, "new"] = 1.0', 'new=pl.when(pl.col("kg") > 1).then(pl.lit(1.0))',
                 id="loc assignment new column missing elsewhere"),
    # True/False as pandas writes them; a blank (NaN in pandas' object column) stays missing
    pytest.param('df["s"] = df["ok"].astype(str)',
                 'pl.col("ok").replace_strict({True: "True", False: "False"})',
                 id="astype str of booleans"),
    pytest.param('df["b"] = df["kg"].astype(bool)', 'pl.col("kg").cast(pl.Boolean).fill_null(True)',
                 id="astype bool of numbers: missing is True"),
    pytest.param('df["b"] = df["grade"].astype(bool)', '(pl.col("grade") != "").fill_null(True)',
                 id="astype bool of text"),
    pytest.param('df["c"] = df["grade"].astype("category")', 'pl.col("grade").cast(pl.Categorical)',
                 id="astype category"),
    pytest.param('r = df.astype({"n": "float64"})', 'n=pl.col("n").cast(pl.Float64)', id="astype dict"),
    pytest.param('df.rename(columns={"kg": "mass"}, inplace=True)', 'df = df.rename({"kg": "mass"})',
                 id="inplace rename rebinds"),
]


@pytest.mark.parametrize("before, expected", PORTS)
def test_ports(before: str, expected: str) -> None:
    check_ports(FRAME + before + "\n", expected)


TODOS = [
    pytest.param('r = df.rename(columns=str.swapcase)', "frame.rename", id="rename function porter does not read"),
    pytest.param('r = df.rename(columns={"kg": "n"})', "frame.rename",
                 id="rename onto an existing name (pandas keeps duplicates)"),
    pytest.param('r = df.rename(columns={"kg": 1})', "frame.rename", id="rename to a number"),
    pytest.param("r = df.drop([0, 1])", "frame.drop", id="drop rows by label"),
    pytest.param("r = df.drop(index=[0, 1])", "frame.drop", id="drop index="),
    pytest.param('r = df.assign(**{"my col": 1})', "frame.assign", id="assign unpacked keywords"),
    pytest.param('rows = [{"a": 1}, {"a": 0}]\nrows.append({"a": 2})\nd2 = pd.DataFrame(rows)\nd2["b"] = d2["a"].astype(bool)',
                 "series.astype", id="astype bool of an unknown type"),
]


@pytest.mark.parametrize("before, key", TODOS)
def test_todo(before: str, key: str) -> None:
    check_todo(FRAME + before + "\n", key)


def test_todo_row_mask_assignment_keeps_pandas_semantics() -> None:
    # the frame is handed to pandas before the statement, which then runs as written
    # (numbers only: pandas 3 refuses to write 0 into its text columns)
    differential("""
import pandas as pd
df = pd.DataFrame({"n": [1, 5, 3, 7], "kg": [1.0, 2.0, None, 4.5]})
df[df["n"] > 3] = 0
result = df
""")


def test_todo_loc_label_assignment() -> None:
    check_todo(FRAME + 'df.loc[2, "kg"] = 0\n', "frame.loc_setitem")


UNCHANGED = [
    pytest.param("d = {}\nd['a'] = 1\ndel d['a']\n", id="dict setitem and del"),
    pytest.param("import numpy as np\na = np.zeros(3)\nb = a.astype(int)\n", id="numpy astype"),
    pytest.param("class Box:\n    def rename(self, columns):\n        return columns\n"
                 "    def drop(self, columns):\n        return columns\n"
                 "b = Box()\nx = b.rename(columns={'a': 'b'})\ny = b.drop(columns=['a'])\n",
                 id="rename and drop of another class"),
    pytest.param("import os\nos.rename('a.txt', 'b.txt') if False else None\n", id="os.rename"),
]


@pytest.mark.parametrize("before", UNCHANGED)
def test_unchanged(before: str) -> None:
    check_unchanged("import pandas as pd\n" + before)


# -- differential ---------------------------------------------------------------------------

STATEMENTS = [
    pytest.param('df["d"] = df["kg"] * 2', id="expression"),
    pytest.param('df["d"] = 1', id="int scalar"),
    pytest.param('df["d"] = "Éclair"', id="text scalar"),
    pytest.param('df["d"] = np.nan', id="NaN scalar is missing"),
    pytest.param('df["d"] = df["kg"] > 1', id="comparison with missing"),
    pytest.param('df["d"] = df["kg"] != 4', id="!= with missing"),
    pytest.param('df["d"] = ~(df["kg"] > 1)', id="negated comparison with missing"),
    pytest.param('df["d"] = df["kg"] > df["n"]', id="comparison of two columns"),
    pytest.param('df["kg"] = df["kg"] + 1', id="overwrite a column"),
    pytest.param('df["d"] = df["kg"] - df["kg"].mean()', id="reduction broadcast"),
    pytest.param('df["d"] = df["kg"]\ndf["kg"] = 0', id="copy then overwrite"),
    pytest.param('df["kg"] *= 2', id="augmented multiply"),
    pytest.param('df["kg"] += df["n"]', id="augmented add of a column"),
    pytest.param('df[["kg", "n"]] = 0', id="one value into two columns"),
    pytest.param('df = df.assign(d=lambda d: d["kg"] * 2, e=lambda d: d["d"] + 1)', id="assign dependent lambdas"),
    pytest.param('df = df.assign(d=df["n"] * 2, e=1)', id="assign expression and scalar"),
    pytest.param("df = df.assign(d=lambda x: x.kg > 1)", id="assign comparison lambda"),
    pytest.param('df = df.rename(columns={"kg": "mass", "zzz": "q"})', id="rename with unknown key"),
    pytest.param('df = df.rename(columns={"kg": "mass"}).assign(m2=lambda d: d.mass * 2)', id="rename then use"),
    pytest.param('df = df.rename({"kg": "mass"}, axis="columns")', id="rename axis columns"),
    pytest.param('df = df.drop(columns=["ok"])', id="drop columns list"),
    pytest.param('df = df.drop("ok", axis=1)', id="drop axis=1"),
    pytest.param('df = df.drop(columns="ok")', id="drop one name"),
    pytest.param('del df["ok"]', id="del"),
    pytest.param('df.columns = ["a", "b", "c", "d"]', id="columns list"),
    pytest.param('df.columns = ["n", "kg", "grade", "ok"]', id="columns swapped"),
    pytest.param('df.loc[df["kg"] > 1, "grade"] = "big"', id="loc existing text column"),
    pytest.param('df.loc[df["kg"] > 1, "new"] = 1.0', id="loc new float column"),
    pytest.param('df.loc[df["kg"] > 1, "new"] = "x"', id="loc new text column"),
    pytest.param('df.loc[~(df["kg"] > 1), "n"] = 0', id="loc negated mask with missing"),
    pytest.param('df.loc[df["grade"] == "A", "kg"] = df["n"]', id="loc value from a column"),
    pytest.param('df.loc[df["kg"] > 1, "kg"] = np.nan', id="loc NaN"),
    pytest.param('df.loc[:, "z"] = 5', id="loc all rows"),
    pytest.param('df["n"] = df["n"].astype(float)', id="astype float"),
    pytest.param('df["s"] = df["n"].astype(str)', id="astype str of ints"),
    pytest.param('df["s"] = df["kg"].astype(str)', id="astype str keeps missing"),
    pytest.param('df["s"] = df["ok"].astype(str)', id="astype str of booleans"),
    pytest.param('df["b"] = df["kg"].astype(bool)', id="astype bool of floats with NaN"),
    pytest.param('df["b"] = df["grade"].astype(bool)', id="astype bool of text with None"),
    pytest.param('df["b"] = df["n"].astype(bool)', id="astype bool of ints"),
    pytest.param('df["i"] = df["ok"].astype(int)', id="astype int of booleans"),
    pytest.param('df["i"] = df["kg"].fillna(0).astype(int)', id="astype int after fillna"),
    pytest.param('df["c"] = df["grade"].astype("category")', id="astype category"),
    pytest.param("df = df.astype(str)", id="astype str of the frame"),
    pytest.param('df = df.astype({"n": "float64"})', id="astype dict"),
    pytest.param('df["s"] = df["n"].astype(str) + "kg"', id="astype then concatenate"),
    pytest.param('df.drop(columns=["ok"], inplace=True)', id="inplace drop"),
]


@pytest.mark.parametrize("statement", STATEMENTS)
def test_frame_matches_pandas(statement: str) -> None:
    differential(FRAME + statement + "\nresult = df\n")


def test_assignments_on_an_empty_frame() -> None:
    differential(FRAME + """
none = df[df["n"] > 100]
none["d"] = none["kg"] * 2
none.loc[none["kg"] > 1, "grade"] = "big"
result = none.rename(columns={"kg": "mass"}).drop(columns="ok")
""")


def test_assignment_into_a_filtered_frame() -> None:
    differential(FRAME + 'df2 = df[df.kg > 1]\ndf2["z"] = df2["n"] * 10\nresult = df2\n')


def test_astype_int_with_missing_lowers_confidence() -> None:
    # pandas raises on NaN when casting to int; Polars keeps the value missing.
    result = convert(FRAME + 'df["k"] = df["kg"].astype(int)\n')
    site = next(s for s in result.sites if s.key == "series.astype")
    assert site.confidence <= 0.95 and "raises" in site.message


@pytest.mark.parametrize("statement", [
    pytest.param('df["d"] = [3, 1, 4, 1, 5, 9]', id="a list literal, by position"),
    pytest.param('df["d"] = [3, None, 4, 1, 5, 9]', id="whole numbers beside a missing value are floats"),
    pytest.param('df["d"] = ("é", "b", None, "d", "e", "f")', id="a tuple of text"),
    pytest.param('seq = []\nfor i in range(len(df)):\n    seq.append(i * 10)\ndf["d"] = seq',
                 id="a list built in a loop (was pl.lit: the whole list in every row)"),
])
def test_a_list_assigned_as_a_column_matches_pandas(statement: str) -> None:
    differential(FRAME + statement + "\nresult = df\n")


def test_a_list_of_another_length_fails_as_in_pandas() -> None:
    import subprocess
    import sys
    source = FRAME + 'df["d"] = [1, 2]\nprint(df.collect() if hasattr(df, "collect") else df)\n'
    converted = convert(source).converted_text
    assert "pl.Series([1, 2]" in converted
    done = subprocess.run([sys.executable, "-c", converted], capture_output=True, text=True)
    assert done.returncode != 0  # pandas raises ValueError; Polars refuses the length too


def test_astype_of_text_with_spaces_reads_numbers_as_pandas() -> None:
    # pandas reads each text as float()/int() do, around spaces; a strict cast had failed
    differential("""
import pandas as pd
df = pd.DataFrame({"pct": ["12 %", "7%", None, " 3 %"], "n": [" 4", "5 ", None, "\\t6"],
                   "m": [" 4", "5 ", "+1", "\\t6"]})
df["f"] = df["pct"].str.rstrip("%").astype(float) / 100
df["i"] = df["m"].astype(int)
df["g"] = df["n"].astype("float64")
result = df
""")


# -- integer widths: a whole number stored as a column is int64 in pandas ----------------------

@pytest.mark.parametrize("statement", [
    pytest.param('df["c"] = 50000\ndf["sq"] = df["c"] * df["c"]', id="a constant squared"),
    pytest.param('df = df.assign(c=50000)\ndf["sq"] = df["c"] * df["c"] * df["n"]',
                 id="assign of a constant"),
    pytest.param('df["c"] = len(df)\ndf["sq"] = df["c"] * 1_000_000_000', id="a count broadcast"),
    pytest.param('df.loc[df["n"] > 2, "c"] = 70000\ndf["sq"] = df["c"] * df["c"]',
                 id="loc of a constant"),
    pytest.param('df[["c", "e"]] = 80000\ndf["sq"] = df["c"] * df["e"]', id="into two columns"),
    pytest.param('rows = len(df)\ndf["c"] = rows * 3\ndf["sq"] = df["c"] * 1_000_000_000',
                 id="arithmetic on a count"),
    pytest.param('df["c"] = df["ok"].sum() - 5\ndf["sq"] = df["c"] * 1_000_000_000',
                 id="a sum of booleans minus a number"),
])
def test_whole_numbers_stored_do_not_wrap_around(statement: str) -> None:
    # pandas is the reference: 50000 * 50000 is 2500000000 in its int64 (Polars' Int32
    # literal gave -1794967296)
    differential(FRAME + statement + "\nresult = df\n")


# -- a True/False column read with a blank: pandas' object column of True, False and NaN -------

def test_astype_str_of_booleans_with_a_blank_keeps_it_missing(tmp_path, monkeypatch) -> None:
    # pandas is the reference: "True", "False", "True", missing (the blank was written "False")
    (tmp_path / "x.csv").write_text("k,flag\na,TRUE\nb,false\nc,True\nd,\n")
    monkeypatch.chdir(tmp_path)
    result = differential('import pandas as pd\ndf = pd.read_csv("x.csv")\n'
                          'df["txt"] = df["flag"].astype(str)\n'
                          'result = df[["k", "txt"]]\n'
                          'missing = int(df["txt"].isna().sum())\n',
                          "result", "missing", data_dir=str(tmp_path))
    assert 'pl.col("flag").replace_strict({True: "True", False: "False"})' in result.converted_text


@pytest.mark.parametrize("value", [
    'df.loc[df["kg"] > 2, "kg"].values * 10',
    'df.loc[df["kg"] > 2, "kg"].to_numpy()',
])
def test_an_array_assigned_into_masked_rows_stays_pandas(value: str) -> None:
    # pandas places the array over the chosen rows by position; pl.lit(array) in a when()
    # had raised ShapeError (an array of 2 values against every row)
    source = """
import numpy as np
import pandas as pd
df = pd.DataFrame({"k": ["c", "a", "b", "d"], "kg": [3.0, 1.0, np.nan, 4.0]})
df.loc[df["kg"] > 2, "w"] = """ + value + "\nresult = df\n"
    differential(source)
    check_todo(source, "frame.loc_setitem")


def test_astype_bool_of_booleans_with_a_blank_is_true(tmp_path, monkeypatch) -> None:
    # pandas is the reference: bool(NaN) is True, so the blank counts as True (2 of 3 rows)
    (tmp_path / "x.csv").write_text("k,flag,v\na,True,1\nb,,\nc,False,3\n")
    monkeypatch.chdir(tmp_path)
    result = differential('import pandas as pd\ndf = pd.read_csv("x.csv")\n'
                          'df["b"] = df["flag"].astype(bool)\n'
                          'df["c"] = (df["v"] > 1).astype(bool)\n'
                          'n = int(df["flag"].astype(bool).sum())\nresult = df\n',
                          "result", "n", data_dir=str(tmp_path))
    assert not result.todos, result.converted_text


def test_arithmetic_on_whole_numbers_is_one_int64_value() -> None:
    # len(df) * 3 is a whole number: no doubt that it is a single value, and Int64 as in pandas
    # (counted in the frame itself, without a collect)
    result = differential(FRAME + 'df["c"] = len(df) * 3 + 1\nresult = df\n')
    assert "pl.len().cast(pl.Int64) * 3 + 1" in result.converted_text, result.converted_text
    assert all(s.confidence == 1.0 for s in result.sites if s.key == "frame.setitem"), result.sites


def test_values_made_per_row_are_placed_by_position_not_broadcast() -> None:
    # `[a, b] * 4` and `np.arange(n) - 5` are one value per row: pl.lit gave every row the
    # whole list; a NaN in a list is missing as in pandas
    differential('''
import numpy as np
import pandas as pd
df = pd.DataFrame({"a": [1, 2, 3, 4, 5, 6, 7, 8]})
df["f"] = [1.5, 0.25, np.nan, None] * 2
df["n"] = np.arange(len(df)) - 5
df["r"] = list(range(8))
df["k"] = 7
result = df
missing = df.isna().sum()
''', "result", "missing")


# -- pd.to_numeric --------------------------------------------------------------------------------

NUMERIC_TEXT = """\
import pandas as pd
df = pd.DataFrame({
    "raw": ["1", " 3 ", "2.5e1", "x", None, "inf", "+5", ".5", "1,000", "1_000", "0x10", "-0",
            "1.5E-3", "12abc", "\\t7\\n", "nan", "", "Infinity"],
    "n": [1.0, 2.0, 3.0, 4.0, 5.0, 6.0, 7.0, 8.0, 9.0, 10.0, 11.0, 12.0, 13.0, 14.0, 15.0, 16.0,
          17.0, 18.0],
})
"""


@pytest.mark.parametrize("snippet", [
    'df["v"] = pd.to_numeric(df["raw"], errors="coerce")\nresult = df',
    'result = pd.to_numeric(df["raw"], errors="coerce").sum()',
    'result = df.assign(v=pd.to_numeric(df["raw"], errors="coerce") * 2)',
    'result = df.assign(same=pd.to_numeric(df["n"]))',
    # every text readable: errors="raise" reads them as pandas does
    'ok = df[df["raw"].isin(["1", " 3 ", "+5", ".5"])]\nresult = ok.assign(v=pd.to_numeric(ok["raw"]))',
])
def test_to_numeric_matches_pandas(snippet: str) -> None:
    result = differential(NUMERIC_TEXT + snippet + "\n")
    assert not result.todos, result.converted_text


def test_to_numeric_of_unreadable_text_fails_as_pandas_does() -> None:
    source = NUMERIC_TEXT + 'df["v"] = pd.to_numeric(df["raw"])\nresult = df.collect() if hasattr(df, "collect") else df\n'
    with pytest.raises(Exception):
        run(source)
    converted = convert(source).converted_text
    with pytest.raises(Exception):
        run(converted)


PIVOTED = '''
import pandas as pd
df = pd.DataFrame({"m": ["a", "b", "a", "c"], "s": ["x", "y", "y", "x"], "v": [1.0, 2.0, 3.0, None]})
load = df.pivot_table(index="m", columns="s", values="v", aggfunc="sum", fill_value=0)
'''


def test_columns_name_none_writes_nothing() -> None:
    # pandas keeps the pivot's key as the columns' name, which melt would use as the variable
    # column; set to None, melt names it "variable" in both
    result = differential(PIVOTED + 'load.columns.name = None\nload = load.reset_index()\n'
                          'long = load.melt(id_vars="m")\n', "load", "long")
    assert "TODO" not in result.converted_text
    assert "columns.name" not in result.converted_text
    assert "load = load\n" not in result.converted_text


def test_columns_name_given_is_a_todo() -> None:
    check_todo(PIVOTED + 'load.columns.name = "series"\nload = load.reset_index()\n',
               "frame.columns.name")


@pytest.mark.parametrize("source", [
    'result = df.groupby("k")["v"].mean().rename("mean_v").reset_index()',
    'result = df.assign(w=df["v"].rename("z"))',
    'df["w"] = (df["v"] * 2).rename("twice")\nresult = df',
])
def test_series_rename_matches_pandas(source: str) -> None:
    frame = 'import pandas as pd\ndf = pd.DataFrame({"k": ["a", "b", "a", None], "v": [1.0, None, 3.0, 4.0]})\n'
    result = differential(frame + source + "\n")
    assert "TODO" not in result.converted_text


def test_datetimes_as_text_are_written_as_pandas_writes_them(tmp_path) -> None:
    # dates only when every time is midnight; whole seconds, milliseconds or microseconds as
    # few as the column needs; a missing value stays missing (to_csv writes the same)
    out = tmp_path / "times.csv"
    source = f'''
import pandas as pd
df = pd.DataFrame({{"a": ["2024-01-31", None, "2024-02-01"],
                   "b": ["2024-01-31 10:00:00.000", None, "2024-02-01 00:00:01.500"],
                   "c": ["2024-01-31 10:00:00", "2024-01-31 11:00:00", None],
                   "d": ["2024-01-31 10:00:00.123456", None, "2024-01-01 00:00:00.000000"]}})
df["a"] = pd.to_datetime(df["a"], format="%Y-%m-%d")
df["b"] = pd.to_datetime(df["b"], format="%Y-%m-%d %H:%M:%S.%f")
df["c"] = pd.to_datetime(df["c"], format="%Y-%m-%d %H:%M:%S")
df["d"] = pd.to_datetime(df["d"], format="%Y-%m-%d %H:%M:%S.%f")
df["a_t"] = df["a"].astype(str)
df["b_t"] = df["b"].astype(str)
df["c_t"] = df["c"].astype(str)
df["d_t"] = df["d"].astype(str)
df.to_csv({str(out)!r}, index=False)
result = df
'''
    converted = differential(source).converted_text
    assert "TODO" not in converted
    expected = out.read_text()
    run(converted)
    assert out.read_text() == expected


def test_float_nan_written_under_a_mask_is_a_missing_value(tmp_path) -> None:
    # float("nan") is NaN, as np.nan is: missing in pandas (an empty field when written)
    out = tmp_path / "r.csv"
    source = f'''
import pandas as pd
df = pd.DataFrame({{"k": ["a", "b", "a"], "v": [5, -6, 7]}})
df.loc[df["v"] < 0, "v"] = float("nan")
df["w"] = float("inf")
gone = df["v"].isna().sum()
df.to_csv({str(out)!r}, index=False)
'''
    differential(source, "df", "gone")
    expected = out.read_text()
    run(convert(source).converted_text)
    assert out.read_text() == expected


LOCAL_RETURNS = '''
import pandas as pd
import numpy as np
h = pd.DataFrame({"boat": ["A", "B", "C", None], "kg": [10.0, 2.0, np.nan, 4.5],
                  "crew": [3.0, 1.0, 4.0, np.nan]})
'''


@pytest.mark.parametrize("function", [
    pytest.param('''
def label(row):
    total = 0
    for c in ["kg", "crew"]:
        if pd.notna(row[c]):
            total += row[c]
    return total if total > 5 else "small"
''', id="a number or a text"),
    pytest.param('''
def label(row):
    d = {}
    for c in ["boat", "kg"]:
        d[c] = row[c] if isinstance(row[c], str) else "?"
    return d
''', id="a dict filled key by key"),
])
def test_a_row_function_whose_local_result_has_no_polars_type_keeps_the_frame_on_pandas(function):
    # pandas keeps numbers beside text, or dicts, in one object column: put back into Polars
    # they failed (ArrowInvalid) or became a struct column no CSV writer takes
    result = differential(LOCAL_RETURNS + function + '''
h["lab"] = h.apply(label, axis=1)
h["n"] = h["lab"].astype(str).str.len()
''', "h")
    assert "pl.Series(h" not in result.converted_text


def test_a_row_function_returning_a_number_it_adds_up_is_put_back():
    result = differential(LOCAL_RETURNS + '''
def load(row):
    total = 0.0
    for c in ["kg", "crew"]:
        if pd.notna(row[c]):
            total += row[c]
    return total
h["load"] = h.apply(load, axis=1)
h["double"] = h["load"] * 2
''', "h")
    assert "pl.Series(h" in result.converted_text  # not the whole frame kept on pandas


def test_astype_str_of_split_lists_writes_pythons_text_of_each_list():
    # pandas: ['ash', 'celadon'] (str of the list); Polars refused to cast a list to text
    result = differential('''
import pandas as pd
df = pd.DataFrame({"id": [1, 2, 3, 4], "glazes": ["ash;celadon", None, "shino", "it's;tenmoku"]})
df["parts"] = df["glazes"].str.split(";")
df["as_text"] = df["parts"].astype(str)
df["n"] = df["as_text"].str.len()
''', "df")
    assert "astype" not in result.converted_text


def test_a_categorical_of_numbers_keeps_the_frame_on_pandas():
    # pl.Series of a pandas Categorical of ints is plain Int64: value_counts then orders ties
    # by first appearance, pandas by the categories' order, and .cat fails
    result = differential('''
import pandas as pd
h = pd.DataFrame({"trip": [1, 2, 3, 4, 5], "crew": [4, 3, 4, 3, 1]})
h["crew_c"] = h["crew"].astype("category")
vc = h["crew_c"].value_counts()
first = h["crew_c"].cat.categories[0]
''', "vc", "first")
    assert "pl.Series(h" not in result.converted_text


def test_a_nullable_integer_column_keeps_its_type_through_a_hand_over(tmp_path) -> None:
    # pandas holds astype("Int64") as a nullable column: 1 and <NA>. A statement kept on
    # pandas (pd.Categorical) got it from Polars as float64 (1.0, nan), and the file written
    # after it said 1.0 where pandas writes 1
    source = """
import pandas as pd
df = pd.read_csv("orchard.csv")
df["xi"] = df["x"].astype("Int64")
df["c"] = pd.Categorical(df["k"])
print(df["xi"].dtype, df["xi"].iloc[1] is pd.NA)
df.to_csv("o.csv", index=False)
"""
    result = same_text(source, tmp_path, {"orchard.csv": "k,x\na,1\nb,\nc,3\n"})
    assert 'astype({"xi": "Int64"})' in result.converted_text


# -- columns pandas makes float64 because a value is missing, whatever the values ------------------

DATA_AB = {"data.csv": """\
    id,a,b
    1,5,1.5
    2,5,
    3,-2,3.0
    4,0,-1.0
    5,9,2.0
    """}


@pytest.mark.parametrize("mask", ['df["a"] > 4', 'df["a"] > -100', 'df["a"] > 100'],
                         ids=["some rows", "every row", "no row"])
def test_loc_setitem_of_a_new_column_is_float_whatever_the_mask(tmp_path, mask) -> None:
    # pandas makes the new column float64 (NaN outside the mask) even when the mask is all
    # True or all False, and it stays float after fillna: written 1.0, "1.0" as text
    source = f'''
import pandas as pd
df = pd.read_csv("data.csv")
df.loc[{mask}, "h"] = 1
df["h"] = df["h"].fillna(0)
df["hs"] = df["h"].astype(str)
print(df["h"].sum(), df["h"].tolist())
df.to_csv("o.csv", index=False)
'''
    result = same_text(source, tmp_path, DATA_AB)
    assert "TODO" not in result.converted_text


def test_nan_assigned_to_a_column_is_a_float_column(tmp_path) -> None:
    # df["z"] = np.nan is a float64 column of NaN in pandas: filled with 1 it writes 1.0, and
    # its mean is NaN (Polars' Null-typed pl.lit(None) would fill to integers)
    source = '''
import numpy as np
import pandas as pd
df = pd.read_csv("data.csv")
df["z"] = np.nan
df["z"] = df["z"].fillna(1)
df.loc[df["b"].isna() | (df["b"] < 0), "n5"] = np.nan
df["n5"] = df["n5"].fillna(0)
df["z2"] = np.nan
df["zm"] = df["z2"].mean()
df.to_csv("o.csv", index=False)
print(df["z"].tolist(), df["n5"].tolist())
'''
    result = same_text(source, tmp_path, DATA_AB)
    assert "pl.lit(None, dtype=pl.Float64)" in result.converted_text


def test_loc_assignment_keeps_a_nullable_integer_column_nullable(tmp_path) -> None:
    # pandas writes whole numbers into its Int64 column as they are: still Int64 (1, <NA>);
    # after the loc assignment porter had lost the mark, and tolist() gave 1.0 and nan
    source = """
import pandas as pd
df = pd.read_csv("orchard.csv")
df["xi"] = df["x"].astype("Int64")
df.loc[df["k"] == "c", "xi"] = 7
df["half"] = df["xi"] // 2
print(df["xi"].tolist(), df["half"].tolist())
df.to_csv("o.csv", index=False)
"""
    same_text(source, tmp_path, {"orchard.csv": "k,x\na,1\nb,\nc,3\n"})


def test_astype_nullable_boolean_keeps_missing_values(tmp_path) -> None:
    # astype("boolean") is pandas' nullable boolean: a blank stays <NA> (written empty), where
    # astype(bool) makes it True; numbers 1.0 and 0.0 become True and False
    source = """
import pandas as pd
df = pd.read_csv("kiln.csv")
df["fired_nb"] = df["fired"].astype("boolean")
df["load_nb"] = df["load"].astype("boolean")
df["door_nb"] = df["door"].astype("boolean")
print(df["fired_nb"].sum(), df["load_nb"].sum(), df["door_nb"].sum())
df.to_csv("o.csv", index=False)
"""
    same_text(source, tmp_path, {"kiln.csv": "fired,load,door\nTrue,1.0,1\n,,0\nFalse,0.0,1\n"})


def test_astype_nullable_boolean_of_other_numbers_fails_as_in_pandas() -> None:
    # pandas refuses numbers other than 0 and 1 ("Need to pass bool-like values")
    result = convert('import pandas as pd\ndf = pd.DataFrame({"kg": [2.5, 0.0]})\n'
                     'df["b"] = df["kg"].astype("boolean")\nresult = df\n')
    with pytest.raises(Exception):
        run(result.converted_text)["result"].collect()


FERRY = {"ferry.csv": "crossing,fare,deck\n3,1.5,a\n4,2.0,\n5,,c\n"}


@pytest.mark.parametrize("build", [
    pytest.param('out, spare = [], []\nfor i, row in df.iterrows():\n    out.append(row["crossing"] * 2)\n',
                 id="unpacked empty lists"),
    pytest.param('out = list()\nfor v in df["fare"]:\n    out.append(v * 2)\n', id="list()"),
    pytest.param('def make(n):\n    return list(range(n))\nout = make(len(df))\n', id="a helper's list"),
    pytest.param('out = df["fare"].tolist()\nout.reverse()\n', id="tolist changed in place"),
    pytest.param('out = sorted(df["crossing"].tolist(), reverse=True)\n', id="sorted"),
    pytest.param('out = [0] * len(df)\nout[1] = 5\n', id="repeated list"),
])
def test_a_name_holding_a_list_is_placed_by_position(build: str, tmp_path) -> None:
    # pandas puts a list's values one per row; pl.lit(out) would put the whole list in every row
    source = ('import pandas as pd\ndf = pd.read_csv("ferry.csv")\n' + build
              + 'df["o"] = out\ndf = df.assign(p=out)\nprint(df["o"].tolist())\n'
              'df.to_csv("o.csv", index=False)\n')
    same_text(source, tmp_path, FERRY)


def test_a_name_of_unseen_type_holding_one_value_is_broadcast(tmp_path) -> None:
    source = ('import pandas as pd\ndf = pd.read_csv("ferry.csv")\nk = 7\n'
              'k = k + 0 if len(df) else 1\ndf["o"] = k\ndf.to_csv("o.csv", index=False)\n')
    same_text(source, tmp_path, FERRY)


ORCHARD_ROWS = {"orchard.csv": "row,trees,yield_t\na,1,2.5\nb,4,2.0\nc,3,\n"}


@pytest.mark.parametrize("statement", [
    pytest.param('df.loc[df["trees"] > 2, "trees"] = 3.0', id="whole float under a mask"),
    pytest.param('df.loc[:, "trees"] = 3.0', id="whole float to every row"),
    pytest.param('df.loc[df["trees"] > 2, "trees"] = -0.0', id="negative zero"),
    pytest.param('df.loc[df["trees"] > 2, "trees"] = np.nan', id="NaN makes it float"),
])
def test_loc_float_into_an_int_column_keeps_it_int_when_lossless(statement: str, tmp_path) -> None:
    # pandas writes 3.0 into its int64 column as 3 (the column stays int64: 1, 3, 3)
    source = ('import numpy as np\nimport pandas as pd\ndf = pd.read_csv("orchard.csv")\n'
              + statement + '\nprint(df["trees"].tolist(), df["trees"].sum())\n'
              'df.to_csv("o.csv", index=False)\n')
    same_text(source, tmp_path, ORCHARD_ROWS)


@pytest.mark.parametrize("value", ["3.5", "1e30", "True"])
def test_loc_lossy_value_into_an_int_column_stays_pandas(value: str) -> None:
    # pandas refuses them ("Invalid value '3.5' for dtype 'int64'"), whatever the rows
    result = convert('import pandas as pd\ndf = pd.DataFrame({"trees": [1, 4, 3]})\n'
                     f'df.loc[df["trees"] > 5, "trees"] = {value}\n')
    assert any(s.key == "frame.loc_setitem" and s.status == "todo" for s in result.sites)
    with pytest.raises((TypeError, ValueError)):  # the hand-over fails as pandas does
        run(result.converted_text)


def test_loc_new_true_false_or_text_column_is_missing_outside_the_mask(tmp_path) -> None:
    # pandas makes an object (str) column with NaN outside the mask: tolist() shows nan
    source = ('import pandas as pd\ndf = pd.read_csv("orchard.csv")\n'
              'df.loc[df["trees"] > 2, "thinned"] = True\n'
              'df.loc[df["trees"] > 2, "note"] = "dense"\n'
              'print(df["thinned"].tolist(), df["thinned"].sum(), df["note"].tolist())\n'
              'print(df["thinned"].astype(bool).tolist())\n'
              'df.to_csv("o.csv", index=False)\n')
    same_text(source, tmp_path, ORCHARD_ROWS)


def test_loc_computed_value_into_an_int_column_lowers_confidence(tmp_path) -> None:
    # pandas keeps int64 when the value is whole (2.0 is written 2), the conversion goes float
    (tmp_path / "orchard.csv").write_text(ORCHARD_ROWS["orchard.csv"])
    result = convert('import pandas as pd\ndf = pd.read_csv("orchard.csv")\n'
                     'df.loc[df["trees"] > 2, "trees"] = df["yield_t"].min()\n'
                     'df.to_csv("o.csv", index=False)\n', data_dir=str(tmp_path))
    site = next(s for s in result.sites if s.key == "frame.loc_setitem")
    assert site.confidence <= 0.8 and "keeps int64" in site.message
