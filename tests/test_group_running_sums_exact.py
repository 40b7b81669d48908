"""Running sums within groups (groupby(...)[col].cumsum(), transform("cumsum")) to the last
digit, as pandas computes them (pandas is the reference).

pandas adds a group's floats with a compensated (Kahan) running sum, where a plain running sum
(Polars' cum_sum) drifts: ten 0.1s end at 1.0 in pandas and 0.9999999999999999 in a plain sum,
and a casting log's running metal was written 8754.199999999999 for pandas' 8754.2. A rolling
sum over a window of equal values is checked too: pandas gives the value times its count. The
checks compare the text each side writes: a CSV holds the shortest text that reads back as
the same float, so equal text is the same number, bit for bit.
"""

from __future__ import annotations

import numpy as np
import pandas as pd
import pytest

from support import converted_text, same_text

# an orchard co-op's picking log: crates of apples weighed per picker, in the order weighed
TENTHS = "picker,kg\n" + "".join(f"{'Ava' if i % 3 else 'Émile'},0.1\n" for i in range(30))


def picking_log(values: np.ndarray, seed: int, missing: float = 0.0,
                missing_keys: bool = False) -> str:
    """A picking log of `values` in the order weighed over four pickers (one unicode name),
    with a share of `missing` weights left blank and, if asked, some pickers not noted."""
    rng = np.random.default_rng(seed)
    pickers = rng.choice(["Ava", "Émile", "Zoë", "Bram"], len(values)).astype(object)
    if missing_keys:
        pickers[rng.random(len(values)) < 0.1] = None
    values = values.astype(float)
    values[rng.random(len(values)) < missing] = np.nan
    return pd.DataFrame({"picker": pickers, "kg": values}).to_csv(index=False)


def hard_values(kind: str, rows: int = 600, seed: int = 1) -> np.ndarray:
    rng = np.random.default_rng(seed)
    if kind == "tenths":
        return np.full(rows, 0.1)
    if kind == "cancelling":
        return np.tile([1e16, 1.0, -1e16, 3.3, 0.7, -2.2], rows // 6)
    if kind == "large and small":
        return np.where(rng.random(rows) < 0.5, rng.uniform(1e12, 1e13, rows),
                        rng.uniform(0, 1e-3, rows))
    if kind == "one decimal":
        return np.round(rng.uniform(0, 900, rows), 1)
    return rng.uniform(-1e3, 1e3, rows)


SCRIPT = """
    import pandas as pd
    log = pd.read_csv("picks.csv")
    log["to_date"] = log.groupby("picker")["kg"].cumsum()
    log["by_name"] = log.groupby("picker")["kg"].transform("cumsum")
    log.to_csv("running.csv", index=False)
    print(log["to_date"].tolist()[-5:])
    """


def test_ten_tenths_end_at_one_as_in_pandas(tmp_path):
    result = same_text(SCRIPT, tmp_path, {"picks.csv": TENTHS})
    assert ".cum_sum()" not in result.converted_text
    sites = [s for s in result.sites if s.key in ("groupby.cumsum", "groupby.transform")]
    assert sites and all(s.confidence == 1.0 for s in sites), sites


@pytest.mark.parametrize("kind", ["tenths", "cancelling", "large and small", "one decimal",
                                  "uniform"])
@pytest.mark.parametrize("missing", [0.0, 0.2])
def test_running_sums_of_hard_values_are_pandas_digits(tmp_path, kind, missing):
    # pandas gives a missing weight NaN and carries on past it; a missing picker gets NaN
    csv = picking_log(hard_values(kind), seed=3, missing=missing, missing_keys=missing > 0)
    same_text(SCRIPT, tmp_path, {"picks.csv": csv})


@pytest.mark.parametrize("with_data", [True, False])
def test_running_sums_of_a_column_of_unknown_type(tmp_path, with_data):
    # without --data the column's type is not known: floats still get pandas' digits
    csv = picking_log(hard_values("one decimal", rows=300), seed=4, missing=0.1,
                      missing_keys=True)
    same_text(SCRIPT, tmp_path, {"picks.csv": csv}, with_data=with_data)


@pytest.mark.parametrize("missing_key", [False, True])
def test_running_sums_of_whole_numbers_stay_whole(tmp_path, missing_key):
    # crates counted: int64 in pandas (written 3), float64 where a picker is not noted (3.0)
    rows = ["Ava,2", "Zoë,1", "Ava,3", "Bram,4", "Zoë,5"] + ([",6"] if missing_key else [])
    same_text("""
        import pandas as pd
        log = pd.read_csv("crates.csv")
        log["to_date"] = log.groupby("picker")["crates"].cumsum()
        log.to_csv("running.csv", index=False)
        log.dropna(subset=["picker"]).to_csv("noted.csv", index=False)
        """, tmp_path, {"crates.csv": "picker,crates\n" + "\n".join(rows) + "\n"})


def test_a_running_sum_keeps_pandas_nan_after_an_infinite_sum(tmp_path):
    # kg per crate: a crate noted with 0 crates divides by zero (inf). pandas' compensation
    # turns NaN once the sum is infinite, and so does every later value of that picker
    same_text("""
        import pandas as pd
        log = pd.read_csv("crates.csv")
        log["per_crate"] = log["kg"] / log["crates"]
        log["to_date"] = log.groupby("picker")["per_crate"].cumsum()
        log["by_name"] = log.groupby("picker")["per_crate"].transform("cumsum")
        log.to_csv("running.csv", index=False)
        """, tmp_path, {"crates.csv": "picker,kg,crates\nAva,10.5,2\nZoë,3.0,1\nAva,4.0,0\n"
                                      "Ava,,1\nAva,2.5,1\nZoë,-1.0,0\nZoë,1.0,0\nZoë,0.1,1\n"
                                      "Bram,0.1,1\nBram,0.2,1\n"})


def test_running_sums_with_a_missing_key_kept_as_a_group(tmp_path):
    csv = picking_log(hard_values("tenths", rows=60), seed=5, missing=0.2, missing_keys=True)
    same_text("""
        import pandas as pd
        log = pd.read_csv("picks.csv")
        log["to_date"] = log.groupby("picker", dropna=False)["kg"].cumsum()
        log.to_csv("running.csv", index=False)
        """, tmp_path, {"picks.csv": csv})


def test_running_sums_of_a_log_filtered_to_no_rows(tmp_path):
    same_text(SCRIPT.replace('log = pd.read_csv("picks.csv")',
                             'log = pd.read_csv("picks.csv")\n    log = log[log["kg"] > 1000]'),
              tmp_path, {"picks.csv": TENTHS})


def test_the_running_sum_is_one_readable_expression():
    text = converted_text("""
        import pandas as pd
        log = pd.read_csv("picks.csv")
        log["to_date"] = log.groupby("picker")["kg"].cumsum()
        """)
    assert 'pl.col("kg").rolling_sum(2 ** 31 - 1, min_samples=1)' in text
    assert ".to_pandas()" not in text and "map_batches" not in text
    assert max(len(line) for line in text.splitlines() if "rolling_sum" in line) <= 88


def test_rolling_sums_of_equal_weights_are_pandas_products(tmp_path):
    # pandas' rolling sum gives a window whose values are all equal that value times their
    # count (five 2.2 kg crates: 11.0), where the sum as the window moves ends at
    # 11.000000000000002
    rng = np.random.default_rng(7)
    weights = np.repeat(rng.choice([0.1, 0.7, 1.3, 2.2, 0.0, -0.0], 40), 8)
    pickers = rng.choice(["Ava", "Émile", "Zoë"], len(weights))
    csv = pd.DataFrame({"picker": pickers, "kg": weights}).to_csv(index=False)
    same_text("""
        import pandas as pd
        log = pd.read_csv("picks.csv")
        log["last5"] = log["kg"].rolling(5).sum()
        log["near"] = log["kg"].rolling(5, center=True, min_periods=2).sum()
        log["mine3"] = (log.groupby("picker")["kg"].rolling(3, min_periods=1).sum()
                        .reset_index(level=0, drop=True))
        log.to_csv("windows.csv", index=False)
        """, tmp_path, {"picks.csv": csv})
