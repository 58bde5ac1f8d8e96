"""Round-2 bad-input paths of the command line: each exits 2 with one message naming the file, line and
field (or the option) and what was expected, no traceback, and leaves the user's files as they were."""

import io
import sys
from pathlib import Path

import pytest

from crossrate.cli.main import main

#: The invented test library the CLI fixtures load (see tests/cli/conftest.py).
TEST_LIBRARY = Path(__file__).resolve().parents[1] / "services" / "data" / "halden_screen_test.toml"

ROOT = Path(__file__).resolve().parents[2]
MEASURED_HEADER = "oxidant,reductant,k_measured"


def _one_line(rc, out, err, *needles):
    assert rc == 2, err
    assert out == ""
    assert "Traceback" not in err
    lines = err.strip().splitlines()
    assert len(lines) == 1, err
    for needle in needles:
        assert needle in lines[0], (needle, lines[0])
    return lines[0]


@pytest.mark.parametrize("argv, needles", [
    (["predict", "hl-iron-a", "hl-ru-b", "--samples", "1"], ["--samples: '1'", "100 to 1000000 draws"]),
    (["predict", "hl-iron-a", "hl-ru-b", "--samples", "100000000000"], ["--samples", "100 to 1000000 draws"]),
    (["predict", "hl-iron-a", "hl-ru-b", "--seed", "-1"], ["--seed: '-1'", "0 or greater"]),
    (["check", "x.csv", "--samples", "10"], ["--samples: '10'"]),
    (["fit", "x.csv", "--seed", "-4"], ["--seed: '-4'"]),
    (["lambda", "--radius", "3.5", "--medium", "water", "--charges", "3:3"], ["--charges: '3:3'", "z_ox - z_red = 1"]),
])
def test_bad_option_values_give_one_line(run_cli, argv, needles):
    _one_line(*run_cli(*argv), *needles)


def test_map_out_into_a_missing_folder(run_cli, tmp_path):
    target = tmp_path / "no-such-folder" / "map.csv"
    line = _one_line(*run_cli("map", "--out", str(target)), "--out", "does not exist", "nothing was written")
    assert "Errno" not in line
    assert not target.parent.exists()


def test_map_out_onto_a_folder_even_with_force(run_cli, tmp_path):
    folder = tmp_path / "results"
    folder.mkdir()
    _one_line(*run_cli("map", "--out", str(folder), "--force"), "is a folder; expected a file name")
    assert list(folder.iterdir()) == []


def test_map_with_a_tag_no_couple_carries(run_cli):
    _one_line(*run_cli("map", "--tag", "no-such-tag"), "--tag no-such-tag: no loaded couple carries this tag")


def test_library_export_out_paths(run_cli, tmp_path):
    _one_line(*run_cli("library", "export", "--format", "csv", "--out", str(tmp_path / "nope" / "x.csv")),
              "does not exist")
    mine = tmp_path / "mine.csv"
    mine.write_text("my own table\n", encoding="utf-8")
    _one_line(*run_cli("library", "export", "--format", "csv", "--out", str(mine)), "file exists")
    assert mine.read_text(encoding="utf-8") == "my own table\n"
    rc, out, err = run_cli("library", "export", "--format", "csv", "--out", str(tmp_path / "new.csv"))
    assert rc == 0 and (tmp_path / "new.csv").read_text(encoding="utf-8").startswith("id,name,")
    assert sorted(p.name for p in tmp_path.iterdir()) == ["mine.csv", "new.csv"]  # no temporary left


def _write(tmp_path, name, data: bytes) -> Path:
    path = tmp_path / name
    path.write_bytes(data)
    return path


def test_check_csv_not_utf8_names_line_and_column(run_cli, tmp_path):
    # byte 0xe9 (Latin-1 e acute) is the 9th character of line 3
    path = _write(tmp_path, "latin1.csv", f"{MEASURED_HEADER}\nhl-iron-a,hl-ru-b,1e6\nhl-iron-\xe9,hl-ru-b,1e6\n"
                  .encode("latin-1"))
    _one_line(*run_cli("check", str(path)), f"{path}:3:9: not a UTF-8 text file (byte 0xe9)", "CSV UTF-8")


def test_check_csv_utf16_is_named(run_cli, tmp_path):
    path = _write(tmp_path, "utf16.csv", f"{MEASURED_HEADER}\nhl-iron-a,hl-ru-b,1e6\n".encode("utf-16"))
    _one_line(*run_cli("check", str(path)), f"{path}:1:1", "UTF-16")


def test_check_csv_folder_and_missing_file(run_cli, tmp_path):
    _one_line(*run_cli("check", str(tmp_path)), f"{tmp_path}: cannot be read: it is a folder; expected a CSV file")
    _one_line(*run_cli("check", str(tmp_path / "absent.csv")), "absent.csv: cannot be read: no such file")


def test_check_csv_with_bom_and_crlf_reads(run_cli, tmp_path):
    path = _write(tmp_path, "excel.csv", f"\ufeff{MEASURED_HEADER}\r\nhl-iron-a,hl-ru-b,1e6\r\n".encode())
    rc, out, err = run_cli("check", str(path), "--samples", "200", "--format", "csv")
    assert rc == 0, err
    assert out.splitlines()[1].startswith("2,,hl-iron-a,hl-ru-b,")


def test_check_csv_line_numbers_survive_form_feeds(run_cli, tmp_path):
    # A form feed inside a free-text cell must not count as a line end (str.splitlines would split there),
    # so the bad k_measured is reported on line 3, column 3, where an editor shows it.
    path = _write(tmp_path, "ff.csv", f"{MEASURED_HEADER},label\nhl-iron-a,hl-ru-b,1e6,a\x0cb\n"
                  "hl-iron-a,hl-ru-b,fast,c\n".encode())
    _one_line(*run_cli("check", str(path)), f"{path}:3:3: field k_measured: got 'fast', expected a number")


def test_check_csv_column_typo_gets_a_suggestion(run_cli, tmp_path):
    path = _write(tmp_path, "typo.csv", b"oxidant,reductant,k_measred\nhl-iron-a,hl-ru-b,1e6\n")
    rc, out, err = run_cli("check", str(path))
    assert rc == 2 and "Traceback" not in err
    assert f"{path}:1:3: unknown column 'k_measred'; did you mean 'k_measured'?" in err


def test_library_add_into_a_missing_folder(run_cli, tmp_path):
    target = tmp_path / "group" / "lib.toml"
    _one_line(*run_cli("library", "add", str(target), "--id", "x", "--name", "X", library=False),
              "folder", "does not exist", "nothing was written")
    assert not target.parent.exists()


def test_library_add_blames_the_option_not_the_snippet(run_cli, tmp_path):
    snippet = tmp_path / "snip.toml"
    snippet.write_text('name = "X"\ncharge_ox = 3\ncharge_red = 2\nE = 0.5\nE_scale = "SHE"\nradius = 3.5\n'
                       'medium = "water"\nionic_strength = 0.1\ntemperature = 298.15\nsource = "invented"\n'
                       "k_self = 1e3\n", encoding="utf-8")
    target = tmp_path / "lib.toml"
    rc, out, err = run_cli("library", "add", str(target), "--id", "x", "--from-toml", str(snippet),
                           "--k-self", "-3", library=False)
    assert rc == 2 and "Traceback" not in err
    assert "command line: couple x: field k_self: got -3" in err
    assert str(snippet) not in err
    assert not target.exists()


@pytest.mark.parametrize("action", [["rename", "t-none", "t-new"], ["remove", "t-none"]])
def test_library_rename_remove_unknown_id_names_the_file(run_cli, tmp_path, action):
    lib = tmp_path / "lib.toml"
    original = TEST_LIBRARY.read_bytes()
    lib.write_bytes(original)
    _one_line(*run_cli("library", action[0], str(lib), *action[1:], library=False),
              f"{lib}: no couple 't-none' in this file", "nothing was changed")
    assert lib.read_bytes() == original
    assert not (tmp_path / "lib.toml.bak").exists()


class _ClosedPipe(io.TextIOBase):
    """stdout whose reader has gone away (`crossrate ... | head -1`)."""

    def __init__(self, fd):
        self._fd = fd

    def write(self, text):
        raise BrokenPipeError(32, "Broken pipe")

    def fileno(self):
        return self._fd


def test_closed_pipe_is_not_reported_as_an_error(isolated_env, tmp_path, monkeypatch, capsys):
    with open(tmp_path / "sink", "w") as sink:
        monkeypatch.setattr(sys, "stdout", _ClosedPipe(sink.fileno()))
        rc = main(["library", "list", "--no-bundled", "--library", str(TEST_LIBRARY), "--format", "csv"])
    assert rc == 0
    assert capsys.readouterr().err == ""


def test_check_csv_cells_name_the_unit_and_the_solvent(run_cli, tmp_path):
    path = _write(tmp_path, "cells.csv", b"oxidant,reductant,k_measured,temperature,medium\n"
                  b"hl-iron-a,hl-ru-b,1e6,300 K,water\nhl-iron-a,hl-ru-b,1e6,298,Water\n")
    rc, out, err = run_cli("check", str(path))
    assert rc == 2 and out == "" and "Traceback" not in err
    assert f"{path}:2:4: field temperature: got '300 K', expected a plain number without a unit" in err
    assert f"{path}:3:5: field medium: got 'Water', expected a solvent key (did you mean 'water'?)" in err


def test_check_csv_unclosed_quote_and_empty_file(run_cli, tmp_path):
    path = _write(tmp_path, "quote.csv", f'{MEASURED_HEADER}\n"hl-iron-a,hl-ru-b,1e6\n'.encode())
    _one_line(*run_cli("check", str(path)), f"{path}:2: a double quote is not closed")
    empty = _write(tmp_path, "empty.csv", b"# only a comment\n\n")
    _one_line(*run_cli("fit", str(empty), library=False), f"{empty}: no header line",
              "dG0_kJ_per_mol or dG0_eV, k_obs")


def test_screen_with_a_tag_no_couple_carries(run_cli):
    _one_line(*run_cli("screen", "hl-iron-a", "--role", "oxidant", "--tag", "no-such-tag"),
              "--tag no-such-tag: no loaded couple carries this tag")
