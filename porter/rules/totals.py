"""Reductions of a frame per column (axis=0): df.sum(), df.count(), df.nunique(),
df.isna().sum(), ... -> one select of an expression per column, unpivoted.

pandas gives a Series indexed by the column names. porter keeps it as pandas' Series would
read after reset_index(): a frame with the names in a column "index" (porter's index column,
unnamed in pandas) and the values in "0", one row per column in the frame's order, so that
what the script does next (print it, filter it, sort it, write it) reads a frame as pandas
reads its Series.
"""

from __future__ import annotations

from collections.abc import Callable, Sequence
from dataclasses import replace

from porter.emit import code as emit
from porter.emit.code import Code
from porter.rules import rule
from porter.translate.context import PandasCall, RuleContext, Unsupported
from porter.translate.values import Column, Frame, Value

# the value column's name: pandas' reset_index() of an unnamed Series names it 0
VALUE = "0"

# pandas' sum, mean and std of a float column, as its nanops compute them
REDUCE_FUNCTION = "pandas_reduce"
REDUCE_DEFINITION = '''\
def pandas_reduce(values, how="sum", ddof=1):
    """The sum, mean, std or var (how="sum" / "mean" / "std" / "var") of a column of numbers
    as pandas computes them: numpy's pairwise sum of the values as floats, a missing one
    counted 0 in its place; the mean over the count of values present; the var from the
    squared distances to that mean (0 where a value is missing), added the same way, over
    count - ddof, and the std its square root. NaN where there are too few values. Polars
    adds in another order, and the last digit can differ (55.080000000000005 for
    55.08000000000001, a std of 3.265986323710904 for 3.2659863237109046)."""
    def reduce(column):
        import numpy as np

        present = column.is_not_null().to_numpy()
        numbers = column.cast(pl.Float64).fill_null(0.0).to_numpy()
        total = numbers.sum()
        if how == "sum":
            return total
        count = int(present.sum())
        if how == "mean":
            return total / count if count else float("nan")
        if count <= ddof:
            return float("nan")
        squares = (total / count - numbers) ** 2
        squares[~present] = 0.0
        spread = squares.sum() / (count - ddof)
        return float(np.sqrt(spread) if how == "std" else spread)

    return values.map_batches(reduce, returns_scalar=True, return_dtype=pl.Float64)
'''


def column_totals(frame: Frame, names: Sequence[str], expr: Callable[[str], Code],
                  dtype: str | None) -> Column:
    """The Series pandas gives for a reduction of each column of `frame` named in `names`:
    `expr(name)` is the reduction of one column (one value), `dtype` the Series' type."""
    if not names:
        raise Unsupported("a reduction of a frame without columns")
    _plain_names(frame)
    values = [expr(name).method("alias", name) for name in names]
    code = frame.code.method("select", *values).method(
        "unpivot", variable_name="index", value_name=VALUE)
    result = Frame(code, columns=("index", VALUE), index=("index",), index_unnamed=True,
                   labels_intact=False,
                   dtypes=(("index", "str"),) + (((VALUE, dtype),) if dtype else ()))
    return Column(emit.col(VALUE), frame=result, name=None, dtype=dtype,
                  refs=frozenset({VALUE}))


def _plain_names(frame: Frame) -> None:
    """A frame whose column names become labels as porter holds them: text of one level."""
    if frame.index:
        raise Unsupported("a frame with an index of its own")
    if frame.column_pairs or frame.columns_name is not None or frame.number_labels \
            or frame.int_labels_except is not None:
        # two levels of names (agg with lists) label pandas' result with two levels, a
        # pivot's named columns give its labels a name, number names are numbers there
        raise Unsupported("column names of two levels, with a name of their own, or numbers")


def pandas_median(column: Code) -> Code:
    """The median of numbers as pandas (and numpy) compute it: the middle value, or the two
    middle ones added and halved, (a + b) / 2 (0.39999999999999997 for 0.7 and 0.1), where
    Polars' median gives 0.4. Missing values skipped; of none, missing."""
    return emit.binop(emit.binop(column.method("quantile", 0.5, "lower"), "+",
                                 column.method("quantile", 0.5, "higher")), "/", 2)


def pandas_reduce(column: Code, how: str = "sum", ddof: int = 1) -> Code:
    """pandas' sum, mean, std or var of a column of numbers (REDUCE_DEFINITION)."""
    if how == "sum":
        return emit.call(REDUCE_FUNCTION, column)
    return emit.call(REDUCE_FUNCTION, column, how=how, **({"ddof": ddof} if ddof != 1 else {}))


@rule("frame.nunique")
def frame_nunique(call: PandasCall, ctx: RuleContext) -> Value:
    """df.nunique() -> one n_unique() per column, as a Series indexed by the column names.

    Handles: missing values not counted (dropna=True), counted as one value with
    dropna=False; 0.0 and -0.0 are one value in both; columns of any type; int64 counts.
    Caveats: axis=1 (distinct values per row) is a TODO.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "axis", "dropna", positional=2)
    if call.const("axis", 0, 0, kinds=(int, str)) not in (0, "index"):
        raise Unsupported("distinct values per row (axis=1)")
    if frame.columns is None or not frame.columns:
        raise Unsupported("the frame's columns are not known")
    dropna = call.const("dropna", 1, True, kinds=(bool,))

    def distinct(name: str) -> Code:
        column = emit.col(name).method("drop_nulls") if dropna else emit.col(name)
        return column.method("n_unique").method("cast", emit.atom("pl.Int64"))

    return column_totals(frame, list(frame.columns), distinct, "int")


@rule("frame.corr")
def frame_corr(call: PandasCall, ctx: RuleContext) -> Value:
    """df.corr() -> pl.corr(a, b) of each pair of columns, as a table labelled by the column
    names ("index", unnamed in pandas), one row and one column per number column; the columns
    holding the frame's own index (row labels, a groupby's keys) are left out, as pandas
    leaves out its index.

    Handles: Pearson's correlation over the rows where both values are present, as pandas
    pairs them; a column with fewer than two values, or none that vary, gives a missing value
    (NaN in pandas); min_periods; True/False columns as 1 and 0; numeric_only=True when every
    column's type is known; columns whose type is known only at run time (after a merge or a
    fillna of one) cast to Float64 as the number columns are (0.9: text that reads as numbers,
    or dates, would be correlated where pandas raises).
    Caveats: pandas computes each pair with Welford's running sums, Polars with another
    order of adding: the last digit can differ (0.47619312 in both to 15 digits) (0.9).
    method="spearman" / "kendall", and text or date columns (pandas raises) are TODOs.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "method", "min_periods", "numeric_only", positional=1)
    if call.const("method", 0, "pearson") != "pearson":
        raise Unsupported("a rank correlation (spearman, kendall): rank the columns first")
    if frame.columns is None:
        raise Unsupported("a frame whose column types porter does not know")
    # the columns holding the frame's index (row labels carried after a filter, a groupby's
    # keys) are not pandas' columns: a correlation never reads the index
    names = [c for c in frame.columns if c not in frame.index]
    untyped = [c for c in names if frame.dtype(c) is None]
    numeric_only = call.const("numeric_only", None, False, kinds=(bool,))
    if untyped and numeric_only:
        raise Unsupported("numeric_only=True of columns whose types porter does not know")
    if untyped:
        # typed at run time (a merge, fillna of such a column): cast to Float64 as the number
        # columns are; text that is not numbers stops the script there, as pandas raises
        ctx.lower(f"the types of {', '.join(map(repr, untyped))} are not known: numbers are "
                  "correlated as pandas does; text that reads as numbers, or dates, would be "
                  "correlated where pandas raises", 0.9)
    _plain_names(replace(frame, index=()))
    numbers = [c for c in names if frame.dtype(c) in ("int", "float", "bool", None)]
    if numeric_only:
        names = numbers
    elif numbers != names:
        raise Unsupported("text or date columns: pandas raises (numeric_only=True leaves them "
                          "out)")
    if not names:
        raise Unsupported("a frame without number columns")
    min_periods = call.const("min_periods", None, 1, kinds=(int, type(None))) or 1
    ctx.lower("pandas adds each pair with Welford's running sums and Polars in another "
              "order: the last digit of a correlation can differ", 0.9)

    # one row per column `a`: its correlation with each column `b`, written as a loop over
    # the names (the same select for every row)
    a, b = emit.atom("a"), emit.atom("b")
    value = emit.pl("corr", a, b).method("fill_nan", None)  # NaN in pandas: missing
    if min_periods > 1:
        both = emit.binop(emit.pl("col", a).method("is_not_null"), "&",
                          emit.pl("col", b).method("is_not_null")).method("sum")
        value = emit.when(emit.binop(both, ">=", min_periods), value)
    listed = emit.lit(list(names))
    cells = emit.atom(f"*({value.method('alias', b).text} for b in {listed.text})")
    cast = frame.code.method("with_columns", emit.col(names).method(
        "cast", emit.atom("pl.Float64")))  # a text column fails here, as pandas raises
    row = cast.method("select", emit.pl("lit", a).method("alias", "index"), cells)
    code = emit.pl("concat", emit.atom(f"[{row.text} for a in {listed.text}]"))
    return Frame(code, columns=("index", *names), index=("index",), index_unnamed=True,
                 labels_intact=False,
                 dtypes=(("index", "str"), *((c, "float") for c in names)))
