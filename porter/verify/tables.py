"""Read back the table files a script wrote, so the two sides' outputs can be compared.

Both sides' files are read by the same code, so whatever a reader does to a file (type
inference, text parsing) it does to both and cancels out; only what differs in the files shows.
Every table comes back normalised (`compare.normalize`).
"""

from __future__ import annotations

import importlib
import json
import re
from pathlib import Path
from types import ModuleType

import polars as pl

from porter.verify.compare import column_from_values, normalize

TEXT_SUFFIXES = {".csv": ",", ".tsv": "\t"}
JSON_LINES_SUFFIXES = {".jsonl", ".ndjson"}
TABLE_SUFFIXES = {*TEXT_SUFFIXES, *JSON_LINES_SUFFIXES, ".json", ".parquet", ".xlsx"}

# ISO 8601 text as pandas and Polars write datetimes: `2024-01-31`, `2024-01-31 08:00:00`,
# `2024-01-31T08:00:00.000000`, with an offset `+01:00`, `+0100` or `Z` for aware ones.
_NAIVE = r"^\d{4}-\d{2}-\d{2}(?:[ T]\d{2}:\d{2}(?::\d{2}(?:\.\d{1,9})?)?)?$"
_AWARE = r"^\d{4}-\d{2}-\d{2}[ T]\d{2}:\d{2}:\d{2}(?:\.\d{1,9})?(?:Z|[+-]\d{2}:?\d{2})$"
# where pandas' to_parquet stores an unnamed index
_PANDAS_INDEX = re.compile(r"__index_level_\d+__")


class TableReadError(Exception):
    """A file with a table suffix that cannot be read as a table."""


def read_table(path: Path) -> pl.DataFrame | None:
    """The table in `path`, chosen by its suffix, normalised; None when it is not a table.

    - `.csv`, `.tsv`: pandas' `read_csv` with its defaults (Polars' `read_csv` if pandas is not
      importable); an empty file is an empty table.
    - `.parquet`: Polars; pandas' index as `normalize` reads it (see `_read_parquet`).
    - `.jsonl`, `.ndjson`: one JSON object per line.
    - `.json`: records (a list of objects, what Polars writes), or pandas' `to_json` orients
      "columns" (dict of dicts; also "index", which has the same shape and so reads
      transposed), "split", "table" and "values", or a dict of equal-length lists. The index
      of the "columns" and "split" orients is dropped (it has no name there). JSON that parses
      but is no table (a scalar, a dict of scalars...) returns None: compare it as bytes.
    - `.xlsx`: pandas + openpyxl (None when they are not importable: compare bytes). A workbook
      of several sheets is one table with a leading `sheet` column naming each row's sheet.

    In the text formats (CSV, TSV, JSON) a text column whose every value is an ISO 8601 date or
    datetime is read as Datetime (dates at midnight; aware values in UTC): these formats have no
    datetime type, and pandas and Polars write the same instant as different text
    (`2024-01-31 08:00:00` vs `2024-01-31T08:00:00.000000`). pandas' default `to_json` writes
    datetimes as epoch milliseconds, which no reader can tell from numbers.

    Raises TableReadError when a table file cannot be read.
    """
    suffix = path.suffix.lower()
    if suffix not in TABLE_SUFFIXES:
        return None
    try:
        if suffix in TEXT_SUFFIXES:
            return _text_datetimes(_read_delimited(path, TEXT_SUFFIXES[suffix]))
        if suffix == ".parquet":
            return _read_parquet(path)
        if suffix in JSON_LINES_SUFFIXES:
            return _text_datetimes(_read_json_lines(path))
        if suffix == ".json":
            table = _read_json(path)
            return None if table is None else _text_datetimes(table)
        return _read_excel(path)
    except TableReadError:
        raise
    except Exception as error:  # whatever the reader says is why the table cannot be read
        raise TableReadError(f"cannot read {path.name} as a table: "
                             f"{type(error).__name__}: {error}") from error


def _pandas() -> ModuleType | None:
    try:
        import pandas
    except ImportError:
        return None
    return pandas


def _read_delimited(path: Path, separator: str) -> pl.DataFrame:
    if not path.read_bytes().strip():
        return pl.DataFrame()
    pd = _pandas()
    if pd is None:
        return normalize(pl.read_csv(path, separator=separator, infer_schema_length=None))
    return normalize(pd.read_csv(path, sep=separator))


def _read_parquet(path: Path) -> pl.DataFrame:
    """Polars reads the stored columns; pandas' index is read the way `normalize` treats it.

    pandas stores an unnamed index as `__index_level_N__` columns (dropped, like an unnamed
    index) and a RangeIndex only in its metadata, which Polars ignores: a named one (e.g. after
    `set_index("id")` on consecutive ids) is put back as a column.
    """
    frame = pl.read_parquet(path)
    frame = frame.drop(c for c in frame.columns if _PANDAS_INDEX.fullmatch(c))
    metadata = json.loads(pl.read_parquet_metadata(path).get("pandas") or "{}")
    ranges = [pl.int_range(i["start"], i["stop"], i["step"], eager=True).alias(str(i["name"]))
              for i in metadata.get("index_columns", ())
              if isinstance(i, dict) and i.get("kind") == "range" and i.get("name") is not None
              and str(i["name"]) not in frame.columns]
    return normalize(pl.DataFrame([*ranges, *frame.get_columns()]) if ranges else frame)


def _read_json_lines(path: Path) -> pl.DataFrame:
    records = []
    for number, line in enumerate(path.read_text(encoding="utf-8").splitlines(), 1):
        if line.strip():
            try:
                record = json.loads(line)
            except json.JSONDecodeError as error:
                raise TableReadError(f"cannot read {path.name}: line {number} is not JSON "
                                     f"({error.msg})") from error
            if not isinstance(record, dict):
                raise TableReadError(f"cannot read {path.name}: line {number} is not a JSON object")
            records.append(record)
    return _from_records(records)


def _read_json(path: Path) -> pl.DataFrame | None:
    text = path.read_text(encoding="utf-8")
    if not text.strip():
        return pl.DataFrame()
    try:
        data = json.loads(text)
    except json.JSONDecodeError as error:
        raise TableReadError(f"cannot read {path.name}: not JSON ({error.msg} at line "
                             f"{error.lineno})") from error
    if isinstance(data, list):
        if all(isinstance(row, dict) for row in data):  # records (also the empty list)
            return _from_records(data)
        if all(isinstance(row, list) for row in data):  # values
            return _from_rows(path, [str(i) for i in range(len(data[0]))], data)
        return None
    if not isinstance(data, dict) or not data:
        return None
    if isinstance(data.get("schema"), dict) and isinstance(data.get("data"), list):  # table
        table = _from_records(data["data"])
        if data["schema"].get("primaryKey") == ["index"] and "index" in table.columns:
            table = table.drop("index")  # pandas' name for an unnamed index
        return table
    if isinstance(data.get("columns"), list) and isinstance(data.get("data"), list):  # split
        names = ["_".join(map(str, c)) if isinstance(c, list) else str(c) for c in data["columns"]]
        return _from_rows(path, names, data["data"])
    values = list(data.values())
    if all(isinstance(v, dict) for v in values):  # columns: {column: {row label: value}}
        labels = list(dict.fromkeys(label for column in values for label in column))
        return pl.DataFrame([column_from_values(str(name), [column.get(label) for label in labels])
                             for name, column in data.items()])
    if all(isinstance(v, list) for v in values):  # {column: [values]}
        if len({len(v) for v in values}) != 1:
            raise TableReadError(f"cannot read {path.name}: its columns have different lengths")
        return pl.DataFrame([column_from_values(str(k), v) for k, v in data.items()])
    return None


def _from_records(records: list[dict[str, object]]) -> pl.DataFrame:
    names = dict.fromkeys(name for record in records for name in record)
    return pl.DataFrame([column_from_values(str(name), [r.get(name) for r in records])
                         for name in names])


def _from_rows(path: Path, names: list[str], rows: list[object]) -> pl.DataFrame:
    if any(not isinstance(row, list) or len(row) != len(names) for row in rows):
        raise TableReadError(f"cannot read {path.name}: its rows do not all have "
                             f"{len(names)} values")
    return pl.DataFrame([column_from_values(name, [row[i] for row in rows])  # type: ignore[index]
                         for i, name in enumerate(names)])


def _read_excel(path: Path) -> pl.DataFrame | None:
    pd = _pandas()
    try:
        importlib.import_module("openpyxl")  # pandas' reader for .xlsx
    except ImportError:
        return None
    if pd is None:
        return None
    workbook = pd.read_excel(path, sheet_name=None)
    sheets = {name: normalize(frame) for name, frame in workbook.items()}
    if len(sheets) == 1:
        return next(iter(sheets.values()))
    return pl.concat([frame.select(pl.lit(str(name)).alias("sheet"), pl.all())
                      for name, frame in sheets.items()], how="diagonal_relaxed")


def _text_datetimes(frame: pl.DataFrame) -> pl.DataFrame:
    """Text columns whose every value is an ISO 8601 date or datetime, as Datetime("us")."""
    return frame.with_columns(_parsed(s) for s in frame.get_columns() if s.dtype == pl.String
                              and s.null_count() < s.len())


def _parsed(s: pl.Series) -> pl.Series:
    present = s.drop_nulls()
    text = s.str.replace("T", " ", literal=True)
    try:
        if present.str.contains(_NAIVE).all():
            padded = pl.select(pl.when(text.str.len_chars() == 10).then(text + " 00:00:00")
                               .when(text.str.len_chars() == 16).then(text + ":00")
                               .otherwise(text)).to_series()
            return padded.str.to_datetime("%Y-%m-%d %H:%M:%S%.f", time_unit="us").alias(s.name)
        if present.str.contains(_AWARE).all():
            text = text.str.replace("Z$", "+00:00")
            return (text.str.to_datetime("%Y-%m-%d %H:%M:%S%.f%z", time_unit="us")
                    .dt.convert_time_zone("UTC").alias(s.name))
    except pl.exceptions.PolarsError:  # looked like dates but is not (2024-13-45): keep text
        pass
    return s
