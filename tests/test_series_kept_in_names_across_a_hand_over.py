"""A Series kept in a name (`y = orders["cost"]`) and read again after its frame went to pandas:
pandas computes it first, in its own name, from the Polars frame; it was left an expression of
a frame that no longer was one (the script stopped), and a Series kept as a frame of its own
took the row labels a filter left for its values (a model fitted on the row numbers). pandas is
the reference implementation: the model's coefficients and score are compared.

The data: an invented tram depot's work orders, with a duplicate line, a missing labour time
and three priorities.
"""

from __future__ import annotations

import pytest

from support import convert_source, run

HEAD = """
import pandas as pd
import numpy as np
import matplotlib
matplotlib.use("Agg")
import matplotlib.pyplot as plt
from sklearn.linear_model import LinearRegression
orders = pd.DataFrame({"h": [1.0, 2.0, 3.0, None, 5.0, 6.0, 2.5, 2.0],
                       "p": [10.0, 19.0, 31.0, 5.0, 52.0, 58.0, 20.0, 19.0],
                       "prio": ["P1", "P2", "P1", "P3", "P2", "P1", "P3", "P2"]}).drop_duplicates()
orders = orders.dropna(subset=["h"])
orders["cost"] = orders["h"] * 68.0 + orders["p"]
orders["cost"].plot(kind="hist", bins=3)
plt.close()
"""

CASES = {
    "one-hot columns, the prediction set back": """
X = pd.get_dummies(orders[["h", "prio"]], columns=["prio"], dtype=float)
y = orders["cost"]
model = LinearRegression().fit(X, y)
orders["predicted"] = model.predict(X).round(2)
orders["residual"] = (orders["cost"] - orders["predicted"]).round(2)
""",
    "a plain column, the prediction set back": """
X = orders[["h"]]
y = orders["cost"]
model = LinearRegression().fit(X, y)
orders["predicted"] = model.predict(X).round(2)
""",
}


@pytest.mark.parametrize("step", list(CASES.values()), ids=list(CASES))
def test_a_series_read_after_its_frame_went_to_pandas(step: str) -> None:
    source = HEAD + step + ("coef = np.round(model.coef_, 6).tolist()\n"
                            "score = round(model.score(X, y), 9)\n")
    expected = run(source)
    converted = convert_source(source).converted_text
    actual = run(converted)
    assert actual["coef"] == expected["coef"], converted
    assert actual["score"] == expected["score"], converted
