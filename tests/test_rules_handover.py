"""Hand-overs to pandas: plotting and writers Polars lacks (porter/rules/handover.py,
mappings/handover.toml, and frame.to_excel / frame.to_sql in mappings/io.toml).

Rule cases check the converted text. Differential cases run each snippet with pandas — the
reference implementation — and its conversion, and compare what reaches pandas: for plots,
through a plotting backend that records the data instead of drawing it (no matplotlib
needed); for to_sql, by reading the table back.
"""

from __future__ import annotations

import ast
import datetime as dt
import sys
import textwrap
import types

from hypothesis import HealthCheck, given, settings, strategies as st
import numpy as np
import pandas as pd
import polars as pl
import pytest

from porter.rules.handover import TEXT_DEFINITION, TEXT_FUNCTION

from rule_checks import check_todo, check_unchanged
from support import convert, differential

FRAME = '''
import sqlite3
import numpy as np
import pandas as pd
df = pd.DataFrame({"k": ["b", "a", None, "é", "a"], "v": [1.5, np.nan, 3.0, 4.0, 0.5]})
con = sqlite3.connect(":memory:")
'''


def last_statement(source: str) -> str:
    """The converted form of the last statement's expression, laid out on one line."""
    text = convert(FRAME + textwrap.dedent(source)).converted_text
    return ast.unparse(ast.parse(text).body[-1].value)


def one_line(code: str) -> str:
    """`code` (an expression written over several lines for reading) on one line."""
    return ast.unparse(ast.parse(f"({code.strip()})", mode="eval"))


def sites(source: str, key: str):
    result = convert(FRAME + textwrap.dedent(source))
    return [s for s in result.sites if s.key == key], result


# -- rule cases ---------------------------------------------------------------------------------

PORTS = [
    pytest.param('df.plot(kind="bar", x="k", y="v")',
                 'df.collect().to_pandas().plot(kind="bar", x="k", y="v")',
                 "frame.plot", id="df.plot(...)"),
    pytest.param('ax = df.plot.line(title="kg")',
                 'df.collect().to_pandas().plot.line(title="kg")',
                 "frame.plot", id="df.plot.<kind>(...)"),
    pytest.param('df["v"].plot()',
                 'df.select(pl.col("v")).collect().to_series().to_pandas().plot()',
                 "series.plot", id="series plot"),
    pytest.param('df.groupby("k")["v"].sum().plot(kind="bar")',
                 '''df.with_columns(_porter_rows_in_key_order=pl.col("k").is_sorted()).drop_nulls("k")
                    .group_by("k").agg(pl.col("v"), pl.col("_porter_rows_in_key_order").first())
                    .with_columns(pandas_group_sums(pl.col("v"), in_key_order=pl.col("_porter_rows_in_key_order")))
                    .drop("_porter_rows_in_key_order").sort("k").collect()
                    .to_pandas().set_index("k")["v"].plot(kind="bar")''',
                 "series.plot", id="grouped series keeps its index on the x axis"),
    pytest.param('df.groupby("k").agg(total=("v", "sum")).plot.barh()',
                 '''df.with_columns(_porter_rows_in_key_order=pl.col("k").is_sorted()).drop_nulls("k")
                    .group_by("k").agg(pl.col("v").alias("total"), pl.col("_porter_rows_in_key_order").first())
                    .with_columns(pandas_group_sums(pl.col("total"), in_key_order=pl.col("_porter_rows_in_key_order")))
                    .drop("_porter_rows_in_key_order")
                    .sort("k").collect().to_pandas().set_index("k").plot.barh()''',
                 "frame.plot", id="grouped frame keeps its index on the x axis"),
    pytest.param('df.hist(column="v", bins=3)',
                 'df.select("v").collect().to_pandas().hist(column="v", bins=3)',
                 "frame.hist", id="df.hist"),
    pytest.param('ax = None\ndf.boxplot(column="v", by="k", ax=ax)',
                 'df.collect().to_pandas().boxplot(column="v", by="k", ax=ax)',
                 "frame.boxplot", id="df.boxplot"),
    pytest.param('df["v"].hist(bins=[0, 2, 4])',
                 'df.select(pl.col("v")).collect().to_series().to_pandas().hist(bins=[0, 2, 4])',
                 "series.hist", id="series hist"),
    pytest.param('df[df["v"] > 1].hist("v")',
                 'df.filter(pl.col("v") > 1).collect().to_pandas().hist("v")',
                 "frame.hist", id="hist after a filter: values only"),
    pytest.param('df.hist(column=df.columns[0])',
                 'df.collect().to_pandas().hist(column=df.collect_schema().names()[0])',
                 "frame.hist", id="arguments computed by porter"),
    pytest.param('df.to_excel("out.xlsx", sheet_name="data", index=False)',
                 'df.collect().to_pandas().to_excel("out.xlsx", sheet_name="data", index=False)',
                 "frame.to_excel", id="to_excel"),
    pytest.param('df.groupby("k").agg(total=("v", "sum")).to_excel("totals.xlsx")',
                 '''df.with_columns(_porter_rows_in_key_order=pl.col("k").is_sorted()).drop_nulls("k")
                    .group_by("k").agg(pl.col("v").alias("total"), pl.col("_porter_rows_in_key_order").first())
                    .with_columns(pandas_group_sums(pl.col("total"), in_key_order=pl.col("_porter_rows_in_key_order")))
                    .drop("_porter_rows_in_key_order")
                    .sort("k").collect().to_pandas().set_index("k").to_excel("totals.xlsx")''',
                 "frame.to_excel", id="to_excel writes the grouped index"),
    pytest.param('df[df["v"] > 1].to_sql("t", con, index=False)',
                 'df.filter(pl.col("v") > 1).collect().to_pandas().to_sql("t", con, index=False)',
                 "frame.to_sql", id="to_sql index=False after a filter"),
    pytest.param('df.to_sql("t", con, if_exists="replace")',
                 'df.collect().to_pandas().to_sql("t", con, if_exists="replace")',
                 "frame.to_sql", id="to_sql with labels 0..n-1"),
]


@pytest.mark.parametrize(("source", "expected", "key"), PORTS)
def test_hand_over(source: str, expected: str, key: str) -> None:
    assert last_statement(source) == one_line(expected)
    found, result = sites(source, key)
    assert [(s.status, s.confidence) for s in found] == [("handover", 1.0)]
    assert "TODO(porter)" not in result.converted_text


LOWERED = [
    pytest.param('df.sort_values("v").plot()', "frame.plot", id="frame plot after a sort"),
    pytest.param('df[df["v"] > 1]["v"].plot()', "series.plot", id="series plot after a filter"),
]


@pytest.mark.parametrize(("source", "key"), LOWERED)
def test_plot_of_changed_labels_is_lowered(source: str, key: str) -> None:
    found, _ = sites(source, key)
    assert [(s.status, s.confidence) for s in found] == [("handover", 0.8)]
    assert "row labels" in found[0].message


def test_writing_changed_labels_is_a_todo() -> None:
    # pandas writes the labels left by the sort; the TODO output still runs
    check_todo(FRAME + 'df.sort_values("v").to_sql("t", con)\n', "frame.to_sql")
    found, _ = sites('df.sort_values("v").to_sql("t", con)\n', "frame.to_sql")
    assert "index=True" in found[0].message


def test_excel_of_changed_labels_is_a_todo() -> None:
    found, result = sites('df[df["v"] > 1].to_excel("out.xlsx")\n', "frame.to_excel")
    assert [s.status for s in found] == ["todo"]
    assert "# TODO(porter): frame.to_excel: index=True" in result.converted_text


UNCHANGED = [
    pytest.param('''
        class Chart:
            def plot(self, kind):
                return kind
        chart = Chart()
        chart.plot(kind="bar")
        ''', id="plot of something that is not a frame"),
    pytest.param('''
        import pandas as pd
        import numpy as np
        counts = np.histogram([1, 2, 2], bins=2)
        ''', id="histogram of a list"),
]


@pytest.mark.parametrize("source", UNCHANGED)
def test_unchanged(source: str) -> None:
    check_unchanged(source)


# -- differential: pandas is the reference implementation -------------------------------------

def _seen(data: pd.DataFrame | pd.Series, **_: object) -> pd.DataFrame:
    """What pandas was asked to draw, with its row labels as a column (so they are compared:
    a line or bar plot draws against them)."""
    frame = data.to_frame() if isinstance(data, pd.Series) else data
    return frame.reset_index()


def _seen_values(data: pd.DataFrame | pd.Series, column: object = None, by: object = None,
                 **_: object) -> pd.DataFrame:
    """What pandas was asked to draw, values only: histograms and box plots ignore labels.
    With column= (and by=) pandas reads those columns of the frame, nothing else."""
    frame = data.to_frame() if isinstance(data, pd.Series) else data
    if column is not None and isinstance(data, pd.DataFrame):
        named = [*([column] if isinstance(column, str) else column),
                 *([by] if isinstance(by, str) else by or [])]
        frame = frame[named]
    return frame.reset_index(drop=True)


RECORDER = types.ModuleType("porter_recording_plot_backend")
RECORDER.plot = _seen  # type: ignore[attr-defined]
RECORDER.hist_frame = _seen_values  # type: ignore[attr-defined]
RECORDER.hist_series = _seen_values  # type: ignore[attr-defined]
RECORDER.boxplot_frame = _seen_values  # type: ignore[attr-defined]


@pytest.fixture
def recording_backend(monkeypatch: pytest.MonkeyPatch):
    """A pandas plotting backend that returns the data it receives instead of drawing."""
    monkeypatch.setitem(sys.modules, RECORDER.__name__, RECORDER)
    with pd.option_context("plotting.backend", RECORDER.__name__):
        yield


PLOTS = {
    "frame plot": 'result = df.plot(kind="bar", x="k", y="v")',
    "frame plot accessor": 'result = df.plot.line()',
    "series plot": 'result = df["v"].plot()',
    "grouped series": 'result = df.groupby("k")["v"].sum().plot(kind="bar")',
    "grouped frame": 'result = df.groupby("k").agg(total=("v", "sum"), n=("v", "count")).plot.barh()',
    "frame hist": 'result = df.hist(column="v", bins=3)',
    "frame hist after a filter": 'result = df[df["v"] > 1].hist()',
    "frame boxplot": 'result = df.boxplot(column="v", by="k")',
    "series hist": 'result = df["v"].hist(bins=2)',
    "empty frame": 'result = df[df["v"] > 100].plot()',
    "merged frame": '''
        names = pd.DataFrame({"k": ["a", "é"], "name": ["Ann", "Élise"]})
        result = df.merge(names, on="k", how="left").plot(x="name", y="v")
    ''',
}


@pytest.mark.parametrize("source", list(PLOTS.values()), ids=list(PLOTS))
def test_plotted_data_matches_pandas(source: str, recording_backend: None) -> None:
    differential(FRAME + textwrap.dedent(source))


def test_plot_after_a_sort_differs_in_its_labels(recording_backend: None) -> None:
    # why the site is lowered to 0.8: pandas plots against the old labels (1, 0, 2, ...)
    with pytest.raises(AssertionError, match="row 0 differs"):
        differential(FRAME + 'result = df.sort_values("v").plot()\n')


SQL = {
    "plain frame, labels written": 'df.to_sql("t", con)',
    "index=False": 'df.to_sql("t", con, index=False)',
    "after a filter, index=False": 'df[df["v"] > 1].to_sql("t", con, index=False)',
    "grouped frame writes its index": 'df.groupby("k").agg(total=("v", "sum")).to_sql("t", con)',
    "empty frame": 'df[df["v"] > 100].to_sql("t", con, index=False)',
}


@pytest.mark.parametrize("source", list(SQL.values()), ids=list(SQL))
def test_to_sql_matches_pandas(source: str) -> None:
    differential(FRAME + source + '\nresult = pd.read_sql("select * from t", con)\n')


def test_to_excel_matches_pandas(tmp_path, monkeypatch: pytest.MonkeyPatch) -> None:
    pytest.importorskip("openpyxl")
    monkeypatch.chdir(tmp_path)
    differential(FRAME + 'df.groupby("k").agg(total=("v", "sum")).to_excel("out.xlsx")\n'
                 'result = pd.read_excel("out.xlsx")\n')


@pytest.mark.parametrize("use", [
    'list(df["v"])', 'max(df["v"].fillna(0))', 'min(df["v"], default=0)',
    'sum(df["v"].fillna(0))', 'list(df)', 'sorted(df["k"].dropna())',
])
def test_a_builtin_without_a_rule_is_given_the_series_as_pandas_has_it(use):
    # max(df["v"]) under a TODO: the Series goes to pandas, never a subscripted LazyFrame
    differential(FRAME + textwrap.dedent(f"""
        df["w"] = df["v"] * 2
        result = {use}
    """))


TEXT_FRAME = '''
import pandas as pd
df = pd.DataFrame({"k": ["b", "a", "ø", None], "v": [1, None, 3, 4], "w": [0.5, 1.25, None, 2.0]})
'''


@pytest.mark.parametrize("source, laid_out_here", [
    pytest.param('shown = df.sort_values("k").to_string(index=False)', True,
                 id="sorted, no labels"),
    pytest.param('shown = df.to_string()', True, id="labels 0..n-1"),
    pytest.param('shown = df[df["w"] > 0.6].to_string(index=False)', True, id="filtered"),
    pytest.param('shown = df.to_string(columns=["k"])', False, id="an option"),
    pytest.param('shown = df.groupby("k")["v"].sum().to_string()', False, id="a groupby's keys"),
    pytest.param('shown = df["w"].to_string()', False, id="a Series"),
])
def test_to_string_lays_out_what_pandas_lays_out(source: str, laid_out_here: bool) -> None:
    result = differential(TEXT_FRAME + source + "\n", "shown")
    assert "TODO" not in result.converted_text
    assert ("pandas_to_string(" in result.converted_text) is laid_out_here
    status = "converted" if laid_out_here else "handover"
    assert [s.status for s in result.sites if s.key.endswith("to_string")] == [status]


def _text_function():
    namespace: dict = {"pl": pl}
    exec(TEXT_DEFINITION, namespace)
    return namespace[TEXT_FUNCTION]


_TIMES = st.datetimes(min_value=dt.datetime(1990, 1, 1), max_value=dt.datetime(2100, 1, 1))
_FLOATS = st.one_of(st.floats(), st.floats(-1e3, 1e3), st.none(),
                    st.sampled_from([0.5, 2.675, 1e-7, 1e7, 123456.789, -0.0, 0.1, 1e16]))
_INTS = st.one_of(st.integers(-10**12, 10**12), st.integers(-5, 5))
_TEXTS = st.one_of(st.text(max_size=60), st.sampled_from(["a", "é", "x\ty", "", "naïve " * 10]))


@st.composite
def _frame_pairs(draw):
    """The same small table as pandas holds it and as a converted script's Polars frame holds
    it: an int column with a missing value is float in pandas, a boolean one object."""
    n = draw(st.integers(0, 8))
    in_pandas, in_polars = {}, {}
    kinds = draw(st.lists(st.sampled_from(["int", "float", "text", "bool", "category", "time",
                                           "date"]), min_size=1, max_size=4))
    for i, kind in enumerate(kinds):
        name = draw(st.sampled_from(["a", "kg", "name", "x y", "ü", "a_long_column_name"])) + str(i)
        missing = draw(st.booleans())

        def values(strategy):
            return draw(st.lists(st.one_of(strategy, st.none()) if missing else strategy,
                                 min_size=n, max_size=n))
        if kind == "int":
            v = values(_INTS)
            in_polars[name] = pl.Series(v, dtype=pl.Int64)
            in_pandas[name] = pd.Series([np.nan if x is None else x for x in v],
                                        dtype="float64" if None in v else "int64")
        elif kind == "float":
            v = draw(st.lists(_FLOATS, min_size=n, max_size=n))
            in_polars[name] = pl.Series(v, dtype=pl.Float64)
            in_pandas[name] = pd.Series([np.nan if x is None else x for x in v], dtype="float64")
        elif kind == "bool":
            v = values(st.booleans())
            in_polars[name] = pl.Series(v, dtype=pl.Boolean)
            in_pandas[name] = pd.Series([np.nan if x is None else x for x in v],
                                        dtype=object if None in v else bool)
        elif kind in ("text", "category"):
            v = values(_TEXTS)
            in_polars[name] = pl.Series(v, dtype=pl.String if kind == "text" else pl.Categorical)
            in_pandas[name] = pd.Series(v, dtype="str" if kind == "text" else "category")
        else:
            v = values(_TIMES)
            if kind == "date":
                v = [None if x is None else dt.datetime(x.year, x.month, x.day) for x in v]
            in_polars[name] = pl.Series(v, dtype=pl.Datetime("us"))
            in_pandas[name] = pd.Series(pd.to_datetime(v), dtype="datetime64[us]")
    return pd.DataFrame(in_pandas), pl.DataFrame(in_polars)


@settings(max_examples=400, deadline=None, derandomize=True,
          suppress_health_check=[HealthCheck.too_slow, HealthCheck.data_too_large])
@given(_frame_pairs(), st.booleans())
def test_the_text_function_lays_frames_out_as_pandas_does(pair, index) -> None:
    # pandas itself is the reference: its DataFrame.to_string() of the same table
    in_pandas, in_polars = pair
    assert _text_function()(in_polars, index=index) == in_pandas.to_string(index=index)


def test_to_string_with_labels_a_sort_changed_is_pandas_own() -> None:
    result = differential(TEXT_FRAME + 'shown = df.sort_values("k").to_string()\n', "shown")
    assert "TODO(porter)" in result.converted_text
