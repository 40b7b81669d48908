"""Converting one script: parse → analyse → translate → emit. The CLI and batch call this."""

from __future__ import annotations

import ast
from pathlib import Path
from typing import Callable
import re
import sys
import traceback

import libcst as cst

from porter.analysis.consumers import plotting_arguments, seaborn_data_columns
from porter.analysis.frame_lists import frame_lists
from porter.analysis.pipes import pipes_as_calls
from porter.analysis.returned_frames import return_changed_frames
from porter.mapping import MappingTable, load_table
from porter.emit.fstrings import fits
from porter.model import ConversionError, FileResult, InternalError, Options, Site, SiteDraft
from porter.rules import registry
from porter.translate.engine import translate_module
from porter.translate.evaluate import Services


# The oldest Python porter supports (pyproject's requires-python): every output must parse on it.
OLDEST_PYTHON = (3, 11)

# Without these in the script, no frame can hold a datetime column (CSV scans do not infer dates).
DATETIME_HINTS = re.compile(r"parse_dates|to_datetime|read_parquet|read_excel|read_json|read_sql|"
                            r"Timestamp|datetime|date_range|\.dt\.|astype\(.datetime")
# what shows that a script works with durations (a difference of dates, which porter keeps no
# type for): its CSV writes then format duration columns as pandas does
# a division (x / 0 is inf) or an infinity written out: pandas' windows take inf as missing
INFINITY_HINTS = re.compile(r"[^/]/[^/=]|\binf\b|np\.inf|Infinity")
# lists in a column (str.split, a function that splits; apply(list), agg(x=("n", list))): a
# frame back from pandas with its types unknown may hold them
LIST_HINTS = re.compile(r"split\(|[(,:]\s*list\s*[),}]")
DURATION_HINTS = re.compile(r"[Tt]imedelta|DateOffset|\.dt\.(days|seconds|total_seconds|components)")
# what can make pandas' nullable integer columns (written 2024 where a plain integer column with
# a missing value, float in pandas, is written 2024.0); dt.isocalendar() makes UInt32 / Int32 ones
NULLABLE_INT_HINTS = re.compile(r"U?Int(8|16|32|64)|convert_dtypes|dtype_backend|pd\.NA\b|pd\.array|"
                                r"isocalendar")
# what can make a category column: pandas sorts it by its categories, not its text; or a
# Period column, which Polars has no type for (a frame pandas made stays pandas then too)
CATEGORY_HINTS = re.compile(r"categor|Categorical|cut\(|read_parquet|read_feather|read_pickle|"
                            r"read_hdf|read_stata|read_spss|to_period|period_range|\bPeriod(Index|Dtype)?\(")


def parse(text: str, path: str | None = None) -> cst.Module:
    try:
        return cst.parse_module(text)
    except cst.ParserSyntaxError as exc:
        message = exc.message if hasattr(exc, "message") else str(exc)
        raise ConversionError(f"syntax error: {message}", path, exc.raw_line, exc.raw_column + 1) from None


def convert_source(text: str, *, path: str | None = None, options: Options | None = None,
                   table: MappingTable | None = None, output: str | None = None) -> FileResult:
    """Convert the text of one pandas script; raises ConversionError for bad input."""
    options = options or Options()
    module = parse(text, path)
    # df.pipe(clean) is clean(df), which porter ports as the script's other calls
    module = pipes_as_calls(module)
    # helpers that change their frame in place return it, and their callers rebind it
    returned = return_changed_frames(module)
    module = returned.module
    schema_lookup = None
    if options.data_dir is not None:
        from porter.analysis.schema import SchemaReader
        schema_lookup = SchemaReader(options.data_dir)
    services = Services(
        table=table or load_table(),
        registry=registry(),
        code_for=module.code_for_node,
        position=lambda node: (0, 0),
        min_confidence=options.min_confidence,
        schema_lookup=schema_lookup,
        datetimes_possible=bool(DATETIME_HINTS.search(text)),
        nullable_ints_possible=bool(NULLABLE_INT_HINTS.search(text)),
        durations_possible=bool(DURATION_HINTS.search(text)),
        lists_possible=bool(LIST_HINTS.search(text)),
        infinities_possible=bool(INFINITY_HINTS.search(text)),
        categories_possible=bool(CATEGORY_HINTS.search(text)),
        plotted=plotting_arguments(module),
        seaborn_columns=seaborn_data_columns(module),
        frame_lists=frame_lists(module),
    )
    try:
        translation = translate_module(module, services)
        converted = translation.module.code
    except Exception as exc:  # a bug in porter: this file fails, with where and why
        at = services.statement_lines[0]
        raise InternalError(f"{type(exc).__name__}: {exc}", path, returned.original_line(at) if at else None,
                            traceback.format_exc()) from None
    check_parses(converted, text, path)
    sites = tuple(_site(d, returned.original_line) for d in translation.sites)
    return FileResult(
        source=path or "<stdin>",
        output=output,
        original_text=text,
        converted_text=converted,
        sites=sites,
        status="converted" if converted != text else "unchanged",
    )


def check_parses(converted: str, original: str, path: str | None) -> None:
    """Raise InternalError when porter's output does not parse on the oldest supported Python
    (unless the input itself needs a newer one)."""
    problem = _syntax_problem(converted)
    if problem is None or _syntax_problem(original) is not None:
        return
    line, message = problem
    raise InternalError(f"the converted script does not parse on Python "
                        f"{'.'.join(map(str, OLDEST_PYTHON))}: {message}", path, line)


def _syntax_problem(text: str) -> tuple[int | None, str] | None:
    try:
        ast.parse(text, feature_version=OLDEST_PYTHON)
    except SyntaxError as exc:
        return exc.lineno, exc.msg
    # Newer interpreters accept what 3.11 does not between an f-string's braces (quotes of the
    # f-string itself, backslashes, comments), whatever feature_version says: check that too.
    for fstring in _fstrings(text) if sys.version_info >= (3, 12) else ():
        for part in _expressions(fstring):
            if not fits(cst.Module([]).code_for_node(part.expression), fstring.end):
                return None, "an f-string's braces hold its own quote, a backslash or a comment"
    return None


def _fstrings(text: str) -> list[cst.FormattedString]:
    if "f'" not in text.lower() and 'f"' not in text.lower():
        return []
    found: list[cst.FormattedString] = []

    class Finder(cst.CSTVisitor):
        def visit_FormattedString(self, node: cst.FormattedString) -> None:
            found.append(node)

    cst.parse_module(text).visit(Finder())
    return found


def _expressions(fstring: cst.FormattedString) -> list[cst.FormattedStringExpression]:
    parts = [p for p in fstring.parts if isinstance(p, cst.FormattedStringExpression)]
    for part in list(parts):
        if part.format_spec:
            parts += [p for p in part.format_spec if isinstance(p, cst.FormattedStringExpression)]
    return parts


def convert_file(path: str | Path, *, options: Options | None = None,
                 output: str | None = None) -> FileResult:
    path = Path(path)
    if not path.exists():
        raise ConversionError("no such file", str(path))
    if path.is_dir():
        raise ConversionError("is a folder, not a Python script", str(path))
    return convert_source(read_text(path), path=str(path), options=options, output=output)


def read_text(path: Path) -> str:
    """A script's text; a file that is not UTF-8 or cannot be read is a ConversionError."""
    try:
        return path.read_text(encoding="utf-8")
    except UnicodeDecodeError as exc:
        raise ConversionError(f"not UTF-8 text ({exc.reason} at byte {exc.start})", str(path)) from None
    except OSError as exc:
        raise ConversionError(exc.strerror or str(exc), str(path)) from None


def _site(draft: SiteDraft, line_of: Callable[[int], int] = lambda line: line) -> Site:
    """The finding as reported, its lines in the original file's numbering (`line_of`)."""
    message = draft.message
    if draft.suggestion:
        message += f"; suggested: {' '.join(draft.suggestion.split())}"
    return Site(line_of(draft.line), line_of(draft.end_line), draft.key, draft.rule, draft.status,
                draft.confidence, message)
