"""Fixtures of the Python-API tests: the invented test library, with the user's own layers kept out."""

from pathlib import Path

import pytest

REPO = Path(__file__).resolve().parents[2]
TEST_LIBRARY = REPO / "tests" / "services" / "data" / "halden_screen_test.toml"


@pytest.fixture
def isolated_env(tmp_path, monkeypatch):
    for name in ("CROSSRATE_GROUP_LIBRARY", "CROSSRATE_PERSONAL_LIBRARY"):
        monkeypatch.delenv(name, raising=False)
    monkeypatch.setenv("HOME", str(tmp_path))
    monkeypatch.setenv("XDG_CONFIG_HOME", str(tmp_path / "config"))
    monkeypatch.setenv("NO_COLOR", "1")
    return tmp_path


@pytest.fixture
def test_library_path() -> Path:
    return TEST_LIBRARY
