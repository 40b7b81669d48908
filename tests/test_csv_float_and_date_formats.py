"""to_csv(float_format="%.2f") and to_csv(date_format=...): the text pandas writes.

pandas is the reference: each check runs the snippet with pandas and its conversion with
Polars, each in a folder of its own, and compares the files they write character for
character (a tide-gauge club's readings, an apiary's weighings).
"""

from __future__ import annotations

from pathlib import Path

from support import convert, same_text

READINGS = """\
gauge,read_at,level,count,spare,note
Pier,2025-01-02 08:05:03,0.125,1,4,calm
Pier,,2.5,2,,
Weir,2025-12-31 00:00:00,,3,6,crête
Weir,2025-03-01 13:00:00,-0.0,4,7,
Ford,2025-03-01 13:30:00,0.375,0,8,gust
"""


def test_float_format_fixed_decimals_ties_inf_and_missing(tmp_path: Path) -> None:
    # Polars' float_precision rounds the exact binary value, ties to even, as Python's %
    # does (0.125 -> 0.12, 0.375 -> 0.38, 2.5 -> 2); NaN an empty field, inf as inf, -0.0 as
    # -0.00; an int column holding a blank is float64 in pandas: 4.00; one without stays 1
    result = same_text("""
        import pandas as pd
        df = pd.read_csv("readings.csv")
        df["per"] = df["level"] / df["count"]
        df["ok"] = df["level"] > 0.2
        df.to_csv("two.csv", index=False, float_format="%.2f")
        df.to_csv("none.csv", index=False, float_format="%.0f")
        """, tmp_path, {"readings.csv": READINGS})
    assert "float_precision=2" in result.converted_text
    assert "TODO" not in result.converted_text


def test_float_format_without_the_column_types(tmp_path: Path) -> None:
    # without --data the selectors find the float and int columns when the script runs
    result = same_text("""
        import pandas as pd
        df = pd.read_csv("readings.csv")
        df["per"] = df["level"] / df["count"]
        df.to_csv("out.csv", index=False, float_format="%.3f", na_rep="-")
        """, tmp_path, {"readings.csv": READINGS}, with_data=False)
    assert "TODO" not in result.converted_text


def test_float_format_on_group_means(tmp_path: Path) -> None:
    result = same_text("""
        import pandas as pd
        df = pd.read_csv("readings.csv")
        means = df.groupby("gauge", as_index=False)["level"].mean()
        means.to_csv("means.csv", index=False, float_format="%.1f")
        """, tmp_path, {"readings.csv": READINGS})
    assert "float_precision=1" in result.converted_text
    assert "TODO" not in result.converted_text


def test_float_format_on_float32(tmp_path: Path) -> None:
    # pandas formats the float32 value itself ("%.4f" % its float64 value), as Polars does
    result = same_text("""
        import pandas as pd
        df = pd.read_csv("readings.csv")
        df["small"] = df["level"].astype("float32") / 3
        df[["gauge", "small"]].to_csv("small.csv", index=False, float_format="%.4f")
        """, tmp_path, {"readings.csv": READINGS})
    assert "float_precision=4" in result.converted_text
    assert "TODO" not in result.converted_text


def test_date_format_naive_and_zoned_datetimes(tmp_path: Path) -> None:
    # every datetime column through strftime (a zoned one in its local time, as pandas
    # formats it); NaT an empty field, alone on its line "" as pandas writes it; dates held
    # as Python dates and durations are not formatted by pandas
    result = same_text("""
        import pandas as pd
        df = pd.read_csv("readings.csv")
        df["read_at"] = pd.to_datetime(df["read_at"], format="%Y-%m-%d %H:%M:%S")
        df["day"] = df["read_at"].dt.date
        df["since"] = df["read_at"] - pd.Timestamp("2025-01-01")
        df["local"] = df["read_at"].dt.tz_localize("UTC").dt.tz_convert("Europe/Paris")
        df.to_csv("uk.csv", index=False, date_format="%d/%m/%Y %H:%M %a %b %j %I%p %y %%")
        df[["read_at"]].to_csv("year.csv", index=False, date_format="%Y")
        """, tmp_path, {"readings.csv": READINGS})
    assert 'strftime("%d/%m/%Y %H:%M %a %b %j %I%p %y %%")' in result.converted_text
    assert "TODO" not in result.converted_text


def test_both_formats_on_a_write_pandas_makes(tmp_path: Path) -> None:
    # index=True on a plain frame: pandas writes the file, with the formats it was given
    result = same_text("""
        import pandas as pd
        df = pd.read_csv("readings.csv")
        df["read_at"] = pd.to_datetime(df["read_at"], format="%Y-%m-%d %H:%M:%S")
        df.to_csv("indexed.csv", float_format="%.1f", date_format="%d/%m/%Y")
        """, tmp_path, {"readings.csv": READINGS})
    assert 'float_format="%.1f"' in result.converted_text
    assert "TODO" not in result.converted_text


def test_formats_polars_cannot_write_alike_are_todos(tmp_path: Path) -> None:
    # %f is microseconds in Python and nanoseconds in Polars; "%.3g" and a function have no
    # float_precision form: TODOs, and the conversion still runs
    source = """
        import pandas as pd
        df = pd.read_csv("readings.csv")
        df["read_at"] = pd.to_datetime(df["read_at"], format="%Y-%m-%d %H:%M:%S")
        df.to_csv("a.csv", index=False, date_format="%H:%M:%S.%f")
        df.to_csv("b.csv", index=False, float_format="%.3g")
        df.to_csv("c.csv", index=False, float_format="{:.2f}".format)
        """
    (tmp_path / "readings.csv").write_text(READINGS)
    text = convert(source, data_dir=str(tmp_path)).converted_text
    assert text.count("# TODO(porter): frame.to_csv") == 3, text
    assert "%f: Python's strftime" in text.replace("\n#   ", " ")
    run_dir = tmp_path / "run"
    run_dir.mkdir()
    same_text(source, run_dir, {"readings.csv": READINGS})
