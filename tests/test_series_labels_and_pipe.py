"""A Series labelled by one key (a groupby's result, df.sum()'s column names) read by label:
s["x"], s.loc["x"], s.items(), s.index, list(s); and df.pipe(lambda d: ...). pandas (the
reference) runs each script; the conversion runs with Polars on the same file; printed text and
written files must be the same."""

from __future__ import annotations

from pathlib import Path
import subprocess
import sys
import textwrap

import pytest

from porter.api import convert_source
from porter.model import Options
from support import same_text

# an orchard co-op's crates: a blank variety, a blank weight, accented names, repeated rows
CRATES = """\
grower,variety,kg,crates
Ödön,Boskoop,12.5,3
Maren,Elstar,7.25,2
Ödön,Elstar,,1
Jules,,4.0,5
Maren,Elstar,7.25,2
Jules,Boskoop,0.1,0
"""


@pytest.mark.parametrize("lines", [
    'by = crates.groupby("grower")["kg"].sum()\nprint(by["Maren"], by.loc["Ödön"])',
    'by = crates.groupby("grower")["crates"].count()\nprint(by.loc["Jules"] * 2)',
    'by = crates.groupby("variety")["kg"].mean()\nfor name, kg in by.items():\n    print(name, round(kg, 2))',
    'by = crates.groupby("grower")["crates"].sum()\nprint(dict(by.items()))',
    'by = crates.groupby("grower")["variety"].first()\nfor name, v in by.items():\n    print(name, v)',
    'by = crates.groupby("grower")["kg"].max()\nprint(by.index.tolist(), list(by.index), list(by))',
    'totals = crates[["kg", "crates"]].sum()\nprint(totals["crates"], totals.loc["kg"])',
    'gaps = crates.isna().sum()\nprint([name for name, n in gaps.items() if n > 0])',
    'print(len(crates.index), crates.index.tolist(), crates.index.max())',
    'for i in crates.index[:3]:\n    print(i, i * 2)',
    'print(crates["kg"][1:4].tolist(), crates["grower"][:2].tolist(), crates["crates"][-2:].tolist())',
    'by = crates.groupby("grower")["kg"].sum()\nprint(by[1:].tolist(), by.sort_values()[:2].tolist())',
    'c = crates["crates"].cumsum()\nprint(c[2:5].tolist())',
])
def test_values_read_by_label_are_pandas_own(tmp_path: Path, lines: str) -> None:
    text = same_text(f'''\
import pandas as pd
crates = pd.read_csv("crates.csv")
{lines}
''', tmp_path, {"crates.csv": CRATES}).converted_text
    assert "TODO(porter)" not in text, text


def test_a_label_no_row_holds_raises_in_both(tmp_path: Path) -> None:
    # pandas raises KeyError; the conversion must fail too, not print a value
    script = textwrap.dedent('''\
        import pandas as pd
        crates = pd.read_csv("crates.csv")
        by = crates.groupby("grower")["kg"].sum()
        print(by["Nobody"])
        ''')
    (tmp_path / "crates.csv").write_text(CRATES)
    converted = convert_source(script, options=Options(data_dir=str(tmp_path))).converted_text
    assert "TODO(porter)" not in converted, converted
    for name, text in (("original.py", script), ("converted.py", converted)):
        (tmp_path / name).write_text(text)
        done = subprocess.run([sys.executable, name], cwd=tmp_path, capture_output=True,
                              text=True, timeout=120)
        assert done.returncode != 0 and not done.stdout, (name, done.stdout)


def test_labels_that_may_repeat_stay_todos(tmp_path: Path) -> None:
    text = same_text('''\
import pandas as pd
crates = pd.read_csv("crates.csv")
by = crates.groupby("grower")["kg"].sum()
both = pd.concat([by, by])
print(both["Maren"])
''', tmp_path, {"crates.csv": CRATES}).converted_text
    assert "TODO(porter)" in text, text


@pytest.mark.parametrize("pipe", [
    'crates.pipe(lambda d: d[d["kg"] > 5])',
    'crates.pipe(lambda t: t.assign(per_crate=t["kg"] / t["crates"]))',
    'crates.pipe(lambda d: d.drop_duplicates().sort_values("grower", kind="stable"))',
])
def test_pipe_of_a_lambda_is_its_body(tmp_path: Path, pipe: str) -> None:
    text = same_text(f'''\
import pandas as pd
crates = pd.read_csv("crates.csv")
out = {pipe}
out.to_csv("out.csv", index=False)
''', tmp_path, {"crates.csv": CRATES}).converted_text
    assert "TODO(porter)" not in text and ".pipe(lambda" not in text, text


def test_pipe_of_a_named_function_is_its_call(tmp_path: Path) -> None:
    # pandas calls heavy(crates, 5): so does the port, whose function takes the Polars frame
    text = same_text('''\
import pandas as pd

def heavy(frame, limit):
    return frame[frame["kg"] > limit]

crates = pd.read_csv("crates.csv")
crates.pipe(heavy, 5).to_csv("out.csv", index=False)
''', tmp_path, {"crates.csv": CRATES}).converted_text
    assert "TODO(porter)" not in text and "heavy(crates, 5)" in text, text
