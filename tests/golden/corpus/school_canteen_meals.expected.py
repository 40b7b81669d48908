"""School canteen: meals and cost per class, the menu mix, and allergen alerts for the kitchen.

A portion count of 0 means the pupil was booked but absent. The allergen
column says 'none' or is blank when the family declared nothing.
"""
import pandas as pd
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


def pandas_upper(text):
    """text.str.to_uppercase() as pandas' str.upper() writes it (pyarrow's kernel, one letter
    at a time): "ß" is "ẞ" (Polars: "SS"), and a letter Polars writes as two or three ("ﬁ" as
    "FI", "ŉ", Greek letters with accents or an iota) is kept, or made its one capital, as
    pandas does: the text is cut around those letters and each piece upper-cased. A batch of
    values that holds none of them gets Polars' own upper case, and only that is computed."""
    kept, iota = "[ŉǰΐΰևẖ-ẚὐὒὔὖᾈ-ᾏᾘ-ᾟᾨ-ᾯᾲᾴᾶᾷᾼῂῄῆῇῌῒ\u1fd3ῖῗῢ-ῤῦῧῲῴῶῷῼﬀ-ﬆﬓ-ﬗ]", "[ᾀ-ᾇᾐ-ᾗᾠ-ᾧᾳῃῳ]"

    def upper(values):
        values = values.str.replace_all("ß", "ẞ", literal=True)
        special = values.str.contains(f"{kept}|{iota}")
        if not special.any():
            return values.str.to_uppercase()
        piece = pl.element()
        by_piece = (
            pl.first().str.extract_all(f"{kept}|{iota}|[^ŉǰΐΰևẖ-ẚὐὒὔὖᾈ-ᾏᾘ-ᾟᾨ-ᾯᾲᾴᾶᾷᾼῂῄῆῇῌῒ\u1fd3ῖῗῢ-ῤῦῧῲῴῶῷῼﬀ-ﬆﬓ-ﬗᾀ-ᾇᾐ-ᾗᾠ-ᾧᾳῃῳ]+")
            .list.eval(
                pl.when(piece.str.contains(f"^{kept}$")).then(piece)
                .when(piece.str.contains(f"^{iota}$")).then(piece.str.to_titlecase())
                .otherwise(piece.str.to_uppercase())
            )
            .list.join("")
        )
        return values.to_frame().select(
            pl.when(special).then(by_piece).otherwise(pl.first().str.to_uppercase())
        ).to_series()

    return text.map_batches(upper, return_dtype=pl.String, is_elementwise=True)


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

MEAL_PRICE = {"standard": 3.40, "reduced": 1.10}

meals = pl.scan_csv(
    "data/meals.csv",
    null_values=PANDAS_NA_VALUES + ["none"],
    infer_schema_length=None,
)
print(meals.select(pl.len()).collect().item())

meals = meals.with_columns(
    class_group=pandas_upper(pl.col("class_group").str.strip_chars(PANDAS_WHITESPACE)),
)
meals = meals.with_columns(
    tariff=pl.when(pl.col("reduced_rate") == "yes")
    .then(pl.lit("reduced"))
    .otherwise(pl.lit("standard")),
)
meals = meals.with_columns(
    unit_price=pl.col("tariff").replace_strict(MEAL_PRICE, default=None),
)
meals = meals.with_columns(
    cost=(pl.col("portions") * pl.col("unit_price")).fill_nan(None),
)
meals = meals.with_columns(second_helping=(pl.col("portions") > 1).fill_null(False))

served = meals.filter(pl.col("portions") > 0).collect().lazy()
absent = meals.filter(~(pl.col("portions") > 0).fill_null(False))
print(
    served.select(pl.len()).collect().item(),
    absent.select(pl.len()).collect().item(),
    served.select(pl.col("pupil_id").drop_nulls().n_unique().cast(pl.Int64))
    .collect()
    .item(),
)

per_class = (
    served
    .with_columns(_porter_rows_in_key_order=pl.col("class_group").is_sorted())
    .drop_nulls("class_group")
    .group_by("class_group")
    .agg(
        pl.col("pupil_id").drop_nulls().n_unique().cast(pl.Int64).alias("pupils"),
        pl.col("portions"),
        pl.col("second_helping").sum().cast(pl.Int64).alias("seconds"),
        pl.col("cost"),
        pl.col("_porter_rows_in_key_order").first(),
    )
    .with_columns(
        pandas_group_sums(
            pl.col("portions"),
            floats=False,
            in_key_order=pl.col("_porter_rows_in_key_order"),
        ),
        pandas_group_sums(
            pl.col("cost"),
            floats=False,
            in_key_order=pl.col("_porter_rows_in_key_order"),
        ),
    )
    .drop("_porter_rows_in_key_order")
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort("class_group")
)
per_class = per_class.with_columns(cost=pl.col("cost").round(2))
(
    per_class
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("class_costs.csv")
)

menu_mix = (
    served
    .drop_nulls(["class_group", "menu"])
    .group_by(["class_group", "menu"])
    .agg(pl.col("pupil_id").count().cast(pl.Int64))
    .sort(["class_group", "menu"])
)
menu_mix = menu_mix.rename({"pupil_id": "meals"})
(
    menu_mix
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("menu_mix.csv")
)

# the kitchen wants a plain list of plates to check by hand
risky = served.filter(
    pl.col("menu").is_in(["meat", "fish"]) & pl.col("allergen").is_not_null(),
)
dates, pupils, notes = [], [], []
row_values = (
    risky
    .select(
        dates=pl.col("served_on"),
        pupils=pl.col("pupil_id"),
        notes=pl.concat_str(
            pl.col("class_group").fill_null("nan"),
            pl.lit(": "),
            pl.col("menu").cast(pl.String).fill_null("nan"),
            pl.lit(" plate, check "),
            pl.col("allergen").cast(pl.String).fill_null("nan"),
        ),
    )
    .collect()
)
dates.extend(row_values["dates"].to_list())
pupils.extend(row_values["pupils"].to_list())
notes.extend(row_values["notes"].to_list())
alerts = (
    pl.from_pandas(
        pd.DataFrame({"served_on": dates, "pupil_id": pupils, "note": notes}),
    )
    .lazy()
)
(
    alerts
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("allergen_alerts.csv")
)
print(alerts.head(5).collect())
