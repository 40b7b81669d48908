"""Frames and Series given to a plotting library (porter/analysis/consumers.py): handed over to
pandas on purpose, as a hand-over site with a confidence, not a TODO.

pandas is the reference: the original script and its conversion run against a stand-in
`matplotlib.pyplot` and `seaborn` that print what they were given (the type, the values, the
name and the row labels), and both must print the same.
"""

from __future__ import annotations

from pathlib import Path
import subprocess
import sys
import textwrap

import pytest

from support import convert

# What matplotlib reads of a pandas value (from memory of its documented behaviour, not
# measured here: matplotlib is not installed for the tests): scatter, hist, bar, ... and
# plot(x, y) turn each sequence into an array of its values; plot(s) alone draws the Series
# against its row labels; seaborn's data= frame is read by the column names given as x= / y=.
RECORDER = """\
VALUES_ONLY = {"scatter", "hist", "bar", "barh", "pie", "boxplot"}


def _show(name, *args, **kwargs):
    data = [a for a in args if not isinstance(a, str)]
    values_only = name.split(".")[-1] in VALUES_ONLY or (
        name.split(".")[-1] == "plot" and len(data) >= 2)
    for value in (*args, *kwargs.values()):
        kind = type(value).__module__.split(".")[0] + "." + type(value).__name__
        if values_only and hasattr(value, "to_numpy"):
            print(name, [str(v) for v in value.to_numpy()])
        elif hasattr(value, "to_dict") and hasattr(value, "index"):
            print(name, kind, getattr(value, "name", None), list(value.index),
                  value.to_dict() if hasattr(value, "to_dict") else value)
        else:
            print(name, kind, value)


def __getattr__(name):
    if name.startswith("__"):
        raise AttributeError(name)
    return lambda *args, **kwargs: _show(name, *args, **kwargs)


class _Axes:
    def __getattr__(self, name):
        return lambda *args, **kwargs: _show("ax." + name, *args, **kwargs)


def subplots(*args, **kwargs):
    return object(), _Axes()
"""

CSV = """\
hive,kg,month
Ärger,1.5,1
B,2.0,2
A,,3
B,0.5,4
"""


def _run_both(source: str, tmp_path: Path) -> tuple[str, str, object]:
    source = textwrap.dedent(source)
    result = convert(source)
    outputs = []
    for side, text in (("pandas", source), ("polars", result.converted_text)):
        folder = tmp_path / side
        (folder / "matplotlib").mkdir(parents=True)
        (folder / "matplotlib" / "__init__.py").write_text("")
        (folder / "matplotlib" / "pyplot.py").write_text(RECORDER)
        (folder / "seaborn.py").write_text(RECORDER)
        (folder / "hives.csv").write_text(CSV)
        (folder / "script.py").write_text(text)
        done = subprocess.run([sys.executable, "script.py"], cwd=folder, capture_output=True,
                              text=True, timeout=120)
        assert done.returncode == 0, f"{side}:\n{done.stderr}\n{text}"
        outputs.append(done.stdout)
    return outputs[0], outputs[1], result


@pytest.mark.parametrize("body", [
    'plt.plot(df["month"], df["kg"])',
    'plt.bar(df["hive"], df["kg"] * 2)',
    'fig, ax = plt.subplots()\nax.scatter(df.month, df.kg)',
    'sns.barplot(data=df, x="hive", y="kg")',
    'plt.hist(df.groupby("hive")["kg"].sum())',  # labelled by the group keys
])
def test_plotting_gets_what_pandas_would_give_it(body: str, tmp_path: Path) -> None:
    source = ("import pandas as pd\nimport matplotlib.pyplot as plt\nimport seaborn as sns\n"
              f'df = pd.read_csv("hives.csv")\n{body}\n')
    expected, actual, result = _run_both(source, tmp_path)
    assert expected == actual
    plotted = [s for s in result.sites if s.key == "handover.plotting"]
    assert plotted and all(s.status == "handover" and s.confidence == 1.0 for s in plotted)
    assert "TODO" not in result.converted_text


def test_a_series_whose_labels_a_filter_changed_keeps_them(tmp_path: Path) -> None:
    # a filtered Series plotted alone: matplotlib draws its row labels as x values, so they
    # must be pandas' (the original row numbers), not 0..n-1
    source = """\
        import pandas as pd
        import matplotlib.pyplot as plt
        df = pd.read_csv("hives.csv")
        heavy = df[df["kg"] > 1.6]
        plt.plot(heavy["kg"].round(1))
        plt.plot(df.sort_values("kg")["kg"])
    """
    expected, actual, _ = _run_both(source, tmp_path)
    assert expected == actual


def test_values_only_plots_of_a_filtered_frame_stay_polars(tmp_path: Path) -> None:
    # scatter and plot(x, y) draw values: the filter stays Polars, no TODO, same values
    source = """\
        import pandas as pd
        import matplotlib.pyplot as plt
        df = pd.read_csv("hives.csv")
        df = df[df["kg"] > 0.7]
        plt.scatter(df["month"], df["kg"])
        plt.plot(df["month"], df["kg"], "o-")
    """
    expected, actual, result = _run_both(source, tmp_path)
    assert expected == actual
    assert "TODO" not in result.converted_text
    assert 'df.filter(pl.col("kg") > 0.7)' in result.converted_text


def test_other_code_keeps_its_todo() -> None:
    result = convert('import pandas as pd\nimport mylib\ndf = pd.read_csv("hives.csv")\n'
                     'mylib.draw(df)\n')
    assert [s.status for s in result.sites if s.key == "handover.unknown_code"] == ["todo"]
