"""read_csv(sep=r"\\s+") (and older pandas' delim_whitespace=True): pandas splits each line at
runs of spaces and tabs, ignores the spaces a line starts with and skips blank lines. porter
reads the lines, splits them the same way and casts the columns to the types --data shows
pandas reads. pandas is the reference: each case prints and writes with both and compares
the text.

The data: an invented tide-gauge logger's export of a ferry line, aligned in columns with
spaces and tabs, with a gap written NA, a blank line, a missing reading and a harbour name
with an accent.
"""

from __future__ import annotations

import pytest

from support import same_text

GAUGE = """\
stamp   harbour  level_cm  temp
1    Ørnes     312   8.5
  2  Brae\t  -15    NA
3    Sund      0     9.25

4\tBrae      NA    7.0
5    Ørnes     298   n/a
"""

CASES = {
    "read and written": 'df = pd.read_csv("gauge.txt", sep=r"\\s+")\ndf.to_csv("out.csv", index=False)',
    "a column computed": 'df = pd.read_csv("gauge.txt", sep="\\\\s+")\n'
                         'df["level_m"] = df["level_cm"] / 100\ndf.to_csv("out.csv", index=False)',
    "na_values added": 'df = pd.read_csv("gauge.txt", sep=r"\\s+", na_values=["0"])\n'
                       'df.describe().to_csv("out.csv")',
    "a groupby after it": 'df = pd.read_csv("gauge.txt", sep=r"\\s+")\n'
                          'df.groupby("harbour")["level_cm"].max().to_csv("out.csv")',
}


@pytest.mark.parametrize("step", list(CASES.values()), ids=list(CASES))
def test_a_file_split_at_spaces_reads_as_pandas_reads_it(step: str, tmp_path) -> None:
    result = same_text("import pandas as pd\n" + step + "\n", tmp_path, {"gauge.txt": GAUGE})
    assert "TODO" not in result.converted_text, result.converted_text


QUOTED = 'stamp harbour\n1 "Ørnes pier"\n2 Brae\n'
RAGGED = "stamp harbour level\n1 Ørnes 3\n2 Brae\n"


@pytest.mark.parametrize("files, step, with_data", [
    # a quoted field holding a space is one field to pandas
    ({"gauge.txt": QUOTED}, 'df = pd.read_csv("gauge.txt", sep=r"\\s+")', True),
    # a line with fewer fields: porter does not split such files itself
    ({"gauge.txt": RAGGED}, 'df = pd.read_csv("gauge.txt", sep=r"\\s+")', True),
    # without --data porter does not know the columns and their types
    ({"gauge.txt": GAUGE}, 'df = pd.read_csv("gauge.txt", sep=r"\\s+")', False),
    # other options beside it
    ({"gauge.txt": GAUGE}, 'df = pd.read_csv("gauge.txt", sep=r"\\s+", usecols=["stamp"])', True),
], ids=["quoted", "ragged", "no data", "usecols"])
def test_what_porter_does_not_split_stays_pandas(files, step, with_data, tmp_path) -> None:
    result = same_text("import pandas as pd\n" + step + "\nprint(df)\n", tmp_path, files,
                       with_data=with_data)
    assert "TODO(porter): pd.read_csv" in result.converted_text, result.converted_text
