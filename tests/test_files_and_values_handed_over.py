"""Reading and writing files, and values handed over: parquet files pandas wrote
with its nullable dtypes, files the script writes and reads back, and what Python code is given.

pandas is the reference: each check runs the script with pandas and its conversion with Polars
in folders holding the same files, and compares what they print and the files they write.
"""

from __future__ import annotations

import io
import os
import subprocess
import sys
import textwrap
from pathlib import Path

import pandas as pd
import pyarrow as pa
import pyarrow.parquet as pq
import pytest

from support import convert  # (imports porter whole first)
from porter.analysis.schema import FileSchema

PYTHON = sys.executable


def _run_both(folder: Path, source: str, files: dict[str, bytes],
              **options: object) -> tuple[str, Path, Path]:
    """Run `source` with pandas in folder/pd and its conversion in folder/pl (each holding
    `files`, converted with them as --data); the converted text and the two folders."""
    source = textwrap.dedent(source)
    data = folder / "data"
    data.mkdir()
    for name, content in files.items():
        (data / name).write_bytes(content)
    result = convert(source, data_dir=str(data), **options)
    text = result.converted_text
    out = []
    for side, script in (("pd", source), ("pl", text)):
        work = folder / side
        work.mkdir()
        for name, content in files.items():
            (work / name).write_bytes(content)
        (work / "s.py").write_text(script, encoding="utf-8")
        done = subprocess.run([PYTHON, "s.py"], cwd=work, capture_output=True, text=True,
                              timeout=120, env={**os.environ, "PYTHONHASHSEED": "0"})
        assert done.returncode == 0, f"{side} failed:\n{done.stderr}\n--- script ---\n{script}"
        (work / "stdout.txt").write_text(done.stdout, encoding="utf-8")
        out.append(work)
    return text, out[0], out[1]


def _same_outputs(pd_dir: Path, pl_dir: Path, text: str) -> None:
    """Every file pandas wrote (and what it printed) is written byte for byte by the conversion."""
    for path in sorted(pd_dir.iterdir()):
        if path.name == "s.py":
            continue
        other = pl_dir / path.name
        assert other.exists(), f"{path.name} not written\n--- converted ---\n{text}"
        assert path.read_bytes() == other.read_bytes(), (
            f"{path.name}: pandas {path.read_bytes()!r}\nconverted {other.read_bytes()!r}\n"
            f"--- converted ---\n{text}")


def _parquet(table: pa.Table | pd.DataFrame) -> bytes:
    sink = io.BytesIO()
    if isinstance(table, pd.DataFrame):
        table.to_parquet(sink, index=False)
    else:
        pq.write_table(table, sink)
    return sink.getvalue()


# -- read_parquet of a file pandas wrote with its nullable dtypes ---------------------------

# a seed bank's drawers: pandas' nullable Int64, boolean and string columns, each with a
# missing value, beside plain ones
DRAWERS = pd.DataFrame({
    "drawer": pd.array([4, None, 9], dtype="Int64"),
    "sealed": pd.array([True, None, False], dtype="boolean"),
    "label": pd.array(["vetch", None, "flax"], dtype="string"),
    "grams": [1.5, None, 2.0],
    "shelf": [1, 2, 3],
})
# the same values written by Arrow itself: no pandas metadata, so pandas reads numpy's types
# (float64 for the ints with a missing value, object for the True/False)
PLAIN = pa.table({"drawer": pa.array([4, None, 9], pa.int64()),
                  "sealed": pa.array([True, None, False]),
                  "label": pa.array(["vetch", None, "flax"]),
                  "grams": pa.array([1.5, None, 2.0]), "shelf": pa.array([1, 2, 3])})

READ_BACK = """
    import pandas as pd

    df = pd.read_parquet("drawers.parquet")
    print(df.dtypes)
    df["next"] = df["drawer"] + 1
    df.to_csv("drawers.csv", index=False)
"""

needs_metadata = pytest.mark.skipif(
    not hasattr(FileSchema, "pandas_nullable"),
    reason="the schema reader does not read pandas' parquet metadata yet (FileSchema.pandas_nullable)")


@needs_metadata
def test_parquet_pandas_wrote_keeps_its_nullable_dtypes(tmp_path: Path) -> None:
    # pandas 3.1: read_parquet restores Int64/boolean/string from the file's metadata, so the
    # Int64 column is written 4 and 5 beside a missing one (a plain int64 would be 4.0)
    text, pd_dir, pl_dir = _run_both(tmp_path, READ_BACK, {"drawers.parquet": _parquet(DRAWERS)})
    assert "4,True,vetch,1.5,1,5\n" in (pd_dir / "drawers.csv").read_text()
    _same_outputs(pd_dir, pl_dir, text)


def test_parquet_arrow_wrote_reads_numpy_types(tmp_path: Path) -> None:
    # no pandas metadata: pandas reads the ints with a missing value as float64 (4.0)
    text, pd_dir, pl_dir = _run_both(tmp_path, READ_BACK, {"drawers.parquet": _parquet(PLAIN)})
    assert "4.0,True,vetch,1.5,1,5.0\n" in (pd_dir / "drawers.csv").read_text()
    _same_outputs(pd_dir, pl_dir, text)


def test_parquet_metadata_not_read_lowers_the_read() -> None:
    # without the file's metadata porter cannot tell pandas' Int64 from a plain int64 column
    result = convert(textwrap.dedent(READ_BACK))
    site = next(s for s in result.sites if s.key == "pd.read_parquet")
    assert site.confidence <= 0.95 and "nullable dtypes" in site.message, site


# -- a CSV file the script writes and reads back ----------------------------------------------

# a ferry line's crossings: a code kept as text ("+3" is a number to pandas' reader), notes
# with no value at all, a berth key with a blank
CROSSINGS = (b"crossing,code,note,berth,minutes\n"
             b"f1,+3,,1,42.5\nf2,7,,,38.0\nf3,-2,,3,51.0\n")
BERTHS = b"berth,pier\n1,north\n3,south\n"


def test_text_written_and_read_back_is_read_as_pandas_reads_it(tmp_path: Path) -> None:
    # pandas 3.1 reads "+3" back as the number 3 (the code column is int64 then), where
    # Polars' scan infers text and its sum fails
    source = """
        import pandas as pd

        df = pd.read_csv("crossings.csv", dtype={"code": str})
        df["tag"] = df["crossing"] + "x"
        df.to_csv("mid.csv", index=False)
        back = pd.read_csv("mid.csv")
        print(back.dtypes)
        print(back["code"].sum())
        back.merge(pd.read_csv("berths.csv"), on="berth", how="left").to_csv("out.csv", index=False)
    """
    text, pd_dir, pl_dir = _run_both(tmp_path, source, {"crossings.csv": CROSSINGS,
                                                        "berths.csv": BERTHS})
    assert "\n8\n" in (pd_dir / "stdout.txt").read_text()  # 3 + 7 - 2
    _same_outputs(pd_dir, pl_dir, text)


def test_floats_written_and_read_back_keep_their_type(tmp_path: Path) -> None:
    # a float column with no value is written as empty fields; pandas reads it back as float64
    # (filled with 0 it adds as a number), Polars' scan would infer text ("0" + "1" is "01")
    source = """
        import numpy as np
        import pandas as pd

        df = pd.read_csv("crossings.csv", usecols=["note", "berth", "minutes"])
        df["wait"] = np.nan
        df.to_csv("mid.csv", index=False)
        back = pd.read_csv("mid.csv")
        print(back.dtypes)
        joined = back.merge(pd.read_csv("berths.csv"), on="berth", how="inner")
        joined["total"] = joined["wait"].fillna(0) + joined["note"].fillna(1)
        joined.to_csv("out.csv", index=False)
    """
    text, pd_dir, pl_dir = _run_both(tmp_path, source, {"crossings.csv": CROSSINGS,
                                                        "berths.csv": BERTHS})
    assert ",1.0\n" in (pd_dir / "out.csv").read_text()
    assert "TODO(porter): pd.read_csv" not in text  # ported: floats are certain
    _same_outputs(pd_dir, pl_dir, text)


# -- values handed to Python code: pandas only where a value is missing ----------------------

@pytest.mark.parametrize("cells", [
    ["3", "1", "2"], ["3", "", "2"], ["0.5", "2.25"], ["0.5", ""], ["ewe", "ram"], ["ewe", ""],
    ["True", "False"], ["9223372036854775807", "-9223372036854775808"],
], ids=repr)
def test_pandas_values_are_pandas_own(cells: list[str]) -> None:
    # what a loop over a column read from a file gives Python code: pandas 3.1's values (nan
    # for a missing one, floats for whole numbers beside one); where none is missing the
    # Polars Series gives the same Python objects, so pandas need not be imported for them
    import polars as pl
    from porter.translate.handover import VALUES_DEFINITION
    # (a second column: a one-column line with an empty field is a blank line pandas skips)
    text = "\n".join(["pen,flock", *(f"{i},{c}" for i, c in enumerate(cells))]) + "\n"
    expected = list(pd.read_csv(io.StringIO(text))["flock"])
    space: dict[str, object] = {}
    exec(VALUES_DEFINITION, space)
    column = pl.read_csv(io.StringIO(text), null_values=[""])["flock"]
    got = list(space["pandas_values"](column))  # type: ignore[operator]
    assert [(type(v), repr(v)) for v in got] == [(type(v), repr(v)) for v in expected]
    assert ("pandas" in type(space["pandas_values"](column)).__module__) == ("" in cells)  # type: ignore[operator]


# a seed bank's packets: text, whole numbers and floats, with or without a missing value
PACKETS_FULL = b"packet,seeds,grams\nvetch,30,1.5\nflax,12,0.25\nrye,7,2.0\n"
PACKETS_GAPS = b"packet,seeds,grams\nvetch,30,1.5\n,,\nrye,7,2.0\n"

VALUES_SCRIPT = """
    import sys
    import pandas as pd

    df = pd.read_csv("packets.csv")
    total = 0
    for n in df["seeds"]:
        total = total + n if n == n else total
    print(repr(total))
    for g in df["grams"]:
        print(repr(g), type(g).__name__)
    labels = []
    for p in df["packet"]:
        labels.append(p.upper() if isinstance(p, str) else p)
    print(labels, df["packet"].tolist(), repr(df["packet"].to_numpy()))
    print(repr(df["packet"].iloc[1]), repr(df["packet"].iloc[-1]))
    with open("pandas_imported.txt", "w") as out:
        out.write(str("pandas" in sys.modules))
"""


@pytest.mark.parametrize("data", [PACKETS_FULL, PACKETS_GAPS], ids=["full", "gaps"])
def test_values_handed_to_python_are_pandas_own(tmp_path: Path, data: bytes) -> None:
    # pandas 3.1: nan for a missing value (floats for the whole numbers beside one); the
    # conversion prints the same, and imports pandas only where a value is missing
    text, pd_dir, pl_dir = _run_both(tmp_path, VALUES_SCRIPT, {"packets.csv": data})
    (pd_dir / "pandas_imported.txt").unlink()
    imported = (pl_dir / "pandas_imported.txt").read_text()
    (pl_dir / "pandas_imported.txt").unlink()
    _same_outputs(pd_dir, pl_dir, text)
    assert imported == str(data == PACKETS_GAPS), text


@pytest.mark.parametrize("data", [PACKETS_FULL, PACKETS_GAPS], ids=["full", "gaps"])
def test_text_values_are_pandas_string_array(tmp_path: Path, data: bytes) -> None:
    # pandas 3.1: a text column's .values is its ArrowStringArray (to_numpy() a numpy array)
    source = """
        import pandas as pd

        df = pd.read_csv("packets.csv")
        print(repr(df["packet"].values))
        print(repr(df["packet"].to_numpy()))
    """
    text, pd_dir, pl_dir = _run_both(tmp_path, source, {"packets.csv": data})
    assert "ArrowStringArray" in (pd_dir / "stdout.txt").read_text()
    _same_outputs(pd_dir, pl_dir, text)


# -- whole numbers past Int64 computed by pandas ---------------------------------------------

SEEDS = b"lot,grams,kind\na,3,bean\nb,5,pea\nc,7,bean\n"


@pytest.mark.parametrize("line", [
    'df["huge"] = df["grams"].map(weight)',
    'df["huge"] = df["grams"].apply(lambda g: math.factorial(g * 4))',
    'df["huge"] = df["grams"].map({3: 2**70, 5: 1, 7: 2})',
    'df["huge"] = [math.factorial(g * 4) for g in df["grams"]]',
])
def test_python_ints_past_int64_stay_pandas(tmp_path: Path, line: str) -> None:
    # pandas 3.1 keeps 10 ** 21 or 28! exactly in an object column; no Polars type holds them
    # (pl.Series and pl.from_pandas raise OverflowError), so the frame stays pandas
    source = f"""
        import math
        import pandas as pd

        def weight(g):
            return 10 ** (g * 3)

        df = pd.read_csv("seeds.csv")
        {line}
        df[df["kind"] == "bean"].to_csv("out.csv", index=False)
    """
    text, pd_dir, pl_dir = _run_both(tmp_path, source, {"seeds.csv": SEEDS})
    assert max(int(row.split(",")[-1]) for row in
               (pd_dir / "out.csv").read_text().splitlines()[1:]) > 2**63
    _same_outputs(pd_dir, pl_dir, text)
