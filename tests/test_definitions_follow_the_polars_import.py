"""The functions and constants a conversion writes at the top of the script (pandas' missing
tokens, the CSV float layout) read `pl`, so they go after `import polars as pl`. A script that
runs code before its pandas import (an environment variable set for Modin, a path added) had
them put before that import, and the converted script failed with NameError. pandas is the
reference: both versions run and write the same file.

The data: an invented hill-fort dig's finds, with a weight not weighed ("?").
"""

from __future__ import annotations

from support import same_text

FILES = {"finds.csv": """\
    find_id,material,weight_g
    F1,flint,12.5
    F2,bone,?
    F3,flint,0.00004
    """}

SOURCES = {
    "an environment variable set before the import": """\
        import os
        os.environ.setdefault("MODIN_ENGINE", "python")
        import pandas as pd
        df = pd.read_csv("finds.csv", na_values=["?"])
        df.to_csv("out.csv", index=False)
        """,
    "a path added, a docstring above": '''\
        """Finds by material."""
        import sys
        sys.path.insert(0, ".")
        import numpy as np
        import pandas as pd
        df = pd.read_csv("finds.csv", na_values=["?"])
        df["heavy"] = np.where(df["weight_g"] > 10, "yes", "no")
        df.to_csv("out.csv", index=False)
        ''',
}


def test_definitions_come_after_the_polars_import(tmp_path) -> None:
    for i, source in enumerate(SOURCES.values()):
        folder = tmp_path / str(i)
        folder.mkdir()
        result = same_text(source, folder, FILES)
        lines = result.converted_text.splitlines()
        first_use = next(n for n, line in enumerate(lines) if "pl." in line)
        assert lines.index("import polars as pl") < first_use, result.converted_text
