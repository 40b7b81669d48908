"""The review page: its model (alignment, placement, folding, levels) and its rendering."""

from __future__ import annotations

import re

from markupsafe import escape
import pytest

from porter.api import convert_source
from porter.model import FileResult, Site
from porter.review import render_review
from porter.review.model import align, build_page, confidence_level, fold
from porter.verify.model import Comparison, OutputResult, SideRun, VerifyResult

BEFORE = """\
import pandas as pd

df = pd.read_csv("in.csv")
rows = [r for _, r in df.iterrows()]
df.to_csv("out.csv", index=False)
"""

AFTER = """\
import polars as pl

df = pl.scan_csv("in.csv")
# TODO(porter): frame.iterrows: row loops have no lazy form
rows = [r for _, r in df.collect().to_pandas().iterrows()]
df.sink_csv("out.csv")
"""

SITES = (
    Site(3, 3, "pd.read_csv", "read-csv", "converted", 0.95, "types inferred alike"),
    Site(4, 4, "frame.iterrows", "todo", "todo", 0.0, "row loops have no lazy form"),
    Site(5, 5, "frame.to_csv", "to-csv", "converted", 0.85, "booleans written true/false"),
)


def result(before: str = BEFORE, after: str = AFTER, sites=SITES, source: str = "job.py") -> FileResult:
    return FileResult(source, None, before, after, tuple(sites))


def rows_of(page, number: int = 0):
    return page.files[number].blocks[0].rows


def pairs(rows):
    return [(r.left.number if r.left else None, r.right.number if r.right else None) for r in rows]


def test_alignment_pairs_changed_lines_and_gives_todo_comments_their_own_row():
    rows = align(BEFORE, AFTER)
    assert pairs(rows) == [(1, 1), (2, 2), (3, 3), (None, 4), (4, 5), (5, 6)]
    assert [r.kind for r in rows] == ["replace", "equal", "replace", "insert", "replace", "replace"]
    assert rows[3].todo_comment and not any(r.todo_comment for r in rows if r is not rows[3])


def test_alignment_of_an_inserted_preamble_keeps_the_statement_beside_its_original():
    before = "import pandas as pd\n\ndf = pd.read_csv('a.csv')\nprint(df)\n"
    after = ("import polars as pl\n\nNA = [\n    'NA',\n]\n\n"
             "df = pl.scan_csv('a.csv', null_values=NA)\nprint(df)\n")
    rows = align(before, after)
    by_left = {r.left.number: r.right.number for r in rows if r.left and r.right}
    assert by_left[3] == 7 and by_left[4] == 8
    assert [r.right.number for r in rows if r.left is None] == [3, 4, 5, 6]
    # every line of both texts appears exactly once, in order
    assert [r.left.number for r in rows if r.left] == [1, 2, 3, 4]
    assert [r.right.number for r in rows if r.right] == list(range(1, 9))


def test_sites_are_placed_on_their_source_line_and_the_converted_row():
    page = build_page([result()])
    rows = rows_of(page)
    by_key = {s.key: s for s in page.files[0].sites}
    assert by_key["pd.read_csv"].converted_line == 3
    assert by_key["frame.iterrows"].converted_line == 5
    assert by_key["frame.to_csv"].converted_line == 6
    for site in by_key.values():
        (left_row,) = [r for r in rows if site in r.left_sites]
        (right_row,) = [r for r in rows if site in r.right_sites]
        assert left_row.left.number == site.line
        assert right_row.right.number == site.converted_line


def test_a_todo_is_anchored_on_its_comment_row_with_the_mapping_advice():
    page = build_page([result()])
    (todo,) = page.todos
    assert todo.id == "todo-1" and todo.key == "frame.iterrows" and todo.line == 4
    assert todo.converted_line == 4  # the `# TODO(porter)` comment
    (row,) = [r for r in rows_of(page) if r.todos]
    assert row.todo_comment and row.right.text.startswith("# TODO(porter)")
    assert todo.advice  # from the mapping table


def test_a_todo_marker_without_a_site_is_still_listed():
    after = AFTER.replace("frame.iterrows: row", "frame.iterrows: row", 1)
    sites = [s for s in SITES if s.status != "todo"]
    page = build_page([result(after=after, sites=sites)])
    (todo,) = page.todos
    assert todo.key == "frame.iterrows" and todo.converted_line == 4 and todo.line is None


def test_mapping_differences_are_attached_to_sites():
    page = build_page([result()])
    read_csv = next(s for s in page.files[0].sites if s.key == "pd.read_csv")
    assert read_csv.handles and read_csv.key in read_csv.tooltip


def test_what_a_rule_handles_is_written_once_per_key():
    # three files using read_csv: the handles text appears once, each site links to it
    html = render_review([result(), result(), result()])
    handles = build_page([result()]).files[0].sites[0].handles
    assert handles and html.count(f"<li>{escape(handles[0])}</li>") == 1  # (as the page escapes it)
    assert 'href="#key-pd.read_csv"' in html and 'id="key-pd.read_csv"' in html


@pytest.mark.parametrize("confidence, level", [(1.0, "high"), (0.95, "high"), (0.949, "medium"),
                                               (0.8, "medium"), (0.79, "low"), (0.0, "low")])
def test_confidence_levels(confidence, level):
    assert confidence_level(confidence) == level


def test_low_threshold_marks_converted_sites_only():
    page = build_page([result()], low=0.9)
    low = {s.key for s in page.files[0].sites if s.low}
    assert low == {"frame.to_csv"}  # 0.85; the TODO is a TODO, not a low-confidence rewrite
    assert not any(s.low for s in build_page([result()], low=0.5).files[0].sites)


def test_long_unchanged_stretches_fold_keeping_context():
    middle = "".join(f"x{i} = {i}\n" for i in range(20))
    before = "import pandas as pd\n" + middle + "df = pd.read_csv('a.csv')\n"
    after = "import polars as pl\n" + middle + "df = pl.scan_csv('a.csv')\n"
    chunks = fold(align(before, after), context=3)
    assert [c.folded for c in chunks] == [False, True, False]
    assert len(chunks[1].rows) == 20 - 6
    assert [r.left.number for r in chunks[0].rows] == [1, 2, 3, 4]
    assert chunks[2].rows[0].left.number == 19


def test_short_unchanged_stretches_and_rows_with_sites_stay_open():
    before = "import pandas as pd\na = 1\nb = 2\ndf = pd.read_csv('a.csv')\n"
    after = "import polars as pl\na = 1\nb = 2\ndf = pl.scan_csv('a.csv')\n"
    assert not any(c.folded for c in fold(align(before, after)))
    rows = align(before * 1, before)  # all equal, but a site keeps its row visible
    rows[1].left_sites.append(object())  # type: ignore[arg-type]
    assert all(not c.folded or rows[1] not in c.rows for c in fold(rows, context=0))


def test_page_totals_come_from_the_report_model():
    page = build_page([result(), result(source="other.py")])
    assert page.summary["files"] == 2 and page.summary["todo"] == 2
    assert page.summary["todo_by_key"] == {"frame.iterrows": 2}
    assert page.files[1].summary["lowest_confidence"] == 0.85
    assert [t.id for t in page.todos] == ["todo-1", "todo-2"] and page.folder


# ------------------------------------------------------------------ rendering

EVIL = 'import pandas as pd\n\ndf = pd.read_csv("a.csv")\nx = "</script><script>alert(1)</script>"\n'


def test_page_is_self_contained():
    html = render_review([result()])
    assert "<script src" not in html.lower()
    assert not re.search(r"""(?:src|href)\s*=\s*["']?(?:https?:)?//""", html, re.I)
    assert "@import" not in html and "url(http" not in html
    assert "http://" not in html and "https://" not in html
    assert html.count("<script>") == 1 and html.count("</script>") == 1


def test_user_code_is_escaped():
    converted = convert_source(EVIL, path="evil.py")
    html = render_review([converted])
    assert "<script>alert(1)" not in html and "</script><script>" not in html
    assert "&lt;/script&gt;&lt;script&gt;alert(1)&lt;/script&gt;" in html
    assert html.count("<script>") == 1


def test_paths_and_messages_are_escaped():
    evil_site = Site(3, 3, "pd.read_csv", "read-csv", "converted", 0.5, "<b onmouseover=x>")
    html = render_review([result(sites=[evil_site], source="<img src=x>.py")])
    assert "<img src=x>" not in html and "<b onmouseover" not in html
    assert "&lt;img src=x&gt;.py" in html


def test_page_structure_for_a_single_file():
    html = render_review([result()], low=0.9)
    assert 'id="file-index"' not in html
    assert '<ol id="todo-list">' in html and 'href="#todo-1"' in html
    assert re.search(r'<div class="row [^"]*todo-row[^"]*" id="todo-1">', html)
    assert html.count('class="code pane-original"') == html.count('class="code pane-converted"')
    assert 'class="site status-converted level-medium low-confidence"' in html
    assert "row loops have no lazy form" in html
    assert '<span class="k">import</span>' in html or '<span class="kn">import</span>' in html


def test_folder_page_has_the_sortable_filterable_index():
    html = render_review([result(), result(source="b.py"), FileResult("c.py", None, "", "", (), "unchanged")])
    assert '<table id="file-index">' in html and '<input id="filter"' in html
    index = html[html.index('<table id="file-index">'):]
    index = index[:index.index("</table>")]
    assert index.count("<th ") == 6 and index.count('href="#file-') == 3
    assert 'id="todo-keys"' in html and "frame.iterrows" in html


def test_verdicts_are_shown():
    run = SideRun(0, 1.25, 120.0)
    verdict = VerifyResult("different", (
        OutputResult("out.csv", "file", Comparison("different", "2 cells differ", 2,
                                                   ((3, ("a", 1), ("a", 2)),))),
        OutputResult("df", "variable", Comparison("same"))), run, SideRun(0, 0.5, 60.5))
    html = render_review([result()], verdicts={"job.py": verdict})
    assert "verdict-different" in html and "1.25 s" in html and "60.5 MiB" in html
    assert "first-rows" in html and "a, 2" in html


# ------------------------------------------------------------------ the command line

def test_review_command_writes_only_the_page(tmp_path, capsys):
    from porter.cli import main
    src = tmp_path / "src"
    (src / "sub").mkdir(parents=True)
    (src / "a.py").write_text(EVIL)
    (src / "sub" / "b.py").write_text(BEFORE)
    (src / "plain.py").write_text("x = 1\n")
    before = sorted(p for p in tmp_path.rglob("*"))
    out = tmp_path / "review.html"
    assert main(["review", str(src), "-o", str(out), "-q", "-j", "1"]) == 0
    assert sorted(p for p in tmp_path.rglob("*")) == sorted(before + [out])
    html = out.read_text()
    assert '<table id="file-index">' in html and "&lt;/script&gt;" in html
    assert main(["review", str(src / "a.py"), "-o", str(tmp_path / "one.html"), "-q"]) == 0
    assert 'id="file-index"' not in (tmp_path / "one.html").read_text()


def test_review_command_bad_input(tmp_path, capsys):
    from porter.cli import main
    assert main(["review", str(tmp_path / "missing.py"), "-o", str(tmp_path / "r.html")]) == 2
    script = tmp_path / "a.py"
    script.write_text(BEFORE)
    assert main(["review", str(script), "--verify", "-o", str(tmp_path / "r.html")]) == 2
    assert "--data" in capsys.readouterr().err
    with pytest.raises(SystemExit) as exc:
        main(["review", str(script), "--low", "2", "-o", str(tmp_path / "r.html")])
    assert exc.value.code == 2
    assert not (tmp_path / "r.html").exists()


def test_convert_html_for_a_file_and_a_folder(tmp_path):
    from porter.cli import main
    src = tmp_path / "src"
    src.mkdir()
    (src / "a.py").write_text(BEFORE)
    assert main(["convert", str(src / "a.py"), "-o", str(tmp_path / "a_pl.py"), "-q",
                 "--html", str(tmp_path / "a.html")]) == 0
    assert "pane-converted" in (tmp_path / "a.html").read_text()
    assert main(["convert", str(src), "-o", str(tmp_path / "out"), "-q", "-j", "1",
                 "--html", str(tmp_path / "f.html")]) == 0
    html = (tmp_path / "f.html").read_text()
    assert '<table id="file-index">' in html and "frame.iterrows" in html


def test_a_notebook_is_shown_cell_by_cell():
    nbformat = pytest.importorskip("nbformat")
    from porter.notebooks import convert_notebook_text
    nb = nbformat.v4.new_notebook()
    nb.cells = [nbformat.v4.new_markdown_cell("# notes"),
                nbformat.v4.new_code_cell("import pandas as pd\ndf = pd.read_csv('a.csv')"),
                nbformat.v4.new_code_cell("rows = [r for _, r in df.iterrows()]")]
    converted = convert_notebook_text(nbformat.writes(nb), "nb.ipynb")
    page = build_page([converted])
    blocks = page.files[0].blocks
    assert [b.cell for b in blocks] == [2, 3]
    (todo,) = page.todos
    assert todo.cell == 3 and todo.key == "frame.iterrows"
    assert any(r.todos for r in blocks[1].rows)
