"""Frames and Series given to scikit-learn and SciPy (porter/analysis/consumers.py): handed over
to pandas on purpose, as a hand-over site with a confidence, not a TODO.

pandas is the reference, and the libraries themselves are run: the original script and its
conversion fit the same models and compute the same statistics, and every number they give
(coefficients, feature names, predictions, p-values) must be the same. The data is an invented
seed bank's germination log, with a missing value and a repeated lot.
"""

from __future__ import annotations

import pytest

from support import differential

pytest.importorskip("sklearn")
pytest.importorskip("scipy")

LOG = """\
lot,species,temp,moisture,rate
L1,flax,12.5,0.30,0.61
L2,flax,15.0,0.35,0.70
L3,oat,18.0,0.28,0.66
L3,oat,18.0,0.28,0.66
L4,oat,21.5,0.40,0.81
L5,rye,9.0,0.22,
L6,rye,24.0,0.45,0.88
L7,lupin,16.5,0.33,0.72
L8,lupin,13.0,0.25,0.58
"""


@pytest.fixture(autouse=True)
def germination(tmp_path, monkeypatch):
    (tmp_path / "germination.csv").write_text(LOG, encoding="utf-8")
    monkeypatch.chdir(tmp_path)


HEAD = """\
import pandas as pd
from scipy import stats
from sklearn.linear_model import LinearRegression
from sklearn.metrics import mean_absolute_error
from sklearn.model_selection import train_test_split
from sklearn.pipeline import make_pipeline
from sklearn.preprocessing import StandardScaler
df = pd.read_csv("germination.csv")
df = df.dropna().drop_duplicates()
"""

CASES = {
    "a model fitted on columns": """
        model = LinearRegression().fit(df[["temp", "moisture"]], df["rate"])
        result = [*model.coef_.tolist(), float(model.intercept_), *model.feature_names_in_]
    """,
    "a pipeline fitted, then predicting": """
        pipe = make_pipeline(StandardScaler(), LinearRegression())
        pipe.fit(df[["temp", "moisture"]], df["rate"])
        result = pipe.predict(df[["temp", "moisture"]]).round(12).tolist()
    """,
    "a metric of two columns": """
        df["guess"] = df["temp"] / 30
        result = float(mean_absolute_error(df["rate"], df["guess"]))
    """,
    "a correlation test": """
        r, p = stats.pearsonr(df["temp"], df["rate"])
        result = [float(r), float(p)]
    """,
    "a split of the frame read, its labels read": """
        raw = pd.read_csv("germination.csv")
        train, test = train_test_split(raw[["lot", "temp"]], test_size=0.25, random_state=0)
        result = test.reset_index()
    """,
}


@pytest.mark.parametrize("body", list(CASES.values()), ids=list(CASES))
def test_modelling_libraries_get_what_pandas_gives_them(body: str) -> None:
    import textwrap
    result = differential(HEAD + textwrap.dedent(body), data_dir=".")
    todos = [s.key for s in result.sites if s.status == "todo"]
    assert "handover.unknown_code" not in todos
    assert any(s.key == "handover.library" and s.status == "handover" for s in result.sites)


def test_a_split_of_a_filtered_frame_keeps_pandas_labels() -> None:
    # train_test_split returns pandas frames with the labels it was given: after a filter those
    # are the original row numbers, which porter gives it as pandas has them
    differential(HEAD + """\
warm = df[df["temp"] > 10]
train, test = train_test_split(warm, test_size=0.25, random_state=0)
result = test.reset_index()
""", data_dir=".")


ARRAYS_PUT_BACK = {
    "cluster labels as a column": """
        from sklearn.cluster import KMeans
        X = StandardScaler().fit_transform(df[["temp", "moisture"]])
        df["cluster"] = KMeans(n_clusters=2, n_init=10, random_state=0).fit_predict(X)
        result = df
    """,
    "two components of a 2-D array": """
        from sklearn.decomposition import PCA
        pcs = PCA(n_components=2, random_state=0).fit_transform(df[["temp", "moisture", "rate"]])
        df["pc1"] = pcs[:, 0]
        df["pc2"] = pcs[:, 1]
        result = df.round(9)
    """,
    "predictions of a filtered frame": """
        warm = df[df["temp"] > 12].copy()
        model = LinearRegression().fit(warm[["temp"]], warm["rate"])
        warm["fit"] = model.predict(warm[["temp"]])
        result = warm.round(9).reset_index()
    """,
    "scaled columns written back": """
        scaler = StandardScaler()
        df["temp_z"] = scaler.fit_transform(df[["temp"]])[:, 0]
        result = df.round(9)
    """,
}


@pytest.mark.parametrize("body", list(ARRAYS_PUT_BACK.values()), ids=list(ARRAYS_PUT_BACK))
def test_arrays_a_model_gives_back_are_columns_by_position(body: str) -> None:
    # a model's predictions, a transform's rows and a column of a 2-D array are numpy arrays:
    # pandas places them by position, as pl.Series in with_columns does; the frame stays Polars
    import textwrap
    result = differential(HEAD + textwrap.dedent(body), data_dir=".")
    assert not result.todos, [s.message for s in result.sites if s.status == "todo"]
    assert "pl.Series(" in result.converted_text
