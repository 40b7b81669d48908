"""Rule cases and differential checks for porter/rules/groupby.py (groupby + aggregations, agg
spellings, series reductions, value_counts, unique, describe).

pandas is the reference implementation: every differential check runs the snippet with pandas
and its conversion with Polars and compares what they computed (pandas' index becomes columns).
"""

from __future__ import annotations

import pandas as pd
import pytest

from rule_checks import check_ports, check_todo, check_unchanged
from support import assert_same_table, column_kinds, convert, differential, run, same_text

# None and NaN keys, NaN values, a group whose values are all missing (c), ties in counts,
# unicode keys and text.
FRAME = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "shop": ["b", "a", None, "b", "a", "c", np.nan, "Éclair", "c"],
    "qty": [1.0, np.nan, 3.0, 4.0, 5.0, np.nan, 2.0, 2.0, None],
    "n": [1, 2, 3, 4, 5, 6, 7, 8, 8],
    "t": ["x", "y", "z", None, "y", "ünï", "w", "v", "x"],
})
"""

AGGREGATIONS = ["sum", "mean", "median", "min", "max", "std", "var", "count", "nunique",
                "first", "last", "size"]

# -- ports ----------------------------------------------------------------------------------

PORTS = [
    pytest.param('r = df.groupby("shop")["qty"].sum()',
                 'df.with_columns(_porter_rows_in_key_order=pl.col("shop").is_sorted()).drop_nulls("shop")'
                 '.group_by("shop").agg(pl.col("qty"), pl.col("_porter_rows_in_key_order").first())'
                 '.with_columns(pandas_group_sums(pl.col("qty"), in_key_order=pl.col("_porter_rows_in_key_order")))'
                 '.drop("_porter_rows_in_key_order").sort("shop")',
                 id="missing keys dropped and keys sorted"),
    pytest.param('r = df.groupby("shop", sort=False)["qty"].sum()', 'group_by("shop", maintain_order=True)',
                 id="sort=False keeps first appearance"),
    pytest.param('r = df.groupby("shop", dropna=False)["qty"].sum()', '.sort("shop", nulls_last=True)',
                 id="dropna=False keeps the missing key last"),
    pytest.param('r = df.groupby("shop")["qty"].nunique()', 'pl.col("qty").drop_nulls().n_unique()',
                 id="nunique skips missing"),
    pytest.param('r = df.groupby("shop")["t"].first()', 'pl.col("t").first(ignore_nulls=True)',
                 id="first skips missing"),
    pytest.param('r = df.groupby("shop")["qty"].count()', 'pl.col("qty").count().cast(pl.Int64)', id="count"),
    pytest.param('r = df.groupby("shop").size()', 'pl.len().cast(pl.Int64).alias("size")', id="size"),
    pytest.param('r = df.groupby("shop").agg(total=("qty", "sum"))', '.agg(pl.col("qty").alias("total"), pl.col("_porter_rows_in_key_order").first())',
                 id="named aggregation"),
    pytest.param('r = df.groupby("shop").agg({"qty": ["sum", "max"], "n": "min"})',
                 'pl.col("n").min().alias("n_min")', id="dict of lists flattened to column_function"),
    pytest.param('r = df.groupby("shop")["qty"].agg(sum)',
                 'pl.when(pl.col("qty").null_count() == 0).then(pl.col("qty").sum())',
                 id="builtin sum is NaN when a value is missing"),
    pytest.param('r = df.groupby("shop")["qty"].agg(max)',
                 'pl.when(pl.col("qty").first().is_not_null()).then(pl.col("qty").max())',
                 id="builtin max keeps a leading NaN"),
    pytest.param('r = df.groupby("shop").t.sum()', 'pl.col("t").str.join("")', id="text sum concatenates"),
    pytest.param('r = df["shop"].value_counts()', '.group_by("shop", maintain_order=True)',
                 id="value_counts ties in order of appearance"),
    pytest.param("r = df.describe()", "pandas_percentiles(pl.selectors.numeric(), [0.25, 0.5, 0.75])",
                 id="describe linear percentiles"),
    pytest.param('r = df.groupby("shop")["qty"].agg(lambda s: s.max() - s.min())',
                 '(pl.col("qty").max() - pl.col("qty").min())', id="agg with a lambda"),
]


# a function given to agg: its body is one value of the group's values
FUNCTION_AGGREGATIONS = [
    pytest.param('r = df.groupby("shop")["qty"].agg(lambda s: s.max() - s.min())', id="spread"),
    pytest.param('r = df.groupby("shop")["n"].agg(lambda s: s.max() / s.min())', id="ratio of ints"),
    pytest.param('r = df.groupby("shop")["qty"].agg(lambda s: s.max() * 2 + 1)', id="arithmetic"),
    pytest.param('r = df.groupby("shop")["n"].agg(lambda s: s.count() / 3)', id="count divided"),
    pytest.param('r = df.groupby("shop")["qty"].agg(lambda s: s.isna().mean())', id="share missing"),
    pytest.param('r = df.groupby("shop")["t"].agg(lambda s: (s == "x").sum())', id="count of a text"),
    pytest.param('r = df.groupby("shop")["t"].agg(lambda s: s.str.len().max())', id="longest text"),
    pytest.param('r = df.groupby("shop")["qty"].agg(lambda s: s.max() if s.count() > 1 else 0)',
                 id="conditional"),
    pytest.param('def spread(values):\n    return values.max() - values.min()\n'
                 'r = df.groupby("shop", dropna=False).agg(sp=("qty", spread), top=("n", lambda s: s.max()),'
                 ' k=("qty", "count"))', id="named, the script's own function, missing key kept"),
    pytest.param('r = df.groupby("shop")["n"].agg(gap=lambda s: s.max() - s.min())',
                 id="named on a selected column"),
    pytest.param('r = df.groupby("shop", as_index=False)[["qty", "n"]].agg(lambda s: s.max() - s.min())',
                 id="each selected column"),
]


@pytest.mark.parametrize("before", FUNCTION_AGGREGATIONS)
def test_function_aggregations_match_pandas(before: str) -> None:
    result = differential(FRAME + before + "\n", "r")
    assert "TODO" not in result.converted_text, result.converted_text


@pytest.mark.parametrize("before, expected", PORTS)
def test_ports(before: str, expected: str) -> None:
    check_ports(FRAME + before + "\n", expected)


TODOS = [
    pytest.param('r = df.groupby("shop")["t"].agg(lambda s: ", ".join(s.dropna()))', "groupby.agg",
                 id="agg with a lambda that is not an expression"),
    pytest.param('r = df.groupby("shop").agg(["min", "max"])', "groupby.agg",
                 id="list of functions over several columns"),
    pytest.param('r = df.groupby("shop")["t"].sum(min_count=1)', "groupby.sum",
                 id="min_count of text"),
    pytest.param('r = df["qty"].sum(skipna=False)', "series.sum", id="skipna=False"),
    pytest.param('r = df.groupby("shop")["qty"].apply(lambda s: s.cumsum())', "groupby.apply", id="apply"),
    pytest.param('r = df.groupby("shop").sum(numeric_only=True)', "groupby.sum", id="numeric_only"),
    pytest.param('r = df[["t"]].describe()', "frame.describe", id="describe without numbers"),
]


@pytest.mark.parametrize("before, key", TODOS)
def test_todo(before: str, key: str) -> None:
    check_todo(FRAME + before + "\n", key)


UNCHANGED = [
    pytest.param("import itertools\ngroups = itertools.groupby([1, 1, 2])\n", id="itertools groupby"),
    pytest.param("import collections\nc = collections.Counter('aab')\nx = c.most_common(1)\n", id="Counter"),
    pytest.param("xs = [3, 1]\ntotal = sum(xs)\nbig = max(xs)\n", id="builtin reductions on lists"),
    pytest.param("class Ledger:\n    def groupby(self, key):\n        return self\n"
                 "    def sum(self):\n        return 0\n"
                 "x = Ledger().groupby('k').sum()\n", id="groupby of another class"),
]


@pytest.mark.parametrize("before", UNCHANGED)
def test_unchanged(before: str) -> None:
    check_unchanged("import pandas as pd\n" + before)


# -- differential ---------------------------------------------------------------------------

@pytest.mark.parametrize("how", AGGREGATIONS)
def test_series_groupby_aggregation(how: str) -> None:
    differential(FRAME + f'result = df.groupby("shop")["qty"].{how}()\n')


@pytest.mark.parametrize("how", AGGREGATIONS)
def test_frame_groupby_aggregation(how: str) -> None:
    differential(FRAME + f'result = df.groupby("shop")[["qty", "n"]].{how}()\n')


@pytest.mark.parametrize("how", ["nunique", "first", "last", "count", "min", "max"])
def test_text_groupby_aggregation(how: str) -> None:
    differential(FRAME + f'result = df.groupby("shop")["t"].{how}()\n')


GROUPINGS = [
    pytest.param('df.groupby("shop", sort=False)["qty"].sum()', id="sort=False"),
    pytest.param('df.groupby("shop", as_index=False)["qty"].sum()', id="as_index=False"),
    pytest.param('df.groupby("shop", dropna=False)["qty"].sum()', id="dropna=False None and NaN keys"),
    pytest.param('df.groupby("shop", dropna=False, sort=False)["qty"].mean()', id="dropna=False sort=False"),
    pytest.param('df.groupby("shop", as_index=False).size()', id="as_index=False size"),
    pytest.param('df.groupby("shop", as_index=False)["qty"].count()', id="as_index=False count"),
    pytest.param('df.groupby(["shop", "t"])["qty"].sum()', id="two keys"),
    pytest.param('df.groupby(["shop", "n"], dropna=False)["qty"].sum()', id="two keys dropna=False"),
    pytest.param('df.groupby(["shop", "n"], sort=False).size()', id="two keys sort=False size"),
    pytest.param('df.groupby("n", sort=False)["qty"].sum()', id="int key duplicates"),
    pytest.param('df.groupby(df["shop"])["qty"].sum()', id="key given as a column"),
    pytest.param('df.groupby("shop").qty.count()', id="attribute selection"),
    pytest.param('df.groupby("shop").sum()', id="sum concatenates text"),
    pytest.param('df.groupby("shop").count()', id="frame count"),
    pytest.param('df.groupby("shop").nunique()', id="frame nunique"),
    pytest.param('df.groupby("shop").first()', id="frame first"),
    pytest.param('df.groupby("shop")["qty"].std(ddof=0)', id="std ddof=0"),
    pytest.param('df.groupby("shop")["qty"].var(ddof=0)', id="var ddof=0"),
    pytest.param('df.groupby("shop").agg(total=("qty", "sum"), m=("n", "max"))', id="agg named"),
    pytest.param('df.groupby("shop").agg(c=("qty", "count"), s=("qty", "size"), u=("t", "nunique"))',
                 id="agg named counts"),
    pytest.param('df.groupby("shop").agg(f=("t", "first"), l=("t", "last"))', id="agg named first last"),
    pytest.param('df.groupby("shop", as_index=False).agg(total=("qty", "sum"))', id="agg named as_index=False"),
    pytest.param('df.groupby("shop").agg({"qty": "sum", "n": "mean"})', id="agg dict"),
    pytest.param('df.groupby("shop", sort=False).agg({"qty": "mean"})', id="agg dict sort=False"),
    pytest.param('df.groupby("shop")["qty"].agg(["sum", "mean"])', id="agg list"),
    pytest.param('df.groupby("shop")["qty"].agg(["std", "var", "size"])', id="agg list with size"),
    pytest.param('df.groupby("shop")["qty"].agg("sum")', id="agg string"),
    pytest.param('df.groupby("shop")["qty"].agg("median")', id="agg string median"),
    pytest.param('df.groupby("shop").agg("sum")', id="frame agg string"),
    pytest.param('df.groupby("shop")[["qty", "n"]].agg("max")', id="selection agg string"),
    pytest.param('df.groupby("shop")["qty"].agg(np.sum)', id="agg numpy sum"),
    pytest.param('df.groupby("shop")["qty"].agg(sum)', id="agg builtin sum"),
    pytest.param('df.groupby("shop")["qty"].agg(max)', id="agg builtin max"),
    pytest.param('df.groupby("shop")["qty"].agg(min)', id="agg builtin min"),
    pytest.param('df.groupby("shop")["qty"].agg(len)', id="agg builtin len"),
    pytest.param('df.groupby("shop")[["qty", "n"]].agg(max)', id="frame agg builtin max"),
    pytest.param('df.groupby("shop").agg(total=("qty", sum), top=("qty", max), low=("n", min), rows=("t", len))',
                 id="agg named builtins"),
    pytest.param('df.groupby("shop").qty.agg(total="sum", most="max")', id="series named agg"),
    pytest.param('df.groupby("shop")["qty"].sum().sort_values(ascending=False, kind="stable")',
                 id="sorted aggregate"),
]


@pytest.mark.parametrize("expr", GROUPINGS)
def test_grouping_matches_pandas(expr: str) -> None:
    differential(FRAME + f"result = {expr}\n")


def test_named_aggregation_of_builtins_is_ported() -> None:
    # ("qty", sum): pandas 3 calls the builtin on each group's values (NaN makes the sum NaN)
    result = differential(FRAME + 'result = df.groupby("shop").agg(total=("qty", sum), top=("qty", max))\n')
    assert not result.todos, result.converted_text


def test_groupby_held_in_a_variable() -> None:
    differential(FRAME + 'g = df.groupby("shop")\nresult = g["qty"].sum()\nnamed = g.agg(total=("qty", "sum"))\n',
                 "result", "named")


SCALARS = [
    pytest.param('df["qty"].sum()', id="sum"),
    pytest.param('df["qty"].mean()', id="mean"),
    pytest.param('df["qty"].median()', id="median"),
    pytest.param('df["qty"].min()', id="min"),
    pytest.param('df["qty"].max()', id="max"),
    pytest.param('df["qty"].std()', id="std"),
    pytest.param('df["qty"].var()', id="var"),
    pytest.param('df["qty"].std(ddof=0)', id="std ddof=0"),
    pytest.param('df["qty"].count()', id="count"),
    pytest.param('df["shop"].nunique()', id="nunique text"),
    pytest.param('df["qty"].nunique()', id="nunique numbers"),
    pytest.param('df["n"].sum()', id="int sum"),
    pytest.param('df["n"].mean()', id="int mean"),
    pytest.param('df["t"].min()', id="text min skips None"),
    pytest.param('df["t"].max()', id="text max unicode"),
    pytest.param('(df["qty"] > 1).sum()', id="sum of a comparison with NaN"),
    pytest.param('(df["qty"] > 1).mean()', id="mean of a comparison with NaN"),
    pytest.param('df[df["n"] > 100]["qty"].sum()', id="sum of empty"),
    pytest.param('df[df["n"] > 100]["qty"].count()', id="count of empty"),
]


@pytest.mark.parametrize("expr", SCALARS)
def test_series_reduction_matches_pandas(expr: str) -> None:
    differential(FRAME + f"result = {expr}\n")


# pandas gives NaN for the mean, min, ... of no values (an empty selection, only missing values,
# the std of one value); the value is used as a number and written as text, where None fails
# or reads "None"
NO_VALUES = [
    pytest.param('df[df["n"] > 100]["qty"].max()', id="max of an empty selection"),
    pytest.param('df[df["n"] > 100]["qty"].min()', id="min of an empty selection"),
    pytest.param('df[df["shop"] == "c"]["qty"].mean()', id="mean of only missing values"),
    pytest.param('df[df["n"] > 100]["qty"].median()', id="median of an empty selection"),
    pytest.param('df[df["n"] == 1]["qty"].std()', id="std of one value"),
    pytest.param('df[df["n"] == 1]["qty"].var()', id="var of one value"),
    pytest.param('df[df["n"] > 100]["qty"].quantile(0.9)', id="quantile of an empty selection"),
    pytest.param('df[df["n"] > 100]["n"].mean()', id="mean of an empty int selection"),
    pytest.param('df[df["n"] > 100]["n"].median()', id="median of an empty int selection"),
    pytest.param('df[df["n"] > 1]["qty"].max()', id="max of some values"),
    pytest.param('df[df["n"] > 1]["n"].max()', id="int max stays an int"),
]


@pytest.mark.parametrize("expr", NO_VALUES)
def test_reduction_of_no_values_is_nan_like_pandas(expr: str) -> None:
    differential(FRAME + f"value = {expr}\nresult = [value * 1.2, f\"{{value}}\", str(value)]\n")


def test_reductions_are_numpy_values_as_pandas_gives_them(tmp_path) -> None:
    # ~ of any() is its negation (np.bool_: ~True is -2 in Python, a truthy number), the max
    # of no integers is nan (None from item(), which a format spec refuses), a max of
    # integers divides by zero to inf, a mean of a column named by a loop variable is nan
    # when it has no values
    result = same_text("""
        import pandas as pd
        df = pd.read_csv("t.csv")
        has_missing = df["a"].isna().any()
        if ~has_missing:
            print("complete data")
        else:
            print("some values missing")
        print(~(df["a"] > 10).any(), ~df["a"].notna().all())
        big = df[df["n"] > 100]
        print(big["n"].max(), big["n"].min(), f"{big['n'].max():.1f}")
        print(df["n"].max() / big["n"].max().item() if False else df["n"].max() / 0)
        for c in ["a", "b"]:
            print(c, df[c].mean(), f"{df[c].std():.2f}", df[c].sum())
    """, tmp_path, {"t.csv": "id,a,b,n\np,4,,1\nq,,,2\nr,3,,5\n"})
    assert 'pl.col("n").max().fill_null' not in result.converted_text  # 8 stays 8, not 8.0


def test_reduction_inside_an_expression_keeps_missing_as_null() -> None:
    differential(FRAME + """
df["qty2"] = df["qty"].fillna(df[df["n"] > 100]["qty"].mean())
df["over"] = df["qty"] > df["qty"].mean()
result = df
count = int(df["qty2"].isna().sum())
""", "result", "count")


COUNTS = [
    pytest.param('df["shop"].value_counts()', id="value_counts ties and missing"),
    pytest.param('df["n"].value_counts()', id="value_counts ints"),
    pytest.param('df["qty"].value_counts()', id="value_counts floats with NaN"),
    pytest.param('df["t"].value_counts(normalize=True)', id="value_counts normalize"),
    pytest.param('df["shop"].value_counts(dropna=False)', id="value_counts dropna=False"),
    pytest.param('df["shop"].value_counts(ascending=True)', id="value_counts ascending"),
    pytest.param('df["shop"].value_counts(sort=False)', id="value_counts sort=False"),
    pytest.param('df[df["n"] > 100]["shop"].value_counts()', id="value_counts empty"),
]


@pytest.mark.parametrize("expr", COUNTS)
def test_value_counts_matches_pandas(expr: str) -> None:
    differential(FRAME + f"result = {expr}\n")


@pytest.mark.parametrize("column", ["qty", "n"])
def test_unique_of_numbers_is_the_array_pandas_gives(column: str) -> None:
    # pandas gives a numpy array with nan for a missing value (not None): the values' reprs,
    # the usual `v == v` filter and tolist() agree
    differential(FRAME + f"""
u = df["{column}"].unique()
result = [repr(v) for v in u]
kept = [repr(v) for v in u if v == v]
listed = repr(u.tolist())
size = len(u)
""", "result", "kept", "listed", "size")


@pytest.mark.parametrize("column", ["shop", "t"])
def test_unique_of_text_in_order_of_appearance(column: str) -> None:
    # pandas' own values: nan for a missing text, as pandas gives it (held in a name, the
    # array is numpy's where no text is missing: 0.98 for a later print of it)
    source = FRAME + f'u = df["{column}"].unique()\nresult = u.tolist()\nfirst = u[0]\n'
    result = differential(source, "result", "first")
    assert any(s.key == "series.unique" and s.confidence == 0.98 for s in result.sites)


def test_unique_of_numbers_and_dates_as_pandas_gives_them() -> None:
    # an integer column with a missing value is float in pandas; NaN made by a division and a
    # missing value are one value in pandas' unique; dates are pandas' own array of Timestamps
    result = differential("""
import numpy as np
import pandas as pd
df = pd.DataFrame({"k": [1, 2, 1, None, 2], "a": [0.0, 1.0, 0.0, np.nan, 2.0],
                   "b": [0.0, 1.0, 0.0, 3.0, 2.0],
                   "d": ["2024-01-02", None, "2024-01-02", "2024-03-01", None]})
df["r"] = df["a"] / df["b"]
df["d"] = pd.to_datetime(df["d"], format="%Y-%m-%d")
result = [repr(v) for v in df["k"].unique()]
ratios = repr(df["r"].unique().tolist())
days = [str(v)[:10] for v in df["d"].unique() if not pd.isna(v)]
""", "result", "ratios", "days")
    assert all(s.confidence == 1.0 for s in result.sites if s.key == "series.unique")


def test_empty_frame_groupby() -> None:
    differential(FRAME + 'none = df[df["n"] > 100]\nresult = none.groupby("shop")["qty"].sum()\n'
                 'mean = none["qty"].mean()\n', "result", "mean")


@pytest.mark.parametrize("select", ["df", 'df[["qty", "n"]]', 'df.assign(ok=df["n"] > 4)'])
def test_describe_matches_pandas(select: str) -> None:
    # pandas keeps the statistic names in an unnamed index; porter writes them as a column
    # named "index", as pandas' reset_index() names it.
    source = FRAME + f"result = {select}.describe()\n"
    expected = run(source)["result"].rename_axis("index")
    actual = run(convert(source).converted_text)["result"]
    assert_same_table(expected, actual)


def test_describe_then_reset_index() -> None:
    differential(FRAME + 'result = df[["qty", "n"]].describe().reset_index()\n')


def test_dict_of_lists_lowers_confidence() -> None:
    result = convert(FRAME + 'r = df.groupby("shop").agg({"qty": ["sum", "max"], "n": "min"})\n')
    site = next(s for s in result.sites if s.key == "groupby.agg")
    assert site.confidence <= 0.9 and "MultiIndex" in site.message


# -- pivot_table -------------------------------------------------------------------------------

PIVOT = FRAME.replace('"n": [1, 2, 3, 4, 5, 6, 7, 8, 8],',
                      '"n": [1, 2, 3, 4, 5, 6, 7, 8, 8],\n    "month": [6, 10, 7, 6, 9, 10, 7, 6, None],')


@pytest.mark.parametrize("call", [
    'df.pivot_table(index="shop", columns="month", values="qty")',
    'df.pivot_table(index="shop", columns="month", values="qty", aggfunc="median")',
    'df.pivot_table(index="shop", columns="month", values="n", aggfunc="sum", fill_value=0)',
    'df.pivot_table(index="shop", columns="t", values="n", aggfunc="count", fill_value=0)',
    'df.pivot_table(index="shop", columns="month", values="qty", aggfunc="max", fill_value=-1)',
    'df.pivot_table(index=["shop", "t"], columns="month", values="n", aggfunc="min", fill_value=0)',
    'df.pivot_table(values="qty", index="t", columns="shop", aggfunc="mean", fill_value=0.5)',
    'df[df["n"] > 100].pivot_table(index="shop", columns="month", values="n", aggfunc="sum", fill_value=0)',
    'df.pivot_table(index="shop", columns="month", values="qty", margins=True)',
])
def test_pivot_table_matches_pandas(call: str) -> None:
    # a missing key drops its row; a group whose mean is missing is dropped; the months come
    # in their numeric order (10 after 9), the rows in key order
    result = differential(PIVOT + f"result = {call}.reset_index()\n")
    assert not result.todos, result.converted_text


@pytest.mark.parametrize("call", [
    # a combination of shop and month no row has: pandas makes every cell float
    'df.pivot_table(index="shop", columns="month", values="n", aggfunc="sum")',
    'df.pivot_table(index="shop", columns="month", values="n", aggfunc="count")',
    'df.pivot_table(index="shop", columns="t", values="n", aggfunc="max")',
    'df.pivot_table(index=["shop", "t"], columns="month", values="n", aggfunc="min")',
    # every combination present: pandas keeps the integers
    'df[df["shop"] == "b"].pivot_table(index="shop", columns="month", values="n", aggfunc="sum")',
    'df[df["shop"].isin(["a", "b"])].pivot_table(index="t", columns="shop", values="n", aggfunc="count")',
    # a True/False column summed: counts, float when a combination is missing
    'df.assign(big=df["n"] > 4).pivot_table(index="shop", columns="month", values="big", aggfunc="sum")',
])
def test_pivot_table_without_fill_value_has_pandas_types(call: str) -> None:
    # the cell types decide what to_csv and print write (6 or 6.0): pandas decides them on
    # the unstacked table, so the conversion must too
    source = PIVOT + f"result = {call}.reset_index()\n"
    result = differential(source)
    assert not result.todos, result.converted_text
    assert column_kinds(run(source)["result"]) == column_kinds(run(result.converted_text)["result"]), \
        result.converted_text


@pytest.mark.parametrize("call", [
    'df.pivot_table(index="shop", columns="month", values="t", aggfunc="max")',
    'df.pivot_table(index="shop", columns="month", values="qty", aggfunc="median", margins=True)',
    'df.pivot_table(index="shop", columns="month")',
    'df.pivot_table(index="shop", columns=["month", "t"], values="n", fill_value=0)',
    'df.pivot_table(index="shop", columns="month", values="n", aggfunc=["sum", "max"], fill_value=0)',
])
def test_pivot_table_todo(call: str) -> None:
    result = convert(PIVOT + f"result = {call}\n")
    assert any(s.key == "frame.pivot_table" for s in result.todos)


def test_value_counts_normalize_divides_like_pandas():
    # 100 kinds counted 1..100 times: Polars' reciprocal multiplication (count * (1 / total))
    # is one binary digit off pandas' count / total for 42 of the shares; compared exactly
    from support import run, convert
    source = """
import pandas as pd
df = pd.DataFrame({"k": [f"kind {i}" for i in range(1, 101) for _ in range(i)]})
shares = df["k"].value_counts(normalize=True)
exact = shares.tolist()
"""
    converted = convert(source).converted_text
    assert "value_counts" not in converted
    assert run(source)["exact"] == run(converted)["exact"]


def test_a_named_reduction_of_no_values_stays_missing_in_expressions() -> None:
    differential(FRAME + """
m = df[df["n"] > 100]["qty"].mean()
top = df[df["n"] > 1]["qty"].max()
df["qty2"] = df["qty"].fillna(m)
df["scaled"] = df["qty"] * m
df["share"] = df["qty"] / top
result = df
count = int(df["qty2"].isna().sum()) + int(df["scaled"].isna().sum())
text = f"{m} {top}"
""", "result", "count", "text")


# -- groupby().apply(f) where f makes one row of aggregates ---------------------------------------

# Missing keys (None), a group where the `loge` condition keeps no row (c, Éclair), NaN in a float
# column, a missing zone (b), a group of one row (d), unicode keys, int and float columns.
APPLY_HEAD = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "shop": ["b", "a", None, "b", "a", "c", "Éclair", "c", "d"],
    "qty": [1.0, np.nan, 3.0, 4.0, 5.0, np.nan, 2.0, 2.0, 1.5],
    "n": [1, 2, 3, 4, 5, 6, 7, 8, 8],
    "zone": ["loge", "pit", "loge", None, "loge", "pit", "pit", "pit", "loge"],
})


def summary(g):
    # one row per shop
    sold = g["n"].sum()
    loge = g.loc[g["zone"] == "loge", "n"].sum()
    return pd.Series({
        "sold": sold,
        "qty": g["qty"].sum(),
        "zones": g["zone"].nunique(),
        "biggest": g["n"].max(),
        "loge_share": loge / sold if sold > 0 else np.nan,
    })
"""
APPLY = APPLY_HEAD + """

def counts(g):
    return pd.Series({"rows": len(g), "n": g["n"].sum(), "loge_n": g.loc[g["zone"] == "loge", "n"].sum(),
                      "zones": g.zone.nunique(), "qty_count": g["qty"].count()})


def share_if_any(g):
    loge = g.loc[g["zone"] == "loge", "n"].sum()
    if loge > 0:
        return loge / g["n"].sum()
    return np.nan
"""

APPLY_CASES = {
    "mixed ints and floats make every column float": 'df.groupby("shop").apply(summary)',
    "then reset_index": 'df.groupby("shop").apply(summary).reset_index()',
    "all ints stay ints": 'df.groupby("shop").apply(counts)',
    "a condition with no rows in some groups": 'df.groupby("shop").apply(share_if_any)',
    "one value: a Series without a name": 'df.groupby("shop").apply(lambda g: (g.n * g.qty).sum())',
    "one value, reset_index names it 0": 'df.groupby("shop").apply(lambda g: len(g)).reset_index()',
    "sort=False and dropna=False": ('df.groupby("shop", sort=False, dropna=False)'
                                    '.apply(counts).reset_index()'),
    "as_index=False": 'df.groupby("shop", as_index=False).apply(summary)',
    "group_keys=False changes nothing for one row per group": (
        'df.groupby("shop", group_keys=False).apply(summary)'),
    "two keys": 'df.groupby(["zone", "shop"]).apply(lambda g: g["qty"].mean()).reset_index()',
    "masks: != keeps missing, ~ of a NaN comparison, isin, isna": (
        'df.groupby("shop").apply(lambda g: pd.Series({'
        '"ne": g.loc[g["zone"] != "loge", "n"].sum(), "inv": g[~(g["qty"] > 1.5)]["n"].sum(), '
        '"isin": g.loc[g["zone"].isin(["pit", "x"]), "n"].count(), '
        '"na": g.loc[g["qty"].isna(), "n"].sum(), "both": g.loc[(g.n > 2) & (g.zone == "pit"), "n"].sum()}))'),
    "mean of a mask counts NaN as False": (
        'df.groupby("shop").apply(lambda g: (g["qty"] > 1.5).mean())'),
    "float() of a max that has no rows in some groups": (
        'df.groupby("shop").apply(lambda g: pd.Series({"top": float(g.loc[g["zone"] == "loge", "n"].max()), '
        '"spread": g["qty"].max() - g["qty"].min(), "sd": g["n"].std(), "dev": (g["n"] - g["n"].mean()).sum()}))'),
    "a test of NaN takes the else branch, != of NaN the then branch": (
        'df.groupby("shop").apply(lambda g: pd.Series({'
        '"a": 1.0 if g["qty"].max() > 1.5 else 0.0, "b": 1.0 if g["qty"].max() != 2.0 else 0.0, '
        '"c": 1.0 if not g["qty"].max() > 1.5 else 0.0}))'),
    "rows compared with a value of their group, NaN != NaN": (
        'df.groupby("shop").apply(lambda g: pd.Series({"above": g.loc[g["n"] > g["n"].mean(), "n"].sum(), '
        '"q_above": g[g["qty"] >= g["qty"].mean()]["n"].count(), "n_over_q": g.loc[g.n > g.qty, "n"].sum(), '
        '"nan_ne": 1.0 if g.loc[g["zone"] == "loge", "qty"].max() != g.loc[g["zone"] == "loge", "qty"].min() '
        'else 0.0, "rows": len(g)}))'),
    "0 / 0 is missing": 'df.groupby("shop").apply(lambda g: g.loc[g["zone"] == "loge", "n"].sum() / g.loc[g["zone"] == "loge", "n"].count())',
}


@pytest.mark.parametrize("call", list(APPLY_CASES.values()), ids=list(APPLY_CASES))
def test_groupby_apply_matches_pandas(call: str) -> None:
    result = differential(APPLY + f"result = {call}\n")
    assert [s.status for s in result.sites if s.key == "groupby.apply"] == ["converted"]
    _same_types(APPLY + f"result = {call}\n", result.converted_text)


def _same_types(source: str, converted: str) -> None:
    """pandas makes each column int64 or float64 (12 prints as 12.0): so must Polars. (The
    differential check reads ints and floats alike.)"""
    expected = run(source)["result"]
    actual = run(converted)["result"]
    frame = expected.to_frame() if isinstance(expected, pd.Series) else expected
    schema = (actual.collect() if hasattr(actual, "collect") else actual.to_frame()).schema
    for name, dtype in frame.dtypes.items():
        if dtype.kind in "if":
            polars = next(t for c, t in schema.items() if c == str(name) or name is None)
            assert polars.is_float() == (dtype.kind == "f"), (name, dtype, polars)


def test_groupby_apply_code() -> None:
    text = check_ports(APPLY_HEAD + 'result = df.groupby("shop").apply(summary).reset_index()\n',
                       'pl.col("n").filter(pl.col("zone") == "loge").sum()')
    assert 'pl.col("zone").drop_nulls().n_unique().cast(pl.Float64).alias("zones")' in text
    assert ".otherwise(None)" in text and 'pandas_reduce(pl.col("qty")).alias("qty")' in text
    # the function is no longer called: left out with a note (keeping it would keep the
    # pandas import), and converting again changes nothing
    assert "a pandas function of each group, is ported as group_by().agg()" in text
    assert "def summary" not in text and "import pandas" not in text
    assert convert(text).converted_text == text


def test_groupby_apply_function_called_elsewhere_is_ported_as_usual() -> None:
    result = convert(APPLY + 'result = df.groupby("shop").apply(counts)\nfirst = counts(df)\n')
    assert "# porter: ported as" not in result.converted_text
    assert any(s.key == "groupby.apply" and s.status == "converted" for s in result.sites)


def test_groupby_apply_confidence() -> None:
    result = convert(APPLY + 'result = df.groupby("shop").apply(counts)\n')
    found = [s for s in result.sites if s.key == "groupby.apply"]
    assert found and found[0].confidence == 0.95 and "empty frame" in found[0].message


APPLY_TODOS = [
    pytest.param('result = df.groupby("shop").apply(lambda g: g.head(1))', "head", id="returns a frame"),
    pytest.param('def loud(g):\n    print(len(g))\n    return g["n"].sum()\n'
                 'result = df.groupby("shop").apply(loud)', "not one expression", id="prints"),
    pytest.param('def looped(g):\n    total = 0\n    for v in g["n"]:\n        total += v\n'
                 '    return total\nresult = df.groupby("shop").apply(looped)', "not one expression",
                 id="loops"),
    pytest.param('def grow(g):\n    g["m"] = g["n"] * 2\n    return g["m"].sum()\n'
                 'result = df.groupby("shop").apply(grow)', "not one expression", id="changes the group"),
    pytest.param('result = df.groupby("shop").apply(lambda g: g.loc[g["zone"] == "loge", "n"].max())',
                 "depends on the data", id="int or NaN by group"),
    pytest.param('result = df.groupby("shop").apply(lambda g: g["n"].sum() if len(g) > 1 else np.nan)',
                 "depends on the data", id="int or np.nan"),
    pytest.param('result = df.groupby("shop").apply(lambda g: pd.Series({"z": g["zone"].max(), "n": len(g)}))',
                 "object Series", id="text value"),
    pytest.param('result = df.groupby("shop").apply(lambda g: g["n"].sum() > 3)', "True/False",
                 id="boolean value"),
    pytest.param('result = df.groupby("shop", as_index=False).apply(lambda g: len(g))', "None",
                 id="one value with as_index=False"),
    pytest.param('result = df.groupby("shop").apply(lambda g: pd.Series({"shop": len(g)}))',
                 "like a group key", id="a value named like the key"),
    pytest.param('result = df.groupby("shop")["n"].apply(lambda s: s.cumsum())', "selected column",
                 id="SeriesGroupBy.apply giving a Series"),
    pytest.param('result = df.groupby("shop").apply(lambda g: g["n"] - g["n"].mean())',
                 "as a value", id="a value per row"),
]


@pytest.mark.parametrize(("source", "reason"), APPLY_TODOS)
def test_groupby_apply_todos(source: str, reason: str) -> None:
    text = check_todo(APPLY + source + "\n", "groupby.apply")
    assert reason in text


def test_groupby_apply_reading_a_key_column_is_a_todo() -> None:
    # pandas 3 does not pass the key columns to the function: it raises KeyError
    result = convert(APPLY + 'result = df.groupby("shop").apply(lambda g: g["shop"].nunique())\n')
    assert any(s.key == "groupby.apply" and s.status == "todo" and "key column" in s.message
               for s in result.sites)


def test_groupby_apply_with_unknown_column_types(tmp_path, monkeypatch) -> None:
    # read without --data: a float value makes the Series float whatever the others are (0.9);
    # with only sums of unknown types the result type is not known (a TODO)
    monkeypatch.chdir(tmp_path)
    (tmp_path / "d.csv").write_text("k,v,w\na,1,2.5\nb,2,\na,3,1.0\n")
    source = ('import pandas as pd\nd = pd.read_csv("d.csv")\n'
              'result = d.groupby("k").apply(lambda g: pd.Series({"v": g["v"].sum(), "m": g["w"].mean()}))\n')
    found = differential(source)
    site = next(s for s in found.sites if s.key == "groupby.apply")
    assert site.status == "converted" and site.confidence == 0.9
    _same_types(source, found.converted_text)
    result = convert('import pandas as pd\nd = pd.read_csv("d.csv")\n'
                     'result = d.groupby("k").apply(lambda g: g["v"].sum())\n')
    assert any(s.key == "groupby.apply" and s.status == "todo" and "--data" in s.message
               for s in result.sites)


def test_group_keys_reaches_the_apply_handed_to_pandas() -> None:
    # a frame per group: group_keys=False keeps the rows' own labels, not the keys (pandas 3.1)
    source = APPLY + 'result = df.groupby("shop", group_keys=False).apply(lambda g: g.head(1))\n'
    text = check_todo(source, "groupby.apply")
    assert 'groupby("shop", group_keys=False)' in text
    differential(source)


def test_a_method_wins_over_a_column_of_its_name() -> None:
    # pandas reads g.size / g.count / g.mean as the methods even when the frame has columns of
    # those names; porter had read them as the columns and called a column
    differential("""
import numpy as np
import pandas as pd
df = pd.DataFrame({"k": ["b", "a", "b", None, "é"], "size": ["s", "l", "s", "m", None],
                   "count": [5, 6, np.nan, 7, 1], "mean": [1.0, None, 3.0, 4.0, 2.0]})
result = df.groupby("k").size()
counts = df.groupby("k").count()
means = df.groupby("k")[["count", "mean"]].mean()
column = df.groupby("k")["count"].size()
""", "result", "counts", "means", "column")


def test_scalar_reductions_are_numpy_numbers_as_in_pandas() -> None:
    # pandas' reductions are np.float64 / np.int64: an empty selection divides to NaN (a
    # Python float from .item() raised ZeroDivisionError) and .round() / .astype() exist
    import warnings
    with warnings.catch_warnings():
        warnings.simplefilter("ignore", RuntimeWarning)
        differential("""
import numpy as np
import pandas as pd
df = pd.DataFrame({"k": ["a", "b", "a", None], "v": [1.5, 2.0, 3.25, np.nan], "n": [1, 2, 3, 4]})
sub = df[df["k"] == "zzz"]
avg = sub["v"].sum() / len(sub)
rate = sub["n"].sum() / sub["n"].count()
mean = df["v"].mean().round(2)
tot = df["n"].sum().astype(float)
share = df["n"].sum() / sub["n"].sum()
kinds = [type(df["v"].sum()).__name__, type(df["n"].sum()).__name__, type(df["v"].mean()).__name__]
""", "avg", "rate", "mean", "tot", "share", "kinds")


def test_max_of_a_datetime_column_is_a_timestamp() -> None:
    # pandas gives a Timestamp (day_name(), quarter, normalize()...): so does the conversion
    result = differential("""
import pandas as pd
df = pd.DataFrame({"t": ["2024-01-31 10:30", "2024-02-29 08:00"]})
df["d"] = pd.to_datetime(df["t"])
last = df["d"].max()
result = [last.day_name(), last.quarter, str(last.normalize()), str(last), last.dayofyear]
""")
    site = next(s for s in result.sites if s.key == "series.max")
    assert site.confidence == 1.0


def test_sums_of_a_true_false_column_of_unknown_type_do_not_wrap(tmp_path, monkeypatch) -> None:
    # read from a file without --data: porter does not know "ok" holds True/False, whose sum is
    # UInt32 in Polars (1 - 3 wrapped to 4294967294); pandas counts them as int64
    (tmp_path / "flags.csv").write_text("k,ok,n\na,True,1\na,False,2\nb,True,3\n", encoding="utf-8")
    monkeypatch.chdir(tmp_path)
    differential('''
import pandas as pd
df = pd.read_csv("flags.csv")
g = df.groupby("k")["ok"].sum().reset_index()
g["short"] = g["ok"] - 3
result = df.groupby("k").sum().reset_index()
result["less"] = result["ok"] - 3
''', "g", "result")


# -- any / all ----------------------------------------------------------------------------------

ANY_ALL = [
    pytest.param('df.groupby("shop")["qty"].{how}()', id="floats: NaN skipped, a group of only NaN"),
    pytest.param('df.groupby("shop")["n"].{how}()', id="integers"),
    pytest.param('df.groupby("shop")["t"].{how}()', id="text with None and unicode"),
    pytest.param('df.groupby("shop")[["qty", "n"]].{how}()', id="two columns"),
    pytest.param('df.assign(z=df["n"] - 8).groupby("shop")["z"].{how}()', id="zeros"),
    pytest.param('df.assign(e=df["t"].fillna("")).groupby("shop")["e"].{how}()', id="empty texts"),
    pytest.param('df.assign(b=df["n"] > 4).groupby("shop").agg(x=("b", "{how}"), y=("qty", "{how}"))',
                 id="named aggregation of booleans"),
    pytest.param('df[df["n"] > 100].groupby("shop")["qty"].{how}()', id="empty frame"),
]


@pytest.mark.parametrize("how", ["any", "all"])
@pytest.mark.parametrize("expr", ANY_ALL)
def test_groupby_any_all_matches_pandas(expr: str, how: str) -> None:
    differential(FRAME + f"result = {expr.format(how=how)}\n")


@pytest.mark.parametrize("known", [False, True], ids=["unknown types", "types from --data"])
def test_groupby_any_all_of_read_booleans_with_missing_values(tmp_path, monkeypatch, known) -> None:
    # pandas reads True/False with a blank as an object column and skips the missing value
    monkeypatch.chdir(tmp_path)
    (tmp_path / "d.csv").write_text("k,ok,v\na,True,1.5\na,,0\nb,,\nc,False,0\nc,True,\nd,False,2\n")
    options = {"data_dir": str(tmp_path)} if known else {}
    found = differential('import pandas as pd\nd = pd.read_csv("d.csv")\n'
                         'result = d.groupby("k").agg(a=("ok", "any"), b=("ok", "all"), '
                         'c=("v", "any"), e=("v", "all"))\n', **options)
    assert '.any().alias("a")' in found.converted_text


def test_groupby_any_skipna_false_is_a_todo() -> None:
    check_todo(FRAME + 'r = df.groupby("shop")["qty"].any(skipna=False)\n', "groupby.any")


def test_timestamp_attributes_of_the_latest_date() -> None:
    # pandas gives a Timestamp; porter collects a Python datetime, which has no day_name() or
    # quarter: they are written with the datetime's own methods (it had crashed)
    differential('''
import pandas as pd
df = pd.DataFrame({"d": ["2024-02-29 10:00", None, "2023-12-31 23:59", "2024-07-01 00:00"]})
df["d"] = pd.to_datetime(df["d"], format="%Y-%m-%d %H:%M")
last = df["d"].max()
first = df["d"].min()
result = [last.day_name(), first.month_name(), last.quarter, first.quarter, last.dayofweek,
          last.dayofyear, first.is_month_start, last.strftime("%Y-%m-%d")]
''')


# bins "neg" and "mid" hold no row; "low" and "high" tie
BINNED = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({"v": [1.0, 5.0, 2.0, 8.0, np.nan, 30.0]})
df["bin"] = pd.cut(df["v"], bins=[-5, 0, 2.5, 4, 10, 50], labels=["neg", "low", "mid", "high", "top"])
"""


@pytest.mark.parametrize("call", [
    "value_counts()", "value_counts(sort=False)", "value_counts(ascending=True)",
    "value_counts(normalize=True)", "value_counts(dropna=False)",
    "value_counts(dropna=False, sort=False)",
])
def test_value_counts_of_binned_values_lists_every_category(call: str) -> None:
    # pandas counts a Categorical by its categories: the empty bins as 0, in the labels' order
    # (sort=False), ties ordered by category when sorted
    result = differential(BINNED + f'result = df["bin"].{call}\nempty = df[df["v"] > 100]["bin"].{call}\n',
                          "result", "empty")
    assert "pandas_category_counts(" in result.converted_text


def test_value_counts_of_a_categorical_with_its_categories_written_out() -> None:
    differential("""
import pandas as pd
df = pd.DataFrame({"size": ["XL", "L", "S", "L"], "v": [1, 2, 3, 4]})
df["size"] = pd.Categorical(df["size"], categories=["S", "M", "L", "XL"], ordered=True)
result = df["size"].value_counts(sort=False)
ties = df["size"].value_counts()
big = df[df["v"] > 1]["size"].value_counts(sort=False)
""", "result", "ties", "big")


def test_value_counts_of_astype_category_is_a_todo() -> None:
    result = convert(FRAME + 'df["t"] = df["t"].astype("category")\nresult = df["t"].value_counts()\n')
    assert any(s.key == "series.value_counts" for s in result.todos)


def test_grouping_by_a_series_of_another_frame_aligns_like_pandas() -> None:
    # the other frame's "k" has the name of a column of `df`, not its values: pandas aligns
    # it on the row labels
    source = '''
import pandas as pd
df = pd.DataFrame({"k": ["a", "b", "a", "c"], "v": [1, 2, 3, 4]})
other = pd.DataFrame({"k": ["x", "x", "y", "y"]})
result = df.groupby(other["k"])["v"].sum()
'''
    converted = differential(source).converted_text
    assert "TODO(porter): frame.groupby" in converted


# A missing timestamp, two readings on one day late and early, a missing key, unicode text.
COMPUTED_KEYS = '''
import pandas as pd
df = pd.DataFrame({"ts": ["2024-01-01 10:00", "2024-01-01 23:00", None, "2024-12-31 23:59",
                          "2025-01-01 00:00", "2024-01-03 02:00"],
                   "eur": [1.5, 2.0, 3.0, None, 4.0, 0.5],
                   "k": ["a", "b", "a", "b", None, "ø"]})
df["ts"] = pd.to_datetime(df["ts"], format="%Y-%m-%d %H:%M")
'''


@pytest.mark.parametrize("expr", [
    'df.groupby(df["ts"].dt.date)["eur"].sum().round(2).rename_axis("day").reset_index()',
    'df.groupby(df["ts"].dt.year)[["eur"]].mean()',
    'df.groupby(df["ts"].dt.month, sort=False)["eur"].count()',
    'df.groupby(df["k"].str.upper())["eur"].agg(["sum", "size"])',
    'df.groupby(df["k"].str.upper(), dropna=False)["eur"].max()',
    'df.groupby(df["eur"] > 1)["k"].first()',
    'df.groupby(df["ts"].dt.date)["eur"].apply(lambda s: s.iloc[-1])',
])
def test_grouping_by_a_computed_series_matches_pandas(expr: str) -> None:
    result = differential(COMPUTED_KEYS + f"result = {expr}\n")
    assert "TODO" not in result.converted_text


@pytest.mark.parametrize("expr", [
    # pandas aggregates the column the key is named like, too
    pytest.param('df.groupby(df["ts"].dt.date).max()', id="every column"),
    pytest.param('df.groupby(df["ts"].dt.date)["eur"].apply(lambda s: s.cumsum())',
                 id="handed over with pandas' own grouping"),
])
def test_grouping_by_a_computed_series_todos(expr: str) -> None:
    source = COMPUTED_KEYS + f"result = {expr}\n"
    assert any(s.status == "todo" for s in convert(source).sites)
    differential(source)


def test_date_keys_reach_pandas_as_dates() -> None:
    # pandas' index holds datetime.date objects after grouping by a date column; a hand-over
    # gives pandas code the same objects (not Timestamps)
    source = COMPUTED_KEYS + ('df["d"] = df["ts"].dt.date\n'
                              'g = df.groupby("d")["eur"].sum()\n'
                              'result = [type(k).__name__ for k in g.index]\n')
    expected, actual = run(source)["result"], run(convert(source).converted_text)["result"]
    assert expected == actual


@pytest.mark.parametrize("expr", [
    'df.groupby("k")["eur"].sum().rename_axis("key").reset_index()',
    'df.groupby(["k", df["ts"].dt.year.rename("y")])["eur"].sum()',
    'df.groupby("k")[["eur"]].sum().rename_axis(index="key").reset_index()',
    'df.groupby("k")[["eur"]].sum().rename_axis(columns=None)',
])
def test_rename_axis_matches_pandas(expr: str) -> None:
    differential(COMPUTED_KEYS + f"result = {expr}\n")


PIVOT_FRAME = '''
import pandas as pd
df = pd.DataFrame({"band": ["b", "a", "b", "a", "c", None], "voice": ["alto", "alto", "bass",
                   "bass", "alto", "bass"], "att": [0.5, 0.25, 1.0, None, 0.75, 0.1],
                   "n": [1, 2, 3, 4, 5, 6], "t": ["x", "y", "z", "ü", "v", ""]})
'''


@pytest.mark.parametrize("values", ["att", "n", "t"])
def test_pivot_matches_pandas(values: str) -> None:
    # a missing index key is a row of its own (first, as pandas sorts it); a combination no
    # row has is missing, and makes the int cells float in pandas
    result = differential(PIVOT_FRAME + f'result = df.pivot(index="band", columns="voice", '
                                        f'values="{values}")\nflat = result.reset_index()\n',
                          "result", "flat")
    assert "TODO" not in result.converted_text


@pytest.mark.parametrize("columns, values", [("band", "att"), ("band", "n"), ("att", "t")])
def test_pivot_by_a_key_with_a_missing_value_names_its_column_nan(columns: str, values: str) -> None:
    # pandas labels the column of a missing key NaN (its text "nan"); Polars names it "null"
    result = differential(PIVOT_FRAME + f'result = df.pivot(index="voice", columns="{columns}", '
                                        f'values="{values}")\nflat = result.reset_index()\n',
                          "result", "flat")
    assert "TODO" not in result.converted_text


def test_pivot_of_a_repeated_combination_raises_in_both() -> None:
    source = PIVOT_FRAME + ('result = df.assign(band="b")'
                            '.pivot(index="voice", columns="band", values="n")\n')
    with pytest.raises(ValueError):
        run(source)
    with pytest.raises(Exception, match="(?i)single value|duplicate"):
        run(convert(source).converted_text)["result"].collect()


EXTREMES = '''
import pandas as pd
df = pd.DataFrame({"st": ["b", "a", "b", None, "a", "b", "ø"], "t": [3.0, 1.0, -2.0, -9.0, 1.0, -2.0, None],
                   "z": [1, 5, 5, 0, 2, 5, 7], "d": ["x", "y", "z", "w", "v", "u", "s"]})
'''


@pytest.mark.parametrize("expr", [
    # ties: the first of equal values; a missing value skipped; the missing key left out;
    # rows in the keys' order
    'df.loc[df.groupby("st")["t"].idxmin(), ["st", "d", "t"]]',
    'df.loc[df.groupby("st")["z"].idxmax()]',
    'df.loc[df.groupby(["st", "z"])["t"].idxmin()]',
    'df.groupby("st")["z"].idxmin()',
])
def test_group_extreme_labels_match_pandas(expr: str) -> None:
    source = EXTREMES.replace("None],", "4.0],") + f"result = {expr}\n"
    result = differential(source)
    assert "TODO" not in result.converted_text


def test_group_extreme_labels_after_a_sort_pick_the_rows_pandas_picks() -> None:
    # after a sort the labels are the original row numbers: the rows picked by them are
    # pandas' own (once a TODO that kept the frame on pandas; now the labels carried as a
    # column where the script can make no nullable ints), checked against pandas
    source = EXTREMES.replace("None],", "4.0],") + (
        'df = df.sort_values("z")\nresult = df.loc[df.groupby("st")["t"].idxmin()]\n')
    differential(source)


@pytest.mark.parametrize("expr", [
    'df.groupby("st").ngroups',
    'df.groupby(["st", "z"]).ngroups',
    'df.groupby("st", dropna=False).ngroups',
    'df.groupby("st")["t"].ngroups',
    'sorted(df.groupby("st").groups.keys())',
])
def test_group_counts_match_pandas(expr: str) -> None:
    differential(EXTREMES + f"result = {expr}\nprint({expr})\n")


def test_a_groupby_kept_in_a_name_sees_the_frame_changed_in_place() -> None:
    # pandas' GroupBy holds the frame object, which df["x"] = ... changes
    source = '''
import pandas as pd
df = pd.DataFrame({"k": ["a", "b", "a", None], "x": [1, 2, 3, 4]})
g = df.groupby("k")
df["x"] = df["x"] * 100
s = g["x"].sum()
df["old_mean"] = g["x"].transform("mean")
'''
    result = differential(source, "df", "s")
    assert "TODO" not in result.converted_text


def test_describe_and_pivot_by_dates_or_flags_stay_pandas() -> None:
    # pandas describes the datetime column too (handed over: pandas describes the collected
    # frame), and labels pivoted columns by Timestamps and True/False: kept on pandas, the
    # values are pandas' own
    source = '''
import pandas as pd
df = pd.DataFrame({"n": [3, 5, 4], "day": ["2024-01-31", "2024-02-29", "2024-03-01"],
                   "k": ["a", "b", "a"], "f": [True, False, True]})
df["day"] = pd.to_datetime(df["day"], format="%Y-%m-%d")
d = df.describe()
p = df.pivot_table(index="k", columns="day", values="n", aggfunc="sum")
q = df.pivot_table(index="k", columns="f", values="n", aggfunc="sum")
r = df.pivot(index="k", columns="day", values="n")
'''
    result = differential(source, "d", "p", "q", "r")
    keys = {s.key for s in result.sites if s.status == "todo"}
    assert "frame.pivot_table" in keys
    assert {s.status for s in result.sites if s.key == "frame.describe"} == {"handover"}


def test_the_sum_of_a_text_column_joins_the_texts() -> None:
    source = ('import pandas as pd\ndf = pd.DataFrame({"s": ["a", "b", None, "ø", ""]})\n'
              'result = df["s"].sum()\nshown = f"codes: {df[\'s\'].sum()}"\n')
    differential(source, "result", "shown")


def test_a_column_groupby_kept_in_a_name_keeps_the_column_as_it_was() -> None:
    # pandas' SeriesGroupBy holds the column taken, not the frame: df["x"] = ... after it
    # does not change what it sums (a DataFrameGroupBy would see the new column)
    source = '''
import pandas as pd
df = pd.DataFrame({"k": ["a", "b", "a", None], "x": [1, 2, 3, 4], "y": [5, 6, 7, 8]})
g = df.groupby("k")["x"]
df["x"] = df["x"] * 100
df.insert(0, "n", 1)
s = g.sum()
'''
    differential(source, "df", "s")


@pytest.mark.parametrize("values, q", [
    ("[1.0, 2.0, np.inf]", 0.5),  # the position falls on 2.0; numpy reads inf next: NaN
    ("[-np.inf, 2.0, 3.0]", 0.0),  # on -inf itself: NaN
    ("[1.0, np.inf, np.inf, 4.0]", 0.25),  # between 1.0 and 4.0, no infinity read
    ("[1.0, 2.0, np.inf]", 1.0),  # the last value, inf
])
def test_quantile_with_infinite_values_is_numpys(values, q):
    differential(f'''
import numpy as np
import pandas as pd
df = pd.DataFrame({{"x": {values}}})
result = df["x"].quantile({q})
''')


# s.idxmax() / idxmin(): the label of the first extreme value, missing values skipped
EXTREME_LABELS = [
    pytest.param('r = (df["qty"].idxmax(), df["qty"].idxmin(), df["n"].idxmax(), df["t"].idxmin())',
                 id="row labels of a frame labelled 0..n-1, ties and NaN"),
    pytest.param('per = df.groupby("shop")["n"].sum()\nr = (per.idxmax(), per.idxmin())',
                 id="the key of a groupby result"),
    pytest.param('r = (df.loc[df["n"].idxmax(), "t"], df.loc[df["qty"].idxmin(), "n"])',
                 id="the value on that row"),
    pytest.param('per = df.groupby("shop").agg(q=("qty", "sum"), k=("n", "max"))\n'
                 'r = per.loc[per["q"].idxmax(), "k"]', id="the value on a groupby result's row"),
]


@pytest.mark.parametrize("before", EXTREME_LABELS)
def test_extreme_labels_match_pandas(before: str) -> None:
    result = differential(FRAME + before + "\n", "r")
    assert "TODO" not in result.converted_text, result.converted_text
    assert "to_pandas" not in result.converted_text


def test_extreme_label_after_a_filter_stays_todo() -> None:
    # the labels are the original row numbers: arg_max of the filtered rows is another number
    check_todo(FRAME + 'r = df[df["n"] > 3]["qty"].idxmax()\n', "series.idxmax")


@pytest.mark.parametrize("values", [
    [i % 4 for i in range(40)],
    [float((i * 7) % 5) for i in range(33)],
    [1, 3, 3, 0, 3, 2, 3, 1, 0, 0, 3],
])
def test_extreme_labels_are_the_first_of_ties(values: list[float]) -> None:
    # pandas' label is the first of equal extremes (Polars' arg_max of a lazy select is not
    # always the first one)
    differential(f'import pandas as pd\ndf = pd.DataFrame({{"v": {values}}})\n'
                 'r = (df["v"].idxmax(), df["v"].idxmin(), df["v"].value_counts().idxmax())\n', "r")


def test_agg_function_with_a_float_branch_says_pandas_may_keep_ints() -> None:
    # pandas' result is int64 when no group takes the 0.5 branch; Polars' branches share Float64
    result = convert(FRAME + 'r = df.groupby("shop")["n"].agg(lambda s: s.sum() if s.sum() > 3 else 0.5)\n')
    site = next(s for s in result.sites if s.key == "groupby.agg")
    assert site.confidence <= 0.9 and "float branch" in site.message


def test_observed_false_on_keys_that_are_not_categories_changes_nothing() -> None:
    # observed=False adds the unseen categories of a Categorical key; text and number keys
    # have none
    result = differential(FRAME + 'r = df.groupby(["shop", "n"], observed=False)["qty"].sum()\n', "r")
    assert "TODO" not in result.converted_text


def test_observed_false_on_a_category_key_stays_todo() -> None:
    check_todo(FRAME + 'df["shop"] = df["shop"].astype("category")\n'
               'r = df.groupby("shop", observed=False)["qty"].sum()\n', "frame.groupby")


def test_nunique_dropna_false_counts_missing_values_once() -> None:
    # NaN and None are one missing value to pandas
    result = differential(FRAME + 'r = (df["qty"].nunique(dropna=False), df["shop"].nunique(dropna=False),'
                          ' df["n"].nunique(dropna=False), df["t"].nunique(dropna=True))\n', "r")
    assert "TODO" not in result.converted_text


def test_pivot_table_observed_false_on_a_cut_keeps_unused_categories(tmp_path):
    """pivot_table(observed=False) on a pd.cut category: pandas keeps the bins no row falls
    in (a row or column of 0 for a count, of missing cells otherwise); the pivot of the
    groups would drop them. A TODO where the category is an index key or the function is not a
    count: pandas computes it; a count by a category columns key is ported
    (test_pivot_table_every_category.py)."""
    from support import same_text
    result = same_text('''
        import pandas as pd
        df = pd.read_csv("d.csv")
        df["band"] = pd.cut(df["depth"], bins=[0, 5, 10, 30], labels=["shallow", "mid", "deep"])
        pt = df.pivot_table(index="band", columns="site", values="id", aggfunc="count", observed=False)
        pt.to_csv("out_pt.csv")
        pt3 = df.pivot_table(index="site", columns="band", values="depth", aggfunc="sum",
                             observed=False)
        pt3.to_csv("out_pt3.csv")
        pt4 = df.pivot_table(index="site", columns="band", values="id", aggfunc="count",
                             fill_value=0, observed=False)
        pt4.to_csv("out_pt4.csv")
    ''', tmp_path, {"d.csv": "id,depth,site\n1,1,A\n2,3,B\n3,25,A\n"})
    statuses = [s.status for s in sorted(result.sites, key=lambda s: s.line)
                if s.key == "frame.pivot_table"]
    assert statuses == ["todo", "todo", "converted"]


def test_missing_true_false_value_is_nan_in_unique_and_counts(tmp_path) -> None:
    # pandas' True/False column with a blank is an object column: its missing value is nan
    # in unique() and in value_counts(dropna=False)'s labels, not None
    from support import same_text
    same_text("""
        import pandas as pd
        df = pd.read_csv("ferry.csv")
        print(df["ok"].value_counts(dropna=False).to_dict())
        print(df["ok"].value_counts().to_dict())
        print(df["ok"].unique().tolist())
        print(df["ok"].unique())
        """, tmp_path, {"ferry.csv": "trip,ok\na,True\nb,False\nc,\nd,True\n"})


def test_reduction_of_a_column_pandas_made_float_by_a_missing_value(tmp_path) -> None:
    # map() with a dict that misses a value makes pandas' column float64 (its sum prints
    # 80.0); one that finds every value keeps int64 (150); Polars keeps Int64 either way
    same_text("""
        import pandas as pd
        df = pd.read_csv("ferries.csv")
        df["some"] = df["crossings"].map({3: 30, 5: 50})
        df["every"] = df["crossings"].map({3: 30, 5: 50, 2: 20, 4: 40, 1: 10})
        df["none"] = df["crossings"].map({9: 90})
        df["gone"] = df["crossings"].replace(3, float("nan"))
        print(df["some"].sum(), df["some"].max(), df["some"].min())
        print(df["every"].sum(), df["every"].max(), df["every"].min())
        print(df["none"].sum(), df["none"].max(), df["gone"].sum(), df["gone"].max())
        print(df["crossings"].map({3: 30, 5: 50}).sum(), f"{df['some'].max()}")
    """, tmp_path, {"ferries.csv": "ferry,crossings\nA,3\nB,5\nC,2\nD,4\nE,1\n"})


def test_value_counts_shows_the_zero_met_first(tmp_path) -> None:
    # 0.0 and -0.0 are one value: pandas shows the one it met first (0.0 here); a lazy
    # group_by kept -0.0
    same_text("""
        import pandas as pd
        df = pd.read_csv("k.csv")
        vc = df["temp"].value_counts()
        print(vc.index.tolist())
        vc.to_csv("vc.csv")
        print(df["temp"].value_counts(dropna=False, normalize=True).to_dict())
        print(df["temp"].value_counts(sort=False).to_dict())
    """, tmp_path, {"k.csv": "kiln,temp\nA,0.0\nB,-0.0\nC,1.5\nD,-0.0\nE,0.0\nF,\n"})


def test_min_max_in_a_loop_over_columns_are_pandas_values(tmp_path) -> None:
    # a column named by a loop variable has no known type: its max of no values printed
    # None where pandas prints nan (NaT for dates); numbers, dates and text as pandas'
    same_text("""
        import pandas as pd
        df = pd.read_csv("b.csv", parse_dates=["day"])
        for c in ["fare", "tips", "day", "n", "ok", "note"]:
            print(c, df[c].max(), df[c].min(), repr(df[c].max()))
        empty = df[df["n"] > 100]
        for c in ["fare", "day", "n", "note"]:
            print(c, f"{empty[c].max()}", empty[c].min())
        for c in ["day"]:
            print(df[c].max().strftime("%Y-%m"), (df[c].max() - df[c].min()).days)
    """, tmp_path, {"b.csv": "boat,fare,tips,day,n,ok,note\n"
                             "A,3.5,,2024-01-02,3,True,x\nB,2.0,,2024-03-01,5,False,\n"
                             "C,4.25,,,1,True,y\n"})


def test_groupby_of_a_column_pandas_made_float_is_float(tmp_path) -> None:
    # map() that misses a value makes pandas' column float64: its group sums are written 50.0
    # (the column is made Float64 where it is set, as it holds a missing value there)
    result = same_text("""
        import pandas as pd
        df = pd.DataFrame({"grade": ["low", "high", "mid"], "crossings": [3, 5, 2]})
        df["c4"] = df["crossings"].map({3: 30, 5: 50})
        g = df.groupby("grade")["c4"].sum()
        h = df.groupby("grade").agg(total=("c4", "sum"), n=("c4", "count"))
        k = df.groupby("grade")["crossings"].sum()
        print(g.tolist(), h["total"].tolist(), k.tolist())
        h.to_csv("h.csv")
    """, tmp_path)
    sites = {(s.line, s.key): s for s in result.sites}
    assert sites[(5, "groupby.sum")].confidence == 1.0
    assert sites[(6, "groupby.agg")].confidence == 1.0


def test_sum_of_a_float32_column_as_pandas_adds_it(tmp_path) -> None:
    # pandas adds float32 values as numpy does (pairwise, in float32): 57.8; Polars' lazy sum
    # gave 57.800003. A float64 column of the same script is still pandas' sum
    same_text("""
        import pandas as pd
        df = pd.read_csv("kilns.csv", dtype={"w": "float32"})
        df["x"] = (df["w"] * 3).round(1)
        df["v"] = df["w"].astype("float64") / 7
        print(df["x"].sum(), df["w"].sum(), df["v"].sum(), f"{df['x'].sum():.6f}")
        print(df[df["w"] > 100]["x"].sum())
    """, tmp_path, {"kilns.csv": "kiln,w\nA,1.005\nB,2.675\nC,0.125\nD,3.14159\nE,\nF,12.345678\n"})


def test_groups_of_a_true_false_key_with_missing_values_kept_in_pandas_order(tmp_path) -> None:
    # read_csv makes a True/False column with a gap an object column: pandas sorts its groups
    # (dropna=False) as numpy sorts objects, NaN neither below nor above anything: NaN met
    # between True and False stays there, NaN met first stays first
    files = {"ferry.csv": "boat,late,pax\nA,True,1\nB,,2\nC,False,3\nD,True,4\n",
             "ferry2.csv": "boat,late,pax\nA,,1\nB,True,2\nC,False,3\nD,,4\n"}
    same_text("""
        import pandas as pd
        df = pd.read_csv("ferry.csv")
        df.groupby("late", dropna=False)["pax"].sum().to_csv("one.csv")
        df.groupby(["late", "boat"], dropna=False).agg(n=("pax", "size")).to_csv("two.csv")
        df.groupby("late", dropna=False)["pax"].rolling(2, min_periods=1).sum().to_csv("w.csv")
        print(df[df["pax"] > 1].groupby("late", dropna=False)["pax"].max().tolist())
        df2 = pd.read_csv("ferry2.csv")
        print(df2.groupby("late", dropna=False)["pax"].sum().tolist())
        df2.groupby(["boat", "late"], dropna=False)["pax"].mean().to_csv("three.csv")
    """, tmp_path, files)


def test_group_sums_of_a_true_false_column_as_read_say_pandas_may_keep_a_lone_value(tmp_path) -> None:
    # read_csv makes a True/False column with a gap an object column: pandas' group sum of a
    # group holding only False is False (Python's sum from the first value), porter's 0
    (tmp_path / "orchard.csv").write_text("row,late,kg\nA,True,2.5\nB,,4.0\nC,False,3.5\n")
    result = convert("""
        import pandas as pd
        df = pd.read_csv("orchard.csv")
        a = df.groupby("row")["late"].sum()
        b = df.groupby("row").agg(n=("late", "sum"), kg=("kg", "sum"))
        df["heavy"] = df["kg"] > 3
        c = df.groupby("row")["heavy"].sum()
    """, data_dir=str(tmp_path))
    sites = {(s.line, s.key): s for s in result.sites}
    assert sites[(4, "groupby.sum")].confidence <= 0.9
    assert "object column" in sites[(4, "groupby.sum")].message
    assert sites[(5, "groupby.agg")].confidence <= 0.9
    assert sites[(7, "groupby.sum")].confidence == 1.0


def test_min_max_of_no_text_or_dates_are_pandas_nan_and_nat(tmp_path) -> None:
    # an empty selection or only missing values: pandas gives nan for text and NaT for dates
    # (and max - min is NaT), where item() gave None and None - None failed
    same_text("""
        import pandas as pd
        df = pd.read_csv("glass.csv")
        df["d"] = pd.to_datetime(df["d"], format="%Y-%m-%d")
        e = df[df["x"] > 100]
        print("max s:", e["s"].max(), "min s:", e["s"].min(), df[df["x"] == 2]["s"].max())
        print("max d:", e["d"].max(), "min d:", df[df["x"] == 2]["d"].min())
        print("span", e["d"].max() - e["d"].min(), df["d"].max() - df["d"].min())
        print(df["s"].max(), df["d"].max(), df["d"].max().year, f"{df['d'].min():%Y-%m}")
        df["gap"] = (df["d"].max() - df["d"]).dt.days
        df["first"] = df["s"] == df["s"].min()
        df.to_csv("o.csv", index=False)
    """, tmp_path, {"glass.csv": "s,x,d\nab,1,2024-01-01\n,2,\ncd,3,2024-02-01\n"})


def test_quantile_nearest_rounds_a_half_position_to_even(tmp_path) -> None:
    # numpy rounds a .5 position half to even (the median of 10, 11 is 10), Polars' "nearest"
    # up; lower / higher / nearest of whole numbers are ints in pandas (floats with a gap)
    same_text("""
        import pandas as pd
        df = pd.read_csv("kiln.csv")
        print(df[df["k"] == "a"]["v"].quantile(0.5, interpolation="nearest"))
        print(df["v"].quantile(0.5, interpolation="lower"), df["v"].quantile(0.3, interpolation="higher"))
        for q in [0.0, 0.1, 0.25, 0.5, 0.625, 0.75, 0.9, 1.0]:
            print(q, df["v"].quantile(q, interpolation="nearest"),
                  df["w"].quantile(q, interpolation="nearest"),
                  df[df["k"] == "z"]["v"].quantile(q, interpolation="nearest"))
        df["x"] = df["v"].where(df["v"] > 11)
        print(df["x"].quantile(0.5, interpolation="nearest"), df["x"].quantile(0.5, interpolation="lower"))
    """, tmp_path, {"kiln.csv": "k,v,w\na,10,1.5\na,11,\nb,10,2.5\nb,11,3.5\nb,12,1.0\nb,13,2.0\n"
                                "b,14,\nb,15,0.5\n"})


def test_zero_of_a_float_key_among_several_is_the_zero_met_first(tmp_path) -> None:
    # pandas' one group of 0.0 and -0.0 is labelled with the zero it met first (-0.0 here, in
    # every combination); Polars' group_by on several keys wrote 0.0
    same_text("""
        import pandas as pd
        df = pd.read_csv("tide.csv")
        df.groupby(["d", "f"], dropna=False)["v"].sum().to_csv("by_df.csv")
        df.groupby(["f", "d"])["v"].sum().to_csv("by_fd.csv")
        df.groupby("f", dropna=False)["v"].sum().to_csv("by_f.csv")
    """, tmp_path, {"tide.csv": "d,f,b,v\nx,1.5,1,1\nx,,2,2\nx,-0.0,3,3\nx,0.0,4,4\ny,1.5,5,5\n"
                                "y,0.0,6,6\ny,-0.0,7,7\n"})


@pytest.mark.parametrize("step", [
    pytest.param('df.groupby("lot")["grams"].mean().to_csv("g.csv")', id="a column's mean"),
    pytest.param('df.groupby("lot").agg(m=("grams", "mean"), s=("grams", "sum")).to_csv("g.csv")',
                 id="a named aggregation"),
    pytest.param('df[["lot", "grams"]].groupby("lot").mean().to_csv("g.csv")', id="every column"),
    pytest.param('df.pivot_table(index="lot", columns="bin", values="grams").to_csv("g.csv")',
                 id="pivot_table"),
    pytest.param('pd.crosstab(df["lot"], df["bin"], values=df["grams"], aggfunc="mean")'
                 '.to_csv("g.csv")', id="crosstab"),
])
@pytest.mark.parametrize("data", [
    pytest.param("lot,bin,grams\nL1,a,0.1\nL1,a,0.2\nL2,b,0.7\nL3,b,0.3\n",
                 id="sorted keys, nothing missing"),
    pytest.param("lot,bin,grams\nL1,a,0.1\nL1,a,0.2\nL2,b,0.7\nL2,a,\nL3,b,0.3\n",
                 id="a missing value"),
    pytest.param("lot,bin,grams\nL2,b,0.7\nL1,a,0.1\nL3,b,0.3\nL1,a,0.2\n", id="keys unsorted"),
])
def test_group_mean_of_float32_is_pandas(step: str, data: str, tmp_path) -> None:
    # pandas 3.1's group mean of float32 is float64 where the rows come in the order of the
    # sorted keys and nothing is missing (the mean of 0.1 and 0.2 is 0.15000000223517418),
    # float32 otherwise (0.15000000596046448, written 0.15); Polars' mean of Float32 was always
    # Float32: the mean is pandas' (a TODO)
    result = same_text(f"""
        import pandas as pd
        df = pd.read_csv("d.csv", dtype={{"grams": "float32"}})
        {step}
        print(df.groupby("lot")["grams"].mean().tolist())
    """, tmp_path, {"d.csv": data})
    assert result.todos


@pytest.mark.parametrize("step", [
    pytest.param('df.groupby("vessel")["vessel"].count()', id="count of the key"),
    pytest.param('df.groupby(df["vessel"].str.upper())["vessel"].count()',
                 id="a computed key named after the column"),
    pytest.param('df.groupby(df["sail"].dt.year)["sail"].count()', id="the year of a date column"),
    pytest.param('df.groupby("vessel")[["vessel", "pax"]].count()', id="the key among columns"),
    pytest.param('df.groupby("vessel").agg({"vessel": "count"})', id="agg dict"),
    pytest.param('df.groupby("vessel", as_index=False).agg({"vessel": "count", "pax": "sum"})',
                 id="as_index=False"),
    pytest.param('df.groupby("vessel")["vessel"].nunique().reset_index(name="n")', id="renamed"),
])
def test_aggregating_the_group_key_itself_is_pandas(step: str, tmp_path) -> None:
    # pandas keeps the key in the index and the aggregate under the same name (written
    # vessel,vessel); Polars' group_by stopped on the duplicate name (DuplicateError)
    result = same_text(f"""
        import pandas as pd
        df = pd.read_csv("d.csv", parse_dates=["sail"])
        r = {step}
        r.to_csv("r.csv")
        print(len(r))
    """, tmp_path, {"d.csv": "vessel,pax,sail\nGull,3,2024-01-02\nTern,,2023-05-06\n"
                             "Gull,5,2024-07-08\ngull,2,\n"})
    assert result.todos


@pytest.mark.parametrize("step", [
    pytest.param('df["count"].value_counts()', id="a column named count"),
    pytest.param('df["proportion"].value_counts(normalize=True)', id="proportion, normalized"),
    pytest.param('df["count"].value_counts(normalize=True)', id="count, normalized"),
])
def test_value_counts_of_a_column_named_like_its_result(step: str, tmp_path) -> None:
    # pandas names the counts "count" (or "proportion") and keeps the values in the index
    # under the column's name: count,count written; the Polars group_by stopped on the
    # duplicate name
    same_text(f"""
        import pandas as pd
        df = pd.read_csv("d.csv")
        df["proportion"] = df["count"]
        r = {step}
        r.to_csv("r.csv")
        print(r.to_dict())
    """, tmp_path, {"d.csv": "species,count\nwren,3\nrobin,1\ntit,3\njay,\n"})
