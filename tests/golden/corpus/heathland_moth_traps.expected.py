# Moth traps on the heath: what brings the moths out?
# Competition-notebook style: explore, plot, one-hot encode, fit a forest, look at importances.

import numpy as np
import pandas as pd
import polars as pl
import matplotlib

# Text that pandas' read_csv reads as a missing value.
PANDAS_NA_VALUES = [
    "", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null",
]


def pandas_dtypes_text(probe):
    """print(df.dtypes) as pandas prints it, from the frame's probe row (PANDAS_DTYPE_PROBE),
    without importing pandas: each column's type as pandas names it (an integer column with a
    missing value is float64, a True/False one object), names to the left and types to the
    right, only the first and last five of more than sixty columns."""
    kinds = []
    for name, dtype in probe.schema.items():
        missing = probe[name].has_nulls()
        if dtype.is_integer() and dtype not in (pl.Int128, pl.UInt128):
            kind = "float64" if missing else str(dtype).lower()
        elif dtype in (pl.Float32, pl.Float64):
            kind = str(dtype).lower()
        elif dtype == pl.Boolean:
            kind = "object" if missing else "bool"
        elif dtype == pl.String:
            kind = "str"
        elif dtype == pl.Categorical or isinstance(dtype, pl.Enum):
            kind = "category"
        elif isinstance(dtype, pl.Datetime):
            zone = f", {dtype.time_zone}" if dtype.time_zone else ""
            kind = f"datetime64[{dtype.time_unit}{zone}]"
        elif dtype == pl.Date:
            kind = "datetime64[ms]"
        elif isinstance(dtype, pl.Duration):
            kind = f"timedelta64[{dtype.time_unit}]"
        elif dtype in (pl.Time, pl.Null, pl.Binary) \
                or isinstance(dtype, (pl.List, pl.Array, pl.Struct, pl.Decimal)):
            kind = "object"
        else:
            kind = None
        if kind is None or "\t" in name or "\r" in name or "\n" in name:  # pandas names it
            return str(probe.to_pandas().dtypes)
        kinds.append((name, kind))
    if not kinds:
        return "Series([], dtype: object)"
    footer = "dtype: object"
    if len(kinds) > 60:
        footer = f"Length: {len(kinds)}, dtype: object"
        kinds = [*kinds[:5], None, *kinds[-5:]]
    shown = [k for k in kinds if k is not None]
    left = max(len(name) for name, _ in shown)
    right = max(len(kind) for _, kind in shown)
    lines = [" " * left + "   " + "...".center(right + 1) if k is None
             else k[0].ljust(left) + "    " + k[1].rjust(right) for k in kinds]
    return "\n".join([*lines, footer])


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


# The characters Python's str.isspace() calls whitespace, which pandas' str.strip() takes
# off: Polars' strip_chars() leaves the separators \x1c-\x1f.
PANDAS_WHITESPACE = (
    "\t\n\x0b\x0c\r\x1c\x1d\x1e\x1f \x85\xa0\u1680"
    "\u2000\u2001\u2002\u2003\u2004\u2005\u2006\u2007"
    "\u2008\u2009\u200a\u2028\u2029\u202f\u205f\u3000"
)

# One row per column that gives pandas the dtype of the whole column: the first value, or a
# missing value where the column holds one (pandas makes such an int column float64 and a
# True/False one object); no row when the frame has none.
PANDAS_DTYPE_PROBE = pl.when(~pl.all().is_null().any()).then(pl.all().head(1))

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
from sklearn.model_selection import train_test_split, cross_val_score
from sklearn.ensemble import RandomForestRegressor
from sklearn.linear_model import LinearRegression
from sklearn.metrics import mean_absolute_error, r2_score

traps = (
    pl.scan_csv(
        "data/traps.csv",
        null_values=PANDAS_NA_VALUES,
        infer_schema_length=None,
    )
    .with_columns(pandas_to_datetime(pl.col("night"), coerce=False))
    .collect()
    .lazy()
)
habitats = pl.scan_csv(
    "data/habitats.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)

print((traps.select(pl.len()).collect().item(), len(traps.collect_schema())))
print(pandas_dtypes_text(traps.select(PANDAS_DTYPE_PROBE).collect()))
# TODO(porter): frame.isna: the frame's columns are not known; per-column counts are
#   lf.null_count(); row masks are pl.any_horizontal(pl.col(columns).is_null())
print(traps.collect().to_pandas().isna().mean().round(3))

traps = traps.unique(keep="first", maintain_order=True)
traps = traps.with_columns(
    site=pandas_title(pl.col("site").str.strip_chars(PANDAS_WHITESPACE)),
)
traps = traps.filter(
    pl.col("site").is_not_null() & pl.col("site").ne_missing(pl.lit("")),
)
traps = traps.with_columns(wind_kmh=pl.col("wind_kmh").fill_null(0))
traps = traps.drop_nulls("temp_c")
traps = (
    traps
    .with_columns(month=pl.col("night").dt.month().cast(pl.Int32))
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("month",) if t[c].has_nulls()]),
    )
    .lazy()
)
traps = traps.with_columns(
    warm=(pl.col("temp_c") > pl.col("temp_c").median()).fill_null(False).cast(pl.Int64),
)
traps = (
    traps
    .rename(
        lambda c, other=habitats.collect_schema().names(): c + "_x" if c in other and c not in ("site",) else c,
    )
    .join(
        habitats.rename(
            lambda c, other=traps.collect_schema().names(): c + "_y" if c in other and c not in ("site",) else c,
        ),
        on="site",
        how="left",
        nulls_equal=True,
        maintain_order="left_right",
    )
)
traps = (
    traps
    .with_columns(habitat=pl.col("habitat").fill_null(pl.lit("unknown")))
    .collect()
    .lazy()
)
print(
    traps.select(pl.col("habitat"))
    .drop_nulls()
    .group_by("habitat", maintain_order=True)
    .agg(pl.len().cast(pl.Int64).alias("count"))
    .sort("count", descending=True, maintain_order=True)
    .collect(),
)

# nightly totals over the summer
nightly = (
    traps
    .with_columns(_porter_rows_in_key_order=pl.col("night").is_sorted())
    .drop_nulls("night")
    .group_by("night")
    .agg(pl.col("catch"), pl.col("_porter_rows_in_key_order").first())
    .with_columns(
        pandas_group_sums(
            pl.col("catch"),
            floats=False,
            in_key_order=pl.col("_porter_rows_in_key_order"),
        ),
    )
    .drop("_porter_rows_in_key_order")
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort("night")
    .collect()
    .lazy()
)
plt.figure(figsize=(8, 3))
plt.plot(
    nightly.collect().to_pandas().set_index("night").index,
    nightly.select(pl.col("catch")).collect().to_series().to_numpy(),
    color="purple",
)
plt.ylabel("moths caught")
plt.tight_layout()
plt.savefig("data/nightly.png")
plt.close()

fig, ax = plt.subplots(1, 2, figsize=(10, 4))
sns.histplot(
    traps.select(pl.col("catch")).collect().to_series().to_pandas(),
    bins=20,
    ax=ax[0],
)
sns.scatterplot(
    data=traps.collect().to_pandas(),
    x="temp_c",
    y="catch",
    hue="habitat",
    ax=ax[1],
)
fig.savefig("data/catch.png")
plt.close(fig)

corr = pl.concat(
    [
        traps.select("temp_c", "wind_kmh", "moon_pct", "cloud_okta", "catch", "species")
        .with_columns(
            pl.col(["temp_c", "wind_kmh", "moon_pct", "cloud_okta", "catch", "species"])
            .cast(pl.Float64),
        )
        .select(
            pl.lit(a).alias("index"),
            *(
                pl.corr(a, b).fill_nan(None).alias(b)
                for b in ["temp_c", "wind_kmh", "moon_pct", "cloud_okta", "catch", "species"]
            ),
        )
        for a in ["temp_c", "wind_kmh", "moon_pct", "cloud_okta", "catch", "species"]
    ],
)
sns.heatmap(
    corr.collect().to_pandas().set_index("index").rename_axis(None),
    annot=True,
    fmt=".2f",
    cmap="vlag",
)
plt.savefig("data/corr.png")
plt.close()

# TODO(porter): np.percentile: np.percentile of a column not known to hold numbers
top = np.percentile(traps.select(pl.col("catch")).collect().to_series().to_pandas(), 90)
print("a good night catches more than", top)

# model
model_df = (
    traps
    .select("temp_c", "wind_kmh", "moon_pct", "cloud_okta", "month", "habitat", "catch")
    .collect()
    .pipe(
        lambda d: d.select(pl.exclude("habitat"), *(pl.col("habitat").eq_missing(v).cast(pl.Int64).alias(f"habitat_{v}") for v in d["habitat"].drop_nulls().unique().sort().slice(1))),
    )
    .lazy()
)
X = model_df.drop("catch").collect().lazy()
y = pl.col("catch")
X_train, X_test, y_train, y_test = train_test_split(
    X.collect().to_pandas(),
    model_df.select(y.alias("catch")).collect().to_series().to_pandas(),
    test_size=0.25,
    random_state=0,
)

lin = LinearRegression().fit(X_train, y_train)
print("linear MAE", round(mean_absolute_error(y_test, lin.predict(X_test)), 3))

forest = RandomForestRegressor(n_estimators=50, random_state=0)
forest.fit(X_train, y_train)
pred = forest.predict(X_test)
print("forest MAE", round(mean_absolute_error(y_test, pred), 3), "R2", round(r2_score(y_test, pred), 3))
scores = cross_val_score(
    LinearRegression(),
    X.collect().to_pandas().to_numpy(),
    model_df.select(y).collect().to_series().to_numpy(),
    cv=5,
    scoring="r2",
)
print("cv r2", scores.round(3))

importances = (
    pl.from_pandas(
        pd.DataFrame(
            {"feature": X.collect_schema().names(), "importance": forest.feature_importances_},
        ),
    )
    .lazy()
)
importances = importances.pipe(pandas_sort_values, "importance", descending=True)
(
    importances
    .with_columns(PANDAS_CSV_ZONED_DATETIMES)
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_DATETIMES,
        PANDAS_CSV_DURATIONS,
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        PANDAS_CSV_LISTS,
        PANDAS_CSV_NUMBER_LISTS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("data/importances.csv")
)

by_site = (
    traps
    .drop_nulls(["site", "habitat"])
    .group_by(["site", "habitat"])
    .agg(
        pl.col("night").drop_nulls().n_unique().cast(pl.Int64).alias("nights"),
        pl.col("catch").alias("moths"),
        pl.col("catch").max().alias("best"),
        pl.col("species").alias("richness"),
    )
    .with_columns(
        pandas_group_sums(pl.col("moths"), floats=False),
        pandas_group_sums(pl.col("richness"), mean=True, floats=False),
    )
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort(["site", "habitat"])
)
by_site = by_site.with_columns(
    per_night=(pl.col("moths") / pl.col("nights")).fill_nan(None).round(2),
)
by_site = by_site.with_columns(richness=pl.col("richness").round(2))
(
    by_site
    .with_columns(PANDAS_CSV_ZONED_DATETIMES)
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_DATETIMES,
        PANDAS_CSV_DURATIONS,
        PANDAS_CSV_INTS,
        PANDAS_CSV_FLOATS,
        PANDAS_CSV_LISTS,
        PANDAS_CSV_NUMBER_LISTS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("data/by_site.csv")
)
