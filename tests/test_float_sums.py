"""Sums and means of floats to the last digit, as pandas computes them (pandas is the reference).

pandas adds a Series' floats with numpy's pairwise sum and a group's with a compensated sum;
Polars adds them in another order. With a few thousand prices the last digit of most sums
differed (printed 1335365.4825000002 for 1335365.4825), and rounded to cents a sum that lands
on a half cent (prices times 1.25) went the other way. The frames here are made of such
prices, with missing values, so that a plain Polars sum fails these tests.
"""

from __future__ import annotations

import io
import math

import numpy as np
import pytest
import pandas as pd
import polars as pl

from support import same_text


def prices_csv(rows: int = 3000, groups: int = 40, seed: int = 5) -> str:
    """A ledger of prices in cents, a third of them times 1.25 (a half cent is common), with
    missing prices, over `groups` shops and a year of dates."""
    rng = np.random.default_rng(seed)
    price = np.round(rng.uniform(0, 900, rows), 2) * np.where(rng.random(rows) < 0.3, 1.25, 1)
    price[rng.random(rows) < 0.05] = np.nan
    frame = pd.DataFrame({
        "shop": rng.integers(0, groups, rows),
        "day": pd.Timestamp("2024-01-01") + pd.to_timedelta(rng.integers(0, 366, rows), unit="D"),
        "kind": rng.choice(["ferry", "dock", "pier"], rows),
        "price": price,
    })
    return frame.to_csv(index=False)


def exact_group_sums(csv: str, keys: list[str]) -> bool:
    """Whether pandas' compensated group sums of this ledger are the exact sums rounded once
    (math.fsum): true for nearly every group, and what porter's conversion computes; a test on
    a ledger where pandas slips by a unit in the last digit would test the slip."""
    frame = pd.read_csv(io.StringIO(csv))
    sums = frame.groupby(keys)["price"].sum()
    exact = frame.groupby(keys)["price"].agg(lambda s: math.fsum(s.dropna()))
    return bool((sums == exact).all())


def test_series_sum_and_mean_print_pandas_digits(tmp_path):
    csv = prices_csv(seed=7)
    frame = pd.read_csv(io.StringIO(csv))
    # a ledger on which Polars' own sum and mean differ from pandas' in the last digit
    polars_sum = pl.Series(frame["price"].to_numpy(), nan_to_null=True).sum()
    assert polars_sum != frame["price"].sum()
    same_text("""
        import pandas as pd
        d = pd.read_csv("prices.csv")
        print(d["price"].sum(), d["price"].mean())
        ferry = d[d["kind"] == "ferry"]
        print(ferry["price"].sum(), ferry["price"].mean(), round(ferry["price"].mean(), 4))
        none = d[d["shop"] > 1000]
        print(none["price"].sum(), none["price"].mean())
        print(f"{d['price'].sum():.2f} {d['price'].mean()}")
    """, tmp_path, {"prices.csv": csv})


def test_group_sums_and_means_are_pandas_to_the_last_digit(tmp_path):
    csv = prices_csv(rows=6000, groups=30, seed=5)
    assert exact_group_sums(csv, ["shop"]) and exact_group_sums(csv, ["shop", "kind"])
    same_text("""
        import pandas as pd
        d = pd.read_csv("prices.csv")
        t = d.groupby("shop", as_index=False).agg(total=("price", "sum"), avg=("price", "mean"))
        t["cents"] = t["total"].round(2)
        t.to_csv("per_shop.csv", index=False)
        k = d.groupby(["shop", "kind"])["price"].sum().reset_index()
        k.to_csv("per_kind.csv", index=False)
        d["shop_total"] = d.groupby("shop")["price"].transform("sum")
        d["shop_mean"] = d.groupby("shop")["price"].transform("mean")
        d[["shop", "shop_total", "shop_mean"]].to_csv("windows.csv", index=False)
    """, tmp_path, {"prices.csv": csv})


def test_pivot_table_and_resample_sums(tmp_path):
    csv = prices_csv(rows=4000, groups=6, seed=2)
    assert exact_group_sums(csv, ["shop", "kind"])
    frame = pd.read_csv(io.StringIO(csv), parse_dates=["day"])
    monthly = frame.set_index("day")["price"].resample("MS").sum()
    exact = frame.groupby(frame["day"].dt.to_period("M"))["price"].agg(
        lambda s: math.fsum(s.dropna()))
    assert (monthly.to_numpy() == exact.to_numpy()).all()
    same_text("""
        import pandas as pd
        d = pd.read_csv("prices.csv", parse_dates=["day"])
        p = d.pivot_table(index="shop", columns="kind", values="price", aggfunc="sum", fill_value=0)
        p.round(2).to_csv("pivot.csv")
        m = d.set_index("day")["price"].resample("MS").sum().reset_index()
        m.to_csv("monthly.csv", index=False)
    """, tmp_path, {"prices.csv": csv})


def test_groups_of_missing_values_infinities_and_none(tmp_path):
    same_text("""
        import pandas as pd
        d = pd.read_csv("odd.csv")
        t = d.groupby("k").agg(total=("v", "sum"), avg=("v", "mean"))
        t.to_csv("odd_out.csv")
        print(d["v"].sum(), d["v"].mean())
        e = d[d["k"] == "zz"]
        print(e["v"].sum(), e["v"].mean())
        print(e.groupby("k")["v"].sum().to_dict())
    """, tmp_path, {"odd.csv": """\
        k,v
        a,
        a,
        b,1.5
        c,inf
        c,2.0
        d,-inf
        d,inf
        e,0.1
        e,0.2
        e,-0.0
        """})


def temperatures_csv(rows: int = 5000, stations: int = 40, seed: int = 1) -> str:
    """Hourly temperatures of both signs at forty stations: sums that cancel, where pandas'
    compensated sum keeps an error of its own in many groups (not the exact sum rounded)."""
    rng = np.random.default_rng(seed)
    temp = np.round(rng.normal(0.5, 6.0, rows), 1)
    temp[rng.random(rows) < 0.04] = np.nan
    frame = pd.DataFrame({
        "station": rng.integers(0, stations, rows),
        "at": pd.Timestamp("2024-03-01") + pd.to_timedelta(np.sort(rng.integers(0, 90 * 24, rows)), unit="h"),
        "temp": temp,
    })
    return frame.to_csv(index=False)


def test_group_sums_that_cancel_are_pandas_compensated_sums(tmp_path):
    # pandas' group sum is a compensated (Kahan) sum in row order: where temperatures of both
    # signs cancel, it is not the exact sum rounded in many groups (checked first, so that the
    # test needs porter's pandas_group_sums and not an exact sum)
    csv = temperatures_csv()
    frame = pd.read_csv(io.StringIO(csv), parse_dates=["at"])
    assert not exact_group_sums(csv.replace("temp", "price"), ["station"])
    daily = frame.set_index("at")["temp"].resample("D").sum()
    exact = frame.groupby(frame["at"].dt.floor("D"))["temp"].agg(lambda s: math.fsum(s.dropna()))
    assert (daily.loc[exact.index].to_numpy() != exact.to_numpy()).any()
    same_text("""
        import pandas as pd
        d = pd.read_csv("temps.csv", parse_dates=["at"])
        t = d.groupby("station").agg(total=("temp", "sum"), avg=("temp", "mean"), n=("temp", "count"))
        t.to_csv("per_station.csv")
        daily = d.set_index("at")["temp"].resample("D").sum().reset_index()
        daily.to_csv("daily.csv", index=False)
        means = d.set_index("at").resample("W")["temp"].mean()
        means.to_csv("weekly.csv")
        p = d.pivot_table(index="station", columns=d["at"].dt.month.rename("month"), values="temp", aggfunc="sum")
        print(d.groupby(["station"])["temp"].sum().tolist())
    """, tmp_path, {"temps.csv": csv})


def test_window_sums_that_cancel_are_pandas_compensated_sums(tmp_path):
    # a transform's sum is pandas' group sum spread over the rows: the same compensated sum,
    # which is not the exact sum rounded where temperatures of both signs cancel (checked in
    # the test above); here the sum sits inside a window and a larger expression
    csv = temperatures_csv(seed=4)
    assert not exact_group_sums(csv.replace("temp", "price"), ["station"])
    same_text("""
        import pandas as pd
        d = pd.read_csv("temps.csv", parse_dates=["at"])
        d["station_total"] = d.groupby("station")["temp"].transform("sum")
        d["station_mean"] = d.groupby("station")["temp"].transform("mean")
        d["share"] = d["temp"] / d.groupby("station")["temp"].transform("sum")
        d.to_csv("with_totals.csv", index=False)
    """, tmp_path, {"temps.csv": csv})


def test_resampled_sums_without_missing_values_are_numpy_reduceat(tmp_path):
    # a resample bins rows sorted by time: pandas 3.1 adds each bin with numpy's reduceat (the
    # first value plus numpy's pairwise sum of the rest) where no value of the column (of the
    # group, after a groupby) is missing, and with its compensated sum otherwise; these
    # temperatures have no missing value, and the bins' Kahan sums differ from pandas' in many
    frame = pd.read_csv(io.StringIO(temperatures_csv()), parse_dates=["at"])
    frame["temp"] = frame["temp"].fillna(0.0)  # no missing temperature
    csv = frame.to_csv(index=False)
    assert frame["temp"].notna().all()

    def kahan(values):
        total = carry = 0.0
        for x in values:
            y = x - carry
            t = total + y
            carry, total = (t - total) - y, t
        return total

    daily = frame.set_index("at")["temp"].resample("D").sum()
    kahans = frame.groupby(frame["at"].dt.floor("D"))["temp"].agg(lambda s: kahan(s.tolist()))
    assert (daily.loc[kahans.index].to_numpy() != kahans.to_numpy()).any()
    with_gap = frame.copy()
    with_gap.loc[with_gap["station"] == 3, "temp"] = np.nan  # one station with no value
    with_gap.to_csv(tmp_path / "gaps.csv", index=False)
    same_text("""
        import pandas as pd
        d = pd.read_csv("temps.csv", parse_dates=["at"])
        daily = d.set_index("at")["temp"].resample("D").sum().reset_index()
        daily.to_csv("daily.csv", index=False)
        per = d.set_index("at").groupby("station")["temp"].resample("W").mean().reset_index()
        per.to_csv("per_station_weekly.csv", index=False)
        g = pd.read_csv("gaps.csv", parse_dates=["at"])
        both = g.groupby("station").resample("D", on="at")["temp"].sum().reset_index()
        both.to_csv("gaps_daily.csv", index=False)
        print(g.set_index("at")["temp"].resample("D").sum().tolist())
    """, tmp_path, {"temps.csv": csv, "gaps.csv": (tmp_path / "gaps.csv").read_text()})


def test_groupby_of_rows_sorted_by_their_keys_is_numpy_reduceat(tmp_path):
    # pandas 3.1 adds a groupby's floats with numpy's reduceat where the rows come sorted by
    # the keys (a missing key only at the front) and the column has no missing value, and
    # with its compensated sum otherwise: the conversion tells the two apart on the rows
    frame = pd.read_csv(io.StringIO(temperatures_csv()), parse_dates=["at"])
    frame["temp"] = frame["temp"].fillna(0.0)
    frame = frame.sort_values(["station", "at"], kind="stable")
    csv = frame.to_csv(index=False)
    sums = frame.groupby("station")["temp"].sum()

    def kahan(values):
        total = carry = 0.0
        for x in values:
            y = x - carry
            t = total + y
            carry, total = (t - total) - y, t
        return total

    kahans = frame.groupby("station")["temp"].agg(lambda s: kahan(s.tolist()))
    assert (sums != kahans).any()  # the two adders differ on these rows
    gap = frame.copy()
    gap.loc[gap.index[-1], "temp"] = np.nan  # one missing value: the compensated sum
    first = frame.copy()  # a missing key only at the front: dropped, still in key order
    first["station"] = first["station"].astype(str).where(first["station"] > 0)
    last = first.iloc[::-1].sort_values("station", kind="stable")  # missing keys last
    files = {"temps.csv": csv, "gap.csv": gap.to_csv(index=False),
             "first.csv": first.to_csv(index=False), "last.csv": last.to_csv(index=False),
             "shuffled.csv": frame.sample(frac=1.0, random_state=3).to_csv(index=False)}
    same_text("""
        import pandas as pd
        d = pd.read_csv("temps.csv", parse_dates=["at"])
        t = d.groupby("station").agg(total=("temp", "sum"), avg=("temp", "mean"))
        t.to_csv("sorted_out.csv")
        d["day"] = d["at"].dt.strftime("%m-%d")
        two = d.groupby(["station", "day"])["temp"].sum().reset_index()
        two.to_csv("two_keys_out.csv", index=False)
        for name in ["gap", "first", "last", "shuffled"]:
            e = pd.read_csv(f"{name}.csv", dtype={"station": str})
            e.groupby("station")["temp"].sum().to_csv(f"{name}_out.csv")
    """, tmp_path, files)


def test_sums_of_columns_of_unknown_type_are_pandas_too(tmp_path):
    # without --data, or after a frame came back from pandas, porter does not know that a
    # column holds floats: its group sums and means are still pandas' (ten 0.1 are 1.0 in
    # pandas' compensated sum, 0.9999999999999999 in Polars' own), whole numbers and
    # True/False stay whole
    rows = "".join(f"a,0.1,{i},True\nb,0.3,2,False\n" for i in range(10))
    script = """
        import pandas as pd
        d = pd.read_csv("f.csv")
        def tidy(df):
            df["k"] = df["k"].str.upper()
        tidy(d)
        out = d.groupby("k", as_index=False).agg(v=("v", "sum"), m=("v", "mean"),
                                                  n=("n", "sum"), b=("flag", "sum"))
        out.to_csv("o.csv", index=False)
        print(d.groupby("k")["v"].sum().tolist(), d.groupby("k")["n"].mean().tolist())
        e = pd.read_csv("f.csv")
        e.groupby("k")["v"].sum().to_csv("plain.csv")
    """
    (tmp_path / "with").mkdir()
    (tmp_path / "without").mkdir()
    same_text(script, tmp_path / "with", {"f.csv": "k,v,n,flag\n" + rows})
    same_text(script, tmp_path / "without", {"f.csv": "k,v,n,flag\n" + rows}, with_data=False)



def test_frame_sums_of_columns_of_unknown_type_are_pandas_too(tmp_path):
    # df.groupby(k).sum() / mean() over every column, none of whose types porter knows
    # (no --data): each column's sum is still pandas' (ten 0.1 are 1.0), whole numbers and
    # True/False stay whole
    rows = "".join(f"a,0.1,{i},True\nb,0.3,2,False\n" for i in range(10))
    same_text("""
        import pandas as pd
        d = pd.read_csv("f.csv")
        d.groupby("k").sum().to_csv("sums.csv")
        d.groupby("k").mean().to_csv("means.csv")
        print(d.groupby("k")[["v"]].sum()["v"].tolist())
    """, tmp_path, {"f.csv": "k,v,n,flag\n" + rows}, with_data=False)

def group_sums_helper():
    """The pandas_group_sums definition that porter writes into a converted script, defined
    here as the script defines it."""
    from porter.rules.groupby import GROUP_SUMS_DEFINITION

    space = {"pl": pl}
    exec(GROUP_SUMS_DEFINITION, space)
    return space["pandas_group_sums"]


@pytest.mark.parametrize("groups", [1, 3, 40, 1500, 20000])
def test_group_sums_helper_is_pandas_for_few_long_and_many_short_groups(groups):
    # pandas (the reference) adds a group's floats with a compensated sum in row order when
    # the rows are not sorted by key; the helper must end on the same digits whether the
    # groups are few and long or many and short, with missing values and infinities about
    rng = np.random.default_rng(groups)
    rows = 60_000
    value = np.concatenate([
        np.round(rng.uniform(-900, 900, rows // 3), 2),
        np.round(rng.uniform(0, 500, rows // 3), 2) * 1.25,
        rng.normal(0, 1e6, rows - 2 * (rows // 3)),
    ])
    rng.shuffle(value)
    value[rng.random(rows) < 0.03] = np.nan
    key = rng.integers(0, groups, rows)
    key[0], key[-1] = groups - 1, 0  # rows out of key order: pandas' compensated sum
    if groups > 2:  # infinities of both signs in one group, of one sign in another
        value[np.flatnonzero(key == 1)[:2]] = [np.inf, -np.inf]
        value[np.flatnonzero(key == 2)[:1]] = np.inf
    helper = group_sums_helper()
    for mean in (False, True):
        grouped = pd.DataFrame({"k": key, "v": value}).groupby("k")["v"]
        expected = (grouped.mean() if mean else grouped.sum()).to_numpy()
        got = (pl.DataFrame({"k": key, "v": value}).lazy().group_by("k").agg(pl.col("v"))
               .with_columns(helper(pl.col("v"), mean=mean)).sort("k").collect()["v"]
               .fill_null(float("nan")).to_numpy())
        assert len(got) == len(expected)
        assert ((got == expected) | (np.isnan(got) & np.isnan(expected))).all(), \
            f"{(got != expected).sum()} of {len(got)} groups differ (mean={mean})"
