"""Lime kiln burns: the restored kiln's firing log cleaned, the peak of every six hours, each
quarter's fuel, each kiln's burns and the fuel per tonne of lime it holds (a pandas 1.x
notebook, kept since 2015, written for pandas 1.5: see reference.txt).

A blank burner is the burner of the line above; a blank temperature is a dropped thermocouple
(the kiln's last reading holds); 'N/A' fuel was not weighed.
"""
import polars as pl
import pandas as pd
import numpy as np

# Text that pandas' read_csv reads as a missing value.
PANDAS_NA_VALUES = [
    "", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null",
]


def pandas_read_csv(*args, squeeze=False, error_bad_lines=None, warn_bad_lines=None,
                    delim_whitespace=False, infer_datetime_format=False, parse_dates=None,
                    date_parser=None, keep_date_col=False, **kwargs):
    """pd.read_csv as pandas 1.5 read it, with the options pandas 2 and 3 removed: squeeze=True
    (a file of one column is that column), error_bad_lines=False (on_bad_lines=), delim_whitespace
    (sep=r"\\s+"), parse_dates joining columns ([["d", "t"]] or {"name": ["d", "t"]}: the texts
    joined with a space, the new column first) and date_parser= (called on the columns, else on
    each joined text, else on each row's texts, as pandas 1.5's converter tried them; a column it
    cannot read stays text)."""
    pandas = __import__("pandas")

    if error_bad_lines is False:
        kwargs["on_bad_lines"] = "skip" if warn_bad_lines is False else "warn"
    if delim_whitespace:
        kwargs["sep"] = r"\s+"
    groups, keep = [], set()
    if isinstance(parse_dates, dict):
        groups = [(name, list(cols)) for name, cols in parse_dates.items()]
    elif isinstance(parse_dates, (list, tuple)):
        for col in parse_dates:
            if isinstance(col, list):
                groups.append(("_".join(str(c) for c in col), col))
            else:
                groups.append((col, [col]))
                keep.add(col)
    elif parse_dates:
        return pandas.read_csv(*args, parse_dates=parse_dates, **kwargs)
    texts = {c for _, cols in groups for c in cols}
    if texts:
        given = kwargs.get("dtype")
        kwargs["dtype"] = {**(given if isinstance(given, dict) else {}), **{c: object for c in texts}}
    frame = pandas.read_csv(*args, **kwargs)

    def dates(cols):
        values = [frame[c].to_numpy(dtype=object) for c in cols]
        joined = [" ".join(str(v) for v in row) for row in zip(*values)]
        if date_parser is None:
            found = joined
        else:
            try:
                found = date_parser(*values)
                if isinstance(found, __import__("datetime").datetime):
                    raise TypeError("one value")
            except Exception:
                try:
                    found = [date_parser(text) for text in joined]
                except Exception:
                    found = [date_parser(*row) for row in zip(*values)]
        try:
            return pandas.to_datetime(found)
        except (ValueError, TypeError):
            return pandas.Series(found, dtype=object).to_numpy()

    made = {name: dates(cols) for name, cols in groups}
    joined_away = [c for name, cols in groups for c in cols if name not in keep]
    if not keep_date_col:
        frame = frame.drop(columns=[c for c in joined_away if c in frame.columns])
    for name in keep:
        frame[name] = made[name]
    new = [name for name, _ in groups if name not in keep]
    for at, name in enumerate(new):
        frame.insert(at, name, made[name])
    if squeeze and len(frame.columns) == 1:
        return frame[frame.columns[0]].copy()
    return frame


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

dateparse = lambda x: __import__("datetime").datetime.strptime(x, "%d/%m/%Y %H:%M")

# TODO(porter): pd.read_csv: error_bad_lines=False is on_bad_lines='skip' in pandas 3 (older pandas'
#   option): on_bad_lines='skip': pandas leaves out a row with more fields than the header, Polars'
#   reader keeps it (its extra fields cut off); porter splits the lines at the separator itself and
#   casts the columns to the types pandas reads, which it knows with --data only (columns of numbers
#   or text, no quotes, no carriage returns, no lines of spaces, the first data line no longer than
#   the header)
kiln = pandas_read_csv(
    "data/readings.csv",
    parse_dates=[["date", "clock"]],
    date_parser=dateparse,
    na_values=["N/A"],
    error_bad_lines=False,
    warn_bad_lines=False,
)
kiln.rename(columns={"date_clock": "read_at"}, inplace=True)
kiln.drop_duplicates(subset=["reading"], inplace=True)
kiln["kiln"] = kiln["kiln"].str.strip().str.title()
kiln["burner"] = kiln["burner"].ffill()
kiln.sort_values(["kiln", "read_at"], inplace = True)
kiln["temp_c"] = kiln.groupby("kiln")["temp_c"].ffill()
kiln["slaking"] = np.where(kiln["temp_c"] >= 900, "yes", "no")
print(kiln.head(10))
print(kiln.shape)

kiln.to_csv("data/readings_clean.csv", index=False)

peaks = kiln.set_index("read_at").resample("6h")["temp_c"].max()
peaks = peaks.dropna().reset_index()
peaks = pl.from_pandas(peaks).lazy()
(
    peaks
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
    .sink_csv("data/six_hour_peaks.csv")
)

quarters = kiln.groupby(pd.Grouper(key="read_at", freq="QE")).agg({"fuel_kg": "sum",
                                                                  "reading": "count"})
quarters.rename(columns={"reading":"readings"}, inplace=True)
quarters.reset_index(inplace=True)
quarters.to_csv("data/quarters.csv", index=False)

# one line a kiln (the key comes back as the kiln's name)
# TODO(porter): pd.DataFrame: an empty DataFrame has no schema to build lazily
per_kiln = pd.DataFrame()
for k, rows in kiln.groupby("kiln"):
    per_kiln = pandas_append(per_kiln, {"kiln": k, "readings": len(rows), "fuel_kg": rows["fuel_kg"].sum(),
                                "burns": rows["read_at"].dt.date.nunique(),
                                "peak_c": rows["temp_c"].max()}, ignore_index=True)

kilns = pl.scan_csv(
    "data/kilns.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)
kilns = kilns.with_columns(kiln=pandas_title(pl.col("kiln")))
kilns = kilns.collect().to_pandas()
# TODO(porter): frame.labels: pandas code reads the row labels of `kilns` later, which are the
#   original row numbers after a filter or sort: pandas makes it; to port it, keep the row number as
#   a column (with_row_index) where the frame is read and use that column where the labels are read
kilns.drop_duplicates(subset="kiln", keep="last", inplace=True)
per_kiln = per_kiln.merge(kilns, on="kiln", how="left")
per_kiln = pl.from_pandas(per_kiln).lazy()
per_kiln = per_kiln.with_columns(
    kg_per_t=(pl.col("fuel_kg") / pl.col("capacity_t")).fill_nan(None).round(1),
)
per_kiln = per_kiln.with_columns(
    kg_per_burn=(pl.col("fuel_kg") / pl.col("burns")).fill_nan(None).round(2),
)
(
    per_kiln
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
    .sink_csv("data/per_kiln.csv")
)

burners = (kiln.groupby(["burner", "slaking"], as_index=False)
               .agg(readings=("reading", "count"), fuel_kg=("fuel_kg", "sum"), hottest=("temp_c", "max")))
burners.to_csv("data/burners.csv", index=False)
