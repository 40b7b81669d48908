# Hill farm lambing book: which ewes lose lambs, and can we see it coming?
# Notebook style: look at the book, clean it, band it, draw it, fit a model, write it up.

import numpy as np
import pandas as pd
import polars as pl
import matplotlib

# Text that pandas' read_csv reads as a missing value.
PANDAS_NA_VALUES = [
    "", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null",
]


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


def pandas_to_datetime(text, coerce):
    """pd.to_datetime(text) without format=, as pandas reads it: pandas guesses one
    format from the first value (the first format below whose first pattern reads a
    real date in it) and reads every value with it (the second pattern); a value it
    does not fit is missing (coerce) or an error, as is a first value in none of
    these formats. Each value is rewritten into one layout Polars reads."""
    def read(layouts, strict):
        return (layouts.str.replace_many(['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December', 'Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'],
                                          ['1', '2', '3', '4', '5', '6', '7', '8', '9', '10', '11', '12', '1', '2', '3', '4', '5', '6', '7', '8', '9', '10', '11', '12'],
                                          ascii_case_insensitive=True, leftmost=True)
                .str.to_datetime('%Y/%m/%d %H:%M:%S%.f=', time_unit="us", strict=strict))

    first = text.filter(~text.is_in(['', 'NaT', 'nat', 'NAT', 'nan', 'NaN', 'NAN', 'now', 'today'])).first()
    written = text
    if not coerce:  # pandas' texts for NaT are missing, not an error
        text = text.replace(['', 'NaT', 'nat', 'NAT', 'nan', 'NaN', 'NAN'], None)
    # blanks before or after the first value are part of pandas' format (' %Y-%m-%d'):
    # every value needs a run of blanks there
    bare, lead, trail = (~first.str.contains(r"^\s|\s$"), first.str.contains(r"^\s"),
                         first.str.contains(r"\s$"))
    first = first.str.strip_chars()

    def blanks(pattern, front, back):
        return pattern.replace("^(?:", "^(?:" + front, 1)[:-3] + back + ")|^"

    formats = [
        # %Y-%m-%d
        ('^(?:[1-9][0-9]{3})-(?:1[0-2]|0[1-9]|[1-9])-(?:3[01]|[12][0-9]|0[1-9]|[1-9])$',
         '(?i)^(?:(?P<Y>[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))-(?P<m>1[0-2]|0[1-9]|[1-9])-(?P<d>3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9]))|^',
         '${Y}/${m}/${d} 0:0:0='),
        # %Y-%m-%d %H:%M
        ('^(?:[1-9][0-9]{3})-(?:1[0-2]|0[1-9]|[1-9])-(?:3[01]|[12][0-9]|0[1-9]|[1-9]) (?:2[0-3]|[01][0-9]|[0-9]):(?:[0-5][0-9]|[0-9])$',
         '(?i)^(?:(?P<Y>[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))-(?P<m>1[0-2]|0[1-9]|[1-9])-(?P<d>3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9])\\s+(?P<H>2[0-3]|[0-1][0-9]|[0-9]):(?P<M>[0-5][0-9]|[0-9]))|^',
         '${Y}/${m}/${d} ${H}:${M}:0='),
        # %Y-%m-%d %H:%M:%S
        ('^(?:[1-9][0-9]{3})-(?:1[0-2]|0[1-9]|[1-9])-(?:3[01]|[12][0-9]|0[1-9]|[1-9]) (?:2[0-3]|[01][0-9]|[0-9]):(?:[0-5][0-9]|[0-9]):(?:[0-5][0-9]|[0-9])$',
         '(?i)^(?:(?P<Y>[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))-(?P<m>1[0-2]|0[1-9]|[1-9])-(?P<d>3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9])\\s+(?P<H>2[0-3]|[0-1][0-9]|[0-9]):(?P<M>[0-5][0-9]|[0-9]):(?P<S>6[0-1]|[0-5][0-9]|[0-9]))|^',
         '${Y}/${m}/${d} ${H}:${M}:${S}='),
        # %Y-%m-%d %H:%M:%S.%f
        ('^(?:[1-9][0-9]{3})-(?:1[0-2]|0[1-9]|[1-9])-(?:3[01]|[12][0-9]|0[1-9]|[1-9]) (?:2[0-3]|[01][0-9]|[0-9]):(?:[0-5][0-9]|[0-9]):(?:[0-5][0-9]|[0-9])\\.(?:[0-9]{1,6})$',
         '(?i)^(?:(?P<Y>[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))-(?P<m>1[0-2]|0[1-9]|[1-9])-(?P<d>3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9])\\s+(?P<H>2[0-3]|[0-1][0-9]|[0-9]):(?P<M>[0-5][0-9]|[0-9]):(?P<S>6[0-1]|[0-5][0-9]|[0-9])\\.(?P<f>[0-9]{1,9}))|^',
         '${Y}/${m}/${d} ${H}:${M}:${S}.${f}='),
        # %Y-%m-%dT%H:%M:%S
        ('^(?:[1-9][0-9]{3})-(?:1[0-2]|0[1-9]|[1-9])-(?:3[01]|[12][0-9]|0[1-9]|[1-9])T(?:2[0-3]|[01][0-9]|[0-9]):(?:[0-5][0-9]|[0-9]):(?:[0-5][0-9]|[0-9])$',
         '(?i)^(?:(?P<Y>[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))-(?P<m>1[0-2]|0[1-9]|[1-9])-(?P<d>3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9])T(?P<H>2[0-3]|[0-1][0-9]|[0-9]):(?P<M>[0-5][0-9]|[0-9]):(?P<S>6[0-1]|[0-5][0-9]|[0-9]))|^',
         '${Y}/${m}/${d} ${H}:${M}:${S}='),
        # %Y-%m-%dT%H:%M:%S.%f
        ('^(?:[1-9][0-9]{3})-(?:1[0-2]|0[1-9]|[1-9])-(?:3[01]|[12][0-9]|0[1-9]|[1-9])T(?:2[0-3]|[01][0-9]|[0-9]):(?:[0-5][0-9]|[0-9]):(?:[0-5][0-9]|[0-9])\\.(?:[0-9]{1,6})$',
         '(?i)^(?:(?P<Y>[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))-(?P<m>1[0-2]|0[1-9]|[1-9])-(?P<d>3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9])T(?P<H>2[0-3]|[0-1][0-9]|[0-9]):(?P<M>[0-5][0-9]|[0-9]):(?P<S>6[0-1]|[0-5][0-9]|[0-9])\\.(?P<f>[0-9]{1,9}))|^',
         '${Y}/${m}/${d} ${H}:${M}:${S}.${f}='),
        # %Y/%m/%d
        ('^(?:[1-9][0-9]{3})/(?:1[0-2]|0[1-9]|[1-9])/(?:3[01]|[12][0-9]|0[1-9]|[1-9])$',
         '(?i)^(?:(?P<Y>[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))/(?P<m>1[0-2]|0[1-9]|[1-9])/(?P<d>3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9]))|^',
         '${Y}/${m}/${d} 0:0:0='),
        # %Y%m%d
        ('^(?:[1-9][0-9]{3})(?:1[0-2]|0[1-9])(?:3[01]|[12][0-9]|0[1-9])$',
         '(?i)^(?:(?P<Y>[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))(?P<m>1[0-2]|0[1-9]|[1-9])(?P<d>3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9]))|^',
         '${Y}/${m}/${d} 0:0:0='),
        # %m/%d/%Y
        ('^(?:1[0-2]|0[1-9]|[1-9])/(?:3[01]|[12][0-9]|0[1-9]|[1-9])/(?:[1-9][0-9]{3})$',
         '(?i)^(?:(?P<m>1[0-2]|0[1-9]|[1-9])/(?P<d>3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9])/(?P<Y>[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9])))|^',
         '${Y}/${m}/${d} 0:0:0='),
        # %d/%m/%Y
        ('^(?:3[01]|[12][0-9]|0[1-9]|[1-9])/(?:1[0-2]|0[1-9]|[1-9])/(?:[1-9][0-9]{3})$',
         '(?i)^(?:(?P<d>3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9])/(?P<m>1[0-2]|0[1-9]|[1-9])/(?P<Y>[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9])))|^',
         '${Y}/${m}/${d} 0:0:0='),
        # %m/%d/%Y %H:%M
        ('^(?:1[0-2]|0[1-9]|[1-9])/(?:3[01]|[12][0-9]|0[1-9]|[1-9])/(?:[1-9][0-9]{3}) (?:2[0-3]|[01][0-9]|[0-9]):(?:[0-5][0-9]|[0-9])$',
         '(?i)^(?:(?P<m>1[0-2]|0[1-9]|[1-9])/(?P<d>3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9])/(?P<Y>[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))\\s+(?P<H>2[0-3]|[0-1][0-9]|[0-9]):(?P<M>[0-5][0-9]|[0-9]))|^',
         '${Y}/${m}/${d} ${H}:${M}:0='),
        # %d/%m/%Y %H:%M
        ('^(?:3[01]|[12][0-9]|0[1-9]|[1-9])/(?:1[0-2]|0[1-9]|[1-9])/(?:[1-9][0-9]{3}) (?:2[0-3]|[01][0-9]|[0-9]):(?:[0-5][0-9]|[0-9])$',
         '(?i)^(?:(?P<d>3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9])/(?P<m>1[0-2]|0[1-9]|[1-9])/(?P<Y>[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))\\s+(?P<H>2[0-3]|[0-1][0-9]|[0-9]):(?P<M>[0-5][0-9]|[0-9]))|^',
         '${Y}/${m}/${d} ${H}:${M}:0='),
        # %m/%d/%Y %H:%M:%S
        ('^(?:1[0-2]|0[1-9]|[1-9])/(?:3[01]|[12][0-9]|0[1-9]|[1-9])/(?:[1-9][0-9]{3}) (?:2[0-3]|[01][0-9]|[0-9]):(?:[0-5][0-9]|[0-9]):(?:[0-5][0-9]|[0-9])$',
         '(?i)^(?:(?P<m>1[0-2]|0[1-9]|[1-9])/(?P<d>3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9])/(?P<Y>[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))\\s+(?P<H>2[0-3]|[0-1][0-9]|[0-9]):(?P<M>[0-5][0-9]|[0-9]):(?P<S>6[0-1]|[0-5][0-9]|[0-9]))|^',
         '${Y}/${m}/${d} ${H}:${M}:${S}='),
        # %d/%m/%Y %H:%M:%S
        ('^(?:3[01]|[12][0-9]|0[1-9]|[1-9])/(?:1[0-2]|0[1-9]|[1-9])/(?:[1-9][0-9]{3}) (?:2[0-3]|[01][0-9]|[0-9]):(?:[0-5][0-9]|[0-9]):(?:[0-5][0-9]|[0-9])$',
         '(?i)^(?:(?P<d>3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9])/(?P<m>1[0-2]|0[1-9]|[1-9])/(?P<Y>[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))\\s+(?P<H>2[0-3]|[0-1][0-9]|[0-9]):(?P<M>[0-5][0-9]|[0-9]):(?P<S>6[0-1]|[0-5][0-9]|[0-9]))|^',
         '${Y}/${m}/${d} ${H}:${M}:${S}='),
        # %m.%d.%Y
        ('^(?:1[0-2]|0[1-9]|[1-9])\\.(?:3[01]|[12][0-9]|0[1-9]|[1-9])\\.(?:[1-9][0-9]{3})$',
         '(?i)^(?:(?P<m>1[0-2]|0[1-9]|[1-9])\\.(?P<d>3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9])\\.(?P<Y>[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9])))|^',
         '${Y}/${m}/${d} 0:0:0='),
        # %d.%m.%Y
        ('^(?:3[01]|[12][0-9]|0[1-9]|[1-9])\\.(?:1[0-2]|0[1-9]|[1-9])\\.(?:[1-9][0-9]{3})$',
         '(?i)^(?:(?P<d>3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9])\\.(?P<m>1[0-2]|0[1-9]|[1-9])\\.(?P<Y>[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9])))|^',
         '${Y}/${m}/${d} 0:0:0='),
        # %B %d, %Y
        ('^(?:September|February|November|December|January|October|August|March|April|June|July|May) (?:3[01]|[12][0-9]|0[1-9]|[1-9]), (?:[1-9][0-9]{3})$',
         '(?i)^(?:(?P<B>september|february|november|december|january|october|august|march|april|june|july|may)\\s+(?P<d>3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9]),\\s+(?P<Y>[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9])))|^',
         '${Y}/${B}/${d} 0:0:0='),
        # %b %d, %Y
        ('^(?:Jan|Feb|Mar|Apr|May|Jun|Jul|Aug|Sep|Oct|Nov|Dec) (?:3[01]|[12][0-9]|0[1-9]|[1-9]), (?:[1-9][0-9]{3})$',
         '(?i)^(?:(?P<b>jan|feb|mar|apr|may|jun|jul|aug|sep|oct|nov|dec)\\s+(?P<d>3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9]),\\s+(?P<Y>[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9])))|^',
         '${Y}/${b}/${d} 0:0:0='),
        # %d %B %Y
        ('^(?:3[01]|[12][0-9]|0[1-9]|[1-9]) (?:September|February|November|December|January|October|August|March|April|June|July|May) (?:[1-9][0-9]{3})$',
         '(?i)^(?:(?P<d>3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9])\\s+(?P<B>september|february|november|december|january|october|august|march|april|june|july|may)\\s+(?P<Y>[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9])))|^',
         '${Y}/${B}/${d} 0:0:0='),
        # %d %b %Y
        ('^(?:3[01]|[12][0-9]|0[1-9]|[1-9]) (?:Jan|Feb|Mar|Apr|May|Jun|Jul|Aug|Sep|Oct|Nov|Dec) (?:[1-9][0-9]{3})$',
         '(?i)^(?:(?P<d>3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9])\\s+(?P<b>jan|feb|mar|apr|may|jun|jul|aug|sep|oct|nov|dec)\\s+(?P<Y>[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9])))|^',
         '${Y}/${b}/${d} 0:0:0='),
    ]
    fits = [first.str.contains(selection)
            & read(first.str.replace(pattern, layout), False).is_not_null()
            for selection, pattern, layout in formats]
    guessed = [
        pl.when(fit)
        .then(pl.when(bare).then(text.str.replace(pattern, layout))
              .when(~trail).then(text.str.replace(blanks(pattern, r"\s+", ""), layout))
              .when(~lead).then(text.str.replace(blanks(pattern, "", r"\s+"), layout))
              .otherwise(text.str.replace(blanks(pattern, r"\s+", r"\s+"), layout)))
        for fit, (selection, pattern, layout) in zip(fits, formats)
    ]
    # a first value in none of these formats (a word, an impossible day such as
    # 2024-02-30, am/pm, a time zone): pandas guesses another format or none and
    # reads the values its own way, so pandas reads them here
    known = first.is_null() | pl.any_horizontal(fits)

    def by_pandas(columns):
        values, known = columns
        if known.len() == 0 or known.all():
            return pl.Series(values.name, [None] * values.len(), dtype=pl.Datetime("us"))
        pandas = __import__("pandas")

        dates = pandas.to_datetime(values.to_pandas(), errors="coerce" if coerce else "raise")
        if dates.dtype.kind != "M" or getattr(dates.dtype, "tz", None) is not None:
            raise ValueError("pandas reads these values as dates with a time zone, "
                             "which this port does not hold")
        return pl.from_pandas(dates).cast(pl.Datetime("us"))

    ours = read(pl.when(known).then(pl.coalesce(guessed if coerce else [*guessed, text])),
                not coerce)
    return pl.coalesce(ours, pl.map_batches([written, known], by_pandas,
                                            return_dtype=pl.Datetime("us")))


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


# The characters Python's str.isspace() calls whitespace, which pandas' str.strip() takes
# off: Polars' strip_chars() leaves the separators \x1c-\x1f.
PANDAS_WHITESPACE = (
    "\t\n\x0b\x0c\r\x1c\x1d\x1e\x1f \x85\xa0\u1680"
    "\u2000\u2001\u2002\u2003\u2004\u2005\u2006\u2007"
    "\u2008\u2009\u200a\u2028\u2029\u202f\u205f\u3000"
)

# Datetime columns with a time zone as pandas' to_csv writes them: the time always, then the
# offset (+01:00); no fraction of a second when none has one, milliseconds when they are enough.
PANDAS_CSV_ZONED_DATETIMES = (
    pl.when((pl.selectors.datetime(time_zone="*").dt.microsecond() == 0).all())
    .then(pl.selectors.datetime(time_zone="*").dt.strftime("%Y-%m-%d %H:%M:%S%:z"))
    .when((pl.selectors.datetime(time_zone="*").dt.microsecond() % 1000 == 0).all())
    .then(pl.selectors.datetime(time_zone="*").dt.strftime("%Y-%m-%d %H:%M:%S%.3f%:z"))
    .otherwise(pl.selectors.datetime(time_zone="*").dt.strftime("%Y-%m-%d %H:%M:%S%.6f%:z"))
)

# Datetime columns as pandas' to_csv writes them: dates only when every time in the column is
# midnight, no fraction of a second when none has one, milliseconds when they are enough.
PANDAS_CSV_DATETIMES = (
    pl.when((pl.selectors.datetime() == pl.selectors.datetime().dt.truncate("1d")).all())
    .then(pl.selectors.datetime().dt.strftime("%Y-%m-%d"))
    .when((pl.selectors.datetime().dt.microsecond() == 0).all())
    .then(pl.selectors.datetime().dt.strftime("%Y-%m-%d %H:%M:%S"))
    .when((pl.selectors.datetime().dt.microsecond() % 1000 == 0).all())
    .then(pl.selectors.datetime().dt.strftime("%Y-%m-%d %H:%M:%S%.3f"))
    .otherwise(pl.selectors.datetime().dt.strftime("%Y-%m-%d %H:%M:%S%.6f"))
)

# Duration columns as pandas' to_csv writes them: "2 days" when every value is a whole number
# of days, else "-1 days +23:00:00", with microseconds when one value has them.
PANDAS_CSV_DURATIONS = (
    pl.when((pl.selectors.duration().dt.total_microseconds() % 86_400_000_000 == 0).all())
    .then(
        (pl.selectors.duration().dt.total_microseconds() // 86_400_000_000).cast(pl.String)
        + " days"
    )
    .otherwise(
        (pl.selectors.duration().dt.total_microseconds() // 86_400_000_000).cast(pl.String)
        + pl.when(pl.selectors.duration().dt.total_microseconds() < 0)
        .then(pl.lit(" days +"))
        .otherwise(pl.lit(" days "))
        + (pl.selectors.duration().dt.total_microseconds() % 86_400_000_000 // 3_600_000_000)
        .cast(pl.String).str.zfill(2)
        + ":"
        + (pl.selectors.duration().dt.total_microseconds() % 3_600_000_000 // 60_000_000)
        .cast(pl.String).str.zfill(2)
        + ":"
        + (pl.selectors.duration().dt.total_microseconds() % 60_000_000 // 1_000_000)
        .cast(pl.String).str.zfill(2)
        + pl.when((pl.selectors.duration().dt.total_microseconds() % 1_000_000 == 0).all())
        .then(pl.lit(""))
        .otherwise(
            "." + (pl.selectors.duration().dt.total_microseconds() % 1_000_000)
            .cast(pl.String).str.zfill(6)
        )
    )
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
from sklearn.model_selection import train_test_split, cross_val_score, KFold
from sklearn.compose import ColumnTransformer
from sklearn.preprocessing import OneHotEncoder, StandardScaler
from sklearn.pipeline import Pipeline
from sklearn.linear_model import LogisticRegression, LinearRegression
from sklearn.metrics import accuracy_score, roc_auc_score, r2_score

lambings = (
    pl.scan_csv(
        "data/lambings.csv",
        null_values=PANDAS_NA_VALUES,
        infer_schema_length=None,
    )
    .with_columns(pandas_to_datetime(pl.col("lambed"), coerce=False))
    .collect()
    .lazy()
)
fields = pl.scan_csv(
    "data/fields.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)

print(lambings.head(10).collect())
print((lambings.select(pl.len()).collect().item(), len(lambings.collect_schema())))
print(lambings.collect().to_pandas().describe())
# TODO(porter): frame.isna: the frame's columns are not known; per-column counts are
#   lf.null_count(); row masks are pl.any_horizontal(pl.col(columns).is_null())
print(lambings.collect().to_pandas().isna().sum())
print(
    lambings.select(pl.col("breed"))
    .drop_nulls()
    .group_by("breed", maintain_order=True)
    .agg(pl.len().cast(pl.Int64).alias("count"))
    .sort("count", descending=True, maintain_order=True)
    .collect(),
)
print(
    lambings.select(pl.col("assisted"))
    .drop_nulls()
    .group_by("assisted", maintain_order=True)
    .agg(pl.len().cast(pl.Int64).alias("count"))
    .sort("count", descending=True, maintain_order=True)
    .collect(),
)

# --- cleaning
lambings = lambings.unique(keep="first", maintain_order=True)
lambings = lambings.with_columns(
    field=pandas_title(pl.col("field").str.strip_chars(PANDAS_WHITESPACE)),
)
lambings = lambings.filter(pl.col("field").is_not_null())
lambings = lambings.with_columns(
    ewe_kg=pl.col("ewe_kg").fill_null(pl.col("ewe_kg").median()),
)
lambings = lambings.with_columns(ewe_kg=pl.col("ewe_kg").clip(30, 95))  # a few misread scales
lambings = lambings.with_columns(condition=pl.col("condition").fill_null(3))
lambings = (
    lambings
    .rename(
        lambda c, other=fields.collect_schema().names(): c + "_x" if c in other and c not in ("field",) else c,
    )
    .join(
        fields.rename(
            lambda c, other=lambings.collect_schema().names(): c + "_y" if c in other and c not in ("field",) else c,
        ),
        on="field",
        how="left",
        nulls_equal=True,
        maintain_order="left_right",
    )
)
lambings = lambings.with_columns(shelter=pl.col("shelter").fill_null(pl.lit("none")))
lambings = (
    lambings
    .with_columns(
        altitude_m=pl.col("altitude_m")
        .fill_null(pandas_column_total(pl.col("altitude_m"), "mean")),
    )
    .collect()
    .lazy()
)
# TODO(porter): frame.isna: the frame's columns are not known; per-column counts are
#   lf.null_count(); row masks are pl.any_horizontal(pl.col(columns).is_null())
print(lambings.collect().to_pandas().isna().sum())

# --- features
lambings = lambings.with_columns(lost=pl.col("born") - pl.col("alive_48h"))
lambings = lambings.with_columns(
    any_lost=(pl.col("lost") > 0).fill_null(False).cast(pl.Int64),
)
lambings = lambings.with_columns(
    survival=(pl.col("alive_48h") / pl.col("born")).fill_nan(None),
)
lambings = lambings.with_columns(log_birth_kg=np.log(pl.col("birth_kg")).fill_nan(None))
lambings = lambings.with_columns(
    helped=(pl.col("assisted") == "yes").fill_null(False).cast(pl.Int64),
)
lambings = (
    lambings
    .with_columns(hour=pl.col("lambed").dt.hour().cast(pl.Int32))
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("hour",) if t[c].has_nulls()]),
    )
    .lazy()
)
lambings = lambings.with_columns(
    night=((pl.col("hour") >= 20) | (pl.col("hour") < 6))
    .fill_null(False)
    .cast(pl.Int64),
)
lambings = lambings.with_columns(week=pl.col("lambed").dt.week().cast(pl.UInt32))
lambings = lambings.with_columns(
    age_band=pl.when(pl.col("ewe_age").is_between(0, 2, closed="right"))
    .then(pl.lit("gimmer"))
    .when(pl.col("ewe_age").is_between(2, 4, closed="right"))
    .then(pl.lit("young"))
    .when(pl.col("ewe_age").is_between(4, 6, closed="right"))
    .then(pl.lit("prime"))
    .when(pl.col("ewe_age").is_between(6, 10, closed="right"))
    .then(pl.lit("old"))
    .cast(pl.Enum(["gimmer", "young", "prime", "old"])),
)
lambings = (
    lambings
    .with_columns(
        weight_band=pl.when(pl.col("ewe_kg") <= pandas_quantile(pl.col("ewe_kg"), 0.25))
        .then(pl.lit("light"))
        .when(pl.col("ewe_kg") <= pandas_quantile(pl.col("ewe_kg"), 0.5))
        .then(pl.lit("mid"))
        .when(pl.col("ewe_kg") <= pandas_quantile(pl.col("ewe_kg"), 0.75))
        .then(pl.lit("heavy"))
        .when(pl.col("ewe_kg") <= pl.col("ewe_kg").max())
        .then(pl.lit("big"))
        .cast(pl.Enum(["light", "mid", "heavy", "big"])),
    )
    .collect()
    .lazy()
)
print(
    pandas_category_counts(lambings.select(pl.col("age_band")).drop_nulls(), "age_band")
    .sort("count", descending=True, maintain_order=True)
    .collect(),
)
print(lambings.select("ewe_kg", "weight_band").head(5).collect())

# TODO(porter): frame.select_dtypes: a frame with a column whose type porter does not know; select
#   the columns by their types (pl.selectors), as pandas holds them
numbers = lambings.collect().to_pandas().select_dtypes(include="number")
print(numbers.columns.tolist())
corr = numbers.corr()
print(corr.round(2))

# --- pictures
fig, axes = plt.subplots(1, 2, figsize=(11, 4))
axes[0].hist(
    lambings.select(pl.col("birth_kg")).collect().to_series().to_pandas(),
    bins=20,
    color="olive",
)
axes[0].set_xlabel("mean lamb weight (kg)")
axes[1].scatter(
    lambings.select(pl.col("ewe_kg")).collect().to_series().to_pandas(),
    lambings.select(pl.col("birth_kg")).collect().to_series().to_pandas(),
    c=lambings.select(pl.col("born")).collect().to_series().to_pandas(),
    s=12,
    cmap="viridis",
)
axes[1].set_xlabel("ewe weight (kg)")
fig.tight_layout()
fig.savefig("data/weights.png")
plt.close(fig)

plt.figure(figsize=(8, 8))
sns.heatmap(corr, annot=True, fmt=".1f", cmap="RdBu_r", center=0)
plt.tight_layout()
plt.savefig("data/corr.png")
plt.close()

sns.violinplot(
    data=lambings.collect().to_pandas(),
    x="breed",
    y="birth_kg",
    hue="helped",
)
plt.savefig("data/birth_kg_by_breed.png")
plt.close()

sns.boxplot(
    data=lambings.collect().to_pandas(),
    x="age_band",
    y="survival",
    hue="shelter",
)
plt.savefig("data/survival_by_age.png")
plt.close()

daily = (
    lambings
    .with_columns(pl.col("lambed").dt.date().alias("lambed"))
    .with_columns(_porter_rows_in_key_order=pl.col("lambed").is_sorted())
    .drop_nulls("lambed")
    .group_by("lambed")
    .agg(pl.col("born"), pl.col("_porter_rows_in_key_order").first())
    .with_columns(
        pandas_group_sums(
            pl.col("born"),
            floats=False,
            in_key_order=pl.col("_porter_rows_in_key_order"),
        ),
    )
    .drop("_porter_rows_in_key_order")
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort("lambed")
    .collect()
    .lazy()
)
plt.figure(figsize=(9, 3))
plt.plot(
    daily.select(pl.col("lambed")).collect().to_series().to_pandas().dt.date.to_frame().set_index("lambed").index,
    daily.select(pl.col("born")).collect().to_series().to_numpy(),
    marker=".",
)
plt.ylabel("lambs born")
plt.savefig("data/daily.png")
plt.close()

weekly = (
    lambings
    .drop_nulls(["week", "shepherd"])
    .group_by(["week", "shepherd"])
    .agg(pl.col("lost"))
    .with_columns(pandas_group_sums(pl.col("lost"), floats=False))
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort(["week", "shepherd"])
)
sns.lineplot(data=weekly.collect().to_pandas(), x="week", y="lost", hue="shepherd")
plt.savefig("data/weekly_losses.png")
plt.close()

grid = (
    lambings
    .with_columns(
        _porter_rows_in_key_order=pl.when(~pl.any_horizontal(pl.col("age_band", "field").is_null())).then(pl.struct("age_band", "field")).is_sorted() & ~pl.col("survival").fill_nan(None).is_null().any(),
    )
    .drop_nulls(["age_band", "field"])
    .group_by(["age_band", "field"])
    .agg(pl.col("survival"), pl.col("_porter_rows_in_key_order").first())
    .with_columns(
        pandas_group_sums(
            pl.col("survival"),
            mean=True,
            in_key_order=pl.col("_porter_rows_in_key_order"),
        ),
    )
    .drop("_porter_rows_in_key_order")
    .drop_nulls("survival")
    .sort("field")
    .collect()
    .pivot(on="field", index="age_band", values="survival")
    .sort("age_band")
    .lazy()
)
print(grid.with_columns(pl.selectors.float().round(3)).collect())
sns.heatmap(
    grid.collect().to_pandas().set_index("age_band").rename_axis(columns="field"),
    annot=True,
    fmt=".2f",
    cmap="YlGn",
)
plt.savefig("data/survival_grid.png")
plt.close()

# --- birth weight from the ewe's weight
lin = LinearRegression()
lin.fit(
    lambings.select(pl.col("ewe_kg")).collect().to_series().to_numpy().reshape(-1, 1),
    lambings.select(pl.col("birth_kg")).collect().to_series().to_numpy(),
)
print(
    "slope",
    round(lin.coef_[0], 4),
    "r2",
    round(
        r2_score(
            lambings.select(pl.col("birth_kg")).collect().to_series().to_pandas(),
            lin.predict(
                lambings.select(pl.col("ewe_kg")).collect().to_series().to_numpy().reshape(-1, 1),
            ),
        ),
        3,
    ),
)
lambings = (
    lambings
    .with_columns(
        birth_kg_fit=pl.Series(
            lin.predict(lambings.select("ewe_kg").collect().to_pandas().to_numpy()),
            nan_to_null=True,
        ),
    )
    .collect()
    .lazy()
)

# --- will a ewe lose a lamb?
numeric = ["ewe_age", "ewe_kg", "condition", "born", "birth_kg", "altitude_m", "helped", "night"]
categorical = ["breed", "shelter"]
X = (
    lambings
    .select(
        "ewe_age",
        "ewe_kg",
        "condition",
        "born",
        "birth_kg",
        "altitude_m",
        "helped",
        "night",
        "breed",
        "shelter",
    )
    .collect()
    .lazy()
)
y = pl.col("any_lost")
X_train, X_test, y_train, y_test = train_test_split(
    X.collect().to_pandas(),
    lambings.select(y.alias("any_lost")).collect().to_series().to_pandas(),
    test_size=0.25,
    random_state=1,
    stratify=lambings.select(y.alias("any_lost")).collect().to_series().to_pandas(),
)

prep = ColumnTransformer([
    ("num", StandardScaler(), numeric),
    ("cat", OneHotEncoder(handle_unknown="ignore"), categorical),
])
model = Pipeline([("prep", prep), ("clf", LogisticRegression(max_iter=500))])
model.fit(X_train, y_train)
pred = model.predict(X_test)
proba = model.predict_proba(X_test)[:, 1]
print("accuracy", round(accuracy_score(y_test, pred), 3), "auc", round(roc_auc_score(y_test, proba), 3))

folds = KFold(n_splits=5, shuffle=True, random_state=3)
scores = cross_val_score(
    model,
    X.collect().to_pandas(),
    lambings.select(y.alias("any_lost")).collect().to_series().to_pandas(),
    cv=folds,
    scoring="accuracy",
)
print("cv accuracy", scores.round(3), scores.mean().round(3))

lambings = lambings.with_columns(
    risk=pl.Series(
        model.predict_proba(X.collect().to_pandas())[:, 1],
        nan_to_null=True,
    ),
)
lambings = (
    lambings
    .with_columns(
        flag=pl.when(pl.col("risk") > 0.5)
        .then(pl.lit("watch"))
        .otherwise(pl.lit("ok")),
    )
    .collect()
    .lazy()
)
print(
    lambings.select(pl.col("flag"))
    .drop_nulls()
    .group_by("flag", maintain_order=True)
    .agg(pl.len().cast(pl.Int64).alias("count"))
    .sort("count", descending=True, maintain_order=True)
    .collect(),
)

names = model.named_steps["prep"].get_feature_names_out()
weights = (
    pl.from_pandas(
        pd.DataFrame({"feature": names, "weight": model.named_steps["clf"].coef_[0]}),
    )
    .lazy()
)
weights = weights.with_columns(size=pl.col("weight").abs())
weights = weights.pipe(pandas_sort_values, "size", descending=True)
(
    weights
    .with_columns(PANDAS_CSV_ZONED_DATETIMES)
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_DATETIMES,
        PANDAS_CSV_DURATIONS,
        PANDAS_CSV_FLOATS,
        PANDAS_CSV_LISTS,
        PANDAS_CSV_NUMBER_LISTS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("data/weights.csv")
)

# --- write it up
by_field = (
    lambings
    .drop_nulls(["field", "shelter"])
    .group_by(["field", "shelter"])
    .agg(
        pl.col("ewe").drop_nulls().n_unique().cast(pl.Int64).alias("ewes"),
        pl.col("born"),
        pl.col("lost"),
        pl.col("birth_kg").alias("mean_birth_kg"),
        pl.col("risk").alias("mean_risk"),
    )
    .with_columns(
        pandas_group_sums(pl.col("born"), floats=False),
        pandas_group_sums(pl.col("lost"), floats=False),
        pandas_group_sums(pl.col("mean_birth_kg"), mean=True, floats=False),
        pandas_group_sums(pl.col("mean_risk"), mean=True, floats=False),
    )
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort(["field", "shelter"])
)
by_field = by_field.with_columns(
    loss_rate=(pl.col("lost") / pl.col("born")).fill_nan(None).round(3),
)
by_field = by_field.with_columns(mean_birth_kg=pl.col("mean_birth_kg").round(2))
by_field = by_field.with_columns(mean_risk=pl.col("mean_risk").round(3))
(
    by_field
    .with_columns(PANDAS_CSV_ZONED_DATETIMES)
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_DATETIMES,
        PANDAS_CSV_DURATIONS,
        PANDAS_CSV_FLOATS,
        PANDAS_CSV_LISTS,
        PANDAS_CSV_NUMBER_LISTS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("data/by_field.csv")
)

by_breed = (
    lambings
    .drop_nulls("breed")
    .group_by("breed")
    .agg(
        pl.col("birth_kg").count().cast(pl.Int64).alias("count"),
        pl.col("birth_kg").alias("mean"),
        pl.col("birth_kg").std().alias("std"),
        pl.col("birth_kg").min().alias("min"),
        pl.col("birth_kg").max().alias("max"),
    )
    .with_columns(pandas_group_sums(pl.col("mean"), mean=True, floats=False))
    .sort("breed")
    .with_columns((pl.selectors.float() - pl.selectors.by_name("breed")).round(2))
)
(
    by_breed
    .with_columns(PANDAS_CSV_ZONED_DATETIMES)
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_DATETIMES,
        PANDAS_CSV_DURATIONS,
        PANDAS_CSV_FLOATS,
        PANDAS_CSV_LISTS,
        PANDAS_CSV_NUMBER_LISTS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("data/by_breed.csv")
)

watch = (
    lambings
    .filter(pl.col("flag") == "watch")
    .pipe(pandas_sort_values, "risk", descending=True)
)
watch = watch.select(
    "ewe",
    "field",
    "breed",
    "ewe_age",
    "condition",
    "born",
    "lost",
    "risk",
)
watch = watch.with_columns(risk=pl.col("risk").round(3))
(
    watch
    .with_columns(PANDAS_CSV_ZONED_DATETIMES)
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_DATETIMES,
        PANDAS_CSV_DURATIONS,
        PANDAS_CSV_FLOATS,
        PANDAS_CSV_LISTS,
        PANDAS_CSV_NUMBER_LISTS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("data/watch_list.csv")
)
