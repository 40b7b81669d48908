"""Converting Jupyter notebooks (.ipynb): the code cells, in order, as one program.

The code cells are joined into one module, with a separator comment before each cell, so names
flow between cells the way they do when the notebook runs top to bottom. IPython magics and
shell lines (``%``, ``!``, ``?`` help, ``x = !cmd``) become placeholders that parse as Python and
are restored verbatim afterwards; a cell that starts with a cell magic (``%%time``...) is left
as it is. The converted module is split back at the separators: markdown and raw cells, cell
ids and all metadata stay as they were; a code cell whose text changed loses its outputs and
execution count (they are stale), the others keep them. Sites point to the cell (its position
in the notebook, counting from 1, markdown cells included) and the line within it.
"""

from __future__ import annotations

import ast
from dataclasses import replace
from pathlib import Path
import re

import libcst as cst
import nbformat

from porter.api import convert_source, read_text
from porter.model import ConversionError, FileResult, Options, Site

MAGIC_START = re.compile(r"\s*(?:[%!?]|\w[\w.]*\s*=\s*[%!])")
HELP_LINE = re.compile(r"\s*[\w.\[\]]+\?{1,2}\s*$")


def convert_notebook(path: str | Path, options: Options | None = None, *,
                     output: str | None = None) -> FileResult:
    """Convert the notebook at ``path``; raises ConversionError for a file that is not one."""
    path = Path(path)
    return convert_notebook_text(read_text(path), str(path), options, output=output)


def convert_notebook_text(text: str, path: str | None, options: Options | None = None, *,
                          output: str | None = None) -> FileResult:
    """Convert the JSON text of a notebook; ``converted_text`` is the notebook's JSON."""
    notebook = _read(text, path)
    program = _Program(notebook.cells, text, path)
    result = convert_source(program.module, path=path, options=options)
    new_sources = program.split(result.converted_text)
    changed = False
    for index, source in new_sources.items():
        cell = notebook.cells[index]
        if source != cell.source:
            cell.source = source
            cell.outputs = []
            cell.execution_count = None
            changed = True
    sites = [program.site_in_cell(site) for site in result.sites]
    if changed:
        sites += _cell_magic_todos(notebook.cells)
    return FileResult(
        source=path or "<stdin>",
        output=output,
        original_text=text,
        converted_text=nbformat.writes(notebook, version=nbformat.NO_CONVERT) if changed else text,
        sites=tuple(sites),
        status="converted" if changed else "unchanged",
    )


def _read(text: str, path: str | None) -> nbformat.NotebookNode:
    try:
        notebook = nbformat.reads(text, as_version=nbformat.NO_CONVERT)
    except Exception as exc:  # nbformat raises JSON, key and version errors alike
        raise ConversionError(f"not a Jupyter notebook: {_reason(exc)}", path) from None
    if not isinstance(notebook.get("nbformat"), int):
        raise ConversionError("not a Jupyter notebook: no nbformat version", path)
    if notebook.get("nbformat") != 4:
        raise ConversionError(f"nbformat {notebook.get('nbformat')} is not supported "
                              "(version 4 notebooks are)", path)
    try:
        nbformat.validate(notebook)
    except nbformat.ValidationError as exc:
        raise ConversionError(f"not a valid notebook: {_reason(exc)}", path) from None
    return notebook


def _reason(exc: Exception) -> str:
    lines = str(exc).strip().splitlines()
    return lines[0] if lines else type(exc).__name__


class _Program:
    """The code cells of a notebook as one module, and the way back to the cells."""

    def __init__(self, cells: list[nbformat.NotebookNode], text: str, path: str | None):
        self.token = _unused_token(text)
        self.path = path
        self.magics: list[str] = []
        self.cells: list[int] = []  # notebook index of each cell in the module
        self.first_lines: list[int] = []  # module line of each cell's separator
        self.trailing_newline: list[bool] = []
        parts: list[str] = []
        line = 1
        for index, cell in enumerate(cells):
            if cell.cell_type != "code" or _is_cell_magic(cell.source):
                continue
            code = self._hide_magics(cell.source)
            _check_syntax(code, index, path)
            if code and not code.endswith("\n"):
                code += "\n"
            self.cells.append(index)
            self.first_lines.append(line)
            self.trailing_newline.append(cell.source.endswith("\n"))
            parts.append(f"{self._separator(len(self.cells) - 1)}\n{code}")
            line += 1 + code.count("\n")
        parts.append(f"{self._separator(len(self.cells))}\n")
        self.module = "".join(parts)
        self.originals = [cells[i].source for i in self.cells]

    def _separator(self, number: int) -> str:
        return f"# {self.token}:cell:{number}"

    def _hide_magics(self, source: str) -> str:
        """Replace each magic or shell line by a placeholder of the same indentation."""
        out: list[str] = []
        scanner = _Scanner()
        continued_magic = False
        for line in source.splitlines(keepends=True):
            body = line.rstrip("\r\n")
            if continued_magic or (scanner.at_statement_start() and _is_magic(body)):
                continued_magic = body.endswith("\\")
                indent = body[: len(body) - len(body.lstrip())]
                marker = f"# {self.token}:magic:{len(self.magics)}"
                self.magics.append(body)
                out.append(f"{indent}pass  {marker}" if indent else marker)
                out.append(line[len(body):])
            else:
                scanner.feed(line)
                out.append(line)
        return "".join(out)

    def split(self, converted: str) -> dict[int, str]:
        """The new source of each converted cell, by notebook index."""
        converted = re.sub(rf"^[ \t]*(?:pass  )?# {self.token}:magic:(\d+)(?=\r?$)",
                           lambda m: self.magics[int(m.group(1))], converted, flags=re.M)
        pieces = re.split(rf"^# {self.token}:cell:(\d+)\r?\n", converted, flags=re.M)
        numbers = [int(n) for n in pieces[1::2]]
        if numbers != list(range(len(self.cells) + 1)) or self.token in "".join(pieces[::2]):
            raise ConversionError("porter lost the boundaries between cells (a bug in porter)",
                                  self.path)
        prefix, bodies, tail = pieces[0], pieces[2::2][:-1], pieces[-1]
        if bodies and tail.strip():  # nothing should follow the last separator; keep it if so
            bodies[-1] += tail
        sources: dict[int, str] = {}
        for number, body in enumerate(bodies):
            original = self.originals[number]
            if number == 0:
                body = prefix + body
            if not self.trailing_newline[number] and body.endswith("\n"):
                body = body[:-1]
            if body != original and not original.startswith("\n"):
                body = body.lstrip("\n")
            sources[self.cells[number]] = body
        return sources

    def site_in_cell(self, site: Site) -> Site:
        """The site with its line counted within its cell, and the cell set."""
        number = max((n for n, first in enumerate(self.first_lines) if first < site.line), default=0)
        first = self.first_lines[number] if self.first_lines else 0
        return replace(site, line=max(1, site.line - first), end_line=max(1, site.end_line - first),
                       cell=self.cells[number] + 1 if self.cells else None)


class _Scanner:
    """Tracks brackets, strings and line continuations, to tell where a statement starts."""

    def __init__(self) -> None:
        self.depth = 0
        self.quote = ""  # the open string's quote: ', ", ''' or \"\"\"
        self.continued = False

    def at_statement_start(self) -> bool:
        return self.depth == 0 and not self.quote and not self.continued

    def feed(self, line: str) -> None:
        i, body = 0, line.rstrip("\r\n")
        while i < len(body):
            if self.quote:
                if body[i] == "\\":
                    i += 2
                    continue
                if body.startswith(self.quote, i):
                    i += len(self.quote)
                    self.quote = ""
                    continue
                i += 1
                continue
            char = body[i]
            if char == "#":
                break
            if char in "'\"":
                self.quote = body[i:i + 3] if body[i:i + 3] in ("'''", '"""') else char
                i += len(self.quote)
                continue
            if char in "([{":
                self.depth += 1
            elif char in ")]}":
                self.depth = max(0, self.depth - 1)
            i += 1
        self.continued = body.endswith("\\") and not self.quote
        if self.quote in ("'", '"'):  # a one-line string cannot run on; do not let it stick
            self.quote = ""


# cell magics whose body is Python: it runs against the converted names, untouched
PYTHON_CELL_MAGICS = ("%%time", "%%timeit", "%%capture", "%%prun")
CELL_MAGIC_TODO = ("a cell under a cell magic is left as written: its pandas code now meets the "
                   "Polars frames of the converted cells; port it by hand")


def _cell_magic_todos(cells: list[nbformat.NotebookNode]) -> list[Site]:
    """A TODO for each Python cell-magic cell of a converted notebook (porter does not rewrite
    them, and the frames they use are LazyFrames now)."""
    todos = []
    for number, cell in enumerate(cells, start=1):
        if cell.cell_type == "code" and _is_cell_magic(cell.source) and \
                cell.source.lstrip().split(maxsplit=1)[0] in PYTHON_CELL_MAGICS:
            lines = cell.source.count("\n") + 1
            todos.append(Site(1, lines, "notebook.cell_magic", "todo", "todo", 0.0,
                              CELL_MAGIC_TODO, cell=number))
    return todos


def _is_magic(line: str) -> bool:
    return bool(MAGIC_START.match(line) or HELP_LINE.match(line))


def _is_cell_magic(source: str) -> bool:
    return source.lstrip().startswith("%%")


def _check_syntax(code: str, index: int, path: str | None) -> None:
    """Raise ConversionError naming the cell (and the line in it) if the cell does not parse."""
    try:
        cst.parse_module(code)
    except cst.ParserSyntaxError as exc:
        message = exc.message if hasattr(exc, "message") else str(exc)
        line, column = exc.raw_line, exc.raw_column + 1
        try:  # Python's own parser places most errors more precisely
            compile(code, "<cell>", "exec", flags=ast.PyCF_ONLY_AST, dont_inherit=True)
        except SyntaxError as error:
            message, line, column = error.msg, error.lineno or line, error.offset or column
        raise ConversionError(f"syntax error in cell {index + 1}: {message}", path,
                              line, column) from None


def _unused_token(text: str) -> str:
    number = 0
    while f"porter-nb{number}" in text:
        number += 1
    return f"porter-nb{number}"
