"""A groupby's table laid over every pier and every day of a range read from the data
(`pd.date_range(df["day"].min(), df["day"].max())`, `pd.MultiIndex.from_product`,
`table.reindex(full, fill_value=0)`), and the MultiIndex steps after it (`swaplevel`,
`sort_index`, `loc[pd.IndexSlice[...]]`, `droplevel`, `unstack`, `index.strftime`), checked
against pandas (the reference implementation).

pandas gives one row per combination in the product's order: a pier with no crossing on a day
gets fill_value in every column, a missing value the table had stays missing, whole numbers
stay whole unless the fill is a fraction. The data is an invented island ferry line's
crossings.
"""

from __future__ import annotations

import pytest

from support import assert_same_value, convert, differential, exact_floats, run

HEAD = '''
import numpy as np
import pandas as pd
trips = pd.DataFrame({
    "day": ["2026-06-10", "2026-06-08", "2026-06-10", "2026-06-13", "2026-06-08", "2026-06-10",
            None, "2026-06-12", "2026-06-13"],
    "pier": ["Skál", "Holm", "Holm", "Øyra", "Skál", "Skál", "Holm", "Øyra", None],
    "cars": [4, 2, 6, 1, 3, 2, 5, 7, 1],
    "fare": [40.0, np.nan, 60.0, 10.0, 30.5, 20.25, 50.0, np.nan, 9.0],
})
trips["day"] = pd.to_datetime(trips["day"])
'''

REINDEXED = '''
daily = trips.groupby(["pier", "day"]).agg(cars=("cars", "sum"), fare=("fare", "max"))
piers = sorted(trips["pier"].dropna().unique())
days = pd.date_range(trips["day"].min(), trips["day"].max(), freq="D")
full = pd.MultiIndex.from_product([piers, days], names=["pier", "day"])
daily = daily.reindex(full, fill_value=0)
'''

CASES = {
    "every pier on every day, whole numbers stay whole, NaN kept": (
        REINDEXED + 'result = daily.reset_index()'),
    "a fraction as the fill turns whole numbers float": (
        REINDEXED.replace("fill_value=0", "fill_value=0.5") + 'result = daily.reset_index()'),
    "the product written inline, piers listed in the script, not sorted": (
        'daily = trips.groupby(["pier", "day"])[["cars"]].sum()\n'
        'days = pd.date_range(trips["day"].min(), trips["day"].max())\n'
        'daily = daily.reindex(pd.MultiIndex.from_product([["Øyra", "Holm", "Ness"], days], names=["p", "d"]), fill_value=-1)\n'
        'result = daily.reset_index()'),
    "two-day steps": (
        REINDEXED.replace('freq="D"', 'freq="2D"') + 'result = daily.reset_index()'),
    "levels swapped, sorted, a slice of days": (
        REINDEXED + 'by_day = daily.swaplevel().sort_index()\n'
        'result = by_day.loc[pd.IndexSlice["2026-06-09":"2026-06-12", :], "cars"].reset_index()'),
    "a slice of days open on one side, every column": (
        REINDEXED + 'by_day = daily.swaplevel("pier", "day").sort_index()\n'
        'result = by_day.loc[pd.IndexSlice[:"2026-06-10", :], :].reset_index()'),
    "one pier's rows, its level dropped": (
        REINDEXED + 'skal = daily.loc[pd.IndexSlice["Skál", :], :].droplevel("pier")\n'
        'result = [int((skal["cars"] > 0).sum()), skal.reset_index()]'),
    "a day's rows by label on the second level": (
        'daily = trips.groupby(["pier", "cars"])[["fare"]].sum()\n'
        'result = daily.loc[pd.IndexSlice[:, 2], :].reset_index()'),
    "a label and a slice that leave no row: no rows, no error": (
        'daily = trips.groupby(["pier", "cars"])[["fare"]].sum().sort_index()\n'
        'result = daily.loc[pd.IndexSlice["Holm", 7:9], :].reset_index()'),
    "a slice and a label, each level in turn": (
        'daily = trips.groupby(["pier", "cars"])[["fare"]].sum().sort_index()\n'
        'result = daily.loc[pd.IndexSlice["Holm":"Øyra", 2], :].reset_index()'),
    "a slice of text labels after sort_index": (
        REINDEXED + 'result = daily.sort_index().loc[pd.IndexSlice["Holm":"Skál", :], "fare"].reset_index()'),
    "unstacked by pier, days with a crossing, written as day/month": (
        REINDEXED + 'wide = daily["cars"].unstack("pier", fill_value=0)\n'
        'wide = wide[wide.sum(axis=1) > 0]\n'
        'wide.index = wide.index.strftime("%d/%m")\n'
        'result = wide.rename_axis(index="day", columns=None).reset_index()'),
    "a Series reindexed over the range read from the data": (
        'per_day = trips.groupby("day")["cars"].sum()\n'
        'days = pd.date_range(trips["day"].min(), trips["day"].max(), freq="D")\n'
        'result = per_day.reindex(days, fill_value=0).rename_axis("day").reset_index()'),
    "the range read from the data as a column of a frame": (
        'days = pd.date_range(trips["day"].min(), trips["day"].max(), freq="D")\n'
        'calendar = pd.DataFrame({"day": days, "open": True})\n'
        'result = calendar.merge(trips, on="day", how="left")'),
    "times of day kept at both ends, twelve-hour steps": (
        'trips["day"] = trips["day"] + pd.to_timedelta(trips["cars"], unit="h")\n'
        'days = pd.date_range(trips["day"].min(), trips["day"].max(), freq="12h")\n'
        'result = pd.DataFrame({"at": days})'),
}


@pytest.mark.parametrize("source", list(CASES.values()), ids=list(CASES))
def test_reindex_on_a_product_matches_pandas(source: str) -> None:
    result = differential(HEAD + source + "\n")
    assert not [s for s in result.sites if s.status in ("todo", "handover")], result.converted_text


def test_every_site_is_stated_certain_on_the_reindex() -> None:
    result = differential(HEAD + REINDEXED + 'result = daily.reset_index()\n')
    # (from_product is lowered for a level list holding nan, which it cannot see here)
    mine = ("pd.date_range", "frame.reindex", "frame.swaplevel", "frame.loc", "frame.droplevel")
    assert all(s.confidence >= 1.0 for s in result.sites if s.key in mine), [
        (s.key, s.confidence) for s in result.sites if s.confidence < 1.0]
    assert "pl.datetime_range(" in result.converted_text
    assert 'how="cross"' in result.converted_text


@pytest.mark.parametrize("name", ["every pier on every day, whole numbers stay whole, NaN kept",
                                  "unstacked by pier, days with a crossing, written as day/month",
                                  "one pier's rows, its level dropped"])
def test_values_agree_to_the_last_digit(name: str) -> None:
    # the sites of the steps ported here are stated at 1.0; other sites of the snippet (the
    # frame written out, unique()) are not, so differential compares within 1e-9: compare
    # exactly here
    source = HEAD + CASES[name] + "\n"
    converted = convert(source)
    expected, actual = run(source), run(converted.converted_text)
    with exact_floats():
        assert_same_value(expected["result"], actual["result"])


RAISES = {
    "a pier no row holds: KeyError in both": (
        KeyError, REINDEXED + 'picked = daily.loc[pd.IndexSlice["Vik", :], :]\n'
        'result = picked.reset_index()\n'),
    "a combination no row holds: KeyError in both": (
        KeyError, 'daily = trips.groupby(["pier", "cars"])[["fare"]].sum()\n'
        'result = daily.sort_index().loc[pd.IndexSlice["Holm":"Skál", 7], :].reset_index()\n'),
    "no dates at all: both stop at the range": (
        Exception, 'empty = trips[trips["cars"] > 100]\n'
        'days = pd.date_range(empty["day"].min(), empty["day"].max(), freq="D")\n'
        'result = pd.DataFrame({"day": days})\n'),
}


@pytest.mark.parametrize("error, source", list(RAISES.values()), ids=list(RAISES))
def test_what_pandas_refuses_is_refused(error: type[Exception], source: str) -> None:
    converted = convert(HEAD + source)
    assert not [s for s in converted.sites if s.status in ("todo", "handover")], \
        converted.converted_text
    with pytest.raises(error):
        run(HEAD + source)
    with pytest.raises(error):
        run(converted.converted_text)


@pytest.mark.parametrize("source", [
    # labels that repeat: pandas raises ("cannot handle a non-unique multi-index!")
    'full = pd.MultiIndex.from_product([["Holm", "Skál"], [2, 4]], names=["pier", "cars"])\n'
    'try:\n'
    '    trips.set_index(["pier", "cars"]).reindex(full, fill_value=0)\n'
    '    result = "no error"\n'
    'except ValueError:\n'
    '    result = "ValueError"\n',
    # a slice of a level on rows not sorted by the keys: pandas raises UnsortedIndexError
    REINDEXED + 'result = daily.swaplevel().loc[pd.IndexSlice["2026-06-09":"2026-06-12", :], :].reset_index()\n',
    # sorted by other keys than the ones labelling the rows now
    REINDEXED + 'by_day = daily.sort_index().reset_index().set_index(["day", "pier"])\n'
    'result = by_day.loc[pd.IndexSlice["2026-06-09":"2026-06-12", :], :].reset_index()\n',
])
def test_what_porter_cannot_check_stays_a_todo(source: str) -> None:
    result = convert(HEAD + source)
    assert [s for s in result.sites if s.status == "todo"], result.converted_text


def test_a_level_made_of_a_frames_labels_stays_pandas() -> None:
    # written into the Polars frame as the script wrote it, `piers.index` was read from a
    # LazyFrame (the converted script stopped); it stays pandas code, which pandas runs
    source = HEAD + REINDEXED.replace(
        "piers = sorted(trips[\"pier\"].dropna().unique())",
        "piers = trips.dropna(subset=[\"pier\"]).groupby(\"pier\")[\"cars\"].sum()").replace(
        "[piers, days]", "[piers.index, days]") + "result = daily.reset_index()\n"
    result = differential(source)
    assert [s for s in result.sites if s.key == "pd.MultiIndex.from_product"
            and s.status == "todo"], result.converted_text


@pytest.mark.parametrize("freq", ["D", "24h", "6h"])
def test_a_range_over_the_clock_change_matches_pandas(freq: str) -> None:
    # pandas 3's Day is a calendar day, as Polars' "1d"; 24h is a fixed duration in both
    source = f'''
import pandas as pd
sailings = pd.DataFrame({{"at": ["2026-03-27 10:00", "2026-03-31 09:30", "2026-03-29 12:00"], "cars": [3, 1, 2]}})
sailings["at"] = pd.to_datetime(sailings["at"]).dt.tz_localize("Europe/Oslo")
days = pd.date_range(sailings["at"].min(), sailings["at"].max(), freq="{freq}")
result = pd.DataFrame({{"at": days}})
'''
    result = differential(source)
    assert not [s for s in result.sites if s.status in ("todo", "handover")], result.converted_text


def test_a_product_read_otherwise_stays_pandas_and_agrees() -> None:
    # the MultiIndex is printed too: pandas' own, and the range in it pandas' DatetimeIndex
    source = HEAD + REINDEXED + 'print(len(full))\nresult = daily.reset_index()\n'
    result = differential(source)
    assert {s.key for s in result.sites if s.status == "todo"} >= {
        "pd.date_range", "pd.MultiIndex.from_product"}, result.converted_text


@pytest.mark.parametrize("source", [
    # levels without names: pandas names a level after the Series given for it
    REINDEXED.replace(', names=["pier", "day"]', '') + 'result = daily.reset_index()\n',
    # the product ported, the reindex not (no fill_value: NaN rows, whole numbers made
    # floats): pandas' MultiIndex of its labels
    'daily = trips.groupby(["pier", "day"]).agg(cars=("cars", "sum"), fare=("fare", "sum"))\n'
    'days = pd.date_range(trips["day"].min(), trips["day"].max(), freq="D")\n'
    'full = pd.MultiIndex.from_product([["Holm", "Skál"], days], names=["pier", "day"])\n'
    'result = daily.reindex(full).reset_index()\n',
    # a range from the data over a Series and a table kept on pandas (no fill_value): the
    # labels unnamed, as pandas' DatetimeIndex
    'per_day = trips.groupby("day")["cars"].sum()\n'
    'days = pd.date_range(trips["day"].min(), trips["day"].max(), freq="D")\n'
    'result = per_day.reindex(days).reset_index()\n',
    'per_day = trips.groupby("day")[["cars"]].sum()\n'
    'days = pd.date_range(trips["day"].min(), trips["day"].max(), freq="D")\n'
    'result = per_day.reindex(days).reset_index()\n',
])
def test_a_product_porter_does_not_port_agrees(source: str) -> None:
    result = differential(HEAD + source)
    assert [s for s in result.sites if s.status == "todo"], result.converted_text


def test_whole_numbers_pandas_holds_as_floats_agree() -> None:
    # a left merge leaves a pier without a fee: pandas holds the fees as floats, and the fill
    # of the new rows is written 0.0
    source = HEAD + '''
fees = pd.DataFrame({"pier": ["Holm", "Skál"], "fee": [3, 4]})
trips = trips.merge(fees, on="pier", how="left")
daily = trips.groupby(["pier", "day"])[["fee"]].max()
days = pd.date_range(trips["day"].min(), trips["day"].max(), freq="D")
full = pd.MultiIndex.from_product([["Holm", "Øyra"], days], names=["pier", "day"])
result = daily.reindex(full, fill_value=0).reset_index()
result.to_csv("/dev/null")
'''
    differential(source)
