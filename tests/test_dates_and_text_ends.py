"""Dates and strings found by the three corpus scripts of issue 10 (harbour_museum_tickets,
mountain_rescue_radio, community_radio_playlog), and two known gaps of str.strip() and
str.title().

pandas (the installed 3.1) is the reference: each check runs the snippet with pandas and its
conversion with Polars and compares the results (support.differential / same_text).
"""

from __future__ import annotations

from support import convert, differential, same_text

HEAD = "import numpy as np\nimport pandas as pd\n"


def test_strip_without_characters_strips_pythons_whitespace() -> None:
    # Python's str.isspace() holds the separators \x1c-\x1f; pandas' str.strip() strips them
    # (pandas 3.1: "\x1ca\x1f".strip() is "a"), Polars' strip_chars() does not
    differential(HEAD + '''
df = pd.DataFrame({"s": ["\\x1ca\\x1c", " \\x1d b\\x1e\\t", "\\x1f", "\\u3000c\\xa0", None, "",
                         "\\x1c \\x1c d \\x1f\\n", "\\u200be\\u200b", "é\\x85"]})
df["both"] = df["s"].str.strip()
df["left"] = df["s"].str.lstrip()
df["right"] = df["s"].str.rstrip()
result = df
''')


def test_title_starts_a_word_after_a_letter_without_case() -> None:
    # pandas (pyarrow's kernel) starts a word after CJK, Hebrew, a modifier letter:
    # "中a" -> "中A"; Polars reads any alphabetic character as inside a word ("中a")
    differential(HEAD + '''
df = pd.DataFrame({"s": ["中a", "中文abc def", "ab中cd", "שלוםabc", "aʼb", "ªab", "中ß", "中ǆx",
                         "中ﬁsh", "ⅰa Ⓐb ⓐc", "x\\u0301y", "日本の港 harbour", None, ""]})
df["t"] = df["s"].str.title()
result = df
''')


RADIO = {"log.csv": "msg,logged\n1,1719900000\n2,\n3,1719903600\n4,0\n5,-86400\n"}


def test_epoch_seconds_in_a_column_with_blanks(tmp_path) -> None:
    # a blank makes the column float64 in pandas; pd.to_datetime(unit="s") reads it as whole
    # seconds (datetime64[us], NaT for the blank); it had stayed on pandas under a TODO
    result = same_text('''
        import pandas as pd
        log = pd.read_csv("log.csv")
        log["at"] = pd.to_datetime(log["logged"], unit="s")
        log["day"] = log["at"].dt.day
        log.to_csv("out.csv", index=False)
    ''', tmp_path, RADIO)
    assert "pd.to_datetime" not in result.converted_text
    assert "pl.from_epoch" in result.converted_text


def test_epoch_milliseconds_of_a_float_column() -> None:
    result = differential(HEAD + '''
df = pd.DataFrame({"ms": [1719900000000.0, np.nan, 0.0, -1000.0, 86400000.0]})
df["at"] = pd.to_datetime(df["ms"], unit="ms")
result = df
''')
    assert "pl.from_epoch" in result.converted_text


def test_epoch_of_a_float_column_says_why_it_is_lowered() -> None:
    text = HEAD + ('df = pd.DataFrame({"x": [1719900000.0, np.nan]})\n'
                   'df["t"] = pd.to_datetime(df["x"], unit="s")\n')
    site = next(s for s in convert(text).sites if s.key == "pd.to_datetime")
    assert site.confidence == 0.9 and "nanoseconds" in site.message


def test_a_written_series_whose_first_date_has_a_zone_stays_on_pandas() -> None:
    # pandas' own docstring example (Series.dt.date, dt.days_in_month, dt.quarter ...): the
    # first value "1/1/2020 10:00:00+00:00" is read by dateutil value by value; the guessed
    # formats porter follows have no zone, and the converted script failed ("conversion from
    # str to datetime failed"). It stays on pandas under a TODO that runs.
    result = differential(HEAD + '''
s = pd.Series(["1/1/2020 10:00:00+00:00", "2/1/2020 11:00:00+00:00"])
s = pd.to_datetime(s)
result = s.dt.days_in_month
''')
    assert "TODO(porter): pd.to_datetime" in result.converted_text


def test_a_written_series_of_iso_dates_is_still_ported() -> None:
    result = differential(HEAD + '''
s = pd.Series(["2020-01-01 10:00:00", "2020-02-01 11:00:00", None])
s = pd.to_datetime(s)
result = s.dt.quarter
''')
    assert "TODO" not in result.converted_text


def test_tz_localize_then_tz_convert() -> None:
    # the radio log's Unix seconds are UTC; the debrief reads local time (pandas 3.1: 06:00 UTC
    # on 2 July is 08:00 in Vienna, CEST; 06:00 on 2 January is 07:00, CET)
    result = differential(HEAD + '''
df = pd.DataFrame({"s": ["2024-07-02 06:00", "2024-01-02 06:00", None, "2024-03-31 00:59",
                         "2024-03-31 01:00"]})
df["t"] = pd.to_datetime(df["s"], format="%Y-%m-%d %H:%M")
df["local"] = df["t"].dt.tz_localize("UTC").dt.tz_convert("Europe/Vienna")
df["hour"] = df["local"].dt.hour
df["day"] = df["local"].dt.strftime("%Y-%m-%d %H:%M")
df["back"] = df["t"].dt.tz_localize("Asia/Kolkata").dt.tz_convert(None)
df["naive"] = df["local"].dt.tz_localize(None)
result = df
''')
    assert "TODO" not in result.converted_text


def test_zoned_column_written_to_csv(tmp_path) -> None:
    result = same_text('''
        import pandas as pd
        log = pd.read_csv("log.csv")
        log["at"] = pd.to_datetime(log["logged"], unit="s")
        log["at"] = log["at"].dt.tz_localize("UTC").dt.tz_convert("America/Sao_Paulo")
        log["h"] = log["at"].dt.hour
        log.to_csv("out.csv", index=False)
    ''', tmp_path, RADIO)
    assert "TODO" not in result.converted_text


def test_tz_localize_of_a_time_that_does_not_exist_fails_in_both() -> None:
    # 02:30 on 31 March 2024 does not exist in Vienna: pandas raises (nonexistent="raise"),
    # and so does Polars (non_existent="raise")
    import pytest
    from support import run
    source = HEAD + ('df = pd.DataFrame({"s": ["2024-03-31 02:30"]})\n'
                     'df["t"] = pd.to_datetime(df["s"], format="%Y-%m-%d %H:%M")\n'
                     'df["z"] = df["t"].dt.tz_localize("Europe/Vienna")\nresult = df\n')
    with pytest.raises(Exception):
        run(source)
    converted = convert(source).converted_text
    assert "TODO" not in converted
    with pytest.raises(Exception, match="non-existent|does not exist"):
        run(converted)["result"].collect()  # a lazy frame: the error comes when it is computed


def test_replace_anchored_at_both_ends_keeps_a_final_newline() -> None:
    # Python's $ also matches before a final newline: re.sub(r"^R-?(\d\d)-?(\d+)$", ...) of
    # "R24031\n" is "R-24-031\n"; it had stayed on pandas under a TODO
    result = differential(HEAD + r'''
df = pd.DataFrame({"s": ["r24-33", "R-24-031", "R24031\n", "x", None, "R-24-1\n\n", "", "\n"]})
df["t"] = df["s"].str.upper().str.replace(r"^R-?(\d\d)-?(\d+)$", r"R-\1-\2", regex=True)
df["u"] = df["s"].str.replace(r"^(\s*)$", r"<\1>", regex=True)
df["v"] = df["s"].str.replace(r"^(?P<a>r)(.*)$", r"\g<a>:\2", regex=True, case=False)
result = df
''')
    assert "TODO" not in result.converted_text


def test_date_offset_added_to_a_datetime_column() -> None:
    # the presenters' licence renewal (community_radio_playlog): pandas moves by calendar
    # months and clips the day to a shorter month's end (2024-01-31 + 1 month is 2024-02-29)
    result = differential(HEAD + '''
df = pd.DataFrame({"s": ["2024-01-31", "2023-02-28", None, "2024-02-29", "2023-12-31",
                         "2023-03-31"]})
df["d"] = pd.to_datetime(df["s"], format="%Y-%m-%d")
df["a"] = df["d"] + pd.DateOffset(months=1)
df["b"] = df["d"] - pd.DateOffset(years=1)
df["c"] = pd.DateOffset(months=13) + df["d"]
df["e"] = df["d"] - pd.DateOffset(days=-3)
df["f"] = df["d"] + pd.DateOffset(weeks=2)
df["g"] = df["d"] + pd.DateOffset(months=-1)
df["late"] = df["a"] > pd.Timestamp("2024-02-29")
result = df
''')
    assert "TODO" not in result.converted_text and "offset_by" in result.converted_text


def test_date_offset_that_sets_a_part_stays_on_pandas() -> None:
    # DateOffset(month=3) (singular) sets the month: not a move by months
    text = HEAD + ('df = pd.DataFrame({"s": ["2024-01-31"]})\n'
                   'df["d"] = pd.to_datetime(df["s"], format="%Y-%m-%d")\n'
                   'df["m"] = df["d"] + pd.DateOffset(month=3)\nresult = df\n')
    result = differential(text)
    assert "TODO(porter): pd.DateOffset" in result.converted_text


def test_date_offset_held_in_a_name_stays_on_pandas() -> None:
    # a name holds pandas' DateOffset (no Polars value): the addition had raised inside porter
    # ("could not read this call"); it is a TODO that runs, as pandas computes it
    result = differential(HEAD + '''
df = pd.DataFrame({"s": ["2024-01-31", None, "2023-03-31"]})
df["d"] = pd.to_datetime(df["s"], format="%Y-%m-%d")
off = pd.DateOffset(months=1)
df["r"] = df["d"] + off
t = pd.Timestamp("2024-01-31") + pd.DateOffset(months=1)
df["late"] = df["d"] < t
result = df
''')
    assert "a DateOffset held in a name" in result.converted_text
    assert "internal error" not in result.converted_text
