"""`porter verify` end to end: both versions run on the same data, every output compared.

pandas is the reference: the original script runs with pandas, the converted one with Polars.
"""

from __future__ import annotations

import json
from pathlib import Path
import shutil

import pytest

from corpus_check import CORPUS, KNOWN_TIE_OUTPUTS, cases, reference_python
from porter.cli import main
from porter.verify.api import VerifyOptions, verify

FIXTURES = Path(__file__).resolve().parent / "verify_fixtures" / "harvest"


def test_a_faithful_conversion_is_the_same():
    result = verify(FIXTURES / "harvest.py", (FIXTURES / "harvest_polars.py").read_text(), FIXTURES)
    assert result.verdict == "same", result.to_json()
    names = {o.name: o for o in result.outputs}
    assert {"totals.csv", "named.csv"} <= set(names)
    assert names["by_grower"].kind == "variable"  # a frame left in the globals
    assert result.original.exit_code == 0 and result.converted.exit_code == 0
    assert result.original.peak_mib and result.original.wall_s > 0


@pytest.mark.parametrize("broken, output", [
    pytest.param("broken_aggregation.py", "totals.csv", id="a wrong aggregation"),
    pytest.param("broken_filter.py", "named.csv", id="a missing filter"),
    pytest.param("broken_join.py", "named.csv", id="a wrong join type"),
])
def test_broken_conversions_are_caught(broken, output):
    result = verify(FIXTURES / "harvest.py", (FIXTURES / broken).read_text(), FIXTURES)
    assert result.verdict == "different"
    statuses = {o.name: o.comparison.status for o in result.outputs}
    assert statuses[output] == "different", statuses


def test_the_users_folder_is_never_written(tmp_path):
    data = tmp_path / "data_copy"
    shutil.copytree(FIXTURES, data)
    before = sorted(p.relative_to(data) for p in data.rglob("*"))
    verify(data / "harvest.py", None, data)
    assert sorted(p.relative_to(data) for p in data.rglob("*")) == before


@pytest.mark.parametrize("name", cases())
def test_every_corpus_script_verifies_as_same(name):
    # a case written for an older pandas (corpus/<name>/reference.txt) runs its original there
    result = verify(CORPUS / name / f"{name}.py", None, CORPUS / name,
                    VerifyOptions(reference_python=reference_python(name)))
    if name in KNOWN_TIE_OUTPUTS:
        # a documented rounding tie after a float sum (see corpus_check.KNOWN_TIES): only
        # those outputs may differ
        differing = {o.name for o in result.outputs if o.comparison.status != "same"}
        assert differing <= KNOWN_TIE_OUTPUTS[name], \
            json.dumps(result.to_json(), indent=1, default=str)[:3000]
        return
    assert result.verdict == "same", json.dumps(result.to_json(), indent=1, default=str)[:3000]


def _script(tmp_path: Path, text: str) -> Path:
    (tmp_path / "data").mkdir()
    script = tmp_path / "data" / "job.py"
    script.write_text(text)
    return script


def test_a_crash_is_an_error_with_its_traceback(tmp_path):
    script = _script(tmp_path, "import pandas as pd\nraise ValueError('the ferry sank')\n")
    result = verify(script, None, script.parent)
    assert result.verdict == "error"
    assert result.original.failure == "crashed"
    assert "ValueError: the ferry sank" in result.original.stderr


def test_a_script_that_hangs_is_stopped(tmp_path):
    script = _script(tmp_path, "import time\nwhile True:\n    time.sleep(0.1)\n")
    result = verify(script, None, script.parent, VerifyOptions(timeout=2))
    assert result.verdict == "error" and result.original.failure == "timed out"
    assert result.original.wall_s < 10


def test_a_script_that_allocates_without_end_is_stopped(tmp_path):
    script = _script(tmp_path, "blocks = []\nwhile True:\n    blocks.append(bytearray(50_000_000))\n")
    result = verify(script, None, script.parent, VerifyOptions(memory_mib=400, timeout=60))
    assert result.verdict == "error" and result.original.failure == "out of memory"


def test_a_missing_output_is_reported(tmp_path):
    data = tmp_path / "work"
    data.mkdir()
    (data / "a.py").write_text("import pandas as pd\npd.DataFrame({'x': [1]}).to_csv('x.csv', index=False)\n")
    result = verify(data / "a.py", "print('nothing written')\n", data)
    assert result.verdict == "missing"
    assert [(o.name, o.comparison.status) for o in result.outputs] == [("x.csv", "missing")]


def test_cli_verify_exit_codes_and_json(tmp_path, capsys):
    report = tmp_path / "verdict.json"
    assert main(["verify", str(FIXTURES / "harvest.py"), str(FIXTURES / "harvest_polars.py"),
                 "--data", str(FIXTURES), "--json", str(report)]) == 0
    out = capsys.readouterr().out
    assert "SAME" in out and "totals.csv" in out
    data = json.loads(report.read_text())
    assert data["verdict"] == "same" and {"exit_code", "wall_s", "peak_mib"} <= set(data["original"])
    assert {"measured", "runs", "wall_s_runs", "peak_mib_runs", "capture_s",
            "baseline_mib"} <= set(data["converted"])
    assert data["original"]["measured"] == "script" and data["original"]["runs"] == 2
    assert {"name", "kind", "status", "detail"} <= set(data["outputs"][0])
    assert main(["verify", str(FIXTURES / "harvest.py"), str(FIXTURES / "broken_join.py"),
                 "--data", str(FIXTURES)]) == 1
    assert "DIFFERENT" in capsys.readouterr().out


def test_cli_verify_bad_input(tmp_path, capsys):
    assert main(["verify", str(tmp_path / "none.py"), "--data", str(tmp_path)]) == 2
    assert "no such script" in capsys.readouterr().err
    assert main(["verify", str(FIXTURES / "harvest.py"), "--data", str(tmp_path / "nope")]) == 2
    assert "no such folder" in capsys.readouterr().err


def test_convert_then_verify(tmp_path, capsys):
    out = tmp_path / "harvest_polars.py"
    code = main(["convert", str(FIXTURES / "harvest.py"), "-o", str(out), "--verify",
                 "--data", str(FIXTURES), "-q"])
    assert code == 0
    assert "SAME" in capsys.readouterr().err


def test_an_output_that_cannot_be_read_back_is_named(tmp_path):
    data = tmp_path / "work"
    data.mkdir()
    writer = "open('broken.parquet', 'wb').write(b'not a parquet file')\n"
    (data / "a.py").write_text(writer)
    other = "open('broken.parquet', 'wb').write(b'not a parquet file either')\n"
    result = verify(data / "a.py", other, data)
    assert result.verdict == "error"
    (out,) = result.outputs
    assert out.name == "broken.parquet" and out.comparison.status == "error"
    assert "broken.parquet" in out.comparison.detail or "read back" in out.comparison.detail
    # the same bytes on both sides are the same output, table or not (JSON Lines, say)
    same = verify(data / "a.py", writer, data)
    assert same.verdict == "same" and "identical bytes" in same.outputs[0].comparison.detail


def test_same_values_written_as_other_text_are_said_so(tmp_path):
    data = tmp_path / "work"
    data.mkdir()
    (data / "a.py").write_text("open('out.csv', 'w').write('year\\n2024.0\\n')\n")
    result = verify(data / "a.py", "open('out.csv', 'w').write('year\\n2024\\n')\n", data)
    (out,) = result.outputs
    assert out.comparison.status == "same" and "other text" in out.comparison.detail


def test_rows_in_another_order_fail_unless_ignored(tmp_path, capsys):
    data = tmp_path / "work"
    data.mkdir()
    script = data / "a.py"
    script.write_text("import pandas as pd\n"
                      "pd.DataFrame({'x': [1, 2, 3]}).to_csv('x.csv', index=False)\n")
    shuffled = ("import polars as pl\n"
                "pl.DataFrame({'x': [3, 1, 2]}).write_csv('x.csv')\n")
    (tmp_path / "shuffled.py").write_text(shuffled)
    assert verify(script, shuffled, data).verdict == "same-unordered"
    args = ["verify", str(script), str(tmp_path / "shuffled.py"), "--data", str(data)]
    assert main(args) == 1
    assert main(args + ["--ignore-order"]) == 0


def test_keep_leaves_both_working_copies(tmp_path, capsys):
    assert main(["verify", str(FIXTURES / "harvest.py"), "--data", str(FIXTURES), "--keep"]) == 0
    out = capsys.readouterr().out
    kept = [line.split(" ran in ")[1] for line in out.splitlines() if " ran in " in line]
    assert len(kept) == 2
    assert all((Path(folder) / "totals.csv").is_file() for folder in kept)
    shutil.rmtree(Path(kept[0]).parent.parent, ignore_errors=True)


def test_verify_help_says_it_runs_code(capsys):
    with pytest.raises(SystemExit):
        main(["verify", "--help"])
    assert "RUNS THE SCRIPTS" in capsys.readouterr().out


def test_the_row_a_loop_over_rows_leaves_behind_is_not_a_result():
    from porter.verify.api import _row_loop_names
    names = _row_loop_names("for _, row in df.iterrows():\n    out.append(row['a'])\n"
                            "for t in df.itertuples():\n    pass\nfor x in range(3):\n    pass\n")
    assert names == {"_", "row", "t"}


def test_an_output_left_in_the_folder_by_an_earlier_run_is_still_compared(tmp_path):
    # the script writes out.csv again, with what an earlier run left there: it is an output
    (tmp_path / "d.csv").write_text("k,v\na,1\nb,2\n", encoding="utf-8")
    script = tmp_path / "s.py"
    script.write_text('import pandas as pd\ndf = pd.read_csv("d.csv")\n'
                      'df["w"] = df["v"] * 2\ndf.to_csv("out.csv", index=False)\n',
                      encoding="utf-8")
    (tmp_path / "out.csv").write_text("k,v,w\na,1,2\nb,2,4\n", encoding="utf-8")
    result = verify(script, None, tmp_path)
    assert "out.csv" in [o.name for o in result.outputs]


def test_a_data_folder_holding_the_temporary_folder_is_not_copied_into_itself(tmp_path, monkeypatch):
    # `porter verify --data .` run from the system's temporary folder: the run's own folder
    # is made inside the data folder, and copying the data must not copy it again and again
    data = tmp_path / "work"
    data.mkdir()
    (data / "t.csv").write_text("k,v\nx,1\ny,2\n", encoding="utf-8")
    (data / "a.py").write_text("import pandas as pd\npd.read_csv('t.csv').to_csv('o.csv', index=False)\n")
    monkeypatch.setattr("tempfile.tempdir", str(data))
    result = verify(data / "a.py", None, data)
    assert result.verdict == "same", result
