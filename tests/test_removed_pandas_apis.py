"""APIs pandas 2 and 3 removed, which old scripts still call: DataFrame.applymap (now
DataFrame.map), DataFrame.append (now pd.concat) and fillna(method=...) (now ffill / bfill). Such a script fails on pandas 3.1; its
port runs. The reference is what the API did, in pandas' own words for it today: each script
written with applymap / append is converted, and its output compared with the same script
written with DataFrame.map / pd.concat run by pandas 3.1. DataFrame.map itself is checked
the same way against pandas."""

from __future__ import annotations

from pathlib import Path
import subprocess
import sys

import pytest

from porter.api import convert_source
from porter.model import Options
from support import same_text

# a seed bank's tray log: blanks, accented names, whole numbers and floats, a duplicate row
TRAYS = """\
tray,seed,sown,grams
T1,Bohne,12,1.5
T2,Érable,,0.25
T3,,7,
T1,Bohne,12,1.5
"""

MORE = """\
tray,seed,grams,note
T9,Kale,3.0,late
"""


SCRIPT = """\
import pandas as pd
trays = pd.read_csv("trays.csv")
more = pd.read_csv("more.csv")
out = {}
out.to_csv("out.csv", index=False)
print(out.dtypes.astype(str).tolist(), len(out))
"""


def _outputs(folder: Path, text: str) -> tuple[str, str]:
    folder.mkdir()
    (folder / "trays.csv").write_text(TRAYS)
    (folder / "more.csv").write_text(MORE)
    (folder / "script.py").write_text(text)
    done = subprocess.run([sys.executable, "script.py"], cwd=folder, capture_output=True,
                          text=True, timeout=120)
    assert done.returncode == 0, f"{done.stderr}\n--- script ---\n{text}"
    return done.stdout, (folder / "out.csv").read_text()


@pytest.mark.parametrize("old, new", [
    ('trays[["sown", "grams"]].applymap(lambda x: x * 2)',
     'trays[["sown", "grams"]].map(lambda x: x * 2)'),
    ('trays[["tray", "seed"]].applymap(lambda s: str(s).lower())',
     'trays[["tray", "seed"]].map(lambda s: str(s).lower())'),
    ('trays.append(more)', 'pd.concat([trays, more])'),
    ('trays.append(more, ignore_index=True)', 'pd.concat([trays, more], ignore_index=True)'),
    ('trays.append([more, trays], sort=True)', 'pd.concat([trays, more, trays], sort=True)'),
    ('trays.fillna(method="ffill")', 'trays.ffill()'),
    ('trays.fillna(method="backfill", limit=1)', 'trays.bfill(limit=1)'),
    ('trays.assign(grams=trays["grams"].fillna(method="pad"))',
     'trays.assign(grams=trays["grams"].ffill())'),
    ('trays.assign(sown=trays["sown"].fillna(method="bfill"))',
     'trays.assign(sown=trays["sown"].bfill())'),
])
def test_removed_apis_port_as_their_successors(tmp_path: Path, old: str, new: str) -> None:
    # the reference: pandas 3.1 running the script written with today's name
    expected = _outputs(tmp_path / "pandas", SCRIPT.format(new))
    (tmp_path / "sample").mkdir()
    (tmp_path / "sample" / "trays.csv").write_text(TRAYS)
    (tmp_path / "sample" / "more.csv").write_text(MORE)
    converted = convert_source(SCRIPT.format(old), options=Options(
        data_dir=str(tmp_path / "sample"))).converted_text
    assert "TODO(porter)" not in converted, converted
    assert _outputs(tmp_path / "polars", converted) == expected, converted


@pytest.mark.parametrize("mapping", [
    'trays[["sown", "grams"]].map(lambda x: x + 1 if x > 10 else x)',
    'trays[["seed"]].map(lambda s: s.upper(), na_action="ignore")',
    'trays[["sown", "seed"]].map(lambda v: f"<{v}>")',
])
def test_frame_map_is_series_map_on_every_column(tmp_path: Path, mapping: str) -> None:
    text = same_text(f'''\
import pandas as pd
trays = pd.read_csv("trays.csv")
out = {mapping}
out.to_csv("out.csv", index=False)
print(len(out))
''', tmp_path, {"trays.csv": TRAYS}).converted_text
    assert "TODO(porter)" not in text, text


def test_a_dict_given_to_frame_map_stays_pandas(tmp_path: Path) -> None:
    # pandas' DataFrame.map takes a function only: it raises TypeError on a dict
    text = convert_source('''\
import pandas as pd
trays = pd.read_csv("trays.csv")
out = trays[["sown"]].map({12: "dozen"})
''').converted_text
    assert "TODO(porter): frame.map" in text, text


def test_appending_a_row_stays_a_todo(tmp_path: Path) -> None:
    text = convert_source('''\
import pandas as pd
trays = pd.read_csv("trays.csv")
trays = trays.append({"tray": "T7", "seed": "Kale"}, ignore_index=True)
''').converted_text
    assert "TODO(porter): frame.append" in text, text
