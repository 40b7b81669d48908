"""Code porter keeps on pandas (a TODO's hand-over, a loop it does not port) runs under pandas
3.1, so a method pandas 2 or 3 removed is written as pandas 3.1 spells it there: append ->
pd.concat, iteritems -> items, applymap -> map, fillna(method=) -> ffill / bfill, lookup -> the
values read pair by pair. Each snippet runs as written under pandas 1.5.3 (a Python built once
from the package index) and as converted under pandas 3.1 and Polars, through `porter verify
--reference-python`; skipped with the reason where pandas 1.5.3 cannot be had here.
"""

from __future__ import annotations

import json
import re
from pathlib import Path
import textwrap

import pytest

from porter.api import convert_source
from porter.model import Options
from porter.rules.legacy import modern_call
from porter.verify.api import VerifyOptions, verify
from test_legacy_spellings_under_pandas_1_5 import pandas_1_5  # noqa: F401

# a cider press's pressings: a missing press (the same as above), a missing juice reading,
# accents, a duplicated line, apples of 0 kg
PRESSINGS = """pressing,press,orchard,apples_kg,juice_l
P1,rack,Les Pommiers,120,80.5
P2,,Hôtel-Dieu,60,
P3,screw,Cœur de Lion,0,2.5
P4,rack,brook farm,200,131.0
P4,rack,brook farm,200,131.0
P5,,Les Pommiers,45,30.0
P6,belt,Mill Lane,85,
"""


def same_with_kept_code(python: str, tmp_path: Path, source: str, with_data: bool = False) -> str:
    """Run `source` under pandas 1.5.3 and its conversion (TODOs allowed: code kept on pandas)
    under pandas 3.1; the outputs must be the same. Returns the converted text."""
    (tmp_path / "data").mkdir()
    (tmp_path / "data" / "pressings.csv").write_text(PRESSINGS, encoding="utf-8")
    script = tmp_path / "old.py"
    script.write_text(textwrap.dedent(source), encoding="utf-8")
    converted = convert_source(script.read_text(encoding="utf-8"), path=str(script),
                               options=Options(data_dir=str(tmp_path) if with_data else None))
    result = verify(script, converted.converted_text, tmp_path,
                    VerifyOptions(reference_python=python))
    assert "pandas 1.5.3" in (result.original.environment or "")
    assert result.verdict == "same", (converted.converted_text[-2500:]
                                      + json.dumps(result.to_json(), indent=1, default=str)[:3000])
    return converted.converted_text


@pytest.mark.parametrize("row", [
    '{"press": press, "pressings": len(rows), "kg": rows["apples_kg"].sum()}',
    # all numbers: pandas 1.5 made the row a float Series, so every column is float
    '{"pressings": len(rows), "kg": rows["apples_kg"].sum()}',
    '{"press": press, "juice": rows["juice_l"].sum(), "first": rows["orchard"].iloc[0]}',
])
def test_a_row_appended_per_group_in_a_loop(pandas_1_5, tmp_path, row):
    text = same_with_kept_code(pandas_1_5, tmp_path, f"""
        import pandas as pd
        log = pd.read_csv("data/pressings.csv")
        out = pd.DataFrame()
        for press, rows in log.groupby("press"):
            out = out.append({row}, ignore_index=True)
        out.to_csv("data/out.csv", index=False)
    """)
    # ported to one group_by where porter reads every value, else kept with pandas_append
    assert "out.append(" not in text
    assert re.search(r"pandas_append\(\s*out,", text) or "group_by(" in text


def test_frames_and_series_appended_in_kept_code(pandas_1_5, tmp_path):
    text = same_with_kept_code(pandas_1_5, tmp_path, """
        import pandas as pd
        log = pd.read_csv("data/pressings.csv")
        out = pd.DataFrame()
        kg = pd.Series(dtype=float)
        for press, rows in log.groupby("press"):
            out = out.append(rows.head(1))
            kg = kg.append(rows["apples_kg"])
        out.to_csv("data/out.csv")
        kg.to_csv("data/kg.csv")
    """)
    assert "out.append(" not in text and "kg.append(" not in text


@pytest.mark.parametrize("with_data", [True, False])
def test_removed_methods_after_a_hand_over(pandas_1_5, tmp_path, with_data):
    # without --data the frame is handed to pandas at the first label read (lookup), and what
    # follows stays pandas code: iteritems, fillna(method=), lookup, applymap
    text = same_with_kept_code(pandas_1_5, tmp_path, """
        import pandas as pd
        log = pd.read_csv("data/pressings.csv")
        log.drop_duplicates(inplace=True)
        log.sort_values(["orchard", "pressing"], inplace=True)
        gaps = {}
        for name, values in log.iteritems():
            gaps[name] = int(values.isna().sum())
        print(gaps)
        log["press"] = log["press"].fillna(method="ffill")
        log["juice_l"] = log["juice_l"].fillna(method="bfill", limit=1)
        log = log.reset_index(drop=True)
        log["which"] = "apples_kg"
        log["picked"] = log.lookup(log.index, log["which"])
        log[["orchard"]] = log[["orchard"]].applymap(lambda s: s.title())
        log.to_csv("data/out.csv", index=False)
    """, with_data=with_data)
    for removed in (".iteritems(", "method=", ".lookup(", ".applymap("):
        assert removed not in text.split("PANDAS_CSV_INTS =")[-1], removed


def test_todays_spelling_of_each_removed_call():
    assert modern_call("df", "append", [(None, "{'a': 1}"), ("ignore_index", "True")]) == \
        "pandas_append(df, {'a': 1}, ignore_index=True)"
    assert modern_call("s", "fillna", [("method", '"pad"'), ("limit", "2")]) == \
        "s.ffill(limit=2)"
    assert modern_call("s", "fillna", [("method", '"backfill"')]) == "s.bfill()"
    # a value and a method: pandas raised; kept as written
    assert modern_call("s", "fillna", [(None, "0"), ("method", '"pad"')]) is None
    assert modern_call("df", "iteritems", []) == "df.items()"
    assert modern_call("df", "applymap", [(None, "f")]) == "df.map(f)"
    assert modern_call("df", "sum", []) is None


def test_the_append_helper_does_what_pandas_1_5_did(pandas_1_5, tmp_path):
    # each case printed by pandas 1.5's own append and by the helper under pandas 3.1
    cases = [
        "pd.DataFrame().append({'a': 1, 'b': 2.5}, ignore_index=True)",
        "pd.DataFrame({'a': [1]}).append({'b': 'é', 'a': 2.5}, ignore_index=True)",
        # (a row whose value is None in an int column: pandas 1.5's concat keeps the object
        # None, pandas 3.1's makes NaN: both write an empty field to CSV; not compared here)
        "pd.DataFrame({'a': [1]}).append(pd.Series({'a': 3}, name='x'))",
        "pd.DataFrame({'a': [1]}).append([{'a': 2}, {'c': 3}], ignore_index=True)",
        "pd.DataFrame({'a': [1]}).append([pd.DataFrame({'a': [2]}), pd.DataFrame({'b': [3]})])",
        "pd.DataFrame({'a': [1]}, index=[5]).append(pd.DataFrame({'a': [2]}), sort=True)",
        "pd.Series([1, 2]).append(pd.Series([3.5]), ignore_index=True)",
        "pd.Series([1]).append([pd.Series([2]), pd.Series(['x'])])",
    ]
    from porter.rules.legacy import APPEND_DEFINITION
    old = "import pandas as pd\n" + "".join(
        f"print(repr({case}.astype(object).to_dict()))\n" for case in cases)
    new = "import pandas as pd\n" + APPEND_DEFINITION + "".join(
        f"print(repr({modern_call(case.split('.append(')[0], 'append', _args(case))}"
        ".astype(object).to_dict()))\n" for case in cases)
    import subprocess
    import sys
    (tmp_path / "old.py").write_text(old, encoding="utf-8")
    (tmp_path / "new.py").write_text(new, encoding="utf-8")
    expected = subprocess.run([pandas_1_5, str(tmp_path / "old.py")], capture_output=True,
                              text=True, check=True).stdout
    actual = subprocess.run([sys.executable, str(tmp_path / "new.py")], capture_output=True,
                            text=True, check=True).stdout
    assert actual.replace("np.float64(", "").replace("np.int64(", "") == \
        expected.replace("np.float64(", "").replace("np.int64(", ""), new


def _args(case: str) -> list[tuple[str | None, str]]:
    """The arguments of the append call written at the end of `case`."""
    import ast
    call = ast.parse(case, mode="eval").body
    assert isinstance(call, ast.Call)
    return [(None, ast.unparse(a)) for a in call.args] + \
        [(k.arg, ast.unparse(k.value)) for k in call.keywords]


@pytest.mark.parametrize("function", ['g.tail(1)', 'g.nlargest(1, "apples_kg")',
                                      'g["apples_kg"].sum() + len(g)'])
def test_a_groupby_apply_kept_on_pandas_passes_the_keys(pandas_1_5, tmp_path, function):
    # blind, the frame is handed to pandas (its labels are read): the kept apply is given the
    # key columns as pandas 1.5 gave them (pandas 3.1 leaves them out)
    text = same_with_kept_code(pandas_1_5, tmp_path, f"""
        import pandas as pd
        log = pd.read_csv("data/pressings.csv")
        log.drop_duplicates(inplace=True)
        log["press"] = log["press"].fillna(method="ffill")
        log["first"] = log.lookup(log.index, ["orchard"] * len(log))
        out = log.groupby("press").apply(lambda g: {function})
        out = out.reset_index(drop=True) if isinstance(out, pd.DataFrame) else out.reset_index()
        out.to_csv("data/out.csv", index=False)
    """)
    assert "[list(log.columns)]" in text


def test_a_chain_kept_on_pandas_renames_old_frequencies(pandas_1_5, tmp_path):
    text = same_with_kept_code(pandas_1_5, tmp_path, """
        import pandas as pd
        log = pd.read_csv("data/pressings.csv")
        log.drop_duplicates(inplace=True)
        log["day"] = pd.to_datetime("2021-09-" + (log.index + 10).astype(str))
        log["first"] = log.lookup(log.index, ["orchard"] * len(log))
        weekly = log.groupby(pd.Grouper(key="day", freq="W"))["apples_kg"].sum().reset_index()
        weekly.to_csv("data/weekly.csv", index=False)
        monthly = log.set_index("day").resample("BM")["apples_kg"].sum().reset_index()
        monthly.to_csv("data/monthly.csv", index=False)
    """)
    assert '"BME"' in text


def test_a_script_of_todays_pandas_keeps_its_apply():
    result = convert_source("""import pandas as pd
log = pd.read_csv("data/pressings.csv")
log["first"] = log.loc[log.index, "orchard"]
out = log.groupby("press").apply(lambda g: g.tail(1))
out.to_csv("out.csv")
""")
    assert "list(log.columns)" not in result.converted_text


def test_a_list_made_by_pandas_still_appends():
    # a list from pandas code kept as written is no frame: its own append runs
    import subprocess
    import sys
    from porter.rules.legacy import APPEND_DEFINITION
    code = APPEND_DEFINITION + (
        "import pandas as pd\nvalues = pd.Series([1, 2]).tolist()\n"
        "print(pandas_append(values, 3), values)\n"
        "print(list(pandas_append(pd.Index(['a']), pd.Index(['b']))))\n")
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True)
    assert out.stdout == "None [1, 2, 3]\n['a', 'b']\n"
