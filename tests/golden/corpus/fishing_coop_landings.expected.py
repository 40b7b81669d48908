"""Fishing cooperative: landed catch against quota for each boat and species, and a season total per boat.

Species names are spelled every which way at the quay; an ice-box count of -1
means "not counted". A quota of 0 is a suspended licence, so the share used
is left as the raw division (inf or NaN) for the office to spot.
"""
import polars as pl

# Text that pandas' read_csv reads as a missing value.
PANDAS_NA_VALUES = [
    "", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null",
]


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

SPELLINGS = {"anchovie": "anchovy", "sardines": "sardine"}


def clean_landings(landings):
    landings = landings.with_columns(
        species=pl.col("species")
        .str.strip_chars(PANDAS_WHITESPACE)
        .str.replace_many({"İ": "i", "Σ": "σ"})
        .str.to_lowercase(),
    )
    landings = landings.with_columns(
        species=pl.col("species").replace({"anchovie": "anchovy", "sardines": "sardine"}),
    )
    landings = landings.with_columns(ice_boxes=pl.col("ice_boxes").replace(-1, 0))
    landings = landings.with_columns(
        value_eur=(pl.col("catch_kg") * pl.col("price_per_kg")).fill_nan(None).round(2),
    )
    return landings


def quota_status(landings, quota):
    landed = (
        landings
        .drop_nulls(["boat", "species"])
        .group_by(["boat", "species"])
        .agg(
            pl.col("catch_kg").alias("landed_kg"),
            pl.col("port").last(ignore_nulls=True).alias("port"),
        )
        .with_columns(pandas_group_sums(pl.col("landed_kg"), floats=False))
        .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
        .sort(["boat", "species"])
    )
    status = (
        landed
        .rename(
            lambda c, other=quota.collect_schema().names(): c + "_landed" if c in other and c not in ("boat", "species") else c,
        )
        .join(
            quota.rename(lambda c: c + "_home" if c in ("landed_kg", "port") else c),
            on=["boat", "species"],
            how="full",
            coalesce=True,
            nulls_equal=True,
            maintain_order="left_right",
        )
        .sort(["boat", "species"], nulls_last=True, maintain_order=True)
    )
    status = status.with_columns(
        landed_kg=pl.col("landed_kg").fill_null(0),
        quota_kg=pl.col("quota_kg").fill_null(0),
    )
    status = status.with_columns(
        used_share=(pl.col("landed_kg") / pl.col("quota_kg")).fill_nan(None).round(2),
    )
    status = status.with_columns(
        over_quota=(pl.col("landed_kg") > pl.col("quota_kg")).fill_null(False),
    )
    status = status.with_columns(
        away_port=(pl.col("port_landed") != pl.col("port_home")).fill_null(True),
    )
    return status


def boat_totals(landings):
    totals = (
        landings
        .drop_nulls("boat")
        .group_by("boat")
        .agg(
            pl.col("landing_id").drop_nulls().n_unique().cast(pl.Int64).alias("trips"),
            pl.col("catch_kg"),
            pl.col("value_eur"),
            pl.col("ice_boxes"),
            pl.col("price_per_kg").max().alias("best_price"),
        )
        .with_columns(
            pandas_group_sums(pl.col("catch_kg"), floats=False),
            pandas_group_sums(pl.col("value_eur"), floats=False),
            pandas_group_sums(pl.col("ice_boxes"), floats=False),
        )
        .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
        .sort("boat")
    )
    return totals.with_columns(pl.selectors.float().round(2))


landings = (
    clean_landings(
        pl.scan_csv(
            "data/landings.csv",
            null_values=PANDAS_NA_VALUES,
            infer_schema_length=None,
        ),
    )
    .collect()
    .lazy()
)
quota = pl.scan_csv(
    "data/quota.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)
print(
    pandas_text_array(
        landings.select(pl.col("species").unique(maintain_order=True))
        .collect()
        .to_series(),
    ),
)

status = quota_status(landings, quota).collect().lazy()
(
    status
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("quota_status.csv")
)
print(status.filter(pl.col("over_quota")).collect())

totals = boat_totals(landings).collect().lazy()
(
    totals
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("boat_totals.csv")
)
print(
    pandas_total(
        totals.select(
            pl.col("catch_kg").implode().alias("values"),
            pl.col("catch_kg").sum().alias("total"),
        )
        .collect(),
    ),
)
