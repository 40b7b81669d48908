"""Notebook conversion: the code cells as one program, everything else kept as it was.

The notebook is built with nbformat; pandas is the reference in the differential check, which
runs the original cells (magics removed) with pandas and the converted cells with Polars.
"""

from __future__ import annotations

import copy
import json
from pathlib import Path

import nbformat
from nbformat.v4 import new_code_cell, new_markdown_cell, new_notebook, new_output, new_raw_cell
import pytest

from porter.model import ConversionError, Options
from porter.notebooks import convert_notebook, convert_notebook_text
from support import assert_same_table, run

SALES_CSV = "region,kind,amount\nNorth,a,1.5\nSouth,b,4.0\nNorth,b,2.5\nEast,a,3.0\nSouth,a,0.5\n"

PIVOT = "wide = sales.pivot_table(index='region', columns='kind', values='amount', aggfunc='sum')"
CELLS = [
    new_markdown_cell("# Sales\nA *short* report.\n", metadata={"tags": ["intro"]}),
    new_code_cell("%matplotlib inline\nimport pandas as pd\n!pip list\n", execution_count=1,
                  outputs=[new_output("stream", name="stdout", text="pandas 3\n")],
                  metadata={"tags": ["setup"]}),
    new_code_cell("sales = pd.read_csv('sales.csv')\n", execution_count=2,
                  outputs=[new_output("execute_result", data={"text/plain": "frame"}, execution_count=2)]),
    new_markdown_cell("## Totals"),
    new_code_cell("%%time\nn = 1 + 1\n", execution_count=3,
                  outputs=[new_output("stream", name="stdout", text="Wall time: 1 ms\n")]),
    new_code_cell("print('hello')", execution_count=4,
                  outputs=[new_output("stream", name="stdout", text="hello\n")]),
    # no trailing newline; uses the frame read two code cells earlier
    new_code_cell("totals = sales.groupby('region')['amount'].sum().reset_index()\n"
                  "big = sales[sales['amount'] > 2]\n" + PIVOT,
                  execution_count=5, outputs=[new_output("stream", name="stdout", text="x\n")]),
    new_raw_cell("raw text, kept"),
]


@pytest.fixture()
def notebook(tmp_path: Path) -> Path:
    nb = new_notebook(cells=copy.deepcopy(CELLS), metadata={
        "kernelspec": {"name": "python3", "display_name": "Python 3", "language": "python"},
        "language_info": {"name": "python"}})
    path = tmp_path / "report.ipynb"
    path.write_text(nbformat.writes(nb), encoding="utf-8")
    (tmp_path / "sales.csv").write_text(SALES_CSV, encoding="utf-8")
    return path


def read(text: str) -> nbformat.NotebookNode:
    return nbformat.reads(text, as_version=nbformat.NO_CONVERT)


def test_round_trip_keeps_cells_ids_and_metadata(notebook: Path) -> None:
    result = convert_notebook(notebook)
    before, after = read(notebook.read_text()), read(result.converted_text)
    assert result.status == "converted"
    assert after.nbformat == before.nbformat and after.nbformat_minor == before.nbformat_minor
    assert after.metadata == before.metadata
    assert [c.cell_type for c in after.cells] == [c.cell_type for c in before.cells]
    assert [c.id for c in after.cells] == [c.id for c in before.cells]
    assert [c.metadata for c in after.cells] == [c.metadata for c in before.cells]
    for old, new in zip(before.cells, after.cells):
        if old.cell_type != "code":
            assert new.source == old.source  # markdown and raw cells byte-identical


def test_code_converted_and_magics_untouched(notebook: Path) -> None:
    cells = read(convert_notebook(notebook).converted_text).cells
    setup = cells[1].source
    assert setup.startswith("%matplotlib inline\nimport polars as pl\n")
    assert setup.endswith("\n!pip list\n")
    assert "PANDAS_NA_VALUES = [" in setup  # the constant lands in the cell with the imports
    assert "pl.scan_csv('sales.csv'" in cells[2].source
    assert cells[4].source == CELLS[4].source  # the %%time cell as it was
    assert cells[5].source == CELLS[5].source
    assert "big = sales.filter(pl.col('amount') > 2)" in cells[6].source
    assert not cells[6].source.endswith("\n")  # the cell still ends without a newline


def test_outputs_cleared_only_where_changed(notebook: Path) -> None:
    cells = read(convert_notebook(notebook).converted_text).cells
    for index in (1, 2, 6):
        assert cells[index].outputs == [] and cells[index].execution_count is None
    for index in (4, 5):
        assert cells[index].outputs == CELLS[index].outputs
        assert cells[index].execution_count == CELLS[index].execution_count


def test_sites_point_to_cell_and_line(notebook: Path) -> None:
    result = convert_notebook(notebook)
    todo, magic = sorted(result.todos, key=lambda s: s.key)
    assert (todo.key, todo.cell, todo.line, todo.end_line) == ("frame.pivot_table", 7, 3, 3)
    # the %%time cell keeps its pandas code while the frames became Polars: a TODO says so
    assert magic.key == "notebook.cell_magic" and magic.status == "todo"
    assert read(notebook.read_text()).cells[magic.cell - 1].source.startswith("%%time")
    assert todo.to_json()["cell"] == 7
    read_csv = next(s for s in result.sites if s.key == "pd.read_csv")
    assert (read_csv.cell, read_csv.line) == (3, 1)
    groupby = next(s for s in result.sites if s.key == "frame.groupby")
    assert (groupby.cell, groupby.line) == (7, 1)
    cells = read(result.converted_text).cells
    assert "# TODO(porter): frame.pivot_table" in cells[6].source


def test_converting_again_changes_nothing(notebook: Path) -> None:
    once = convert_notebook(notebook)
    twice = convert_notebook_text(once.converted_text, str(notebook), Options())
    assert twice.status == "unchanged"
    assert twice.converted_text == once.converted_text


def test_notebook_without_pandas_is_unchanged(tmp_path: Path) -> None:
    text = nbformat.writes(new_notebook(cells=[new_code_cell("%load_ext autoreload\nx = 1")]))
    result = convert_notebook_text(text, "plain.ipynb", None)
    assert result.status == "unchanged" and result.converted_text == text and result.sites == ()


def test_magic_lookalikes_in_strings_and_brackets_stay_code() -> None:
    source = ('import pandas as pd\nnote = """\n%not a magic\n"""\nx = (7\n% 2)\n'
              'for i in range(2):\n    !echo {i}\npd.read_csv?\nfiles = !ls\n'
              "df = pd.read_csv('a.csv')")
    text = nbformat.writes(new_notebook(cells=[new_code_cell(source)]))
    converted = read(convert_notebook_text(text, "m.ipynb", None).converted_text).cells[0].source
    for line in ('%not a magic', '% 2)', '    !echo {i}', 'pd.read_csv?', 'files = !ls'):
        assert f"\n{line}\n" in converted
    assert "pl.scan_csv('a.csv'" in converted


def test_unreadable_notebooks_raise(tmp_path: Path) -> None:
    bad = tmp_path / "bad.ipynb"
    bad.write_text("{not json", encoding="utf-8")
    with pytest.raises(ConversionError, match="not a Jupyter notebook") as info:
        convert_notebook(bad)
    assert info.value.path == str(bad)
    with pytest.raises(ConversionError, match="not a Jupyter notebook"):
        convert_notebook_text(json.dumps({"cells": []}), "x.ipynb", None)


def test_syntax_error_names_the_cell() -> None:
    nb = new_notebook(cells=[new_markdown_cell("m"), new_code_cell("x = 1"),
                             new_code_cell("import pandas as pd\ndef f(:\n    pass")])
    with pytest.raises(ConversionError, match="cell 3") as info:
        convert_notebook_text(nbformat.writes(nb), "broken.ipynb", None)
    assert info.value.line == 2


def _program(nb: nbformat.NotebookNode) -> str:
    """The code cells as a script the way they run, without magics and cell-magic cells."""
    lines = []
    for cell in nb.cells:
        if cell.cell_type == "code" and not cell.source.startswith("%%"):
            lines += [l for l in cell.source.splitlines() if not l.lstrip().startswith(("%", "!"))]
    return "\n".join(lines) + "\n"


def test_differential_pandas_vs_converted(notebook: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    monkeypatch.chdir(notebook.parent)
    result = convert_notebook(notebook)
    expected = run(_program(read(notebook.read_text())))
    actual = run(_program(read(result.converted_text)))
    assert "pl.scan_csv" in _program(read(result.converted_text))
    assert_same_table(expected["totals"], actual["totals"])
    assert_same_table(expected["big"], actual["big"])
    assert_same_table(expected["wide"], actual["wide"])
