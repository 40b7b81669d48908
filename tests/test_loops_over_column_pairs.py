"""`for name, col in df.items():` (and iteritems(), which pandas 2 removed): a loop over the
column names with `col` standing for pl.col(name). pandas (the reference) runs each script; the
conversion runs with Polars on the same file; printed text and written files must be the same.
"""

from __future__ import annotations

from pathlib import Path

import pytest

from support import same_text

# a ferry line's sailings: blanks in each column, accents, ties
SAILINGS = """\
quay,boat,cars,fare
Süd,Möwe,12,4.5
Nord,,7,
Süd,Möwe,12,4.5
,Reiher,,3.0
"""


@pytest.mark.parametrize("body", [
    "print(name, col.isna().sum(), col.nunique())",
    "print(name, col.count(), len(col))",
    'rows.append({"column": name, "missing": int(col.isna().sum())})',
])
def test_column_pairs_loops_are_pandas_own(tmp_path: Path, body: str) -> None:
    text = same_text(f'''\
import pandas as pd
sailings = pd.read_csv("sailings.csv")
rows = []
for name, col in sailings.items():
    {body}
print(rows)
''', tmp_path, {"sailings.csv": SAILINGS}).converted_text
    assert "TODO(porter)" not in text and ".items()" not in text, text


def test_iteritems_loops_as_items_did(tmp_path: Path) -> None:
    # pandas 3 has no iteritems: the reference is the same loop written with items()
    script = '''\
import pandas as pd
sailings = pd.read_csv("sailings.csv")
for name, col in sailings.{}():
    print(name, col.isna().sum())
'''
    (tmp_path / "modern").mkdir()
    modern = same_text(script.format("items"), tmp_path / "modern", {"sailings.csv": SAILINGS})
    from porter.api import convert_source
    from porter.model import Options
    old = convert_source(script.format("iteritems"), options=Options(
        data_dir=str(tmp_path / "modern" / "pandas"))).converted_text
    assert old == modern.converted_text


def test_a_loop_that_rebinds_the_column_stays_pandas_shaped(tmp_path: Path) -> None:
    text = same_text('''\
import pandas as pd
sailings = pd.read_csv("sailings.csv")
for name, col in sailings.items():
    col = col.dropna()
    print(name, len(col))
''', tmp_path, {"sailings.csv": SAILINGS}).converted_text
    assert "for name, col in" in text, text


def test_a_loop_that_changes_the_frame_runs_as_pandas_runs_it(tmp_path: Path) -> None:
    # the body writes columns of the frame it iterates: the loop stays pandas' (handed over)
    same_text('''\
import pandas as pd
sailings = pd.read_csv("sailings.csv")
for name, col in sailings[["cars", "fare"]].items():
    sailings[name + "_x2"] = col * 2
sailings.to_csv("out.csv", index=False)
''', tmp_path, {"sailings.csv": SAILINGS})
