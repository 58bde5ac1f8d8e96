"""Fixtures of the library tests: small invented library texts and an environment with no group or
personal library of the user's leaking in. A plain checkout is importable without `pip install -e .`:
the repository root goes first on sys.path when crossrate is not installed."""

import importlib.util
import sys
from pathlib import Path

import pytest
from library_helpers import BASE

ROOT = Path(__file__).resolve().parents[2]
if importlib.util.find_spec("crossrate") is None:
    sys.path.insert(0, str(ROOT))


@pytest.fixture(autouse=True)
def isolated_env(tmp_path, monkeypatch):
    """No group/personal library from the machine: config home and HOME point into tmp_path."""
    for name in ("CROSSRATE_GROUP_LIBRARY", "CROSSRATE_PERSONAL_LIBRARY"):
        monkeypatch.delenv(name, raising=False)
    monkeypatch.setenv("HOME", str(tmp_path / "home"))
    monkeypatch.setenv("XDG_CONFIG_HOME", str(tmp_path / "config"))
    monkeypatch.setenv("NO_COLOR", "1")
    monkeypatch.setenv("COLUMNS", "100")
    return tmp_path


@pytest.fixture
def write_lib(tmp_path):
    """write_lib(text, name='lib.toml') -> Path of a file holding text (bytes written as given)."""

    def write(text: str, name: str = "lib.toml") -> Path:
        p = tmp_path / name
        p.write_bytes(text.encode("utf-8"))
        return p

    return write


@pytest.fixture
def base_file(write_lib) -> Path:
    return write_lib(BASE)
