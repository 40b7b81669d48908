"""Reads of the files a loop or a comprehension lists (glob.glob, Path.glob, os.listdir), with
--data (porter/analysis/globbed_files.py, rules/io.py): porter lists them in the data folder and
reads each one's schema as pandas infers it; when every file gives the same columns and types,
the read is a scan told that schema and the loop, the frame list and pd.concat port. Files that
disagree (another type, other columns, an all-blank column, a file of a header only), or no file
listed, keep the read on pandas under a TODO saying why. Without --data nothing changes.

pandas is the reference: each check runs the script with pandas and its conversion, in the same
folder, and compares what they computed.
"""

from __future__ import annotations

from pathlib import Path
import textwrap

import pytest

from support import converted_text, differential

LOOP_TODO = "the file read is only known when the script runs"

# a ferry line's monthly crossing logs: counts with a blank in every file (float64 to pandas),
# text with non-ASCII letters, a repeated row, fares with a missing value
CROSSINGS = {
    "data/crossings_2025-01.csv": """\
        ferry,route,cars,fare
        Ørnen,Nord–Sør,12,4.5
        Tern,Øy,,3.0
        Ørnen,Øy,7,
        """,
    "data/crossings_2025-02.csv": """\
        ferry,route,cars,fare
        Tern,Nord–Sør,3,4.5
        Tern,Nord–Sør,3,4.5
        Skarv,Øy,,2.25
        Skarv,Øy,0,2.25
        """,
    "data/crossings_2025-03.csv": """\
        ferry,route,cars,fare
        Skarv,Øy,5,2.0
        Ørnen,Nord–Sør,,1.0
        """,
}


def _folder(tmp_path: Path, files: dict[str, str]) -> Path:
    for name, content in files.items():
        target = tmp_path / name
        target.parent.mkdir(parents=True, exist_ok=True)
        target.write_text(textwrap.dedent(content), encoding="utf-8")
    return tmp_path


def _ported(source: str, tmp_path: Path, monkeypatch: pytest.MonkeyPatch,
            files: dict[str, str] = CROSSINGS, *names: str) -> str:
    """Runs the script with pandas and as converted with --data (both in the same folder),
    compares `names` (default: result) and returns the conversion, followed by the messages
    of the reads porter keeps on pandas (the TODO comments wrap them)."""
    monkeypatch.chdir(_folder(tmp_path, files))
    result = differential(source, *names, data_dir=str(tmp_path))
    reads = [s.message for s in result.sites if s.status == "todo" and s.key == "pd.read_csv"]
    return "\n".join([result.converted_text, *reads])


def test_the_loop_over_a_sorted_glob_ports_whole(tmp_path, monkeypatch) -> None:
    # the example of the brief: a column from the path, the frames stacked, a fill, a groupby
    source = """\
        import glob
        import os
        import pandas as pd

        frames = []
        for path in sorted(glob.glob("data/crossings_*.csv")):
            part = pd.read_csv(path)
            part["source"] = os.path.basename(path)
            frames.append(part)
        catch = pd.concat(frames, ignore_index=True)
        catch["cars"] = catch["cars"].fillna(0)
        result = catch.groupby(["ferry", "route"], as_index=False)["cars"].sum()
        by_source = catch.groupby("source", as_index=False)["fare"].mean()
        stacked = catch
        """
    text = _ported(source, tmp_path, monkeypatch, CROSSINGS, "result", "by_source", "stacked")
    assert "pl.scan_csv(path" in text and "pl.concat(frames" in text
    assert "TODO" not in text and "to_pandas" not in text


@pytest.mark.parametrize("listing", [
    'glob.glob("data/crossings_*.csv")',  # the file system's order: the same list both ways
    'sorted(glob.glob("data/*.csv"), reverse=True)',
    'glob.glob("data/**/*.csv", recursive=True)',
    'glob.iglob(os.path.join("data", "crossings_*.csv"))',
    'listed',  # a name bound once to the listing
    'glob_("data/*.csv")',  # from glob import glob as glob_
])
def test_a_comprehension_over_a_glob_keeps_pandas_order(listing, tmp_path, monkeypatch) -> None:
    # the converted script goes over the same Python list glob.glob gives when it runs, so the
    # rows are stacked in the order pandas stacks them, sorted or not
    source = f"""\
        import glob
        import os
        from glob import glob as glob_
        import pandas as pd
        listed = sorted(glob.glob("data/*.csv"))
        result = pd.concat([pd.read_csv(f) for f in {listing}], ignore_index=True)
        """
    text = _ported(source, tmp_path, monkeypatch)
    assert "pl.scan_csv(f" in text and LOOP_TODO not in text


def test_path_glob_and_a_column_from_the_path(tmp_path, monkeypatch) -> None:
    source = """\
        from pathlib import Path
        import pandas as pd
        frames = []
        for file in sorted(Path("data").glob("crossings_*.csv")):
            month = pd.read_csv(file)
            month["month"] = file.stem[-7:]
            frames.append(month)
        result = pd.concat(frames, ignore_index=True)
        """
    text = _ported(source, tmp_path, monkeypatch)
    assert "pl.scan_csv(file" in text and "TODO" not in text


def test_os_listdir_filtered_by_its_ending(tmp_path, monkeypatch) -> None:
    # notes.txt is not a table: the filter leaves it out, so the files read all agree
    files = {**CROSSINGS, "data/notes.txt": "crossings by month\n"}
    source = """\
        import os
        import pandas as pd
        frames = []
        for name in sorted(os.listdir("data")):
            if name.endswith(".csv"):
                frames.append(pd.read_csv(os.path.join("data", name)))
        result = pd.concat(frames, ignore_index=True)
        """
    text = _ported(source, tmp_path, monkeypatch, files)
    assert "pl.scan_csv(os.path.join(" in text and LOOP_TODO not in text


def test_a_continue_filter_and_an_f_string_path(tmp_path, monkeypatch) -> None:
    files = {**CROSSINGS, "data/readme.md": "# logs\n"}
    source = """\
        import os
        import pandas as pd
        FOLDER = "data"
        frames = []
        for name in sorted(os.listdir(FOLDER)):
            if not name.endswith(".csv"):
                continue
            frames.append(pd.read_csv(f"{FOLDER}/{name}"))
        result = pd.concat(frames, ignore_index=True)
        """
    text = _ported(source, tmp_path, monkeypatch, files)
    assert LOOP_TODO not in text


def test_a_continue_filter_on_the_path_itself(tmp_path, monkeypatch) -> None:
    files = {**CROSSINGS, "data/notes.txt": "crossings by month\n"}
    source = """\
        import glob
        import pandas as pd
        frames = []
        for path in sorted(glob.glob("data/*")):
            if not path.endswith(".csv"):
                continue
            frames.append(pd.read_csv(path))
        result = pd.concat(frames, ignore_index=True)
        """
    text = _ported(source, tmp_path, monkeypatch, files)
    assert LOOP_TODO not in text and "pl.concat(frames" in text


def test_a_filter_porter_cannot_evaluate_keeps_every_file(tmp_path, monkeypatch) -> None:
    # `wanted(name)` is not evaluated: every .csv file listed is taken, and they all agree
    source = """\
        import glob
        import pandas as pd
        def wanted(name):
            return "-02" not in name
        result = pd.concat([pd.read_csv(f) for f in sorted(glob.glob("data/*.csv")) if wanted(f)],
                           ignore_index=True)
        """
    text = _ported(source, tmp_path, monkeypatch)
    assert LOOP_TODO not in text


def test_the_read_options_are_the_ones_a_known_file_takes(tmp_path, monkeypatch) -> None:
    files = {name: content.replace(",", ";") for name, content in CROSSINGS.items()}
    source = """\
        import glob
        import pandas as pd
        result = pd.concat([pd.read_csv(f, sep=";", usecols=["ferry", "cars"], na_values=["0"])
                            for f in sorted(glob.glob("data/*.csv"))], ignore_index=True)
        """
    text = _ported(source, tmp_path, monkeypatch, files)
    assert LOOP_TODO not in text and 'separator=";"' in text


def test_without_ignore_index_the_labels_stay_pandas(tmp_path, monkeypatch) -> None:
    # pd.concat without ignore_index keeps each file's labels 0..n-1 (repeated): the list
    # stays pandas', each scan handed over as the frame pandas would have read
    source = """\
        import glob
        import pandas as pd
        frames = []
        for f in sorted(glob.glob("data/*.csv")):
            frames.append(pd.read_csv(f))
        stacked = pd.concat(frames)
        result = stacked.loc[0]
        labels = stacked.index.tolist()
        """
    text = _ported(source, tmp_path, monkeypatch, CROSSINGS, "result", "labels")
    assert "pl.concat(frames" not in text


@pytest.mark.parametrize("odd, reason", [
    # whole numbers without a blank: int64, where the other files' blanks make float64
    ("ferry,route,cars,fare\nTern,Øy,4,1.5\n", "other types"),
    # an all-blank column: float64 to pandas, where the others hold text
    ("ferry,route,cars,fare\n,Øy,1,1.5\n,Øy,2,1.0\n", "other types"),
    # another column
    ("ferry,route,cars,fare,crew\nTern,Øy,1,1.5,3\n", "other columns"),
    # a header only: object columns to pandas
    ("ferry,route,cars,fare\n", "a header only"),
])
def test_files_that_disagree_stay_pandas(odd, reason, tmp_path, monkeypatch) -> None:
    files = {**CROSSINGS, "data/crossings_2025-04.csv": odd}
    source = """\
        import glob
        import pandas as pd
        frames = []
        for f in sorted(glob.glob("data/*.csv")):
            frames.append(pd.read_csv(f))
        result = pd.concat(frames, ignore_index=True)
        """
    text = _ported(source, tmp_path, monkeypatch, files)
    assert LOOP_TODO in text and reason in text


def test_an_all_blank_column_beside_floats_ports(tmp_path, monkeypatch) -> None:
    # pandas reads the blank column as float64, as it reads the fares of the other files
    files = {**CROSSINGS, "data/crossings_2025-04.csv": "ferry,route,cars,fare\nTern,Øy,,\n"}
    source = """\
        import glob
        import pandas as pd
        result = pd.concat([pd.read_csv(f) for f in sorted(glob.glob("data/*.csv"))],
                           ignore_index=True)
        """
    text = _ported(source, tmp_path, monkeypatch, files)
    assert LOOP_TODO not in text


def test_no_file_listed_keeps_the_todo(tmp_path, monkeypatch) -> None:
    source = """\
        import glob
        import pandas as pd
        frames = [pd.read_csv(f) for f in glob.glob("data/ferries_*.csv")]
        result = len(frames)
        """
    text = _ported(source, tmp_path, monkeypatch)
    assert LOOP_TODO in text and "no file of the --data folder is listed" in text


def test_without_data_nothing_changes() -> None:
    text = converted_text("""\
        import glob
        import pandas as pd
        result = pd.concat([pd.read_csv(f) for f in sorted(glob.glob("data/*.csv"))],
                           ignore_index=True)
        """)
    assert LOOP_TODO in text


def test_a_listing_porter_cannot_make_keeps_the_todo(tmp_path, monkeypatch) -> None:
    source = """\
        import glob
        import pandas as pd
        def files(folder):
            return glob.glob(folder + "/*.csv")
        result = pd.concat([pd.read_csv(f) for f in files("data")], ignore_index=True)
        """
    text = _ported(source, tmp_path, monkeypatch)
    assert LOOP_TODO in text


def test_a_listing_the_script_changes_keeps_the_todo(tmp_path, monkeypatch) -> None:
    # the list gets a file porter did not list (with other columns): the read stays pandas'
    files = {**CROSSINGS, "extra/crew.csv": "ferry,crew\nTern,3\n"}
    source = """\
        import glob
        import pandas as pd
        listed = sorted(glob.glob("data/*.csv"))
        listed.append("extra/crew.csv")
        result = pd.concat([pd.read_csv(f) for f in listed], ignore_index=True)
        """
    text = _ported(source, tmp_path, monkeypatch, files)
    assert LOOP_TODO in text


def test_parquet_files_of_one_schema(tmp_path, monkeypatch) -> None:
    import pandas as pd
    _folder(tmp_path, {})
    (tmp_path / "data").mkdir()
    for month, kg in (("01", [1.5, None]), ("02", [2.0, 3.25])):
        pd.DataFrame({"boat": ["Skarv", "Tern"], "kg": kg}).to_parquet(
            tmp_path / "data" / f"m{month}.parquet", index=False)
    source = """\
        import glob
        import pandas as pd
        result = pd.concat([pd.read_parquet(f) for f in sorted(glob.glob("data/*.parquet"))],
                           ignore_index=True)
        """
    text = _ported(source, tmp_path, monkeypatch, {})
    assert "pl.scan_parquet(f" in text


def test_blank_lines_in_one_file(tmp_path, monkeypatch) -> None:
    # pandas skips a blank line; the scan reads it as a row of missing values, which porter
    # leaves out where any file listed has one
    files = {**CROSSINGS, "data/crossings_2025-04.csv": "ferry,route,cars,fare\n\nTern,Øy,,1.5\n\n"
             "Skarv,Nord–Sør,2,3.0\n"}
    source = """\
        import glob
        import pandas as pd
        result = pd.concat([pd.read_csv(f) for f in sorted(glob.glob("data/*.csv"))],
                           ignore_index=True)
        """
    text = _ported(source, tmp_path, monkeypatch, files)
    assert "pl.scan_csv(f" in text


@pytest.mark.parametrize("second", ["2025-02-03", "02/03/2025", "3 Feb 2025"])
def test_dates_written_otherwise_in_another_file(second, tmp_path, monkeypatch) -> None:
    # pandas guesses each file's date format from that file's first value
    files = {"data/log_1.csv": "ferry,day\nTern,2025-01-13\nSkarv,2025-01-02\n",
             "data/log_2.csv": f"ferry,day\nTern,{second}\nSkarv,{second}\n"}
    source = """\
        import glob
        import pandas as pd
        result = pd.concat([pd.read_csv(f, parse_dates=["day"]) for f in sorted(glob.glob("data/*.csv"))],
                           ignore_index=True)
        """
    _ported(source, tmp_path, monkeypatch, files)


FRAME = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "boat": ["Ålesund", "Kvarøy", None, "Kvarøy", "Ålesund", "Tind"],
    "kg": [1.5, np.nan, 4.0, 4.0, 0.5, 2.25],
    "month": [1, 2, 2, 3, 1, 3],
})
"""


@pytest.mark.parametrize("body", [
    'result = pd.concat([df[df["month"] == m] for m in [3, 1, 9]], ignore_index=True)',
    'result = pd.concat([df[df["kg"] > x].assign(cut=1) for x in [0.5, 2.0] if x > 0],\n'
    '                   ignore_index=True)',
])
def test_a_comprehension_of_frames_is_stacked_in_polars(body) -> None:
    result = differential(FRAME + body + "\n")
    assert "pl.concat(\n    [" in result.converted_text or "pl.concat([" in result.converted_text
    assert "TODO" not in result.converted_text


@pytest.mark.parametrize("body", [
    # the columns differ from one piece to the next: "kg" and "month" missing by turns, which
    # pandas makes float64 (month 1.0), where Polars would keep Int64
    'result = pd.concat([df[["boat", c]] for c in ["kg", "month"]], ignore_index=True)',
    # without ignore_index pandas keeps each piece's row labels
    'stacked = pd.concat([df[df["month"] == m] for m in [3, 1]])\nresult = stacked.index.tolist()',
])
def test_a_comprehension_porter_cannot_read_stays_pandas(body) -> None:
    result = differential(FRAME + body + "\n")
    assert "pl.concat(" not in result.converted_text


def test_a_frame_changed_before_it_is_appended_in_each_turn() -> None:
    # `part` is bound afresh in each turn and changed before the append: the list holds each
    # turn's frame as it was changed, never changed again
    result = differential(FRAME + 'parts = []\nfor m in [1, 3]:\n    part = df[df["month"] == m]\n'
                          '    part["turn"] = m\n    parts.append(part)\n'
                          'result = pd.concat(parts, ignore_index=True)\n')
    assert "pl.concat(parts" in result.converted_text and "TODO" not in result.converted_text


@pytest.mark.parametrize("body", [
    # changed in the turn before it is bound again: the change reaches the frame appended
    'parts = []\npart = df\nfor m in [1, 3]:\n    part["turn"] = m\n'
    '    part = df[df["month"] == m]\n    parts.append(part)\n'
    'result = pd.concat(parts, ignore_index=True)',
    # bound in the outer loop, changed and appended in the inner one: the list holds one
    # object twice, which the second turn changes again
    'parts = []\nfor m in [1, 3]:\n    part = df[df["month"] == m]\n    for t in ["a", "b"]:\n'
    '        part["turn"] = t\n        parts.append(part)\n'
    'result = pd.concat(parts, ignore_index=True)',
    # bound under a condition only: a turn without it changes the frame appended before
    'parts = []\npart = df[df["month"] == 2]\nfor m in [1, 3]:\n    if m > 2:\n'
    '        part = df[df["month"] == m]\n    part["turn"] = m\n    parts.append(part)\n'
    'result = pd.concat(parts, ignore_index=True)',
    # changed after the append: pandas' list holds that same object
    'parts = []\nfor m in [1, 3]:\n    part = df[df["month"] == m]\n    parts.append(part)\n'
    '    part["turn"] = m\nresult = pd.concat(parts, ignore_index=True)',
])
def test_a_frame_changed_where_the_list_sees_it_stays_pandas(body) -> None:
    result = differential(FRAME + body + "\n")
    assert "pl.concat(parts" not in result.converted_text


def test_the_corpus_example_verifies_same(tmp_path) -> None:
    # the kelp co-op's month files, board registers and price lists (corpus), run both ways by
    # porter verify in copies of the case folder: every output the same
    import shutil

    from porter.verify.api import verify
    case = Path(__file__).parent.parent / "corpus" / "kelp_harvest_month_files"
    folder = tmp_path / "case"
    shutil.copytree(case, folder)
    script = folder / "kelp_harvest_month_files.py"
    outcome = verify(script, None, folder)
    statuses = {o.name: o.comparison.status for o in outcome.outputs}
    assert outcome.verdict == "same", statuses
    assert {"by_boat.csv", "per_file.csv", "harvest_valued.csv"} <= set(statuses)
