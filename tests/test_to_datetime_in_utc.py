"""pd.to_datetime(..., utc=True) of text or epoch numbers without a zone of their own: the
times pandas reads, in UTC. pandas (the reference) runs each script; the conversion runs with
Polars on the same file; printed text and written files must be the same."""

from __future__ import annotations

from pathlib import Path

import pytest

from support import same_text

# a ferry line's departures: a blank time, a blank epoch, a time just before midnight
DEPARTURES = """\
boat,left,secs
Möwe,2024-03-01 10:00:00,1709287200
Reiher,2024-03-02 23:59:59,
Alk,,1709460000
"""


@pytest.mark.parametrize("lines", [
    'deps["t"] = pd.to_datetime(deps["left"], format="%Y-%m-%d %H:%M:%S", utc=True)',
    'deps["t"] = pd.to_datetime(deps["secs"], unit="s", utc=True)',
    'deps["t"] = pd.to_datetime(deps["left"], format="%Y-%m-%d %H:%M:%S", utc=True, errors="coerce")\n'
    'deps["h"] = deps["t"].dt.hour',
    'deps["t"] = pd.to_datetime(deps["left"], format="%Y-%m-%d %H:%M:%S", utc=True)'
    '.dt.tz_convert("Europe/Oslo")',
])
def test_times_in_utc_are_pandas_own(tmp_path: Path, lines: str) -> None:
    text = same_text(f'''\
import pandas as pd
deps = pd.read_csv("departures.csv")
{lines}
deps.to_csv("out.csv", index=False)
print(deps.dtypes.astype(str).tolist())
''', tmp_path, {"departures.csv": DEPARTURES}).converted_text
    assert "TODO(porter)" not in text, text


@pytest.mark.parametrize("call", [
    'pd.to_datetime(deps["left"], format="%Y-%m-%d %H:%M:%S%z", utc=True)',
    'pd.to_datetime(deps["left"], utc=True)',  # text without format= may carry offsets
])
def test_text_that_may_carry_offsets_stays_a_todo(call: str) -> None:
    from porter.api import convert_source
    text = convert_source(f'''\
import pandas as pd
deps = pd.read_csv("departures.csv")
deps["t"] = {call}
''').converted_text
    assert "TODO(porter): pd.to_datetime" in text, text
