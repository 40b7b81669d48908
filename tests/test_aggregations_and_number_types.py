"""Aggregations, windows and number types: numpy functions given to agg, int
columns pandas keeps int, the midpoint of an even median.

pandas is the reference: each check runs the script with pandas and its conversion with Polars
in folders holding the same files, and compares what they print and write (same_text: 5 and
5.0 differ there, as do two floats one digit apart).
"""

from __future__ import annotations

import pytest

from support import convert, differential, same_text

CO = {"co.csv": "member,month,crates\nAnn,1,10\nAnn,2,7\nBea,1,\nBea,3,4\nCal,2,3\nCal,2,\nCal,1,5\n"}


# -- np.std / np.var / np.median given to agg (F-F24, F-F25) -------------------------------

@pytest.mark.parametrize("line", [
    'print(d.groupby("member")["month"].agg(np.std).tolist())',
    'print(d.groupby("member")["crates"].agg(np.var).tolist())',
    'print(d.groupby("member").month.aggregate(np.nanstd).tolist())',
    'print(d.groupby(["member"])[["month", "crates"]].agg(np.std).values.tolist())',
    'd.groupby("member").agg(s=("month", np.std), v=("crates", np.var)).to_csv("o.csv")',
    'd.groupby("member")["crates"].agg(s=np.std, m=np.median).to_csv("o.csv")',
    'print(d.groupby("member")["crates"].agg(np.median).tolist())',
    'print(d.groupby("member")["crates"].agg(np.nanmedian).tolist())',
    'print(d.groupby("member")[["month", "crates"]].agg(np.median).values.tolist())',
    'd.groupby("member").agg(m=("crates", np.median), t=("crates", np.nansum)).to_csv("o.csv")',
    'd.pivot_table(index="member", columns="month", values="crates", aggfunc=np.median).to_csv("o.csv")',
    'pd.crosstab(d["member"], d["month"], values=d["crates"], aggfunc=np.median).to_csv("o.csv")',
])
def test_numpy_functions_in_agg(line, tmp_path):
    """pandas 3 calls the numpy function on each group: np.std / np.var with ddof=0 (Ann's
    months 1, 2: 0.5), np.median NaN for a group holding a missing value (Bea)."""
    same_text(f"""
        import numpy as np
        import pandas as pd
        d = pd.read_csv("co.csv")
        {line}
        """, tmp_path, CO)


def test_numpy_std_in_resample(tmp_path):
    files = {"v.csv": "day,v,n\n2024-01-01 00:00,1,1\n2024-01-01 12:00,4,2\n"
                      "2024-01-02 00:00,,3\n2024-01-02 12:00,2,4\n2024-01-04 00:00,8,5\n"}
    result = same_text("""
        import numpy as np
        import pandas as pd
        v = pd.read_csv("v.csv", parse_dates=["day"])
        print(v.set_index("day").resample("D")["v"].agg(np.std).tolist())
        print(v.set_index("day").resample("D")["n"].agg(np.var).tolist())
        """, tmp_path, files)
    assert "TODO" not in result.converted_text


# -- int results of group windows where a key is missing (E-F01) ----------------------------

KEYS = {"d.csv": "grp,qty\na,1\n,2\na,3\nb,4\n"}


@pytest.mark.parametrize("line", [
    'df["n"] = df.groupby("grp").cumcount()',
    'df["n"] = df.groupby("grp")["qty"].transform("sum")',
    'df["n"] = df.groupby("grp")["qty"].cumsum()',
])
def test_int_window_with_a_missing_key_beside_nullable_ints(line, tmp_path):
    """pandas gives the row of the missing key NaN: the column is float64 (0.0, 1.0), even in
    a script that makes one of pandas' nullable integers elsewhere."""
    same_text(f"""
        import pandas as pd
        df = pd.read_csv("d.csv")
        df["q"] = df["qty"].astype("Int64")
        {line}
        df.to_csv("out.csv", index=False)
        """, tmp_path, KEYS)


@pytest.mark.parametrize("line", [
    'df["n"] = df.groupby("grp").cumcount()',
    'df["n"] = df.groupby("grp")["qty"].transform("count")',
])
def test_int_window_rows_of_a_missing_key_dropped_stay_float(line, tmp_path):
    """After dropna pandas still writes 0.0 (the column was made float64 by the missing key):
    the conversion makes the column Float64 where it is computed, when a key is missing."""
    same_text(f"""
        import pandas as pd
        df = pd.read_csv("d.csv")
        {line}
        df = df.dropna()
        df.to_csv("out.csv", index=False)
        """, tmp_path, KEYS)


# -- int columns pandas keeps int (E-F10, E-F16, E-F17) ------------------------------------

FISH = {"d.csv": "tank,fish,n\nT1,3,1\nT2,-1,5\nT1,4,2\nT2,2,3\n"}


@pytest.mark.parametrize("line", [
    'df["prev"] = df["fish"].shift(1, fill_value=0.5)',
    'df["prev"] = df["fish"].shift(1, fill_value=2.0)',
    'df["prev"] = df["fish"].shift(-1, fill_value=0)',
    'df["prev"] = df.groupby("tank")["fish"].shift(1, fill_value=0.5)',
    'df["prev"] = df.groupby("tank")["fish"].shift(1, fill_value=2.0)',
    'df["prev"] = df["fish"].interpolate()',
    'df["prev"] = df["fish"].shift(1).interpolate()',
    'df["prev"] = df.groupby("tank")["n"].transform(lambda s: s.max() if s.max() > 1 else 0.5)',
    'df["prev"] = df["n"]; print(df.groupby("tank")["n"].agg(lambda s: s.max() if s.max() > 1 else 0.5).tolist())',
])
def test_int_column_kept_int(line, tmp_path):
    """An int column shifted in with a whole fill (2.0), interpolated without a missing value,
    or given a float branch no group takes stays int64 in pandas (written 2, not 2.0); a
    fraction (0.5) makes it float64. The frame then goes to pandas (a group's running median,
    which porter does not port), which keeps the column's type as porter states it."""
    same_text(f"""
        import pandas as pd
        df = pd.read_csv("d.csv")
        {line}
        df["run_med"] = df.groupby("tank")["n"].expanding().median().reset_index(level=0, drop=True)
        df.to_csv("o.csv", index=False)
        print(df["prev"].tolist())
        """, tmp_path, FISH)


# -- the median of an even count: (a + b) / 2, as pandas ------------------------------------

KG = {"d.csv": "hive,kg,n\nN,0.7,1\nN,0.1,2\nS,0.5,4\nS,,7\nN,,3\nS,1e16,5\nS,1,6\n"}


@pytest.mark.parametrize("line", [
    'print(df["kg"].head(2).median(), df["n"].median(), df["kg"].median())',
    'print(df.groupby("hive")["kg"].median().tolist(), df.groupby("hive")["n"].median().tolist())',
    'print(df.groupby("hive")["kg"].transform("median").tolist())',
    'print(df.groupby("hive").agg(m=("kg", "median")).values.tolist())',
    'print(df["kg"].rolling(2).median().tolist(), df["kg"].rolling(4, min_periods=1).median().tolist())',
    'print(df["kg"].rolling(3, center=True, min_periods=2).median().tolist())',
    'print(df.pivot_table(index="hive", columns="n", values="kg", aggfunc="median").values.tolist())',
])
def test_median_of_an_even_count(line, tmp_path):
    """pandas gives (0.7 + 0.1) / 2 = 0.39999999999999997 and (1e16 + 1) / 2 = 5e15, where
    Polars' median gives 0.4 and 5000000000000001.0."""
    same_text(f"""
        import pandas as pd
        df = pd.read_csv("d.csv")
        {line}
        """, tmp_path, KG)


# -- a grouped running sum of floats (E-F11) ------------------------------------------------

@pytest.mark.parametrize("line", [
    'df["run"] = df.groupby("stall")["fee"].cumsum()',
    'df["run"] = df.groupby("stall")["fee"].transform("cumsum")',
])
def test_grouped_float_cumsum_is_pandas_compensated_sum(line):
    """pandas' grouped cumsum is Kahan-compensated (ten 0.1s: 1.0, not 0.9999999999999999):
    Polars' rolling sum over the group adds with the same compensation, at full confidence."""
    result = differential(f"""
        import pandas as pd
        df = pd.DataFrame({{"stall": ["pear"] * 10 + ["fig"] * 3, "fee": [0.1] * 10 + [0.7] * 3}})
        {line}
        result = df
        """)
    sites = [s for s in result.sites if s.key.startswith("groupby.")
             and s.key.endswith(("cumsum", "transform"))]
    assert sites and sites[0].confidence == 1.0
