"""The lines behind an output (porter.verify.origins), which a trial's disagreement uses to name
the converted sites where to look."""

from __future__ import annotations

import textwrap

from porter.verify.origins import origins

SCRIPT = textwrap.dedent('''\
    import pandas as pd
    from pathlib import Path

    OUT = Path("out")
    kilns = pd.read_csv("data/kilns.csv")
    firings = pd.read_csv("data/firings.csv")
    glaze = pd.read_csv("data/glaze.csv")

    def tidy(frame):
        return frame.dropna(subset=["kiln"])

    firings = tidy(firings)
    firings["hours"] = firings["minutes"] / 60
    firings.sort_values("hours", inplace=True)
    pieces = []
    for kiln, part in firings.groupby("kiln"):
        pieces.append(part.head(2))
    top = pd.concat(pieces)
    top = top.merge(kilns, on="kiln")
    glaze_use = glaze.groupby("glaze").size()
    glaze_use.to_csv(OUT / "glaze_use.csv")
    top.to_csv(OUT / "top_firings.csv", index=False)
    ''')


def _lines(output: str) -> dict[int, int]:
    return {o.line: o.distance for o in origins(SCRIPT, output)}


def test_a_written_file_goes_back_through_every_name_it_reads():
    found = _lines("out/top_firings.csv")
    assert found[22] == 0  # the write
    assert found[18] == 1 and found[19] == 1  # both bindings of top
    # the loop that fills the list, the list, the frame changed in place, the helper, the reads
    assert {15, 16, 17, 12, 13, 14, 9, 5, 6} <= set(found)
    assert found[5] < found[6] or found[5] == found[6]
    # what only feeds the other output is not behind this one
    assert 7 not in found and 20 not in found and 21 not in found


def test_nearest_first():
    found = origins(SCRIPT, "top_firings.csv")  # a name without the folder matches too
    distances = [o.distance for o in found]
    assert distances == sorted(distances) and found[0].line == 22


def test_a_frame_left_in_the_globals_starts_at_its_bindings():
    found = _lines("glaze_use")
    assert set(found) == {20, 7, 1}  # its binding, the read, the import of pandas
    assert found[20] == 0


def test_nothing_behind_an_unknown_output_or_a_script_that_does_not_parse():
    assert origins(SCRIPT, "elsewhere.csv") == []
    assert origins("def broken(:\n", "x.csv") == []
