"""Community bakery oven share: flour used against flour brought per member, how full each
oven ran on each day of the week (every oven and day, booked or not), loaf sizes by band and
the breads baked.
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


def pandas_category_counts(frame, name):
    """How many rows hold each category of the Enum column `name`, as pandas counts a
    Categorical: every category in the categories' order, one no row holds counted 0, then the
    missing values when the frame has any."""
    categories = frame.collect_schema()[name].categories
    counts = frame.group_by(name).agg(pl.len().cast(pl.Int64).alias("count"))
    every = pl.LazyFrame({name: categories}).cast({name: pl.Enum(categories)})
    return pl.concat([
        every.join(counts, on=name, how="left", maintain_order="left")
        .with_columns(pl.col("count").fill_null(0)),
        counts.filter(pl.col(name).is_null()),
    ])


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

# %%
bookings = pl.scan_csv(
    "data/bookings.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)
deliveries = pl.scan_csv(
    "data/flour_deliveries.csv",
    null_values=PANDAS_NA_VALUES + ["-"],
    infer_schema_length=None,
)
print(
    (bookings.select(pl.len()).collect().item(), len(bookings.collect_schema())),
    (deliveries.select(pl.len()).collect().item(), len(deliveries.collect_schema())),
)

bookings = bookings.unique("booking_id", keep="first", maintain_order=True)
bookings = bookings.with_columns(
    baker=pandas_title(pl.col("baker").str.strip_chars(PANDAS_WHITESPACE)),
)
bookings = bookings.with_columns(oven=pl.col("oven").str.strip_chars(PANDAS_WHITESPACE))
bookings = bookings.drop_nulls("baker").collect().lazy()
deliveries = (
    deliveries
    .with_columns(
        flour=pl.col("flour").str.replace_many({"İ": "i", "Σ": "σ"}).str.to_lowercase(),
    )
    .collect()
    .lazy()
)
print(
    deliveries.select(pl.col("flour"))
    .drop_nulls()
    .group_by("flour", maintain_order=True)
    .agg(pl.len().cast(pl.Int64).alias("count"))
    .select(
        pl.col("flour"),
        pandas_div(pl.col("count"), pl.col("count").sum()).alias("proportion"),
    )
    .sort("proportion", descending=True, maintain_order=True)
    .collect(),
)


def kg_table(frame, who):
    out = (
        frame
        .drop_nulls(who)
        .group_by(who)
        .agg(pl.col("kg"))
        .with_columns(pandas_group_sums(pl.col("kg"), floats=False))
        .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
        .sort(who)
    )
    return out


# %% flour used against flour brought
used = kg_table(bookings, "baker")
brought = kg_table(deliveries.drop_nulls("member"), "member")
balance = (
    used
    .rename({"kg": "kg_used"})
    .with_columns(_in_left=pl.lit(True))
    .join(
        brought.rename({"kg": "kg_brought"}).with_columns(_in_right=pl.lit(True)),
        left_on="baker",
        right_on="member",
        how="full",
        coalesce=False,
        nulls_equal=True,
        maintain_order="left_right",
    )
    .sort(
        pl.coalesce(pl.col("baker"), pl.col("member")),
        nulls_last=True,
        maintain_order=True,
    )
    .with_columns(
        _merge=pl.when(
            pl.col("_in_left").is_not_null() & pl.col("_in_right").is_not_null(),
        )
        .then(pl.lit("both"))
        .when(pl.col("_in_left").is_not_null())
        .then(pl.lit("left_only"))
        .otherwise(pl.lit("right_only"))
        .cast(pl.Enum(["left_only", "right_only", "both"])),
    )
    .drop("_in_left", "_in_right")
    .collect()
    .lazy()
)
print(
    pandas_category_counts(balance.select(pl.col("_merge")).drop_nulls(), "_merge")
    .sort("count", descending=True, maintain_order=True)
    .collect(),
)
never_brought = balance.filter(pl.col("_merge") == "left_only")
print(
    "baked without bringing flour:",
    [
        float("nan") if v is None else v
        for v in never_brought.select(pl.col("baker")).collect().to_series().to_numpy().tolist()
    ],
)
balance = balance.with_columns(name=pl.col("baker").fill_null(pl.col("member")))
balance = balance.with_columns(
    owed_kg=(pl.col("kg_used").fill_null(0) - pl.col("kg_brought").fill_null(0))
    .fill_nan(None)
    .round(2),
)
balance = (
    balance
    .with_row_index("index")
    .with_columns(pl.col("index").cast(pl.Int64))
    .select("index", "name", "kg_used", "kg_brought", "owed_kg", "_merge")
    .pipe(pandas_sort_values, "owed_kg", descending=True)
    .collect()
    .lazy()
)
(
    balance
    .drop("index")
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
    .sink_csv("data/flour_balance.csv")
)
# TODO(porter): series.idxmax: the extreme of a column whose type porter does not know
# TODO(porter): frame.loc: rows chosen by index label: the index is not data in Polars
worst = (
    balance.collect()
    .to_pandas()
    .set_index("index")
    .rename_axis(None)
    .loc[balance.select(pl.col("index"), pl.col("owed_kg")).collect().to_pandas().set_index("index")["owed_kg"].rename_axis(None).idxmax(), "name"]
)
print("owes the most flour:", worst)

# %% every oven on every day, booked or not
ovens = pl.LazyFrame(
    {"oven": ["wood", "deck", "small", "clay"], "capacity": [40, 24, 12, 0]},
)
days = pl.LazyFrame({"day": ["Mon", "Tue", "Wed", "Thu", "Fri", "Sat", "Sun"]})
grid = ovens.join(days, how="cross", maintain_order="left_right")
load = (
    bookings
    .drop_nulls(["oven", "day"])
    .group_by(["oven", "day"])
    .agg(pl.col("loaves"), pl.col("booking_id").count().cast(pl.Int64).alias("booked"))
    .with_columns(pandas_group_sums(pl.col("loaves"), floats=False))
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort(["oven", "day"])
)
grid = (
    grid
    .join(
        load,
        on=["oven", "day"],
        how="left",
        nulls_equal=True,
        maintain_order="left_right",
        validate="1:1",
    )
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("booked",) if t[c].has_nulls()]),
    )
    .lazy()
)
grid = grid.with_columns(
    loaves=pl.col("loaves").fill_null(0),
    booked=pl.col("booked").fill_null(0),
)
grid = grid.with_columns(
    fill=(pl.col("loaves") / pl.col("capacity")).fill_nan(None).round(3),
)
idle = grid.filter(pl.col("booked") == 0)
print(idle.select(pl.len()).collect().item(), "oven-days with no booking")
(
    grid
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
    .sink_csv("data/oven_days.csv")
)

# %% loaf sizes by band
bookings = (
    bookings
    .with_columns(
        size=pl.when(
            pl.col("loaves") <= pandas_quantile(pl.col("loaves"), 0.3333333333333333),
        )
        .then(pl.lit("few"))
        .when(pl.col("loaves") <= pandas_quantile(pl.col("loaves"), 0.6666666666666666))
        .then(pl.lit("some"))
        .when(pl.col("loaves") <= pl.col("loaves").max())
        .then(pl.lit("many"))
        .cast(pl.Enum(["few", "some", "many"])),
    )
    .collect()
    .lazy()
)
by_size = (
    bookings
    .drop_nulls("size")
    .group_by("size")
    .agg(pl.col("booking_id").count().cast(pl.Int64).alias("bookings"), pl.col("kg"))
    .with_columns(pandas_group_sums(pl.col("kg"), mean=True, floats=False))
    .sort("size")
)
by_size = by_size.with_columns(kg=pl.col("kg").round(2))
by_size = by_size.sort("size", nulls_last=True, descending=True)
print(by_size.collect())

# %% breads baked, per oven
breads = bookings.select("booking_id", "oven", "breads")
breads = breads.with_columns(bread=pl.col("breads").str.split("|"))
breads = (
    breads
    .explode("bread", empty_as_null=True, keep_nulls=True)
    .drop_nulls("bread")
)
per_oven = (
    breads
    .select("oven", "bread")
    .collect()
    .pipe(
        lambda d: d.select(pl.exclude("bread"), *(pl.col("bread").eq_missing(v).cast(pl.Int64).alias(f"bread_{v}") for v in d["bread"].drop_nulls().unique().sort())),
    )
    .lazy()
)
per_oven = (
    per_oven
    .drop_nulls("oven")
    .group_by("oven")
    .agg(pl.all())
    .with_columns(pandas_group_sums(pl.selectors.list(), floats=False))
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort("oven")
)
per_oven = (
    per_oven
    .join(ovens, on="oven", how="left", nulls_equal=True, maintain_order="left_right")
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("capacity",) if t[c].has_nulls()]),
    )
    .lazy()
)
per_oven = per_oven.collect().lazy()
(
    per_oven
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
    .sink_csv("data/breads_per_oven.csv")
)
print(per_oven.collect())
