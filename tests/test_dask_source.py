"""Dask DataFrame scripts as a source (`import dask.dataframe as dd`, rules/dask.py): the Dask
original and its Polars conversion run on the same small multi-file data, and what they write
is compared (Dask is the reference, run by the test itself)."""

from __future__ import annotations

from pathlib import Path
import subprocess
import sys
import textwrap

import pandas as pd
import pytest

from support import assert_same_table, convert

pytest.importorskip("dask.dataframe", reason="Dask is a test extra (pip install '.[dask]')")

# a ferry line's ticket files: t-1, t-10, t-2 sort by name in that order (not by number);
# blanks, N/A, a repeated key, accented text, a file whose first route is new
FILES = {
    "data/tickets-2.csv": """\
        route,fare,pax,deck
        N,1.5,1,Pont
        S,2.0,2,Cale
        N,,3,Pont
        É,4.25,1,
        """,
    "data/tickets-10.csv": """\
        route,fare,pax,deck
        E,5.0,4,Cale
        S,N/A,5,Pont
        """,
    "data/tickets-1.csv": """\
        route,fare,pax,deck
        Z,7.5,6,Pont
        N,8.0,7,Cale
        N,8.0,7,Cale
        """,
    "data/routes.csv": """\
        route,name,km
        N,Nordhavn,12
        S,Süderby,8
        E,Estuaire,20
        Z,Zéro,3
        É,Éole,
        """,
}


def _run(source: str, folder: Path) -> dict[str, str]:
    folder.mkdir()
    for name, content in FILES.items():
        (folder / name).parent.mkdir(parents=True, exist_ok=True)
        (folder / name).write_text(textwrap.dedent(content), encoding="utf-8")
    (folder / "out").mkdir()
    (folder / "script.py").write_text(source, encoding="utf-8")
    done = subprocess.run([sys.executable, "script.py"], cwd=folder, capture_output=True,
                          text=True, timeout=180)
    assert done.returncode == 0, f"{folder.name} failed:\n{done.stderr}\n{source}"
    return {p.name: p.read_text(encoding="utf-8") for p in sorted((folder / "out").iterdir())}


def same_outputs(source: str, tmp_path: Path, with_data: bool = True):
    """Run the Dask original and its conversion, each in a folder of its own holding FILES;
    the files they write under out/ must read back as the same tables, and be the same text."""
    source = textwrap.dedent(source)
    data = tmp_path / "data_for_porter"
    if with_data:
        _run("", data)
    result = convert(source, data_dir=str(data) if with_data else None)
    expected = _run(source, tmp_path / "dask")
    actual = _run(result.converted_text, tmp_path / "polars")
    assert expected.keys() == actual.keys(), result.converted_text
    for name in expected:
        assert_same_table(pd.read_csv(tmp_path / "dask" / "out" / name),
                          pd.read_csv(tmp_path / "polars" / "out" / name))
        assert expected[name] == actual[name], \
            f"{name}:\n{expected[name]}\n---\n{actual[name]}\n--- converted ---\n{result.converted_text}"
    return result


def todo_keys(result) -> list[str]:
    return [s.key for s in result.sites if s.status == "todo"]


@pytest.mark.parametrize("with_data", [True, False])
def test_read_over_a_glob_in_the_order_of_the_names(tmp_path, with_data):
    result = same_outputs("""
        import dask.dataframe as dd
        t = dd.read_csv("data/tickets-*.csv")
        t.to_csv("out/all.csv", single_file=True, index=False)
        """, tmp_path, with_data)
    assert "pl.scan_csv(" in result.converted_text and '"data/tickets-*.csv"' in result.converted_text
    assert "dask" not in result.converted_text
    assert not todo_keys(result)


def test_from_dask_imported_as_a_name(tmp_path):
    result = same_outputs("""
        from dask import dataframe as dd
        t = dd.read_csv("data/tickets-*.csv", blocksize=None)
        t.compute().to_csv("out/all.csv", index=False)
        """, tmp_path)
    assert not todo_keys(result)


def test_groupby_sorted_as_asked(tmp_path):
    result = same_outputs("""
        import dask.dataframe as dd
        t = dd.read_csv("data/tickets-*.csv")
        by = t.groupby("route", sort=True).agg({"fare": "sum", "pax": "max"})
        by.compute().to_csv("out/by.csv")
        t.groupby("deck", sort=True).pax.sum().compute().to_csv("out/deck.csv")
        t.groupby(["deck", "route"], sort=True).pax.count().compute().to_csv("out/two.csv")
        """, tmp_path)
    assert not todo_keys(result)
    assert all(s.confidence == 1.0 for s in result.sites if s.key == "frame.groupby")


def test_groupby_order_without_sort_is_lowered(tmp_path):
    # what Dask gives without sort=True: neither sorted nor in the order met (the groups of
    # each partition sorted, then in the order met over the partitions)
    folder = tmp_path / "d"
    _run('import dask.dataframe as dd\n'
         't = dd.read_csv("data/tickets-*.csv")\n'
         't.groupby("deck").pax.sum().compute().to_csv("out/d.csv")\n'
         't.groupby("route").agg({"pax": "sum"}).compute().to_csv("out/r.csv")\n', folder)
    assert pd.read_csv(folder / "out" / "d.csv").deck.tolist() == ["Cale", "Pont"]  # Pont met first
    assert pd.read_csv(folder / "out" / "r.csv").route.tolist() == ["Z", "N", "E", "S", "É"]
    for line in ('t.groupby("deck").pax.sum().compute().to_csv("out/d.csv")',
                 't.groupby("deck", sort=False).pax.sum().compute().to_csv("out/d.csv")'):
        result = convert(f'import dask.dataframe as dd\nt = dd.read_csv("data/tickets-*.csv")\n{line}\n')
        site = next(s for s in result.sites if s.key == "frame.groupby")
        assert site.confidence == 0.5 and "Dask's groupby does not sort" in site.message


def test_a_computed_frame_groups_as_pandas_does(tmp_path):
    result = same_outputs("""
        import dask.dataframe as dd
        t = dd.read_csv("data/tickets-*.csv").compute()
        t.groupby("route").pax.sum().to_csv("out/by.csv")
        """, tmp_path)
    assert not todo_keys(result)


def test_merge_with_a_lookup_then_assign(tmp_path):
    result = same_outputs("""
        import dask.dataframe as dd
        import pandas as pd
        t = dd.read_csv("data/tickets-*.csv")
        routes = pd.read_csv("data/routes.csv")
        t = t.merge(routes, on="route", how="left")
        t = t.assign(takings=t.fare * t.pax, far=t.km > 10)
        by = t.groupby(["name", "deck"], sort=True).agg({"takings": "sum", "pax": "sum"}).reset_index()
        by.compute().to_csv("out/by.csv", index=False)
        t[t.pax > 1].to_csv("out/many.csv", single_file=True, index=False)
        """, tmp_path)
    assert not todo_keys(result)


def test_merge_with_a_lookup_read_by_dask(tmp_path):
    result = same_outputs("""
        import dask.dataframe as dd
        t = dd.read_csv("data/tickets-*.csv")
        routes = dd.read_csv("data/routes.csv")
        both = t.merge(routes, on="route", how="inner").persist()
        both.compute().to_csv("out/both.csv", index=False)
        """, tmp_path)
    assert not todo_keys(result)


def test_merge_of_two_frames_of_several_files_is_lowered(tmp_path):
    # Dask shuffles both frames on the key: its rows come in another order than pandas'
    folder = tmp_path / "d"
    script = ('import dask.dataframe as dd\n'
              't = dd.read_csv("data/tickets-*.csv")\n'
              'both = t.merge(dd.read_csv("data/tickets-1*.csv"), on="route")\n'
              'both.compute().to_csv("out/m.csv", index=False)\n')
    _run(script, folder)
    shuffled = pd.read_csv(folder / "out" / "m.csv")
    pandas_order = pd.read_csv(folder / "data" / "tickets-1.csv")
    whole = pd.concat([pd.read_csv(folder / "data" / f"tickets-{n}.csv") for n in (1, 10, 2)])
    merged = whole.merge(pd.concat([pandas_order, pd.read_csv(folder / "data" / "tickets-10.csv")]),
                         on="route")
    assert sorted(shuffled.to_csv(index=False).splitlines()) == sorted(merged.to_csv(index=False).splitlines())
    assert shuffled.route.tolist() != merged.route.tolist()
    result = convert(script)
    site = next(s for s in result.sites if s.key == "frame.merge")
    assert site.confidence == 0.5 and "shuffles" in site.message
    result = convert(script.replace("tickets-1*.csv", "routes.csv"))
    site = next(s for s in result.sites if s.key == "frame.merge")
    assert site.confidence > 0.5


@pytest.mark.parametrize("line, key", [
    ('t.sort_values("pax").compute().to_csv("out/s.csv", index=False)', "frame.sort_values"),
    ('t.drop_duplicates("route").compute().to_csv("out/s.csv", index=False)', "frame.drop_duplicates"),
])
def test_orders_dask_decides_by_its_partitions_are_lowered(line, key):
    result = convert(f'import dask.dataframe as dd\nt = dd.read_csv("data/tickets-*.csv")\n{line}\n')
    site = next(s for s in result.sites if s.key == key)
    assert site.confidence == 0.5 and "Dask" in site.message, result.converted_text


def test_dask_sort_is_not_stable_over_partitions(tmp_path):
    # why the sort above is lowered: equal keys in another order than pandas' stable sort
    folder = tmp_path / "d"
    _run('import random\n'
         'import pandas as pd\n'
         'import dask.dataframe as dd\n'
         'rng = random.Random(3)\n'
         'for i in range(4):\n'
         '    keys = [rng.choice("abcde") for _ in range(6)]\n'
         '    pd.DataFrame({"k": keys, "v": [rng.choice([1, 2, 3]) for _ in keys],\n'
         '                  "i": [f"{i}-{j}" for j in range(6)]}).to_csv(f"data/l-{i}.csv", index=False)\n'
         'dd.read_csv("data/l-*.csv").sort_values("v").compute().to_csv("out/s.csv", index=False)\n'
         'dd.read_csv("data/l-*.csv").compute().sort_values("v", kind="stable")'
         '.to_csv("out/p.csv", index=False)\n', folder)
    assert (folder / "out" / "s.csv").read_text() != (folder / "out" / "p.csv").read_text()


def test_head_of_all_partitions_is_exact(tmp_path):
    result = same_outputs("""
        import dask.dataframe as dd
        t = dd.read_csv("data/tickets-*.csv")
        t.head(4, npartitions=-1).to_csv("out/head.csv", index=False)
        """, tmp_path)
    assert not todo_keys(result)
    assert all(s.confidence == 1.0 for s in result.sites if s.key == "dd.frame.head")


def test_head_of_the_first_partition_is_lowered(tmp_path):
    # the first file holds 3 rows: Dask's head(3) reads them all (more would be fewer)
    result = same_outputs("""
        import dask.dataframe as dd
        t = dd.read_csv("data/tickets-*.csv")
        t.head(3).to_csv("out/head.csv", index=False)
        """, tmp_path)
    site = next(s for s in result.sites if s.key == "dd.frame.head")
    assert site.confidence == 0.8 and "first partition" in site.message


def test_repartition_and_persist_change_nothing(tmp_path):
    result = same_outputs("""
        import dask.dataframe as dd
        t = dd.read_csv("data/tickets-*.csv").repartition(npartitions=2).persist()
        t["half"] = t.fare / 2
        t.compute().to_csv("out/t.csv", index=False)
        """, tmp_path)
    assert not todo_keys(result)


def test_map_partitions_of_a_row_wise_function(tmp_path):
    result = same_outputs("""
        import dask.dataframe as dd

        def priced(part):
            part = part.assign(takings=part.fare * part.pax)
            part["deck"] = part.deck.str.upper()
            return part

        t = dd.read_csv("data/tickets-*.csv")
        t = t.map_partitions(priced)
        t.compute().to_csv("out/t.csv", index=False)
        """, tmp_path)
    assert not todo_keys(result)


def test_map_partitions_of_a_lambda(tmp_path):
    result = same_outputs("""
        import dask.dataframe as dd
        t = dd.read_csv("data/tickets-*.csv")
        t = t.map_partitions(lambda p: p.assign(seats=p.pax * 2))
        t.compute().to_csv("out/t.csv", index=False)
        """, tmp_path)
    assert not todo_keys(result)


def test_map_partitions_reading_other_rows_is_a_todo():
    # per partition, the mean is each file's own
    result = convert("""
        import dask.dataframe as dd

        def centred(part):
            return part.assign(dev=part.pax - part.pax.mean())

        t = dd.read_csv("data/tickets-*.csv")
        t = t.map_partitions(centred)
        t.compute().to_csv("out/t.csv", index=False)
        """)
    # the call is a TODO, and the frame it is given stays Dask's from its read
    assert "frame.labels" in todo_keys(result) or "dd.frame.map_partitions" in todo_keys(result)
    assert "t.map_partitions(centred)" in result.converted_text
    assert "pl.scan_csv" not in result.converted_text


@pytest.mark.parametrize("line, key", [
    ('t.to_csv("out/t-*.csv", index=False)', "dd.frame.to_csv"),
    ('t.set_index("route").compute().to_csv("out/t.csv")', "dd.frame.set_index"),
    ('t.route.value_counts().compute().to_csv("out/t.csv")', "dd.series.value_counts"),
    ('print(t.npartitions)', "dd.frame.npartitions"),
    ('t.to_parquet("out/t")', "dd.frame.to_parquet"),
    ('t.reset_index().compute().to_csv("out/t.csv", index=False)', "dd.frame.reset_index"),
    ('t.compute().to_csv("out/t.csv")', "frame.to_csv"),
])
def test_what_dask_does_otherwise_is_a_todo(line, key):
    result = convert(f'import dask.dataframe as dd\nt = dd.read_csv("data/tickets-*.csv")\n{line}\n')
    # the call is a TODO, or (its pandas fallback reading Dask's repeated labels) the read is
    # kept on Dask whole with the rest
    assert key in todo_keys(result) or "frame.labels" in todo_keys(result), result.converted_text
    assert "dd.read_csv(" in result.converted_text


def test_labels_of_several_files_repeat(tmp_path):
    # what the TODO above protects: Dask's labels start again at 0 in each file
    folder = tmp_path / "d"
    _run('import dask.dataframe as dd\n'
         'dd.read_csv("data/tickets-*.csv").compute().to_csv("out/t.csv")\n', folder)
    labels = pd.read_csv(folder / "out" / "t.csv").iloc[:, 0].tolist()
    assert labels == [0, 1, 2, 0, 1, 0, 1, 2, 3]


def test_reset_index_after_a_groupby(tmp_path):
    result = same_outputs("""
        import dask.dataframe as dd
        t = dd.read_csv("data/tickets-*.csv")
        t.groupby("deck", sort=True).pax.sum().reset_index().compute().to_csv("out/d.csv")
        t.reset_index(drop=True).compute().to_csv("out/t.csv", index=False)
        """, tmp_path)
    assert not todo_keys(result)


def test_a_reduction_computed(tmp_path):
    result = same_outputs("""
        import dask.dataframe as dd
        import pandas as pd
        t = dd.read_csv("data/tickets-*.csv")
        total = t.fare.sum().compute()
        most = t.pax.max().compute()
        pd.DataFrame({"total": [total], "most": [most], "rows": [len(t)]}).to_csv("out/s.csv", index=False)
        """, tmp_path)
    assert "compute" not in result.converted_text


def test_from_pandas(tmp_path):
    result = same_outputs("""
        import dask.dataframe as dd
        import pandas as pd
        routes = pd.read_csv("data/routes.csv")
        r = dd.from_pandas(routes, npartitions=2)
        r.assign(long=r.km * 1000).compute().to_csv("out/r.csv", index=False)
        """, tmp_path)
    assert not todo_keys(result)


def test_a_folder_conversion_finds_a_script_importing_only_dask(tmp_path):
    (tmp_path / "src").mkdir()
    (tmp_path / "src" / "tickets.py").write_text(
        'import dask.dataframe as dd\n'
        't = dd.read_csv("data/tickets-*.csv")\n'
        't.to_csv("out/all.csv", single_file=True, index=False)\n', encoding="utf-8")
    done = subprocess.run([sys.executable, "-m", "porter", "convert", str(tmp_path / "src"),
                           "-o", str(tmp_path / "out")], capture_output=True, text=True, timeout=120,
                          cwd=Path(__file__).resolve().parent.parent)
    assert done.returncode == 0, done.stderr
    assert "pl.scan_csv(" in (tmp_path / "out" / "tickets.py").read_text(encoding="utf-8")


def test_verify_computes_the_dask_originals_frames(tmp_path):
    import json
    folder = tmp_path / "case"
    _run("", folder)
    (folder / "tickets.py").write_text(
        'import dask.dataframe as dd\n'
        't = dd.read_csv("data/tickets-*.csv")\n'
        'by = t.groupby("deck", sort=True).pax.sum()\n'
        'by.compute().to_csv("by.csv")\n', encoding="utf-8")
    report = tmp_path / "verify.json"
    done = subprocess.run([sys.executable, "-m", "porter", "verify", str(folder / "tickets.py"),
                           "--data", str(folder), "--json", str(report)], capture_output=True,
                          text=True, timeout=300, cwd=Path(__file__).resolve().parent.parent)
    assert done.returncode == 0, done.stdout + done.stderr
    text = report.read_text(encoding="utf-8")
    compared = json.loads(text)
    assert '"by"' in text and '"t"' in text, text
    assert "same" in json.dumps(compared).lower()


def test_a_star_in_a_written_name_is_a_todo_in_a_dask_script():
    # pandas writes one file under that very name; Dask one per partition
    result = convert('import dask.dataframe as dd\n'
                     't = dd.read_csv("data/tickets-*.csv").compute()\n'
                     't.to_csv("out/part-*.csv", index=False)\n')
    assert "frame.to_csv" in todo_keys(result) or "frame.labels" in todo_keys(result), \
        result.converted_text
    assert "pl.scan_csv" not in result.converted_text


def test_a_column_blank_in_the_first_file(tmp_path):
    # Polars infers the types from the first file of a glob (text for an all-blank column),
    # Dask reads float64 there: with --data porter gives the scan the types all files share
    files = {"data/f-1.csv": "k,v\na,\nb,\n", "data/f-2.csv": "k,v\nc,5\nd,2.5\n"}
    source = ('import dask.dataframe as dd\n'
              't = dd.read_csv("data/f-*.csv")\n'
              't.to_csv("out/t.csv", single_file=True, index=False)\n')
    texts = {}
    for side, options in (("dask", None), ("polars", "data")):
        folder = tmp_path / side
        (folder / "data").mkdir(parents=True)
        (folder / "out").mkdir()
        for name, content in files.items():
            (folder / name).write_text(content, encoding="utf-8")
        text = source if side == "dask" else convert(source, data_dir=str(tmp_path / "dask")).converted_text
        (folder / "s.py").write_text(text, encoding="utf-8")
        done = subprocess.run([sys.executable, "s.py"], cwd=folder, capture_output=True, text=True,
                              timeout=120)
        assert done.returncode == 0, done.stderr
        texts[side] = (folder / "out" / "t.csv").read_text(encoding="utf-8")
    assert texts["dask"] == texts["polars"]
    blind = convert(source)
    site = next(s for s in blind.sites if s.key == "dd.read_csv")
    assert site.confidence <= 0.9 and "first file" in site.message


@pytest.mark.parametrize("names, same", [(("p-02", "p-10"), True), (("p-2", "p-10"), False)])
def test_read_parquet_over_a_glob(tmp_path, names, same):
    # Dask reads parquet files in natural order (p-2 before p-10), Polars by name
    sides = {}
    source = ('import dask.dataframe as dd\n'
              't = dd.read_parquet("data/p-*.parquet")\n'
              't.to_csv("out/t.csv", single_file=True, index=False)\n')
    result = convert(source)
    for side in ("dask", "polars"):
        folder = tmp_path / side
        (folder / "data").mkdir(parents=True)
        (folder / "out").mkdir()
        pd.DataFrame({"k": ["a", "b"], "v": [1.5, None]}).to_parquet(folder / "data" / f"{names[0]}.parquet", index=False)
        pd.DataFrame({"k": ["c", "é"], "v": [2.0, 3.0]}).to_parquet(folder / "data" / f"{names[1]}.parquet", index=False)
        text = source if side == "dask" else result.converted_text
        (folder / "s.py").write_text(text, encoding="utf-8")
        done = subprocess.run([sys.executable, "s.py"], cwd=folder, capture_output=True, text=True,
                              timeout=120)
        assert done.returncode == 0, done.stderr + text
        sides[side] = (folder / "out" / "t.csv").read_text(encoding="utf-8")
    assert (sides["dask"] == sides["polars"]) is same
    assert "pl.scan_parquet" in result.converted_text
    site = next(s for s in result.sites if s.key == "dd.read_parquet")
    assert site.confidence == 0.7 and "natural order" in site.message
