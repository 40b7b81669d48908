# harbour museum ticket office -- weekly numbers for the trustees
# (pasted from the office notebook; cells kept in order)
import math

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
    special = text.str.contains(f"{kept}|{iota}")
    return (
        pl.when(special.any())  # else only Polars' own upper case is computed
        .then(pl.when(special).then(by_piece).otherwise(text.str.to_uppercase()))
        .otherwise(text.str.to_uppercase())
    )


# The characters Python's str.isspace() calls whitespace, which pandas' str.strip() takes
# off: Polars' strip_chars() leaves the separators \x1c-\x1f.
PANDAS_WHITESPACE = (
    "\t\n\x0b\x0c\r\x1c\x1d\x1e\x1f \x85\xa0\u1680"
    "\u2000\u2001\u2002\u2003\u2004\u2005\u2006\u2007"
    "\u2008\u2009\u200a\u2028\u2029\u202f\u205f\u3000"
)

# %% load
tix = (
    pl.scan_csv(
        "data/tickets.csv",
        null_values=PANDAS_NA_VALUES + [],
        infer_schema_length=None,
    )
    .collect()
    .lazy()
)
shows = pl.scan_csv(
    "data/exhibitions.csv",
    null_values=PANDAS_NA_VALUES + [],
    infer_schema_length=None,
)
print((tix.select(pl.len()).collect().item(), len(tix.collect_schema())))
print(tix.head(5).collect())

# %% the two tills write their stamps differently: try the new one, then the old day-first one
new_till = (
    pl.when(pl.col("sold_at").str.contains("(?i)^(?:(?:[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))-(?:1[0-2]|0[1-9]|[1-9])-(?:3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9])\\s+(?:2[0-3]|[0-1][0-9]|[0-9]):(?:[0-5][0-9]|[0-9]))$")).then(pl.col("sold_at")).str
    .to_datetime("%Y-%m-%d %H:%M", time_unit="us", strict=False)
)
old_till = (
    pl.when(pl.col("sold_at").str.contains("(?i)^(?:(?:3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9])/(?:1[0-2]|0[1-9]|[1-9])/(?:[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))\\s+(?:2[0-3]|[0-1][0-9]|[0-9]):(?:[0-5][0-9]|[0-9]))$")).then(pl.col("sold_at")).str
    .to_datetime("%d/%m/%Y %H:%M", time_unit="us", strict=False)
)
tix = tix.with_columns(sold_at=new_till.fill_null(old_till)).collect().lazy()
print(
    "unreadable stamps:",
    tix.select(pl.col("sold_at").is_null().sum().cast(pl.Int64))
    .collect()
    .to_series()
    .to_numpy()[0],
)

# %% refs: HM-2024-000123/AD, hm 2024 123 ad, HM2024123 ...
parts = (
    pl.col("ref").str
    .extract_groups(
        "(?i)^hm[^\\p{L}\\p{N}_]*(?P<year>\\d{4})[^\\p{L}\\p{N}_]*(?P<num>\\d{1,6})(?:[^\\p{L}\\p{N}_]*(?P<code>[a-zé]{2}))?\\n?$",
    )
)
tix = tix.with_columns(ticket_no=parts.struct.field("num").str.zfill(6))
tix = tix.with_columns(
    ref_year=parts.struct.field("year")
    .str.strip_chars()
    .cast(pl.Float64, strict=False)
    .fill_nan(None),
)
tix = tix.with_columns(code=pandas_upper(parts.struct.field("code"))).collect().lazy()
print(tix.select("ref", "ticket_no", "code").head(10).collect())
tix = tix.collect().to_pandas()
# TODO(porter): frame.labels: pandas code reads the row labels of `tix` later, which are the
#   original row numbers after a filter or sort: pandas makes it; to port it, keep the row number as
#   a column (with_row_index) where the frame is read and use that column where the labels are read
tix = tix.drop_duplicates()


# TODO(porter): frame.labels: pandas code reads the row labels of what clean_kind returns, the
#   original row numbers after a filter or sort: it stays pandas code
def clean_kind(df):
    # the desk types whatever it likes
    df["visitor"] = df["visitor"].str.strip().str.lower()
    df["visitor"] = df["visitor"].replace({"étudiant": "student", "famille": "family"})
    df["visitor"] = df["visitor"].fillna("unknown")
    return df


tix = clean_kind(tix)
tix["desk"] = tix["desk"].str.strip().str.capitalize()
tix["lang"] = tix["lang"].str.strip().str.lower().map({"fr": "French", "de": "German", "en": "English", "nl": "Dutch"})

# %% money: vouchers carry their value in the text ("voucher 12")
tix["voucher"] = tix["paid_by"].str.extract(r"voucher\s*(\d+)", expand=False).astype(float)
tix["paid_by"] = tix["paid_by"].str.split(" ", n=1, expand=True)[0].str.lower()
tix["is_voucher"] = tix["paid_by"].str.startswith("vouch", na=False)


def net_price(row):
    if row["price"] != row["price"]:
        return np.nan
    if row["visitor"] in ("child", "student"):
        disc = 0.0
    elif row["party"] >= 4:
        disc = 0.1
    else:
        disc = 0.0
    net = row["price"] * (1 - disc) - (row["voucher"] if row["voucher"] > 0 else 0)
    return round(max(net, 0), 2)


tix["net"] = tix.apply(net_price, axis=1)
tix["per_head"] = tix["net"] / tix["party"]

# %% time of the sale
tix["day"] = tix["sold_at"].dt.normalize()
tix["week"] = tix["sold_at"].dt.isocalendar().week
tix["month"] = tix["sold_at"].dt.to_period("M")
tix["hour"] = tix["sold_at"].dt.hour
tix["slot"] = tix["hour"].map(lambda h: "morning" if h < 12 else ("lunch" if h < 14 else "afternoon"))
tix["month_end"] = tix["sold_at"].dt.is_month_end
# TODO(porter): pd.to_timedelta: only a column of a frame porter ports, or a number or text written
#   out, is ported
tix["leaves_at"] = tix["sold_at"] + pd.to_timedelta(tix["visit_min"], unit="m")
tix["after_close"] = tix["leaves_at"] > tix["day"] + pl.select(pl.duration(hours=18)).item()
tix["tour_count"] = tix["tours"].str.count(";") + 1
tix.loc[tix["tours"].isna() | (tix["tours"] == "none"), "tour_count"] = 0
tix["lighthouse"] = tix["tours"].str.contains("lighthouse", case=False, na=False)
print(tix.dtypes)

# %% exhibitions on when the ticket was sold
shows = shows.with_columns(
    opens=pl.when(
        pl.col("opens")
        .str.contains(
            "(?i)^(?:(?:[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))-(?:1[0-2]|0[1-9]|[1-9])-(?:3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9]))$",
        ),
    )
    .then(pl.col("opens"))
    .when(
        ~pl.col("opens").is_in(["", "NaT", "nat", "NAT", "nan", "NaN", "NAN"]) & pl.col("opens").is_not_null(),
    )
    .then(pl.lit("="))
    .str.to_datetime("%Y-%m-%d", time_unit="us"),
)
shows = (
    shows
    .with_columns(
        closes=pl.when(
            pl.col("closes")
            .str.contains(
                "(?i)^(?:(?:[1-9][0-9]{3}|0(?:[1-9][0-9]{2}|0[1-9][0-9]|00[1-9]))-(?:1[0-2]|0[1-9]|[1-9])-(?:3[0-1]|[1-2][0-9]|0[1-9]|[1-9]| [1-9]))$",
            ),
        )
        .then(pl.col("closes"))
        .when(
            ~pl.col("closes").is_in(["", "NaT", "nat", "NAT", "nan", "NaN", "NAN"]) & pl.col("closes").is_not_null(),
        )
        .then(pl.lit("="))
        .str.to_datetime("%Y-%m-%d", time_unit="us")
        .fill_null(pl.datetime(2024, 12, 31)),
    )
    .collect()
    .lazy()
)
shows = (
    shows
    .with_columns(
        days_open=(pl.col("closes") - pl.col("opens")).dt.total_microseconds() // 86_400_000_000 + 1,
    )
    .collect()
    .pipe(
        lambda t: t.with_columns([pl.col(c).cast(pl.Float64) for c in ("days_open",) if t[c].has_nulls()]),
    )
    .lazy()
)
shows = shows.with_columns(
    short=pandas_upper(pl.col("title").str.head(10).str.strip_chars(PANDAS_WHITESPACE)),
)
print(shows.collect())

# one output per desk and week
tix = tix[tix["sold_at"].notna()]
weekly = tix.groupby(["week", "desk"], as_index=False).agg(
    tickets=("ticket_no", "count"), visitors=("party", "sum"), takings=("net", "sum"),
    lighthouse=("lighthouse", "sum"), late=("after_close", "sum"))
weekly["takings"] = weekly["takings"].round(2)
weekly["label"] = weekly.apply(lambda r: f"W{int(r['week']):02d}-{r['desk'][:1]}", axis=1)
weekly = weekly.sort_values(["week", "desk"])
weekly.to_csv("data/weekly_desks.csv", index=False)

# by month and kind
monthly = tix.groupby(["month", "visitor"]).agg(n=("party", "sum"), avg_visit=("visit_min", "mean")).reset_index()
monthly["month"] = monthly["month"].astype(str)
monthly["avg_visit"] = monthly["avg_visit"].apply(lambda m: math.floor(m) if m == m else -1)
monthly.to_csv("data/monthly_visitors.csv", index=False)

# per day: month-end days get flagged for the accountant
daily = tix.groupby("day").agg(net=("net", "sum"), tickets=("ticket_no", "size"), month_end=("month_end", "first")).reset_index()
daily["net"] = daily["net"].round(2)
daily["days_in_month"] = daily["day"].dt.days_in_month
daily["weekday"] = daily["day"].dt.day_name()
daily["busy"] = np.where(daily["tickets"] >= 22, "busy", "quiet")
daily.to_csv("data/daily_takings.csv", index=False)
print(daily.tail())

# refs nobody could read
bad = tix[tix["ticket_no"].isna()][["ref", "sold_at", "desk"]]
bad["ref_len"] = bad["ref"].str.len()
bad = bad.sort_values(["sold_at", "ref"])
bad.to_csv("data/unreadable_refs.csv", index=False)
print(len(bad), "refs unreadable")
