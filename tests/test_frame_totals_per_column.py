"""Reductions of a frame per column (axis=0: df.sum(), df.count(), df.nunique(),
df.isna().sum(), ...): pandas gives a Series indexed by the column names, which porter keeps
as a frame of the names ("index") and the values ("0"). pandas (the reference) runs each
script; the conversion runs with Polars on the same file; printed text and written files
must be the same.
"""

from __future__ import annotations

from pathlib import Path

import pytest

from support import same_text

# a seed bank's packet shelves: blanks in every column, duplicates, 0.0 beside -0.0, accented
# varieties, True/False with no blank, floats whose sum depends on the order of adding
SHELVES = """\
shelf,variety,grams,packets,sown,moisture
S1,bean,12.1,3,True,0.1
S2,Erbse,,4,False,0.2
S1,bean,0.7,,True,-0.0
S3,,3.3,1,False,0.0
S2,kale,12.1,7,True,0.3
,Grünkohl,1e-17,2,False,
S4,kale,7.77,0,True,0.7
S1,bean,2.2,9,False,0.1
"""

# no shelf holds a tonne: no rows left
EMPTY = 'shelves = shelves[shelves["grams"] > 1e6]'


def _run(tmp_path: Path, reduction: str, rows: str = "") -> str:
    text = same_text(f'''\
import pandas as pd
shelves = pd.read_csv("shelves.csv")
{rows}
result = {reduction}
result.reset_index().to_csv("result.csv", index=False)
result.to_csv("labelled.csv")
''', tmp_path, {"shelves.csv": SHELVES}).converted_text
    return text


@pytest.mark.parametrize("reduction", [
    "shelves.isna().sum()",
    "shelves.notna().sum()",
    "shelves.isnull().any()",
    "shelves[['grams', 'moisture']].notnull().all()",
    "shelves.isna().mean()",
    "(shelves.notna().mean() * 100).round(1)",
    "shelves.count()",
    "shelves.nunique()",
    "shelves.nunique(dropna=False)",
    "shelves[['grams', 'packets', 'moisture']].sum()",
    "shelves[['packets', 'sown']].sum()",
    "shelves.sum(numeric_only=True)",
    "shelves[['grams', 'packets', 'sown']].mean()",
    "shelves.mean(numeric_only=True)",
    "shelves[['grams', 'packets']].max()",
    "shelves[['packets']].min()",
    "shelves[['moisture', 'grams']].min()",
    "shelves[['grams', 'packets', 'sown']].median()",
    "shelves.median(numeric_only=True)",
])
@pytest.mark.parametrize("rows", ["", EMPTY], ids=["shelves", "empty"])
def test_per_column_reductions_are_pandas_own(tmp_path: Path, reduction: str, rows: str) -> None:
    text = _run(tmp_path, reduction, rows)
    assert "TODO(porter)" not in text, text


def test_float_totals_add_as_pandas_adds(tmp_path: Path) -> None:
    # 10,000 prices whose float sum depends on the order of adding (Polars' own sum differs
    # from numpy's pairwise one in the last digit)
    rows = "\n".join(f"{i % 7},{(i * 0.37) % 13.1 + 1e-9 * i}" for i in range(10_000))
    text = same_text('''\
import pandas as pd
prices = pd.read_csv("prices.csv")
totals = prices.sum()
print(repr(totals.iloc[1]), repr(prices.mean().iloc[1]))
totals.reset_index().to_csv("totals.csv", index=False)
''', tmp_path, {"prices.csv": "lot,price\n" + rows + "\n"}).converted_text
    assert "pandas_reduce" in text


def test_totals_used_further_read_the_labels(tmp_path: Path) -> None:
    text = same_text('''\
import pandas as pd
shelves = pd.read_csv("shelves.csv")
missing = shelves.isna().sum()
gaps = missing[missing > 0].sort_values(ascending=False)
print(gaps.to_dict())
print(list(gaps.index))
print(shelves.isna().sum().sum(), missing.max())
distinct = shelves.nunique()
distinct.sort_values().reset_index(name="values").to_csv("distinct.csv", index=False)
''', tmp_path, {"shelves.csv": SHELVES}).converted_text
    assert "TODO(porter)" not in text, text


@pytest.mark.parametrize("reduction", [
    "shelves.sum()",            # pandas joins the text of a text column
    "shelves.min()",            # and takes the least text
    "shelves[['grams', 'sown']].max()",  # an object Series of a float and True
    "shelves[['grams']].sum(min_count=1)",
    "shelves[['grams']].sum(skipna=False)",
])
def test_reductions_pandas_computes_otherwise_stay_pandas(tmp_path: Path, reduction: str) -> None:
    text = _run(tmp_path, reduction)
    assert "TODO(porter)" in text, text


@pytest.mark.parametrize("reduction", [
    # two levels of column names: pandas labels the totals with two levels
    'shelves.groupby("shelf").agg({"grams": ["sum", "max"]}).reset_index(drop=True).sum()',
    # a pivot's columns carry the key's name, which labels pandas' totals
    'shelves.pivot_table(index="shelf", columns="variety", values="packets", aggfunc="sum")'
    '.reset_index(drop=True).count()',
])
def test_totals_of_columns_pandas_names_otherwise_stay_pandas_shaped(
        tmp_path: Path, reduction: str) -> None:
    same_text(f'''\
import pandas as pd
shelves = pd.read_csv("shelves.csv")
result = {reduction}
result.reset_index().to_csv("result.csv", index=False)
''', tmp_path, {"shelves.csv": SHELVES})
