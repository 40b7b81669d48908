"""Rule cases and differential checks for porter/rules/rows.py (drop_duplicates, sort_values,
nlargest/nsmallest, reset_index, isin, between, replace).

pandas is the reference implementation: every differential check runs the snippet with pandas
and its conversion with Polars and compares what they computed.
"""

from __future__ import annotations

import pytest

from rule_checks import check_ports, check_todo, check_unchanged
from support import convert, differential, same_text

# Duplicate keys, ties in v, NaN and None together in text and numbers, unicode text.
FRAME = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "k": ["b", "a", None, "b", "a", np.nan, "Éclair"],
    "v": [3.0, 1.0, np.nan, 3.0, None, 2.0, 1.0],
    "n": [1, 2, 3, 4, 5, 6, 7],
})
"""

# -- ports ----------------------------------------------------------------------------------

PORTS = [
    pytest.param('r = df.drop_duplicates(subset=["k"])', 'df.unique("k", keep="first", maintain_order=True)',
                 id="drop_duplicates keeps the first in order"),
    pytest.param('r = df.drop_duplicates(subset="k", keep=False)', 'keep="none"', id="keep=False"),
    pytest.param('r = df.sort_values("v")', 'df.pipe(pandas_sort_values, "v")',
                 id="one number key in pandas' quicksort order"),
    pytest.param('r = df.sort_values("v", ascending=False)', 'df.pipe(pandas_sort_values, "v", descending=True)',
                 id="one number key descending"),
    pytest.param('r = df.sort_values("v", kind="stable")', 'df.sort("v", nulls_last=True, maintain_order=True)',
                 id="kind=stable keeps Polars' stable sort"),
    pytest.param('r = df.sort_values("v", ascending=False, kind="mergesort")',
                 'df.sort("v", descending=True, nulls_last=True, maintain_order=True)', id="kind=mergesort"),
    pytest.param('r = df["v"].sort_values()', 'df.pipe(pandas_sort_values, pl.col("v")).select(pl.col("v"))',
                 id="series sort in pandas' order"),
    pytest.param('r = df.sort_values(["k", "v"], ascending=[True, False])', "descending=[False, True]",
                 id="ascending list"),
    pytest.param('r = df.sort_values("v", na_position="first")', "nulls_last=False", id="na_position first"),
    pytest.param('r = df.nlargest(3, "v")', 'df.sort("v", descending=True, nulls_last=True, maintain_order=True).head(3)',
                 id="nlargest keeps ties in order"),
    pytest.param('r = df.groupby("k")["v"].sum().reset_index()', '.drop("_porter_rows_in_key_order").sort("k")',
                 id="reset_index after groupby: keys are columns"),
    pytest.param("r = df.reset_index()", 'df.with_row_index("index").with_columns(pl.col("index").cast(pl.Int64))',
                 id="reset_index of fresh labels"),
    pytest.param('r = df[df.v > 1].reset_index(drop=True)', "r = df.filter(pl.col(\"v\") > 1)\n",
                 id="reset_index drop after a filter is nothing"),
    pytest.param('df["r"] = df["k"].isin(["a", None])', 'is_in(["a", None], nulls_equal=True)',
                 id="None in the list matches missing text"),
    pytest.param('df["r"] = df["v"].isin([1.0, np.nan])', "nulls_equal=True", id="NaN in the list"),
    pytest.param('df["r"] = df["v"].isin([1.0, None])', 'pl.col("v").is_in([1.0, None]).fill_null(False)',
                 id="None does not match a missing number"),
    pytest.param('df["r"] = df["v"].between(1, 3, inclusive="neither")', 'is_between(1, 3, closed="none")',
                 id="between inclusive neither"),
    pytest.param('r = df.replace("a", "A")', 'pl.selectors.string().replace("a", "A")', id="frame replace text"),
]


@pytest.mark.parametrize("before, expected", PORTS)
def test_ports(before: str, expected: str) -> None:
    check_ports(FRAME + before + "\n", expected)


TODOS = [
    pytest.param('r = df.nlargest(2, "v", keep="last")', "frame.nlargest", id="nlargest keep last"),
    pytest.param('r = df.nlargest(2, ["v", "n"], keep="all")', "frame.nlargest", id="nlargest keep all on two columns"),
    pytest.param('r = df.sort_values("v", key=np.abs)', "frame.sort_values",
                 id="sort key other than a lambda"),
    pytest.param('r = df.sort_values("v", key=lambda s: s.values)', "frame.sort_values",
                 id="sort key giving no column"),
    pytest.param('r = df.replace({"k": {"a": "A"}})', "frame.replace", id="nested replace dict"),
    pytest.param('s2 = df["n"].replace(1, "one")', "series.replace", id="replace with another type"),
    pytest.param("r = df.replace(np.nan, 0)", "frame.replace",
                 id="frame replace NaN also fills the text columns (object in pandas)"),
    pytest.param('r = df.sort_values("v", kind="stable").sort_index()', "frame.sort_index",
                 id="sort_index of original row numbers"),
]


@pytest.mark.parametrize("before, key", TODOS)
def test_todo(before: str, key: str) -> None:
    check_todo(FRAME + before + "\n", key)


def test_third_reset_index_is_a_todo() -> None:
    # pandas raises (columns "index" and "level_0" exist): the line stays pandas'
    text = convert(FRAME + "r = df.reset_index().reset_index().reset_index()\n").converted_text
    assert "# TODO(porter): frame.reset_index" in text


UNCHANGED = [
    pytest.param("xs = [3, 1, 2]\nxs.sort()\nys = sorted(xs, reverse=True)\n", id="list sort"),
    pytest.param("text = 'a-b'\nclean = text.replace('-', '_')\n", id="str replace"),
    pytest.param("import heapq\ntop = heapq.nlargest(2, [3, 1, 2])\n", id="heapq nlargest"),
    pytest.param("class Range:\n    def between(self, a, b):\n        return a < b\n"
                 "    def isin(self, xs):\n        return False\n"
                 "r = Range()\nx = r.between(1, 2)\ny = r.isin([1])\n", id="between and isin of another class"),
]


@pytest.mark.parametrize("before", UNCHANGED)
def test_unchanged(before: str) -> None:
    check_unchanged("import pandas as pd\n" + before)


# -- differential ---------------------------------------------------------------------------

FRAMES = [
    pytest.param('df.drop_duplicates(subset=["k"])', id="drop_duplicates first with None and NaN"),
    pytest.param('df.drop_duplicates(subset="k", keep="last")', id="drop_duplicates last"),
    pytest.param('df.drop_duplicates(subset=["k"], keep=False)', id="drop_duplicates keep False"),
    pytest.param('df.drop_duplicates(subset=["k", "v"])', id="drop_duplicates two columns"),
    pytest.param('df.drop_duplicates(subset=["v"], keep=False)', id="drop_duplicates NaN equals None"),
    pytest.param("df.drop_duplicates()", id="drop_duplicates whole rows"),
    pytest.param('df.drop_duplicates(keep="last")', id="drop_duplicates whole rows last"),
    pytest.param('df.drop_duplicates(subset=["k", "v"], keep="last")', id="drop_duplicates two columns last"),
    pytest.param('df.drop_duplicates(subset="v", keep="last")', id="drop_duplicates last NaN equals None"),
    pytest.param('df[df["v"] > 1].drop_duplicates(["k"], keep="last")', id="drop_duplicates last after filter"),
    pytest.param('df[df["v"] > 99].drop_duplicates(["k"], keep="last")', id="drop_duplicates last of empty"),
    pytest.param('df.sort_values("v", kind="stable")', id="sort ties stable"),
    pytest.param('df.sort_values("v", ascending=False, kind="stable")', id="sort descending NaN last"),
    pytest.param('df.sort_values(["k", "v"], ascending=[True, False])', id="sort ascending list"),
    pytest.param('df.sort_values("v", na_position="first", kind="stable")', id="sort na first"),
    pytest.param('df.sort_values(by="k", kind="stable")', id="sort text with None and unicode"),
    pytest.param('df.sort_values(["v", "n"], ascending=False, na_position="first")', id="sort two keys na first"),
    pytest.param('df["v"].sort_values(kind="stable")', id="series sort"),
    pytest.param('df.nlargest(3, "v")', id="nlargest ties"),
    pytest.param('df.nsmallest(3, "v")', id="nsmallest ties"),
    pytest.param('df.nlargest(6, "v")', id="nlargest appends NaN rows"),
    pytest.param('df.nsmallest(2, ["v", "n"])', id="nsmallest two columns"),
    pytest.param('df["v"].nlargest(2)', id="series nlargest"),
    pytest.param('df["v"].nsmallest(3)', id="series nsmallest"),
    pytest.param('df.groupby("k")["v"].sum().reset_index()', id="reset_index after groupby"),
    pytest.param('df.groupby("k").v.sum().reset_index(name="total")', id="reset_index name"),
    pytest.param('df.groupby("k").size().reset_index(name="c")', id="size reset_index"),
    pytest.param('df.groupby("k")["v"].sum().reset_index(drop=True)', id="series reset_index drop"),
    pytest.param("df.reset_index()", id="reset_index fresh labels"),
    pytest.param("df.reset_index().reset_index()", id="second reset_index names level_0"),
    pytest.param("df.head(3).reset_index()", id="reset_index after head"),
    pytest.param("df.reset_index(drop=True)", id="reset_index drop"),
    pytest.param("df[df.v > 1].reset_index(drop=True)", id="reset_index drop after filter"),
    pytest.param('df.sort_values("v", kind="stable").reset_index(drop=True)', id="reset_index drop after sort"),
    pytest.param('df.assign(r=df["k"].isin(["a", "b"]))', id="isin text with missing"),
    pytest.param('df.assign(r=df["k"].isin(["a", None]))', id="isin None in list text"),
    pytest.param('df.assign(r=df["v"].isin([1.0, np.nan]))', id="isin NaN in list"),
    pytest.param('df.assign(r=df["v"].isin([1.0, None]))', id="isin None in list numbers"),
    pytest.param('df.assign(r=~df["k"].isin(["a"]))', id="not isin keeps missing"),
    pytest.param('df.assign(r=df["n"].isin(["1", 2]))', id="isin text never equals a number"),
    pytest.param('df.assign(r=df["k"].isin([1, "a"]))', id="isin number never equals a text"),
    pytest.param('df.assign(r=df["v"].isin(["3.0"]))', id="isin only texts in a number column"),
    pytest.param('df[df["k"].isin(["a"])]', id="isin as a mask"),
    pytest.param('df[~df["v"].isin([3.0])]', id="not isin as a mask"),
    pytest.param('df.assign(r=df["n"].isin(df["v"]))', id="isin an int column in a float column"),
    pytest.param('df[df["v"].isin(df["n"])]', id="isin a float column in an int column"),
    pytest.param('df.assign(r=df["n"].isin(df[df["n"] > 2]["v"]))',
                 id="isin a float column of other rows"),
    pytest.param('df.assign(r=df["v"].between(1, 3))', id="between both"),
    pytest.param('df.assign(r=df["v"].between(1, 3, inclusive="neither"))', id="between neither"),
    pytest.param('df.assign(r=df["v"].between(1, 3, inclusive="left"))', id="between left"),
    pytest.param('df.assign(r=df["v"].between(1, 3, inclusive="right"))', id="between right"),
    pytest.param('df.assign(r=~df["v"].between(1, 2))', id="not between keeps missing"),
    pytest.param('df.assign(r=df["k"].replace("a", "A"))', id="replace scalar text"),
    pytest.param('df.assign(r=df["k"].replace({"a": "A", "b": "B"}))', id="replace dict text"),
    pytest.param('df.assign(r=df["v"].replace(3.0, 30.0))', id="replace scalar float"),
    pytest.param('df.assign(r=df["v"].replace({1.0: 10.0, 3.0: np.nan}))', id="replace dict to NaN"),
    pytest.param('df.assign(r=df["n"].replace(1, 2.5))', id="replace int with fraction"),
    pytest.param('df.assign(r=df["n"].replace(1.0, 5))', id="replace float key in int column"),
    pytest.param('df.assign(r=df["k"].replace("a", None))', id="replace with None"),
    pytest.param('df.assign(r=df["v"].replace(np.nan, 0))', id="replace NaN"),
    pytest.param('df.replace("a", "A")', id="frame replace text"),
    pytest.param('df.replace({"a": "A"})', id="frame replace dict"),
    pytest.param("df.replace(3.0, 0)", id="frame replace number"),
    pytest.param("df.replace(1, 100)", id="frame replace int"),
    pytest.param("df.replace(1, 2.5)", id="frame replace int with fraction"),
    pytest.param("df.replace(np.nan, -1)", id="frame replace NaN with text columns"),
    pytest.param("df.replace(2.5, 0)", id="frame replace a fraction no integer equals"),
    pytest.param("df[['n', 'v']].replace({1.5: 0, 3: 30})", id="frame replace a fraction and a whole number"),
    pytest.param('df.assign(r=df["n"].replace(2.5, 0))', id="replace a fraction in an int column"),
    pytest.param('df.assign(r=df["n"].replace({1.5: 0, 3: 30}))',
                 id="replace a fraction and a whole number in an int column"),
    pytest.param('df.assign(r=df["v"].replace({1: 10, 2.5: 20}))', id="replace whole and fractional keys in a float column"),
    pytest.param('df.assign(r=df["v"].replace({3.0: 10.5, 1: 20}))', id="replace with a fraction and a whole number"),
    pytest.param('df.assign(r=df["n"].replace({2.0: 20, 3: 30}))', id="replace whole float keys in an int column"),
    pytest.param('df[["v", "n"]].replace(np.nan, 0)', id="frame replace NaN of number columns"),
]


@pytest.mark.parametrize("expr", FRAMES)
def test_frame_matches_pandas(expr: str) -> None:
    differential(FRAME + f"result = {expr}\n")


ISIN_NUMBERS = [
    pytest.param('df["n"].isin([3.0, 5.0])', id="integral floats in an int column"),
    pytest.param('df["n"].isin([33, 7.0])', id="int and float mixed in an int column"),
    pytest.param('df["n"].isin([3.5, 4.0, np.nan])', id="fraction and NaN in an int column"),
    pytest.param('df["n"].isin([2.5])', id="only a fraction in an int column"),
    pytest.param('df["n"].isin([True])', id="True is 1 in an int column"),
    pytest.param('df["v"].isin([3, 7])', id="ints in a float column"),
    pytest.param('df["v"].isin([1, np.nan])', id="int and NaN in a float column"),
    pytest.param('df["n"] > 2).isin([1]', id="1 is True in a bool column"),
]


@pytest.mark.parametrize("expr", ISIN_NUMBERS)
def test_isin_numbers_of_another_type_match_pandas(expr: str) -> None:
    # pandas compares numbers by value (3.0 == 3, True == 1); Polars refuses a list of another
    # numeric type
    differential(FRAME + f"df['r'] = ({expr})\nresult = df\n")


def test_isin_floats_on_a_column_of_unknown_type(tmp_path, monkeypatch) -> None:
    # without --data the column may be integer or float: compared as floats
    (tmp_path / "d.csv").write_text("lot,n,f\nL1,3,3.0\nL2,4,\nL3,,7.5\nL4,7,33\n")
    monkeypatch.chdir(tmp_path)
    result = differential("""
import pandas as pd
df = pd.read_csv("d.csv")
df["a"] = df["n"].isin([3.0, 5.0])
df["b"] = df["f"].isin([33, 7.5])
df["c"] = df["n"].isin([33, 7.0])
result = df
""")
    assert 'pl.col("n").cast(pl.Float64).is_in([3.0, 5.0])' in result.converted_text


def test_drop_duplicates_last_on_columns_of_unknown_names(tmp_path, monkeypatch) -> None:
    # without --data the names are not known: the row number is left out by a selector
    (tmp_path / "d.csv").write_text("lot,n\nL1,3\nL2,\nL1,3\n,4\nL2,\n,4\nL3,1\n")
    monkeypatch.chdir(tmp_path)
    result = differential("""
import pandas as pd
df = pd.read_csv("d.csv")
result = df.drop_duplicates(keep="last")
lots = df.drop_duplicates("lot", keep="last")
""", "result", "lots")
    assert 'pl.selectors.exclude("__row")' in result.converted_text


def test_drop_duplicates_last_of_named_columns_is_a_filter(tmp_path, monkeypatch) -> None:
    # the last row of each key kept in place by a filter (is_last_distinct): no numbering of
    # the rows, no unordered unique, no sort back (seven times faster on a million rows)
    (tmp_path / "d.csv").write_text("lot,n\nL1,3\nL2,\nL1,3\n,4\nL2,\n,4\nL3,1\nÉ1,2\n")
    monkeypatch.chdir(tmp_path)
    result = differential("""
import pandas as pd
df = pd.read_csv("d.csv")
lots = df.drop_duplicates("lot", keep="last")
pairs = df.drop_duplicates(["lot", "n"], keep="last")
""", "lots", "pairs")
    assert '.filter(pl.col("lot").is_last_distinct())' in result.converted_text
    assert '.filter(pl.struct("lot", "n").is_last_distinct())' in result.converted_text
    assert "__row" not in result.converted_text


def test_isin_whole_numbers_on_a_column_of_unknown_type_is_lowered() -> None:
    result = convert('import pandas as pd\ndf = pd.read_csv("d.csv")\nr = df[df["n"].isin([3, 5])]\n')
    site = next(s for s in result.sites if s.key == "series.isin")
    assert site.confidence <= 0.95 and "float column" in site.message


def test_isin_with_a_variable_list_holding_none() -> None:
    differential(FRAME + 'vals = ["a", None]\nresult = df[df["k"].isin(vals)]\nother = df[~df["k"].isin(vals)]\n',
                 "result", "other")


def test_empty_frame() -> None:
    differential(FRAME + """
none = df[df["n"] > 100]
result = none.sort_values("v").drop_duplicates(subset=["k"]).nlargest(2, "v")
flags = none.assign(r=none["v"].between(1, 2), s=none["k"].isin(["a"]))
""", "result", "flags")


def test_single_key_sort_is_not_lowered() -> None:
    # pandas_sort_values gives pandas' own order: the site keeps full confidence
    site = next(s for s in convert(FRAME + 'r = df.sort_values("v")\n').sites if s.key == "frame.sort_values")
    assert site.confidence == 1.0


def test_category_key_keeps_the_stable_sort_and_says_why() -> None:
    # pandas sorts a categorical's codes with numpy's quicksort, which porter does not redo
    result = convert(FRAME + 'df["c"] = df["k"].astype("category")\nr = df.sort_values("c")\n')
    site = next(s for s in result.sites if s.key == "frame.sort_values")
    assert "pandas_sort_values" not in result.converted_text
    assert site.confidence < 1.0 and "tied rows" in site.message


# 300 rows with many ties: numpy's quicksort (pandas' default for one key) does not keep tied
# rows in their order beyond 16 values. k: whole numbers 0..5; x: whole numbers with missing
# values (floats in pandas); f: fractions with missing values; ok: True/False; s: a group.
def _ties_csv() -> str:
    lines = ["id,k,x,f,ok,s,day"]
    for i in range(300):
        r = (i * 2654435761) % 2**32
        x = "" if r % 11 == 0 else str(r % 7)
        f = "" if r % 13 == 0 else f"{(r >> 8) % 4 / 4 - 0.5}"
        lines.append(f"{i},{(r >> 4) % 6},{x},{f},{r % 3 == 0},{'abc'[(r >> 12) % 3]},"
                     f"2024-03-{(r >> 16) % 4 + 1:02d}")
    return "\n".join(lines) + "\n"


TIES = [
    pytest.param('df.sort_values("k", ascending=False).head(5)', id="top 5 of many ties"),
    pytest.param('df.sort_values("k", ascending=False).drop_duplicates("s")', id="best row per group"),
    pytest.param('df.sort_values("k").drop_duplicates("s", keep="last")', id="ascending keep last"),
    pytest.param('df.sort_values("k").head(40)', id="ascending head"),
    pytest.param('df.sort_values("x", na_position="first").head(60)', id="ints with missing first"),
    pytest.param('df.sort_values("x", ascending=False).drop_duplicates("s")', id="ints with missing descending"),
    pytest.param('df.sort_values("x", ascending=False, na_position="first").head(60)',
                 id="ints with missing descending first"),
    pytest.param('df.sort_values("f").head(60)', id="floats with missing"),
    pytest.param('df.sort_values("f", ascending=False, na_position="first").head(60)',
                 id="floats descending missing first"),
    pytest.param('df.sort_values("ok", ascending=False).drop_duplicates("s")', id="true/false key"),
    pytest.param('df.sort_values(by=["k"], ascending=[False]).head(10)', id="one key in lists"),
    pytest.param('df.sort_values("k", ascending=False).groupby("s").head(2)', id="groupby head after sort"),
    pytest.param('df.sort_values("k", ascending=False).groupby("s", as_index=False).first()',
                 id="groupby first after sort"),
    pytest.param('df.groupby("k", as_index=False)["f"].sum().sort_values("f", ascending=False)',
                 id="sort after a groupby's sorted keys"),
    pytest.param('df.sort_values("id", ascending=False).sort_values("k").head(40)', id="sort after a sort"),
    pytest.param('df.sort_values(["k", "x"], ascending=[False, True]).head(30)', id="two keys: stable lexsort"),
    pytest.param('df.sort_values("s").head(30)', id="text key: stable in pandas 3"),
    pytest.param('df.sort_values("k", kind="stable").head(30)', id="kind stable"),
    pytest.param('df.nlargest(10, "k")', id="nlargest keeps the first ties"),
    pytest.param('df.nsmallest(10, "x")', id="nsmallest keeps the first ties"),
]


@pytest.mark.parametrize("known", [True, False], ids=["types known", "types unknown"])
@pytest.mark.parametrize("expr", TIES)
def test_single_key_sort_orders_ties_as_pandas(expr: str, known: bool, tmp_path, monkeypatch) -> None:
    (tmp_path / "scores.csv").write_text(_ties_csv())
    monkeypatch.chdir(tmp_path)
    options = {"data_dir": str(tmp_path)} if known else {}
    differential(f'import pandas as pd\ndf = pd.read_csv("scores.csv")\nresult = {expr}\n', **options)


GROUPED_SORTS = [
    pytest.param('df.groupby("k").size().sort_values(ascending=False).head(10).reset_index(name="n")',
                 id="group sizes largest first"),
    pytest.param('df.groupby("k")["v"].sum().sort_values().reset_index()', id="group sums ascending"),
    pytest.param('df.groupby("k", as_index=False)["v"].sum().sort_values("v", ascending=False).head(15)',
                 id="frame of group sums"),
]


@pytest.mark.parametrize("expr", GROUPED_SORTS)
def test_sort_of_group_results_orders_ties_as_pandas(expr: str, tmp_path, monkeypatch) -> None:
    # 60 groups whose sizes and sums tie often: sorted after the groupby's sorted keys
    rows = [((i * 2654435761) % 2**32) for i in range(400)]
    (tmp_path / "g.csv").write_text("k,v\n" + "".join(f"{r % 60},{(r >> 8) % 5}\n" for r in rows))
    monkeypatch.chdir(tmp_path)
    differential(f'import pandas as pd\ndf = pd.read_csv("g.csv")\nresult = {expr}\n')


def test_sort_by_dates_orders_ties_as_pandas(tmp_path, monkeypatch) -> None:
    # pandas sorts datetime64 values with numpy's quicksort too (another tie order than for ints)
    (tmp_path / "scores.csv").write_text(_ties_csv())
    monkeypatch.chdir(tmp_path)
    differential('import pandas as pd\ndf = pd.read_csv("scores.csv", parse_dates=["day"])\n'
                 'result = df.sort_values("day", ascending=False).drop_duplicates("s")\n'
                 'first = df.sort_values("day").head(40)\n', "result", "first",
                 data_dir=str(tmp_path))


def test_sort_key_of_a_computed_series_orders_ties_as_pandas() -> None:
    # NaN made by a computation (not a missing value in Polars) is missing to pandas; -0.0 ties
    # 0.0 (1 / the value shows which zero came first, also in a sorted Series)
    differential("""\
import numpy as np
import pandas as pd
df = pd.DataFrame({"id": list(range(40)), "a": [0.0, -1.0, 2.0, 1.0, 0.0] * 8, "b": [0.0, 1.0, -1.0, 0.0] * 10})
df["r"] = df["a"] / df["b"]
df["z"] = df["a"] * -0.0
result = df.sort_values("r", ascending=False)
zeros = df.sort_values("z").head(20)
signs = 1 / df["z"].sort_values(ascending=False)
""", "result", "zeros", "signs")


@pytest.mark.parametrize("step", [
    pytest.param("r = df[df.v > 1].reset_index()", id="reset_index after a filter"),
    pytest.param('r = df.sort_values("v").reset_index()', id="reset_index after a sort"),
    pytest.param('r = df["v"].reset_index()', id="series labels as a column"),
])
def test_row_labels_read_after_a_filter_or_sort_are_pandas_row_numbers(step: str) -> None:
    # pandas keeps the original row numbers as labels, which reset_index() brings back: porter
    # numbers the rows before the filter or sort (the frame's columns are known from the
    # script) and carries the number; once TODOs, checked against pandas now
    result = differential(FRAME + step + "\n", "r")
    assert not [s for s in result.sites if s.status == "todo"], result.converted_text


@pytest.mark.parametrize("expr", [
    pytest.param('df[df["k"].isin(other["k"])]', id="isin another frame's column"),
    pytest.param('df[~df["k"].isin(other["k"])]', id="not isin another frame's column"),
    pytest.param('df[df["k"].isin(df["j"])]', id="isin a column of the same frame"),
])
def test_isin_a_series_matches_pandas(expr: str) -> None:
    # pandas is the reference: membership in the other Series' values, missing matches missing
    differential("""
import numpy as np
import pandas as pd
df = pd.DataFrame({"k": ["a", None, "b", "é", "c"], "j": ["b", "x", None, "c", "y"]})
other = pd.DataFrame({"k": ["b", None, "é", "b"]})
""" + f"result = {expr}\n")


DATED = """\
import pandas as pd
df = pd.DataFrame({"t": ["2024-01-31 18:00", "2024-02-01 00:00", "2023-12-31 00:00", None, "2024-02-29 23:59",
                         "2024-01-01 00:00"], "v": [1, 2, 3, 4, 5, 6]})
df["d"] = pd.to_datetime(df["t"])
"""


@pytest.mark.parametrize("bounds", [
    pytest.param('"2024-01-01", "2024-01-31"', id="days: the 31st at 18:00 is after the bound"),
    pytest.param('"2024-01-01", "2024-02-01 00:00", inclusive="left"', id="a time, inclusive left"),
    pytest.param('"2024-01", "2024-02"', id="months"),
    pytest.param('pd.Timestamp("2024-01-01"), "2024-02-29"', id="a Timestamp and a text"),
])
def test_between_dates_written_as_text(bounds: str) -> None:
    # pandas reads the text as dates; Polars had refused to compare datetimes with text
    differential(DATED + f'result = df[df["d"].between({bounds})]\n')


# -- series.rank --------------------------------------------------------------------------------

RANK_FRAME = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "k": ["b", "a", None, "b", "a", np.nan, "Éclair", "é", "z"],
    "v": [3.0, 1.0, np.nan, 3.0, None, 2.0, 1.0, 7.0, 3.0],
    "n": [1, 2, 3, 4, 5, 6, 7, 1, 9],
    "ok": [True, False, True, True, False, True, False, True, True],
})
"""

RANKS = [
    pytest.param('df["v"].rank()', id="average with ties NaN and None"),
    pytest.param('df["v"].rank(pct=True)', id="average pct"),
    pytest.param('df["v"].rank(method="min", ascending=False)', id="min descending"),
    pytest.param('df["v"].rank(method="max", pct=True)', id="max pct"),
    pytest.param('df["v"].rank(method="first")', id="first numbers ties in order"),
    pytest.param('df["v"].rank(method="first", ascending=False)', id="first descending"),
    pytest.param('df["v"].rank(method="dense", pct=True)', id="dense pct over the highest rank"),
    pytest.param('df["n"].rank(method="dense", ascending=False, pct=True)', id="int dense descending pct"),
    pytest.param('df["n"].rank(pct=True)', id="int average pct"),
    pytest.param('df["k"].rank(method="min")', id="text with unicode and missing"),
    pytest.param('df["ok"].rank()', id="booleans"),
]


@pytest.mark.parametrize("expr", RANKS)
def test_series_rank_matches_pandas(expr: str) -> None:
    differential(RANK_FRAME + f"df['r'] = {expr}\nresult = df\n")


@pytest.mark.parametrize("mask", [
    pytest.param('df["n"] > 3', id="a filtered frame"),
    pytest.param('df["n"] > 100', id="an empty frame"),
])
def test_series_rank_of_a_filtered_frame_matches_pandas(mask: str) -> None:
    differential(RANK_FRAME + f"d = df[{mask}].copy()\n"
                 "d['r'] = d['v'].rank(pct=True)\nd['m'] = d['k'].rank(method='dense', ascending=False)\n"
                 "result = d\n")


def test_series_rank_ports() -> None:
    check_ports(RANK_FRAME + 'df["r"] = df["v"].rank(method="min", ascending=False, pct=True)\n',
                'pandas_div(pl.col("v").rank("min", descending=True).cast(pl.Float64), pl.col("v").count())')


@pytest.mark.parametrize("before", [
    pytest.param('df["r"] = df["v"].rank(na_option="bottom")', id="na_option bottom"),
    pytest.param('df["r"] = df["k"].astype("category").rank()', id="categories"),
])
def test_series_rank_todo(before: str) -> None:
    check_todo(RANK_FRAME + before + "\n", "series.rank")


# -- duplicated ---------------------------------------------------------------------------------

@pytest.mark.parametrize("snippet", [
    # None and NaN keys count as one value, as pandas counts them
    'result = df[df.duplicated(subset=["k"])]',
    'result = df[df.duplicated(subset="k", keep="last")]',
    'result = df[df.duplicated(["k", "v"], keep=False)]',
    'result = df[~df.duplicated(["k", "v"])]',
    'result = df.assign(dup=df.duplicated())',
    'result = int(df.duplicated(subset=["v"]).sum())',
    'result = df["k"].duplicated().tolist()',
    'result = df[df["v"].duplicated(keep=False)]',
    'result = df[df["k"].duplicated(keep="last")]["n"].tolist()',
    'result = df[df["n"] > 100].duplicated().sum()',
])
def test_duplicated_matches_pandas(snippet: str) -> None:
    result = differential(FRAME + snippet + "\n")
    assert not result.todos, result.converted_text


def test_duplicated_of_a_whole_frame_needs_its_columns() -> None:
    text = check_ports(FRAME + 'r = df.duplicated()\n', "pl.struct(pl.col(\"k\"), pl.col(\"v\"), pl.col(\"n\"))")
    assert ".is_first_distinct().not_()" in text


def test_a_series_reset_without_a_name_has_the_integer_label_0() -> None:
    # pandas labels the values column with the integer 0: read by [0], listed as 0
    source = '''
import pandas as pd
df = pd.DataFrame({"k": ["a", "b", "a", None], "v": [1, 2, 3, 4]})
d3 = df.groupby("k").size().reset_index()
top = d3[0].max()
cols = d3.columns.tolist()
'''
    differential(source, "top", "cols")


def test_replace_with_nan_in_an_int_column_is_float_once_filled(tmp_path) -> None:
    # pandas makes the int column float64 once a value is replaced by NaN, and it stays
    # float after fillna: -1.0 / 8.0, not -1 / 8
    from support import same_text
    same_text("""
        import numpy as np
        import pandas as pd
        df = pd.read_csv("hives.csv")
        r = df["frames"].replace(0, np.nan)
        df["r_lbl"] = r.fillna(-1).astype(str)
        df["r_f"] = df["frames"].replace({0: np.nan}).fillna(0)
        df.to_csv("out.csv", index=False)
        """, tmp_path, {"hives.csv": "hive,frames\nH1,0\nH2,8\nH3,5\nH4,0\n"})


def test_isin_of_another_frames_column_is_a_list_to_polars() -> None:
    # Polars 2 deprecates is_in(<a Series of the column's own type>): the values go as one list
    import warnings
    with warnings.catch_warnings():
        warnings.simplefilter("error", DeprecationWarning)
        result = differential("""
import pandas as pd
loans = pd.DataFrame({"member": ["m1", "m2", None, "m4"], "days": [3, 5, 2, 9]})
members = pd.DataFrame({"member_no": ["m1", "m4", None]})
result = loans[~loans["member"].isin(members["member_no"])]
""")
    assert ".to_series().implode()" in result.converted_text


@pytest.mark.parametrize("expr", ['df["ok"].replace({1: 0})', 'df["ok"].replace(1, 0)',
                                  'df["n"].replace({True: 9, "1": 8, 2.0: 7})'])
def test_replace_keys_of_another_kind_match_nothing(expr) -> None:
    # pandas compares the keys with the column's own type (1 is not True, "1" is not 1); Polars
    # cast 1 to True and replaced every True
    differential(f"""
import pandas as pd
df = pd.DataFrame({{"ok": [True, False, True], "n": [1, 2, 0]}})
df["r"] = {expr}
result = df
""")


def test_replace_with_none_in_a_number_column_is_a_todo(tmp_path) -> None:
    # pandas 3 makes an object column of the ints and None ([3, None, 2], written 3); Polars'
    # Int64 with nulls is what porter reads as pandas' float64 (written 3.0, [3.0, nan, 2.0])
    check_todo(FRAME + 's = df["n"].replace(0, None)\nresult = s.tolist()\n', "series.replace")
    check_todo(FRAME + 's = df["n"].replace({0: None})\n', "series.replace")
    same_text("""
        import pandas as pd
        df = pd.read_csv("orchard.csv")
        s = df["apples"].replace(0, None)
        print(s.tolist(), s.dtype)
        t = df["tree"].replace("B", None)
        print(t.tolist())
    """, tmp_path, {"orchard.csv": "tree,apples\nA,3\nB,0\nC,2\nD,0\n"})
