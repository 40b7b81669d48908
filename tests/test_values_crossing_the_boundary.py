"""Values crossing between pandas and Polars, and files written.

pandas is the reference implementation: each check runs the script with pandas and its
conversion with Polars, each in a folder of its own, and compares what they print and the text
of every file they write (support.same_text).
"""

from __future__ import annotations

from pathlib import Path
import subprocess
import sys
import textwrap

import pandas as pd

from porter.api import convert_source
from porter.model import Options
from support import same_text

DELIVERIES = "k,v,n\na,1,1\nb,2,\nc,3,3\n"


def test_to_parquet_of_a_filtered_frame_keeps_pandas_labels(tmp_path: Path) -> None:
    # pandas stores RangeIndex(1, 3) in the file's metadata; read back, those are the labels
    same_text("""
        import os
        import pandas as pd
        df = pd.read_csv("d.csv")
        big = df[df["v"] > 1]
        big.to_parquet("big.parquet")
        back = pd.read_parquet("big.parquet")
        back.to_csv("back.csv")
        print(back.index.tolist())
        os.remove("big.parquet")  # (the texts of the files are compared)
    """, tmp_path, {"d.csv": DELIVERIES})


def test_to_parquet_of_a_sorted_frame_read_back(tmp_path: Path) -> None:
    # pandas stores the order labels as __index_level_0__, which its read_parquet makes the
    # labels again; Polars would read that column as a column
    same_text("""
        import os
        import pandas as pd
        df = pd.read_csv("d.csv")
        df.sort_values("v", ascending=False).to_parquet("s.parquet")
        back = pd.read_parquet("s.parquet")
        back.to_csv("back.csv")
        print(back.columns.tolist())
        os.remove("s.parquet")
    """, tmp_path, {"d.csv": DELIVERIES})


def test_read_parquet_of_a_file_holding_pandas_labels(tmp_path: Path) -> None:
    # an input file pandas wrote from a sorted frame: __index_level_0__ holds its labels
    source = textwrap.dedent("""
        import pandas as pd
        back = pd.read_parquet("s.parquet")
        back.to_csv("back.csv")
        print(back.columns.tolist())
    """)
    frame = pd.DataFrame({"k": ["a", "b", "c"], "v": [3, 1, 2]}).sort_values("v")
    texts = []
    result = None
    for side in ("pandas", "polars"):
        folder = tmp_path / side
        folder.mkdir()
        frame.to_parquet(folder / "s.parquet")
        if result is None:
            result = convert_source(source, options=Options(data_dir=str(folder)))
        (folder / "script.py").write_text(source if side == "pandas" else result.converted_text)
        done = subprocess.run([sys.executable, "script.py"], cwd=folder, capture_output=True,
                              text=True, timeout=120)
        assert done.returncode == 0, done.stderr
        texts.append((done.stdout, (folder / "back.csv").read_text()))
    assert texts[0] == texts[1], f"{texts}\n--- converted ---\n{result.converted_text}"


def test_iloc_of_a_missing_text_is_nan(tmp_path: Path) -> None:
    # pandas gives nan for a missing text (a file name shows it); in another frame's filter it
    # matches no row, as nan matches nothing in pandas
    same_text("""
        import pandas as pd
        df = pd.read_csv("z.csv")
        z = df["zone"].iloc[1]
        first = df["zone"].iloc[0]
        print(z, first)
        other = pd.read_csv("z.csv")
        other[other["zone"] == z].to_csv(f"zone_{z}.csv", index=False)
        other[other["zone"] == first].to_csv(f"zone_{first}.csv", index=False)
        df[df["zone"] != df["zone"].iloc[1]].to_csv("rest.csv", index=False)
    """, tmp_path, {"z.csv": "zone,v\nN,1\n,2\nS,3\n"})


def test_agg_list_of_text_with_a_missing_value(tmp_path: Path) -> None:
    # pandas' list holds nan for the missing text: written [nan, 'cancelled']
    same_text("""
        import pandas as pd
        f = pd.read_csv("f.csv")
        a = f.groupby("route")["status"].agg(list).reset_index()
        a.to_csv("out.csv", index=False)
    """, tmp_path, {"f.csv": "route,status\nEast,\nEast,cancelled\nNorth,ok\n"})


def test_frame_of_rows_with_values_of_two_types(tmp_path: Path) -> None:
    # pandas keeps an object column of ints and text; pl.from_pandas refuses it
    same_text("""
        import pandas as pd
        f = pd.read_csv("f.csv")
        rows = []
        for route, g in f.groupby("route"):
            top = g["pax"].max()
            rows.append({"route": route, "best": top if top > 20 else "low"})
        out = pd.DataFrame(rows)
        out.to_csv("out.csv", index=False)
    """, tmp_path, {"f.csv": "route,pax\nNorth,40\nNorth,61\nEast,12\n"})


def test_frame_of_rows_holding_lists(tmp_path: Path) -> None:
    # pandas writes each list's repr; Polars' CSV writer refuses a List column
    same_text("""
        import pandas as pd
        f = pd.read_csv("f.csv")
        rows = []
        for route, g in f.groupby("route"):
            rows.append({"route": route, "pax": list(g["pax"])})
        out = pd.DataFrame(rows)
        out.to_csv("out.csv", index=False)
    """, tmp_path, {"f.csv": "route,pax\nNorth,40\nNorth,61\nEast,12\n"})


def test_row_labels_set_on_pandas_are_kept(tmp_path: Path) -> None:
    # pandas writes the labels it was given (k,k,v / a,a,1); a frame coming back to Polars
    # would lose them
    same_text("""
        import pandas as pd
        df = pd.read_csv("d.csv")
        df.index = df["k"]
        df.to_csv("o.csv")
        e = pd.read_csv("d.csv")
        e.index += 1
        e["w"] = e["v"] * 2
        e.to_csv("o2.csv")
        r = pd.read_csv("d.csv").sort_values("v")
        r.index = range(1, len(r) + 1)
        r.index.name = "rank"
        r.to_csv("o3.csv")
    """, tmp_path, {"d.csv": "k,v\nb,2\na,1\nc,3\n"})


def test_group_unique_and_lists_made_by_pandas_stay_pandas(tmp_path: Path) -> None:
    # pandas' cells hold arrays (unique()) or lists of numpy values and Timestamps, written as
    # their text; pl.from_pandas refuses the arrays, Polars' CSV writer the lists
    same_text("""
        import pandas as pd
        f = pd.read_csv("f.csv", parse_dates=["dep"])
        u = f.groupby("route")["status"].unique().reset_index()
        u.to_csv("u.csv", index=False)
        e = f.groupby("route")["pax"].agg(lambda s: sorted(s.unique())).reset_index()
        e.to_csv("e.csv", index=False)
        a = f.groupby("route")["dep"].agg(list).reset_index()
        a.to_csv("a.csv", index=False)
    """, tmp_path, {"f.csv": "route,status,pax,dep\nEast,,12,2024-05-02\nEast,cancelled,0,"
                             "2024-05-04\nNorth,ok,40,2024-05-01\n"})


def test_two_levels_of_column_labels_handed_to_pandas(tmp_path: Path) -> None:
    # pandas' columns after agg({"v": [...]}) are (column, function) pairs, with or without
    # the keys in the index: code that joins them reads pairs, not porter's flat names
    same_text("""
        import pandas as pd
        df = pd.read_csv("d.csv")
        b = df.groupby("k", as_index=False).agg({"v": ["min", "max"]})
        b.columns = ["_".join(c).strip("_") for c in b.columns]
        b.to_csv("b.csv", index=False)
        c = df.groupby("k", as_index=False).agg({"v": ["min", "max"]})
        c[("v", "range")] = c[("v", "max")] - c[("v", "min")]
        c.to_csv("c.csv", index=False)
    """, tmp_path, {"d.csv": "k,v\na,1\na,3\nb,2\n"})


def test_series_labelled_by_texts_handed_over_has_an_unnamed_index(tmp_path: Path) -> None:
    # pd.Series(..., index=[...]) has an unnamed index; porter holds the labels in a column
    # called "index", which must not become the index's name on the way back to pandas: it
    # would show as extractall's first level ("index" where pandas has "level_0"), in a print
    # and in to_csv's header (source: pandas' own docstring example of str.extractall)
    same_text("""
        import pandas as pd
        s = pd.Series(["a1a2", "b1", "c1", None, "é9"], index=["A", "B", "C", "D", "É"])
        found = s.str.extractall(r"[abé](\\d)")
        print(found)
        found.reset_index().to_csv("found.csv", index=False)
        s.str.extractall(r"(?P<letter>[ab])?(?P<digit>\\d)").to_csv("parts.csv")
    """, tmp_path)
