"""df.sample(...): Polars draws other rows than pandas whatever the seed, so the port is stated
at 0.3. What does match is checked here against pandas itself: the number of rows (frac counted
as pandas rounds it), the columns and their types, rows drawn from the frame's own rows (each
once without replace), the same rows again for the same seed; and `porter verify` compares
the outputs computed from a draw by their columns (and the draw by its number of rows) while
still catching a real difference elsewhere in the script. The data is an invented orchard
co-op's crates."""

from __future__ import annotations

from collections import Counter
from pathlib import Path
import textwrap

import pandas as pd
import polars as pl
import pytest

from porter.verify.api import random_draws, verify
from support import convert, differential, run

HEAD = '''
import numpy as np
import pandas as pd
crates = pd.DataFrame({
    "grower": ["Ädle", "Brin", "Brin", None, "Çava", "Dorn", "Ädle", "Eske", "Fenn", "Brin"],
    "kg": [12.5, np.nan, 7.0, 7.0, 3.25, 0.0, -0.0, 12.5, 9.0, 1.5],
    "boxes": [3, 1, 2, 2, 5, 0, 4, 3, 1, 2],
})
'''

SHAPES = [
    "result = crates.sample(n=3, random_state=4)",
    "result = crates.sample(frac=0.35, random_state=0)",   # pandas 4 rows, Polars' fraction 3
    "result = crates.sample(frac=0.25, random_state=0)",   # 2.5 rounds to 2, as in pandas
    "result = crates.sample(frac=0.15, random_state=0)",   # 1.5 rounds to 2
    "result = crates.sample(frac=1, random_state=11)",
    "result = crates.sample(random_state=2)",
    "result = crates.sample(n=0)",
    "result = crates.sample(frac=1.5, replace=True, random_state=3)",
    "result = crates.sample(n=25, replace=True, random_state=3, ignore_index=True)",
    "result = crates[crates['kg'] > 1].sample(n=2, random_state=5)",
    "result = crates.sample(frac=0.5, random_state=9).reset_index(drop=True)",
]


def _rows(frame: object) -> list[tuple[object, ...]]:
    if isinstance(frame, pl.LazyFrame):
        frame = frame.collect()
    if isinstance(frame, pl.DataFrame):
        frame = frame.to_pandas()
    assert isinstance(frame, pd.DataFrame)
    frame = frame[["grower", "kg", "boxes"]]
    return [tuple("<missing>" if v is None or v != v else v for v in row)
            for row in frame.itertuples(index=False, name=None)]


@pytest.mark.parametrize("shape", SHAPES)
def test_the_draw_has_pandas_rows_count_columns_and_types(shape: str) -> None:
    source = HEAD + shape + "\n"
    result = convert(source)
    sites = [s for s in result.sites if s.key == "frame.sample"]
    assert sites and all(s.status == "converted" and s.confidence == 0.3 for s in sites), \
        result.converted_text
    expected = run(source)["result"]
    actual = run(result.converted_text)["result"]
    actual = actual.collect() if isinstance(actual, pl.LazyFrame) else actual
    assert list(actual.columns)[-3:] == list(expected.columns)
    assert actual.height == len(expected)
    pandas_kinds = {c: str(t) for c, t in expected.dtypes.items()}
    polars_kinds = {c: str(t) for c, t in actual.to_pandas()[list(expected.columns)].dtypes.items()}
    assert polars_kinds == pandas_kinds
    # drawn from the frame's own rows, each at most once without replace
    source_rows = Counter(_rows(run(HEAD)["crates"]))
    drawn = Counter(_rows(actual))
    assert set(drawn) <= set(source_rows)
    if "replace=True" not in shape:
        assert all(drawn[r] <= source_rows[r] for r in drawn)


def test_the_same_seed_draws_the_same_rows_again() -> None:
    text = convert(HEAD + "a = crates.sample(n=4, random_state=21)\n"
                          "b = crates.sample(n=4, random_state=21)\n").converted_text
    done = run(text)
    assert _rows(done["a"]) == _rows(done["b"])


def test_more_rows_than_the_frame_holds_raises_in_both() -> None:
    source = HEAD + "result = crates.sample(n=11)\n"
    with pytest.raises(ValueError):
        run(source)
    with pytest.raises(pl.exceptions.ShapeError):
        run(convert(source).converted_text)


@pytest.mark.parametrize("shape", [
    'result = crates.sample(n=2, weights="boxes")',
    "result = crates.sample(n=1, axis=1)",
    "result = crates.sample(n=2, random_state=np.random.RandomState(1))",
])
def test_what_polars_cannot_draw_stays_a_todo(shape: str) -> None:
    source = HEAD + shape + "\n"
    result = convert(source)
    assert "# TODO(porter): frame.sample" in result.converted_text
    run(result.converted_text)


def test_the_outputs_computed_from_a_draw_are_found() -> None:
    draws = random_draws(textwrap.dedent('''\
        import pandas as pd
        df = pd.read_csv("crates.csv")
        picked = df.sample(n=3, random_state=1)
        shuffled = df.sample(frac=1).reset_index(drop=True)
        shuffled["w"] = shuffled["kg"] * 2
        per = shuffled.groupby("grower")["kg"].sum()
        whole = df.groupby("grower")["kg"].sum()
        per.to_csv("per.csv")
        df.sample(n=2).to_csv("out/two.csv", index=False)
        whole.to_csv("whole.csv")
    '''))
    assert draws.names == {"picked": True, "shuffled": False, "per": False}
    assert draws.files == {"per.csv", "out/two.csv"}
    assert draws.file("sub/out/two.csv") and not draws.file("whole.csv")


def test_a_draw_of_pythons_or_numpys_random_module_is_not_a_frames() -> None:
    # random.sample and np.random.sample run alike on both sides (the same seed, the same
    # generator): what is computed from them is compared as usual
    draws = random_draws(textwrap.dedent('''\
        import random
        import numpy as np
        import pandas as pd
        random.seed(3)
        growers = random.sample(["Ädle", "Brin", "Çava"], 2)
        noise = np.random.sample(4)
        df = pd.read_csv("crates.csv")
        picked = df[df["grower"].isin(growers)]
        picked.to_csv("picked.csv")
    '''))
    assert not draws, draws


CRATES_CSV = """\
grower,kg,boxes
Ädle,12.5,3
Brin,,1
Brin,7.0,2
,7.0,2
Çava,3.25,5
Dorn,0.0,0
"""

SCRIPT = '''\
import pandas as pd
crates = pd.read_csv("crates.csv")
picked = crates.sample(n=3, random_state=1)
picked.to_csv("picked.csv", index=False)
heavy = crates[crates["kg"] > 5]
heavy.to_csv("heavy.csv", index=False)
'''


def test_verify_compares_a_draw_by_its_shape_and_still_catches_a_real_difference(
        tmp_path: Path) -> None:
    (tmp_path / "crates.csv").write_text(CRATES_CSV, encoding="utf-8")
    script = tmp_path / "crates_report.py"
    script.write_text(SCRIPT, encoding="utf-8")
    result = verify(script, None, tmp_path)
    statuses = {o.name: o.comparison for o in result.outputs}
    assert result.verdict == "same", statuses
    assert "random" in statuses["picked.csv"].detail and "random" in statuses["picked"].detail
    assert statuses["heavy.csv"].detail == ""  # compared cell by cell
    assert any("at random" in n for n in result.notes)
    # a conversion that gets the output not drawn at random wrong is still caught
    converted = convert(SCRIPT, data_dir=str(tmp_path)).converted_text
    broken = converted.replace('pl.col("kg") > 5', 'pl.col("kg") > 3')
    assert broken != converted
    caught = verify(script, broken, tmp_path)
    assert {o.name: o.comparison.status for o in caught.outputs}["heavy.csv"] == "different"
    # and a draw of another number of rows is caught too
    fewer = converted.replace("sample(3,", "sample(2,")
    assert fewer != converted
    short = verify(script, fewer, tmp_path)
    assert {o.name: o.comparison.status for o in short.outputs}["picked"] == "different"


@pytest.mark.parametrize("source", [
    "mixed = crates.sample(frac=1, random_state=5)\nresult = mixed.sort_index()",
    "result = crates.sample(frac=1.0, random_state=5).sort_values(['kg', 'grower', 'boxes'])"
    ".reset_index(drop=True)",
    "per = crates.groupby('grower')[['kg']].sum()\nresult = per.sample(frac=1.0, random_state=1).sort_index()",
])
def test_a_whole_shuffle_put_back_in_order_matches_pandas(source: str) -> None:
    # every row drawn once: put back in order by their labels (carried as pandas' labels) or by
    # their values, the rows are pandas' own
    result = differential(HEAD + source + "\n")
    assert [s for s in result.sites if s.key == "frame.sample" and s.status == "converted"], \
        result.converted_text
