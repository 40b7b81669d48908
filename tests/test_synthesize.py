"""`porter verify` without `--data`: the inputs made from the script alone.

pandas is the reference: the original script runs with pandas on the data porter makes. Every
deliberately broken conversion in tests/verify_fixtures/ must be caught without the data the
fixtures ship.
"""

from __future__ import annotations

import csv
from pathlib import Path
import textwrap

import pytest

from porter.cli import main
from porter.verify.api import verify
from porter.verify.synthesize import SynthesisError, synthesize
from porter.verify.trials import TrialOptions, run_trials

FIXTURES = Path(__file__).resolve().parent / "verify_fixtures"


def _made(source: str, tmp_path: Path) -> dict[str, list[dict[str, str]]]:
    synthesize(textwrap.dedent(source), tmp_path / "made")
    tables = {}
    for path in sorted((tmp_path / "made").rglob("*.*sv")):
        text = path.read_text(encoding="utf-8")
        separator = max(",;\t", key=text.splitlines()[0].count)
        tables[str(path.relative_to(tmp_path / "made"))] = list(
            csv.DictReader(text.splitlines(), delimiter=separator))
    return tables


@pytest.mark.parametrize("folder, original, broken", [
    ("harvest", "harvest.py", "broken_aggregation.py"),
    ("harvest", "harvest.py", "broken_filter.py"),
    ("harvest", "harvest.py", "broken_join.py"),
    ("trials", "landings.py", "broken_null_key.py"),
    ("trials", "landings.py", "broken_count.py"),
    ("trials", "landings.py", "broken_mean.py"),
    ("trials", "landings.py", "broken_round.py"),
    ("trials_ferry", "crossings.py", "broken_ties.py"),
    ("trials_ferry", "crossings.py", "broken_missing_first.py"),
    ("trials_ferry", "crossings.py", "broken_join_order.py"),
])
def test_every_broken_fixture_is_caught_without_its_data(folder, original, broken, tmp_path):
    script = FIXTURES / folder / original
    synthesize(script.read_text(encoding="utf-8"), tmp_path / "sample")
    converted = (FIXTURES / folder / broken).read_text(encoding="utf-8")
    if verify(script, converted, tmp_path / "sample").verdict != "same":
        return
    trials = run_trials(script, converted, tmp_path / "sample",
                        TrialOptions(trials=10, seed=0, shrink_runs=4, kinds=1, out=tmp_path))
    assert trials.disagreements, [t.verdict for t in trials.trials]


def test_columns_get_their_type_from_how_the_script_uses_them(tmp_path):
    made = _made('''
        import pandas as pd
        SOURCE = "data/crossings.csv"
        trips = pd.read_csv(SOURCE, sep=";")
        trips = trips[trips["route"].isin(["North Sound", "Outer Isles"])]
        trips["fare"] = trips["adults"] * 4.5 + trips["cars"]
        late = trips[trips["minutes_late"] > 15]
        trips["day"] = pd.to_datetime(trips["sailed"], format="%d/%m/%Y %H:%M").dt.day_name()
        trips["ship"] = trips["ship"].str.title()
        late.groupby("captain")["minutes_late"].mean().to_csv("late.csv")
    ''', tmp_path)
    rows = made["data/crossings.csv"]
    assert rows and set(rows[0]) == {"route", "adults", "cars", "minutes_late", "sailed",
                                     "ship", "captain"}
    present = [r for r in rows if all(r.values())]
    assert {r["route"] for r in rows} >= {"North Sound", "Outer Isles"}  # the literals
    for r in rows:
        for number in ("adults", "cars", "minutes_late"):
            assert r[number] == "" or float(r[number]) == float(r[number])
    assert any(r["sailed"][2] == "/" for r in present)  # dates in the script's format
    assert any("" in r.values() for r in rows)  # missing values among them


def test_a_column_only_carried_along_is_text_and_a_rename_types_its_input(tmp_path):
    made = _made('''
        import pandas as pd
        def load(path):
            frame = pd.read_csv(path)
            frame = frame.rename(columns={"Weight": "kg"})
            return frame
        crates = load("data/crates.csv")
        crates["kg"] = crates["kg"].round(1)
        crates.drop(columns=["note"]).to_csv("out.csv", index=False)
        print(crates.shelf.nunique())
    ''', tmp_path)
    rows = made["data/crates.csv"]
    assert set(rows[0]) == {"Weight", "note", "shelf"}
    assert all(r["Weight"] == "" or float(r["Weight"]) == float(r["Weight"]) for r in rows)


def test_separator_and_merge_keys_shared_between_files(tmp_path):
    made = _made('''
        import pandas as pd
        a = pd.read_csv("data/hives.tsv", sep="\\t")
        b = pd.read_csv("data/keepers.csv")
        both = a.merge(b, on="keeper", how="left")
        both["kg"] = both["honey_kg"].round(1)
        both.to_csv("both.csv", index=False)
    ''', tmp_path)
    hives, keepers = made["data/hives.tsv"], made["data/keepers.csv"]
    assert set(hives[0]) == {"keeper", "honey_kg"} and set(keepers[0]) == {"keeper"}
    left = {r["keeper"] for r in hives} - {""}
    right = {r["keeper"] for r in keepers} - {""}
    assert left & right and left - right  # some keys match, some do not


@pytest.mark.parametrize("source, named", [
    ('import pandas as pd\nimport sys\ndf = pd.read_csv(sys.argv[1])\ndf["kg"].sum()\n',
     "computed at run time"),
    ('import pandas as pd\ndf = pd.read_parquet("data/x.parquet")\ndf["kg"].sum()\n',
     "read_parquet"),
    ('import pandas as pd\ndf = pd.read_csv("/srv/exports/x.csv")\ndf["kg"].sum()\n',
     "outside the script's folder"),
    ('import pandas as pd\ndf = pd.read_csv("data/x.csv")\ndf["n"] = df["note"].apply(parse)\n',
     "'note'"),
    ('import pandas as pd\nprint(1)\n', "reads no CSV file"),
])
def test_what_cannot_be_made_is_named_and_asks_for_data(source, named, tmp_path):
    # a column given to the script's own function: what it expects, porter cannot tell
    with pytest.raises(SynthesisError) as caught:
        synthesize(source, tmp_path / "made")
    assert named in str(caught.value) and "--data" in str(caught.value)


def test_verify_without_data_on_the_command_line(tmp_path, capsys, monkeypatch):
    monkeypatch.chdir(tmp_path)
    harvest = FIXTURES / "harvest"
    code = main(["verify", str(harvest / "harvest.py"), str(harvest / "broken_join.py"),
                 "--trials", "1"])
    captured = capsys.readouterr()
    assert code == 1
    assert "no --data: made data/deliveries.csv" in captured.err
    kept = tmp_path / "porter-sample-0"
    assert (kept / "data" / "growers.csv").is_file()
    assert f"--data {kept}" in captured.out


def test_a_column_in_the_wrong_file_after_a_merge_is_moved_until_the_script_runs(tmp_path):
    script = tmp_path / "theatre.py"
    script.write_text(textwrap.dedent('''
        import pandas as pd
        halls = pd.read_csv("data/a_halls.csv")
        sales = pd.read_csv("data/sales.csv")
        full = sales.merge(halls[["show_id", "hall"]], on="show_id", how="left")
        full["fill"] = full["sold"] / full["capacity"]
        full.to_csv("fill.csv", index=False)
    '''), encoding="utf-8")
    from porter.verify.synthesize import synthesize_checked
    synthesize_checked(script, tmp_path / "made")
    header = (tmp_path / "made" / "data" / "sales.csv").read_text().splitlines()[0]
    assert "capacity" in header.split(",")  # the halls file could not give it: moved
    assert verify(script, script.read_text(), tmp_path / "made").original.exit_code == 0


def test_with_data_the_columns_types_and_values_come_from_its_files(tmp_path):
    # --synthesize --data: the file's own columns (all of them, in its order), types and values
    # from its first rows; a column given to the script's own function is typed by its values
    # (without --data porter cannot tell it and asks for --data). Invented kiln log.
    data = tmp_path / "data"
    (data / "data").mkdir(parents=True)
    (data / "data" / "kilns.csv").write_text(
        "kiln,fired_on,hours,pieces,note\n"
        "K1,2024-03-01,11.5,40,glaze ok\nK2,2024-03-02,9.25,,crack\nK1,2024-03-04,12,38,\n"
        + "K3,2024-03-09,10.5,99,late\n" * 50, encoding="utf-8")
    source = textwrap.dedent('''
        import pandas as pd
        kilns = pd.read_csv("data/kilns.csv")
        kilns["n"] = kilns["note"].apply(len)
        kilns.groupby("kiln")["hours"].sum().to_csv("hours.csv")
    ''')
    with pytest.raises(SynthesisError):
        synthesize(source, tmp_path / "without")
    sizes = synthesize(source, tmp_path / "made", types_from=data, sample_rows=3)
    with (tmp_path / "made" / "data" / "kilns.csv").open(encoding="utf-8") as handle:
        rows = list(csv.DictReader(handle))
    assert len(rows) == sizes["data/kilns.csv"]
    assert list(rows[0]) == ["kiln", "fired_on", "hours", "pieces", "note"]
    values = {name: {r[name] for r in rows} - {""} for name in rows[0]}
    assert {"K1", "K2"} <= values["kiln"] and "K3" not in values["kiln"]  # the first 3 rows only
    assert all(v.lstrip("-").isdigit() for v in values["pieces"])  # whole numbers
    assert all(float(v) == float(v) for v in values["hours"])
    assert all(len(v) == 10 and v[4] == "-" for v in values["fired_on"])  # dates as the file has


def test_synthesize_with_data_on_the_command_line(tmp_path, capsys, monkeypatch):
    monkeypatch.chdir(tmp_path)
    harvest = FIXTURES / "harvest"
    code = main(["verify", str(harvest / "harvest.py"), str(harvest / "broken_join.py"),
                 "--data", str(harvest), "--synthesize", "--sample-rows", "5", "--trials", "1"])
    captured = capsys.readouterr()
    assert code == 1
    assert f"the types of {harvest}'s files: made data/deliveries.csv" in captured.err
