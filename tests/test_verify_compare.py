"""Tests for porter/verify/compare.py: normalising both sides' outputs and comparing them."""

from __future__ import annotations

import datetime as dt
import time

import numpy as np
import pandas as pd
import polars as pl
import pytest

from porter.verify.compare import ABS_TOL, column_from_values, compare, normalize
from porter.verify.model import Comparison

SALES = pd.DataFrame({"city": ["Oslo", "Lima", "Oslo", "Pune"], "kg": [3, 5, 4, 1]})


def frame(**columns: object) -> pl.DataFrame:
    return pl.DataFrame(columns, strict=False)


# --------------------------------------------------------------------------------------------
# normalize: index


def test_named_index_becomes_a_column() -> None:
    table = normalize(SALES.set_index("city"))
    assert table.columns == ["city", "kg"]
    assert table["city"].to_list() == ["Oslo", "Lima", "Oslo", "Pune"]


def test_multiindex_becomes_columns() -> None:
    grouped = SALES.assign(year=[2023, 2023, 2024, 2024]).groupby(["city", "year"])["kg"].sum()
    table = normalize(grouped)
    assert table.columns == ["city", "year", "kg"]
    assert table.rows() == [("Lima", 2023.0, 5.0), ("Oslo", 2023.0, 3.0), ("Oslo", 2024.0, 4.0),
                            ("Pune", 2024.0, 1.0)]


def test_unnamed_multiindex_levels_are_named_like_reset_index() -> None:
    data = pd.DataFrame({"v": [1, 2]}, index=pd.MultiIndex.from_tuples([("a", 1), ("b", 2)]))
    assert normalize(data).columns == ["level_0", "level_1", "v"]


def test_default_range_index_is_dropped() -> None:
    assert normalize(SALES).columns == ["city", "kg"]


def test_unnamed_plain_index_is_dropped() -> None:
    filtered = SALES[SALES["kg"] > 3]  # labels 1, 2: not 0..n-1 but still no data
    assert filtered.index.tolist() == [1, 2]
    table = normalize(filtered)
    assert table.columns == ["city", "kg"]
    assert table.height == 2


def test_row_labels_carried_as_a_column_are_compared_with_pandas_labels() -> None:
    # porter carries the labels a filter left (1, 2) as a first column "index" where a later
    # step reads them: compared with pandas' own labels, as data
    filtered = SALES[SALES["kg"] > 3]
    carried = frame(index=[1, 2], city=["Lima", "Oslo"], kg=[5, 4])
    assert compare(filtered, carried).status == "same"
    wrong = frame(index=[0, 1], city=["Lima", "Oslo"], kg=[5, 4])  # renumbered: not pandas'
    assert compare(filtered, wrong).status == "different"
    # a frame with a column of its own named "index" is not read that way
    other = SALES.rename(columns={"kg": "index"})
    assert compare(other, frame(index=[0], city=["x"], kg=[1])).status == "different"


def test_unnamed_index_of_labels_is_data() -> None:
    # df.isna().sum(): a Series indexed by the column names, which the reader sees; the
    # converted side holds them as a column "index", as reset_index() names them
    missing = SALES.assign(kg=[1.0, None, 3.0, 2.0]).isna().sum()
    table = normalize(missing)
    assert table.columns == ["index", "0"]
    assert table["index"].to_list() == ["city", "kg"]
    assert normalize(pd.DataFrame({"v": [1]}, index=["x"])).columns == ["index", "v"]
    # a column already named "index" keeps its own values
    assert normalize(pd.DataFrame({"index": [1]}, index=["x"])).columns == ["index"]


def test_index_that_is_also_a_column_is_not_repeated() -> None:
    assert normalize(SALES.set_index("city", drop=False)).columns == ["city", "kg"]


# --------------------------------------------------------------------------------------------
# normalize: column names


def test_multiindex_columns_are_flattened_with_underscore() -> None:
    aggregated = SALES.groupby("city").agg({"kg": ["sum", "mean"]})
    assert normalize(aggregated).columns == ["city", "kg_sum", "kg_mean"]
    # after reset_index the key column is ("city", ""): its empty part is left out
    assert normalize(aggregated.reset_index()).columns == ["city", "kg_sum", "kg_mean"]


def test_column_names_are_strings() -> None:
    table = normalize(pd.DataFrame([[1, 2]]))
    assert table.columns == ["0", "1"]


def test_repeated_pandas_column_names_are_numbered() -> None:
    data = pd.concat([SALES[["kg"]], SALES[["kg"]] * 2], axis=1)
    table = normalize(data)
    assert table.columns == ["kg", "kg_1"]
    assert table["kg_1"].to_list() == [6.0, 10.0, 8.0, 2.0]


# --------------------------------------------------------------------------------------------
# normalize: values


@pytest.mark.parametrize("missing", [np.nan, None, pd.NaT, pd.NA, float("nan")])
def test_every_missing_marker_is_null(missing: object) -> None:
    column = normalize(pd.DataFrame({"v": pd.Series([1.5, missing], dtype=object)}))["v"]
    assert column.to_list() == [1.5, None]
    assert column.dtype == pl.Float64


def test_missing_in_typed_pandas_columns_is_null() -> None:
    data = pd.DataFrame({"f": [1.0, np.nan], "i": pd.array([1, pd.NA], dtype="Int64"),
                         "t": pd.to_datetime(["2024-01-01", None]), "s": ["a", None]})
    assert normalize(data).null_count().row(0) == (1, 1, 1, 1)


def test_polars_nan_is_null() -> None:
    assert normalize(pl.DataFrame({"v": [1.0, float("nan"), None]}))["v"].null_count() == 2


def test_numbers_are_float64_and_booleans_stay_booleans() -> None:
    table = normalize(pd.DataFrame({"i": [1, 2], "u": np.array([1, 2], dtype="uint8"),
                                    "b": [True, False],
                                    "bo": pd.Series([True, None], dtype=object)}))
    assert table.schema == pl.Schema({"i": pl.Float64, "u": pl.Float64, "b": pl.Boolean,
                                      "bo": pl.Boolean})
    polars = normalize(pl.DataFrame({"i": [1], "d": pl.Series([1.5], dtype=pl.Decimal(10, 2))}))
    assert polars.schema == pl.Schema({"i": pl.Float64, "d": pl.Float64})


def test_categoricals_are_strings() -> None:
    pandas_cat = normalize(pd.DataFrame({"c": pd.Categorical(["x", None, "y"])}))
    polars_cat = normalize(pl.DataFrame({"c": pl.Series(["x", None, "y"], dtype=pl.Categorical)}))
    assert pandas_cat.schema == polars_cat.schema == pl.Schema({"c": pl.String})
    assert pandas_cat["c"].to_list() == ["x", None, "y"]
    # a categorical compares as its values: int categories are numbers
    assert normalize(pd.DataFrame({"c": pd.Categorical([1, 2])}))["c"].dtype == pl.Float64


def test_pandas_text_is_string() -> None:
    table = normalize(pd.DataFrame({"s": pd.Series(["a", None], dtype="str"),
                                    "o": pd.Series(["a", None], dtype=object)}))
    assert table.schema == pl.Schema({"s": pl.String, "o": pl.String})


def test_mixed_object_column_compares_as_text() -> None:
    assert normalize(pd.DataFrame({"m": ["a", 1, None]}))["m"].to_list() == ["a", "1", None]


def test_datetimes_at_microseconds() -> None:
    stamps = pd.to_datetime(["2024-01-01 08:00:00.123456789"])
    table = normalize(pd.DataFrame({"t": stamps}))
    assert table.schema["t"] == pl.Datetime("us")
    assert table["t"][0] == dt.datetime(2024, 1, 1, 8, 0, 0, 123456)


def test_tz_aware_datetimes_are_utc_and_naive_stay_naive() -> None:
    paris = pd.DataFrame({"t": pd.to_datetime(["2024-01-01 09:00"]).tz_localize("Europe/Paris")})
    table = normalize(paris)
    assert table.schema["t"] == pl.Datetime("us", "UTC")
    assert table["t"][0] == dt.datetime(2024, 1, 1, 8, tzinfo=dt.timezone.utc)
    naive = normalize(pd.DataFrame({"t": pd.to_datetime(["2024-01-01 09:00"])}))
    assert naive.schema["t"] == pl.Datetime("us")
    objects = normalize(pd.DataFrame({"t": [dt.datetime(2024, 1, 1, 9, tzinfo=dt.timezone(
        dt.timedelta(hours=1)))]}))
    assert objects["t"][0] == dt.datetime(2024, 1, 1, 8, tzinfo=dt.timezone.utc)


def test_date_objects_are_dates() -> None:
    table = normalize(pd.DataFrame({"d": [dt.date(2024, 1, 31), None]}))
    assert table.schema["d"] == pl.Date
    assert table["d"].to_list() == [dt.date(2024, 1, 31), None]
    assert normalize(pl.DataFrame({"d": [dt.date(2024, 1, 31)]})).schema["d"] == pl.Date


def test_series_is_a_one_column_table() -> None:
    assert normalize(pd.Series([1, 2], name="kg")).columns == ["kg"]
    assert normalize(pd.Series([1, 2])).columns == ["0"]
    assert normalize(pl.Series([1, 2])).columns == ["0"]
    assert normalize(pl.Series("kg", [1, 2])).columns == ["kg"]


def test_lazy_frame_is_collected() -> None:
    table = normalize(pl.LazyFrame({"a": [1, 2]}).filter(pl.col("a") > 1))
    assert table.rows() == [(2.0,)]


def test_normalize_is_idempotent() -> None:
    once = normalize(SALES.groupby("city").agg({"kg": ["sum", "mean"]}))
    assert normalize(once).equals(once)


def test_normalize_rejects_what_is_no_table() -> None:
    with pytest.raises(TypeError, match="list"):
        normalize([1, 2])


def test_column_from_values_kinds() -> None:
    assert column_from_values("a", [1, 2.5, None]).dtype == pl.Float64
    assert column_from_values("a", [True, None]).dtype == pl.Boolean
    assert column_from_values("a", [None, None]).dtype == pl.Null
    assert column_from_values("a", [dt.timedelta(seconds=1)]).dtype == pl.Duration("us")
    assert column_from_values("a", [True, 1]).to_list() == ["True", "1"]  # mixed: text


# --------------------------------------------------------------------------------------------
# compare: statuses


def test_same() -> None:
    assert compare(SALES, frame(city=["Oslo", "Lima", "Oslo", "Pune"], kg=[3, 5, 4, 1])) == \
        Comparison("same")


def test_column_order_is_ignored() -> None:
    assert compare(SALES, frame(kg=[3, 5, 4, 1], city=["Oslo", "Lima", "Oslo", "Pune"])).status \
        == "same"


def test_different_values_count_cells_and_show_rows() -> None:
    result = compare(SALES, frame(city=["Oslo", "Lima", "Oslo", "Pune"], kg=[3, 6, 4, 2]))
    assert result.status == "different"
    assert result.differing_cells == 2
    assert result.first_rows == ((1, ("Lima", 5.0), ("Lima", 6.0)),
                                 (3, ("Pune", 1.0), ("Pune", 2.0)))
    assert "2 cells differ in 2 of 4 rows" in result.detail and "kg" in result.detail


def test_first_rows_are_at_most_five() -> None:
    result = compare(pd.DataFrame({"v": range(10)}), frame(v=list(range(1, 11))))
    assert result.differing_cells == 10
    assert [row for row, _, _ in result.first_rows] == [0, 1, 2, 3, 4]


def test_different_columns_are_named() -> None:
    result = compare(SALES, frame(city=["Oslo", "Lima", "Oslo", "Pune"], weight=[3, 5, 4, 1]))
    assert result.status == "different"
    assert "missing in converted: kg" in result.detail
    assert "extra in converted: weight" in result.detail


def test_column_names_are_exact() -> None:
    assert compare(SALES, frame(City=["Oslo", "Lima", "Oslo", "Pune"], kg=[3, 5, 4, 1])).status \
        == "different"


def test_different_row_counts() -> None:
    result = compare(SALES, frame(city=["Oslo", "Oslo", "Pune"], kg=[3, 4, 1]))
    assert result.status == "different"
    assert "original has 4 rows, converted has 3" in result.detail
    assert "1 original rows and 0 converted rows have no match" in result.detail
    assert result.first_rows == ((1, ("Lima", 5.0), ()),)
    assert result.differing_cells == 2  # the two cells of the unmatched row


def test_different_row_counts_count_repeated_rows() -> None:
    result = compare(pd.DataFrame({"v": [1, 1, 2]}), frame(v=[1, 2, 2, 3]))
    assert "1 original rows and 2 converted rows have no match" in result.detail
    assert result.first_rows == ((1, (1.0,), ()), (2, (), (2.0,)), (3, (), (3.0,)))


def test_order_only() -> None:
    reordered = frame(city=["Pune", "Oslo", "Lima", "Oslo"], kg=[1, 4, 5, 3])
    result = compare(SALES, reordered)
    assert result.status == "same-unordered"
    assert "different order" in result.detail
    assert compare(SALES, reordered, ignore_order=True).status == "same"


def test_same_multiset_needs_same_repeats() -> None:
    assert compare(pd.DataFrame({"v": [1, 1, 2]}), frame(v=[2, 2, 1])).status == "different"


def test_ignore_order_still_finds_differences_after_sorting() -> None:
    result = compare(SALES, frame(city=["Pune", "Oslo", "Lima", "Oslo"], kg=[1, 4, 5, 9]),
                     ignore_order=True)
    assert result.status == "different"
    assert result.differing_cells == 1
    assert "1 of 4 rows have no equal row" in result.detail
    assert result.first_rows == ((0, ("Oslo", 3.0), ("Oslo", 9.0)),)


def test_unordered_with_missing_values() -> None:
    original = pd.DataFrame({"a": [None, "x", None], "v": [1.0, np.nan, np.nan]})
    converted = frame(a=["x", None, None], v=[None, None, 1.0])
    assert compare(original, converted).status == "same-unordered"


def test_nan_vs_value_differs() -> None:
    result = compare(pd.DataFrame({"v": [1.0, np.nan]}), frame(v=[1.0, 0.0]))
    assert result.status == "different"
    assert result.first_rows == ((1, (None,), (0.0,)),)


def test_none_and_nan_are_equal() -> None:
    assert compare(pd.DataFrame({"v": [1.0, np.nan]}), frame(v=[1.0, None])).status == "same"
    assert compare(pd.DataFrame({"s": ["a", None]}), frame(s=["a", None])).status == "same"
    assert compare(pd.DataFrame({"s": ["a", np.nan]}), frame(s=["a", None])).status == "same"


def test_all_missing_column_matches_any_type() -> None:
    assert compare(pd.DataFrame({"v": [np.nan, np.nan]}), pl.DataFrame({"v": [None, None]})) \
        .status == "same"


# --------------------------------------------------------------------------------------------
# compare: tolerance


def one(value: float) -> pl.DataFrame:
    return pl.DataFrame({"v": [value]})


def test_rtol_just_inside_and_just_outside() -> None:
    assert compare(one(1e6), one(1e6 * (1 + 0.9e-9))).status == "same"
    assert compare(one(1e6), one(1e6 * (1 + 1.1e-9))).status == "different"
    assert compare(one(1e6), one(1e6 * (1 + 1.1e-9)), rtol=1e-8).status == "same"


def test_infinities_match_exactly_only() -> None:
    inf = float("inf")
    assert compare(one(inf), one(inf)).status == "same"
    assert compare(one(-inf), one(-inf)).status == "same"
    assert compare(one(inf), one(-inf)).status == "different"
    assert compare(one(inf), one(1.7e308)).status == "different"
    assert compare(one(inf), pl.DataFrame({"v": [None]}, schema={"v": pl.Float64})).status \
        == "different"


def test_negative_zero_is_zero() -> None:
    assert compare(one(-0.0), one(0.0)).status == "same"
    assert compare(pl.DataFrame({"v": [-0.0, 1.0]}), pl.DataFrame({"v": [1.0, 0.0]})).status \
        == "same-unordered"


def test_absolute_tolerance_near_zero() -> None:
    assert compare(one(0.0), one(1e-300)).status == "same"
    assert compare(one(0.0), one(5.6e-17)).status == "same"  # a summation residue
    assert compare(one(0.0), one(ABS_TOL * 10)).status == "different"
    assert compare(one(0.0), one(1e-300), atol=0).status == "different"


def test_tolerance_applies_when_rows_are_reordered() -> None:
    original = pl.DataFrame({"k": ["a", "b"], "v": [0.1 + 0.2, 1.0]})
    assert compare(original, pl.DataFrame({"k": ["b", "a"], "v": [1.0, 0.3]})).status \
        == "same-unordered"


# --------------------------------------------------------------------------------------------
# compare: what pandas scripts produce against their Polars conversion


def test_groupby_with_and_without_reset_index() -> None:
    converted = SALES.pipe(pl.from_pandas).group_by("city", maintain_order=False).agg(
        pl.col("kg").sum()).sort("city")
    assert compare(SALES.groupby("city")["kg"].sum(), converted).status == "same"
    assert compare(SALES.groupby("city")["kg"].sum().reset_index(), converted).status == "same"
    assert compare(SALES.groupby("city").sum(), converted).status == "same"


def test_groupby_agg_multiindex_columns() -> None:
    original = SALES.groupby("city").agg({"kg": ["sum", "mean"]})
    converted = pl.DataFrame({"city": ["Lima", "Oslo", "Pune"], "kg_sum": [5, 7, 1],
                              "kg_mean": [5.0, 3.5, 1.0]})
    assert compare(original, converted).status == "same"
    assert compare(original, converted.with_columns(pl.col("kg_mean") + 1)).status == "different"


def test_int_vs_float_columns() -> None:
    assert compare(pd.DataFrame({"v": [1, 2]}), frame(v=[1.0, 2.0])).status == "same"
    assert compare(pd.DataFrame({"v": [1.0, np.nan]}), pl.DataFrame({"v": [1, None]})).status \
        == "same"
    assert compare(pd.DataFrame({"v": [1, 2]}), frame(v=[1.0, 2.5])).status == "different"


def test_bool_is_not_a_number() -> None:
    result = compare(pd.DataFrame({"v": [True, False]}), frame(v=[1, 0]))
    assert result.status == "different"
    assert "original Boolean, converted Float64" in result.detail


def test_categorical_vs_string() -> None:
    original = pd.DataFrame({"c": pd.Categorical(["x", "y", "x"])})
    assert compare(original, frame(c=["x", "y", "x"])).status == "same"
    assert compare(original, pl.DataFrame({"c": pl.Series(["x", "y", "x"],
                                                          dtype=pl.Categorical)})).status == "same"
    assert compare(original, frame(c=["x", "y", "z"])).status == "different"


def test_datetime_ns_vs_us() -> None:
    original = pd.DataFrame({"t": pd.to_datetime(["2024-01-01 08:00:00", "2024-06-30 23:59:59.5"],
                                                 format="ISO8601")})
    converted = pl.DataFrame({"t": [dt.datetime(2024, 1, 1, 8), dt.datetime(2024, 6, 30, 23, 59,
                                                                             59, 500000)]})
    assert compare(original.astype({"t": "datetime64[ns]"}), converted).status == "same"
    assert compare(original, converted.with_columns(pl.col("t").dt.cast_time_unit("ns"))).status \
        == "same"
    assert compare(original, converted.with_columns(pl.col("t") + pl.duration(seconds=1))) \
        .status == "different"


def test_tz_aware_compares_instants() -> None:
    original = pd.DataFrame({"t": pd.to_datetime(["2024-01-01 09:00"]).tz_localize("Europe/Paris")})
    utc = pl.DataFrame({"t": [dt.datetime(2024, 1, 1, 8)]}).with_columns(
        pl.col("t").dt.replace_time_zone("UTC"))
    assert compare(original, utc).status == "same"
    tokyo = utc.with_columns(pl.col("t").dt.convert_time_zone("Asia/Tokyo"))
    assert compare(original, tokyo).status == "same"
    naive = pl.DataFrame({"t": [dt.datetime(2024, 1, 1, 8)]})
    assert compare(original, naive).status == "different"


def test_dates_vs_polars_dates_and_not_datetimes() -> None:
    original = pd.DataFrame({"d": [dt.date(2024, 1, 31), dt.date(2024, 2, 1)]})
    assert compare(original, pl.DataFrame({"d": [dt.date(2024, 1, 31), dt.date(2024, 2, 1)]})) \
        .status == "same"
    datetimes = pl.DataFrame({"d": [dt.datetime(2024, 1, 31), dt.datetime(2024, 2, 1)]})
    result = compare(original, datetimes)
    assert result.status == "different"
    assert "column d: original Date" in result.detail


def test_series_vs_polars_frame() -> None:
    assert compare(SALES["kg"], frame(kg=[3, 5, 4, 1])).status == "same"
    assert compare(SALES["kg"], pl.Series("kg", [3, 5, 4, 1])).status == "same"
    assert compare(SALES["kg"].rename(None), pl.Series([3, 5, 4, 1])).status == "same"


def test_empty_tables() -> None:
    assert compare(SALES.head(0), frame(city=[], kg=[])).status == "same"
    assert compare(SALES.head(0), frame(city=["Oslo"], kg=[3])).status == "different"


def test_large_tables_are_fast() -> None:
    n = 100_000
    rng = np.random.default_rng(0)
    original = pd.DataFrame({"k": rng.integers(0, 1000, n).astype(str), "v": rng.random(n),
                             "i": np.arange(n)})
    converted = pl.from_pandas(original).reverse()
    start = time.perf_counter()
    assert compare(original, converted).status == "same-unordered"
    changed = converted.with_columns(pl.when(pl.col("i") == 7).then(0.0).otherwise(pl.col("v"))
                                     .alias("v"))
    assert compare(original, changed, ignore_order=True).differing_cells == 1
    assert compare(original, changed.head(n - 1)).status == "different"
    assert time.perf_counter() - start < 10


def test_a_rounded_sum_that_landed_on_a_half_is_named_as_such() -> None:
    # a sum landed on 10431.325: added in one order it is 10431.325000000001 and rounds to
    # .33, in the other 10431.324999999999 and rounds to .32
    pandas_side = pd.DataFrame({"k": ["a", "b"], "eur": [10431.33, 1.5]})
    polars_side = pl.DataFrame({"k": ["a", "b"], "eur": [10431.32, 1.5]})
    result = compare(pandas_side, polars_side)
    assert result.status == "different"
    assert "rounding half" in result.detail


def test_a_real_difference_is_not_named_a_rounding_half() -> None:
    result = compare(pd.DataFrame({"eur": [1.25, 2.5]}), pl.DataFrame({"eur": [1.25, 2.75]}))
    assert result.status == "different" and "rounding half" not in result.detail
