"""Reading and writing: pd.read_csv / read_parquet → scans, to_csv / to_parquet → sinks.
"""

from __future__ import annotations

from dataclasses import replace
import ast
import re
from typing import Any

import libcst as cst

from porter.emit import code as emit
from porter.emit.code import Code
from porter.rules import rule
from porter.rules.io_options import (CSV_DATETIMES_CONSTANT, CSV_DURATIONS_CONSTANT,
                                     CSV_FLOATS_CONSTANT,
                                     CSV_INTS_CONSTANT, CSV_LISTS_CONSTANT,
                                     CSV_NUMBER_LISTS_CONSTANT, CSV_ZONED_DATETIMES_CONSTANT,
                                     DTYPES, NULLABLE_INT_DTYPES,
                                     NA_CONSTANT, NOT_DECOMPRESSED, PANDAS_NA_TOKENS,
                                     POLARS_CSV_COMPRESSION, compression_of, is_number, is_url,
                                     na_value_numbers, na_value_texts,
                                     written_compression)
from porter.analysis.schema import PADDING, PANDAS_FALSE, PANDAS_TRUE, WHITESPACE_SEPARATOR, WORDS
from porter.rules.datetimes import GUESS_DAYFIRST_REASON, GUESS_REASON, Strptime, formatted_parse, guessed_parse, strptime_port
from porter.rules.strings import LIST_STR, list_repr
from porter.rules.ops import MASKED_DTYPES
from porter.translate import handover
from porter.translate.context import (PandasCall, RuleContext, Unsupported, derive,
                                     nullable_columns, select_columns)
from porter.translate.values import Frame, Indexed, Module, Opaque, PandasValue, Scalar, Value

# dtype= for every column that reads each as text: str and "str" (pandas 3.1's str dtype),
# "string" (StringDtype, pd.NA for missing) and object
ALL_TEXT_DTYPES = ("str", "string", "object")
READ_CSV_IGNORED = {"low_memory", "engine", "memory_map", "on_bad_lines"}
# read_csv's options beside which on_bad_lines="skip" is read (_scan_fields)
BAD_LINES_BESIDE = ("filepath_or_buffer", "sep", "delimiter", "na_values", "parse_dates",
                    "date_parser", "dayfirst", "on_bad_lines", "low_memory", "engine",
                    "memory_map")


def dtype_spelling(value: Value) -> str | None:
    """How a dtype was written: "int", "str", "float64", "category"…"""
    if isinstance(value, Opaque) and value.is_const:
        if isinstance(value.const, type):
            return value.const.__name__
        if isinstance(value.const, str):
            return value.const
    if isinstance(value, Module):
        return value.qualname.rsplit(".", 1)[-1]
    return None


def polars_dtype(value: Value) -> tuple[str, str]:
    spelled = dtype_spelling(value)
    if spelled is None or spelled not in DTYPES:
        raise Unsupported(f"dtype {value.code.text} has no Polars counterpart in porter's table")
    return DTYPES[spelled]


def _paths(source: Value) -> object:
    """The file a read names: its text, or the texts a function's calls pass for it."""
    if isinstance(source, Opaque):
        return source.const if source.is_const else (source.choices or None)
    return None


def _names_a_loop_variable(call: PandasCall, ctx: RuleContext) -> bool:
    """The path written in the call uses a name a for loop or a comprehension binds."""
    module, node = ctx.python_module, call.node
    if module is None or not isinstance(node, cst.Call) or not node.args:
        return True  # not knowable here: the careful answer
    targets = {n.id for loop in ast.walk(module) if isinstance(loop, (ast.For, ast.comprehension))
               for n in ast.walk(loop.target) if isinstance(n, ast.Name)}
    used: set[str] = set()

    class Names(cst.CSTVisitor):
        def visit_Name(self, name: cst.Name) -> None:
            used.add(name.value)

    node.args[0].value.visit(Names())
    return bool(used & targets)


def _files_of_a_loop(call: PandasCall, ctx: RuleContext,
                     keyword: str = "filepath_or_buffer") -> tuple[str, ...] | str | None:
    """The files a read whose path is a loop's or a comprehension's variable may open, listed
    in the --data folder (porter/analysis/globbed_files.py); why not, or None without --data."""
    lister = getattr(ctx.schema_lookup, "listing", None)
    module = ctx.python_module
    node = call.first_node(keyword) if keyword in call.kwargs or call.args else None
    if lister is None or module is None or node is None:
        return None
    from porter.analysis.globbed_files import listed_files
    try:
        path = ast.parse(cst.Module([]).code_for_node(node).strip(), mode="eval").body
    except SyntaxError:
        return "the path read is written in a way porter does not evaluate"
    files = listed_files(module, path, lister)
    if isinstance(files, tuple):
        if any(is_url(f) or compression_of(f) in NOT_DECOMPRESSED for f in files):
            return "a file listed is compressed in a way Polars' scans do not read, or a URL"
    return files


def _with_source(call: PandasCall, source: Value) -> PandasCall:
    if "filepath_or_buffer" in call.kwargs:
        return replace(call, kwargs={**call.kwargs, "filepath_or_buffer": source})
    return replace(call, args=(source, *call.args[1:]))


_LOOP_READ = ("the file read is only known when the script runs (a loop's or a comprehension's "
              "variable), and ")
# what the schema reader notes of a file beyond its column types, which the read is written
# for (FileSchema): files that differ in one of them are not read alike
_READ_DETAILS = ("padded", "line_ends", "pandas_nullable", "implicit_index",
                 "wide_ints", "typed_categories", "trailing_comments", "thousands_unsure",
                 "spaced_quotes", "words_unsure", "bad_lines_unsure", "bool_texts")


def _check_globbed(files: tuple[str, ...], reader: str, options: dict[str, Any],
                   ctx: RuleContext) -> Any:
    """Every file a loop lists must read as the same table: the same columns, in the same
    order, with the same pandas dtypes and the same reading details porter looks at (see
    _READ_DETAILS). Otherwise the read is a TODO naming the first file that differs and how.
    Returns the schema the read is written for: the first file's, with blank lines and rows
    of empty fields noted where any file has them, and each file's first dates."""
    from porter.analysis.schema import FileSchema
    found = [ctx.input_schema(reader, f, options) for f in files]
    for file, schema in zip(files, found):
        if not isinstance(schema, FileSchema):
            raise ctx.todo(_LOOP_READ + f"porter could not read the schema of {file} under "
                           "--data; the read stays pandas'")
    first_file, first = files[0], found[0]
    assert isinstance(first, FileSchema)
    for file, schema in zip(files[1:], found[1:]):
        assert isinstance(schema, FileSchema)
        reason = None
        if schema.no_rows != first.no_rows:
            header_only = file if schema.no_rows else first_file
            reason = (f"{header_only} holds a header only (pandas reads its columns as object, "
                      "where the other files give typed columns, and pd.concat then makes "
                      "object columns)")
        elif list(schema) != list(first):
            reason = (f"the files listed have other columns ({first_file}: {', '.join(first)}; "
                      f"{file}: {', '.join(schema)}): pandas reads each with its own")
        elif differ := [c for c in first if first[c] != schema[c]
                        or (first.polars or {}).get(c) != (schema.polars or {}).get(c)]:
            column = differ[0]
            reason = (f"the files listed give column {column!r} other types ({first_file}: "
                      f"{_pandas_kind(first, column)}, {file}: {_pandas_kind(schema, column)}; "
                      "an all-blank column is float to pandas, whole numbers with a blank too)")
        elif "na_values" in options and schema.missing_ints != first.missing_ints:
            # whole numbers typed float by a blank: pandas matches them with na_values' numbers
            # otherwise than it matches floats (see _numbers_missing)
            reason = (f"{first_file} and {file} differ in which columns hold whole numbers "
                      "with a blank, which na_values= reads otherwise")
        elif schema.polars != first.polars or any(
                getattr(schema, d) != getattr(first, d) for d in _READ_DETAILS):
            details = [d for d in _READ_DETAILS if getattr(schema, d) != getattr(first, d)]
            reason = (f"{first_file} and {file} differ in how pandas reads them "
                      f"({', '.join(details) or 'column types'})")
        if reason is not None:
            raise ctx.todo(_LOOP_READ + reason + "; the read stays pandas'")
    combined = FileSchema(first)
    combined.__dict__.update(first.__dict__)
    looked = [s.blank_lines for s in found]  # type: ignore[union-attr]
    combined.blank_lines = None if None in looked else any(looked)
    combined.empty_rows = any(s.empty_rows for s in found)  # type: ignore[union-attr]
    combined.missing_ints = frozenset().union(*(s.missing_ints for s in found))  # type: ignore[union-attr]
    # parse_dates: pandas guesses each file's format from its own first value
    # (_parsed_dates), and keeps a file's column as text where a value does not fit it
    combined.first_texts_each = [s.first_texts or {} for s in found]  # type: ignore[union-attr]
    heads: dict[str, list[str]] = {}
    for s in found:
        for column, values in (s.text_heads or {}).items():  # type: ignore[union-attr]
            heads.setdefault(column, []).extend(values)
    combined.text_heads = heads or first.text_heads
    return combined


def _pandas_kind(schema: Any, column: str) -> str:
    polars = (schema.polars or {}).get(column)
    return f"{schema[column]} ({polars})" if polars else str(schema[column])


@rule("pd.read_csv")
def read_csv(call: PandasCall, ctx: RuleContext) -> Value:
    """pd.read_csv -> pl.scan_csv; index_col="k" -> the table labelled by column k (as
    df.set_index("k"): the column kept first, held as the index).

    index_col: one column by name, or by position where porter knows the columns (--data);
    several columns and index_col with usecols are TODOs. See _read_modern_csv for the rest."""
    index_col = call.const("index_col", None, None, kinds=(str, int, type(None)))
    if index_col is None:
        return _read_modern_csv(call, ctx)
    if isinstance(index_col, bool):
        raise ctx.todo("index_col=False / True: read without it")
    if call.has("usecols", 1):
        raise ctx.todo("index_col with usecols: set_index after reading")
    frame = _read_modern_csv(
        replace(call, kwargs={k: v for k, v in call.kwargs.items() if k != "index_col"}), ctx)
    if not isinstance(frame, Frame):
        raise ctx.todo("index_col on a read porter keeps on pandas")
    if isinstance(index_col, int):
        if frame.columns is None or not -len(frame.columns) <= index_col < len(frame.columns):
            raise ctx.todo("index_col by position where porter does not know the columns (run "
                           "with --data)")
        index_col = frame.columns[index_col]
    elif frame.columns is not None and index_col not in frame.columns:
        raise ctx.todo(f"index_col {index_col!r} is not a column of the file (pandas raises)")
    return Indexed(handover.to_pandas(frame).method("set_index", index_col), frame=frame, key=index_col,
                   sites=frame.sites)


def _read_modern_csv(call: PandasCall, ctx: RuleContext) -> Value:
    """pd.read_csv -> pl.scan_csv.

    Handles: pandas' missing-value tokens (null_values), type inference over the whole file
    (infer_schema_length=None), sep, usecols in file order, dtype, parse_dates, na_values
    (one value, a list, or a dict of columns: see _emptied_columns; a number, given as text or
    not, also in its other spellings in float columns: see _numbers_missing), nrows, skiprows
    (a count), decimal="," (decimal_comma), header=None / 0 with names=[...] (has_header, new_columns), dtype=str / "str" / object / "string" for every column (infer_schema_length=0),
    comment= (comment_prefix), keep_default_na=False (empty_string_is_null=False),
    compression= gzip / zstd / infer. With --data: header=None without names (the columns
    "0", "1", ... as pandas' integer labels), thousands=, skipinitialspace=True, a list of
    skiprows, true_values / false_values and a usecols function (read as text, then cast to
    the types pandas infers, read from the sample); sep=r"\\s+" (each line split at runs of
    spaces and tabs by pl.scan_lines and str.extract_all, then cast; with na_values= only,
    and where the sample has no quotes and the same number of fields on every line).
    Caveats: converters, encodings
    other than UTF-8, latin-1 and cp1252 (read eagerly by pl.read_csv(encoding=...).lazy()),
    on_bad_lines="skip"/"warn" beside options other than sep=, na_values=, parse_dates= and
    date_parser= or without --data (pandas leaves out a row with more fields than the header:
    with --data the lines are split at the separator, _scan_fields) and sep=None (pandas
    guesses the separator) are TODOs; na_values per column needs --data (or a
    dtype= for those columns), and so do the options above. A comment after the data on a
    line is a TODO with --data (pandas cuts it, Polars keeps it), 0.8 without. With nrows, Polars still infers types from the whole file (0.9).
    Integers beyond int64 beside a negative value or a blank (text in pandas, Int128 in
    Polars) are a TODO when --data shows them.
    parse_dates follows pandas' guess of one format from the first value (05/03/2024 month
    first; day first with dayfirst=True, 2024-01-05 too): with --data made at convert time from the sample and written out (0.9), else made
    at run time by pandas_to_datetime (0.8); a value that does not fit stops the script where
    pandas leaves the column as text, except that a column whose values in --data's first 1000
    rows do not all fit is left as text, as pandas leaves it (0.9). An empty header is named "Unnamed: n" only when --data shows
    it; a repeated header name is a TODO then.
    Older pandas' options (porter/rules/legacy.py): squeeze=True (a file of one column read as
    that column), error_bad_lines= / warn_bad_lines= (as on_bad_lines=), delim_whitespace=True
    (as sep=r"\\s+") and infer_datetime_format= (no effect on the values: left out).
    """
    from porter.rules.legacy import modern_read_csv, squeezed
    call, squeeze, rewritten = modern_read_csv(call, ctx)
    try:
        read = _read_csv(call, ctx)
    except Unsupported as exc:
        if not rewritten:
            raise
        raise Unsupported(f"{rewritten} in pandas 3 (older pandas' option): {exc.reason}") from None
    return squeezed(read, ctx) if squeeze else read


def _read_csv(call: PandasCall, ctx: RuleContext) -> Value:
    known = {"filepath_or_buffer", "sep", "delimiter", "usecols", "dtype", "parse_dates",
             "dayfirst", "na_values", "keep_default_na", "nrows", "skiprows", "encoding", "header", "names",
             "decimal", "comment", "thousands", "skipinitialspace", "compression",
             "true_values", "false_values", "date_parser", "keep_date_col",
             *READ_CSV_IGNORED}
    ctx.reject_unknown(call, *known, positional=1)
    source = call.arg("filepath_or_buffer", 0)
    check_source(source, ctx)
    _compression(call, source, ctx)
    globbed: tuple[str, ...] | None = None
    if _paths(source) is None and _names_a_loop_variable(call, ctx):
        # one of many files (a loop's or a comprehension's): Polars infers the types of each
        # file porter never saw, and its inference differs from pandas' (a day's file with an
        # all-blank column is text to it, float64 to pandas, and the concat then differs).
        # With --data, a loop over a listing porter can make there (glob.glob, Path.glob,
        # os.listdir) names the files: the scan is told the schema they all share
        listed = _files_of_a_loop(call, ctx)
        if not isinstance(listed, tuple):
            raise ctx.todo("the file read is only known when the script runs (a loop's or a "
                           "comprehension's variable): pandas reads numbers written \" 5\" or "
                           "\"+3\", an all-blank column as float and a file of a header only as "
                           "object columns, where Polars' scan infers text; the read stays "
                           "pandas'" + (f" ({listed})" if listed else
                                        " (with --data, porter reads the files of a glob.glob, "
                                        "Path.glob or os.listdir the loop goes over)"))
        globbed = listed
        source = replace(source, choices=listed)
        call = _with_source(call, source)
        ctx.lower("the files the loop lists when the script runs may be others than --data's: "
                  "each is read with the types the files listed there share (a value that does "
                  "not fit fails, loudly)", 0.95)
    if _paths(source) is None:
        ctx.lower("the file is named when the script runs (porter never saw it): Polars infers "
                  "its types over the whole file as pandas does, but reads numbers written "
                  "\" 5\" or \"+3\", an all-blank column and a file of a header only as text", 0.9)
    keep_default_na = call.const("keep_default_na", None, True, kinds=(bool,)) is not False
    bad_lines = call.const("on_bad_lines", None, "error", kinds=(str,)) if call.has("on_bad_lines") else "error"
    skip_bad = bad_lines in ("skip", "warn")
    if skip_bad:
        # pandas leaves out a row with more fields than the header (and with "warn" says so on
        # stderr); Polars' reader keeps it, its extra fields cut off, or fails on it: the file's
        # lines are split at the separator here (_scan_fields), with --data showing no quotes
        others = set(call.kwargs) - set(BAD_LINES_BESIDE)
        if others or len(call.args) > 1:
            raise ctx.todo(f"on_bad_lines={bad_lines!r} beside "
                           f"{', '.join(sorted(others)) or 'more arguments'}: pandas leaves out "
                           "a row with more fields than the header, Polars' reader keeps it (its "
                           "extra fields cut off); porter splits the lines itself beside "
                           f"{', '.join(BAD_LINES_BESIDE[1:4])}, parse_dates= and "
                           "date_parser= only")
    elif bad_lines != "error":
        raise ctx.todo(f"on_bad_lines={bad_lines!r}: pandas calls the function with each line "
                       "that has more fields than the header")
    for name in ("sep", "delimiter"):
        if call.has(name) and call.const(name, None, "", kinds=(str, type(None))) is None:
            # sep=None (engine="python"): pandas guesses the separator from the file's first
            # line (csv.Sniffer); the scan would read commas
            raise ctx.todo(f"{name}=None: pandas guesses the separator from the file's first "
                           "line; give it (sep=\";\") so the scan reads it")
    options: dict[str, Any] = {}
    if skip_bad:
        options["on_bad_lines"] = "skip"  # the schema reader leaves those lines out too
    kwargs: dict[str, object] = {}
    sep = call.const("sep", None, None, kinds=(str,)) or call.const("delimiter", None, None, kinds=(str,))
    words = sep == WHITESPACE_SEPARATOR  # fields split at runs of spaces and tabs
    if words and skip_bad:
        raise ctx.todo(f"on_bad_lines={bad_lines!r} beside sep={sep!r}: pandas leaves out a row "
                       "with more fields than the header; porter splits the lines at one "
                       "separator character only")
    if words:
        others = set(call.kwargs) - {"sep", "delimiter", "na_values", *READ_CSV_IGNORED}
        if others or len(call.args) > 1:
            raise ctx.todo(f"sep={sep!r} beside {', '.join(sorted(others)) or 'more arguments'}: "
                           "porter splits a file at runs of spaces with na_values= only")
        options["sep"] = sep
    elif sep is not None:
        if len(sep) != 1:
            raise ctx.todo(f"separator {sep!r} is not a single character (pandas reads it as a regex)")
        if sep != ",":
            kwargs["separator"] = sep
        options["sep"] = sep
    encoding = call.const("encoding", None, None, kinds=(str,))
    decoded = None  # an encoding Polars' scan does not read: the file is read eagerly
    if encoding is not None and encoding.lower().replace("-", "").replace("_", "") not in ("utf8", "utf8sig"):
        spelled = encoding.lower().replace("_", "-")
        if spelled not in SINGLE_BYTE_ENCODINGS:
            raise ctx.todo(f"encoding {encoding!r}: Polars' scan reads UTF-8 only, and porter "
                           "reads only latin-1 / iso-8859-1 / cp1252 eagerly; re-encode the file "
                           "first")
        if compression_of(str(_paths(source) or "")) is not None:
            raise ctx.todo(f"encoding {encoding!r} of a compressed file: Polars' eager reader "
                           "decodes the bytes before it decompresses them")
        # pl.read_csv decodes the file with Python's codec (as pandas does), then reads it
        decoded = encoding
        options["encoding"] = spelled
    _header_and_names(call, ctx, kwargs, options)
    comment = call.const("comment", None, None, kinds=(str, type(None))) if call.has("comment") else None
    if comment is not None:
        if len(comment) != 1:
            raise ctx.todo(f"comment={comment!r}: pandas takes a single character")
        if call.has("skiprows"):
            # pandas skips the lines first and then the comments; Polars' skip_rows counts
            # otherwise beside comment_prefix (measured: it reads a skipped header)
            raise ctx.todo("comment= beside skiprows=: Polars' reader counts the skipped rows "
                           "otherwise than pandas beside a comment prefix")
        # a line starting with the character is skipped by both (in a quoted field it is
        # text in both); one after data on a line is looked for below (--data)
        kwargs["comment_prefix"] = comment
        options["comment"] = comment
    decimal = call.const("decimal", None, ".", kinds=(str,)) if call.has("decimal") else "."
    if decimal not in (".", ","):
        raise ctx.todo(f"decimal={call.arg('decimal').code.text}: Polars' reader reads a "
                       "decimal point or a decimal comma only")
    if decimal == ",":
        # pandas and Polars' decimal_comma read "1,5" as 1.5 and leave a column holding
        # "1.5" text (measured: the same types, the same values, quoted or not)
        if (sep or ",") == ",":
            ctx.lower("decimal=\",\" beside the comma separator: only quoted numbers (\"1,5\") "
                      "are read as decimals, as in pandas", 0.95)
        kwargs["decimal_comma"] = True
        options["decimal"] = ","
    thousands = call.const("thousands", None, None, kinds=(str, type(None))) \
        if call.has("thousands") else None
    if thousands is not None:
        if len(thousands) != 1 or thousands.isalnum():
            raise ctx.todo(f"thousands={thousands!r}: porter reads one character that is not "
                           "a letter or a digit")
        if thousands == decimal:
            raise ctx.todo(f"thousands={thousands!r} is the decimal character too: pandas "
                           "reads \"1.5\" as 15")
        if call.has("dtype"):
            # pandas strips the separator from a column given a number dtype too, Polars'
            # reader fails on "1,234" told it is Int64
            raise ctx.todo("thousands= beside dtype=: Polars' reader does not read \"1,234\" "
                           "as a number when told the column's type")
        # Polars' reader has no thousands separator: with --data porter finds the columns
        # pandas reads as numbers ("1,234", quoted beside the comma separator), reads them as
        # text, removes the separator and casts them (the `padded` columns below)
        options["thousands"] = thousands
    skip_spaces = call.const("skipinitialspace", None, False, kinds=(bool,)) \
        if call.has("skipinitialspace") else False
    if skip_spaces:
        if options.get("header", 0) is None or "names" in options:
            raise ctx.todo("skipinitialspace=True beside header=None or names=")
        if decimal != ".":
            raise ctx.todo("skipinitialspace=True beside decimal=\",\"")
        # pandas removes the spaces after each separator (and before a header name) before it
        # reads the field: a field " NA" is missing, " 5" a number. Polars' reader has no such
        # option: the scan reads every field as text, the spaces are removed, pandas' tokens
        # made missing and the columns cast to the types --data shows pandas reads
        options["skipinitialspace"] = True
    bool_texts: dict[str, bool] = {}
    for name, meaning in (("true_values", True), ("false_values", False)):
        given = call.const(name, None, None, kinds=(list, tuple)) if call.has(name) else None
        if given is not None and not all(isinstance(t, str) for t in given):
            raise ctx.todo(f"{name}={given!r}: porter reads a list of texts")
        if given:
            options[name] = tuple(given)
            for text in given:
                if bool_texts.setdefault(text, meaning) is not meaning:
                    raise ctx.todo(f"{text!r} is among both true_values and false_values")
    per_column = _na_values_per_column(call, ctx, keep_default_na)
    na_values = None if per_column is not None else call.const_values("na_values")
    nulls: object = emit.atom(NA_CONSTANT)
    if na_values is not None:
        extra = na_value_texts(na_values)
        nulls = emit.binop(emit.atom(NA_CONSTANT), "+", [v for v in extra if v not in PANDAS_NA_TOKENS])
        options["na_values"] = extra
    if not keep_default_na:
        # pandas' own tokens are not missing then, nor is an empty field (""): only the
        # na_values given are. Polars' reader keeps "" with empty_string_is_null=False, but
        # reads an empty field of a number column as missing where pandas makes the column
        # text: with --data porter reads such columns as text (schema.py)
        if skip_spaces:
            raise ctx.todo("keep_default_na=False beside skipinitialspace=True")
        nulls = na_value_texts(na_values) if na_values is not None else None
        kwargs["empty_string_is_null"] = False
        options["keep_default_na"] = False
    if nulls is not None:
        kwargs["null_values"] = nulls
    dtype = call.const("dtype", None, None) if call.has("dtype") and _const_dtype_dict(call) else None
    all_text = False
    if call.has("dtype") and dtype is None:
        dtype_value = call.arg("dtype")
        spelled = dtype_spelling(dtype_value)
        if spelled is None and dtype_value.code.text in ("str", "object", "np.object_"):
            spelled = "object" if "object" in dtype_value.code.text else "str"  # the builtins
        if spelled not in ALL_TEXT_DTYPES:
            raise ctx.todo(f"dtype={spelled or dtype_value.code.text} for every column: give a dict of columns")
        # every column read as text as the file writes it (" 5", "007", "+3", "1,200.5"):
        # Polars' scan with no type inference; pandas' missing-value tokens still read as
        # missing in both (keep_default_na=False is a TODO above)
        all_text = True
        options["dtype"] = "str"
        if spelled == "object":
            ctx.lower("dtype=object: pandas' columns are object (dtypes says so) where the "
                      "values read are the same text; a frame handed back to pandas has str "
                      "columns", 0.95)
        if spelled == "string":
            ctx.lower('dtype="string": pandas holds pd.NA for a missing value and its string '
                      "methods give nullable results (str.len() is Int64 with <NA>, a "
                      "comparison <NA>, not False); the values read and what to_csv writes "
                      "are the same", 0.9)
    overrides: dict[str, Code] = {}
    dtypes: dict[str, str] = {}
    nullable: dict[str, str] = {}  # pandas' nullable integers (dtype={"c": "Int64"})
    if dtype:
        for column, kind in call.kwargs["dtype"].const.items():  # type: ignore[union-attr]
            spelled = kind.__name__ if isinstance(kind, type) else str(kind)
            if spelled not in DTYPES:
                raise ctx.todo(f"dtype {spelled!r} for column {column!r} is not in porter's table")
            if spelled in NULLABLE_INT_DTYPES or spelled in MASKED_DTYPES:
                # pandas' nullable types: a hand-over gives them back (<NA>, not None or NaN)
                nullable[column] = spelled
            overrides[column] = emit.atom(DTYPES[spelled][0])
            dtypes[column] = DTYPES[spelled][1]
        options["dtype"] = dict(call.kwargs["dtype"].const)  # type: ignore[union-attr]
        kwargs["schema_overrides"] = overrides
    kwargs["infer_schema_length"] = 0 if all_text else None
    skiprows = call.const("skiprows", None, None, kinds=(int, list, tuple))
    dropped: list[int] = []  # the data rows a list of skiprows leaves out, as the scan counts
    if skiprows is not None and not isinstance(skiprows, int):
        rows = list(skiprows)
        if not all(isinstance(r, int) and not isinstance(r, bool) and r >= 0 for r in rows):
            raise ctx.todo(f"skiprows={rows!r}: porter reads rows as numbers from 0")
        # pandas counts the file's rows from 0 (the header line is 0; a blank line is a row, a
        # quoted field over several lines one row): the first rows skipped one after the other
        # are the scan's skip_rows, the others are left out after a scan of text, before
        # the types --data shows pandas infers for what is left are cast
        rows = sorted(set(rows))
        first = 0
        while first in rows:
            first += 1
        later = [r for r in rows if r > first]
        skiprows = first or None
        if later:
            if call.has("nrows") or not keep_default_na:
                raise ctx.todo("skiprows= a list beside nrows= or keep_default_na=False")
            header_line = 0 if options.get("header", 0) is None else 1
            dropped = [r - first - header_line for r in later]
            options["skiprows_list"] = tuple(dropped)
    if skiprows is not None:
        kwargs["skip_rows"] = skiprows
        options["skiprows"] = skiprows
    nrows = call.const("nrows", None, None, kinds=(int,))
    if nrows is not None:
        kwargs["n_rows"] = nrows
        # pandas infers column types from the rows it reads: with --data porter reads the
        # types of those rows (schema.py) and the scan is told them
        options["nrows"] = nrows

    schema = ctx.input_schema("csv", _paths(source), options)
    if globbed is not None:
        schema = _check_globbed(globbed, "csv", options, ctx)
    if schema is None and isinstance(_paths(source), str) and not options.keys() - {"sep"}:
        written = _written_frame(_paths(source), sep or ",", ctx)  # type: ignore[arg-type]
        if written is not None:
            overrides = {**_read_back_types(written, ctx), **overrides}
            kwargs["schema_overrides"] = overrides
    if skip_spaces and getattr(schema, "spaced_quotes", False):
        raise ctx.todo("skipinitialspace=True and a quoted field after spaces (a, \"b, c\"): "
                       "pandas starts the quoted field after the spaces, Polars' reader keeps "
                       "the spaces and the quotes as text (and splits the field at its comma)")
    if skip_spaces and (not getattr(schema, "polars", None) or getattr(schema, "partial", False)
                        or "" in schema.polars):  # type: ignore[union-attr]
        raise ctx.todo("skipinitialspace=True: Polars' reader has no option to remove the "
                       "spaces after a separator; porter removes them after a scan of text and "
                       "casts each column to the type pandas reads, which it knows with --data "
                       "only (for columns of numbers or text)")
    if bool_texts and (schema is None or getattr(schema, "partial", False)):
        raise ctx.todo("true_values= / false_values=: Polars' reader has no such option; porter "
                       "makes True/False of the text columns whose every value is one of them, "
                       "which it finds with --data")
    if dropped and (not getattr(schema, "polars", None) or getattr(schema, "partial", False)
                    or "" in schema.polars):  # type: ignore[union-attr]
        raise ctx.todo("skiprows= a list of rows: pandas infers the column types from the rows "
                       "it keeps; porter leaves the rows out after a scan of text and casts the "
                       "columns to the types it reads from --data (columns of numbers or text)")
    if thousands is not None and (schema is None or getattr(schema, "partial", False)):
        raise ctx.todo(f"thousands={thousands!r}: Polars' reader has no thousands separator; "
                       "porter removes it from the columns pandas reads as numbers, which it "
                       "finds with --data (run with --data, or read those columns as text and "
                       "remove it)")
    for column in getattr(schema, "thousands_unsure", ()):
        raise ctx.todo(f"thousands={thousands!r}: column {column!r} holds the separator doubled "
                       "after a digit (\"1,,234\": a number to pandas in a column of integers, "
                       "text in one of floats) or an integer of more than 18 digits")
    if comment is not None and getattr(schema, "trailing_comments", False):
        raise ctx.todo(f"comment={comment!r} after the data on a line (1,2 {comment} note), or "
                       "after spaces: pandas cuts the line there, Polars' comment_prefix skips "
                       "only lines that start with it and keeps the rest of this one in the last "
                       "field")
    if comment is not None and schema is None:
        ctx.lower(f"comment={comment!r}: lines that start with it are skipped, as pandas skips "
                  f"them; a comment after the data on a line (1,2 {comment} note) is cut off by "
                  "pandas and kept in the last field by Polars (run with --data to have porter "
                  "look)", 0.8)
    if options.get("number_names"):
        if schema is None or getattr(schema, "partial", False) or not schema:
            raise ctx.todo("header=None without names=: pandas names the columns by the "
                           "integers 0, 1, ...; porter names them \"0\", \"1\", ... when "
                           "--data holds the file and shows how many there are")
        # the scan names the columns as the schema reader named them ("0", "1", ...)
        kwargs["new_columns"] = list(schema)
    if nrows is not None and getattr(schema, "polars", None) is None:
        # Polars infers column types from the whole file even when it reads n rows (and parses
        # past them), pandas only from the rows it reads.
        ctx.lower("nrows: pandas infers column types from the rows it reads, Polars from the "
                  "whole file (a column whose later rows hold text is read as text)", 0.9)
    if nrows is not None and getattr(schema, "blank_lines", False):
        raise ctx.todo("nrows with blank lines among the rows read: pandas skips them and "
                       "reads the next rows, Polars counts each as one of the n_rows")
    emptied: list[tuple[str, list[str], Code | None, str, bool]] = []
    if per_column is not None:
        emptied = _emptied_columns(per_column, schema, overrides, dtypes, source, options, ctx)
        if emptied:  # read as text, so that no token is lost to a type Polars infers first
            kwargs["schema_overrides"] = {**overrides, **{c: emit.atom("pl.String") for c, *_ in emptied}}
    line_ends = getattr(schema, "line_ends", None)
    if line_ends == "mixed":
        raise ctx.todo("the file's lines end in a bare carriage return (\\r) beside lines ending "
                       "in \\n: pandas ends a line at each, Polars' reader at \\n only (it "
                       "joins lines, or keeps the \\r in the last field)")
    if line_ends == "cr":
        # every line ends in a bare \r (old Mac files): pandas reads each as a line, Polars'
        # reader does when told that \r ends a line
        kwargs["eol_char"] = "\r"
        ctx.lower("the file's lines end in a bare carriage return (\\r), which the scan is "
                  "told: a file of the same name whose lines end otherwise is read as one "
                  "line", 0.95)
    if getattr(schema, "implicit_index", False):
        raise ctx.todo("the data rows have one field more than the header (a trailing "
                       "separator): pandas reads the first field of each row as the row labels "
                       "and gives the header's names to the rest, Polars' reader fails on the "
                       "extra field")
    for column in getattr(schema, "typed_categories", ()):
        raise ctx.todo(f"dtype category for column {column!r}, whose values all read as numbers "
                       "(or True/False): pandas makes the categories numbers (007 becomes 7), "
                       "Polars' Categorical keeps the text")
    if schema is None and "category" in dtypes.values():
        ctx.lower("dtype category: pandas makes the categories numbers when every value reads "
                  "as one (007 becomes 7), Polars' Categorical keeps the text (--data would "
                  "tell)", 0.9)
    for column in getattr(schema, "wide_ints", ()):
        # pandas reads a column of integers beyond int64 as uint64 only when every value is
        # from 0 to 2**64 - 1 and none is missing (porter reads those UInt64); with a negative
        # value or a blank it reads text (a blank is "", not missing)
        raise ctx.todo(f"column {column!r} holds integers beyond int64 beside a negative value "
                       "or a blank: pandas reads it as text (a blank as \"\"), Polars as "
                       "Int128, which does not go to numpy or pandas; the read stays pandas'")
    if getattr(schema, "no_rows", False):
        # the types read from a file of a header only say nothing (every column is text to
        # Polars); pandas reads such columns as object: a sum is 0 and max/mean NaN, a concat
        # with it makes the other frames' columns object (select_dtypes, describe, mean
        # differ). Columns of no type (pl.Null) gave a missing sum and kept int types: the
        # read stays pandas'
        raise ctx.todo("the --data file has a header and no rows: pandas reads every column "
                       "as object (a sum is 0, max and mean NaN, a concat with it makes the "
                       "other frames' columns object); Polars has no such columns")
    exact = getattr(schema, "polars", None)
    if skip_bad and (not exact or "" in exact or getattr(schema, "partial", False)
                     or not all(t in TEXT_CASTS for t in exact.values())):
        raise ctx.todo(f"on_bad_lines={bad_lines!r}: pandas leaves out a row with more fields "
                       "than the header, Polars' reader keeps it (its extra fields cut off); "
                       "porter splits the lines at the separator itself and casts the columns "
                       "to the types pandas reads, which it knows with --data only (columns of "
                       "numbers or text, no quotes, no carriage returns, no lines of spaces, "
                       "the first data line no longer than the header)")
    if words and (not exact or "" in exact or getattr(schema, "partial", False)
                  or not all(t in TEXT_CASTS for t in exact.values())):
        raise ctx.todo(f"sep={sep!r}: porter splits the lines at runs of spaces and tabs itself "
                       "and casts the columns to the types pandas reads, which it knows with "
                       "--data only (columns of numbers or text, the same number of fields on "
                       "every line, no quotes)")
    if exact and "" not in exact:
        # --data gave the file: the scan is told the types porter read (inferring them over
        # the whole file again would read it twice). They are matched to the header by name;
        # a later file whose values do not fit them fails loudly, and a column it adds is
        # read as text (infer_schema_length=0) where pandas would infer its type
        scan_types = kwargs.pop("schema_overrides", overrides)
        kwargs.pop("infer_schema_length", None)
        types = {c: scan_types.get(c, emit.atom(t)) for c, t in exact.items()}
        kwargs = {"schema_overrides": types, "infer_schema_length": 0, **kwargs}
        ctx.lower("the column types are the ones read from --data: a file whose values do not "
                  "fit them fails to read, and a column it adds is read as text (pandas would "
                  "infer other types)", 0.95)
        if nrows is not None and not all(t.text in TEXT_CASTS for t in types.values()):
            # the typed reader parses past the n rows: a later value that does not fit the
            # types of the rows read stops it where pandas never reads that value
            ctx.lower("nrows: the scan is told the types of the rows pandas reads; Polars' "
                      "reader also parses some rows past them, and a value there that does "
                      "not fit those types (True/False) stops the read", 0.9)
        text_casts = TEXT_CASTS + (("pl.Boolean",) if skip_spaces or dropped else ())
        if (skip_spaces or dropped) and not (all(t.text in text_casts for t in types.values())
                                             and decimal == "."):
            raise ctx.todo(("skipinitialspace=True" if skip_spaces else "skiprows= a list")
                           + " beside a column of a type porter does not cast from text as the "
                           "reader reads it, or decimal=\",\"")
        if all(t.text in text_casts for t in types.values()) and decimal == ".":
            # (a cast of "1,5" to Float64 fails: a decimal comma is read by the typed scan)
            code = _scan_as_text(source.code, kwargs, types, bool(getattr(schema, "partial", False)),
                                 decoded, strip_start=skip_spaces, dropped=dropped,
                                 words=list(exact) if words else None,
                                 fields=(sep or ",", list(exact)) if skip_bad else None)
            if skip_bad:
                ctx.lower(f"on_bad_lines={bad_lines!r}: each line is split at the separator "
                          "and a line with more fields than the header left out, as pandas "
                          "does; a quoted field holding the separator is split (--data showed "
                          "no quotes)" + (", and pandas' message on stderr for each line "
                                          "left out is not written" if bad_lines == "warn"
                                          else ""), 0.95)
            if words:
                ctx.lower("sep=r\"\\s+\": each line is split at runs of spaces and tabs; a "
                          "line with more fields than the header is cut to the header's (pandas "
                          "fails on it), and a quoted field holding spaces is split (--data "
                          "showed no quotes)", 0.95)
        else:
            code = _scan(source.code, kwargs, decoded)
    else:
        code = _scan(source.code, kwargs, decoded)
    if schema and any(re.search(r"_duplicated_\d+$", c) for c in schema):
        raise ctx.todo("the header repeats a name: pandas names the copy 'x.1' (an empty one "
                       "'Unnamed: n'), Polars '_duplicated_n'")
    unnamed = {c: f"Unnamed: {i}" for i, c in enumerate(schema or {}) if c == ""}
    if unnamed:  # an empty header (a written index): pandas names it by its position
        code = code.method("rename", unnamed)
        schema = {unnamed.get(c, c): kind for c, kind in schema.items()}  # type: ignore[union-attr]
    if not keep_default_na and schema is None:
        ctx.lower("keep_default_na=False: an empty field in a column of numbers makes pandas "
                  "read the column as text (\"\"), Polars reads a missing number (run with "
                  "--data to have porter look)", 0.8)
    if getattr(schema, "blank_lines", False):
        if not keep_default_na:
            raise ctx.todo("keep_default_na=False and blank lines: pandas skips them, Polars "
                           "reads each as a row of empty texts")
        if getattr(schema, "empty_rows", False):
            raise ctx.todo("the file has blank lines, which pandas skips and Polars reads as rows "
                           "of missing values, beside lines of only spaces or of empty fields, "
                           "which porter cannot tell from them after the scan")
        # pandas skips blank lines; Polars reads each as a row of missing values
        code = code.method("filter", emit.unary("~", emit.pl("all_horizontal", emit.atom("pl.all().is_null()"))))
    padded = getattr(schema, "padded", None)
    if padded:
        # numbers with spaces around them or a plus sign (" 5", "+3"): pandas reads numbers,
        # Polars text; stripped and cast as pandas types them (--data showed every value fits)
        stripped = {c: emit.col(unnamed.get(c, c)).attr("str").method("strip_chars", PADDING)
                    for c in padded}
        if thousands is not None:  # "1,234" -> "1234" (--data showed where it is one number)
            stripped = {c: e.attr("str").method("replace_all", thousands, "", literal=True)
                        for c, e in stripped.items()}
        if decimal == ",":  # "1,5" -> "1.5", which the cast reads (decimal=",")
            stripped = {c: e.attr("str").method("replace", ",", ".", literal=True)
                        for c, e in stripped.items()}
        code = code.method("with_columns", *[
            stripped[c].method("cast", emit.atom(t)) for c, t in padded.items()])
        ctx.lower("numbers written with spaces around them or a plus sign"
                  + (f" or the thousands separator {thousands!r}" if thousands is not None else "")
                  + " are read as text" + (", the separator removed," if thousands is not None else "")
                  + " and cast (--data showed every value of those columns is a number)", 0.95)
    made_bool = list(getattr(schema, "bool_texts", ()))
    if made_bool:
        # true_values / false_values: pandas reads a column whose every value is one of them
        # (or True/False as pandas writes them) as True/False; the scan read it as text
        meaning = {**{t: True for t in PANDAS_TRUE}, **{t: False for t in PANDAS_FALSE},
                   **bool_texts}
        code = code.method("with_columns", *[
            emit.col(unnamed.get(c, c)).method("replace_strict", meaning,
                                                return_dtype=emit.atom("pl.Boolean"))
            for c in made_bool])
        for c in made_bool:
            dtypes[unnamed.get(c, c)] = "bool"
    if emptied:
        # pandas empties these columns' own tokens before it infers their types
        exprs = []
        for column, tokens, cast, kind, by_value in emptied:
            expr = emit.col(column).method("replace", tokens, None)
            expr = expr.method("cast", cast) if cast is not None else expr
            # the column's numbers however they are written (see _numbers_missing)
            numbers = na_value_numbers(tokens) if by_value else []
            exprs.append(expr.method("replace", numbers, None) if numbers else expr)
            dtypes[column] = kind
        code = code.method("with_columns", *exprs)
    columns = tuple(schema) if schema and not getattr(schema, "partial", False) else None
    for column, kind in (schema or {}).items():
        if kind != "other":
            dtypes.setdefault(column, kind)
    numbers = na_value_numbers(na_values) if na_values is not None else []
    if numbers:
        code = _numbers_missing(code, numbers, dtypes if columns is not None else None,
                                getattr(schema, "missing_ints", frozenset()))
    # pandas' read_csv makes plain numpy integers (float64 with a missing value) unless told
    frame = Frame(code, columns=columns, dtypes=tuple(dtypes.items()),
                  nullable_ints=tuple(nullable.items()),
                  # header=None without names=: pandas' labels are the integers 0, 1, ...
                  number_labels=columns if options.get("number_names") and columns else ())

    chooser = _usecols_function(call, ctx)
    if chooser is not None:
        # usecols=lambda c: ...: pandas calls it with each name of the header and keeps the
        # columns it says yes to; porter calls it with the names --data shows
        if frame.columns is None:
            raise ctx.todo("usecols given as a function: porter calls it with the header's names, "
                           "which it knows with --data only (or list the columns)")
        try:
            chosen = [c for c in frame.columns if chooser(c)]
        except Exception as error:  # noqa: BLE001 - the script's function, on a header name
            raise ctx.todo(f"usecols given as a function fails on a header name ({error})")
        if not chosen:
            raise ctx.todo("usecols given as a function keeps no column (pandas reads an empty frame)")
        frame = _select_in_file_order(frame, chosen, ctx)
        ctx.lower("usecols given as a function: called with the header of the --data file; a "
                  "file with other columns gets these ones", 0.95)
        usecols = None
    else:
        usecols = call.const_values("usecols", kinds=(str, int))
    if usecols is not None:
        frame = _select_in_file_order(frame, usecols, ctx)
    parse_dates = call.const("parse_dates", None, None, kinds=(bool, list, tuple, dict))
    parser_format = _date_parser_format(call, ctx)
    if call.const("keep_date_col", None, False, kinds=(bool,)):
        raise ctx.todo("keep_date_col=True (removed in pandas 3): the joined columns kept "
                       "beside the combined one")
    if parser_format is not None and not parse_dates:
        raise ctx.todo("date_parser= without parse_dates: pandas never calls it")
    if parse_dates and _combines_columns(parse_dates):
        frame = _combined_dates(frame, parse_dates, parser_format, schema, ctx)
    elif parse_dates:
        if parse_dates is True or not all(isinstance(c, str) for c in parse_dates):
            raise ctx.todo("parse_dates must list column names")
        # dayfirst= only changes pandas' guess of each column's format
        dayfirst = call.const("dayfirst", None, False, kinds=(bool,))
        parsed = {c: _parsed_dates(c, schema, ctx, parser_format, dayfirst=dayfirst)
                  for c in parse_dates}
        exprs = [e for e in parsed.values() if e is not None]
        dated = [c for c, e in parsed.items() if e is not None]
        if exprs:
            frame = derive(frame, frame.code.method("with_columns", *exprs), same_rows=True,
                           dtypes=tuple({**dict(frame.dtypes), **{c: "datetime" for c in dated}}.items()))
    if schema is None and ctx.schema_lookup is not None and isinstance(_paths(source), str) \
            and getattr(ctx.schema_lookup, "written_by_script", lambda path: False)(_paths(source)):
        # the script writes this file before it reads it: --data may hold an older copy
        # (translate.writes.FreshSchemas), so its types are not taken
        ctx.lower(f"the script writes {_paths(source)} before it reads it, so the copy under "
                  "--data may be an older one: the scan infers the types over the whole file, "
                  "from what the script wrote", 0.95)
    elif schema is None and ctx.schema_lookup is not None and isinstance(_paths(source), str) \
            and not is_url(_paths(source)):  # type: ignore[arg-type]
        ctx.lower(f"{_paths(source)} is not under the --data folder (paths are looked up from "
                  "it, as the script reads them from where it runs): the scan infers the types "
                  "over the whole file", 0.95)
    if schema is None and all_text:
        ctx.lower("a blank line is skipped by pandas and read as a row of missing values by "
                  "Polars (run with --data to have porter look)", 0.95)
    elif schema is None and not dtype:
        ctx.lower("column types are inferred from the data the same way in both, except "
                  "integer columns with missing values (float in pandas); a blank line is "
                  "skipped by pandas and read as a row of missing values by Polars (run with "
                  "--data to have porter look)", 0.95)
    return frame


def _header_and_names(call: PandasCall, ctx: RuleContext, kwargs: dict[str, object],
                      options: dict[str, Any]) -> None:
    """read_csv(header=None / 0, names=[...]) -> scan_csv(has_header=..., new_columns=[...]).

    header=None reads the first line as data; names= gives the columns their names (header=0
    beside it: the file's header line is read and replaced). pandas' dtype= and na_values
    keys are the new names, as are Polars' schema_overrides keys."""
    names = call.const("names", None, None, kinds=(list, tuple)) if call.has("names") else None
    if call.has("names") and (names is None or not all(isinstance(n, str) for n in names)):
        raise ctx.todo("names= must list the column names as texts")
    header: object = "infer"
    if call.has("header"):
        header = call.const("header", None, "?", kinds=(int, str, type(None)))
        if isinstance(header, bool) or header not in (None, 0, "infer"):
            raise ctx.todo(f"header={call.arg('header').code.text}: only header=None or 0 are "
                           "read (a later header line or several are not)")
    if header == "infer":  # pandas: no header line when names are given, else the first line
        header = None if names is not None else 0
    if header is None and names is None:
        # pandas labels the columns with the integers 0, 1, ...; Polars' names are text: the
        # scan names them "0", "1", ... and the frame carries them as number labels, which a
        # hand-over to pandas makes integers again (as for pd.DataFrame of rows). The count of
        # columns comes from --data (read_csv sets new_columns from it).
        for option in ("dtype", "usecols", "parse_dates", "converters"):
            if call.has(option):
                raise ctx.todo(f"header=None without names= beside {option}=: pandas names the "
                               "columns by the integers 0, 1, ..., which porter does not read "
                               f"in {option}=")
        if call.has("na_values") and isinstance(call.const("na_values", None, None), dict):
            raise ctx.todo("header=None without names= beside na_values per column: pandas "
                           "names the columns by the integers 0, 1, ...")
        if ctx.schema_lookup is None:
            raise ctx.todo("header=None without names=: pandas names the columns by the "
                           "integers 0, 1, ...; porter names them \"0\", \"1\", ... when "
                           "--data shows how many there are (or give names=[...])")
        kwargs["has_header"] = False
        options["header"] = None
        options["number_names"] = True
        return
    if names is not None and len(set(names)) != len(names):
        raise ctx.todo("names= repeats a name (pandas refuses it)")
    if header is None:
        kwargs["has_header"] = False
        options["header"] = None
    if names is not None:
        kwargs["new_columns"] = list(names)
        options["names"] = list(names)
        # pandas takes the first fields as the row labels when a row has more fields than
        # names, and adds columns of NaN when it has fewer; Polars' scan fails on either
        ctx.lower("names=: a file whose rows do not have as many fields as names fails to "
                  "read (pandas makes the extra first fields the row labels, or adds columns "
                  "of NaN)", 0.95)


# The types a text column is cast to after the scan exactly as the CSV reader would parse it
# (measured: the same values, the same failures, except numbers with spaces around them, which
# porter reads as text anyway, see `padded`)
TEXT_CASTS = ("pl.String", "pl.Int64", "pl.Int32", "pl.Float64", "pl.Float32", "pl.UInt64")


# encodings pandas reads that Polars' eager reader decodes the same way (Python's codec, one
# byte a character: every byte is a character, so no read fails in one and not the other,
# except cp1252's five unassigned bytes, which both refuse)
SINGLE_BYTE_ENCODINGS = ("latin-1", "latin1", "iso-8859-1", "iso8859-1", "cp1252",
                         "windows-1252")


def _scan(source: Code, kwargs: dict[str, Any], encoding: str | None) -> Code:
    """pl.scan_csv, or for a file in another encoding pl.read_csv(encoding=...).lazy():
    Polars' scan reads UTF-8 only, its eager reader decodes the file with Python's codec."""
    if encoding is None:
        return emit.pl("scan_csv", source, **kwargs)
    return emit.pl("read_csv", source, **kwargs, encoding=encoding).method("lazy")


def _scan_as_text(source: Code, kwargs: dict[str, Any], types: dict[str, Code], partial: bool,
                  encoding: str | None = None, strip_start: bool = False,
                  dropped: list[int] | None = None, words: list[str] | None = None,
                  fields: tuple[str, list[str]] | None = None) -> Code:
    """A scan of every column as text, pandas' missing-value tokens made missing, and a cast to
    the types porter read from --data.

    Polars' reader compares every field with each of `null_values` (about 0.1 s per column of
    1,000,000 rows for pandas' 19 tokens); one `is_in` per column after the scan does the same
    job in a fraction of that. A quoted empty field ("") is missing in pandas, and here too.
    Files of several layouts read by one call (`partial`) cast the columns each file has, as
    the typed scan's schema_overrides ignore the ones it lacks."""
    options = {k: v for k, v in kwargs.items() if k not in ("schema_overrides", "null_values")}
    nulls = kwargs.get("null_values")  # none with keep_default_na=False and no na_values
    code = _scan_fields(source, *fields) if fields is not None else \
        _scan(source, options, encoding) if words is None else _scan_words(source, words)
    if dropped:
        # read_csv(skiprows=[...]): the data rows pandas skips, counted as the scan reads them
        # (before blank lines are left out: pandas counts them too)
        code = code.method("filter", emit.unary("~", emit.pl("int_range", emit.pl("len"))
                                                .method("is_in", list(dropped))))
    if strip_start:
        # read_csv(skipinitialspace=True): the spaces after each separator are not part of the
        # field (nor of a header name), in pandas; tabs are
        code = code.method("rename", emit.atom('lambda name: name.lstrip(" ")')).method(
            "with_columns", emit.atom("pl.all()").attr("str").method("strip_chars_start", " "))
    if nulls is not None:
        code = code.method(
            "with_columns",
            emit.pl("when", emit.unary("~", emit.atom("pl.all()").method("is_in", nulls)))
            .method("then", emit.atom("pl.all()")))
    casts: dict[Any, Code] = {c: t for c, t in types.items() if t.text not in ("pl.String", "pl.Boolean")}
    flags = [c for c, t in types.items() if t.text == "pl.Boolean"]
    if flags:
        # True/False as the reader reads a Boolean column: "true"/"false" in any case (a
        # column with another text is not Boolean in the types from --data)
        code = code.method("with_columns", emit.call("pl.col", *flags).attr("str")
                           .method("to_lowercase")
                           .method("replace_strict", {"true": True, "false": False},
                                   return_dtype=emit.atom("pl.Boolean")))
    if partial:
        by_type: dict[str, list[str]] = {}
        for column, kind in casts.items():
            by_type.setdefault(kind.text, []).append(column)
        casts = {emit.call("pl.selectors.by_name", *columns, require_all=False): emit.atom(kind)
                 for kind, columns in by_type.items()}
    return code.method("cast", casts) if casts else code


def _scan_words(source: Code, names: list[str]) -> Code:
    """read_csv(sep=r"\\s+"): the file's lines, each split into the runs of characters other
    than spaces and tabs (pandas' whitespace; leading ones ignored), blank lines skipped, the
    header line left out, and the fields named by it (as --data showed it) in text columns."""
    line = emit.col("line")
    return (emit.pl("scan_lines", source)
            .method("select", line.attr("str").method("extract_all", emit.atom(WORD_PATTERN)))
            .method("filter", emit.binop(line.attr("list").method("len"), ">", 0))
            .method("slice", 1)
            .method("select", line.attr("list").method("to_struct", fields=names)
                    .attr("struct").method("unnest")))


def _scan_fields(source: Code, sep: str, names: list[str]) -> Code:
    """read_csv(on_bad_lines="skip") (pandas 1.x: error_bad_lines=False): the file's lines,
    blank ones skipped, each split at the separator; the header line left out, a line with more
    fields than the header left out as pandas leaves it out, one with fewer given missing
    values for the fields it lacks (as pandas reads it), and the fields named by the header
    (as --data showed it) in text columns. --data showed no quotes: no field holds the
    separator."""
    line = emit.col("line")
    return (emit.pl("scan_lines", source)
            .method("filter", emit.binop(line, "!=", ""))
            .method("select", line.attr("str").method("split", sep))
            .method("slice", 1)
            .method("filter", emit.binop(line.attr("list").method("len"), "<=", len(names)))
            .method("select", line.attr("list").method("to_struct", fields=names)
                    .attr("struct").method("unnest")))


# a field of a file read with sep=r"\s+": what lies between runs of spaces and tabs (the
# schema reader splits the sample with the same pattern)
WORD_PATTERN = f'r"{WORDS.pattern}"'


def _numbers_missing(code: Code, numbers: list[float], dtypes: dict[str, str] | None,
                     whole: frozenset[str]) -> Code:
    """The scan with the numbers of `na_values` made missing in its columns of floats, however
    the file writes them: pandas compares a column it parses as floats with them (-999.00 and
    -9.99e2 are missing for na_values=["-999"]), where the scan matched the texts listed. A
    column pandas parses as integers (`whole`: float here only for a missing value) is matched
    by its text only, as pandas matches it ("-0999" stays). The columns are named when --data
    gave their types, else chosen by type after the scan."""
    if dtypes is None:
        floats = emit.atom("pl.selectors.float()")
        if whole:
            floats = emit.binop(floats, "-", emit.call("pl.selectors.by_name", *sorted(whole),
                                                       require_all=False))
        return code.method("with_columns", floats.method("replace", numbers, None))
    columns = [c for c, kind in dtypes.items() if kind == "float" and c not in whole]
    if not columns:
        return code
    return code.method("with_columns", emit.call("pl.col", *columns).method("replace", numbers, None))


def _na_values_per_column(call: PandasCall, ctx: RuleContext,
                          keep_default_na: bool = True) -> dict[str, list[str]] | None:
    """na_values={column: token(s)}: the texts each column adds to pandas' own tokens (which
    still apply to every column); None when na_values is not a dict."""
    if not call.has("na_values"):
        return None
    given = call.const("na_values")
    if not isinstance(given, dict):
        return None
    per_column: dict[str, list[str]] = {}
    for column, value in given.items():
        if not isinstance(column, str):
            raise ctx.todo(f"na_values key {column!r}: pandas reads a number as a column position")
        values = [] if value is None else list(value) if isinstance(value, (list, tuple, set)) \
            else [value]
        if not all(isinstance(v, str) or is_number(v) for v in values):
            raise ctx.todo(f"na_values[{column!r}]={value!r}: porter reads text or numbers here")
        texts = [t for t in na_value_texts(values) if t not in PANDAS_NA_TOKENS or not keep_default_na]
        if texts:
            per_column[column] = texts
    return per_column


def _emptied_columns(per_column: dict[str, list[str]], schema: Any, overrides: dict[str, Code],
                     dtypes: dict[str, str], source: Value, options: dict[str, Any],
                     ctx: RuleContext) -> list[tuple[str, list[str], Code | None, str, bool]]:
    """The columns whose own tokens are emptied after the scan: (name, tokens, the cast to the
    type pandas gives the rest, porter's dtype name, whether pandas parses it as floats and so
    matches it with the numbers of the tokens too).

    Polars' null_values takes one text per column in a dict (and then no others for the other
    columns), so the scan keeps pandas' tokens for every column and reads these columns as
    text; their tokens become missing afterwards and the column gets the type pandas infers
    for what is left: a dtype= of the call, or, with --data, the type Polars infers from the
    file with those tokens missing (as for a list of na_values). A key that is not a column of
    the file is ignored, as pandas ignores it.
    """
    if getattr(schema, "partial", False):
        raise ctx.todo("na_values per column for files of different layouts")
    out: list[tuple[str, list[str], Code | None, str, bool]] = []
    for column, tokens in per_column.items():
        if column in overrides:
            if schema is None:
                ctx.lower(f"na_values for column {column!r}: if the file has no such column, "
                          "pandas ignores the key and Polars fails (--data would tell)", 0.95)
            elif column not in schema:
                continue
            cast = overrides[column] if overrides[column].text != "pl.String" else None
            out.append((column, tokens, cast, dtypes[column], dtypes[column] == "float"))
            continue
        if schema is None:
            raise ctx.todo(f"na_values per column ({column!r}): porter reads the column as text "
                           "and empties its tokens, and the type pandas then infers is only "
                           "known with --data (or give the column a dtype=)")
        if column not in schema:
            if "" in schema:  # an empty header: pandas names it "Unnamed: n" (renamed later)
                raise ctx.todo(f"na_values for column {column!r} with an empty header name")
            continue  # pandas ignores a key that names no column
        after = ctx.input_schema("csv", _paths(source), {**options, "na_values": tokens})
        kind = after.get(column) if after else None
        if column in (getattr(after, "padded", None) or getattr(schema, "padded", None) or {}):
            raise ctx.todo(f"na_values for column {column!r}, whose numbers are written with "
                           "spaces around them or a plus sign")
        codes = getattr(after, "polars", None) or {}
        if kind == "str":
            out.append((column, tokens, None, "str", False))
        elif kind in ("int", "float") and codes.get(column):
            out.append((column, tokens, emit.atom(codes[column]), kind,
                        kind == "float" and column not in getattr(after, "missing_ints", ())))
        else:
            raise ctx.todo(f"na_values for column {column!r}: what is left reads as "
                           f"{kind or 'a type porter does not know'}, which porter does not "
                           "cast from text")
    return out


def _compression(call: PandasCall, source: Value, ctx: RuleContext) -> None:
    """read_csv(compression=...): "infer" (pandas' default: from the name, see check_source),
    "gzip" or "zstd" (also as {"method": ...}), which Polars' scan reads from any name (it
    tells them by their first bytes), or None on a name pandas infers no compression from.
    Other methods, and None on a .gz / .zst name (pandas reads the compressed bytes as text,
    Polars decompresses them), are TODOs."""
    if not call.has("compression"):
        return
    given = call.const("compression", None, "?", kinds=(str, dict, type(None)))
    method = given
    if isinstance(given, dict):
        if set(given) != {"method"}:
            raise ctx.todo(f"compression={given!r}: porter reads a method alone")
        method = given["method"]
    if method in ("infer", "gzip", "zstd"):
        return
    if method is None:
        path = _paths(source)
        if isinstance(path, str) and compression_of(path) is None:
            return
        raise ctx.todo("compression=None on a file named .gz or .zst (or not known): pandas reads "
                       "its bytes as text, Polars' scan decompresses them")
    raise ctx.todo(f"compression={method!r}: Polars' scans decompress gzip and zstd only; "
                   "decompress the file first, or read it with pandas and hand it over")


def check_source(source: Value, ctx: RuleContext) -> None:
    """A compressed file Polars does not decompress is a TODO; a URL lowers the confidence."""
    path = source.const if isinstance(source, Opaque) and isinstance(source.const, str) else None
    if path is None:
        return
    if compression_of(path) in NOT_DECOMPRESSED:
        raise ctx.todo(f"{compression_of(path)} compression: pandas decompresses it, Polars' "
                       "scans do not (gzip and zstd they do); decompress the file first, or "
                       "read it with pandas and hand it over with pl.from_pandas")
    if is_url(path):
        ctx.lower("read from a URL: Polars fetches it with its own client (proxies and "
                  "authentication may differ from pandas')", 0.9)


def _const_dtype_dict(call: PandasCall) -> bool:
    value = call.kwargs.get("dtype")
    return isinstance(value, Opaque) and isinstance(value.const, dict)


def _combines_columns(parse_dates: Any) -> bool:
    """parse_dates={"when": ["d", "t"]} or [["d", "t"]]: columns joined into one (pandas < 3)."""
    if isinstance(parse_dates, dict):
        return True
    # (a tuple in the list is one column's name, of two levels, in pandas: not combined)
    return isinstance(parse_dates, (list, tuple)) and \
        any(isinstance(c, (list, tuple)) for c in parse_dates)


def _date_parser_format(call: PandasCall, ctx: RuleContext) -> str | None:
    """The format of read_csv's date_parser= (removed in pandas 3), when it is
    `lambda x: pd.to_datetime(x, format=F)` or `lambda x: datetime.strptime(x, F)`: pandas
    before 3 read the (joined) texts with it, as date_format=F / to_datetime(format=F) do
    now. None without date_parser; a TODO for any other function."""
    if not call.has("date_parser"):
        return None
    function = call.arg("date_parser")
    node = function.node if isinstance(function, Opaque) else None
    if node is None and isinstance(function, Opaque) and function.code.text.isidentifier():
        # dateparse = lambda x: ... bound once in the script
        node = _function_bound_once(function.code.text, ctx)
    todo = ctx.todo("date_parser= (removed in pandas 3) other than lambda x: "
                    "pd.to_datetime(x, format=...) or datetime.strptime(x, ...): write "
                    "date_format= or parse the column with pd.to_datetime after reading")
    if not (isinstance(node, cst.Lambda) and len(node.params.params) == 1
            and isinstance(node.body, cst.Call)):
        raise todo
    param = node.params.params[0].name.value
    body = node.body
    func = cst.Module([]).code_for_node(body.func)
    args = [a for a in body.args if a.keyword is None]
    kwargs = {a.keyword.value: a.value for a in body.args if a.keyword is not None}
    if not (args and isinstance(args[0].value, cst.Name) and args[0].value.value == param):
        raise todo
    if func.endswith("to_datetime") and len(args) == 1 and set(kwargs) == {"format"}:
        fmt = kwargs["format"]
        evaluated = ctx.evaluate(body.func, {})
        if not (isinstance(evaluated, Module) and evaluated.qualname == "pandas.to_datetime"):
            raise todo
    elif func.split(".")[-2:] == ["datetime", "strptime"] and len(args) == 2 and not kwargs:
        fmt = args[1].value
    else:
        raise todo
    if not isinstance(fmt, cst.SimpleString) or not isinstance(fmt.evaluated_value, str):
        raise todo
    return fmt.evaluated_value


def _function_bound_once(name: str, ctx: RuleContext) -> cst.Lambda | None:
    """The lambda a name of the script stands for (`dateparse = lambda x: ...`), when the
    script binds the name there only, at the top level, and nowhere else (never assigned,
    imported, defined or deleted again); None otherwise."""
    import ast as python_ast

    module = ctx.python_module
    if not isinstance(module, python_ast.Module):
        return None
    found: list[python_ast.AST] = []
    for node in python_ast.walk(module):
        if isinstance(node, (python_ast.FunctionDef, python_ast.AsyncFunctionDef,
                             python_ast.ClassDef)) and node.name == name:
            found.append(node)
        elif isinstance(node, python_ast.Name) and node.id == name \
                and not isinstance(node.ctx, python_ast.Load):
            found.append(node)
        elif isinstance(node, (python_ast.Import, python_ast.ImportFrom)) \
                and any((a.asname or a.name) == name for a in node.names):
            found.append(node)
        elif isinstance(node, python_ast.arg) and node.arg == name:
            found.append(node)
    if len(found) != 1:
        return None
    lambda_text = None
    for statement in module.body:
        if isinstance(statement, python_ast.Assign) and len(statement.targets) == 1 \
                and isinstance(statement.targets[0], python_ast.Name) \
                and statement.targets[0].id == name and isinstance(statement.value, python_ast.Lambda):
            lambda_text = python_ast.unparse(statement.value)
    if lambda_text is None:
        return None
    try:
        parsed = cst.parse_expression(lambda_text)
    except cst.ParserSyntaxError:
        return None
    return parsed if isinstance(parsed, cst.Lambda) else None


def _combined_dates(frame: Frame, parse_dates: Any, fmt: str | None, schema: Any,
                    ctx: RuleContext) -> Frame:
    """read_csv(parse_dates=[["d", "t"]]) / parse_dates={"when": ["d", "t"]} (pandas < 3): the
    columns' texts joined with a space and read as one datetime column, named "d_t" (or the
    dict's key), put first, the joined columns dropped; as pandas 3.1 reads
    pd.to_datetime(df["d"] + " " + df["t"]) (format= given by date_parser)."""
    if isinstance(parse_dates, dict):
        groups = list(parse_dates.items())
    else:
        if not all(isinstance(g, list) for g in parse_dates):
            raise ctx.todo("parse_dates mixing single columns (or tuples: names of two "
                           "levels) and lists of columns")
        groups = [("_".join(str(c) for c in g), g) for g in parse_dates]
    parts: list[str] = []
    exprs: list[Code] = []
    names: list[str] = []
    for name, group in groups:
        if not (isinstance(name, str) and isinstance(group, (list, tuple)) and group
                and all(isinstance(c, str) for c in group)):
            raise ctx.todo("parse_dates combining columns other than by their names")
        if frame.columns is not None and any(c not in frame.columns for c in group):
            raise ctx.todo("parse_dates names a column the file does not have")
        if any(c in parts for c in group) or name in names:
            raise ctx.todo("a column in two combined dates")
        if name in group or (frame.columns is not None and name in frame.columns):
            # pandas before 3: "New date column already in dict"
            raise ctx.todo(f"the combined column {name!r} is already a column (pandas raises)")
        kinds = [frame.dtype(c) for c in group]
        if any(k not in (None, "str") for k in kinds):
            raise ctx.todo("a combined column read as numbers or dates: pandas before 3 joined "
                           "the text it read, porter joins text columns only")
        if None in kinds:
            ctx.lower("parse_dates joining columns whose types porter does not know (run with "
                      "--data): a column read as numbers is joined as Polars writes them", 0.9)
        joined = emit.pl("concat_str", [emit.col(c) for c in group], separator=" ") \
            if len(group) > 1 else emit.col(group[0])
        firsts = None
        texts = getattr(schema, "first_texts", None) or {}
        if fmt is None and all(c in texts for c in group) and \
                len(getattr(schema, "first_texts_each", None) or [None]) == 1:
            firsts = " ".join(texts[c] for c in group)
        exprs.append(_dates_of(joined, fmt, firsts, ctx).method("alias", name))
        parts.extend(group)
        names.append(name)
    ctx.lower("combined date columns: a row with a missing part is missing here, as "
              "pd.to_datetime(df[\"d\"] + \" \" + df[\"t\"]) gives it in pandas 3; pandas "
              "before 3 joined the text 'nan' and kept the whole column as text", 0.95)
    code = frame.code.method("with_columns", *exprs)
    if frame.columns is not None:
        columns = (*names, *(c for c in frame.columns if c not in parts and c not in names))
        code = code.method("select", *columns)
    else:
        columns = None
        code = code.method("select", *names, emit.pl("exclude", *parts, *names))
    dtypes = tuple({**{n: "datetime" for n in names},
                    **{c: t for c, t in frame.dtypes if c not in parts and c not in names}}.items())
    return derive(frame, code, same_rows=True, columns=columns, dtypes=dtypes)


def _dates_of(text: Code, fmt: str | None, first: str | None, ctx: RuleContext) -> Code:
    """Text read as datetimes as pd.to_datetime(text, format=fmt) reads it; without fmt, in the
    format pandas guesses from `first` (the sample's first value) or at run time."""
    if fmt is None and first is not None:
        import warnings

        from pandas.tseries.api import guess_datetime_format
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")
            fmt = guess_datetime_format(first)
        if fmt is not None:
            ctx.lower(f"parse_dates: the format pandas guesses from the sample's first value "
                      f"({fmt!r}); a file whose first date is written otherwise is read "
                      "otherwise", 0.9)
    if fmt is not None:
        port = strptime_port(fmt)
        if not isinstance(port, Strptime):
            raise ctx.todo(f"the date format {fmt!r}: {port}")
        ctx.lower("parse_dates with a format: a value that does not fit stops the script "
                  "where pandas leaves the column as text", 0.9)
        return formatted_parse(text, fmt, port, coerce=False)
    ctx.lower(f"parse_dates: {GUESS_REASON}", 0.8)
    return guessed_parse(text, coerce=False)


def _parsed_dates(column: str, schema: Any, ctx: RuleContext,
                  fmt: str | None = None, *, dayfirst: bool = False) -> Code | None:
    """read_csv(parse_dates=[column]): pandas guesses one format from the column's first value
    and reads every value with it. With --data porter makes the same guess from the sample's
    first value and writes that format; without, pandas_to_datetime guesses it at run time.
    None when --data shows a value that does not fit the format guessed (day-first dates whose
    first day is 12 or less): pandas' read_csv then keeps the column as text, and so does the
    scan."""
    if fmt is not None:
        # date_parser=lambda x: pd.to_datetime(x, format=fmt) (pandas < 3): date_format=fmt now
        port = strptime_port(fmt)
        if not isinstance(port, Strptime):
            raise ctx.todo(f"the date format {fmt!r}: {port}")
        ctx.lower("date_parser with a format: a value that does not fit stops the script "
                  "where pandas leaves the column as text", 0.9)
        return formatted_parse(emit.col(column), fmt, port, coerce=False)
    each = getattr(schema, "first_texts_each", None) or [getattr(schema, "first_texts", None) or {}]
    firsts = [texts[column] for texts in each if column in texts]
    fmt = None
    if firsts:
        import warnings

        from pandas.tseries.api import guess_datetime_format  # pandas' own guess, as read_csv makes it
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")  # "Parsing dates in %d/%m/%Y format when dayfirst=False"
            formats = {guess_datetime_format(first, dayfirst=dayfirst) for first in firsts}
        fmt = formats.pop() if len(formats) == 1 else None  # the files agree on one format
    heads = getattr(schema, "text_heads", None) or {}
    if fmt is not None and column in heads and not _all_fit(heads[column], fmt):
        ctx.lower(f"parse_dates: a value of {column!r} in the sample does not fit the format "
                  f"pandas guesses from its first value ({fmt!r}), so pandas' read_csv keeps "
                  "the column as text and so does the scan; a file whose values all fit would "
                  "be read as dates by pandas", 0.9)
        return None
    port = strptime_port(fmt) if fmt is not None else None
    if isinstance(port, Strptime):
        ctx.lower(f"parse_dates: the format pandas guesses from the sample's first value "
                  f"({fmt!r}); a file whose first date is written otherwise is read otherwise, "
                  "and a value that does not fit stops the script where pandas leaves the "
                  "column as text", 0.9)
        return formatted_parse(emit.col(column), fmt, port, coerce=False)  # type: ignore[arg-type]
    ctx.lower(f"parse_dates: {GUESS_DAYFIRST_REASON if dayfirst else GUESS_REASON}; a value "
              "that does not fit stops the script where pandas leaves the column as text", 0.8)
    return guessed_parse(emit.col(column), coerce=False, dayfirst=dayfirst)


def _all_fit(values: list[str], fmt: str) -> bool:
    """Whether pandas' to_datetime reads every value with `fmt` (as read_csv's parse_dates
    does with the format it guessed; it keeps the text when one does not fit)."""
    import warnings

    import pandas as pd
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        try:
            pd.to_datetime(pd.Series(values, dtype=object), format=fmt)
        except (ValueError, TypeError, OverflowError):
            return False
    return True


def _pandas_writes(frame: Frame, call: PandasCall, target: Value, ctx: RuleContext,
                   reason: str, also: tuple[str, ...] = ()) -> Scalar:
    """to_csv written by pandas (a frame handed over once, at the write): pandas writes the
    file itself, so every option it was given goes along (columns= is a select already)."""
    ctx.handover = True
    ctx.lower(reason, 1.0)
    passed = {name: _plain_argument(call, name) for name in (*HANDED_OPTIONS, *also)
              if call.has(name)}
    return Scalar(handover.to_pandas(frame).method("to_csv", target.code, **passed))


# what a usecols function may use: its parameter, constants, comparisons, and str methods that
# compute from the name alone
_NAME_METHODS = {"startswith", "endswith", "lower", "upper", "strip", "lstrip", "rstrip",
                 "isdigit", "isalpha", "isnumeric", "casefold", "replace", "split"}
_SAFE_NODES = (ast.Expression, ast.Lambda, ast.arguments, ast.arg, ast.Name, ast.Load,
               ast.Constant, ast.Compare, ast.BoolOp, ast.And, ast.Or, ast.UnaryOp, ast.Not,
               ast.In, ast.NotIn, ast.Eq, ast.NotEq, ast.Set, ast.List, ast.Tuple, ast.Call,
               ast.Attribute, ast.Subscript, ast.Slice)


def _usecols_function(call: PandasCall, ctx: RuleContext) -> Any:
    """usecols=lambda c: ... written in the call, as a Python function porter can call with a
    header name, when it computes from the name alone (str methods, comparisons, constants:
    `c.startswith("v")`, `c in {"a", "b"}`, `c not in ("x",)`); None when usecols is not a
    lambda. A lambda that reads anything else is a TODO."""
    node = next((arg.value for arg in call.node.args
                 if arg.keyword is not None and arg.keyword.value == "usecols"), None) \
        if isinstance(call.node, cst.Call) else None
    if not isinstance(node, cst.Lambda):
        return None
    text = cst.Module([]).code_for_node(node)
    try:
        tree = ast.parse(text.strip(), mode="eval")
    except SyntaxError:
        raise ctx.todo("usecols given as a function porter cannot read")
    function = tree.body
    if not isinstance(function, ast.Lambda) or len(function.args.args) != 1 \
            or function.args.vararg or function.args.kwarg or function.args.kwonlyargs \
            or function.args.defaults:
        raise ctx.todo("usecols given as a function of other than one parameter")
    parameter = function.args.args[0].arg
    for part in ast.walk(function.body):
        if not isinstance(part, _SAFE_NODES):
            raise ctx.todo(f"usecols given as a function that uses {type(part).__name__}: porter "
                           "calls one made of the name, constants, comparisons and str methods")
        if isinstance(part, ast.Name) and part.id != parameter:
            raise ctx.todo(f"usecols given as a function that reads {part.id!r}: porter calls "
                           "one made of the name, constants, comparisons and str methods")
        if isinstance(part, ast.Call) and not (isinstance(part.func, ast.Attribute)
                                               and part.func.attr in _NAME_METHODS):
            raise ctx.todo("usecols given as a function that calls something other than a str "
                           "method")
        if isinstance(part, ast.Attribute) and part.attr not in _NAME_METHODS:
            raise ctx.todo(f"usecols given as a function that reads .{part.attr}")
        if isinstance(part, ast.Constant) and not isinstance(part.value, (str, int)):
            raise ctx.todo("usecols given as a function with a constant other than text or a number")
    return eval(compile(tree, "<usecols>", "eval"), {"__builtins__": {}})  # noqa: S307 - checked above


def _select_in_file_order(frame: Frame, usecols: list[Any], ctx: RuleContext) -> Frame:
    """pandas keeps the file's column order whatever the order of `usecols`."""
    if not all(isinstance(c, str) for c in usecols):
        raise ctx.todo("usecols by position or by function")
    if frame.columns is not None:
        ordered = [c for c in frame.columns if c in usecols]
        return select_columns(frame, frame.code.method("select", *ordered), ordered)
    if len(usecols) == 1:
        return select_columns(frame, frame.code.method("select", usecols[0]), usecols)
    pattern = "^(" + "|".join(re.escape(c) for c in usecols) + ")$"
    code = frame.code.method("select", emit.col(pattern))
    return derive(frame, code, same_rows=True, columns=None)


@rule("pd.read_parquet")
def read_parquet(call: PandasCall, ctx: RuleContext) -> Value:
    """pd.read_parquet -> pl.scan_parquet.

    Handles: NaN stored in float columns becomes a missing value, as pandas reads it.
    """
    ctx.reject_unknown(call, "path", "columns", "engine", positional=1)
    source = call.arg("path", 0)
    path = _paths(source)
    if path is None and isinstance(source, Opaque) and _names_a_loop_variable(call, ctx):
        # a loop's or a comprehension's variable over files porter lists in --data: the scan
        # knows their columns when every file has the same ones, of the same types (else it
        # reads each file's own, as before)
        listed = _files_of_a_loop(call, ctx, "path")
        if isinstance(listed, tuple):
            try:
                _check_globbed(listed, "parquet", {}, ctx)
            except Unsupported:
                pass
            else:
                path = listed
    schema = ctx.input_schema("parquet", path, {})
    pandas = _pandas_name(ctx)
    written = isinstance(path, str) and _pandas_may_write_parquet(ctx.python_module, path)
    if (written or any(c.startswith("__index_level_") for c in schema or ())) \
            and pandas is not None:
        # pandas stores a frame's row labels in the file (a filtered or sorted frame's as a
        # column __index_level_0__, others as metadata) and its read_parquet restores them as
        # the row labels; Polars reads such a column as a column and the metadata not at all.
        # The script writes this file itself, where that write may stay on pandas, or the file
        # holds such a column: the frame stays pandas
        ctx.handover = True
        ctx.lower("pandas may have stored row labels in this file (the script writes it, or it "
                  "holds __index_level_0__), which read_parquet restores as the row labels; "
                  "Polars would read them as a column or not at all: read by pandas", 1.0)
        args = [a.code for a in call.args]
        kwargs = {k: v.code for k, v in call.kwargs.items()}
        return PandasValue(emit.call(f"{pandas}.read_parquet", *args, **kwargs))
    # pandas keeps its nullable dtypes (Int64, boolean, string, Float64) in the metadata of a
    # file it wrote, and its read_parquet restores them: an Int64 column with a missing value
    # is written 7 by to_csv (<NA> by astype(str)) where the plain int64 of a file without that
    # metadata is float64 in pandas (7.0, nan). The schema reader reads them from the file
    # (FileSchema.pandas_nullable: {} when there are none); marked, the rules follow them
    kept = getattr(schema, "pandas_nullable", None) if schema is not None else None
    if kept is None and (schema is None or set(schema.values()) & {"int", "bool", "str", "float"}):
        ctx.lower("a file pandas wrote keeps its nullable dtypes (Int64, boolean, string) in "
                  "its metadata, which read_parquet restores: an Int64 column with a missing "
                  "value is written 7 and printed <NA> by pandas, 7.0 and nan here (porter "
                  "did not read the file's metadata)", 0.95)
    frame = Frame(emit.pl("scan_parquet", source.code),
                  columns=tuple(schema) if schema else None,
                  dtypes=tuple((schema or {}).items()),
                  nullable_ints=None if kept is None else tuple(
                      (c, kind) for c, kind in kept.items() if schema is None or c in schema))
    if schema is None or "float" in schema.values():
        frame = derive(frame, frame.code.method(
            "with_columns", emit.pl("col", emit.atom("pl.Float32"), emit.atom("pl.Float64"))
            .method("fill_nan", None)), same_rows=True)
    columns = call.const("columns", None, None)
    if columns is not None:
        frame = select_columns(frame, frame.code.method("select", *columns), list(columns))
    return frame


# what pandas' read_csv makes of a column of this type that to_csv wrote (without options):
# floats (Python's repr, a missing one as an empty field) are float64 whatever the values, and
# so is a column with no value at all, which Polars' scan would read as text
_READ_BACK_CERTAIN = {"float": "pl.Float64"}


def _written_frame(path: str, sep: str, ctx: RuleContext) -> Frame | None:
    """The frame the script wrote to `path` with to_csv and reads back here, when porter can
    tell which one it is: one write of a name to that path and one read of it, both statements
    at the top of the script, the write first, the name not changed between them, the write
    without options that change what it writes (index=False only) and read with its separator."""
    module = ctx.python_module
    if not isinstance(module, ast.Module) or ctx.evaluate is None:
        return None

    def target(node: ast.Call, *names: str) -> object:
        given = node.args[0] if node.args else next(
            (k.value for k in node.keywords if k.arg in names), None)
        return given.value if isinstance(given, ast.Constant) else None

    calls = [n for n in ast.walk(module) if isinstance(n, ast.Call)
             and isinstance(n.func, ast.Attribute) and n.func.attr in ("to_csv", "read_csv")]
    writes = [n for n in calls if n.func.attr == "to_csv"  # type: ignore[attr-defined]
              and target(n, "path_or_buf") in (path, None)]
    reads = [n for n in calls if n.func.attr == "read_csv"  # type: ignore[attr-defined]
             and target(n, "filepath_or_buffer") in (path, None)]
    if len(writes) != 1 or len(reads) != 1 or target(writes[0], "path_or_buf") != path:
        return None
    write, read = writes[0], reads[0]
    owner = {id(n): i for i, stmt in enumerate(module.body) for n in ast.walk(stmt)}
    first, last = owner.get(id(write)), owner.get(id(read))
    if first is None or last is None or first >= last or any(
            isinstance(module.body[i], (ast.If, ast.For, ast.While, ast.With, ast.Try,
                                        ast.FunctionDef, ast.AsyncFunctionDef, ast.ClassDef))
            for i in (first, last)):
        return None
    name = write.func.value  # type: ignore[attr-defined]
    if not isinstance(name, ast.Name) or any(
            k.arg != "index" or not (isinstance(k.value, ast.Constant) and k.value.value is False)
            for k in write.keywords if k.arg not in ("path_or_buf", "sep")) \
            or not any(k.arg == "index" for k in write.keywords) \
            or next((k.value.value for k in write.keywords if k.arg == "sep"
                     and isinstance(k.value, ast.Constant)), ",") != sep \
            or len(write.args) > 1:
        return None
    for stmt in module.body[first + 1:last]:  # the frame written is the one the name holds
        for node in ast.walk(stmt):
            if isinstance(node, (ast.Name, ast.Subscript, ast.Attribute)) \
                    and isinstance(node.ctx, (ast.Store, ast.Del)) \
                    and name.id in {n.id for n in ast.walk(node) if isinstance(n, ast.Name)}:
                return None
            if isinstance(node, ast.Call) and any(k.arg == "inplace" for k in node.keywords):
                return None
    frame = ctx.evaluate(cst.Name(name.id), {})
    if not isinstance(frame, Frame) or frame.columns is None or frame.index:
        return None
    return frame


def _read_back_types(frame: Frame, ctx: RuleContext) -> dict[str, Code]:
    """The scan's types for a file the script wrote from `frame` (to_csv) and reads back: the
    ones pandas' reading is certain of whatever the values (floats); a TODO where pandas may
    read text as numbers the scan reads as text."""
    unsure = [c for c in frame.columns or () if frame.dtype(c) in ("str", "category", None, "other")]
    if unsure:
        # pandas infers each column's type from the text it reads back: "+3" and " 5" are
        # numbers to it (text to Polars' scan), and a column with no value float64 (text)
        raise ctx.todo(f"the script reads back text it wrote ({', '.join(map(repr, unsure))}): "
                       "pandas infers numbers from text like \"+3\" or \" 5\", and float64 for "
                       "a column with no value, where Polars' scan infers text; the read stays "
                       "pandas'")
    ctx.lower("the file is read back as the script wrote it: its float columns as Float64 (as "
              "pandas reads them, even with no value), the others inferred (an int or True/False "
              "column with no value at all is float64 in pandas, text here)", 0.95)
    return {c: emit.atom(_READ_BACK_CERTAIN[frame.dtype(c)])  # type: ignore[index]
            for c in frame.columns or () if frame.dtype(c) in _READ_BACK_CERTAIN}


def _pandas_name(ctx: RuleContext) -> str | None:
    """The name the script binds pandas to (pd, pandas), or None."""
    def is_pandas(name: str) -> bool:
        value = ctx.evaluate(cst.Name(name), {}) if ctx.evaluate is not None else None
        return isinstance(value, Module) and value.qualname == "pandas"

    return next((n for n in ("pd", "pandas") if is_pandas(n)), None)


def _pandas_may_write_parquet(module: object, path: str) -> bool:
    """Whether the script writes `path` with to_parquet(...) without index=False (or its path
    is not written out): pandas stores a frame's row labels there."""
    if not isinstance(module, ast.Module):
        return False
    for node in ast.walk(module):
        if not (isinstance(node, ast.Call) and isinstance(node.func, ast.Attribute)
                and node.func.attr == "to_parquet"):
            continue
        if any(k.arg == "index" and isinstance(k.value, ast.Constant) and k.value.value is False
               for k in node.keywords):
            continue
        target = node.args[0] if node.args else next(
            (k.value for k in node.keywords if k.arg == "path"), None)
        if not isinstance(target, ast.Constant) or target.value == path:
            return True
    return False


def _write_target(call: PandasCall, ctx: RuleContext, name: str) -> Value:
    target = call.arg("path_or_buf", 0, None) if name == "csv" else call.arg("path", 0, None)
    if target is None or (isinstance(target, Opaque) and target.is_const and target.const is None):
        raise ctx.todo(f"to_{name}() without a path returns the text; collect and write it")
    return target


@rule("frame.to_csv", "series.to_csv")
def to_csv(call: PandasCall, ctx: RuleContext) -> Value:
    """DataFrame.to_csv -> LazyFrame.sink_csv.

    Handles: index=False; the index columns porter tracks (after a groupby) are written first
    like pandas writes the index; sep, header (a list renames the written columns), na_rep,
    columns; encoding="utf-8-sig" (the byte-order mark first: include_bom), other encodings
    than UTF-8 are TODOs; gzip and zstd compression, given or inferred from the name as pandas
    infers it (bz2, zip, xz and tar are TODOs: Polars' sink does not write them); an empty
    text as an empty field, as pandas writes it (Polars quotes it; with na_rep given beside
    text columns pandas writes the file, as Polars' writer has one text for both); columns of lists of text, numbers or True/False as pandas writes str(list)
    (numpy arrays, which pandas writes [1 2], are lists in Polars: 0.9 where the script may
    make them); float_format="%.<n>f" as float_precision (Python's % and Polars both round the
    exact binary value, ties to even); date_format with directives both write alike
    (_SAME_DIRECTIVES), other formats are TODOs.
    Caveats: booleans and datetimes are written as pandas writes them (True/False, no `T`,
    the offset of a time zone: +00:00);
    an integer column holding a missing value as floats (2024.0: float64 in pandas), and one
    pandas holds as its nullable integers (astype("Int64"), dtype={"c": "Int64"},
    isocalendar()) as ints (2024); where porter does not know which columns are nullable (a
    frame back from pandas or built by a step that does not follow them, in a script that
    makes nullable integers) as ints (0.9); a missing value alone on its line (one column)
    as "". describe()'s unnamed index is written by pandas (Polars quotes the empty header
    name pandas writes as an empty field). With the default index=True on a
    plain frame the write is handed to pandas (with its sep, header, na_rep,
    encoding) so the row labels are written.
    """
    ctx.reject_unknown(call, "path_or_buf", "index", "sep", "header", "na_rep", "columns",
                       "encoding", "compression", "float_format", "date_format", positional=1)
    target = _write_target(call, ctx, "csv")
    digits = _float_format_digits(call, ctx)
    date_format = _csv_date_format(call, ctx)
    frame = _as_frame(call)
    if frame.column_pairs and call.const("header", None, True) is not False:
        # agg({"v": ["sum", "mean"]}): pandas' columns have two levels, written as a header of
        # one line per level (and one for the index name); porter's are flat names, so pandas
        # writes the file with the levels put back
        return _two_level_write(call, frame, target, ctx)
    columns = call.const("columns", None, None)
    if columns is not None:
        frame = select_columns(frame, frame.code.method("select", *frame.index, *columns),
                               [*frame.index, *columns])
    index = call.const("index", None, True)
    if index and not frame.index:
        if not frame.labels_intact:
            raise ctx.todo("index=True writes pandas' row labels, which are no longer 0..n-1 here")
        return _pandas_writes(frame, call, target, ctx,
                              "index=True writes the row labels: handed over to pandas for the "
                              "write")
    if index and frame.index_unnamed \
            and call.const("header", None, True, kinds=(bool, list, tuple)) is not False:
        # pandas writes an unnamed index (describe's statistics, both levels of
        # pd.concat(keys=)) under empty headers (",a", ",,a"); Polars' writer quotes an empty
        # column name ('"",a') and a frame cannot hold two: pandas writes the file
        return _pandas_writes(frame, call, target, ctx,
                              "the unnamed index is written under an empty header, which Polars "
                              "quotes: handed over to pandas for the write")
    na_rep = call.const("na_rep", None, "", kinds=(str,))
    if na_rep and ({t for _, t in frame.dtypes} & {"str", "category"} or frame.columns is None
                   or len(frame.dtypes) != len(frame.columns)):
        # pandas writes an empty text as an empty field and a missing value as na_rep; Polars'
        # writer quotes an empty text ("") to tell it from a missing one, and writes one
        # null_value for both: pandas writes the file (with every option it was given)
        return _pandas_writes(frame, call, target, ctx,
                              f"na_rep={na_rep!r} beside text columns: pandas writes an empty "
                              "text as an empty field, Polars' writer as \"\": handed over to "
                              "pandas for the write", also=("index",))
    frame = written_index(frame, bool(index))
    kwargs: dict[str, object] = {}
    sep = call.const("sep", None, ",")
    if sep != ",":
        kwargs["separator"] = sep
    header = call.const("header", None, True, kinds=(bool, list, tuple))
    if header is False:
        kwargs["include_header"] = False
    if na_rep:
        kwargs["null_value"] = na_rep
    kwargs.update(_sink_compression(call, target, ctx))
    encoding = call.const("encoding", None, None, kinds=(str,))
    spelled = encoding.lower().replace("-", "").replace("_", "") if encoding else "utf8"
    if spelled == "utf8sig":  # the byte-order mark first, as Excel wants it
        kwargs["include_bom"] = True
    elif spelled != "utf8":
        raise ctx.todo(f"encoding {encoding!r}: Polars writes UTF-8 only")
    if frame.columns is not None and len(frame.dtypes) == len(frame.columns):
        ctx.confidence = max(ctx.confidence, 0.98)  # every column's type is known and handled
    frame = nullable_ints_text(frame, ctx)
    if digits is None:
        frame = float32_text(frame, ctx)  # (with float_format float32 is formatted as float64)
    text = csv_text_columns(frame, ctx)
    if date_format is not None:
        # every datetime column (a time zone's local time, as pandas formats it) through the
        # format pandas gives strftime; dates held as Python dates (pl.Date) pandas writes as
        # they are, and durations too
        text = [emit.atom("pl.selectors.datetime()").attr("dt").method("strftime", date_format)
                if c.text == CSV_DATETIMES_CONSTANT else c for c in text]
    if digits is not None:
        text = [_fixed_float_text(c, digits) for c in text]
        kwargs["float_precision"] = digits
    kinds = {t for _, t in frame.dtypes}
    if CSV_DATETIMES_CONSTANT in {c.text for c in text}:
        # datetimes with a time zone first, with their offset (PANDAS_CSV_DATETIMES' selector
        # then no longer finds them)
        frame = derive(frame, frame.code.method("with_columns", emit.atom(CSV_ZONED_DATETIMES_CONSTANT)),
                       same_rows=True)
    if kinds & {"str", "category"} or frame.columns is None or len(frame.dtypes) != len(frame.columns):
        # pandas writes an empty text as an empty field, as it writes a missing value;
        # Polars quotes it ("") to tell it from a missing one. Categories are written as
        # their text (an Enum without "" among them would refuse the replace). (With na_rep
        # the write is pandas', above)
        text.append(emit.atom("pl.selectors.by_dtype(pl.String, pl.Categorical, pl.Enum)")
                    .method("cast", emit.atom("pl.String")).method("replace", "", None))
    if text:
        frame = derive(frame, frame.code.method("with_columns", *text), same_rows=True)
    code = frame.code
    if isinstance(header, (list, tuple)):
        names = _header_names(frame, list(header), ctx)
        if names:
            code = code.method("rename", names)
    if not na_rep:
        if frame.columns is not None and len(frame.columns) == 1:
            # pandas quotes an empty field when it is the whole line ("" is not a blank line,
            # which a reader would skip)
            kwargs["null_value"] = '""'
        elif frame.columns is None:
            ctx.lower("a frame of one column: pandas writes a missing value as \"\" and Polars "
                      "as an empty line, which a reader skips (porter does not know the columns)",
                      0.9)
    return Scalar(code.method("sink_csv", target.code, **kwargs))


# to_csv options a write handed to pandas passes on as they were written
HANDED_OPTIONS = ("sep", "header", "na_rep", "encoding", "compression", "float_format",
                  "date_format")

# strftime directives Python (pandas' Timestamp.strftime) and Polars (chrono) write alike for
# a datetime: %f is microseconds in Python and nanoseconds in chrono, %z and %Z differ for a
# column without a time zone (Python writes nothing), %c, %x, %X and the rest follow a locale
_SAME_DIRECTIVES = frozenset("YmdHMSybBaAjIp%")


def _csv_date_format(call: PandasCall, ctx: RuleContext) -> str | None:
    """to_csv(date_format=...): the format when Polars' strftime writes what pandas writes."""
    if not call.has("date_format"):
        return None
    fmt = call.const("date_format", None, None, kinds=(str, type(None)))
    if fmt is None:
        return None
    directives = re.findall(r"%(.?)", fmt)
    if not all(d in _SAME_DIRECTIVES for d in directives):
        odd = sorted({f"%{d}" for d in directives if d not in _SAME_DIRECTIVES})
        raise ctx.todo(f"date_format with {', '.join(odd)}: Python's strftime and Polars' write "
                       "it differently")
    return fmt


def _float_format_digits(call: PandasCall, ctx: RuleContext) -> int | None:
    """to_csv(float_format="%.2f"): the number of decimals, which sink_csv's float_precision
    writes as Python's % operator does (the exact binary value rounded, ties to even)."""
    if not call.has("float_format"):
        return None
    fmt = call.const("float_format", None, None, kinds=(str, type(None)))
    if fmt is None:
        return None
    found = re.fullmatch(r"%\.(\d{1,2})f", fmt)
    if found is None:
        raise ctx.todo(f"float_format={fmt!r}: only the form '%.<n>f' is ported (Polars' writer "
                       "has a number of decimals, not a format)")
    return int(found.group(1))


def _fixed_float_text(column: Code, digits: int) -> Code:
    """A csv_text_columns expression under float_format: float columns stay numbers, for
    float_precision (NaN an empty field, as pandas writes it); integer columns holding a missing
    value, which pandas holds as float64, written as the float float_format gives ("2024.00")."""
    if column.text == CSV_FLOATS_CONSTANT:
        return emit.atom("pl.selectors.float()").method("fill_nan", None)
    if column.text == CSV_INTS_CONSTANT:
        # "%.2f" % float(k): the float nearest k (above 2**53 another integer), then the zeros
        as_float = emit.atom("pl.selectors.integer()").method("cast", emit.atom("pl.Float64")) \
            .method("cast", emit.atom("pl.Int64")).method("cast", emit.atom("pl.String"))
        if digits:
            as_float = emit.binop(as_float, "+", emit.lit("." + "0" * digits))
        return emit.when(emit.binop(emit.atom("pl.selectors.integer()").method("null_count"), ">", 0),
                         as_float,
                         emit.atom("pl.selectors.integer()").method("cast", emit.atom("pl.String")))
    return column


def _sink_compression(call: PandasCall, target: Value, ctx: RuleContext) -> dict[str, object]:
    """sink_csv's options for the compression pandas writes: given, or inferred from the name
    (gzip and zstd; Polars' sink writes no other, and checks the name's suffix)."""
    given = call.const("compression", None, "infer", kinds=(str, type(None)))
    path = target.const if isinstance(target, Opaque) and isinstance(target.const, str) else None
    if given == "infer":
        if path is None:
            ctx.lower("the file's name is not written out: pandas compresses a name ending .gz, "
                      ".zst, .bz2, .zip, .xz or .tar, Polars' sink writes it uncompressed (and "
                      "refuses .gz and .zst)", 0.9)
            return {}
        method = written_compression(path)
    else:
        method = given
    if method is None:
        # an uncompressed file under a name Polars takes for a compressed one
        named = path is None or written_compression(path) in POLARS_CSV_COMPRESSION
        return {"check_extension": False} if named else {}
    if method not in POLARS_CSV_COMPRESSION:
        raise ctx.todo(f"{method} compression: Polars' CSV sink writes gzip and zstd only")
    out: dict[str, object] = {"compression": method}
    if path is None or not path.endswith(POLARS_CSV_COMPRESSION[method]):
        out["check_extension"] = False  # pandas writes it under any name
    return out


def _plain_argument(call: PandasCall, name: str) -> Code:
    """An option passed on to pandas as it was written: a plain Python value, not a frame."""
    value = call.arg(name)
    if not isinstance(value, Opaque):
        raise Unsupported(f"`{name}` is not a plain value here")
    return value.code


def _header_names(frame: Frame, header: list[Any], ctx: RuleContext) -> dict[str, str]:
    """header=[...]: new names for the written columns other than the index, in their order."""
    if frame.columns is None:
        raise ctx.todo("header= names the written columns in order, which porter does not know "
                       "here (give columns= too, or run with --data)")
    written = [c for c in frame.columns if c not in frame.index]
    if not all(isinstance(h, str) for h in header):
        raise ctx.todo("header= with names that are not text")
    if len(header) != len(written):
        raise ctx.todo(f"header= gives {len(header)} names for {len(written)} columns (pandas raises)")
    final = [*frame.index, *header]
    if len(set(final)) != len(final):
        raise ctx.todo("header= repeats a name (or an index name): Polars writes each name once")
    return {old: new for old, new in zip(written, header) if old != new}


def _two_level_write(call: PandasCall, frame: Frame, target: Value, ctx: RuleContext) -> Value:
    """to_csv of a frame whose pandas columns are (column, function) pairs: handed to pandas
    with those two levels, so the header is pandas' own."""
    import libcst as cst

    def is_pandas(name: str) -> bool:  # the name the script binds pandas to
        value = ctx.evaluate(cst.Name(name), {}) if ctx.evaluate is not None else None
        return isinstance(value, Module) and value.qualname == "pandas"

    pandas = next((n for n in ("pd", "pandas") if is_pandas(n)), None)
    pairs = dict(frame.column_pairs)
    names = [c for c in frame.columns if c not in frame.index] if frame.columns is not None else None
    if pandas is None or names is None or any(c not in pairs for c in names) or call.args[1:] \
            or set(call.kwargs) - {"path_or_buf", "index"}:
        raise ctx.todo("the columns have two levels in pandas (an aggregation with a list per "
                       "column), written as a header of several lines; porter's names are "
                       "flat: name them (df.columns = [...]) before writing")
    ctx.handover = True
    ctx.lower("the columns have two levels in pandas, written as a header line per level: "
              "handed to pandas with them for the write", 1.0)
    levels = emit.call(f"{pandas}.MultiIndex.from_tuples", [pairs[c] for c in names])
    kwargs = {} if call.const("index", None, True) else {"index": False}
    code = handover.to_pandas(frame).method("set_axis", levels, axis=1)
    return Scalar(code.method("to_csv", target.code, **kwargs))


def written_index(frame: Frame, index: bool) -> Frame:
    """The columns porter keeps for pandas' index: left out with index=False; an unnamed index
    (describe) is written under an empty header, as pandas writes it."""
    if not frame.index:
        return frame
    if not index:
        columns = tuple(c for c in frame.columns if c not in frame.index) if frame.columns else None
        return derive(frame, frame.code.method("drop", *frame.index), same_rows=True,
                      columns=columns, index=())
    if frame.index_unnamed and len(frame.index) == 1:
        return derive(frame, frame.code.method("rename", {frame.index[0]: ""}), same_rows=True)
    return frame


_LIST_REPR_CAVEAT = ("a list holding control characters other than \\n \\t \\r is written "
                     "otherwise than Python's repr")


def csv_text_columns(frame: Frame, ctx: RuleContext) -> list[Code]:
    """Columns whose text pandas writes differently, written the pandas way.

    pandas writes booleans as True/False, and a datetime column as dates only when every value
    is at midnight, without fractions when none has microseconds (decided per column from the
    data, which the expression does too); floats as Python's repr (5e-05, 1.5e-07).
    """
    kinds = {t for _, t in frame.dtypes}
    complete = frame.columns is not None and len(frame.dtypes) == len(frame.columns)
    out = []
    if "bool" in kinds or not complete:  # the selector finds boolean columns when it runs
        out.append(emit.atom("pl.selectors.boolean()").method(
            "replace_strict", {True: "True", False: "False"}))
    if "datetime" in kinds or (ctx.datetimes_possible and not complete):
        out.append(emit.atom(CSV_DATETIMES_CONSTANT))
    if "duration" in kinds or ((ctx.durations_possible or ctx.datetimes_possible) and not complete):
        # a difference of dates: Polars cannot write a duration, pandas writes "1 days 06:00:00";
        # any script that makes datetimes can subtract them (t - Timestamp, u - t) in a column
        # porter has no type for
        out.append(emit.atom(CSV_DURATIONS_CONSTANT))
    if "int" in kinds or not complete:
        if ctx.nullable_ints_possible and frame.nullable_ints is None:
            # pandas' nullable Int64 (astype("Int64"), dtype={"c": "Int64"}) writes 2024
            # where a plain integer column with a missing value, float in pandas, writes 2024.0;
            # porter does not know which columns of this frame are nullable (a frame a step
            # built without following them, or back from pandas), and writes integers as integers
            ctx.lower("the script uses pandas' nullable integers, and porter does not know which "
                      "columns of this frame are: an integer column holding a missing value is "
                      "written 2024, as a nullable column is; a plain one is float in pandas "
                      "(2024.0)", 0.9)
        else:
            # (the columns pandas holds as nullable integers are text already: the selector
            # passes over them)
            out.append(emit.atom(CSV_INTS_CONSTANT))
    if "float" in kinds or not complete:
        # Python's repr of small floats (5e-05, 1.5e-07), where Polars writes 0.00005, 1.5e-7;
        # the selector finds float columns porter has no type for (a describe(), a Series'
        # values, keys) too
        out.append(emit.atom(CSV_FLOATS_CONSTANT))
    if ctx.lists_possible and not complete:
        # lists in columns porter may not know of (a frame back from pandas): Polars' CSV
        # writer refuses nested data, pandas writes str(list); the selectors find them all
        ctx.lower(_LIST_REPR_CAVEAT, 0.99)
        out += [emit.atom(CSV_LISTS_CONSTANT), emit.atom(CSV_NUMBER_LISTS_CONSTANT)]
        if _makes_arrays(ctx):
            ctx.lower("the script may put numpy arrays in a column (unique()), which pandas "
                      "writes [1 2]; Polars holds them as lists, written [1, 2] here", 0.9)
        return out
    for name, kind in frame.dtypes:  # lists of text (str.split): pandas writes str(list)
        if kind == LIST_STR and (frame.columns is None or name in frame.columns):
            ctx.lower(_LIST_REPR_CAVEAT, 0.99)
            out.append(list_repr(emit.col(name)).method("alias", name))
    return out


# float32 columns as pandas' to_csv writes them: numpy's text of each value (values.astype(str):
# 0.1, 1.234567e+06, 1e-04, with the shortest digits of the float32), NaN as an empty field.
# Polars writes the same digits positionally (1234567.0, 0.0001); PANDAS_CSV_FLOATS' selector
# no longer finds these columns once they are text
FLOAT32_TEXT = ("pl.selectors.by_dtype(pl.Float32).map_batches(lambda s: pl.Series(s.name, "
                "s.to_numpy().astype(str), dtype=pl.String).replace(\"nan\", None), "
                "return_dtype=pl.String)")


def float32_text(frame: Frame, ctx: RuleContext) -> Frame:
    """`frame` with its float32 columns written as pandas writes them (FLOAT32_TEXT), where
    the script may hold one (ops.float32_possible)."""
    from porter.rules.ops import float32_possible

    complete = frame.columns is not None and len(frame.dtypes) == len(frame.columns)
    if not ({t for _, t in frame.dtypes} & {"float", "other"} or not complete) \
            or not float32_possible(ctx):
        return frame
    return derive(frame, frame.code.method("with_columns", emit.atom(FLOAT32_TEXT)), same_rows=True)


def nullable_ints_text(frame: Frame, ctx: RuleContext) -> Frame:
    """`frame` with the integer columns pandas holds as nullable integers (astype("Int64"),
    dtype={"c": "Int64"}, dt.isocalendar() parts) written as their digits: pandas writes 2024
    for them even beside a missing value, where PANDAS_CSV_INTS writes a plain int column
    holding one as float64 (2024.0). A column porter cannot tell (written by a step from a
    frame that holds nullable integers) is written as ints too, at lower confidence."""
    if frame.nullable_ints is None:
        return frame  # nothing known (csv_text_columns says so)
    nullable, unsure = nullable_columns(frame)  # type: ignore[misc]
    if unsure:
        ctx.lower(f"porter does not know whether pandas holds {', '.join(map(repr, unsure))} as "
                  "one of its nullable integers (written 2024) or as a plain int column "
                  "(float64 with a missing value, written 2024.0): written as integers", 0.9)
    names = [*nullable, *unsure]
    if not names:
        return frame
    # the integer columns among them (an unsure one may be of another type): their digits
    chosen = emit.binop(emit.call("pl.selectors.by_name", *names, require_all=False), "&",
                        emit.atom("pl.selectors.integer()"))
    return derive(frame, frame.code.method("with_columns", chosen.method(
        "cast", emit.atom("pl.String"))), same_rows=True)


def _makes_arrays(ctx: RuleContext) -> bool:
    """Whether the script may put numpy arrays in a column: a groupby's unique(), or a
    function (a lambda, or what a def returns) giving .values / .to_numpy() / .unique() /
    np.array."""
    import ast

    def attrs(node: ast.AST) -> set[str]:
        return {n.attr for n in ast.walk(node) if isinstance(n, ast.Attribute)}

    module = ctx.python_module
    if module is None:
        return True
    for node in ast.walk(module):
        if isinstance(node, ast.Attribute) and node.attr == "unique" and "groupby" in attrs(node.value):
            return True
        given = [node.body] if isinstance(node, ast.Lambda) else \
            [n.value for n in ast.walk(node) if isinstance(n, ast.Return) and n.value is not None] \
            if isinstance(node, ast.FunctionDef) else []
        if any(attrs(value) & {"values", "to_numpy", "unique", "array"} for value in given):
            return True
    return False


@rule("frame.to_parquet")
def to_parquet(call: PandasCall, ctx: RuleContext) -> Value:
    """DataFrame.to_parquet -> LazyFrame.sink_parquet.

    Handles: index=False; a frame with the index columns porter tracks (a groupby's keys) is
    written by pandas, which marks them as the index in the file's metadata (its read_parquet
    restores them as the row labels; Polars would write plain columns).
    """
    ctx.reject_unknown(call, "path", "index", "engine", "compression", positional=1)
    target = _write_target(call, ctx, "parquet")
    frame = _as_frame(call)
    index = call.const("index", None, None)
    if index and not frame.index:
        raise ctx.todo("index=True stores the row labels as a column; add it with with_row_index")
    if index is None and not frame.index and not frame.labels_intact:
        # pandas stores row labels 0..n-1 as metadata only, and any others (after a filter
        # or a sort) in the file: its read_parquet gives them back as the row labels
        raise ctx.todo("pandas stores the row labels, which are no longer 0..n-1 here, in the "
                       "file (read_parquet gives them back); Polars writes none: write "
                       "index=False, or reset_index(drop=True) first")
    if frame.index and index is not False:
        # pandas marks the index columns (a groupby's keys) as the index in the file's
        # metadata, and its read_parquet restores them as the row labels; Polars would write
        # them as plain columns: pandas writes the file, from the frame with its index put back
        ctx.handover = True
        ctx.lower(f"pandas stores {', '.join(frame.index)} as the index in the file (its "
                  "read_parquet restores them as the row labels): handed over to pandas for "
                  "the write", 1.0)
        passed = {name: _plain_argument(call, name) for name in ("index", "engine", "compression")
                  if call.has(name)}
        return Scalar(handover.to_pandas(frame).method("to_parquet", target.code, **passed))
    frame = written_index(frame, index is not False)
    kwargs: dict[str, object] = {}
    compression = call.const("compression", None, None)
    if compression is not None:
        kwargs["compression"] = compression
    return Scalar(frame.code.method("sink_parquet", target.code, **kwargs))


def _as_frame(call: PandasCall) -> Frame:
    receiver = call.receiver
    if isinstance(receiver, Frame):
        return receiver
    from porter.translate.values import Column
    assert isinstance(receiver, Column)
    code = handover.series_frame(receiver)
    name = receiver.name if receiver.name is not None else "0"
    # the Series keeps its frame's row labels: after a filter or a sort they are no longer
    # 0..n-1, which to_csv's index=True (and to_parquet) must not write as such
    return Frame(code, columns=(*receiver.frame.index, name), index=receiver.frame.index,
                 labels_intact=receiver.frame.labels_intact,
                 index_unnamed=receiver.frame.index_unnamed)
