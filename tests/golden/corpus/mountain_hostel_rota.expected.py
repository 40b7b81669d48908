"""Mountain hostel network: bed-nights per hostel over the July season, how full each hostel
ran for its beds, and who cleaned what on the rota.

A stay is one party's night in a hostel; 'N/A' guests were not counted by the warden.
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


def tidy(col):
    return col.str.strip_chars(PANDAS_WHITESPACE)


def share(part, whole):
    return (part / whole).round(3)


# %% bed-nights
stays = (
    pl.scan_csv(
        "data/stays.csv",
        null_values=PANDAS_NA_VALUES + [],
        infer_schema_length=None,
    )
    .with_columns(pandas_to_datetime(pl.col("night"), coerce=False))
)
print(stays.select(pl.len()).collect().item(), "stays on the sheet")
stays = stays.unique("stay_id", keep="first", maintain_order=True)
stays = stays.with_columns(hostel=tidy(pl.col("hostel")))
stays = stays.drop_nulls("hostel")

nightly = (
    stays
    .with_columns(
        _porter_rows_in_key_order=pl.when(
            ~pl.any_horizontal(pl.col("night", "hostel").is_null()),
        )
        .then(pl.struct("night", "hostel"))
        .is_sorted(),
    )
    .drop_nulls(["night", "hostel"])
    .group_by(["night", "hostel"])
    .agg(pl.col("guests"), pl.col("_porter_rows_in_key_order").first())
    .with_columns(
        pandas_group_sums(
            pl.col("guests"),
            floats=False,
            in_key_order=pl.col("_porter_rows_in_key_order"),
        ),
    )
    .drop("_porter_rows_in_key_order")
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort(["night", "hostel"])
)
# TODO(porter): series.unstack: values of type unknown: pandas makes an object column when a
#   combination is missing; pivot(on=key, index=other keys) on the collected groups, columns sorted
#   first
grid = (
    nightly.collect()
    .to_pandas()
    .set_index(["night", "hostel"])["guests"]
    .unstack("hostel", fill_value=0)
)
season = pl.datetime_range(
    pl.datetime(2026, 7, 1),
    pl.datetime(2026, 7, 31),
    "1d",
    eager=True,
)
grid = grid.reindex(season, fill_value=0)
grid = grid.rename_axis("night")
print(grid.index.name, len(grid), "nights")
print(grid.head())

# long and back again: the warden's sheet wants one row per night, one column per hostel
long = grid.reset_index().melt(id_vars="night", var_name="hostel", value_name="bed_nights")
long = long[long["bed_nights"] > 0]
back = long.pivot(index="night", columns="hostel", values="bed_nights")
back = back.fillna(0)
print(back.shape)
back.index = back.index.strftime("%d %b")
back = back.rename_axis(index="night", columns=None).reset_index()
back.to_csv("data/nightly_sheet.csv", index=False)

totals = grid.sum()
peak = grid.max()
busy = (grid > 0).sum()
# TODO(porter): pd.concat: axis=1 of values other than named Series labelled by one key lines them
#   up by their row labels: join on the label columns
summary = pd.concat([totals.rename("bed_nights"), peak.rename("peak"), busy.rename("open_nights")], axis=1)
hostels = (
    pl.scan_csv(
        "data/hostels.csv",
        null_values=PANDAS_NA_VALUES,
        infer_schema_length=None,
    )
    .select("hostel", pl.exclude("hostel"))
    .collect()
    .lazy()
)
# TODO(porter): frame.loc: a label of another type than the key column (or a key of unknown type)
print(hostels.collect().to_pandas().set_index("hostel").loc["Refuge Écrins"])
# TODO(porter): frame.at: a label of another type than the key column (or a key of unknown type);
#   filter the column holding the labels and take the value: lf.filter(pl.col(key) ==
#   label).select(c).collect().item()
print(
    "Grauhorn beds",
    hostels.collect().to_pandas().set_index("hostel").at["Grauhorn", "beds"],
)
# TODO(porter): frame.join: DataFrame.join aligns on the index: make the index a column and use
#   LazyFrame.join(on=...)
summary = hostels.collect().to_pandas().set_index("hostel").join(summary, how="left")
summary["bed_nights"] = summary["bed_nights"].fillna(0)
summary["occupancy"] = share(summary["bed_nights"], summary["beds"] * 31)
# TODO(porter): pd.cut: cutting something other than a column
summary["band"] = pd.cut(summary["occupancy"], bins=[0, 0.15, 0.3, 1, float("inf")],
                         labels=["quiet", "steady", "busy", "overfull"])
summary = summary.sort_index()
print(summary)
summary.to_csv("data/hostel_summary.csv")

# %% cleaning rota
rota = (
    pl.scan_csv("data/rota.csv", null_values=PANDAS_NA_VALUES, infer_schema_length=None)
    .with_columns(pandas_to_datetime(pl.col("day"), coerce=False))
)
rota = rota.with_columns(task=pl.col("tasks").str.split(";"))
rota = rota.explode("task", empty_as_null=True, keep_nulls=True)
rota = (
    rota
    .with_columns(
        task=tidy(pl.col("task"))
        .str.replace_many({"İ": "i", "Σ": "σ"})
        .str.to_lowercase(),
    )
    .collect()
    .lazy()
)
print(
    rota.select(pl.col("task"))
    .group_by("task", maintain_order=True)
    .agg(pl.len().cast(pl.Int64).alias("count"))
    .sort("count", descending=True, maintain_order=True)
    .collect(),
)
done = (
    rota
    .select(pl.col("task"))
    .collect()
    .pipe(
        lambda d: d.select(*(pl.col("task").eq_missing(v).cast(pl.Int64).alias(f"did_{v}") for v in d["task"].drop_nulls().unique().sort())),
    )
    .lazy()
)
rota = pl.concat([rota.drop("tasks"), done], how="horizontal").collect().lazy()
per_cleaner = (
    rota
    .select("cleaner", pl.col(list(done.collect_schema().names())))
    .drop_nulls("cleaner")
    .group_by("cleaner")
    .agg(pl.all())
    .with_columns(pandas_group_sums(pl.selectors.list(), floats=False))
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort("cleaner")
    .collect()
    .lazy()
)
print(per_cleaner.collect())

who = (
    rota
    .drop_nulls(["cleaner", "hostel"])
    .group_by(["cleaner", "hostel"])
    .agg(pl.len().cast(pl.Int64))
    .with_columns(pandas_div(pl.col("len"), pl.col("len").sum().over("hostel")))
    .sort("hostel")
    .collect()
    .pivot(on="hostel", index="cleaner", values="len")
    .sort("cleaner")
    .with_columns(pl.exclude("cleaner").fill_null(0.0))
    .lazy()
    .with_columns((pl.selectors.float() - pl.selectors.by_name("cleaner")).round(3))
    .collect()
    .lazy()
)
print(who.collect())
# TODO(porter): frame.at: a label of another type than the key column (or a key of unknown type);
#   filter the column holding the labels and take the value: lf.filter(pl.col(key) ==
#   label).select(c).collect().item()
print(
    "Céline's share of Grauhorn",
    who.collect()
    .to_pandas()
    .set_index("cleaner")
    .rename_axis(columns="hostel")
    .at["Céline", "Grauhorn"],
)

visits = rota.unique("visit", keep="first", maintain_order=True)
minutes = (
    visits
    .drop_nulls(["hostel", "cleaner"])
    .group_by(["hostel", "cleaner"])
    .agg(pl.col("minutes"))
    .with_columns(pandas_group_sums(pl.col("minutes"), floats=False))
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort(["hostel", "cleaner"])
    .collect()
    .lazy()
)
# TODO(porter): series.sort_index: row labels that are original row numbers after a filter or sort,
#   or keys that may repeat: keep them in a column (with_row_index) and sort by it
by_cleaner = (
    minutes.select("cleaner", "hostel", "minutes")
    .collect()
    .to_pandas()
    .set_index(["cleaner", "hostel"])["minutes"]
    .sort_index()
)
print(by_cleaner.xs("Ana", level="cleaner"))
# TODO(porter): series.xs: a label of another type than the key (or a key of unknown type); filter
#   the key column and drop it
bergsee = (
    minutes.collect()
    .to_pandas()
    .set_index(["hostel", "cleaner"])["minutes"]
    .xs("Bergsee", level="hostel")
)
print("Bergsee's cleaners", list(bergsee.index))
work = by_cleaner.reset_index(name="minutes")
# TODO(porter): handover.unknown_code: passed to code porter does not understand: handed over to
#   pandas with .collect().to_pandas(); port that code to take a Polars frame
work = work.merge(per_cleaner.collect().to_pandas(), on="cleaner", how="left")
work.to_csv("data/cleaning_minutes.csv", index=False)
