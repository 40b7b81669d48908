"""Lighthouse keepers' log: lamp oil burnt per station, the foggy watches, and who kept them.

Three watches a night (dusk, midnight, dawn). The oil tank is dipped at every watch, but
keepers skip it often ('not read', '--' or blank); the gaps are filled by straight-line
interpolation between readings. Visibility is 'fog' when the keeper could not see the buoy.
"""
import numpy as np
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

WATCHES = {'dusk': 1, 'midnight': 2, 'dawn': 3}
FOG_NM = 2   # below two nautical miles the horn goes on


def tidy_names(s):
    # keepers type their own names, in any case, sometimes with a leading space
    return pandas_title(s.str.strip_chars(PANDAS_WHITESPACE))


log = pl.scan_csv(
    "data/watch_log.csv",
    null_values=PANDAS_NA_VALUES + ["not read", "--", "fog"],
    infer_schema_length=None,
)
stations = pl.scan_csv(
    'data/stations.csv',
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)
print("raw lines:", log.select(pl.len()).collect().item())

log = log.unique(keep="first", maintain_order=True)
log = log.with_columns(
    station=pandas_upper(pl.col("station").str.strip_chars(PANDAS_WHITESPACE)),
)
log = log.with_columns(keeper=tidy_names(pl.col('keeper')))
log = (
    log
    .with_columns(
        watch_no=pl.col("watch")
        .str.replace_many({"İ": "i", "Σ": "σ"})
        .str.to_lowercase()
        .replace_strict(WATCHES, default=None),
    )
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("watch_no",) if t[c].has_nulls()]),
    )
    .lazy()
)
log = log.with_columns(
    wind_bft=pl.col("wind_bft").fill_null(0),
    remarks=pl.col("remarks").fill_null(pl.lit("")),
)

# order of the book: station, night, watch
log = log.sort(
    ["station", "watch_date", "watch_no", "log_id"],
    nulls_last=True,
    maintain_order=True,
)

# fill the tank dips the keepers skipped
log = log.with_columns(oil_est=pl.col("oil_litres").interpolate().forward_fill())
log = log.with_columns(oil_est=pl.col("oil_est").round(1))
log = log.with_columns(estimated=pl.col("oil_litres").is_null()).collect().lazy()

# --- per station: oil range over the fortnight against the tank size
stations = stations.unique("code", keep="first", maintain_order=True)
per_station = (
    log
    .with_columns(_porter_rows_in_key_order=pl.col("station").is_sorted())
    .drop_nulls("station")
    .group_by("station")
    .agg(
        pl.col("log_id").count().cast(pl.Int64).alias("watches"),
        pl.col("oil_est").max().alias("high"),
        pl.col("oil_est").min().alias("low"),
        pl.col("estimated").sum().cast(pl.Int64).alias("estimated"),
        pl.col("wind_bft").alias("mean_wind"),
        pl.col("_porter_rows_in_key_order").first(),
    )
    .with_columns(
        pandas_group_sums(
            pl.col("mean_wind"),
            mean=True,
            floats=False,
            in_key_order=pl.col("_porter_rows_in_key_order"),
        ),
    )
    .drop("_porter_rows_in_key_order")
    .sort("station")
)
per_station = (
    per_station
    .rename(
        lambda c, other=stations.collect_schema().names(): c + "_x" if c in other and c not in ("station",) else c,
    )
    .join(
        stations.rename(
            lambda c: c + "_y" if c in ("station", "watches", "high", "low", "estimated", "mean_wind") else c,
        ),
        left_on="station",
        right_on="code",
        how="left",
        coalesce=False,
        nulls_equal=True,
        maintain_order="left_right",
    )
)
per_station = per_station.with_columns(
    burn_share=((pl.col("high") - pl.col("low")) / pl.col("tank_litres"))
    .fill_nan(None),
)
per_station = per_station.with_columns(burn_share=pl.col("burn_share").round(3))
per_station = per_station.with_columns(mean_wind=pl.col('mean_wind').round(2))
per_station = (
    per_station
    .drop("code")
    .pipe(pandas_sort_values, "burn_share", descending=True)
)
(
    per_station
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("station_oil.csv")
)

# --- foggy watches, for the harbour master
foggy = log.filter(
    (pl.col("visibility_nm") < FOG_NM) | pl.col("visibility_nm").is_null(),
)
foggy = foggy.select(
    "log_id",
    "station",
    "watch_date",
    "watch",
    "keeper",
    "visibility_nm",
    "oil_est",
    "remarks",
)
foggy = (
    foggy
    .sort(["watch_date", "station", "log_id"], nulls_last=True, maintain_order=True)
    .collect()
    .lazy()
)
(
    foggy
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("data/foggy_watches.csv")
)

# --- who kept the foggy watches
by_keeper = (
    foggy
    .drop_nulls(["station", "keeper"])
    .group_by(["station", "keeper"])
    .agg(pl.len().cast(pl.Int64).alias("size"))
    .sort(["station", "keeper"])
    .select(pl.col("station"), pl.col("keeper"), pl.col("size").alias("fog_watches"))
)
by_keeper = by_keeper.sort(
    ["fog_watches", "station", "keeper"],
    descending=[True, False, False],
    nulls_last=True,
    maintain_order=True,
)
print(by_keeper.head(8).collect())
print(
    "estimated dips:",
    int(
        log.select(pl.col("estimated").sum().cast(pl.Int64))
        .collect()
        .to_series()
        .to_numpy()[0],
    ),
    "of",
    log.select(pl.len()).collect().item(),
)
