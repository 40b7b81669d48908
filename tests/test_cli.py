"""The command line: outputs, exit codes, clear errors for bad input."""

from __future__ import annotations

import json
import subprocess
import sys

import pytest

from porter.cli import main

SCRIPT = """\
import pandas as pd

df = pd.read_csv("data/kg.csv")
rows = [r for _, r in df.iterrows()]
df = df.sort_values("kg")
df.to_csv("out.csv", index=False)
"""


@pytest.fixture
def script(tmp_path):
    path = tmp_path / "harvest.py"
    path.write_text(SCRIPT)
    return path


def test_convert_to_stdout(script, capsys):
    assert main(["convert", str(script)]) == 0
    out, err = capsys.readouterr()
    assert "pl.scan_csv(" in out and "import polars as pl" in out
    assert "TODOs" in err and "frame.iterrows" in err


def test_convert_to_file_and_report(script, tmp_path, capsys):
    out_file, report = tmp_path / "out.py", tmp_path / "report.json"
    assert main(["convert", str(script), "-o", str(out_file), "--report", str(report), "-q"]) == 0
    assert capsys.readouterr() == ("", "")
    assert "pipe(pandas_sort_values, \"kg\")" in out_file.read_text()
    data = json.loads(report.read_text())
    (entry,) = data["files"]
    assert entry["source"] == str(script) and entry["output"] == str(out_file)
    keys = {s["key"]: s for s in entry["sites"]}
    assert keys["frame.iterrows"]["status"] == "todo"
    assert keys["frame.sort_values"]["status"] == "converted"
    assert set(keys["frame.sort_values"]) == {"line", "end_line", "key", "rule", "status", "confidence", "message"}
    assert data["summary"]["todo_by_key"] == {"frame.iterrows": 1}
    assert data["summary"]["files"] == 1


def test_diff_writes_nothing(script, tmp_path, capsys):
    assert main(["convert", str(script), "--diff", "-o", str(tmp_path / "never.py"), "-q"]) == 0
    out = capsys.readouterr().out
    assert out.startswith("---") and "+import polars as pl" in out and "-import pandas as pd" in out
    assert not (tmp_path / "never.py").exists()


def test_fail_on_todo(script, capsys):
    assert main(["convert", str(script), "--fail-on-todo", "-q"]) == 1
    clean = script.with_name("clean.py")
    clean.write_text("import pandas as pd\ndf = pd.read_csv('a.csv')\nprint(len(df))\n")
    assert main(["convert", str(clean), "--fail-on-todo", "-q"]) == 0


def test_min_confidence_turns_a_rewrite_into_a_todo_with_the_suggestion(script, capsys):
    assert main(["convert", str(script), "--min-confidence", "0.99", "-q"]) == 0
    out = capsys.readouterr().out
    assert "# TODO(porter): pd.read_csv: confidence 0.95 is below --min-confidence 0.99" in out
    assert 'suggested: pl.scan_csv("data/kg.csv"' in out
    # the read stays on pandas, and so does everything computed from it
    assert 'df = pd.read_csv("data/kg.csv")' in out and 'df.sort_values("kg")' in out


def test_missing_file_is_a_clear_error(tmp_path, capsys):
    assert main(["convert", str(tmp_path / "nope.py")]) == 2
    assert capsys.readouterr().err.strip() == f"porter: {tmp_path / 'nope.py'}: no such file"


def test_syntax_error_names_file_and_line(tmp_path, capsys):
    bad = tmp_path / "bad.py"
    bad.write_text("import pandas as pd\n\ndf = pd.read_csv('x.csv'\nprint(df)\n")
    assert main(["convert", str(bad)]) == 2
    err = capsys.readouterr().err
    assert err.startswith(f"porter: {bad}:") and "syntax error" in err and "Traceback" not in err


def test_not_utf8_is_a_clear_error(tmp_path, capsys):
    bad = tmp_path / "latin.py"
    bad.write_bytes("x = 'caf\xe9'\n".encode("latin-1"))
    assert main(["convert", str(bad)]) == 2
    assert "not UTF-8" in capsys.readouterr().err


def test_bad_usage_exits_2(capsys):
    with pytest.raises(SystemExit) as exc:
        main(["convert"])
    assert exc.value.code == 2
    with pytest.raises(SystemExit) as exc:
        main(["convert", "x.py", "--min-confidence", "2"])
    assert exc.value.code == 2


def test_missing_data_folder(script, tmp_path, capsys):
    assert main(["convert", str(script), "--data", str(tmp_path / "none")]) == 2
    assert "no such folder" in capsys.readouterr().err


def test_python_dash_m_and_console_script(script):
    proc = subprocess.run([sys.executable, "-m", "porter", "convert", str(script), "-q"],
                          capture_output=True, text=True)
    assert proc.returncode == 0 and "pl.scan_csv" in proc.stdout


def test_data_folder_gives_the_shortest_faithful_code(tmp_path, capsys):
    # with --data porter reads the input schemas (no data) and knows the columns: usecols keep
    # file order by name, shared merge columns are renamed by name, not found at run time
    (tmp_path / "data").mkdir()
    (tmp_path / "data" / "a.csv").write_text("k,kg,grade\n1,2.5,A\n")
    (tmp_path / "data" / "b.csv").write_text("k,grade,price\n1,B,3\n")
    script = tmp_path / "join.py"
    script.write_text(
        "import pandas as pd\n"
        "a = pd.read_csv('data/a.csv', usecols=['grade', 'k'])\n"
        "b = pd.read_csv('data/b.csv')\n"
        "m = a.merge(b, on='k')\n"
        "m.to_csv('m.csv', index=False)\n")
    assert main(["convert", str(script), "-q"]) == 0
    without = capsys.readouterr().out
    assert main(["convert", str(script), "--data", str(tmp_path), "-q"]) == 0
    with_data = capsys.readouterr().out
    assert "collect_schema" in without and 'pl.col("^(grade|k)$")' in without
    flat = "".join(with_data.split())
    assert "collect_schema" not in with_data
    assert '.select("k","grade")' in flat
    assert '.rename({"grade":"grade_x"})' in flat and '.rename({"grade":"grade_y"})' in flat
