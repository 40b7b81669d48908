# community radio -- play log for the music rights return and the volunteers' rota
# copied out of the station notebook, run from the station PC
import numpy as np
import pandas as pd
import polars as pl

# Text that pandas' read_csv reads as a missing value.
PANDAS_NA_VALUES = [
    "", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null",
]


def pandas_upper(text):
    """text.str.to_uppercase() as pandas' str.upper() writes it (pyarrow's kernel, one letter
    at a time): "ß" is "ẞ" (Polars: "SS"), and a letter Polars writes as two or three ("ﬁ" as
    "FI", "ŉ", Greek letters with accents or an iota) is kept, or made its one capital, as
    pandas does: the text is cut around those letters and each piece upper-cased."""
    kept, iota = "[ŉǰΐΰևẖ-ẚὐὒὔὖᾈ-ᾏᾘ-ᾟᾨ-ᾯᾲᾴᾶᾷᾼῂῄῆῇῌῒ\u1fd3ῖῗῢ-ῤῦῧῲῴῶῷῼﬀ-ﬆﬓ-ﬗ]", "[ᾀ-ᾇᾐ-ᾗᾠ-ᾧᾳῃῳ]"
    text = text.str.replace_all("ß", "ẞ", literal=True)
    piece = pl.element()
    by_piece = (
        text.str.extract_all(f"{kept}|{iota}|[^ŉǰΐΰևẖ-ẚὐὒὔὖᾈ-ᾏᾘ-ᾟᾨ-ᾯᾲᾴᾶᾷᾼῂῄῆῇῌῒ\u1fd3ῖῗῢ-ῤῦῧῲῴῶῷῼﬀ-ﬆﬓ-ﬗᾀ-ᾇᾐ-ᾗᾠ-ᾧᾳῃῳ]+")
        .list.eval(
            pl.when(piece.str.contains(f"^{kept}$")).then(piece)
            .when(piece.str.contains(f"^{iota}$")).then(piece.str.to_titlecase())
            .otherwise(piece.str.to_uppercase())
        )
        .list.join("")
    )
    return pl.when(text.str.contains(f"{kept}|{iota}")).then(by_piece).otherwise(
        text.str.to_uppercase())


plays = (
    pl.scan_csv(
        "data/plays.csv",
        null_values=PANDAS_NA_VALUES + ["?"],
        infer_schema_length=None,
    )
    .collect()
    .lazy()
)
people = pl.scan_csv(
    "data/presenters.csv",
    null_values=PANDAS_NA_VALUES + [],
    infer_schema_length=None,
)
print(plays.head(3).collect())
plays = plays.collect().to_pandas()
# TODO(porter): frame.labels: pandas code reads the row labels of `plays` later, which are the
#   original row numbers after a filter or sort: pandas makes it; to port it, keep the row number as
#   a column (with_row_index) where the frame is read and use that column where the labels are read
plays = plays.drop_duplicates()

# the old desk writes 01.03.2024 21:04, the new one ISO with seconds
# TODO(porter): pd.to_datetime: only a column of a frame is ported; a scalar, a list or a frame
#   stays on pandas
aired = pd.to_datetime(plays["aired"], format="%Y-%m-%d %H:%M:%S", errors="coerce")
# TODO(porter): pd.to_datetime: only a column of a frame is ported; a scalar, a list or a frame
#   stays on pandas
aired = aired.fillna(pd.to_datetime(plays["aired"], format="%d.%m.%Y %H:%M", errors="coerce"))
plays["aired"] = aired
print("not understood:", plays["aired"].isna().sum())

# "Artist - Title (feat. X)"; a phone types an en dash
plays["track"] = plays["track"].str.replace("–", "-", regex=False)
bits = plays["track"].str.split(" - ", n=1, expand=True)
plays["artist"] = bits[0].str.strip().str.title()
plays["title"] = bits[1].str.strip().str.capitalize()
plays.loc[bits[1].isna(), "artist"] = np.nan
plays.loc[bits[1].isna(), "title"] = bits[0].str.capitalize()
plays["feat"] = plays["title"].str.extract(r"\(feat\. ([^)]+)\)", expand=False)
plays["live"] = plays["title"].str.contains(r"\(live\)", regex=True, na=False)
plays["edit"] = plays["title"].str.endswith("edit", na=False) | plays["title"].str.endswith("Edit", na=False)


# lengths: 3:45, 245s, 1:02:03
def seconds(t):
    if not isinstance(t, str):
        return np.nan
    if t.endswith("s"):
        return float(t[:-1])
    parts = t.split(":")
    if len(parts) == 3:
        return int(parts[0]) * 3600 + int(parts[1]) * 60 + int(parts[2])
    return int(parts[0]) * 60 + int(parts[1])


plays["secs"] = plays["length"].map(seconds)
# TODO(porter): pd.to_timedelta: only a column of a frame porter ports, or a number or text written
#   out, is ported
plays["dur"] = pd.to_timedelta(plays["secs"], unit="s")
plays["ends"] = plays["aired"] + plays["dur"]
plays["overrun"] = plays["secs"] > 600
plays["mins"] = plays["secs"].apply(lambda s: int(np.ceil(s / 60)) if s == s else 0)

plays["presenter"] = plays["presenter"].str.strip().str.upper()
plays["show"] = plays["show"].str.title()
plays["req"] = plays["request_from"].str.strip().str.upper()
plays["requested"] = plays["req"].isin(["FR", "DE", "PT", "GB"])
plays["country"] = plays["req"].map({"FR": "France", "DE": "Germany", "PT": "Portugal"}).fillna("-")

plays["day"] = plays["aired"].dt.normalize()
plays["dow"] = plays["aired"].dt.dayofweek
plays["week"] = plays["aired"].dt.to_period("W").astype(str)
plays["night"] = plays["aired"].dt.hour.map(lambda h: h >= 22 or h < 6)
print(plays.dtypes)

# -- the rights return: one row per artist and title
ret = plays.dropna(subset=["aired"]).groupby(["artist", "title"], dropna=False).agg(
    plays=("play_id", "count"), seconds=("secs", "sum"), listeners=("listeners", "sum"),
    first=("aired", "min"), last=("aired", "max")).reset_index()
ret["span_days"] = (ret["last"] - ret["first"]).dt.days
ret["avg_len"] = (ret["seconds"] / ret["plays"]).round(1)
ret["code"] = ret["artist"].fillna("unknown").str.slice(0, 3).str.upper() + "-" + ret["plays"].astype(str).str.zfill(3)
ret = ret.sort_values(["plays", "artist", "title"], ascending=[False, True, True])
ret.to_csv("data/rights_return.csv", index=False)
print(ret.head(10))

# -- every day of the period, with the days nothing was logged
# TODO(porter): pd.date_range: porter has no rule for this API yet
# TODO(porter): pd.DataFrame: building a frame from another pandas object
days = pd.DataFrame({"day": pd.date_range("2024-02-26", "2024-04-06", freq="D")})
per_day = plays.groupby("day").agg(n=("play_id", "size"), secs=("secs", "sum"), nights=("night", "sum")).reset_index()
per_day = days.merge(per_day, on="day", how="left")
per_day["n"] = per_day["n"].fillna(0).astype(int)
per_day["hours"] = (per_day["secs"] / 3600).round(2)
per_day["weekend"] = per_day["day"].dt.dayofweek >= 5
per_day["month_end"] = per_day["day"].dt.is_month_end
per_day.to_csv("data/days.csv", index=False)

# -- presenters: licence renewal from the day they joined
people = people.with_columns(initials=pandas_upper(pl.col("initials")))
people = people.with_columns(
    joined=pl.when(
        pl.col("joined")
        .str.contains(
            "(?i)^(?:(?:[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))-(?:1[0-2]|0[1-9]|[1-9])-(?:3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9]))$",
        ),
    )
    .then(pl.col("joined"))
    .when(
        ~pl.col("joined").is_in(["", "NaT", "nat", "NAT", "nan", "NaN", "NAN"]) & pl.col("joined").is_not_null(),
    )
    .then(pl.lit("="))
    .str.to_datetime("%Y-%m-%d", time_unit="us"),
)
people = people.with_columns(renew=pl.col("joined").dt.offset_by("12mo"))
rota = plays.groupby("presenter", dropna=False).agg(plays=("play_id", "count"), last_on=("aired", "max")).reset_index()
# TODO(porter): handover.unknown_code: passed to code porter does not understand: handed over to
#   pandas with .collect().to_pandas(); port that code to take a Polars frame
rota = rota.merge(
    people.collect().to_pandas(),
    left_on="presenter",
    right_on="initials",
    how="left",
)
rota["late"] = rota["last_on"] > rota["renew"]
rota["label"] = rota.apply(lambda r: f"{r['name']} ({r['plays']})" if isinstance(r["name"], str) else "?", axis=1)
rota = rota.drop(columns=["initials"])
rota.to_csv("data/rota.csv", index=False)
print(rota)
