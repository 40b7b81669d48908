"""Hill-fort dig: summaries of the finds register for the site meeting.

The register got too big for the site laptop's pandas, so the import was switched to Modin
(same API); nothing else changed.
"""
import os

os.environ.setdefault("MODIN_ENGINE", "python")  # no Ray on the site laptop
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


def pandas_quantile(column, q):
    """The q quantile of the column's values as pandas computes it (numpy's linear
    interpolation a + (b - a) * t, to the last binary digit and the sign of a zero: Polars'
    quantile can be one digit off, which moves a value sitting on a bin's edge into the next
    bin, and returns -0.0 where numpy's sum gives 0.0)."""
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
    infinite = ((column == float("inf")).sum() >= last - below) \
        | ((column == float("-inf")).sum() >= below + 1)
    return (
        pl.when((t == 0) & (below < last) & infinite).then(a + float("nan"))
        .when(t >= 0.5).then(b - (b - a) * (1 - t))
        .otherwise(a + (b - a) * t)
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

finds = pl.scan_csv(
    "data/finds.csv",
    null_values=PANDAS_NA_VALUES + ["?"],
    infer_schema_length=None,
)
trenches = pl.scan_csv(
    "data/trenches.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)
print((finds.select(pl.len()).collect().item(), len(finds.collect_schema())))

finds = finds.unique("find_id", keep="first", maintain_order=True)
finds = finds.with_columns(
    material=pl.col("material")
    .str.strip_chars(PANDAS_WHITESPACE)
    .str.replace_many({"İ": "i", "Σ": "σ"})
    .str.to_lowercase(),
)
finds = finds.with_columns(weight_g=pl.col("weight_g").fill_null(0))
finds = finds.with_columns(
    depth_band=pl.when(pl.col("depth_cm").is_between(0, 20, closed="right"))
    .then(pl.lit("topsoil"))
    .when(pl.col("depth_cm").is_between(20, 50, closed="right"))
    .then(pl.lit("upper"))
    .when(pl.col("depth_cm").is_between(50, 100, closed="right"))
    .then(pl.lit("middle"))
    .when(pl.col("depth_cm").is_between(100, 300, closed="right"))
    .then(pl.lit("deep"))
    .cast(pl.Enum(["topsoil", "upper", "middle", "deep"])),
)
finds = (
    finds
    .rename(
        lambda c, other=trenches.collect_schema().names(): c + "_x" if c in other and c not in ("trench",) else c,
    )
    .join(
        trenches.rename(
            lambda c, other=finds.collect_schema().names(): c + "_y" if c in other and c not in ("trench",) else c,
        ),
        on="trench",
        how="left",
        nulls_equal=True,
        maintain_order="left_right",
    )
)
finds = finds.with_columns(period=pl.col("period").fill_null(pl.lit("unphased")))
finds = (
    finds
    .with_columns(
        metal=pl.when(pl.col("material").is_in(["iron", "bronze"]))
        .then(pl.lit("metal"))
        .otherwise(pl.lit("other")),
    )
    .collect()
    .lazy()
)

# what each trench gave
by_material = (
    finds
    .drop_nulls(["trench", "material"])
    .group_by(["trench", "material"])
    .agg(
        pl.col("find_id").count().cast(pl.Int64).alias("finds"),
        pl.col("weight_g"),
        pl.col("depth_cm").max().alias("deepest"),
    )
    .with_columns(pandas_group_sums(pl.col("weight_g"), floats=False))
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort(["trench", "material"])
)
by_material = by_material.with_columns(
    share=(
        pl.col("finds")
        / pl.when(pl.col("trench").is_not_null()).then(pl.col("finds").sum().over("trench"))
    )
    .fill_nan(None)
    .round(3),
)
by_material = by_material.sort(
    ["trench", "finds"],
    descending=[False, True],
    nulls_last=True,
    maintain_order=True,
)
(
    by_material
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("data/by_material.csv")
)

# per square metre, for trenches on the list
dens = (
    finds
    .drop_nulls("trench")
    .group_by("trench")
    .agg(
        pl.col("find_id").count().cast(pl.Int64).alias("n"),
        pl.col("area_m2").first(ignore_nulls=True).alias("area"),
    )
    .sort("trench")
)
dens = dens.with_columns(per_m2=(pl.col("n") / pl.col("area")).fill_nan(None).round(2))
dens = (
    dens
    .drop_nulls("per_m2")
    .pipe(pandas_sort_values, "per_m2", descending=True)
    .collect()
    .lazy()
)
print(dens.head(5).collect())
(
    dens
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("data/density.csv")
)

bands = (
    finds
    .drop_nulls(["material", "depth_band"])
    .group_by(["material", "depth_band"])
    .agg(pl.len().cast(pl.Int64).alias("size"))
    .sort(["material", "depth_band"])
    .sort("depth_band")
    .collect()
    .pivot(on="depth_band", index="material", values="size")
    .sort("material")
    .fill_null(0)
    .lazy()
)
(
    bands
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("data/depth_bands.csv")
)

cut_off = finds.select(pandas_quantile(pl.col("weight_g"), 0.9)).collect().item()
heavy = finds.filter(pl.col("weight_g") > cut_off).collect().lazy()
print(heavy.select(pl.len()).collect().item(), "finds over", cut_off, "g")
per_day = (
    heavy
    .drop_nulls(["dug_on", "metal"])
    .group_by(["dug_on", "metal"])
    .agg(
        pl.col("weight_g").count().cast(pl.Int64).alias("count"),
        pl.col("weight_g").alias("sum"),
        pl.col("weight_g").alias("mean"),
    )
    .with_columns(
        pandas_group_sums(pl.col("sum"), floats=False),
        pandas_group_sums(pl.col("mean"), mean=True, floats=False),
    )
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort(["dug_on", "metal"])
    .with_columns((pl.selectors.float() - pl.selectors.by_name("dug_on")).round(1))
)
(
    per_day
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("data/heavy_per_day.csv")
)
