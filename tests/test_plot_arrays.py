"""A column of numbers given to matplotlib's drawing functions or to scikit-learn's models and
metrics goes over as the numpy array of its values (`.collect().to_series().to_numpy()`), not as
a pandas Series: both libraries make an array of a Series' values and read neither its row
labels nor its name (porter/translate/evaluate.py, _values_array).

pandas is the reference: the script and its conversion run with the real matplotlib (Agg) and
scikit-learn on the same small files (a whole-number column with a missing value, floats with
NaN, a duplicated row, accented text, an empty file), and must write the same picture, byte for
byte, and print the same numbers.
"""

from __future__ import annotations

from pathlib import Path
import subprocess
import sys
import textwrap

import pytest

from support import convert

pytest.importorskip("matplotlib")
pytest.importorskip("sklearn")

FILES = {
    "tricky": (
        "hive,kg,frames,month,guess\n"
        "Ärger,1.5,12,1,1.25\n"
        "B,,9,2,2.5\n"
        "A,2.25,,3,2.0\n"
        "A,2.25,,3,2.0\n"
        "Étang,0.5,14,4,0.75\n"
        "B,3.0,7,5,3.5\n"
    ),
    "empty": "hive,kg,frames,month,guess\n",
}

SCRIPT = """\
import numpy as np
import pandas as pd
import matplotlib
matplotlib.use("Agg")
import matplotlib.pyplot as plt
from sklearn.metrics import mean_absolute_error

df = pd.read_csv("hives.csv")
fig, ax = plt.subplots()
ax.hist(df["kg"].dropna(), bins=3)
ax.scatter(df["month"], df["frames"], c=df["month"])
fig.savefig("values.png")
plt.close(fig)
plt.figure()
plt.bar(df["hive"], df["month"])
plt.savefig("bars.png")
plt.close()
scored = df.dropna(subset=["kg"])
if len(scored):
    print(mean_absolute_error(scored["kg"], scored["guess"]))
"""


def _run_both(folder: Path, data: str) -> tuple[list[object], list[object], str]:
    (folder / "data").mkdir(parents=True)
    (folder / "data" / "hives.csv").write_text(data, encoding="utf-8")
    result = convert(SCRIPT, data_dir=str(folder / "data"))
    seen = []
    for side, text in (("pandas", SCRIPT), ("polars", result.converted_text)):
        work = folder / side
        work.mkdir()
        (work / "hives.csv").write_text(data, encoding="utf-8")
        (work / "script.py").write_text(text, encoding="utf-8")
        done = subprocess.run([sys.executable, "script.py"], cwd=work, capture_output=True,
                              text=True, timeout=180)
        assert done.returncode == 0, f"{side}:\n{done.stderr}\n{text}"
        seen.append([done.stdout, (work / "values.png").read_bytes(),
                     (work / "bars.png").read_bytes()])
    return seen[0], seen[1], result.converted_text


@pytest.mark.parametrize("data", FILES.values(), ids=FILES.keys())
def test_number_columns_go_over_as_arrays_and_draw_the_same(data: str, tmp_path: Path) -> None:
    expected, actual, text = _run_both(tmp_path, data)
    assert expected[0] == actual[0]  # the metric printed
    assert expected[1] == actual[1], "the histogram and scatter differ"
    assert expected[2] == actual[2], "the bar chart differs"
    if data == FILES["empty"]:
        return  # no types read from an empty file: the Series go over as pandas' own
    # numbers (floats, whole numbers with a missing value) as numpy arrays of their values
    for column in ("kg", "month", "frames", "guess"):
        assert f'pl.col("{column}")).collect().to_series().to_numpy()' in text, column
    # text stays pandas' (a missing text is nan there, None in a Polars array)
    assert 'pl.col("hive")).collect().to_series().to_pandas()' in text
    assert "TODO" not in text


def test_a_series_labelled_by_group_keys_stays_pandas() -> None:
    # a groupby result is labelled by its keys: it is not the plain column this is about
    result = convert(textwrap.dedent("""\
        import pandas as pd
        import matplotlib.pyplot as plt
        df = pd.DataFrame({"k": ["a", "b", "a"], "v": [1.0, 2.0, 3.0]})
        plt.hist(df.groupby("k")["v"].sum())
    """))
    assert ".to_numpy()" not in result.converted_text.split("plt.hist")[1]
