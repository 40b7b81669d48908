"""f-strings with a format spec inside element and row functions (`{x:.0f}`, `{n:03d}`): the
text Python's format() writes, as one Polars expression.

pandas (the reference) runs each script on the CSV file; the conversion runs with Polars on the
same file; what they write must be the same text. Python's format() of `.0f` rounds the exact
value half to even and writes "-0", "nan" and "inf"; `.2f` rounds the exact binary value
(2.675 -> "2.67"), which no expression does, so it stays a TODO and pandas' values are kept.
"""

from __future__ import annotations

from pathlib import Path

from support import same_text

# a cooperage's stave lots: halves, negative zeros, a blank, infinities, huge and tiny values
LOTS = """\
lot,days,oak,cooper
1,0.5,12,Éloi
2,1.5,3,ana
3,2.5,,Bartholomew
4,-0.4,7,
5,-0.0,100,x
6,,1234,yy
7,-2.5,0,q
8,1e30,5,zz
9,123456.5,6,w
10,inf,8,i
11,-inf,9,j
12,-0.6,11,k
13,0.0,2,ΣΑΣ
"""


def check(tmp_path: Path, body: str, todo: bool = False) -> str:
    script = 'import pandas as pd\nlots = pd.read_csv("lots.csv")\n' + body + \
             'lots.to_csv("out.csv", index=False)\n'
    text = same_text(script, tmp_path, {"lots.csv": LOTS}).converted_text
    assert ("TODO(porter)" in text) == todo, text
    return text


def test_no_decimals_of_a_float_column_in_a_lambda(tmp_path: Path) -> None:
    text = check(tmp_path, 'lots["label"] = lots["days"].map(lambda d: f"{d:.0f} d")\n')
    assert "map_elements" not in text and "pl.Series(" not in text


def test_no_decimals_in_a_row_function_next_to_text(tmp_path: Path) -> None:
    # a row of a frame holding text reaches Python as objects: the float stays a float
    check(tmp_path, '''\
def card(row):
    if row["cooper"] != row["cooper"]:
        return "unassigned"
    return f"{row['cooper']}: {row['days']:.0f} days, {row['oak']:.0f} staves"


lots["card"] = lots.apply(card, axis=1)
''')


def test_no_decimals_of_whole_days_with_a_missing_date(tmp_path: Path) -> None:
    # dt.days where a date is missing is float64 in pandas: 75.0 is written "75", NaN "nan"
    check(tmp_path, '''\
lots["made"] = pd.to_datetime("2024-03-01") + pd.to_timedelta(lots["oak"], unit="D")
lots["age"] = (pd.Timestamp("2025-01-01") - lots["made"]).dt.days
lots["card"] = lots.apply(lambda r: f"{r['cooper']} {r['age']:.0f} d", axis=1)
''')


def test_zero_and_blank_padded_lengths(tmp_path: Path) -> None:
    text = check(tmp_path, 'lots["tag"] = lots["cooper"].map('
                           'lambda c: f"{len(c):03d}/{len(c):4d}/{len(c):d}", na_action="ignore")\n')
    assert "zfill(3)" in text and "pad_start(4)" in text


def test_two_decimals_stay_on_pandas(tmp_path: Path) -> None:
    # 2.675 is written 2.67 by Python: the exact binary value is below the half
    text = check(tmp_path, 'lots["x"] = lots["days"].map(lambda d: f"{d:.2f}")\n', todo=True)
    assert "format spec '.2f'" in text


def test_d_of_a_column_value_stays_on_pandas(tmp_path: Path) -> None:
    # a column's int may reach Python as a float (a blank in the column, a row holding a
    # float), where format(7.0, "d") raises: only ints made by int() or len() are ported
    check(tmp_path, 'lots["x"] = lots["lot"].map(lambda n: f"{n:03d}")\n', todo=True)
