"""Seed bank: germination rate per species, the five best accessions, and weak lots kept in the cold room.

Accession numbers are zero-padded strings; a tray with nothing sown (sown == 0)
has no rate rather than a division error.
"""
import polars as pl

# Text that pandas' read_csv reads as a missing value.
PANDAS_NA_VALUES = [
    "", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null",
]


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


def pandas_sort_values(frame, by, descending=False, nulls_last=True):
    """The frame sorted by one column (a name or an expression) in the order pandas'
    sort_values gives: pandas sorts numbers, True/False and dates with numpy's quicksort, which
    does not keep tied rows in their order (Polars' sort does); missing values (NaN too) come
    first or last, in their order. Text is sorted stably by pandas, as by Polars."""

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


# The characters Python's str.isspace() calls whitespace, which pandas' str.strip() takes
# off: Polars' strip_chars() leaves the separators \x1c-\x1f.
PANDAS_WHITESPACE = (
    "\t\n\x0b\x0c\r\x1c\x1d\x1e\x1f \x85\xa0\u1680"
    "\u2000\u2001\u2002\u2003\u2004\u2005\u2006\u2007"
    "\u2008\u2009\u200a\u2028\u2029\u202f\u205f\u3000"
)


# Float columns as pandas' to_csv writes them (Python's repr): 5e-05 and 1.5e-07, where Polars
# writes 0.00005 and 1.5e-7; NaN as an empty field. Only values below 0.0001 (other than 0)
# need the replacements, and only they are given them.
def pandas_csv_floats(values):
    text = values.fill_nan(None).cast(pl.String)
    small = (values.abs() < 1e-4) & (values != 0)
    if not small.any():
        return text
    repr_text = (
        text.filter(small)
        .str.replace(r"e-(\d)$", "e-0${1}")
        .str.replace(r"^(-?)0\.0000(\d)$", "${1}${2}e-05")
        .str.replace(r"^(-?)0\.0000(\d)(\d+)$", "${1}${2}.${3}e-05")
    )
    return text.scatter(small.arg_true(), repr_text)


PANDAS_CSV_FLOATS = pl.selectors.float().map_batches(
    pandas_csv_floats, return_dtype=pl.String, is_elementwise=True,
)

# Integer columns as pandas' to_csv writes them: one holding a missing value is float in
# pandas (2024.0), one without stays integer (2024).
PANDAS_CSV_INTS = (
    pl.when(pl.selectors.integer().null_count() > 0)
    .then(pl.selectors.integer().cast(pl.Float64).cast(pl.String))
    .otherwise(pl.selectors.integer().cast(pl.String))
)

TEST_COLUMNS = ["test_id", "accession", "species", "sown", "germinated", "test_date"]


def load_tests(path):
    tests = (
        pl.scan_csv(
            path,
            null_values=PANDAS_NA_VALUES,
            schema_overrides={"accession": pl.String},
            infer_schema_length=None,
        )
        .select(pl.col("^(test_id|accession|species|sown|germinated|test_date)$"))
    )
    return tests.drop_nulls("germinated")


def add_rates(tests):
    rate = (
        pl.when(pl.col("sown") > 0)
        .then((pl.col("germinated") / pl.col("sown")).fill_nan(None))
        .otherwise(None)
    )
    return tests.with_columns(rate=rate)


def attach_registry(tests, registry):
    registry = registry.with_columns(
        storage=pl.col("storage")
        .str.strip_chars(PANDAS_WHITESPACE)
        .str.replace_many({"İ": "i", "Σ": "σ"})
        .str.to_lowercase(),
    )
    return tests.join(
        registry.rename(
            lambda c, other=tests.collect_schema().names(): c + "_registry" if c in other and c not in ("accession_id",) else c,
        ),
        left_on="accession",
        right_on="accession_id",
        how="left",
        coalesce=False,
        nulls_equal=True,
        maintain_order="left_right",
    )


def species_summary(tests):
    summary = (
        tests
        .drop_nulls("species")
        .group_by("species")
        .agg(pl.col("rate"), pl.col("sown"), pl.col("germinated"))
        .with_columns(
            pandas_group_sums(pl.col("rate"), mean=True),
            pandas_group_sums(pl.col("sown"), floats=False),
            pandas_group_sums(pl.col("germinated"), floats=False),
        )
        .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
        .sort("species")
    )
    summary = summary.with_columns(rate=pl.col("rate").round(3))
    return summary.pipe(pandas_sort_values, "rate", descending=True)


tests = add_rates(load_tests("data/germination_tests.csv"))
registry = pl.scan_csv(
    "data/accessions.csv",
    null_values=PANDAS_NA_VALUES,
    schema_overrides={"accession_id": pl.String},
    infer_schema_length=None,
)
rated = attach_registry(tests, registry).collect().lazy()
print(
    tests.select(pl.len()).collect().item(),
    rated.select(pl.len()).collect().item(),
)

(
    species_summary(rated)
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("species_rates.csv")
)

top = (
    rated
    .sort("rate", descending=True, nulls_last=True, maintain_order=True)
    .head(5)
    .select("test_id", "accession", "species", "sown", "rate", "storage")
    .collect()
    .lazy()
)
(
    top
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("top_accessions.csv")
)
print(top.collect())

weak = rated.filter((pl.col("rate") < 0.5) & (pl.col("storage") == "cold room"))
weak = (
    weak
    .drop("accession_id", "species_registry")
    .sort(["rate", "test_id"], nulls_last=True, maintain_order=True)
    .collect()
    .lazy()
)
(
    weak
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("weak_cold_room.csv")
)
print(
    weak.select(pl.col("accession").drop_nulls().n_unique().cast(pl.Int64))
    .collect()
    .item(),
)
