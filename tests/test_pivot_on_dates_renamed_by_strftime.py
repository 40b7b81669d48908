"""A pivot_table on a date columns key followed by `t.columns = t.columns.strftime(format)`:
the pivot names its new columns by the dates so written (in the order of the dates), the
statement after it writes nothing; the index keys keep their type, so a melt and a label
lookup (set_index(k).loc[label]) after it port too. Checked against pandas (the reference),
to the written text.

The data is an invented lifeboat station's call-out log: a missing crew name, a missing
date, a missing duration, accents, repeated rows, dates that only one crew member has.
"""

from __future__ import annotations

from pathlib import Path

import pytest

from support import convert, run, same_text

LOG_CSV = """\
call,crew,day,minutes
k1,Morwenna,2026-03-09,45.5
k2,Morwenna,2026-03-09,30
k3,Tomos,2026-03-10,
k4,,2026-03-10,12
k5,Éliane,,20
k6,Éliane,2026-03-17,15.25
k7,Tomos,2026-03-09,60
k8,Morwenna,2026-03-17,0.1
k9,Morwenna,2026-03-17,0.2
k10,Tomos,2026-03-10,7
k11,Ùna,2026-04-01,
k12,Tomos,2026-03-10,7
"""

HEAD = 'import pandas as pd\nlog = pd.read_csv("log.csv", parse_dates=["day"])\n'


def _same(body: str, tmp_path: Path) -> str:
    result = same_text(HEAD + body, tmp_path, {"log.csv": LOG_CSV})
    assert "TODO" not in result.converted_text, result.converted_text
    return result.converted_text


@pytest.mark.parametrize("pivot", [
    't = log.pivot_table(index="crew", columns="day", values="minutes", aggfunc="count", '
    'fill_value=0)\n',
    't = log.pivot_table(index="crew", columns="day", values="minutes", aggfunc="sum", '
    'fill_value=0)\n',
    't = log.pivot_table(index="crew", columns="day", values="minutes", aggfunc="mean")\n',
    't = log.pivot_table(index=["crew"], columns=["day"], values="minutes", aggfunc="max")\n',
    't = pd.pivot_table(log, index="crew", columns="day", values="minutes", aggfunc="count")\n',
])
@pytest.mark.parametrize("fmt", ["%a %d", "%Y-%m-%d", "%d %b %Y", "%j"])
def test_date_columns_renamed_by_strftime(pivot: str, fmt: str, tmp_path: Path) -> None:
    converted = _same(pivot + f't.columns = t.columns.strftime("{fmt}")\n'
                      't = t.reset_index()\n'
                      't.to_csv("out.csv", index=False)\n'
                      'print(t.shape, list(t.columns))\n', tmp_path)
    assert "dt.to_string" in converted


def test_the_corpus_pattern_melt_and_a_label(tmp_path: Path) -> None:
    # the pivot, its columns renamed, back to columns, melted, then the rows of one label
    # (written out: a printed .loc[label] shows the rows as Polars prints a frame)
    _same('t = log.pivot_table(index="crew", columns="day", values="minutes", '
          'aggfunc="count", fill_value=0)\n'
          't.columns = t.columns.strftime("%a %d")\n'
          't = t.reset_index()\n'
          'long = t.melt(id_vars="crew", var_name="day", value_name="calls")\n'
          'long = long[long["calls"] > 0].sort_values(["crew", "day"])\n'
          'long = long.set_index("crew")\n'
          'long.loc["Éliane"].to_csv("eliane.csv")\n'
          'long.loc["Tomos"].to_csv("tomos.csv")\n'
          'long.reset_index().to_csv("long.csv", index=False)\n', tmp_path)


def test_no_rows(tmp_path: Path) -> None:
    _same('e = log[log["minutes"] > 1000]\n'
          't = e.pivot_table(index="crew", columns="day", values="minutes", aggfunc="count", '
          'fill_value=0)\n'
          't.columns = t.columns.strftime("%Y-%m-%d")\n'
          'print(t.reset_index().shape)\n', tmp_path)


@pytest.mark.parametrize("body,reason", [
    # nothing renames the dates: pandas labels the columns with Timestamps
    ('t = log.pivot_table(index="crew", columns="day", values="minutes", aggfunc="count")\n'
     'print(t)\n', "datetime columns key"),
    # something between the pivot and the rename
    ('t = log.pivot_table(index="crew", columns="day", values="minutes", aggfunc="count")\n'
     'print(t)\nt.columns = t.columns.strftime("%d")\n', "datetime columns key"),
    # another frame's pivot renamed
    ('t = log.pivot_table(index="crew", columns="day", values="minutes", aggfunc="count")\n'
     'u = t\nu.columns = u.columns.strftime("%d")\n', "datetime columns key"),
    # a directive not checked to write the same
    ('t = log.pivot_table(index="crew", columns="day", values="minutes", aggfunc="count")\n'
     't.columns = t.columns.strftime("%c")\n', "%c"),
    # margins add their name to the dates
    ('t = log.pivot_table(index="crew", columns="day", values="minutes", aggfunc="count", '
     'margins=True)\nt.columns = t.columns.strftime("%d")\n', "margins"),
])
def test_left_as_todo(body: str, reason: str, tmp_path: Path) -> None:
    (tmp_path / "log.csv").write_text(LOG_CSV, encoding="utf-8")
    result = convert(HEAD + body, data_dir=str(tmp_path))
    assert any(reason in s.message for s in result.todos), [s.message for s in result.todos]


def test_dates_written_alike_stop_the_conversion_loudly(tmp_path: Path,
                                                        monkeypatch: pytest.MonkeyPatch) -> None:
    # two Tuesdays written "Tue": pandas keeps two columns of that name, which a Polars frame
    # cannot hold; the conversion stops with an error, and the site says so (lower confidence)
    (tmp_path / "log.csv").write_text(LOG_CSV, encoding="utf-8")
    monkeypatch.chdir(tmp_path)
    source = HEAD + ('t = log.pivot_table(index="crew", columns="day", values="minutes", '
                     'aggfunc="count", fill_value=0)\n'
                     't.columns = t.columns.strftime("%a")\n')
    assert list(run(source)["t"].columns).count("Tue") == 2
    result = convert(source, data_dir=str(tmp_path))
    assert not result.todos
    site = next(s for s in result.sites if s.key == "frame.pivot_table")
    assert site.confidence <= 0.9
    with pytest.raises(ValueError, match="written alike"):
        run(result.converted_text)
