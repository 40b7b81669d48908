"""Rule cases and differential checks for porter/rules/reshape.py (crosstab, unstack, melt,
get_dummies, qcut).

pandas is the reference implementation: every differential check runs the snippet with pandas
and its conversion with Polars and compares what they computed (pandas' index becomes columns).
"""

from __future__ import annotations

import pytest

from rule_checks import check_ports, check_todo
from support import column_kinds, convert, differential, run, same_text

# A missing key of each kind (None and NaN), unicode keys, a column key ("r") seen with one
# index key only, a row ("é") whose other key is missing, NaN values, ties.
FRAME = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "shop": ["b", "a", None, "b", "a", "c", np.nan, "Éclair", "c", "a"],
    "kind": ["p", "q", "q", None, "p", "r", "p", "q", "p", "p"],
    "qty": [1.0, np.nan, 3.0, 4.0, 5.0, np.nan, 2.0, 2.0, 7.5, 0.5],
    "n": [1, 2, 3, 4, 5, 6, 7, 8, 8, 2],
    "size": [3, 1, 1, 2, 3, 3, 1, 2, 2, 3],
})
"""


def _todo_keys(source: str) -> list[str]:
    return [s.key for s in convert(source).todos]


# -- crosstab -----------------------------------------------------------------------------------

def test_crosstab_ports_to_a_pivot_of_counts() -> None:
    text = check_ports(FRAME + 'result = pd.crosstab(df["shop"], df["kind"])\n',
                       '.group_by(["shop", "kind"]).agg(pl.len().cast(pl.Int64))')
    assert '.pivot(on="kind", index="shop", values="len")' in text
    assert 'pl.exclude("shop").fill_null(0)' in text


@pytest.mark.parametrize("call", [
    'pd.crosstab(df["shop"], df["kind"])',
    'pd.crosstab(df.shop, df.kind)',
    'pd.crosstab(index=df["kind"], columns=df["shop"])',
    'pd.crosstab(df["shop"], df["size"])',  # number labels: named as text by Polars
    'pd.crosstab([df["shop"], df["kind"]], df["size"])',
    'pd.crosstab([df["shop"], df["kind"]], df["size"], normalize="index")',
    'pd.crosstab(df["shop"].str.upper(), df["kind"])',
    'pd.crosstab(df["shop"], df["kind"], rownames=["where"], colnames=["what"])',
    'pd.crosstab(df["shop"], df["kind"], normalize=True)',
    'pd.crosstab(df["shop"], df["kind"], normalize="all")',
    'pd.crosstab(df["shop"], df["kind"], normalize="index")',
    'pd.crosstab(df["shop"], df["kind"], normalize="columns")',
    'pd.crosstab(df["shop"], df["kind"], normalize=0)',
    'pd.crosstab(df["shop"], df["kind"], normalize=1)',
    'pd.crosstab(df["shop"], df["kind"], values=df["qty"], aggfunc="mean")',
    'pd.crosstab(df["shop"], df["kind"], values=df["n"], aggfunc="median")',
    'pd.crosstab(df["shop"], df["kind"], values=df["qty"], aggfunc="sum")',
    'pd.crosstab(df["shop"], df["kind"], values=df["qty"], aggfunc="max")',
    'pd.crosstab(df["kind"], df["shop"], values=df["qty"], aggfunc=np.mean)',
    'pd.crosstab(df["qty"] > 2, df["kind"])',  # NaN > 2 is False, a key like any other
    'pd.crosstab(df["shop"], df["kind"], margins=True)',
    'pd.crosstab(df["shop"], df["kind"], margins=True, margins_name="Total")',
    'pd.crosstab(df["shop"], df["size"], margins=True, normalize=True)',
    'pd.crosstab(df["shop"], df["kind"], margins=True, normalize="index")',
    'pd.crosstab(df["shop"], df["kind"], margins=True, normalize="columns")',
])
def test_crosstab_matches_pandas(call: str) -> None:
    # rows sorted by key (Éclair after the ASCII letters), missing keys dropped, 0 for "r"
    # under every shop but c; a group whose mean is missing dropped (a's "q")
    result = differential(FRAME + f"result = {call}\n")
    assert not result.todos, result.converted_text


def test_crosstab_margins_when_no_row_has_both_keys() -> None:
    # every row misses one key: pandas gives an empty table, Polars' sum_horizontal of no
    # columns raised (with normalize pandas raises too)
    source = FRAME + ('df = df[df["shop"].isna() | df["kind"].isna()]\n'
                      'result = pd.crosstab(df["shop"], df["kind"], margins=True)\n')
    result = differential(source)
    assert not result.todos, result.converted_text


def test_crosstab_after_reset_index_and_round() -> None:
    differential(FRAME + 'result = pd.crosstab(df["shop"], df["kind"], normalize="index")'
                         '.round(3).reset_index()\n')


def test_crosstab_of_no_rows() -> None:
    result = differential(FRAME + 'e = df[df["n"] > 100]\n'
                                  'result = pd.crosstab(e["shop"], e["kind"]).reset_index()\n')
    assert not result.todos


def test_crosstab_normalize_divides_as_pandas() -> None:
    # 1 / 3, 2 / 3, 1 / 7 ... : Polars' reciprocal multiplication would be a digit off
    source = ("import pandas as pd\n"
              "df = pd.DataFrame({'k': list('aaabbbbbbb' * 7), 'c': list('xyz' * 23 + 'x')})\n"
              "result = pd.crosstab(df['k'], df['c'], normalize='index')\n")
    text = differential(source).converted_text
    assert "pandas_div(" in text


def test_crosstab_of_number_labels_lowers_confidence() -> None:
    result = convert(FRAME + 'result = pd.crosstab(df["shop"], df["size"])\n')
    site = next(s for s in result.sites if s.key == "pd.crosstab")
    assert site.confidence == 0.95 and "as text" in site.message


@pytest.mark.parametrize("call", [
    'pd.crosstab(df["shop"], df["kind"], margins=True, values=df["qty"], aggfunc="mean")',
    'pd.crosstab(df["shop"], df["kind"], margins=True, values=df["qty"], aggfunc="sum")',
    'pd.crosstab(df["shop"], df["kind"], margins=True, values=df["qty"], aggfunc="min", '
    'margins_name="Σ")',
])
def test_crosstab_margins_with_values_match_pandas(call: str) -> None:
    result = differential(FRAME + f"result = {call}\n")
    assert "pandas_pivot_margins" in result.converted_text


@pytest.mark.parametrize("call,reason", [
    ('pd.crosstab(df["size"], df["kind"], margins=True)', "margins"),
    ('pd.crosstab(df["shop"], df["kind"], margins=True, values=df["qty"], aggfunc="median")',
     "margins of median"),
    ('pd.crosstab([df["shop"], df["size"]], df["kind"], margins=True)', "margins"),
    ('pd.crosstab(df["shop"], df["kind"], dropna=False)', "dropna=False"),
    # pandas writes a header row per columns key (to_csv); Polars has one level of names
    ('pd.crosstab(df["shop"], [df["kind"], df["size"]])', "two levels"),
    ('pd.crosstab(df["shop"], [df["size"], df["kind"]], normalize="columns")', "two levels"),
    ('pd.crosstab(df["shop"], df["kind"], values=df["n"], aggfunc="sum")', "float"),
    ('pd.crosstab(df["shop"], df["kind"], values=df["qty"], aggfunc="count")', "count"),
    ('pd.crosstab(df["shop"], df["n"] > 3)', "bool"),
    ('pd.crosstab(df["shop"], df["kind"], normalize="index", values=df["qty"], aggfunc="mean")',
     "normalize"),
    ('pd.crosstab(df["shop"].values, df["kind"])', "not columns"),
    ('pd.crosstab(df["shop"], df["kind"], values=df["kind"], aggfunc="max")', "str column"),
])
def test_crosstab_todo(call: str, reason: str) -> None:
    text = check_todo(FRAME + f"result = {call}\n", "pd.crosstab")
    assert reason in text


@pytest.mark.parametrize("call", [
    'pd.crosstab(df["band"], df["kind"])',
    'pd.crosstab(df["shop"], df["band"])',  # "mid" is in no row of shop c: 0
    'pd.crosstab(df["shop"], df["band"], normalize="columns")',
])
def test_crosstab_of_ordered_labels_matches_pandas(call: str) -> None:
    # pd.cut's labels: rows and columns in the labels' order ("lo" < "mid" < "hi"), not by
    # text; a label no row has ("top") is left out, as pandas leaves out unobserved categories
    source = FRAME + ('df["band"] = pd.cut(df["n"], bins=[0, 3, 6, 8, 99], '
                      'labels=["lo", "mid", "hi", "top"])\n'
                      f'result = {call}\n')
    result = differential(source)
    assert not result.todos, result.converted_text


def test_a_table_used_twice_is_not_collected_again() -> None:
    # the pivot and the dummies are built on collected data: the frame is in memory already
    text = convert(FRAME + 'ct = pd.crosstab(df["shop"], df["kind"])\n'
                           'x = pd.get_dummies(df, columns=["kind"])\n'
                           'print(ct)\nprint(ct.shape)\nprint(x)\nprint(len(x))\n').converted_text
    assert "".join(text.split()).count(".lazy().collect().lazy()") == 0, text


def test_crosstab_left_to_pandas_keeps_its_index() -> None:
    # the row keys are pandas' index: a TODO'd crosstab stays a pandas frame (from_pandas
    # would drop them)
    result = differential(FRAME + 'result = pd.crosstab(df["size"], df["kind"], margins=True)\n')
    assert [s.key for s in result.todos] == ["pd.crosstab"]


# -- melt ---------------------------------------------------------------------------------------

# -- unstack ------------------------------------------------------------------------------------

def test_unstack_ports_to_a_pivot_of_the_groups() -> None:
    text = check_ports(FRAME + 'result = df.groupby(["shop", "kind"])["n"].sum().unstack()\n',
                       '.pivot(on="kind", index="shop", values="n")')
    assert '.pipe(pandas_unstacked, "shop")' in text and "def pandas_unstacked(" in text


@pytest.mark.parametrize("call", [
    # a combination no row has (shop c, kind q): every cell float, as pandas makes it
    'df.groupby(["shop", "kind"])["n"].sum().unstack()',
    'df.groupby(["shop", "kind"]).size().unstack()',
    'df.groupby(["shop", "kind"])["n"].count().unstack(fill_value=0)',
    'df.groupby(["shop", "kind"])["qty"].mean().unstack()',
    'df.groupby(["shop", "kind"])["qty"].max().unstack(level=0)',
    'df.groupby(["shop", "kind"])["n"].sum().unstack("shop", fill_value=-1)',
    'df.groupby(["shop", "kind", "size"])["n"].sum().unstack()',
    'df.groupby(["shop", "kind", "size"])["n"].sum().unstack(1)',
    'df.groupby(["kind", "size"])["n"].sum().unstack()',
    'df.groupby(["shop", "kind"]).agg(total=("n", "sum"), top=("qty", "max"))["total"].unstack()',
    '(df.groupby(["shop", "kind"])["n"].sum() * 2).unstack(fill_value=0)',
    # every combination present: the integers stay
    'df[df["shop"] == "a"].groupby(["shop", "kind"])["n"].sum().unstack()',
    'df[df["shop"] == "zzz"].groupby(["shop", "kind"])["n"].sum().unstack()',
])
def test_unstack_matches_pandas(call: str) -> None:
    source = FRAME + f"result = {call}.reset_index()\n"
    result = differential(source)
    assert not result.todos, result.converted_text
    from support import run
    assert column_kinds(run(source)["result"]) == column_kinds(run(result.converted_text)["result"]), \
        result.converted_text


def test_unstack_states_pandas_order_of_a_key_value_only_missing_rows_hold() -> None:
    # kind "w" only in the row whose shop is missing: pandas keeps "w" among the groupby's
    # labels, unstack removes it and lays kind out as it first comes (z, y, x), not sorted
    source = ('import pandas as pd\n'
              'df = pd.DataFrame({"shop": ["b", "c", "a", None], "kind": ["y", "x", "z", "w"], '
              '"qty": [1.0, 2.0, 3.0, 4.0]})\n'
              'result = df.groupby(["shop", "kind"])["qty"].sum().unstack()\n')
    assert list(run(source)["result"].columns) == ["z", "y", "x"]
    sites = [s for s in convert(source).sites if s.key == "series.unstack"]
    assert sites and all(s.confidence <= 0.95 for s in sites)
    assert "first come" in sites[0].message


def test_unstack_of_a_series_kept_in_a_name() -> None:
    result = differential(FRAME + 'g = df.groupby(["shop", "kind"])["n"].sum()\n'
                                  'result = g.unstack(fill_value=0).reset_index()\n')
    assert not result.todos, result.converted_text


@pytest.mark.parametrize("call,reason", [
    ('df.groupby(["shop", "kind"], sort=False)["n"].sum().unstack()', "sorted result"),
    ('df.groupby(["shop", "kind"])["n"].sum().sort_values().unstack()', "sorted result"),
    ('df.groupby(["shop", "kind"], dropna=False)["n"].sum().unstack()', "sorted result"),
    ('df.assign(t=df["kind"]).groupby(["shop", "kind"])["t"].first().unstack()', "values of type"),
    ('df.groupby("shop")["n"].sum().unstack()', "one level"),
])
def test_unstack_todo(call: str, reason: str) -> None:
    result = convert(FRAME + f"result = {call}\n")
    todo = next(s for s in result.todos if s.key == "series.unstack")
    assert reason in todo.message


@pytest.mark.parametrize("call", [
    'df.groupby(["shop", "kind"])["n"].sum().sort_values().unstack()',
    'df.groupby(["shop", "kind"], sort=False)["n"].sum().unstack()',
    'df.groupby(["shop", "kind"], sort=False)[["n", "qty"]].sum().unstack()',
    'df.groupby(["shop", "kind"], sort=False, dropna=False)["qty"].max().unstack()',
])
def test_unstack_left_to_pandas_keeps_pandas_layout(call: str) -> None:
    # the hand-over puts the keys back as labels: pandas lays the table out itself
    differential(FRAME + f"result = {call}.reset_index()\n")


def test_melt_ports_to_selects_stacked_in_pandas_order() -> None:
    # one select per value column, stacked: pandas' order without numbering and sorting rows
    check_ports(FRAME + 'result = df.melt(id_vars="shop", value_vars=["qty", "n"])\n',
                'pl.concat([df.select("shop", pl.lit("qty").alias("variable"), '
                'pl.col("qty").alias("value")), df.select("shop", pl.lit("n").alias("variable"), '
                'pl.col("n").alias("value"))], how="vertical_relaxed")')


def test_melt_of_an_expression_stacks_the_selects_in_a_pipe() -> None:
    result = differential(FRAME + 'result = df[df["n"] > 1].melt(id_vars="shop", value_vars=["size", "n"], var_name="what")\n')
    assert "lambda frame: pl.concat([frame.select(" in result.converted_text
    assert "__melt_row" not in result.converted_text


@pytest.mark.parametrize("call", [
    'df.melt(id_vars="shop", value_vars=["qty", "n"])',  # NaN, ints and floats: float values
    'df.melt(id_vars=["shop", "kind"], value_vars=["n", "size"])',
    'df.melt(id_vars="shop", value_vars="qty")',
    'df.melt(id_vars=["shop"], value_vars=["kind"], var_name="what", value_name="which")',
    'df[["shop", "n", "size"]].melt(id_vars="shop")',  # every other column
    'df[["n", "size"]].melt()',
    'pd.melt(df, id_vars=["shop"], value_vars=["n", "size"])',
    'pd.melt(df, ["kind"], ["size", "n"], "col", "val")',
    'df[df["n"] > 100].melt(id_vars="shop", value_vars=["qty", "n"])',
    'df[df["n"] > 2].melt(id_vars="shop", value_vars=["size", "n"])',
    'df.groupby("shop")[["n", "size"]].sum().melt()',  # the keys (the index) left out
])
def test_melt_matches_pandas(call: str) -> None:
    result = differential(FRAME + f"result = {call}\n")
    assert not result.todos, result.converted_text


def test_melt_of_a_frame_in_pieces_keeps_pandas_order() -> None:
    # a concatenated frame is held in pieces: Polars' unpivot goes piece by piece, so without
    # the sort the second piece's rows of "n" would come after the first piece's rows of "size"
    source = FRAME + ('both = pd.concat([df, df.sort_values("n")], ignore_index=True)\n'
                      'result = both.melt(id_vars="shop", value_vars=["n", "size"])\n')
    result = differential(source)
    assert not result.todos, result.converted_text


@pytest.mark.parametrize("call,reason", [
    ('df.melt(id_vars="shop", value_vars=["kind", "n"])', "mixed column"),
    ('df.melt(id_vars="shop", value_vars=["n"], ignore_index=False)', "ignore_index"),
])
def test_melt_todo(call: str, reason: str) -> None:
    text = check_todo(FRAME + f"result = {call}\n", "frame.melt")
    assert reason in text


def test_melt_of_a_crosstab_names_the_variable_after_its_columns_axis() -> None:
    # pandas' crosstab names its columns axis "kind": melt calls the variable column "kind"
    source = FRAME + ('t = pd.crosstab(df["shop"], df["kind"]).reset_index()\n'
                      'result = t.melt(id_vars="shop", value_vars=["p", "q"])\n')
    result = differential(source)
    assert not result.todos, result.converted_text
    assert "columns.name" not in next(s for s in result.sites if s.key == "frame.melt").message


_PIVOTED = 'w = df.pivot_table(index="shop", columns="kind", values="n", aggfunc="sum")'


@pytest.mark.parametrize("lines", [
    # pivot_table, unstack (ported) and reset_index keep the columns' name "kind"
    f'{_PIVOTED}.reset_index()\nresult = w.melt(id_vars="shop")',
    f'{_PIVOTED}\nw = w.reset_index()\nresult = w.melt(id_vars="shop", value_name="kg")',
    'w = df.groupby(["shop", "kind"])["n"].sum().unstack().reset_index()\n'
    'result = pd.melt(w, id_vars=["shop"])',
    'w = df.groupby(["shop", "kind"]).size().unstack(fill_value=0).reset_index()\n'
    'w["t"] = 1\nw = w.fillna(0)\nresult = w.melt(id_vars="shop")',
    f'{_PIVOTED}.reset_index()\nw = w[w["p"] > 1].rename(columns={{"p": "pp"}})\n'
    'result = w.melt(id_vars="shop")',
    # where pandas drops the name: "variable" again
    f'{_PIVOTED}.reset_index()\nw = w.rename_axis(columns=None)\nresult = w.melt(id_vars="shop")',
    f'{_PIVOTED}.reset_index()\nw.columns.name = None\nresult = w.melt(id_vars="shop")',
    f'{_PIVOTED}.reset_index()\nw.columns = ["shop", "a", "b", "c"]\nresult = w.melt(id_vars="shop")',
    f'{_PIVOTED}.reset_index()\nw = w.merge(df[["shop", "size"]].drop_duplicates("shop"), '
    'on="shop")\nresult = w.melt(id_vars="shop")',
])
def test_melt_of_a_pivoted_table_names_the_variable_as_pandas_does(lines: str) -> None:
    result = differential(FRAME + lines + "\n")
    assert not result.todos, result.converted_text


def test_melt_without_value_vars_reads_the_columns_at_run_time() -> None:
    source = "import pandas as pd\ndf = pd.read_csv('kiosks.csv')\nresult = df.melt(id_vars='k')\n"
    result = convert(source)
    assert not result.todos
    assert '.sort(pl.col("variable").cast(pl.Enum(df.collect_schema().names())), "__melt_row")' \
        in result.converted_text
    assert next(s for s in result.sites if s.key == "frame.melt").confidence == 0.9


def test_melt_of_unknown_columns_matches_pandas() -> None:
    # a crosstab's columns are its data: melt takes every column but the key, in order
    source = FRAME + ('t = pd.crosstab(df["shop"], df["kind"]).reset_index()\n'
                      'result = t.melt(id_vars="shop", var_name="kind")\n')
    result = differential(source)
    assert "collect_schema" in result.converted_text


def test_melt_of_unknown_columns_of_a_chain_is_a_todo() -> None:
    source = FRAME + ('result = pd.crosstab(df["shop"], df["kind"]).reset_index()'
                      '.melt(id_vars="shop", var_name="kind")\n')
    text = check_todo(source, "frame.melt")
    assert "value_vars left out" in text


# -- get_dummies --------------------------------------------------------------------------------

def test_get_dummies_ports_to_one_expression_per_category() -> None:
    check_ports(FRAME + 'result = pd.get_dummies(df, columns=["kind"])\n',
                '.collect().pipe(lambda d: d.select(pl.exclude("kind"), '
                '*(pl.col("kind").eq_missing(v).alias(f"kind_{v}") '
                'for v in d["kind"].drop_nulls().unique().sort())))')


@pytest.mark.parametrize("call", [
    'pd.get_dummies(df, columns=["kind"])',
    'pd.get_dummies(df, columns=["kind", "shop"])',  # in the order of columns=
    'pd.get_dummies(df, columns=["size"], dtype=float)',
    'pd.get_dummies(df, columns=["shop"], dtype=int, drop_first=True)',
    'pd.get_dummies(df, columns=["qty"])',
    'pd.get_dummies(df, columns=["shop", "kind"], prefix=["S", "K"], prefix_sep="-")',
    'pd.get_dummies(df, columns=["shop", "kind"], prefix={"kind": "k", "shop": "s"})',
    'pd.get_dummies(df, columns=["shop", "kind"], prefix="x")',
    'pd.get_dummies(df, columns=["shop"], dummy_na=True)',
    'pd.get_dummies(df, columns=["shop"], prefix="{größe}", prefix_sep="→")',  # braces: no f-string
    """pd.get_dummies(df, columns=["kind"], prefix="it's", prefix_sep='"')""",
    'pd.get_dummies(df["kind"], prefix="k", dummy_na=True)',
    'pd.get_dummies(df[df["n"] > 100]["kind"])',
    'pd.get_dummies(df)',
    'pd.get_dummies(df[["n", "kind"]], columns=["kind"], dtype=float)',
    'pd.get_dummies(df["shop"])',
    'pd.get_dummies(df["size"], prefix="size", drop_first=True)',
    'pd.get_dummies(df["n"] > 4)',
    'pd.get_dummies(df["qty"] < 3)',  # NaN < 3 is False
    'pd.get_dummies(df[df["n"] > 100], columns=["shop"])',
    'pd.get_dummies(df[df["n"] > 6], columns=["kind"], drop_first=True)',
])
def test_get_dummies_matches_pandas(call: str) -> None:
    result = differential(FRAME + f"result = {call}\n")
    assert not result.todos, result.converted_text


@pytest.mark.parametrize("call,reason", [
    ('pd.get_dummies(df.astype({"kind": "category"}), columns=["kind"])', "category"),
    ('pd.get_dummies(df, columns=["kind"], dummy_na=True, drop_first=True)', "dummy_na"),
    ('pd.get_dummies(df.groupby("shop")[["kind"]].first(), columns=["kind"])', "index"),
    ('pd.get_dummies(df.groupby("shop")[["kind"]].first()["kind"])', "index"),
])
def test_get_dummies_todo(call: str, reason: str) -> None:
    text = check_todo(FRAME + f"result = {call}\n", "pd.get_dummies")
    assert reason in text


@pytest.mark.parametrize("call", [
    'pd.get_dummies(df, columns=["kind"], sparse=True)',
    'pd.get_dummies(df, columns=["kind"], prefix=["a", "b"])',  # pandas raises
    'pd.crosstab(df["shop"], df["kind"], values=df["qty"])',  # pandas raises
    'df.melt(id_vars="shop", value_vars=["n"], value_name="shop")',  # pandas raises
    'pd.qcut(df["n"], 3, labels=["a", "b"])',  # pandas raises
    'pd.get_dummies(df, columns="kind")',  # pandas raises
])
def test_forms_left_to_pandas(call: str) -> None:
    keys = _todo_keys(FRAME + f"result = {call}\n")
    assert len(keys) == 1 and call.split("(")[0].replace("df.", "frame.") in keys


def test_get_dummies_of_unknown_columns_is_a_todo() -> None:
    source = "import pandas as pd\ndf = pd.read_csv('kiosks.csv')\nresult = pd.get_dummies(df)\n"
    assert _todo_keys(source) == ["pd.get_dummies"]


# -- qcut ---------------------------------------------------------------------------------------

QCUT = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "kg": [3.0, 1.0, np.nan, 2.0, 2.0, 5.0, 8.0, None, 4.0, 6.0, 7.0],
    "n": [1, 2, 3, 4, 5, 6, 7, 1, 2, 3, 4],
})
"""


def test_qcut_ports_to_linear_quantile_edges() -> None:
    text = check_ports(QCUT + 'df["band"] = pd.qcut(df["kg"], 2, labels=["lo", "hi"])\n',
                       'pl.when(pl.col("kg") <= pandas_quantile(pl.col("kg"), 0.5))'
                       '.then(pl.lit("lo")).when(pl.col("kg") <= pl.col("kg").max())'
                       '.then(pl.lit("hi"))')
    assert '.cast(pl.Enum(["lo", "hi"]))' in text
    assert "def pandas_quantile(column, q):" in text


@pytest.mark.parametrize("call", [
    'pd.qcut(df["kg"], 3, labels=["lo", "mid", "hi"])',
    'pd.qcut(df["kg"], 4, labels=["ä", "b", "c", "d"])',
    # 1..7 in thirds: the edges 3.0 and 5.0 are values of the column (ties at the edges)
    'pd.qcut(df["n"], 3, labels=["lo", "mid", "hi"])',
    'pd.qcut(df["n"], [0, 0.5, 1], labels=["lo", "hi"])',
    'pd.qcut(df["kg"], [0.25, 0.5, 0.75], labels=["b", "c"])',  # values outside are missing
    'pd.qcut(df["kg"], q=[0.1, 0.9], labels=["mid"])',
    'pd.qcut(df["n"] * 1.5, 5, labels=list("abcde"))',
    'pd.qcut(df["kg"], 3, labels=False)',
    'pd.qcut(x=df["n"], q=2, labels=False)',
])
def test_qcut_matches_pandas(call: str) -> None:
    result = differential(QCUT + f"df['band'] = {call}\nresult = df\n")
    assert not result.todos, result.converted_text


def test_qcut_of_inner_quantiles_bounds_the_first_bin() -> None:
    text = check_ports(QCUT + 'df["band"] = pd.qcut(df["kg"], [0.25, 0.5, 0.75], labels=["b", "c"])\n',
                       'pl.when(pl.col("kg").is_between(pandas_quantile(pl.col("kg"), 0.25), '
                       'pandas_quantile(pl.col("kg"), 0.5), closed="both"))')
    assert 'closed="right"' in text


@pytest.mark.parametrize("values,q", [
    # the 5/6 quantile of these is 36.29999999999999 in pandas (numpy's interpolation) and
    # 36.3 in Polars' quantile (which interpolates differently when values are missing): the
    # two 36.3 go to the top bin in pandas
    ("[36.3, None, 6.6, 19.8, None, 0.0, 3.3, 23.1, 39.6, 42.9, 19.8, 33.0, None, 26.4, 33.0, "
     "19.8, 33.0, 16.5, 36.3, 0.0, 33.0, None, 16.5]", 6),
    # 7/9 is not exact: pandas takes the quantile one digit above it, whose edge is 49.5
    # itself (49.49999999999998 at 7/9), so the two 49.5 stay in the seventh bin
    ("[29.7, 39.6, 26.4, None, 33.0, 42.9, 26.4, 49.5, 23.1, 36.3, 42.9, 39.6, 42.9, 52.8, "
     "29.7, 19.8, 42.9, 59.4, 62.7, 36.3, 59.4, 42.9, 49.5, 39.6, 19.8, 13.2, 6.6, 59.4, None, "
     "29.7]", 9),
])
def test_qcut_puts_values_on_an_edge_where_pandas_does(values: str, q: int) -> None:
    # the missing value is 0 / 0: NaN made missing (fill_nan), as scripts make them
    source = ("import pandas as pd\n"
              f"df = pd.DataFrame({{'kg': {values}}})\n"
              "df['kg'] = df['kg'].fillna(0.0) / df['kg'].notna().astype(float)\n"
              f"df['band'] = pd.qcut(df['kg'], {q}, labels=[f'b{{i}}' for i in range({q})])\n"
              "result = df\n")
    source = source.replace("[f'b{i}' for i in range(%d)]" % q, repr([f"b{i}" for i in range(q)]))
    result = differential(source)
    assert not result.todos, result.converted_text


def test_qcut_labels_sort_in_their_order() -> None:
    # an ordered categorical sorts by its labels, an Enum too: "hi" after "lo"
    differential(QCUT + 'df["band"] = pd.qcut(df["kg"], 2, labels=["lo", "hi"])\n'
                        'result = df.sort_values(["band", "n"])\n')


def test_qcut_says_pandas_raises_on_equal_edges() -> None:
    result = convert(QCUT + 'df["band"] = pd.qcut(df["kg"], 2, labels=["lo", "hi"])\n')
    site = next(s for s in result.sites if s.key == "pd.qcut")
    assert site.confidence == 0.95 and "raises" in site.message


@pytest.mark.parametrize("call,reason", [
    ('pd.qcut(df["kg"], 3)', "Interval"),
    ('pd.qcut(df["kg"], 3, labels=["a", "b", "c"], duplicates="drop")', "duplicates"),
    ('pd.qcut(df["kg"], [0.5, 0.2], labels=["a"])', "increase"),
])
def test_qcut_todo(call: str, reason: str) -> None:
    text = check_todo(QCUT + f"df['band'] = {call}\n", "pd.qcut")
    assert reason in text


@pytest.mark.parametrize("table", [
    'pd.crosstab(v["zone"], v["sp"])',
    'v.pivot_table(index="zone", columns="sp", values="n", aggfunc="sum", fill_value=0)',
    'v.groupby(["zone", "sp"])["n"].sum().unstack()',
])
def test_a_pivoted_table_handed_to_pandas_keeps_its_columns_name(table, tmp_path, monkeypatch):
    # pandas is the reference: a pivoted table's columns are named after the key ("sp"),
    # which .T makes the index's name and .stack() a level's: written out by to_csv
    monkeypatch.chdir(tmp_path)
    (tmp_path / "t.csv").write_text("zone,sp,n\nN,reed,2\nS,rush,3\nN,rush,4\n", encoding="utf-8")
    source = f'import pandas as pd\nv = pd.read_csv("t.csv")\nt = {table}\n'
    for name in ("a", "b"):
        run(source + 't.T.to_csv("a.csv")\nt.stack().to_csv("b.csv")\n')
        expected = (tmp_path / f"{name}.csv").read_text()
        result = convert(source + 't.T.to_csv("a.csv")\nt.stack().to_csv("b.csv")\n',
                         data_dir=str(tmp_path))
        run(result.converted_text)
        assert (tmp_path / f"{name}.csv").read_text() == expected, result.converted_text


def test_pivot_table_count_of_a_float_column_is_float_when_a_cell_is_missing(tmp_path) -> None:
    # count cells are integers, whatever the values' type: pandas makes every cell float
    # when a combination has no row (2.0 and an empty cell), integers when none is missing
    source = '''
import pandas as pd
df = pd.read_csv("data.csv")
p = df.pivot_table(index="grp", columns="cat", values="v", aggfunc="count")
p.to_csv("p.csv")
print(p["A"].tolist())
q = df[df["grp"] == "g2"].pivot_table(index="grp", columns="cat", values="v", aggfunc="count")
q.to_csv("q.csv")
'''
    same_text(source, tmp_path, {"data.csv": "grp,cat,v\ng1,A,1.5\ng1,A,2.5\ng2,A,3.0\ng2,B,4.0\n"})


def test_melt_of_a_table_pivoted_on_an_integer_key_gives_integer_variables(tmp_path):
    """pandas labels the columns of a table unstacked, pivoted or crosstabbed on an integer
    key with the integers, and melt puts them in the variable column: int64 (sorted and
    compared as numbers), never the text Polars names the columns by."""
    same_text('''
        import pandas as pd
        df = pd.read_csv("kiln.csv")
        u = df.groupby(["kiln", "week"])["fires"].sum().unstack(fill_value=0).reset_index()
        m = u.melt(id_vars="kiln")
        m = m.sort_values(["week", "kiln"])
        m.to_csv("out_m.csv", index=False)
        m[m["week"] > 5].to_csv("out_late.csv", index=False)
        c = pd.crosstab(df["ward"], df["grade"]).reset_index()
        cm = c.melt(id_vars="ward", value_vars=None)
        cm[cm["grade"] >= 2].sort_values("grade").to_csv("out_c.csv", index=False)
        pt = df.pivot_table(index="kiln", columns="week", values="fires", aggfunc="sum").reset_index()
        pm = pt.melt(id_vars=["kiln"])
        pm.sort_values(["week", "kiln"]).to_csv("out_pm.csv", index=False)
    ''', tmp_path, {"kiln.csv": "kiln,week,fires,ward,grade\nK1,2,1,W1,1\nK1,10,4,W2,3\n"
                                "K2,2,3,W1,2\nK2,9,5,W1,3\n"})


def test_melt_of_integer_labels_beside_text_labels_is_a_todo(tmp_path):
    (tmp_path / "kiln.csv").write_text("kiln,week,fires\nK1,2,1\nK1,10,4\nK2,2,3\n")
    result = convert(f'''
        import pandas as pd
        df = pd.read_csv("{tmp_path / 'kiln.csv'}")
        c = pd.crosstab(df["kiln"], df["week"], margins=True).reset_index()
        result = c.melt(id_vars="kiln")
    ''', data_dir=str(tmp_path))
    assert any(s.key == "frame.melt" and s.status == "todo" for s in result.sites), \
        result.converted_text


# -- the row total of a pivoted table --------------------------------------------------------

@pytest.mark.parametrize("made", [
    'df.groupby(["shop", "kind"])["n"].sum().unstack()',  # a missing combination: float cells
    'df.groupby(["shop", "kind"])["n"].sum().unstack(fill_value=0)',
    'df.groupby(["shop", "kind"])["qty"].mean().unstack()',  # NaN means and missing cells
    'df.groupby(["shop", "kind"])["qty"].sum().unstack(fill_value=0)',
    'df.groupby(["shop", "kind", "size"])["n"].sum().unstack()',
    'df[df["shop"] == "zzz"].groupby(["shop", "kind"])["n"].sum().unstack()',  # no rows, no columns
    'pd.crosstab(df["shop"], df["kind"])',
    'pd.crosstab(df["shop"], df["kind"], margins=True)',
    'pd.crosstab(df["shop"], df["kind"], normalize="index")',
])
def test_row_total_of_a_pivoted_table_matches_pandas(made: str) -> None:
    # wide["total"] = wide.sum(axis=1): the columns are the data's, every one a number
    source = FRAME + f'wide = {made}\nwide["total"] = wide.sum(axis=1)\nresult = wide.reset_index()\n'
    result = differential(source)
    assert not [s for s in result.todos if s.key in ("frame.sum", "frame.setitem")], \
        result.converted_text
    assert "pl.sum_horizontal(" in result.converted_text


def test_row_total_of_a_pivoted_table_changed_since_is_not_assumed_numbers() -> None:
    # after astype(str) the cells are text: pandas would join them, porter does not sum
    source = FRAME + ('wide = df.groupby(["shop", "kind"])["n"].sum().unstack(fill_value=0)\n'
                      'wide = wide.astype(str)\n'
                      'result = wide.sum(axis=1)\n')
    assert "pl.sum_horizontal(" not in convert(source).converted_text


# -- xs: one label of one level of a groupby's Series ----------------------------------------

@pytest.mark.parametrize("call", [
    'df.groupby(["shop", "kind"])["n"].sum().xs("p", level="kind")',
    'df.groupby(["shop", "kind"])["qty"].mean().xs("a", level="shop")',
    'df.groupby(["shop", "kind"])["qty"].mean().xs("a")',
    'df.groupby(["shop", "kind"])["n"].sum().xs("q", level=1)',
    'df.groupby(["shop", "kind", "size"])["n"].sum().xs("p", level="kind")',
    'df.groupby(["shop", "kind"])["n"].cumsum().groupby([df["shop"], df["kind"]]).max().xs("p", level="kind")',
    'df.groupby(["shop", "kind"])["n"].sum().rank().xs("p", level="kind")',
])
def test_xs_matches_pandas(call: str) -> None:
    result = differential(FRAME + f"result = {call}.reset_index()\n")
    assert not [s for s in result.todos if s.key == "series.xs"], result.converted_text


def test_xs_then_reductions_match_pandas() -> None:
    source = FRAME + ('s = df.groupby(["shop", "kind"])["n"].sum().xs("p", level="kind")\n'
                      'top = s.max()\nwho = s.idxmax()\nresult = s.sort_values().reset_index()\n')
    differential(source, "top", "who", "result")


@pytest.mark.parametrize("call,reason", [
    ('df.groupby(["shop", "kind"])["n"].sum().xs("p", level="kind", drop_level=False)', "drop_level"),
    ('df.groupby(["shop", "kind"])["n"].sum().xs(("a", "p"))', "one label"),
    ('df.groupby("shop")["n"].sum().xs("a")', "two or more keys"),
    ('df.groupby(["shop", "size"])["n"].sum().xs("3", level="size")', "another type"),
])
def test_xs_todo(call: str, reason: str) -> None:
    todo = next(s for s in convert(FRAME + f"result = {call}\n").todos if s.key == "series.xs")
    assert reason in todo.message


# -- pivot_table without columns: a groupby of the value columns -----------------------------

@pytest.mark.parametrize("call", [
    'df.pivot_table(index="shop", values=["qty", "n"], aggfunc="sum")',
    'df.pivot_table(index=["shop", "kind"], values=["qty", "n"], aggfunc={"n": "sum", "qty": "sum"}, fill_value=0)',
    'df.pivot_table(index=["shop", "kind"], values=["qty", "n"], aggfunc={"qty": "mean", "n": "max"})',
    'df.pivot_table(index="kind", values=["qty", "size"], aggfunc={"qty": "min", "size": "count"}, fill_value=-1)',
    'df.pivot_table(index="kind", values="qty", aggfunc="max")',
    'df.pivot_table(index="kind", values=["qty"])',  # mean by default
    'df[df["qty"].isna()].pivot_table(index="shop", values=["qty", "n"], aggfunc={"qty": "mean", "n": "sum"})',
    'df[df["qty"].isna()].pivot_table(index="shop", values=["qty"], aggfunc="mean", fill_value=0)',
])
def test_pivot_table_without_columns_matches_pandas(call: str) -> None:
    result = differential(FRAME + f"result = {call}.reset_index()\n")
    assert not [s for s in result.todos if s.key == "frame.pivot_table"], result.converted_text
    from support import run
    assert column_kinds(run(FRAME + f"result = {call}.reset_index()\n")["result"]) == \
        column_kinds(run(result.converted_text)["result"]), result.converted_text


@pytest.mark.parametrize("call,reason", [
    ('df.pivot_table(index="shop", values=["qty", "n"], aggfunc={"qty": "sum"})', "per value column"),
    ('df.pivot_table(index="shop", values=["qty"], aggfunc="std")', "per value column"),
    ('df.pivot_table(index="shop", values=["qty"], margins=True)', "margins"),
    ('df.pivot_table(index="shop")', "values other than"),
])
def test_pivot_table_without_columns_todo(call: str, reason: str) -> None:
    todo = next(s for s in convert(FRAME + f"result = {call}\n").todos if s.key == "frame.pivot_table")
    assert reason in todo.message


@pytest.mark.parametrize("body", [
    # a groupby's table: its keys are pandas' index, not columns summed
    't = df.groupby("shop")[["n", "qty"]].sum()\nt["total"] = t.sum(axis=1)\nresult = t.reset_index()',
    't = df.groupby(["shop", "kind"])[["n", "size"]].max()\nt["top"] = t.max(axis=1)\nresult = t.reset_index()',
    # a pivot whose columns the script chose: their row total
    't = df.groupby(["shop", "kind"])["n"].sum().unstack(fill_value=0)[["p", "q"]]\n'
    't["total"] = t.sum(axis=1)\nresult = t.reset_index()',
])
def test_row_and_column_totals_leave_the_index_out(body: str) -> None:
    result = differential(FRAME + body + "\n")
    assert not [s for s in result.todos if s.key in ("frame.sum", "frame.max", "frame.setitem")], \
        result.converted_text
