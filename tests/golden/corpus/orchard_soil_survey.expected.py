"""Community orchard soil survey: which soils go with healthy trees?

Course notebook: load, tidy, look, cluster the cores, draw, write the summaries.
"""
import polars as pl
import matplotlib

# Text that pandas' read_csv reads as a missing value.
PANDAS_NA_VALUES = [
    "", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null",
]


def pandas_aligned(frame, values, key):
    """The frame with the columns of `values` (its labels `key` and the values) joined on
    `key` as pandas aligns a Series set into a frame: each row gets the value of its label
    (missing where the Series lacks it, a missing label matching a missing one); a frame
    without rows gets the Series' labels as its rows, as pandas gives it them."""
    joined = frame.join(values, on=key, how="left", nulls_equal=True, maintain_order="left")
    rows = frame.select(pl.len().alias("_porter_rows"))
    taken = (
        values.join(rows, how="cross", maintain_order="left")
        .filter(pl.col("_porter_rows") == 0)
        .drop("_porter_rows")
    )
    return pl.concat([joined, taken], how="diagonal_relaxed")


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
matplotlib.use("Agg")
import matplotlib.pyplot as plt
import seaborn as sns
from sklearn.preprocessing import StandardScaler
from sklearn.cluster import KMeans
from sklearn.decomposition import PCA

cores = (
    pl.scan_csv(
        "data/cores.csv",
        null_values=PANDAS_NA_VALUES + ["err"],
        infer_schema_length=None,
    )
    .collect()
    .lazy()
)
trees = pl.scan_csv(
    "data/trees.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)
print(cores.collect().to_pandas().info())
print(
    pl.concat([
        cores.select(
            pl.lit("count").alias("index"),
            pl.selectors.numeric().count().cast(pl.Float64),
        ),
        cores.select(
            pl.lit("mean").alias("index"),
            pandas_reduce(pl.selectors.numeric().cast(pl.Float64), how="mean"),
        ),
        cores.select(
            pl.lit("std").alias("index"),
            pandas_reduce(pl.selectors.numeric().cast(pl.Float64), how="std"),
        ),
        cores.select(
            pl.lit("min").alias("index"),
            pl.selectors.numeric().min().cast(pl.Float64),
        ),
        cores.select(
            pl.lit(pl.Series(["25%", "50%", "75%"])).alias("index"),
            pandas_percentiles(pl.selectors.numeric(), [0.25, 0.5, 0.75]),
        ),
        cores.select(
            pl.lit("max").alias("index"),
            pl.selectors.numeric().max().cast(pl.Float64),
        ),
    ])
    .with_columns(pl.selectors.float().round(2))
    .collect(),
)

cores = cores.unique("core", keep="first", maintain_order=True)
cores = cores.with_columns(
    plot=pandas_title(pl.col("plot").str.strip_chars(PANDAS_WHITESPACE)),
)
cores = cores.with_columns(
    moisture_pct=pl.col("moisture_pct")
    .fill_null(pandas_column_total(pl.col("moisture_pct"), "mean")),
)
cores = cores.drop_nulls("ph")
cores = cores.with_columns(
    acid=pl.when(pl.col("ph") < 6.0).then(pl.lit("acid")).otherwise(pl.lit("neutral")),
)
cores = (
    cores
    .rename(
        lambda c, other=trees.collect_schema().names(): c + "_x" if c in other and c not in ("tree",) else c,
    )
    .join(
        trees.rename(
            lambda c, other=cores.collect_schema().names(): c + "_y" if c in other and c not in ("tree",) else c,
        ),
        on="tree",
        how="left",
        nulls_equal=True,
        maintain_order="left_right",
    )
)
cores = cores.with_columns(age=2024 - pl.col("planted")).collect().lazy()
print(
    cores.select(pl.col("variety"))
    .group_by("variety", maintain_order=True)
    .agg(pl.len().cast(pl.Int64).alias("count"))
    .sort("count", descending=True, maintain_order=True)
    .collect(),
)

# look
(
    cores.select(pl.col("ph"))
    .collect()
    .to_series()
    .to_pandas()
    .plot(kind="hist", bins=12, title="soil pH")
)
plt.savefig("data/ph.png")
plt.close()

sns.countplot(data=cores.collect().to_pandas(), x="plot", hue="acid")
plt.xticks(rotation=20)
plt.tight_layout()
plt.savefig("data/acid_by_plot.png")
plt.close()

by_depth = (
    cores
    .drop_nulls("depth_cm")
    .group_by("depth_cm")
    .agg(pl.col("ph"), pl.col("nitrogen_mgkg"), pl.col("organic_pct"))
    .with_columns(
        pandas_group_sums(pl.col("ph"), mean=True, floats=False),
        pandas_group_sums(pl.col("nitrogen_mgkg"), mean=True, floats=False),
        pandas_group_sums(pl.col("organic_pct"), mean=True, floats=False),
    )
    .sort("depth_cm")
)
by_depth.collect().to_pandas().set_index("depth_cm").plot(kind="bar", figsize=(6, 4))
plt.savefig("data/by_depth.png")
plt.close()

# cluster the cores on their chemistry
features = ["ph", "nitrogen_mgkg", "moisture_pct", "organic_pct"]
X = StandardScaler().fit_transform(cores.select(features).collect().to_pandas())
km = KMeans(n_clusters=3, n_init=10, random_state=0)
cores = cores.with_columns(cluster=pl.Series(km.fit_predict(X), nan_to_null=True))
pcs = PCA(n_components=2, random_state=0).fit_transform(X)
cores = cores.with_columns(pc1=pl.Series(pcs[:, 0], nan_to_null=True))
cores = cores.with_columns(pc2=pl.Series(pcs[:, 1], nan_to_null=True)).collect().lazy()

plt.figure(figsize=(6, 5))
sns.scatterplot(
    data=cores.collect().to_pandas(),
    x="pc1",
    y="pc2",
    hue="cluster",
    palette="deep",
)
plt.savefig("data/clusters.png")
plt.close()

profile = (
    cores
    .drop_nulls("cluster")
    .group_by("cluster")
    .agg(
        pl.col("ph"),
        pl.col("nitrogen_mgkg"),
        pl.col("moisture_pct"),
        pl.col("organic_pct"),
        pl.col("health"),
    )
    .with_columns(
        pandas_group_sums(pl.col("ph"), mean=True, floats=False),
        pandas_group_sums(pl.col("nitrogen_mgkg"), mean=True, floats=False),
        pandas_group_sums(pl.col("moisture_pct"), mean=True, floats=False),
        pandas_group_sums(pl.col("organic_pct"), mean=True, floats=False),
        pandas_group_sums(pl.col("health"), mean=True, floats=False),
    )
    .sort("cluster")
    .with_columns((pl.selectors.float() - pl.selectors.by_name("cluster")).round(2))
)
profile = (
    pandas_aligned(
        profile,
        cores.drop_nulls("cluster")
        .group_by("cluster")
        .agg(pl.len().cast(pl.Int64).alias("size"))
        .sort("cluster")
        .select(pl.col("cluster"), pl.col("size").alias("_porter_aligned")),
        "cluster",
    )
    .with_columns(cores=pl.col("_porter_aligned"))
    .drop("_porter_aligned")
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("cores",) if t[c].dtype.is_integer() and t[c].has_nulls()]),
    )
    .lazy()
)
print(profile.collect())
(
    profile
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("data/cluster_profile.csv")
)

healthy = cores.filter(pl.col("health") >= 4)
# TODO(porter): series.arith: two Series aligned on labels whose types are not known to be one type:
#   pandas finds no label of one in the other
share = (
    (
        healthy.drop_nulls("variety").group_by("variety").agg(pl.len().cast(pl.Int64).alias("size")).sort("variety").select(pl.col("variety"), pl.col("size").alias("0")).collect().to_pandas().set_index("variety")["0"].rename(None)
        / cores.drop_nulls("variety").group_by("variety").agg(pl.len().cast(pl.Int64).alias("size")).sort("variety").select(pl.col("variety"), pl.col("size").alias("0")).collect().to_pandas().set_index("variety")["0"].rename(None)
    )
    .fillna(0)
    .round(3)
)
share = share.rename("healthy_share").reset_index()
share = pl.from_pandas(share).lazy()
(
    share
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("data/healthy_share.csv")
)

plots = (
    cores
    .with_columns(_porter_rows_in_key_order=pl.col("plot").is_sorted())
    .drop_nulls("plot")
    .group_by("plot")
    .agg(
        pl.col("core").count().cast(pl.Int64).alias("cores"),
        pl.col("ph").alias("mean_ph"),
        pl.col("moisture_pct").max().alias("wet"),
        pl.col("tree").drop_nulls().n_unique().cast(pl.Int64).alias("trees"),
        pl.col("_porter_rows_in_key_order").first(),
    )
    .with_columns(
        pandas_group_sums(
            pl.col("mean_ph"),
            mean=True,
            floats=False,
            in_key_order=pl.col("_porter_rows_in_key_order"),
        ),
    )
    .drop("_porter_rows_in_key_order")
    .sort("plot")
)
plots = plots.with_columns(mean_ph=pl.col("mean_ph").round(2))
(
    plots
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("data/plots.csv")
)
