"""Compare one output of the original (pandas) script with the same output of the converted one.

Both sides are first turned into a plain Polars table by `normalize`, "the way a person reads a
table": what a reader of the two outputs would call the same data must compare equal, and
everything else must not. `compare` then checks the columns, the cells (floats within a tolerance)
and the row order, and says how the two differ when they do.
"""

from __future__ import annotations

import datetime as dt
import decimal
import math
import numbers
from collections.abc import Sequence

import polars as pl

from porter.verify.model import Comparison

#: Floats this close to each other are equal whatever their relative difference (see `compare`).
ABS_TOL = 1e-12
#: How many differing rows a `Comparison` shows.
ROWS_SHOWN = 5


# --------------------------------------------------------------------------------------------
# normalisation


def normalize(value: object) -> pl.DataFrame:
    """A plain Polars table holding what `value` (a pandas or Polars frame or series) shows.

    The rules, and why each is right for a verification:

    - A meaningful pandas index becomes columns: a named index or a MultiIndex (e.g. the group
      keys after `groupby` without `reset_index`) carries data the reader sees, and the converted
      side holds the same data as ordinary columns. Unnamed levels of a MultiIndex are named
      `level_0`, `level_1`... as `reset_index` names them. A default RangeIndex or an unnamed
      index of whole numbers is only row numbering and is dropped; so is an index level whose name is
      already a column (`set_index(..., drop=False)`), since the column holds the same values.
      An unnamed index of labels that are not whole numbers (the column names a `df.sum()`
      is indexed by, `describe`'s statistics) is data: a column "index", as `reset_index`
      names it.
    - MultiIndex columns are flattened by joining their non-empty parts with "_":
      `("kg", "sum")` -> `kg_sum`, `("city", "")` -> `city`. That is the name a Polars
      aggregation such as `pl.col("kg").sum().alias("kg_sum")` gives the same column.
    - Column names are strings (pandas' `0` -> `"0"`); Polars names are always strings.
      Repeated names (possible in pandas only) get `_1`, `_2`... so each column stays comparable.
    - NaN, None, NaT, pd.NA and null are all one "missing" value (null): pandas stores missing
      values as NaN/NaT/NA depending on the dtype, Polars as null, and they mean the same.
    - Numbers (ints, floats, decimals) become Float64: pandas turns an int column into float as
      soon as a value is missing, Polars keeps it int; the numbers are what matters. Booleans stay
      booleans (True is not the number 1.0 to a reader). Integers beyond 2**53 lose exactness.
    - Categoricals compare as their values (string categories -> String): the category set is a
      storage detail. pandas text (`str`, object of str) and Polars String/Categorical/Enum are
      all String.
    - Datetimes at microsecond precision (Polars' default unit; pandas' nanoseconds are
      truncated); timezone-naive ones as they are, tz-aware ones converted to UTC, so the same
      instants in different zones match while naive and aware values do not.
    - `datetime.date` objects (pandas object column) and Polars Date are Date.
    - A Series is a one-column table named after the Series, "0" when unnamed (as `to_frame`
      names it).
    - An object column holding mixed kinds of values is compared as the text of the values.
    """
    if isinstance(value, pl.LazyFrame):
        value = value.collect()
    if isinstance(value, pl.Series):
        value = value.to_frame(value.name or "0")
    if isinstance(value, pl.DataFrame):
        return pl.DataFrame([_normalize_series(s) for s in value.get_columns()])
    if _is_pandas(value):
        return _from_pandas(value)
    raise TypeError(f"cannot compare a {type(value).__name__} as a table")


def column_from_values(name: str, values: Sequence[object]) -> pl.Series:
    """A normalised column from plain Python values (a pandas object column, JSON values).

    The kind of the non-missing values decides the type: all bools -> Boolean, all numbers ->
    Float64, all str -> String, all datetimes -> Datetime (aware ones in UTC; naive and aware
    mixed -> text), all dates -> Date, all timedeltas -> Duration; anything else -> the text of
    each value (`str`), which is how a reader sees a cell of mixed content.
    """
    cells = [None if _is_missing(v) else v for v in values]
    kinds = {_kind(v) for v in cells if v is not None}
    if not kinds:
        return pl.Series(name, cells, dtype=pl.Null)
    kind = kinds.pop() if len(kinds) == 1 else "mixed"
    if kind == "bool":
        return pl.Series(name, [None if v is None else bool(v) for v in cells], dtype=pl.Boolean)
    if kind == "number":
        numbers = [None if v is None else float(v) for v in cells]  # type: ignore[arg-type]
        return pl.Series(name, numbers, dtype=pl.Float64).fill_nan(None)
    if kind == "str":
        return pl.Series(name, cells, dtype=pl.String)
    if kind == "date":
        return pl.Series(name, cells, dtype=pl.Date)
    if kind == "timedelta":
        return pl.Series(name, cells, dtype=pl.Duration("us"))
    if kind == "datetime":
        aware = {v.tzinfo is not None for v in cells if isinstance(v, dt.datetime)}
        if aware == {False}:
            return pl.Series(name, cells, dtype=pl.Datetime("us"))
        if aware == {True}:
            utc = [None if v is None else v.astimezone(dt.timezone.utc)  # type: ignore[union-attr]
                   for v in cells]
            return pl.Series(name, utc, dtype=pl.Datetime("us", "UTC"))
    return pl.Series(name, [None if v is None else str(v) for v in cells], dtype=pl.String)


def _normalize_series(s: pl.Series) -> pl.Series:
    dtype = s.dtype
    if dtype.is_numeric():
        return s.cast(pl.Float64).fill_nan(None)
    if isinstance(dtype, (pl.Categorical, pl.Enum)):
        return s.cast(pl.String)
    if isinstance(dtype, pl.Datetime):
        if dtype.time_zone is not None:
            s = s.dt.convert_time_zone("UTC")
        return s.dt.cast_time_unit("us")
    if isinstance(dtype, pl.Duration):
        return s.dt.cast_time_unit("us")
    if dtype == pl.Object:
        return column_from_values(s.name, s.to_list())
    return s


def _is_pandas(value: object) -> bool:
    return type(value).__module__.split(".")[0] == "pandas"


def _from_pandas(value: object) -> pl.DataFrame:
    import pandas as pd

    if isinstance(value, pd.Series):
        value = value.to_frame(0 if value.name is None else value.name)
    if not isinstance(value, pd.DataFrame):
        raise TypeError(f"cannot compare a pandas {type(value).__name__} as a table")
    names = [_column_name(label) for label in value.columns]
    columns: list[pl.Series] = []
    index = value.index
    if isinstance(index, pd.MultiIndex) or index.name is not None:
        for i, level in enumerate(index.names):
            name = f"level_{i}" if level is None else _column_name(level)
            if name not in names:
                columns.append(_from_pandas_values(name, index.get_level_values(i)))
    elif index.inferred_type not in ("integer", "empty") and "index" not in names:
        # labels that are not row numbers (the column names of df.isna().sum(), describe's
        # statistics) are data the reader sees: "index", as reset_index() names them
        columns.append(_from_pandas_values("index", index))
    for name, (_, column) in zip(names, value.items()):
        columns.append(_from_pandas_values(name, column))
    return pl.DataFrame(_unique_names(columns))


def _from_pandas_values(name: str, values: object) -> pl.Series:
    """One pandas column (Series or index level) as a normalised Polars column."""
    import pandas as pd

    dtype = values.dtype  # type: ignore[attr-defined]
    typed = getattr(dtype, "kind", "O") in "biufMm"  # numpy and nullable numbers, datetimes
    if typed or isinstance(dtype, (pd.StringDtype, pd.ArrowDtype)):
        try:
            return _normalize_series(pl.from_pandas(values).rename(name))  # type: ignore[arg-type]
        except Exception:  # an unusual extension type: fall back to its Python values
            pass
    # object, categorical (compared as its values), period, interval, complex...
    return column_from_values(name, pd.Series(values).astype(object).tolist())


def _column_name(label: object) -> str:
    if isinstance(label, tuple):  # a MultiIndex column: ("kg", "sum") -> "kg_sum"
        return "_".join(str(part) for part in label if part is not None and str(part) != "")
    return str(label)


def _unique_names(columns: list[pl.Series]) -> list[pl.Series]:
    seen: set[str] = set()
    out = []
    for column in columns:
        name, k = column.name, 0
        while name in seen:
            k += 1
            name = f"{column.name}_{k}"
        seen.add(name)
        out.append(column.rename(name))
    return out


def _is_missing(value: object) -> bool:
    if value is None or type(value).__name__ in ("NAType", "NaTType"):
        return True
    if isinstance(value, (float, decimal.Decimal)) or type(value).__module__ == "numpy":
        try:
            return bool(value != value)  # NaN, numpy NaT
        except (TypeError, ValueError):  # arrays
            return False
    return False


def _kind(value: object) -> str:
    if isinstance(value, bool) or (type(value).__module__ == "numpy"
                                   and type(value).__name__ in ("bool", "bool_")):
        return "bool"
    if isinstance(value, (numbers.Real, decimal.Decimal)):
        return "number"
    if isinstance(value, str):
        return "str"
    if isinstance(value, dt.datetime):  # before date: a datetime is a date
        return "datetime"
    if isinstance(value, dt.date):
        return "date"
    if isinstance(value, dt.timedelta):
        return "timedelta"
    return "other"


# --------------------------------------------------------------------------------------------
# comparison


def _row_numbers_as_labels(value: object) -> bool:
    """A pandas frame or Series whose index is one unnamed level of whole numbers (which
    normalize drops) and that has no column "index"."""
    if not _is_pandas(value) or not hasattr(value, "index"):
        return False
    index = value.index  # type: ignore[attr-defined]
    columns = getattr(value, "columns", ())
    return index.nlevels == 1 and index.name is None and "index" not in columns \
        and index.inferred_type in ("integer", "empty")


def compare(expected: object, actual: object, *, rtol: float = 1e-9, atol: float = ABS_TOL,
            ignore_order: bool = False) -> Comparison:
    """Compare the original side's output (`expected`) with the converted side's (`actual`).

    Both are normalised first (see `normalize`). Columns are matched by name, in any order; the
    names must be the same sets. Floats a, b match when both are missing, when a == b (so equal
    infinities match and 0.0 matches -0.0), or when both are finite and
    `abs(a - b) <= max(rtol * max(abs(a), abs(b)), atol)`: that is `math.isclose(a, b,
    rel_tol=rtol, abs_tol=atol)`. The small absolute tolerance (1e-12 by default) exists because
    a relative tolerance alone never lets 0.0 match anything, while summing in a different
    order (which the two libraries do) leaves residues like 5.6e-17 where the exact answer is 0;
    so 0.0 and 1e-300 match. Pass `atol=0` for a purely relative comparison.

    Rows are compared in order. If they only match as multisets the status is
    "same-unordered", or "same" with `ignore_order=True`. Otherwise the status is "different",
    with the count of differing cells and the first differing rows (row number, original row,
    converted row). With `ignore_order=True` the rows of each side that have no equal row on
    the other are paired in sorted order, and only those pairs are counted and shown (row
    numbers are the original side's).

    When the row counts differ, rows are matched as multisets (floats rounded to the
    tolerance); `differing_cells` counts the cells of the unmatched rows of both sides, and each
    shown row has the row of the side it is missing from as an empty tuple.
    """
    left, right = normalize(expected), normalize(actual)
    missing = [c for c in left.columns if c not in right.columns]
    extra = [c for c in right.columns if c not in left.columns]
    if extra == ["index"] and not missing and _row_numbers_as_labels(expected):
        # the converted frame carries pandas' row labels (the row numbers a filter or sort
        # left) as a column "index", where pandas holds them as its index: compared as data
        left = normalize(expected.reset_index())  # type: ignore[union-attr]
        extra = []
    if missing or extra:
        parts = ([f"missing in converted: {', '.join(missing)}"] if missing else []) + (
            [f"extra in converted: {', '.join(extra)}"] if extra else [])
        return Comparison("different", detail="columns differ; " + "; ".join(parts))
    right = right.select(left.columns)
    left, right, notes = _common_types(left, right)
    if left.height != right.height:
        return _unmatched_rows(left, right, rtol, atol, notes)
    matches = _cell_matches(left, right, rtol, atol)
    if _all_true(matches):
        return Comparison("same")
    left_sorted, right_sorted = _sorted(left, rtol, atol), _sorted(right, rtol, atol)
    sorted_matches = _cell_matches(left_sorted, right_sorted, rtol, atol)
    if _all_true(sorted_matches):
        if ignore_order:
            return Comparison("same", detail="same rows in a different order (order ignored)")
        return Comparison("same-unordered", detail="same rows in a different order")
    if ignore_order:
        return _different_unordered(left, right, rtol, atol, notes) or _different(
            left_sorted, right_sorted, sorted_matches, ["rows compared after sorting", *notes])
    return _different(left, right, matches, notes)


def _common_types(left: pl.DataFrame, right: pl.DataFrame
                  ) -> tuple[pl.DataFrame, pl.DataFrame, list[str]]:
    """Give each column one type on both sides. An all-missing (Null) column takes the other
    side's type; other mismatches (text vs number, date vs datetime...) compare as text, so
    they show as differing values, and the detail names the two types."""
    notes: list[str] = []
    left_out, right_out = [], []
    for a, b in zip(left.get_columns(), right.get_columns()):
        if a.dtype != b.dtype:
            if a.dtype == pl.Null:
                a = a.cast(b.dtype)
            elif b.dtype == pl.Null:
                b = b.cast(a.dtype)
            else:
                notes.append(f"column {a.name}: original {a.dtype}, converted {b.dtype}")
                a, b = _as_text(a), _as_text(b)
        left_out.append(a)
        right_out.append(b)
    return pl.DataFrame(left_out), pl.DataFrame(right_out), notes


def _as_text(s: pl.Series) -> pl.Series:
    try:
        return s.cast(pl.String)
    except Exception:  # nested types
        return pl.Series(s.name, [None if v is None else str(v) for v in s.to_list()],
                         dtype=pl.String)


def _cell_matches(left: pl.DataFrame, right: pl.DataFrame, rtol: float, atol: float
                  ) -> pl.DataFrame:
    """A table of booleans: does each cell of `left` match the same cell of `right`?"""
    width = left.width
    pairs = pl.DataFrame([*(s.alias(f"l{i}") for i, s in enumerate(left.get_columns())),
                          *(s.alias(f"r{i}") for i, s in enumerate(right.get_columns()))])
    return pairs.select(
        _cell_equal(pl.col(f"l{i}"), pl.col(f"r{i}"), left.dtypes[i], rtol, atol)
        .alias(left.columns[i]) for i in range(width))


def _cell_equal(a: pl.Expr, b: pl.Expr, dtype: pl.DataType, rtol: float, atol: float) -> pl.Expr:
    if dtype != pl.Float64:
        return a.eq_missing(b)
    both_missing = a.is_null() & b.is_null()
    # isclose only for finite values: rtol * inf would let inf match any number
    close = (a.is_finite() & b.is_finite()
             & ((a - b).abs() <= pl.max_horizontal(rtol * pl.max_horizontal(a.abs(), b.abs()),
                                                   pl.lit(atol))))
    return (both_missing | (a == b) | close).fill_null(False)


def _all_true(matches: pl.DataFrame) -> bool:
    return all(matches.select(pl.all().all()).row(0)) if matches.width else True


def _row_keys(frame: pl.DataFrame, rtol: float, atol: float) -> pl.DataFrame:
    """Sortable, joinable keys of the rows: floats rounded to about the tolerance (so values
    that match within it usually get the same key; -0.0 and 0.0 too), nested values as text."""
    digits = min(15, max(1, int(-math.log10(rtol)) - 1)) if rtol > 0 else None
    keys = []
    for i, s in enumerate(frame.get_columns()):
        if s.dtype == pl.Float64:
            rounded = s.round_sig_figs(digits) if digits is not None else s
            key = pl.select(pl.when(s.abs() <= atol).then(0.0).otherwise(rounded)).to_series()
        elif s.dtype.is_nested():
            key = _as_text(s)
        elif s.dtype == pl.Null:  # all missing: any type joins and sorts
            key = s.cast(pl.Boolean)
        else:
            key = s
        keys.append(key.alias(f"k{i}"))
    return pl.DataFrame(keys)


def _sorted(frame: pl.DataFrame, rtol: float, atol: float) -> pl.DataFrame:
    if frame.width == 0:
        return frame
    keys = _row_keys(frame, rtol, atol)
    order = keys.with_row_index("row").sort(keys.columns, nulls_last=True, maintain_order=True)
    return frame[order["row"]]


def _different(left: pl.DataFrame, right: pl.DataFrame, matches: pl.DataFrame,
               notes: list[str]) -> Comparison:
    cells = int(matches.select(pl.sum_horizontal((~pl.all()).sum())).item())
    bad = matches.with_row_index("row").filter(~pl.all_horizontal(pl.exclude("row")))["row"]
    columns = [c for c, ok in zip(matches.columns, matches.select(pl.all().all()).row(0)) if not ok]
    verb = "cell differs" if cells == 1 else "cells differ"
    detail = f"{cells} {verb} in {bad.len()} of {left.height} rows (columns: {', '.join(columns)})"
    if _rounding_halves(left, right, matches, columns):
        detail += (": each by one unit in the last decimal the column is rounded to, where a "
                   "sum or mean of floats landed on a rounding half (x.xx5) and was rounded "
                   "the other way (pandas and Polars add floats in different orders)")
    shown = tuple((int(i), left.row(int(i)), right.row(int(i))) for i in bad.head(ROWS_SHOWN))
    return Comparison("different", detail="; ".join([detail, *notes]), differing_cells=cells,
                      first_rows=shown)


def _rounding_halves(left: pl.DataFrame, right: pl.DataFrame, matches: pl.DataFrame,
                     columns: list[str]) -> bool:
    """Whether every differing cell is a float of a rounded column (every value of it, on both
    sides, has at most d decimals, 1 <= d <= 6) that differs by exactly one unit in its d-th
    decimal: the trace of floats added in another order, then rounded at a half."""
    for name in columns:
        i = matches.columns.index(name)
        a, b = left.to_series(i), right.to_series(i)
        if not (a.dtype.is_float() and b.dtype.is_float()):
            return False
        values = pl.concat([a, b]).drop_nulls().drop_nans()
        decimals = next((d for d in range(7) if values.is_empty() or (
            (values * 10 ** d - (values * 10 ** d).round()).abs().max() < 1e-6)), None)
        if not decimals:  # whole numbers: a count or an id one apart, not a rounded half
            return False
        wrong = ~matches.to_series(i)
        gaps = ((a.filter(wrong) - b.filter(wrong)).abs() * 10 ** decimals - 1).abs()
        if gaps.is_empty() or gaps.null_count() or gaps.max() > 1e-6:
            return False
    return True


def _different_unordered(left: pl.DataFrame, right: pl.DataFrame, rtol: float, atol: float,
                         notes: list[str]) -> Comparison | None:
    """Equal row counts, order ignored: the rows of each side with no equal row on the other
    are paired in sorted order and compared cell by cell. Sorting whole tables instead would
    shift every row after a changed sort key and count far more cells than changed."""
    lonely_left = _rows_without_match(left, right, rtol, atol)
    lonely_right = _rows_without_match(right, left, rtol, atol)
    if not lonely_left:  # matched only up to the rounding of the keys: let the caller sort
        return None
    # keep each row's number while sorting the leftovers
    rows_left = _sorted(left[lonely_left].with_columns(pl.Series("__row", lonely_left)), rtol, atol)
    rows_right = _sorted(right[lonely_right], rtol, atol)
    numbers = rows_left["__row"].to_list()
    rows_left = rows_left.drop("__row")
    matches = _cell_matches(rows_left, rows_right, rtol, atol)
    result = _different(rows_left, rows_right, matches, notes)
    detail = (f"order ignored; {len(lonely_left)} of {left.height} rows have no equal row on "
              f"the other side; paired in sorted order, " + result.detail)
    shown = tuple((numbers[i], a, b) for i, a, b in result.first_rows)
    return Comparison("different", detail=detail, differing_cells=result.differing_cells,
                      first_rows=shown)


def _unmatched_rows(left: pl.DataFrame, right: pl.DataFrame, rtol: float, atol: float,
                    notes: list[str]) -> Comparison:
    """Rows of each side with no equal row on the other, counting repeated rows."""
    lonely_left = _rows_without_match(left, right, rtol, atol)
    lonely_right = _rows_without_match(right, left, rtol, atol)
    detail = (f"original has {left.height} rows, converted has {right.height}; "
              f"{len(lonely_left)} original rows and {len(lonely_right)} converted rows "
              "have no match on the other side")
    rows = sorted([(i, left.row(i), ()) for i in lonely_left[:ROWS_SHOWN]]
                  + [(i, (), right.row(i)) for i in lonely_right[:ROWS_SHOWN]],
                  key=lambda r: (r[0], r[1] == ()))
    return Comparison("different", detail="; ".join([detail, *notes]),
                      differing_cells=(len(lonely_left) + len(lonely_right)) * left.width,
                      first_rows=tuple(rows[:ROWS_SHOWN]))


def _rows_without_match(frame: pl.DataFrame, other: pl.DataFrame, rtol: float, atol: float
                        ) -> list[int]:
    if frame.width == 0:
        return list(range(max(0, frame.height - other.height)))
    keys, other_keys = _row_keys(frame, rtol, atol), _row_keys(other, rtol, atol)
    on = [*keys.columns, "nth"]

    def numbered(k: pl.DataFrame) -> pl.DataFrame:  # the n-th copy of a row matches the n-th
        return k.with_row_index("row").with_columns(
            pl.int_range(pl.len()).over(keys.columns).alias("nth"))

    lonely = numbered(keys).join(numbered(other_keys).drop("row"), on=on, how="anti",
                                 nulls_equal=True)
    return sorted(lonely["row"].to_list())
