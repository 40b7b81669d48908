"""Hill-farm shearing gang: the wool-classer's tally of fleeces off the board, the gang list,
what each shearer earned per shed and day, and how the clip graded.

A fleece graded blank was not classed; 'N/A' weight went to the bin unweighed.
"""
import pandas as pd
import polars as pl

# Text that pandas' read_csv reads as a missing value.
PANDAS_NA_VALUES = [
    "", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null",
]


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


GRADE_ORDER = ["AA", "A", "B", "C"]


def tidy_name(col):
    return col.str.strip().str.title()


def per_head(frame, rate_col="rate"):
    # pay is per fleece shorn; the learner (rate 0) gets the day rate instead
    frame["pay"] = frame["fleeces"] * frame[rate_col]
    frame.loc[frame[rate_col] == 0, "pay"] = 95.0
    return frame


# %% the tally
tally = (
    pl.scan_csv(
        "data/fleeces.csv",
        null_values=PANDAS_NA_VALUES + [],
        infer_schema_length=None,
    )
    .with_columns(pandas_to_datetime(pl.col("day"), coerce=False))
)
print((tally.select(pl.len()).collect().item(), len(tally.collect_schema())))
tally = tally.collect().to_pandas()
# TODO(porter): frame.labels: pandas code reads the row labels of `tally` later, which are the
#   original row numbers after a filter or sort: pandas makes it; to port it, keep the row number as
#   a column (with_row_index) where the frame is read and use that column where the labels are read
tally = tally.drop_duplicates(subset=["tally"])
tally["shearer"] = tidy_name(tally["shearer"])
tally["breed"] = tally["breed"].str.title()
tally["grade"] = tally["grade"].str.upper()
print(tally["shearer"].value_counts(dropna=False))

# weights of the clip in bands of the scale
bands = tally["fleece_kg"].value_counts(bins=[1.0, 1.5, 2.0, 2.5, 3.0, 4.0], sort=False)
print(bands)
# TODO(porter): pd.qcut: cutting something other than a column; pl.when(v <= v.quantile(p,
#   "linear")) per bin, cast to pl.Enum(labels)
tally["size"] = pd.qcut(tally["fleece_kg"], q=4, labels=["light", "fair", "good", "heavy"])

# %% kg by shearer and grade (classed fleeces only)
classed = tally[tally["grade"].isin(GRADE_ORDER)]
# TODO(porter): pd.crosstab: the index Series come from a frame an earlier statement left on pandas;
#   group_by both keys and pl.len(), then pivot with the columns sorted
kg = pd.crosstab(classed["shearer"], classed["grade"], values=classed["fleece_kg"], aggfunc="sum")
kg = kg.fillna(0).round(2)
kg["clip"] = kg.sum(axis=1)
kg = kg.sort_values("clip", ascending=False)
print(kg)
top = kg.index[0]
print("best clip:", top, kg.at[top, "clip"])
kg.reset_index(names="shearer").to_csv("data/kg_by_grade.csv", index=False)

# %% shed x day: fleeces and kg
daily = tally.groupby(["shed", "day"]).agg(fleeces=("tally", "count"), kg=("fleece_kg", "sum"))
print(daily.head())
sheds = sorted(tally["shed"].unique())
# TODO(porter): pd.date_range: `start` is computed at run time; porter needs it written out; write
#   the range as pl.datetime_range(start, end, interval, eager=True)
days = pd.date_range(tally["day"].min(), tally["day"].max(), freq="D")
full = (
    pl.LazyFrame({"shed": sheds})
    .join(pl.LazyFrame({"day": days}), how="cross", maintain_order="left_right")
)
daily = daily.reindex(
    full.collect().to_pandas().set_index(["shed", "day"]).index,
    fill_value=0,
)
by_day = daily.swaplevel().sort_index()
print(by_day.loc[pd.IndexSlice["2026-06-08":"2026-06-10", :], "fleeces"])
blaen = daily.loc[pd.IndexSlice["Blaen", :], :].droplevel("shed")
print("Blaen worked", int((blaen["fleeces"] > 0).sum()), "days")
wide = daily["fleeces"].unstack("shed", fill_value=0)
wide = wide[wide.sum(axis=1) > 0]
wide.index = wide.index.strftime("%d/%m")
wide = wide.rename_axis(index="day", columns=None).reset_index()
wide.to_csv("data/fleeces_per_day.csv", index=False)

# %% pay: per shearer and shed, joined to the gang list on the label
count = tally.groupby(["shearer", "shed"])["tally"].count()
pay = count.unstack(fill_value=0).stack()
pay = pay[pay > 0].rename("fleeces").reset_index()
gang = (
    pl.scan_csv("data/gang.csv", null_values=PANDAS_NA_VALUES, infer_schema_length=None)
    .select("shearer", pl.exclude("shearer"))
    .collect()
    .lazy()
)
# TODO(porter): frame.loc: a label of another type than the key column (or a key of unknown type)
print(gang.collect().to_pandas().set_index("shearer").loc["Mared Lusk"])
# TODO(porter): frame.at: a label of another type than the key column (or a key of unknown type);
#   filter the column holding the labels and take the value: lf.filter(pl.col(key) ==
#   label).select(c).collect().item()
print(
    "north gang rate:",
    gang.collect().to_pandas().set_index("shearer").at["Owain Fell", "rate"],
)
totals = pay.groupby("shearer")["fleeces"].sum().to_frame()
# TODO(porter): handover.unknown_code: passed to code porter does not understand: handed over to
#   pandas with .collect().to_pandas(); port that code to take a Polars frame
totals = totals.merge(
    gang.collect().to_pandas().set_index("shearer"),
    left_index=True,
    right_index=True,
    how="left",
)
totals = per_head(totals)
totals["gang"] = totals["gang"].fillna("relief")
totals = totals.sort_index()
totals["kg_each"] = (tally.groupby("shearer")["fleece_kg"].mean()).round(3)
totals.reset_index(names="shearer").to_csv("data/shearer_pay.csv", index=False)
print(totals)

# %% how each breed's fleeces weigh, and grades by flock and breed
summary = tally.groupby("breed")["fleece_kg"].describe()
summary = summary[["count", "mean", "min", "max"]].round(3)
print(summary)
grid = tally.pivot_table(index=["shed", "flock"], columns=["size"], values="fleece_kg",
                         aggfunc="count", fill_value=0, observed=False)
print(grid)
mix = tally.pivot_table(index=["shed", "breed"], values=["fleece_kg", "second_cuts"],
                        aggfunc={"fleece_kg": "mean", "second_cuts": "sum"})
mix = mix.round(3).reset_index()
mix = mix.merge(summary, left_on="breed", right_index=True, how="left")
mix.to_csv("data/breed_mix.csv", index=False)
