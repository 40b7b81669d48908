"""`acc = pd.DataFrame()` then `for key, rows in df.groupby(k): acc = acc.append({...},
ignore_index=True)` in a pandas 1.x script: one group_by().agg() in Polars, with the rows, the
column order and the types pandas 1.5's append gave. Run as written under pandas 1.5.3 (a
Python built once from the package index) and as converted under Polars through `porter verify
--reference-python`; skipped with the reason where pandas 1.5.3 cannot be had here.
"""

from __future__ import annotations

import pytest

from porter.api import convert_source
from test_kept_pandas_code_in_todays_spelling import same_with_kept_code
from test_legacy_spellings_under_pandas_1_5 import pandas_1_5, same_under_old_pandas  # noqa: F401

# a cider press's pressings: a missing press, missing juice, a press with no juice read at
# all, accents in the keys, a duplicated line, a batch number (whole numbers) per pressing
PRESSINGS = """pressing,press,batch,orchard,apples_kg,juice_l
P1,rack,3,Les Pommiers,120,80.5
P2,,3,Hôtel-Dieu,60,
P3,écrou,1,Cœur de Lion,0,2.5
P4,rack,2,brook farm,200,131.25
P4,rack,2,brook farm,200,131.25
P5,belt,1,Les Pommiers,45,
P6,belt,1,Mill Lane,85,
P7,Écrou,2,Mill Lane,35,20.0
"""


def appended(row: str, by: str = '"press"', target: str = "press") -> str:
    return f"""
        import pandas as pd
        log = pd.read_csv("data/pressings.csv")
        out = pd.DataFrame()
        for {target}, rows in log.groupby({by}):
            out = out.append({row}, ignore_index=True)
        out.to_csv("data/out.csv", index=False)
    """


@pytest.mark.parametrize("row", [
    # a text key: each column keeps its own type (pressings and kg ints, juice float)
    '{"press": press, "pressings": len(rows), "kg": rows["apples_kg"].sum(), '
    '"juice": rows["juice_l"].sum()}',
    # the key last and renamed, a mean and a difference of reductions
    '{"mean_kg": rows["apples_kg"].mean(), "spread": rows["apples_kg"].max() - '
    'rows["apples_kg"].min(), "which": press}',
    # no key: numbers only, one of them float: every column float (3 written 3.0)
    '{"pressings": len(rows), "juice": rows["juice_l"].sum()}',
    # numbers only, all whole: ints
    '{"pressings": len(rows), "kg": rows["apples_kg"].sum()}',
])
@pytest.mark.parametrize("with_data", [True, False])
def test_one_row_per_group(pandas_1_5, tmp_path, row, with_data):
    same_under_old_pandas(pandas_1_5, tmp_path, appended(row), {"pressings.csv": PRESSINGS},
                          with_data=with_data)


@pytest.mark.parametrize("with_data", [True, False])
def test_a_whole_number_key_with_whole_numbers_and_floats(pandas_1_5, tmp_path, with_data):
    # the batch key is a number: with a float value every column is float (batch 3 is 3.0)
    same_under_old_pandas(pandas_1_5, tmp_path, appended(
        '{"batch": batch, "pressings": len(rows), "juice": rows["juice_l"].sum()}',
        by='"batch"', target="batch"), {"pressings.csv": PRESSINGS}, with_data=with_data)


def test_two_keys(pandas_1_5, tmp_path):
    same_under_old_pandas(pandas_1_5, tmp_path, appended(
        '{"press": press, "batch": batch, "kg": rows["apples_kg"].sum()}',
        by='["press", "batch"]', target="(press, batch)"), {"pressings.csv": PRESSINGS})


@pytest.mark.parametrize("loop", [
    # the rows read after the loop
    """for press, rows in log.groupby("press"):
            out = out.append({"press": press, "n": len(rows)}, ignore_index=True)
        print(len(rows))""",
    # two statements in the body
    """for press, rows in log.groupby("press"):
            n = len(rows)
            out = out.append({"press": press, "n": n}, ignore_index=True)""",
    # a value porter does not read
    """for press, rows in log.groupby("press"):
            out = out.append({"press": press, "first": rows["orchard"].iloc[0]}, ignore_index=True)""",
])
def test_other_loops_stay_pandas_code_that_runs(pandas_1_5, tmp_path, loop):
    # (on the pressings of test_kept_pandas_code_in_todays_spelling)
    text = same_with_kept_code(pandas_1_5, tmp_path, f"""
        import pandas as pd
        log = pd.read_csv("data/pressings.csv")
        out = pd.DataFrame()
        {loop}
        out.to_csv("data/out.csv", index=False)
    """)
    assert "pandas_append(" in text


def test_the_loop_is_gone_from_the_conversion():
    result = convert_source("""import pandas as pd
log = pd.read_csv("data/pressings.csv")
out = pd.DataFrame()
for press, rows in log.groupby("press"):
    out = out.append({"press": press, "n": len(rows)}, ignore_index=True)
out.to_csv("out.csv", index=False)
""")
    assert not [s for s in result.sites if s.status == "todo"]
    assert "for press" not in result.converted_text and "group_by(" in result.converted_text
