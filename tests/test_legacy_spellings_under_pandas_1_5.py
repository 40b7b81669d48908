"""Older pandas spellings the corpus cases of pandas 1.x notebooks use, checked against the
pandas they were written for: each snippet runs as written under pandas 1.5.3 (a Python built
once from the package index, porter.verify.declared) and as converted under Polars, through
`porter verify --reference-python`; the conversion has no TODO. Where pandas 1.5.3 cannot be
had here (no network) the tests are skipped with the reason.
"""

from __future__ import annotations

import json
from pathlib import Path
import textwrap

import pytest

from porter.api import convert_source
from porter.model import Options
from porter.verify.api import VerifyOptions, verify
from porter.verify.declared import ReferenceUnavailable, python_with

OLD = ("pandas==1.5.3", "numpy<2")

# a seed bank's packets: a missing grams value at the start, middle and end of an accession,
# an accession with none, accented species, a duplicated line
PACKETS = """accession,species,grams,seeds,drawer
SB-1,Anémone,,40,a1
SB-1,Anémone,2.5,40,a1
SB-2,primula,1.25,0,b2
SB-1,Anémone,,120,a1
SB-3,Silene ,,800,
SB-2,primula,,250,b2
SB-2,primula,0.75,250,b2
SB-3,Silene ,,800,
SB-1,anémone,3.0,60,A1
"""


@pytest.fixture(scope="module")
def pandas_1_5() -> str:
    try:
        return python_with(*OLD)
    except ReferenceUnavailable as exc:
        pytest.skip(str(exc))


def same_under_old_pandas(python: str, tmp_path: Path, source: str,
                          files: dict[str, str] | None = None, with_data: bool = True) -> None:
    (tmp_path / "data").mkdir()
    for name, text in (files or {"packets.csv": PACKETS}).items():
        (tmp_path / "data" / name).write_text(text, encoding="utf-8")
    script = tmp_path / "old.py"
    script.write_text(textwrap.dedent(source), encoding="utf-8")
    converted = convert_source(script.read_text(encoding="utf-8"), path=str(script),
                               options=Options(data_dir=str(tmp_path) if with_data else None))
    todos = [s.key for s in converted.sites if s.status == "todo"]
    assert not todos, f"TODOs {todos}\n{converted.converted_text}"
    result = verify(script, converted.converted_text, tmp_path,
                    VerifyOptions(reference_python=python))
    assert "pandas 1.5.3" in (result.original.environment or "")
    assert result.verdict == "same", json.dumps(result.to_json(), indent=1, default=str)[:3000]
    assert any(o.kind == "file" for o in result.outputs)


@pytest.mark.parametrize("call", ["backfill()", "pad()", "backfill(limit=1)"])
def test_a_groupbys_pad_and_backfill(pandas_1_5, tmp_path, call):
    # GroupBy.pad / backfill: ffill / bfill under the names pandas 2 removed
    same_under_old_pandas(pandas_1_5, tmp_path, f"""
        import pandas as pd
        df = pd.read_csv("data/packets.csv")
        df["grams"] = df.groupby("accession")["grams"].{call}
        df.to_csv("data/out.csv", index=False)
    """)


@pytest.mark.parametrize("with_data", [True, False])
def test_applymap_written_back_into_several_columns(pandas_1_5, tmp_path, with_data):
    # df[[a, b]] = df[[a, b]].applymap(f): the mapped frame's columns by position (without
    # --data the frame's own columns are not known: written in place all the same)
    same_under_old_pandas(pandas_1_5, tmp_path, """
        import pandas as pd
        df = pd.read_csv("data/packets.csv")
        df = df.sort_values(["seeds", "accession"])
        df[["species", "accession"]] = df[["species", "accession"]].applymap(lambda s: s.strip().title())
        df[["low", "high"]] = df[["seeds", "grams"]].applymap(lambda x: x * 2)
        df.to_csv("data/out.csv", index=False)
    """, with_data=with_data)


def test_frames_left_by_pandas_1_5_are_compared(pandas_1_5, tmp_path):
    # a frame filtered by the old pandas carries an Int64Index, whose class pandas 2 removed:
    # the verifier reads it back through pandas' own reader, and compares it
    files = {"packets.csv": PACKETS}
    (tmp_path / "data").mkdir()
    (tmp_path / "data" / "packets.csv").write_text(PACKETS, encoding="utf-8")
    script = tmp_path / "old.py"
    script.write_text(textwrap.dedent("""
        import pandas as pd
        df = pd.read_csv("data/packets.csv")
        heavy = df[df["seeds"] > 100]
        heavy.to_csv("data/heavy.csv", index=False)
    """), encoding="utf-8")
    del files
    result = verify(script, None, tmp_path, VerifyOptions(reference_python=pandas_1_5))
    statuses = {o.name: o.comparison.status for o in result.outputs}
    assert statuses.get("heavy") == "same", json.dumps(result.to_json(), indent=1, default=str)[:3000]
    assert result.verdict == "same", statuses


# a ferry's loads: the rate of each deck in a column of its own, a text column beside them,
# duplicated loads, a missing weight
LOADS = """load,deck,consignee,main,upper,open,weight_t
L1,main,Brae Stores,4.5,6.0,3.5,12.5
L2,open,Højland,4.5,6.25,3.0,
L2,open,Højland,4.5,6.25,3.0,
L3,upper,Île Verte,5.0,6.25,3.5,0.0
L4,main,mòr,5.5,6.0,3.0,30.25
"""


@pytest.mark.parametrize("before", ["pass", "df = df.drop_duplicates().reset_index(drop=True)"])
def test_lookup_of_each_rows_own_column(pandas_1_5, tmp_path, before):
    # DataFrame.lookup (removed in pandas 2): the value of the column each row's label names
    same_under_old_pandas(pandas_1_5, tmp_path, f"""
        import pandas as pd
        df = pd.read_csv("data/loads.csv")
        {before}
        df["rate"] = df.lookup(df.index, df["deck"])
        df["charge"] = (df["rate"] * df["weight_t"]).round(2)
        df.to_csv("data/out.csv", index=False)
    """, {"loads.csv": LOADS})


@pytest.mark.parametrize("method", ["iteritems", "items"])
def test_a_loop_over_columns_filling_a_dict(pandas_1_5, tmp_path, method):
    # for name, values in df.iteritems(): a dict of the script's own filled per column stays a
    # loop over the column names (it was handed to pandas, where iteritems no longer runs)
    same_under_old_pandas(pandas_1_5, tmp_path, f"""
        import pandas as pd
        df = pd.read_csv("data/loads.csv")
        gaps = {{}}
        for name, values in df.{method}():
            gaps[name] = int(values.isna().sum())
        pd.DataFrame({{"column": list(gaps), "missing": list(gaps.values())}}).to_csv("data/gaps.csv", index=False)
    """, {"loads.csv": LOADS})


SAILINGS = """sailed,fee,tonnes
2023-04-28,45,1.5
2023-04-29,60,
2023-03-31,80,2.25
2023-06-30,,3.0
2023-07-01,120,0.0
2023-09-30,150,4.5
2023-12-30,210,1.25
"""


@pytest.mark.parametrize("rule", ["BM", "M", "A"])
def test_old_month_end_aliases_in_resample(pandas_1_5, tmp_path, rule):
    # "BM" (each month's last weekday: a Saturday the 29th falls in the next month's bin), "M"
    # and "A", which pandas 3 spells BME, ME and YE
    same_under_old_pandas(pandas_1_5, tmp_path, f"""
        import pandas as pd
        df = pd.read_csv("data/sailings.csv", parse_dates=["sailed"])
        out = df.set_index("sailed").resample("{rule}")[["fee", "tonnes"]].sum().reset_index()
        out.to_csv("data/out.csv", index=False)
    """, {"sailings.csv": SAILINGS})
