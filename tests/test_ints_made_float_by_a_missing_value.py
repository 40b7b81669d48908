"""An integer column pandas makes float64 because a value went missing where it was computed
keeps pandas' type after those rows are dropped and in the group sums made of it (written 5.0,
not 5): whatever made the value missing (a dict's map or get that found no value, where() or
replace() with NaN, a count of missing text, a fill within groups whose key is missing), and
whether the column was set with df[name] = ... or df.assign(name=...). Where nothing went
missing the column stays int (written 5)."""

from __future__ import annotations

import pytest

from support import same_text

# a ferry line's sailings: one sailing has no route noted, one no remark
SAILINGS = ("sailing,route,deck,cars,remark\n"
            "1,north,upper,12,calm crossing\n"
            "2,south,lower,30,\n"
            "3,,upper,7,late  by ten minutes\n"
            "4,north,lower,25,fog\n"
            "5,söder,upper,18,full load today\n"
            "6,south,lower,22,calm\n")
NOTED = "\n".join(line for line in SAILINGS.splitlines() if ",," not in line) + "\n"

MADE = {
    "map": 'log["route"].map({"north": 1, "south": 2, "söder": 3})',
    "where": 'log["cars"].where(log["cars"] > 10)',
    "replace": 'log["cars"].replace(7, float("nan"))',
    "count": 'log["remark"].str.count(r"\\s+") + 1',
    "ffill": 'log.groupby("route")["cars"].ffill()',
    "bfill": 'log.groupby("route")["cars"].bfill(limit=1)',
}


@pytest.mark.parametrize("how", ["setitem", "assign"])
@pytest.mark.parametrize("made", list(MADE))
def test_dropped_rows_and_group_sums_keep_pandas_float(tmp_path, made, how):
    setting = f'log["x"] = {MADE[made]}' if how == "setitem" else f'log = log.assign(x={MADE[made]})'
    same_text(f"""
        import pandas as pd
        log = pd.read_csv("sailings.csv")
        {setting}
        log.groupby("deck", as_index=False).agg(x=("x", "sum")).to_csv("decks.csv", index=False)
        log.groupby("deck")["x"].max().to_csv("most.csv")
        log.dropna(subset=["route", "remark", "x"]).to_csv("kept.csv", index=False)
        print(log.dropna(subset=["x"])["x"].tolist())
        """, tmp_path, {"sailings.csv": SAILINGS})


@pytest.mark.parametrize("made", ["map", "count", "ffill"])
def test_nothing_missing_stays_int(tmp_path, made):
    same_text(f"""
        import pandas as pd
        log = pd.read_csv("sailings.csv")
        log["x"] = {MADE[made]}
        log.groupby("deck", as_index=False).agg(x=("x", "sum")).to_csv("decks.csv", index=False)
        log.to_csv("kept.csv", index=False)
        """, tmp_path, {"sailings.csv": NOTED})


def test_a_word_count_of_missing_remarks_summed_by_a_named_aggregation(tmp_path):
    # a radio log's pattern: the text kept in a name, its word count summed per route
    same_text("""
        import pandas as pd
        log = pd.read_csv("sailings.csv")
        txt = log["remark"]
        log["words"] = txt.str.count(r"\\s+") + 1
        per = log.groupby("deck", as_index=False).agg(n=("sailing", "count"),
                                                      words=("words", "sum"))
        per.to_csv("decks.csv", index=False)
        """, tmp_path, {"sailings.csv": SAILINGS}, with_data=False)


def test_assign_with_a_lambda_reading_an_earlier_keyword(tmp_path):
    same_text("""
        import pandas as pd
        log = pd.read_csv("sailings.csv")
        log = log.assign(code=log["route"].map({"north": 1, "south": 2}),
                         twice=lambda d: d["code"] * 2)
        log.dropna(subset=["code"]).to_csv("kept.csv", index=False)
        log.groupby("deck", as_index=False)[["code", "twice"]].sum().to_csv("decks.csv",
                                                                           index=False)
        """, tmp_path, {"sailings.csv": SAILINGS})
