"""Input schemas from `--data DIR`: column types read without loading data."""

from __future__ import annotations

from pathlib import Path
import re
from typing import Any

import polars as pl

from porter.rules.io_options import NOT_DECOMPRESSED, compression_of, is_url, scan_kwargs


def dtype_name(dtype: pl.DataType) -> str | None:
    """porter's name for a Polars dtype (the categories rules reason about)."""
    if dtype.is_integer():
        return "int"
    if dtype.is_float():
        return "float"
    if dtype == pl.String:
        return "str"
    if dtype == pl.Boolean:
        return "bool"
    if dtype == pl.Date:
        return "date"
    if isinstance(dtype, pl.Datetime):
        return "datetime"
    if isinstance(dtype, (pl.Categorical, pl.Enum)):
        return "category"
    return None


class FileSchema(dict[str, str]):
    """porter's dtype names per column, in file order; `polars` holds the exact Polars dtypes
    (as code, `pl.Int64`) when every column has one a scan can be told."""

    polars: dict[str, str] | None = None
    partial: bool = False  # several files' columns together: which one a read gets is not known
    # lines pandas skips and Polars reads as a row of missing values: blank lines (True/False,
    # None when not looked at), and whether the file also has rows whose every field is empty
    # or missing (",,"), which pandas keeps
    blank_lines: bool | None = None
    empty_rows: bool = False
    # columns of numbers written with spaces around them or a plus sign (" 5", "+3"): pandas
    # reads numbers, Polars text; the scan reads them as text and the read casts them to the
    # Polars dtype (as code) given here, after stripping the spaces
    padded: dict[str, str] | None = None
    # each text column's first value that is not missing or one of pandas' texts for NaT:
    # pandas guesses a date format from it (read_csv(parse_dates=...))
    first_texts: dict[str, str] | None = None
    first_texts_each: list[dict[str, str]] | None = None  # several files' (see merged)
    # each text column's values in the first 1000 rows (missing ones left out): whether they all
    # fit the date format pandas guesses from the first (read_csv keeps the column as text if not)
    text_heads: dict[str, list[str]] | None = None
    # columns of whole numbers typed float only because a value is missing: pandas parses them
    # as integers, and so does not match them with the numbers of na_values (see read_csv)
    missing_ints: frozenset[str] = frozenset()
    # a file of a header only: pandas reads every column as object (no type), Polars as text;
    # its column types say nothing of a file with rows (`polars` is None then)
    no_rows: bool = False
    # the first data row has one field more than the header (a trailing comma on data lines):
    # pandas reads the first field of each row as the row labels and the columns shift by one
    implicit_index: bool = False
    # integer columns beyond int64 that pandas does not read as uint64 (text or Python ints
    # there; Int128 to Polars)
    wide_ints: tuple[str, ...] = ()
    # columns given dtype "category" whose values all read as numbers or True/False: pandas
    # then makes the categories numbers (007 becomes 7), Polars keeps the text
    typed_categories: tuple[str, ...] = ()
    # how the file's lines end where Polars' reader (which ends a line at \n only) differs from
    # pandas' (\n, \r\n or a bare \r): "cr" when every line ends in a bare \r (read with
    # eol_char="\r"), "mixed" when bare \r and \n both end lines (no reader option does that)
    line_ends: str | None = None
    # read_csv(comment="#"): the character appears outside quotes after the start of a line
    # (1,2 # note, or after spaces), where pandas cuts the line and Polars' comment_prefix,
    # which skips whole lines only, does not
    trailing_comments: bool = False
    # read_csv(thousands=","): text columns whose numbers porter cannot tell pandas' reading of
    # (a separator doubled, "1,,234", an integer of more than 18 digits)
    thousands_unsure: tuple[str, ...] = ()
    # read_csv(skipinitialspace=True): a quote after the spaces that follow a separator, where
    # pandas starts a quoted field and Polars' reader keeps the spaces and the quotes as text
    spaced_quotes: bool = False
    # read_csv(sep=r"\s+"): a quote in the file, or a data line whose number of fields is not
    # the header's (see SchemaReader._read_words)
    words_unsure: bool = False
    # read_csv(on_bad_lines="skip" / "warn", pandas 1.x's error_bad_lines=False): a quote, a
    # carriage return, a line of spaces, the first data line longer than the header, or no
    # data line (see SchemaReader._read_skipping_bad_lines)
    bad_lines_unsure: bool = False
    # read_csv(true_values=..., false_values=...): the text columns pandas reads as True/False
    # (every value one of them or of pandas' own True/False texts); scanned as text here
    bool_texts: tuple[str, ...] = ()
    # parquet: the columns pandas wrote with one of its nullable dtypes (Int64, boolean,
    # string, Float64), from the pandas metadata of the file, which pandas' read_parquet
    # restores; {} for a file without any, None when not looked at
    pandas_nullable: dict[str, str] | None = None


def polars_code(dtype: pl.DataType) -> str | None:
    """`pl.Int64` for a dtype a CSV scan reads as is; None for one it cannot be told."""
    plain = {pl.Int64: "pl.Int64", pl.Float64: "pl.Float64", pl.String: "pl.String",
             pl.Boolean: "pl.Boolean", pl.Int32: "pl.Int32", pl.Float32: "pl.Float32",
             pl.UInt64: "pl.UInt64"}
    for kind, code in plain.items():
        if dtype == kind:
            return code
    return None


def merged(schemas: list[FileSchema]) -> FileSchema | None:
    """The schema several files of one read share (a function called with each): the same
    columns, or, when their columns differ but agree on the types of the names they share,
    every column's type with `partial` set."""
    first = schemas[0]
    if all(list(s.items()) == list(first.items()) and s.polars == first.polars
           and s.padded == first.padded and s.line_ends == first.line_ends
           and s.pandas_nullable == first.pandas_nullable for s in schemas):
        return first
    if any(s.padded for s in schemas):
        return None  # which file's numbers need their spaces stripped is not known
    names: dict[str, str] = {}
    codes: dict[str, str] = {}
    for schema in schemas:
        if schema.polars is None:
            return None
        for name, kind in schema.items():
            if names.setdefault(name, kind) != kind or codes.setdefault(name, schema.polars[name]) \
                    != schema.polars[name]:
                return None
    found = FileSchema(names)
    found.polars, found.partial = codes, True
    found.first_texts_each = [s.first_texts or {} for s in schemas]
    looked = [s.blank_lines for s in schemas]
    found.blank_lines = None if None in looked else any(looked)
    found.empty_rows = any(s.empty_rows for s in schemas)
    found.missing_ints = frozenset().union(*(s.missing_ints for s in schemas))
    found.no_rows = any(s.no_rows for s in schemas)
    found.implicit_index = any(s.implicit_index for s in schemas)
    ends = {s.line_ends for s in schemas}
    found.line_ends = "mixed" if len(ends) > 1 else ends.pop()
    return found


# read_csv(sep=r"\s+"): pandas splits each line at runs of spaces and tabs (its C reader's
# whitespace), never at other white space such as a no-break space
WHITESPACE_SEPARATOR = r"\s+"
WORDS = re.compile(r"[^ \t]+")


class SchemaReader:
    """Looks input files up under the data folder; remembers what it read."""

    def __init__(self, data_dir: str | Path) -> None:
        self.root = Path(data_dir)
        self.cache: dict[tuple[str, str, str], dict[str, str] | None] = {}

    def __call__(self, reader: str, path: str, options: dict[str, Any]) -> dict[str, str] | None:
        key = (reader, path, repr(sorted(options.items())))
        if key not in self.cache:
            self.cache[key] = self._read(reader, path, options)
        return self.cache[key]

    def listing(self, kind: str, where: str, pattern: str | None,
                recursive: bool) -> list[str] | None:
        """What a listing call of the script (glob.glob, os.listdir, Path.glob...) gives run
        from the data folder (porter/analysis/globbed_files.py)."""
        from porter.analysis.globbed_files import list_in
        return list_in(self.root, kind, where, pattern, recursive)

    def _read(self, reader: str, path: str, options: dict[str, Any]) -> dict[str, str] | None:
        if any(c in path for c in "*?[") and not is_url(path):
            return self._read_glob(reader, path, options)
        if is_url(path) or compression_of(path) in NOT_DECOMPRESSED:
            return None  # never read as text what Polars cannot read (zip bytes as a header)
        file = self.root / path
        if not file.is_file():
            return None
        if reader == "csv" and options.get("encoding"):
            # read_csv(encoding="latin-1"): the rule reads it with pl.read_csv(encoding=...),
            # which decodes it with Python's codec; porter reads a UTF-8 copy the same way
            import tempfile
            with tempfile.TemporaryDirectory() as folder:
                copy = Path(folder) / file.name
                try:
                    copy.write_text(file.read_bytes().decode(options["encoding"]), encoding="utf-8")
                except (UnicodeDecodeError, LookupError, OSError):
                    return None
                rest = {k: v for k, v in options.items() if k != "encoding"}
                return self._read_decoded(reader, copy, rest)
        if reader == "csv" and _gzipped(file):
            # a .gz file: Polars' scan decompresses it, and the helpers below, which read the
            # file's lines themselves (blank lines, line ends, comments), read a plain copy
            import gzip
            import shutil
            import tempfile
            if file.stat().st_size > SAMPLE_SCAN_LIMIT:
                return None
            with tempfile.TemporaryDirectory() as folder:
                copy = Path(folder) / "decompressed.csv"
                try:
                    with gzip.open(file, "rb") as packed, copy.open("wb") as plain:
                        shutil.copyfileobj(packed, plain)
                except (OSError, EOFError):
                    return None
                return self._read_decoded(reader, copy, options)
        return self._read_decoded(reader, file, options)

    def _read_glob(self, reader: str, path: str, options: dict[str, Any]) -> dict[str, str] | None:
        """A glob (Dask's dd.read_csv("data/t-*.csv"), Polars' scan over it): the schema its
        files share, in the order of their sorted names; None when they differ or none match."""
        try:
            files = sorted(str(f.relative_to(self.root)) for f in self.root.glob(path) if f.is_file())
        except (ValueError, NotImplementedError, OSError):
            return None
        if not files:
            return None
        found = [self(reader, f, options) for f in files]
        if not all(isinstance(f, FileSchema) for f in found):
            return None
        schema = merged(found)  # type: ignore[arg-type]
        return None if schema is None or schema.partial else schema

    def _read_decoded(self, reader: str, file: Path, options: dict[str, Any]) -> dict[str, str] | None:
        if reader == "csv":
            ends = _line_ends(file)
            if ends == "mixed":  # no scan reads it as pandas does: the read is a TODO
                found = FileSchema()
                found.line_ends = ends
                return found
            if ends == "cr":  # the helpers below read it with eol_char="\r" (scan_kwargs)
                options = {**options, "lineterminator": "\r"}
        if reader == "csv" and options.get("sep") == WHITESPACE_SEPARATOR:
            return self._read_words(file, options)
        if reader == "csv" and options.get("on_bad_lines") == "skip":
            return self._read_skipping_bad_lines(file, options)
        if reader == "csv" and (options.get("skipinitialspace") or options.get("skiprows_list")):
            return self._read_stripped(file, options)
        if reader == "csv" and isinstance(options.get("nrows"), int):
            # pandas infers the types of read_csv(nrows=N) from the N rows it reads: porter
            # reads the types of those rows only, from a copy of the file cut after them
            import tempfile
            with tempfile.TemporaryDirectory() as folder:
                head = Path(folder) / file.name
                if not _first_rows(file, head, options):
                    return None
                return self._read_file(reader, head, options)
        return self._read_file(reader, file, options)

    def _read_words(self, file: Path, options: dict[str, Any]) -> dict[str, str] | None:
        """read_csv(sep=r"\\s+"): the schema of the file as pandas reads it, each line's fields
        the runs of characters other than spaces and tabs (leading ones ignored, blank lines
        skipped), read from a comma-separated copy. A quote in the file (pandas reads a
        quoted field with its spaces as one), or a data line with another number of fields
        than the header (pandas fails, or makes the first field the row label), marks the
        schema `words_unsure`: the read is a TODO."""
        import csv
        import tempfile

        if file.stat().st_size > SAMPLE_SCAN_LIMIT:
            return None
        try:
            text = file.read_text(encoding="utf-8")
        except (OSError, UnicodeDecodeError):
            return None
        rows = [words for line in text.splitlines() if (words := WORDS.findall(line))]
        if not rows or '"' in text or "'" in text or any(len(r) != len(rows[0]) for r in rows):
            found = FileSchema()
            found.words_unsure = True
            return found
        rest = {k: v for k, v in options.items() if k != "sep"}
        with tempfile.TemporaryDirectory() as folder:
            copy = Path(folder) / "words.csv"
            with copy.open("w", newline="", encoding="utf-8") as out:
                csv.writer(out).writerows(rows)
            return self._read_file("csv", copy, rest)

    def _read_skipping_bad_lines(self, file: Path, options: dict[str, Any]) -> dict[str, str] | None:
        """read_csv(on_bad_lines="skip"): the schema of the file as pandas reads it, a data
        line with more fields than the header left out, one with fewer filled with missing
        values, blank lines skipped; read from a copy with those lines so. The read splits
        each line at the separator itself (rules/io.py), which is pandas' reading only without
        quotes: a quote in the file, a carriage return, a line of spaces only (pandas skips
        it), a first data line longer than the header (pandas makes its first field the row
        label) or no data line marks the schema `bad_lines_unsure`: the read is a TODO."""
        import csv
        import tempfile

        if file.stat().st_size > SAMPLE_SCAN_LIMIT:
            return None
        try:
            text = file.read_text(encoding="utf-8")
        except (OSError, UnicodeDecodeError):
            return None
        sep = options.get("sep", ",")
        lines = [line for line in text.split("\n") if line]
        rows = [line.split(sep) for line in lines]
        if len(rows) < 2 or '"' in text or "\r" in text or any(not line.strip() for line in lines) \
                or len(rows[1]) > len(rows[0]):
            found = FileSchema()
            found.bad_lines_unsure = True
            return found
        width = len(rows[0])
        kept = [row + [""] * (width - len(row)) for row in rows if len(row) <= width]
        rest = {k: v for k, v in options.items() if k != "on_bad_lines"}
        with tempfile.TemporaryDirectory() as folder:
            copy = Path(folder) / "kept.csv"
            with copy.open("w", newline="", encoding="utf-8") as out:
                csv.writer(out, delimiter=sep, lineterminator="\n").writerows(kept)
            return self._read_file("csv", copy, rest)

    def _read_stripped(self, file: Path, options: dict[str, Any]) -> dict[str, str] | None:
        """read_csv(skipinitialspace=True), or skiprows= a list of rows: the schema of the
        file as pandas reads it once the spaces after each separator are gone and the rows
        skipped, read from a copy without them (the values and the header names, as read_csv's
        scan removes them; the lines skipped, comments and the rows past nrows left out).
        `skiprows_list` holds the positions of the data rows to leave out as the scan counts
        them (a blank line is one)."""
        import tempfile

        if file.stat().st_size > SAMPLE_SCAN_LIMIT or compression_of(str(file)):
            return None
        strip = bool(options.get("skipinitialspace"))
        spaced = _spaced_quotes(file, options.get("sep", ",")) if strip else False
        if spaced is None:
            return None
        if spaced:  # pandas starts a quoted field after the spaces, Polars' reader does not
            found = FileSchema()
            found.spaced_quotes = True
            return found
        read = {k: v for k, v in options.items() if k in ("sep", "nrows", "skiprows", "comment",
                                                          "lineterminator", "header", "names",
                                                          "number_names")}
        kwargs = {**scan_kwargs(read), "null_values": None, "infer_schema_length": 0}
        if "nrows" in read:
            kwargs["n_rows"] = read["nrows"]
        blank_lines, empty_rows = _blank_lines(file, scan_kwargs(options))
        try:
            frame = pl.scan_csv(file, **kwargs)
            if options.get("skiprows_list"):
                frame = frame.filter(~pl.int_range(pl.len()).is_in(list(options["skiprows_list"])))
            if blank_lines and not empty_rows:  # blank lines, which pandas skips
                frame = frame.filter(~pl.all_horizontal(pl.all().is_null()))
            if strip:
                frame = frame.rename(lambda name: name.lstrip(" ")).with_columns(
                    pl.all().str.strip_chars_start(" "))
            table = frame.collect()
        except (pl.exceptions.PolarsError, OSError, ValueError):
            return None
        rest = {k: v for k, v in options.items()
                if k not in (*read, "skipinitialspace", "skiprows_list")}
        if "sep" in options:
            rest["sep"] = options["sep"]
        with tempfile.TemporaryDirectory() as folder:
            copy = Path(folder) / "stripped.csv"
            table.write_csv(copy, separator=options.get("sep", ","))
            found = self._read_file("csv", copy, rest)
        if isinstance(found, FileSchema):
            found.blank_lines, found.empty_rows = blank_lines, empty_rows
        return found

    def _read_file(self, reader: str, file: Path, options: dict[str, Any]) -> dict[str, str] | None:
        if reader == "csv" and _implicit_index(file, options):
            # Polars' reader fails on the extra field (and so do the helpers below): the read
            # is a TODO, whatever the types
            found = FileSchema()
            found.implicit_index = True
            return found
        try:
            if reader == "csv":
                schema = pl.scan_csv(file, **scan_kwargs(options)).collect_schema()
                blank_lines, empty_rows = _blank_lines(file, scan_kwargs(options))
                unsure = _thousands_unsure(file, schema, options)
                schema, padded, padded_ints = _text_read_as_numbers(file, schema, options)
                schema, missing_ints = _missing_ints_as_floats(
                    file, schema, options, skip_blank=bool(blank_lines) and not empty_rows)
                schema, wide = _unsigned_ints(file, schema, options)
                bool_texts = _bool_texts(file, schema, options)
                if options.get("keep_default_na") is False:
                    schema, emptied = _empty_fields_as_text(file, schema, options)
                    missing_ints -= emptied
                    padded = {k: v for k, v in padded.items() if k not in emptied}
            elif reader == "parquet":
                schema = pl.scan_parquet(file).collect_schema()
            else:
                return None
        except (pl.exceptions.PolarsError, OSError, ValueError):
            return None
        found = FileSchema({name: dtype_name(dtype) or "other" for name, dtype in schema.items()})
        if reader == "csv":
            codes = {name: polars_code(dtype) for name, dtype in schema.items()}
            if all(codes.values()):
                found.polars = codes  # type: ignore[assignment]
                for name in padded:  # scanned as text, then cast
                    found.polars[name] = "pl.String"
            if padded:
                found.padded = {name: polars_code(dtype) for name, dtype in padded.items()}  # type: ignore[misc]
            found.blank_lines, found.empty_rows = blank_lines, empty_rows
            found.first_texts, found.text_heads = _first_texts(file, schema, options)
            found.missing_ints = frozenset(missing_ints | padded_ints)
            found.thousands_unsure = unsure
            found.bool_texts = tuple(bool_texts)
            for name in bool_texts:  # scanned as text, then made True/False
                found[name] = "bool"
            found.no_rows = _no_rows(file, options)
            found.implicit_index = _implicit_index(file, options)
            found.wide_ints = tuple(wide)
            found.typed_categories = _typed_categories(file, options)
            found.line_ends = "cr" if options.get("lineterminator") == "\r" else None
            if options.get("comment"):
                found.trailing_comments = _trailing_comments(file, options["comment"],
                                                             options.get("quotechar", '"'))
            if found.no_rows:
                found.polars = None
        if reader == "parquet":
            found.pandas_nullable = _pandas_nullable(file)
        return found


# pandas' nullable dtypes as its parquet metadata names them ("numpy_type")
_NULLABLE_DTYPES = {"Int8", "Int16", "Int32", "Int64", "UInt8", "UInt16", "UInt32", "UInt64",
                    "boolean", "string", "Float32", "Float64"}


# the texts pandas' CSV reader reads as True and False whatever true_values/false_values add
PANDAS_TRUE = ("True", "TRUE", "true")
PANDAS_FALSE = ("False", "FALSE", "false")


def _bool_texts(file: Path, schema: Any, options: dict[str, Any]) -> list[str]:
    """The text columns read_csv(true_values=..., false_values=...) reads as True/False: every
    value that is not missing is one of those texts or pandas' own (measured: a column of
    numbers stays numbers, a column with one other text stays text, values as written)."""
    texts = set(options.get("true_values") or ()) | set(options.get("false_values") or ())
    if not texts:
        return []
    texts |= {*PANDAS_TRUE, *PANDAS_FALSE}
    candidates = [name for name, dtype in schema.items() if dtype == pl.String]
    if not candidates or file.stat().st_size > SAMPLE_SCAN_LIMIT:
        return []
    row = pl.scan_csv(file, **scan_kwargs(options)).select(
        *[pl.col(n).drop_nulls().is_in(sorted(texts)).all().alias(n) for n in candidates]
    ).collect().row(0, named=True)
    return [n for n in candidates if row[n]]


def _empty_fields_as_text(file: Path, schema: Any, options: dict[str, Any]) \
        -> tuple[dict[str, Any], set[str]]:
    """read_csv(keep_default_na=False): the schema with each column of numbers that holds an
    empty field typed text, as pandas reads it (the field is "" then, not NaN; Polars' reader
    reads a missing number), and the names of those columns."""
    numbers = [name for name, dtype in schema.items() if dtype.is_numeric()]
    found = dict(schema)
    if not numbers:
        return found, set()
    kwargs = {**scan_kwargs(options), "infer_schema_length": 0}
    kwargs.pop("schema_overrides", None)
    row = pl.scan_csv(file, **kwargs).select(
        *[(pl.col(n) == "").any().alias(n) for n in numbers]).collect().row(0, named=True)
    emptied = {n for n in numbers if row[n]}
    for name in emptied:
        found[name] = pl.String
    return found, emptied


def _gzipped(file: Path) -> bool:
    """Whether the file is gzip data (its first two bytes), as Polars' scan tells it."""
    try:
        with file.open("rb") as handle:
            return handle.read(2) == b"\x1f\x8b"
    except OSError:
        return False


def _pandas_nullable(file: Path) -> dict[str, str] | None:
    """The columns of a parquet file pandas wrote that its read_parquet gives one of pandas'
    nullable dtypes, read from the file's pandas metadata (no data is loaded); {} for a file
    without that metadata (written by Arrow or Polars: pandas reads numpy's types)."""
    import json
    try:
        stored = pl.read_parquet_metadata(file).get("pandas")
        columns = json.loads(stored)["columns"] if stored else []
    except (pl.exceptions.PolarsError, OSError, ValueError, KeyError, TypeError):
        return None
    return {c["field_name"]: c["numpy_type"] for c in columns
            if isinstance(c, dict) and c.get("numpy_type") in _NULLABLE_DTYPES
            and isinstance(c.get("field_name"), str)}


def _first_rows(file: Path, head: Path, options: dict[str, Any]) -> bool:
    """Write to `head` the lines of `file` up to the end of its first `nrows` data rows as
    pandas counts them (after `skiprows` lines and the header; blank lines are not rows, a
    quoted field may span lines); False when the file is not read."""
    import csv

    if file.stat().st_size > SAMPLE_SCAN_LIMIT or compression_of(str(file)):
        return False
    try:
        with file.open(encoding="utf-8-sig", errors="replace", newline="") as handle:
            lines = handle.read().splitlines(keepends=True)
    except OSError:
        return False
    kept = int(options.get("skiprows") or 0)
    taken = 0

    comment = options.get("comment")

    def feed():  # counts the lines the csv reader takes
        nonlocal kept
        while kept < len(lines):
            kept += 1
            if comment and lines[kept - 1].startswith(comment):
                continue  # a comment line (read_csv(comment=...)): no row
            yield lines[kept - 1]

    rows = csv.reader(feed(), delimiter=options.get("sep", ","))
    # the header (none with header=None), then the rows
    wanted = (0 if "header" in options and options["header"] is None else 1) + int(options["nrows"])
    try:
        for row in rows:
            if row:
                taken += 1
                if taken == wanted:
                    break
    except csv.Error:
        return False
    head.write_text("".join(lines[:kept]), encoding="utf-8")
    return True


_NOT_FIRST = {"", "NaT", "nat", "NAT", "nan", "NaN", "NAN", "now", "today"}


def _first_texts(file: Path, schema: Any, options: dict[str, Any]) \
        -> tuple[dict[str, str], dict[str, list[str]]]:
    """The first value of each text column that pandas would guess a date format from, and the
    column's values in the first 1000 rows."""
    texts = [name for name, dtype in schema.items() if dtype == pl.String]
    if not texts:
        return {}, {}
    try:
        kwargs = {**scan_kwargs(options), "infer_schema_length": 0}  # all text, no inference
        kwargs.pop("schema_overrides", None)
        head = pl.scan_csv(file, **kwargs).select(texts).head(1000).collect()
    except (pl.exceptions.PolarsError, OSError, ValueError):
        return {}, {}
    found = {}
    heads = {}
    for name in texts:
        heads[name] = [v for v in head[name].to_list() if v is not None]
        values = [v for v in heads[name] if v.strip() not in _NOT_FIRST]
        if values:
            found[name] = values[0]
    return found, heads


def _line_ends(file: Path) -> str | None:
    """"cr" when the file's lines end in a bare carriage return, "mixed" when some lines end
    in one and others in \n (or \r\n), None otherwise; a \r inside a quoted field is a value,
    not a line's end. pandas ends a line at each of \n, \r\n and \r; Polars at \n only."""
    import re

    if file.stat().st_size > SAMPLE_SCAN_LIMIT or compression_of(str(file)):
        return None
    try:
        data = file.read_bytes()
    except OSError:
        return None
    if b"\r" not in data:
        return None
    data = re.sub(rb'"(?:[^"]|"")*"', b"", data)  # quoted fields hold values, not line ends
    bare = re.search(rb"\r(?!\n)", data) is not None
    if not bare:
        return None
    return "mixed" if b"\n" in data else "cr"


def _trailing_comments(file: Path, comment: str, quote: str) -> bool:
    """Whether `comment` appears outside quoted fields anywhere but at the start of a line (a
    line starting with it is skipped whole, by pandas and by Polars' comment_prefix alike);
    True when the file is not looked at (the careful answer)."""
    if file.stat().st_size > SAMPLE_SCAN_LIMIT or compression_of(str(file)):
        return True
    try:
        text = file.read_text(encoding="utf-8-sig", errors="replace")
    except OSError:
        return True
    quoted, at_start = False, True
    skipping = False  # inside a comment line
    for char in text:
        if char in "\r\n" and not quoted:
            at_start, skipping = True, False
            continue
        if skipping:
            continue
        if at_start and char == comment:
            skipping, at_start = True, False
            continue
        at_start = False
        if char == quote:
            quoted = not quoted
        elif char == comment and not quoted:
            return True
    return False


def _spaced_quotes(file: Path, separator: str, quote: str = '"') -> bool | None:
    """Whether a field starts with spaces and then a quote (`a, "b, c"`), outside quoted
    fields; None when the file is not read."""
    try:
        text = file.read_text(encoding="utf-8-sig", errors="replace")
    except OSError:
        return None
    quoted, spaces, at_field = False, 0, True
    for char in text:
        if quoted:
            if char == quote:  # its end, or the first of a doubled quote (read on as text)
                quoted, at_field, spaces = False, False, 0
            continue
        if at_field and char == " ":
            spaces += 1
            continue
        if char == quote:
            if at_field and spaces:
                return True
            quoted = True
        at_field = char in (separator, "\n", "\r")
        spaces = 0
    return False


def _implicit_index(file: Path, options: dict[str, Any]) -> bool:
    """Whether the first data row has one field more than the header, where pandas takes
    the first column as the index (Polars' reader fails on such a row)."""
    import csv
    import itertools

    if "names" in options or ("header" in options and options["header"] is None):
        return False  # no header line to compare with (names= of another count fail the scan)

    try:
        with file.open(encoding="utf-8-sig", errors="replace", newline="") as handle:
            lines = itertools.islice(handle, int(options.get("skiprows") or 0), None)
            if options.get("comment"):  # lines skipped as comments are no header nor row
                lines = (line for line in lines if not line.startswith(options["comment"]))
            rows = (r for r in csv.reader(lines, delimiter=options.get("sep", ",")) if r)
            header, first = next(rows, None), next(rows, None)
    except (OSError, csv.Error):
        return False
    return header is not None and first is not None and len(first) == len(header) + 1


def _unsigned_ints(file: Path, schema: Any, options: dict[str, Any]) -> tuple[dict[str, Any], list[str]]:
    """The schema with each integer column Polars reads as Int128 (a value beyond int64) that
    pandas reads as uint64 (every value from 0 to 2**64 - 1, none missing) typed UInt64, and
    the names of the other Int128 columns (pandas reads text or Python ints there)."""
    wide = [name for name, dtype in schema.items() if dtype == pl.Int128]
    found = dict(schema)
    if not wide:
        return found, []
    if file.stat().st_size > SAMPLE_SCAN_LIMIT:
        return found, wide
    row = pl.scan_csv(file, **scan_kwargs(options)).select(
        *[pl.col(n).min().alias(f"\0min{i}") for i, n in enumerate(wide)],
        *[pl.col(n).max().alias(f"\0max{i}") for i, n in enumerate(wide)],
        *[pl.col(n).null_count().alias(f"\0nulls{i}") for i, n in enumerate(wide)],
    ).collect().row(0, named=True)
    others = []
    for i, name in enumerate(wide):
        if row[f"\0nulls{i}"] == 0 and row[f"\0min{i}"] is not None and row[f"\0min{i}"] >= 0 \
                and row[f"\0max{i}"] < 2**64:
            found[name] = pl.UInt64
        else:
            others.append(name)
    return found, others


def _typed_categories(file: Path, options: dict[str, Any]) -> tuple[str, ...]:
    """The columns given dtype "category" whose values Polars reads as numbers or True/False
    when not told they are text (pandas reads the categories as such too)."""
    given = options.get("dtype") if isinstance(options.get("dtype"), dict) else {}
    names = [c for c, t in given.items() if str(t) == "category"]
    if not names:
        return ()
    kwargs = scan_kwargs({k: v for k, v in options.items() if k != "dtype"})
    try:
        schema = pl.scan_csv(file, **kwargs).collect_schema()
    except (pl.exceptions.PolarsError, OSError, ValueError):
        return ()
    return tuple(c for c in names if c in schema and (schema[c].is_numeric() or schema[c] == pl.Boolean))


def _no_rows(file: Path, options: dict[str, Any]) -> bool:
    """Whether the file has a header and no rows (not looked at past SAMPLE_SCAN_LIMIT)."""
    if file.stat().st_size > SAMPLE_SCAN_LIMIT:
        return False
    return pl.scan_csv(file, **scan_kwargs(options)).select(pl.len()).collect().item() == 0


def _missing_ints_as_floats(file: Path, schema: Any, options: dict[str, Any], *,
                            skip_blank: bool = False) -> tuple[dict[str, Any], set[str]]:
    """The schema with each inferred integer column that has a missing value read as Float64,
    as pandas reads it (pandas has no missing integer in a default read: 33 becomes 33.0), and
    the names of those columns."""
    given = options.get("dtype") if isinstance(options.get("dtype"), dict) else {}
    # integers beyond int64 (Int128) are left to _unsigned_ints: pandas reads them as text
    ints = [name for name, dtype in schema.items()
            if dtype.is_integer() and dtype != pl.Int128 and name not in given]
    found = dict(schema)
    if not ints or file.stat().st_size > SAMPLE_SCAN_LIMIT:
        return found, set()
    frame = pl.scan_csv(file, **scan_kwargs(options))
    if skip_blank:  # the file has blank lines and no rows of empty fields (_blank_lines)
        # pandas skips blank lines, which Polars reads as rows of missing values: they make
        # no integer column float
        frame = frame.filter(~pl.all_horizontal(pl.all().is_null()))
    counts = frame.select(pl.col(ints).null_count()).collect().row(0, named=True)
    for name in ints:
        if counts[name]:
            found[name] = pl.Float64
    return found, {name for name in ints if counts[name]}


# A number as pandas' CSV parser reads it once the spaces and tabs around it are stripped (a
# plus sign is allowed); narrower than pandas' (no digits past int64): a column with other
# text stays text, as Polars reads it.
PADDED_INT = r"^[+-]?[0-9]{1,18}$"
PADDED_FLOAT = r"^[+-]?([0-9]+\.?[0-9]*|\.[0-9]+)([eE][+-]?[0-9]+)?$"
# infinity as pandas' CSV parser reads it (inf, -Inf, +INFINITY: any case, no spaces around),
# which Polars' reader infers as text but reads as a float when told the column is Float64
INFINITY = r"(?i)^[+-]?inf(inity)?$"
# a float Polars' reader reads as it is written (no plus sign, no spaces)
PLAIN_FLOAT = r"^-?([0-9]+\.?[0-9]*|\.[0-9]+)([eE][+-]?[0-9]+)?$"
PADDING = " \t"


def _with_thousands(pattern: str, separator: str) -> str:
    """PADDED_INT or PADDED_FLOAT allowing pandas' thousands separator in the whole part of the
    number: once between two digits, or after the last one ("1,234", "1,2,3", "5,", "1,.5",
    "1,e3"; measured on pandas 3.1: ",5" and "1,,234" in a float column stay text)."""
    sep = f"\\x{{{ord(separator):X}}}"
    whole = f"[0-9](?:{sep}?[0-9])*{sep}?"
    if pattern == PADDED_INT:
        return f"^[+-]?{whole}$"
    return f"^[+-]?({whole}(\\.[0-9]*)?|\\.[0-9]+)([eE][+-]?[0-9]+)?$"


def _thousands_unsure(file: Path, schema: Any, options: dict[str, Any]) -> tuple[str, ...]:
    """The text columns where read_csv(thousands=...) may read numbers porter does not tell:
    a value with the separator doubled after a digit ("1,,234": an integer to pandas in a column
    of integers, text in one of floats), or an integer of more than 18 digits (int64 to pandas,
    float here)."""
    separator = options.get("thousands")
    if not separator or file.stat().st_size > SAMPLE_SCAN_LIMIT:
        return ()
    texts = [name for name, dtype in schema.items() if dtype == pl.String]
    if not texts:
        return ()
    sep = f"\\x{{{ord(separator):X}}}"
    whole = f"^[+-]?[0-9](?:{sep}?[0-9])*{sep}?$"
    row = pl.scan_csv(file, **scan_kwargs(options)).select(
        *[(pl.col(n).str.contains(f"[0-9]{sep}{sep}")
           | (pl.col(n).str.strip_chars(PADDING).str.contains(whole)
              & (pl.col(n).str.replace_all("[^0-9]", "").str.len_chars() > 18))).any()
          .alias(n) for n in texts]).collect().row(0, named=True)
    return tuple(n for n in texts if row[n])


def _text_read_as_numbers(file: Path, schema: Any, options: dict[str, Any]) \
        -> tuple[dict[str, Any], dict[str, Any], set[str]]:
    """The schema with the text columns pandas reads as numbers typed as pandas types them,
    those of them whose numbers Polars cannot read as they are (`padded`), and those of these
    that are whole numbers with a missing value (float in pandas).

    A column holding only missing values is float64 in pandas (Polars infers text). Numbers
    written with spaces or tabs around them, or with a plus sign (" 5", "+3", "2.50 "), are
    numbers in pandas and text in Polars: int64, or float64 when one is not whole or a value
    is missing. A column of numbers with inf, -inf or Infinity among them is float64 in pandas
    (text in Polars' inference): typed Float64, which Polars' reader and cast read them as,
    and scanned as text and stripped only when a number in it is padded too.
    """
    given = options.get("dtype") if isinstance(options.get("dtype"), dict) else {}
    if options.get("dtype") == "str":  # every column read as text (dtype=str)
        return dict(schema), {}, set()
    texts = [name for name, dtype in schema.items() if dtype == pl.String and name not in given]
    found = dict(schema)
    if not texts or file.stat().st_size > SAMPLE_SCAN_LIMIT:
        return found, {}, set()
    frame = pl.scan_csv(file, **scan_kwargs(options))
    stripped = [pl.col(name).str.strip_chars(PADDING) for name in texts]
    padded_int, padded_float, plain_float = PADDED_INT, PADDED_FLOAT, PLAIN_FLOAT
    if options.get("thousands"):  # "1,234": a number to pandas, text to Polars
        padded_int, padded_float = (_with_thousands(p, options["thousands"])
                                    for p in (PADDED_INT, PADDED_FLOAT))
        # at most 18 digits for an integer, as PADDED_INT (_thousands_unsure finds longer ones)
        stripped_ints = [s.str.contains(padded_int)
                         & (s.str.replace_all("[^0-9]", "").str.len_chars() <= 18)
                         for s in stripped]
    else:
        stripped_ints = [s.str.contains(padded_int) for s in stripped]
    if options.get("decimal") == ",":  # "1,5" is a number to pandas then, "1.5" text
        padded_float, plain_float = (p.replace(r"\.", ",") for p in (padded_float, PLAIN_FLOAT))
    row = frame.select(
        pl.len().alias("\0rows"),
        *[pl.col(name).null_count().alias(f"\0nulls{i}") for i, name in enumerate(texts)],
        *[s.all().alias(f"\0int{i}") for i, s in enumerate(stripped_ints)],
        *[s.str.contains(padded_float).all().alias(f"\0float{i}") for i, s in enumerate(stripped)],
        *[(pl.col(name).str.contains(INFINITY) | s.str.contains(padded_float)).all()
          .alias(f"\0inf{i}") for i, (name, s) in enumerate(zip(texts, stripped))],
        *[pl.col(name).str.contains(f"{INFINITY}|{plain_float}").all().alias(f"\0plain{i}")
          for i, name in enumerate(texts)],
    ).collect().row(0, named=True)
    padded: dict[str, Any] = {}
    missing_ints: set[str] = set()
    for i, name in enumerate(texts):
        if not row["\0rows"]:
            continue  # a file of a header only: pandas reads text columns too
        if row[f"\0nulls{i}"] == row["\0rows"]:
            found[name] = pl.Float64
        elif row[f"\0int{i}"]:
            found[name] = padded[name] = pl.Float64 if row[f"\0nulls{i}"] else pl.Int64
            if row[f"\0nulls{i}"]:
                missing_ints.add(name)
        elif row[f"\0float{i}"]:
            found[name] = padded[name] = pl.Float64
        elif row[f"\0plain{i}"]:
            found[name] = pl.Float64
        elif row[f"\0inf{i}"]:
            found[name] = padded[name] = pl.Float64
    return found, padded, missing_ints


SAMPLE_SCAN_LIMIT = 256 * 1024 * 1024  # a larger sample is not read again for its blank lines or blanks


def _blank_lines(file: Path, kwargs: dict[str, Any]) -> tuple[bool | None, bool]:
    """(whether the file has blank lines after its header, whether it has lines a scan cannot
    tell from a skipped blank line once read: every field empty or a missing-value token, or
    only spaces); (None, False) when the file is not looked at."""
    if file.stat().st_size > SAMPLE_SCAN_LIMIT:
        return None, False
    separator = kwargs.get("separator", ",")
    tokens = set(kwargs.get("null_values") or ()) | {""}
    blank = empty = False
    try:
        with file.open(encoding="utf-8", errors="replace", newline="") as handle:
            lines = handle.read().splitlines()
    except OSError:
        return None, False
    header = 1 if kwargs.get("has_header", True) else 0
    for line in lines[header + int(kwargs.get("skip_rows") or 0):]:
        if not line:
            blank = True
        elif not line.strip():  # skipped by pandas, a row of spaces in Polars' text columns
            blank = empty = True
        elif all(field.strip().strip('"') in tokens for field in line.split(separator)):
            empty = True
    return blank, empty
