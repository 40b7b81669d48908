"""A helper that changes its frame in place and returns nothing is ported, not handed to pandas.

pandas is the reference: each script runs with pandas and its conversion with Polars on the
same files, and they must print and write the same text. The helper is made to return its
frame and each call rebinds the caller's name (`tidy(d)` becomes `d = tidy(d)`): the caller's
frame is the changed one, as it is in pandas.
"""

from __future__ import annotations

import libcst as cst

from porter.analysis.returned_frames import return_changed_frames
from porter.api import convert_source
from support import same_text

CATCH = {"catch.csv": "boat,species,kg,price\nHeron,hake ,120.5,2.1\nótter,Sardine,,1.4\n"
                      "Heron,sardine,33.0,1.5\n,cod,12.25,3.0\nótter,hake,7.5,\n"}


def test_helper_changing_its_frame_is_ported(tmp_path):
    result = same_text("""
        import pandas as pd


        def tidy(df, rate):
            # the quay writes species every which way
            df["species"] = df["species"].str.strip().str.lower()
            df["value"] = df["kg"] * df["price"] * rate
            df.loc[df["kg"].isna(), "value"] = 0.0
            df.rename(columns={"kg": "catch_kg"}, inplace=True)


        d = pd.read_csv("catch.csv")
        tidy(d, 1.0)
        print(d.columns.tolist())
        e = pd.read_csv("catch.csv")
        tidy(e, 2.0)
        d.to_csv("d.csv", index=False)
        e.groupby("species", as_index=False)["value"].sum().to_csv("e.csv", index=False)
    """, tmp_path, CATCH)
    assert "TODO" not in result.converted_text
    assert "d = tidy(d, 1.0)" in result.converted_text
    assert "e = tidy(e, 2.0)" in result.converted_text
    assert "to_pandas" not in result.converted_text


def test_helpers_left_as_written_still_compute_what_pandas_computes(tmp_path):
    # a helper whose result is used, one that returns, one given as a value and one that
    # changes two frames keep their form: porter hands the frames to pandas as before
    result = same_text("""
        import pandas as pd


        def mark(df):
            df["seen"] = 1


        def mark_both(a, b):
            a["seen"] = 1
            b["seen"] = 2


        def mark_and_count(df):
            df["seen"] = 1
            return len(df)


        d = pd.read_csv("catch.csv")
        e = pd.read_csv("catch.csv")
        mark_both(d, e)
        n = mark_and_count(d)
        f = pd.read_csv("catch.csv")
        for frame in [f]:
            mark(frame)
        print(n, d["seen"].sum(), e["seen"].sum(), f["seen"].sum())
        f.to_csv("f.csv", index=False)
    """, tmp_path, CATCH)
    assert "return df\n" not in result.converted_text


def test_lines_of_findings_are_the_original_lines():
    source = (
        "import pandas as pd\n"           # 1
        "\n"                              # 2
        "\n"                              # 3
        "def tidy(df):\n"                 # 4
        "    df['kg'] = df['kg'] * 2\n"   # 5
        "\n"                              # 6
        "\n"                              # 7
        "def grade(df):\n"                # 8
        "    df['g'] = 1\n"               # 9
        "\n"                              # 10
        "\n"                              # 11
        "d = pd.read_csv('catch.csv')\n"  # 12
        "tidy(d)\n"                       # 13
        "grade(d)\n"                      # 14
        "d.to_csv('o.csv', index=False)\n"  # 15
    )
    returned = return_changed_frames(cst.parse_module(source))
    assert returned.functions == ("grade", "tidy")
    text = returned.module.code
    assert text.splitlines()[5] == "    return df" and text.splitlines()[10] == "    return df"
    assert [returned.original_line(n) for n in (5, 7, 10, 14, 17)] == [5, 6, 9, 12, 15]
    result = convert_source(source)
    lines: dict[str, set[int]] = {}
    for site in result.sites:
        lines.setdefault(site.key, set()).add(site.line)
    assert lines["frame.setitem"] == {5, 9}  # in each helper's body
    assert lines["pd.read_csv"] == {12}
    assert lines["frame.to_csv"] == {15}


def test_helper_given_a_frame_handed_to_pandas_runs_once(tmp_path):
    # the argument handed to pandas is the argument's own code: the helper written around it
    # once (it had been written inside its own argument too, and ran twice)
    result = same_text("""
        import pandas as pd

        def bump(df):
            df["n"] = df["n"] + 1
            return df

        t = pd.read_csv("t.csv")
        t = bump(t.drop_duplicates())
        parts = t["x"].str.extract(r"(?i)r-?(\\d+)\\W*([a-z]+)")
        t["x"] = parts[0]
        t["area"] = parts[1]
        t.to_csv("out.csv", index=False)
    """, tmp_path, {"t.csv": "n,x\n1,r-7/north\n1,r-7/north\n2,R12 valley\n"})
    assert result.converted_text.count("bump(") == 2  # its definition and one call
