"""Frames reachable through a second name, checked against pandas (the reference).

In pandas a change made in place through one name (`d["month"] = ...`, `frames[0].loc[...] = 0`)
is seen through every other name bound to the same object: a loop variable over a list of
frames, a list or dict holding them, `a if c else b`, tuple unpacking. porter's Polars code
rebinds names, so such frames are handed to pandas in their own names first (frame.shared,
frame.changed_in_a_loop) and the change lands on the object every name holds. The data is an
invented bakery's monthly sales.
"""

from __future__ import annotations

import pytest

from support import same_text

MONTHS = {"jan.csv": "k,v\na,1\nb,-2\n", "feb.csv": "k,v\nc,3\nd,4.5\n"}
READ = """import pandas as pd
jan = pd.read_csv("jan.csv")
feb = pd.read_csv("feb.csv")
"""


@pytest.mark.parametrize("loop", [
    'for d, name in [(jan, "jan"), (feb, "feb")]:\n    d["month"] = name',
    'for d, name in zip([jan, feb], ["jan", "feb"]):\n    d["month"] = name',
    'for i, d in enumerate((jan, feb)):\n    d["month"] = i',
    'frames = {"jan": jan, "feb": feb}\nfor name, d in frames.items():\n    d["month"] = name',
    'months = {"jan": jan, "feb": feb}\nfor m in months:\n    months[m]["month"] = m',
    'for d, name in [(jan, "jan"), (feb, "feb")]:\n    d.loc[d["v"] < 0, "v"] = 0\n'
    '    d.rename(columns={"k": "key"}, inplace=True)',
])
@pytest.mark.parametrize("with_data", [True, False])
def test_frames_tagged_in_a_loop_with_a_second_variable_keep_the_change(loop, with_data, tmp_path):
    # the tag-each-month loop: the loop ran on copies, and the new column was missing
    source = READ + loop + """
allm = pd.concat([jan, feb], ignore_index=True)
allm.to_csv("all.csv", index=False)
print(len(jan.columns), len(feb.columns))
"""
    result = same_text(source, tmp_path, MONTHS, with_data=with_data)
    assert "TODO(porter): frame." in result.converted_text


def test_a_helper_changing_a_list_of_frames_changes_them(tmp_path):
    same_text(READ.replace("import pandas as pd", """import pandas as pd
def tag_all(frames, tags):
    for d, t in zip(frames, tags):
        d["src"] = t""") + """
tag_all([jan, feb], ["j", "f"])
pd.concat([jan, feb], ignore_index=True).to_csv("o.csv", index=False)
""", tmp_path, MONTHS)


def test_a_list_built_before_its_frames_change_sees_the_change(tmp_path):
    # pandas' list holds the objects themselves: concat sees the new column
    result = same_text(READ + """
frames = [jan, feb]
jan["month"] = "jan"
feb["month"] = "feb"
pd.concat(frames, ignore_index=True).to_csv("all.csv", index=False)
""", tmp_path, MONTHS)
    assert "frame.shared" in result.converted_text


def test_a_frame_changed_through_a_list_element(tmp_path):
    # no TODO at all before: the changes ran on a copy and df was written unchanged
    result = same_text(READ + """
frames = [jan]
frames[0]["x"] = 1
frames[0].loc[frames[0]["v"] < 0, "v"] = 0
jan.to_csv("o.csv", index=False)
""", tmp_path, MONTHS)
    assert "frame.shared" in result.converted_text


def test_a_frame_appended_then_changed_is_changed_in_the_list(tmp_path):
    same_text(READ + """
frames = []
for d in ["jan.csv", "feb.csv"]:
    one = pd.read_csv(d)
    frames.append(one)
    one["src"] = d
pd.concat(frames, ignore_index=True).to_csv("o.csv", index=False)
""", tmp_path, MONTHS)


@pytest.mark.parametrize("alias", [
    "target = jan if len(jan) > 5 else feb\ntarget[\"flag\"] = 1",
    "a, b = jan, feb\na[\"x\"] = 1\nb.drop(columns=[\"k\"], inplace=True)",
    "box = {}\nbox[\"j\"] = jan\nbox[\"j\"][\"x\"] = 2",
])
def test_a_conditional_or_unpacked_alias_changed_in_place(alias, tmp_path):
    # the conditional alias changed a copy; tuple unpacking crashed on the LazyFrame
    result = same_text(READ + alias + """
pd.concat([jan, feb], ignore_index=True).to_csv("o.csv", index=False)
""", tmp_path, MONTHS)
    assert "frame.shared" in result.converted_text


def test_a_loop_variable_read_after_the_loop_keeps_the_frames_on_pandas(tmp_path):
    # `d` is still feb after the loop: a change through it is a change of feb
    same_text(READ + """
for d, name in [(jan, "jan"), (feb, "feb")]:
    d["month"] = name
d["last"] = True
pd.concat([jan, feb], ignore_index=True).to_csv("o.csv", index=False)
""", tmp_path, MONTHS)


def test_frames_only_read_through_other_names_stay_polars(tmp_path):
    # nothing is changed in place through a second name: no hand-over is needed
    result = same_text(READ + """
jan["month"] = 1
frames = {"jan": jan, "feb": feb}
for name, d in frames.items():
    print(name, len(d))
parts = []
for f in ["jan.csv", "feb.csv"]:
    one = pd.read_csv(f)
    one["src"] = f
    parts.append(one)
pd.concat(parts, ignore_index=True).to_csv("o.csv", index=False)
jan.to_csv("j.csv", index=False)
""", tmp_path, MONTHS)
    assert "frame.shared" not in result.converted_text
    assert "frame.changed_in_a_loop" not in result.converted_text


def test_a_frame_on_pandas_already_stays_there_while_a_list_holds_it(tmp_path):
    # `jan` went to pandas for insert() and would come back to Polars at the next statement
    # porter rewrites: the list would keep the old object without the new column
    same_text(READ + """
jan.insert(0, "n", 1)
frames = [jan, feb]
jan["month"] = "jan"
pd.concat(frames, ignore_index=True).to_csv("o.csv", index=False)
""", tmp_path, MONTHS)


def test_frames_unpacked_into_two_names_are_those_frames(tmp_path):
    # `a, b = jan, feb` left both names holding LazyFrames that pandas code then read (crash);
    # a swap reads the names it binds and stays as written
    result = same_text(READ + """
a, b = jan, feb
print(a["v"].sum(), len(b))
x, y = 1, "k"
x, y = y, x
print(b[b["v"] > 3].shape, x, y)
a.to_csv("o.csv", index=False)
""", tmp_path, MONTHS)
    assert "x, y = y, x" in result.converted_text
