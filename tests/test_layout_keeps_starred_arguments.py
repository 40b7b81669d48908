"""Laying a long statement out one step or argument per line never changes what it means:
the layout of each statement parses to the same Python tree as the statement on one line.
A `*values` or `**mapping` argument kept its value but lost its star when it was laid out
(`df.assign(**{...})` became `df.assign({...})`), a call that does something else. A list
comprehension or a generator is laid out as its value, then its `for` and `if` clauses."""

from __future__ import annotations

import ast

import pytest

from porter.emit.code import Code, layout_chain

LONG = "x" * 60

STATEMENTS = [
    f'pl.concat(*(frame_{LONG}.filter(pl.col("a") == v).with_columns(b=pl.lit(v)) for v in vs), how="vertical")',
    f'df.assign(**{{"alpha_{LONG}": pl.col("a"), "beta": pl.col("b"), "gamma": pl.col("c")}})',
    f'print(*frame_{LONG}.select("aaaaaaaaaaaaaaaa").collect().to_series().to_list(), sep=", ")',
    f'f(*g_{LONG}(aaaaaaaaaaaaaaaaaaaaaa, bbbbbbbbbbbbbbbbbbbbbbbbbbb, cccccccccccccccccccccccc), k=1)',
    f'frame_{LONG}.with_columns(**{{name: pl.col(name).fill_null(0) for name in names_{LONG}}})',
    f'frame_{LONG}.select(*[pl.col(c).sum() for c in cols], total=pl.sum_horizontal(cols_{LONG}))',
    f'frame.with_columns(**mapping_{LONG}.with_columns(pl.col("a").alias("b")).collect().row(0, named=True))',
    # comprehensions laid out: the value, then each for / if clause, inside the brackets
    f'pl.concat([frame_{LONG}.select(pl.lit(a).alias("index"), *(pl.corr(a, b).alias(b) for b in names_{LONG})) for a in names_{LONG}])',
    f'pl.concat([frame_{LONG}.filter(pl.col(a) > 0).select(pl.col(a).sum()) for a in names if a != "k" for x in "ab"])',
    f'frame_{LONG}.select(*(pl.col(c).fill_null(0).alias(c) for c in ["aaaaaaaaaa", "bbbbbbbbbbb", "cccccccccc"]))',
    # a chain given as text (pandas code around a hand-over), a column taken between two calls
    f'frame_{LONG}.collect().to_pandas().set_index("shop")["w"].plot.bar(color="k")',
    f'frame_{LONG}.collect().to_pandas().groupby("k")["w"].agg(["min", "max"]).loc["a"].plot()',
]


@pytest.mark.parametrize("text", STATEMENTS)
def test_layout_means_what_the_one_line_means(text):
    laid_out = layout_chain(Code(text), "", "out = ")
    assert "\n" in laid_out  # long enough to be laid out
    assert ast.dump(ast.parse(laid_out)) == ast.dump(ast.parse(f"out = {text}")), laid_out
