"""Older pandas spellings that pandas 2 and 3 removed, read with the meaning they had.

Frequency aliases: pandas 2.2 renamed the end-of-period offsets (M -> ME, Q -> QE, Y / A ->
YE, BM -> BME, ...) and the fixed ones (H -> h, T -> min, S -> s, L -> ms, U -> us, N -> ns),
and pandas 3 rejects the old names with a ValueError. A script written for the pandas that had
them means the offset pandas now spells otherwise; the port reads it as that.

Periods (to_period, period_range) kept M, Q and Y: "M" there is still the month period, not
an offset, and is never rewritten. Only the names pandas 3.1 itself rejects are translated
(checked with pandas at convert time as well as by the table), so an alias pandas still
accepts never changes meaning.
"""

from __future__ import annotations

import re

# an offset's old base name -> pandas 3's (date_range, resample, Grouper, dt.floor / ceil / round)
OFFSET_ALIASES = {
    "M": "ME", "BM": "BME", "CBM": "CBME", "SM": "SME",
    "Q": "QE", "BQ": "BQE",
    "A": "YE", "Y": "YE", "BA": "BYE", "BY": "BYE", "AS": "YS", "BAS": "BYS",
    "H": "h", "BH": "bh", "CBH": "cbh", "T": "min", "S": "s", "L": "ms", "U": "us", "N": "ns",
}
# a period's old frequency -> pandas 3's (to_period, period_range); M, Q and Y are unchanged
PERIOD_ALIASES = {
    "A": "Y", "H": "h", "T": "min", "S": "s", "L": "ms", "U": "us", "N": "ns",
}
_ALIAS = re.compile(r"(\d*)([A-Z]+)(-[A-Z]{3})?")


def _modern(freq: str, table: dict[str, str], accepted: object) -> str | None:
    found = _ALIAS.fullmatch(freq)
    if found is None or found.group(2) not in table:
        return None
    count, base, anchor = found.group(1), found.group(2), found.group(3) or ""
    if anchor and base not in ("Q", "BQ", "A", "Y", "BA", "BY", "AS", "BAS"):
        return None  # only quarters and years take a month (W-SUN keeps its name)
    new = f"{count}{table[base]}{anchor}"
    if accepted(freq) or not accepted(new):  # type: ignore[operator]
        return None  # pandas still reads the old name (its meaning is pandas'), or not the new
    return new


def _offset_accepted(freq: str) -> bool:
    import warnings
    import pandas as pd
    try:
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")
            pd.tseries.frequencies.to_offset(freq)
    except ValueError:
        return False
    return True


def period_accepted(freq: str) -> bool:
    """Whether pandas 3.1 reads `freq` as a period frequency ("M", "Q", "Y", "h")."""
    import warnings
    import pandas as pd
    try:
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")
            pd.Period("2024-01-01", freq=freq)
    except (ValueError, TypeError):
        return False
    return True


def modern_offset(freq: object) -> str | None:
    """pandas 3.1's name for an offset alias it rejects ("M" -> "ME", "15T" -> "15min",
    "A-JUN" -> "YE-JUN"); None when there is nothing to rename."""
    if not isinstance(freq, str):
        return None
    return _modern(freq, OFFSET_ALIASES, _offset_accepted)


def modern_period(freq: object) -> str | None:
    """pandas 3.1's name for a period frequency it rejects ("A" -> "Y", "H" -> "h"); None
    when there is nothing to rename ("M", "Q", "Y" are still the month, quarter and year)."""
    if not isinstance(freq, str):
        return None
    return _modern(freq, PERIOD_ALIASES, period_accepted)
