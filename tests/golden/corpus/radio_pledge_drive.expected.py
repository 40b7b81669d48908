"""Community radio pledge week: volunteer hours on the rota, the pledges listeners phoned in,
each show's takings against its target, and who took the calls.

Hours 'N/A' means the sheet was not signed (the hours are not counted); a pledge with no sum
counts as a promise but adds nothing.
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


def pandas_dates_as_text(groups, key, fmt):
    """The groups of a pivot with their date `key` written with the strftime format `fmt`
    (Polars' to_string of each date): the names the script gives the pivoted columns next
    (df.columns = df.columns.strftime(fmt)). Two dates written alike would make pandas keep
    two columns of one name, which a Polars frame cannot hold: that stops here."""
    dates = groups.get_column(key).unique()
    if dates.dt.to_string(fmt).n_unique() != dates.len():
        raise ValueError(f"two dates are written alike with {fmt!r}: pandas keeps two columns "
                         "of one name, a Polars frame cannot")
    return groups.with_columns(pl.col(key).dt.to_string(fmt))


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

# Integer columns as pandas' to_csv writes them: one holding a missing value is float in
# pandas (2024.0), one without stays integer (2024).
PANDAS_CSV_INTS = (
    pl.when(pl.selectors.integer().null_count() > 0)
    .then(pl.selectors.integer().cast(pl.Float64).cast(pl.String))
    .otherwise(pl.selectors.integer().cast(pl.String))
)


def clean(col):
    return pandas_title(col.str.strip_chars(PANDAS_WHITESPACE))


# %% the rota
rota = (
    pl.scan_csv(
        "data/rota.csv",
        null_values=PANDAS_NA_VALUES + [],
        infer_schema_length=None,
    )
    .with_columns(pandas_to_datetime(pl.col("day"), coerce=False))
)
rota = rota.unique(keep="first", maintain_order=True)
rota = rota.with_columns(volunteer=clean(pl.col("volunteer")))
rota = rota.drop_nulls("volunteer").collect().lazy()
print(rota.head(5).collect())

# TODO(porter): frame.pivot_table: margins of sum of a column not known to be whole numbers or
#   floats (floats: sum, mean, min, max and count); group_by the keys, then DataFrame.pivot(on,
#   index, values) with the columns sorted
hours = (
    rota.collect()
    .to_pandas()
    .pivot_table(
        index=["volunteer"],
        columns=["role"],
        values="hours",
        aggfunc="sum",
        fill_value=0,
        margins=True,
        margins_name="total",
    )
)
print(hours)
busiest = hours.drop(index="total")["total"].idxmax()
print("busiest:", busiest, hours.loc[busiest, "total"])
hours = hours.reset_index().rename_axis(columns=None)
hours.to_csv("data/volunteer_hours.csv", index=False)

# slots per show and day of the week, a day with no slot for a show is a 0
rota = rota.with_columns(weekday=pl.col("day").dt.to_string("%A"))
per = (
    rota
    .drop_nulls(["show", "weekday"])
    .group_by(["show", "weekday"])
    .agg(pl.len().cast(pl.Int64).alias("size"))
    .sort(["show", "weekday"])
    .select(pl.col("show"), pl.col("weekday"), pl.col("size").alias("0"))
)
per = (
    per
    .sort("weekday")
    .collect()
    .pivot(on="weekday", index="show", values="0")
    .sort("show")
    .fill_null(0)
    .lazy()
)
per = (
    per
    .with_row_index("__stack_row")
    .unpivot(
        index=["__stack_row", "show"],
        variable_name="weekday",
        value_name="values",
    )
    .sort("__stack_row", maintain_order=True)
    .drop("__stack_row")
    .select(pl.col("show"), pl.col("weekday"), pl.col("values").alias("slots"))
    .collect()
    .lazy()
)
# TODO(porter): series.xs: a label of another type than the key (or a key of unknown type); filter
#   the key column and drop it
print(
    per.collect()
    .to_pandas()
    .set_index(["show", "weekday"])["slots"]
    .xs("Drive", level="show"),
)
quiet = (
    per
    .filter(pl.col("slots") == 0)
    .select(pl.col("show").unique(maintain_order=True))
    .collect()
    .to_series()
    .to_numpy()
)
print("shows with an empty weekday:", sorted(quiet))

# %% pledges
pledges = (
    pl.scan_csv(
        "data/pledges.csv",
        null_values=PANDAS_NA_VALUES + [],
        infer_schema_length=None,
    )
    .with_columns(pandas_to_datetime(pl.col("day"), coerce=False))
)
pledges = pledges.with_columns(
    method=pl.col("method").str.replace_many({"İ": "i", "Σ": "σ"}).str.to_lowercase(),
)
pledges = pledges.with_columns(show=pl.col("show").fill_null(pl.lit("unknown")))
pledges = (
    pledges
    .with_columns(taken_by=pl.col("taken_by").fill_null(pl.lit("by post")))
    .collect()
    .lazy()
)
# TODO(porter): series.describe: describe of a column not known to hold numbers (pandas describes
#   text, True/False and dates with other statistics)
print(pledges.select(pl.col("amount")).collect().to_series().to_pandas().describe())

ways = (
    pledges
    .drop_nulls(["show", "method"])
    .group_by(["show", "method"])
    .agg(pl.len().cast(pl.Int64))
    .with_columns(pandas_div(pl.col("len"), pl.col("len").sum().over("show")))
    .sort("method")
    .collect()
    .pivot(on="method", index="show", values="len")
    .sort("show")
    .with_columns(pl.exclude("show").fill_null(0.0))
    .lazy()
    .with_columns((pl.selectors.float() - pl.selectors.by_name("show")).round(3))
)
print(ways.collect())
# TODO(porter): pd.crosstab: margins with an index key not known to be text (the total row's label
#   goes into it); group_by both keys and pl.len(), then pivot with the columns sorted
sums = pd.crosstab(
    pledges.select(pl.col("show")).collect().to_series().to_pandas(),
    pledges.select(pl.col("method")).collect().to_series().to_pandas(),
    values=pledges.select(pl.col("amount")).collect().to_series().to_pandas(),
    aggfunc="sum",
    margins=True,
)
print(sums)
print("card total:", sums.loc["All", "card"])

by_show = (
    pledges
    .drop_nulls("show")
    .group_by("show")
    .agg(
        pl.col("pledge").count().cast(pl.Int64).alias("pledges"),
        pl.col("amount").alias("raised"),
        pl.col("amount").max().alias("biggest"),
    )
    .with_columns(pandas_group_sums(pl.col("raised"), floats=False))
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort("show")
)
schedule = (
    pl.scan_csv(
        "data/schedule.csv",
        null_values=PANDAS_NA_VALUES,
        infer_schema_length=None,
    )
    .select("show", pl.exclude("show"))
)
# TODO(porter): frame.sort_index: row labels that are original row numbers after a filter or sort,
#   or keys that may repeat: keep them in a column (with_row_index) and sort by it; the index is not
#   data in Polars: sort by the column that holds the labels
schedule = schedule.collect().to_pandas().set_index("show").sort_index()
print(schedule.loc["Breakfast"])
# TODO(porter): handover.unknown_code: passed to code porter does not understand: handed over to
#   pandas with .collect().to_pandas(); port that code to take a Polars frame
board = schedule.merge(
    by_show.collect().to_pandas().set_index("show"),
    left_index=True,
    right_index=True,
    how="outer",
)
board["raised"] = board["raised"].fillna(0)
board["of_target"] = (board["raised"] / board["target"]).round(3)
board["per_hour"] = board["raised"] / board["slot_hours"]
board = board.rename_axis("show").reset_index()
board = pl.from_pandas(board).lazy()
(
    board
    .with_columns(PANDAS_CSV_ZONED_DATETIMES)
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_DATETIMES,
        PANDAS_CSV_DURATIONS,
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("data/show_board.csv")
)
print(board.collect())

# %% who took the calls, day by day, in long form
taken = (
    pledges
    .drop_nulls(["taken_by", "day"])
    .group_by(["taken_by", "day"])
    .agg(pl.col("amount").count().cast(pl.Int64))
    .sort("day")
    .collect()
    .pipe(pandas_dates_as_text, "day", "%a %d")
    .pivot(on="day", index="taken_by", values="amount")
    .sort("taken_by")
    .fill_null(0)
    .lazy()
)
long = (
    taken
    .with_row_index("__melt_row")
    .unpivot(index=["taken_by", "__melt_row"], variable_name="day", value_name="calls")
    .sort(pl.col("day").cast(pl.Enum(taken.collect_schema().names())), "__melt_row")
    .drop("__melt_row")
)
long = (
    long
    .filter(pl.col("calls") > 0)
    .sort(["taken_by", "day"], nulls_last=True, maintain_order=True)
)
long = long.collect().lazy()
# TODO(porter): frame.loc: a label of another type than the key column (or a key of unknown type)
print(long.collect().to_pandas().set_index("taken_by").loc["Émile Sand"])
(
    long
    .with_columns(PANDAS_CSV_ZONED_DATETIMES)
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_DATETIMES,
        PANDAS_CSV_DURATIONS,
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("data/calls_taken.csv")
)
