"""Functions of one value (Series.map / apply) and of a row (DataFrame.apply(axis=1)) whose
bodies use isinstance(), `in`, slices and items of text, split() into parts, max()/min() and
`if` blocks that only set names: each becomes one Polars expression.

pandas (the reference) runs each script on CSV files read with --data; the conversion runs
with Polars on the same files; what they print and write must be the same text. The values a
function receives are pandas': text (missing: the float NaN), floats, ints (an int column with
a missing value is float64) and True/False.
"""

from __future__ import annotations

from pathlib import Path

import pytest

from support import same_text

# a ferry line's ticket log: free text, odd duration formats, missing values, unicode
TRIPS = """\
trip,note,length,fare,kind,party,voucher,late,flag
1,MAYDAY engine,3:45,12.5,child,1,,0,True
2,pos 4612/0759,245s,8.0,adult,4,5,3,False
3,,1:02:03,,student,2,,,True
4,Pos,07:05,20.0,,5,12,1,
5,İstanbul maydays,0:00,0.0,adult,1,0,0,False
6,ΣΑΣ,,15.25,senior,6,,7,True
7,po,12s,3.3,adult,2,2.5,2,False
8,x,1.5s,7.0,child,3,,0,True
"""


def check(tmp_path: Path, body: str) -> str:
    script = "import numpy as np\nimport pandas as pd\n" \
             'trips = pd.read_csv("trips.csv")\n' + body + \
             'trips.to_csv("out.csv", index=False)\n'
    result = same_text(script, tmp_path, {"trips.csv": TRIPS})
    text = result.converted_text
    assert "TODO(porter)" not in text, text
    # one expression: no pandas call left, no Python run on each value (the writer's
    # helpers for list columns come before the script's own lines)
    script = text[text.index("trips = "):]
    assert "pl.Series(" not in script and "map_elements" not in script, text
    return text


def test_isinstance_in_and_a_slice_of_text(tmp_path: Path) -> None:
    text = check(tmp_path, """\
trips["kind2"] = trips["note"].map(lambda t: "mayday" if isinstance(t, str) and "mayday" in t.lower() else ("pos" if isinstance(t, str) and t[:3].lower() == "pos" else "other"))
""")
    assert 'str.contains("mayday", literal=True)' in text and "str.head(3)" in text


def test_a_duration_parser_with_split_len_int_and_endswith(tmp_path: Path) -> None:
    text = check(tmp_path, '''\
def seconds(t):
    if not isinstance(t, str):
        return np.nan
    if t.endswith("s"):
        return float(t[:-1])
    parts = t.split(":")
    if len(parts) == 3:
        return int(parts[0]) * 3600 + int(parts[1]) * 60 + int(parts[2])
    return int(parts[0]) * 60 + int(parts[1])


trips["secs"] = trips["length"].map(seconds)
''')
    assert 'str.split(":")' in text and "list.len()" in text and "list.get(2" in text


def test_a_row_function_whose_if_blocks_set_a_name(tmp_path: Path) -> None:
    check(tmp_path, '''\
def net(row):
    if row["fare"] != row["fare"]:
        return np.nan
    if row["kind"] in ("child", "student"):
        disc = 0.5
    elif row["party"] >= 4:
        disc = 0.1
    else:
        disc = 0.0
    value = row["fare"] * (1 - disc) - (row["voucher"] if row["voucher"] > 0 else 0)
    return max(value, 0)


trips["net"] = trips.apply(net, axis=1)
''')


@pytest.mark.parametrize("column", ["note", "fare", "party", "late", "flag"])
def test_isinstance_decided_from_the_column_type(tmp_path: Path, column: str) -> None:
    check(tmp_path, f"""\
trips["is_str"] = trips["{column}"].map(lambda x: isinstance(x, str))
trips["is_int"] = trips["{column}"].map(lambda x: isinstance(x, int))
trips["is_float"] = trips["{column}"].map(lambda x: isinstance(x, float))
trips["is_number"] = trips["{column}"].map(lambda x: isinstance(x, (int, float)))
trips["is_bool"] = trips["{column}"].map(lambda x: isinstance(x, bool))
""")


def test_in_and_not_in_a_tuple_of_constants(tmp_path: Path) -> None:
    check(tmp_path, """\
trips["young"] = trips["kind"].map(lambda k: k in ("child", "student"))
trips["older"] = trips["kind"].map(lambda k: k not in ("child", "student"))
trips["round_fare"] = trips["fare"].map(lambda f: f in (8, 20.0, 0))
trips["small_party"] = trips["party"].map(lambda p: "small" if p in [1, 2] else "big")
""")


@pytest.mark.parametrize("part", ["[1:]", "[-2:]", "[:-1]", "[1:3]", "[-3:-1]", "[2:1]", "[:0]",
                                  "[0]", "[-1]", "[:-9]", "[5:]"])
def test_slices_and_items_of_text(tmp_path: Path, part: str) -> None:
    # na_action="ignore": pandas slices no missing value (NaN has no [..])
    check(tmp_path, f"""\
trips["part"] = trips["kind"].map(lambda k: k{part}, na_action="ignore")
trips["upper"] = trips["kind"].map(lambda k: k{part}.upper() if isinstance(k, str) else "-")
""")


def test_max_and_min_of_a_value_and_a_number(tmp_path: Path) -> None:
    check(tmp_path, """\
trips["at_least"] = trips["voucher"].map(lambda v: max(v, 1))
trips["at_most"] = trips["late"].map(lambda v: min(v, 2.5))
trips["party_cap"] = trips["party"].map(lambda v: min(v, 4))
""")


def test_an_if_without_else_that_sets_a_name(tmp_path: Path) -> None:
    check(tmp_path, '''\
def label(kind):
    tag = "ticket"
    if kind in ("child", "student"):
        tag = "reduced"
    if not isinstance(kind, str):
        tag = "unknown"
    return tag + "!"


trips["tag"] = trips["kind"].map(label)
''')


def test_numpy_ceil_and_floor_of_a_value_and_of_a_column(tmp_path: Path) -> None:
    check(tmp_path, """\
trips["mins"] = trips["fare"].apply(lambda s: int(np.ceil(s / 60)) if s == s else 0)
trips["late_up"] = trips["late"].map(lambda s: np.ceil(s - 0.5))
trips["party_up"] = np.ceil(trips["party"] / 4)
trips["party_down"] = np.floor(trips["party"])
trips["fare_down"] = np.floor(trips["fare"] - 10)
""")


def test_numpy_floor_of_an_int_column_with_a_missing_value(tmp_path: Path) -> None:
    # "late" read as ints with a blank: pandas holds it as float64 (written 3.0)
    script = """\
import numpy as np
import pandas as pd
t = pd.read_csv("t.csv")
t["down"] = np.floor(t["late"])
t["up"] = np.ceil(t["n"])
t.to_csv("out.csv", index=False)
"""
    same_text(script, tmp_path, {"t.csv": "n,late\n1,3\n2,\n-3,7\n"})


def test_a_row_function_with_isinstance_and_an_f_string(tmp_path: Path) -> None:
    check(tmp_path, """\
trips["label"] = trips.apply(lambda r: f"{r['kind']} ({r['party']})" if isinstance(r["kind"], str) else "?", axis=1)
trips["paid"] = trips.apply(lambda r: r["voucher"] if isinstance(r["voucher"], float) and r["voucher"] > 0 else r["fare"], axis=1)
""")


def test_round_of_max_of_arithmetic_is_python_round(tmp_path: Path) -> None:
    # max() of arithmetic whose type porter does not keep: round(.., 2) stays Python's round
    # of a float (the exact binary value), not Polars' round of an int column
    text = same_text('''\
import numpy as np
import pandas as pd
t = pd.read_csv("t.csv")
t["net"] = t.apply(lambda r: round(max(r["price"] * 0.9 - (r["v"] if r["v"] > 0 else 0), 0), 2), axis=1)
t.to_csv("out.csv", index=False)
''', tmp_path, {"t.csv": "price,v,k\n2.975,,a\n10,2,b\n1.005,5,c\n,1,d\n"}).converted_text
    assert "round(v, 2)" in text


def test_math_floor_and_ceil_are_python_ints(tmp_path: Path) -> None:
    # math.floor returns a Python int: pandas makes an int64 column where no value is NaN
    # (the lambda tests it first); -0.5 floors to -1 and ceils to 0
    text = check(tmp_path, """\
import math
trips["fare_floor"] = trips["fare"].apply(lambda m: math.floor(m) if m == m else -1)
trips["half_up"] = trips["fare"].map(lambda m: math.ceil(m / 2 - 3) if m == m else 0)
""")
    assert ".floor().cast(pl.Int64)" in text and ".ceil().cast(pl.Int64)" in text
