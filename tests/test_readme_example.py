"""The README's example conversion is what porter writes for its example script today."""

from __future__ import annotations

import re
from pathlib import Path

from porter.api import convert_source
from porter.model import Options

README = Path(__file__).resolve().parent.parent / "README.md"


def test_readme_example_is_porters_output(tmp_path):
    section = README.read_text(encoding="utf-8").split("## What a conversion looks like", 1)[1]
    pandas_block, polars_block = re.findall(r"```python\n(.*?)```", section, re.S)[:2]
    (tmp_path / "data").mkdir()
    (tmp_path / "data" / "deliveries.csv").write_text(
        "orchard,kg,trees,grade\nNorth Slope,120.5,10,A\nRiverside,80.25,8,reject\n")
    converted = convert_source(pandas_block, options=Options(data_dir=str(tmp_path))).converted_text
    shown = polars_block[polars_block.index("deliveries = "):]
    assert converted[converted.index("deliveries = "):] == shown
