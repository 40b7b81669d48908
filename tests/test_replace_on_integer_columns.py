"""series.replace on an integer column whose result type pandas picks from the data: the
conversion keeps those calls on pandas, and what the script prints and writes is pandas' own.

pandas is the reference: each check runs the script with pandas and as converted and compares
the text printed and the files written.
"""

from __future__ import annotations

import pytest

from support import same_text

BELLS = {"d.csv": "bell,strikes\nB1,12\nB2,0\nB3,7\n"}


@pytest.mark.parametrize("step", [
    pytest.param('df["strikes"] = df["strikes"].replace({0: None})', id="a dict"),
    pytest.param('df["strikes"] = df["strikes"].replace(0, None)', id="two values"),
    pytest.param('df["other"] = df["strikes"].replace({0: None})', id="a new column"),
])
def test_none_in_place_of_an_int_is_written_as_pandas_writes_it(step: str, tmp_path) -> None:
    # pandas makes an object column of the ints and None, written 12,,7; the Series put back
    # from pandas into the Polars frame was Int64 with a null, written 12.0,,7.0
    result = same_text(f"""
        import pandas as pd
        df = pd.read_csv("d.csv")
        {step}
        df.to_csv("o.csv", index=False)
        print(df["strikes"].tolist())
    """, tmp_path, BELLS)
    assert result.todos


@pytest.mark.parametrize("data", [
    pytest.param("n,k\n1,a\n2,b\n3,c\n", id="the value absent"),
    pytest.param("n,k\n1,a\n99,b\n3,c\n", id="the value present"),
])
def test_a_fraction_in_place_of_an_int_is_pandas(data: str, tmp_path) -> None:
    # pandas' int64 column stays int64 where 99 is absent (written 1,2,3) and becomes float64
    # where it is found (1.0,1.5,3.0); the conversion cast it to Float64 always
    result = same_text("""
        import pandas as pd
        df = pd.read_csv("d.csv")
        df["r"] = df["n"].replace(99, 1.5)
        df["s"] = df["n"].replace({99: 2.5, 3: 4})
        df.to_csv("o.csv", index=False)
        print(df["r"].tolist(), df["s"].sum())
    """, tmp_path, {"d.csv": data})
    assert result.todos
