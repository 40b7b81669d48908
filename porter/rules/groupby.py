"""Aggregation: groupby + agg / sum / mean / ... / size, and whole-column reductions,
value_counts, unique, nunique, describe."""

from __future__ import annotations

import ast
import re
from dataclasses import dataclass, field, replace
from typing import Any, ClassVar, Collection

import libcst as cst

from porter.analysis import pandas_names
from porter.emit import code as emit
from porter.emit.code import Code
from porter.rules import rule
from porter.rules.elementwise import body_expression
from porter.rules.totals import pandas_median, pandas_reduce
from porter.rules.ops import float32_possible, small_ints_possible
from porter.rules.io_options import (
    CATEGORY_COUNTS_FUNCTION, DATES_AS_TEXT_FUNCTION, DIVIDE_FUNCTION, MARGINS_FUNCTION,
    PERCENTILES_FUNCTION, QUANTILE_FUNCTION, UNSTACKED_FUNCTION,
)
from porter.translate.context import (
    PandasCall, RuleContext, Unsupported, check_same_rows, column_names, column_of, derive,
    derived_column, grouping_code, nullable_mark, row_labels_carried, without_index,
)
from porter.translate import handover
from porter.translate.values import (
    NOT_NULLABLE, Column, Frame, Grouped, Module, Opaque, Scalar, Value, fresh_token,
)

AGGREGATIONS = ("sum", "mean", "median", "min", "max", "std", "var", "count", "nunique",
                "first", "last", "size", "any", "all")
COUNTS = {"count", "nunique", "nunique_all", "size"}


# pandas adds the floats of each group with a compensated (Kahan) sum in row order, which no
# Polars expression follows: Polars' own sum (in another order, not the same from run to run)
# ends one unit in the last digit away in most groups of a few hundred rows (written to CSV,
# 212.40000000000003 for 212.4), and a round(2) of a sum that lands on a half cent (prices
# times 1.25) gives the other cent in about one group in ten.
#
# Where a group_by's aggregate is a column of its own (agg_with_sums), the agg collects each
# group's values as a list and pandas_group_sums adds them as pandas does: Polars' rolling sum
# is the same compensated sum in row order, so a rolling sum over a window as long as the group
# ends on pandas' total (about 0.02 s per 1,000,000 values in up to 30,000 groups, 0.2 s in
# 300,000; pandas' own sum: 0.01 s to 0.05 s).
GROUP_SUMS_FUNCTION = "pandas_group_sums"
GROUP_SUMS_DEFINITION = '''\
def pandas_group_sums(values, mean=False, sorted_within=None, in_key_order=None, floats=True):
    """Each group's sum of floats (mean=True: mean) as pandas computes it, from the group's
    values as a list (pl.col(...) in an agg). pandas adds a group with a compensated (Kahan)
    sum in row order, missing values skipped, which is what Polars' rolling sum computes over
    a window longer than the group; Polars' own sum adds in another order and can end a unit
    in the last digit away (212.40000000000003 for 212.4). Where the rows reach pandas
    grouped in the order of the sorted keys and none is missing, it adds with numpy's
    reduceat instead: the first value plus numpy's pairwise sum of the rest. That is a
    resample (sorted_within names the keys whose rows are binned together, [] for all rows)
    where no value of those rows is missing, or a groupby whose in_key_order says so
    (computed on the rows before grouping). floats=False: the column's type is not known;
    whole numbers and True/False are added as Polars adds them (exactly), into Int64."""
    kept = pl.element().fill_nan(None).drop_nulls()
    whole_group = 2**40  # a window longer than any group

    def compensated(lists):
        total = lists.list.eval(kept.rolling_sum(whole_group, min_samples=1).last())
        total = total.list.first().fill_null(0.0)
        if not mean:
            return total
        return (total / lists.list.eval(kept.len()).list.first()).fill_nan(None)

    def add(columns):
        lists = columns[0]
        if lists.dtype.inner != pl.Float64:  # whole numbers, True/False: exact sums
            total = lists.list.mean() if mean else lists.list.sum()
            return total.cast(pl.Int64) if total.dtype.is_unsigned_integer() else total
        if len(columns) == 1 or not len(lists):
            return compensated(lists)
        import numpy as np

        sizes = lists.list.len().cast(pl.Int64).to_numpy()
        clean = columns[1].to_numpy() & (sizes > 0)
        flat = lists.explode().to_numpy()  # an empty list: one missing value
        starts = np.concatenate(([0], np.maximum(sizes, 1).cumsum()[:-1]))
        with np.errstate(invalid="ignore"):
            total = np.add.reduceat(flat, starts)
        if mean:
            total = total / np.maximum(sizes, 1)
        if not clean.all():
            total = np.where(clean, total, compensated(lists).to_numpy())
        return pl.Series(total).fill_nan(None) if mean else pl.Series(total)

    kind = pl.Float64 if floats else None
    if sorted_within is None and in_key_order is None:
        if floats:
            return compensated(values)
        return values.map_batches(lambda lists: add([lists]), return_dtype=kind)
    missing = values.list.eval(pl.element().cast(pl.Float64).fill_nan(None).is_null()).list.any()
    if in_key_order is not None:
        clean = in_key_order & ~missing.any()
    else:
        clean = ~(missing.any().over(sorted_within) if sorted_within else missing.any())
    return pl.map_batches([values, clean], add, return_dtype=kind)
'''

# Where the sum is part of a larger expression (a window's over(), a division), it is the
# same compensated sum written as one expression: a rolling sum over a window as long as the
# group, its last value.
GROUP_SUM_FUNCTION = "pandas_group_sum"
GROUP_SUM_DEFINITION = '''\
def pandas_group_sum(x):
    """x.sum() of floats in a group_by or a window, as pandas' group sum adds them: a
    compensated (Kahan) sum in row order, missing values skipped, which is what Polars'
    rolling sum computes over a window longer than the group. Polars' own sum adds in
    another order and can end a unit in the last digit away (212.40000000000003 for 212.4),
    and round(2) of a sum on a half cent then gives the other cent."""
    kept = x.fill_nan(None).drop_nulls()
    return kept.rolling_sum(2**40, min_samples=1).last().fill_null(0.0)
'''
# A transform("sum") / transform("mean") of floats: each group's total as the agg computes it
# (pandas_group_sums: numpy's where the rows come sorted by the keys and no value is missing),
# put back on the group's rows by a join on the keys.
GROUP_SUM_OVER_FUNCTION = "pandas_group_sum_over"
GROUP_SUM_OVER_DEFINITION = '''\
def pandas_group_sum_over(x, *keys, mean=False):
    """x.sum().over(keys) of floats (mean=True: the mean) as pandas' transform("sum") adds
    each group: as its groupby().sum() does (pandas_group_sums: a compensated sum in row
    order, or numpy's sum where the rows come sorted by the keys and no value is missing),
    the total put on every row of the group; a row with a missing key gets none."""

    def add(columns):
        frame = pl.DataFrame(columns[1:]).with_columns(_values=columns[0])
        names = frame.columns[:-1]
        complete = ~pl.any_horizontal(pl.col(names).is_null())
        ordered = pl.when(complete).then(pl.struct(names)).is_sorted() if len(names) > 1 \
            else pl.col(names[0]).is_sorted()
        totals = (
            frame.lazy()
            .with_columns(_in_key_order=ordered)
            .filter(complete)
            .group_by(names)
            .agg(pl.col("_values"), pl.col("_in_key_order").first())
            .select(*names, pandas_group_sums(pl.col("_values"), mean=mean,
                                              in_key_order=pl.col("_in_key_order")).alias("_total"))
        )
        joined = frame.lazy().join(totals, on=names, how="left", maintain_order="left")
        return joined.collect().get_column("_total")

    return pl.map_batches([x, *(pl.col(k) for k in keys)], add, return_dtype=pl.Float64)
'''
GROUP_MEAN_FUNCTION = "pandas_group_mean"
GROUP_MEAN_DEFINITION = '''\
def pandas_group_mean(x):
    """x.mean() of floats in a group_by or a window, as pandas' group mean computes it: the
    sum added as pandas_group_sum adds it, over the count; missing where there is no value."""
    return (pandas_group_sum(x) / x.fill_nan(None).count()).fill_nan(None)
'''


def agg_with_sums(code: Code, *exprs: Code, sorted_within: tuple[str, ...] | None = None,
                  in_key_order: str | None = None, untyped: Collection[str] = ()) -> Code:
    """code.agg(*exprs), where each float sum or mean that agg_expr made and that is an
    aggregate of its own (pandas_group_sum(pl.col("x")), maybe aliased) is added as pandas adds
    it: the agg keeps the group's values as a list and pandas_group_sums adds them after.

    `sorted_within`: the rows reach pandas grouped and sorted (a resample bins rows sorted by
    time), binned together within these keys (() for all rows): pandas then adds a group with
    numpy's reduceat where none of those rows is missing (GROUP_SUMS_DEFINITION).
    `in_key_order`: the column of the frame (IN_KEY_ORDER, in_key_order_flag) that says whether
    the rows come sorted by the keys; taken into the agg and dropped after.
    `untyped`: columns whose type porter does not know (no --data, after a hand-over): their
    plain sum() and mean() go through pandas_group_sums too, which adds floats as pandas
    and whole numbers as before (floats=False)."""
    inner: list[Code] = []
    after: list[Code] = []
    masks: list[Code] = []  # min_count: the sum kept where the group has enough values
    flags: list[str] = []
    for expr in exprs:
        condition, expr = _min_count_parts(expr)
        split = _own_group_sum(expr, untyped)
        if split is not None and condition is not None and split[1] == WHOLE_FRAME:
            split = None
        if split is None:
            inner.append(expr if condition is None else emit.when(condition, expr))
            continue
        if condition is not None:
            flag = MIN_COUNT_FLAG + split[1]
            flags.append(flag)
            inner.append(condition.method("alias", flag))
            masks.append(emit.when(emit.col(flag), emit.col(split[1])).method("alias", split[1]))
        values, name, mean, floats = split
        if name == WHOLE_FRAME:  # df.groupby(k).sum() of columns of unknown type
            if sorted_within is not None or in_key_order is not None:
                inner.append(expr)  # (the flag is per column; Polars' own sum here)
                continue
            inner.append(values)
            options = {"mean": True} if mean else {}
            after.append(emit.call(GROUP_SUMS_FUNCTION, emit.atom("pl.selectors.list()"),
                                   **options, floats=False))
            continue
        inner.append(values if values.text == emit.col(name).text else values.method("alias", name))
        options: dict[str, object] = {"mean": True} if mean else {}
        if not floats:
            options["floats"] = False
        if sorted_within is not None:
            options["sorted_within"] = list(sorted_within)
        if in_key_order is not None:
            options["in_key_order"] = emit.col(in_key_order)
        after.append(emit.call(GROUP_SUMS_FUNCTION, emit.col(name), **options))
    if in_key_order is not None and after:
        inner.append(emit.col(in_key_order).method("first"))
    code = code.method("agg", *inner)
    if not after:
        return code
    code = code.method("with_columns", *after)
    if masks:
        code = code.method("with_columns", *masks).method("drop", *flags)
    return code.method("drop", in_key_order) if in_key_order is not None else code


class UntypedColumns:
    """The columns of a frame whose type porter does not know (`in` tells), for agg_with_sums."""

    def __init__(self, frame: Frame) -> None:
        self.frame = frame

    def __contains__(self, name: object) -> bool:
        return isinstance(name, str) and self.frame.dtype(name) is None


IN_KEY_ORDER = "_porter_rows_in_key_order"


def keys_sorted_as_pandas(grouped: Grouped) -> bool:
    """A sort=True, dropna=True groupby by keys that Polars sorts as pandas does (text by code
    point, numbers, dates, True/False): whether its rows come in key order can be told from
    them, which decides how pandas adds a group's floats (in_key_order_flag)."""
    return grouped.sort and not grouped.prepared and grouped.dropna and all(
        grouped.frame.dtype(k) in ("str", "int", "datetime", "date", "bool")
        for k in grouped.keys)


def in_key_order_flag(grouped: Grouped, exprs: list[Code],
                      untyped: Collection[str] = ()) -> Code | None:
    """For a groupby with float sums of their own (agg_with_sums), a flag computed on the rows
    before grouping: whether they come sorted by the keys, those with a missing key first
    (pandas drops them): pandas 3.1's group ids are then monotonic, and it adds a column
    without missing values with numpy's reduceat (pandas_group_sums). Only for sort=True
    groupbys by keys that Polars sorts as pandas does (text by code point, numbers, dates,
    True/False); None otherwise."""
    if not keys_sorted_as_pandas(grouped):
        return None
    if not any(split is not None and split[1] != WHOLE_FRAME
               for split in (_own_group_sum(e, untyped) for e in exprs)):
        return None
    keys = list(grouped.keys)
    if len(keys) == 1:
        return emit.col(keys[0]).method("is_sorted")
    # a row with any key missing is dropped by pandas (id -1): it must come first
    complete = emit.unary("~", emit.pl("any_horizontal", emit.pl("col", *keys).method("is_null")))
    return emit.when(complete, emit.pl("struct", *keys)).method("is_sorted")


def pivot_groups(source: Code, groups: list[str], value: str, expr: Code) -> Code:
    """The groups of a pivot (pivot_table, crosstab with values=): `source` without the rows
    missing a key, grouped by `groups`, `expr` (agg_expr of the column `value`) per group. A
    float sum or mean is added as pandas adds it (agg_with_sums): pandas 3.1 groups by
    monotonic ids and adds with numpy's reduceat where the rows come sorted by the keys (those
    missing a key first) and the column holds no missing value at all (NaN on a row missing a
    key counts too), and with its compensated sum otherwise: the flag is computed on the rows
    before any is dropped."""
    split = _own_group_sum(expr)
    if split is None or split[1] == WHOLE_FRAME:
        return agg_with_sums(source.method("drop_nulls", groups).method("group_by", groups),
                             expr)
    complete = emit.unary("~", emit.pl("any_horizontal", emit.pl("col", *groups).method("is_null")))
    ordered = emit.when(complete, emit.pl("struct", *groups)).method("is_sorted") \
        if len(groups) > 1 else emit.col(groups[0]).method("is_sorted")
    present = emit.unary("~", emit.col(value).method("fill_nan", None).method("is_null")
                         .method("any"))
    flagged = source.method("with_columns", **{IN_KEY_ORDER: emit.binop(ordered, "&", present)})
    return agg_with_sums(flagged.method("drop_nulls", groups).method("group_by", groups), expr,
                         in_key_order=IN_KEY_ORDER)


MIN_COUNT_FLAG = "_porter_min_count_"


def _min_count_parts(expr: Code) -> tuple[Code | None, Code]:
    """(the condition, the sum) of with_min_count's pl.when(cond).then(sum), maybe aliased
    (the alias kept on the sum); (None, expr) for any other expression."""
    try:
        node = ast.parse(expr.text, mode="eval").body
    except SyntaxError:
        return None, expr
    alias = None
    if isinstance(node, ast.Call) and isinstance(node.func, ast.Attribute) \
            and node.func.attr == "alias" and len(node.args) == 1 and not node.keywords:
        alias, node = node.args[0], node.func.value
    if not (isinstance(node, ast.Call) and isinstance(node.func, ast.Attribute)
            and node.func.attr == "then" and len(node.args) == 1 and not node.keywords):
        return None, expr
    when = node.func.value
    if not (isinstance(when, ast.Call) and ast.unparse(when.func) == "pl.when"
            and len(when.args) == 1 and not when.keywords):
        return None, expr
    condition = ast.get_source_segment(expr.text, when.args[0])
    total = ast.get_source_segment(expr.text, node.args[0])
    if condition is None or total is None or ".count() >= " not in condition:
        return None, expr
    total_code = emit.atom(total)
    if alias is not None:
        total_code = total_code.method("alias", ast.literal_eval(alias))
    return emit.atom(f"({condition})"), total_code


def _plain_column(node: ast.expr) -> str | None:
    """The name in pl.col("name"), or None for another expression."""
    if isinstance(node, ast.Call) and ast.unparse(node.func) == "pl.col" and len(node.args) == 1 \
            and not node.keywords and isinstance(node.args[0], ast.Constant) \
            and isinstance(node.args[0].value, str):
        return node.args[0].value
    return None


WHOLE_FRAME = ""  # _own_group_sum's name for pl.all().sum(): each column, after the agg a list


def _own_group_sum(expr: Code, untyped: Collection[str] = ()) -> tuple[Code, str, bool, bool] | None:
    """(the values, the output's name, whether a mean, whether known floats) of
    pandas_group_sum(values) or pandas_group_mean(values), or of pl.col(c).sum() / mean() of
    a column c in `untyped`, alone or aliased; None for any other expression."""
    try:
        node = ast.parse(expr.text, mode="eval").body
    except SyntaxError:
        return None
    name = None
    if isinstance(node, ast.Call) and isinstance(node.func, ast.Attribute) \
            and node.func.attr == "alias" and len(node.args) == 1 and not node.keywords \
            and isinstance(node.args[0], ast.Constant) and isinstance(node.args[0].value, str):
        name, node = node.args[0].value, node.func.value
    if isinstance(node, ast.Call) and isinstance(node.func, ast.Attribute) \
            and node.func.attr in ("sum", "mean") and not node.args and not node.keywords:
        if ast.unparse(node.func.value) == "pl.all()" and name is None \
                and isinstance(untyped, UntypedColumns):  # every column, none of them known
            return emit.pl("all"), WHOLE_FRAME, node.func.attr == "mean", False
        column = _plain_column(node.func.value)
        if column is None or column not in untyped:
            return None
        return emit.col(column), name or column, node.func.attr == "mean", False
    if not (isinstance(node, ast.Call) and isinstance(node.func, ast.Name)
            and node.func.id in (GROUP_SUM_FUNCTION, GROUP_MEAN_FUNCTION)
            and len(node.args) == 1 and not node.keywords):
        return None
    values = ast.get_source_segment(expr.text, node.args[0])
    if values is None:
        return None
    if name is None:  # the output is named after the column the values come from
        name = _plain_column(node.args[0])
        if name is None:
            return None
    return emit.atom(values), name, node.func.id == GROUP_MEAN_FUNCTION, True


def with_min_count(column: Code, total: Code, min_count: int, dtype: str | None) -> Code:
    """A group's sum `total`, missing where the group has fewer than `min_count` values
    (pandas' min_count): pl.when(count >= k).then(total). The sum itself is left as it was
    made (agg_with_sums finds a float sum of its own inside and adds it as pandas adds)."""
    if dtype == "str":
        raise Unsupported("min_count of a text sum")
    # pandas counts the values that are not NaN (Polars' count() counts a NaN)
    values = column.method("fill_nan", None) if dtype == "float" else column
    count = values.method("count")
    return emit.when(emit.binop(count, ">=", min_count), total)


GROUP_SPREAD_DIGITS = (
    "pandas adds a group's values one by one to a running mean and sum of squares (Welford's "
    "method) for std and var, Polars computes them another way: the last digit can differ "
    "(3.1449649170272735 in pandas, 3.144964917027274 here)")


def lower_for_group_spread(ctx: RuleContext, how: str, dtype: str | None) -> None:
    """A group's std or var is not pandas' to the last digit: say so (0.98). A column of True/
    False values has few distinct sums of squares, but is lowered as well."""
    if how in ("std", "var") and dtype != "str":
        ctx.lower(GROUP_SPREAD_DIGITS, 0.98)


def agg_expr(column: Code, how: str, dtype: str | None = None, *, float32: bool = False) -> Code:
    """One pandas aggregation as a Polars expression, with pandas' treatment of missing values.

    `float32`: the float column may be float32 (ops.float32_possible). pandas 3.1's group
    mean of float32 is float64, added in float64 (0.15000000223517418 for 0.1 and 0.2), where
    the rows come grouped in the order of the sorted keys and no value is missing (its
    reduceat path), and float32 otherwise (0.15000000596046448, written 0.15): the type
    depends on the data, which a Polars plan cannot follow."""
    if how == "mean" and float32 and dtype == "float":
        raise Unsupported("the group mean of a column that may be float32: pandas gives "
                          "float64 (added in float64: 0.15000000223517418) where the rows come "
                          "in the order of the sorted keys and no value is missing, float32 "
                          "(0.15000000596046448, written 0.15) otherwise; a Polars plan fixes "
                          "the type before it sees the data")
    if how == "count":  # non-missing values; Int64 so later arithmetic cannot wrap around
        return column.method("count").method("cast", emit.atom("pl.Int64"))
    if how == "nunique":  # pandas does not count missing values
        return column.method("drop_nulls").method("n_unique").method("cast", emit.atom("pl.Int64"))
    if how == "nunique_all":  # dropna=False: a missing value (NaN or None) counts as one
        return column.method("n_unique").method("cast", emit.atom("pl.Int64"))
    if how in ("first", "last"):  # pandas skips missing values
        return column.method(how, ignore_nulls=True)
    if how == "sum" and dtype == "str":  # pandas concatenates text
        return column.attr("str").method("join", "")
    if how == "sum" and dtype == "bool":
        # pandas counts the True values as int64; Polars' UInt32 would wrap around below 0
        # in later arithmetic (the sum - 3 of a group with one True is 4294967294)
        return column.method("sum").method("cast", emit.atom("pl.Int64"))
    if how in ("sum", "mean") and dtype == "float" and not float32:
        # pandas adds a group's floats with a compensated sum, Polars in another order
        return emit.call(GROUP_SUM_FUNCTION if how == "sum" else GROUP_MEAN_FUNCTION, column)
    if how == "builtin_sum":  # Python's sum meets NaN: the group's sum is NaN
        return emit.when(emit.binop(column.method("null_count"), "==", 0), column.method("sum"))
    if how in ("builtin_min", "builtin_max"):
        # Python's min/max keep a NaN met first (nothing compares above it) and skip later ones
        return emit.when(column.method("first").method("is_not_null"), column.method(how[8:]))
    if how in ("numpy_std", "numpy_var"):
        # np.std / np.var given as the function: pandas 3 calls them on each group's Series,
        # which numpy hands to Series.std / var with ddof=0 (missing values skipped)
        if dtype not in ("int", "float"):
            raise Unsupported(f"np.{how[6:]} of a column not known to be numbers")
        return column.method(how[6:], ddof=0)
    if how == "numpy_median":
        # np.median reads the group's values: one missing value makes the median NaN
        if dtype not in ("int", "float"):
            raise Unsupported("np.median of a column not known to be numbers")
        return emit.when(emit.binop(column.method("null_count"), "==", 0), pandas_median(column))
    if how == "median" and dtype in ("int", "float"):
        return pandas_median(column)
    if how in ("sum", "mean", "median", "min", "max", "std", "var"):
        return column.method(how)
    if how in ("any", "all"):
        # pandas skips missing values (skipna=True): a group of only missing values is False
        # for any, True for all, as Polars' any/all ignoring nulls; numbers are true when not
        # 0 and text when not empty; a column of unknown type is cast (text fails loudly)
        if dtype in ("int", "float"):
            column = emit.binop(column, "!=", 0)
        elif dtype == "str":
            column = emit.binop(column, "!=", "")
        elif dtype is None:
            column = column.method("cast", emit.atom("pl.Boolean"))
        elif dtype != "bool":
            raise Unsupported(f"aggregation {how!r} of a {dtype} column")
        return column.method(how)
    raise Unsupported(f"aggregation {how!r}")


NUMPY_AGGREGATIONS = {
    "nansum": "sum", "nanmean": "mean", "amin": "min", "nanmin": "min", "amax": "max",
    "nanmax": "max", "nanmedian": "median", "median": "numpy_median", "std": "numpy_std",
    "nanstd": "numpy_std", "var": "numpy_var", "nanvar": "numpy_var",
}


def how_name(value: Value) -> str:
    if isinstance(value, Opaque) and isinstance(value.const, str):
        return value.const
    if isinstance(value, Module):
        if value.qualname.startswith("numpy."):
            name = value.qualname.rsplit(".", 1)[-1]
            # pandas 3 calls a numpy function on each group's Series: sum, mean, min and max
            # (and their nan* forms) are the Series' own reductions; std and var are too, with
            # numpy's ddof=0; np.median reads the values (a missing one makes NaN)
            return NUMPY_AGGREGATIONS.get(name, name)
        return value.qualname.rsplit(".", 1)[-1]
    if isinstance(value, Opaque) and value.code.text in ("sum", "min", "max", "len"):
        # pandas 3 calls a Python builtin on each group's values (NaN included)
        return {"len": "size"}.get(value.code.text, f"builtin_{value.code.text}")
    raise Unsupported(f"aggregation {value.code.text} (a function porter cannot read)")


def _is_function(value: Value) -> bool:
    """A lambda, or a name porter does not know as a value (the script's own def)."""
    return isinstance(value, Opaque) and not value.is_const \
        and isinstance(value.node, (cst.Lambda, cst.Name)) \
        and not (isinstance(value.node, cst.Name) and value.node.value in ("sum", "min", "max", "len"))


def _function_pair(spec: Value, ctx: RuleContext) -> tuple[str, Opaque] | None:
    """("kg", lambda s: ...) in a named aggregation: the column and the function."""
    node = spec.node if isinstance(spec, Opaque) else None
    if not (isinstance(node, cst.Tuple) and len(node.elements) == 2):
        return None
    column, function = (ctx.evaluate(e.value, {}) for e in node.elements)
    if isinstance(column, Opaque) and isinstance(column.const, str) and _is_function(function):
        assert isinstance(function, Opaque)
        return column.const, function
    return None


def _builtin_pair(spec: Value, ctx: RuleContext) -> tuple[str, str] | None:
    """("kg", sum) in a named aggregation: the column and the builtin's aggregation name."""
    node = spec.node if isinstance(spec, Opaque) else None
    if not (isinstance(node, cst.Tuple) and len(node.elements) == 2):
        return None
    function = node.elements[1].value
    if not (isinstance(function, cst.Name) and function.value in ("sum", "min", "max", "len")):
        # ("kg", np.std): a numpy function porter reads (how_name)
        value = ctx.evaluate(function, {})
        if not (isinstance(value, Module) and value.qualname.startswith("numpy.")):
            return None
    column = ctx.evaluate(node.elements[0].value, {})
    if not (isinstance(column, Opaque) and isinstance(column.const, str)):
        return None
    return column.const, how_name(ctx.evaluate(function, {}))


# numpy's functions whose name (pandas' label for the output column) is the attribute's
NUMPY_LABELLED = frozenset({
    "sum", "mean", "max", "min", "amax", "amin", "std", "var", "median", "nansum", "nanmean",
    "nanmax", "nanmin", "nanmedian", "nanstd", "nanvar", "size",
})


def _function_item(node: cst.BaseExpression, ctx: RuleContext) -> tuple[Any, str] | None:
    """One aggregation of a dict or list given to agg: (what add() reads, pandas' label of its
    output column). A text is itself; a numpy function (pandas 3 calls it on each group's
    Series) and the builtins sum / min / max / len (called on each group's values) are read
    by how_name and labelled by their __name__, as pandas labels them. None: not one of these."""
    if isinstance(node, cst.Name) and node.value in ("sum", "min", "max", "len"):
        value = ctx.evaluate(node, {})
        return how_name(value), node.value
    value = ctx.evaluate(node, {})
    if isinstance(value, Opaque) and isinstance(value.const, str):
        return value.const, value.const
    if isinstance(value, Module) and value.qualname.startswith("numpy."):
        name = value.qualname.rsplit(".", 1)[-1]
        if name in NUMPY_LABELLED:
            return how_name(value), name
    return None


def _functions_spec(spec: Value, ctx: RuleContext) -> Any:
    """A dict or list given to agg that holds numpy functions or Python builtins beside texts
    ({"kg": np.mean, "n": [np.sum, "max"]}): the same structure with each function as a
    (how, label) pair; None when it is not one porter reads."""
    node = spec.node if isinstance(spec, Opaque) else None

    def functions(items: cst.BaseExpression) -> Any:
        if isinstance(items, cst.List):
            read = [_function_item(e.value, ctx) for e in items.elements
                    if isinstance(e, cst.Element)]
            if len(read) != len(items.elements) or None in read:
                return None
            if len({label for _, label in read}) != len(read):
                # [np.sum, sum]: two outputs of one label (pandas keeps both, a Polars frame
                # cannot)
                raise Unsupported("two functions of one name in a list of aggregations")
            return read
        return _function_item(items, ctx)

    if isinstance(node, cst.Dict):
        result: dict[str, Any] = {}
        for element in node.elements:
            if not isinstance(element, cst.DictElement):
                return None
            key = ctx.evaluate(element.key, {})
            if not (isinstance(key, Opaque) and isinstance(key.const, str)) or key.const in result:
                return None
            hows = functions(element.value)
            if hows is None:
                return None
            result[key.const] = hows
        return result
    if isinstance(node, cst.List):
        return functions(node)
    return None


def grouped_of(call: PandasCall) -> Grouped:
    assert isinstance(call.receiver, Grouped)
    return call.receiver


@rule("frame.groupby")
def groupby(call: PandasCall, ctx: RuleContext) -> Value:
    """df.groupby(keys, sort, dropna, as_index, group_keys) -> a pending group_by.

    Handles: rows with a missing key are dropped (dropna=True); keys sorted (sort=True) or in
    order of first appearance (sort=False); keys as the index (as_index=True); group_keys
    (only apply reads it, and only for a result like-indexed to each group: porter keeps it
    for the apply it hands to pandas); observed=False where every key's type is known and none
    is a category (it adds only a Categorical key's unseen categories).
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "by", "sort", "dropna", "as_index", "observed", "group_keys",
                       "level", positional=1)
    by = call.arg("by", 0, None)
    if call.has("level"):
        keys = _levels_as_keys(call, frame, ctx)
    elif isinstance(by, Column) and by.name is not None and by.code.text == emit.col(by.name).text:
        # a column of this very frame; a Series of another frame (or of other rows) is aligned
        # on the index by pandas, which has no expression form
        check_same_rows(by, frame)
        keys: list[str] = [by.name]
    elif isinstance(by, Column) and not by.element:
        return _computed_key(call, frame, by, ctx)
    else:
        keys_const = call.const("by", 0)
        keys = column_names(keys_const, "the group keys")
    if not all(isinstance(k, str) for k in keys):
        raise Unsupported("grouping by something other than column names")
    if call.const("observed", None, True) is not True \
            and not all(frame.dtype(k) in ("str", "int", "float", "bool", "date", "datetime") for k in keys):
        # observed=False only adds the unseen categories of a Categorical key
        raise Unsupported("observed=False adds unseen categories")
    if any(frame.dtype(k) == "category" for k in keys):
        ctx.lower("category keys sort by their categories in pandas; porter sorts by text, which "
                  "is the same for categories made by astype('category')", 0.9)
    sort = call.const("sort", None, None)
    if sort is not True and frame.dask:
        # Dask's groupby (sort=None or False) does not sort: with one output partition (split_out=1)
        # its order depends on the aggregation's path (a Series' sum sorts each partition's
        # groups, then keeps the order they are met in over the partitions; agg({...}) keeps
        # the order met) and on how the files split into partitions
        ctx.lower("Dask's groupby does not sort its groups, and their order depends on its "
                  "partitions and on the aggregation (each partition's groups sorted, then "
                  "in the order met; agg({...}) in the order met): porter orders them as "
                  "pandas would; give sort=True, or sort the result", 0.5)
    return Grouped(frame.code, frame=frame, keys=tuple(keys),
                   sort=bool(sort if sort is not None else True),
                   dropna=bool(call.const("dropna", None, True)),
                   as_index=bool(call.const("as_index", None, True)),
                   group_keys=bool(call.const("group_keys", None, True, kinds=(bool,))),
                   key_list=isinstance(by, Opaque) and isinstance(by.const, list)
                   or isinstance(call.const("level", None, None, kinds=(str, int, list)), list))


def _levels_as_keys(call: PandasCall, frame: Frame, ctx: RuleContext) -> list[str]:
    """groupby(level=...) of a table labelled by key columns, naming (or giving the positions
    of) every level: the groups of those key columns, as groupby(by=keys) makes them (pandas
    reads an index level's name as a key too)."""
    from porter.rules.selection import index_level
    if call.arg("by", 0, None) is not None:
        raise ctx.todo("by= and level= together")
    given = call.const("level", None, None, kinds=(str, int, list))
    levels = given if isinstance(given, list) else [given]
    keys: list[str] = []
    for level in levels:
        found = index_level(frame, Opaque(emit.lit(level), const=level))
        if found is None or found in keys:
            raise ctx.todo(f"a level the index does not have: {level!r}")
        keys.append(found)
    if set(keys) != set(frame.index):
        # pandas leaves the other levels out of what it aggregates: Polars would sum them
        raise ctx.todo("some of the levels only: group by the key columns and drop the others")
    if call.const("as_index", None, True) is not True:
        raise ctx.todo("as_index=False with level=")
    return keys


@rule("series.groupby")
def series_groupby(call: PandasCall, ctx: RuleContext) -> Value:
    """s.groupby(level=...) of a Series labelled by key columns (a groupby's result) -> a
    pending group_by on those key columns, the Series the one column to aggregate.

    Handles: level by name or position, one or a list; sort= and dropna= as for a frame (a
    row whose level is missing is left out); the other levels stay labels of what head(),
    nth() and the windows keep (they are columns of the frame).
    Caveats: by= (a Series, a function or a mapping of the labels) and a Series labelled
    0..n-1 are TODOs.
    """
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call, "level", "sort", "dropna", "group_keys", "observed")
    if call.has("by", 0) or not call.has("level"):
        raise Unsupported("grouping a Series by values (by=): porter reads level= only")
    frame = column.frame
    if not frame.index or column.element:
        raise Unsupported("level= of a Series labelled 0..n-1")
    levels = call.const_values("level", None, kinds=(str, int))
    keys: list[str] = []
    for level in levels or ():
        if isinstance(level, bool):
            raise Unsupported("level=True")
        if isinstance(level, int):
            if not -len(frame.index) <= level < len(frame.index):
                raise Unsupported("a level position the index does not have (pandas raises)")
            keys.append(frame.index[level])
        elif level in frame.index and not frame.index_unnamed:
            keys.append(level)
        else:
            raise Unsupported(f"level {level!r} is not a name of the index (pandas raises)")
    if not keys or len(set(keys)) != len(keys):
        raise Unsupported("no level, or a level named twice")
    if call.const("observed", None, True) is not True \
            and not all(frame.dtype(k) in ("str", "int", "float", "bool", "date", "datetime")
                        for k in keys):
        raise Unsupported("observed=False adds unseen categories")
    name = column.name
    if name is None or name in frame.index or column.code.text != emit.col(name).text:
        # a computed Series: made a column of its frame first, named apart from the keys
        name = name if isinstance(name, str) and name not in frame.index and \
            (frame.columns is None or name not in frame.columns) else "_porter_values"
        frame = derive(frame, frame.code.method("with_columns", column.code.method("alias", name)),
                       same_rows=True, columns=None if frame.columns is None else
                       (*(c for c in frame.columns if c != name), name),
                       dtypes=tuple((c, t) for c, t in frame.dtypes if c != name)
                       + (((name, column.dtype),) if column.dtype else ()))
        if name == "_porter_values":
            raise Unsupported("a computed Series whose name porter cannot keep")
    sort = call.const("sort", None, None)
    if sort is not True and frame.dask:
        # Dask's groupby (sort=None or False) does not sort: with one output partition (split_out=1)
        # its order depends on the aggregation's path (a Series' sum sorts each partition's
        # groups, then keeps the order they are met in over the partitions; agg({...}) keeps
        # the order met) and on how the files split into partitions
        ctx.lower("Dask's groupby does not sort its groups, and their order depends on its "
                  "partitions and on the aggregation (each partition's groups sorted, then "
                  "in the order met; agg({...}) in the order met): porter orders them as "
                  "pandas would; give sort=True, or sort the result", 0.5)
    return Grouped(frame.code, frame=frame, keys=tuple(keys),
                   sort=bool(sort if sort is not None else True),
                   dropna=bool(call.const("dropna", None, True)),
                   group_keys=bool(call.const("group_keys", None, True, kinds=(bool,))),
                   selection=(name,), single=True,
                   key_list=isinstance(call.kwargs.get("level"), Opaque)
                   and isinstance(call.kwargs["level"].const, list))


def _computed_key(call: PandasCall, frame: Frame, by: Column, ctx: RuleContext) -> Value:
    """df.groupby(df["ts"].dt.date) -> the Series made a key column named like it, then
    grouped by it. Its frame holds other rows than `frame` (its key column is not the
    frame's), so nothing computed from the groups is put back into `frame` as an expression."""
    check_same_rows(by, frame)
    if by.name is None:
        raise Unsupported("grouping by a computed Series without a name")
    ctx.reject_unknown(call, "by", "sort", "dropna", "as_index", positional=1)
    if call.const("as_index", None, True) is not True:
        raise Unsupported("as_index=False with a computed Series as the key")
    if by.dtype not in ("int", "float", "str", "bool", "date", "datetime"):
        raise Unsupported("grouping by a computed Series of a type porter does not know")
    name = by.name
    hides = frame.columns is None or name in frame.columns
    # a comparison that met a missing value is False in pandas (a key), null in Polars
    key = ctx.bool_expr(by, frame) if by.dtype == "bool" else ctx.expr(by, frame)
    code = frame.code.method("with_columns", key.method("alias", name))
    columns = None if frame.columns is None else (
        frame.columns if name in frame.columns else (*frame.columns, name))
    dtypes = tuple((c, t) for c, t in frame.dtypes if c != name) + ((name, by.dtype),)
    keyed = derive(frame, code, same_rows=False, columns=columns, dtypes=dtypes)
    sort = bool(call.const("sort", None, True))
    dropna = bool(call.const("dropna", None, True))
    options = {k: v for k, v in (("sort", sort), ("dropna", dropna)) if v is not True}
    pandas = handover.to_pandas(frame).method("groupby", handover.to_pandas(by), **options)
    return Grouped(keyed.code, frame=keyed, keys=(name,), sort=sort, dropna=dropna,
                   pandas=pandas, hides_column=hides)


@rule("groupby.getitem")
def groupby_getitem(call: PandasCall, ctx: RuleContext) -> Value:
    """g["kg"] / g[["kg", "price"]] -> the columns to aggregate."""
    grouped = grouped_of(call)
    key = call.args[0]
    if isinstance(key, Opaque) and isinstance(key.const, str):
        return Grouped(grouped.code, frame=grouped.frame, keys=grouped.keys, sort=grouped.sort,
                       dropna=grouped.dropna, as_index=grouped.as_index,
                       group_keys=grouped.group_keys, selection=(key.const,), single=True,
                       prepared=grouped.prepared, key_list=grouped.key_list,
                       pandas=grouped.pandas, hides_column=grouped.hides_column)
    if isinstance(key, Opaque) and isinstance(key.const, list):
        return Grouped(grouped.code, frame=grouped.frame, keys=grouped.keys, sort=grouped.sort,
                       dropna=grouped.dropna, as_index=grouped.as_index,
                       group_keys=grouped.group_keys, selection=tuple(key.const), single=False,
                       prepared=grouped.prepared, key_list=grouped.key_list,
                       pandas=grouped.pandas, hides_column=grouped.hides_column)
    if isinstance(key, Scalar) and key.pytype == "list[str]" and not grouped.prepared \
            and grouped.pandas is None and not grouped.frame.index:
        # g[cols] of a list of names made when the script runs (list(other.columns)): the
        # frame narrowed to the keys and those columns, grouped as a frame whose other
        # columns porter does not know (a key named in the list, which pandas aggregates as
        # a column too, makes Polars raise on the name held twice: never a table without it)
        frame = grouped.frame
        keys = list(grouped.keys)
        chosen = emit.pl("col", key.code)
        narrowed = derive(frame, frame.code.method("select", *keys, chosen), same_rows=True,
                          columns=None, dtypes=tuple((k, t) for k, t in frame.dtypes if k in keys))
        return Grouped(narrowed.code, frame=narrowed, keys=grouped.keys, sort=grouped.sort,
                       dropna=grouped.dropna, as_index=grouped.as_index,
                       group_keys=grouped.group_keys, selection=None, single=False,
                       key_list=grouped.key_list)
    raise Unsupported("selecting group columns by a computed key")


def agg_dtype(how: str, dtype: str | None) -> str | None:
    """porter's dtype name of an aggregate of a column of `dtype` (None: not known)."""
    if how in COUNTS:
        return "int"
    if how in ("numpy_std", "numpy_var", "numpy_median"):
        return "float"
    if how in ("mean", "median", "std", "var"):
        if dtype == "duration" and how in ("mean", "median"):
            return "duration"
        return "float" if dtype in ("int", "float", "bool") else None
    if how in ("sum", "builtin_sum"):
        return {"bool": "int", "int": "int", "float": "float", "str": "str",
                "duration": "duration"}.get(dtype or "")
    if how in ("min", "max", "first", "last", "builtin_min", "builtin_max"):
        return dtype if dtype in ("int", "float", "str", "bool", "datetime", "date", "duration") \
            else None
    return None


def aggregate(grouped: Grouped, exprs: list[Code], names: list[str], ctx: RuleContext,
              *, series_name: str | None = None, is_series: bool = False,
              dtypes: list[str | None] | None = None) -> Value:
    """The frame of aggregates, sorted like pandas, as a frame or (for one column) a Series.

    `dtypes` are the aggregates' types where known (agg_dtype); the keys keep theirs."""
    same = [n for n in names if n in grouped.keys]
    if same:
        # pandas keeps the key in the index and the aggregate beside it under one name
        # (written vessel,vessel; as_index=False keeps only the aggregate): a Polars frame
        # cannot hold two columns of one name
        raise Unsupported(f"aggregating the group key {same[0]!r} under its own name: pandas "
                          "keeps the key in its index and the aggregate beside it under one "
                          "name (as_index=False: the aggregate in place of the key); no Polars "
                          "frame holds two columns of one name")
    _float_int_aggregates(grouped, exprs, ctx)
    _object_bool_sums(grouped, exprs, ctx)
    order = group_order(grouped) if grouped.sort else None
    if order is not None and grouped.prepared:
        raise Unsupported("a True/False key with missing values kept (dropna=False) of a "
                          "groupby bound to a name: pandas' order of its groups")
    # with a True/False key whose missing values are kept, the groups in order of first
    # appearance (maintain_order), which order_of_bool_key reads
    zeros = _zero_keys(grouped)
    if zeros:
        # pandas labels the one group of 0.0 and -0.0 of a key with the zero it met first in
        # the frame (-0.0 in every combination of several keys); Polars' group_by on several
        # keys writes 0.0: each such key is taken again from the group's rows, where it holds
        # the frame's first zero
        grouped = replace(grouped, frame=replace(grouped.frame, code=grouped.frame.code.method(
            "with_columns", *(emit.col(k).method("first").method("over", k) for k in zeros))))
    untyped = UntypedColumns(grouped.frame)
    flag = in_key_order_flag(grouped, exprs, untyped) if order is None else None
    if flag is not None:
        # pandas adds a group's floats one of two ways, chosen by how the rows come
        grouped = replace(grouped, frame=replace(grouped.frame, code=grouped.frame.code.method(
            "with_columns", **{IN_KEY_ORDER: flag})))
    code = agg_with_sums(
        grouping_code(grouped if order is None else replace(grouped, sort=False)),
        *exprs, *(emit.col(k).method("first").method("alias", ZERO_KEY + k) for k in zeros),
        in_key_order=IN_KEY_ORDER if flag is not None else None, untyped=untyped)
    if zeros:
        code = code.method("with_columns", *(emit.col(ZERO_KEY + k).method("alias", k)
                                             for k in zeros)).method(
            "drop", emit.names_arg(ZERO_KEY + k for k in zeros))
    kinds = dtypes or [None] * max(len(names), 1)
    if any(".sum()" in e.text and ".sum().cast(" not in e.text for e in exprs) \
            and any(t is None for t in kinds):
        # a sum of a column of unknown type may be a sum of True/False: UInt32 in Polars, which
        # wraps around below 0 in later arithmetic (pandas counts them as int64)
        code = code.method("with_columns",
                           emit.atom("pl.selectors.unsigned_integer()").method("cast", emit.atom("pl.Int64")))
    keys = list(grouped.keys)
    if grouped.sort:
        # keys are unique after grouping, so the sort is total; a kept null key sorts last
        kwargs = {} if grouped.dropna else {"nulls_last": True}
        code = code.method("sort", emit.names_arg(keys) if order is None else order, **kwargs)
    columns = (*keys, *names)
    index = tuple(keys) if grouped.as_index else ()
    known = [(k, grouped.frame.dtype(k)) for k in keys]
    known += list(zip(names, dtypes or [None] * len(names)))
    rows = fresh_token()
    frame = Frame(code, columns=columns, index=index, labels_intact=not grouped.as_index,
                  dtypes=tuple((c, t) for c, t in known if t is not None), rows=rows,
                  grouped_rows=rows if grouped.sort and grouped.dropna and index else None,
                  levels_as_met=not grouped.sort and len(index) > 1,
                  levels_with_missing=grouped.sort and not grouped.dropna and len(index) > 1)
    if is_series and grouped.as_index:
        name = series_name
        return Column(emit.col(name if name is not None else names[0]), frame=frame,
                      name=name, refs=frozenset(names), dtype=frame.dtype(names[0]))
    return frame


ZERO_KEY = "_porter_key_"


def _zero_keys(grouped: Grouped) -> list[str]:
    """The float keys of a grouping on several keys (not one bound to a name), whose zero
    Polars writes as 0.0 where pandas writes the zero it met first."""
    if grouped.prepared or len(grouped.keys) < 2:
        return []
    return [k for k in grouped.keys if grouped.frame.dtype(k) == "float"]


def order_of_bool_key(key: str) -> Code:
    """What to sort by so that a True/False key holding a missing value comes in pandas' order
    of its groups (groupby(dropna=False, sort=True)), over rows in order of first appearance.

    Such a column is an object column in pandas (True, False and NaN, as read_csv gives it),
    and pandas sorts its distinct values as numpy sorts objects: an insertion sort of them in
    order of first appearance, where NaN is neither below nor above anything. So NaN met first
    stays first (NaN, False, True), NaN met last stays last (False, True, NaN), and NaN met
    between the two keeps the order they were met in (True, NaN, False). Without a missing
    value the column is pandas' bool: False before True."""
    value = emit.col(key)
    row = emit.pl("int_range", emit.pl("len"))
    at_true, at_false, at_null = (row.method("filter", c).method("first") for c in (
        value, value.method("not_"), value.method("is_null")))
    as_int = value.method("cast", emit.atom("pl.Int8"))
    met = emit.when(value, at_true).method("when", value.method("not_")).method(
        "then", at_false).method("otherwise", at_null)
    return emit.when(at_null.method("is_null"), as_int).method(
        "when", emit.binop(at_null, "==", emit.pl("min_horizontal", at_true, at_false, at_null))
    ).method("then", as_int.method("fill_null", -1)).method(
        "when", emit.binop(at_null, "==", emit.pl("max_horizontal", at_true, at_false, at_null))
    ).method("then", as_int.method("fill_null", 2)).method("otherwise", met)


def group_order(grouped: Grouped) -> list[Code] | None:
    """What to sort groups (or rows in order of first appearance) by, to have pandas' order
    of the groups, where a key is True/False and missing keys are kept; None where sorting
    by the keys with missing ones last gives it."""
    # pandas' nullable boolean (dtype="boolean", astype("boolean")) sorts as a number: False,
    # True, then <NA> last, as sorting by the key with missing ones last does
    objects = [k for k in grouped.keys if grouped.frame.dtype(k) == "bool"
               and nullable_mark(grouped.frame, k) != "boolean"]
    if grouped.dropna or not objects:
        return None
    return [order_of_bool_key(k) if k in objects else emit.col(k) for k in grouped.keys]


def _object_bool_sums(grouped: Grouped, exprs: list[Code], ctx: RuleContext) -> None:
    """The group sums of a True/False column as read (not one the script computed): with a
    missing value anywhere in the file, pandas holds it as an object column, whose group sum
    is Python's sum from the group's first value: a group of one value keeps it (True, False),
    mixed with the counts of the others; porter counts the True values (1, 0)."""
    for name in target_columns_of(grouped, exprs):
        if grouped.frame.dtype(name) == "bool" and grouped.frame.version(name) == 0 \
                and any(e.text.startswith(agg_expr(emit.col(name), "sum", "bool").text)
                        for e in exprs):
            ctx.lower(f"`{name}` is an object column in pandas where it has a missing value "
                      "(read_csv): its group sums keep a group's lone value as True/False, "
                      "where porter counts the True values (1, 0)", 0.9)


def target_columns_of(grouped: Grouped, exprs: list[Code]) -> list[str]:
    """The frame's columns named in the aggregations `exprs`."""
    columns = grouped.frame.columns or ()
    return [c for c in columns if any(emit.col(c).text in e.text for e in exprs)]


def _float_int_aggregates(grouped: Grouped, exprs: list[Code], ctx: RuleContext) -> None:
    """An integer column pandas holds as float64 when a step left a value missing (Frame.
    float_ints: a map() that missed a value, a merge that left a row unmatched) aggregates to
    float64 there (a sum of 50.0, written 50.0), to Int64 here with no missing value left in
    the groups' sums (written 50): which one depends on the data, so the site says so."""
    counted = ("count()", "len()", "n_unique()", "null_count()")
    for name, why in grouped.frame.float_ints:
        if name in grouped.keys:
            continue
        if any(emit.col(name).text in e.text and not any(c in e.text for c in counted)
               for e in exprs):
            ctx.lower(f"pandas holds `{name}` as float64 when {why}: its aggregates are float "
                      "there (50.0), integers here (50) where no group is left without a value",
                      0.9)


def target_columns(grouped: Grouped, ctx: RuleContext) -> list[str] | None:
    if grouped.selection is not None:
        return list(grouped.selection)
    if grouped.hides_column:
        raise Unsupported(f"the key {grouped.keys[0]!r} is computed and named like a column, "
                          "which pandas aggregates too: select the columns to aggregate")
    if grouped.frame.columns is not None:
        # pandas aggregates the columns, never the index: the row labels a filter or sort
        # left in the column "index" (or an index set_index made) are not aggregated
        return [c for c in grouped.frame.columns
                if c not in grouped.keys and c not in grouped.frame.index]
    return None


def _all_but_index(grouped: Grouped) -> Code:
    """pl.all() in the group_by's agg (the keys left out by Polars), without the columns that
    hold the frame's index, which pandas never aggregates."""
    index = [c for c in grouped.frame.index if c not in grouped.keys]
    return emit.pl("all").method("exclude", *index) if index else emit.pl("all")


@rule(*(f"groupby.{how}" for how in AGGREGATIONS))
def reduce(call: PandasCall, ctx: RuleContext) -> Value:
    """GroupBy.sum / mean / median / min / max / ... / size -> aggregations in LazyGroupBy.agg.

    The reductions: sum, mean, median, min, max, std, var, count, nunique, first, last, size.

    Handles: missing values skipped by first/last/nunique/count; counts as Int64; keys sorted.
    """
    grouped = grouped_of(call)
    how = call.name
    allowed = {"numeric_only", "ddof"} if how in ("std", "var") else {"numeric_only"}
    if how == "nunique":
        allowed = {"dropna"}
    if how == "sum":
        allowed = {"numeric_only", "min_count"}
    ctx.reject_unknown(call, *allowed)
    if call.const("numeric_only", None, False):
        raise Unsupported("numeric_only=True needs the column types")
    dropna = call.const("dropna", None, True)
    if dropna not in (True, False):
        raise Unsupported("dropna computed at run time")
    if how == "nunique" and dropna is False:
        how = "nunique_all"  # a missing value (NaN or None, one value to pandas) counts once
    min_count = call.const("min_count", None, 0)
    if isinstance(min_count, bool) or not isinstance(min_count, int):
        raise Unsupported("min_count that is not a literal whole number")
    if how == "size":
        expr = emit.pl("len").method("cast", emit.atom("pl.Int64"))
        if grouped.as_index:
            # g.size() is an unnamed Series; g["qty"].size() is named after the column
            name = grouped.selection[0] if grouped.single and grouped.selection else None
            return aggregate(grouped, [expr.method("alias", name or "size")], [name or "size"], ctx,
                             series_name=name, is_series=True, dtypes=["int"])
        return aggregate(grouped, [expr.method("alias", "size")], ["size"], ctx, dtypes=["int"])
    ddof = call.const("ddof", None, 1)
    columns = target_columns(grouped, ctx)
    if columns is None:
        ctx.lower("the non-key columns are not known: text columns would fail in Polars "
                  "(pandas concatenates or raises); run with --data to know them", 0.85)
        if min_count > 0:
            raise Unsupported("min_count over columns porter does not know (run with --data)")
        lower_for_group_spread(ctx, how, None)
        expr = agg_expr(_all_but_index(grouped), how)
        if how in ("std", "var") and ddof != 1:
            expr = _all_but_index(grouped).method(how, ddof=ddof)
        return aggregate(grouped, [expr], [], ctx)
    exprs = []
    for name in columns:
        lower_for_group_spread(ctx, how, grouped.frame.dtype(name))
        expr = agg_expr(emit.col(name), how, grouped.frame.dtype(name),
                        float32=float32_possible(ctx))
        if how in ("std", "var") and ddof != 1:
            expr = emit.col(name).method(how, ddof=ddof)
        if min_count > 0 and grouped.frame.dtype(name) is None:
            ctx.lower(f"min_count: the type of `{name}` is not known, and a NaN porter does not "
                      "see as missing would be counted as a value", 0.95)
        if min_count > 0:
            expr = with_min_count(emit.col(name), expr, min_count, grouped.frame.dtype(name))
        exprs.append(expr)
    single = grouped.single and len(columns) == 1
    dtypes = [agg_dtype(how, grouped.frame.dtype(name)) if ddof == 1 or how not in ("std", "var")
              else "float" for name in columns]
    return aggregate(grouped, exprs, columns, ctx, series_name=columns[0] if single else None,
                     is_series=single, dtypes=dtypes)


# pandas' group quantile is its own (libgroupby.group_quantile), not numpy's: with the group's
# values sorted and the position q * (count - 1), it takes the value below the position where
# the position falls on one, else val + (next - val) * frac, frac the position's fraction.
# numpy's quantile (pandas_quantile) computes next - (next - val) * (1 - frac) from frac 0.5 up,
# which ends a unit in the last digit away in about one group in ten.
GROUP_QUANTILE_FUNCTION = "pandas_group_quantile"
GROUP_QUANTILE_DEFINITION = '''\
def pandas_group_quantile(column, q, interpolation="linear"):
    """The q quantile of a group's values as pandas' groupby().quantile(q) computes it: with
    the values sorted, missing ones left out, and the position q * (count - 1), the value
    below the position where it falls on one, else val + (next - val) * frac (frac the
    position's fraction), to the last binary digit. numpy's quantile, which Series.quantile
    uses, interpolates from the value above past frac 0.5 and can end a digit away; Polars'
    linear quantile too. "lower", "higher": val, next; "midpoint": (val + next) / 2;
    "nearest": the position rounded half to even. A group without values: missing."""
    count = column.count()
    position = (count.cast(pl.Float64) - 1) * q
    frac = position - position.floor()
    below = column.drop_nulls().quantile(q, "lower")
    above = column.drop_nulls().quantile(q, "higher")
    if interpolation == "lower":
        return below
    if interpolation == "higher":
        return above
    if interpolation == "nearest":
        odd = position.floor() % 2 == 1
        return pl.when((frac > 0.5) | ((frac == 0.5) & odd)).then(above).otherwise(below)
    between = (below + above) / 2 if interpolation == "midpoint" else below + (above - below) * frac
    return pl.when(frac == 0).then(below).otherwise(between)
'''


def _numeric_targets(grouped: Grouped, ctx: RuleContext, what: str, unknown: str) -> list[str]:
    """The columns a group statistic of numbers aggregates: known ones (pandas raises on text),
    each of them numbers, or of a type not known (the confidence lowered with `unknown`)."""
    columns = target_columns(grouped, ctx)
    if columns is None:
        raise Unsupported("the columns to aggregate are not known (run with --data): pandas "
                          "raises on text columns")
    for name in columns:
        dtype = grouped.frame.dtype(name)
        if dtype is None:
            ctx.lower(f"the type of `{name}` is not known: {unknown}", 0.95)
        elif dtype not in ("int", "float"):
            raise Unsupported(f"the group {what} of a {dtype} column")
    return list(columns)


@rule("groupby.quantile")
def group_quantile(call: PandasCall, ctx: RuleContext) -> Value:
    """GroupBy.quantile(q) -> pandas_group_quantile(pl.col(c), q) in LazyGroupBy.agg.

    Handles: one q (a number), linear interpolation as pandas' group quantile computes it to
    the last digit (val + (next - val) * frac, not numpy's formula); missing values skipped, a
    group without values missing; keys sorted, as_index, sort, dropna as the other aggregations.
    interpolation lower / higher / midpoint / nearest as pandas' group quantile (nearest: the
    position rounded half to even); lower / higher / nearest of integers stay integers.
    Caveats: a list of q, numeric_only and columns not known to be numbers are TODOs.
    """
    grouped = grouped_of(call)
    ctx.reject_unknown(call, "q", "interpolation", "numeric_only", positional=1)
    q = call.const("q", 0, 0.5)
    if not isinstance(q, (int, float)) or isinstance(q, bool):
        raise Unsupported("q that is not one literal number (several quantiles give a "
                          "MultiIndex in pandas)")
    if not 0 <= q <= 1:
        raise Unsupported("q outside [0, 1] (pandas raises)")
    method = call.const("interpolation", None, "linear")
    if method not in ("linear", "lower", "higher", "midpoint", "nearest"):
        raise Unsupported(f"interpolation={method!r}")
    if call.const("numeric_only", None, False) is not False:
        raise Unsupported("numeric_only=True needs the column types")
    columns = _numeric_targets(grouped, ctx, "quantile", "a quantile of dates or times in "
                               "pandas is a date or time, which Polars' may not follow")
    options = {} if method == "linear" else {"interpolation": method}
    exprs, dtypes = [], []
    for name in columns:
        expr = emit.call(GROUP_QUANTILE_FUNCTION, emit.col(name), q, **options)
        if method in ("lower", "higher", "nearest") and grouped.frame.dtype(name) == "int":
            # one of the group's values: pandas keeps int64 (Polars' quantile gives Float64)
            expr, kind = expr.method("cast", emit.atom("pl.Int64")), "int"
        else:
            kind = "float"
        exprs.append(expr.method("alias", name))
        dtypes.append(kind)
    single = grouped.single and len(columns) == 1
    return aggregate(grouped, exprs, columns, ctx, series_name=columns[0] if single else None,
                     is_series=single, dtypes=dtypes)


# pandas 3.1's group skew adds each value to running moments in row order (algos'
# moments_add_value) and corrects the bias at the end (calc_skew): fewer than 3 values, or
# values all equal (0 / 0), give NaN. Polars' skew(bias=False) sums powers of the deviations
# instead and ends a few units in the last digits away in most groups, so each group's values
# go through the same steps in Python (about 0.5 s per 1,000,000 values).
GROUP_SKEW_FUNCTION = "pandas_group_skew"
GROUP_SKEW_DEFINITION = '''\
def pandas_group_skew(values):
    """A group's skew as pandas' groupby().skew() computes it, to the last digit: each value
    that is not missing added in row order to the running mean and second and third central
    moments, then m3 / (m2 * sqrt(m2)) * n * sqrt(n - 1) / (n - 2); fewer than 3 values or
    values all equal give NaN. Polars' skew(bias=False) computes it another way, a few units
    in the last digits away."""
    import numpy as np

    count, mean, m2, m3 = 0, 0.0, 0.0, 0.0
    for value in values.to_list():
        if value is None or value != value:
            continue
        delta = value - mean
        count += 1
        n = float(count)
        delta_n = delta / n
        term1 = delta * delta_n * (n - 1.0)
        m3 += delta_n * (term1 * (n - 2.0) - 3.0 * m2)
        m2 += term1
        mean += delta_n
    if count < 3:
        return float("nan")
    with np.errstate(all="ignore"):  # 0 / 0 where the values are all equal: NaN, as pandas
        m2, m3, n = np.float64(m2), np.float64(m3), np.float64(count)
        return float((m3 / (m2 * np.sqrt(m2))) * ((n * np.sqrt(n - 1.0)) / (n - 2.0)))
'''


@rule("groupby.skew")
def group_skew(call: PandasCall, ctx: RuleContext) -> Value:
    """GroupBy.skew() -> pandas_group_skew on each group's values in LazyGroupBy.agg.

    Handles: the bias-corrected skew as pandas 3.1 computes it to the last digit (running
    moments in row order, pandas_group_skew); missing values skipped; fewer than 3 values or
    all values equal give NaN; keys sorted, as_index, sort, dropna as the other aggregations.
    Caveats: skipna=False, numeric_only and columns not known to be numbers are TODOs.
    """
    grouped = grouped_of(call)
    ctx.reject_unknown(call, "skipna", "numeric_only")
    if call.const("skipna", None, True) is not True:
        raise Unsupported("skipna=False")
    if call.const("numeric_only", None, False) is not False:
        raise Unsupported("numeric_only=True needs the column types")
    columns = _numeric_targets(grouped, ctx, "skew", "a column of True/False or dates may "
                               "not follow pandas")
    exprs = [emit.col(name).method("cast", emit.atom("pl.Float64")).method(
        "map_batches", emit.atom(GROUP_SKEW_FUNCTION), return_dtype=emit.atom("pl.Float64"),
        returns_scalar=True).method("alias", name) for name in columns]
    single = grouped.single and len(columns) == 1
    return aggregate(grouped, exprs, columns, ctx, series_name=columns[0] if single else None,
                     is_series=single, dtypes=["float"] * len(columns))


@rule("groupby.agg", "groupby.aggregate")
def agg(call: PandasCall, ctx: RuleContext) -> Value:
    """GroupBy.agg -> LazyGroupBy.agg: g.agg(total=("kg", "sum")), g.agg({"kg": "sum"}),
    g["kg"].agg(["sum", "mean"]), g.agg("sum").

    Handles: output names as pandas makes them; a dict of lists gives MultiIndex columns in
    pandas, flattened here to "kg_sum" for every output (documented), as is a list on a
    frame's one column (g[["kg"]].agg([...])); handed to pandas with its keys in the index,
    the frame gets its two levels back (handover.to_pandas); g["kg"].agg(total="sum");
    the Python builtins sum / min / max, which pandas 3 calls on each group's values (a
    missing value makes sum NaN; one met first is min and max), and len (the group size);
    a lambda or the script's own function whose body is a reduction of the group's values, or
    reductions combined by operators (s.max() - s.min()): one aggregation expression
    (windows.group_function).
    Caveats: a float sum/mean/std/var inside such a function is numpy's pairwise summation in
    pandas, Polars adds in order: the last digit can differ (0.95).
    """
    grouped = grouped_of(call)
    exprs: list[Code] = []
    names: list[str] = []
    dtypes: list[str | None] = []

    def add_function(column: str, function: Opaque, name: str) -> None:
        from porter.rules.windows import group_function  # windows builds on this module
        expr, dtype = group_function(call, grouped, column, function, ctx)
        exprs.append(expr.method("alias", name))
        names.append(name)
        dtypes.append(dtype)

    def add(column: str, how: str, name: str) -> None:
        if how == "size":
            expr = emit.pl("len").method("cast", emit.atom("pl.Int64"))
        else:
            lower_for_group_spread(ctx, how, grouped.frame.dtype(column))
            expr = agg_expr(emit.col(column), how, grouped.frame.dtype(column),
                            float32=float32_possible(ctx))
        exprs.append(expr.method("alias", name))
        names.append(name)
        dtypes.append(agg_dtype(how, grouped.frame.dtype(column)))

    if call.kwargs and not call.args:
        selected = grouped.selection[0] if grouped.single and grouped.selection else None
        for name, spec in call.kwargs.items():
            pair = _function_pair(spec, ctx)
            if pair is not None:  # g.agg(spread=("kg", lambda s: s.max() - s.min()))
                add_function(pair[0], pair[1], name)
                continue
            if selected is not None and _is_function(spec):
                add_function(selected, spec, name)  # g["kg"].agg(spread=lambda s: ...)
                continue
            if selected is not None and not (isinstance(spec, Opaque) and isinstance(spec.const, tuple)):
                add(selected, how_name(spec), name)  # g["kg"].agg(total="sum")
                continue
            builtin = _builtin_pair(spec, ctx)
            if builtin is not None:  # g.agg(total=("kg", sum)): pandas 3 calls it per group
                add(builtin[0], builtin[1], name)
                continue
            if not (isinstance(spec, Opaque) and isinstance(spec.const, tuple) and len(spec.const) == 2):
                raise Unsupported("named aggregation needs (column, function) pairs")
            column, how = spec.const
            add(column, how_name(Opaque(emit.lit(how), const=how)), name)
        return aggregate(grouped, exprs, names, ctx, dtypes=dtypes)
    if len(call.args) != 1:
        raise Unsupported("agg with extra arguments")
    spec_value = call.args[0]
    spec: Any = spec_value.const if isinstance(spec_value, Opaque) and spec_value.is_const else None
    if call.kwargs:
        # g["c"].agg("nunique", dropna=False), g["c"].agg("sum", min_count=1): pandas passes
        # the options to the named method
        if not (isinstance(spec, str) and spec in ("nunique", "sum")
                and set(call.kwargs) <= ({"dropna"} if spec == "nunique" else {"min_count"})):
            raise Unsupported("agg with extra arguments")
        return reduce(PandasCall(grouped, spec, (), dict(call.kwargs), call.node), ctx)
    if spec is None and isinstance(spec_value, Opaque):
        # numpy functions or builtins among texts: each as (how, pandas' label of its output)
        spec = _functions_spec(spec_value, ctx)

    def how_label(how: Any) -> tuple[str, str]:
        return (how[0], how[1]) if isinstance(how, tuple) else (how, str(how))

    if isinstance(spec, dict):
        # any list makes every output a (column, function) pair in pandas: flatten them all
        flattened = any(isinstance(hows, list) for hows in spec.values())
        pairs_made: list[tuple[str, tuple[str, str]]] = []
        for column, hows in spec.items():
            for item in hows if isinstance(hows, list) else [hows]:
                how, label = how_label(item)
                name = f"{column}_{label}" if flattened else column
                add(column, how, name)
                pairs_made.append((name, (column, label)))
        if flattened:
            ctx.lower("pandas makes MultiIndex columns here; porter names them column_function", 0.9)
            result = aggregate(grouped, exprs, names, ctx, dtypes=dtypes)
            pairs = tuple(pairs_made)
            return replace(result, column_pairs=pairs) if isinstance(result, Frame) else result
        return aggregate(grouped, exprs, names, ctx, dtypes=dtypes)
    if isinstance(spec, list):
        columns = target_columns(grouped, ctx)
        if columns is None or len(columns) != 1:
            raise Unsupported("a list of functions over several columns makes MultiIndex columns")
        if not grouped.single:
            # g[["kg"]].agg([...]): a frame's columns, (column, function) pairs in pandas
            for item in spec:
                how, label = how_label(item)
                add(columns[0], how, f"{columns[0]}_{label}")
            ctx.lower("pandas makes MultiIndex columns here; porter names them column_function", 0.9)
            result = aggregate(grouped, exprs, names, ctx, dtypes=dtypes)
            pairs = tuple((f"{columns[0]}_{how_label(item)[1]}", (columns[0], how_label(item)[1]))
                          for item in spec)
            return replace(result, column_pairs=pairs) if isinstance(result, Frame) else result
        for item in spec:
            how, label = how_label(item)
            add(columns[0], how, label)
        return aggregate(grouped, exprs, names, ctx, dtypes=dtypes)
    if _is_function(spec_value):
        # g["kg"].agg(lambda s: s.max() - s.min()), g.agg(spread): each column's own value
        assert isinstance(spec_value, Opaque)
        columns = target_columns(grouped, ctx)
        if columns is None:
            raise Unsupported("a function over columns porter does not know")
        for column in columns:
            add_function(column, spec_value, column)
        single = grouped.single and len(columns) == 1
        return aggregate(grouped, exprs, names, ctx, series_name=columns[0] if single else None,
                         is_series=single, dtypes=dtypes)
    how = how_name(spec_value)
    if how.startswith(("builtin_", "numpy_")):
        columns = target_columns(grouped, ctx)
        if columns is None:
            raise Unsupported("a Python builtin or numpy function over columns porter does "
                              "not know")
        for column in columns:
            add(column, how, column)
        single = grouped.single and len(columns) == 1
        return aggregate(grouped, exprs, names, ctx, series_name=columns[0] if single else None,
                         is_series=single, dtypes=dtypes)
    forward = PandasCall(grouped, how, (), {}, call.node)
    if how not in AGGREGATIONS:
        raise Unsupported(f"aggregation {how!r}")
    return reduce(forward, ctx)


# -- whole-column reductions ------------------------------------------------------------------

def scalar_of(column: Column, expr: Code, pytype: str | None = None, *,
              collected: Code | None = None, numpy: bool = False) -> Scalar:
    """A reduction of a column: `expr` inside expressions of its frame, `collected` (default
    `expr`) as the Python value.

    A number or a True/False is numpy's, as pandas gives it (np.float64, np.int64, np.bool_):
    it divides by zero to inf/NaN where a Python float raises ZeroDivisionError, has .round()
    / .astype() / .item(), round() rounds it as pandas' value rounds, and ~ of a True/False is
    its negation (~True is -2 in Python). `numpy` asks for numpy's value where the type is not
    known (a missing number is then NaN, as pandas', not None)."""
    value = collected if collected is not None else expr
    if collected is not None and collected != expr:
        # the Python value is NaN where pandas' is; marked float, it is made null again inside
        # another frame's expressions (context.expr_in)
        pytype = "float"
    elif pytype is None and expr.text.endswith(".sum()") and column.dtype in ("int", "float"):
        pytype = column.dtype
    if pytype == "bool" or pytype is None and column.dtype == "bool" \
            or numpy and pytype not in ("int", "float"):
        code = column.frame.code.method("select", value).method("collect").method(
            "to_series").method("to_numpy").index(0)
    elif pytype in ("int", "float"):
        code = column.frame.code.method("select", value)
        if not (value.text.endswith(".cast(pl.Int64)") or collected is not None and collected != expr):
            # an integer as np.int64, as pandas' (an Int32 sum would wrap around in numpy
            # arithmetic); a float, whatever porter took the column to be, stays a float
            code = code.method("cast", emit.atom("{pl.selectors.integer(): pl.Int64}"))
        code = code.method("collect").method("to_series").method("to_numpy").index(0)
    else:
        code = column.frame.code.method("select", value).method("collect").method("item")
    agg_column = Column(expr, frame=column.frame, name=column.name, refs=column.refs,
                        versions=column.versions)
    return Scalar(code, pytype=pytype, agg=agg_column)


@rule(*(f"series.{how}" for how in ("sum", "mean", "median", "min", "max", "std", "var", "count",
                                   "nunique")))
def series_reduce(call: PandasCall, ctx: RuleContext) -> Value:
    """s.sum() / mean / median / min / max / std / var / count / nunique -> a Python scalar.

    Handles: missing values are skipped (nunique does not count them; with dropna=False they
    count once); the sum of text joins
    the texts; std/var with ddof (1 by default), of numbers computed as pandas' nanvar does
    (pandas_reduce: numpy's pairwise sums in two passes, to the last digit);
    the mean, median, std, var (and the min and max of a float column) of no values (an empty
    selection, only missing values, the std of one value) are NaN in pandas and None in
    Polars: the Python value is made NaN (fill_null(float("nan"))).
    Numbers and True/False are numpy's (np.int64, np.float64, np.bool_), as pandas gives
    them: the min/max of no integers is NaN, ~ of any() is its negation, a zero max divides
    to inf.
    The min/max of a column of unknown type (named by a loop variable), of text or of dates
    is pandas' value through to_pandas(): nan for no values (NaT for dates), a Timestamp for
    a date.
    Caveats: the min/max of no values of a boolean column (or one of unknown type holding
    True/False) is NaN in pandas and None here (a NaN fill would make every result float)
    (0.98); the mean of a column of
    unknown type that holds dates is numpy's datetime64, not a pd.Timestamp (0.98).
    """
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call, "ddof", "skipna", "numeric_only",
                       *(("dropna",) if call.name == "nunique" else ()))
    if call.const("skipna", None, True) is not True:
        raise Unsupported("skipna=False")
    dropna = call.const("dropna", None, True)
    if dropna not in (True, False):
        raise Unsupported("dropna computed at run time")
    how = call.name
    code = ctx.bool_expr(column, column.frame) if column.dtype == "bool" else column.code
    if column.dtype == "duration" and how in ("std", "var"):
        raise Unsupported(f"the {how} of durations: Polars has none (pandas gives a Timedelta)")
    if column.dtype == "duration" and how in ("sum", "mean", "median", "min", "max"):
        # pandas' value is a Timedelta ("1 days 01:45:00"), which Polars' to_pandas makes; a
        # Python timedelta prints "1 day, 1:45:00"
        scalar = scalar_of(column, code.method(how))
        value = column.frame.code.method("select", code.method(how)).method("collect") \
            .method("to_series").method("to_pandas").index(0)
        assert scalar.agg is not None
        return replace(scalar, code=value, agg=replace(scalar.agg, dtype="duration"))
    if how in ("std", "var"):
        expr = code.method(how, ddof=call.const("ddof", None, 1))
    elif how == "nunique" and dropna is False:
        # a missing value (NaN or None, one value to pandas) counts once
        expr = code.method("n_unique").method("cast", emit.atom("pl.Int64"))
    elif how in ("count", "nunique"):
        expr = agg_expr(code, how)
    elif how == "sum" and column.dtype == "bool":
        expr = agg_expr(code, how, "bool")  # Int64, as pandas' int64 (Polars' UInt32 wraps)
    elif how == "sum" and column.dtype == "int" and not column.element \
            and small_ints_possible(ctx):
        # numpy adds an int32 (int16, int8) column into int64; Polars' sum keeps Int32 and
        # wraps around (2000000000 + 2000000000 is -294967296): the column is cast first
        expr = code.method("cast", emit.atom("pl.Int64")).method("sum")
    elif how == "sum" and column.dtype == "str":
        # pandas joins the texts (missing ones skipped); of no text at all it gives 0
        ctx.lower("the sum of no text at all is 0 in pandas and \"\" here", 0.98)
        expr = agg_expr(code, how, "str")
    elif how == "median" and column.dtype in ("int", "float"):
        expr = pandas_median(code)  # (a + b) / 2 for an even count, as pandas
    else:
        expr = code.method(how)
    if how in ("min", "max") and column.dtype in ("datetime", "str"):
        # pandas' value through to_pandas(): a pd.Timestamp, or NaT where there are no values
        # (an empty selection, only missing ones), where item() gave None (printed "None", and
        # max - min failed); text as is, NaN for no text
        # day_name(), quarter and the like are written with the datetime's own (evaluate.py),
        # which a Timestamp has too
        return pandas_scalar(column, expr, "datetime" if column.dtype == "datetime" else None)
    if column.float_int is not None and column.dtype == "int" and how in ("sum", "min", "max"):
        return _float_int_reduction(column, code, expr)
    float64 = not ("Float32" in code.text or float32_possible(ctx))
    # a group's values inside a function of the group (transform(lambda s: s - s.mean())): the
    # reduction is computed per group by Polars' own (a Python function per group would be
    # slow); the rules there say that the last digit can differ
    in_group = GROUP_VALUES in column.frame.code.text
    if how == "sum" and column.dtype == "float" and not column.element and in_group:
        return _numpy_sum(column, code, expr)
    if how in ("std", "var") and column.dtype in ("int", "float") and not column.element \
            and not in_group and float64:
        # numpy's two passes, as pandas' nanvar: the pairwise sum for the mean, then the
        # squared distances added the same way; Polars' own std can be a digit off
        # (3.265986323710904 for 3.2659863237109046)
        expr = pandas_reduce(code, how, call.const("ddof", None, 1))
    if how == "sum" and column.dtype == "float" and not column.element:
        # inside an expression of the same rows (d["v"] / d["v"].sum()) the total is numpy's
        # pairwise sum too: Polars' own sum adds in another order and the share could differ
        # in the last digit (0.23972844534962662 for 0.2397284453496266)
        return _numpy_sum(column, code, pandas_reduce(code) if float64 else expr)
    if how == "mean" and column.dtype == "float" and not column.element and float64:
        inside = expr if in_group else pandas_reduce(code, "mean").method("fill_nan", None)
        return _numpy_mean(column, code, inside)
    if how in ("sum", "mean") and column.dtype is None and not column.element \
            and not float32_possible(ctx) and not in_group:
        return _total_of_unknown_type(column, code, expr, how)
    if how in ("min", "max") and column.dtype is None:
        return _unknown_type_extreme(column, how, expr, ctx)
    if how in NAN_WHEN_EMPTY:
        # numpy's value where Polars' is not a float: the min/max of no integers is NaN there
        # as in pandas (None from item()), a mean of a column of unknown type a numpy float
        numpy = column.dtype == "int" or column.dtype is None and how not in ("min", "max")
        scalar = scalar_of(column, expr, collected=_nan_when_empty(column, how, expr, ctx),
                           numpy=numpy)
        if column.number and how in ("mean", "median", "std", "var") and scalar.pytype is None:
            scalar = replace(scalar, pytype="float")  # of numbers (Frame.numbers): a float
        return scalar
    # a count, or a sum of integers or booleans, is a Python int (stored as a column: Int64)
    whole = how in ("count", "nunique") or how == "sum" and column.dtype in ("int", "bool")
    scalar = scalar_of(column, expr, "int" if whole else None, numpy=column.dtype is None)
    if how == "nunique":
        # pandas' nunique() is a Python int (printed 2, not np.int64(2) inside a list)
        return replace(scalar, code=column.frame.code.method("select", expr).method("collect")
                       .method("item"))
    return scalar


# numpy's reductions given a Series call the Series' own method (numpy passes ddof=0 to std
# and var); np.median is not one of them: numpy reads the values, and a missing one makes NaN
NUMPY_REDUCTIONS = {
    "np.sum": "sum", "np.nansum": "sum", "np.mean": "mean", "np.nanmean": "mean",
    "np.max": "max", "np.amax": "max", "np.nanmax": "max", "np.min": "min", "np.amin": "min",
    "np.nanmin": "min", "np.std": "std", "np.var": "var",
}


@rule(*NUMPY_REDUCTIONS)
def numpy_reduction(call: PandasCall, ctx: RuleContext) -> Value:
    """np.sum(s) / np.mean(s) / np.max(s) / np.std(s) … -> the Series' own reduction.

    Handles: numpy hands a Series to the Series' own method, so missing values are skipped as
    s.sum() skips them; np.std and np.var with ddof=0, as numpy passes it; the nan* forms give
    the same values (a sum of no values is 0, a mean NaN).
    Caveats: axis=, dtype=, out= or ddof= given to numpy are TODOs.
    """
    if len(call.args) != 1 or call.kwargs:
        raise Unsupported("numpy's axis=, dtype=, out= or ddof= with a Series")
    column = call.args[0]
    if not isinstance(column, Column):
        raise Unsupported("numpy's reduction of something other than one column")
    how = NUMPY_REDUCTIONS[ctx.key]
    kwargs: dict[str, Value] = {"ddof": Opaque(emit.lit(0), const=0)} \
        if how in ("std", "var") else {}
    return series_reduce(replace(call, receiver=column, name=how, args=(), kwargs=kwargs), ctx)


# numpy's order statistics of a Series read its values (numpy does not hand them to the
# Series' own method): a missing value, NaN to numpy, makes the result NaN; the nan* forms
# skip missing values. The quantile asked for, as a fraction (np.percentile's q / 100)
NUMPY_QUANTILES = ("np.median", "np.nanmedian", "np.percentile", "np.nanpercentile",
                   "np.quantile", "np.nanquantile")


@rule(*NUMPY_QUANTILES)
def numpy_quantile(call: PandasCall, ctx: RuleContext) -> Value:
    """np.median(s) / np.percentile(s, q) / np.quantile(s, q) and their nan* forms ->
    numpy's linear interpolation of the column's values (pandas_quantile), one value.

    Handles: numpy interpolates linearly between the two values around the position, to the
    last digit as pandas_quantile computes it; np.percentile divides q by 100 as numpy does;
    a missing value makes np.median / np.percentile / np.quantile NaN (numpy reads NaN), the
    nan* forms skip missing values; integer columns give floats.
    Caveats: several quantiles at once (a list q), axis=, method= and the like, a q outside
    [0, 100] (numpy raises), and columns not known to hold numbers are TODOs.
    """
    name = call.name
    median = name.endswith("median")
    ctx.reject_unknown(call, "a", *(() if median else ("q",)), positional=1 if median else 2)
    column = call.arg("a", 0)
    if not isinstance(column, Column) or column.element:
        raise Unsupported(f"np.{name} of something other than one column")
    if column.dtype not in ("int", "float"):
        raise Unsupported(f"np.{name} of a column not known to hold numbers")
    q = 0.5 if median else call.const("q", 1, None)
    if not isinstance(q, (int, float)) or isinstance(q, bool):
        raise Unsupported("several quantiles at once, or a q computed at run time")
    if name.endswith("percentile"):
        q = q / 100  # numpy's true division, the same float
    if not 0 <= q <= 1:
        raise Unsupported("a quantile outside [0, 1] (numpy raises)")
    expr = emit.call(QUANTILE_FUNCTION, column.code, q)
    if not name.startswith("nan"):
        # numpy reads a missing value as NaN, which makes the result NaN
        expr = emit.when(emit.binop(column.code.method("null_count"), "==", 0), expr)
    return scalar_of(column, expr, collected=expr.method("fill_null", emit.call("float", "nan")))


@rule("series.mode")
def series_mode(call: PandasCall, ctx: RuleContext) -> Value:
    """s.mode() -> the most frequent values, sorted, as a column of a frame of their own.

    Handles: missing values are not counted (dropna=True); every value tied for most frequent,
    in sorted order and labelled 0..k-1, as pandas gives them; no values give an empty Series.
    Caveats: dropna=False, and columns whose type porter does not know (or integers pandas
    holds as floats, or as its nullable integers), are TODOs.
    """
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call, "dropna", positional=1)
    if call.const("dropna", 0, True) is not True:
        raise Unsupported("dropna=False counts the missing values as one more value")
    if column.dtype not in ("int", "float", "str", "bool", "datetime", "date"):
        raise Unsupported("the mode of a column whose type porter does not know")
    if column.dtype == "int" and (column.float_int is not None
                                  or ctx.nullable_ints_possible
                                  and column.nullable_int != NOT_NULLABLE):
        raise Unsupported("the mode of integers pandas may hold as float64 or as its nullable "
                          "Int64 here")
    name = column.name if column.name is not None else "mode"
    expr = column.code.method("drop_nulls").method("mode").method("sort").method("alias", name)
    frame = Frame(column.frame.code.method("select", expr), columns=(name,),
                  dtypes=((name, column.dtype),), sites=column.sites)
    return replace(column_of(frame, name), name=column.name)


NAN_WHEN_EMPTY = ("mean", "median", "min", "max", "std", "var", "quantile")


def _unknown_type_extreme(column: Column, how: str, expr: Code, ctx: RuleContext) -> Scalar:
    """The min or max of a column whose type porter does not know (a loop over names): the
    value as pandas gives it, whatever the column's type, through to_pandas(): NaN for a
    column with no values (item() gives None, printed "None" where pandas prints "nan"),
    np.int64 / np.float64 for numbers, a pd.Timestamp for a date (NaT for none), text as is."""
    ctx.lower(f"the {how} of a True/False column of unknown type with no values is NaN in "
              "pandas and None here", 0.98)
    return pandas_scalar(column, expr)


def pandas_scalar(column: Column, expr: Code, pytype: str | None = None) -> Scalar:
    """The value of `expr` (one row) as pandas gives it: collected and read through
    to_pandas() (NaN, NaT, a Timestamp, numpy numbers)."""
    value = column.frame.code.method("select", expr).method("collect").method(
        "to_series").method("to_pandas").attr("iloc").index(0)
    agg_column = Column(expr, frame=column.frame, name=column.name, refs=column.refs,
                        versions=column.versions,
                        dtype="datetime" if pytype == "datetime" else None)
    return Scalar(value, pytype=pytype, agg=agg_column)


# the name a group stands under inside a function of the group (windows.GROUP_FRAME)
GROUP_VALUES = "_porter_group"


def _numpy_sum(column: Column, code: Code, expr: Code) -> Scalar:
    """The sum of a float column as pandas' Series.sum() computes it: numpy's pairwise sum in
    the column's own type (np.float32(57.8) for float32), missing values counted 0. Polars
    adds in another order: the last digit differs in about half of the sums of a few thousand
    prices (96690495.5379627 for 96690495.53796269), and float32 sums by more (57.800003)."""
    value = column.frame.code.method("select", code).method("collect").method(
        "to_series").method("fill_null", 0).method("to_numpy").method("sum")
    agg_column = Column(expr, frame=column.frame, name=column.name, refs=column.refs,
                        versions=column.versions)
    return Scalar(value, pytype="float", agg=agg_column)


# pandas' Series.mean() of floats: numpy's pairwise sum, as Series.sum(), over the count
MEAN_FUNCTION = "pandas_mean"
MEAN_DEFINITION = '''\
def pandas_mean(values):
    """values.mean() of a float Series as pandas computes it: numpy's pairwise sum of the
    values, missing ones counted 0, over their count, and NaN when there is none (Polars
    adds in another order, and the last digit of the mean can differ)."""
    total = values.fill_null(0.0).to_numpy().sum()
    return total / values.count() if values.count() else total * float("nan")
'''


# s.sum() / s.mean() of a column whose type porter does not know (no --data): a float column
# is added as pandas adds it, which only the column's values tell
TOTAL_FUNCTION = "pandas_total"
TOTAL_DEFINITION = '''\
def pandas_total(frame, how="sum"):
    """s.sum() / s.mean() of a column whose type was not known when the script was converted,
    from a frame of one row: the column's values as a list, then Polars' own total. A float
    column is added as pandas adds it, with numpy's pairwise sum, missing values counted 0
    (Polars adds in another order, and the last digit could differ: 11532.650000000001 for
    11532.65), its mean that sum over the count of values (NaN when there is none); any other
    column keeps Polars' total, as a numpy value as pandas gives it."""
    values = frame.to_series(0)[0]
    if not values.dtype.is_float() or how == "mean" and values.dtype != pl.Float64:
        return frame.to_series(1).to_numpy()[0]
    total = values.fill_null(0.0).to_numpy().sum()
    if how == "sum":
        return total
    return total / values.count() if values.count() else total * float("nan")
'''


# the same inside an expression of the column's own rows (d["v"] / d["v"].sum())
TOTAL_EXPR_FUNCTION = "pandas_column_total"
TOTAL_EXPR_DEFINITION = '''\
def pandas_column_total(values, how="sum"):
    """values.sum() / values.mean() inside an expression, of a column whose type was not known
    when the script was converted: a float column added as pandas adds it, with numpy's pairwise
    sum, missing values counted 0 (the mean: of float64, over the count of values); any other
    column with Polars' own sum or mean (text fails, as Polars' own sum)."""
    def total(column):
        if column.dtype.is_float() and (how == "sum" or column.dtype == pl.Float64):
            result = column.fill_null(0.0).to_numpy().sum()
            if how == "mean":
                result = result / column.count() if column.count() else None
            return pl.Series([result], dtype=column.dtype)
        return column.to_frame().select(getattr(pl.all(), how)()).to_series()

    return values.map_batches(total, returns_scalar=True)
'''


def _total_of_unknown_type(column: Column, code: Code, expr: Code, how: str) -> Scalar:
    """The sum or mean of a column of a type porter does not know, as pandas computes it
    (TOTAL_DEFINITION): numpy's pairwise sum where the column holds floats."""
    frame = column.frame.code.method("select", code.method("implode").method("alias", "values"),
                                     expr.method("alias", "total")).method("collect")
    value = emit.call(TOTAL_FUNCTION, frame, *(["mean"] if how == "mean" else []))
    inside = emit.call(TOTAL_EXPR_FUNCTION, code, *(["mean"] if how == "mean" else []))
    agg_column = Column(inside, frame=column.frame, name=column.name, refs=column.refs,
                        versions=column.versions)
    # the mean of numbers, int64 or float64 (Frame.numbers), is a float either way
    return Scalar(value, pytype="float" if how == "mean" and column.number else None,
                  agg=agg_column)


def _numpy_mean(column: Column, code: Code, expr: Code) -> Scalar:
    """The mean of a float64 column as pandas' Series.mean() computes it (MEAN_DEFINITION)."""
    value = emit.call(MEAN_FUNCTION, column.frame.code.method("select", code).method("collect")
                      .method("to_series"))
    agg_column = Column(expr, frame=column.frame, name=column.name, refs=column.refs,
                        versions=column.versions)
    return Scalar(value, pytype="float", agg=agg_column)


def _float_int_reduction(column: Column, code: Code, expr: Code) -> Scalar:
    """The sum, min or max of an integer column pandas holds as float64 when a step left a
    value missing (a map() that found a value not in its dict, a merge that left a row
    unmatched: column.float_int), int64 when none went missing: pandas' value is then
    np.float64 (14.0), else np.int64 (14). Polars keeps Int64 with nulls: one missing value
    of the column put after the result makes to_numpy() give float64 just where pandas'
    column is float64 (the sum of only missing values is 0.0, their max NaN, as pandas')."""
    missing = code.method("filter", code.method("is_null")).method("head", 1)
    value = column.frame.code.method("select", expr.method("append", missing)).method(
        "cast", emit.atom("{pl.selectors.integer(): pl.Int64}")).method("collect").method(
        "to_series").method("to_numpy").index(0)
    agg_column = Column(expr, frame=column.frame, name=column.name, refs=column.refs,
                        versions=column.versions)
    return Scalar(value, agg=agg_column)


def _nan_when_empty(column: Column, how: str, expr: Code, ctx: RuleContext) -> Code:
    """pandas' mean, median, min, ... of no values is NaN; Polars gives None. Where the result
    is a float in Polars too, the Python value is filled with NaN (only the collected value:
    inside expressions porter keeps missing as null)."""
    float_result = column.dtype == "float" if how in ("min", "max") \
        else column.dtype in ("int", "float", "bool")
    if float_result:
        return expr.method("fill_null", emit.call("float", "nan"))
    if column.dtype == "datetime":
        ctx.lower(f"pandas' {how} of a datetime column is a pd.Timestamp, here a datetime."
                  "datetime: porter writes day_name(), month_name(), quarter, dayofweek and "
                  "dayofyear with its own methods; other Timestamp-only ones (normalize(), "
                  "to_period()) fail on it", 0.9)
    if column.dtype == "int":
        return expr  # numpy's value of a missing number is NaN (scalar_of(numpy=True))
    if column.dtype is None and how not in ("min", "max"):
        ctx.lower(f"the {how} of a column of unknown type: pandas' of a date column is a "
                  "pd.Timestamp, here numpy's datetime64", 0.98)
        return expr
    what = "a boolean" if column.dtype == "bool" else \
        "an unknown-type" if column.dtype is None else f"a {column.dtype}"
    missing = "NaT" if column.dtype in ("datetime", "date") else "NaN"
    ctx.lower(f"the {how} of no values (an empty selection or only missing values) of {what} "
              f"column is {missing} in pandas and None here", 0.98)
    return expr


def _has_bins(call: PandasCall) -> bool:
    bins = call.kwargs.get("bins")
    return bins is not None and not (isinstance(bins, Opaque) and bins.is_const and bins.const is None)


def interval_labels(edges: list[int | float]) -> list[str]:
    """The text of the Interval labels pd.cut(values, edges, include_lowest=True) gives its
    bins, as pandas writes them ("(0.999, 1.5]": the first edge moved down by 10**-3, pandas'
    display precision, and the edges rounded to it): computed by pandas itself from the edges,
    which are literal numbers."""
    import pandas as pd

    categories = pd.cut(pd.Series([], dtype="float64"), edges, include_lowest=True).cat.categories
    return [str(c) for c in categories]


def _literal_edges(call: PandasCall, column: Column) -> list[int | float]:
    """value_counts(bins=[edges]): the edges, a literal list of increasing numbers, of a
    column of numbers; anything else a TODO saying why."""
    bins = call.const("bins", None, None, kinds=(list, tuple, int))
    if isinstance(bins, int) and not isinstance(bins, bool):
        raise Unsupported(
            "bins as a number of bins: pandas counts pd.cut(values, n, include_lowest=True), "
            "whose edges come from the data (min and max, widened by 0.1%) and whose Interval "
            "labels round them for display ((0.0891, 3.4]); porter ports literal edges only")
    if not isinstance(bins, (list, tuple)) or len(bins) < 2 or not all(
            isinstance(b, (int, float)) and not isinstance(b, bool) and b == b
            and abs(b) != float("inf") for b in bins):
        raise Unsupported("bins other than a literal list of finite numbers")
    if any(a >= b for a, b in zip(bins, bins[1:])):
        raise Unsupported("bins that do not increase (pandas raises)")
    if column.dtype not in ("int", "float"):
        raise Unsupported("bins of a column not known to hold numbers (pandas raises on text)")
    return list(bins)


def _binned_counts(call: PandasCall, column: Column, ctx: RuleContext) -> Value:
    """s.value_counts(bins=[edges]) -> the rows cut into the bins as pd.cut(include_lowest=True)
    cuts them (an Enum of the Interval labels' text), counted by pandas_category_counts.

    pandas counts pd.cut(values, bins, include_lowest=True): each bin once, in the bins' order,
    an empty one as 0; values outside every bin and missing ones are not counted (dropna=False
    too: pandas drops that missing label); with dropna=True (the default) and no value in any
    bin the result has no rows; normalize divides by the number of values, missing ones and
    those outside the bins too; sort orders the counts stably (ties in the bins' order)."""
    # pandas labels the counts by the bins in an unnamed index (not named after the Series),
    # which reset_index() names "index"
    name = "index"
    edges = _literal_edges(call, column)
    labels = interval_labels(edges)
    values = column.code
    if column.dtype == "float":
        values = values.method("fill_nan", None)  # NaN falls in no bin
    code: Code | None = None
    for i, (low, high, label) in enumerate(zip(edges, edges[1:], labels)):
        # right-closed bins; include_lowest closes the first on its exact edge (pandas counts
        # a value equal to edges[0], not one between the label's moved edge and edges[0])
        test = values.method("is_between", low, high, closed="both" if i == 0 else "right")
        step = emit.pl("lit", label)
        code = emit.pl("when", test).method("then", step) if code is None \
            else code.method("when", test).method("then", step)
    assert code is not None
    binned = code.method("cast", emit.pl("Enum", labels)).method("alias", name)
    source = column.frame.code.method("select", binned)
    counts = emit.call(CATEGORY_COUNTS_FUNCTION, source.method("drop_nulls"), name)
    dropna = call.const("dropna", None, True, kinds=(bool,))
    if dropna:
        # pandas gives no rows where no value falls in any bin
        counts = counts.method("filter", emit.binop(emit.col("count").method("sum"), ">", 0))
    result_name = "count"
    if call.const("normalize", None, False, kinds=(bool,)):
        # divided by the number of values, those in no bin and missing ones too
        total = column.frame.code.method("select", emit.pl("len").method("alias", "_porter_rows"))
        counts = counts.method("join", total, how="cross").method(
            "select", emit.col(name), emit.call(
                DIVIDE_FUNCTION, emit.col("count"), emit.col("_porter_rows")).method(
                "alias", "proportion"))
        result_name = "proportion"
    if call.const("sort", None, True, kinds=(bool,)):
        descending = not call.const("ascending", None, False, kinds=(bool,))
        kwargs: dict[str, object] = {"descending": True} if descending else {}
        counts = counts.method("sort", result_name, **kwargs, maintain_order=True)
    kind = "float" if result_name == "proportion" else "int"
    result = Frame(counts, columns=(name, result_name), index=(name,), labels_intact=False,
                   index_unnamed=True, dtypes=((name, "enum"), (result_name, kind)))
    return Column(emit.col(result_name), frame=result, name=result_name, dtype=kind,
                  refs=frozenset({result_name}))


def _reject_bins(call: PandasCall) -> None:
    """value_counts(bins=...): a TODO saying why (bins=None is no bins)."""
    if _has_bins(call):
        raise Unsupported(
            "bins: pandas counts pd.cut(values, bins, include_lowest=True) and labels the "
            "counts with Interval values, every bin listed (empty ones as 0): with a number of "
            "bins the edges come from the data (min and max, widened by 0.1%) and the labels "
            "round them for display ((0.0891, 3.4]), which porter would have to reproduce as "
            "text; Polars has no Interval type for the index (pd.cut's labels=None is a TODO "
            "too)")


@rule("series.value_counts")
def value_counts(call: PandasCall, ctx: RuleContext) -> Value:
    """s.value_counts() -> counts by value, most frequent first, ties in order of appearance.

    Handles: missing values not counted (dropna=True); normalize=True gives "proportion";
    ascending=True; 0.0 and -0.0 counted as one value shown as the one met first, as pandas. A Categorical whose categories porter knows (pd.cut labels, an Enum of
    pd.Categorical's categories) lists every category, one no row holds counted 0, in the
    categories' order, which also orders ties when sorted (pandas_category_counts).
    Caveats: a category column made by astype("category") is a TODO (pandas' categories are
    the values it held when made, which porter does not know after a filter); so is a column
    named "count" (or "proportion" with normalize=True), whose values and counts pandas gives
    one name.
    """
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call, "normalize", "sort", "ascending", "dropna", "bins")
    if _has_bins(call):
        return _binned_counts(call, column, ctx)
    name = column.name
    if name is None:
        raise Unsupported("counting an unnamed Series")
    if column.dtype == "category":
        raise Unsupported("pandas counts every category of a Categorical, those no row holds "
                          "too, in the categories' order; Polars' Categorical does not know them")
    if name == "count" or name == "proportion" and call.const("normalize", None, False):
        # pandas names the counts "count" ("proportion" with normalize=True) and keeps the
        # values in the index under their own name: a column of that name gives both one name
        # (written count,count), which no Polars frame holds
        raise Unsupported(f"counting the values of a column named {name!r}: pandas keeps them "
                          f"in the index under that name beside the counts ({name},{name} "
                          "written); a Polars frame cannot hold two columns of one name")
    frame = column.frame.code.method("select", column.code if column.code.text == emit.col(name).text
                                     else column.code.method("alias", name))
    if call.const("dropna", None, True):
        frame = frame.method("drop_nulls")
    if column.dtype == "float":
        # 0.0 and -0.0 are one value: pandas shows the one it met first; a lazy group_by may
        # keep either. Each value made the first one of its group first
        frame = frame.method("with_columns", emit.col(name).method("first").method("over", name))
    if column.dtype == "enum":
        # pandas counts a Categorical by its categories: each once, in their order, an unused
        # one as 0; missing values (dropna=False) after them. The stable sort below then orders
        # ties by category, as pandas' does.
        counts = emit.call(CATEGORY_COUNTS_FUNCTION, frame, name)
    else:
        counts = frame.method("group_by", name, maintain_order=True).method(
            "agg", emit.pl("len").method("cast", emit.atom("pl.Int64")).method("alias", "count"))
    result_name = "count"
    if call.const("normalize", None, False):
        # divided value by value, as pandas divides (see series.arith)
        counts = counts.method("select", emit.col(name), emit.call(
            DIVIDE_FUNCTION, emit.col("count"), emit.col("count").method("sum")).method("alias", "proportion"))
        result_name = "proportion"
    if call.const("sort", None, True):
        descending = not call.const("ascending", None, False)
        kwargs: dict[str, object] = {"descending": True} if descending else {}
        counts = counts.method("sort", result_name, **kwargs, maintain_order=True)
    # the counts are int64, the proportions float64
    kind = "float" if result_name == "proportion" else "int"
    rows = fresh_token()  # each value once: labels of distinct values
    result = Frame(counts, columns=(name, result_name), index=(name,), labels_intact=False,
                   dtypes=(((name, column.dtype),) if column.dtype is not None else ())
                   + ((result_name, kind),), rows=rows, distinct_labels=(rows, (name,)))
    return Column(emit.col(result_name), frame=result, name=result_name, dtype=kind,
                  refs=frozenset({result_name}))


@rule("groupby.value_counts")
def group_value_counts(call: PandasCall, ctx: RuleContext) -> Value:
    """g[c].value_counts() -> group_by(keys + [c], maintain_order=True).agg(pl.len()), sorted.

    Handles: pandas groups the rows by the keys and the column without sorting (combinations
    in order of first appearance), sorts the counts stably (sort=True; descending unless
    ascending=True), then, with the groupby's sort=True, sorts stably by the keys alone: within
    a key the most frequent value first, ties in order of first appearance. A row whose key is
    missing is left out (the groupby's dropna=True; dropna=False keeps it, sorted last); a
    missing value is not counted (dropna=True) or counted as a value of its own
    (dropna=False). normalize=True divides by the key's total ("proportion"). as_index=False
    gives a frame. 0.0 and -0.0 are one value, shown as the one met first.
    Caveats: bins, a DataFrameGroupBy (no column selected), Categorical keys or values,
    columns named "count" ("proportion") or like a key, and a True/False key with its missing
    values kept are TODOs.
    """
    grouped = grouped_of(call)
    _reject_bins(call)
    ctx.reject_unknown(call, "normalize", "sort", "ascending", "dropna", "bins")
    if grouped.prepared or not grouped.single or not grouped.selection \
            or len(grouped.selection) != 1:
        raise Unsupported("value_counts of a groupby without one column selected")
    if grouped.hides_column or grouped.pandas is not None:
        raise Unsupported("value_counts of a groupby by a computed key")
    value = grouped.selection[0]
    keys = list(grouped.keys)
    normalize = call.const("normalize", None, False, kinds=(bool,))
    sort = call.const("sort", None, True, kinds=(bool,))
    ascending = call.const("ascending", None, False, kinds=(bool,))
    dropna = call.const("dropna", None, True, kinds=(bool,))
    result_name = "proportion" if normalize else "count"
    if value in keys or result_name in (*keys, value):
        raise Unsupported(f"a column named like a key or {result_name!r}: pandas gives the "
                          "index and the counts one name, which no Polars frame can hold")
    if group_order(grouped) is not None:
        raise Unsupported("a True/False key with missing values kept (dropna=False): pandas' "
                          "order of its groups")
    frame = grouped.frame
    for name in (*keys, value):
        dtype = frame.dtype(name)
        if dtype in ("category", "enum"):
            raise Unsupported("a Categorical key or value: pandas counts every category")
        if dtype is None:
            ctx.lower(f"the type of `{name}` is not known: 0.0 and -0.0 are one value to "
                      "pandas, shown as the one met first, which a lazy group_by may not "
                      "follow", 0.95)
    code = frame.code.method("select", *keys, value)
    if grouped.dropna:
        code = code.method("drop_nulls", emit.names_arg(keys))
    if dropna:
        code = code.method("drop_nulls", value)
    floats = [n for n in (*keys, value) if frame.dtype(n) == "float"]
    if floats:
        # 0.0 and -0.0 are one key: pandas shows the one it met first
        code = code.method("with_columns", *(emit.col(n).method("first").method("over", n)
                                             for n in floats))
    # pandas: groupby(keys + [value], sort=False).size(), in order of first appearance
    counts = code.method("group_by", [*keys, value], maintain_order=True).method(
        "agg", emit.pl("len").method("cast", emit.atom("pl.Int64")).method("alias", "count"))
    if sort:
        # sort_values(kind="stable"): ties keep the order of first appearance
        counts = counts.method("sort", "count", **({} if ascending else {"descending": True}),
                               maintain_order=True)
    if grouped.sort:
        # sort_index(level=keys, sort_remaining=False): stable, a missing key last
        counts = counts.method("sort", emit.names_arg(keys), maintain_order=True,
                               **({} if grouped.dropna else {"nulls_last": True}))
    if normalize:
        # each count divided by its key's total, value by value as pandas divides
        counts = counts.method("select", *(emit.col(n) for n in (*keys, value)), emit.call(
            DIVIDE_FUNCTION, emit.col("count"), emit.col("count").method("sum").method(
                "over", emit.names_arg(keys))).method("alias", "proportion"))
    dtypes = tuple((n, frame.dtype(n)) for n in (*keys, value) if frame.dtype(n) is not None)
    kind = "float" if normalize else "int"
    if not grouped.as_index:
        return Frame(counts, columns=(*keys, value, result_name), labels_intact=True,
                     dtypes=(*dtypes, (result_name, kind)))
    result = Frame(counts, columns=(*keys, value, result_name), index=(*keys, value),
                   labels_intact=False, dtypes=dtypes)
    return Column(emit.col(result_name), frame=result, name=result_name, dtype=kind,
                  refs=frozenset({result_name}))


@rule("frame.value_counts")
def frame_value_counts(call: PandasCall, ctx: RuleContext) -> Value:
    """df.value_counts(subset) -> the rows' distinct combinations counted, most frequent first.

    Handles: pandas 3.1 groups without sorting (sort=False: the combinations in order of first
    appearance) and sorts the counts stably, so ties keep that order; a row with a missing
    value is not counted (dropna=True), a missing value is a key of its own with dropna=False;
    normalize=True gives "proportion"; ascending=True; sort=False; 0.0 and -0.0 counted as one
    value shown as the one met first.
    Caveats: a Categorical column (pandas counts every category, unused ones as 0) and a
    column named "count" ("proportion") are TODOs.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "subset", "normalize", "sort", "ascending", "dropna", positional=1)
    subset = call.const("subset", 0, None, kinds=(str, list, tuple))
    if subset is None:
        if frame.columns is None:
            raise Unsupported("the frame's columns are not known (convert with --data)")
        names = list(frame.columns)
    else:
        names = [subset] if isinstance(subset, str) else list(subset)
    if not names or not all(isinstance(n, str) for n in names):
        raise Unsupported("subset is not a list of column names")
    if frame.columns is not None and any(n not in frame.columns for n in names):
        raise Unsupported("a name in subset is not a column (pandas raises KeyError)")
    normalize = call.const("normalize", None, False, kinds=(bool,))
    result_name = "proportion" if normalize else "count"
    if result_name in names:
        raise Unsupported(f"a column named {result_name!r}: pandas keeps it in the index beside "
                          "the counts of that name, which no Polars frame can hold")
    if any(frame.dtype(n) in ("category", None) for n in names):
        raise Unsupported("a column of a type porter does not know, or a Categorical (pandas "
                          "counts every category, unused ones as 0)")
    code = frame.code.method("select", *names)
    if call.const("dropna", None, True, kinds=(bool,)):
        code = code.method("drop_nulls")
    floats = [n for n in names if frame.dtype(n) == "float"]
    if floats:
        # 0.0 and -0.0 are one key: pandas shows the one it met first
        code = code.method("with_columns", *(emit.col(n).method("first").method("over", n)
                                             for n in floats))
    counts = code.method("group_by", names, maintain_order=True).method(
        "agg", emit.pl("len").method("cast", emit.atom("pl.Int64")).method("alias", "count"))
    if call.const("sort", None, True, kinds=(bool,)):
        descending = not call.const("ascending", None, False, kinds=(bool,))
        counts = counts.method("sort", "count", **({"descending": True} if descending else {}),
                               maintain_order=True)
    if normalize:
        # divided value by value, as pandas divides (see series.arith)
        counts = counts.method("select", *(emit.col(n) for n in names), emit.call(
            DIVIDE_FUNCTION, emit.col("count"), emit.col("count").method("sum")).method(
            "alias", "proportion"))
    result = Frame(counts, columns=(*names, result_name), index=tuple(names), labels_intact=False,
                   dtypes=tuple((n, frame.dtype(n)) for n in names if frame.dtype(n) is not None))
    return Column(emit.col(result_name), frame=result, name=result_name,
                  dtype="float" if normalize else "int", refs=frozenset({result_name}))


# the distinct texts of a column as pandas' unique() gives them, pandas imported only for nan
TEXT_VALUES_FUNCTION = "pandas_text_values"
TEXT_VALUES_DEFINITION = '''\
def pandas_text_values(values):
    """Texts as pandas gives them: its own string array, nan for a missing one, where one is
    missing (Polars gives None); otherwise the same texts as a numpy array, so that pandas is
    not imported for them."""
    return values.to_pandas().unique() if values.null_count() else values.to_numpy()
'''


# print(s.unique()) of text without pandas: the text of pandas' string array written out
TEXT_ARRAY_FUNCTION = "pandas_text_array"
TEXT_ARRAY_DEFINITION = '''\
def pandas_text_array(values):
    """print(s.unique()) of text as pandas prints its string array, without importing pandas:
    each text quoted, nan for a missing one, lines wrapped at 80 characters (values padded to
    one width where they fill more than a line), the first and last ten of more than a
    hundred."""
    items = ["nan" if v is None else
             "'" + v.replace("\\t", r"\\t").replace("\\r", r"\\r").replace("\\n", r"\\n") + "'"
             for v in values.to_list()]
    if len(items) < 2:
        body = "[" + ", ".join(items) + "]"
    else:
        cut = len(items) > 100
        head, tail = (items[:10], items[-10:]) if cut else ([], items)
        if cut or len(", ".join(head)) >= 80 or len(", ".join(tail)) >= 80:
            wide = max(len(item) for item in head + tail)
            head, tail = [x.rjust(wide) for x in head], [x.rjust(wide) for x in tail]
        body, line = "", "\\n "

        def add(word, limit=80):
            nonlocal body, line
            if len(line.rstrip()) + len(word.rstrip()) >= limit:
                body, line = body + line.rstrip(), "\\n "
            line += word

        for item in head:
            add(item + ", ")
        if cut:
            body, line = body + line.rstrip() + "\\n ...", "\\n "
        for item in tail[:-1]:
            add(item + ", ")
        add(tail[-1], 78)
        body = "[" + (body + line + "]")[2:]
    return f"<ArrowStringArray>\\n{body}\\nLength: {len(items)}, dtype: str"
'''


@rule("series.unique")
def unique(call: PandasCall, ctx: RuleContext) -> Value:
    """s.unique() -> the distinct values in order of first appearance, as an array.

    Handles: numbers are a numpy array, as pandas gives them (to_numpy()): a missing value is
    nan (NaN and a missing value are one value, as pandas counts them), an integer column with
    one is float, and tolist() / iterating give numbers.
    Text is pandas' own array of the distinct values (nan for a missing one; a loop over it
    compares as a missing text in Polars expressions), reached only where a text is missing
    unless printed (pandas_text_values: numpy's array of the same texts otherwise); categories (pd.cut, astype("category"))
    pandas' Categorical of them (tolist() gives nan for a missing one). Dates,
    times and durations are pandas' own array (date objects, Timestamps, Timedeltas, NaT).
    Caveats: values of unknown type are a numpy array of Polars' values, where a missing value
    is None, not nan (0.95; None still compares in Polars expressions, nan would not against
    text); distinct texts held in a name and printed later are laid out as numpy's array where
    none is missing (0.98); a printed Categorical lists its categories, in another order for astype("category")
    (0.9 when printed).
    """
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call)
    from porter.rules.selection import nullable_values_lower
    nullable_values_lower(column, ctx)  # pandas' nullable text, True/False, floats: <NA>
    values = column.code
    if column.dtype == "float":
        values = values.method("fill_nan", None)  # pandas has one missing value, NaN
    series = column.frame.code.method("select", values.method("unique", maintain_order=True)) \
        .method("collect").method("to_series")
    if column.dtype in ("int", "float"):
        # pandas' unique of numbers is a numpy array; Polars' to_numpy makes a missing value
        # nan (an integer column with one becomes float, as it is in pandas)
        if column.dtype == "int" and ctx.nullable_ints_possible:
            from porter.rules.materialize import NULLABLE_INT_VALUES
            ctx.lower(NULLABLE_INT_VALUES, 0.9)
        return Scalar(series.method("to_numpy"), pytype="array")
    if column.dtype == "bool":
        # pandas' True/False with a missing value is an object array holding nan (Polars'
        # to_numpy gives None); without one a bool array, as to_pandas gives it
        ctx.handover = True
        return Scalar(series.method("to_pandas").method("fillna", emit.atom('float("nan")'))
                      .method("to_numpy"), pytype="array")
    if column.dtype == "str" and not column.element and ctx.printed:
        # printed: the text of pandas' string array of the distinct texts (nan for a missing
        # one), written without importing pandas
        return Scalar(emit.call(TEXT_ARRAY_FUNCTION, series), pytype="str")
    if column.dtype == "str" and not column.element and ctx.shown:
        # displayed: pandas' own array of the distinct texts (its string array, shown as such),
        # nan for a missing one
        ctx.handover = True
        return Scalar(series.method("to_pandas").method("unique"), pytype="array", items="text")
    if column.dtype == "str" and not column.element:
        # listed, sorted or looped over: pandas' array where a text is missing (nan for it),
        # else the same texts as a numpy array, without importing pandas for them
        ctx.lower("the distinct texts held in a name and printed later are pandas' string "
                  "array only where one is missing (a numpy array's layout otherwise)", 0.98)
        return Scalar(emit.call(TEXT_VALUES_FUNCTION, series), pytype="array", items="text")
    if column.dtype in ("str", None):
        ctx.lower("a missing value in the distinct values is None here, nan in pandas", 0.95)
        return Scalar(series.method("to_numpy"), pytype="array")
    if column.dtype in ("date", "datetime", "duration"):
        # pandas' own array of the distinct values (pandas finds the same ones again): dates
        # are datetime.date objects, times Timestamps, durations Timedeltas, NaT for a missing
        # one, and tolist() is there
        ctx.handover = True
        values = series.method("to_pandas")
        if column.dtype == "date":
            values = values.attr("dt").attr("date")
        return Scalar(values.method("unique"), pytype="array")
    if column.dtype in ("category", "enum"):
        # pandas' unique of a category column is a Categorical: tolist() and iterating give the
        # labels and nan for a missing one (a Polars Series has no tolist(), and gives None)
        ctx.handover = True
        if ctx.shown:
            ctx.lower("the printed Categorical lists its categories: for astype(\"category\") "
                      "pandas sorts them, and a merge indicator's are not ordered in pandas", 0.9)
        return Scalar(series.method("to_pandas").method("unique"), pytype="array", items="text")
    ctx.lower(f"the distinct values of a {column.dtype} column are a Polars Series: iterating "
              "gives Python values (None for a missing one), and pandas' array methods such as "
              "tolist() are not there", 0.9)
    return Scalar(series, pytype="series")


QUARTILES, QUARTILE_VALUES = ("25%", "50%", "75%"), (0.25, 0.5, 0.75)


def _statistic_labels(labels: str | tuple[str, ...]) -> Code:
    """The column "index" of describe's rows: one statistic's name, or several (a row each)."""
    if isinstance(labels, str):
        return emit.pl("lit", labels).method("alias", "index")
    return emit.pl("lit", emit.pl("Series", list(labels))).method("alias", "index")


@rule("frame.describe")
def describe(call: PandasCall, ctx: RuleContext) -> Value:
    """df.describe() -> count, mean, std, min, 25%, 50%, 75%, max of the numeric columns.

    Handles: percentiles interpolated linearly like pandas (Polars' default is "nearest"), as
    numpy computes them to the last bit and the sign of a zero (pandas_quantile);
    booleans and text left out like pandas; the statistics as a column named "index" (pandas
    keeps them in an unnamed index, which reset_index() names "index").
    A frame with a datetime column is handed to pandas, which describes it (timestamps and a
    float count in one object column, std last: no Polars column holds that).
    Caveats: to_csv with the index writes the header "" (quoted) where pandas writes nothing.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call)
    # pandas describes the columns, never the index (a groupby's keys, row labels)
    numeric = without_index(emit.atom("pl.selectors.numeric()"), frame)
    as_float = emit.atom("pl.Float64")
    stats: list[tuple[str | tuple[str, ...], Code]] = [
        ("count", numeric.method("count").method("cast", as_float)),
        # numpy's pairwise sums, as pandas adds (the last digit of Polars' mean and std
        # can differ)
        ("mean", pandas_reduce(numeric.method("cast", as_float), "mean")),
        ("std", pandas_reduce(numeric.method("cast", as_float), "std")),
        ("min", numeric.method("min").method("cast", as_float)),
        # numpy's percentiles, as pandas computes them: the three quartiles in one pass over
        # each column, a row each (pandas_percentiles)
        (QUARTILES, emit.call(PERCENTILES_FUNCTION, numeric, list(QUARTILE_VALUES))),
        ("max", numeric.method("max").method("cast", as_float)),
    ]
    # pandas keeps the statistic names in an unnamed index, which reset_index() names "index"
    parts = [frame.code.method("select", _statistic_labels(name), expr) for name, expr in stats]
    code = emit.pl("concat", parts)
    if frame.columns is not None and len(frame.dtypes) == len(frame.columns) and not any(
            t in ("int", "float") for c, t in frame.dtypes if c not in frame.index):
        raise Unsupported("describe of a frame without numeric columns describes text in pandas")
    if any(t == "datetime" for _, t in frame.dtypes):  # (dates are objects: left out)
        # pandas describes a datetime column with timestamps (mean, min, quartiles, max) beside
        # a float count, in one object column, and puts std last: no Polars column holds
        # timestamps and numbers together, so pandas describes the collected frame itself, as
        # df.info() is handed over (a hand-over, not a TODO). The row labels are not shown
        ctx.handover = True
        return Opaque(handover.to_pandas(frame).method("describe"))
    if ctx.datetimes_possible and not (frame.columns is not None
                                       and len(frame.dtypes) == len(frame.columns)):
        ctx.lower("a datetime column porter does not know of would be described by pandas too",
                  0.85)
    numeric_cols = tuple(c for c in frame.columns or () if frame.dtype(c) in ("int", "float")
                         and c not in frame.index) or None
    columns = ("index", *numeric_cols) if numeric_cols else None
    # every statistic is a float (count too, as pandas gives it)
    dtypes = (("index", "str"), *((c, "float") for c in numeric_cols or ()))
    return Frame(code, columns=columns, index=("index",), labels_intact=False, index_unnamed=True,
                 dtypes=dtypes)



@rule("series.describe")
def series_describe(call: PandasCall, ctx: RuleContext) -> Value:
    """s.describe() of numbers -> count, mean, std, min, 25%, 50%, 75%, max as df.describe()
    computes them for one column: a Series labelled by the statistics, kept as a frame of the
    labels ("index", unnamed in pandas) and the values (named after the column).

    Handles: missing values skipped; every statistic a float (count too); percentiles
    interpolated as numpy (pandas_quantile); mean and std added as pandas (pandas_reduce).
    Caveats: text, True/False, dates (pandas describes them otherwise), a column of unknown
    type, and percentiles= / include= / exclude= are TODOs.
    """
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call)
    if column.dtype not in ("int", "float"):
        raise Unsupported("describe of a column not known to hold numbers (pandas describes "
                          "text, True/False and dates with other statistics)")
    name = column.name
    if not isinstance(name, str) or name == "index":
        raise Unsupported("describe of a Series without a text name")
    values = column.code
    as_float = emit.atom("pl.Float64")
    stats: list[tuple[str | tuple[str, ...], Code]] = [
        ("count", values.method("count").method("cast", as_float)),
        # numpy's pairwise sums, as pandas adds (the last digit of Polars' mean and std can
        # differ)
        ("mean", pandas_reduce(values.method("cast", as_float), "mean")),
        ("std", pandas_reduce(values.method("cast", as_float), "std")),
        ("min", values.method("min").method("cast", as_float)),
        # numpy's percentiles, as pandas computes them: the three quartiles in one pass, a
        # row each (pandas_percentiles)
        (QUARTILES, emit.call(PERCENTILES_FUNCTION, values, list(QUARTILE_VALUES))),
        ("max", values.method("max").method("cast", as_float)),
    ]
    # pandas labels the statistics in an unnamed index, which reset_index() names "index"
    parts = [column.frame.code.method("select", _statistic_labels(label), expr.method("alias", name))
             for label, expr in stats]
    code = emit.pl("concat", parts)
    result = Frame(code, columns=("index", name), index=("index",), index_unnamed=True,
                   labels_intact=False, dtypes=(("index", "str"), (name, "float")))
    return Column(emit.col(name), frame=result, name=name, dtype="float",
                  refs=frozenset({name}))


@rule("groupby.describe")
def group_describe(call: PandasCall, ctx: RuleContext) -> Value:
    """g["c"].describe() of numbers -> count, mean, std, min, 25%, 50%, 75%, max per group in
    one LazyGroupBy.agg, a frame labelled by the keys.

    Handles: pandas describes each group's Series as Series.describe does, so each statistic
    is computed as series.describe computes it: count as a float, mean and std added as numpy
    adds (pandas_reduce; two passes, not the Welford's method of groupby.std), percentiles
    interpolated as numpy (pandas_quantile); missing values (NaN too) skipped, a group without
    values counted 0 with the others missing; every statistic a float; keys sorted, sort=,
    dropna=, as_index= as the other aggregations.
    Caveats: a frame's groupby (pandas' columns are a MultiIndex of column and statistic),
    text, True/False and dates (other statistics in pandas), a column of unknown type, and
    percentiles= / include= / exclude= are TODOs. A frame without rows keeps its key columns
    here, where pandas gives an unnamed empty index (0.95).
    """
    grouped = grouped_of(call)
    ctx.reject_unknown(call)
    if not grouped.single or not grouped.selection or len(grouped.selection) != 1:
        raise Unsupported("describe of a frame's groups: pandas labels the columns by a "
                          "MultiIndex of the column and the statistic")
    name = grouped.selection[0]
    dtype = grouped.frame.dtype(name)
    if dtype not in ("int", "float"):
        raise Unsupported("describe of a column not known to hold numbers (pandas describes "
                          "text, True/False and dates with other statistics)")
    ctx.lower("a frame without rows: pandas describes it with an unnamed empty index (no key "
              "column, as_index=False too), where porter keeps the key columns", 0.9)
    values = emit.col(name)
    if dtype == "float":
        values = values.method("fill_nan", None)  # NaN is a missing value to pandas
    as_float = emit.atom("pl.Float64")
    stats: list[tuple[str, Code]] = [
        ("count", values.method("count").method("cast", as_float)),
        # each group is a Series described by Series.describe: numpy's pairwise sums and the
        # two-pass std of nanops (pandas_reduce), not groupby.std's running sums
        ("mean", pandas_reduce(values.method("cast", as_float), "mean")),
        ("std", pandas_reduce(values.method("cast", as_float), "std")),
        ("min", values.method("min").method("cast", as_float)),
        # numpy's interpolation to the last bit, and the sign of a zero (pandas_quantile)
        ("25%", emit.call(QUANTILE_FUNCTION, values, 0.25)),
        ("50%", emit.call(QUANTILE_FUNCTION, values, 0.5)),
        ("75%", emit.call(QUANTILE_FUNCTION, values, 0.75)),
        ("max", values.method("max").method("cast", as_float)),
    ]
    names = [label for label, _ in stats]
    exprs = [expr.method("alias", label) for label, expr in stats]
    return aggregate(grouped, exprs, names, ctx, dtypes=["float"] * len(names))


def _several_quantiles(column: Column, qs: list[object]) -> Column:
    """s.quantile([0.1, 0.5, 0.9]): a Series of the quantiles labelled by the q's (floats),
    named as the column; numpy's linear interpolation as pandas computes it, every quantile in
    one pass (pandas_percentiles), missing for a column without values (NaN in pandas)."""
    if not qs or not all(isinstance(v, (int, float)) and not isinstance(v, bool) and 0 <= v <= 1
                         for v in qs):
        raise Unsupported("quantiles other than numbers between 0 and 1 (pandas raises)")
    if column.dtype not in ("int", "float") or column.element:
        raise Unsupported("several quantiles of a column not known to hold numbers")
    name = column.name
    if not isinstance(name, str) or name == "index":
        raise Unsupported("several quantiles of a Series without a text name")
    values = [float(v) for v in qs]
    labels = emit.pl("lit", emit.call("pl.Series", values, dtype=emit.atom("pl.Float64")))
    code = column.frame.code.method(
        "select", labels.method("alias", "index"),
        emit.call(PERCENTILES_FUNCTION, column.code, values).method("alias", name))
    result = Frame(code, columns=("index", name), index=("index",), index_unnamed=True,
                   labels_intact=False, dtypes=(("index", "float"), (name, "float")))
    return Column(emit.col(name), frame=result, name=name, dtype="float",
                  refs=frozenset({name}))


@rule("series.quantile")
def series_quantile(call: PandasCall, ctx: RuleContext) -> Value:
    """Series.quantile(q) -> select(pandas_quantile(expr, q)).collect().item().

    Handles: pandas interpolates linearly (Polars' default is "nearest"), as numpy computes
    it to the last bit and the sign of a zero (pandas_quantile); "nearest" as numpy's, a .5
    position rounded half to even; "lower", "higher" and "nearest" of an integer column are
    integers where no value is missing, as pandas' (others are Polars' quantile).
    Caveats: a list of quantiles (a Series in pandas) is a TODO.
    """
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call, "q", "interpolation", positional=1)
    q = call.const("q", 0, 0.5)
    method = call.const("interpolation", None, "linear")
    if isinstance(q, (list, tuple)) and method == "linear":
        return _several_quantiles(column, list(q))
    if not isinstance(q, (int, float)) or isinstance(q, bool):
        raise Unsupported("several quantiles at once, other than linear interpolation")
    if method not in ("linear", "lower", "higher", "nearest", "midpoint"):
        raise Unsupported(f"interpolation={method!r}")
    if method == "linear" and column.dtype in ("int", "float", None):
        # numpy's interpolation to the last bit (pandas_quantile): Polars' quantile can be a
        # digit off, and returns -0.0 where numpy's a + (b - a) * t gives 0.0
        expr = emit.call(QUANTILE_FUNCTION, column.code, q)
    elif method == "nearest" and column.dtype in ("int", "float", None):
        # numpy's: the value at (count - 1) * q rounded half to even, where Polars' "nearest"
        # rounds a .5 position up (the median of 10, 11 is 10 in pandas, 11 in Polars)
        count = column.code.method("count").method("cast", emit.atom("pl.Float64"))
        at = emit.binop(emit.binop(count, "-", 1), "*", q).method(
            "round", 0, mode="half_to_even").method("cast", emit.atom("pl.Int64"))
        expr = column.code.method("drop_nulls").method("sort").method("slice", at, 1) \
            .method("first")
    else:
        expr = column.code.method("quantile", q, method)
    if method in ("lower", "higher", "nearest") and column.dtype == "int":
        # one of the column's values: np.int64 in pandas, np.float64 where the column holds a
        # missing value (pandas' float64 column); Polars' lower/higher of integers is Float64
        if method != "nearest":
            expr = expr.method("cast", emit.atom("pl.Int64"))
        return _float_int_reduction(column, column.code, expr)
    return scalar_of(column, expr, collected=_nan_when_empty(column, "quantile", expr, ctx))


@rule("series.any", "series.all")
def series_any_all(call: PandasCall, ctx: RuleContext) -> Value:
    """Series.any() / all() -> select(expr.any() / expr.all()).collect().item().

    Handles: missing values are skipped (pandas' skipna=True); a comparison that met a missing
    value counts as False; numbers are true when not zero.
    """
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call, "skipna")
    if call.const("skipna", None, True) is not True:
        raise Unsupported("skipna=False counts missing values as true")
    if column.dtype == "bool":
        code = ctx.bool_expr(column, column.frame)
    elif column.dtype in ("int", "float"):
        code = column.code.method("cast", emit.atom("pl.Boolean"))
    else:
        raise Unsupported("any/all of a column whose type porter does not know (text is true "
                          "when not empty in pandas)")
    return scalar_of(column, code.method(call.name), pytype="bool")


def _check_columns_key(frame: Frame, columns: str) -> None:
    """The key whose values name the new columns of a pivot: its values' text must be what
    pandas' labels are written as."""
    if frame.dtype(columns) in ("datetime", "date", "bool"):
        raise Unsupported(f"a {frame.dtype(columns)} columns key: pandas labels the new columns "
                          "with its values (Timestamps, True/False), Polars with their text")


def pivot_sorted(code: Code, on: str, keys: list[str], values: str | list[str], fill: Any,
                 float_when_missing: bool, dates_as_text: str | None = None) -> Code:
    """The groups (one row per combination) collected and pivoted as pandas lays the table
    out: the new columns in the order of their values (the pivot meets them sorted), the rows
    in the order of the keys; `fill` for a combination no row has, or else, for integer cells
    (`float_when_missing`), every cell float when one is missing (pandas_unstacked).
    `dates_as_text`: the key's dates written with this strftime format once sorted, the
    names the script gives the columns next (pandas_dates_as_text: two dates written alike
    stop the script, where pandas keeps two columns of one name)."""
    index: str | list[str] = keys[0] if len(keys) == 1 else keys
    code = code.method("sort", on).method("collect")
    if dates_as_text is not None:
        from porter.rules.datetimes import polars_strftime
        code = code.method("pipe", emit.atom(DATES_AS_TEXT_FUNCTION), on,
                           polars_strftime(dates_as_text))
    code = code.method("pivot", on=on, index=index, values=values).method("sort", index)
    if fill is not None:
        return code.method("fill_null", fill)
    if float_when_missing:
        return code.method("pipe", emit.atom(UNSTACKED_FUNCTION), index)
    return code


@rule("pd.pivot_table")
def pd_pivot_table(call: PandasCall, ctx: RuleContext) -> Value:
    """pd.pivot_table(df, values, index, columns, ...) -> as df.pivot_table(values, index,
    columns, ...): the frame as the first argument (or data=), the rest moved one place."""
    frame = call.arg("data", 0)
    if not isinstance(frame, Frame):
        raise Unsupported("pivoting something other than a frame porter tracks")
    kwargs = {k: v for k, v in call.kwargs.items() if k != "data"}
    args = call.args[1:] if "data" not in call.kwargs else call.args
    return pivot_table(PandasCall(frame, "pivot_table", tuple(args), kwargs, call.node), ctx)


@rule("frame.pivot_table")
def pivot_table(call: PandasCall, ctx: RuleContext) -> Value:
    """df.pivot_table(index, columns, values, aggfunc, fill_value) -> group_by the keys, then
    the collected groups pivoted (the new columns are the data's own values).

    Handles: rows with a missing key are dropped and groups whose mean / median / min / max is
    missing too, as pandas drops them; the new columns come in the order of their values
    (sorted before the pivot: Polars names them as text) and the rows sorted by the index
    keys; fill_value fills the missing cells; without it, sum, count, min and max of numbers
    turn every cell float when one is missing, as pandas does (pandas_unstacked decides on the
    pivoted table); the index keys stay label columns; margins=True of one text index key,
    of whole numbers or a count (pandaspivot_margins: the total column and row last, computed
    as pandas computes them).
    Caveats: one values column and one columns key; sum, min and max of a column not known to
    be numbers without fill_value, margins of several index keys, of a key not known to be
    text or of floats, dropna=False, sort=False, observed=False on a key
    that may be a category (pandas keeps its unused categories) and lists or dicts of
    functions with columns= are TODOs; without columns=, a list of functions gives
    (function, column) pairs of MultiIndex columns (_pivot_functions). The new columns are
    named by their values as text; handed to pandas, those of an integer key get pandas'
    integer labels back.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "values", "index", "columns", "aggfunc", "fill_value", "dropna",
                       "margins", "margins_name", "sort", "observed", positional=5)
    index = call.const("index", 1, None, kinds=(str, list, tuple))
    columns = call.const("columns", 2, None, kinds=(str, list, tuple))
    values = call.const("values", 0, None, kinds=(str, list, tuple))
    if isinstance(columns, (list, tuple)) and len(columns) == 1:
        columns = columns[0]
    if columns is None and not call.has("columns", 2):
        return _pivot_without_columns(call, frame, index, values, ctx)
    if isinstance(values, (list, tuple)) and len(values) > 1 and isinstance(columns, str):
        return _pivot_several_values(call, frame, index, columns, list(values), ctx)
    if isinstance(values, (list, tuple)) and len(values) == 1:
        raise Unsupported("values given as a list: pandas keeps two levels of column labels")
    if not isinstance(columns, str) or not isinstance(values, str):
        raise Unsupported("one values column and one columns key only")
    dates_as_text = None
    if frame.dtype(columns) in ("datetime", "date"):
        # the dates cannot name Polars columns; the text the next statement makes of them can
        dates_as_text = _columns_formatted_next(call, ctx)
        if call.const("margins", None, False):
            raise Unsupported("margins of a date columns key: pandas adds its name to the dates")
    if dates_as_text is None:
        _check_columns_key(frame, columns)
    elif not {"Y", "m", "d"} <= set(re.findall(r"%(.)", dates_as_text.replace("%%", ""))):
        ctx.lower("two dates the format writes alike (without the year, month and day) make "
                  "pandas keep two columns of one name; the conversion stops with an error "
                  "(pandas_dates_as_text)", 0.9)
    keys = [index] if isinstance(index, str) else list(index or [])
    if not keys or not all(isinstance(k, str) for k in keys):
        raise Unsupported("a pivot without index keys")
    margins = call.const("margins", None, False, kinds=(bool,))
    margins_name = call.const("margins_name", None, "All", kinds=(str,))
    if not call.const("dropna", None, True) or not call.const("sort", None, True):
        raise Unsupported("dropna=False or sort=False")
    how = how_name(call.arg("aggfunc", 3)) if call.has("aggfunc", 3) else "mean"
    plain = ("str", "int", "float", "bool", "date", "datetime")
    if call.const("observed", None, True) is not True and not all(
            frame.dtype(k) in plain for k in (*keys, columns)):
        if how == "count" and frame.dtype(columns) == "enum" and not margins \
                and all(frame.dtype(k) in plain for k in keys):
            return _pivot_count_every_category(frame, keys, columns, values, ctx)
        # pandas then keeps every category of a Categorical key (pd.cut's bins), used or not:
        # rows and columns of 0 (count) or missing cells, which the pivot of the groups lacks
        raise Unsupported("observed=False keeps the unused categories of a category key "
                          "(rows and columns no row has)")
    if how not in ("sum", "mean", "median", "numpy_median", "min", "max", "count"):
        raise Unsupported(f"aggfunc {how!r}")
    fill = call.const("fill_value", 4, None)
    if fill is not None and (isinstance(fill, bool) or not isinstance(fill, (int, float))):
        raise Unsupported("a fill_value that is not a number")
    value_dtype = frame.dtype(values)
    # without fill_value, pandas turns every cell float when one combination has no value:
    # decided on the pivoted table, as pandas decides it (pandas_unstacked)
    float_when_missing = fill is None and how not in ("mean", "median", "numpy_median")
    if float_when_missing and how != "count" and value_dtype not in ("int", "float", "bool"):
        raise Unsupported(f"{how} without fill_value of a column not known to be numbers: "
                          "pandas makes every cell float when one is missing")
    known = frame.columns
    absent = [c for c in (*keys, columns, values) if known is not None and c not in known]
    if absent:
        raise Unsupported(f"columns {absent} are not in the frame (pandas raises KeyError)")
    groups = [*keys, columns]
    code = pivot_groups(frame.code, groups, values,
                        agg_expr(emit.col(values), how, value_dtype, float32=float32_possible(ctx)))
    if how in ("mean", "median", "numpy_median", "min", "max"):
        code = code.method("drop_nulls", values)  # pandas drops a group whose value is missing
    # count cells are integers whatever the values' type (a float column's too)
    code = pivot_sorted(code, columns, keys, values, fill,
                        float_when_missing and (value_dtype != "float" or how == "count"),
                        dates_as_text)
    if margins:
        code = pivot_margins(code, frame, keys, columns, values, how, value_dtype,
                             margins_name, fill, float32_possible(ctx))
    if dates_as_text is None:  # (else named as the next statement names them)
        ctx.lower("the new columns are named by their values as text (pandas keeps the values)",
                  0.95)
    # pandas code given the table finds the columns by the key's values (pv[2024])
    int_labels = (*keys, *([margins_name] if margins else [])) \
        if frame.dtype(columns) == "int" else None
    # the index keys keep their type (the total row's label is text, as the keys); the
    # total column is float where every cell is (floats summed, means)
    dtypes = [(k, frame.dtype(k)) for k in keys if frame.dtype(k) is not None]
    if margins and (how in ("mean", "median", "numpy_median") or value_dtype == "float"
                    and how in ("sum", "min", "max")):
        dtypes.append((margins_name, "float"))
    code = code.method("lazy")
    # every cell but the keys holds numbers (wide.sum(axis=1) adds them): floats for a mean or
    # a float column; whole numbers filled where a combination is missing stay whole, else the
    # data decides (None)
    if how in ("mean", "median", "numpy_median") or value_dtype == "float" and how != "count":
        cells: tuple[str, str | None] | None = (code.text, "float")
    elif how == "count" or value_dtype == "int":
        cells = (code.text, "int" if type(fill) is int else None)
    else:
        cells = None
    return Frame(code, columns=None, index=tuple(keys), labels_intact=False,
                 int_labels_except=int_labels, columns_name=columns, dtypes=tuple(dtypes),
                 dates_as_text=dates_as_text, number_cells=cells)


def _columns_formatted_next(call: PandasCall, ctx: RuleContext) -> str | None:
    """The strftime format of `t.columns = t.columns.strftime("<format>")` where that is the
    statement right after each `t = <this pivot>` of the script (the same call written
    elsewhere too), or None. Checked on the script's text: only then does the pivot name its
    date columns by that text at once, which nothing reads before the statement renames them."""
    module = ctx.python_module
    if module is None or call.node is None:
        return None
    try:
        wanted = ast.unparse(ast.parse(cst.Module([]).code_for_node(call.node).strip(),
                                       mode="eval").body)
    except SyntaxError:
        return None
    found: set[str | None] = set()
    for node in ast.walk(module):
        for name in ("body", "orelse", "finalbody"):
            statements = getattr(node, name, None)
            if not isinstance(statements, list):
                continue
            for at, stmt in enumerate(statements):
                if not (isinstance(stmt, ast.Assign) and len(stmt.targets) == 1
                        and isinstance(stmt.targets[0], ast.Name)
                        and ast.unparse(stmt.value) == wanted):
                    continue
                after = statements[at + 1] if at + 1 < len(statements) else None
                found.add(_strftime_of_columns(after, stmt.targets[0].id))
    if len(found) != 1:
        return None
    return found.pop()


def _strftime_of_columns(stmt: ast.stmt | None, name: str) -> str | None:
    """The format of `name.columns = name.columns.strftime("<format>")`, or None."""
    columns = f"{name}.columns"
    if not (isinstance(stmt, ast.Assign) and len(stmt.targets) == 1
            and ast.unparse(stmt.targets[0]) == columns and isinstance(stmt.value, ast.Call)):
        return None
    call = stmt.value
    if not (isinstance(call.func, ast.Attribute) and call.func.attr == "strftime"
            and ast.unparse(call.func.value) == columns and len(call.args) == 1
            and not call.keywords and isinstance(call.args[0], ast.Constant)
            and isinstance(call.args[0].value, str)):
        return None
    return call.args[0].value


def _pivot_count_every_category(frame: Frame, keys: list[str], columns: str, values: str,
                                ctx: RuleContext) -> Value:
    """pivot_table(index=keys, columns=c, values=v, aggfunc="count", observed=False) where c
    holds the categories of pd.cut / pd.qcut labels (an Enum): pandas counts v for every
    combination of the index keys met in a row (none of them missing; the row's c or v may
    be) with every category of c, used or not: a column per category in the categories'
    order, 0 where no value is counted, int64 (fill_value never applies: no cell is missing).
    The combinations crossed with the categories, the counts joined on them, then pivoted."""
    absent = [c for c in (*keys, columns, values)
              if frame.columns is not None and c not in frame.columns]
    if absent:
        raise Unsupported(f"columns {absent} are not in the frame (pandas raises KeyError)")
    if len(set(keys)) != len(keys) or columns in keys or values in (*keys, columns):
        raise Unsupported("a key named twice, or the values column among the keys")
    ctx.lower("a frame without rows gives pandas an empty table without columns; here the "
              "index keys' columns", 0.95)
    rows = frame.code.method("drop_nulls", keys).method("select", *keys).method(
        "unique", maintain_order=True)
    # the Enum's categories, in their order, from the frame's schema (no data read)
    kind = frame.code.method("collect_schema").index(columns)
    every = emit.pl("LazyFrame", {columns: kind.attr("categories")}).method("cast", {columns: kind})
    counts = frame.code.method("drop_nulls", [*keys, columns]).method(
        "group_by", [*keys, columns]).method(
        "agg", emit.col(values).method("count").method("cast", emit.atom("pl.Int64")))
    grid = rows.method("join", every, how="cross", maintain_order="left_right").method(
        "join", counts, on=[*keys, columns], how="left", nulls_equal=True,
        maintain_order="left").method("with_columns", emit.col(values).method("fill_null", 0))
    # every category of every combination is there: the pivot meets them in the categories'
    # order, and names the new columns by their text
    code = pivot_sorted(grid, columns, keys, values, None, False)
    ctx.lower("the new columns are named by their values as text (pandas keeps the values)", 0.95)
    return Frame(code.method("lazy"), columns=None, index=tuple(keys), labels_intact=False,
                 columns_name=columns)


def pivot_margins(table: Code, frame: Frame, keys: list[str], columns: str, values: str,
                   how: str, dtype: str | None, name: str, fill: Any, float32: bool) -> Code:
    """margins=True: the pivoted table given to pandas_pivot_margins, which adds the total
    column and row `name` as pandas computes them (each over the rows where neither key nor
    the value is missing, a row of totals last and a column last, a missing total making an
    integer column float). Sums and means of floats are added as pandas adds them: each row's
    and column's as its groupby does (pandas_group_sums), the grand total as its Series.sum
    or mean (pandas_reduce)."""
    if not all(frame.dtype(k) == "str" for k in keys):
        raise Unsupported("margins of an index key not known to be text (the total row's "
                          "label goes into it, and \"\" into the other keys)")
    kwargs: dict[str, Any] = {}
    if how == "count" and dtype is not None or how != "count" and dtype == "int" \
            or how in ("min", "max") and dtype == "float":
        # whole numbers are added exactly in any order; a count, min and max are exact
        total = agg_expr(emit.col(values), how, dtype)
        if "pandas_" in total.text:
            raise Unsupported(f"margins of {how}")
    elif how in ("sum", "mean") and dtype == "float" and not float32:
        # pandas adds each row's and column's floats as its groupby does, the grand total as
        # its Series.sum / mean does (numpy's pairwise sum): each order ends in other digits
        total = pandas_reduce(emit.col(values), how)
        kwargs["group_sums"] = emit.atom(GROUP_SUMS_FUNCTION)
        if how == "mean":
            kwargs["mean"] = True
    else:
        raise Unsupported(f"margins of {how} of a column not known to be whole numbers or "
                          "floats (floats: sum, mean, min, max and count)")
    if name != "All":
        kwargs["name"] = name
    if fill is not None:
        kwargs["fill_value"] = fill
    return table.method("pipe", emit.atom(MARGINS_FUNCTION), frame.code, emit.names_arg(keys),
                        columns, values, total, **kwargs)


_PIVOT_ROW_FUNCTIONS = ("sum", "mean", "median", "min", "max", "count")


def _pivot_several_values(call: PandasCall, frame: Frame, index: Any, on: str,
                          values: list[str], ctx: RuleContext) -> Value:
    """df.pivot_table(index=keys, columns=k, values=[a, b], aggfunc="sum" or {a: .., b: ..},
    fill_value=0): the groups of keys and k aggregated, pivoted on k with every value column
    (Polars names the new columns "a_x": the value column, then the key's value). pandas
    labels them by two levels, (a, x), sorted (sort=True): the value columns in sorted order,
    each with the key's values sorted; that is the order here too. The frame carries the value
    columns (value_levels): df["a"] is the table of a's columns, handed to pandas it gets its
    two levels back; any other use keeps it on pandas.

    Only sums and counts with a fill_value: neither is ever missing for a group, so pandas
    drops no row or column (dropna=True) and fill_value fills the combinations no row has."""
    keys = [index] if isinstance(index, str) else list(index or [])
    if not keys or not all(isinstance(k, str) for k in keys) or len(set(keys)) != len(keys):
        raise Unsupported("a pivot without index keys")
    if not all(isinstance(v, str) for v in values) or len(set(values)) != len(values) \
            or set(values) & {*keys, on}:
        raise Unsupported("values other than distinct column names apart from the keys")
    if any(other.startswith(v + "_") for v in values for other in (*values, *keys)):
        # the value's columns are found by the prefix "<value>_" of their names
        raise Unsupported("a value column whose name with '_' begins another column's name")
    if call.const("margins", None, False) or not call.const("dropna", None, True) \
            or not call.const("sort", None, True):
        raise Unsupported("margins, dropna=False or sort=False")
    if call.const("observed", None, True) is not True and not all(
            frame.dtype(k) in ("str", "int", "float", "bool", "date", "datetime")
            for k in (*keys, on)):
        raise Unsupported("observed=False keeps the unused categories of a category key")
    if frame.dtype(on) != "str":
        raise Unsupported("a columns key that is not text: pandas labels the columns with its "
                          "values, Polars with their text")
    aggfunc = call.const("aggfunc", 3, "mean", kinds=(str, dict))
    hows = aggfunc if isinstance(aggfunc, dict) else {v: aggfunc for v in values}
    if set(hows) != set(values) or not all(h in ("sum", "count") for h in hows.values()):
        raise Unsupported("several value columns: sums and counts only (a dict naming each "
                          "value column, or one of them for all)")
    fill = call.const("fill_value", 4, None)
    if fill is None or isinstance(fill, bool) or not isinstance(fill, (int, float)):
        raise Unsupported("several value columns without a number as fill_value: pandas makes "
                          "the cells of a combination no row has missing (integers float)")
    if frame.columns is None or not set((*keys, on, *values)) <= set(frame.columns):
        raise Unsupported("columns porter does not know in the frame (run with --data)")
    for v in values:
        if hows[v] == "sum" and frame.dtype(v) not in ("int", "float"):
            raise Unsupported(f"the sum of {v!r}, not known to be numbers")
    ordered = sorted(values)
    groups = [*keys, on]
    float32 = float32_possible(ctx)
    exprs = [agg_expr(emit.col(v), hows[v], frame.dtype(v), float32=float32) for v in ordered]
    code = agg_with_sums(frame.code.method("drop_nulls", groups).method("group_by", groups),
                         *exprs)
    code = pivot_sorted(code, on, keys, ordered, fill, False)
    return Frame(code.method("lazy"), columns=None, index=tuple(keys), labels_intact=False,
                 columns_name=on, value_levels=tuple(ordered),
                 dtypes=tuple((k, frame.dtype(k)) for k in keys if frame.dtype(k) is not None))


def _pivot_without_columns(call: PandasCall, frame: Frame, index: Any, values: Any,
                           ctx: RuleContext) -> Value:
    """df.pivot_table(index=keys, values=cols, aggfunc=how or {col: how}) without columns=:
    pandas' groupby(keys)[cols].agg(...) with the columns in sorted order (sort=True), the
    rows whose every value is missing dropped (dropna=True) and fill_value in the missing
    cells, as pandas' pivot_table does after the groupby. Ported as that groupby, through
    porter's own rules for it."""
    keys = [index] if isinstance(index, str) else list(index or [])
    names = [values] if isinstance(values, str) else list(values or [])
    if not keys or not all(isinstance(k, str) for k in keys):
        raise Unsupported("a pivot without index keys")
    if not names or not all(isinstance(v, str) for v in names) or set(names) & set(keys) \
            or len(set(names)) != len(names):
        raise Unsupported("values other than column names apart from the keys (pandas "
                          "then pivots every other column)")
    if not call.const("dropna", None, True) or not call.const("sort", None, True) \
            or call.const("margins", None, False):
        raise Unsupported("margins, dropna=False or sort=False")
    if call.const("observed", None, True) is not True and not all(
            frame.dtype(k) in ("str", "int", "float", "bool", "date", "datetime") for k in keys):
        raise Unsupported("observed=False keeps the unused categories of a category key")
    aggfunc = call.const("aggfunc", 3, "mean", kinds=(str, dict, list))
    fill = call.const("fill_value", 4, None)
    if fill is not None and (isinstance(fill, bool) or not isinstance(fill, (int, float))):
        raise Unsupported("a fill_value that is not a number")
    absent = [c for c in (*keys, *names) if frame.columns is not None and c not in frame.columns]
    if absent:
        raise Unsupported(f"columns {absent} are not in the frame (pandas raises KeyError)")
    ordered = sorted(names)  # pandas sorts the columns of the table (sort=True)
    by = keys[0] if isinstance(index, str) else keys
    if isinstance(aggfunc, list):
        return _pivot_functions(frame, keys, by, ordered, aggfunc, fill, ctx)
    hows = aggfunc if isinstance(aggfunc, dict) else {v: aggfunc for v in names}
    if set(hows) != set(names) or not all(isinstance(h, str) and h in _PIVOT_ROW_FUNCTIONS
                                          for h in hows.values()):
        raise Unsupported(f"aggfunc other than one of {', '.join(_PIVOT_ROW_FUNCTIONS)} per "
                          "value column (a dict naming each of them)")
    frame_name = "_porter_pivoted"
    expr = cst.parse_expression(f"{frame_name}.groupby({by!r})[{ordered!r}].agg("
                                f"{ {v: hows[v] for v in ordered}!r})")
    table = ctx.evaluate(expr, {frame_name: frame})
    if not isinstance(table, Frame) or tuple(table.index) != tuple(keys):
        raise Unsupported("the groupby porter would port it as is kept on pandas")
    code = table.code
    # a sum or count is never missing (0 for a group without values); the others may be
    missing = [v for v in ordered if hows[v] in ("mean", "median", "min", "max")]
    if missing:
        # a group whose every value is missing: pandas drops its row (dropna=True)
        code = code.method("filter", emit.pl("any_horizontal", emit.col(ordered).method(
            "is_not_null")))
    if fill is not None and missing:
        code = code.method("with_columns", emit.col(missing).method("fill_null", fill))
    columns = table.columns
    if missing:
        # and a column whose every value is missing (every row, or no row left): pandas drops
        # it (dropna=True), which the data decides
        code = code.method("collect").method("pipe", emit.atom(
            f"lambda t: t.drop([c for c in {missing!r} if t[c].is_null().all()])")).method("lazy")
        columns = None
    else:
        ctx.lower("a table without rows keeps its columns, which pandas drops (dropna=True)", 0.95)
    return replace(table, code=code, rows=fresh_token(), columns=columns)


def _pivot_functions(frame: Frame, keys: list[str], by: Any, ordered: list[str],
                     hows: list[Any], fill: Any, ctx: RuleContext) -> Value:
    """df.pivot_table(index=keys, values=cols, aggfunc=[how, ...]) without columns=: pandas
    pivots once per function and puts the tables side by side (concat with the functions as
    keys), so each column is labelled by a (function, value column) pair, the functions in
    the order given and the value columns sorted within each. Ported as one groupby with a
    named aggregation per pair, the flat names ("sum_kg") carrying their pairs
    (Frame.column_pairs). A function's table drops the groups whose values are all missing
    and then a column whose every value is missing; side by side, a group is kept when one
    table has it (a sum or count has every group)."""
    if not hows or not all(isinstance(h, str) and h in _PIVOT_ROW_FUNCTIONS for h in hows) \
            or len(set(hows)) != len(hows):
        raise Unsupported(f"a list of functions other than distinct ones of "
                          f"{', '.join(_PIVOT_ROW_FUNCTIONS)} (pandas names a function's "
                          "table by its __name__)")
    if fill is not None:
        # each function's table is filled before they are put side by side, where the
        # groups one of them dropped come back missing
        raise Unsupported("fill_value with a list of functions")
    pairs = [(f"{how}_{v}", (how, v)) for how in hows for v in ordered]
    if any(flat in keys for flat, _ in pairs):
        raise Unsupported("a function_column name that is an index key's")
    named = ", ".join(f"{flat}=({v!r}, {how!r})" for flat, (how, v) in pairs)
    frame_name = "_porter_pivoted"
    table = ctx.evaluate(cst.parse_expression(f"{frame_name}.groupby({by!r}).agg({named})"),
                         {frame_name: frame})
    if not isinstance(table, Frame) or tuple(table.index) != tuple(keys):
        raise Unsupported("the groupby porter would port it as is kept on pandas")
    code = table.code
    missing = [flat for flat, (how, _) in pairs if how in ("mean", "median", "min", "max")]
    rows = table.rows  # the groupby's rows, one per key, sorted: alignable on the key
    if missing and len(missing) == len(pairs):
        # a group whose every value is missing: every function's table drops its row
        code = code.method("filter", emit.pl("any_horizontal", emit.col(missing).method(
            "is_not_null")))
        rows = fresh_token()
    columns = table.columns
    if missing:
        # a column whose every value is missing (a sum or count only where there is no row
        # at all): pandas drops it (dropna=True), which the data decides
        flats = [flat for flat, _ in pairs]
        code = code.method("collect").method("pipe", emit.atom(
            f"lambda t: t.drop([c for c in {emit.lit(flats).text} if t[c].is_null().all()])"
        )).method("lazy")
        columns = None
    else:
        ctx.lower("a table without rows keeps its columns, which pandas drops (dropna=True)", 0.95)
    return replace(table, code=code, rows=rows, columns=columns, column_pairs=tuple(pairs))


@rule("groupby.ngroups")
def ngroups(call: PandasCall, ctx: RuleContext) -> Value:
    """g.ngroups -> the number of distinct keys (rows with a missing key left out, as with
    dropna=True), collected as a Python int."""
    grouped = grouped_of(call)
    if grouped.pandas is not None or grouped.prepared:
        raise Unsupported("a groupby porter did not make from a frame's columns")
    keys = list(grouped.keys)
    frame = grouped.frame.code
    if grouped.dropna:
        frame = frame.method("drop_nulls", emit.names_arg(keys))
    distinct = emit.col(keys[0]) if len(keys) == 1 else emit.pl("struct", keys)
    code = frame.method("select", distinct.method("n_unique")).method("collect").method("item")
    return Scalar(code, pytype="int")


@dataclass(frozen=True)
class ExtremeLabels(Column):
    """g["c"].idxmin() / idxmax(): each group's row label of its smallest / largest value (the
    first among ties), as a Series indexed by the keys. `source` is the grouped frame, whose
    labels are 0..n-1: df.loc[these] of that frame is a filter of it (rules/selection.py)."""

    source: Frame = field(kw_only=True)
    keys: tuple[str, ...] = field(kw_only=True)
    column: str = field(kw_only=True)
    how: str = field(kw_only=True)  # "min" or "max"


@rule("groupby.ngroup")
def ngroup(call: PandasCall, ctx: RuleContext) -> Value:
    """df.groupby(keys).ngroup() -> each row's group number: pl.col(k).rank("dense") - 1 in the
    keys' sorted order (sort=False: in order of first appearance, replace_strict).

    Handles: numbers from 0 in the order pandas iterates the groups (keys sorted, or in order
    of first appearance with sort=False), ascending=False numbers from the last; a row whose
    key is missing gets no number (dropna=True: NaN in pandas, whose column is then float,
    marked as the other group windows mark it), or with dropna=False one key's missing value
    is the last group (sort=True). Several keys: their combinations ranked as one struct.
    Caveats: dropna=False with several keys, or with sort=False, and Categorical keys are TODOs.
    """
    from porter.rules.windows import _key_missing_float, _keys_present  # windows imports us

    grouped = grouped_of(call)
    ctx.reject_unknown(call, "ascending", positional=1)
    ascending = call.const("ascending", 0, True, kinds=(bool,))
    if grouped.prepared or grouped.pandas is not None:
        raise Unsupported("ngroup of a groupby by a computed key")
    keys = list(grouped.keys)
    if any(grouped.frame.dtype(k) in ("category", "enum") for k in keys):
        raise Unsupported("a Categorical key: pandas numbers the groups in the categories' order")
    if not grouped.dropna and (len(keys) > 1 or not grouped.sort):
        raise Unsupported("dropna=False with several keys or sort=False: where pandas puts "
                          "the missing key's group")
    if group_order(grouped) is not None:
        raise Unsupported("a True/False key with missing values kept (dropna=False): pandas' "
                          "order of its groups")
    key = emit.col(keys[0]) if len(keys) == 1 else emit.pl("struct", *keys)
    if grouped.sort:
        # the keys' sorted order (0.0 and -0.0 one key, as in pandas); a missing key no rank
        present = key if len(keys) == 1 or not grouped.dropna else \
            emit.when(_keys_present(grouped), key)
        number = emit.binop(present.method("rank", "dense").method(
            "cast", emit.atom("pl.Int64")), "-", 1)
        if not grouped.dropna:  # the missing key's group comes last
            number = number.method("fill_null", emit.col(keys[0]).method("drop_nulls").method(
                "n_unique").method("cast", emit.atom("pl.Int64")))
    else:
        # the distinct keys in order of first appearance, numbered
        source = key if len(keys) == 1 else emit.when(_keys_present(grouped), key)
        first = source.method("drop_nulls").method("unique", maintain_order=True)
        number = source.method("replace_strict", first, emit.pl(
            "int_range", first.method("len"), dtype=emit.atom("pl.Int64")), default=None)
    if not ascending:
        number = emit.binop(number.method("max"), "-", number)
    base = column_of(grouped.frame, keys[0])
    result = derived_column(base, number, dtype="int", name=None)
    return _key_missing_float(grouped, result, NOT_NULLABLE)


@rule("groupby.idxmin", "groupby.idxmax")
def group_extreme_labels(call: PandasCall, ctx: RuleContext) -> Value:
    """g["c"].idxmin() / idxmax() -> each group's row number of its first smallest / largest
    value (pl.col("index").get(pl.col(c).arg_min()) on the rows numbered), keys sorted.

    Handles: missing values skipped; the first of equal values; df.loc[these, cols] of the
    same frame as a filter of each group's row, in the keys' order.
    Handles too: a frame carrying the labels a filter or sort left (its column "index").
    Caveats: another index, several columns, sort=False, keys kept (dropna=False) and
    skipna=False are TODOs; a group whose values are all missing makes pandas raise, here its
    label is missing (0.95).
    """
    grouped = grouped_of(call)
    ctx.reject_unknown(call, "skipna", "numeric_only")
    if call.const("skipna", None, True) is not True:
        raise Unsupported("skipna=False")
    frame = grouped.frame
    if not (grouped.single and grouped.selection):
        raise Unsupported("the labels of several columns (select one column first)")
    carried = row_labels_carried(frame)
    if not (frame.labels_intact and not frame.index or carried) or grouped.pandas is not None:
        raise Unsupported("the frame's row labels are no longer 0..n-1: keep the row number as "
                          "a column (with_row_index) where the frame is made")
    if not (grouped.sort and grouped.dropna and grouped.as_index):
        raise Unsupported("groupby options other than the defaults")
    column = grouped.selection[0]
    if not carried and frame.columns is not None and "index" in frame.columns:
        raise Unsupported("the frame has a column named \"index\"")
    ctx.lower("a group whose values are all missing makes pandas raise; its label is missing "
              "here", 0.95)
    how = call.name.removeprefix("idx")
    # the labels: the row numbers, or those a filter or sort left, carried as "index"
    numbered = frame.code if carried else frame.code.method("with_row_index").method(
        "with_columns", emit.col("index").method("cast", emit.atom("pl.Int64")))
    keyed = replace(grouped, code=numbered, frame=replace(frame, code=numbered), selection=None,
                    single=False, sites=())
    label = emit.col("index").method("get", emit.col(column).method(f"arg_{how}"))
    result = aggregate(keyed, [label.method("alias", column)], [column], ctx,
                       series_name=column, is_series=True, dtypes=["int"])
    assert isinstance(result, Column)
    return ExtremeLabels(result.code, frame=result.frame, name=result.name, dtype="int",
                         refs=result.refs, versions=result.versions, source=frame,
                         keys=grouped.keys, column=column, how=how)


@dataclass(frozen=True)
class RowPosition(Scalar):
    """s.idxmax() / idxmin(): a row label, and the position of its row (`position`, an
    expression) in the frame with the rows `rows`: df.loc[this, "c"] of that frame is
    pl.col("c").get(position) (rules/selection.py)."""

    rows: int = field(kw_only=True)
    position: Code = field(kw_only=True)
    # the versions of the columns `position` reads: a column overwritten since (same rows)
    # gives another position
    read: tuple[tuple[str, int], ...] = field(default=(), kw_only=True)
    # `best = s.idxmax()` then `df.loc[best, "c"]`: the position is computed in the frame again
    kept_when_bound: ClassVar[bool] = True

    def current_in(self, frame: Frame) -> bool:
        """Whether `position` still points at the row the label was read from in `frame`."""
        return self.rows == frame.rows and all(frame.version(n) == v for n, v in self.read)


@rule("series.idxmax", "series.idxmin")
def series_extreme_label(call: PandasCall, ctx: RuleContext) -> Value:
    """s.idxmax() / idxmin() -> the row label of the first largest / smallest value: its row
    number ((c == c.max()).arg_true().first()) on a frame whose labels are 0..n-1, or its key
    where a groupby on one key left the key as the label (`per["kg"].idxmax()`).

    Handles: missing values skipped; the first of equal values; the label as a Python value,
    as pandas gives it.
    Caveats: a frame whose labels are no longer 0..n-1, labels of several keys (pandas gives
    a tuple) and skipna=False are TODOs; a column whose values are all missing (or none) makes
    pandas raise, here the label is None (0.95).
    """
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call, "skipna", "axis")
    if call.const("skipna", None, True) is not True:
        raise Unsupported("skipna=False")
    if column.dtype not in ("int", "float", "str", "date", "datetime", "duration"):
        raise Unsupported("the extreme of a column whose type porter does not know")
    frame = column.frame
    how = call.name.removeprefix("series.idx")[-3:]
    values = column.code.method("fill_nan", None) if column.dtype == "float" else column.code
    # the first row holding the extreme value: Polars' arg_max of a whole column in a lazy
    # select is not always the first of equal values (pandas' is)
    position = emit.binop(values, "==", values.method(how)).method("arg_true").method("first")
    if not frame.index and frame.labels_intact:
        label = position
    elif len(frame.index) == 1 and column.name not in frame.index:
        label = emit.col(frame.index[0]).method("get", position)
    else:
        raise Unsupported("the frame's row labels are no longer 0..n-1 (or are several keys): "
                          "keep the row number as a column (with_row_index) where it is made")
    ctx.lower("a column whose values are all missing makes pandas raise; the label is None "
              "here", 0.95)
    pytype = "int" if not frame.index else {"int": "int", "str": "str"}.get(frame.dtype(frame.index[0]) or "")
    return RowPosition(frame.code.method("select", label).method("collect").method("item"),
                       pytype=pytype, rows=frame.rows, position=position,
                       read=tuple(column.versions))


@rule("frame.pivot")
def pivot(call: PandasCall, ctx: RuleContext) -> Value:
    """df.pivot(index=, columns=, values=) -> the collected frame pivoted without aggregating
    (a repeated combination raises in both), laid out as pandas lays it out.

    Handles: the rows sorted by the index key (a missing key first, as pandas keeps it), the
    new columns in the order of their values; integer cells turn float when a combination is
    missing, as pandas' are (pandas_unstacked); the index key stays a label column.
    A missing value in the columns key labels a column NaN in pandas: named "nan" (its text)
    here, where Polars would name it "null".
    Caveats: values or columns given as lists, and index left out (the row labels) are TODOs or lower
    the confidence. The new columns are named by their values as text.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "columns", "index", "values")
    index = call.const("index", None, None)
    columns = call.const("columns", None, None)
    values = call.const("values", None, None)
    if not all(isinstance(v, str) for v in (index, columns, values)):
        raise Unsupported("index, columns and values each naming one column (the row labels, "
                          "lists and several values make other layouts)")
    if frame.index:
        raise Unsupported("the frame keeps an index (after a groupby): call reset_index() first")
    known = frame.columns
    absent = [c for c in (index, columns, values) if known is not None and c not in known]
    if absent:
        raise Unsupported(f"columns {absent} are not in the frame (pandas raises KeyError)")
    _check_columns_key(frame, columns)
    value_dtype = frame.dtype(values)
    if value_dtype is None:
        ctx.lower("the values' type is not known: pandas turns whole numbers float when a "
                  "combination is missing", 0.9)
    ctx.lower("the new columns are named by their values as text (pandas keeps the values: "
              "a missing value in the columns key labels a column NaN, named \"nan\" here, "
              "which to_csv writes as an empty header in pandas)", 0.95)
    code = frame.code.method("select", index, columns, values)
    code = pivot_sorted(code, columns, [index], values, None, value_dtype in ("int", "bool"))
    # Polars names the column of a missing key "null"; pandas' label is NaN, whose text is "nan"
    code = code.method("rename", {"null": "nan"}, strict=False)
    int_labels = (index,) if frame.dtype(columns) == "int" else None
    code = code.method("lazy")
    # the index key keeps its type (a date key's labels are dates: df.index.strftime); the
    # cells are the values, floats staying floats (whole numbers are float where a
    # combination is missing, which the data decides)
    dtypes = ((index, frame.dtype(index)),) if frame.dtype(index) is not None else ()
    cells = (code.text, "float") if value_dtype == "float" else (
        (code.text, None) if value_dtype == "int" else None)
    return Frame(code, columns=None, index=(index,), labels_intact=False, dtypes=dtypes,
                 int_labels_except=int_labels, columns_name=columns, number_cells=cells,
                 columns_kind=frame.dtype(columns))


# -- groupby().apply(f) where f makes one row of aggregates ---------------------------------------
#
# The function is not run per group: its body (a lambda, or the script's own function made one
# expression by body_expression) is read once, with the parameter standing for any group, and
# each value it computes becomes an expression of group_by().agg(). What the body may contain:
# columns of the group (g["c"], g.c, g.loc[mask, "c"], g[mask]["c"], row arithmetic of them),
# masks comparing a column with a constant or a value of the group (==, !=, <, ..., & | ~, isin,
# isna, notna), the reductions below, len(g),
# float() / int() / abs(), + - * / between them, comparisons and `a if cond else b`, numbers and
# np.nan, and at the top pd.Series({"name": value, ...}) or one value.
#
# The types of what pandas builds matter (12 prints as 12.0 in a float column), so each value
# carries the Python types it can have for a group: {"int"}, {"float"}, or both (an int that is
# NaN for some groups: the max of no rows). pandas makes each group's Series float64 when one of
# its values is a float, and the frame of those Series float64 when one group's is, so every
# column is Float64 when one value is always a float, Int64 when all are always ints, and the
# form is a TODO when that depends on the data.

APPLY_REDUCTIONS = ("sum", "mean", "median", "min", "max", "std", "var", "count", "nunique")
_INT, _FLOAT = frozenset({"int"}), frozenset({"float"})
PYTHON_KINDS = {int: "int", float: "float"}
_COMPARE = {cst.Equal: "==", cst.NotEqual: "!=", cst.LessThan: "<", cst.LessThanEqual: "<=",
            cst.GreaterThan: ">", cst.GreaterThanEqual: ">="}
_ARITH = {cst.Add: "+", cst.Subtract: "-", cst.Multiply: "*", cst.Divide: "/"}


@dataclass(frozen=True)
class _Rows:
    """The group's rows (g), or those a mask keeps (g[mask], g.loc[mask])."""

    mask: Code | None = None


@dataclass(frozen=True)
class _Dates:
    """g["when"].dt: the date parts of a datetime column of the group."""

    column: "_GroupColumn"


@dataclass(frozen=True)
class _Loc:
    rows: _Rows


@dataclass(frozen=True)
class _GroupColumn:
    """A column of the group's rows (or arithmetic of them, row by row): not a value (pandas
    would align it), only reducible; `mask` keeps some of the rows."""

    code: Code
    dtype: str | None
    mask: Code | None


@dataclass(frozen=True)
class _Mask:
    """A boolean per row of the group; `null_is_false`: null where pandas has False."""

    code: Code
    null_is_false: bool

    def filled(self) -> Code:
        return self.code.method("fill_null", False) if self.null_is_false else self.code


@dataclass(frozen=True)
class _Agg:
    """One value per group: an expression inside agg(), and the Python types it can have
    (None: not known)."""

    code: Code
    kinds: frozenset[str] | None
    is_test: bool = False  # a comparison of values (null where Python has False)


class _BodyReader:
    def __init__(self, param: str, grouped: Grouped, ctx: RuleContext) -> None:
        self.param = param
        self.grouped = grouped
        self.ctx = ctx

    def fail(self, what: str) -> Unsupported:
        return Unsupported(f"the function {what}: porter ports a function whose values are "
                           "reductions of the group's columns (sum, mean, nunique, len(g), ...), "
                           "arithmetic and `a if cond else b` between them")

    # -- any node -------------------------------------------------------------------------
    def read(self, node: cst.BaseExpression) -> Any:
        if isinstance(node, cst.Name) and node.value == self.param:
            return _Rows()
        if not self.uses_param(node):
            return self.constant(node)
        method = getattr(self, f"_{type(node).__name__}", None)
        if method is None:
            raise self.fail(f"uses `{_source(node)}`")
        return method(node)

    def uses_param(self, node: cst.CSTNode) -> bool:
        found = False

        class Find(cst.CSTVisitor):
            def visit_Name(self_, name: cst.Name) -> None:
                nonlocal found
                found = found or name.value == self.param

            def visit_Attribute(self_, attr: cst.Attribute) -> bool:
                attr.value.visit(self_)
                return False  # `x.g` is an attribute, not the parameter

        node.visit(Find())
        return found

    def constant(self, node: cst.BaseExpression) -> _Agg:
        value = self.ctx.evaluate(node, {})
        if isinstance(value, Opaque) and value.is_const and not isinstance(value.const, bool) \
                and isinstance(value.const, (int, float)):
            kinds = _INT if isinstance(value.const, int) else _FLOAT
            return _Agg(emit.lit(value.const), kinds)
        raise self.fail(f"uses `{_source(node)}`, which is not a number porter reads")

    def agg(self, node: cst.BaseExpression) -> _Agg:
        value = self.read(node)
        if isinstance(value, _Agg):
            return value
        if isinstance(value, _Mask):
            raise self.fail("uses a boolean per row as a value (pandas would align it)")
        raise self.fail(f"uses `{_source(node)}` as a value: reduce it to one value per group")

    def test(self, node: cst.BaseExpression) -> Code:
        value = self.read(node)
        if isinstance(value, _Agg) and value.is_test:
            return value.code
        raise self.fail(f"tests `{_source(node)}`, which is not a comparison of values")

    # -- the group, its columns and masks ---------------------------------------------------
    def column(self, rows: _Rows, name: Any) -> _GroupColumn:
        if not isinstance(name, str):
            raise self.fail("selects columns porter cannot name")
        grouped = self.grouped
        if name in grouped.keys:
            raise Unsupported(_key_read_reason(name))
        frame = grouped.frame
        if frame.columns is not None and (name not in frame.columns or name in frame.index):
            raise Unsupported(f"the function reads {name!r}, which is not a column of the "
                              "frame (KeyError in pandas)")
        return _GroupColumn(emit.col(name), frame.dtype(name), rows.mask)

    def _Attribute(self, node: cst.Attribute) -> Any:
        value = self.read(node.value)
        name = node.attr.value
        if isinstance(value, _Rows) and name == "loc":
            return _Loc(value)
        if isinstance(value, _GroupColumn) and value.dtype == "datetime" and name == "dt":
            return _Dates(value)
        if isinstance(value, _Dates) and name == "date":
            # g["when"].dt.date: each time's day (a missing time a missing day), an object
            # Series of dates in pandas, which only count / nunique reduce here (the reduction
            # refuses the others: pandas keeps such values in an object Series)
            column = value.column
            return _GroupColumn(column.code.attr("dt").method("date"), "date", column.mask)
        if isinstance(value, _Rows) and name not in pandas_names.FRAME:
            return self.column(value, name)
        raise self.fail(f"uses `.{name}`")

    def _Subscript(self, node: cst.Subscript) -> Any:
        value = self.read(node.value)
        parts = [s.slice for s in node.slice]
        if not all(isinstance(p, cst.Index) for p in parts):
            raise self.fail("slices rows by position")
        keys = [p.value for p in parts]  # type: ignore[union-attr]
        if isinstance(value, _Loc) and len(keys) == 2:
            rows = self.rows(value.rows, keys[0])
            return self.column(rows, self.name_of(keys[1]))
        if isinstance(value, (_Rows, _Loc)) and len(keys) == 1:
            rows = value if isinstance(value, _Rows) else value.rows
            key = self.read(keys[0]) if self.uses_param(keys[0]) else None
            if isinstance(key, _Mask):
                return _Rows(self.combined(rows.mask, key))
            if isinstance(value, _Rows) and key is None:
                return self.column(rows, self.name_of(keys[0]))
        if isinstance(value, _GroupColumn) and len(keys) == 1:
            key = self.read(keys[0])
            if isinstance(key, _Mask):  # g["c"][g["z"] == "x"]
                return _GroupColumn(value.code, value.dtype, self.combined(value.mask, key))
        raise self.fail(f"uses `{_source(node)}`")

    def name_of(self, node: cst.BaseExpression) -> Any:
        value = self.ctx.evaluate(node, {})
        return value.const if isinstance(value, Opaque) and value.is_const else None

    def rows(self, rows: _Rows, node: cst.BaseExpression) -> _Rows:
        key = self.read(node) if self.uses_param(node) else None
        if not isinstance(key, _Mask):
            raise self.fail(f"selects rows with `{_source(node)}`, which is not a mask of the group")
        return _Rows(self.combined(rows.mask, key))

    def combined(self, mask: Code | None, key: _Mask) -> Code:
        # a filter keeps the rows where the mask is true: null (pandas' False) drops the row
        return key.code if mask is None else emit.binop(mask, "&", key.code)

    def unmasked(self, value: Any, node: cst.CSTNode) -> _GroupColumn:
        if not isinstance(value, _GroupColumn) or value.mask is not None:
            raise self.fail(f"compares `{_source(node)}`, which is not a column of the whole group")
        return value

    # -- comparisons, operators -------------------------------------------------------------
    def _Comparison(self, node: cst.Comparison) -> Any:
        if len(node.comparisons) != 1 or type(node.comparisons[0].operator) not in _COMPARE:
            raise self.fail(f"compares with `{_source(node)}`")
        op = _COMPARE[type(node.comparisons[0].operator)]
        right_node = node.comparisons[0].comparator
        left = self.read(node.left) if self.uses_param(node.left) else None
        right = self.read(right_node) if self.uses_param(right_node) else None
        if isinstance(left, _GroupColumn) or isinstance(right, _GroupColumn):
            column_first = isinstance(left, _GroupColumn)
            column = self.unmasked(left if column_first else right, node)
            other_node = right_node if column_first else node.left
            other_value = right if column_first else left
            code = column.code
            if isinstance(other_value, _Agg) and not other_value.is_test:
                other = other_value.code  # one value per group, met by every row
            elif isinstance(other_value, _GroupColumn):
                other = self.unmasked(other_value, node).code  # row by row
            else:
                const = None if self.uses_param(other_node) else self.name_of(other_node)
                if not isinstance(const, (str, int, float)) or (
                        isinstance(const, float) and const != const):
                    raise self.fail("compares a column with something other than a constant "
                                    "(text or a number) or a value of the group")
                other = emit.lit(const)
            if op == "!=":  # pandas: a missing value differs from everything
                return _Mask(emit.binop(code, "!=", other).method("fill_null", True), False)
            pair = (code, other) if column_first else (other, code)
            return _Mask(emit.binop(pair[0], op, pair[1]), True)
        a, b = self.agg(node.left), self.agg(right_node)
        if op == "!=":  # Python: NaN != x is True; Polars' null would take the other branch
            return _Agg(emit.binop(a.code, "!=", b.code).method("fill_null", True), None,
                        is_test=True)
        return _Agg(emit.binop(a.code, op, b.code), None, is_test=True)

    def _BinaryOperation(self, node: cst.BinaryOperation) -> Any:
        left, right = self.read(node.left), self.read(node.right)
        if isinstance(node.operator, (cst.BitAnd, cst.BitOr)) and isinstance(left, _Mask) \
                and isinstance(right, _Mask):
            op = "&" if isinstance(node.operator, cst.BitAnd) else "|"
            # Kleene logic: null (pandas' False) & x and null | x keep the same rows
            return _Mask(emit.binop(left.code, op, right.code),
                         left.null_is_false or right.null_is_false)
        if type(node.operator) not in _ARITH:
            raise self.fail(f"uses the operator in `{_source(node)}`")
        op = _ARITH[type(node.operator)]
        if isinstance(left, _GroupColumn) or isinstance(right, _GroupColumn):
            return self.row_arithmetic(node, left, right, op)
        a, b = self.agg(node.left), self.agg(node.right)
        if op == "/":  # 0 / 0 is NaN, which porter keeps out of frames: missing, as in pandas
            return _Agg(emit.binop(a.code, "/", b.code).method("fill_nan", None), _FLOAT)
        if a.kinds is None or b.kinds is None:
            kinds = None
        elif a.kinds == _FLOAT or b.kinds == _FLOAT:
            kinds = _FLOAT
        else:
            kinds = a.kinds | b.kinds
        return _Agg(emit.binop(a.code, op, b.code), kinds)

    def row_arithmetic(self, node: cst.BinaryOperation, left: Any, right: Any,
                       op: str) -> _GroupColumn:
        """g["a"] * g["b"], g["a"] - 1: row by row, over the same rows."""
        sides: list[_GroupColumn] = []
        columns: list[_GroupColumn] = []
        for value, child in ((left, node.left), (right, node.right)):
            if value is None or isinstance(value, _Agg) and not self.uses_param(child):
                const = self.name_of(child)
                if isinstance(const, bool) or not isinstance(const, (int, float)):
                    raise self.fail(f"uses `{_source(child)}` in row arithmetic")
                sides.append(_GroupColumn(emit.lit(const), PYTHON_KINDS[type(const)], None))
            elif isinstance(value, _GroupColumn):
                sides.append(value)
                columns.append(value)
            elif isinstance(value, _Agg) and not value.is_test:
                # one value per group, met by every row (g["n"] - g["n"].mean())
                dtype = "int" if value.kinds == _INT else "float" if value.kinds == _FLOAT \
                    else None
                sides.append(_GroupColumn(value.code, dtype, None))
            else:
                raise self.fail(f"uses `{_source(child)}` in row arithmetic")
        if len({c.mask.text if c.mask is not None else None for c in columns}) > 1:
            raise self.fail("combines columns of different rows (pandas aligns them)")
        a, b = sides
        mask = columns[0].mask
        code = emit.binop(a.code, op, b.code)
        if op == "/":
            return _GroupColumn(code.method("fill_nan", None), "float", mask)
        kinds = {a.dtype, b.dtype}
        dtype = None if None in kinds or not kinds <= {"int", "float"} else \
            "float" if "float" in kinds else "int"
        return _GroupColumn(code, dtype, mask)

    def _UnaryOperation(self, node: cst.UnaryOperation) -> Any:
        value = self.read(node.expression)
        if isinstance(node.operator, cst.BitInvert) and isinstance(value, _Mask):
            return _Mask(emit.unary("~", value.filled()), False)  # ~False is True in pandas
        if isinstance(node.operator, cst.Not) and isinstance(value, _Agg) and value.is_test:
            return _Agg(emit.unary("~", value.code.method("fill_null", False)), None, is_test=True)
        if isinstance(node.operator, cst.Minus) and isinstance(value, _Agg) and not value.is_test:
            return _Agg(emit.unary("-", value.code), value.kinds)
        raise self.fail(f"uses `{_source(node)}`")

    def _BooleanOperation(self, node: cst.BooleanOperation) -> Any:
        a, b = self.test(node.left), self.test(node.right)
        op = "&" if isinstance(node.operator, cst.And) else "|"
        return _Agg(emit.binop(a, op, b), None, is_test=True)

    def _IfExp(self, node: cst.IfExp) -> Any:
        test = self.test(node.test)
        body, orelse = self.agg(node.body), self.agg(node.orelse)
        if body.is_test or orelse.is_test:
            raise self.fail("returns True/False")
        kinds = None if body.kinds is None or orelse.kinds is None else body.kinds | orelse.kinds
        # NaN in Python's test is False, null in Polars' pl.when takes the otherwise branch
        return _Agg(emit.when(test, body.code, orelse.code), kinds)

    # -- calls ------------------------------------------------------------------------------
    def _Call(self, node: cst.Call) -> Any:
        if any(a.star for a in node.args):
            raise self.fail("unpacks arguments")
        if isinstance(node.func, cst.Name) and node.func.value in ("len", "float", "int", "abs"):
            if len(node.args) != 1 or node.args[0].keyword is not None:
                raise self.fail(f"calls {node.func.value} with other arguments")
            return self.builtin(node.func.value, node.args[0].value)
        if isinstance(node.func, cst.Attribute):
            receiver = self.read(node.func.value)
            name = node.func.attr.value
            if node.args:
                if isinstance(receiver, _GroupColumn) and name == "isin" and len(node.args) == 1:
                    values = self.name_of(node.args[0].value)
                    if isinstance(values, (list, tuple)) and all(
                            isinstance(v, (str, int, float)) and not isinstance(v, bool)
                            for v in values):
                        column = self.unmasked(receiver, node)
                        return _Mask(column.code.method("is_in", list(values)), False)
                raise self.fail(f"calls .{name}() with arguments")
            if isinstance(receiver, _GroupColumn) and name in ("isna", "isnull", "notna", "notnull"):
                column = self.unmasked(receiver, node)
                method = "is_null" if name in ("isna", "isnull") else "is_not_null"
                return _Mask(column.code.method(method), False)
            if isinstance(receiver, _GroupColumn) and name in APPLY_REDUCTIONS:
                return self.reduction(receiver, name)
            if isinstance(receiver, _Mask) and name in ("sum", "mean"):
                code = receiver.filled()  # pandas counts a comparison with NaN as False
                if name == "sum":
                    return _Agg(code.method("sum").method("cast", emit.atom("pl.Int64")), _INT)
                return _Agg(code.method("mean"), _FLOAT)
            raise self.fail(f"calls .{name}()")
        raise self.fail(f"calls `{_source(node.func)}`")

    def builtin(self, name: str, arg: cst.BaseExpression) -> _Agg:
        if name == "len":
            value = self.read(arg)
            mask = value.mask if isinstance(value, (_Rows, _GroupColumn)) else None
            if not isinstance(value, (_Rows, _GroupColumn)):
                raise self.fail(f"takes len of `{_source(arg)}`")
            code = emit.pl("len") if mask is None else mask.method("sum")
            return _Agg(code.method("cast", emit.atom("pl.Int64")), _INT)
        value = self.agg(arg)
        if name == "abs":
            return _Agg(value.code.method("abs"), value.kinds)
        target = "pl.Float64" if name == "float" else "pl.Int64"
        if name == "int":  # int() of NaN raises in Python: a script that runs has none
            self.ctx.lower("int() of a missing value raises in pandas; Polars keeps it missing",
                           0.95)
        return _Agg(value.code.method("cast", emit.atom(target)), _FLOAT if name == "float" else _INT)

    def reduction(self, column: _GroupColumn, how: str) -> _Agg:
        code = column.code
        if column.mask is not None:
            code = code.method("filter", column.mask)
        dtype = column.dtype
        if how in ("count", "nunique"):
            return _Agg(agg_expr(code, how), _INT)
        if dtype in ("str", "datetime", "date", "category", "enum") and how != "mean":
            raise Unsupported(f"the function takes the {how} of the {dtype} column "
                              f"`{column.code.text}`: pandas keeps such values in an object "
                              "Series")
        if how in ("sum", "mean", "std", "var") and dtype == "float" \
                or how in ("mean", "std", "var") and dtype == "int":
            # pandas calls Series.sum (mean, std, var) on each group's values: numpy's
            # pairwise sum, where Polars adds them in another order (4285.299999999999 for
            # 4285.3); pandas_reduce adds them with numpy, one group at a time, and the
            # mean of no values is missing
            total = pandas_reduce(code, how)
            return _Agg(total if how == "sum" else total.method("fill_nan", None), _FLOAT)
        if how in ("sum", "mean", "std", "var") and dtype is None:
            self.ctx.lower(f"the {how} of a group's values of a type porter does not know: "
                           "pandas adds floats with numpy's pairwise sum, Polars in another "
                           "order, so the last digit can differ", 0.95)
        if how in ("mean", "median", "std", "var"):
            return _Agg(code.method(how), _FLOAT)
        if dtype == "bool":
            if how != "sum":
                raise Unsupported(f"the {how} of a boolean column gives True/False: pandas "
                                  "keeps them in an object Series")
            return _Agg(code.method("sum").method("cast", emit.atom("pl.Int64")), _INT)
        if dtype == "float":
            return _Agg(code.method(how), _FLOAT)
        if dtype == "int":
            if how == "sum":  # the sum of no rows is 0
                return _Agg(code.method("sum"), _INT)
            # the min / max of no rows is NaN: only a filtered selection can have none
            return _Agg(code.method(how), _INT if column.mask is None else _INT | _FLOAT)
        return _Agg(code.method(how), None)


def _source(node: cst.CSTNode) -> str:
    return cst.Module(body=[]).code_for_node(node)


@rule("groupby.apply")
def groupby_apply(call: PandasCall, ctx: RuleContext) -> Value:
    """df.groupby(keys).apply(f), f making one row of aggregates -> group_by(keys).agg(...).

    Handles: f a lambda or the script's own function (one parameter; local names, `if` with
    `return`s) returning pd.Series({"name": value, ...}) or one value; values such as
    g["c"].sum(), g["c"].nunique(), g.loc[g["z"] == "x", "c"].sum(), len(g), arithmetic and
    `a / b if b > 0 else np.nan`; pandas' types: every column Float64 when one value is always
    a float (12 becomes 12.0), Int64 when all are ints; one value gives an unnamed Series;
    missing keys dropped, keys sorted, sort=False, dropna=False, as_index=False.
    g["col"].apply(f) with f reducing the group's Series to one value is g["col"].agg(f)
    (pandas calls f on each group's Series either way).
    Caveats: loops, printing, returning a frame, changing the group, text, boolean or date
    values, an int that is NaN for some groups only (the max of no rows: pandas' types then
    depend on the data), a Series key named like a group key and g["col"].apply(f) with f
    giving a Series are TODOs; an empty frame gives pandas' input columns (f is never called) (0.95).
    """
    grouped = grouped_of(call)
    ctx.reject_unknown(call, "func", "include_groups", positional=1)
    if call.const("include_groups", None, False) is not False:
        raise ctx.todo("include_groups=True (pandas 3 raises ValueError)")
    if grouped.selection is not None:
        # g["kg"].apply(f) calls f on each group's Series, as g["kg"].agg(f) does: a function
        # that reduces it to one value (s.ewm(span=3).mean().iloc[-1], s.max() - s.min()) is
        # that aggregation
        function = call.args[0] if call.args else call.kwargs.get("func")
        if grouped.single and len(call.args) + len(call.kwargs) == 1 and _is_function(function):
            forward = PandasCall(call.receiver, "agg", (function,), {}, call.node)
            try:
                return agg(forward, ctx)
            except Unsupported as exc:
                raise ctx.todo(f"apply on a selected column: {exc.reason}") from None
        raise ctx.todo("apply on selected columns: write the function as agg() of the column")
    key = _key_read(call, ctx, grouped.keys)
    if key is not None:
        raise ctx.todo(_key_read_reason(key))
    param, body = _applied_body(call, ctx)
    rows = _rows_of_groups(param, body, grouped, call, ctx)
    if rows is not None:
        return rows
    reader = _BodyReader(param, grouped, ctx)
    series = _series_dict(body, ctx)
    names: list[str] = []
    values: list[_Agg] = []
    if series is None:
        if not grouped.as_index:
            raise ctx.todo("as_index=False with one value per group: pandas names the column "
                           "None, which Polars cannot")
        values.append(reader.agg(body))
        names.append("0")
    else:
        for name, node in series:
            if name in grouped.keys:
                raise ctx.todo(f"the Series names a value {name!r} like a group key: pandas "
                               "makes a column and an index level of one name")
            names.append(name)
            values.append(reader.agg(node))
    if any(v.is_test for v in values):
        raise ctx.todo("the function returns True/False: pandas keeps it in an object Series")
    kinds = [v.kinds for v in values]
    target = "pl.Float64"
    if any(k == _FLOAT for k in kinds):
        dtype = "float"
        if any(k is None for k in kinds):
            ctx.lower("some values' column types are not known (run with --data): a text "
                      "value would fail in Polars where pandas keeps an object Series", 0.9)
    elif all(k == _INT for k in kinds):
        dtype = "int"
    elif any(k is None for k in kinds):
        raise ctx.todo("porter does not know the types of the columns the function reduces "
                       "(run with --data): pandas' result is int or float by them")
    else:
        raise ctx.todo("a value is an int for some groups and NaN for others (the min/max of "
                       "no rows, `x if c else np.nan`): pandas makes every column float only "
                       "when that happens, which depends on the data; wrap it in float(...)")
    exprs = []
    for name, value in zip(names, values):
        code = value.code
        if dtype == "float" and value.kinds != _FLOAT:
            code = _recast(code, target)  # pandas' Series is float64
        exprs.append(code.method("alias", name))
    ctx.lower("on an empty frame pandas never calls the function and returns the input's "
              "columns; Polars returns the function's", 0.95)
    return aggregate(grouped, exprs, names, ctx, series_name=None, is_series=series is None,
                     dtypes=[dtype] * len(names))


_GROUP_ROW_METHODS = {"nlargest": ("n", "columns", "keep"), "nsmallest": ("n", "columns", "keep"),
                      "head": ("n",), "tail": ("n",)}


def _rows_of_groups(param: str, body: cst.BaseExpression, grouped: Grouped, call: PandasCall,
                    ctx: RuleContext) -> Frame | None:
    """apply(lambda g: g.nlargest(n, col)) (nsmallest, head(n), tail(n)) in a script written
    for pandas 1.x (legacy.written_for_older_pandas): some rows of each group, every column
    kept, as pandas 1.x gave them; None for another function or a script of today's pandas.

    pandas before 3 passed each group with its key columns, so the rows keep every column; the
    groups' rows come one group after another in sorted key order (rows of a missing key left
    out), within a group as the method orders them (nlargest: by value, ties and then missing
    values in the frame's order, as DataFrame.nlargest keeps them; head / tail: the frame's
    order). pandas 1.x (source of 1.5, read: _python_apply_general) gave the rows in the
    frame's order instead when every group's result was its own rows in their order (no group
    longer than n, nlargest finding them in order): the function looked like a transform.
    """
    from porter.rules.legacy import written_for_older_pandas

    if _group_mask(param, body) is not None:
        return _masked_rows_of_groups(param, body, grouped, call, ctx)
    if not (isinstance(body, cst.Call) and isinstance(body.func, cst.Attribute)
            and isinstance(body.func.value, cst.Name) and body.func.value.value == param
            and body.func.attr.value in _GROUP_ROW_METHODS):
        return None
    if not written_for_older_pandas(ctx.python_module):
        # pandas 3 leaves the key columns out of the groups: a TODO as before (a script of
        # pandas 1.x, which calls APIs pandas 2 or 3 removed, meant them kept)
        return None
    method = body.func.attr.value
    names = _GROUP_ROW_METHODS[method]
    given: dict[str, Any] = {}
    for i, arg in enumerate(body.args):
        name = arg.keyword.value if arg.keyword is not None else names[i] if i < len(names) else None
        if arg.star or name not in names:
            raise ctx.todo(f"{method}() with arguments porter does not read")
        try:
            given[name] = ast.literal_eval(cst.Module([]).code_for_node(arg.value))
        except (ValueError, SyntaxError):
            raise ctx.todo(f"{method}() with arguments that are not written out") from None
    n = given.get("n", 5)
    if not isinstance(n, int) or isinstance(n, bool) or n < 1:
        raise ctx.todo(f"{method}() of a number of rows below 1 or not a whole number")
    if call.has("include_groups"):
        raise ctx.todo("include_groups=: the rows without the key columns (pandas 2.2 and 3), "
                       "which porter does not port")
    if grouped.prepared or grouped.pandas is not None or grouped.frame.index:
        raise ctx.todo("apply of rows on a groupby of a computed key or of a labelled table")
    if not grouped.sort or not grouped.dropna:
        raise ctx.todo("apply of rows with sort=False or dropna=False")
    frame = grouped.frame
    key_names = list(grouped.keys)
    row, size = "_porter_row", "_porter_size"
    if frame.columns is not None and {row, size} & set(frame.columns):
        raise ctx.todo(f"a column named {row} or {size}")
    code = frame.code.method("with_row_index", row).method(
        "with_columns", emit.pl("len").method("over", *key_names).method("alias", size))
    code = code.method("filter", _keys_present_of(key_names))
    place = emit.pl("int_range", emit.pl("len")).method("over", *key_names)
    if method in ("nlargest", "nsmallest"):
        columns = given.get("columns")
        if isinstance(columns, list) and len(columns) == 1:
            columns = columns[0]
        if not isinstance(columns, str):
            raise ctx.todo(f"{method}() of several columns or of no column named")
        if given.get("keep", "first") != "first":
            raise ctx.todo(f'{method}(keep="last" / "all"): ties kept otherwise')
        if columns in grouped.keys:
            raise ctx.todo(f"{method}() of a key column (pandas 3 leaves it out of the group)")
        dtype = frame.dtype(columns) if frame.columns is None or columns in frame.columns \
            else None
        if frame.columns is not None and columns not in frame.columns:
            raise ctx.todo(f"{method}() of {columns!r}, which is not a column (pandas raises)")
        if dtype not in (None, "int", "float", "datetime", "date"):
            raise ctx.todo(f"{method}() of a column of type {dtype} (pandas raises)")
        values = emit.col(columns)
        if dtype == "float":
            values = values.method("fill_nan", None)  # NaN sorts with the missing values
        elif dtype is None:
            ctx.lower("the column's type is not known (run with --data): a NaN computed "
                      "into it sorts as the largest number here, where pandas puts it with "
                      "the missing values", 0.95)
        options: dict[str, object] = {"descending": True} if method == "nlargest" else {}
        code = code.method("sort", values, **options, nulls_last=True, maintain_order=True)
        keep = emit.binop(place, "<", n)
    elif method == "head":
        keep = emit.binop(place, "<", n)
    else:
        keep = emit.binop(emit.pl("int_range", emit.pl("len"), 0, -1).method("over", *key_names),
                          "<=", n)
    code = code.method("filter", keep)
    # pandas 1.x: every group's result its own rows in their order -> the frame's order, else
    # the groups in key order (a stable sort keeps each group's rows as the method gave them).
    # One sort: the frame's row number where that holds (missing otherwise, which ties)
    like_indexed = emit.binop(
        emit.binop(emit.col(size), "<=", n).method("all"), "&",
        emit.binop(emit.col(row).method("diff").method("over", *key_names).method("fill_null", 1),
                   ">", 0).method("all"))
    code = code.method("sort", [emit.when(like_indexed, emit.col(row)), *key_names],
                       maintain_order=True).method("drop", row, size)
    ctx.lower("the key columns stay in the rows, as pandas 1.x and 2.x passed them to the "
              "function (pandas 3 leaves them out); the rows grouped in key order, or in the "
              "frame's order where every group's result is its own rows in order, as pandas "
              "1.x gave them (pandas 2 groups them always)", 0.8)
    return derive(frame, code, same_rows=False)


def _group_mask(param: str, body: cst.BaseExpression) -> cst.BaseExpression | None:
    """The mask of `g[mask]` (one key that reads the group: not a column's name), else None."""
    if not (isinstance(body, cst.Subscript) and isinstance(body.value, cst.Name)
            and body.value.value == param and len(body.slice) == 1
            and isinstance(body.slice[0].slice, cst.Index)):
        return None
    key = body.slice[0].slice.value
    found = False

    class Find(cst.CSTVisitor):
        def visit_Name(self, name: cst.Name) -> None:
            nonlocal found
            found = found or name.value == param

        def visit_Attribute(self, attr: cst.Attribute) -> bool:
            attr.value.visit(self)
            return False

    key.visit(Find())
    return key if found else None


def _masked_rows_of_groups(param: str, body: cst.BaseExpression, grouped: Grouped,
                           call: PandasCall, ctx: RuleContext) -> Frame | None:
    """apply(lambda g: g[g["n"] == g["n"].max()]) in a script written for pandas 1.x: the rows
    of each group its mask keeps (a comparison of the group's columns with values of the
    group: g["c"].max(), .mean(), a constant), every column kept, as pandas 1.x gave them;
    None for a script of today's pandas (the function reads the key columns, which pandas 3
    leaves out: a TODO as before).

    The mask is computed within each group (over the keys); a missing value in a comparison
    keeps no row, as pandas' False. Rows of a missing key are left out. pandas 1.x (source of
    1.5, read: _python_apply_general, _concat_objects) gave the rows in the frame's order when
    every group's result was the group itself (its index the group's: every row kept), and
    else one group after another in sorted key order, each group's rows in the frame's order.
    """
    from porter.rules.legacy import written_for_older_pandas

    if not written_for_older_pandas(ctx.python_module):
        return None
    if call.has("include_groups"):
        raise ctx.todo("include_groups=: the rows without the key columns (pandas 2.2 and 3), "
                       "which porter does not port")
    if grouped.prepared or grouped.pandas is not None or grouped.frame.index:
        raise ctx.todo("apply of rows on a groupby of a computed key or of a labelled table")
    if not grouped.sort or not grouped.dropna:
        raise ctx.todo("apply of rows with sort=False or dropna=False")
    frame = grouped.frame
    key_names = list(grouped.keys)
    if any(not isinstance(k, str) for k in key_names):
        raise ctx.todo("apply of rows on keys porter cannot name")
    mask = _BodyReader(param, grouped, ctx).read(_group_mask(param, body))  # type: ignore[arg-type]
    if not isinstance(mask, _Mask):
        raise ctx.todo("apply(lambda g: g[key]) with a key that is not a True/False mask of the "
                       "group's rows")
    row, keep = "_porter_row", "_porter_keep"
    if frame.columns is not None and {row, keep} & set(frame.columns):
        raise ctx.todo(f"a column named {row} or {keep}")
    code = frame.code.method("with_row_index", row).method("filter", _keys_present_of(key_names))
    code = code.method("with_columns", mask.filled().method("over", *key_names).method("alias", keep))
    # every row kept (each group's result the group itself): the frame's order; else the
    # groups in key order, each group's rows in the frame's order (a stable sort)
    code = code.method("sort", [emit.when(emit.col(keep).method("all"), emit.col(row)),
                                *key_names], maintain_order=True)
    code = code.method("filter", emit.col(keep)).method("drop", row, keep)
    ctx.lower("the key columns stay in the rows, as pandas 1.x and 2.x passed them to the "
              "function (pandas 3 leaves them out); the rows grouped in key order, or in the "
              "frame's order where every group keeps all its rows, as pandas 1.x gave them "
              "(pandas 2 groups them always)", 0.8)
    return derive(frame, code, same_rows=False)


def _keys_present_of(keys: list[str]) -> Code:
    """Rows whose every key is present: the rows pandas (dropna=True) puts in a group."""
    present = emit.col(keys[0]).method("is_not_null")
    for key in keys[1:]:
        present = emit.binop(present, "&", emit.col(key).method("is_not_null"))
    return present


def _recast(code: Code, target: str) -> Code:
    """`code` cast to `target`, in place of a cast it ends with (a count's Int64)."""
    if code.base is not None and code.steps and code.steps[-1].startswith(".cast("):
        code = code.without_last_step()
    return code.method("cast", emit.atom(target))


def _key_read_reason(key: str) -> str:
    return (f"the function reads the key column {key!r}: pandas before 3 passed the key columns "
            "to it, which the script relies on, and pandas 3 does not (KeyError); read the key "
            "from the group's name (g.name) or select the columns with the key "
            "(groupby(keys)[[...]].apply)")


def _key_read(call: PandasCall, ctx: RuleContext, keys: tuple[Any, ...]) -> str | None:
    """The first group key the applied function reads from its group (g["k"], g.k,
    g.loc[..., "k"], g[["k", ...]]), anywhere in a lambda or the script's own function."""
    function = call.arg("func", 0)
    node = function.node if isinstance(function, Opaque) else None
    if isinstance(node, cst.Name) and ctx.function_def is not None:
        node = ctx.function_def(node.value)
    if isinstance(node, cst.Lambda):
        params = node.params.params
    elif isinstance(node, cst.FunctionDef):
        params = node.params.params
    else:
        return None
    if not params:
        return None
    param = params[0].name.value
    names = {k for k in keys if isinstance(k, str)}
    found: list[str] = []

    def texts(index: cst.BaseExpression) -> list[str]:
        if isinstance(index, cst.SimpleString):
            return [index.evaluated_value] if isinstance(index.evaluated_value, str) else []
        if isinstance(index, (cst.List, cst.Tuple)):
            return [t for e in index.elements for t in texts(e.value)]
        return []

    class Find(cst.CSTVisitor):
        def visit_Subscript(self, sub: cst.Subscript) -> None:
            target = sub.value
            if isinstance(target, cst.Attribute) and target.attr.value in ("loc", "at"):
                target = target.value
                parts = sub.slice[1:]  # the column part of g.loc[rows, cols]
            else:
                parts = sub.slice[:1] if len(sub.slice) == 1 else []
            if isinstance(target, cst.Name) and target.value == param:
                for part in parts:
                    if isinstance(part.slice, cst.Index):
                        found.extend(t for t in texts(part.slice.value) if t in names)

        def visit_Attribute(self, attr: cst.Attribute) -> None:
            if isinstance(attr.value, cst.Name) and attr.value.value == param \
                    and attr.attr.value in names and attr.attr.value not in pandas_names.FRAME \
                    and attr.attr.value != "name":  # g.name: the group's key in pandas 3 too
                found.append(attr.attr.value)

    node.visit(Find())
    return found[0] if found else None


def _applied_body(call: PandasCall, ctx: RuleContext) -> tuple[str, cst.BaseExpression]:
    """The parameter and the body (one expression) of the function passed to apply."""
    function = call.arg("func", 0)
    node = function.node if isinstance(function, Opaque) else None
    if isinstance(node, cst.Lambda):
        params = node.params
        if len(params.params) != 1 or params.star_arg not in (None, cst.MaybeSentinel.DEFAULT) \
                or params.kwonly_params or params.star_kwarg or params.posonly_params:
            raise ctx.todo("a lambda that does not take exactly the group")
        return params.params[0].name.value, node.body
    definition = ctx.function_def(node.value) if isinstance(node, cst.Name) \
        and ctx.function_def is not None else None
    if not isinstance(definition, cst.FunctionDef):
        raise ctx.todo("a function porter cannot read: define it in the script, or write it "
                       "as agg() expressions")
    if definition.asynchronous is not None:
        raise ctx.todo("an async function")
    try:
        body = body_expression(definition)
    except Unsupported as exc:
        raise ctx.todo(f"{definition.name.value} is not one expression ({exc.reason}): "
                       "write it as agg() expressions") from None
    return definition.params.params[0].name.value, body


def _series_dict(node: cst.BaseExpression,
                 ctx: RuleContext) -> list[tuple[str, cst.BaseExpression]] | None:
    """The items of `pd.Series({"name": value, ...})`, or None for a function of one value."""
    if not isinstance(node, cst.Call):
        return None
    func = ctx.evaluate(node.func, {})
    if not (isinstance(func, Module) and func.qualname == "pandas.Series"):
        return None
    if len(node.args) != 1 or node.args[0].keyword is not None \
            or not isinstance(node.args[0].value, cst.Dict):
        raise Unsupported("pd.Series of something other than one dict written out")
    items = []
    for element in node.args[0].value.elements:
        if not isinstance(element, cst.DictElement):
            raise Unsupported("** in the Series' dict")
        key = ctx.evaluate(element.key, {})
        if not (isinstance(key, Opaque) and isinstance(key.const, str)):
            raise Unsupported("a Series label that is not text written out")
        if any(k == key.const for k, _ in items):
            raise Unsupported(f"the label {key.const!r} twice")
        items.append((key.const, element.value))
    if not items:
        raise Unsupported("an empty Series (pandas returns no columns)")
    return items
