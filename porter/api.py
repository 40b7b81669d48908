"""Converting one script: parse → analyse → translate → emit. The CLI and batch call this."""

from __future__ import annotations

from pathlib import Path
import re

import libcst as cst

from porter.mapping import MappingTable, load_table
from porter.model import ConversionError, FileResult, Options, Site, SiteDraft
from porter.rules import registry
from porter.translate.engine import translate_module
from porter.translate.evaluate import Services


# Without these in the script, no frame can hold a datetime column (CSV scans do not infer dates).
DATETIME_HINTS = re.compile(r"parse_dates|to_datetime|read_parquet|read_excel|read_json|read_sql|"
                            r"Timestamp|datetime|date_range|\.dt\.|astype\(.datetime")


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
    )
    translation = translate_module(module, services)
    converted = translation.module.code
    sites = tuple(_site(d) for d in translation.sites)
    return FileResult(
        source=path or "<stdin>",
        output=output,
        original_text=text,
        converted_text=converted,
        sites=sites,
        status="converted" if converted != text else "unchanged",
    )


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


def _site(draft: SiteDraft) -> Site:
    message = draft.message
    if draft.suggestion:
        message += f"; suggested: {' '.join(draft.suggestion.split())}"
    return Site(draft.line, draft.end_line, draft.key, draft.rule, draft.status,
                draft.confidence, message)
