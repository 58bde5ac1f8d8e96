"""`crossrate library ...`: exit codes, messages on stderr, the output forms."""

import csv
import io
import json
import os
import subprocess
import sys
from pathlib import Path

import pytest
from library_helpers import BASE, line_of

from crossrate.cli.main import main
from crossrate.library.toml_reader import read_library_file

ROOT = Path(__file__).resolve().parents[2]


@pytest.fixture
def run(capsys):
    def go(*argv):
        try:
            rc = main(list(argv))
        except SystemExit as exc:  # argparse's own usage errors
            rc = exc.code
        out, err = capsys.readouterr()
        return rc, out, err

    return go


def test_validate_valid_and_invalid_files(run, base_file, write_lib):
    rc, out, err = run("library", "validate", str(base_file))
    assert (rc, out, err) == (0, f"{base_file}: valid (3 couples; checked on top of the bundled layer)\n", "")
    bad = write_lib(BASE.replace("radius = 3.5", "radius = 0.5"), "bad.toml")
    rc, out, err = run("library", "validate", str(base_file), str(bad))
    assert rc == 2
    assert out == f"{base_file}: valid (3 couples; checked on top of the bundled layer)\n"
    line = line_of(BASE, "radius = 3.5")
    assert err.splitlines() == [
        f"{bad}:{line}: couple t-one: field radius: got 0.5 angstrom; expected a finite number from 1 to 30 angstrom",
        "crossrate: 1 problem in 1 file",
    ]


def test_validate_missing_file_and_syntax_error(run, write_lib, tmp_path):
    rc, _, err = run("library", "validate", str(tmp_path / "none.toml"))
    assert rc == 2 and f"{tmp_path / 'none.toml'}: no such file; expected a library TOML file" in err
    bad = write_lib("[library]\nformat = 1\ntitle = \n", "syn.toml")
    rc, _, err = run("library", "validate", str(bad))
    assert rc == 2 and err.startswith(f"{bad}:3:9: TOML syntax error: ")
    assert "Traceback" not in err


def test_validate_bundled_libraries(run):
    rc, out, err = run("library", "validate", str(ROOT / "libraries" / "demo.toml"),
                       str(ROOT / "libraries" / "starter.toml"))
    assert rc == 0 and err == "" and out.count("valid") == 2


def test_list_table_marks_unverified_and_shadowing(run, base_file, write_lib):
    over = write_lib(BASE.replace("test two 2+/1+", "test two, personal copy"), "over.toml")
    rc, out, err = run("library", "list", "--no-bundled", "--library", str(base_file), "--library", str(over))
    assert rc == 0 and err == ""
    row = next(ln for ln in out.splitlines() if ln.lstrip().startswith("t-two"))
    assert "-0.200?" in row and "5e+06?" in row and "cli" in row  # unverified values marked
    assert "? unverified: values recalled or estimated, not checked against the primary source (1 of these" in out
    assert "3 shadowed by a later layer: t-one (cli -> cli), t-two (cli -> cli), t-three (cli -> cli)" in out


def test_list_filters_and_formats(run, base_file):
    rc, out, _ = run("library", "list", "--no-bundled", "--library", str(base_file), "--format", "json",
                     "--medium", "acetonitrile")
    assert rc == 0
    (rec,) = json.loads(out)
    assert rec["id"] == "t-three" and rec["E_scale"] == "Fc-MeCN" and rec["k_self"] == 2.0e7
    assert rec["path"] == str(base_file) and rec["line"] == line_of(BASE, "[couple.t-three]")
    assert rec["layer"] == "cli" and rec["shadows"] == [] and rec["E_sd"] is None
    rc, out, _ = run("library", "list", "--no-bundled", "--library", str(base_file), "--format", "csv",
                     "--tag", "aqua")
    rows = list(csv.DictReader(io.StringIO(out)))
    assert [r["id"] for r in rows] == ["t-one"] and rows[0]["tags"] == "aqua" and rows[0]["verified"] == "true"
    rc, _, err = run("library", "list", "--no-bundled", "--library", str(base_file), "--medium", "watr")
    assert rc == 2 and "unknown medium 'watr'" in err


def test_list_bundled_by_default(run):
    rc, out, _ = run("library", "list", "--format", "json")
    ids = {r["id"] for r in json.loads(out)}
    assert rc == 0 and "fe-aq" in ids and not any(i.startswith("hl-") for i in ids)  # the demo only when asked


def test_each_bundled_layer_left_out_on_its_own(run):
    def ids(*args):
        rc, out, err = run("library", "list", "--format", "json", *args)
        assert rc == 0, err
        return {r["id"]: r for r in json.loads(out)}

    both = ids("--demo")
    assert "fe-aq" in both and "hl-med3" in both
    assert both["hl-med3"]["layer"] == "demo" and both["fe-aq"]["layer"] == "bundled"
    assert both["hl-med3"]["invented"] is True and both["hl-med3"]["verified"] is False
    demo_only = ids("--demo", "--no-starter")
    assert demo_only and all(i.startswith("hl-") for i in demo_only)
    rc, _, err = run("library", "list", "--demo", "--no-bundled")
    assert rc == 2 and "--demo and --no-bundled contradict" in err
    # the root parser takes the flags too (before the command)
    rc, out, _ = run("--demo", "library", "list", "--format", "json")
    assert rc == 0 and "hl-med3" in {r["id"] for r in json.loads(out)}


def test_list_marks_invented_couples_apart_from_unverified(run):
    rc, out, err = run("library", "list", "--demo")
    assert rc == 0, err
    med3 = next(ln for ln in out.splitlines() if ln.startswith("hl-med3 "))
    fe = next(ln for ln in out.splitlines() if ln.startswith("fe-aq "))
    assert "+1.050!" in med3 and "?" not in med3  # invented: its own mark, not the unverified one
    assert "+0.740?" in fe and "!" not in fe
    flat = " ".join(out.split())
    assert "! invented: made-up values (demo, teaching), not measurements; never use them for real predictions (25 of" in flat
    rc, out, _ = run("library", "show", "hl-med3", "--demo")
    assert rc == 0 and "INVENTED" in out and "UNVERIFIED" not in out


def test_empty_set_said_in_words(run):
    rc, out, err = run("library", "list", "--no-bundled")
    assert rc == 0
    assert out.startswith("no couples loaded: searched the personal layer (") and "no such file" in out
    rc, out, err = run("predict", "hl-med2", "hl-ru-amine", "--no-bundled")
    assert rc == 2 and err.startswith("crossrate: no couples loaded: searched the personal layer")
    assert "--demo" in err and "crossrate library new FILE" in err


def test_show_fields_origin_and_shadowing(run, base_file, write_lib):
    over = write_lib(BASE, "over.toml")
    rc, out, _ = run("library", "show", "t-two", "--no-bundled", "--library", str(base_file), "--library", str(over))
    assert rc == 0
    assert out.startswith("couple t-two: test two 2+/1+\n")
    assert f"from            {over}:{line_of(BASE, '[couple.t-two]')} (cli layer)" in out
    assert "UNVERIFIED" in out
    assert f"k_self          5e+06 M^-1 s^-1   (line {line_of(BASE, 'k_self = 5.0e6')})" in out
    assert f"shadows         {base_file}:{line_of(BASE, '[couple.t-two]')} (cli layer)" in out
    assert "E on root scale -0.200 V vs SHE" in out


def test_show_unknown_id_suggests(run, base_file):
    rc, out, err = run("library", "show", "t-tow", "--no-bundled", "--library", str(base_file))
    assert rc == 2 and out == ""
    assert err.startswith("crossrate: unknown couple 't-tow'; did you mean t-two")


def test_add_from_options_keeps_the_file(run, base_file):
    rc, out, err = run("library", "add", str(base_file), "--id", "t-four", "--name", "test four", "--charge-ox", "0",
                       "--charge-red", "-1", "--E", "-0.3", "--radius", "3.8", "--ionic-strength", "0.1",
                       "--source", "invented for the tests", "--tags", "organic, quinone", "--k-self", "1e8",
                       "--verified")
    assert rc == 0 and err == "" and "added couple t-four" in out
    text = base_file.read_text()
    assert text.startswith(BASE)
    c = read_library_file(base_file).couple("t-four")
    assert (c.charge_ox, c.E, c.k_self, c.tags, c.verified, c.medium) == (0, -0.3, 1e8, ("organic", "quinone"),
                                                                          True, "water")
    assert base_file.with_name("lib.toml.bak").read_text() == BASE


def test_add_reports_every_bad_option(run, base_file):
    rc, _, err = run("library", "add", str(base_file), "--id", "t-four", "--name", "x", "--charge-ox", "3",
                     "--charge-red", "1", "--E", "fast", "--radius", "0.2", "--ionic-strength", "0.1",
                     "--source", "s")
    assert rc == 2
    assert "command line: couple t-four: field E: --E: 'fast' is not a number" in err
    assert "command line: couple t-four: field radius: got 0.2 angstrom" in err
    assert "field charge_ox: charge_ox - charge_red = 3 - (1) = 2; expected exactly 1" in err
    assert base_file.read_text() == BASE


def test_add_from_toml_snippet(run, base_file, write_lib):
    snip = write_lib('[couple.t-five]\nname = "five"\ncharge_ox = 1\ncharge_red = 0\nE = 0.4\nradius = 4\n'
                     'ionic_strength = 0\nsource = "invented"\nk_slef = 5\n', "snip.toml")
    rc, _, err = run("library", "add", str(base_file), "--from-toml", str(snip))
    assert rc == 2 and f"{snip}:9: couple t-five: field k_slef: unknown field (did you mean k_self?)" in err
    snip.write_text(snip.read_text().replace("k_slef", "k_self"))
    rc, out, _ = run("library", "add", str(base_file), "--from-toml", str(snip), "--E", "0.45")
    assert rc == 0
    c = read_library_file(base_file).couple("t-five")
    assert (c.E, c.k_self) == (0.45, 5.0)  # the option overrides the snippet


def test_add_without_id(run, base_file):
    rc, _, err = run("library", "add", str(base_file), "--name", "x")
    assert rc == 2 and "no id; expected --id ID" in err


def test_remove_and_rename(run, base_file):
    rc, _, err = run("library", "remove", str(base_file), "t-tw")
    assert rc == 2 and "no couple 't-tw' in this file; did you mean t-two?" in err
    rc, out, _ = run("library", "rename", str(base_file), "t-two", "t-2")
    assert rc == 0 and "renamed couple t-two to t-2" in out
    rc, out, _ = run("library", "remove", str(base_file), "t-2")
    assert rc == 0 and "removed couple t-2" in out
    assert [c.id for c in read_library_file(base_file).couples] == ["t-one", "t-three"]


def test_export_toml_reads_back_the_same_couples(run, base_file, tmp_path):
    out_file = tmp_path / "export.toml"
    rc, out, _ = run("library", "export", "--format", "toml", "--no-bundled", "--library", str(base_file),
                     "--out", str(out_file))
    assert rc == 0 and "wrote 3 couples" in out
    again = read_library_file(out_file)
    assert again.couples == read_library_file(base_file).couples  # every field (origin aside) equal
    assert again.scales["Fc-MeCN"].offset_V == 0.63
    rc, _, err = run("library", "export", "--format", "toml", "--no-bundled", "--library", str(base_file),
                     "--out", str(out_file))
    assert rc == 2 and "file exists; expected a new file name (nothing was written)" in err


def test_export_json_and_csv(run, base_file):
    rc, out, _ = run("library", "export", "--format", "json", "--no-bundled", "--library", str(base_file))
    assert rc == 0 and [r["id"] for r in json.loads(out)] == ["t-one", "t-two", "t-three"]
    rc, out, _ = run("library", "export", "--format", "csv", "--no-bundled", "--library", str(base_file))
    assert rc == 0 and out.splitlines()[0].startswith("id,name,charge_ox,charge_red,E,")


def test_library_without_action_exits_2(run):
    rc, _, err = run("library")
    assert rc == 2 and "validate" in err


def test_real_process_no_traceback(base_file, write_lib):
    bad = write_lib(BASE.replace("k_self = 5.0e6", "k_self = true"), "bad.toml")
    env = dict(os.environ, PYTHONPATH=str(ROOT))
    proc = subprocess.run([sys.executable, "-m", "crossrate.cli.main", "library", "validate", str(bad)],
                          capture_output=True, text=True, env=env, cwd=ROOT)
    assert proc.returncode == 2
    assert f"{bad}:{line_of(BASE, 'k_self = 5.0e6')}: couple t-two: field k_self: got true (a boolean)" in proc.stderr
    assert "Traceback" not in proc.stderr


def test_add_to_a_new_personal_file_using_a_bundled_scale(run, tmp_path):
    p = tmp_path / "personal.toml"
    rc, out, err = run("library", "add", str(p), "--id", "my-fc", "--name", "my ferrocene", "--charge-ox", "1",
                       "--charge-red", "0", "--E", "0.05", "--E-scale", "Fc-MeCN", "--radius", "3.8",
                       "--medium", "acetonitrile", "--ionic-strength", "0.1", "--temperature", "298.15",
                       "--source", "invented for the tests")
    assert (rc, err) == (0, "") and "added couple my-fc" in out
    rc, out, err = run("library", "validate", str(p))
    assert rc == 0 and "valid (1 couple;" in out


GROUP_WITH_SCALE = """\
[library]
format = 1
[library.scales.lab-ref]
name = "the group's reference electrode (invented)"
relative_to = "SHE"
offset_V = 0.20
"""


def test_validate_judges_a_file_in_the_layered_context(run, write_lib, monkeypatch):
    group = write_lib(GROUP_WITH_SCALE, "group.toml")
    monkeypatch.setenv("CROSSRATE_GROUP_LIBRARY", str(group))
    # a scale redefined differently from the group's: refused, as predict --library would refuse it
    other = GROUP_WITH_SCALE.replace("offset_V = 0.20", "offset_V = 0.30")
    mine = write_lib(other, "mine.toml")
    rc, out, err = run("library", "validate", str(mine))
    assert rc == 2 and out == ""
    assert f"{mine}:" in err and "library.scales.lab-ref: defined differently in " + str(group) in err
    rc2, _, err2 = run("predict", "--library", str(mine), "--no-bundled", "x", "y")
    assert rc2 == 2 and "defined differently" in err2
    # a file using the group's scale without defining it: valid, and the message says in which context
    user = write_lib(BASE.replace('E_scale = "SHE"', 'E_scale = "lab-ref"'), "user.toml")
    rc, out, err = run("library", "validate", str(user))
    assert (rc, err) == (0, "")
    assert out == f"{user}: valid (3 couples; checked on top of the bundled and group layers)\n"

