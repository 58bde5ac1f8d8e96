"""Fixtures of the core tests. Also makes a plain checkout importable (`.venv/bin/pytest tests/core` without
`pip install -e .`): the repository root goes first on sys.path when crossrate is not installed."""

import importlib.util
import sys
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[2]
if importlib.util.find_spec("crossrate") is None:
    sys.path.insert(0, str(ROOT))


@pytest.fixture(scope="session")
def repo_root() -> Path:
    """The checkout's top folder (for subprocess tests that import crossrate from it)."""
    return ROOT
