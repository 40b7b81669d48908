"""Windows met in the corpus scripts (issue 10): round() or abs() of a window
within groups, time windows of a frame (`df.rolling("30D", on="t")[col]`), and the running
sum of a True/False column read with a blank.

pandas is the reference: each check runs the script with pandas and its conversion with Polars
in folders holding the same files, and compares what they print and write as text.
"""

from __future__ import annotations

import pytest

from support import same_text

BOATS = {"b.csv": "boat,fuel,t\nheron,3.25,2024-01-01\nótter,,2024-01-02\nheron,-1.5,2024-01-02\n"
                  ",7.0,2024-01-04\nótter,2.75,2024-01-05\nheron,4.125,2024-01-09\n"
                  "ótter,-0.5,2024-01-09\nheron,,2024-01-12\n"}


# -- round / abs of a group window ----------------------------------------------------------

@pytest.mark.parametrize("line", [
    'd["r"] = d.groupby("boat")["fuel"].expanding().mean().reset_index(level=0, drop=True).round(1)',
    'd["r"] = d.groupby("boat")["fuel"].rolling(2, min_periods=1).sum().round(2).reset_index(level=0, drop=True)',
    'd["r"] = d.groupby("boat")["fuel"].rolling(2, min_periods=1).min().droplevel(0).abs()',
    'd["r"] = d.groupby("boat")["fuel"].rolling(3, min_periods=1).mean().abs().round(3).droplevel(0)',
])
def test_round_and_abs_of_a_group_window(line, tmp_path):
    """pandas keeps each value's labels through round and abs: assigned back, each lands on its
    own row (the row with no boat gets NaN)."""
    result = same_text(f"""
        import pandas as pd
        d = pd.read_csv("b.csv")
        {line}
        print(d["fuel"].tolist())
        d.to_csv("o.csv", index=False)
        """, tmp_path, BOATS)
    assert "TODO" not in result.converted_text


# -- windows of a frame: df.rolling(n or "30D", on="t")[col] -----------------------------------

# times tied (two shouts at 06:00 on the 3rd), a missing value on a tied row, ints and floats
SHOUTS = {"s.csv": "at,crew,fuel\n2024-01-01 06:00,4,12.5\n2024-01-02 18:00,5,\n"
                   "2024-01-03 06:00,,30.0\n2024-01-03 06:00,6,7.25\n2024-01-03 06:00,3,\n"
                   "2024-01-04 07:00,4,-2.0\n2024-01-09 00:00,7,1.5\n2024-01-09 00:30,0,\n"
                   "2024-01-10 00:00,5,4.0\n"}


@pytest.mark.parametrize("line", [
    'd["r"] = d.rolling("2D", on="at")["fuel"].count()',
    'd["r"] = d.rolling("2D", on="at", min_periods=2)["fuel"].count()',
    'd["r"] = d.rolling("2D", on="at")["crew"].sum()',
    'd["r"] = d.rolling("36h", on="at", min_periods=0)["fuel"].sum()',
    'd["r"] = d.rolling("3D", on="at")["fuel"].mean()',
    'd["r"] = d.rolling("1D", on="at", min_periods=2)["crew"].mean()',
    'd["r"] = d.rolling("2D", on="at")["fuel"].min()',
    'd["r"] = d.rolling(window="90min", on="at")["crew"].max()',
    'd["r"] = d.rolling(3, min_periods=1)["fuel"].max()',
    'd["r"] = d.rolling(2)["crew"].sum()',
])
def test_frame_windows(line, tmp_path):
    """pandas' time window at a row ends at that row: the rows tied on its time that come
    later are not in it (the 06:00 shouts of the 3rd see 1, 2, then 3 rows); min_periods
    counts the rows for count, the values present otherwise."""
    result = same_text(f"""
        import pandas as pd
        d = pd.read_csv("s.csv", parse_dates=["at"])
        {line}
        print(d["r"].tolist())
        d.to_csv("o.csv", index=False)
        """, tmp_path, SHOUTS)
    assert "TODO" not in result.converted_text



@pytest.mark.parametrize("line", [
    'd["r"] = d.rolling("2D", on="at")["fuel"].median()',
    'd["r"] = d.rolling("3D", on="at", min_periods=2)["crew"].std()',
])
def test_frame_time_windows_handed_to_pandas_are_pandas_windows(line, tmp_path):
    """A time window whose method porter leaves to pandas (median, std: the tied rows' part
    cannot be combined) is made again from the frame's times and the column, as pandas made
    it; the column alone has no times, and pandas' Series.rolling refuses on=."""
    result = same_text(f"""
        import pandas as pd
        d = pd.read_csv("s.csv", parse_dates=["at"])
        {line}
        print(d["r"].tolist())
        d.to_csv("o.csv", index=False)
        """, tmp_path, SHOUTS)
    assert 'select("at", ' in result.converted_text  # only the times and the column go over

def test_time_window_of_a_sorted_frame(tmp_path):
    """The usual script: sort by time, then count what happened in the 7 days up to each row."""
    files = {"s.csv": "at,no\n2024-03-09 10:00,4\n2024-03-01 08:00,1\n2024-03-03 09:00,2\n"
                      "2024-03-03 09:00,3\n2024-03-20 11:00,5\n2024-03-08 07:59,6\n"}
    result = same_text("""
        import pandas as pd
        d = pd.read_csv("s.csv")
        d["at"] = pd.to_datetime(d["at"], format="%Y-%m-%d %H:%M")
        d = d.sort_values(["at", "no"]).reset_index(drop=True)
        d["last_week"] = d.rolling("7D", on="at")["no"].count()
        d["no_sum"] = d.rolling("7D", on="at")["no"].sum()
        d.to_csv("o.csv", index=False)
        """, tmp_path, files)
    assert "rolling_sum_by" in result.converted_text


# -- the running sum of a True/False column read with a blank --------------------------------

FLAGS = {"f.csv": "load,organic,kg\n1,True,3\n2,False,4\n3,,5\n4,True,1\n5,False,2\n6,True,0\n"}


def test_running_sum_of_flags_read_with_a_blank_is_a_todo(tmp_path):
    """pandas reads the column as object (True, False, NaN); its cumsum keeps the first value as
    it is, counts in ints, and turns float after the first missing value. No Polars column
    holds that, and the file's types do not say whether a value is missing."""
    import io

    import pandas as pd
    from support import convert
    flags = pd.read_csv(io.StringIO(FLAGS["f.csv"]))["organic"]
    assert flags.dtype == object
    assert [type(v).__name__ for v in flags.cumsum()] == ["bool", "int", "float", "float",
                                                          "float", "float"]
    (tmp_path / "f.csv").write_text(FLAGS["f.csv"])
    for line in ('d["n"] = d["organic"].cumsum()', 'd["n"] = d["organic"].cumprod()'):
        text = convert(f'import pandas as pd\nd = pd.read_csv("f.csv")\n{line}\n'
                       'd.to_csv("o.csv", index=False)\n', data_dir=str(tmp_path)).converted_text
        assert "TODO(porter): series.cum" in text and "may hold a missing value" in text


@pytest.mark.parametrize("line", [
    'd["n"] = d["organic"].fillna(False).astype(bool).cumsum()',
    'd["n"] = (d["kg"] > 2).cumsum()',
    'd["n"] = d["organic"].cummax()',
])
def test_running_values_of_flags_that_port(line, tmp_path):
    """Filled first, or made by a comparison, the flags are a bool column in pandas too: the
    running sum is a count (int64); cummax keeps True/False and the blank."""
    result = same_text(f"""
        import pandas as pd
        d = pd.read_csv("f.csv")
        {line}
        print(d["n"].tolist())
        d.to_csv("o.csv", index=False)
        """, tmp_path, FLAGS)
    assert "TODO" not in result.converted_text
