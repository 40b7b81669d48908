"""Lighthouse stores ledger: the keepers' issues of stores cleaned, each month's issues, each
store's totals and each keeper's last issue (a pandas 1.x notebook, written for pandas 1.5: see
reference.txt).

A blank keeper is the keeper of the line above; 'N/A' unit costs were not priced yet.
"""
import pandas as pd
import polars as pl

# Text that pandas' read_csv reads as a missing value.
PANDAS_NA_VALUES = [
    "", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null",
]


def pandas_append(appended_to, other, ignore_index=False, verify_integrity=False, sort=False):
    """appended_to.append(other) as pandas 1.5 ran it (DataFrame.append and Series.append,
    which pandas 2 removed): pd.concat, where a dict or a Series given to a frame is one row
    first (Series(other).to_frame().T.infer_objects()) and a list of dicts a frame; the append
    of anything else (an Index, a list) is its own."""
    pandas = __import__("pandas")  # (no import statement: a second conversion leaves it be)

    if not isinstance(appended_to, (pandas.DataFrame, pandas.Series)):
        return appended_to.append(other)  # an Index's own append, a list's
    if isinstance(appended_to, pandas.Series):
        if isinstance(other, (list, tuple)):
            return pandas.concat([appended_to, *other], ignore_index=ignore_index,
                                 verify_integrity=verify_integrity)
        return pandas.concat([appended_to, other], ignore_index=ignore_index,
                             verify_integrity=verify_integrity)
    if isinstance(other, (pandas.Series, dict)):
        if isinstance(other, dict):
            if not ignore_index:
                raise TypeError("Can only append a dict if ignore_index=True")
            other = pandas.Series(other)
        if other.name is None and not ignore_index:
            raise TypeError("Can only append a Series if ignore_index=True or if the Series "
                            "has a name")
        names = pandas.Index([other.name], name=appended_to.index.name).names
        other = other.to_frame().T.infer_objects().rename_axis(names)
    elif isinstance(other, list) and other and not isinstance(other[0], pandas.DataFrame):
        other = pandas.DataFrame(other)
        if appended_to.index.name is not None and not ignore_index:
            other.index.name = appended_to.index.name
    to_concat = [appended_to, *other] if isinstance(other, (list, tuple)) else [appended_to, other]
    return pandas.concat(to_concat, ignore_index=ignore_index, verify_integrity=verify_integrity,
                         sort=sort)


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

led = (
    pl.scan_csv(
        "data/ledger.csv",
        null_values=PANDAS_NA_VALUES + [],
        infer_schema_length=None,
    )
    .with_columns(
        pandas_to_datetime(
            pl.concat_str([pl.col("day"), pl.col("time")], separator=" "),
            coerce=False,
        )
        .alias("day_time"),
    )
    .select("day_time", pl.exclude("day", "time", "day_time"))
)
led = led.rename({"day_time": "logged_at"}, strict=False)
led = led.collect().to_pandas()
# TODO(porter): frame.labels: pandas code reads the row labels of `led` later, which are the
#   original row numbers after a filter or sort: pandas makes it; to port it, keep the row number as
#   a column (with_row_index) where the frame is read and use that column where the labels are read
led.drop_duplicates(subset=["entry"], inplace=True)
led["keeper"] = led["keeper"].ffill()
led[["store", "keeper"]] = led[["store", "keeper"]].map(lambda s: s.strip().title())

blanks = {}
for name, values in led.items():
    blanks[name] = int(values.isna().sum())
print("blank per column:", blanks)

led["cost"] = (led["qty"] * led["unit_cost"]).round(2)
led.sort_values(["logged_at", "entry"], inplace=True)
led.to_csv("data/ledger_clean.csv", index=False)

monthly = (
    led.groupby(pd.Grouper(key="logged_at", freq="ME"))[["qty", "cost"]]
    .sum()
    .reset_index()
)
monthly = pl.from_pandas(monthly).lazy()
(
    monthly
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
    .sink_csv("data/monthly.csv")
)

# TODO(porter): pd.DataFrame: an empty DataFrame has no schema to build lazily
stores = pd.DataFrame()
for store, rows in led.groupby("store"):
    stores = pandas_append(stores, {"store": store, "issues": len(rows), "qty": rows["qty"].sum(),
                            "cost": rows["cost"].sum()}, ignore_index=True)
stores["cost_per_unit"] = (stores["cost"] / stores["qty"]).round(2)
stores.to_csv("data/stores.csv", index=False)

last = (
    led.groupby("keeper")[list(led.columns)]
    .apply(lambda g: g.tail(1))
    .reset_index(drop=True)
)
last = last[["keeper", "entry", "logged_at", "store", "qty"]]
last.to_csv("data/last_by_keeper.csv", index=False)
