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

from porter.emit import code as emit
from porter.emit.code import Code
from porter.rules import rule
from porter.translate.context import PandasCall, RuleContext, Unsupported
from porter.translate.values import Column, Frame, Value

# the value column's name: pandas' reset_index() of an unnamed Series names it 0
VALUE = "0"

# pandas' DataFrame.sum() / mean() of float columns: numpy's pairwise sum of each column
FLOAT_SUM_FUNCTION = "pandas_float_sum"
FLOAT_SUM_DEFINITION = '''\
def pandas_float_sum(values, mean=False):
    """The sum (mean=True: mean) of a float column as pandas' DataFrame.sum() computes it:
    numpy's pairwise sum of the values, missing ones counted 0 (over the count of values
    present, NaN when there is none). Polars adds in another order, and the last digit of
    a sum of many floats can differ."""
    def add(column):
        total = column.fill_null(0.0).to_numpy().sum()
        if mean:
            count = column.count()
            return total / count if count else float("nan")
        return total

    return values.map_batches(add, returns_scalar=True, return_dtype=pl.Float64)
'''


def column_totals(frame: Frame, names: Sequence[str], expr: Callable[[str], Code],
                  dtype: str | None) -> Column:
    """The Series pandas gives for a reduction of each column of `frame` named in `names`:
    `expr(name)` is the reduction of one column (one value), `dtype` the Series' type."""
    if not names:
        raise Unsupported("a reduction of a frame without columns")
    if frame.index:
        raise Unsupported("a frame with an index of its own")
    values = [expr(name).method("alias", name) for name in names]
    code = frame.code.method("select", *values).method(
        "unpivot", variable_name="index", value_name=VALUE)
    result = Frame(code, columns=("index", VALUE), index=("index",), index_unnamed=True,
                   labels_intact=False,
                   dtypes=(("index", "str"),) + (((VALUE, dtype),) if dtype else ()))
    return Column(emit.col(VALUE), frame=result, name=None, dtype=dtype,
                  refs=frozenset({VALUE}))


def pandas_median(column: Code) -> Code:
    """The median of numbers as pandas (and numpy) compute it: the middle value, or the two
    middle ones added and halved, (a + b) / 2 (0.39999999999999997 for 0.7 and 0.1), where
    Polars' median gives 0.4. Missing values skipped; of none, missing."""
    return emit.binop(emit.binop(column.method("quantile", 0.5, "lower"), "+",
                                 column.method("quantile", 0.5, "higher")), "/", 2)


def float_sum(column: Code, *, mean: bool = False) -> Code:
    """pandas' sum (mean) of a float column (FLOAT_SUM_DEFINITION)."""
    if mean:
        return emit.call(FLOAT_SUM_FUNCTION, column, mean=True)
    return emit.call(FLOAT_SUM_FUNCTION, column)


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
