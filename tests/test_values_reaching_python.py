"""Values that reach Python: tolist(), unique(), values, iloc and nunique() give
what pandas gives: nan for a missing text or True/False, pandas' Timestamps and NaT, Python
ints, a Categorical's labels.

pandas is the reference: each check runs the script with pandas and its conversion with Polars
in folders holding the same files, and compares what they print (support.same_text).
"""

from __future__ import annotations

from support import same_text

LAMPS = {"lamps.csv": "lamp,oil,keeper\nA,3.5,Ida\nB,,\nC,1.0,Ida\n"}
SAILINGS = {"t.csv": "sailing,dep,pax,ok\nS1,2024-03-01 08:00:00,12,True\nS2,,7,\n"
                     "S3,2024-03-02 09:00:00,3,False\n"}


def test_iloc_of_datetime_is_a_timestamp_and_nat(tmp_path):
    same_text("""
        import pandas as pd
        t = pd.read_csv("t.csv", parse_dates=["dep"])
        first = t["dep"].iloc[0]
        print(first.normalize(), first.quarter, repr(first))
        print(t["dep"].iloc[1], [t["dep"].iloc[-1]])
        last = t["dep"].iloc[1]
        print(f"last departure: {last}")
        print(len(t[t["dep"] >= t["dep"].iloc[2]]))
    """, tmp_path, SAILINGS)


def test_unique_tolist_of_categories(tmp_path):
    same_text("""
        import pandas as pd
        d = pd.read_csv("lamps.csv")
        d["band"] = pd.cut(d["oil"], bins=[0, 2, 4], labels=["low", "high"])
        print(d["band"].unique().tolist())
        print(d["band"].dropna().unique().tolist())
        print(d["keeper"].astype("category").unique().tolist())
        print(d["band"].tolist(), d["band"].to_numpy())
        for b in d["band"].unique():
            print(b, len(d[d["band"] == b]))
    """, tmp_path, LAMPS)


def test_unique_of_text_keeps_pandas_nan(tmp_path):
    same_text("""
        import pandas as pd
        d = pd.read_csv("lamps.csv")
        print(d["keeper"].unique().tolist())
        print(d["keeper"].unique())
        for k in d["keeper"].unique():
            sub = d[d["keeper"] == k]
            print(k, len(sub), sub["oil"].sum())
    """, tmp_path, LAMPS)


def test_tolist_of_a_column_of_unknown_type(tmp_path):
    same_text("""
        import pandas as pd
        a = pd.read_csv("t.csv")
        a.to_csv("tmp.csv", index=False)
        b = pd.read_csv("tmp.csv")
        print(b["sailing"].tolist(), b["ok"].tolist(), b["pax"].tolist())
    """, tmp_path, {"t.csv": "sailing,ok,pax\nS1,True,1\n,,\nS3,False,3\n"})


def test_values_of_true_false_with_a_blank(tmp_path):
    same_text("""
        import pandas as pd
        t = pd.read_csv("t.csv")
        print(t["ok"].values, t["ok"].to_numpy())
    """, tmp_path, SAILINGS)


def test_nunique_is_a_python_int(tmp_path):
    same_text("""
        import pandas as pd
        d = pd.read_csv("lamps.csv")
        print({"keepers": d["keeper"].nunique(), "all": d["keeper"].nunique(dropna=False)})
        print([d["lamp"].nunique()])
    """, tmp_path, LAMPS)


def test_iloc_of_true_false_with_a_blank(tmp_path):
    same_text("""
        import pandas as pd
        t = pd.read_csv("t.csv")
        print(t["ok"].iloc[1], [t["ok"].iloc[2], t["ok"].iloc[-1]])
        print([(t["pax"] > 5).iloc[0]])
    """, tmp_path, SAILINGS)


def test_keys_of_dates_stay_dates(tmp_path):
    same_text("""
        import pandas as pd
        t = pd.read_csv("t.csv", parse_dates=["dep"])
        print(t.groupby(t["dep"].dt.date)["pax"].sum().to_dict())
        t["day"] = t["dep"].dt.date
        print(t["day"].value_counts().to_dict())
        print(t.groupby("day")["pax"].sum().reset_index().values.tolist())
    """, tmp_path, SAILINGS)


def test_nullable_text_and_true_false_values_are_flagged(tmp_path):
    # pandas gives <NA> for a missing value of its "string" / "boolean" columns, which porter
    # does not follow: the sites say so (confidence 0.8), where they claimed pandas' values
    source = """
        import pandas as pd
        d = pd.read_csv("d.csv", dtype={"n": "Int64", "s": "string", "b": "boolean"})
        a = d["s"].tolist()
        b = d["b"].iloc[1]
        c = d["s"].unique()
        e = (d["n"] / 2).tolist()
    """
    import textwrap
    from support import convert
    result = convert(textwrap.dedent(source))
    sites = {(s.line, s.key): s for s in result.sites}
    for line, key in ((5, "series.iloc"), (6, "series.unique"), (7, "series.tolist")):
        site = sites[(line, key)]
        assert site.confidence <= 0.9 and "<NA>" in site.message, site
    # a column read with dtype "string" is one porter follows: its values are pandas' own
    # (['x', <NA>, 'z'], through the dtype), not flagged
    assert 'to_pandas().astype("string").tolist()' in result.converted_text


def test_value_counts_keys_of_unknown_type_keep_nan(tmp_path):
    same_text("""
        import pandas as pd
        a = pd.read_csv("t.csv")
        a.to_csv("tmp.csv", index=False)
        s = pd.read_csv("tmp.csv")
        print(s["ok"].value_counts(dropna=False).to_dict())
        print(s["sailing"].value_counts(dropna=False).to_dict())
    """, tmp_path, {"t.csv": "sailing,ok\nS1,True\n,\nS3,False\nS1,True\n"})


def test_distinct_texts_listed_without_a_missing_one_do_not_need_pandas(tmp_path):
    # pandas is the reference; the converted script reaches pandas only where a text is missing
    from support import same_text
    result = same_text("""
        import pandas as pd
        d = pd.read_csv("parts.csv")
        named = d[d["part"].notna()]
        print(sorted(named["part"].unique()))
        print(d["part"].unique().tolist())
        for p in named["part"].unique():
            print(p, len(named[named["part"] == p]))
        print(d["part"].unique())
    """, tmp_path, {"parts.csv": """\
        part,kg
        rope,2
        pulley,
        ,4
        rope,1
        Öse,3
        """})
    assert "pandas_text_values" in result.converted_text
