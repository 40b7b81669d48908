"""Row labels after filters and sorts, when pandas code reads them, checked against pandas (the
reference implementation).

After a filter or a sort pandas keeps each row's original number as its label. A Polars frame
has no labels, so wherever pandas code reads them (a loop's row label, row.name, a Series
assigned into the frame, concat side by side, an index written out) porter has pandas make the
frame, back along a chain of statements to one whose labels are still 0..n-1. The data is an
invented ferry line's crossing log.
"""

from __future__ import annotations

import pytest

from support import convert, differential


@pytest.fixture(autouse=True)
def crossings(tmp_path, monkeypatch):
    (tmp_path / "crossings.csv").write_text(
        "boat,leg,cars,fare\nOrm,north,12,5.5\nSkarv,south,-3,4.0\nOrm,north,7,\n"
        "Lunde,east,0,6.25\n,south,9,3.0\nSkarv,north,15,5.5\nLunde,south,4,2.0\n",
        encoding="utf-8")
    monkeypatch.chdir(tmp_path)


HEAD = 'import pandas as pd\ndf = pd.read_csv("crossings.csv")\n'


@pytest.mark.parametrize("body", [
    # two filters in two statements, then the labels written out
    'df = df[df["cars"] > 0]\ndf = df[df["leg"] != "east"]\nresult = df.reset_index()\n',
    # a dropna, a filter, then idxmax per group
    'df = df.dropna(subset=["boat"])\npos = df[df["cars"] > 0]\n'
    'result = pos.groupby("boat")["cars"].idxmax()\n',
    # a sort, a new column, a filter, then the labels
    'df = df.sort_values("cars", kind="stable")\ndf["double"] = df["cars"] * 2\n'
    'late = df[df["cars"] > 2]\nresult = list(late.index)\n',
])
def test_labels_after_a_chain_of_statements(body: str) -> None:
    differential(HEAD + body)


def test_a_loop_over_rows_reads_their_labels() -> None:
    differential(HEAD + """\
pos = df[df["cars"] > 0]
labels, doubled = [], []
for i, row in pos.iterrows():
    labels.append(i)
    doubled.append(row["cars"] * 2)
tags = []
for t in pos.itertuples():
    tags.append(f"{t.Index}-{t.boat}")
""", "labels", "doubled", "tags")


def test_row_name_in_a_row_function_after_a_filter() -> None:
    differential(HEAD + """\
f = df[df["fare"].notna()].copy()
f["tag"] = f.apply(lambda r: f"{r.name}:{r['leg']}", axis=1)
result = f
""")


def test_a_row_function_reading_columns_only_is_put_back_by_position() -> None:
    # no label read: the sort stays Polars and pandas' result is put back on the same rows
    result = differential(HEAD + """\
def tag(row):
    text = ""
    for part in (row["leg"], row["boat"]):
        text += str(part)
    return text
df = df.sort_values("cars", kind="stable")
df["tag"] = df.apply(tag, axis=1)
result = df.reset_index(drop=True)
""")
    assert "pl.Series(" in result.converted_text


@pytest.mark.parametrize("body", [
    # a Series computed by pandas, assigned into a filtered or a sorted frame: pandas aligns it
    'def ten(v):\n    try:\n        return int(v) * 10\n    except ValueError:\n        return -1\n'
    's = df["cars"].apply(ten)\nd2 = df[df["leg"] != "north"]\nd2["s"] = s\nresult = d2\n',
    'def ten(v):\n    try:\n        return int(v) * 10\n    except ValueError:\n        return -1\n'
    's = df["cars"].apply(ten)\nd3 = df.sort_values("cars")\nd3["s"] = s\nresult = d3\n',
    'def ten(v):\n    try:\n        return int(v) * 10\n    except ValueError:\n        return -1\n'
    's = df["cars"].apply(ten)\ndf = df[df["cars"] > 0]\ndf["s"] = s\nresult = df\n',
])
def test_a_series_from_pandas_assigned_into_other_rows(body: str) -> None:
    differential(HEAD + body)


def test_concat_side_by_side_of_two_filtered_frames() -> None:
    differential(HEAD + """\
a1 = df[df["cars"] > 5][["boat", "cars"]]
a2 = df[df["fare"] < 5.5][["fare"]]
result = pd.concat([a1, a2], axis=1)
""")


def test_group_apply_returning_rows_keeps_their_labels() -> None:
    differential(HEAD + """\
pos = df[df["cars"] > 0]
top = pos.groupby("leg", group_keys=True).apply(lambda x: x.nlargest(1, "cars"))
result = top.reset_index()
""")


def test_a_corpus_style_pipeline_without_label_reads_stays_polars() -> None:
    # a column given to the script's own function is not a label read
    result = convert(HEAD + """\
def tidy(s):
    return s.str.strip().str.title()
df = df.drop_duplicates()
df["boat"] = tidy(df["boat"])
df = df.sort_values("cars")
totals = df.groupby("leg")["cars"].sum()
""")
    assert "to_pandas" not in result.converted_text, result.converted_text


def test_a_loop_whose_body_has_pandas_make_a_frame_reads_it_in_its_header_too() -> None:
    # the body's filter is made by pandas, so the frame is handed over before the loop; the
    # loop's own header runs after that and must read the pandas frame (it had stayed a
    # Polars expression on a pandas frame: unhashable type 'Expr')
    differential(HEAD + """\
df["fare"] = df["fare"].fillna(0)
rows = []
for leg in sorted(df["leg"].unique()):
    sub = df[df["leg"] == leg]
    rows.append({"leg": leg, "cars": sub["cars"].sum(), "top": sub.sort_values("cars").iloc[-1]["boat"]})
result = pd.DataFrame(rows)
""")


def test_a_merge_left_on_pandas_after_a_filter_keeps_the_filter_on_polars() -> None:
    # a merge numbers its rows afresh: the filtered frame's labels are not read
    result = differential(HEAD + """\
boats = pd.DataFrame({"boat": ["Orm", "Skarv", "Lunde"], "crew": [3, 2, 4]})
pos = df[df["cars"] > 0]
result = pos.merge(boats, on="boat", how="outer", indicator=True)
""")
    assert "frame.labels" not in {s.key for s in result.sites}


def test_a_merge_on_the_index_after_a_filter_uses_pandas_labels() -> None:
    differential(HEAD + """\
boats = pd.DataFrame({"crew": [3, 2, 4, 1, 5, 6, 7]})
pos = df[df["cars"] > 0]
result = pos.merge(boats, left_index=True, right_index=True, how="left", indicator=True)
""")


@pytest.mark.parametrize("call", [
    'df.groupby("leg")["cars"].agg(lambda s: sorted(s)[0])',
    'df["boat"].str.encode("utf-8").tolist()',
])
def test_value_by_value_and_group_calls_after_a_filter_leave_the_filter_on_polars(call: str) -> None:
    result = differential(HEAD + f'df = df.drop_duplicates()\ndf = df[df["cars"] > 0]\nresult = {call}\n')
    assert "frame.labels" not in {s.key for s in result.sites}, result.converted_text


@pytest.mark.parametrize("expression", [
    # a frame no statement names, filtered or sorted on the way, read by its labels under a
    # TODO: pandas runs the whole expression from the frame in the name
    'df[df["cars"] > 2].index.tolist()',
    'df["cars"].sort_values(ascending=False)[3]',
    'list(df.sort_values("cars").head(3).index)',
])
def test_labels_of_a_temporary_are_pandas_own(expression: str) -> None:
    differential(HEAD + f"result = {expression}\n")


def test_a_keyword_named_like_a_frame_stays_a_keyword() -> None:
    # pandas runs the whole expression with the frames it names handed over; `ascending=` is a
    # parameter's name, not the frame of that name
    result = differential(HEAD + """\
ascending = pd.DataFrame({"boat": ["Orm", "Lunde"], "crew": [3, 4]})
result = df[df["cars"] > 2].sort_index(ascending=False).index.tolist()
""")
    assert "sort_index(ascending=False)" in result.converted_text, result.converted_text


def test_labels_after_an_inplace_sort_and_inplace_set_index(tmp_path, monkeypatch) -> None:
    # the sort's original row numbers are read later; set_index / sort_index in place change
    # the frame pandas holds (not a copy of it)
    monkeypatch.chdir(tmp_path)
    (tmp_path / "d.csv").write_text("id,k,v\n3,a,5\n1,b,-6\n2,a,7\n", encoding="utf-8")
    source = '''
import pandas as pd
df = pd.read_csv("d.csv")
df.set_index("id", inplace=True)
df["v2"] = df["v"] * 2
f = pd.read_csv("d.csv").set_index("id")
f.sort_index(inplace=True)
f["w"] = f["v"] - 1
d5 = pd.read_csv("d.csv")
d5.sort_values("v", inplace=True)
d5["w"] = d5["v"] * 2
labels = d5.index.tolist()
'''
    differential(source, "df", "f", "d5", "labels")


def test_labels_read_many_statements_after_the_filter_are_pandas_labels(tmp_path, monkeypatch):
    # pandas is the reference: a filter, then a long run of column assignments, then the
    # labels read (to_csv with its index, df.index, df.loc[label]); porter once looked back
    # only ten statements and handed over renumbered rows under the TODO
    monkeypatch.chdir(tmp_path)
    (tmp_path / "d.csv").write_text("st,t\nb,1\na,5\n,9\nb,7\na,2\nb,3\n", encoding="utf-8")
    steps = "".join(f'df["x{i}"] = df["t"] * {i}\n' for i in range(1, 16))
    differential('import pandas as pd\ndf = pd.read_csv("d.csv")\n'
                 'df = df.dropna(subset=["st"])\n' + steps
                 + 'labels = df.index.tolist()\none = df.loc[3, "t"]\n'
                 'best = df.groupby("st")["t"].idxmax().tolist()\n',
                 "labels", "one", "best")


def test_filtered_frames_in_a_list_or_appended_in_a_loop_keep_pandas_labels(tmp_path, monkeypatch):
    # pandas is the reference: parts of a frame, filtered inline, concatenated by pandas code
    # porter does not port (a list in a name, a loop of appends) and written with their labels
    monkeypatch.chdir(tmp_path)
    (tmp_path / "d.csv").write_text("st,t\nb,1\na,5\n,9\nb,7\na,2\nb,3\n", encoding="utf-8")
    differential("""
import pandas as pd
df = pd.read_csv("d.csv")
parts = [df[df["st"] == "a"], df[df["st"] == "b"]]
c = pd.concat(parts)
frames = []
for v in ["a", "b"]:
    frames.append(df[df.st == v])
d = pd.concat(frames)
labels = c.index.tolist() + d.index.tolist()
""", "labels")


@pytest.mark.parametrize("make", [
    # a filter through a mask kept in a name: the same labels as the mask written inline
    'mask = df["cars"] > 5\npos = df[mask]\n',
    'mask = df["cars"] > 5\npos = df.loc[mask, ["boat", "cars"]]\n',
    'm1 = df["cars"] > 0\nm2 = df["boat"].notna()\npos = df[m1 & m2]\n',
    'm1 = df["cars"] > 0\nm2 = df["leg"] != "east"\nboth = m1 & m2\npos = df[~both]\n',
    # the mask is an expression of another frame with the same labels
    'mask = df["fare"] < 5.5\nother = df.copy()\npos = other[mask]\n',
])
@pytest.mark.parametrize("read", [
    'result = pos.reset_index()\n',
    'result = [list(pos.index), pos["cars"].idxmax()]\n',
    'result = [i for i, _ in pos.iterrows()]\n',
    'result = pos.sort_index(ascending=False).reset_index()\n',
    'df["flag"] = pos["cars"] > 9\nresult = df\n',
])
def test_a_filter_through_a_named_mask_keeps_pandas_labels(make: str, read: str) -> None:
    differential(HEAD + make + read)


def test_a_named_mask_used_again_after_the_filter_pandas_made() -> None:
    # the mask is computed by pandas for the filter; later uses read that pandas Series
    differential(HEAD + """\
mask = df["cars"] > 5
pos = df[mask]
labels = list(pos.index)
count = int(mask.sum())
df["big"] = mask
result = df[~mask]
""", "result", "labels", "count")


@pytest.mark.parametrize("body", [
    # the script's own functions read the labels of the frame they are given: a filtered or
    # sorted frame passed to them holds pandas' labels
    'pos = df[df["cars"] > 5]\nby_fare = df.sort_values("fare", ascending=False)\n'
    'def save(d, name):\n    d.to_csv(name)\n'
    'save(pos, "pos.csv")\nsave(by_fare, "fare.csv")\nsave(df, "all.csv")\n'
    'result = [open(n).read() for n in ("pos.csv", "fare.csv", "all.csv")]\n',
    'pos = df[df["cars"] > 5]\ndef top(d):\n    return d["cars"].idxmax()\nresult = [top(pos), top(df)]\n',
    'pos = df[df["cars"] > 5]\ndef labels(d):\n    e = d[d["fare"] < 6]\n    return list(e.index)\nresult = labels(pos)\n',
    # through a chain of helpers, and with a frame the statement does not name
    'pos = df[df["cars"] > 5]\ndef inner(d):\n    return d.index.tolist()\n'
    'def outer(d):\n    return inner(d)\nresult = outer(pos)\n',
    'def save(d, name):\n    d.to_csv(name)\nfor leg in ["north", "south"]:\n'
    '    save(df[df["leg"] == leg], leg + ".csv")\n'
    'result = open("north.csv").read() + open("south.csv").read()\n',
    # the frame is also read by pandas elsewhere (.at on a label)
    'pos = df[df["cars"] > 5]\ndef show(d):\n    return d.index.tolist()\nx = pos.at[5, "boat"]\n'
    'result = [show(pos), x]\n',
])
def test_labels_read_inside_the_scripts_own_functions(body: str) -> None:
    differential(HEAD + body)


@pytest.mark.parametrize("body", [
    # the function filters or sorts, and the labels of what it returns are read: it stays
    # pandas code (its body had been ported to Polars and was then called with a pandas frame)
    'def heavy(d, lim=5):\n    return d[d["cars"] > lim]\na = heavy(df)\nresult = list(a.index)\n',
    'def heavy(d, lim=5):\n    return d[d["cars"] > lim]\na = heavy(df)\nb = heavy(df, 10)\n'
    'result = [a.reset_index(), b]\n',
    'def load():\n    return pd.read_csv("crossings.csv").sort_values("cars")\nx = load()\n'
    'result = list(x.index)\n',
])
def test_labels_of_what_the_scripts_own_function_returns(body: str) -> None:
    differential(HEAD + body)


@pytest.mark.parametrize("body", [
    # the helper adds a row at label len(frame): after the filter that label may exist, and
    # pandas overwrites that row instead of adding one
    'def add_total(frame):\n    frame.loc[len(frame), ["boat", "cars"]] = ["TOTAL", frame["cars"].sum()]\n'
    'df = df[df["cars"] > 0]\nadd_total(df)\nresult = df\n',
    # the helper drops and writes by label (label 1 is gone after the filter: a new row)
    'def fix(frame):\n    frame.drop(index=[3], inplace=True, errors="ignore")\n'
    '    frame.loc[1, "leg"] = "fixed"\n'
    'df = df[df["cars"] > 4]\nfix(df)\nresult = df\n',
    # a sort, a column, then the helper writes one cell by label
    'def mark(frame):\n    frame.at[2, "leg"] = "two"\n'
    'df = df.sort_values("cars", kind="stable")\ndf["double"] = df["cars"] * 2\nmark(df)\nresult = df\n',
    # the same written in the script itself
    'df = df[df["cars"] > 0]\ndf.at[5, "leg"] = "five"\nresult = df\n',
])
def test_a_frame_changed_in_place_by_label_after_a_filter_keeps_pandas_labels(body: str) -> None:
    differential(HEAD + body)


def test_a_helper_changing_a_frame_that_keeps_its_labels_leaves_the_read_on_polars() -> None:
    # no filter or sort before: the labels are 0..n-1 on both sides, the read stays Polars
    result = differential(HEAD + 'def add_total(frame):\n'
                          '    frame.loc[len(frame), ["boat", "cars"]] = ["TOTAL", frame["cars"].sum()]\n'
                          'df["double"] = df["cars"] * 2\nadd_total(df)\nresult = df\n')
    assert "frame.labels" not in {site.key for site in result.sites}
