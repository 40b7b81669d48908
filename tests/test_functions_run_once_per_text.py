"""A value function with no expression form (a loop, difflib, a cache) that changes nothing
outside itself is run by Polars once per distinct text of the column, its result put on every
row holding that text; it may read module names bound once to a plain Python value (a list
made from a column's values) that nothing changes afterwards.

pandas (the reference) runs each script; the conversion runs with Polars on the same files;
what they write must be the same text.
"""

from __future__ import annotations

from pathlib import Path

from support import same_text

# a salt marsh's bird checklist and hand-written count lines: typos, blanks, plurals, unicode
CHECKLIST = "species,status\nRedshank,amber\nCurlew,red\nBrent Goose,amber\nDunlin,red\nÉgret,green\n"
COUNTS = """\
line,species_raw,birds
1,red shank,4
2,curlw,
3,brent geese,120
4,,3
5,?,2
6,dunlin,17
7,red shank,5
8,egret,1
9,CURLEW ,2
10,gull,9
"""

HEADER = '''\
import difflib
from functools import lru_cache

import pandas as pd

checklist = pd.read_csv("checklist.csv")
checklist["species"] = checklist["species"].str.lower()
counts = pd.read_csv("counts.csv")
'''

MATCH = '''
def match(raw):
    if not isinstance(raw, str) or not raw.strip():
        return None
    name = raw.strip().lower()
    for plural, single in (("geese", "goose"),):
        name = name.replace(plural, single)
    best = difflib.get_close_matches(name, SPECIES, n=1, cutoff=0.75)
    return best[0] if best else None
'''


def run(tmp_path: Path, body: str) -> str:
    script = HEADER + body + 'counts.to_csv("out.csv", index=False)\n'
    files = {"checklist.csv": CHECKLIST, "counts.csv": COUNTS}
    return same_text(script, tmp_path, files).converted_text


def test_a_cached_function_reading_a_list_of_the_checklist_runs_once_per_text(tmp_path: Path) -> None:
    text = run(tmp_path, 'SPECIES = checklist["species"].tolist()\n\n\n@lru_cache(maxsize=None)'
               + MATCH + '\n\ncounts["species"] = counts["species_raw"].map(match)\n'
               'counts["known"] = counts["species"].notna()\n')
    assert "TODO(porter)" not in text, text
    assert 'map_distinct(pl.col("species_raw"), match, pl.String)' in text


def test_missing_texts_left_missing_with_na_action_ignore(tmp_path: Path) -> None:
    text = run(tmp_path, 'SPECIES = checklist["species"].to_list()\n' + MATCH +
               '\ncounts["species"] = counts["species_raw"].map(match, na_action="ignore")\n')
    assert "TODO(porter)" not in text and "skip_nulls=True" in text, text


def test_a_list_changed_after_the_map_keeps_the_function_on_pandas(tmp_path: Path) -> None:
    # Polars runs the function when the plan is collected, after the list has grown
    text = run(tmp_path, 'SPECIES = checklist["species"].tolist()\n' + MATCH +
               '\ncounts["species"] = counts["species_raw"].map(match)\n'
               'SPECIES.append("gull")\n')
    assert "TODO(porter)" in text and "map_distinct" not in text


def test_a_series_read_by_the_function_keeps_it_on_pandas(tmp_path: Path) -> None:
    # a frame or a Series is a Polars object in the conversion: the function would see it
    text = run(tmp_path, 'SPECIES = checklist["species"]\n' + MATCH +
               '\ncounts["species"] = counts["species_raw"].map(match)\n')
    assert "TODO(porter)" in text and "map_distinct" not in text


def test_a_function_counting_its_calls_keeps_it_on_pandas(tmp_path: Path) -> None:
    text = run(tmp_path, 'SPECIES = checklist["species"].tolist()\nCALLS = []\n' + MATCH.replace(
        "    if not isinstance", "    CALLS.append(raw)\n    if not isinstance") +
        '\ncounts["species"] = counts["species_raw"].map(match)\n')
    assert "TODO(porter)" in text and "map_distinct" not in text
