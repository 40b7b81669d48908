"""pd.DataFrame / pd.Series from Python values. Reference: pandas 3.1 itself (each differential
case runs the snippet with pandas and the conversion with Polars and compares the tables, and
the column types where pandas' type shows in the written output)."""

from __future__ import annotations

import pytest
import pandas as pd
import polars as pl

from support import convert, differential, run

PORTS = [
    pytest.param('result = pd.DataFrame({"a": [1, 2, 3], "b": ["x", None, "ü"]})', id="dict of lists"),
    pytest.param('result = pd.DataFrame({"a": [1, None, 3]})', id="int with a missing value is float"),
    pytest.param('result = pd.DataFrame({"a": [1, 2.5, np.nan], "b": [np.nan, np.nan, np.nan]})',
                 id="int and float, NaN only"),
    pytest.param('result = pd.DataFrame({"k": ["a", "b"], "n": 0})', id="a single value broadcast"),
    pytest.param('result = pd.DataFrame({"a": [1, 2], "b": [3, 4]}, columns=["b", "a"])',
                 id="columns= reorders a dict"),
    pytest.param('result = pd.DataFrame([{"a": 1, "b": "x"}, {"b": "y", "c": 2.5}])',
                 id="list of dicts: union of keys, missing ones missing"),
    pytest.param('result = pd.DataFrame([[2.0, 1.0], [3.0, np.nan], [1.0, 0.0]], columns=list("AB"))',
                 id="list of lists with columns"),
    pytest.param('result = pd.DataFrame([(1, "x"), (2, "y")], columns=["n", "s"])', id="list of tuples"),
    pytest.param('result = pd.DataFrame([[1, 2], [3, 4], [5, 6]])', id="rows without columns"),
    pytest.param('result = pd.DataFrame([1, 2, 3])', id="a list of values is one column"),
    pytest.param('result = pd.DataFrame(np.arange(12).reshape(3, 4), columns=list("abcd"))',
                 id="a 2-D array"),
    pytest.param('result = pd.DataFrame(np.arange(4.0))', id="a 1-D array"),
    pytest.param('data = {"a": [1, 2]}\ndata["b"] = [3.5, None]\nresult = pd.DataFrame(data)',
                 id="a dict built at run time"),
    pytest.param('result = pd.DataFrame({"a": []})', id="an empty column is float"),
    pytest.param('result = pd.DataFrame({"flag": [True, False]})', id="booleans"),
    pytest.param('result = pd.DataFrame([])', id="an empty list"),
    pytest.param('result = pd.DataFrame([], columns=["a", "b"])', id="no rows, named columns"),
    pytest.param('result = pd.DataFrame([("é", 1.5), ("ü", None)], columns=["k", "v"])',
                 id="tuples with unicode and a missing value"),
    pytest.param('result = pd.Series([1, None, 3], name="kg").to_frame()', id="Series with a name"),
    pytest.param('s = pd.Series(["x", "y", None])\nresult = s.str.upper().to_frame()', id="Series without a name"),
    pytest.param('result = pd.Series([1.5, 2.5, np.nan]).sum()', id="Series reduction"),
    pytest.param('result = pd.Series({"a": 1, "b": 2, "Ü": None}).reset_index()',
                 id="Series of a dict: its keys are the labels"),
    pytest.param('s = pd.Series({"x": 1.5, "y": np.nan}, name="w")\nresult = (s * 2).to_frame().reset_index()',
                 id="Series of a dict, named"),
    pytest.param('result = pd.Series({"x": 3, "y": 1}).sort_values().reset_index()',
                 id="Series of a dict, sorted"),
]


@pytest.mark.parametrize("body", PORTS)
def test_literal_frames_match_pandas(body):
    result = differential("import pandas as pd\nimport numpy as np\n" + body)
    assert not result.todos, result.converted_text


@pytest.mark.parametrize("body", [
    'result = pd.DataFrame({"a": [1, None, 3]})',
    'result = pd.DataFrame([[1, None], [None, 4]], columns=["x", "y"])',
    'result = pd.DataFrame([{"a": 1}, {"a": None}])',
    'result = pd.DataFrame({"a": [1, 2.5]})',
])
def test_integer_columns_with_missing_values_are_float_as_in_pandas(body):
    source = "import pandas as pd\n" + body + "\n"
    expected = run(source)["result"]
    actual = run(convert(source).converted_text)["result"].collect()
    assert all(str(t) == "float64" for t in expected.dtypes)
    assert all(t == pl.Float64 for t in actual.dtypes)


TODOS = [
    pytest.param('result = pd.DataFrame({"A": ["a", 1, 2, 3]})', "mixes int, str", id="text and numbers"),
    pytest.param('result = pd.DataFrame({"A": [True, None]})', "True/False with missing", id="bool with None"),
    pytest.param('result = pd.DataFrame({"A": [None, None]})', "only None", id="None only"),
    pytest.param('result = pd.DataFrame({1: [10], 2: [20]})', "not text", id="number labels"),
    pytest.param('result = pd.DataFrame({"country": ["X", ["A", "B"]]})', "mixes list, str",
                 id="list cells mixed with text"),
    pytest.param('result = pd.DataFrame({"a": [1]}, index=["x"])', "index=", id="index"),
    pytest.param('result = pd.DataFrame([[1, 2], [3]])', "different lengths", id="ragged rows"),
    pytest.param('result = pd.DataFrame({"a": 1, "b": 2})', "single values", id="scalars only"),
    pytest.param('result = pd.DataFrame({"a": [1]}, columns=["a", "b"])', "not in the data",
                 id="columns= names a missing key"),
    pytest.param('result = pd.Series([1, 2], index=[10, 20])', "index=", id="Series with index"),
    pytest.param('s = pd.Series(range(3))', "run time", id="Series of computed values"),
    pytest.param('result = pd.DataFrame({"a": [1, 2]}, dtype=float)', "dtype=", id="dtype"),
    pytest.param('result = pd.DataFrame(columns=["a", "b"])', "empty DataFrame", id="columns only"),
    pytest.param('result = pd.DataFrame({"a": pd.Series([1, 2]), "b": pd.Series(["x", None])})',
                 "another pandas object", id="dict of Series"),
]


@pytest.mark.parametrize(("body", "reason"), TODOS)
def test_object_columns_and_labels_are_todos(body, reason):
    result = convert("import pandas as pd\n" + body + "\n")
    todo, = [s for s in result.todos if s.key in ("pd.DataFrame", "pd.Series")]
    assert reason in todo.message
    try:
        run("import pandas as pd\n" + body + "\n")
    except ValueError:  # pandas itself refuses: the code under the TODO refuses alike
        with pytest.raises(ValueError):
            run(result.converted_text)
        return
    run(result.converted_text)  # the pandas code under the TODO still runs


def test_rows_without_columns_say_the_labels_become_text():
    result = convert("import pandas as pd\nresult = pd.DataFrame([[1, 2]])\n")
    site, = [s for s in result.sites if s.key == "pd.DataFrame"]
    assert site.confidence == 0.9 and "text" in site.message


def test_a_frame_of_rows_is_not_transposed():
    # the shape pandas gives, (3, 2), not Polars' column reading of the same lists (2, 3)
    source = "import pandas as pd\nresult = pd.DataFrame([[2.0, 1.0], [3.0, 4.0], [1.0, 0.0]], columns=['A', 'B'])\n"
    assert run(source)["result"].shape == (3, 2)
    assert run(convert(source).converted_text)["result"].collect().shape == (3, 2)


def test_list_cells_keep_their_values():
    source = ("import pandas as pd\nimport numpy as np\n"
              "result = pd.DataFrame({'c': [['A', 'B'], ['C'], []], 'n': [[1.5], [np.nan, 2.0], [3.0]]})\n")
    result = convert(source)
    site, = [s for s in result.sites if s.key == "pd.DataFrame"]
    assert site.status == "converted" and site.confidence == 0.9
    expected = run(source)["result"]
    actual = run(result.converted_text)["result"].collect()
    assert [list(v) for v in expected["c"]] == actual["c"].to_list()
    nan_as_none = [[None if x != x else x for x in v] for v in expected["n"]]
    assert nan_as_none == actual["n"].to_list()


def test_a_literal_changed_in_place_is_not_a_constant():
    source = ("import pandas as pd\ncols = ['a']\ncols.append('b')\n"
              "result = pd.DataFrame([[1, 2]], columns=cols)\n")
    differential(source)


def test_a_dict_of_series_kept_on_pandas_gives_pandas_frame():
    # the Series are ported, then handed over (unnamed Series without a name) to the pandas
    # constructor under the TODO: the frame pandas builds is the same
    differential("import pandas as pd\ns1 = pd.Series([1, 2, 3], name='kg')\n"
                 "s2 = pd.Series(['x', 'ü', None])\n"
                 "result = pd.DataFrame({'a': s1, 'b': s2, 'c': s2.str.upper()})\n")


def test_a_frame_from_a_dict_of_grouped_series_keeps_their_labels(tmp_path, monkeypatch):
    # pandas is the reference: Series put into a dict in a loop are lined up on their labels
    # (the weeks), which become the frame's index; from_pandas would have numbered the rows
    monkeypatch.chdir(tmp_path)
    (tmp_path / "t.csv").write_text("wk,ship,tons\n4,aa,1\n5,aa,2\n5,bb,3\n7,bb,4\n",
                                    encoding="utf-8")
    differential("""
import pandas as pd
p = pd.read_csv("t.csv")
res = {}
for ship in ["aa", "bb"]:
    sub = p[p["ship"] == ship]
    res[ship] = sub.groupby("wk")["tons"].sum()
wide = pd.DataFrame(res).fillna(0)
result = wide.reset_index()
""", data_dir=str(tmp_path))


def test_a_literal_holding_aggregates_of_a_frame_computes_them(tmp_path):
    """The values written inside a literal frame or Series (`df["fish"].max()`, `df.shape[1]`)
    are computed from the converted frame, never left as pandas code on a LazyFrame."""
    from support import same_text
    same_text('''
        import pandas as pd
        df = pd.read_csv("aq.csv")
        res = pd.DataFrame({"stat": ["max", "mean"], "value": [df["fish"].max(), df["fish"].mean()]})
        res.to_csv("res.csv", index=False)
        pd.DataFrame([{"k": "all", "v": df["fish"].sum()}]).to_csv("r2.csv", index=False)
        n = len(df)
        r3 = pd.DataFrame({"metric": ["rows", "cols"],
                           "value": [n, df.shape[1]]})
        r3.to_csv("r3.csv", index=False)
        tot = pd.Series({"sales": df["sales"].sum(), "cost": df["cost"].sum()})
        print(tot)
        print(pd.Series([df["fish"].min(), df["sales"].max()], name="x"))
    ''', tmp_path, {"aq.csv": "tank,fish,sales,cost\nT1,3,1.5,2.0\nT2,-1,10.25,5.0\nT3,7,9.0,5.0\n"})


def test_a_frame_built_from_run_time_data_converts_the_same_twice() -> None:
    # the first pass writes pl.from_pandas(pd.DataFrame(...)) laid out over several lines; a
    # second pass keeps it as it is (it added a TODO there)
    source = ('import numpy as np\nimport pandas as pd\ndf = pd.DataFrame(\n'
              '    {"group_label": list("ab" * 2), "delta": np.arange(4).astype("timedelta64[ns]"), '
              '"kg_landed": np.arange(4) * 1.5}\n)\nr = df.groupby("group_label").kg_landed.count()\n')
    once = convert(source).converted_text
    assert "TODO" not in once and "pl.from_pandas(" in once
    assert convert(once).converted_text == once
