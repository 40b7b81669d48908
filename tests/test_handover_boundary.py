"""Hand-overs to pandas and back, checked against pandas itself (the reference implementation).

A statement porter keeps on pandas gets its frame once, and the frame comes back to Polars
(`pl.from_pandas`) at the next statement porter can rewrite whole; a Series computed by pandas
is put back by position only when it was computed row for row from the same rows. Each shape
below is one a real script takes; the data is an invented harbour's cargo log.
"""

from __future__ import annotations

import textwrap
from pathlib import Path

import pytest

from porter.api import convert_source
from support import convert, differential, run


@pytest.fixture(autouse=True)
def cargo(tmp_path, monkeypatch):
    (tmp_path / "cargo.csv").write_text(
        "berth,kind,tons,crates\nA,grain,5.0,3\nB,timber,,2\nA,grain,1.5,1\nC,salt,7.25,\n"
        "B,grain,0.5,4\nA,timber,3.0,2\nC,salt,,1\nÅ,fish,2.0,5\n", encoding="utf-8")
    monkeypatch.chdir(tmp_path)


def both(source: str, *names: str) -> str:
    """The conversion's text, after its values `names` were checked against pandas'."""
    return differential(source, *names).converted_text


def test_a_todo_in_the_middle_of_a_pipeline_does_not_keep_the_rest_on_pandas():
    text = both("""
        import pandas as pd
        df = pd.read_csv("cargo.csv")
        df = df[df["tons"].notna()]
        df.insert(1, "port", "Sandvik")
        df["heavy"] = df["tons"] > 2
        totals = df.groupby("kind")["crates"].sum().reset_index()
        first = df.head(3)
    """, "totals", "first", "df")
    assert "pl.from_pandas(df).lazy()" in text
    assert "group_by" in text


def test_a_row_function_after_a_filter_is_put_back_on_its_rows():
    both("""
        import pandas as pd
        def label(row):
            for part in (row["berth"], row["kind"]):  # a loop: kept on pandas
                return f"{part}-{row['kind']}"
        df = pd.read_csv("cargo.csv")
        df = df[df["crates"] > 1]
        df["label"] = df.apply(label, axis=1)
        df["tons2"] = df["tons"] * 2
        result = df
    """, "result")


def test_a_row_function_after_a_sort_is_put_back_on_its_rows():
    text = both("""
        import pandas as pd
        def label(row):
            text = ""
            for part in (row["berth"], row["kind"]):  # a loop: kept on pandas
                text += part
            return text
        df = pd.read_csv("cargo.csv")
        df = df.sort_values("tons", kind="stable")
        df["label"] = df.apply(label, axis=1)
        result = df.reset_index(drop=True)
    """, "result")
    assert "pl.Series(" in text


def test_a_series_computed_by_a_pandas_groupby_is_put_back():
    both("""
        import pandas as pd
        df = pd.read_csv("cargo.csv")
        df["share"] = df.groupby("berth")["tons"].transform(lambda s: s / s.sum())
        result = df
    """, "result")


def test_a_masked_augmented_assignment_aligns_like_pandas():
    text = both("""
        import pandas as pd
        df = pd.read_csv("cargo.csv")
        df = df[df["crates"] > 1]
        mask = df["kind"] == "grain"
        df.loc[mask, "tons"] += df["crates"] * 3.0
        result = df
    """, "result")
    assert "pl.Series(" not in text


def test_ordered_bands_keep_their_order_after_a_hand_over():
    both("""
        import pandas as pd
        df = pd.read_csv("cargo.csv")
        df["band"] = pd.cut(df["tons"], [0, 2, 5, 10], labels=["small", "medium", "large"])
        df.insert(0, "port", "Sandvik")
        result = df.sort_values("band", kind="stable")
    """, "result")


def test_list_values_cross_the_boundary_as_lists():
    both("""
        import pandas as pd
        df = pd.read_csv("cargo.csv")
        df["parts"] = df["kind"].str.split("i")
        df.insert(0, "port", "Sandvik")
        result = df.explode("parts")
    """, "result")


def test_a_frame_kept_on_pandas_by_a_loop_comes_back_after_it():
    text = both("""
        import pandas as pd
        df = pd.read_csv("cargo.csv")
        for i in range(3):
            df.at[i, "tons"] = i * 10.0
        df["double"] = df["tons"] * 2
        totals = df.groupby("berth")["double"].sum().reset_index()
    """, "totals", "df")
    lines = text.splitlines()
    loop = next(i for i, line in enumerate(lines) if line.startswith("for i"))
    assert lines[loop - 1] == "df = df.collect().to_pandas()"
    assert "df = pl.from_pandas(df).lazy()" in lines[loop + 2:]


def test_a_loop_that_hands_over_and_back_in_each_turn_stays_consistent():
    both("""
        import pandas as pd
        df = pd.read_csv("cargo.csv")
        for step in range(2):
            df.insert(0, f"step{step}", step)
            df["tons"] = df["tons"] * 2
        result = df
    """, "result")


@pytest.mark.parametrize("flag", ["True", "False"])
def test_a_frame_handed_over_in_one_branch_is_pandas_after_either(flag):
    # the branch that kept the frame in Polars hands it over too: the code after the `if`
    # ran on a LazyFrame when the other branch was taken (`df["z"] = ...` failed)
    text = both(f"""
        import pandas as pd
        df = pd.read_csv("cargo.csv")
        flag = {flag}
        if flag:
            df.insert(0, "port", "Sandvik")
        else:
            df["double"] = df["tons"] * 2
        df["z"] = df["crates"] + 1
        result = df
    """, "result")
    assert text.count("df = df.collect().to_pandas()") == 2


def test_a_frame_handed_over_in_an_elif_chain_is_checked_after_it():
    for flag in ("1", "2", "3"):
        both(f"""
            import pandas as pd
            df = pd.read_csv("cargo.csv")
            flag = {flag}
            if flag == 1:
                df.insert(0, "port", "Sandvik")
            elif flag == 2:
                df["double"] = df["tons"] * 2
            df["z"] = df["crates"] + 1
            result = df
        """, "result")


def test_a_column_given_to_the_scripts_own_function_is_assigned_by_pandas():
    # the function returns a Series: pandas aligns it on the index, pl.lit cannot hold it
    text = both('''
        import pandas as pd
        def tidy(s):
            return s.str.strip().str.title()
        df = pd.read_csv("cargo.csv")
        df["kind"] = tidy(df["kind"])
        df = df[df["crates"] > 1]
        ''', "df")
    assert "pl.lit(tidy" not in text


def test_a_frame_pandas_made_with_fresh_labels_comes_back_to_polars():
    # groupby.apply stays on pandas; its reset_index() result is labelled 0..n-1, so the
    # merge, arithmetic and sort after it run in Polars again
    text = both('''
        import pandas as pd
        def summary(g):
            return pd.Series({"tons": g["tons"].sum(), "loads": len(g)})
        df = pd.read_csv("cargo.csv")
        per_berth = df.groupby("berth").apply(summary).reset_index()
        sizes = pd.DataFrame({"berth": ["A", "B", "C"], "cranes": [2, 1, 0]})
        per_berth = per_berth.merge(sizes, on="berth", how="left")
        per_berth["per_crane"] = per_berth["tons"] / per_berth["cranes"]
        per_berth = per_berth.sort_values(["per_crane", "berth"], ascending=[False, True])
        ''', "per_berth")
    assert "pl.from_pandas(per_berth)" in text
    assert ".sort(" in text


def test_a_frame_pandas_made_stays_pandas_where_categories_may_be_about():
    # a category column sorts by its categories in pandas; porter does not know the columns of
    # a frame pandas made, so it cannot bring the categories back as an Enum
    source = textwrap.dedent('''
        import pandas as pd
        df = pd.read_csv("cargo.csv")
        df["kind"] = df["kind"].astype("category")
        counts = df.groupby("berth").apply(len).reset_index()
        counts = counts.sort_values("berth")
        ''')
    assert "pl.from_pandas(counts)" not in convert_source(source).converted_text


def test_category_columns_keep_pandas_category_order_when_handed_over():
    # a Polars Categorical reaches pandas with its categories in the order Polars met them;
    # astype("category") sorts them, and pandas sorts the column by its categories
    both('''
        import pandas as pd
        df = pd.read_csv("cargo.csv")
        df["kind"] = df["kind"].astype("category")
        counts = df.groupby("kind", observed=True).apply(len).reset_index()
        counts = counts.sort_values("kind")
        ''', "counts")


def test_a_category_series_keeps_pandas_category_order_when_handed_over():
    both('''
        import pandas as pd
        df = pd.read_csv("cargo.csv")
        kinds = df["kind"].astype("category")
        order = kinds.cat.categories.tolist()
        ''', "order")


def test_cut_labels_keep_their_order_beside_a_category_when_handed_over():
    both('''
        import pandas as pd
        df = pd.read_csv("cargo.csv")
        df["kind"] = df["kind"].astype("category")
        df["size"] = pd.cut(df["tons"], bins=[0, 2, 5, 10], labels=["small", "mid", "big"])
        counts = df.groupby(["size", "kind"], observed=True).apply(len).reset_index()
        counts = counts.sort_values(["size", "kind"])
        ''', "counts")


def test_columns_made_while_the_frame_is_on_pandas_come_back_with_it():
    # three statements on the handed-over frame each add a column (str.partition's frame is
    # computed by pandas, whose labels porter does not keep); the frame (whose columns
    # porter knows) comes back to Polars with all three, so `df.code` after the filter is a
    # column, not an unknown attribute
    text = both('''
        import pandas as pd
        df = pd.DataFrame({"kind": ["grain", "timber", "salt", "ö"], "tons": [5.0, None, 7.25, 2.0]})
        parts = df["kind"].str.partition("a")
        df["first"] = parts[0]
        df["second"] = parts[1].str.upper()
        df["code"] = parts[2].str.len()
        df = df[df["tons"].notna()]
        short = df[df.code < 4]
        ''', "short")
    assert "pl.from_pandas(df)" in text
    assert "TODO(porter): frame.getattr" not in text


def test_a_loop_over_a_column_reads_pandas_values():
    # `for x in df["c"]` had become `for x in pl.col("c")`, which Polars cannot iterate; a
    # missing value reaches the loop as NaN, as in pandas
    both('''
        import pandas as pd
        df = pd.read_csv("cargo.csv")
        total = 0
        seen = []
        for tons in df["tons"]:
            total += tons
            seen.append(tons)
        ''', "total", "seen")


def test_a_function_that_changes_its_frame_in_place_changes_the_callers(tmp_path):
    # `add_flags(df)` adds a column to the caller's frame; the converted function had rebound
    # its own name, and the column was lost
    text = both('''
        import pandas as pd
        def add_flags(frame, limit=4):
            frame["heavy"] = frame["tons"] > limit
            frame.drop(columns=["crates"], inplace=True)
        df = pd.read_csv("cargo.csv")
        add_flags(df, limit=2)
        df.to_csv("out.csv", index=False)
        ''', "df")
    assert "add_flags(df" in text
    pandas_text = (tmp_path / "out.csv").read_text(encoding="utf-8")
    assert "True" in pandas_text  # the converted script wrote over it, the pandas way


def test_two_names_for_one_frame_changed_in_place_stay_one_frame():
    # `view = df` makes one object in pandas: a column added through view is in df too
    both('''
        import pandas as pd
        df = pd.read_csv("cargo.csv")
        view = df
        view["double"] = view["crates"] * 2
        df.loc[df["tons"] > 4, "kind"] = "heavy"
        ''', "df", "view")


def test_frames_changed_through_a_loop_variable_are_changed():
    # `for frame in [a, b]: frame[...] = ...` changes a and b; the loop had run on copies
    both('''
        import pandas as pd
        a = pd.read_csv("cargo.csv")
        b = pd.read_csv("cargo.csv")
        for frame in [a, b]:
            frame["kg"] = frame["tons"] * 1000
            frame.loc[frame["crates"] > 2, "kind"] = "BIG"
        both_frames = pd.concat([a, b], ignore_index=True)
        ''', "a", "b", "both_frames")


def test_interval_bands_from_pandas_keep_the_frame_on_pandas():
    # pd.cut without labels gives pandas' Interval values, which Polars cannot hold or write
    # (the put-back crashed, and so did writing the frame brought back)
    text = both('''
        import pandas as pd
        df = pd.read_csv("cargo.csv")
        df["band"] = pd.cut(df["tons"], bins=[0, 2, 5, 10])
        df["band3"] = pd.cut(df["crates"], bins=3)
        df = df[df["crates"] > 1]
        df.to_csv("bands.csv", index=False)
        ''', "df")
    assert "pl.from_pandas(df)" not in text


def test_a_function_that_changes_its_frame_and_is_rebound_stays_polars():
    # `df = clean(df)`: the caller's name holds the result, so the change in place is seen
    # through it; the function is ported (no hand-over)
    text = both('''
        import pandas as pd
        def clean(frame):
            frame["kind"] = frame["kind"].str.upper()
            frame.dropna(subset=["tons"], inplace=True)
            return frame
        df = pd.read_csv("cargo.csv")
        df = clean(df)
        other = clean(pd.read_csv("cargo.csv"))
        ''', "df", "other")
    assert "to_pandas" not in text


def test_two_names_for_one_frame_changed_by_a_function_stay_one_frame():
    both('''
        import pandas as pd
        def add_flags(frame):
            frame["heavy"] = frame["tons"] > 4
        df = pd.read_csv("cargo.csv")
        view = df
        add_flags(view)
        ''', "df", "view")


def test_a_column_set_to_a_name_is_not_taken_for_an_alias():
    # `df["flag"] = False` once read as `df = False` (an alias of the name False): an internal
    # error; `df["k"] = other` is no alias either
    both('''
        import pandas as pd
        df = pd.read_csv("cargo.csv")
        heavy = df[df["tons"] > 1]
        default = "none"
        df["flag"] = False
        df["note"] = default
        heavy["flag"] = True
        ''', "df", "heavy")


def test_labels_of_a_filtered_frame_read_later_are_pandas_own():
    # pos.index once read 0..n-1 from a collected frame, so the wrong rows were flagged
    text = both('''
        import pandas as pd
        df = pd.read_csv("cargo.csv")
        pos = df[df["tons"] > 2]
        df["heavy"] = False
        df.loc[pos.index, "heavy"] = True
        ''', "df", "pos")
    # one marker for the statement pandas makes, not one per call in it
    assert text.count("TODO(porter): frame.labels") == 1
    assert "pos = df[df[\"tons\"] > 2]" in text


def test_a_filtered_series_added_to_a_whole_column_aligns_on_labels():
    # pandas aligns the two Series on their labels: the filtered one keeps the original numbers
    both('''
        import pandas as pd
        df = pd.read_csv("cargo.csv")
        big = df[df["crates"] > 1]["crates"]
        total = big + df["crates"]
        ''', "total")


def test_a_column_stored_into_a_frame_pandas_holds_is_handed_over():
    # the target is a pandas frame (its labels are pandas' own): the Polars expression would
    # have been stored as an expression object
    both('''
        import pandas as pd
        df = pd.read_csv("cargo.csv")
        heavy = df[df["tons"] > 2].copy()
        heavy.index.name = "row"
        heavy["crates_all"] = df["crates"]
        ''', "heavy")


# -- values crossing the boundary keep pandas' meaning --------------------------------------

def test_categories_pandas_orders_come_back_as_an_enum_in_that_order():
    # a Categorical made on pandas sorts and groups in its categories' order, not by text
    text = differential('''
        import pandas as pd
        q = pd.DataFrame({"zone": ["high", "low", "pioneer", "mid", "low", None],
                          "n": [1, 2, 3, 4, 5, 6]})
        q["zone"] = pd.Categorical(q["zone"], categories=["pioneer", "low", "mid", "high"],
                                   ordered=True)
        s = q.sort_values("zone")
        g = q.groupby("zone", observed=True)["n"].sum().reset_index()
        ''', "s", "g").converted_text
    assert "pl.Enum(" in text


@pytest.mark.parametrize("making", [
    'q["size"].astype(order)',
    'q["size"].astype(pd.CategoricalDtype(["S", "M", "L", "XL"], ordered=True))',
    'q["size"].astype("category").cat.reorder_categories(["XL", "L", "M", "S"])',
    'q["size"].astype("category").cat.set_categories(["L", "S", "M"])',
])
def test_categories_written_out_on_pandas_keep_their_order_after_the_hand_over(making):
    differential(f'''
        import pandas as pd
        q = pd.DataFrame({{"size": ["M", "XL", "S", "M", None, "L"], "n": [1, 2, 3, 4, 5, 6]}})
        order = pd.CategoricalDtype(["S", "M", "L", "XL"], ordered=True)
        q.insert(0, "row", range(6))
        q["size"] = {making}
        s = q.sort_values(["size", "row"])
        ''', "s")


def test_number_categories_made_on_pandas_are_not_taken_for_text():
    text = differential('''
        import pandas as pd
        q = pd.DataFrame({"grade": [3, 1, 2, 1], "n": [1, 2, 3, 4]})
        q.insert(0, "row", range(4))
        q["grade"] = pd.Categorical(q["grade"], categories=[1, 2, 3])
        s = q.sort_values(["grade", "row"])
        ''', "s").converted_text
    assert "pl.Enum(" not in text


def test_group_keys_given_as_a_list_reach_pandas_as_a_list():
    # pandas' groups of groupby(["k"]) have 1-tuple keys; groupby("k") would give scalars
    text = differential('''
        import pandas as pd
        df = pd.DataFrame({"shed": ["north", "south", "north", None], "v": [1.0, 2.0, 3.0, 4.0]})
        rows = []
        for key, g in df.groupby(["shed"]):
            rows.append({"key": str(key), "total": g["v"].sum()})
        unpacked = []
        for (shed,), g in df.groupby(["shed"])[["v"]]:
            unpacked.append(shed)
        single = [str(key) for key, g in df.groupby("shed")]
        ''', "rows", "unpacked", "single").converted_text
    assert 'groupby(["shed"])' in text and 'groupby("shed")' in text


def test_dates_reach_pandas_as_dates_not_timestamps():
    # pandas' dt.date holds datetime.date objects (NaT where the time is missing); Polars'
    # to_pandas would make them Timestamps, whose isoformat() and str() differ
    differential('''
        import pandas as pd
        df = pd.DataFrame({"ts": ["2024-01-31 18:00", None, "2024-12-31 06:30"], "v": [1, 2, 3]})
        df["ts"] = pd.to_datetime(df["ts"])
        df["day"] = df["ts"].dt.date
        df["iso"] = df["day"].apply(lambda d: d.isoformat())
        df["kind"] = df["day"].apply(lambda d: type(d).__name__)
        rows = []
        for i in range(1):
            rows.append(df)  # a loop keeps the frame on pandas
        whole = [type(d).__name__ for d in rows[0]["day"]]
        text = [str(d) for d in rows[0]["day"]]
        ''', "df", "whole", "text")


def test_a_missing_flag_reaches_pandas_as_nan():
    # read_csv gives a blank in a True/False column as NaN, which is true; Polars' to_pandas
    # would give None, which is false
    (Path("flags.csv")).write_text("k,flag,n\na,True,1\nb,,\nc,False,3\n", encoding="utf-8")
    differential('''
        import pandas as pd
        def yn(b):
            try:
                return "Y" if bool(b) else "N"
            except TypeError:
                return "?"
        df = pd.read_csv("flags.csv")
        df["yn"] = df["flag"].apply(yn)
        rows = []
        for i in range(1):
            rows.append(df)  # a loop keeps the frame on pandas
        whole = [yn(b) for b in rows[0]["flag"]]
        ''', "df", "whole", data_dir=".")


def test_an_integer_column_with_a_gap_comes_back_from_pandas_an_integer():
    # to_pandas makes an Int64 column with a missing value float64; the converted code after
    # the hand-over writes it as pandas' Int64 does: 7, not 7.0
    differential('''
        import pandas as pd
        import numpy as np
        df = pd.DataFrame({"n": [7.0, np.nan, 12.0], "g": ["a", "b", "a"]})
        df["n"] = df["n"].astype("Int64")
        df["q"] = np.sqrt(df["n"].astype(float))
        df["label"] = "#" + df["n"].astype(str)
        ''', "df")


def test_period_values_grouped_and_sorted_as_their_text():
    # Polars has no period type: a period column kept in its frame is the periods' text
    # ("2024-01", "2024Q1"), grouped and sorted in pandas' order; compared as text (pandas
    # holds Period objects)
    differential('''
        import pandas as pd
        df = pd.DataFrame({"when": ["2024-01-31", "2024-02-01", "2024-02-29", None],
                           "v": [1, 2, 3, 4]})
        df["when"] = pd.to_datetime(df["when"])
        df["month"] = df["when"].dt.to_period("M")
        m = df.groupby("month")["v"].sum().reset_index()
        m["month"] = m["month"].astype(str)
        by_month = df.sort_values(["month", "v"])
        per = df["when"].dt.to_period("Q")
        df["q"] = per
        df["qs"] = df["q"].astype(str)
        by_month = by_month.astype({"month": str})
        df = df.astype({"month": str, "q": str})
        ''', "m", "by_month", "df")


def test_a_pandas_made_frame_with_periods_stays_pandas():
    differential('''
        import pandas as pd
        df = pd.DataFrame({"when": pd.to_datetime(["2024-01-31", "2024-02-01", "2024-02-29"]),
                           "v": [1, 2, 3]})
        df["month"] = df["when"].dt.to_period("M")
        m = df.groupby("month")["v"].sum().reset_index()
        m["month"] = m["month"].astype(str)
        ''', "m")


@pytest.mark.parametrize("making", [
    'q["size"].astype(order)',
    'q["size"].astype(pd.CategoricalDtype(["S", "M", "L", "XL"], ordered=True))',
    'pd.Categorical(q["size"], categories=["XL", "S", "M", "L"])',
    'q["size"].astype("category").cat.reorder_categories(["XL", "L", "M", "S"])',
])
def test_categories_put_back_from_pandas_keep_their_order(making):
    # the column pandas computes row for row is put back into the Polars frame (pl.Series):
    # as an Enum of the categories written out, not a Categorical Polars orders by text
    differential(f'''
        import pandas as pd
        q = pd.DataFrame({{"size": ["M", "XL", "S", "M", None, "L"], "n": [1, 2, 3, 4, 5, 6]}})
        order = pd.CategoricalDtype(["S", "M", "L", "XL"], ordered=True)
        q["size"] = {making}
        s = q.sort_values(["size", "n"])
        g = q.groupby("size", observed=True)["n"].sum().reset_index()
        ''', "s", "g")


def test_a_frame_comes_back_with_the_columns_it_has_before_the_statement():
    # the statement that brings the frame back makes a column: the casts of the come-back
    # are for the columns the frame has then, not for that one
    differential('''
        import pandas as pd
        df = pd.DataFrame({"tags": ["a;b", "c", None], "g": ["x", "x", "y"]})
        df["sz"] = df.groupby("g")["tags"].transform("count") - 3
        df["pos"] = df["tags"].str.find("e") - 1
        df["ln"] = df["tags"].str.len() - 4
        ''', "df")


def test_an_enum_from_pandas_goes_back_to_pandas_with_all_its_categories_in_order():
    # observed=False lists unseen categories, in pandas' order; max() reads that order too
    differential('''
        import pandas as pd
        q = pd.DataFrame({"zone": ["high", "low", "mid", "low", None], "n": [1, 2, 3, 4, 5]})
        q["zone"] = pd.Categorical(q["zone"], categories=["pioneer", "low", "mid", "high"],
                                   ordered=True)
        s = q.sort_values(["zone", "n"])
        g = q.groupby("zone", observed=False)["n"].sum().reset_index()
        top = q["zone"].max()
        cats = list(q["zone"].cat.categories)
        ''', "s", "g", "top", "cats")


@pytest.mark.parametrize("making", [
    'pd.Categorical(q["size"], categories=zones)',
    'q["size"].astype(pd.CategoricalDtype(zones, ordered=True))',
    'q["size"].astype("category").cat.reorder_categories(zones)',
    'q["size"].astype("category").cat.rename_categories({"M": "m", "XL": "a"})',
    'q["size"].astype("category").cat.add_categories(["A"]).cat.reorder_categories(zones + ["A"])',
    'pd.Categorical(q["n"], categories=[3, 1, 2, 6, 5, 4])',
    'pd.Categorical(q["size"], categories=sorted(zones, key=len))',
])
def test_categories_in_an_order_of_the_scripts_are_never_sorted_by_text(making):
    # read through a name, or not readable at all (the frame then stays pandas)
    differential(f'''
        import pandas as pd
        q = pd.DataFrame({{"size": ["M", "XL", "S", "M", None, "L"], "n": [1, 2, 3, 4, 5, 6]}})
        zones = ["XL", "S", "M", "L"]
        q["size"] = {making}
        s = q.sort_values(["size", "n"])
        ''', "s")


def test_a_dropped_column_is_not_cast_on_either_side_of_the_boundary():
    differential('''
        import pandas as pd
        df = pd.DataFrame({"ts": ["2024-01-31 18:00", None], "n": [1, 2], "k": ["a", "b"],
                           "ok": [True, False]})
        df["ts"] = pd.to_datetime(df["ts"])
        df["day"] = df["ts"].dt.date
        df = df.drop(columns=["n", "day", "ok"])
        df["w"] = df["k"].str.find("b")
        df["m"] = df["w"] + 1
        rows = []
        for i in range(1):
            rows.append(df)
        ''', "df")


# -- a pivot on an integer key: pandas labels the new columns with numbers -------------------

@pytest.fixture
def landings(tmp_path):
    (tmp_path / "landings.csv").write_text(
        "quay,year,boats\nA,2023,1\nA,2024,5\nB,2023,3\nB,2024,4\nC,2024,7\nA,2024,2\n",
        encoding="utf-8")


def test_a_pivot_tables_columns_are_found_by_their_integer_labels(landings):
    # Polars names the pivoted columns "2023" / "2024"; pandas reads pv[2024], which porter
    # reads as the column "2024" (it once handed the frame to pandas code for it)
    text = differential("""
        import pandas as pd
        df = pd.read_csv("landings.csv")
        pv = df.pivot_table(index="quay", columns="year", values="boats", aggfunc="sum").reset_index()
        pv["growth"] = pv[2024] - pv[2023]
        pv = pv.sort_values("quay", ascending=False)
        pv["ratio"] = pv["growth"] * 2
        pv = pv.reset_index(drop=True)
        pv["double"] = pv[2023] * 2
        newest = pv[2024].tolist()
    """, "pv", "newest", data_dir=".").converted_text
    assert "TODO(porter)" not in text and "to_pandas()" not in text, text


def test_pandas_code_finds_a_crosstabs_and_an_unstacked_tables_integer_labels(landings):
    differential("""
        import pandas as pd
        df = pd.read_csv("landings.csv")
        ct = pd.crosstab(df["quay"], df["year"], margins=True)
        latest = ct[2024].tolist()
        u = df.groupby(["quay", "year"])["boats"].sum().unstack()
        first = u[2023].tolist()
    """, "latest", "first", data_dir=".")


def test_pivot_columns_named_by_the_script_keep_its_names_for_pandas_code(landings):
    differential("""
        import pandas as pd
        df = pd.read_csv("landings.csv")
        pv = df.pivot_table(index="quay", columns="year", values="boats", aggfunc="max")
        named = pv.copy()
        named.columns = ["2023", "2024"]
        named = named.reset_index()
        latest = named.to_dict()["2024"]
        renamed = pv.rename(columns={2024: "now"}).reset_index()
        old = renamed[2023].tolist()
        now = renamed.to_dict()["now"]
    """, "latest", "old", "now", data_dir=".")


# -- a function pandas maps over a column, whose values Polars cannot hold as pandas does -------

@pytest.fixture
def codes(tmp_path):
    (tmp_path / "codes.csv").write_text(
        "code,n,s\n12,1,x-y\nA7,2,it's-z\n3.5,3,\n,4,w\n", encoding="utf-8")


@pytest.mark.parametrize("function, after", [
    # a number or the text as it was: pandas keeps both in one object column
    ("def f(c):\n    try:\n        return float(c)\n    except ValueError:\n        return c\n",
     'df["kind"] = df["v"].map(lambda v: type(v).__name__)'),
    # True/False beside a number: Polars would make True 1.0
    ("def f(c):\n    if c == c and c[0].isdigit():\n        return 1.5\n    return False\n",
     'df["m"] = df["n"] * 2'),
    # lists of numbers, then .str[0] of them
    ("def f(c):\n    return [len(c)] * 2 if c == c else []\n", 'df["first"] = df["v"].str[0]'),
    ("", 'df["m"] = df["n"] + 1'),  # tuples: a lambda written in the call
])
def test_values_of_no_polars_type_keep_the_frame_on_pandas(codes, function, after):
    mapped = "f" if function else "lambda c: (c, 1)"
    text = differential(f"""
import pandas as pd
{function}
df = pd.read_csv("codes.csv")
df["v"] = df["code"].map({mapped})
{after}
df = df[df["n"] > 1]
df.to_csv("out.csv", index=False)
out = pd.read_csv("out.csv")
""", "df", "out", data_dir=".").converted_text
    assert "the frame stays pandas" in text


def test_lists_of_text_made_by_pandas_come_back_as_lists(codes):
    text = differential("""
        import pandas as pd
        def tags(v):
            if v != v:
                return None
            return v.split("-")
        df = pd.read_csv("codes.csv")
        df["parts"] = df["s"].map(tags)
        df["first"] = df["parts"].str[0]
        df["count"] = df["parts"].str.len()
        df["v"] = df["n"].apply(lambda x: x * 2 if x > 1 else 0.5)
        df.to_csv("out.csv", index=False)
        out = pd.read_csv("out.csv")
        first = df["first"].tolist()
    """, "out", "first", data_dir=".").converted_text
    # the function is an expression now (split), its parts a list column either way
    assert ".list.get(0" in text


def test_a_group_call_left_on_pandas_gets_only_the_columns_it_reads():
    # a groupby of one column with the script's own function: the keys and that column go over
    text = both("""
        import pandas as pd
        def spread(s):
            values = sorted(v for v in s if v == v)
            return values[-1] - values[0] if values else 0.0
        df = pd.read_csv("cargo.csv")
        df["tons2"] = df["tons"] * 2
        result = df.groupby("kind")["tons2"].agg(spread).reset_index()
    """, "result")
    assert 'df.select("kind","tons2").collect().to_pandas().groupby("kind")' in "".join(text.split()), text


def test_a_statement_kept_on_pandas_after_a_hand_over_is_marked():
    # `df` went to pandas for the insert; the statement after it keeps pandas for a call of
    # its own (a row lookup by label), which gets its own marker, not a silent pass
    text = both("""
        import pandas as pd
        df = pd.read_csv("cargo.csv")
        df.insert(1, "port", "Sandvik")
        first = df.set_index("berth").loc["A"]
        """, "first")
    # (set_index makes the table labelled by berth; its row by label is frame.loc's TODO)
    assert "TODO(porter): frame.loc" in text


def test_series_of_a_frame_sorted_after_their_last_use_stay_expressions():
    # three parses of one text column, combined and put back, then the frame is sorted: the
    # Series are not read after the sort, so they stay expressions of the frame
    text = both("""
        import pandas as pd
        df = pd.read_csv("cargo.csv")
        df = df.drop_duplicates()
        as_float = pd.to_numeric(df["tons"], errors="coerce")
        as_crates = pd.to_numeric(df["crates"], errors="coerce")
        df["load"] = as_float.fillna(as_crates).fillna(0)
        df = df.sort_values(["load", "berth"])
        """, "df")
    assert "TODO" not in text


def test_list_columns_of_a_frame_handed_over_are_lists():
    # a row loop kept on pandas tests isinstance(..., list): with numpy arrays it was False
    both("""
        import pandas as pd
        df = pd.read_csv("cargo.csv")
        df["parts"] = df["kind"].str.split("i")
        seen = []
        for i, row in df.iterrows():
            df.at[i, "t2"] = row["crates"]
            seen.append(isinstance(row["parts"], list) and "gra" in row["parts"])
        records = df.to_dict("records")
        """, "seen", "records")


def test_series_kept_in_names_go_to_pandas_before_their_frame():
    # a statement kept on pandas reads a mask and a duration kept in names: pandas computes
    # them from the Polars frame first (an expression of a frame pandas now holds would fail)
    both("""
        import pandas as pd
        df = pd.read_csv("cargo.csv")
        heavy = df["tons"] > 2
        df.loc[heavy, "crates"] = df.loc[heavy, "crates"] * 2
        per = df["tons"] / df["crates"]
        df.insert(0, "per", per)
        """, "df")


def test_a_list_column_back_from_pandas_is_written_as_pandas_writes_it(tmp_path):
    # the frame comes back from pandas with its types unknown; its lists are written as
    # Python writes them (Polars' CSV writer refuses nested data)
    out = tmp_path / "parts.csv"
    source = f"""
import pandas as pd
df = pd.read_csv("cargo.csv")
df["parts"] = df["kind"].str.split("i")
df.insert(0, "n", 1)
df["crates2"] = df["crates"] * 2
df.to_csv({str(out)!r}, index=False)
"""
    differential(source, "df")
    expected = out.read_text()
    run(convert(source).converted_text)
    assert out.read_text() == expected


TRUE_FALSE = """
import pandas as pd
df = pd.read_csv("t.csv", parse_dates=["d"])
"""


@pytest.fixture
def true_false(tmp_path, monkeypatch):
    monkeypatch.chdir(tmp_path)
    (tmp_path / "t.csv").write_text("id,ok,d\n1,True,2024-01-31 00:00:00\n2,False,\n"
                                    "3,,2024-02-29 10:30:00\n", encoding="utf-8")
    return str(tmp_path)  # the data folder: the column types are known, as with --data


def test_a_frame_back_from_pandas_after_pop_keeps_its_column_types(true_false):
    # pandas is the reference: after `df.pop` (kept on pandas) the True/False column is still
    # True/False, so its text is "True", never Polars' "true", and the datetimes keep pandas' text
    result = differential(TRUE_FALSE + """
df.pop("id")
df["s"] = df["ok"].astype(str)
df["t"] = df["ok"].map(lambda v: f"<{v}>")
df["u"] = df["d"].astype(str)
result = df
""", data_dir=true_false)
    assert "from_pandas" in result.converted_text


def test_a_function_that_copies_its_frame_first_does_not_change_the_callers(true_false):
    # `frame = frame.copy()` first: the function's later changes are its copy's, so the
    # caller's frame stays in Polars with its types
    result = differential(TRUE_FALSE + """
def clean(frame):
    frame = frame.copy()
    frame["id"] = frame["id"] * 10
    return frame
a = clean(df)
df["t"] = df["ok"].map(lambda v: f"ok:{v}")
result = df
""", data_dir=true_false)
    assert "from_pandas(df)" not in result.converted_text


def test_a_function_that_changes_its_frame_before_copying_it_is_still_a_change(true_false):
    result = convert(TRUE_FALSE + """
def clean(frame):
    frame["id"] = frame["id"] * 10
    frame = frame.copy()
    return frame
a = clean(df)
""")
    assert any("clean" in s.key for s in result.todos), result.converted_text


def test_a_try_around_pandas_code_stays_pandas_and_its_frames_come_back(tmp_path, monkeypatch):
    # pandas is the reference: the first format fails on these dates and the handler parses
    # them day first; a failed merge validation is caught. In Polars both errors would come
    # later, where the plan is collected, as Polars' own exceptions: the handlers never ran
    monkeypatch.chdir(tmp_path)
    (tmp_path / "t.csv").write_text("id,d\n1,05/01/2024\n2,13/01/2024\n", encoding="utf-8")
    (tmp_path / "r.csv").write_text("id,b\n1,1\n1,2\n", encoding="utf-8")
    result = differential("""
import pandas as pd
try:
    df = pd.read_csv("t.csv")
except FileNotFoundError:
    df = pd.read_csv("other.csv")
try:
    df["d"] = pd.to_datetime(df["d"], format="%Y-%m-%d")
except ValueError:
    df["d"] = pd.to_datetime(df["d"], format="%d/%m/%Y")
r = pd.read_csv("r.csv")
failed = False
try:
    m = df.merge(r, on="id", how="left", validate="one_to_one")
except pd.errors.MergeError:
    failed = True
df["m"] = df["d"].dt.month
result = df
""", "result", "failed")
    assert sum(s.key == "frame.try" for s in result.todos) == 3
    assert "from_pandas(df)" in result.converted_text  # back to Polars after the try


def test_a_try_without_pandas_code_is_rewritten_as_usual():
    result = convert("import pandas as pd\ndf = pd.DataFrame({'a': [1, 2]})\n"
                     "try:\n    n = int('x')\nexcept ValueError:\n    n = 0\n"
                     "df['b'] = df['a'] + n\n")
    assert not any(s.key == "frame.try" for s in result.sites)


def test_a_mixed_object_result_of_a_hand_over_stays_pandas(tmp_path, monkeypatch):
    # pandas is the reference: replace("none", 0) on a text column and pd.melt of a float and
    # a text column make object columns mixing text and numbers, which Polars has no type for
    # (pl.Series / pl.from_pandas raised on them)
    monkeypatch.chdir(tmp_path)
    (tmp_path / "t.csv").write_text("site,jan,feb,cnt\nA,3.5,x,3\nB,1.0,,none\nC,2.0,y,\n",
                                    encoding="utf-8")
    differential("""
import pandas as pd
w = pd.read_csv("t.csv")
d = pd.melt(w, id_vars="site", value_vars=["jan", "feb"])
w["cnt"] = w["cnt"].replace("none", 0)
values = d["value"].tolist()
counts = w["cnt"].tolist()
""", "values", "counts", data_dir=str(tmp_path))


def test_a_try_kept_on_pandas_reads_the_labels_a_filter_left(tmp_path, monkeypatch):
    # pandas is the reference: after the filter the rows keep their labels (0, 2); the code in
    # the try reads label 2, which exists in pandas (a renumbered frame raised KeyError there)
    monkeypatch.chdir(tmp_path)
    (tmp_path / "d.csv").write_text("lot,kg\nA,1\nB,-1\nC,3\n", encoding="utf-8")
    differential("""
import pandas as pd
df = pd.read_csv("d.csv")
sub = df[df["kg"] > 0]
try:
    picked = sub.loc[2, "lot"]
except KeyError:
    picked = "none"
""", "picked", data_dir=str(tmp_path))


@pytest.mark.parametrize("made", [
    'df.pivot_table(index="berth", columns="kind", values="tons", aggfunc="sum").reset_index()',
    'df.groupby(["berth", "kind"])["crates"].sum().unstack().reset_index()',
    'pd.crosstab(df["berth"], df["kind"]).reset_index()',
])
def test_a_pivoted_table_reaches_pandas_with_its_columns_name(made: str) -> None:
    # pandas names the columns of a pivoted table after its key ("kind"), through
    # reset_index too: a stack kept on pandas names its level after it, not level_1
    text = differential(f"""
        import pandas as pd
        df = pd.read_csv("cargo.csv")
        wide = {made}
        long = wide.set_index("berth").stack()
        result = long.reset_index()
    """, data_dir=".").converted_text
    assert 'rename_axis(columns="kind")' in text


def test_a_melt_kept_on_pandas_names_its_variable_after_the_pivoted_columns() -> None:
    text = differential("""
        import pandas as pd
        df = pd.read_csv("cargo.csv")
        wide = df.groupby(["berth", "kind"]).size().unstack(fill_value=0).reset_index()
        result = wide.fillna(0).melt(id_vars="berth")
    """, data_dir=".").converted_text
    assert 'rename_axis(columns="kind")' in text


_AGG_LISTS = 'st = df.groupby("berth").agg({"tons": ["sum", "mean"], "crates": ["max"]})\n'


@pytest.mark.parametrize("lines", [
    _AGG_LISTS + 'result = st.stack(level=0).reset_index()',
    _AGG_LISTS + 'result = st.T.reset_index()',
    _AGG_LISTS + 'result = st.xs("sum", axis=1, level=1).reset_index()',
    _AGG_LISTS + 'result = st["tons"].reset_index()',
    _AGG_LISTS + 'result = st[("tons", "mean")].reset_index()',
    _AGG_LISTS + 'result = st.droplevel(0, axis=1).reset_index()',
    _AGG_LISTS + 'st.columns = st.columns.map("_".join)\nresult = st.reset_index()',
    _AGG_LISTS + 'st = st.round(1)\nresult = st.stack(level=0).reset_index()',
    'st = df.groupby("berth")[["tons"]].agg(["sum", "mean"])\nresult = st.stack().reset_index()',
    'st = df.groupby(["berth", "kind"]).agg({"tons": ["sum", "mean"]})\n'
    'result = st.stack(level=0).reset_index()',
])
def test_an_aggregation_with_lists_reaches_pandas_with_two_levels_of_columns(lines: str) -> None:
    # porter names the columns tons_sum, ...; pandas' code kept on pandas reads the two
    # levels (column, function) pandas made
    text = differential("import pandas as pd\ndf = pd.read_csv(\"cargo.csv\")\n" + lines + "\n",
                        data_dir=".").converted_text
    assert "frame.set_axis(frame.columns.map(" in text


@pytest.mark.parametrize("made", [
    # each row's label repeated once per column melted
    'pd.melt(df, id_vars=["berth"], value_vars=["tons", "crates"], ignore_index=False)',
    # a join on the labels, of the last rows (labels 5, 6, 7) with all of them
    'pd.merge(df.tail(3), df[["tons"]], left_index=True, right_index=True, suffixes=("", "_r"))',
])
def test_a_frame_pandas_returns_with_labels_of_its_own_keeps_them(made: str) -> None:
    # pl.from_pandas would drop them: the frame stays pandas
    both(f"""
        import pandas as pd
        df = pd.read_csv("cargo.csv")
        m = {made}
        result = m.reset_index()
        labels = list(m.index)
    """, "result", "labels")


def test_a_melt_that_renumbers_its_rows_comes_back_to_polars() -> None:
    text = both("""
        import pandas as pd
        df = pd.read_csv("cargo.csv")
        m = pd.melt(df, id_vars=["berth"], value_vars=["tons", "crates"], ignore_index=True, col_level=0)
        result = m.reset_index()
    """)
    assert "pl.from_pandas(" in text


@pytest.mark.parametrize("uses", [
    'df.loc[m, "tons"] = 0\ndf.loc[~m, "crates"] = 1\n',
    'df.loc[m, "tons"] = 0\ndf.loc[m, "crates"] = 1\nresult = [int(m.sum()), df.loc[m, "berth"].tolist()]\n',
    'df.loc[m, "tons"] += df["crates"]\ndf.loc[~m, "crates"] *= 2\n',
])
def test_a_mask_reused_after_a_column_it_reads_is_overwritten_keeps_its_values(uses: str) -> None:
    # pandas computed m before the first line overwrote "tons": it keeps those values
    result = differential(f"""
import pandas as pd
df = pd.read_csv("cargo.csv")
m = (df["crates"] > 1) & df["tons"].notna()
{uses}
frame = df
""", *(("frame", "result") if "result" in uses else ("frame",)))
    messages = " ".join(site.message for site in result.sites)
    assert "column 'crates' was overwritten" not in messages


@pytest.mark.parametrize("data_dir", [None, "."])
@pytest.mark.parametrize("before", [
    # kept on pandas (a loc to two columns), then back to Polars
    'df.loc[df["crates"] > 3, ["tons", "spare"]] = 0\n',
    # the script's own function changes the frame: its columns are not known after it
    'def stamp(frame):\n    frame["seen"] = True\nstamp(df)\n',
])
def test_a_new_column_written_through_loc_after_a_hand_over(before: str, data_dir: str | None) -> None:
    # pandas makes the column, missing outside the rows chosen
    text = differential(f"""
import pandas as pd
df = pd.read_csv("cargo.csv")
{before}df.loc[df["crates"] > 2, "new"] = "x"
df.loc[df["crates"] > 1, "kind"] = "many"
frame = df
""", "frame", data_dir=data_dir).converted_text
    if data_dir and "spare" in before:
        # the columns the loc wrote are known: the frame's schema is kept across the hand-over
        assert "pl.selectors.by_name" not in text


@pytest.mark.parametrize("use", [
    's.str.replace(r"^\\s*|\\s*$", "", regex=True)',
    's.str.upper() + "!"',
])
def test_a_series_kept_in_a_name_before_its_frame_goes_to_pandas_under_another_name(use: str) -> None:
    # `out = df` then a change through `out`: both names stay pandas from there, and `s` too
    differential(f"""
import pandas as pd
df = pd.read_csv("cargo.csv")
s = df["kind"]
out = df
out["c"] = {use}
frame = out
""", "frame")


# a ferry line's crossings: `cars` is whole numbers with none missing, `wait` has a missing one
FERRY = "quay,cars,wait\nnorth,4,1.5\nsouth,2,\neast,3,2.5\n"


@pytest.mark.parametrize("made", [
    'df["cars"].where(df["cars"] > 2, "few")',
    'df["cars"].where(df["cars"] > 2, False)',
    'df["cars"].mask(df["cars"] > 2, True)',
    'df["cars"].mask(df["cars"] > 2, "many")',
    'df["cars"].replace(4, "four")',
    'df["cars"].replace({4: "four", 2: None})',
])
def test_an_int_columns_type_is_known_after_a_hand_over(made: str) -> None:
    # the Categorical is pandas' (the frame goes over and comes back): `cars` is still an
    # integer column, so text or True/False put into it makes pandas' mixed column, which
    # stays pandas (Polars made the ints text, or 1 for True)
    Path("ferry.csv").write_text(FERRY)
    differential(f"""
import pandas as pd
df = pd.read_csv("ferry.csv")
df["q"] = pd.Categorical(df["quay"])
df["m"] = {made}
shown = repr(df["m"].tolist())
written = df.to_csv(index=False)
""", "shown", "written", data_dir=".")


@pytest.mark.parametrize("made", [
    'df["wait"].fillna(True)',
    'df["wait"].fillna("none")',
    'df["wait"].where(df["wait"] > 2, "short")',
    'df["quay"].where(df["cars"] > 2, 0)',
    'df.apply(lambda r: (r["quay"], r["wait"]), axis=1)',
])
def test_a_frame_given_values_polars_has_no_type_for_stays_pandas_after_a_hand_over(made: str) -> None:
    # the frame was handed over (the Categorical) and waits to come back: a mixed or tuple
    # column keeps it on pandas, as it does a frame never handed over (pl.from_pandas made
    # True 1.0, or failed on the text)
    Path("ferry.csv").write_text(FERRY)
    differential(f"""
import pandas as pd
df = pd.read_csv("ferry.csv")
df["q"] = pd.Categorical(df["quay"])
df["m"] = {made}
df["u"] = df["quay"].str.upper()
shown = repr(df["m"].tolist())
written = df.to_csv(index=False)
""", "shown", "written", data_dir=".")
