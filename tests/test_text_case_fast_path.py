"""str.title() and str.upper() against pandas on whole columns, with and without the letters
that need porter's letter-by-letter fix-ups (pandas is the reference).

pandas_title and pandas_upper compute the slow fix-ups only where a batch of values holds such a
letter; a batch without one takes Polars' own title or upper case. Both kinds of column, and
columns where a few rows hold one, must read as pandas writes them.
"""

from __future__ import annotations

import random

import pandas as pd
import polars as pl
import pytest

PLAIN = list("abcdefgh XYZ'-3é.") + ["Fähre", "O'Derry", "mc", "ÉLAN", "øre", "Ωmega", "кот"]
SPECIAL = ["Σ", "ß", "Ǆ", "ǅ", "ǆ", "İ", "ﬁ", "ŉ", "日本", "אב", "ʰ", "ᾳ"]


def helper(name: str):
    from porter.rules import strings

    space = {"pl": pl}
    exec(getattr(strings, f"{name.upper()}_DEFINITION"), space)
    return space[f"pandas_{name}"]


@pytest.mark.parametrize("name", ["title", "upper"])
@pytest.mark.parametrize("share", [0.0, 0.02, 0.5])
def test_case_of_columns_with_and_without_special_letters(name, share):
    rng = random.Random(f"{name}{share}")
    convert = helper(name)
    for _ in range(60):
        special = [rng.choice(SPECIAL)]  # one kind of special letter in a column at most
        values = []
        for _ in range(rng.choice([1, 5, 40])):
            if rng.random() < 0.05:
                values.append(None)
                continue
            pool = special if rng.random() < share else PLAIN
            values.append("".join(rng.choice(pool if rng.random() < 0.7 else PLAIN)
                                  for _ in range(rng.randint(0, 6))))
        expected = getattr(pd.Series(values, dtype="str").str, name)()
        got = pl.DataFrame({"t": values}, schema={"t": pl.String}).select(convert(pl.col("t")))["t"]
        assert got.to_list() == [None if v != v else v for v in expected.tolist()], values
