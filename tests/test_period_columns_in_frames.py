"""dt.to_period() kept as a column of its frame (`df["month"] = df["d"].dt.to_period("M")`), then
grouped, sorted, written and printed: Polars holds the periods' text ("2024-03", "2024Q1",
"2024-03-04/2024-03-10"), which orders as the periods do and is what pandas writes; a missing
period stays missing. Operators and the .dt accessor on such a column stay pandas (which reads
"2024-3" as the period 2024-03). Reference: pandas 3.1 itself: each case runs with pandas and
as converted, and the printed text and written files must be the same."""

from __future__ import annotations

from pathlib import Path

import pytest

from support import convert, same_text

# a lighthouse museum's ticket desk: a missing stamp, New Year, a leap day, a Sunday/Monday
# week boundary, rows out of order, a missing desk, accents
SALES = {
    "sales.csv": (
        "sold,desk,party\n"
        "2024-03-05 10:00,Quai,2\n"
        ",Phare,1\n"
        "2023-12-31 23:30,Quai,3\n"
        "2024-02-29 09:15,Écluse,4\n"
        "2024-01-01 00:00,,5\n"
        "2024-03-10 18:00,Phare,1\n"
        "2024-03-11 08:00,Quai,2\n"
    ),
}

HEAD = (
    "import pandas as pd\n"
    'sales = pd.read_csv("sales.csv")\n'
    'sales["sold"] = pd.to_datetime(sales["sold"], format="%Y-%m-%d %H:%M")\n'
)


@pytest.mark.parametrize("freq", ["M", "Q", "W", "D", "h", "Y"])
def test_a_period_column_grouped_and_written_as_pandas_writes_it(freq, tmp_path: Path):
    result = same_text(HEAD + (
        f'sales["period"] = sales["sold"].dt.to_period("{freq}")\n'
        'sales.to_csv("all.csv", index=False)\n'
        'per = sales.groupby(["period", "desk"]).agg(n=("party", "sum")).reset_index()\n'
        'per.to_csv("per.csv", index=False)\n'
        'per["period"] = per["period"].astype(str)\n'
        'per.to_csv("per_text.csv", index=False)\n'
    ), tmp_path, SALES)
    assert not result.todos, result.converted_text
    assert "to_pandas" not in result.converted_text


def test_missing_periods_group_and_sort_last(tmp_path: Path):
    result = same_text(HEAD + (
        'sales["month"] = sales["sold"].dt.to_period("M")\n'
        'kept = sales.groupby("month", dropna=False)["party"].sum().reset_index()\n'
        'kept.to_csv("kept.csv", index=False)\n'
        'ordered = sales.sort_values(["month", "party"])\n'
        'ordered.to_csv("ordered.csv", index=False)\n'
        'print(len(ordered))\n'
    ), tmp_path, SALES)
    assert not result.todos, result.converted_text


def test_printed_dtypes_name_the_periods(tmp_path: Path):
    result = same_text(HEAD + (
        'sales["month"] = sales["sold"].dt.to_period("M")\n'
        'sales["quarter"] = sales["sold"].dt.to_period("Q")\n'
        'print(sales.dtypes)\n'
    ), tmp_path, SALES)
    assert not result.todos, result.converted_text


@pytest.mark.parametrize("use", [
    'sales["m"] = sales["month"].dt.month',
    'sales["start"] = sales["month"].dt.to_timestamp()',
    'sales = sales[sales["month"] == "2024-3"]',
    'sales["next"] = sales["month"] + 1',
])
def test_operators_and_the_accessor_on_a_period_column_stay_pandas(use, tmp_path: Path):
    """pandas reads "2024-3" as the period 2024-03 and adds whole periods: not text."""
    result = same_text(HEAD + (
        'sales["month"] = sales["sold"].dt.to_period("M")\n'
        f'{use}\n'
        'sales.to_csv("out.csv", index=False)\n'
    ), tmp_path, SALES)
    assert result.todos, result.converted_text


def test_a_function_that_takes_and_returns_the_frame_keeps_its_integer_types(tmp_path: Path):
    """A helper that tidies a column and returns the frame: what it returns holds no nullable
    integer, so printing dtypes after an ISO week is made needs no TODO."""
    result = same_text(HEAD + (
        "def tidy(df):\n"
        '    df["desk"] = df["desk"].str.strip().str.lower()\n'
        '    df["desk"] = df["desk"].fillna("unknown")\n'
        "    return df\n"
        "\n"
        "sales = tidy(sales)\n"
        'sales["week"] = sales["sold"].dt.isocalendar().week\n'
        'print(sales.dtypes)\n'
        'sales.to_csv("out.csv", index=False)\n'
    ), tmp_path, SALES)
    assert not result.todos, result.converted_text


def test_a_function_whose_body_makes_nullable_integers_is_not_assumed_plain(tmp_path: Path):
    source = HEAD + (
        "def weeks(df):\n"
        '    df["week"] = df["sold"].dt.isocalendar().week\n'
        "    return df\n"
        "\n"
        "sales = weeks(sales)\n"
        'sales["n"] = sales["party"] + 1\n'
        'print(sales.dtypes)\n'
    )
    (tmp_path / "sales.csv").write_text(SALES["sales.csv"])
    result = convert(source, data_dir=str(tmp_path))
    assert "TODO(porter): frame.dtypes" in result.converted_text, result.converted_text


def test_an_outer_merge_on_periods_puts_the_missing_period_first(tmp_path: Path):
    """pandas sorts NaT first in an outer merge (the smallest int64 inside), as for dates."""
    result = same_text(HEAD + (
        'sales["month"] = sales["sold"].dt.to_period("M")\n'
        'per = sales.groupby("month", as_index=False)["party"].sum()\n'
        'per = per[per["party"] > 2]\n'
        'both = sales[["month", "desk"]].merge(per, on="month", how="outer")\n'
        'both.to_csv("both.csv", index=False)\n'
    ), tmp_path, SALES)
    assert not result.todos, result.converted_text
