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


def pandas_upper(text):
    """text.str.to_uppercase() as pandas' str.upper() writes it (pyarrow's kernel, one letter
    at a time): "ß" is "ẞ" (Polars: "SS"), and a letter Polars writes as two or three ("ﬁ" as
    "FI", "ŉ", Greek letters with accents or an iota) is kept, or made its one capital, as
    pandas does: the text is cut around those letters and each piece upper-cased."""
    kept, iota = "[ŉǰΐΰևẖ-ẚὐὒὔὖᾈ-ᾏᾘ-ᾟᾨ-ᾯᾲᾴᾶᾷᾼῂῄῆῇῌῒ\u1fd3ῖῗῢ-ῤῦῧῲῴῶῷῼﬀ-ﬆﬓ-ﬗ]", "[ᾀ-ᾇᾐ-ᾗᾠ-ᾧᾳῃῳ]"
    text = text.str.replace_all("ß", "ẞ", literal=True)
    piece = pl.element()
    by_piece = (
        text.str.extract_all(f"{kept}|{iota}|[^ŉǰΐΰևẖ-ẚὐὒὔὖᾈ-ᾏᾘ-ᾟᾨ-ᾯᾲᾴᾶᾷᾼῂῄῆῇῌῒ\u1fd3ῖῗῢ-ῤῦῧῲῴῶῷῼﬀ-ﬆﬓ-ﬗᾀ-ᾇᾐ-ᾗᾠ-ᾧᾳῃῳ]+")
        .list.eval(
            pl.when(piece.str.contains(f"^{kept}$")).then(piece)
            .when(piece.str.contains(f"^{iota}$")).then(piece.str.to_titlecase())
            .otherwise(piece.str.to_uppercase())
        )
        .list.join("")
    )
    return pl.when(text.str.contains(f"{kept}|{iota}")).then(by_piece).otherwise(
        text.str.to_uppercase())


# The characters Python's str.isspace() calls whitespace, which pandas' str.strip() takes
# off: Polars' strip_chars() leaves the separators \x1c-\x1f.
PANDAS_WHITESPACE = (
    "\t\n\x0b\x0c\r\x1c\x1d\x1e\x1f \x85\xa0\u1680"
    "\u2000\u2001\u2002\u2003\u2004\u2005\u2006\u2007"
    "\u2008\u2009\u200a\u2028\u2029\u202f\u205f\u3000"
)

# Float columns as pandas' to_csv writes them (Python's repr): 5e-05 and 1.5e-07, where Polars
# writes 0.00005 and 1.5e-7; NaN as an empty field.
PANDAS_CSV_FLOATS = (
    pl.selectors.float().fill_nan(None).cast(pl.String)
    .str.replace(r"e-(\d)$", "e-0${1}")
    .str.replace(r"^(-?)0\.0000(\d)$", "${1}${2}e-05")
    .str.replace(r"^(-?)0\.0000(\d)(\d+)$", "${1}${2}.${3}e-05")
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
meals = (
    meals
    .with_columns(second_helping=(pl.col("portions") > 1).fill_null(False))
    .collect()
    .lazy()
)

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
    .drop_nulls("class_group")
    .group_by("class_group")
    .agg(
        pl.col("pupil_id").drop_nulls().n_unique().cast(pl.Int64).alias("pupils"),
        pl.col("portions").sum().alias("portions"),
        pl.col("second_helping").sum().cast(pl.Int64).alias("seconds"),
        pl.col("cost").sum().alias("cost"),
    )
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
