"""Rule cases and differential checks for porter/rules/selection.py (columns, masks, loc, iloc,
head/tail, query, columns/shape/len/empty).

pandas is the reference implementation: every differential check runs the snippet with pandas
and its conversion with Polars and compares what they computed.
"""

from __future__ import annotations

import pytest

from rule_checks import check_ports, check_todo, check_unchanged
from support import convert, differential

# NaN and None together, duplicates and ties, unicode text, a name with a space.
FRAME = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "kg": [1.5, np.nan, None, 4.0, 4.0, 0.5],
    "grade": ["A", None, "B", "A", "Éclair", "ünï"],
    "n": [1, 2, 3, 4, 5, 6],
    "my col": [1, 1, 2, 2, 3, 3],
})
"""

# -- ports ----------------------------------------------------------------------------------

PORTS = [
    pytest.param('r = df[df["kg"] > 1]', 'df.filter(pl.col("kg") > 1)', id="df[col] in a mask"),
    pytest.param("r = df[df.kg > 1]", 'df.filter(pl.col("kg") > 1)', id="attribute access"),
    pytest.param('r = df[["grade", "kg"]]', 'df.select("grade", "kg")', id="list of columns"),
    pytest.param('cols = ["n", "kg"]\nr = df[cols]', "df.select(cols)", id="variable list of columns"),
    pytest.param('col = "kg"\nr = df[df[col] > 1]', 'df.filter(pl.col(col) > 1)', id="variable column name"),
    pytest.param('r = df.loc[df["kg"] > 1, ["grade", "n"]]',
                 'df.filter(pl.col("kg") > 1).select("grade", "n")', id="loc mask and columns"),
    pytest.param('r = df.loc[:, ["n", "kg"]]', 'df.select("n", "kg")', id="loc all rows"),
    pytest.param("r = df.iloc[1:3]", "df.slice(1, 2)", id="iloc slice"),
    pytest.param("r = df.iloc[2:]", "df.slice(2)", id="iloc open end"),
    pytest.param("r = df.iloc[-2:]", "df.tail(2)", id="iloc last rows"),
    pytest.param("r = df.iloc[:4, :]", "df.head(4)", id="iloc rows and all columns"),
    pytest.param("r = df[1:3]", "df.slice(1, 2)", id="plain row slice"),
    pytest.param("r = df.head()", "df.head(5)", id="head default five"),
    pytest.param("r = df.tail(2)", "df.tail(2)", id="tail"),
    pytest.param('r = df.query("kg > 1 and grade == \'A\'")',
                 'df.filter((pl.col("kg") > 1) & (pl.col("grade") == "A"))', id="query and"),
    pytest.param('r = df.query("not kg > 1")', '~(pl.col("kg") > 1).fill_null(False)',
                 id="query not fills missing with False first"),
    pytest.param('r = df.query("kg != 4")', '(pl.col("kg") != 4).fill_null(True)',
                 id="query != is True for missing"),
    pytest.param('lim = 1\nr = df.query("kg > @lim")', 'pl.col("kg") > lim', id="query @variable"),
    pytest.param('r = df.query("`my col` == 2")', 'pl.col("my col") == 2', id="query backquotes"),
    pytest.param('r = df.query("1 < kg <= 4")', '(1 < pl.col("kg")) & (pl.col("kg") <= 4)',
                 id="query chained comparison"),
    pytest.param("r = list(df.columns)", "df.collect_schema().names()", id="columns from the schema"),
    pytest.param("r = len(df)", "df.select(pl.len()).collect().item()", id="len counts rows"),
    pytest.param("r = df.empty", "df.select(pl.len()).collect().item() == 0", id="empty"),
    pytest.param('r = df[df["grade"] != "A"]', 'pl.col("grade").ne_missing(pl.lit("A"))',
                 id="!= keeps missing rows"),
]


@pytest.mark.parametrize("before, expected", PORTS)
def test_ports(before: str, expected: str) -> None:
    check_ports(FRAME + before + "\n", expected)


TODOS = [
    pytest.param("r = df.iloc[-3:-1]", "frame.iloc", id="negative slice bounds"),
    pytest.param("r = df.iloc[0, 1]", "frame.iloc", id="one value by row and column position"),
    pytest.param("r = df.loc[[0, 2]]", "frame.loc", id="rows by a list of labels"),
    pytest.param("r = df.head(-2)", "frame.head", id="head negative"),
    pytest.param("r = df.tail(-2)", "frame.tail", id="tail negative"),
    pytest.param('r = df.query("grade.str.startswith(\'A\')")', "frame.query", id="query with a method"),
    pytest.param('r = df.query("index > 2")', "frame.query", id="query on the index"),
    pytest.param('r = df.query("kg > 1", engine="python")', "frame.query", id="query engine"),
    pytest.param("r = df.set_index(['grade', 'n'], drop=False)", "frame.set_index", id="set_index"),
]


@pytest.mark.parametrize("before, key", TODOS)
def test_todo(before: str, key: str) -> None:
    check_todo(FRAME + before + "\n", key)


def test_todo_iloc_column_position_computed_at_run_time() -> None:
    check_todo(FRAME + "i = len(df) % 3\nr = df.iloc[:, i]\n", "frame.iloc")


@pytest.mark.parametrize("expr", [
    "df.iloc[:, 0].tolist()",
    "df.iloc[:, -1].tolist()",
    "df.iloc[:, 1:3]",
    "df.iloc[:, ::2]",
    "df.iloc[:, -2:]",
    "df.iloc[2:, [3, 0]]",
    "df.iloc[:4, 1:]",
    "df[df.kg > 1].iloc[:, :2]",
    'df.groupby("grade").sum().iloc[:, 1:]',  # the key stays in the index, not counted
    'df.groupby("my col").agg(kg=("kg", "max"), n=("n", "min")).iloc[:, -1].to_frame()',
])
def test_iloc_column_positions_match_pandas(expr: str) -> None:
    result = differential(FRAME + f"result = {expr}\n")
    assert "TODO" not in result.converted_text


UNCHANGED = [
    pytest.param("rows = [3, 1, 2]\nfirst = rows[0:2]\n", id="list slice"),
    pytest.param("import collections\nq = collections.deque([1, 2])\nq.append(3)\n", id="deque"),
    pytest.param("class Shelf:\n    def head(self, n):\n        return n\n"
                 "    def query(self, text):\n        return text\n"
                 "s = Shelf()\nx = s.head(2)\ny = s.query('kg > 1')\n", id="head and query of another class"),
    pytest.param("import sqlite3\ncon = sqlite3.connect(':memory:')\ncur = con.execute('select 1')\n",
                 id="sqlite execute"),
]


@pytest.mark.parametrize("before", UNCHANGED)
def test_unchanged(before: str) -> None:
    check_unchanged("import pandas as pd\n" + before)


# -- differential ---------------------------------------------------------------------------

FRAMES = [
    pytest.param('df[df["kg"] > 1]', id="mask drops missing"),
    pytest.param("df[df.kg >= 4]", id="attribute mask with ties"),
    pytest.param('df[["grade", "kg"]]', id="columns in the asked order"),
    pytest.param('df[~(df["kg"] > 1)]', id="negated mask keeps missing"),
    pytest.param('df[df["grade"] != "A"]', id="!= keeps missing text"),
    pytest.param('df[df["kg"] > 100]', id="empty result"),
    pytest.param('df.loc[df["kg"] > 1, ["grade", "n"]]', id="loc mask and columns"),
    pytest.param('df.loc[df["kg"] > 1, "grade"]', id="loc mask and one column"),
    pytest.param('df.loc[~(df.kg > 1), ["grade"]]', id="loc negated mask"),
    pytest.param("df.iloc[1:3]", id="iloc slice"),
    pytest.param("df.iloc[-2:]", id="iloc tail"),
    pytest.param("df[2:]", id="slice open end"),
    pytest.param("df.head(2)", id="head"),
    pytest.param("df.head(0)", id="head zero"),
    pytest.param("df.tail(10)", id="tail longer than the frame"),
    pytest.param('df[df["kg"] > 1]["grade"].head(1)', id="column of a filtered frame"),
    pytest.param('df["kg"][df["n"] > 2]', id="series masked by another column"),
    pytest.param('df[df["kg"] > 1].iloc[1:]', id="slice after a filter"),
    pytest.param("df.query(\"kg > 1 and grade == 'A'\")", id="query and"),
    pytest.param("df.query(\"kg > 1 or grade == 'B'\")", id="query or"),
    pytest.param('df.query("not kg > 1")', id="query not with missing"),
    pytest.param('df.query("not (kg > 1 and n > 2)")', id="query not of and"),
    pytest.param('df.query("~(kg > 1)")', id="query tilde"),
    pytest.param("df.query(\"grade in ['A', 'B']\")", id="query in"),
    pytest.param("df.query(\"grade not in ['A', 'B']\")", id="query not in keeps missing"),
    pytest.param('df.query("kg != 4")', id="query != keeps missing"),
    pytest.param('df.query("kg != kg")', id="query NaN differs from itself"),
    pytest.param('df.query("1 < kg <= 4")', id="query chained"),
    pytest.param('df.query("n * 2 > kg")', id="query arithmetic"),
    pytest.param('df.query("`my col` == 2")', id="query backquoted name"),
    pytest.param("df.query(\"grade == 'Éclair'\")", id="query unicode"),
    pytest.param("df.query(\"kg > 1.0 and not grade in ['A']\")", id="query and not in"),
]


@pytest.mark.parametrize("expr", FRAMES)
def test_frame_matches_pandas(expr: str) -> None:
    differential(FRAME + f"result = {expr}\n")


def test_query_with_variables() -> None:
    differential(FRAME + """
lim = 1
names = ["A", "B"]
result = df.query("kg > @lim and grade in @names")
""")


def test_query_in_a_list_holding_none_matches_missing() -> None:
    # pandas' `in` matches a missing value against None in the list.
    differential(FRAME + """
names = ["A", None]
result = df.query("grade in @names")
other = df.query("grade not in @names")
""", "result", "other")


SCALARS = [
    pytest.param("list(df.columns)", id="columns"),
    pytest.param("df.shape", id="shape"),
    pytest.param("len(df)", id="len"),
    pytest.param('len(df[df.kg > 100])', id="len of empty"),
    pytest.param('len(df["kg"])', id="len of a column counts missing"),
    pytest.param("df.empty", id="empty false"),
    pytest.param("df[df.kg > 100].empty", id="empty true"),
    pytest.param("df.query(\"kg > 1\").shape", id="shape after query"),
]


@pytest.mark.parametrize("expr", SCALARS)
def test_scalar_matches_pandas(expr: str) -> None:
    differential(FRAME + f"result = {expr}\n")


def test_mask_held_in_a_variable() -> None:
    differential(FRAME + 'm = df["kg"] > 1\nresult = df[m]\nother = df[~m]\n', "result", "other")


def test_unicode_column_names_and_empty_frame() -> None:
    differential("""
        import pandas as pd
        df = pd.DataFrame({"Éclair": [1, 2], "ünï": ["a", "b"]})
        none = df[df["Éclair"] > 5]
        result = none[["ünï"]]
        count = len(none)
        """, "result", "count")


def test_shape_subscript() -> None:
    result = differential(FRAME + "result = df.shape[0]\nwidth = df.shape[1]\nlast = df.shape[-1]\n"
                          "empty = df[df['kg'] > 1e9].shape[0]\n", "result", "width", "last", "empty")
    assert "collect_schema" not in result.converted_text.splitlines()[-4]  # rows only


def test_series_taken_before_the_frame_is_filtered() -> None:
    differential(FRAME + """
s = df["n"]
df = df[df["n"] > 3]
result = s.sum()
""")


def test_site_confidence_for_an_unknown_column_variable() -> None:
    # A name porter cannot see is taken to hold one column name: it says so.
    result = convert(FRAME + "def pick():\n    return 'kg'\ncol = pick()\nr = df[df[col] > 1]\n")
    site = next(s for s in result.sites if s.key == "frame.getitem.column")
    assert site.confidence <= 0.85


# -- explode (I12) ----------------------------------------------------------------------------

# text split into lists: several parts, an empty string ([""]), missing values (None and NaN),
# an empty list (split() of ""), unicode, a trailing separator, a duplicate row
EXPLODE = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "job": ["J1", "J2", "J3", "J4", "J5", "J6", "J1"],
    "parts": ["bolt;nut", "", None, "nut", "é;ß;", np.nan, "bolt;nut"],
})
df["p"] = df["parts"].str.split(";")
df["q"] = df["parts"].str.split(";")
df["w"] = df["parts"].str.replace(";", " ").str.split()
"""


def test_explode_ports() -> None:
    check_ports(EXPLODE + 'r = df.explode("p")\n',
                'df.explode("p", empty_as_null=True, keep_nulls=True)')


@pytest.mark.parametrize("before, key", [
    pytest.param('r = df.explode("job")', "frame.explode", id="a column of text"),
])
def test_explode_todo(before: str, key: str) -> None:
    check_todo(EXPLODE + before + "\n", key)


@pytest.mark.parametrize("expr", [
    pytest.param('df.explode("p")', id="parts, empty string, missing"),
    pytest.param('df.explode("w")', id="empty lists give a missing row"),
    pytest.param('df.explode(["p", "q"])', id="two columns"),
    pytest.param('df.explode("p", ignore_index=True).reset_index()', id="ignore_index"),
    pytest.param('df.explode("p").reset_index()', id="labels repeat after explode"),
    pytest.param('df[df["job"] == "none"].explode("p")', id="empty frame"),
    pytest.param('df.explode("p")["p"].str.strip().str.len()', id="text after explode"),
])
def test_explode_matches_pandas(expr: str) -> None:
    # pandas is the reference implementation
    result = differential(EXPLODE + f"result = {expr}\n")
    assert "TODO(porter)" not in result.converted_text, result.converted_text


def test_explode_of_a_column_of_unknown_type_says_so() -> None:
    # a round trip through pandas (a row insert by position is not ported) loses the types
    source = EXPLODE + 'df.insert(0, "n", 1)\nr = df.explode("p")\n'
    site = next(s for s in convert(source).sites if s.key == "frame.explode")
    assert site.confidence == 0.95 and "lists" in site.message


@pytest.mark.parametrize("expr", [
    pytest.param('df["p"].explode()', id="series explode"),
    pytest.param('df["w"].explode(ignore_index=True)', id="series explode of empty lists"),
    pytest.param('df["parts"].str.split(";").explode().value_counts()', id="count the parts"),
    pytest.param('df["parts"].str.split(";").explode().str.len()', id="text after explode"),
])
def test_series_explode_matches_pandas(expr: str) -> None:
    # pandas is the reference implementation
    result = differential(EXPLODE + f"result = {expr}\n")
    assert "TODO(porter)" not in result.converted_text, result.converted_text


def test_series_explode_of_text_is_a_todo() -> None:
    check_todo(EXPLODE + 'r = df["job"].explode()\n', "series.explode")


@pytest.mark.parametrize("text", [
    pytest.param("d > '2024-01-15'", id="after a day"),
    pytest.param("'2024-01-31' <= d < '2024-02-29 23:59'", id="chained, text first, with a time"),
    pytest.param("d >= '2024-02-01' or v > 5", id="from midnight, or"),
    pytest.param("`d` < '2024-02'", id="backquoted, a month"),
])
def test_query_with_dates_written_as_text(text: str) -> None:
    # pandas reads the text as a date; Polars had refused to compare datetimes with text
    differential(f"""
import pandas as pd
df = pd.DataFrame({{"t": ["2024-01-31 18:00", "2024-02-01 00:00", "2023-12-31 00:00", None,
                          "2024-02-29 23:59"], "v": [1, 2, 3, 4, 6]}})
df["d"] = pd.to_datetime(df["t"])
result = df.query("{text}")
""")


@pytest.mark.parametrize("text", ["d == '2024-02-01'", "d != '2024-02-01 00:00'"])
def test_query_equal_to_a_date_written_as_text_is_a_todo(text: str) -> None:
    # pandas' query finds no date equal to the text (it compares the text itself)
    check_todo(f"""
import pandas as pd
df = pd.DataFrame({{"t": ["2024-02-01 00:00", None], "v": [1, 2]}})
df["d"] = pd.to_datetime(df["t"])
result = df.query("{text}")
""", "frame.query")


GROUPED = """
import numpy as np
import pandas as pd
df = pd.DataFrame({"kiln": ["a", "a", "b", None, "é"], "loss": [1.0, 2.0, 4.0, 8.0, np.nan],
                   "n": [1.25, 2.0, 3.0, 4.0, 5.5]})
"""


@pytest.mark.parametrize("statements", [
    pytest.param('s = df.groupby("kiln").agg({"loss": ["mean", "max"]})\n'
                 's.columns = ["_".join(c) for c in s.columns]', id="join MultiIndex pairs"),
    pytest.param('s = df.groupby("kiln").agg({"loss": ["mean", "max"], "n": "sum"})\n'
                 's.columns = [f"{a}_{b}" for a, b in s.columns]', id="unpack MultiIndex pairs"),
    pytest.param('s = df.groupby("kiln")["loss"].agg(["mean", "max"])\n'
                 's.columns = [c.upper() for c in s.columns]', id="keys stay out of the names"),
    pytest.param('s = df.groupby("kiln")[["loss"]].sum()\n'
                 's.columns = ["total_" + c for c in s.columns]', id="prefix every name"),
    pytest.param('s = df.groupby("kiln")[["loss", "n"]].mean()\n'
                 'for c in s.columns:\n    s[c] = s[c].round(1)', id="a loop over the columns"),
    pytest.param('s = df.groupby("kiln")[["loss", "n"]].mean()\ns.columns = ["a", "b"]',
                 id="a list of names for the columns only"),
])
def test_columns_of_a_grouped_frame(statements: str) -> None:
    # pandas' df.columns leaves out the keys it keeps in the index, and agg with lists gives
    # (column, function) pairs; porter had iterated Polars' names (keys included, flat)
    differential(GROUPED + statements + "\nresult = s\nnames = list(s.columns)\n"
                 "width = len(s.columns)\nshape = s.shape[1]\n", "result", "names", "width", "shape")


def test_columns_of_a_multiindex_frame_with_its_keys_back_is_a_todo() -> None:
    # pandas' columns are then ("kiln", ""), ("loss", "mean"), ...
    check_todo(GROUPED + 's = df.groupby("kiln").agg({"loss": ["mean", "max"]}).reset_index()\n'
               "names = list(s.columns)\n", "frame.columns")


@pytest.mark.parametrize("key", [
    pytest.param('[c for c in s.columns if c != "n"]', id="a comprehension over the names"),
    pytest.param("s.columns[:1]", id="a slice of the names"),
    pytest.param('["n", "loss"]', id="a list written out"),
])
def test_columns_chosen_by_a_list_built_from_the_names(key: str) -> None:
    # pandas keeps the keys in the index; the list had been taken for one column name
    differential(GROUPED + 's = df.groupby("kiln")[["loss", "n"]].mean()\n'
                 f"result = s[{key}]\nplain = df[{key.replace('s.columns', 'df.columns')}]\n",
                 "result", "plain")


def test_columns_of_a_grouped_frame_chosen_by_a_list_in_a_name() -> None:
    differential(GROUPED + 's = df.groupby("kiln")[["loss", "n"]].mean()\ncols = ["n"]\n'
                 "result = s[cols]\n")


# -- a True/False column as a query condition ----------------------------------------------------

QUERY_CONDITIONS = [
    pytest.param('df.query("sold and kg > 1")', id="column and comparison"),
    pytest.param('df.query("kg > 1 and sold")', id="comparison and column"),
    pytest.param('df.query("sold or kg > 1")', id="column or comparison with missing kg"),
    pytest.param('df.query("not sold")', id="not column"),
    pytest.param('df.query("not sold and grade == \'A\'")', id="not column and comparison"),
    pytest.param('df.query("sold")', id="bare column"),
    pytest.param('df.query("`is sold` and n > 2")', id="backquoted column"),
    pytest.param('df.query("not (sold or kg > 1)")', id="not of or with missing kg"),
    pytest.param('df[df["n"] > 100].query("sold and kg > 1")', id="empty frame"),
]


@pytest.mark.parametrize("expr", QUERY_CONDITIONS)
def test_query_with_a_condition_column_matches_pandas(expr: str) -> None:
    differential(FRAME + 'df["sold"] = df["n"] % 2 == 0\ndf["is sold"] = df["grade"] == "A"\n'
                 f"result = {expr}\n")


def test_query_condition_column_ports() -> None:
    check_ports(FRAME + 'df["sold"] = df["n"] > 2\nr = df.query("sold and kg > 0")\n',
                'df.filter(pl.col("sold") & (pl.col("kg") > 0))')


def test_query_number_column_as_a_condition_is_a_todo() -> None:
    check_todo(FRAME + 'r = df.query("n and kg > 0")\n', "frame.query")


def test_query_condition_column_read_without_types(tmp_path, monkeypatch) -> None:
    # True/False with a blank: an object column in pandas, whose missing value `and`/`or` take
    # as False; porter does not know the type without --data (0.9)
    monkeypatch.chdir(tmp_path)
    (tmp_path / "d.csv").write_text("k,ok,v\na,True,1.5\nb,,0\nc,,\nd,False,0\né,True,\nf,False,2\n")
    found = differential('import pandas as pd\nd = pd.read_csv("d.csv")\n'
                         'result = d.query("ok and v > 0")\nother = d.query("ok or v > 0")\n',
                         "result", "other")
    sites = [s for s in found.sites if s.key == "frame.query"]
    assert sites and all(s.status == "converted" and s.confidence == 0.9 for s in sites)


# -- column names renamed with string methods -------------------------------------------------

NAMES_FRAME = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({
    " Site Name ": ["Kai", None, "Ünï"],
    "Visit  Date\\x1f": [1.5, np.nan, None],
    "COUNT": [1, 2, 2],
    "lot.no": ["a", "b", "c"],
})
"""

RENAMES = [
    pytest.param('df.rename(columns=lambda c: c.strip().lower().replace(" ", "_"))', id="rename lambda"),
    pytest.param("df.rename(columns=lambda c: c.upper())", id="rename lambda upper"),
    pytest.param('df.rename(lambda col: col.rstrip().replace(".", "_", 1), axis=1)', id="rename mapper axis 1"),
    pytest.param('df.rename(columns=lambda c: c.removeprefix(" "))', id="rename lambda removeprefix"),
]


@pytest.mark.parametrize("expr", RENAMES)
def test_rename_function_matches_pandas(expr: str) -> None:
    differential(NAMES_FRAME + f"result = {expr}\n")


SET_NAMES = [
    pytest.param('df.columns.str.strip().str.lower().str.replace(" ", "_")', id="strip lower replace"),
    pytest.param('df.columns.str.replace(".", "_")', id="replace is not a pattern"),
    pytest.param('df.columns.str.strip(" S")', id="strip characters"),
    pytest.param("df.columns.str.rstrip().str.upper()", id="rstrip upper"),
]


@pytest.mark.parametrize("expr", SET_NAMES)
def test_set_columns_from_string_methods_matches_pandas(expr: str) -> None:
    found = differential(NAMES_FRAME + f"df.columns = {expr}\nresult = df\n")
    assert "collect_schema" not in found.converted_text  # the names are computed by porter


def test_names_from_string_methods_on_an_empty_frame() -> None:
    differential('import pandas as pd\ndf = pd.DataFrame({" A b ": [], "C": []})\n'
                 'df.columns = df.columns.str.strip().str.replace(" ", "_")\n'
                 "other = df.rename(columns=lambda c: c.lower())\nresult = df\n", "result", "other")


def test_names_from_string_methods_without_known_columns(tmp_path, monkeypatch) -> None:
    # without --data: the same Python methods at run time; rename takes the lambda itself
    monkeypatch.chdir(tmp_path)
    (tmp_path / "d.csv").write_text(" Site Name ,Visit  Date,lot.no\nKai,1.5,a\n,,b\n")
    found = differential('import pandas as pd\nd = pd.read_csv("d.csv")\n'
                         'result = d.rename(columns=lambda c: c.strip().lower().replace(" ", "_"))\n'
                         "other = d.copy()\n"
                         'other.columns = other.columns.str.strip().str.replace(".", "_")\n',
                         "result", "other")
    assert 'rename(lambda c: c.strip().lower().replace(" ", "_"))' in found.converted_text
    assert '[c.strip().replace(".", "_") for c in' in found.converted_text


NAME_TODOS = [
    pytest.param("df.rename(columns=lambda c: c.swapcase())", "frame.rename", id="a method porter does not read"),
    pytest.param("df.rename(columns=str.swapcase)", "frame.rename", id="a function by name porter does not read"),
    pytest.param('df.rename(columns=lambda c: c.replace(" ", ""))', "frame.rename",
                 id="new names repeat a name"),
]


@pytest.mark.parametrize("before, key", NAME_TODOS)
def test_names_from_string_methods_todo(before: str, key: str) -> None:
    check_todo(NAMES_FRAME.replace('"lot.no"', '"Site Name"') + "result = " * before.startswith("df.r")
               + before + "\n", key)


@pytest.mark.parametrize("names", [
    # pandas lower-cases "İ" to "i", Python to "i̇"; "ß" upper-cased, a pattern, accents
    pytest.param('df.columns = df.columns.str.lower()', id="lower of İ"),
    pytest.param('df.columns = df.columns.str.upper().str.strip()', id="upper of ß"),
    pytest.param('df.columns = df.columns.str.replace("[()€ ]", "", regex=True)', id="a pattern"),
    pytest.param('df.columns = df.columns.str.lower().str.replace(r"[^a-z]+", "_", regex=True).str.strip("_")',
                 id="a pattern after lower"),
])
def test_names_porter_knows_are_computed_by_pandas(names: str) -> None:
    # pandas' own Index.str methods compute the new names at conversion (the columns known)
    result = differential('import pandas as pd\n'
                          'df = pd.DataFrame({"İd": [1], "Maß (€)": [2.5], " Größe ": ["x"]})\n'
                          + names + "\nresult = df\n")
    assert not [s for s in result.sites if s.status == "todo"], result.converted_text


def test_names_a_pattern_makes_alike_are_a_todo() -> None:
    check_todo('import pandas as pd\ndf = pd.DataFrame({"a.b": [1], "a_b": [2]})\n'
               'df.columns = df.columns.str.replace(".", "_", regex=False)\n',
               "frame.columns.str.replace")


def test_a_pattern_on_names_porter_does_not_know_is_a_todo(tmp_path, monkeypatch) -> None:
    monkeypatch.chdir(tmp_path)
    (tmp_path / "d.csv").write_text(" Site Name ,lot.no\nKai,a\n")
    check_todo('import pandas as pd\ndf = pd.read_csv("d.csv")\n'
               'df.columns = df.columns.str.replace(".", "_", regex=True)\n',
               "frame.columns.str.replace")


def test_rename_lambda_with_arguments_python_refuses_is_a_todo() -> None:
    text = convert(NAMES_FRAME + 'r = df.rename(columns=lambda c: c.replace(None, "_"))\n').converted_text
    assert "# TODO(porter): frame.rename" in text


@pytest.mark.parametrize("expr", [
    pytest.param('df.columns.str.startswith(" ")', id="another Index.str method"),
    pytest.param('df.columns.str.strip().str.contains("o")', id="another method after one porter computes"),
])
def test_other_index_str_methods_stay_pandas(expr: str) -> None:
    found = differential(NAMES_FRAME + f"result = [bool(x) for x in {expr}]\n")
    assert "frame.columns.index" in found.converted_text


def test_two_counts_of_one_frame_are_one_select() -> None:
    # len(df) - df["k"].nunique(): both counted in one plan run, the integers as pandas'
    result = differential(FRAME + 'result = len(df) - df["grade"].nunique() * 2\n')
    assert result.converted_text.count(".collect()") == 1, result.converted_text


# -- df[names] where the list of names is built when the script runs ---------------------------

NAME_LISTS = [
    pytest.param('keep = [c for c in df.columns if c != "grade"]\nresult = df[keep]',
                 id="a comprehension over the names"),
    pytest.param('keep = ["n"]\nkeep.append("kg")\nresult = df[keep]', id="append"),
    pytest.param('keep = ["n"]\nkeep += ["kg"]\nresult = df[keep]', id="augmented with a list"),
    pytest.param('keep = list(df.columns)\nkeep.remove("grade")\nresult = df[keep]', id="remove"),
    pytest.param('keep = [c for c in ["n", "kg"] if c != "kg"]\nresult = df[keep]',
                 id="one name left: still a frame"),
    pytest.param("result = df[sorted(df.columns)]", id="sorted names written in the key"),
    pytest.param('result = df[list(df.columns[:2]) + ["n"]]', id="a slice of the names plus a list"),
    pytest.param('keep = sorted(df.columns, reverse=True)\nresult = df[keep]',
                 id="sorted names in a variable, their order kept"),
]


@pytest.mark.parametrize("code", NAME_LISTS)
def test_list_of_names_built_at_run_time_selects_a_frame(code: str) -> None:
    result = differential(FRAME + code + "\n")
    assert ".alias(" not in result.converted_text


def test_reduction_of_columns_chosen_by_a_comprehension() -> None:
    # pandas gives one value per column; porter must not collect them as one item
    differential(FRAME + 'qcols = [c for c in df.columns if c in ("kg", "n")]\n'
                 "result = df[qcols].mean().round(2).to_dict()\n"
                 "width = df[qcols].shape[1]\n", "result", "width")


def test_a_name_holding_a_list_and_one_name_elsewhere_is_a_todo() -> None:
    result = convert(FRAME + 'key = "n"\nif len(df) > 3:\n    key = ["n", "kg"]\n'
                     "result = df[key]\n")
    assert "TODO(porter): frame.getitem.column" in result.converted_text


def test_for_loop_over_a_frame_iterates_its_column_names() -> None:
    result = differential(FRAME + "result = []\nfor col in df:\n    result.append(col)\n"
                          "totals = {}\nfor c in df[df['n'] > 2]:\n"
                          "    totals[c] = int(df[c].count())\n", "result", "totals")
    assert "TODO" not in result.converted_text


def test_names_chosen_by_a_mask_of_the_names_select_those_columns() -> None:
    # pandas' Index.str.startswith makes a boolean array, which indexes pandas' Index of the
    # names (porter's names are a Python list, which it cannot index)
    differential(FRAME + 'result = df[df.columns[df.columns.str.startswith("g")]]\n'
                 'other = df[df.columns[df.columns.str.contains("n")]]\n', "result", "other")


def test_columns_of_a_table_on_an_integer_key_are_integers(tmp_path) -> None:
    # pandas labels a crosstab / unstack on an int key with the ints (10 > 9), Polars with
    # their text ("9" > "10"): sorted, max, formats and selections by them as pandas has them
    from support import same_text
    same_text("""
        import pandas as pd
        df = pd.read_csv("kiln.csv")
        c = pd.crosstab(df["kiln"], df["week"])
        c = c[sorted(c.columns, reverse=True)]
        c.to_csv("out_c.csv")
        print(max(c.columns), list(c.columns))
        keep = [w for w in c.columns if w > 5]
        c[keep].to_csv("out_keep.csv")
        for w in c.columns:
            print(w, c[w].sum())
        u = df.groupby(["kiln", "week"])["fires"].sum().unstack(fill_value=0)
        u.columns = [f"wk{w:02d}" for w in u.columns]
        u.reset_index().to_csv("out_u.csv", index=False)
        """, tmp_path, {"kiln.csv": "kiln,week,fires\nK1,2,1\nK1,10,4\nK2,2,3\nK2,9,5\n"})


def test_printed_dtypes_are_pandas_type_names(tmp_path) -> None:
    # pandas prints int64 / str / datetime64[us], not Polars' schema
    from support import same_text
    same_text("""
        import pandas as pd
        df = pd.read_csv("kiln.csv", parse_dates=["day"])
        print(df.dtypes)
        print(df[["kiln", "fires"]].dtypes)
        """, tmp_path, {"kiln.csv": "kiln,day,fires,temp\nK1,2024-01-02,1,\nK2,,3,2.5\n"})
