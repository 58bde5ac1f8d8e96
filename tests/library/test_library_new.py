"""`crossrate library new FILE`: a valid file with header and commented example couple, never over a file;
then add, list and predict with it (the README's path from nothing to a first couple)."""

import pytest

from crossrate.cli.main import main
from crossrate.library.new_library import create_library
from crossrate.library.toml_reader import read_library_file


@pytest.fixture
def run(capsys):
    def go(*argv):
        try:
            rc = main(list(argv))
        except SystemExit as exc:
            rc = exc.code
        out, err = capsys.readouterr()
        return rc, out, err

    return go


def test_new_file_has_header_defaults_and_commented_example(run, tmp_path):
    path = tmp_path / "ours.toml"
    rc, out, err = run("library", "new", str(path), "--title", "Our couples", "--medium", "acetonitrile",
                       "--E-scale", "SCE", "--temperature", "293.15")
    assert rc == 0 and err == "" and out.startswith(f"created {path}: no couple yet (defaults acetonitrile, SCE, 293.15 K)")
    lf = read_library_file(path)
    assert lf.title == "Our couples" and lf.couples == []
    assert lf.defaults == {"medium": "acetonitrile", "E_scale": "SCE", "temperature": 293.15}
    text = path.read_text(encoding="utf-8")
    assert "format = 1" in text
    # the example couple is there, commented out, with every required field and its unit
    example = [ln[2:] for ln in text.splitlines() if ln.startswith("# ") and "=" in ln]
    for field in ("name", "charge_ox", "charge_red", "E", "radius", "ionic_strength", "source"):
        assert any(ln.startswith(f"{field} =") for ln in example), field
    assert "# [couple.my-couple]" in text and "V vs SCE" in text and "M^-1 s^-1" in text


def test_new_refuses_to_overwrite_and_bad_defaults(run, tmp_path):
    path = tmp_path / "ours.toml"
    path.write_text("keep me\n", encoding="utf-8")
    rc, _, err = run("library", "new", str(path))
    assert rc == 2 and err == f"crossrate: {path}: exists already; expected the name of a new file (nothing was written)\n"
    assert path.read_text(encoding="utf-8") == "keep me\n"
    other = tmp_path / "other.toml"
    rc, _, err = run("library", "new", str(other), "--medium", "watr")
    assert rc == 2 and "medium 'watr': expected one of" in err and not other.exists()
    rc, _, err = run("library", "new", str(other), "--E-scale", "NHE")
    assert rc == 2 and "E_scale 'NHE': expected one of SHE" in err and not other.exists()
    rc, _, err = run("library", "new", str(tmp_path / "no-folder" / "x.toml"))
    assert rc == 2 and "does not exist; expected an existing folder" in err
    rc, _, err = run("library", "new", str(tmp_path / "x.txt"))
    assert rc == 2 and "expected a file name ending in .toml" in err


def test_from_nothing_to_a_first_couple(run, tmp_path):
    path = str(tmp_path / "ours.toml")
    assert run("library", "new", path)[0] == 0
    rc, out, err = run("library", "add", path, "--id", "my-med", "--name", "invented mediator 1+/0",
                       "--charge-ox", "1", "--charge-red", "0", "--E", "0.45", "--k-self", "2e6", "--radius", "4.0",
                       "--ionic-strength", "0.1", "--source", "invented example", "--invented")
    assert rc == 0, err
    text = (tmp_path / "ours.toml").read_text(encoding="utf-8")
    assert "# [couple.my-couple]" in text  # the commented example is kept
    assert run("library", "validate", path)[0] == 0
    rc, out, err = run("library", "list", "--no-starter", "--library", path)
    assert rc == 0 and "my-med" in out and "+0.450!" in out
    rc, out, err = run("predict", "my-med", "fe-aq", "--library", path, "--ionic-strength", "0.1", "--samples", "0")
    assert rc == 0, err
    flat = " ".join(out.split())
    assert "my-med (! invented)" in flat and "fe-aq (? unverified)" in flat


def test_create_library_api_never_overwrites(tmp_path):
    path = tmp_path / "a.toml"
    create_library(path)
    before = path.read_bytes()
    with pytest.raises(Exception, match="exists already"):
        create_library(path, title="again")
    assert path.read_bytes() == before
    assert read_library_file(path).title == "a"  # the file name's stem by default
