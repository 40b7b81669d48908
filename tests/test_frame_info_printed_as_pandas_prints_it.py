"""df.info() prints pandas' own summary: the row labels (a RangeIndex from 1 to 3 after a
filter, an Index of text after set_index), each column's non-null count and pandas' dtype, and
the memory pandas holds, which depends on the labels too. porter hands the frame to pandas
for it, its row labels with it. pandas is the reference: each case prints with both and the
texts are compared.

The data: an invented ferry line's crossings, with a missing route, a missing load and
accented harbour names.
"""

from __future__ import annotations

import subprocess
import sys
import textwrap

import pytest

from porter.api import convert_source
from porter.model import Options
from support import same_text

FILES = {"crossings.csv": """\
    route,harbour,cars,load_t
    A,Ørnes,12,30.5
    B,Brae,,12.0
    ,Ørnes,7,
    A,Sund,3,8.25
    C,Brae,9,14.0
    """}

HEAD = "import pandas as pd\ndf = pd.read_csv('crossings.csv')\n"

# labels 0..n-1 or an index porter tracks: handed over (no TODO), printed exactly as pandas does
EXACT = {
    "as read": "df.info()",
    "labelled by text": "df.set_index('harbour').info()",
    "a column added": "df['t'] = df['load_t'] / df['cars']\ndf.info(verbose=True, show_counts=True)",
}

# labels a filter or a sort changed: a TODO that hands the frame over with its labels, printed
# as pandas does but for the bytes counted for text (pandas keeps a filtered column's null mask)
RELABELLED = {
    "printed after a filter": "df[df['cars'] > 5].info()",
    "a filter kept in a name": "big = df[df['load_t'] > 10]\nbig.info()",
    "sorted": "df.sort_values('cars').info()",
    "print of its None": "print(df.dropna().info())",
}


@pytest.mark.parametrize("step", list(EXACT.values()), ids=list(EXACT))
def test_info_prints_what_pandas_prints(step: str, tmp_path) -> None:
    result = same_text(HEAD + step + "\n", tmp_path, FILES)
    assert "TODO" not in result.converted_text, result.converted_text
    assert [s.status for s in result.sites if s.key == "frame.info"] == ["handover"]


@pytest.mark.parametrize("step", list(RELABELLED.values()), ids=list(RELABELLED))
def test_info_shows_the_labels_a_filter_left(step: str, tmp_path) -> None:
    source = HEAD + step + "\n"
    (tmp_path / "crossings.csv").write_text(textwrap.dedent(FILES["crossings.csv"]))
    result = convert_source(source, options=Options(data_dir=str(tmp_path)))
    printed = []
    for text in (source, result.converted_text):
        (tmp_path / "script.py").write_text(text)
        done = subprocess.run([sys.executable, "script.py"], cwd=tmp_path, capture_output=True,
                              text=True, timeout=120, check=True)
        printed.append([line for line in done.stdout.splitlines()
                        if not line.startswith("memory usage:")])
    assert printed[0] == printed[1], result.converted_text
