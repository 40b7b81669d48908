"""Number types pandas 3.1 keeps or changes: whole floats put into int columns,
missing values beside whole numbers, int arithmetic in row functions, to_numeric of text.

pandas is the reference: each check runs the script with pandas and its conversion with Polars
in folders holding the same files, and compares what they print and write (same_text: 3 and
3.0 differ there, as they do for whoever reads the output).
"""

from __future__ import annotations

import pytest

from support import convert, same_text

# a ferry line's crossings: whole numbers of cars, fractions of hours
FERRY = {"f.csv": "boat,cars,hours\nAster,1,1.5\nBrill,2,2.5\nAster,3,3.5\nCove,4,4.0\n"}


# -- where / mask / clip / loc with a whole float on an int column ---------------------------

@pytest.mark.parametrize("line", [
    'f["x"] = f["cars"].where(f["cars"] > 2, 0.0)',
    'f["x"] = f["cars"].where(f["cars"] > 2, other=-0.0)',
    'f["x"] = f["cars"].mask(f["cars"] > 2, 5.0)',
    'f["x"] = f["cars"].clip(0.0, 3.0)',
    'f["x"] = f["cars"].clip(lower=2.0)',
    'f["x"] = f["cars"].clip(upper=np.inf)',
    'f["x"] = f["cars"].clip(np.nan, 3.0)',
    'f.loc[f["cars"] > 3, "cars"] = 0.0',
    'f["x"] = f["hours"].where(f["hours"] > 2, 0.0)',
    'f["x"] = f["hours"].clip(2.0, 3.0)',
])
@pytest.mark.parametrize("with_data", [True, False])
def test_whole_float_into_int_column(line, with_data, tmp_path):
    """pandas 3.1 puts a whole float into its int64 column as the int: where(cars > 2, 0.0),
    clip(0.0, 3.0) and loc[...] = 0.0 keep int64 (written 0, not 0.0), whatever the rows;
    an infinite or NaN bound is no bound. A float column stays float (written 0.0)."""
    same_text(f"""
        import numpy as np
        import pandas as pd
        f = pd.read_csv("f.csv")
        {line}
        f.to_csv("o.csv", index=False)
        print(f.iloc[:, -1].tolist())
        """, tmp_path, FERRY, with_data=with_data)


@pytest.mark.parametrize("line, keep", [
    ('f["x"] = f["w"].where(f["w"].notna(), 0.0)', "f['cars'] > 1"),
    ('f["x"] = f["w"].mask(f["w"].isna(), 5.0)', "f['cars'] > 1"),
    ('f["x"] = f["w"].clip(0.0, 2.0)', "f['cars'] > 1"),
    ('f["x"] = f["w"].clip(0.0, 2.0)', "f['cars'] > 0"),
])
def test_whole_float_into_an_int_column_pandas_holds_as_floats(line, keep, tmp_path):
    """where() without other that left a car count out makes pandas' column float64: 0.0 put
    in is 0.0 there (written 0.0), and a clip keeps the missing value (written 2.0); where it
    left none out the column is int64 (written 2). (Filled when nothing was missing, pandas'
    column stays int64: lowered, as fillna is.)"""
    same_text(f"""
        import pandas as pd
        f = pd.read_csv("f.csv")
        f["w"] = f["cars"].where({keep})
        {line}
        f.to_csv("o.csv", index=False)
        print(f["x"].tolist())
        """, tmp_path, FERRY)


@pytest.mark.parametrize("line", [
    'f["x"] = f["cars"].clip(upper=f["cars"].quantile(0.9))',
    'f["x"] = f["cars"].clip(lower=f["cars"].mean())',
    'lo = f["cars"].median(); f["x"] = f["cars"].clip(lo, 100)',
    'f["x"] = f["cars"].clip(upper=f["cars"].quantile(0.9) * 1)',
])
def test_computed_float_bound_on_int_column_is_not_truncated(line, tmp_path):
    """pandas clips 1, 2, 3, 4 to a cap of 3.7 (the 0.9 quantile) as 1.0, 2.0, 3.0, 3.7, and
    to a floor of 2.5 (the mean) as 2.5, 2.5, 3.0, 4.0: Polars' clip would take the bound as
    the Int64 column's type (3 and 2)."""
    result = same_text(f"""
        import pandas as pd
        f = pd.read_csv("f.csv")
        {line}
        f.to_csv("o.csv", index=False)
        """, tmp_path, FERRY)
    sites = [s for s in result.sites if s.key == "series.clip"]
    assert sites and all(s.confidence < 1 for s in sites)


@pytest.mark.parametrize("line", [
    'f["x"] = f["cars"].where(f["cars"] > 0, 0.5)',
    'f["x"] = f["cars"].where(f["cars"] > 0, f["cars"].mean())',
    'f["x"] = f["cars"].mask(f["cars"] > 9, f["hours"])',
])
def test_fraction_into_int_column_is_lowered(line):
    """pandas makes the int64 column float64 only when the condition leaves a value out: here
    none is, so pandas writes 1, 2 where Polars' Float64 column writes 1.0, 2.0."""
    result = convert(f"""
        import pandas as pd
        f = pd.read_csv("f.csv", dtype={{"cars": "int64", "hours": "float64"}})
        {line}
        f.to_csv("o.csv", index=False)
        """)
    sites = [s for s in result.sites if s.key in ("series.where", "series.mask")]
    assert sites and sites[0].confidence < 1 and "leaves a value out" in sites[0].message


# -- None, NaN and pd.NA beside whole numbers (np.where, map) --------------------------------

CROSSINGS = {"c.csv": "boat,cars\nAster,1\nBrill,-2\nCove,3\n"}


@pytest.mark.parametrize("line", [
    'c["x"] = np.where(c["cars"] > 0, 1, None)',
    'c["x"] = np.where(c["cars"] > 0, c["cars"], None)',
    'c["x"] = np.where(c["cars"] > 0, c["cars"], pd.NA)',
    'c["x"] = np.where(c["cars"] > 0, True, None)',
    'c["x"] = c["boat"].map({"Aster": 1, "Brill": pd.NA, "Cove": 2})',
    'c["x"] = c["cars"].map(lambda x: pd.NA if x < 0 else x)',
    # what stays as it was: NaN makes float64, None beside text a missing text
    'c["x"] = np.where(c["cars"] > 0, c["cars"], np.nan)',
    'c["x"] = np.where(c["cars"] > 0, "east", None)',
    'c["x"] = c["boat"].map({"Aster": 1, "Brill": None, "Cove": 2})',
    'c["x"] = c["cars"].map(lambda x: None if x < 0 else x)',
])
def test_missing_beside_whole_numbers(line, tmp_path):
    """numpy makes None (or pd.NA) beside whole numbers an object array of ints and None, which
    pandas writes 1 and lists [1, None, 3]; NaN makes float64 (written 1.0), and map() turns
    None beside numbers into NaN (float64) but keeps pd.NA in an object column."""
    same_text(f"""
        import numpy as np
        import pandas as pd
        c = pd.read_csv("c.csv")
        {line}
        c.to_csv("o.csv", index=False)
        print(c["x"].tolist())
        """, tmp_path, CROSSINGS)


@pytest.mark.parametrize("line", [
    'c["x"] = np.where(c["cars"] > 0, 1.5, None)',
    'c["x"] = c["cars"].map(lambda x: None if x < 0 else x > 2)',
])
def test_none_beside_floats_or_bools_is_lowered(line, tmp_path):
    """pandas lists these object columns with None where porter's column has NaN; the file
    written is the same (1.5 and an empty field)."""
    result = convert(f"""
        import numpy as np
        import pandas as pd
        c = pd.read_csv("c.csv")
        {line}
        c.to_csv("o.csv", index=False)
        """)
    assert any(s.confidence <= 0.9 and "None" in s.message for s in result.sites
               if s.key in ("np.where", "series.map"))


# -- d.get(x, default) in a function: the numbers pandas infers ------------------------------

PIERS = {"p.csv": "pier,n\nnorth,1\nsouth,-2\nwest,3\n"}


@pytest.mark.parametrize("line", [
    'd = {"north": 1, "south": 2.5}; p["x"] = p["pier"].map(lambda x: d.get(x, 0))',
    'd = {"north": 1.5, "south": 2.0}; p["x"] = p["pier"].map(lambda x: d.get(x, 0))',
    'd = {"north": 1, "south": 2}; p["x"] = p["pier"].map(lambda x: d.get(x, 0.5))',
    'd = {"north": 1, "south": 2}; p["x"] = p["pier"].map(lambda x: d.get(x))',
    'd = {"north": 1, "south": 2}; p["x"] = p["pier"].map(lambda x: d.get(x)).fillna(0)',
    'd = {"north": 1, "south": 2}; p["x"] = p["pier"].map(lambda x: d.get(x, "none"))',
    'd = {"north": 1, "south": 2, "west": 4}; p["x"] = p["pier"].map(lambda x: d[x] * 2)',
])
def test_dict_get_in_a_function(line, tmp_path):
    """pandas makes the column of what the function returned: 1 and 2.5 are float64 (Polars
    would build the dict's values as Int64 and fail on 2.5), a default of another type than
    the values mixes them, None a missing value, text an object column."""
    same_text(f"""
        import pandas as pd
        p = pd.read_csv("p.csv")
        {line}
        p.to_csv("o.csv", index=False)
        print(p["x"].tolist())
        """, tmp_path, PIERS)


def test_dict_get_with_a_default_of_another_number_type_is_lowered():
    """Every pier found in a dict of ints: pandas keeps int64 (written 1) where the float
    default makes Polars' column Float64 (1.0)."""
    result = convert("""
        import pandas as pd
        p = pd.read_csv("p.csv")
        d = {"north": 1, "south": 2, "west": 3}
        p["x"] = p["pier"].map(lambda x: d.get(x, 0.0))
        """)
    assert any(s.confidence < 1 and "not all of one number type" in s.message
               for s in result.sites if s.key == "series.map")


# -- int arithmetic in a row function ----------------------------------------------------------

LOCKS = {"l.csv": "lock,up,down,hours\nA,7,2,1.5\nB,9,4,2.5\nC,-7,2,0.5\n"}


@pytest.mark.parametrize("line", [
    'l["x"] = l.apply(lambda r: r["up"] // r["down"], axis=1)',
    'l["x"] = l.apply(lambda r: r["up"] // r["down"] if r["lock"] == "A" else 0, axis=1)',
    'l["x"] = l.apply(lambda r: r["up"] // r["hours"], axis=1)',
    'l["x"] = l[["up", "down", "hours"]].apply(lambda r: r["up"] + r["down"], axis=1)',
    'l["x"] = l["up"].map(lambda v: v // 2)',
])
def test_int_arithmetic_in_row_functions(line, tmp_path):
    """A row holding text is an object Series in pandas: its ints stay Python ints and
    up // down is an int (3, written 3); a row of numbers only with a float is float64, so
    up + down is 9.0 there."""
    same_text(f"""
        import pandas as pd
        l = pd.read_csv("l.csv")
        {line}
        l.to_csv("o.csv", index=False)
        print(l["x"].tolist())
        """, tmp_path, LOCKS)


def test_int_dict_over_a_cut_is_lowered():
    """pandas maps a categorical one to one into a categorical of ints: written 1 beside a
    missing value, where an int column with a missing value is written 1.0."""
    result = convert("""
        import pandas as pd
        p = pd.read_csv("p.csv")
        p["band"] = pd.cut(p["n"], bins=[-5, 0, 5], labels=["low", "high"])
        p["x"] = p["band"].map({"low": 1, "high": 2})
        p.to_csv("o.csv", index=False)
        """)
    assert any(s.confidence <= 0.9 and "categorical" in s.message
               for s in result.sites if s.key == "series.map")


# -- a power past int64 -------------------------------------------------------------------------

def test_int_power_wraps_around_as_numpy(tmp_path):
    """numpy's int64 power wraps around past 2**63 as Polars' Int64 does (both are the power
    modulo 2**64): 3037000500 ** 2 is -9223372036709301616 in both, so the rewrite is sure."""
    result = same_text("""
        import pandas as pd
        g = pd.read_csv("g.csv")
        g["sq"] = g["tonnes"] ** 2
        g["cube"] = (g["tonnes"] + 1) ** 3
        g.to_csv("o.csv", index=False)
        """, tmp_path, {"g.csv": "tonnes\n3037000500\n1099511627776\n-5\n62\n"})
    assert all(s.confidence == 1 for s in result.sites if s.key == "series.arith")


def test_power_of_an_int_column_pandas_holds_as_floats_is_lowered():
    """where() left a value out: pandas' column is float64, whose square of 3037000500 is
    9.22337203700025e+18, where Polars' Int64 wraps around."""
    result = convert("""
        import pandas as pd
        g = pd.read_csv("g.csv", dtype={"tonnes": "int64"})
        g["sq"] = g["tonnes"].where(g["tonnes"] > 0) ** 2
        """)
    assert any(s.confidence <= 0.95 and "wraps around" in s.message
               for s in result.sites if s.key == "series.arith")


# -- pd.eval: a TODO that runs -------------------------------------------------------------------

@pytest.mark.parametrize("line", [
    'print(pd.eval("double_age = df.age * 2", target=df))',
    'print(pd.eval("df.age + 1").tolist())',
    'print(pd.eval("df.age * k"))',
])
def test_pd_eval_reads_the_frames_as_pandas(line, tmp_path):
    """pandas' own docstring example: pd.eval looks `df` up in the script's variables, a
    LazyFrame once converted ('LazyFrame' object has no attribute 'age'); the frame is handed
    over through local_dict=."""
    result = same_text(f"""
        import pandas as pd
        df = pd.DataFrame({{"animal": ["dog", "pig"], "age": [10, 20]}})
        k = 3
        {line}
        """, tmp_path)
    sites = [s for s in result.sites if s.key == "pd.eval"]
    assert sites and sites[0].status == "todo"


def test_pd_eval_in_a_function_reads_its_locals(tmp_path):
    same_text("""
        import pandas as pd

        def scaled(frame, k):
            return pd.eval("frame.age * k")

        df = pd.DataFrame({"animal": ["dog", "pig"], "age": [10, 20]})
        print(scaled(df, 3).tolist())
        """, tmp_path)
