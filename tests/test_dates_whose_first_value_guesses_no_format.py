"""pd.to_datetime(column) without format= whose first value is in none of the layouts porter
guesses a format from (a word, an impossible day, am/pm, eight digits that read day first):
pandas then guesses another format or none and reads the values its own way (dateutil, value
by value). The converted code has pandas read the column at run time in that case; it gave no
dates at all before (every row missing with errors="coerce"). pandas is the reference
implementation: each case runs both and compares.

The data: an invented orchard's picking sheets, as pickers write the dates.
"""

from __future__ import annotations

import pytest

from support import differential

COLUMNS = {
    "an impossible day first": ["2025-09-31", "2025-09-01", "2025-09-12", None, "2025-09-30"],
    "a word first": ["unknown", "2025-09-01", "2025-09-12", None, "2025-10-02"],
    "am/pm first": ["1 March 2024 3pm", "2024-03-02", "March 4, 2024"],
    "a guessed format, then other layouts": ["2025-09-01", "01/09/2025", "Sept 3 2025", None],
    "all missing": [None, None, None],
    "unicode and blanks": ["  ", "2025-09-01", "å", "2025-09-03"],
}


@pytest.mark.parametrize("values", list(COLUMNS.values()), ids=list(COLUMNS))
@pytest.mark.parametrize("dayfirst", [False, True])
def test_dates_read_as_pandas_reads_them(values: list[str | None], dayfirst: bool) -> None:
    source = f"""
import pandas as pd
sheet = pd.DataFrame({{"picked": {values!r}, "crates": list(range({len(values)}))}})
sheet["picked_on"] = pd.to_datetime(sheet["picked"], errors="coerce"{", dayfirst=True" if dayfirst else ""})
result = sheet
"""
    differential(source)


def test_dates_eight_digits_day_first() -> None:
    differential("""
import pandas as pd
sheet = pd.DataFrame({"picked": ["31012024", "01022024", None]})
sheet["picked_on"] = pd.to_datetime(sheet["picked"], errors="coerce", dayfirst=True)
result = sheet
""")


def test_a_value_pandas_cannot_read_stops_both_scripts() -> None:
    # errors="raise": pandas raises on "garbage" after reading the word-first column value by
    # value; the converted script raises too (no frame of missing dates)
    source = """
import pandas as pd
sheet = pd.DataFrame({"picked": ["soon", "2025-09-01"]})
sheet["picked_on"] = pd.to_datetime(sheet["picked"])
result = sheet
"""
    from support import convert_source, run
    with pytest.raises(Exception):
        run(source)
    with pytest.raises(Exception):
        run(convert_source(source).converted_text)
