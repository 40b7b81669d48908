"""df.loc[mask, ["a", "b"]] = value: one pl.when(mask).then(value).otherwise(pl.col(c)) per
column, each column keeping the type pandas 3.1 gives it (checked by running pandas): 0 into
an int column stays int (written 0), into a float column float (0.0); NaN makes an int column
float even when the mask chooses no row; a missing value in the mask chooses no row; values
pandas refuses (0.5 into int, 0 into text or True/False) keep the statement on pandas."""

from __future__ import annotations

import pytest

from rule_checks import convert
from support import same_text

# an orchard co-op's crate log: a blank deposit, a missing grade, a duplicate crate
CRATES = ("crate,grower,kg,deposit,grade,paid,fee\n"
          "1,Hollins,18.5,5.0,A,True,2\n"
          "2,Ōtake,21.0,,B,False,3\n"
          "3,Hollins,,2.5,,True,0\n"
          "3,Hollins,,2.5,,True,0\n"
          "4,Marsh,12.25,,A,False,7\n")


@pytest.mark.parametrize("statement", [
    'df.loc[df["deposit"].isna(), ["deposit", "fee"]] = 0',
    'df.loc[df["deposit"].isna(), ["fee", "deposit"]] = 2.0',
    'df.loc[df["kg"] > 100, ["deposit", "fee"]] = 0',  # no row chosen
    'df.loc[df["kg"] > 0, ["deposit", "fee"]] = 0',  # a missing kg chooses no row
    'df.loc[df["kg"] > 0, ["fee", "kg"]] = float("nan")',  # fee becomes float
    'df.loc[df["kg"] > 100, ["fee"]] = float("nan")',  # float even with no row chosen
    'df.loc[df["grower"] == "Hollins", ["grade", "grower"]] = "X"',
    'df.loc[df["grower"] == "Hollins", ["grade"]] = None',
    'df.loc[df["paid"], ["paid"]] = False',
    'df.loc[df["fee"] >= 2, ["fee", "kg"]] = [0, 1.5]',
    'df.loc[df["fee"] >= 2, ["fee", "kg"]] = (9, 0)',
    'df.loc[df["fee"] >= 2, ["fee", "bonus"]] = 1',  # a new column: float, missing elsewhere
    'df.loc[df["fee"] >= 2, ["label"]] = "late"',
    'df.loc[(df["fee"] > 0) & (df["kg"] < 20), ["fee", "deposit"]] = -1',
    'df.loc[df["crate"] == 3, ["kg", "deposit"]] = 0',  # duplicate rows both chosen
])
@pytest.mark.parametrize("with_data", [True, False])
def test_loc_assignment_to_several_columns_writes_pandas_text(tmp_path, statement, with_data):
    result = same_text(f"""
        import pandas as pd
        df = pd.read_csv("crates.csv")
        {statement}
        df.to_csv("out.csv", index=False)
        print(df.dtypes.astype(str).tolist())
        """, tmp_path, {"crates.csv": CRATES}, with_data=with_data)
    if with_data:
        assert "TODO" not in result.converted_text


def test_loc_assignment_to_several_columns_of_an_empty_frame(tmp_path):
    same_text("""
        import pandas as pd
        df = pd.read_csv("crates.csv")
        df = df[df["kg"] > 100]
        df.loc[df["fee"] > 0, ["fee", "deposit"]] = 0
        df.to_csv("out.csv", index=False)
        """, tmp_path, {"crates.csv": CRATES})


def test_loc_assignment_mask_reads_the_columns_before_they_change(tmp_path):
    # the mask is computed before pandas writes any column: fee is read as it was
    same_text("""
        import pandas as pd
        df = pd.read_csv("crates.csv")
        df.loc[df["fee"] > 2, ["fee", "deposit"]] = 0
        df.loc[df["fee"] == 0, ["kg", "fee"]] = [1, 5]
        df.to_csv("out.csv", index=False)
        """, tmp_path, {"crates.csv": CRATES})


FRAME = ('import pandas as pd\n'
         'df = pd.DataFrame({"i": [1, 2, 3], "f": [0.5, None, 2.0], "s": ["a", None, "c"], '
         '"b": [True, False, True]})\n')


@pytest.mark.parametrize("statement", [
    'df.loc[df["i"] > 1, ["i", "f"]] = 0.5',  # pandas refuses 0.5 in int64
    'df.loc[df["i"] > 1, ["i", "b"]] = 0',  # and 0 in bool
    'df.loc[df["i"] > 1, ["s", "f"]] = 0',  # and 0 in str
    'df.loc[df["i"] > 1, ["f", "s"]] = "z"',  # and "z" in float64
    'df.loc[df["i"] > 1, ["f", "i"]] = True',
    'df.loc[df["i"] > 1, ["f", "new"]] = True',  # a new object column
    'df.loc[df["i"] > 1, ["i", "f"]] = [0, 1, 2]',  # not one value per column
    'df.loc[df["i"] > 1, ["i", "i"]] = 0',
    'df.loc[df["i"] > 1, ["i", "f"]] = df["i"]',  # aligned on labels in pandas
])
def test_loc_assignment_pandas_refuses_or_aligns_stays_todo(statement):
    # the statement stays on pandas (which raises for most of these, as it should)
    result = convert(FRAME + statement + "\nresult = df\n")
    assert "# TODO(porter): frame.loc_setitem" in result.converted_text, result.converted_text
    assert any(s.key == "frame.loc_setitem" and s.status == "todo" for s in result.sites)
