"""`idx = df.index` of a table labelled by one date key, kept in a name and read later, checked
against pandas (the reference implementation).

The name holds a frame of the key alone (the labels in the table's order), so that its
DatetimeIndex methods (strftime, year, month_name ...) are ported as they are on `df.index`
itself, and pandas is not imported just to hold the labels. Uses porter does not port
(len, list, a label by position) get pandas' DatetimeIndex of them, as they do inline. The
data is an invented village choir's register: a missing evening, an evening written twice,
a part with an accent.
"""

from __future__ import annotations

import pytest

from support import convert, differential

REGISTER_CSV = """\
evening,part,came
2026-01-05,tenor,1
2026-01-05,alto,3
2026-01-12,tenor,2
2026-01-12,alto,1
,tenor,4
2026-01-19,ténor,2
2026-01-19,alto,0
2026-01-26,tenor,0
2026-01-26,tenor,1
2026-01-26,alto,5
"""

HEAD = ('import pandas as pd\nreg = pd.read_csv("register.csv", parse_dates=["evening"])\n'
        'wide = reg.groupby(["evening", "part"])["came"].sum().unstack(fill_value=0)\n')


@pytest.fixture(autouse=True)
def register(tmp_path, monkeypatch):
    (tmp_path / "register.csv").write_text(REGISTER_CSV, encoding="utf-8")
    monkeypatch.chdir(tmp_path)


@pytest.mark.parametrize("body", [
    'thin = wide[wide["tenor"] < 2].index\nresult = list(thin.strftime("%d %b"))',
    'idx = wide.index\nresult = list(idx.strftime("%Y-%m-%d"))',
    'idx = wide.index\nresult = list(idx.month_name())',
    'idx = wide.index\nresult = list(idx.year)',
    'idx = wide.sort_values("alto").index\nresult = list(idx.strftime("%d"))',
    # the table changes after: the name keeps the labels it was given
    'idx = wide.index\nwide = wide[wide["alto"] > 1]\nresult = list(idx.strftime("%d"))',
    # uses porter hands to pandas: its DatetimeIndex of the labels
    'idx = wide[wide["alto"] > 0].index\nresult = len(idx)',
    'idx = wide.index\nresult = list(idx)',
    'idx = wide.index\nresult = [d.day for d in idx]',
    # no row left
    'idx = wide[wide["alto"] > 99].index\nresult = list(idx.strftime("%d"))',
    # a table labelled by set_index of the dates (a missing date among them)
    'idx = reg.set_index("evening").index\nresult = list(idx.strftime("%d %b"))',
])
def test_a_date_index_in_a_name_matches_pandas(body: str) -> None:
    differential(HEAD + body + "\n", data_dir=".")


def test_a_date_index_in_a_name_is_not_handed_to_pandas() -> None:
    body = 'thin = wide[wide["tenor"] < 2].index\nprint(list(thin.strftime("%d %b")))\n'
    text = convert(HEAD + body, data_dir=".").converted_text
    assert "to_pandas" not in text.split("thin =", 1)[1].split("\n\n")[0], text
    assert 'thin = wide.filter(pl.col("tenor") < 2).select("evening")' in text, text
