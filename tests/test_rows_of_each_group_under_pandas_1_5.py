"""groupby(k).apply(lambda g: g.nlargest(n, col)) and the like (nsmallest, head, tail) in a
pandas 1.x script (one that uses an API pandas 2 or 3 removed: here pd.np): each group's rows
with the key columns kept, as pandas 1.5 gave them; in a script of today's pandas a TODO. Run
as written under pandas 1.5.3 (a Python built once from the package index) and as converted
under Polars through `porter verify --reference-python`; skipped with the reason where pandas
1.5.3 cannot be had here.
"""

from __future__ import annotations

import pytest

from porter.api import convert_source
from test_legacy_spellings_under_pandas_1_5 import pandas_1_5, same_under_old_pandas  # noqa: F401

# a seed bank's drawers: a missing key, a missing weight, tied weights, a drawer of one
# packet, accents, a duplicated line
PACKETS = """drawer,species,grams,seeds
a1,Anémone,2.5,40
b2,primula,1.25,0
a1,Silene,,120
,Œillet,9.0,5
b2,primula,1.25,250
a1,Anémone,2.5,60
c3,Ært,0.5,800
b2,Primula,3.75,10
a1,Silene,,120
b2,Mêlée,0.75,250
"""

# every drawer holds at most two packets, already in falling order of grams: pandas 1.5 takes
# the function for a transform and gives the rows in the frame's order
SMALL = """drawer,species,grams,seeds
b2,primula,3.0,0
a1,Anémone,2.5,40
a1,Silene,1.0,120
b2,Mêlée,0.75,250
c3,Ært,,800
"""


@pytest.mark.parametrize("function", [
    'g.nlargest(2, "grams")',
    'g.nsmallest(2, "grams")',
    'g.nlargest(1, columns="seeds")',
    'g.nlargest(3, ["grams"])',
    "g.head(2)",
    "g.tail(2)",
    "g.head(1)",
])
@pytest.mark.parametrize("data", [PACKETS, SMALL], ids=["packets", "small-groups"])
@pytest.mark.parametrize("with_data", [True, False])
def test_rows_of_each_group_keep_the_key_columns(pandas_1_5, tmp_path, function, data,
                                                 with_data):
    same_under_old_pandas(pandas_1_5, tmp_path, f"""
        import pandas as pd
        df = pd.read_csv("data/packets.csv")
        blank = pd.np.nan
        top = df.groupby("drawer").apply(lambda g: {function}).reset_index(drop=True)
        top = top[["drawer", "species", "grams", "seeds"]]
        top.to_csv("data/top.csv", index=False)
    """, {"packets.csv": data}, with_data=with_data)


def test_two_keys_and_a_function_of_the_script(pandas_1_5, tmp_path):
    same_under_old_pandas(pandas_1_5, tmp_path, """
        import pandas as pd

        def heaviest(g):
            return g.nlargest(1, "grams")

        df = pd.read_csv("data/packets.csv")
        df["grams"] = df["grams"].fillna(method="bfill") * 2
        top = df.groupby(["drawer", "species"]).apply(heaviest).reset_index(drop=True)
        top.to_csv("data/top.csv", index=False)
    """)


@pytest.mark.parametrize("call", [
    'df.groupby("drawer").apply(lambda g: g.nlargest(2, "grams"), include_groups=False)',
    'df.groupby("drawer").apply(lambda g: g.nlargest(2, "grams", keep="all"))',
    'df.groupby("drawer").apply(lambda g: g.nlargest(2, ["grams", "seeds"]))',
    'df.groupby("drawer", sort=False).apply(lambda g: g.head(2))',
    'df.groupby("drawer").apply(lambda g: g.head(-1))',
    'df.groupby("drawer").apply(lambda g: g.head(n))',
])
def test_what_is_not_ported_is_a_todo(call):
    source = f"""import pandas as pd
blank = pd.np.nan
n = 2
df = pd.read_csv("data/packets.csv")
top = {call}
top.to_csv("top.csv")
"""
    result = convert_source(source)
    assert "groupby.apply" in [s.key for s in result.sites if s.status == "todo"]


def test_a_script_of_todays_pandas_keeps_the_todo():
    # pandas 3 leaves the key columns out of each group: not what pandas 1.x gave
    result = convert_source("""import pandas as pd
df = pd.read_csv("data/packets.csv")
top = df.groupby("drawer").apply(lambda g: g.nlargest(2, "grams"))
top.to_csv("top.csv")
""")
    assert "groupby.apply" in [s.key for s in result.sites if s.status == "todo"]
