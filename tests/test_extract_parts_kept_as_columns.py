"""str.extract's frame of parts kept in a name and read after its text column is overwritten
(engine.parts_as_columns): pandas' parts keep the values of the text as it was, so porter adds
them to the text's frame under names of their own where they are bound, reads them from there
and drops them after the name's last read.

pandas is the reference implementation: each differential check runs the snippet with pandas
and its conversion with Polars and compares the variables they computed. The scenario is a
ferry line's berth codes: 'B-07 North', 'b12/ quay'.
"""

from __future__ import annotations

from support import convert, differential

HEAD = ("import numpy as np\nimport pandas as pd\n"
        'df = pd.DataFrame({"berth": ["B-07 North", "b12/ quay", None, "B-3 Öresund", "x", '
        '"B-07 North", "b1  harbour", ""], "n": [1, 2, 3, 4, 5, 6, 7, 8]})\n')
EXTRACT = 'parts = df["berth"].str.extract(r"(?i)^b-?(\\d+)\\W*\\s*([a-zö]+)$")\n'


def test_source_overwritten_before_the_second_part_is_read() -> None:
    result = differential(HEAD + EXTRACT +
                          'df["berth"] = "B" + parts[0].str.zfill(2)\n'
                          'df["side"] = parts[1].str.lower()\n'
                          "result = df\n")
    text = result.converted_text
    assert "to_pandas" not in text and "TODO" not in text
    assert 'df.drop("_parts_0", "_parts_1")' in text


def test_columns_of_the_same_names_already_there() -> None:
    # the frame has a column named as the parts would be: they take other names
    result = differential(HEAD + 'df["_parts_0"] = df["n"] * 2\n' + EXTRACT +
                          'df["berth"] = parts[1]\n'
                          'df["code"] = parts[0]\n'
                          "result = df\n")
    assert "__parts_0" in result.converted_text and "to_pandas" not in result.converted_text


def test_named_groups_and_reads_in_other_statements() -> None:
    result = differential(HEAD + 'parts = df["berth"].str.extract(r"(?P<no>\\d+)\\W*(?P<quay>[a-z]+)")\n'
                          'df["berth"] = parts["quay"]\n'
                          'df["n"] = df["n"] + 1\n'
                          'df["no"] = parts["no"].fillna("0")\n'
                          "result = df\n")
    assert "to_pandas" not in result.converted_text


def test_frame_read_whole_before_the_last_read_stays_pandas() -> None:
    # print(df) in between would show the added columns: pandas computes the parts there
    result = differential(HEAD + EXTRACT +
                          'df["berth"] = parts[0]\n'
                          "print(df)\n"
                          'df["side"] = parts[1]\n'
                          "result = df\n")
    assert "_parts_0" not in result.converted_text


def test_text_kept_stays_an_expression() -> None:
    # the text is not overwritten: the parts stay an expression of the frame, nothing is added
    text = convert(HEAD + EXTRACT + 'df["a"] = parts[0]\ndf["b"] = parts[1]\nresult = df\n'
                   ).converted_text
    assert "_parts_0" not in text and "parts.struct.field" in text


# -- str.split(expand=True) changed in place, and a Series read after its column changed ----

SAILINGS = ("import numpy as np\nimport pandas as pd\n"
            'df = pd.DataFrame({"day": ["2025-06-24", "2025-06-24", "2025-06-25", None, '
            '"2025-06-26", "2025-06-24"], "span": ["5:00-09:00", "22:30 - 01:15", "all tide", '
            '"6:00-7:00", None, "5:00-09:00"]})\n'
            "df = df.drop_duplicates()\n"
            'df["day"] = pd.to_datetime(df["day"], format="%Y-%m-%d")\n')


def test_split_relabelled_and_changed_in_place() -> None:
    result = differential(SAILINGS +
                          'span = df["span"].str.replace(" ", "", regex=False).str.split("-", expand=True)\n'
                          'span.columns = ["start", "stop"]\n'
                          'span["start"] = span["start"].str.zfill(5)\n'
                          "head = span.head()\n"
                          'df["start"] = df["day"] + pd.to_timedelta(span["start"] + ":00", errors="coerce")\n'
                          'df["stop"] = df["day"] + pd.to_timedelta(span["stop"] + ":00", errors="coerce")\n'
                          "result = df\n", "result", "head")
    text = result.converted_text
    assert "to_pandas" not in text and "TODO" not in text
    assert 'df.drop("_span_0", "_span_1")' in text


def test_mask_read_after_a_column_it_reads_is_written() -> None:
    # pandas' mask keeps its values: overnight.sum() counts the runs before the day was added
    result = differential(SAILINGS +
                          'df["start"] = df["day"] + pd.Timedelta(hours=5)\n'
                          'df["stop"] = df["day"] + pd.Timedelta(hours=1)\n'
                          'overnight = df["stop"] < df["start"]\n'
                          'df.loc[overnight, "stop"] += pd.Timedelta(days=1)\n'
                          'df["minutes"] = (df["stop"] - df["start"]).dt.total_seconds() / 60\n'
                          "late = overnight.sum()\n"
                          "result = df\n", "result", "late")
    text = result.converted_text
    assert "TODO" not in text and 'df.drop("_overnight")' in text
