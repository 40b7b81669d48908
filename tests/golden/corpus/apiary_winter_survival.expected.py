"""Which hives came through the winter? The bee inspector's autumn sheets against the spring count.

Course-notebook style: look at the data, clean it, draw a few pictures, fit a small model.
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


def pandas_title(text):
    """text.str.to_titlecase() as pandas' str.title() writes it (pyarrow's kernel, one letter
    at a time): "Σ" is "σ" at the end of a word too, "ß" first in a word is "ẞ" (Polars: "Ss"),
    a digraph first in a word is its upper case ("ǆemal" -> "Ǆemal", Polars: "ǅemal"), "İ"
    inside a word is "i" (Polars: i and a combining dot), and a letter Polars writes as two or
    three first in a word ("ﬁ" as "Fi") is kept: a letter without case set before it makes
    Polars read it as inside a word, and is taken out after. A letter without case (CJK,
    Hebrew, a modifier letter) ends a word for pandas, not for Polars: a mark that is no
    letter (U+FFFF) is set after each, and taken out after. Where a batch of values holds none of
    these letters, Polars' own title case is pandas', and only that is computed."""
    kept, mark = "[ŉǰΐΰևẖ-ẚὐὒὔὖᾲᾴᾶᾷῂῄῆῇῒ\u1fd3ῖῗῢ-ῤῦῧῲῴῶῷﬀ-ﬆﬓ-ﬗ]", "\ua66e"
    special = r"[ΣßǄ-ǌǱ-ǳİ\u0307\uffffŉǰΐΰևẖ-ẚὐὒὔὖᾲᾴᾶᾷῂῄῆῇῒ\u1fd3ῖῗῢ-ῤῦῧῲῴῶῷﬀ-ﬆﬓ-ﬗ[\p{Alphabetic}&&[^\p{Lu}\p{Ll}\p{Lt}]&&[^\p{Cased}&&[\p{Nl}\x{24b6}-\x{24e9}]]]]"

    def title(values):
        if not values.str.contains(special).any():
            return values.str.to_titlecase()
        return (
            values.str.replace_many({"Σ": "σ", "ß": "ẞ"})
            .str.replace_all(r"[\p{Alphabetic}&&[^\p{Lu}\p{Ll}\p{Lt}]&&[^\p{Cased}&&[\p{Nl}\x{24b6}-\x{24e9}]]]", "$0\uffff")
            .str.replace_all(kept, mark + "$0")
            .str.to_titlecase()
            .str.replace_all("\uffff", "", literal=True)
            .str.replace_many({"ǅ": "Ǆ", "ǈ": "Ǉ", "ǋ": "Ǌ", "ǲ": "Ǳ", "i\u0307": "i"})
            .str.replace_all(mark + f"({kept})", "$1")
        )

    return text.map_batches(title, return_dtype=pl.String, is_elementwise=True)


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
from sklearn.model_selection import train_test_split
from sklearn.preprocessing import StandardScaler
from sklearn.linear_model import LogisticRegression
from sklearn.metrics import accuracy_score, confusion_matrix

df = (
    pl.scan_csv(
        "data/inspections.csv",
        null_values=PANDAS_NA_VALUES,
        infer_schema_length=None,
    )
    .collect()
    .lazy()
)
heights = pl.scan_csv(
    "data/apiaries.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)
print((df.select(pl.len()).collect().item(), len(df.collect_schema())))
print(df.head(5).collect())
# TODO(porter): frame.isnull: the frame's columns are not known
print(df.collect().to_pandas().isnull().sum())

# --- cleaning
df = df.unique(keep="first", maintain_order=True)
df = df.with_columns(
    apiary=pandas_title(pl.col("apiary").str.strip_chars(PANDAS_WHITESPACE)),
)
df = df.with_columns(apiary=pl.col("apiary").fill_null(pl.lit("Unknown")))
df = df.drop_nulls("honey_kg")
df = df.with_columns(
    mites_per_100=pl.col("mites_per_100").fill_null(pl.col("mites_per_100").median()),
)
df = df.with_columns(queen_age=2024 - pl.col("queen_year"))
df = df.with_columns(
    queen_age=pl.col("queen_age")
    .fill_null(pandas_column_total(pl.col("queen_age"), "mean")),
)
df = df.with_columns(log_mites=np.log1p(pl.col("mites_per_100")).fill_nan(None))
df = df.with_columns(
    strong=pl.when(pl.col("frames") >= 10).then(pl.lit(1, dtype=pl.Int64)).otherwise(0),
)
df = (
    df
    .rename(
        lambda c, other=heights.collect_schema().names(): c + "_x" if c in other and c not in ("apiary",) else c,
    )
    .join(
        heights.rename(
            lambda c, other=df.collect_schema().names(): c + "_y" if c in other and c not in ("apiary",) else c,
        ),
        on="apiary",
        how="left",
        nulls_equal=True,
        maintain_order="left_right",
    )
)
df = df.with_columns(height_m=pl.col("height_m").fill_null(0)).collect().lazy()
print(
    pl.concat([
        df.select(
            pl.lit("count").alias("index"),
            pl.selectors.numeric().count().cast(pl.Float64),
        ),
        df.select(
            pl.lit("mean").alias("index"),
            pandas_reduce(pl.selectors.numeric().cast(pl.Float64), how="mean"),
        ),
        df.select(
            pl.lit("std").alias("index"),
            pandas_reduce(pl.selectors.numeric().cast(pl.Float64), how="std"),
        ),
        df.select(
            pl.lit("min").alias("index"),
            pl.selectors.numeric().min().cast(pl.Float64),
        ),
        df.select(
            pl.lit(pl.Series(["25%", "50%", "75%"])).alias("index"),
            pandas_percentiles(pl.selectors.numeric(), [0.25, 0.5, 0.75]),
        ),
        df.select(
            pl.lit("max").alias("index"),
            pl.selectors.numeric().max().cast(pl.Float64),
        ),
    ])
    .collect(),
)
print(
    df.select(pl.col("survived"))
    .drop_nulls()
    .group_by("survived", maintain_order=True)
    .agg(pl.len().cast(pl.Int64).alias("count"))
    .sort("count", descending=True, maintain_order=True)
    .collect(),
)

# --- pictures
fig, ax = plt.subplots(figsize=(6, 4))
ax.hist(
    df.select(pl.col("honey_kg")).collect().to_series().to_pandas(),
    bins=15,
    color="goldenrod",
)
ax.set_xlabel("honey (kg)")
ax.set_ylabel("hives")
fig.savefig("data/honey_hist.png")
plt.close(fig)

plt.figure(figsize=(6, 4))
plt.scatter(
    df.select(pl.col("mites_per_100")).collect().to_series().to_pandas(),
    df.select(pl.col("brood_pct")).collect().to_series().to_pandas(),
    c=df.select(pl.col("survived")).collect().to_series().to_pandas(),
    s=12,
)
plt.xlabel("mites per 100 bees")
plt.ylabel("brood (%)")
plt.savefig("data/mites_brood.png")
plt.close()

sns.boxplot(data=df.collect().to_pandas(), x="apiary", y="honey_kg")
plt.xticks(rotation=30)
plt.tight_layout()
plt.savefig("data/honey_by_apiary.png")
plt.close()

num_cols = ["frames", "brood_pct", "mites_per_100", "honey_kg", "queen_age", "height_m"]
corr = pl.concat(
    [
        df.select(num_cols)
        .with_columns(
            pl.col([
                "frames",
                "brood_pct",
                "mites_per_100",
                "honey_kg",
                "queen_age",
                "height_m",
            ])
            .cast(pl.Float64),
        )
        .select(
            pl.lit(a).alias("index"),
            *(
                pl.corr(a, b).fill_nan(None).alias(b)
                for b in ["frames", "brood_pct", "mites_per_100", "honey_kg", "queen_age", "height_m"]
            ),
        )
        for a in ["frames", "brood_pct", "mites_per_100", "honey_kg", "queen_age", "height_m"]
    ],
)
print(corr.with_columns(pl.selectors.float().round(2)).collect())

# --- model
features = ["frames", "brood_pct", "log_mites", "queen_age", "height_m", "strong"]
X = df.select(features)
y = pl.col("survived")
X_train, X_test, y_train, y_test = train_test_split(
    X.collect().to_pandas(),
    df.select(y.alias("survived")).collect().to_series().to_pandas(),
    test_size=0.3,
    random_state=42,
)
scaler = StandardScaler()
X_train_s = scaler.fit_transform(X_train)
X_test_s = scaler.transform(X_test)
model = LogisticRegression(max_iter=1000)
model.fit(X_train_s, y_train)
pred = model.predict(X_test_s)
print("accuracy:", round(accuracy_score(y_test, pred), 3))
print(confusion_matrix(y_test, pred))
coefs = (
    pl.from_pandas(pd.DataFrame({"feature": features, "weight": model.coef_[0]}))
    .lazy()
)
coefs = coefs.pipe(pandas_sort_values, "weight")
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
    df
    .with_columns(_porter_rows_in_key_order=pl.col("apiary").is_sorted())
    .drop_nulls("apiary")
    .group_by("apiary")
    .agg(
        pl.col("hive").drop_nulls().n_unique().cast(pl.Int64).alias("hives"),
        pl.col("survived"),
        pl.col("honey_kg").alias("honey"),
        pl.col("_porter_rows_in_key_order").first(),
    )
    .with_columns(
        pandas_group_sums(
            pl.col("survived"),
            mean=True,
            floats=False,
            in_key_order=pl.col("_porter_rows_in_key_order"),
        ),
        pandas_group_sums(
            pl.col("honey"),
            mean=True,
            floats=False,
            in_key_order=pl.col("_porter_rows_in_key_order"),
        ),
    )
    .drop("_porter_rows_in_key_order")
    .sort("apiary")
)
summary = summary.with_columns(survived=pl.col("survived").round(3))
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
    .sink_csv("data/apiary_summary.csv")
)
