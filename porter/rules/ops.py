"""Operators and element-wise numbers: arithmetic, comparisons, & | ~, round, abs, clip,
np.where.

porter keeps Polars frames free of NaN (NaN becomes null wherever it can arise), so a missing
value is always null on the Polars side; these rules rely on that.
"""

from __future__ import annotations

import ast
from dataclasses import replace
import functools
import math
import re
from pathlib import Path

import libcst as cst

from porter.emit import code as emit
from porter.emit.code import Code
from porter.rules import rule
from porter.rules.datetimes import is_timedelta, timedelta_arithmetic
from porter.rules.io_options import DIVIDE_FUNCTION, FLOAT_DIVMOD_FUNCTION
from porter.translate.context import (
    MIXED_COLUMN, PandasCall, RuleContext, Unsupported, check_same_rows, derive, derived_column,
    floats_where_missing, number_cells, value_dtype, with_column_updates, without_index,
)
from porter.translate.handover import to_pandas
from porter.translate.values import (
    NOT_NULLABLE, Column, Frame, Opaque, PandasValue, Scalar, Value, fresh_token,
)

NUMERIC = {"int", "float"}


def base_column(*values: Value) -> Column:
    if any(isinstance(v, Column) and v.dtype is not None and v.dtype.startswith("period[")
           for v in values):
        # dt.to_period() kept in a frame as the periods' text: pandas compares and adds periods
        # ("2024-3" == 2024-03, month + 1 is the next month), not text
        raise Unsupported("a column of periods, held as their text: operators on it stay pandas")
    if any(isinstance(v, Opaque) and v.pytype is not None and v.pytype.startswith("period[")
           for v in values):
        # a Period of a loop over pd.period_range, other than compared with a column of its
        # periods (_period_operands): pandas compares and adds Periods, not text
        raise Unsupported("a pandas Period (a loop over pd.period_range): operators on it "
                          "stay pandas")
    columns = [v for v in values if isinstance(v, Column)]
    if not columns:
        raise Unsupported("no column among the operands")
    first = columns[0]
    for candidate in columns:
        # operands of the same rows taken at different points (names[1], split before
        # runs["surname"] was added, beside runs["surname"]): the expressions are read in the
        # newest frame, the one that holds the column versions of every operand
        if candidate.frame.rows == first.frame.rows \
                and all(_readable_in(c, candidate.frame) for c in columns):
            return first if candidate.frame is first.frame else replace(first, frame=candidate.frame)
    return first


def _readable_in(column: Column, frame: Frame) -> bool:
    try:
        check_same_rows(column, frame)
    except Unsupported:
        return False
    return True


def operand(value: Value, frame: Frame, ctx: RuleContext, *, as_bool: bool = False) -> Code:
    """A value on one side of an operator: Polars operators read a Python string as a literal,
    so plain literals are written as they are."""
    if isinstance(value, Opaque) and value.is_const and not isinstance(value.const, (list, dict, tuple)):
        return value.code if value.code.text.isidentifier() else emit.lit(value.const)
    return ctx.bool_expr(value, frame) if as_bool else ctx.expr(value, frame)


def _is_nonzero_constant(value: Value) -> bool:
    return isinstance(value, Opaque) and isinstance(value.const, (int, float)) \
        and not isinstance(value.const, bool) and value.const != 0


ALIGNED_LEFT, ALIGNED_RIGHT = "_porter_left", "_porter_right"


def _aligned_group_results(left: Value, right: Value, op: str,
                           ctx: RuleContext) -> tuple[Column, Column] | None:
    """Two Series of different frames, each a groupby's sorted result on the same one key
    (`healthy.groupby("k").size() / df.groupby("k").size()`): pandas aligns them on the labels,
    the union of the keys in sorted order (a missing key last), NaN where one side lacks a
    label, an int Series float64 then. The two tables are joined on the key (a full join,
    missing keys matching each other as pandas' NaN labels do) and sorted by it; int columns
    are made Float64 once the join has run when it left a value missing (int64 where none
    is). Each side becomes a column of that table. None for any other pair."""
    if not (isinstance(left, Column) and isinstance(right, Column)) or left.frame.rows == right.frame.rows:
        return None
    frames = (left.frame, right.frame)
    if not all(len(f.index) == 1 and f.grouped_rows == f.rows for f in frames) \
            or left.frame.index != right.frame.index:
        return None
    key = left.frame.index[0]
    kinds = {f.dtype(key) for f in frames}
    if len(kinds) > 1 or None in kinds:
        raise Unsupported("two Series aligned on labels whose types are not known to be one "
                          "type: pandas finds no label of one in the other")
    if not {left.dtype, right.dtype} <= NUMERIC:
        raise Unsupported("two Series of other than numbers aligned on labels: pandas makes "
                          "NaN where a label is missing, which changes their type")
    # (each side's own sort by the key is left out: the join's order is sorted afterwards)
    sides = [_without_last_sort(side.frame.code, key).method(
                 "select", emit.col(key), ctx.expr(side, side.frame).method("alias", alias))
             for side, alias in ((left, ALIGNED_LEFT), (right, ALIGNED_RIGHT))]
    code = sides[0].method("join", sides[1], on=key, how="full", coalesce=True,
                           nulls_equal=True).method("sort", key, nulls_last=True)
    ints = tuple(alias for side, alias in ((left, ALIGNED_LEFT), (right, ALIGNED_RIGHT))
                 if side.dtype == "int")
    if ints and op != "/":
        code = floats_where_missing(code, ints)
    rows = fresh_token()
    table = replace(left.frame, code=code, rows=rows, grouped_rows=rows, sites=(),
                    columns=(key, ALIGNED_LEFT, ALIGNED_RIGHT),
                    dtypes=((key, left.frame.dtype(key)),
                            *((alias, side.dtype) for side, alias in
                              ((left, ALIGNED_LEFT), (right, ALIGNED_RIGHT)) if side.dtype == "float")),
                    versions=(), float_ints=(), nullable_ints=(), unsure_ints=(), number_cells=None,
                    column_pairs=(), value_levels=(), number_labels=(), labels_intact=False,
                    binding=None)
    return tuple(Column(emit.col(alias), frame=table, name=side.name,  # type: ignore[return-value]
                        dtype=side.dtype if side.dtype == "float" else None,
                        refs=frozenset({alias}), nullable_int=NOT_NULLABLE)
                 for side, alias in ((left, ALIGNED_LEFT), (right, ALIGNED_RIGHT)))


def _without_last_sort(code: Code, key: str) -> Code:
    """A plan without its last step when that step is a plain sort by `key`."""
    if code.base is None or not code.steps or code.steps[-1] != f".sort({emit.render(key)})":
        return code
    return code.without_last_step()


@rule("series.arith")
def arithmetic(call: PandasCall, ctx: RuleContext) -> Value:
    """Series arithmetic -> Expr operators: a + b, a - b, a * b, a / b, a // b, a % b, a ** b.

    Handles: 0/0 gives NaN in both, which porter turns into a missing value (fill_nan(None));
    integer // and % by zero give inf/NaN in pandas and null in Polars, so // is written as a
    floored true division and % is guarded; bool + bool is a logical or in pandas; inf * 0
    and inf - inf are made missing too wherever an operand may hold inf (a float or
    unknown-type column, stored from a division or read from the data, or an inf constant);
    integer and boolean operands and finite constants need nothing; an operand that is a
    Timedelta goes to datetimes.timedelta_arithmetic; text times a whole number repeats it
    (_repeated_text); a number column and NaN (x * np.nan) make a float column of missing
    values, as pandas makes one of NaN. pandas' nullable integers (astype("Int64")): x // 0
    and x % 0 are 0, the result integer. A float column that may be float32 divided by a
    number stays Float32 (numpy takes the number as float32). x // d and x % d where a float
    takes part are computed by numpy (pandas_float_divmod): it floors the exact quotient and
    takes the exact remainder, Polars floors the rounded quotient (1.0 // 0.1: 9.0 against
    10.0). Two groupby results of different frames on the same one key are aligned on their
    labels (_aligned_group_results).
    Caveats: two such results of groupby(sort=False) or dropna=False, or of True/False values,
    are TODOs. Two operands of unknown type (a + b without --data) may be text or dates, where
    fill_nan fails: left out, confidence 0.95 (for - and * only when the script makes no
    datetimes).
    """
    left, right = call.receiver, call.args[0]
    assert left is not None
    aligned = _aligned_group_results(left, right, call.name, ctx)
    if aligned is not None:
        left, right = aligned
        call = replace(call, receiver=left, args=(right, *call.args[1:]))
    column = base_column(left, right)
    if is_timedelta(left) or is_timedelta(right):
        return timedelta_arithmetic(call, ctx, column)
    frame = column.frame
    op = call.name
    lcode = operand(left, frame, ctx, as_bool=True)
    rcode = operand(right, frame, ctx, as_bool=True)
    ltype, rtype = value_dtype(left), value_dtype(right)
    dtype: str | None = None
    if any(_object_bools_possible(v, ctx) for v in (left, right)):
        ctx.lower(OBJECT_BOOLS_ARITHMETIC, 0.9)
    if op == "+" and ltype == rtype == "bool":
        return derived_column(column, emit.binop(lcode, "|", rcode), dtype="bool", others=[left, right])
    if op in ("+", "-", "*", "/", "//", "%") and any(_is_nan_constant(v) for v in (left, right)) \
            and {ltype, rtype} <= {"int", "float", "bool", None}:
        # x * np.nan is NaN for every row, a float column in pandas (Polars' x * None stays an
        # integer column of missing values: fillna(-9) would write -9, not -9.0)
        code = emit.pl("repeat", None, emit.pl("len"), dtype=emit.atom("pl.Float64"))
        return derived_column(column, code, dtype="float", others=[left, right],
                              name=_result_name(left, right))
    if ltype == "duration" and op in ("/", "*") or rtype == "duration" and op == "*":
        # durations scaled by numbers stay durations; a duration over a duration is a float
        # (NaN for 0 / 0, missing in pandas); pandas_div and fill_nan take numbers only
        code = emit.binop(lcode, op, rcode)
        over = op == "/" and rtype != "duration" and rtype not in NUMERIC
        if op == "/" and not over and rtype == "duration":
            # divided value by value (Polars multiplies by the reciprocal of one divisor, a
            # binary digit off numpy's quotient)
            code = emit.binop(lcode, "/", emit.binop(emit.binop(lcode, "*", 0), "+", rcode)) \
                .method("fill_nan", None)
        return derived_column(column, code, others=[left, right],
                              dtype="float" if op == "/" and rtype == "duration" else
                              None if over else "duration", name=_result_name(left, right))
    if op == "*" and ("str" in (ltype, rtype)):
        return _repeated_text(left, right, lcode, rcode, column, ctx)
    if op == "/":
        # a NaN an operand made missing stays NaN through + - * / and is made missing by the
        # outermost operation instead: one fill_nan for a chain of arithmetic
        lplain, rplain = _nan_unfilled(lcode), _nan_unfilled(rcode)
        code = emit.binop(lplain, "/", rplain)
        if _single_divisor(right) and not _exact_reciprocal(right) and ltype == "float" \
                and float32_possible(ctx):
            # as below, divided value by value; the divisor takes the column's type (sign() * 0
            # keeps it, 0 for inf too): a float32 column over a number stays float32 in pandas
            # (numpy takes the number as float32), where pandas_div's integer divisor makes
            # the quotient Float64, another number
            code = emit.binop(lplain, "/", emit.binop(
                emit.binop(lplain.method("sign"), "*", 0), "+", rplain))
        elif _single_divisor(right) and not _exact_reciprocal(right):
            # Polars multiplies by the reciprocal of a single divisor: one binary digit off
            # pandas' quotient for about a third of the values (a later round() can flip)
            code = emit.call(DIVIDE_FUNCTION, lplain, rplain)
        if not _is_nonzero_constant(right) or lplain is not lcode or rplain is not rcode:
            code = code.method("fill_nan", None)
        dtype = "float"
    elif op in ("//", "%") and _float_division(left, right) and not float32_possible(ctx):
        # numpy floors the exact quotient and takes the exact remainder; Polars floors the
        # rounded quotient (1.0 // 0.1: 9.0 against 10.0; 1.0 % 0.1: 0.09999999999999995
        # against 0.0, and most remainders by a fraction a digit off): numpy computes them
        code = emit.call(FLOAT_DIVMOD_FUNCTION, _nan_unfilled(lcode), _nan_unfilled(rcode),
                         **({"remainder": True} if op == "%" else {}))
        dtype = "float"
    elif op in ("//", "%") and ltype == rtype == "int" and any(
            masked(v) and v.nullable_int not in MASKED_DTYPES for v in (left, right)):
        # pandas' nullable integers: x // 0 and x % 0 are 0 (<NA> for a missing x), and the
        # result stays integer; Polars' floored // and % agree elsewhere (-7 // 2 is -4,
        # -7 % 2 is 1) and give null for a zero divisor
        code = emit.binop(lcode, op, rcode)
        if isinstance(right, Opaque) and right.const == 0:
            code = emit.binop(lcode, "*", 0)
        elif not _is_nonzero_constant(right):
            code = emit.when(emit.binop(rcode, "==", 0), emit.binop(lcode, "*", 0), code)
        dtype = "int"
    elif op == "//":
        if rtype == "float" or isinstance(right, Opaque) and isinstance(right.const, float) \
                and not right.const.is_integer():
            ctx.lower("floor division by a fraction: pandas floors the exact quotient (1.0 // 0.1 "
                      "is 9.0), Polars the rounded one (10.0), which can differ by one", 0.9)
        if _is_nonzero_constant(right):
            code = emit.binop(lcode, "//", rcode)
            dtype = ltype if ltype in NUMERIC else None
            if ltype not in ("int", "bool"):
                ctx.lower(_NEAR_A_MULTIPLE, 0.99)
        elif ltype == rtype == "int" and any(isinstance(v, Column) and v.element for v in (left, right)) \
                and not any(isinstance(v, Column) and v.float_int for v in (left, right)):
            # one value of a function (s.map, a row of apply that holds text, which pandas
            # does not make float): Python's int // int, an int, which raises for a zero
            # divisor where Polars' gives null
            code, dtype = emit.binop(lcode, "//", rcode), "int"
        else:
            code = emit.binop(lcode, "/", rcode).method("floor").method("fill_nan", None)
            dtype = "float"
            ctx.lower("floor division is computed as floored true division (float result)", 0.95)
    elif op == "%":
        if ltype == "str" or isinstance(left, Opaque) and isinstance(left.const, str):
            raise Unsupported("text formatting with % (\"n=%s\" % v): write it as an f-string")
        code = emit.binop(lcode, "%", rcode)
        if rtype == "float" or isinstance(right, Opaque) and isinstance(right.const, float) \
                and not right.const.is_integer():
            ctx.lower("the remainder of a division by a fraction is computed as x - d * floor(x / d), "
                      "which can be some binary digits off pandas' exact remainder", 0.9)
        elif ltype not in ("int", "bool"):
            ctx.lower(_NEAR_A_MULTIPLE, 0.99)
        if isinstance(right, Opaque) and right.const == 0:
            code = emit.pl("lit", None, dtype=emit.atom("pl.Float64"))  # every value is NaN
        elif _is_nonzero_constant(right) and right.const < 0 and ltype != "bool":  # type: ignore[union-attr]
            # a zero remainder takes the divisor's sign in pandas (6.0 % -3 is -0.0), Polars
            # writes 0.0: x % d is -((-x) % -d), the same number, with the sign of zero of a
            # remainder by a positive divisor turned round
            code = emit.unary("-", emit.binop(emit.unary("-", lcode), "%", emit.lit(-right.const)))  # type: ignore[union-attr]
        elif not _is_nonzero_constant(right):
            code = emit.when(emit.binop(rcode, "!=", 0), code)
            if ltype != "int" and rtype != "int":
                ctx.lower("a zero remainder by a negative divisor is -0.0 in pandas (6.0 % -3), "
                          "0.0 here: written and printed so", 0.99)
    elif op in ("+", "-", "*", "**"):
        code = emit.binop(lcode, op, rcode)
        hoisted = False
        if op != "**":  # one fill_nan for a chain of arithmetic, as for / above
            lplain, rplain = _nan_unfilled(lcode), _nan_unfilled(rcode)
            hoisted = lplain is not lcode or rplain is not rcode
            code = emit.binop(lplain, op, rplain)
        if hoisted:
            code = code.method("fill_nan", None)
        elif op != "**" and _nan_possible(op, left, right):
            if _numeric(left) or _numeric(right) or op != "+" and not ctx.datetimes_possible:
                code = code.method("fill_nan", None)  # inf * 0, inf - inf: NaN, missing in pandas
            else:
                # fill_nan fails on text and dates, which two operands of unknown type may be
                ctx.lower("operands of unknown type: where they hold inf, inf - inf and inf * 0 "
                          "are NaN, missing in pandas but not in Polars (fill_nan is left out: "
                          "the values may be text or dates)", 0.95)
        if ltype in NUMERIC and rtype in NUMERIC:
            dtype = "float" if "float" in (ltype, rtype) else "int"
        elif "float" in (ltype, rtype) and any(
                isinstance(v, Scalar) and v.pytype in ("int", "float") for v in (left, right)):
            dtype = "float"  # a float column and a number computed from the data (its mean)
        elif op == "+" and "str" in (ltype, rtype):
            dtype = "str"
        elif op == "-" and ltype == rtype == "datetime" or op in ("+", "-") and ltype == rtype == "duration":
            dtype = "duration"
        elif op in ("+", "-") and ltype == "datetime" and rtype == "duration" \
                or op == "+" and ltype == "duration" and rtype == "datetime":
            dtype = "datetime"  # a date moved by a duration column (pd.to_timedelta(days, unit="D"))
        if op == "**" and isinstance(left, Column) and not left.element and ltype == "int" \
                and not left.float_int and _number_const(right) \
                and isinstance(right.const, int) and right.const >= 0:  # type: ignore[union-attr]
            # an int64 column to a whole power: no NaN can arise, and a power past int64 wraps
            # around in numpy's int64 as in Polars' Int64 (both are the power modulo 2**64:
            # 3037000500 ** 2 is -9223372036709301616 in both). (An int column pandas holds as
            # float64, float_int, is not: its power does not wrap.)
            code = emit.binop(lcode, "**", rcode)
        elif op == "**":
            if column.element:
                lcode, dtype = _python_power(left, right, lcode, dtype, ctx)
            code = _power(left, right, lcode, rcode, ctx).method("fill_nan", None)
            ctx.lower("a negative base to a fractional power is NaN in both (made missing here)", 0.98)
            if isinstance(left, Column) and left.float_int and ltype == "int":
                ctx.lower(f"pandas holds the base as float64 when {left.float_int}: a power "
                          "past 2**63 is a large float there (9.2e+18) and wraps around in "
                          "Polars' Int64 here", 0.95)
    else:
        raise Unsupported(f"operator {op} on columns")
    if _is_str_literal(left) and op == "+":
        code = emit.binop(emit.pl("lit", left.const), "+", rcode)  # type: ignore[union-attr]
    result = derived_column(column, code, dtype=dtype, others=[left, right], name=_result_name(left, right))
    # inside a lambda, arithmetic on the parameter is still one value: `(s + "!").upper()`
    return replace(result, element=True) if column.element else result


def _repeated_text(left: Value, right: Value, lcode: Code, rcode: Code, column: Column,
                   ctx: RuleContext) -> Value:
    """text * n (or n * text): each text repeated n times, as Python and pandas' str dtype
    repeat it ("*" * 3 is "***"; n <= 0 gives ""); a missing text stays missing. Polars has
    no repeat for text: the value is repeated into a list (repeat_by) and joined. n is a whole
    number: a constant, or an int column (pandas: one per row; also a Python int in a lambda,
    where a text constant may come first: "*" * x)."""
    text, times, tcode, ncode = (left, right, lcode, rcode) if value_dtype(left) == "str" \
        else (right, left, rcode, lcode)
    count = times.const if isinstance(times, Opaque) and times.is_const else None
    if isinstance(count, bool) or not (isinstance(count, int) or value_dtype(times) == "int"):
        raise Unsupported("text times a value that is not a whole number (pandas raises "
                          "\"Can only string multiply by an integer\")")
    if not isinstance(text, Column) and not column.element:
        # pandas' "*" * series goes to numpy, which raises; Python's own in a lambda works
        raise Unsupported("a text constant times a column (numpy raises in pandas)")
    if isinstance(text, Column):
        present = tcode.method("is_not_null")
    else:
        present = ncode.method("is_not_null")
        tcode = emit.pl("lit", text.const)  # type: ignore[union-attr]
    if count is not None:
        repeated = emit.pl("lit", "") if count <= 0 else \
            tcode.method("repeat_by", count).attr("list").method("join", "")
    else:
        repeated = tcode.method("repeat_by", ncode.method("clip", 0)).attr("list").method("join", "")
    code = emit.pl("when", present).method("then", repeated)
    result = derived_column(column, code, dtype="str", others=[left, right],
                            name=_result_name(left, right))
    return replace(result, element=True) if column.element else result


def _power(left: Value, right: Value, lcode: Code, rcode: Code, ctx: RuleContext) -> Code:
    """a ** b as numpy computes it on pandas' floats, where a missing value is NaN: NaN ** 0
    and 1 ** NaN are 1 (Polars: null ** 0 is null). Float operands are given NaN for missing
    values before the power; an exponent that is a nonzero constant needs nothing."""
    if _is_nonzero_constant(right) and not (isinstance(left, Opaque) and left.const == 1):
        return emit.binop(lcode, "**", rcode)
    nan = emit.call("float", "nan")
    operands = []
    for value, code in ((left, lcode), (right, rcode)):
        kind = value_dtype(value)
        if isinstance(value, Column) and kind == "float":
            code = code.method("fill_null", nan)
        elif isinstance(value, Column) and kind not in ("int", "bool"):
            ctx.lower("a missing value to the power 0 (or 1 to a missing power) is 1 in pandas "
                      "and missing here, unless the column is known to hold floats", 0.9)
        operands.append(code)
    return emit.binop(operands[0], "**", operands[1])


# in the reason of a TODO whose pandas result may hold values no Polars column holds (Python's
# integers past Int64, complex numbers): a column made of it keeps its frame on pandas
# (rules/assign.py value_expr)
PYTHON_ONLY_NUMBERS = "numbers no Polars type holds"


def _python_power(left: Value, right: Value, lcode: Code, dtype: str | None,
                  ctx: RuleContext) -> tuple[Code, str | None]:
    """a ** b in a lambda (or the script's function) is Python's power of each value, not
    numpy's of the column: the base's code and the result's dtype, or a TODO.

    A whole number to a negative whole number is float(a) ** b in Python (2 ** -2 is 0.25,
    a float64 column), which Polars refuses for an integer base: the base is cast to Float64.
    Python's whole numbers never overflow (10 ** 20 is exact, an object column in pandas)
    where Polars' Int64 wraps around; a whole-number exponent that is a column gives an int
    or a float by its sign, and pandas' column int64 or float64 by the data; a negative
    number to a fraction is a complex number ((-4) ** 0.5), and pandas' column complex."""
    lkind, rkind = value_dtype(left), value_dtype(right)
    exponent = right.const if _number_const(right) else None  # type: ignore[union-attr]

    def whole(value: Value, kind: str | None) -> bool:
        return kind in ("int", "bool") or _number_const(value) and isinstance(value.const, int)  # type: ignore[union-attr]

    if whole(left, lkind) and whole(right, rkind):
        if rkind == "bool":
            return lcode, dtype  # an exponent of 0 or 1
        if not isinstance(exponent, int):
            raise ctx.todo("a whole number to the power of a column of whole numbers: Python's "
                           "result is a float where the exponent is negative (2 ** -2 is 0.25) "
                           "and an int elsewhere, so pandas' column is float64 or int64 by the "
                           "data; Polars refuses a negative integer exponent")
        if exponent < 0:
            return lcode.method("cast", emit.atom("pl.Float64")), "float"
        if exponent >= 3 and lkind != "bool":
            raise ctx.todo(f"x ** {exponent} of whole numbers: Python's integers never overflow "
                           f"(pandas keeps a result past 9.2e18 exactly, in an object column of "
                           f"{PYTHON_ONLY_NUMBERS}), where Polars' Int64 wraps around")
        if exponent == 2 and lkind != "bool":
            ctx.lower("x ** 2 of whole numbers: Python's integers never overflow, where Polars' "
                      "Int64 wraps around past 9.2e18 (values of 3.04e9 and more)", 0.98)
        return lcode, dtype
    fractional = not (isinstance(exponent, (int, float)) and float(exponent).is_integer()) \
        and rkind not in ("int", "bool")
    if fractional and lkind != "bool" and not (_number_const(left) and left.const >= 0):  # type: ignore[union-attr]
        raise ctx.todo("Python's power of a negative number to a fraction ((-4) ** 0.5) is a "
                       f"complex number, and pandas' column complex ({PYTHON_ONLY_NUMBERS}); "
                       "Polars gives NaN")
    if lkind is None and isinstance(exponent, int):
        if exponent < 0:
            # a float base is unchanged by the cast; a whole number is what Python computes
            return lcode.method("cast", emit.atom("pl.Float64")), "float"
        if exponent >= 2:
            ctx.lower("the base's type is not known: where it holds whole numbers, Python's "
                      "power never overflows and Polars' Int64 wraps around past 9.2e18", 0.9)
    return lcode, dtype


_ARITHMETIC = (ast.Add, ast.Sub, ast.Mult, ast.Div)


def _nan_unfilled(code: Code) -> Code:
    """`code` without its last `.fill_nan(None)` when that step only makes missing the NaN of
    arithmetic (+ - * /, pandas_div): the NaN goes on through the enclosing + - * / and the
    enclosing operation's own fill_nan makes it missing. Anything else is returned as is."""
    if code.steps != (".fill_nan(None)",) or code.base is None:
        return code
    inner = code.base[1:-1] if code.base.startswith("(") and code.base.endswith(")") else code.base
    try:
        tree = ast.parse(inner, mode="eval").body
    except SyntaxError:
        return code
    if isinstance(tree, ast.BinOp) and isinstance(tree.op, _ARITHMETIC):
        return Code(inner, emit.BINARY_PRECEDENCE["+" if isinstance(tree.op, (ast.Add, ast.Sub)) else "*"])
    if isinstance(tree, ast.Call) and isinstance(tree.func, ast.Name) and tree.func.id == DIVIDE_FUNCTION \
            and code.base == inner:
        return Code(inner)
    return code


def _is_nan_constant(value: Value) -> bool:
    return isinstance(value, Opaque) and isinstance(value.const, float) and math.isnan(value.const)


def _single_divisor(value: Value) -> bool:
    """A divisor that is one value for every row (a number, a collected scalar, an aggregate),
    not a column of values."""
    return not isinstance(value, Column)


def _exact_reciprocal(value: Value) -> bool:
    """A constant whose reciprocal is exact (a power of two) or that is 0 (x * inf is x / 0)."""
    if not (isinstance(value, Opaque) and isinstance(value.const, (int, float))
            and not isinstance(value.const, bool)):
        return False
    number = abs(float(value.const))
    if number == 0:
        return True
    mantissa, _ = math.frexp(number)
    return mantissa == 0.5 and math.isfinite(number)


def _may_be_infinite(value: Value) -> bool:
    """A value that may hold ±inf: an inf constant, or a float or unknown-type column or value
    (a column stored from a division, or inf read from the data); integers, booleans, text and
    dates cannot."""
    if isinstance(value, Opaque) and value.is_const:
        return isinstance(value.const, float) and math.isinf(value.const)
    if isinstance(value, Column):
        return value.dtype in (None, "float")
    if isinstance(value, (Scalar, Opaque)):
        return value.pytype in (None, "float")
    return True


def _may_be_zero(value: Value) -> bool:
    """A value that may be 0 (or False): anything but a nonzero constant or text."""
    if isinstance(value, Opaque) and value.is_const:
        return isinstance(value.const, (int, float)) and value.const == 0
    if isinstance(value, Column):
        return value.dtype != "str"
    if isinstance(value, (Scalar, Opaque)):
        return value.pytype != "str"
    return True


def _numeric(value: Value) -> bool:
    """A value known to be a number (or a boolean): the result of arithmetic with it is a
    number too, so fill_nan applies to it."""
    if isinstance(value, Opaque) and value.is_const:
        return isinstance(value.const, (int, float))
    if isinstance(value, Column):
        return value.dtype in ("int", "float", "bool")
    if isinstance(value, (Scalar, Opaque)):
        return value.pytype in ("int", "float", "bool")
    return False


def _nan_possible(op: str, left: Value, right: Value) -> bool:
    """inf * 0 and inf - inf (inf + -inf) are NaN, missing in pandas: + and - need both sides
    possibly infinite, * one side possibly infinite and the other possibly zero."""
    if op in ("+", "-"):
        return _may_be_infinite(left) and _may_be_infinite(right)
    if op == "*":
        return _may_be_infinite(left) and _may_be_zero(right) \
            or _may_be_infinite(right) and _may_be_zero(left)
    return False


def _is_str_literal(value: Value) -> bool:
    return isinstance(value, Opaque) and isinstance(value.const, str)


def _result_name(left: Value, right: Value) -> str | None:
    """pandas keeps a name when both sides share it (or one side is a scalar)."""
    names = [v.name for v in (left, right) if isinstance(v, Column)]
    return names[0] if len(set(names)) == 1 else None


@rule("series.compare")
def compare(call: PandasCall, ctx: RuleContext) -> Value:
    """a == b, a != b, a < b, ... on columns and scalars -> Expr comparisons.

    Handles: a comparison with a missing value is False in pandas (True for !=) and null in
    Polars; != is filled with True right away, the others are filled with False where the
    result is negated or used as a value (a filter drops null rows like False rows); text
    compared with a column known to hold datetimes is read as pandas reads it (pd.Timestamp)
    and written as pl.datetime(...); text compared (== or !=) with a number or True/False
    (a text column with 7, a number column with "7", a True/False column with "true") is never
    equal in pandas: False (True for !=) for every row, where Polars would refuse the
    comparison or read True as "true". A column pandas holds as one of its nullable types
    (astype("Int64" / "Float64" / "string" / "boolean")) compares a missing value as <NA>,
    as Polars' null: no fill, the result is pandas' boolean (Kleene & |).
    Caveats: a column that may be of a nullable type porter did not follow (the script makes
    some, the column's mark is not known) gives False here where pandas gives <NA> (0.9).
    With the column's type unknown, text that looks like a date lowers confidence
    (0.7): pandas parses it where the column holds datetimes. Polars reads the datetime in the
    column's unit (a column of milliseconds compared with a date holding microseconds).
    """
    left, right = call.receiver, call.args[0]
    assert left is not None
    left, right = _period_operands(left, right)
    column = base_column(left, right)
    frame = column.frame
    left, right = _as_datetime(left, column), _as_datetime(right, column)
    if call.name in ("==", "!=") and _text_against_other(left, right):
        # "7" == 7, "true" == True, True == "true": never equal in pandas (Polars refuses
        # text against a number and reads True as the text "true")
        code = emit.pl("repeat", call.name == "!=", emit.pl("len"))
        return derived_column(column, code, dtype="bool", others=[left, right])
    lcode, rcode = operand(left, frame, ctx), operand(right, frame, ctx)
    if any(masked(v) for v in (left, right)):
        # pandas' nullable types (Int64, Float64, string, boolean) compare with three-valued
        # logic: a missing value on either side gives <NA> (written empty, skipped by sum, a
        # filter drops its row), as Polars' null does; the result is pandas' boolean
        code = emit.binop(lcode, call.name, rcode)
        result = derived_column(column, code, dtype="bool", others=[left, right])
        return replace(result, nullable_int="boolean")
    _maybe_masked(ctx, left, right)
    if call.name == "!=":
        if isinstance(right, Opaque) and right.is_const and right.const is not None:
            code = lcode.method("ne_missing", ctx.expr(right, frame))
        else:
            code = emit.binop(lcode, "!=", rcode).method("fill_null", True)
        return derived_column(column, code, dtype="bool", others=[left, right])
    if _date_like(right) and column.dtype not in ("str", "datetime"):
        ctx.lower("comparing with a date written as text: pandas parses it when the column "
                  "holds datetimes", 0.7)
    code = emit.binop(lcode, call.name, rcode)
    return derived_column(column, code, dtype="bool", null_is_false=True, others=[left, right])


def _period_operands(left: Value, right: Value) -> tuple[Value, Value]:
    """A column of periods (dt.to_period, held as their text) compared with a Period of the
    same frequency from a loop over pd.period_range (its pytype is the periods' dtype name):
    the column as text and the Period as str(p), which pandas writes the same way. Texts of
    one frequency with years of four digits (period_range checks them) order as the periods
    do, and a missing period compares as missing text does (False, True for !=). Anything
    else stays as it was (a column of periods stays pandas: base_column)."""
    def kind(value: Value) -> str | None:
        if isinstance(value, Column) and value.dtype is not None \
                and value.dtype.startswith("period[") and not value.element:
            return value.dtype
        return None
    for column, period in ((left, right), (right, left)):
        if kind(column) is not None and isinstance(period, Opaque) \
                and period.pytype == kind(column):
            assert isinstance(column, Column)
            as_text = replace(column, dtype="str")
            text = Opaque(emit.call("str", period.code), pytype="str")
            return (as_text, text) if column is left else (text, as_text)
    return left, right


_NOT_TEXT = ("int", "float", "bool")

# pandas' nullable dtypes (masked arrays and the "string" dtype): their missing value is <NA>,
# which comparisons and & | keep (three-valued logic) where numpy's types give False. Marked on
# the column as its pandas dtype name (Column.nullable_int, Frame.nullable_ints)
MASKED_DTYPES = {"boolean": "bool", "string": "str", "Float64": "float", "Float32": "float"}
MASKED_REASON = (
    "the script makes pandas' nullable types ({kinds}), and porter does not know whether this "
    "column is one: pandas compares a missing value of one as <NA> (written empty, skipped by "
    "sum), where a plain column gives False (True for !=), as here")


def masked(value: Value) -> bool:
    """A column pandas holds as one of its nullable types (Int64, Float64, string, boolean)."""
    return isinstance(value, Column) and bool(value.nullable_int) and not value.element


def _maybe_masked(ctx: RuleContext, *values: Value) -> None:
    """Lower the site where an operand may be one of pandas' nullable types porter did not
    follow (a column made so by a step that does not mark it, a read with dtype="string")."""
    kinds = masked_kinds(ctx)
    others = kinds - {"int"}
    for value in values:
        if not isinstance(value, Column) or value.element or value.null_is_false:
            continue
        if value.dtype in ("int", None) and value.nullable_int is None and "int" in kinds \
                or others and (value.dtype is None or value.dtype in others):
            names = sorted(k for k in kinds if k != "int") + (["Int64"] if "int" in kinds else [])
            ctx.lower(MASKED_REASON.format(kinds=", ".join(names)), 0.9)
            return


# what in a script makes a column of pandas' nullable types, by porter's dtype of the column
_MASKED_TEXTS = {"boolean": "bool", "string": "str", "string[python]": "str",
                 "string[pyarrow]": "str", "Float64": "float", "Float32": "float"}
_MASKED_NAMES = {"BooleanDtype": "bool", "StringDtype": "str", "Float64Dtype": "float",
                 "Float32Dtype": "float"}


def masked_kinds(ctx: RuleContext) -> frozenset[str]:
    """The kinds of column ("int", "float", "str", "bool") the script may make one of pandas'
    nullable types of: it names the dtype ("string", "boolean", "Float64"), or converts with
    convert_dtypes / dtype_backend (any kind); "int" where it may make nullable integers."""
    module = ctx.python_module
    kinds = set(_masked_in(module)) if module is not None else {"float", "str", "bool"}
    if ctx.nullable_ints_possible:
        kinds.add("int")
    return frozenset(kinds)


@functools.lru_cache(maxsize=16)
def _masked_in(module: ast.Module) -> frozenset[str]:
    kinds: set[str] = set()
    for node in ast.walk(module):
        if isinstance(node, ast.Constant) and isinstance(node.value, str) \
                and node.value in _MASKED_TEXTS:
            kinds.add(_MASKED_TEXTS[node.value])
        name = node.attr if isinstance(node, ast.Attribute) else \
            node.id if isinstance(node, ast.Name) else None
        if name in _MASKED_NAMES:
            kinds.add(_MASKED_NAMES[name])
        if name in ("convert_dtypes", "dtype_backend") or isinstance(node, ast.keyword) \
                and node.arg == "dtype_backend":
            kinds.update(("float", "str", "bool"))
    return frozenset(kinds)


def _text_against_other(left: Value, right: Value) -> bool:
    """Text on one side and a number or True/False on the other (a column or a constant):
    pandas compares them value by value and finds no value equal."""
    types = {value_dtype(left), value_dtype(right)}
    return "str" in types and bool(types & set(_NOT_TEXT))


def _as_datetime(value: Value, column: Column) -> Value:
    """Text compared with a datetime column is read as a date by pandas ("2024-03-01" is
    midnight, "2024-03" the first of the month); Polars refuses to compare datetimes with text,
    so the text is read here as pandas reads it and written as pl.datetime(...)."""
    if column.dtype != "datetime" or not (isinstance(value, Opaque) and isinstance(value.const, str)):
        return value
    import pandas as pd
    try:
        stamp = pd.Timestamp(value.const)
    except (ValueError, TypeError):
        raise Unsupported(f"{value.const!r} is not a date pandas can read: pandas refuses the "
                          "comparison") from None
    if stamp is pd.NaT:
        raise Unsupported("a comparison with NaT")
    if stamp.tzinfo is not None:
        raise Unsupported("a date with a time zone compared with a datetime column")
    if stamp.nanosecond:
        raise Unsupported("a date with nanoseconds (Polars' datetimes here hold microseconds)")
    parts = [stamp.year, stamp.month, stamp.day, stamp.hour, stamp.minute, stamp.second,
             stamp.microsecond]
    while len(parts) > 3 and parts[-1] == 0:
        parts.pop()
    code = emit.pl("datetime", *parts)
    return Scalar(code, pytype="datetime", expr=code)


def _date_like(value: Value) -> bool:
    return isinstance(value, Opaque) and isinstance(value.const, str) and \
        len(value.const) >= 8 and value.const[:4].isdigit() and value.const[4:5] in "-/"


# the last step of a boolean expression that is never missing
_NEVER_MISSING = (".fill_null(", ".is_null(", ".is_not_null(", ".is_in(", ".ne_missing(",
                  ".eq_missing(", ".is_duplicated(", ".is_unique(")


def may_hold_nan(value: Value, *, unknown: bool = False) -> bool:
    """A True/False column whose missing values are pandas' NaN, not a comparison's False: a
    yes/no column read with a blank (pandas makes it an object column of True, False and NaN),
    the result of map or shift. A comparison (null_is_false) and an expression that is never
    missing are not. `unknown`: a column of unknown type counts too."""
    kinds = ("bool", None) if unknown else ("bool",)
    if not (isinstance(value, Column) and value.dtype in kinds) or value.null_is_false \
            or masked(value):
        return False
    return not (value.code.steps and value.code.steps[-1].startswith(_NEVER_MISSING))


@rule("series.logical")
def logical(call: PandasCall, ctx: RuleContext) -> Value:
    """mask & mask, mask | mask, mask ^ mask -> Expr & | ^.

    Handles: Kleene logic with null standing for pandas' False gives the same rows for & and |;
    ^ fills first. A True/False column with blanks (object in pandas, True/False/NaN): pandas
    gives False wherever the left operand (the column under a scalar: True | s) is NaN and
    reads a NaN of the other as False, and the result is True/False (NaN | True is False):
    those rows are missing in the result (pl.when(a.is_not_null())), which stands for
    pandas' False. pandas' nullable boolean (astype("boolean"), a comparison of a nullable
    column) follows Kleene logic, as Polars does (_kleene).
    Caveats: a raw column of unknown type (no --data) may be such a column (0.9).
    """
    left, right = call.receiver, call.args[0]
    assert left is not None
    column = base_column(left, right)
    frame = column.frame
    if any(masked(v) for v in (left, right)):
        return _kleene(call, ctx, column, left, right)
    for value in (left, right):
        if isinstance(value, Column) and value.dtype is None and not value.null_is_false \
                and value.name is not None and value.code.text == emit.col(value.name).text:
            ctx.lower(f"column {value.name!r} of unknown type: if it holds True/False with "
                      "blanks, pandas reads a blank as NaN, which & | ^ make False (run with "
                      "--data to know the type)", 0.9)
    # the Series whose operator pandas calls: the left one, or the right one under a scalar
    # (True | s is s.__ror__(True)); a NaN of it makes the result False, a NaN of the other
    # operand is read as False
    first = left if isinstance(left, Column) else right
    nan_first = may_hold_nan(first)
    if call.name == "^":
        codes = [ctx.bool_expr(v, frame) for v in (left, right)]
        codes = [c.method("fill_null", False) if v is not first and may_hold_nan(v) else c
                 for v, c in zip((left, right), codes)]
        code = emit.binop(codes[0], "^", codes[1])
        if nan_first:  # missing stands for pandas' False, filled where stored or negated
            return derived_column(column, emit.when(first.code.method("is_not_null"), code),
                                  dtype="bool", null_is_false=True, others=[left, right])
        return derived_column(column, code, dtype="bool", others=[left, right])
    # & and |: Kleene logic gives null (pandas' False) or pandas' value wherever the first
    # operand is present; NaN | True is False in pandas, True in Polars: kept missing there
    nullable = any(isinstance(v, Column) and (v.null_is_false or may_hold_nan(v))
                   for v in (left, right))
    code = emit.binop(ctx.expr(left, frame), call.name, ctx.expr(right, frame))
    if nan_first and call.name == "|":
        code = emit.when(first.code.method("is_not_null"), code)
    return derived_column(column, code, dtype="bool", null_is_false=nullable, others=[left, right])


def _kleene(call: PandasCall, ctx: RuleContext, column: Column, left: Value,
            right: Value) -> Value:
    """& | ^ with pandas' nullable boolean on a side: Kleene logic, as Polars' (<NA> | True is
    True, <NA> | False and <NA> ^ x are <NA>, <NA> & False is False); a comparison of numpy's
    types on the other side is False where it met a missing value (filled). A True/False
    column with blanks (pandas' objects: True, False, NaN) beside one is left to pandas."""
    frame = column.frame
    codes = []
    for value in (left, right):
        if not masked(value) and (may_hold_nan(value, unknown=True)
                                  or isinstance(value, Column) and value.dtype not in ("bool",)):
            raise Unsupported("pandas' nullable boolean beside a column that may hold True/False "
                              "with blanks (Python objects: NaN | <NA> is True in pandas)")
        codes.append(ctx.bool_expr(value, frame) if isinstance(value, Column)
                     else operand(value, frame, ctx))
    _maybe_masked(ctx, *(v for v in (left, right) if not masked(v)))
    code = emit.binop(codes[0], call.name, codes[1])
    result = derived_column(column, code, dtype="bool", others=[left, right])
    return replace(result, nullable_int="boolean")


# A True/False column of the frame (read, stored, or filled) may be one pandas holds as Python
# objects: one that has or had a missing value (a blank in the file, a map() that missed a
# key) keeps the object dtype after fillna or dropna. Python's operators then act on each value
OBJECT_BOOLS_UNARY = (
    "a True/False column that has or had a missing value (a blank in the file, a map() that "
    "missed a key) is held by pandas as Python objects, even once filled: ~ of it gives -2 and "
    "-1 (Python's ~True, ~False), and fails where a value is missing; Polars negates each value")
OBJECT_BOOLS_ARITHMETIC = (
    "a True/False column that has or had a missing value (a blank in the file, a map() that "
    "missed a key) is held by pandas as Python objects: arithmetic gives Python ints beside NaN "
    "(x * 1 is written 1 where Polars' integer column with a missing value is written 1.0), "
    "and True + True is 2 (a logical or here)")
_PLAIN_BOOL_COLUMN = re.compile(r'^pl\.col\("(?:[^"\\]|\\.)*"\)(\.fill_null\((?:True|False)\))?$')


def _object_bools_possible(value: Value, ctx: RuleContext) -> bool:
    """A True/False column pandas may hold as objects: a column of the frame as it was read or
    stored (or filled), not a comparison or isna() computed here, nor a column the script
    only ever stores comparisons in (`df["late"] = df["due"] < today`): numpy bools."""
    if not (isinstance(value, Column) and value.dtype == "bool" and not value.null_is_false
            and not value.element and not masked(value) and _PLAIN_BOOL_COLUMN.match(value.code.text) is not None):
        return False
    module = ctx.python_module
    if module is None or value.name is None or ".fill_null(" in value.code.text:
        return True
    return not _numpy_bools_only(module, value.name)


# methods whose result is a numpy bool Series in pandas, whatever their receiver holds
_BOOL_METHODS = frozenset({
    "isna", "isnull", "notna", "notnull", "isin", "between", "duplicated", "eq", "ne", "lt",
    "le", "gt", "ge", "contains", "startswith", "endswith", "match", "fullmatch", "isdigit",
    "isalpha", "isalnum", "isnumeric", "isdecimal", "isspace", "islower", "isupper", "istitle"})


def _numpy_bools_only(module: ast.Module, name: str) -> bool:
    """Whether the script stores into column `name` (df["name"] = ..., assign(name=...)) and
    every value it stores there is a comparison, a test such as isna(), or ~ & | of them:
    pandas holds the column as numpy bools then. A column the script never stores was read
    (a blank makes it objects), and any other value may hold a missing one."""
    stored: list[ast.expr] = []
    for node in ast.walk(module):
        if isinstance(node, (ast.Assign, ast.AugAssign, ast.AnnAssign)):
            targets = node.targets if isinstance(node, ast.Assign) else [node.target]
            for target in targets:
                if isinstance(target, ast.Subscript):
                    key = target.slice
                    if isinstance(key, ast.Constant) and key.value == name and node.value is not None:
                        stored.append(node.value if isinstance(node, ast.Assign) else ast.Constant(None))
                    elif isinstance(key, ast.Tuple) and any(
                            isinstance(e, ast.Constant) and e.value == name for e in key.elts):
                        return False  # df.loc[rows, name] = ...: other rows may be missing
        elif isinstance(node, ast.keyword) and node.arg == name:
            stored.append(node.value)
    return bool(stored) and all(_numpy_bool(v) for v in stored)


def _numpy_bool(node: ast.expr) -> bool:
    if isinstance(node, ast.Compare):
        return True
    if isinstance(node, ast.UnaryOp) and isinstance(node.op, (ast.Invert, ast.Not)):
        return _numpy_bool(node.operand)
    if isinstance(node, ast.BinOp) and isinstance(node.op, (ast.BitAnd, ast.BitOr, ast.BitXor)):
        return _numpy_bool(node.left) and _numpy_bool(node.right)
    return isinstance(node, ast.Call) and isinstance(node.func, ast.Attribute) \
        and node.func.attr in _BOOL_METHODS


@rule("series.unary")
def unary(call: PandasCall, ctx: RuleContext) -> Value:
    """~mask, -s -> ~expr, -expr.

    Handles: ~ of a comparison that met a missing value is True in pandas: filled with False
    before negating.
    """
    column = call.receiver
    assert isinstance(column, Column)
    if call.name in ("~", "-") and _object_bools_possible(column, ctx):
        # ~ of a True/False column read or stored: pandas may hold it as objects, where
        # ~True is -2 (OBJECT_BOOLS_UNARY)
        ctx.lower(OBJECT_BOOLS_UNARY, 0.9)
    if call.name == "~":
        return derived_column(column, emit.unary("~", ctx.bool_expr(column, column.frame)),
                              dtype=column.dtype)
    if call.name == "-" and column.dtype == "bool":
        return derived_column(column, emit.unary("~", ctx.bool_expr(column, column.frame)), dtype="bool")
    return derived_column(column, emit.unary(call.name, column.code), dtype=column.dtype)


@rule("series.round", "frame.round")
def round_(call: PandasCall, ctx: RuleContext) -> Value:
    """s.round(n) / round(s, n) / df.round(n) -> .round(n) (both round half to even).

    Caveats: a float computed from a sum or mean that lands on a decimal half (676.215) can
    round either way: the two libraries (and Polars' streaming engine from run to run) add
    floats in different orders, so the last bit differs (0.98).
    """
    ctx.reject_unknown(call, "decimals", positional=1)
    decimals = call.const("decimals", 0, 0)
    receiver = call.receiver
    if isinstance(decimals, int) and not isinstance(decimals, bool) and decimals < 0 \
            and isinstance(receiver, Column) and receiver.dtype in ("int", "float") \
            and "Float32" not in receiver.code.text and not float32_possible(ctx):
        # numpy's round to tens or hundreds: the value over 10**-n rounded half to even
        # (rint), times 10**-n, in float64; an int column is made int again (149 -> 100)
        scale = 10 ** -decimals
        code = emit.binop(emit.binop(receiver.code, "/", scale).method("round", 0), "*", scale)
        if receiver.dtype == "int":
            code = code.method("cast", emit.atom("pl.Int64"))
        else:
            ctx.lower("a computed float on a half can round the other way (floats are added in "
                      "another order)", 0.98)
        return derived_column(receiver, code, dtype=receiver.dtype)
    if isinstance(decimals, dict) and isinstance(receiver, Frame):
        return _round_by_column(receiver, decimals, ctx)
    if not isinstance(decimals, int) or decimals < 0:
        raise Unsupported("rounding to tens or hundreds (negative decimals) of a frame or of a "
                          "column whose type porter does not know")
    if not (isinstance(receiver, Column) and receiver.dtype == "int"):
        ctx.lower("a computed float on a decimal half can round the other way (floats are added "
                  "in another order)", 0.98)
    if isinstance(receiver, Column):
        if decimals > 0 and receiver.dtype in ("float", None) and "Float32" in receiver.code.text:
            code = float32_round(receiver.code, decimals)
        elif decimals > 0 and receiver.dtype in ("float", None) and float32_possible(ctx):
            code = any_float_round(receiver.code, decimals)
        else:
            code = receiver.code.method("round", decimals)
        return derived_column(receiver, code, dtype=receiver.dtype)
    assert isinstance(receiver, Frame)
    # pandas rounds every numeric column, never the index (float keys held as columns);
    # integers are unchanged by it
    if decimals > 0 and float32_possible(ctx):
        code = receiver.code.method(
            "with_columns",
            without_index(emit.atom("pl.selectors.by_dtype(pl.Float64)"), receiver).method("round", decimals),
            float32_round(without_index(emit.atom("pl.selectors.by_dtype(pl.Float32)"), receiver), decimals))
    else:
        code = receiver.code.method(
            "with_columns", without_index(emit.atom("pl.selectors.float()"), receiver).method("round", decimals))
    from porter.translate.context import number_cells
    pivoted, cells = number_cells(receiver)
    if pivoted:
        # the cells of a pivoted table stay numbers of their type: still a table of them
        return replace(derive(receiver, code, same_rows=True), number_cells=(code.text, cells))
    return derive(receiver, code, same_rows=True)


def _round_by_column(frame: Frame, decimals: dict[object, object], ctx: RuleContext) -> Value:
    """df.round({"kg": 1, "price": 2}): each float column named rounded to its decimals, as
    pandas rounds it (half to even); a name that is no column, a column of whole numbers or
    True/False (unchanged by rounding) and a text or date column (pandas leaves what is not
    a number) are left as they are, and so is the index held in columns."""
    if not all(isinstance(k, str) and isinstance(v, int) and not isinstance(v, bool) and v >= 0
               for k, v in decimals.items()):
        raise Unsupported("decimals other than whole numbers from 0 up by column name")
    if frame.columns is None:
        raise Unsupported("rounding by column of a frame whose columns porter does not know")
    rounded: list[Code] = []
    for name, places in decimals.items():
        if name not in frame.columns or name in frame.index:
            continue  # pandas ignores it (and never rounds the index)
        dtype = frame.dtype(name)
        if dtype in ("int", "bool", "str", "date", "datetime", "duration", "category", "enum"):
            continue  # unchanged by pandas' round
        if dtype != "float":
            raise Unsupported(f"rounding column {name!r}, whose type porter does not know")
        column = emit.col(name)
        code = any_float_round(column, places) if places > 0 and float32_possible(ctx) \
            else column.method("round", places)
        rounded.append(code)
    if not rounded:
        return derive(frame, frame.code, same_rows=True)
    ctx.lower("a computed float on a decimal half can round the other way (floats are added "
              "in another order)", 0.98)
    code = frame.code.method("with_columns", *rounded)
    from porter.translate.context import number_cells
    pivoted, cells = number_cells(frame)
    if pivoted:
        return replace(derive(frame, code, same_rows=True), number_cells=(code.text, cells))
    return derive(frame, code, same_rows=True)


def float32_round(code: Code, decimals: int) -> Code:
    """numpy's round of a float32 array (what pandas' round does to a float32 column): the
    value times 10**n in float32, rounded half to even, divided by 10**n. Polars' round of a
    Float32 multiplies in Float64, so 2.675 (2.67499995 in float32) becomes 2.67 where numpy's
    267.5 (the product rounded to float32) becomes 2.68. The quotient is taken in Float64 and
    rounded once to Float32."""
    scale = 10 ** decimals
    scaled = emit.binop(code, "*", emit.atom(str(scale))).method("round", 0)
    quotient = emit.binop(scaled.method("cast", emit.atom("pl.Float64")), "/", emit.atom(str(scale)))
    # Polars divides by one value through its reciprocal: round(n) gives the exact quotient
    return quotient.method("round", decimals).method("cast", emit.atom("pl.Float32"))


def any_float_round(code: Code, decimals: int) -> Code:
    """numpy's round for a column that may be Float64 or Float32 (the type is not known):
    the value times 10**n in its own type, rounded half to even, divided by 10**n, and rounded
    again by Polars, which gives the correctly rounded quotient in either type (it is the same
    as .round(n) of a Float64 column)."""
    scale = 10 ** decimals
    scaled = emit.binop(code, "*", emit.atom(str(scale))).method("round", 0)
    return emit.binop(scaled, "/", emit.atom(str(scale))).method("round", decimals)


# numpy and pandas names of a 32-bit (or 16-bit) float: a script that names none of them and
# reads only text files (CSV, JSON, Excel: float64) holds no float32 column
_SMALL_FLOAT_TEXTS = frozenset({"float32", "Float32", "f4", "<f4", ">f4", "float16", "Float16",
                                "f2", "<f2", ">f2"})
_SMALL_FLOAT_NAMES = frozenset({"float32", "Float32", "float16", "Float16", "single", "half"})
_BINARY_READERS = frozenset({"read_parquet", "read_feather", "read_orc", "read_hdf",
                             "read_pickle", "read_stata", "read_spss", "read_sas", "read_sql",
                             "read_sql_query", "read_sql_table"})


# x // 3 and x % 3 of a column whose type porter does not know (without --data): where it holds
# floats, Polars' result differs from numpy's for a value just below a multiple of the divisor
_NEAR_A_MULTIPLE = ("x // d and x % d of a column of unknown type: if it holds floats, a value one "
                    "binary digit below a multiple of d is floored another way than numpy floors "
                    "it (Polars floors the rounded quotient)")


def _float_division(left: Value, right: Value) -> bool:
    """Whether x // d or x % d divides numbers of which one is a float (a float column or a
    float written in the script), each a column or a number, none the value of a function
    run in Python (where Python's // is pandas' already)."""
    def number(value: Value) -> str | None:
        if isinstance(value, Column):
            return value.dtype if value.dtype in ("int", "float") and not value.element else None
        if isinstance(value, Opaque) and value.is_const and type(value.const) in (int, float):
            return "float" if isinstance(value.const, float) else "int"
        return None

    kinds = [number(left), number(right)]
    return None not in kinds and "float" in kinds


def float32_possible(ctx: RuleContext) -> bool:
    """Whether a float column of the script may be float32, where numpy rounds the product
    in float32 (see float32_round): the script names a 32-bit float, or reads a binary file
    whose columns are not known (a Parquet file under --data is looked at)."""
    module = ctx.python_module
    if module is None:
        return True
    return _float32_in(module, getattr(ctx.schema_lookup, "root", None))


@functools.lru_cache(maxsize=16)
def _float32_in(module: ast.Module, root: Path | None) -> bool:
    """float32_possible of one script (and data folder), read once: every round and sum of
    the script asks."""
    for node in ast.walk(module):
        if isinstance(node, ast.Constant) and isinstance(node.value, str) \
                and node.value in _SMALL_FLOAT_TEXTS:
            return True
        if isinstance(node, ast.Attribute) and node.attr in _SMALL_FLOAT_NAMES:
            return True
        if isinstance(node, ast.Name) and node.id in ("float32", "float16"):
            return True
        if isinstance(node, ast.Call):
            func = node.func
            name = func.attr if isinstance(func, ast.Attribute) else func.id if isinstance(func, ast.Name) else None
            if name in _BINARY_READERS and not _parquet_without_float32(node, name, root):
                return True
    return False


# numpy and pandas names of integers narrower than 64 bits: a script that names none of them
# and reads only text files holds no such column
_SMALL_INT_TEXTS = frozenset({"int32", "int16", "int8", "uint32", "uint16", "uint8", "Int32",
                              "Int16", "Int8", "UInt32", "UInt16", "UInt8", "i4", "i2", "i1",
                              "<i4", "<i2", "u4", "u2", "u1", "<u4", "<u2"})


def small_ints_possible(ctx: RuleContext) -> bool:
    """Whether an int column of the script may be narrower than int64 (int32, int16...): numpy
    adds those into int64 (the sum of two int32 2000000000 is 4000000000), where Polars'
    sum keeps Int32 and wraps around. The script names such a type or reads a binary file."""
    module = ctx.python_module
    if module is None:
        return True
    return _small_ints_in(module)


@functools.lru_cache(maxsize=16)
def _small_ints_in(module: ast.Module) -> bool:
    for node in ast.walk(module):
        if isinstance(node, ast.Constant) and isinstance(node.value, str) \
                and node.value in _SMALL_INT_TEXTS:
            return True
        name = node.attr if isinstance(node, ast.Attribute) else \
            node.id if isinstance(node, ast.Name) else None
        if name in _SMALL_INT_TEXTS or name in ("isocalendar", "Int32Dtype", "Int16Dtype",
                                                 "Int8Dtype"):
            return True
        if isinstance(node, ast.Call):
            func = node.func
            called = func.attr if isinstance(func, ast.Attribute) else \
                func.id if isinstance(func, ast.Name) else None
            if called in _BINARY_READERS:
                return True
    return False


def _parquet_without_float32(node: ast.Call, reader: str, root: Path | None) -> bool:
    """A read_parquet of a file under --data none of whose columns is a 32- or 16-bit float."""
    if reader != "read_parquet" or root is None or not node.args \
            or not isinstance(node.args[0], ast.Constant) or not isinstance(node.args[0].value, str):
        return False
    import polars as pl
    try:
        schema = pl.scan_parquet(root / node.args[0].value).collect_schema()
    except (pl.exceptions.PolarsError, OSError, ValueError):
        return False
    return not any(dtype in (pl.Float32, pl.Float16) for dtype in schema.values())


@rule("series.abs")
def abs_(call: PandasCall, ctx: RuleContext) -> Value:
    """s.abs() / abs(s) -> .abs()."""
    column = call.receiver
    assert isinstance(column, Column)
    return derived_column(column, column.code.method("abs"), dtype=column.dtype)


@rule("series.clip")
def clip(call: PandasCall, ctx: RuleContext) -> Value:
    """s.clip(lower, upper) -> .clip(lower, upper).

    Handles: an integer column with fractional bounds becomes float in pandas; Polars would
    truncate the bounds (3.7 to 3), so the column is cast to Float64 first; a bound the script
    computes is cast for as a float unless it is known to be an int. A whole float bound (0.0)
    on an int column is the int it equals, and a missing (NaN) or infinite one no bound:
    pandas keeps int64 (written 0).
    Two single bounds the wrong way round are swapped, as pandas swaps them (clip(3, 1) is
    clip(1, 3)): constants here, bounds computed by the script when it runs.
    Caveats: pandas makes it float only when a value reaches a fractional bound: one that no
    bound changes stays integer there (written 3, Polars 3.0) (0.95); so does a computed bound
    that is whole (0.95, or 0.9 when porter does not know it is a number).
    """
    ctx.reject_unknown(call, "lower", "upper", positional=2)
    column = call.receiver
    assert isinstance(column, Column)
    lower = call.arg("lower", 0, None)
    upper = call.arg("upper", 1, None)
    if column.dtype in ("int", None):
        # pandas clips an int64 column to a whole float bound (0.0) as to the int, and takes a
        # NaN bound, or an infinite one on its own side, for no bound: the column stays int64
        # (written 0). An int literal keeps Polars' Int64 column Int64 and a Float64 one takes
        # it as a float; one pandas holds as float64 (float_int) keeps its missing values, and
        # the mark with them
        lower, upper = _as_int(lower, -math.inf), _as_int(upper, math.inf)
    bounds = [b for b in (lower, upper) if b is not None]
    code, dtype = column.code, column.dtype
    if not bounds:
        return derived_column(column, code, dtype=dtype)  # no bound: the values as they are
    kinds = {_bound_kind(b) for b in bounds}
    if column.dtype != "float" and ("float" in kinds or column.dtype == "int" and None in kinds):
        # Polars casts a bound to the column's type: a float bound on an Int64 column would be
        # truncated (a cap of 3.7 gives 3 where pandas gives 3.7)
        code, dtype = code.method("cast", emit.atom("pl.Float64")), "float"
        if "float" in kinds:
            ctx.lower("pandas makes the integer column float only where a value reaches a "
                      "float bound that is not whole; when none does it stays integer "
                      "(written 3 where Polars writes 3.0)", 0.95)
        else:
            ctx.lower("a bound the script computes, of a type porter does not know, on an "
                      "integer column: the column is made Float64 so that a float bound is "
                      "not truncated; pandas keeps int64 where the bound is a whole number "
                      "or no value reaches it (written 3 where Polars writes 3.0)", 0.9)
    elif column.dtype is None and None in kinds:
        ctx.lower("a bound the script computes on a column of unknown type: Polars takes a "
                  "float bound as an integer column's type (a cap of 3.7 gives 3 where pandas "
                  "gives 3.7)", 0.9)
    if any(isinstance(b, Column) for b in bounds):
        return _clip_per_row(column, code, dtype, lower, upper, ctx)
    args = [ctx.expr(b, column.frame) if b is not None else None for b in (lower, upper)]
    if lower is not None and upper is not None:
        args = _ordered_bounds(lower, upper, column, ctx)
    return derived_column(column, code.method("clip", *args), dtype=dtype)


def _clip_per_row(column: Column, code: Code, dtype: str | None, lower: Value | None,
                  upper: Value | None, ctx: RuleContext) -> Value:
    """s.clip(lower=df["m"]) of a float column, one bound a column of the same rows -> clip
    with that column as the bound, as a Float64 whose NaN is missing: pandas takes a missing
    (NaN) bound on a row for no bound there, as Polars takes a null one."""
    if dtype != "float" or lower is not None and upper is not None:
        raise Unsupported("bounds given per row of a column that is not known to be float, or "
                          "both bounds given")
    bound = lower if lower is not None else upper
    assert isinstance(bound, Column)
    if bound.dtype not in ("int", "float", None) or bound.frame.rows != column.frame.rows:
        raise Unsupported("bounds given per row: of another frame or of a type that is not a "
                          "number")
    if bound.dtype is None:
        ctx.lower("a bound column of a type porter does not know is taken as numbers", 0.95)
    per_row = ctx.expr(bound, column.frame).method("cast", emit.atom("pl.Float64")).method(
        "fill_nan", None)
    side = "lower_bound" if lower is not None else "upper_bound"
    return derived_column(column, code.method("clip", **{side: per_row}), dtype="float")


def _as_int(value: Value | None, no_bound: float) -> Value | None:
    """A bound of clip() on an int column: a whole float constant as the int it equals, a
    NaN or `no_bound` (inf for the upper bound) as None; anything else as it is."""
    if isinstance(value, Opaque) and isinstance(value.const, float) \
            and (value.const != value.const or value.const == no_bound):
        return None
    whole = whole_float(value) if value is not None else None
    return value if whole is None else Opaque(code=emit.atom(repr(whole)), const=whole)


def _bound_kind(value: Value) -> str | None:
    """"int" or "float" when a bound is known to be one, else None."""
    if isinstance(value, Opaque) and value.is_const:
        return "int" if isinstance(value.const, int) else "float" \
            if isinstance(value.const, float) else None
    if isinstance(value, Scalar) and value.pytype in ("int", "float"):
        return value.pytype
    return None


def _number_const(value: Value) -> bool:
    return isinstance(value, Opaque) and value.is_const and isinstance(value.const, (int, float)) \
        and not isinstance(value.const, bool)


def _ordered_bounds(lower: Value, upper: Value, column: Column, ctx: RuleContext) -> list[Code]:
    """pandas clips to the smaller and the larger of two single bounds (clip(3, 1) is
    clip(1, 3)); a missing (NaN) bound is no bound, which Polars' clip does too. Constants are
    ordered here, other values when the script runs: neither is moved when one is missing."""
    frame = column.frame
    if _number_const(lower) and _number_const(upper):
        low, high = lower.const, upper.const  # type: ignore[union-attr]
        if not (math.isnan(low) or math.isnan(high)) and low > high:
            lower, upper = upper, lower
        return [ctx.expr(lower, frame), ctx.expr(upper, frame)]
    numbers = column.dtype in ("int", "float", "bool") or column.dtype is None and all(
        _number_const(b) or isinstance(b, Scalar) and b.pytype in ("int", "float") for b in (lower, upper))
    if column.dtype is None and not numbers:
        ctx.lower("clip with two bounds computed at run time on a column of unknown type: a NaN "
                  "bound is no bound in pandas, but may be taken as the larger one when pandas "
                  "orders the two bounds here", 0.98)
    codes = []
    for bound in (lower, upper):
        code = ctx.expr(bound, frame)
        as_expr = _number_const(bound) or isinstance(bound, Scalar) and (
            bound.agg is not None and bound.agg.frame.rows == frame.rows
            or bound.expr is not None or bound.pytype == "float")
        if not as_expr:
            # a value of the script's (lo = s.quantile(0.9)): an expression, and its NaN no
            # bound (Polars takes NaN for the larger value)
            code = emit.pl("lit", code)
            code = code.method("fill_nan", None) if numbers else code
        codes.append(code)
    swapped = emit.binop(codes[0], ">", codes[1])
    return [emit.when(swapped, codes[1], codes[0]), emit.when(swapped, codes[0], codes[1])]


@rule("np.where")
def np_where(call: PandasCall, ctx: RuleContext) -> Value:
    """np.where(cond, a, b) -> pl.when(cond).then(a).otherwise(b).

    Handles: a condition that met a missing value takes the otherwise branch, as in pandas; a
    blank of a True/False column (NaN in pandas' object column) is true for numpy and takes
    the first branch (fill_null(True)); whole numbers in both branches are int64 as in numpy
    (pl.lit(n, dtype=pl.Int64): Polars would make them Int32, which wraps around in
    arithmetic); np.nan beside integers or True/False makes a float64 array (cast to Float64),
    whatever the condition.
    """
    if len(call.args) != 3 or call.kwargs:
        raise Unsupported("np.where with one argument returns positions")
    cond, then, other = call.args
    column = base_column(cond, then, other)
    _object_branches(then, other, ctx)
    frame = column.frame
    then_code, other_code = int64_branches(then, other, [_branch(v, ctx, frame) for v in (then, other)])
    test = ctx.expr(cond, frame)
    kind = value_dtype(cond)
    if isinstance(cond, Column) and kind in ("int", "float"):
        # numbers as conditions: numpy takes every number but 0 as true, NaN too
        test = emit.binop(test, "!=", 0)
        if kind == "float":
            test = test.method("fill_null", True)
    elif isinstance(cond, Column) and kind != "bool":
        raise Unsupported("a condition whose type porter does not know: numpy takes numbers "
                          "and text as true or false by their value")
    elif may_hold_nan(cond, unknown=True):
        # a blank of a True/False column is NaN in pandas, which numpy takes as true (a
        # column of another type fails in pl.when, filled or not)
        test = test.method("fill_null", True)
    code = emit.when(test, then_code, other_code)
    dtype = _common_dtype(then, other)
    nan = [v for v in (then, other) if isinstance(v, Opaque) and isinstance(v.const, float)
           and v.const != v.const]
    if nan and {value_dtype(v) for v in (then, other) if v not in nan} <= {"int", "bool"}:
        # numpy makes NaN beside integers (or True/False) a float64 array whatever the
        # condition: Polars' null beside Int64 would stay Int64 (written 5, pandas 5.0)
        code, dtype = code.method("cast", emit.atom("pl.Float64")), "float"
    return derived_column(column, code, dtype=dtype, name=None, others=[cond, then, other])


def _none_like(value: Value) -> bool:
    """None or pd.NA written in the script (pd.NA is evaluated as NaN: its spelling tells)."""
    return isinstance(value, Opaque) and value.is_const and (
        value.const is None or isinstance(value.const, float) and value.const != value.const
        and re.search(r"(^|\.)NA$", value.code.text) is not None)


def _object_branches(then: Value, other: Value, ctx: RuleContext) -> None:
    """numpy makes None (or pd.NA) beside numbers or True/False an object array of the values
    and None ([1, None, 3]), which pandas keeps as an object column: it writes 1 where an
    integer column with a missing value (float64) is written 1.0, lists None, and prints None
    where a float column has NaN. Beside text it makes a text column with a missing value,
    as Polars' String with null is."""
    if not any(_none_like(v) for v in (then, other)):
        return
    kinds = {value_dtype(v) for v in (then, other) if not _none_like(v)}
    if kinds & {"int", "bool"}:
        raise Unsupported("None (or pd.NA) beside whole numbers or True/False: numpy makes an "
                          "object array of the values and None ([1, None, 3], written 1), "
                          f"which no Polars type holds (it {MIXED_COLUMN})")
    if kinds - {"str"}:
        ctx.lower("None (or pd.NA) beside numbers: numpy makes an object array, which pandas "
                  "lists and prints as None where Polars' missing value is NaN (written the "
                  "same: 1.5 and an empty field), and writes 1 where an integer column with a "
                  "missing value is written 1.0", 0.9)


@rule("series.where", "series.mask")
def where_mask(call: PandasCall, ctx: RuleContext) -> Value:
    """s.where(cond, other) -> pl.when(cond).then(s).otherwise(other); s.mask(cond, other)
    the other way round.

    Handles: a condition that met a missing value is False (where replaces the value, mask
    keeps it), as pandas' comparisons give False; `other` left out is a missing value;
    `other` a value or a column of the same rows.
    Caveats: an int column given missing values stays Int64 with nulls in Polars (float64 in
    pandas when a value is left out, which depends on the data: written as floats while the
    nulls remain; a later fillna, dropna or filter is lowered to 0.9); a condition that is not a column (a callable, an array), `other` of another
    kind than the column (text into numbers) and True/False columns given missing values
    (an object column in pandas) are TODOs.
    """
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call, "cond", "other", positional=2)
    cond = call.arg("cond", 0)
    other = call.arg("other", 1, None)
    if not isinstance(cond, Column):
        raise Unsupported("a condition that is not a column of the frame (a function or an "
                          "array)")
    missing = other is None or isinstance(other, Opaque) and (
        other.const is None or isinstance(other.const, float) and other.const != other.const)
    if missing and column.dtype in ("bool", None):
        if column.dtype == "bool":
            raise Unsupported("a True/False column given missing values is an object column in "
                              "pandas")
        ctx.lower("the column type is not known: pandas makes a True/False column given "
                  "missing values an object column", 0.95)
    if not missing:
        kind = value_dtype(other)
        if isinstance(other, Opaque) and isinstance(other.const, str):
            kind = "str"
        numbers = {"int", "float"}
        if kind is not None and column.dtype is not None and kind != column.dtype \
                and not {kind, column.dtype} <= numbers:
            raise Unsupported(f"a {kind} value into a {column.dtype} column {MIXED_COLUMN}")
    if not missing and column.dtype in ("int", None) and column.float_int is None:
        other = _int_float_other(other, column, call.name, ctx)
    elif not missing and column.float_int is not None and value_dtype(other) == "float":
        # pandas holds the column as float64 when a value went missing, and 0.0 put in stays
        # a float there (Float64 here); with nothing missing it is int64, 0.0 put in an int
        ctx.lower(f"pandas holds the column as float64 when {column.float_int}, where a float "
                  "put in makes it Float64 here; when nothing was missing pandas keeps int64 "
                  "(written 3 where Polars writes 3.0)", 0.95)
    frame = column.frame
    # missing: False, as pandas' comparisons give it; a condition of pandas' nullable boolean
    # (a comparison of an Int64 column) holding <NA> replaces the value in both where() and
    # mask() (mask treats <NA> as True)
    test = ctx.expr(cond, frame).method(
        "fill_null", call.name == "mask" and cond.nullable_int == "boolean")
    kept = column.code
    replacement = emit.atom("None") if missing else _branch(other, ctx, frame)
    if call.name == "mask":
        code = emit.pl("when", test).method("then", replacement).method("otherwise", kept)
    elif missing:
        code = emit.when(test, kept)
    else:
        code = emit.when(test, kept, replacement)
    dtype = column.dtype if missing else _common_dtype(column, other)
    if not missing and {value_dtype(other), column.dtype} == {"int", "float"}:
        dtype = "float"
    result = derived_column(column, code, dtype=dtype, others=[cond, *([other] if not missing else [])])
    if missing and column.dtype == "int":
        # float64 in pandas when the condition leaves a value out (not when it keeps every
        # one): Polars keeps Int64 with nulls, which later steps read (lost_float_ints)
        result = replace(result, float_int=f"{call.name}() left a value missing")
    return result


def whole_float(value: Value) -> int | None:
    """A float constant that an int64 column holds without loss (0.0, -3.0, 1e6), as an int;
    None for anything else (2.5, NaN, inf, 1e30, an int, a column)."""
    if not (isinstance(value, Opaque) and isinstance(value.const, float)):
        return None
    number = value.const
    if math.isfinite(number) and number.is_integer() and -2**63 <= number < 2**63:
        return int(number)
    return None


def _int_float_other(other: Value, column: Column, method: str, ctx: RuleContext) -> Value:
    """The value where() / mask() puts into an int (or not known) column. pandas puts a float
    into its int64 column as an int when no value is lost (0.0 is 0: the column stays int64,
    written 0), and makes the column float64 only for a fraction (or a float column, a value
    computed when the script runs that is not whole) and only when the condition leaves a
    value out: a type that depends on the data."""
    whole = whole_float(other)
    if whole is not None:
        # an int literal: an Int64 column stays Int64 and a Float64 one takes it as a float
        # (its supertype), as pandas does with 0.0 in either
        return Opaque(code=emit.atom(repr(whole)), const=whole)
    fraction = isinstance(other, Opaque) and isinstance(other.const, float) \
        and math.isfinite(other.const)
    computed = column.dtype == "int" and (isinstance(other, Scalar) and other.pytype != "int"
                                          or isinstance(other, Column) and other.dtype != "int")
    if fraction or computed:
        what = "a fraction" if fraction else "a float it computes" if isinstance(other, Scalar) \
            else "a float column"
        ctx.lower(f"{method}() with {what} on {'an int' if column.dtype else 'a'} column: pandas "
                  "makes its int64 column float64 only when the condition leaves a value out, "
                  "and keeps int64 when none is (or the values it puts in are whole): written "
                  "3 where Polars writes 3.0", 0.95)
    return other


def _branch(value: Value, ctx: RuleContext, frame: Frame) -> Code:
    if isinstance(value, Opaque) and isinstance(value.const, str):
        return emit.pl("lit", value.const)
    if isinstance(value, Column):
        return ctx.bool_expr(value, frame)
    return ctx.expr(value, frame)


def int64_lit(value: object) -> Code:
    """A whole number as a column of its own (broadcast, or a branch of pl.when): pandas and
    numpy make it int64, Polars' pl.lit an Int32, where arithmetic wraps around without an
    error (50000 * 50000 is -1794967296)."""
    return emit.pl("lit", value, dtype=emit.atom("pl.Int64"))


def _is_whole_number(value: Value) -> bool:
    if isinstance(value, Opaque) and value.is_const:
        return isinstance(value.const, int) and not isinstance(value.const, bool)
    return isinstance(value, Scalar) and value.pytype == "int" and value.agg is None


def int64_branches(then: Value, other: Value, codes: list[Code]) -> list[Code]:
    """The branches of a choice between values (np.where, `a if c else b`), each given as
    `codes`: where no branch is a column (whose type a whole number takes on, as numpy's and
    Polars' both do) and none is a float, the first whole number is made Int64 (the other
    takes its type): the result is int64 as in numpy, not Polars' Int32."""
    values = (then, other)
    if any(isinstance(v, Column) for v in values) or any(
            isinstance(v, Opaque) and isinstance(v.const, float) for v in values):
        return codes
    for i, value in enumerate(values):
        if _is_whole_number(value):
            return [int64_lit(value.code) if j == i else code for j, code in enumerate(codes)]
    return codes


def _common_dtype(*values: Value) -> str | None:
    kinds = {value_dtype(v) for v in values}
    return kinds.pop() if len(kinds) == 1 else None



@rule("pd.eval")
def pd_eval(call: PandasCall, ctx: RuleContext) -> Value:
    """pd.eval("double_age = df.age * 2", target=df) -> pd.eval(..., target=<pandas frame>,
    local_dict={**locals(), "df": <pandas frame>}): stays pandas (a TODO that runs), with the
    frames it reads handed over.

    pandas looks the names of the text up in the script's variables when it runs: a frame
    there is a LazyFrame in the converted script, which has no attribute `age`. Each name of
    the text that holds a frame or a column is given to pandas as its pandas version through
    `local_dict=`, beside the script's other variables (`**locals()`: pandas reads the
    caller's globals as before).
    """
    ctx.reject_unknown(call, "expr", "parser", "engine", "local_dict", "global_dict",
                       "resolvers", "level", "target", "inplace", positional=1)
    text = call.const("expr", 0, None, kinds=(str,))
    if text is None:
        raise Unsupported("an expression that is not written out as text")
    if call.const("inplace", None, False) is not False:
        # pandas changes the target frame itself, which is a LazyFrame's copy here
        raise Unsupported("inplace=True changes the target frame: assign the result instead "
                          "(df = pd.eval(..., target=df))")
    if "resolvers" in call.kwargs or "local_dict" in call.kwargs or "global_dict" in call.kwargs:
        raise Unsupported("names given with resolvers=, local_dict= or global_dict=")
    try:
        names = sorted({n.id for n in ast.walk(ast.parse(text.strip())) if isinstance(n, ast.Name)})
    except SyntaxError:
        raise Unsupported("an expression porter cannot read") from None
    handed = {}
    for name in names:
        value = ctx.evaluate(cst.Name(name), {}) if ctx.evaluate is not None else None
        if isinstance(value, (Frame, Column)):
            handed[name] = to_pandas(value)
    args = [emit.lit(text)]
    for key, value in call.kwargs.items():
        if isinstance(value, (Frame, Column)):
            args.append(Code(f"{key}={to_pandas(value).text}"))
        else:
            args.append(Code(f"{key}={value.code.text}"))
    if handed:
        items = ", ".join(f"{emit.lit(name).text}: {code.text}" for name, code in handed.items())
        args.append(Code(f"local_dict={{**locals(), {items}}}"))
    ctx.needs_review("pd.eval stays pandas: the frames its text names are handed over "
                     "(local_dict=), as is target=; write the expression with pl.col")
    func = cst.Module([]).code_for_node(call.node.func) if isinstance(call.node, cst.Call) \
        else "pd.eval"
    return PandasValue(Code(f"{func}({', '.join(a.text for a in args)})"))


# df.div(s, axis=0) and its kin: the operator each writes
_ROW_WISE_OPS = {"div": "/", "truediv": "/", "divide": "/", "mul": "*", "multiply": "*",
                 "sub": "-", "subtract": "-", "add": "+"}
_BY_ROW = "_porter_by_row"


@rule(*(f"frame.{name}" for name in _ROW_WISE_OPS))
def frame_by_rows(call: PandasCall, ctx: RuleContext) -> Value:
    """wide.div(wide.sum(axis=1), axis=0) -> the Series in a column, then pl.exclude(keys) / it.

    mul / sub / add alike: each column of numbers with a Series of the frame's own rows, row by
    row, one expression over the columns.

    Handles: a pivoted table whose columns porter does not know (pivot_table, unstack, crosstab:
    every column but the keys holds numbers), or a frame whose columns are all known numbers;
    division value by value (a column over a column: no reciprocal), 0 / 0 missing, x / 0 inf,
    as pandas; inf - inf and inf * 0 made missing where floats take part.
    Caveats: axis="columns" (a Series lined up with the column labels), a Series of other rows
    (pandas aligns it on the labels), fill_value=, level= and text or date columns are TODOs.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "other", "axis", positional=2)
    if call.const("axis", 1, "columns", kinds=(int, str)) not in (0, "index", "rows"):
        raise Unsupported("axis='columns': pandas lines a Series up with the column labels")
    other = call.arg("other", 0)
    if not isinstance(other, Column) or other.dtype not in ("int", "float"):
        raise Unsupported("something other than a Series of numbers of the frame's own rows")
    by_row = ctx.expr(other, frame)  # a Series of other rows: pandas aligns it (a TODO)
    op = _ROW_WISE_OPS[call.name]
    pivoted, cells = number_cells(frame)
    if pivoted:
        values = emit.pl("exclude", *frame.index, _BY_ROW)
        kinds = {cells}
    elif frame.columns is not None:
        names = [c for c in frame.columns if c not in frame.index]
        kinds = {frame.dtype(c) for c in names}
        if not names or not kinds <= {"int", "float"}:
            raise Unsupported("columns that are not all known numbers")
        values = emit.col(names)
    else:
        raise Unsupported("the frame's columns are not known")
    if op == "/" or "float" in kinds or other.dtype == "float":
        kind: str | None = "float"
    elif kinds == {"int"}:
        kind = "int"
    else:
        raise Unsupported("cells whose type the data decides (int or float) with a whole number")
    result = emit.binop(values, op, emit.col(_BY_ROW))
    if kind == "float":
        result = result.method("fill_nan", None)  # 0 / 0, inf - inf: missing, as NaN in pandas
    code = frame.code.method("with_columns", by_row.method("alias", _BY_ROW)) \
        .method("with_columns", result).method("drop", _BY_ROW)
    if pivoted:
        return replace(derive(frame, code, same_rows=True), number_cells=(code.text, kind))
    return with_column_updates(frame, code, dict.fromkeys(names, kind))
