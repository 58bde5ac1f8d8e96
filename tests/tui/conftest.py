"""Fixtures for the workbench tests (the helpers themselves live in tui_fixtures.py)."""

import pytest
from tui_fixtures import small_couples

from crossrate.library.couple_set import CoupleSet


@pytest.fixture
def small_set() -> CoupleSet:
    return CoupleSet(small_couples())
