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


# a lime kiln's readings: the day written day-first and the clock time apart, a line with a
# note in an extra field (twice: pandas 1.x's error_bad_lines=False leaves such lines out), a
# short line (its last fields missing), a blank line, 'N/A' fuel, accented burners
READINGS = """reading,kiln,date,clock,temp_c,fuel_kg,burner
R1,Ruadh,02/04/2015,06:00,275.5,12.5,Séamus
R2,Ruadh,02/04/2015,08:00,,N/A,
R3,Nord,13/04/2015,23:00,650.5,10,,draw-hole blocked
R4,Nord,13/04/2015,10:45,426.5,20

R5,,14/04/2015,12:00,1180.0,0,Ishbel
R6,Nord,14/04/2015,14:30,980.25,40,Anwen,,
R7,Ruadh,01/05/2015,06:00,0.0,25.5,Jòsaidh
"""

PARSERS = {
    "lambda": 'dateparse = lambda x: pd.datetime.strptime(x, "%d/%m/%Y %H:%M")',
    "to_datetime": 'dateparse = lambda text: pd.to_datetime(text, format="%d/%m/%Y %H:%M")',
}


@pytest.mark.parametrize("bad_lines", ["error_bad_lines=False, warn_bad_lines=False",
                                       "error_bad_lines=False"])
@pytest.mark.parametrize("parser", sorted(PARSERS))
def test_bad_lines_left_out_and_a_date_parser_named_once(pandas_1_5, tmp_path, bad_lines, parser):
    # error_bad_lines=False (on_bad_lines="skip" / "warn" since): a line with more fields than
    # the header is left out, a short one read with its missing fields; the date parser a name
    # bound once to a function (a lambda, a def returning one call) of the joined day and time
    source = "import pandas as pd\n" + PARSERS[parser] + f"""
df = pd.read_csv("data/readings.csv", parse_dates=[["date", "clock"]], date_parser=dateparse,
                 na_values=["N/A"], {bad_lines})
df["burner"] = df["burner"].fillna(method="pad")
df.to_csv("data/out.csv", index=False)
"""
    same_under_old_pandas(pandas_1_5, tmp_path, source, {"readings.csv": READINGS})


@pytest.mark.parametrize("text", [
    READINGS.replace("draw-hole blocked", '"draw-hole, blocked"'),  # a quote: a field may hold a comma
    READINGS.replace("R1,Ruadh,02/04/2015,06:00,275.5,12.5,Séamus", "R1,Ruadh,02/04/2015,06:00,275.5,12.5,Séamus,x"),
])
def test_bad_lines_the_split_cannot_read_stay_a_todo(tmp_path, text):
    # a quoted field (the split at commas would cut it) or a first data line longer than the
    # header (pandas makes its first field the row label): the read is a TODO that says so
    (tmp_path / "data").mkdir()
    (tmp_path / "data" / "readings.csv").write_text(text, encoding="utf-8")
    source = 'import pandas as pd\ndf = pd.read_csv("data/readings.csv", error_bad_lines=False)\n' \
             'df.to_csv("data/out.csv", index=False)\n'
    converted = convert_source(source, path="old.py", options=Options(data_dir=str(tmp_path)))
    todos = [s for s in converted.sites if s.status == "todo"]
    assert [s.key for s in todos] == ["pd.read_csv"], converted.converted_text
    assert "no quotes" in todos[0].message and "pandas leaves out a row" in todos[0].message


def test_bad_lines_without_data_stay_a_todo():
    source = 'import pandas as pd\ndf = pd.read_csv("data/readings.csv", error_bad_lines=False)\n'
    converted = convert_source(source, path="old.py", options=Options())
    assert [s.key for s in converted.sites if s.status == "todo"] == ["pd.read_csv"]


# a bothy's visitor book: a missing bothy, a party size missing, ties for the largest party
VISITS = """entry,bothy,party,nights,town
V1,Coire Dubh,4,2,Zürich
V2,Lòn Mòr,6,1,
V3,,6,3,Kraków
V4,Coire Dubh,6,1,Besançon
V5,Lòn Mòr,,2,Glasgow
V6,Black Sike,2,2,Ålesund
V7,Coire Dubh,6,,Glasgow
V8,Lòn Mòr,6,2,Zürich
"""


@pytest.mark.parametrize("body", [
    'g[g["party"] == g["party"].max()]',         # some rows of each group: key order
    'g[g["party"] >= g["party"].min()]',         # every row but a missing party's
    'g[g["nights"] > 0]',                        # a missing night keeps no row
    'g[g["party"] > 0]',                         # the missing party's group keeps fewer rows
    'g[g["party"] == g["party"]]',               # NaN == NaN is False
])
@pytest.mark.parametrize("sort", ["", 'df = df.sort_values("town")'])
def test_rows_of_each_group_chosen_by_a_mask(pandas_1_5, tmp_path, body, sort):
    # groupby(k).apply(lambda g: g[mask]) under pandas 1.x: the key columns kept in the rows;
    # the frame's order where every group keeps all its rows, else the groups in key order
    same_under_old_pandas(pandas_1_5, tmp_path, f"""
        import pandas as pd
        df = pd.read_csv("data/visits.csv")
        {sort}
        out = df.groupby("bothy").apply(lambda g: {body}).reset_index(drop=True)
        out.to_csv("data/out.csv", index=False)
        blank = pd.np.nan  # (a pandas 1.x script)
    """, {"visits.csv": VISITS})


def test_rows_chosen_by_a_mask_every_row_kept(pandas_1_5, tmp_path):
    # every group keeps all its rows: pandas 1.x gave the frame's order (a missing key's rows
    # left out), not the groups one after another
    same_under_old_pandas(pandas_1_5, tmp_path, """
        import pandas as pd
        df = pd.read_csv("data/visits.csv")
        out = df.groupby("bothy").apply(lambda g: g[g["entry"] != "none"]).reset_index(drop=True)
        out.to_csv("data/out.csv", index=False)
        blank = pd.np.nan  # (a pandas 1.x script)
    """, {"visits.csv": VISITS})


WHEN = """stay,hut,at
S1,Nord,2015-04-02 06:00
S2,Nord,2015-04-02 18:30
S3,Süd,2015-04-03 07:00
S4,Nord,
S5,,2015-04-04 09:00
S6,Süd,2015-04-05 23:59
S7,Süd,2015-04-05 00:00
"""


@pytest.mark.parametrize("key", ['["hut"]', '"hut"'])
def test_days_counted_per_group_in_a_loop_appending_rows(pandas_1_5, tmp_path, key):
    # for k, rows in df.groupby(["hut"]): k is the key itself under pandas 1.x (a tuple of one
    # under pandas 2 and 3); rows["at"].dt.date.nunique() counts the days, a missing time none
    same_under_old_pandas(pandas_1_5, tmp_path, f"""
        import pandas as pd
        df = pd.read_csv("data/when.csv", parse_dates=["at"])
        out = pd.DataFrame()
        for k, rows in df.groupby({key}):
            out = out.append({{"hut": k, "stays": len(rows), "days": rows["at"].dt.date.nunique()}},
                             ignore_index=True)
        out.to_csv("data/out.csv", index=False)
    """, {"when.csv": WHEN})


def test_bad_lines_beside_a_whitespace_separator_stay_a_todo(tmp_path):
    (tmp_path / "data").mkdir()
    (tmp_path / "data" / "t.txt").write_text("a b\n1 2\n3 4 5\n", encoding="utf-8")
    source = 'import pandas as pd\ndf = pd.read_csv("data/t.txt", sep=r"\\s+", error_bad_lines=False)\n'
    converted = convert_source(source, path="old.py", options=Options(data_dir=str(tmp_path)))
    assert [s.key for s in converted.sites if s.status == "todo"] == ["pd.read_csv"]


@pytest.mark.parametrize("loop", [
    'for k, rows in df.groupby(["hut"]):\n    seen[k] = len(rows)',
    'for k, at in df.groupby(by=["hut"], sort=False)["at"]:\n    seen[k] = at.count()',
])
def test_a_loop_over_a_groupby_on_one_listed_key_kept_on_pandas(pandas_1_5, tmp_path, loop):
    # a loop porter keeps on pandas (a TODO) runs under pandas 3.1, where a list of one key
    # gives tuples: in a pandas 1.x script the groupby is on the key itself, whose groups'
    # keys are the values pandas 1.x gave
    (tmp_path / "data").mkdir()
    (tmp_path / "data" / "when.csv").write_text(WHEN, encoding="utf-8")
    script = tmp_path / "old.py"
    script.write_text("import pandas as pd\n"
                      'df = pd.read_csv("data/when.csv")\n'
                      "df = df.sort_values(\"stay\", ascending=False)\n"
                      "seen = {}\n" + loop + "\n"
                      'pd.DataFrame({"hut": list(seen), "n": list(seen.values())})'
                      '.to_csv("data/out.csv", index=False)\n'
                      "blank = pd.np.nan\n", encoding="utf-8")
    converted = convert_source(script.read_text(encoding="utf-8"), path=str(script),
                               options=Options(data_dir=str(tmp_path)))
    assert "groupby([" not in converted.converted_text, converted.converted_text
    result = verify(script, converted.converted_text, tmp_path,
                    VerifyOptions(reference_python=pandas_1_5))
    assert result.verdict == "same", json.dumps(result.to_json(), indent=1, default=str)[:3000]


@pytest.mark.parametrize("read", [
    'pd.read_csv("data/readings.csv", parse_dates=[["date", "clock"]], date_parser=dateparse, '
    'na_values=["N/A"], error_bad_lines=False, warn_bad_lines=False)',
    'pd.read_csv("data/readings.csv", parse_dates={"at": ["date", "clock"]}, '
    'date_parser=lambda d, t: pd.to_datetime(d + " " + t, format="%d/%m/%Y %H:%M"), '
    'error_bad_lines=False, warn_bad_lines=False, keep_date_col=True)',
    'pd.read_csv("data/readings.csv", usecols=["reading", "date"], parse_dates=["date"], '
    'date_parser=dateparse_day, error_bad_lines=False, warn_bad_lines=False)',
    'pd.read_csv("data/one.csv", squeeze=True).to_frame("kiln")',
    'pd.read_csv("data/readings.csv", squeeze=True, error_bad_lines=False, warn_bad_lines=False)',
])
def test_a_read_kept_on_pandas_reads_the_removed_options_as_pandas_1_5(pandas_1_5, tmp_path, read):
    # without --data these reads stay pandas' (a TODO): the kept call runs under pandas 3.1,
    # which has none of squeeze=, error_bad_lines=, date_parser=, parse_dates joining columns,
    # keep_date_col= nor pd.datetime: pandas_read_csv reads them as pandas 1.5 did
    (tmp_path / "data").mkdir()
    (tmp_path / "data" / "readings.csv").write_text(READINGS, encoding="utf-8")
    (tmp_path / "data" / "one.csv").write_text("kiln\nRuadh\nNord\n\nÒrd\n", encoding="utf-8")
    script = tmp_path / "old.py"
    script.write_text("import pandas as pd\n"
                      'dateparse = lambda x: pd.datetime.strptime(x, "%d/%m/%Y %H:%M")\n'
                      'dateparse_day = lambda x: pd.to_datetime(x, format="%d/%m/%Y")\n'
                      f"df = {read}\n"
                      'df.to_csv("data/out.csv", index=False)\n', encoding="utf-8")
    converted = convert_source(script.read_text(encoding="utf-8"), path=str(script), options=Options())
    assert "pandas_read_csv(" in converted.converted_text, converted.converted_text
    result = verify(script, converted.converted_text, tmp_path,
                    VerifyOptions(reference_python=pandas_1_5))
    assert result.verdict == "same", json.dumps(result.to_json(), indent=1, default=str)[:3000]
