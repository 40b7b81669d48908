"""Statements and element functions that crashed or changed a column's type.

Every check runs the script with pandas (the reference) and its conversion with Polars, each
in a folder of its own, and compares what they print and the files they write (same_text), or
compares the values (differential).
"""

from __future__ import annotations

from pathlib import Path

from support import same_text


FRAMES = "hive,frames,k\nH1,10,3\nH2,3,-2\nH3,12,5\n"
MIXED = "k,a,b\nx,1,2.5\ny,3,\nz,-2,4.0\n"


# -- E-F12: augmented assignment with every operator --------------------------------------

def test_floor_division_and_remainder_in_place(tmp_path: Path) -> None:
    # pandas writes frames = 3, 1, 4; `df["frames"] //= 3` was left as written on the
    # LazyFrame (TypeError: LazyFrame is not subscriptable)
    same_text("""
        import pandas as pd
        df = pd.read_csv("d.csv")
        df["frames"] //= 3
        df["k"] %= 4
        df.to_csv("o.csv", index=False)
        print(df.to_string())
    """, tmp_path, {"d.csv": FRAMES})


def test_power_and_bit_operators_in_place(tmp_path: Path) -> None:
    same_text("""
        import pandas as pd
        df = pd.read_csv("d.csv")
        df["k"] **= 2
        df["a"] = df["frames"]
        df["a"] |= 8
        df["b"] = df["frames"] > 5
        df["b"] &= df["k"] > 5
        df["f"] = df["frames"] * 1.5
        df["f"] //= 2
        df["f"] **= 0.5
        df.to_csv("o.csv", index=False)
        print(df.to_string())
    """, tmp_path, {"d.csv": FRAMES})


def test_floor_division_of_selected_rows_in_place(tmp_path: Path) -> None:
    # pandas writes frames = 3, 3, 4; `df.loc[...] //= 3` was left as written
    # (AttributeError: 'LazyFrame' object has no attribute 'loc')
    same_text("""
        import pandas as pd
        df = pd.read_csv("d.csv")
        df.loc[df["frames"] >= 10, "frames"] //= 3
        df.loc[df["k"] > 0, "k"] %= 2
        df.to_csv("o.csv", index=False)
        print(df.to_string())
    """, tmp_path, {"d.csv": FRAMES})


# -- E-F13: several columns set in one statement ------------------------------------------

def test_tuple_assignment_of_two_columns(tmp_path: Path) -> None:
    # pandas writes lo/hi = 9/11, 2/4, 11/13; the statement was left as written
    same_text("""
        import pandas as pd
        df = pd.read_csv("d.csv")
        df["lo"], df["hi"] = df["frames"] - 1, df["frames"] + 1
        df.to_csv("o.csv", index=False)
        print(df.to_string())
    """, tmp_path, {"d.csv": FRAMES})


def test_tuple_assignment_computes_every_value_first(tmp_path: Path) -> None:
    # Python computes the values before it sets a column: the swap exchanges a and b; a
    # name set twice keeps the last value
    same_text("""
        import pandas as pd
        df = pd.read_csv("d.csv")
        df["a"], df["b"] = df["b"], df["a"]
        df["c"], df["c"] = 1, df["a"] * 2
        [df["d"], df["e"]] = [df["k"].str.upper(), df["a"].mean()]
        df.to_csv("o.csv", index=False)
        print(df.to_string())
    """, tmp_path, {"d.csv": MIXED})


def test_chained_assignment_of_two_columns(tmp_path: Path) -> None:
    # `df["seen"] = df["ok"] = 0` was left as written ('LazyFrame' object does not support
    # item assignment)
    same_text("""
        import pandas as pd
        df = pd.read_csv("d.csv")
        df["seen"] = df["ok"] = 0
        df["a"] = df["s"] = df["a"] * 2
        df.to_csv("o.csv", index=False)
        print(df.to_string())
    """, tmp_path, {"d.csv": MIXED})


def test_columns_set_beside_other_targets_stay_pandas(tmp_path: Path) -> None:
    # a column among other targets (a name, another frame, a loc selection): the frame is
    # handed to pandas first, never pandas code on a LazyFrame
    same_text("""
        import pandas as pd
        df = pd.read_csv("d.csv")
        other = df.copy()
        x, df["n"] = 5, df["a"] + 1
        df["p"], other["q"] = 1, 2
        df.loc[df["a"] > 0, "a"], df["r"] = 0, 7
        y = df["u"] = 3
        df.to_csv("o.csv", index=False)
        print(df.to_string(), other.to_string(), x, y)
    """, tmp_path, {"d.csv": MIXED})


def test_assign_takes_series_computed_before_the_call(tmp_path: Path) -> None:
    # assign(a=df["b"], b=df["a"]) swaps in pandas (the Series are computed before the call);
    # the conversion read the new a for b. A lambda sees the columns made before it.
    same_text("""
        import pandas as pd
        df = pd.read_csv("d.csv")
        out = df.assign(a=df["b"], b=df["a"])
        out2 = df.assign(a=lambda d: d["b"] * 10, c=df["a"], e=lambda d: d["a"] + 1)
        out.to_csv("o.csv", index=False)
        print(out.to_string())
        print(out2.to_string())
    """, tmp_path, {"d.csv": "k,a,b\nx,1,2\ny,3,4\n"})


# -- E-F25, E-F26, E-F27: Python's power of each value ------------------------------------

POWERS = "k,i,f,j\nA,4,2.5,2\nB,-8,-1.5,3\nC,5,,0\n"


def test_whole_number_to_a_negative_power_in_a_lambda(tmp_path: Path) -> None:
    # Python's 4 ** -1 is 0.25 (pandas writes 0.25, -0.125, 0.2); Polars refused the negative
    # integer exponent (InvalidOperationError); 2 ** x and r["i"] ** r["j"] give an int or a
    # float by the exponent's sign
    same_text("""
        import pandas as pd
        df = pd.read_csv("d.csv")
        df["a"] = df["i"].map(lambda x: x ** -1)
        df["b"] = df["f"].map(lambda x: x ** -2)
        df["c"] = df["i"].map(lambda x: x ** 2)
        df["e"] = df["i"].map(lambda x: 2 ** x)
        df["g"] = df.apply(lambda r: r["i"] ** r["j"], axis=1)
        df.to_csv("o.csv", index=False)
        print(df.to_string())
    """, tmp_path, {"d.csv": POWERS})


def test_whole_numbers_to_a_large_power_in_a_lambda(tmp_path: Path) -> None:
    # Python's 10 ** 20 is exact (pandas writes 100000000000000000000, an object column);
    # Polars' Int64 wrapped around to 7766279631452241920
    same_text("""
        import pandas as pd
        df = pd.read_csv("d.csv")
        df["big"] = df["n"].map(lambda x: x ** 20)
        df["n"] = df["n"] + 1
        df.to_csv("o.csv", index=False)
        print(df["big"].tolist())
    """, tmp_path, {"d.csv": "cell,n\nA,10\nB,3\n"})


def test_negative_number_to_a_fraction_in_a_lambda(tmp_path: Path) -> None:
    # Python's (-2.25) ** 0.5 is a complex number (pandas writes (9.18e-17+1.5j)); the
    # conversion wrote a missing value
    same_text("""
        import pandas as pd
        df = pd.read_csv("d.csv")
        df["root"] = df["depth"].map(lambda x: x ** 0.5)
        df.to_csv("o.csv", index=False)
        print(df["root"].tolist())
    """, tmp_path, {"d.csv": "well,depth\nW1,4.0\nW2,-2.25\n"})


# -- E-F29: float(s) and int(s) of text in a lambda ---------------------------------------

def test_python_float_and_int_of_text_in_a_lambda(tmp_path: Path) -> None:
    # Python's float(" 1.5") is 1.5 and float("1_000") 1000.0 (int(" 3") is 3); the strict
    # cast refused them (InvalidOperationError)
    same_text("""
        import pandas as pd
        df = pd.read_csv("d.csv", dtype={"kg": str, "n": str})
        df["w"] = df["kg"].map(lambda s: float(s))
        df["i"] = df["n"].map(lambda s: int(s) + 1)
        df["nan"] = df["kg"].map(lambda s: float(s) if s.strip() != "2" else float("nan"))
        df.to_csv("o.csv", index=False)
        print(df.to_string(), df["w"].sum(), df["nan"].isna().sum())
    """, tmp_path, {"d.csv": 'sack,kg,n\nS1," 1.5"," 3"\nS2,1_000,1_0\nS3,2,-4\n'})


# -- E-F03: an f-string that formats each value, in a branch ------------------------------

def test_fstring_with_a_format_spec_in_a_branch(tmp_path: Path) -> None:
    # pandas writes 007, 012, -; the f-string was kept as written and formatted the whole
    # collected Series once (TypeError: unsupported format string passed to Series.__format__)
    same_text("""
        import pandas as pd
        def tag(x):
            if x > 5:
                return f"{x:03d}"
            return "-"
        df = pd.read_csv("d.csv")
        df["tag"] = df["n"].map(lambda x: f"{x:03d}" if x > 5 else "-")
        df["t"] = df["n"].apply(tag)
        df["r"] = df["s"].map(lambda s: f"<{s!r}>" if s != "B" else "-")
        df["row"] = df.apply(lambda r: f"{r['bin']}{r['n']:>3}" if r["n"] > 5 else r["bin"], axis=1)
        df.to_csv("o.csv", index=False)
        print(df.to_string())
    """, tmp_path, {"d.csv": "bin,n,s\nA,7,ab\nB,12,cd\nC,3,B\n"})
