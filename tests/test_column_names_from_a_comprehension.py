"""df.columns = [c.strip().lower().replace(" ", "_") for c in df.columns]: the new names
computed when the script is converted (the same Python string methods on each name), so the
columns and their types stay known to the rest of the script.

pandas is the reference implementation: every check runs the snippet with pandas and its
conversion with Polars and compares the frames, names included.
"""

from __future__ import annotations

from pathlib import Path

import pytest

from support import converted_text, differential, same_text

# Names with spaces around and inside, mixed case, a unicode letter (ß), a missing value.
FRAME = """\
import numpy as np
import pandas as pd
w = pd.DataFrame({
    " Loan ID": [1, 2, 3, 4],
    "Days Out ": [1.5, None, 2.0, 14.0],
    "Straße": ["a", "b", None, "é"],
})
"""

COMPREHENSIONS = [
    pytest.param('w.columns = [c.strip().lower().replace(" ", "_") for c in w.columns]\n'
                 'result = w.assign(z=w["days_out"] * 2)', id="strip lower replace, then used by name"),
    pytest.param("w.columns = [col.upper() for col in w.columns]\nresult = w", id="upper (ß as Python)"),
    pytest.param('w.columns = [c.replace(" ", "") for c in w.columns.str.strip()]\nresult = w',
                 id="over names after Index.str"),
    pytest.param('w.columns = [c.strip().title() for c in w.columns]\nresult = w', id="title"),
    pytest.param('g = w.groupby("Straße")[[" Loan ID", "Days Out "]].sum()\n'
                 'g.columns = [c.strip().lower() for c in g.columns]\nresult = g.reset_index()',
                 id="a groupby's columns: the key stays as it is"),
]


@pytest.mark.parametrize("snippet", COMPREHENSIONS)
def test_names_from_a_comprehension_match_pandas(snippet: str) -> None:
    result = differential(FRAME + snippet + "\n")
    assert "TODO(porter)" not in result.converted_text
    assert "collect_schema" not in result.converted_text  # computed now, not at run time


def test_the_new_names_are_written_out(tmp_path: Path) -> None:
    text = converted_text(FRAME + 'w.columns = [c.strip().lower().replace(" ", "_") for c in w.columns]\n')
    assert 'w.rename({" Loan ID": "loan_id", "Days Out ": "days_out", "Straße": "straße"})' \
        in "".join(text.split("\n"))
    same_text(FRAME + 'w.columns = [c.strip().lower().replace(" ", "_") for c in w.columns]\n'
              'w.to_csv("out.csv", index=False)\n', tmp_path)


@pytest.mark.parametrize("snippet", [
    pytest.param('w.columns = [f"x_{c}" for c in w.columns]\nresult = w', id="an f-string"),
    pytest.param('w.columns = [c.strip() for c in w.columns if c]\nresult = w', id="with a condition"),
    pytest.param('w.columns = [c.strip()[:4] for c in w.columns]\nresult = w', id="a slice"),
])
def test_other_comprehensions_are_computed_at_run_time(snippet: str) -> None:
    result = differential(FRAME + snippet + "\n")
    assert "collect_schema" in result.converted_text
