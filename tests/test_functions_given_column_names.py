"""The script's own function whose calls name a column by a text of their own
(`kg_table(bookings, "baker")`, `kg_table(deliveries, "member")`): its body is ported once, the
parameter standing where its texts go (`.group_by(who)`), and kept only when it is, for each
text the calls pass, exactly the code porter writes for that text (engine.texts_followed).
What it returns for each call has the columns that call's text names.

pandas is the reference implementation: each check runs the script with pandas and its
conversion with Polars and compares the named variables.
"""

from __future__ import annotations

import re

from support import differential, same_text

# a seed bank's lending book and its returns: missing and duplicate keys, unicode names, NaN
FRAMES = '''
import numpy as np
import pandas as pd

lent = pd.DataFrame({
    "grower": ["Åsa", "bo", None, "Åsa", "Émile", "bo", "zoë"],
    "packet": ["p1", "p2", "p3", "p4", "p5", "p6", "p7"],
    "grams": [2.5, np.nan, 1.0, 0.1, 0.2, 3.0, 0.7],
})
returned = pd.DataFrame({
    "member": ["bo", "Åsa", "bo", None, "ülla"],
    "grams": [1.0, 0.3, np.nan, 4.0, 0.1],
    "season": ["spring", "autumn", "spring", "autumn", "spring"],
})
'''


def both(source: str, *names: str) -> str:
    """The conversion's text, after its values `names` were checked against pandas'."""
    return differential(FRAMES + source, *names).converted_text


def test_a_group_key_named_by_each_call_is_the_parameter():
    text = both('''
def grams_table(frame, who):
    out = frame.groupby(who, as_index=False)["grams"].sum()
    return out

taken = grams_table(lent, "grower")
given = grams_table(returned.dropna(subset=["member"]), "member")
balance = taken.merge(given, left_on="grower", right_on="member", how="outer",
                      suffixes=("_taken", "_given"), indicator=True)
balance["owed"] = (balance["grams_taken"].fillna(0) - balance["grams_given"].fillna(0)).round(2)
balance = balance.sort_values("owed", ascending=False)
worst = balance.loc[balance["owed"].idxmax(), "member"]
''', "taken", "given", "balance", "worst")
    assert ".group_by(who)" in text and ".sort(who)" in text
    assert "TODO(porter)" not in text and ".collect().to_pandas()" not in text
    assert "_porter_text_" not in text
    # "grams" is a float in both frames: the sums are typed, and so is what follows
    assert not re.search(r"floats=False[,)]", text)


def test_an_empty_frame_given_to_the_function():
    text = both('''
def grams_table(frame, who):
    return frame.groupby(who)["grams"].sum().reset_index()

taken = grams_table(lent[lent["grams"] > 100], "grower")
given = grams_table(returned, "member")
both_ = given.merge(taken, left_on="member", right_on="grower", how="left")
''', "taken", "given", "both_")
    assert ".group_by(who)" in text and "TODO(porter)" not in text


def test_the_columns_each_call_returns_are_known_where_it_is_called():
    # the key column keeps the name each call gave it: later statements read it by that name
    text = both('''
def counted(frame, key):
    return frame.groupby(key, as_index=False).agg(n=("grams", "count"), top=("grams", "max"))

by_grower = counted(lent, "grower").sort_values(["n", "grower"], ascending=[False, True])
by_member = counted(returned, "member")
by_member["label"] = by_member["member"].str.upper()
by_season = counted(returned, "season")
first = by_season["season"].iloc[0]
''', "by_grower", "by_member", "by_season", "first")
    assert "def counted(frame, key):" in text and ".group_by(key)" in text
    assert "TODO(porter)" not in text and ".collect().to_pandas()" not in text


def test_two_text_parameters_a_key_and_a_value():
    text = both('''
def only(frame, column, value):
    kept = frame[frame[column] == value]
    return kept.sort_values("grams")

bo = only(lent, "grower", "bo")
spring = only(returned, "season", "spring")
''', "bo", "spring")
    assert "pl.col(column) == value" in text and "TODO(porter)" not in text


def test_a_text_the_body_makes_a_name_of_is_not_followed():
    # `who + "_grams"` is computed when porter reads the body: one port cannot name the column
    # of every call, so the parameter stays text porter does not know (as before)
    text = both('''
def renamed(frame, who):
    out = frame.groupby(who, as_index=False)["grams"].sum()
    out = out.rename(columns={"grams": who + "_grams"})
    return out

a = renamed(lent, "grower")
b = renamed(returned, "member")
''', "a", "b")
    assert "_porter_text_" not in text


def test_one_text_for_every_call_is_unchanged():
    # every call passes the same text: the body names that column (param_consts), as before
    text = both('''
def grams_table(frame, who):
    return frame.groupby(who, as_index=False)["grams"].sum()

a = grams_table(lent, "grower")
b = grams_table(lent[lent["grams"] > 0.5], "grower")
''', "a", "b")
    assert '.group_by("grower")' in text and "TODO(porter)" not in text


def test_sums_in_key_order_are_added_as_pandas_adds_them(tmp_path):
    # rows that come sorted by the key are added one after another by pandas (26.160000000000004),
    # others with compensation (26.16): the body knows "grams" is a float column in every
    # call's frame, and the key's type, so it tells the two apart as pandas does
    same_text('''
        import pandas as pd

        def grams_table(frame, who):
            return frame.groupby(who, as_index=False)["grams"].sum()

        lent = pd.DataFrame({"grower": ["a", "a", "a", "a", "b", "b"],
                             "grams": [6.1, 6.96, 7.2, 5.9, 9.0, 0.223]})
        back = pd.DataFrame({"member": ["a", "b", "a", "a", "a"],
                             "grams": [6.1, 0.223, 6.96, 7.2, 5.9], "note": list("vwxyz")})
        grams_table(lent, "grower").to_csv("lent.csv", index=False)
        grams_table(back, "member").to_csv("back.csv", index=False)
        ''', tmp_path)


def test_a_text_parameter_bound_anew_in_the_body_is_not_followed():
    # `key` is read after `who` holds another text: the body is not ported for the parameter
    text = both('''
def grams_table(frame, who):
    key = who
    who = "grams"
    return frame.groupby(key, as_index=False)[who].sum()

taken = grams_table(lent, "grower")
given = grams_table(returned, "member")
''', "taken", "given")
    assert "_porter_text_" not in text
    assert ".group_by(who)" not in text


def test_a_body_the_last_pass_writes_otherwise_is_not_taken_for_polars():
    # rename's key is written as text by the rule: the body is not ported for the parameter.
    # The analysis passes compare the code they would write too, so the callers never take
    # what it returns (pandas frames) for LazyFrames (pd.concat stays pandas)
    text = both('''
def keyed(frame, who):
    out = frame[frame[who].notna()].rename(columns={who: "key"})
    out["label"] = out["key"].str.upper() + "-" + who
    return out

a = keyed(lent, "grower")
b = keyed(returned, "member")
both_ = pd.concat([a, b])
''', "a", "b", "both_")
    assert "_porter_text_" not in text
    assert "pl.concat([a, b]" not in text


def test_a_merge_key_named_by_each_call():
    text = both('''
def joined(left, right, on):
    return left.merge(right, on=on, how="left")

c = joined(lent.rename(columns={"grower": "member"}), returned, "member")
d = joined(returned, returned, "season")
''', "c", "d")
    assert "on=on" in text and "TODO(porter)" not in text
