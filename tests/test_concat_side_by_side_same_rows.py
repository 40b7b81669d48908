"""pd.concat([df, dummies], axis=1) of pieces that hold the same rows in the same order (a frame,
a Series computed from it, pd.get_dummies of one of its columns), checked against pandas (the
reference implementation).

pandas lines the pieces up on their labels; pieces made from the same rows carry the same
labels in the same order (repeated ones too, after an explode), so they are put side by side
as they are: a horizontal concat in Polars. The data is an invented mountain hostel network's
cleaning rota.
"""

from __future__ import annotations

import pytest

from support import differential

HEAD = '''
import numpy as np
import pandas as pd
rota = pd.DataFrame({
    "visit": [3, 1, 2, 4, 5, 6],
    "hostel": ["Grauhorn", "Col du Lac", "Écrins", "Grauhorn", None, "Bergsee"],
    "cleaner": ["Ana", "Céline", "Ana", "Bruno", "Dario", "Céline"],
    "tasks": ["beds; showers", "KITCHEN", None, "beds;bins; Beds", "", "windows"],
    "minutes": [45.0, 30.0, np.nan, 60.0, 90.0, 30.0],
})
'''

CASES = {
    "a frame and the dummies of one of its columns": (
        'done = pd.get_dummies(rota["cleaner"], prefix="did", dtype=int)\n'
        'result = pd.concat([rota.drop(columns=["tasks"]), done], axis=1)'),
    "after an explode: labels that repeat": (
        'r = rota.assign(task=rota["tasks"].str.split(";")).explode("task")\n'
        'r["task"] = r["task"].str.strip().str.lower()\n'
        'done = pd.get_dummies(r["task"], prefix="did", dtype=int)\n'
        'result = pd.concat([r.drop(columns=["tasks"]), done], axis=1).reset_index(drop=True)'),
    "after a filter, bool dummies": (
        'r = rota[rota["minutes"] > 30]\n'
        'result = pd.concat([r, pd.get_dummies(r["hostel"])], axis=1).reset_index(drop=True)'),
    "a frame and a named Series of it": (
        'r = rota[rota["minutes"] < 90]\n'
        'result = pd.concat([r[["visit", "hostel"]], (r["minutes"] / 60).rename("hours")], axis=1).reset_index(drop=True)'),
}


@pytest.mark.parametrize("source", list(CASES.values()), ids=list(CASES))
def test_side_by_side_of_the_same_rows_matches_pandas(source: str) -> None:
    result = differential(HEAD + source + "\n")
    assert not [s for s in result.sites if s.status in ("todo", "handover")], result.converted_text


def test_pieces_of_other_rows_are_not_put_side_by_side() -> None:
    # a filtered frame beside the whole one: pandas aligns the labels (missing values where
    # the filter left a row out)
    differential(HEAD + 'r = rota[rota["minutes"] > 30]\n'
                 'result = pd.concat([rota[["visit"]], r[["hostel"]]], axis=1).reset_index(drop=True)\n')


GROUPED = {
    "the dummies' columns summed per group": (
        'r = rota.assign(task=rota["tasks"].str.split(";")).explode("task")\n'
        'r["task"] = r["task"].str.strip().str.lower()\n'
        'done = pd.get_dummies(r["task"], prefix="did", dtype=int)\n'
        'r = pd.concat([r.drop(columns=["tasks"]), done], axis=1)\n'
        'result = r.groupby("cleaner")[list(done.columns)].sum().reset_index()'),
    "columns of another frame": (
        'other = rota[["minutes", "visit"]]\n'
        'result = rota.groupby("hostel")[list(other.columns)].max().reset_index()'),
}


@pytest.mark.parametrize("source", list(GROUPED.values()), ids=list(GROUPED))
def test_group_columns_named_by_a_list_of_names_match_pandas(source: str) -> None:
    result = differential(HEAD + source + "\n")
    assert not [s for s in result.sites if s.status in ("todo", "handover")], result.converted_text
