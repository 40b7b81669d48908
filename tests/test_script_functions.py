"""The script's own functions that take or return columns (porter/translate/functions.py).

pandas is the reference implementation: each check runs the script with pandas and its
conversion with Polars and compares the named variables.
"""

from __future__ import annotations

import textwrap

import pytest

from porter.api import convert_source
from support import differential, same_text

# tons has missing values and a NaN-free float; names have stray spaces, case and unicode
CARGO = ("berth,kind,tons,crates,skipper\nA,grain,5.0,3, ada lind\nB,timber,,2,BO ÅSTRÖM\n"
         "A,grain,1.5,1,ada lind \nC,salt,7.25,,\nB,grain,0.5,4,éva  noor\nA,timber,3.0,2,bo åström\n")


@pytest.fixture(autouse=True)
def cargo(tmp_path, monkeypatch):
    (tmp_path / "cargo.csv").write_text(CARGO, encoding="utf-8")
    monkeypatch.chdir(tmp_path)


def both(source: str, *names: str) -> str:
    """The conversion's text, after its values `names` were checked against pandas'."""
    return differential(source, *names).converted_text


def test_a_function_of_a_column_becomes_a_function_of_an_expression():
    text = both('''
        import pandas as pd
        def tidy(s):
            """Names as the harbour office writes them."""
            return s.str.strip().str.title()
        df = pd.read_csv("cargo.csv")
        df["skipper"] = tidy(df["skipper"])
        ''', "df")
    assert "tidy(pl.col(\"skipper\"))" in text
    assert "to_pandas" not in text and "TODO" not in text


def test_an_expression_function_with_names_and_two_columns():
    text = both('''
        import pandas as pd
        def load_per_crate(tons, crates):
            kg = tons * 1000
            return kg / crates
        df = pd.read_csv("cargo.csv")
        df["per_crate"] = load_per_crate(df["tons"], df["crates"])
        heavy = df[df["crates"] > 1]
        heavy = heavy.assign(per_crate=load_per_crate(heavy["tons"], heavy["crates"]))
        ''', "df", "heavy")
    assert "to_pandas" not in text and "TODO" not in text


def test_columns_of_two_frames_keep_the_function_on_pandas():
    # pandas aligns the two Series on their labels: no single Polars frame holds both
    text = both('''
        import pandas as pd
        def ratio(a, b):
            return a / b
        df = pd.read_csv("cargo.csv")
        first = pd.read_csv("cargo.csv").head(3)
        r = ratio(df["tons"], first["crates"])
        ''', "r")
    assert "def ratio(a, b):\n    return a / b" in text


def test_a_function_that_reduces_its_column_is_not_an_expression():
    text = both('''
        import pandas as pd
        def centred(s):
            m = s.mean()
            return s - m
        df = pd.read_csv("cargo.csv")
        df["centred"] = centred(df["tons"])
        total = centred(df["crates"]).sum()
        ''', "df", "total")
    assert "_porter_caller_rows_" not in text


def test_a_function_also_called_with_a_plain_list_stays_as_it_was():
    both('''
        import pandas as pd
        def doubled(s):
            return s * 2
        df = pd.read_csv("cargo.csv")
        df["twice"] = doubled(df["crates"])
        listed = doubled([1, 2])
        ''', "df", "listed")


def test_a_column_returned_from_a_frame_parameter_is_evaluated_in_the_callers_frame():
    # the function once returned `pl.col("crates") * 2` to a caller that printed its sum:
    # the expression's text, not the number
    text = both('''
        import pandas as pd
        def doubled_crates(frame):
            return frame["crates"] * 2
        df = pd.read_csv("cargo.csv")
        total = doubled_crates(df).sum()
        df["twice"] = doubled_crates(df)
        ''', "total", "df")
    assert "TODO" not in text


def test_a_column_of_other_rows_is_returned_as_a_pandas_series():
    # the rows are a filter of the parameter's: the caller gets the Series pandas would
    text = both('''
        import pandas as pd
        def heavy_tons(frame):
            heavy = frame[frame["tons"] > 1]
            return heavy["tons"]
        df = pd.read_csv("cargo.csv")
        total = heavy_tons(df).sum()
        count = len(heavy_tons(df))
        ''', "total", "count")
    assert "return pl.col" not in text


def test_a_frame_given_to_unknown_code_after_a_filter_is_made_by_pandas():
    # the unknown code may read the labels (a plot's x axis): pandas makes `heavy`, so they are
    # the original row numbers; the unfiltered frame is handed over as it is
    result = convert_source(textwrap.dedent('''
        import pandas as pd
        import matplotlib_like
        df = pd.read_csv("cargo.csv")
        heavy = df[df["tons"] > 1]
        matplotlib_like.plot(heavy["tons"])
        matplotlib_like.plot(df["tons"])
        '''))
    assert [s.line for s in result.sites if s.key == "frame.labels"] == [5]
    assert "df = df.collect().to_pandas()\n" in result.converted_text
    assert "heavy = df[df[\"tons\"] > 1]" in result.converted_text
    assert not any("renumbered" in s.message for s in result.sites)


def test_two_calls_of_one_loader_are_two_frames(tmp_path):
    # both calls once returned frames with the same rows, so b["x"] was taken for a's own
    # column: a["d"] = pl.col("x") copied a's values
    (tmp_path / "later.csv").write_text(CARGO.replace("5.0", "50.0").replace("7.25", "72.5"),
                                        encoding="utf-8")
    both('''
        import pandas as pd
        def load(path):
            return pd.read_csv(path)
        first = load("cargo.csv")
        later = load("later.csv")
        first["later_tons"] = later["tons"]
        ''', "first")


def test_counting_the_rows_of_loaded_files_reads_no_columns():
    # a loader's frames hold a file's rows: counting them is not a reason to keep them
    text = both('''
        import pandas as pd
        def load(path, tag):
            sheet = pd.read_csv(path)
            return sheet.assign(tag=tag)
        both_halves = pd.concat([load("cargo.csv", "a"), load("cargo.csv", "b")], ignore_index=True)
        n = len(both_halves)
        heavy = both_halves[both_halves["tons"] > 1]
        ''', "n", "heavy")
    assert "both_halves = pl.concat" in text and ".collect().lazy()" not in text, text


def test_calls_that_read_the_labels_of_a_sorted_frame_see_pandas_labels():
    # reset_index() and idxmax() of a sorted frame once read positions 0..n-1
    both('''
        import pandas as pd
        df = pd.read_csv("cargo.csv")
        by_tons = df.sort_values("tons", ascending=False)
        numbered = by_tons.reset_index()
        heaviest = by_tons["tons"].idxmax()
        kept = df[df["crates"] > 1]
        in_file_order = kept.sort_index()
        ''', "numbered", "heaviest", "in_file_order")


def test_a_column_helper_called_on_two_columns_is_ported():
    # the first pass, before the helper was known, handed the frame to pandas at its first
    # call, so the second call passed a pandas Series: that call no longer stops the learning
    text = both('''
        import pandas as pd
        def tidy(s):
            return s.str.strip().str.lower()
        df = pd.read_csv("cargo.csv")
        df["berth"] = tidy(df["berth"])
        df["skipper"] = tidy(df["skipper"])
        result = df
        ''', "result")
    assert "TODO(porter)" not in text, text
    assert 'tidy(pl.col("skipper"))' in text


# -- functions that read or change the module's frames (not given as parameters) ----------------

SALES = {"t.csv": "k,v,n\na,1.5,1\nb,,2\nc,-2,\nd,4,4\n", "r.csv": "k,rate\na,0.5\nb,2\n"}


def test_a_helper_that_changes_a_module_frame_defined_after_it(tmp_path):
    result = same_text("""
        import pandas as pd
        def add_tax():
            sales["tax"] = sales["v"] * 0.2
        sales = pd.read_csv("t.csv")
        add_tax()
        sales["w"] = sales["tax"] + 1
        sales.to_csv("o.csv", index=False)
        """, tmp_path, SALES)
    assert "function.module_frame" in result.converted_text


def test_a_lookup_helper_applied_to_a_column_reads_a_module_frame(tmp_path):
    same_text("""
        import pandas as pd
        rates = pd.read_csv("r.csv")
        def rate_for(k):
            hit = rates.loc[rates["k"] == k, "rate"]
            return hit.iloc[0] if len(hit) else 1.0
        df = pd.read_csv("t.csv")
        df["r"] = df["k"].apply(rate_for)
        df.to_csv("o.csv", index=False)
        """, tmp_path, SALES)


def test_a_progress_helper_reads_the_frame_as_it_is_at_each_call(tmp_path):
    same_text("""
        import pandas as pd
        def report(label):
            print(f"{label}: rows={len(df)} total={df['v'].sum():.2f}")
        df = pd.read_csv("t.csv")
        report("raw")
        df = df[df["v"].notna()]
        report("no-nan")
        df["v2"] = df["v"] * 2
        df.to_csv("o.csv", index=False)
        """, tmp_path, SALES)


def test_a_helper_of_a_frame_later_rebound_and_sorted(tmp_path):
    same_text("""
        import pandas as pd
        df = pd.read_csv("t.csv")
        def pos_total():
            return df.loc[df["v"] > 0, "v"].sum()
        print(pos_total())
        df["w"] = df["v"].fillna(10)
        df = df.sort_values("w")
        df.to_csv("o.csv")
        print(pos_total())
        """, tmp_path, SALES)


def test_step_functions_that_bind_a_global_frame(tmp_path):
    result = same_text("""
        import pandas as pd
        df = None
        def load():
            global df
            df = pd.read_csv("t.csv")
            df["v"] = df["v"].fillna(0)
        def enrich():
            global df
            df = df[df["v"] >= 0]
            df["w"] = df["v"] * 2
        load()
        enrich()
        print(len(df))
        df.to_csv("o.csv", index=False)
        """, tmp_path, SALES)
    assert "TODO(porter): function.module_frame" in result.converted_text


def test_a_module_frame_read_by_a_helper_given_a_frame(tmp_path):
    same_text("""
        import pandas as pd
        rates = pd.read_csv("r.csv")
        def with_rates(frame):
            return frame.merge(rates, on="k", how="left")
        df = with_rates(pd.read_csv("t.csv"))
        df.to_csv("o.csv", index=False)
        """, tmp_path, SALES)


def test_helpers_reading_one_module_frame_defined_before_and_after_them(tmp_path):
    # report() is defined before df, total() after it: df goes to pandas before main() for
    # report, and total must not meet it as a Polars frame
    same_text("""
        import pandas as pd
        def report(label):
            print(label, len(df), round(df["v"].sum(), 2))
        df = pd.read_csv("t.csv")
        def main():
            report("start")
            print(df[df["v"] > 0].shape)
        def total(frame):
            return frame["v"].sum() + len(df)
        if __name__ == "__main__":
            main()
            print(total(df))
            for i in range(2):
                report(f"loop {i}")
        """, tmp_path, SALES)


# -- a function called from a statement kept on pandas ---------------------------------------

KILN = {"firings.csv": "kiln,cone,hours\nwest,6,4\neast,10,2\nnorth,8,\nsouth,4,3\n"}


@pytest.mark.parametrize("body", [
    'd.sort_values("cone")["cone"].cumsum()',
    'd["cone"].sort_values(ascending=False)',
    'd[d["cone"] > 5]["hours"] * 2',
    'd.dropna()["cone"]',
    'd["cone"].nlargest(2)',
])
def test_a_helper_called_where_pandas_aligns_its_series_stays_pandas(tmp_path, body):
    # pandas puts the helper's Series in by its row labels (the statement stays pandas): its
    # body, ported for a Polars frame, was called with the pandas frame (AttributeError), and
    # its collected Series would have been numbered 0..n-1 again
    same_text(f"""
        import pandas as pd
        df = pd.read_csv("firings.csv")
        def helper(d):
            return {body}
        df["z"] = helper(df)
        print(df["z"].tolist())
        df.to_csv("o.csv", index=False)
        """, tmp_path, KILN)


@pytest.mark.parametrize("use", ['s = helper(df)\ndf["z"] = s\nprint(df["z"].tolist())',
                                 'print(helper(df))'])
def test_a_helpers_sorted_series_keeps_pandas_labels(tmp_path, use):
    # the Series a helper returns after a sort carries the original row numbers, which
    # pandas aligns on and prints
    same_text("""
        import pandas as pd
        df = pd.read_csv("firings.csv")
        def helper(d):
            return d.sort_values("cone")["hours"]
""" + textwrap.indent(use, " " * 8) + "\n",
              tmp_path, KILN)


def test_a_helper_of_the_frames_own_rows_is_still_ported(tmp_path):
    result = same_text("""
        import pandas as pd
        df = pd.read_csv("firings.csv")
        def helper(d):
            return d["cone"] * 2
        df["z"] = helper(df)
        df.to_csv("o.csv", index=False)
        """, tmp_path, KILN)
    assert "TODO" not in result.converted_text


def test_a_function_of_a_column_called_from_a_statement_kept_on_pandas(tmp_path):
    # the where() is pandas' (a Series pandas aligns): tidy gets pandas' Series there, so it
    # is not made a function of Polars expressions
    same_text("""
        import pandas as pd
        df = pd.read_csv("firings.csv")
        def tidy(s):
            return s.str.upper()
        df["m"] = tidy(df["kiln"]).where(df["cone"] > 5, "low")
        df["n"] = tidy(df["kiln"])
        print(df["m"].tolist())
        df.to_csv("o.csv", index=False)
        """, tmp_path, KILN)


def test_a_helper_called_inside_a_try_kept_on_pandas(tmp_path):
    # the `try` stays pandas, its frames handed over: helper is given the pandas frame there
    same_text("""
        import pandas as pd
        df = pd.read_csv("firings.csv")
        def helper(d):
            return d["cone"] * 2
        df["y"] = helper(df)
        try:
            df["z"] = helper(df) + pd.to_numeric("1")
        except KeyError:
            pass
        print(df["z"].tolist())
        df.to_csv("o.csv", index=False)
        """, tmp_path, KILN)
