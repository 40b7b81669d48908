"""Village recycling depot: combine two weekly drop-off sheets, weigh up each material,
and list the households that bring the heavy glass and metal loads.

A ticket that shows up on both sheets is disputed and left out entirely;
weight 0 or 'n/a' means the scale was not used.
"""
import polars as pl

# Text that pandas' read_csv reads as a missing value.
PANDAS_NA_VALUES = [
    "", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null",
]


def pandas_dtypes_text(probe):
    """print(df.dtypes) as pandas prints it, from the frame's probe row (PANDAS_DTYPE_PROBE),
    without importing pandas: each column's type as pandas names it (an integer column with a
    missing value is float64, a True/False one object), names to the left and types to the
    right, only the first and last five of more than sixty columns."""
    kinds = []
    for name, dtype in probe.schema.items():
        missing = probe[name].has_nulls()
        if dtype.is_integer() and dtype not in (pl.Int128, pl.UInt128):
            kind = "float64" if missing else str(dtype).lower()
        elif dtype in (pl.Float32, pl.Float64):
            kind = str(dtype).lower()
        elif dtype == pl.Boolean:
            kind = "object" if missing else "bool"
        elif dtype == pl.String:
            kind = "str"
        elif dtype == pl.Categorical or isinstance(dtype, pl.Enum):
            kind = "category"
        elif isinstance(dtype, pl.Datetime):
            zone = f", {dtype.time_zone}" if dtype.time_zone else ""
            kind = f"datetime64[{dtype.time_unit}{zone}]"
        elif dtype == pl.Date:
            kind = "datetime64[ms]"
        elif isinstance(dtype, pl.Duration):
            kind = f"timedelta64[{dtype.time_unit}]"
        elif dtype in (pl.Time, pl.Null, pl.Binary) \
                or isinstance(dtype, (pl.List, pl.Array, pl.Struct, pl.Decimal)):
            kind = "object"
        else:
            kind = None
        if kind is None or "\t" in name or "\r" in name or "\n" in name:  # pandas names it
            return str(probe.to_pandas().dtypes)
        kinds.append((name, kind))
    if not kinds:
        return "Series([], dtype: object)"
    footer = "dtype: object"
    if len(kinds) > 60:
        footer = f"Length: {len(kinds)}, dtype: object"
        kinds = [*kinds[:5], None, *kinds[-5:]]
    shown = [k for k in kinds if k is not None]
    left = max(len(name) for name, _ in shown)
    right = max(len(kind) for _, kind in shown)
    lines = [" " * left + "   " + "...".center(right + 1) if k is None
             else k[0].ljust(left) + "    " + k[1].rjust(right) for k in kinds]
    return "\n".join([*lines, footer])


def pandas_text_array(values):
    """print(s.unique()) of text as pandas prints its string array, without importing pandas:
    each text quoted, nan for a missing one, lines wrapped at 80 characters (values padded to
    one width where they fill more than a line), the first and last ten of more than a
    hundred."""
    items = ["nan" if v is None else
             "'" + v.replace("\t", r"\t").replace("\r", r"\r").replace("\n", r"\n") + "'"
             for v in values.to_list()]
    if len(items) < 2:
        body = "[" + ", ".join(items) + "]"
    else:
        cut = len(items) > 100
        head, tail = (items[:10], items[-10:]) if cut else ([], items)
        if cut or len(", ".join(head)) >= 80 or len(", ".join(tail)) >= 80:
            wide = max(len(item) for item in head + tail)
            head, tail = [x.rjust(wide) for x in head], [x.rjust(wide) for x in tail]
        body, line = "", "\n "

        def add(word, limit=80):
            nonlocal body, line
            if len(line.rstrip()) + len(word.rstrip()) >= limit:
                body, line = body + line.rstrip(), "\n "
            line += word

        for item in head:
            add(item + ", ")
        if cut:
            body, line = body + line.rstrip() + "\n ...", "\n "
        for item in tail[:-1]:
            add(item + ", ")
        add(tail[-1], 78)
        body = "[" + (body + line + "]")[2:]
    return f"<ArrowStringArray>\n{body}\nLength: {len(items)}, dtype: str"


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


# The characters Python's str.isspace() calls whitespace, which pandas' str.strip() takes
# off: Polars' strip_chars() leaves the separators \x1c-\x1f.
PANDAS_WHITESPACE = (
    "\t\n\x0b\x0c\r\x1c\x1d\x1e\x1f \x85\xa0\u1680"
    "\u2000\u2001\u2002\u2003\u2004\u2005\u2006\u2007"
    "\u2008\u2009\u200a\u2028\u2029\u202f\u205f\u3000"
)

# One row per column that gives pandas the dtype of the whole column: the first value, or a
# missing value where the column holds one (pandas makes such an int column float64 and a
# True/False one object); no row when the frame has none.
PANDAS_DTYPE_PROBE = pl.when(~pl.all().is_null().any()).then(pl.all().head(1))


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

CREDITS = pl.LazyFrame(
    {
        "material": ["glass", "paper", "metal", "textiles", "e-waste"],
        "credit_per_kg": [0.02, 0.03, 0.11, 0.05, 0.0],
    },
)

week1 = pl.scan_csv(
    "data/dropoffs_week1.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)
week2 = (
    pl.scan_csv(
        "data/dropoffs_week2.csv",
        null_values=PANDAS_NA_VALUES,
        infer_schema_length=None,
    )
    .collect()
    .lazy()
)
print(week1.collect_schema().names())
print(pandas_dtypes_text(week2.select(PANDAS_DTYPE_PROBE).collect()))

drops = pl.concat([week1, week2], how="diagonal_relaxed")
print((drops.select(pl.len()).collect().item(), len(drops.collect_schema())))

drops = (
    drops
    .unique("ticket", keep="none", maintain_order=True)
    .drop("staff")
    .with_columns(
        material=pl.col("material")
        .str.strip_chars(PANDAS_WHITESPACE)
        .str.replace_many({"İ": "i", "Σ": "σ"})
        .str.to_lowercase(),
        weight_kg=pl.col("weight_kg").cast(pl.Float64),
        bags=pl.col("bags").cast(pl.Float64),
    )
    .filter(pl.col("weight_kg") > 0)
    .collect()
    .lazy()
)
print(
    pandas_text_array(
        drops.select(pl.col("material").unique(maintain_order=True)).collect().to_series(),
    ),
)
print(
    drops.select(pl.col("material"))
    .drop_nulls()
    .group_by("material", maintain_order=True)
    .agg(pl.len().cast(pl.Int64).alias("count"))
    .sort("count", descending=True, maintain_order=True)
    .head(3)
    .collect(),
)

per_material = (
    drops
    .with_columns(_porter_rows_in_key_order=pl.col("material").is_sorted())
    .drop_nulls("material")
    .group_by("material")
    .agg(
        pl.col("weight_kg").alias("kg"),
        pl.col("ticket").count().cast(pl.Int64).alias("visits"),
        pl.col("bags"),
        pl.col("_porter_rows_in_key_order").first(),
    )
    .with_columns(
        pandas_group_sums(
            pl.col("kg"),
            in_key_order=pl.col("_porter_rows_in_key_order"),
        ),
        pandas_group_sums(
            pl.col("bags"),
            in_key_order=pl.col("_porter_rows_in_key_order"),
        ),
    )
    .drop("_porter_rows_in_key_order")
    .sort("material")
    .join(
        CREDITS,
        on="material",
        how="left",
        nulls_equal=True,
        maintain_order="left_right",
    )
    .with_columns(
        credit=(pl.col("kg") * pl.col("credit_per_kg")).fill_nan(None).round(2),
    )
    .sort(
        ["kg", "material"],
        descending=[True, False],
        nulls_last=True,
        maintain_order=True,
    )
)
(
    per_material
    .with_columns(
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("material_totals.csv")
)

heavy = drops.filter(
    pl.col("weight_kg").is_between(20, 60) & pl.col("material").is_in(["glass", "metal"]),
)
heavy_households = (
    heavy
    .drop_nulls("household")
    .group_by("household")
    .agg(pl.len().cast(pl.Int64).alias("size"))
    .sort("household")
    .select(pl.col("household"), pl.col("size").alias("0"))
)
heavy_households = heavy_households.rename({"0": "heavy_loads"})
heavy_households = (
    heavy_households
    .sort(
        ["heavy_loads", "household"],
        descending=[True, False],
        nulls_last=True,
        maintain_order=True,
    )
    .collect()
    .lazy()
)
(
    heavy_households
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("heavy_households.csv")
)
print(heavy_households.head(5).collect())

household_kg = (
    drops
    .drop_nulls("household")
    .group_by("household")
    .agg(pl.col("weight_kg"))
    .with_columns(pandas_group_sums(pl.col("weight_kg")))
    .sort("household")
)
first_visit = (
    drops
    .sort(["dropped_on", "ticket"], nulls_last=True, maintain_order=True)
    .drop_nulls("household")
    .group_by("household")
    .agg(pl.all().first(ignore_nulls=True))
    .sort("household")
)
first_visit = (
    first_visit
    .select("household", "dropped_on", "material")
    .join(
        household_kg,
        on="household",
        how="inner",
        nulls_equal=True,
        maintain_order="left_right",
    )
    .collect()
    .lazy()
)
(
    first_visit
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("household_first_visit.csv")
)
print(
    first_visit.tail(3).collect(),
    drops.select(pl.col("weight_kg"))
    .collect()
    .to_series()
    .fill_null(0)
    .to_numpy()
    .sum(),
)
