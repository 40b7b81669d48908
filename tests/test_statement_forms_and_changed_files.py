"""Statement forms porter left unconverted (`match`, `a = b = ...`,
annotated assignments), and files the script changes after it reads them.

Every check runs the script with pandas (the reference) and its conversion with Polars, each
in a folder of its own, and compares what they print and the files they write.
"""

from __future__ import annotations

from pathlib import Path
import subprocess
import sys
import textwrap

from support import convert, converted_text, same_text


D = "k,v\na,1\nb,2\nc,3\n"
E = "k,v\nz,9\n"


# -- match statements ---------------------------------------------------------------------

def test_match_case_bodies_are_converted(tmp_path: Path) -> None:
    # pandas adds w = v * 2 in the first case; the case bodies were left as written, on a
    # LazyFrame (TypeError: LazyFrame is not subscriptable)
    same_text("""
        import pandas as pd
        df = pd.read_csv("d.csv")
        mode = "double"
        match mode:
            case "double":
                df["w"] = df["v"] * 2
            case _:
                df["w"] = df["v"]
        df.to_csv("o.csv", index=False)
        print(df["w"].tolist())
    """, tmp_path, {"d.csv": D})


def test_match_without_catch_all_guards_and_captures(tmp_path: Path) -> None:
    # no case matches "other": the frame keeps its columns; a guard reads frame values; a
    # capture pattern binds a name the body uses
    same_text("""
        import pandas as pd
        df = pd.read_csv("d.csv")
        for mode in ["double", ("add", 5), "big", "other"]:
            match mode:
                case "double":
                    df["w"] = df["v"] * 2
                case ("add", amount):
                    df["w"] = df["v"] + amount
                case "big" if df["v"].sum() > 3:
                    df = df[df["v"] > 1]
            print(mode, df.shape, df["v"].sum())
        df.to_csv("o.csv", index=False)
    """, tmp_path, {"d.csv": D})


def test_match_case_that_keeps_a_frame_on_pandas(tmp_path: Path) -> None:
    # one case changes the frame in a way porter keeps on pandas, the other does not: after
    # the statement the frame is pandas' either way
    same_text("""
        import pandas as pd
        df = pd.read_csv("d.csv")
        mode = "insert"
        match mode:
            case "insert":
                df.insert(0, "first", df["v"] * 3)
            case "other":
                df["w"] = 1
        df.to_csv("o.csv", index=False)
        print(df.columns.tolist())
    """, tmp_path, {"d.csv": D})


# -- a = b = value ------------------------------------------------------------------------

def test_chained_assignment_of_a_read(tmp_path: Path) -> None:
    # pandas writes o.csv; the uses after `raw = df = pd.read_csv(...)` were left as written
    # (AttributeError: 'LazyFrame' object has no attribute 'to_csv')
    same_text("""
        import pandas as pd
        raw = df = pd.read_csv("d.csv")
        df.to_csv("o.csv", index=False)
        print(raw["v"].sum(), len(df))
    """, tmp_path, {"d.csv": D})


def test_chained_assignment_then_a_change_in_place(tmp_path: Path) -> None:
    # both names are one frame in pandas: the column added through one shows through the other
    same_text("""
        import pandas as pd
        x = y = pd.read_csv("d.csv")
        y["z"] = y["v"] * 2
        x.to_csv("o.csv", index=False)
        print(x.columns.tolist(), y["z"].sum())
    """, tmp_path, {"d.csv": D})


def test_chained_assignment_of_scalars_and_frames(tmp_path: Path) -> None:
    same_text("""
        import pandas as pd
        df = pd.read_csv("d.csv")
        lo = hi = df["v"].sum()
        a = b = df[df["v"] > 1]
        a.to_csv("a.csv", index=False)
        print(lo, hi, len(b))
    """, tmp_path, {"d.csv": D})


# -- name: T = value ----------------------------------------------------------------------

def test_annotated_read_and_filter(tmp_path: Path) -> None:
    # the later uses of an annotated frame were left as written (AttributeError)
    result = same_text("""
        import pandas as pd
        df: pd.DataFrame = pd.read_csv("d.csv")
        sub: pd.DataFrame = df[df["v"] > 1]
        total: float = df["v"].sum()
        doubled: pd.Series = df["v"] * 2
        df["d"] = doubled
        df.to_csv("o.csv", index=False)
        sub.to_csv("s.csv", index=False)
        print(total, df["d"].tolist())
    """, tmp_path, {"d.csv": D})
    text = result.converted_text
    assert "df: pl.LazyFrame = " in text and "sub: pl.LazyFrame = " in text
    assert "pd.DataFrame" not in text and "total: float = " in text


def test_annotated_frame_kept_on_pandas(tmp_path: Path) -> None:
    same_text("""
        import pandas as pd
        df: pd.DataFrame = pd.read_csv("d.csv")
        df.insert(0, "first", df["v"] * 3)
        again: pd.DataFrame = df
        again.to_csv("o.csv", index=False)
        print(again.columns.tolist())
    """, tmp_path, {"d.csv": D})


# -- files the script changes after it reads them -----------------------------------------

def test_read_then_input_overwritten(tmp_path: Path) -> None:
    # pandas read d.csv before the script overwrote it and prints 6; the scan read the new
    # file when the plan ran, after the write, and printed 9
    same_text("""
        import pandas as pd
        old = pd.read_csv("d.csv")
        new = pd.read_csv("e.csv")
        new.to_csv("d.csv", index=False)
        print(old["v"].sum(), len(old))
    """, tmp_path, {"d.csv": D, "e.csv": E})


def test_read_then_input_moved(tmp_path: Path) -> None:
    # pandas read inbox/d.csv before it was moved; the scan ran after the move and stopped
    # (FileNotFoundError). (A frame used once: one used twice was collected where it was read.)
    for side in ("pandas", "polars"):
        (tmp_path / side / "inbox").mkdir(parents=True)
        (tmp_path / side / "inbox" / "d.csv").write_text(D)
    source = textwrap.dedent("""
        import shutil
        import pandas as pd
        df = pd.read_csv("inbox/d.csv")
        shutil.move("inbox/d.csv", "d_done.csv")
        df.to_csv("o.csv", index=False)
    """)
    converted = convert(source, data_dir=str(tmp_path / "pandas")).converted_text
    outs = []
    for side, text in (("pandas", source), ("polars", converted)):
        (tmp_path / side / "s.py").write_text(text)
        done = subprocess.run([sys.executable, "s.py"], cwd=tmp_path / side,
                              capture_output=True, text=True, timeout=120)
        assert done.returncode == 0, done.stderr + converted
        outs.append((done.stdout, (tmp_path / side / "o.csv").read_text()))
    assert outs[0] == outs[1]


def test_back_up_then_overwrite(tmp_path: Path) -> None:
    # pandas writes backup.csv from the old d.csv, then the new d.csv; the two sinks were
    # batched in one pl.collect_all, which Polars refuses (the batch reads d.csv)
    same_text("""
        import pandas as pd
        old = pd.read_csv("d.csv")
        new = pd.read_csv("e.csv")
        old.to_csv("backup.csv", index=False)
        new.to_csv("d.csv", index=False)
        print(open("d.csv").read())
    """, tmp_path, {"d.csv": D, "e.csv": E})


def test_rewrite_the_file_read(tmp_path: Path) -> None:
    # the most common form: read a file, add a column, write it back to the same file
    same_text("""
        import pandas as pd
        df = pd.read_csv("d.csv")
        df["w"] = df["v"] * 2
        df.to_csv("d.csv", index=False)
        print(len(df), open("d.csv").read())
    """, tmp_path, {"d.csv": D})


def test_read_through_a_function_then_overwritten(tmp_path: Path) -> None:
    same_text("""
        import os
        import pandas as pd

        def load(path):
            return pd.read_csv(path)

        old = load("d.csv")
        os.remove("d.csv")
        pd.read_csv("e.csv").to_csv("d.csv", index=False)
        print(old["v"].sum(), len(old))
    """, tmp_path, {"d.csv": D, "e.csv": E})


def test_read_then_a_write_whose_path_porter_cannot_tell(tmp_path: Path) -> None:
    # the name of the file written is only known when the script runs: it may be the one read
    same_text("""
        import pandas as pd
        old = pd.read_csv("d.csv")
        new = pd.read_csv("e.csv")
        for name in ["d"]:
            new.to_csv(name + ".csv", index=False)
        print(old["v"].sum())
    """, tmp_path, {"d.csv": D, "e.csv": E})


def test_a_read_after_its_file_is_written_is_not_collected() -> None:
    # writing other files, or writing before the read, keeps the plan lazy
    text = converted_text("""
        import pandas as pd
        a = pd.read_csv("a.csv")
        a.to_csv("b.csv", index=False)
        b = pd.read_csv("b.csv")
        b.to_csv("c.csv", index=False)
    """)
    assert ".collect()" not in text


def test_stale_copy_in_data_of_a_file_the_script_writes(tmp_path: Path) -> None:
    # stage.csv in --data is an old copy (kg 1.5, code x); the script writes it before it
    # reads it back: pandas reads kg and code as integers, the scan was told float and text
    same_text("""
        import pandas as pd
        j = pd.read_csv("jan.csv")
        j["code"] = j["kg"] * 10
        j.to_csv("stage.csv", index=False)
        back = pd.read_csv("stage.csv")
        back.to_csv("final.csv", index=False)
        print(back["code"].tolist(), back.dtypes.tolist())
    """, tmp_path, {"jan.csv": "crate,kg\nc1,5\nc2,6\n", "stage.csv": "crate,kg,code\nold,1.5,x\n"})


def test_stale_copy_that_no_longer_fits(tmp_path: Path) -> None:
    # the stale copy's integers do not fit what the script writes (1.5): the typed scan stopped
    same_text("""
        import pandas as pd
        j = pd.read_csv("jan.csv")
        j.to_csv("stage.csv", index=False)
        back = pd.read_csv("stage.csv")
        print(back["kg"].sum())
    """, tmp_path, {"jan.csv": "crate,kg\nc1,1.5\nc2,6\n", "stage.csv": "crate,kg\nold,1\n"})


def test_one_statement_reads_and_writes_the_same_file(tmp_path: Path) -> None:
    # Polars refuses to stream a query into the file it reads
    same_text("""
        import pandas as pd
        pd.read_csv("d.csv").assign(w=1).to_csv("d.csv", index=False)
        print(open("d.csv").read())
    """, tmp_path, {"d.csv": D})


def test_starred_unpacking_of_frames(tmp_path: Path) -> None:
    # `first.to_csv(...)` was left as written after `first, *rest = [...]` (AttributeError)
    same_text("""
        import pandas as pd
        df = pd.read_csv("d.csv")
        first, *rest = [df, df.head(1), df.tail(1)]
        first.to_csv("f.csv", index=False)
        print(len(rest), [len(r) for r in rest])
    """, tmp_path, {"d.csv": D})


def test_groupby_and_series_bound_from_a_read_then_overwritten(tmp_path: Path) -> None:
    # a pending groupby and a Series kept in a name read their file when used
    same_text("""
        import pandas as pd
        g = pd.read_csv("d.csv").groupby("k")
        s = pd.read_csv("d.csv")["v"]
        t = pd.read_csv("d.csv")["v"] * 2
        pd.DataFrame({"k": ["z"], "v": [0]}).to_csv("d.csv", index=False)
        print(g["v"].sum().tolist(), s.sum(), t.tolist())
    """, tmp_path, {"d.csv": "k,v\na,1\nb,2\na,3\n"})


def test_parquet_read_then_overwritten(tmp_path: Path) -> None:
    # pandas sums the first file (3); the scan read the second one (9)
    same_text("""
        import os
        import pandas as pd
        pd.DataFrame({"k": ["a", "b"], "v": [1, 2]}).to_parquet("a.parquet")
        p = pd.read_parquet("a.parquet")
        pd.DataFrame({"k": ["z"], "v": [9]}).to_parquet("a.parquet")
        print(p["v"].sum())
        os.remove("a.parquet")  # (the files written are compared as text)
    """, tmp_path, {"d.csv": D})


def test_the_read_of_a_file_the_script_wrote_says_why_its_types_are_inferred(tmp_path: Path) -> None:
    # the site said the file was not under --data, although it is (an older copy)
    result = same_text("""
        import pandas as pd
        j = pd.read_csv("jan.csv")
        j.to_csv("stage.csv", index=False)
        back = pd.read_csv("stage.csv")
        print(back["kg"].sum())
    """, tmp_path, {"jan.csv": "crate,kg\nc1,5\nc2,6\n", "stage.csv": "crate,kg\nold,1.5\n"})
    read = [s for s in result.sites if s.key == "pd.read_csv" and s.line == 5]
    # (a frame with text written and read back stays pandas': "+3" is a number to pandas)
    assert read and "reads back text it wrote" in read[0].message
    assert "not under the --data folder" not in read[0].message
