"""pandas reader options and their Polars counterparts, shared by the io rules and the schema
reader (`--data`)."""

from __future__ import annotations

from typing import Any

import polars as pl

from porter.emit import code as emit
from porter.emit.code import Code

# pandas' default missing-value tokens (sorted(pandas._libs.parsers.STR_NA_VALUES), pandas 3.1).
# Polars only treats the empty field as missing, so every scan lists them.
PANDAS_NA_TOKENS = ["", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
                    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null"]
NA_CONSTANT = "PANDAS_NA_VALUES"
# An expression, defined once at the top of a converted script, that writes every datetime
# column the way pandas' to_csv does (decided per column from the data).
CSV_DATETIMES_CONSTANT = "PANDAS_CSV_DATETIMES"
CSV_DATETIMES_DEFINITION = """\
# Datetime columns as pandas' to_csv writes them: dates only when every time in the column is
# midnight, no fraction of a second when none has one, milliseconds when they are enough.
PANDAS_CSV_DATETIMES = (
    pl.when((pl.selectors.datetime() == pl.selectors.datetime().dt.truncate("1d")).all())
    .then(pl.selectors.datetime().dt.strftime("%Y-%m-%d"))
    .when((pl.selectors.datetime().dt.microsecond() == 0).all())
    .then(pl.selectors.datetime().dt.strftime("%Y-%m-%d %H:%M:%S"))
    .when((pl.selectors.datetime().dt.microsecond() % 1000 == 0).all())
    .then(pl.selectors.datetime().dt.strftime("%Y-%m-%d %H:%M:%S%.3f"))
    .otherwise(pl.selectors.datetime().dt.strftime("%Y-%m-%d %H:%M:%S%.6f"))
)
"""

# The same for datetime columns with a time zone, applied first (they are text when
# PANDAS_CSV_DATETIMES runs): pandas writes their offset (+00:00) and always the time.
CSV_ZONED_DATETIMES_CONSTANT = "PANDAS_CSV_ZONED_DATETIMES"
CSV_ZONED_DATETIMES_DEFINITION = """\
# Datetime columns with a time zone as pandas' to_csv writes them: the time always, then the
# offset (+01:00); no fraction of a second when none has one, milliseconds when they are enough.
PANDAS_CSV_ZONED_DATETIMES = (
    pl.when((pl.selectors.datetime(time_zone="*").dt.microsecond() == 0).all())
    .then(pl.selectors.datetime(time_zone="*").dt.strftime("%Y-%m-%d %H:%M:%S%:z"))
    .when((pl.selectors.datetime(time_zone="*").dt.microsecond() % 1000 == 0).all())
    .then(pl.selectors.datetime(time_zone="*").dt.strftime("%Y-%m-%d %H:%M:%S%.3f%:z"))
    .otherwise(pl.selectors.datetime(time_zone="*").dt.strftime("%Y-%m-%d %H:%M:%S%.6f%:z"))
)
"""


def datetime_text(time: Code) -> Code:
    """One datetime column's values as pandas' astype(str) writes them: the same choice as
    PANDAS_CSV_DATETIMES above makes for every datetime column of a write (keep the two in
    step), decided from the whole column. A column with a time zone is not told apart here
    (its offset is left out), where a write applies PANDAS_CSV_ZONED_DATETIMES first."""
    dt = time.attr("dt")
    midnight = emit.binop(time, "==", dt.method("truncate", "1d")).method("all")
    seconds = emit.binop(dt.method("microsecond"), "==", 0).method("all")
    millis = emit.binop(emit.binop(dt.method("microsecond"), "%", 1000), "==", 0).method("all")
    return (emit.pl("when", midnight).method("then", dt.method("to_string", "%Y-%m-%d"))
            .method("when", seconds).method("then", dt.method("to_string", "%Y-%m-%d %H:%M:%S"))
            .method("when", millis).method("then", dt.method("to_string", "%Y-%m-%d %H:%M:%S%.3f"))
            .method("otherwise", dt.method("to_string", "%Y-%m-%d %H:%M:%S%.6f")))

# An expression, defined once at the top of a converted script, that writes every duration
# column the way pandas' to_csv writes a timedelta column (decided per column from the data).
CSV_DURATIONS_CONSTANT = "PANDAS_CSV_DURATIONS"
CSV_DURATIONS_DEFINITION = """\
# Duration columns as pandas' to_csv writes them: "2 days" when every value is a whole number
# of days, else "-1 days +23:00:00", with microseconds when one value has them.
PANDAS_CSV_DURATIONS = (
    pl.when((pl.selectors.duration().dt.total_microseconds() % 86_400_000_000 == 0).all())
    .then(
        (pl.selectors.duration().dt.total_microseconds() // 86_400_000_000).cast(pl.String)
        + " days"
    )
    .otherwise(
        (pl.selectors.duration().dt.total_microseconds() // 86_400_000_000).cast(pl.String)
        + pl.when(pl.selectors.duration().dt.total_microseconds() < 0)
        .then(pl.lit(" days +"))
        .otherwise(pl.lit(" days "))
        + (pl.selectors.duration().dt.total_microseconds() % 86_400_000_000 // 3_600_000_000)
        .cast(pl.String).str.zfill(2)
        + ":"
        + (pl.selectors.duration().dt.total_microseconds() % 3_600_000_000 // 60_000_000)
        .cast(pl.String).str.zfill(2)
        + ":"
        + (pl.selectors.duration().dt.total_microseconds() % 60_000_000 // 1_000_000)
        .cast(pl.String).str.zfill(2)
        + pl.when((pl.selectors.duration().dt.total_microseconds() % 1_000_000 == 0).all())
        .then(pl.lit(""))
        .otherwise(
            "." + (pl.selectors.duration().dt.total_microseconds() % 1_000_000)
            .cast(pl.String).str.zfill(6)
        )
    )
)
"""

def duration_text(duration: Code) -> Code:
    """One duration column's values as pandas' astype(str) writes them: the text
    PANDAS_CSV_DURATIONS writes for every duration column of a write ("1 days" when every
    value is whole days, else "0 days 02:30:00"), decided from the whole column."""
    body = CSV_DURATIONS_DEFINITION.split("PANDAS_CSV_DURATIONS = ", 1)[1].strip()
    column = duration.text if duration.prec >= emit.ATOM and "\n" not in duration.text \
        else f"({duration.text})"
    return Code(body.replace("pl.selectors.duration()", column))


# An expression, defined once at the top of a converted script, that writes every integer
# column the way pandas' to_csv does: pandas holds an integer column that has a missing value
# as floats, and writes 2024.0 (decided per column from the data).
CSV_INTS_CONSTANT = "PANDAS_CSV_INTS"
CSV_INTS_DEFINITION = """\
# Integer columns as pandas' to_csv writes them: one holding a missing value is float in
# pandas (2024.0), one without stays integer (2024).
PANDAS_CSV_INTS = (
    pl.when(pl.selectors.integer().null_count() > 0)
    .then(pl.selectors.integer().cast(pl.Float64).cast(pl.String))
    .otherwise(pl.selectors.integer().cast(pl.String))
)
"""

# An expression, defined once at the top of a converted script, that writes every float
# column the way pandas' to_csv does: Python's repr, where Polars writes 0.00005 for 5e-05 and
# 1.5e-7 for 1.5e-07 (the digits are the same shortest ones; only the layout differs, for
# magnitudes below 1e-4 and exponents of one digit). NaN is an empty field, as pandas writes it.
CSV_FLOATS_CONSTANT = "PANDAS_CSV_FLOATS"
# Polars' text of a float made Python's repr (pattern, replacement), in this order
FLOAT_REPR = ((r"e-(\d)$", "e-0${1}"),
              (r"^(-?)0\.0000(\d)$", "${1}${2}e-05"),
              (r"^(-?)0\.0000(\d)(\d+)$", "${1}${2}.${3}e-05"))
CSV_FLOATS_DEFINITION = (
    "# Float columns as pandas' to_csv writes them (Python's repr): 5e-05 and 1.5e-07, where Polars\n"
    "# writes 0.00005 and 1.5e-7; NaN as an empty field. Only values below 0.0001 (other than 0)\n"
    "# need the replacements, and only they are given them.\n"
    "def pandas_csv_floats(values):\n"
    "    text = values.fill_nan(None).cast(pl.String)\n"
    "    small = (values.abs() < 1e-4) & (values != 0)\n"
    "    if not small.any():\n"
    "        return text\n"
    "    repr_text = (\n"
    "        text.filter(small)\n"
    + "".join(f'        .str.replace(r"{pattern}", "{text}")\n' for pattern, text in FLOAT_REPR)
    + "    )\n"
    "    return text.scatter(small.arg_true(), repr_text)\n"
    "\n"
    "\n"
    "PANDAS_CSV_FLOATS = pl.selectors.float().map_batches(\n"
    "    pandas_csv_floats, return_dtype=pl.String, is_elementwise=True,\n"
    ")\n")


def float_text(number: Code) -> Code:
    """One float column's values as pandas' astype(str) writes them: Python's repr (5e-05,
    1.5e-07), with PANDAS_CSV_FLOATS' replacements (FLOAT_REPR); NaN is missing."""
    code = number.method("fill_nan", None).method("cast", emit.atom("pl.String"))
    for pattern, text in FLOAT_REPR:
        code = code.attr("str").method("replace", pattern, text)
    return code


# An expression, defined once at the top of a converted script, that writes every column of
# lists of text the way pandas' to_csv writes a Python list: ['a', "it's"], escaped as repr.
CSV_LISTS_CONSTANT = "PANDAS_CSV_LISTS"
CSV_LISTS_DEFINITION = """\
# Columns of lists of text as pandas' to_csv writes them: Python's repr of the list; a missing
# text in a list is NaN in pandas (agg(list) of a text column).
PANDAS_CSV_LISTS = pl.format(
    "[{}]",
    pl.selectors.by_dtype(pl.List(pl.String))
    .list.eval(
        pl.when(pl.element().is_null())
        .then(pl.lit("nan"))
        .when(
            pl.element().str.contains("'", literal=True)
            & ~pl.element().str.contains('"', literal=True),
        )
        .then(pl.format('"{}"', pl.element().str.replace_many(
            ["\\\\", "\\n", "\\t", "\\r"], ["\\\\\\\\", "\\\\n", "\\\\t", "\\\\r"])))
        .otherwise(pl.format("'{}'", pl.element().str.replace_many(
            ["\\\\", "\\n", "\\t", "\\r", "'"], ["\\\\\\\\", "\\\\n", "\\\\t", "\\\\r", "\\\\'"])))
    )
    .list.join(", "),
)
"""

# An expression, defined once at the top of a converted script, that writes every column of
# lists of numbers or True/False the way pandas' to_csv writes a Python list: str(list).
CSV_NUMBER_LISTS_CONSTANT = "PANDAS_CSV_NUMBER_LISTS"
CSV_NUMBER_LISTS_DEFINITION = """\
# Columns of lists of numbers or True/False as pandas' to_csv writes them: Python's str of the
# list ([1, 2], [1.5, nan, 1e-05], [True]); a missing float in a list is NaN in pandas.
PANDAS_CSV_NUMBER_LISTS = pl.selectors.by_dtype(
    pl.List(pl.Int8), pl.List(pl.Int16), pl.List(pl.Int32), pl.List(pl.Int64),
    pl.List(pl.UInt8), pl.List(pl.UInt16), pl.List(pl.UInt32), pl.List(pl.UInt64),
    pl.List(pl.Float64), pl.List(pl.Boolean),
).map_elements(
    lambda values: str(
        [float("nan") if v is None and values.dtype == pl.Float64 else v for v in values]
    ),
    return_dtype=pl.String,
)
"""

# A function, defined once at the top of a converted script, that gives a row to the script's
# own row function as pandas' apply(axis=1) gives it: a missing value is NaN.
ROW_FUNCTION = "pandas_row"
ROW_DEFINITION = """\
def pandas_row(row):
    \"\"\"A row of the columns a function reads, as pandas' apply(axis=1) passes it: a missing
    value is NaN (a float), not None.\"\"\"
    return {name: float("nan") if value is None else value for name, value in row.items()}
"""

# A function, defined once at the top of a converted script, that divides as pandas divides.
DIVIDE_FUNCTION = "pandas_div"
DIVIDE_DEFINITION = """\
def pandas_div(numerator, divisor):
    \"\"\"numerator / divisor, each value divided as pandas divides it: Polars multiplies by the
    reciprocal of a single divisor, which can be one binary digit off the quotient (and a later
    round() then goes the other way).\"\"\"
    return numerator / (numerator.is_null() * 0 + divisor)
"""

# A function, defined once at the top of a converted script, that computes x // d and x % d
# of floats as pandas does (numpy's floor_divide and remainder).
FLOAT_DIVMOD_FUNCTION = "pandas_float_divmod"
FLOAT_DIVMOD_DEFINITION = """\
def pandas_float_divmod(numerator, divisor, remainder=False):
    \"\"\"numerator // divisor (remainder=True: numerator % divisor) of floats as pandas computes
    them, with numpy: the floor of the exact quotient and the exact remainder (1.0 // 0.1 is
    9.0 and 1.0 % 0.1 is 0.09999999999999995, where Polars floors the rounded quotient: 10.0,
    and 1.0 - 0.1 * 10.0 is 0.0). Missing values stay missing, and so does a NaN the division
    makes (0.0 // 0.0); x // 0.0 is inf.\"\"\"

    def compute(parts):
        import numpy as np

        numbers, divisors = (column.to_numpy() for column in parts.struct.unnest().get_columns())
        with np.errstate(all="ignore"):
            values = (np.remainder if remainder else np.floor_divide)(numbers, divisors)
        return pl.Series(values, dtype=pl.Float64).fill_nan(None)

    divisor = divisor if isinstance(divisor, pl.Expr) else pl.lit(divisor)
    # the result keeps the numerator's name, as Polars' // does
    return pl.struct(numerator, divisor.alias("_porter_divisor")).map_batches(
        compute, return_dtype=pl.Float64, is_elementwise=True)
"""

# A function, defined once at the top of a converted script, that computes a quantile as
# pandas does (numpy's linear interpolation, to the last binary digit).
QUANTILE_FUNCTION = "pandas_quantile"
QUANTILE_DEFINITION = """\
def pandas_quantile(column, q):
    \"\"\"The q quantile of the column's values as pandas computes it (numpy's linear
    interpolation a + (b - a) * t, to the last binary digit and the sign of a zero: Polars'
    quantile can be one digit off, which moves a value sitting on a bin's edge into the next
    bin, and returns -0.0 where numpy's sum gives 0.0).\"\"\"
    count = column.count()
    position = (count.cast(pl.Float64) - 1) * q
    below = position.floor().cast(pl.Int64)
    last = count.cast(pl.Int64) - 1
    # numpy at the last value (q=1, or one value) takes it twice with weight position + 1,
    # which gives the sign of a zero as numpy gives it (-0.0 alone stays -0.0; else 0.0)
    t = pl.when(position >= last.cast(pl.Float64)).then(position + 1).otherwise(position - below)
    # the two values around the position, found by selection (no sort): below it, and above
    # it (the same value where the position falls on one)
    a = column.drop_nulls().quantile(q, "lower")
    b = column.drop_nulls().quantile(q, "higher")
    # where the position falls on a value numpy also reads the next one: NaN when that one
    # is inf or the value itself is -inf (inf * 0)
    infinite = ((column == float("inf")).sum() >= last - below) \\
        | ((column == float("-inf")).sum() >= below + 1)
    return (
        pl.when((t == 0) & (below < last) & infinite).then(a + float("nan"))
        .when(t >= 0.5).then(b - (b - a) * (1 - t))
        .otherwise(a + (b - a) * t)
    )
"""

# A function, defined once at the top of a converted script, that numbers the bins of
# pd.qcut(..., labels=False, duplicates="drop") as pandas does (over the distinct edges).
QCUT_NUMBERS_FUNCTION = "pandas_qcut_numbers"
QCUT_NUMBERS_DEFINITION = """\
def pandas_qcut_numbers(column, edges):
    \"\"\"The bin numbers pd.qcut(..., labels=False, duplicates="drop") gives: pandas keeps
    each edge once and numbers a value by the distinct edges below it (a value on the lowest
    edge is in bin 0); a value below the lowest edge or above the highest, or missing, has
    none, and with one distinct edge no value has one. The edges do not decrease: an edge is
    distinct where it differs from the one before.\"\"\"
    distinct = [pl.lit(True)] + [high != low for low, high in zip(edges, edges[1:])]
    # (a missing value compares as null, which the sum leaves out: it has no edge below it)
    below = pl.sum_horizontal([((edge < column) & new).cast(pl.Int64)
                               for edge, new in zip(edges, distinct)])
    count = pl.sum_horizontal([new.cast(pl.Int64) for new in distinct])
    position = pl.when(column == edges[0]).then(1).otherwise(below)
    return (
        pl.when((position == 0) | (position == count)).then(None)
        .otherwise(position - 1)
        .cast(pl.Int64)
    )
"""

# A function, defined once at the top of a converted script, that computes describe()'s
# quartiles as pandas does: numpy's percentile of each column's values, one pass for all three
# (an expression of Polars' lower and higher quantiles computes each of them several times).
PERCENTILES_FUNCTION = "pandas_percentiles"
PERCENTILES_DEFINITION = """\
def pandas_percentiles(column, qs):
    \"\"\"The quantiles qs of the column's values as pandas computes them: numpy's percentile
    of the values present (linear interpolation, to the last binary digit and the sign of a
    zero), a row each; missing where the column holds no value.\"\"\"
    import numpy as np

    def percentiles(values):
        present = values.drop_nulls().cast(pl.Float64).to_numpy()
        if not len(present):
            return pl.Series([None] * len(qs), dtype=pl.Float64)
        return pl.Series(np.percentile(present, [q * 100 for q in qs]), dtype=pl.Float64)

    return column.map_batches(percentiles, return_dtype=pl.Float64)
"""

# A function, defined once at the top of a converted script, that gives a pivoted table the
# types pandas' unstack gives it: one missing cell anywhere makes the whole block float.
UNSTACKED_FUNCTION = "pandas_unstacked"
UNSTACKED_DEFINITION = """\
def pandas_unstacked(table, keys):
    \"\"\"The pivoted table with pandas' cell types: pandas turns every cell float when one
    combination of keys has no value (its NaN), and keeps integers when none is missing.\"\"\"
    if any(column.has_nulls() for column in table.drop(keys).iter_columns()):
        return table.with_columns(pl.exclude(keys).cast(pl.Float64))
    return table
"""

# A function, defined once at the top of a converted script, that adds pivot_table's margins
# (margins=True) to a pivoted table of one or more index keys and one columns key, as pandas
# adds them.
MARGINS_FUNCTION = "pandas_pivot_margins"
MARGINS_DEFINITION = """\
def pandas_pivot_margins(table, frame, index, columns, values, total, name="All", fill_value=None,
                         group_sums=None, mean=False):
    \"\"\"pivot_table(margins=True): a last column `name` with each row's total and a last row
    with each column's total and the grand total, each `total` (the aggregation of `values`)
    over the rows of `frame` where no key and not the value is missing, as pandas computes
    them. `index` is one key or a list of keys: the last row holds `name` in the first and ""
    in the others, as pandas labels it. Floats (`group_sums` given, pandas_group_sums): each
    row's and column's total is added as pandas' groupby adds it (numpy's sum where those
    rows come sorted by the keys, else a compensated sum in row order; `mean`: over the
    count), and `total` is the grand total (pandas' Series.sum or mean). A column without a
    total gets `fill_value` in the last row; a row without one keeps its total missing; an
    integer column holding a missing value becomes float, as in pandas. A table without rows
    stays as it is.\"\"\"
    keys = [index] if isinstance(index, str) else list(index)
    if table.is_empty():
        return table
    if any((table[key] == name).any() for key in keys) or name in table.drop(keys).columns:
        raise ValueError(f'Conflicting name "{name}" in margins')
    kept = frame.drop_nulls([*keys, columns, values])

    def totals(by, alias):
        if group_sums is None:
            return kept.group_by(by).agg(total.alias(alias))
        # pandas adds a group's floats one of two ways, chosen by how the rows come
        ordered = pl.col(by[0]).is_sorted() if len(by) == 1 else pl.struct(by).is_sorted()
        return (
            kept.select(*by, pl.col(values).alias(alias), ordered.alias("_porter_in_key_order"))
            .group_by(by).agg(pl.col(alias), pl.col("_porter_in_key_order").first())
            .select(*by, group_sums(pl.col(alias), mean=mean,
                                    in_key_order=pl.col("_porter_in_key_order")))
        )

    per_row = totals(keys, name)
    per_column = totals([columns], values).sort(columns).with_columns(pl.col(columns).cast(pl.String))
    grand = kept.select(total.alias(name))
    per_row, per_column, grand = pl.collect_all([per_row, per_column, grand])
    last = per_column.transpose(column_names=columns)
    absent = [c for c in table.columns if c not in keys and c not in last.columns]
    labels = pl.DataFrame({key: [name if i == 0 else ""] for i, key in enumerate(keys)})
    last = pl.concat([
        labels, last.with_columns(pl.lit(fill_value).alias(c) for c in absent), grand,
    ], how="horizontal")
    table = pl.concat([
        table.join(per_row, on=keys, how="left", maintain_order="left"),
        last.select(table.columns + [name]),
    ], how="vertical_relaxed")
    return table.with_columns(
        pl.col(c).cast(pl.Float64) for c, t in table.schema.items()
        if t.is_integer() and table[c].has_nulls()
    )
"""

# A function, defined once at the top of a converted script, that writes the date key of a
# pivot's groups as the text the script names the pivoted columns by next.
DATES_AS_TEXT_FUNCTION = "pandas_dates_as_text"
DATES_AS_TEXT_DEFINITION = """\
def pandas_dates_as_text(groups, key, fmt):
    \"\"\"The groups of a pivot with their date `key` written with the strftime format `fmt`
    (Polars' to_string of each date): the names the script gives the pivoted columns next
    (df.columns = df.columns.strftime(fmt)). Two dates written alike would make pandas keep
    two columns of one name, which a Polars frame cannot hold: that stops here.\"\"\"
    dates = groups.get_column(key).unique()
    if dates.dt.to_string(fmt).n_unique() != dates.len():
        raise ValueError(f"two dates are written alike with {fmt!r}: pandas keeps two columns "
                         "of one name, a Polars frame cannot")
    return groups.with_columns(pl.col(key).dt.to_string(fmt))
"""

# A function, defined once at the top of a converted script, that adds crosstab's margins
# (margins=True) to a table of counts of one index key, as pandas adds them.
COUNT_MARGINS_FUNCTION = "pandas_count_margins"
COUNT_MARGINS_DEFINITION = """\
def pandas_count_margins(table, key, name="All"):
    \"\"\"crosstab(margins=True) of counts: a last column `name` with each row's total and a
    last row `name` with each column's total, as pandas adds them; pandas raises when a key
    already holds that name. A table without rows stays as it is.\"\"\"
    if table.is_empty():
        return table
    if (table[key] == name).any() or name in table.drop(key).columns:
        raise ValueError(f'Conflicting name "{name}" in margins')
    table = table.with_columns(pl.sum_horizontal(pl.exclude(key)).alias(name))
    return pl.concat([table, table.select(pl.lit(name).alias(key), pl.exclude(key).sum())])
"""

# A function, defined once at the top of a converted script, that counts an Enum column (a
# pandas Categorical) as pandas' value_counts does: every category, those no row holds included.
CATEGORY_COUNTS_FUNCTION = "pandas_category_counts"
CATEGORY_COUNTS_DEFINITION = """\
def pandas_category_counts(frame, name):
    \"\"\"How many rows hold each category of the Enum column `name`, as pandas counts a
    Categorical: every category in the categories' order, one no row holds counted 0, then the
    missing values when the frame has any.\"\"\"
    categories = frame.collect_schema()[name].categories
    counts = frame.group_by(name).agg(pl.len().cast(pl.Int64).alias("count"))
    every = pl.LazyFrame({name: categories}).cast({name: pl.Enum(categories)})
    return pl.concat([
        every.join(counts, on=name, how="left", maintain_order="left")
        .with_columns(pl.col("count").fill_null(0)),
        counts.filter(pl.col(name).is_null()),
    ])
"""

# A function, defined once at the top of a converted script, that sorts rows as pandas'
# sort_values by one column does (numpy's quicksort: tied rows do not keep their order).
SORT_FUNCTION = "pandas_sort_values"
SORT_DEFINITION = """\
def pandas_sort_values(frame, by, descending=False, nulls_last=True):
    \"\"\"The frame sorted by one column (a name or an expression) in the order pandas'
    sort_values gives: pandas sorts numbers, True/False and dates with numpy's quicksort, which
    does not keep tied rows in their order (Polars' sort does); missing values (NaN too) come
    first or last, in their order. Text is sorted stably by pandas, as by Polars.\"\"\"

    def positions(values):
        # each row's position in pandas' order
        if values.dtype.is_float():
            values = values.fill_nan(None)  # NaN is missing to pandas
        if not (values.dtype.is_numeric() or values.dtype in (
                pl.Boolean, pl.Date, pl.Datetime, pl.Duration)):
            rank = values.rank("ordinal", descending=descending).cast(pl.Int64)
            missing = values.is_null().cum_sum().cast(pl.Int64)
            if nulls_last:
                return rank.fill_null(missing + values.len() - values.null_count())
            return (rank + values.null_count()).fill_null(missing)
        import numpy as np

        # the values as pandas holds them: integers with a missing value are floats, and
        # True/False with a missing value are objects (each is sorted another way by numpy)
        numbers = values.drop_nulls().to_numpy()
        if values.dtype.is_integer() and values.has_nulls():
            numbers = numbers.astype(np.float64)
        elif values.dtype == pl.Boolean and values.has_nulls():
            numbers = numbers.astype(object)
        rows = np.flatnonzero(values.is_not_null().to_numpy())
        if descending:  # as pandas' nargsort: reversed, sorted, reversed again
            order = rows[::-1][numbers[::-1].argsort(kind="quicksort")][::-1]
        else:
            order = rows[numbers.argsort(kind="quicksort")]
        missing = np.flatnonzero(values.is_null().to_numpy())
        order = np.concatenate([order, missing] if nulls_last else [missing, order])
        key = np.empty(len(order), dtype=np.int64)
        key[order] = np.arange(len(order))
        return pl.Series(values.name, key)

    # a column of its own: Polars merges consecutive sorts, and would compute the positions
    # from the rows before an earlier sort
    by = pl.col(by) if isinstance(by, str) else by
    return (
        frame.with_columns(by.map_batches(positions, return_dtype=pl.Int64).alias("_pandas_order"))
        .sort("_pandas_order")
        .drop("_pandas_order")
    )
"""

# dtype spellings in read_csv(dtype=...) / astype(...) → (Polars dtype code, porter dtype name)
DTYPES: dict[str, tuple[str, str]] = {
    "str": ("pl.String", "str"), "string": ("pl.String", "str"), "object": ("pl.String", "str"),
    "int": ("pl.Int64", "int"), "int64": ("pl.Int64", "int"), "Int64": ("pl.Int64", "int"),
    "int32": ("pl.Int32", "int"), "Int32": ("pl.Int32", "int"),
    "float": ("pl.Float64", "float"), "float64": ("pl.Float64", "float"),
    "Float64": ("pl.Float64", "float"), "float32": ("pl.Float32", "float"),
    "bool": ("pl.Boolean", "bool"), "boolean": ("pl.Boolean", "bool"),
    "category": ("pl.Categorical", "category"),
    "datetime64[ns]": ("pl.Datetime(\"ns\")", "datetime"),
    "datetime64[us]": ("pl.Datetime(\"us\")", "datetime"),
}
PYTHON_TYPES = {"str": "str", "int": "int", "float": "float", "bool": "bool"}
# pandas' nullable integer dtypes: a missing value keeps them integers (<NA>, written 2024)
NULLABLE_INT_DTYPES = frozenset({"Int64", "Int32", "Int16", "Int8",
                                 "UInt64", "UInt32", "UInt16", "UInt8"})


# pandas infers a file's compression from its name. Polars' scans detect gzip and zstd by their
# first bytes and read them alike; a zip or xz file fails, and a bz2 file is read as its bytes.
DECOMPRESSED_BY_POLARS = (".gz", ".zst")
NOT_DECOMPRESSED = (".zip", ".bz2", ".xz", ".tar", ".tgz", ".tbz2", ".txz")


def compression_of(path: str) -> str | None:
    """The compression pandas infers from the file name, as its extension; None for none."""
    lowered = path.lower()
    for extension in (*DECOMPRESSED_BY_POLARS, *NOT_DECOMPRESSED):
        if lowered.endswith(extension):
            return extension
    return None


# pandas' writers infer the compression from the name too (pandas.io.common, tar first);
# Polars' CSV sink writes gzip and zstd, and refuses a name ending .gz / .zst without them
WRITE_COMPRESSION = {".tar": "tar", ".tar.gz": "tar", ".tar.bz2": "tar", ".tar.xz": "tar",
                     ".gz": "gzip", ".bz2": "bz2", ".zip": "zip", ".xz": "xz", ".zst": "zstd"}
POLARS_CSV_COMPRESSION = {"gzip": ".gz", "zstd": ".zst"}  # what sink_csv writes: its suffix


def written_compression(path: str) -> str | None:
    """The compression pandas' to_csv infers from the file's name; None for none."""
    lowered = path.split("::")[0].lower()
    return next((method for extension, method in WRITE_COMPRESSION.items()
                 if lowered.endswith(extension)), None)


def is_url(path: str) -> bool:
    return "://" in path


def na_value_texts(values: list[Any]) -> list[str]:
    """The texts pandas reads as missing for `na_values`, as its reader spells them
    (pandas.io.parsers' _stringify_na_values): the value as text and, when it reads as a
    whole number, "-999.0" and "-999" too (whether it was given as 999, 999.0 or "999")."""
    texts: list[str] = []
    for value in values:
        spellings = [str(value)]
        try:
            number = float(value)
            if number == int(number):
                spellings += [f"{int(number)}.0", str(int(number))]
        except (TypeError, ValueError, OverflowError):
            pass
        texts += [t for t in dict.fromkeys(spellings) if t not in texts]
    return texts


def na_value_numbers(values: list[Any]) -> list[float]:
    """The numbers pandas makes missing in a column it reads as numbers, however the file
    writes them ("-999.00", "-9.99e2"): every value of `na_values` that float() reads, NaN
    aside (pandas.io.parsers' _floatify_na_values), texts ("-999") as well as numbers."""
    numbers: list[float] = []
    for value in values:
        try:
            number = float(value)
        except (TypeError, ValueError, OverflowError):
            continue
        if number == number and number not in numbers:
            numbers.append(number)
    return numbers


def is_number(value: Any) -> bool:
    return isinstance(value, (int, float)) and not isinstance(value, bool)


def scan_kwargs(options: dict[str, Any]) -> dict[str, Any]:
    """Real keyword arguments for pl.scan_csv from literal read_csv options (for --data)."""
    kwargs: dict[str, Any] = {"null_values": list(PANDAS_NA_TOKENS), "infer_schema_length": None}
    if "sep" in options:
        kwargs["separator"] = options["sep"]
    if "header" in options and options["header"] is None:  # the first line is data
        kwargs["has_header"] = False
    if "names" in options:
        kwargs["new_columns"] = list(options["names"])
    if options.get("number_names"):  # header=None without names=: pandas' 0, 1, ... as text
        kwargs["with_column_names"] = lambda names: [str(i) for i in range(len(names))]
    if options.get("decimal") == ",":
        kwargs["decimal_comma"] = True
    if options.get("comment"):  # lines that start with it (the schema reader looks at others)
        kwargs["comment_prefix"] = options["comment"]
    if "skiprows" in options:
        kwargs["skip_rows"] = options["skiprows"]
    if "lineterminator" in options:  # lines ending in a bare \r (the schema reader's finding)
        kwargs["eol_char"] = options["lineterminator"]
    if options.get("keep_default_na") is False:  # only the na_values given, and "" is text
        kwargs["null_values"] = []
        kwargs["empty_string_is_null"] = False
    na = options.get("na_values")
    if isinstance(na, str):
        kwargs["null_values"].append(na)
    elif isinstance(na, list):
        kwargs["null_values"].extend(str(v) for v in na)
    dtype = options.get("dtype")
    if dtype == "str":  # every column as text (read_csv(dtype=str))
        kwargs["infer_schema_length"] = 0
    if isinstance(dtype, dict):
        overrides = {}
        for column, name in dtype.items():
            spelled = name.__name__ if isinstance(name, type) else str(name)
            if spelled in DTYPES:
                overrides[column] = eval(DTYPES[spelled][0], {"pl": pl})  # noqa: S307 - our table
        kwargs["schema_overrides"] = overrides
    return kwargs
