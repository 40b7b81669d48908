"""Seed bank germination trials: does cold stratification help, and can we tell a good tray?

Course-notebook style: describe, correlate, cross-tabulate, draw, then a scaled logistic
regression in a pipeline with cross-validation.
"""
import numpy as np
import pandas as pd
import polars as pl
import matplotlib

# Text that pandas' read_csv reads as a missing value.
PANDAS_NA_VALUES = [
    "", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null",
]


def pandas_reduce(values, how="sum", ddof=1):
    """The sum, mean, std or var (how="sum" / "mean" / "std" / "var") of a column of numbers
    as pandas computes them: numpy's pairwise sum of the values as floats, a missing one
    counted 0 in its place; the mean over the count of values present; the var from the
    squared distances to that mean (0 where a value is missing), added the same way, over
    count - ddof, and the std its square root. NaN where there are too few values. Polars
    adds in another order, and the last digit can differ (55.080000000000005 for
    55.08000000000001, a std of 3.265986323710904 for 3.2659863237109046)."""
    def reduce(column):
        import numpy as np

        present = column.is_not_null().to_numpy()
        numbers = column.cast(pl.Float64).fill_null(0.0).to_numpy()
        total = numbers.sum()
        if how == "sum":
            return total
        count = int(present.sum())
        if how == "mean":
            return total / count if count else float("nan")
        if count <= ddof:
            return float("nan")
        squares = (total / count - numbers) ** 2
        squares[~present] = 0.0
        spread = squares.sum() / (count - ddof)
        return float(np.sqrt(spread) if how == "std" else spread)

    return values.map_batches(reduce, returns_scalar=True, return_dtype=pl.Float64)


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


def pandas_percentiles(column, qs):
    """The quantiles qs of the column's values as pandas computes them: numpy's percentile
    of the values present (linear interpolation, to the last binary digit and the sign of a
    zero), a row each; missing where the column holds no value."""
    import numpy as np

    def percentiles(values):
        present = values.drop_nulls().cast(pl.Float64).to_numpy()
        if not len(present):
            return pl.Series([None] * len(qs), dtype=pl.Float64)
        return pl.Series(np.percentile(present, [q * 100 for q in qs]), dtype=pl.Float64)

    return column.map_batches(percentiles, return_dtype=pl.Float64)


def pandas_div(numerator, divisor):
    """numerator / divisor, each value divided as pandas divides it: Polars multiplies by the
    reciprocal of a single divisor, which can be one binary digit off the quotient (and a later
    round() then goes the other way)."""
    return numerator / (numerator.is_null() * 0 + divisor)


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
            ["\\", "\n", "\t", "\r"], ["\\\\", "\\n", "\\t", "\\r"])))
        .otherwise(pl.format("'{}'", pl.element().str.replace_many(
            ["\\", "\n", "\t", "\r", "'"], ["\\\\", "\\n", "\\t", "\\r", "\\'"])))
    )
    .list.join(", "),
)
matplotlib.use("Agg")
import matplotlib.pyplot as plt
import seaborn as sns
from sklearn.pipeline import Pipeline
from sklearn.preprocessing import StandardScaler
from sklearn.linear_model import LogisticRegression
from sklearn.model_selection import train_test_split, cross_val_score
from sklearn.metrics import confusion_matrix, classification_report

trials = (
    pl.scan_csv(
        "data/trials.csv",
        null_values=PANDAS_NA_VALUES,
        infer_schema_length=None,
    )
    .collect()
    .lazy()
)
species = pl.scan_csv(
    "data/species.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)
print(trials.head(5).collect())
print(
    pl.concat([
        trials.select(
            pl.lit("count").alias("index"),
            pl.selectors.numeric().count().cast(pl.Float64),
        ),
        trials.select(
            pl.lit("mean").alias("index"),
            pandas_reduce(pl.selectors.numeric().cast(pl.Float64), how="mean"),
        ),
        trials.select(
            pl.lit("std").alias("index"),
            pandas_reduce(pl.selectors.numeric().cast(pl.Float64), how="std"),
        ),
        trials.select(
            pl.lit("min").alias("index"),
            pl.selectors.numeric().min().cast(pl.Float64),
        ),
        trials.select(
            pl.lit(pl.Series(["25%", "50%", "75%"])).alias("index"),
            pandas_percentiles(pl.selectors.numeric(), [0.25, 0.5, 0.75]),
        ),
        trials.select(
            pl.lit("max").alias("index"),
            pl.selectors.numeric().max().cast(pl.Float64),
        ),
    ])
    .collect(),
)

trials = trials.unique(keep="first", maintain_order=True)
trials = trials.with_columns(
    species=pandas_upper(pl.col("species").str.strip_chars(PANDAS_WHITESPACE).str.head(1)) + pl.col("species").str.strip_chars(PANDAS_WHITESPACE).str.slice(1).str.replace_many({"İ": "i", "Σ": "σ"}).str.to_lowercase(),
)
trials = trials.with_columns(
    seed_weight_mg=pl.col("seed_weight_mg")
    .fill_null(pandas_column_total(pl.col("seed_weight_mg"), "mean")),
)
trials = trials.drop_nulls("age_years")
trials = trials.with_columns(
    rate=(pl.col("germinated") / pl.col("sown")).fill_nan(None),
)
trials = trials.filter(pl.col("sown") > 0)
trials = trials.with_columns(
    good=(pl.col("rate") >= 0.5).fill_null(False).cast(pl.Int64),
)
trials = (
    trials
    .rename(
        lambda c, other=species.collect_schema().names(): c + "_x" if c in other and c not in ("species",) else c,
    )
    .join(
        species.rename(
            lambda c, other=trials.collect_schema().names(): c + "_y" if c in other and c not in ("species",) else c,
        ),
        on="species",
        how="left",
        nulls_equal=True,
        maintain_order="left_right",
    )
)
trials = (
    trials
    .with_columns(family=pl.col("family").fill_null(pl.lit("unknown")))
    .collect()
    .lazy()
)

print(
    trials.select(pl.col("treatment"))
    .drop_nulls()
    .group_by("treatment", maintain_order=True)
    .agg(pl.len().cast(pl.Int64).alias("count"))
    .select(
        pl.col("treatment"),
        pandas_div(pl.col("count"), pl.col("count").sum()).alias("proportion"),
    )
    .sort("proportion", descending=True, maintain_order=True)
    .select(pl.col("treatment"), pl.col("proportion").round(3).alias("proportion"))
    .collect(),
)
print(
    trials.select(pl.col("good"))
    .drop_nulls()
    .group_by("good", maintain_order=True)
    .agg(pl.len().cast(pl.Int64).alias("count"))
    .select(
        pl.col("good"),
        pandas_div(pl.col("count"), pl.col("count").sum()).alias("proportion"),
    )
    .sort("proportion", descending=True, maintain_order=True)
    .collect(),
)

# correlations
# TODO(porter): frame.corr: a frame whose column types porter does not know; pl.corr(a, b) per pair
#   of columns
corr = trials.collect().to_pandas().corr(numeric_only=True)
print(corr.round(2))
plt.figure(figsize=(7, 6))
sns.heatmap(corr, annot=True, fmt=".2f", cmap="coolwarm")
plt.tight_layout()
plt.savefig("data/corr.png")
plt.close()

# treatment against outcome
table = (
    trials
    .drop_nulls(["treatment", "good"])
    .group_by(["treatment", "good"])
    .agg(pl.len().cast(pl.Int64))
    .sort("good")
    .collect()
    .pivot(on="good", index="treatment", values="len")
    .sort("treatment")
    .with_columns(pl.exclude("treatment").fill_null(0))
    .lazy()
)
print(table.collect())
(
    table.collect()
    .to_pandas()
    .set_index("treatment")
    .rename_axis(columns="good")
    .rename(
        columns=lambda c: int(c) if c not in ("treatment",) and c.removeprefix("-").isdecimal() else c,
    )
    .plot(kind="bar", stacked=True)
)
plt.ylabel("trays")
plt.savefig("data/treatment_good.png")
plt.close()

trials.collect().to_pandas().boxplot(column="rate", by="treatment")
plt.savefig("data/rate_by_treatment.png")
plt.close()

sns.scatterplot(
    data=trials.collect().to_pandas(),
    x="age_years",
    y="rate",
    hue="treatment",
)
plt.savefig("data/age_rate.png")
plt.close()

# model
trials = trials.with_columns(
    cold=(pl.col("treatment") == "cold").fill_null(False).cast(pl.Int64),
)
trials = (
    trials
    .with_columns(
        scarified=(pl.col("treatment") == "scarified").fill_null(False).cast(pl.Int64),
    )
    .collect()
    .lazy()
)
features = ["seed_weight_mg", "age_years", "cold", "scarified"]
X = trials.select(features).collect().lazy()
y = pl.col("good")
X_train, X_test, y_train, y_test = train_test_split(
    X.collect().to_pandas(),
    trials.select(y.alias("good")).collect().to_series().to_pandas(),
    test_size=0.3,
    random_state=0,
    stratify=trials.select(y.alias("good")).collect().to_series().to_pandas(),
)

pipe = Pipeline([("scale", StandardScaler()), ("model", LogisticRegression())])
pipe.fit(X_train, y_train)
pred = pipe.predict(X_test)
print(confusion_matrix(y_test, pred))
print(classification_report(y_test, pred))
scores = cross_val_score(
    pipe,
    X.collect().to_pandas(),
    trials.select(y.alias("good")).collect().to_series().to_pandas(),
    cv=5,
)
print("cv accuracy", scores.mean().round(3), scores.std().round(3))

coefs = (
    pl.from_pandas(
        pd.DataFrame({"feature": features, "weight": pipe.named_steps["model"].coef_[0]}),
    )
    .lazy()
)
(
    coefs
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        PANDAS_CSV_LISTS,
        PANDAS_CSV_NUMBER_LISTS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("data/weights.csv")
)

summary = (
    trials
    .drop_nulls(["family", "treatment"])
    .group_by(["family", "treatment"])
    .agg(
        pl.col("tray").count().cast(pl.Int64).alias("trays"),
        pl.col("accession").drop_nulls().n_unique().cast(pl.Int64).alias("accessions"),
        pl.col("rate").alias("mean_rate"),
    )
    .with_columns(pandas_group_sums(pl.col("mean_rate"), mean=True))
    .sort(["family", "treatment"])
)
summary = summary.with_columns(mean_rate=pl.col("mean_rate").round(3))
(
    summary
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        PANDAS_CSV_LISTS,
        PANDAS_CSV_NUMBER_LISTS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("data/summary.csv")
)
