"""read_csv options that read a file another way (every column as text, other encodings),
checked against pandas 3.1 by the text each side prints and writes."""

from __future__ import annotations

import subprocess
import sys
import textwrap
from pathlib import Path

import pytest

from porter.api import convert_source
from porter.model import FileResult, Options
from support import convert, same_text

# an orchard co-op's crates: blanks, pandas' missing-value tokens, quoted fields with the
# separator, accented text, numbers with spaces, a plus sign and leading zeros
CRATES = ('variety,crate,weight,grower\n'
          'Reinette grise, 5,"1,200.5",NA\n'
          'Bérénice,,3.50,n/a\n'
          '"Pippin, late",007,+3,  Éloïse \n'
          'Cox,12,NaN,""\n'
          'Gala,-0,1e3,null\n')

READ_AS_TEXT = '''
import pandas as pd
crates = pd.read_csv("crates.csv", dtype={dtype})
print(crates.dtypes.astype(str).tolist())
print(crates.isna().sum().tolist())
print(crates["crate"].str.len().tolist())
crates["label"] = crates["crate"].str.strip() + "/" + crates["variety"]
crates.to_csv("out.csv", index=False)
'''


@pytest.mark.parametrize("with_data", [True, False])
@pytest.mark.parametrize("dtype", ["str", '"str"', "object"])
def test_read_csv_every_column_as_text(tmp_path: Path, dtype: str, with_data: bool) -> None:
    source = READ_AS_TEXT.format(dtype=dtype)
    if dtype == "object":  # the values are the same; pandas names the dtype object (0.95)
        source = source.replace('print(crates.dtypes.astype(str).tolist())\n', '')
    result = same_text(source, tmp_path, {"crates.csv": CRATES}, with_data=with_data)
    assert "TODO(porter): pd.read_csv" not in result.converted_text
    assert "infer_schema_length=0" in result.converted_text


def test_read_csv_every_column_as_pandas_string(tmp_path: Path) -> None:
    source = READ_AS_TEXT.format(dtype='"string"').replace(
        'print(crates.dtypes.astype(str).tolist())\n', '').replace(
        'print(crates["crate"].str.len().tolist())\n', '')
    result = same_text(source, tmp_path, {"crates.csv": CRATES})
    assert "TODO(porter): pd.read_csv" not in result.converted_text
    read = next(s for s in result.sites if s.key == "pd.read_csv")
    assert read.confidence <= 0.9  # pd.NA, not NaN, for a missing value


def test_read_csv_every_column_as_text_keeps_blank_line_handling(tmp_path: Path) -> None:
    result = same_text('''
        import pandas as pd
        crates = pd.read_csv("crates.csv", dtype=str)
        print(len(crates), crates["crate"].tolist())
        crates.to_csv("out.csv", index=False)
        ''', tmp_path, {"crates.csv": "variety,crate\nCox,007\n\nGala, 5\n"})
    assert "TODO(porter): pd.read_csv" not in result.converted_text


def test_read_csv_other_dtype_for_every_column_stays_todo() -> None:
    text = convert('import pandas as pd\ndf = pd.read_csv("a.csv", dtype=float)\n').converted_text
    assert "TODO(porter): pd.read_csv" in text


# a ferry line's sailings, no header line: a blank, NA tokens, accented text, a quoted field
SAILINGS = ('Île-aux-Moines,007,1.5\n'
            '"Port, north",12,NA\n'
            'Séné,,2\n'
            'Arradon,3,n/a\n')


@pytest.mark.parametrize("with_data", [True, False])
@pytest.mark.parametrize("read", [
    'pd.read_csv("sailings.csv", header=None, names=["pier", "cars", "hours"])',
    'pd.read_csv("sailings.csv", names=["pier", "cars", "hours"])',
    'pd.read_csv("sailings.csv", names=["pier", "cars", "hours"], dtype={"cars": str})',
    'pd.read_csv("sailings.csv", names=("pier", "cars", "hours"), dtype=str)',
    'pd.read_csv("sailings.csv", header=None, names=["pier", "cars", "hours"], usecols=["hours", "pier"])',
])
def test_read_csv_names_without_a_header_line(tmp_path: Path, read: str, with_data: bool) -> None:
    result = same_text(f'''
        import pandas as pd
        sailings = {read}
        print(sailings.columns.tolist(), sailings.dtypes.astype(str).tolist())
        print(sailings.isna().sum().tolist(), len(sailings))
        sailings.to_csv("out.csv", index=False)
        ''', tmp_path, {"sailings.csv": SAILINGS}, with_data=with_data)
    assert "TODO(porter): pd.read_csv" not in result.converted_text
    assert "has_header=False" in result.converted_text


@pytest.mark.parametrize("with_data", [True, False])
def test_read_csv_names_replace_the_header_line(tmp_path: Path, with_data: bool) -> None:
    result = same_text('''
        import pandas as pd
        sailings = pd.read_csv("sailings.csv", header=0, names=["pier", "cars", "hours"])
        sailings["load"] = sailings["cars"] * 2
        print(sailings.columns.tolist(), sailings.dtypes.astype(str).tolist())
        sailings.to_csv("out.csv", index=False)
        ''', tmp_path, {"sailings.csv": "Quai,Voitures,Heures\n" + SAILINGS.replace("\nSéné,,2", "")},
        with_data=with_data)
    assert "TODO(porter): pd.read_csv" not in result.converted_text
    assert "new_columns=" in result.converted_text


@pytest.mark.parametrize("read", [
    'pd.read_csv("a.csv", header=None)',  # integer column names, not known without --data
    'pd.read_csv("a.csv", header=1)',
    'pd.read_csv("a.csv", names=["a", "a"])',
])
def test_read_csv_headers_porter_does_not_read_stay_todo(read: str) -> None:
    text = convert(f"import pandas as pd\ndf = {read}\n").converted_text
    assert "TODO(porter): pd.read_csv" in text


def same_text_of_bytes(source: str, tmp_path: Path, files: dict[str, bytes],
                       with_data: bool = True) -> FileResult:
    """support.same_text for input files given as bytes (another encoding than UTF-8)."""
    source = textwrap.dedent(source)
    folders = {side: tmp_path / side for side in ("pandas", "polars")}
    for folder in folders.values():
        folder.mkdir()
        for name, content in files.items():
            (folder / name).write_bytes(content)
    data = str(folders["pandas"]) if with_data else None
    result = convert_source(source, options=Options(data_dir=data))
    texts = []
    for side, text in (("pandas", source), ("polars", result.converted_text)):
        folder = folders[side]
        (folder / "script.py").write_text(text, encoding="utf-8")
        done = subprocess.run([sys.executable, "script.py"], cwd=folder, capture_output=True,
                              text=True, timeout=120)
        assert done.returncode == 0, f"{side} failed:\n{done.stderr}\n--- converted ---\n" \
                                     f"{result.converted_text}"
        written = {p.name: p.read_bytes() for p in sorted(folder.iterdir())
                   if p.name != "script.py" and p.name not in files}
        texts.append((done.stdout, written))
    assert texts[0] == texts[1], f"pandas {texts[0]}\npolars {texts[1]}\n--- converted ---\n" \
                                 f"{result.converted_text}"
    return result


# a cider press's ledger: accents, a quoted field with the separator, NA tokens, a blank,
# numbers with a space in front (read as numbers by pandas; with --data by porter too)
LEDGER = ('pressée,litres,remarque,prix\n'
          'Reinette,12,"café, crème",1.5\n'
          'Bérénice,,NA,2\n'
          '{euro}uro,{pad}7,{oe}uf,n/a\n'
          'Cœur de bœuf,3,,0.25\n')


def ledger(encoding: str, pad: str = "") -> bytes:
    single = encoding in ("latin-1", "iso-8859-1")  # no € nor œ in latin-1
    text = LEDGER.format(euro="E" if single else "€", oe="O" if single else "Œ", pad=pad)
    if single:
        text = text.replace("œ", "oe")
    return text.encode(encoding)


@pytest.mark.parametrize("with_data", [True, False])
@pytest.mark.parametrize("encoding", ["latin-1", "iso-8859-1", "cp1252", "ISO-8859-1",
                                      "windows-1252", "latin1", "utf-8-sig"])
def test_read_csv_in_another_encoding(tmp_path: Path, encoding: str, with_data: bool) -> None:
    file = ledger("utf-8-sig" if encoding == "utf-8-sig" else encoding.lower().replace("latin1", "latin-1"))
    result = same_text_of_bytes(f'''
        import pandas as pd
        presses = pd.read_csv("ledger.csv", encoding="{encoding}")
        print(presses.columns.tolist(), presses.dtypes.astype(str).tolist())
        print(presses.isna().sum().tolist())
        presses["label"] = presses["pressée"].str.upper() + ":" + presses["remarque"]
        presses.to_csv("out.csv", index=False)
        ''', tmp_path, {"ledger.csv": file}, with_data=with_data)
    assert "TODO(porter): pd.read_csv" not in result.converted_text
    if encoding != "utf-8-sig":
        assert f'encoding="{encoding}"' in result.converted_text


def test_read_csv_in_another_encoding_with_padded_numbers_and_text_columns(tmp_path: Path) -> None:
    # with --data the padded numbers are read as pandas reads them; dtype=str and names= too
    result = same_text_of_bytes('''
        import pandas as pd
        presses = pd.read_csv("ledger.csv", encoding="cp1252")
        presses["double"] = presses["litres"] * 2
        texts = pd.read_csv("ledger.csv", encoding="cp1252", dtype=str)
        named = pd.read_csv("ledger.csv", encoding="cp1252", header=0, names=["a", "b", "c", "d"])
        print(presses.dtypes.astype(str).tolist(), texts["litres"].tolist(), named.columns.tolist())
        presses.to_csv("out.csv", index=False)
        texts.to_csv("texts.csv", index=False)
        named.to_csv("named.csv", index=False, encoding="utf-8")
        ''', tmp_path, {"ledger.csv": ledger("cp1252", pad=" ")})
    assert "TODO(porter): pd.read_csv" not in result.converted_text


@pytest.mark.parametrize("read", [
    'pd.read_csv("a.csv", encoding="utf-16")',
    'pd.read_csv("a.csv.gz", encoding="latin-1")',
    'pd.read_csv("a.csv", encoding="shift_jis")',
])
def test_read_csv_encodings_porter_does_not_read_stay_todo(read: str) -> None:
    text = convert(f"import pandas as pd\ndf = {read}\n").converted_text
    assert "TODO(porter): pd.read_csv" in text


# a lighthouse keeper's log with a decimal comma: a column of "1.5" stays text in pandas,
# quoted numbers, exponents, a blank, NA, -0,0, and numbers with a space before them
LOG = ('phare;hauteur;vent;code;note\n'
       'Kéréon;1,5;7;1.5;"2,5"\n'
       'Ar-Men;2;NA;2;3\n'
       'Nividic;-0,25;;3,5;1,5e3\n'
       'Jument;-0,0;9;x;,5\n')


@pytest.mark.parametrize("with_data", [True, False])
def test_read_csv_decimal_comma(tmp_path: Path, with_data: bool) -> None:
    result = same_text('''
        import pandas as pd
        log = pd.read_csv("log.csv", sep=";", decimal=",")
        print(log.dtypes.astype(str).tolist())
        log["double"] = log["hauteur"] * 2
        log.to_csv("out.csv", index=False)
        ''', tmp_path, {"log.csv": LOG}, with_data=with_data)
    assert "TODO(porter): pd.read_csv" not in result.converted_text
    assert "decimal_comma=True" in result.converted_text


def test_read_csv_decimal_comma_with_padded_numbers(tmp_path: Path) -> None:
    # pandas reads " 1,5" and "+2" as numbers: with --data porter strips them, swaps the
    # comma and casts
    result = same_text('''
        import pandas as pd
        log = pd.read_csv("log.csv", sep=";", decimal=",")
        print(log.dtypes.astype(str).tolist())
        log.to_csv("out.csv", index=False)
        ''', tmp_path, {"log.csv": "phare;hauteur;vent;code\nKéréon; 1,5;+2;1.5\nAr-Men;2; 3;1,5 \n"})
    assert "TODO(porter): pd.read_csv" not in result.converted_text


def test_read_csv_decimal_comma_beside_the_comma_separator(tmp_path: Path) -> None:
    result = same_text('''
        import pandas as pd
        log = pd.read_csv("log.csv", decimal=",")
        print(log.dtypes.astype(str).tolist())
        log.to_csv("out.csv", index=False)
        ''', tmp_path, {"log.csv": 'phare,hauteur,vent\nKéréon,"1,5",3\nAr-Men,2,"4,25"\n'})
    assert "decimal_comma=True" in result.converted_text


def test_read_csv_other_decimal_stays_todo() -> None:
    text = convert('import pandas as pd\ndf = pd.read_csv("a.csv", decimal="\'")\n').converted_text
    assert "TODO(porter): pd.read_csv" in text


@pytest.mark.parametrize("use", [
    # the columns as pandas labels them, their types, a write
    'print(sailings.columns.tolist(), sailings.dtypes.astype(str).tolist(), len(sailings))',
    # a column selected by its integer label: handed to pandas there
    'sailings["double"] = sailings[1] * 2\nprint(sailings["double"].tolist())',
    # named afterwards by a rename of the integer labels
    'sailings = sailings.rename(columns={0: "pier", 1: "cars", 2: "hours"})\n'
    'sailings["load"] = sailings["cars"] * 2\nprint(sailings.columns.tolist())',
])
def test_read_csv_no_header_line_and_no_names(tmp_path: Path, use: str) -> None:
    # pandas labels the columns with the integers 0, 1, 2; porter names them "0", "1", "2"
    result = same_text('import pandas as pd\n'
                       'sailings = pd.read_csv("sailings.csv", header=None)\n'
                       f'{use}\n'
                       'sailings.to_csv("out.csv", index=False)\n',
                       tmp_path, {"sailings.csv": SAILINGS})
    assert "TODO(porter): pd.read_csv" not in result.converted_text
    assert 'new_columns=["0", "1", "2"]' in result.converted_text


@pytest.mark.parametrize("read", [
    'pd.read_csv("sailings.csv", header=None, usecols=[0, 2])',
    'pd.read_csv("sailings.csv", header=None, dtype={1: str})',
])
def test_read_csv_no_header_line_with_integer_keys_stays_todo(tmp_path: Path, read: str) -> None:
    (tmp_path / "sailings.csv").write_text(SAILINGS)
    text = convert(f"import pandas as pd\ndf = {read}\n", data_dir=str(tmp_path)).converted_text
    assert "TODO(porter): pd.read_csv" in text


# a seed bank's drawer log: comment lines before the header, between rows and after a blank
# line (with --data only: without it porter does not look for blank lines, which pandas skips),
# a "#" inside quoted fields (text, not a comment), NA tokens, accented text
DRAWERS = ('# seed bank drawers, counted in spring\n'
           '# second line of notes\n'
           'drawer,seeds,label,weight\n'
           'A1,120,"Pois #3",1.5\n'
           '# A2 is empty this year\n'
           'B7,,"Fève, naine",NA\n'
           '\n'
           '#\n'
           'C2,45,"#lentille",2\n'
           'D4,7,Blé,n/a\n')


@pytest.mark.parametrize("with_data", [True, False])
@pytest.mark.parametrize("options", ['comment="#"', 'comment="#", nrows=2',
                                     'comment="#", usecols=["label", "seeds"]'])
def test_read_csv_comment_lines(tmp_path: Path, options: str, with_data: bool) -> None:
    result = same_text(f'''
        import pandas as pd
        drawers = pd.read_csv("drawers.csv", {options})
        print(drawers.columns.tolist(), drawers.dtypes.astype(str).tolist(), len(drawers))
        drawers["tag"] = drawers["label"] + "!"
        drawers.to_csv("out.csv", index=False)
        ''', tmp_path, {"drawers.csv": DRAWERS if with_data else DRAWERS.replace("\n\n", "\n")},
        with_data=with_data)
    assert "TODO(porter): pd.read_csv" not in result.converted_text
    assert 'comment_prefix="#"' in result.converted_text
    read = next(s for s in result.sites if s.key == "pd.read_csv")
    if not with_data:  # a comment after the data on a line is not looked for
        assert read.confidence <= 0.8


@pytest.mark.parametrize("text", [
    'drawer,seeds\nA1,120 # recounted\nB7,3\n',  # after the data
    'drawer,seeds # how many\nA1,120\n',  # after the header
    'drawer,seeds\nA1,120\n  # indented\nB7,3\n',  # after spaces
    'drawer,seeds\nA1,#120\n',  # a field that starts with it
])
def test_read_csv_comment_after_data_stays_todo(tmp_path: Path, text: str) -> None:
    # pandas cuts the line at the comment character, Polars' comment_prefix skips whole lines
    (tmp_path / "drawers.csv").write_text(text)
    result = convert('import pandas as pd\ndf = pd.read_csv("drawers.csv", comment="#")\n',
                     data_dir=str(tmp_path))
    assert "TODO(porter): pd.read_csv" in result.converted_text


@pytest.mark.parametrize("read", [
    'pd.read_csv("a.csv", comment="//")',
    'pd.read_csv("a.csv", comment="#", skiprows=2)',
])
def test_read_csv_comment_forms_porter_does_not_read_stay_todo(read: str) -> None:
    text = convert(f"import pandas as pd\ndf = {read}\n").converted_text
    assert "TODO(porter): pd.read_csv" in text


# an orchard co-op's yearly harvest: quoted numbers with a thousands comma beside the comma
# separator, a decimal part, a missing value, a plus sign and spaces, a column of text that
# holds a comma between digits but is not all numbers, a trailing separator ("5,"), "1,2,3"
HARVEST = ('orchard,kilos,price,plot,code\n'
           'Verger du Moulin,"1,234","1,234.5",A-1,"1,2,3"\n'
           'Clos Bérénice,"12,345",7.25,"12,5 ares",7\n'
           'Pré Haut,,"+2,000.75",B,"5,"\n'
           'Côte Grise," 3,400 ",NA,"1,000",12\n')


@pytest.mark.parametrize("options", [
    'thousands=","',
    'thousands=",", usecols=["price", "kilos", "orchard"]',
    'thousands=",", na_values=["7.25"]',
    'thousands=",", nrows=2',
])
def test_read_csv_thousands_separator(tmp_path: Path, options: str) -> None:
    result = same_text(f'''
        import pandas as pd
        harvest = pd.read_csv("harvest.csv", {options})
        print(harvest.columns.tolist(), harvest.dtypes.astype(str).tolist())
        harvest["total"] = harvest["kilos"] * harvest["price"]
        print(harvest["total"].sum())
        harvest.to_csv("out.csv", index=False)
        ''', tmp_path, {"harvest.csv": HARVEST})
    assert "TODO(porter): pd.read_csv" not in result.converted_text
    assert 'replace_all(",", "", literal=True)' in result.converted_text


# a ferry line's takings with a semicolon separator, a point for thousands and a comma for
# decimals, and a space for thousands in another file
@pytest.mark.parametrize(("text", "options"), [
    ('quai;recette;passagers\nLe Palais;1.234,50;1.200\nSauzon;"12.000";80\n'
     'Port-Tudy;;2.003.004\n', 'sep=";", thousands=".", decimal=","'),
    ('quai,recette,passagers\nLe Palais,1 234.5,1 200\nSauzon,12 000,80\nPort-Tudy,,7\n',
     'thousands=" "'),
])
def test_read_csv_thousands_point_and_space(tmp_path: Path, text: str, options: str) -> None:
    result = same_text(f'''
        import pandas as pd
        takings = pd.read_csv("takings.csv", {options})
        print(takings.dtypes.astype(str).tolist(), takings["recette"].sum())
        takings.to_csv("out.csv", index=False)
        ''', tmp_path, {"takings.csv": text})
    assert "TODO(porter): pd.read_csv" not in result.converted_text


@pytest.mark.parametrize("text", [
    'a,b\n"1,,234",x\n7,y\n',  # doubled: an integer to pandas here, text in a float column
    'a,b\n"1,234,567,890,123,456,789",x\n',  # 19 digits: int64 to pandas
])
def test_read_csv_thousands_porter_cannot_tell_stays_todo(tmp_path: Path, text: str) -> None:
    (tmp_path / "a.csv").write_text(text)
    result = convert('import pandas as pd\ndf = pd.read_csv("a.csv", thousands=",")\n',
                     data_dir=str(tmp_path))
    assert "TODO(porter): pd.read_csv" in result.converted_text


@pytest.mark.parametrize("read", [
    'pd.read_csv("a.csv", thousands=",")',  # without --data
    'pd.read_csv("a.csv", thousands=".")',  # the decimal point too
    'pd.read_csv("a.csv", thousands=",", dtype={"a": float})',
])
def test_read_csv_thousands_forms_porter_does_not_read_stay_todo(read: str) -> None:
    text = convert(f"import pandas as pd\ndf = {read}\n").converted_text
    assert "TODO(porter): pd.read_csv" in text


# a ferry line's crossings written by hand with a space after each comma: a header with spaces,
# NA tokens and a blank after spaces, numbers with spaces on both sides, a quoted field that
# follows its comma at once, a tab (kept by pandas), accented text
CROSSINGS = ('pier, cars, hours, note\n'
             'Le Palais,  7, 1.5, calme\n'
             'Sauzon, NA,  2, n/a\n'
             '  Port-Tudy, 12 ,,"houle, forte"\n'
             'Houat,3, 0.25,\tÉté\n'
             'Hœdic, 4, -1,  \n')


@pytest.mark.parametrize("options", [
    "skipinitialspace=True",
    'skipinitialspace=True, usecols=["note", "cars"]',
    'skipinitialspace=True, na_values=["calme"], nrows=3',
    'skipinitialspace=True, dtype={"cars": str}',
    'skipinitialspace=True, na_values={"hours": ["-1"]}',
])
def test_read_csv_spaces_after_the_separator(tmp_path: Path, options: str) -> None:
    result = same_text(f'''
        import pandas as pd
        crossings = pd.read_csv("crossings.csv", {options})
        print(crossings.columns.tolist(), crossings.dtypes.astype(str).tolist())
        print(crossings.isna().sum().tolist(), len(crossings))
        crossings["tag"] = crossings["note"] + "|"
        crossings.to_csv("out.csv", index=False)
        ''', tmp_path, {"crossings.csv": CROSSINGS})
    assert "TODO(porter): pd.read_csv" not in result.converted_text
    assert 'strip_chars_start(" ")' in result.converted_text


@pytest.mark.parametrize("with_data", [True, False])
def test_read_csv_spaces_before_a_quoted_field_stay_todo(tmp_path: Path, with_data: bool) -> None:
    # pandas starts the quoted field after the spaces; Polars' reader splits it at its comma
    (tmp_path / "a.csv").write_text('pier, note\nSauzon, "houle, forte"\n')
    result = convert('import pandas as pd\ndf = pd.read_csv("a.csv", skipinitialspace=True)\n',
                     data_dir=str(tmp_path) if with_data else None)
    assert "TODO(porter): pd.read_csv" in result.converted_text


# a seed bank's shipments, gzip-compressed: a blank line (pandas skips it: the integer column
# stays integer), NA tokens, accented text
SHIPMENTS = 'lot,seeds,origin\n1,120,Bérénice\n\n2,NA,"Pré, haut"\n3,45,\n'


@pytest.mark.parametrize(("name", "options"), [
    ("shipments.csv.gz", ""),  # inferred from the name
    ("shipments.csv.gz", ', compression="infer"'),
    ("shipments.dat", ', compression="gzip"'),
    ("shipments.dat", ', compression={"method": "gzip"}'),
])
def test_read_csv_gzip(tmp_path: Path, name: str, options: str) -> None:
    import gzip
    result = same_text_of_bytes(f'''
        import pandas as pd
        shipments = pd.read_csv("{name}"{options})
        print(shipments.dtypes.astype(str).tolist(), len(shipments))
        shipments.to_csv("out.csv", index=False)
        ''', tmp_path, {name: gzip.compress(SHIPMENTS.encode())})
    assert "TODO(porter): pd.read_csv" not in result.converted_text


@pytest.mark.parametrize("read", [
    'pd.read_csv("a.csv.gz", compression=None)',
    'pd.read_csv("a.csv", compression="bz2")',
    'pd.read_csv("a.csv", compression={"method": "gzip", "mtime": 1})',
])
def test_read_csv_compressions_porter_does_not_read_stay_todo(read: str) -> None:
    text = convert(f"import pandas as pd\ndf = {read}\n").converted_text
    assert "TODO(porter): pd.read_csv" in text


def test_read_csv_no_compression_on_a_plain_name(tmp_path: Path) -> None:
    result = same_text('''
        import pandas as pd
        shipments = pd.read_csv("shipments.csv", compression=None)
        shipments.to_csv("out.csv", index=False)
        ''', tmp_path, {"shipments.csv": SHIPMENTS})
    assert "TODO(porter): pd.read_csv" not in result.converted_text


# a seed bank's countries of origin: "NA" is Namibia, "n/a" and "" are texts too when pandas'
# own tokens are off; a number column with an empty field (text to pandas then), one with
# "-" for missing, accented text
ORIGINS = ('code,country,seeds,weight,grams\n'
           'NA,Namibie,120,1.5,10\n'
           'FR,,45,-,20\n'
           'n/a,Pérou,,2.25,-\n'
           'NULL,"",7,0.5,30\n')


@pytest.mark.parametrize("with_data", [True, False])
@pytest.mark.parametrize("options", [
    "keep_default_na=False",
    'keep_default_na=False, na_values=["-"]',
    'keep_default_na=False, na_values={"weight": ["-"], "country": ["NA"]}',
])
def test_read_csv_without_pandas_missing_tokens(tmp_path: Path, options: str, with_data: bool) -> None:
    if not with_data and "{" in options:
        pytest.skip("na_values per column needs --data")
    result = same_text(f'''
        import pandas as pd
        origins = pd.read_csv("origins.csv", {options})
        print(origins.dtypes.astype(str).tolist(), origins["code"].tolist())
        origins["tag"] = origins["code"] + "/" + origins["country"]
        origins.to_csv("out.csv", index=False)
        ''', tmp_path, {"origins.csv": ORIGINS if with_data else ORIGINS.replace("Pérou,,", "Pérou,3,")},
        with_data=with_data)
    assert "TODO(porter): pd.read_csv" not in result.converted_text
    assert "empty_string_is_null=False" in result.converted_text
    read = next(s for s in result.sites if s.key == "pd.read_csv")
    if not with_data:  # an empty field in a column of numbers is not looked for
        assert read.confidence <= 0.8


@pytest.mark.parametrize("chooser", [
    'lambda c: c.startswith("k")',
    'lambda c: c in {"price", "orchard", "absent"}',
    'lambda c: c not in ("plot", "code")',
    'lambda name: name.lower().endswith("e") or name == "kilos"',
])
def test_read_csv_usecols_function(tmp_path: Path, chooser: str) -> None:
    # pandas calls the function with each header name; porter with those of --data
    result = same_text(f'''
        import pandas as pd
        harvest = pd.read_csv("harvest.csv", thousands=",", usecols={chooser})
        print(harvest.columns.tolist(), harvest.dtypes.astype(str).tolist())
        harvest.to_csv("out.csv", index=False)
        ''', tmp_path, {"harvest.csv": HARVEST})
    assert "TODO(porter): pd.read_csv" not in result.converted_text
    assert "lambda" not in result.converted_text


@pytest.mark.parametrize("chooser", [
    'lambda c: c in wanted',  # a name of the script
    'lambda c: len(c) > 3',  # a builtin
    'lambda c: c.startswith("zzz")',  # no column
])
def test_read_csv_usecols_functions_porter_does_not_call_stay_todo(tmp_path: Path, chooser: str) -> None:
    (tmp_path / "harvest.csv").write_text(HARVEST)
    text = convert(f'import pandas as pd\nwanted = ["kilos"]\ndf = pd.read_csv("harvest.csv", usecols={chooser})\n',
                   data_dir=str(tmp_path)).converted_text
    assert "TODO(porter): pd.read_csv" in text


def test_read_csv_usecols_function_without_data_stays_todo() -> None:
    text = convert('import pandas as pd\ndf = pd.read_csv("a.csv", usecols=lambda c: c != "x")\n').converted_text
    assert "TODO(porter): pd.read_csv" in text


# a lighthouse keeper's tallies: a line of units above the header, a subtotal row of text
# among the numbers (pandas infers the column's type without it), a blank line (a row to
# pandas' skiprows count), a quoted field over two lines (one row), NA tokens, accents
TALLIES = ('unités,,\n'
           'phare,nuits,note\n'
           'Kéréon,12,"calme"\n'
           'sous-total,douze,-\n'
           '\n'
           'Ar-Men,NA,"houle\nforte"\n'
           'Jument,7,n/a\n'
           'total,dix-neuf,-\n')


@pytest.mark.parametrize("options", [
    "skiprows=[0, 3, 7]",
    "skiprows=(0, 3, 7), usecols=['nuits', 'phare']",
    'skiprows=[0, 3, 7], na_values=["-"]',
    'skiprows=[0, 7, 3], header=None, names=["a", "b", "c"]',
])
def test_read_csv_list_of_rows_skipped(tmp_path: Path, options: str) -> None:
    result = same_text(f'''
        import pandas as pd
        tallies = pd.read_csv("tallies.csv", {options})
        print(tallies.columns.tolist(), tallies.dtypes.astype(str).tolist(), len(tallies))
        tallies.to_csv("out.csv", index=False)
        ''', tmp_path, {"tallies.csv": TALLIES})
    assert "TODO(porter): pd.read_csv" not in result.converted_text
    assert "pl.int_range(pl.len()).is_in(" in result.converted_text


def test_read_csv_list_of_first_rows_skipped(tmp_path: Path) -> None:
    # the first rows one after the other: the scan's skip_rows, no filter
    result = same_text('''
        import pandas as pd
        tallies = pd.read_csv("tallies.csv", skiprows=[0])
        print(tallies.columns.tolist(), len(tallies))
        tallies.to_csv("out.csv", index=False)
        ''', tmp_path, {"tallies.csv": TALLIES})
    assert "skip_rows=1" in result.converted_text


@pytest.mark.parametrize("read", [
    'pd.read_csv("tallies.csv", skiprows=[0, 3])',  # without --data
    'pd.read_csv("tallies.csv", skiprows=[0, 3], nrows=2)',
    'pd.read_csv("tallies.csv", skiprows=lambda i: i % 2 == 1)',
])
def test_read_csv_lists_of_rows_porter_does_not_skip_stay_todo(read: str) -> None:
    text = convert(f"import pandas as pd\ndf = {read}\n").converted_text
    assert "TODO(porter): pd.read_csv" in text


# an orchard co-op's spraying log: yes/no and oui/non, pandas' own TRUE/false beside them, a
# column of 1/0 (numbers stay numbers), a column with a text that is neither (stays text)
SPRAYS = ('rang,traité,bio,passes,avis\n'
          'R1,yes,oui,1,yes\n'
          'R2,no,non,0,peut-être\n'
          'R3,TRUE,Oui,1,no\n'
          'R4,false,non,0,yes\n')


@pytest.mark.parametrize("options", [
    'true_values=["yes", "oui", "Oui"], false_values=["no", "non"]',
    'true_values=["yes"], false_values=["no"]',
    'true_values=["yes"], false_values=["no", "1"]',  # the column of 1/0 stays numbers
    'true_values=["yes", "oui", "Oui"], false_values=["no", "non"], usecols=["bio", "rang"]',
])
def test_read_csv_true_and_false_texts(tmp_path: Path, options: str) -> None:
    result = same_text(f'''
        import pandas as pd
        sprays = pd.read_csv("sprays.csv", {options})
        print(sprays.dtypes.astype(str).tolist())
        print(sprays[sprays.columns[-1]].tolist())
        sprays.to_csv("out.csv", index=False)
        ''', tmp_path, {"sprays.csv": SPRAYS})
    assert "TODO(porter): pd.read_csv" not in result.converted_text
    assert "replace_strict(" in result.converted_text


def test_read_csv_true_and_false_texts_filter_rows(tmp_path: Path) -> None:
    result = same_text('''
        import pandas as pd
        sprays = pd.read_csv("sprays.csv", true_values=["yes"], false_values=["no"])
        done = sprays[sprays["traité"]]
        print(len(done), done["rang"].tolist())
        done.to_csv("out.csv", index=False)
        ''', tmp_path, {"sprays.csv": SPRAYS})
    assert "TODO(porter): pd.read_csv" not in result.converted_text


@pytest.mark.parametrize("read", [
    'pd.read_csv("a.csv", true_values=["yes"])',  # without --data
    'pd.read_csv("a.csv", true_values=["x"], false_values=["x"])',
])
def test_read_csv_true_and_false_texts_porter_does_not_read_stay_todo(read: str) -> None:
    text = convert(f"import pandas as pd\ndf = {read}\n").converted_text
    assert "TODO(porter): pd.read_csv" in text


@pytest.mark.parametrize(("text", "options"), [
    ('phare, gardé, nuits\nKéréon, True, 3\nAr-Men, FALSE,  4\nJument, , 5\n',
     "skipinitialspace=True"),
    ('phare,gardé,nuits\nKéréon,True,3\nsous-total,oui,x\nAr-Men,false,4\n', "skiprows=[2]"),
])
def test_read_csv_true_false_column_read_as_text_and_cast(tmp_path: Path, text: str,
                                                          options: str) -> None:
    # a Boolean column scanned as text is made True/False as the reader reads it
    result = same_text(f'''
        import pandas as pd
        phares = pd.read_csv("phares.csv", {options})
        print(phares.dtypes.astype(str).tolist(), phares["gardé"].tolist())
        phares.to_csv("out.csv", index=False)
        ''', tmp_path, {"phares.csv": text})
    assert "TODO(porter): pd.read_csv" not in result.converted_text
