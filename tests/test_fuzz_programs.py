"""Property-based, on programs nobody wrote: hypothesmith generates valid Python from the
grammar; with pandas imported and a frame in scope, porter must never crash, and what it writes
must parse on Python 3.11."""

from __future__ import annotations

import ast

from hypothesis import HealthCheck, assume, given, settings
import hypothesmith

from porter.api import OLDEST_PYTHON, convert_source
from porter.model import ConversionError

PRELUDE = "import pandas as pd\ndf = pd.read_csv('a.csv')\n"


@settings(max_examples=30, deadline=None, derandomize=True,
          suppress_health_check=list(HealthCheck))
@given(hypothesmith.from_node())
def test_generated_programs_never_crash_porter(program):
    text = PRELUDE + program
    try:
        ast.parse(text, feature_version=OLDEST_PYTHON)
    except (SyntaxError, ValueError):
        assume(False)
    try:
        result = convert_source(text)
    except ConversionError:  # libcst rejects some grammar corners: a clear error, not a crash
        return
    ast.parse(result.converted_text, feature_version=OLDEST_PYTHON)
