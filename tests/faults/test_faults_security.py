"""A library or a CSV can never make crossrate run code, write outside the file it was asked to write, or
change a file's permissions when it rewrites it."""

import io
import os
import re
import stat
from contextlib import redirect_stderr, redirect_stdout

import pytest
from fault_corpus import VALID_LIBRARY

from crossrate.cli.main import main

#: Texts that would do something if anything evaluated, expanded or templated them.
PAYLOADS = ("__import__('os').system('touch PWNED')", "$(touch PWNED)", "`touch PWNED`", "{{7*7}}",
            "${PWNED}", "!!python/object/apply:os.system ['touch PWNED']", "%(PWNED)s", "=cmd|'/C touch PWNED'!A0")


def _run(*argv):
    out, err = io.StringIO(), io.StringIO()
    with redirect_stdout(out), redirect_stderr(err):
        rc = main(list(argv))
    return rc, out.getvalue(), err.getvalue()


def _hostile_library(tmp_path):
    text = VALID_LIBRARY
    for i, payload in enumerate(PAYLOADS):
        esc = payload.replace("\\", "\\\\").replace('"', '\\"')
        text += (f'\n[couple.p-{i}]\nname = "{esc}"\ncharge_ox = 3\ncharge_red = 2\nE = 0.2\nk_self = 10\n'
                 f'radius = 4\nionic_strength = 0.1\nsource = "{esc}"\nnotes = "{esc}"\ntags = ["{esc}"]\n')
    p = tmp_path / "hostile.toml"
    p.write_text(text, encoding="utf-8")
    return p


def test_library_and_csv_text_is_never_run(tmp_path, monkeypatch):
    monkeypatch.chdir(tmp_path)
    lib = _hostile_library(tmp_path)
    lib_opts = ("--no-bundled", "--library", str(lib))
    runs = [("library", "validate", str(lib)), ("library", "list", *lib_opts), ("library", "show", "p-0", *lib_opts),
            ("library", "export", "--format", "csv", *lib_opts), ("library", "export", "--format", "json", *lib_opts),
            ("library", "export", "--format", "toml", *lib_opts), ("predict", "p-0", "p-1", *lib_opts),
            ("map", "--format", "json", "--allow-mixed-media", "--medium", "water", *lib_opts)]
    csv = tmp_path / "m.csv"
    csv.write_text("oxidant,reductant,k_measured,label\n" + "".join(
        f'p-0,p-1,1e3,"{p.replace(chr(34), chr(34) * 2)}"\n' for p in PAYLOADS), encoding="utf-8")
    runs.append(("check", str(csv), "--format", "csv", *lib_opts))
    for argv in runs:
        rc, out, err = _run(*argv)
        assert rc == 0, (argv, err)
        if argv[1] in ("show", "list") or argv[0] == "check":
            assert "{{7*7}}" in out or "p-0" in out
    # "49" would be a template evaluated ({{7*7}}); the file's own path (pytest-49x/...) may hold it too.
    shown = re.sub(r"pytest-\d+", "", _run("library", "show", "p-3", *lib_opts)[1].replace(str(tmp_path), ""))
    assert not (tmp_path / "PWNED").exists() and "49" not in shown


@pytest.mark.parametrize("bad_id", ["../x", "../../etc/x", "/tmp/x", "a/b", "x\x00y", "..", "-x"])
def test_ids_never_name_files(tmp_path, bad_id):
    # ids are keys inside the file, never file names: a path-like one is refused, and one the id rule allows
    # (".." is lower-case letters, digits, '.', '_' and '-') only ever becomes a table in the file
    lib = tmp_path / "sub" / "lib.toml"
    lib.parent.mkdir()
    lib.write_text(VALID_LIBRARY, encoding="utf-8")
    before = sorted(p.relative_to(tmp_path) for p in tmp_path.rglob("*"))
    rc, _, err = _run("library", "add", str(lib), f"--id={bad_id}", "--name", "x", "--charge-ox", "3", "--charge-red",
                      "2", "--E", "0.1", "--radius", "4", "--ionic-strength", "0.1", "--source", "invented")
    allowed = bad_id in ("..", "-x")
    if allowed:
        assert rc == 0, err
        from crossrate.library.toml_reader import read_library_file

        assert read_library_file(lib).couple(bad_id) is not None
    else:
        assert rc == 2 and "bad id" in err
        rc2, _, _ = _run("library", "rename", str(lib), "hl-a", bad_id)
        assert rc2 == 2
        assert lib.read_text(encoding="utf-8") == VALID_LIBRARY
    after = sorted(p.relative_to(tmp_path) for p in tmp_path.rglob("*") if not p.name.startswith(".lib.toml.lock")
                   and p.name != "lib.toml.bak")
    assert after == before


def test_output_never_written_through_a_link_to_elsewhere(tmp_path):
    lib = tmp_path / "lib.toml"
    lib.write_text(VALID_LIBRARY, encoding="utf-8")
    victim = tmp_path / "victim.txt"
    victim.write_text("precious\n")
    link = tmp_path / "map.csv"
    link.symlink_to(victim)
    rc, _, err = _run("map", "--out", str(link), "--no-bundled", "--library", str(lib))
    assert rc == 2 and "file exists" in err
    rc, _, err = _run("map", "--out", str(link), "--force", "--no-bundled", "--library", str(lib))
    assert rc == 0, err
    assert victim.read_text() == "precious\n"  # --force replaced the link itself, never its target
    assert not link.is_symlink() and link.read_text().startswith("oxidant\\reductant")


def test_library_edit_through_a_link_edits_the_shared_file_and_keeps_its_mode(tmp_path):
    shared = tmp_path / "shared"
    shared.mkdir()
    real = shared / "group.toml"
    real.write_text(VALID_LIBRARY, encoding="utf-8")
    os.chmod(real, 0o2664 & 0o777 | 0o060)
    mode = stat.S_IMODE(os.stat(real).st_mode)
    link = tmp_path / "mine.toml"
    link.symlink_to(real)
    rc, out, err = _run("library", "add", str(link), "--id", "new-one", "--name", "x", "--charge-ox", "3",
                        "--charge-red", "2", "--E", "0.1", "--radius", "4", "--ionic-strength", "0.1", "--source", "x")
    assert rc == 0, err
    assert link.is_symlink() and "[couple.new-one]" in real.read_text(encoding="utf-8")
    assert stat.S_IMODE(os.stat(real).st_mode) == mode
    rc, _, err = _run("library", "remove", str(link), "new-one")
    assert rc == 0 and stat.S_IMODE(os.stat(real).st_mode) == mode
    assert sorted(p.name for p in tmp_path.iterdir()) == ["mine.toml", "shared"]


def test_workbench_result_files_are_written_safely(tmp_path):
    # The workbench's "save the result" goes through the same output writer as map --out: an existing file
    # is never replaced without replace=True, a link is replaced (never its target), the umask applies.
    from crossrate.tui.result_files import write_result_file

    target = tmp_path / "prediction.md"
    old = os.umask(0o027)
    try:
        assert write_result_file(str(target), "one\n") == str(target)
    finally:
        os.umask(old)
    assert stat.S_IMODE(os.stat(target).st_mode) == 0o640
    with pytest.raises(FileExistsError):
        write_result_file(str(target), "two\n")
    assert target.read_text() == "one\n"
    victim = tmp_path / "victim.txt"
    victim.write_text("precious\n")
    link = tmp_path / "map.json"
    link.symlink_to(victim)
    write_result_file(str(link), "{}\n", replace=True)
    assert victim.read_text() == "precious\n" and link.read_text() == "{}\n"
    assert sorted(p.name for p in tmp_path.iterdir()) == ["map.json", "prediction.md", "victim.txt"]
