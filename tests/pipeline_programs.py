"""Pandas pipelines nobody wrote: a hypothesis strategy that chains steps real scripts use
(filters, sorts, new columns, fills, merges, groupbys, window and group functions, string
methods) on small frames that are hard on purpose (missing keys and values, NaN, ties,
duplicates, accented text, zero). Each program ends in `result = df`.

Used by tests/test_generated_pipelines.py (a fixed number of examples in the suite) and on
demand for a longer search:

    python tests/pipeline_programs.py --examples 300     # prints each program that differs
"""

from __future__ import annotations

from dataclasses import dataclass

from hypothesis import strategies as st

PRELUDE = """\
import numpy as np
import pandas as pd
df = pd.DataFrame({
    "k": ["b", "a", None, "b", "a", "c", "É", "a", "b", "c"],
    "g": ["x", "y", "x", None, "y", "x", "x", "y", "x", "y"],
    "v": [1.5, np.nan, 3.0, -2.25, 5.0, 0.0, np.nan, 2.5, 1.5, 7.125],
    "n": [1, 2, 3, 4, 5, 6, 7, 8, 8, 0],
    "t": ["p", "q ", None, "Ünï", "p", "", "r", " q", "p", "s"],
    "ds": ["2026-03-01", "2026-03-02", None, "2026-02-28", "2026-03-01", "2026-04-30",
           "2026-03-15", "", "2026-01-01", "2026-03-02"],
})
df["d"] = pd.to_datetime(df["ds"])
other = pd.DataFrame({"k": ["a", "b", "d", "a", None], "w": [10, 20, 30, 40, 50]})
"""


@dataclass(frozen=True)
class Step:
    """One statement: the columns it needs (`numbers`: those that must still hold numbers),
    the columns it adds or leaves (each "name:n" for numbers, "name:t" for text), and whether
    it remakes the frame (a groupby: only the columns it leaves are there after it)."""

    code: str
    needs: frozenset[str]
    numbers: frozenset[str]
    adds: tuple[tuple[str, str], ...]
    remakes: bool


def _s(code: str, needs: str = "", numbers: str = "", adds: str = "", leaves: str | None = None) -> Step:
    given = leaves if leaves is not None else adds
    columns = tuple((c.split(":")[0], c.split(":")[1]) for c in given.split())
    return Step(code, frozenset(needs.split()) | frozenset(numbers.split()),
                frozenset(numbers.split()), columns, leaves is not None)


STEPS = [
    # filters and row selections
    _s('df = df[df["v"] > 1]', numbers="v"),
    _s('df = df[df["n"] % 2 == 0]', numbers="n"),
    _s('df = df[df["k"].notna()]', "k"),
    _s('df = df[df["k"].isin(["a", "c", "É"])]', "k"),
    _s('df = df.dropna(subset=["v"])', "v"),
    _s('df = df.dropna()'),
    _s('df = df.drop_duplicates(subset=["k"])', "k"),
    _s('df = df.drop_duplicates(subset=["k"], keep="last")', "k"),
    _s('df = df.head(6)'),
    _s('df = df.tail(4)'),
    _s('df = df.reset_index(drop=True)'),
    _s('df = df.query("n > 2")', numbers="n"),
    # sorts (a tie breaker keeps the order pandas gives defined)
    _s('df = df.sort_values(["v", "n"], ascending=[False, True])', numbers="v n"),
    _s('df = df.sort_values("k", kind="stable", na_position="first")', "k"),
    _s('df = df.sort_values(["g", "n"], kind="stable")', "g n"),
    _s('df = df.nlargest(4, "n")', numbers="n"),
    # new and changed columns
    _s('df["x"] = df["v"] * 2 + df["n"]', numbers="v n", adds="x:n"),
    _s('df["x"] = df["n"] / df["v"]', numbers="v n", adds="x:n"),
    _s('df["v"] = df["v"].fillna(0)', numbers="v"),
    _s('df["v"] = df["v"].fillna(df["v"].mean())', numbers="v"),
    _s('df["k"] = df["k"].fillna("none")', "k"),
    _s('df["t"] = df["t"].str.strip().str.upper()', "t"),
    _s('df["u"] = df["t"].str.len()', "t", adds="u:n"),
    _s('df["b"] = np.where(df["v"] > 1, "hi", "lo")', numbers="v", adds="b:t"),
    _s('df["d"] = df["n"].map({1: "one", 2: "two", 8: "eight"})', numbers="n", adds="d:t"),
    _s('df.loc[df["n"] > 4, "v"] = 0', numbers="n v"),
    _s('df["r"] = df["v"].rank()', numbers="v", adds="r:n"),
    _s('df["s"] = df["v"].shift(1)', numbers="v", adds="s:n"),
    _s('df["c"] = df["n"].cumsum()', numbers="n", adds="c:n"),
    _s('df["c"] = df.groupby("k")["n"].cumsum()', "k", numbers="n", adds="c:n"),
    _s('df["m"] = df.groupby("g")["v"].transform("mean")', "g", numbers="v", adds="m:n"),
    _s('df["y"] = df["v"].round(1)', numbers="v", adds="y:n"),
    _s('df = df.assign(y=lambda d: d["n"] * 3 - 1)', numbers="n", adds="y:n"),
    _s('df["v"] = df["v"].clip(lower=0, upper=4)', numbers="v"),
    _s('df["z"] = df["v"].apply(lambda x: x * 2 if x > 1 else -x)', numbers="v", adds="z:n"),
    _s('df["e"] = df["v"].where(df["n"] > 3)', numbers="v n", adds="e:n"),
    _s('df["e"] = df["v"].replace(1.5, -1.0)', numbers="v", adds="e:n"),
    _s('df["e"] = df["n"].between(2, 6)', numbers="n", adds="e:b"),
    _s('df["e"] = df.groupby("k").cumcount()', "k", adds="e:n"),
    _s('df["e"] = df["v"].rank(method="dense", ascending=False)', numbers="v", adds="e:n"),
    _s('df["e"] = df["k"].duplicated()', "k", adds="e:b"),
    _s('df["e"] = df["t"].str.contains("p", na=False)', "t", adds="e:b"),
    _s('df["e"] = df["v"].rolling(2).mean()', numbers="v", adds="e:n"),
    _s('df["e"] = df.groupby("g")["v"].diff()', "g", numbers="v", adds="e:n"),
    _s('df["e"] = df["n"].astype(str) + "-" + df["k"].fillna("?")', "n k", adds="e:t"),
    _s('df["e"] = pd.cut(df["v"], bins=[-5, 0, 2, 10]).astype(str)', numbers="v", adds="e:t"),
    _s('df["e"] = df["d"].dt.month', "d", adds="e:n"),
    _s('df["e"] = df["d"].dt.strftime("%Y-%m")', "d", adds="e:t"),
    _s('df = df[df["d"] >= "2026-03-01"]', "d"),
    _s('df["e"] = (df["d"] - pd.Timestamp("2026-01-01")).dt.days', "d", adds="e:n"),
    _s('df = df.loc[df["n"] > 2, ["k", "n"]]', "k", numbers="n", leaves="k:t n:n"),
    _s('df = df.iloc[1:7]'),
    _s('df = df.set_index("k").reset_index()', "k"),
    _s('df = pd.concat([df, df.head(3)])'),
    _s('df = pd.concat([df, df.tail(2)], ignore_index=True)'),
    _s('df["e"] = df.apply(lambda r: r["n"] * 2 if r["k"] == "a" else r["n"], axis=1)', "k",
       numbers="n", adds="e:n"),
    _s('df["e"] = df["v"].interpolate()', numbers="v", adds="e:n"),
    _s('df["e"] = df["v"].ffill()', numbers="v", adds="e:n"),
    _s('df["e"] = df["v"].pct_change()', numbers="v", adds="e:n"),
    _s('df["e"] = df["n"].mask(df["n"] > 5, -1)', numbers="n", adds="e:n"),
    _s('df = df.drop(columns=["t"])', "t", leaves=None),
    _s('df.insert(0, "f", df["n"] * 2)', numbers="n", adds="f:n"),
    _s('df["e"] = df["v"].ewm(span=3).mean()', numbers="v", adds="e:n"),
    _s('df["e"] = df["k"].str.cat(df["g"], sep="-")', "k g", adds="e:t"),
    _s('df["e"] = df.groupby("k")["v"].rank()', "k", numbers="v", adds="e:n"),
    _s('df["e"] = df["v"].cummax()', numbers="v", adds="e:n"),
    _s('df["e"] = df["v"].expanding().sum()', numbers="v", adds="e:n"),
    _s('df = df.set_index("n").sort_index().reset_index()', numbers="n"),
    # a Series of the sorted frame set back (pandas aligns it on the labels)
    _s('df["e"] = df.sort_values("v").groupby("g")["n"].cumsum()', "g", numbers="v n",
       adds="e:n"),
    _s('df["e"] = df.sort_values(["g", "n"], kind="stable").groupby("g")["v"].shift()', "g",
       numbers="v n", adds="e:n"),
    _s('df["e"] = df.sort_values("n")["v"].diff()', numbers="v n", adds="e:n"),
    _s('df["e"] = df["t"].str.split(" ").str[0]', "t", adds="e:t"),
    _s('df["e"] = df["d"].dt.dayofweek', "d", adds="e:n"),
    _s('df["e"] = df["d"] + pd.Timedelta(days=3)', "d", adds="e:d"),
    _s('df["e"] = df["v"].fillna(df.groupby("g")["v"].transform("median"))', "g", numbers="v",
       adds="e:n"),
    _s('df["e"] = df["k"].map(df["k"].value_counts())', "k", adds="e:n"),
    _s('df["e"] = df["v"] / df.groupby("k")["v"].transform("sum")', "k", numbers="v",
       adds="e:n"),
    _s('df = df.rename(columns={"v": "w2"}).rename(columns={"w2": "v"})'),
    _s('df["e"] = df["t"].str.replace("p", "P", regex=False).str.lower()', "t", adds="e:t"),
    # joins
    _s('df = df.merge(other, on="k", how="left")', "k", adds="w:n"),
    _s('df = df.merge(other, on="k", how="inner")', "k", adds="w:n"),
    # groupbys that remake the frame
    _s('df = df.groupby("k", as_index=False).agg(v=("v", "sum"), n=("n", "max"))', "k",
       numbers="v n", leaves="k:t v:n n:n"),
    _s('df = df.groupby(["g", "k"], as_index=False)["n"].sum()', "g k", numbers="n",
       leaves="g:t k:t n:n"),
    _s('df = df.groupby("g").agg(v=("v", "mean"), c=("k", "count")).reset_index()', "g k",
       numbers="v", leaves="g:t v:n c:n"),
    _s('df = df.groupby("k", dropna=False)["n"].size().reset_index(name="size")', "k",
       leaves="k:t size:n"),
    _s('df = df["k"].value_counts().reset_index()', "k", leaves="k:t count:n"),
    _s('df = df.pivot_table(index="k", columns="g", values="n", aggfunc="sum").reset_index()',
       "k g", numbers="n", leaves="k:t x:n y:n"),
    _s('df = df.melt(id_vars=["k"], value_vars=["n"])', "k", numbers="n",
       leaves="k:t variable:t value:n"),
    _s('df = df.groupby("g")["n"].agg(["sum", "mean", "count"]).reset_index()', "g",
       numbers="n", leaves="g:t sum:n mean:n count:n"),
    _s('df = pd.crosstab(df["k"], df["g"]).reset_index()', "k g", leaves="k:t x:n y:n"),
]


@st.composite
def programs(draw: st.DrawFn, max_steps: int = 5) -> str:
    """A pipeline of 1 to `max_steps` steps, each using only columns the frame still has."""
    kinds = {"k": "t", "g": "t", "v": "n", "n": "n", "t": "t", "ds": "t", "d": "d"}
    lines = []
    for _ in range(draw(st.integers(1, max_steps))):
        usable = [s for s in STEPS if s.needs <= set(kinds)
                  and all(kinds[c] == "n" for c in s.numbers)]
        step = draw(st.sampled_from(usable))
        lines.append(step.code)
        if step.remakes:
            kinds = {}
        kinds.update(step.adds)
        if "drop(columns=" in step.code:
            kinds.pop("t", None)
    return PRELUDE + "\n".join(lines) + "\nresult = df\n"


def main() -> int:
    import argparse
    import sys
    from pathlib import Path

    from hypothesis import HealthCheck, given, settings

    sys.path.insert(0, str(Path(__file__).resolve().parent))
    sys.path.insert(0, str(Path(__file__).resolve().parent.parent))
    from support import differential, run

    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--examples", type=int, default=200)
    parser.add_argument("--steps", type=int, default=5)
    args = parser.parse_args()
    found: list[str] = []
    refused = []

    @settings(max_examples=args.examples, deadline=None, database=None,
              suppress_health_check=list(HealthCheck))
    @given(programs(args.steps))
    def search(program: str) -> None:
        try:
            run(program)
        except Exception as exc:  # noqa: BLE001 - a program pandas refuses is not a test
            refused.append(f"{type(exc).__name__}: {exc}"[:120])
            return
        try:
            differential(program)
        except Exception as exc:  # noqa: BLE001 - report and go on searching
            found.append(f"{program}\n--> {str(exc)[:600]}\n")

    search()
    for text in found:
        print(text)
    print(f"{len(found)} of {args.examples} programs differ; pandas refused {len(refused)}")
    for reason in sorted(set(refused))[:10]:
        print("  refused:", reason)
    return 1 if found else 0


if __name__ == "__main__":
    raise SystemExit(main())
