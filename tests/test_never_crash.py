"""porter never crashes on a user's script, and what it writes parses on the oldest Python it
supports (3.11). Each case is an invented example of a failure seen on real scripts."""

from __future__ import annotations

import ast
import json
from pathlib import Path
import textwrap

import pytest

from porter import api, cli
from porter.api import OLDEST_PYTHON, convert_source
from porter.model import InternalError, Options
from support import differential

ROOT = Path(__file__).resolve().parent.parent


def parses_on_oldest(text: str) -> None:
    ast.parse(text, feature_version=OLDEST_PYTHON)


def convert(body: str, **options):
    result = convert_source("import pandas as pd\n" + textwrap.dedent(body), options=Options(**options))
    parses_on_oldest(result.converted_text)
    return result


# -- options in every form pandas accepts ---------------------------------------------------

@pytest.fixture
def meters(tmp_path, monkeypatch):
    (tmp_path / "meters.csv").write_text("meter,kwh\nM1,-1\nM2,-1.0\nM3,4.5\nM4,n/a\n-1,2\n")
    monkeypatch.chdir(tmp_path)
    return tmp_path


def test_na_values_given_as_one_number_is_read_like_pandas(meters):
    # reference: pandas 3.1 itself; -1 as text and as number, in both columns
    result = differential('import pandas as pd\nresult = pd.read_csv("meters.csv", na_values=-1)\n')
    assert not result.todos


def test_na_values_given_as_a_list_of_numbers_and_text(meters):
    differential('import pandas as pd\nresult = pd.read_csv("meters.csv", na_values=[-1, "M4"])\n')


def test_na_values_per_column_is_a_todo_not_a_crash():
    result = convert('df = pd.read_csv("meters.csv", na_values={"kwh": [-1]})\n')
    assert [s.key for s in result.todos] == ["pd.read_csv"]
    assert "per column" in result.todos[0].message


def test_na_values_of_an_unreadable_kind_is_a_todo():
    result = convert('df = pd.read_csv("meters.csv", na_values=[None, 1j])\n')
    assert [s.key for s in result.todos] == ["pd.read_csv"]


def test_a_rule_that_raises_keeps_pandas_under_a_todo(monkeypatch):
    from porter.rules import registry

    def broken(call, ctx):
        raise TypeError("'int' object is not iterable")

    table = dict(registry())
    table["frame.sort_values"] = broken
    monkeypatch.setattr(api, "registry", lambda: table)
    result = convert('df = pd.read_csv("a.csv")\nout = df.sort_values("kg")\nout.to_csv("o.csv")\n')
    todo, = result.todos
    assert todo.key == "frame.sort_values" and "internal error: please report" in todo.message
    assert "df.collect().to_pandas().sort_values(\"kg\")" in result.converted_text


# -- keywords glued to their expression -----------------------------------------------------

@pytest.mark.parametrize("statement", [
    "if(df.kg > 0).all():\n    print('ok')\n",
    "while(df.kg > 0).any():\n    break\n",
    "for x in(df.kg > 0).tolist():\n    pass\n",
    "ok = not(df.kg > 0).all()\n",
    "ok = 3 in(df.kg * 2).tolist()\n",
    "def f():\n    return(df.kg > 0).sum()\n",
    "if True:\n    pass\nelif(df.kg > 0).all():\n    pass\n",
    "with open('x') as h:\n    print(len(df))\n",
])
def test_a_keyword_glued_to_its_expression(statement):
    result = convert('df = pd.read_csv("a.csv")\n' + statement)
    assert result.sites


def test_glued_keyword_gets_parentheses_only_where_rewritten():
    result = convert('df = pd.read_csv("a.csv")\nif(df.kg > 0).all():\n    x = (1)\n')
    assert "if(df.select(" in result.converted_text and "x = (1)" in result.converted_text


# -- f-strings --------------------------------------------------------------------------------

def test_code_inside_a_double_quoted_fstring_uses_single_quotes():
    result = convert('counts = pd.read_csv("a.csv").groupby("k")["v"].sum()\n'
                     'print(f"share: {counts[1]:.1f}%")\n')
    line = result.converted_text.splitlines()[-1]
    assert line.startswith('print(f"share: {') and '"k"' not in line


def test_code_inside_a_single_quoted_fstring_keeps_double_quotes():
    result = convert('df = pd.read_csv("a.csv")\nprint(f\'total {df["kg"].sum()}\')\n')
    assert "pl.col(\"kg\").sum()" in result.converted_text


@pytest.mark.parametrize("body", [
    'print((f"total {df[\'kg\'].sum()}"\n       f" mean {df[\'kg\'].mean()}"))\n',
    'msg = ("rows: " f"{len(df)}")\n',
    'msg = (f"{df.kg.sum()}"\n       "x")\n',
    'msg = (f"a {df.shape}" "b" f"{df.kg.max()!r:>{10}}")\n',
    'msg = f"{df.kg.max()=}"\n',
])
def test_concatenated_and_parenthesised_fstrings(body):
    convert('df = pd.read_csv("a.csv")\n' + body)


def test_code_that_cannot_fit_between_braces_becomes_a_format_call():
    # a literal holding both quote characters cannot be requoted for Python 3.11
    body = ('df = pd.read_csv("a.csv")\n'
            'print("n=" f"{df[df.name == \'it\\\'s \\"x\\"\'].shape[0]:>4} rows {{ok}}")\n')
    result = convert(body)
    assert '.format(' in result.converted_text and "{{ok}}" in result.converted_text


def test_format_call_fallback_gives_the_same_text():
    from porter.emit.fstrings import as_format_call
    import libcst as cst
    for text in ['f"a{x:.1f}b{{c}}"', "f'{x!r:>{w}}|'", 'rf"\\d{x}"', 'f"{x=}"', 'f"{x = :>5}"']:
        node = cst.parse_expression(text)
        call = as_format_call(node, cst.Module([]).code_for_node)
        assert call is not None
        code = cst.Module([]).code_for_node(call)
        scope = {"x": 3.14159, "w": 8}
        assert eval(code, scope) == eval(text, scope), (text, code)  # noqa: S307 - literals above


# -- internal errors ---------------------------------------------------------------------------

def _explode(*args, **kwargs):
    raise RuntimeError("boom")


def test_an_internal_error_names_the_file_and_line_and_exits_2(tmp_path, monkeypatch, capsys):
    script = tmp_path / "harvest.py"
    original = "import pandas as pd\ndf = pd.read_csv('a.csv')\n"
    script.write_text(original)
    monkeypatch.setattr("porter.emit.code.layout_chain", _explode)
    report = tmp_path / "report.json"
    code = cli.main(["convert", str(script), "-o", str(tmp_path / "out.py"), "--report", str(report)])
    err = capsys.readouterr().err
    assert code == 2
    assert f"{script}:2: internal error: please report (RuntimeError: boom)" in err
    assert "Traceback" not in err
    assert not (tmp_path / "out.py").exists() and script.read_text() == original
    entry, = json.loads(report.read_text())["files"]
    assert entry["status"] == "failed" and "RuntimeError: boom" in entry["traceback"]


def test_debug_prints_the_traceback(tmp_path, monkeypatch, capsys):
    script = tmp_path / "harvest.py"
    script.write_text("import pandas as pd\ndf = pd.read_csv('a.csv')\n")
    monkeypatch.setattr("porter.translate.engine._todo_comments", _explode)
    assert cli.main(["convert", str(script), "--debug"]) == 2
    assert "Traceback" in capsys.readouterr().err


def test_an_internal_error_in_a_folder_fails_that_file_only(tmp_path, monkeypatch, capsys):
    src = tmp_path / "src"
    src.mkdir()
    (src / "bad.py").write_text("import pandas as pd\ndf = pd.read_csv('a.csv')\nspecial = 1\n")
    (src / "good.py").write_text("import pandas as pd\ndf = pd.read_csv('a.csv')\n")
    real = api.translate_module

    def flaky(module, services):
        if "special" in module.code:
            raise RuntimeError("boom")
        return real(module, services)

    monkeypatch.setattr(api, "translate_module", flaky)
    report = tmp_path / "report.json"
    code = cli.main(["convert", str(src), "-o", str(tmp_path / "out"), "-j", "1",
                     "--report", str(report), "-q"])
    assert code == 2
    files = {Path(f["source"]).name: f for f in json.loads(report.read_text())["files"]}
    assert files["bad.py"]["status"] == "failed"
    assert "internal error: please report" in files["bad.py"]["error"]
    assert "Traceback" in files["bad.py"]["traceback"]
    assert files["good.py"]["status"] == "converted"
    assert (tmp_path / "out" / "good.py").exists() and not (tmp_path / "out" / "bad.py").exists()


def test_output_that_does_not_parse_on_311_is_an_internal_error(monkeypatch):
    monkeypatch.setattr(api, "_syntax_problem",
                        lambda text: (3, "invalid syntax") if "polars" in text else None)
    with pytest.raises(InternalError, match="does not parse on Python 3.11"):
        convert_source("import pandas as pd\ndf = pd.read_csv('a.csv')\n")


# -- every shipped script -----------------------------------------------------------------------

SHIPPED = sorted([*ROOT.glob("tests/golden/*.py"), *ROOT.glob("corpus/*/*.py")])
SHIPPED = [p for p in SHIPPED if not p.name.endswith(".expected.py")]


@pytest.mark.parametrize("path", SHIPPED, ids=lambda p: str(p.relative_to(ROOT)))
def test_every_golden_and_corpus_conversion_parses_on_311(path):
    result = convert_source(path.read_text(encoding="utf-8"), path=str(path))
    parses_on_oldest(result.converted_text)
    assert not any("internal error" in s.message for s in result.sites)


# -- statement forms: match, annotated and chained assignments, unpacking ----------

@pytest.mark.parametrize("body", [
    # every kind of case pattern, guards reading frame values, no catch-all
    'df = pd.read_csv("d.csv")\nmatch df.shape:\n    case (0, _):\n        pass\n'
    '    case (n, m) if n > m:\n        df = df.head(n)\n    case {"a": x, **kw}:\n        pass\n'
    '    case [first, *others]:\n        df["x"] = 1\n    case pd.DataFrame() as f:\n        pass\n'
    'df.to_csv("o.csv", index=False)\n',
    'df: pd.DataFrame\ndf = pd.read_csv("d.csv")\nx: "pd.DataFrame" = df\n'
    'y: list[pd.DataFrame] = [df]\ndf["a"] = df["b"] = 0\n',
    'df = pd.read_csv("d.csv")\na, *b, c = [df, df.head(1), df, df]\n*a, = [df]\n'
    'a, *b = df, (df)\na = b = a\nx = x = df\n',
    'df = pd.read_csv("d.csv")\ng: pd.core.groupby.DataFrameGroupBy = df.groupby("k")\n'
    'print(g["v"].sum())\n',
])
def test_statement_forms_convert_and_parse(body):
    convert(body)


def test_file_changes_of_every_kind_convert_and_parse():
    # the calls that write, move or remove files in all their spellings, and ones that only
    # look like them (str.replace, df.rename, open for reading)
    convert('''
        import os, shutil, subprocess
        from pathlib import Path
        p = Path("x") / "d.csv"
        df = pd.read_csv(p)
        p.write_text("k\\n1\\n")
        os.rename(p, "y")
        open(f"./{p}", mode="w").close()
        with open("d.csv", "a") as fh:
            fh.write("x")
        with open("d.csv") as fh:
            fh.read()
        Path("z.csv").unlink()
        Path("z.csv").open("w").close()
        "a-b".replace("-", "_")
        df = df.rename({"k": "key"}, axis=1)
        subprocess.run(["ls"])
        shutil.rmtree("old")
        df.to_csv()
        print(df)
    ''')
