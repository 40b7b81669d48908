"""Tests for porter/verify/tables.py: reading back the table files a script wrote.

Each format is written twice, the pandas way and the Polars way, from the same table; both files
must read back as the same table, and as that table.
"""

from __future__ import annotations

from collections.abc import Callable
import datetime as dt
import json
from pathlib import Path
import sys

import numpy as np
import pandas as pd
import polars as pl
import pytest

from porter.verify import tables
from porter.verify.compare import compare
from porter.verify.tables import TableReadError, read_table

PANDAS = pd.DataFrame({
    "id": [1, 2, 3],
    "price": [1.5, np.nan, 2.25],
    "name": ["Éclair", None, "a,b"],
    "ok": [True, False, True],
    "maybe": pd.Series([True, None, False], dtype=object),
    "at": pd.to_datetime(["2024-01-01 08:00:00", "2024-01-01 09:30:00.5", None], format="ISO8601"),
})
POLARS = pl.from_pandas(PANDAS)

Writer = Callable[[Path], object]

WRITES: dict[str, tuple[Writer, Writer]] = {
    "csv": (lambda p: PANDAS.to_csv(p, index=False), POLARS.write_csv),
    "tsv": (lambda p: PANDAS.to_csv(p, index=False, sep="\t"),
            lambda p: POLARS.write_csv(p, separator="\t")),
    "parquet": (PANDAS.to_parquet, POLARS.write_parquet),
    "jsonl": (lambda p: PANDAS.to_json(p, orient="records", lines=True, date_format="iso"),
              POLARS.write_ndjson),
    "ndjson": (lambda p: PANDAS.to_json(p, orient="records", lines=True, date_format="iso"),
               POLARS.write_ndjson),
    "json": (lambda p: PANDAS.to_json(p, orient="records", date_format="iso"), POLARS.write_json),
}


def written(tmp_path: Path, suffix: str, pandas_write: Writer, polars_write: Writer
            ) -> tuple[pl.DataFrame | None, pl.DataFrame | None]:
    pandas_file, polars_file = tmp_path / f"pandas.{suffix}", tmp_path / f"polars.{suffix}"
    pandas_write(pandas_file)
    polars_write(polars_file)
    return read_table(pandas_file), read_table(polars_file)


@pytest.mark.parametrize("suffix", WRITES)
def test_round_trip(tmp_path: Path, suffix: str) -> None:
    from_pandas, from_polars = written(tmp_path, suffix, *WRITES[suffix])
    assert from_pandas is not None and from_polars is not None
    assert compare(from_pandas, from_polars).status == "same"
    assert compare(from_pandas, PANDAS).status == "same"  # and it is the table written


@pytest.mark.parametrize("orient", ["columns", "split", "table", "records"])
def test_pandas_json_orients(tmp_path: Path, orient: str) -> None:
    from_pandas, from_polars = written(
        tmp_path, "json", lambda p: PANDAS.to_json(p, orient=orient, date_format="iso"),
        POLARS.write_json)
    assert from_pandas is not None and from_polars is not None
    assert compare(from_pandas, from_polars).status == "same"


def test_json_values_and_dict_of_lists(tmp_path: Path) -> None:
    values = tmp_path / "values.json"
    values.write_text("[[1, \"a\"], [2, null]]")
    assert read_table(values).rows() == [(1.0, "a"), (2.0, None)]  # type: ignore[union-attr]
    lists = tmp_path / "lists.json"
    lists.write_text(json.dumps({"a": [1, 2], "b": ["x", None]}))
    assert compare(read_table(lists), pl.DataFrame({"a": [1, 2], "b": ["x", None]})).status \
        == "same"


def test_xlsx_round_trip(tmp_path: Path) -> None:
    # what a converted script writes: porter hands to_excel over to pandas
    from_pandas, from_polars = written(tmp_path, "xlsx", lambda p: PANDAS.to_excel(p, index=False),
                                       lambda p: POLARS.to_pandas().to_excel(p, index=False))
    assert from_pandas is not None and from_polars is not None
    assert compare(from_pandas, from_polars).status == "same"
    assert from_pandas.columns == list(PANDAS.columns)
    assert from_pandas["name"].to_list() == ["Éclair", None, "a,b"]
    assert from_pandas["at"][1] == dt.datetime(2024, 1, 1, 9, 30, 0, 500000)


def test_xlsx_written_by_polars(tmp_path: Path) -> None:
    pytest.importorskip("xlsxwriter")
    from_pandas, from_polars = written(tmp_path, "xlsx", lambda p: PANDAS.to_excel(p, index=False),
                                       POLARS.write_excel)
    assert compare(from_pandas, from_polars).status == "same"


def test_xlsx_sheets_are_stacked(tmp_path: Path) -> None:
    path = tmp_path / "book.xlsx"
    with pd.ExcelWriter(path) as book:
        PANDAS[["id"]].to_excel(book, sheet_name="first", index=False)
        PANDAS[["id"]].head(1).to_excel(book, sheet_name="second", index=False)
    table = read_table(path)
    assert table is not None
    assert table.rows() == [("first", 1.0), ("first", 2.0), ("first", 3.0), ("second", 1.0)]


def test_xlsx_without_openpyxl_is_compared_as_bytes(tmp_path: Path,
                                                    monkeypatch: pytest.MonkeyPatch) -> None:
    path = tmp_path / "out.xlsx"
    PANDAS.to_excel(path, index=False)
    monkeypatch.setitem(sys.modules, "openpyxl", None)  # import openpyxl now raises ImportError
    assert read_table(path) is None


# --------------------------------------------------------------------------------------------
# CSV details


def test_written_index_is_a_column(tmp_path: Path) -> None:
    # to_csv's default index=True writes the row labels: a real difference in the file
    from_pandas, from_polars = written(tmp_path, "csv", PANDAS.to_csv, POLARS.write_csv)
    assert from_pandas is not None and from_pandas.columns[0] == "Unnamed: 0"
    result = compare(from_pandas, from_polars)
    assert result.status == "different" and "Unnamed: 0" in result.detail


def test_csv_datetime_text_of_both_libraries(tmp_path: Path) -> None:
    pandas_file, polars_file = tmp_path / "a.csv", tmp_path / "b.csv"
    pandas_file.write_text("t,d\n2024-01-01 09:00:00+01:00,2024-01-31\n")
    polars_file.write_text("t,d\n2024-01-01T08:00:00.000000Z,2024-01-31T00:00:00.000000\n")
    from_pandas, from_polars = read_table(pandas_file), read_table(polars_file)
    assert from_pandas is not None
    assert from_pandas.schema == pl.Schema({"t": pl.Datetime("us", "UTC"), "d": pl.Datetime("us")})
    assert compare(from_pandas, from_polars).status == "same"


def test_csv_text_that_only_looks_like_dates_stays_text(tmp_path: Path) -> None:
    path = tmp_path / "a.csv"
    path.write_text("a,b,c\n2024-13-45,2024-01-01,2024-01-01\nx,01/02/2024,2024-01-02 10:00\n")
    table = read_table(path)
    assert table is not None
    assert table.schema == pl.Schema({"a": pl.String, "b": pl.String, "c": pl.Datetime("us")})


def test_csv_empty_file_is_an_empty_table(tmp_path: Path) -> None:
    path = tmp_path / "empty.csv"
    path.write_text("")
    table = read_table(path)
    assert table is not None and table.shape == (0, 0)
    path.write_text("a,b\n")
    table = read_table(path)
    assert table is not None and table.columns == ["a", "b"] and table.height == 0


def test_csv_without_pandas_reads_with_polars(tmp_path: Path,
                                              monkeypatch: pytest.MonkeyPatch) -> None:
    path = tmp_path / "polars.csv"
    POLARS.write_csv(path)
    monkeypatch.setattr(tables, "_pandas", lambda: None)
    table = read_table(path)
    assert table is not None
    assert compare(table, PANDAS).status == "same"


# --------------------------------------------------------------------------------------------
# Parquet details


def test_parquet_unnamed_index_is_dropped(tmp_path: Path) -> None:
    shuffled = PANDAS.iloc[[2, 0, 1]]  # labels 2, 0, 1: no range, pandas stores a column
    shuffled.to_parquet(tmp_path / "shuffled.parquet")
    assert "__index_level_0__" in pl.read_parquet(tmp_path / "shuffled.parquet").columns
    assert compare(read_table(tmp_path / "shuffled.parquet"), POLARS[[2, 0, 1]]).status == "same"


def test_parquet_named_index_is_a_column(tmp_path: Path) -> None:
    PANDAS.set_index("name").to_parquet(tmp_path / "stored.parquet")  # stored as a column
    assert compare(read_table(tmp_path / "stored.parquet"), POLARS).status == "same"
    # consecutive ids become a RangeIndex, which pandas keeps only in the file's metadata
    PANDAS.set_index("id").to_parquet(tmp_path / "range.parquet")
    assert "id" not in pl.read_parquet(tmp_path / "range.parquet").columns
    table = read_table(tmp_path / "range.parquet")
    assert table is not None and table["id"].to_list() == [1.0, 2.0, 3.0]
    assert compare(table, POLARS).status == "same"


# --------------------------------------------------------------------------------------------
# errors and non-tables


@pytest.mark.parametrize("name, content", [
    ("ragged.csv", b"a,b\n1,2\n3,4,5,6\n"),
    ("latin1.csv", "a\nÉclair\n".encode("latin-1")),
    ("garbage.parquet", b"not a parquet file"),
    ("broken.json", b"[{\"a\": 1},"),
    ("ragged.json", json.dumps({"columns": ["a", "b"], "data": [[1, 2], [3]]}).encode()),
    ("uneven.json", json.dumps({"a": [1, 2], "b": [1]}).encode()),
    ("broken.jsonl", b"{\"a\": 1}\n{\"a\": \n"),
    ("list.jsonl", b"{\"a\": 1}\n[1, 2]\n"),
    ("garbage.xlsx", b"not a workbook"),
])
def test_unreadable_table_raises(tmp_path: Path, name: str, content: bytes) -> None:
    path = tmp_path / name
    path.write_bytes(content)
    with pytest.raises(TableReadError, match=name):
        read_table(path)


@pytest.mark.parametrize("name, content", [
    ("notes.txt", "a,b\n1,2\n"),
    ("chart.png", "\x89PNG"),
    ("total.json", "42"),
    ("summary.json", json.dumps({"rows": 3, "ok": True})),
    ("mixed.json", json.dumps([{"a": 1}, 2])),
])
def test_non_tables_return_none(tmp_path: Path, name: str, content: str) -> None:
    path = tmp_path / name
    path.write_text(content)
    assert read_table(path) is None


def test_suffix_is_case_insensitive(tmp_path: Path) -> None:
    path = tmp_path / "OUT.CSV"
    PANDAS.to_csv(path, index=False)
    assert compare(read_table(path), PANDAS).status == "same"
