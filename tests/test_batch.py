"""Folders: discovery, mirrored output, failures that do not stop the batch, scan, check, shards,
merged reports, configuration and safe in-place writes."""

from __future__ import annotations

import json
import os
from pathlib import Path
import shutil
import subprocess

import pytest

from porter import batch
from porter.batch import BatchOptions, discover, excluded, parse_shard, shard
from porter.cli import main

PANDAS = """\
import pandas as pd

df = pd.read_csv("data/kg.csv")
df = df.sort_values("kg")
df.to_csv("out.csv", index=False)
"""

WITH_TODO = """\
import pandas as pd

df = pd.read_csv("data/kg.csv")
rows = [r for _, r in df.iterrows()]
"""

PLAIN = "import os\n\nprint(os.getcwd())\n"


def build(root: Path) -> Path:
    """A code base: nested packages, bad files, files without pandas, folders to ignore."""
    src = root / "src"
    files = {
        "main.py": PANDAS,
        "pkg/__init__.py": "",
        "pkg/clean.py": PANDAS.replace("kg.csv", "clean.csv"),
        "pkg/sub/loops.py": WITH_TODO,
        "pkg/sub/helpers.py": PLAIN,
        "tools/plain.py": PLAIN,
        "broken.py": "import pandas as pd\n\ndf = pd.read_csv('x.csv'\n",
        # ignored: hidden folder, virtual environments, caches, build outputs
        ".hidden/secret.py": PANDAS,
        "venv/lib/v.py": PANDAS,
        "custom_env/lib/w.py": PANDAS,
        "custom_env/pyvenv.cfg": "home = /usr/bin\n",
        "__pycache__/c.py": PANDAS,
        "build/b.py": PANDAS,
        "node_modules/n.py": PANDAS,
        "notes.md": "not Python\n",
        "data/kg.csv": "kg\n1\n",
    }
    for name, text in files.items():
        path = src / name
        path.parent.mkdir(parents=True, exist_ok=True)
        path.write_text(text)
    (src / "latin.py").write_bytes("import pandas as pd\nx = 'caf\xe9'\n".encode("latin-1"))
    return src


EXPECTED = ["broken.py", "latin.py", "main.py", "pkg/__init__.py", "pkg/clean.py",
            "pkg/sub/helpers.py", "pkg/sub/loops.py", "tools/plain.py"]


@pytest.fixture
def src(tmp_path):
    return build(tmp_path)


def relative(items, root: Path) -> list[str]:
    return [Path(i.path).relative_to(root).as_posix() for i in items]


def snapshot(folder: Path) -> dict[str, bytes]:
    return {p.relative_to(folder).as_posix(): p.read_bytes()
            for p in sorted(folder.rglob("*")) if p.is_file()}


def test_discovery_skips_hidden_venvs_caches_and_builds(src):
    found = discover([str(src)], BatchOptions(mode="scan"))
    assert relative(found.items, src) == EXPECTED


def test_gitignore_is_honoured_in_a_git_repository(src):
    if shutil.which("git") is None:
        pytest.skip("git is not installed")
    (src / "generated").mkdir()
    (src / "generated" / "g.py").write_text(PANDAS)
    (src / "pkg" / "tmp_out.py").write_text(PANDAS)
    (src / ".gitignore").write_text("generated/\ntmp_*.py\n")
    before = relative(discover([str(src)], BatchOptions(mode="scan")).items, src)
    assert "generated/g.py" in before  # no repository yet: .gitignore means nothing
    subprocess.run(["git", "init", "-q", str(src)], check=True)
    after = relative(discover([str(src)], BatchOptions(mode="scan")).items, src)
    assert after == EXPECTED


def test_exclude_globs():
    assert excluded("pkg/sub/loops.py", ["pkg/sub/*"])
    assert excluded("pkg/sub/loops.py", ["sub"])
    assert excluded("pkg/sub/loops.py", ["*.py"])
    assert not excluded("pkg/sub/loops.py", ["tools"])


def test_convert_folder_mirrors_the_tree(src, tmp_path, capsys):
    before = snapshot(src)
    out, report = tmp_path / "out", tmp_path / "report.json"
    code = main(["convert", str(src), "-o", str(out), "--report", str(report), "-j", "1"])
    assert code == 1  # two files failed
    assert snapshot(src) == before  # nothing under SRC_DIR changed
    written = sorted(p.relative_to(out).as_posix() for p in out.rglob("*") if p.is_file())
    # converted and unchanged scripts mirrored; failed files and non-Python files are not
    assert written == ["main.py", "pkg/__init__.py", "pkg/clean.py", "pkg/sub/helpers.py",
                       "pkg/sub/loops.py", "tools/plain.py"]
    assert "pl.scan_csv(" in (out / "pkg" / "clean.py").read_text()
    assert "# TODO(porter): frame.iterrows" in (out / "pkg" / "sub" / "loops.py").read_text()
    assert (out / "tools" / "plain.py").read_bytes() == (src / "tools" / "plain.py").read_bytes()

    err = capsys.readouterr().err
    assert "8 files: 3 converted, 3 unchanged, 2 failed" in err
    assert "frame.iterrows" in err and "lowest confidence" in err
    assert f"failed: {src / 'broken.py'}: syntax error" in err
    assert f"failed: {src / 'latin.py'}: not UTF-8" in err

    data = json.loads(report.read_text())
    by_source = {Path(e["source"]).relative_to(src).as_posix(): e for e in data["files"]}
    assert sorted(by_source) == EXPECTED
    assert by_source["broken.py"]["status"] == "failed"
    assert "line 3" in by_source["broken.py"]["error"]
    assert by_source["tools/plain.py"]["status"] == "unchanged"
    assert by_source["main.py"]["output"] == str(out / "main.py")
    summary = data["summary"]
    assert (summary["files"], summary["files_converted"], summary["files_unchanged"],
            summary["files_failed"]) == (8, 3, 3, 2)
    assert summary["todo_by_key"] == {"frame.iterrows": 1}
    assert summary["keys"]["pd.read_csv"] == 3
    assert summary["lowest_confidence_files"]


def test_clean_folder_exits_0_and_fail_on_todo_exits_1(src, tmp_path, capsys):
    for bad in ("broken.py", "latin.py"):
        (src / bad).unlink()
    assert main(["convert", str(src), "-o", str(tmp_path / "a"), "-j", "1", "-q"]) == 0
    assert main(["convert", str(src), "-o", str(tmp_path / "b"), "-j", "1", "-q",
                 "--fail-on-todo"]) == 1
    assert main(["convert", str(src), "-o", str(tmp_path / "c"), "-j", "1", "-q",
                 "--exclude", "loops.py", "--fail-on-todo"]) == 0
    assert not (tmp_path / "c" / "pkg" / "sub" / "loops.py").exists()


def test_too_large_and_crashing_files_fail_alone(src, tmp_path, monkeypatch, capsys):
    (src / "big.py").write_text(PANDAS + "# padding\n" * 300)
    real = batch.convert_source

    def crash_on_clean(text, *, path=None, **kwargs):
        if path and path.endswith("clean.py"):
            raise RuntimeError("boom")
        return real(text, path=path, **kwargs)

    monkeypatch.setattr(batch, "convert_source", crash_on_clean)
    report = tmp_path / "r.json"
    # an internal error is status 2, never 1 (which a CI job reads as "TODOs remain")
    assert main(["scan", str(src), "-j", "1", "--max-size", "1KB", "--report", str(report), "-q"]) == 2
    entries = {Path(e["source"]).name: e for e in json.loads(report.read_text())["files"]}
    assert entries["big.py"]["status"] == "failed" and "too large" in entries["big.py"]["error"]
    assert entries["clean.py"]["error"] == "internal error: please report (RuntimeError: boom)"
    assert "RuntimeError: boom" in entries["clean.py"]["traceback"]
    assert entries["main.py"]["status"] == "converted"


def test_usage_errors_exit_2(src, tmp_path, capsys):
    assert main(["convert", str(src)]) == 2  # a folder needs -o or --in-place
    assert main(["convert", str(src), "-o", str(src)]) == 2
    assert main(["convert", str(src), "-o", str(tmp_path / "o"), "--in-place"]) == 2
    assert main(["scan", str(tmp_path / "missing")]) == 2
    for bad in (["--shard", "0/3"], ["--shard", "4/3"], ["--shard", "x"], ["-j", "0"],
                ["--max-size", "lots"]):
        with pytest.raises(SystemExit) as exc:
            main(["scan", str(src), *bad])
        assert exc.value.code == 2


def test_parallel_output_is_identical(src, tmp_path, capsys):
    for jobs in ("1", "2"):
        main(["convert", str(src), "-o", str(tmp_path / f"out{jobs}"), "-j", jobs,
              "--report", str(tmp_path / f"r{jobs}.json"), "-q"])
    assert snapshot(tmp_path / "out1") == snapshot(tmp_path / "out2")
    one, two = (json.loads((tmp_path / f"r{j}.json").read_text()) for j in "12")
    for entry in one["files"] + two["files"]:
        entry.pop("output")
    assert one == two


def test_in_place_rewrites_only_pandas_scripts(src, capsys):
    plain = (src / "tools" / "plain.py").stat().st_mtime_ns
    os.chmod(src / "main.py", 0o755)
    assert main(["convert", str(src), "--in-place", "-j", "1", "-q"]) == 1  # the two bad files
    assert "pl.scan_csv(" in (src / "main.py").read_text()
    assert os.stat(src / "main.py").st_mode & 0o777 == 0o755  # permissions kept
    assert (src / "tools" / "plain.py").stat().st_mtime_ns == plain
    assert (src / "broken.py").read_text().startswith("import pandas")
    assert not list(src.rglob("*.porter-tmp"))


def test_interrupted_in_place_write_leaves_no_partial_file(src, monkeypatch, capsys):
    original = (src / "main.py").read_bytes()

    def half_then_fail(handle, data):
        handle.write(data[: len(data) // 2])
        raise OSError(28, "No space left on device")

    monkeypatch.setattr(batch, "_fill", half_then_fail)
    results = batch.run_batch([str(src)], batch.BatchOptions(in_place=True, jobs=1))
    assert (src / "main.py").read_bytes() == original
    assert not [p for p in src.rglob("*") if p.name.endswith(".porter-tmp")]
    entry = next(r for r in results.results if r.source.endswith("main.py"))
    assert entry.status == "failed" and "No space left on device" in (entry.error or "")


def test_shards_partition_the_file_list(src):
    everything = discover([str(src)], BatchOptions(mode="scan")).items
    for n in (1, 2, 3, 5, 11):
        slices = [discover([str(src)], BatchOptions(mode="scan", shard=(k, n))).items
                  for k in range(1, n + 1)]
        union = [i for s in slices for i in s]
        assert sorted(union, key=lambda i: i.source) == everything
        assert len(union) == len(set(union))  # pairwise disjoint
        again = [discover([str(src)], BatchOptions(mode="scan", shard=(k, n))).items
                 for k in range(1, n + 1)]
        assert again == slices  # deterministic
    assert parse_shard("2/3") == (2, 3)
    with pytest.raises(ValueError):
        shard([1, 2], 3, 2)


def test_report_merge(src, tmp_path, capsys):
    paths = []
    for k in (1, 2, 3):
        path = tmp_path / f"shard{k}.json"
        main(["scan", str(src), "--shard", f"{k}/3", "-j", "1", "-q", "--report", str(path)])
        paths.append(str(path))
    whole = tmp_path / "whole.json"
    main(["scan", str(src), "-j", "1", "-q", "--report", str(whole)])
    merged = tmp_path / "merged.json"
    assert main(["report", "merge", *paths, "-o", str(merged)]) == 0
    merged_data, whole_data = json.loads(merged.read_text()), json.loads(whole.read_text())
    assert sorted(e["source"] for e in merged_data["files"]) == [e["source"] for e in whole_data["files"]]
    assert merged_data["summary"] == whole_data["summary"]
    assert main(["report", "merge", paths[0], paths[0], "-o", str(tmp_path / "dup.json")]) == 2
    assert "also in" in capsys.readouterr().err


def test_scan_writes_nothing_and_reports_readiness(src, capsys):
    before = snapshot(src.parent)
    assert main(["scan", str(src), "-j", "1"]) == 1  # failed files
    assert snapshot(src.parent) == before
    out = capsys.readouterr().out
    assert f"{src / 'pkg' / 'sub' / 'loops.py'}: 2 sites, 1 would convert, 0 handover, 1 TODO (frame.iterrows)" in out
    assert "uses frame.iterrows, pd.read_csv" in out
    assert "pandas APIs used" in out and "pd.read_csv" in out
    assert "total: 8 files: 3 would convert, 3 unchanged, 2 failed" in out


def test_check_exit_codes(src, tmp_path, capsys):
    plain, loops = src / "tools" / "plain.py", src / "pkg" / "sub" / "loops.py"
    assert main(["scan", "--check", "-q", str(plain), str(src / "pkg" / "__init__.py")]) == 0
    assert main(["scan", "--check", "-q", str(plain), str(loops)]) == 1
    assert main(["convert", "--check", "-q", str(plain)]) == 0
    assert main(["convert", "--check", "-q", str(src / "main.py")]) == 1
    # a converted script that still carries a TODO marker does not pass the gate either
    out = tmp_path / "out"
    main(["convert", str(src), "-o", str(out), "-j", "1", "-q"])
    assert main(["scan", "--check", "-q", str(out / "main.py")]) == 0
    assert main(["scan", "--check", str(out / "pkg" / "sub" / "loops.py")]) == 1
    assert "TODO(porter) markers" in capsys.readouterr().err
    assert not (src / "out").exists()


def test_config_from_pyproject_and_the_command_line_overrides_it(src, tmp_path, monkeypatch, capsys):
    for bad in ("broken.py", "latin.py"):
        (src / bad).unlink()
    project = tmp_path / "project"
    (project / "deep").mkdir(parents=True)
    (project / "pyproject.toml").write_text(
        '[tool.porter]\nmin-confidence = 0.99\nexclude = ["tools"]\njobs = 1\nfail-on-todo = true\n')
    monkeypatch.chdir(project / "deep")  # found by walking up
    report = tmp_path / "r.json"
    assert main(["scan", str(src), "-q", "--report", str(report)]) == 1  # fail-on-todo
    data = json.loads(report.read_text())
    assert not any("tools" in e["source"] for e in data["files"])
    assert "pd.read_csv" in data["summary"]["todo_by_key"]  # 0.95 < 0.99: a TODO
    assert main(["scan", str(src), "-q", "--no-fail-on-todo", "--min-confidence", "0",
                 "--report", str(report)]) == 0
    data = json.loads(report.read_text())
    assert data["summary"]["todo_by_key"] == {"frame.iterrows": 1}
    (project / "pyproject.toml").write_text('[tool.porter]\nspeed = "fast"\n')
    assert main(["scan", str(src), "-q"]) == 2
    assert "unknown key" in capsys.readouterr().err


def test_pre_commit_hook_definition():
    text = (Path(__file__).resolve().parents[1] / ".pre-commit-hooks.yaml").read_text()
    assert "id: porter-scan" in text and "porter scan --check" in text
    assert "language: python" in text and "types: [python]" in text


def test_progress_bar_only_on_a_terminal(capsys):
    with batch._progress_bar(3, True) as bar:
        assert bar.disable  # stderr is captured here, not a terminal


def test_notebooks_in_a_folder_are_converted_when_supported(src, tmp_path, capsys):
    pytest.importorskip("porter.notebooks")
    nbformat = pytest.importorskip("nbformat")
    notebook = nbformat.v4.new_notebook()
    notebook.cells = [nbformat.v4.new_markdown_cell("# kg"),
                      nbformat.v4.new_code_cell("import pandas as pd\ndf = pd.read_csv('a.csv')"),
                      nbformat.v4.new_code_cell("df = df.sort_values('kg')")]
    nbformat.write(notebook, src / "pkg" / "explore.ipynb")
    out = tmp_path / "out"
    main(["convert", str(src), "-o", str(out), "-j", "1", "-q"])
    converted = nbformat.read(out / "pkg" / "explore.ipynb", as_version=4)
    assert [c.cell_type for c in converted.cells] == ["markdown", "code", "code"]
    assert "pl.scan_csv(" in converted.cells[1].source
