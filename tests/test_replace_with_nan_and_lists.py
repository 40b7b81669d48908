"""Series.replace with NaN as the new value, and with a list of values to replace.

- s.replace("", np.nan) on a text column (a very common clean-up) is a missing value of the
  text column in pandas 3 (str stays str); porter took NaN for a number beside text and
  handed the frame over to pandas.
- s.replace([np.inf, -np.inf], np.nan) on a float column is float64 with NaN in pandas; porter
  read the list as one value of another type and handed the frame over.
- s.replace(["a", "b"], "z") replaces each listed value.

pandas is the reference implementation: each check runs the script with pandas and its
conversion with Polars and compares what they print and write.
"""

from __future__ import annotations

from pathlib import Path

from support import convert, same_text

DATA = {"r.csv": "k,v,n\na,1.5,1\n,inf,2\nb,-inf,\nc,0,4\n,2.5,5\nA,,6\nb,2.5,0\n"}


def test_empty_text_replaced_with_nan(tmp_path: Path) -> None:
    same_text("""
        import pandas as pd
        import numpy as np
        df = pd.read_csv("r.csv")
        df["k1"] = df["k"].fillna("").replace("", np.nan)
        df["k4"] = df["k"].fillna("").replace({"": np.nan, "c": "C"})
        df["k5"] = df["k"].fillna("-").replace("-", pd.NA)
        print(df["k1"].isna().sum(), df["k4"].count(), df["k5"].tolist())
        print(df["k1"].fillna("none").tolist(), df["k1"].value_counts(dropna=False).to_dict())
        df.to_csv("o.csv", index=False)
        """, tmp_path, DATA)


def test_infinities_replaced_with_nan(tmp_path: Path) -> None:
    same_text("""
        import pandas as pd
        import numpy as np
        df = pd.read_csv("r.csv")
        df["r"] = df["v"] / df["n"]
        df["v1"] = df["v"].replace([np.inf, -np.inf], np.nan)
        df["r1"] = df["r"].replace([np.inf, -np.inf], np.nan).round(2)
        df["v2"] = df["v"].replace(np.inf, np.nan)
        print(df["v1"].isna().sum(), df["r1"].mean(), df["v2"].count(), df["r1"].fillna(-1).tolist())
        df.to_csv("o.csv", index=False)
        """, tmp_path, DATA)


def test_lists_of_values_to_replace(tmp_path: Path) -> None:
    same_text("""
        import pandas as pd
        import numpy as np
        df = pd.read_csv("r.csv")
        df["k2"] = df["k"].replace(["a", "b"], "z")
        df["k3"] = df["k"].replace(["a", "b"], np.nan)
        df["k6"] = df["k"].replace(["a", "c"], ["x", "y"])
        df["n2"] = df["n"].fillna(0).astype(int).replace([0, 1], 9)
        df["n3"] = df["n"].replace([1.0, 2.0], [10.0, 20.0])
        print(df["k3"].isna().sum(), df["k2"].tolist(), df["n2"].tolist(), df["n3"].tolist())
        df.to_csv("o.csv", index=False)
        """, tmp_path, DATA)


def test_the_clean_up_stays_polars(tmp_path: Path) -> None:
    (tmp_path / "r.csv").write_text(DATA["r.csv"], encoding="utf-8")
    result = convert("""
        import pandas as pd
        import numpy as np
        df = pd.read_csv("r.csv")
        df["k"] = df["k"].replace("", np.nan)
        df["v"] = df["v"].replace([np.inf, -np.inf], np.nan)
        """, data_dir=str(tmp_path))
    assert "TODO" not in result.converted_text, result.converted_text
    assert "to_pandas" not in result.converted_text, result.converted_text
