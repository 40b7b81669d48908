"""A column divided by its own total, or centred on its own mean, to the last digit.

`d["share"] = d["dry"] / d["dry"].sum()` is how most notebooks compute shares. pandas adds
the column with numpy's pairwise sum (missing values skipped); inside a Polars expression the
total was Polars' own sum, which adds in another order: on a day ledger of a kelp yard the
share was written 0.23972844534962662 where pandas writes 0.2397284453496266.
"""

from __future__ import annotations

import io

import numpy as np
import pandas as pd
import polars as pl
import pytest

from support import same_text


def weights_csv(rows: int = 400, seed: int = 8) -> str:
    """Dry weights in hundredths of a kilo, some missing, over a few racks and days."""
    rng = np.random.default_rng(seed)
    dry = np.round(rng.uniform(0, 60, rows), 2)
    dry[rng.random(rows) < 0.05] = np.nan
    frame = pd.DataFrame({"rack": rng.choice(["R1", "R2", "Rø"], rows),
                          "day": rng.integers(1, 80, rows), "dry": dry})
    return frame.to_csv(index=False)


GROUPED_SEED = 8


def test_the_ledgers_sum_differently_in_polars():
    def polars_sum(values: pd.Series) -> float:
        return pl.Series(values.to_numpy(), nan_to_null=True).sum()

    frame = pd.read_csv(io.StringIO(weights_csv()))
    assert polars_sum(frame["dry"]) != frame["dry"].sum()
    rack = frame[frame["rack"] == "Rø"]["dry"]
    assert polars_sum(rack) != rack.sum()
    days = pd.read_csv(io.StringIO(weights_csv(rows=3000, seed=GROUPED_SEED)))
    totals = days.groupby("day")["dry"].sum()
    assert polars_sum(totals) != totals.sum()


def test_share_of_the_column_total(tmp_path):
    same_text("""
        import pandas as pd
        d = pd.read_csv("dry.csv")
        d["share"] = d["dry"] / d["dry"].sum()
        d["pct"] = (d["dry"] / d["dry"].sum() * 100).round(4)
        d["centred"] = d["dry"] - d["dry"].mean()
        d.to_csv("shares.csv", index=False)
    """, tmp_path, {"dry.csv": weights_csv()})


def test_share_of_a_grouped_total(tmp_path):
    same_text("""
        import pandas as pd
        d = pd.read_csv("dry.csv")
        t = d.groupby("day").agg(n=("dry", "count"), dry=("dry", "sum")).reset_index()
        t["dry_share"] = t["dry"] / t["dry"].sum()
        t["above_mean"] = t["dry"] - t["dry"].mean()
        t.to_csv("per_rack.csv", index=False)
    """, tmp_path, {"dry.csv": weights_csv(rows=3000, seed=GROUPED_SEED)})


def test_share_of_a_filtered_frame(tmp_path):
    same_text("""
        import pandas as pd
        d = pd.read_csv("dry.csv")
        r = d[d["rack"] == "Rø"].copy()
        r["share"] = r["dry"] / r["dry"].sum()
        r.to_csv("rack.csv", index=False)
        e = d[d["dry"] > 1000].copy()
        e["share"] = e["dry"] / e["dry"].sum()
        e["centred"] = e["dry"] - e["dry"].mean()
        e.to_csv("none.csv", index=False)
    """, tmp_path, {"dry.csv": weights_csv()})


@pytest.mark.parametrize("with_data", [True, False])
def test_a_group_function_keeps_polars_own_reductions(tmp_path, with_data):
    # inside a function of each group the reduction stays Polars' own, computed per group by
    # .over(): numpy's sum would be a Python call per group (20 times slower at 10,000 groups)
    result = same_text("""
        import pandas as pd
        d = pd.read_csv("dry.csv")
        d["c"] = d.groupby("rack")["dry"].transform(lambda s: s - s.mean())
        d["t"] = d.groupby("rack")["dry"].transform(lambda s: s / s.max())
        d.round(9).to_csv("groups.csv", index=False)
    """, tmp_path, {"dry.csv": weights_csv()}, with_data=with_data)
    assert "pandas_reduce(" not in result.converted_text
    assert "pandas_column_total(" not in result.converted_text
