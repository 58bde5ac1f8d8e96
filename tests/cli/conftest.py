"""Fixtures of the CLI tests: run `crossrate` in-process on the invented test library, isolated from the
user's group/personal libraries, with NO_COLOR set so the plain (golden) form is printed."""

import os
from pathlib import Path

import pytest

from crossrate.cli.main import main

TESTS = Path(__file__).resolve().parents[1]
TEST_LIBRARY = TESTS / "services" / "data" / "halden_screen_test.toml"
GOLDEN = Path(__file__).parent / "golden"


@pytest.fixture
def isolated_env(tmp_path, monkeypatch):
    """No group/personal library, no colour, fixed width."""
    for name in ("CROSSRATE_GROUP_LIBRARY", "CROSSRATE_PERSONAL_LIBRARY"):
        monkeypatch.delenv(name, raising=False)
    monkeypatch.setenv("HOME", str(tmp_path))
    monkeypatch.setenv("XDG_CONFIG_HOME", str(tmp_path / "config"))
    monkeypatch.setenv("NO_COLOR", "1")
    monkeypatch.setenv("COLUMNS", "100")
    return tmp_path


@pytest.fixture
def run_cli(isolated_env, capsys):
    """run_cli(*args, library=True) -> (exit code, stdout, stderr); --no-bundled --library TEST added."""

    def run(*args, library=True):
        argv = list(args)
        if library:
            argv += ["--no-bundled", "--library", str(TEST_LIBRARY)]
        try:
            rc = main(argv)
        except SystemExit as exc:  # argparse errors
            rc = exc.code
        out, err = capsys.readouterr()
        return rc, out, err

    return run


@pytest.fixture
def golden():
    """golden(name, text): compare with tests/cli/golden/<name>; CROSSRATE_UPDATE_GOLDEN=1 rewrites it."""

    def check(name: str, text: str):
        path = GOLDEN / name
        if os.environ.get("CROSSRATE_UPDATE_GOLDEN") == "1":
            path.write_text(text, encoding="utf-8")
        assert path.exists(), f"missing golden file {path}; run with CROSSRATE_UPDATE_GOLDEN=1 once and review it"
        assert text == path.read_text(encoding="utf-8")

    return check


@pytest.fixture(scope="session")
def couple_set():
    """The test library through the real layered reader (only this file)."""
    from crossrate.library.layers import load_layered

    return load_layered(extra_paths=(str(TEST_LIBRARY),), bundled=False, group=False, personal=False)
