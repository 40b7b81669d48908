"""Sheepdog trial society: placings per trial and class, each dog's form over the season.

Run sheets typed up after each trial. Judges mark points LOST per phase; 'ret' means the dog
retired before that phase was judged, 'n/a' that the judge's card was lost (counted as 0 lost).
Handler written 'Surname, First'. A run with no class still counts in the dog's form.
"""
import numpy as np
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

RUNS = "data/runs.csv"
CLASSES = "data/classes.csv"
PHASES = ["outrun", "lift", "fetch", "drive", "shed", "pen"]
GRIP_PENALTY = 100          # a grip is a disqualification: the run scores nothing
OVERTIME_LOST = 5           # points off per started minute over the time allowed
SEASON_START = pd.Timestamp("2025-04-01")


# porter: award(score), a function of each value, is ported as one expression
#   where it was applied, and left out here


# porter: weather_word(w), a function of each value, is ported as one expression
#   where it was applied, and left out here


runs = pl.scan_csv(
    RUNS,
    null_values=PANDAS_NA_VALUES + ["ret"],
    infer_schema_length=None,
)
classes = pl.scan_csv(CLASSES, null_values=PANDAS_NA_VALUES, infer_schema_length=None)
print((runs.select(pl.len()).collect().item(), len(runs.collect_schema())))
runs = runs.collect().to_pandas()
# TODO(porter): frame.labels: pandas code reads the row labels of `runs` later, which are the
#   original row numbers after a filter or sort: pandas makes it; to port it, keep the row number as
#   a column (with_row_index) where the frame is read and use that column where the labels are read
runs = runs.drop_duplicates()
print("after dropping repeats:", runs.shape)

# --- names ---
names = runs["handler"].str.strip().str.split(",", n=1, expand=True)
runs["surname"] = names[0].str.strip().str.title()
runs["handler"] = names[1].str.strip().str.capitalize() + " " + runs["surname"]
dog = runs["dog"].str.extract(r"^\s*(\w+)\s*\((?:reg|Reg)\s*(\d+)\)")
runs["dog"] = dog[0].str.title()
runs["reg_no"] = "R" + dog[1].str.zfill(6)
runs["class"] = runs["class"].str.strip().str.lower().str.replace(r"[\s_]+", "-", regex=True)
runs.loc[runs["class"] == "", "class"] = np.nan
runs["ground"] = runs["ground"].str.strip().str.title()
print(runs[["handler", "dog", "reg_no", "class"]].head(8))

# --- dates: the hut at Cwm Hir writes day-first ---
# TODO(porter): pd.to_datetime: only a column of a frame is ported; a scalar, a list or a frame
#   stays on pandas
d1 = pd.to_datetime(runs["trial_date"], format="%Y-%m-%d", errors="coerce")
# TODO(porter): pd.to_datetime: only a column of a frame is ported; a scalar, a list or a frame
#   stays on pandas
d2 = pd.to_datetime(runs["trial_date"], format="%d/%m/%Y", errors="coerce")
runs["trial_date"] = d1.fillna(d2)
runs["week"] = runs["trial_date"].dt.isocalendar().week
runs["days_in"] = (runs["trial_date"] - SEASON_START).dt.days
print("runs with no date:", runs["trial_date"].isna().sum())

# --- points ---
runs["retired"] = runs[PHASES].isna().any(axis=1) & runs["run_time"].str.contains("retired", case=False, na=True)
for p in PHASES:
    runs[p] = runs[p].fillna(0)
runs["lost"] = runs.loc[:, "outrun":"pen"].sum(axis=1)
# TODO(porter): handover.unknown_code: passed to code porter does not understand: handed over to
#   pandas with .collect().to_pandas(); port that code to take a Polars frame
runs = runs.merge(classes.collect().to_pandas(), on="class", how="left")
runs = pl.from_pandas(runs).lazy()
runs = runs.with_columns(max_points=pl.col("max_points").fill_null(100))
runs = runs.with_columns(score=pl.col("max_points") - pl.col("lost"))
runs = runs.with_columns(score=pl.col("score").clip(0, None))

t = pl.col("run_time").str.strip_chars(PANDAS_WHITESPACE)
mins = (
    t.str.extract("^(\\d+):", 1).str
    .strip_chars()
    .cast(pl.Float64, strict=False)
    .fill_nan(None)
)
secs = t.str.tail(2).str.strip_chars().cast(pl.Float64, strict=False).fill_nan(None)
runs = runs.with_columns(run_secs=(mins * 60 + secs).fill_nan(None))
runs = runs.with_columns(
    over_min=pandas_div(pl.col("run_secs") - pl.col("time_allowed_min") * 60, 60)
    .fill_nan(None)
    .ceil()
    .clip(0, None),
)
runs = runs.with_columns(
    score=pl.when(pl.col("over_min") > 0)
    .then((pl.col("score") - pl.col("over_min") * OVERTIME_LOST).fill_nan(None))
    .otherwise(
        pl.coalesce(pl.selectors.by_name("score", require_all=False), pl.lit(None)),
    ),
)

runs = runs.with_columns(
    faults=pl.col("faults").str.replace_many({"İ": "i", "Σ": "σ"}).str.to_lowercase(),
)
runs = (
    runs
    .with_columns(n_faults=pl.col("faults").str.count_matches(";").cast(pl.Int64) + 1)
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("n_faults",) if t[c].has_nulls()]),
    )
    .lazy()
)
runs = runs.with_columns(n_faults=pl.col("n_faults").fill_null(0))
gripped = pl.col("faults").str.contains("(?i)grip").fill_null(False)
runs = runs.with_columns(
    score=pl.when(gripped)
    .then(pl.lit(0, dtype=pl.Int64))
    .otherwise(
        pl.coalesce(pl.selectors.by_name("score", require_all=False), pl.lit(None)),
    ),
)
runs = runs.with_columns(
    score=pl.when(pl.col("retired"))
    .then(pl.lit(None, dtype=pl.Float64))
    .otherwise(
        pl.coalesce(pl.selectors.by_name("score", require_all=False), pl.lit(None)),
    ),
)
runs = runs.with_columns(
    award=pl.when((pl.col("score") != pl.col("score")).fill_null(True))
    .then(pl.lit("retired"))
    .when(pl.col("score") >= 85)
    .then(pl.lit("excellent"))
    .when(pl.col("score") >= 70)
    .then(pl.lit("good"))
    .when(pl.col("score") > 0)
    .then(pl.lit("fair"))
    .otherwise(pl.lit("no score")),
)
runs = (
    runs
    .with_columns(
        weather=pl.when(
            pl.col("weather").fill_null(pl.lit("unknown")).str.to_lowercase().str.contains("wet", literal=True) | pl.col("weather").fill_null(pl.lit("unknown")).str.to_lowercase().str.contains("rain", literal=True) | pl.col("weather").fill_null(pl.lit("unknown")).str.to_lowercase().str.contains("drizzle", literal=True),
        )
        .then(pl.lit("wet"))
        .otherwise(pl.lit("dry")),
    )
    .collect()
    .lazy()
)
print(
    runs.select(
        "run_no",
        "class",
        "lost",
        "run_secs",
        "over_min",
        "n_faults",
        "score",
        "award",
    )
    .head(10)
    .collect(),
)

# --- placings per trial day and class ---
runs = runs.sort(
    ["trial_date", "class", "run_no"],
    nulls_last=True,
    maintain_order=True,
)
runs = runs.with_columns(
    place=pl.when(pl.col("trial_date").is_not_null() & pl.col("class").is_not_null())
    .then(
        pl.col("score")
        .rank("min", descending=True)
        .cast(pl.Float64)
        .over("trial_date", "class"),
    ),
)
runs = (
    runs
    .with_columns(
        entries=pl.when(
            pl.col("trial_date").is_not_null() & pl.col("class").is_not_null(),
        )
        .then(pl.col("run_no").count().cast(pl.Int64).over("trial_date", "class")),
    )
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("entries",) if t[c].has_nulls()]),
    )
    .lazy()
)
runs = runs.with_columns(
    class_mean=pl.when(
        pl.col("trial_date").is_not_null() & pl.col("class").is_not_null(),
    )
    .then(pl.col("score").mean().over("trial_date", "class"))
    .round(2),
)
runs = (
    runs
    .with_columns(
        above_mean=pl.when(pl.col("score") > pl.col("class_mean"))
        .then(pl.lit("yes"))
        .otherwise(pl.lit("no")),
    )
    .collect()
    .lazy()
)
placings = runs.filter(pl.col("place") <= 3)
placings = placings.select(
    "trial_date",
    "ground",
    "class",
    "place",
    "handler",
    "dog",
    "reg_no",
    "score",
    "award",
    "judge",
    "entries",
)
(
    placings
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
    .sink_csv("data/placings.csv")
)

# --- each dog's form ---
runs = runs.sort(
    ["reg_no", "trial_date", "run_no"],
    nulls_last=True,
    maintain_order=True,
)
runs = (
    runs
    .with_columns(
        outing=pl.when(pl.col("reg_no").is_not_null()).then(pl.int_range(pl.len(), dtype=pl.Int64).over("reg_no")) + 1,
    )
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("outing",) if t[c].has_nulls()]),
    )
    .lazy()
)
runs = runs.with_columns(
    prev_score=pl.when(pl.col("reg_no").is_not_null())
    .then(pl.col("score").shift(1).over("reg_no")),
)
runs = runs.with_columns(change=pl.col("score") - pl.col("prev_score"))
runs = runs.with_columns(
    best_so_far=pl.when(pl.col("reg_no").is_not_null())
    .then(pl.col("score").cum_max().over("reg_no")),
)
runs = (
    runs
    .with_columns(
        fees_to_date=pl.when(pl.col("reg_no").is_not_null())
        .then(
            pl.when(
                pl.col("entry_fee").is_not_null(),
                pl.col("entry_fee")
                .rolling_sum(2 ** 31 - 1, min_samples=1)
                .shift()
                .fill_null(0)
                .is_finite(),
            )
            .then(pl.col("entry_fee").rolling_sum(2 ** 31 - 1, min_samples=1))
            .over("reg_no"),
        ),
    )
    .collect()
    .lazy()
)
form = runs.select(
    "reg_no",
    "dog",
    "handler",
    "trial_date",
    "week",
    "days_in",
    "outing",
    "class",
    "score",
    "prev_score",
    "change",
    "best_so_far",
    "fees_to_date",
    "weather",
    "above_mean",
)
(
    form
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
    .sink_csv("data/dog_form.csv")
)

wet = (
    runs
    .group_by(["handler", "weather"])
    .agg(
        pl.col("run_no").count().cast(pl.Int64).alias("runs"),
        pl.col("score").alias("mean_score"),
        pl.col("n_faults").sum().alias("faults"),
    )
    .with_columns(pandas_group_sums(pl.col("mean_score"), mean=True, floats=False))
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort(["handler", "weather"], nulls_last=True)
)
wet = wet.collect().lazy()
(
    wet
    .with_columns(PANDAS_CSV_ZONED_DATETIMES)
    .with_columns(
        pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        PANDAS_CSV_DATETIMES,
        PANDAS_CSV_DURATIONS,
        pl.selectors.float().fill_nan(None),
        PANDAS_CSV_LISTS,
        PANDAS_CSV_NUMBER_LISTS,
        pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)
        .cast(pl.String)
        .replace("", None),
    )
    .sink_csv("data/handler_weather.csv", float_precision=2)
)
print(wet.collect())
