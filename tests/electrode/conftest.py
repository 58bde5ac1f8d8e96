"""Fixtures of the electrode tests: the invented electrode test library, loaded without any other layer."""

from pathlib import Path

import pytest

from crossrate.library.layers import load_layered

DATA = Path(__file__).parent / "data"
ELECTRODE_LIBRARY = DATA / "electrode_test.toml"


@pytest.fixture(scope="session")
def electrode_set():
    return load_layered(extra_paths=(str(ELECTRODE_LIBRARY),), bundled=False, group=False, personal=False)


@pytest.fixture
def run_electrode(tmp_path, monkeypatch, capsys):
    """run_electrode(*args) -> (exit code, stdout, stderr), the electrode test library only, no colour."""
    from crossrate.cli.main import main

    for name in ("CROSSRATE_GROUP_LIBRARY", "CROSSRATE_PERSONAL_LIBRARY"):
        monkeypatch.delenv(name, raising=False)
    monkeypatch.setenv("HOME", str(tmp_path))
    monkeypatch.setenv("XDG_CONFIG_HOME", str(tmp_path / "config"))
    monkeypatch.setenv("NO_COLOR", "1")

    def run(*args, library=True):
        argv = ["electrode", *args]
        if library:
            argv += ["--no-bundled", "--library", str(ELECTRODE_LIBRARY)]
        try:
            rc = main(argv)
        except SystemExit as exc:
            rc = exc.code
        out, err = capsys.readouterr()
        return rc, out, err

    return run
