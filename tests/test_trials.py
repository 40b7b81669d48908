"""Randomised trials (`porter verify --trials K`): datasets drawn from the sample catch
conversions that the sample itself lets through.

pandas is the reference: the original script runs with pandas on every trial. The broken
conversions in verify_fixtures/trials/ and trials_ferry/ each fall into a known trap (a group
for a missing key, a count of rows where pandas counts values, a missing value taken as 0,
halves rounded away from zero, ties of a sort key put in another order, missing values sorted
first, a join that gives the rows in the other table's order); the sample holds none of those
cases, so verifying on it says "same".
"""

from __future__ import annotations

import json
from pathlib import Path

import pytest

from porter.api import convert_source
from porter.cli import main
from porter.model import Options
from porter.verify.api import verify
from porter.verify.trials import TrialOptions, run_trials

FIXTURES = Path(__file__).resolve().parent / "verify_fixtures" / "trials"
ORIGINAL = FIXTURES / "landings.py"
FERRY = Path(__file__).resolve().parent / "verify_fixtures" / "trials_ferry"
# (data folder, original, broken conversion, the file whose rows the trials vary most)
BROKEN = [
    *((FIXTURES, ORIGINAL, name, "data/landings.csv")
      for name in ["broken_null_key.py", "broken_count.py", "broken_mean.py", "broken_round.py"]),
    # a sort whose ties or missing values come out in another order, a join that reorders rows
    *((FERRY, FERRY / "crossings.py", name, "data/crossings.csv")
      for name in ["broken_ties.py", "broken_missing_first.py", "broken_join_order.py"]),
]
BROKEN_IDS = [case[2].removesuffix(".py") for case in BROKEN]


def _text(name: str, folder: Path = FIXTURES) -> str:
    return (folder / name).read_text(encoding="utf-8")


@pytest.mark.parametrize("folder, original, broken, main_table", BROKEN, ids=BROKEN_IDS)
def test_the_sample_alone_does_not_show_the_broken_conversions(folder, original, broken, main_table):
    assert verify(original, _text(broken, folder), folder).verdict == "same"


# the conversion's site each broken conversion breaks: a disagreement names it among the sites
# nearest the lines behind the differing output
CULPRIT = {"broken_null_key": "groupby.agg", "broken_count": "groupby.agg",
           "broken_mean": "groupby.agg", "broken_round": "series.round",
           "broken_ties": "frame.sort_values", "broken_missing_first": "frame.sort_values",
           "broken_join_order": "frame.merge"}


@pytest.mark.parametrize("folder, original, broken, main_table", BROKEN, ids=BROKEN_IDS)
def test_trials_catch_each_broken_conversion_and_keep_the_smallest_data(
        folder, original, broken, main_table, tmp_path):
    sites = convert_source(original.read_text(encoding="utf-8"), path=str(original),
                           options=Options(data_dir=str(folder))).sites
    result = run_trials(original, _text(broken, folder), folder,
                        TrialOptions(trials=12, seed=0, shrink_runs=10, out=tmp_path),
                        sites=sites)
    assert result.disagreements, [t.verdict for t in result.trials]
    found = result.disagreements[0]
    assert len(result.trials) == 12  # every trial runs
    assert result.trials[found.trial - 1].verdict in ("different", "same-unordered", "error")
    # rows in another order are a difference too: the order written is part of the output
    assert found.outputs and {o.comparison.status for o in found.outputs} <= {"different",
                                                                              "same-unordered"}
    # the folder holds the data that shows it again, smaller than the trial's own
    assert sum(found.rows.values()) <= sum(result.trials[found.trial - 1].rows.values())
    assert found.rows[main_table] <= result.trials[found.trial - 1].rows[main_table]
    again = verify(original, _text(broken, folder), found.folder)
    assert again.verdict in ("different", "same-unordered")
    assert found.command.endswith(f"--data {found.folder}")
    nearest = [site.key for site in found.nearest_sites]
    assert CULPRIT[broken.removesuffix(".py")] in nearest, nearest
    assert len({site.line for site in found.nearest_sites}) <= 5
    assert nearest[0] == "frame.to_csv"  # the write itself comes first


def test_faithful_conversions_agree_on_every_trial():
    # by hand, and porter's own conversion of the original
    converted = convert_source(ORIGINAL.read_text(encoding="utf-8"), path=str(ORIGINAL),
                               options=Options(data_dir=str(FIXTURES))).converted_text
    for text in (_text("landings_polars.py"), converted):
        result = run_trials(ORIGINAL, text, FIXTURES, TrialOptions(trials=8, seed=3))
        assert not result.disagreements, result.to_json()
        assert result.agreed + result.skipped == 8
        assert result.varied == ("data/landings.csv",)


def test_faithful_conversions_of_a_sort_and_a_join_agree_on_every_trial():
    original = FERRY / "crossings.py"
    converted = convert_source(original.read_text(encoding="utf-8"), path=str(original),
                               options=Options(data_dir=str(FERRY))).converted_text
    for text in (_text("crossings_polars.py", FERRY), converted):
        result = run_trials(original, text, FERRY, TrialOptions(trials=8, seed=3))
        assert not result.disagreements, result.to_json()
        assert result.agreed + result.skipped == 8


def test_the_same_seed_draws_the_same_datasets():
    text = _text("landings_polars.py")
    first, again, other = (run_trials(ORIGINAL, text, FIXTURES, TrialOptions(trials=4, seed=s))
                           for s in (11, 11, 12))
    rows = [[t.rows for t in r.trials] for r in (first, again, other)]
    assert rows[0] == rows[1]
    assert rows[0] != rows[2]


def test_the_command_line_reports_trials_in_the_json(tmp_path, capsys):
    report = tmp_path / "verdict.json"
    code = main(["verify", str(ORIGINAL), str(FIXTURES / "broken_mean.py"), "--data",
                 str(FIXTURES), "--trials", "12", "--trials-out", str(tmp_path),
                 "--json", str(report)])
    out = capsys.readouterr().out
    assert code == 1
    assert "DISAGREEMENT" in out and "porter verify" in out
    trials = json.loads(report.read_text())["trials"]
    assert trials["seed"] == 0 and trials["disagreements"][0]["outputs"]
    # where to look: the group mean the broken conversion gets wrong, on line 5
    assert "the converted sites nearest the lines behind it:" in out
    assert (5, "groupby.agg") in {(site["line"], site["key"])
                                  for site in trials["disagreements"][0]["nearest_sites"]}
    assert Path(trials["disagreements"][0]["folder"]).parent == tmp_path


def test_the_review_page_shows_each_scripts_trials(tmp_path):
    from porter.review.run import ReviewOptions, review
    from porter.model import Options
    from porter.verify.api import VerifyOptions
    done = review(str(ORIGINAL), ReviewOptions(
        options=Options(data_dir=str(FIXTURES)), verify=True,
        verify_options=VerifyOptions(timing_runs=0), trials=2, seed=4, trials_out=str(tmp_path)))
    assert "Randomised trials" in done.html
    assert "porter trials (seed 4): 2 of 2 agreed" in done.html
    with pytest.raises(Exception, match="--trials needs --verify"):
        review(str(ORIGINAL), ReviewOptions(options=Options(data_dir=str(FIXTURES)), trials=2))


def test_trial_folders_inside_the_data_folder_are_neither_copied_nor_varied(tmp_path):
    # the default --trials-out is the current folder, often the data folder itself
    import shutil
    data = tmp_path / "harbour"
    shutil.copytree(FIXTURES, data)
    options = TrialOptions(trials=6, seed=0, shrink_runs=3, kinds=1, out=data)
    first = run_trials(data / "landings.py", _text("broken_mean.py"), data, options)
    assert first.disagreements and Path(first.disagreements[0].folder).parent == data
    kept = Path(first.disagreements[0].folder)
    assert not any(p.name.startswith("porter-trial-") for p in kept.iterdir())
    again = run_trials(data / "landings.py", _text("broken_mean.py"), data, options)
    assert again.varied == ("data/landings.csv",)
    assert not any("porter-trial-" in c for c in again.copied)


def test_without_hypothesis_the_trials_say_what_to_install(monkeypatch):
    import sys
    from porter.model import ConversionError
    monkeypatch.setitem(sys.modules, "hypothesis", None)  # as if not installed
    with pytest.raises(ConversionError, match=r"pip install 'porter\[trials\]'"):
        run_trials(ORIGINAL, _text("broken_mean.py"), FIXTURES, TrialOptions(trials=2))
