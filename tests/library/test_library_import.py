"""`crossrate library import` and the CSV export it reads back: every problem at once with file:line:column,
nothing written on any problem, ids refused unless replacing, the target's comments kept, and a TOML -> CSV
-> TOML round trip that loses nothing (property test over every field of the schema)."""

import datetime
import math
import tempfile
from pathlib import Path

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st
from library_helpers import BASE

from crossrate.cli.library_cmd import _bundled_scales
from crossrate.cli.main import main
from crossrate.core.potential_scales import ScaleRegistry, builtin_scales
from crossrate.core.solvents import solvent_table
from crossrate.errors import LibraryError
from crossrate.library.couple import BondSet, Couple
from crossrate.library.couple_export import couple_record, export_toml, records_csv
from crossrate.library.couple_import import import_couples_csv, parse_tags_cell
from crossrate.library.schema import FIELD_SPECS
from crossrate.library.spreadsheet_cells import from_spreadsheet_cell, spreadsheet_safe
from crossrate.library.toml_reader import read_library_file

HEADER = "id,name,charge_ox,charge_red,E,radius,ionic_strength,source,tags,doi,date\n"


def _run(*argv):
    try:
        return main(list(argv))
    except SystemExit as exc:
        return exc.code


# --- the round trip ----------------------------------------------------------------------------------

_TEXT = st.text(st.characters(blacklist_categories=("Cs", "Cc")) | st.sampled_from("\n\t\r,;\"'#[]=+-@"), max_size=30)
_NAME = _TEXT.filter(lambda s: s.strip())


def _number(spec):
    lo, hi = spec.low, spec.high
    return st.floats(lo, hi, allow_nan=False, allow_infinity=False, exclude_min=spec.low_open,
                     exclude_max=spec.high_open)


@st.composite
def couples(draw, n_max=4):
    out = []
    for i in range(draw(st.integers(1, n_max))):
        z = draw(st.integers(-9, 10))
        values = {"id": f"c-{i}.{draw(st.sampled_from(['a', 'b_', 'x-9']))}", "charge_ox": z, "charge_red": z - 1}
        for spec in FIELD_SPECS:
            n = spec.name
            if n in values:
                continue
            optional = not spec.required and draw(st.booleans())
            if optional or (n in ("E00", "excited_form")):
                continue
            kind = spec.kind
            if kind == "number":
                values[n] = draw(_number(spec))
            elif kind == "text":
                values[n] = draw(_NAME if spec.required else _TEXT)
            elif kind == "boolean":
                values[n] = draw(st.booleans())
            elif kind == "text list":
                values[n] = tuple(draw(st.lists(_NAME, max_size=3)))
            elif kind == "bonds":
                values[n] = tuple(BondSet(draw(st.integers(1, 100)), draw(st.floats(-1, 1)),
                                          draw(st.floats(0, 5000, exclude_min=True)),
                                          draw(st.floats(0, 5000, exclude_min=True)))
                                  for _ in range(draw(st.integers(0, 2))))
            elif kind == "medium":
                values[n] = draw(st.sampled_from(sorted(solvent_table())))
            elif kind == "scale":
                values[n] = draw(st.sampled_from(sorted(builtin_scales())))
            elif kind == "doi":
                values[n] = "10." + draw(st.from_regex(r"[0-9]{4,9}/[A-Za-z0-9.()/:;_-]{1,20}", fullmatch=True))
            elif kind == "date":
                values[n] = draw(st.dates(datetime.date(1900, 1, 1), datetime.date(2024, 12, 31)))
            else:
                raise AssertionError(f"the round-trip test does not know field kind {kind!r} ({n}); add it here")
        if values.get("invented") and values.get("verified"):
            values["verified"] = False  # made-up values cannot be verified (a rule of the schema)
        if draw(st.booleans()):
            values["E00"] = draw(st.floats(0, 5, exclude_min=True))
            values["excited_form"] = draw(st.sampled_from(["ox", "red"]))
        out.append(Couple(**values))
    return out


@settings(max_examples=40, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(couples())
def test_toml_to_csv_to_toml_loses_nothing(original):
    with tempfile.TemporaryDirectory() as d:
        folder = Path(d)
        first = folder / "first.toml"
        first.write_text(export_toml(original, ScaleRegistry()), encoding="utf-8")
        read_back = read_library_file(first).couples
        assert read_back == original
        table = folder / "couples.csv"
        table.write_text(records_csv([couple_record(c) for c in read_back]), encoding="utf-8", newline="")
        second = folder / "second.toml"
        import_couples_csv(table, second)
        again = read_library_file(second).couples
        assert again == original
        for a, b in zip(again, original, strict=True):  # floats identical to the last bit, not only ==
            for spec in FIELD_SPECS:
                x, y = getattr(a, spec.name), getattr(b, spec.name)
                if isinstance(x, float):
                    assert math.copysign(1.0, x) == math.copysign(1.0, y) and x.hex() == y.hex()


@given(st.text())
def test_spreadsheet_guard_is_undone_on_import(text):
    assert from_spreadsheet_cell(spreadsheet_safe(text)) == text


def test_tags_cell_forms():
    assert parse_tags_cell("aqua; spin-change") == ["aqua", "spin-change"]
    assert parse_tags_cell('["a;b", " c"]') == ["a;b", " c"]
    with pytest.raises(ValueError, match="TOML list"):
        parse_tags_cell('["a"')


# --- problems ----------------------------------------------------------------------------------------

def test_every_problem_at_once_with_line_and_column_and_nothing_written(tmp_path, capsys):
    target = tmp_path / "lib.toml"
    target.write_text(BASE, encoding="utf-8")
    before = target.read_bytes()
    table = tmp_path / "in.csv"
    table.write_text(HEADER
                     + 'n-1,New one,3,3,abc,3.5,0.1,invented for the tests,,,\n'        # line 2: charges, E
                     + 'n-2,"two\nlines",2,1,0.1,35,0.1,invented for the tests,,10.1/x,\n'  # 3-4: radius, doi
                     + 't-one,Dup of file,2,1,0.1,3.5,0.1,invented for the tests,,,2999-01-01\n'  # 5: id, date
                     + 'n-1,again,2,1,0.1,3.5,0.1,s,,,\n'                                   # 6: id twice
                     + 'n-5,short,2\n', encoding="utf-8")                                   # 7: cells
    rc = _run("library", "import", str(table), "--into", str(target))
    err = capsys.readouterr().err
    assert rc == 2
    t = str(table)
    for expected in (f"{t}:2:3: couple n-1: field charge_ox: charge_ox - charge_red", f"{t}:2:5: couple n-1: field E:",
                     f"{t}:3:6: couple n-2: field radius:", f"{t}:3:10: couple n-2: field doi:",
                     f"{t}:5:1: couple t-one: already in {target} (line", f"{t}:5:11: couple t-one: field date:",
                     f"{t}:6:1: couple n-1: id also on line 2", f"{t}:7: 3 cells; expected 11"):
        assert expected in err, expected
    assert "Traceback" not in err
    assert target.read_bytes() == before
    assert not (tmp_path / "lib.toml.bak").exists()


def test_unknown_column_and_missing_id_column(tmp_path, capsys):
    table = tmp_path / "in.csv"
    table.write_text("name,radiuss\nx,3\n", encoding="utf-8")
    rc = _run("library", "import", str(table), "--into", str(tmp_path / "new.toml"))
    err = capsys.readouterr().err
    assert rc == 2
    assert f"{table}:1:2: unknown column 'radiuss' (did you mean radius?)" in err
    assert f"{table}:1:1: no id column" in err
    assert not (tmp_path / "new.toml").exists()


def test_not_utf8_names_line_and_column(tmp_path):
    table = tmp_path / "in.csv"
    table.write_bytes(HEADER.encode() + b"n-1,caf\xe9,3,2\n")
    with pytest.raises(LibraryError, match=r"in\.csv:2:8: not UTF-8 text \(byte 0xe9\)"):
        import_couples_csv(table, tmp_path / "new.toml")


# --- writing -----------------------------------------------------------------------------------------

def test_adds_to_a_file_keeping_its_comments_and_defaults(tmp_path, capsys):
    target = tmp_path / "lib.toml"
    target.write_text(BASE, encoding="utf-8")
    table = tmp_path / "in.csv"
    table.write_text(HEADER + "n-1,New one,3,2,0.25,3.5,0.1,invented for the tests,aqua; new,10.1021/ab12345,"
                     "2024-05-17\n", encoding="utf-8")
    assert _run("library", "import", str(table), "--into", str(target)) == 0
    assert "imported 1 couples" in capsys.readouterr().out
    text = target.read_text(encoding="utf-8")
    assert text.startswith(BASE)  # every byte of the file as it was, comments included
    lf = read_library_file(target)
    c = lf.couple("n-1")
    # medium, temperature and E_scale came from the file's [library] defaults and are not repeated
    assert (c.medium, c.temperature, c.E_scale) == ("water", 298.15, "SHE")
    assert "medium" not in text.split("[couple.n-1]")[1]
    assert c.tags == ("aqua", "new") and c.doi == "10.1021/ab12345" and c.date == datetime.date(2024, 5, 17)
    assert (tmp_path / "lib.toml.bak").read_text(encoding="utf-8") == BASE


def test_replace_rewrites_only_the_named_couples(tmp_path, capsys):
    target = tmp_path / "lib.toml"
    target.write_text(BASE, encoding="utf-8")
    table = tmp_path / "in.csv"
    table.write_text("id,name,charge_ox,charge_red,E,k_self,radius,ionic_strength,source,verified\n"
                     "t-two,test two 2+/1+,2,1,-0.25,5.0e6,4.0,0.1,invented for the tests,false\n", encoding="utf-8")
    assert _run("library", "import", str(table), "--into", str(target)) == 2
    assert "import with --replace" in capsys.readouterr().err
    assert _run("library", "import", str(table), "--into", str(target), "--replace") == 0
    assert "1 replaced (t-two)" in capsys.readouterr().out
    text = target.read_text(encoding="utf-8")
    assert text == BASE.replace("E = -0.20", "E = -0.25")  # one line changed; the comment in the table kept
    assert read_library_file(target).couple("t-two").E == -0.25


def test_export_of_one_file_reads_back_through_the_cli(tmp_path, capsys):
    source = tmp_path / "lib.toml"
    source.write_text(BASE, encoding="utf-8")
    out = tmp_path / "out.csv"
    assert _run("library", "export", "--file", str(source), "--format", "csv", "--out", str(out)) == 0
    capsys.readouterr()
    assert _run("library", "import", str(out), "--into", str(tmp_path / "copy.toml")) == 0
    # t-three's scale Fc-MeCN is the bundled starter library's too, which the import checks against; a CSV
    # carries no scale definitions
    known = _bundled_scales()
    assert "Fc-MeCN" in known
    assert read_library_file(tmp_path / "copy.toml", known_scales=known).couples == read_library_file(source).couples
