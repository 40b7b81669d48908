"""Mountain dairy summer pasture: milk per herder and alp, the herders' wages, and the cows
that gave least.

The milk book is kept by whoever milks: names come with and without their accents
('Séverine Brügger', 'SEVERINE BRUGGER'), so they are folded to plain lower-case ASCII
before they are matched to the wage list, which is keyed that way. 'dry' means the cow was
not milked. Alpe Gèrra had no cows summered this year (the count was not sent up).
"""
import polars as pl

# Text that pandas' read_csv reads as a missing value.
PANDAS_NA_VALUES = [
    "", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null",
]


def pandas_text_values(values):
    """Texts as pandas gives them: its own string array, nan for a missing one, where one is
    missing (Polars gives None); otherwise the same texts as a numpy array, so that pandas is
    not imported for them."""
    return values.to_pandas().unique() if values.null_count() else values.to_numpy()


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


milk = (
    pl.scan_csv(
        "data/milk_log.csv",
        null_values=PANDAS_NA_VALUES + ["dry"],
        infer_schema_length=None,
    )
    .collect()
    .lazy()
)
herders = pl.scan_csv(
    "data/herders.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)
alps = pl.scan_csv(
    "data/alps.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)
print(
    "milk lines:",
    milk.select(pl.len()).collect().item(),
    "| blank litres:",
    milk.select(pl.col("litres").is_null().sum().cast(pl.Int64))
    .collect()
    .to_series()
    .to_numpy()[0],
)

# TODO(porter): frame.duplicated: the frame's columns are not known (pass subset=[...]);
#   ~pl.struct(cols).is_first_distinct() for keep='first'
print("lines written twice:", milk.collect().to_pandas().duplicated().sum())
milk = milk.with_columns(
    alp=pandas_title(pl.col("alp").str.strip_chars(PANDAS_WHITESPACE))
    .str.replace_all("Da", "da", literal=True),
)
milk = milk.with_columns(
    milking=pl.col("milking").str.replace_many({"İ": "i", "Σ": "σ"}).str.to_lowercase(),
)
milk = milk.with_columns(
    herder_key=pl.col("herder")
    .str.strip_chars(PANDAS_WHITESPACE)
    .str.replace_many({"İ": "i", "Σ": "σ"})
    .str.to_lowercase(),
)
# fold the accents away: é -> e, ü -> u, å -> a
milk = (
    milk
    .with_columns(
        herder_key=pl.col("herder_key")
        .str.normalize("NFKD")
        .str.replace_all("[^\\x00-\\x7F]", ""),
    )
    .collect()
    .lazy()
)
print(
    milk.select(pl.col("herder_key"))
    .drop_nulls()
    .group_by("herder_key", maintain_order=True)
    .agg(pl.len().cast(pl.Int64).alias("count"))
    .sort("count", descending=True, maintain_order=True)
    .collect(),
)

milk = milk.with_columns(litres=pl.col("litres").fill_null(0))
milk = milk.with_columns(
    fat_kg=pandas_div(pl.col("litres") * pl.col("fat_pct"), 100).fill_nan(None),
)

# the wage list has Luzi twice (a raise in July): the later line counts
wages = herders.filter(pl.col("herder_key").is_last_distinct())
milk = (
    milk
    .rename(
        lambda c, other=wages.collect_schema().names(): c + "_x" if c in other and c not in ("herder_key",) else c,
    )
    .join(
        wages.rename(
            lambda c, other=milk.collect_schema().names(): c + "_y" if c in other and c not in ("herder_key",) else c,
        ),
        on="herder_key",
        how="left",
        nulls_equal=True,
        maintain_order="left_right",
    )
)
milk = (
    milk
    .with_columns(wage=(pl.col("litres") * pl.col("wage_per_litre")).fill_nan(None))
    .collect()
    .lazy()
)

# --- per herder: litres, fat and wage
per_herder = (
    milk
    .with_columns(_porter_rows_in_key_order=pl.col("herder_key").is_sorted())
    .drop_nulls("herder_key")
    .group_by("herder_key")
    .agg(
        pl.col("day").drop_nulls().n_unique().cast(pl.Int64).alias("days"),
        pl.col("litres"),
        pl.col("fat_kg"),
        pl.col("wage"),
        pl.col("_porter_rows_in_key_order").first(),
    )
    .with_columns(
        pandas_group_sums(
            pl.col("litres"),
            floats=False,
            in_key_order=pl.col("_porter_rows_in_key_order"),
        ),
        pandas_group_sums(
            pl.col("fat_kg"),
            in_key_order=pl.col("_porter_rows_in_key_order"),
        ),
        pandas_group_sums(
            pl.col("wage"),
            floats=False,
            in_key_order=pl.col("_porter_rows_in_key_order"),
        ),
    )
    .drop("_porter_rows_in_key_order")
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort("herder_key")
)
per_herder = per_herder.with_columns(fat_kg=pl.col("fat_kg").round(3))
per_herder = per_herder.with_columns(wage=pl.col("wage").round(2))
per_herder = per_herder.with_columns(litres=pl.col("litres").round(1))
per_herder = per_herder.sort(
    ["litres", "herder_key"],
    descending=[True, False],
    nulls_last=True,
    maintain_order=True,
)
(
    per_herder
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("herder_wages.csv")
)
no_wage = milk.filter(pl.col("wage_per_litre").is_null()).collect().lazy()
print(
    f"{no_wage.select(pl.len()).collect().item()} lines by herders not on the wage list:",
    sorted(
        pandas_text_values(
            no_wage.select(pl.col("herder_key").unique(maintain_order=True))
            .collect()
            .to_series(),
        ),
    ),
)

# --- per alp and day, against the cows summered there
per_alp = (
    milk
    .drop_nulls(["alp", "day"])
    .group_by(["alp", "day"])
    .agg(pl.col("litres"))
    .with_columns(pandas_group_sums(pl.col("litres"), floats=False))
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort(["alp", "day"])
)
per_alp = (
    per_alp
    .rename(
        lambda c, other=alps.collect_schema().names(): c + "_x" if c in other and c not in ("alp",) else c,
    )
    .join(
        alps.rename(lambda c: c + "_y" if c in ("day", "litres") else c),
        on="alp",
        how="left",
        nulls_equal=True,
        maintain_order="left_right",
    )
)
per_alp = per_alp.with_columns(
    litres_per_cow=(pl.col("litres") / pl.col("cows_summered")).fill_nan(None).round(2),
)
per_alp = per_alp.with_columns(litres=pl.col("litres").round(1))
(
    per_alp
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("alp_days.csv")
)

# --- the cows that gave least in the evening
evening = milk.filter(pl.col("milking") == "evening")
low = (
    evening
    .drop_nulls("cow")
    .group_by("cow")
    .agg(pl.col("litres"), pl.col("log_id").count().cast(pl.Int64).alias("milkings"))
    .with_columns(pandas_group_sums(pl.col("litres"), mean=True, floats=False))
    .sort("cow")
)
low = low.with_columns(litres=pl.col("litres").round(2))
low = low.sort(["litres", "cow"], nulls_last=True, maintain_order=True).head(4)
print(low.collect())
