"""df.boxplot(column=..., by=...) and df.hist(column=..., by=...) written out: only the columns
named go over to pandas (porter/rules/handover.py, plot_method), as pandas reads nothing else of
the frame then.

pandas is the reference: the script and its conversion run with the real matplotlib (Agg) on
the same small files (accented group names, a missing group, a missing value, a duplicated row)
and must draw the same pictures, byte for byte.
"""

from __future__ import annotations

from pathlib import Path
import subprocess
import sys

import pytest

from support import convert

pytest.importorskip("matplotlib")

FILES = {
    "tricky": (
        "hive,kg,frames,month,site\n"
        "Ärger,1.5,12,1,heath\n"
        "B,,9,2,\n"
        "A,2.25,,3,orchard\n"
        "A,2.25,,3,orchard\n"
        "Étang,0.5,14,4,heath\n"
        "B,3.0,7,5,étang\n"
    ),
    "one group": "hive,kg,frames,month,site\nA,1.0,3,1,heath\nA,2.0,4,2,heath\nA,2.0,4,2,heath\n",
}

SCRIPT = """\
import pandas as pd
import matplotlib
matplotlib.use("Agg")
import matplotlib.pyplot as plt

df = pd.read_csv("hives.csv")
df["kg2"] = df["kg"] * 2
df.boxplot(column="kg", by="site")
plt.savefig("box.png")
plt.close("all")
df.hist(column=["kg", "frames"], by="hive", bins=3)
plt.savefig("hist.png")
plt.close("all")
df.hist(column="kg2")
plt.savefig("one.png")
plt.close("all")
"""


@pytest.mark.parametrize("data", FILES.values(), ids=FILES.keys())
def test_named_columns_only_go_over_and_draw_the_same(data: str, tmp_path: Path) -> None:
    (tmp_path / "data").mkdir()
    (tmp_path / "data" / "hives.csv").write_text(data, encoding="utf-8")
    result = convert(SCRIPT, data_dir=str(tmp_path / "data"))
    pictures = []
    for side, text in (("pandas", SCRIPT), ("polars", result.converted_text)):
        work = tmp_path / side
        work.mkdir()
        (work / "hives.csv").write_text(data, encoding="utf-8")
        (work / "script.py").write_text(text, encoding="utf-8")
        done = subprocess.run([sys.executable, "script.py"], cwd=work, capture_output=True,
                              text=True, timeout=180)
        assert done.returncode == 0, f"{side}:\n{done.stderr}\n{text}"
        pictures.append([(work / name).read_bytes() for name in ("box.png", "hist.png", "one.png")])
    for name, expected, actual in zip(("box", "hist", "one"), *pictures):
        assert expected == actual, f"{name}.png differs\n{result.converted_text}"
    text = result.converted_text.replace("\n", "").replace(" ", "")
    assert "TODO" not in text
    assert '.select("kg","site").collect().to_pandas().boxplot(column="kg",by="site")' in text
    assert '.select("hive","kg","frames").collect().to_pandas().hist(' in text
    assert '.select("kg2").collect().to_pandas().hist(column="kg2")' in text
